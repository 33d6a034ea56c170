"""Staging study panel: 1 … N stages side by side, each at its least-power split, off the GUI
thread, with a chart of power and discharge temperature, and Apply to put an option into the
project as one undo step.

The panel composes its pieces: the controls on the left (:mod:`stagewright.gui.study.controls`: most stages,
hours, price, an optional site variable, Run/Cancel, progress, Apply), the comparison table
(:mod:`stagewright.gui.study.options_table`) and the staging chart (:mod:`stagewright.gui.study.chart_view`) on the right.
It runs the study in :class:`stagewright.gui.study.worker.StudyController` and keeps its answer; limits that
decide a split, and options that miss their limits, go to the messages area.
"""
from __future__ import annotations

__all__ = ["StudyPanel"]

import os
import threading
from dataclasses import replace

from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import (QComboBox, QDockWidget, QHBoxLayout, QLabel, QSizePolicy, QSplitter,
                               QStackedWidget, QTabWidget, QVBoxLayout, QWidget)

from stagewright.core.study.options import staging_note

from stagewright.gui.widgets.plain_text import plain_label, plain_tip
from stagewright.gui.presentation import units
from stagewright.gui.study.apply import apply_text, option_stages, study_key
from stagewright.gui.study.chart_view import StagingChartView
from stagewright.gui.study.controls import StudyControls
from stagewright.gui.study.display import VARIABLES, case_label, limit_messages
from stagewright.gui.study.options_table import OptionsTable, apply_state, comparison_note
from stagewright.gui.study.worker import StudyController
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.panels.messages_panel import Message

_SIDE_BY_SIDE_PX = 900  # table and chart side by side from this width, else on two tabs
_STUDY_INPUTS = ("max_stages", "operating_hours_per_year", "energy_price_per_kWh", "variable", "values")
_CHART_HINT = "Run a study to see driver power and\ndischarge temperature against the\nnumber of stages."


class StudyPanel(QWidget):
    """The staging study of the open project.

    Attributes
    ----------
    controls : StudyControls
        Inputs, Run/Cancel, progress, status, Apply.
    table : OptionsTable
        The options of the case shown; the picked one is what Apply applies.
    chart : StagingChartView
        The same options as a chart.

    Signals
    -------
    messages_changed(source, messages)
        ``("study", [Message, ...])`` whenever the study's messages change (the window hands
        them to the messages area).
    run_started(max_stages)
        A study started, comparing 1 to ``max_stages`` stages.
    """

    title = "Staging study"
    messages_changed = Signal(str, object)
    run_started = Signal(int)  #: a study started, comparing 1 to this many stages

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.action_map: dict = {}
        self.controller = StudyController(self)
        self.answer: dict | None = None  # last answer (complete or cancelled part)
        self._doc: dict | None = None  # the document it was run on
        self._key = ""  # study_key of that document
        self._pending: tuple | None = None  # (doc, key, variable, values) of the running job
        self.messages: list[Message] = []
        self._failure: tuple | None = None  # (message, study key) of a study that could not run
        self._pool_warming = False  # the study pool's background warm-up has been started
        self._pool_ready = False  # … and has finished: comparisons run their options side by side
        self._build()
        c = self.controller
        c.progress.connect(self._on_progress)
        c.finished.connect(self._on_finished)
        c.cancelled.connect(self._on_cancelled)
        c.failed.connect(self._on_failed)
        editor.model.changed.connect(self._on_model_changed)
        editor.prefs.changed.connect(self._on_prefs)
        editor.problems_changed.connect(self._update_state)
        self.destroyed.connect(lambda *_: self._disconnect())
        self._on_model_changed("")

    def _warm_up_pool_once(self) -> None:
        """After the first study, prepare two worker processes in the background, so that the next
        staging comparisons run their options side by side (stagewright.core.warm_pool); not at
        start-up, where the workers' start would compete with the window's own."""
        if not self._pool_warming and (os.cpu_count() or 1) >= 2:
            self._pool_warming = True
            threading.Thread(target=self._warm_up_pool, name="stagewright-study-pool", daemon=True).start()

    def _warm_up_pool(self) -> None:
        """(On its own thread.) Warm the shared pool; the next studies of this panel use it. A failure
        only means that they run on one process."""
        from stagewright.core.warm_pool import warm_up_pool
        try:
            self._pool_ready = warm_up_pool(2) >= 1
        except Exception:  # noqa: BLE001 - no pool (e.g. a sandbox without processes): one process it is
            self._pool_ready = False

    def _disconnect(self) -> None:
        try:
            self.editor.model.changed.disconnect(self._on_model_changed)
            self.editor.prefs.changed.disconnect(self._on_prefs)
        except RuntimeError:
            pass

    # ---- building ------------------------------------------------------------------------
    def _build(self) -> None:
        outer = QVBoxLayout(self)
        outer.setContentsMargins(6, 4, 6, 4)
        outer.setSpacing(4)
        self.banner = QLabel("Out of date — the project changed since this study ran. Run the study again.")
        self.banner.setObjectName("staleBanner")
        self.banner.setWordWrap(True)
        self.banner.hide()
        outer.addWidget(self.banner)
        lay = QHBoxLayout()
        lay.setSpacing(8)
        outer.addLayout(lay, 1)
        self.controls = StudyControls(self.editor.model, self.editor.prefs)
        lay.addWidget(self.controls, 0)
        self.table = OptionsTable()
        self.table.itemSelectionChanged.connect(self._update_state)
        self.note = plain_label(QLabel())  # how the options are built: always beside the numbers it explains
        self.note.setObjectName("footNote")
        self.note.setWordWrap(True)
        self.note.setSizePolicy(QSizePolicy.Ignored, QSizePolicy.Preferred)
        self.comparison = QWidget()
        cv = QVBoxLayout(self.comparison)
        cv.setContentsMargins(0, 0, 0, 0)
        cv.setSpacing(3)
        cv.addWidget(self.note)
        cv.addWidget(self.table, 1)
        self.chart = StagingChartView(_CHART_HINT, icon_px=16)
        lay.addLayout(self._results(), 1)

    def _results(self) -> QVBoxLayout:
        """Which case is shown (sensitivity runs), over the table and the chart."""
        # table and chart side by side when the panel is wide, as two tabs when it is not
        self.results = QStackedWidget()
        self.splitter = QSplitter(Qt.Horizontal)
        self.splitter.setChildrenCollapsible(False)
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        self.results.addWidget(self.splitter)
        self.results.addWidget(self.tabs)
        right = QVBoxLayout()
        right.setSpacing(3)
        case_row = QHBoxLayout()  # which value of the site variable is shown (sensitivity runs)
        self.case_label = QLabel("Showing")
        self.case = QComboBox()
        self.case.setToolTip("Which value of the site variable the table and chart show")
        self.case.currentIndexChanged.connect(self._on_case)
        self.case.setSizeAdjustPolicy(QComboBox.AdjustToContents)
        case_row.addWidget(self.case_label)
        case_row.addWidget(self.case)
        case_row.addStretch(1)
        right.addLayout(case_row)
        right.addWidget(self.results, 1)
        self._side_by_side = None
        self._split_sized = False
        self._arrange(True)
        self._show_case_row()
        return right

    def _arrange(self, side_by_side: bool) -> None:
        """Put the table and the chart side by side (a splitter) or on two tabs."""
        if side_by_side == self._side_by_side:
            return
        self._side_by_side = side_by_side
        self._split_sized = False
        if side_by_side:
            self.tabs.clear()
            self.splitter.addWidget(self.comparison)
            self.splitter.addWidget(self.chart)
            self.splitter.setStretchFactor(0, 1)
            self.splitter.setStretchFactor(1, 1)
            self.results.setCurrentWidget(self.splitter)
            self.comparison.show()  # a widget taken from a hidden tab stays hidden otherwise
            self.chart.show()
        else:
            self.tabs.addTab(self.comparison, "Comparison")
            self.tabs.addTab(self.chart, "Chart")
            self.results.setCurrentWidget(self.tabs)

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        room = event.size().width() - self.controls.width()
        was = self._side_by_side and self._split_sized
        self._arrange(room >= _SIDE_BY_SIDE_PX)
        if self._side_by_side and not was:  # the table's wide size hint would take nearly all
            self.splitter.setSizes([int(room * 0.55), int(room * 0.45)])
            self._split_sized = True

    def set_actions(self, actions: dict) -> None:
        """Put the window's study actions (declared in app/window/actions.py) on the panel's buttons."""
        self.action_map = actions
        self.controls.add_action_buttons(actions)
        self._update_state()

    # ---- reading -------------------------------------------------------------------------
    @property
    def rows(self) -> list[dict]:
        """Comparison rows of the case shown (SI)."""
        case = self._shown_case()
        return case["rows"] if case else []

    @property
    def study_doc(self) -> dict | None:
        """The document the shown study ran on."""
        return self._doc

    @property
    def is_stale(self) -> bool:
        return self.answer is not None and study_key(self.editor.model.doc) != self._key

    @property
    def busy(self) -> bool:
        return self.controller.busy

    # ---- running -------------------------------------------------------------------------
    def _raise_dock(self) -> None:
        dock = self.parentWidget()
        while dock is not None and not isinstance(dock, QDockWidget):
            dock = dock.parentWidget()
        if dock is not None:
            dock.show()
            dock.raise_()

    def run_study(self) -> None:
        """Start the study of the current document (handler of the "train.study" action)."""
        self._raise_dock()
        ed = self.editor
        if ed.problems or ed.entry_errors:
            self._set_status("Fix the inputs marked in Messages first: the study needs a project that solves.")
            return
        doc = ed.model.snapshot()
        try:
            req = self.controls.request(doc)
        except ValueError as exc:
            self._set_status(f"Values: {exc}.")
            return
        if self._pool_ready:
            req = replace(req, processes=2)
        self._pending = (doc, study_key(doc), req.variable, req.values)
        self._failure = None
        self.controls.set_progress(None)  # busy until the study reports its first option
        self.controller.run(req)
        what = (f"{len(req.values)} value(s) of {VARIABLES[req.variable][0].lower()}, " if req.variable else "")
        self._set_status(f"Running: {what}1 to {req.max_stages} stages…")
        self._update_state()
        self.run_started.emit(req.max_stages)

    def cancel_study(self) -> None:
        """Stop the running study (handler of the "train.study_cancel" action)."""
        if self.controller.busy:
            self.controller.cancel()
            self._set_status("Cancelling…")

    def apply_selected(self) -> None:
        """Put the selected option into the project as one undo step ("train.study_apply")."""
        row = self.table.selected_row()
        if not apply_state(row, self.answer, self.controller.busy, self.is_stale)[0]:
            return
        stages = option_stages(self.editor.model.doc, row["pressure_ratios"], self.answer.get("first_efficiency"))
        if self.editor.set_values([("stages", stages)], apply_text(row["stages"])):
            self._set_status(f"Applied the {row['stages']}-stage option: Edit ▸ Undo restores the previous train.")

    def keep_selected_as_case(self) -> None:
        """Add the selected option as a new case of the project, one undo step
        ("train.study_keep_case"): the case shown with the option's stages."""
        from stagewright.core.project.case_changes import base_document, differences
        from stagewright.core.project.cases import add_case, case_document, unique_name

        row = self.table.selected_row()
        if not apply_state(row, self.answer, self.controller.busy, self.is_stale)[0]:
            return
        model = self.editor.model
        project = model.project_snapshot()
        own = case_document(project, model.active_case)
        own["stages"] = option_stages(model.doc, row["pressure_ratios"], self.answer.get("first_efficiency"))
        name = unique_name(project, f"{row['stages']} stages (study)")
        new = add_case(project, name, differences(base_document(project), own),
                       note=f"The staging study's {row['stages']}-stage option of “{model.active_case}”")
        self.editor.replace_project(new, model.active_case, f"Keep the {row['stages']}-stage option as a case")
        self._set_status(f"Kept the {row['stages']}-stage option as the case “{name}” (Cases panel).")

    def shutdown(self) -> None:
        """Stop the study thread (the window's closeEvent)."""
        self.controller.shutdown()

    # ---- answers -------------------------------------------------------------------------
    def _accept(self, answer: dict) -> None:
        doc, key = self._pending[:2]
        self._pending = None
        self.answer, self._doc, self._key = answer, doc, key
        with signals_blocked(self.case):
            self.case.clear()
            for case in answer["cases"]:
                self.case.addItem(case_label(answer["variable"], case["value"], self.editor.prefs.system))
        self._show_case_row()
        self.refresh()

    def _on_progress(self, job: int, fraction: float, message: str) -> None:
        self.controls.set_progress(fraction)
        if fraction >= 1.0:  # every option optimised; the answer is not in yet
            self._set_status("Every option optimised: putting the table together…")
            return
        if self._pending and self._pending[2]:
            values = self._pending[3]
            k = min(int(fraction * len(values)), len(values) - 1)
            message = f"{case_label(self._pending[2], values[k], self.editor.prefs.system)}: " \
                      f"{message.rsplit(': ', 1)[-1]}"
        self._set_status(message[:1].upper() + message[1:] + "…")

    def _on_finished(self, job: int, answer: dict, seconds: float) -> None:
        self.controls.set_progress(1.0, finished=True)
        self._accept(answer)
        n = sum(len(c["rows"]) for c in answer["cases"])
        self._set_status(f"Compared {n} option(s) in {seconds:.1f} s." + self._best_text())
        self._warm_up_pool_once()

    def _on_cancelled(self, job: int, answer: dict, message: str) -> None:
        self.controls.set_progress(self.controls.fraction)  # what was done (never a busy bar)
        self._accept(answer)
        self._set_status(f"Cancelled: {message[:1].upper() + message[1:]}." if answer["cases"]
                         else "Cancelled before the first option was finished.")

    def _on_failed(self, job: int, message: str, field: str) -> None:
        key = self._pending[1] if self._pending else ""
        self._pending = None
        self.answer, self._doc, self._key = None, None, ""
        self.controls.set_progress(0.0)
        message = self.editor.failure_text(message, field, self.controller.failure_detail)
        field = "" if field in _STUDY_INPUTS else field
        self._failure = (Message("problem", f"The staging study could not run: {message}", field),
                         key)
        self._set_status(f"The study could not run: {message}")
        self.refresh()

    def _best_text(self) -> str:
        ok = [r for r in self.rows if r["feasible"] and r["driver_power_W"] is not None]
        if not ok:
            return " No option meets every limit."
        best = min(ok, key=lambda r: r["driver_power_W"])
        power = units.format_value(best["driver_power_W"], "power", self.editor.prefs.system, True)
        return f" Least driver power: {best['stages']} stages, {power}."

    # ---- showing -------------------------------------------------------------------------
    def _shown_case(self) -> dict | None:
        if not self.answer or not self.answer["cases"]:
            return None
        i = max(0, min(self.case.currentIndex(), len(self.answer["cases"]) - 1))
        return self.answer["cases"][i]

    def refresh(self) -> None:
        """Table, chart, note and messages in the current unit system."""
        system = self.editor.prefs.system
        self._update_note()
        self.table.show_rows(self.rows, system)
        case = self._shown_case()
        if case and case.get("error"):
            self._set_status(f"{self.case.currentText()}: not solved: {case['error']}")
        self.chart.show_rows(self.rows, system, self._limit_K() if self.rows else None)
        self._update_state()

    def _limit_K(self) -> float | None:
        """The first stage's discharge-temperature limit in the document the study ran on [K]."""
        doc = self._doc or self.editor.model.doc
        first = (doc.get("stages") or [{}])[0]
        limit = first.get("max_discharge_temperature_K") if isinstance(first, dict) else None
        return limit if isinstance(limit, (int, float)) else None

    def _update_note(self) -> None:
        fallback = ""
        if not self.rows:
            try:
                fallback = staging_note(self.editor.model.normalised()["stages"])
            except (KeyError, IndexError, TypeError, AttributeError):
                pass
        self.note.setText(comparison_note(self.rows, fallback))

    def _messages(self) -> list[Message]:
        if self._failure is not None:  # shown until the project changes or the study runs again
            message, key = self._failure
            return [message] if key == study_key(self.editor.model.doc) else []
        if self.answer is None or self.is_stale or self._doc is None:
            return []
        ed, system = self.editor, self.editor.prefs.system
        out = []
        variable = self.answer["variable"]
        for i, case in enumerate(self.answer["cases"]):
            if case.get("error"):
                out.append(Message("warning", f"Staging study, {self.case.itemText(i)}: not solved: {case['error']}"))
        case = self._shown_case()
        if case:
            prefix = f"{self.case.currentText()}, " if variable else ""
            for sev, text, field in limit_messages(case["rows"], len(self._doc["stages"]), system,
                                                   gauge=ed.prefs.gauge, barometric_Pa=ed.barometric_Pa(),
                                                   prefix=prefix):
                out.append(Message(sev, text, field))
        return out

    def _publish(self, messages: list[Message]) -> None:
        if messages != self.messages:
            self.messages = messages
            self.messages_changed.emit("study", list(messages))

    # ---- state ---------------------------------------------------------------------------
    def _update_state(self) -> None:
        busy = self.controller.busy
        stale = self.is_stale
        can_apply, text, why = apply_state(self.table.selected_row(), self.answer, busy, stale)
        for key, on in (("train.study", not busy), ("train.study_cancel", busy), ("train.study_apply", can_apply),
                        ("train.study_keep_case", can_apply)):
            if key in self.action_map:
                self.action_map[key].setEnabled(on)
        if "train.study_apply" in self.action_map:
            act = self.action_map["train.study_apply"]
            act.setText(text)
            act.setToolTip(plain_tip(why))
            act.setStatusTip(why)
        self.controls.set_inputs_enabled(not busy)
        self.banner.setVisible(stale)
        self.table.set_stale(stale)
        self._publish(self._messages())

    def _show_case_row(self) -> None:
        on = bool(self.answer and self.answer["variable"] and len(self.answer["cases"]) > 0)
        self.case.setVisible(on)
        self.case_label.setVisible(on)

    def _set_status(self, text: str) -> None:
        self.controls.set_status(text)

    # ---- user input ----------------------------------------------------------------------
    def _on_case(self, _index: int) -> None:
        self.refresh()

    def _on_prefs(self) -> None:
        system = self.editor.prefs.system
        self.controls.show_units(system)
        if self.answer is not None:
            with signals_blocked(self.case):
                for i, case in enumerate(self.answer["cases"]):
                    self.case.setItemText(i, case_label(self.answer["variable"], case["value"], system))
        self.refresh()

    def _on_model_changed(self, path: str) -> None:
        if path == "" and not self.controller.busy:  # another document: its own default
            self.controls.suggest_stage_count()
        if self.answer is None and not (path == "year" or path.startswith("year.")):  # the note reads the stages
            self._update_note()
        self._update_state()
