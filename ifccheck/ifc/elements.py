"""World bounding boxes of the elements that may support or brace members.

Walls, columns, beams, members, slabs, roofs, footings, plates and spaces become
:class:`ElementBox` records: their world axis-aligned box in inches (slabs, roofs and spaces also
with the texts a project rule names them by, slabs and roofs with their material layers). The box comes from the element's 'Body'
representation when its items are extrusions (also inside mapped items and the first operand
of booleans), else from its 'Box' representation, else from the vertices of a faceted or
polygonal body. An extrusion gives eight points: the corners of its profile's bounding
rectangle at both ends. An element without geometry of its own (a roof of slabs, an elemented
wall) is the box around its aggregated parts.

Like the member reader this reads each placement, profile and mapped representation once and
what every element has by attribute position (see ifccheck.ifc.sections).
"""

from __future__ import annotations

import math
from typing import Optional

import ifcopenshell
import ifcopenshell.util.placement as ifc_placement
import numpy as np

from ..errors import ModelReadError
from ..model import ElementBox
from .areas import element_tags, slab_layers
from .sections import ITEMS, REPRESENTATIONS, ShapeReader, check_positions, fixed_position, identified

#: the classes read (subtypes included) and the kind each gives
ELEMENT_KINDS = {
    "IfcWall": "wall",
    "IfcColumn": "column",
    "IfcBeam": "beam",
    "IfcMember": "member",
    "IfcSlab": "slab",
    "IfcFooting": "footing",
    "IfcPlate": "plate",
    "IfcRoof": "roof",
    "IfcSpace": "space",
}
#: kinds whose tags (and for slabs and roofs, material layers) are read, see ifccheck.ifc.areas
_DESCRIBED_KINDS = frozenset({"slab", "roof", "space"})

#: representation identifiers that never hold the body
_NOT_BODY = frozenset({"Axis", "Box", "FootPrint", "Annotation", "Profile", "Reference", "Clearance", "CoG"})
_EXTRUSIONS = frozenset({"IfcExtrudedAreaSolid", "IfcExtrudedAreaSolidTapered"})
_BOOLEANS = frozenset({"IfcBooleanResult", "IfcBooleanClippingResult"})
#: bodies given by their vertices, read only when neither extrusions nor a 'Box' representation give the box
_POINT_SETS = frozenset({"IfcFacetedBrep", "IfcFacetedBrepWithVoids", "IfcShellBasedSurfaceModel", "IfcFaceBasedSurfaceModel"})
_FACE_SETS = frozenset({"IfcPolygonalFaceSet", "IfcTriangulatedFaceSet", "IfcTriangulatedIrregularNetwork"})

_GLOBAL_ID = fixed_position("IfcRoot", "GlobalId", 0)
_NAME = fixed_position("IfcRoot", "Name", 2)
_OBJECT_PLACEMENT = fixed_position("IfcProduct", "ObjectPlacement", 5)
_REPRESENTATION = fixed_position("IfcProduct", "Representation", 6)
_SWEPT_AREA = fixed_position("IfcExtrudedAreaSolid", "SweptArea", 0)
_POSITION = fixed_position("IfcExtrudedAreaSolid", "Position", 1)
_EXTRUDED_DIRECTION = fixed_position("IfcExtrudedAreaSolid", "ExtrudedDirection", 2)
_DEPTH = fixed_position("IfcExtrudedAreaSolid", "Depth", 3)
_DIRECTION_RATIOS = fixed_position("IfcDirection", "DirectionRatios", 0)
_MAPPING_SOURCE = fixed_position("IfcMappedItem", "MappingSource", 0)
_MAPPING_TARGET = fixed_position("IfcMappedItem", "MappingTarget", 1)
_MAPPING_ORIGIN = fixed_position("IfcRepresentationMap", "MappingOrigin", 0)
_MAPPED_REPRESENTATION = fixed_position("IfcRepresentationMap", "MappedRepresentation", 1)
_FIRST_OPERAND = fixed_position("IfcBooleanResult", "FirstOperand", 1)
_COORDINATES = fixed_position("IfcCartesianPoint", "Coordinates", 0)

#: what odd data of one element raises while it is read; that element is counted as unreadable
_ODD_DATA = (ModelReadError, AttributeError, TypeError, ValueError, IndexError, KeyError, ZeroDivisionError, RuntimeError)

_IDENTITY = np.eye(4)
_SOLIDS_ONLY, _WITH_VERTICES = False, True  # the two ways a body is read, see _BoxReader.item_points


def read_element_boxes(
    model: ifcopenshell.file, to_inch: float, storeys: Optional[dict] = None, shapes: Optional[ShapeReader] = None,
    kinds: Optional[frozenset] = None,
) -> tuple:
    """(boxes, unreadable): an ElementBox of every wall, column, beam, member, slab, footing,
    plate, roof and space whose geometry gives one, and how many of those elements gave none.

    ``to_inch`` is the factor from the model's length unit to inches. ``storeys`` maps element
    ids to the names of their storeys; without it they are found from the spatial structure.
    ``shapes`` is a ShapeReader that has read placements of this model already (the member
    reader's), so they are not read twice. ``kinds`` limits the kinds read (e.g. {"slab", "space"}).
    """
    check_positions(model.schema_identifier)
    storey_of = storeys.get if storeys is not None else _StoreyFinder(model).storey_name
    reader = _BoxReader(model, to_inch, shapes or ShapeReader())
    boxes, unreadable = [], 0
    for ifc_class, kind in ELEMENT_KINDS.items():
        if kinds is not None and kind not in kinds:
            continue
        for element in model.by_type(ifc_class):
            corners = reader.corners_with_parts(element)
            if corners is None:
                unreadable += 1
                continue
            boxes.append(_element_box(element, kind, storey_of(element.id(), ""), corners, to_inch))
    return boxes, unreadable


def _element_box(element, kind: str, storey, corners: tuple, to_inch: float) -> ElementBox:
    tags, layers, layers_source = (), (), ""
    if kind in _DESCRIBED_KINDS:
        tags = element_tags(element)
        if kind != "space":
            layers, layers_source = slab_layers(element, to_inch, corners[1][2] - corners[0][2])
    return ElementBox(
        global_id=element.get_argument(_GLOBAL_ID),
        name=element.get_argument(_NAME) or "",
        ifc_class=element.is_a(),
        kind=kind,
        storey=storey or "",
        lo=corners[0],
        hi=corners[1],
        tags=tags,
        layers=layers,
        layers_source=layers_source,
    )


def _parts(element) -> list:
    """The elements aggregated by ``element`` (IfcRelAggregates)."""
    return [part for rel in getattr(element, "IsDecomposedBy", None) or () for part in rel.RelatedObjects or ()]


def _union(corner_pairs: list) -> Optional[tuple]:
    """The box around boxes given as (lo, hi) pairs; None for none."""
    if not corner_pairs:
        return None
    lows, highs = zip(*corner_pairs)
    return tuple(min(axis) for axis in zip(*lows)), tuple(max(axis) for axis in zip(*highs))


class _BoxReader:
    """Reads element boxes, each placement, profile, direction and mapped representation once."""

    def __init__(self, model: ifcopenshell.file, to_inch: float, shapes: ShapeReader) -> None:
        self.model = model
        self.to_inch = to_inch
        self.shapes = shapes
        self._profiles: dict = {}  # profile id -> its bounding rectangle corners (4x3, z = 0)
        self._directions: dict = {}  # IfcDirection id -> unit vector
        self._prisms: dict = {}  # (profile ids, direction id, depth) -> corners of an extrusion, see _prism
        self._maps: dict = {}  # (IfcRepresentationMap id, mode) -> points in the map's own coordinates
        self._mappings: dict = {}  # (MappingTarget id, MappingOrigin id) -> 4x4 matrix
        self._with_parts: dict = {}  # element id -> (lo, hi) or None, see corners_with_parts

    def corners_with_parts(self, element) -> Optional[tuple]:
        """World (lo, hi) corners of an element; for one whose geometry gives none (a roof of slabs,
        an elemented wall) the box around its aggregated parts, found the same way; None if none."""
        key = element.id()
        if key not in self._with_parts:
            self._with_parts[key] = None  # guards against a cycle of aggregations
            corners = self.element_corners(element)
            if corners is None:
                corners = _union([c for c in map(self.corners_with_parts, _parts(element)) if c is not None])
            self._with_parts[key] = corners
        return self._with_parts[key]

    def element_corners(self, element) -> Optional[tuple]:
        """World (lo, hi) corners of an element in inches; None when its geometry gives no box."""
        try:
            world = self._world_points(element)
        except _ODD_DATA:
            return None  # odd data of one element: it is counted as unreadable
        if world is None:
            return None
        scale = self.to_inch
        axes = world.T.tolist()  # three lists of coordinates: faster than numpy for a few points
        return tuple(min(axis) * scale for axis in axes), tuple(max(axis) * scale for axis in axes)

    def _world_points(self, element) -> Optional[np.ndarray]:
        """World points (n x 3) whose box is the element's: from the body, else Box, else body vertices."""
        shape = element.get_argument(_REPRESENTATION)
        if shape is None:
            return None
        representations = identified(shape.get_argument(REPRESENTATIONS))
        body = _body(representations)
        matrix = self.shapes.object_matrix(element.get_argument(_OBJECT_PLACEMENT))
        points = self.representation_points(body, matrix, _SOLIDS_ONLY)
        if points is None:
            points = self.representation_points(_identified_as(representations, "Box"), matrix, _SOLIDS_ONLY)
        if points is None:
            points = self.representation_points(body, matrix, _WITH_VERTICES)
        return points

    def representation_points(self, representation, matrix: np.ndarray, mode: bool) -> Optional[np.ndarray]:
        """Points of all items of a representation placed by ``matrix``; None unless every item gives some."""
        if representation is None:
            return None
        arrays = [self.item_points(item, matrix, mode) for item in representation.get_argument(ITEMS)]
        if not arrays or any(points is None for points in arrays):
            return None
        return arrays[0] if len(arrays) == 1 else np.vstack(arrays)

    def item_points(self, item, matrix: np.ndarray, mode: bool) -> Optional[np.ndarray]:
        """Points (n x 3) whose box is the item's, placed by the 4x4 ``matrix``; None for an item of
        another kind. Vertex sets count only in the _WITH_VERTICES mode."""
        kind = item.is_a()
        if kind in _EXTRUSIONS:
            return self._extrusion_points(item, matrix)
        if kind in _BOOLEANS:
            return self.item_points(item.get_argument(_FIRST_OPERAND), matrix, mode)
        if kind == "IfcMappedItem":
            return self._mapped_points(item, matrix, mode)
        if kind == "IfcBoundingBox":
            return _moved(_bounding_box_points(item), matrix)
        if mode is _WITH_VERTICES and kind in _POINT_SETS:
            return _moved(self._vertices(item), matrix)
        if mode is _WITH_VERTICES and kind in _FACE_SETS:
            return _moved(np.array(item.Coordinates.CoordList, dtype=float).reshape(-1, 3), matrix)
        return None

    def _extrusion_points(self, solid, matrix: np.ndarray) -> Optional[np.ndarray]:
        """The corners of the profile's bounding rectangle at both ends of the extrusion (8 points)."""
        prism = self._prism(solid)
        if prism is None:
            return None
        position = solid.get_argument(_POSITION)
        if position is not None:
            matrix = matrix @ self.shapes.placement_matrix(position)
        return prism @ matrix[:3].T  # homogeneous points: rotation and translation in one product

    def _prism(self, solid) -> Optional[np.ndarray]:
        """The 8 corners of an extrusion (8 x 4, homogeneous, in its Position's coordinates); read once per
        profile, direction and depth. A tapered extrusion ends in the rectangle of its end profile."""
        profile, direction = solid.get_argument(_SWEPT_AREA), solid.get_argument(_EXTRUDED_DIRECTION)
        depth = float(solid.get_argument(_DEPTH))
        tapered = solid.is_a() == "IfcExtrudedAreaSolidTapered"
        end_profile = solid.EndSweptArea if tapered else profile
        key = (profile.id(), end_profile.id(), direction.id(), depth)
        if key not in self._prisms:
            start, end = self._profile_corners(profile), self._profile_corners(end_profile)
            prism = None
            if start is not None and end is not None:
                corners = np.vstack((start, end + self._direction(direction) * depth))
                prism = np.hstack((corners, np.ones((8, 1))))
                prism.flags.writeable = False  # shared by the extrusions of one profile and depth
            self._prisms[key] = prism
        return self._prisms[key]

    def _profile_corners(self, profile) -> Optional[np.ndarray]:
        key = profile.id()
        if key not in self._profiles:
            rectangle = self._profile_rectangle(profile)
            self._profiles[key] = _corners(rectangle) if rectangle is not None else None
        return self._profiles[key]

    def _profile_rectangle(self, profile) -> Optional[tuple]:
        """(x0, y0, x1, y1): the bounding rectangle of a profile in its own coordinates, including its
        Position; None for a profile of another kind."""
        kind = profile.is_a()
        if kind == "IfcCompositeProfileDef":
            parts = [self._profile_rectangle(part) for part in profile.Profiles or ()]
            if not parts or any(part is None for part in parts):
                return None
            return tuple(f(part[i] for part in parts) for i, f in ((0, min), (1, min), (2, max), (3, max)))
        if kind in ("IfcArbitraryClosedProfileDef", "IfcArbitraryProfileDefWithVoids"):
            return _rectangle_of(self._curve_points(profile.OuterCurve))
        half = _half_sizes(profile)
        if half is None:
            return None
        hx, hy = half
        corners = ((-hx, -hy), (hx, -hy), (hx, hy), (-hx, hy))
        position = getattr(profile, "Position", None)  # optional in IFC4
        if position is None:
            return (-hx, -hy, hx, hy)
        return _rectangle_of(_placed(self.shapes.placement_matrix(position), corners))

    def _vertices(self, item) -> Optional[np.ndarray]:
        """Every IfcCartesianPoint a faceted body or surface model is made of."""
        points = [entity for entity in self.model.traverse(item) if entity.is_a() == "IfcCartesianPoint"]
        if not points:
            return None
        return np.array([(*point.get_argument(_COORDINATES), 0.0)[:3] for point in points], dtype=float)

    def _curve_points(self, curve) -> list:
        """(x, y) points of a profile's outer curve whose bounding rectangle is the curve's or holds it:
        polylines and indexed poly curves by their points (arcs by their three points), lines by their
        trimming points, circles and circular arcs by the square around the full circle."""
        kind = curve.is_a()
        if kind == "IfcPolyline":
            return [point.get_argument(_COORDINATES)[:2] for point in curve.Points]
        if kind == "IfcIndexedPolyCurve":
            return [coordinates[:2] for coordinates in curve.Points.CoordList]
        if kind == "IfcCompositeCurve":
            return [point for segment in curve.Segments for point in self._curve_points(segment.ParentCurve)]
        if kind == "IfcCircle":
            return self._circle_square(curve)
        if kind == "IfcTrimmedCurve" and curve.BasisCurve.is_a("IfcCircle"):
            return self._circle_square(curve.BasisCurve)
        if kind == "IfcTrimmedCurve" and curve.BasisCurve.is_a("IfcLine"):
            return [_line_point(curve.BasisCurve, trims) for trims in (curve.Trim1, curve.Trim2)]
        raise ModelReadError(f"profile curve {kind} is not supported")

    def _circle_square(self, circle) -> list:
        r = circle.Radius
        return _placed(self.shapes.placement_matrix(circle.Position), ((-r, -r), (r, -r), (r, r), (-r, r)))

    def _direction(self, direction) -> np.ndarray:
        key = direction.id()
        if key not in self._directions:
            ratios = np.array((*direction.get_argument(_DIRECTION_RATIOS), 0.0)[:3], dtype=float)
            length = float(np.linalg.norm(ratios))
            if not length > 0:
                raise ModelReadError(f"extrusion direction #{key} has no length")
            self._directions[key] = ratios / length
        return self._directions[key]

    def _mapped_points(self, item, matrix: np.ndarray, mode: bool) -> Optional[np.ndarray]:
        """Points of a mapped item: its representation's points (read once), placed by its origin and target."""
        source = item.get_argument(_MAPPING_SOURCE)
        key = (source.id(), mode)
        if key not in self._maps:
            self._maps[key] = self.representation_points(source.get_argument(_MAPPED_REPRESENTATION), _IDENTITY, mode)
        return _moved(self._maps[key], matrix @ self._mapping_matrix(item, source))

    def _mapping_matrix(self, item, source) -> np.ndarray:
        target, origin = item.get_argument(_MAPPING_TARGET), source.get_argument(_MAPPING_ORIGIN)
        key = (target.id(), origin.id())
        if key not in self._mappings:
            matrix = ifc_placement.get_mappeditem_transformation(item)  # target after origin
            if matrix is None:
                raise ModelReadError(f"mapped item #{item.id()} has a 2D mapping target")
            self._mappings[key] = np.asarray(matrix, dtype=float)
        return self._mappings[key]


def _half_sizes(profile) -> Optional[tuple]:
    """Half the overall sizes (x, y) of a parameterized profile, about its Position (the centre of its
    bounding box for these profiles, as IFC defines them); None for another kind."""
    kind = profile.is_a()
    if kind in ("IfcRectangleProfileDef", "IfcRoundedRectangleProfileDef", "IfcRectangleHollowProfileDef"):
        return profile.XDim / 2, profile.YDim / 2
    if kind in ("IfcCircleProfileDef", "IfcCircleHollowProfileDef"):
        return profile.Radius, profile.Radius
    if kind in ("IfcIShapeProfileDef", "IfcAsymmetricIShapeProfileDef"):
        widths = [getattr(profile, name, None) for name in ("OverallWidth", "BottomFlangeWidth", "TopFlangeWidth")]
        return max(width for width in widths if width is not None) / 2, profile.OverallDepth / 2
    if kind == "IfcLShapeProfileDef":
        return (profile.Width or profile.Depth) / 2, profile.Depth / 2  # Width is optional: equal legs
    if kind in ("IfcTShapeProfileDef", "IfcUShapeProfileDef"):
        return profile.FlangeWidth / 2, profile.Depth / 2
    if kind == "IfcCShapeProfileDef":
        return profile.Width / 2, profile.Depth / 2
    return None


def _placed(matrix: np.ndarray, points) -> list:
    """(x, y) points of a profile moved by the 4x4 matrix of a 2D placement."""
    return [(matrix[0, 0] * x + matrix[0, 1] * y + matrix[0, 3], matrix[1, 0] * x + matrix[1, 1] * y + matrix[1, 3]) for x, y in points]


def _line_point(line, trims) -> tuple:
    """(x, y) of a line's trimming point: the cartesian point if given, else the point at the parameter."""
    for trim in trims:
        if trim.is_a("IfcCartesianPoint"):
            return trim.get_argument(_COORDINATES)[:2]
    parameter = next(trim.wrappedValue for trim in trims if trim.is_a("IfcParameterValue"))
    start, vector = line.Pnt.get_argument(_COORDINATES), line.Dir
    ratios = vector.Orientation.get_argument(_DIRECTION_RATIOS)
    scale = parameter * vector.Magnitude / math.hypot(ratios[0], ratios[1])
    return start[0] + ratios[0] * scale, start[1] + ratios[1] * scale


def _rectangle_of(points) -> tuple:
    xs, ys = [float(p[0]) for p in points], [float(p[1]) for p in points]
    if not xs or not all(math.isfinite(v) for v in (*xs, *ys)):
        raise ModelReadError("profile without finite points")
    return min(xs), min(ys), max(xs), max(ys)


def _corners(rectangle: tuple) -> np.ndarray:
    """The 4 corners (4 x 3, z = 0) of a profile's bounding rectangle."""
    x0, y0, x1, y1 = rectangle
    corners = np.array(((x0, y0, 0.0), (x1, y0, 0.0), (x1, y1, 0.0), (x0, y1, 0.0)))
    corners.flags.writeable = False  # shared by every extrusion of the profile
    return corners


def _moved(points: Optional[np.ndarray], matrix: np.ndarray) -> Optional[np.ndarray]:
    """Points (n x 3) moved by a 4x4 matrix."""
    if points is None:
        return None
    return points @ matrix[:3, :3].T + matrix[:3, 3]


def _bounding_box_points(box) -> np.ndarray:
    """The 8 corners of an IfcBoundingBox."""
    x, y, z = (*box.Corner.Coordinates, 0.0)[:3]
    sizes = (box.XDim, box.YDim, box.ZDim)
    return np.array([(x + i * sizes[0], y + j * sizes[1], z + k * sizes[2]) for i in (0, 1) for j in (0, 1) for k in (0, 1)])


def _body(representations: list):
    """The 'Body' representation, else the first one not named as something else."""
    body = _identified_as(representations, "Body")
    if body is not None:
        return body
    return next((rep for identifier, rep in representations if identifier not in _NOT_BODY), None)


def _identified_as(representations: list, identifier: str):
    return next((rep for name, rep in representations if name == identifier), None)


class _StoreyFinder:
    """Storey names of elements from one pass over the containment and aggregation relationships."""

    def __init__(self, model: ifcopenshell.file) -> None:
        self._containers = _related_map(model, "IfcRelContainedInSpatialStructure", "RelatedElements", "RelatingStructure")
        self._wholes = _related_map(model, "IfcRelAggregates", "RelatedObjects", "RelatingObject")
        self._names: dict = {}
        self._structures: dict = {}

    def storey_name(self, element_id: int, default: str = "") -> str:
        """Name of the storey containing the element, its spatial container or its assembly; ``default`` if none."""
        if element_id not in self._names:
            self._names[element_id] = None  # guards against a cycle of aggregations
            self._names[element_id] = self._find(element_id)
        return self._names[element_id] or default

    def _find(self, element_id: int) -> Optional[str]:
        structure = self._containers.get(element_id)
        if structure is not None:
            return self._structure_storey(structure)
        whole = self._wholes.get(element_id)
        if whole is None:
            return None
        if whole.is_a("IfcBuildingStorey"):
            return whole.Name or ""
        return self.storey_name(whole.id(), None)

    def _structure_storey(self, structure) -> Optional[str]:
        """Name of the storey that is, or aggregates, a spatial structure element; read once per structure."""
        key = structure.id()
        if key not in self._structures:
            self._structures[key] = self._storey_above(structure)
        return self._structures[key]

    def _storey_above(self, structure) -> Optional[str]:
        seen = set()
        while structure is not None and structure.id() not in seen:
            if structure.is_a("IfcBuildingStorey"):
                return structure.Name or ""
            seen.add(structure.id())
            structure = self._wholes.get(structure.id())
        return None


def _related_map(model: ifcopenshell.file, ifc_class: str, related: str, relating: str) -> dict:
    """Id of each related entity -> the relating one (the first relationship naming it wins)."""
    found: dict = {}
    for relationship in model.by_type(ifc_class):
        whole = getattr(relationship, relating)
        for entity in getattr(relationship, related) or ():
            found.setdefault(entity.id(), whole)
    return found
