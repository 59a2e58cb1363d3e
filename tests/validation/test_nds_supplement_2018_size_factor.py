"""Size factor CF and flat use factor Cfu of dimension lumber against the published tables.

Reference: American Wood Council, *NDS Supplement: Design Values for Wood Construction*, 2018
edition, Table 4A adjustment factors: size factors CF (grades Select Structural, No.1 & Btr, No.1,
No.2, No.3) and flat use factors Cfu. Exact match required (tolerance 0).
"""

import math
from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0

# NDS Supplement 2018, Table 4A, size factors: nominal depth -> (Fb 2"&3" thick, Fb 4" thick, Ft, Fc)
CF_TABLE = {
    2: (1.5, 1.5, 1.5, 1.15), 3: (1.5, 1.5, 1.5, 1.15), 4: (1.5, 1.5, 1.5, 1.15),
    5: (1.4, 1.4, 1.4, 1.1),
    6: (1.3, 1.3, 1.3, 1.1),
    8: (1.2, 1.3, 1.2, 1.05),
    10: (1.1, 1.2, 1.1, 1.0),
    12: (1.0, 1.1, 1.0, 1.0),
    14: (0.9, 1.0, 0.9, 0.9), 16: (0.9, 1.0, 0.9, 0.9),  # "14 in and wider"
}
# NDS Supplement 2018, Table 4A, flat use factors: nominal width -> (2"&3" thick, 4" thick); None = no value
CFU_TABLE = {
    2: (1.0, None), 3: (1.0, None),
    4: (1.1, 1.0),
    5: (1.1, 1.05),
    6: (1.15, 1.05),
    8: (1.15, 1.05),
    10: (1.2, 1.1), 12: (1.2, 1.1), 14: (1.2, 1.1),  # "10 in and wider"
}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


def row_for(table, low, high, size):
    rows = table[(table[low] <= size) & (size <= table[high])]
    assert len(rows) == 1, f"nominal size {size} in must fall in exactly one row"
    return rows.iloc[0]


@pytest.mark.parametrize("depth", sorted(CF_TABLE))
def test_size_factor(depth):
    table = read_rules("nds2018/size_factor.csv")
    row = row_for(table[table.grade_group == "structural"], "nominal_depth_min", "nominal_depth_max", depth)
    columns = ("CF_Fb_thick_2_3", "CF_Fb_thick_4", "CF_Ft", "CF_Fc")
    for column, published in zip(columns, CF_TABLE[depth]):
        assert abs(row[column] - published) <= TOL, f"{depth} in {column}"
    assert row["status"] == "seen"


@pytest.mark.parametrize("width", sorted(CFU_TABLE))
def test_flat_use_factor(width):
    row = row_for(read_rules("nds2018/flat_use.csv"), "nominal_width_min", "nominal_width_max", width)
    for column, published in zip(("Cfu_thick_2_3", "Cfu_thick_4"), CFU_TABLE[width]):
        if published is None:
            assert math.isnan(row[column]), f"{width} in {column} must be blank"
        else:
            assert abs(row[column] - published) <= TOL, f"{width} in {column}"
    assert row["status"] == "seen"
