"""Checks that a file is a complete IFC file of a schema ifccheck reads, before any parser sees it.

The header and the end of the file are read (never the whole file), so a file that is not IFC,
is cut short or uses an unsupported schema gets a message that says what to do. No ifcopenshell
here: the command line runs these checks before it starts parsing the file on a thread.
"""

from __future__ import annotations

import re
from pathlib import Path

from .errors import ModelReadError

#: schemas the reader handles (IFC4X3 covers IFC4X3_ADD2 and its siblings)
SUPPORTED_SCHEMAS = "IFC2X3, IFC4 or IFC4X3"

_HEADER_LIMIT = 1 << 20  # the STEP header is read up to its ENDSEC; it is never near 1 MiB
_TAIL_BYTES = 4096
_BYTE_ORDER_MARK = b"\xef\xbb\xbf"
_FILE_SCHEMA = re.compile(rb"FILE_SCHEMA\s*\(\s*\(\s*'([^']*)'", re.IGNORECASE)


def check_ifc_file(path) -> None:
    """Check, before ifcopenshell parses it, that the file at ``path`` exists, is an IFC file,
    is complete and uses a supported schema; raises :class:`ModelReadError` saying what to do."""
    path = Path(path)
    _check_file_exists(path)
    head, tail = _read_ends(path)
    if not head.lstrip(_BYTE_ORDER_MARK + b" \t\r\n").startswith(b"ISO-10303-21;"):
        raise ModelReadError(
            f"{path} is not an IFC file (it does not start with 'ISO-10303-21;'); export the model as IFC (.ifc)"
        )
    if b"END-ISO-10303-21;" not in tail:
        raise ModelReadError(
            f"{path} is truncated (no 'END-ISO-10303-21;' at its end); copy or export the file again"
        )
    schema = _header_schema(head)
    if not _schema_supported(schema):
        raise ModelReadError(
            f"{path} uses schema '{schema}', which ifccheck does not read; export it as {SUPPORTED_SCHEMAS}"
        )


def _check_file_exists(path: Path) -> None:
    if not path.exists():
        raise ModelReadError(f"model file {path} does not exist; check the path")
    if not path.is_file():
        raise ModelReadError(f"{path} is not a file; give the path of an .ifc file")
    if path.stat().st_size == 0:
        raise ModelReadError(f"model file {path} is empty; export the model again")


def _read_ends(path: Path) -> tuple[bytes, bytes]:
    """The STEP header (up to its first ENDSEC) and the last few KiB of the file."""
    with open(path, "rb") as fh:
        head = fh.read(_HEADER_LIMIT)
        end = head.find(b"ENDSEC;")
        if end >= 0:
            head = head[: end + len(b"ENDSEC;")]
        size = fh.seek(0, 2)
        fh.seek(max(0, size - _TAIL_BYTES))
        tail = fh.read()
    return head, tail


def _header_schema(head: bytes) -> str:
    found = _FILE_SCHEMA.search(head)
    return found.group(1).decode("ascii", "replace").strip() if found else ""


def _schema_supported(schema: str) -> bool:
    name = schema.upper()
    return name.startswith("IFC2X3") or name == "IFC4" or name.startswith("IFC4_") or name.startswith("IFC4X3")
