"""Access to the design data in rules/ and to a project's rules file.

rules/ holds data only: CSV tables (``#`` starts a comment line) and TOML defaults. This module
finds the folder, reads tables once, and merges a project TOML file over the defaults, checking
every key and value and naming the file line of each mistake.
"""

from __future__ import annotations

import functools
import re
import sys
from pathlib import Path

import pandas as pd
import pint

from .errors import RulesError, UnitError
from .units import parse_quantity, parse_temperature_f

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib


def rules_dir() -> Path:
    """The rules/ folder: installed as package data, or beside the package in a source checkout."""
    here = Path(__file__).resolve().parent
    for candidate in (here / "_rules", here.parent / "rules"):
        if (candidate / "defaults.toml").is_file():
            return candidate
    raise RulesError("the rules/ data folder is missing; reinstall ifccheck (pip install .)")


@functools.lru_cache(maxsize=None)
def read_table(relpath: str) -> pd.DataFrame:
    """Read one CSV table of rules/ (e.g. ``"nds2018/size_factor.csv"``); lines starting with # are comments."""
    path = rules_dir() / relpath
    try:
        return pd.read_csv(path, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])
    except FileNotFoundError as exc:
        raise RulesError(f"rules table {relpath} is missing from {rules_dir()}; reinstall ifccheck") from exc
    except Exception as exc:
        raise RulesError(f"rules table {relpath} cannot be read ({exc}); fix the CSV") from exc


def read_toml(path: Path) -> dict:
    """Read a TOML file, turning every failure into a RulesError that names the file."""
    try:
        with open(path, "rb") as fh:
            return tomllib.load(fh)
    except FileNotFoundError as exc:
        raise RulesError(f"rules file {path} does not exist; check the --rules path") from exc
    except tomllib.TOMLDecodeError as exc:
        raise RulesError(f"rules file {path} is not valid TOML: {exc}; fix that line") from exc
    except OSError as exc:
        raise RulesError(f"rules file {path} cannot be read: {exc}") from exc


@functools.lru_cache(maxsize=None)
def _default_rules() -> dict:
    return read_toml(rules_dir() / "defaults.toml")


def example_text() -> str:
    """The commented starter project file, rules/example_project.toml (every key, each explained)."""
    path = rules_dir() / "example_project.toml"
    try:
        return path.read_text(encoding="utf-8")
    except OSError as exc:
        raise RulesError(f"the example rules file {path} cannot be read ({exc}); reinstall ifccheck") from exc


# --- where a key sits in the file ------------------------------------------------------------

_HEADER = re.compile(r"^\s*(\[\[?)\s*([^\[\]]+?)\s*\]\]?\s*(#.*)?$")


class _RulesText:
    """The lines of a project rules file, to name the line of a mistake (tomllib gives no positions).

    Tables are found by their ``[name]`` / ``[[name]]`` header lines, keys by the first line at or
    after the table's header (and before the next header) that starts with ``key =``.
    """

    def __init__(self, name: str, text: str = ""):
        self.name = name
        self.lines = text.splitlines()
        self.headers = []  # (line number, table name) in file order
        for number, line in enumerate(self.lines, start=1):
            match = _HEADER.match(line)
            if match:
                table = ".".join(part.strip().strip("\"'") for part in match.group(2).split("."))
                self.headers.append((number, table))

    def line_of(self, table: "str | None", key: "str | None" = None, index: int = 0) -> "int | None":
        """Line of ``key`` in ``table`` (its ``index``-th ``[[table]]``), of the table header when
        ``key`` is None; ``table`` None is the part before the first header. None when not found."""
        if table is None:
            start, end = 1, self.headers[0][0] if self.headers else len(self.lines) + 1
        else:
            starts = [number for number, name in self.headers if name == table]
            if len(starts) <= index:
                return self.line_of(None, table) if key is None else None
            start = starts[index]
            end = next((number for number, _ in self.headers if number > start), len(self.lines) + 1)
            if key is None:
                return start
        quoted = re.escape(key)
        pattern = re.compile(rf"""^\s*(?:{quoted}|"{quoted}"|'{quoted}')\s*=""")
        return next((n for n in range(start, end) if pattern.match(self.lines[n - 1])), None)

    def error(self, message: str, table: "str | None" = None, key: "str | None" = None, index: int = 0) -> RulesError:
        """A RulesError starting with the file name and, when found, the line of ``table``/``key``."""
        line = self.line_of(table, key, index) if (table or key) else None
        at = f"{self.name} line {line}" if line else self.name
        return RulesError(f"{at}: {message}")


# --- merging a project file over the defaults ------------------------------------------------


def load_rules(project: "str | Path | dict | None" = None) -> dict:
    """The defaults of rules/defaults.toml with a project's file (path) or dict merged over them.

    Only sections and keys that exist in the defaults may be set ([member_use],
    [member_use_by_storey] and [load_groups] take any key); anything else raises a RulesError
    naming the file line and the key, so a typo never silently falls back to a default.
    ``rules["area_loads"]`` is a list of dicts, see :func:`area_load_entries`.
    """
    defaults = _default_rules()
    merged = {section: (dict(values) if isinstance(values, dict) else list(values)) for section, values in defaults.items()}
    if project is None:
        return merged
    if isinstance(project, dict):
        source, text = project, _RulesText("project rules")
    else:
        source = read_toml(Path(project))
        text = _RulesText(f"rules file {project}", Path(project).read_text(encoding="utf-8", errors="replace"))
    for section, values in source.items():
        if section not in merged:
            raise text.error(f"unknown section [{section}]; known sections are {_known_sections(merged)}", section)
        if section == "area_loads":
            merged[section] = area_load_entries(values, text)
        elif not isinstance(values, dict):
            raise text.error(f"{section} should be a table: a [{section}] line followed by key = value lines", section)
        else:
            _merge_table(section, merged[section], values, text)
    _check_defaults(merged["defaults"], text)
    _check_member_uses(merged, text)
    return merged


def _known_sections(merged: dict) -> str:
    return ", ".join(f"[[{s}]]" if isinstance(v, list) else f"[{s}]" for s, v in merged.items())


def _merge_table(section: str, target: dict, values: dict, text: _RulesText) -> None:
    """Set the project's keys of one table; [defaults] accepts only its own keys, each of its type."""
    for key, value in values.items():
        if section == "defaults" and key not in target:
            known = ", ".join(sorted(target))
            raise text.error(f"unknown key '{key}' in [{section}]; known keys are {known}", section, key)
        expected = target.get(key)
        if expected is not None and type(expected) is not type(value) and not (
            isinstance(expected, float) and isinstance(value, int)
        ):
            raise text.error(
                f"[{section}] {key} = {value!r} should be a {type(expected).__name__} like {expected!r}", section, key
            )
        target[key] = value


_CHOICES = {
    "shear_section": ("support_face", "support_centre", "d_from_face"),
    "report_units": ("auto", "imperial", "metric"),
    "supports_from_geometry": ("auto", "always", "never"),
}


def _check_defaults(d: dict, text: _RulesText) -> None:
    """Reject impossible [defaults] values with a message naming the line, the key and what was expected."""
    for key, choices in _CHOICES.items():
        if d[key] not in choices:
            raise text.error(f"[defaults] {key} = {d[key]!r}; expected one of {', '.join(choices)}", "defaults", key)
    try:
        bearing = parse_quantity(d["bearing_length"], "length")
    except UnitError as exc:
        raise text.error(f"[defaults] bearing_length: {exc}", "defaults", "bearing_length") from exc
    if not bearing > 0:
        raise text.error(
            f"[defaults] bearing_length = {d['bearing_length']!r} must be positive (a length like '1.5 in')",
            "defaults", "bearing_length",
        )
    try:
        tolerance = parse_quantity(d["support_tolerance"], "length")
    except UnitError as exc:
        raise text.error(f"[defaults] support_tolerance: {exc}", "defaults", "support_tolerance") from exc
    if not tolerance >= 0:
        raise text.error(f"[defaults] support_tolerance = {d['support_tolerance']!r} must not be negative",
                         "defaults", "support_tolerance")
    try:
        parse_temperature_f(d["service_temperature"])
    except UnitError as exc:
        raise text.error(f"[defaults] service_temperature: {exc}", "defaults", "service_temperature") from exc
    if not 0 <= d["overhang_ratio"] <= 10:
        raise text.error(
            f"[defaults] overhang_ratio = {d['overhang_ratio']!r} must be between 0 and 10 (a share of the span)",
            "defaults", "overhang_ratio",
        )
    if not 0 < d["max_bending_slope"] <= 90:
        raise text.error(
            f"[defaults] max_bending_slope = {d['max_bending_slope']!r} must be between 0 and 90 degrees",
            "defaults", "max_bending_slope",
        )


def _check_member_uses(rules: dict, text: _RulesText) -> None:
    """Every member use, by predefined type or by storey, must be a row of ibc2018/deflection_limits.csv."""
    uses = set(read_table("ibc2018/deflection_limits.csv")["member_use"])
    for section in ("member_use", "member_use_by_storey"):
        for key, use in rules[section].items():
            if use not in uses:
                raise text.error(
                    f"[{section}] {key}: member use {use!r} is not one of {', '.join(sorted(uses))}", section, key
                )


def member_use(rules: dict, predefined_type: str, storey: str = "") -> str:
    """The member use (a row of ibc2018/deflection_limits.csv) for deflection limits: by storey name
    from [member_use_by_storey] first, then by predefined type from [member_use], else "floor"."""
    by_storey = rules.get("member_use_by_storey", {})
    if storey in by_storey:
        return by_storey[storey]
    return rules["member_use"].get(predefined_type, "floor")


# --- area loads ------------------------------------------------------------------------------

AREA_LOAD_SELECTORS = ("storey", "slab", "space_usage")
AREA_LOAD_TYPES = ("dead", "live", "roof_live", "snow")
_AREA_LOAD_KEYS = (*AREA_LOAD_SELECTORS, *AREA_LOAD_TYPES, "preset")


@functools.lru_cache(maxsize=None)
def live_load_presets() -> dict:
    """Named minimum live loads of rules/presets/live_loads.csv: name -> (load type, psi, source).

    A preset whose name starts with ``roof_`` gives ``roof_live``, any other gives ``live``.
    """
    table = read_table("presets/live_loads.csv")
    presets = {}
    for row in table.itertuples(index=False):
        try:
            value = parse_quantity(f"{row.live} {row.unit}", "planar_force")
        except UnitError as exc:
            raise RulesError(f"rules table presets/live_loads.csv, preset {row.name}: {exc}; fix the CSV") from exc
        load_type = "roof_live" if row.name.startswith("roof_") else "live"
        presets[row.name] = (load_type, value, row.source)
    return presets


def area_load_entries(entries, text: "_RulesText | None" = None) -> list:
    """The [[area_loads]] entries of a project file, checked, with loads in core units (psi).

    Each result has its one selector key (``storey``, ``slab`` or ``space_usage``) with its text,
    ``dead``, ``live``, ``roof_live`` and ``snow`` in psi (0.0 where not given), ``given`` (the load
    types the entry or its preset sets), ``preset`` (name or None), ``line`` (its ``[[area_loads]]`` line in the file, or None) and ``label`` such as
    ``area_loads[2] (storey 'Level 2')`` (entries counted from 1).
    """
    text = text or _RulesText("project rules")
    if not isinstance(entries, list) or not all(isinstance(e, dict) for e in entries):
        raise text.error("area_loads should be a list of tables: one [[area_loads]] header per entry", "area_loads")
    return [_area_load_entry(entry, number, text) for number, entry in enumerate(entries, start=1)]


def _area_load_entry(entry: dict, number: int, text: _RulesText) -> dict:
    where = f"[[area_loads]] #{number}"

    def fail(message: str, key: "str | None" = None) -> RulesError:
        return text.error(f"{where} {message}", "area_loads", key, number - 1)

    for key in entry:
        if key not in _AREA_LOAD_KEYS:
            raise fail(f"has unknown key '{key}'; known keys are {', '.join(_AREA_LOAD_KEYS)}", key)
    selectors = [key for key in AREA_LOAD_SELECTORS if key in entry]
    if len(selectors) != 1:
        found = f"has {' and '.join(selectors)}" if selectors else "has none"
        raise fail(f"{found}; expected exactly one of {', '.join(AREA_LOAD_SELECTORS)} saying where the loads act",
                   selectors[1] if len(selectors) > 1 else None)
    selector = selectors[0]
    target = entry[selector]
    if not isinstance(target, str) or not target.strip():
        raise fail(f"{selector} = {target!r} should be a name in quotes, like \"Level 2\"", selector)
    loads = {load_type: 0.0 for load_type in AREA_LOAD_TYPES}
    preset = entry.get("preset")
    presets = live_load_presets()
    if preset is not None:
        if preset not in presets:
            raise fail(f"preset = {preset!r} is not a preset of rules/presets/live_loads.csv; "
                       f"expected one of {', '.join(presets)}", "preset")
        load_type, value, _ = presets[preset]
        loads[load_type] = value
    given = [key for key in AREA_LOAD_TYPES if key in entry]
    if not given and preset is None:
        raise fail(f"gives no load; expected at least one of {', '.join(AREA_LOAD_TYPES)} or a preset")
    for key in given:
        loads[key], problem = _area_load_psi(entry[key])
        if problem:
            raise fail(f"{key} = {entry[key]!r} {problem}", key)
    return {
        selector: target,
        **loads,
        "given": tuple(k for k in AREA_LOAD_TYPES if k in given or (preset is not None and k == presets[preset][0])),
        "preset": preset,
        "line": text.line_of("area_loads", None, number - 1),
        "label": f"area_loads[{number}] ({selector} {target!r})",
    }


def _area_load_psi(value) -> "tuple[float, str]":
    """An area load written with its unit (e.g. "40 psf", "1.9 kPa") in psi, and what is wrong with it ("" if nothing)."""
    if not isinstance(value, str):
        return 0.0, 'should be a text with a unit, like "40 psf" or "1.9 kPa"'
    try:
        psi = parse_quantity(value, "planar_force")
    except UnitError as exc:
        if isinstance(exc.__cause__, pint.DimensionalityError):
            return 0.0, "is not a pressure; expected units like psf or kPa"
        return 0.0, f"cannot be used: {exc}"
    if psi < 0:
        return 0.0, "must be zero or more (an area load acting downward)"
    return psi, ""
