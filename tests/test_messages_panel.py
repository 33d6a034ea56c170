"""The Messages panel, status line and study table speak display units and field names.

Issue 14, items 7 and 8, in the window: a hot single stage (the demo with one stage removed)
is solved and reported with its limit and value; a discharge beyond the humid-air range
(ASHRAE RP-1485: 623.15 K) fails with the model, its range and the remedy, in US units when
US units are shown. Conversions: NIST SP 811 (2008), Appendix B (t/°F = 1.8·T/K − 459.67).
"""
from __future__ import annotations

import json

import pytest

pytest.importorskip("pytestqt")

from conftest import SAMPLES  # noqa: E402
from gui_support import make_window  # noqa: E402

pytestmark = pytest.mark.gui


def _demo_one_stage(**stage) -> dict:
    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    del doc["stages"][1]
    doc["stages"][0].update(stage)
    return doc


def _plain(text: str) -> None:
    assert "stages[" not in text and "_K" not in text and " K " not in text and " Pa" not in text
    assert "kg/h" not in text and "real_gas" not in text


def test_a_hot_single_stage_is_solved_and_warned_about_in_us_units(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _demo_one_stage())
    ed, msgs = win.editor, win.panels["messages"]
    assert ed.failure is None and ed.result is not None  # used to be "could not be solved"
    n = ed.solved_jobs
    ed.prefs.system = "US"
    qtbot.waitUntil(lambda: any("°F" in t for t in msgs.texts("warning")), timeout=5000)
    t_out = ed.result["stages"][0]["outlet"]["temperature_K"]
    warnings = msgs.texts("warning")
    assert warnings[0] == f"Stage 1 discharge temperature {1.8 * t_out - 459.67:.4g} °F is above its 392 °F limit."
    assert any(t.startswith("Aftercooler drains ") and "lb/h of condensate" in t for t in warnings)
    for i, m in enumerate(msgs.messages):
        _plain(m.text)
        _plain(msgs.list.item(i).toolTip())
    assert ed.solved_jobs == n  # switching units re-words, never re-solves
    win.close()


def test_a_discharge_beyond_the_humid_air_range_fails_in_plain_words(qtbot, tmp_path):
    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow
    settings = QSettings(str(tmp_path / "settings.ini"), QSettings.IniFormat)
    win = MainWindow(_demo_one_stage(heat_loss_W=0.0), settings=settings, debounce_ms=10, restore_layout=False)
    win.ask_save_changes = lambda: "discard"
    qtbot.addWidget(win)
    win.show()
    ed, msgs = win.editor, win.panels["messages"]
    qtbot.waitUntil(lambda: ed.failure is not None, timeout=60_000)
    ed.prefs.system = "US"
    qtbot.waitUntil(lambda: any("°F" in t for t in msgs.texts("problem")), timeout=5000)
    text = msgs.texts("problem")[0]
    assert text.startswith("The train could not be solved: Stage 1 discharge temperature 662.")
    assert "real-gas humid-air property model" in text and "up to 662 °F" in text
    assert "add a stage" in text and "ideal-gas property model" in text
    _plain(text)
    failed = next(m for m in msgs.messages if m.severity == "problem")
    assert failed.field == "stages[0].pressure_ratio"  # the input to change first, for jumping to it
    win.close()


def test_the_study_table_names_the_limit_and_the_value():
    from stagewright.gui.study.display import limit_summary
    b = {"field": "stages[0].max_discharge_temperature_K", "limit": 473.15, "value": 619.1859900091036,
         "closest_feasible": 619.1859900091036, "status": "violated", "message": "…"}
    row = {"binding_limits": [b]}
    assert limit_summary(row, "SI") == "Stage 1 discharge 346 °C > 200 °C limit"  # was "… not met"
    assert limit_summary(row, "US") == "Stage 1 discharge 654.9 °F > 392 °F limit"
