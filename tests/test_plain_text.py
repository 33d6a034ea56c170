"""Text from project files is shown as text, never rendered as markup (issue 22 item 14): the
"Cannot open project" dialog, every message box and the tooltips of messages and fields."""
from __future__ import annotations

import json

import pytest

from tests.gui_support import SAMPLE, make_window

pytestmark = pytest.mark.gui

MARKUP = "<img src='/etc/hostname'><b>All is fine</b> <a href='https://example.invalid'>details</a>"


def _as_rendered(text: str) -> str:
    """What Qt shows for ``text`` in a tooltip or an auto-format label: rendered when it
    looks like rich text (Qt::mightBeRichText), literal otherwise."""
    from PySide6.QtGui import QTextDocument, Qt

    if not Qt.mightBeRichText(text):
        return text
    doc = QTextDocument()
    doc.setHtml(text)
    return doc.toPlainText()


def test_cannot_open_dialog_shows_a_key_name_with_markup_as_text(qtbot, tmp_path):
    from PySide6.QtCore import Qt

    win = make_window(qtbot, tmp_path)
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    doc[MARKUP] = 1
    bad = tmp_path / "crafted.json"
    bad.write_text(json.dumps(doc), encoding="utf-8")
    boxes = []
    win.prompts.show_error = lambda title, text: boxes.append(win.prompts.error_box(title, text))
    assert not win.files.open_path(str(bad), ask=False)
    [box] = boxes
    assert box.textFormat() == Qt.PlainText and "<img src=" in box.text()
    box.deleteLater()


def make_window_unsolved(qtbot, tmp_path, doc):
    """A window on a document with input problems (no solve to wait for)."""
    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow
    settings = QSettings(str(tmp_path / "settings.ini"), QSettings.IniFormat)
    win = MainWindow(doc, settings=settings, debounce_ms=10, restore_layout=False)
    win.prompts.ask_save_changes = lambda _name: "discard"
    qtbot.addWidget(win)
    win.show()
    qtbot.waitUntil(lambda: bool(win.editor.problems), timeout=10_000)
    win.panels["messages"].refresh()
    return win


def test_message_tooltips_show_markup_as_text(qtbot, tmp_path):
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    doc["stages"][0]["name"] = MARKUP
    doc["stages"][0]["efficiency"]["value"] = 1.5  # a problem on a stage named with markup
    doc[MARKUP] = 1                                # and an unknown key named with it
    win = make_window_unsolved(qtbot, tmp_path, doc)
    from stagewright.gui.widgets.quantity_field import QuantityField

    panel = win.panels["messages"]
    shown = [_as_rendered(panel.list.item(i).toolTip()) for i in range(panel.list.count())]
    assert any("<img src='/etc/hostname'>" in s for s in shown), shown
    # a problem message in a field's tooltip names the stage by its name: shown literally too
    fields = [f for f in win.findChildren(QuantityField) if f.path == "stages[0].efficiency.value"]
    assert fields
    for f in fields:
        f.update_mark()
        assert _as_rendered(f.edit.toolTip()) == f.problem_message()


def test_plain_tip_keeps_every_character():
    from stagewright.gui.widgets.plain_text import plain_tip

    text = "a < b & c > d\n  indented <i>not italic</i>"
    assert _as_rendered(plain_tip(text)) == text
