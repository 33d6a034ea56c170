"""Recovery files: unsaved work survives a crash, and goes back to the project it came from. Qt-free.

Each window keeps its own recovery file, a :class:`RecoverySlot`::

    recovery_dir() / "recovery-<window id>.json"    the unsaved document and whose it is
    recovery_dir() / "recovery-<window id>.lock"    held locked by the window's process (owner_lock)

The window's process holds the lock for as long as it runs, so another Stagewright process
never takes a live window's work for a crashed session's; when the process ends — cleanly or
by a crash — the operating system drops the lock. A clean exit removes both files; after a
crash they stay, and :func:`claim_orphans` (at start-up, or when a file is opened) finds them:
only recovery files whose owner is gone, each claimed (locked) while the user decides, so two
processes starting together never offer the same work twice.

``recovery_dir()`` is ``$STAGEWRIGHT_DATA_DIR`` if set (tests, portable installs); else
``%APPDATA%\\Stagewright`` on Windows, ``~/Library/Application Support/Stagewright`` on macOS,
``$XDG_DATA_HOME/stagewright`` or ``~/.local/share/stagewright`` elsewhere. Nothing is created
until something is written.

A recovery file is a small JSON envelope around the project document, naming the project it
belongs to (its file, or none for a project never saved, with the window's id) and its owner::

    {"format": "stagewright-recovery", "version": 2, "saved_at": "2024-05-01T10:00:00.123456+00:00",
     "source_path": "/home/ann/plant.json" | null, "window": "3f9c0a1b2d4e",
     "owner": {"pid": 4242, "host": "ann-laptop", "started": "123456"}, "document": {…project…}}

Version 1 files (``recovery.json``, one per user, no owner; written by earlier releases) are
still read, as the work of a session that has ended. Files are read as data only, with the same
size and depth limits as project files. Nothing here deletes work the user did not let go: a
recovery file that cannot be read is renamed ``….unreadable`` and kept.
"""
from __future__ import annotations

__all__ = ["recovery_dir", "RecoverySlot", "Recovered", "Unreadable", "Orphans", "claim_orphans",
           "read_recovery_file", "new_window_id", "ENV_VAR", "RECOVERY_FORMAT"]

import contextlib
import datetime
import json
import os
import secrets
import sys
from dataclasses import dataclass, field
from pathlib import Path

from stagewright.core.errors import InputError, ProjectFileError, SaveError
from stagewright.core.project.migrate import migrate
from stagewright.core.project.parse import MAX_FILE_BYTES, parse_bytes, read_limited
from stagewright.core.project.reading import recognise
from stagewright.core.project.schema import FORMAT_NAME
from stagewright.core.project.writing import atomic_write, plain_data

from stagewright.gui.document.owner_lock import OwnerLock, owner_alive, process_identity

ENV_VAR = "STAGEWRIGHT_DATA_DIR"
RECOVERY_FORMAT = "stagewright-recovery"
_ENVELOPE_VERSION = 2
_LEGACY_NAME = "recovery.json"  # version 1: one slot per user, no owner
_PREFIX = "recovery-"
UNREADABLE_SUFFIX = ".unreadable"


def _platform_dir() -> Path:
    home = Path.home()
    if sys.platform.startswith("win"):
        appdata = os.environ.get("APPDATA")
        return (Path(appdata) if appdata else home / "AppData" / "Roaming") / "Stagewright"
    if sys.platform == "darwin":
        return home / "Library" / "Application Support" / "Stagewright"
    xdg = os.environ.get("XDG_DATA_HOME", "")
    # the XDG base-directory specification: an empty or relative value is ignored
    base = Path(xdg) if xdg and os.path.isabs(xdg) else home / ".local" / "share"
    return base / "stagewright"


def recovery_dir() -> Path:
    """The user data folder that holds the recovery files (see the module docstring)."""
    override = os.environ.get(ENV_VAR)
    return Path(override) if override else _platform_dir()


def new_window_id() -> str:
    """A fresh id for one window's recovery slot (12 hex digits, random)."""
    return secrets.token_hex(6)


def _lock_path(data: Path) -> Path:
    return data.with_suffix(".lock")


@dataclass(frozen=True)
class Recovered:
    """The unsaved work in one recovery file.

    Attributes
    ----------
    file : Path
        The recovery file.
    window : str
        Id of the window that wrote it.
    document : dict
        The project, upgraded to the current format version; possibly with validation problems
        (work in progress is kept as it was).
    source_path : Path or None
        The project's file (absolute), or None for a project never saved.
    saved_at : datetime.datetime
        When it was written (UTC).
    """

    file: Path
    window: str
    document: dict
    source_path: Path | None
    saved_at: datetime.datetime

    @property
    def untitled(self) -> bool:
        return self.source_path is None

    def source_exists(self) -> bool:
        return self.source_path is not None and self.source_path.is_file()

    def belongs_to(self, path) -> bool:
        """Whether this is unsaved work on the project file ``path``."""
        if self.source_path is None or path is None:
            return False
        try:
            return os.path.samefile(self.source_path, path)
        except OSError:  # one of them is missing: compare the names
            return self.source_path.resolve() == Path(path).resolve()

    def newer_than_source(self) -> bool:
        """Whether it was written after the project file last changed on disk (True if that file is gone)."""
        try:
            mtime = self.source_path.stat().st_mtime if self.source_path else None
        except OSError:
            return True
        return mtime is None or self.saved_at.timestamp() > mtime

    def project_name(self) -> str:
        """How a person recognises the project: its file name, or the title of a new project."""
        if self.source_path is not None:
            return self.source_path.name
        title = str(self.document.get("title") or "").strip()
        return f"the new project “{title}”" if title else "a new project"


@dataclass(frozen=True)
class Unreadable:
    """A recovery file of a session that has ended, which cannot be read (damaged, or a newer version)."""

    file: Path
    message: str


def read_recovery_file(path) -> Recovered:
    """Read one recovery file.

    Raises
    ------
    ProjectFileError
        The file is damaged, not a recovery file, or of an unknown version.
    """
    path = Path(path)
    try:
        envelope = parse_bytes(read_limited(path))
    except ProjectFileError as exc:
        raise ProjectFileError(f"recovery file {path}: {exc}", line=exc.line, column=exc.column) from None
    if not isinstance(envelope, dict) or envelope.get("format") != RECOVERY_FORMAT \
            or envelope.get("version") not in (1, _ENVELOPE_VERSION) or not isinstance(envelope.get("document"), dict):
        raise ProjectFileError(f"recovery file {path}: not a Stagewright recovery file of version 1 or "
                               f"{_ENVELOPE_VERSION}", field="(document)")
    source = envelope.get("source_path")
    if source is not None and not isinstance(source, str):
        raise ProjectFileError(f"recovery file {path}: source_path: {source!r} — expected text or null",
                               field="source_path")
    try:
        saved_at = datetime.datetime.fromisoformat(str(envelope.get("saved_at")))
    except ValueError:
        saved_at = datetime.datetime.fromtimestamp(path.stat().st_mtime, datetime.timezone.utc)
    if saved_at.tzinfo is None:
        saved_at = saved_at.replace(tzinfo=datetime.timezone.utc)
    doc, _ = migrate(recognise(envelope["document"]))
    window = envelope.get("window")
    window = window if isinstance(window, str) else path.stem.removeprefix(_PREFIX)
    return Recovered(path, window, {"format": FORMAT_NAME, **doc}, Path(source) if source is not None else None,
                     saved_at)


class RecoverySlot:
    """One window's recovery file, owned by this process from the first write until :meth:`release`.

    Parameters
    ----------
    folder : path-like, optional
        Where it lives (default :func:`recovery_dir`, read now).
    window : str, optional
        The window's id (default: a new one).
    """

    def __init__(self, folder=None, window: str | None = None) -> None:
        self.folder = Path(folder) if folder is not None else recovery_dir()
        self.window = window or new_window_id()
        self.path = self.folder / f"{_PREFIX}{self.window}.json"
        self._lock = OwnerLock(_lock_path(self.path))

    def write(self, doc: dict, source_path=None) -> None:
        """Store the unsaved document and the file it belongs to (None for a new project), atomically.

        The document is not validated: autosave never refuses work in progress.

        Raises
        ------
        InputError
            ``doc`` is not plain JSON data (e.g. holds NaN or an object).
        SaveError
            The file cannot be written; the previous recovery file is unchanged.
        """
        if not isinstance(doc, dict):
            raise InputError("(document)", type(doc).__name__, "expected a project object")
        body = plain_data(doc)  # schema key order; refuses NaN and objects
        envelope = {
            "format": RECOVERY_FORMAT,
            "version": _ENVELOPE_VERSION,
            "saved_at": datetime.datetime.now(datetime.timezone.utc).isoformat(timespec="microseconds"),
            "source_path": None if source_path is None else str(Path(source_path).absolute()),
            "window": self.window,
            "owner": process_identity(),
            "document": body,
        }
        # compact: the standard library's C encoder (it does not indent) writes an 8760-bin year
        # some ten times faster, and autosave runs on the GUI thread
        data = (json.dumps(envelope, ensure_ascii=True, separators=(",", ":")) + "\n").encode("ascii")
        if len(data) > MAX_FILE_BYTES:
            raise SaveError(f"recovery copy would be {len(data)} bytes, more than {MAX_FILE_BYTES}")
        try:
            self.folder.mkdir(parents=True, exist_ok=True)
        except OSError as exc:
            raise SaveError(f"{self.folder}: cannot create the recovery folder ({exc.strerror or exc})") from exc
        self._own()
        atomic_write(self.path, data, backup=False)

    def _own(self) -> None:
        """Hold the lock before the first write, so the file is never seen without a live owner."""
        try:
            got = self._lock.try_acquire()
        except OSError as exc:
            raise SaveError(f"{self._lock.path}: cannot create the lock file ({exc.strerror or exc})") from exc
        if got is False:  # ids are random: only a copied folder could make this happen
            raise SaveError(f"{self.path}: another running Stagewright holds this recovery file")

    def read(self) -> Recovered | None:
        """What this window last stored, or None."""
        return read_recovery_file(self.path) if self.path.exists() else None

    def clear(self) -> None:
        """Remove the recovery file (a save, a discard): this window keeps the slot for later changes."""
        try:
            self.path.unlink()
        except FileNotFoundError:
            pass
        except OSError as exc:
            raise SaveError(f"{self.path}: cannot remove the recovery file ({exc.strerror or exc})") from exc

    def release(self) -> None:
        """A clean exit: remove the recovery file, then let the lock go and remove the lock file."""
        self.clear()
        self._lock.release(remove=True)


@dataclass
class Orphans:
    """Recovery files of sessions that have ended, each claimed (locked) by this process until :meth:`release`.

    Attributes
    ----------
    recovered : list of Recovered
        Readable work, newest first.
    unreadable : list of Unreadable
        Files that could not be read.
    """

    recovered: list = field(default_factory=list)
    unreadable: list = field(default_factory=list)
    _locks: dict = field(default_factory=dict, repr=False)

    def discard(self, item: Recovered | Unreadable) -> None:
        """Delete the recovery file (the user let the work go, or it lives on in another file)."""
        item.file.unlink(missing_ok=True)
        self._forget(item, remove_lock=True)

    def set_aside(self, item: Unreadable) -> Path:
        """Rename an unreadable file ``….unreadable`` (kept, never offered again); returns the new path."""
        target = item.file.with_name(item.file.name + UNREADABLE_SUFFIX)
        os.replace(item.file, target)
        self._forget(item, remove_lock=True)
        return target

    def _forget(self, item, remove_lock: bool) -> None:
        lock = self._locks.pop(item.file, None)
        if lock is not None:
            lock.release(remove=remove_lock)
        for group in (self.recovered, self.unreadable):
            if item in group:
                group.remove(item)

    def release(self) -> None:
        """Let every claim go; the files not discarded stay for a later session."""
        for lock in self._locks.values():
            lock.release()
        self._locks.clear()


def _claim(data: Path, locks: dict) -> bool:
    """Lock ``data``'s lock file if its owner is gone; True when claimed."""
    lock = OwnerLock(_lock_path(data))
    try:
        got = lock.try_acquire()
    except OSError:
        return False  # cannot even open the lock file (read-only folder): leave it alone
    if got is None:  # no locks on this file system: ask whether the recorded owner still runs
        try:
            owner = json.loads(read_limited(data)).get("owner")
        except (OSError, ValueError, AttributeError, ProjectFileError):
            owner = None
        if owner_alive(owner):
            return False
    elif not got:
        return False
    locks[data] = lock
    return True


def _candidates(folder: Path) -> list[Path]:
    try:
        names = sorted(os.listdir(folder))
    except OSError:
        return []
    return [folder / n for n in names
            if n == _LEGACY_NAME or (n.startswith(_PREFIX) and n.endswith(".json"))]


@contextlib.contextmanager
def claim_orphans(folder=None, exclude=()):
    """The recovery files whose owning process has ended, claimed while the ``with`` block runs.

    Parameters
    ----------
    folder : path-like, optional
        Where to look (default :func:`recovery_dir`).
    exclude : iterable of Path
        Recovery files never to consider (this window's own).

    Yields
    ------
    Orphans
        Readable work newest first, and the files that could not be read. A file a live process
        owns — another window, in this process or another — is never among them.
    """
    found = Orphans()
    skip = {Path(p) for p in exclude}
    try:
        for data in _candidates(Path(folder) if folder is not None else recovery_dir()):
            if data in skip or not _claim(data, found._locks):
                continue
            if not data.exists():  # its owner removed it on a clean exit just before the claim
                found._locks.pop(data).release(remove=True)
                continue
            try:
                found.recovered.append(read_recovery_file(data))
            except (ProjectFileError, OSError) as exc:
                found.unreadable.append(Unreadable(data, str(exc)))
        found.recovered.sort(key=lambda r: r.saved_at, reverse=True)
        yield found
    finally:
        found.release()
