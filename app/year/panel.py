"""The year-at-site panel: edit the project's year profile, and run it month by month (or bin
by bin) off the GUI thread."""
from __future__ import annotations

__all__ = ["YearPanel", "YEAR_COLUMNS"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QHBoxLayout, QLabel, QProgressBar, QPushButton, QSplitter, QTableWidget,
                               QTableWidgetItem, QTabWidget, QVBoxLayout, QWidget)

from app.presentation import units, year_tables
from app.presentation.figures import shown
from app.widgets.table_copy import attach_table_copy
from app.year.worker import YearRunner
from app.year.editor import YearEditor

#: the year table's columns: the figures of app.presentation.year_tables.YEAR_BINS the window shows
#: (as the table stood at import; the panel reads it afresh when built)
YEAR_COLUMNS = tuple(shown(year_tables.YEAR_BINS, "window"))


class YearPanel(QWidget):
    """Edits the project's ``year`` (Profile tab), runs :func:`thermo.year.run_year` on it and
    shows each bin and the chart (Results tab)."""

    title = "Year at site"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.runner = YearRunner(self)
        self.result: dict | None = None
        self._canvas = None
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        row = QHBoxLayout()
        self.run_button = QPushButton("Run year")
        self.cancel_button = QPushButton("Cancel")
        self.cancel_button.setEnabled(False)
        self.progress = QProgressBar()
        self.progress.setTextVisible(True)
        self.progress.setVisible(False)  # an empty bar before the first run reads as a broken widget
        self.status = QLabel()
        self.status.setWordWrap(True)
        for w in (self.run_button, self.cancel_button, self.progress):
            row.addWidget(w)
        row.addWidget(self.status, 1)
        lay.addLayout(row)
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        self.profile_editor = YearEditor(editor)
        self.tabs.addTab(self.profile_editor, "Profile")
        results = QWidget()
        rlay = QVBoxLayout(results)
        rlay.setContentsMargins(0, 4, 0, 0)
        self.split = QSplitter(Qt.Horizontal)
        self._columns = shown(year_tables.YEAR_BINS, "window")
        self.table = QTableWidget(0, len(self._columns))
        self.table.verticalHeader().setVisible(False)
        self.table.verticalHeader().setDefaultSectionSize(self.table.fontMetrics().height() + 8)
        self.table.setEditTriggers(QTableWidget.NoEditTriggers)
        attach_table_copy(self.table)  # Ctrl+C and Copy table: tab-separated text for a spreadsheet
        self.split.addWidget(self.table)
        self.chart_box = QWidget()
        QVBoxLayout(self.chart_box).setContentsMargins(0, 0, 0, 0)
        self.split.addWidget(self.chart_box)
        self.chart_box.setMinimumWidth(320)
        self.split.setStretchFactor(0, 1)
        self.split.setStretchFactor(1, 1)
        self.split.setChildrenCollapsible(False)
        rlay.addWidget(self.split, 1)
        self.totals = QLabel()
        self.totals.setWordWrap(True)
        rlay.addWidget(self.totals)
        self.tabs.addTab(results, "Results")
        lay.addWidget(self.tabs, 1)
        self.run_button.clicked.connect(self.run)
        self.cancel_button.clicked.connect(self.runner.cancel)
        self.runner.progress.connect(self._on_progress)
        self.runner.finished.connect(self._on_finished)
        self.runner.failed.connect(self._on_failed)
        editor.prefs.changed.connect(self.refresh)
        editor.result_changed.connect(self._on_project_changed)
        editor.model.changed.connect(lambda _path: self._on_project_changed())
        self.profile_editor.refused.connect(lambda _m: self.tabs.setCurrentIndex(0))
        self._on_project_changed()

    # ---- running -------------------------------------------------------------------------
    def has_profile(self) -> bool:
        return bool(self.editor.model.snapshot().get("year"))

    def run(self) -> None:
        if not self.has_profile():
            return
        self.runner.run(self.editor.model.snapshot())
        self.run_button.setEnabled(False)
        self.cancel_button.setEnabled(True)
        self.progress.setValue(0)
        self.progress.setVisible(True)
        self.status.setText("Running…")

    def _on_progress(self, _job: int, done: int, total: int) -> None:
        self.progress.setMaximum(total)
        self.progress.setValue(done)

    def _on_finished(self, _job: int, result: dict, _seconds: float) -> None:
        self.result = result
        self._idle("Year solved.")
        self.tabs.setCurrentIndex(1)  # shown before drawing: the chart lays out at its real size
        self.refresh()

    def _on_failed(self, _job: int, message: str, _field: str) -> None:
        self._idle(message)

    def _idle(self, text: str) -> None:
        self.run_button.setEnabled(self.has_profile())
        self.cancel_button.setEnabled(False)
        self.status.setText(text)

    def _on_project_changed(self) -> None:
        if not self.runner.busy:
            self.run_button.setEnabled(self.has_profile())
        if not self.has_profile():
            self.status.setText("This project has no year profile: start one from the site "
                                "in the Profile tab.")
        elif self.result is not None:
            self.status.setText("The project changed since this year was run: run it again.")
        elif not self.runner.busy:
            self.status.setText("Run the year to see each month's energy, condensate and temperatures.")

    # ---- showing -------------------------------------------------------------------------
    def refresh(self) -> None:
        system = self.editor.prefs.system
        heads = []
        for fig in self._columns:
            sym = fig.symbol_in("window", system)
            heads.append(f"{fig.label_in('window')}\n[{sym}]" if sym else f"{fig.label_in('window')}\n")
        self.table.setHorizontalHeaderLabels(heads)
        if self.result is None:
            self.table.setRowCount(0)
            return
        bins = self.result["bins"]
        self.table.setRowCount(len(bins))
        for row, b in enumerate(bins):
            for col, fig in enumerate(self._columns):
                item = QTableWidgetItem(fig.text(b, "window", system))
                item.setTextAlignment((Qt.AlignLeft if fig.is_left_aligned() else Qt.AlignRight) | Qt.AlignVCenter)
                self.table.setItem(row, col, item)
        self.table.resizeColumnsToContents()
        self._give_chart_the_rest()
        t = self.result["totals"]
        worst = self.result["worst_discharge_temperature"]
        self.totals.setText(
            f"Energy {units.format_value(t.get('energy_kWh', 0.0) * 3.6e6, 'energy', system, with_unit=True)} · "
            f"condensate {units.format_value(t.get('condensate_m3'), 'liquid_volume', system, with_unit=True)} · "
            f"hottest discharge {units.format_value(worst['temperature_K'], 'temperature', system, with_unit=True)}"
            f" in {worst['bin']}")
        self._draw(system)

    def _give_chart_the_rest(self) -> None:
        """Size the table to its columns (at most 60 % of the width) and give the chart the rest:
        the table's size hint alone would take nearly all of a wide window."""
        total = sum(self.split.sizes())
        if total <= 0:
            return
        need = (self.table.horizontalHeader().length() + self.table.verticalScrollBar().sizeHint().width()
                + 2 * self.table.frameWidth() + 4)
        table = min(need, int(0.6 * total), total - self.chart_box.minimumWidth())
        if table > 0:
            self.split.setSizes([table, total - table])

    def _draw(self, system: str) -> None:
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
        from matplotlib.figure import Figure

        from app.charts.year_chart import draw_year_chart
        if self._canvas is None:
            self._canvas = FigureCanvasQTAgg(Figure(figsize=(5, 3), dpi=100))
            self.chart_box.layout().addWidget(self._canvas)
        draw_year_chart(self._canvas.figure, self.result, system)
        self._canvas.draw_idle()
