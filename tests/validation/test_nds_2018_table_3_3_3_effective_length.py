"""Effective length of bending members against the published table.

Reference: American Wood Council, *National Design Specification for Wood Construction* (NDS),
2018 edition, Table 3.3.3 (effective length le for bending members, le = a*lu + b*d).

Seen coefficients must match exactly (tolerance 0). Rows the rules mark memory are not oracles;
for them only presence and status are checked, plus a derived consistency check (hand
calculation below): where the table switches form at lu/d = 7, both forms give the same le within
0.02 d, as every seen pair does (e.g. 2.06*7 = 14.42 vs 1.63*7 + 3 = 14.41).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0
TOL_CONTINUITY_D = 0.02
OPEN_END = 1e9

# NDS 2018, Table 3.3.3, seen: (case, a lu/d value inside the seen range) -> (a, b)
SEEN = {
    ("single_span_uniform", 3.0): (2.06, 0.0),
    ("single_span_uniform", 10.0): (1.63, 3.0),  # row status memory only for its upper end
    ("single_span_point_centre", 3.0): (1.80, 0.0),
    ("single_span_point_centre", 20.0): (1.37, 3.0),
    ("single_span_point_centre_braced_centre", 10.0): (1.11, 0.0),
    ("single_span_two_points_braced", 10.0): (1.68, 0.0),
    ("single_span_three_points_braced", 10.0): (1.54, 0.0),
    ("cantilever_uniform", 3.0): (1.33, 0.0),  # coefficient seen; its lu/d < 7 range is memory
    ("cantilever_point_end", 3.0): (1.87, 0.0),  # coefficient seen; its lu/d < 7 range is memory
}
CASES = (
    "single_span_uniform",
    "single_span_point_centre",
    "single_span_point_centre_braced_centre",
    "single_span_two_points_braced",
    "single_span_three_points_braced",
    "cantilever_uniform",
    "cantilever_point_end",
    "single_span_equal_end_moments",
)
MEMORY_ONLY = ("single_span_equal_end_moments", "unspecified_loading")


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


def rows_of(case):
    table = read_rules("nds2018/effective_length.csv")
    return table[table.case == case].sort_values("lu_over_d_min")


def row_at(case, lu_over_d):
    rows = rows_of(case)
    hits = rows[(rows.lu_over_d_min <= lu_over_d) & (lu_over_d < rows.lu_over_d_max)]
    assert len(hits) == 1, f"{case}: lu/d = {lu_over_d} must fall in exactly one row"
    return hits.iloc[0]


@pytest.mark.parametrize(("case", "lu_over_d"), sorted(SEEN))
def test_seen_coefficients(case, lu_over_d):
    row = row_at(case, lu_over_d)
    a, b = SEEN[(case, lu_over_d)]
    assert abs(row["a"] - a) <= TOL
    assert abs(row["b"] - b) <= TOL


@pytest.mark.parametrize("case", ["single_span_point_centre", "single_span_point_centre_braced_centre",
                                  "single_span_two_points_braced", "single_span_three_points_braced"])
def test_fully_seen_cases_are_marked_seen(case):
    assert set(rows_of(case)["status"]) == {"seen"}


@pytest.mark.parametrize("case", CASES + ("unspecified_loading",))
def test_ranges_cover_all_slenderness_without_gaps(case):
    rows = rows_of(case)
    assert rows.iloc[0]["lu_over_d_min"] == 0
    assert rows.iloc[-1]["lu_over_d_max"] == OPEN_END
    assert list(rows.lu_over_d_max[:-1]) == list(rows.lu_over_d_min[1:])


@pytest.mark.parametrize("case", CASES + ("unspecified_loading",))
def test_le_continuous_where_the_form_changes(case):
    # derived: le/d = a*(lu/d) + b on both sides of each boundary
    rows = rows_of(case)
    for (_, left), (_, right) in zip(rows.iloc[:-1].iterrows(), rows.iloc[1:].iterrows()):
        x = right["lu_over_d_min"]
        assert abs((left["a"] * x + left["b"]) - (right["a"] * x + right["b"])) <= TOL_CONTINUITY_D


@pytest.mark.parametrize("case", MEMORY_ONLY)
def test_memory_cases_present_and_flagged(case):
    rows = rows_of(case)
    assert len(rows) >= 1
    assert set(rows["status"]) == {"memory"}
