"""Saving never loses the last good file: failures are injected at every step.

The guarantee rests on rename(2) replacing the destination atomically (POSIX.1-2017,
*rename*: "If the link named by the new argument exists, it shall be removed and old
renamed to new ... there shall be no point at which a link named new does not exist")
and on ``os.replace`` doing the same on Windows (Python documentation, ``os.replace``).
"""
from __future__ import annotations

import errno
import json
import os
import stat
import subprocess
import sys
import textwrap

import pytest

from tests.conftest import ROOT, SAMPLES, make_doc
from stagewright.core.project.schema import FORMAT_VERSION
from stagewright.core.errors import InputError, SaveError
from stagewright.core.project import backup_path, dumps, load, save
from stagewright.core.project import writing
from stagewright.core.project.writing import file_text

SAMPLE = SAMPLES / "two_stage_plant_air.json"


@pytest.fixture
def project(tmp_path):
    """A saved project and a changed document to save over it."""
    path = tmp_path / "plant.json"
    save(load(SAMPLE), path)
    changed = load(path)
    changed["title"] = "changed"
    return path, changed


def _leftovers(folder):
    return sorted(n for n in os.listdir(folder) if n.endswith(".tmp"))


def test_save_writes_canonical_text_and_keeps_a_backup(project):
    path, changed = project
    original = path.read_bytes()
    save(changed, path)
    assert path.read_text(encoding="utf-8") == file_text(changed)  # dumps, "$schema" first (issue 18)
    assert backup_path(path).read_bytes() == original
    assert load(path) == changed
    assert _leftovers(path.parent) == []


def test_first_save_of_a_new_file_makes_no_backup(tmp_path):
    path = tmp_path / "new.json"
    save(make_doc(), path)
    assert not backup_path(path).exists()
    assert load(path)["version"] == FORMAT_VERSION


def test_key_order_follows_the_schema():
    text = dumps(load(SAMPLE))
    top = [k for k in json.loads(text)]  # json keeps document order
    assert top[:4] == ["format", "version", "title", "note"]
    assert text.index('"kind": "isentropic"') < text.index('"value": 0.82')


def test_a_document_with_problems_is_saved_and_named_on_reading(project):
    # the window asks before saving such a document; the work is kept, and reading names
    # what has to be fixed
    from stagewright.core.errors import InputError as Refused
    from stagewright.core.project import load_with_problems
    path, changed = project
    changed["stages"][0]["efficiency"]["value"] = 7.0
    save(changed, path)
    with pytest.raises(Refused, match=r"stages\[0\]\.efficiency\.value: 7\.0"):
        load(path)
    doc, found = load_with_problems(path)
    assert doc == changed and [p.field for p in found] == ["stages[0].efficiency.value"]


@pytest.mark.parametrize("bad, field", [(float("nan"), "discharge_pressure_Pa"), (object(), "discharge_pressure_Pa")])
def test_save_refuses_values_json_cannot_hold(tmp_path, bad, field):
    doc = make_doc(discharge_pressure_Pa=bad)
    with pytest.raises(InputError, match=field):
        save(doc, tmp_path / "x.json")
    assert os.listdir(tmp_path) == []


def test_save_refuses_a_document_of_another_version_or_format(tmp_path):
    with pytest.raises(InputError, match=f"^version: 0 — expected {FORMAT_VERSION}"):
        save(dict(make_doc(), version=0), tmp_path / "x.json")
    with pytest.raises(InputError, match="^format: 'x' — expected 'stagewright-project'"):
        save(dict(make_doc(), format="x"), tmp_path / "x.json")
    assert os.listdir(tmp_path) == []


def test_unpaired_surrogate_in_text_is_saved_as_an_escape_and_reads_back(tmp_path):
    doc = make_doc(title="odd \ud800 text")  # what a "\ud800" escape in a file gives
    save(doc, tmp_path / "s.json")
    assert load(tmp_path / "s.json")["title"] == "odd \ud800 text"


@pytest.mark.skipif(os.name != "posix", reason="POSIX permission bits")
def test_permissions_of_the_replaced_file_are_kept(project):
    path, changed = project
    os.chmod(path, 0o640)
    save(changed, path)
    assert stat.S_IMODE(os.stat(path).st_mode) == 0o640


@pytest.mark.skipif(os.name != "posix", reason="POSIX umask")
def test_a_new_file_gets_ordinary_permissions(tmp_path):
    umask = os.umask(0o022)
    try:
        save(make_doc(), tmp_path / "n.json")
    finally:
        os.umask(umask)
    assert stat.S_IMODE(os.stat(tmp_path / "n.json").st_mode) == 0o644  # not mkstemp's 0600


@pytest.mark.skipif(not hasattr(os, "symlink") or os.name != "posix", reason="symbolic links")
def test_a_symbolic_link_is_followed(project, tmp_path):
    path, changed = project
    link = tmp_path / "link.json"
    link.symlink_to(path)
    save(changed, link)
    assert link.is_symlink() and load(path)["title"] == "changed"


def test_steps_happen_in_the_safe_order(project, monkeypatch):
    path, changed = project
    calls = []
    real = {name: getattr(os, name) for name in ("fsync", "link", "replace")}
    for name in real:
        monkeypatch.setattr(os, name, lambda *a, _n=name: (calls.append(_n), real[_n](*a))[1])
    save(changed, path)
    # file data on disk before the backup link and the rename; the folder last
    assert calls == ["fsync", "link", "replace", "replace", "fsync"]


# --- injected failures: the original file must stay byte-identical --------------------------

def _fail(err):
    def raiser(*a, **k):
        raise err
    return raiser


class _FullDisk:
    """A file object whose write stores half the data, then fails like a full disk."""

    def __init__(self, fh):
        self.fh = fh

    def write(self, data):
        self.fh.write(data[: len(data) // 2])
        raise OSError(errno.ENOSPC, "No space left on device")

    def __getattr__(self, name):
        return getattr(self.fh, name)

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.fh.close()


def _full_disk(monkeypatch):
    real = os.fdopen
    monkeypatch.setattr(os, "fdopen", lambda *a, **k: _FullDisk(real(*a, **k)))


FAILURES = {
    "disk full on write": (_full_disk, "the disk is full"),
    "fsync fails": (lambda mp: mp.setattr(os, "fsync", _fail(OSError(errno.EIO, "I/O error"))), "I/O error"),
    "replace fails": (lambda mp: mp.setattr(os, "replace", _fail(OSError(errno.EXDEV, "Invalid cross-device link"))),
                      "Invalid cross-device link"),
    "permission denied creating the temp file": (
        lambda mp: mp.setattr(os, "open", _fail(PermissionError(errno.EACCES, "Permission denied"))),
        "permission denied"),
    "backup cannot be made": (
        lambda mp: (mp.setattr(os, "link", _fail(OSError(errno.EPERM, "no links"))),
                    mp.setattr(writing.shutil, "copy2", _fail(OSError(errno.ENOSPC, "full")))),
        "the disk is full"),
    "chmod fails": (lambda mp: mp.setattr(os, "chmod", _fail(PermissionError(errno.EPERM, "Operation not permitted"))),
                    "permission denied"),
}


@pytest.mark.parametrize("name", FAILURES)
def test_injected_failure_leaves_the_original_byte_identical(project, monkeypatch, name):
    path, changed = project
    save(changed, path)  # now there is a backup too
    original, backup = path.read_bytes(), backup_path(path).read_bytes()
    inject, reason = FAILURES[name]
    changed["title"] = "never written"
    with monkeypatch.context() as mp:
        inject(mp)
        with pytest.raises(SaveError, match=rf"cannot save \({reason}.*\); the previous file is unchanged"):
            save(changed, path)
    assert path.read_bytes() == original
    assert backup_path(path).read_bytes() == backup
    assert _leftovers(path.parent) == []
    assert load(path)["title"] == "changed"
    save(changed, path)  # and saving works again afterwards
    assert load(path)["title"] == "never written"


def _project_rename_fails(monkeypatch, path):
    """The rename that puts the new project file in place fails (whatever the order of steps)."""
    real = os.replace

    def project_rename_fails(src, dst):
        if os.path.realpath(dst) == os.path.realpath(path):
            raise OSError(errno.EIO, "I/O error")
        real(src, dst)
    monkeypatch.setattr(os, "replace", project_rename_fails)


def test_rename_failing_after_the_backup_link_keeps_the_original_and_makes_no_backup(project, monkeypatch):
    path, changed = project
    original = path.read_bytes()
    _project_rename_fails(monkeypatch, path)
    with pytest.raises(SaveError, match="I/O error"):
        save(changed, path)
    assert path.read_bytes() == original and not backup_path(path).exists()
    assert _leftovers(path.parent) == []


def test_a_failed_final_rename_keeps_the_older_backup(project, monkeypatch):
    # issue 22 item 4: the backup was replaced before the rename that failed, losing the older one
    path, changed = project
    save(changed, path)  # plant.json = "changed", its backup = the first save
    older_backup, current = backup_path(path).read_bytes(), path.read_bytes()
    changed["title"] = "never written"
    _project_rename_fails(monkeypatch, path)
    with pytest.raises(SaveError, match="the previous file is unchanged"):
        save(changed, path)
    assert path.read_bytes() == current
    assert backup_path(path).read_bytes() == older_backup
    assert _leftovers(path.parent) == []


def test_a_read_only_project_file_is_not_replaced(project):
    # issue 22 item 4: Save replaced a read-only file silently (rename needs only the folder writable)
    path, changed = project
    before = path.read_bytes()
    os.chmod(path, 0o444)
    try:
        with pytest.raises(SaveError, match="read-only"):
            save(changed, path)
        assert path.read_bytes() == before and not backup_path(path).exists()
    finally:
        os.chmod(path, 0o644)
    save(changed, path)  # writable again: saved
    assert load(path)["title"] == "changed"


def test_temporary_files_of_killed_saves_are_removed_by_the_next_save(project):
    # issue 22 item 4: kill -9 during saves left 48 files (142 MB) after 160 kills, never cleaned
    path, changed = project
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                          capture_output=True, text=True, check=True)
    dead_pid = int(dead.stdout)
    folder = path.parent
    orphans = [f".plant.json.{dead_pid}-0123abcd.tmp", f".plant.json.bak.{dead_pid}-4567cdef.tmp"]
    running = f".plant.json.{os.getppid()}-89abcdef.tmp"  # a save in progress by a live process
    legacy_old, legacy_new = ".plant.json.0badc0de.tmp", ".plant.json.1badc0de.tmp"
    other = f".other.json.{dead_pid}-0123abcd.tmp"
    for name in orphans + [running, legacy_old, legacy_new, other]:
        (folder / name).write_bytes(b"x" * 1000)
    os.utime(folder / legacy_old, (1e9, 1e9))  # written in 2001
    save(changed, path)
    left = _leftovers(folder)
    assert not set(orphans) & set(left) and legacy_old not in left
    assert {running, legacy_new, other} <= set(left)
    assert load(path)["title"] == "changed"


def test_backup_falls_back_to_a_copy_without_hard_links(project, monkeypatch):
    path, changed = project
    original = path.read_bytes()
    monkeypatch.setattr(os, "link", _fail(OSError(errno.EPERM, "no hard links on this file system")))
    save(changed, path)
    assert backup_path(path).read_bytes() == original


@pytest.mark.skipif(os.name != "posix" or os.geteuid() == 0, reason="needs a non-root POSIX user")
def test_read_only_folder_is_reported_and_nothing_changes(project):
    path, changed = project
    before = path.read_bytes()
    os.chmod(path.parent, 0o555)
    try:
        with pytest.raises(SaveError, match="permission denied"):
            save(changed, path)
    finally:
        os.chmod(path.parent, 0o755)
    assert path.read_bytes() == before


def test_missing_folder_is_a_save_error(tmp_path):
    with pytest.raises(SaveError, match="cannot save"):
        save(make_doc(), tmp_path / "no" / "such" / "folder.json")


# --- a process killed in the middle of saving --------------------------------------------

_KILLED = textwrap.dedent("""
    import os, sys, time
    sys.path.insert(0, {root!r})
    from stagewright.core.project import load, save
    point = sys.argv[2]
    real = {{"fsync": os.fsync, "link": os.link, "replace": os.replace}}
    def hang(name):
        def wrapper(*args):
            if name == point:
                print("ready", flush=True)
                time.sleep(60)
            return real[name](*args)
        return wrapper
    for name in real:
        setattr(os, name, hang(name))
    doc = load(sys.argv[1])
    doc["title"] = "half-saved"
    doc["note"] = "x" * 19000
    save(doc, sys.argv[1])
""")


@pytest.mark.parametrize("point", ["fsync", "link", "replace"])
def test_process_killed_mid_save_leaves_the_original(project, point, tmp_path):
    path, _ = project
    original = path.read_bytes()
    script = tmp_path / "killed.py"
    script.write_text(_KILLED.format(root=str(ROOT)), encoding="utf-8")
    proc = subprocess.Popen([sys.executable, str(script), str(path), point],
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    try:
        assert proc.stdout.readline().strip() == "ready", proc.stderr.read()
        proc.kill()  # SIGKILL on POSIX, TerminateProcess on Windows: no clean-up runs
    finally:
        proc.wait(timeout=30)
        proc.stdout.close()
        proc.stderr.close()
    assert path.read_bytes() == original
    assert load(path)["title"] != "half-saved"
    # a stray temporary file may remain; it is hidden and never read
    assert all(n.startswith(".plant.json") for n in _leftovers(path.parent))


def test_plain_data_is_what_the_text_reads_back_as_in_the_same_key_order():
    # the recovery copy writes plain_data compactly; a save writes dumps: the same data, same order
    import json
    from pathlib import Path

    from stagewright.core.project.writing import dumps, plain_data
    folder = Path(__file__).resolve().parent.parent / "sample_projects"
    for path in sorted(folder.glob("*.json")):
        doc = json.loads(path.read_text(encoding="utf-8"))
        doc["year"] = {"profile": {"kind": "bins", "bins": [
            {"hours": 1.0, "relative_humidity": 0.5, "temperature_K": 270.0 + 0.01 * k} for k in range(500)]}}
        data = plain_data(doc)
        again = json.loads(dumps(doc))
        assert data == again and json.dumps(data) == json.dumps(again), path.name


@pytest.mark.parametrize("bad, field", [
    (float("inf"), r"stages\[1\]\.heat_loss_W"), (object(), r"stages\[1\]\.heat_loss_W"),
    ([1.0, float("nan")], r"stages\[1\]\.heat_loss_W\[1\]")])
def test_values_json_cannot_hold_are_named_deep_in_the_document(bad, field):
    # the quick check of plain data finds them; the error still names the field
    from stagewright.core.project.writing import plain_data
    doc = make_doc()
    doc["stages"] = [dict(doc["stages"][0]), dict(doc["stages"][0], heat_loss_W=bad)]
    with pytest.raises(InputError, match=field):
        plain_data(doc)


def test_a_key_that_is_not_text_is_refused():
    from stagewright.core.project.writing import plain_data
    doc = make_doc()
    doc["stages"] = [dict(doc["stages"][0], **{"x": 1})]
    doc["stages"][0][3] = 1.0
    with pytest.raises(InputError, match="object keys must be text"):
        plain_data(doc)
