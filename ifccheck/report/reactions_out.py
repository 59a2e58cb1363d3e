"""Reactions on walls, columns and footings: per supporting element, the sum of the reactions of
the members found bearing on it, per load type, so the engineer can check the supports next."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from ..atomic import atomic_target
from ..model import LOAD_TYPES
from .csv_out import neutralise
from .display import factor, report_system

_NAMES = {"D": "dead", "L": "live", "Lr": "roof_live", "S": "snow", "W": "wind"}


def reactions_frame(table: pd.DataFrame, elements: list, units, rules: dict) -> pd.DataFrame:
    """One row per supporting element with the unfactored reactions by load type (display units)."""
    force, f_force = factor(report_system(units, rules), "force")
    by_id = {e.global_id: e for e in elements}
    totals: dict = {}
    for member, reactions in zip(table["name"], table["element_reactions"]):
        for element, by_type in reactions or ():
            row = totals.setdefault(element, {"members": [], **{t: 0.0 for t in LOAD_TYPES}})
            row["members"].append(str(member))
            for t, value in by_type.items():
                row[t] += value
    rows = []
    for element, row in totals.items():
        box = by_id.get(element)
        rows.append({
            "global_id": element,
            "name": box.name if box else "",
            "ifc_class": box.ifc_class if box else "",
            "storey": box.storey if box else "",
            "member_count": len(row["members"]),
            **{f"{_NAMES[t]}_reaction_{force}": row[t] * f_force for t in LOAD_TYPES},
            "members": "; ".join(row["members"]),
        })
    columns = ["global_id", "name", "ifc_class", "storey", "member_count",
               *(f"{_NAMES[t]}_reaction_{force}" for t in LOAD_TYPES), "members"]
    return pd.DataFrame(rows, columns=columns).round(3).map(neutralise)


def write_reactions_csv(table: pd.DataFrame, elements: list, path: Path, units, rules: dict) -> Path:
    """Write the reactions list to ``path`` atomically."""
    frame = reactions_frame(table, elements, units, rules)
    with atomic_target(path) as tmp:
        frame.to_csv(tmp, index=False, encoding="utf-8")
    return Path(path)
