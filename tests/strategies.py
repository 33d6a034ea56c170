"""Hypothesis strategies that build project documents from the schema itself.

Because they are derived from ``stagewright.core.project.schema.PROJECT``, a key added to the schema is
exercised by the round-trip and fuzz tests without touching this file.
"""
from __future__ import annotations

import math

from hypothesis import strategies as st

from stagewright.core.atmosphere import standard_pressure
from stagewright.core.project.validation import problems
from stagewright.core.project.schema import PROJECT
from stagewright.core.project.schema_types import Changes, Choice, Items, Num, Obj, Raw, Text, Variant


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
    elif isinstance(node, Changes):  # a case's changes: a field any project has, with a valid value
        s = st.fixed_dictionaries({}, optional={"title": st.text(max_size=20), "note": st.text(max_size=20)})
    elif isinstance(node, Raw):
        s = st.dictionaries(st.text(max_size=5), st.floats(allow_nan=False, allow_infinity=False), max_size=3)
    else:
        raise TypeError(node)
    return st.one_of(st.none(), s) if getattr(node, "nullable", False) else s


def _plausible_efficiency(eff: dict, t_guess: float) -> dict:
    if "value" in eff:
        return {**eff, "value": 0.5 + 0.5 * eff["value"]}
    return {**eff, "value_K": t_guess + 30.0 + 0.05 * (eff["value_K"] - 200.0)}


def _within_reach(doc: dict, ratio: float) -> dict:
    """The document made plausible: a discharge pressure its stages can reach (the site
    pressure times ``ratio`` per stage, within the schema's range), isentropic or
    polytropic efficiencies of 0.5 or more, and measured discharge temperatures near what
    such a stage would reach; stage ratios are left to the split. Without this most drawn pressures lie beyond
    what any ratio up to 40 per stage delivers, most efficiencies heat the air past the
    property range, and the solve itself is rarely reached."""
    site = doc.get("site", {})
    p_site = site.get("barometric_pressure_Pa") or standard_pressure(site.get("elevation_m") or 0.0)
    node = PROJECT.fields["discharge_pressure_Pa"]
    p_out = min(max(p_site * ratio ** len(doc["stages"]), node.lo), node.hi)
    t0 = site.get("ambient_temperature_K", 293.15)
    t_guess = t0 + t0 * (ratio ** 0.2857 - 1.0) / 0.8  # an 80 % stage from the ambient, dry ideal gas
    stages = [{**s, "efficiency": _plausible_efficiency(s["efficiency"], t_guess), "pressure_ratio": None}
              for s in doc["stages"]]
    return {**doc, "discharge_pressure_Pa": p_out, "stages": stages}


def documents():
    """Valid project documents of the current version, cross-key rules included.

    Three in four have a discharge pressure their stages can reach (so the solve itself is
    exercised); the rest keep the schema's whole pressure range (so refusals are too)."""
    reachable = st.tuples(strategy(PROJECT), st.floats(1.3, 4.0)).map(lambda t: _within_reach(*t))
    return st.one_of(reachable, reachable, reachable, strategy(PROJECT)).filter(lambda d: not problems(d))
