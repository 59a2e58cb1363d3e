"""The NDS 2018 / ASCE 7-16 ASD design basis: resolves reference values and adjustment factors per
member, runs the vectorised checks, and states each verdict with its reason.

Core units: inch, lbf, psi, lbf/in (see ifccheck.units).
"""

from __future__ import annotations

import functools

import numpy as np
import pandas as pd

from ...errors import DesignValueLookupError
from ...model import LOAD_TYPES
from ...rules import read_table
from ..inputs import LOAD_COLUMNS
from . import factors, values
from .checks import CHECKS, SectionCapacity, allowable_span, evaluate

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


@functools.lru_cache(maxsize=4096)
def _identify(input_species, input_grade, pset_species, pset_grade, material_name) -> values.Identification:
    return values.identify(
        [
            ("input Species", input_species),
            ("input Grade", input_grade),
            ("Pset_MaterialWood", f"{pset_species} {pset_grade}".strip()),
            ("material name", material_name),
        ]
    )


class NdsBasis:
    key = "NDS"
    label = "NDS 2018 / ASCE 7-16 ASD"

    def check(self, inputs: pd.DataFrame, rules: dict) -> pd.DataFrame:
        t = inputs.copy()
        problems = [list(p) for p in t["problems"]]
        used = [list(u) for u in t["defaults_used"]]
        self._resolve_material(t, problems)
        self._resolve_size(t, problems)
        self._resolve_values(t, problems)
        self._design_span(t, problems)
        self._add_self_weight(t)
        self._deflection_limits(t, used)
        cap = self._capacity(t, rules, problems)
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
        for column in _COMB_COLUMNS + ["governing_check", "governing_combination"]:
            out[column] = ""
        if ok.any():
            self._run_checks(t, out, cap, ok)
        self._verdicts(out, ok, problems, used)
        return out

    # -- resolving what the model says into NDS terms -------------------------------------------

    def _resolve_material(self, t: pd.DataFrame, problems: list) -> None:
        ids = [
            _identify(*key)
            for key in zip(t["input_species"].astype(str), t["input_grade"].astype(str),
                           t["material_species"].astype(str), t["material_grade"].astype(str),
                           t["material_name"].astype(str))
        ]
        t["species"] = [i.species for i in ids]
        t["grade"] = [i.grade for i in ids]
        t["identified_from"] = [
            f"species from {i.species_from or 'nowhere'}, grade from {i.grade_from or 'nowhere'}" for i in ids
        ]
        for k, (i, row) in enumerate(zip(ids, t.itertuples())):
            # a Species or Grade the user gave must be understood, never silently passed over
            if row.input_grade and not values.identify([("", row.input_grade)]).grade:
                problems[k].append(f"input Grade '{row.input_grade}' is not an NDS grade in rules/nds2018")
                continue
            if row.input_species and not values.identify([("", row.input_species)]).species:
                problems[k].append(f"input Species '{row.input_species}' is not an NDS species in rules/nds2018")
                continue
            if not i.grade:
                seen = row.input_grade or row.material_grade or row.material_name
                problems[k].append(f"grade not identified ('{seen}' is not an NDS grade in rules/nds2018)")
            if not i.species:
                seen = row.input_species or row.material_species or row.material_name
                problems[k].append(f"species not identified ('{seen}' is not an NDS species in rules/nds2018)")

    def _resolve_size(self, t: pd.DataFrame, problems: list) -> None:
        nominal_t, nominal_w, labels = [], [], []
        for k, row in enumerate(t.itertuples()):
            if not (np.isfinite(row.b) and np.isfinite(row.d)):
                nominal_t.append(np.nan)
                nominal_w.append(np.nan)
                labels.append("")
                if not any("section" in p for p in problems[k]):
                    problems[k].append("no section found")
                continue
            ply = row.b / row.plies
            thick, t_std = values.nominal_size(min(ply, row.d))
            wide, w_std = values.nominal_size(max(ply, row.d))
            nominal_t.append(thick)
            nominal_w.append(wide)
            label = f"{int(thick)}x{int(wide)}" if ply <= row.d else f"{int(wide)}x{int(thick)} flat"
            if row.plies > 1:
                label = f"{row.plies}-{label}"
            labels.append(label if (t_std and w_std) else f"non-standard (taken as {label})")
        t["nominal_thickness"] = nominal_t
        t["nominal_width"] = nominal_w
        t["nominal"] = labels
        t["flat"] = (t["d"] < t["b"] / t["plies"]).to_numpy()

    def _resolve_values(self, t: pd.DataFrame, problems: list) -> None:
        cols = ["Fb", "Fv", "Fc_perp", "E", "Emin", "G"]
        found = {c: [] for c in cols}
        products = []
        for k, row in enumerate(t.itertuples()):
            product = ""
            data = {}
            if row.species and row.grade and np.isfinite(row.nominal_width):
                product = values.product_of(row.nominal_thickness, row.nominal_width, row.grade)
                try:
                    data = values.reference_values(row.species, row.grade, product, row.nominal_width)
                except DesignValueLookupError as exc:
                    problems[k].append(str(exc))
            products.append(product)
            for c in cols:
                found[c].append(float(data[c]) if data and np.isfinite(data[c]) else np.nan)
        t["product"] = products
        for c in cols:
            t[c] = found[c]

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
        n_live, n_total = [], []
        for k, row in enumerate(t.itertuples()):
            table_live, table_total = deflection_limits(row.member_use)
            live = row.n_live_input if np.isfinite(row.n_live_input) else table_live
            total = row.n_total_input if np.isfinite(row.n_total_input) else table_total
            if not (np.isfinite(row.n_live_input) and np.isfinite(row.n_total_input)):
                used[k].append(f"deflection limits L/{live:g} live, L/{total:g} total "
                               f"(IBC 2018 Table 1604.3, {row.member_use.replace('_', ' ')})")
            n_live.append(live)
            n_total.append(total)
        t["n_live"] = n_live
        t["n_total"] = n_total

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
        C_M_b = factors.C_M(product, "Fb", wet, Fb * C_F)
        C_r = np.where(dimension, factors.C_r(t["repetitive"].to_numpy(bool) | (t["plies"].to_numpy() >= 3)), 1.0)
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
        sub = SectionCapacity(**{
            name: (value[ok] if isinstance(value, np.ndarray) else value) for name, value in vars(cap).items()
        })
        combos, names = combinations()
        cd = cd_by_load_type()
        loads = t[LOAD_COLUMNS].to_numpy(float)[ok]
        L = t["design_span"].to_numpy(float)[ok]
        r = evaluate(L, loads, combos, cd, sub)
        util = r["util"]  # (5, n, m)
        gov_comb = util.argmax(axis=2)  # (5, n)
        gov_util = np.take_along_axis(util, gov_comb[:, :, None], axis=2)[:, :, 0]
        idx = np.flatnonzero(ok)
        rows = np.arange(len(idx))
        for j, (u_col, c_col) in enumerate(zip(_UTIL_COLUMNS, _COMB_COLUMNS)):
            out.loc[out.index[idx], u_col] = gov_util[j]
            out.loc[out.index[idx], c_col] = np.array(names, dtype=object)[gov_comb[j]]
        gov_check = gov_util.argmax(axis=0)
        out.loc[out.index[idx], "max_util"] = gov_util.max(axis=0)
        out.loc[out.index[idx], "governing_check"] = np.array(CHECKS, dtype=object)[gov_check]
        out.loc[out.index[idx], "governing_combination"] = np.array(names, dtype=object)[gov_comb[gov_check, rows]]
        # required properties for the governing case: demand / capacity scales the provided property
        deflection = np.maximum(gov_util[2], gov_util[3])
        out.loc[out.index[idx], "required_A"] = gov_util[1] * sub.A
        out.loc[out.index[idx], "required_S"] = gov_util[0] * sub.S
        out.loc[out.index[idx], "required_I"] = deflection * sub.I
        b = gov_comb[0]
        for column, key in (("C_D", "CD"), ("C_L", "C_L"), ("F_b_prime", "F_b_prime"), ("f_b", "f_b")):
            out.loc[out.index[idx], column] = r[key][rows, b]
        out.loc[out.index[idx], "F_v_prime"] = r["F_v_prime"][rows, gov_comb[1]]
        out.loc[out.index[idx], "f_v"] = r["f_v"][rows, gov_comb[1]]
        for column in ("C_F", "C_r", "C_M_b"):
            out.loc[out.index[idx], column] = t[column].to_numpy(float)[ok]
        out.loc[out.index[idx], "allowable_span"] = allowable_span(loads, combos, cd, sub)
        out.loc[out.index[idx], "slender"] = r["too_slender"][rows, b]

    def _verdicts(self, out: pd.DataFrame, ok: np.ndarray, problems: list, used: list) -> None:
        status, reason = [], []
        for k, row in enumerate(out.itertuples()):
            assumed = ("; assumed: " + "; ".join(used[k])) if used[k] else ""
            if not ok[k]:
                status.append("NOT_CHECKED")
                reason.append("; ".join(problems[k]) + assumed)
                continue
            failing = [
                f"{check} {getattr(row, u):.2f} under {getattr(row, c)}"
                for check, u, c in zip(CHECKS, _UTIL_COLUMNS, _COMB_COLUMNS)
                if getattr(row, u) > 1.0
            ]
            if failing:
                slender = " (RB above 50, NDS 3.3.3.7: brace the compression edge)" if getattr(row, "slender", False) else ""
                status.append("FAIL")
                reason.append("fails " + ", ".join(failing) + slender + assumed)
            else:
                status.append("PASS")
                reason.append(f"all checks pass, governing {row.governing_check} {row.max_util:.2f}" + assumed)
        out["status"] = status
        out["reason"] = reason
