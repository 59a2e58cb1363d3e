"""Reference design values of visually graded dimension lumber against the published table.

Reference: American Wood Council, *National Design Specification (NDS) Supplement: Design Values
for Wood Construction*, 2018 edition, Table 4A (Douglas Fir-Larch, Hem-Fir, Spruce-Pine-Fir;
2"-4" thick, 2" and wider; psi). Specific gravity G: AWC, *NDS* 2018, Table 12.3.3A.

Only values seen in a reproduction of the table are asserted as oracles; every value must equal
the published one exactly (tolerance 0 psi; G tolerance 0.005).
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
PROPERTIES = ("Fb", "Ft", "Fv", "Fc_perp", "Fc", "E", "Emin")
TOL_PSI = 0.0
TOL_G = 0.005

# NDS Supplement 2018, Table 4A: Fb, Ft, Fv, Fc_perp, Fc, E, Emin (psi)
TABLE_4A = {
    ("Douglas Fir-Larch", "Select Structural"): (1500, 1000, 180, 625, 1700, 1_900_000, 690_000),
    ("Douglas Fir-Larch", "No.1 & Btr"): (1200, 800, 180, 625, 1550, 1_800_000, 660_000),
    ("Douglas Fir-Larch", "No.1"): (1000, 675, 180, 625, 1500, 1_700_000, 620_000),
    # current value 900 (NDS 2012-2018 Supplements); 875 is the pre-2001 value of older span tables
    ("Douglas Fir-Larch", "No.2"): (900, 575, 180, 625, 1350, 1_600_000, 580_000),
    ("Hem-Fir", "Select Structural"): (1400, 925, 150, 405, 1500, 1_600_000, 580_000),
    # current value 975; 950 is the pre-2001 value
    ("Hem-Fir", "No.1"): (975, 625, 150, 405, 1350, 1_500_000, 550_000),
    ("Hem-Fir", "No.2"): (850, 525, 150, 405, 1300, 1_300_000, 470_000),
    # Table 4A prints one grade "No.1/No.2" for SPF
    ("Spruce-Pine-Fir", "No.1"): (875, 450, 135, 425, 1150, 1_400_000, 510_000),
    ("Spruce-Pine-Fir", "No.2"): (875, 450, 135, 425, 1150, 1_400_000, 510_000),
}

# NDS Supplement 2018, Table 4A, SPF Select Structural without Fb (Fb is checked separately below)
SPF_SELECT_STRUCTURAL = {"Ft": 700, "Fv": 135, "Fc_perp": 425, "Fc": 1400, "E": 1_500_000, "Emin": 550_000}

# Specific gravity G: NDS 2018, Table 12.3.3A (DF-L, SPF); NDS Supplement 2018, Table 4A (Hem-Fir)
SPECIFIC_GRAVITY = {"Douglas Fir-Larch": 0.50, "Hem-Fir": 0.43, "Spruce-Pine-Fir": 0.42}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


def dimension_row(species, grade):
    table = read_rules("nds2018/reference_values.csv")
    rows = table[(table.species == species) & (table.grade == grade) & (table["product"] == "dimension")]
    assert len(rows) == 1, f"expected one dimension row for {species} {grade}"
    return rows.iloc[0]


@pytest.mark.parametrize(("species", "grade"), sorted(TABLE_4A))
def test_table_4a_values(species, grade):
    row = dimension_row(species, grade)
    for name, published in zip(PROPERTIES, TABLE_4A[(species, grade)]):
        assert abs(row[name] - published) <= TOL_PSI, f"{species} {grade} {name}"
    assert row["nominal_depth"] == "*"
    assert row["status"] == "seen"
    assert "NDS Supplement 2018, Table 4A" in row["source"]


def test_table_4a_spf_select_structural_seen_values():
    row = dimension_row("Spruce-Pine-Fir", "Select Structural")
    for name, published in SPF_SELECT_STRUCTURAL.items():
        assert abs(row[name] - published) <= TOL_PSI, name


def test_table_4a_spf_select_structural_fb_is_1250_not_1150():
    # NDS Supplement 2018, Table 4A: reproductions disagree (1150 / 1250). 1250 is derived: with it the
    # 2018 IRC Table R802.5.1(2) SPF SS ceiling-joist spans are reproduced to 0.4 in, 1150 misses by up to
    # 10.5 in. The row therefore carries status derived and says so in notes. Tolerance 0 psi.
    row = dimension_row("Spruce-Pine-Fir", "Select Structural")
    assert abs(row["Fb"] - 1250) <= TOL_PSI
    assert row["status"] == "derived"
    assert "Fb derived" in row["notes"]


@pytest.mark.parametrize("species", sorted(SPECIFIC_GRAVITY))
def test_specific_gravity(species):
    table = read_rules("nds2018/reference_values.csv")
    rows = table[(table.species == species) & (table["product"] == "dimension")]
    assert len(rows) >= 3
    for value in rows["G"]:
        assert abs(value - SPECIFIC_GRAVITY[species]) <= TOL_G
