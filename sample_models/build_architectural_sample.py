"""Build the Quillfeather Barn sample model (architectural only), byte-identically on every run.

The Quillfeather Barn is an invented barn conversion for the same fictional client as the
Quillfeather Studio (see README.md beside this file): a timber-framed barn of 20 ft x 24 ft with a
loft floor and a 6:12 gable roof. ``quillfeather_barn_architectural.ifc`` (IFC4; foot) holds what
an architectural model holds: walls, posts, a girder, joists, a floor slab, rafters, a ridge beam
and a roof. It has NO loads (no ``ifccheck_DesignInput``) and NO structural-analysis model: the
checker finds the supports in the geometry and takes the loads from the project rules file
``quillfeather_barn.rules.toml`` (area loads per storey) times each member's tributary width.

* Loft floor, south bay: joists J-01 to J-07 from the west wall to a dropped girder G-01 (on two
  posts P-01, P-02), bearing on its top.
* Loft floor, north bay: joists J-08 to J-17 from the west to the east wall, continuous over the
  interior bearing wall W-05 at mid-length (two spans).
* Roof: rafters R-S-01 to R-S-09 (south slope) and R-N-01 to R-N-09 (north slope) from the eaves
  knee walls to the ridge beam RB-01, which bears on the two gable walls and a ridge post P-03.

Usage: ``python sample_models/build_architectural_sample.py [OUT_DIR]`` (default: this folder).

All data below are in inches; the model writes them in feet. The expected results and their hand
calculations are in README.md.
"""

from __future__ import annotations

import argparse
import math
import sys
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.root
import ifcopenshell.api.spatial

HERE = Path(__file__).resolve().parent
if str(HERE) not in sys.path:  # build_samples.py sits beside this file and is not in a package
    sys.path.insert(0, str(HERE))

from build_samples import (  # noqa: E402 - after the path set-up above
    DFL1,
    DFL2,
    IMPERIAL,
    P2PLY_2X12,
    P2X10,
    P6X6,
    MemberSpec,
    Profile,
    SampleBuilder,
    UnitSystem,
)

FILE_NAME = "quillfeather_barn_architectural.ifc"
UNITS = UnitSystem(FILE_NAME, "IFC4", IMPERIAL.per_inch, IMPERIAL.per_plf, IMPERIAL.per_psf, IMPERIAL.units)
PREPROCESSOR = "ifccheck sample_models/build_architectural_sample.py"

BARN_NAME = "Quillfeather Barn"
BARN_DESCRIPTION = (
    "Invented sample: a barn converted into a workshop with a loft, for the fictional Inkwell and "
    "Loom Makers' Guild. Architectural model only: no loads, no analysis model. Not a real "
    "building, client or site."
)
BARN_ADDRESS_LINES = ["Old Tithe Yard, 7 Inkpot Row"]
BARN_TOWN = "Little Wyvernsby (fictional)"
BARN_STOREYS = (("Ground Floor", 0.0), ("Loft Floor", 120.0), ("Roof", 168.0))

P3PLY_2X12 = Profile("2x12", 1.5, 11.25, plies=3)

# ------------------------------------------------------------------------------------------
# The barn (inches). Wall centrelines: x = 0, 120 (interior, north bay only), 240; y = 0, 288.
# ------------------------------------------------------------------------------------------

EXTERIOR_WALL = 5.5  # 2x6 studs
INTERIOR_WALL = 3.5  # 2x4 studs
X_WEST, X_MID, X_EAST = 0.0, 120.0, 240.0
Y_SOUTH, Y_NORTH = 0.0, 288.0
OUTER = EXTERIOR_WALL / 2  # from a wall centreline to its outer face

JOIST_BOTTOM = 110.0  # the ground-floor walls' and the girder's top
JOIST_Z = JOIST_BOTTOM + P2X10.d / 2
SLAB_THICKNESS = 0.75  # floor sheathing
FLOOR_TOP = JOIST_BOTTOM + P2X10.d + SLAB_THICKNESS  # 120 in: the Loft Floor storey
JOIST_SPACING = 16.0
SOUTH_BAY_JOISTS = 7  # J-01 ... J-07 at y = 16 ... 112 in, on the girder
NORTH_BAY_JOISTS = 10  # J-08 ... J-17 at y = 128 ... 272 in, over the interior wall

GIRDER_Z = JOIST_BOTTOM - P2PLY_2X12.d / 2  # dropped: its top is the joists' bottom
POST_Y = (8.0, 120.0)  # girder posts P-01, P-02: 112 in apart, joists at 8, 24, ... 104 in from P-01

PITCH = 0.5  # 6:12
COS_PITCH = 1.0 / math.sqrt(1.0 + PITCH**2)
PLATE_TOP = 168.0  # top of the eaves knee walls: the rafters' bottom at the wall centreline
RAFTER_HALF_PLUMB = P2X10.d / 2 / COS_PITCH  # plumb half-depth of a sloped rafter
RIDGE_Y = (Y_SOUTH + Y_NORTH) / 2
RIDGE_TOP = PLATE_TOP + PITCH * (RIDGE_Y - Y_SOUTH)  # the rafters' bottom at the ridge centreline
RIDGE_Z = RIDGE_TOP - P3PLY_2X12.d / 2
RIDGE_BOTTOM = RIDGE_TOP - P3PLY_2X12.d
RAFTER_SPACING = 24.0
RAFTERS_PER_SLOPE = 9  # at x = 24 ... 216 in
ROOF_THICKNESS = 0.75  # roof sheathing


def rafter_axis_z(y: float) -> float:
    """Height of a rafter's axis above plan position y of the south slope (north: mirrored)."""
    return PLATE_TOP + RAFTER_HALF_PLUMB + PITCH * (y - Y_SOUTH)


def loft_joists() -> list:
    """J-01 ... J-07 from the west wall's outer face to the girder's far face; J-08 ... J-17 from
    the west wall's outer face to the east wall's outer face, over the interior wall."""
    joists = []
    for i in range(1, SOUTH_BAY_JOISTS + NORTH_BAY_JOISTS + 1):
        y = JOIST_SPACING * i
        south = i <= SOUTH_BAY_JOISTS
        x_end = X_MID + P2PLY_2X12.b if south else X_EAST + OUTER  # the girder is 3 in wide
        joists.append(
            MemberSpec(
                f"J-{i:02d}", "IfcBeam", "JOIST", "Loft Floor", P2X10,
                (X_WEST - OUTER, y, JOIST_Z), (x_end, y, JOIST_Z),
                "Loft joist, south bay: west wall to the girder" if south
                else "Loft joist, north bay: west wall to east wall over the interior wall",
                material=DFL2,
            )
        )
    return joists


GIRDER = MemberSpec(
    "G-01", "IfcBeam", "BEAM", "Loft Floor", P2PLY_2X12,
    (X_MID, POST_Y[0] - OUTER, GIRDER_Z), (X_MID, POST_Y[1] + OUTER, GIRDER_Z),
    "Dropped girder under the south-bay loft joists, on posts P-01 and P-02",
    material=DFL1,
)


def posts() -> list:
    girder_posts = [
        MemberSpec(
            f"P-{k:02d}", "IfcColumn", "COLUMN", "Ground Floor", P6X6,
            (X_MID, y, 0.0), (X_MID, y, JOIST_BOTTOM - P2PLY_2X12.d),
            "Post under the girder", material=DFL1,
        )
        for k, y in enumerate(POST_Y, start=1)
    ]
    ridge_post = MemberSpec(
        "P-03", "IfcColumn", "COLUMN", "Loft Floor", P6X6,
        (X_MID, RIDGE_Y, FLOOR_TOP), (X_MID, RIDGE_Y, RIDGE_BOTTOM),
        "Ridge post over the interior bearing wall", material=DFL1,
    )
    return [*girder_posts, ridge_post]


def rafters() -> list:
    """Each slope's rafters run from the outer face of the eaves wall to the ridge centreline,
    where the two slopes' rafters meet end to end."""
    members = []
    for slope, y_eave, step in (("S", Y_SOUTH - OUTER, 1.0), ("N", Y_NORTH + OUTER, -1.0)):
        z_eave = rafter_axis_z(Y_SOUTH - OUTER)
        z_ridge = rafter_axis_z(RIDGE_Y)
        for i in range(1, RAFTERS_PER_SLOPE + 1):
            x = RAFTER_SPACING * i
            members.append(
                MemberSpec(
                    f"R-{slope}-{i:02d}", "IfcMember", "RAFTER", "Roof", P2X10,
                    (x, y_eave, z_eave), (x, RIDGE_Y, z_ridge),
                    f"Rafter of the {'south' if step > 0 else 'north'} slope, 6:12, eaves wall to ridge beam",
                    material=DFL2,
                )
            )
    return members


RIDGE = MemberSpec(
    "RB-01", "IfcBeam", "BEAM", "Roof", P3PLY_2X12,
    (X_WEST - OUTER, RIDGE_Y, RIDGE_Z), (X_EAST + OUTER, RIDGE_Y, RIDGE_Z),
    "Ridge beam on the gable walls and the ridge post P-03; rafters bear on its top",
    material=DFL1,
)


def catalogue() -> list:
    """Every framing member of the barn, in the order they are written."""
    return [*loft_joists(), GIRDER, *posts(), *rafters(), RIDGE]


# walls: (name, storey, description, (x_lo, y_lo, z_lo), (x_hi, y_hi, z_hi))
WALLS = (
    ("W-01", "Ground Floor", "West gable wall below the loft, 2x6",
     (X_WEST - OUTER, Y_SOUTH - OUTER, 0.0), (X_WEST + OUTER, Y_NORTH + OUTER, JOIST_BOTTOM)),
    ("W-02", "Ground Floor", "East gable wall below the loft, 2x6",
     (X_EAST - OUTER, Y_SOUTH - OUTER, 0.0), (X_EAST + OUTER, Y_NORTH + OUTER, JOIST_BOTTOM)),
    ("W-03", "Ground Floor", "South eaves wall below the loft, 2x6",
     (X_WEST + OUTER, Y_SOUTH - OUTER, 0.0), (X_EAST - OUTER, Y_SOUTH + OUTER, JOIST_BOTTOM)),
    ("W-04", "Ground Floor", "North eaves wall below the loft, 2x6",
     (X_WEST + OUTER, Y_NORTH - OUTER, 0.0), (X_EAST - OUTER, Y_NORTH + OUTER, JOIST_BOTTOM)),
    ("W-05", "Ground Floor", "Interior bearing wall under the north-bay joists' mid-length, 2x4",
     (X_MID - INTERIOR_WALL / 2, 124.0, 0.0), (X_MID + INTERIOR_WALL / 2, Y_NORTH - OUTER, JOIST_BOTTOM)),
    ("W-06", "Loft Floor", "South knee wall of the loft, 2x6, carrying the rafters",
     (X_WEST - OUTER, Y_SOUTH - OUTER, FLOOR_TOP), (X_EAST + OUTER, Y_SOUTH + OUTER, PLATE_TOP)),
    ("W-07", "Loft Floor", "North knee wall of the loft, 2x6, carrying the rafters",
     (X_WEST - OUTER, Y_NORTH - OUTER, FLOOR_TOP), (X_EAST + OUTER, Y_NORTH + OUTER, PLATE_TOP)),
    ("W-08", "Loft Floor", "West gable wall of the loft, 2x6, carrying the ridge beam",
     (X_WEST - OUTER, Y_SOUTH + OUTER, FLOOR_TOP), (X_WEST + OUTER, Y_NORTH - OUTER, RIDGE_BOTTOM)),
    ("W-09", "Loft Floor", "East gable wall of the loft, 2x6, carrying the ridge beam",
     (X_EAST - OUTER, Y_SOUTH + OUTER, FLOOR_TOP), (X_EAST + OUTER, Y_NORTH - OUTER, RIDGE_BOTTOM)),
)

FLOOR_SLAB = (
    "S-01", "Loft Floor", "Loft floor sheathing on the joists",
    (X_WEST - OUTER, Y_SOUTH - OUTER, FLOOR_TOP - SLAB_THICKNESS), (X_EAST + OUTER, Y_NORTH + OUTER, FLOOR_TOP),
)

# ------------------------------------------------------------------------------------------
# The model
# ------------------------------------------------------------------------------------------


class BarnBuilder(SampleBuilder):
    """The Quillfeather Barn: framing members as in the studio models, plus walls, a floor slab
    and a roof as extruded solids, and nothing else (no loads, no analysis model)."""

    preprocessor = PREPROCESSOR
    site_name = f"{BARN_NAME} site"
    building_name = BARN_NAME
    address_lines = BARN_ADDRESS_LINES
    town = BARN_TOWN
    storey_levels = BARN_STOREYS

    def __init__(self):
        super().__init__(UNITS)
        self.project.Name = BARN_NAME
        self.project.Description = BARN_DESCRIPTION

    def slab_body(self, width: float, length: float, thickness: float):
        """'Body': a width x length rectangle (local x, local y from the placement's origin along
        local y) extruded ``thickness`` along local z."""
        geometry = self.geometry
        profile = self.model.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA",
            Position=self.model.create_entity(
                "IfcAxis2Placement2D", Location=geometry.point([0.0, geometry.length(length / 2)])
            ),
            XDim=geometry.length(width), YDim=geometry.length(length),
        )
        solid = self.model.create_entity(
            "IfcExtrudedAreaSolid", SweptArea=profile, ExtrudedDirection=geometry.direction((0.0, 0.0, 1.0)),
            Depth=geometry.length(thickness),
        )
        body = self.model.create_entity("IfcShapeRepresentation", geometry.body, "Body", "SweptSolid", [solid])
        return self.model.create_entity("IfcProductDefinitionShape", Representations=[body])

    def add_solid(self, ifc_class: str, predefined_type: str, name: str, description: str, whole, origin,
                  z_axis, x_axis, width: float, length: float, thickness: float):
        """An element whose body is one extruded rectangle, placed in world coordinates; contained
        in ``whole`` when it is a storey, else a part of it (the roof's slabs). One element per api
        call, and the placement set afterwards, so it stays in world coordinates and every run
        writes the same entities in the same order."""
        element = ifcopenshell.api.root.create_entity(
            self.model, ifc_class, predefined_type=predefined_type, name=name
        )
        element.Description = description
        if whole.is_a("IfcBuildingStorey"):
            ifcopenshell.api.spatial.assign_container(self.model, products=[element], relating_structure=whole)
        else:
            ifcopenshell.api.aggregate.assign_object(self.model, products=[element], relating_object=whole)
        element.ObjectPlacement = self.geometry.world_placement(origin, z_axis, x_axis)
        element.Representation = self.slab_body(width, length, thickness)
        return element

    def add_box(self, ifc_class: str, predefined_type: str, spec: tuple):
        """A wall or level slab from (name, storey, description, low corner, high corner)."""
        name, storey, description, lo, hi = spec
        origin = ((lo[0] + hi[0]) / 2, lo[1], lo[2])
        return self.add_solid(
            ifc_class, predefined_type, name, description, self.storeys[storey], origin, None, None,
            hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2],
        )

    def add_roof(self) -> None:
        """IfcRoof RF-01 (GABLE_ROOF, no body of its own) made of two sloped IfcSlab ROOF whose
        underside lies on the rafters' top, from the eaves walls' outer faces to the ridge line."""
        roof = ifcopenshell.api.root.create_entity(self.model, "IfcRoof", predefined_type="GABLE_ROOF", name="RF-01")
        roof.Description = "6:12 gable roof of the barn"
        ifcopenshell.api.spatial.assign_container(self.model, products=[roof], relating_structure=self.storeys["Roof"])
        roof.ObjectPlacement = self.geometry.world_placement()
        sin_pitch = PITCH * COS_PITCH
        plan = RIDGE_Y - (Y_SOUTH - OUTER)
        underside = rafter_axis_z(Y_SOUTH - OUTER) + RAFTER_HALF_PLUMB
        width = X_EAST - X_WEST + 2 * OUTER
        for name, y_eave, side in (("RS-01", Y_SOUTH - OUTER, 1.0), ("RS-02", Y_NORTH + OUTER, -1.0)):
            self.add_solid(
                "IfcSlab", "ROOF", name, f"Roof sheathing, {'south' if side > 0 else 'north'} slope", roof,
                ((X_WEST + X_EAST) / 2, y_eave, underside),
                (0.0, -side * sin_pitch, COS_PITCH), (side, 0.0, 0.0),
                width, plan / COS_PITCH, ROOF_THICKNESS,
            )

    def build_barn(self) -> ifcopenshell.file:
        for spec in catalogue():
            self.add_member(spec)
        for wall in WALLS:
            self.add_box("IfcWall", "SOLIDWALL", wall)
        self.add_box("IfcSlab", "FLOOR", FLOOR_SLAB)
        self.add_roof()
        self.sort_unordered_sets()
        self.fix_global_ids()
        self.fix_header()
        return self.model


def build_architectural_sample(out_dir: Path) -> Path:
    """Write quillfeather_barn_architectural.ifc into ``out_dir``; returns its path."""
    out_dir = Path(out_dir)
    out_dir.mkdir(parents=True, exist_ok=True)
    path = out_dir / FILE_NAME
    BarnBuilder().build_barn().write(str(path))
    return path


def main(argv=None) -> None:
    parser = argparse.ArgumentParser(description="Build the Quillfeather Barn architectural sample IFC model.")
    parser.add_argument("out_dir", nargs="?", default=str(HERE), help="folder to write into (default: this folder)")
    args = parser.parse_args(argv)
    print(build_architectural_sample(Path(args.out_dir)))


if __name__ == "__main__":
    main()
