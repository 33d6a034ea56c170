"""The staging-study tab of the charts area: power and discharge temperature against the
number of stages (drawn by :func:`app.charts.draw_staging_chart`) and the options as a table."""
from __future__ import annotations

__all__ = ["StudyTab", "STUDY_COLUMNS"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QAbstractItemView, QHeaderView, QLabel, QSplitter, QTableWidget,
                               QTableWidgetItem, QVBoxLayout, QWidget)

from app.presentation import units
from app.presentation.messages import limit_short
from app.study.display import tooltip as display_tooltip

#: (row key, header, quantity or None)
STUDY_COLUMNS = [
    ("stages", "Stages", None),
    ("feasible", "Within\nlimits", None),
    ("driver_power_W", "Driver power", "power"),
    ("specific_power_kW_per_m3_min", "Specific power", "specific_power"),
    ("max_discharge_temperature_K", "Hottest\ndischarge", "temperature"),
    ("saving_W", "Saving", "power"),
    ("binding_limits", "Binding limits\n", None),
]


class _OneLine(QLabel):
    """A one-line label that elides its text to fit; the whole text is its tooltip."""

    def __init__(self, text: str = ""):
        super().__init__()
        self._full = text
        self.setMinimumWidth(50)
        self.setText(text)

    def set_full_text(self, text: str) -> None:
        self._full = text
        self.setToolTip(text)
        self._elide()

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self._elide()

    def _elide(self) -> None:
        self.setText(self.fontMetrics().elidedText(self._full, Qt.ElideRight, max(self.width() - 4, 20)))


class StudyTab(QWidget):
    """Empty until a study has run; ``show_rows(rows, note, system, limit_K)`` fills it."""

    def __init__(self, parent=None):
        super().__init__(parent)
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
        from matplotlib.figure import Figure
        self.figure = Figure(figsize=(6, 3))
        self.canvas = FigureCanvasQTAgg(self.figure)
        self.canvas.setMinimumSize(420, 200)
        self.toolbar = NavigationToolbar2QT(self.canvas, self)
        self.intro = _OneLine()
        self.intro.set_full_text("Train ▸ Run staging study compares 1 to N stages, each at its best "
                                 "pressure split within the stage limits.")
        self.intro.setObjectName("footNote")
        self.stale = QLabel("Out of date — the project changed since this study ran. Run it again.")
        self.stale.setObjectName("staleBanner")
        self.stale.hide()
        self.table = QTableWidget(0, len(STUDY_COLUMNS))
        self.table.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.table.verticalHeader().setVisible(False)
        self.table.verticalHeader().setDefaultSectionSize(20)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeToContents)
        self.table.horizontalHeader().setStretchLastSection(True)
        self.table.setWordWrap(False)
        self.table.setTextElideMode(Qt.ElideRight)
        self.table.setMinimumHeight(90)
        top = QWidget()
        tl = QVBoxLayout(top)
        tl.setContentsMargins(0, 0, 0, 0)
        tl.setSpacing(0)
        tl.addWidget(self.toolbar)
        tl.addWidget(self.canvas, 1)
        split = QSplitter(Qt.Vertical)
        split.addWidget(top)
        split.addWidget(self.table)
        split.setStretchFactor(0, 1)
        split.setStretchFactor(1, 0)
        split.setChildrenCollapsible(False)
        self.splitter = split
        lay = QVBoxLayout(self)
        lay.setContentsMargins(4, 4, 4, 2)
        lay.addWidget(self.stale)
        lay.addWidget(split, 1)
        lay.addWidget(self.intro)
        self.rows: list[dict] = []
        self._last = None

    def show_rows(self, rows: list[dict], note: str, system: str, limit_K: float | None,
                  doc: dict | None = None) -> None:
        from app.charts import draw_staging_chart
        self.rows, self._last = rows, (rows, note, limit_K, doc)
        self.intro.set_full_text(note)
        self.stale.hide()
        draw_staging_chart(self.figure, rows, system=system, limit_K=limit_K)
        self.canvas.draw_idle()
        heads = []
        for key, name, q in STUDY_COLUMNS:
            sym = units.unit(q, system).symbol if q else ""
            heads.append(f"{name}\n[{sym}]" if sym else (name if "\n" in name else name + "\n"))
        self.table.setHorizontalHeaderLabels(heads)
        self.table.setRowCount(len(rows))
        for r, row in enumerate(rows):
            for c, (key, _, q) in enumerate(STUDY_COLUMNS):
                v = row.get(key)
                if key == "feasible":
                    text = "yes" if v else "no"
                elif key == "binding_limits":
                    text = "; ".join(self._limit_text(x, doc, system) for x in (v or []))
                elif q is None:
                    text = "—" if v is None else str(v)
                else:
                    text = units.format_value(v, q, system, with_unit=False)
                item = QTableWidgetItem(text)
                if key == "binding_limits" and v:
                    item.setToolTip(display_tooltip(row, "limits", system))
                item.setTextAlignment((Qt.AlignLeft if key == "binding_limits" else Qt.AlignRight) | Qt.AlignVCenter)
                self.table.setItem(r, c, item)
        want = self.table.horizontalHeader().height() + 20 * len(rows) + 2 * self.table.frameWidth() + 4
        total = sum(self.splitter.sizes()) or self.height()
        # the chart keeps at least two thirds; the table scrolls beyond that
        table_h = min(want, total // 3)
        self.splitter.setSizes([total - table_h, table_h])

    @staticmethod
    def _limit_text(limit, doc, system: str = "SI") -> str:
        if not isinstance(limit, dict):
            return str(limit)
        return limit_short(limit, doc, system)

    def redraw(self, system: str) -> None:
        if self._last is not None:
            rows, note, limit_K, doc = self._last
            stale = self.stale.isVisible()
            self.show_rows(rows, note, system, limit_K, doc)
            self.stale.setVisible(stale)

    def mark_stale(self) -> None:
        if self._last is not None:
            self.stale.show()
