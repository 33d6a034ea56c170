"""Project files: load and save a project document as UTF-8 JSON.

Minimal first version: reading with clear errors and an atomic save. Versions,
migration, backups and recovery files build on this module.
"""
from __future__ import annotations

__all__ = ["load", "save", "dumps"]

import json
import os
import tempfile
from pathlib import Path

from .document import problems
from .errors import InputError, StagewrightError

MAX_FILE_BYTES = 5_000_000


def dumps(doc: dict) -> str:
    """Serialise a document: pretty-printed, keys sorted, UTF-8 text ending in a newline."""
    return json.dumps(doc, indent=2, sort_keys=True, ensure_ascii=False) + "\n"


def load(path) -> dict:
    """Read and validate a project file.

    Raises
    ------
    StagewrightError
        Unreadable file, broken JSON (with line and column), or a document that fails
        validation (naming the field path, the value and what was expected).
    """
    path = Path(path)
    try:
        size = path.stat().st_size
        if size > MAX_FILE_BYTES:
            raise StagewrightError(f"{path}: file is {size} bytes; project files are limited to {MAX_FILE_BYTES}")
        text = path.read_text(encoding="utf-8")
    except OSError as exc:
        raise StagewrightError(f"{path}: cannot read ({exc.strerror})") from None
    except UnicodeDecodeError as exc:
        raise StagewrightError(f"{path}: not UTF-8 text (byte {exc.start})") from None
    try:
        doc = json.loads(text)
    except json.JSONDecodeError as exc:
        raise StagewrightError(f"{path}: broken JSON at line {exc.lineno}, column {exc.colno}: {exc.msg}") from None
    found = problems(doc)
    if found:
        raise InputError.from_problems(found)
    return doc


def save(doc: dict, path) -> None:
    """Write ``doc`` to ``path`` atomically (temporary file in the same folder, fsync, replace)."""
    path = Path(path)
    text = dumps(doc)
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
            fh.flush()
            os.fsync(fh.fileno())
        os.replace(tmp, path)
    except BaseException:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        raise
