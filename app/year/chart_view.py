"""The year panel's Chart tab: :func:`stagewright.gui.charts.year_chart.draw_year_chart` on a matplotlib canvas.

The canvas is made on the first year to draw (matplotlib loads late). The chart takes the whole
tab: docked under the window's charts it is wide and short, and shows its three panels side by
side; a floated or tall panel stacks them. When a resize crosses from one shape to the other the
chart is drawn again (after a short pause, not on every step of a drag).
"""
from __future__ import annotations

__all__ = ["YearChartView"]

from PySide6.QtCore import QEvent, Qt, QTimer
from PySide6.QtWidgets import QLabel, QStackedWidget

_HINT = "Run the year to see its energy, condensate and\nhottest discharge month by month."


class YearChartView(QStackedWidget):
    """``show_year(year, system)`` draws a year (None: the hint)."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.canvas = None
        self.side_by_side: bool | None = None  # the arrangement drawn
        self._shown: tuple = (None, "SI")
        self.hint = QLabel(_HINT)
        self.hint.setAlignment(Qt.AlignCenter)
        self.hint.setObjectName("footNote")
        self.addWidget(self.hint)
        self._redraw = QTimer(self)
        self._redraw.setSingleShot(True)
        self._redraw.setInterval(80)
        self._redraw.timeout.connect(self._on_resized)

    @property
    def figure(self):
        return None if self.canvas is None else self.canvas.figure

    def show_year(self, year: dict | None, system: str) -> None:
        self._shown = (year, system)
        if year is None:
            self.setCurrentWidget(self.hint)
            return
        if self.canvas is None:
            from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
            from matplotlib.figure import Figure
            self.canvas = FigureCanvasQTAgg(Figure(figsize=(9, 2.4), dpi=100))
            self.canvas.setMinimumSize(320, 160)
            self.canvas.installEventFilter(self)
            self.addWidget(self.canvas)
        self.setCurrentWidget(self.canvas)
        self._draw()

    def _draw(self) -> None:
        from stagewright.gui.charts.year_chart import draw_year_chart, side_by_side_for
        year, system = self._shown
        self.side_by_side = side_by_side_for(*self.figure.get_size_inches())
        draw_year_chart(self.figure, year, system, side_by_side=self.side_by_side, dryer=True)
        self.canvas.draw_idle()

    def _on_resized(self) -> None:
        from stagewright.gui.charts.year_chart import side_by_side_for
        if self._shown[0] is not None and side_by_side_for(*self.figure.get_size_inches()) != self.side_by_side:
            self._draw()

    def eventFilter(self, obj, event) -> bool:
        if obj is self.canvas and event.type() == QEvent.Resize:
            self._redraw.start()
        return super().eventFilter(obj, event)
