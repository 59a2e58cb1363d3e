"""Load duration factor CD against the published table.

Reference: American Wood Council, *National Design Specification for Wood Construction* (NDS),
2018 edition, Table 2.3.2 (frequently used load duration factors, ASD). Roof live load takes the
seven-day value, named roof live load against 1.25 in NDS 2005. Exact match (tolerance 0).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0

# NDS 2018, Table 2.3.2: load type -> (load duration, CD)
TABLE_2_3_2 = {
    "D": ("permanent", 0.9),
    "L": ("ten years", 1.0),
    "S": ("two months", 1.15),
    "Lr": ("seven days", 1.25),
    "W": ("ten minutes", 1.6),
}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize("load_type", sorted(TABLE_2_3_2))
def test_load_duration_factor(load_type):
    table = read_rules("nds2018/load_duration.csv").set_index("load_type")
    duration, published = TABLE_2_3_2[load_type]
    assert abs(table.loc[load_type, "CD"] - published) <= TOL
    assert table.loc[load_type, "duration"] == duration
    assert table.loc[load_type, "status"] == "seen"


def test_only_the_five_load_types():
    table = read_rules("nds2018/load_duration.csv")
    assert sorted(table.load_type) == sorted(TABLE_2_3_2)
