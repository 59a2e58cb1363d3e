"""Everything that touches IFC: opening a model, reading its members, writing verdicts back.

Only this package imports ifcopenshell; the design code sees the records of ifccheck.model.
"""

from ..model import ReadResult
from .open import open_model
from .reader import read_model
from .structural import StructuralSummary, read_structural

__all__ = ["open_model", "read_model", "read_structural", "read_members"]


def read_members(model, rules: dict) -> ReadResult:
    """The candidate members (:func:`read_model`) with their structural-analysis data attached."""
    result = read_model(model, rules)
    if model.by_type("IfcStructuralCurveMember"):
        elements = {m.global_id: model.by_guid(m.global_id) for m in result.members}
        result.structural = read_structural(model, elements, result.units.to_core, rules)
        for record in result.members:
            record.analysis = result.structural.by_member.get(record.global_id)
    else:
        result.structural = StructuralSummary()
    return result
