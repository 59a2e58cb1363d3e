"""World bounding boxes of supporting elements (ifccheck.ifc.elements).

Every expected box is a hand calculation shown beside it: the element's placement, the corners of
its profile's bounding rectangle at both ends of the extrusion (or its vertices), converted to
inches by the exact definitions 1 in = 25.4 mm and 1 ft = 12 in. Tolerance 1e-6 in throughout.
"""

from __future__ import annotations

import collections
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.project
import ifcopenshell.api.root
import ifcopenshell.api.spatial
import ifcopenshell.api.unit
import pytest

from ifccheck.ifc.elements import read_element_boxes
from ifccheck.ifc.units import model_units

SAMPLES = Path(__file__).resolve().parents[1] / "sample_models"
REAL_MODELS = Path(__file__).resolve().parents[2] / "shared" / "real_models"
TOL = 1e-6  # in
MM = 1 / 25.4  # in per mm, exact by definition of the inch
FT = 12.0  # in per ft


class TinyModel:
    """An IFC4 model in mm or feet with one storey, built with ifcopenshell.api plus raw geometry."""

    def __init__(self, unit: str) -> None:
        f = self.f = ifcopenshell.api.project.create_file(version="IFC4")
        project = ifcopenshell.api.root.create_entity(f, ifc_class="IfcProject", name="Boxes")
        if unit == "mm":
            ifcopenshell.api.unit.assign_unit(f, length={"is_metric": True, "raw": "MILLIMETERS"})
        else:
            ifcopenshell.api.unit.assign_unit(f, units=[ifcopenshell.api.unit.add_conversion_based_unit(f, name="foot")])
        root = ifcopenshell.api.context.add_context(f, context_type="Model")
        self.body = ifcopenshell.api.context.add_context(
            f, context_type="Model", context_identifier="Body", target_view="MODEL_VIEW", parent=root
        )
        self.box = ifcopenshell.api.context.add_context(
            f, context_type="Model", context_identifier="Box", target_view="MODEL_VIEW", parent=root
        )
        site = ifcopenshell.api.root.create_entity(f, ifc_class="IfcSite", name="Site")
        ifcopenshell.api.aggregate.assign_object(f, products=[site], relating_object=project)
        self.storey = ifcopenshell.api.root.create_entity(f, ifc_class="IfcBuildingStorey", name="Level 1")
        ifcopenshell.api.aggregate.assign_object(f, products=[self.storey], relating_object=site)

    def placement(self, location, axis=None, ref=None, parent=None):
        f = self.f
        position = f.createIfcAxis2Placement3D(
            f.createIfcCartesianPoint([float(c) for c in location]),
            f.createIfcDirection([float(c) for c in axis]) if axis else None,
            f.createIfcDirection([float(c) for c in ref]) if ref else None,
        )
        return f.createIfcLocalPlacement(parent, position)

    def extrusion(self, profile, depth, direction=(0.0, 0.0, 1.0), position=None):
        return self.f.createIfcExtrudedAreaSolid(
            profile, position, self.f.createIfcDirection([float(c) for c in direction]), float(depth)
        )

    def element(self, ifc_class, name, placement, items=(), identifier="Body", contained=True):
        element = ifcopenshell.api.root.create_entity(self.f, ifc_class=ifc_class, name=name)
        if contained:
            ifcopenshell.api.spatial.assign_container(self.f, products=[element], relating_structure=self.storey)
        element.ObjectPlacement = placement  # after the container, so it stays as given
        if items:
            context = self.box if identifier == "Box" else self.body
            representation = self.f.createIfcShapeRepresentation(context, identifier, "SweptSolid", list(items))
            element.Representation = self.f.createIfcProductDefinitionShape(None, None, [representation])
        return element

    def read(self, **kwargs):
        boxes, unreadable = read_element_boxes(self.f, model_units(self.f).to_core["length"], **kwargs)
        return {box.name: box for box in boxes}, unreadable


def assert_box(box, lo, hi):
    assert box.lo == pytest.approx(lo, abs=TOL)
    assert box.hi == pytest.approx(hi, abs=TOL)


@pytest.fixture(scope="module")
def mm_model():
    m = TinyModel("mm")
    f = m.f
    # wall 3000 long, 200 thick, 2700 high: profile x 0..3000, y 0..200 (rectangle centred at
    # (1500, 100)); placement at (1000, 2000, 500) turned by RefDirection (3, 4, 0): cos 0.6, sin 0.8.
    # world x = 1000 + 0.6 x - 0.8 y, y = 2000 + 0.8 x + 0.6 y; corners (0,0) -> (1000, 2000),
    # (3000,0) -> (2800, 4400), (3000,200) -> (2640, 4520), (0,200) -> (840, 2120); z 500..3200
    wall_profile = f.createIfcRectangleProfileDef(
        "AREA", None, f.createIfcAxis2Placement2D(f.createIfcCartesianPoint((1500.0, 100.0)), None), 3000.0, 200.0
    )
    m.element("IfcWall", "W1", m.placement((1000, 2000, 500), ref=(3, 4, 0)), [m.extrusion(wall_profile, 2700)])
    # column: circle r = 150 (no Position), solid Position at z = 100, depth 2800, placed at
    # (5000, 0, 0) relative to a storey placement at z = 3000: x 4850..5150, y -150..150, z 3100..5900
    storey_placement = m.placement((0, 0, 3000))
    circle = f.createIfcCircleProfileDef("AREA", None, None, 150.0)
    solid_position = f.createIfcAxis2Placement3D(f.createIfcCartesianPoint((0.0, 0.0, 100.0)), None, None)
    column_solid = m.extrusion(circle, 2800, position=solid_position)
    m.element("IfcColumn", "C1", m.placement((5000, 0, 0), parent=storey_placement), [column_solid])
    # slab: polyline profile (0,0) (4000,0) (4000,2000) (1500,3000) (0,3000), solid Position at
    # z = -200, depth 200, placed at (100, 200, 3000): x 100..4100, y 200..3200, z 2800..3000
    points = [f.createIfcCartesianPoint(p) for p in ((0.0, 0.0), (4000.0, 0.0), (4000.0, 2000.0), (1500.0, 3000.0), (0.0, 3000.0))]
    outline = f.createIfcArbitraryClosedProfileDef("AREA", None, f.createIfcPolyline([*points, points[0]]))
    slab_position = f.createIfcAxis2Placement3D(f.createIfcCartesianPoint((0.0, 0.0, -200.0)), None, None)
    m.element("IfcSlab", "S1", m.placement((100, 200, 3000)), [m.extrusion(outline, 200, position=slab_position)])
    # oblique extrusion: rectangle 100 x 50 centred at the origin, direction (0, 0.6, 0.8), depth
    # 1000 -> the far end moved by (0, 600, 800): x -50..50, y -25..625, z 0..800
    bar = f.createIfcRectangleProfileDef("AREA", None, None, 100.0, 50.0)
    m.element("IfcMember", "M1", m.placement((0, 0, 0)), [m.extrusion(bar, 1000, direction=(0, 0.6, 0.8))])
    # mapped item: inside the map a 100 x 200 rectangle extruded 4000 along the map's x (solid
    # Position: Axis (1,0,0), RefDirection (0,1,0), so profile x -> y, profile y -> z): x 0..4000,
    # y -50..50, z -100..100; origin moves it by (10, 0, 0), the target by (0, 0, 1000), as
    # ifcopenshell applies them (target after origin); placed at (0, 5000, 0):
    # x 10..4010, y 4950..5050, z 900..1100
    along_x = f.createIfcAxis2Placement3D(
        f.createIfcCartesianPoint((0.0, 0.0, 0.0)), f.createIfcDirection((1.0, 0.0, 0.0)), f.createIfcDirection((0.0, 1.0, 0.0))
    )
    inner = m.extrusion(f.createIfcRectangleProfileDef("AREA", None, None, 100.0, 200.0), 4000, position=along_x)
    mapped_rep = f.createIfcShapeRepresentation(m.body, "Body", "SweptSolid", [inner])
    origin = f.createIfcAxis2Placement3D(f.createIfcCartesianPoint((10.0, 0.0, 0.0)), None, None)
    source = f.createIfcRepresentationMap(origin, mapped_rep)
    target = f.createIfcCartesianTransformationOperator3D(None, None, f.createIfcCartesianPoint((0.0, 0.0, 1000.0)), 1.0, None)
    m.element("IfcBeam", "B1", m.placement((0, 5000, 0)), [f.createIfcMappedItem(source, target)])
    return m


def test_mm_factor(mm_model):
    # 1 in = 25.4 mm exactly (international inch)
    assert model_units(mm_model.f).to_core["length"] == pytest.approx(MM, rel=1e-12)


def test_rotated_wall(mm_model):
    boxes, _ = mm_model.read()
    assert_box(boxes["W1"], (840 * MM, 2000 * MM, 500 * MM), (2800 * MM, 4520 * MM, 3200 * MM))
    assert boxes["W1"].kind == "wall" and boxes["W1"].storey == "Level 1"


def test_circular_column_below_storey_placement(mm_model):
    boxes, _ = mm_model.read()
    assert_box(boxes["C1"], (4850 * MM, -150 * MM, 3100 * MM), (5150 * MM, 150 * MM, 5900 * MM))
    assert boxes["C1"].kind == "column"


def test_polyline_slab(mm_model):
    boxes, _ = mm_model.read()
    assert_box(boxes["S1"], (100 * MM, 200 * MM, 2800 * MM), (4100 * MM, 3200 * MM, 3000 * MM))


def test_oblique_extrusion(mm_model):
    boxes, _ = mm_model.read()
    assert_box(boxes["M1"], (-50 * MM, -25 * MM, 0.0), (50 * MM, 625 * MM, 800 * MM))


def test_mapped_item(mm_model):
    boxes, unreadable = mm_model.read()
    assert_box(boxes["B1"], (10 * MM, 4950 * MM, 900 * MM), (4010 * MM, 5050 * MM, 1100 * MM))
    assert unreadable == 0


def test_given_storeys_are_used(mm_model):
    wall = next(w for w in mm_model.f.by_type("IfcWall") if w.Name == "W1")
    boxes, _ = mm_model.read(storeys={wall.id(): "From the caller"})
    assert boxes["W1"].storey == "From the caller"
    assert boxes["C1"].storey == ""  # not in the given map


@pytest.mark.parametrize(
    "ifc_class, attributes, width, depth",
    [
        # overall sizes about the profile's Position, the centre of its bounding box (IFC4
        # parameterized profiles); hand: box x +-width/2, y +-depth/2
        ("IfcIShapeProfileDef", {"OverallWidth": 150.0, "OverallDepth": 300.0, "WebThickness": 7.1, "FlangeThickness": 10.7}, 150.0, 300.0),
        ("IfcLShapeProfileDef", {"Depth": 100.0, "Width": 80.0, "Thickness": 8.0}, 80.0, 100.0),
        ("IfcLShapeProfileDef", {"Depth": 100.0, "Thickness": 8.0}, 100.0, 100.0),  # no Width: equal legs
        ("IfcTShapeProfileDef", {"Depth": 150.0, "FlangeWidth": 120.0, "WebThickness": 8.0, "FlangeThickness": 10.0}, 120.0, 150.0),
        ("IfcUShapeProfileDef", {"Depth": 200.0, "FlangeWidth": 75.0, "WebThickness": 8.5, "FlangeThickness": 11.5}, 75.0, 200.0),
        ("IfcCShapeProfileDef", {"Depth": 200.0, "Width": 70.0, "WallThickness": 2.5, "Girth": 20.0}, 70.0, 200.0),
    ],
)
def test_parameterized_profiles(ifc_class, attributes, width, depth):
    m = TinyModel("mm")
    profile = m.f.create_entity(ifc_class, ProfileType="AREA", **attributes)
    m.element("IfcBeam", "P", m.placement((0, 0, 0)), [m.extrusion(profile, 1000)])
    boxes, _ = m.read()
    assert_box(boxes["P"], (-width / 2 * MM, -depth / 2 * MM, 0.0), (width / 2 * MM, depth / 2 * MM, 1000 * MM))


@pytest.fixture(scope="module")
def feet_model():
    m = TinyModel("feet")
    f = m.f
    # column 0.5 x 0.5 ft, depth 8 ft, at (2, 3, 0) ft relative to a storey placement at z = 10 ft:
    # x 1.75..2.25 ft = 21..27 in, y 2.75..3.25 ft = 33..39 in, z 10..18 ft = 120..216 in
    square = f.createIfcRectangleProfileDef("AREA", None, None, 0.5, 0.5)
    storey_placement = m.placement((0, 0, 10))
    m.element("IfcColumn", "C2", m.placement((2, 3, 0), parent=storey_placement), [m.extrusion(square, 8)])
    # faceted brep: tetrahedron (0,0,0) (2,0,0) (0,3,0) (0,0,4) ft at (10, 0, 0) ft:
    # x 10..12 ft = 120..144 in, y 0..3 ft = 0..36 in, z 0..4 ft = 0..48 in
    corners = [f.createIfcCartesianPoint(p) for p in ((0.0, 0.0, 0.0), (2.0, 0.0, 0.0), (0.0, 3.0, 0.0), (0.0, 0.0, 4.0))]
    faces = [
        f.createIfcFace([f.createIfcFaceOuterBound(f.createIfcPolyLoop([corners[i] for i in face]), True)])
        for face in ((0, 2, 1), (0, 1, 3), (0, 3, 2), (1, 2, 3))
    ]
    brep = f.createIfcFacetedBrep(f.createIfcClosedShell(faces))
    m.element("IfcMember", "BREP", m.placement((10, 0, 0)), [brep])
    # footing with only a 'Box' representation: corner (0, 0, -1) ft, 4 x 4 x 1 ft, at (20, 0, 0) ft:
    # x 20..24 ft = 240..288 in, y 0..48 in, z -1..0 ft = -12..0 in
    box = f.createIfcBoundingBox(f.createIfcCartesianPoint((0.0, 0.0, -1.0)), 4.0, 4.0, 1.0)
    m.element("IfcFooting", "F1", m.placement((20, 0, 0)), [box], identifier="Box")
    # roof without a body, aggregating a slab 10 x 20 ft (centred), 0.5 ft thick, at z = 20 ft:
    # x -5..5 ft = -60..60 in, y -10..10 ft = -120..120 in, z 20..20.5 ft = 240..246 in
    roof = m.element("IfcRoof", "R1", m.placement((0, 0, 0)))
    deck = f.createIfcRectangleProfileDef("AREA", None, None, 10.0, 20.0)
    slab = m.element("IfcSlab", "RS1", m.placement((0, 0, 20)), [m.extrusion(deck, 0.5)], contained=False)
    ifcopenshell.api.aggregate.assign_object(f, products=[slab], relating_object=roof)
    # a plate without any representation gives no box and is counted as unreadable
    m.element("IfcPlate", "NO-SHAPE", m.placement((0, 0, 0)))
    return m


def test_feet_factor(feet_model):
    # 1 ft = 12 in exactly
    assert model_units(feet_model.f).to_core["length"] == pytest.approx(FT, rel=1e-12)


def test_feet_column_through_placement_chain(feet_model):
    boxes, _ = feet_model.read()
    assert_box(boxes["C2"], (21.0, 33.0, 120.0), (27.0, 39.0, 216.0))


def test_faceted_brep_vertices(feet_model):
    boxes, _ = feet_model.read()
    assert_box(boxes["BREP"], (120.0, 0.0, 0.0), (144.0, 36.0, 48.0))
    assert boxes["BREP"].kind == "member"


def test_box_representation(feet_model):
    boxes, _ = feet_model.read()
    assert_box(boxes["F1"], (240.0, 0.0, -12.0), (288.0, 48.0, 0.0))
    assert boxes["F1"].kind == "footing"


def test_roof_is_the_union_of_its_slabs(feet_model):
    boxes, _ = feet_model.read()
    for name in ("R1", "RS1"):
        assert_box(boxes[name], (-60.0, -120.0, 240.0), (60.0, 120.0, 246.0))
    assert boxes["R1"].kind == "roof" and boxes["RS1"].kind == "slab"
    assert boxes["RS1"].storey == "Level 1"  # through the roof it is part of


def test_element_without_shape_is_counted(feet_model):
    boxes, unreadable = feet_model.read()
    assert "NO-SHAPE" not in boxes
    assert unreadable == 1
    assert sorted(boxes) == ["BREP", "C2", "F1", "R1", "RS1"]


def test_sample_model_members():
    """Quillfeather imperial sample (sample_models/build_samples.py): 18 IfcBeam and 7 IfcMember, each
    with a 'Body' extrusion. J-U-01 runs from (0, 16, z) to (156, 16, z) with z = 120 - 9.25 / 2 =
    115.375 in, a 2x10 (1.5 x 9.25 in) with its depth vertical: x 0..156, y 15.25..16.75,
    z 110.75..120.0 in."""
    model = ifcopenshell.open(SAMPLES / "quillfeather_imperial.ifc")
    boxes, unreadable = read_element_boxes(model, model_units(model).to_core["length"])
    assert collections.Counter(box.kind for box in boxes) == {"beam": 18, "member": 7}
    assert unreadable == 0
    joist = next(box for box in boxes if box.name == "J-U-01")
    assert_box(joist, (0.0, 15.25, 110.75), (156.0, 16.75, 120.0))
    assert joist.storey == "Upper Floor"


#: boxes per kind of each third-party model: its element counts in real_models/SOURCES.md (summary
#: table, subtypes included; IfcFooting, IfcPlate and IfcRoof are absent from these files), every
#: element giving a box
REAL_MODEL_COUNTS = {
    "roof_truss--Axis-Struc.ifc": {"beam": 9, "column": 1},
    "little_steel_frame-3D--Axis-Struc.ifc": {"beam": 59, "column": 27},
    "AC20-FZK-Haus.ifc": {"beam": 4, "member": 42, "slab": 4, "wall": 13, "space": 7},
    "539--rotated-studs--augmented.ifc": {"beam": 19, "member": 406, "slab": 1, "wall": 22},
    "395--beam--segfault--1--augmented.ifc": {"beam": 1},
    "ISSUE_021_Mini_Project.ifc": {"beam": 1949, "member": 228, "column": 26, "slab": 24},
    "example.ifc": {"beam": 43, "column": 42, "slab": 9, "wall": 17, "space": 1},
    "structural-curve-member.ifc": {},
    "beam-parametric-cross-section.ifc": {"beam": 18},
    "simple_beam.ifc": {},
}


@pytest.mark.parametrize("name", sorted(REAL_MODEL_COUNTS))
def test_real_models_read(name):
    path = REAL_MODELS / name
    if not path.is_file():
        pytest.skip(f"{path} is absent")
    model = ifcopenshell.open(path)
    boxes, unreadable = read_element_boxes(model, model_units(model).to_core["length"])
    assert dict(collections.Counter(box.kind for box in boxes)) == REAL_MODEL_COUNTS[name]
    assert unreadable == 0
    for box in boxes:  # every box has its low corner at or below its high corner (tolerance 0)
        assert all(lo <= hi for lo, hi in zip(box.lo, box.hi))


# --- names and layers of slabs and spaces (ifccheck.ifc.areas) ----------------------------------


def test_slab_layers_and_space_names_are_read():
    """A 19 mm plywood + 38 mm screed slab (layer set on its type) and a room whose usage is in
    Pset_SpaceOccupancyRequirements: layers 19/25.4 = 0.748 in and 38/25.4 = 1.496 in (exact mm
    to in), bottom to top; a single-material slab 200 mm thick takes its box height, 7.874 in."""
    import ifcopenshell.api.classification
    import ifcopenshell.api.material
    import ifcopenshell.api.pset
    import ifcopenshell.api.type

    m = TinyModel("mm")
    f = m.f
    plate = f.createIfcRectangleProfileDef("AREA", None, None, 4000.0, 3000.0)
    deck = m.element("IfcSlab", "Deck 1", m.placement((0, 0, 3000)), [m.extrusion(plate, 57)])
    deck.PredefinedType = "FLOOR"
    deck_type = ifcopenshell.api.root.create_entity(f, ifc_class="IfcSlabType", name="Loft deck 57")
    ifcopenshell.api.type.assign_type(f, related_objects=[deck], relating_type=deck_type)
    layers = ifcopenshell.api.material.add_material_set(f, name="Deck", set_type="IfcMaterialLayerSet")
    for name, thickness in (("Plywood", 19.0), ("Cement screed", 38.0)):
        material = ifcopenshell.api.material.add_material(f, name=name)
        layer = ifcopenshell.api.material.add_layer(f, layer_set=layers, material=material)
        layer.LayerThickness = thickness
    ifcopenshell.api.material.assign_material(f, products=[deck_type], material=layers)
    system = ifcopenshell.api.classification.add_classification(f, classification="Demo codes")
    ifcopenshell.api.classification.add_reference(f, products=[deck], identification="23.1", name="Floor decks",
                                                 classification=system)
    solid = m.element("IfcSlab", "Ground", m.placement((0, 0, 0)), [m.extrusion(plate, 200)])
    concrete = ifcopenshell.api.material.add_material(f, name="Concrete", category="concrete")
    ifcopenshell.api.material.assign_material(f, products=[solid], material=concrete)
    room = m.element("IfcSpace", "R-2", m.placement((0, 0, 3057)), [m.extrusion(plate, 2400)], contained=False)
    room.LongName = "Bedroom 2"
    pset = ifcopenshell.api.pset.add_pset(f, product=room, name="Pset_SpaceOccupancyRequirements")
    ifcopenshell.api.pset.edit_pset(f, pset=pset, properties={"OccupancyType": "Sleeping"})
    boxes, _ = m.read()
    assert boxes["Deck 1"].tags == ("Deck 1", "FLOOR", "Loft deck 57", "23.1", "Floor decks")
    assert [name for name, _ in boxes["Deck 1"].layers] == ["Plywood", "Cement screed"]
    assert [t for _, t in boxes["Deck 1"].layers] == pytest.approx([19 * MM, 38 * MM], abs=TOL)
    assert boxes["Deck 1"].layers_source == "material layer set"
    assert boxes["Ground"].layers == (("Concrete", pytest.approx(200 * MM, abs=TOL)),)  # Name and Category once
    assert boxes["R-2"].kind == "space" and boxes["R-2"].tags == ("R-2", "Bedroom 2", "Sleeping")
    assert boxes["R-2"].layers == ()
