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


def test_stating_an_uncertainty_in_the_window_is_one_undo_step(qtbot, tmp_path):
    from gui_support import simple_real_gas_doc
    doc = simple_real_gas_doc()
    doc["stages"][0]["efficiency"] = {"kind": "discharge_temperature", "value_K": 420.0}
    win = make_window(qtbot, tmp_path, doc)
    panel = win.panels["field_check"]
    ed = panel.inputs_editor
    assert "stages[0].efficiency.value_K" in ed.paths and not panel.run_button.isEnabled()
    ed.input_box.setCurrentIndex(ed.paths.index("stages[0].efficiency.value_K"))
    ed.kind_box.setCurrentText("limits ± a (rectangular)")
    assert ed.unit_label.text() == "K"
    ed.amount.setText("1.5")
    assert ed.apply()
    assert win.model.get("field_check") == {"uncertainties": [
        {"input": "stages[0].efficiency.value_K", "kind": "limits", "half_width": 1.5}]}
    assert panel.run_button.isEnabled()
    ed.kind_box.setCurrentText("accuracy class, % of full scale")
    ed.amount.setText("0.5")
    ed.scale.setText("600")
    assert ed.apply()  # replaces the input's entry
    assert win.model.get("field_check")["uncertainties"] == [
        {"input": "stages[0].efficiency.value_K", "kind": "accuracy_class", "class_percent": 0.5, "full_scale": 600.0}]
    ed.amount.setText("a lot")
    assert not ed.apply() and "numbers" in ed.message.text()
    assert ed.remove()
    assert win.model.get("field_check", None) is None
    win.editor.undo_stack.undo()
    assert win.model.get("field_check")["uncertainties"][0]["class_percent"] == 0.5
    win.close()
