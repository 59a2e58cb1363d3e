"""Rectangular cross-sections of members: where the model states them and which side is the depth.

A section comes from the material profile set (occurrence usage or type), else from the body's
extrusion, else from base quantities (Width and Depth or Height). The depth d is the dimension
that lies in the vertical plane: the world directions of the profile's axes decide it. Where no
placement says otherwise the profile's YDim is the depth (the IFC convention).
"""

from __future__ import annotations

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

# Geometry is read as plain dicts from get_info(recursive=True), ifcopenshell's fast C++ path,
# once per placement, solid and profile: per-attribute access is the reader's main cost.


@dataclass(frozen=True)
class Extrusion:
    """An IfcExtrudedAreaSolid of a member's body (as a get_info dict) and the world matrix of its Position."""

    solid: dict
    matrix: np.ndarray

    def vector(self) -> np.ndarray:
        """The extrusion (direction times Depth) in world coordinates, model length units."""
        direction = np.array(self.solid["ExtrudedDirection"]["DirectionRatios"], dtype=float)
        return self.matrix[:3, :3] @ (direction * (float(self.solid["Depth"]) / _length(direction)))


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


def body_of(representations, object_matrix: np.ndarray) -> Body:
    """The body representation and its first IfcExtrudedAreaSolid (also inside mapped items and booleans)."""
    representation = _body_representation(representations)
    if representation is None:
        return Body(None, None)
    for item in representation.Items:
        extrusion = _extrusion_in(item, object_matrix)
        if extrusion is not None:
            return Body(representation, extrusion)
    return Body(representation, None)


def _body_representation(representations):
    for representation in representations:
        if representation.RepresentationIdentifier == "Body":
            return representation
    for representation in representations:
        if representation.RepresentationIdentifier not in _NOT_BODY:
            return representation
    return None


def _item_classes(item) -> list:
    """Classes of a representation item, looking inside mapped items."""
    if item.is_a("IfcMappedItem"):
        return [name for sub_item in item.MappingSource.MappedRepresentation.Items for name in _item_classes(sub_item)]
    return [item.is_a()]


def _extrusion_in(item, matrix: np.ndarray) -> Optional[Extrusion]:
    kind = item.is_a()
    if kind in _EXTRUSIONS:
        solid = item.get_info(recursive=True)
        return Extrusion(solid, placed(matrix, solid["Position"]))
    if kind in _BOOLEANS:
        return _extrusion_in(item.FirstOperand, matrix)
    if kind == "IfcMappedItem":
        inner = matrix @ _mapped_item_matrix(item)
        for sub_item in item.MappingSource.MappedRepresentation.Items:
            extrusion = _extrusion_in(sub_item, inner)
            if extrusion is not None:
                return extrusion
    return None


def _mapped_item_matrix(item) -> np.ndarray:
    matrix = ifc_placement.get_mappeditem_transformation(item)  # None for a 2D mapping target
    return matrix if matrix is not None else axis_matrix(item.MappingSource.MappingOrigin.get_info(recursive=True))


def placed(parent: np.ndarray, placement: Optional[dict]) -> np.ndarray:
    """``parent`` times the matrix of an axis placement dict (``parent`` itself when there is none)."""
    return parent if placement is None else parent @ axis_matrix(placement)


def axis_matrix(placement: Optional[dict]) -> np.ndarray:
    """4x4 matrix of an IfcAxis2Placement3D or 2D given as a get_info dict (identity for None).

    The x axis is RefDirection projected normal to the z axis, as IFC defines it.
    """
    if placement is None:
        return _IDENTITY
    kind = placement["type"]
    location = placement["Location"]
    if kind not in ("IfcAxis2Placement3D", "IfcAxis2Placement2D") or location["type"] != "IfcCartesianPoint":
        raise ModelReadError(f"placement {kind} at {location['type']} is not supported")
    axis = placement.get("Axis")
    reference = placement["RefDirection"]
    z = _unit(axis["DirectionRatios"]) if axis is not None else (0.0, 0.0, 1.0)
    ref = (*reference["DirectionRatios"], 0.0)[:3] if reference is not None else (1.0, 0.0, 0.0)
    if z is None:
        raise ModelReadError(f"placement #{placement['id']} has a zero-length Axis")
    along_z = sum(r * c for r, c in zip(ref, z))
    x = _unit([r - along_z * c for r, c in zip(ref, z)])
    if x is None:
        raise ModelReadError(f"placement #{placement['id']} has its RefDirection along its Axis")
    y = (z[1] * x[2] - z[2] * x[1], z[2] * x[0] - z[0] * x[2], z[0] * x[1] - z[1] * x[0])
    coordinates = (*location["Coordinates"], 0.0)[:3]
    return np.array(
        (
            (x[0], y[0], z[0], coordinates[0]),
            (x[1], y[1], z[1], coordinates[1]),
            (x[2], y[2], z[2], coordinates[2]),
            (0.0, 0.0, 0.0, 1.0),
        )
    )


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
    """Reads members' sections, reading each profile and profile set once."""

    def __init__(self, to_inch: float) -> None:
        self.to_inch = to_inch  # the model's length factor
        self._rectangles: dict = {}
        self._profile_sets: dict = {}

    def read(self, profile_set, body: Body, object_matrix: np.ndarray, quantity_sets: dict) -> SectionReading:
        """The member's section in inches: from the profile set, else the extrusion, else base quantities.

        ``quantity_sets`` maps names to the element's IfcElementQuantity entities.
        """
        plies = self._profile_set_plies(profile_set)
        if plies:
            return self._profile_set_section(plies, body.extrusion, object_matrix)
        if body.extrusion is not None:
            return self._extrusion_section(body.extrusion)
        from_quantities = _quantity_section(quantity_sets, self.to_inch)
        if from_quantities is not None:
            return from_quantities
        return SectionReading(None, f"no rectangular section found (profile none: {body.description()}, no Width/Depth quantities)")

    def _rectangle(self, profile: dict) -> _Rectangle:
        key = profile["id"]
        if key not in self._rectangles:
            self._rectangles[key] = _read_rectangle(profile)
        return self._rectangles[key]

    def _profile_set_plies(self, profile_set) -> list:
        if profile_set is None:
            return []
        key = profile_set.id()
        if key not in self._profile_sets:
            profiles = [item.Profile for item in profile_set.MaterialProfiles or () if item.Profile is not None]
            self._profile_sets[key] = [self._rectangle(profile.get_info(recursive=True)) for profile in profiles]
        return self._profile_sets[key]

    def _profile_set_section(self, plies: list, extrusion: Optional[Extrusion], object_matrix) -> SectionReading:
        problem = _plies_problem(plies)
        if problem:
            return SectionReading(None, problem)
        body_profile = self._rectangle(extrusion.solid["SweptArea"]) if extrusion is not None else None
        if body_profile is not None and not body_profile.problem and body_profile.same_size(plies[0]):
            width, depth = _oriented(body_profile, extrusion.matrix)  # the body shows how the profile is turned
        else:
            width, depth = _oriented(plies[0], object_matrix)
        return self._built_up(plies, width, depth, "profile set")

    def _extrusion_section(self, extrusion: Extrusion) -> SectionReading:
        area = extrusion.solid["SweptArea"]
        profiles = area["Profiles"] if area["type"] == "IfcCompositeProfileDef" else [area]
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
    frame = parent[:3, :3] @ rectangle.frame[:3, :3]
    x_axis, y_axis = frame[:, 0], frame[:, 1]
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
