"""The cases of a project: a base design and named cases that each change some of its fields.

Every function here is pure: it takes a project document and returns a new one (or a value),
never changing its argument, so the window can keep the old document for undo.

    names = case_names(doc)                  # ["Base", "Summer", "Three stages"]
    summer = case_document(doc, "Summer")    # a standalone project, as if saved on its own
    doc = add_case(doc, "Winter", {"site.ambient_temperature_K": 268.15})
    doc = make_base(doc, "Three stages")     # every case keeps what it was

A case's results are those of :func:`case_document`'s standalone document, exactly: nothing
else of the project reaches the solver.
"""
from __future__ import annotations

__all__ = ["DEFAULT_BASE_NAME", "MAX_NAME_LENGTH", "MAX_CASES", "case_names", "base_name", "case_document",
           "case_changes", "add_case", "set_case_changes", "rename_case", "duplicate_case", "remove_case",
           "make_base", "unique_name", "name_problem"]

import copy
from typing import Any, Mapping

from stagewright.core.errors import InputError
from stagewright.core.project.case_changes import apply_changes, base_document, differences

#: the base design's name when the project does not name it
DEFAULT_BASE_NAME = "Base"
MAX_NAME_LENGTH = 80
#: most cases a project may hold besides its base (the schema's limit)
MAX_CASES = 50


def base_name(doc: Mapping) -> str:
    """The base design's name (``base_name``, else :data:`DEFAULT_BASE_NAME`)."""
    name = doc.get("base_name")
    return name if isinstance(name, str) and name.strip() else DEFAULT_BASE_NAME


def _cases(doc: Mapping) -> list[dict]:
    cases = doc.get("cases")
    return [c for c in cases if isinstance(c, dict)] if isinstance(cases, list) else []


def case_names(doc: Mapping) -> list[str]:
    """The base's name, then each case's, in the project's order.

    Examples
    --------
    >>> case_names({"cases": [{"name": "Summer", "changes": {}}]})
    ['Base', 'Summer']
    """
    return [base_name(doc)] + [str(c.get("name", "")) for c in _cases(doc)]


def _index(doc: Mapping, name: str) -> int:
    """Position of case ``name`` in ``doc["cases"]`` (-1: the base)."""
    if name == base_name(doc):
        return -1
    for i, case in enumerate(_cases(doc)):
        if case.get("name") == name:
            return i
    raise InputError("case", name, "expected one of the project's cases: " + ", ".join(case_names(doc)))


def case_changes(doc: Mapping, name: str) -> dict[str, Any]:
    """The changes case ``name`` makes to the base (empty for the base itself)."""
    i = _index(doc, name)
    return {} if i < 0 else copy.deepcopy(_cases(doc)[i].get("changes") or {})


def case_document(doc: Mapping, name: str | None = None) -> dict:
    """Case ``name`` (default: the base) as a standalone project document.

    Raises
    ------
    InputError
        If the project has no case of that name (field ``case``).
    """
    if name is None or _index(doc, name) < 0:
        return base_document(doc)
    return apply_changes(doc, case_changes(doc, name))


def unique_name(doc: Mapping, stem: str) -> str:
    """``stem``, or ``stem 2``, ``stem 3`` … — the first name no case of ``doc`` has.

    Examples
    --------
    >>> unique_name({"cases": [{"name": "Summer", "changes": {}}]}, "Summer")
    'Summer 2'
    """
    names = set(case_names(doc))
    stem = stem.strip()[:MAX_NAME_LENGTH - 4] or "Case"
    if stem not in names:
        return stem
    n = 2
    while f"{stem} {n}" in names:
        n += 1
    return f"{stem} {n}"


def name_problem(doc: Mapping, name: Any, keep: str | None = None) -> str | None:
    """Why ``name`` cannot name a case of ``doc`` (None: it can). ``keep`` is the case being renamed."""
    if not isinstance(name, str) or not name.strip():
        return "a case needs a name"
    if len(name) > MAX_NAME_LENGTH:
        return f"a case name has at most {MAX_NAME_LENGTH} characters"
    if name != keep and name in case_names(doc):
        return f"the project already has a case named {name!r}"
    return None


def _checked_name(doc: Mapping, name: Any, keep: str | None = None) -> str:
    problem = name_problem(doc, name, keep)
    if problem:
        raise InputError("case name", name, problem)
    return name


def add_case(doc: Mapping, name: str, changes: Mapping[str, Any] | None = None, note: str = "") -> dict:
    """``doc`` with a new case ``name`` at the end (no changes: a copy of the base)."""
    _checked_name(doc, name)
    if len(_cases(doc)) >= MAX_CASES:
        raise InputError("cases", len(_cases(doc)), f"a project holds at most {MAX_CASES} cases besides its base")
    out = copy.deepcopy(dict(doc))
    case = {"name": name, "changes": copy.deepcopy(dict(changes or {}))}
    if note:
        case["note"] = note
    out["cases"] = _cases(out) + [case]
    return out


def set_case_changes(doc: Mapping, name: str, changes: Mapping[str, Any]) -> dict:
    """``doc`` with case ``name``'s changes replaced (for the base: raises, edit the base itself)."""
    i = _index(doc, name)
    if i < 0:
        raise InputError("case", name, "the base design has no changes: edit its fields")
    out = copy.deepcopy(dict(doc))
    out["cases"][i]["changes"] = copy.deepcopy(dict(changes))
    return out


def rename_case(doc: Mapping, name: str, new_name: str) -> dict:
    """``doc`` with case ``name`` (or the base) renamed."""
    i = _index(doc, name)
    _checked_name(doc, new_name, keep=name)
    out = copy.deepcopy(dict(doc))
    if i < 0:
        out["base_name"] = new_name
    else:
        out["cases"][i]["name"] = new_name
    return out


def duplicate_case(doc: Mapping, name: str, new_name: str | None = None) -> dict:
    """``doc`` with a copy of case ``name`` (or of the base) added as ``new_name`` (default
    ``"<name> copy"``, made unique)."""
    changes = case_changes(doc, name)
    new_name = new_name if new_name is not None else unique_name(doc, f"{name} copy")
    note = "" if _index(doc, name) < 0 else str(_cases(doc)[_index(doc, name)].get("note", ""))
    return add_case(doc, new_name, changes, note)


def remove_case(doc: Mapping, name: str) -> dict:
    """``doc`` without case ``name``. The base cannot be removed: make another case the base first."""
    i = _index(doc, name)
    if i < 0:
        raise InputError("case", name, "the base design cannot be removed; make another case the base first")
    out = copy.deepcopy(dict(doc))
    del out["cases"][i]
    if not out["cases"]:
        del out["cases"]
    return out


def make_base(doc: Mapping, name: str) -> dict:
    """``doc`` with case ``name`` as its base design; every other case (the old base among them)
    is restated as its differences from the new base, so each still describes the same design.

    Examples
    --------
    >>> doc = {"title": "A", "site": {"ambient_temperature_K": 293.15},
    ...        "cases": [{"name": "Hot", "changes": {"site.ambient_temperature_K": 308.15}}]}
    >>> new = make_base(doc, "Hot")
    >>> new["site"], new["base_name"], new["cases"]
    ({'ambient_temperature_K': 308.15}, 'Hot', [{'name': 'Base', 'changes': {'site.ambient_temperature_K': 293.15}}])
    """
    i = _index(doc, name)
    if i < 0:
        return copy.deepcopy(dict(doc))
    new_base = case_document(doc, name)
    others = []
    for other in case_names(doc):
        if other == name:
            continue
        entry = {"name": other, "changes": differences(new_base, case_document(doc, other))}
        j = _index(doc, other)
        note = _cases(doc)[j].get("note") if j >= 0 else None
        if note:
            entry["note"] = note
        others.append(entry)
    out = {k: copy.deepcopy(v) for k, v in doc.items() if k in ("format", "version", "snapshot")}
    out.update(new_base)
    out["base_name"] = name
    out["cases"] = others
    return out
