"""Staging options: an N-stage train built from a project's stages."""
from __future__ import annotations

__all__ = ["MAX_STAGES", "staging_stages", "staging_note", "check_stage_count"]

import copy

from stagewright.core.errors import InputError

#: Most stages a comparison builds.
MAX_STAGES = 8


def check_stage_count(n, field: str = "max_stages") -> int:
    """``n`` as an int in 1 … MAX_STAGES, or an :class:`InputError` naming the range."""
    if isinstance(n, bool) or not isinstance(n, int) or not 1 <= n <= MAX_STAGES:
        raise InputError(field, n, f"expected a whole number of stages from 1 to {MAX_STAGES}")
    return n


def staging_stages(stages: list[dict], n: int) -> list[dict]:
    """Stage entries of the N-stage option of a project (normalised stage entries).

    Every stage is a copy of the project's first stage (efficiency, mechanical efficiency,
    casing heat loss, exit velocity, limits and its cooler as intercooler); the last one
    carries the project's last-stage cooler as aftercooler. Names are "stage 1" … "stage N";
    every ratio is left to the study.

    Examples
    --------
    >>> first = {"name": "LP", "cooler": {"outlet_temperature_K": 300.0}}
    >>> last = {"name": "HP", "cooler": None}
    >>> [(s["name"], s["cooler"]) for s in staging_stages([first, last], 2)]
    [('stage 1', {'outlet_temperature_K': 300.0}), ('stage 2', None)]
    """
    check_stage_count(n, "stages")
    out = []
    for k in range(n):
        st = copy.deepcopy(stages[0])
        st["name"] = f"stage {k + 1}"
        st["pressure_ratio"] = None
        if k == n - 1:
            st["cooler"] = copy.deepcopy(stages[-1]["cooler"])
        out.append(st)
    return out


def staging_note(stages: list[dict]) -> str:
    """The sentence every comparison shows: how its options were built."""
    first = stages[0].get("name") or "stage 1"
    after = ("the project's last-stage cooler is kept as the aftercooler"
             if stages[-1].get("cooler") else "there is no aftercooler (the project's last stage has none)")
    inter = "its intercooler" if stages[0].get("cooler") else "no intercooler (the first stage has none)"
    return (f"Each N-stage option repeats the project's first stage ({first}: efficiency, mechanical "
            f"efficiency, casing heat loss, exit velocity, limits and {inter}) N times; {after}. "
            "Every option is at its own optimum split.")
