"""The CSV exception list: formula-like text is neutralised, units are in the column names."""

import pytest

from conftest import PLF, member, run_basis
from ifccheck.model import ModelUnits
from ifccheck.report.csv_out import exceptions_frame, neutralise
from ifccheck.rules import load_rules


@pytest.mark.parametrize("text", ["=HYPERLINK(\"x\")", "+1", "-2+3", "@SUM(A1)", "\tx", "\rx"])
def test_cells_a_spreadsheet_would_run_are_neutralised(text):
    # common practice (CSV injection): prefix a quote so the cell stays text
    assert neutralise(text) == "'" + text


def test_plain_text_and_numbers_stay_as_they_are():
    assert neutralise("J-U-01") == "J-U-01" and neutralise(-1.5) == -1.5


def test_member_names_and_units_in_the_frame():
    row = run_basis([member(1.5, 5.5, 200.0, {"LiveLoad": 100 * PLF, "Species": "DF-L", "Grade": "No.2"},
                            name="=cmd()")])
    row["provenance"] = "test"
    imperial = ModelUnits(to_core={}, system="imperial")
    frame = exceptions_frame(row, imperial, load_rules())
    assert frame["name"].iloc[0] == "'=cmd()"
    assert frame["design_span_ft"].iloc[0] == pytest.approx((200.0 - 1.5) / 12, abs=1e-4)
    assert frame["live_load_plf"].iloc[0] == pytest.approx(100.0, abs=1e-4)
    metric = exceptions_frame(row, ModelUnits(to_core={}, system="metric"), load_rules())
    assert metric["design_span_m"].iloc[0] == pytest.approx((200.0 - 1.5) * 0.0254, abs=1e-4)
    assert metric["live_load_kN_per_m"].iloc[0] == pytest.approx(100 * 4.4482216152605 / 0.3048 / 1000, abs=1e-4)
