"""The staging study in the rest of the window: Train ▸ Run staging study is the study panel's own
command (it raises the panel and runs :func:`stagewright.core.study.compare_stagings` on its worker thread,
:mod:`stagewright.gui.study.worker`: progress, cancel, stale answers dropped); :class:`StudyLink` announces a
study's start and outcome in the status bar. The window stays live; a new run or closing the
window cancels a running study."""
from __future__ import annotations

__all__ = ["StudyLink"]

import copy

from PySide6.QtCore import QObject
from PySide6.QtWidgets import QStatusBar


class StudyLink(QObject):
    """Follows the study panel for the window's status bar.

    Parameters
    ----------
    panel : StudyPanel
        The study panel (its worker's signals).
    status : QStatusBar
        Where a study's start and outcome are announced.
    """

    def __init__(self, panel, status: QStatusBar, parent: QObject | None = None):
        super().__init__(parent)
        self.panel = panel
        self.status = status
        panel.run_started.connect(self._on_started)
        panel.controller.finished.connect(self._on_done)
        panel.controller.cancelled.connect(self._on_stopped)
        panel.controller.failed.connect(self._on_stopped)

    def current_rows(self) -> list[dict] | None:
        """Rows of the study the panel shows when it was run on the project as it now stands
        (a copy), else None: no study, an out-of-date one, or one without rows."""
        if self.panel.is_stale or not self.panel.rows:
            return None
        return copy.deepcopy(self.panel.rows)

    def _on_started(self, max_stages: int) -> None:
        self.status.showMessage(f"Staging study: comparing 1 to {max_stages} stages…", 4000)

    def _on_done(self, _job: int, answer: dict, _seconds: float) -> None:
        rows = [r for case in answer["cases"] for r in case["rows"]]
        feasible = sorted({r["stages"] for r in rows if r.get("feasible")})
        self.status.showMessage(
            f"Staging study done: {len(rows)} options, fewest stages within the limits: "
            f"{feasible[0] if feasible else 'none'}", 8000)

    def _on_stopped(self, *_args) -> None:
        self.status.clearMessage()  # the study panel says why
