"""Autosave and recovery in the window, on top of the Qt-free :mod:`app.document.recovery_file`.

A few seconds after a change, while the project has unsaved changes, the document and its
source path are written to the recovery file; a save, an explicit "don't save" and a
clean exit remove it. At start the window offers to restore what a previous session left.
"""
from __future__ import annotations

__all__ = ["RecoveryOps", "AUTOSAVE_MS"]

import sys

from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QMessageBox

from app.document import recovery_file as rec

AUTOSAVE_MS = 3000


class RecoveryOps:
    """Mixed into :class:`~app.window.main_window.MainWindow` (needs ``editor``, ``path``, FileOps)."""

    def setup_autosave(self, interval_ms: int | None = AUTOSAVE_MS) -> None:
        """Start autosaving (``None``: off, e.g. screenshots and most tests)."""
        self._autosave = None
        if interval_ms is None:
            return
        self._autosave = QTimer(self)
        self._autosave.setSingleShot(True)
        self._autosave.setInterval(interval_ms)
        self._autosave.timeout.connect(self.write_recovery_now)
        # the stack's index moves after the command ran: only then is the change "unsaved"
        self.editor.undo_stack.indexChanged.connect(self._on_change_for_autosave)
        self.editor.undo_stack.cleanChanged.connect(self._on_clean_for_autosave)

    @property
    def autosave_enabled(self) -> bool:
        return getattr(self, "_autosave", None) is not None

    def _on_change_for_autosave(self, *_args) -> None:
        if self._autosave is not None and self.is_modified():
            self._autosave.start()

    def _on_clean_for_autosave(self, clean: bool) -> None:
        if clean and not self.dirty_without_undo:  # back to what is on disk: nothing to recover
            self.clear_recovery_file()

    def write_recovery_now(self) -> bool:
        if not self.is_modified():
            return False
        try:
            rec.write_recovery(self.editor.model.snapshot(), self.path)
        except Exception as exc:  # SaveError, or a bug: tell the user, never crash
            self.statusBar().showMessage(f"Autosave failed: {exc}", 8000)
            return False
        return True

    def clear_recovery_file(self) -> None:
        if getattr(self, "_autosave", None) is not None:
            self._autosave.stop()
        if not self.autosave_enabled:
            return
        try:
            rec.clear_recovery()
        except OSError as exc:
            print(f"stagewright: could not remove the recovery file: {exc}", file=sys.stderr)

    # ---- start-up ------------------------------------------------------------------------
    def ask_restore(self, source_name: str) -> bool:
        """Tests replace this question."""
        box = QMessageBox(QMessageBox.Question, "Restore unsaved work?",
                          f"The last session ended with unsaved changes to {source_name}.",
                          QMessageBox.Yes | QMessageBox.No, self)
        box.setInformativeText("Restore them? (No discards them.)")
        box.button(QMessageBox.Yes).setText("Restore")
        box.button(QMessageBox.No).setText("Discard")
        return box.exec() == QMessageBox.Yes

    def offer_recovery(self) -> bool:
        """If a previous session left unsaved work, offer to restore it; True if restored."""
        if not self.autosave_enabled:
            return False
        try:
            found = rec.read_recovery()
        except Exception as exc:  # a damaged recovery file: say so, then drop it
            self.show_error("Recovery file unreadable", f"{exc}\n\nThe recovery file is removed.")
            self.clear_recovery_file()
            return False
        if found is None:
            return False
        doc, source = found
        name = source.name if source else "a new project"
        if not self.ask_restore(name):
            self.clear_recovery_file()
            return False
        self._load_into(doc, source, dirty=True)
        self.write_recovery_now()  # still recoverable until it is saved
        self.statusBar().showMessage(f"Restored unsaved work on {name}", 6000)
        return True
