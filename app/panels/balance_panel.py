"""Balance sheet: every state point and component of the solved train, totals and closure.

Shows the last result in the display unit system; when the document has changed in a way
that cannot be solved (or the solve failed) the numbers stay visible but greyed, under a
banner that says they are out of date. Each table copies to the clipboard as tab-separated text
(Ctrl+C, or its context menu, which also copies the whole sheet).
"""
from __future__ import annotations

__all__ = ["BalancePanel", "POINT_COLUMNS", "COMPONENT_COLUMNS", "TOTALS", "TOTAL_TIPS", "NEGATIVE_TIPS"]

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor
from PySide6.QtWidgets import (QAbstractItemView, QHeaderView, QLabel, QSplitter, QTableWidget,
                               QTableWidgetItem, QVBoxLayout, QWidget)

from stagewright.gui.widgets.plain_text import plain_label
from stagewright.gui.presentation import balance_tables as tables
from stagewright.gui.presentation.figures import Figure, condition_holds, shown
from stagewright.gui.presentation.result_notes import NEGATIVE_TIPS, TOTAL_TIPS
from stagewright.gui.document.paths import stage_index
from stagewright.gui.widgets.table_copy import attach_table_copy, table_rows

WARNING_BG = "#fde7c4"  # a value a warning in Messages is about
_OUT = "window"
#: the window's columns and totals as the presentation tables stood at import (the panel reads
#: the tables afresh when it is built)
POINT_COLUMNS = tuple(shown(tables.POINTS, _OUT))
COMPONENT_COLUMNS = tuple(shown(tables.COMPONENTS, _OUT))
TOTALS = tuple(shown(tables.TOTALS, _OUT))
_POINT_NAMES = {"intake": "Site intake", "filter": "After intake filter"}
_COMPONENT_NAMES = {"filter": "Intake filter", "train": "Whole train"}


class FitTable(QTableWidget):
    """Columns as wide as their contents; spare width shared out evenly among the shown
    columns (never clipped)."""

    def fit_columns(self) -> None:
        header = self.horizontalHeader()
        self.resizeColumnsToContents()
        shown = [i for i in range(self.columnCount()) if not self.isColumnHidden(i)]
        widths = {i: header.sectionSize(i) for i in shown}
        spare = self.viewport().width() - sum(widths.values())
        if spare > 0 and len(shown) > 1:  # to the shown figure columns only (not the label)
            extra = spare // (len(shown) - 1)
            for i in shown[1:]:
                header.resizeSection(i, widths[i] + extra)

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self.fit_columns()


def _table(columns: list[str]) -> QTableWidget:
    t = FitTable(0, len(columns))
    t.setEditTriggers(QAbstractItemView.NoEditTriggers)
    t.setSelectionBehavior(QAbstractItemView.SelectRows)
    t.setAlternatingRowColors(True)
    t.verticalHeader().setVisible(False)
    t.verticalHeader().setDefaultSectionSize(20)
    t.setHorizontalHeaderLabels(columns)
    h = t.horizontalHeader()
    h.setSectionResizeMode(QHeaderView.Interactive)
    h.setStretchLastSection(False)
    t.setWordWrap(False)
    return t


class BalancePanel(QWidget):
    """Three tables: state points, components, totals (their figures: :mod:`stagewright.gui.presentation.balance_tables`)."""

    title = "Balance sheet"

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self._columns = {"points": shown(tables.POINTS, _OUT), "components": shown(tables.COMPONENTS, _OUT)}
        self._total_rows = shown(tables.TOTALS, _OUT)
        self._filled: tuple = (None, None)  # (result, units) the tables were last filled with
        lay = QVBoxLayout(self)
        lay.setContentsMargins(6, 4, 6, 4)
        lay.setSpacing(4)
        self.banner = plain_label(QLabel())
        self.banner.setObjectName("staleBanner")
        self.banner.setWordWrap(True)
        self.banner.hide()
        lay.addWidget(self.banner)
        split = QSplitter(Qt.Horizontal)
        left = QSplitter(Qt.Vertical)
        self.points = _table(["Point"] + [f.label_in(_OUT) for f in self._columns["points"]])
        self.components = _table(["Component"] + [f.label_in(_OUT) for f in self._columns["components"]])
        self.totals = _table(["Total", "Value"])
        self.totals.setMinimumWidth(330)
        left.addWidget(self.points)
        left.addWidget(self.components)
        split.addWidget(left)
        split.addWidget(self.totals)
        split.setStretchFactor(0, 3)
        split.setStretchFactor(1, 1)
        self.splitter = split
        lay.addWidget(split, 1)
        self._row_keys: dict[str, list[str]] = {"points": [], "components": [], "totals": []}
        sheet = [("Copy balance sheet", self.sheet_text)]
        self.copiers = {name: attach_table_copy(getattr(self, name), rows, sheet) for name, rows in (
            ("points", lambda sel: self._copy_rows(self.points, sel)),
            ("components", lambda sel: self._copy_rows(self.components, sel)),
            ("totals", self._copy_totals))}
        editor.result_changed.connect(self.refresh)
        editor.prefs.changed.connect(self.refresh)
        self.refresh()

    # ---- reading (tests and reports) -------------------------------------------------------
    def value_text(self, table: str, row_key: str, column: str) -> str:
        """Shown text of a cell: ``value_text("components", "stage-2", "power")``."""
        return self._item(table, row_key, column).text()

    def tool_tip(self, table: str, row_key: str, column: str) -> str:
        """Tooltip of a cell; ``column`` ``"label"`` is a row's label (``tool_tip("totals", key, "label")``)."""
        return self._item(table, row_key, column).toolTip()

    def _item(self, table: str, row_key: str, column: str) -> QTableWidgetItem:
        t = getattr(self, table)
        row = self._row_keys[table].index(row_key)
        if column == "label":
            col = 0
        elif table == "totals":
            col = 1
        else:
            col = 1 + [f.id for f in self._columns[table]].index(column)
        return t.item(row, col)

    def row_keys(self, table: str) -> list[str]:
        return list(self._row_keys[table])

    def column_keys(self, table: str) -> list[str]:
        """Ids of the figure columns of ``"points"`` or ``"components"`` (after the row label)."""
        return [f.id for f in self._columns[table]]

    def show_row(self, table: str, row_key: str) -> bool:
        """Select the row ``row_key`` of ``table`` and scroll it into view; False if it has none shown."""
        keys = self._row_keys.get(table, [])
        t = getattr(self, table)
        if row_key not in keys or t.isRowHidden(keys.index(row_key)):
            return False
        row = keys.index(row_key)
        t.setFocus()
        t.selectRow(row)
        t.scrollTo(t.model().index(row, 0))
        return True

    # ---- copying ---------------------------------------------------------------------------
    def sheet_text(self) -> str:
        """The three tables as tab-separated text, a blank line between them."""
        return "\n".join(self.copiers[name].text() for name in ("points", "components", "totals"))

    def _stale_note(self) -> list[list[str]]:
        return [[self.banner.text()]] if self.is_stale and self.banner.text() else []

    def _copy_rows(self, table: QTableWidget, only_selected: bool) -> list[list[str]]:
        return self._stale_note() + table_rows(table, only_selected)

    def _copy_totals(self, only_selected: bool) -> list[list[str]]:
        """Totals with the value and its unit in separate columns (a spreadsheet reads the number)."""
        r = self.editor.result
        chosen = {i.row() for i in self.totals.selectionModel().selectedIndexes()}
        rows = [["Total", "Value", "Unit"]]
        if r is None:
            return self._stale_note() + rows
        system = self.editor.prefs.system
        for row, fig in enumerate(self._total_rows):
            if self.totals.isRowHidden(row) or (only_selected and row not in chosen):
                continue
            rows.append([fig.label_in(_OUT), fig.text(r, _OUT, system), fig.symbol_in(_OUT, system)])
        return self._stale_note() + rows

    @property
    def is_stale(self) -> bool:
        return self.banner.isVisibleTo(self)

    # ---- filling -------------------------------------------------------------------------
    def refresh(self) -> None:
        ed = self.editor
        r = ed.result
        system = ed.prefs.system
        stale = ed.stale and not ed.solver.busy
        if stale and r is not None:
            why = "the inputs marked in Messages need fixing" if (ed.problems or ed.entry_errors) else \
                "the last solve failed (see Messages)"
            self.banner.setText(f"Out of date — {why}. These numbers belong to an earlier input.")
        elif stale:
            self.banner.setText("No results yet — the inputs marked in Messages need fixing.")
        self.banner.setVisible(stale)
        for t in (self.points, self.components, self.totals):
            t.setProperty("stale", stale)
            t.style().unpolish(t)
            t.style().polish(t)
        shown_for = (system, self.editor.prefs.gauge, self.editor.barometric_Pa())
        if r is not None and r is self._filled[0] and shown_for == self._filled[1]:
            return  # the same result in the same units (an edit marked it out of date): nothing to refill
        self._filled = (r, shown_for)
        self._headers(system)
        if r is None:
            for t in (self.points, self.components, self.totals):
                t.setRowCount(0)
            return
        self._fill_points(r, system)
        self._fill_components(r, system)
        self._fill_totals(r, system)
        self._hide_what_does_not_apply(r)
        for t in (self.points, self.components, self.totals):
            t.fit_columns()

    def _hide_what_does_not_apply(self, r: dict) -> None:
        """Humidity columns and water totals only where there is water to speak of, exchanger
        figures only when some cooler has a coolant side (each figure's ``when``)."""
        for name, rows in (("points", [(None, p) for _, _, p in tables.train_points(r)]),
                           ("components", [(kind, c) for _, kind, _, c in tables.component_rows(r)])):
            table = getattr(self, name)
            for col, fig in enumerate(self._columns[name], 1):
                table.setColumnHidden(col, not condition_holds(fig, _OUT, r, rows))
        for row, fig in enumerate(self._total_rows):
            self.totals.setRowHidden(row, not condition_holds(fig, _OUT, r))

    def _pressure_kw(self) -> dict:
        return {"gauge": self.editor.prefs.gauge, "barometric_Pa": self.editor.barometric_Pa()}

    def _headers(self, system: str) -> None:
        def head(fig: Figure) -> str:  # name over unit keeps the columns narrow
            sym = fig.symbol_in(_OUT, system, **self._pressure_kw())
            return f"{fig.label_in(_OUT)}\n[{sym}]" if sym else f"{fig.label_in(_OUT)}\n"
        self.points.setHorizontalHeaderLabels(["Point\n"] + [head(f) for f in self._columns["points"]])
        self.components.setHorizontalHeaderLabels(["Component\n"] + [head(f) for f in self._columns["components"]])

    @staticmethod
    def _point_name(key: str, i: int | None, stages: int) -> str:
        if key in _POINT_NAMES:
            return _POINT_NAMES[key]
        if key.startswith("stage"):
            return f"Stage {i} discharge"
        return "Aftercooler outlet" if i == stages else f"Intercooler {i} outlet"

    def _fill_points(self, r: dict, system: str) -> None:
        rows = tables.train_points(r)
        n = len(r["stages"])
        self.points.setRowCount(len(rows))
        self._row_keys["points"] = [k for k, _, _ in rows]
        hot = {f"stage-{i + 1}" for i in self._over_limit(r)}
        pressure = self._pressure_kw()
        for row, (key, i, p) in enumerate(rows):
            self._set(self.points, row, 0, self._point_name(key, i, n), left=True)
            for col, fig in enumerate(self._columns["points"], 1):
                item = self._set(self.points, row, col, fig.text(p, _OUT, system, **pressure))
                flagged = key in hot and fig.id == "T"
                item.setBackground(QColor(WARNING_BG) if flagged else QBrush())
                item.setToolTip("Above this stage's discharge temperature limit (see Messages)" if flagged else "")

    @staticmethod
    def _over_limit(r: dict) -> set[int]:
        """Stages whose discharge-temperature warning the result carries (0-based)."""
        out = set()
        for w in r.get("warnings", []):
            i = stage_index(w.get("field", ""))
            if i is not None and w["field"].endswith("max_discharge_temperature_K"):
                out.add(i)
        return out

    def _fill_components(self, r: dict, system: str) -> None:
        rows = tables.component_rows(r)
        n = len(r["stages"])
        self.components.setRowCount(len(rows))
        self._row_keys["components"] = [k for k, _, _, _ in rows]
        for row, (key, kind, i, data) in enumerate(rows):
            bold = kind == "train"
            if kind in _COMPONENT_NAMES:
                label = _COMPONENT_NAMES[kind]
            else:
                label = f"Stage {i}" if kind == "stage" else ("Aftercooler" if i == n else f"Intercooler {i}")
            self._set(self.components, row, 0, label, left=True, bold=bold)
            for col, fig in enumerate(self._columns["components"], 1):
                self._set(self.components, row, col, fig.text(data, _OUT, system, kind=kind, missing=""), bold=bold)

    def _fill_totals(self, r: dict, system: str) -> None:
        self.totals.setRowCount(len(self._total_rows))
        self._row_keys["totals"] = [f.id for f in self._total_rows]
        for row, fig in enumerate(self._total_rows):
            v = fig.value(r)
            self._set(self.totals, row, 0, fig.label_in(_OUT), left=True).setToolTip(fig.note)
            text = fig.text(r, _OUT, system, with_unit=True)
            negative = isinstance(v, (int, float)) and v < 0.0
            self._set(self.totals, row, 1, text).setToolTip(fig.negative_note if negative else "")

    @staticmethod
    def _set(table: QTableWidget, row: int, col: int, text: str, left: bool = False,
             bold: bool = False) -> QTableWidgetItem:
        item = table.item(row, col)
        if item is None:
            item = QTableWidgetItem()
            table.setItem(row, col, item)
        item.setText(text)
        item.setTextAlignment((Qt.AlignLeft if left else Qt.AlignRight) | Qt.AlignVCenter)
        if bold != item.font().bold():
            font = item.font()
            font.setBold(bold)
            item.setFont(font)
        return item
