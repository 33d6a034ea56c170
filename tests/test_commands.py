"""Undo commands keep paths and copies, so undo/redo survive removing and re-creating stages."""
from __future__ import annotations

import pytest

pytest.importorskip("PySide6")

from PySide6.QtGui import QUndoStack  # noqa: E402

from stagewright.gui.window.commands import InsertStage, MoveStage, RemoveStage, SetValues  # noqa: E402
from stagewright.gui.document.paths import ABSENT  # noqa: E402
from stagewright.gui.document.model import ProjectModel  # noqa: E402


def test_every_command_undoes_to_the_identical_document(doc_factory):
    original = doc_factory(stages=3)
    m = ProjectModel(original)
    stack = QUndoStack()
    stack.push(SetValues(m, [("stages[2].efficiency.value", 0.75)], "Change stage 3 efficiency"))
    stack.push(SetValues(m, [("stages[0].cooler", ABSENT), ("title", "t")], "Two keys"))
    stack.push(RemoveStage(m, 2, "Remove stage 3"))
    stack.push(InsertStage(m, 0, {"efficiency": {"kind": "polytropic", "value": 0.85}}, "Insert"))
    stack.push(MoveStage(m, 0, 2, "Move stage 1 down"))
    assert m.stage_count == 3 and m.get("stages[2].efficiency.kind") == "polytropic"
    assert "cooler" not in m.doc["stages"][0]  # [stage 1 without cooler, stage 2, inserted]
    while stack.canUndo():
        stack.undo()
    assert m.doc == original
    while stack.canRedo():
        stack.redo()
    assert m.stage_count == 3 and m.get("title") == "t"
    assert stack.undoText() == "Move stage 1 down"


def test_set_values_undo_restores_a_missing_key(doc_factory):
    m = ProjectModel(doc_factory())
    stack = QUndoStack()
    stack.push(SetValues(m, [("stages[1].heat_loss_W", 500.0)], "Change stage 2 casing heat loss"))
    assert m.get("stages[1].heat_loss_W") == 500.0
    stack.undo()
    assert "heat_loss_W" not in m.doc["stages"][1]
