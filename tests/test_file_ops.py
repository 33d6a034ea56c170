"""File dialogs of the window: where they start, the name they suggest, files they did not ask about."""
from __future__ import annotations

import json

import pytest

pytest.importorskip("pytestqt")

from gui_support import make_window, simple_real_gas_doc  # noqa: E402

from stagewright.gui.document.file_names import file_stem_for  # noqa: E402

pytestmark = pytest.mark.gui


@pytest.fixture
def documents(tmp_path, monkeypatch):
    """The user's documents folder (QStandardPaths.DocumentsLocation), made a temporary one."""
    from PySide6.QtCore import QStandardPaths
    folder = tmp_path / "Documents"
    folder.mkdir()
    real = QStandardPaths.writableLocation

    def location(kind):
        return str(folder) if kind == QStandardPaths.DocumentsLocation else real(kind)
    monkeypatch.setattr(QStandardPaths, "writableLocation", staticmethod(location))
    return folder


def titled(title):
    doc = simple_real_gas_doc()
    doc["title"] = title
    return doc


def dialog_starts(win, method, answer=""):
    starts = []
    setattr(win.prompts, method, lambda start: starts.append(start) or answer)
    return starts


def test_save_as_starts_in_documents_with_a_name_from_the_title(qtbot, tmp_path, documents):
    win = make_window(qtbot, tmp_path, titled("Plant air: 2027"))
    starts = dialog_starts(win, "save_project_name")
    assert not win.files.save_as()
    assert starts == [str(documents / "Plant air 2027.json")]  # not ./untitled.json in the checkout
    win.close()


def test_dialogs_start_in_the_last_folder_used(qtbot, tmp_path, documents):
    win = make_window(qtbot, tmp_path, titled("Hall B"))
    projects = tmp_path / "projects"
    projects.mkdir()
    win.prompts.save_project_name = lambda start: str(projects / "hall")
    assert win.files.save_as()
    assert (projects / "hall.json").is_file()
    win.files.new_project()  # an untitled project: its dialogs start where the last one went
    save_starts = dialog_starts(win, "save_project_name")
    open_starts = dialog_starts(win, "open_project_name")
    win.files.save_as()
    win.files.open_dialog()
    assert save_starts == [str(projects / "New compression train.json")] and open_starts == [str(projects)]
    win.close()
    again = make_window(qtbot, tmp_path, simple_real_gas_doc())  # same settings file: remembered
    starts = dialog_starts(again, "open_project_name")
    again.files.open_dialog()
    assert starts == [str(projects)]
    projects.joinpath("hall.json").unlink()
    projects.rmdir()  # a folder that is gone: back to the documents folder
    again.files.open_dialog()
    assert starts[-1] == str(documents)
    again.close()


def test_save_as_of_a_saved_project_starts_at_its_file(qtbot, tmp_path, documents):
    path = tmp_path / "plant.json"
    path.write_text(json.dumps(simple_real_gas_doc()), encoding="utf-8")
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    assert win.files.open_path(path)
    starts = dialog_starts(win, "save_project_name")
    win.files.save_as()
    assert starts == [str(path)]
    win.close()


def test_a_suffix_added_to_the_typed_name_does_not_overwrite_without_asking(qtbot, tmp_path, documents):
    existing = tmp_path / "hall.json"
    existing.write_text("keep me", encoding="utf-8")
    win = make_window(qtbot, tmp_path, titled("Hall"))
    win.prompts.save_project_name = lambda start: str(tmp_path / "hall")  # the dialog asked about "hall"
    asked = []
    win.prompts.confirm_overwrite = lambda paths: asked.append(list(paths)) or False
    assert not win.files.save_as()
    assert asked == [[existing]] and existing.read_text(encoding="utf-8") == "keep me"
    win.prompts.confirm_overwrite = lambda paths: True
    assert win.files.save_as() and json.loads(existing.read_text(encoding="utf-8"))["title"] == "Hall"
    win.close()


@pytest.mark.parametrize("title, stem", [
    ("Plant air 2027", "Plant air 2027"),
    ("Bottling hall — two-stage plant air, 18 m³/min at 8.5 bar(g)",
     "Bottling hall — two-stage plant air, 18 m³-min at 8.5 bar(g)"),
    ('a<b>c:d"e|f?g*h\\i', "a b c d e f g h-i"),
    ("line\nbreak\ttab", "line break tab"),
    ("trailing dots...", "trailing dots"),
    ("", "Untitled"),
    ("???", "Untitled"),
    ("COM1", "COM1 project"),
    ("x" * 200, "x" * 80),
    ("word " * 30, ("word " * 16).strip()),
])
def test_file_stem_for(title, stem):
    assert file_stem_for(title) == stem
