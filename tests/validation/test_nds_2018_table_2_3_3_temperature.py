"""Temperature factor Ct against the published table.

Reference: American Wood Council, *National Design Specification for Wood Construction* (NDS),
2018 edition, Table 2.3.3 (temperature factor Ct; bands T <= 100 degF, 100 < T <= 125 degF,
125 < T <= 150 degF; dry or wet in-service moisture). Exact match (tolerance 0).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
TOL = 0.0
BANDS_F = (100, 125, 150)

# NDS 2018, Table 2.3.3: (properties, moisture) -> Ct for the three bands
TABLE_2_3_3 = {
    (("Ft", "E", "Emin"), "dry"): (1.0, 0.9, 0.9),
    (("Ft", "E", "Emin"), "wet"): (1.0, 0.9, 0.9),
    (("Fb", "Fv", "Fc", "Fc_perp"), "dry"): (1.0, 0.8, 0.7),
    (("Fb", "Fv", "Fc", "Fc_perp"), "wet"): (1.0, 0.7, 0.5),
}
CASES = [
    (prop, moisture, band, ct)
    for (props, moisture), values in TABLE_2_3_3.items()
    for prop in props
    for band, ct in zip(BANDS_F, values)
]


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


@pytest.mark.parametrize(("prop", "moisture", "t_max", "published"), CASES)
def test_temperature_factor(prop, moisture, t_max, published):
    table = read_rules("nds2018/temperature.csv")
    rows = table[(table.property == prop) & (table.moisture == moisture) & (table.T_max_F == t_max)]
    assert len(rows) == 1
    assert abs(rows.iloc[0]["Ct"] - published) <= TOL
    assert rows.iloc[0]["status"] == "seen"


def test_table_has_exactly_these_rows():
    assert len(read_rules("nds2018/temperature.csv")) == len(CASES) == 42
