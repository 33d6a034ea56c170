"""The field-check panel evaluates the project's measurement uncertainty off the GUI thread,
shows each result with U and the verdict on each guarantee, and can be cancelled."""
import json

import pytest

pytest.importorskip("PySide6")

from gui_support import ROOT, make_window  # noqa: E402

FIELD_SAMPLE = ROOT / "sample_projects" / "field_check_two_stage.json"
pytestmark = pytest.mark.gui
RUN_MS = 120_000


def test_evaluation_fills_results_guarantees_and_inputs(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, json.loads(FIELD_SAMPLE.read_text(encoding="utf-8")))
    win.docks["field_check"].raise_()
    panel = win.panels["field_check"]
    assert panel.run_button.isEnabled()
    with qtbot.waitSignal(panel.runner.finished, timeout=RUN_MS):
        panel.run(200)
    d = panel.result
    assert panel.figures_table.rowCount() == len(d["figures"]) == 7
    assert panel.inputs_table.rowCount() == 11
    assert panel.verdicts_table.rowCount() == 3
    assert panel.figures_table.item(4, 0).text() == "Stage 2 isentropic efficiency"
    assert panel.figures_table.item(4, 2).text().startswith("± ")
    assert "outside" in panel.verdict_line.text()
    assert "of the variance of" in panel.notes.toPlainText()
    # an edit makes the evaluation stale
    win.editor.set_value("site.ambient_temperature_K", 301.15)
    assert "changed" in panel.status.text()
    win.close()


def test_cancel_keeps_the_first_order_result(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, json.loads(FIELD_SAMPLE.read_text(encoding="utf-8")))
    panel = win.panels["field_check"]
    panel.runner.progress.connect(lambda _job, fraction, _m: fraction > 0 and panel.runner.cancel())
    with qtbot.waitSignal(panel.runner.finished, timeout=RUN_MS):
        panel.run(100_000)
    assert panel.result["monte_carlo"] is None
    assert "cancelled" in panel.status.text()
    assert panel.figures_table.rowCount() == 7 and panel.run_button.isEnabled()
    win.close()


def test_a_project_without_field_check_says_how_to_add_one(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    panel = win.panels["field_check"]
    assert not panel.run_button.isEnabled()
    assert "field_check" in panel.status.text()
    win.close()
