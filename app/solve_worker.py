"""Solve the project off the GUI thread, debounced, dropping results that are out of date.

Every request gets a job id one higher than the last. The worker skips jobs that were
superseded while they waited, and the controller discards any answer whose id is not the
newest, so an edit made during a solve always wins. Errors in the worker become a
``failed`` signal with the reason and the field path; nothing propagates into Qt.
"""
from __future__ import annotations

__all__ = ["SolveController", "SolveWorker"]

import sys
import time
import traceback

from PySide6.QtCore import QObject, QThread, QTimer, Signal, Slot


def _stop_thread(thread: QThread, timeout_ms: int = 10_000) -> None:
    try:
        running = thread.isRunning()
    except RuntimeError:  # its wrapper went first: the thread was already stopped and deleted
        return
    if running:
        thread.quit()
        thread.wait(timeout_ms)


class SolveWorker(QObject):
    """Lives in the worker thread; solves one document per ``request``."""

    done = Signal(int, object, float)  #: job id, result dict, seconds
    failed = Signal(int, str, str)  #: job id, message, field path

    def __init__(self, latest):
        super().__init__()
        self._latest = latest  # callable returning the newest job id

    @Slot(int, object)
    def run(self, job_id: int, doc: dict) -> None:
        if job_id != self._latest():
            return  # superseded while queued
        start = time.perf_counter()
        try:
            from thermo import StagewrightError, solve
            try:
                result = solve(doc).to_dict()
            except StagewrightError as exc:
                self.failed.emit(job_id, str(exc), getattr(exc, "field", "") or "")
                return
        except Exception as exc:  # a bug in the core must not take the window down
            traceback.print_exc(file=sys.stderr)
            self.failed.emit(job_id, f"internal error in the solver: {type(exc).__name__}: {exc}", "")
            return
        self.done.emit(job_id, result, time.perf_counter() - start)

    @Slot()
    def release(self) -> None:
        """Runs in the worker thread just before it stops: free its CoolProp states."""
        from thermo.solve import release_thread_models
        release_thread_models()


class SolveController(QObject):
    """Owns the worker thread; the window calls :meth:`request` after each valid edit.

    Signals
    -------
    started(job_id), finished(job_id, result, seconds), failed(job_id, message, field)
        ``finished`` and ``failed`` only ever carry the newest job.
    """

    started = Signal(int)
    finished = Signal(int, object, float)
    failed = Signal(int, str, str)
    _submit = Signal(int, object)
    _release = Signal()

    def __init__(self, parent=None, debounce_ms: int = 150):
        super().__init__(parent)
        self._job = 0
        self._pending_doc = None
        self._busy = False
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(debounce_ms)
        self._timer.timeout.connect(self._fire)
        self._thread = QThread()
        self._thread.setObjectName("stagewright-solver")
        self._worker = SolveWorker(lambda: self._job)
        self._worker.moveToThread(self._thread)
        self._submit.connect(self._worker.run)
        self._release.connect(self._worker.release)
        self._worker.done.connect(self._on_done)
        self._worker.failed.connect(self._on_failed)
        self._thread.start()
        # never let a running QThread be destroyed (Qt aborts): stop it with its owner
        thread = self._thread
        self.destroyed.connect(lambda *_: _stop_thread(thread))

    @property
    def latest_job(self) -> int:
        return self._job

    @property
    def busy(self) -> bool:
        """True from a request until its answer (or a newer request's answer) arrives."""
        return self._busy or self._timer.isActive()

    def request(self, doc: dict, immediate: bool = False) -> int:
        """Solve ``doc`` (a private copy) after the debounce delay; return its job id."""
        self._job += 1
        self._pending_doc = doc
        if immediate:
            self._timer.stop()
            self._fire()
        else:
            self._timer.start()
        return self._job

    def cancel(self) -> None:
        """Forget any pending or running job (its answer will be dropped)."""
        self._timer.stop()
        self._job += 1
        self._pending_doc = None
        self._busy = False

    def _fire(self) -> None:
        if self._pending_doc is None:
            return
        doc, self._pending_doc = self._pending_doc, None
        self._busy = True
        self.started.emit(self._job)
        self._submit.emit(self._job, doc)

    @Slot(int, object, float)
    def _on_done(self, job_id: int, result: dict, seconds: float) -> None:
        if job_id != self._job:
            return  # stale: a newer edit is on its way
        self._busy = False
        self.finished.emit(job_id, result, seconds)

    @Slot(int, str, str)
    def _on_failed(self, job_id: int, message: str, field: str) -> None:
        if job_id != self._job:
            return
        self._busy = False
        self.failed.emit(job_id, message, field)

    def shutdown(self, timeout_ms: int = 10_000) -> None:
        """Stop the timer and the worker thread (called from the window's closeEvent)."""
        self.cancel()
        if self._thread.isRunning():
            self._release.emit()  # queued behind any running job, in the worker thread
            _stop_thread(self._thread, timeout_ms)
