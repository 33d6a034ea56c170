"""The package panel's results: the package figures, the data sheet and the part-load chart (tabs).

Every number is a row of :mod:`stagewright.gui.presentation.package_table` for the ``"window"`` output (the
text output, the report and the CSV read the same rows). The chart is drawn on a matplotlib
canvas made on first use.
"""
from __future__ import annotations

__all__ = ["PackageResults", "FIGURES_TAB", "YEAR_TAB", "SHEET_TAB", "CHART_TAB"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QFrame, QLabel, QScrollArea, QStackedWidget, QTableWidget,
                               QTableWidgetItem, QTabWidget, QVBoxLayout, QWidget)

from stagewright.gui.presentation import package_table as pt
from stagewright.gui.presentation.cautions import package_cautions
from stagewright.gui.widgets.plain_text import plain_label, plain_tip
from stagewright.gui.widgets.result_table import result_table

FIGURES_TAB, YEAR_TAB, SHEET_TAB, CHART_TAB = range(4)
_OUT = "window"


def _fill(table: QTableWidget, heads: list[str], rows: list[list[str]], left: tuple = (0,),
          tips: list[str] | None = None) -> None:
    table.setColumnCount(len(heads))
    table.setHorizontalHeaderLabels(heads)
    table.setRowCount(len(rows))
    for r, row in enumerate(rows):
        for c, text in enumerate(row):
            item = QTableWidgetItem(text)
            item.setTextAlignment((Qt.AlignLeft if c in left else Qt.AlignRight) | Qt.AlignVCenter)
            if tips and c == 0 and tips[r]:
                item.setToolTip(tips[r])
            table.setItem(r, c, item)
    table.resizeColumnsToContents()


def _note(name: str) -> QLabel:
    label = plain_label(QLabel())
    label.setObjectName(name)
    label.setWordWrap(True)
    return label


def _scrolled(page: QWidget) -> QScrollArea:
    """``page`` in a scroll area: its wrapped notes never make the docked panel (and so the window)
    taller than the user sized it."""
    area = QScrollArea()
    area.setWidgetResizable(True)
    area.setFrameShape(QFrame.NoFrame)
    area.setWidget(page)
    return area


class PackageResults(QTabWidget):
    """``show_package(pkg, system)`` fills the Figures and Chart tabs; ``show_sheet(sheet, system, note)``
    the Data sheet tab (None: the note alone)."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.setDocumentMode(True)
        figures = QWidget()
        lay = QVBoxLayout(figures)
        lay.setContentsMargins(2, 2, 2, 2)
        self.control_line = _note("packageControl")
        self.points = result_table(name="packagePoints")
        self.annual = result_table(name="packageAnnual")
        self.notes = _note("footNote")
        self.cautions = _note("packageCautions")
        lay.addWidget(self.control_line)
        lay.addWidget(self.points, 1)
        lay.addWidget(self.notes)
        lay.addWidget(self.cautions)
        sheet = QWidget()
        lay = QVBoxLayout(sheet)
        lay.setContentsMargins(2, 2, 2, 2)
        self.sheet_status = _note("packageSheetStatus")
        self.conditions = _note("sheetConditions")
        self.sheet = result_table(name="sheetLoads")
        self.sheet_notes = _note("footNote")
        for w, stretch in ((self.sheet_status, 0), (self.conditions, 0), (self.sheet, 1), (self.sheet_notes, 0)):
            lay.addWidget(w, stretch)
        self.chart = QStackedWidget()
        self.chart_hint = QLabel("The part-load chart shows once the project is solved.")
        self.chart_hint.setAlignment(Qt.AlignCenter)
        self.chart.addWidget(self.chart_hint)
        self.canvas = None
        self.addTab(_scrolled(figures), "Figures")
        self.addTab(self.annual, "Load profile year")
        self.addTab(_scrolled(sheet), "Data sheet")
        self.addTab(self.chart, "Chart")
        self._chart_pending = None  # (pkg, system) not drawn yet: the chart draws when it is looked at
        self.currentChanged.connect(lambda _i: self._draw_if_shown())

    def show_package(self, pkg: dict | None, system: str) -> None:
        if pkg is None:
            for t in (self.points, self.annual):
                t.setRowCount(0)
            self.control_line.setText("Solve the project to see the package figures.")
            self.notes.setText("")
            self.chart.setCurrentWidget(self.chart_hint)
            self._chart_pending = None
            return
        self.control_line.setText(pt.control_line(pkg))
        figures = pt.point_figures(pkg, _OUT)
        heads = ["Figure", "Unit"] + [h for h, _ in pt.point_columns(pkg)]
        _fill(self.points, heads, pt.point_rows(pkg, _OUT, system), left=(0, 1), tips=[f.note for f in figures])
        annual = pt.annual_rows(pkg, _OUT, system)
        self.setTabEnabled(YEAR_TAB, bool(annual))
        self.setTabToolTip(YEAR_TAB, "" if annual else "Give a load profile (hours at each load) to see its year")
        _fill(self.annual, ["A year of the load profile, at the site as stated", "Value"], annual)
        notes = sorted({n for p in (pkg["full_load"], pkg["at_load"], *pkg["part_loads"]) for n in p["notes"]})
        self.notes.setText("\n".join(n[:1].upper() + n[1:] + "." for n in notes))
        self.notes.setVisible(bool(notes))
        cautions = package_cautions(pkg["control"])[:-1]  # the data-sheet remark is on the Data sheet tab
        self.cautions.setText("Caution — " + " · ".join(title.lower() for title, _ in cautions)
                              + ": hover here for the text (the report prints it on the data sheet).")
        self.cautions.setToolTip(plain_tip("\n\n".join(f"{title}: {text}" for title, text in cautions)))
        self._chart_pending = (pkg, system)
        self._draw_if_shown()

    def showEvent(self, event) -> None:  # noqa: N802 (Qt's name)
        super().showEvent(event)
        self._draw_if_shown()

    def _draw_if_shown(self) -> None:
        """Draw the part-load chart if its tab is the one shown (a chart nobody sees costs a
        quarter of a second of the window's time after every edit)."""
        if self._chart_pending is not None and self.currentWidget() is self.chart and self.isVisible():
            pkg, system = self._chart_pending
            self._chart_pending = None
            self._draw(pkg, system)

    def _draw(self, pkg: dict, system: str) -> None:
        from stagewright.gui.charts.part_load_chart import draw_part_load_chart
        if self.canvas is None:
            from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
            from matplotlib.figure import Figure
            self.canvas = FigureCanvasQTAgg(Figure(figsize=(7, 3.2), dpi=100))
            self.canvas.setMinimumSize(240, 120)  # never taller than the dock the user sized
            self.chart.addWidget(self.canvas)
        self.chart.setCurrentWidget(self.canvas)
        draw_part_load_chart(self.canvas.figure, pkg, system)
        self.canvas.draw_idle()

    def show_sheet(self, sheet: dict | None, system: str, status: str) -> None:
        self.sheet_status.setText(status)
        self.sheet_status.setVisible(bool(status))
        if sheet is None:
            self.conditions.setText("")
            self.sheet.setRowCount(0)
            self.sheet_notes.setText("")
            return
        self.conditions.setText("\n".join(pt.sheet_condition_lines(sheet, _OUT, system)))
        heads = [f"{h}\n[{u}]" if u else h for h, u in pt.sheet_headers(_OUT, system)]
        _fill(self.sheet, heads, pt.sheet_rows(sheet, _OUT, system), left=(0, 1))
        self.sheet_notes.setText(" ".join(n[:1].upper() + n[1:] + "." for n in sheet["notes"]))
