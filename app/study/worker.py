"""Run staging studies off the GUI thread, with progress, cancellation and stale answers dropped.

A :class:`~stagewright.gui.jobs.job_runner.JobRunner`: every study gets a job id one higher than the last, and
only the newest job's progress and answer are passed on. Each job has its own
``threading.Event``: Cancel sets it and the study stops before its next trial solve
(``stagewright.core.study`` checks it), answering ``cancelled`` with what it had finished. Errors
become a ``failed`` signal with the reason and the field path.

Progress is the study's own (the share of its options finished), with the trial solves of the
option being optimised counted in between (:class:`stagewright.gui.study.job.TrialProgress`). A fraction
of 1 means every option is optimised, not that the answer is in: the answer is ``finished``.
"""
from __future__ import annotations

__all__ = ["StudyController"]

import threading
from typing import Callable

from PySide6.QtCore import Signal

from stagewright.gui.jobs.job_runner import JobCancelled, JobRunner
from stagewright.gui.study.job import StudyRequest, TrialProgress, partial_answer, run_request


def _study(request: StudyRequest, report: Callable[[float, str], None], cancel: threading.Event) -> dict:
    from stagewright.core.study import StudyCancelled
    progress = TrialProgress(report, cancel)
    try:
        return run_request(request, progress.report, progress.cancel)
    except StudyCancelled as exc:
        raise JobCancelled(partial_answer(request, exc.partial, str(exc)), str(exc)) from None


class StudyController(JobRunner):
    """Owns the study thread; the study panel calls :meth:`run` (a :class:`~stagewright.gui.study.job.StudyRequest`),
    :meth:`cancel` and :meth:`forget`.

    Signals
    -------
    started(job), progress(job, fraction, message), finished(job, answer, seconds),
    cancelled(job, partial answer, message), failed(job, message, field)
        All but ``started`` only ever carry the newest job.
    """

    progress = Signal(int, float, str)

    def __init__(self, parent=None):
        super().__init__(_study, what="the staging study", thread_name="stagewright-study", parent=parent)
