"""Design bases: each checks the table of design inputs and returns one verdict row per member.

A design basis is registered under a key; the checker picks it from the rules'
``design_basis``. The reader and writers never depend on which basis ran, so another basis
(Eurocode 5) can be added beside NDS by registering it here.
"""

from __future__ import annotations

from typing import Protocol

import pandas as pd

from ..errors import RulesError

#: columns every design basis returns, in core units (inch, lbf, psi); the report and writers use these
VERDICT_COLUMNS = [
    "status", "reason", "governing_check", "governing_combination", "max_util",
    "util_bending", "util_shear", "util_deflection_live", "util_deflection_total", "util_bearing",
    "comb_bending", "comb_shear", "comb_deflection_live", "comb_deflection_total", "comb_bearing",
    "design_span", "allowable_span", "species", "grade", "nominal",
    "A", "S", "I", "required_A", "required_S", "required_I", "design_basis",
    "governing_location", "support_count", "bending_edge", "unbraced_length_used", "uplift_force",
    "problems", "element_reactions",
]


class DesignBasis(Protocol):
    """What the checker needs of a design basis."""

    key: str
    label: str

    def check(self, inputs: pd.DataFrame, rules: dict) -> pd.DataFrame:
        """Verdict columns (at least VERDICT_COLUMNS) for every row of ``inputs``, same index;
        ``problems`` holds every reason a member was not checked (the inputs' and the basis's own)."""


_BASES: dict = {}


def register(basis: DesignBasis) -> None:
    _BASES[basis.key] = basis


def get_basis(label: str) -> DesignBasis:
    """The registered basis whose key starts the rules' ``design_basis`` text (e.g. "NDS 2018 / ...")."""
    from . import nds  # noqa: F401  (registers the NDS basis)

    for key, basis in _BASES.items():
        if str(label).upper().startswith(key):
            return basis
    known = ", ".join(b.label for b in _BASES.values())
    raise RulesError(f"design_basis {label!r} is not available; use one of: {known}")
