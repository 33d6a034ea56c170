"""Run staging studies off the GUI thread, with progress, cancellation and stale answers dropped.

The same pattern as :mod:`app.solve_worker`: every request gets a job id one higher than the
last; the worker skips a job superseded while it waited, and the controller passes on only
answers of the newest job. Each job has its own ``threading.Event``: Cancel sets it and the
study stops before its next trial solve (``thermo.study`` checks it), answering with what it
had finished. Errors become a ``failed`` signal with the reason and the field path.
"""
from __future__ import annotations

__all__ = ["StudyController", "StudyWorker"]

import sys
import threading
import time
import traceback

from PySide6.QtCore import QObject, QThread, Signal, Slot

from .study_job import StudyRequest, partial_answer, run_request


def _stop_thread(thread: QThread, timeout_ms: int = 10_000) -> None:
    if thread.isRunning():
        thread.quit()
        thread.wait(timeout_ms)


class StudyWorker(QObject):
    """Lives in the study thread; runs one :class:`~app.study_job.StudyRequest` per ``run``."""

    progress = Signal(int, float, str)  #: job id, fraction 0…1, message
    done = Signal(int, object, float)  #: job id, answer, seconds
    cancelled = Signal(int, object, str)  #: job id, partial answer, message
    failed = Signal(int, str, str)  #: job id, message, field path

    def __init__(self, latest):
        super().__init__()
        self._latest = latest  # callable returning the newest job id

    @Slot(int, object, object)
    def run(self, job_id: int, request: StudyRequest, cancel: threading.Event) -> None:
        if job_id != self._latest() or cancel.is_set():
            return  # superseded or cancelled while queued
        start = time.perf_counter()
        try:
            from thermo import StagewrightError
            from thermo.study import StudyCancelled
            try:
                answer = run_request(request, lambda f, m: self.progress.emit(job_id, f, m), cancel)
            except StudyCancelled as exc:
                self.cancelled.emit(job_id, partial_answer(request, exc.partial, str(exc)), str(exc))
                return
            except StagewrightError as exc:
                self.failed.emit(job_id, str(exc), getattr(exc, "field", "") or "")
                return
        except Exception as exc:  # a bug in the core must not take the window down
            traceback.print_exc(file=sys.stderr)
            self.failed.emit(job_id, f"internal error in the staging study: {type(exc).__name__}: {exc}", "")
            return
        self.done.emit(job_id, answer, time.perf_counter() - start)

    @Slot()
    def release(self) -> None:
        """Runs in the study thread just before it stops: free its CoolProp states."""
        from thermo.solve import release_thread_models
        release_thread_models()


class StudyController(QObject):
    """Owns the study thread; the study panel calls :meth:`run` and :meth:`cancel`.

    Signals
    -------
    started(job), progress(job, fraction, message), finished(job, answer, seconds),
    cancelled(job, partial answer, message), failed(job, message, field)
        All but ``started`` only ever carry the newest job.
    """

    started = Signal(int)
    progress = Signal(int, float, str)
    finished = Signal(int, object, float)
    cancelled = Signal(int, object, str)
    failed = Signal(int, str, str)
    _submit = Signal(int, object, object)
    _release = Signal()

    def __init__(self, parent=None):
        super().__init__(parent)
        self._job = 0
        self._busy = False
        self._cancel = threading.Event()
        self._current = [self._cancel]  # the running job's event, for the destroyed handler
        self._thread = QThread()
        self._thread.setObjectName("stagewright-study")
        self._worker = StudyWorker(lambda: self._job)
        self._worker.moveToThread(self._thread)
        self._submit.connect(self._worker.run)
        self._release.connect(self._worker.release)
        self._worker.progress.connect(self._on_progress)
        self._worker.done.connect(self._on_done)
        self._worker.cancelled.connect(self._on_cancelled)
        self._worker.failed.connect(self._on_failed)
        self._thread.start()
        # never let a running QThread be destroyed (Qt aborts): stop the study, then the thread
        thread, current = self._thread, self._current
        self.destroyed.connect(lambda *_: (current[0].set(), _stop_thread(thread)))

    @property
    def latest_job(self) -> int:
        return self._job

    @property
    def busy(self) -> bool:
        """True from a request until the answer of the newest job arrives."""
        return self._busy

    def run(self, request: StudyRequest) -> int:
        """Start a study (a job still running is cancelled and its answer dropped)."""
        self._cancel.set()
        self._cancel = threading.Event()
        self._current[0] = self._cancel
        self._job += 1
        self._busy = True
        self.started.emit(self._job)
        self._submit.emit(self._job, request, self._cancel)
        return self._job

    def cancel(self) -> None:
        """Ask the running study to stop; it answers ``cancelled`` with what it finished."""
        self._cancel.set()

    def forget(self) -> None:
        """Cancel and drop whatever is running (no answer will arrive)."""
        self._cancel.set()
        self._job += 1
        self._busy = False

    @Slot(int, float, str)
    def _on_progress(self, job_id: int, fraction: float, message: str) -> None:
        if job_id == self._job:
            self.progress.emit(job_id, fraction, message)

    @Slot(int, object, float)
    def _on_done(self, job_id: int, answer: dict, seconds: float) -> None:
        if job_id != self._job:
            return  # stale: a newer study was started
        self._busy = False
        self.finished.emit(job_id, answer, seconds)

    @Slot(int, object, str)
    def _on_cancelled(self, job_id: int, answer: dict, message: str) -> None:
        if job_id != self._job:
            return
        self._busy = False
        self.cancelled.emit(job_id, answer, message)

    @Slot(int, str, str)
    def _on_failed(self, job_id: int, message: str, field: str) -> None:
        if job_id != self._job:
            return
        self._busy = False
        self.failed.emit(job_id, message, field)

    def shutdown(self, timeout_ms: int = 10_000) -> None:
        """Stop the study and the thread (called from the window's closeEvent)."""
        self.forget()
        if self._thread.isRunning():
            self._release.emit()  # queued behind the (now cancelled) job, in the study thread
            _stop_thread(self._thread, timeout_ms)
