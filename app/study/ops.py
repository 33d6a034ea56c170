"""The staging study in the rest of the window: Train ▸ Run staging study is the study panel's own
command (it runs :func:`thermo.study.compare_stagings` on its worker thread,
:mod:`app.study.worker`: progress, cancel, stale answers dropped); :class:`StudyLink` follows the
panel, showing its options, large, in the Staging study tab of the charts area and its start and
outcome in the status bar. The window stays live; a new run or closing the window cancels a
running study."""
from __future__ import annotations

__all__ = ["StudyLink"]

from PySide6.QtCore import QObject
from PySide6.QtWidgets import QStatusBar

from app.document.paths import get_in


class StudyLink(QObject):
    """Follows the study panel for the window.

    Parameters
    ----------
    panel : StudyPanel
        The study panel (its answers, its worker's signals).
    charts : ChartsPanel
        The charts area, whose Staging study tab shows the panel's options.
    editor : Editor
        The window's editor (the open document, display units).
    status : QStatusBar
        Where a study's start and outcome are announced.
    """

    def __init__(self, panel, charts, editor, status: QStatusBar, parent: QObject | None = None):
        super().__init__(parent)
        self.panel = panel
        self.charts = charts
        self.editor = editor
        self.status = status
        panel.run_started.connect(self._on_started)
        panel.shown_changed.connect(self._show_in_tab)
        panel.stale_changed.connect(self._tab_stale)
        panel.controller.finished.connect(self._on_done)
        panel.controller.cancelled.connect(self._on_stopped)
        panel.controller.failed.connect(self._on_stopped)

    def _on_started(self, max_stages: int) -> None:
        """A study started: say so, and bring the charts area's Staging study tab to the front."""
        self.status.showMessage(f"Staging study: comparing 1 to {max_stages} stages…", 4000)
        tab = self.charts.study_tab()
        if tab is not None:
            self.charts.tabs.setCurrentWidget(tab)

    def _show_in_tab(self) -> None:
        rows = self.panel.rows
        if not rows:  # a study that failed: what the tab shows belongs to an earlier one
            if self.charts.study is not None:
                self.charts.study.mark_stale()
            return
        tab = self.charts.study_tab()
        if tab is None:
            return
        doc = self.panel.study_doc or self.editor.model.doc
        limit = get_in(doc, "stages[0].max_discharge_temperature_K", None)
        tab.show_rows(rows, rows[0].get("note", ""), self.editor.prefs.system, limit, doc)
        tab.stale.setVisible(self.panel.is_stale)

    def _on_done(self, _job: int, answer: dict, _seconds: float) -> None:
        rows = [r for case in answer["cases"] for r in case["rows"]]
        feasible = sorted({r["stages"] for r in rows if r.get("feasible")})
        self.status.showMessage(
            f"Staging study done: {len(rows)} options, fewest stages within the limits: "
            f"{feasible[0] if feasible else 'none'}", 8000)

    def _on_stopped(self, *_args) -> None:
        self.status.clearMessage()  # the study panel says why

    def _tab_stale(self, stale: bool) -> None:
        tab = self.charts.study
        if tab is not None:
            if stale:
                tab.mark_stale()
            else:
                tab.stale.hide()
