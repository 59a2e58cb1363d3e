"""Creep factor Kcr for long-term deflection against the published clause.

Reference: American Wood Council, *National Design Specification for Wood Construction* (NDS),
2018 edition, Section 3.5.2 (Kcr = 1.5 for seasoned lumber and glulam in dry service; 2.0 for
unseasoned lumber and for wet service). Timbers are taken as unseasoned in dry service (common
practice: they are normally supplied green). Exact match (tolerance 0).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0

# NDS 2018, 3.5.2: (product, service) -> Kcr
KCR = {
    ("dimension", "dry"): 1.5,
    ("dimension", "wet"): 2.0,
    ("glulam", "dry"): 1.5,
    ("glulam", "wet"): 2.0,
    ("beams_stringers", "dry"): 2.0,  # unseasoned (common practice)
    ("beams_stringers", "wet"): 2.0,
    ("posts_timbers", "dry"): 2.0,  # unseasoned (common practice)
    ("posts_timbers", "wet"): 2.0,
}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize(("product", "service"), sorted(KCR))
def test_creep_factor(product, service):
    table = read_rules("nds2018/creep.csv")
    rows = table[(table["product"] == product) & (table.service == service)]
    assert len(rows) == 1
    assert abs(rows.iloc[0]["Kcr"] - KCR[(product, service)]) <= TOL


def test_exactly_these_rows():
    assert len(read_rules("nds2018/creep.csv")) == len(KCR)
