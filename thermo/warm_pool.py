"""One process pool kept warm for short jobs that are worth splitting (the staging comparison).

A pool started for one job pays for each worker's first use of the property library, scipy's
optimiser and the humid-air back end (about a second a worker); a job that takes half a second on
one core gains nothing from it. :func:`warm_pool` keeps one pool alive between jobs and
:func:`warm_up_pool` prepares its workers ahead (the window does it in the background when a
panel that uses it is first shown). Sweeps, long years and Monte Carlo draws start their own
pools: they last long enough for the start not to matter.
"""
from __future__ import annotations

__all__ = ["warm_pool", "warm_up_pool", "is_warm"]

import threading
from concurrent.futures import ProcessPoolExecutor

from stagewright.core.process_pool import pool_context

_lock = threading.Lock()
_pool: list = [None, 0]  # (executor, workers)
_warm: list = [0]  # workers prepared by warm_up_pool (0: none)


def warm_pool(workers: int) -> ProcessPoolExecutor:
    """The shared pool with ``workers`` processes (started on first call, replaced if broken or resized)."""
    with _lock:
        pool, size = _pool
        if pool is None or size != workers or getattr(pool, "_broken", False):
            if pool is not None:
                pool.shutdown(wait=False, cancel_futures=True)
            pool = ProcessPoolExecutor(max_workers=workers, mp_context=pool_context())
            _pool[:] = [pool, workers]
        return pool


def _prepare_worker(_: int) -> int:
    """Load what a study's first trial needs in this worker; its process id."""
    import os

    from scipy.optimize import minimize  # noqa: F401  (SLSQP of the optimal split)

    from stagewright.core.exchanger.coolant import warm_up
    warm_up()
    return os.getpid()


def warm_up_pool(workers: int) -> int:
    """Start the shared pool's workers and load their libraries; how many distinct workers answered.

    Examples
    --------
    >>> warm_up_pool(1)
    1
    """
    pool = warm_pool(workers)
    answered = len(set(pool.map(_prepare_worker, range(2 * workers))))
    _warm[0] = workers
    return answered


def is_warm() -> bool:
    """True once :func:`warm_up_pool` has prepared the shared pool (and it has not broken since)."""
    pool = _pool[0]
    return bool(_warm[0]) and pool is not None and not getattr(pool, "_broken", False)
