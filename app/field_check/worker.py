"""Run a field check's uncertainty off the GUI thread, with progress, cancel and stale answers dropped.

A :class:`~stagewright.gui.jobs.job_runner.JobRunner`. The job propagates to first order (a few dozen solves)
and then draws the Monte Carlo check; cancel stops the draws at the next chunk and the job
still *finishes*, with the first-order result and a note saying the Monte Carlo run was
cancelled (cancelled before the first order is done, it answers ``cancelled``).
"""
from __future__ import annotations

__all__ = ["FieldCheckRunner"]

import threading
from typing import Callable

from PySide6.QtCore import Signal

from stagewright.gui.jobs.job_runner import JobCancelled, JobRunner


def _field_check(payload: tuple, report: Callable[[float, str], None], cancel: threading.Event) -> dict:
    from stagewright.core.uncertainty.field_check import field_check_uncertainty
    from stagewright.core.uncertainty.monte_carlo import MonteCarloCancelled
    doc, draws = payload
    try:
        return field_check_uncertainty(doc, draws=draws, progress=report, cancel=cancel).to_dict()
    except MonteCarloCancelled as exc:  # before the first-order result was ready
        raise JobCancelled(None, "field check cancelled") from exc


class FieldCheckRunner(JobRunner):
    """Runs :func:`stagewright.core.uncertainty.field_check.field_check_uncertainty` in its own thread.

    Signals
    -------
    started(job), progress(job, fraction, message), finished(job, result_dict, seconds),
    cancelled(job, None, message), failed(job, message, field)
    """

    progress = Signal(int, float, str)

    def __init__(self, parent=None):
        super().__init__(_field_check, what="the field-check uncertainty", thread_name="stagewright-field-check",
                         parent=parent)
