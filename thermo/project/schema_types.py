"""A small declarative schema language for project documents.

A schema is a tree of :class:`Num`, :class:`Choice`, :class:`Text`, :class:`Obj`,
:class:`Variant` and :class:`Items`. :func:`check` walks a document against it and
returns the normalised document (defaults filled in) and a list of
:class:`~stagewright.core.errors.Problem`, each naming the field path, the value and what is
allowed. It never raises on bad data and never evaluates anything.
"""
from __future__ import annotations

__all__ = ["Num", "Choice", "Text", "Obj", "Variant", "Items", "Changes", "Raw", "check", "walk", "MISSING"]

import json
import math
from dataclasses import dataclass, field
from typing import Any

from stagewright.core.errors import Problem

MISSING = object()


@dataclass(frozen=True)
class Num:
    """A finite real number in [lo, hi] (bounds open where flagged), with a unit label."""

    lo: float = -math.inf
    hi: float = math.inf
    unit: str = ""
    required: bool = False
    default: Any = MISSING
    nullable: bool = False
    lo_open: bool = False
    hi_open: bool = False
    integer: bool = False

    def describe(self) -> str:
        lo = "(" if self.lo_open else "["
        hi = ")" if self.hi_open else "]"
        kind = "a whole number" if self.integer else "a number"
        unit = f" {self.unit}" if self.unit else ""
        return f"expected {kind} in {lo}{self.lo:g}, {self.hi:g}{hi}{unit}"


@dataclass(frozen=True)
class Choice:
    """One of a fixed set of strings."""

    options: tuple
    required: bool = False
    default: Any = MISSING
    nullable: bool = False

    def describe(self) -> str:
        return "expected one of " + ", ".join(repr(o) for o in self.options)


@dataclass(frozen=True)
class Text:
    """Free text of bounded length."""

    required: bool = False
    default: Any = MISSING
    max_length: int = 20_000
    nullable: bool = False


@dataclass(frozen=True)
class Obj:
    """A JSON object with a fixed set of keys; unknown keys are problems."""

    fields: dict = field(default_factory=dict)
    required: bool = False
    nullable: bool = False
    default: Any = MISSING
    one_of: tuple = ()  #: groups of keys of which exactly one must be present


@dataclass(frozen=True)
class Variant:
    """An object whose allowed keys depend on its ``kind`` (a tagged union)."""

    variants: dict  #: kind -> dict of fields (``kind`` itself excluded)
    tag: str = "kind"
    required: bool = False
    nullable: bool = False
    default: Any = MISSING


@dataclass(frozen=True)
class Items:
    """A JSON array of objects of one schema."""

    item: Any
    min_length: int = 0
    max_length: int = 1000
    required: bool = False
    default: Any = MISSING


@dataclass(frozen=True)
class Changes:
    """An object mapping field paths (``site.ambient_temperature_K``, ``stages[1].cooler``) to
    values: a case's differences from the base design. Each path must be well formed and start
    at one of ``roots``; what the values mean is checked on the case's own document."""

    roots: tuple = ()
    required: bool = False
    default: Any = MISSING
    max_items: int = 200


@dataclass(frozen=True)
class Raw:
    """Any JSON value, kept as it is (results kept with the file)."""

    required: bool = False
    nullable: bool = False
    default: Any = MISSING


def _is_number(v: Any) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def _check_num(s: Num, v: Any, path: str, out: list) -> Any:
    if not _is_number(v) or not math.isfinite(v):
        out.append(Problem(path, v, s.describe()))
        return v
    if s.integer and not float(v).is_integer():
        out.append(Problem(path, v, s.describe()))
        return v
    below = v <= s.lo if s.lo_open else v < s.lo
    above = v >= s.hi if s.hi_open else v > s.hi
    if below or above:
        out.append(Problem(path, v, s.describe()))
    return int(v) if s.integer else float(v)


#: longest key name echoed in a field path, [characters]
_SHOWN_KEY_CHARS = 60


def _shown_key(key: str) -> str:
    """An unknown key as a field path shows it: as it is when a plain name, else quoted ("" or
    "a.b" stay visible as keys), cut to a readable length (a file may hold a megabyte key)."""
    if key.isidentifier() and len(key) <= _SHOWN_KEY_CHARS:
        return key
    if len(key) > _SHOWN_KEY_CHARS:
        return json.dumps(key[:_SHOWN_KEY_CHARS - 1])[:-1] + f'…" ({len(key)} characters)'
    return json.dumps(key)


_FIELD_SPECS: dict = {}  #: id of an object's fields -> (the fields, their keys, one entry per field)


def _field_spec(fields: dict) -> tuple:
    """What :func:`_check_fields` needs of each field, worked out once per schema: the key, its
    schema, whether it is a plain (not whole) number and its bounds, and what an absent key means
    (required, a default, or nothing)."""
    spec = _FIELD_SPECS.get(id(fields))
    if spec is not None and spec[0] is fields:
        return spec
    entries = []
    for key, sub in fields.items():
        num = isinstance(sub, Num) and not sub.integer
        required = getattr(sub, "required", False)
        default = getattr(sub, "default", MISSING)
        entries.append((key, sub, num, sub.lo if num else 0.0, sub.hi if num else 0.0,
                        num and sub.lo_open, num and sub.hi_open, required, default,
                        isinstance(default, (dict, list))))
    spec = (fields, frozenset(fields), tuple(entries))
    _FIELD_SPECS[id(fields)] = spec  # the fields kept alive with it, so that their id is never reused
    return spec


def _check_fields(fields: dict, v: dict, path: str, out: list, skip=()) -> dict:
    _, known, entries = _field_spec(fields)
    result = {}
    prefix = f"{path}." if path else ""
    if not known.issuperset(v):
        for key in v:
            if key not in fields and key not in skip:
                names = ", ".join(sorted(list(fields) + list(skip)))
                out.append(Problem(f"{prefix}{_shown_key(key)}", v[key], f"unknown key; known keys here: {names}"))
    for key, sub, num, lo, hi, lo_open, hi_open, required, default, container in entries:
        if key in v:
            value = v[key]
            # a plain finite float inside its bounds is its own normalised value (as _check_num)
            if num and type(value) is float and value - value == 0.0 and not (
                    (value <= lo if lo_open else value < lo) or (value >= hi if hi_open else value > hi)):
                result[key] = value
            else:
                result[key] = check(sub, value, f"{prefix}{key}", out)
        elif required:
            what = sub.describe() if hasattr(sub, "describe") else ""
            out.append(Problem(f"{prefix}{key}", None, "required key is missing" + (f"; {what}" if what else "")))
        elif default is not MISSING:
            result[key] = check(sub, default, f"{prefix}{key}", out) if container else default
    return result


def _check_changes(schema: Changes, value: Any, path: str, out: list) -> dict:
    from stagewright.core.errors import InputError
    from stagewright.core.project.paths import parse_path

    if not isinstance(value, dict):
        out.append(Problem(path, value, "expected an object of field paths and their values"))
        return {}
    if len(value) > schema.max_items:
        out.append(Problem(path, f"{len(value)} changes", f"expected at most {schema.max_items} changes"))
        return {}
    for key in value:
        try:
            first = parse_path(key)[0]
        except InputError:
            out.append(Problem(path, key, "expected a field path like stages[1].efficiency.value"))
            continue
        if first not in schema.roots:
            out.append(Problem(path, key, "a case may change only " + ", ".join(schema.roots)))
    return dict(value)


#: largest integer every float holds exactly (an int beyond it takes the general check)
_EXACT_INT = 2 ** 53
_FLAT_CHECKS: dict = {}  #: id of an item schema -> its flat check, or None (see _flat_item_check)


def _flat_item_check(schema: Any):
    """A quick check of one list item against an :class:`Obj` whose fields are all plain numbers
    (not whole numbers) or text — a month or a bin of a year, a row of a table — or None for any
    other schema. It returns the normalised item exactly as :func:`check` would when the item has
    no problem, and None otherwise (the caller then runs :func:`check` on that item, which says
    what is wrong). An 8760-bin year is checked about three times faster."""
    key = id(schema)
    if key in _FLAT_CHECKS:
        return _FLAT_CHECKS[key][1]
    spec = None
    if isinstance(schema, Obj) and not schema.one_of and all(
            (isinstance(s, Num) and not s.integer) or isinstance(s, Text) for s in schema.fields.values()):
        spec = tuple((k, isinstance(s, Num), s.lo if isinstance(s, Num) else 0.0, s.hi if isinstance(s, Num) else 0.0,
                      getattr(s, "lo_open", False), getattr(s, "hi_open", False), s.nullable, s.required, s.default,
                      getattr(s, "max_length", 0)) for k, s in schema.fields.items())
    fields = frozenset(schema.fields) if spec is not None else frozenset()

    def flat(item: Any) -> dict | None:
        if type(item) is not dict or not fields.issuperset(item):
            return None
        result = {}
        for k, num, lo, hi, lo_open, hi_open, nullable, required, default, max_length in spec:
            if k in item:
                v = item[k]
                if v is None:
                    if not nullable:
                        return None
                    result[k] = None
                elif num:
                    t = type(v)
                    if t is int:
                        if not -_EXACT_INT <= v <= _EXACT_INT:
                            return None
                    elif t is not float or v - v != 0.0:  # bools, subclasses, text; NaN and ±inf
                        return None
                    if (v <= lo if lo_open else v < lo) or (v >= hi if hi_open else v > hi):
                        return None
                    result[k] = float(v)
                else:
                    if type(v) is not str or len(v) > max_length:
                        return None
                    result[k] = v
            elif required or isinstance(default, (dict, list)):
                return None
            elif default is not MISSING:
                result[k] = default
        return result

    check_fn = flat if spec is not None else None
    _FLAT_CHECKS[key] = (schema, check_fn)  # the schema kept alive, so that its id is never reused
    return check_fn


def check(schema: Any, value: Any, path: str, out: list) -> Any:
    """Check ``value`` against ``schema``; append problems to ``out``; return normalised value."""
    if value is None and getattr(schema, "nullable", False):
        return None
    if isinstance(schema, Num):
        return _check_num(schema, value, path, out)
    if isinstance(schema, Choice):
        if value not in schema.options:
            out.append(Problem(path, value, schema.describe()))
        return value
    if isinstance(schema, Text):
        if not isinstance(value, str):
            out.append(Problem(path, value, "expected text"))
        elif len(value) > schema.max_length:
            out.append(Problem(path, value[:40] + "…", f"text longer than {schema.max_length} characters"))
        return value
    if isinstance(schema, Obj):
        if not isinstance(value, dict):
            out.append(Problem(path, value, "expected an object"))
            return {}
        result = _check_fields(schema.fields, value, path, out)
        for group in schema.one_of:  # after the keys' own problems (a missing required key first)
            present = [k for k in group if k in value and value[k] is not None]
            if len(present) != 1:
                # at the top level the problem names a key (the document itself has no field)
                where = path or (present[1] if len(present) > 1 else group[0])
                out.append(Problem(where, {k: value.get(k) for k in group},
                                   ("required: " if not present else "") + "give exactly one of " + ", ".join(group)))
        return result
    if isinstance(schema, Variant):
        if not isinstance(value, dict):
            out.append(Problem(path, value, "expected an object"))
            return {}
        tag = value.get(schema.tag)
        if not isinstance(tag, str) or tag not in schema.variants:  # a list or object tag is unhashable
            out.append(Problem(f"{path}.{schema.tag}", tag,
                               "expected one of " + ", ".join(repr(k) for k in schema.variants)))
            return dict(value)
        result = _check_fields(schema.variants[tag], value, path, out, skip=(schema.tag,))
        result[schema.tag] = tag
        return result
    if isinstance(schema, Changes):
        return _check_changes(schema, value, path, out)
    if isinstance(schema, Raw):
        return value
    if isinstance(schema, Items):
        if not isinstance(value, list):
            out.append(Problem(path, value, "expected a list"))
            return []
        if len(value) > schema.max_length:  # one message, not one per item of a list of millions
            out.append(Problem(path, f"{len(value)} item(s)",
                               f"expected {schema.min_length} to {schema.max_length} items; "
                               "the items were not checked"))
            return list(value)
        if len(value) < schema.min_length:
            out.append(Problem(path, f"{len(value)} item(s)",
                               f"expected {schema.min_length} to {schema.max_length} items"))
        fast = _flat_item_check(schema.item)
        if fast is None:
            return [check(schema.item, item, f"{path}[{i}]", out) for i, item in enumerate(value)]
        items = []
        for i, item in enumerate(value):
            good = fast(item)
            items.append(good if good is not None else check(schema.item, item, f"{path}[{i}]", out))
        return items
    raise TypeError(f"unknown schema node {schema!r}")  # programming error, not user input


def walk(schema: Any, path: str = ""):
    """Every key of a schema, parents before children, as ``(path, node)`` pairs.

    Paths read ``site.elevation_m``, ``stages[].cooler.approach_K``; a variant's keys
    carry the kind in braces, ``flow{mass}.value``, after the tag itself, ``flow.kind``.
    Used to document the schema and to generate test documents from it.
    """
    if path:
        yield path, schema
    prefix = f"{path}." if path else ""
    if isinstance(schema, Obj):
        for key, sub in schema.fields.items():
            yield from walk(sub, f"{prefix}{key}")
    elif isinstance(schema, Variant):
        yield f"{prefix}{schema.tag}", Choice(tuple(schema.variants), required=True)
        for kind, fields in schema.variants.items():
            for key, sub in fields.items():
                yield from walk(sub, f"{path}{{{kind}}}.{key}")
    elif isinstance(schema, Items):
        yield from walk(schema.item, f"{path}[]")
