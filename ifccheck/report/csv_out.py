"""The exception list: one CSV row per FAIL and NOT_CHECKED member, column names carrying units."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from ..atomic import atomic_target
from ..model import LOAD_TYPES
from .display import factor, report_system

_LOAD_NAMES = {"D": "dead", "L": "live", "Lr": "roof_live", "S": "snow", "W": "wind"}
_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def neutralise(cell):
    """Keep a spreadsheet from running a text cell as a formula (leading = + - @ tab CR)."""
    if isinstance(cell, str) and cell.startswith(_FORMULA_START):
        return "'" + cell
    return cell


def exceptions_frame(rows: pd.DataFrame, units, rules: dict) -> pd.DataFrame:
    """The CSV's columns, in display units of the project's unit system."""
    system = report_system(units, rules)
    length, f_len = factor(system, "length")
    load, f_load = factor(system, "linear_force")
    force, f_force = factor(system, "force")
    area, f_area = factor(system, "area")
    modulus, f_mod = factor(system, "section_modulus")
    inertia, f_in = factor(system, "moment_of_inertia")
    out = pd.DataFrame(
        {
            "global_id": rows["global_id"],
            "name": rows["name"],
            "ifc_class": rows["ifc_class"],
            "predefined_type": rows["predefined_type"],
            "storey": rows["storey"],
            "status": rows["status"],
            "section": rows["section"],
            "nominal": rows["nominal"],
            "species": rows["species"],
            "grade": rows["grade"],
            f"tributary_width_{length}": rows["tributary_width"] * f_len,
            f"design_span_{length}": rows["design_span"] * f_len,
            f"allowable_span_{length}": rows["allowable_span"] * f_len,
            **{f"{_LOAD_NAMES[t]}_load_{load}": rows[f"w_{t}"] * f_load for t in LOAD_TYPES},
            "support_count": rows["support_count"],
            "governing_check": rows["governing_check"],
            "governing_combination": rows["governing_combination"],
            f"governing_location_{length}": rows["governing_location"] * f_len,
            "bending_edge_in_compression": rows["bending_edge"],
            f"unbraced_length_{length}": rows["unbraced_length_used"] * f_len,
            f"uplift_{force}": rows["uplift_force"] * f_force,
            "max_utilization": rows["max_util"],
            "bending_utilization": rows["util_bending"],
            "shear_utilization": rows["util_shear"],
            "live_deflection_utilization": rows["util_deflection_live"],
            "total_deflection_utilization": rows["util_deflection_total"],
            "bearing_utilization": rows["util_bearing"],
            f"area_provided_{area}": rows["A"] * f_area,
            f"area_required_{area}": rows["required_A"] * f_area,
            f"section_modulus_provided_{modulus}": rows["S"] * f_mod,
            f"section_modulus_required_{modulus}": rows["required_S"] * f_mod,
            f"moment_of_inertia_provided_{inertia}": rows["I"] * f_in,
            f"moment_of_inertia_required_{inertia}": rows["required_I"] * f_in,
            "section_source": rows["section_source"],
            "span_source": rows["span_source"],
            "load_sources": rows["load_sources"],
            "supports": rows["supports_found"],
            "provenance": rows["provenance"],
            "reason": rows["reason"],
        }
    )
    return out.round(4).map(neutralise)


def write_exceptions_csv(rows: pd.DataFrame, path: Path, units, rules: dict) -> Path:
    """Write the exception list to ``path`` atomically (UTF-8, one header row)."""
    frame = exceptions_frame(rows, units, rules)
    with atomic_target(path) as tmp:
        frame.to_csv(tmp, index=False, encoding="utf-8")
    return Path(path)
