"""File menu behaviour of the main window: new, open, recent, save, save as, revert, and the
question asked before unsaved changes would be lost. Reading and writing is
:func:`thermo.project.load` / :func:`thermo.project.save`."""
from __future__ import annotations

__all__ = ["FileOps", "MAX_RECENT"]

from pathlib import Path

from PySide6.QtWidgets import QFileDialog, QMessageBox

from thermo import StagewrightError
from thermo import project

from app.document.model import new_document

MAX_RECENT = 8
FILTER = "Stagewright projects (*.json);;All files (*)"


class FileOps:
    """Mixed into :class:`~app.window.main_window.MainWindow` (needs ``editor``, ``settings``, ``path``)."""

    path: Path | None = None
    dirty_without_undo = False  # e.g. a document restored from recovery
    untitled_name = "Untitled"

    # ---- state ---------------------------------------------------------------------------
    def is_modified(self) -> bool:
        return self.dirty_without_undo or not self.editor.undo_stack.isClean()

    def update_title(self) -> None:
        name = self.path.name if self.path else self.untitled_name
        self.setWindowTitle(f"{name}[*] — Stagewright")
        self.setWindowModified(self.is_modified())
        self.action_map["file.revert"].setEnabled(self.path is not None and self.is_modified())

    def _load_into(self, doc: dict, path: Path | None, dirty: bool = False) -> None:
        self.dirty_without_undo = dirty  # first: clearing the stack must not drop a recovery
        self.editor.undo_stack.clear()
        self.path = Path(path) if path else None
        self.untitled_name = "Untitled"
        self.editor.model.replace(doc)
        self.editor.undo_stack.setClean()
        self.update_title()
        self.editor.solve_now(immediate=True)

    # ---- questions (tests replace these) ---------------------------------------------------
    def ask_save_changes(self) -> str:
        """"save", "discard" or "cancel"."""
        box = QMessageBox(QMessageBox.Warning, "Unsaved changes",
                          f"Save the changes to {self.path.name if self.path else 'this new project'}?",
                          QMessageBox.Save | QMessageBox.Discard | QMessageBox.Cancel, self)
        box.setInformativeText("Your changes are lost if you don't save them.")
        answer = box.exec()
        return {QMessageBox.Save: "save", QMessageBox.Discard: "discard"}.get(answer, "cancel")

    def show_error(self, title: str, text: str) -> None:
        QMessageBox.warning(self, title, text)

    def maybe_save(self) -> bool:
        """True when it is fine to drop the current document."""
        if not self.is_modified():
            return True
        answer = self.ask_save_changes()
        if answer == "save":
            return self.save()
        if answer == "discard":
            self.after_discard()
            return True
        return False

    # ---- commands ------------------------------------------------------------------------
    def new_project(self) -> None:
        if self.maybe_save():
            self._load_into(new_document(), None)

    def open_dialog(self) -> None:
        if not self.maybe_save():
            return
        start = str(self.path.parent) if self.path else ""
        name, _ = QFileDialog.getOpenFileName(self, "Open project", start, FILTER)
        if name:
            self.open_path(name, ask=False)

    def open_path(self, name, ask: bool = True) -> bool:
        if ask and not self.maybe_save():
            return False
        try:
            doc = project.load(name)
        except StagewrightError as exc:
            self.show_error("Cannot open project", str(exc))
            self._forget_recent(str(name))
            return False
        self._load_into(doc, Path(name))
        self._remember_recent(str(Path(name).resolve()))
        return True

    def save(self) -> bool:
        if self.path is None:
            return self.save_as()
        return self._write(self.path)

    def save_as(self) -> bool:
        start = str(self.path) if self.path else "untitled.json"
        name, _ = QFileDialog.getSaveFileName(self, "Save project as", start, FILTER)
        if not name:
            return False
        if not name.lower().endswith(".json"):
            name += ".json"
        return self._write(Path(name))

    def _write(self, path: Path) -> bool:
        found = self.editor.model.problems()
        if found and QMessageBox.question(
                self, "Save a project with problems?",
                f"The project has {len(found)} input problem(s) (see Messages). It will be saved as it "
                "is, but it cannot be opened again until they are fixed. Save anyway?") != QMessageBox.Yes:
            return False
        try:
            project.save(self.editor.model.snapshot(), path)
        except (OSError, StagewrightError) as exc:
            self.show_error("Cannot save project", f"{path}: {exc}")
            return False
        self.path = Path(path)
        self.dirty_without_undo = False
        self.editor.undo_stack.setClean()
        self._remember_recent(str(self.path.resolve()))
        self.update_title()
        self.statusBar().showMessage(f"Saved {self.path.name}", 4000)
        self.after_save()
        return True

    def after_save(self) -> None:
        """The saved file is the truth again: no recovery file."""
        self.clear_recovery_file()

    def after_discard(self) -> None:
        """The user chose to drop unsaved changes: the recovery file goes too."""
        self.clear_recovery_file()

    def revert(self) -> None:
        if self.path is None or not self.is_modified():
            return
        if QMessageBox.question(self, "Revert to saved",
                                f"Discard all changes since {self.path.name} was last saved?") == QMessageBox.Yes:
            self.open_path(self.path, ask=False)

    # ---- recent files (plain strings in QSettings) -----------------------------------------
    def recent_files(self) -> list[str]:
        value = self.settings.value("files/recent", [])
        if isinstance(value, str):
            value = [value]
        return [v for v in (value or []) if isinstance(v, str)][:MAX_RECENT]

    def _remember_recent(self, name: str) -> None:
        items = [name] + [r for r in self.recent_files() if r != name]
        self.settings.setValue("files/recent", items[:MAX_RECENT])
        self.rebuild_recent_menu()

    def _forget_recent(self, name: str) -> None:
        resolved = str(Path(name).resolve())
        items = [r for r in self.recent_files() if r not in (name, resolved)]
        self.settings.setValue("files/recent", items)
        self.rebuild_recent_menu()

    def rebuild_recent_menu(self) -> None:
        menu = self.recent_menu
        menu.clear()
        files = self.recent_files()
        for i, name in enumerate(files, 1):
            act = menu.addAction(f"&{i} {Path(name).name}")
            act.setToolTip(name)
            act.triggered.connect(lambda _=False, n=name: self.open_path(n))
        if not files:
            menu.addAction("(none)").setEnabled(False)
        else:
            menu.addSeparator()
            menu.addAction("Clear list", lambda: (self.settings.setValue("files/recent", []),
                                                  self.rebuild_recent_menu()))
