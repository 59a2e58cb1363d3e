"""One error hierarchy for ifccheck.

Every error the package raises on purpose is an :class:`IfcCheckError`. Each subclass also
derives from the matching built-in (``ValueError`` or ``LookupError``) so callers that catch the
built-in keep working. Messages say what is wrong and what to do next.
"""


class IfcCheckError(Exception):
    """Base class of every error raised on purpose by ifccheck."""


class ModelReadError(IfcCheckError, ValueError):
    """The IFC model cannot be opened or read (not IFC, truncated, unsupported schema)."""


class RulesError(IfcCheckError, ValueError):
    """A rules file (project TOML or a table in rules/) is missing, malformed or inconsistent."""


class UnitError(IfcCheckError, ValueError):
    """A quantity has a unit that cannot be read or converted."""


class DesignValueLookupError(IfcCheckError, LookupError):
    """No reference design value is tabulated for the requested species, grade or size."""


class OutputError(IfcCheckError, OSError):
    """An output file cannot be written."""
