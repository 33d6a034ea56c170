"""Write a file atomically: a temporary file beside the target, then one rename.

A failed or interrupted export never leaves a half-written report in place of a good one.
The temporary file is created with ``open(..., "x")`` so the finished file gets the usual
permissions (the user's umask), not the private ones of :func:`tempfile.mkstemp`.
"""
from __future__ import annotations

__all__ = ["atomic_path"]

import contextlib
import os
import uuid
from pathlib import Path


@contextlib.contextmanager
def atomic_path(path):
    """Yield a temporary path to write; on success it replaces ``path``, on failure it is removed."""
    path = Path(path)
    tmp = path.with_name(f".{path.name}.{os.getpid()}.{uuid.uuid4().hex[:8]}.tmp")
    with open(tmp, "xb"):
        pass
    try:
        yield tmp
        os.replace(tmp, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        raise
