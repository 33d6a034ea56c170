"""File → Export report… in the window: the same PDF (and CSV) as ``stagewright report``.

The report is written by :func:`app.report.export_report` on a worker thread from a
snapshot of the document and the current result, so the window never freezes; the
outcome comes back as a Qt signal (queued to the GUI thread). Files are written
atomically, so a failed export never leaves a half-written report behind.
"""
from __future__ import annotations

__all__ = ["ExportController", "ExportJob", "PDF_AND_CSV", "PDF_ONLY"]

import copy
import threading
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtWidgets import QStatusBar

PDF_AND_CSV = "PDF report and CSV balance sheet (*.pdf)"
PDF_ONLY = "PDF report only (*.pdf)"


class ExportJob(QObject):
    """One export on a worker thread; ``done(message, error)`` arrives in the GUI thread."""

    done = Signal(str, str)

    def __init__(self, doc: dict, result: dict, pdf: Path, csv: Path | None, system: str, source: str,
                 parent=None, study_rows: list[dict] | None = None) -> None:
        super().__init__(parent)
        self.args = (doc, result, pdf, csv, system, source)
        self.study_rows = study_rows  #: a staging study run in the window for this project, to print
        self.thread = threading.Thread(target=self._run, name="stagewright-export", daemon=True)

    def start(self) -> None:
        self.thread.start()

    def _run(self) -> None:
        from thermo import StagewrightError

        from app.report import export_report
        doc, result, pdf, csv, system, source = self.args
        try:
            pages = export_report(doc, result, pdf, csv, system=system, source_name=source,
                                  study_rows=self.study_rows)
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
    """

    def __init__(self, editor, files, prompts, status: QStatusBar, parent: QObject | None = None):
        super().__init__(parent)
        self.editor = editor
        self.files = files
        self.prompts = prompts
        self.status = status
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
        name, chosen = self.prompts.export_target(str(path.with_suffix(".pdf")) if path else "report.pdf")
        if not name:
            return
        pdf = Path(name if name.lower().endswith(".pdf") else name + ".pdf")
        csv = pdf.with_suffix(".csv") if chosen != PDF_ONLY else None
        source = path.name if path else ""
        job = ExportJob(ed.model.snapshot(), copy.deepcopy(ed.result), pdf, csv, ed.prefs.system, source, self,
                        study_rows=self._study_rows())
        job.done.connect(self._on_export_done)
        self.job = job
        self.status.showMessage(f"Exporting {pdf.name}…")
        job.start()

    def _study_rows(self) -> list[dict] | None:
        """Rows of the staging study the window shows, when it was run on the project as it now stands.

        Read from the window's study link (``parent().study``, a controller the window owns);
        None when there is no study, it is out of date, or it has no rows.
        """
        panel = getattr(getattr(self.parent(), "study", None), "panel", None)
        if panel is None or panel.is_stale or not panel.rows:
            return None
        return copy.deepcopy(panel.rows)

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
