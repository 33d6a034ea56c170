"""The package panel: edit the project's ``package`` section (capacity control, motor, auxiliaries,
loads and load profile) and see the package figures, the data sheet and the part-load chart beside it.

The package figures come with every solve (``result["package"]``); the data sheet needs two more
solves, which :class:`~stagewright.gui.package.worker.DataSheetRunner` runs off the GUI thread after each
solve while the panel is shown (a newer request drops an older answer). Without a package section
the panel offers "Add capacity control…", which writes a load/unload control on a receiver sized
from the free air delivery (:func:`stagewright.gui.package.edits.new_package`) as one undo step.
"""
from __future__ import annotations

__all__ = ["PackagePanel"]

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QFrame, QLabel, QPushButton, QScrollArea, QSplitter, QStackedWidget, QVBoxLayout,
                               QWidget)

from stagewright.gui.package.edits import RECEIVER_L_PER_L_S, new_package
from stagewright.gui.package.inputs import PackageInputs
from stagewright.gui.package.results_view import PackageResults
from stagewright.gui.package.worker import DataSheetRunner
from stagewright.gui.widgets.plain_text import plain_label

_EMPTY_TEXT = ("This project has no package section: the figures are the train's alone (driver input over "
               "the free air delivery, at full load). Add a capacity control to see the package's input power "
               "and specific power at part load, its auxiliaries, a load profile's year and a data sheet at "
               "the ISO 1217 reference conditions beside the site.")


class PackagePanel(QWidget):
    """Inputs of ``package`` (left) beside its results (right: Figures, Data sheet, Chart)."""

    title = "Package"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.runner = DataSheetRunner(self)
        self.sheet: dict | None = None
        self._sheet_doc: dict | None = None  #: the document the sheet shown (or running) belongs to
        self._sheet_pending = False
        lay = QVBoxLayout(self)
        lay.setContentsMargins(4, 2, 4, 2)
        self.pages = QStackedWidget()
        lay.addWidget(self.pages)
        empty = QWidget()
        e_lay = QVBoxLayout(empty)
        text = plain_label(QLabel(_EMPTY_TEXT))
        text.setWordWrap(True)
        self.add_button = QPushButton("Add capacity control…")
        self.add_button.setToolTip(
            f"Adds load/unload control on a receiver of about {RECEIVER_L_PER_L_S:g} L per (L/s) of free air "
            "delivery (common practice, no source), with the schema's defaults for the rest; change any of it.")
        self.add_button.clicked.connect(self.add_package)
        e_lay.addWidget(text)
        e_lay.addWidget(self.add_button, 0, Qt.AlignLeft)
        e_lay.addStretch(1)
        self.pages.addWidget(empty)
        split = QSplitter(Qt.Horizontal)
        self.inputs = PackageInputs(editor)
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QFrame.NoFrame)
        scroll.setWidget(self.inputs)
        scroll.setMinimumWidth(280)
        self.results = PackageResults()
        split.addWidget(scroll)
        split.addWidget(self.results)
        split.setStretchFactor(0, 0)
        split.setStretchFactor(1, 1)
        split.setSizes([380, 660])
        self.pages.addWidget(split)
        self.runner.finished.connect(self._on_sheet)
        self.runner.failed.connect(self._on_sheet_failed)
        self.runner.cancelled.connect(lambda *_a: None)
        editor.result_changed.connect(self._on_result)
        editor.prefs.changed.connect(self.refresh)
        editor.model.changed.connect(lambda _path: self._show_page())
        self._show_page()
        self._on_result()

    # ---- the section ---------------------------------------------------------------------
    def has_package(self) -> bool:
        return isinstance(self.editor.model.get("package"), dict)

    def add_package(self) -> None:
        """Write a new ``package`` section (one undo step)."""
        fad = (self.editor.result or {}).get("free_air_delivery_m3_s")
        self.editor.set_value("package", new_package(fad), "Add capacity control")

    def _show_page(self) -> None:
        self.pages.setCurrentIndex(1 if self.has_package() else 0)

    # ---- results -------------------------------------------------------------------------
    def _package_result(self) -> dict | None:
        ed = self.editor
        if ed.stale or not ed.result:
            return None
        return ed.result.get("package")

    def _on_result(self) -> None:
        pkg = self._package_result()
        if pkg is not None:
            self._sheet_pending = True
            if self.isVisible():
                self.request_sheet()
        self.refresh()

    def request_sheet(self) -> None:
        """Compute the data sheet of the current document off the GUI thread (if it has a package)."""
        self._sheet_pending = False
        if not self.has_package() or self.editor.problems:
            return
        doc = self.editor.model.snapshot()
        if doc == self._sheet_doc and (self.sheet is not None or self.runner.busy):
            return
        self._sheet_doc = doc
        self.runner.run(doc)
        self.results.show_sheet(self.sheet, self.editor.prefs.system, "Computing the data sheet (two more solves)…")

    def showEvent(self, event) -> None:  # noqa: N802 (Qt's name)
        super().showEvent(event)
        if self._sheet_pending:
            self.request_sheet()

    def _on_sheet(self, _job: int, sheet: dict, _seconds: float) -> None:
        self.sheet = sheet
        self._show_sheet("")

    def _on_sheet_failed(self, _job: int, message: str, field: str) -> None:
        self.sheet = None
        self._show_sheet("The data sheet could not be computed: "
                         + self.editor.failure_text(message, field, self.runner.failure_detail))

    def _show_sheet(self, status: str) -> None:
        current = self._sheet_doc == self.editor.model.doc
        if self.sheet is not None and not current:
            status = "Out of date: the project changed since this sheet was computed."
        self.results.show_sheet(self.sheet, self.editor.prefs.system, status)

    def refresh(self) -> None:
        """Figures, chart and data sheet in the current unit system."""
        system = self.editor.prefs.system
        self.results.show_package(self._package_result(), system)
        if not self.runner.busy:
            self._show_sheet("" if self.sheet is not None else "The data sheet is computed after each solve "
                                                                "while this panel is shown.")

    def shutdown(self) -> None:
        """Stop the worker (the window's closeEvent)."""
        self.runner.shutdown()
