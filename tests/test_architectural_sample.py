"""The Quillfeather Barn sample: an architectural-only model (no loads, no analysis model) whose
supports are found in the geometry and whose loads come from the project rules' area loads times
the tributary widths; the derived loads, supports, bracing and results are checked against hand
calculations written out here (statics of beams, common practice; AWC Design Aid No. 6, "Beam
Design Formulas with Shear and Moment Diagrams", 2005, where named).

Scenario and numbers: sample_models/README.md, section "Quillfeather Barn". Loads are per
horizontal (plan) length, in lbf/in unless stated; lengths in inches.
"""

from __future__ import annotations

import math
import shutil
from pathlib import Path

import ifcopenshell
import pandas as pd
import pytest
from conftest import load_script

import ifccheck
from ifccheck.cli import main as cli_main

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "sample_models"
FILE = SAMPLES / "quillfeather_barn_architectural.ifc"
RULES = SAMPLES / "quillfeather_barn.rules.toml"

builder = load_script(SAMPLES / "build_architectural_sample.py", "sample_models_build_architectural_sample")

PSF = 1 / 144  # lbf/in² per lbf/ft²
REL = 1e-3  # tolerance on values the checker computes from the same statics (0.1 %)

# project rules (demo data): loft floor D 10 psf, L 40 psf; roof D 15 psf, S 25 psf
FLOOR = {"D": 10 * PSF, "L": 40 * PSF}
ROOF = {"D": 15 * PSF, "S": 25 * PSF}

# sections (dressed sizes), S = b d² / 6
S_2X10 = 1.5 * 9.25**2 / 6  # 21.39 in³
S_2PLY_2X12 = 3.0 * 11.25**2 / 6  # 63.28 in³
S_3PLY_2X12 = 4.5 * 11.25**2 / 6  # 94.92 in³

# geometry of the model (build_architectural_sample.py): spans between support centres and the
# short overhangs beyond them (the members run over the full width of their bearings)
JOIST_SPAN = 120.0  # J-01 ... J-17, each span
WALL_OVERHANG = 2.75  # half of a 5.5 in wall beyond its centreline
GIRDER_OVERHANG = 1.5  # half of the 3 in girder
RAFTER_SPAN = 142.875  # plan: eaves-wall centre (y = 0) to the middle of its bearing on the ridge
RIDGE_OVERHANG = 1.125  # rafter end (ridge centreline) beyond that point: half of 2.25 in
GIRDER_SPAN = 112.0  # post centres
GIRDER_LOADS_AT = [8.0 + 16.0 * k for k in range(7)]  # J-01 ... J-07 from P-01
RIDGE_SPAN = 120.0  # each of the two spans
RIDGE_LOADS_AT = [24.0 * k for k in range(1, 10)]  # rafter lines from the west gable wall centre


@pytest.fixture(scope="module")
def result():
    return ifccheck.check_model(FILE, RULES)


@pytest.fixture(scope="module")
def table(result):
    return result.table.set_index("name")


@pytest.fixture(scope="module")
def reactions(tmp_path_factory):
    """The command line run on a copy of the model: it writes MODEL.reactions.csv beside it."""
    folder = tmp_path_factory.mktemp("barn")
    model = folder / FILE.name
    shutil.copyfile(FILE, model)
    assert cli_main(["check", str(model), "--rules", str(RULES)]) == 1  # 1: J-09 fails (bearing under P-03)
    return pd.read_csv(folder / "quillfeather_barn_architectural.reactions.csv").set_index("name")


# ------------------------------------------------------------------------------------------
# hand calculations (statics)
# ------------------------------------------------------------------------------------------


def line_load(area_load: float, width: float) -> float:
    """Line load of a member = area load x tributary width (common practice)."""
    return area_load * width


def far_reaction(w: float, span: float, near_overhang: float, far_overhang: float) -> float:
    """Reaction at the far support of a simple span with overhangs at both ends, w over the whole
    member: total load times the distance of its centroid from the near support, over the span."""
    length = span + near_overhang + far_overhang
    return w * length * (length / 2 - near_overhang) / span


def span_moment(w_all: float, w_overhang: float, span: float, a1: float, a2: float) -> float:
    """Largest positive moment of a simple span with overhangs a1, a2: ``w_all`` on the span,
    ``w_overhang`` on the overhangs (their end moments -w a²/2 relieve the span). The moment
    M(x) = M_A + (M_B - M_A) x/L + w x (L - x)/2 peaks at x = L/2 + (M_B - M_A)/(w L)."""
    m_a, m_b = -w_overhang * a1**2 / 2, -w_overhang * a2**2 / 2
    x = span / 2 + (m_b - m_a) / (w_all * span)
    return m_a + (m_b - m_a) * x / span + w_all * x * (span - x) / 2


def two_span_support_moment(w_spans: float, w_overhangs: float, span: float, a: float) -> float:
    """|moment| over the middle support of two equal spans with overhang a at both ends: the
    three-moment equation 4 L M1 = -w L³/2 - 2 M0 L with M0 = -w_o a²/2 gives
    M1 = -w L²/8 + w_o a²/4 (AWC Design Aid No. 6, two equal spans, uniform load: -wL²/8)."""
    return w_spans * span**2 / 8 - w_overhangs * a**2 / 4


def two_span_point_moment(loads: list, span: float) -> float:
    """|moment| over the middle support of two equal spans under point loads (P, a), a from the
    load's own end support: AWC Design Aid No. 6, "Continuous beam - two equal spans - concentrated
    load at any point", M1 = P a b (L + a)/(4 L²) with b = L - a."""
    return sum(p * a * (span - a) * (span + a) / (4 * span**2) for p, a in loads)


def beam_stability_factor(fb_star: float, e_min: float, le: float, b: float, d: float) -> float:
    """C_L, NDS 2018 Eq. 3.3-6, with R_B = sqrt(le d / b²) (Eq. 3.3-5), F_bE = 1.20 E'min / R_B²."""
    alpha = 1.20 * e_min / (le * d / b**2) / fb_star
    c = (1 + alpha) / 1.9
    return c - math.sqrt(c**2 - alpha / 0.95)


# NDS Supplement 2018, Table 4A: DF-L No.2 Fb 900, Emin 580,000, Fc⊥ 625 psi; DF-L No.1 Fb 1000,
# Emin 620,000 psi. Size factor CF (Table 4A) 1.1 for a 2x10, 1.0 for a 2x12; repetitive-member
# factor Cr 1.15 (NDS 2018 §4.3.9) on joists and rafters at 24 in or less and on the 3-ply ridge
# (three members in contact); CD 1.0 for D+L, 1.15 for D+S (NDS 2018 Table 2.3.2).
FB_JOIST = 900 * 1.0 * 1.1 * 1.15  # 1138.5 psi, top edge braced (CL = 1)
FB_RAFTER = 900 * 1.15 * 1.1 * 1.15  # 1309.3 psi


def joist_loads(width: float = 16.0) -> dict:
    return {t: line_load(q, width) for t, q in FLOOR.items()}


def rafter_loads(width: float = 24.0) -> dict:
    return {t: line_load(q, width) for t, q in ROOF.items()}


def girder_point_loads(load_type: str) -> list:
    """(P, a) on G-01: each south-bay joist's reaction at the girder; the edge joist J-01 carries
    16 in too (8 in to J-02 and half the 16 in strip to the south wall)."""
    full = far_reaction(joist_loads()[load_type], JOIST_SPAN, WALL_OVERHANG, GIRDER_OVERHANG)
    return [(full, a) for a in GIRDER_LOADS_AT]


def ridge_point_loads(load_type: str) -> list:
    """(P, x) on RB-01: at each rafter line the reactions of the two slopes' rafters at the
    ridge; the edge rafters carry 24 in too (12 in to the next rafter and half the 24 in strip to
    the gable wall)."""
    full = far_reaction(rafter_loads()[load_type], RAFTER_SPAN, WALL_OVERHANG, RIDGE_OVERHANG)
    return [(2 * full, x) for x in RIDGE_LOADS_AT]


def ridge_support_moment(load_type: str) -> float:
    """Both spans' loads, each at a from its own end support; the load at 120 in is on the post."""
    loads = [(p, x if x < RIDGE_SPAN else 2 * RIDGE_SPAN - x) for p, x in ridge_point_loads(load_type) if x != RIDGE_SPAN]
    return two_span_point_moment(loads, RIDGE_SPAN)


# ------------------------------------------------------------------------------------------
# the model
# ------------------------------------------------------------------------------------------


def test_rebuild_is_byte_identical_to_the_committed_file(tmp_path):
    path = builder.build_architectural_sample(tmp_path)
    assert path.name == FILE.name
    assert path.read_bytes() == FILE.read_bytes(), "quillfeather_barn_architectural.ifc differs from its rebuild"


def test_the_model_is_architectural_only():
    # hand-counted from the builder's catalogue (exact, tolerance 0): 17 joists + girder + ridge
    # beam = 19 IfcBeam; 18 rafters; 3 posts; 5 ground-floor + 4 loft walls; floor slab + two roof
    # slabs; one roof; and no loads or analysis data of any kind
    model = ifcopenshell.open(str(FILE))
    counts = {c: len(model.by_type(c)) for c in ("IfcBeam", "IfcMember", "IfcColumn", "IfcWall", "IfcSlab", "IfcRoof")}
    assert counts == {"IfcBeam": 19, "IfcMember": 18, "IfcColumn": 3, "IfcWall": 9, "IfcSlab": 3, "IfcRoof": 1}
    assert model.schema == "IFC4"
    assert not [p for p in model.by_type("IfcPropertySet") if p.Name == "ifccheck_DesignInput"]
    for cls in ("IfcStructuralAnalysisModel", "IfcStructuralAction", "IfcStructuralLoadGroup"):
        assert len(model.by_type(cls)) == 0
    foot = [u for u in model.by_type("IfcConversionBasedUnit") if u.UnitType == "LENGTHUNIT"]
    assert [u.Name for u in foot] == ["foot"]


# ------------------------------------------------------------------------------------------
# derived loads
# ------------------------------------------------------------------------------------------


def test_interior_joists_carry_16_in_and_53_3_plf_live(table):
    # joists at 16 in on centre: tributary width = half the spacing each side = 16 in; 40 psf x
    # 16/12 ft = 53.33 plf live, 10 psf x 16/12 ft = 13.33 plf dead (common practice)
    interior = table.loc[[f"J-{i:02d}" for i in range(2, 17)]]
    assert interior["tributary_width"].tolist() == pytest.approx([16.0] * 15, abs=1e-6)
    assert (interior["w_L"] * 12).tolist() == pytest.approx([53.333] * 15, rel=1e-4)
    assert (interior["w_D"] * 12).tolist() == pytest.approx([13.333] * 15, rel=1e-4)
    assert interior["load_sources"].str.contains("area_loads[1] (storey 'Loft Floor')", regex=False).all()
    # edge joists J-01 (y = 16 in) and J-17 (y = 272 in) beside the south and north walls (centre
    # lines y = 0 and 288 in) under the floor slab: half the 16 in to the next joist plus half the
    # 16 in strip to the wall, which carries the other half: 8 + 8 = 16 in (common practice)
    edge = table.loc[["J-01", "J-17"]]
    assert edge["tributary_width"].tolist() == pytest.approx([16.0, 16.0], abs=1e-6)
    assert edge["notes"].map(lambda n: any("half the slab strip to IfcWall" in x for x in n)).all()


def test_rafters_carry_24_in_of_roof_dead_and_snow_load(table):
    # rafters at 24 in: 25 psf x 2 ft = 50 plf snow, 15 psf x 2 ft = 30 plf dead, per plan length
    interior = table.loc[[f"R-{s}-{i:02d}" for s in "SN" for i in range(2, 9)]]
    assert interior["tributary_width"].tolist() == pytest.approx([24.0] * 14, abs=1e-6)
    # the edge rafters at x = 24 and 216 in, 24 in from the gable walls' centre lines (x = 0, 240):
    # half the 24 in spacing plus half the 24 in strip to the gable wall = 24 in (common practice)
    edge = table.loc[["R-S-01", "R-S-09", "R-N-01", "R-N-09"]]
    assert edge["tributary_width"].tolist() == pytest.approx([24.0] * 4, abs=1e-6)
    assert (interior["w_S"] * 12).tolist() == pytest.approx([50.0] * 14, rel=1e-6)
    assert (interior["w_D"] * 12).tolist() == pytest.approx([30.0] * 14, rel=1e-6)


def test_carriers_take_loads_only_through_the_reactions_of_what_bears_on_them(table):
    # the girder and the ridge beam get no area load of their own (0 plf, tolerance 1e-9)
    for name in ("G-01", "RB-01"):
        row = table.loc[name]
        assert [row["w_D"], row["w_L"], row["w_S"]] == pytest.approx([0.0, 0.0, 0.0], abs=1e-9)
        assert "reactions of the members bearing on it" in row["load_sources"]
    # the provenance names the members whose reactions it carries
    assert table.loc["G-01", "load_sources"].endswith("J-01, J-02, J-03, J-04, J-05, J-06, J-07 (7)")


# ------------------------------------------------------------------------------------------
# supports from the geometry
# ------------------------------------------------------------------------------------------


def _supports(table, name):
    return [(s.source, s.width) for s in table.loc[name, "analysis"].supports]


def test_supports_and_bearing_lengths_come_from_the_walls_posts_and_beams(table):
    # each bearing length is the element's width along the member: 2x6 walls 5.5 in, 2x4 interior
    # wall 3.5 in, 2-ply girder 3.0 in, 6x6 posts 5.5 in; the rafters end at the ridge centreline,
    # so they bear on half the 4.5 in ridge beam (tolerance 1e-6 in)
    expected = {
        "J-01": [("W-01", 5.5), ("G-01", 3.0)],
        "J-07": [("W-01", 5.5), ("G-01", 3.0)],
        "J-08": [("W-01", 5.5), ("W-05", 3.5), ("W-02", 5.5)],
        "J-17": [("W-01", 5.5), ("W-05", 3.5), ("W-02", 5.5)],
        "G-01": [("P-01", 5.5), ("P-02", 5.5)],
        "RB-01": [("W-08", 5.5), ("P-03", 5.5), ("W-09", 5.5)],
        "R-S-05": [("W-06", 5.5), ("RB-01", 2.25)],
        "R-N-05": [("W-07", 5.5), ("RB-01", 2.25)],
    }
    for name, bearings in expected.items():
        found = _supports(table, name)
        assert [source.split("'")[1] for source, _ in found] == [element for element, _ in bearings], name
        assert [width for _, width in found] == pytest.approx([width for _, width in bearings], abs=1e-6), name
    # the continuous north-bay joists: three supports, two spans of 120 in
    assert (table.loc[[f"J-{i:02d}" for i in range(8, 18)], "support_count"] == 3).all()
    assert table.loc["J-08", "design_span"] == pytest.approx(JOIST_SPAN, abs=1e-6)
    assert table.loc["R-S-05", "design_span"] == pytest.approx(RAFTER_SPAN, abs=1e-6)


def test_joists_and_rafters_under_the_slabs_are_braced_on_their_top_edge(table):
    framing = table[table["predefined_type"].isin(["JOIST", "RAFTER"])]
    assert len(framing) == 35
    assert framing["braced"].all()
    assert framing["reason"].str.contains("top edge braced by the slab or roof on it").all()
    simple = framing.drop(index=[f"J-{i:02d}" for i in range(8, 18)])
    assert (simple["bending_edge"] == "top").all() and simple["C_L"].tolist() == pytest.approx([1.0] * 25)
    # the continuous joists: negative moment over W-05 puts the bottom edge in compression, held at
    # the wall and unbraced to the inflection point 0.25 L = 30 in from it (AWC Design Aid No. 6,
    # two equal spans, uniform load: inflection at 0.75 L from the end support); tolerance 0.01 in
    continuous = table.loc[[f"J-{i:02d}" for i in range(8, 18)]]
    assert (continuous["bending_edge"] == "bottom").all()
    assert continuous["unbraced_length_used"].tolist() == pytest.approx([0.25 * JOIST_SPAN] * 10, abs=0.01)
    # the dropped girder is not braced along its length (BEAM default) but at its posts and at the
    # seven joists on its top: posts 2.75 and 114.75 in from its start, joists at 10.75 ... 106.75
    # in, so the longest stretch is 16 in (common practice: joists held by the sheathing brace it)
    assert not table.loc["G-01", "braced"]
    assert table.loc["G-01", "unbraced_length_used"] == pytest.approx(16.0, abs=1e-6)
    assert "top edge braced at its supports and at the 7 members framing onto it" in table.loc["G-01", "reason"]


# ------------------------------------------------------------------------------------------
# moments, reactions and utilizations by hand
# ------------------------------------------------------------------------------------------


def test_south_bay_joist_moment_and_bending(table):
    # J-02: w = 66.67 plf on the 120 in span, the dead load alone on the 2.75 and 1.5 in overhangs
    # (live on the overhangs would only relieve the span): M ≈ wL²/8 = 10,000 in-lb (AWC Design Aid
    # No. 6, simple beam, uniform load) less 2.7 in-lb
    w = joist_loads()
    m = span_moment(w["D"] + w["L"], w["D"], JOIST_SPAN, WALL_OVERHANG, GIRDER_OVERHANG)
    assert m == pytest.approx(9997.3, abs=0.5)
    assert table.loc["J-02", "f_b"] == pytest.approx(m / S_2X10, rel=REL)
    assert table.loc["J-02", "util_bending"] == pytest.approx(m / S_2X10 / FB_JOIST, rel=REL)  # 0.41


def test_continuous_joist_support_moment_bending_and_bearing(table):
    # J-08, live on both spans (not the overhangs): M1 = wL²/8 - w_D a²/4 = 10,000 - 2.1 in-lb
    w = joist_loads()
    m1 = two_span_support_moment(w["D"] + w["L"], w["D"], JOIST_SPAN, WALL_OVERHANG)
    assert m1 == pytest.approx(9997.9, abs=0.5)
    assert table.loc["J-08", "f_b"] == pytest.approx(m1 / S_2X10, rel=REL)
    # bottom edge unbraced 30 in: le = 2.06 lu (NDS 2018 Table 3.3.3, lu/d < 7) = 61.8 in
    c_l = beam_stability_factor(FB_JOIST, 580_000, 2.06 * 30.0, 1.5, 9.25)
    assert c_l == pytest.approx(0.967, abs=0.001)
    assert table.loc["J-08", "util_bending"] == pytest.approx(m1 / S_2X10 / (FB_JOIST * c_l), rel=REL)  # 0.42
    # bearing on the 3.5 in interior wall, all loads on: R1 = 1.25 wL - 1.5 w a²/L (three-moment
    # result above) = 832.8 lb; fc⊥ = R/(1.5 x 3.5) vs Fc⊥ Cb, Cb = (lb + 0.375)/lb (NDS 2018
    # §3.10.4, bearing more than 3 in from the member's end)
    total = w["D"] + w["L"]
    r1 = 1.25 * total * JOIST_SPAN - 1.5 * total * WALL_OVERHANG**2 / JOIST_SPAN
    assert r1 == pytest.approx(832.8, abs=0.1)
    c_b = (3.5 + 0.375) / 3.5
    assert table.loc["J-08", "util_bearing"] == pytest.approx(r1 / (1.5 * 3.5) / (625 * c_b), rel=REL)  # 0.23


def test_girder_carries_the_joist_reactions_to_its_posts(table, reactions):
    # each south-bay joist's reaction at the girder (simple span with overhangs, all load on):
    # w (L + a1 + a2)(half length - a1)/L = 4.444 x 124.25 x 59.375/120 = 273.2 lb live, J-01 too.
    # Posts (statics of the 112 in girder): R(P-02) = Σ P a / L, R(P-01) = Σ P - R(P-02)
    assert girder_point_loads("L")[1][0] == pytest.approx(273.24, abs=0.01)
    for load_type, column in (("D", "dead_reaction_lbf"), ("L", "live_reaction_lbf")):
        loads = girder_point_loads(load_type)
        north = sum(p * a for p, a in loads) / GIRDER_SPAN
        south = sum(p for p, _ in loads) - north
        assert reactions.loc["P-02", column] == pytest.approx(north, rel=1e-4)
        assert reactions.loc["P-01", column] == pytest.approx(south, rel=1e-4)
    assert reactions.loc["P-01", "members"] == "G-01"
    assert reactions.loc["P-02", "live_reaction_lbf"] == pytest.approx(956.32, abs=0.01)


def test_girder_moment_and_bending_from_the_joist_point_loads(table):
    # largest moment of the simple span under the seven point loads (D+L): at a load point,
    # M(a_k) = R(P-01) a_k - Σ_{j<k} P_j (a_k - a_j); 34,154 in-lb under J-04 (a = 56 in)
    loads = [(pd_ + pl, a) for (pd_, a), (pl, _) in zip(girder_point_loads("D"), girder_point_loads("L"))]
    r_south = sum(p * (GIRDER_SPAN - a) for p, a in loads) / GIRDER_SPAN
    m = max(r_south * a - sum(p * (a - aj) for p, aj in loads if aj < a) for _, a in loads)
    assert m == pytest.approx(34_154, abs=2)
    assert table.loc["G-01", "f_b"] == pytest.approx(m / S_2PLY_2X12, rel=REL)
    # braced at the joists 16 in apart: lu/d = 1.42 < 7, le = 2.06 lu (NDS 2018 Table 3.3.3)
    le = 2.06 * 16.0
    assert table.loc["G-01", "effective_length"] == pytest.approx(le, abs=0.01)
    c_l = beam_stability_factor(1000.0, 620_000, le, 3.0, 11.25)
    assert c_l == pytest.approx(0.997, abs=0.001)
    assert table.loc["G-01", "util_bending"] == pytest.approx(m / S_2PLY_2X12 / (1000 * c_l), rel=REL)  # 0.54


def test_ridge_beam_carries_the_rafter_reactions(table, reactions):
    # rafter reaction at the ridge (simple span 142.875 in, overhangs 2.75 and 1.125 in):
    # w x 146.75 x 70.625/142.875 = 181.35 lb dead, 302.25 lb snow; two slopes at each rafter line
    assert ridge_point_loads("D")[1][0] == pytest.approx(2 * 181.35, abs=0.02)
    # two equal spans of 120 in: gable wall R = Σ P (L - a)/L - M1/L (span 1), ridge post
    # R = P(120) + Σ P a/L + 2 M1/L over both spans, M1 from AWC Design Aid No. 6 (above)
    for load_type, column in (("D", "dead_reaction_lbf"), ("S", "snow_reaction_lbf")):
        m1 = ridge_support_moment(load_type)
        loads = ridge_point_loads(load_type)
        span1 = [(p, x) for p, x in loads if x < RIDGE_SPAN]
        gable = sum(p * (RIDGE_SPAN - x) for p, x in span1) / RIDGE_SPAN - m1 / RIDGE_SPAN
        on_post = [p for p, x in loads if x == RIDGE_SPAN][0]
        post = on_post + sum(p * min(x, 2 * RIDGE_SPAN - x) for p, x in loads if x != RIDGE_SPAN) / RIDGE_SPAN + 2 * m1 / RIDGE_SPAN
        assert reactions.loc["W-08", column] == pytest.approx(gable, rel=1e-4)
        assert reactions.loc["W-09", column] == pytest.approx(gable, rel=1e-4)
        assert reactions.loc["P-03", column] == pytest.approx(post, rel=1e-4)
    assert reactions.loc["P-03", "dead_reaction_lbf"] == pytest.approx(2248.75, abs=0.01)


def test_ridge_beam_moment_and_bending(table):
    # D+S over the post: M1 = 26,115 (D) + 43,524 (S) in-lb; bottom edge unbraced from the post to
    # the inflection point, where M(x) = R_gable x - Σ P (x - a) = 0 (between the loads at 72 and
    # 96 in): lu = 30.0 in, le = 2.06 lu (NDS 2018 Table 3.3.3, lu/d < 7); Fb* = 1000 x 1.15 x 1.0
    # x 1.15 (CD snow, CF 2x12, Cr three plies in contact, §4.3.9)
    m1 = ridge_support_moment("D") + ridge_support_moment("S")
    assert m1 == pytest.approx(69_639, abs=2)
    assert table.loc["RB-01", "f_b"] == pytest.approx(m1 / S_3PLY_2X12, rel=REL)
    loads = [(pd_ + ps, x) for (pd_, x), (ps, _) in zip(ridge_point_loads("D"), ridge_point_loads("S"))]
    span1 = [(p, x) for p, x in loads if x < RIDGE_SPAN]
    r_gable = sum(p * (RIDGE_SPAN - x) for p, x in span1) / RIDGE_SPAN - m1 / RIDGE_SPAN
    left = [(p, x) for p, x in span1 if x <= 72.0]
    x0 = sum(p * x for p, x in left) / (sum(p for p, _ in left) - r_gable)  # M(x0) = 0
    lu = RIDGE_SPAN - x0
    assert lu == pytest.approx(30.00, abs=0.01)
    assert table.loc["RB-01", "unbraced_length_used"] == pytest.approx(lu, abs=0.01)
    fb_star = 1000 * 1.15 * 1.0 * 1.15
    c_l = beam_stability_factor(fb_star, 620_000, 2.06 * lu, 4.5, 11.25)
    assert table.loc["RB-01", "util_bending"] == pytest.approx(m1 / S_3PLY_2X12 / (fb_star * c_l), rel=REL)  # 0.56


def test_rafter_moment_and_bending(table):
    # R-S-05: w = 80 plf (D 30 + S 50) on the 142.875 in plan span, dead alone on the overhangs:
    # M ≈ wL²/8 = 17,011 less 5.5 in-lb
    w = rafter_loads()
    m = span_moment(w["D"] + w["S"], w["D"], RAFTER_SPAN, WALL_OVERHANG, RIDGE_OVERHANG)
    assert m == pytest.approx(17_005.4, abs=0.5)
    assert table.loc["R-S-05", "f_b"] == pytest.approx(m / S_2X10, rel=REL)
    assert table.loc["R-S-05", "util_bending"] == pytest.approx(m / S_2X10 / FB_RAFTER, rel=REL)  # 0.61


def test_every_member_but_j09_passes_far_from_its_limits(table, result):
    # hand bending utilizations (tests above): south-bay joists 0.41, continuous joists 0.42,
    # girder 0.54, ridge beam 0.56, rafters 0.61; edge joists and rafters carry as much as the
    # next one in (half their spacing and half the strip to the wall beside them), so the same.
    # Every one ≤ 0.8, and so is every other check the checker made (tolerance 0).
    assert result.counts() == {"PASS": 36, "FAIL": 1, "NOT_CHECKED": 0, "skipped": 0}
    assert table.loc[table["status"] == "FAIL"].index.tolist() == ["J-09"]
    others = table.drop(index="J-09")
    assert (others["governing_check"] == "BENDING").all()
    hand = {"J-02": 0.41, "J-08": 0.42, "G-01": 0.541, "RB-01": 0.557, "R-S-05": 0.61, "R-N-05": 0.61}
    for name, util in hand.items():
        assert table.loc[name, "util_bending"] == pytest.approx(util, abs=0.005), name
    for edge, inner in (("J-01", "J-02"), ("J-17", "J-16"), ("R-S-01", "R-S-02"), ("R-N-09", "R-N-08")):
        assert table.loc[edge, "util_bending"] == pytest.approx(table.loc[inner, "util_bending"], rel=1e-6)
    checks = ["util_bending", "util_shear", "util_deflection_live", "util_deflection_total", "util_bearing"]
    assert others[checks].max().max() <= 0.8


def test_the_ridge_post_stands_on_joist_j09_and_crushes_it_at_the_interior_wall(table, reactions):
    # P-03 (6x6 ridge post) stands on J-09 right over W-05: the post's load goes through the
    # joist into the wall. Under D+S the bearing on W-05 carries the post's D + S reactions
    # (statics of the ridge beam, above) plus J-09's own interior dead reaction, 1.25 w_D L -
    # 1.5 w_D a²/L (floors take no snow): fc⊥ = R/(1.5 x 3.5) against Fc⊥ Cb = 625 x (3.5 +
    # 0.375)/3.5 psi (NDS Supplement 2018 Table 4A; NDS 2018 §3.10.4): 1.70, a FAIL an engineer
    # would fix with solid blocking (squash blocks) under the post
    on_post = table.loc["RB-01", "analysis"].supports[1]
    assert on_post.source == "bears on IfcColumn 'P-03', which stands on 'J-09'"
    w_d = joist_loads()["D"]
    post = reactions.loc["P-03", "dead_reaction_lbf"] + reactions.loc["P-03", "snow_reaction_lbf"]
    r = post + 1.25 * w_d * JOIST_SPAN - 1.5 * w_d * WALL_OVERHANG**2 / JOIST_SPAN
    assert r == pytest.approx(6163.2, abs=0.5)
    c_b = (3.5 + 0.375) / 3.5
    row = table.loc["J-09"]
    assert (row["status"], row["governing_check"], row["comb_bearing"]) == ("FAIL", "BEARING", "D+S")
    assert row["util_bearing"] == pytest.approx(r / (1.5 * 3.5) / (625 * c_b), rel=REL)  # 1.70
    assert row["load_sources"].endswith("reactions of the members bearing on it: RB-01 through a post (1)")
