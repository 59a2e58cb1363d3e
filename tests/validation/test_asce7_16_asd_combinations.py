"""Basic ASD load combinations against the published standard.

Reference: ASCE/SEI 7-16, *Minimum Design Loads and Associated Criteria for Buildings and Other
Structures*, Section 2.4.1 (basic combinations for allowable stress design, combinations 1-7
without earthquake; "(Lr or S or R)" expanded, R not carried). The same terms are printed in IBC
2018, Section 1605.3.1, and ASCE 7-22, Section 2.4.1, where they were read. 0.45W = 0.75(0.6W).
Coefficients must match exactly (tolerance 1e-12, floating-point rounding of 0.75 * 0.6).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 1e-12
LOADS = ("D", "L", "Lr", "S", "W")

# ASCE 7-16, 2.4.1: name -> coefficients of D, L, Lr, S, W
COMBINATIONS = {
    "D": (1.0, 0, 0, 0, 0),  # (1)
    "D+L": (1.0, 1.0, 0, 0, 0),  # (2)
    "D+Lr": (1.0, 0, 1.0, 0, 0),  # (3)
    "D+S": (1.0, 0, 0, 1.0, 0),  # (3)
    "D+0.75L+0.75Lr": (1.0, 0.75, 0.75, 0, 0),  # (4)
    "D+0.75L+0.75S": (1.0, 0.75, 0, 0.75, 0),  # (4)
    "D+0.6W": (1.0, 0, 0, 0, 0.6),  # (5)
    "D+0.75L+0.45W+0.75Lr": (1.0, 0.75, 0.75, 0, 0.75 * 0.6),  # (6)
    "D+0.75L+0.45W+0.75S": (1.0, 0.75, 0, 0.75, 0.75 * 0.6),  # (6)
    "0.6D+0.6W": (0.6, 0, 0, 0, 0.6),  # (7)
}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize("name", list(COMBINATIONS))
def test_combination_coefficients(name):
    table = read_rules("asce7_16/asd_combinations.csv").set_index("name")
    for load, published in zip(LOADS, COMBINATIONS[name]):
        assert abs(table.loc[name, load] - published) <= TOL, f"{name} {load}"
    assert table.loc[name, "status"] in {"seen", "derived"}


def test_exactly_these_combinations_in_order():
    assert list(read_rules("asce7_16/asd_combinations.csv")["name"]) == list(COMBINATIONS)
