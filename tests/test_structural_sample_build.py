"""The Quillfeather Annex sample model and its IFC structural-analysis model.

Checks that ``sample_models/build_structural_sample.py`` rebuilds the committed
``quillfeather_annex_structural.ifc`` byte for byte, that the file holds the hand-counted entities,
that ``ifcopenshell.validate`` (with the EXPRESS rules) reports nothing, that the analysis model is
wired as sample_models/README.md describes, and that the supports and loads read back from the file
give the README's hand-calculated reactions, moments, utilizations and deflections.
"""

from __future__ import annotations

import math
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.placement
import ifcopenshell.validate
import numpy as np
import pytest
from conftest import load_script

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "sample_models"
FILE = SAMPLES / "quillfeather_annex_structural.ifc"


builder = load_script(SAMPLES / "build_structural_sample.py", "sample_models_build_structural_sample")

FT = 12.0  # inches per foot


@pytest.fixture(scope="module")
def model():
    return ifcopenshell.open(str(FILE))


def test_rebuild_is_byte_identical_to_the_committed_file(tmp_path):
    path = builder.build_structural_sample(tmp_path)
    assert path.name == FILE.name
    assert path.read_bytes() == FILE.read_bytes(), "quillfeather_annex_structural.ifc differs from its rebuild"


# Hand-counted from sample_models/README.md (exact counts, tolerance 0), members J-A-01, G-A-01,
# BJ-A-01, HDR-A-01, J-A-02 in that order:
# point connections: supports 3 + 2 + 2 + 2 + 1 = 10, and the joint of J-A-02 on G-A-01 = 11;
# curve actions 2 (J-A-01 D, L) + 2 (BJ-A-01 D, L) + 2 (J-A-02 D, L) = 6, one linear force each;
# point actions 4 x 2 (G-A-01 D, L at 2, 4, 8, 10 ft) + 2 (HDR-A-01 D, S) = 10, one single force
# each; vertices: J-A-01 3 (0, 12, 24 ft), G-A-01 2 ends + 4 load points + the joint at 6 ft,
# BJ-A-01 3 (0, 10, 14 ft), HDR-A-01 2 ends + 1 load point, J-A-02 its start (its end is the
# joint's vertex) = 17; topology representations 5 edges + 11 connections + 10 point actions = 26;
# product shapes 5 beams + 26 = 31; groups: model + 3 load cases = 4; activity relationships one
# per action = 16; member-connection relationships one per support (10) + two at the joint = 12;
# boundary conditions shared: pinned, roller = 2.
CLASS_COUNTS = {
    "IfcBeam": 5,
    "IfcStructuralAnalysisModel": 1,
    "IfcStructuralCurveMember": 5,
    "IfcStructuralPointConnection": 11,
    "IfcBoundaryNodeCondition": 2,
    "IfcStructuralLoadCase": 3,
    "IfcStructuralCurveAction": 6,
    "IfcStructuralLoadLinearForce": 6,
    "IfcStructuralPointAction": 10,
    "IfcStructuralLoadSingleForce": 10,
    "IfcEdge": 5,
    "IfcVertexPoint": 17,
    "IfcTopologyRepresentation": 26,
    "IfcProductDefinitionShape": 31,
    "IfcRelAssignsToProduct": 5,
    "IfcRelConnectsStructuralMember": 12,
    "IfcRelConnectsStructuralActivity": 16,
    "IfcRelAssignsToGroup": 4,
    "IfcRelServicesBuildings": 1,
    "IfcMaterial": 2,
    "IfcPropertySet": 5,
}


def test_entity_counts_by_class(model):
    counts = {cls: len(model.by_type(cls, include_subtypes=False)) for cls in CLASS_COUNTS}
    assert counts == CLASS_COUNTS


def test_validate_reports_no_errors(model):
    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(model, logger, express_rules=True)
    assert logger.statements == []  # exact: no error or warning at all


def test_header_schema_and_global_ids(model):
    assert model.schema == "IFC4"
    assert model.header.file_name.time_stamp == "2024-01-01T00:00:00"
    assert len(model.by_type("IfcOwnerHistory")) == 0
    global_ids = [e.GlobalId for e in model.by_type("IfcRoot")]
    assert len(global_ids) == len(set(global_ids))


# ------------------------------------------------------------------------------------------
# Reading the analysis data back (inches and lbf; positions along the member from its start)
# ------------------------------------------------------------------------------------------


def _vertex_inches(vertex):
    return np.array(vertex.VertexGeometry.Coordinates) * FT  # the model's length unit is the foot


def _curve_member(beam):
    (rel,) = [r for r in beam.ReferencedBy if r.is_a("IfcRelAssignsToProduct")]
    (member,) = rel.RelatedObjects
    return member


def _edge(member):
    (rep,) = member.Representation.Representations
    assert (rep.RepresentationIdentifier, rep.RepresentationType) == ("Reference", "Edge")
    (edge,) = rep.Items
    return edge


def _length(member) -> float:
    edge = _edge(member)
    return float(np.linalg.norm(_vertex_inches(edge.EdgeEnd) - _vertex_inches(edge.EdgeStart)))


def _position_along(member, vertex) -> float:
    """x (in) of a vertex along the member's edge; asserts it lies on the edge (1e-9 in)."""
    edge = _edge(member)
    start, end = _vertex_inches(edge.EdgeStart), _vertex_inches(edge.EdgeEnd)
    axis = (end - start) / np.linalg.norm(end - start)
    offset = _vertex_inches(vertex) - start
    x = float(offset @ axis)
    assert np.linalg.norm(offset - x * axis) == pytest.approx(0.0, abs=1e-9)
    assert -1e-9 <= x <= _length(member) + 1e-9
    return x


def _vertex_of(product):
    (rep,) = product.Representation.Representations
    assert (rep.RepresentationIdentifier, rep.RepresentationType) == ("Reference", "Vertex")
    (vertex,) = rep.Items
    return vertex


def _supports(member) -> list:
    """[(x in, condition name)] of the member's point connections with a boundary condition, by x."""
    connections = [r.RelatedStructuralConnection for r in member.ConnectedBy]
    return sorted(
        (_position_along(member, _vertex_of(c)), c.AppliedCondition.Name) for c in connections if c.AppliedCondition
    )


def _joints(member) -> list:
    """[(x in, connection)] of the member's point connections without a boundary condition, by x."""
    connections = [r.RelatedStructuralConnection for r in member.ConnectedBy]
    return sorted(
        ((_position_along(member, _vertex_of(c)), c) for c in connections if c.AppliedCondition is None),
        key=lambda joint: joint[0],
    )


def _load_type(action) -> str:
    (group,) = [r.RelatingGroup for r in action.HasAssignments if r.is_a("IfcRelAssignsToGroup")]
    return {"DEAD_LOAD_G": "D", "LIVE_LOAD_Q": "L", "SNOW_S": "S"}[group.ActionSource]


def _loads(member) -> dict:
    """{"uniform": {type: w lbf/in downward}, "point": [(type, x in, P lbf downward)]}."""
    uniform, points = {}, []
    for rel in member.AssignedStructuralActivity:
        action = rel.RelatedStructuralActivity
        if action.is_a("IfcStructuralCurveAction"):
            uniform[_load_type(action)] = -action.AppliedLoad.LinearForceZ / FT  # lbf/ft -> lbf/in
        else:
            points.append((_load_type(action), _position_along(member, _vertex_of(action)), -action.AppliedLoad.ForceZ))
    return {"uniform": uniform, "point": sorted(points)}


def _section(beam):
    """b, d (in) of the beam's body profile (plies side by side for a composite)."""
    (solid,) = [i for r in beam.Representation.Representations if r.RepresentationIdentifier == "Body" for i in r.Items]
    profile = solid.SweptArea
    plies = profile.Profiles if profile.is_a("IfcCompositeProfileDef") else [profile]
    return sum(p.XDim for p in plies) * FT, plies[0].YDim * FT


@pytest.fixture(scope="module")
def members(model):
    """Per beam name: its curve member, supports, loads and section."""
    out = {}
    for beam in model.by_type("IfcBeam"):
        member = _curve_member(beam)
        out[beam.Name] = {"beam": beam, "member": member, "supports": _supports(member), "joints": _joints(member),
                          "loads": _loads(member), "section": _section(beam)}
    return out


# ------------------------------------------------------------------------------------------
# Wiring of the analysis model
# ------------------------------------------------------------------------------------------


def test_each_beam_has_one_curve_member_along_its_axis(members):
    for name, m in members.items():
        beam, member = m["beam"], m["member"]
        assert member.Name == name and member.PredefinedType == "RIGID_JOINED_MEMBER"
        matrix = ifcopenshell.util.placement.get_local_placement(beam.ObjectPlacement)
        (axis,) = [r for r in beam.Representation.Representations if r.RepresentationIdentifier == "Axis"]
        local_end = np.array([*axis.Items[0].Points[1].Coordinates, 1.0])
        edge = _edge(member)
        assert _vertex_inches(edge.EdgeStart) == pytest.approx(matrix[:3, 3] * FT, abs=1e-9), name
        assert _vertex_inches(edge.EdgeEnd) == pytest.approx((matrix @ local_end)[:3] * FT, abs=1e-9), name


def test_analysis_model_groups_loads_and_building(model):
    (analysis,) = model.by_type("IfcStructuralAnalysisModel")
    assert analysis.PredefinedType == "LOADING_3D"
    items = [o for rel in analysis.IsGroupedBy for o in rel.RelatedObjects]
    expected = model.by_type("IfcStructuralCurveMember") + model.by_type("IfcStructuralPointConnection")
    assert sorted(e.id() for e in items) == sorted(e.id() for e in expected)
    sources = {(c.Name, c.ActionType, c.ActionSource) for c in analysis.LoadedBy}
    assert sources == {
        ("D dead load", "PERMANENT_G", "DEAD_LOAD_G"),
        ("L floor live load", "VARIABLE_Q", "LIVE_LOAD_Q"),
        ("S snow load", "VARIABLE_Q", "SNOW_S"),
    }
    ((building,),) = [rel.RelatedBuildings for rel in analysis.ServicesBuildings]
    assert building.Name == "Quillfeather Annex"


def test_every_item_and_action_sits_on_the_shared_world_placement(model):
    (analysis,) = model.by_type("IfcStructuralAnalysisModel")
    shared = analysis.SharedPlacement
    assert ifcopenshell.util.placement.get_local_placement(shared) == pytest.approx(np.eye(4), abs=1e-12)
    for cls in ("IfcStructuralCurveMember", "IfcStructuralPointConnection", "IfcStructuralCurveAction",
                "IfcStructuralPointAction"):
        for entity in model.by_type(cls):
            assert entity.ObjectPlacement == shared, entity.Name


def test_every_action_has_one_member_and_one_load_case(model):
    for cls in ("IfcStructuralCurveAction", "IfcStructuralPointAction"):
        for action in model.by_type(cls):
            assert len(action.AssignedToStructuralItem) == 1, action.Name
            assert len([r for r in action.HasAssignments if r.is_a("IfcRelAssignsToGroup")]) == 1, action.Name
            assert action.GlobalOrLocal == "GLOBAL_COORDS"
    for action in model.by_type("IfcStructuralCurveAction"):
        assert (action.PredefinedType, action.ProjectedOrTrue) == ("CONST", "TRUE_LENGTH")


def test_boundary_conditions_hold_the_vertical_translation_and_no_rotation(model):
    held = {}
    for condition in model.by_type("IfcBoundaryNodeCondition"):
        values = [getattr(condition, a).wrappedValue for a in (
            "TranslationalStiffnessX", "TranslationalStiffnessY", "TranslationalStiffnessZ",
            "RotationalStiffnessX", "RotationalStiffnessY", "RotationalStiffnessZ")]
        held[condition.Name] = values
    assert held == {"pinned": [True, True, True, False, False, False],
                    "roller": [False, False, True, False, False, False]}


# supports (x along the member, ft) and loads as in the README's member table (tolerance 1e-9)
SUPPORTS_FT = {
    "J-A-01": [(0.0, "pinned"), (12.0, "roller"), (24.0, "roller")],
    "G-A-01": [(0.0, "pinned"), (12.0, "roller")],
    "BJ-A-01": [(0.0, "pinned"), (10.0, "roller")],
    "HDR-A-01": [(0.0, "pinned"), (6.0, "roller")],
    "J-A-02": [(0.0, "pinned")],
}
UNIFORM_PLF = {
    "J-A-01": {"D": 40 / 3, "L": 160 / 3},
    "BJ-A-01": {"D": 20.0, "L": 80.0},
    "G-A-01": {},
    "HDR-A-01": {},
    "J-A-02": {"D": 20.0, "L": 80.0},
}
POINTS_FT_LBF = {
    "G-A-01": sorted([("D", x, 80.0) for x in (2, 4, 8, 10)] + [("L", x, 320.0) for x in (2, 4, 8, 10)]),
    "HDR-A-01": [("D", 2.0, 1800.0), ("S", 2.0, 3000.0)],
    "J-A-01": [],
    "BJ-A-01": [],
    "J-A-02": [],
}
JOINTS_FT = {"G-A-01": [6.0], "J-A-02": [8.0]}  # the one joint: mid-span of the girder, end of the joist


@pytest.mark.parametrize("name", list(SUPPORTS_FT))
def test_supports_and_loads_read_back(members, name):
    m = members[name]
    assert [(x / FT, kind) for x, kind in m["supports"]] == [
        (pytest.approx(x, abs=1e-9), kind) for x, kind in SUPPORTS_FT[name]
    ]
    uniform = {k: w * FT for k, w in m["loads"]["uniform"].items()}
    assert uniform == pytest.approx(UNIFORM_PLF[name], rel=1e-12)
    points = [(t, x / FT, P) for t, x, P in m["loads"]["point"]]
    assert points == [(t, pytest.approx(x, abs=1e-9), pytest.approx(P, rel=1e-12)) for t, x, P in POINTS_FT_LBF[name]]
    assert [x / FT for x, _ in m["joints"]] == pytest.approx(JOINTS_FT.get(name, []), abs=1e-9)


def test_j_a_02_frames_into_the_girder_through_one_shared_connection(members):
    """The joint is one IfcStructuralPointConnection without a condition, joined by both curve
    members; its vertex is the very IfcVertexPoint the joist's edge ends on (README, "Joint")."""
    ((x_girder, joint),), ((x_joist, same),) = members["G-A-01"]["joints"], members["J-A-02"]["joints"]
    assert joint == same and joint.Name == "J-A-02 on G-A-01"
    assert {r.RelatingStructuralMember.Name for r in joint.ConnectsStructuralMembers} == {"G-A-01", "J-A-02"}
    assert _vertex_of(joint) == _edge(members["J-A-02"]["member"]).EdgeEnd
    assert (x_girder, x_joist) == (pytest.approx(72.0, abs=1e-9), pytest.approx(96.0, abs=1e-9))


def test_the_reader_makes_the_girder_carry_j_a_02(model, members):
    """ifccheck.ifc.structural reads the joint as J-A-02's pinned support at its end (96 in) carried by
    G-A-01 at 72 in along it (positions as in the README; 1e-9 in)."""
    from ifccheck.ifc.structural import read_structural
    from ifccheck.ifc.units import model_units
    from ifccheck.rules import load_rules

    beams = {m["beam"].GlobalId: m["beam"] for m in members.values()}
    summary = read_structural(model, beams, model_units(model).to_core, load_rules())
    joist = summary.by_member[members["J-A-02"]["beam"].GlobalId]
    assert [(s.x, s.carrier, s.carrier_x) for s in joist.supports] == [
        (pytest.approx(0.0, abs=1e-9), "", pytest.approx(math.nan, nan_ok=True)),
        (pytest.approx(96.0, abs=1e-9), members["G-A-01"]["beam"].GlobalId, pytest.approx(72.0, abs=1e-9)),
    ]
    carriers = [s.carrier for name, m in members.items() if name != "J-A-02"
                for s in summary.by_member[m["beam"].GlobalId].supports]
    assert carriers == [""] * 9  # nothing else bears on another member


# ------------------------------------------------------------------------------------------
# The README's hand calculations from the data in the file
# ------------------------------------------------------------------------------------------


def _S(b, d):
    return b * d**2 / 6


def _I(b, d):
    return b * d**3 / 12


def _C_L(le, b, d, E_min, F_b_star):
    """NDS 2018 §3.3.3: RB = sqrt(le d / b^2), FbE = 1.20 E'min / RB^2, CL by Eq. 3.3-6."""
    F_bE = 1.20 * E_min / (le * d / b**2)
    r = F_bE / F_b_star
    a = (1 + r) / 1.9
    return a - math.sqrt(a**2 - r / 0.95)


def test_two_span_joist_j_a_01(members):
    """AWC Design Aid No. 6, "Continuous Beam - Two Equal Spans - Uniformly Distributed Load":
    R1 = R3 = 0.375 wL, R2 = 1.25 wL, M2 = -0.125 wL^2; "... - Uniform Load on One Span":
    R1 = 7wL/16, so with dead on both spans and live on span 1 only R1 = 0.375 wD L + 0.4375 wL L and
    the largest positive moment is R1^2 / (2 (wD + wL)). README: 300 / 1000 lb, -14,400 in-lb,
    340 lb, 10,404 in-lb; bending (NDS Supplement 2018 Table 4A, DF-L No.2 2x10: Fb 900 psi,
    Emin 580,000 psi; CF 1.1, Cr 1.15, CD 1.0): positive 0.427 with CL = 1; negative 0.618 with
    lu = 0.25 L = 36 in to the inflection point, le = 2.06 lu (NDS 2018 Table 3.3.3, lu/d < 7)."""
    m = members["J-A-01"]
    xs = [x for x, _ in m["supports"]]
    L = xs[1] - xs[0]
    assert xs[2] - xs[1] == pytest.approx(L, rel=1e-12)  # equal spans, so the AWC formulas apply
    wD, wL = m["loads"]["uniform"]["D"], m["loads"]["uniform"]["L"]
    w = wD + wL
    assert 0.375 * w * L == pytest.approx(300.0, rel=1e-9)
    assert 1.25 * w * L == pytest.approx(1000.0, rel=1e-9)
    M_neg = 0.125 * w * L**2
    assert M_neg == pytest.approx(14_400.0, rel=1e-9)
    R1 = 0.375 * wD * L + 0.4375 * wL * L
    assert R1 == pytest.approx(340.0, rel=1e-9)
    M_pos = R1**2 / (2 * w)
    assert M_pos == pytest.approx(10_404.0, rel=1e-9)
    b, d = m["section"]
    Fb_star = 900 * 1.0 * 1.1 * 1.15
    assert M_pos / _S(b, d) / Fb_star == pytest.approx(0.427, abs=0.0005)
    lu = L - 0.75 * L  # the zero of M(x) = 0.375 wL x - w x^2 / 2 lies at 0.75 L from the end support
    assert lu / d < 7
    CL = _C_L(2.06 * lu, b, d, 580_000, Fb_star)
    assert CL == pytest.approx(0.956, abs=0.0005)
    assert M_neg / _S(b, d) / (Fb_star * CL) == pytest.approx(0.618, abs=0.0005)


def test_girder_g_a_01(members):
    """Statics of a simple span under point loads: R = sum P / 2 (symmetric), M(mid) = R L/2 -
    sum P (L/2 - a)+; midspan deflection sum P a (3L^2 - 4a^2) / (48 EI), a from the nearer support
    (AWC Design Aid No. 6, "Simple Beam - Concentrated Load at Any Point" superposed). The loads are
    the girder's own four pairs and, at the joint, J-A-02's reactions w l / 2 per load type (simple
    span). README: 1000 lb, 43,200 in-lb, bending 0.686 (DF-L No.1 Fb 1000, Emin 620,000, E 1,700,000
    psi, NDS Supplement 2018 Table 4A; lu = 24 in, le = 2.06 lu), live deflection 0.1206 in."""
    m, joist = members["G-A-01"], members["J-A-02"]
    (x0, _), (x1, _) = m["supports"]
    L = x1 - x0
    ((x_joint, _),) = m["joints"]
    l_joist = _length(joist["member"])
    reactions = [(t, x_joint, w * l_joist / 2) for t, w in joist["loads"]["uniform"].items()]
    assert sorted(reactions) == [
        ("D", pytest.approx(72.0, abs=1e-9), pytest.approx(80.0, rel=1e-9)),
        ("L", pytest.approx(72.0, abs=1e-9), pytest.approx(320.0, rel=1e-9)),
    ]
    points = m["loads"]["point"] + reactions
    R = sum(P for _, _, P in points) / 2
    assert R == pytest.approx(1000.0, rel=1e-12)
    M_mid = R * L / 2 - sum(P * max(L / 2 - x, 0.0) for _, x, P in points)
    assert M_mid == pytest.approx(43_200.0, rel=1e-9)
    b, d = m["section"]
    CL = _C_L(2.06 * 24.0, b, d, 620_000, 1000.0)
    assert M_mid / _S(b, d) / (1000.0 * CL) == pytest.approx(0.686, abs=0.0005)
    EI = 1_700_000 * _I(b, d)
    live = sum(P * min(x, L - x) * (3 * L**2 - 4 * min(x, L - x) ** 2) for t, x, P in points if t == "L") / (48 * EI)
    assert live == pytest.approx(0.1206, abs=0.00005)


def test_balcony_joist_bj_a_01(members):
    """Statics of a beam overhanging one support: Mb = -w a^2 / 2 from the overhang's load,
    R_A = w L / 2 + Mb / L from the back span's; largest positive moment R_A^2 / (2 w) with live on
    the back span only; smallest R_A with live on the overhang only. README: R_B 980 lb, R_A 484 and
    20 lb, Mb -9,600 in-lb, M+ 14,055 in-lb, bending 0.577 (Fb' = 1138.5 psi as J-A-01); tip
    deflection with live on the overhang w a^3 (4L + 3a) / (24 EI) = 0.1211 in."""
    m = members["BJ-A-01"]
    (xa, _), (xb, _) = m["supports"]
    L = xb - xa
    a = _length(m["member"]) - xb
    assert (L, a) == (pytest.approx(120.0, abs=1e-9), pytest.approx(48.0, abs=1e-9))
    wD, wL = m["loads"]["uniform"]["D"], m["loads"]["uniform"]["L"]
    w = wD + wL
    Mb_full = -w * a**2 / 2
    assert Mb_full == pytest.approx(-9_600.0, rel=1e-9)
    assert w * (L + a) - (w * L / 2 + Mb_full / L) == pytest.approx(980.0, rel=1e-9)  # R_B, all loaded
    R_A_back = w * L / 2 - wD * a**2 / 2 / L
    assert R_A_back == pytest.approx(484.0, rel=1e-9)
    assert wD * L / 2 + Mb_full / L == pytest.approx(20.0, rel=1e-9)  # R_A, live on the overhang only
    M_pos = R_A_back**2 / (2 * w)
    assert M_pos == pytest.approx(14_055.36, rel=1e-9)
    b, d = m["section"]
    assert M_pos / _S(b, d) / (900 * 1.1 * 1.15) == pytest.approx(0.577, abs=0.0005)
    tip = wL * a**3 * (4 * L + 3 * a) / (24 * 1_600_000 * _I(b, d))
    assert tip == pytest.approx(0.1211, abs=0.00005)


def test_store_joist_j_a_02(members):
    """AWC Design Aid No. 6, "Simple Beam - Uniformly Distributed Load": R = wl/2, M = wl^2/8,
    deflection 5wl^4/(384EI). l = 96 in from the north wall to the girder's axis. README: R 80 / 320
    lb (D / L), M 9,600 in-lb; bending 0.293 (2x12 DF-L No.2: Fb 900 psi, CF 1.0, Cr 1.15, NDS
    Supplement 2018 Table 4A; CL = 1, braced); live deflection 0.0259 in / (l/360) = 0.097."""
    m = members["J-A-02"]
    ((x0, _),), ((x1, _),) = m["supports"], m["joints"]
    l = x1 - x0
    assert l == pytest.approx(96.0, abs=1e-9)
    wD, wL = m["loads"]["uniform"]["D"], m["loads"]["uniform"]["L"]
    assert (wD * l / 2, wL * l / 2) == (pytest.approx(80.0, rel=1e-9), pytest.approx(320.0, rel=1e-9))
    M = (wD + wL) * l**2 / 8
    assert M == pytest.approx(9_600.0, rel=1e-9)
    b, d = m["section"]
    assert M / _S(b, d) / (900 * 1.0 * 1.15) == pytest.approx(0.293, abs=0.0005)
    live = 5 * wL * l**4 / (384 * 1_600_000 * _I(b, d))
    assert live == pytest.approx(0.0259, abs=0.00005)
    assert live / (l / 360) == pytest.approx(0.097, abs=0.0005)


def test_header_hdr_a_01(members):
    """AWC Design Aid No. 6, "Simple Beam - Concentrated Load at Any Point": R1 = Pb/L, M = Pab/L.
    README: 3200 lb, 76,800 in-lb; bending 1.577 under D+S (Fb' = 900 x 1.15 x 1.1 = 1138.5 psi, NDS
    Supplement 2018 Table 4A and NDS 2018 Table 2.3.2; no Cr, CL = 1) -> FAIL; snow deflection
    P a (L^2 - a^2)^1.5 / (9 sqrt3 L EI) = 0.0634 in."""
    m = members["HDR-A-01"]
    (x0, _), (x1, _) = m["supports"]
    L = x1 - x0
    (_, a, PD), (_, a_s, PS) = m["loads"]["point"]
    assert a == pytest.approx(a_s, abs=1e-9)
    b_arm = L - a
    assert (PD + PS) * b_arm / L == pytest.approx(3200.0, rel=1e-9)
    M = (PD + PS) * a * b_arm / L
    assert M == pytest.approx(76_800.0, rel=1e-9)
    b, d = m["section"]
    assert M / _S(b, d) / (900 * 1.15 * 1.1) == pytest.approx(1.577, abs=0.0005)
    snow = PS * a * (L**2 - a**2) ** 1.5 / (9 * math.sqrt(3) * L * 1_600_000 * _I(b, d))
    assert snow == pytest.approx(0.0634, abs=0.00005)
