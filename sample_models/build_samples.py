"""Build the Quillfeather Studio sample models, byte-identically on every run.

Quillfeather Studio is an invented two-storey timber-framed building: a craft workshop on the
ground floor with a small flat above, for an invented client at an invented address. The same
building is written in three files:

* ``quillfeather_imperial.ifc``: IFC4; foot, lbf, lbf/ft, lbf/ft2 (psf);
* ``quillfeather_metric.ifc``: IFC4; millimetre, kN, kN/m, kPa, every value converted exactly
  from the imperial one, so both models give the same verdicts;
* ``quillfeather_ifc2x3.ifc``: IFC2X3; metre, a few of the same members, and no force units
  assigned, so its loads are in the SI defaults (N/m, Pa).

Usage: ``python sample_models/build_samples.py [OUT_DIR]`` (default: this folder).

Every dimension in the member catalogue below is in inches and every load in lbf/ft (plf) or
lbf/ft2 (psf); each model converts them into its own units as it is written. README.md beside
this file lists every member with its expected verdict and the hand calculation behind it.
"""

from __future__ import annotations

import argparse
import math
import uuid
from dataclasses import dataclass, field
from pathlib import Path
from typing import Optional

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

HERE = Path(__file__).resolve().parent

# exact conversion factors: international foot and inch; pound-force = 0.45359237 kg x 9.80665 m/s2
FOOT_M = 0.3048
INCH_M = 0.0254
LBF_N = 4.4482216152605

INPUT_PSET = "ifccheck_DesignInput"
#: kind of every input property written here (the same kinds as ifccheck.model.INPUT_PROPS)
INPUT_KINDS = {
    "DeadLoad": "linear_force",
    "LiveLoad": "linear_force",
    "SnowLoad": "linear_force",
    "DeadAreaLoad": "planar_force",
    "LiveAreaLoad": "planar_force",
    "SnowAreaLoad": "planar_force",
    "TributaryWidth": "length",
    "UnbracedLength": "length",
    "BearingLength": "length",
    "SelfWeightIncluded": "bool",
    "ContinuouslyBraced": "bool",
    "RepetitiveMember": "bool",
    "Species": "label",
    "Grade": "label",
    "LiveDeflectionLimit": "number",
    "TotalDeflectionLimit": "number",
}
MEASURE_OF_KIND = {
    "linear_force": "IfcLinearForceMeasure",
    "planar_force": "IfcPlanarForceMeasure",
    "length": "IfcPositiveLengthMeasure",
    "bool": "IfcBoolean",
    "label": "IfcLabel",
    "number": "IfcReal",
}

# fixed header and ownership data, so that every build writes the same bytes
TIME_STAMP = "2024-01-01T00:00:00"
CREATION_DATE = 1704067200  # the same instant in seconds since 1970 (IFC2X3 owner history only)
AUTHOR = "ifccheck sample builder"
ORGANIZATION = "ifccheck project"
PREPROCESSOR = "ifccheck sample_models/build_samples.py"
GUID_NAMESPACE = uuid.UUID("3f0b6a52-8d1e-5c47-9a36-0e2f4b7c9d81")

# ------------------------------------------------------------------------------------------
# The building (all lengths in inches, loads in plf / psf)
# ------------------------------------------------------------------------------------------

PROJECT_NAME = "Quillfeather Studio"
PROJECT_DESCRIPTION = (
    "Invented sample: a craft workshop with a flat above, for the fictional Inkwell and Loom "
    "Makers' Guild. Not a real building, client or site."
)
ADDRESS_LINES = ["7 Inkpot Row"]
TOWN = "Little Wyvernsby (fictional)"

STOREYS = (("Ground Floor", 0.0), ("Upper Floor", 120.0), ("Roof", 216.0))


@dataclass(frozen=True)
class Profile:
    """A cross-section (inches): ``plies`` rectangles b x d side by side, or a steel I-shape b x d."""

    name: str
    b: float
    d: float
    plies: int = 1
    web: float = 0.0  # I-shapes only
    flange: float = 0.0  # I-shapes only

    @property
    def is_i_shape(self) -> bool:
        return self.web > 0

    @property
    def label(self) -> str:
        return f"{self.plies}-ply {self.name}" if self.plies > 1 else self.name


@dataclass(frozen=True)
class Material:
    name: str
    category: str
    species: str = ""  # written to Pset_MaterialWood (IFC4 only)
    grade: str = ""


@dataclass(frozen=True)
class TypeSpec:
    name: str
    ifc_class: str
    predefined_type: str
    material: Optional[Material] = None
    inputs: dict = field(default_factory=dict)
    beam_common: dict = field(default_factory=dict)


@dataclass(frozen=True)
class MemberSpec:
    """One member of the catalogue; ``start`` and ``end`` are the ends of its axis (inches)."""

    name: str
    ifc_class: str
    predefined_type: str
    storey: str
    profile: Profile
    start: tuple
    end: tuple
    description: str
    type_name: str = ""
    material: Optional[Material] = None  # assigned to the occurrence
    inputs: dict = field(default_factory=dict)
    beam_common: dict = field(default_factory=dict)
    in_ifc2x3: bool = False


# dressed sizes of dimension lumber and timbers (in), and a steel I-shape
P2X6 = Profile("2x6", 1.5, 5.5)
P2X8 = Profile("2x8", 1.5, 7.25)
P2X10 = Profile("2x10", 1.5, 9.25)
P2PLY_2X6 = Profile("2x6", 1.5, 5.5, plies=2)
P2PLY_2X8 = Profile("2x8", 1.5, 7.25, plies=2)
P2PLY_2X12 = Profile("2x12", 1.5, 11.25, plies=2)
P6X6 = Profile("6x6", 5.5, 5.5)
P_STEEL = Profile("I 8.14x5.25", 5.25, 8.14, web=0.23, flange=0.33)

DFL2 = Material("DF-L No.2", "Wood", "Douglas Fir-Larch", "No.2")
DFL1 = Material("DF-L No.1", "Wood", "Douglas Fir-Larch", "No.1")
DFL_UNKNOWN = Material("DF-L Premium Select X", "Wood", "Douglas Fir-Larch", "Premium Select X")
HF2 = Material("Hem-Fir No.2", "Wood", "Hem-Fir", "No.2")
SOFTWOOD = Material("Sawn softwood", "Wood")
STEEL = Material("Steel S355", "Steel")

FLOOR_LOADS = {"DeadAreaLoad": 10.0, "LiveAreaLoad": 40.0, "TributaryWidth": 16.0, "SelfWeightIncluded": True}
ROOF_LOADS = {"DeadAreaLoad": 10.0, "SnowAreaLoad": 25.0, "TributaryWidth": 24.0, "SelfWeightIncluded": True}

JOIST_TYPE = TypeSpec(
    "Joist 2x10 DF-L No.2", "IfcBeamType", "JOIST", DFL2, FLOOR_LOADS, {"LoadBearing": True}
)
RAFTER_TYPE = TypeSpec("Rafter 2x8 Hem-Fir No.2", "IfcMemberType", "RAFTER", HF2, ROOF_LOADS)
TYPES = (JOIST_TYPE, RAFTER_TYPE)

UPPER_JOIST_Z = 120.0 - P2X10.d / 2  # top of the joists at the upper floor level


def upper_floor_joists() -> list:
    """J-U-01 to J-U-10: 2x10 DF-L No.2 at 16 in o.c., 13 ft, west bay (x = 0 to 13 ft).

    J-U-01 to J-U-06 take material and loads from their type; J-U-07 to J-U-10 carry both
    themselves, J-U-10 with a generic material and its species and grade as design inputs.
    J-U-05 also has a clear span in Pset_BeamCommon.
    """
    joists = []
    for i in range(1, 11):
        y = 16.0 * i
        if i <= 6:
            type_name, material, inputs = JOIST_TYPE.name, None, {}
        elif i == 10:
            type_name, material = "", SOFTWOOD
            inputs = {**FLOOR_LOADS, "Species": "Douglas Fir-Larch", "Grade": "No.2"}
        else:
            type_name, material, inputs = "", DFL2, FLOOR_LOADS
        joists.append(
            MemberSpec(
                name=f"J-U-{i:02d}",
                ifc_class="IfcBeam",
                predefined_type="JOIST",
                storey="Upper Floor",
                profile=P2X10,
                start=(0.0, y, UPPER_JOIST_Z),
                end=(156.0, y, UPPER_JOIST_Z),
                description="Floor joist of the flat, west bay",
                type_name=type_name,
                material=material,
                inputs=inputs,
                beam_common={"Span": 154.5} if i == 5 else {},
                in_ifc2x3=i in (1, 2, 7),
            )
        )
    return joists


OTHER_MEMBERS = (
    MemberSpec(
        "J-U-11", "IfcBeam", "JOIST", "Upper Floor", P2X6,
        (144.0, 232.0, 120.0 - P2X6.d / 2), (312.0, 232.0, 120.0 - P2X6.d / 2),
        "Infill joist over the kiln bay, where the bearing line steps west (undersized)",
        material=DFL2, inputs=FLOOR_LOADS, in_ifc2x3=True,
    ),
    MemberSpec(
        "J-U-12", "IfcBeam", "JOIST", "Upper Floor", P2X10,
        (156.0, 16.0, UPPER_JOIST_Z), (312.0, 16.0, UPPER_JOIST_Z),
        "Floor joist of the flat, east bay, with a grade no table knows",
        material=DFL_UNKNOWN, inputs={**FLOOR_LOADS, "Grade": "Premium Select X"},
    ),
    MemberSpec(
        "TJ-U-01", "IfcBeam", "JOIST", "Upper Floor", P2X10,
        (156.0, 96.0, UPPER_JOIST_Z), (312.0, 96.0, UPPER_JOIST_Z),
        "Trimmer joist at the stair opening; its loads are not entered yet",
        material=DFL2,
    ),
    MemberSpec(
        "FB-U-01", "IfcBeam", "BEAM", "Upper Floor", P2PLY_2X12,
        (192.0, 96.75, 120.0 - P2PLY_2X12.d / 2), (192.0, 216.75, 120.0 - P2PLY_2X12.d / 2),
        "Flush beam at the stair opening, carrying 10 ft tail joists in hangers",
        material=DFL1,
        inputs={
            "DeadLoad": 50.0, "LiveLoad": 200.0, "SelfWeightIncluded": True, "UnbracedLength": 16.0,
            "LiveDeflectionLimit": 480.0, "TotalDeflectionLimit": 360.0,
        },
    ),
    MemberSpec(
        "HDR-G-01", "IfcBeam", "LINTEL", "Ground Floor", P2PLY_2X8,
        (60.0, 1.75, 100.0 - P2PLY_2X8.d / 2), (120.0, 1.75, 100.0 - P2PLY_2X8.d / 2),
        "Header over the 5 ft window in the south (eaves) wall",
        material=DFL2,
        inputs={
            "DeadLoad": 160.0, "SnowLoad": 162.5, "SelfWeightIncluded": True, "BearingLength": 3.0,
            "ContinuouslyBraced": True,
        },
    ),
    MemberSpec(
        "HDR-G-02", "IfcBeam", "LINTEL", "Ground Floor", P2PLY_2X6,
        (310.25, 72.0, 100.0 - P2PLY_2X6.d / 2), (310.25, 168.0, 100.0 - P2PLY_2X6.d / 2),
        "Header over the 8 ft workshop door in the east wall (undersized)",
        material=DFL2,
        inputs={
            "DeadLoad": 150.0, "LiveLoad": 260.0, "SelfWeightIncluded": True, "BearingLength": 3.0,
            "ContinuouslyBraced": True,
        },
    ),
    MemberSpec(
        "SB-G-01", "IfcBeam", "BEAM", "Ground Floor", P_STEEL,
        (156.0, 24.0, 110.75 - P_STEEL.d / 2), (156.0, 168.0, 110.75 - P_STEEL.d / 2),
        "Steel beam over the wide opening in the central bearing wall",
        material=STEEL, inputs={"DeadLoad": 130.0, "LiveLoad": 520.0}, in_ifc2x3=True,
    ),
    MemberSpec(
        "P-G-01", "IfcMember", "POST", "Ground Floor", P6X6,
        (156.0, 168.0, 0.0), (156.0, 168.0, 110.75 - P_STEEL.d),
        "Post under the north end of the steel beam",
        material=DFL1,
    ),
    MemberSpec(
        "FW-G-01", "IfcBeam", "BEAM", "Ground Floor", P2X8,
        (24.0, 200.0, 12.0 + P2X8.d / 2), (120.0, 200.0, 12.0 + P2X8.d / 2),
        "Temporary formwork beam of the kiln plinth",
        material=DFL2, inputs={"DeadLoad": 75.0, "LiveLoad": 50.0}, beam_common={"LoadBearing": False},
    ),
)


def roof_rafters() -> list:
    """R-R-01 to R-R-06: 2x8 Hem-Fir No.2 at 24 in, 6:12, plate (y = 0) to ridge (y = 10 ft)."""
    return [
        MemberSpec(
            name=f"R-R-{i:02d}",
            ifc_class="IfcMember",
            predefined_type="RAFTER",
            storey="Roof",
            profile=P2X8,
            start=(24.0 * i, 0.0, 216.0),
            end=(24.0 * i, 120.0, 276.0),
            description="Rafter of the south roof slope, 6:12",
            type_name=RAFTER_TYPE.name,
            in_ifc2x3=i == 1,
        )
        for i in range(1, 7)
    ]


def catalogue() -> list:
    """Every member of Quillfeather Studio, in the order they are written."""
    return [*upper_floor_joists(), *OTHER_MEMBERS, *roof_rafters()]


# ------------------------------------------------------------------------------------------
# Unit systems
# ------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class UnitSystem:
    """How one model writes values: the factor from inch, plf and psf to the model's units."""

    file_name: str
    schema: str
    per_inch: float
    per_plf: float
    per_psf: float
    units: str  # "imperial", "metric" or "si_metre"

    def convert(self, kind: str, value):
        """A catalogue value (inch, plf, psf, or a plain value) in this model's units."""
        factor = {"length": self.per_inch, "linear_force": self.per_plf, "planar_force": self.per_psf}.get(kind)
        return tidy(value * factor) if factor else value


def tidy(value: float) -> float:
    """``value`` to 15 significant digits, so that 24 in is written 609.6 mm, not 609.5999999999999."""
    return float(f"{value:.15g}")


IMPERIAL = UnitSystem("quillfeather_imperial.ifc", "IFC4", 1 / 12, 1.0, 1.0, "imperial")
METRIC = UnitSystem(
    "quillfeather_metric.ifc", "IFC4", INCH_M * 1000, LBF_N / FOOT_M / 1000, LBF_N / FOOT_M**2 / 1000, "metric"
)
IFC2X3 = UnitSystem("quillfeather_ifc2x3.ifc", "IFC2X3", INCH_M, LBF_N / FOOT_M, LBF_N / FOOT_M**2, "si_metre")
MODELS = (IMPERIAL, METRIC, IFC2X3)


def conversion_unit(model, unit_type, name, exponents, factor, si_name, measure):
    """An IfcConversionBasedUnit: ``factor`` SI units (``si_name``) per unit."""
    si_unit = model.create_entity("IfcSIUnit", UnitType=unit_type, Name=si_name)
    value = model.create_entity(measure, factor)
    return model.create_entity(
        "IfcConversionBasedUnit",
        Dimensions=model.create_entity("IfcDimensionalExponents", *exponents),
        UnitType=unit_type,
        Name=name,
        ConversionFactor=model.create_entity("IfcMeasureWithUnit", ValueComponent=value, UnitComponent=si_unit),
    )


def derived_unit(model, unit_type, elements):
    return ifcopenshell.api.unit.add_derived_unit(model, unit_type, None, elements)


def add_imperial_units(model) -> None:
    """foot, ft2, ft3, degree, pound-force, lbf/ft and lbf/ft2 as the project units."""
    foot = conversion_unit(model, "LENGTHUNIT", "foot", (1, 0, 0, 0, 0, 0, 0), FOOT_M, "METRE", "IfcLengthMeasure")
    area = conversion_unit(
        model, "AREAUNIT", "square foot", (2, 0, 0, 0, 0, 0, 0), 0.09290304, "SQUARE_METRE", "IfcAreaMeasure"
    )
    volume = conversion_unit(
        model, "VOLUMEUNIT", "cubic foot", (3, 0, 0, 0, 0, 0, 0), 0.028316846592, "CUBIC_METRE", "IfcVolumeMeasure"
    )
    angle = conversion_unit(
        model, "PLANEANGLEUNIT", "degree", (0, 0, 0, 0, 0, 0, 0), math.pi / 180, "RADIAN", "IfcPlaneAngleMeasure"
    )
    lbf = conversion_unit(model, "FORCEUNIT", "pound-force", (1, 1, -2, 0, 0, 0, 0), LBF_N, "NEWTON", "IfcForceMeasure")
    plf = derived_unit(model, "LINEARFORCEUNIT", {lbf: 1, foot: -1})
    psf = derived_unit(model, "PLANARFORCEUNIT", {lbf: 1, foot: -2})
    ifcopenshell.api.unit.assign_unit(model, units=[foot, area, volume, angle, lbf, plf, psf])


def add_metric_units(model) -> None:
    """mm, m2, m3, radian, kN, kN/m and kN/m2 (kPa) as the project units."""
    add_si = ifcopenshell.api.unit.add_si_unit
    mm = add_si(model, "LENGTHUNIT", "MILLI")
    area = add_si(model, "AREAUNIT")
    volume = add_si(model, "VOLUMEUNIT")
    angle = add_si(model, "PLANEANGLEUNIT")
    kilonewton = add_si(model, "FORCEUNIT", "KILO")
    metre = add_si(model, "LENGTHUNIT")  # only inside the derived units
    kn_per_m = derived_unit(model, "LINEARFORCEUNIT", {kilonewton: 1, metre: -1})
    kpa = derived_unit(model, "PLANARFORCEUNIT", {kilonewton: 1, metre: -2})
    ifcopenshell.api.unit.assign_unit(model, units=[mm, area, volume, angle, kilonewton, kn_per_m, kpa])


def add_si_metre_units(model) -> None:
    """metre, m2, m3 and radian only: force, line load and area load stay at the SI defaults."""
    add_si = ifcopenshell.api.unit.add_si_unit
    units = [add_si(model, kind) for kind in ("LENGTHUNIT", "AREAUNIT", "VOLUMEUNIT", "PLANEANGLEUNIT")]
    ifcopenshell.api.unit.assign_unit(model, units=units)


ADD_UNITS = {"imperial": add_imperial_units, "metric": add_metric_units, "si_metre": add_si_metre_units}

# ------------------------------------------------------------------------------------------
# Geometry: members placed in world coordinates, extruded along their local z axis
# ------------------------------------------------------------------------------------------


def _unit_vector(v):
    length = math.sqrt(sum(c * c for c in v))
    return tuple(c / length for c in v)


def _cross(a, b):
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


def member_axes(start, end):
    """Local z along the member, local x horizontal across it, so local y (the depth) points up."""
    z_axis = _unit_vector(tuple(e - s for s, e in zip(start, end)))
    if abs(z_axis[2]) > 0.999999:  # vertical member: any horizontal x will do
        return z_axis, (1.0, 0.0, 0.0)
    return z_axis, _unit_vector(_cross((0.0, 0.0, 1.0), z_axis))


class GeometryWriter:
    """Writes placements, bodies and axes of members into one model, in its length unit."""

    def __init__(self, model, units: UnitSystem):
        self.model = model
        self.units = units
        self.is_ifc2x3 = model.schema == "IFC2X3"
        root = ifcopenshell.api.context.add_context(model, context_type="Model")
        self.body = ifcopenshell.api.context.add_context(
            model, context_type="Model", context_identifier="Body", target_view="MODEL_VIEW", parent=root
        )
        self.axis = ifcopenshell.api.context.add_context(
            model, context_type="Model", context_identifier="Axis", target_view="GRAPH_VIEW", parent=root
        )
        self.origin = self.point((0.0, 0.0, 0.0))
        self.profiles = {}

    def length(self, inches: float) -> float:
        return self.units.convert("length", inches)

    def point(self, coords_in_model_units):
        return self.model.create_entity("IfcCartesianPoint", [float(c) for c in coords_in_model_units])

    def direction(self, ratios):
        return self.model.create_entity("IfcDirection", [float(c) for c in ratios])

    def world_placement(self, location_in=(0.0, 0.0, 0.0), z_axis=None, x_axis=None):
        position = self.model.create_entity(
            "IfcAxis2Placement3D",
            Location=self.point([self.length(c) for c in location_in]),
            Axis=self.direction(z_axis) if z_axis else None,
            RefDirection=self.direction(x_axis) if x_axis else None,
        )
        return self.model.create_entity("IfcLocalPlacement", PlacementRelTo=None, RelativePlacement=position)

    def profile(self, profile: Profile):
        """One profile definition per section, shared by the members that use it; a built-up
        section is an IfcCompositeProfileDef of its plies side by side."""
        if profile.label not in self.profiles:
            if profile.is_i_shape:
                entity = self.model.create_entity(
                    "IfcIShapeProfileDef", ProfileType="AREA", ProfileName=profile.name, Position=self.position_2d(),
                    OverallWidth=self.length(profile.b), OverallDepth=self.length(profile.d),
                    WebThickness=self.length(profile.web), FlangeThickness=self.length(profile.flange),
                )
            elif profile.plies == 1:
                entity = self.rectangle(profile, 0.0)
            else:
                first_centre = -(profile.plies - 1) / 2 * profile.b
                plies = [self.rectangle(profile, first_centre + i * profile.b) for i in range(profile.plies)]
                entity = self.model.create_entity(
                    "IfcCompositeProfileDef", ProfileType="AREA", ProfileName=profile.label, Profiles=plies
                )
            self.profiles[profile.label] = entity
        return self.profiles[profile.label]

    def position_2d(self, x_in: float = 0.0):
        location = self.model.create_entity("IfcCartesianPoint", [self.length(x_in), 0.0])
        return self.model.create_entity("IfcAxis2Placement2D", Location=location)

    def rectangle(self, profile: Profile, x_in: float):
        """One ply b x d centred ``x_in`` across the member from its axis."""
        return self.model.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName=profile.name, Position=self.position_2d(x_in),
            XDim=self.length(profile.b), YDim=self.length(profile.d),
        )

    def place_member(self, element, spec: MemberSpec) -> None:
        """Placement at the start of the axis; 'Body' extrusion and 'Axis' polyline along local z."""
        z_axis, x_axis = member_axes(spec.start, spec.end)
        element.ObjectPlacement = self.world_placement(spec.start, z_axis, x_axis)
        length = self.length(math.dist(spec.start, spec.end))
        solid = self.model.create_entity(
            "IfcExtrudedAreaSolid",
            SweptArea=self.profile(spec.profile),
            Position=self.model.create_entity("IfcAxis2Placement3D", Location=self.origin) if self.is_ifc2x3 else None,
            ExtrudedDirection=self.direction((0.0, 0.0, 1.0)),
            Depth=length,
        )
        axis_line = self.model.create_entity("IfcPolyline", [self.origin, self.point((0.0, 0.0, length))])
        body = self.model.create_entity(
            "IfcShapeRepresentation", self.body, "Body", "SweptSolid", [solid]
        )
        axis = self.model.create_entity(
            "IfcShapeRepresentation", self.axis, "Axis", "GeometricCurveSet" if self.is_ifc2x3 else "Curve3D",
            [axis_line],
        )
        element.Representation = self.model.create_entity("IfcProductDefinitionShape", Representations=[axis, body])


# ------------------------------------------------------------------------------------------
# The model
# ------------------------------------------------------------------------------------------


class SampleBuilder:
    """Builds one Quillfeather Studio model in the given unit system. Subclasses building other
    scenarios set the class attributes below to their own names."""

    preprocessor = PREPROCESSOR  # the header's preprocessor and originating system
    site_name = "Quillfeather Studio site"
    building_name = PROJECT_NAME
    address_lines = ADDRESS_LINES
    town = TOWN
    storey_levels = STOREYS  # (name, elevation in inches)

    def __init__(self, units: UnitSystem):
        self.units = units
        self.model = ifcopenshell.api.project.create_file(version=units.schema)
        self.is_ifc2x3 = units.schema == "IFC2X3"
        if self.is_ifc2x3:
            self.owner_user, self.owner_application = self.add_owner()
        self.project = ifcopenshell.api.root.create_entity(self.model, "IfcProject", name=PROJECT_NAME)
        self.project.Description = PROJECT_DESCRIPTION
        ADD_UNITS[units.units](self.model)
        self.geometry = GeometryWriter(self.model, units)
        self.storeys = self.add_spatial_structure()
        self.materials = {}
        self.types = {}

    def add_owner(self):
        """IFC2X3 requires owner histories: a fixed invented user and application."""
        person = self.model.create_entity("IfcPerson", FamilyName="Builder", GivenName="Sample")
        organization = self.model.create_entity("IfcOrganization", Name=ORGANIZATION)
        user = self.model.create_entity("IfcPersonAndOrganization", ThePerson=person, TheOrganization=organization)
        application = self.model.create_entity(
            "IfcApplication", ApplicationDeveloper=organization, Version="1",
            ApplicationFullName=AUTHOR, ApplicationIdentifier="ifccheck-samples",
        )
        return user, application

    def add_spatial_structure(self) -> dict:
        site = ifcopenshell.api.root.create_entity(self.model, "IfcSite", name=self.site_name)
        building = ifcopenshell.api.root.create_entity(self.model, "IfcBuilding", name=self.building_name)
        building.BuildingAddress = self.model.create_entity(
            "IfcPostalAddress", Purpose="SITE", AddressLines=self.address_lines, Town=self.town
        )
        ifcopenshell.api.aggregate.assign_object(self.model, products=[site], relating_object=self.project)
        ifcopenshell.api.aggregate.assign_object(self.model, products=[building], relating_object=site)
        # placements are set after each assignment, which would make them relative to the container
        site.ObjectPlacement = self.geometry.world_placement()
        building.ObjectPlacement = self.geometry.world_placement()
        storeys = {}
        for name, elevation in self.storey_levels:
            storey = ifcopenshell.api.root.create_entity(self.model, "IfcBuildingStorey", name=name)
            ifcopenshell.api.aggregate.assign_object(self.model, products=[storey], relating_object=building)
            storey.Elevation = self.geometry.length(elevation)
            storey.ObjectPlacement = self.geometry.world_placement((0.0, 0.0, elevation))
            storeys[name] = storey
        return storeys

    def material(self, spec: Material):
        if spec.name not in self.materials:
            material = ifcopenshell.api.material.add_material(
                self.model, name=spec.name, category=None if self.is_ifc2x3 else spec.category
            )
            if spec.species and not self.is_ifc2x3:
                pset = ifcopenshell.api.pset.add_pset(self.model, product=material, name="Pset_MaterialWood")
                ifcopenshell.api.pset.edit_pset(
                    self.model, pset=pset,
                    properties={
                        "Species": self.model.create_entity("IfcLabel", spec.species),
                        "StrengthGrade": self.model.create_entity("IfcLabel", spec.grade),
                    },
                )
            self.materials[spec.name] = material
        return self.materials[spec.name]

    def add_design_input(self, product, inputs: dict) -> None:
        """The ifccheck_DesignInput property set, each value in this model's unit and measure type."""
        properties = {}
        for name, value in inputs.items():
            kind = INPUT_KINDS[name]
            properties[name] = self.model.create_entity(MEASURE_OF_KIND[kind], self.units.convert(kind, value))
        pset = ifcopenshell.api.pset.add_pset(self.model, product=product, name=INPUT_PSET)
        ifcopenshell.api.pset.edit_pset(self.model, pset=pset, properties=properties)

    def add_beam_common(self, product, values: dict) -> None:
        properties = {}
        if "Span" in values:
            span = self.geometry.length(values["Span"])
            properties["Span"] = self.model.create_entity("IfcPositiveLengthMeasure", span)
        if "LoadBearing" in values:
            properties["LoadBearing"] = self.model.create_entity("IfcBoolean", values["LoadBearing"])
        pset = ifcopenshell.api.pset.add_pset(self.model, product=product, name="Pset_BeamCommon")
        ifcopenshell.api.pset.edit_pset(self.model, pset=pset, properties=properties)

    def joist_inputs(self, inputs: dict, predefined_type: str) -> dict:
        """IFC2X3 has no JOIST type, so its joists say outright what that type implies: repetitive
        members with the compression edge braced by the floor sheathing."""
        if self.is_ifc2x3 and predefined_type == "JOIST" and inputs:
            return {**inputs, "RepetitiveMember": True, "ContinuouslyBraced": True}
        return inputs

    def add_type(self, spec: TypeSpec):
        predefined = spec.predefined_type
        if self.is_ifc2x3 and predefined == "JOIST":
            element_type = ifcopenshell.api.root.create_entity(
                self.model, spec.ifc_class, predefined_type="USERDEFINED", name=spec.name
            )
            element_type.ElementType = "JOIST"
        else:
            element_type = ifcopenshell.api.root.create_entity(
                self.model, spec.ifc_class, predefined_type=predefined, name=spec.name
            )
        if not self.is_ifc2x3:
            ifcopenshell.api.project.assign_declaration(
                self.model, definitions=[element_type], relating_context=self.project
            )
        if spec.material:
            ifcopenshell.api.material.assign_material(
                self.model, products=[element_type], material=self.material(spec.material)
            )
        if spec.inputs:
            self.add_design_input(element_type, self.joist_inputs(spec.inputs, predefined))
        if spec.beam_common:
            self.add_beam_common(element_type, spec.beam_common)
        self.types[spec.name] = element_type
        return element_type

    def add_member(self, spec: MemberSpec):
        if self.is_ifc2x3:  # no PredefinedType on IFC2X3 occurrences: say it in ObjectType
            element = ifcopenshell.api.root.create_entity(self.model, spec.ifc_class, name=spec.name)
            element.ObjectType = spec.predefined_type
        else:
            element = ifcopenshell.api.root.create_entity(
                self.model, spec.ifc_class, predefined_type=spec.predefined_type, name=spec.name
            )
        element.Description = spec.description
        ifcopenshell.api.spatial.assign_container(
            self.model, products=[element], relating_structure=self.storeys[spec.storey]
        )
        self.geometry.place_member(element, spec)  # after the container, so the placement stays in world coordinates
        if spec.type_name:
            ifcopenshell.api.type.assign_type(
                self.model, related_objects=[element], relating_type=self.types[spec.type_name]
            )
        if spec.material:
            ifcopenshell.api.material.assign_material(
                self.model, products=[element], material=self.material(spec.material)
            )
        if spec.inputs:
            self.add_design_input(element, self.joist_inputs(spec.inputs, spec.predefined_type))
        if spec.beam_common:
            self.add_beam_common(element, spec.beam_common)
        return element

    def build(self, members: list) -> ifcopenshell.file:
        used_types = {m.type_name for m in members}
        for spec in TYPES:
            if spec.name in used_types:
                self.add_type(spec)
        for spec in members:
            self.add_member(spec)
        if self.is_ifc2x3:
            self.fix_owner_history()
        self.sort_unordered_sets()
        self.fix_global_ids()
        self.fix_header()
        return self.model

    def fix_owner_history(self) -> None:
        """Replace the owner histories the api stamped with the clock by one fixed history."""
        fixed = self.model.create_entity(
            "IfcOwnerHistory", OwningUser=self.owner_user, OwningApplication=self.owner_application,
            State="READWRITE", ChangeAction="ADDED", CreationDate=CREATION_DATE,
        )
        for rooted in self.model.by_type("IfcRoot"):
            rooted.OwnerHistory = fixed
        for history in self.model.by_type("IfcOwnerHistory"):
            if history != fixed:
                self.model.remove(history)

    def sort_unordered_sets(self) -> None:
        """Write the members of every unordered set (units, related objects) in id order: the api
        builds them from Python sets, whose order may change from one run to the next."""
        for unit_assignment in self.model.by_type("IfcUnitAssignment"):
            unit_assignment.Units = sorted(unit_assignment.Units, key=lambda e: e.id())
        for rel in self.model.by_type("IfcRelationship"):
            for attribute in ("RelatedObjects", "RelatedElements", "RelatedDefinitions"):
                if hasattr(rel, attribute):
                    setattr(rel, attribute, sorted(getattr(rel, attribute), key=lambda e: e.id()))

    def fix_global_ids(self) -> None:
        """GlobalIds from uuid5 of the file and the entity: named objects by class and name,
        relationships and property sets by their place in the file."""
        for index, rooted in enumerate(sorted(self.model.by_type("IfcRoot"), key=lambda e: e.id())):
            if rooted.is_a("IfcObjectDefinition"):
                key = f"{self.units.file_name}/{rooted.is_a()}/{rooted.Name}"
            else:
                key = f"{self.units.file_name}/{rooted.is_a()}/{index}"
            rooted.GlobalId = ifcopenshell.guid.compress(uuid.uuid5(GUID_NAMESPACE, key).hex)

    def fix_header(self) -> None:
        header = self.model.header
        header.file_description.description = (
            ("ViewDefinition [CoordinationView_V2.0]",) if self.is_ifc2x3 else ("ViewDefinition [DesignTransferView]",)
        )
        header.file_name.name = self.units.file_name
        header.file_name.time_stamp = TIME_STAMP
        header.file_name.author = (AUTHOR,)
        header.file_name.organization = (ORGANIZATION,)
        header.file_name.preprocessor_version = self.preprocessor
        header.file_name.originating_system = self.preprocessor
        header.file_name.authorization = "none"


def build_model(units: UnitSystem) -> ifcopenshell.file:
    """Quillfeather Studio in one unit system (the IFC2X3 file holds only its subset)."""
    members = catalogue()
    if units.schema == "IFC2X3":
        members = [m for m in members if m.in_ifc2x3]
    return SampleBuilder(units).build(members)


def build_all(out_dir: Path) -> list:
    """Write the three sample models into ``out_dir``; returns their paths."""
    out_dir = Path(out_dir)
    out_dir.mkdir(parents=True, exist_ok=True)
    paths = []
    for units in MODELS:
        path = out_dir / units.file_name
        build_model(units).write(str(path))
        paths.append(path)
    return paths


def main(argv=None) -> None:
    parser = argparse.ArgumentParser(description="Build the Quillfeather Studio sample IFC models.")
    parser.add_argument("out_dir", nargs="?", default=str(HERE), help="folder to write into (default: this folder)")
    args = parser.parse_args(argv)
    for path in build_all(Path(args.out_dir)):
        print(path)


if __name__ == "__main__":
    main()
