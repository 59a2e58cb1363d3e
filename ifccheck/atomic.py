"""Atomic output: write to a temporary file beside the target, rename it into place on success."""

from __future__ import annotations

import os
import tempfile
from contextlib import contextmanager
from pathlib import Path

from .errors import OutputError


@contextmanager
def atomic_target(path):
    """Yield a temporary path beside ``path``; on success it replaces ``path``, on error it is removed."""
    path = Path(path)
    try:
        fd, name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    except OSError as exc:
        raise OutputError(f"cannot write {path}: {exc}; check the folder exists and is writable") from exc
    os.close(fd)
    tmp = Path(name)
    try:
        yield tmp
        os.replace(tmp, path)
    except OSError as exc:
        tmp.unlink(missing_ok=True)
        raise OutputError(f"cannot write {path}: {exc}; check the folder exists and is writable") from exc
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
