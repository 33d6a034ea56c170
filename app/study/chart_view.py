"""The staging chart on screen: driver power and discharge temperature against the number of
stages, drawn by :func:`stagewright.gui.charts.draw_staging_chart` on a matplotlib canvas with its
navigation toolbar (never pyplot). The study panel shows it beside its table (or on a tab of its
own when the panel is narrow), with a hint until a study has run; matplotlib is imported only
when the first chart is drawn.
"""
from __future__ import annotations

__all__ = ["StagingChartView"]

from PySide6.QtCore import QEvent, QSize, Qt, QTimer
from PySide6.QtWidgets import QLabel, QStackedWidget, QVBoxLayout, QWidget


class StagingChartView(QStackedWidget):
    """One staging chart; ``show_rows(rows, system, limit_K)`` draws it.

    The chart has no title of its own: the panel is its heading.

    Parameters
    ----------
    hint : str
        Shown instead of the chart while there is nothing to draw.
    icon_px : int, optional
        Size of the toolbar's icons (None: matplotlib's own).
    """

    _FIGSIZE, _MIN_SIZE = (4.5, 3.0), (240, 160)  # [in], [px]

    def __init__(self, hint: str, *, icon_px: int | None = None, parent=None):
        super().__init__(parent)
        self.figure = self.canvas = self.toolbar = None
        self._chart: QWidget | None = None
        self._icon_px = icon_px
        self._shown: tuple = ([], "SI", None)  # rows, system, limit_K last shown
        self.hint = QLabel(hint)
        self.hint.setAlignment(Qt.AlignCenter)
        self.hint.setObjectName("footNote")
        self.addWidget(self.hint)
        self._redraw = QTimer(self)  # the legend's columns follow the canvas width
        self._redraw.setSingleShot(True)
        self._redraw.setInterval(80)
        self._redraw.timeout.connect(self._on_resized)

    def _make_canvas(self) -> None:
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
        from matplotlib.figure import Figure
        holder = QWidget()
        v = QVBoxLayout(holder)
        v.setContentsMargins(0, 0, 0, 0)
        v.setSpacing(0)
        self.figure = Figure(figsize=self._FIGSIZE)
        self.canvas = FigureCanvasQTAgg(self.figure)
        self.canvas.setMinimumSize(*self._MIN_SIZE)
        self.canvas.installEventFilter(self)
        self.toolbar = NavigationToolbar2QT(self.canvas, holder)
        if self._icon_px:
            self.toolbar.setIconSize(QSize(self._icon_px, self._icon_px))
        v.addWidget(self.toolbar)
        v.addWidget(self.canvas, 1)
        self.addWidget(holder)
        self._chart = holder

    @property
    def rows(self) -> list[dict]:
        """The rows drawn (SI)."""
        return self._shown[0]

    def show_rows(self, rows: list[dict], system: str, limit_K: float | None = None) -> None:
        """Draw ``rows`` in ``system``'s units, with the discharge-temperature limit ``limit_K`` [K];
        no rows: the hint."""
        self._shown = (list(rows), system, limit_K)
        if not rows:
            self.setCurrentWidget(self.hint)
            return
        if self.canvas is None:
            self._make_canvas()
        self._draw()
        self.setCurrentWidget(self._chart)

    def _draw(self) -> None:
        from stagewright.gui.charts import draw_staging_chart
        rows, system, limit_K = self._shown
        draw_staging_chart(self.figure, rows, system, limit_K=limit_K, title=None)
        self.canvas.draw_idle()

    def _on_resized(self) -> None:
        if self.rows:
            self._draw()

    def eventFilter(self, obj, event) -> bool:
        if obj is self.canvas and event.type() == QEvent.Resize and self.rows:
            self._redraw.start()
        return super().eventFilter(obj, event)
