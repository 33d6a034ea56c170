"""Write project files so that no failure can lose the last good file.

:func:`dumps` gives the on-disk text: UTF-8 JSON, two-space indent, keys in the order of
:mod:`stagewright.core.project.schema` (``format`` and ``version`` first, a variant's ``kind`` first), so
that files read well and diff well under version control.

:func:`atomic_write` writes a temporary file in the destination's folder, flushes and
fsyncs it, links the previous file to a temporary backup name, renames the temporary file
over the destination, then renames the backup into place, and fsyncs the folder (POSIX).
The rename is atomic, so at every instant the destination holds either the complete old
file or the complete new one: a full disk, a permission error or a killed process leaves
the old file, and the older backup, byte for byte. A file marked read-only is not replaced.
A killed process can leave a hidden ``.<name>.<pid>-<random>.tmp`` file behind; it is never
read, and the next save of that file removes it once its process has ended
(:func:`remove_orphans`).
"""
from __future__ import annotations

__all__ = ["dumps", "plain_data", "file_text", "save", "atomic_write", "backup_path", "remove_orphans"]

import contextlib
import errno
import json
import math
import os
import re
import secrets
import shutil
import stat
import time
from pathlib import Path
from typing import Any

from stagewright.core.project import schema
from stagewright.core.errors import InputError, SaveError
from stagewright.core.project.schema_types import Items, Obj, Variant
from stagewright.core.project.parse import MAX_FILE_BYTES
from stagewright.core.project.reading import SCHEMA_ID, SCHEMA_KEY


def backup_path(path) -> Path:
    """Where :func:`save` keeps the previous version of ``path``: ``name.json.bak`` beside it."""
    path = Path(path)
    return path.with_name(path.name + ".bak")


def _ordered(node: Any, value: Any) -> Any:
    """``value`` with object keys in schema order; keys the schema does not know go last, sorted."""
    if isinstance(value, list):
        item = node.item if isinstance(node, Items) else None
        return [_ordered(item, v) for v in value]
    if not isinstance(value, dict):
        return value
    if isinstance(node, Obj):
        fields, first = node.fields, ()
    elif isinstance(node, Variant):
        fields, first = node.variants.get(value.get(node.tag), {}), (node.tag,)
    else:
        fields, first = {}, ()
    keys = [k for k in first if k in value] + [k for k in fields if k in value]
    keys += sorted(k for k in value if k not in keys)
    return {k: _ordered(fields.get(k), value[k]) for k in keys}


def _plain(value: Any) -> bool:
    """True when ``value`` is plain JSON data that reads back the same (the quick pass of
    :func:`_check_data`: no field paths are made unless something is wrong; exact types only,
    anything else goes to the full check)."""
    t = type(value)
    if t is dict:
        return all(type(k) is str for k in value) and all(map(_plain, value.values()))
    if t is list or t is tuple:
        return all(map(_plain, value))
    if t is float:
        return value - value == 0.0  # not NaN nor ±inf
    return t is str or t is int or t is bool or value is None


def _check_data(value: Any, path: str) -> None:
    """Refuse what JSON cannot hold or would not read back the same."""
    if path == "" and _plain(value):
        return
    if isinstance(value, dict):
        for k, v in value.items():
            if not isinstance(k, str):
                raise InputError(f"{path}.{k}" if path else str(k), k, "object keys must be text")
            _check_data(v, f"{path}.{k}" if path else k)
    elif isinstance(value, (list, tuple)):
        for i, v in enumerate(value):
            _check_data(v, f"{path}[{i}]")
    elif isinstance(value, float) and not math.isfinite(value):
        raise InputError(path, value, "expected a finite number")
    elif value is not None and not isinstance(value, (str, int, float, bool)):
        raise InputError(path, type(value).__name__, "expected plain JSON data")


def plain_data(doc: dict) -> dict:
    """``doc`` as :func:`dumps` writes it, as data: checked to be plain JSON data (finite numbers,
    text keys) and in schema key order, without making the text (for a caller that writes it
    compactly, e.g. a recovery copy: the standard library's C encoder does not indent).

    Raises
    ------
    InputError
        What JSON cannot hold or would not read back the same (NaN, an object, a non-text key).

    Examples
    --------
    >>> list(plain_data({"title": "t", "version": 1, "format": "stagewright-project"}))
    ['format', 'version', 'title']
    """
    _check_data(doc, "")
    return _ordered(schema.PROJECT, doc)


def dumps(doc: dict) -> str:
    """Serialise a document: pretty-printed, schema key order, text ending in a newline.

    Examples
    --------
    >>> print(dumps({"title": "t", "version": 1, "format": "stagewright-project"}), end="")
    {
      "format": "stagewright-project",
      "version": 1,
      "title": "t"
    }
    """
    _check_data(doc, "")
    return json.dumps(_ordered(schema.PROJECT, doc), indent=2, ensure_ascii=False, allow_nan=False) + "\n"


def file_text(doc: dict) -> str:
    """What :func:`save` writes: :func:`dumps` with ``"$schema": SCHEMA_ID`` as the first key, so
    that editors validate and complete the file against the schema shipped with the package
    (:mod:`stagewright.core.project.json_schema`; the reader ignores the key).

    Examples
    --------
    >>> print(file_text({"format": "stagewright-project", "version": 3}), end="")
    {
      "$schema": "urn:stagewright:project:3",
      "format": "stagewright-project",
      "version": 3
    }
    """
    body = dumps({k: v for k, v in doc.items() if k != SCHEMA_KEY})
    first = "{\n  " + json.dumps(SCHEMA_KEY) + ": " + json.dumps(SCHEMA_ID)
    return first + ("\n}\n" if body == "{}\n" else "," + body[1:])


def _encode(text: str, doc_for_ascii) -> bytes:
    try:
        return text.encode("utf-8")
    except UnicodeEncodeError:
        # text with an unpaired surrogate (read from a \\ud800 escape) cannot be UTF-8;
        # the all-ASCII form escapes it and reads back identical
        return (json.dumps(doc_for_ascii, indent=2, ensure_ascii=True, allow_nan=False) + "\n").encode("ascii")


def _fsync_dir(folder: Path) -> None:
    if os.name != "posix":
        return  # Windows cannot open a folder for fsync; its rename is durable on NTFS
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass  # some file systems refuse fsync on a folder; the rename has happened
    finally:
        os.close(fd)


def _link_backup(path: Path, bak: Path) -> str:
    """The previous content of ``path`` under a temporary name beside ``bak`` (hard link, else a
    copy); :func:`atomic_write` renames it to ``bak`` only once the new file is in place, so a
    failed save keeps the older backup."""
    tmp = _temp_name(bak)
    try:
        try:
            os.link(path, tmp)  # the old inode lives on under the backup name: no copy, no window
        except OSError:
            shutil.copy2(path, tmp)  # a file system without hard links
    except BaseException:
        _unlink_quietly(tmp)
        raise
    return tmp


def _unlink_quietly(name: str | None) -> None:
    if name is not None:
        try:
            os.unlink(name)
        except OSError:
            pass


def _temp_name(path: Path) -> str:
    """``.<name>.<pid>-<random>.tmp`` beside ``path``: hidden, never read, and naming the process
    that wrote it, so that one left by a killed process can be removed (:func:`remove_orphans`)."""
    return str(path.with_name(f".{path.name}.{os.getpid()}-{secrets.token_hex(4)}.tmp"))


_ORPHAN = re.compile(r"^\.(?P<name>.+)\.(?:(?P<pid>\d+)-)?[0-9a-f]{8}\.tmp$")
#: a temporary file of the older naming (no process id) is removed when older than this, [s]
_LEGACY_ORPHAN_AGE_S = 3600.0


def _process_alive(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OSError, OverflowError):
        return True  # exists (another user's), or cannot tell: keep the file
    return True


def remove_orphans(path) -> list[str]:
    """Remove temporary files of saves of ``path`` (and of its backup) that a killed process left.

    A file ``.<name>.<pid>-<random>.tmp`` is removed when process ``pid`` has ended; one of the
    older naming without a process id when it is more than an hour old. A save in progress by a
    running process is never touched. Never raises.

    Returns
    -------
    list of str
        The names removed.
    """
    path = Path(path)
    names = {path.name, backup_path(path).name}
    removed = []
    try:
        entries = list(os.scandir(path.parent))
    except OSError:
        return removed
    now = time.time()
    for entry in entries:
        m = _ORPHAN.match(entry.name)
        if not m or m.group("name") not in names:
            continue
        try:
            if m.group("pid") is not None:
                stale = not _process_alive(int(m.group("pid")))
            else:
                stale = now - entry.stat(follow_symlinks=False).st_mtime > _LEGACY_ORPHAN_AGE_S
            if stale and entry.is_file(follow_symlinks=False):
                os.unlink(entry.path)
                removed.append(entry.name)
        except OSError:
            continue
    return removed


def _create_temp(path: Path) -> tuple[int, str]:
    """Create ``.<name>.<random>.tmp`` beside ``path``, mode 0666 less the umask (a new
    file gets ordinary permissions, unlike mkstemp's 0600)."""
    flags = os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_BINARY", 0)
    for _ in range(100):
        tmp = _temp_name(path)
        try:
            return os.open(tmp, flags, 0o666), tmp
        except FileExistsError:
            continue
    raise FileExistsError(errno.EEXIST, "no free temporary file name", str(path.parent))


def _reason(exc: OSError) -> str:
    if exc.errno == errno.ENOSPC:
        return "the disk is full"
    if exc.errno in (errno.EACCES, errno.EPERM):
        return "permission denied"
    return exc.strerror or str(exc)


def atomic_write(path, data: bytes, backup: bool = True) -> None:
    """Replace ``path`` by ``data`` atomically, keeping the previous file as a backup.

    Parameters
    ----------
    path : str or Path
        Destination file. A symbolic link is followed: its target is replaced.
    data : bytes
        The complete new content.
    backup : bool
        Keep the previous file as :func:`backup_path` (``name.json.bak``).

    Raises
    ------
    SaveError
        For any failure (disk full, permission denied, missing folder …); the previous
        file, and its backup, are unchanged.
    """
    path = Path(os.path.realpath(path))
    folder = path.parent
    tmp = bak_tmp = None
    try:
        try:
            old = os.stat(path)
        except FileNotFoundError:
            old = None
        if old is not None and not stat.S_ISREG(old.st_mode):
            raise SaveError(f"{path}: cannot save over something that is not a regular file")
        if old is not None and not _writable(path, old):
            raise SaveError(f"{path}: the file is read-only; nothing was written (save under another "
                            "name, or make the file writable first)")
        remove_orphans(path)
        fd, tmp = _create_temp(path)
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        if old is not None:
            os.chmod(tmp, stat.S_IMODE(old.st_mode))  # keep the permissions of the file replaced
        if backup and old is not None:
            bak_tmp = _link_backup(path, backup_path(path))
        os.replace(tmp, path)
        tmp = None
        if bak_tmp is not None:
            # the new file is in place: only now does the previous one become the backup (if
            # this rename fails, the save has succeeded and the older backup stays)
            with contextlib.suppress(OSError):
                os.replace(bak_tmp, backup_path(path))
                bak_tmp = None
    except OSError as exc:
        raise SaveError(f"{path}: cannot save ({_reason(exc)}); the previous file is unchanged") from exc
    finally:
        _unlink_quietly(tmp)
        _unlink_quietly(bak_tmp)
    _fsync_dir(folder)


def _writable(path: Path, info: os.stat_result) -> bool:
    """False for a file marked read-only (no write permission bit: a superuser may write it,
    but the user marked it so), or one this user may not write."""
    if not info.st_mode & (stat.S_IWUSR | stat.S_IWGRP | stat.S_IWOTH):
        return False
    return os.access(path, os.W_OK)


def save(doc: dict, path) -> None:
    """Write ``doc`` to ``path`` atomically, keeping the previous file as ``path.bak``.

    The file is written with ``$schema`` (:data:`stagewright.core.project.reading.SCHEMA_ID`, for
    editors; the reader ignores it), ``format`` and ``version`` set. A document with validation
    problems (a value out of range, a missing key) is written as it is — the window asks
    the user first — and :func:`stagewright.core.project.load` will name those problems when it is
    read; :func:`stagewright.core.project.load_with_problems` opens it anyway.

    Parameters
    ----------
    doc : dict
        A project document of the current format version (left unchanged).
    path : str or Path
        Destination, conventionally ``*.json``.

    Raises
    ------
    InputError
        If the document is not plain JSON data (NaN, infinity, an object that is not a
        dict, list, str, number, bool or None), or declares another format version;
        nothing is written.
    SaveError
        If writing fails; the previous file and its backup are unchanged.
    """
    if not isinstance(doc, dict):
        raise InputError("(document)", type(doc).__name__, "expected a project object")
    if doc.get("version", schema.FORMAT_VERSION) != schema.FORMAT_VERSION:
        raise InputError("version", doc.get("version"),
                         f"expected {schema.FORMAT_VERSION}: save writes current-version documents "
                         "(stagewright.core.project.migrate upgrades older ones)")
    if doc.get("format", schema.FORMAT_NAME) != schema.FORMAT_NAME:
        raise InputError("format", doc.get("format"), f"expected {schema.FORMAT_NAME!r}")
    full = {"format": schema.FORMAT_NAME, "version": schema.FORMAT_VERSION, **doc}
    full.pop(SCHEMA_KEY, None)
    data = _encode(file_text(full), {SCHEMA_KEY: SCHEMA_ID, **_ordered(schema.PROJECT, full)})
    if len(data) > MAX_FILE_BYTES:
        raise SaveError(f"{path}: the project would be {len(data)} bytes, more than the "
                        f"{MAX_FILE_BYTES} a project file may hold; nothing was written")
    atomic_write(path, data, backup=True)
