"""Everything that touches IFC: opening a model, reading its members, writing verdicts back.

Only this package imports ifcopenshell; the design code sees the records of ifccheck.model.
"""

from ..model import ReadResult
from .open import open_model
from .reader import read_model
from .elements import read_element_boxes
from .structural import StructuralSummary, read_structural

__all__ = ["open_model", "read_model", "read_structural", "read_members"]


def read_members(model, rules: dict) -> ReadResult:
    """The candidate members (:func:`read_model`) with their structural-analysis data attached."""
    result = read_model(model, rules)
    if model.by_type("IfcStructuralCurveMember"):
        elements = {m.global_id: model.by_guid(m.global_id) for m in result.members}
        axes = {m.global_id: (m.axis_start, m.axis_end) if m.axis_start is not None else None for m in result.members}
        result.structural = read_structural(model, elements, result.units.to_core, rules, axes)
        for record in result.members:
            record.analysis = result.structural.by_member.get(record.global_id)
    else:
        result.structural = StructuralSummary()
    # every element when supports are searched; else only what area loads and slab edges need
    kinds = None if _supports_from_geometry(model, rules["defaults"]["supports_from_geometry"]) else _PLACE_KINDS
    result.elements, result.unreadable_elements = read_element_boxes(model, result.units.to_core["length"], kinds=kinds)
    return result


#: element kinds read for area loads by slab and space and for slab edges, when supports are not searched
_PLACE_KINDS = frozenset({"slab", "roof", "space"})


def _supports_from_geometry(model, mode: str) -> bool:
    """Whether to look for supports in the geometry: always, never, or (auto) when the model has
    walls, columns or footings for members to bear on."""
    if mode != "auto":
        return mode == "always"
    return any(model.by_type(kind) for kind in ("IfcWall", "IfcColumn", "IfcFooting"))
