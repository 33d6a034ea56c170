"""A read-only results table: no row numbers, rows one line high, copyable as tab-separated text."""
from __future__ import annotations

__all__ = ["result_table"]

from PySide6.QtWidgets import QAbstractItemView, QTableWidget

from stagewright.gui.widgets.table_copy import attach_table_copy


def result_table(columns: tuple = (), name: str = "") -> QTableWidget:
    """A table of results the user reads and copies but never edits (its last column stretches)."""
    t = QTableWidget(0, len(columns))
    if columns:
        t.setHorizontalHeaderLabels(list(columns))
    if name:
        t.setObjectName(name)
    t.verticalHeader().setVisible(False)
    t.verticalHeader().setDefaultSectionSize(t.fontMetrics().height() + 8)
    t.setEditTriggers(QAbstractItemView.NoEditTriggers)
    t.setWordWrap(False)
    t.horizontalHeader().setStretchLastSection(True)
    attach_table_copy(t)
    return t
