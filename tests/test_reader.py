"""The IFC reader on tiny models built in memory with ifcopenshell.api (IFC4 and IFC2X3, mm and feet).

Expected values are hand conversions from the exact unit definitions: 1 in = 25.4 mm and
1 ft = 12 in (international yard and pound, 1959), 1 lbf = 0.45359237 kg x 9.80665 m/s2 =
4.4482216152605 N (standard gravity, 3rd CGPM 1901). Hence 1 lbf/ft = 1/12 lbf/in = 0.083333 lbf/in
and 1 kN/m = 1000 / 4.4482216152605 lbf / (1000 / 25.4 in) = 5.710147 lbf/in. Material words and
strength-class names are common practice (EN 338 names C24, EN 206 names C25/30).
"""

from __future__ import annotations

import math

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.material
import ifcopenshell.api.project
import ifcopenshell.api.pset
import ifcopenshell.api.root
import ifcopenshell.api.spatial
import ifcopenshell.api.type
import ifcopenshell.api.unit
import ifcopenshell.guid
import pytest

from ifccheck.errors import ModelReadError
from ifccheck.ifc import open_model, read_model
from ifccheck.ifc.materials import classify_texts
from ifccheck.model import INPUT_PSET, MemberRecord, SkippedElement
from ifccheck.rules import load_rules

FOOT_M = 0.3048
INCH_M = 0.0254
LBF_N = 4.4482216152605
LBF_PER_IN_PER_KN_PER_M = 1000.0 / LBF_N * INCH_M  # 5.710147 lbf/in in 1 kN/m
REL = 1e-9  # tolerance of exact conversions (double precision)

RULES = load_rules()


def conversion_unit(model, unit_type, name, exponents, factor, si_name, prefix=None):
    si_unit = model.create_entity("IfcSIUnit", UnitType=unit_type, Name=si_name, Prefix=prefix)
    return model.create_entity(
        "IfcConversionBasedUnit",
        Dimensions=model.create_entity("IfcDimensionalExponents", *exponents),
        UnitType=unit_type,
        Name=name,
        ConversionFactor=model.create_entity(
            "IfcMeasureWithUnit", ValueComponent=model.create_entity("IfcReal", factor), UnitComponent=si_unit
        ),
    )


def assign_units(model, system: str) -> None:
    """mm, kN, kN/m, kN/m2, degC ("mm"); foot, lbf, lbf/ft, lbf/ft2, degF ("ft"); metre only ("m")."""
    add_si = ifcopenshell.api.unit.add_si_unit
    derived = ifcopenshell.api.unit.add_derived_unit
    if system == "m":
        units = [add_si(model, "LENGTHUNIT")]
    elif system == "mm":
        metre, kilonewton = add_si(model, "LENGTHUNIT"), add_si(model, "FORCEUNIT", "KILO")
        units = [
            add_si(model, "LENGTHUNIT", "MILLI"),
            kilonewton,
            derived(model, "LINEARFORCEUNIT", None, {kilonewton: 1, metre: -1}),
            derived(model, "PLANARFORCEUNIT", None, {kilonewton: 1, metre: -2}),
            model.create_entity("IfcSIUnit", UnitType="THERMODYNAMICTEMPERATUREUNIT", Name="DEGREE_CELSIUS"),
        ]
    else:
        foot = conversion_unit(model, "LENGTHUNIT", "foot", (1, 0, 0, 0, 0, 0, 0), FOOT_M, "METRE")
        lbf = conversion_unit(model, "FORCEUNIT", "pound-force", (1, 1, -2, 0, 0, 0, 0), LBF_N, "NEWTON")
        units = [
            foot,
            lbf,
            derived(model, "LINEARFORCEUNIT", None, {lbf: 1, foot: -1}),
            derived(model, "PLANARFORCEUNIT", None, {lbf: 1, foot: -2}),
            ifcopenshell.api.unit.add_conversion_based_unit(model, "fahrenheit"),
        ]
    ifcopenshell.api.unit.assign_unit(model, units=units)


class TinyModel:
    """A project with one storey; members are placed by their start point and direction (inches)."""

    def __init__(self, schema="IFC4", units="mm"):
        self.model = ifcopenshell.api.project.create_file(version=schema)
        self.ifc2x3 = schema == "IFC2X3"
        if self.ifc2x3:  # IFC2X3 needs an owner history: the api takes the file's first user and application
            organisation = self.model.create_entity("IfcOrganization", Name="Test")
            person = self.model.create_entity("IfcPerson", FamilyName="Tester")
            self.model.create_entity("IfcPersonAndOrganization", ThePerson=person, TheOrganization=organisation)
            self.model.create_entity("IfcApplication", ApplicationDeveloper=organisation, Version="1",
                                     ApplicationFullName="test", ApplicationIdentifier="test")
        project = ifcopenshell.api.root.create_entity(self.model, "IfcProject", name="Tiny")
        assign_units(self.model, units)
        self.per_inch = {"mm": 25.4, "ft": 1 / 12, "m": INCH_M}[units]
        root = ifcopenshell.api.context.add_context(self.model, context_type="Model")
        self.body = ifcopenshell.api.context.add_context(self.model, "Model", "Body", "MODEL_VIEW", parent=root)
        self.axis = ifcopenshell.api.context.add_context(self.model, "Model", "Axis", "GRAPH_VIEW", parent=root)
        building = ifcopenshell.api.root.create_entity(self.model, "IfcBuilding", name="B")
        ifcopenshell.api.aggregate.assign_object(self.model, products=[building], relating_object=project)
        self.storey = ifcopenshell.api.root.create_entity(self.model, "IfcBuildingStorey", name="Level 2")
        ifcopenshell.api.aggregate.assign_object(self.model, products=[self.storey], relating_object=building)

    def length(self, inches):
        return float(inches) * self.per_inch

    def rectangle(self, b_in, d_in, rotated=False, name="rect"):
        """A b x d rectangle; ``rotated`` turns it 90° in its own plane so XDim = d lies along local y."""
        position = self.model.create_entity(
            "IfcAxis2Placement2D",
            Location=self.model.create_entity("IfcCartesianPoint", (0.0, 0.0)),
            RefDirection=self.model.create_entity("IfcDirection", (0.0, 1.0)) if rotated else None,
        )
        x_dim, y_dim = (d_in, b_in) if rotated else (b_in, d_in)
        return self.model.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName=name, Position=position,
            XDim=self.length(x_dim), YDim=self.length(y_dim),
        )

    def member(self, name, profile, length_in, ifc_class="IfcBeam", predefined="JOIST", direction=(1.0, 0.0, 0.0),
               local_x=None, axis=False, storey=True):
        """An element extruded along its local z = ``direction``; local x horizontal unless given."""
        kwargs = {} if self.ifc2x3 and ifc_class == "IfcBeam" else {"predefined_type": predefined}
        element = ifcopenshell.api.root.create_entity(self.model, ifc_class, name=name, **kwargs)
        if storey:
            ifcopenshell.api.spatial.assign_container(self.model, products=[element], relating_structure=self.storey)
        z = _unit(direction)
        x = local_x or (_unit((-z[1], z[0], 0.0)) if abs(z[2]) < 0.999 else (1.0, 0.0, 0.0))
        element.ObjectPlacement = self.model.create_entity(
            "IfcLocalPlacement",
            RelativePlacement=self.model.create_entity(
                "IfcAxis2Placement3D",
                Location=self.model.create_entity("IfcCartesianPoint", (0.0, 0.0, 0.0)),
                Axis=self.model.create_entity("IfcDirection", z),
                RefDirection=self.model.create_entity("IfcDirection", x),
            ),
        )
        solid = self.model.create_entity(
            "IfcExtrudedAreaSolid", SweptArea=profile,
            Position=self.model.create_entity(
                "IfcAxis2Placement3D", Location=self.model.create_entity("IfcCartesianPoint", (0.0, 0.0, 0.0))
            ),
            ExtrudedDirection=self.model.create_entity("IfcDirection", (0.0, 0.0, 1.0)), Depth=self.length(length_in),
        )
        representations = [self.model.create_entity("IfcShapeRepresentation", self.body, "Body", "SweptSolid", [solid])]
        if axis:
            line = self.model.create_entity("IfcPolyline", [
                self.model.create_entity("IfcCartesianPoint", (0.0, 0.0, 0.0)),
                self.model.create_entity("IfcCartesianPoint", (0.0, 0.0, self.length(length_in))),
            ])
            representations.append(self.model.create_entity("IfcShapeRepresentation", self.axis, "Axis", "Curve3D", [line]))
        element.Representation = self.model.create_entity("IfcProductDefinitionShape", Representations=representations)
        return element

    def material(self, product, name, category=None):
        material = ifcopenshell.api.material.add_material(self.model, name=name, category=category)
        ifcopenshell.api.material.assign_material(self.model, products=[product], material=material)
        return material

    def element_type(self, ifc_class, predefined, name="T"):
        element_type = ifcopenshell.api.root.create_entity(self.model, ifc_class, predefined_type=predefined, name=name)
        return element_type

    def assign_type(self, elements, element_type):
        ifcopenshell.api.type.assign_type(self.model, related_objects=list(elements), relating_type=element_type)

    def pset(self, product, name, values: dict):
        """A property set of single values; ``values`` maps names to (IFC measure type, value)."""
        pset = ifcopenshell.api.pset.add_pset(self.model, product=product, name=name)
        properties = {key: self.model.create_entity(measure, value) for key, (measure, value) in values.items()}
        ifcopenshell.api.pset.edit_pset(self.model, pset=pset, properties=properties)
        return pset

    def read(self):
        return read_model(self.model, RULES)


def _unit(vector):
    length = math.sqrt(sum(c * c for c in vector))
    return tuple(c / length for c in vector)


def only_member(result) -> MemberRecord:
    assert len(result.members) == 1, result
    return result.members[0]


def only_skipped(result) -> SkippedElement:
    assert len(result.skipped) == 1 and not result.members, result
    return result.skipped[0]


# --- section, span, storey and units ---------------------------------------------------------


def test_mm_beam_along_x_gives_section_span_storey_in_inches():
    tiny = TinyModel("IFC4", "mm")
    beam = tiny.member("B1", tiny.rectangle(1.5, 9.25, name="2x10"), 144.0)
    tiny.material(beam, "DF-L No.2", "Wood")
    read = tiny.read()
    member = only_member(read)
    assert read.units.system == "metric" and read.units.length_name == "millimetre"
    assert read.units.to_core["length"] == pytest.approx(1 / 25.4, rel=REL)  # 1 mm = 1/25.4 in
    assert member.section.width == pytest.approx(1.5, rel=REL)
    assert member.section.depth == pytest.approx(9.25, rel=REL)
    assert (member.section.source, member.section.profile_name) == ("extrusion", "2x10")
    assert member.span == pytest.approx(144.0, rel=REL)
    assert (member.span_source, member.span_is_clear, member.slope) == ("extrusion", False, 0.0)
    assert member.storey == "Level 2"
    assert member.material.kind == "timber" and member.material.source == "occurrence"
    assert "section 38.1x234.95 mm from extrusion ('2x10')" in member.notes
    assert "span 3.66 m from extrusion" in member.notes  # 144 in x 0.0254 = 3.6576 m
    assert member.problems == []


def test_profile_turned_so_xdim_is_vertical_gives_xdim_as_depth():
    """The profile's own Position turns it 90°; a second joist is turned by its placement instead."""
    tiny = TinyModel("IFC4", "mm")
    by_profile = tiny.member("J1", tiny.rectangle(1.5, 9.25, rotated=True), 144.0)
    by_placement_profile = tiny.rectangle(9.25, 1.5)  # XDim = 9.25 in, laid along local x ...
    by_placement = tiny.member("J2", by_placement_profile, 144.0, local_x=(0.0, 0.0, 1.0))  # ... which points up
    for joist in (by_profile, by_placement):
        tiny.material(joist, "Softwood")
    sections = {m.name: m.section for m in tiny.read().members}
    for name in ("J1", "J2"):
        assert sections[name].depth == pytest.approx(9.25, rel=REL)
        assert sections[name].width == pytest.approx(1.5, rel=REL)


def test_material_and_profile_set_on_the_type_only_with_two_plies():
    tiny = TinyModel("IFC4", "mm")
    beam_type = tiny.element_type("IfcBeamType", "BEAM", "2-ply 2x12")
    softwood = ifcopenshell.api.material.add_material(tiny.model, name="Sawn softwood", category="Wood")
    profile_set = ifcopenshell.api.material.add_material_set(tiny.model, name="2-ply", set_type="IfcMaterialProfileSet")
    for offset in (-0.75, 0.75):  # two 1.5 x 11.25 plies side by side (centres 1.5 in apart across the width)
        ply = tiny.rectangle(1.5, 11.25, name="2x12")
        ply.Position.Location.Coordinates = (tiny.length(offset), 0.0)
        ifcopenshell.api.material.add_profile(tiny.model, profile_set, material=softwood, profile=ply)
    ifcopenshell.api.material.assign_material(tiny.model, products=[beam_type], type="IfcMaterialProfileSet",
                                              material=profile_set)
    beam = tiny.member("FB1", tiny.rectangle(3.0, 11.25), 120.0, predefined="NOTDEFINED")
    tiny.assign_type([beam], beam_type)
    ifcopenshell.api.material.unassign_material(tiny.model, products=[beam])  # the usage the api added
    member = only_member(tiny.read())
    assert member.predefined_type == "BEAM"  # NOTDEFINED on the occurrence: the type's applies
    assert (member.material.name, member.material.source, member.material.kind) == ("Sawn softwood", "type", "timber")
    assert member.section.plies == 2 and member.section.source == "profile set"
    assert member.section.width == pytest.approx(3.0, rel=REL)  # total of the plies
    assert member.section.ply_width == pytest.approx(1.5, rel=REL)
    assert member.section.depth == pytest.approx(11.25, rel=REL)


def test_ifc2x3_beam_takes_its_type_and_a_strength_class_material():
    tiny = TinyModel("IFC2X3", "m")
    beam_type = tiny.element_type("IfcBeamType", "JOIST")
    beam = tiny.member("J1", tiny.rectangle(1.5, 7.25), 120.0, axis=True)
    tiny.assign_type([beam], beam_type)
    tiny.material(beam, "C24")
    tiny.pset(beam, INPUT_PSET, {"DeadLoad": ("IfcLinearForceMeasure", 146.0)})  # N/m: the SI default
    read = tiny.read()
    member = only_member(read)
    assert read.schema == "IFC2X3"
    assert member.predefined_type == "JOIST"
    assert member.material.kind == "timber" and member.material.matched == r"^[CDT]\d{2}$"
    assert (member.span_source, member.span) == ("axis", pytest.approx(120.0, rel=REL))
    # no force unit assigned: N/m; 146 N/m = 146 / 4.4482216152605 lbf / (1 / 0.0254 in) = 0.833661 lbf/in
    assert member.inputs["DeadLoad"] == pytest.approx(146.0 / LBF_N * INCH_M, rel=REL)


def test_pset_span_on_the_type_is_a_clear_span_in_model_units():
    tiny = TinyModel("IFC4", "ft")
    beam_type = tiny.element_type("IfcBeamType", "JOIST")
    tiny.pset(beam_type, "Pset_BeamCommon", {"Span": ("IfcPositiveLengthMeasure", 12.5), "LoadBearing": ("IfcBoolean", True)})
    beam = tiny.member("J1", tiny.rectangle(1.5, 9.25), 153.0, axis=True)
    tiny.assign_type([beam], beam_type)
    tiny.material(beam, "Hem-Fir No.2")
    member = only_member(tiny.read())
    assert member.span == pytest.approx(150.0, rel=REL)  # 12.5 ft x 12 in/ft
    assert (member.span_source, member.span_is_clear) == ("Pset_BeamCommon.Span", True)
    assert "span 12.50 ft from Pset_BeamCommon.Span on the type" in member.notes


def test_axis_as_indexed_poly_curve_and_as_trimmed_line():
    """Axis lengths in mm: a two-segment indexed curve 1000 + 2000 mm and a line trimmed at
    parameters 0 and 1500 with a 2 mm vector magnitude, i.e. 3000 mm; both level."""
    tiny = TinyModel("IFC4", "mm")
    create = tiny.model.create_entity
    indexed = tiny.member("B1", tiny.rectangle(1.5, 9.25), 10.0)
    trimmed = tiny.member("B2", tiny.rectangle(1.5, 9.25), 10.0)
    curves = {
        "B1": create("IfcIndexedPolyCurve", Points=create("IfcCartesianPointList3D", ((0.0, 0.0, 0.0), (0.0, 0.0, 1000.0), (0.0, 0.0, 3000.0))),
                     Segments=[create("IfcLineIndex", (1, 2)), create("IfcLineIndex", (2, 3))]),
        "B2": create("IfcTrimmedCurve",
                     BasisCurve=create("IfcLine", create("IfcCartesianPoint", (0.0, 0.0, 0.0)),
                                       create("IfcVector", create("IfcDirection", (0.0, 0.0, 1.0)), 2.0)),
                     Trim1=[create("IfcParameterValue", 0.0)], Trim2=[create("IfcParameterValue", 1500.0)],
                     SenseAgreement=True, MasterRepresentation="PARAMETER"),
    }
    for element in (indexed, trimmed):
        tiny.material(element, "Softwood")
        axis = create("IfcShapeRepresentation", tiny.axis, "Axis", "Curve3D", [curves[element.Name]])
        element.Representation.Representations = (*element.Representation.Representations, axis)
    for member in tiny.read().members:
        assert member.span_source == "axis"
        assert member.span == pytest.approx(3000.0 / 25.4, rel=REL)
        assert member.slope == 0.0


def test_base_quantities_give_the_section_when_the_body_is_no_extrusion():
    tiny = TinyModel("IFC4", "mm")
    beam = tiny.member("B1", tiny.rectangle(1.5, 9.25), 120.0, axis=True)
    beam.Representation.Representations[0].Items[0].SweptArea = tiny.model.create_entity(
        "IfcCircleProfileDef", ProfileType="AREA", Radius=10.0
    )
    tiny.material(beam, "Softwood")
    assert "no rectangular section found (profile IfcCircleProfileDef)" in only_member(tiny.read()).problems
    beam.Representation.Representations = beam.Representation.Representations[1:]  # keep the axis only
    quantities = ifcopenshell.api.pset.add_qto(tiny.model, product=beam, name="Qto_BeamBaseQuantities")
    ifcopenshell.api.pset.edit_qto(tiny.model, qto=quantities, properties={"Width": 89.0, "Depth": 235.0})
    member = only_member(tiny.read())
    assert member.section.source == "base quantities"
    assert (member.section.width, member.section.depth) == (pytest.approx(89 / 25.4, rel=REL), pytest.approx(235 / 25.4, rel=REL))
    assert member.span_source == "axis"


def test_zero_profile_size_is_a_problem_and_no_section():
    tiny = TinyModel("IFC4", "mm")
    beam = tiny.member("B1", tiny.rectangle(0.0, 9.25), 120.0)
    tiny.material(beam, "Softwood")
    member = only_member(tiny.read())
    assert member.section is None
    assert any(p.startswith("section dimensions not positive (XDim=0.0") for p in member.problems)


def test_storey_through_an_element_assembly():
    tiny = TinyModel("IFC4", "mm")
    truss = ifcopenshell.api.root.create_entity(tiny.model, "IfcElementAssembly", name="Truss")
    ifcopenshell.api.spatial.assign_container(tiny.model, products=[truss], relating_structure=tiny.storey)
    chord = tiny.member("Chord", tiny.rectangle(1.5, 5.5), 96.0, storey=False)
    ifcopenshell.api.aggregate.assign_object(tiny.model, products=[chord], relating_object=truss)
    tiny.material(chord, "Softwood")
    assert only_member(tiny.read()).storey == "Level 2"


# --- what is left out ---------------------------------------------------------------------------


def test_steel_beam_is_skipped_as_non_timber_naming_its_material():
    tiny = TinyModel("IFC4", "mm")
    tiny.material(tiny.member("S1", tiny.rectangle(4.0, 8.0), 120.0), "Steel S355", "Steel")
    skipped = only_skipped(tiny.read())
    assert skipped.category == "non_timber"
    assert skipped.reason == "non-timber material 'Steel S355' (steel)"


def test_load_bearing_false_on_the_type_skips_the_member():
    tiny = TinyModel("IFC4", "mm")
    formwork_type = tiny.element_type("IfcBeamType", "BEAM")
    tiny.pset(formwork_type, "Pset_BeamCommon", {"LoadBearing": ("IfcBoolean", False)})
    beam = tiny.member("FW1", tiny.rectangle(1.5, 7.25), 96.0)
    tiny.assign_type([beam], formwork_type)
    tiny.material(beam, "Softwood")
    skipped = only_skipped(tiny.read())
    assert skipped.category == "not_load_bearing"
    assert skipped.reason == "LoadBearing is FALSE (Pset_BeamCommon on the type)"


def test_steep_member_is_skipped_and_a_sloped_rafter_spans_its_horizontal_projection():
    tiny = TinyModel("IFC4", "ft")
    rise_75 = (math.cos(math.radians(75)), 0.0, math.sin(math.radians(75)))
    rise_30 = (math.cos(math.radians(30)), 0.0, math.sin(math.radians(30)))
    steep = tiny.member("Brace", tiny.rectangle(1.5, 5.5), 96.0, ifc_class="IfcMember", predefined="MEMBER", direction=rise_75)
    rafter = tiny.member("R1", tiny.rectangle(1.5, 7.25), 144.0, ifc_class="IfcMember", predefined="RAFTER", direction=rise_30)
    stud = tiny.member("S1", tiny.rectangle(1.5, 3.5), 96.0, ifc_class="IfcMember", predefined="STUD", direction=(0, 0, 1))
    for element in (steep, rafter, stud):
        tiny.material(element, "Spruce-Pine-Fir")
    read = tiny.read()
    reasons = {s.name: (s.category, s.reason) for s in read.skipped}
    assert reasons["Brace"] == ("not_bending", "axis 75.0° from horizontal, steeper than 60°")
    assert reasons["S1"] == ("not_bending", "IfcMember of type STUD is not a bending member")
    member = only_member(type(read)(read.schema, read.units, read.members, []))
    assert member.slope == pytest.approx(30.0, rel=1e-9)
    assert member.span == pytest.approx(144.0 * math.cos(math.radians(30)), rel=REL)  # 124.71 in
    assert "span is the horizontal projection of the sloped length (12.00 ft at 30.0°)" in member.notes


def test_unknown_material_stays_a_candidate_with_a_problem_unless_the_input_names_a_species():
    tiny = TinyModel("IFC4", "mm")
    plain = tiny.member("B1", tiny.rectangle(1.5, 9.25), 120.0)
    named = tiny.member("B2", tiny.rectangle(1.5, 9.25), 120.0)
    for element in (plain, named):
        tiny.material(element, "Solid")
    tiny.pset(named, INPUT_PSET, {"Species": ("IfcLabel", "Douglas Fir-Larch")})
    members = {m.name: m for m in tiny.read().members}
    assert members["B1"].material.kind == "unknown"
    assert "material not identified (name 'Solid')" in members["B1"].problems
    assert members["B2"].material.kind == "timber"
    assert members["B2"].material.matched == f"{INPUT_PSET}.Species"
    assert members["B2"].problems == []


# --- the input property set ------------------------------------------------------------------------


def _loaded_joist(units: str, values: dict):
    tiny = TinyModel("IFC4", units)
    beam = tiny.member("J1", tiny.rectangle(1.5, 9.25), 144.0)
    tiny.material(beam, "DF-L No.2")
    tiny.pset(beam, INPUT_PSET, values)
    return only_member(tiny.read())


def test_feet_and_millimetre_models_give_the_same_core_inputs():
    plf_in_kn_per_m = LBF_N / FOOT_M / 1000.0  # 1 lbf/ft = 0.0145939 kN/m
    psf_in_kpa = LBF_N / FOOT_M**2 / 1000.0  # 1 lbf/ft2 = 0.0478803 kPa
    imperial = _loaded_joist("ft", {
        "DeadLoad": ("IfcLinearForceMeasure", 100.0),
        "LiveAreaLoad": ("IfcPlanarForceMeasure", 40.0),
        "TributaryWidth": ("IfcPositiveLengthMeasure", 16.0 / 12.0),
        "ServiceTemperature": ("IfcThermodynamicTemperatureMeasure", 100.0),
    })
    metric = _loaded_joist("mm", {
        "DeadLoad": ("IfcLinearForceMeasure", 100.0 * plf_in_kn_per_m),
        "LiveAreaLoad": ("IfcPlanarForceMeasure", 40.0 * psf_in_kpa),
        "TributaryWidth": ("IfcPositiveLengthMeasure", 16.0 * 25.4),
        "ServiceTemperature": ("IfcThermodynamicTemperatureMeasure", (100.0 - 32.0) / 1.8),  # 37.78 degC
    })
    expected = {"DeadLoad": 100.0 / 12.0, "LiveAreaLoad": 40.0 / 144.0, "TributaryWidth": 16.0, "ServiceTemperature": 100.0}
    for member in (imperial, metric):
        assert member.problems == []
        for name, value in expected.items():
            assert member.inputs[name] == pytest.approx(value, rel=1e-6), name
            assert member.input_sources[name] == "occurrence"


def test_hand_conversion_factors_of_line_loads():
    one_plf = _loaded_joist("ft", {"DeadLoad": ("IfcLinearForceMeasure", 1.0)})
    one_kn_per_m = _loaded_joist("mm", {"DeadLoad": ("IfcLinearForceMeasure", 1.0)})
    assert one_plf.inputs["DeadLoad"] == pytest.approx(0.083333, rel=1e-5)  # 1 lbf/ft = 1/12 lbf/in
    assert one_kn_per_m.inputs["DeadLoad"] == pytest.approx(5.710147, rel=1e-6)  # see the module docstring
    assert one_kn_per_m.inputs["DeadLoad"] == pytest.approx(LBF_PER_IN_PER_KN_PER_M, rel=REL)


def test_nan_load_in_the_file_is_a_problem_naming_the_property(tmp_path):
    """ifcopenshell refuses NaN in memory, so the NaN is written into the file's text."""
    tiny = TinyModel("IFC4", "mm")
    beam = tiny.member("J1", tiny.rectangle(1.5, 9.25), 144.0)
    tiny.material(beam, "Softwood")
    tiny.pset(beam, INPUT_PSET, {"DeadLoad": ("IfcLinearForceMeasure", 123.25), "LiveLoad": ("IfcLinearForceMeasure", 2.0)})
    path = tmp_path / "nan.ifc"
    tiny.model.write(str(path))
    path.write_text(path.read_text().replace("IFCLINEARFORCEMEASURE(123.25)", "IFCLINEARFORCEMEASURE(NaN)"))
    member = only_member(read_model(open_model(path), RULES))
    assert "DeadLoad" not in member.inputs
    assert f"{INPUT_PSET}.DeadLoad on the occurrence is not used: its value is not a number (NaN or unreadable)" in member.problems
    assert member.inputs["LiveLoad"] == pytest.approx(2.0 * LBF_PER_IN_PER_KN_PER_M, rel=REL)


def test_invalid_inputs_are_problems_and_not_stored():
    member = _loaded_joist("mm", {
        "LiveLoad": ("IfcLinearForceMeasure", -1.0),
        "WindLoad": ("IfcLinearForceMeasure", -0.5),  # uplift is allowed
        "SnowLoad": ("IfcLinearForceMeasure", 2e6),  # 2e6 kN/m: beyond any real load
        "TributaryWidth": ("IfcPositiveLengthMeasure", 0.0),
        "LiveDeflectionLimit": ("IfcReal", 0.0),
        "TotalDeflectionLimit": ("IfcLabel", "L/240"),
        "Colour": ("IfcLabel", "red"),
    })
    assert member.inputs == {"WindLoad": pytest.approx(-0.5 * LBF_PER_IN_PER_KN_PER_M, rel=REL)}
    problems = " | ".join(member.problems)
    for name in ("LiveLoad", "SnowLoad", "TributaryWidth", "LiveDeflectionLimit", "TotalDeflectionLimit"):
        assert f"{INPUT_PSET}.{name} on the occurrence is not used" in problems, name
    assert f"{INPUT_PSET}.Colour on the occurrence is not an input property of ifccheck; ignored" in member.notes


def test_occurrence_wins_over_type_per_property_and_property_units_apply():
    tiny = TinyModel("IFC4", "mm")
    joist_type = tiny.element_type("IfcBeamType", "JOIST")
    tiny.pset(joist_type, INPUT_PSET, {"DeadLoad": ("IfcLinearForceMeasure", 1.0), "LiveLoad": ("IfcLinearForceMeasure", 2.0)})
    beam = tiny.member("J1", tiny.rectangle(1.5, 9.25), 144.0)
    tiny.assign_type([beam], joist_type)
    tiny.material(beam, "Softwood")
    own = tiny.pset(beam, INPUT_PSET, {"LiveLoad": ("IfcLinearForceMeasure", 3.0), "BearingLength": ("IfcPositiveLengthMeasure", 3.0)})
    inch = conversion_unit(tiny.model, "LENGTHUNIT", "inch", (1, 0, 0, 0, 0, 0, 0), INCH_M, "METRE")
    next(p for p in own.HasProperties if p.Name == "BearingLength").Unit = inch  # a property-level unit
    member = only_member(tiny.read())
    assert member.inputs["DeadLoad"] == pytest.approx(1.0 * LBF_PER_IN_PER_KN_PER_M, rel=REL)
    assert member.inputs["LiveLoad"] == pytest.approx(3.0 * LBF_PER_IN_PER_KN_PER_M, rel=REL)
    assert member.inputs["BearingLength"] == pytest.approx(3.0, rel=REL)  # 3 in, not 3 mm
    assert member.input_sources == {"DeadLoad": "type", "LiveLoad": "occurrence", "BearingLength": "occurrence"}


def test_plies_input_splits_the_modelled_width():
    member = _loaded_joist("mm", {"Plies": ("IfcInteger", 3)})
    assert member.section.plies == 3
    assert member.section.width == pytest.approx(1.5, rel=REL) and member.section.ply_width == pytest.approx(0.5, rel=REL)


# --- units that are not the length unit ---------------------------------------------------------------


def test_derived_units_absent_from_a_mm_model_are_si():
    read = TinyModel("IFC4", "mm").read()
    # 1 m3 = (1 / 0.0254)^3 in3 = 61023.744 in3, whatever the length unit; 1 m4 = 2402509.6 in4
    assert read.units.to_core["section_modulus"] == pytest.approx(INCH_M**-3, rel=REL)
    assert read.units.to_core["moment_of_inertia"] == pytest.approx(INCH_M**-4, rel=REL)


def test_mass_density_in_kilogram_per_cubic_metre():
    tiny = TinyModel("IFC4", "mm")
    kilogram = ifcopenshell.api.unit.add_si_unit(tiny.model, "MASSUNIT", "KILO")
    metre = ifcopenshell.api.unit.add_si_unit(tiny.model, "LENGTHUNIT")
    density = ifcopenshell.api.unit.add_derived_unit(tiny.model, "MASSDENSITYUNIT", None, {kilogram: 1, metre: -3})
    ifcopenshell.api.unit.assign_unit(tiny.model, units=[density])
    # 1 kg/m3 = (1 / 0.45359237 lb) / (1 / 0.0254 in)^3 = 3.6127292e-5 lb/in3
    assert tiny.read().units.to_core["mass_density"] == pytest.approx(INCH_M**3 / 0.45359237, rel=REL)


def test_imperial_system_from_a_foot_model():
    units = TinyModel("IFC4", "ft").read().units
    assert (units.system, units.length_name) == ("imperial", "foot")
    assert units.to_core["length"] == pytest.approx(12.0, rel=REL)


# --- odd data never stops the reader -----------------------------------------------------------


def test_unsupported_placement_is_a_problem_of_that_member_only():
    tiny = TinyModel("IFC4", "mm")
    odd = tiny.member("Odd", tiny.rectangle(1.5, 9.25), 120.0)
    fine = tiny.member("Fine", tiny.rectangle(1.5, 9.25), 120.0)
    for element in (odd, fine):
        tiny.material(element, "Softwood")
    odd.ObjectPlacement = tiny.model.create_entity("IfcGridPlacement")
    members = {m.name: m for m in tiny.read().members}
    assert any("geometry cannot be read" in p and "IfcGridPlacement" in p for p in members["Odd"].problems)
    assert members["Fine"].problems == []


# --- material words and patterns (common practice) ---------------------------------------------------


@pytest.mark.parametrize(
    "name, kind",
    [
        ("C24", "timber"),  # EN 338 strength class
        ("C25/30", "non_timber"),  # EN 206 concrete class
        ("GL28h", "timber"),  # EN 14080 glulam class
        ("24F-V4", "timber"),  # glulam combination symbol
        ("Brettschichtholz", "timber"),
        ("Nadelholz", "timber"),
        ("TIMBER/HOUT", "timber"),
        ("limtre", "timber"),
        ("Southern Pine", "timber"),
        ("S 235", "non_timber"),
        ("STEEL/S235JR", "non_timber"),
        ("Stahlbeton", "non_timber"),
        ("Metal - Steel - 345 MPa", "non_timber"),
        ("Alpine white", "unknown"),
        ("Solid", "unknown"),
    ],
)
def test_material_words_and_strength_classes(name, kind):
    assert classify_texts([name]).kind == kind


# --- opening files --------------------------------------------------------------------------------


def _written_model(tmp_path):
    tiny = TinyModel("IFC4", "mm")
    tiny.material(tiny.member("B1", tiny.rectangle(1.5, 9.25), 120.0), "Softwood")
    path = tmp_path / "tiny.ifc"
    tiny.model.write(str(path))
    return path


def test_open_model_reads_a_good_file(tmp_path):
    model = open_model(_written_model(tmp_path))
    assert model.schema == "IFC4" and len(model.by_type("IfcBeam")) == 1


@pytest.mark.parametrize(
    "damage, message",
    [
        ("missing", "does not exist"),
        ("empty", "is empty"),
        ("not_ifc", "is not an IFC file"),
        ("truncated", "is truncated"),
        ("old_schema", "uses schema 'IFC2X2_FINAL'"),
    ],
)
def test_open_model_says_what_is_wrong(tmp_path, damage, message):
    path = _written_model(tmp_path)
    text = path.read_text()
    if damage == "missing":
        path = tmp_path / "absent.ifc"
    elif damage == "empty":
        path.write_text("")
    elif damage == "not_ifc":
        path.write_text("name,span\nJ1,12 ft\n")
    elif damage == "truncated":
        path.write_text(text[: len(text) // 2])
    else:
        path.write_text(text.replace("FILE_SCHEMA(('IFC4'))", "FILE_SCHEMA(('IFC2X2_FINAL'))"))
    with pytest.raises(ModelReadError, match=message):
        open_model(path)
