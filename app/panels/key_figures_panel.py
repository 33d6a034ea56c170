"""Key figures: the answer first. A strip of tiles — powers, specific power, each cooler's duty,
cooling water, condensate, pressure dew point and the count of warnings — read from
:data:`stagewright.gui.presentation.balance_tables.KEY_FIGURES`. Clicking a tile asks for its detail (the
window shows the balance-sheet row, or the messages)."""
from __future__ import annotations

__all__ = ["KeyFiguresPanel", "FigureTile", "WARNINGS_KEY"]

from PySide6.QtCore import QEvent, Qt, Signal
from PySide6.QtWidgets import QFrame, QLabel, QSizePolicy, QVBoxLayout, QWidget

from stagewright.gui.widgets.plain_text import plain_label, plain_tip
from stagewright.gui.presentation import balance_tables as tables
from stagewright.gui.presentation.figures import shown
from stagewright.gui.widgets.tile_flow import TileFlowLayout

WARNINGS_KEY = "warnings"  #: the tile that counts problems and warnings
_MISSING = "—"
_STYLE = """
QFrame#keyFigure { background: #ffffff; border: 1px solid #d3d9df; border-radius: 4px; }
QFrame#keyFigure:hover, QFrame#keyFigure:focus { border: 1px solid #1f6f78; }
QFrame#keyFigure[tone="warning"] { background: #fff4e0; border: 1px solid #f0c36d; }
QFrame#keyFigure[tone="problem"] { background: #fdecea; border: 1px solid #e6a49c; }
QLabel#keyFigureName { color: #52606d; font-size: 11px; }
QLabel#keyFigureValue { color: #1f2933; font-size: 14px; font-weight: 600; }
QFrame#keyFigure[stale="true"] QLabel#keyFigureValue { color: #9aa5b1; }
"""


class FigureTile(QFrame):
    """One key figure: a small name over a large value; ``clicked(key)`` on click, Enter or Space."""

    clicked = Signal(str)

    def __init__(self, key: str, parent: QWidget | None = None):
        super().__init__(parent)
        self.key = key
        self.setObjectName("keyFigure")
        self.setFocusPolicy(Qt.TabFocus)
        self.setCursor(Qt.PointingHandCursor)
        self.setAttribute(Qt.WA_Hover)
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 2, 6, 3)
        lay.setSpacing(0)
        self.name = plain_label(QLabel())
        self.name.setObjectName("keyFigureName")
        self.value = plain_label(QLabel(_MISSING))
        self.value.setObjectName("keyFigureValue")
        self.value.setTextInteractionFlags(Qt.NoTextInteraction)
        lay.addWidget(self.name)
        lay.addWidget(self.value)

    def show_figure(self, name: str, value: str, tip: str, tone: str = "", stale: bool = False) -> None:
        """Set the texts, the tooltip and the look (``tone``: ``""``, ``"warning"`` or ``"problem"``)."""
        self.name.setText(name)
        self.value.setText(value)
        self.setToolTip(plain_tip(tip))
        self.setAccessibleName(f"{name}: {value}")
        if self.property("tone") != tone or self.property("stale") != stale:
            self.setProperty("tone", tone)
            self.setProperty("stale", stale)
            for w in (self, self.name, self.value):
                w.style().unpolish(w)
                w.style().polish(w)
        self.updateGeometry()

    def mouseReleaseEvent(self, event) -> None:
        if event.button() == Qt.LeftButton and self.rect().contains(event.position().toPoint()):
            self.clicked.emit(self.key)
        super().mouseReleaseEvent(event)

    def keyPressEvent(self, event) -> None:
        if event.key() in (Qt.Key_Return, Qt.Key_Enter, Qt.Key_Space):
            self.clicked.emit(self.key)
            return
        super().keyPressEvent(event)


class KeyFiguresPanel(QWidget):
    """The strip of key figures; ``detail_requested(key)`` when a tile is clicked.

    Keys are those of :func:`stagewright.gui.presentation.balance_tables.key_figures` and :data:`WARNINGS_KEY`.
    """

    title = "Key figures"
    detail_requested = Signal(str)

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.setStyleSheet(_STYLE)
        self.setSizePolicy(QSizePolicy.Preferred, QSizePolicy.Fixed)
        self.flow = TileFlowLayout(self, spacing=4)
        self.flow.setContentsMargins(4, 4, 4, 4)
        self.tiles: dict[str, FigureTile] = {}
        self.figures: dict[str, tables.KeyFigure] = {}
        self._problems: list[str] = []
        self._warnings: list[str] = []
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)
        self.refresh()

    # ---- reading (tests) -----------------------------------------------------------------
    def keys(self) -> list[str]:
        return list(self.tiles)

    def value_text(self, key: str) -> str:
        return self.tiles[key].value.text()

    def detail(self, key: str) -> tuple[str, str] | None:
        """Where the balance sheet details the figure ``key``: ``(table, row key)`` or None."""
        fig = self.figures.get(key)
        return fig.detail if fig is not None else None

    # ---- filling -------------------------------------------------------------------------
    def set_messages(self, problems: list[str], warnings: list[str]) -> None:
        """The texts of the problems and warnings the Messages panel lists (for the warnings tile)."""
        self._problems, self._warnings = list(problems), list(warnings)
        self._show_warnings()

    def refresh(self) -> None:
        ed = self.editor
        figures = tables.key_figures(ed.result) if ed.result is not None else []
        self.figures = {k.key: k for k in figures}
        stale = ed.result is None or (ed.stale and not ed.solver.busy)
        window_figures = shown(tables.KEY_FIGURES, "window")  # the table also holds the report's first page
        keys = [k.key for k in figures] if figures else [f.id for f in window_figures if isinstance(f.key, str)]
        if keys + [WARNINGS_KEY] != list(self.tiles):
            self._rebuild(keys + [WARNINGS_KEY])
        system = ed.prefs.system
        for k in figures:
            value = k.text(system, _MISSING)
            tip = k.figure.note if value != _MISSING else self._why_missing(k)
            self.tiles[k.key].show_figure(k.label, value, f"{tip}\nClick for the detail.", stale=stale)
        if not figures:
            for fig in window_figures:
                if fig.id in self.tiles:
                    self.tiles[fig.id].show_figure(fig.label, _MISSING, "No results yet.", stale=True)
        self._show_warnings()

    @staticmethod
    def _why_missing(k: tables.KeyFigure) -> str:
        if k.figure.when == "moist" and not k.applies:
            return "Dry intake air (no humidity given for the site): no water condenses."
        if k.key == "cooling_water_kg_s":
            return ("No cooler has a water or water–glycol coolant side: give one in the cooler's "
                    "Coolant side (Train panel) to get the cooling-water flow.")
        return "Not available for this result."

    def _show_warnings(self) -> None:
        tile = self.tiles.get(WARNINGS_KEY)
        if tile is None:
            return
        n_p, n_w = len(self._problems), len(self._warnings)
        if n_p:
            value, tone = f"{n_p} problem{'s' * (n_p != 1)}", "problem"
        elif n_w:
            value, tone = f"{n_w} warning{'s' * (n_w != 1)}", "warning"
        else:
            value, tone = "none", ""
        lines = self._problems + self._warnings
        tip = "\n".join(f"• {t}" for t in lines) if lines else "No input problems and no warnings."
        tile.show_figure("Warnings", value, tip + "\nClick to see them in Messages.", tone=tone)
        self.flow.fit_height(self)

    def _rebuild(self, keys: list[str]) -> None:
        for tile in self.tiles.values():
            self.flow.removeWidget(tile)
            tile.deleteLater()
        self.tiles = {}
        for key in keys:
            tile = FigureTile(key, self)
            tile.clicked.connect(self.detail_requested)
            self.flow.addWidget(tile)
            tile.show()  # now: the flow lays out shown tiles only
            self.tiles[key] = tile

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self.flow.fit_height(self)

    def event(self, event) -> bool:
        if event.type() == QEvent.LayoutRequest:  # a tile's text (so its width) changed
            self.flow.fit_height(self)
        return super().event(event)
