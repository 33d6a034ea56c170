"""Edits of a project's year at the site, checked before they are made. Qt-free.

The year editor turns each user action into a list of ``(path, value)`` pairs for
:meth:`stagewright.gui.window.editor.Editor.set_values` (one undo step). :func:`refusal` applies the pairs
to a copy of the document and runs :func:`stagewright.core.project.validation.problems` on it: an edit that
would add a problem is refused with the field path, the value and the schema's range
(:meth:`stagewright.core.project.schema_types.Num.describe`), so the year section always stays valid.
"""
from __future__ import annotations

__all__ = ["ENTRY_COLUMNS", "EntryColumn", "entries_key", "start_from_site", "entries_path",
           "with_entry_added", "with_entry_removed", "profile_as", "cell_pairs", "refusal",
           "month_hours", "undo_text"]

import copy
import re
from dataclasses import dataclass
from typing import Any

from stagewright.core.errors import Problem
from stagewright.core.project.schema import YEAR
from stagewright.core.project.schema_types import check
from stagewright.core.project.validation import normalise, problems
from stagewright.core.year_profile import DAYS_IN_MONTH, MONTH_NAMES, operating_bins, year_problems

from stagewright.gui.presentation import units
from stagewright.gui.document.paths import ABSENT, get_in, parse_path, set_in
from stagewright.gui.document.field_specs import describe, range_text


@dataclass(frozen=True)
class EntryColumn:
    """One editable column of the profile table."""

    key: str  #: key of a month or bin entry
    header: str
    quantity: str | None  #: display quantity (None: text)
    tip: str


ENTRY_COLUMNS = (
    EntryColumn("label", "Bin", None, "Name of the bin (shown in the results and the chart)."),
    EntryColumn("temperature_K", "T", "temperature", "Mean ambient temperature of the month or bin."),
    EntryColumn("relative_humidity", "RH", "fraction", "Mean relative humidity of the intake air."),
    EntryColumn("hours", "Hours", "hours",
                "Operating hours. Monthly: leave every month empty to spread the operating hours "
                "per year by the days of each month."),
    EntryColumn("load", "Load", "fraction", "Share of the project's flow; empty: the year's load."),
    EntryColumn("coolant_inlet_temperature_K", "Coolant in", "temperature",
                "Water or glycol coolant inlet temperature; empty: each cooler's own. "
                "Air-cooled coolers always take the ambient temperature."),
)


#: a path inside one entry: ``year.profile.bins[12].hours`` (groups: the list, the index)
_ENTRY_FIELD = re.compile(r"^year\.profile\.(months|bins)\[(\d+)\]\.\w+$")
#: one of the year's own fields: ``year.load``, ``year.coolers.mode``
_OWN_FIELD = re.compile(r"^year\.(?!profile\b)\w+(?:\.\w+)?$")


def entries_key(kind: str) -> str:
    """``"months"`` or ``"bins"``: the list of entries of a profile kind."""
    return "months" if kind == "monthly" else "bins"


def entries_path(doc: dict) -> str:
    """Path of the profile's entry list, e.g. ``"year.profile.months"``."""
    return "year.profile." + entries_key(get_in(doc, "year.profile.kind", "monthly"))


def start_from_site(doc: dict) -> dict:
    """A monthly year whose 12 months all hold the site's ambient temperature and humidity.

    Placeholders for the user to replace with the site's own monthly data; hours are left
    to the default spread (8760 h by the days of each month).
    """
    site = doc.get("site") or {}
    t = site.get("ambient_temperature_K")
    t = float(t) if isinstance(t, (int, float)) and not isinstance(t, bool) else 288.15
    rh = site.get("relative_humidity")
    rh = float(rh) if isinstance(rh, (int, float)) and not isinstance(rh, bool) else 0.0
    return {"profile": {"kind": "monthly",
                        "months": [{"temperature_K": t, "relative_humidity": rh} for _ in MONTH_NAMES]}}


def month_hours(doc: dict) -> list[float] | None:
    """Hours each entry runs as the year is solved (monthly spread included); None if invalid."""
    try:
        return [b.hours for b in operating_bins(normalise(doc)["year"])]
    except Exception:  # the year is invalid: nothing to show
        return None


def with_entry_added(doc: dict, after: int | None) -> list[tuple[str, Any]]:
    """Pairs that add a bin after index ``after`` (copying it; ``None``: at the end)."""
    path = entries_path(doc)
    entries = copy.deepcopy(get_in(doc, path, []))
    index = len(entries) - 1 if after is None or after >= len(entries) else after
    new = copy.deepcopy(entries[index]) if entries else {"temperature_K": 288.15, "relative_humidity": 0.6,
                                                         "hours": 100.0}
    new.pop("label", None)
    entries.insert(index + 1, new)
    return [(path, entries)]


def with_entry_removed(doc: dict, index: int) -> list[tuple[str, Any]]:
    path = entries_path(doc)
    entries = copy.deepcopy(get_in(doc, path, []))
    del entries[index]
    return [(path, entries)]


def profile_as(doc: dict, kind: str) -> list[tuple[str, Any]]:
    """Pairs that restate the profile as ``kind``.

    Monthly → bins keeps the year as it is solved: each month becomes a bin named after it
    with the hours it runs (months with no hours are left out), and operating hours per
    year are dropped when the months gave their own hours (bins would be rescaled to them).
    Bins → monthly maps 12 bins in order to January…December with their hours; other
    counts are refused by :func:`refusal` (the core's rule of 12 months).
    """
    prof = get_in(doc, "year.profile", {})
    if prof.get("kind") == kind:
        return []
    old = prof.get(entries_key(prof.get("kind", "monthly")), [])
    pairs: list[tuple[str, Any]] = []
    if kind == "bins":
        hours = month_hours(doc) or [24.0 * d for d in DAYS_IN_MONTH]
        bins = []
        for i, (m, h) in enumerate(zip(old, hours)):
            if h > 0:
                b = {"label": MONTH_NAMES[i], **{k: v for k, v in m.items() if k != "hours"}, "hours": h}
                bins.append(b)
        pairs.append(("year.profile", {"kind": "bins", "bins": bins}))
        if any(m.get("hours") is not None for m in old) and get_in(doc, "year.operating_hours_per_year") \
                not in (ABSENT, None):
            pairs.append(("year.operating_hours_per_year", ABSENT))
    else:
        months = [{k: v for k, v in b.items() if k != "label"} for b in old]
        pairs.append(("year.profile", {"kind": "monthly", "months": months}))
    return pairs


def cell_pairs(doc: dict, index: int, key: str, value: Any) -> list[tuple[str, Any]]:
    """Pairs for one cell; a monthly hours value typed while no month has hours fills the
    other months with the hours they run now, so that the rest of the year stays as it was."""
    path = f"{entries_path(doc)}[{index}].{key}"
    pairs = [(path, value)]
    if key == "hours" and value is not ABSENT and get_in(doc, "year.profile.kind") == "monthly":
        months = get_in(doc, "year.profile.months", [])
        if all(m.get("hours") is None for m in months):
            now = month_hours(doc)
            if now is not None:
                pairs = [(f"year.profile.months[{i}].hours", value if i == index else round(h, 6))
                         for i, h in enumerate(now)]
    return pairs


def undo_text(path: str, doc: dict) -> str:
    """``"Change March temperature"``, ``"Change bin 3 hours"``, ``"Change year load"``."""
    name = describe(path, doc)
    return "Change " + (name if name.split(" ")[0] in MONTH_NAMES else name[:1].lower() + name[1:])


def _apply(doc: dict, pairs: list[tuple[str, Any]]) -> dict:
    """``doc`` with the pairs set, ``doc`` itself untouched: the containers along each path are
    copied (shallow), everything else is shared — never a deep copy of an 8760-bin year."""
    cand = dict(doc)
    for p, v in pairs:
        tokens = parse_path(p)
        node = cand
        for t in tokens[:-1]:
            try:
                child = node[t]
            except (KeyError, IndexError, TypeError):
                child = ABSENT
            if isinstance(child, dict):
                child = dict(child)
            elif isinstance(child, list):
                child = list(child)
            else:  # set_in makes the missing containers
                break
            node[t] = child
            node = child
        set_in(cand, p, v)  # shared, not copied: the candidate is only read
    return cand


def _entry_schema(kind: str):
    """Schema of one month or bin (:data:`stagewright.core.project.schema.YEAR`)."""
    return YEAR.fields["profile"].variants[kind][entries_key(kind)].item


def _year_problems(doc: dict, rows: set, kind: str, own_fields: bool) -> list[Problem]:
    """Problems of entries ``rows`` of the profile, of the year's own fields (``own_fields``: its
    load, prices, cooler choices, checked with the profile cut to one entry) and of the year's rules
    (:func:`stagewright.core.year_profile.year_problems`, which read every entry's hours)."""
    key = entries_key(kind)
    year = doc["year"]
    entries = year["profile"][key]
    out: list[Problem] = []
    for i in sorted(rows):
        check(_entry_schema(kind), entries[i], f"year.profile.{key}[{i}]", out)
    if own_fields:
        check(YEAR, {**year, "profile": {**year["profile"], key: entries[:1]}}, "year", out)
    if not out:
        out.extend(year_problems({"year": {"profile": {"kind": kind, key: entries},
                                           "operating_hours_per_year": year.get("operating_hours_per_year")}}))
    return out


def _new_year_problems(doc: dict, cand: dict, pairs: list) -> list[Problem] | None:
    """New problems of an edit inside the year — cells of entries, the year's own fields — checked
    on what it touches and the year's rules only (a cell of an 8760-bin year checks one bin, not
    8760); None for any other edit (the profile's kind or length, the whole year, the rest of the
    project): then the whole document is checked."""
    kind = get_in(doc, "year.profile.kind")
    if kind not in ("monthly", "bins") or get_in(cand, "year.profile.kind") != kind:
        return None
    key = entries_key(kind)
    rows, own_fields = set(), False
    for p, _v in pairs:
        m = _ENTRY_FIELD.match(p)
        if m is not None and m.group(1) == key:
            rows.add(int(m.group(2)))
        elif _OWN_FIELD.match(p):
            own_fields = True
        else:
            return None
    entries = get_in(doc, f"year.profile.{key}")
    if not isinstance(entries, list) or not entries or not all(isinstance(e, dict) for e in entries) \
            or any(i >= len(entries) for i in rows) or len(get_in(cand, f"year.profile.{key}")) != len(entries):
        return None
    try:
        before = {(p.field, p.expected) for p in _year_problems(doc, rows, kind, own_fields)}
        return [p for p in _year_problems(cand, rows, kind, own_fields) if (p.field, p.expected) not in before]
    except (KeyError, TypeError, AttributeError):  # e.g. a bin without its hours: the whole check says what
        return None


def refusal(doc: dict, pairs: list[tuple[str, Any]], system: str = "SI") -> str | None:
    """Why the edit must not be made (a new problem of the year), or None when it is fine.

    The message names the field, the value (display unit and SI) and the allowed range. An edit
    of cells or of the year's own fields checks what it touches and the year's rules
    (:func:`_new_year_problems`); any other edit, the whole document before and after.
    """
    cand = _apply(doc, pairs)
    new = _new_year_problems(doc, cand, pairs)
    if new is None:
        after = problems(cand)
        before = {(p.field, p.expected) for p in problems(doc)} if after else set()
        new = [p for p in after if (p.field, p.expected) not in before]
    if not new:
        return None
    p = new[0]
    name = describe(p.field, cand)
    rng = range_text(p.field, cand, system)
    value = p.value
    if isinstance(value, (int, float)) and not isinstance(value, bool) and rng:
        from stagewright.gui.document.field_specs import quantity_for
        q = quantity_for(p.field, cand) or "ratio"
        shown = units.format_value(float(value), q, system, with_unit=True)
        return (f"Not changed: {name} {shown} is out of range (allowed: {rng}). "
                f"[{p.field} = {value:g}; {p.expected}]")
    found = "" if value is None else f" (found {value!r})"
    return f"Not changed: {name}: {p.expected}{found}. [{p.field}]"
