"""Which running process owns a file: an OS lock held for the owner's lifetime. Qt-free.

A recovery file belongs to the window process that writes it until that process ends, even
when it ends by a crash or ``kill -9``. The owner holds an exclusive lock on a small lock file
beside it; the operating system drops the lock when the process ends, however it ends, so
another process can tell a live owner from a dead one by trying to take the lock without
waiting:

* POSIX: ``fcntl.flock(fd, LOCK_EX | LOCK_NB)`` — a lock on the open file description; a second
  ``open`` of the same file, even in the same process, does not get it while the first holds it.
* Windows: ``msvcrt.locking(fd, LK_NBLCK, 1)`` — a byte-range lock owned by the file handle.

Some network file systems refuse ``flock`` (``ENOLCK``, ``EOPNOTSUPP``). :meth:`OwnerLock.try_acquire`
then answers ``None`` and the caller falls back to the owner recorded in the file itself
(:func:`process_identity`, checked by :func:`owner_alive`: the same host, the process id still in
use and, on Linux, the same process start time, so a reused id is not taken for the owner).
"""
from __future__ import annotations

__all__ = ["OwnerLock", "process_identity", "owner_alive"]

import errno
import os
import socket
import sys
from pathlib import Path

try:  # POSIX
    import fcntl
except ImportError:  # Windows
    fcntl = None
try:  # Windows
    import msvcrt
except ImportError:  # POSIX
    msvcrt = None

_HELD_ERRNOS = {errno.EAGAIN, errno.EWOULDBLOCK, errno.EACCES}


class OwnerLock:
    """An exclusive lock on ``path`` (created if missing), held until :meth:`release` or the process ends.

    Parameters
    ----------
    path : path-like
        The lock file. Its content is never read: only the lock on it counts.
    """

    def __init__(self, path) -> None:
        self.path = Path(path)
        self._fd: int | None = None

    @property
    def held(self) -> bool:
        """True while this object holds the lock."""
        return self._fd is not None

    def try_acquire(self) -> bool | None:
        """Take the lock without waiting.

        Returns
        -------
        bool or None
            True: this object holds it now (or held it already). False: another holder, alive,
            has it. None: the file system cannot lock; ask :func:`owner_alive` instead.

        Raises
        ------
        OSError
            The lock file cannot be created or opened (e.g. a read-only folder).
        """
        if self._fd is not None:
            return True
        for _ in range(3):  # the holder may remove and another re-create the file in between
            fd = os.open(self.path, os.O_RDWR | os.O_CREAT | getattr(os, "O_BINARY", 0), 0o600)
            outcome = _lock(fd)
            if outcome is not True:
                os.close(fd)
                return outcome
            if _still_at_path(fd, self.path):
                self._fd = fd
                return True
            os.close(fd)  # locked a file its holder had just removed: try the new one
        return False

    def release(self, remove: bool = False) -> None:
        """Let the lock go; ``remove``: delete the lock file too (while still holding it on POSIX)."""
        fd, self._fd = self._fd, None
        if fd is None:
            return
        if remove and msvcrt is None:
            _unlink_quietly(self.path)  # before the lock goes: nobody can hold a removed file's lock usefully
        try:
            if msvcrt is not None:
                os.lseek(fd, 0, os.SEEK_SET)
                msvcrt.locking(fd, msvcrt.LK_UNLCK, 1)
        except OSError:
            pass  # closing the handle below releases it anyway
        finally:
            os.close(fd)
        if remove and msvcrt is not None:
            _unlink_quietly(self.path)  # Windows cannot remove an open file

    def __del__(self) -> None:  # a forgotten lock is released with its object, as at process end
        if getattr(self, "_fd", None) is not None:
            try:
                os.close(self._fd)
            except OSError:
                pass


def _lock(fd: int) -> bool | None:
    """True locked, False held by another, None cannot lock on this file system."""
    try:
        if fcntl is not None:
            fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
        elif msvcrt is not None:
            os.lseek(fd, 0, os.SEEK_SET)
            msvcrt.locking(fd, msvcrt.LK_NBLCK, 1)  # beyond the end of an empty file is allowed
        else:
            return None
    except OSError as exc:
        if msvcrt is not None or exc.errno in _HELD_ERRNOS:
            return False
        return None  # ENOLCK, EOPNOTSUPP, EINVAL …: no locks here
    return True


def _still_at_path(fd: int, path: Path) -> bool:
    if msvcrt is not None:
        return True  # Windows refuses to remove an open file: it cannot have been replaced
    try:
        return os.path.samestat(os.fstat(fd), os.stat(path))
    except OSError:
        return False


def _unlink_quietly(path: Path) -> None:
    try:
        path.unlink()
    except OSError:
        pass  # gone already, or another process has it open (Windows): it is only a lock file


def _start_time(pid: int) -> str | None:
    """The process's start time in clock ticks after boot (Linux ``/proc/<pid>/stat`` field 22), or None."""
    try:
        with open(f"/proc/{pid}/stat", "rb") as fh:
            text = fh.read().decode("ascii", "replace")
    except OSError:
        return None
    fields = text.rpartition(")")[2].split()  # the command name (field 2) may hold spaces
    return fields[19] if len(fields) > 19 else None


def process_identity() -> dict:
    """This process as an owner record: ``{"pid", "host", "started"}`` (JSON data)."""
    pid = os.getpid()
    return {"pid": pid, "host": socket.gethostname(), "started": _start_time(pid)}


def owner_alive(owner) -> bool:
    """Whether the process in an owner record (from :func:`process_identity`) still runs.

    Used only where the file system cannot lock. In doubt the owner counts as alive (its work
    is then not offered to another process, never deleted): another host, an unknown platform.
    A record that is missing or malformed means an owner that never registered: not alive.
    """
    if not isinstance(owner, dict) or not isinstance(owner.get("pid"), int) or isinstance(owner.get("pid"), bool):
        return False
    if owner.get("host") != socket.gethostname() or not hasattr(os, "kill") or sys.platform.startswith("win"):
        return True  # cannot look at another host's processes; os.kill on Windows would end the process
    pid = owner["pid"]
    try:
        os.kill(pid, 0)  # signal 0: only checks that the process exists
    except ProcessLookupError:
        return False
    except PermissionError:
        pass  # it exists, under another user
    except OSError:
        return True
    started = owner.get("started")
    now = _start_time(pid)
    return not (started is not None and now is not None and now != started)  # a reused id is another process
