"""Writing verdicts back into an IFC model, and writing the model to disk atomically.

Each checked member gets one ``ifccheck_Verdict`` property set; earlier ones are removed first, so
a rerun replaces verdicts instead of stacking them. Values are written in the model's own units
(the unit assignment of each measure type; SI where the model assigns none).
"""

from __future__ import annotations

from pathlib import Path

import ifcopenshell
import ifcopenshell.guid
import numpy as np

from ..atomic import atomic_target
from ..model import VERDICT_PSET, ModelUnits

#: verdict property -> (table column, IFC measure type, unit kind or None)
_MEASURED = (
    ("MaxUtilization", "max_util", "IfcRatioMeasure", None),
    ("BendingUtilization", "util_bending", "IfcRatioMeasure", None),
    ("ShearUtilization", "util_shear", "IfcRatioMeasure", None),
    ("LiveDeflectionUtilization", "util_deflection_live", "IfcRatioMeasure", None),
    ("TotalDeflectionUtilization", "util_deflection_total", "IfcRatioMeasure", None),
    ("BearingUtilization", "util_bearing", "IfcRatioMeasure", None),
    ("DesignSpan", "design_span", "IfcLengthMeasure", "length"),
    ("AllowableSpan", "allowable_span", "IfcLengthMeasure", "length"),
    ("RequiredArea", "required_A", "IfcAreaMeasure", "area"),
    ("RequiredSectionModulus", "required_S", "IfcSectionModulusMeasure", "section_modulus"),
    ("RequiredMomentOfInertia", "required_I", "IfcMomentOfInertiaMeasure", "moment_of_inertia"),
    ("GoverningLocation", "governing_location", "IfcLengthMeasure", "length"),
    ("SupportCount", "support_count", "IfcCountMeasure", "count"),
)
_LABELS = (
    ("Status", "status", "IfcLabel"),
    ("Reason", "reason", "IfcText"),
    ("GoverningCheck", "governing_check", "IfcLabel"),
    ("GoverningCombination", "governing_combination", "IfcLabel"),
    ("DesignBasis", "design_basis", "IfcLabel"),
)


def copy_model(model: ifcopenshell.file) -> ifcopenshell.file:
    """An independent copy of a model (so a host's open model is never changed by writing)."""
    return ifcopenshell.file.from_string(model.to_string())


def remove_verdicts(model: ifcopenshell.file) -> int:
    """Remove every earlier ifccheck_Verdict property set with its relations and properties."""
    psets = [p for p in model.by_type("IfcPropertySet") if p.Name == VERDICT_PSET]
    removed_props: set = set()
    for pset in psets:
        for rel in [r for r in model.get_inverse(pset) if r.is_a("IfcRelDefinesByProperties")]:
            model.remove(rel)
        props = [p for p in (pset.HasProperties or ()) if p.id() not in removed_props]
        model.remove(pset)
        for prop in props:
            if not model.get_inverse(prop):  # not used by any other property set
                removed_props.add(prop.id())
                model.remove(prop)
    return len(psets)


class _PropertyFactory:
    """Creates property entities, sharing identical ones (same name, type and value) between sets."""

    def __init__(self, model: ifcopenshell.file):
        self.model = model
        self._cache: dict = {}

    def single(self, name: str, ifc_type: str, value):
        key = (name, ifc_type, value)
        prop = self._cache.get(key)
        if prop is None:
            prop = self.model.create_entity(
                "IfcPropertySingleValue", Name=name, NominalValue=self.model.create_entity(ifc_type, value)
            )
            self._cache[key] = prop
        return prop


def _owner_history(model: ifcopenshell.file):
    """IFC2X3 requires an owner history on every rooted entity: reuse the project's (or any)."""
    if model.schema != "IFC2X3":
        return None
    project = (model.by_type("IfcProject") or [None])[0]
    if project is not None and project.OwnerHistory is not None:
        return project.OwnerHistory
    histories = model.by_type("IfcOwnerHistory")
    return histories[0] if histories else None


def write_verdicts(model: ifcopenshell.file, table, units: ModelUnits, checked_with: str) -> int:
    """Attach one ifccheck_Verdict set to every member of ``table`` (core units); returns the count.

    Members whose verdicts are identical in every property (a run of equal joists) share one
    property set through one relation, which IFC allows and which keeps large models small.
    """
    remove_verdicts(model)
    factory = _PropertyFactory(model)
    history = _owner_history(model)
    groups: dict = {}
    for guid, values in zip(table["global_id"], _verdict_values(table, units, checked_with)):
        groups.setdefault(values, []).append(guid)
    count = 0
    for values, guids in groups.items():
        elements = [e for e in (_by_guid(model, g) for g in guids) if e is not None]
        if not elements:
            continue
        props = [factory.single(name, ifc_type, value) for name, ifc_type, value in values]
        pset = model.create_entity(
            "IfcPropertySet", GlobalId=ifcopenshell.guid.new(), OwnerHistory=history, Name=VERDICT_PSET,
            HasProperties=props,
        )
        model.create_entity(
            "IfcRelDefinesByProperties", GlobalId=ifcopenshell.guid.new(), OwnerHistory=history,
            RelatedObjects=elements, RelatingPropertyDefinition=pset,
        )
        count += len(elements)
    return count


def _verdict_values(table, units: ModelUnits, checked_with: str) -> list:
    """Per row, the verdict's (name, IFC type, value) triples in the model's units."""
    scale = {kind: 1.0 / units.to_core[kind] for kind in ("length", "area", "section_modulus", "moment_of_inertia")}
    columns = []
    for name, col, ifc_type in _LABELS:
        columns.append([(name, ifc_type, str(v)) if str(v or "") else None for v in table[col].tolist()])
    for name, col, ifc_type, kind in _MEASURED:
        values = _in_model_units(table[col].to_numpy(float), kind, scale)
        columns.append([(name, ifc_type, v) if v == v else None for v in values.tolist()])  # v != v: NaN
    columns.append([("CheckedWith", "IfcLabel", checked_with)] * len(table))
    return [tuple(p for p in row if p is not None) for row in zip(*columns)]


def _in_model_units(values: np.ndarray, kind, scale: dict) -> np.ndarray:
    """Core-unit values as written: ratios to 6 decimals, counts as integers (object array, NaN kept),
    lengths, areas and section properties scaled to the model's units."""
    if kind is None:
        return np.round(values, 6)
    if kind == "count":
        return np.array([int(v) if v == v else v for v in values.tolist()], dtype=object)
    return np.round(values * scale[kind], 9)


def _by_guid(model: ifcopenshell.file, guid: str):
    try:
        return model.by_guid(guid)
    except RuntimeError:
        return None


def write_model_atomically(model: ifcopenshell.file, path: Path) -> Path:
    """Write ``model`` to ``path`` through a temporary file beside it (never a half-written file)."""
    with atomic_target(path) as tmp:
        model.write(str(tmp), format=".ifc")
    return Path(path)
