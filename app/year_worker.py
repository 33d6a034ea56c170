"""Run a year at the site off the GUI thread, with progress, cancel and stale answers dropped.

A plain Python thread per run (a year is a handful of solves, started by a button): every
run gets a job id one higher than the last; answers and progress of an older job are
dropped when they arrive. Signals emitted from the worker thread reach the panel queued,
in the GUI thread. The thread frees its CoolProp states before it ends.
"""
from __future__ import annotations

__all__ = ["YearRunner"]

import sys
import threading
import traceback

from PySide6.QtCore import QObject, Signal


class YearRunner(QObject):
    """Starts :func:`thermo.year.run_year` in a thread; emits only the newest job's news.

    Signals
    -------
    progress(job, done, total), finished(job, result_dict), failed(job, message, field)
    """

    progress = Signal(int, int, int)
    finished = Signal(int, object)
    failed = Signal(int, str, str)

    def __init__(self, parent=None):
        super().__init__(parent)
        self._job = 0
        self._cancel = threading.Event()
        self._thread: threading.Thread | None = None
        self._progress_raw.connect(self._relay_progress)
        self._finished_raw.connect(self._relay_finished)
        self._failed_raw.connect(self._relay_failed)

    # raw signals carry every job; the relays drop stale ones in the GUI thread
    _progress_raw = Signal(int, int, int)
    _finished_raw = Signal(int, object)
    _failed_raw = Signal(int, str, str)

    @property
    def busy(self) -> bool:
        return self._thread is not None and self._thread.is_alive()

    def run(self, doc: dict) -> int:
        """Start a year run of ``doc`` (a private copy); supersedes any run in progress."""
        self.cancel()
        self._job += 1
        job, cancel = self._job, threading.Event()
        self._cancel = cancel
        self._thread = threading.Thread(target=self._work, args=(job, doc, cancel),
                                        name="stagewright-year", daemon=True)
        self._thread.start()
        return job

    def cancel(self) -> None:
        self._cancel.set()

    def shutdown(self, timeout_s: float = 10.0) -> None:
        """Cancel and wait for the thread (the window's closeEvent)."""
        self.cancel()
        if self._thread is not None:
            self._thread.join(timeout_s)

    def _work(self, job: int, doc: dict, cancel: threading.Event) -> None:
        from thermo import StagewrightError
        from thermo.solve import release_thread_models
        from thermo.year import run_year
        try:
            result = run_year(doc, progress=lambda done, total: self._progress_raw.emit(job, done, total),
                              cancelled=cancel.is_set)
            self._finished_raw.emit(job, result.to_dict())
        except StagewrightError as exc:  # bad input, or cancelled (YearCancelled is one)
            self._failed_raw.emit(job, str(exc), getattr(exc, "field", "") or "")
        except Exception as exc:  # a bug in the core must not take the window down
            traceback.print_exc(file=sys.stderr)
            self._failed_raw.emit(job, f"internal error in the year run: {type(exc).__name__}: {exc}", "")
        finally:
            release_thread_models()

    def _relay_progress(self, job: int, done: int, total: int) -> None:
        if job == self._job:
            self.progress.emit(job, done, total)

    def _relay_finished(self, job: int, result: dict) -> None:
        if job == self._job:
            self.finished.emit(job, result)

    def _relay_failed(self, job: int, message: str, field: str) -> None:
        if job == self._job:
            self.failed.emit(job, message, field)
