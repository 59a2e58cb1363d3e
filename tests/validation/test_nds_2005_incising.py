"""Incising factor Ci against the published table.

Reference: American Forest & Paper Association / American Wood Council, *National Design
Specification for Wood Construction* (NDS), 2005 edition, incising factor Ci for dimension lumber
(incisions at most 0.4 in deep, 3/8 in long, 1100 per square foot). Exact match (tolerance 0).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0

# NDS 2005, incising factor Ci
CI = {"E": 0.95, "Emin": 0.95, "Fb": 0.80, "Ft": 0.80, "Fc": 0.80, "Fv": 0.80, "Fc_perp": 1.00}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize("prop", sorted(CI))
def test_incising_factor(prop):
    table = read_rules("nds2018/incising.csv").set_index("property")
    assert abs(table.loc[prop, "Ci"] - CI[prop]) <= TOL
    assert table.loc[prop, "status"] == "seen"


def test_only_these_properties():
    assert sorted(read_rules("nds2018/incising.csv")["property"]) == sorted(CI)
