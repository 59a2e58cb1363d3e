"""Framing runs and tributary widths from member axes, and the axis ends the reader gives.

Tributary widths are hand calculations of common practice: a member carries half the
centre-to-centre spacing to each neighbour (joists at 16 in on centre carry 16 in; an edge joist
half of that plus the slab's overhang past it). The repetitive-member flag follows NDS 2018,
4.3.9 (three or more members not more than 24 in on centre). Axis ends of the sample model are
the catalogue's placements in sample_models/build_samples.py (J-U-01 from (0, 16, 115.375) in to
(156, 16, 115.375) in: y = 16 in x 1, z = 120 in - 9.25 in / 2).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from conftest import SAMPLES
from ifccheck.design.framing import tributary_widths
from ifccheck.ifc import open_model, read_model
from ifccheck.rules import load_rules
from test_reader import TinyModel

TOL = 1e-9  # in: exact sums of the layout's coordinates


def row_of_joists(count, spacing, length=156.0, z=115.375, angle_deg=0.0, origin=(0.0, 0.0), flip=()):
    """``count`` parallel axes at ``spacing`` on centre, along ``angle_deg`` in plan; indices in
    ``flip`` are drawn the other way (end to start)."""
    along = np.array([math.cos(math.radians(angle_deg)), math.sin(math.radians(angle_deg)), 0.0])
    across = np.array([-along[1], along[0], 0.0])
    base = np.array([origin[0], origin[1], z])
    starts = np.array([base + k * spacing * across for k in range(count)])
    ends = starts + length * along
    for k in flip:
        starts[k], ends[k] = ends[k].copy(), starts[k].copy()
    return starts, ends


def run_of(starts, ends, storeys=None, **options):
    n = len(starts)
    names = [f"J-{k + 1:02d}" for k in range(n)]
    return tributary_widths(starts, ends, np.full(n, 1.5), storeys or ["Level 2"] * n, names=names, **options)


def test_ten_joists_at_16_in_carry_16_in_and_the_edges_8_in_plus_the_overhang():
    """Common practice, by hand: interior 16 / 2 + 16 / 2 = 16 in; edge 16 / 2 + 6 = 14 in with a
    6 in slab overhang. NDS 2018, 4.3.9: ten members at 16 in <= 24 in are repetitive."""
    table = run_of(*row_of_joists(10, 16.0), edge_overhang=6.0)
    assert table["tributary_width"].iloc[1:9].to_numpy() == pytest.approx([16.0] * 8, abs=TOL)
    assert table["tributary_width"].iloc[[0, 9]].to_numpy() == pytest.approx([14.0, 14.0], abs=TOL)
    assert table["run"].nunique() == 1 and (table["run_size"] == 10).all()
    assert table["repetitive"].all()
    assert math.isnan(table["spacing_right"].iloc[0]) and table["spacing_left"].iloc[0] == pytest.approx(16.0, abs=TOL)
    assert table["note"].iloc[2].startswith(
        "tributary width 16.0 in: half the spacing to J-02 and J-04 (16.0 in, 16.0 in; run of 10 parallel members)"
    )
    assert "plus an edge overhang of 6.0 in" in table["note"].iloc[0]


def test_joists_at_24_in_carry_24_in_and_are_repetitive():
    """Common practice: 24 / 2 + 24 / 2 = 24 in; NDS 2018, 4.3.9: 24 in on centre is still repetitive."""
    table = run_of(*row_of_joists(5, 24.0))
    assert table["tributary_width"].iloc[1:4].to_numpy() == pytest.approx([24.0] * 3, abs=TOL)
    assert table["tributary_width"].iloc[0] == pytest.approx(12.0, abs=TOL)  # edge: 24 / 2 + 0
    assert table["repetitive"].all()


def test_joists_at_32_in_are_a_run_but_not_repetitive():
    """Common practice: 32 / 2 + 32 / 2 = 32 in; NDS 2018, 4.3.9: more than 24 in on centre is not repetitive."""
    table = run_of(*row_of_joists(4, 32.0))
    assert table["tributary_width"].iloc[1:3].to_numpy() == pytest.approx([32.0, 32.0], abs=TOL)
    assert (table["run_size"] == 4).all()
    assert not table["repetitive"].any()


def test_two_perpendicular_runs_in_one_storey_stay_apart():
    """Six joists along x and six along y crossing the same plan area: two runs of 6, each at 16 in."""
    along_x = row_of_joists(6, 16.0, length=120.0, origin=(0.0, 10.0))
    along_y = row_of_joists(6, 16.0, length=120.0, angle_deg=90.0, origin=(100.0, 0.0))
    table = run_of(np.vstack([along_x[0], along_y[0]]), np.vstack([along_x[1], along_y[1]]))
    assert table["run"].nunique() == 2
    assert (table["run"].iloc[:6] == table["run"].iloc[0]).all() and (table["run_size"] == 6).all()
    assert table["tributary_width"].iloc[[1, 2, 3, 4, 7, 8, 9, 10]].to_numpy() == pytest.approx([16.0] * 8, abs=TOL)


def test_the_same_plan_in_two_storeys_gives_two_runs():
    """Five joists at 16 in at z = 115.375 in (Level 2) and the same plan at z = 235.375 in (Level 3)."""
    low, high = row_of_joists(5, 16.0), row_of_joists(5, 16.0, z=235.375)
    storeys = ["Level 2"] * 5 + ["Level 3"] * 5
    table = run_of(np.vstack([low[0], high[0]]), np.vstack([low[1], high[1]]), storeys)
    assert table["run"].nunique() == 2 and (table["run_size"] == 5).all()
    assert table["tributary_width"].iloc[[1, 2, 3, 6, 7, 8]].to_numpy() == pytest.approx([16.0] * 6, abs=TOL)


def test_a_lone_beam_and_a_post_get_no_tributary_width():
    """A beam with no parallel member within 48 in and a vertical post: NaN (unknown), in no run."""
    starts = np.array([[0.0, 0.0, 100.0], [0.0, 200.0, 0.0]])
    ends = np.array([[144.0, 0.0, 100.0], [0.0, 200.0, 96.0]])
    table = run_of(starts, ends)
    assert table["tributary_width"].isna().all()
    assert (table["run"] == -1).all() and (table["run_size"] == 0).all()
    assert table["note"].iloc[0].startswith("tributary width unknown: no parallel member")
    assert table["note"].iloc[1] == "tributary width unknown: the axis has no plan direction (unknown or vertical)"


def test_axes_drawn_the_other_way_still_join_the_run():
    """Every other joist drawn end to start: the same run of 8 at 16 in on centre."""
    table = run_of(*row_of_joists(8, 16.0, flip=(1, 3, 5, 7)))
    assert (table["run_size"] == 8).all()
    assert table["tributary_width"].iloc[1:7].to_numpy() == pytest.approx([16.0] * 6, abs=TOL)


def test_a_run_skewed_30_degrees_is_spaced_across_its_own_direction():
    """Six joists along 30° in plan at 19.2 in on centre (measured square to them): interior 19.2 in."""
    table = run_of(*row_of_joists(6, 19.2, angle_deg=30.0, origin=(50.0, -20.0)))
    assert table["tributary_width"].iloc[1:5].to_numpy() == pytest.approx([19.2] * 4, abs=1e-9)
    assert table["tributary_width"].iloc[0] == pytest.approx(9.6, abs=1e-9)
    assert (table["run_size"] == 6).all() and table["repetitive"].all()


def test_members_meeting_end_to_end_or_farther_than_max_spacing_are_no_neighbours():
    """Two bays of 3 joists at 16 in meeting at x = 156 in are two runs; a joist 60 in past the
    last one (over max_spacing = 48 in) starts no neighbour."""
    west, east = row_of_joists(3, 16.0), row_of_joists(3, 16.0, origin=(156.0, 0.0))
    far = row_of_joists(1, 16.0, origin=(0.0, 92.0))  # 92 - 32 = 60 in from the last west joist
    table = run_of(np.vstack([west[0], east[0], far[0]]), np.vstack([west[1], east[1], far[1]]))
    assert table["run"].iloc[:6].nunique() == 2 and (table["run_size"].iloc[:6] == 3).all()
    assert table["run"].iloc[6] == -1 and math.isnan(table["tributary_width"].iloc[6])


def test_joists_lapped_over_a_bearing_wall_are_not_each_others_neighbours():
    """Two bays of 5 joists at 16 in, the east bay 1.5 in to the side of the west one, lapping
    12 in over a wall at x = 150 in: each joist still carries 16 in (8 + 8, common practice), not
    half of the 1.5 in to the joist it laps; the lap (12 of 156 in) is no shared length."""
    west = row_of_joists(5, 16.0)
    east = row_of_joists(5, 16.0, origin=(144.0, 1.5))
    table = run_of(np.vstack([west[0], east[0]]), np.vstack([west[1], east[1]]))
    interior = table["tributary_width"].iloc[[1, 2, 3, 6, 7, 8]].to_numpy()
    assert interior == pytest.approx([16.0] * 6, abs=TOL)
    assert table["run"].iloc[:5].nunique() == 1 and table["run"].iloc[5:].nunique() == 1
    assert table["run"].iloc[0] != table["run"].iloc[5]


def test_a_tail_joist_beside_a_full_joist_is_its_neighbour():
    """A 60 in tail joist (at a stair opening) midway between full 156 in joists at 32 in runs
    side by side with them over all its length: neighbours, 16 / 2 + 16 / 2 = 16 in (common practice)."""
    full = row_of_joists(3, 32.0)
    tail = row_of_joists(1, 16.0, length=60.0, origin=(96.0, 16.0))
    table = run_of(np.vstack([full[0], tail[0]]), np.vstack([full[1], tail[1]]))
    assert table["tributary_width"].iloc[3] == pytest.approx(16.0, abs=TOL)
    assert table["run_size"].iloc[3] == 4


def test_an_edge_overhang_function_gets_the_outward_direction():
    """The overhang function is called with the edge members' rows and unit vectors pointing
    away from their neighbour: J-01 at y = 0 outward -y, J-04 at y = 48 outward +y."""
    seen = {}

    def overhang(rows, mids, outward):
        seen.update({int(r): tuple(np.round(o, 12)) for r, o in zip(rows, outward)})
        return np.where(outward[:, 1] > 0, 4.0, 2.0)

    table = run_of(*row_of_joists(4, 16.0), edge_overhang=overhang)
    assert seen == {0: (0.0, -1.0), 3: (0.0, 1.0)}
    assert table["tributary_width"].iloc[[0, 3]].to_numpy() == pytest.approx([10.0, 12.0], abs=TOL)


# --- axis ends from the reader ---------------------------------------------------------------


@pytest.fixture(scope="module")
def imperial_members():
    return read_model(open_model(SAMPLES / "quillfeather_imperial.ifc"), load_rules()).members


def test_axis_ends_of_joist_j_u_01_in_world_inches(imperial_members):
    joist = next(m for m in imperial_members if m.name == "J-U-01")
    assert joist.axis_start == pytest.approx((0.0, 16.0, 115.375), abs=1e-6)
    assert joist.axis_end == pytest.approx((156.0, 16.0, 115.375), abs=1e-6)


def test_upper_floor_joists_of_the_sample_carry_16_in(imperial_members):
    """J-U-01 to J-U-10 at 16 in on centre (build_samples.py): interior 16 in, edges 8 in; the east
    bay joists meeting them end to end at x = 156 in are not their neighbours."""
    members = [m for m in imperial_members if m.axis_start is not None]
    table = tributary_widths(
        np.array([m.axis_start for m in members]), np.array([m.axis_end for m in members]),
        np.array([m.section.width if m.section else np.nan for m in members]), [m.storey for m in members],
        names=[m.name for m in members],
    )
    width = dict(zip([m.name for m in members], table["tributary_width"]))
    assert [width[f"J-U-{i:02d}"] for i in range(2, 10)] == pytest.approx([16.0] * 8, abs=1e-6)
    assert [width["J-U-01"], width["J-U-10"]] == pytest.approx([8.0, 8.0], abs=1e-6)


def test_axis_ends_from_the_extrusion_run_through_the_profile_centre():
    """No Axis representation: 144 in extrusions along x placed at (10, 20, 30) in and at
    (10, 36, 30) in, sharing a 2x10 profile centred 4.625 in below the placement (local y is up):
    axes from (10, 20, 25.375) to (154, 20, 25.375) and 16 in further along y."""
    tiny = TinyModel("IFC4", "mm")
    profile = tiny.rectangle(1.5, 9.25)
    profile.Position.Location.Coordinates = (0.0, tiny.length(-4.625))
    for name, y in (("B1", 20.0), ("B2", 36.0)):
        beam = tiny.member(name, profile, 144.0)
        beam.ObjectPlacement.RelativePlacement.Location = tiny.model.create_entity(
            "IfcCartesianPoint", tuple(tiny.length(c) for c in (10.0, y, 30.0))
        )
        tiny.material(beam, "DF-L No.2", "Wood")
    members = {m.name: m for m in tiny.read().members}
    for name, y in (("B1", 20.0), ("B2", 36.0)):
        assert members[name].axis_start == pytest.approx((10.0, y, 25.375), abs=1e-6)
        assert members[name].axis_end == pytest.approx((154.0, y, 25.375), abs=1e-6)
