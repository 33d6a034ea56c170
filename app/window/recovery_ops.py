"""Autosave and recovery in the window, on top of the Qt-free :mod:`stagewright.gui.document.recovery_file`.

Autosave: the first change after the project was last clean (or last autosaved) starts a
single-shot timer of :data:`AUTOSAVE_MS`; further changes do not restart it, so the unsaved work
reaches the window's recovery file at most that long after the first unsaved change, however
often the user types (a maximum delay, not a debounce). A save, an explicit "don't save", an undo
back to the saved state and a clean exit remove the file.

Recovery: each window's file names the project it belongs to and is owned by the window's
process while it runs (:mod:`stagewright.gui.document.owner_lock`), so only work of sessions that have ended
is ever offered, each to the project it came from:

* at start-up without a project file — work on new (never saved) projects, and work whose file
  is no longer there; work on other files is kept and mentioned in the status bar;
* when a project file is opened (start-up with a file, File ▸ Open, Open Recent) — that file's
  own work, if it is newer than the file on disk.

Each offer is Restore, Keep for later or Discard; nothing is deleted unless the user discards it
or it was restored into this window's own recovery file.
"""
from __future__ import annotations

__all__ = ["RecoveryController", "AUTOSAVE_MS"]

import sys
from pathlib import Path

from PySide6.QtCore import QObject, Qt, QTimer
from PySide6.QtWidgets import QStatusBar

from stagewright.gui.document import recovery_file as rec

AUTOSAVE_MS = 3000


class RecoveryController(QObject):
    """Autosave of unsaved work to this window's recovery file, and the offers to restore a crashed session's.

    Parameters
    ----------
    editor : Editor
        The window's editor (its document and undo stack).
    files : FileController
        Whether there are unsaved changes, the source path; a save or a discard clears the file,
        an opened file gets its own recovered work offered.
    prompts : Prompts
        The restore question and errors.
    status : QStatusBar
        Autosave failures, a restore, work kept for another project.
    interval_ms : int or None
        Longest delay from the first unsaved change to the write (None: no autosave and no
        recovery, e.g. screenshots and most tests).
    """

    def __init__(self, editor, files, prompts, status: QStatusBar, interval_ms: int | None = AUTOSAVE_MS,
                 parent: QObject | None = None):
        super().__init__(parent)
        self.editor = editor
        self.files = files
        self.prompts = prompts
        self.status = status
        self._timer: QTimer | None = None
        self.slot: rec.RecoverySlot | None = None
        files.saved.connect(self.clear)  # the saved file is the truth again
        files.discarded.connect(self.clear)  # the user let the changes go
        files.opened.connect(self.offer_for_file)
        if interval_ms is None:
            return
        self.slot = rec.RecoverySlot()
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        # precise: a coarse timer (Qt's default) may fire up to 5 % of the interval late, and the
        # promise is a write at most interval_ms after the first unsaved change
        self._timer.setTimerType(Qt.TimerType.PreciseTimer)
        self._timer.setInterval(interval_ms)
        self._timer.timeout.connect(self.write_now)
        # the stack's index moves after the command ran: only then is the change "unsaved"
        editor.undo_stack.indexChanged.connect(self._on_change)
        editor.undo_stack.cleanChanged.connect(self._on_clean)

    @property
    def enabled(self) -> bool:
        return self._timer is not None

    def _on_change(self, *_args) -> None:
        # started by the first unsaved change, never restarted: a write at most interval_ms later
        if self._timer is not None and self.files.is_modified() and not self._timer.isActive():
            self._timer.start()

    def _on_clean(self, clean: bool) -> None:
        if clean and not self.files.dirty_without_undo:  # back to what is on disk: nothing to recover
            self.clear()

    def write_now(self) -> bool:
        if self.slot is None or not self.files.is_modified():
            return False
        if self._timer is not None:
            self._timer.stop()
        try:
            self.slot.write(self.editor.model.project_snapshot(), self.files.path)
        except Exception as exc:  # SaveError, or a bug: tell the user, never crash
            self.status.showMessage(f"Autosave failed: {exc}", 8000)
            return False
        return True

    def clear(self) -> None:
        """Remove this window's recovery file (a save, a discard, an undo back to the saved state)."""
        if self._timer is None:
            return
        self._timer.stop()
        try:
            self.slot.clear()
        except OSError as exc:
            print(f"stagewright: could not remove the recovery file: {exc}", file=sys.stderr)

    def shutdown(self) -> None:
        """A clean exit (the window's closeEvent): the work is saved or was let go, so the recovery
        file goes, the process lets its claim go and autosave stops following the undo stack (which
        is deleted with the window)."""
        if self._timer is None:
            return
        self.clear()
        self.editor.undo_stack.indexChanged.disconnect(self._on_change)
        self.editor.undo_stack.cleanChanged.disconnect(self._on_clean)
        self._timer = None
        try:
            self.slot.release()
        except OSError as exc:
            print(f"stagewright: could not remove the recovery file: {exc}", file=sys.stderr)

    # ---- offers --------------------------------------------------------------------------
    def offer(self) -> bool:
        """At start-up: offer what ended sessions left for this window's project; True if restored.

        Without a project file: work on new projects and work whose file is gone. With one: that
        file's own work (as when a file is opened).
        """
        if self.files.path is not None:
            return self.offer_for_file(self.files.path)
        return self._offer(lambda r: r.untitled or not r.source_exists(),
                           "open that file to restore it")

    def offer_for_file(self, path) -> bool:
        """``path`` was just opened: offer its own unsaved work from an ended session if newer than the file."""
        path = Path(path)
        return self._offer(lambda r: r.belongs_to(path) and r.newer_than_source(),
                           "start Stagewright without a file (new projects) or open its file to restore it",
                           stale=lambda r: r.belongs_to(path))

    def _offer(self, wanted, how_to_restore: str, stale=lambda r: False) -> bool:
        if not self.enabled:
            return False
        try:
            with rec.claim_orphans(self.slot.folder, exclude=[self.slot.path]) as found:
                self._set_aside_unreadable(found)
                for item in [r for r in found.recovered if wanted(r)]:
                    answer = self.prompts.ask_restore(item.project_name(), _local_time(item))
                    if answer == "restore":
                        self._restore(item, found)
                        return True
                    if answer == "discard":
                        found.discard(item)
                self._mention_kept(found, wanted, stale, how_to_restore)
        except OSError as exc:  # a recovery folder that cannot be read or changed: say so, keep going
            self.prompts.show_error("Recovery files", f"{exc}")
        return False

    def _restore(self, item: rec.Recovered, found: rec.Orphans) -> None:
        self.files.load(item.document, item.source_path, dirty=True)
        name = item.project_name()
        if self.write_now():  # it lives on in this window's own recovery file: the old one can go
            found.discard(item)
            self.status.showMessage(f"Restored unsaved work on {name}", 6000)
        else:  # when in doubt, keep the file
            self.status.showMessage(f"Restored unsaved work on {name}; its recovery copy {item.file} is kept", 10000)

    def _set_aside_unreadable(self, found: rec.Orphans) -> None:
        for bad in list(found.unreadable):
            try:
                kept = found.set_aside(bad)
            except OSError as exc:
                kept = f"{bad.file} (could not be renamed: {exc.strerror or exc})"
            self.prompts.show_error("Recovery file unreadable",
                                    f"{bad.message}\n\nIt is not offered again; the file is kept as {kept}.")

    def _mention_kept(self, found: rec.Orphans, wanted, stale, how_to_restore: str) -> None:
        """Tell the user about ended sessions' work left in the recovery folder, and how to get it back."""
        others = [r for r in found.recovered if not wanted(r)]
        if not others:
            return
        older = [r for r in others if stale(r)]
        if older:
            self.status.showMessage(
                f"A recovery copy of {older[0].project_name()} older than the file on disk was not "
                f"offered; it is kept in {self.slot.folder}", 15000)
            return
        names = sorted({r.project_name() for r in others})
        self.status.showMessage(f"Unsaved work from a session that ended without saving is kept for "
                                f"{', '.join(names)}: {how_to_restore}.", 15000)


def _local_time(item: rec.Recovered) -> str:
    return item.saved_at.astimezone().strftime("%Y-%m-%d %H:%M")
