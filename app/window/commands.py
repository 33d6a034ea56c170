"""Undo commands: every edit of the project is one of these on the window's QUndoStack.

Commands keep field paths and stage indices plus deep copies of values — never
references to widgets or document objects — so undo still works after a stage has been
deleted and re-created.
"""
from __future__ import annotations

__all__ = ["SetValues", "InsertStage", "RemoveStage", "MoveStage"]

import copy
from typing import Any

from PySide6.QtGui import QUndoCommand

from app.document.model import ProjectModel


class SetValues(QUndoCommand):
    """Set one or more values at paths (``ABSENT`` removes a key) as one undo step."""

    def __init__(self, model: ProjectModel, pairs: list[tuple[str, Any]], text: str):
        super().__init__(text)
        self._model = model
        self._new = [(p, copy.deepcopy(v)) for p, v in pairs]
        self._old: list[tuple[str, Any]] = []

    def redo(self) -> None:
        olds = self._model.set_many(self._new)
        # undo restores in reverse order so nested paths come back as they were
        self._old = list(reversed([(p, o) for (p, _), o in zip(self._new, olds)]))

    def undo(self) -> None:
        self._model.set_many(self._old)


class InsertStage(QUndoCommand):
    """Insert a stage (with its cooler, if any) at an index."""

    def __init__(self, model: ProjectModel, index: int, stage: dict, text: str):
        super().__init__(text)
        self._model, self._index, self._stage = model, index, copy.deepcopy(stage)

    def redo(self) -> None:
        self._model.insert_stage(self._index, self._stage)

    def undo(self) -> None:
        self._model.remove_stage(self._index)


class RemoveStage(QUndoCommand):
    """Remove the stage at an index; undo puts the same data back at the same place."""

    def __init__(self, model: ProjectModel, index: int, text: str):
        super().__init__(text)
        self._model, self._index = model, index
        self._stage: dict | None = None

    def redo(self) -> None:
        self._stage = self._model.remove_stage(self._index)

    def undo(self) -> None:
        self._model.insert_stage(self._index, self._stage)


class MoveStage(QUndoCommand):
    """Move a stage from one position to another."""

    def __init__(self, model: ProjectModel, index: int, new_index: int, text: str):
        super().__init__(text)
        self._model, self._from, self._to = model, index, new_index

    def redo(self) -> None:
        self._model.move_stage(self._from, self._to)

    def undo(self) -> None:
        self._model.move_stage(self._to, self._from)
