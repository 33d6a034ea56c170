"""Field paths for the window: reading, setting and removing values at a path.

The spelling is :mod:`stagewright.core.project.paths`'s (the same paths appear in problems, result
warnings and sweeps); this module adds what an editor needs on top — ``ABSENT`` for "key
not present", removal, and tests of which paths a change touches. Qt-free.
"""
from __future__ import annotations

__all__ = ["ABSENT", "parse_path", "format_path", "get_in", "set_in", "stage_index",
           "stage_path", "is_related"]

from typing import Any

from stagewright.core.project.paths import parse_path as _parse_core

class _Absent:
    """Marker for "key not present" (different from a JSON ``null``); survives copying."""

    _instance = None

    def __new__(cls):
        if cls._instance is None:
            cls._instance = super().__new__(cls)
        return cls._instance

    def __repr__(self) -> str:
        return "ABSENT"

    def __bool__(self) -> bool:
        return False

    def __copy__(self):
        return self

    def __deepcopy__(self, memo):
        return self

    def __reduce__(self):
        return (_Absent, ())


ABSENT = _Absent()


def parse_path(path: str) -> list:
    """``"stages[1].cooler.approach_K"`` → ``["stages", 1, "cooler", "approach_K"]``.

    >>> parse_path("stages[1].efficiency.value")
    ['stages', 1, 'efficiency', 'value']
    >>> parse_path("")
    []
    """
    return _parse_core(path) if path else []


def format_path(tokens: list) -> str:
    """Inverse of :func:`parse_path`.

    >>> format_path(["stages", 0, "name"])
    'stages[0].name'
    """
    out = ""
    for t in tokens:
        out += f"[{t}]" if isinstance(t, int) else (f".{t}" if out else t)
    return out


def get_in(doc: Any, path: str, default: Any = ABSENT) -> Any:
    """Value at ``path`` or ``default`` when any step is missing."""
    node = doc
    for t in parse_path(path):
        try:
            node = node[t]
        except (KeyError, IndexError, TypeError):
            return default
    return node


def set_in(doc: dict, path: str, value: Any) -> Any:
    """Set the value at ``path`` (``ABSENT`` deletes the key); return the old value or ``ABSENT``.

    Missing intermediate objects are created, so setting a cooler key on a stage without a
    cooler gives it one.
    """
    tokens = parse_path(path)
    if not tokens:
        raise KeyError("empty path")
    node = doc
    for t, nxt in zip(tokens[:-1], tokens[1:]):
        child = node[t] if isinstance(t, int) else node.get(t)
        if child is None:
            child = [] if isinstance(nxt, int) else {}
            node[t] = child
        node = child
    last = tokens[-1]
    if isinstance(last, int):
        old = node[last]
        node[last] = value
        return old
    old = node.get(last, ABSENT)
    if value is ABSENT:
        node.pop(last, None)
    else:
        node[last] = value
    return old


def stage_index(path: str) -> int | None:
    """Index of the stage a path points into, or None.

    >>> stage_index("stages[2].cooler.pressure_drop_Pa")
    2
    """
    tokens = parse_path(path)
    if len(tokens) >= 2 and tokens[0] == "stages" and isinstance(tokens[1], int):
        return tokens[1]
    return None


def stage_path(index: int, key: str = "") -> str:
    """``stage_path(1, "cooler.approach_K")`` → ``"stages[1].cooler.approach_K"``."""
    return f"stages[{index}]" + (f".{key}" if key else "")


def is_related(a: str, b: str) -> bool:
    """True when one path lies inside the other (or they are equal); ``""`` is the whole document.

    >>> is_related("stages", "stages[1].name"), is_related("site.elevation_m", "site.ambient_temperature_K")
    (True, False)
    """
    ta, tb = parse_path(a), parse_path(b)
    n = min(len(ta), len(tb))
    return ta[:n] == tb[:n]
