"""Supports and loads of the checked members from the model's structural-analysis data.

IFC2X3, IFC4 and IFC4X3 describe an analysis model with IfcStructuralCurveMember (an IfcEdge
between two vertices), IfcStructuralPointConnection (a vertex, restrained where it carries an
IfcBoundaryNodeCondition) and IfcStructuralAction (loads) assigned to load groups and load cases.
:func:`read_structural` links each physical member to its curve member(s), through
IfcRelAssignsToProduct or else by matching end points, and turns what holds and loads them into
an :class:`~ifccheck.model.AnalysisInput` in core units.

Conventions of the records:

* ``x`` runs from the physical member's start (first point of its 'Axis' representation, else the
  start of its body extrusion) along its axis, in inches; analysis points off the axis are
  projected onto it. ``length`` is the member's length along that axis.
* Loads are gravity positive: only the component along world -Z is taken. Other force components
  and all moments are left out, and a note says so.
* Line loads are per horizontal length. The checker analyses a sloped member on its horizontal
  projection (positions times cos(slope)), so PROJECTED_LENGTH values are taken as given and
  values per true length are multiplied by true length / horizontal length.
* Structural items are placed by their own ObjectPlacement, else by the SharedPlacement of their
  analysis model (IFC4 and later), else they are in world coordinates. GLOBAL_COORDS loads and
  IFC4 curve-member Axis directions are in the analysis model's global system (its SharedPlacement).
* A node restrained vertically (IfcBoundaryNodeCondition) is a support. A node that holds nothing
  but joins another member at this member's end is a pinned support; when the node lies inside the
  length of another checked member (not at its ends), that member carries this one: the support
  names it (``carrier``, ``carrier_x`` along it) and the design check applies the reaction to it as
  a point load, carried members first. A joint with a member that is not checked, or of member ends
  only, carries the reaction no further. Members meet at the same IfcStructuralPointConnection, or
  at distinct point connections within the tolerance of each other (found on a position grid).

The load type of each load group comes from rules/load_groups.toml (ActionSource, ActionType, then
the group's name, then the group it belongs to). Odd data never stops the reading: what cannot be
read becomes a problem of the member it concerns.
"""

from __future__ import annotations

import functools
import math
import re
from collections import Counter, defaultdict
from dataclasses import dataclass, field
from typing import Optional

import ifcopenshell
import ifcopenshell.util.placement as ifc_placement
import numpy as np

from ..errors import ModelReadError, RulesError
from ..model import LOAD_TYPES, AnalysisInput, LoadRecord, SupportRecord
from ..rules import read_toml, rules_dir
from .reader import axis_ends
from .units import project_unit_to_si

# linking and position tolerance: 1 % of the member's length, at least 2 in (common practice)
_TOLERANCE_RATIO = 0.01
_TOLERANCE_MIN_IN = 2.0
_GRID_IN = 6.0  # cell of the end-point grid, inches
# a stiffness at or above this (N/m, N·m/rad) is a rigid restraint; exports write 1e10 for "fixed"
_RIGID_SI = 1e9
_ALIGNED = 1e-6  # direction cosine below which a restraint axis has no share in a direction
_SMALL = 1e-9  # relative size below which a force component is zero
_UP = np.array((0.0, 0.0, 1.0))
_COMBINATIONS = frozenset({"LOAD_COMBINATION", "LOAD_COMBINATION_GROUP"})
_UNSET = frozenset({None, "NOTDEFINED", "USERDEFINED"})
# force and moment components of IfcStructuralLoadSingleForce and IfcStructuralLoadLinearForce
_POINT = (("ForceX", "ForceY", "ForceZ"), ("MomentX", "MomentY", "MomentZ"))
_LINEAR = (("LinearForceX", "LinearForceY", "LinearForceZ"), ("LinearMomentX", "LinearMomentY", "LinearMomentZ"))
IGNORED = "ignored"  # load type of actions that put no load on a bending check
SELF_WEIGHT = "self_weight"  # name label: D, and the analysis's self weight


@dataclass
class StructuralSummary:
    """What the model's structural-analysis data gave: per member for the checker, counts for the console.

    Model-wide counts: ``analysis_models``, ``curve_members``, ``groups_by_type`` (load groups and
    load cases, combinations excepted, by load type, "ignored" or "unmapped"), ``load_combinations``
    (skipped: the checker applies its own ASD combinations) and ``unmapped_groups`` (names).
    The other counts cover the members passed in.
    """

    by_member: dict = field(default_factory=dict)  # GlobalId -> AnalysisInput
    analysis_models: int = 0
    curve_members: int = 0
    linked_by_relation: int = 0  # physical members linked through IfcRelAssignsToProduct
    linked_by_geometry: int = 0  # physical members linked by matching end points
    supports: int = 0
    groups_by_type: dict = field(default_factory=dict)
    load_combinations: int = 0
    unmapped_groups: list = field(default_factory=list)
    temperature_actions: int = 0  # ignored
    actions_without_values: int = 0  # plain IfcStructuralLoad, e.g. a request for the self weight
    non_gravity_components: int = 0  # actions whose components other than gravity were left out
    problems: list = field(default_factory=list)  # model-wide: why the analysis data is not used


def read_structural(
    model: ifcopenshell.file, members: dict, to_core: dict, rules: dict, axes: Optional[dict] = None
) -> StructuralSummary:
    """Supports and loads from the structural-analysis data for each member linked to it.

    ``members`` maps GlobalId to the physical IfcBeam / IfcMember; ``axes`` maps GlobalId to its
    world axis ends in inches as the member reader found them (read here the same way when not
    given, see :func:`.reader.axis_ends`); ``to_core`` holds the model's
    unit factors (:class:`~ifccheck.model.ModelUnits`); ``rules`` is the dict of
    :func:`ifccheck.rules.load_rules`, whose optional ``load_groups`` section extends
    rules/load_groups.toml (see :func:`load_group_rules`). Members the analysis model does not
    describe get no entry in ``by_member``.
    """
    group_rules = load_group_rules(rules)  # a RulesError here is the rules' fault, not the model's
    summary = StructuralSummary(
        analysis_models=len(model.by_type("IfcStructuralAnalysisModel")),
        curve_members=len(model.by_type("IfcStructuralCurveMember")),
    )
    try:
        groups = _LoadGroups(model, group_rules)
        summary.groups_by_type, summary.load_combinations = groups.counts(), groups.combinations
        summary.unmapped_groups = groups.unmapped()
        reader = _MemberReader(model, to_core, groups, summary) if summary.curve_members else None
    except Exception as exc:  # noqa: BLE001 - odd model-wide data: the members are checked without it
        summary.problems.append(
            f"the structural-analysis data cannot be read ({type(exc).__name__}: {exc}); it is not used"
        )
        return summary
    if reader is not None:
        summary.by_member = reader.read_all(members, axes if axes is not None else axis_ends(model, members.values()))
    return summary


# --- load group types ------------------------------------------------------------------------


@dataclass(frozen=True)
class GroupRules:
    """The load-group mapping: enumeration values to load types and name patterns in the order tried."""

    action_source: dict
    action_type: dict
    names: tuple  # ((label, compiled pattern), ...): label is a load type, "ignored" or "self_weight"

    def name_label(self, name: str) -> Optional[str]:
        text = name.strip().lower()
        return next((label for label, pattern in self.names if pattern.search(text)), None)


def load_group_rules(rules: dict) -> GroupRules:
    """The mapping of rules/load_groups.toml with a project's ``rules["load_groups"]`` over it.

    A project section may set ``action_source`` and ``action_type`` entries and add ``names`` per
    label (e.g. ``{"names": {"L": ["^fl$"]}}``); its names are tried before the defaults.
    """
    defaults = _default_group_rules()
    project = rules.get("load_groups") or {}
    where = "project rules [load_groups]"
    action_source = {**defaults["action_source"], **project.get("action_source", {})}
    action_type = {**defaults["action_type"], **project.get("action_type", {})}
    for table, mapping in (("action_source", action_source), ("action_type", action_type)):
        for key, label in mapping.items():
            if label not in (*LOAD_TYPES, IGNORED):
                raise RulesError(
                    f"load groups: [{table}] {key} = {label!r}; expected one of {', '.join((*LOAD_TYPES, IGNORED))}"
                )
    order = defaults["names"]["order"]
    names = _compiled_names(project.get("names", {}), order, where)
    names += _compiled_names(defaults["names"], order, "rules/load_groups.toml")
    return GroupRules(action_source=action_source, action_type=action_type, names=names)


@functools.lru_cache(maxsize=None)
def _default_group_rules() -> dict:
    return read_toml(rules_dir() / "load_groups.toml")


def _compiled_names(table: dict, order: list, where: str) -> tuple:
    unknown = set(table) - set(order) - {"order"}
    if unknown:
        raise RulesError(f"{where}: unknown name labels {', '.join(sorted(unknown))}; use {', '.join(order)}")
    compiled = []
    for label in order:
        for pattern in table.get(label, ()):
            try:
                compiled.append((label, re.compile(pattern)))
            except re.error as exc:
                raise RulesError(
                    f"{where}: names.{label} pattern {pattern!r} is not a regular expression ({exc})"
                ) from exc
    return tuple(compiled)


@dataclass(frozen=True)
class _GroupType:
    """The load type of one load group or case, or why it has none."""

    name: str
    load_type: Optional[str]  # one of LOAD_TYPES, "ignored", or None
    source: str = ""  # what decided it
    self_weight: bool = False
    coefficient: Optional[float] = None
    problem: str = ""  # when load_type is None


class _LoadGroups:
    """Load types of every load group and load case of the model, each decided once."""

    def __init__(self, model: ifcopenshell.file, rules: GroupRules) -> None:
        self.rules = rules
        self.combinations = 0
        self._types: dict = {}
        for group in model.by_type("IfcStructuralLoadGroup"):
            if group.PredefinedType in _COMBINATIONS:
                self.combinations += 1
            else:
                self.type_of(group)

    def counts(self) -> dict:
        return dict(Counter(group.load_type or "unmapped" for group in self._types.values()))

    def unmapped(self) -> list:
        return [group.name for group in self._types.values() if group.load_type is None]

    def type_of(self, group, visiting: frozenset = frozenset()) -> _GroupType:
        key = group.id()
        if key not in self._types:
            self._types[key] = self._resolve(group, visiting | {key})
        return self._types[key]

    def of_action(self, action) -> _GroupType:
        """The type of the load group or case an action belongs to (combinations do not count)."""
        groups = _assigned_groups(action)
        cases = [group for group in groups if group.PredefinedType not in _COMBINATIONS]
        if not cases:
            where = "only in load combinations" if groups else "in no load group or load case"
            return _GroupType(name="", load_type=None, problem=f"{_label(action)} is {where}, so it has no load type")
        types = [self.type_of(group) for group in cases]
        mapped = {t.load_type for t in types if t.load_type is not None}
        if len(mapped) > 1:
            names = ", ".join(f"'{t.name}'" for t in types)
            return _GroupType(
                name=types[0].name,
                load_type=None,
                problem=f"{_label(action)} is in load groups {names} of different load types",
            )
        return next((t for t in types if t.load_type is not None), types[0])

    def _resolve(self, group, visiting: frozenset) -> _GroupType:
        name = group.Name or f"#{group.id()}"
        label = self.rules.name_label(name)
        self_weight = label == SELF_WEIGHT
        common = {"name": name, "self_weight": self_weight, "coefficient": group.Coefficient}
        source = group.ActionSource
        if source in self.rules.action_source:
            return _GroupType(load_type=self.rules.action_source[source], source=f"ActionSource {source}", **common)
        if source not in _UNSET:
            problem = (
                f"load group '{name}' has ActionSource {source}, which is none of the checked load types "
                f"{', '.join(LOAD_TYPES)}"
            )
            return _GroupType(load_type=None, problem=problem, **common)
        if group.ActionType in self.rules.action_type:
            return _GroupType(
                load_type=self.rules.action_type[group.ActionType], source=f"ActionType {group.ActionType}", **common
            )
        if label is not None:
            return _GroupType(load_type="D" if label == SELF_WEIGHT else label, source="its name", **common)
        parents = [parent for parent in _assigned_groups(group) if parent.PredefinedType not in _COMBINATIONS]
        for parent in parents:
            if parent.id() not in visiting:
                inherited = self.type_of(parent, visiting)
                if inherited.load_type is not None:
                    common["self_weight"] = self_weight or inherited.self_weight
                    return _GroupType(load_type=inherited.load_type, source=f"load group '{inherited.name}'", **common)
        problem = f"load group '{name}' has no load type (set ActionSource, or map its name in the rules)"
        return _GroupType(load_type=None, problem=problem, **common)


def _assigned_groups(obj) -> list:
    """The load groups, load cases and combinations an action or a load group is assigned to."""
    return [
        rel.RelatingGroup
        for rel in obj.HasAssignments or ()
        if rel.is_a("IfcRelAssignsToGroup") and rel.RelatingGroup.is_a("IfcStructuralLoadGroup")
    ]


# --- geometry ------------------------------------------------------------------------------


@dataclass(frozen=True)
class _Segment:
    """A straight line in world coordinates (inches) from its start to its end."""

    start: np.ndarray
    end: np.ndarray

    @property
    def length(self) -> float:
        return float(np.linalg.norm(self.end - self.start))

    @property
    def direction(self) -> np.ndarray:
        return (self.end - self.start) / self.length


@dataclass(frozen=True)
class _Axis(_Segment):
    """A physical member's axis; ``source`` says where it was read."""

    source: str

    @property
    def tolerance(self) -> float:
        return max(_TOLERANCE_RATIO * self.length, _TOLERANCE_MIN_IN)

    def x(self, point: np.ndarray) -> float:
        """Position of a point projected onto the axis, from the start."""
        return float((point - self.start) @ self.direction)

    def offset(self, point: np.ndarray) -> float:
        """Distance of a point from the axis line."""
        along = point - self.start
        return float(np.linalg.norm(along - (along @ self.direction) * self.direction))

    def at_end(self, x: float) -> bool:
        return x <= self.tolerance or x >= self.length - self.tolerance

    def outside(self, x: float) -> bool:
        return x < -self.tolerance or x > self.length + self.tolerance


@dataclass(frozen=True)
class _Curve(_Segment):
    """An IfcStructuralCurveMember and its edge."""

    entity: object


@dataclass
class _Chain:
    """A physical member's axis with its curve members in order along it and their connections."""

    axis: _Axis
    curves: list  # list[_Curve]
    connections: list = field(default_factory=list)  # [(connection, [IfcRelConnectsStructuralMember])]

    @property
    def ids(self) -> set:
        return {curve.entity.id() for curve in self.curves}


class _Places:
    """World matrices of structural items: own placement, else the analysis model's SharedPlacement."""

    def __init__(self, model: ifcopenshell.file, to_inch: float) -> None:
        self.to_inch = to_inch
        self._shared: dict = {}
        analyses = model.by_type("IfcStructuralAnalysisModel")
        placements = [getattr(analysis, "SharedPlacement", None) for analysis in analyses]
        self._default = _matrix(placements[0]) if len(analyses) == 1 else np.eye(4)
        for analysis, placement in zip(analyses, placements):
            if placement is not None:
                matrix = _matrix(placement)
                for rel in analysis.IsGroupedBy or ():
                    for item in rel.RelatedObjects:
                        self._shared[item.id()] = matrix

    def global_matrix(self, item) -> np.ndarray:
        return self._shared.get(item.id(), self._default)

    def frame(self, item, owner=None) -> np.ndarray:
        """Matrix placing ``item``'s topology: its own placement, else that of ``owner``'s analysis model."""
        if item.ObjectPlacement is not None:
            return _matrix(item.ObjectPlacement)
        return self.global_matrix(owner if owner is not None else item)

    def point(self, matrix: np.ndarray, coordinates) -> np.ndarray:
        local = np.array((*coordinates, 0.0)[:3], dtype=float)
        return (matrix[:3, :3] @ local + matrix[:3, 3]) * self.to_inch

    def vertex(self, item, matrix: np.ndarray) -> Optional[np.ndarray]:
        """The first IfcVertexPoint of an item's topology representation, in world inches."""
        for topology in _topology_items(item):
            if topology.is_a("IfcVertexPoint"):
                return self.point(matrix, _vertex_coordinates(topology))
        return None

    def edge(self, item, matrix: np.ndarray) -> Optional[tuple]:
        """(start, end) of the first IfcEdge of an item's topology representation, in world inches."""
        for topology in _topology_items(item):
            if topology.is_a("IfcOrientedEdge"):
                start, end = topology.EdgeElement.EdgeStart, topology.EdgeElement.EdgeEnd
                start, end = (start, end) if topology.Orientation else (end, start)
            elif topology.is_a("IfcEdge"):
                start, end = topology.EdgeStart, topology.EdgeEnd
            else:
                continue
            return self.point(matrix, _vertex_coordinates(start)), self.point(matrix, _vertex_coordinates(end))
        return None


def _matrix(placement) -> np.ndarray:
    if placement is None:
        return np.eye(4)
    if not placement.is_a("IfcLocalPlacement"):
        raise ModelReadError(f"placement {placement.is_a()} is not supported")
    return ifc_placement.get_local_placement(placement)


def _topology_items(item) -> list:
    shape = item.Representation
    return [
        topology for representation in (shape.Representations if shape else ()) for topology in representation.Items
    ]


def _vertex_coordinates(vertex) -> tuple:
    if not vertex.is_a("IfcVertexPoint") or not vertex.VertexGeometry.is_a("IfcCartesianPoint"):
        raise ModelReadError(f"vertex #{vertex.id()} is not an IfcVertexPoint at an IfcCartesianPoint")
    return tuple(float(c) for c in vertex.VertexGeometry.Coordinates)


def _axis_of_curves(curves: list) -> _Axis:
    """The line through the two end points of the curve members farthest apart (few points, all pairs)."""
    points = [p for curve in curves for p in (curve.start, curve.end)]
    start, end = max(
        ((a, b) for a in points for b in points), key=lambda pair: float(np.linalg.norm(pair[1] - pair[0]))
    )
    return _Axis(start, end, "analysis members")


# --- linking physical members to curve members ---------------------------------------------------


class _Links:
    """Curve members of each physical member: by IfcRelAssignsToProduct, else by matching end points."""

    def __init__(self, model: ifcopenshell.file, curve_of) -> None:
        self.by_physical: dict = defaultdict(list)  # physical id -> [curve member entity]
        self.physical_of: dict = {}  # curve member id -> physical element
        for rel in model.by_type("IfcRelAssignsToProduct"):
            relating, related = rel.RelatingProduct, rel.RelatedObjects or ()
            if relating is None:
                continue
            if relating.is_a("IfcStructuralCurveMember"):
                pairs = [(obj, relating) for obj in related if not obj.is_a("IfcStructuralItem")]
            else:
                pairs = [(relating, obj) for obj in related if obj.is_a("IfcStructuralCurveMember")]
            for physical, curve in pairs:
                self.by_physical[physical.id()].append(curve)
                self.physical_of[curve.id()] = physical
        self._ends = _Grid()  # (_Curve, 0 for start or 1 for end) by position
        self._claimed: set = set()
        for entity in model.by_type("IfcStructuralCurveMember"):
            if entity.id() not in self.physical_of:
                curve = _quietly(curve_of, entity)
                for end, point in enumerate((curve.start, curve.end) if curve else ()):
                    self._ends.add(point, (curve, end))

    def by_relation(self, element) -> list:
        return self.by_physical.get(element.id(), [])

    def by_geometry(self, axis: _Axis) -> list:
        """Curve members in a row from the axis start to its end, each step advancing along the axis."""
        tolerance, point, chain = axis.tolerance, axis.start, []
        while np.linalg.norm(point - axis.end) > tolerance:
            step = self._next(point, axis, tolerance, {curve.entity.id() for curve in chain})
            if step is None:
                return []
            chain.append(step[0])
            point = step[1]
        self._claimed.update(curve.entity.id() for curve in chain)
        return chain

    def _next(self, point: np.ndarray, axis: _Axis, tolerance: float, used: set) -> Optional[tuple]:
        best = None
        for curve, end in self._ends.near(point, tolerance):
            if curve.entity.id() in used or curve.entity.id() in self._claimed:
                continue
            far = curve.end if end == 0 else curve.start
            advance = axis.x(far) - axis.x(point)
            on_axis = axis.offset(far) <= tolerance and axis.x(far) <= axis.length + tolerance
            if on_axis and advance > tolerance and (best is None or advance > best[2]):
                best = (curve, far, advance)
        return best[:2] if best is not None else None


class _Grid:
    """Items by position in cubes of _GRID_IN, so that those near a point are found without comparing all pairs."""

    def __init__(self) -> None:
        self._cells: dict = defaultdict(list)  # cell -> [(point, item)]

    def add(self, point: np.ndarray, item) -> None:
        self._cells[_cell(point)].append((point, item))

    def near(self, point: np.ndarray, tolerance: float) -> list:
        """The items within ``tolerance`` of ``point``, cell by cell in the order added."""
        reach = math.ceil(tolerance / _GRID_IN)
        centre = _cell(point)
        found = []
        for dx in range(-reach, reach + 1):
            for dy in range(-reach, reach + 1):
                for dz in range(-reach, reach + 1):
                    for place, item in self._cells.get((centre[0] + dx, centre[1] + dy, centre[2] + dz), ()):
                        if np.linalg.norm(place - point) <= tolerance:
                            found.append(item)
        return found


def _cell(point: np.ndarray) -> tuple:
    return tuple(int(math.floor(c / _GRID_IN)) for c in point)


def _quietly(read, entity):
    """``read(entity)``, or None where the entity's data cannot be read (it then links nothing)."""
    try:
        return read(entity)
    except Exception:  # noqa: BLE001 - an unreadable curve member simply takes no part in matching
        return None


# --- supports ------------------------------------------------------------------------------


@dataclass(frozen=True)
class _Held:
    """Which of the six degrees of freedom a condition holds, about the axes of its frame (world)."""

    translation: tuple  # 3 bools
    rotation: tuple  # 3 bools
    axes: np.ndarray  # columns: the condition's x, y, z in world coordinates

    def holds_translation(self, direction: np.ndarray) -> bool:
        return self._holds(self.translation, direction)

    def holds_rotation(self, directions: list) -> bool:
        return all(self._holds(self.rotation, direction) for direction in directions)

    def _holds(self, flags: tuple, direction: np.ndarray) -> bool:
        """Held along a direction: every condition axis with a share in it is held."""
        return all(held for j, held in enumerate(flags) if abs(float(self.axes[:, j] @ direction)) > _ALIGNED)


# --- the member reader -----------------------------------------------------------------------


@dataclass
class _Linked:
    """A checked member linked to its curve members, with what has been read of it so far."""

    global_id: str
    label: str
    result: AnalysisInput
    chain: Optional[_Chain]  # None when none of its curve members can be read


@dataclass(frozen=True)
class _Joined:
    """Another member at a node: its name, and its link when it is a checked member."""

    label: str
    checked: Optional[_Linked]

    def carries_at(self, point: np.ndarray) -> Optional[float]:
        """The node's x along this checked member when it lies inside its length (not at an end), else None."""
        if self.checked is None or self.checked.chain is None:
            return None
        axis = self.checked.chain.axis
        x = axis.x(point)
        return None if axis.at_end(x) else x


class _MemberReader:
    """Links every checked member to its curve members, then reads the analysis data of one after
    another; curve members are read once."""

    def __init__(
        self, model: ifcopenshell.file, to_core: dict, groups: _LoadGroups, summary: StructuralSummary
    ) -> None:
        self.to_inch = to_core["length"]
        self.to_lbf = to_core["force"]
        self.to_lbf_per_in = to_core["linear_force"]
        self.groups = groups
        self.summary = summary
        self.places = _Places(model, self.to_inch)
        self.ifc2x3 = model.schema == "IFC2X3"
        # factors from the model's stiffness units to SI (IFC2X3 writes stiffness numbers)
        self.stiffness_to_si = {
            "translation": project_unit_to_si(model, "LINEARSTIFFNESSUNIT"),
            "rotation": project_unit_to_si(model, "ROTATIONALSTIFFNESSUNIT"),
        }
        self._curves: dict = {}
        self.links = _Links(model, self.curve)
        self._checked: dict = {}  # curve member id -> _Linked of the checked member it belongs to
        self._nodes = _Grid()  # every IfcStructuralPointConnection by position
        for connection in model.by_type("IfcStructuralPointConnection"):
            point = _quietly(self._node_point, connection)
            if point is not None:
                self._nodes.add(point, connection)

    def curve(self, entity) -> _Curve:
        key = entity.id()
        if key not in self._curves:
            edge = self.places.edge(entity, self.places.frame(entity))
            if edge is None or np.linalg.norm(edge[1] - edge[0]) == 0:
                raise ModelReadError(f"{_label(entity)} has no IfcEdge of positive length")
            self._curves[key] = _Curve(start=edge[0], end=edge[1], entity=entity)
        return self._curves[key]

    def _node_point(self, connection) -> Optional[np.ndarray]:
        return self.places.vertex(connection, self.places.frame(connection))

    def read_all(self, members: dict, axes: dict) -> dict:
        """GlobalId -> AnalysisInput of each member a curve member describes. Every member is linked
        before any is read, so that each knows the checked members it frames into."""
        linked = {}
        for global_id, element in members.items():
            member = self._link(global_id, element, axes.get(global_id))
            if member is not None:
                linked[global_id] = member
                for curve in member.chain.curves if member.chain is not None else ():
                    self._checked[curve.entity.id()] = member
        for member in linked.values():
            self._read_linked(member)
        _note_carried(linked)
        for member in linked.values():
            result = member.result
            result.notes, result.problems = _collapsed(result.notes), _collapsed(result.problems)
            self.summary.supports += len(result.supports)
        return {global_id: member.result for global_id, member in linked.items()}

    def _link(self, global_id: str, element, ends: Optional[tuple]) -> Optional[_Linked]:
        """The member with its chain of curve members, or None when no curve member describes it."""
        axis = _Axis(np.array(ends[0]), np.array(ends[1]), "axis") if ends is not None else None
        if axis is not None and not axis.length > 0:
            axis = None
        axis_problem = "" if axis is not None else "the member's axis cannot be read"
        entities = self.links.by_relation(element)
        how = "IfcRelAssignsToProduct"
        if not entities and axis is not None:
            entities = [curve.entity for curve in self.links.by_geometry(axis)]
            how = "matching end points"
        if not entities:
            return None
        result = AnalysisInput(length=axis.length if axis is not None else math.nan)
        if axis_problem:
            result.problems.append(axis_problem)
        try:
            chain = self._chain(entities, axis, result)
        except Exception as exc:  # noqa: BLE001 - odd data of one member must not stop the others
            chain = None
            result.problems.append(f"structural-analysis data cannot be read ({type(exc).__name__}: {exc})")
        if chain is not None:
            result.length = chain.axis.length
            result.notes.append(f"{len(chain.curves)} analysis member(s) linked by {how}")
        if how == "IfcRelAssignsToProduct":
            self.summary.linked_by_relation += 1
        else:
            self.summary.linked_by_geometry += 1
        return _Linked(global_id, _label(element), result, chain)

    def _read_linked(self, member: _Linked) -> None:
        if member.chain is None:
            return
        try:
            self._read_supports(member.chain, member.result)
            self._read_loads(member.chain, member.result)
        except Exception as exc:  # noqa: BLE001 - odd data of one member must not stop the others
            member.result.problems.append(f"structural-analysis data cannot be read ({type(exc).__name__}: {exc})")

    def _chain(self, entities: list, axis: Optional[_Axis], result: AnalysisInput) -> Optional[_Chain]:
        curves = []
        for entity in entities:
            try:
                curves.append(self.curve(entity))
            except ModelReadError as exc:
                result.problems.append(f"{exc}; it is left out")
        if not curves:
            result.problems.append("none of the linked analysis members can be read")
            return None
        if axis is None:
            axis = _axis_of_curves(curves)
            result.notes.append(
                f"the member's axis is not readable; its analysis members' extent ({axis.length:.1f} in) is used"
            )
        curves.sort(key=lambda curve: axis.x((curve.start + curve.end) / 2))
        offset = max(axis.offset(point) for curve in curves for point in (curve.start, curve.end))
        if offset > axis.tolerance:
            result.notes.append(
                f"the analysis members lie up to {offset:.1f} in off the member's axis; positions are projected onto it"
            )
        chain = _Chain(axis, curves)
        chain.connections = _connections_of(chain)
        return chain

    # --- supports ----------------------------------------------------------------------------

    def _read_supports(self, chain: _Chain, result: AnalysisInput) -> None:
        for connection, rels in chain.connections:
            try:
                support = self._support(connection, rels, chain, result)
            except ModelReadError as exc:
                result.problems.append(f"support at {_label(connection)} is not read: {exc}")
                continue
            if support is None:
                continue
            if chain.axis.outside(support.x):
                result.problems.append(
                    f"support at x = {support.x:.1f} in ({support.source}) lies outside the member "
                    f"(0 to {chain.axis.length:.1f} in)"
                )
            result.supports.append(support)
        result.supports.sort(key=lambda support: support.x)
        if not result.supports:
            result.notes.append(
                "the analysis model gives this member no support (no restrained node, no joint with another member at its ends)"
            )

    def _support(self, connection, rels: list, chain: _Chain, result: AnalysisInput) -> Optional[SupportRecord]:
        """A restrained node is a support. A node that holds nothing (no condition, or all free) but
        joins another member is a pinned support at this member's end (see :meth:`_joint_support`)."""
        if not connection.is_a("IfcStructuralPointConnection"):
            raise ModelReadError(f"{connection.is_a()} is not read (only point connections are)")
        point = self._node_point(connection)
        if point is None:
            raise ModelReadError("it has no IfcVertexPoint")
        x = chain.axis.x(point)
        vertical, rotation = self._restraint(connection, rels, chain.axis)
        if vertical:
            return SupportRecord(
                x=x, kind="fixed" if rotation else "pinned", source=f"boundary condition of {_label(connection)}"
            )
        joined = self._joined(connection, point, chain)
        if not joined:
            return None
        if chain.axis.at_end(x):
            return self._joint_support(x, point, joined, result)
        self._note_joined_inside(x, point, joined, result)
        return None

    def _joined(self, connection, point: np.ndarray, chain: _Chain) -> list:
        """The other members at a node, each once: those joined to this very connection, then those
        at other point connections within the member's tolerance of it (found on the grid)."""
        own = chain.ids
        nodes = {node.id(): node for node in (connection, *self._nodes.near(point, chain.axis.tolerance))}
        joined: dict = {}
        for node in nodes.values():
            for rel in node.ConnectsStructuralMembers or ():
                member = rel.RelatingStructuralMember
                if member.id() in own:
                    continue
                checked = self._checked.get(member.id())
                physical = self.links.physical_of.get(member.id())
                if checked is not None:
                    joined.setdefault(checked.global_id, _Joined(checked.label, checked))
                elif physical is not None:
                    joined.setdefault(physical.id(), _Joined(_label(physical), None))
                else:
                    joined.setdefault(member.id(), _Joined(_label(member), None))
        return list(joined.values())

    def _joint_support(self, x: float, point: np.ndarray, joined: list, result: AnalysisInput) -> SupportRecord:
        """A pinned support where this member's end meets other members. When the node lies inside the
        length of a checked member, that member carries this one: the reaction is its point load."""
        names = ", ".join(j.label for j in joined)
        carriers = [(j, j.carries_at(point)) for j in joined if j.carries_at(point) is not None]
        if not carriers:
            unchecked = [j.label for j in joined if j.checked is None]
            why = f"{', '.join(unchecked)}: not a checked member" if unchecked else "it is at the other members' ends"
            result.notes.append(
                f"support at x = {x:.1f} in: joint with {names} (taken as pinned); its reaction is not carried "
                f"further ({why})"
            )
            return SupportRecord(x=x, kind="pinned", source=f"joint with {names}")
        (carrier, carrier_x), others = carriers[0], carriers[1:]
        result.notes.append(
            f"support at x = {x:.1f} in: this member frames into {carrier.label} (taken as pinned); its reaction is "
            f"applied to that member as a point load at x = {carrier_x:.1f} in along it"
        )
        if others:
            result.notes.append(
                f"the node at x = {x:.1f} in also lies inside {', '.join(j.label for j, _ in others)}; "
                f"the whole reaction goes to {carrier.label}"
            )
        return SupportRecord(
            x=x, kind="pinned", source=f"joint with {names}", carrier=carrier.checked.global_id, carrier_x=carrier_x
        )

    def _note_joined_inside(self, x: float, point: np.ndarray, joined: list, result: AnalysisInput) -> None:
        """Notes on members met inside this one's length that bring it no load (those that frame into
        it are noted by :func:`_note_carried`)."""
        unchecked = [j.label for j in joined if j.checked is None]
        crossing = [j.label for j in joined if j.carries_at(point) is not None]
        if unchecked:
            result.notes.append(
                f"{', '.join(unchecked)} join(s) this member at x = {x:.1f} in; no load from them is applied here "
                "(not checked members)"
            )
        if crossing:
            result.notes.append(
                f"{', '.join(crossing)} cross(es) this member at x = {x:.1f} in; no load passes between them there "
                "(the node lies inside both)"
            )

    def _restraint(self, connection, rels: list, axis: _Axis) -> tuple:
        """(vertical translation held, rotation across the member held) of the node and the member's ends there."""
        global_rotation = self.places.global_matrix(connection)[:3, :3]
        node = self._held(
            connection.AppliedCondition, global_rotation, getattr(connection, "ConditionCoordinateSystem", None)
        )
        if node is None:
            return False, False
        across = _across(axis.direction)
        vertical, rotation = node.holds_translation(_UP), node.holds_rotation(across)
        for rel in rels:  # a release at the member's end (IfcRelConnectsStructuralMember.AppliedCondition)
            end = self._held(rel.AppliedCondition, global_rotation, rel.ConditionCoordinateSystem)
            if end is not None:
                vertical, rotation = vertical and end.holds_translation(_UP), rotation and end.holds_rotation(across)
        return vertical, rotation

    def _held(self, condition, global_rotation: np.ndarray, system) -> Optional[_Held]:
        if condition is None:
            return None
        if not condition.is_a("IfcBoundaryNodeCondition"):
            raise ModelReadError(f"its condition is an {condition.is_a()}, not an IfcBoundaryNodeCondition")
        axes = global_rotation @ (ifc_placement.get_axis2placement(system)[:3, :3] if system is not None else np.eye(3))
        # IFC2X3 names the translational stiffnesses LinearStiffnessX/Y/Z, IFC4 TranslationalStiffnessX/Y/Z
        prefix = "LinearStiffness" if self.ifc2x3 else "TranslationalStiffness"
        translation = tuple(self._is_held(getattr(condition, f"{prefix}{c}"), "translation") for c in "XYZ")
        rotation = tuple(self._is_held(getattr(condition, f"RotationalStiffness{c}"), "rotation") for c in "XYZ")
        return _Held(translation, rotation, axes)

    def _is_held(self, value, kind: str) -> bool:
        """IFC4+: IfcBoolean TRUE held, FALSE free; a stiffness (IFC2X3 always): 0 free, >= 1e9 SI rigid."""
        value = getattr(value, "wrappedValue", value)
        if value is None:
            return False
        if isinstance(value, bool):
            return value
        stiffness = float(value) * self.stiffness_to_si[kind]
        if stiffness == 0:
            return False
        if stiffness >= _RIGID_SI:
            return True
        raise ModelReadError(f"elastic {kind} restraint of stiffness {float(value):g} (model units) is not modelled")

    def _other_members(self, connection, chain: _Chain) -> str:
        """Names of the curve members at a connection that are not this member's, '' when none."""
        own = chain.ids
        others = []
        for rel in connection.ConnectsStructuralMembers or ():
            member = rel.RelatingStructuralMember
            if member.id() not in own:
                physical = self.links.physical_of.get(member.id())
                others.append(_label(physical) if physical is not None else _label(member))
        return ", ".join(dict.fromkeys(others))

    # --- loads -------------------------------------------------------------------------------

    def _read_loads(self, chain: _Chain, result: AnalysisInput) -> None:
        seen: set = set()
        on_items = [(curve.entity, curve) for curve in chain.curves] + [
            (connection, None) for connection, _ in chain.connections
        ]
        for item, curve in on_items:
            for rel in item.AssignedStructuralActivity or ():
                action = rel.RelatedStructuralActivity
                if action.is_a("IfcStructuralAction") and action.id() not in seen:
                    seen.add(action.id())
                    try:
                        self._action(action, item, curve, chain, result)
                    except ModelReadError as exc:
                        result.problems.append(f"{_label(action)} is not read: {exc}")

    def _action(self, action, item, curve: Optional[_Curve], chain: _Chain, result: AnalysisInput) -> None:
        load = action.AppliedLoad
        if load is None:
            raise ModelReadError("it has no AppliedLoad")
        if load.is_a("IfcStructuralLoadTemperature"):
            self.summary.temperature_actions += 1
            result.notes.append("temperature action ignored: a temperature change puts no load on a bending check")
            return
        group = self.groups.of_action(action)
        if load.is_a() == "IfcStructuralLoad":  # the abstract base: a name, no values
            self.summary.actions_without_values += 1
            result.notes.append(
                f"action without load values in load group '{group.name}' (e.g. a request for the self weight) is not applied; "
                "the checker adds the member's own weight unless SelfWeightIncluded is TRUE"
            )
            return
        if group.load_type is None:
            result.problems.append(group.problem)
            return
        if group.load_type == IGNORED:
            result.notes.append(
                f"load group '{group.name}' ({group.source}) puts no load on a bending check; its actions are ignored"
            )
            return
        self._note_group(group, result)
        records, other_components = self._records(action, item, curve, chain, result)
        if other_components:
            self.summary.non_gravity_components += 1
            result.notes.append("load components other than gravity (horizontal forces, moments) were left out")
        source = f"{_label(action)} in load group '{group.name}'"
        for kind, value, a, b, value_end in records:
            for x in (a, b):
                if not math.isnan(x) and chain.axis.outside(x):
                    result.problems.append(
                        f"load at x = {x:.1f} in ({source}) lies outside the member (0 to {chain.axis.length:.1f} in)"
                    )
            result.loads.append(
                LoadRecord(
                    load_type=group.load_type, kind=kind, value=value, a=a, b=b, value_end=value_end, source=source
                )
            )

    def _note_group(self, group: _GroupType, result: AnalysisInput) -> None:
        if group.self_weight:
            result.notes.append(
                f"load group '{group.name}' is the analysis self weight: its D loads count as the member's self-weight "
                "(the checker adds the own weight only when SelfWeightIncluded is not TRUE)"
            )
        if group.coefficient not in (None, 0.0, 1.0):
            result.notes.append(
                f"load group '{group.name}' has Coefficient {group.coefficient:g}; its loads are taken as given (unfactored)"
            )

    def _records(self, action, item, curve: Optional[_Curve], chain: _Chain, result: AnalysisInput) -> tuple:
        """([(kind, value, a, b, value_end)], other components found) of one action, core units."""
        if action.is_a("IfcStructuralPointAction"):
            return self._point_records(action, item, curve, chain, result)
        if action.is_a("IfcStructuralLinearAction") or action.is_a("IfcStructuralCurveAction"):
            if curve is None:
                raise ModelReadError("a line action on a point connection")
            return self._line_records(action, curve, chain, result)
        raise ModelReadError(f"{action.is_a()} on a curve member is not read")

    def _point_records(self, action, item, curve: Optional[_Curve], chain: _Chain, result: AnalysisInput) -> tuple:
        load = action.AppliedLoad
        if not load.is_a("IfcStructuralLoadSingleForce"):
            raise ModelReadError(f"its load is an {load.is_a()}, not an IfcStructuralLoadSingleForce")
        point = self.places.vertex(action, self.places.frame(action, item))
        if point is None and curve is None:  # on a point connection: at the connection
            point = self.places.vertex(item, self.places.frame(item))
        if point is None:
            raise ModelReadError("it has no IfcVertexPoint giving its position")
        x = chain.axis.x(point)
        if curve is None and not self._takes_joint_load(item, chain, x, action, result):
            return [], False
        down, other = self._gravity(action, item, curve, load, _POINT)
        return [("point", down * self.to_lbf, x, math.nan, math.nan)], other

    def _takes_joint_load(self, connection, chain: _Chain, x: float, action, result: AnalysisInput) -> bool:
        """A load on a node goes to this member inside its length, or at its end where no other member
        joins this connection (it then adds to the reaction there, which goes on to any carrier)."""
        others = self._other_members(connection, chain)
        if not chain.axis.at_end(x) or not others:
            return True
        result.notes.append(
            f"{_label(action)} acts on the joint with {others} at this member's end and is not applied to it "
            "(a member the joint lies inside of takes it; where the members only end there, none does)"
        )
        return False

    def _line_records(self, action, curve: _Curve, chain: _Chain, result: AnalysisInput) -> tuple:
        extent = self.places.edge(action, self.places.frame(action, curve.entity)) or (curve.start, curve.end)
        start, end = extent
        length = float(np.linalg.norm(end - start))
        direction = (end - start) / length
        samples = sorted(self._samples(action, length), key=lambda sample: sample[0])
        if all(load.is_a("IfcStructuralLoadSingleForce") for _, load in samples):  # DISCRETE: point loads
            records, other = [], False
            for s, load in samples:
                down, more = self._gravity(action, curve.entity, curve, load, _POINT)
                records.append(("point", down * self.to_lbf, chain.axis.x(start + s * direction), math.nan, math.nan))
                other = other or more
            return records, other
        values, other = [], False
        for s, load in samples:
            if not load.is_a("IfcStructuralLoadLinearForce"):
                raise ModelReadError(f"its load {load.is_a()} is not an IfcStructuralLoadLinearForce")
            down, more = self._gravity(action, curve.entity, curve, load, _LINEAR)
            values.append((s, down * self.to_lbf_per_in))
            other = other or more
        if any(value for _, value in values):
            ratio = self._per_horizontal(action, direction, result)
            values = [(s, value * ratio) for s, value in values]
        return _pieces(values, start, direction, chain.axis), other

    def _samples(self, action, length: float) -> list:
        """[(distance along the loaded line from its start in inches, load)] of a line action."""
        load = action.AppliedLoad
        if action.is_a("IfcStructuralLinearActionVarying"):  # IFC2X3
            loads = [load, *(action.SubsequentAppliedLoads or ())]
            parameters = _point_on_curve_parameters(action.VaryingAppliedLoadLocation)
            if len(parameters) != len(loads) or not parameters or parameters[-1] <= 0:
                raise ModelReadError(f"{len(loads)} load values but locations {parameters}")
            # the locations are read as parameters along the loaded line, scaled so the last value
            # sits at its end (exports write 0..1 or 0..length)
            return [(length * p / parameters[-1], value) for p, value in zip(parameters, loads)]
        if load.is_a("IfcStructuralLoadConfiguration"):  # values at locations along the member (IFC4+)
            locations = load.Locations or ()
            if len(locations) != len(load.Values) or any(len(location) != 1 for location in locations):
                raise ModelReadError(f"{len(load.Values)} load values but {len(locations)} single locations")
            return [(float(location[0]) * self.to_inch, value) for location, value in zip(locations, load.Values)]
        if not load.is_a("IfcStructuralLoadLinearForce"):
            raise ModelReadError(f"its load is an {load.is_a()}, not an IfcStructuralLoadLinearForce")
        return [(0.0, load), (length, load)]

    def _per_horizontal(self, action, direction: np.ndarray, result: AnalysisInput) -> float:
        """Factor onto a value per horizontal length: 1 for PROJECTED_LENGTH, else true / horizontal length.

        IfcStructuralCurveAction.ProjectedOrTrue; unset or on local loads it is read as TRUE_LENGTH.
        """
        projected = (
            getattr(action, "ProjectedOrTrue", None) == "PROJECTED_LENGTH" and action.GlobalOrLocal != "LOCAL_COORDS"
        )
        if projected:
            return 1.0
        horizontal = math.hypot(direction[0], direction[1])
        if horizontal < _SMALL:
            raise ModelReadError("a gravity line load on a vertical analysis member is axial, not a bending load")
        if horizontal < 1 - _SMALL:
            slope = math.degrees(math.acos(horizontal))
            result.notes.append(
                f"{_label(action)}: values per true length on a member sloped {slope:.1f}° are taken per "
                f"horizontal length (x {1 / horizontal:.4f})"
            )
        return 1.0 / horizontal

    def _gravity(self, action, item, curve: Optional[_Curve], load, components: tuple) -> tuple:
        """(downward force in model units, whether other components or moments were left out)."""
        forces, moments = components
        vector = np.array([getattr(load, name) or 0.0 for name in forces], dtype=float)
        if action.GlobalOrLocal == "LOCAL_COORDS":
            world = self._local_axes(item, curve) @ vector
        else:
            world = self.places.global_matrix(item)[:3, :3] @ vector
        down = -float(world[2])
        scale = max(abs(down), float(np.linalg.norm(vector)), 1.0)
        other = math.hypot(world[0], world[1]) > _SMALL * scale or any(getattr(load, name) for name in moments)
        return down, other

    def _local_axes(self, item, curve: Optional[_Curve]) -> np.ndarray:
        """Columns: local x, y, z in world coordinates of a curve member, or of a point connection."""
        rotation = self.places.global_matrix(item)[:3, :3]
        if curve is None:
            system = getattr(item, "ConditionCoordinateSystem", None)
            return rotation @ (ifc_placement.get_axis2placement(system)[:3, :3] if system is not None else np.eye(3))
        x = curve.direction
        given = _local_z_direction(curve.entity)
        z0 = (
            rotation @ np.array(given, dtype=float)
            if given is not None
            else (_UP if abs(x[2]) < 1 - _SMALL else np.array((1.0, 0.0, 0.0)))
        )
        z = z0 - (z0 @ x) * x
        if np.linalg.norm(z) < _SMALL:
            raise ModelReadError(f"{_label(curve.entity)} has its local z direction along its axis")
        z = z / np.linalg.norm(z)
        return np.column_stack((x, np.cross(z, x), z))


def _note_carried(linked: dict) -> None:
    """Tells each carrying member, from the supports of the members bearing on it, what frames into it."""
    for member in linked.values():
        for support in member.result.supports:
            carrier = linked.get(support.carrier)
            if carrier is not None:
                carrier.result.notes.append(
                    f"{member.label} frames into this member at x = {support.carrier_x:.1f} in; its reaction is "
                    "applied here as a point load (the design check analyses the carried member first)"
                )


def _local_z_direction(entity) -> Optional[tuple]:
    """A curve member's local z: IFC4 Axis, IFC2X3 ProfileOrientation of its profile properties; None if neither."""
    axis = getattr(entity, "Axis", None)
    if axis is not None:
        return axis.DirectionRatios
    for rel in entity.HasAssociations or ():
        orientation = (
            getattr(rel, "ProfileOrientation", None) if rel.is_a("IfcRelAssociatesProfileProperties") else None
        )
        if orientation is not None and orientation.is_a("IfcDirection"):
            return orientation.DirectionRatios
    return None


def _point_on_curve_parameters(shape_aspect) -> list:
    """Parameters of the IfcPointOnCurve items of an IFC2X3 VaryingAppliedLoadLocation, in order."""
    representations = shape_aspect.ShapeRepresentations if shape_aspect is not None else ()
    return [
        float(item.PointParameter)
        for representation in representations
        for item in representation.Items
        if item.is_a("IfcPointOnCurve")
    ]


def _pieces(values: list, start: np.ndarray, direction: np.ndarray, axis: _Axis) -> list:
    """Uniform or linear load records between consecutive (distance, lbf/in) samples; zero pieces dropped."""
    records = []
    for (s0, w0), (s1, w1) in zip(values, values[1:]):
        if s1 <= s0 or (w0 == 0 and w1 == 0):
            continue
        x0, x1 = axis.x(start + s0 * direction), axis.x(start + s1 * direction)
        if x1 < x0:
            (x0, w0), (x1, w1) = (x1, w1), (x0, w0)
        if math.isclose(w0, w1, rel_tol=1e-9, abs_tol=1e-12):
            records.append(("uniform", w0, x0, x1, math.nan))
        else:
            records.append(("linear", w0, x0, x1, w1))
    return records


def _connections_of(chain: _Chain) -> list:
    """[(connection, [its IfcRelConnectsStructuralMember to this chain])] in order along the chain."""
    found: dict = {}
    for curve in chain.curves:
        for rel in curve.entity.ConnectedBy or ():
            connection = rel.RelatedStructuralConnection
            found.setdefault(connection.id(), (connection, []))[1].append(rel)
    return list(found.values())


def _across(direction: np.ndarray) -> list:
    """The horizontal axis across a member (about which it bends); both horizontal axes for a vertical one."""
    across = np.cross(_UP, direction)
    norm = float(np.linalg.norm(across))
    if norm < _ALIGNED:
        return [np.array((1.0, 0.0, 0.0)), np.array((0.0, 1.0, 0.0))]
    return [across / norm]


def _label(entity) -> str:
    name = getattr(entity, "Name", None)
    return f"{entity.is_a()} '{name}'" if name else f"{entity.is_a()} #{entity.id()}"


def _collapsed(lines: list) -> list:
    """Each distinct line once, in first order, with the number of times where it repeats."""
    counts = Counter(lines)
    return [line if counts[line] == 1 else f"{line} ({counts[line]} times)" for line in dict.fromkeys(lines)]
