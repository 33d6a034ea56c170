"""The lock that says which running process owns a recovery file (Qt-free).

Semantics checked: POSIX ``flock`` locks belong to the open file description, so a second ``open``
of the same file does not get the lock even in the same process (Linux flock(2) manual page);
the operating system drops it when the process ends.
"""
from __future__ import annotations

import os
import socket
import subprocess
import sys

import pytest

from stagewright.gui.document import owner_lock
from stagewright.gui.document.owner_lock import OwnerLock, owner_alive, process_identity
from tests.conftest import ROOT


def test_one_holder_at_a_time_even_in_one_process(tmp_path):
    first, second = OwnerLock(tmp_path / "x.lock"), OwnerLock(tmp_path / "x.lock")
    assert first.try_acquire() is True and first.try_acquire() is True  # again: still held
    assert second.try_acquire() is False and not second.held
    first.release()
    assert second.try_acquire() is True
    second.release(remove=True)
    assert not (tmp_path / "x.lock").exists()


def test_a_lock_file_replaced_while_locking_is_not_taken_for_the_current_one(tmp_path, monkeypatch):
    path = tmp_path / "x.lock"
    real_lock = owner_lock._lock
    calls = []

    def holder_removes_it_meanwhile(fd):
        if not calls:  # the first file we opened is removed (its holder exited) and another made anew
            os.unlink(path)
            path.write_bytes(b"")
        calls.append(fd)
        return real_lock(fd)
    monkeypatch.setattr(owner_lock, "_lock", holder_removes_it_meanwhile)
    lock = OwnerLock(path)
    assert lock.try_acquire() is True and len(calls) == 2  # the lock is on the file now at the path
    assert OwnerLock(path).try_acquire() is False
    lock.release()


def test_the_lock_ends_with_its_process(tmp_path):
    code = ("import sys; from stagewright.gui.document.owner_lock import OwnerLock; l = OwnerLock(sys.argv[1]); "
            "print(l.try_acquire(), flush=True); sys.stdin.readline()")
    proc = subprocess.Popen([sys.executable, "-c", code, str(tmp_path / "x.lock")], stdin=subprocess.PIPE,
                            stdout=subprocess.PIPE, text=True, cwd=ROOT)
    try:
        assert proc.stdout.readline().strip() == "True"
        assert OwnerLock(tmp_path / "x.lock").try_acquire() is False
    finally:
        proc.kill()
        proc.wait(30)
    assert OwnerLock(tmp_path / "x.lock").try_acquire() is True


def _dead_pid() -> int:
    return int(subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                              capture_output=True, text=True).stdout)


@pytest.mark.skipif(sys.platform.startswith("win"), reason="the fallback is for POSIX file systems without locks")
def test_owner_records():
    me = process_identity()
    assert me["pid"] == os.getpid() and me["host"] == socket.gethostname()
    assert owner_alive(me)
    assert not owner_alive({**me, "pid": _dead_pid()})
    assert owner_alive({**me, "host": me["host"] + "-elsewhere"})  # cannot tell: in doubt, alive
    assert not owner_alive(None) and not owner_alive({"pid": "12"}) and not owner_alive({"pid": True})
    if me["started"] is not None:  # Linux: a reused process id is another process
        assert not owner_alive({**me, "started": str(int(me["started"]) + 1)})


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the stand-in is built on POSIX flock")
def test_the_windows_branch_locks_unlocks_and_removes_after_closing(tmp_path, monkeypatch):
    """msvcrt.locking(fd, LK_NBLCK, 1) raises OSError when another handle holds the byte (Python
    documentation, msvcrt module); a stand-in with those semantics, built on flock, drives the
    Windows branch here."""
    import fcntl
    calls = []

    class FakeMsvcrt:
        LK_NBLCK, LK_UNLCK = 2, 0

        @staticmethod
        def locking(fd, mode, nbytes):
            calls.append((mode, os.lseek(fd, 0, os.SEEK_CUR), nbytes))
            fcntl.flock(fd, fcntl.LOCK_UN if mode == 0 else fcntl.LOCK_EX | fcntl.LOCK_NB)
    monkeypatch.setattr(owner_lock, "fcntl", None)
    monkeypatch.setattr(owner_lock, "msvcrt", FakeMsvcrt)
    first, second = OwnerLock(tmp_path / "x.lock"), OwnerLock(tmp_path / "x.lock")
    assert first.try_acquire() is True and second.try_acquire() is False
    first.release(remove=True)
    assert calls == [(2, 0, 1), (2, 0, 1), (0, 0, 1)] and not (tmp_path / "x.lock").exists()
