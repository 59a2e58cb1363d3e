"""Access to the design data in rules/ and to a project's rules file.

rules/ holds data only: CSV tables (``#`` starts a comment line) and TOML defaults. This module
finds the folder, reads tables once, and merges a project TOML file over the defaults.
"""

from __future__ import annotations

import functools
import sys
from pathlib import Path

import pandas as pd

from .errors import RulesError
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


def load_rules(project: "str | Path | dict | None" = None) -> dict:
    """The defaults of rules/defaults.toml with a project's file (path) or dict merged over them.

    Only sections and keys that exist in the defaults may be set; anything else raises a
    RulesError naming the key, so a typo never silently falls back to a default.
    """
    merged = {section: dict(values) for section, values in _default_rules().items()}
    if project is None:
        return merged
    source = project if isinstance(project, dict) else read_toml(Path(project))
    where = "project rules" if isinstance(project, dict) else f"rules file {project}"
    for section, values in source.items():
        if section not in merged or not isinstance(values, dict):
            known = ", ".join(f"[{s}]" for s in merged)
            raise RulesError(f"{where}: unknown section [{section}]; known sections are {known}")
        for key, value in values.items():
            if section == "defaults" and key not in merged[section]:
                known = ", ".join(sorted(merged[section]))
                raise RulesError(f"{where}: unknown key '{key}' in [{section}]; known keys are {known}")
            expected = merged[section].get(key)
            if expected is not None and type(expected) is not type(value) and not (
                isinstance(expected, float) and isinstance(value, int)
            ):
                raise RulesError(
                    f"{where}: [{section}] {key} = {value!r} should be a {type(expected).__name__} like {expected!r}"
                )
            merged[section][key] = value
    check_values(merged, where)
    return merged


_CHOICES = {
    "shear_section": ("support_face", "support_centre", "d_from_face"),
    "report_units": ("auto", "imperial", "metric"),
}


def check_values(rules: dict, where: str = "rules") -> None:
    """Reject impossible values with a message naming the key and what was expected."""
    d = rules["defaults"]
    for key, choices in _CHOICES.items():
        if d[key] not in choices:
            raise RulesError(f"{where}: [defaults] {key} = {d[key]!r}; expected one of {', '.join(choices)}")
    try:
        bearing = parse_quantity(d["bearing_length"], "length")
        parse_temperature_f(d["service_temperature"])
    except ValueError as exc:
        raise RulesError(f"{where}: [defaults] {exc}") from exc
    if not bearing > 0:
        raise RulesError(f"{where}: [defaults] bearing_length = {d['bearing_length']!r} must be positive")
    if not 0 < d["max_bending_slope"] <= 90:
        raise RulesError(f"{where}: [defaults] max_bending_slope must be between 0 and 90 degrees")
    uses = set(read_table("ibc2018/deflection_limits.csv")["member_use"])
    for ptype, use in rules["member_use"].items():
        if use not in uses:
            raise RulesError(
                f"{where}: [member_use] {ptype}: member use {use!r} is not one of {', '.join(sorted(uses))}"
            )
