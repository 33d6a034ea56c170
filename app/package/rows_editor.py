"""A small table editor of a list of rows in the document (a load profile, other loads, curve points).

Each cell is a value of one key of one row, shown in the display unit of its quantity; typing in
a cell writes that one value (one undo step), Add row and Remove row replace the list (one undo
step each). Text that is not a number is refused in the status line under the table and the
document stays as it was; a value out of range goes into the document and is reported by the
project's problems, like every other entry field.
"""
from __future__ import annotations

__all__ = ["RowsEditor", "RowColumn"]

from dataclasses import dataclass

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QAbstractItemView, QHBoxLayout, QLabel, QPushButton, QTableWidget, QTableWidgetItem,
                               QVBoxLayout, QWidget)

from stagewright.gui.document.paths import ABSENT
from stagewright.gui.package.edits import with_row, without_row
from stagewright.gui.presentation import units
from stagewright.gui.widgets.plain_text import plain_label, plain_tip
from stagewright.gui.widgets.quantity_field import format_shown, parse_number
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.widgets.table_copy import attach_table_copy


@dataclass(frozen=True)
class RowColumn:
    """One column: the row's key, its header, its display quantity (None: text)."""

    key: str
    header: str
    quantity: str | None = None


class RowsEditor(QWidget):
    """Edits the list at ``path`` (``package.load_profile`` …); ``noun`` names a row in undo texts."""

    def __init__(self, editor, path: str, columns: list[RowColumn], noun: str, min_rows: int = 0,
                 max_rows: int = 100, parent=None):
        super().__init__(parent)
        self.editor, self.path, self.columns, self.noun = editor, path, columns, noun
        self.min_rows, self.max_rows = min_rows, max_rows
        self.key = path.rsplit(".", 1)[-1]
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.table = QTableWidget(0, len(columns))
        self.table.verticalHeader().setDefaultSectionSize(self.table.fontMetrics().height() + 8)
        self.table.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.table.horizontalHeader().setStretchLastSection(True)
        self.table.setMinimumHeight(self.table.fontMetrics().height() * 6)
        attach_table_copy(self.table)
        lay.addWidget(self.table)
        row = QHBoxLayout()
        self.add_button = QPushButton("Add row")
        self.remove_button = QPushButton("Remove row")
        self.status = plain_label(QLabel())
        self.status.setObjectName("footNote")
        self.status.setWordWrap(True)
        row.addWidget(self.add_button)
        row.addWidget(self.remove_button)
        row.addWidget(self.status, 1)
        lay.addLayout(row)
        self.add_button.clicked.connect(self.add_row)
        self.remove_button.clicked.connect(self.remove_row)
        self.table.itemChanged.connect(self._on_item_changed)
        self.refresh()

    def rows(self) -> list:
        value = self.editor.model.get(self.path)
        return [] if value is ABSENT or value is None else value

    def _unit(self, col: RowColumn) -> units.Unit | None:
        return None if col.quantity is None else units.unit(col.quantity, self.editor.prefs.system)

    def refresh(self) -> None:
        """Show the document's rows in the current units."""
        rows = self.rows()
        heads = []
        for col in self.columns:
            u = self._unit(col)
            heads.append(f"{col.header} [{u.symbol}]" if u is not None and u.symbol else col.header)
        with signals_blocked(self.table):
            self.table.setHorizontalHeaderLabels(heads)
            self.table.setRowCount(len(rows))
            for r, data in enumerate(rows):
                for c, col in enumerate(self.columns):
                    value = data.get(col.key) if isinstance(data, dict) else None
                    u = self._unit(col)
                    if u is None or not isinstance(value, (int, float)):
                        text = "" if value is None else str(value)
                    else:
                        text = format_shown(u.to_display(float(value)))
                    item = QTableWidgetItem(text)
                    item.setTextAlignment((Qt.AlignLeft if u is None else Qt.AlignRight) | Qt.AlignVCenter)
                    problem = self._problem(f"{self.path}[{r}].{col.key}")
                    if problem:
                        item.setToolTip(plain_tip(problem))
                        item.setForeground(Qt.red)
                    self.table.setItem(r, c, item)
        self.add_button.setEnabled(len(rows) < self.max_rows)
        self.remove_button.setEnabled(len(rows) > self.min_rows)

    def _problem(self, path: str) -> str | None:
        """The project's problem with the value at ``path``, in display units with the field's label."""
        from stagewright.gui.document.messages import problem_text
        found = next((p for p in self.editor.problems if p.field == path), None)
        if found is None:
            return None
        return problem_text(found, self.editor.model.doc, self.editor.prefs.system)

    def _on_item_changed(self, item: QTableWidgetItem) -> None:
        r, c = item.row(), item.column()
        col = self.columns[c]
        text = item.text().strip()
        u = self._unit(col)
        if u is None:
            value = text
        else:
            shown = parse_number(text)
            if shown is None:
                self.status.setText(f"'{text}' is not a number: row {r + 1}, {col.header.lower()} kept as it was.")
                self.refresh()
                return
            value = float(f"{u.to_si(shown):.12g}")
        self.status.setText("")
        if not self.editor.set_value(f"{self.path}[{r}].{col.key}", value):
            self.refresh()

    def add_row(self) -> None:
        self.status.setText("")
        self.editor.set_value(self.path, with_row(self.rows(), self.key), f"Add {self.noun}")

    def remove_row(self) -> None:
        rows = self.rows()
        if len(rows) <= self.min_rows:
            return
        current = self.table.currentRow()
        index = current if 0 <= current < len(rows) else len(rows) - 1
        self.editor.set_value(self.path, without_row(rows, index), f"Remove {self.noun} {index + 1}")

