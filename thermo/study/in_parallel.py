"""The options of a staging comparison optimised in worker processes, largest first.

Each stage count is an independent optimisation (:func:`~stagewright.core.study.optimal_split.split_prepared`),
so the options of :func:`~stagewright.core.study.compare.compare_stagings` can run side by side: a
worker solves exactly what the calling process would, so the results are the same, bit for bit
(a test compares them). The options are handed out most stages first (the cost of an option grows
with its stage count), so the longest one starts at once and the short ones fill the other worker.
"""
from __future__ import annotations

__all__ = ["options_in_pool", "useful_processes"]

import os
from dataclasses import replace
from concurrent.futures import FIRST_COMPLETED, wait
from typing import Callable

from stagewright.core.study.optimal_split import SplitResult, solve_at, split_prepared
from stagewright.core.study.options import staging_stages
from stagewright.core.study.prepare import Prepared
from stagewright.core.study.progress import ProgressSpan, StudyCancelled
from stagewright.core.warm_pool import warm_pool

_POLL_S = 0.05  # how often a waiting comparison looks at its cancel flag, [s]


def useful_processes(processes: int | None, options: int) -> int:
    """Worker processes for ``options`` options: ``processes`` (None: every core), at most one an option."""
    wanted = (os.cpu_count() or 1) if processes is None else int(processes)
    return max(1, min(wanted, options))


def _one_option(prepared: Prepared, project_stages: list, n: int) -> SplitResult:
    """The ``n``-stage option at its optimum split, without its full solve (run in a worker: a
    solve's result holds property objects that do not cross processes; the caller solves again
    at the split's ratios, which gives the same result)."""
    split = split_prepared(prepared.with_stages(staging_stages(project_stages, n)), strict=False)
    return replace(split, result=None)


def _with_result(prepared: Prepared, project_stages: list, n: int, split: SplitResult) -> SplitResult:
    """``split`` with its full solve made here (None where it had none: no split could be formed)."""
    if split.pressure_ratios is None:
        return split
    doc = prepared.with_stages(staging_stages(project_stages, n)).doc
    return replace(split, result=solve_at(doc, split.pressure_ratios))


def options_in_pool(prepared: Prepared, project_stages: list, counts: list[int], processes: int,
                    span: ProgressSpan, should_stop: Callable[[], bool]) -> dict[int, SplitResult]:
    """Optimise the options of ``counts`` stages in ``processes`` workers; {stage count: split}.

    Raises
    ------
    StudyCancelled
        When ``should_stop()`` turns true while options are running; ``partial`` holds the
        finished ones as (stage count, split), fewest stages first; the workers stop after the
        option in hand.
    """
    weights = {n: n + 1.0 for n in counts}
    total, done = sum(weights.values()), 0.0
    span.report(0.0, f"optimising {len(counts)} options in {processes} processes")
    finished: dict[int, SplitResult] = {}
    pool = warm_pool(processes)
    running = {pool.submit(_one_option, prepared, project_stages, n): n for n in sorted(counts, reverse=True)}
    try:
        while running:
            if should_stop():
                raise StudyCancelled(partial=sorted(finished.items()))
            ready, _ = wait(running, timeout=_POLL_S, return_when=FIRST_COMPLETED)
            for fut in ready:
                n = running.pop(fut)
                finished[n] = _with_result(prepared, project_stages, n, fut.result())
                done += weights[n]
                span.report(done / total, f"optimised the {n}-stage option")
    finally:
        for fut in running:  # cancelled or failed: options not yet started are dropped
            fut.cancel()
    return finished
