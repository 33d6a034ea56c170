"""File → Export report… in the window: the same PDF (and CSV) as ``stagewright report``.

The report is written by :func:`stagewright.gui.report.export_report` on a worker thread from a
snapshot of the document and the current result, so the window never freezes; the
outcome comes back as a Qt signal (queued to the GUI thread). Files are written
atomically, so a failed export never leaves a half-written report behind.
"""
from __future__ import annotations

__all__ = ["ExportController", "ExportJob", "PDF_AND_CSV", "PDF_ONLY", "EXPORT_FOLDER_KEY"]

import copy
import threading
from pathlib import Path
from typing import Callable

from PySide6.QtCore import QObject, Signal
from PySide6.QtWidgets import QStatusBar

from stagewright.gui.document.file_names import with_suffix_added
from stagewright.gui.window.file_ops import PROJECT_FOLDER_KEY, remember_folder, start_folder

PDF_AND_CSV = "PDF report and CSV balance sheet (*.pdf)"
PDF_ONLY = "PDF report only (*.pdf)"
EXPORT_FOLDER_KEY = "export/last_folder"


class ExportJob(QObject):
    """One export on a worker thread; ``done(message, error)`` arrives in the GUI thread."""

    done = Signal(str, str)

    def __init__(self, doc: dict, result: dict, pdf: Path, csv: Path | None, system: str, source: str,
                 parent=None, study_rows: list[dict] | None = None, project: dict | None = None,
                 shown_case: str = "") -> None:
        super().__init__(parent)
        self.args = (doc, result, pdf, csv, system, source)
        self.study_rows = study_rows  #: a staging study run in the window for this project, to print
        self.project, self.shown_case = project, shown_case  #: the whole project (its cases) and the case shown
        self.thread = threading.Thread(target=self._run, name="stagewright-export", daemon=True)

    def start(self) -> None:
        self.thread.start()

    def _run(self) -> None:
        from stagewright.core import StagewrightError

        from stagewright.gui.report import export_report
        doc, result, pdf, csv, system, source = self.args
        try:
            pages = export_report(doc, result, pdf, csv, system=system, source_name=source,
                                  study_rows=self.study_rows, project=self.project, shown_case=self.shown_case)
        except (OSError, StagewrightError) as exc:
            self.done.emit("", f"{pdf}: {getattr(exc, 'strerror', None) or exc}")
            return
        except Exception as exc:  # never a crash of the window: the reason goes to a message box
            self.done.emit("", f"{pdf}: the report could not be made ({type(exc).__name__}: {exc})")
            return
        written = f"{pdf.name} ({pages} pages)" + (f" and {csv.name}" if csv else "")
        self.done.emit(f"Exported {written}", "")

    def wait(self, timeout: float | None = None) -> None:
        if self.thread.is_alive():
            self.thread.join(timeout)


class ExportController(QObject):
    """File ▸ Export Report…: one export at a time, on its own thread.

    Parameters
    ----------
    editor : Editor
        The window's editor (document, current result, display units).
    files : FileController
        The project's file: the report's default name and its source line.
    prompts : Prompts
        Where to write, and errors.
    status : QStatusBar
        Progress and outcome.
    study_rows : callable, optional
        Returns the rows of the staging study the window shows when it was run on the project as
        it now stands (else None); the report then carries the study.
    """

    def __init__(self, editor, files, prompts, status: QStatusBar, parent: QObject | None = None,
                 study_rows: Callable[[], list[dict] | None] | None = None):
        super().__init__(parent)
        self.editor = editor
        self.files = files
        self.prompts = prompts
        self.status = status
        self._study_rows = study_rows or (lambda: None)
        self.job: ExportJob | None = None

    def export_report_dialog(self) -> None:
        ed = self.editor
        if self.job is not None and self.job.thread.is_alive():
            self.status.showMessage("An export is still being written…", 4000)
            return
        if ed.result is None or ed.stale or ed.solver.busy:
            self.prompts.show_error("Nothing to export yet",
                                    "The results are not up to date. Fix the problems listed in Messages "
                                    "(or wait for the solve to finish), then export again.")
            return
        path = self.files.path
        name, chosen = self.prompts.export_target(str(self._start_folder() / f"{self.files.suggested_stem()}.pdf"))
        if not name:
            return
        name, added = with_suffix_added(name, ".pdf")
        pdf = Path(name)
        csv = pdf.with_suffix(".csv") if chosen != PDF_ONLY else None
        # the dialog asked about the file named in it; the .pdf added here and the CSV beside it were not
        unasked = [p for p, asked in ((pdf, not added), (csv, False)) if p is not None and not asked and p.exists()]
        if unasked and not self.prompts.confirm_overwrite(unasked):
            self.status.showMessage("Export cancelled: nothing was written", 4000)
            return
        remember_folder(self.files.settings, EXPORT_FOLDER_KEY, pdf)
        source = path.name if path else ""
        job = ExportJob(ed.model.snapshot(), copy.deepcopy(ed.result), pdf, csv, ed.prefs.system, source, self,
                        study_rows=self._study_rows(), project=ed.model.project_snapshot(),
                        shown_case=ed.model.active_case)
        job.done.connect(self._on_export_done)
        self.job = job
        self.status.showMessage(f"Exporting {pdf.name}…")
        job.start()

    def _start_folder(self) -> Path:
        """The last folder a report went to; else the project's folder; else the last project folder or documents."""
        last = self.files.settings.value(EXPORT_FOLDER_KEY, "")
        if isinstance(last, str) and last and Path(last).is_dir():
            return Path(last)
        if self.files.path is not None and self.files.path.parent.is_dir():
            return self.files.path.absolute().parent
        return start_folder(self.files.settings, PROJECT_FOLDER_KEY)

    def _on_export_done(self, message: str, error: str) -> None:
        if error:
            self.status.clearMessage()
            self.prompts.show_error("Cannot export the report", error)
        else:
            self.status.showMessage(message, 6000)

    def wait(self, timeout: float = 30.0) -> None:
        """Let a running export finish (called when the window closes)."""
        if self.job is not None:
            self.job.wait(timeout)
