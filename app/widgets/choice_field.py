"""A drop-down bound to one document path, or to a value derived from several keys; choosing
pushes one undo step via a callback."""
from __future__ import annotations

__all__ = ["ChoiceField"]

from typing import Callable

from PySide6.QtWidgets import QComboBox

from stagewright.gui.widgets.signals_blocked import signals_blocked


class ChoiceField(QComboBox):
    """``options`` is a list of (stored value, shown text); ``on_choose(value)`` makes the edit.

    The callback (not a plain set) lets a panel turn a choice into a consistent edit of
    several keys, e.g. changing the efficiency basis carries the current value across.
    A choice that no single key stores (how the site pressure is given, the cooler's outlet
    basis, the coolant) passes ``current``, which reads the chosen value from the document;
    without it the box would read an empty path and go blank after every choice.
    """

    def __init__(self, editor, path: str, options: list[tuple[str, str]],
                 on_choose: Callable[[str], None] | None = None, parent=None,
                 current: Callable[[], str] | None = None):
        super().__init__(parent)
        self.editor, self.path = editor, path
        self._current = current
        self._values = [v for v, _ in options]
        for _, text in options:
            self.addItem(text)
        # as wide as the longest choice: choices are kept short so that nothing is cut off
        self._on_choose = on_choose or (lambda value: editor.set_value(self.path, value))
        self.activated.connect(self._chosen)

    def set_path(self, path: str) -> None:
        self.path = path
        self.refresh()

    def current_value(self) -> str:
        return self._values[self.currentIndex()] if self.currentIndex() >= 0 else ""

    def refresh(self, value: str | None = None) -> None:
        if value is None and self._current is not None:
            value = self._current()
        if value is None:
            value = self.editor.model.get(self.path)
            if value not in self._values:
                from stagewright.gui.document.paths import get_in
                value = get_in(self.editor.model.normalised(), self.path, None)
        with signals_blocked(self):
            self.setCurrentIndex(self._values.index(value) if value in self._values else -1)

    def update_mark(self) -> None:
        pass

    def _chosen(self, index: int) -> None:
        value = self._values[index]
        self._on_choose(value)
        self.refresh()
