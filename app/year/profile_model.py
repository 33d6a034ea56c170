"""The year profile as a Qt table model: one row per month or bin, read from the document on demand.

A :class:`QAbstractTableModel` over ``year.profile.months`` or ``year.profile.bins`` of the window's
document. Nothing is copied into items: a cell's text is made when the view paints it, so an
imported 8760-row year shows at once and an edit repaints one row (:meth:`ProfileTableModel.entry_changed`)
rather than the whole table. Cells are in display units (:mod:`stagewright.gui.presentation.units`);
a typed cell goes to ``commit(row, key, text)`` — :meth:`stagewright.gui.year.editor.YearEditor.set_cell`,
one undo step or a refusal — and never into the document directly.
"""
from __future__ import annotations

__all__ = ["ProfileTableModel", "SOFT_COLOUR", "SHOWN_DECIMALS"]

from typing import Callable

from PySide6.QtCore import QAbstractTableModel, QModelIndex, Qt
from PySide6.QtGui import QColor, QFont

from stagewright.core.year_profile import MONTH_NAMES

from stagewright.gui.document.paths import get_in
from stagewright.gui.presentation import units
from stagewright.gui.widgets.quantity_field import format_entry
from stagewright.gui.year.edits import ENTRY_COLUMNS, entries_key, month_hours

#: text colour of values shown but not stored (spread hours, the year's load, unnamed bins)
SOFT_COLOUR = "#8a96a3"
#: decimals a cell shows while not edited, per quantity (weather data carry tenths; the cell's
#: editor shows the stored value to the unit's decimals plus two, so that nothing is lost unseen)
SHOWN_DECIMALS = {"temperature": 1, "fraction": 1}
_SPREAD_TIP = "Spread from the operating hours by the days of the month (not stored)."
_LOAD_TIP = "The year's load (not stored here); type a value to give this entry its own."


class ProfileTableModel(QAbstractTableModel):
    """The entries of the document's year profile, one row each, in the window's unit system.

    Parameters
    ----------
    editor : stagewright.gui.window.editor.Editor
        The window's editor: its ``model.doc`` is read, its ``prefs.system`` names the units.
    commit : callable
        ``commit(row, key, text) -> bool``: take a typed cell (False when refused).
    """

    def __init__(self, editor, commit: Callable[[int, str, str], bool], parent=None):
        super().__init__(parent)
        self._editor = editor
        self._commit = commit
        self._soft_font = QFont()
        self._soft_font.setItalic(True)
        self._soft_colour = QColor(SOFT_COLOUR)
        self._read_state()

    # ---- state read once per reset --------------------------------------------------------
    def _read_state(self) -> None:
        doc = self._editor.model.doc
        self.kind = get_in(doc, "year.profile.kind", "monthly")
        self.monthly = self.kind == "monthly"
        self.system = self._editor.prefs.system
        self._units = {c.key: units.unit(c.quantity, self.system) for c in ENTRY_COLUMNS if c.quantity}
        self._spread = month_hours(doc) if self.monthly and doc.get("year") else None
        self._year_load = get_in(doc, "year.load", 1.0)
        if not isinstance(self._year_load, (int, float)):
            self._year_load = 1.0
        entries = get_in(doc, "year.profile." + entries_key(self.kind), [])
        self._entries = entries if isinstance(entries, list) else []  #: the document's own list (read, never copied)
        self.count = len(self._entries)  #: rows as of the last reset (the view's row count)

    def reset(self) -> None:
        """Read the profile afresh (another kind, rows added or removed, units, the year's load)."""
        self.beginResetModel()
        self._read_state()
        self.endResetModel()

    def entry_changed(self, row: int) -> None:
        """Entry ``row`` changed in the document (the number of entries did not): repaint its row only."""
        self._entries = self.entries()
        if 0 <= row < self.count:
            self.dataChanged.emit(self.index(row, 0), self.index(row, self.columnCount() - 1))

    def entries(self) -> list:
        entries = get_in(self._editor.model.doc, "year.profile." + entries_key(self.kind), [])
        return entries if isinstance(entries, list) else []

    # ---- QAbstractTableModel --------------------------------------------------------------
    def rowCount(self, parent=QModelIndex()) -> int:
        return 0 if parent.isValid() else self.count

    def columnCount(self, parent=QModelIndex()) -> int:
        return 0 if parent.isValid() else len(ENTRY_COLUMNS)

    def headerData(self, section, orientation, role=Qt.DisplayRole):
        if orientation != Qt.Horizontal or not 0 <= section < len(ENTRY_COLUMNS):
            return super().headerData(section, orientation, role)
        c = ENTRY_COLUMNS[section]
        if role == Qt.DisplayRole:
            name = "Month" if (self.monthly and c.key == "label") else c.header
            sym = self._units[c.key].symbol if c.quantity else ""
            return f"{name}\n[{sym}]" if sym else f"{name}\n"
        if role == Qt.ToolTipRole:
            return c.tip
        return None

    def flags(self, index):
        base = Qt.ItemIsEnabled | Qt.ItemIsSelectable
        if self.monthly and ENTRY_COLUMNS[index.column()].key == "label":
            return base
        return base | Qt.ItemIsEditable

    def data(self, index, role=Qt.DisplayRole):
        if not index.isValid():
            return None
        row, c = index.row(), ENTRY_COLUMNS[index.column()]
        entries = self._entries
        if row >= len(entries) or not isinstance(entries[row], dict):
            return None
        if role == Qt.DisplayRole:
            return self.text(row, c.key, entries[row], shown=True)
        if role == Qt.EditRole:
            return self.text(row, c.key, entries[row])
        if role == Qt.TextAlignmentRole:
            return int((Qt.AlignLeft if c.key == "label" else Qt.AlignRight) | Qt.AlignVCenter)
        soft = self._soft(row, c.key, entries[row])
        if role == Qt.ForegroundRole:
            return self._soft_colour if soft else None
        if role == Qt.FontRole:
            return self._soft_font if soft and c.key != "label" else None
        if role == Qt.ToolTipRole:
            if soft and c.key == "hours":
                return _SPREAD_TIP
            if soft and c.key == "load":
                return _LOAD_TIP
        return None

    def setData(self, index, value, role=Qt.EditRole) -> bool:
        if role != Qt.EditRole or not index.isValid():
            return False
        key = ENTRY_COLUMNS[index.column()].key
        text = "" if value is None else str(value)
        if text.strip() == self.text(index.row(), key).strip():
            return True  # the cell left as shown: no edit (a rounded value would lose its digits)
        return self._commit(index.row(), key, text)

    # ---- cell texts -----------------------------------------------------------------------
    def text(self, row: int, key: str, entry: dict | None = None, shown: bool = False) -> str:
        """The cell of entry ``row`` and column ``key`` as its editor shows it, or rounded as the
        table shows it (``shown``: :data:`SHOWN_DECIMALS`)."""
        if entry is None:
            entry = self._entries[row]
        value = entry.get(key)
        if key == "label":
            return MONTH_NAMES[row] if self.monthly and row < 12 else (value or f"bin {row + 1}")
        u = self._units[key]
        if isinstance(value, (int, float)) and not isinstance(value, bool):
            quantity = next(c.quantity for c in ENTRY_COLUMNS if c.key == key)
            if shown and quantity in SHOWN_DECIMALS:
                text = f"{u.to_display(value):.{SHOWN_DECIMALS[quantity]}f}"
                return text[1:] if text.startswith("-") and float(text) == 0.0 else text  # never "-0.0"
            return format_entry(u.to_display(value), u.decimals)
        if key == "hours" and self._spread is not None and row < len(self._spread):
            return f"{self._spread[row]:.0f}"  # spread by days: shown, not stored
        if key == "load":
            if shown:
                return f"{u.to_display(self._year_load):.{SHOWN_DECIMALS['fraction']}f}"
            return format_entry(u.to_display(self._year_load), u.decimals)
        return "" if value is None else str(value)

    def _soft(self, row: int, key: str, entry: dict) -> bool:
        """True where the cell shows a value that is not stored in the entry."""
        if key == "label":
            return not self.monthly and not entry.get("label")
        if key in ("hours", "load"):
            return entry.get(key) is None
        return False
