"""The IFC reader on the third-party models of ../shared/real_models (skipped when that folder is absent).

Source of every count and fact asserted here: ../shared/real_models/SOURCES.md, the measured facts
about those files (ifcopenshell 0.9.0.post1). Counts are exact (tolerance 0); lengths are asserted
within the stated tolerance. The files are read where they are, never copied.
"""

from __future__ import annotations

import math
from collections import Counter

import pytest

from ifccheck.ifc import open_model, read_model
from ifccheck.rules import load_rules

RULES = load_rules()
MM = 1 / 25.4  # inches per millimetre (1 in = 25.4 mm exactly)


@pytest.fixture
def read(real_models_dir):
    """Open and read one file of the folder by name."""

    def _read(name, edit=None):
        model = open_model(real_models_dir / name)
        if edit is not None:
            edit(model)
        return read_model(model, RULES), model

    return _read


def categories(result) -> Counter:
    return Counter(s.category for s in result.skipped)


def sizes_mm(result) -> Counter:
    return Counter((round(m.section.width / MM), round(m.section.depth / MM)) for m in result.members)


def test_every_file_reads_without_an_unreadable_member(real_models_dir):
    """All 10 files open; no element's data breaks the reader."""
    paths = sorted(real_models_dir.glob("*.ifc"))
    assert len(paths) == 10
    for path in paths:
        result = read_model(open_model(path), RULES)
        problems = [p for m in result.members for p in m.problems if "cannot be read" in p]
        assert problems == [], path.name


def test_roof_truss_nine_c24_beams(read):
    """SOURCES.md 1: 9 IfcBeam, IfcMaterial C24 on each, IfcRectangleProfileDef 120x300, 120x250, 120x140; metres."""
    result, _ = read("roof_truss--Axis-Struc.ifc")
    assert (result.schema, result.units.length_name, result.units.system) == ("IFC2X3", "metre", "metric")
    assert len(result.members) == 9 and result.skipped == []
    assert {m.material.name for m in result.members} == {"C24"}
    assert {m.material.kind for m in result.members} == {"timber"}
    assert set(sizes_mm(result)) == {(120, 300), (120, 250), (120, 140)}
    assert all(m.section.source == "extrusion" for m in result.members)


def test_little_steel_frame_17_c24_beams_and_42_steel(read):
    """SOURCES.md 2: 59 IfcBeam: 42 'S 235' (skipped) and 17 'C24' with IfcRectangleProfileDef 100x160."""
    result, _ = read("little_steel_frame-3D--Axis-Struc.ifc")
    assert categories(result) == {"non_timber": 42}
    assert all(s.reason == "non-timber material 'S 235' (steel)" for s in result.skipped)
    assert len(result.members) == 17
    assert sizes_mm(result) == {(100, 160): 17}
    # SOURCES.md 2: units are m and kN, so 1 kN/m = 5.710147 lbf/in (1000 N / 4.4482216152605 N/lbf / 39.370079 in)
    assert result.units.to_core["linear_force"] == pytest.approx(5.710147, rel=1e-6)


def test_fzk_house_46_candidates_with_unidentified_material(read):
    """SOURCES.md 3: 4 IfcBeam + 42 IfcMember, material 'Solid' (45) or 'Radial Gradient Fill 1515460218' (1);
    only Unterzug-1 is an extruded rectangle, 0.20 x 0.24 m, BaseQuantities Length 4.08 m."""
    result, _ = read("AC20-FZK-Haus.ifc")
    assert len(result.members) == 46 and result.skipped == []
    unidentified = Counter(p for m in result.members for p in m.problems if p.startswith("material not identified"))
    assert unidentified == {
        "material not identified (name 'Solid')": 45,
        "material not identified (name 'Radial Gradient Fill 1515460218')": 1,
    }
    with_section = [m for m in result.members if m.section is not None]
    assert [m.name for m in with_section] == ["Unterzug-1"]
    girder = with_section[0]
    assert (girder.section.width / MM, girder.section.depth / MM) == (pytest.approx(200.0, abs=0.01), pytest.approx(240.0, abs=0.01))
    assert girder.span == pytest.approx(4.08 / 0.0254, abs=0.005 / 0.0254)  # within 5 mm of 4.08 m


def test_rotated_studs_125_softwood_members_from_the_type(read):
    """SOURCES.md 4: 19 IfcBeam + 406 IfcMember; 207 studs, 45 + 45 plates, 3 steel beams; the
    material is an IfcMaterialProfileSet 'Softwood' on the types only; units mm; some bodies swap
    XDim/YDim (198 x 48)."""
    result, _ = read("539--rotated-studs--augmented.ifc")
    assert result.units.to_core["length"] == pytest.approx(MM, rel=1e-12)
    assert Counter(s.reason for s in result.skipped) == {
        "IfcMember of type STUD is not a bending member": 207,
        "IfcMember of type PLATE is not a bending member": 90,
        "non-timber material 'Steel' (steel)": 3,
    }
    assert len(result.members) == 19 + 406 - 300
    assert {(m.material.name, m.material.category, m.material.source) for m in result.members} == {
        ("Softwood", "Softwood", "type")
    }
    assert all(m.section is not None and m.section.source == "profile set" for m in result.members)
    lintels = [m for m in result.members if m.name == "Drager"]  # profile 198 x 48 (XDim x YDim), standing
    assert len(lintels) == 16
    assert {(round(m.section.width / MM), round(m.section.depth / MM)) for m in lintels} == {(48, 198)}


def test_rotated_studs_are_steep_and_excluded_by_slope_too(read):
    """The 207 studs of SOURCES.md 4 also fall to the slope rule once their type says nothing."""

    def untyped_studs(model):
        for member_type in model.by_type("IfcMemberType"):
            if member_type.PredefinedType == "STUD":
                member_type.PredefinedType = "USERDEFINED"

    result, _ = read("539--rotated-studs--augmented.ifc", untyped_studs)
    steep = [s for s in result.skipped if s.reason == "axis 90.0° from horizontal, steeper than 60°"]
    assert len(steep) == 207
    assert {s.name for s in steep} == {"Stendere"}


def test_single_mesh_timber_beam_has_no_section(read):
    """SOURCES.md 5: 1 IfcBeam 'TIMBER', IfcMaterial 'TIMBER', IfcFacetedBrep body only (no profile)."""
    result, _ = read("395--beam--segfault--1--augmented.ifc")
    member = result.members[0]
    assert len(result.members) == 1 and member.material.kind == "timber"
    assert member.section is None
    assert "no rectangular section found (profile none: body IfcFacetedBrep, no Width/Depth quantities)" in member.problems


def test_carwash_formwork_is_not_load_bearing(read):
    """SOURCES.md 6: 1949 IfcBeam and 228 IfcMember, LoadBearing=False on all 2177; the 324
    'TIMBER/HOUT' beams are formwork, so none is a candidate."""
    result, _ = read("ISSUE_021_Mini_Project.ifc")
    assert result.members == []
    assert categories(result) == {"not_load_bearing": 2177}
    assert Counter(s.ifc_class for s in result.skipped) == {"IfcBeam": 1949, "IfcMember": 228}


def test_example_steel_beams_carry_a_span_equal_to_their_axis(read):
    """SOURCES.md 7: 43 steel IfcBeam with Pset_BeamCommon.Span in mm, equal to the Axis polyline's
    length on all 43. The material is renamed in memory so the beams become candidates."""

    def as_timber(model):
        for material in model.by_type("IfcMaterial"):
            material.Name = "Softwood"

    plain, _ = read("example.ifc")
    assert categories(plain) == {"non_timber": 43}
    result, model = read("example.ifc", as_timber)
    assert len(result.members) == 43
    for member in result.members:
        assert (member.span_source, member.span_is_clear) == ("Pset_BeamCommon.Span", True)
        beam = model.by_guid(member.global_id)
        axis = next(r for r in beam.Representation.Representations if r.RepresentationIdentifier == "Axis")
        points = [p.Coordinates for p in axis.Items[0].Points]
        axis_mm = sum(math.dist(a, b) for a, b in zip(points, points[1:]))
        assert member.span == pytest.approx(axis_mm * MM, abs=1.0 * MM)  # within 1 mm


def test_parametric_steel_beams_are_skipped(read):
    """SOURCES.md 9: 18 IfcBeam, IfcMaterialProfileSetUsage S275J2 (Category Steel); IFC4X3_ADD2."""
    result, _ = read("beam-parametric-cross-section.ifc")
    assert result.schema == "IFC4X3_ADD2"
    assert categories(result) == {"non_timber": 18}
    assert {s.reason for s in result.skipped} == {"non-timber material 'S275J2' (steel)"}


def test_structural_models_without_physical_members(read):
    """SOURCES.md 8 and 10: no IfcBeam or IfcMember; inch/lbf units in 8, mm and Mg (MassDensity
    2.5E-09 Mg/mm3 = 2500 kg/m3) in 10."""
    curve, _ = read("structural-curve-member.ifc")
    assert (curve.members, curve.skipped) == ([], [])
    assert (curve.units.system, curve.units.length_name) == ("imperial", "inch")
    assert curve.units.to_core["length"] == pytest.approx(1.0, rel=1e-12)
    assert curve.units.to_core["force"] == pytest.approx(1.0, rel=1e-6)
    simple, _ = read("simple_beam.ifc")
    assert (simple.members, simple.skipped) == ([], [])
    # 2500 kg/m3 = 2500 / 0.45359237 lb / (1 / 0.0254)^3 in3 = 0.0903182 lb/in3
    density = 2.5e-9 * simple.units.to_core["mass_density"]
    assert density == pytest.approx(2500 * 0.0254**3 / 0.45359237, rel=1e-9)
