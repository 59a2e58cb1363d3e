"""Wet service factor CM against the published tables.

Reference: American Wood Council, *NDS Supplement: Design Values for Wood Construction*, 2018
edition, wet service factors CM of Table 4A (dimension lumber, moisture content above 19 %, with
the Fb*CF <= 1150 psi and Fc*CF <= 750 psi exceptions), Table 4D (timbers 5" x 5" and larger) and
Table 5A (glulam, moisture content 16 % or more). Exact match (tolerance 0).
"""

import math
from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0
PROPERTIES = ("Fb", "Ft", "Fv", "Fc_perp", "Fc", "E", "Emin")

# CM per property (Fb, Ft, Fv, Fc_perp, Fc, E, Emin)
TIMBERS = (1.0, 1.0, 1.0, 0.67, 0.91, 1.0, 1.0)  # NDS Supplement 2018, Table 4D
CM = {
    "dimension": (0.85, 1.0, 0.97, 0.67, 0.8, 0.9, 0.9),  # NDS Supplement 2018, Table 4A
    "beams_stringers": TIMBERS,
    "posts_timbers": TIMBERS,
    "glulam": (0.8, 0.8, 0.875, 0.53, 0.73, 0.833, 0.833),  # NDS Supplement 2018, Table 5A
}
# NDS Supplement 2018, Table 4A: CM = 1.0 when (Fb)(CF) <= 1150 psi and when (Fc)(CF) <= 750 psi
THRESHOLDS = {("dimension", "Fb"): 1150, ("dimension", "Fc"): 750}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize("product", sorted(CM))
def test_wet_service_factor(product):
    table = read_rules("nds2018/wet_service.csv")
    rows = table[table["product"] == product].set_index("property")
    assert sorted(rows.index) == sorted(PROPERTIES)
    for prop, published in zip(PROPERTIES, CM[product]):
        assert abs(rows.loc[prop, "CM"] - published) <= TOL, f"{product} {prop}"
        threshold = THRESHOLDS.get((product, prop))
        if threshold is None:
            assert math.isnan(rows.loc[prop, "keep_1_if_FCF_at_most"]), f"{product} {prop}"
        else:
            assert abs(rows.loc[prop, "keep_1_if_FCF_at_most"] - threshold) <= TOL
        assert rows.loc[prop, "status"] == "seen"
