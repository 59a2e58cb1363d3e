"""Southern Pine size-specific reference design values against the published table.

Reference: American Wood Council, *NDS Supplement: Design Values for Wood Construction*, 2018
edition, Table 4B (Southern Pine, visually graded dimension lumber, values effective 1 June 2013),
as given in metric by SFPA, *Southern Pine Use Guide* (metric edition). Specific gravity:
AWC, *NDS* 2018, Table 12.3.3A.

The psi values must equal the published ones exactly (tolerance 0 psi). The metric check converts
the guide's MPa/GPa values (1 MPa = 145.038 psi) and allows half a unit of their last printed digit
(0.05 MPa = 7.25 psi; 0.05 GPa = 7252 psi). Values the rules mark memory (Fv, Fc_perp, G of Select
Structural and No.1) are not oracles: only their presence and status are checked.
"""

from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[2] / "rules"
DEPTHS = ("4", "6", "8", "10", "12")
TOL_PSI = 0.0
PSI_PER_MPA = 145.038
TOL_MPA_ROUNDING = 0.05 * PSI_PER_MPA
TOL_GPA_ROUNDING = 0.05 * 1000 * PSI_PER_MPA

# NDS Supplement 2018, Table 4B, No.2, 2x4..2x12: Fb, Ft, Fc (psi); E 1,400,000, Emin 510,000,
# Fv 175, Fc_perp 565 for all widths
NO2_FB = (1100, 1000, 925, 800, 750)
NO2_FT = (675, 600, 550, 475, 450)
NO2_FC = (1450, 1400, 1350, 1300, 1250)
# SFPA Southern Pine Use Guide (metric), No.2, 2x4..2x12: Fb, Ft, Fc (MPa); E 9.7 GPa, Emin 3.5 GPa
NO2_FB_MPA = (7.6, 6.9, 6.4, 5.5, 5.2)
NO2_FT_MPA = (4.7, 4.1, 3.8, 3.3, 3.1)
NO2_FC_MPA = (10.0, 9.7, 9.3, 9.0, 8.6)
# NDS Supplement 2018, Table 4B, Fb (psi) 2x4..2x12 and E, Emin (psi) for No.1 and Select Structural
FB_BY_GRADE = {"No.1": (1500, 1350, 1250, 1050, 1000), "Select Structural": (2350, 2100, 1950, 1700, 1600)}
E_BY_GRADE = {"No.1": (1_600_000, 580_000), "Select Structural": (1_800_000, 660_000)}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


def southern_pine(grade):
    table = read_rules("nds2018/reference_values.csv")
    rows = table[(table.species == "Southern Pine") & (table.grade == grade) & (table["product"] == "dimension")]
    return rows.set_index("nominal_depth").loc[list(DEPTHS)]


@pytest.mark.parametrize("index", range(len(DEPTHS)))
def test_no2_size_specific_values(index):
    row = southern_pine("No.2").iloc[index]
    assert abs(row["Fb"] - NO2_FB[index]) <= TOL_PSI
    assert abs(row["Ft"] - NO2_FT[index]) <= TOL_PSI
    assert abs(row["Fc"] - NO2_FC[index]) <= TOL_PSI
    assert abs(row["E"] - 1_400_000) <= TOL_PSI
    assert abs(row["Emin"] - 510_000) <= TOL_PSI
    assert abs(row["Fv"] - 175) <= TOL_PSI
    assert abs(row["Fc_perp"] - 565) <= TOL_PSI
    assert abs(row["G"] - 0.55) <= 0.005  # NDS 2018, Table 12.3.3A
    assert row["status"] == "seen"


@pytest.mark.parametrize("index", range(len(DEPTHS)))
def test_no2_matches_metric_reproduction(index):
    # SFPA Southern Pine Use Guide (metric): hand conversion MPa * 145.038 = psi
    row = southern_pine("No.2").iloc[index]
    assert abs(row["Fb"] - NO2_FB_MPA[index] * PSI_PER_MPA) <= TOL_MPA_ROUNDING
    assert abs(row["Ft"] - NO2_FT_MPA[index] * PSI_PER_MPA) <= TOL_MPA_ROUNDING
    assert abs(row["Fc"] - NO2_FC_MPA[index] * PSI_PER_MPA) <= TOL_MPA_ROUNDING
    assert abs(row["E"] - 9.7 * 1000 * PSI_PER_MPA) <= TOL_GPA_ROUNDING
    assert abs(row["Emin"] - 3.5 * 1000 * PSI_PER_MPA) <= TOL_GPA_ROUNDING


@pytest.mark.parametrize("grade", sorted(FB_BY_GRADE))
def test_no1_and_select_structural_seen_values(grade):
    rows = southern_pine(grade)
    E, Emin = E_BY_GRADE[grade]
    for index, published_fb in enumerate(FB_BY_GRADE[grade]):
        row = rows.iloc[index]
        assert abs(row["Fb"] - published_fb) <= TOL_PSI
        assert abs(row["E"] - E) <= TOL_PSI
        assert abs(row["Emin"] - Emin) <= TOL_PSI


@pytest.mark.parametrize("grade", sorted(FB_BY_GRADE))
def test_no1_and_select_structural_memory_values_flagged(grade):
    # Fv, Fc_perp and G of these grades are recollections: present, but the rows say memory
    for _, row in southern_pine(grade).iterrows():
        assert row["status"] == "memory"
        assert "memory" in row["notes"]
        assert row[["Fv", "Fc_perp", "G"]].notna().all()
        assert row[["Ft", "Fc"]].isna().all()  # not known: left blank


def test_no_southern_pine_row_for_all_sizes():
    # Table 4B values are size-specific: no nominal_depth "*" row for Southern Pine dimension lumber
    table = read_rules("nds2018/reference_values.csv")
    sp = table[(table.species == "Southern Pine") & (table["product"] == "dimension")]
    assert len(sp) == 15
    assert "*" not in set(sp["nominal_depth"])
