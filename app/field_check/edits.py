"""Qt-free edits of a project's ``field_check`` section, as the window's field-check panel makes them.

Each function returns a new section (the document is changed by the caller, as one undo step);
the values are SI, in the unit of the input named.
"""
from __future__ import annotations

__all__ = ["KINDS", "uncertainty_entry", "with_uncertainty", "without_uncertainty"]

import copy

#: what the panel offers → (entry kind, the class is of the full scale)
KINDS = {"standard uncertainty u": ("standard", False), "limits ± a (rectangular)": ("limits", False),
         "accuracy class, % of reading": ("accuracy_class", False),
         "accuracy class, % of full scale": ("accuracy_class", True)}


def uncertainty_entry(path: str, offered: str, amount: float, full_scale: float | None = None) -> dict:
    """The ``uncertainties`` entry of ``path`` for a choice of :data:`KINDS` (``amount`` SI, or per cent).

    Examples
    --------
    >>> uncertainty_entry("flow.value", "accuracy class, % of reading", 1.5)
    {'input': 'flow.value', 'kind': 'accuracy_class', 'class_percent': 1.5}
    """
    kind, of_scale = KINDS[offered]
    if kind == "standard":
        return {"input": path, "kind": kind, "standard_uncertainty": amount}
    if kind == "limits":
        return {"input": path, "kind": kind, "half_width": amount}
    entry = {"input": path, "kind": kind, "class_percent": amount}
    if of_scale:
        entry["full_scale"] = full_scale
    return entry


def with_uncertainty(section: dict | None, entry: dict) -> dict:
    """``section`` with ``entry`` added, or replacing the entry of the same input.

    Examples
    --------
    >>> s = with_uncertainty(None, {"input": "a", "kind": "standard", "standard_uncertainty": 1.0})
    >>> with_uncertainty(s, {"input": "a", "kind": "limits", "half_width": 2.0})["uncertainties"]
    [{'input': 'a', 'kind': 'limits', 'half_width': 2.0}]
    """
    out = copy.deepcopy(section) if section else {}
    items = out.setdefault("uncertainties", [])
    for i, old in enumerate(items):
        if old.get("input") == entry["input"]:
            items[i] = dict(entry)
            return out
    items.append(dict(entry))
    return out


def without_uncertainty(section: dict | None, path: str) -> dict | None:
    """``section`` without the entry of input ``path`` (None when nothing is left in it)."""
    out = copy.deepcopy(section) if section else {}
    out["uncertainties"] = [e for e in out.get("uncertainties", []) if e.get("input") != path]
    if not out["uncertainties"]:
        del out["uncertainties"]
    return out or None
