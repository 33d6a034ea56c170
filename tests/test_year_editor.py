"""The year profile editor in the Year at site panel: every edit one undo step, SI in the
document, refused values leave it unchanged, and the edited project saves and loads again."""
import copy
import json

import pytest

pytest.importorskip("PySide6")

from PySide6.QtCore import Qt  # noqa: E402

from stagewright.gui.year.edits import ENTRY_COLUMNS  # noqa: E402
from gui_support import ROOT, make_window, simple_real_gas_doc  # noqa: E402

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui

COL = {c.key: i for i, c in enumerate(ENTRY_COLUMNS)}


def _fahrenheit_to_K(t_F: float) -> float:
    # NIST SP 811 (2008), Appendix B.9: T/K = (t/°F + 459.67) / 1.8
    return (t_F + 459.67) / 1.8


def _type_cell(ed, row: int, key: str, text: str) -> bool:
    """What the table does when the user finishes typing in a cell: the view's delegate sets the
    model's data (the editor commits it as one undo step or refuses it)."""
    model = ed.table.model()
    return model.setData(model.index(row, COL[key]), text, Qt.EditRole)


def _cell(ed, row: int, key: str) -> str:
    """The cell's text as the table shows it."""
    model = ed.table.model()
    return model.data(model.index(row, COL[key]), Qt.DisplayRole)


def _head(ed, key: str) -> str:
    return ed.table.model().headerData(COL[key], Qt.Horizontal, Qt.DisplayRole)


def _sample_window(qtbot, tmp_path):
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    return make_window(qtbot, tmp_path, doc)


def test_start_from_the_site_creates_twelve_placeholder_months_as_one_undo_step(qtbot, tmp_path):
    doc = simple_real_gas_doc(stages=1)
    doc["site"]["relative_humidity"] = 0.55
    win = make_window(qtbot, tmp_path, doc)
    panel = win.panels["year"]
    ed = panel.profile_editor
    assert ed.stack.currentIndex() == 0 and not panel.run_button.isEnabled()
    count = win.editor.undo_stack.count()
    ed.start_button.click()
    year = win.editor.model.get("year")
    assert year["profile"]["kind"] == "monthly" and len(year["profile"]["months"]) == 12
    assert all(m == {"temperature_K": 293.15, "relative_humidity": 0.55} for m in year["profile"]["months"])
    assert win.editor.model.problems() == []
    assert ed.stack.currentIndex() == 1 and ed.table.model().rowCount() == 12
    assert ed.note.isVisibleTo(ed) and "Placeholders" in ed.note.text()
    assert panel.run_button.isEnabled()
    assert win.editor.undo_stack.count() == count + 1
    # once a month differs from the site, the placeholder note goes
    _type_cell(ed, 6, "temperature_K", "26")
    assert win.editor.model.get("year.profile.months[6].temperature_K") == pytest.approx(299.15)
    assert not ed.note.isVisibleTo(ed)
    win.editor.undo_stack.undo()
    win.editor.undo_stack.undo()
    assert win.editor.model.get("year", None) is None and ed.stack.currentIndex() == 0


def test_a_cell_typed_in_us_units_is_stored_in_kelvin_and_undo_redo_restore_it(qtbot, tmp_path):
    win = _sample_window(qtbot, tmp_path)
    win.set_us_units(True)
    ed = win.panels["year"].profile_editor
    model, stack = win.editor.model, win.editor.undo_stack
    assert "°F" in _head(ed, "temperature_K")
    old = model.get("year.profile.months[2].temperature_K")
    _type_cell(ed, 2, "temperature_K", "50")
    assert model.get("year.profile.months[2].temperature_K") == pytest.approx(_fahrenheit_to_K(50.0), abs=1e-9)
    assert stack.undoText() == "Change March temperature"
    stack.undo()
    assert model.get("year.profile.months[2].temperature_K") == old
    assert _cell(ed, 2, "temperature_K") == "43.7"  # 279.65 K shown in °F again
    stack.redo()
    assert model.get("year.profile.months[2].temperature_K") == pytest.approx(283.15, abs=1e-9)
    # humidity in percent, load in percent: fractions in the document
    _type_cell(ed, 2, "relative_humidity", "71.5")
    assert model.get("year.profile.months[2].relative_humidity") == pytest.approx(0.715)


def test_an_out_of_range_cell_is_refused_naming_field_value_and_range(qtbot, tmp_path):
    win = _sample_window(qtbot, tmp_path)
    win.set_us_units(True)
    ed = win.panels["year"].profile_editor
    before = copy.deepcopy(win.editor.model.doc)
    count = win.editor.undo_stack.count()
    _type_cell(ed, 2, "temperature_K", "150")  # 338.7 K: above the schema's 333.15 K
    msg = ed.message.text()
    assert "year.profile.months[2].temperature_K" in msg
    assert "150.0 °F" in msg and "-58 to 140 °F" in msg and "[223.15, 333.15] K" in msg
    assert win.editor.model.doc == before and win.editor.undo_stack.count() == count
    assert _cell(ed, 2, "temperature_K") == "43.7"  # the cell shows the document again
    _type_cell(ed, 3, "relative_humidity", "twelve")
    assert "not a number" in ed.message.text() and win.editor.model.doc == before
    ed.fields["year.load"][0].setText("0")  # load is in (0, 1]
    ed.fields["year.load"][0].setModified(True)
    ed.fields["year.load"][0].editingFinished.emit()
    assert "year.load" in ed.message.text() and "(0, 1]" in ed.message.text()
    assert win.editor.model.doc == before
    # a month longer than the month is the core's rule (stagewright.core.year_profile), also refused
    _type_cell(ed, 1, "hours", "700")
    assert "February" in ed.message.text() and win.editor.model.doc == before
    # a good value clears the message
    assert ed.set_field("year.load", "70")
    assert win.editor.model.get("year.load") == pytest.approx(0.7) and ed.message.text() == ""


def test_monthly_hours_typed_once_fill_the_other_months_so_the_year_keeps_its_hours(qtbot, tmp_path):
    from stagewright.core.project.validation import normalise
    from stagewright.core.year_profile import operating_bins
    win = _sample_window(qtbot, tmp_path)
    ed = win.panels["year"].profile_editor
    before = operating_bins(normalise(win.editor.model.doc)["year"])
    _type_cell(ed, 0, "hours", "400")
    after = operating_bins(normalise(win.editor.model.doc)["year"])
    assert after[0].hours == 400.0
    assert [b.hours for b in after[1:]] == pytest.approx([b.hours for b in before[1:]], abs=1e-5)
    win.editor.undo_stack.undo()
    assert all("hours" not in m for m in win.editor.model.get("year.profile.months"))


def test_switch_to_bins_keeps_the_year_then_add_and_remove_bins(qtbot, tmp_path):
    from stagewright.core.project.validation import normalise
    from stagewright.core.year_profile import operating_bins
    win = _sample_window(qtbot, tmp_path)
    ed = win.panels["year"].profile_editor
    model, stack = win.editor.model, win.editor.undo_stack
    before = operating_bins(normalise(model.doc)["year"])
    assert not ed.add_button.isVisibleTo(ed)  # a monthly profile has exactly 12 months
    assert ed.set_kind("bins")
    assert model.problems() == []
    after = operating_bins(normalise(model.doc)["year"])
    assert [b.label for b in after] == [b.label for b in before]
    assert [b.hours for b in after] == pytest.approx([b.hours for b in before], rel=1e-12)
    assert [(b.temperature_K, b.relative_humidity, b.load, b.coolant_inlet_temperature_K) for b in after] == \
        [(b.temperature_K, b.relative_humidity, b.load, b.coolant_inlet_temperature_K) for b in before]
    assert ed.add_button.isVisibleTo(ed)
    ed.table.selectRow(2)
    ed.add_button.click()
    bins = model.get("year.profile.bins")
    assert len(bins) == 13 and ed.table.model().rowCount() == 13
    assert bins[3]["temperature_K"] == bins[2]["temperature_K"] and "label" not in bins[3]
    assert _cell(ed, 3, "label") == "bin 4"
    _type_cell(ed, 3, "label", "Heat wave")
    _type_cell(ed, 3, "hours", "40")
    assert model.get("year.profile.bins[3]") == {**bins[3], "label": "Heat wave", "hours": 40.0}
    ed.table.selectRow(0)
    ed.remove_button.click()
    assert len(model.get("year.profile.bins")) == 12
    assert model.get("year.profile.bins[0].label") == "February"
    for _ in range(4):
        stack.undo()
    assert len(model.get("year.profile.bins")) == 12 and model.get("year.profile.bins[0].label") == "January"
    stack.undo()
    assert model.get("year.profile.kind") == "monthly"
    # back from 13 bins to months is refused with the schema's limit of twelve months
    stack.redo()
    stack.redo()
    before_refusal = copy.deepcopy(model.doc)
    assert not ed.set_kind("monthly")
    assert "[year.profile.months]" in ed.message.text() and "expected 1 to 12 items" in ed.message.text()
    assert "13 item(s)" in ed.message.text()
    assert model.doc == before_refusal


def test_the_last_bin_cannot_be_removed(qtbot, tmp_path):
    doc = simple_real_gas_doc(stages=1)
    doc["year"] = {"profile": {"kind": "bins", "bins": [{"temperature_K": 290.0, "relative_humidity": 0.5,
                                                          "hours": 1000.0}]}}
    win = make_window(qtbot, tmp_path, doc)
    ed = win.panels["year"].profile_editor
    assert not ed.remove_button.isEnabled()
    before = copy.deepcopy(win.editor.model.doc)
    assert not ed.remove_entry()
    assert "year.profile.bins" in ed.message.text() and win.editor.model.doc == before


def test_edited_year_saves_and_loads_back_the_same(qtbot, tmp_path):
    from stagewright.core.project import load
    win = _sample_window(qtbot, tmp_path)
    win.set_us_units(True)
    ed = win.panels["year"].profile_editor
    _type_cell(ed, 7, "temperature_K", "77")
    assert ed.set_field("year.operating_hours_per_year", "7000")
    assert ed.set_field("year.energy_price_per_kWh", "0.21")
    assert ed.set_kind("bins")
    out = tmp_path / "edited.json"
    assert win.files.save_to(out)
    loaded = load(out)
    assert loaded["year"] == win.editor.model.doc["year"]
    assert loaded["year"]["profile"]["bins"][7]["temperature_K"] == pytest.approx(298.15, abs=1e-9)
    assert loaded["year"]["operating_hours_per_year"] == 7000.0
    win.files.new_project()
    assert win.panels["year"].profile_editor.stack.currentIndex() == 0
    assert win.files.open_path(str(out))
    assert win.panels["year"].profile_editor.table.model().rowCount() == 12
    assert win.editor.model.get("year") == loaded["year"]


def test_delete_year_is_undoable(qtbot, tmp_path):
    win = _sample_window(qtbot, tmp_path)
    ed = win.panels["year"].profile_editor
    year = copy.deepcopy(win.editor.model.get("year"))
    ed.delete_button.click()
    assert win.editor.model.get("year", None) is None and not win.panels["year"].run_button.isEnabled()
    win.editor.undo_stack.undo()
    assert win.editor.model.get("year") == year and win.panels["year"].run_button.isEnabled()
