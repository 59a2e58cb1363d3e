"""Rectangular cross-sections of members: where the model states them and which side is the depth.

A section comes from the material profile set (occurrence usage or type), else from the body's
extrusion, else from base quantities (Width and Depth or Height). The depth d is the dimension
that lies in the vertical plane: the world directions of the profile's axes decide it. Where no
placement says otherwise the profile's YDim is the depth (the IFC convention). The placements and
bodies these need are read here too (ShapeReader).
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass
from typing import Optional

import ifcopenshell
import ifcopenshell.util.placement as ifc_placement
import numpy as np

from ..errors import ModelReadError
from ..model import Section
from .units import property_unit_to_core

#: quantity sets that hold a member's cross-section sizes, in the order they are trusted
QUANTITY_SETS = ("Qto_BeamBaseQuantities", "Qto_MemberBaseQuantities", "BaseQuantities")

_SAME_SIZE = 1e-6  # relative tolerance for two profile sizes to be the same rectangle
_NOT_BODY = {"Axis", "Box", "FootPrint", "Annotation", "Profile", "Reference", "Clearance"}
_IDENTITY = np.eye(4)
_IDENTITY.flags.writeable = False  # shared; every use makes a new matrix from it
_EXTRUSIONS = frozenset({"IfcExtrudedAreaSolid", "IfcExtrudedAreaSolidTapered"})
_BOOLEANS = frozenset({"IfcBooleanResult", "IfcBooleanClippingResult"})
#: solid rectangles: IfcRectangleProfileDef and its rounded subtype (the hollow subtype is a tube)
_RECTANGLES = frozenset({"IfcRectangleProfileDef", "IfcRoundedRectangleProfileDef"})

# What every member has (placement, representations, body solid) is read by attribute position:
# entity.get_argument(i) is several times faster than entity.Name, which looks the name up in the
# schema on each call (entity[i] adds a bounds check in Python). A subtype keeps its supertype's
# attributes first, so a position holds for subtypes too; check_positions confirms every one
# against the model's schema. Profiles are read once each as get_info dicts, and each placement
# and pair of directions once per model.
_FIXED: list = []  # (class, attribute, position) of each attribute read by position


def fixed_position(ifc_class: str, name: str, position: int) -> int:
    """``position``, where attribute ``name`` of ``ifc_class`` (and its subtypes) is read; see check_positions."""
    _FIXED.append((ifc_class, name, position))
    return position


@functools.lru_cache(maxsize=None)
def attribute_position(schema: str, ifc_class: str, name: str) -> Optional[int]:
    """Position of attribute ``name`` in entities of ``ifc_class`` in ``schema``; None if the class has none."""
    declaration = ifcopenshell.schema_by_name(schema).declaration_by_name(ifc_class)
    names = [attribute.name() for attribute in declaration.all_attributes()]
    return names.index(name) if name in names else None


@functools.lru_cache(maxsize=None)
def check_positions(schema: str) -> None:
    """Raise ModelReadError unless every fixed_position holds in ``schema``."""
    for ifc_class, name, position in _FIXED:
        if attribute_position(schema, ifc_class, name) != position:
            raise ModelReadError(
                f"schema {schema} does not have {ifc_class}.{name} at position {position}; ifccheck cannot read it"
            )


_PLACEMENT_REL_TO = fixed_position("IfcLocalPlacement", "PlacementRelTo", 0)
_RELATIVE_PLACEMENT = fixed_position("IfcLocalPlacement", "RelativePlacement", 1)
_LOCATION = fixed_position("IfcPlacement", "Location", 0)
_AXIS = fixed_position("IfcAxis2Placement3D", "Axis", 1)
_REF_DIRECTION = {
    "IfcAxis2Placement3D": fixed_position("IfcAxis2Placement3D", "RefDirection", 2),
    "IfcAxis2Placement2D": fixed_position("IfcAxis2Placement2D", "RefDirection", 1),
}
_COORDINATES = fixed_position("IfcCartesianPoint", "Coordinates", 0)
_DIRECTION_RATIOS = fixed_position("IfcDirection", "DirectionRatios", 0)
REPRESENTATIONS = fixed_position("IfcProductRepresentation", "Representations", 2)
_IDENTIFIER = fixed_position("IfcRepresentation", "RepresentationIdentifier", 1)
ITEMS = fixed_position("IfcRepresentation", "Items", 3)
_SWEPT_AREA = fixed_position("IfcExtrudedAreaSolid", "SweptArea", 0)
_POSITION = fixed_position("IfcExtrudedAreaSolid", "Position", 1)
_EXTRUDED_DIRECTION = fixed_position("IfcExtrudedAreaSolid", "ExtrudedDirection", 2)
_DEPTH = fixed_position("IfcExtrudedAreaSolid", "Depth", 3)


@dataclass(frozen=True)
class Extrusion:
    """An IfcExtrudedAreaSolid of a member's body, its profile and the world matrix of its Position."""

    solid: ifcopenshell.entity_instance
    profile: ifcopenshell.entity_instance  # its SweptArea
    matrix: np.ndarray

    def vector(self) -> np.ndarray:
        """The extrusion (direction times Depth) in world coordinates, model length units."""
        ratios = self.solid.get_argument(_EXTRUDED_DIRECTION).get_argument(_DIRECTION_RATIOS)
        direction = np.array(ratios, dtype=float)
        return self.matrix[:3, :3] @ (direction * (float(self.solid.get_argument(_DEPTH)) / _length(direction)))


@dataclass(frozen=True)
class Body:
    """The body representation and its first extrusion, if any."""

    representation: Optional[ifcopenshell.entity_instance]
    extrusion: Optional[Extrusion]

    def description(self) -> str:
        """What the body is made of, for messages, e.g. 'body IfcFacetedBrep'."""
        if self.representation is None:
            return "no body representation"
        classes = sorted({name for item in self.representation.Items for name in _item_classes(item)})
        return f"body {', '.join(classes) or 'without items'}"


@dataclass(frozen=True)
class SectionReading:
    section: Optional[Section]
    problem: str = ""


@dataclass(frozen=True)
class _Rectangle:
    """A profile as read once: its sizes and own placement, or why it is no usable rectangle."""

    x_dim: float
    y_dim: float
    frame: np.ndarray  # the profile's Position
    name: str
    problem: str  # "" for a solid rectangle of positive sizes

    def same_size(self, other: "_Rectangle") -> bool:
        return all(
            math.isclose(a, b, rel_tol=_SAME_SIZE)
            for a, b in zip(sorted((self.x_dim, self.y_dim)), sorted((other.x_dim, other.y_dim)))
        )


def identified(representations) -> list:
    """(RepresentationIdentifier, representation) of each representation of a product shape."""
    return [(representation.get_argument(_IDENTIFIER), representation) for representation in representations]


class ShapeReader:
    """Reads members' placements and bodies, each placement and each pair of directions once."""

    def __init__(self) -> None:
        self._placements: dict = {}  # IfcLocalPlacement id -> world matrix
        self._frames: dict = {}  # (Axis id, RefDirection id) -> frame matrix (see _frame)

    def object_matrix(self, placement) -> np.ndarray:
        """World matrix of an IfcLocalPlacement chain (model length units)."""
        if placement is None:
            return _IDENTITY
        key = placement.id()
        matrix = self._placements.get(key)
        if matrix is None:
            if not placement.is_a("IfcLocalPlacement"):
                raise ModelReadError(f"object placement {placement.is_a()} is not supported")
            relative_to = placement.get_argument(_PLACEMENT_REL_TO)
            parent = self.object_matrix(relative_to) if relative_to is not None else _IDENTITY
            matrix = parent @ self.placement_matrix(placement.get_argument(_RELATIVE_PLACEMENT))
            self._placements[key] = matrix
        return matrix

    def placement_matrix(self, placement) -> np.ndarray:
        """4x4 matrix of an IfcAxis2Placement3D or 2D entity, as :func:`axis_matrix` gives for its dict."""
        kind, location = placement.is_a(), placement.get_argument(_LOCATION)
        _check_placement(kind, location.is_a())
        axis = placement.get_argument(_AXIS) if kind == "IfcAxis2Placement3D" else None
        reference = placement.get_argument(_REF_DIRECTION[kind])
        key = (axis.id() if axis is not None else None, reference.id() if reference is not None else None)
        if key not in self._frames:
            self._frames[key] = _frame(_axes(_ratios(axis), _ratios(reference), placement.id()))
        return _located(self._frames[key], location.get_argument(_COORDINATES))

    def body(self, representations: list, object_matrix: np.ndarray) -> Body:
        """The body representation and its first IfcExtrudedAreaSolid (also inside mapped items and booleans).

        ``representations`` are the (identifier, representation) pairs of :func:`identified`.
        """
        representation = _body_representation(representations)
        if representation is None:
            return Body(None, None)
        for item in representation.get_argument(ITEMS):
            extrusion = self._extrusion_in(item, object_matrix)
            if extrusion is not None:
                return Body(representation, extrusion)
        return Body(representation, None)

    def _extrusion_in(self, item, matrix: np.ndarray) -> Optional[Extrusion]:
        kind = item.is_a()
        if kind in _EXTRUSIONS:
            position = item.get_argument(_POSITION)
            if position is not None:
                matrix = matrix @ self.placement_matrix(position)
            return Extrusion(item, item.get_argument(_SWEPT_AREA), matrix)
        if kind in _BOOLEANS:
            return self._extrusion_in(item.FirstOperand, matrix)
        if kind == "IfcMappedItem":
            inner = matrix @ _mapped_item_matrix(item)
            for sub_item in item.MappingSource.MappedRepresentation.Items:
                extrusion = self._extrusion_in(sub_item, inner)
                if extrusion is not None:
                    return extrusion
        return None


def _body_representation(representations: list):
    for identifier, representation in representations:
        if identifier == "Body":
            return representation
    for identifier, representation in representations:
        if identifier not in _NOT_BODY:
            return representation
    return None


def _item_classes(item) -> list:
    """Classes of a representation item, looking inside mapped items."""
    if item.is_a("IfcMappedItem"):
        return [name for sub_item in item.MappingSource.MappedRepresentation.Items for name in _item_classes(sub_item)]
    return [item.is_a()]


def _mapped_item_matrix(item) -> np.ndarray:
    matrix = ifc_placement.get_mappeditem_transformation(item)  # None for a 2D mapping target
    return matrix if matrix is not None else axis_matrix(item.MappingSource.MappingOrigin.get_info(recursive=True))


def axis_matrix(placement: Optional[dict]) -> np.ndarray:
    """4x4 matrix of an IfcAxis2Placement3D or 2D given as a get_info dict (identity for None).

    The x axis is RefDirection projected normal to the z axis, as IFC defines it.
    """
    if placement is None:
        return _IDENTITY
    location = placement["Location"]
    _check_placement(placement["type"], location["type"])
    axis, reference = placement.get("Axis"), placement["RefDirection"]
    ratios = [direction["DirectionRatios"] if direction is not None else None for direction in (axis, reference)]
    return _located(_frame(_axes(*ratios, placement["id"])), location["Coordinates"])


def _check_placement(kind: str, location_kind: str) -> None:
    if kind not in _REF_DIRECTION or location_kind != "IfcCartesianPoint":
        raise ModelReadError(f"placement {kind} at {location_kind} is not supported")


def _ratios(direction) -> Optional[tuple]:
    return direction.get_argument(_DIRECTION_RATIOS) if direction is not None else None


def _axes(axis: Optional[tuple], reference: Optional[tuple], placement_id: int) -> tuple:
    """Unit (x, y, z) axes of a placement from its Axis and RefDirection ratios (IFC's defaults for None)."""
    z = _unit(axis) if axis is not None else (0.0, 0.0, 1.0)
    ref = (*reference, 0.0)[:3] if reference is not None else (1.0, 0.0, 0.0)
    if z is None:
        raise ModelReadError(f"placement #{placement_id} has a zero-length Axis")
    along_z = sum(r * c for r, c in zip(ref, z))
    x = _unit([r - along_z * c for r, c in zip(ref, z)])
    if x is None:
        raise ModelReadError(f"placement #{placement_id} has its RefDirection along its Axis")
    y = (z[1] * x[2] - z[2] * x[1], z[2] * x[0] - z[0] * x[2], z[0] * x[1] - z[1] * x[0])
    return x, y, z


def _frame(axes: tuple) -> np.ndarray:
    """4x4 matrix of unit axes (x, y, z) at the origin."""
    x, y, z = axes
    return np.array(
        (
            (x[0], y[0], z[0], 0.0),
            (x[1], y[1], z[1], 0.0),
            (x[2], y[2], z[2], 0.0),
            (0.0, 0.0, 0.0, 1.0),
        )
    )


def _located(frame: np.ndarray, location: tuple) -> np.ndarray:
    """A new matrix of ``frame`` moved to a location (2D or 3D coordinates)."""
    coordinates = (*location, 0.0)[:3]
    matrix = frame.copy()
    matrix[0, 3], matrix[1, 3], matrix[2, 3] = coordinates[0], coordinates[1], coordinates[2]
    return matrix


def _unit(vector) -> Optional[tuple]:
    length = math.sqrt(sum(c * c for c in vector))
    return tuple(c / length for c in vector) if length > 1e-12 else None


def _length(vector) -> float:
    return math.sqrt(sum(float(c) * float(c) for c in vector))


def profile_set_of(definition) -> Optional[ifcopenshell.entity_instance]:
    """The IfcMaterialProfileSet of a material definition (itself or through a usage), else None."""
    if definition is None:
        return None
    if definition.is_a("IfcMaterialProfileSetUsage"):
        return definition.ForProfileSet
    return definition if definition.is_a("IfcMaterialProfileSet") else None


def _describe(profile: dict) -> str:
    name = profile.get("ProfileName")
    return f"{profile['type']} '{name}'" if name else profile["type"]


class SectionReader:
    """Reads members' sections, reading each profile and profile set once.

    A section read from profiles depends only on them and on how they are turned (the rotation
    of their placement), so it is read once per profile and rotation: members of one size in one
    direction share it.
    """

    def __init__(self, to_inch: float) -> None:
        self.to_inch = to_inch  # the model's length factor
        self._rectangles: dict = {}
        self._profile_sets: dict = {}
        self._readings: dict = {}

    def read(self, profile_set, body: Body, object_matrix: np.ndarray, quantity_sets: dict) -> SectionReading:
        """The member's section in inches: from the profile set, else the extrusion, else base quantities.

        ``quantity_sets`` maps names to the element's IfcElementQuantity entities.
        """
        plies = self._profile_set_plies(profile_set)
        extrusion = body.extrusion
        if plies:
            body_profile = (extrusion.profile.id(), rotation_key(extrusion.matrix)) if extrusion is not None else None
            key = (profile_set.id(), body_profile, rotation_key(object_matrix))
            return self._once(key, self._profile_set_section, plies, extrusion, object_matrix)
        if extrusion is not None:
            key = (extrusion.profile.id(), rotation_key(extrusion.matrix))
            return self._once(key, self._extrusion_section, extrusion)
        from_quantities = _quantity_section(quantity_sets, self.to_inch)
        if from_quantities is not None:
            return from_quantities
        return SectionReading(None, f"no rectangular section found (profile none: {body.description()}, no Width/Depth quantities)")

    def _once(self, key: tuple, read, *args) -> SectionReading:
        """``read(*args)``, read once per key of profiles and rotations."""
        if key not in self._readings:
            self._readings[key] = read(*args)
        return self._readings[key]

    def _rectangle(self, profile) -> _Rectangle:
        key = profile.id()
        if key not in self._rectangles:
            self._rectangles[key] = _read_rectangle(profile.get_info(recursive=True))
        return self._rectangles[key]

    def _profile_set_plies(self, profile_set) -> list:
        if profile_set is None:
            return []
        key = profile_set.id()
        if key not in self._profile_sets:
            profiles = [item.Profile for item in profile_set.MaterialProfiles or () if item.Profile is not None]
            self._profile_sets[key] = [self._rectangle(profile) for profile in profiles]
        return self._profile_sets[key]

    def _profile_set_section(self, plies: list, extrusion: Optional[Extrusion], object_matrix) -> SectionReading:
        problem = _plies_problem(plies)
        if problem:
            return SectionReading(None, problem)
        body_profile = self._rectangle(extrusion.profile) if extrusion is not None else None
        if body_profile is not None and not body_profile.problem and body_profile.same_size(plies[0]):
            width, depth = _oriented(body_profile, extrusion.matrix)  # the body shows how the profile is turned
        else:
            width, depth = _oriented(plies[0], object_matrix)
        return self._built_up(plies, width, depth, "profile set")

    def _extrusion_section(self, extrusion: Extrusion) -> SectionReading:
        area = extrusion.profile
        profiles = area.Profiles if area.is_a() == "IfcCompositeProfileDef" else [area]
        plies = [self._rectangle(profile) for profile in profiles]
        problem = _plies_problem(plies)
        if problem:
            return SectionReading(None, problem)
        width, depth = _oriented(plies[0], extrusion.matrix)
        return self._built_up(plies, width, depth, "extrusion")

    def _built_up(self, plies: list, ply_width: float, depth: float, source: str) -> SectionReading:
        """Equal rectangles side by side make one built-up section of their total width."""
        if len(plies) > 1 and _stacked(plies, depth):
            return SectionReading(None, f"no rectangular section found ({len(plies)} profiles stacked, not side by side)")
        section = Section(
            width=ply_width * len(plies) * self.to_inch,
            depth=depth * self.to_inch,
            plies=len(plies),
            source=source,
            profile_name=plies[0].name,
        )
        return SectionReading(section)


def _read_rectangle(profile: dict) -> _Rectangle:
    name = profile.get("ProfileName") or ""
    if profile["type"] not in _RECTANGLES:
        return _Rectangle(0.0, 0.0, _IDENTITY, name, f"no rectangular section found (profile {_describe(profile)})")
    x_dim, y_dim = profile["XDim"], profile["YDim"]
    if not (_positive(x_dim) and _positive(y_dim)):
        problem = f"section dimensions not positive (XDim={x_dim}, YDim={y_dim} in {_describe(profile)})"
        return _Rectangle(0.0, 0.0, _IDENTITY, name, problem)
    return _Rectangle(float(x_dim), float(y_dim), axis_matrix(profile["Position"]), name, "")


def rotation_key(matrix: np.ndarray) -> bytes:
    """The rotation part of a placement matrix as a dict key: equal bytes, equal numbers."""
    return matrix[:3, :3].tobytes()


def _plies_problem(plies: list) -> str:
    """Why a list of profiles is not one rectangle or several equal ones; '' when it is."""
    for ply in plies:
        if ply.problem:
            return ply.problem
    if any(not ply.same_size(plies[0]) for ply in plies[1:]):
        sizes = ", ".join(f"{ply.x_dim:g}x{ply.y_dim:g}" for ply in plies)
        return f"no rectangular section found (profiles of different sizes {sizes})"
    return ""


def _oriented(rectangle: _Rectangle, parent: np.ndarray) -> tuple:
    """(width, depth) of a rectangle placed by ``parent``: the axis more vertical in the world is the depth."""
    rows = (parent[:3, :3] @ rectangle.frame[:3, :3]).tolist()
    x_axis, y_axis = [row[0] for row in rows], [row[1] for row in rows]
    x_scale, y_scale = _length(x_axis), _length(y_axis)
    x_size, y_size = rectangle.x_dim * x_scale, rectangle.y_dim * y_scale
    if abs(x_axis[2]) / x_scale > abs(y_axis[2]) / y_scale + 1e-9:
        return y_size, x_size
    return x_size, y_size


def _stacked(plies: list, depth: float) -> bool:
    """True when the plies' own positions move them along the depth instead of across it."""
    first = plies[0]
    depth_is_x = math.isclose(first.x_dim, depth, rel_tol=_SAME_SIZE) and not math.isclose(
        first.y_dim, depth, rel_tol=_SAME_SIZE
    )
    along_depth = [ply.frame[0 if depth_is_x else 1, 3] for ply in plies]
    return max(along_depth) - min(along_depth) > _SAME_SIZE * depth


def _quantity_section(quantity_sets: dict, to_inch: float) -> Optional[SectionReading]:
    ordered = [quantity_sets[name] for name in QUANTITY_SETS if name in quantity_sets]
    ordered += [qset for name, qset in quantity_sets.items() if name not in QUANTITY_SETS]
    for qset in ordered:
        lengths = {q.Name: q for q in qset.Quantities or () if q.is_a("IfcQuantityLength")}
        width = lengths.get("Width")
        depth = lengths.get("Depth") or lengths.get("Height")
        if width is None or depth is None:
            continue
        sizes = (_quantity_inches(width, to_inch), _quantity_inches(depth, to_inch))
        if not all(_positive(size) for size in sizes):
            values = f"Width={width.LengthValue}, {depth.Name}={depth.LengthValue} in {qset.Name}"
            return SectionReading(None, f"section dimensions not positive ({values})")
        return SectionReading(Section(width=sizes[0], depth=sizes[1], source="base quantities"))
    return None


def _quantity_inches(quantity, to_inch: float) -> float:
    unit = getattr(quantity, "Unit", None)
    factor = property_unit_to_core(unit, "length") if unit is not None else to_inch
    value = quantity.LengthValue  # None where the file holds a NaN
    return float(value) * factor if value is not None else math.nan


def _positive(value) -> bool:
    return value is not None and math.isfinite(float(value)) and float(value) > 0
