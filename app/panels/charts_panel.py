"""Charts area: the T–s process path and the power split, each a matplotlib canvas with its
navigation toolbar. The figures are drawn by the Qt-free functions in :mod:`app.charts`."""
from __future__ import annotations

__all__ = ["ChartsPanel", "ChartTab"]

from PySide6.QtWidgets import QLabel, QTabWidget, QVBoxLayout, QWidget

from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
from matplotlib.figure import Figure

from ..doc_paths import get_in

try:  # the figure functions live on their own branch until they land
    from ..charts import draw_power_split, draw_ts_chart
except ImportError:  # pragma: no cover - only before app/charts is merged
    draw_ts_chart = draw_power_split = None


class ChartTab(QWidget):
    """One figure, its canvas and toolbar; ``draw(result, system, limits)`` redraws it."""

    def __init__(self, draw, parent=None):
        super().__init__(parent)
        self._draw = draw
        self.figure = Figure(figsize=(6, 4), layout="constrained")
        self.canvas = FigureCanvasQTAgg(self.figure)
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
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        lay.addWidget(self.tabs)
        self.ts = self.power = None
        if draw_ts_chart is None:
            note = QLabel("The T–s and power-split charts appear here once app/charts is installed.")
            note.setWordWrap(True)
            self.tabs.addTab(note, "Charts")
        else:
            self.ts = ChartTab(draw_ts_chart)
            self.power = ChartTab(draw_power_split)
            self.tabs.addTab(self.ts, "T–s path")
            self.tabs.addTab(self.power, "Power split")
        self.tabs.currentChanged.connect(lambda _i: self._draw_current())
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)

    def _limits(self) -> list:
        stages = self.editor.model.get("stages", []) or []
        return [get_in(st, "max_discharge_temperature_K", None) for st in stages]

    def refresh(self) -> None:
        ed = self.editor
        if ed.result is None or self.ts is None:
            return
        if ed.stale and ed.solver.busy:
            return  # a fresh result is on its way
        for tab in (self.ts, self.power):
            tab.pending = (ed.result, ed.prefs.system)
        self._draw_current()

    def _draw_current(self) -> None:
        tab = self.tabs.currentWidget()
        if not isinstance(tab, ChartTab) or tab.pending is None:
            return
        result, system = tab.pending
        kw = {"limits_K": self._limits()} if tab is self.ts else {}
        tab.draw(result, system, **kw)
