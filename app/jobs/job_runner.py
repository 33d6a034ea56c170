"""Background jobs off the GUI thread: one worker thread, job ids, stale answers dropped.

A :class:`JobRunner` owns one worker :class:`~PySide6.QtCore.QThread` and runs a *work*
function there, one job at a time, in the order they were started. Every job gets an id one
higher than the last and its own ``threading.Event`` (its cancel flag). A newer job
supersedes an older one: the older one's event is set, the worker skips it if it has not
started yet, and whatever it still reports is dropped in the GUI thread, so only the newest
job's progress and answer are passed on. Nothing the work raises reaches Qt:

- :class:`JobCancelled` becomes ``cancelled(job, partial answer, message)``;
- a :class:`stagewright.core.errors.StagewrightError` becomes ``failed(job, message, field path)``,
  its message naming the field, the value and the valid range;
- anything else (a bug) becomes ``failed(job, "internal error in <what>: …", "")``, with
  the traceback on stderr for the developer, never in front of the user.

The solve, staging-study and year runners of the window (:mod:`stagewright.gui.jobs.solve_worker`,
:mod:`stagewright.gui.study.worker`, :mod:`stagewright.gui.year.worker`) are thin subclasses.
"""
from __future__ import annotations

__all__ = ["JobCancelled", "JobRunner", "Work", "stop_thread"]

import atexit
import os
import sys
import threading
import time
import traceback
from typing import Any, Callable

from PySide6.QtCore import QObject, QThread, Signal, Slot

#: ``work(payload, report, cancel) -> answer``: runs in the worker thread; ``report(*args)``
#: sends progress (the arguments of the runner's ``progress`` signal after the job id);
#: ``cancel`` is the job's ``threading.Event``, to be checked between steps.
Work = Callable[[Any, Callable[..., None], threading.Event], Any]

_ANSWERS = ("finished", "cancelled", "failed")  # the signals that end a job


class JobCancelled(Exception):
    """Raised by a work function that stopped because its cancel event was set.

    Parameters
    ----------
    partial : object
        The answer made of what was finished before the stop (``cancelled`` carries it).
    message : str
        What was done before the stop, for the user (``study cancelled after 1 of 5 …``).
    """

    def __init__(self, partial: Any, message: str) -> None:
        super().__init__(message)
        self.partial = partial
        self.message = message


def stop_thread(thread: QThread, timeout_ms: int = 10_000) -> None:
    """Quit a running ``thread`` and wait for it (a no-op if it is stopped or already deleted).

    Parameters
    ----------
    thread : QThread
        The worker thread.
    timeout_ms : int
        How long to wait for the job it is running [ms].
    """
    try:
        running = thread.isRunning()
    except RuntimeError:  # its wrapper went first: the thread was already stopped and deleted
        return
    if running:
        thread.quit()
        if not thread.wait(timeout_ms):
            _keep_until_finished(thread)


#: worker threads whose job outlived the shutdown wait (a long step that does not look at its
#: cancel event): kept referenced until they end, because Qt aborts the process when a running
#: QThread is destroyed ("QThread: Destroyed while thread is still running")
_OUTLIVING: set = set()


def _keep_until_finished(thread: QThread) -> None:
    # threads that have ended since are let go here, in the GUI thread (never from the ending
    # thread itself, where dropping the last reference would destroy it while it still runs)
    for ended in [t for t in _OUTLIVING if t.isFinished()]:
        _OUTLIVING.discard(ended)
    if not _OUTLIVING:
        atexit.unregister(_end_outliving)
        atexit.register(_end_outliving)
    _OUTLIVING.add(thread)


def _end_outliving(grace_ms: int = 3000) -> None:
    """At interpreter exit: give outliving jobs a moment, then end the process at once if one still
    runs — its work is let go either way (the window saved or kept it before closing), and
    destroying its thread would abort with a crash report instead of exiting."""
    for thread in list(_OUTLIVING):
        try:
            if thread.isRunning() and not thread.wait(grace_ms):
                sys.stdout.flush()
                sys.stderr.flush()
                os._exit(0)
        except RuntimeError:  # already deleted
            pass


class _Worker(QObject):
    """Lives in the worker thread; runs one job per ``run`` and reports it as ``news``."""

    news = Signal(int, str, object)  #: job id, runner signal name, that signal's arguments after the id

    def __init__(self, work: Work, what: str, latest: Callable[[], int]) -> None:
        super().__init__()
        self._work = work
        self._what = what
        self._latest = latest  # callable returning the newest job id

    @Slot(int, object, object)
    def run(self, job_id: int, payload: Any, cancel: threading.Event) -> None:
        if job_id != self._latest():
            return  # superseded while queued (a cancelled newest job still runs, and answers)
        start = time.perf_counter()
        try:
            from stagewright.core import StagewrightError
            try:
                answer = self._work(payload, lambda *args: self.news.emit(job_id, "progress", args), cancel)
            except JobCancelled as exc:
                self.news.emit(job_id, "cancelled", (exc.partial, exc.message))
                return
            except StagewrightError as exc:
                self.news.emit(job_id, "failed", (str(exc), getattr(exc, "field", "") or "",
                                                  getattr(exc, "detail", None)))
                return
        except Exception as exc:  # a bug in the core must not take the window down
            traceback.print_exc(file=sys.stderr)
            self.news.emit(job_id, "failed", (f"internal error in {self._what}: {type(exc).__name__}: {exc}", ""))
            return
        self.news.emit(job_id, "finished", (answer, time.perf_counter() - start))


class _WorkerThread(QThread):
    """The worker's thread: its event loop, then its CoolProp states freed as it ends.

    Freeing them here, rather than in a job queued before ``quit()``, happens however the
    loop ends: a queued job is not run if ``quit()`` came first (states left in a finished
    thread are only collected at interpreter teardown, too late for CoolProp).
    """

    def run(self) -> None:
        try:
            self.exec()
        finally:
            from stagewright.core.solve import release_thread_models
            release_thread_models()


class JobRunner(QObject):
    """Owns a worker thread that runs ``work`` for each job; passes on only the newest job's news.

    Parameters
    ----------
    work : Work
        ``work(payload, report, cancel) -> answer``, called in the worker thread.
    what : str
        What the work is, for the message of an internal error (``"the solver"``).
    thread_name : str
        Name of the worker thread (shown by debuggers and in crash reports).
    parent : QObject, optional
        Qt parent; the thread is stopped when the runner is destroyed.

    Signals
    -------
    started(job), finished(job, answer, seconds), cancelled(job, partial answer, message),
    failed(job, message, field)
        All but ``started`` only ever carry the newest job. A subclass whose work reports
        progress declares ``progress = Signal(int, …)`` with the types of ``report``'s
        arguments; the newest job's reports arrive there, in the GUI thread.
    """

    started = Signal(int)
    finished = Signal(int, object, float)
    cancelled = Signal(int, object, str)
    failed = Signal(int, str, str)
    _submit = Signal(int, object, object)

    def __init__(self, work: Work, *, what: str, thread_name: str, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self._job = 0
        self._busy = False
        self.failure_detail: dict | None = None  #: template and values of the last failure (or None)
        self._events = [threading.Event()]  # the newest job's cancel event (a list: see below)
        self._thread = _WorkerThread()
        self._thread.setObjectName(thread_name)
        self._worker = _Worker(work, what, lambda: self._job)
        self._worker.moveToThread(self._thread)
        self._submit.connect(self._worker.run)
        self._worker.news.connect(self._relay)
        self._thread.start()
        # never let a running QThread be destroyed (Qt aborts): stop the job, then the thread
        thread, events = self._thread, self._events
        self.destroyed.connect(lambda *_: (events[0].set(), stop_thread(thread)))

    @property
    def latest_job(self) -> int:
        """Id of the newest job (answers of any other are dropped)."""
        return self._job

    @property
    def busy(self) -> bool:
        """True from the start of a job until the answer of the newest job arrives."""
        return self._busy

    def supersede(self) -> int:
        """Make a new newest job id without starting it; older jobs are cancelled and dropped.

        Returns
        -------
        int
            The new id; :meth:`start` runs a payload under it.
        """
        self._events[0].set()
        self._events[0] = threading.Event()
        self._job += 1
        return self._job

    def start(self, payload: Any) -> None:
        """Run ``payload`` in the worker thread as the newest job (:attr:`latest_job`)."""
        self._busy = True
        self.started.emit(self._job)
        self._submit.emit(self._job, payload, self._events[0])

    def run(self, payload: Any) -> int:
        """Start a job (one still running is cancelled and its answer dropped); return its id."""
        self.supersede()
        self.start(payload)
        return self._job

    def cancel(self) -> None:
        """Ask the newest job to stop at its next check; it answers as its work decides
        (``cancelled`` with what it finished, or ``failed``)."""
        self._events[0].set()

    def forget(self) -> None:
        """Cancel and drop whatever is running or queued (no answer will arrive)."""
        self.supersede()
        self._busy = False

    def shutdown(self, timeout_ms: int = 10_000) -> None:
        """Drop the jobs and stop the thread, which frees its CoolProp states (the window's closeEvent).

        Parameters
        ----------
        timeout_ms : int
            How long to wait for a running job to notice its cancel event [ms].
        """
        self.forget()
        stop_thread(self._thread, timeout_ms)

    @Slot(int, str, object)
    def _relay(self, job_id: int, signal: str, args: tuple) -> None:
        if job_id != self._job:
            return  # stale: a newer job was started, or this one was forgotten
        if signal in _ANSWERS:
            self._busy = False
        if signal == "failed":  # the error's template and values, read by failed's slots
            self.failure_detail = args[2] if len(args) > 2 else None
            args = args[:2]
        getattr(self, signal).emit(job_id, *args)
