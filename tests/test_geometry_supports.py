"""Supports found in the geometry: joists bearing on walls below them become continuous members,
their reactions are summed per wall, and an end over nothing is reported (hand calculations,
common practice; two equal spans under uniform load: interior reaction 1.25 wL, AWC Design Aid
No. 6, 2007)."""

import pytest

from conftest import PSF, member
from ifccheck.design import get_basis
from ifccheck.design.inputs import design_inputs
from ifccheck.model import ElementBox
from ifccheck.report.reactions_out import reactions_frame
from ifccheck.model import ModelUnits
from ifccheck.rules import load_rules

RULES = {"area_loads": [{"storey": "Level 2", "dead": "10 psf", "live": "40 psf"}]}
Z_AXIS, DEPTH = 120.0, 9.25
TOP = Z_AXIS - DEPTH / 2  # the joists' bottom: the walls' top


def _wall(name, x):
    return ElementBox(f"guid-{name}", name, "IfcWall", "wall", "Level 1", (x - 1.75, -20.0, 0.0), (x + 1.75, 100.0, TOP))


def _joists(n=5, spacing=16.0, end=289.75):
    records = []
    for k in range(n):
        rec = member(1.5, DEPTH, end + 1.75, {"Species": "DF-L", "Grade": "No.2"}, name=f"J{k + 1}")
        rec.storey = "Level 2"
        rec.axis_start = (-1.75, k * spacing, Z_AXIS)
        rec.axis_end = (end, k * spacing, Z_AXIS)
        records.append(rec)
    return records


def _check(records, walls):
    rules = load_rules(RULES)
    inputs = design_inputs(records, rules, walls)
    out = get_basis(rules["defaults"]["design_basis"]).check(inputs, rules)
    return inputs.drop(columns=[c for c in out.columns if c in inputs.columns]).join(out)


def test_joists_over_three_walls_are_two_span_members_and_the_walls_get_their_reactions():
    walls = [_wall("W1", 0.0), _wall("W2", 144.0), _wall("W3", 288.0)]
    t = _check(_joists(), walls)
    assert (t["support_count"] == 3).all()
    assert t["supports_found"].str.contains("bears on IfcWall 'W2' at 145.8 in").all()  # 1.75 + 144
    assert (t["status"] != "NOT_CHECKED").all(), list(t["reason"])
    assert set(t["bending_edge"]) == {"bottom"}  # the negative moment over W2 governs
    reactions = reactions_frame(t, walls, ModelUnits(to_core={}, system="imperial"), load_rules(RULES)).set_index("name")
    # tributary widths 8 + 16 + 16 + 16 + 8 = 64 in; w = 40 psf x 64/12 ft; interior reaction 1.25 wL
    # the joists also carry load on the a = 1.75 in beyond each end wall's centre: it goes to the end
    # wall (w·a) and moves the interior reaction by less than 0.1 % (its end moment), hence rel 1e-3
    w, L, a = 40 * (64 / 12) / 12, 144.0, 1.75  # lbf/in summed over the five joists
    assert reactions.loc["W2", "live_reaction_lbf"] == pytest.approx(1.25 * w * L, rel=1e-3)
    assert reactions.loc["W1", "live_reaction_lbf"] == pytest.approx(0.375 * w * L + w * a, rel=1e-3)
    assert reactions.loc["W2", "member_count"] == 5
    assert PSF == pytest.approx(1 / 144)


def test_an_end_over_nothing_is_not_checked():
    walls = [_wall("W1", 0.0), _wall("W2", 144.0)]
    t = _check(_joists(end=289.75), walls)
    assert (t["status"] == "NOT_CHECKED").all()
    assert t["reason"].str.contains("no support found at end B").all()


def test_without_walls_in_the_model_members_stay_simple_spans():
    t = _check(_joists(end=142.25), [])
    assert (t["support_count"] == 2).all()


def _box(name, kind, lo, hi, cls="IfcColumn"):
    return ElementBox(f"guid-{name}", name, cls, kind, "Level 1", lo, hi)


def _girder_bay(girder_top: float, joist_ends: tuple) -> tuple:
    """(records, elements): three 2x10 joists at 16 in on each side of a 2-ply 2x12 girder G1
    along x = 144 in (top at ``girder_top``) on posts P1 and P2, the joists from the walls W1 and
    W3 to the girder, running over (x0, x1) of ``joist_ends`` on each side."""
    joists = []
    for side, (x0, x1) in enumerate(joist_ends):
        for k in range(3):
            rec = member(1.5, DEPTH, x1 - x0, {"Species": "DF-L", "Grade": "No.2"}, name=f"J{side}{k}")
            rec.storey = "Level 2"
            rec.axis_start, rec.axis_end = (x0, k * 16.0, Z_AXIS), (x1, k * 16.0, Z_AXIS)
            joists.append(rec)
    girder = member(3.0, 11.25, 60.0, {"Species": "DF-L", "Grade": "No.1"}, ptype="BEAM", name="G1")
    girder.storey = "Level 2"
    girder_axis = girder_top - 11.25 / 2
    girder.axis_start, girder.axis_end = (144.0, -14.0, girder_axis), (144.0, 46.0, girder_axis)
    post_top = girder_top - 11.25
    elements = [
        _wall("W1", 0.0), _wall("W3", 288.0),
        _box("P1", "column", (142.25, -15.75, 0.0), (145.75, -12.25, post_top)),
        _box("P2", "column", (142.25, 44.25, 0.0), (145.75, 47.75, post_top)),
        _box("G1", "beam", (142.5, -14.0, post_top), (145.5, 46.0, girder_top), cls="IfcBeam"),
    ]
    return joists + [girder], elements


def test_a_girder_carrying_joists_from_both_sides_gets_their_reactions_summed():
    # three joists each side at 16 in (tributary 8 + 16 + 8 = 32 in), 12 ft spans, 40 psf live,
    # bearing on a dropped girder at x = 144 in that sits on two posts; the posts then carry the
    # joists' reactions at the girder from both sides: 2 x w x (L/2 + a), with w = 40 psf x 32/12 ft
    # and a = 1.5 in of joist running past the girder's centre (common practice)
    records, elements = _girder_bay(girder_top=TOP, joist_ends=((-1.75, 145.5), (142.5, 289.75)))
    t = _check(records, elements)
    assert (t["status"] != "NOT_CHECKED").all(), list(t.loc[t["status"] == "NOT_CHECKED", "reason"])
    g = t.set_index("name").loc["G1"]
    assert "reactions of the members bearing on it" in g["load_sources"]
    posts = reactions_frame(t, elements, ModelUnits(to_core={}, system="imperial"), load_rules(RULES)).set_index("name")
    w, L, a = 40 * (32 / 12) / 12, 144.0, 1.5  # lbf/in over the three joists of one side
    assert posts.loc[["P1", "P2"], "live_reaction_lbf"].sum() == pytest.approx(2 * w * (L / 2 + a), rel=1e-3)


def test_joists_hung_on_a_flush_girder_hand_it_their_reactions():
    # the same bay with the girder flush: its top level with the joists' top (2x12 beside 2x10), the
    # joists ending at its faces (x = 142.5 and 145.5 in). Each joist bears on its wall (centre
    # line 1.75 in from its end) and hangs on the girder at the face: supports 142.5 in apart, the
    # joist running 1.75 in past the wall. Reaction at the hanger with the load over the whole
    # 144.25 in: R = w 144.25 (144.25 / 2 - 1.75) / 142.5 = 71.24 w (statics, common practice);
    # the posts carry both sides' reactions: 2 x 71.24 w, w = 40 psf x 32/12 ft for three joists
    records, elements = _girder_bay(girder_top=TOP + DEPTH, joist_ends=((-1.75, 142.5), (145.5, 289.75)))
    t = _check(records, elements)
    assert (t["status"] != "NOT_CHECKED").all(), list(t.loc[t["status"] == "NOT_CHECKED", "reason"])
    j = t.set_index("name").loc["J00"]
    assert [s.x for s in j["analysis"].supports] == pytest.approx([1.75, 144.25], abs=1e-9)
    assert j["analysis"].supports[1].source == "hangs on IfcBeam 'G1' (flush: hanger assumed)"
    assert "reactions of the members bearing on it" in t.set_index("name").loc["G1", "load_sources"]
    posts = reactions_frame(t, elements, ModelUnits(to_core={}, system="imperial"), load_rules(RULES)).set_index("name")
    w = 40 * (32 / 12) / 12  # lbf/in over the three joists of one side
    r = w * 144.25 * (144.25 / 2 - 1.75) / 142.5
    assert posts.loc[["P1", "P2"], "live_reaction_lbf"].sum() == pytest.approx(2 * r, rel=1e-3)


def test_rim_joists_meeting_at_a_corner_do_not_hang_on_each_other():
    # two rim joists in an L, each ending inside the other's end: a corner, not flush framing
    a = member(1.5, DEPTH, 144.0, {"Species": "DF-L", "Grade": "No.2"}, name="RA")
    a.axis_start, a.axis_end = (0.0, 0.75, Z_AXIS), (144.0, 0.75, Z_AXIS)
    b = member(1.5, DEPTH, 144.0, {"Species": "DF-L", "Grade": "No.2"}, name="RB")
    b.axis_start, b.axis_end = (0.75, 0.0, Z_AXIS), (0.75, 144.0, Z_AXIS)
    boxes = [_box("RA", "beam", (0.0, 0.0, TOP), (144.0, 1.5, TOP + DEPTH), cls="IfcBeam"),
             _box("RB", "beam", (0.0, 0.0, TOP), (1.5, 144.0, TOP + DEPTH), cls="IfcBeam"), _wall("W9", 300.0)]
    for rec in (a, b):
        rec.storey = "Level 2"
    t = _check([a, b], boxes).set_index("name")
    for name in ("RA", "RB"):
        sources = [s.source for s in t.loc[name, "analysis"].supports] if t.loc[name, "analysis"] is not None else []
        assert not any("hangs on" in s for s in sources)


def test_a_post_standing_on_a_girder_hands_it_the_beam_reaction():
    # a 96 in beam B1 (4x10 ... here 3 x 9.25) bears on wall W1 at x = 0 and on post P1 at
    # x = 96 in; P1 stands at mid-span of girder G1 (144 in between walls WA and WB, along y).
    # B1's reaction on P1 (simple span, uniform w over its length, common practice) becomes a
    # point load on G1 at its mid-span: G1's walls carry half of it each (statics).
    beam_bottom, girder_top = 96.0, 60.0
    b1 = member(3.0, DEPTH, 99.5, {"Species": "DF-L", "Grade": "No.1", "LiveLoad": 200.0 / 12},
                ptype="BEAM", name="B1")
    b1.axis_start, b1.axis_end = (-1.75, 0.0, beam_bottom + DEPTH / 2), (97.75, 0.0, beam_bottom + DEPTH / 2)
    g1 = member(3.0, 11.25, 147.5, {"Species": "DF-L", "Grade": "No.1", "DeadLoad": 1.0}, ptype="BEAM", name="G1")
    g1.axis_start, g1.axis_end = (96.0, -73.75, girder_top - 11.25 / 2), (96.0, 73.75, girder_top - 11.25 / 2)
    for rec in (b1, g1):
        rec.storey = "Level 1"
    w1 = ElementBox("guid-W1", "W1", "IfcWall", "wall", "Level 1", (-1.75, -20.0, 0.0), (1.75, 20.0, beam_bottom))
    p1 = _box("P1", "column", (94.25, -1.75, girder_top), (97.75, 1.75, beam_bottom))
    wa = ElementBox("guid-WA", "WA", "IfcWall", "wall", "Level 0", (80.0, -73.75, 0.0), (112.0, -70.25, girder_top - 11.25))
    wb = ElementBox("guid-WB", "WB", "IfcWall", "wall", "Level 0", (80.0, 70.25, 0.0), (112.0, 73.75, girder_top - 11.25))
    g1_box = _box("G1", "beam", (94.5, -73.75, girder_top - 11.25), (97.5, 73.75, girder_top), cls="IfcBeam")
    elements = [w1, p1, wa, wb, g1_box]
    t = _check([b1, g1], elements)
    assert (t["status"] != "NOT_CHECKED").all(), list(t.loc[t["status"] == "NOT_CHECKED", "reason"])
    rows = t.set_index("name")
    on_post = rows.loc["B1", "analysis"].supports[1]
    assert on_post.source == "bears on IfcColumn 'P1', which stands on 'G1'"
    assert on_post.carrier_x == pytest.approx(73.75, abs=1e-9)  # G1 runs from y = -73.75
    # B1: supports at x = 1.75 (wall centre) and 97.75 in (post centre, B1 ends at the post's far
    # face), w = 200 plf over 99.5 in: R(P1) = w 99.5 (99.5/2 - 1.75) / 96 = 200/12 x 50.79 lbf
    w = 200.0 / 12
    r_post = w * 99.5 * (99.5 / 2 - 1.75) / 96.0
    frame = reactions_frame(t, elements, ModelUnits(to_core={}, system="imperial"), load_rules(RULES)).set_index("name")
    assert frame.loc["P1", "live_reaction_lbf"] == pytest.approx(r_post, rel=1e-6)
    assert frame.loc[["WA", "WB"], "live_reaction_lbf"].tolist() == pytest.approx([r_post / 2] * 2, rel=1e-6)


def test_the_input_bearing_length_wins_over_the_walls_width():
    # the rule: the bearing length is the supporting element's width (3.5 in walls here)
    # unless the input property set gives one (2.0 in): every support then bears on 2.0 in
    records = _joists(n=3)
    for rec in records:
        rec.inputs["BearingLength"] = 2.0
    t = _check(records, [_wall("W1", 0.0), _wall("W2", 144.0), _wall("W3", 288.0)]).set_index("name")
    assert [s.width for s in t.loc["J2", "analysis"].supports] == pytest.approx([2.0, 2.0, 2.0], abs=1e-12)
    plain = _check(_joists(n=3), [_wall("W1", 0.0), _wall("W2", 144.0), _wall("W3", 288.0)]).set_index("name")
    assert [s.width for s in plain.loc["J2", "analysis"].supports] == pytest.approx([3.5, 3.5, 3.5], abs=1e-9)
