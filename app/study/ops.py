"""Train ▸ Run staging study: the study panel runs :func:`thermo.study.compare_stagings` on its
worker thread (:mod:`app.study.worker`: progress, cancel, stale answers dropped); the options
it shows are also drawn, large, in the Staging study tab of the charts area. The window stays
live; a new run or closing the window cancels a running study."""
from __future__ import annotations

__all__ = ["StudyOps", "study_stage_count"]

from app.document.paths import get_in


def study_stage_count(n_stages: int) -> int:
    """Most stages to compare: two more than the project has, at least 4, at most the study's limit."""
    from thermo.study import MAX_STAGES
    return max(1, min(MAX_STAGES, max(4, n_stages + 2)))


class StudyOps:
    """Mixed into :class:`~app.window.main_window.MainWindow` (needs ``editor``, ``charts``, ``panels["study"]``)."""

    def connect_study(self) -> None:
        """Follow the study panel: its options in the charts area's tab, out of date with it."""
        panel = self.panels["study"]
        panel.shown_changed.connect(self._show_study_in_tab)
        panel.stale_changed.connect(self._study_tab_stale)
        panel.controller.finished.connect(self._on_study_done)
        panel.controller.cancelled.connect(self._on_study_stopped)
        panel.controller.failed.connect(self._on_study_stopped)

    def run_study(self) -> None:
        """Handler of Train ▸ Run staging study: the panel runs it; the charts area shows it."""
        panel = self.panels["study"]
        panel.run_study()
        if panel.busy:
            self.statusBar().showMessage(f"Staging study: comparing 1 to {panel.max_stages.value()} stages…", 4000)
            tab = self.charts.study_tab()
            if tab is not None:
                self.charts.tabs.setCurrentWidget(tab)

    def _show_study_in_tab(self) -> None:
        panel = self.panels["study"]
        rows = panel.rows
        if not rows:  # a study that failed: what the tab shows belongs to an earlier one
            if self.charts.study is not None:
                self.charts.study.mark_stale()
            return
        tab = self.charts.study_tab()
        if tab is None:
            return
        doc = panel.study_doc or self.editor.model.doc
        limit = get_in(doc, "stages[0].max_discharge_temperature_K", None)
        tab.show_rows(rows, rows[0].get("note", ""), self.prefs.system, limit, doc)
        tab.stale.setVisible(panel.is_stale)

    def _on_study_done(self, _job: int, answer: dict, _seconds: float) -> None:
        rows = [r for case in answer["cases"] for r in case["rows"]]
        feasible = sorted({r["stages"] for r in rows if r.get("feasible")})
        self.statusBar().showMessage(
            f"Staging study done: {len(rows)} options, fewest stages within the limits: "
            f"{feasible[0] if feasible else 'none'}", 8000)

    def _on_study_stopped(self, *_args) -> None:
        self.statusBar().clearMessage()  # the study panel says why

    def _study_tab_stale(self, stale: bool) -> None:
        tab = self.charts.study
        if tab is not None:
            if stale:
                tab.mark_stale()
            else:
                tab.stale.hide()

    def stop_study(self) -> None:
        """Cancel a running study and stop its thread (closeEvent)."""
        self.panels["study"].shutdown()
