"""Balance sheet: a negative exergy out with heat (heat rejected below ambient) is explained; spare
width goes to the shown columns."""
import json

import pytest

pytest.importorskip("PySide6")

from stagewright.gui.panels.balance_panel import NEGATIVE_TIPS, TOTAL_TIPS  # noqa: E402
from gui_support import SAMPLE, make_window, simple_real_gas_doc, wait_solved  # noqa: E402

pytestmark = pytest.mark.gui

AMBIENT_K = 303.15
KEY = "heat_exergy_W"


def _kw(text: str) -> float:
    number, unit = text.rsplit(" ", 1)
    assert unit == "kW"
    return float(number.replace(" ", ""))


def _doc(coolant_inlet_K: float) -> dict:
    # invented one-stage train: 30 °C site, an aftercooler bringing the air to 10 K above its coolant
    doc = simple_real_gas_doc(stages=1)
    doc["site"]["ambient_temperature_K"] = AMBIENT_K
    doc["stages"][0]["cooler"] = {"coolant_inlet_temperature_K": coolant_inlet_K, "approach_K": 10.0,
                                  "pressure_drop_Pa": 0.0}
    return doc


def test_heat_rejected_below_ambient_shows_negative_with_its_explanation(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc(283.15))  # coolant 20 K colder than the site
    bal, r = win.panels["balance"], win.editor.result
    cooler = r["stages"][0]["cooler"]
    assert cooler["boundary_temperature_K"] == pytest.approx(283.15)
    # exergy of heat Q leaving at Tb: Q (1 - T0/Tb) (A. Bejan, G. Tsatsaronis, M. Moran, Thermal
    # Design and Optimization, Wiley, 1996, §3.2); casing loss is zero here, so the cooler is all of it
    expected_W = cooler["duty_W"] * (1.0 - AMBIENT_K / 283.15)
    shown = bal.value_text("totals", KEY, "")
    assert _kw(shown) < 0.0
    assert _kw(shown) == pytest.approx(expected_W / 1e3, abs=0.006)
    tip = bal.tool_tip("totals", KEY, "")
    assert tip == NEGATIVE_TIPS[KEY] and "below the site ambient" in tip and "not an error" in tip
    assert bal.tool_tip("totals", KEY, "label") == TOTAL_TIPS[KEY] and "T0/Tb" in TOTAL_TIPS[KEY]
    assert bal.tool_tip("totals", "shaft_power_W", "") == ""  # other totals carry no such note

    # the same cooler with its coolant 10 K warmer than the site: positive, and no explanation left
    ed = win.editor
    after = ed.solved_jobs
    ed.set_value("stages[0].cooler.coolant_inlet_temperature_K", 313.15)
    wait_solved(qtbot, win, after)
    assert _kw(bal.value_text("totals", KEY, "")) > 0.0
    assert bal.tool_tip("totals", KEY, "") == ""
    assert bal.tool_tip("totals", KEY, "label") == TOTAL_TIPS[KEY]
    win.close()


def test_spare_width_goes_to_the_shown_columns(qtbot, tmp_path):
    # the demo's coolers have no exchanger sized: those component columns are hidden and must not
    # take a share of the spare width (the shown columns then stopped short of the table's edge)
    win = make_window(qtbot, tmp_path, json.loads(SAMPLE.read_text(encoding="utf-8")))
    win.resize(1920, 1080)
    table = win.panels["balance"].components
    qtbot.waitUntil(lambda: table.viewport().width() > 900)
    table.fit_columns()
    header = table.horizontalHeader()
    assert any(table.isColumnHidden(c) for c in range(table.columnCount()))
    shown = sum(header.sectionSize(c) for c in range(table.columnCount()) if not table.isColumnHidden(c))
    assert table.viewport().width() - table.columnCount() <= shown <= table.viewport().width()  # rounding only
    win.close()
