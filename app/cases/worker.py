"""Compare cases off the GUI thread: :func:`stagewright.core.cases.compare_cases` in a
:class:`~stagewright.gui.jobs.job_runner.JobRunner` (progress per case, cancel between cases, stale answers
dropped)."""
from __future__ import annotations

__all__ = ["CompareRunner"]

import threading
from typing import Callable

from PySide6.QtCore import Signal

from stagewright.gui.jobs.job_runner import JobCancelled, JobRunner


def _compare(payload: tuple[dict, list[str] | None], report: Callable[[int, int], None],
             cancel: threading.Event) -> list:
    from stagewright.core.cases import compare_cases
    doc, names = payload
    outcomes = compare_cases(doc, names, progress=report, cancelled=cancel.is_set)
    if cancel.is_set():
        raise JobCancelled(outcomes, f"comparison cancelled after {len(outcomes)} case(s)")
    return outcomes


class CompareRunner(JobRunner):
    """Runs a comparison of cases in its own thread.

    Signals
    -------
    started(job), progress(job, done, total), finished(job, outcomes, seconds),
    cancelled(job, partial outcomes, message), failed(job, message, field)
    """

    progress = Signal(int, int, int)

    def __init__(self, parent=None):
        super().__init__(_compare, what="the comparison of cases", thread_name="stagewright-compare", parent=parent)
