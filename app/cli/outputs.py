"""Files the sub-commands write: never over an input, never two onto one, never silently.

Every output a sub-command is about to write is checked before any work starts
(:func:`output_problems`): an output that is one of the inputs (by name, through a symbolic
link or a hard link) is refused; two outputs that are one file (two inputs of one name from
different folders, written into one folder) are refused; an existing file is replaced only
with ``--force``. Writing itself is atomic (:func:`write_text_atomically`): a temporary file
beside the output, then one rename, which replaces a symbolic link by the new file rather
than writing into what it points at.
"""
from __future__ import annotations

__all__ = ["output_problems", "write_text_atomically", "FORCE_HELP"]

import os
from pathlib import Path

FORCE_HELP = "replace output files that already exist (never an input file)"


def _identity(path: Path):
    """What makes two names one file: (device, inode) when it exists, else the resolved path."""
    try:
        info = os.stat(path)
        return ("inode", info.st_dev, info.st_ino)
    except OSError:
        return ("path", os.path.normcase(os.path.realpath(path)))


def output_problems(inputs: list[Path], outputs: list[Path], force: bool,
                    create_folders: bool = False) -> list[str]:
    """One line per output that must not be written; empty when all may be.

    Parameters
    ----------
    inputs : list of Path
        The files read.
    outputs : list of Path
        The files to be written, in order.
    force : bool
        Replace outputs that exist (``--force``); inputs are never replaced.
    create_folders : bool
        The sub-command creates a missing output folder (else a missing folder is refused).

    Examples
    --------
    >>> output_problems([Path("a.json")], [Path("a.json")], force=True)
    ['a.json: is an input file; choose another output name (inputs are never overwritten)']
    """
    lines = []
    read = {_identity(p): p for p in inputs}
    seen: dict = {}
    for out in outputs:
        ident = _identity(out)
        if ident in read or os.path.normcase(os.path.realpath(out)) in {
                os.path.normcase(os.path.realpath(p)) for p in inputs}:
            lines.append(f"{out}: is an input file; choose another output name (inputs are never overwritten)")
        elif ident in seen:
            lines.append(f"{out}: would be written twice (also as {seen[ident]}); inputs of one name from "
                         "different folders need different output folders or names")
        elif out.is_dir():
            lines.append(f"{out}: is a folder; give a file name")
        elif not create_folders and not out.parent.is_dir() and not os.path.lexists(out):
            lines.append(f"{out}: the folder {out.parent} does not exist")
        elif os.path.lexists(out) and not force:
            lines.append(f"{out}: exists; give --force to replace it")
        seen.setdefault(ident, out)
    return lines


def write_text_atomically(path: Path, text: str) -> None:
    """Write ``text`` (UTF-8) to ``path``: a temporary file beside it, then one rename.

    Raises
    ------
    OSError
        When the file cannot be written; ``path`` is then unchanged.
    """
    from stagewright.gui.report.atomic import atomic_path

    with atomic_path(path) as tmp:
        with open(tmp, "w", encoding="utf-8", newline="") as fh:
            fh.write(text)
            fh.flush()
            os.fsync(fh.fileno())
