"""NDS checks on the beam analysis (continuous spans, cantilevers, point loads).

Sources, each named beside its test: AWC, *Beam Design Formulas with Shear and Moment Diagrams*
(Design Aid No. 6, 2007); AWC, *NDS Structural Wood Design Examples 2015/2018*, Example E1.2a;
NDS 2018 clauses as cited; IBC 2018 Table 1604.3 (cantilever L taken as twice its length).
"""

import numpy as np
import pytest

from conftest import PLF, member, run_basis
from ifccheck.model import AnalysisInput, LoadRecord, SupportRecord

UTILS = ["util_bending", "util_shear", "util_deflection_live", "util_deflection_total", "util_bearing"]


def _with_analysis(record, length, supports, loads=()):
    record.analysis = AnalysisInput(length=length, supports=list(supports), loads=list(loads))
    return record


def test_simple_spans_agree_with_the_closed_form_path():
    # the simple-span uniform case must give the same numbers by formula and by analysis (common practice)
    rng = np.random.default_rng(7)
    closed, analysed = [], []
    for k in range(60):
        L = float(rng.uniform(60, 300))
        lb = float(rng.uniform(1.5, 5.5))
        d = float(rng.choice([5.5, 7.25, 9.25, 11.25]))
        inputs = {"DeadLoad": float(rng.uniform(5, 40)) * PLF, "LiveLoad": float(rng.uniform(10, 200)) * PLF,
                  "SnowLoad": float(rng.uniform(0, 100)) * PLF, "BearingLength": lb, "Species": "DF-L",
                  "Grade": "No.2", "ContinuouslyBraced": bool(rng.integers(2)), "SelfWeightIncluded": True}
        closed.append(member(1.5, d, L - lb, inputs, ptype="BEAM", name=f"C{k}", clear=True))
        a = member(1.5, d, L - lb, inputs, ptype="BEAM", name=f"A{k}", clear=True)
        analysed.append(_with_analysis(a, L, [SupportRecord(0.0), SupportRecord(L)]))
    t = run_basis(closed + analysed)
    c, a = t.iloc[:60], t.iloc[60:]
    for column in UTILS + ["max_util", "required_S", "required_I", "required_A"]:
        assert a[column].to_numpy() == pytest.approx(c[column].to_numpy(), rel=1e-6), column
    assert list(a["governing_check"]) == list(c["governing_check"])


def test_awc_example_e1_2a_in_full():
    # AWC Examples E1.2a: 4x16 DF-L SS, 20 ft simple span, concentrated load at midspan, no lateral
    # support between ends: le 375 in, RB 21.6, FbE 1776 psi, CL 0.876, F'b 1313 psi (CD 1.0 here, live load)
    inputs = {"Species": "DF-L", "Grade": "Select Structural", "ContinuouslyBraced": False,
              "SelfWeightIncluded": True, "LiveLoad": 0.0}
    rec = _with_analysis(member(3.5, 15.25, 240.0, inputs, ptype="BEAM"), 240.0,
                         [SupportRecord(0.0), SupportRecord(240.0)], [LoadRecord("L", "point", 2000.0, 120.0)])
    row = run_basis([rec]).iloc[0]
    assert row.effective_length == pytest.approx(1.37 * 240 + 3 * 15.25, abs=1e-9)  # 374.55, published 375
    assert row.unbraced_length_used == pytest.approx(240.0)
    assert row.R_B == pytest.approx(21.6, abs=0.05)
    assert row.F_bE == pytest.approx(1776, abs=1.0)
    assert row.C_L == pytest.approx(0.876, abs=0.0005)
    assert row.F_b_prime == pytest.approx(1313, abs=1.0)
    assert row.governing_combination == "D+L" and row.bending_edge == "top"
    assert row.f_b == pytest.approx(2000 * 240 / 4 / (3.5 * 15.25**2 / 6), rel=1e-9)  # M = PL/4


def _two_span(w_plf, L, lb=3.5):
    inputs = {"Species": "DF-L", "Grade": "No.2", "SelfWeightIncluded": True, "ContinuouslyBraced": True,
              "BearingLength": lb}
    rec = member(1.5, 11.25, 2 * L, inputs, ptype="JOIST")
    return _with_analysis(rec, 2 * L, [SupportRecord(0.0), SupportRecord(L), SupportRecord(2 * L)],
                          [LoadRecord("L", "uniform", w_plf * PLF, 0.0, 2 * L)])


def test_two_equal_spans_interior_moment_and_reaction():
    # AWC Design Aid No. 6, two equal spans, uniform load: interior reaction 1.25 wL, moment at the
    # interior support -wL²/8 (bottom edge in compression, unbraced over the negative-moment stretch)
    w, L = 60.0, 144.0
    row = run_basis([_two_span(w, L)]).iloc[0]
    assert row.support_count == 3 and row.bending_edge == "bottom"
    assert row.governing_location == pytest.approx(L, abs=1e-6) or row.governing_check != "BENDING"
    assert row.f_b == pytest.approx(w * PLF * L**2 / 8 / (1.5 * 11.25**2 / 6), rel=1e-6)
    Cb = (3.5 + 0.375) / 3.5  # NDS 3.10.4 at the interior support (more than 3 in from the end)
    expected_bearing = 1.25 * w * PLF * L / (1.5 * 3.5 * 625 * Cb)
    assert row.util_bearing == pytest.approx(expected_bearing, rel=1e-6)
    # the negative-moment stretch runs from 0.75L to 1.25L (zero moment at 3L/4 from each end); the
    # bottom edge is held at the support, so lu = L/4 each side; lu/d < 7: le = 2.06 lu (NDS Table 3.3.3)
    lu = 0.25 * L
    assert lu / 11.25 < 7
    assert row.effective_length == pytest.approx(2.06 * lu, rel=1e-6)


def test_cantilever_with_end_load_deflection_uses_twice_its_length():
    # AWC Design Aid No. 6, cantilever, concentrated load at free end: M = PL, Δ = PL³/3EI;
    # IBC 2018 Table 1604.3 footnote: L for a cantilever is twice its length
    P, L = 300.0, 48.0
    inputs = {"Species": "DF-L", "Grade": "No.2", "SelfWeightIncluded": True, "ContinuouslyBraced": True,
              "LiveDeflectionLimit": 360, "TotalDeflectionLimit": 240}
    rec = _with_analysis(member(1.5, 9.25, L, inputs, ptype="JOIST"), L,
                         [SupportRecord(0.0, "fixed")], [LoadRecord("L", "point", P, L)])
    row = run_basis([rec]).iloc[0]
    EI = 1_600_000 * 1.5 * 9.25**3 / 12
    assert row.util_deflection_live == pytest.approx((P * L**3 / (3 * EI)) / (2 * L / 360), rel=1e-6)
    assert row.bending_edge == "bottom"
    assert row.f_b == pytest.approx(P * L / (1.5 * 9.25**2 / 6), rel=1e-6)


def test_uplift_is_a_failing_check():
    # ASCE 7-16 2.4.1 combination 0.6D + 0.6W with net upward wind: the supports pull (common practice)
    inputs = {"Species": "DF-L", "Grade": "No.2", "SelfWeightIncluded": True, "DeadLoad": 10 * PLF,
              "WindLoad": -60 * PLF}
    row = run_basis([member(1.5, 9.25, 144.0, inputs, ptype="RAFTER")]).iloc[0]
    assert row.status == "FAIL" and row.governing_check == "UPLIFT"
    assert row.governing_combination == "0.6D+0.6W"
    assert row.uplift_force == pytest.approx((0.6 * 10 - 0.6 * 60) * PLF * (144 - 1.5) / 2 * -1, rel=1e-6)


def test_analysis_loads_win_over_the_input_property_set_and_the_reason_says_so():
    inputs = {"Species": "DF-L", "Grade": "No.2", "SelfWeightIncluded": True, "LiveLoad": 500 * PLF}
    rec = _with_analysis(member(1.5, 9.25, 144.0, inputs, ptype="JOIST"), 144.0,
                         [SupportRecord(0.0), SupportRecord(144.0)], [LoadRecord("L", "uniform", 40 * PLF, 0.0, 144.0)])
    row = run_basis([rec]).iloc[0]
    assert "ifccheck_DesignInput loads are not used" in row.reason
    # M = wL²/8 with the analysis data's 40 plf, not the property set's 500 plf
    assert row.f_b == pytest.approx(40 * PLF * 144**2 / 8 / (1.5 * 9.25**2 / 6), rel=1e-6)


def _beam(name, length, supports, loads, b=1.5, d=11.25, ptype="BEAM", grade="No.2"):
    inputs = {"Species": "DF-L", "Grade": grade, "SelfWeightIncluded": True, "ContinuouslyBraced": True}
    return _with_analysis(member(b, d, length, inputs, ptype=ptype, name=name), length, supports, loads)


def test_a_joist_framing_into_a_girder_loads_it_with_its_reaction():
    # load path (common practice): the joist's end reaction w·L/2 is a point load on the girder; a
    # simple-span girder with a point load P at a: R1 = P(L - a)/L, M = P·a·(L - a)/L (AWC Design Aid No. 6)
    w, Lj, Lg, a = 80.0, 144.0, 192.0, 64.0
    joist = _beam("J1", Lj, [SupportRecord(0.0), SupportRecord(Lj, carrier="guid-G1", carrier_x=a)],
                  [LoadRecord("L", "uniform", w * PLF, 0.0, Lj)], ptype="JOIST")
    girder = _beam("G1", Lg, [SupportRecord(0.0), SupportRecord(Lg)], [], b=3.0)
    t = run_basis([girder, joist]).set_index("name")
    P = w * PLF * Lj / 2
    S = 3.0 * 11.25**2 / 6
    assert t.loc["G1", "f_b"] == pytest.approx(P * a * (Lg - a) / Lg / S, rel=1e-6)
    assert t.loc["G1", "status"] != "NOT_CHECKED"


def test_a_carrier_of_an_unchecked_member_and_a_cycle_are_not_checked():
    j = _beam("J1", 144.0, [SupportRecord(0.0), SupportRecord(144.0, carrier="guid-G1", carrier_x=50.0)],
              [LoadRecord("L", "uniform", 5.0, 0.0, 144.0)], grade="Premium X")
    g = _beam("G1", 192.0, [SupportRecord(0.0), SupportRecord(192.0)], [])
    a = _beam("A", 100.0, [SupportRecord(0.0), SupportRecord(100.0, carrier="guid-B", carrier_x=50.0)],
              [LoadRecord("D", "uniform", 5.0, 0.0, 100.0)])
    b = _beam("B", 100.0, [SupportRecord(0.0), SupportRecord(100.0, carrier="guid-A", carrier_x=50.0)],
              [LoadRecord("D", "uniform", 5.0, 0.0, 100.0)])
    t = run_basis([j, g, a, b]).set_index("name")
    assert t.loc["G1", "status"] == "NOT_CHECKED" and "carries J1" in t.loc["G1", "reason"]
    assert "cycle" in t.loc["A", "reason"] and "cycle" in t.loc["B", "reason"]
