"""The multiprocessing context of every process pool in the core (sweeps, long years, Monte
Carlo draws): ``forkserver`` with the core preloaded where the platform has it (workers start
quickly and never inherit a GUI's threads), else ``spawn``."""
from __future__ import annotations

__all__ = ["pool_context"]

import multiprocessing


def pool_context():
    """A multiprocessing context for ``ProcessPoolExecutor(mp_context=…)``."""
    if "forkserver" in multiprocessing.get_all_start_methods():
        ctx = multiprocessing.get_context("forkserver")
        ctx.set_forkserver_preload(["stagewright.core"])
        return ctx
    return multiprocessing.get_context("spawn")
