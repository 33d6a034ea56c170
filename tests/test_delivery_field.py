"""The Duty panel's delivery-pressure field keeps what the user stated, gauge or absolute (issue 14, item 3)."""
import pytest

from tests.gui_support import make_window, simple_real_gas_doc, type_into, wait_solved

pytestmark = pytest.mark.gui

GAUGE, ABSOLUTE = "discharge_gauge_pressure_Pa", "discharge_pressure_Pa"


def _doc_at_600_m() -> dict:
    doc = simple_real_gas_doc()
    doc["site"] = {"ambient_temperature_K": 293.15, "elevation_m": 600.0}
    return doc


def test_8_bar_gauge_is_held_when_the_elevation_changes(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc_at_600_m())
    ed, duty, site = win.editor, win.panels["duty"], win.panels["site"]
    assert ed.prefs.gauge
    n = ed.solved_jobs
    type_into(qtbot, duty.pressure, "8")
    wait_solved(qtbot, win, n)
    n = ed.solved_jobs
    type_into(qtbot, site.elevation, "0")
    wait_solved(qtbot, win, n)
    # what the user asked for is still shown and still solved: 8 bar(g) at the new site
    assert duty.pressure.text() == "8" and duty.pressure.unit_label.text() == "bar(g)"
    assert ed.model.get(GAUGE) == 800_000.0 and ABSENT_ABS(ed)
    delivered = ed.result["delivery"]["pressure_Pa"] - ed.result["barometric_pressure_Pa"]
    assert delivered == pytest.approx(800_000.0, rel=1e-9)
    assert ed.result["barometric_pressure_Pa"] == pytest.approx(101_325.0)  # ISO 2533 at 0 m
    win.close()


def ABSENT_ABS(ed) -> bool:
    from stagewright.gui.document.paths import ABSENT
    return ed.model.get(ABSOLUTE) is ABSENT


def test_typing_writes_the_key_of_the_basis_shown_as_one_undo_step(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())  # states 9 bar(a) at a 1 bar(a) site
    ed, duty = win.editor, win.panels["duty"]
    before = dict(ed.model.doc)
    assert duty.pressure.text() == "8" and duty.pressure.unit_label.text() == "bar(g)"
    win.action_map["view.gauge"].trigger()  # show absolute: the document is untouched
    assert duty.pressure.text() == "9" and duty.pressure.unit_label.text() == "bar(a)"
    assert ed.model.doc == before and ed.undo_stack.count() == 0
    win.action_map["view.gauge"].trigger()
    n = ed.solved_jobs
    type_into(qtbot, duty.pressure, "7")
    wait_solved(qtbot, win, n)
    assert ed.model.get(GAUGE) == 700_000.0 and ABSENT_ABS(ed)
    assert ed.undo_stack.count() == 1
    ed.undo_stack.undo()
    assert ed.model.get(ABSOLUTE) == 900_000.0 and GAUGE not in ed.model.doc
    ed.undo_stack.redo()
    win.action_map["view.gauge"].trigger()  # absolute display: a gauge statement shown as absolute
    assert duty.pressure.text() == "8" and duty.pressure.unit_label.text() == "bar(a)"
    type_into(qtbot, duty.pressure, "10")
    assert ed.model.get(ABSOLUTE) == 1_000_000.0 and GAUGE not in ed.model.doc
    win.close()


def test_a_new_project_states_its_delivery_pressure_gauge():
    from stagewright.gui.document.model import new_document
    from stagewright.core.project.validation import problems
    doc = new_document()
    assert doc[GAUGE] == 700_000.0 and ABSOLUTE not in doc and problems(doc) == []


def test_the_flow_row_is_named_for_what_it_holds_and_normal_volume_names_its_state(qtbot, tmp_path):
    """Issue 14, item 10: a shaft power is labelled Shaft power (not Flow); normal volume reads
    Nm³/min or scfm with the reference state it refers to (stagewright.core.flow: DIN 1343, 0 °C, 101 325 Pa)."""
    doc = simple_real_gas_doc()
    doc["flow"] = {"kind": "shaft_power", "value": 200_000.0}
    win = make_window(qtbot, tmp_path, doc)
    duty, ed = win.panels["duty"], win.editor
    assert duty.flow_label.text() == "Shaft power" and duty.flow.unit_label.text() == "kW"
    ed.set_value("flow", {"kind": "normal_volume", "value": 1.0})
    assert duty.flow_label.text() == "Normal volume flow" and duty.flow.unit_label.text() == "Nm³/min"
    assert duty.flow.text() == "60"  # 1 m³/s
    tip = duty.flow.unit_label.toolTip()
    assert "DIN 1343" in tip and "0 °C" in tip and "1.01325 bar(a)" in tip and "14.696 psia" in tip
    win.action_map["view.us_units"].trigger()
    assert duty.flow.unit_label.text() == "scfm"
    assert duty.flow.text() == "2119"  # shown to four significant digits; the tooltip has them all
    assert float(duty.flow.edit.toolTip().split()[0]) == pytest.approx(60.0 / 0.3048 ** 3, rel=1e-6)  # 1 ft = 0.3048 m (exact)
    bal = win.panels["balance"]
    from stagewright.gui.panels.balance_panel import TOTALS
    row = [f.key for f in TOTALS].index("normal_volume_flow_m3_s")
    wait_solved(qtbot, win, 0)
    assert bal.totals.item(row, 1).text().endswith("scfm") and "DIN 1343" in bal.totals.item(row, 0).toolTip()
    win.close()
