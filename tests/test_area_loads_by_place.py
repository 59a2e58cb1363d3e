"""Area loads by slab and by space usage, the slab's own weight and the slab edge overhang.

Demo scenario (invented): the loft of a small bindery, ten 2x10 joists at 16 in on centre
spanning 12 ft along x at y = 0 ... 144 in, tops at 124.625 in, a 0.75 in plywood deck on them
reaching 8 in past the edge joists, a reading room over y 0 ... 72 in and a stack room over
y 72 ... 144 in. Every expected load is a hand calculation of common practice: area load times
tributary width (psf x in / 12 = plf).
"""

from __future__ import annotations

import pytest

from conftest import PLF, member, run_basis
from ifccheck.design.area_loads import names_place, slab_weight, unit_weights
from ifccheck.model import ElementBox

TOP = 120.0 + 9.25 / 2  # joist tops
DECK = ElementBox("g-deck", "Loft deck", "IfcSlab", "slab", "Loft", (-4.0, -8.0, TOP), (148.0, 152.0, TOP + 0.75),
                  tags=("Loft deck", "FLOOR", "Deck 3/4"), layers=(("Timber boards", 0.75),), layers_source="material layer set")
READING = ElementBox("g-read", "R-1", "IfcSpace", "space", "Loft", (-4.0, -8.0, TOP + 0.75), (148.0, 72.0, TOP + 96.0),
                     tags=("R-1", "Reading Room"))
STACKS = ElementBox("g-stack", "R-2", "IfcSpace", "space", "Loft", (-4.0, 72.0, TOP + 0.75), (148.0, 152.0, TOP + 96.0),
                    tags=("R-2", "Stack Room", "Library stacks"))
ELEMENTS = [DECK, READING, STACKS]


def joists(n=10, spacing=16.0):
    records = []
    for k in range(n):
        rec = member(1.5, 9.25, 144.0, {"Species": "DF-L", "Grade": "No.2"}, name=f"J{k + 1:02d}")
        rec.storey = "Loft"
        rec.axis_start, rec.axis_end = (0.0, k * spacing, 120.0), (144.0, k * spacing, 120.0)
        records.append(rec)
    return records


def rules(*entries, **defaults):
    return {"defaults": {"self_weight_included": True, **defaults}, "area_loads": list(entries)}


STOREY = {"storey": "Loft", "dead": "10 psf", "live": "40 psf"}
READING_ROOM = {"space_usage": "reading*", "live": "60 psf"}
DECK_RULE = {"slab": "loft DECK", "dead": "12 psf"}


def test_a_space_usage_load_wins_over_the_storey_for_the_type_it_gives():
    # J03 (y = 32 in) under the reading room: live 60 psf x 16/12 = 80 plf from the space rule;
    # dead from the storey rule 10 x 16/12 = 13.33 plf (the space rule gives no dead load)
    t = run_basis(joists(), rules(STOREY, READING_ROOM), ELEMENTS).set_index("name")
    assert t.loc["J03", "w_L"] / PLF == pytest.approx(80.0, rel=1e-9)
    assert t.loc["J03", "w_D"] / PLF == pytest.approx(40 / 3, rel=1e-9)
    sources = t.loc["J03", "load_sources"]
    assert "area_loads[2] (space_usage 'reading*') on IfcSpace 'R-1' (L) x tributary width 16.0 in" in sources
    assert "area_loads[1] (storey 'Loft') (D) x tributary width 16.0 in" in sources
    # J08 (y = 112 in) under the stack room, which no rule names: the storey's 40 psf = 53.33 plf
    assert t.loc["J08", "w_L"] / PLF == pytest.approx(160 / 3, rel=1e-9)


def test_a_slab_load_wins_over_the_storey_and_a_space_over_the_slab():
    # dead 12 psf from the deck rule (slab over every joist) x 16/12 = 16 plf; live by space / storey
    t = run_basis(joists(), rules(STOREY, READING_ROOM, DECK_RULE), ELEMENTS).set_index("name")
    assert t.loc[["J03", "J08"], "w_D"].div(PLF).tolist() == pytest.approx([16.0, 16.0], rel=1e-9)
    assert t.loc[["J03", "J08"], "w_L"].div(PLF).tolist() == pytest.approx([80.0, 160 / 3], rel=1e-9)
    assert "area_loads[3] (slab 'loft DECK') on IfcSlab 'Loft deck' (D)" in t.loc["J08", "load_sources"]


def test_a_joist_under_two_rooms_takes_the_larger_load():
    # a joist along y (x = 72 in) from y = 0 to 144 in runs under both rooms: the larger live load,
    # 60 psf of the reading room, over its whole length (conservative); a lone joist has no run, so
    # TributaryWidth 16 in is given: 60 x 16 / 12 = 80 plf
    rec = member(1.5, 9.25, 144.0, {"Species": "DF-L", "Grade": "No.2", "TributaryWidth": 16.0}, name="X1")
    rec.storey = "Loft"
    rec.axis_start, rec.axis_end = (72.0, 0.0, 120.0), (72.0, 144.0, 120.0)
    stacks = {"space_usage": "Library stacks", "live": "50 psf"}
    t = run_basis([rec], rules(READING_ROOM, stacks), ELEMENTS).set_index("name")
    assert t.loc["X1", "w_L"] / PLF == pytest.approx(80.0, rel=1e-9)


def test_edge_joists_carry_the_deck_past_them():
    # J01 (y = 0) and J10 (y = 144): half the 16 in spacing plus the 8 in of deck past them = 16 in
    t = run_basis(joists(), rules(STOREY), ELEMENTS).set_index("name")
    assert t.loc[["J01", "J10"], "tributary_width"].tolist() == pytest.approx([16.0, 16.0], abs=1e-9)
    assert any("to the edge of IfcSlab 'Loft deck'" in note for note in t.loc["J01", "notes"])


def test_an_edge_joist_beside_a_wall_shares_the_strip_with_it():
    # a wall under the deck edge, centre line y = -6 in (3.5 in wide, top at the joists' bottom):
    # J01 carries 8 in to J02 plus half of the 6 in to the wall = 11 in
    wall = ElementBox("g-w", "W-1", "IfcWall", "wall", "Ground", (-4.0, -7.75, 0.0), (148.0, -4.25, TOP - 9.25))
    t = run_basis(joists(), rules(STOREY), [*ELEMENTS, wall]).set_index("name")
    assert t.loc["J01", "tributary_width"] == pytest.approx(11.0, abs=1e-9)


def test_the_slab_weight_is_added_when_the_rules_exclude_it():
    # timber boards at the C24 mean density 420 kg/m3 (EN 338:2016, Table 1) = 26.22 lbf/ft3:
    # 0.75 in -> 26.22 x 0.75 / 12 = 1.639 psf; x 16/12 ft = 2.185 plf on top of the storey's
    # 10 psf x 16/12 = 13.33 plf (tolerance 0.01 %, the density's rounding)
    t = run_basis(joists(), rules(STOREY, slab_weight_included=False), ELEMENTS).set_index("name")
    deck = 420 * 9.80665 / 4.4482216 * 0.3048**3 * 0.75 / 12  # psf
    assert deck == pytest.approx(1.639, abs=0.001)
    assert t.loc["J05", "w_D"] / PLF == pytest.approx(40 / 3 + deck * 16 / 12, rel=1e-4)
    assert "weight of IfcSlab 'Loft deck' 1.6 psf" in t.loc["J05", "load_sources"]
    assert (t["status"] != "NOT_CHECKED").all()


def test_an_unknown_slab_material_leaves_the_member_not_checked():
    odd = ElementBox(**{**DECK.__dict__, "layers": (("Unobtainium board", 0.75),)})
    t = run_basis(joists(), rules(STOREY, slab_weight_included=False), [odd]).set_index("name")
    assert (t["status"] == "NOT_CHECKED").all()
    assert "'Unobtainium board' has no unit weight" in t.loc["J05", "reason"]


def test_no_slab_over_the_members_when_its_weight_must_be_added_is_a_problem():
    t = run_basis(joists(), rules(STOREY, slab_weight_included=False), [READING, STACKS]).set_index("name")
    assert (t["status"] == "NOT_CHECKED").all()
    assert "no slab was found over the member" in t.loc["J05", "reason"]


def test_a_space_floor_far_above_the_joists_does_not_load_them():
    # a mezzanine room whose floor is 30 in above the joist tops (more than the 12 in build-up)
    high = ElementBox(**{**READING.__dict__, "lo": (-4.0, -8.0, TOP + 30.0)})
    t = run_basis(joists(), rules(STOREY, READING_ROOM), [DECK, high]).set_index("name")
    assert t.loc["J03", "w_L"] / PLF == pytest.approx(160 / 3, rel=1e-9)


def test_rule_texts_match_tags_ignoring_case_with_wildcards():
    assert names_place("reading*", ("R-1", "Reading Room"))
    assert names_place("  stack room ", ("Stack Room",))
    assert not names_place("Reading", ("Reading Room",))


def test_unit_weights_convert_and_the_longest_entry_wins():
    # EN 338:2016 Table 1, C24 mean density 420 kg/m3 x 9.80665 m/s2 = 4119 N/m3 = 26.22 lbf/ft3
    # (unit conversion, tolerance 0.01 lbf/ft3). Layer by layer, the text "Lightweight Concrete
    # Topping" takes the table's lightweight concrete row, not its concrete row (the longer entry
    # wins); the expected weight is the table's two rows times the thicknesses (arithmetic only)
    weights = {" ".join(words): w * 1728 for words, w, _ in unit_weights()}
    assert weights["timber"] == pytest.approx(26.22, abs=0.01)
    assert weights["lightweight concrete"] != weights["concrete"]
    slab = ElementBox("g", "S", "IfcSlab", "slab", "", (0, 0, 0), (1, 1, 1),
                      layers=(("Lightweight Concrete Topping", 1.5), ("Concrete C25/30", 4.0)))
    psi, how, problem = slab_weight(slab)
    assert problem == ""
    expected = (weights["lightweight concrete"] * 1.5 + weights["concrete"] * 4.0) / 12  # psf
    assert psi * 144 == pytest.approx(expected, rel=1e-9)


def test_a_run_under_one_slab_is_repetitive_and_without_a_slab_the_type_decides():
    # NDS 2018, 4.3.9: three or more members at 24 in or less joined by load-distributing elements
    # (the deck). Ten BEAM-type members at 16 in: under the deck repetitive; with no slab in the
    # model the BEAM default (not repetitive) applies; at 32 in never (spacing over 24 in)
    def beams(spacing=16.0):
        records = joists(spacing=spacing)
        for rec in records:
            rec.predefined_type = "BEAM"
        return records

    under = run_basis(beams(), rules(STOREY), ELEMENTS).set_index("name")
    assert under["repetitive"].all()
    assert "repetitive member yes (framing run of 10 under IfcSlab 'Loft deck')" in under.loc["J05", "reason"]
    bare = run_basis(beams(), rules(STOREY), []).set_index("name")
    assert not bare["repetitive"].any()
    assert "framing run of 10 but no slab found over it; BEAM default" in bare.loc["J05", "reason"]
    wide = run_basis(beams(32.0), rules(STOREY), ELEMENTS).set_index("name")
    assert not wide["repetitive"].any()


def test_the_data_readiness_summary_groups_missing_slab_weights():
    # both ways a slab weight can be missing count under one heading of the coordinator's list
    from ifccheck.report.console import readiness

    odd = ElementBox(**{**DECK.__dict__, "layers": (("Unobtainium board", 0.75),)})
    unknown = run_basis(joists(3), rules(STOREY, slab_weight_included=False), [odd])
    missing = run_basis(joists(2), rules(STOREY, slab_weight_included=False), [READING])
    lacks = dict(readiness(list(unknown["problems"]) + list(missing["problems"])))
    assert lacks == {"the slab's weight (a slab over the member, its material's unit weight)": 5}
