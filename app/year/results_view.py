"""The year panel's Results tab: the year's totals beside the bin-by-bin table.

The totals come first, on the left, because they are what a facility engineer takes away from a
year (energy, its cost, cooling water, condensate, recoverable heat, the worst month); the bins
follow on the right. Both read :mod:`stagewright.gui.presentation.year_tables`: the totals are the figures
:func:`~stagewright.gui.presentation.year_tables.totals_for` keeps for the year (no cooling-water line for an
air-cooled train, no recovered heat without heat recovery, no money without prices), the columns
are :data:`~stagewright.gui.presentation.year_tables.YEAR_BINS` as the window shows them.
"""
from __future__ import annotations

__all__ = ["YearResultsView", "YearBinsModel", "MONEY_TIP", "total_text"]

from PySide6.QtCore import QAbstractTableModel, QModelIndex, Qt
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QSplitter, QTableView, QTableWidget, QTableWidgetItem

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


#: rows whose cell widths are measured when the bins are shown (an hourly year is not measured row by row)
_WIDTH_SAMPLE_ROWS = 50
_MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August", "September", "October",
           "November", "December")


def total_text(fig: Figure, year: dict, system: str) -> str:
    """A total with its unit; an extreme with its bin: ``137.3 °C in August``, ``144.9 °C at
    2025-07-22 15:00`` (an hour of an imported year), ``144.9 °C in bin 34.2 °C 50 %``."""
    text = fig.text(year, _OUT, system, with_unit=True)
    if fig.bin_key:
        where = str(read_path(year, fig.bin_key))
        if where in _MONTHS:
            text += f" in {where}"
        elif where[:4].isdigit() and where[4:5] == "-":  # a timestamp (stagewright.gui.document.year_csv)
            text += f" at {where}"
        else:
            text += f" in bin {where}"
    return text


class YearBinsModel(QAbstractTableModel):
    """The year's bins, one row each, a column per figure; texts are made when a row is painted,
    so an 8760-bin year is shown at once (no 100 000 table items)."""

    def __init__(self, columns: list, parent=None):
        super().__init__(parent)
        self.columns = columns
        self.bins: list = []
        self.system = "SI"

    def show(self, bins: list, system: str) -> None:
        self.beginResetModel()
        self.bins, self.system = bins, system
        self.endResetModel()

    def rowCount(self, parent=QModelIndex()) -> int:
        return 0 if parent.isValid() else len(self.bins)

    def columnCount(self, parent=QModelIndex()) -> int:
        return 0 if parent.isValid() else len(self.columns)

    def headerData(self, section, orientation, role=Qt.DisplayRole):
        if orientation != Qt.Horizontal or not 0 <= section < len(self.columns):
            return super().headerData(section, orientation, role)
        fig = self.columns[section]
        if role == Qt.DisplayRole:
            sym = fig.symbol_in(_OUT, self.system)
            return f"{fig.label_in(_OUT)}\n[{sym}]" if sym else f"{fig.label_in(_OUT)}\n"
        if role == Qt.ToolTipRole and fig.note:
            return fig.note[:1].upper() + fig.note[1:]
        return None

    def data(self, index, role=Qt.DisplayRole):
        if not index.isValid() or index.row() >= len(self.bins):
            return None
        fig = self.columns[index.column()]
        if role == Qt.DisplayRole:
            return fig.text(self.bins[index.row()], _OUT, self.system)
        if role == Qt.TextAlignmentRole:
            return int((Qt.AlignLeft if fig.is_left_aligned() else Qt.AlignRight) | Qt.AlignVCenter)
        return None


class YearResultsView(QSplitter):
    """Totals (left) and bins (right); ``show_year(year, system)`` fills both, None empties them.

    Attributes
    ----------
    totals : QTableWidget
        One row per total: its name and its value with unit.
    table : QTableView
        One row per bin (:class:`YearBinsModel`), one column per figure of ``YEAR_BINS`` shown in the window.
    """

    def __init__(self, parent=None):
        super().__init__(Qt.Horizontal, parent)
        self.columns = shown(year_tables.YEAR_BINS, _OUT)
        self.totals = _table(2)
        self.totals.setObjectName("yearTotals")
        self.totals.setHorizontalHeaderLabels(["Year total", "Value"])
        self.totals.horizontalHeader().setStretchLastSection(True)
        self.bins = YearBinsModel(self.columns, self)
        self.table = QTableView()
        self.table.setModel(self.bins)
        self.table.verticalHeader().setVisible(False)
        self.table.verticalHeader().setSectionResizeMode(QHeaderView.Fixed)
        self.table.verticalHeader().setDefaultSectionSize(self.table.fontMetrics().height() + 8)
        self.table.horizontalHeader().setResizeContentsPrecision(_WIDTH_SAMPLE_ROWS)
        self.table.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.table.setWordWrap(False)
        attach_table_copy(self.table)
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
        if year is None:
            self.bins.show([], system)
            self.totals.setRowCount(0)
            self.shown_totals = []
            return
        self._fill_bins(year["bins"], system)
        self._fill_totals(year, system)
        self._size()

    def _fill_bins(self, bins: list[dict], system: str) -> None:
        self.bins.show(bins, system)
        self.table.resizeColumnsToContents()  # measures the first rows only (_WIDTH_SAMPLE_ROWS)

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
