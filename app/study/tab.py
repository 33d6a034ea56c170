"""The staging-study tab of the charts area: power and discharge temperature against the
number of stages, large, over the options' deciding figures. It reuses the study panel's pieces:
the chart (:class:`~app.study.chart_view.StagingChartView`) and the table
(:class:`~app.study.options_table.OptionsTable`, with summary columns of its own)."""
from __future__ import annotations

__all__ = ["StudyTab", "STUDY_COLUMNS"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QSplitter, QVBoxLayout, QWidget

from app.presentation import units
from app.document.field_specs import describe
from app.study.chart_view import StagingChartView
from app.study.display import Column, cells
from app.study.options_table import OptionsTable

#: the tab's columns: the figures that decide between the options (the panel shows them all)
STUDY_COLUMNS = [
    Column("stages", "Stages"),
    Column("feasible", "Within\nlimits"),
    Column("power", "Driver power", "power"),
    Column("specific", "Specific power", "specific_power"),
    Column("hottest", "Hottest\ndischarge", "temperature"),
    Column("saving", "Saving", "power"),
    Column("limits", "Binding limits"),
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
    """Empty until a study has run; ``show_rows(rows, note, system, limit_K, doc)`` fills it."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.chart = StagingChartView(titled=True, figsize=(6, 3), min_size=(420, 200))
        self.intro = _OneLine()
        self.intro.set_full_text("Train ▸ Run staging study compares 1 to N stages, each at its best "
                                 "pressure split within the stage limits.")
        self.intro.setObjectName("footNote")
        self.stale = QLabel("Out of date — the project changed since this study ran. Run it again.")
        self.stale.setObjectName("staleBanner")
        self.stale.hide()
        self.table = OptionsTable(STUDY_COLUMNS, self._cells, left={"limits"}, pickable=False)
        self.table.verticalHeader().setDefaultSectionSize(20)
        self.table.setMinimumHeight(90)
        split = QSplitter(Qt.Vertical)
        split.addWidget(self.chart)
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

    @property
    def figure(self):
        return self.chart.figure

    @property
    def canvas(self):
        return self.chart.canvas

    def show_rows(self, rows: list[dict], note: str, system: str, limit_K: float | None,
                  doc: dict | None = None) -> None:
        self.rows, self._last = rows, (rows, note, limit_K, doc)
        self.intro.set_full_text(note)
        self.stale.hide()
        self.chart.show_rows(rows, system, limit_K)
        self.table.show_rows(rows, system)
        t = self.table
        want = t.horizontalHeader().height() + t.verticalHeader().defaultSectionSize() * len(rows) \
            + 2 * t.frameWidth() + 4
        total = sum(self.splitter.sizes()) or self.height()
        # the chart keeps at least two thirds; the table scrolls beyond that
        table_h = min(want, total // 3)
        self.splitter.setSizes([total - table_h, table_h])

    def _cells(self, row: dict, system: str) -> dict[str, str]:
        """The panel's cell texts, with the hottest discharge and the binding limits named in full."""
        shown = cells(row, system)
        shown["hottest"] = units.format_value(row.get("max_discharge_temperature_K"), "temperature", system)
        doc = self._last[3] if self._last else None
        shown["limits"] = "; ".join(self._limit_text(x, doc) for x in (row.get("binding_limits") or []))
        return shown

    @staticmethod
    def _limit_text(limit, doc) -> str:
        if not isinstance(limit, dict):
            return str(limit)
        name = describe(limit.get("field", ""), doc or {}) if limit.get("field") else "limit"
        return f"{name}: {limit.get('status', '')}".rstrip(": ")

    def redraw(self, system: str) -> None:
        if self._last is not None:
            rows, note, limit_K, doc = self._last
            stale = self.stale.isVisible()
            self.show_rows(rows, note, system, limit_K, doc)
            self.stale.setVisible(stale)

    def mark_stale(self) -> None:
        if self._last is not None:
            self.stale.show()
