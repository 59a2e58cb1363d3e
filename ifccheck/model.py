"""Typed records passed between the reader, the design checks and the writers.

All numbers are in the core unit system of :mod:`ifccheck.units` (inch, lbf, psi, lbf/in,
degrees Fahrenheit). The reader fills these records from an IFC model; nothing here touches
ifcopenshell.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Optional

#: ASD load types, in the order used by every load array: dead, floor live, roof live, snow, wind
LOAD_TYPES = ("D", "L", "Lr", "S", "W")

#: names of the input property set and its load properties (ours; documented in the README)
INPUT_PSET = "ifccheck_DesignInput"
VERDICT_PSET = "ifccheck_Verdict"
LINE_LOAD_PROPS = {"DeadLoad": "D", "LiveLoad": "L", "RoofLiveLoad": "Lr", "SnowLoad": "S", "WindLoad": "W"}
AREA_LOAD_PROPS = {"DeadAreaLoad": "D", "LiveAreaLoad": "L", "RoofLiveAreaLoad": "Lr", "SnowAreaLoad": "S"}

#: every property of the input property set and its kind: "linear_force", "planar_force",
#: "length", "bool", "label", "temperature" or "number" (a plain ratio such as the n of L/n)
INPUT_PROPS = {
    **{name: "linear_force" for name in LINE_LOAD_PROPS},
    **{name: "planar_force" for name in AREA_LOAD_PROPS},
    "TributaryWidth": "length",
    "SelfWeightIncluded": "bool",
    "Species": "label",
    "Grade": "label",
    "RepetitiveMember": "bool",
    "WetService": "bool",
    "ServiceTemperature": "temperature",
    "ContinuouslyBraced": "bool",
    "UnbracedLength": "length",
    "BearingLength": "length",
    "LiveDeflectionLimit": "number",
    "TotalDeflectionLimit": "number",
    # number of equal plies a built-up member's modelled (total) width is made of
    "Plies": "number",
}


@dataclass(frozen=True)
class Section:
    """A rectangular (possibly built-up) cross-section as found in the model.

    ``width`` is the dimension across the bending plane (b) and ``depth`` the one in the
    vertical bending plane (d), both in inches; for a built-up member ``width`` is the total of
    all ``plies``.
    """

    width: float
    depth: float
    plies: int = 1
    source: str = ""  # "profile set", "extrusion", "base quantities"
    profile_name: str = ""

    @property
    def ply_width(self) -> float:
        return self.width / self.plies


@dataclass(frozen=True)
class MaterialInfo:
    """What the model says about a member's material, before any design-basis lookup."""

    name: str = ""
    category: str = ""
    species: str = ""  # Pset_MaterialWood.Species
    grade: str = ""  # Pset_MaterialWood.StrengthGrade
    kind: str = "unknown"  # "timber", "non_timber" or "unknown"
    matched: str = ""  # the word or pattern that decided the kind
    source: str = ""  # "occurrence" or "type"
    #: True when the material says non-timber but the input property set names a species or grade
    contradicted: bool = False


@dataclass(frozen=True)
class SupportRecord:
    """A support of a member found in the model's structural-analysis data (core units).

    ``x`` runs along the member from its start (inches); ``kind`` is pinned, roller or fixed;
    ``width`` is the bearing length along the member (NaN: use the design inputs' bearing length).
    """

    x: float
    kind: str = "pinned"
    width: float = float("nan")
    source: str = ""
    #: where this member bears on another checked member: that member's GlobalId and the position
    #: along it (in); the reaction here is a point load on the carrier ("" / NaN when none)
    carrier: str = ""
    carrier_x: float = float("nan")
    #: the supporting element found in the geometry (GlobalId), whose reactions are listed
    element: str = ""


@dataclass(frozen=True)
class LoadRecord:
    """A load on a member from the model's structural-analysis data (core units, gravity positive).

    ``kind``: "uniform" (``value`` lbf/in from ``a`` to ``b``), "linear" (``value`` at ``a`` to
    ``value_end`` at ``b``, lbf/in), "point" (``value`` lbf at ``a``) or "moment" (``value`` lbf·in
    at ``a``, clockwise positive). Positions in inches from the member's start.
    """

    load_type: str  # one of LOAD_TYPES
    kind: str
    value: float
    a: float
    b: float = float("nan")
    value_end: float = float("nan")
    source: str = ""


@dataclass
class AnalysisInput:
    """What the structural-analysis data says about one physical member (core units)."""

    length: float  # analysis member length along the member, in
    supports: list = field(default_factory=list)  # list[SupportRecord]
    loads: list = field(default_factory=list)  # list[LoadRecord]
    notes: list = field(default_factory=list)
    problems: list = field(default_factory=list)


@dataclass
class MemberRecord:
    """One candidate bending member read from the model (core units)."""

    global_id: str
    name: str
    ifc_class: str
    predefined_type: str
    storey: str
    material: MaterialInfo
    section: Optional[Section]
    #: span length as read (inches) and where it came from; ``span_is_clear`` is True when it is
    #: a clear span between supports (Pset ``Span``), False when it is the member's length
    span: Optional[float] = None
    span_source: str = ""
    span_is_clear: bool = False
    #: slope of the member axis from horizontal, degrees (0 when unknown)
    slope: float = 0.0
    #: input property set values in core units, keyed by property name (see INPUT_PROPS)
    inputs: dict = field(default_factory=dict)
    #: where each input came from ("occurrence" or "type"), keyed like ``inputs``
    input_sources: dict = field(default_factory=dict)
    #: provenance notes: what was read from where and what was assumed
    notes: list = field(default_factory=list)
    #: reasons found while reading that prevent a check (lead to NOT_CHECKED)
    problems: list = field(default_factory=list)
    #: supports and loads from the model's structural-analysis data, when it has any for this member
    analysis: Optional[AnalysisInput] = None
    #: world coordinates (x, y, z) of the ends of the member's axis, inches: from its 'Axis'
    #: representation, else its body extrusion through the profile centre (None when unknown)
    axis_start: Optional[tuple] = None
    axis_end: Optional[tuple] = None


@dataclass(frozen=True)
class SkippedElement:
    """A candidate class element left out of the check, with the reason (counted, not judged)."""

    global_id: str
    name: str
    ifc_class: str
    reason: str  # e.g. "non-timber material 'S235' (steel)", "LoadBearing is FALSE", "steeper than 60°"
    category: str  # "non_timber", "not_load_bearing" or "not_bending"


@dataclass(frozen=True)
class ElementBox:
    """An element that may support, brace or load members (wall, column, beam, member, slab,
    roof, footing, space), as its world axis-aligned bounding box in inches."""

    global_id: str
    name: str
    ifc_class: str
    kind: str  # "wall", "column", "beam", "member", "slab", "roof", "footing", "plate", "space"
    storey: str
    lo: tuple  # (x, y, z) minimum corner
    hi: tuple  # (x, y, z) maximum corner
    #: slabs, roofs and spaces: the texts a project rule's ``slab`` or ``space_usage`` is matched
    #: against (name, object type, type name, classification, and for spaces long name and occupancy)
    tags: tuple = ()
    #: slabs and roofs: ((material text, thickness in inches), ...) bottom to top, for the slab's weight
    layers: tuple = ()
    layers_source: str = ""  # where the layers came from, e.g. "material layer set", "material and box height"


@dataclass
class ModelUnits:
    """The model's unit scales: factor from the model's unit of each kind to core units."""

    to_core: dict  # kind -> float (model value * factor = core value)
    length_name: str = "metre"
    system: str = "metric"  # "metric" or "imperial", decides CSV and console units


@dataclass
class ReadResult:
    """Everything the reader hands on: candidates, skipped elements, units, schema."""

    schema: str
    units: ModelUnits
    members: list  # list[MemberRecord]
    skipped: list  # list[SkippedElement]
    #: what the structural-analysis data gave (ifccheck.ifc.structural.StructuralSummary), if read
    structural: object = None
    #: walls, columns, beams, slabs and roofs as boxes, for supports and bracing from the geometry
    elements: list = field(default_factory=list)  # list[ElementBox]
    unreadable_elements: int = 0  # elements whose box could not be read from their geometry
