"""The JSON Schema (draft 2020-12) of the project file, generated from :mod:`stagewright.core.project.schema`.

The schema ships with the package as ``project.schema.json`` beside this module
(:data:`SCHEMA_FILE`), so editors can validate and complete project files, and other tools can
check them without Stagewright. It is generated from the declarations of
:mod:`~stagewright.core.project.schema` (:class:`~stagewright.core.project.schema_types.Num`, ``Choice``, ``Text``,
``Obj``, ``Variant``, ``Items``, ``Changes``, ``Raw``) by one generic walk, so a new section
needs no change here; after changing the schema (or a key's meaning in
:mod:`~stagewright.core.project.schema_docs`, which gives each key its ``description``) run::

    python -m stagewright.core.project.json_schema --write

``tests/test_project_json_schema.py`` fails until the committed file is the generated one.

Files that :func:`stagewright.core.project.save` writes carry ``"$schema": SCHEMA_ID``, a URN naming the
schema of this format version (``urn:stagewright:project:3``). A URN, not a web address: nothing
is fetched, no server has to stay up, and the name does not move with the installation; an
editor is pointed at the installed file once (``docs/project-format.md``, *JSON Schema*). The
reader accepts the key with any text value (an editor may rewrite it to a local path) and
ignores it.

Where the schema and the tool's validation differ
-------------------------------------------------
The schema states every key, type, range, default, required key and "exactly one of" group of
the key table. It does not state the rules that the validation applies in code across keys
(:data:`CROSS_KEY_RULES`; a document the schema accepts may still be refused for one of these,
and the tool names the field); some of them JSON Schema could express, and would need a
declaration in :mod:`~stagewright.core.project.schema` first (they live in ``validation.py``,
``year_profile.py`` and ``uncertainty/inputs.py`` today):

- ``site``: not both ``barometric_pressure_Pa`` and ``elevation_m``; at most one of
  ``relative_humidity``, ``dew_point_K``, ``humidity_ratio``; a dew point not above the ambient
  temperature.
- ``inlet_pressure_drop_Pa`` less than half the barometric pressure (from the site).
- ``discharge_pressure_Pa`` above the barometric pressure; ``discharge_gauge_pressure_Pa`` at
  most 5e7 Pa less the barometric pressure.
- ``stages[i]``: ``min_pressure_ratio`` at most ``max_pressure_ratio``.
- ``stages[i].cooler``: ``coolant_inlet_temperature_K`` required with ``approach_K`` (unless
  the coolant is air) and for a water or glycol coolant; a ``coolant`` required with
  ``ua_W_K``; ``coolant.glycol_fraction`` required for glycol and only for glycol.
- ``year.profile``: twelve months, January to December; hours for every month or none, each at
  most the hours of its month; bins adding up to at most 8784 h;
  ``year.operating_hours_per_year`` at most 8784 h.
- ``field_check``: each uncertainty names a measured input of the project, each input once;
  each guarantee names a figure a field check reports (ISO 1217 Annex C tolerances only on free
  air delivery and specific power).
- ``cases``: names unique, not empty and not the base's; each case's own document (the base
  with its changes) valid.

Nor does it state what the reader refuses before any document rule (``stagewright.core.project.parse``):
a file over 16 MB, nesting deeper than 32, text that is not UTF-8, a key given twice, ``NaN`` or
``Infinity`` (not JSON, though Python's parser reads them).
"""
from __future__ import annotations

__all__ = ["SCHEMA_ID", "SCHEMA_DIALECT", "SCHEMA_FILE", "CROSS_KEY_RULES", "json_schema", "node_schema",
           "schema_text", "committed_text", "write"]

import json
import math
import re
import sys
from pathlib import Path
from typing import Any

from stagewright.core.project import schema
# the schema's ``$id``, and the ``$schema`` value of every file the tool writes: defined beside the
# reader, which ignores the key, so that saving a file does not import this generator
from stagewright.core.project.reading import SCHEMA_ID
from stagewright.core.project.schema_types import MISSING, Changes, Choice, Items, Num, Obj, Raw, Text, Variant, walk

#: the dialect of the generated schema
SCHEMA_DIALECT = "https://json-schema.org/draft/2020-12/schema"
#: the generated schema as shipped with the package
SCHEMA_FILE = Path(__file__).with_name("project.schema.json")

#: (field-path pattern, rule) of every rule the validation applies beyond the key table: a problem
#: of a document the schema accepts names a field matching one of these (the tests check it)
CROSS_KEY_RULES = (
    (r"site\.elevation_m", "not both barometric_pressure_Pa and elevation_m"),
    (r"site\.(relative_humidity|dew_point_K|humidity_ratio)",
     "at most one of relative_humidity, dew_point_K, humidity_ratio"),
    (r"site\.dew_point_K", "a dew point not above the ambient temperature"),
    (r"inlet_pressure_drop_Pa", "less than half the barometric pressure"),
    (r"discharge_pressure_Pa", "above the barometric pressure"),
    (r"discharge_gauge_pressure_Pa", "at most 5e7 Pa absolute"),
    (r"stages\[\d+\]\.min_pressure_ratio", "at most max_pressure_ratio"),
    (r"stages\[\d+\]\.cooler\.coolant_inlet_temperature_K",
     "required with approach_K (unless the coolant is air) and for a water or glycol coolant"),
    (r"stages\[\d+\]\.cooler\.coolant", "required with ua_W_K"),
    (r"stages\[\d+\]\.cooler\.coolant\.glycol_fraction", "required for glycol, and only for glycol"),
    (r"year\.profile\.months", "twelve months, January to December"),
    (r"year\.profile\.months\[\d+\]\.hours", "hours for every month or none, each at most its month's"),
    (r"year\.profile\.bins", "bins adding up to at most 8784 h"),
    (r"year\.operating_hours_per_year", "at most 8784 h"),
    (r"field_check\.uncertainties\[\d+\]\.input", "a measured input of the project, each once"),
    (r"field_check\.guarantees\[\d+\]\.figure", "a figure a field check reports; ISO 1217 on FAD and "
                                                "specific power only"),
    (r"cases\[\d+\]\.name", "unique, not empty, not the base's"),
    (r"cases\[\d+\]\.changes", "the case's own document valid"),
)

_JSON_VALUE = "#/$defs/json_value"
_NOT_NULL = {"not": {"type": "null"}}


def _annotate(out: dict, node: Any, path: str, meanings: dict) -> dict:
    """``out`` with the key's meaning (and unit) as ``description`` and its ``default``."""
    meaning = meanings.get(path)
    unit = getattr(node, "unit", "")
    if meaning or unit:
        out["description"] = " ".join(part for part in (meaning, f"[{unit}]" if unit else "") if part)
    default = getattr(node, "default", MISSING)
    if default is not MISSING:
        out["default"] = default
    return out


def _number(node: Num) -> dict:
    out: dict = {"type": ["integer" if node.integer else "number"]}
    if math.isfinite(node.lo):
        out["exclusiveMinimum" if node.lo_open else "minimum"] = node.lo
    if math.isfinite(node.hi):
        out["exclusiveMaximum" if node.hi_open else "maximum"] = node.hi
    if node.nullable:
        out["type"].append("null")
    out["type"] = out["type"][0] if len(out["type"]) == 1 else out["type"]
    return out


def _object(fields: dict, path: str, meanings: dict, tag: tuple = ()) -> dict:
    """A closed object of ``fields`` (and the variant tag ``(name, kind)``, if any)."""
    props: dict = {}
    required = []
    if tag:
        props[tag[0]] = {"const": tag[1]}
        required.append(tag[0])
    for key, sub in fields.items():
        sub_path = f"{path}{{{tag[1]}}}.{key}" if tag else (f"{path}.{key}" if path else key)
        props[key] = node_schema(sub, sub_path, meanings)
        if getattr(sub, "required", False):
            required.append(key)
    out: dict = {"type": "object", "properties": props}
    if required:
        out["required"] = required
    out["additionalProperties"] = False
    return out


def _exactly_one(group: tuple) -> dict:
    """Exactly one key of ``group`` present and not null."""
    return {"oneOf": [{"required": [k], "properties": {k: _NOT_NULL}} for k in group]}


def _change_path_pattern(roots: tuple) -> str:
    """A field path (:func:`stagewright.core.project.paths.parse_path`) starting at one of ``roots``."""
    name = "[A-Za-z_][A-Za-z0-9_]*"
    first = "|".join(re.escape(r) for r in roots)
    return rf"^(?:{first})(?:\.{name}|\.?\[[0-9]{{1,9}}\](?:{name})?)*(?!\n)$"


def node_schema(node: Any, path: str = "", meanings: dict | None = None) -> dict:
    """The JSON Schema of one schema node (``path`` in :func:`~stagewright.core.project.schema_types.walk`
    notation names its meaning in ``meanings``).

    Examples
    --------
    >>> node_schema(Num(0.0, 1.0, lo_open=True, nullable=True))
    {'type': ['number', 'null'], 'exclusiveMinimum': 0.0, 'maximum': 1.0}
    >>> node_schema(Choice(("a", "b"), default="a"))
    {'enum': ['a', 'b'], 'default': 'a'}
    """
    meanings = {} if meanings is None else meanings
    nullable = getattr(node, "nullable", False)
    if isinstance(node, Num):
        out = _number(node)
    elif isinstance(node, Choice):
        out = {"enum": list(node.options) + ([None] if nullable else [])}
    elif isinstance(node, Text):
        out = {"type": ["string", "null"] if nullable else "string", "maxLength": node.max_length}
    elif isinstance(node, Obj):
        out = _object(node.fields, path, meanings)
        groups = [_exactly_one(g) for g in node.one_of]
        if len(groups) == 1:
            out.update(groups[0])
        elif groups:
            out["allOf"] = groups
    elif isinstance(node, Variant):
        out = {"type": "object", "properties": {node.tag: node_schema(Choice(tuple(node.variants)),
                                                                      f"{path}.{node.tag}" if path else node.tag,
                                                                      meanings)},
               "required": [node.tag],
               "oneOf": [_object(fields, path, meanings, tag=(node.tag, kind)) for kind, fields in node.variants.items()]}
    elif isinstance(node, Items):
        out = {"type": "array", "items": node_schema(node.item, f"{path}[]", meanings)}
        if node.min_length:
            out["minItems"] = node.min_length
        out["maxItems"] = node.max_length
    elif isinstance(node, Changes):
        out = {"type": "object", "maxProperties": node.max_items,
               "propertyNames": {"pattern": _change_path_pattern(node.roots)},
               "additionalProperties": {"$ref": _JSON_VALUE}}
    elif isinstance(node, Raw):
        out = {"$ref": _JSON_VALUE}
    else:
        raise TypeError(f"unknown schema node {node!r}")  # programming error, not user input
    if nullable and isinstance(node, (Obj, Variant)):
        out = {"anyOf": [out, {"type": "null"}]}
    return _annotate(out, node, path, meanings)


def _largest_list() -> int:
    """The most items any list may hold (the reader refuses longer ones anywhere, even in a
    snapshot's results: ``stagewright.core.project.reading``)."""
    return max(n.max_length for _, n in walk(schema.PROJECT) if isinstance(n, Items))


def json_schema() -> dict:
    """The JSON Schema of the project file, generated afresh from :mod:`stagewright.core.project.schema`."""
    from stagewright.core.project.schema_docs import PROJECT_KEYS  # the meanings, read only when generating

    top = node_schema(schema.PROJECT, "", PROJECT_KEYS)
    top["properties"] = {"$schema": {"type": "string", "description":
                                     f"The JSON Schema of this file ({SCHEMA_ID}); the tool ignores it."},
                         **top["properties"]}
    return {
        "$schema": SCHEMA_DIALECT,
        "$id": SCHEMA_ID,
        "title": f"Stagewright project file, format version {schema.FORMAT_VERSION}",
        "description": "Generated from thermo/project/schema.py by `python -m stagewright.core.project.json_schema "
                       "--write`; rules across keys that it does not state are listed in "
                       "docs/project-format.md (JSON Schema).",
        **top,
        "$defs": {"json_value": {"description": f"Any JSON value; arrays of at most {_largest_list()} items.",
                                 "maxItems": _largest_list(), "items": {"$ref": _JSON_VALUE},
                                 "additionalProperties": {"$ref": _JSON_VALUE}}},
    }


def schema_text() -> str:
    """The generated schema as the committed file holds it."""
    return json.dumps(json_schema(), indent=2, ensure_ascii=False, allow_nan=False) + "\n"


def committed_text() -> str:
    """The schema file shipped with the package (:data:`SCHEMA_FILE`)."""
    return SCHEMA_FILE.read_text(encoding="utf-8")


def write() -> bool:
    """Write :data:`SCHEMA_FILE` afresh; True if it changed."""
    new = schema_text()
    old = SCHEMA_FILE.read_text(encoding="utf-8") if SCHEMA_FILE.exists() else None
    if new != old:
        SCHEMA_FILE.write_text(new, encoding="utf-8", newline="\n")
    return new != old


if __name__ == "__main__":  # pragma: no cover - a developer tool
    if "--write" in sys.argv:
        print(f"{SCHEMA_FILE}: {'updated' if write() else 'already up to date'}")
    elif "--check" in sys.argv:
        sys.exit(0 if committed_text() == schema_text() else 1)
    else:
        sys.stdout.write(schema_text())
