"""Autosave and recovery in the window, on top of the Qt-free :mod:`app.document.recovery_file`.

A few seconds after a change, while the project has unsaved changes, the document and its
source path are written to the recovery file; a save, an explicit "don't save" and a
clean exit remove it. At start the window offers to restore what a previous session left.
"""
from __future__ import annotations

__all__ = ["RecoveryController", "AUTOSAVE_MS"]

import sys

from PySide6.QtCore import QObject, QTimer
from PySide6.QtWidgets import QStatusBar

from app.document import recovery_file as rec

AUTOSAVE_MS = 3000


class RecoveryController(QObject):
    """Autosave of unsaved work to the recovery file, and the offer to restore it at start.

    Parameters
    ----------
    editor : Editor
        The window's editor (its document and undo stack).
    files : FileController
        Whether there are unsaved changes, the source path; a save or a discard clears the file.
    prompts : Prompts
        The restore question and errors.
    status : QStatusBar
        Autosave failures and a restore.
    interval_ms : int or None
        Delay from a change to the write (None: no autosave, e.g. screenshots and most tests).
    """

    def __init__(self, editor, files, prompts, status: QStatusBar, interval_ms: int | None = AUTOSAVE_MS,
                 parent: QObject | None = None):
        super().__init__(parent)
        self.editor = editor
        self.files = files
        self.prompts = prompts
        self.status = status
        self._timer: QTimer | None = None
        files.saved.connect(self.clear)  # the saved file is the truth again
        files.discarded.connect(self.clear)  # the user let the changes go
        if interval_ms is None:
            return
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(interval_ms)
        self._timer.timeout.connect(self.write_now)
        # the stack's index moves after the command ran: only then is the change "unsaved"
        editor.undo_stack.indexChanged.connect(self._on_change)
        editor.undo_stack.cleanChanged.connect(self._on_clean)

    @property
    def enabled(self) -> bool:
        return self._timer is not None

    def _on_change(self, *_args) -> None:
        if self._timer is not None and self.files.is_modified():
            self._timer.start()

    def _on_clean(self, clean: bool) -> None:
        if clean and not self.files.dirty_without_undo:  # back to what is on disk: nothing to recover
            self.clear()

    def write_now(self) -> bool:
        if not self.files.is_modified():
            return False
        try:
            rec.write_recovery(self.editor.model.snapshot(), self.files.path)
        except Exception as exc:  # SaveError, or a bug: tell the user, never crash
            self.status.showMessage(f"Autosave failed: {exc}", 8000)
            return False
        return True

    def clear(self) -> None:
        """Remove the recovery file (a save, a discard, a clean exit)."""
        if self._timer is None:
            return
        self._timer.stop()
        try:
            rec.clear_recovery()
        except OSError as exc:
            print(f"stagewright: could not remove the recovery file: {exc}", file=sys.stderr)

    def shutdown(self) -> None:
        """A clean exit (the window's closeEvent): the work is saved or was let go, so the recovery
        file goes and autosave stops following the undo stack (which is deleted with the window)."""
        self.clear()
        if self._timer is not None:
            self.editor.undo_stack.indexChanged.disconnect(self._on_change)
            self.editor.undo_stack.cleanChanged.disconnect(self._on_clean)
            self._timer = None

    # ---- start-up ------------------------------------------------------------------------
    def offer(self) -> bool:
        """If a previous session left unsaved work, offer to restore it; True if restored."""
        if not self.enabled:
            return False
        try:
            found = rec.read_recovery()
        except Exception as exc:  # a damaged recovery file: say so, then drop it
            self.prompts.show_error("Recovery file unreadable", f"{exc}\n\nThe recovery file is removed.")
            self.clear()
            return False
        if found is None:
            return False
        doc, source = found
        name = source.name if source else "a new project"
        if not self.prompts.ask_restore(name):
            self.clear()
            return False
        self.files.load(doc, source, dirty=True)
        self.write_now()  # still recoverable until it is saved
        self.status.showMessage(f"Restored unsaved work on {name}", 6000)
        return True
