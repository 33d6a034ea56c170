r"""Monte Carlo propagation of the measurement uncertainties through the solve (JCGM 101:2008).

Each input is drawn from the distribution its stated uncertainty assigns it — Gaussian
:math:`N(x, u^2)` for a standard uncertainty (JCGM 101:2008 §6.4.7), rectangular
:math:`R(x - a, x + a)` for limits or an accuracy class (§6.4.2) — independently, with a
seeded generator so a run can be repeated. Every draw is one solve of the measurement model.
From the :math:`M` results of each figure come its mean (§7.6, the estimate), its standard
deviation (the standard uncertainty) and the probabilistically symmetric coverage interval
between the :math:`(1-p)/2` and :math:`(1+p)/2` quantiles (§7.7). The coverage probability is
:math:`p = 0.9545`, the probability of :math:`\pm 2` standard deviations of a Gaussian, so the
interval compares directly with :math:`y \pm U` of the first-order propagation at :math:`k = 2`
(the comparison of JCGM 101:2008 §8).

A draw that lands outside an input's valid range, or whose solve fails, is not counted; the
number of such draws is reported.
"""
from __future__ import annotations

__all__ = ["MonteCarloResult", "MonteCarloCancelled", "draw_inputs", "propagate_monte_carlo",
           "COVERAGE_PROBABILITY"]

import math
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass

import numpy as np

from stagewright.core.errors import StagewrightError
from stagewright.core.process_pool import pool_context

COVERAGE_PROBABILITY = math.erf(2.0 / math.sqrt(2.0))  #: 0.9545: ±2 σ of a Gaussian
_CHUNK = 250


class MonteCarloCancelled(StagewrightError):
    """The Monte Carlo run was cancelled; ``done`` draws of ``draws`` were solved."""

    def __init__(self, done: int, draws: int) -> None:
        super().__init__(f"Monte Carlo cancelled after {done} of {draws} draws")
        self.done, self.draws = done, draws


@dataclass
class MonteCarloResult:
    """Summary of a Monte Carlo run, arrays over the figures (SI)."""

    draws: int  #: draws asked for
    solved: int  #: draws whose solve succeeded
    failed: int  #: draws outside an input's range or whose solve failed
    first_failure: str  #: the message of the first failed draw ("" if none)
    mean: np.ndarray
    standard_uncertainty: np.ndarray  #: standard deviation of the draws' results
    low: np.ndarray  #: lower end of the coverage interval
    high: np.ndarray  #: upper end
    coverage_probability: float
    seed: int

    def standard_error_of_u(self) -> np.ndarray:
        """Statistical standard error of ``standard_uncertainty`` from the number of draws,
        :math:`s/\\sqrt{2(M-1)}` (normal-theory approximation)."""
        return self.standard_uncertainty / math.sqrt(2.0 * max(self.solved - 1, 1))


def draw_inputs(inputs, draws: int, seed: int) -> np.ndarray:
    """``draws`` × inputs array of input values drawn from their distributions (see module notes)."""
    rng = np.random.default_rng(seed)
    out = np.empty((draws, len(inputs)))
    for i, inp in enumerate(inputs):
        if inp.distribution == "rectangular":
            out[:, i] = inp.value + rng.uniform(-inp.half_width, inp.half_width, draws)
        else:
            out[:, i] = inp.value + inp.standard_uncertainty * rng.standard_normal(draws)
    return out


def _solve_chunk(model, xs: np.ndarray) -> tuple[np.ndarray, list]:
    ys = np.full((len(xs), len(model.figures)), np.nan)
    failures = []
    for j, x in enumerate(xs):
        try:
            ys[j] = model(x)
        except StagewrightError as exc:
            failures.append(str(exc))
    return ys, failures



def propagate_monte_carlo(model, draws: int, seed: int, *, processes: int = 1, progress=None,
                          cancel=None) -> MonteCarloResult:
    """Propagate the inputs' distributions through ``model`` with ``draws`` draws.

    Parameters
    ----------
    model : MeasurementModel
        :math:`y = f(x)` with its ``inputs`` (their distributions) and ``figures``.
    draws : int
        Number of draws :math:`M`.
    seed : int
        Seed of the random generator (the same seed gives the same draws).
    processes : int
        Worker processes (1: in this thread).
    progress : callable, optional
        ``progress(done, draws)`` after every chunk of draws.
    cancel : callable or threading.Event, optional
        Checked between chunks; when set, :class:`MonteCarloCancelled` is raised.

    Returns
    -------
    MonteCarloResult

    Raises
    ------
    MonteCarloCancelled
        When cancelled.
    """
    xs = draw_inputs(model.inputs, draws, seed)
    is_cancelled = (cancel.is_set if hasattr(cancel, "is_set") else cancel) or (lambda: False)
    chunks = [xs[i:i + _CHUNK] for i in range(0, draws, _CHUNK)]
    parts, failures, done = [], [], 0

    def collect(part):
        nonlocal done
        parts.append(part[0])
        failures.extend(part[1])
        done += len(part[0])
        if progress:
            progress(done, draws)

    if processes <= 1:
        for ch in chunks:
            if is_cancelled():
                raise MonteCarloCancelled(done, draws)
            collect(_solve_chunk(model, ch))
    else:
        with ProcessPoolExecutor(max_workers=processes, mp_context=pool_context()) as pool:
            futures = [pool.submit(_solve_chunk, model, ch) for ch in chunks]
            for fut in futures:
                if is_cancelled():
                    for f in futures:
                        f.cancel()
                    raise MonteCarloCancelled(done, draws)
                collect(fut.result())
    return _summarise(np.vstack(parts), draws, failures, seed)


def _summarise(ys: np.ndarray, draws: int, failures: list, seed: int) -> MonteCarloResult:
    ok = ys[np.all(np.isfinite(ys), axis=1)]
    p = COVERAGE_PROBABILITY
    if len(ok) < 2:
        nan = np.full(ys.shape[1], np.nan)
        return MonteCarloResult(draws, len(ok), draws - len(ok), failures[0] if failures else "",
                                nan, nan, nan, nan, p, seed)
    low, high = np.quantile(ok, [(1.0 - p) / 2.0, (1.0 + p) / 2.0], axis=0)
    return MonteCarloResult(draws, len(ok), draws - len(ok), failures[0] if failures else "",
                            ok.mean(axis=0), ok.std(axis=0, ddof=1), low, high, p, seed)
