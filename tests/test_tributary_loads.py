"""Loads by tributary width: the project rules' area loads for a storey times each member's
tributary width from its framing run (hand calculations, common practice: joists at 16 in on
centre under 40 psf live carry 40 × 16/12 = 53.3 plf)."""

import pytest

from conftest import PLF, PSF, member, run_basis

RULES = {
    "area_loads": [{"storey": "Level 2", "dead": "10 psf", "live": "40 psf"}],
}


def _joists(n=10, spacing=16.0, inputs=None):
    records = []
    for k in range(n):
        rec = member(1.5, 9.25, 144.0, {"Species": "DF-L", "Grade": "No.2", **(inputs or {})}, name=f"J{k + 1:02d}")
        rec.storey = "Level 2"
        rec.axis_start = (0.0, k * spacing, 120.0)
        rec.axis_end = (144.0, k * spacing, 120.0)
        records.append(rec)
    return records


def test_interior_joists_at_16_in_carry_53_plf_live():
    t = run_basis(_joists(), RULES).set_index("name")
    assert t.loc["J05", "tributary_width"] == pytest.approx(16.0)
    assert t.loc["J05", "w_L"] / PLF == pytest.approx(40 * 16 / 12, rel=1e-9)  # 53.3 plf
    assert t.loc["J01", "tributary_width"] == pytest.approx(8.0)  # edge of the run: half a spacing
    assert t.loc["J01", "w_L"] / PLF == pytest.approx(40 * 8 / 12, rel=1e-9)
    assert "area_loads[1] (storey 'Level 2') (D, L) x tributary width 16.0 in (framing run)" in t.loc["J05", "load_sources"]
    assert t.loc["J05", "repetitive"]  # NDS 4.3.9: 3 or more at 24 in or less


def test_tributary_width_of_the_input_property_set_wins():
    t = run_basis(_joists(inputs={"TributaryWidth": 12.0}), RULES).set_index("name")
    assert t.loc["J05", "w_L"] / PLF == pytest.approx(40 * 12 / 12, rel=1e-9)


def test_loads_of_the_input_property_set_win_over_the_project_area_loads():
    t = run_basis(_joists(inputs={"LiveLoad": 30 * PLF}), RULES).set_index("name")
    assert t.loc["J05", "w_L"] / PLF == pytest.approx(30.0, rel=1e-9)


def test_a_lone_member_with_area_loads_but_no_neighbours_is_not_checked():
    t = run_basis(_joists(n=1), RULES).set_index("name")
    assert t.loc["J01", "status"] == "NOT_CHECKED"
    assert "no tributary width" in t.loc["J01", "reason"]


def test_area_loads_in_psf_and_kpa_agree():
    kpa = {"area_loads": [{"storey": "Level 2", "dead": "0.478803 kPa", "live": "1.915212 kPa"}]}
    a = run_basis(_joists(), RULES)["w_L"].to_numpy()
    b = run_basis(_joists(), kpa)["w_L"].to_numpy()
    assert b == pytest.approx(a, rel=1e-5)  # 1 psf = 0.0478803 kPa (1 lbf/ft² by definition)
    assert PSF == pytest.approx(1 / 144)
