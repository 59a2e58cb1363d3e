"""Reading the candidate bending members of an IFC model into MemberRecords (core units).

One pass over IfcBeam and IfcMember (subtypes included). Each element is either a candidate
(:class:`MemberRecord`, with notes on where each value came from and problems that prevent a
check) or a :class:`SkippedElement` with the reason: not a bending member type, LoadBearing FALSE,
non-timber material, or an axis steeper than ``max_bending_slope``. Odd data never stops the
pass: what cannot be read becomes a problem of that member.

Large models have tens of thousands of members, so the pass reads each thing once: the
relationships of the whole model in one pass per class (:class:`_Relations`), each shared type,
material, property set, placement, pair of directions and profile once, and what every member
has by attribute position (see ifccheck.ifc.sections).
"""

from __future__ import annotations

import contextlib
import functools
import gc
import math
from dataclasses import dataclass, field, replace
from typing import Optional

import ifcopenshell
import ifcopenshell.util.element as ifc_element
import numpy as np

from ..errors import ModelReadError
from ..model import INPUT_PROPS, INPUT_PSET, MaterialInfo, MemberRecord, ReadResult, SkippedElement
from ..units import to_temperature_f
from .materials import UNKNOWN, MaterialReader
from .sections import (
    ITEMS,
    REPRESENTATIONS,
    SectionReader,
    ShapeReader,
    attribute_position,
    check_positions,
    fixed_position,
    identified,
    profile_set_of,
    rotation_key,
)
from .units import format_length, format_section, model_temperature_unit, model_units, property_unit_to_core, temperature_unit

#: IfcMember types that carry bending; every other IfcMember type (POST, STUD, BRACE, ...) is skipped
BENDING_MEMBER_TYPES = frozenset({"RAFTER", "PURLIN", "STRINGER", "MEMBER", "NOTDEFINED", "USERDEFINED"})

#: predefined type names of IfcBeamTypeEnum and IfcMemberTypeEnum (IFC4X3), for USERDEFINED types
KNOWN_PREDEFINED_TYPES = frozenset({
    "BEAM", "JOIST", "HOLLOWCORE", "LINTEL", "SPANDREL", "T_BEAM", "GIRDER_SEGMENT", "DIAPHRAGM", "PIERCAP",
    "HATSTONE", "CORNICE", "EDGEBEAM", "BRACE", "CHORD", "COLLAR", "MEMBER", "MULLION", "PLATE", "POST",
    "PURLIN", "RAFTER", "STRINGER", "STRUT", "STUD", "STIFFENING_RIB", "ARCH_SEGMENT", "SUSPENSION_CABLE",
    "SUSPENDER", "STAY_CABLE", "STRUCTURALCABLE", "TIE_BAR",
})

#: the common property sets holding LoadBearing and Span, own class first (some exporters put
#: Pset_BeamCommon on members)
_COMMON_PSETS = {"IfcBeam": ("Pset_BeamCommon", "Pset_MemberCommon"), "IfcMember": ("Pset_MemberCommon", "Pset_BeamCommon")}

#: measure types accepted for each input kind, with the unit kind of the model they are read in;
#: a plain number (IfcReal, ...) is read in the model's unit of the property's kind
_MEASURES = {
    "linear_force": {"IfcLinearForceMeasure": "linear_force"},
    "planar_force": {"IfcPlanarForceMeasure": "planar_force", "IfcPressureMeasure": "stress"},
    "length": {name: "length" for name in ("IfcLengthMeasure", "IfcPositiveLengthMeasure", "IfcNonNegativeLengthMeasure")},
    "temperature": {"IfcThermodynamicTemperatureMeasure": "temperature"},
}
_PLAIN_NUMBERS = frozenset(
    {"IfcReal", "IfcInteger", "IfcNumericMeasure", "IfcCountMeasure", "IfcRatioMeasure", "IfcPositiveRatioMeasure"}
)
_BOOLEANS = frozenset({"IfcBoolean", "IfcLogical"})
_LABELS = frozenset({"IfcLabel", "IfcText", "IfcIdentifier"})

# limits past which an input value is a modelling error, not a design case (core units)
_ABSURD_LOAD = 1e6  # lbf/in or psi
_ABSURD_LENGTH = 1e5  # in (over 2.5 km)
_ABSOLUTE_ZERO_F = -459.67
_LEVEL = 1e-6  # degrees: a slope below this is a level member (rounding of placements)

# attributes of every member read by position (see ifccheck.ifc.sections)
_GLOBAL_ID = fixed_position("IfcRoot", "GlobalId", 0)
_NAME = fixed_position("IfcRoot", "Name", 2)
_OBJECT_TYPE = fixed_position("IfcObject", "ObjectType", 4)
_OBJECT_PLACEMENT = fixed_position("IfcProduct", "ObjectPlacement", 5)
_REPRESENTATION = fixed_position("IfcProduct", "Representation", 6)
_EXTRUDED_DIRECTION = fixed_position("IfcExtrudedAreaSolid", "ExtrudedDirection", 2)
_EXTRUDED_DEPTH = fixed_position("IfcExtrudedAreaSolid", "Depth", 3)
_DIRECTION_RATIOS = fixed_position("IfcDirection", "DirectionRatios", 0)
_POLYLINE_POINTS = fixed_position("IfcPolyline", "Points", 0)
_COORDINATES = fixed_position("IfcCartesianPoint", "Coordinates", 0)


def read_model(model: ifcopenshell.file, rules: dict) -> ReadResult:
    """Every IfcBeam and IfcMember of ``model`` as a candidate MemberRecord or a SkippedElement.

    ``rules`` is the dict of :func:`ifccheck.rules.load_rules`; its
    ``defaults.max_bending_slope`` (degrees) separates bending members from posts and studs.
    """
    check_positions(model.schema_identifier)
    elements = (*model.by_type("IfcBeam"), *model.by_type("IfcMember"))
    members, skipped = [], []
    with _no_cycle_collection():
        reader = _ModelReader(model, float(rules["defaults"]["max_bending_slope"]), _Relations(model, len(elements)))
        for element in elements:
            outcome = reader.read(element)
            (skipped if isinstance(outcome, SkippedElement) else members).append(outcome)
    return ReadResult(schema=model.schema_identifier, units=reader.units, members=members, skipped=skipped)


def axis_ends(model: ifcopenshell.file, elements) -> dict:
    """World axis ends (inches) of any elements, read as the members' are (their 'Axis'
    representation, else their body extrusion): GlobalId -> (start, end), or None where unknown."""
    reader = _ModelReader(model, 90.0, _Relations(model, 0))
    ends = {}
    for element in elements:
        try:
            _, object_matrix, axis = reader._geometry(element)
        except Exception:  # noqa: BLE001 - odd geometry of one element: its axis is unknown
            axis = None
        ends[element.GlobalId] = axis.ends(object_matrix, reader.to_inch) if axis is not None else None
    return ends


@contextlib.contextmanager
def _no_cycle_collection():
    """Pause Python's cycle collector during the pass.

    The pass makes a few dozen small objects per member, and the records it keeps grow with the
    model; the collector would scan them over and over (about a tenth of the pass on large models).
    Reference counting still frees what the pass drops; any cycle is collected once it is back on.
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


@dataclass(frozen=True)
class _Found:
    """A single-value property found on the occurrence or its type."""

    prop: ifcopenshell.entity_instance
    pset: str
    source: str  # "occurrence" or "type"


@dataclass(frozen=True)
class _Input:
    """One property of the input property set as read: a usable value, or why not."""

    value: object = None
    usable: bool = False
    note: str = ""
    problem: str = ""


@dataclass
class _Inputs:
    """The input property sets of a member as read: values and their sources, notes and problems."""

    values: dict = field(default_factory=dict)
    sources: dict = field(default_factory=dict)
    notes: list = field(default_factory=list)
    problems: list = field(default_factory=list)


@dataclass(frozen=True)
class _Axis:
    """A member's axis in world coordinates: its length (model units) and its end-to-end vector.

    Its ends are kept relative to the origin of the member's object placement (world directions,
    model units), so members of one rotation and axis share one _Axis; see :meth:`ends`.
    """

    length: float
    vector: np.ndarray
    source: str  # "axis" or "extrusion"
    start_offset: tuple
    end_offset: tuple

    def ends(self, object_matrix: np.ndarray, to_inch: float) -> tuple:
        """World (start, end) points of the axis in inches, of a member placed by ``object_matrix``."""
        ox, oy, oz = object_matrix[:3, 3].tolist()
        (sx, sy, sz), (ex, ey, ez) = self.start_offset, self.end_offset
        return (
            ((ox + sx) * to_inch, (oy + sy) * to_inch, (oz + sz) * to_inch),
            ((ox + ex) * to_inch, (oy + ey) * to_inch, (oz + ez) * to_inch),
        )

    @functools.cached_property
    def slope(self) -> float:
        """Degrees from horizontal (worked out once per axis; members of one direction share it)."""
        horizontal = math.hypot(self.vector[0], self.vector[1])
        slope = math.degrees(math.atan2(abs(self.vector[2]), horizontal))
        return 0.0 if slope < _LEVEL else slope


@dataclass(frozen=True)
class _TypeInfo:
    """What a type object gives all its occurrences, read once per type."""

    psets: dict
    predefined: str
    material: tuple  # (MaterialInfo, MaterialKind, definition)
    common: dict  # property name -> _Found or None, from its common property sets
    inputs: Optional[ifcopenshell.entity_instance]  # its input property set


_NO_MATERIAL = MaterialInfo()
_NO_TYPE = _TypeInfo(psets={}, predefined="", material=(_NO_MATERIAL, UNKNOWN, None), common={}, inputs=None)

#: relationship classes gathered once per model: (class, attribute naming the elements, attribute
#: naming what is related to them); IfcRelDefinesByProperties without subtypes, as the IFC2X3
#: IfcRelOverridesProperties is not read
_GATHERED = {
    "definitions": ("IfcRelDefinesByProperties", "RelatedObjects", "RelatingPropertyDefinition"),
    "types": ("IfcRelDefinesByType", "RelatedObjects", "RelatingType"),
    "materials": ("IfcRelAssociatesMaterial", "RelatedObjects", "RelatingMaterial"),
    "containers": ("IfcRelContainedInSpatialStructure", "RelatedElements", "RelatingStructure"),
}


#: in a gathered map: no relationship of the class names the element, or its own inverse
#: attribute must decide (several relationships name it, or the class was not gathered)
_UNRELATED, _ASK_ELEMENT = object(), object()


class _Relations:
    """What the relationships of a model relate to each element, read in one pass per relationship class.

    Looking up an inverse attribute (IsDefinedBy, HasAssociations, ...) costs microseconds per
    element; one pass over each relationship class builds maps from element id to the related
    entity instead. A class with more relationships than there are candidates is not gathered
    (its map is None), and an element named by several relationships of one class is read through
    its inverse attribute as before, so the order the model gives them still decides.
    """

    def __init__(self, model: ifcopenshell.file, candidates: int) -> None:
        self.ifc2x3 = model.schema == "IFC2X3"
        for name, (ifc_class, elements, related) in _GATHERED.items():
            relationships = model.by_type(ifc_class, include_subtypes=ifc_class != "IfcRelDefinesByProperties")
            gathered = _gather(relationships, elements, related) if len(relationships) <= candidates else None
            setattr(self, name, gathered)
        self._storeys: dict = {}

    def type_and_definitions(self, element, key: int) -> tuple:
        """(type object or None, property and quantity set definitions) of an occurrence of id ``key``."""
        element_type, definition = _related(self.types, key), _related(self.definitions, key)
        if element_type is _ASK_ELEMENT or definition is _ASK_ELEMENT:
            return _defined_by(element, self.ifc2x3)
        element_type = None if element_type is _UNRELATED else element_type
        if definition is _UNRELATED:
            return element_type, []
        return element_type, list(definition) if isinstance(definition, tuple) else [definition]  # IFC4 set of sets

    def material(self, element, key: int):
        """The material definition associated with the element of id ``key`` itself, or None."""
        material = _related(self.materials, key)
        if material is _ASK_ELEMENT:
            return ifc_element.get_material(element, should_inherit=False)
        return None if material is _UNRELATED else material

    def storey_name(self, element, key: int) -> str:
        """Name of the IfcBuildingStorey containing the element of id ``key`` (directly, via spaces, or
        via its assembly)."""
        structure = _related(self.containers, key)
        if structure is _UNRELATED or structure is _ASK_ELEMENT:  # the assembly or host decides, or several
            return _storey_name(element)
        if structure is None:
            return ""
        key = structure.id()
        if key not in self._storeys:
            self._storeys[key] = _storey_name_of_structure(structure)
        return self._storeys[key]


def _gather(relationships, elements: str, related: str) -> dict:
    """Element id -> the entity related to it by ``relationships`` (_ASK_ELEMENT where several are)."""
    found: dict = {}
    for relationship in relationships:
        entity = getattr(relationship, related)
        for element in getattr(relationship, elements) or ():
            key = element.id()
            found[key] = _ASK_ELEMENT if key in found else entity
    return found


def _related(gathered: Optional[dict], key: int):
    """The entity related to element ``key`` in a gathered map, _UNRELATED or _ASK_ELEMENT."""
    return gathered.get(key, _UNRELATED) if gathered is not None else _ASK_ELEMENT


def _defined_by(element, ifc2x3: bool) -> tuple:
    """(type object or None, property and quantity set definitions) from the element's inverse attributes."""
    element_type, definitions = None, []
    for rel in getattr(element, "IsDefinedBy", None) or ():
        kind = rel.is_a()
        if kind == "IfcRelDefinesByProperties":
            relating = rel.RelatingPropertyDefinition
            definitions += list(relating) if isinstance(relating, tuple) else [relating]  # IFC4 set of sets
        elif kind == "IfcRelDefinesByType":  # IFC2X3
            element_type = rel.RelatingType
    if element_type is None and not ifc2x3:
        typed_by = getattr(element, "IsTypedBy", None)
        element_type = typed_by[0].RelatingType if typed_by else None
    return element_type, definitions


class _ModelReader:
    """Reads elements of one model, each type object, material, property set, profile and placement once."""

    def __init__(self, model: ifcopenshell.file, max_slope: float, relations: _Relations) -> None:
        self.model = model
        self.relations = relations
        self.units = model_units(model)
        self.max_slope = max_slope
        self.to_inch = self.units.to_core["length"]
        self.schema = model.schema_identifier
        self.materials = MaterialReader()
        self.sections = SectionReader(self.to_inch)
        self.shapes = ShapeReader()
        self._types: dict = {}
        self._inputs_by_pset: dict = {}
        self._inputs: dict = {}
        self._profile_sets: dict = {}
        self._section_notes: dict = {}
        self._axes: dict = {}
        self._extrusion_axes: dict = {}
        self._profile_centres: dict = {}
        self._beam_classes: dict = {}
        self._predefined_positions: dict = {}
        self._span_notes: dict = {}

    def read(self, element):
        try:
            return self._read(element)
        except Exception as exc:  # odd data of one element must not stop the whole model
            return _unreadable(element, exc)

    def _read(self, element):
        key = element.id()
        element_type, definitions = self.relations.type_and_definitions(element, key)
        own_psets = _by_name(definitions)
        type_info = self._type_info(element_type)
        ifc_class = element.is_a()
        predefined = _predefined_type(self._own_predefined_type(element, ifc_class), type_info)
        is_beam = self._is_beam(element, ifc_class)
        if not is_beam and predefined not in BENDING_MEMBER_TYPES:
            return _skip(element, f"IfcMember of type {predefined} is not a bending member", "not_bending")
        common = _COMMON_PSETS["IfcBeam" if is_beam else "IfcMember"]
        load_bearing = self._common_property("LoadBearing", common, own_psets, type_info)
        if load_bearing is not None and load_bearing.prop.NominalValue.wrappedValue is False:
            return _skip(element, f"LoadBearing is FALSE ({load_bearing.pset} on the {load_bearing.source})", "not_load_bearing")
        record = MemberRecord(
            global_id=element.get_argument(_GLOBAL_ID),
            name=element.get_argument(_NAME) or "",
            ifc_class=ifc_class,
            predefined_type=predefined,
            storey="",
            material=_NO_MATERIAL,
            section=None,
        )
        _guarded(record, "ifccheck_DesignInput", self._read_inputs, record, own_psets, type_info)
        material = _guarded(record, "material", self._material, element, key, type_info)
        info, kind, definition = material or (_NO_MATERIAL, UNKNOWN, None)
        record.material = _with_input_identity(info, record.inputs)
        if record.material.kind == "non_timber":
            return _skip(element, f"non-timber material '{info.name}' ({kind.material_kind})", "non_timber")
        _note_material(record)
        geometry = _guarded(record, "geometry", self._geometry, element)
        body, object_matrix, axis = geometry or (None, None, None)
        record.slope = axis.slope if axis is not None else 0.0
        if record.slope > self.max_slope:
            reason = f"axis {record.slope:.1f}° from horizontal, steeper than {self.max_slope:g}°"
            return _skip(element, reason, "not_bending")
        if axis is not None:
            record.axis_start, record.axis_end = axis.ends(object_matrix, self.to_inch)
        if body is not None:
            _guarded(record, "section", self._read_section, record, definition, body, object_matrix, own_psets)
        _guarded(record, "span", self._read_span, record, common, own_psets, type_info, axis)
        record.storey = _guarded(record, "storey", self.relations.storey_name, element, key) or ""
        return record

    def _is_beam(self, element, ifc_class: str) -> bool:
        """Whether the element is an IfcBeam or of a subtype, asked once per class."""
        if ifc_class not in self._beam_classes:
            self._beam_classes[ifc_class] = element.is_a("IfcBeam")
        return self._beam_classes[ifc_class]

    # --- type objects and geometry -----------------------------------------------------------

    def _type_info(self, element_type) -> _TypeInfo:
        if element_type is None:
            return _NO_TYPE
        key = element_type.id()
        if key not in self._types:
            psets = _by_name(element_type.HasPropertySets or ())
            definition = ifc_element.get_material(element_type, should_inherit=False)
            material = (*self.materials.read(definition, "type"), definition) if definition is not None else _NO_TYPE.material
            common = {
                (name, pset_names): _first_property(name, pset_names, psets, "type")
                for name in ("LoadBearing", "Span")
                for pset_names in _COMMON_PSETS.values()
            }
            predefined = _user_defined(getattr(element_type, "PredefinedType", None), element_type.ElementType)
            inputs = _property_set(psets.get(INPUT_PSET))
            self._types[key] = _TypeInfo(psets=psets, predefined=predefined, material=material, common=common, inputs=inputs)
        return self._types[key]

    def _own_predefined_type(self, element, ifc_class: str) -> str:
        """The occurrence's PredefinedType (IFC2X3 beams and members have none), or what its ObjectType names."""
        if ifc_class not in self._predefined_positions:
            self._predefined_positions[ifc_class] = attribute_position(self.schema, ifc_class, "PredefinedType")
        position = self._predefined_positions[ifc_class]
        predefined = element.get_argument(position) if position is not None else None
        if predefined not in _UNSET_TYPES:
            return predefined
        return _user_defined(predefined, element.get_argument(_OBJECT_TYPE))

    def _common_property(self, name: str, pset_names: tuple, own_psets: dict, type_info: _TypeInfo) -> Optional[_Found]:
        """A common property of the occurrence, else of its type."""
        found = _first_property(name, pset_names, own_psets, "occurrence") if own_psets else None
        return found if found is not None else type_info.common.get((name, pset_names))

    def _material(self, element, key: int, type_info: _TypeInfo) -> tuple:
        """(MaterialInfo, MaterialKind, definition): the occurrence's own material, else its type's."""
        definition = self.relations.material(element, key)
        if definition is None:
            return type_info.material
        return (*self.materials.read(definition, "occurrence"), definition)

    def _geometry(self, element) -> tuple:
        object_matrix = self.shapes.object_matrix(element.get_argument(_OBJECT_PLACEMENT))
        shape = element.get_argument(_REPRESENTATION)
        representations = identified(shape.get_argument(REPRESENTATIONS)) if shape is not None else []
        body = self.shapes.body(representations, object_matrix)
        return body, object_matrix, self._member_axis(representations, object_matrix, body)

    def _member_axis(self, representations: list, object_matrix: np.ndarray, body) -> Optional[_Axis]:
        """The member's axis from its 'Axis' representation, else from its body extrusion."""
        points = _axis_points(representations)
        axis = self._axis_along(points, object_matrix) if points is not None else None
        if axis is not None:
            return axis
        if body.extrusion is not None:
            return self._extrusion_axis(body.extrusion, object_matrix)
        return None

    def _extrusion_axis(self, extrusion, object_matrix: np.ndarray) -> _Axis:
        """:func:`_new_extrusion_axis`, once per profile, extrusion and its place relative to the
        member's placement (members of one size and direction share it)."""
        solid = extrusion.solid
        key = (
            extrusion.profile.id(),
            solid.get_argument(_EXTRUDED_DIRECTION).get_argument(_DIRECTION_RATIOS),
            solid.get_argument(_EXTRUDED_DEPTH),
            rotation_key(extrusion.matrix),
            (extrusion.matrix[:3, 3] - object_matrix[:3, 3]).tobytes(),
        )
        if key not in self._extrusion_axes:
            self._extrusion_axes[key] = self._new_extrusion_axis(extrusion, object_matrix)
        return self._extrusion_axes[key]

    def _new_extrusion_axis(self, extrusion, object_matrix: np.ndarray) -> _Axis:
        """The axis of a body extrusion: from the profile centre at its base along the extrusion."""
        vector = extrusion.vector()
        cx, cy = self._profile_centre(extrusion.profile)
        matrix = extrusion.matrix
        start = matrix[:3, 3] - object_matrix[:3, 3]
        if cx or cy:  # most profiles are centred on their position
            start = start + matrix[:3, 0] * cx + matrix[:3, 1] * cy
        end = start + vector
        return _Axis(float(np.linalg.norm(vector)), vector, "extrusion", tuple(start.tolist()), tuple(end.tolist()))

    def _profile_centre(self, profile) -> tuple:
        """:func:`_profile_centre`, once per profile."""
        key = profile.id()
        if key not in self._profile_centres:
            self._profile_centres[key] = _profile_centre(profile)
        return self._profile_centres[key]

    def _axis_along(self, points: list, object_matrix: np.ndarray) -> Optional[_Axis]:
        """:func:`_axis_along`, once per axis points and rotation (parallel members of one length share it)."""
        key = (rotation_key(object_matrix), tuple(points))
        if key not in self._axes:
            self._axes[key] = _axis_along(points, object_matrix)
        return self._axes[key]

    # --- section, span, inputs ---------------------------------------------------------------

    def _read_section(self, record: MemberRecord, definition, body, object_matrix, own_psets: dict) -> None:
        quantity_sets = {name: pset for name, pset in own_psets.items() if pset.is_a("IfcElementQuantity")}
        reading = self.sections.read(self._profile_set(definition), body, object_matrix, quantity_sets)
        if reading.problem:
            record.problems.append(reading.problem)
            return
        section = reading.section
        plies = record.inputs.get("Plies")
        if plies is not None and section.plies > 1 and plies != section.plies:
            record.problems.append(f"{INPUT_PSET}.Plies is {plies} but the model shows {section.plies} plies side by side")
            return
        if plies is not None and section.plies == 1 and plies > 1:
            section = replace(section, plies=plies)
            record.notes.append(f"built-up of {plies} plies from {INPUT_PSET}.Plies (the modelled width is their total)")
        elif section.plies > 1:
            record.notes.append(f"built-up of {section.plies} plies side by side in the {section.source}")
        record.section = section
        record.notes.append(self._section_note(section))

    def _section_note(self, section) -> str:
        """The note naming a section and its source, written once per distinct section."""
        key = (section.width, section.depth, section.source, section.profile_name)
        if key not in self._section_notes:
            named = f" ('{section.profile_name}')" if section.profile_name else ""
            size = format_section(section.width, section.depth, self.units.system)
            self._section_notes[key] = f"section {size} from {section.source}{named}"
        return self._section_notes[key]

    def _profile_set(self, definition):
        """The material profile set of a material definition (see profile_set_of), found once per definition."""
        if definition is None:
            return None
        key = definition.id()
        if key not in self._profile_sets:
            self._profile_sets[key] = profile_set_of(definition)
        return self._profile_sets[key]

    def _read_span(self, record: MemberRecord, common: tuple, own_psets: dict, type_info: _TypeInfo, axis) -> None:
        found = self._common_property("Span", common, own_psets, type_info)
        if found is not None:
            try:
                record.span = self._length(found.prop)
            except ModelReadError as exc:
                record.problems.append(f"{found.pset}.Span on the {found.source} is not used: {exc}")
            else:
                record.span_source, record.span_is_clear = f"{found.pset}.Span", True
                record.notes.append(f"span {format_length(record.span, self.units.system)} from {found.pset}.Span on the {found.source}")
                return
        if axis is None:
            record.problems.append("no span found (no Span property, Axis representation or extrusion)")
            return
        length = axis.length * self.to_inch
        record.span = length * math.cos(math.radians(record.slope))
        record.span_source = axis.source
        record.notes.append(self._span_note(record.span, axis.source))
        if record.slope > 0:
            record.notes.append(
                f"span is the horizontal projection of the sloped length "
                f"({format_length(length, self.units.system)} at {record.slope:.1f}°)"
            )

    def _span_note(self, span: float, source: str) -> str:
        """The note of a span read from an axis or extrusion, written once per distinct span."""
        key = (span, source)
        if key not in self._span_notes:
            self._span_notes[key] = f"span {format_length(span, self.units.system)} from {source}"
        return self._span_notes[key]

    def _length(self, prop) -> float:
        """A positive length property in inches (its own unit, else the model's length unit)."""
        number = _finite_number(prop.NominalValue.wrappedValue)
        factor = property_unit_to_core(prop.Unit, "length") if prop.Unit is not None else self.to_inch
        value = number * factor
        if not 0 < value <= _ABSURD_LENGTH:
            raise ModelReadError(f"{number!r} is not a positive length below {_ABSURD_LENGTH:g} in")
        return value

    def _read_inputs(self, record: MemberRecord, own_psets: dict, type_info: _TypeInfo) -> None:
        """The input property set, occurrence over type per property, converted to core units."""
        type_pset, own_pset = type_info.inputs, _property_set(own_psets.get(INPUT_PSET))
        key = (type_pset.id() if type_pset is not None else None, own_pset.id() if own_pset is not None else None)
        if key not in self._inputs:  # members of one type mostly share the same sets
            self._inputs[key] = self._combined_inputs(type_pset, own_pset)
        given = self._inputs[key]
        record.problems += given.problems
        record.notes += given.notes
        record.inputs.update(given.values)
        record.input_sources.update(given.sources)

    def _combined_inputs(self, type_pset, own_pset) -> "_Inputs":
        """The inputs of a type's and an occurrence's input property sets, occurrence over type per property."""
        given = {}
        for source, pset in (("type", type_pset), ("occurrence", own_pset)):
            if pset is not None:
                given.update({name: (read, source) for name, read in self._pset_inputs(pset).items()})
        inputs = _Inputs()
        for name, (read, source) in given.items():
            where = f"{INPUT_PSET}.{name} on the {source}"
            if read.problem:
                inputs.problems.append(f"{where} is not used: {read.problem}")
            elif read.note:
                inputs.notes.append(f"{where} {read.note}")
            if read.usable:
                inputs.values[name], inputs.sources[name] = read.value, source
        return inputs

    def _pset_inputs(self, pset) -> dict:
        """Each property of one input property set, read once per set (sets are often shared)."""
        key = pset.id()
        if key not in self._inputs_by_pset:
            self._inputs_by_pset[key] = {prop.Name: self._input(prop) for prop in pset.HasProperties or ()}
        return self._inputs_by_pset[key]

    def _input(self, prop) -> "_Input":
        if prop.Name not in INPUT_PROPS:
            return _Input(note="is not an input property of ifccheck; ignored")
        if prop.is_a("IfcPropertySingleValue") and prop.NominalValue is None:
            return _Input(note="has no value; ignored")
        try:
            value, note = self._input_value(prop)
        except ModelReadError as exc:
            return _Input(problem=str(exc))
        return _Input(value=value, usable=True, note=note)

    def _input_value(self, prop) -> tuple:
        """(value in core units, note) of one input; ModelReadError saying why when it is invalid."""
        if not prop.is_a("IfcPropertySingleValue"):
            raise ModelReadError(f"it is an {prop.is_a()}; give a single value")
        name, kind = prop.Name, INPUT_PROPS[prop.Name]
        measure, raw = prop.NominalValue.is_a(), prop.NominalValue.wrappedValue
        if kind == "bool":
            if measure not in _BOOLEANS or not isinstance(raw, bool):
                raise ModelReadError(f"{raw!r} ({measure}) is not an IfcBoolean TRUE or FALSE")
            return raw, ""
        if kind == "label":
            if measure not in _LABELS or not str(raw).strip():
                raise ModelReadError(f"{raw!r} ({measure}) is not a non-empty IfcLabel")
            return str(raw).strip(), ""
        number = _finite_number(raw)
        if kind == "number":
            if measure not in _PLAIN_NUMBERS:
                raise ModelReadError(f"{raw!r} is an {measure}; give a plain number (IfcReal)")
            return _checked_number(name, number), ""
        if kind == "temperature":
            return _checked_temperature(self._temperature_f(prop, number, measure)), ""
        factor = self._input_factor(prop, kind, measure)
        note = ""
        if measure in _PLAIN_NUMBERS and prop.Unit is None:
            note = f"is a plain {measure}; read in the model's {kind.replace('_', ' ')} unit"
        return _checked_measure(name, kind, number * factor), note

    def _input_factor(self, prop, kind: str, measure: str) -> float:
        if measure not in _MEASURES[kind] and measure not in _PLAIN_NUMBERS:
            expected = " or ".join(_MEASURES[kind])
            raise ModelReadError(f"it is an {measure}; give an {expected}")
        if prop.Unit is not None:
            return property_unit_to_core(prop.Unit, kind)
        return self.units.to_core[_MEASURES[kind].get(measure, kind)]

    def _temperature_f(self, prop, number: float, measure: str) -> float:
        if measure not in _MEASURES["temperature"] and measure not in _PLAIN_NUMBERS:
            raise ModelReadError(f"it is an {measure}; give an IfcThermodynamicTemperatureMeasure")
        unit = temperature_unit(prop.Unit) if prop.Unit is not None else model_temperature_unit(self.model)
        return to_temperature_f(number, unit)


# --- element-level helpers -----------------------------------------------------------------


def _by_name(definitions) -> dict:
    """Property and quantity sets by name (the first of a name wins)."""
    found: dict = {}
    for definition in definitions:
        found.setdefault(definition.Name, definition)
    return found


def _property_set(definition):
    """``definition`` when it is an IfcPropertySet, else None (quantity sets hold no inputs)."""
    return definition if definition is not None and definition.is_a("IfcPropertySet") else None


def _first_property(name: str, pset_names: tuple, psets: dict, source: str) -> Optional[_Found]:
    """The first single value named ``name`` that has a value, in the sets ``pset_names`` in order."""
    for pset_name in pset_names:
        pset = psets.get(pset_name)
        if pset is None or not pset.is_a("IfcPropertySet"):
            continue
        for prop in pset.HasProperties or ():
            if prop.Name == name and prop.is_a("IfcPropertySingleValue") and prop.NominalValue is not None:
                return _Found(prop, pset_name, source)
    return None


#: predefined types that let ObjectType / ElementType name the type
_UNSET_TYPES = (None, "", "USERDEFINED", "NOTDEFINED")


def _user_defined(predefined, written) -> str:
    """A USERDEFINED (or, in IFC2X3, absent) predefined type takes the type name written in
    ObjectType / ElementType when that names a known type, e.g. JOIST on an IFC2X3 beam type."""
    if predefined in _UNSET_TYPES and written:
        name = str(written).strip().upper().replace(" ", "_")
        if name in KNOWN_PREDEFINED_TYPES:
            return name
    return predefined or ""


def _predefined_type(own: str, type_info: _TypeInfo) -> str:
    """The occurrence's own predefined type, else its type's, else NOTDEFINED."""
    if own and own != "NOTDEFINED":
        return own
    if type_info.predefined and type_info.predefined != "NOTDEFINED":
        return type_info.predefined
    return "NOTDEFINED"


def _with_input_identity(info: MaterialInfo, inputs: dict) -> MaterialInfo:
    """A Species or Grade in the input property set makes a member of unidentified material timber.

    A member whose material says otherwise (steel, concrete) is kept as a candidate too, so the
    contradiction is reported (NOT_CHECKED) instead of being resolved silently either way.
    """
    if info.kind == "timber":
        return info
    for name in ("Species", "Grade"):
        if name in inputs:
            return replace(info, kind="timber", matched=f"{INPUT_PSET}.{name}", contradicted=info.kind == "non_timber")
    return info


def _note_material(record: MemberRecord) -> None:
    material = record.material
    if material.kind == "unknown":
        named = f"name '{material.name}'" if material.name else "no material assigned"
        record.problems.append(f"material not identified ({named})")
        return
    if material.contradicted:
        record.problems.append(
            f"material '{material.name}' is not timber but {INPUT_PSET} gives a Species or Grade; fix one of them"
        )
    if material.name:
        record.notes.append(f"material '{material.name}' from {material.source} (timber by '{material.matched}')")
    else:
        record.notes.append(f"timber by {material.matched}")


def _axis_along(points: list, object_matrix: np.ndarray) -> Optional[_Axis]:
    """The axis along ``points`` (object coordinates) of a member placed by ``object_matrix``; None if of no length.

    Object placements are rotations without scale, so the axis length is taken in object coordinates.
    """
    length = sum(math.dist(a, b) for a, b in zip(points, points[1:]))
    if not length > 0:
        return None
    rotation = object_matrix[:3, :3]
    start, end = rotation @ points[0], rotation @ points[-1]
    return _Axis(length, end - start, "axis", tuple(start.tolist()), tuple(end.tolist()))


def _profile_centre(profile) -> tuple:
    """Centre (x, y) of a profile in its own coordinates: the location of its Position; for a
    composite profile the mean of its parts' centres; the origin for a profile without a Position."""
    if profile.is_a("IfcCompositeProfileDef"):
        centres = [_profile_centre(part) for part in profile.Profiles or ()]
        if not centres:
            return (0.0, 0.0)
        return (sum(c[0] for c in centres) / len(centres), sum(c[1] for c in centres) / len(centres))
    position = getattr(profile, "Position", None)  # parameterized profiles have one
    location = position.Location if position is not None else None
    if location is None or not location.is_a("IfcCartesianPoint"):
        return (0.0, 0.0)
    x, y = (*location.Coordinates, 0.0)[:2]
    return (float(x), float(y))


#: curves of an 'Axis' representation whose points the reader follows
_AXIS_CURVES = frozenset({"IfcPolyline", "IfcIndexedPolyCurve", "IfcTrimmedCurve"})


def _axis_points(representations: list) -> Optional[list]:
    """Points (object coordinates, 3-tuples) of the first curve of the 'Axis' representation.

    ``representations`` are (identifier, representation) pairs, see :func:`sections.identified`.
    """
    for identifier, representation in representations:
        items = representation.get_argument(ITEMS) if identifier == "Axis" else None
        if items:
            points = _axis_curve_points(items[0])
            if points is not None and len(points) >= 2:
                return points
    return None


def _axis_curve_points(curve) -> Optional[list]:
    """Points of an axis curve: a polyline's read by position (the common axis, and twice as fast),
    the other followed curves through their get_info dict; None for a curve not followed."""
    kind = curve.is_a()
    if kind == "IfcPolyline":
        return [_point3(point.get_argument(_COORDINATES)) for point in curve.get_argument(_POLYLINE_POINTS)]
    return _curve_points(curve.get_info(recursive=True)) if kind in _AXIS_CURVES else None


def _curve_points(curve: dict) -> Optional[list]:
    """Points of a curve given as a get_info dict: indexed poly curve, or a trimmed line."""
    kind = curve["type"]
    if kind == "IfcIndexedPolyCurve":
        coordinates = curve["Points"]["CoordList"]
        if curve["Segments"]:
            indices = [i for segment in curve["Segments"] for i in segment["wrappedValue"]]
            coordinates = [coordinates[i - 1] for k, i in enumerate(indices) if k == 0 or i != indices[k - 1]]
        return [_point3(coordinate) for coordinate in coordinates]
    if kind == "IfcTrimmedCurve" and curve["BasisCurve"]["type"] == "IfcLine":
        return [_trim_point(curve["BasisCurve"], trims) for trims in (curve["Trim1"], curve["Trim2"])]
    return None


def _trim_point(line: dict, trims) -> tuple:
    """A trimming point of a line: the cartesian point if given, else the point at the parameter."""
    for trim in trims:
        if trim["type"] == "IfcCartesianPoint":
            return _point3(trim["Coordinates"])
    parameter = next(trim["wrappedValue"] for trim in trims if trim["type"] == "IfcParameterValue")
    start = np.array(_point3(line["Pnt"]["Coordinates"]))
    direction = np.array(_point3(line["Dir"]["Orientation"]["DirectionRatios"]))
    step = direction / np.linalg.norm(direction) * float(line["Dir"]["Magnitude"])
    return tuple(start + parameter * step)


def _point3(coordinates) -> tuple:
    """A 2D or 3D coordinate tuple as 3D."""
    return (*coordinates, 0.0)[:3] if len(coordinates) == 2 else tuple(coordinates)


def _storey_name(element) -> str:
    """Name of the IfcBuildingStorey containing the element (directly, via spaces, or via its assembly)."""
    storey = ifc_element.get_container(element, ifc_class="IfcBuildingStorey")
    return (storey.Name or "") if storey is not None else ""


def _storey_name_of_structure(structure) -> str:
    """Name of the IfcBuildingStorey that is, or aggregates, a spatial structure element ("" for none)."""
    while structure:
        if structure.is_a("IfcBuildingStorey"):
            return structure.Name or ""
        structure = ifc_element.get_aggregate(structure)
    return ""


def _finite_number(raw) -> float:
    if raw is None:  # how ifcopenshell reads a NaN written in the file
        raise ModelReadError("its value is not a number (NaN or unreadable)")
    if isinstance(raw, bool) or not isinstance(raw, (int, float)):
        raise ModelReadError(f"{raw!r} is not a number")
    if not math.isfinite(raw):
        raise ModelReadError(f"{raw!r} is not a finite number")
    return float(raw)


def _checked_number(name: str, number: float):
    if name == "Plies":
        if number != int(number) or number < 1:
            raise ModelReadError(f"{number:g} is not a whole number of plies of 1 or more")
        return int(number)
    if number <= 0:
        raise ModelReadError(f"{number:g} is not a positive n of L/n")
    return number


def _checked_measure(name: str, kind: str, value: float) -> float:
    """A load or length in core units, within what a model can mean."""
    if kind == "length":
        if not 0 < value <= _ABSURD_LENGTH:
            raise ModelReadError(f"{value:g} in is not a positive length below {_ABSURD_LENGTH:g} in")
        return value
    if value < 0 and name != "WindLoad":  # only wind may act upward (uplift)
        raise ModelReadError(f"{value:g} is negative; only WindLoad may be negative (uplift)")
    if abs(value) > _ABSURD_LOAD:
        raise ModelReadError(f"{value:g} (core units) is beyond any real load ({_ABSURD_LOAD:g})")
    return value


def _checked_temperature(value_f: float) -> float:
    if value_f < _ABSOLUTE_ZERO_F:
        raise ModelReadError(f"{value_f:g} °F is below absolute zero")
    return value_f


def _guarded(record: MemberRecord, what: str, read, *args):
    """Run one reading step, ``read(*args)``; when the model's data breaks it, record a problem and go on."""
    try:
        return read(*args)
    except Exception as exc:  # noqa: BLE001 - any failure on odd data becomes a stated problem
        record.problems.append(f"{what} cannot be read ({type(exc).__name__}: {exc})")
        return None


def _skip(element, reason: str, category: str) -> SkippedElement:
    return SkippedElement(
        global_id=element.GlobalId, name=element.Name or "", ifc_class=element.is_a(), reason=reason, category=category
    )


def _unreadable(element, exc: Exception) -> MemberRecord:
    return MemberRecord(
        global_id=getattr(element, "GlobalId", "") or "",
        name=getattr(element, "Name", "") or "",
        ifc_class=element.is_a(),
        predefined_type="NOTDEFINED",
        storey="",
        material=MaterialInfo(),
        section=None,
        problems=[f"element cannot be read ({type(exc).__name__}: {exc})"],
    )
