"""Every question and message box the window puts in front of the user, in one place.

Every box shows its text as plain text (:func:`stagewright.gui.widgets.plain_text.plain_label`): names and
messages from a project file are never rendered as markup.

The window's controllers (:mod:`stagewright.gui.window.file_ops`, :mod:`stagewright.gui.window.export_ops`,
:mod:`stagewright.gui.window.recovery_ops`) ask through the window's one :class:`Prompts`; tests replace its
methods, so no modal dialog ever opens in a test.
"""
from __future__ import annotations

__all__ = ["Prompts", "PROJECT_FILTER"]

from PySide6.QtWidgets import QFileDialog, QMessageBox, QWidget

from stagewright.gui.widgets.plain_text import plain_label
from stagewright.gui.window.export_ops import PDF_AND_CSV, PDF_ONLY

PROJECT_FILTER = "Stagewright projects (*.json);;All files (*)"


class Prompts:
    """Modal questions and messages, parented to ``parent`` (the main window)."""

    def __init__(self, parent: QWidget) -> None:
        self.parent = parent

    def ask_save_changes(self, name: str) -> str:
        """Before unsaved changes to ``name`` would be lost: "save", "discard" or "cancel"."""
        box = QMessageBox(QMessageBox.Warning, "Unsaved changes", f"Save the changes to {name}?",
                          QMessageBox.Save | QMessageBox.Discard | QMessageBox.Cancel, self.parent)
        plain_label(box)
        box.setInformativeText("Your changes are lost if you don't save them.")
        answer = box.exec()
        return {QMessageBox.Save: "save", QMessageBox.Discard: "discard"}.get(answer, "cancel")

    def ask_restore(self, project_name: str, saved_at: str) -> str:
        """Unsaved work on ``project_name`` from a session that ended without saving (last written at
        ``saved_at``, local time): "restore", "keep" (for later) or "discard"."""
        box = QMessageBox(QMessageBox.Question, "Restore unsaved work?",
                          f"A Stagewright session ended without saving its changes to {project_name} "
                          f"(last kept at {saved_at}).", QMessageBox.NoButton, self.parent)
        plain_label(box)
        box.setInformativeText("Restore them in this window? Keep for Later leaves them in the recovery "
                               "folder; Discard deletes them.")
        restore = box.addButton("Restore", QMessageBox.AcceptRole)
        keep = box.addButton("Keep for Later", QMessageBox.RejectRole)
        discard = box.addButton("Discard", QMessageBox.DestructiveRole)
        box.setDefaultButton(restore)
        box.setEscapeButton(keep)
        box.exec()
        clicked = box.clickedButton()
        return "restore" if clicked is restore else "discard" if clicked is discard else "keep"

    def confirm_overwrite(self, paths) -> bool:
        """Replace the existing files ``paths`` (ones the file dialog did not ask about)? True for yes."""
        paths = list(paths)
        several = len(paths) > 1
        names = "\n".join(str(p) for p in paths)
        box = QMessageBox(QMessageBox.Warning, "Replace existing files?" if several else "Replace existing file?",
                          f"{'These files already exist' if several else 'This file already exists'}:\n{names}",
                          QMessageBox.Cancel, self.parent)
        plain_label(box)
        box.setInformativeText("Replacing them overwrites what they hold." if several
                               else "Replacing it overwrites what it holds.")
        replace = box.addButton("Replace", QMessageBox.DestructiveRole)
        box.setDefaultButton(QMessageBox.Cancel)
        box.exec()
        return box.clickedButton() is replace

    def confirm(self, title: str, text: str) -> bool:
        """A yes/no question; True for yes."""
        box = plain_label(QMessageBox(QMessageBox.Question, title, text, QMessageBox.Yes | QMessageBox.No, self.parent))
        box.setDefaultButton(QMessageBox.Yes)
        return box.exec() == QMessageBox.Yes

    def open_project_name(self, start: str) -> str:
        """The project file to open ("" when the user cancels)."""
        name, _ = QFileDialog.getOpenFileName(self.parent, "Open project", start, PROJECT_FILTER)
        return name

    def save_project_name(self, start: str) -> str:
        """Where to save the project ("" when the user cancels)."""
        name, _ = QFileDialog.getSaveFileName(self.parent, "Save project as", start, PROJECT_FILTER)
        return name

    def export_target(self, start: str) -> tuple[str, str]:
        """Where to write the report: (pdf path or "", the chosen filter, PDF_AND_CSV or PDF_ONLY)."""
        return QFileDialog.getSaveFileName(self.parent, "Export report", start, f"{PDF_AND_CSV};;{PDF_ONLY}")

    def error_box(self, title: str, text: str) -> QMessageBox:
        """The message box of :meth:`show_error`, not yet shown: ``text`` as plain text."""
        return plain_label(QMessageBox(QMessageBox.Warning, title, text, QMessageBox.Ok, self.parent))

    def show_error(self, title: str, text: str) -> None:
        self.error_box(title, text).exec()
