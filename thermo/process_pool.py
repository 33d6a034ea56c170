"""The multiprocessing context of every process pool in the core (sweeps, long years, Monte
Carlo draws): ``forkserver`` with the core preloaded where the platform has it (workers start
quickly and never inherit a GUI's threads), else ``spawn``.

The preload includes the solve and its property libraries (:data:`PRELOAD`): importing CoolProp
takes 0.5–2 s, and with only the package preloaded every worker of every pool imported it again
(a year of 8760 hours spent 2–3 s of its wall time there). The forkserver imports them once, the
first time a pool starts; its workers are forked with them loaded."""
from __future__ import annotations

__all__ = ["pool_context", "PRELOAD"]

import multiprocessing


#: modules the forkserver imports once for all its workers (the solve, years, and so CoolProp; scipy's
#: root finders, which a rating's fallback imports on first use: 0.6 s in each worker otherwise)
PRELOAD = ["stagewright.core", "stagewright.core.solve", "stagewright.core.year", "scipy.optimize"]


def pool_context():
    """A multiprocessing context for ``ProcessPoolExecutor(mp_context=…)``."""
    if "forkserver" in multiprocessing.get_all_start_methods():
        ctx = multiprocessing.get_context("forkserver")
        ctx.set_forkserver_preload(PRELOAD)
        return ctx
    return multiprocessing.get_context("spawn")
