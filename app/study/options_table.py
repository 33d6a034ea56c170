"""The study's options as a table: one row per number of stages, every figure in display units.

:class:`OptionsTable` is the study panel's comparison, where an option is picked for Apply (the
least-power option within the limits in bold, options that miss their limits greyed).
:func:`apply_state` says whether the picked option can be applied, and why not;
:func:`comparison_note` is the line above the panel's table. Cell texts, headers and tooltips come
from :mod:`stagewright.gui.study.display`.
"""
from __future__ import annotations

__all__ = ["OptionsTable", "apply_state", "best_row", "comparison_note"]

from PySide6.QtCore import Qt
from PySide6.QtGui import QColor
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableWidget, QTableWidgetItem

from stagewright.gui.widgets.plain_text import plain_tip
from stagewright.gui.study.display import COLUMNS, cells as option_cells, header, tooltip
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.widgets.table_copy import attach_table_copy

_INFEASIBLE = QColor("#8a96a3")
_LEFT = frozenset({"ratios", "temperatures", "limits", "feasible"})  # words and lists; numbers right


def best_row(rows: list[dict]) -> int | None:
    """Index of the least-power option that meets every limit (None if none does)."""
    ok = [i for i, r in enumerate(rows) if r["feasible"] and r.get("driver_power_W") is not None]
    return min(ok, key=lambda i: rows[i]["driver_power_W"]) if ok else None


def comparison_note(rows: list[dict], fallback: str = "") -> str:
    """How the options are built (``fallback`` before any study: the project's own staging note)
    and what the savings are against."""
    if not rows:
        return fallback
    base = next((r for r in rows if r["feasible"]), None)
    savings = "" if base is None else (f" Savings are against the {base['stages']}-stage option, the fewest "
                                       "stages that meet every limit.")
    return rows[0]["note"] + savings


def apply_state(row: dict | None, answer: dict | None, busy: bool, stale: bool) -> tuple[bool, str, str]:
    """Whether the picked option ``row`` can go into the project: (enabled, action text, why).

    Only an option of a finished, current study at the project's own site (no site variable)
    that meets its limits and has pressure ratios can be applied.
    """
    enabled = bool(row is not None and answer is not None and not busy and not stale and not answer["variable"]
                   and row["feasible"] and row.get("pressure_ratios"))
    text = f"Apply {row['stages']}-stage option" if row else "Apply selected option"
    if answer is not None and answer["variable"]:
        why = "Apply works on a study at the project's own site (Vary site: nothing)."
    elif stale:
        why = "The project changed since the study ran: run it again to apply an option."
    elif row is not None and not row["feasible"]:
        why = "This option does not meet its limits, so it is not a design."
    else:
        why = "Put the selected option's stages and pressure ratios into the project (one undo step)."
    return enabled, text, why


class OptionsTable(QTableWidget):
    """Study options, one row each (SI rows of :meth:`stagewright.core.study.StagingComparison.rows`), in
    the columns of :data:`stagewright.gui.study.display.COLUMNS` (headers name over unit).

    Whole rows are picked, one at a time (the option to apply); the best option is in bold, options
    that miss their limits are greyed, rows alternate in colour.
    """

    def __init__(self, parent=None):
        super().__init__(0, len(COLUMNS), parent)
        self.columns = list(COLUMNS)
        self.rows: list[dict] = []
        self.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.setObjectName("studyTable")
        self.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.setSelectionMode(QAbstractItemView.SingleSelection)
        self.setAlternatingRowColors(True)
        self.verticalHeader().setVisible(False)
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeToContents)
        self.horizontalHeader().setStretchLastSection(True)
        self.setWordWrap(False)
        for i, col in enumerate(self.columns):
            item = QTableWidgetItem()
            item.setToolTip(col.tip)
            self.setHorizontalHeaderItem(i, item)
        attach_table_copy(self)  # Ctrl+C and Copy table: tab-separated text for a spreadsheet

    # ---- reading -------------------------------------------------------------------------
    def column(self, key: str) -> int:
        return [c.key for c in self.columns].index(key)

    def cell_text(self, row: int, key: str) -> str:
        return self.item(row, self.column(key)).text()

    def header_text(self, key: str) -> str:
        return self.horizontalHeaderItem(self.column(key)).text()

    def selected_row(self) -> dict | None:
        """The picked option's row (None when nothing is picked)."""
        sel = self.selectionModel().selectedRows()
        if not sel or sel[0].row() >= len(self.rows):
            return None
        return self.rows[sel[0].row()]

    def select_option(self, stages: int) -> None:
        """Pick the row of the ``stages``-stage option."""
        for r, row in enumerate(self.rows):
            if row["stages"] == stages:
                self.selectRow(r)
                return
        raise KeyError(stages)

    # ---- showing -------------------------------------------------------------------------
    def show_rows(self, rows: list[dict], system: str) -> None:
        """Show ``rows`` in ``system``'s units, keeping the picked number of stages (else picking
        the best option). Filling it does not announce a selection change."""
        self.rows = list(rows)
        for i, col in enumerate(self.columns):
            # a name already on two lines needs no empty unit line under it
            two_lines = col.quantity is None and "\n" in col.name
            self.horizontalHeaderItem(i).setText(col.name if two_lines else header(col, system))
        picked = self.selected_row()
        keep = picked["stages"] if picked else None
        best = best_row(self.rows)
        with signals_blocked(self):
            self.setRowCount(len(self.rows))
            for r, row in enumerate(self.rows):
                self._fill(r, row, system, bold=r == best)
        if self.rows:
            want = keep if keep is not None else (self.rows[best]["stages"] if best is not None else None)
            target = next((i for i, row in enumerate(self.rows) if row["stages"] == want), None)
            if target is not None:
                self.selectRow(target)

    def _fill(self, r: int, row: dict, system: str, bold: bool) -> None:
        texts = option_cells(row, system)
        for c, col in enumerate(self.columns):
            item = self.item(r, c)
            if item is None:
                item = QTableWidgetItem()
                self.setItem(r, c, item)
            item.setText(texts[col.key])
            item.setToolTip(plain_tip(tooltip(row, col.key, system)))
            item.setTextAlignment((Qt.AlignLeft if col.key in _LEFT else Qt.AlignRight) | Qt.AlignVCenter)
            font = item.font()
            font.setBold(bold)
            item.setFont(font)
            if not row["feasible"]:
                item.setForeground(_INFEASIBLE)
            else:
                item.setData(Qt.ForegroundRole, None)

    def set_stale(self, stale: bool) -> None:
        """Grey the whole table while the study no longer describes the project."""
        self.setProperty("stale", stale)
        self.style().unpolish(self)
        self.style().polish(self)
