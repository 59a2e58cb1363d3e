"""Opening an IFC file, with one clear error for each way a file can be unusable.

The header and the end of the file are checked first (:mod:`ifccheck.stepfile`), so a file that
is not IFC, is cut short or uses an unsupported schema gets a message that says what to do.
"""

from __future__ import annotations

from pathlib import Path

import ifcopenshell

from ..errors import ModelReadError
from ..stepfile import check_ifc_file


def open_model(path, parsed=None) -> ifcopenshell.file:
    """Open the IFC (STEP physical file) at ``path``.

    ``parsed``, when given, is a callable returning ``path`` as ifcopenshell parses it (or raising
    what it raised): a parse started early, see ifccheck.cli. The file is checked here either way
    and the parse is used only when the checks pass.

    Raises :class:`ModelReadError` when the file is missing, empty, not an IFC file, truncated,
    of an unsupported schema, or cannot be parsed.
    """
    path = Path(path)
    check_ifc_file(path)
    try:
        return parsed() if parsed is not None else ifcopenshell.open(str(path))
    except Exception as exc:  # ifcopenshell raises several unrelated types for damaged files
        raise ModelReadError(f"{path} cannot be parsed as IFC ({exc}); the file is damaged: export it again") from exc
