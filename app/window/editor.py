"""The glue between views and the document: edits become undo commands, problems are
collected, solves are requested and results published.

Views call :meth:`Editor.set_value` (one undo step per user action) and listen to the
signals below; they never touch the document or the undo stack directly.
"""
from __future__ import annotations

__all__ = ["Editor", "ABSENT"]

import copy
import time
from typing import Any

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoStack

from stagewright.core.project.validation import barometric_pressure
from stagewright.core.errors import Problem

from stagewright.gui.window.commands import InsertStage, MoveStage, RemoveStage, ReplaceProject, SetValues
from stagewright.gui.document.display_prefs import DisplayPrefs
from stagewright.gui.document.paths import ABSENT, is_related, stage_path
from stagewright.gui.document.model import ProjectModel
from stagewright.gui.document.field_specs import edit_text
from stagewright.gui.jobs.solve_worker import SolveController


def _library_load_within(seconds: float) -> tuple[float, float] | None:
    """``coolprop_adapter.LOADED`` (seconds it took, when it ended) if loading CoolProp ended within
    the last ``seconds`` (a solve that just took that long loaded it; and for the answer's
    way to the window: 1 s more), else None."""
    from stagewright.core import coolprop_adapter
    loaded = coolprop_adapter.LOADED
    if loaded is None or time.perf_counter() - loaded[1] > seconds + 1.0:
        return None
    return loaded


class Editor(QObject):
    """One per window.

    Signals
    -------
    problems_changed()
        Document problems or unreadable entries changed (see :attr:`problems`, :attr:`entry_errors`).
    result_changed()
        A new result arrived, a solve failed, or the result went stale.
    solve_started()
    focus_requested(str)
        The messages area asks the panels to show the field at this path.
    snapshot_checked(str)
        The results kept with the file were shown at once and the project has been solved
        again: a sentence on whether any figure moved (:func:`stagewright.core.cases.snapshot.change_summary`).
    """

    problems_changed = Signal()
    result_changed = Signal()
    solve_started = Signal()
    focus_requested = Signal(str)
    snapshot_checked = Signal(str)

    def __init__(self, model: ProjectModel, prefs: DisplayPrefs, parent=None, debounce_ms: int = 150):
        super().__init__(parent)
        self.model = model
        self.prefs = prefs
        self.undo_stack = QUndoStack(self)
        self.solver = SolveController(self, debounce_ms=debounce_ms)
        self.problems: list[Problem] = []
        self.entry_errors: dict[str, str] = {}  # path -> message for text that is not a number
        self.result: dict | None = None  # last good result (may be stale)
        self.stale = True
        self.failure: tuple[str, str] | None = None  # (message, field) of the last failed solve
        self.failure_detail: dict | None = None  # its template and values (stagewright.core.errors.message_detail)
        self.solve_seconds: float | None = None
        #: of the last solve's time, what loading CoolProp took when that solve loaded it (else None)
        self.library_load_seconds: float | None = None
        self._load_reported = None
        self.solved_jobs = 0
        self.from_snapshot = False  # the result shown is the one kept with the file, not yet re-solved
        self._snapshot_check: tuple[dict, str] | None = None  # (snapshot, case) to compare the next solve with
        self.solver.finished.connect(self._on_solved)
        self.solver.failed.connect(self._on_failed)
        self.solver.started.connect(lambda _job: self.solve_started.emit())
        model.changed.connect(self._on_model_changed)

    # ---- reading helpers for views -----------------------------------------------------
    def barometric_Pa(self) -> float:
        """Site barometric pressure [Pa] for gauge display: the core's resolution of the site
        being edited (:func:`stagewright.core.project.validation.barometric_pressure`: as given, else the
        ISO 2533 standard atmosphere at the elevation, else sea level)."""
        return barometric_pressure(self.model.get("site", {}))

    def failure_text(self, message: str, field: str, detail: dict | None) -> str:
        """A worker's failure (its SI message, field and message detail) in the display units and
        field labels of this window (:func:`stagewright.gui.document.messages.error_text`)."""
        from stagewright.gui.document.messages import error_text
        p = self.prefs
        return error_text(message, field, detail, self.model.doc, p.system, gauge=p.gauge,
                          barometric_Pa=self.barometric_Pa())

    def problem_for(self, path: str) -> str | None:
        """Message marking the field at ``path`` (unreadable entry first, then range problem)."""
        if path in self.entry_errors:
            return self.entry_errors[path]
        for p in self.problems:
            if p.field == path:
                return p.expected
        return None

    # ---- edits ---------------------------------------------------------------------------
    def set_value(self, path: str, value: Any, text: str | None = None) -> bool:
        """Change one value as one undo step; return False when nothing changed."""
        return self.set_values([(path, value)], text or edit_text(path, self.model.doc))

    def set_values(self, pairs: list[tuple[str, Any]], text: str) -> bool:
        pairs = [(p, v) for p, v in pairs if self.model.get(p) != v or type(self.model.get(p)) is not type(v)]
        if not pairs:
            return False
        self.undo_stack.push(SetValues(self.model, pairs, text))
        return True

    def insert_stage(self, index: int, stage: dict, text: str) -> None:
        self.undo_stack.push(InsertStage(self.model, index, stage, text))

    def remove_stage(self, index: int) -> None:
        self.undo_stack.push(RemoveStage(self.model, index, f"Remove stage {index + 1}"))

    def move_stage(self, index: int, new_index: int) -> None:
        direction = "up" if new_index < index else "down"
        self.undo_stack.push(MoveStage(self.model, index, new_index, f"Move stage {index + 1} {direction}"))

    def replace_project(self, doc: dict, show: str | None, text: str) -> None:
        """A case operation (the whole project before and after) as one undo step, showing case ``show``."""
        self.undo_stack.push(ReplaceProject(self.model, doc, show, text))

    def set_entry_error(self, path: str, message: str | None) -> None:
        """Record (or clear, with None) text in a field that could not be read as a value."""
        if message is None:
            if self.entry_errors.pop(path, None) is None:
                return
        else:
            if self.entry_errors.get(path) == message:
                return
            self.entry_errors[path] = message
        self._revalidate()

    def request_focus(self, path: str) -> None:
        self.focus_requested.emit(path)

    # ---- solving -------------------------------------------------------------------------
    def _on_model_changed(self, path: str) -> None:
        self.from_snapshot, self._snapshot_check = False, None  # an edit: the kept results no longer apply
        if path == "":
            self.entry_errors.clear()
        else:
            for p in [p for p in self.entry_errors if is_related(p, path)]:
                del self.entry_errors[p]
        self._revalidate()

    def _revalidate(self) -> None:
        self.problems = self.model.problems()
        self.problems_changed.emit()
        if self.problems or self.entry_errors:
            was_busy = self.solver.busy
            self.solver.cancel()
            self.failure = None
            if self.stale and was_busy:
                self.result_changed.emit()  # a solve stopped: the views say why it stopped
            self._mark_stale()
        else:
            self.solve_now(immediate=False, checked=True)

    def solve_now(self, immediate: bool = True, checked: bool = False) -> None:
        """Ask the worker to solve the current document (no-op while it has problems); ``checked``:
        :attr:`problems` is already the current document's (not checked a second time)."""
        if not checked:
            self.problems = self.model.problems()
        if self.problems or self.entry_errors:
            self._mark_stale()
            return
        self.solver.request(self.model.snapshot(), immediate=immediate)
        if not self.from_snapshot:  # the kept results stand, unmarked, until the solve checks them
            self._mark_stale()

    def _mark_stale(self) -> None:
        if not self.stale:
            self.stale = True
            self.result_changed.emit()

    def show_snapshot(self, snapshot: dict | None) -> bool:
        """Show the results kept with the file for the case being edited at once (True when there
        are any); the next solve is compared with them (:attr:`snapshot_checked`)."""
        case = self.model.active_case
        kept = ((snapshot or {}).get("results") or {}).get(case)
        if not isinstance(kept, dict) or not kept.get("stages"):
            self._snapshot_check = None
            return False
        self.result, self.stale, self.failure, self.from_snapshot = kept, False, None, True
        self._snapshot_check = (snapshot, case)
        self.result_changed.emit()
        return True

    def _on_solved(self, job_id: int, result: dict, seconds: float) -> None:
        self.result, self.stale, self.failure, self.solve_seconds = result, False, None, seconds
        load = _library_load_within(seconds)
        self.library_load_seconds = None if load is None or load is self._load_reported else load[0]
        self._load_reported = load or self._load_reported  # a load is told once
        self.solved_jobs += 1
        self.from_snapshot = False
        self.result_changed.emit()
        if self._snapshot_check is not None:
            snapshot, case = self._snapshot_check
            self._snapshot_check = None
            if case == self.model.active_case:
                from stagewright.core.cases.snapshot import change_summary, compare_snapshot
                changes = compare_snapshot({"results": {case: snapshot["results"][case]}}, {case: result})
                self.snapshot_checked.emit(change_summary(snapshot, changes))

    def _on_failed(self, job_id: int, message: str, field: str) -> None:
        self.stale, self.failure, self.solve_seconds = True, (message, field), None
        self.failure_detail = getattr(self.solver, "failure_detail", None)
        self.result_changed.emit()

    # ---- stage helpers -------------------------------------------------------------------
    def stage(self, index: int) -> dict:
        return copy.deepcopy(self.model.get(stage_path(index), {}))

    def shutdown(self) -> None:
        self.solver.shutdown()

