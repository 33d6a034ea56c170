"""File menu of the window: new, open, recent, save, save as, revert, and the question asked
before unsaved changes would be lost. Reading and writing is :func:`stagewright.core.project.load` /
:func:`stagewright.core.project.save`."""
from __future__ import annotations

__all__ = ["FileController", "MAX_RECENT", "PROJECT_FOLDER_KEY", "start_folder", "remember_folder"]

from pathlib import Path

from PySide6.QtCore import QObject, QStandardPaths, Signal
from PySide6.QtWidgets import QMenu, QStatusBar

from stagewright.core import StagewrightError
from stagewright.core import project

from stagewright.gui.widgets.plain_text import plain_tip
from stagewright.gui.document.file_names import file_stem_for, with_suffix_added
from stagewright.gui.document.model import new_document

MAX_RECENT = 8
PROJECT_FOLDER_KEY = "files/last_folder"


def start_folder(settings, key: str) -> Path:
    """Where a file dialog starts: the last folder used for ``key`` (kept in QSettings) if it still
    exists, else the user's documents folder, else the home folder — never the process's current
    directory."""
    last = settings.value(key, "")
    if isinstance(last, str) and last and Path(last).is_dir():
        return Path(last)
    docs = QStandardPaths.writableLocation(QStandardPaths.DocumentsLocation)
    return Path(docs) if docs and Path(docs).is_dir() else Path.home()


def remember_folder(settings, key: str, file_path) -> None:
    """Keep the folder of ``file_path`` as the next dialog's start for ``key``."""
    settings.setValue(key, str(Path(file_path).absolute().parent))


class FileController(QObject):
    """The file the window's one project comes from and goes to, and whether it has unsaved changes.

    Parameters
    ----------
    editor : Editor
        The window's editor (its document model and undo stack).
    settings : QSettings
        Where the recent-files list lives.
    prompts : Prompts
        The window's questions and messages.
    status : QStatusBar
        Where a save is announced.
    path : path-like, optional
        File the document came from.

    Signals
    -------
    state_changed()
        The file name or the unsaved-changes state changed (the window title follows).
    saved()
        The document was written: the file is the truth again.
    discarded()
        The user chose to drop the unsaved changes.
    opened(Path)
        A project file was opened by the user (not a revert): its recovered work may be offered.
    keep_results_changed(bool)
        Whether saving writes the shown results into the file changed.
    """

    state_changed = Signal()
    saved = Signal()
    discarded = Signal()
    opened = Signal(object)
    keep_results_changed = Signal(bool)

    def __init__(self, editor, settings, prompts, status: QStatusBar, path=None, parent: QObject | None = None):
        super().__init__(parent)
        self.editor = editor
        self.settings = settings
        self.prompts = prompts
        self.status = status
        self.path: Path | None = Path(path) if path else None
        self.dirty_without_undo = False  # e.g. a document restored from recovery
        self.untitled_name = "Untitled"
        self.recent_menu: QMenu | None = None
        #: write the shown case's results into the file on save (on when the opened file kept results)
        self.keep_results = False

    # ---- state ---------------------------------------------------------------------------
    def is_modified(self) -> bool:
        return self.dirty_without_undo or not self.editor.undo_stack.isClean()

    def suggested_stem(self) -> str:
        """A file name (no extension) for this project: from its title, else its file's, else "Untitled"."""
        return file_stem_for(self.editor.model.get("title", ""),
                             fallback=self.path.stem if self.path else "Untitled")

    def document_name(self) -> str:
        """The file's name, or what an unsaved new project is called."""
        return self.path.name if self.path else self.untitled_name

    def set_untitled_name(self, name: str) -> None:
        """Call a project that has no file yet ``name`` (e.g. the demo)."""
        self.untitled_name = name
        self.state_changed.emit()

    def load(self, doc: dict, path: Path | None, dirty: bool = False) -> None:
        """Show ``doc`` (from ``path``); ``dirty``: it has unsaved changes (restored work)."""
        self.dirty_without_undo = dirty  # first: clearing the stack must not drop a recovery
        self.editor.undo_stack.clear()
        self.path = Path(path) if path else None
        self.untitled_name = "Untitled"
        self.editor.model.replace(doc)
        self.editor.undo_stack.setClean()
        self.state_changed.emit()
        self.show_kept_results(doc)
        self.editor.solve_now(immediate=True)

    def set_keep_results(self, on: bool) -> None:
        """File ▸ Keep Results in File: the next save writes (or drops) the results snapshot."""
        if on != self.keep_results:
            self.keep_results = on
            self.keep_results_changed.emit(on)

    def show_kept_results(self, doc: dict) -> None:
        """Show the results the file kept at once (the solve that follows checks them)."""
        self.set_keep_results(bool(doc.get("snapshot")))
        if self.editor.show_snapshot(doc.get("snapshot")):
            self.status.showMessage("Showing the results saved with the file; solving again to check them…", 6000)

    def maybe_save(self) -> bool:
        """True when it is fine to drop the current document."""
        if not self.is_modified():
            return True
        answer = self.prompts.ask_save_changes(self.path.name if self.path else "this new project")
        if answer == "save":
            return self.save()
        if answer == "discard":
            self.discarded.emit()
            return True
        return False

    # ---- commands ------------------------------------------------------------------------
    def new_project(self) -> None:
        if self.maybe_save():
            self.load(new_document(), None)

    def open_dialog(self) -> None:
        if not self.maybe_save():
            return
        start = self.path.parent if self.path else start_folder(self.settings, PROJECT_FOLDER_KEY)
        name = self.prompts.open_project_name(str(start))
        if name:
            self.open_path(name, ask=False)

    def open_path(self, name, ask: bool = True, announce: bool = True) -> bool:
        """Open the project file ``name`` (``ask``: before dropping unsaved changes; ``announce``:
        emit :attr:`opened`, so an ended session's work on it is offered — not for a revert)."""
        if ask and not self.maybe_save():
            return False
        try:
            doc = project.load(name)
        except StagewrightError as exc:
            self.prompts.show_error("Cannot open project", str(exc))
            self._forget_recent(str(name))
            return False
        self.load(doc, Path(name))
        self._remember_recent(str(Path(name).resolve()))
        remember_folder(self.settings, PROJECT_FOLDER_KEY, name)
        if announce:
            self.opened.emit(Path(name))
        return True

    def save(self) -> bool:
        if self.path is None:
            return self.save_as()
        return self.save_to(self.path)

    def save_as(self) -> bool:
        if self.path is not None:
            start = self.path
        else:
            start = start_folder(self.settings, PROJECT_FOLDER_KEY) / f"{self.suggested_stem()}.json"
        name = self.prompts.save_project_name(str(start))
        if not name:
            return False
        name, added = with_suffix_added(name, ".json")
        # the dialog asked about the name as typed; a suffix added here needs its own question
        if added and Path(name).exists() and not self.prompts.confirm_overwrite([Path(name)]):
            return False
        return self.save_to(Path(name))

    def save_to(self, path: Path) -> bool:
        """Write the project to ``path`` (asking first if it has input problems); True when written."""
        found = self.editor.model.project_problems()
        if found and not self.prompts.confirm(
                "Save a project with problems?",
                f"The project has {len(found)} input problem(s) (see Messages). It will be saved as it "
                "is, but it cannot be opened again until they are fixed. Save anyway?"):
            return False
        try:
            project.save(self._document_to_save(), path)
        except (OSError, StagewrightError) as exc:
            self.prompts.show_error("Cannot save project", f"{path}: {exc}")
            return False
        self.path = Path(path)
        self.dirty_without_undo = False
        self.editor.undo_stack.setClean()
        self._remember_recent(str(self.path.resolve()))
        remember_folder(self.settings, PROJECT_FOLDER_KEY, self.path)
        self.state_changed.emit()
        self.status.showMessage(f"Saved {self.path.name}", 4000)
        self.saved.emit()
        return True

    def _document_to_save(self) -> dict:
        """The whole project; with the shown case's results as its snapshot when the project keeps
        results (:attr:`keep_results`) and they are up to date, else without a snapshot."""
        doc = self.editor.model.project_snapshot()
        doc.pop("snapshot", None)
        ed = self.editor
        if self.keep_results and ed.result is not None and not ed.stale:
            from stagewright.core.cases import take_snapshot
            doc["snapshot"] = take_snapshot({ed.model.active_case: ed.result})
        return doc

    def revert(self) -> None:
        if self.path is None or not self.is_modified():
            return
        if self.prompts.confirm("Revert to saved", f"Discard all changes since {self.path.name} was last saved?"):
            self.open_path(self.path, ask=False, announce=False)

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

    def set_recent_menu(self, menu: QMenu) -> None:
        """Fill ``menu`` (File ▸ Open Recent) with the recent files, and keep it up to date."""
        self.recent_menu = menu
        self.rebuild_recent_menu()

    def _clear_recent(self) -> None:
        self.settings.setValue("files/recent", [])
        self.rebuild_recent_menu()

    def rebuild_recent_menu(self) -> None:
        menu = self.recent_menu
        if menu is None:
            return
        menu.clear()
        files = self.recent_files()
        for i, name in enumerate(files, 1):
            act = menu.addAction(f"&{i} {Path(name).name}")
            act.setToolTip(plain_tip(name))
            act.triggered.connect(lambda _=False, n=name: self.open_path(n))
        if not files:
            menu.addAction("(none)").setEnabled(False)
        else:
            menu.addSeparator()
            menu.addAction("Clear list", self._clear_recent)
