"""The year profile editor with an hourly year (issue 15): an imported 8760-row profile is shown
by a table model that reads the document, an edit changes exactly the entry typed in and repaints
that row only, undo and redo return it, a refused edit leaves the document alone, and US units
show converted values. Timings are in bench/run.py (case ``year_editor``), not here."""
import copy
import json

import pytest

pytest.importorskip("PySide6")

from PySide6.QtCore import Qt  # noqa: E402

from stagewright.gui.year.edits import ENTRY_COLUMNS  # noqa: E402
from gui_support import ROOT, make_window, table_cell_text, type_table_cell, write_hourly_csv  # noqa: E402

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui
COL = {c.key: i for i, c in enumerate(ENTRY_COLUMNS)}
ROW = 5000  # an hour in late July, far below the first screen of rows


def _fahrenheit(t_K: float) -> float:
    # NIST SP 811 (2008), Appendix B.9: t/°F = 1.8 T/K − 459.67
    return 1.8 * t_K - 459.67


@pytest.fixture
def hourly(qtbot, tmp_path):
    """A window whose year is an imported 8760-row hourly profile."""
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    ed = win.panels["year"].profile_editor
    assert ed.import_csv(write_hourly_csv(tmp_path / "hourly.csv"))
    return win, ed


def _row_changes(ed):
    """Rows repainted and resets of the table's model while recording."""
    seen = {"rows": [], "resets": 0}
    model = ed.table.model()
    model.dataChanged.connect(lambda a, b, *_r: seen["rows"].append((a.row(), b.row())))
    model.modelReset.connect(lambda: seen.__setitem__("resets", seen["resets"] + 1))
    return seen


def test_an_edit_in_an_8760_row_profile_changes_exactly_that_entry_and_undo_returns_it(hourly):
    win, ed = hourly
    model, stack = win.editor.model, win.editor.undo_stack
    bins = model.get("year.profile.bins")
    assert len(bins) == 8760 and ed.table.model().rowCount() == 8760
    before = copy.deepcopy(bins)
    seen = _row_changes(ed)
    count = stack.count()
    assert type_table_cell(ed.table, ROW, COL["temperature_K"], "31.5")
    after = model.get("year.profile.bins")
    assert after[ROW] == {**before[ROW], "temperature_K": pytest.approx(304.65, abs=1e-9)}
    assert [b for i, b in enumerate(after) if i != ROW] == [b for i, b in enumerate(before) if i != ROW]
    assert stack.count() == count + 1 and stack.undoText() == "Change bin 5001 (2025-07-28 08:00) temperature"
    # the view repaints the edited row, not the table
    assert seen == {"rows": [(ROW, ROW)], "resets": 0}
    assert table_cell_text(ed.table, ROW, COL["temperature_K"]) == "31.5"
    stack.undo()
    assert model.get("year.profile.bins") == before
    assert table_cell_text(ed.table, ROW, COL["temperature_K"]) == f"{before[ROW]['temperature_K'] - 273.15:.1f}"
    stack.redo()
    assert model.get(f"year.profile.bins[{ROW}].temperature_K") == pytest.approx(304.65, abs=1e-9)
    assert seen["resets"] == 0 and seen["rows"] == [(ROW, ROW)] * 3


def test_a_cell_left_as_shown_is_no_edit(hourly):
    win, ed = hourly
    count = win.editor.undo_stack.count()
    stored = win.editor.model.get(f"year.profile.bins[{ROW}].relative_humidity")
    model = ed.table.model()
    shown = model.data(model.index(ROW, COL["relative_humidity"]), Qt.EditRole)  # what the cell's editor holds
    assert type_table_cell(ed.table, ROW, COL["relative_humidity"], shown)
    assert win.editor.undo_stack.count() == count
    assert win.editor.model.get(f"year.profile.bins[{ROW}].relative_humidity") == stored  # not rounded


def test_a_refused_edit_in_an_8760_row_profile_leaves_the_document_alone(hourly):
    win, ed = hourly
    before = copy.deepcopy(win.editor.model.doc)
    count = win.editor.undo_stack.count()
    assert not type_table_cell(ed.table, ROW, COL["temperature_K"], "75")  # above the schema's 60 °C
    msg = ed.message.text()
    assert f"year.profile.bins[{ROW}].temperature_K" in msg and "75.00 °C" in msg and "-50 to 60 °C" in msg
    assert not type_table_cell(ed.table, ROW, COL["hours"], "30")  # 8789 h in all: more than a year
    assert "year.profile.bins" in ed.message.text() and "8784" in ed.message.text()
    assert not type_table_cell(ed.table, ROW, COL["load"], "warm")
    assert "not a number" in ed.message.text()
    assert win.editor.model.doc == before and win.editor.undo_stack.count() == count
    assert table_cell_text(ed.table, ROW, COL["hours"]) == "1"


def test_us_units_show_converted_values_of_an_hourly_year(hourly):
    win, ed = hourly
    t_K = win.editor.model.get(f"year.profile.bins[{ROW}].temperature_K")
    coolant_K = win.editor.model.get(f"year.profile.bins[{ROW}].coolant_inlet_temperature_K")
    win.set_us_units(True)
    model = ed.table.model()
    assert "°F" in model.headerData(COL["temperature_K"], Qt.Horizontal)
    for key, value_K in (("temperature_K", t_K), ("coolant_inlet_temperature_K", coolant_K)):
        assert float(table_cell_text(ed.table, ROW, COL[key])) == pytest.approx(_fahrenheit(value_K), abs=0.051)
    assert type_table_cell(ed.table, ROW, COL["temperature_K"], "86")  # 30 °C
    assert win.editor.model.get(f"year.profile.bins[{ROW}].temperature_K") == pytest.approx(303.15, abs=1e-9)
    win.set_us_units(False)
    assert table_cell_text(ed.table, ROW, COL["temperature_K"]) == "30.0"
