"""Hypothesis strategies that build project documents from the schema itself.

Because they are derived from ``thermo.project.schema.PROJECT``, a key added to the schema is
exercised by the round-trip and fuzz tests without touching this file.
"""
from __future__ import annotations

import math

from hypothesis import strategies as st

from thermo.project.validation import problems
from thermo.project.schema import PROJECT
from thermo.project.schema_types import Choice, Items, Num, Obj, Text, Variant


def _num(node: Num):
    if node.integer:
        lo = math.ceil(node.lo) + (1 if node.lo_open and float(node.lo).is_integer() else 0)
        hi = math.floor(node.hi) - (1 if node.hi_open and float(node.hi).is_integer() else 0)
        return st.integers(lo, hi)
    return st.floats(node.lo, node.hi, exclude_min=node.lo_open, exclude_max=node.hi_open,
                     allow_nan=False, allow_infinity=False)


def _fields(fields: dict, one_of=()):
    required = {k: strategy(v) for k, v in fields.items() if getattr(v, "required", False)}
    optional = {k: strategy(v) for k, v in fields.items() if not getattr(v, "required", False)}
    base = st.fixed_dictionaries(required, optional=optional)
    for group in one_of:
        base = st.tuples(base, st.sampled_from(group), *(strategy(fields[k]).filter(lambda x: x is not None)
                                                          for k in group)).map(
            lambda t, group=group: _pick(t[0], group, t[1], dict(zip(group, t[2:]))))
    return base


def _pick(d: dict, group, chosen, values) -> dict:
    d = {k: v for k, v in d.items() if k not in group}
    d[chosen] = values[chosen]
    return d


def strategy(node):
    """A strategy for values that pass ``node`` alone (cross-key rules are not applied)."""
    if isinstance(node, Num):
        s = _num(node)
    elif isinstance(node, Choice):
        s = st.sampled_from(node.options)
    elif isinstance(node, Text):
        s = st.text(max_size=min(node.max_length, 40))
    elif isinstance(node, Obj):
        s = _fields(node.fields, node.one_of)
    elif isinstance(node, Variant):
        s = st.one_of([_fields(fields).map(lambda d, kind=kind, tag=node.tag: {tag: kind, **d})
                       for kind, fields in node.variants.items()])
    elif isinstance(node, Items):
        s = st.lists(strategy(node.item), min_size=node.min_length, max_size=min(node.max_length, 4))
    else:
        raise TypeError(node)
    return st.one_of(st.none(), s) if getattr(node, "nullable", False) else s


def documents():
    """Valid project documents of the current version, cross-key rules included."""
    return strategy(PROJECT).filter(lambda d: not problems(d))
