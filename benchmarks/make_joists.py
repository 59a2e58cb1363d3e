"""Write a large IFC4 model of identical floor joists, for timing the checker.

Usage: ``python benchmarks/make_joists.py [N] [OUT.ifc]`` (default 20000 joists into
``benchmarks/out/joists_N.ifc``). From Python: ``make_joists(n, path)``.

The model is in feet. Every joist is a 13 ft 2x10 (1.5 x 9.25 in) IfcBeam JOIST with its own
placement, 'Body' extrusion and 'Axis' polyline; all of them share one IfcBeamType that carries
the material (DF-L No.2, category Wood) and the ifccheck_DesignInput loads (10 psf dead, 40 psf
live, 16 in tributary width, self weight included). Joists stand in rows of 40 at 16 in on
centre, 25 rows to a storey, storeys 10 ft apart. The joist entities are created directly with
``create_entity``, which is far faster than one api call per joist; the file is the same on every
run for the same N (GlobalIds from uuid5 of the names, fixed header).
"""

from __future__ import annotations

import argparse
import math
import time
import uuid
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.material
import ifcopenshell.api.project
import ifcopenshell.api.pset
import ifcopenshell.api.root
import ifcopenshell.api.unit
import ifcopenshell.guid

FOOT_M = 0.3048  # exact
LBF_N = 4.4482216152605  # exact: 0.45359237 kg x 9.80665 m/s2

JOIST_WIDTH_FT = 1.5 / 12
JOIST_DEPTH_FT = 9.25 / 12
JOIST_LENGTH_FT = 13.0
SPACING_FT = 16 / 12
JOISTS_PER_ROW = 40
ROWS_PER_STOREY = 25
ROW_PITCH_FT = 14.0  # 13 ft joists and a 1 ft gap between rows
STOREY_HEIGHT_FT = 10.0

GUID_NAMESPACE = uuid.UUID("8c5e2f07-41a9-5d3b-b6e8-2d7f09a1c354")


def _guid(name: str) -> str:
    return ifcopenshell.guid.compress(uuid.uuid5(GUID_NAMESPACE, name).hex)


def _add_feet_units(model, project) -> None:
    """foot, pound-force, lbf/ft and lbf/ft2 as the project units."""

    def conversion_unit(unit_type, name, exponents, factor, si_name, measure):
        return model.create_entity(
            "IfcConversionBasedUnit",
            Dimensions=model.create_entity("IfcDimensionalExponents", *exponents),
            UnitType=unit_type,
            Name=name,
            ConversionFactor=model.create_entity(
                "IfcMeasureWithUnit",
                ValueComponent=model.create_entity(measure, factor),
                UnitComponent=model.create_entity("IfcSIUnit", UnitType=unit_type, Name=si_name),
            ),
        )

    foot = conversion_unit("LENGTHUNIT", "foot", (1, 0, 0, 0, 0, 0, 0), FOOT_M, "METRE", "IfcLengthMeasure")
    lbf = conversion_unit("FORCEUNIT", "pound-force", (1, 1, -2, 0, 0, 0, 0), LBF_N, "NEWTON", "IfcForceMeasure")
    plf = ifcopenshell.api.unit.add_derived_unit(model, "LINEARFORCEUNIT", None, {lbf: 1, foot: -1})
    psf = ifcopenshell.api.unit.add_derived_unit(model, "PLANARFORCEUNIT", None, {lbf: 1, foot: -2})
    # created directly: the api's assign_unit orders the units as a Python set does, not reproducibly
    project.UnitsInContext = model.create_entity("IfcUnitAssignment", Units=(foot, lbf, plf, psf))


def _add_joist_type(model, project):
    joist_type = ifcopenshell.api.root.create_entity(
        model, "IfcBeamType", predefined_type="JOIST", name="Joist 2x10 DF-L No.2"
    )
    ifcopenshell.api.project.assign_declaration(model, definitions=[joist_type], relating_context=project)
    material = ifcopenshell.api.material.add_material(model, name="DF-L No.2", category="Wood")
    wood = ifcopenshell.api.pset.add_pset(model, product=material, name="Pset_MaterialWood")
    ifcopenshell.api.pset.edit_pset(
        model, pset=wood,
        properties={
            "Species": model.create_entity("IfcLabel", "Douglas Fir-Larch"),
            "StrengthGrade": model.create_entity("IfcLabel", "No.2"),
        },
    )
    ifcopenshell.api.material.assign_material(model, products=[joist_type], material=material)
    inputs = ifcopenshell.api.pset.add_pset(model, product=joist_type, name="ifccheck_DesignInput")
    ifcopenshell.api.pset.edit_pset(
        model, pset=inputs,
        properties={
            "DeadAreaLoad": model.create_entity("IfcPlanarForceMeasure", 10.0),
            "LiveAreaLoad": model.create_entity("IfcPlanarForceMeasure", 40.0),
            "TributaryWidth": model.create_entity("IfcPositiveLengthMeasure", SPACING_FT),
            "SelfWeightIncluded": model.create_entity("IfcBoolean", True),
        },
    )
    return joist_type


class _JoistWriter:
    """Creates joist occurrences entity by entity, sharing what may be shared."""

    def __init__(self, model, body_context, axis_context):
        self.model = model
        self.body_context = body_context
        self.axis_context = axis_context
        self.origin = model.create_entity("IfcCartesianPoint", (0.0, 0.0, 0.0))
        self.axis_end = model.create_entity("IfcCartesianPoint", (0.0, 0.0, JOIST_LENGTH_FT))
        self.along_x = model.create_entity("IfcDirection", (1.0, 0.0, 0.0))
        self.along_y = model.create_entity("IfcDirection", (0.0, 1.0, 0.0))
        self.up = model.create_entity("IfcDirection", (0.0, 0.0, 1.0))
        self.profile = model.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName="2x10",
            Position=model.create_entity(
                "IfcAxis2Placement2D", Location=model.create_entity("IfcCartesianPoint", (0.0, 0.0))
            ),
            XDim=JOIST_WIDTH_FT, YDim=JOIST_DEPTH_FT,
        )

    def joist(self, name: str, x: float, y: float, z: float):
        """A joist along +x from (x, y, z): local z along the joist, local y (the depth) up."""
        create = self.model.create_entity
        placement = create(
            "IfcLocalPlacement",
            RelativePlacement=create(
                "IfcAxis2Placement3D",
                Location=create("IfcCartesianPoint", (x, y, z)),
                Axis=self.along_x,
                RefDirection=self.along_y,
            ),
        )
        solid = create(
            "IfcExtrudedAreaSolid", SweptArea=self.profile, ExtrudedDirection=self.up, Depth=JOIST_LENGTH_FT
        )
        body = create("IfcShapeRepresentation", self.body_context, "Body", "SweptSolid", (solid,))
        axis = create(
            "IfcShapeRepresentation", self.axis_context, "Axis", "Curve3D",
            (create("IfcPolyline", (self.origin, self.axis_end)),),
        )
        return create(
            "IfcBeam", GlobalId=_guid(name), Name=name, ObjectPlacement=placement,
            Representation=create("IfcProductDefinitionShape", Representations=(axis, body)),
        )


def joist_positions(n: int):
    """(storey index, name, x, y) of each joist, in feet, row by row and storey by storey."""
    per_storey = JOISTS_PER_ROW * ROWS_PER_STOREY
    for index in range(n):
        storey, in_storey = divmod(index, per_storey)
        row, place = divmod(in_storey, JOISTS_PER_ROW)
        name = f"J-{storey + 1:02d}-{row + 1:02d}-{place + 1:02d}"
        yield storey, name, row * ROW_PITCH_FT, (place + 1) * SPACING_FT


def make_joists(n: int, path) -> Path:
    """Write an IFC4 model of ``n`` 2x10 DF-L No.2 joists (feet) to ``path``; returns the path."""
    if n < 1:
        raise ValueError(f"the number of joists must be at least 1, not {n}")
    model = ifcopenshell.api.project.create_file(version="IFC4")
    project = ifcopenshell.api.root.create_entity(model, "IfcProject", name=f"Joist benchmark, {n} joists")
    _add_feet_units(model, project)
    context = ifcopenshell.api.context.add_context(model, context_type="Model")
    body = ifcopenshell.api.context.add_context(model, "Model", "Body", "MODEL_VIEW", parent=context)
    axis = ifcopenshell.api.context.add_context(model, "Model", "Axis", "GRAPH_VIEW", parent=context)
    site = ifcopenshell.api.root.create_entity(model, "IfcSite", name="Benchmark site")
    building = ifcopenshell.api.root.create_entity(model, "IfcBuilding", name="Benchmark building")
    ifcopenshell.api.aggregate.assign_object(model, products=[site], relating_object=project)
    ifcopenshell.api.aggregate.assign_object(model, products=[building], relating_object=site)

    storey_count = math.ceil(n / (JOISTS_PER_ROW * ROWS_PER_STOREY))
    storeys = []
    for index in range(storey_count):
        storey = ifcopenshell.api.root.create_entity(model, "IfcBuildingStorey", name=f"Level {index + 1:02d}")
        storey.Elevation = (index + 1) * STOREY_HEIGHT_FT
        storeys.append(storey)
    model.create_entity("IfcRelAggregates", RelatingObject=building, RelatedObjects=storeys)

    joist_type = _add_joist_type(model, project)
    writer = _JoistWriter(model, body, axis)
    joists_by_storey = [[] for _ in storeys]
    for storey, name, x, y in joist_positions(n):
        z = storeys[storey].Elevation - JOIST_DEPTH_FT / 2
        joists_by_storey[storey].append(writer.joist(name, x, y, z))

    everyone = [joist for joists in joists_by_storey for joist in joists]
    model.create_entity("IfcRelDefinesByType", RelatedObjects=everyone, RelatingType=joist_type)
    for storey, joists in zip(storeys, joists_by_storey):
        model.create_entity(
            "IfcRelContainedInSpatialStructure", RelatedElements=joists, RelatingStructure=storey
        )
    for index, rooted in enumerate(sorted(model.by_type("IfcRoot"), key=lambda e: e.id())):
        if not rooted.is_a("IfcBeam"):  # the joists have GlobalIds from their names already
            rooted.GlobalId = _guid(f"{rooted.is_a()}/{index}")

    header = model.header.file_name
    header.name = Path(path).name
    header.time_stamp = "2024-01-01T00:00:00"
    header.author = ("ifccheck benchmark generator",)
    header.organization = ("ifccheck project",)
    header.preprocessor_version = "ifccheck benchmarks/make_joists.py"
    header.originating_system = "ifccheck benchmarks/make_joists.py"
    header.authorization = "none"
    path = Path(path)
    path.parent.mkdir(parents=True, exist_ok=True)
    model.write(str(path))
    return path


def main(argv=None) -> None:
    parser = argparse.ArgumentParser(description="Write an IFC4 benchmark model of N floor joists.")
    parser.add_argument("n", nargs="?", type=int, default=20000, help="number of joists (default 20000)")
    parser.add_argument("out", nargs="?", help="output file (default benchmarks/out/joists_N.ifc)")
    args = parser.parse_args(argv)
    out = Path(args.out) if args.out else Path(__file__).resolve().parent / "out" / f"joists_{args.n}.ifc"
    started = time.perf_counter()
    make_joists(args.n, out)
    print(f"{args.n} joists written to {out} in {time.perf_counter() - started:.1f} s")


if __name__ == "__main__":
    main()
