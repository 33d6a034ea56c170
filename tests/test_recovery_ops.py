"""Autosave to the recovery file and the offer to restore it at start (needs app.document.recovery_file)."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")
recovery = pytest.importorskip("app.document.recovery_file")

from gui_support import make_window, simple_real_gas_doc  # noqa: E402

pytestmark = pytest.mark.gui


@pytest.fixture(autouse=True)
def data_dir(tmp_path, monkeypatch):
    monkeypatch.setenv(recovery.ENV_VAR, str(tmp_path / "data"))
    return tmp_path / "data"


def test_a_change_is_autosaved_and_a_save_clears_it(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc(), autosave_ms=20)
    win.editor.set_value("title", "unsaved work")
    qtbot.waitUntil(lambda: recovery.read_recovery() is not None, timeout=5000)
    doc, source = recovery.read_recovery()
    assert doc["title"] == "unsaved work" and source is None
    assert win.files.save_to(tmp_path / "saved.json")
    assert recovery.read_recovery() is None
    win.close()


def test_undo_back_to_the_saved_state_clears_it(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc(), autosave_ms=20)
    win.editor.set_value("title", "x")
    qtbot.waitUntil(lambda: recovery.read_recovery() is not None, timeout=5000)
    win.editor.undo_stack.undo()
    assert recovery.read_recovery() is None
    win.close()


def test_start_up_offers_the_recovered_document(qtbot, tmp_path):
    source = tmp_path / "plant.json"
    doc = simple_real_gas_doc(stages=3)
    recovery.write_recovery(doc, source)
    win = make_window(qtbot, tmp_path, simple_real_gas_doc(), autosave_ms=20)
    win.prompts.ask_restore = lambda name: name == "plant.json"
    assert win.recovery.offer()
    assert win.editor.model.stage_count == 3 and win.files.path == source
    assert win.isWindowModified()
    assert recovery.read_recovery() is not None  # kept until the work is saved or dropped
    assert win.close()  # the fixture answers "discard"
    assert recovery.read_recovery() is None


def test_declining_removes_the_recovery_file(qtbot, tmp_path):
    recovery.write_recovery(simple_real_gas_doc(), None)
    win = make_window(qtbot, tmp_path, simple_real_gas_doc(), autosave_ms=20)
    win.prompts.ask_restore = lambda name: False
    assert not win.recovery.offer()
    assert recovery.read_recovery() is None
    win.close()
