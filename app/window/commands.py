"""Undo commands: every edit of the project is one of these on the window's QUndoStack.

Commands keep field paths and stage indices plus deep copies of values — never
references to widgets or document objects — so undo still works after a stage has been
deleted and re-created. Each remembers the case it was made in and shows that case again
before it is undone or redone, so an edit of one case is never replayed into another.
"""
from __future__ import annotations

__all__ = ["CaseCommand", "SetValues", "InsertStage", "RemoveStage", "MoveStage", "ReplaceProject"]

import copy
from typing import Any

from PySide6.QtGui import QUndoCommand

from stagewright.gui.document.model import ProjectModel


class CaseCommand(QUndoCommand):
    """An edit made in one case of the project: undo and redo show that case first."""

    def __init__(self, model: ProjectModel, text: str):
        super().__init__(text)
        self._model = model
        self._case = model.active_case

    def _show_case(self) -> None:
        if self._case in self._model.case_names():
            self._model.activate(self._case)


class SetValues(CaseCommand):
    """Set one or more values at paths (``ABSENT`` removes a key) as one undo step."""

    def __init__(self, model: ProjectModel, pairs: list[tuple[str, Any]], text: str):
        super().__init__(model, text)
        self._new = [(p, copy.deepcopy(v)) for p, v in pairs]
        self._old: list[tuple[str, Any]] = []

    def redo(self) -> None:
        self._show_case()
        olds = self._model.set_many(self._new)
        # undo restores in reverse order so nested paths come back as they were
        self._old = list(reversed([(p, o) for (p, _), o in zip(self._new, olds)]))

    def undo(self) -> None:
        self._show_case()
        self._model.set_many(self._old)


class InsertStage(CaseCommand):
    """Insert a stage (with its cooler, if any) at an index."""

    def __init__(self, model: ProjectModel, index: int, stage: dict, text: str):
        super().__init__(model, text)
        self._index, self._stage = index, copy.deepcopy(stage)

    def redo(self) -> None:
        self._show_case()
        self._model.insert_stage(self._index, self._stage)

    def undo(self) -> None:
        self._show_case()
        self._model.remove_stage(self._index)


class RemoveStage(CaseCommand):
    """Remove the stage at an index; undo puts the same data back at the same place."""

    def __init__(self, model: ProjectModel, index: int, text: str):
        super().__init__(model, text)
        self._index = index
        self._stage: dict | None = None

    def redo(self) -> None:
        self._show_case()
        self._stage = self._model.remove_stage(self._index)

    def undo(self) -> None:
        self._show_case()
        self._model.insert_stage(self._index, self._stage)


class MoveStage(CaseCommand):
    """Move a stage from one position to another."""

    def __init__(self, model: ProjectModel, index: int, new_index: int, text: str):
        super().__init__(model, text)
        self._from, self._to = index, new_index

    def redo(self) -> None:
        self._show_case()
        self._model.move_stage(self._from, self._to)

    def undo(self) -> None:
        self._show_case()
        self._model.move_stage(self._to, self._from)


class ReplaceProject(QUndoCommand):
    """A case operation (new, duplicate, rename, remove, make base) as one undo step: the whole
    project before and after, and the case shown in each."""

    def __init__(self, model: ProjectModel, new_doc: dict, show: str | None, text: str):
        super().__init__(text)
        self._model = model
        self._old, self._old_show = model.project_snapshot(), model.active_case
        self._new, self._new_show = copy.deepcopy(new_doc), show

    def redo(self) -> None:
        self._model.replace_project(self._new, self._new_show)

    def undo(self) -> None:
        self._model.replace_project(self._old, self._old_show)
