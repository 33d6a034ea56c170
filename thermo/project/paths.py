"""Field paths into a project document: ``stages[1].efficiency.value``.

The same spelling is used by error messages, result warnings, the window's undo
commands and parameter sweeps, so a path from any of them can select or change a field.
"""
from __future__ import annotations

__all__ = ["parse_path", "get_path", "set_path", "parent_at"]

import re

from stagewright.core.errors import InputError

_TOKEN = re.compile(r"([A-Za-z_][A-Za-z0-9_]*)|\[(\d+)\]")


def parse_path(path: str) -> list:
    """Split ``"stages[1].cooler.approach_K"`` into ``["stages", 1, "cooler", "approach_K"]``.

    Raises
    ------
    InputError
        If the text is not a well-formed field path.
    """
    parts, pos = [], 0
    for m in _TOKEN.finditer(path):
        gap = path[pos:m.start()]
        if gap not in ("", ".") or (gap == "." and not parts):
            raise InputError("path", path, "expected a field path like stages[1].efficiency.value")
        parts.append(m.group(1) if m.group(1) is not None else int(m.group(2)))
        pos = m.end()
    if not parts or pos != len(path):
        raise InputError("path", path, "expected a field path like stages[1].efficiency.value")
    return parts


def get_path(doc, path: str):
    """Value at ``path`` in ``doc`` (KeyError/IndexError if absent)."""
    node = doc
    for part in parse_path(path):
        node = node[part]
    return node


def parent_at(doc, path: str):
    """``(container, last key or index)`` of ``path`` in ``doc``, creating missing objects (and
    lists, before an index) on the way."""
    parts = parse_path(path)
    node = doc
    for part, nxt in zip(parts, parts[1:]):
        if isinstance(part, str) and (part not in node or node[part] is None):
            node[part] = [] if isinstance(nxt, int) else {}
        node = node[part]
    return node, parts[-1]


def set_path(doc, path: str, value) -> None:
    """Set the value at ``path`` in ``doc`` in place, creating missing objects on the way."""
    node, last = parent_at(doc, path)
    node[last] = value
