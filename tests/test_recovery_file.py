"""Recovery file for unsaved work (Qt-free): where it lives, round trip, damage, failures.

Folder conventions: XDG Base Directory Specification 0.8 (freedesktop.org, 2021) —
``$XDG_DATA_HOME``, default ``~/.local/share``, "if an implementation encounters a relative
path in any of these variables it should consider the path invalid and ignore it"; Microsoft's
``%APPDATA%`` (roaming application data); Apple's File System Programming Guide,
``~/Library/Application Support``.
"""
from __future__ import annotations

import errno
import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from app.document import recovery_file as recovery
from app.document.recovery_file import clear_recovery, read_recovery, recovery_dir, recovery_file, write_recovery
from tests.conftest import ROOT, SAMPLES, make_doc
from thermo.project.validation import problems
from thermo.errors import ProjectFileError, SaveError, StagewrightError
from thermo.project import load


@pytest.fixture
def data_dir(tmp_path, monkeypatch):
    folder = tmp_path / "data"
    monkeypatch.setenv("STAGEWRIGHT_DATA_DIR", str(folder))
    return folder


def test_nothing_to_recover(data_dir):
    assert read_recovery() is None
    clear_recovery()  # nothing to remove: no error
    assert not data_dir.exists()  # nothing is created until something is written


def test_round_trip_with_and_without_a_source(data_dir, tmp_path):
    doc = load(SAMPLES / "two_stage_plant_air.json")
    doc["title"] = "edited, not saved"
    write_recovery(doc, tmp_path / "plant.json")
    got, source = read_recovery()
    assert got == doc and source == (tmp_path / "plant.json").absolute()
    write_recovery(doc)
    assert read_recovery() == (doc, None)
    clear_recovery()
    assert read_recovery() is None and not recovery_file().exists()


def test_the_file_is_plain_json_in_the_data_folder(data_dir):
    write_recovery(make_doc(), "relative/p.json")
    envelope = json.loads((data_dir / "recovery.json").read_text(encoding="ascii"))  # stdlib reader
    assert envelope["format"] == "stagewright-recovery" and envelope["version"] == 1
    assert Path(envelope["source_path"]).is_absolute()
    assert envelope["document"]["stages"] == make_doc()["stages"]


def test_unsaved_work_that_does_not_validate_is_still_kept(data_dir):
    doc = make_doc()
    doc["stages"][0]["efficiency"]["value"] = 3.0  # typed mid-edit
    write_recovery(doc)  # autosave never refuses work in progress
    got, _ = read_recovery()  # and restores it as it was, problems included
    assert got == {"format": "stagewright-project", "version": 2, **doc}  # a version-1 document, upgraded
    assert [p.field for p in problems(got)] == ["stages[0].efficiency.value"]


@pytest.mark.parametrize("content, match", [
    (b'{"format": "stagewright-recovery", "version": 1, "document": {', "line 1, column 63: broken JSON"),
    (b'{"format": "something", "version": 1, "document": {}}', "not a Stagewright recovery file"),
    (b'{"format": "stagewright-recovery", "version": 7, "document": {}}', "not a Stagewright recovery file"),
    (b'{"format": "stagewright-recovery", "version": 1, "source_path": 5, "document": {"stages": []}}',
     "source_path: 5"),
    (b'{"format": "stagewright-recovery", "version": 1, "document": {"version": 99, "stages": []}}',
     "newer Stagewright"),
    (b'{"format": "stagewright-recovery", "version": 1, "document": {"rows": []}}', "not a Stagewright project"),
    (b"\x00\xff", "not UTF-8"),
])
def test_a_damaged_recovery_file_is_reported(data_dir, content, match):
    data_dir.mkdir()
    (data_dir / "recovery.json").write_bytes(content)
    with pytest.raises(ProjectFileError, match=match):
        read_recovery()


def test_failed_write_keeps_the_previous_recovery(data_dir, monkeypatch):
    write_recovery(make_doc(title="first"))
    before = recovery_file().read_bytes()

    def full(*a):
        raise OSError(errno.ENOSPC, "No space left on device")
    monkeypatch.setattr(os, "replace", full)
    with pytest.raises(SaveError, match="the disk is full"):
        write_recovery(make_doc(title="second"))
    assert recovery_file().read_bytes() == before
    assert [n for n in os.listdir(data_dir) if n != "recovery.json"] == []


def test_write_refuses_non_json_data(data_dir):
    with pytest.raises(StagewrightError, match="discharge_pressure_Pa"):
        write_recovery(make_doc(discharge_pressure_Pa=float("inf")))
    assert read_recovery() is None


def test_folder_that_cannot_be_made_is_a_save_error(tmp_path, monkeypatch):
    blocker = tmp_path / "file"
    blocker.write_text("x")
    monkeypatch.setenv("STAGEWRIGHT_DATA_DIR", str(blocker / "sub"))
    with pytest.raises(SaveError, match="cannot create the recovery folder"):
        write_recovery(make_doc())


@pytest.mark.parametrize("platform, env, expected", [
    ("linux", {"XDG_DATA_HOME": "/xdg/data"}, "/xdg/data/stagewright"),
    ("linux", {}, "~/.local/share/stagewright"),
    ("linux", {"XDG_DATA_HOME": "relative/path"}, "~/.local/share/stagewright"),  # ignored per the spec
    ("linux", {"XDG_DATA_HOME": ""}, "~/.local/share/stagewright"),
    ("win32", {"APPDATA": "C:/Users/ann/AppData/Roaming"}, "C:/Users/ann/AppData/Roaming/Stagewright"),
    ("win32", {}, "~/AppData/Roaming/Stagewright"),
    ("darwin", {"XDG_DATA_HOME": "/ignored"}, "~/Library/Application Support/Stagewright"),
    ("linux", {"STAGEWRIGHT_DATA_DIR": "/override", "XDG_DATA_HOME": "/xdg"}, "/override"),
])
def test_recovery_dir_per_platform(monkeypatch, platform, env, expected):
    for var in ("STAGEWRIGHT_DATA_DIR", "XDG_DATA_HOME", "APPDATA"):
        monkeypatch.delenv(var, raising=False)
    for var, value in env.items():
        monkeypatch.setenv(var, value)
    monkeypatch.setattr(sys, "platform", platform)
    assert recovery_dir() == Path(os.path.expanduser(expected))


def test_recovery_does_not_import_qt():
    code = "import sys, app.document.recovery_file; print(sorted(m for m in sys.modules if m.startswith(('PySide', 'PyQt'))))"
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "[]"


def test_api_shape():
    # the window's autosave timer and restore prompt rely on exactly these names
    assert set(recovery.__all__) >= {"recovery_dir", "write_recovery", "read_recovery", "clear_recovery"}
