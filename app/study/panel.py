"""Staging study panel: 1 … N stages side by side, each at its least-power split, off the GUI
thread, with a chart of power and discharge temperature, and Apply to put an option into the
project as one undo step.

Controls on the left (most stages, hours, price, an optional site variable), the comparison
table and the staging chart on the right. The study runs in :class:`app.study.worker.StudyController`;
limits that decide a split, and options that miss their limits, go to the messages area.
"""
from __future__ import annotations

__all__ = ["StudyPanel"]

from PySide6.QtCore import QEvent, QSize, Qt, QTimer, Signal
from PySide6.QtGui import QColor
from PySide6.QtWidgets import (QAbstractItemView, QComboBox, QDockWidget, QDoubleSpinBox, QFormLayout,
                               QFrame, QHBoxLayout, QHeaderView, QLabel, QLineEdit, QProgressBar,
                               QScrollArea, QSizePolicy, QSpinBox, QSplitter, QStackedWidget,
                               QTableWidget, QTableWidgetItem, QTabWidget, QToolButton, QVBoxLayout, QWidget)

from thermo.study import DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS, MAX_STAGES
from thermo.study.options import staging_note

from app.presentation import units
from app.presentation.messages import error_text
from app.study.apply import apply_text, option_stages, study_key
from app.study.display import (COLUMNS, VARIABLES, case_label, cells, format_values, header, limit_messages,
                             parse_values, tooltip)
from app.study.job import StudyRequest
from app.study.ops import study_stage_count
from app.study.worker import StudyController
from app.widgets.signals_blocked import signals_blocked
from app.panels.messages_panel import Message

_INFEASIBLE = QColor("#8a96a3")
_SIDE_BY_SIDE_PX = 900  # table and chart side by side from this width, else on two tabs
_STUDY_INPUTS = ("max_stages", "operating_hours_per_year", "energy_price_per_kWh", "variable", "values")


class StudyPanel(QWidget):
    """The staging study of the open project.

    Signals
    -------
    messages_changed(source, messages)
        ``("study", [Message, ...])`` whenever the study's messages change (the window hands
        them to the messages area).
    shown_changed()
        The options shown changed (a new answer, another case, other units).
    stale_changed(stale)
        The project changed so that the study no longer describes it, or back.
    """

    title = "Staging study"
    messages_changed = Signal(str, object)
    shown_changed = Signal()  #: the rows shown (and so the chart) changed
    stale_changed = Signal(bool)  #: the study stopped (True) or started again (False) to fit the project

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.action_map: dict = {}
        self.controller = StudyController(self)
        self.answer: dict | None = None  # last answer (complete or cancelled part)
        self._doc: dict | None = None  # the document it was run on
        self._key = ""  # study_key of that document
        self._pending: tuple | None = None  # (doc, key) of the running job
        self._values_si: list[float] = []
        self._values_system = editor.prefs.system
        self.messages: list[Message] = []
        self._failure: tuple | None = None  # (message, study key) of a study that could not run
        self._was_stale = False
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
        lay.addWidget(self._controls(), 0)
        self.table = self._table()
        self.note = QLabel()  # how the options are built: always beside the numbers it explains
        self.note.setObjectName("footNote")
        self.note.setWordWrap(True)
        self.note.setSizePolicy(QSizePolicy.Ignored, QSizePolicy.Preferred)
        self.comparison = QWidget()
        cv = QVBoxLayout(self.comparison)
        cv.setContentsMargins(0, 0, 0, 0)
        cv.setSpacing(3)
        cv.addWidget(self.note)
        cv.addWidget(self.table, 1)
        self.chart_stack = QStackedWidget()
        self.chart_hint = QLabel("Run a study to see driver power and\ndischarge temperature against the\n"
                                 "number of stages.")
        self.chart_hint.setAlignment(Qt.AlignCenter)
        self.chart_hint.setObjectName("footNote")
        self.chart_stack.addWidget(self.chart_hint)
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
        lay.addLayout(right, 1)
        self._side_by_side = None
        self._split_sized = False
        self._arrange(True)
        self._show_case_row()
        self.figure = self.canvas = self.toolbar = None
        self._redraw = QTimer(self)  # the legend's columns follow the canvas width
        self._redraw.setSingleShot(True)
        self._redraw.setInterval(80)
        self._redraw.timeout.connect(self._draw_chart)

    def _arrange(self, side_by_side: bool) -> None:
        """Put the table and the chart side by side (a splitter) or on two tabs."""
        if side_by_side == self._side_by_side:
            return
        self._side_by_side = side_by_side
        self._split_sized = False
        if side_by_side:
            self.tabs.clear()
            self.splitter.addWidget(self.comparison)
            self.splitter.addWidget(self.chart_stack)
            self.splitter.setStretchFactor(0, 1)
            self.splitter.setStretchFactor(1, 1)
            self.results.setCurrentWidget(self.splitter)
            self.comparison.show()  # a widget taken from a hidden tab stays hidden otherwise
            self.chart_stack.show()
        else:
            self.tabs.addTab(self.comparison, "Comparison")
            self.tabs.addTab(self.chart_stack, "Chart")
            self.results.setCurrentWidget(self.tabs)

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        room = event.size().width() - self._controls_scroll.width()
        was = self._side_by_side and self._split_sized
        self._arrange(room >= _SIDE_BY_SIDE_PX)
        if self._side_by_side and not was:  # the table's wide size hint would take nearly all
            self.splitter.setSizes([int(room * 0.55), int(room * 0.45)])
            self._split_sized = True

    def _controls(self) -> QWidget:
        box = QWidget()
        col = QVBoxLayout(box)
        col.setContentsMargins(0, 0, 4, 0)
        col.setSpacing(3)
        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.AllNonFixedFieldsGrow)
        form.setVerticalSpacing(3)
        form.setHorizontalSpacing(6)
        self.max_stages = QSpinBox()
        self.max_stages.setRange(1, MAX_STAGES)
        self.max_stages.setValue(study_stage_count(self.editor.model.stage_count))
        self.max_stages.setToolTip(f"Compare 1 to this many stages (1 … {MAX_STAGES})")
        form.addRow("Up to stages", self.max_stages)
        self.hours = QDoubleSpinBox()
        self.hours.setRange(0.0, 8784.0)
        self.hours.setDecimals(0)
        self.hours.setSingleStep(100.0)
        self.hours.setValue(DEFAULT_OPERATING_HOURS)
        self.hours.setSuffix(" h/yr")
        self.hours.setToolTip("Operating hours per year, for the yearly saving")
        form.addRow("Operation", self.hours)
        self.price = QDoubleSpinBox()
        self.price.setRange(0.0, 1000.0)
        self.price.setDecimals(3)
        self.price.setSingleStep(0.01)
        self.price.setValue(DEFAULT_ENERGY_PRICE)
        self.price.setSuffix(" /kWh")
        self.price.setToolTip("Price of the driver's input energy per kWh, in your currency "
                              "(the default is a round figure: enter your own tariff)")
        form.addRow("Energy price", self.price)
        self.variable = QComboBox()
        self.variable.addItem("nothing", None)
        for key, (name, _) in VARIABLES.items():
            self.variable.addItem(name, key)
        self.variable.setToolTip("Repeat the study over several values of one site variable "
                                 "(summer and winter operation)")
        self.variable.currentIndexChanged.connect(self._on_variable)
        form.addRow("Vary site", self.variable)
        vals = QHBoxLayout()
        vals.setSpacing(4)
        self.values = QLineEdit()
        self.values.setPlaceholderText("e.g. 5, 20, 35")
        self.values.setToolTip("Values of the site variable, separated by commas, in the unit shown")
        self.values.textEdited.connect(self._on_values_edited)
        self.values_unit = QLabel()
        self.values_unit.setObjectName("unitLabel")
        vals.addWidget(self.values, 1)
        vals.addWidget(self.values_unit)
        self.values_label = QLabel("Values")
        form.addRow(self.values_label, vals)
        for w in (self.max_stages, self.hours, self.price, self.variable):
            w.setMaximumWidth(170)
        col.addLayout(form)
        self.buttons = QHBoxLayout()
        self.buttons.setSpacing(4)
        col.addLayout(self.buttons)
        self.progress = QProgressBar()
        self.progress.setRange(0, 1000)
        self.progress.setValue(0)
        self.progress.setTextVisible(True)
        self.progress.setFormat("%p%")
        self.progress.setMaximumHeight(16)
        col.addWidget(self.progress)
        self.status = QLabel("Not run yet.")
        self.status.setWordWrap(True)
        self.status.setObjectName("footNote")
        self.status.setSizePolicy(QSizePolicy.Ignored, QSizePolicy.Preferred)
        col.addWidget(self.status)
        col.addStretch(1)
        self.apply_row = QHBoxLayout()
        col.addLayout(self.apply_row)
        for w in (self.values, self.values_unit, self.values_label):
            w.setVisible(False)
        scroll = QScrollArea()
        scroll.setWidget(box)
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QFrame.NoFrame)
        scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        scroll.setFixedWidth(box.sizeHint().width() + 24)
        scroll.setSizePolicy(QSizePolicy.Fixed, QSizePolicy.Expanding)
        self._controls_scroll = scroll
        return scroll

    def _table(self) -> QTableWidget:
        t = QTableWidget(0, len(COLUMNS))
        t.setObjectName("studyTable")
        t.setEditTriggers(QAbstractItemView.NoEditTriggers)
        t.setSelectionBehavior(QAbstractItemView.SelectRows)
        t.setSelectionMode(QAbstractItemView.SingleSelection)
        t.setAlternatingRowColors(True)
        t.verticalHeader().setVisible(False)
        t.verticalHeader().setDefaultSectionSize(22)
        t.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeToContents)
        t.horizontalHeader().setStretchLastSection(True)
        t.setWordWrap(False)
        t.itemSelectionChanged.connect(self._update_state)
        for i, col in enumerate(COLUMNS):
            item = QTableWidgetItem()
            item.setToolTip(col.tip)
            t.setHorizontalHeaderItem(i, item)
        return t

    def set_actions(self, actions: dict) -> None:
        """Put the window's study actions (declared in app/window/actions.py) on the panel's buttons."""
        self.action_map = actions
        for key, row in (("train.study", self.buttons), ("train.study_cancel", self.buttons),
                         ("train.study_apply", self.apply_row)):
            if key in actions:
                b = QToolButton()
                b.setDefaultAction(actions[key])
                b.setToolButtonStyle(Qt.ToolButtonTextBesideIcon)
                b.setIconSize(QSize(18, 18))
                b.setSizePolicy(QSizePolicy.Expanding, QSizePolicy.Fixed)
                row.addWidget(b)
        self._controls_scroll.setFixedWidth(self._controls_scroll.widget().sizeHint().width() + 24)
        self._update_state()

    # ---- reading (tests) -----------------------------------------------------------------
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

    def cell_text(self, row: int, key: str) -> str:
        col = [c.key for c in COLUMNS].index(key)
        return self.table.item(row, col).text()

    def header_text(self, key: str) -> str:
        return self.table.horizontalHeaderItem([c.key for c in COLUMNS].index(key)).text()

    def select_option(self, stages: int) -> None:
        """Select the table row of the ``stages``-stage option."""
        for r, row in enumerate(self.rows):
            if row["stages"] == stages:
                self.table.selectRow(r)
                return
        raise KeyError(stages)

    def selected_row(self) -> dict | None:
        sel = self.table.selectionModel().selectedRows()
        if not sel or sel[0].row() >= len(self.rows):
            return None
        return self.rows[sel[0].row()]

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
        variable = self.variable.currentData()
        values: tuple = ()
        if variable:
            try:
                values = tuple(parse_values(self.values.text(), variable, ed.prefs.system))
            except ValueError as exc:
                self.values.setProperty("invalid", True)
                self._repolish(self.values)
                self._set_status(f"Values: {exc}.")
                self.values.setFocus()
                return
        doc = ed.model.snapshot()
        req = StudyRequest(doc, self.max_stages.value(), float(self.hours.value()), float(self.price.value()),
                           variable, values)
        self._pending = (doc, study_key(doc), variable, values)
        self._failure = None
        self.progress.setValue(0)
        self.controller.run(req)
        what = (f"{len(values)} value(s) of {VARIABLES[variable][0].lower()}, " if variable else "")
        self._set_status(f"Running: {what}1 to {req.max_stages} stages…")
        self._update_state()

    def cancel_study(self) -> None:
        """Stop the running study (handler of the "train.study_cancel" action)."""
        if self.controller.busy:
            self.controller.cancel()
            self._set_status("Cancelling…")

    def apply_selected(self) -> None:
        """Put the selected option into the project as one undo step ("train.study_apply")."""
        row = self.selected_row()
        if not self._can_apply(row):
            return
        stages = option_stages(self.editor.model.doc, row["pressure_ratios"], self.answer.get("first_efficiency"))
        if self.editor.set_values([("stages", stages)], apply_text(row["stages"])):
            self._set_status(f"Applied the {row['stages']}-stage option: Edit ▸ Undo restores the previous train.")

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
        self.progress.setValue(int(round(1000 * fraction)))
        if self._pending and self._pending[2] and fraction < 1.0:
            values = self._pending[3]
            k = min(int(fraction * len(values)), len(values) - 1)
            message = f"{case_label(self._pending[2], values[k], self.editor.prefs.system)}: " \
                      f"{message.rsplit(': ', 1)[-1]}"
        self._set_status(message[:1].upper() + message[1:] + "…" if fraction < 1.0 else message)

    def _on_finished(self, job: int, answer: dict, seconds: float) -> None:
        self.progress.setValue(1000)
        self._accept(answer)
        n = sum(len(c["rows"]) for c in answer["cases"])
        self._set_status(f"Compared {n} option(s) in {seconds:.1f} s." + self._best_text())

    def _on_cancelled(self, job: int, answer: dict, message: str) -> None:
        self._accept(answer)
        self._set_status(f"Cancelled: {message[:1].upper() + message[1:]}." if answer["cases"]
                         else "Cancelled before the first option was finished.")

    def _on_failed(self, job: int, message: str, field: str) -> None:
        key = self._pending[1] if self._pending else ""
        self._pending = None
        self.answer, self._doc, self._key = None, None, ""
        self.progress.setValue(0)
        ed = self.editor
        message = error_text(message, field, self.controller.failure_detail, ed.model.doc, ed.prefs.system,
                             gauge=ed.prefs.gauge, barometric_Pa=ed.barometric_Pa())
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
        for i, col in enumerate(COLUMNS):
            self.table.horizontalHeaderItem(i).setText(header(col, system))
        self._update_note()
        rows = self.rows
        selected = self.selected_row()
        keep = selected["stages"] if selected else None
        self.table.blockSignals(True)
        self.table.setRowCount(len(rows))
        best = self._best_row(rows)
        for r, row in enumerate(rows):
            texts = cells(row, system)
            for c, col in enumerate(COLUMNS):
                item = self.table.item(r, c)
                if item is None:
                    item = QTableWidgetItem()
                    self.table.setItem(r, c, item)
                item.setText(texts[col.key])
                item.setToolTip(tooltip(row, col.key, system))
                left = col.key in ("ratios", "temperatures", "limits", "feasible")
                item.setTextAlignment((Qt.AlignLeft if left else Qt.AlignRight) | Qt.AlignVCenter)
                font = item.font()
                font.setBold(r == best)
                item.setFont(font)
                if not row["feasible"]:
                    item.setForeground(_INFEASIBLE)
                else:
                    item.setData(Qt.ForegroundRole, None)
        self.table.blockSignals(False)
        if rows:
            want = keep if keep is not None else (rows[best]["stages"] if best is not None else None)
            target = next((i for i, row in enumerate(rows) if row["stages"] == want), None)
            if target is not None:
                self.table.selectRow(target)
        case = self._shown_case()
        if case and case.get("error"):
            self._set_status(f"{self.case.currentText()}: not solved: {case['error']}")
        self._draw_chart()
        self._update_state()
        self.shown_changed.emit()

    @staticmethod
    def _best_row(rows: list[dict]) -> int | None:
        ok = [i for i, r in enumerate(rows) if r["feasible"] and r.get("driver_power_W") is not None]
        return min(ok, key=lambda i: rows[i]["driver_power_W"]) if ok else None

    def _update_note(self) -> None:
        rows = self.rows
        if rows:
            note = rows[0]["note"]
        else:
            try:
                note = staging_note(self.editor.model.normalised()["stages"])
            except (KeyError, IndexError, TypeError, AttributeError):
                note = ""
        savings = ""
        if rows:
            base = next((r for r in rows if r["feasible"]), None)
            if base is not None:
                savings = (f" Savings are against the {base['stages']}-stage option, the fewest stages that "
                           "meet every limit.")
        self.note.setText(note + savings)

    def _draw_chart(self) -> None:
        rows = self.rows
        if not rows:
            self.chart_stack.setCurrentWidget(self.chart_hint)
            return
        if self.canvas is None:
            from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
            from matplotlib.figure import Figure
            holder = QWidget()
            v = QVBoxLayout(holder)
            v.setContentsMargins(0, 0, 0, 0)
            v.setSpacing(0)
            self.figure = Figure(figsize=(4.5, 3.0))
            self.canvas = FigureCanvasQTAgg(self.figure)
            self.canvas.setMinimumSize(240, 160)
            self.canvas.installEventFilter(self)
            self.toolbar = NavigationToolbar2QT(self.canvas, holder)
            self.toolbar.setIconSize(QSize(16, 16))
            v.addWidget(self.toolbar)
            v.addWidget(self.canvas, 1)
            self.chart_stack.addWidget(holder)
            self._chart_holder = holder
        from app.charts import draw_staging_chart
        doc = self._doc or self.editor.model.doc
        first = (doc.get("stages") or [{}])[0]
        limit = first.get("max_discharge_temperature_K") if isinstance(first, dict) else None
        draw_staging_chart(self.figure, rows, self.editor.prefs.system,
                           limit_K=limit if isinstance(limit, (int, float)) else None, title=None)
        self.canvas.draw_idle()
        self.chart_stack.setCurrentWidget(self._chart_holder)

    def eventFilter(self, obj, event) -> bool:
        if obj is self.canvas and event.type() == QEvent.Resize and self.rows:
            self._redraw.start()
        return super().eventFilter(obj, event)

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
    def _can_apply(self, row: dict | None) -> bool:
        return bool(row is not None and self.answer is not None and not self.controller.busy
                    and not self.is_stale and not self.answer["variable"] and row["feasible"]
                    and row.get("pressure_ratios"))

    def _update_state(self) -> None:
        busy = self.controller.busy
        row = self.selected_row()
        can_apply = self._can_apply(row)
        for key, on in (("train.study", not busy), ("train.study_cancel", busy), ("train.study_apply", can_apply)):
            if key in self.action_map:
                self.action_map[key].setEnabled(on)
        if "train.study_apply" in self.action_map:
            act = self.action_map["train.study_apply"]
            act.setText(f"Apply {row['stages']}-stage option" if row else "Apply selected option")
            if self.answer is not None and self.answer["variable"]:
                why = "Apply works on a study at the project's own site (Vary site: nothing)."
            elif self.is_stale:
                why = "The project changed since the study ran: run it again to apply an option."
            elif row is not None and not row["feasible"]:
                why = "This option does not meet its limits, so it is not a design."
            else:
                why = "Put the selected option's stages and pressure ratios into the project (one undo step)."
            act.setToolTip(why)
            act.setStatusTip(why)
        for w in (self.max_stages, self.hours, self.price, self.variable, self.values):
            w.setEnabled(not busy)
        stale = self.is_stale
        if stale != self._was_stale:
            self._was_stale = stale
            self.stale_changed.emit(stale)
        self.banner.setVisible(stale)
        self.table.setProperty("stale", stale)
        self._repolish(self.table)
        self._publish(self._messages())

    def _show_values_row(self, on: bool) -> None:
        for w in (self.values, self.values_unit, self.values_label):
            w.setVisible(on)
        self._show_case_row()

    def _show_case_row(self) -> None:
        on = bool(self.answer and self.answer["variable"] and len(self.answer["cases"]) > 0)
        self.case.setVisible(on)
        self.case_label.setVisible(on)

    def _set_status(self, text: str) -> None:
        self.status.setText(text)

    @staticmethod
    def _repolish(w) -> None:
        w.style().unpolish(w)
        w.style().polish(w)

    # ---- user input ----------------------------------------------------------------------
    def _on_variable(self, _index: int) -> None:
        variable = self.variable.currentData()
        self._show_values_row(bool(variable))
        if variable:
            self.values_unit.setText(units.unit(VARIABLES[variable][1], self.editor.prefs.system).symbol)
            if not self.values.text().strip():
                self._values_si = self._suggested_values(variable)
                self.values.setText(format_values(self._values_si, variable, self.editor.prefs.system))
            self._values_system = self.editor.prefs.system

    def _suggested_values(self, variable: str) -> list[float]:
        """A start for the values: the project's own value and a cooler and a warmer one."""
        site = self.editor.model.normalised().get("site", {}) or {}
        if variable == "ambient_temperature_K":
            t = float(site.get("ambient_temperature_K", 293.15))
            return [max(223.15, t - 15.0), t, min(333.15, t + 15.0)]
        rh = float(site.get("relative_humidity", 0.0) or 0.0)
        return sorted({0.3, round(rh, 4), 0.9})

    def _on_values_edited(self, _text: str) -> None:
        if self.values.property("invalid"):
            self.values.setProperty("invalid", False)
            self._repolish(self.values)

    def _on_case(self, _index: int) -> None:
        self.refresh()

    def _on_prefs(self) -> None:
        system = self.editor.prefs.system
        variable = self.variable.currentData()
        if variable and system != self._values_system:
            try:  # show the same values in the new unit
                si = parse_values(self.values.text(), variable, self._values_system)
                self.values.setText(format_values(si, variable, system))
            except ValueError:
                pass
            self.values_unit.setText(units.unit(VARIABLES[variable][1], system).symbol)
        self._values_system = system
        if self.answer is not None:
            with signals_blocked(self.case):
                for i, case in enumerate(self.answer["cases"]):
                    self.case.setItemText(i, case_label(self.answer["variable"], case["value"], system))
        self.refresh()

    def _on_model_changed(self, path: str) -> None:
        if path == "" and not self.controller.busy:  # another document: its own default
            self.max_stages.setValue(study_stage_count(self.editor.model.stage_count))
        if self.answer is None:
            self._update_note()
        self._update_state()
