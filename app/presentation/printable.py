"""Text from a project made printable: an unpaired surrogate becomes U+FFFD.

A project file may hold ``\\ud800`` (JSON allows the escape, and the file reads back the same);
such text cannot be encoded as UTF-8 or drawn by a font, so every output that prints or encodes
text from a project (the PDF and CSV report, chart labels) takes it through :func:`printable`.
The document itself keeps the character: saving writes the escape back.
"""
from __future__ import annotations

__all__ = ["printable"]

import re
from typing import Any

_LONE_SURROGATE = re.compile("[\ud800-\udfff]")


def printable(value: Any) -> Any:
    """``value`` with every string in it (dict keys and values, list items) free of unpaired
    surrogates, each replaced by U+FFFD; other values unchanged, containers copied only when needed.

    Examples
    --------
    >>> printable({"title": "a\\ud800b", "n": 1})
    {'title': 'a\ufffdb', 'n': 1}
    """
    if isinstance(value, str):
        return _LONE_SURROGATE.sub("\ufffd", value)
    if isinstance(value, dict):
        return {printable(k): printable(v) for k, v in value.items()}
    if isinstance(value, list):
        return [printable(v) for v in value]
    return value
