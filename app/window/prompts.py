"""Every question and message box the window puts in front of the user, in one place.

The window's controllers (:mod:`app.window.file_ops`, :mod:`app.window.export_ops`,
:mod:`app.window.recovery_ops`) ask through the window's one :class:`Prompts`; tests replace its
methods, so no modal dialog ever opens in a test.
"""
from __future__ import annotations

__all__ = ["Prompts", "PROJECT_FILTER"]

from PySide6.QtWidgets import QFileDialog, QMessageBox, QWidget

from app.window.export_ops import PDF_AND_CSV, PDF_ONLY

PROJECT_FILTER = "Stagewright projects (*.json);;All files (*)"


class Prompts:
    """Modal questions and messages, parented to ``parent`` (the main window)."""

    def __init__(self, parent: QWidget) -> None:
        self.parent = parent

    def ask_save_changes(self, name: str) -> str:
        """Before unsaved changes to ``name`` would be lost: "save", "discard" or "cancel"."""
        box = QMessageBox(QMessageBox.Warning, "Unsaved changes", f"Save the changes to {name}?",
                          QMessageBox.Save | QMessageBox.Discard | QMessageBox.Cancel, self.parent)
        box.setInformativeText("Your changes are lost if you don't save them.")
        answer = box.exec()
        return {QMessageBox.Save: "save", QMessageBox.Discard: "discard"}.get(answer, "cancel")

    def ask_restore(self, source_name: str) -> bool:
        """At start: restore the unsaved work a previous session left on ``source_name``?"""
        box = QMessageBox(QMessageBox.Question, "Restore unsaved work?",
                          f"The last session ended with unsaved changes to {source_name}.",
                          QMessageBox.Yes | QMessageBox.No, self.parent)
        box.setInformativeText("Restore them? (No discards them.)")
        box.button(QMessageBox.Yes).setText("Restore")
        box.button(QMessageBox.No).setText("Discard")
        return box.exec() == QMessageBox.Yes

    def confirm(self, title: str, text: str) -> bool:
        """A yes/no question; True for yes."""
        return QMessageBox.question(self.parent, title, text) == QMessageBox.Yes

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

    def show_error(self, title: str, text: str) -> None:
        QMessageBox.warning(self.parent, title, text)
