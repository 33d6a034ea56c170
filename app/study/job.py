"""One staging-study job of the window: what to run, running it, and the plain-data answer.

Qt-free, so the window's worker thread (:mod:`stagewright.gui.study.worker`) only moves these around.
The answer is a list of *cases*: one for a plain comparison, one per value of the site
variable for a sensitivity run. Each case carries the comparison rows of
:meth:`stagewright.core.study.StagingComparison.rows` (SI, unit in each key).

:class:`TrialProgress` passes the study's progress on: the core reports the share of its options
finished (before each option and once all are done); the optimiser's work within one option cannot
be measured ahead, so between those reports it counts the option's trial solves, so that a long
option is seen to be moving rather than stuck.
"""
from __future__ import annotations

__all__ = ["StudyRequest", "run_request", "partial_answer", "TrialProgress"]

import copy
import threading
import time
from dataclasses import dataclass, field
from typing import Any, Callable


@dataclass(frozen=True)
class StudyRequest:
    """What the user asked for.

    Attributes
    ----------
    doc : dict
        A private copy of the project document.
    max_stages : int
        Most stages, 1 … 8.
    operating_hours_per_year : float
        [h]
    energy_price_per_kWh : float
        [currency/kWh]
    variable : str or None
        A key of :data:`stagewright.core.study.SITE_VARIABLES` for a sensitivity run.
    values : tuple of float
        Values of ``variable`` in its SI unit.
    processes : int
        Worker processes for a staging comparison's options (more than 1 only once the shared pool
        is warm: :mod:`stagewright.core.warm_pool`).
    """

    doc: dict
    max_stages: int
    operating_hours_per_year: float
    energy_price_per_kWh: float
    variable: str | None = None
    values: tuple = field(default_factory=tuple)
    processes: int = 1


def _first_efficiency(doc: dict) -> dict | None:
    """The efficiency the study gave the first stage when the project measures its discharge
    temperature (the isentropic efficiency that temperature implies); None otherwise."""
    stages = doc.get("stages") or []
    eff = stages[0].get("efficiency") if stages and isinstance(stages[0], dict) else None
    if not isinstance(eff, dict) or eff.get("kind") != "discharge_temperature":
        return None
    from stagewright.core.study.prepare import prepare
    return copy.deepcopy(prepare(doc).doc["stages"][0]["efficiency"])


def _case(value, comparison=None, rows=None, error=None) -> dict:
    if comparison is not None:
        rows = comparison.rows()
    return {"value": value, "rows": rows or [], "error": error}


def _answer(req: StudyRequest, cases: list[dict], complete: bool, message: str = "") -> dict:
    return {"variable": req.variable, "max_stages": req.max_stages, "cases": cases, "complete": complete,
            "message": message, "operating_hours_per_year": req.operating_hours_per_year,
            "energy_price_per_kWh": req.energy_price_per_kWh}


def run_request(req: StudyRequest, progress: Callable[[float, str], Any] | None = None,
                cancel: Any = None) -> dict:
    """Run the comparison (or the sensitivity run) of a request.

    Returns
    -------
    dict
        ``variable``, ``max_stages``, ``cases`` (each ``value``, ``rows``, ``error``),
        ``complete`` (True), ``message``, the economics, and ``first_efficiency`` (see
        :func:`_first_efficiency`).

    Raises
    ------
    stagewright.core.errors.StagewrightError
        Bad input (named field) or :class:`stagewright.core.study.StudyCancelled`.
    """
    from stagewright.core.study import compare_stagings, sensitivity

    kw = dict(operating_hours_per_year=req.operating_hours_per_year,
              energy_price_per_kWh=req.energy_price_per_kWh, progress=progress, cancel=cancel)
    if req.variable:
        study = sensitivity(req.doc, req.variable, list(req.values), req.max_stages, **kw)
        cases = [_case(p.value, p.comparison, error=p.error) for p in study.points]
    else:
        cases = [_case(None, compare_stagings(req.doc, max_stages=req.max_stages, processes=req.processes, **kw))]
    out = _answer(req, cases, True)
    out["first_efficiency"] = _first_efficiency(req.doc)
    return out


def partial_answer(req: StudyRequest, partial: list, message: str) -> dict:
    """The answer made of what a cancelled study had finished (``StudyCancelled.partial``)."""
    from stagewright.core.project.validation import normalise
    from stagewright.core.study import StagingComparison
    from stagewright.core.study.options import staging_note

    if req.variable:
        cases = [_case(p.value, p.comparison, error=p.error) for p in partial]
    elif partial:
        note = staging_note(normalise(req.doc)["stages"])
        comp = StagingComparison(list(partial), note, req.operating_hours_per_year, req.energy_price_per_kWh)
        cases = [_case(None, comp)]
    else:
        cases = []
    out = _answer(req, cases, False, message)
    out["first_efficiency"] = _first_efficiency(req.doc) if cases else None
    return out


class TrialProgress:
    """The study's progress reports, with the trial solves of the option being optimised counted.

    Hand :meth:`report` to the study as its ``progress`` and :attr:`cancel` as its ``cancel``: the
    study asks ``cancel.is_set()`` once as it starts an option (just after reporting it) and then
    before every trial solve (:class:`stagewright.core.study.trials.TrialSolver`); the asks after the first
    are counted. At most every ``interval`` seconds the last report is repeated, at the same
    fraction, with the count: ``optimising the 5-stage option (37 trial solves)``.

    Parameters
    ----------
    report : callable
        ``report(fraction, message)``: where the reports go.
    cancel : threading.Event
        The job's cancel flag.
    interval : float
        Least time between two counts, [s].
    clock : callable
        Monotonic clock, [s] (tests pass their own).

    Examples
    --------
    >>> import threading
    >>> seen, now = [], [0.0]
    >>> p = TrialProgress(lambda f, m: seen.append((f, m)), threading.Event(), 0.25, lambda: now[0])
    >>> p.report(0.25, "optimising the 3-stage option")
    >>> for t in (0.0, 0.1, 0.2, 0.3): now[0] = t; _ = p.cancel.is_set()
    >>> seen
    [(0.25, 'optimising the 3-stage option'), (0.25, 'optimising the 3-stage option (3 trial solves)')]
    """

    def __init__(self, report: Callable[[float, str], Any], cancel: threading.Event, interval: float = 0.25,
                 clock: Callable[[], float] = time.monotonic):
        self._report, self._interval, self._clock = report, interval, clock
        self._fraction, self._message, self._trials = 0.0, "", 0
        self._last = clock()
        self.cancel = _CountedEvent(cancel, self._on_check)

    def report(self, fraction: float, message: str) -> None:
        """A report of the study: passed on; the count starts again."""
        self._fraction, self._message, self._trials = fraction, message, -1  # the option's own ask is no solve
        self._last = self._clock()
        self._report(fraction, message)

    def _on_check(self) -> None:
        self._trials += 1
        now = self._clock()
        if self._message and self._trials > 0 and now - self._last >= self._interval:
            self._last = now
            s = "" if self._trials == 1 else "s"
            self._report(self._fraction, f"{self._message} ({self._trials} trial solve{s})")


class _CountedEvent:
    """A cancel event whose ``is_set`` also tells ``on_check`` that it was asked."""

    def __init__(self, event: threading.Event, on_check: Callable[[], None]):
        self._event, self._on_check = event, on_check

    def is_set(self) -> bool:
        self._on_check()
        return self._event.is_set()

    def wait(self, timeout: float | None = None) -> bool:
        return self._event.wait(timeout)

    def set(self) -> None:
        self._event.set()
