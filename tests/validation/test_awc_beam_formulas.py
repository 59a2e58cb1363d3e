"""The beam engine against published closed-form beam formulas.

Source: AWC, *Beam Design Formulas with Shear and Moment Diagrams*, Design Aid No. 6, 2007
edition (cited as "AWC DA6" with the case's title; figure numbers are from memory). Closed-form
results are checked to 0.1 %; coefficients printed rounded (0.0957, 0.0092, 0.472, wl^4/185EI)
are checked at their printed precision (half a unit of the last printed digit).
Where a check is a hand calculation rather than a printed formula, the calculation is shown.
"""

from __future__ import annotations

import math

import pytest

from ifccheck.analysis import (
    BeamLayout,
    LinearLoad,
    PointLoad,
    PointMoment,
    Support,
    UniformLoad,
    analyse_beam,
    live_load_patterns,
)

L = 144.0  # in
W = 10.0  # lbf/in
EI = 1.6e6 * 1.5 * 9.25**3 / 12 * 10  # lbf*in^2, any positive value
CLOSED_FORM = 1e-3  # relative


def printed(value: float, coefficient: str) -> bool:
    """True when ``value`` rounds to the printed ``coefficient`` (within half its last digit)."""
    decimals = len(coefficient.split(".")[1]) if "." in coefficient else 0
    return abs(value - float(coefficient)) <= 0.5 * 10.0**-decimals + 1e-12


def simple(loads, length=L):
    layout = BeamLayout(length, (Support(0.0), Support(length, "roller")), EI)
    return analyse_beam(layout, loads).unit_cases["D"]


def two_spans(loads, combinations=None, width=0.0):
    supports = (Support(0.0, width=width), Support(L, width=width), Support(2 * L, width=width))
    return analyse_beam(BeamLayout(2 * L, supports, EI), loads, combinations)


# AWC DA6, "Simple Beam - Uniformly Distributed Load" (Figure 1): R = V = wl/2,
# Mmax (at center) = wl^2/8, Delta max (at center) = 5wl^4/384EI
def test_simple_span_uniform():
    r = simple([UniformLoad("D", W)])
    assert r.reactions == pytest.approx([W * L / 2] * 2, rel=CLOSED_FORM)
    assert abs(r.max_shear.value) == pytest.approx(W * L / 2, rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(W * L**2 / 8, rel=CLOSED_FORM)
    assert r.max_moment.x == pytest.approx(L / 2, rel=CLOSED_FORM)
    assert r.segments[0].max_deflection.value == pytest.approx(5 * W * L**4 / (384 * EI), rel=CLOSED_FORM)
    assert r.segments[0].max_deflection.x == pytest.approx(L / 2, rel=CLOSED_FORM)


# AWC DA6, "Simple Beam - Load Increasing Uniformly to One End" (Figure 2), W = total load = wl/2:
# R1 = W/3, R2 = 2W/3, Mmax (at x = l/sqrt(3) = 0.5774 l) = 2Wl/(9 sqrt 3) = 0.1283 Wl,
# Delta max (at x = l sqrt(1 - sqrt(8/15)) = 0.5193 l) = 0.01304 Wl^3/EI
def test_simple_span_load_increasing_to_one_end():
    r = simple([LinearLoad("D", 0.0, W, 0.0, L)])
    Wt = W * L / 2
    assert r.reactions == pytest.approx([Wt / 3, 2 * Wt / 3], rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(2 * Wt * L / (9 * math.sqrt(3)), rel=CLOSED_FORM)
    assert printed(r.max_moment.value / (Wt * L), "0.1283")
    assert r.max_moment.x / L == pytest.approx(0.5774, rel=CLOSED_FORM)
    d = r.segments[0].max_deflection
    assert printed(d.value * EI / (Wt * L**3), "0.01304")
    assert d.x / L == pytest.approx(math.sqrt(1 - math.sqrt(8 / 15)), rel=CLOSED_FORM)


# AWC DA6, "Simple Beam - Concentrated Load at Any Point" (Figure 8): R1 = Pb/l, R2 = Pa/l,
# Mmax (at point of load) = Pab/l, Delta at point of load = Pa^2b^2/3EIl,
# Delta max (at x = sqrt(a(a+2b)/3) when a > b) = Pab(a+2b) sqrt(3a(a+2b)) / 27EIl
@pytest.mark.parametrize("a", [0.3 * L, 0.5 * L, 0.8 * L])
def test_simple_span_point_load_anywhere(a):
    P = 2500.0
    b = L - a
    r = simple([PointLoad("D", P, a)])
    assert r.reactions == pytest.approx([P * b / L, P * a / L], rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(P * a * b / L, rel=CLOSED_FORM)
    assert r.max_moment.x == pytest.approx(a, rel=CLOSED_FORM)
    assert r.deflection(a)[0] == pytest.approx(P * a**2 * b**2 / (3 * EI * L), rel=CLOSED_FORM)
    big, small = max(a, b), min(a, b)  # the formula is written for the load nearer the right end
    d = r.segments[0].max_deflection
    expected = P * big * small * (big + 2 * small) * math.sqrt(3 * big * (big + 2 * small)) / (27 * EI * L)
    assert d.value == pytest.approx(expected, rel=CLOSED_FORM)
    x_far = math.sqrt(big * (big + 2 * small) / 3)
    assert d.x == pytest.approx(x_far if a >= b else L - x_far, rel=CLOSED_FORM)


# AWC DA6, "Simple Beam - Uniform Load Partially Distributed" (Figure 4; from memory):
# R1 = wb(2c + b)/2l, Mmax (at x = a + R1/w) = R1 (a + R1/2w)
def test_simple_span_partial_uniform():
    a, b = 30.0, 60.0
    c = L - a - b
    r = simple([UniformLoad("D", W, a, a + b)])
    R1 = W * b * (2 * c + b) / (2 * L)
    assert r.reactions[0] == pytest.approx(R1, rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(R1 * (a + R1 / (2 * W)), rel=CLOSED_FORM)
    assert r.max_moment.x == pytest.approx(a + R1 / W, rel=CLOSED_FORM)


# AWC DA6, "Cantilever Beam - Concentrated Load at Free End" (Figure 22): R = V = P,
# Mmax (at fixed end) = Pl, Delta max (at free end) = Pl^3/3EI. Our signs: hogging is negative.
@pytest.mark.parametrize("fixed_end", ["left", "right"])
def test_cantilever_end_point_load(fixed_end):
    P = 800.0
    x_fixed, x_free = (0.0, L) if fixed_end == "left" else (L, 0.0)
    r = analyse_beam(BeamLayout(L, (Support(x_fixed, "fixed"),), EI), [PointLoad("D", P, x_free)]).unit_cases["D"]
    assert r.reactions == pytest.approx([P], rel=CLOSED_FORM)
    assert r.min_moment.value == pytest.approx(-P * L, rel=CLOSED_FORM)
    assert r.min_moment.x == pytest.approx(x_fixed, abs=1e-9)
    d = r.segments[0].max_deflection
    assert d.value == pytest.approx(P * L**3 / (3 * EI), rel=CLOSED_FORM)
    assert d.x == pytest.approx(x_free, abs=1e-9)
    assert r.segments[0].segment.kind == "overhang"


# AWC DA6, "Beam Fixed at One End, Supported at Other - Uniformly Distributed Load" (Figure 12):
# R1 = 3wl/8 (supported end), R2 = 5wl/8 (fixed end), Mmax (at fixed end) = wl^2/8,
# M1 (at x = 3l/8) = 9wl^2/128, Delta max (at x = l(1 + sqrt 33)/16 = 0.4215 l) = wl^4/185EI
def test_propped_cantilever_uniform():
    layout = BeamLayout(L, (Support(0.0, "pinned"), Support(L, "fixed")), EI)
    r = analyse_beam(layout, [UniformLoad("D", W)]).unit_cases["D"]
    assert r.reactions == pytest.approx([3 * W * L / 8, 5 * W * L / 8], rel=CLOSED_FORM)
    assert r.min_moment.value == pytest.approx(-W * L**2 / 8, rel=CLOSED_FORM)
    assert r.min_moment.x == pytest.approx(L, rel=CLOSED_FORM)
    assert r.supports[1].moment_max.value == pytest.approx(W * L**2 / 8, rel=CLOSED_FORM)  # clockwise on the member
    assert r.max_moment.value == pytest.approx(9 * W * L**2 / 128, rel=CLOSED_FORM)
    assert r.max_moment.x == pytest.approx(3 * L / 8, rel=CLOSED_FORM)
    d = r.segments[0].max_deflection
    assert d.x == pytest.approx(L * (1 + math.sqrt(33)) / 16, rel=CLOSED_FORM)
    assert printed(W * L**4 / (EI * d.value), "185")


# AWC DA6, "Continuous Beam - Two Equal Spans - Uniformly Distributed Load" (Figure 32):
# R1 = R3 = 3wl/8, R2 = 10wl/8 = 1.25 wl, Mmax (at R2) = wl^2/8 (-0.125 wl^2 in our signs),
# M1 (at 3l/8) = 9wl^2/128, Delta max (at 0.4215 l from R1 and R3) = wl^4/185EI
def test_two_equal_spans_uniform():
    r = two_spans([UniformLoad("D", W)]).unit_cases["D"]
    assert r.reactions == pytest.approx([3 * W * L / 8, 1.25 * W * L, 3 * W * L / 8], rel=CLOSED_FORM)
    assert r.min_moment.value == pytest.approx(-0.125 * W * L**2, rel=CLOSED_FORM)
    assert r.min_moment.x == pytest.approx(L, rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(9 * W * L**2 / 128, rel=CLOSED_FORM)
    for seg in r.segments:
        assert printed(W * L**4 / (EI * seg.max_deflection.value), "185")
    assert r.segments[0].max_deflection.x / L == pytest.approx(0.4215, rel=CLOSED_FORM)
    # hand calculation: M(x) = 3wLx/8 - wx^2/2 = 0 at x = 3L/4, so M < 0 from 0.75L to 1.25L
    assert r.zero_moment_points == pytest.approx([0.75 * L, 1.25 * L], rel=CLOSED_FORM)
    assert len(r.negative_moment_regions) == 1
    assert r.negative_moment_regions[0] == pytest.approx((0.75 * L, 1.25 * L), rel=CLOSED_FORM)


# AWC DA6, Figure 32 as above, V2 (interior support) = 5wl/8; hand calculation: at the face of a
# support of width b the shear is 5wl/8 - w b/2 (the load on the half bearing is subtracted)
def test_two_equal_spans_shear_at_support_faces():
    b = 5.5
    r = two_spans([UniformLoad("D", W)], width=b).unit_cases["D"]
    interior = r.supports[1]
    assert interior.shear_left_face.value == pytest.approx(-(5 * W * L / 8 - W * b / 2), rel=CLOSED_FORM)
    assert interior.shear_right_face.value == pytest.approx(5 * W * L / 8 - W * b / 2, rel=CLOSED_FORM)
    assert interior.shear_left_face.x == pytest.approx(L - b / 2, rel=CLOSED_FORM)
    assert math.isnan(r.supports[0].shear_left_face.value)  # nothing left of the end support
    assert r.supports[0].shear_right_face.value == pytest.approx(3 * W * L / 8 - W * b / 2, rel=CLOSED_FORM)


# AWC DA6, "Continuous Beam - Two Equal Spans - Uniform Load on One Span" (Figure 29):
# R1 = 7wl/16, R2 = 5wl/8, R3 = -wl/16, Mmax (at x = 7l/16) = 49wl^2/512 = 0.0957 wl^2,
# M1 (at support R2) = wl^2/16, Delta max (0.472 l from R1) = 0.0092 wl^4/EI
def test_two_equal_spans_one_span_loaded():
    r = two_spans([UniformLoad("D", W, 0.0, L)]).unit_cases["D"]
    assert r.reactions == pytest.approx([7 * W * L / 16, 5 * W * L / 8, -W * L / 16], rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(49 * W * L**2 / 512, rel=CLOSED_FORM)
    assert printed(r.max_moment.value / (W * L**2), "0.0957")
    assert r.max_moment.x == pytest.approx(7 * L / 16, rel=CLOSED_FORM)
    assert printed(r.max_moment.x / L, "0.4375")
    assert r.min_moment.value == pytest.approx(-W * L**2 / 16, rel=CLOSED_FORM)
    d = r.segments[0].max_deflection
    assert printed(d.value * EI / (W * L**4), "0.0092")
    assert printed(d.x / L, "0.472")


# Pattern live loading on two equal spans combines the two AWC DA6 cases above (Figures 29 and
# 32): the envelope takes 0.0957 wl^2 and R1 = 7wl/16 from one span loaded, -0.125 wl^2 and
# R2 = 1.25 wl from both spans loaded, and the uplift -wl/16 at R1 from the far span alone
def test_two_span_live_load_envelope_takes_the_worst_pattern():
    r = two_spans([UniformLoad("L", W)], {"L": {"L": 1.0}}).combinations["L"]
    assert set(r.patterns) == {"all", "span 1", "span 2"}
    assert r.max_moment.value == pytest.approx(49 * W * L**2 / 512, rel=CLOSED_FORM)
    assert r.max_moment.pattern in ("span 1", "span 2")
    assert r.min_moment.value == pytest.approx(-0.125 * W * L**2, rel=CLOSED_FORM)
    assert r.min_moment.pattern == "all"
    assert r.supports[0].reaction_max.value == pytest.approx(7 * W * L / 16, rel=CLOSED_FORM)
    assert r.supports[0].reaction_max.pattern == "span 1"
    assert r.supports[0].reaction_min.value == pytest.approx(-W * L / 16, rel=CLOSED_FORM)
    assert r.supports[0].reaction_min.pattern == "span 2"
    assert r.supports[1].reaction_max.value == pytest.approx(1.25 * W * L, rel=CLOSED_FORM)
    assert printed(r.segments[0].max_deflection.value * EI / (W * L**4), "0.0092")
    assert r.segments[0].max_deflection.pattern == "span 1"


# Pattern generation (common practice): all segments, each alone, each adjacent pair
def test_pattern_list_for_three_spans():
    names = [p.name for p in live_load_patterns(("span 1", "span 2", "span 3"))]
    assert names == ["all", "span 1", "span 2", "span 3", "span 1 + span 2", "span 2 + span 3"]
    assert len(live_load_patterns(1)) == 1


# Hand calculation, simple span with a clockwise couple C at x = a: moments about the left
# support give R2 = C/l and R1 = -C/l; M(a-) = R1 a = -Ca/l and M(a+) = R2 (l - a) = C(l - a)/l
def test_simple_span_concentrated_moment():
    C, a = 12000.0, 48.0
    r = simple([PointMoment("D", C, a)])
    assert r.reactions == pytest.approx([-C / L, C / L], rel=CLOSED_FORM)
    assert r.moment(a, side="left")[0] == pytest.approx(-C * a / L, rel=CLOSED_FORM)
    assert r.moment(a, side="right")[0] == pytest.approx(C * (L - a) / L, rel=CLOSED_FORM)
    assert r.max_moment.value == pytest.approx(C * (L - a) / L, rel=CLOSED_FORM)
    assert r.min_moment.value == pytest.approx(-C * a / L, rel=CLOSED_FORM)
    assert r.zero_moment_points == pytest.approx([a], rel=CLOSED_FORM)


# Combination: ASD factors scale the unit cases linearly (hand calculation with Figure 1:
# (1.0 D + 0.75 L) on a simple span gives Mmax = (wD + 0.75 wL) l^2 / 8)
def test_combination_factors_scale_the_unit_cases():
    layout = BeamLayout(L, (Support(0.0), Support(L, "roller")), EI)
    r = analyse_beam(layout, [UniformLoad("D", 4.0), UniformLoad("L", 8.0)], {"D+0.75L": {"D": 1.0, "L": 0.75}})
    assert r.combinations["D+0.75L"].max_moment.value == pytest.approx((4.0 + 0.75 * 8.0) * L**2 / 8, rel=CLOSED_FORM)
    assert r.unit_cases["L"].max_moment.value == pytest.approx(8.0 * L**2 / 8, rel=CLOSED_FORM)
    by_array = analyse_beam(layout, [UniformLoad("D", 4.0), UniformLoad("L", 8.0)], {"c": [1.0, 0.75, 0.0, 0.0, 0.0]})
    assert by_array.combinations["c"].max_moment.value == pytest.approx((4.0 + 0.75 * 8.0) * L**2 / 8, rel=CLOSED_FORM)
