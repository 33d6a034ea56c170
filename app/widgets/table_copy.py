"""Copy a table to the clipboard as tab-separated text that pastes into a spreadsheet.

:func:`attach_table_copy` gives any table view Ctrl+C (the whole table: in these tables a selected
row is often a pick, such as the study's option, not what to copy) and a context menu with *Copy
table* and *Copy selected rows*. The text has a
header row (a header's unit on its second line joins the name: ``T [°C]``), then the rows and
columns the view shows, each cell as shown — except that the spaces grouping a number's thousands
are dropped, so a spreadsheet reads ``172 945`` as the number 172945.
"""
from __future__ import annotations

__all__ = ["attach_table_copy", "table_rows", "tsv", "clipboard_cell", "TableCopier"]

import re
from collections.abc import Callable, Sequence

from PySide6.QtCore import QEvent, QObject, Qt
from PySide6.QtGui import QGuiApplication, QKeySequence
from PySide6.QtWidgets import QAbstractItemView, QMenu

Rows = list[list[str]]
#: a number grouped in thousands by spaces (``12 345.6``), optionally followed by a unit
_GROUPED = re.compile(r"([-+−]?\d{1,3}(?: \d{3})+(?:\.\d+)?)((?: \D.*)?)")


def clipboard_cell(text: str) -> str:
    """A cell as a spreadsheet should receive it: one line, no tabs, thousands not grouped.

    Examples
    --------
    >>> clipboard_cell("172 945 Btu/h")
    '172945 Btu/h'
    >>> clipboard_cell("T\\n[°C]")
    'T [°C]'
    >>> clipboard_cell("Stage 1 discharge")
    'Stage 1 discharge'
    """
    text = " ".join(text.replace("\t", " ").split())
    m = _GROUPED.fullmatch(text)
    return m.group(1).replace(" ", "") + m.group(2) if m else text


def tsv(rows: Sequence[Sequence[str]]) -> str:
    """Tab-separated lines (each cell through :func:`clipboard_cell`), ending with a newline."""
    return "".join("\t".join(clipboard_cell(str(c)) for c in row) + "\n" for row in rows)


def table_rows(view: QAbstractItemView, only_selected: bool = False) -> Rows:
    """The header row and the rows of ``view`` as shown: hidden rows and columns left out, the
    vertical header as a first column when it is shown; ``only_selected``: just the selected rows."""
    model = view.model()
    cols = [c for c in range(model.columnCount()) if not view.isColumnHidden(c)]
    rows = [r for r in range(model.rowCount()) if not view.isRowHidden(r)]
    if only_selected:
        chosen = {i.row() for i in view.selectionModel().selectedIndexes()}
        rows = [r for r in rows if r in chosen]
    side = view.verticalHeader().isVisible() if hasattr(view, "verticalHeader") else False

    def head(section: int, orientation) -> str:
        value = model.headerData(section, orientation, Qt.DisplayRole)
        return "" if value is None else str(value)

    def cell(r: int, c: int) -> str:
        value = model.data(model.index(r, c), Qt.DisplayRole)
        return "" if value is None else str(value)

    out = [([""] if side else []) + [head(c, Qt.Horizontal) for c in cols]]
    for r in rows:
        out.append(([head(r, Qt.Vertical)] if side else []) + [cell(r, c) for c in cols])
    return out


class TableCopier(QObject):
    """Ctrl+C and the context menu of one table view (made by :func:`attach_table_copy`)."""

    def __init__(self, view: QAbstractItemView, rows: Callable[[bool], Rows] | None = None,
                 extra: Sequence[tuple[str, Callable[[], str]]] = ()):
        super().__init__(view)
        self.view = view
        self._rows = rows or (lambda only_selected: table_rows(view, only_selected))
        self._extra = list(extra)
        view.installEventFilter(self)
        view.setContextMenuPolicy(Qt.CustomContextMenu)
        view.customContextMenuRequested.connect(self._menu)

    def text(self, only_selected: bool = False) -> str:
        """The table (or its selected rows, under the header row) as tab-separated text."""
        rows = self._rows(only_selected)
        return tsv(rows)

    def has_selection(self) -> bool:
        model = self.view.selectionModel()
        return model is not None and model.hasSelection()

    def copy(self, only_selected: bool = False) -> str:
        """Put :meth:`text` on the clipboard and return it."""
        text = self.text(only_selected)
        QGuiApplication.clipboard().setText(text)
        return text

    def eventFilter(self, obj, event) -> bool:
        kind = event.type()
        if kind in (QEvent.ShortcutOverride, QEvent.KeyPress) and event.matches(QKeySequence.Copy):
            if kind == QEvent.KeyPress:
                self.copy()
            event.accept()
            return True
        return False

    def menu(self) -> QMenu:
        """The context menu: *Copy table*, *Copy selected rows* and the extra entries."""
        menu = QMenu(self.view)
        menu.addAction("Copy table", lambda: self.copy(False))
        selected = menu.addAction("Copy selected rows", lambda: self.copy(True))
        selected.setEnabled(self.has_selection())
        for text, make in self._extra:
            menu.addAction(text, lambda make=make: QGuiApplication.clipboard().setText(make()))
        return menu

    def _menu(self, pos) -> None:
        menu = self.menu()
        menu.exec(self.view.viewport().mapToGlobal(pos))
        menu.deleteLater()


def attach_table_copy(view: QAbstractItemView, rows: Callable[[bool], Rows] | None = None,
                      extra: Sequence[tuple[str, Callable[[], str]]] = ()) -> TableCopier:
    """Give ``view`` Ctrl+C and a *Copy table* context menu (see the module docstring).

    Parameters
    ----------
    view : QAbstractItemView
        A table view or widget.
    rows : callable, optional
        ``rows(only_selected) -> [[header…], [cell…], …]`` instead of the cells as shown (e.g. a
        value and its unit in separate columns).
    extra : sequence of (text, callable)
        Further context-menu entries, each copying the text its callable returns.
    """
    return TableCopier(view, rows, extra)
