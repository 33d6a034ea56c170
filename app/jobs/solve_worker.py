"""Solve the project off the GUI thread, debounced, dropping results that are out of date.

Every request gets a job id one higher than the last, so an edit made during a solve always
wins: the running solve's answer is dropped (:class:`~stagewright.gui.jobs.job_runner.JobRunner` does the
thread, the job ids and the error messages). An edit while the solver is idle solves at once;
a burst of edits during a solve makes one solve of the last document. Errors become a ``failed`` signal with the reason and the
field path; nothing propagates into Qt.
"""
from __future__ import annotations

__all__ = ["SolveController"]

import threading

from PySide6.QtCore import QTimer

from stagewright.gui.jobs.job_runner import JobRunner


def _solve(doc: dict, _report, _cancel: threading.Event) -> dict:
    from stagewright.core import solve  # looked up per job (tests replace it)
    return solve(doc).to_dict()


class SolveController(JobRunner):
    """Owns the solver thread; the window calls :meth:`request` after each valid edit.

    Signals
    -------
    started(job_id), finished(job_id, result, seconds), failed(job_id, message, field)
        ``finished`` and ``failed`` only ever carry the newest job.
    """

    def __init__(self, parent=None, debounce_ms: int = 150):
        super().__init__(_solve, what="the solver", thread_name="stagewright-solver", parent=parent)
        self._pending_doc = None
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(debounce_ms)
        self._timer.timeout.connect(self._fire)

    @property
    def busy(self) -> bool:
        """True from a request until its answer (or a newer request's answer) arrives."""
        return super().busy or self._timer.isActive()

    def request(self, doc: dict, immediate: bool = False) -> int:
        """Solve ``doc`` (a private copy); return its job id.

        An edit while the solver is idle solves at once (the balance follows an edit without a
        wait); edits that come while a solve runs (or while gathered edits wait) are gathered
        into one solve of the newest document, after the debounce delay."""
        job = self.supersede()
        self._pending_doc = doc
        if immediate or not (JobRunner.busy.fget(self) or self._timer.isActive()):
            self._timer.stop()
            self._fire()
        else:
            self._timer.start()
        return job

    def forget(self) -> None:
        """Forget any pending or running job (its answer will be dropped)."""
        self._timer.stop()
        self._pending_doc = None
        super().forget()

    cancel = forget  # a solve has nothing to show for a partial run: cancelling drops it

    def _fire(self) -> None:
        if self._pending_doc is None:
            return
        doc, self._pending_doc = self._pending_doc, None
        self.start(doc)
