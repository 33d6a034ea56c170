"""The Cases panel: the project's cases, the one being edited, and cases compared side by side.

Left: the list of cases (the base first, marked); choosing one shows it in every panel and the
edits go into it. New case (a copy of the one shown), Rename, Remove and Make base are each one
undo step (:class:`stagewright.gui.window.commands.ReplaceProject`). Right: Compare solves the chosen cases
(all when none is chosen) off the GUI thread (progress, cancel) and shows a table — a row per
figure, a column per case, each value with its difference from the reference case below it,
a case with warnings marked — and bar charts side by side.
"""
from __future__ import annotations

__all__ = ["CasesPanel"]

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QFont
from PySide6.QtWidgets import (QAbstractItemView, QComboBox, QGridLayout, QHBoxLayout, QInputDialog, QLabel, QListWidget,
                               QListWidgetItem, QProgressBar, QPushButton, QSplitter, QTableWidget,
                               QTableWidgetItem, QTabWidget, QVBoxLayout, QWidget)

from stagewright.core.errors import StagewrightError
from stagewright.core.project import cases as project_cases

from stagewright.gui.cases.worker import CompareRunner
from stagewright.gui.presentation.compare_table import CASE_FIGURES, case_row, difference_text, flags
from stagewright.gui.presentation.figures import condition_holds, shown
from stagewright.gui.widgets.table_copy import attach_table_copy

_OUT = "window"
_WARN = QColor("#fbeed5")  # a case with warnings or a failure: a pale amber header


class CasesPanel(QWidget):
    """Cases of the project: choose, add, rename, remove, make base; compare."""

    title = "Cases"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.model = editor.model
        self.outcomes: list | None = None
        self.runner = CompareRunner(self)
        self.runner.progress.connect(self._on_progress)
        self.runner.finished.connect(self._on_finished)
        self.runner.cancelled.connect(self._on_cancelled)
        self.runner.failed.connect(self._on_failed)
        self._build()
        self.model.cases_changed.connect(self.refresh)
        self.model.changed.connect(self._on_edit)
        editor.prefs.changed.connect(self._show_results)
        self.refresh()

    # ---- layout ----------------------------------------------------------------------------
    def _build(self) -> None:
        left = QWidget()
        lv = QVBoxLayout(left)
        lv.setContentsMargins(0, 0, 0, 0)
        intro = QLabel("The case chosen here is shown and edited in every panel.")
        intro.setWordWrap(True)
        lv.addWidget(intro)
        self.case_list = QListWidget()
        self.case_list.setSelectionMode(QAbstractItemView.SingleSelection)
        self.case_list.currentRowChanged.connect(self._on_row)
        lv.addWidget(self.case_list, 1)
        buttons = QGridLayout()
        self.new_button = QPushButton("New case")
        self.new_button.setToolTip("A new case, a copy of the case shown; edit it to make it differ")
        self.rename_button = QPushButton("Rename…")
        self.remove_button = QPushButton("Remove")
        self.remove_button.setToolTip("Remove the case shown (the base cannot be removed)")
        self.base_button = QPushButton("Make base")
        self.base_button.setToolTip("Make the case shown the base design; every other case keeps its design")
        for i, (b, fn) in enumerate(((self.new_button, self.new_case), (self.rename_button, self.rename_case),
                                     (self.remove_button, self.remove_case), (self.base_button, self.make_base))):
            b.clicked.connect(lambda _=False, fn=fn: fn())
            buttons.addWidget(b, i // 2, i % 2)
        lv.addLayout(buttons)

        right = QWidget()
        rv = QVBoxLayout(right)
        rv.setContentsMargins(0, 0, 0, 0)
        bar = QHBoxLayout()
        self.compare_button = QPushButton("Compare cases")
        self.compare_button.setToolTip("Solve every case (and its year, if any) and show them side by side")
        self.compare_button.clicked.connect(self.compare)
        self.cancel_button = QPushButton("Cancel")
        self.cancel_button.clicked.connect(self.runner.cancel)
        self.cancel_button.setEnabled(False)
        bar.addWidget(self.compare_button)
        bar.addWidget(self.cancel_button)
        bar.addWidget(QLabel("Reference:"))
        self.reference = QComboBox()
        self.reference.setToolTip("Differences are shown against this case")
        self.reference.currentIndexChanged.connect(lambda _i: self._show_results())
        bar.addWidget(self.reference)
        self.progress = QProgressBar()
        self.progress.setVisible(False)
        bar.addWidget(self.progress, 1)
        rv.addLayout(bar)
        self.status = QLabel("Compare the cases to see them side by side.")
        self.status.setObjectName("footNote")
        self.status.setWordWrap(True)
        rv.addWidget(self.status)
        self._pending: dict = {}  # chart name -> what to draw when its tab shows (see _draw)
        self.tabs = QTabWidget()
        self.tabs.currentChanged.connect(self._draw_shown)  # a chart marked while hidden is drawn now
        self.table = QTableWidget(0, 0)
        self.table.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.table.setWordWrap(True)
        attach_table_copy(self.table)
        self.tabs.addTab(self.table, "Figures")
        self.chart_holder = QWidget()
        QVBoxLayout(self.chart_holder).setContentsMargins(0, 0, 0, 0)
        self.canvas = None
        self.tabs.addTab(self.chart_holder, "Chart")
        self.paths_holder = QWidget()
        QVBoxLayout(self.paths_holder).setContentsMargins(0, 0, 0, 0)
        self.paths_canvas = None
        self.tabs.addTab(self.paths_holder, "T–s paths")
        rv.addWidget(self.tabs, 1)

        split = QSplitter(Qt.Horizontal)
        split.addWidget(left)
        split.addWidget(right)
        split.setStretchFactor(0, 0)
        split.setStretchFactor(1, 1)
        split.setSizes([230, 900])  # the list needs the width of a name; the table takes the rest
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(split)

    # ---- the list --------------------------------------------------------------------------
    def refresh(self) -> None:
        """Show the project's cases and which one is being edited."""
        names = self.model.case_names()
        self.case_list.blockSignals(True)
        self.case_list.clear()
        for i, name in enumerate(names):
            item = QListWidgetItem(f"{name}   (base)" if i == 0 else name)
            item.setData(Qt.UserRole, name)
            if name == self.model.active_case:
                font = QFont(item.font())
                font.setBold(True)
                item.setFont(font)
            self.case_list.addItem(item)
        self.case_list.setCurrentRow(names.index(self.model.active_case))
        self.case_list.blockSignals(False)
        self.remove_button.setEnabled(not self.model.is_base_active)
        self.base_button.setEnabled(not self.model.is_base_active)
        current = self.reference.currentText()
        self.reference.blockSignals(True)
        self.reference.clear()
        self.reference.addItems(names)
        self.reference.setCurrentIndex(names.index(current) if current in names else 0)
        self.reference.blockSignals(False)

    def _on_row(self, row: int) -> None:
        item = self.case_list.item(row)
        if item is not None:
            self.model.activate(item.data(Qt.UserRole))

    def _apply(self, operation, args: tuple, show: str | None, text: str) -> None:
        """``operation(project, *args)`` (a :mod:`stagewright.core.project.cases` function) as one undo
        step showing case ``show``; a refusal is said in the status line and nothing changes."""
        try:
            new = operation(self.model.project_snapshot(), *args)
        except StagewrightError as exc:
            self.status.setText(f"Not done: {getattr(exc, 'problem', None) and exc.problem.expected or exc}.")
            return
        self.editor.replace_project(new, show, text)

    def _ask_name(self, title: str, start: str) -> str | None:
        name, ok = QInputDialog.getText(self, title, "Case name:", text=start)
        return name.strip() if ok and name.strip() else None

    def new_case(self, name: str | None = None) -> None:
        """Add a case: a copy of the case shown (``name`` given: no question)."""
        shown_case = self.model.active_case
        start = project_cases.unique_name(self.model.project_snapshot(), f"{shown_case} variant")
        name = name or self._ask_name("New case", start)
        if name:
            self._apply(project_cases.duplicate_case, (shown_case, name), name, f"New case {name}")

    def rename_case(self, name: str | None = None) -> None:
        old = self.model.active_case
        name = name or self._ask_name("Rename case", old)
        if name and name != old:
            self._apply(project_cases.rename_case, (old, name), name, f"Rename case {old} to {name}")

    def remove_case(self) -> None:
        name = self.model.active_case
        self._apply(project_cases.remove_case, (name,), None, f"Remove case {name}")

    def make_base(self) -> None:
        name = self.model.active_case
        self._apply(project_cases.make_base, (name,), None, f"Make {name} the base")

    # ---- comparing -------------------------------------------------------------------------
    def compare(self) -> None:
        """Solve every case side by side (off the GUI thread)."""
        doc = self.model.project_snapshot()
        problems = self.model.project_problems()
        if problems:
            self.status.setText(f"The project has {len(problems)} input problem(s) (see Messages); fix them "
                                "to compare its cases.")
            return
        self.progress.setRange(0, len(self.model.case_names()))
        self.progress.setValue(0)
        self.progress.setVisible(True)
        self.compare_button.setEnabled(False)
        self.cancel_button.setEnabled(True)
        self.status.setText("Comparing the cases…")
        self.runner.run((doc, None))

    def _idle(self, text: str) -> None:
        self.progress.setVisible(False)
        self.compare_button.setEnabled(True)
        self.cancel_button.setEnabled(False)
        self.status.setText(text)

    def _on_progress(self, _job: int, done: int, total: int) -> None:
        self.progress.setRange(0, total)
        self.progress.setValue(done)

    def _on_finished(self, _job: int, outcomes: list, seconds: float) -> None:
        self.outcomes = outcomes
        failed = [o.name for o in outcomes if o.result is None]
        self._idle(f"{len(outcomes)} cases compared in {seconds:.1f} s"
                   + (f"; not solved: {', '.join(failed)}" if failed else "") + ".")
        self._show_results()

    def _on_cancelled(self, _job: int, outcomes: list, message: str) -> None:
        self.outcomes = outcomes or None
        self._idle(message[0].upper() + message[1:] + ".")
        self._show_results()

    def _on_failed(self, _job: int, message: str, _field: str) -> None:
        self._idle(f"The comparison stopped: {message}")

    def _on_edit(self, _path: str) -> None:
        if self.outcomes is not None and not self.status.text().startswith("Out of date"):
            self.status.setText("Out of date: the project changed since the comparison. Compare again.")

    # ---- showing ---------------------------------------------------------------------------
    def _show_results(self) -> None:
        outcomes = self.outcomes or []
        system = self.editor.prefs.system
        reference = next((o for o in outcomes if o.name == self.reference.currentText()),
                         outcomes[0] if outcomes else None)
        rows = [case_row(o.result, o.year) for o in outcomes]
        figures = [f for f in shown(CASE_FIGURES, _OUT)
                   if any(o.result is not None and condition_holds(f, _OUT, r) and f.value(r) is not None
                          for o, r in zip(outcomes, rows))]
        self.table.clear()
        self.table.setRowCount(len(figures) + 1)
        self.table.setColumnCount(len(outcomes))
        self.table.setHorizontalHeaderLabels([o.name for o in outcomes])
        labels = []
        for f in figures:
            sym = f.symbol_in(_OUT, system)
            labels.append(f"{f.label_in(_OUT)} [{sym}]" if sym else f.label_in(_OUT))
        self.table.setVerticalHeaderLabels(labels + ["Notes"])
        ref_row = case_row(reference.result, reference.year) if reference is not None else {}
        for c, (o, row) in enumerate(zip(outcomes, rows)):
            for r, f in enumerate(figures):
                text = f.text(row, _OUT, system) if o.result is not None else "—"
                if o is not reference and o.result is not None and reference is not None and reference.result:
                    delta = difference_text(f, row, ref_row, _OUT, system)
                    text += f"\n{delta}" if delta else ""
                item = QTableWidgetItem(text)
                item.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter)
                self.table.setItem(r, c, item)
            notes = flags(o.result, o.error)
            note_item = QTableWidgetItem("; ".join(notes) if notes else "no warnings")
            if notes:
                note_item.setBackground(QBrush(_WARN))
                self.table.horizontalHeaderItem(c).setBackground(QBrush(_WARN))
                note_item.setToolTip("\n".join(w.get("message", "") for w in (o.result or {}).get("warnings") or [])
                                     or o.error)
            self.table.setItem(len(figures), c, note_item)
        self.table.resizeColumnsToContents()
        self.table.resizeRowsToContents()
        self._draw(outcomes, reference.name if reference is not None else "", system)

    @staticmethod
    def _canvas(holder: QWidget, size: tuple[float, float]):
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
        from matplotlib.figure import Figure
        canvas = FigureCanvasQTAgg(Figure(figsize=size, dpi=100))
        canvas.setMinimumSize(320, 160)
        holder.layout().addWidget(canvas)
        return canvas

    def _draw(self, outcomes: list, reference: str, system: str) -> None:
        """Draw the comparison charts, each when its tab is on screen: a hidden chart is only marked
        to be drawn (:meth:`_draw_shown` draws it when its tab or the panel shows), so a change of
        units or an edit elsewhere does not redraw charts nobody sees (matplotlib: ~0.1 s each)."""
        self._pending = {"chart": (outcomes, reference, system), "paths": (outcomes, reference, system)}
        self._draw_shown()

    def _draw_shown(self, *_args) -> None:
        pending = self._pending
        if not pending:
            return
        from stagewright.gui.charts.case_chart import draw_case_comparison
        from stagewright.gui.charts.case_ts_chart import draw_case_paths
        for name, holder, draw, size in (("chart", self.chart_holder, draw_case_comparison, (9, 2.6)),
                                         ("paths", self.paths_holder, draw_case_paths, (9, 3.2))):
            if name not in pending or not holder.isVisible():
                continue
            outcomes, reference, system = pending.pop(name)
            attr = "canvas" if name == "chart" else "paths_canvas"
            canvas = getattr(self, attr)
            if canvas is None:
                canvas = self._canvas(holder, size)
                setattr(self, attr, canvas)
            canvas.figure.clear()
            draw(canvas.figure, outcomes, reference, system)
            canvas.draw_idle()

    def showEvent(self, event) -> None:  # noqa: N802 (Qt's name)
        super().showEvent(event)
        self._draw_shown()

    def shutdown(self) -> None:
        self.runner.shutdown()
