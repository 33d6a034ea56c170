"""The document's Undo and Redo from the keyboard, also while the cursor is in an entry field.

A line edit keeps its own undo of the text being typed and claims Ctrl+Z / Ctrl+Y (and
Ctrl+Shift+Z) for it, so the window's Edit ▸ Undo never saw the keys while a field had
focus — not even right after that field's edit was committed. With this filter the field
keeps the keys only while it holds typing not yet committed (Ctrl+Z then undoes the typing,
as in any text box); otherwise they go to the window's actions and undo the document.
"""
from __future__ import annotations

__all__ = ["route_undo_keys"]

from PySide6.QtCore import QEvent, QObject
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QLineEdit

_KEYS = (QKeySequence.StandardKey.Undo, QKeySequence.StandardKey.Redo)


class _UndoKeyRouter(QObject):
    def eventFilter(self, obj, event) -> bool:  # noqa: N802 (Qt's name)
        if (event.type() == QEvent.Type.ShortcutOverride and isinstance(obj, QLineEdit)
                and not obj.isModified() and any(event.matches(k) for k in _KEYS)):
            event.ignore()  # not claimed by the field: the window's shortcut fires
            return True
        return False


def route_undo_keys(edit: QLineEdit) -> None:
    """Let ``edit`` pass Undo/Redo keys to the window unless it holds uncommitted typing."""
    router = _UndoKeyRouter(edit)
    edit.installEventFilter(router)
