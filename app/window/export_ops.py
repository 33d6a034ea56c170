"""File → Export report… in the window: the same PDF (and CSV) as ``stagewright report``.

The report is written by :func:`app.report.export_report` on a worker thread from a
snapshot of the document and the current result, so the window never freezes; the
outcome comes back as a Qt signal (queued to the GUI thread). Files are written
atomically, so a failed export never leaves a half-written report behind.
"""
from __future__ import annotations

__all__ = ["ExportOps", "ExportJob", "PDF_AND_CSV", "PDF_ONLY"]

import copy
import threading
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtWidgets import QFileDialog

PDF_AND_CSV = "PDF report and CSV balance sheet (*.pdf)"
PDF_ONLY = "PDF report only (*.pdf)"


class ExportJob(QObject):
    """One export on a worker thread; ``done(message, error)`` arrives in the GUI thread."""

    done = Signal(str, str)

    def __init__(self, doc: dict, result: dict, pdf: Path, csv: Path | None, system: str, source: str,
                 parent=None) -> None:
        super().__init__(parent)
        self.args = (doc, result, pdf, csv, system, source)
        self.thread = threading.Thread(target=self._run, name="stagewright-export", daemon=True)

    def start(self) -> None:
        self.thread.start()

    def _run(self) -> None:
        from thermo import StagewrightError

        from app.report import export_report
        doc, result, pdf, csv, system, source = self.args
        try:
            pages = export_report(doc, result, pdf, csv, system=system, source_name=source)
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


class ExportOps:
    """Mixed into :class:`~app.window.main_window.MainWindow` (needs ``editor``, ``prefs``, ``path``)."""

    export_job: ExportJob | None = None

    def export_target(self) -> tuple[str, str]:
        """Ask where to write; returns (pdf path or "", selected filter). Tests replace this."""
        start = str(self.path.with_suffix(".pdf")) if self.path else "report.pdf"
        return QFileDialog.getSaveFileName(self, "Export report", start, f"{PDF_AND_CSV};;{PDF_ONLY}")

    def export_report_dialog(self) -> None:
        ed = self.editor
        if self.export_job is not None and self.export_job.thread.is_alive():
            self.statusBar().showMessage("An export is still being written…", 4000)
            return
        if ed.result is None or ed.stale or ed.solver.busy:
            self.show_error("Nothing to export yet",
                            "The results are not up to date. Fix the problems listed in Messages "
                            "(or wait for the solve to finish), then export again.")
            return
        name, chosen = self.export_target()
        if not name:
            return
        pdf = Path(name if name.lower().endswith(".pdf") else name + ".pdf")
        csv = pdf.with_suffix(".csv") if chosen != PDF_ONLY else None
        source = self.path.name if self.path else ""
        job = ExportJob(ed.model.snapshot(), copy.deepcopy(ed.result), pdf, csv, self.prefs.system, source, self)
        job.done.connect(self._on_export_done)
        self.export_job = job
        self.statusBar().showMessage(f"Exporting {pdf.name}…")
        job.start()

    def _on_export_done(self, message: str, error: str) -> None:
        if error:
            self.statusBar().clearMessage()
            self.show_error("Cannot export the report", error)
        else:
            self.statusBar().showMessage(message, 6000)

    def wait_for_export(self, timeout: float = 30.0) -> None:
        """Let a running export finish (called when the window closes)."""
        if self.export_job is not None:
            self.export_job.wait(timeout)
