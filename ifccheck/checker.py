"""The whole job in one call: read a model, check every timber bending member, hold the verdicts.

``check_model`` accepts a path or an ``ifcopenshell.file`` already open in a host application
(the plug-in use) and returns a :class:`CheckResult`; nothing is written anywhere until one of
its ``write_*`` methods is called, and a host's model is changed only by ``apply_to_model``.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Optional

import pandas as pd

from . import __version__
from .design import VERDICT_COLUMNS, get_basis
from .design.inputs import design_inputs
from .ifc import open_model, read_members
from .ifc.writer import EarlyCopy, copy_model, write_model_atomically, write_verdicts
from .model import ModelUnits
from .report.csv_out import write_exceptions_csv
from .report.reactions_out import write_reactions_csv
from .rules import load_rules


@dataclass
class CheckResult:
    """Verdicts of one run. ``table`` has one row per candidate member (core units: in, lbf, psi)."""

    model: object  # ifcopenshell.file
    table: pd.DataFrame
    skipped: list
    units: ModelUnits
    schema: str
    rules: dict
    owns_model: bool = False  # True when check_model opened the file itself
    structural: object = None  # what the structural-analysis data gave (counts for the summary)
    elements: list = field(default_factory=list)  # supporting elements found in the geometry (ElementBox)
    _applied: bool = field(default=False, repr=False)

    @property
    def checked_with(self) -> str:
        return f"ifccheck {__version__}"

    def counts(self) -> dict:
        by_status = self.table["status"].value_counts() if len(self.table) else {}
        return {
            "PASS": int(by_status.get("PASS", 0)),
            "FAIL": int(by_status.get("FAIL", 0)),
            "NOT_CHECKED": int(by_status.get("NOT_CHECKED", 0)),
            "skipped": len(self.skipped),
        }

    @property
    def failed(self) -> bool:
        return self.counts()["FAIL"] > 0

    def exceptions(self) -> pd.DataFrame:
        """The rows a reviewer must look at: every FAIL and NOT_CHECKED member."""
        return self.table[self.table["status"].isin(["FAIL", "NOT_CHECKED"])]

    def apply_to_model(self) -> None:
        """Write the verdict property sets into ``self.model`` (replacing earlier ones). For a host's
        open model this changes the host's model: call it only when that is wanted."""
        if not self._applied:
            write_verdicts(self.model, self.table, self.units, self.checked_with)
            self._applied = True

    def write_ifc(self, path, early: Optional[EarlyCopy] = None) -> Path:
        """Write the checked model to ``path`` atomically; a host's model stays untouched.
        ``early``: the model's copy written since it was opened (started by ``check_model``'s
        ``on_open``), completed here instead of writing the whole model."""
        if self.owns_model or self._applied:
            self.apply_to_model()
            target = self.model
        else:
            target = copy_model(self.model)
            write_verdicts(target, self.table, self.units, self.checked_with)
        if early is not None and target is self.model and early.write(target, Path(path)):
            return Path(path)
        return write_model_atomically(target, Path(path))

    @property
    def has_reactions(self) -> bool:
        """Whether any member was found bearing on a wall, column or footing."""
        return "element_reactions" in self.table and any(bool(r) for r in self.table["element_reactions"])

    def write_reactions_csv(self, path) -> Path:
        """Write the reactions on walls, columns and footings, summed per element, to ``path``."""
        return write_reactions_csv(self.table, self.elements, Path(path), self.units, self.rules)

    def write_csv(self, path) -> Path:
        """Write the exception list (FAIL and NOT_CHECKED members) to ``path`` atomically."""
        return write_exceptions_csv(self.exceptions(), Path(path), self.units, self.rules)


def check_model(model_or_path, rules=None, *, parsed=None, on_open=None) -> CheckResult:
    """Check every timber bending member of a model.

    ``model_or_path``: a path to an IFC file, or an open ``ifcopenshell.file``. ``rules``: None
    (rules/ defaults), a path to a project TOML file, or a dict of the same form. For a path,
    ``parsed`` is the parse of it started earlier (see :func:`ifccheck.ifc.open_model`), and
    ``on_open`` is called with the model once it is open, before it is read (the command line
    starts its :class:`EarlyCopy` there).
    """
    merged = load_rules(rules)
    owns = not hasattr(model_or_path, "by_type")
    model = open_model(model_or_path, parsed) if owns else model_or_path
    if owns and on_open is not None:
        on_open(model)
    read = read_members(model, merged)
    inputs = design_inputs(read.members, merged, read.elements)
    basis = get_basis(merged["defaults"]["design_basis"])
    verdicts = basis.check(inputs, merged) if len(inputs) else pd.DataFrame(columns=VERDICT_COLUMNS)
    table = inputs.drop(columns=[c for c in verdicts.columns if c in inputs.columns]).join(verdicts)
    table["provenance"] = [
        _provenance(*row)
        for row in zip(table["notes"], table.get("identified_from", [""] * len(table)), table["load_sources"],
                       table["defaults_used"])
    ]
    return CheckResult(model, table, read.skipped, read.units, read.schema, merged, owns_model=owns,
                       structural=read.structural, elements=read.elements)


def _provenance(notes: list, identified_from: str, load_sources: str, defaults_used: list) -> str:
    """One line saying where each input came from and what was assumed."""
    parts = list(notes)
    if isinstance(identified_from, str) and identified_from:
        parts.append(identified_from)
    if load_sources:
        parts.append(f"loads from {load_sources}")
    if defaults_used:
        parts.append("assumed: " + "; ".join(defaults_used))
    return " | ".join(parts)
