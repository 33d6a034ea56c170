"""The study's options table on its own (no window, no study run): which option is bold and
picked, what stays picked when the units change, and when Apply
is allowed. Rows are written out here (invented figures); unit factors are exact by definition
(NIST SP 811, 2008, App. B: 1 hp = 745.69987158 W)."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")

from stagewright.gui.study.options_table import OptionsTable, apply_state, best_row, comparison_note  # noqa: E402

pytestmark = pytest.mark.gui
HP_W = 745.69987158


def row(stages: int, power_W: float | None, feasible: bool = True, **kw) -> dict:
    base = {"stages": stages, "pressure_ratios": [9 ** (1 / stages)] * stages, "driver_power_W": power_W,
            "feasible": feasible, "binding_limits": [], "note": "Each option repeats the first stage."}
    base.update(kw)
    return base


ROWS = [row(1, 300_000.0, feasible=False), row(2, 260_000.0), row(3, 250_000.0), row(4, 252_000.0)]


def test_best_row_is_the_least_power_option_within_the_limits():
    assert best_row(ROWS) == 2
    assert best_row([row(1, 100.0, feasible=False), row(2, None)]) is None


def test_the_note_says_what_savings_are_against():
    assert comparison_note(ROWS) == ("Each option repeats the first stage. Savings are against the 2-stage "
                                     "option, the fewest stages that meet every limit.")
    assert comparison_note([], "before any study") == "before any study"


def test_apply_needs_a_current_study_at_the_project_site_and_an_option_within_limits():
    answer = {"variable": None}
    assert apply_state(ROWS[2], answer, busy=False, stale=False)[:2] == (True, "Apply 3-stage option")
    assert apply_state(ROWS[2], answer, busy=True, stale=False)[0] is False
    assert apply_state(None, answer, busy=False, stale=False)[:2] == (False, "Apply selected option")
    ok, _, why = apply_state(ROWS[2], answer, busy=False, stale=True)
    assert not ok and why.startswith("The project changed")
    ok, _, why = apply_state(ROWS[0], answer, busy=False, stale=False)
    assert not ok and why == "This option does not meet its limits, so it is not a design."
    ok, _, why = apply_state(ROWS[2], {"variable": "ambient_temperature_K"}, busy=False, stale=False)
    assert not ok and "Vary site: nothing" in why


def test_the_best_option_is_bold_and_picked_and_stays_picked_in_other_units(qtbot):
    table = OptionsTable()
    qtbot.addWidget(table)
    table.show_rows(ROWS, "SI")
    assert table.selected_row()["stages"] == 3
    col = table.column("power")
    assert [table.item(r, col).font().bold() for r in range(4)] == [False, False, True, False]
    assert table.item(0, col).foreground().color().name() == "#8a96a3"  # misses its limits: greyed
    assert table.cell_text(2, "power") == "250.00" and table.header_text("power") == "Driver power\n[kW]"

    table.select_option(4)
    with qtbot.assertNotEmitted(table.itemSelectionChanged):
        table.show_rows(ROWS, "US")  # refilling announces no selection change of its own …
    assert table.selected_row()["stages"] == 4  # … and keeps the picked option
    assert float(table.cell_text(3, "power")) == pytest.approx(252_000.0 / HP_W, abs=0.01)
    assert table.header_text("power") == "Driver power\n[hp]"
    with pytest.raises(KeyError):
        table.select_option(7)
