"""Tables copy to the clipboard as tab-separated text a spreadsheet reads (window issue, item 14):
Ctrl+C and the context menu's *Copy table* (the whole table, whatever row is selected) and *Copy
selected rows*, a header row with units, numbers as shown (without the spaces that group
thousands), hidden rows and columns left out."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")

from PySide6.QtCore import Qt  # noqa: E402
from PySide6.QtGui import QGuiApplication  # noqa: E402
from PySide6.QtWidgets import QTableWidget, QTableWidgetItem  # noqa: E402

from stagewright.gui.widgets.table_copy import attach_table_copy, clipboard_cell, table_rows, tsv  # noqa: E402
from gui_support import make_window, wait_solved  # noqa: E402

pytestmark = pytest.mark.gui


def _clipboard() -> str:
    return QGuiApplication.clipboard().text()


def _grid(text: str) -> list[list[str]]:
    assert text.endswith("\n")
    return [line.split("\t") for line in text[:-1].split("\n")]


def _press_copy(qtbot, view) -> None:
    QGuiApplication.clipboard().setText("")
    view.setFocus()
    qtbot.keyClick(view, Qt.Key_C, Qt.ControlModifier)


def test_cells_become_one_line_numbers_without_grouping():
    assert clipboard_cell("172 945") == "172945"
    assert clipboard_cell("-1 234 567.25 Btu/h") == "-1234567.25 Btu/h"
    assert clipboard_cell("12.27 kg/h") == "12.27 kg/h"
    assert clipboard_cell("Shaft power\n[kW]") == "Shaft power [kW]"
    assert clipboard_cell("Stage 1 discharge") == "Stage 1 discharge"
    assert clipboard_cell("a\tb") == "a b"  # a tab inside a cell would split it
    assert tsv([["a", "1 000"], ["b", ""]]) == "a\t1000\nb\t\n"


def test_a_plain_table_copies_what_it_shows(qtbot):
    t = QTableWidget(3, 3)
    qtbot.addWidget(t)
    t.setHorizontalHeaderLabels(["Name", "Flow\n[m³/h]", "Note"])
    t.verticalHeader().setVisible(False)
    for r, row in enumerate([["A", "1 250.5", "x"], ["B", "7.0", "y"], ["C", "3.0", "z"]]):
        for c, text in enumerate(row):
            t.setItem(r, c, QTableWidgetItem(text))
    t.setColumnHidden(2, True)
    t.setRowHidden(1, True)
    assert table_rows(t) == [["Name", "Flow\n[m³/h]"], ["A", "1 250.5"], ["C", "3.0"]]
    copier = attach_table_copy(t)
    t.show()
    _press_copy(qtbot, t)
    assert _clipboard() == "Name\tFlow [m³/h]\nA\t1250.5\nC\t3.0\n"
    t.selectRow(2)
    assert copier.text(only_selected=True) == "Name\tFlow [m³/h]\nC\t3.0\n"


def test_balance_sheet_tables_copy_with_units_and_as_shown(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    bal = win.panels["balance"]
    _press_copy(qtbot, bal.points)
    rows = _grid(_clipboard())
    header = ["Point"] + [f"{bal.points.horizontalHeaderItem(c).text().replace(chr(10), ' ')}"
                          for c in range(1, bal.points.columnCount()) if not bal.points.isColumnHidden(c)]
    assert rows[0] == header and rows[0][1] == "T [°C]"
    assert [r[0] for r in rows[1:]] == ["Site intake", "After intake filter", "Stage 1 discharge",
                                        "Intercooler 1 outlet", "Stage 2 discharge", "Aftercooler outlet"]
    assert rows[3][1] == bal.value_text("points", "stage-1", "T")  # numbers as shown
    assert all(float(cell) == float(cell) for row in rows[1:] for cell in row[1:])  # every cell a number

    bal.components.selectRow(bal.row_keys("components").index("cooler-2"))
    _press_copy(qtbot, bal.components)  # Ctrl+C: still the whole table
    rows = _grid(_clipboard())
    assert rows[0][:3] == ["Component", "Ratio", "Shaft power [kW]"] and len(rows) == 1 + 6
    rows = _grid(bal.copiers["components"].copy(only_selected=True))  # Copy selected rows
    assert rows[0][:3] == ["Component", "Ratio", "Shaft power [kW]"] and [r[0] for r in rows[1:]] == ["Aftercooler"]

    _press_copy(qtbot, bal.totals)  # no selection: the whole table, value and unit apart
    rows = _grid(_clipboard())
    assert rows[0] == ["Total", "Value", "Unit"]
    shaft = next(r for r in rows if r[0] == "Shaft power")
    assert shaft == ["Shaft power"] + bal.value_text("totals", "shaft_power_W", "").split(" ")
    assert len(rows) - 1 == sum(not bal.totals.isRowHidden(r) for r in range(bal.totals.rowCount()))
    win.close()


def test_us_units_copy_numbers_a_spreadsheet_reads(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    win.prefs.system = "US"
    bal = win.panels["balance"]
    shown = bal.value_text("components", "cooler-1", "heat")
    assert " " in shown  # Btu/h: thousands grouped by a space on screen
    rows = _grid(bal.copiers["components"].text())
    heat = rows[0].index("Heat out [Btu/h]")
    cooler = next(r for r in rows if r[0] == "Intercooler 1")
    assert cooler[heat] == shown.replace(" ", "")
    win.close()


def test_context_menu_copies_the_table_and_the_whole_sheet(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    bal = win.panels["balance"]
    assert bal.totals.contextMenuPolicy() == Qt.CustomContextMenu

    def entry(table: str, text: str):
        menu = bal.copiers[table].menu()
        return {a.text(): a for a in menu.actions()}[text]

    assert [a.text() for a in bal.copiers["totals"].menu().actions()] == [
        "Copy table", "Copy selected rows", "Copy balance sheet"]
    assert not entry("totals", "Copy selected rows").isEnabled()  # nothing selected yet
    QGuiApplication.clipboard().setText("")
    entry("totals", "Copy table").trigger()
    assert _clipboard() == bal.copiers["totals"].text() and _clipboard().startswith("Total\tValue\tUnit\n")

    entry("points", "Copy balance sheet").trigger()
    blocks = _clipboard().split("\n\n")
    assert [b.split("\t", 1)[0] for b in blocks] == ["Point", "Component", "Total"]
    win.close()


def test_out_of_date_numbers_copy_under_the_out_of_date_note(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    ed, bal = win.editor, win.panels["balance"]
    n = ed.solved_jobs
    ed.set_value("stages[0].efficiency.value", 1.5)  # out of range: not solved, last numbers kept
    qtbot.waitUntil(lambda: bal.is_stale)
    first = bal.copiers["points"].text().split("\n")[0]
    assert first.startswith("Out of date")
    ed.undo_stack.undo()
    wait_solved(qtbot, win, n)
    assert bal.copiers["points"].text().startswith("Point\t")
    win.close()


def test_study_options_table_copies_its_options(qtbot):
    from stagewright.gui.study.options_table import OptionsTable
    rows = [{"stages": n, "pressure_ratios": [9 ** (1 / n)] * n, "driver_power_W": p, "feasible": True,
             "binding_limits": [], "note": ""} for n, p in ((2, 260_000.0), (3, 250_000.0))]  # invented
    table = OptionsTable()
    qtbot.addWidget(table)
    table.show_rows(rows, "SI")
    table.show()
    table.select_option(3)  # the picked option does not narrow Ctrl+C
    _press_copy(qtbot, table)
    grid = _grid(_clipboard())
    assert len(grid) == 3 and grid[0] == [clipboard_cell(h) for h in table_rows(table)[0]]
    power = table.column("power")  # no hidden columns here: the copy's columns are the table's
    assert grid[0][power] == clipboard_cell(table.header_text("power"))
    assert [r[power] for r in grid[1:]] == [clipboard_cell(table.cell_text(r, "power")) for r in (0, 1)]
    assert [r[0] for r in grid[1:]] == [table.cell_text(r, "stages") for r in (0, 1)]


def test_year_table_copies_its_bins(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    results = win.panels["year"].results
    table = results.table
    results.bins.show([{"label": "Jan", "temperature_K": 270.15}, {"label": "Feb", "temperature_K": 1273.65}], "SI")
    win.docks["year"].raise_()
    _press_copy(qtbot, table)
    grid = _grid(_clipboard())
    model = table.model()
    assert [r[0] for r in grid[1:]] == ["Jan", "Feb"] and grid[2][1] == "1000.50"  # °C, two decimals, no thousands space in a copy
    assert len(grid[0]) == model.columnCount() - sum(table.isColumnHidden(c) for c in range(model.columnCount()))
    win.close()
