"""The field-check panel: each result with its expanded uncertainty, the verdict on each
guaranteed figure, and the measured inputs with theirs.

It reads the project's ``field_check`` section (the uncertainty of each measured input and the
guaranteed figures, see docs/project-format.md) and runs the first-order propagation and the
Monte Carlo check off the GUI thread (:class:`~stagewright.gui.field_check.worker.FieldCheckRunner`), with
progress and cancel. The verdicts come first, in a line above the tables, because they are the
answer a facility engineer came for; the Results tab then gives every figure with its U.
"""
from __future__ import annotations

__all__ = ["FieldCheckPanel"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QHBoxLayout, QLabel, QPlainTextEdit, QProgressBar, QPushButton,
                               QTableWidget, QTableWidgetItem, QTabWidget, QVBoxLayout, QWidget)

from stagewright.gui.field_check.inputs_editor import InputsEditor
from stagewright.gui.field_check.worker import FieldCheckRunner
from stagewright.gui.presentation import uncertainty_table as ut
from stagewright.gui.widgets.result_table import result_table

RESULTS_TAB, GUARANTEES_TAB, INPUTS_TAB, NOTES_TAB = range(4)
_COLOURS = {"within": "#1b7f3b", "outside": "#b3261e", "not decidable": "#8a5a00"}


def _fill(table: QTableWidget, rows: list[list[str]], left: tuple = (0,)) -> None:
    table.setRowCount(len(rows))
    for r, row in enumerate(rows):
        for c, text in enumerate(row):
            item = QTableWidgetItem(text)
            item.setToolTip(text)  # long cells (the tolerance's source) are cut at the panel's width
            item.setTextAlignment((Qt.AlignLeft if c in left else Qt.AlignRight) | Qt.AlignVCenter)
            table.setItem(r, c, item)
    table.resizeColumnsToContents()


class FieldCheckPanel(QWidget):
    """Results with U (k = 2), verdicts on guarantees and measured inputs of the project's field check."""

    title = "Field check"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.runner = FieldCheckRunner(self)
        self.result: dict | None = None
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        row = QHBoxLayout()
        self.run_button = QPushButton("Evaluate uncertainty")
        self.run_button.setToolTip("First-order propagation through the solve, then the Monte Carlo check")
        self.cancel_button = QPushButton("Cancel")
        self.cancel_button.setEnabled(False)
        self.progress = QProgressBar()
        self.progress.setRange(0, 1000)
        self.progress.setVisible(False)
        self.status = QLabel()
        self.status.setWordWrap(True)
        for w in (self.run_button, self.cancel_button, self.progress):
            row.addWidget(w)
        row.addWidget(self.status, 1)
        lay.addLayout(row)
        self.verdict_line = QLabel()
        self.verdict_line.setObjectName("fieldCheckVerdicts")
        self.verdict_line.setWordWrap(True)
        self.verdict_line.setTextFormat(Qt.RichText)
        lay.addWidget(self.verdict_line)
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        self.figures_table = result_table(ut.FIGURE_COLUMNS)
        self.notes = QPlainTextEdit()
        self.notes.setObjectName("fieldCheckNotes")
        self.notes.setReadOnly(True)
        self.verdicts_table = result_table(ut.VERDICT_COLUMNS)
        self.inputs_table = result_table(ut.INPUT_COLUMNS)
        self.tabs.addTab(self.figures_table, "Results ± U")
        self.tabs.addTab(self.verdicts_table, "Guarantees")
        self.inputs_editor = InputsEditor(editor, self.inputs_table)
        self.tabs.addTab(self.inputs_editor, "Measured inputs")
        self.tabs.addTab(self.notes, "Contributors and method")
        lay.addWidget(self.tabs, 1)
        self.run_button.clicked.connect(self.run)
        self.cancel_button.clicked.connect(self.runner.cancel)
        self.runner.progress.connect(self._on_progress)
        self.runner.finished.connect(self._on_finished)
        self.runner.failed.connect(self._on_failed)
        self.runner.cancelled.connect(lambda _job, _partial, message: self._idle(message))
        editor.prefs.changed.connect(self.refresh)
        editor.model.changed.connect(self._on_project_changed)
        self._on_project_changed()
        self.refresh()

    # ---- running -------------------------------------------------------------------------
    def has_field_check(self) -> bool:
        from stagewright.core.uncertainty.presence import has_field_check  # no numpy while the window opens
        return has_field_check(self.editor.model.doc)  # reads only: no copy of a large year

    def run(self, draws: int | None = None) -> None:
        """Evaluate the project's field check (``draws`` overrides the project's Monte Carlo draws)."""
        if not self.has_field_check():
            return
        self.runner.run((self.editor.model.snapshot(), draws or None))
        self.run_button.setEnabled(False)
        self.cancel_button.setEnabled(True)
        self.progress.setValue(0)
        self.progress.setVisible(True)
        self.status.setText("First-order propagation…")

    def _on_progress(self, _job: int, fraction: float, message: str) -> None:
        self.progress.setValue(int(1000 * fraction))
        self.status.setText(message)

    def _on_finished(self, _job: int, result: dict, seconds: float) -> None:
        self.result = result
        mc = result.get("monte_carlo")
        self._idle(f"Evaluated in {seconds:.1f} s" + (f" ({mc['draws']} Monte Carlo draws)." if mc else
                                                       f"; {result.get('monte_carlo_note', '')}."))
        self.refresh()

    def _on_failed(self, _job: int, message: str, field: str) -> None:
        self._idle(self.editor.failure_text(message, field, self.runner.failure_detail))

    def _idle(self, text: str) -> None:
        self.run_button.setEnabled(self.has_field_check())
        self.cancel_button.setEnabled(False)
        self.progress.setVisible(False)
        self.status.setText(text)

    def _on_project_changed(self, path: str = "") -> None:
        if hasattr(self, "inputs_editor") and not _in_year(path):  # no measured input lies in the year
            self.inputs_editor.refresh()
        if not self.runner.busy:
            self.run_button.setEnabled(self.has_field_check())
        if not self.has_field_check():
            self.status.setText("This project states no measurement uncertainty. Give each measured input's "
                                "uncertainty in the project's field_check section (docs/project-format.md, "
                                "Field-check uncertainty).")
        elif self.result is not None:
            self.status.setText("The project changed since this evaluation: evaluate it again.")
        elif not self.runner.busy:
            self.status.setText("Evaluate to see each result with its expanded uncertainty and the verdict "
                                "on each guaranteed figure.")

    def shutdown(self) -> None:
        """Stop the worker (the window's closeEvent)."""
        self.runner.shutdown()

    # ---- showing -------------------------------------------------------------------------
    def refresh(self) -> None:
        """Tables and verdict line of the last evaluation, in the current unit system."""
        d, system = self.result, self.editor.prefs.system
        if d is None:
            for t in (self.figures_table, self.verdicts_table, self.inputs_table):
                t.setRowCount(0)
            self.notes.setPlainText("")
            self.verdict_line.setText("")
            return
        _fill(self.figures_table, ut.figure_rows(d, system), left=(0, 5))
        verdicts = ut.verdict_rows(d, system)
        _fill(self.verdicts_table, verdicts, left=(0, 4, 5))
        _fill(self.inputs_table, ut.input_rows(d, system), left=(0, 3))
        self.notes.setPlainText("\n".join(ut.notes(d)))
        parts = [f"{row[0]}: <b style='color:{_COLOURS[row[4]]}'>{row[4]}</b> ({row[3]})" for row in verdicts]
        self.verdict_line.setText("Guarantees — " + " · ".join(parts) if parts else "No guaranteed figures stated.")


def _in_year(path: str) -> bool:
    """True for a change inside the project's year profile (``year``, ``year.profile.bins[3].hours``)."""
    return path == "year" or path.startswith("year.")
