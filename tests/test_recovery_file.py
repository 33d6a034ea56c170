"""Recovery files of unsaved work (Qt-free): where they live, whose they are, round trip, damage, failures.

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
import time
from pathlib import Path

import pytest

from stagewright.core.project.schema import FORMAT_VERSION

from stagewright.gui.document import recovery_file as recovery
from stagewright.gui.document.recovery_file import RecoverySlot, claim_orphans, read_recovery_file, recovery_dir
from tests.conftest import ROOT, SAMPLES, make_doc
from stagewright.core.project.validation import problems
from stagewright.core.errors import ProjectFileError, SaveError, StagewrightError
from stagewright.core.project import load


@pytest.fixture
def data_dir(tmp_path, monkeypatch):
    folder = tmp_path / "data"
    monkeypatch.setenv("STAGEWRIGHT_DATA_DIR", str(folder))
    return folder


def crashed(slot: RecoverySlot) -> RecoverySlot:
    """What the operating system does to a slot's lock when its process dies: the lock goes, the files stay."""
    slot._lock.release()
    return slot


def orphans(folder=None):
    with claim_orphans(folder) as found:
        return [(r.window, r.source_path, r.document.get("title")) for r in found.recovered]


def test_nothing_to_recover(data_dir):
    with claim_orphans() as found:
        assert found.recovered == [] and found.unreadable == []
    RecoverySlot().clear()  # nothing to remove: no error
    assert not data_dir.exists()  # nothing is created until something is written


def test_round_trip_with_and_without_a_source(data_dir, tmp_path):
    doc = load(SAMPLES / "two_stage_plant_air.json")
    doc["title"] = "edited, not saved"
    slot = RecoverySlot()
    slot.write(doc, tmp_path / "plant.json")
    got = slot.read()
    assert got.document == doc and got.source_path == (tmp_path / "plant.json").absolute()
    assert got.window == slot.window and got.file == data_dir / f"recovery-{slot.window}.json"
    slot.write(doc)
    assert slot.read().source_path is None and slot.read().untitled
    slot.clear()
    assert slot.read() is None and not slot.path.exists()


def test_the_file_is_plain_json_naming_its_project_and_owner(data_dir):
    slot = RecoverySlot(window="w1")
    slot.write(make_doc(), "relative/p.json")
    envelope = json.loads((data_dir / "recovery-w1.json").read_text(encoding="ascii"))  # stdlib reader
    assert envelope["format"] == "stagewright-recovery" and envelope["version"] == 2
    assert Path(envelope["source_path"]).is_absolute() and envelope["window"] == "w1"
    assert envelope["owner"]["pid"] == os.getpid()
    assert envelope["document"]["stages"] == make_doc()["stages"]


def test_unsaved_work_that_does_not_validate_is_still_kept(data_dir):
    doc = make_doc()
    doc["stages"][0]["efficiency"]["value"] = 3.0  # typed mid-edit
    slot = RecoverySlot()
    slot.write(doc)  # autosave never refuses work in progress
    got = slot.read().document  # and restores it as it was, problems included
    assert got == {"format": "stagewright-project", "version": FORMAT_VERSION, **doc}  # a version-1 document, upgraded
    assert [p.field for p in problems(got)] == ["stages[0].efficiency.value"]


# ---- ownership: only work of ended sessions is ever offered ------------------------------------
def test_a_live_windows_file_is_not_an_orphan_and_a_crashed_ones_is(data_dir):
    live, dead = RecoverySlot(window="live"), RecoverySlot(window="dead")
    live.write(make_doc(title="still being edited"))
    dead.write(make_doc(title="left by a crash"))
    crashed(dead)
    assert orphans() == [("dead", None, "left by a crash")]
    live.release()  # a clean exit leaves nothing behind
    assert sorted(os.listdir(data_dir)) == ["recovery-dead.json", "recovery-dead.lock"]


CHILD = """
import sys
from stagewright.gui.document.recovery_file import RecoverySlot
slot = RecoverySlot(sys.argv[1], window="child")
slot.write({"title": sys.argv[2], "stages": []})
print("written", flush=True)
if sys.stdin.readline().strip() == "exit":
    slot.release()
"""


def _child(folder, title):
    proc = subprocess.Popen([sys.executable, "-c", CHILD, str(folder), title], cwd=ROOT,
                            stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True)
    assert proc.stdout.readline().strip() == "written"
    return proc


def test_another_running_process_owns_its_file_until_it_dies(tmp_path):
    folder = tmp_path / "data"
    proc = _child(folder, "work of a running window")
    try:
        assert orphans(folder) == []  # alive: not offered, so never discarded by mistake
        proc.kill()  # kill -9: no clean-up runs
        proc.wait(30)
        assert orphans(folder) == [("child", None, "work of a running window")]
    finally:
        proc.kill()


def test_a_process_that_exits_cleanly_leaves_nothing(tmp_path):
    folder = tmp_path / "data"
    proc = _child(folder, "saved work")
    proc.communicate("exit\n", timeout=30)
    assert os.listdir(folder) == []


def test_a_claim_is_exclusive_while_the_user_decides(data_dir):
    slot = RecoverySlot(window="a")
    slot.write(make_doc(title="a"))
    crashed(slot)
    with claim_orphans() as first:
        assert [r.window for r in first.recovered] == ["a"]
        assert orphans() == []  # a second process starting now does not offer it too
    assert [w for w, _, _ in orphans()] == ["a"]  # released, not deleted


def test_discard_deletes_only_what_it_names(data_dir):
    for name in ("a", "b"):
        crashed(_written(name))
    with claim_orphans() as found:
        found.discard(next(r for r in found.recovered if r.window == "a"))
    assert sorted(os.listdir(data_dir)) == ["recovery-b.json", "recovery-b.lock"]


def _written(window, title=None, source=None):
    slot = RecoverySlot(window=window)
    slot.write(make_doc(title=title or window), source)
    return slot


def test_newest_first_and_each_knows_its_project(data_dir, tmp_path):
    plant = tmp_path / "plant.json"
    plant.write_text("{}")
    crashed(_written("old", "older work"))
    time.sleep(0.01)
    crashed(_written("new", "newer work", plant))
    with claim_orphans() as found:
        new, old = found.recovered
    assert (new.window, old.window) == ("new", "old")
    assert new.belongs_to(plant) and new.belongs_to(tmp_path / "." / "plant.json") and not old.belongs_to(plant)
    assert new.project_name() == "plant.json" and old.project_name() == "the new project “older work”"
    assert new.newer_than_source()  # written after the file last changed
    os.utime(plant, (time.time() + 60, time.time() + 60))  # the file was saved again since
    assert not new.newer_than_source()
    plant.unlink()
    assert new.newer_than_source() and not new.source_exists()


def test_work_of_an_earlier_release_is_still_found(data_dir):
    data_dir.mkdir()
    (data_dir / "recovery.json").write_text(json.dumps({
        "format": "stagewright-recovery", "version": 1, "saved_at": "2024-05-01T10:00:00+00:00",
        "source_path": "/home/ann/plant.json", "document": make_doc(title="from version 1")}))
    assert orphans() == [("recovery", Path("/home/ann/plant.json"), "from version 1")]


@pytest.mark.parametrize("content, match", [
    (b'{"format": "stagewright-recovery", "version": 2, "document": {', "line 1, column 63: broken JSON"),
    (b'{"format": "something", "version": 2, "document": {}}', "not a Stagewright recovery file"),
    (b'{"format": "stagewright-recovery", "version": 7, "document": {}}', "not a Stagewright recovery file"),
    (b'{"format": "stagewright-recovery", "version": 2, "source_path": 5, "document": {"stages": []}}',
     "source_path: 5"),
    (b'{"format": "stagewright-recovery", "version": 2, "document": {"version": 99, "stages": []}}',
     "newer Stagewright"),
    (b'{"format": "stagewright-recovery", "version": 2, "document": {"rows": []}}', "not a Stagewright project"),
    (b"\x00\xff", "not UTF-8"),
])
def test_a_damaged_recovery_file_is_reported_and_kept_aside(data_dir, content, match):
    data_dir.mkdir()
    (data_dir / "recovery-x.json").write_bytes(content)
    with pytest.raises(ProjectFileError, match=match):
        read_recovery_file(data_dir / "recovery-x.json")
    with claim_orphans() as found:
        assert found.recovered == [] and [u.file.name for u in found.unreadable] == ["recovery-x.json"]
        assert match in found.unreadable[0].message
        kept = found.set_aside(found.unreadable[0])
    assert kept.read_bytes() == content  # never deleted
    assert orphans() == [] and kept.name == "recovery-x.json.unreadable"


def test_failed_write_keeps_the_previous_recovery(data_dir, monkeypatch):
    slot = _written("w", "first")
    before = slot.path.read_bytes()

    def full(*a):
        raise OSError(errno.ENOSPC, "No space left on device")
    monkeypatch.setattr(os, "replace", full)
    with pytest.raises(SaveError, match="the disk is full"):
        slot.write(make_doc(title="second"))
    assert slot.path.read_bytes() == before
    assert sorted(os.listdir(data_dir)) == ["recovery-w.json", "recovery-w.lock"]


def test_write_refuses_non_json_data(data_dir):
    slot = RecoverySlot()
    with pytest.raises(StagewrightError, match="discharge_pressure_Pa"):
        slot.write(make_doc(discharge_pressure_Pa=float("inf")))
    assert slot.read() is None


def test_folder_that_cannot_be_made_is_a_save_error(tmp_path, monkeypatch):
    blocker = tmp_path / "file"
    blocker.write_text("x")
    monkeypatch.setenv("STAGEWRIGHT_DATA_DIR", str(blocker / "sub"))
    with pytest.raises(SaveError, match="cannot create the recovery folder"):
        RecoverySlot().write(make_doc())


# ---- file systems without locks: the owner recorded in the file decides --------------------------
def test_without_locks_a_live_owner_is_recognised_from_the_file(data_dir, monkeypatch):
    monkeypatch.setattr(recovery.OwnerLock, "try_acquire", lambda self: None)  # e.g. NFS refusing flock
    live = _written("live", "this process")
    dead = _written("dead", "an ended process")
    envelope = json.loads(dead.path.read_text())
    envelope["owner"]["pid"] = _dead_pid()
    dead.path.write_text(json.dumps(envelope))
    assert orphans() == [("dead", None, "an ended process")]
    assert live.path.exists()


def _dead_pid() -> int:
    proc = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True, text=True)
    return int(proc.stdout)


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
    code = "import sys, stagewright.gui.document.recovery_file; print(sorted(m for m in sys.modules if m.startswith(('PySide', 'PyQt'))))"
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "[]"
