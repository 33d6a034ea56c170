"""Parse untrusted bytes as JSON data, and nothing else.

A project file may come from anywhere (e-mail, a shared drive, a download), so it is
read as data only: the standard-library JSON parser (never pickle, never ``eval``), a
size limit checked before the bytes are read, a nesting-depth limit checked before the
parser runs (so a hostile file cannot exhaust the recursion stack), duplicate keys
refused (JSON allows them; silently keeping the last one loses data), and very long
integer literals read as floats instead of tripping Python's digit limit. Every
rejection is a :class:`~stagewright.core.errors.ProjectFileError` naming a position (line and
column) or a field path.
"""
from __future__ import annotations

__all__ = ["MAX_FILE_BYTES", "MAX_DEPTH", "parse_bytes", "read_limited", "position"]

import json
import os
import re
import stat
from pathlib import Path
from typing import Any

from stagewright.core.errors import ProjectFileError

#: Largest project file read, [bytes]. The largest document the schema allows (an hourly
#: year profile of 8784 labelled bins, 12 stages with the longest names, all text in 4-byte
#: characters) is about 7 MB pretty-printed (a test builds it); typical files are a few kB.
MAX_FILE_BYTES = 16_000_000
#: Deepest nesting of objects and arrays read. A valid document nests 4 deep
#: (document → stages → stage → cooler); the margin allows for future versions.
MAX_DEPTH = 32
_MAX_INT_DIGITS = 100

#: a string (an unterminated one runs to the end of the text: matching it once keeps the scan
#: linear, where a required closing quote made every later quote start a new failing match),
#: or a bracket
_TOKENS = re.compile(r'"(?:[^"\\]|\\.)*"?|[\[\]{}]', re.DOTALL)


def position(text: str, index: int) -> tuple[int, int]:
    """1-based (line, column) of character ``index`` in ``text``."""
    line = text.count("\n", 0, index) + 1
    return line, index - (text.rfind("\n", 0, index) + 1) + 1


_STRINGS = re.compile(r'"(?:[^"\\]|\\.)*"?', re.DOTALL)
_NOT_BRACKETS = bytes(c for c in range(256) if c not in b"[]{}")  # bytes.translate deletes these


def _deepest(text: str) -> int:
    """Deepest nesting of brackets outside strings, in C-speed passes (a Python loop over the
    two million brackets of a 6 MB file took seconds)."""
    import numpy as np

    brackets = _STRINGS.sub("", text).encode("utf-8", "surrogatepass").translate(None, _NOT_BRACKETS)
    if not brackets:
        return 0
    codes = np.frombuffer(brackets, dtype=np.uint8)
    steps = np.where((codes == ord("[")) | (codes == ord("{")), 1, -1)
    return int(np.cumsum(steps).max())


def _check_depth(text: str) -> None:
    if _deepest(text) <= MAX_DEPTH:
        return
    depth = 0  # too deep: find where, for the message
    for m in _TOKENS.finditer(text):
        tok = m.group()
        if tok in "[{":
            depth += 1
            if depth > MAX_DEPTH:
                line, col = position(text, m.start())
                raise ProjectFileError(f"line {line}, column {col}: nested more than {MAX_DEPTH} levels deep; "
                                       "not a project file", line=line, column=col)
        elif tok in "]}":
            depth -= 1


def _parse_int(literal: str):
    # Python refuses int literals over 4300 digits (a ValueError without a position);
    # no valid key needs more than a few digits, so read long ones as floats (→ inf,
    # which validation then rejects with the field path).
    return int(literal) if len(literal) <= _MAX_INT_DIGITS else float(literal)


class _Pairs:
    """``object_pairs_hook`` that builds dicts and remembers duplicated keys."""

    def __init__(self):
        self.duplicates: list[tuple[int, str]] = []  # (id of the dict, key)

    def __call__(self, pairs):
        d = {}
        for key, value in pairs:
            if key in d:
                self.duplicates.append((id(d), key))
            d[key] = value
        return d


def _find_path(node: Any, target: int, path: str = "") -> str | None:
    if id(node) == target:
        return path
    if isinstance(node, dict):
        items = ((f"{path}.{k}" if path else k, v) for k, v in node.items())
    elif isinstance(node, list):
        items = ((f"{path}[{i}]", v) for i, v in enumerate(node))
    else:
        return None
    for sub_path, value in items:
        found = _find_path(value, target, sub_path)
        if found is not None:
            return found
    return None


def parse_bytes(data: bytes) -> Any:
    """Parse ``data`` (UTF-8 JSON, an optional byte-order mark allowed) into plain data.

    Parameters
    ----------
    data : bytes
        The file's content.

    Returns
    -------
    object
        Plain JSON data: dict, list, str, int, float, bool or None.

    Raises
    ------
    ProjectFileError
        Too large, not UTF-8, nested too deeply, broken JSON or a duplicated key; the
        message names the line and column, or the path of the duplicated key.

    Examples
    --------
    >>> parse_bytes(b'{"title": "x"}')
    {'title': 'x'}
    >>> parse_bytes(b'{"title": "x",}')
    Traceback (most recent call last):
    ...
    stagewright.core.errors.ProjectFileError: line 1, column 15: broken JSON (Expecting property name enclosed in double quotes)
    """
    if len(data) > MAX_FILE_BYTES:
        raise ProjectFileError(f"file is larger than {MAX_FILE_BYTES} bytes; not a project file")
    if data.startswith(b"\xef\xbb\xbf"):  # some Windows editors write a UTF-8 byte-order mark
        data = data[3:]
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        before = data[:exc.start].decode("utf-8")  # valid up to the error, by definition
        line, col = position(before, len(before))
        raise ProjectFileError(f"line {line}, column {col}: not UTF-8 text (byte {exc.start + 1} of the file)",
                               line=line, column=col) from None
    _check_depth(text)
    pairs = _Pairs()
    try:
        doc = json.loads(text, object_pairs_hook=pairs, parse_int=_parse_int)
    except json.JSONDecodeError as exc:
        raise ProjectFileError(f"line {exc.lineno}, column {exc.colno}: broken JSON ({exc.msg})",
                               line=exc.lineno, column=exc.colno) from None
    except RecursionError:  # unreachable after _check_depth; kept so no traceback can escape
        raise ProjectFileError(f"nested more than {MAX_DEPTH} levels deep; not a project file") from None
    if pairs.duplicates:
        where, key = pairs.duplicates[0]
        parent = _find_path(doc, where)
        field = f"{parent}.{key}" if parent else key
        raise ProjectFileError(f"{field}: key given more than once; keep one", field=field)
    return doc


def read_limited(path: Path) -> bytes:
    """Read a regular file of at most :data:`MAX_FILE_BYTES` bytes.

    Raises
    ------
    ProjectFileError
        Missing, unreadable, not a regular file (a folder, a device, a pipe), or too large.
    """
    try:
        info = os.stat(path)
        if not stat.S_ISREG(info.st_mode):
            raise ProjectFileError("not a regular file; not a project file")
        if info.st_size > MAX_FILE_BYTES:
            raise ProjectFileError(f"file is {info.st_size} bytes, larger than {MAX_FILE_BYTES}; "
                                   "not a project file")
        with open(path, "rb") as fh:
            data = fh.read(MAX_FILE_BYTES + 1)  # the file may have grown since stat
    except OSError as exc:
        raise ProjectFileError(f"cannot read ({exc.strerror or exc})") from None
    if len(data) > MAX_FILE_BYTES:
        raise ProjectFileError(f"file is larger than {MAX_FILE_BYTES} bytes; not a project file")
    return data
