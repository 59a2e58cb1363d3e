"""Supports and top-edge bracing found in the geometry.

Every expected value is a hand calculation of common practice shown beside its check: a member
bears on an element whose top is at the member's bottom (axis height less the plumb half-depth
d / (2 cos θ)); the support sits at the centre of the element's width under the member and the
bearing length is that width, stopped at the member's end. Layouts are demo data: 2x10 joists
(d = 9.25 in) whose bottom is at 96 in, so their axis is at 96 + 9.25 / 2 = 100.625 in.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from ifccheck.design.supports import _Axes, _BoxTable, _candidates, _clip, braced_by_slab, find_supports
from ifccheck.model import ElementBox

TOL = 1e-9  # in: exact sums of the layout's coordinates
D = 9.25  # in: depth of a 2x10
AXIS_Z = 96.0 + D / 2  # in: axis of a joist whose bottom is at 96 in


def wall(name, x0, x1, top=96.0, y0=-100.0, y1=100.0, kind="wall", ifc_class="IfcWall", guid=None):
    return ElementBox(guid or f"g-{name}", name, ifc_class, kind, "Level 1", (x0, y0, top - 96.0), (x1, y1, top))


def joist(x0, x1, y=0.0, z=AXIS_Z):
    return np.array([[x0, y, z]]), np.array([[x1, y, z]])


def supports_of(starts, ends, boxes, depth=D, **options):
    n = len(starts)
    return find_supports([f"J-{k}" for k in range(n)], starts, ends, np.full(n, depth), boxes, **options)


def test_joist_on_two_walls_bears_at_the_wall_centres_over_the_wall_thickness():
    """By hand: 2x4 walls 3.5 in thick at x = 0..3.5 and 140.5..144 under a joist 0..144:
    supports at 3.5 / 2 = 1.75 in and 140.5 + 1.75 = 142.25 in, each 3.5 in long."""
    result = supports_of(*joist(0.0, 144.0), [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)])[0]
    assert [s.x for s in result.supports] == pytest.approx([1.75, 142.25], abs=TOL)
    assert [s.width for s in result.supports] == pytest.approx([3.5, 3.5], abs=TOL)
    assert result.problems == []
    first = result.supports[0]
    assert (first.kind, first.source, first.element, first.carrier) == ("pinned", "bears on IfcWall 'W-01'", "g-W-01", "")
    assert math.isnan(first.carrier_x)


def test_positions_run_from_the_start_of_a_joist_drawn_the_other_way():
    """By hand: the same joist drawn from 144 to 0: supports at 144 - 142.25 = 1.75 in and
    144 - 1.75 = 142.25 in from its start, W-02 first."""
    result = supports_of(*joist(144.0, 0.0), [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)])[0]
    assert [s.x for s in result.supports] == pytest.approx([1.75, 142.25], abs=TOL)
    assert [s.element for s in result.supports] == ["g-W-02", "g-W-01"]


def test_bearing_length_is_capped_at_the_member_end():
    """By hand: a joist from x = 2 stops 1.5 in into a 3.5 in wall at x = 0..3.5: the bearing
    is 3.5 - 2 = 1.5 in long, centred 0.75 in from the joist's start."""
    result = supports_of(*joist(2.0, 144.0), [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)])[0]
    assert result.supports[0].width == pytest.approx(1.5, abs=TOL)
    assert result.supports[0].x == pytest.approx(0.75, abs=TOL)


def test_a_joist_running_over_its_bearing_is_supported_within_the_end_reach():
    """By hand: a joist from x = -4 runs 4 in past the wall at 0..3.5: support 4 + 1.75 =
    5.75 in from its start, 3.5 in long; 4 in is within the 6 in end reach. From x = -10 the
    wall is 10 - 1 (tolerance) = 9 in away: beyond the end reach, and with overhangs not
    allowed (overhang_ratio 0) end A has no support; it runs 10 + 1.75 = 11.75 in past it."""
    walls = [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)]
    near = supports_of(*joist(-4.0, 144.0), walls)[0]
    assert near.supports[0].x == pytest.approx(5.75, abs=TOL) and near.supports[0].width == pytest.approx(3.5, abs=TOL)
    assert near.problems == []
    far = supports_of(*joist(-10.0, 144.0), walls, overhang_ratio=0.0)[0]
    assert len(far.supports) == 2
    assert far.problems == ["no support found at end A (it runs 11.8 in past the support at 11.8 in, too far for an overhang)"]


def test_rafter_eaves_past_the_wall_are_an_overhang():
    """By hand: a member from x = -24 over walls at 0..3.5 and 140.5..144: it runs 24 + 1.75 =
    25.75 in past W-01, not more than half the 140.5 in span (70.25 in): two supports, no
    problem; the eaves are checked as a cantilever."""
    walls = [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)]
    eaves = supports_of(*joist(-24.0, 144.0), walls)[0]
    assert [s.x for s in eaves.supports] == pytest.approx([25.75, 166.25], abs=TOL)
    assert eaves.problems == []


def test_a_free_end_longer_than_half_the_span_beside_it_is_a_missing_support():
    """By hand: a joist 0..216 over walls at 0..3.5 and 140.5..144 runs 216 - 142.25 = 73.75 in
    past W-02, more than half the 140.5 in span (70.25 in): end B has no support."""
    walls = [wall("W-01", 0.0, 3.5), wall("W-02", 140.5, 144.0)]
    long_end = supports_of(*joist(0.0, 216.0), walls)[0]
    assert long_end.problems == [
        "no support found at end B (it runs 73.8 in past the support at 142.2 in, too far for an overhang)"
    ]


def test_a_joist_over_an_intermediate_bearing_wall_has_three_supports():
    """By hand: walls at 0..3.5, 142.25..145.75 and 284.5..288 under a joist 0..288: supports
    at 1.75, 144 and 286.25 in, each 3.5 in long."""
    walls = [wall("W-01", 0.0, 3.5), wall("W-02", 142.25, 145.75), wall("W-03", 284.5, 288.0)]
    result = supports_of(*joist(0.0, 288.0), walls)[0]
    assert [s.x for s in result.supports] == pytest.approx([1.75, 144.0, 286.25], abs=TOL)
    assert [s.width for s in result.supports] == pytest.approx([3.5] * 3, abs=TOL)
    assert result.problems == []


def test_a_joist_ending_on_a_girder_names_it_as_carrier_with_the_position_along_it():
    """By hand: a dropped girder 3.5 x 11.25 along y at x = 144, from y = -100 to 200, top at
    the joists' bottom (96 in; axis at 96 - 11.25 / 2 = 90.375 in, box x 142.25..145.75). A joist
    at y = 50 from x = 0 to 145: bearing 142.25..145 = 2.75 in long at 143.625 in; on the girder
    50 - (-100) = 150 in from its start. Without the girder's axis no carrier is named."""
    girder_axis = ((144.0, -100.0, 90.375), (144.0, 200.0, 90.375))
    girder = ElementBox("g-G-1", "G-1", "IfcBeam", "beam", "Level 1", (142.25, -100.0, 84.75), (145.75, 200.0, 96.0))
    boxes = [wall("W-01", 0.0, 3.5, y0=-100.0, y1=200.0), girder]
    starts, ends = joist(0.0, 145.0, y=50.0)
    result = supports_of(starts, ends, boxes, member_axes={"g-G-1": girder_axis})[0]
    on_girder = result.supports[1]
    assert on_girder.x == pytest.approx(143.625, abs=TOL) and on_girder.width == pytest.approx(2.75, abs=TOL)
    assert (on_girder.carrier, on_girder.element) == ("g-G-1", "g-G-1")
    assert on_girder.carrier_x == pytest.approx(150.0, abs=TOL)
    assert on_girder.source == "bears on IfcBeam 'G-1'"
    plain = supports_of(starts, ends, boxes)[0].supports[1]
    assert plain.carrier == "" and math.isnan(plain.carrier_x) and plain.element == "g-G-1"


def test_a_girder_bears_on_its_columns_and_never_on_itself():
    """By hand: the girder above (bottom 84.75 in) on 5.5 in columns at y = -100..-94.5 and
    194.5..200 (tops 84.75 in): supports 2.75 and 300 - 2.75 = 297.25 in along it, 5.5 in long.
    Its own box (same GlobalId) is not a support, though a flat 2x4 (depth 1.5 in) with a
    tolerance of 2 in would find its own top 1.5 in above its bottom."""
    girder = ElementBox("g-G-1", "G-1", "IfcBeam", "beam", "Level 1", (142.25, -100.0, 84.75), (145.75, 200.0, 96.0))
    columns = [
        ElementBox(f"g-C-{k}", f"C-{k}", "IfcColumn", "column", "Level 1", (141.25, y0, 0.0), (146.75, y0 + 5.5, 84.75))
        for k, y0 in ((1, -100.0), (2, 194.5))
    ]
    starts, ends = np.array([[144.0, -100.0, 90.375]]), np.array([[144.0, 200.0, 90.375]])
    result = find_supports(["g-G-1"], starts, ends, np.array([11.25]), [girder, *columns])[0]
    assert [s.x for s in result.supports] == pytest.approx([2.75, 297.25], abs=TOL)
    assert [s.width for s in result.supports] == pytest.approx([5.5, 5.5], abs=TOL)
    assert [s.element for s in result.supports] == ["g-C-1", "g-C-2"]
    flat = ElementBox("g-F", "F", "IfcMember", "member", "Level 1", (0.0, -1.75, 0.0), (96.0, 1.75, 1.5))
    alone = find_supports(["g-F"], np.array([[0.0, 0.0, 0.75]]), np.array([[96.0, 0.0, 0.75]]), np.array([1.5]), [flat], tolerance=2.0)[0]
    assert len(alone.supports) == 0 and alone.problems == ["no support found at end A", "no support found at end B"]


def test_an_end_without_support_is_named():
    """By hand: a joist 0..144 on W-01 only: one support at 1.75 in; end B (x = 144) has none."""
    result = supports_of(*joist(0.0, 144.0), [wall("W-01", 0.0, 3.5)])[0]
    assert [s.x for s in result.supports] == pytest.approx([1.75], abs=TOL)
    assert result.problems == ["no support found at end B"]


def test_a_wall_whose_top_is_3_in_below_the_joist_is_not_a_support():
    """By hand: walls with tops at 96 - 3 = 93 in are 3 in below the joist's bottom, more than
    the 1 in tolerance; tops at 96 - 0.75 = 95.25 in are within it."""
    low = supports_of(*joist(0.0, 144.0), [wall("W-01", 0.0, 3.5, top=93.0), wall("W-02", 140.5, 144.0, top=93.0)])[0]
    assert len(low.supports) == 0 and low.problems == ["no support found at end A", "no support found at end B"]
    close = supports_of(*joist(0.0, 144.0), [wall("W-01", 0.0, 3.5, top=95.25), wall("W-02", 140.5, 144.0, top=95.25)])[0]
    assert len(close.supports) == 2 and close.problems == []


def test_a_wall_meeting_a_column_under_the_joist_end_is_one_bearing():
    """By hand: a 3.5 in wall (x 0..3.5) and a 5.5 in post in it (x 0..5.5), both topped at
    96 in: one bearing 5.5 in long at 2.75 in, on the post (the longer crossing), naming both."""
    post = ElementBox("g-P-1", "P-1", "IfcColumn", "column", "Level 1", (0.0, -2.75, 0.0), (5.5, 2.75, 96.0))
    result = supports_of(*joist(0.0, 144.0), [wall("W-01", 0.0, 3.5), post, wall("W-02", 140.5, 144.0)])[0]
    assert len(result.supports) == 2
    first = result.supports[0]
    assert first.x == pytest.approx(2.75, abs=TOL) and first.width == pytest.approx(5.5, abs=TOL)
    assert first.element == "g-P-1"
    assert first.source == "bears on IfcWall 'W-01' and IfcColumn 'P-1'"


def test_a_diagonal_joist_finds_its_walls_across_grid_cells():
    """By hand: a joist at 30° in plan from (10, 10) with plan length 400 in ends at
    (10 + 400 cos 30°, 10 + 400 sin 30°) = (356.41, 210); 3.5 in square posts centred on both
    ends carry it; each end crossing is 1.75 / cos 30° = 2.0207 in long (the line leaves a post
    through its side x = centre ± 1.75), centred 1.0104 in from the end."""
    angle = math.radians(30.0)
    start = np.array([10.0, 10.0, AXIS_Z])
    end = start + 400.0 * np.array([math.cos(angle), math.sin(angle), 0.0])
    posts = [
        ElementBox(f"g-P-{k}", f"P-{k}", "IfcColumn", "column", "", (p[0] - 1.75, p[1] - 1.75, 0.0), (p[0] + 1.75, p[1] + 1.75, 96.0))
        for k, p in enumerate((start, end))
    ]
    result = supports_of(start[None], end[None], posts)[0]
    half = 1.75 / math.cos(angle)
    assert [s.width for s in result.supports] == pytest.approx([half, half], abs=1e-9)
    assert [s.x for s in result.supports] == pytest.approx([half / 2, 400.0 - half / 2], abs=1e-9)
    assert result.problems == []


@pytest.mark.parametrize("rise_per_foot", [6.0, 12.0])
def test_a_sloped_rafter_bears_on_the_wall_plate_and_the_ridge_beam(rise_per_foot):
    """By hand, a 2x10 rafter at 6/12 and 12/12 (p = rise / 12 per inch of plan), plan 0..144 in.
    Its bottom b(t) = 96 + p (t - 3.5) crosses the plate top (96 in) 3.5 in into the 5.5 in wall
    (a seat cut): support at 2.75 in, 5.5 in long. Its axis is the bottom plus the plumb half-depth
    9.25 / 2 · sqrt(1 + p²) (5.1709 in at 6/12, 6.5407 in at 12/12). A ridge beam 3.5 in wide centred
    at x = 144, from y = -60 to 240, topped at b(143.125): support at (142.25 + 144) / 2 =
    143.125 in, 1.75 in long (the rafter ends at the beam's centre); carrier position 60 in.
    Plan positions, not lengths along the slope."""
    p = rise_per_foot / 12.0
    half = D / 2 * math.sqrt(1.0 + p * p)
    bottom = lambda t: 96.0 + p * (t - 3.5)  # noqa: E731 - the hand calculation's line
    starts, ends = np.array([[0.0, 0.0, bottom(0.0) + half]]), np.array([[144.0, 0.0, bottom(144.0) + half]])
    ridge_top = bottom(143.125)
    ridge = ElementBox("g-RB", "RB", "IfcBeam", "beam", "Roof", (142.25, -60.0, ridge_top - 11.25), (145.75, 240.0, ridge_top))
    axes = {"g-RB": ((144.0, -60.0, ridge_top - 5.625), (144.0, 240.0, ridge_top - 5.625))}
    result = supports_of(starts, ends, [wall("W-01", 0.0, 5.5), ridge], member_axes=axes)[0]
    assert [s.x for s in result.supports] == pytest.approx([2.75, 143.125], abs=TOL)
    assert [s.width for s in result.supports] == pytest.approx([5.5, 1.75], abs=TOL)
    assert result.supports[1].carrier == "g-RB" and result.supports[1].carrier_x == pytest.approx(60.0, abs=TOL)
    assert result.problems == []


def test_the_bottom_of_a_steep_rafter_is_a_plumb_half_depth_below_its_axis():
    """By hand: a 12/12 rafter (45°) over a 1.5 in stud topped exactly at its bottom at the stud's
    centre. The bottom is 9.25 / 2 · sqrt(2) = 6.5407 in below the axis; with d / 2 = 4.625 in it
    would be 1.9157 in higher, and the bottom over the 1.5 in crossing (±0.75 in) would miss the
    stud top by 1.17 in, more than the 0.25 in tolerance. Found: one support at 48 in."""
    half = D / 2 * math.sqrt(2.0)
    starts, ends = np.array([[0.0, 0.0, 100.0]]), np.array([[96.0, 0.0, 196.0]])
    top = 100.0 + 48.0 - half
    stud = ElementBox("g-S", "S", "IfcMember", "member", "", (47.25, -1.75, 0.0), (48.75, 1.75, top))
    result = supports_of(starts, ends, [stud], tolerance=0.25)[0]
    assert [s.x for s in result.supports] == pytest.approx([48.0], abs=TOL)
    assert result.supports[0].width == pytest.approx(1.5, abs=TOL)


def test_members_without_a_plan_line_are_not_searched():
    """A post (vertical axis) and a member with unknown axis: no supports, the reason stated."""
    starts = np.array([[0.0, 0.0, 0.0], [np.nan, 0.0, 0.0]])
    ends = np.array([[0.0, 0.0, 96.0], [10.0, 0.0, 0.0]])
    result = supports_of(starts, ends, [wall("W-01", 0.0, 3.5)])
    assert [len(r.supports) for r in result] == [0, 0]
    assert result[0].problems == ["no support searched: the member's axis has no plan length (vertical)"]
    assert result[1].problems == ["no support searched: the member's axis is unknown"]


def slab(name, lo, hi, kind="slab", ifc_class="IfcSlab"):
    return ElementBox(f"g-{name}", name, ifc_class, kind, "Level 2", lo, hi)


def test_a_slab_on_top_braces_the_joist():
    """By hand: the joist's top is at 96 + 9.25 = 105.25 in. A slab whose underside is at
    105.25 in over the whole joist braces it; one 3 in higher (108.25 in) does not; one that
    covers x = 0..72, 50 % of the 144 in joist, less than 90 %, does not."""
    starts, ends = joist(0.0, 144.0)
    cases = {
        "S-1": slab("S-1", (-10.0, -100.0, 105.25), (200.0, 100.0, 111.25)),
        "S-high": slab("S-high", (-10.0, -100.0, 108.25), (200.0, 100.0, 114.25)),
        "S-half": slab("S-half", (0.0, -100.0, 105.25), (72.0, 100.0, 111.25)),
    }
    found = {name: braced_by_slab(["J"], starts, ends, np.array([D]), [box]) for name, box in cases.items()}
    assert found == {"S-1": ["g-S-1"], "S-high": [""], "S-half": [""]}
    covered = slab("S-most", (0.0, -100.0, 105.25), (130.0, 100.0, 111.25))  # 130 / 144 = 90.3 %
    assert braced_by_slab(["J"], starts, ends, np.array([D]), [covered]) == ["g-S-most"]


def test_a_sloped_roof_box_braces_its_rafter_but_a_level_slab_does_not_brace_a_climbing_member():
    """By hand: a 6/12 rafter, plan 0..144, top t(x) = 100 + 0.5 x (rises 72 in). A roof box whose
    underside is at its lowest top (100 in) and which reaches 180 in braces it; a 6 in level slab
    at 100 in reaches only 106 in, below the rafter's highest top (172 in), and does not."""
    half = D / 2 * math.sqrt(1.25)
    starts, ends = np.array([[0.0, 0.0, 100.0 - half]]), np.array([[144.0, 0.0, 172.0 - half]])
    roof = slab("R-1", (-12.0, -100.0, 100.0), (156.0, 100.0, 180.0), kind="roof", ifc_class="IfcRoof")
    level = slab("S-1", (-12.0, -100.0, 100.0), (156.0, 100.0, 106.0))
    assert braced_by_slab(["R"], starts, ends, np.array([D]), [roof]) == ["g-R-1"]
    assert braced_by_slab(["R"], starts, ends, np.array([D]), [level]) == [""]


def test_the_grid_finds_every_pair_that_meets():
    """The grid search is a superset of the direct test: random demo lines and boxes in a 600 in
    square, every (line, box) pair whose plan crossing exists and whose top is within the
    tolerance of the line's bottom somewhere along it is among the grid's candidates (compared
    with all 200 x 300 pairs)."""
    rng = np.random.default_rng(4)
    n, m, tolerance = 200, 300, 1.0
    starts = np.column_stack([rng.uniform(0, 600, (n, 2)), rng.uniform(90, 110, n)])
    ends = np.column_stack([rng.uniform(0, 600, (n, 2)), rng.uniform(90, 110, n)])
    corner = rng.uniform(0, 600, (m, 2))
    size = rng.uniform(1, 60, (m, 2))
    tops = rng.uniform(80, 110, m)
    boxes = [ElementBox(f"b{k}", "", "IfcWall", "wall", "", (*corner[k], 0.0), (*(corner[k] + size[k]), tops[k])) for k in range(m)]
    axes, table = _Axes(starts, ends, np.full(n, D)), _BoxTable(boxes, ("wall",))
    member, box = _candidates(axes, axes.bottom, table, table.hi[:, 2], tolerance)
    found = set(zip(member.tolist(), box.tolist()))
    i, j = np.repeat(np.arange(n), m), np.tile(np.arange(m), n)
    entry, leave = _clip(axes.start[i], axes.along[i], axes.plan[i], table.lo[j, :2] - tolerance, table.hi[j, :2] + tolerance)
    za, zb = axes.bottom[i] + axes.rise[i] * entry, axes.bottom[i] + axes.rise[i] * leave
    meets = (entry <= leave) & (tops[j] >= np.minimum(za, zb) - tolerance) & (tops[j] <= np.maximum(za, zb) + tolerance)
    expected = set(zip(i[meets].tolist(), j[meets].tolist()))
    assert len(expected) > 20
    assert len(expected - found) == 0
