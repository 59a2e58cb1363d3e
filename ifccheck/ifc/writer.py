"""Writing verdicts back into an IFC model, and writing the model to disk atomically.

Each checked member gets one ``ifccheck_Verdict`` property set; earlier ones are removed first, so
a rerun replaces verdicts instead of stacking them. Values are written in the model's own units
(the unit assignment of each measure type; SI where the model assigns none).

The command line has the model written while it checks it (:class:`EarlyCopy`).
"""

from __future__ import annotations

import os
import sys
import tempfile
import threading
import warnings
from pathlib import Path
from typing import Optional

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
#: (name, IFC type) of each verdict property but CheckedWith, in the order they are written
_PROPERTIES = tuple((name, ifc_type) for name, _, ifc_type in _LABELS) + tuple(
    (name, ifc_type) for name, _, ifc_type, _ in _MEASURED
)


def copy_model(model: ifcopenshell.file) -> ifcopenshell.file:
    """An independent copy of a model (so a host's open model is never changed by writing)."""
    return ifcopenshell.file.from_string(model.to_string())


_ROOT_NAME = 2  # position of IfcRoot.Name (see ifccheck.ifc.sections.fixed_position)


def verdict_psets(model: ifcopenshell.file) -> list:
    """The ifccheck_Verdict property sets of earlier runs."""
    return [p for p in model.by_type("IfcPropertySet") if p.get_argument(_ROOT_NAME) == VERDICT_PSET]


def remove_verdicts(model: ifcopenshell.file) -> int:
    """Remove every earlier ifccheck_Verdict property set with its relations and properties."""
    psets = verdict_psets(model)
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
    for guid, values in zip(table["global_id"].tolist(), _verdict_values(table, units)):
        groups.setdefault(values, []).append(guid)
    count = 0
    for values, guids in groups.items():
        elements = [e for e in (_by_guid(model, g) for g in guids) if e is not None]
        if not elements:
            continue
        props = [
            factory.single(name, ifc_type, value) for (name, ifc_type), value in zip(_PROPERTIES, values)
            if value is not None
        ]
        props.append(factory.single("CheckedWith", "IfcLabel", checked_with))
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


def _verdict_values(table, units: ModelUnits) -> list:
    """Per row, the value of each of _PROPERTIES in the model's units, None where the row has none."""
    scale = {kind: 1.0 / units.to_core[kind] for kind in ("length", "area", "section_modulus", "moment_of_inertia")}
    columns = []
    for _, col, _ in _LABELS:
        columns.append([str(v) if str(v or "") else None for v in table[col].tolist()])
    for _, col, _, kind in _MEASURED:
        values = _in_model_units(table[col].to_numpy(float), kind, scale)
        columns.append([v if v == v else None for v in values.tolist()])  # v != v: NaN
    return list(zip(*columns))


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


#: how a STEP file written by ifcopenshell ends
_TRAILER = b"ENDSEC;\nEND-ISO-10303-21;\n"


class EarlyCopy:
    """The model written to a file by a forked child process as soon as it is open, while this
    process reads and checks it.

    Writing a large model takes as long as reading its members and holds Python's interpreter
    lock, so the command line has a child process write it on another core. Checking only adds
    entities to the model (the verdict sets, with ids above every id it had), and a STEP file lists
    entities by id, so the copy with the added entities' lines put before its end is the file that
    ``model.write`` gives then (:meth:`write`). Where processes cannot be forked, other threads run,
    or the model holds verdicts of an earlier run (removed before the new ones are added), nothing
    is copied and the model is written whole as before.

    Use it as a context manager: on leaving, a child still writing is waited for and an unused copy
    removed.
    """

    def __init__(self, target: Path) -> None:
        self.target = Path(target)  # the copy is written beside it, in the same folder
        self._pid: Optional[int] = None
        self._path: Optional[Path] = None
        self._top = 0

    def start(self, model: ifcopenshell.file) -> None:
        """Fork the child writing ``model``; call it once, before anything is added to the model."""
        if not _can_fork() or verdict_psets(model):
            return
        try:
            fd, name = tempfile.mkstemp(prefix=f".{self.target.name}.", suffix=".copy.tmp", dir=self.target.parent)
        except OSError:
            return  # an unusable folder: writing the output says so later
        os.close(fd)
        self._path, self._top = Path(name), model.get_max_id()
        with warnings.catch_warnings():  # threads of libraries (BLAS) are not copied; the child needs none
            warnings.simplefilter("ignore", DeprecationWarning)
            pid = os.fork()
        if pid == 0:
            _write_and_exit(model, name)
        self._pid = pid

    def write(self, model: ifcopenshell.file, path: Path) -> bool:
        """Put the copy, completed with the entities added since it was started, at ``path``;
        False, and nothing written, when there is no good copy."""
        if not self._child_succeeded():
            return False
        added = (_by_id(model, i) for i in range(self._top + 1, model.get_max_id() + 1))
        lines = "".join(f"{entity.to_string()};\n" for entity in added if entity is not None)
        with open(self._path, "r+b") as fh:
            fh.seek(-len(_TRAILER), os.SEEK_END)
            if fh.read() != _TRAILER:
                return False
            fh.seek(-len(_TRAILER), os.SEEK_END)
            fh.truncate()
            fh.write(lines.encode("utf-8"))
            fh.write(_TRAILER)
        os.replace(self._path, path)
        self._path = None
        return True

    def _child_succeeded(self) -> bool:
        if self._pid is None:
            return False
        try:
            _, status = os.waitpid(self._pid, 0)
        except ChildProcessError:  # reaped elsewhere: its outcome is unknown
            return False
        finally:
            self._pid = None
        return os.waitstatus_to_exitcode(status) == 0

    def __enter__(self) -> "EarlyCopy":
        return self

    def __exit__(self, *exc) -> None:
        if self._pid is not None:  # the check stopped early: the child is waited for (stopped, it would
            self._child_succeeded()  # leave the temporary file it writes through), its copy removed
        if self._path is not None:
            self._path.unlink(missing_ok=True)
            self._path = None


def _can_fork() -> bool:
    """Whether a child process may be forked, and is worth it: where forking is the platform's
    usual way to start one (elsewhere system libraries may not survive a fork), with no other
    Python thread running (a lock it holds would stay held in the child), and with a second core
    to run it on (on one core the child only takes turns with this process)."""
    return (hasattr(os, "fork") and sys.platform.startswith("linux") and threading.active_count() == 1
            and len(os.sched_getaffinity(0)) >= 2)


def _write_and_exit(model: ifcopenshell.file, path: str) -> None:
    """In the forked child: write the model and end at once, leaving the parent's open files,
    buffers and exit handlers alone."""
    code = 1
    try:
        model.write(path, format=".ifc")
        code = 0
    finally:
        os._exit(code)


def _by_id(model: ifcopenshell.file, entity_id: int):
    try:
        return model.by_id(entity_id)
    except RuntimeError:  # the id of an entity removed again
        return None
