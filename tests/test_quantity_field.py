"""Entry fields show figures rounded for their unit (a defect: 10.015251 bar(g), 123.2833 psig
were shown as stored); full precision on focus and in the tooltip; the document keeps it."""
import pytest
from PySide6.QtCore import Qt

from tests.gui_support import make_window, simple_real_gas_doc, type_into, wait_solved

pytestmark = pytest.mark.gui


def _doc():
    doc = simple_real_gas_doc()
    doc["discharge_pressure_Pa"] = 1_101_525.1  # 10.015251 bar(g) over the 1 bar(a) site
    return doc


def test_a_field_not_being_edited_shows_four_significant_digits(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc())
    field = win.panels["duty"].pressure
    assert field.text() == "10.02" and field.unit_label.text() == "bar(g)"
    assert field.edit.toolTip() == "10.015251 bar(g)"
    win.action_map["view.us_units"].trigger()
    assert field.text() == "145.3" and field.unit_label.text() == "psig"  # 10.015251 bar = 145.26… psi
    win.close()


def test_focus_shows_full_precision_and_leaving_unedited_changes_nothing(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc())
    ed, field = win.editor, win.panels["duty"].pressure
    win.activateWindow()
    field.edit.setFocus()
    qtbot.waitUntil(field.edit.hasFocus, timeout=2000)
    assert field.text() == "10.015251"
    win.panels["site"].setFocus()
    win.panels["train"].stage_form.value.edit.setFocus()
    qtbot.waitUntil(lambda: not field.edit.hasFocus(), timeout=2000)
    assert field.text() == "10.02"
    assert ed.model.get("discharge_pressure_Pa") == 1_101_525.1 and ed.undo_stack.count() == 0
    win.close()


def test_typing_a_rounded_value_stores_what_was_typed(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc())
    ed, field = win.editor, win.panels["duty"].pressure
    n = ed.solved_jobs
    type_into(qtbot, field, "10.02")
    wait_solved(qtbot, win, n)
    # typed in gauge: stored as the gauge statement, as typed (issue 14 item 3)
    assert ed.model.get("discharge_gauge_pressure_Pa") == pytest.approx(1_002_000.0, rel=1e-12)
    qtbot.keyClick(field.edit, Qt.Key_Tab)
    win.close()


def test_a_decimal_comma_is_read_where_the_locale_uses_one(qtbot, tmp_path):
    from PySide6.QtCore import QLocale
    old = QLocale()
    QLocale.setDefault(QLocale(QLocale.Language.German, QLocale.Country.Germany))
    try:
        win = make_window(qtbot, tmp_path, _doc())
        ed, field = win.editor, win.panels["site"].fields[1]
        n = ed.solved_jobs
        type_into(qtbot, field, "19,5")
        wait_solved(qtbot, win, n)
        assert ed.model.get("site.ambient_temperature_K") == pytest.approx(292.65, abs=1e-9)
        win.close()
    finally:
        QLocale.setDefault(old)
