"""Deflection limits against the published table.

Reference: International Code Council, *International Building Code* 2018, Table 1604.3
(deflection limits; columns L, S or W, and D + L). live_n is the n of l/n for L (roof: Lr, S);
total_n for D + L. Exact match (tolerance 0).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0

# IBC 2018, Table 1604.3: member use -> (n for L or Lr or S, n for D + L)
TABLE_1604_3 = {
    "floor": (360, 240),
    "roof_plaster_ceiling": (360, 240),
    "roof_nonplaster_ceiling": (240, 180),
    "roof_no_ceiling": (180, 120),
}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize("member_use", sorted(TABLE_1604_3))
def test_deflection_limit(member_use):
    table = read_rules("ibc2018/deflection_limits.csv").set_index("member_use")
    live_n, total_n = TABLE_1604_3[member_use]
    assert abs(table.loc[member_use, "live_n"] - live_n) <= TOL
    assert abs(table.loc[member_use, "total_n"] - total_n) <= TOL
    assert table.loc[member_use, "status"] == "seen"


def test_only_these_member_uses():
    assert sorted(read_rules("ibc2018/deflection_limits.csv")["member_use"]) == sorted(TABLE_1604_3)
