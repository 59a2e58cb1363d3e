"""Supports and loads from IFC structural-analysis data (ifccheck.ifc.structural).

Small models are built in memory (IFC4 and IFC2X3) with ifcopenshell's create_entity; the real
models of ../shared/real_models are read where they are (skipped when the folder is absent).

Expected values are hand conversions from the exact unit definitions: 1 in = 25.4 mm and
1 lbf = 0.45359237 kg x 9.80665 m/s2 = 4.4482216152605 N (international yard and pound, 1959;
standard gravity, 3rd CGPM 1901). Hence 1 kN = 1000 / 4.4482216152605 = 224.8089 lbf,
1 kN/m = 1 N/mm = 224.8089 lbf / 39.37008 in = 5.710147 lbf/in, 1 m = 39.37008 in.
Exact conversions are asserted to a relative 1e-9; values through a file's own rounded
conversion factor to 1e-6.
"""

from __future__ import annotations

import math
from pathlib import Path

import ifcopenshell
import ifcopenshell.guid
import ifcopenshell.util.element as ifc_element
import pytest

from ifccheck.ifc.structural import load_group_rules, read_structural
from ifccheck.ifc.units import model_units
from ifccheck.rules import load_rules

REAL_MODELS = Path(__file__).resolve().parents[2] / "shared" / "real_models"
LBF_N = 4.4482216152605
IN_M = 0.0254
LBF_PER_KN = 1000.0 / LBF_N  # 224.8089 lbf
LBF_PER_IN_PER_KN_PER_M = LBF_PER_KN * IN_M  # 5.710147 lbf/in
IN_PER_M = 1.0 / IN_M  # 39.37008 in
EXACT = 1e-9
RULES = load_rules()


def test_hand_conversions():
    """The two rounded factors quoted in the module docstring (hand calculation above)."""
    assert LBF_PER_KN == pytest.approx(224.8089, rel=1e-6)
    assert LBF_PER_IN_PER_KN_PER_M == pytest.approx(5.710147, rel=1e-6)


# --- a small in-memory model builder ---------------------------------------------------------


class Model:
    """An IFC model with an analysis model, built entity by entity (IFC4 or IFC2X3).

    ``units``: "kN-m" (metre, kN, kN/m), "N-mm" (millimetre, newton, N/mm) or "lbf-in".
    """

    def __init__(self, schema: str = "IFC4", units: str = "kN-m") -> None:
        self.f = ifcopenshell.file(schema=schema)
        self.ifc2x3 = schema == "IFC2X3"
        project = self.f.create_entity("IfcProject", GlobalId=ifcopenshell.guid.new(), Name="P")
        project.UnitsInContext = self.f.create_entity("IfcUnitAssignment", Units=self._units(units))
        origin = self.f.create_entity("IfcAxis2Placement3D", Location=self.point((0.0, 0.0, 0.0)))
        self.context = self.f.create_entity(
            "IfcGeometricRepresentationContext",
            ContextIdentifier="Model",
            ContextType="Model",
            CoordinateSpaceDimension=3,
            Precision=1e-5,
            WorldCoordinateSystem=origin,
        )
        project.RepresentationContexts = [self.context]
        self.analysis = self.f.create_entity(
            "IfcStructuralAnalysisModel", GlobalId=ifcopenshell.guid.new(), Name="A", PredefinedType="LOADING_3D"
        )
        if not self.ifc2x3:
            self.analysis.SharedPlacement = self.f.create_entity("IfcLocalPlacement", RelativePlacement=origin)
        self.items = []

    def _units(self, units: str) -> list:
        si = lambda unit_type, name, prefix=None: self.f.create_entity(
            "IfcSIUnit", UnitType=unit_type, Name=name, Prefix=prefix
        )  # noqa: E731
        if units == "lbf-in":
            inch = self._conversion("LENGTHUNIT", "inch", (1, 0, 0, 0, 0, 0, 0), IN_M, si("LENGTHUNIT", "METRE"))
            lbf = self._conversion("FORCEUNIT", "pound-force", (1, 1, -2, 0, 0, 0, 0), LBF_N, si("FORCEUNIT", "NEWTON"))
            length, force = inch, lbf
        elif units == "N-mm":
            length, force = si("LENGTHUNIT", "METRE", "MILLI"), si("FORCEUNIT", "NEWTON")
        else:
            length, force = si("LENGTHUNIT", "METRE"), si("FORCEUNIT", "NEWTON", "KILO")
        elements = [
            self.f.create_entity("IfcDerivedUnitElement", Unit=force, Exponent=1),
            self.f.create_entity("IfcDerivedUnitElement", Unit=length, Exponent=-1),
        ]
        linear = self.f.create_entity("IfcDerivedUnit", Elements=elements, UnitType="LINEARFORCEUNIT")
        return [length, force, linear]

    def _conversion(self, unit_type, name, exponents, factor, si_unit):
        return self.f.create_entity(
            "IfcConversionBasedUnit",
            Dimensions=self.f.create_entity("IfcDimensionalExponents", *exponents),
            UnitType=unit_type,
            Name=name,
            ConversionFactor=self.f.create_entity(
                "IfcMeasureWithUnit", ValueComponent=self.f.create_entity("IfcReal", factor), UnitComponent=si_unit
            ),
        )

    def point(self, coordinates):
        return self.f.create_entity("IfcCartesianPoint", Coordinates=[float(c) for c in coordinates])

    def vertex(self, coordinates):
        return self.f.create_entity("IfcVertexPoint", VertexGeometry=self.point(coordinates))

    def topology(self, item, kind: str):
        representation = self.f.create_entity(
            "IfcTopologyRepresentation",
            ContextOfItems=self.context,
            RepresentationIdentifier="Reference",
            RepresentationType=kind,
            Items=[item],
        )
        return self.f.create_entity("IfcProductDefinitionShape", Representations=[representation])

    def shape(self, identifier: str, kind: str, item):
        """A product shape of one IfcShapeRepresentation holding ``item``."""
        representation = self.f.create_entity(
            "IfcShapeRepresentation",
            ContextOfItems=self.context,
            RepresentationIdentifier=identifier,
            RepresentationType=kind,
            Items=[item],
        )
        return self.f.create_entity("IfcProductDefinitionShape", Representations=[representation])

    def beam(self, start, end, name="B"):
        """An IfcBeam at the world origin with an 'Axis' polyline from ``start`` to ``end``."""
        line = self.f.create_entity("IfcPolyline", Points=[self.point(start), self.point(end)])
        return self.f.create_entity(
            "IfcBeam", GlobalId=ifcopenshell.guid.new(), Name=name, Representation=self.shape("Axis", "Curve3D", line)
        )

    def extruded_beam(self, origin, direction, across, depth, name="B"):
        """An IfcBeam placed at ``origin`` whose rectangle body is extruded ``depth`` along ``direction``."""
        placement = self.f.create_entity(
            "IfcAxis2Placement3D",
            Location=self.point(origin),
            Axis=self.f.create_entity("IfcDirection", DirectionRatios=direction),
            RefDirection=self.f.create_entity("IfcDirection", DirectionRatios=across),
        )
        centre = self.f.create_entity("IfcCartesianPoint", Coordinates=(0.0, 0.0))
        profile = self.f.create_entity(
            "IfcRectangleProfileDef",
            ProfileType="AREA",
            XDim=100.0,
            YDim=200.0,
            Position=self.f.create_entity("IfcAxis2Placement2D", Location=centre),
        )
        solid = self.f.create_entity(
            "IfcExtrudedAreaSolid",
            SweptArea=profile,
            Position=self.f.create_entity("IfcAxis2Placement3D", Location=self.point((0, 0, 0))),
            ExtrudedDirection=self.f.create_entity("IfcDirection", DirectionRatios=(0.0, 0.0, 1.0)),
            Depth=float(depth),
        )
        return self.f.create_entity(
            "IfcBeam",
            GlobalId=ifcopenshell.guid.new(),
            Name=name,
            ObjectPlacement=self.f.create_entity("IfcLocalPlacement", RelativePlacement=placement),
            Representation=self.shape("Body", "SweptSolid", solid),
        )

    def curve(self, start, end, name="C", axis=None):
        edge = self.f.create_entity("IfcEdge", EdgeStart=self.vertex(start), EdgeEnd=self.vertex(end))
        member = self.f.create_entity(
            "IfcStructuralCurveMember",
            GlobalId=ifcopenshell.guid.new(),
            Name=name,
            Representation=self.topology(edge, "Edge"),
            PredefinedType="RIGID_JOINED_MEMBER",
        )
        if axis is not None:
            member.Axis = self.f.create_entity("IfcDirection", DirectionRatios=axis)
        self.items.append(member)
        return member

    def node(self, coordinates, members, condition=None, name="N"):
        """A point connection joining ``members``; ``condition``: 6 values (IFC4 booleans, IFC2X3 stiffness numbers)."""
        connection = self.f.create_entity(
            "IfcStructuralPointConnection",
            GlobalId=ifcopenshell.guid.new(),
            Name=name,
            Representation=self.topology(self.vertex(coordinates), "Vertex"),
        )
        if condition is not None:
            connection.AppliedCondition = self._condition(condition)
        for member in members:
            self.f.create_entity(
                "IfcRelConnectsStructuralMember",
                GlobalId=ifcopenshell.guid.new(),
                RelatingStructuralMember=member,
                RelatedStructuralConnection=connection,
            )
        self.items.append(connection)
        return connection

    def _condition(self, values):
        prefix = "LinearStiffness" if self.ifc2x3 else "TranslationalStiffness"
        names = [f"{prefix}{c}" for c in "XYZ"] + [f"RotationalStiffness{c}" for c in "XYZ"]
        if self.ifc2x3:
            return self.f.create_entity("IfcBoundaryNodeCondition", **{n: float(v) for n, v in zip(names, values)})
        booleans = {n: self.f.create_entity("IfcBoolean", bool(v)) for n, v in zip(names, values)}
        return self.f.create_entity("IfcBoundaryNodeCondition", **booleans)

    def link(self, physical, curves, reverse=False):
        """IfcRelAssignsToProduct: physical element relating its curve members, or (``reverse``) the other way."""
        if reverse:
            for curve in curves:
                self.f.create_entity(
                    "IfcRelAssignsToProduct",
                    GlobalId=ifcopenshell.guid.new(),
                    RelatedObjects=[physical],
                    RelatingProduct=curve,
                )
        else:
            self.f.create_entity(
                "IfcRelAssignsToProduct",
                GlobalId=ifcopenshell.guid.new(),
                RelatedObjects=list(curves),
                RelatingProduct=physical,
            )

    def group(self, name, source="NOTDEFINED", action_type="NOTDEFINED", kind="LOAD_CASE"):
        ifc_class = "IfcStructuralLoadGroup" if self.ifc2x3 or kind != "LOAD_CASE" else "IfcStructuralLoadCase"
        return self.f.create_entity(
            ifc_class,
            GlobalId=ifcopenshell.guid.new(),
            Name=name,
            PredefinedType=kind,
            ActionType=action_type,
            ActionSource=source,
        )

    def into(self, group, objects):
        self.f.create_entity(
            "IfcRelAssignsToGroup", GlobalId=ifcopenshell.guid.new(), RelatedObjects=list(objects), RelatingGroup=group
        )

    def line_load(self, member, group, z, x=0.0, local=False, projected=None):
        """A constant line action of LinearForceZ = ``z`` (and LinearForceX = ``x``) on a curve member."""
        load = self.f.create_entity("IfcStructuralLoadLinearForce", LinearForceX=x, LinearForceZ=z)
        ifc_class = "IfcStructuralLinearAction" if self.ifc2x3 else "IfcStructuralCurveAction"
        action = self.f.create_entity(
            ifc_class,
            GlobalId=ifcopenshell.guid.new(),
            AppliedLoad=load,
            GlobalOrLocal="LOCAL_COORDS" if local else "GLOBAL_COORDS",
            DestabilizingLoad=False,
            ProjectedOrTrue=projected,
        )
        if not self.ifc2x3:
            action.PredefinedType = "CONST"
        return self._act(member, group, action)

    def point_load(self, item, group, z, at=None, x=0.0, local=False):
        """A point action of ForceZ = ``z`` on a curve member (at point ``at``) or a point connection."""
        load = self.f.create_entity("IfcStructuralLoadSingleForce", ForceX=x, ForceZ=z)
        action = self.f.create_entity(
            "IfcStructuralPointAction",
            GlobalId=ifcopenshell.guid.new(),
            AppliedLoad=load,
            GlobalOrLocal="LOCAL_COORDS" if local else "GLOBAL_COORDS",
            DestabilizingLoad=False,
            Representation=self.topology(self.vertex(at), "Vertex") if at is not None else None,
        )
        return self._act(item, group, action)

    def temperature_load(self, member, group):
        load = self.f.create_entity("IfcStructuralLoadTemperature", DeltaT_Constant=20.0)
        ifc_class = "IfcStructuralLinearAction" if self.ifc2x3 else "IfcStructuralCurveAction"
        action = self.f.create_entity(
            ifc_class,
            GlobalId=ifcopenshell.guid.new(),
            AppliedLoad=load,
            GlobalOrLocal="GLOBAL_COORDS",
            DestabilizingLoad=False,
        )
        return self._act(member, group, action)

    def _act(self, item, group, action):
        self.f.create_entity(
            "IfcRelConnectsStructuralActivity",
            GlobalId=ifcopenshell.guid.new(),
            RelatingElement=item,
            RelatedStructuralActivity=action,
        )
        self.into(group, [action])
        return action

    def read(self, members, rules=RULES):
        self.into(self.analysis, self.items)
        return read_structural(self.f, {m.GlobalId: m for m in members}, model_units(self.f).to_core, rules)


def loads_of(analysis, load_type):
    return [load for load in analysis.loads if load.load_type == load_type]


# --- in-memory models --------------------------------------------------------------------


def test_ifc4_two_span_member_with_three_supports_and_dead_and_live_cases():
    """8 m beam in two curve members (the second reversed) on pinned nodes at 0, 4 and 8 m; kN and kN/m.

    Hand calculation: 4 m = 157.48031 in; 2 kN/m = 11.420294 lbf/in; 3 kN/m = 17.130441 lbf/in.
    The load combination grouping both cases is skipped.
    """
    m = Model("IFC4", "kN-m")
    beam = m.beam((0, 0, 3), (8, 0, 3))
    left, right = m.curve((0, 0, 3), (4, 0, 3), "C1"), m.curve((8, 0, 3), (4, 0, 3), "C2")
    m.link(beam, [right, left])
    held_vertically = (0, 0, 1, 0, 0, 0)
    m.node((0, 0, 3), [left], held_vertically)
    m.node((4, 0, 3), [left, right], (1, 1, 1, 0, 0, 0))
    m.node((8, 0, 3), [right], held_vertically)
    dead, live = m.group("Case 1", source="DEAD_LOAD_G"), m.group("Case 2", source="LIVE_LOAD_Q")
    for curve in (left, right):
        m.line_load(curve, dead, -2.0, projected="TRUE_LENGTH")
        m.line_load(curve, live, -3.0, projected="TRUE_LENGTH")
    combination = m.group("Combination", kind="LOAD_COMBINATION")
    m.into(combination, [dead, live])
    summary = m.read([beam])
    analysis = summary.by_member[beam.GlobalId]
    assert (summary.linked_by_relation, summary.supports, summary.load_combinations) == (1, 3, 1)
    assert summary.groups_by_type == {"D": 1, "L": 1}
    assert analysis.length == pytest.approx(8 * IN_PER_M, rel=EXACT)
    assert [s.x for s in analysis.supports] == pytest.approx([0.0, 4 * IN_PER_M, 8 * IN_PER_M], rel=EXACT, abs=1e-9)
    assert {s.kind for s in analysis.supports} == {"pinned"}
    for load_type, kn_per_m in (("D", 2.0), ("L", 3.0)):
        loads = sorted(loads_of(analysis, load_type), key=lambda load: load.a)
        assert [(load.kind, load.a, load.b) for load in loads] == [
            ("uniform", pytest.approx(0.0, abs=1e-9), pytest.approx(4 * IN_PER_M, rel=EXACT)),
            ("uniform", pytest.approx(4 * IN_PER_M, rel=EXACT), pytest.approx(8 * IN_PER_M, rel=EXACT)),
        ]
        assert [load.value for load in loads] == pytest.approx([kn_per_m * LBF_PER_IN_PER_KN_PER_M] * 2, rel=EXACT)
    assert analysis.problems == []


def test_ifc2x3_cantilever_fixed_end_linked_by_end_points_with_snow_point_load_at_the_tip():
    """2.5 m cantilever along +Y from (1000, 2000, 3000) mm; no IfcRelAssignsToProduct, so the curve
    member is found by its end points. Node at the root: IFC2X3 stiffness 1e10 N/m in X, Y, Z and
    1e10 N·m/rad about all axes -> fixed. A NOTDEFINED group named 'Schnee' maps to S by name.

    Hand calculation: 2500 mm / 25.4 = 98.425197 in; 1.5 kN = 337.21342 lbf.
    """
    m = Model("IFC2X3", "N-mm")
    beam = m.extruded_beam((1000, 2000, 3000), (0.0, 1.0, 0.0), (1.0, 0.0, 0.0), 2500)
    curve = m.curve((1000, 2000, 3000), (1000, 4500, 3000))
    m.node((1000, 2000, 3000), [curve], (1e10,) * 6, "root")
    tip = m.node((1000, 4500, 3000), [curve], name="tip")
    m.point_load(tip, m.group("Schnee"), -1500.0)
    summary = m.read([beam])
    analysis = summary.by_member[beam.GlobalId]
    assert (summary.linked_by_relation, summary.linked_by_geometry) == (0, 1)
    assert analysis.length == pytest.approx(2500 / 25.4, rel=EXACT)
    assert [(s.x, s.kind) for s in analysis.supports] == [(pytest.approx(0.0, abs=1e-9), "fixed")]
    (load,) = analysis.loads
    assert (load.load_type, load.kind) == ("S", "point")
    assert load.a == pytest.approx(2500 / 25.4, rel=EXACT)
    assert load.value == pytest.approx(1.5 * LBF_PER_KN, rel=EXACT)
    assert analysis.problems == []


def test_ifc2x3_linear_force_in_n_per_mm_self_weight_group_temperature_and_unmapped_group():
    """0.5 N/mm = 0.5 kN/m = 2.8550736 lbf/in in a group named 'Eigengewicht' (D, noted as the
    analysis self weight); a temperature action is ignored and counted; a group 'Gruppe 7' with no
    type and no known name becomes a problem of the member it loads."""
    m = Model("IFC2X3", "N-mm")
    beam = m.beam((0, 0, 0), (4000, 0, 0))
    curve = m.curve((0, 0, 0), (4000, 0, 0))
    m.link(beam, [curve])
    m.line_load(curve, m.group("Eigengewicht"), -0.5)
    m.temperature_load(curve, m.group("Temperatur"))
    m.point_load(curve, m.group("Gruppe 7"), -1000.0, at=(2000, 0, 0))
    summary = m.read([beam])
    analysis = summary.by_member[beam.GlobalId]
    (load,) = analysis.loads
    assert (load.load_type, load.kind, load.a, load.b) == ("D", "uniform", 0.0, pytest.approx(4000 / 25.4, rel=EXACT))
    assert load.value == pytest.approx(0.5 * LBF_PER_IN_PER_KN_PER_M, rel=EXACT)
    assert any("'Eigengewicht' is the analysis self weight" in note for note in analysis.notes)
    assert summary.temperature_actions == 1
    assert summary.groups_by_type == {"D": 1, "ignored": 1, "unmapped": 1}
    assert summary.unmapped_groups == ["Gruppe 7"]
    assert analysis.problems == [
        "load group 'Gruppe 7' has no load type (set ActionSource, or map its name in the rules)"
    ]


def test_ifc4_point_action_at_mid_span_in_local_coordinates_imperial():
    """10 ft beam in inches and lbf, curve member with Axis (0, 0, 1) linked the reverse way
    (RelatingProduct = curve member). Point action at x = 60 in: local ForceZ = -500 lbf (down),
    local ForceX = 100 lbf along the member, which is left out with a note and counted."""
    m = Model("IFC4", "lbf-in")
    beam = m.beam((0, 0, 0), (120, 0, 0))
    curve = m.curve((0, 0, 0), (120, 0, 0), axis=(0.0, 0.0, 1.0))
    m.link(beam, [curve], reverse=True)
    m.node((0, 0, 0), [curve], (1, 1, 1, 0, 0, 0))
    m.node((120, 0, 0), [curve], (0, 0, 1, 0, 0, 0))
    m.point_load(curve, m.group("Snow", source="SNOW_S"), -500.0, at=(60, 0, 0), x=100.0, local=True)
    summary = m.read([beam])
    analysis = summary.by_member[beam.GlobalId]
    assert [s.x for s in analysis.supports] == pytest.approx([0.0, 120.0], abs=1e-9)
    (load,) = analysis.loads
    assert (load.load_type, load.kind) == ("S", "point")
    assert (load.a, load.value) == (pytest.approx(60.0, rel=EXACT), pytest.approx(500.0, rel=EXACT))
    assert summary.non_gravity_components == 1
    assert any("other than gravity" in note for note in analysis.notes)


def test_ifc4_sloped_member_true_length_values_become_per_horizontal_length():
    """Rafter 4 m long at 30°: a PROJECTED_LENGTH value stays (1 kN/m = 5.710147 lbf/in per
    horizontal length); a TRUE_LENGTH value is divided by cos 30° = 0.8660254 (6.5935064 lbf/in).
    Positions stay along the member: 0 to 4 m = 157.48031 in."""
    m = Model("IFC4", "kN-m")
    top = (4 * math.cos(math.radians(30)), 0.0, 4 * math.sin(math.radians(30)))
    beam = m.beam((0, 0, 0), top)
    curve = m.curve((0, 0, 0), top)
    m.link(beam, [curve])
    m.line_load(curve, m.group("Snow"), -1.0, projected="PROJECTED_LENGTH")
    m.line_load(curve, m.group("Roofing", action_type="PERMANENT_G"), -1.0, projected="TRUE_LENGTH")
    analysis = m.read([beam]).by_member[beam.GlobalId]
    (snow,), (dead,) = loads_of(analysis, "S"), loads_of(analysis, "D")
    assert snow.value == pytest.approx(LBF_PER_IN_PER_KN_PER_M, rel=EXACT)
    assert dead.value == pytest.approx(LBF_PER_IN_PER_KN_PER_M / math.cos(math.radians(30)), rel=EXACT)
    assert (dead.a, dead.b) == (pytest.approx(0.0, abs=1e-9), pytest.approx(4 * IN_PER_M, rel=EXACT))


def test_ifc4_joist_framing_into_a_split_girder_bears_on_it():
    """A joist whose end node (no boundary condition) joins a girder's two curve members at the
    girder's mid-point gets a pinned support there carried by the girder; the girder is told.
    3 m joist along X, girder 6 m along Y; hand calculation: the node (3, 3, 0) m lies 3 m from the
    girder's start (3, 0, 0) m, 3 m = 118.11024 in, inside the girder (its ends at 0 and 236.22 in)."""
    m = Model("IFC4", "kN-m")
    joist, girder = m.beam((0, 3, 0), (3, 3, 0), "J1"), m.beam((3, 0, 0), (3, 6, 0), "G1")
    joist_curve = m.curve((0, 3, 0), (3, 3, 0))
    girder_curves = [m.curve((3, 0, 0), (3, 3, 0)), m.curve((3, 3, 0), (3, 6, 0))]
    m.link(joist, [joist_curve])
    m.link(girder, girder_curves)
    m.node((0, 3, 0), [joist_curve], (1, 1, 1, 0, 0, 0))
    m.node((3, 3, 0), [joist_curve, *girder_curves])
    m.node((3, 0, 0), [girder_curves[0]], (1, 1, 1, 0, 0, 0))
    m.node((3, 6, 0), [girder_curves[1]], (0, 0, 1, 0, 0, 0))
    summary = m.read([joist, girder])
    on_joist, on_girder = summary.by_member[joist.GlobalId], summary.by_member[girder.GlobalId]
    assert [(s.x, s.kind, s.source) for s in on_joist.supports] == [
        (pytest.approx(0.0, abs=1e-9), "pinned", "boundary condition of IfcStructuralPointConnection 'N'"),
        (pytest.approx(3 * IN_PER_M, rel=EXACT), "pinned", "joint with IfcBeam 'G1'"),
    ]
    first, bearing = on_joist.supports
    assert (first.carrier, math.isnan(first.carrier_x)) == ("", True)
    assert (bearing.carrier, bearing.carrier_x) == (girder.GlobalId, pytest.approx(3 * IN_PER_M, rel=EXACT))
    assert "support at x = 118.1 in: this member frames into IfcBeam 'G1' (taken as pinned); its reaction is " \
        "applied to that member as a point load at x = 118.1 in along it" in on_joist.notes
    assert [(s.x, s.carrier) for s in on_girder.supports] == [
        (pytest.approx(0.0, abs=1e-9), ""),
        (pytest.approx(6 * IN_PER_M, rel=EXACT), ""),
    ]
    assert "IfcBeam 'J1' frames into this member at x = 118.1 in; its reaction is applied here as a point load " \
        "(the design check analyses the carried member first)" in on_girder.notes
    assert not any("later issue" in note for note in on_joist.notes + on_girder.notes)


def joist_on_girder(checked=("joist", "girder")):
    """3 m joist J1 from (0, 2, 0) to (3, 2, 0) m, restrained at its start; girder G1 whose axis runs
    from (3, 6, 0) to (3, 0, 0) m on one curve member drawn from (3, 0, 0) to (3, 6, 0), pinned at both
    ends. The free node at (3, 2, 0) m joins both curve members (the joist's end, inside the girder's
    curve member). A dead point load of -1 kN acts on that node; 2 kN/m dead on the joist."""
    m = Model("IFC4", "kN-m")
    joist, girder = m.beam((0, 2, 0), (3, 2, 0), "J1"), m.beam((3, 6, 0), (3, 0, 0), "G1")
    joist_curve, girder_curve = m.curve((0, 2, 0), (3, 2, 0), "JC"), m.curve((3, 0, 0), (3, 6, 0), "GC")
    m.link(joist, [joist_curve])
    m.link(girder, [girder_curve])
    m.node((0, 2, 0), [joist_curve], (1, 1, 1, 0, 0, 0))
    m.node((3, 0, 0), [girder_curve], (1, 1, 1, 0, 0, 0))
    m.node((3, 6, 0), [girder_curve], (0, 0, 1, 0, 0, 0))
    joint = m.node((3, 2, 0), [joist_curve, girder_curve], name="joint")
    dead = m.group("Dead", source="DEAD_LOAD_G")
    m.point_load(joint, dead, -1.0)
    m.line_load(joist_curve, dead, -2.0)
    members = {"joist": joist, "girder": girder}
    summary = m.read([members[name] for name in checked])
    return summary, joist, girder


def test_joist_end_node_inside_a_girder_curve_member_gets_the_girder_as_carrier():
    """The joist's end node is an interior node of the girder's single curve member (the same
    IfcStructuralPointConnection). Hand calculation: the girder's axis starts at (3, 6, 0) m, so the
    node (3, 2, 0) m lies 6 - 2 = 4 m along it = 157.48031 in; the joist's end is at 3 m = 118.11024 in.
    The point load on the joint lies inside the girder, so the girder takes it (1 kN = 224.8089 lbf
    at 157.48 in) and the joist does not; the joist keeps its own 2 kN/m."""
    summary, joist, girder = joist_on_girder()
    on_joist, on_girder = summary.by_member[joist.GlobalId], summary.by_member[girder.GlobalId]
    support = on_joist.supports[-1]
    assert (support.x, support.kind) == (pytest.approx(3 * IN_PER_M, rel=EXACT), "pinned")
    assert (support.carrier, support.carrier_x) == (girder.GlobalId, pytest.approx(4 * IN_PER_M, rel=EXACT))
    assert [(load.kind, load.value) for load in on_joist.loads] == [
        ("uniform", pytest.approx(2 * LBF_PER_IN_PER_KN_PER_M, rel=EXACT))
    ]
    (node_load,) = on_girder.loads
    assert (node_load.kind, node_load.a) == ("point", pytest.approx(4 * IN_PER_M, rel=EXACT))
    assert node_load.value == pytest.approx(LBF_PER_KN, rel=EXACT)
    assert [s.x for s in on_girder.supports] == pytest.approx([0.0, 6 * IN_PER_M], rel=EXACT, abs=1e-9)
    assert "IfcBeam 'J1' frames into this member at x = 157.5 in; its reaction is applied here as a point load " \
        "(the design check analyses the carried member first)" in on_girder.notes
    assert on_joist.problems == [] and on_girder.problems == []


@pytest.mark.parametrize("offset_mm, matched", [(10.0, True), (80.0, False)])
def test_distinct_coincident_connections_are_matched_by_position(offset_mm, matched):
    """The joist's end node joins only the joist; the girder, split in two curve members, has its own
    node offset_mm away across it (along X). The joist's tolerance is max(1 % of 118.11 in, 2 in) = 2 in:
    10 mm = 0.394 in is within it, so the girder carries the joist at 4 m = 157.48031 in along it
    (the offset is across the girder, so it does not change x); 80 mm = 3.150 in is not, and the
    joist's end holds nothing (no support there)."""
    m = Model("IFC4", "kN-m")
    joist, girder = m.beam((0, 2, 0), (3, 2, 0), "J1"), m.beam((3, 6, 0), (3, 0, 0), "G1")
    joist_curve = m.curve((0, 2, 0), (3, 2, 0))
    x = 3 + offset_mm / 1000
    girder_curves = [m.curve((x, 6, 0), (x, 2, 0)), m.curve((x, 2, 0), (x, 0, 0))]
    m.link(joist, [joist_curve])
    m.link(girder, girder_curves)
    m.node((0, 2, 0), [joist_curve], (1, 1, 1, 0, 0, 0))
    m.node((3, 2, 0), [joist_curve], name="joist end")
    m.node((x, 2, 0), girder_curves, name="girder node")
    m.node((x, 6, 0), [girder_curves[0]], (1, 1, 1, 0, 0, 0))
    m.node((x, 0, 0), [girder_curves[1]], (0, 0, 1, 0, 0, 0))
    summary = m.read([joist, girder])
    on_joist, on_girder = summary.by_member[joist.GlobalId], summary.by_member[girder.GlobalId]
    if matched:
        support = on_joist.supports[-1]
        assert (support.x, support.source) == (pytest.approx(3 * IN_PER_M, rel=EXACT), "joint with IfcBeam 'G1'")
        assert (support.carrier, support.carrier_x) == (girder.GlobalId, pytest.approx(4 * IN_PER_M, rel=EXACT))
        assert any(note.startswith("IfcBeam 'J1' frames into this member at x = 157.5 in") for note in on_girder.notes)
    else:
        assert [s.x for s in on_joist.supports] == pytest.approx([0.0], abs=1e-9)
        assert not any("frames into" in note for note in on_girder.notes)
    assert len(on_girder.supports) == 2


def test_collinear_joists_meeting_end_to_end_get_no_carrier():
    """Two 3 m joists in a row share a free node at x = 3 m = 118.11024 in, the end of both: each
    gets a pinned support there without a carrier (as before), and the reaction is carried no further."""
    m = Model("IFC4", "kN-m")
    left, right = m.beam((0, 0, 0), (3, 0, 0), "J1"), m.beam((3, 0, 0), (6, 0, 0), "J2")
    left_curve, right_curve = m.curve((0, 0, 0), (3, 0, 0)), m.curve((3, 0, 0), (6, 0, 0))
    m.link(left, [left_curve])
    m.link(right, [right_curve])
    m.node((0, 0, 0), [left_curve], (1, 1, 1, 0, 0, 0))
    m.node((3, 0, 0), [left_curve, right_curve])
    m.node((6, 0, 0), [right_curve], (0, 0, 1, 0, 0, 0))
    summary = m.read([left, right])
    on_left, on_right = summary.by_member[left.GlobalId], summary.by_member[right.GlobalId]
    assert [(s.x, s.source, s.carrier) for s in on_left.supports] == [
        (pytest.approx(0.0, abs=1e-9), "boundary condition of IfcStructuralPointConnection 'N'", ""),
        (pytest.approx(3 * IN_PER_M, rel=EXACT), "joint with IfcBeam 'J2'", ""),
    ]
    assert [(s.x, s.source, s.carrier) for s in on_right.supports] == [
        (pytest.approx(0.0, abs=1e-9), "joint with IfcBeam 'J1'", ""),
        (pytest.approx(3 * IN_PER_M, rel=EXACT), "boundary condition of IfcStructuralPointConnection 'N'", ""),
    ]
    assert all(math.isnan(s.carrier_x) for s in on_left.supports + on_right.supports)
    assert "support at x = 118.1 in: joint with IfcBeam 'J2' (taken as pinned); its reaction is not carried " \
        "further (it is at the other members' ends)" in on_left.notes
    assert not any("frames into" in note for note in on_left.notes + on_right.notes)


def test_a_carrier_that_is_not_checked_carries_nothing():
    """As the single-curve girder case, with only the joist passed in (the girder is, say, steel):
    the joist keeps its pinned support at 3 m = 118.11024 in without a carrier, and a note says the
    reaction is not carried further; the girder has no entry."""
    summary, joist, girder = joist_on_girder(checked=("joist",))
    on_joist = summary.by_member[joist.GlobalId]
    support = on_joist.supports[-1]
    assert (support.x, support.kind, support.source) == (
        pytest.approx(3 * IN_PER_M, rel=EXACT), "pinned", "joint with IfcBeam 'G1'"
    )
    assert (support.carrier, math.isnan(support.carrier_x)) == ("", True)
    assert "support at x = 118.1 in: joint with IfcBeam 'G1' (taken as pinned); its reaction is not carried " \
        "further (IfcBeam 'G1': not a checked member)" in on_joist.notes
    assert girder.GlobalId not in summary.by_member


def test_ifc4_load_configuration_gives_a_linear_load():
    """IfcStructuralLoadConfiguration on a 6 m beam: LinearForceZ 0 at 0 m, -2 kN/m at 3 m and 6 m
    (locations in metres along the member): a linear load 0 to 11.420294 lbf/in over 0 to 118.11024 in,
    then a uniform 11.420294 lbf/in to 236.22047 in (hand calculation with the factors above)."""
    m = Model("IFC4", "kN-m")
    beam = m.beam((0, 0, 0), (6, 0, 0))
    curve = m.curve((0, 0, 0), (6, 0, 0))
    m.link(beam, [curve])
    values = [m.f.create_entity("IfcStructuralLoadLinearForce", LinearForceZ=z) for z in (0.0, -2.0, -2.0)]
    configuration = m.f.create_entity("IfcStructuralLoadConfiguration", Values=values, Locations=[[0.0], [3.0], [6.0]])
    action = m.f.create_entity(
        "IfcStructuralCurveAction",
        GlobalId=ifcopenshell.guid.new(),
        AppliedLoad=configuration,
        GlobalOrLocal="GLOBAL_COORDS",
        DestabilizingLoad=False,
        PredefinedType="POLYGONAL",
    )
    m._act(curve, m.group("Dead", source="DEAD_LOAD_G"), action)
    linear, uniform = sorted(m.read([beam]).by_member[beam.GlobalId].loads, key=lambda load: load.a)
    w = 2.0 * LBF_PER_IN_PER_KN_PER_M
    assert (linear.kind, uniform.kind) == ("linear", "uniform")
    assert (linear.a, linear.b, linear.value, linear.value_end) == (
        pytest.approx(0.0, abs=1e-9),
        pytest.approx(3 * IN_PER_M, rel=EXACT),
        pytest.approx(0.0, abs=1e-12),
        pytest.approx(w, rel=EXACT),
    )
    assert (uniform.a, uniform.b, uniform.value) == (
        pytest.approx(3 * IN_PER_M, rel=EXACT),
        pytest.approx(6 * IN_PER_M, rel=EXACT),
        pytest.approx(w, rel=EXACT),
    )


def test_odd_data_becomes_problems_of_the_member():
    """A linked curve member without topology is left out with a problem; an elastic spring
    (IFC2X3 stiffness 5000 N/m, below the 1e9 N/m rigid limit) is not modelled and says so; a load
    beyond the member's end is a problem. Nothing raises. 3 m beam in metres."""
    m = Model("IFC2X3", "kN-m")
    beam = m.beam((0, 0, 0), (3, 0, 0))
    curve = m.curve((0, 0, 0), (3, 0, 0))
    broken = m.f.create_entity("IfcStructuralCurveMember", GlobalId=ifcopenshell.guid.new(), Name="no edge")
    m.link(beam, [curve, broken])
    m.node((0, 0, 0), [curve], (0, 0, 5e3, 0, 0, 0), "spring")  # no stiffness unit assigned: N/m
    action = m.point_load(curve, m.group("Dead"), -1.0, at=(3.5, 0, 0))
    analysis = m.read([beam]).by_member[beam.GlobalId]
    assert analysis.supports == []
    assert analysis.problems == [
        "IfcStructuralCurveMember 'no edge' has no IfcEdge of positive length; it is left out",
        "support at IfcStructuralPointConnection 'spring' is not read: "
        "elastic translation restraint of stiffness 5000 (model units) is not modelled",
        f"load at x = 137.8 in (IfcStructuralPointAction #{action.id()} in load group 'Dead') "
        "lies outside the member (0 to 118.1 in)",
    ]


def test_a_project_can_map_a_group_name():
    """A project's [load_groups] names are tried before the defaults (here 'FL' -> L); the default
    names of rules/load_groups.toml read German compounds and roof live before live."""
    mapping = load_group_rules({**RULES, "load_groups": {"names": {"L": ["^fl$"]}}})
    names = ("FL", "Schnee", "Windlast", "Nutzlast Dach", "Nutzlast", "Eigengewicht", "G", "T-Verlauf", "VERAEND1")
    labels = ("L", "S", "W", "Lr", "L", "self_weight", "D", "ignored", None)
    assert tuple(mapping.name_label(name) for name in names) == labels


# --- the real models -----------------------------------------------------------------------


@pytest.fixture
def real_models():
    if not REAL_MODELS.is_dir():
        pytest.skip("../shared/real_models is absent")
    return REAL_MODELS


def read_real(folder, name, classes=("IfcBeam", "IfcMember"), rules=RULES):
    """Every element of ``classes`` whose material name contains C24 (all of them when none does)."""
    model = ifcopenshell.open(folder / name)
    elements = [e for ifc_class in classes for e in model.by_type(ifc_class)]
    timber = [e for e in elements if "C24" in (getattr(ifc_element.get_material(e), "Name", None) or "")]
    members = {e.GlobalId: e for e in timber or elements}
    return read_structural(model, members, model_units(model).to_core, rules), members


def test_roof_truss_beams_linked_by_relation(real_models):
    """SOURCES.md 1: 9 C24 IfcBeam + 1 IfcColumn, 13 curve members, 10 IfcRelAssignsToProduct
    (beam/column -> curve members, one column to 3), load group ST1 NOTDEFINED, stiffness numbers
    0 or 1e10, abstract IfcStructuralAction self-weight placeholders. Counted by reading the file:
    2 placeholders act on beams' curve members (#208, #237), the other 2 on the column's; 16
    supports over the 9 beams (#204 holds X, Y, Z and rotation about X and Z, not about Y across
    the beams: pinned); the -50 kN point load acts on node #306, joined only by the column."""
    summary, members = read_real(real_models, "roof_truss--Axis-Struc.ifc")
    assert len(members) == 9
    assert (summary.analysis_models, summary.curve_members, summary.linked_by_relation) == (1, 13, 9)
    assert summary.unmapped_groups == ["ST1"] and summary.groups_by_type == {"unmapped": 1}
    assert summary.actions_without_values == 2
    assert summary.supports == 16
    analyses = summary.by_member.values()
    assert {s.kind for a in analyses for s in a.supports} == {"pinned"}
    assert [load for a in analyses for load in a.loads] == []
    assert [p for a in analyses for p in a.problems] == []
    chord = summary.by_member["2C8LChWJz5tf4W1o3Hm8DV"]  # #180, 120x300, extruded 3.154 m
    assert chord.length == pytest.approx(3.154 * IN_PER_M, rel=1e-9)
    assert [(s.x, s.kind) for s in chord.supports] == [
        (pytest.approx(0.0, abs=1e-6), "pinned"),
        (pytest.approx(3.154 * IN_PER_M, rel=1e-6), "pinned"),
    ]


def test_roof_truss_point_load_of_50_kn_on_the_column_top(real_models):
    """SOURCES.md 1: one point load of -50 kN in group ST1. With the column passed and ST1 mapped to
    D by a project rule, it lands on the column's top (x = 1.6 m, its extrusion depth), 50 kN =
    11240.447 lbf. The column's analysis members start 0.15 m below its body (read from the file),
    so the bottom joint lies outside it and is a problem."""
    rules = {**RULES, "load_groups": {"names": {"D": ["^st1$"]}}}
    summary, _ = read_real(real_models, "roof_truss--Axis-Struc.ifc", ("IfcBeam", "IfcColumn"), rules)
    assert summary.linked_by_relation == 10
    column = summary.by_member["0tVreBtcz4ew4aFKzwu08y"]
    (load,) = column.loads
    assert (load.load_type, load.kind) == ("D", "point")
    assert load.a == pytest.approx(1.6 * IN_PER_M, rel=1e-6)
    assert load.value == pytest.approx(50 * LBF_PER_KN, rel=1e-9)
    assert any("lies outside the member" in p for p in column.problems)


def test_little_steel_frame_c24_beams(real_models):
    """SOURCES.md 2: 17 C24 beams (100x160), all linked physical -> structural; their curve members
    carry line loads (group FL), temperature loads and self weight; 102 temperature actions in the
    file. Counted by reading the file: each C24 beam maps to 2 curve members in a row (the second
    reversed), 7.4 m long; each curve member has 1 FL load of -0.75 kN/m (the beams at x = 0 and
    12 m) or -1.5 kN/m (the other 15), 3 temperature actions (all 102 are on C24 members) and 1
    placeholder in group EG. No C24 end node is restrained or joins another member (the steel beams
    lie 0.2 m lower), so there are no supports. The load groups are 15 LOAD_CASE, 6 LOAD_GROUP
    and 7 LOAD_COMBINATION (SOURCES.md calls all 28 LOAD_CASE). D: Eigengewicht (by name),
    old-STAEND2 and STAEND1 (ActionType PERMANENT_G), Linienlast Rechteck and EG (from those two
    groups); ignored: T-Verlauf, T-gleichmässig, T-Kombination (by name); the other 13 are
    VARIABLE_Q groups and their cases, which do not say which variable load they hold."""
    summary, members = read_real(real_models, "little_steel_frame-3D--Axis-Struc.ifc")
    assert len(members) == 17
    assert (summary.curve_members, summary.linked_by_relation, summary.supports) == (176, 17, 0)
    assert (summary.temperature_actions, summary.actions_without_values, summary.load_combinations) == (102, 34, 7)
    assert summary.groups_by_type == {"D": 5, "ignored": 3, "unmapped": 13}
    assert "FL" in summary.unmapped_groups
    for analysis in summary.by_member.values():
        assert analysis.length == pytest.approx(7.4 * IN_PER_M, rel=1e-9)
        assert analysis.loads == []
        assert analysis.problems == [
            "load group 'FL' has no load type (set ActionSource, or map its name in the rules) (2 times)"
        ]


def test_little_steel_frame_fl_loads_when_the_project_maps_fl(real_models):
    """As above with FL mapped to L by a project rule: 2 uniform loads per beam over each half
    (0 to 3.7 m, 3.7 to 7.4 m = 145.67 in, 291.34 in). 0.75 kN/m = 4.2826 lbf/in, 1.5 kN/m = 8.5652 lbf/in."""
    rules = {**RULES, "load_groups": {"names": {"L": ["^fl$"]}}}
    summary, _ = read_real(real_models, "little_steel_frame-3D--Axis-Struc.ifc", rules=rules)
    values = []
    for analysis in summary.by_member.values():
        loads = sorted(analysis.loads, key=lambda load: load.a)
        assert [(load.load_type, load.kind) for load in loads] == [("L", "uniform")] * 2
        assert [(load.a, load.b) for load in loads] == [
            (pytest.approx(0.0, abs=1e-6), pytest.approx(3.7 * IN_PER_M, rel=1e-9)),
            (pytest.approx(3.7 * IN_PER_M, rel=1e-9), pytest.approx(7.4 * IN_PER_M, rel=1e-9)),
        ]
        assert loads[0].value == pytest.approx(loads[1].value, rel=1e-12)
        values.append(round(loads[0].value / LBF_PER_IN_PER_KN_PER_M, 9))
        assert analysis.problems == []
    assert sorted(values) == [0.75] * 2 + [1.5] * 15


def test_simple_beam_and_structural_curve_member_have_no_physical_members(real_models):
    """SOURCES.md 10 and 8: no physical elements, so nothing is linked. simple_beam: 8 load groups
    of which 2 LOAD_COMBINATION; Dead (DEAD_LOAD_G) and Live (LIVE_LOAD_Q) are each a load group and
    a load case; '~LLRF' (NOTDEFINED) is both too. structural-curve-member: 3 curve members, 1 load
    case (NOTDEFINED, no name that maps)."""
    beam, members = read_real(real_models, "simple_beam.ifc")
    assert members == {} and beam.by_member == {}
    assert (beam.curve_members, beam.load_combinations, beam.groups_by_type) == (1, 2, {"D": 2, "L": 2, "unmapped": 2})
    frame, _ = read_real(real_models, "structural-curve-member.ifc")
    assert (frame.by_member, frame.curve_members, frame.unmapped_groups) == ({}, 3, ["Structural Load Case #1"])


def add_axis_beam(model, start, end):
    """An IfcBeam with an 'Axis' polyline, added in memory (the file on disk is not changed)."""
    context = model.by_type("IfcGeometricRepresentationContext")[0]
    line = model.create_entity(
        "IfcPolyline", Points=[model.create_entity("IfcCartesianPoint", Coordinates=p) for p in (start, end)]
    )
    axis = model.create_entity(
        "IfcShapeRepresentation",
        ContextOfItems=context,
        RepresentationIdentifier="Axis",
        RepresentationType="Curve3D",
        Items=[line],
    )
    return model.create_entity(
        "IfcBeam",
        GlobalId=ifcopenshell.guid.new(),
        Name="added",
        Representation=model.create_entity("IfcProductDefinitionShape", Representations=[axis]),
    )


def test_structural_curve_member_load_configuration_with_an_added_beam(real_models):
    """SOURCES.md 8: inch, pound-force, lbf/in; one IfcStructuralLoadConfiguration of -100 at
    locations 96 and 192 (half the beam). The beam's curve member runs (0, 0, 120) to (192, 0, 120)
    and joins the two column members at its ends (read from the file). A beam added on that line is
    linked by end points; its load is 100 lbf/in from 96 to 192 in (the file's pound-force is
    4.44822162 N, hence 1e-6)."""
    model = ifcopenshell.open(real_models / "structural-curve-member.ifc")
    beam = add_axis_beam(model, (0.0, 0.0, 120.0), (192.0, 0.0, 120.0))
    rules = {**RULES, "load_groups": {"names": {"D": ["^structural load case"]}}}
    summary = read_structural(model, {beam.GlobalId: beam}, model_units(model).to_core, rules)
    analysis = summary.by_member[beam.GlobalId]
    assert summary.linked_by_geometry == 1
    assert [(s.x, s.kind) for s in analysis.supports] == [
        (pytest.approx(0.0, abs=1e-9), "pinned"),
        (pytest.approx(192.0, rel=1e-9), "pinned"),
    ]
    (load,) = analysis.loads
    assert (load.kind, load.a, load.b) == ("uniform", pytest.approx(96.0, rel=1e-9), pytest.approx(192.0, rel=1e-9))
    assert load.value == pytest.approx(100.0, rel=1e-6)


def test_simple_beam_fixed_ends_and_dead_point_load_with_an_added_beam(real_models):
    """SOURCES.md 10: mm and N; 2 point connections, both fixed; 1 point load of -20000 N in group
    Dead (DEAD_LOAD_G). Read from the file: the curve member runs (0, 4000, 4000) to
    (4000, 4000, 4000) mm and the load acts at x = 2000 mm. Hand calculation: 4000 mm = 157.48031 in,
    2000 mm = 78.740157 in, 20 kN = 4496.1789 lbf."""
    model = ifcopenshell.open(real_models / "simple_beam.ifc")
    beam = add_axis_beam(model, (0.0, 4000.0, 4000.0), (4000.0, 4000.0, 4000.0))
    analysis = read_structural(model, {beam.GlobalId: beam}, model_units(model).to_core, RULES).by_member[beam.GlobalId]
    assert [(s.x, s.kind) for s in analysis.supports] == [
        (pytest.approx(0.0, abs=1e-9), "fixed"),
        (pytest.approx(4000 / 25.4, rel=1e-9), "fixed"),
    ]
    (load,) = analysis.loads
    assert (load.load_type, load.kind, load.a) == ("D", "point", pytest.approx(2000 / 25.4, rel=1e-9))
    assert load.value == pytest.approx(20 * LBF_PER_KN, rel=1e-9)
