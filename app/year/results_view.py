"""The year panel's Results tab: the year's totals beside the bin-by-bin table.

The totals come first, on the left, because they are what a facility engineer takes away from a
year (energy, its cost, cooling water, condensate, recoverable heat, the worst month); the bins
follow on the right. Both read :mod:`stagewright.gui.presentation.year_tables`: the totals are the figures
:func:`~stagewright.gui.presentation.year_tables.totals_for` keeps for the year (no cooling-water line for an
air-cooled train, no recovered heat without heat recovery, no money without prices), the columns
are :data:`~stagewright.gui.presentation.year_tables.YEAR_BINS` as the window shows them.
"""
from __future__ import annotations

__all__ = ["YearResultsView", "MONEY_TIP", "total_text"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QAbstractItemView, QSplitter, QTableWidget, QTableWidgetItem

from stagewright.gui.presentation import year_tables
from stagewright.gui.presentation.figures import Figure, read_path, shown
from stagewright.gui.widgets.table_copy import attach_table_copy

_OUT = "window"
MONEY_TIP = "In the currency of the prices on the Profile tab (and of the fuel price of heat recovery)"


def _table(columns: int) -> QTableWidget:
    t = QTableWidget(0, columns)
    t.verticalHeader().setVisible(False)
    t.verticalHeader().setDefaultSectionSize(t.fontMetrics().height() + 8)
    t.setEditTriggers(QAbstractItemView.NoEditTriggers)
    t.setWordWrap(False)
    attach_table_copy(t)  # Ctrl+C and Copy table: tab-separated text for a spreadsheet
    return t


def total_text(fig: Figure, year: dict, system: str) -> str:
    """A total with its unit; an extreme with its bin (``137.3 °C in August``)."""
    text = fig.text(year, _OUT, system, with_unit=True)
    if fig.bin_key:
        text += f" in {read_path(year, fig.bin_key)}"
    return text


class YearResultsView(QSplitter):
    """Totals (left) and bins (right); ``show_year(year, system)`` fills both, None empties them.

    Attributes
    ----------
    totals : QTableWidget
        One row per total: its name and its value with unit.
    table : QTableWidget
        One row per bin, one column per figure of ``YEAR_BINS`` shown in the window.
    """

    def __init__(self, parent=None):
        super().__init__(Qt.Horizontal, parent)
        self.columns = shown(year_tables.YEAR_BINS, _OUT)
        self.totals = _table(2)
        self.totals.setObjectName("yearTotals")
        self.totals.setHorizontalHeaderLabels(["Year total", "Value"])
        self.totals.horizontalHeader().setStretchLastSection(True)
        self.table = _table(len(self.columns))
        self.addWidget(self.totals)
        self.addWidget(self.table)
        self.setStretchFactor(0, 0)
        self.setStretchFactor(1, 1)
        self.setChildrenCollapsible(False)
        self.shown_totals: list[Figure] = []

    # ---- reading -------------------------------------------------------------------------
    def total_ids(self) -> list[str]:
        """Ids of the totals shown, top to bottom."""
        return [f.id for f in self.shown_totals]

    def total_value(self, fig_id: str) -> str:
        """Text of the total ``fig_id`` (KeyError when it is not shown)."""
        ids = self.total_ids()
        if fig_id not in ids:
            raise KeyError(fig_id)
        return self.totals.item(ids.index(fig_id), 1).text()

    # ---- showing -------------------------------------------------------------------------
    def show_year(self, year: dict | None, system: str) -> None:
        heads = []
        for fig in self.columns:
            sym = fig.symbol_in(_OUT, system)
            heads.append(f"{fig.label_in(_OUT)}\n[{sym}]" if sym else f"{fig.label_in(_OUT)}\n")
        self.table.setHorizontalHeaderLabels(heads)
        if year is None:
            self.table.setRowCount(0)
            self.totals.setRowCount(0)
            self.shown_totals = []
            return
        self._fill_bins(year["bins"], system)
        self._fill_totals(year, system)
        self._size()

    def _fill_bins(self, bins: list[dict], system: str) -> None:
        self.table.setRowCount(len(bins))
        for row, b in enumerate(bins):
            for col, fig in enumerate(self.columns):
                item = QTableWidgetItem(fig.text(b, _OUT, system))
                item.setTextAlignment((Qt.AlignLeft if fig.is_left_aligned() else Qt.AlignRight) | Qt.AlignVCenter)
                self.table.setItem(row, col, item)
        self.table.resizeColumnsToContents()

    def _fill_totals(self, year: dict, system: str) -> None:
        self.shown_totals = year_tables.totals_for(year, _OUT)
        self.totals.setRowCount(len(self.shown_totals))
        for row, fig in enumerate(self.shown_totals):
            name = QTableWidgetItem(fig.label_in(_OUT))
            value = QTableWidgetItem(total_text(fig, year, system))
            value.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter)
            money = (fig.look(_OUT).quantity or fig.quantity) == "money"
            tip = MONEY_TIP if money else fig.note
            for item in (name, value):
                item.setToolTip(tip[:1].upper() + tip[1:] if tip else "")
            self.totals.setItem(row, 0, name)
            self.totals.setItem(row, 1, value)
        self.totals.resizeColumnsToContents()

    def _size(self) -> None:
        """The totals as wide as their text; the bins take the rest."""
        total = sum(self.sizes())
        if total <= 0:
            return
        t = self.totals
        need = (t.horizontalHeader().length() + t.verticalScrollBar().sizeHint().width() + 2 * t.frameWidth() + 4)
        left = min(need, total // 2)
        self.setSizes([left, total - left])
