"""Ctrl+Z undoes the document from the keyboard wherever focus is (a defect: it did nothing
while the cursor was still in the field just edited; the menu's Undo worked)."""
import pytest
from PySide6.QtCore import Qt

from tests.gui_support import type_into, wait_solved, window  # noqa: F401  (fixture)

pytestmark = pytest.mark.gui


def _focus(qtbot, win, widget) -> None:
    win.activateWindow()
    widget.setFocus()
    qtbot.waitUntil(widget.hasFocus, timeout=2000)


def test_ctrl_z_in_the_field_just_edited_undoes_the_edit(qtbot, window):  # noqa: F811
    ed = window.editor
    window.panels["train"].select("stage", 0)
    field = window.panels["train"].stage_form.value
    before = ed.model.get("stages[0].efficiency.value")
    _focus(qtbot, window, field.edit)
    n = ed.solved_jobs
    type_into(qtbot, field, "71")
    wait_solved(qtbot, window, n)
    assert ed.model.get("stages[0].efficiency.value") == 0.71
    assert field.edit.hasFocus()
    qtbot.keyClick(field.edit, Qt.Key_Z, Qt.ControlModifier)
    assert ed.model.get("stages[0].efficiency.value") == before
    qtbot.keyClick(field.edit, Qt.Key_Y, Qt.ControlModifier)
    assert ed.model.get("stages[0].efficiency.value") == 0.71


def test_ctrl_z_while_typing_undoes_the_typing_first(qtbot, window):  # noqa: F811
    ed = window.editor
    window.panels["train"].select("stage", 0)
    field = window.panels["train"].stage_form.value
    _focus(qtbot, window, field.edit)
    shown, depth = field.edit.text(), ed.undo_stack.index()
    qtbot.keyClicks(field.edit, "9")  # typed, not yet committed
    qtbot.keyClick(field.edit, Qt.Key_Z, Qt.ControlModifier)
    assert field.edit.text() == shown and ed.undo_stack.index() == depth
