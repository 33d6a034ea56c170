"""Train ▸ Run staging study: :func:`thermo.study.compare_stagings` on a worker thread, shown
in the Staging study tab of the charts area. The window stays live; a new run or closing
the window cancels a running study."""
from __future__ import annotations

__all__ = ["StudyOps", "StudyJob", "study_stage_count"]

import sys
import threading
import traceback

from PySide6.QtCore import QObject, Signal

from .doc_paths import get_in


def study_stage_count(n_stages: int) -> int:
    """Most stages to compare: two more than the project has, at least 4, at most the study's limit."""
    from thermo.study import MAX_STAGES
    return max(1, min(MAX_STAGES, max(4, n_stages + 2)))


class StudyJob(QObject):
    """One study on a worker thread; ``done(rows, note, error)`` arrives in the GUI thread."""

    done = Signal(object, str, str)

    def __init__(self, doc: dict, max_stages: int, parent=None):
        super().__init__(parent)
        self.doc, self.max_stages = doc, max_stages
        self.cancel = threading.Event()
        self.thread = threading.Thread(target=self._run, name="stagewright-study", daemon=True)

    def start(self) -> None:
        self.thread.start()

    def _run(self) -> None:
        from thermo import StagewrightError
        from thermo.solve import release_thread_models
        from thermo.study import StudyCancelled, compare_stagings
        try:
            comparison = compare_stagings(self.doc, max_stages=self.max_stages, cancel=self.cancel)
            rows, note = comparison.rows(), comparison.full_note()
        except StudyCancelled:
            return
        except StagewrightError as exc:
            self.done.emit(None, "", str(exc))
            return
        except Exception as exc:  # a bug in the study must not take the window down
            traceback.print_exc(file=sys.stderr)
            self.done.emit(None, "", f"internal error in the staging study: {type(exc).__name__}: {exc}")
            return
        finally:
            release_thread_models()
        if not self.cancel.is_set():
            self.done.emit(rows, note, "")

    def stop(self, timeout: float = 10.0) -> None:
        self.cancel.set()
        if self.thread.is_alive():
            self.thread.join(timeout)


class StudyOps:
    """Mixed into :class:`~app.main_window.MainWindow` (needs ``editor``, ``charts``)."""

    study_job: StudyJob | None = None

    def run_study(self) -> None:
        ed = self.editor
        if ed.problems or ed.entry_errors:
            self.statusBar().showMessage("Fix the problems listed in Messages before a staging study.", 6000)
            return
        tab = self.charts.study_tab()
        if tab is None:
            return
        self.stop_study()
        job = StudyJob(ed.model.snapshot(), study_stage_count(ed.model.stage_count), self)
        job.done.connect(self._on_study_done)
        self.study_job = job
        self.statusBar().showMessage(f"Staging study: comparing 1 to {job.max_stages} stages…")
        self.charts.tabs.setCurrentWidget(tab)
        job.start()

    def _on_study_done(self, rows, note: str, error: str) -> None:
        if self.sender() is not self.study_job:
            return  # an older, cancelled run
        if error:
            self.statusBar().clearMessage()
            self.show_error("Staging study failed", error)
            return
        doc = self.study_job.doc
        limit = get_in(doc, "stages[0].max_discharge_temperature_K", None)
        self.charts.study_tab().show_rows(rows, note, self.prefs.system, limit, doc)
        feasible = [r["stages"] for r in rows if r.get("feasible")]
        self.statusBar().showMessage(
            f"Staging study done: {len(rows)} options, fewest stages within the limits: "
            f"{feasible[0] if feasible else 'none'}", 8000)

    def stop_study(self) -> None:
        if self.study_job is not None:
            self.study_job.stop()
