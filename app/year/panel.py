"""The year-at-site panel: edit the project's year profile, and run it month by month (or bin
by bin) off the GUI thread.

Three tabs: Profile (:mod:`stagewright.gui.year.editor`), Results (:mod:`stagewright.gui.year.results_view`: the year's
totals beside the bin-by-bin table; shown after a run) and Chart (:mod:`stagewright.gui.year.chart_view`:
the chart gets the whole tab, rather than a corner of a panel that is short at the window's
default size)."""
from __future__ import annotations

__all__ = ["YearPanel", "YEAR_COLUMNS", "freezing_caution"]

from PySide6.QtWidgets import QHBoxLayout, QLabel, QProgressBar, QPushButton, QTabWidget, QVBoxLayout, QWidget

from stagewright.gui.widgets.plain_text import plain_label
from stagewright.gui.presentation import year_tables
from stagewright.gui.presentation.figures import shown
from stagewright.gui.year.chart_view import YearChartView
from stagewright.gui.year.editor import YearEditor
from stagewright.gui.year.results_view import YearResultsView
from stagewright.gui.year.worker import YearRunner

#: the year table's columns: the figures of stagewright.gui.presentation.year_tables.YEAR_BINS the window shows
#: (as the table stood at import; the panel reads it afresh when built)
YEAR_COLUMNS = tuple(shown(year_tables.YEAR_BINS, "window"))
PROFILE_TAB, RESULTS_TAB, CHART_TAB = range(3)
_STALE = "Out of date — the project changed since this year was run: run it again."


class YearPanel(QWidget):
    """Edits the project's ``year`` (Profile tab), runs :func:`stagewright.core.year.run_year` on it and
    shows its totals and bins (Results tab) and its chart (Chart tab)."""

    title = "Year at site"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.runner = YearRunner(self)
        self.result: dict | None = None
        self._running_doc: dict | None = None  #: the document the running (or last) run was started on
        self._result_doc: dict | None = None   #: the document ``result`` belongs to
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        row = QHBoxLayout()
        self.run_button = QPushButton("Run year")
        self.cancel_button = QPushButton("Cancel")
        self.cancel_button.setEnabled(False)
        self.progress = QProgressBar()
        self.progress.setTextVisible(True)
        self.progress.setFormat("%v of %m bins")  # an hourly year: "1 200 of 8 760" says more than "13 %"
        self.progress.setMinimumWidth(self.progress.fontMetrics().horizontalAdvance("8784 of 8784 bins") + 24)
        self.progress.setVisible(False)  # an empty bar before the first run reads as a broken widget
        self.status = plain_label(QLabel())
        self.status.setWordWrap(True)
        for w in (self.run_button, self.cancel_button, self.progress):
            row.addWidget(w)
        row.addWidget(self.status, 1)
        lay.addLayout(row)
        self.tabs = QTabWidget()
        self.tabs.setDocumentMode(True)
        self.profile_editor = YearEditor(editor)
        self.results = YearResultsView()
        self.chart = YearChartView()
        self.tabs.addTab(self.profile_editor, "Profile")
        self.tabs.addTab(self.results, "Results")
        self.tabs.addTab(self.chart, "Chart")
        lay.addWidget(self.tabs, 1)
        self.run_button.clicked.connect(self.run)
        self.cancel_button.clicked.connect(self.runner.cancel)
        self.runner.progress.connect(self._on_progress)
        self.runner.finished.connect(self._on_finished)
        self.runner.failed.connect(self._on_failed)
        editor.prefs.changed.connect(self.refresh)
        editor.result_changed.connect(self._on_project_changed)
        editor.model.changed.connect(lambda _path: self._on_project_changed())
        self.profile_editor.refused.connect(lambda _m: self.tabs.setCurrentIndex(PROFILE_TAB))
        self._on_project_changed()
        self.refresh()

    @property
    def table(self):
        """The bin-by-bin table (one row per bin)."""
        return self.results.table

    @property
    def totals(self):
        """The year's totals (one row per total)."""
        return self.results.totals

    # ---- running -------------------------------------------------------------------------
    def has_profile(self) -> bool:
        return bool(self.editor.model.doc.get("year"))  # read, not copied: an 8760-bin year is large

    def run(self) -> None:
        if not self.has_profile():
            return
        self._running_doc = self.editor.model.snapshot()
        self.runner.run(self._running_doc)
        self.run_button.setEnabled(False)
        self.cancel_button.setEnabled(True)
        self.progress.setValue(0)
        self.progress.setVisible(True)
        self.status.setText("Running…")

    def _on_progress(self, _job: int, done: int, total: int) -> None:
        self.progress.setMaximum(total)
        self.progress.setValue(done)

    def _on_finished(self, _job: int, result: dict, _seconds: float) -> None:
        self.result, self._result_doc = result, self._running_doc
        note = year_tables.design_note(result, self.editor.prefs.system)
        caution = freezing_caution(result, self.editor.prefs.system)
        if caution:
            note = (caution + " " + note).strip()
        # edits made while the year ran are not in it: say so, rather than "solved" (issue 22 item 5)
        self._idle(_STALE if self.is_stale else "Year solved." + (f" {note}" if note else ""))
        self.tabs.setCurrentIndex(RESULTS_TAB)  # the totals first; the chart is one tab on
        self.refresh()

    def _on_failed(self, _job: int, message: str, field: str) -> None:
        self._idle(self.editor.failure_text(message, field, self.runner.failure_detail))

    def _idle(self, text: str) -> None:
        self.run_button.setEnabled(self.has_profile())
        self.cancel_button.setEnabled(False)
        self.status.setText(text)

    def _on_project_changed(self) -> None:
        if not self.runner.busy:
            self.run_button.setEnabled(self.has_profile())
        if not self.has_profile():
            self.status.setText("This project has no year profile: start one from the site "
                                "in the Profile tab.")
        elif self.result is not None and self.is_stale:
            self.status.setText(_STALE)
        elif not self.runner.busy:
            monthly = (self.editor.model.doc.get("year") or {}).get("profile", {}).get("kind") == "monthly"
            self.status.setText(f"Run the year to see each {'month' if monthly else 'bin'}'s energy, condensate "
                                "and temperatures.")

    @property
    def is_stale(self) -> bool:
        """True when the year shown was run on another version of the project than the current one."""
        return self.result is not None and self._result_doc != self.editor.model.doc

    # ---- showing -------------------------------------------------------------------------
    def refresh(self) -> None:
        """Totals, bins and chart of the last run in the current unit system."""
        system = self.editor.prefs.system
        self.results.show_year(self.result, system)
        self.chart.show_year(self.result, system)


def freezing_caution(year: dict, system: str = "SI") -> str:
    """The caution for bins where a cooler's condensate would freeze: the bins by name when there
    are a few, else how many, their hours and the ambient range (an hourly year may have thousands).

    Examples
    --------
    >>> year = {"freezing_bins": ["January"], "bins": [{"label": "January", "freezing_condensate": True,
    ...          "hours": 744.0, "temperature_K": 264.15}]}
    >>> freezing_caution(year)[:68]
    'Caution: cooler condensate would freeze (or nearly) in January: free'
    """
    from stagewright.gui.presentation import units
    names = year.get("freezing_bins") or []
    if not names:
        return ""
    if len(names) <= 6:
        where = ", ".join(names)
    else:
        frozen = [b for b in year.get("bins") or [] if b.get("freezing_condensate")]
        hours = sum(b.get("hours") or 0.0 for b in frozen)
        temps = [b["temperature_K"] for b in frozen if b.get("temperature_K") is not None]
        tu = units.unit("temperature", system)
        span = f", ambient {tu.to_display(min(temps)):.1f} to {tu.to_display(max(temps)):.1f} {tu.symbol}" if temps else ""
        where = f"{len(names)} bins ({f'{hours:,.0f}'.replace(',', ' ')} h{span}; marked on the Chart tab)"
    return (f"Caution: cooler condensate would freeze (or nearly) in {where}: freeze protection or a minimum "
            "cooler outlet temperature is needed.")
