"""Read a project file: parse safely, recognise a project, upgrade its version, validate.

Reading never writes anything: a file that is refused, and a file of an older version
that is upgraded in memory, stay exactly as they were on disk until the user saves.
"""
from __future__ import annotations

__all__ = ["load", "loads", "load_with_problems", "read_document", "accept", "recognise"]

from pathlib import Path
from typing import Any

from stagewright.core.project import schema
from stagewright.core.project.validation import problems
from stagewright.core.errors import InputError, ProjectFileError, StagewrightError, shown_value
from stagewright.core.project.migrate import migrate
from stagewright.core.project.parse import parse_bytes, read_limited


def _list_limits() -> tuple[dict, int]:
    """Item limit of each top-level list of the schema, and the largest limit of any list."""
    from stagewright.core.project.schema_types import Items, walk
    top = {k: n.max_length for k, n in schema.PROJECT.fields.items() if isinstance(n, Items)}
    return top, max(n.max_length for _, n in walk(schema.PROJECT) if isinstance(n, Items))


def _refuse_oversized_lists(data: dict) -> None:
    """Refuse a list far longer than the schema allows before anything copies or checks its
    items (a 6 MB file of two million empty stages took 20 s and 1.3 GB, and gave one problem
    per item): one message naming the list and its limit."""
    top, largest = _list_limits()
    stack = [(k, v, top.get(k, largest)) for k, v in data.items()]
    while stack:
        path, value, limit = stack.pop()
        if isinstance(value, list):
            if len(value) > limit:
                raise ProjectFileError(f"{path}: {len(value)} items — expected at most {limit}; "
                                       "not read further", field=path)
            stack.extend((f"{path}[{i}]", v, largest) for i, v in enumerate(value) if isinstance(v, (list, dict)))
        elif isinstance(value, dict):
            stack.extend((f"{path}.{k}", v, largest) for k, v in value.items() if isinstance(v, (list, dict)))


def recognise(data: Any) -> dict:
    """Refuse data that is not a project document at all (rather than a faulty one)."""
    if not isinstance(data, dict):
        kind = {list: "a list", str: "text", bool: "true/false", type(None): "null"}.get(type(data), "a number")
        raise ProjectFileError(f"(document): {kind} — not a Stagewright project "
                               "(expected a JSON object with site, flow and stages)", field="(document)")
    if "format" in data:
        if data["format"] != schema.FORMAT_NAME:
            raise ProjectFileError(f"format: {shown_value(data['format'])} — not a Stagewright project file "
                                   f"(expected {schema.FORMAT_NAME!r})", field="format")
    elif not set(data) & set(schema.PROJECT.fields):
        keys = ", ".join(k if k.isidentifier() and len(k) <= 40 else shown_value(k, 40) for k in sorted(data)[:5]) or "none"
        raise ProjectFileError(f"(document): no 'format' key and none of the project keys (found: {keys}) "
                               "— not a Stagewright project", field="(document)")
    _refuse_oversized_lists(data)
    return data


def accept(data: Any) -> tuple[dict, int]:
    """Recognise, upgrade and validate parsed JSON data as a project; see :func:`read_document`."""
    doc, declared = migrate(recognise(data))
    doc = {"format": schema.FORMAT_NAME, **doc}
    found = problems(doc)
    if found:
        raise InputError.from_problems(found)
    return doc, declared


def read_document(data: bytes) -> tuple[dict, int]:
    """Parse, recognise, upgrade and validate a project from raw bytes.

    Returns
    -------
    tuple of (dict, int)
        The current-version document (``format`` and ``version`` set) and the version the
        file declared.

    Raises
    ------
    ProjectFileError
        Not JSON, not a project, too large, too deep, or an unknown format version.
    InputError
        The document does not validate; ``.problems`` lists every problem with its
        field path, value and what is allowed.
    """
    return accept(parse_bytes(data))


def loads(text: str | bytes) -> dict:
    """Read a project from its file content (text or UTF-8 bytes); see :func:`load`.

    Examples
    --------
    >>> doc = loads('{"site": {"ambient_temperature_K": 293.15}, "flow": {"kind": "mass", "value": 1},'
    ...             ' "discharge_pressure_Pa": 4e5, "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]}')
    >>> doc["format"], doc["version"]  # no version: a version-1 file, upgraded in memory
    ('stagewright-project', 3)
    """
    data = text.encode("utf-8", "surrogatepass") if isinstance(text, str) else bytes(text)
    return read_document(data)[0]


def load(path) -> dict:
    """Read, upgrade and validate a project file.

    Parameters
    ----------
    path : str or Path
        A project file (UTF-8 JSON).

    Returns
    -------
    dict
        The document as written in the file (defaults are not filled in; use
        :func:`stagewright.core.project.validation.normalise` for that), upgraded to the current format
        version, with ``format`` and ``version`` set. ``load → save → load`` gives an
        identical document.

    Raises
    ------
    ProjectFileError
        Unreadable, too large, nested too deeply, not UTF-8, broken JSON (message with
        line and column), not a project file, or a format version newer than this
        release reads. ``.source`` is the path.
    InputError
        The document does not validate: wrong types, missing or unknown keys, values out
        of range. ``.problems`` lists each with field path, value and expected range.
    """
    path = Path(path)
    try:
        return read_document(read_limited(path))[0]
    except StagewrightError as exc:
        exc.source = path
        raise


def load_with_problems(path) -> tuple[dict, list]:
    """Read and upgrade a project file that may not validate (e.g. saved with problems).

    Returns
    -------
    tuple of (dict, list of Problem)
        The document as :func:`load` would return it, and its validation problems (empty
        when it is valid). Solve it only when the list is empty.

    Raises
    ------
    ProjectFileError
        As :func:`load`: unreadable, too large or deep, not UTF-8, broken JSON, not a
        project, or an unknown format version.
    """
    path = Path(path)
    try:
        doc, _ = migrate(recognise(parse_bytes(read_limited(path))))
    except StagewrightError as exc:
        exc.source = path
        raise
    doc = {"format": schema.FORMAT_NAME, **doc}
    return doc, problems(doc)
