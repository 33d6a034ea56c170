"""What every sub-command shares: exit statuses and the files named on the command line."""
from __future__ import annotations

__all__ = ["EXIT_OK", "EXIT_FAILED", "EXIT_INPUT", "expand_paths"]

from pathlib import Path

EXIT_OK, EXIT_FAILED, EXIT_INPUT = 0, 1, 2


def expand_paths(items: list[str]) -> list[Path]:
    """Files named directly, plus every ``*.json`` in folders named, in sorted order.

    Examples
    --------
    >>> [p.name for p in expand_paths(["a.json", "b.json"])]
    ['a.json', 'b.json']
    """
    out: list[Path] = []
    for item in items:
        p = Path(item)
        out.extend(sorted(p.glob("*.json")) if p.is_dir() else [p])
    return out
