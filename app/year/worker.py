"""Run a year at the site off the GUI thread, with progress, cancel and stale answers dropped.

A :class:`~stagewright.gui.jobs.job_runner.JobRunner`: every run gets a job id one higher than the last, and
progress and answers of an older job are dropped. Cancel stops the run between two bins;
it then answers ``failed`` with the core's message (``year run cancelled after 3 of 12
bins``: :class:`stagewright.core.year.YearCancelled` is a ``StagewrightError``).
"""
from __future__ import annotations

__all__ = ["YearRunner"]

import threading
from typing import Callable

from PySide6.QtCore import Signal

from stagewright.gui.jobs.job_runner import JobRunner


def _year(doc: dict, report: Callable[[int, int], None], cancel: threading.Event) -> dict:
    from stagewright.core.year import run_year
    return run_year(doc, progress=report, cancelled=cancel.is_set).to_dict()


class YearRunner(JobRunner):
    """Runs :func:`stagewright.core.year.run_year` in the year thread; emits only the newest job's news.

    Signals
    -------
    started(job), progress(job, done, total), finished(job, result_dict, seconds),
    failed(job, message, field)
    """

    progress = Signal(int, int, int)

    def __init__(self, parent=None):
        super().__init__(_year, what="the year run", thread_name="stagewright-year", parent=parent)
