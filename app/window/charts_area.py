"""Charts area: the T–s process path and the power split, each a matplotlib canvas with its
navigation toolbar. The figures are drawn by the Qt-free functions in :mod:`stagewright.gui.charts`.

matplotlib is imported only when the canvases are first needed (just after the window is
shown), so the window appears without waiting for it.
"""
from __future__ import annotations

__all__ = ["ChartsPanel", "ChartTab"]

from PySide6.QtCore import Qt, QTimer
from PySide6.QtWidgets import QLabel, QTabWidget, QVBoxLayout, QWidget

from stagewright.gui.document.paths import get_in

CHART_REDRAW_MS = 60  #: a new result redraws the shown chart this long after it arrived


class ChartTab(QWidget):
    """One figure, its canvas and toolbar; ``draw(result, system, **kw)`` redraws it."""

    def __init__(self, draw, parent=None):
        super().__init__(parent)
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
        from matplotlib.figure import Figure
        self._draw = draw
        self.figure = Figure(figsize=(6, 4))
        self.canvas = FigureCanvasQTAgg(self.figure)
        self.canvas.setMinimumSize(420, 220)  # with the key figures above, a 768-pixel screen still fits
        self.toolbar = NavigationToolbar2QT(self.canvas, self)
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(0)
        lay.addWidget(self.toolbar)
        lay.addWidget(self.canvas, 1)
        self.pending = None

    def draw(self, result: dict, system: str, **kw) -> None:
        self._draw(self.figure, result, system=system, **kw)
        self.canvas.draw_idle()
        self.pending = None


class ChartsPanel(QWidget):
    """Tabs of charts, redrawn when a fresh result arrives or the unit system changes."""

    title = "Charts"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(0)
        self.stale_note = QLabel("Out of date — these charts belong to an earlier input.")
        self.stale_note.setObjectName("staleBanner")
        self.stale_note.hide()
        lay.addWidget(self.stale_note)
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        lay.addWidget(self.tabs, 1)
        self.ts = self.power = None
        self._placeholder = QLabel("Preparing charts…")
        self._placeholder.setAlignment(Qt.AlignCenter)
        self.tabs.addTab(self._placeholder, "Charts")
        self.tabs.currentChanged.connect(lambda _i: self._draw_current())
        # a new result redraws the shown chart a moment later, so the balance tables show first
        # and a burst of results draws once
        self._redraw = QTimer(self)
        self._redraw.setSingleShot(True)
        self._redraw.setInterval(CHART_REDRAW_MS)
        self._redraw.timeout.connect(self._draw_current)
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)

    def ensure_canvases(self) -> bool:
        """Create the chart tabs (imports matplotlib); True once they exist."""
        if self.ts is not None:
            return True
        from stagewright.gui.charts import draw_power_split, draw_ts_chart  # here: matplotlib loads after first paint
        self.tabs.blockSignals(True)
        self.tabs.clear()
        self.ts = ChartTab(draw_ts_chart)
        self.power = ChartTab(draw_power_split)
        self.tabs.addTab(self.ts, "T–s path")
        self.tabs.addTab(self.power, "Power split")
        self.tabs.blockSignals(False)
        self.refresh()
        return True

    def _limits(self) -> list:
        stages = self.editor.model.get("stages", []) or []
        return [get_in(st, "max_discharge_temperature_K", None) for st in stages]

    def refresh(self) -> None:
        ed = self.editor
        stale = ed.stale and not ed.solver.busy and ed.result is not None
        self.stale_note.setVisible(stale)
        if ed.result is None or self.ts is None:
            return
        if ed.stale and ed.solver.busy:
            return  # a fresh result is on its way
        for tab in (self.ts, self.power):
            tab.pending = (ed.result, ed.prefs.system)
        self._redraw.start()

    def draw_pending(self) -> None:
        """Draw the shown chart now if a result is waiting for it (a screenshot, a report of the view)."""
        self._redraw.stop()
        self._draw_current()

    def _draw_current(self) -> None:
        tab = self.tabs.currentWidget()
        if not isinstance(tab, ChartTab) or tab.pending is None:
            return
        result, system = tab.pending
        kw = {"limits_K": self._limits()} if tab is self.ts else {}
        tab.draw(result, system, **kw)
