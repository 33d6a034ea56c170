"""Results kept with the project file, and what changed when they are computed again.

A snapshot holds each case's results as last saved with the versions of Stagewright and
CoolProp that computed them. On opening, the window shows the snapshot at once, solves again
in the background and reports every figure that moved by more than a relative tolerance
(default 1e-6) — with the likely reason when the versions differ.
"""
from __future__ import annotations

__all__ = ["SnapshotChange", "take_snapshot", "compare_snapshot", "versions", "change_summary", "TOLERANCE"]

import math
from dataclasses import dataclass
from datetime import datetime, timezone
from typing import Any, Mapping

#: relative change below which a recomputed figure counts as unchanged
TOLERANCE = 1e-6


def versions() -> dict[str, str]:
    """This installation's versions: ``{"stagewright_version": …, "coolprop_version": …}``."""
    from stagewright.core import __version__
    from stagewright.core.coolprop_adapter import coolprop_version
    return {"stagewright_version": __version__, "coolprop_version": str(coolprop_version())}


def take_snapshot(results: Mapping[str, dict], saved_utc: str | None = None) -> dict:
    """A snapshot of ``results`` (case name → ``TrainResult.to_dict()``) for the project file.

    Examples
    --------
    >>> snap = take_snapshot({"Base": {"driver_power_W": 1.0}}, saved_utc="2026-01-01T00:00:00Z")
    >>> sorted(snap), snap["results"]
    (['coolprop_version', 'results', 'saved_utc', 'stagewright_version'], {'Base': {'driver_power_W': 1.0}})
    """
    stamp = saved_utc or datetime.now(timezone.utc).strftime("%Y-%m-%dT%H:%M:%SZ")
    return {**versions(), "saved_utc": stamp, "results": {name: r for name, r in results.items()}}


@dataclass(frozen=True)
class SnapshotChange:
    """One figure of one case that is not what the snapshot says: ``old`` or ``new`` is None
    when the figure (or the whole case) is only on one side."""

    case: str
    path: str
    old: Any
    new: Any

    @property
    def relative(self) -> float:
        """|new − old| / max(|old|, |new|) for numbers; 1 for anything else that differs."""
        if _number(self.old) and _number(self.new):
            scale = max(abs(self.old), abs(self.new))
            return abs(self.new - self.old) / scale if scale else 0.0
        return 1.0


def _number(x: Any) -> bool:
    return isinstance(x, (int, float)) and not isinstance(x, bool) and math.isfinite(x)


def _walk(old: Any, new: Any, case: str, path: str, tol: float, out: list) -> None:
    if isinstance(old, dict) and isinstance(new, dict):
        for key in dict.fromkeys([*old, *new]):
            _walk(old.get(key), new.get(key), case, f"{path}.{key}" if path else str(key), tol, out)
    elif isinstance(old, list) and isinstance(new, list) and len(old) == len(new):
        for i, (a, b) in enumerate(zip(old, new)):
            _walk(a, b, case, f"{path}[{i}]", tol, out)
    elif _number(old) and _number(new):
        scale = max(abs(old), abs(new))
        if scale and abs(new - old) > tol * scale:
            out.append(SnapshotChange(case, path, old, new))
    elif old != new:
        out.append(SnapshotChange(case, path, old, new))


def compare_snapshot(snapshot: Mapping, fresh: Mapping[str, dict], tolerance: float = TOLERANCE
                     ) -> list[SnapshotChange]:
    """Every figure of ``fresh`` results (case name → result dict) that differs from the
    snapshot's by more than ``tolerance`` relative (numbers) or at all (text, flags).

    Examples
    --------
    >>> snap = {"results": {"Base": {"driver_power_W": 100.0, "stages": [{"pressure_ratio": 3.0}]}}}
    >>> compare_snapshot(snap, {"Base": {"driver_power_W": 100.00001, "stages": [{"pressure_ratio": 3.1}]}})
    [SnapshotChange(case='Base', path='stages[0].pressure_ratio', old=3.0, new=3.1)]
    """
    old_results = snapshot.get("results") or {}
    out: list[SnapshotChange] = []
    for case in dict.fromkeys([*old_results, *fresh]):
        if case not in fresh or case not in old_results:
            out.append(SnapshotChange(case, "", old_results.get(case) is not None or None,
                                      fresh.get(case) is not None or None))
            continue
        _walk(old_results[case], fresh[case], case, "", tolerance, out)
    return out


def change_summary(snapshot: Mapping, changes: list[SnapshotChange], tolerance: float = TOLERANCE) -> str:
    """One plain sentence (or two) on how the recomputed results compare with the snapshot."""
    now = versions()
    then = {k: snapshot.get(k, "?") for k in now}
    if not changes:
        return (f"Solved again: every figure is within {tolerance:g} (relative) of the results saved with the "
                f"file.")
    cases = sorted({c.case for c in changes})
    largest = max(changes, key=lambda c: c.relative)
    text = (f"Solved again: {len(changes)} figure{'s' if len(changes) != 1 else ''} in "
            f"{', '.join(cases)} moved by more than {tolerance:g} (largest: {largest.path or 'the case'} in "
            f"{largest.case}, {largest.relative:.2g} relative).")
    if then != now:
        text += (f" The file was saved with Stagewright {then['stagewright_version']} and CoolProp "
                 f"{then['coolprop_version']}; this is Stagewright {now['stagewright_version']} with CoolProp "
                 f"{now['coolprop_version']}, which explains changes of property values.")
    else:
        text += " The versions are the same as when the file was saved: the inputs or the saved results changed."
    return text
