"""A case as the differences from the base design: a map of field paths to values.

A project holds one base design (the document's own keys) and named cases, each stored as
``{"name": …, "changes": {"site.ambient_temperature_K": 308.15, "stages[1].cooler": null}}``.
A change sets the value at its field path (:mod:`stagewright.core.project.paths` spelling); ``null``
removes the key (an optional key then takes its default, which for every nullable key of the
schema is "none"). A change to a whole list (``"stages": […]``) replaces the list, so a case
may have another number of stages.

The changes are the *only* thing a case stores: edit the base and every case that does not
change that field follows it.
"""
from __future__ import annotations

__all__ = ["DOCUMENT_ONLY_KEYS", "CHANGEABLE_KEYS", "apply_changes", "differences", "base_document"]

import copy
from typing import Any, Mapping

from stagewright.core.project.paths import parent_at, parse_path

#: keys of the project document that belong to the file, not to a design: never part of a case
DOCUMENT_ONLY_KEYS = ("format", "version", "base_name", "cases", "snapshot")
#: the top-level keys a case may change
CHANGEABLE_KEYS = ("title", "note", "site", "fluid", "flow", "inlet_pressure_drop_Pa", "discharge_pressure_Pa",
                   "discharge_gauge_pressure_Pa", "driver", "stages", "heat_recovery", "year", "field_check",
                   "package")


def base_document(doc: Mapping) -> dict:
    """The base design alone: a deep copy of ``doc`` without its cases and snapshot.

    Examples
    --------
    >>> base_document({"title": "A", "cases": [{"name": "B", "changes": {}}], "snapshot": None})
    {'title': 'A'}
    """
    return {k: copy.deepcopy(v) for k, v in doc.items() if k not in ("base_name", "cases", "snapshot")}


def _order(path: str) -> int:
    return len(parse_path(path))


def apply_changes(base: Mapping, changes: Mapping[str, Any]) -> dict:
    """A deep copy of ``base`` with ``changes`` applied, shorter paths first.

    Parameters
    ----------
    base : Mapping
        A project document (its cases and snapshot, if any, are left out of the copy).
    changes : Mapping of str to JSON value
        Field path → new value; ``None`` removes the key (from an object; in a list it sets the
        item to null).

    Returns
    -------
    dict
        The case as a standalone document.

    Raises
    ------
    stagewright.core.errors.InputError
        If a path is not a well-formed field path (field ``path``).
    KeyError, IndexError, TypeError
        If a path runs through something that is not there (an index past a list's end, a key
        below a number). :func:`stagewright.core.project.validation.problems` reports these as problems
        of the case.

    Examples
    --------
    >>> base = {"site": {"ambient_temperature_K": 293.15}, "stages": [{"name": "1"}, {"name": "2"}]}
    >>> apply_changes(base, {"site.ambient_temperature_K": 308.15, "stages[1].name": "HP"})
    {'site': {'ambient_temperature_K': 308.15}, 'stages': [{'name': '1'}, {'name': 'HP'}]}
    >>> apply_changes({"year": {"load": 1.0}, "title": "x"}, {"year": None})
    {'title': 'x'}
    """
    doc = base_document(base)
    for path in sorted(changes, key=_order):
        node, last = parent_at(doc, path)
        value = changes[path]
        if value is None and isinstance(node, dict):
            node.pop(last, None)
        elif isinstance(node, list) and isinstance(last, int) and last == len(node):
            node.append(copy.deepcopy(value))  # one past the end: a case's added stage
        else:
            node[last] = copy.deepcopy(value)
    return doc


def _same(a: Any, b: Any) -> bool:
    """Equal as project data: a missing key equals null; 1 equals 1.0 (JSON has one number type),
    but ``true`` is not 1."""
    if isinstance(a, bool) or isinstance(b, bool):
        return a is b
    return a == b


def differences(base: Mapping, other: Mapping) -> dict[str, Any]:
    """The changes that turn ``base`` into ``other`` (both standalone documents), as few and as
    deep as possible: :func:`apply_changes` ``(base, differences(base, other))`` equals ``other``
    up to keys that are null in one and missing in the other.

    Objects are compared key by key; lists of one length item by item; a list whose length
    changed is one change of the whole list.

    Examples
    --------
    >>> a = {"title": "A", "site": {"ambient_temperature_K": 293.15, "relative_humidity": 0.6}}
    >>> b = {"title": "A", "site": {"ambient_temperature_K": 308.15}}
    >>> differences(a, b)
    {'site.ambient_temperature_K': 308.15, 'site.relative_humidity': None}
    """
    out: dict[str, Any] = {}
    keys = [k for k in dict.fromkeys([*base, *other]) if k not in DOCUMENT_ONLY_KEYS]
    for key in keys:
        _diff(base.get(key), other.get(key), key, out)
    return out


def _diff(a: Any, b: Any, path: str, out: dict) -> None:
    if isinstance(a, dict) and isinstance(b, dict):
        for key in dict.fromkeys([*a, *b]):
            _diff(a.get(key), b.get(key), f"{path}.{key}", out)
    elif isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
        for i, (x, y) in enumerate(zip(a, b)):
            _diff(x, y, f"{path}[{i}]", out)
    elif not _same(a, b):
        out[path] = copy.deepcopy(b)
