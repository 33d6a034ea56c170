"""Recovery file: unsaved work survives a crash. Qt-free; the window drives it.

API (keep this shape; the window's autosave timer and start-up prompt call it)::

    recovery_dir() -> Path
        The user data folder: $STAGEWRIGHT_DATA_DIR if set (tests, portable installs);
        else %APPDATA%\\Stagewright on Windows, ~/Library/Application Support/Stagewright
        on macOS, $XDG_DATA_HOME/stagewright or ~/.local/share/stagewright elsewhere.
        Not created until something is written.
    recovery_file() -> Path
        recovery_dir() / "recovery.json".
    write_recovery(doc, source_path=None) -> None
        Store the unsaved document, and the file it was opened from or saved to (None for a
        new project), atomically. Raises SaveError (a StagewrightError) if it cannot be
        written; the previous recovery file is then unchanged.
    read_recovery() -> (doc, source_path) | None
        None when there is nothing to recover. Otherwise the document, upgraded to the
        current format version, and the source path (a Path, or None). The document is
        returned even when it has validation problems (work in progress is kept as it
        was; thermo.project.validation.problems lists them). Raises ProjectFileError (a
        StagewrightError) when a recovery file exists but is damaged or of an unknown
        version; the window shows the message and may call clear_recovery().
    clear_recovery() -> None
        Remove the recovery file (nothing to do if there is none).

How the window uses it: after each change, a single-shot timer of a few seconds calls
``write_recovery(doc, path)`` while the project has unsaved changes; after a successful
save, after "discard changes" and on a clean exit it calls ``clear_recovery()``. At start
it calls ``read_recovery()``; a result means the last session ended without saving, so
it offers to restore the document (marked as modified, with its source path) or discard
it. There is one recovery slot per user: a second window running at the same time
overwrites it.

The file is a small JSON envelope around the project document::

    {"format": "stagewright-recovery", "version": 1, "saved_at": "2024-05-01T10:00:00+00:00",
     "source_path": "/home/ann/plant.json" | null, "document": {…project…}}

It is read as data only, with the same size and depth limits as project files.
"""
from __future__ import annotations

__all__ = ["recovery_dir", "recovery_file", "write_recovery", "read_recovery", "clear_recovery",
           "ENV_VAR", "RECOVERY_FORMAT"]

import datetime
import json
import os
import sys
from pathlib import Path

from thermo.errors import InputError, ProjectFileError, SaveError
from thermo.project.parse import MAX_FILE_BYTES, parse_bytes, read_limited
from thermo.project.migrate import migrate
from thermo.project.reading import recognise
from thermo.project.schema import FORMAT_NAME
from thermo.project.writing import atomic_write, dumps

ENV_VAR = "STAGEWRIGHT_DATA_DIR"
RECOVERY_FORMAT = "stagewright-recovery"
_ENVELOPE_VERSION = 1
_FILE_NAME = "recovery.json"


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
    """The user data folder that holds the recovery file (see the module docstring)."""
    override = os.environ.get(ENV_VAR)
    return Path(override) if override else _platform_dir()


def recovery_file() -> Path:
    """Path of the recovery file."""
    return recovery_dir() / _FILE_NAME


def write_recovery(doc: dict, source_path=None) -> None:
    """Store unsaved work so that it survives a crash.

    Parameters
    ----------
    doc : dict
        The project document being edited (current format version). It is not
        validated here: autosave must never refuse work in progress.
    source_path : str or Path or None
        The file the project belongs to, or None for a project never saved.

    Raises
    ------
    InputError
        If ``doc`` is not plain JSON data (e.g. holds NaN or an object).
    SaveError
        If the file cannot be written; the previous recovery file is unchanged.
    """
    if not isinstance(doc, dict):
        raise InputError("(document)", type(doc).__name__, "expected a project object")
    body = json.loads(dumps(doc))  # plain data, schema key order; refuses NaN and objects
    envelope = {
        "format": RECOVERY_FORMAT,
        "version": _ENVELOPE_VERSION,
        "saved_at": datetime.datetime.now(datetime.timezone.utc).isoformat(timespec="seconds"),
        "source_path": None if source_path is None else str(Path(source_path).absolute()),
        "document": body,
    }
    data = (json.dumps(envelope, indent=1, ensure_ascii=True) + "\n").encode("ascii")
    if len(data) > MAX_FILE_BYTES:
        raise SaveError(f"recovery copy would be {len(data)} bytes, more than {MAX_FILE_BYTES}")
    folder = recovery_dir()
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise SaveError(f"{folder}: cannot create the recovery folder ({exc.strerror or exc})") from exc
    atomic_write(folder / _FILE_NAME, data, backup=False)


def read_recovery():
    """The unsaved work of a session that did not end cleanly, or None.

    Returns
    -------
    tuple of (dict, Path or None), or None
        The current-version document (possibly with validation problems, as it was being
        edited) and its source path.

    Raises
    ------
    ProjectFileError
        The recovery file is damaged, not a project, or of an unknown version.
    """
    path = recovery_file()
    if not path.exists():
        return None
    try:
        envelope = parse_bytes(read_limited(path))
    except ProjectFileError as exc:
        raise ProjectFileError(f"recovery file {path}: {exc}", line=exc.line, column=exc.column) from None
    if not isinstance(envelope, dict) or envelope.get("format") != RECOVERY_FORMAT \
            or envelope.get("version") != _ENVELOPE_VERSION or not isinstance(envelope.get("document"), dict):
        raise ProjectFileError(f"recovery file {path}: not a Stagewright recovery file of version "
                               f"{_ENVELOPE_VERSION}", field="(document)")
    source = envelope.get("source_path")
    if source is not None and not isinstance(source, str):
        raise ProjectFileError(f"recovery file {path}: source_path: {source!r} — expected text or null",
                               field="source_path")
    doc, _ = migrate(recognise(envelope["document"]))
    return {"format": FORMAT_NAME, **doc}, (Path(source) if source is not None else None)


def clear_recovery() -> None:
    """Remove the recovery file, if there is one."""
    try:
        recovery_file().unlink()
    except FileNotFoundError:
        pass
    except OSError as exc:
        raise SaveError(f"{recovery_file()}: cannot remove the recovery file ({exc.strerror or exc})") from exc
