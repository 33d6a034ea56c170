"""Charts area: the T–s process path and the power split, each a matplotlib canvas with its
navigation toolbar. The figures are drawn by the Qt-free functions in :mod:`stagewright.gui.charts`.

matplotlib is imported only when the canvases are first needed (just after the window is
shown), so the window appears without waiting for it; :meth:`ChartsPanel.prepare_in_background`
imports it on another thread, so that the window keeps answering while it loads (most of a second).
"""
from __future__ import annotations

__all__ = ["ChartsPanel", "ChartTab"]

import sys
import threading

from PySide6.QtCore import Qt, QTimer, Signal
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


def _import_chart_modules() -> None:
    """Import what the chart tabs need (matplotlib, its Qt canvas, the chart functions)."""
    import matplotlib.backends.backend_qtagg  # noqa: F401
    import matplotlib.figure  # noqa: F401

    import stagewright.gui.charts  # noqa: F401


class ChartsPanel(QWidget):
    """Tabs of charts, redrawn when a fresh result arrives or the unit system changes."""

    title = "Charts"
    #: the chart modules finished importing on their background thread (emitted from that thread)
    modules_imported = Signal()

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
        self._importing: threading.Thread | None = None
        self._wanted = False  # canvases were asked for while the modules were still importing
        self.modules_imported.connect(self._on_modules_imported)

    def prepare_in_background(self) -> None:
        """Import matplotlib and the chart functions on another thread (once). Importing is mostly
        Python code, which lets the GUI thread run between its steps; on the GUI thread the window
        stopped answering for most of a second just after it appeared."""
        if self._importing is not None or self.ts is not None:
            return

        def work() -> None:
            try:
                _import_chart_modules()
            finally:  # a failed import is raised again, with its message, on the GUI thread
                try:
                    self.modules_imported.emit()
                except RuntimeError:  # the window was closed meanwhile
                    pass
        self._importing = threading.Thread(target=work, name="stagewright-charts-import", daemon=True)
        self._importing.start()

    def _on_modules_imported(self) -> None:
        self._importing = None
        if self._wanted:
            self.ensure_canvases(wait=True)  # here, so that a failed import raises on this thread

    def ensure_canvases(self, wait: bool = False) -> bool:
        """Create the chart tabs; True once they exist. Unless ``wait``, matplotlib is imported on
        another thread first (:meth:`prepare_in_background`) and the tabs are made when it ends."""
        if self.ts is not None:
            return True
        if not wait and "matplotlib.backends.backend_qtagg" not in sys.modules:
            self.prepare_in_background()
        if self._importing is not None and not wait:
            self._wanted = True
            return False
        self._wanted = False
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
