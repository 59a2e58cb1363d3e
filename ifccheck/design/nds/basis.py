"""The NDS 2018 / ASCE 7-16 ASD design basis: resolves reference values and adjustment factors per
member, runs the vectorised checks, and states each verdict with its reason.

Core units: inch, lbf, psi, lbf/in (see ifccheck.units).
"""

from __future__ import annotations

import functools
import re

import numpy as np
import pandas as pd

from ...errors import DesignValueLookupError
from ...model import LOAD_TYPES
from ...rules import read_table
from ..inputs import LOAD_COLUMNS
from ..load_path import carrier_edges, dependency_levels
from . import factors, values
from .checks import CHECKS, SectionCapacity, allowable_span, evaluate
from .general import analysed_checks

_UTIL_COLUMNS = ["util_bending", "util_shear", "util_deflection_live", "util_deflection_total", "util_bearing"]
_COMB_COLUMNS = [c.replace("util_", "comb_") for c in _UTIL_COLUMNS]
_PCF_TO_PCI = 1.0 / 1728.0  # lb/ft³ to lb/in³


@functools.lru_cache(maxsize=None)
def combinations() -> "tuple[np.ndarray, tuple]":
    """ASCE 7-16, 2.4.1: ASD combinations from rules/, as (m, 5) coefficients and their names."""
    table = read_table("asce7_16/asd_combinations.csv")
    return table[list(LOAD_TYPES)].to_numpy(float), tuple(table["name"])


@functools.lru_cache(maxsize=None)
def cd_by_load_type() -> np.ndarray:
    """NDS Table 2.3.2: CD of each load type, in LOAD_TYPES order."""
    table = read_table("nds2018/load_duration.csv").set_index("load_type")["CD"]
    return np.array([float(table[t]) for t in LOAD_TYPES])


@functools.lru_cache(maxsize=None)
def deflection_limits(member_use: str) -> "tuple[float, float]":
    """IBC 2018, Table 1604.3: n of L/n for live and for total load, by member use."""
    table = read_table("ibc2018/deflection_limits.csv").set_index("member_use")
    row = table.loc[member_use]
    return float(row["live_n"]), float(row["total_n"])


_VALUE_COLUMNS = ("Fb", "Fb_neg", "Fv", "Fc_perp", "E", "Emin", "G")


_NAN = object()  # stands for NaN in the keys of per_distinct


def per_distinct(t: pd.DataFrame, columns: list, fn) -> list:
    """``fn(*values)`` for every row, computed once per distinct combination of ``columns``."""
    values = [t[c].tolist() for c in columns]
    keys = [  # every NaN is one key (NaN != NaN)
        [_NAN if v != v else v for v in column] if t[c].isna().any() else column
        for c, column in zip(columns, values)
    ]
    cache: dict = {}
    out = []
    for key, row in zip(zip(*keys), zip(*values)):
        if key not in cache:
            cache[key] = fn(*row)
        out.append(cache[key])
    return out


def _add_problems(problems: list, found) -> None:
    for k, extra in enumerate(found):
        problems[k].extend(extra)


def _material_identity(input_species, input_grade, pset_species, pset_grade, material_name):
    """(Identification, where it came from, problems): a Species or Grade the user gave must be
    understood, never silently passed over for the material's."""
    found = values.identify([
        ("input Species", input_species),
        ("input Grade", input_grade),
        ("Pset_MaterialWood", f"{pset_species} {pset_grade}".strip()),
        ("material name", material_name),
    ])
    trail = f"species from {found.species_from or 'nowhere'}, grade from {found.grade_from or 'nowhere'}"
    if input_grade and not values.identify([("", input_grade)]).grade:
        return found, trail, [f"input Grade '{input_grade}' is not an NDS grade in rules/nds2018"]
    if input_species and not values.identify([("", input_species)]).species:
        return found, trail, [f"input Species '{input_species}' is not an NDS species in rules/nds2018"]
    problems = []
    strength_class = _european_strength_class(input_grade, pset_grade, material_name)
    if not found.grade and strength_class:
        return found, trail, [f"'{strength_class[0]}' is an {strength_class[1]}, which has no NDS reference values; "
                              "give an NDS species and grade (ifccheck_DesignInput Species, Grade) or wait for the "
                              "Eurocode 5 basis"]
    if not found.grade:
        seen = input_grade or pset_grade or material_name
        problems.append(f"grade not identified ('{seen}' is not an NDS grade in rules/nds2018)")
    if not found.species:
        seen = input_species or pset_species or material_name
        problems.append(f"species not identified ('{seen}' is not an NDS species in rules/nds2018)")
    return found, trail, problems


@functools.lru_cache(maxsize=1)
def _strength_class_patterns() -> tuple:
    table = read_table("materials/strength_class_patterns.csv")
    table = table[(table["kind"] == "timber") & table["standard"].str.startswith("EN")]
    return tuple((re.compile(p, re.IGNORECASE), standard) for p, standard in zip(table["pattern"], table["standard"]))


def _european_strength_class(*texts) -> tuple:
    """(name, standard) of an EN 338 / EN 14080 strength class named in any of the texts, else ()."""
    for text in texts:
        for part in re.split(r"[\s,;/]+", str(text or "")):
            for pattern, standard in _strength_class_patterns():
                if pattern.search(part):
                    return part, standard
    return ()


def _nominal_section(b: float, d: float, plies: int):
    """(nominal thickness, nominal width, label) of a section of total width b and depth d (in)."""
    if not (np.isfinite(b) and np.isfinite(d)):
        return np.nan, np.nan, ""
    ply = b / plies
    thick, t_std = values.nominal_size(min(ply, d))
    wide, w_std = values.nominal_size(max(ply, d))
    label = f"{int(thick)}x{int(wide)}" if ply <= d else f"{int(wide)}x{int(thick)} flat"
    if plies > 1:
        label = f"{plies}-{label}"
    return thick, wide, label if (t_std and w_std) else f"non-standard (taken as {label})"


def _reference_row(species: str, grade: str, nominal_thickness: float, nominal_width: float):
    """(product, reference values, problem or "") for one species, grade and nominal size."""
    if not (species and grade and np.isfinite(nominal_width)):
        return "", {}, ""
    product = values.product_of(nominal_thickness, nominal_width, grade)
    try:
        row = values.reference_values(species, grade, product, nominal_width)
    except DesignValueLookupError as exc:
        return product, {}, str(exc)
    return product, {c: float(row[c]) for c in _VALUE_COLUMNS}, ""


def _deflection_limits(member_use: str, n_live_input: float, n_total_input: float):
    """(n_live, n_total, default used or "") from the inputs, else IBC 2018 Table 1604.3."""
    table_live, table_total = deflection_limits(member_use)
    live = n_live_input if np.isfinite(n_live_input) else table_live
    total = n_total_input if np.isfinite(n_total_input) else table_total
    if np.isfinite(n_live_input) and np.isfinite(n_total_input):
        return live, total, ""
    return live, total, (f"deflection limits L/{live:g} live, L/{total:g} total "
                         f"(IBC 2018 Table 1604.3, {member_use.replace('_', ' ')})")


def _load_path_problems(t: pd.DataFrame, problems: list) -> None:
    """A member on a cycle of carriers, or carrying a member that cannot be checked (its reaction
    is then unknown), cannot be checked either."""
    if "analysis" not in t:
        return
    edges = carrier_edges(list(t["global_id"]), list(t["analysis"]))
    if not edges:  # no member bears on another: no cycle, nothing carried
        return
    names = [f"{n or g}" for n, g in zip(t["name"], t["global_id"])]
    levels, cyclic = dependency_levels(len(t), edges)
    for k in sorted(cyclic):
        problems[k].append("on a cycle of members bearing on each other; the load path cannot be ordered")
    position = {k: n for n, level in enumerate(levels) for k in level}
    for carried, _, carrier, _ in sorted(edges, key=lambda e: position.get(e[0], -1)):
        if problems[carried] and carried not in cyclic:
            problems[carrier].append(f"carries {names[carried]}, which cannot be checked, so its reaction is unknown")


class NdsBasis:
    key = "NDS"
    label = "NDS 2018 / ASCE 7-16 ASD"

    def check(self, inputs: pd.DataFrame, rules: dict) -> pd.DataFrame:
        t = inputs.copy()
        problems = [list(p) for p in t["problems"]]
        used = [list(u) for u in t["defaults_used"]]
        notices = [("; " + "; ".join(n)) if n else "" for n in t["notices"]]
        self._resolve_material(t, problems)
        self._resolve_size(t, problems)
        self._resolve_values(t, problems)
        self._design_span(t, problems)
        self._add_self_weight(t)
        self._deflection_limits(t, used)
        cap = self._capacity(t, rules, problems)
        _load_path_problems(t, problems)
        ok = np.array([not p for p in problems])
        out = pd.DataFrame(index=t.index)
        out["design_basis"] = self.label
        for column in ("species", "grade", "nominal", "design_span", "identified_from", "self_weight"):
            out[column] = t[column]
        for column in LOAD_COLUMNS:
            out[column] = t[column]
        out["A"], out["S"], out["I"] = t["b"] * t["d"], t["b"] * t["d"] ** 2 / 6, t["b"] * t["d"] ** 3 / 12
        for column in _UTIL_COLUMNS + ["max_util", "required_A", "required_S", "required_I", "allowable_span",
                                       "C_D", "C_L", "C_F", "C_r", "C_M_b", "F_b_prime", "f_b", "F_v_prime", "f_v"]:
            out[column] = np.nan
        for column in ("governing_location", "uplift_force", "support_count", "effective_length", "unbraced_length_used",
                       "R_B", "F_bE"):
            out[column] = np.nan
        for column in _COMB_COLUMNS + ["governing_check", "governing_combination", "bending_edge"]:
            out[column] = ""
        out["slender"] = False
        out["element_reactions"] = [[] for _ in range(len(out))]  # reactions on walls and columns found
        if ok.any():
            self._run_checks(t, out, cap, ok)
        self._verdicts(out, ok, problems, used, notices)
        out["problems"] = problems
        return out

    # -- resolving what the model says into NDS terms -------------------------------------------

    def _resolve_material(self, t: pd.DataFrame, problems: list) -> None:
        found = per_distinct(t, ["input_species", "input_grade", "material_species", "material_grade",
                                 "material_name"], _material_identity)
        t["species"] = [f[0].species for f in found]
        t["grade"] = [f[0].grade for f in found]
        t["identified_from"] = [f[1] for f in found]
        _add_problems(problems, (f[2] for f in found))

    def _resolve_size(self, t: pd.DataFrame, problems: list) -> None:
        found = per_distinct(t, ["b", "d", "plies"], _nominal_section)
        t["nominal_thickness"] = [f[0] for f in found]
        t["nominal_width"] = [f[1] for f in found]
        t["nominal"] = [f[2] for f in found]
        t["flat"] = (t["d"] < t["b"] / t["plies"]).to_numpy()
        missing = np.flatnonzero(~np.isfinite(t["b"].to_numpy(float) * t["d"].to_numpy(float)))
        for k in missing:
            if not any("section" in p for p in problems[k]):
                problems[k].append("no section found")

    def _resolve_values(self, t: pd.DataFrame, problems: list) -> None:
        found = per_distinct(t, ["species", "grade", "nominal_thickness", "nominal_width"], _reference_row)
        t["product"] = [f[0] for f in found]
        for c in _VALUE_COLUMNS:
            t[c] = [f[1].get(c, np.nan) for f in found]
        _add_problems(problems, ([f[2]] if f[2] else [] for f in found))

    def _design_span(self, t: pd.DataFrame, problems: list) -> None:
        # NDS 3.2.1: design span = clear span + 1/2 bearing length at each end; a member's length is
        # taken to run over both bearings, so its design span is length - one bearing length
        lb = t["bearing_length"].to_numpy(float)
        span = t["span_read"].to_numpy(float)
        L = np.where(t["span_is_clear"].to_numpy(bool), span + lb, span - lb)
        t["design_span"] = L
        for k in np.flatnonzero(~np.isfinite(span)):
            if not any("span" in p for p in problems[k]):
                problems[k].append("no span found (no Span property, axis or extrusion length)")
        for k in np.flatnonzero(np.isfinite(span) & ~(L > 0)):
            problems[k].append("design span not positive (member shorter than its bearings)")

    def _add_self_weight(self, t: pd.DataFrame) -> None:
        # self-weight per horizontal length of a sloped member: ρ·b·d / cos(slope)
        density = factors.wood_density_pcf(t["G"].to_numpy(float)) * _PCF_TO_PCI
        cos = np.cos(np.radians(t["slope"].to_numpy(float)))
        weight = density * t["b"].to_numpy(float) * t["d"].to_numpy(float) / cos
        add = ~t["self_weight_included"].to_numpy(bool) & np.isfinite(weight)
        t["w_D"] = t["w_D"].to_numpy(float) + np.where(add, weight, 0.0)
        t["self_weight"] = np.where(add, weight, 0.0)

    def _deflection_limits(self, t: pd.DataFrame, used: list) -> None:
        found = per_distinct(t, ["member_use", "n_live_input", "n_total_input"], _deflection_limits)
        t["n_live"] = [f[0] for f in found]
        t["n_total"] = [f[1] for f in found]
        _add_problems(used, ([f[2]] if f[2] else [] for f in found))

    def _capacity(self, t: pd.DataFrame, rules: dict, problems: list) -> SectionCapacity:
        product = t["product"].to_numpy(str)
        wet = t["wet"].to_numpy(bool)
        temp = t["temperature_F"].to_numpy(float)
        incised = t["incised"].to_numpy(bool) & (product == "dimension")  # NDS 4.3.8: dimension lumber
        nom_t = t["nominal_thickness"].to_numpy(float)
        nom_w = t["nominal_width"].to_numpy(float)
        d = t["d"].to_numpy(float)
        southern_pine = t["species"].to_numpy(str) == "Southern Pine"
        dimension = product == "dimension"

        # NDS Supplement Table 4A: CF on dimension lumber; Table 4B Southern Pine values are
        # size-specific (CF = 1.0 up to 12 in); NDS 4.3.6.2: timbers deeper than 12 in
        C_F = np.where(dimension & ~southern_pine, factors.C_F_dimension(nom_t, nom_w, "Fb"), 1.0)
        C_F = np.where(np.isin(product, ["beams_stringers", "posts_timbers"]), factors.C_F_timber(d), C_F)
        Fb = t["Fb"].to_numpy(float)
        Fb_neg = t["Fb_neg"].to_numpy(float)  # glulam Fbx− (NDS Supplement Table 5A)
        C_M_b = factors.C_M(product, "Fb", wet, Fb * C_F)
        C_r = np.where(dimension, factors.C_r(t["repetitive"].to_numpy(bool)), 1.0)
        C_fu = np.where(dimension, factors.C_fu(nom_t, nom_w, t["flat"].to_numpy(bool)), 1.0)
        C_t = {p: factors.C_t(p, temp, wet) for p in ("Fb", "Fv", "Fc_perp", "E", "Emin")}
        for k in np.flatnonzero(~np.isfinite(C_t["Fb"])):
            problems[k].append(f"service temperature {temp[k]:.0f} F is above the 150 F of NDS 2.3.3")
        C_i = {p: factors.C_i(p, incised) for p in ("Fb", "Fv", "Fc_perp", "E", "Emin")}
        lb = t["bearing_length"].to_numpy(float)
        # bearings at the member's ends: NDS 3.10.4 gives Cb = 1.0 there
        C_b = factors.C_b(lb, np.zeros_like(lb))
        t["C_F"], t["C_r"], t["C_M_b"] = C_F, C_r, C_M_b

        def adjusted(prop):
            return t[prop].to_numpy(float) * factors.C_M(product, prop, wet) * C_t[prop] * C_i[prop]

        return SectionCapacity(
            b=t["b"].to_numpy(float),
            d=d,
            bearing_length=lb,
            F_b_star_noCD=Fb * C_M_b * C_t["Fb"] * C_F * C_i["Fb"] * C_r,
            F_b_star_neg_noCD=np.where(np.isfinite(Fb_neg), Fb_neg, Fb) * C_M_b * C_t["Fb"] * C_F * C_i["Fb"] * C_r,
            C_fu=C_fu,
            glulam=product == "glulam",
            volume_x=np.where(southern_pine, 20.0, 10.0),
            F_v_noCD=adjusted("Fv"),
            F_c_perp_prime=adjusted("Fc_perp") * C_b,
            E_prime=adjusted("E"),
            E_min_prime=adjusted("Emin"),
            K_cr=factors.K_cr(product, wet),
            braced=t["braced"].to_numpy(bool),
            unbraced_length=t["unbraced_length"].to_numpy(float),
            n_live=t["n_live"].to_numpy(float),
            n_total=t["n_total"].to_numpy(float),
            shear_section=rules["defaults"]["shear_section"],
        )

    # -- running the checks -------------------------------------------------------------------

    def _run_checks(self, t: pd.DataFrame, out: pd.DataFrame, cap: SectionCapacity, ok: np.ndarray) -> None:
        combos, names = combinations()
        cd = cd_by_load_type()
        has_analysis = t["analysis"].notna().to_numpy() if "analysis" in t else np.zeros(len(t), bool)
        closed = ok & ~has_analysis
        if closed.any():
            sub = cap.subset(closed)
            loads = t[LOAD_COLUMNS].to_numpy(float)[closed]
            L = t["design_span"].to_numpy(float)[closed]
            r = evaluate(L, loads, combos, cd, sub)
            self._record(t, out, closed, r, names, sub, support_count=2)
            out.loc[out.index[closed], "allowable_span"] = allowable_span(L, loads, combos, cd, sub, r)
        analysed = ok & has_analysis
        if analysed.any():
            sub = cap.subset(analysed)
            r, support_count, longest_span = analysed_checks(t[analysed], combos, names, cd, sub)
            self._record(t, out, analysed, r, names, sub, support_count)
            out.loc[out.index[analysed], "design_span"] = longest_span
            out.loc[out.index[analysed], "element_reactions"] = pd.Series(r["element_reactions"], index=out.index[analysed])

    def _record(self, t, out, mask, r, names, sub: SectionCapacity, support_count) -> None:
        """Write the governing utilizations, combinations, location and calculation trail of ``mask`` rows."""
        util = r["util"]  # (5, n, m)
        dem = r["demands"]
        gov_comb = util.argmax(axis=2)  # (5, n)
        gov_util = np.take_along_axis(util, gov_comb[:, :, None], axis=2)[:, :, 0]
        rows = np.arange(util.shape[1])
        names = np.array(names, dtype=object)
        at = out.index[mask]
        for j, (u_col, c_col) in enumerate(zip(_UTIL_COLUMNS, _COMB_COLUMNS)):
            out.loc[at, u_col] = gov_util[j]
            out.loc[at, c_col] = names[gov_comb[j]]
        gov_check = gov_util.argmax(axis=0)
        gov = gov_comb[gov_check, rows]
        positions = np.stack([r["x_bending"], dem.x_V, dem.x_deflection_live, dem.x_deflection_total, dem.x_bearing])
        out.loc[at, "max_util"] = gov_util.max(axis=0)
        out.loc[at, "governing_check"] = np.array(CHECKS, dtype=object)[gov_check]
        out.loc[at, "governing_combination"] = names[gov]
        out.loc[at, "governing_location"] = positions[gov_check, rows, gov]
        # uplift, a negative reaction under any combination, fails on its own (UPLIFT)
        up_comb = dem.uplift.argmin(axis=1)
        uplift = dem.uplift[rows, up_comb]
        lifted = uplift < -1e-6 * np.maximum(np.abs(dem.R).max(axis=1), 1.0)
        out.loc[at, "uplift_force"] = np.where(lifted, -uplift, 0.0)
        out.loc[at[lifted], "governing_check"] = "UPLIFT"
        out.loc[at[lifted], "governing_combination"] = names[up_comb[lifted]]
        out.loc[at[lifted], "governing_location"] = dem.x_uplift[rows, up_comb][lifted]
        out.loc[at, "support_count"] = support_count
        # required properties for the governing case: demand / capacity scales the provided property
        out.loc[at, "required_A"] = gov_util[1] * sub.A
        out.loc[at, "required_S"] = gov_util[0] * sub.S
        out.loc[at, "required_I"] = np.maximum(gov_util[2], gov_util[3]) * sub.I
        b = gov_comb[0]
        for column, key in (("C_D", "CD"), ("C_L", "C_L"), ("F_b_prime", "F_b_prime"), ("f_b", "f_b"),
                            ("bending_edge", "bending_edge"), ("effective_length", "le_bending"),
                            ("unbraced_length_used", "lu_bending"), ("R_B", "R_B"), ("F_bE", "F_bE"),
                            ("slender", "too_slender")):
            out.loc[at, column] = r[key][rows, b]
        out.loc[at, "F_v_prime"] = r["F_v_prime"][rows, gov_comb[1]]
        out.loc[at, "f_v"] = r["f_v"][rows, gov_comb[1]]
        for column in ("C_F", "C_r", "C_M_b"):
            out.loc[at, column] = t[column].to_numpy(float)[mask]

    def _verdicts(self, out: pd.DataFrame, ok: np.ndarray, problems: list, used: list, notices: list) -> None:
        util = out[_UTIL_COLUMNS].to_numpy(float)
        uplift = out["uplift_force"].fillna(0.0).to_numpy(float)
        fails = ok & ((np.nan_to_num(util, nan=0.0) > 1.0).any(axis=1) | (uplift > 0))
        out["status"] = np.where(~ok, "NOT_CHECKED", np.where(fails, "FAIL", "PASS"))
        combos = out[_COMB_COLUMNS].to_numpy(object)
        slender = out["slender"].to_numpy(bool)
        governing = out["governing_check"].to_numpy(object)
        largest = util.max(axis=1).tolist()
        reasons = []
        for k in range(len(out)):
            assumed = notices[k] + (("; assumed: " + "; ".join(used[k])) if used[k] else "")
            if not ok[k]:
                reasons.append("; ".join(problems[k]) + assumed)
            elif fails[k]:
                failing = [f"{check} {u:.2f} under {c}" for check, u, c in zip(CHECKS, util[k], combos[k]) if u > 1.0]
                if uplift[k] > 0:
                    failing.append(f"UPLIFT {uplift[k]:.0f} lbf under {out['governing_combination'].iat[k]} "
                                   "(hold the member down)")
                failing = ", ".join(failing)
                brace = " (RB above 50, NDS 3.3.3.7: brace the compression edge)" if slender[k] else ""
                reasons.append(f"fails {failing}{brace}{assumed}")
            else:
                reasons.append(f"all checks pass, governing {governing[k]} {largest[k]:.2f}{assumed}")
        out["reason"] = reasons
