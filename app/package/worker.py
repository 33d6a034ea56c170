"""Compute the package's data sheet off the GUI thread, stale answers dropped.

A :class:`~stagewright.gui.jobs.job_runner.JobRunner`: the data sheet solves the project twice more (at the
ISO 1217 reference conditions and at the site, :func:`stagewright.core.part_load.data_sheet.data_sheet`),
too long for the GUI thread on real gas. A newer request drops the answer of an older one.
"""
from __future__ import annotations

__all__ = ["DataSheetRunner"]

import threading
from typing import Callable

from stagewright.gui.jobs.job_runner import JobCancelled, JobRunner


def _data_sheet(doc: dict, _report: Callable, cancel: threading.Event) -> dict:
    from stagewright.core.part_load.data_sheet import data_sheet
    if cancel.is_set():
        raise JobCancelled(None, "data sheet cancelled")
    return data_sheet(doc).to_dict()


class DataSheetRunner(JobRunner):
    """Runs :func:`stagewright.core.part_load.data_sheet.data_sheet` in its own thread.

    Signals
    -------
    started(job), finished(job, sheet_dict, seconds), cancelled(job, None, message),
    failed(job, message, field)
    """

    def __init__(self, parent=None):
        super().__init__(_data_sheet, what="the data sheet", thread_name="stagewright-data-sheet", parent=parent)
