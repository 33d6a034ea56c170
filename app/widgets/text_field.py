"""A free-text entry bound to one document path (names, the project title)."""
from __future__ import annotations

__all__ = ["TextField"]

from PySide6.QtWidgets import QLineEdit

from stagewright.gui.document.paths import ABSENT
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.widgets.undo_keys import route_undo_keys


class TextField(QLineEdit):
    """Writes its text to ``path`` when editing finishes and the text changed."""

    def __init__(self, editor, path: str = "", placeholder: str = "", max_length: int = 200, parent=None):
        super().__init__(parent)
        self.editor, self.path = editor, path
        self.setPlaceholderText(placeholder)
        self.setMaxLength(max_length)
        self.editingFinished.connect(self.commit)
        route_undo_keys(self)

    def set_path(self, path: str) -> None:
        self.path = path
        self.refresh()

    def refresh(self) -> None:
        value = self.editor.model.get(self.path)
        with signals_blocked(self):
            self.setText("" if value is ABSENT or value is None else str(value))
            self.setModified(False)
            self.setCursorPosition(0)

    def update_mark(self) -> None:
        pass

    def commit(self) -> None:
        if not self.isModified():
            return
        self.setModified(False)
        old = self.editor.model.get(self.path)
        new = self.text()
        if new == ("" if old is ABSENT or old is None else old):
            return
        self.editor.set_value(self.path, new)
