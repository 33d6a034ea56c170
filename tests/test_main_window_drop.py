"""A project file dragged onto the window opens as File ▸ Open would, asking before unsaved
changes are lost (window issue, item 14)."""
from __future__ import annotations

import json

import pytest

pytest.importorskip("pytestqt")

from PySide6.QtCore import QMimeData, QPoint, Qt, QUrl  # noqa: E402
from PySide6.QtGui import QDragEnterEvent, QDropEvent  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

from gui_support import SAMPLE, make_window, simple_real_gas_doc, wait_solved  # noqa: E402

pytestmark = pytest.mark.gui


def _mime(*paths) -> QMimeData:
    mime = QMimeData()
    mime.setUrls([QUrl.fromLocalFile(str(p)) for p in paths])
    return mime


def _drag_and_drop(win, mime: QMimeData) -> tuple[bool, bool]:
    """Send a drag entering the window and a drop; (drag accepted, drop accepted)."""
    centre = QPoint(win.width() // 2, win.height() // 2)
    enter = QDragEnterEvent(centre, Qt.CopyAction, mime, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(win, enter)
    drop = QDropEvent(centre, Qt.CopyAction, mime, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(win, drop)
    return enter.isAccepted(), drop.isAccepted()


@pytest.fixture
def project_file(tmp_path):
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    doc["title"] = "Dropped project"
    path = tmp_path / "dropped.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    return path


def test_dropping_a_project_file_opens_it_after_asking_about_unsaved_changes(qtbot, tmp_path, project_file):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    assert win.acceptDrops()
    asked = []
    win.prompts.ask_save_changes = lambda name: asked.append(name) or "discard"
    win.editor.set_value("title", "Edited, not saved")
    assert win.files.is_modified()
    n = win.editor.solved_jobs
    assert _drag_and_drop(win, _mime(project_file)) == (True, True)
    qtbot.waitUntil(lambda: win.files.path == project_file)
    assert asked == ["this new project"]
    assert win.model.get("title") == "Dropped project" and not win.files.is_modified()
    wait_solved(qtbot, win, n)
    assert str(project_file.resolve()) in win.files.recent_files()
    win.close()


def test_cancelling_the_question_keeps_the_work(qtbot, tmp_path, project_file):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    win.prompts.ask_save_changes = lambda _name: "cancel"
    win.editor.set_value("title", "Keep me")
    _drag_and_drop(win, _mime(project_file))
    qtbot.wait(50)
    assert win.files.path is None and win.model.get("title") == "Keep me"
    win.close()


def test_only_one_local_json_file_is_taken(tmp_path, project_file):
    from stagewright.gui.window.main_window import dropped_project
    other = tmp_path / "notes.txt"
    other.write_text("x", encoding="utf-8")
    assert dropped_project(_mime(project_file)) == str(project_file)
    upper = tmp_path / "PLANT.JSON"
    upper.write_text("{}", encoding="utf-8")
    assert dropped_project(_mime(upper)) == str(upper)
    assert dropped_project(_mime(other)) is None
    assert dropped_project(_mime(project_file, upper)) is None  # which one? neither
    assert dropped_project(_mime(tmp_path / "missing.json")) is None
    remote = QMimeData()
    remote.setUrls([QUrl("https://example.org/plant.json")])
    assert dropped_project(remote) is None
    assert dropped_project(QMimeData()) is None


def test_a_dropped_file_that_is_not_a_project_is_refused_with_a_message(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    bad = tmp_path / "bad.json"
    bad.write_text('{"site": 1}', encoding="utf-8")
    errors = []
    win.prompts.show_error = lambda title, text: errors.append((title, text))
    _drag_and_drop(win, _mime(bad))
    qtbot.waitUntil(lambda: bool(errors))
    assert errors[0][0] == "Cannot open project" and "site" in errors[0][1]
    assert win.files.path is None
    win.close()
