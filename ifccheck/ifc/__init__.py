"""Everything that touches IFC: opening a model, reading its members, writing verdicts back.

Only this package imports ifcopenshell; the design code sees the records of ifccheck.model.
"""

from .open import open_model
from .reader import read_model

__all__ = ["open_model", "read_model"]
