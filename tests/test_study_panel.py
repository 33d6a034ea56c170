"""The staging-study panel driven in the real window, offscreen: a study fills the table, cancel
stops it and leaves the window usable, Apply is one undo step, units follow the SI/US switch,
limits reach the messages area.

Expected numbers: the classical optimum of staged compression with perfect intercooling and
no pressure drops — N equal stages of ratio (p2/p1)^(1/N) (Çengel & Boles, *Thermodynamics*,
8th ed., 2015, §7-11) — with the per-stage work of a perfect gas from ``fluids.compressible.
isentropic_work_compression`` (C. Bell, fluids / ChEDL, PyPI), and unit factors exact by
definition (NIST SP 811, 2008, App. B). The projects are constant-cp, so a study takes
milliseconds and the tests are about the window.
"""
from __future__ import annotations

import re
import threading

import pytest

pytest.importorskip("pytestqt")

from fluids.compressible import isentropic_work_compression  # noqa: E402

from conftest import make_doc  # noqa: E402
from gui_support import make_window, wait_solved  # noqa: E402
from stagewright.core.project import dumps  # noqa: E402

pytestmark = pytest.mark.gui

R_MOLAR = 8.314462618  # J/(mol K), CODATA 2018
M_AIR = 0.02896546  # kg/mol (CoolProp's air)
HP_W = 745.69987158  # 1 hp (mechanical) in W — NIST SP 811 (2008), App. B
STUDY_MS = 30_000


def perfect_gas_doc(limit_K=None) -> dict:
    """Invented train: perfect-gas air (cp = 3.5 R/M, k = 1.4), 1 kg/s from 1 bar(a) and 20 °C
    to 9 bar(a), η_s = 0.8, every cooler back to 20 °C, no pressure drops."""
    doc = make_doc(model="constant_cp", stages=2, p_out=9e5, eta=0.8)
    doc["fluid"].update({"cp_J_kgK": R_MOLAR / M_AIR * 3.5, "k": 1.4})
    if limit_K is not None:
        for st in doc["stages"]:
            st["max_discharge_temperature_K"] = limit_K
    return doc


def optimum_kW(n: int) -> float:
    """Driver power of n equal stages of ratio 9^(1/n) (fluids closed form, J/mol → kW at 1 kg/s)."""
    w = isentropic_work_compression(T1=293.15, k=1.4, Z=1.0, P1=1e5, P2=1e5 * 9 ** (1 / n), eta=0.8)
    return n * w / M_AIR / 1000.0


def number(text: str) -> float:
    """A shown number ("1 234.56 kW": spaces group thousands)."""
    return float(re.match(r"^[-+\d .]+", text).group().replace(" ", ""))


def run(qtbot, win, n: int):
    panel = win.panels["study"]
    panel.controls.max_stages.setValue(n)
    with qtbot.waitSignal(panel.controller.finished, timeout=STUDY_MS):
        win.action_map["train.study"].trigger()
    return panel


def test_a_study_fills_the_table_with_the_classical_optimum(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = run(qtbot, win, 4)
    assert win.docks["study"].isVisible()
    assert [panel.table.cell_text(r, "stages") for r in range(panel.table.rowCount())] == ["1", "2", "3", "4"]
    for r, n in enumerate((1, 2, 3, 4)):
        ratios = [float(x) for x in panel.table.cell_text(r, "ratios").split(" × ")]
        assert ratios == pytest.approx([9 ** (1 / n)] * n, abs=6e-4)  # (p2/p1)^(1/N), 3 decimals shown
        assert number(panel.table.cell_text(r, "power")) == pytest.approx(optimum_kW(n), abs=0.006)
        assert panel.table.cell_text(r, "feasible") == "yes"
    assert panel.table.header_text("power") == "Driver power\n[kW]"
    assert "repeats the project's first stage" in panel.note.text() and "aftercooler" in panel.note.text()
    assert panel.controls.progress.value() == 1000 and not panel.busy
    assert win.action_map["train.study"].isEnabled() and not win.action_map["train.study_cancel"].isEnabled()
    # the chart shows the same numbers: power against stage count, in kW
    from matplotlib.lines import Line2D
    (power,) = [ln for ln in panel.chart.figure.findobj(Line2D) if ln.get_gid() == "staging-power"]
    assert list(power.get_xdata()) == [1, 2, 3, 4]
    assert power.get_ydata()[2] == pytest.approx(optimum_kW(3), rel=1e-6)
    assert panel.chart.toolbar is not None  # matplotlib's navigation toolbar
    win.close()


def test_cancel_stops_the_study_and_the_window_stays_usable(qtbot, tmp_path, monkeypatch):
    import stagewright.core.study
    real = stagewright.core.study.compare_stagings
    held = threading.Event()
    first_call = [True]

    def held_after_first_option(doc, max_stages=4, *, progress=None, cancel=None, **kw):
        gate = first_call[0]
        first_call[0] = False

        def report(fraction, message):
            progress(fraction, message)
            if gate and fraction > 0.0 and not held.is_set():
                held.set()
                cancel.wait(20)  # the study waits here until the user presses Cancel
        return real(doc, max_stages, progress=report, cancel=cancel, **kw)
    monkeypatch.setattr(stagewright.core.study, "compare_stagings", held_after_first_option)

    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = win.panels["study"]
    panel.controls.max_stages.setValue(6)
    win.action_map["train.study"].trigger()
    qtbot.waitUntil(lambda: held.is_set() and panel.controls.progress.value() > 0, timeout=STUDY_MS)
    assert panel.busy and win.action_map["train.study_cancel"].isEnabled()
    assert not win.action_map["train.study"].isEnabled() and not panel.controls.max_stages.isEnabled()
    with qtbot.waitSignal(panel.controller.cancelled, timeout=STUDY_MS):
        win.action_map["train.study_cancel"].trigger()
    assert not panel.busy
    assert [r["stages"] for r in panel.rows] == [1]  # what was finished is kept
    assert panel.controls.status.text().startswith("Cancelled")
    assert win.action_map["train.study"].isEnabled() and not win.action_map["train.study_cancel"].isEnabled()

    # the window still edits, solves and studies
    n = win.editor.solved_jobs
    win.editor.set_value("stages[0].efficiency.value", 0.75)
    wait_solved(qtbot, win, n)
    win.editor.undo_stack.undo()
    panel = run(qtbot, win, 3)
    assert [r["stages"] for r in panel.rows] == [1, 2, 3]
    win.close()


def _held_study(monkeypatch, before: threading.Event, after: threading.Event):
    """compare_stagings held until ``before`` is set, and again after it optimised every option
    (its last report, 1.0) until ``after`` is set; returns the events it sets when it gets there."""
    import stagewright.core.study
    real = stagewright.core.study.compare_stagings
    started, optimised = threading.Event(), threading.Event()

    def held(doc, max_stages=4, *, progress=None, cancel=None, **kw):
        started.set()
        before.wait(20)
        comparison = real(doc, max_stages, progress=progress, cancel=cancel, **kw)
        optimised.set()
        after.wait(20)  # the answer is not in yet
        return comparison
    monkeypatch.setattr(stagewright.core.study, "compare_stagings", held)
    return started, optimised


def test_the_bar_reaches_100_percent_only_when_the_answer_is_in(qtbot, tmp_path, monkeypatch):
    go, answer = threading.Event(), threading.Event()
    go.set()
    _, optimised = _held_study(monkeypatch, go, answer)
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = win.panels["study"]
    bar = panel.controls.progress
    panel.controls.max_stages.setValue(3)
    win.action_map["train.study"].trigger()
    qtbot.waitUntil(optimised.is_set, timeout=STUDY_MS)  # every option optimised, the answer held back
    qtbot.wait(200)  # the last report reaches the panel
    assert panel.busy and 0 < bar.value() < bar.maximum() == 1000
    assert bar.text() == "99%" and "putting the table together" in panel.controls.status.text()
    with qtbot.waitSignal(panel.controller.finished, timeout=STUDY_MS):
        answer.set()
    assert not panel.busy and bar.value() == bar.maximum() == 1000 and bar.text() == "100%"
    win.close()


def test_the_bar_claims_no_share_before_the_study_reports(qtbot, tmp_path, monkeypatch):
    # before its first report the study has measured nothing: a busy bar, not "0 %" (nor the last
    # study's "100 %")
    go, answer = threading.Event(), threading.Event()
    answer.set()
    started, _ = _held_study(monkeypatch, go, answer)
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = win.panels["study"]
    bar = panel.controls.progress
    panel.controls.max_stages.setValue(2)
    win.action_map["train.study"].trigger()
    qtbot.waitUntil(started.is_set, timeout=STUDY_MS)
    qtbot.wait(50)
    assert panel.busy and bar.minimum() == bar.maximum() == 0  # Qt's busy indicator
    with qtbot.waitSignal(panel.controller.finished, timeout=STUDY_MS):
        go.set()
    assert bar.value() == bar.maximum() == 1000
    win.close()


def test_apply_is_one_undo_step_and_undo_restores_the_document_exactly(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    ed, bal = win.editor, win.panels["balance"]
    before, count = dumps(ed.model.doc), ed.undo_stack.count()
    panel = run(qtbot, win, 3)
    panel.table.select_option(3)
    act = win.action_map["train.study_apply"]
    assert act.isEnabled() and act.text() == "Apply 3-stage option"
    n = ed.solved_jobs
    act.trigger()
    wait_solved(qtbot, win, n)
    assert ed.model.stage_count == 3
    assert ed.undo_stack.count() == count + 1 and ed.undo_stack.undoText() == "Apply 3-stage option"
    assert [s["name"] for s in ed.model.doc["stages"]] == ["Stage 1", "Stage 2", "Stage 3"]
    assert [s["pressure_ratio"] for s in ed.model.doc["stages"]] == panel.rows[2]["pressure_ratios"]
    # the project now solves to the option's numbers: 3 × the closed-form stage work
    assert number(bal.value_text("totals", "driver_power_W", "")) == pytest.approx(optimum_kW(3), abs=0.006)
    assert not panel.is_stale  # same first stage and aftercooler: the study still describes the project

    n = ed.solved_jobs
    ed.undo_stack.undo()
    wait_solved(qtbot, win, n)
    assert dumps(ed.model.doc) == before
    assert ed.model.stage_count == 2 and not win.isWindowModified()
    win.close()


def test_unit_switch_changes_the_table_units(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    ed = win.editor
    panel = run(qtbot, win, 2)
    kw = number(panel.table.cell_text(1, "power"))
    temps_c = [float(x) for x in panel.table.cell_text(0, "temperatures").split(" · ")]
    before = dumps(ed.model.doc)
    win.action_map["view.us_units"].trigger()
    assert panel.table.header_text("power") == "Driver power\n[hp]"
    assert panel.table.header_text("temperatures") == "Discharge temperatures\n[°F]"
    assert number(panel.table.cell_text(1, "power")) == pytest.approx(kw * 1000.0 / HP_W, abs=0.01)
    temps_f = [float(x) for x in panel.table.cell_text(0, "temperatures").split(" · ")]
    assert temps_f == pytest.approx([c * 9 / 5 + 32 for c in temps_c], abs=0.2)  # 1 decimal each
    assert "hp" in panel.chart.figure.axes[0].get_ylabel()
    win.action_map["view.us_units"].trigger()
    assert panel.table.header_text("power") == "Driver power\n[kW]"
    assert dumps(ed.model.doc) == before and ed.undo_stack.count() == 0
    win.close()


def test_limits_go_to_messages_and_select_their_field(qtbot, tmp_path):
    # one stage of ratio 9 discharges T1·(1 + (9^(2/7) − 1)/0.8), far above 450 K; two stages
    # of ratio 3 stay below it (perfect-gas isentropic relation, Çengel & Boles §7-12)
    win = make_window(qtbot, tmp_path, perfect_gas_doc(limit_K=450.0))
    panel = run(qtbot, win, 3)
    msgs, train = win.panels["messages"], win.panels["train"]
    assert [r["feasible"] for r in panel.rows] == [False, True, True]
    assert panel.table.cell_text(0, "feasible") == "no"
    warnings = [m for m in msgs.messages if m.severity == "warning" and "1-stage option" in m.text]
    assert len(warnings) == 1 and warnings[0].field == "stages[0].max_discharge_temperature_K"
    t2 = 293.15 * (1 + (9 ** (0.4 / 1.4) - 1) / 0.8) - 273.15
    shown = float(re.search(r"discharges ([\d.]+) °C", warnings[0].text).group(1))
    assert shown == pytest.approx(t2, abs=0.006)
    assert "176.85 °C" in warnings[0].text  # the 450 K limit in display units
    assert any(m.severity == "caution" and "discharge temperature" in m.text for m in msgs.messages)
    panel.table.select_option(1)
    assert not win.action_map["train.study_apply"].isEnabled()  # an option that misses its limits is no design

    train.select("cooler", 1)
    msgs._clicked(msgs.list.item(msgs.messages.index(warnings[0])))
    assert (train.selected_kind(), train.selected_stage()) == ("stage", 0)
    field = train.stage_form.field_for("stages[0].max_discharge_temperature_K")
    qtbot.waitUntil(lambda: field.edit.hasFocus(), timeout=2000)

    # a change the study depends on makes it stale: its messages leave, Apply is off
    n = win.editor.solved_jobs
    win.editor.set_value("stages[0].efficiency.value", 0.85)
    wait_solved(qtbot, win, n)
    assert panel.is_stale and panel.banner.isVisibleTo(panel)
    assert not any("stage option" in m.text for m in msgs.messages)
    panel.table.select_option(2)
    assert not win.action_map["train.study_apply"].isEnabled()
    win.close()


def test_a_site_variable_gives_one_case_per_value(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = win.panels["study"]
    panel.controls.variable.setCurrentIndex(panel.controls.variable.findData("ambient_temperature_K"))
    assert panel.controls.values.isVisibleTo(panel) and panel.controls.values_unit.text() == "°C"
    panel.controls.values.setText("5, 15")  # below the coolers' 20 °C outlet: a cooler cannot heat the air
    run(qtbot, win, 2)
    assert [panel.case.itemText(i) for i in range(panel.case.count())] == \
        ["Ambient temperature 5.00 °C", "Ambient temperature 15.00 °C"]
    for i, t_amb in enumerate((278.15, 288.15)):
        panel.case.setCurrentIndex(i)
        assert [r["stages"] for r in panel.rows] == [1, 2]
        # one stage has no split to choose: ratio 9 from the ambient intake (fluids closed form)
        w = isentropic_work_compression(T1=t_amb, k=1.4, Z=1.0, P1=1e5, P2=9e5, eta=0.8) / M_AIR / 1000.0
        assert number(panel.table.cell_text(0, "power")) == pytest.approx(w, abs=0.006)
    panel.table.select_option(2)
    assert not win.action_map["train.study_apply"].isEnabled()  # other site conditions than the project's
    win.action_map["view.us_units"].trigger()
    assert panel.controls.values.text() == "41, 59" and panel.controls.values_unit.text() == "°F"  # exact (NIST SP 811)
    win.close()


def test_closing_the_window_stops_the_study_thread(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = run(qtbot, win, 2)
    assert panel.controller._thread.isRunning()
    assert win.close()
    assert not panel.controller._thread.isRunning()


def test_the_panel_has_a_view_toggle_and_its_layout_is_remembered(qtbot, tmp_path):
    from PySide6.QtCore import QSettings
    from PySide6.QtWidgets import QToolBar

    from stagewright.gui.window.main_window import MainWindow
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    view = next(a.menu() for a in win.menuBar().actions() if a.text() == "&View")
    toggle = next(a for a in view.actions() if a.text() == "Staging study")
    study = next(a.menu() for a in win.menuBar().actions() if a.text() == "&Train")
    assert win.action_map["train.study"] in study.actions()
    assert not win.action_map["train.study"].icon().isNull()  # icons/run_study.svg
    assert win.action_map["train.study"] in win.findChild(QToolBar, "toolbar-main").actions()
    win.docks["study"].setFloating(True)
    toggle.trigger()
    assert not win.docks["study"].isVisible()
    assert win.close()

    settings = QSettings(str(tmp_path / "settings.ini"), QSettings.IniFormat)
    again = MainWindow(perfect_gas_doc(), settings=settings, debounce_ms=10, restore_layout=True)
    again.prompts.ask_save_changes = lambda _name: "discard"
    qtbot.addWidget(again)
    again.show()
    qtbot.waitUntil(lambda: again.docks["study"].isFloating() and not again.docks["study"].isVisible(),
                    timeout=5000)
    again.close()


def test_bad_study_input_is_reported_with_its_field(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel, msgs = win.panels["study"], win.panels["messages"]
    panel.controls.variable.setCurrentIndex(panel.controls.variable.findData("ambient_temperature_K"))
    panel.controls.values.setText("5, warm")
    win.action_map["train.study"].trigger()
    assert not panel.busy and panel.controls.values.property("invalid") is True
    assert panel.controls.status.text() == "Values: 'warm' is not a number."
    panel.controls.values.setText("5, 80")  # above the project format's 60 °C (333.15 K) ambient
    with qtbot.waitSignal(panel.controller.failed, timeout=STUDY_MS):
        win.action_map["train.study"].trigger()
    problems = [m for m in msgs.messages if m.severity == "problem"]
    assert len(problems) == 1 and problems[0].field == "site.ambient_temperature_K"
    assert problems[0].text.startswith("The staging study could not run:")
    panel.table.selectRow(0)  # unrelated state changes keep the message
    assert [m.field for m in msgs.messages if m.severity == "problem"] == ["site.ambient_temperature_K"]
    msgs._clicked(msgs.list.item(msgs.messages.index(problems[0])))
    field = win.panels["site"].field_for("site.ambient_temperature_K")
    qtbot.waitUntil(lambda: field.edit.hasFocus(), timeout=2000)
    win.close()


def test_an_option_kept_as_a_case_solves_to_the_study_numbers(qtbot, tmp_path):
    # issue 20: the options of a staging study can be kept as cases of the project
    import stagewright.core
    from stagewright.core.project.cases import case_document, case_names

    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    ed = win.editor
    panel = run(qtbot, win, 3)
    panel.table.select_option(3)
    act = win.action_map["train.study_keep_case"]
    assert act.isEnabled()
    count = ed.undo_stack.count()
    act.trigger()
    project = ed.model.project_snapshot()
    assert case_names(project) == ["Base", "3 stages (study)"] and ed.undo_stack.count() == count + 1
    assert ed.model.active_case == "Base" and ed.model.stage_count == 2  # the case shown is unchanged
    kept = stagewright.core.solve(case_document(project, "3 stages (study)"))
    assert kept.driver_power_W / 1e3 == pytest.approx(optimum_kW(3), abs=0.006)
    ed.undo_stack.undo()
    assert case_names(ed.model.project_snapshot()) == ["Base"]
    win.close()


def test_after_the_first_study_the_next_runs_side_by_side_with_the_same_rows(qtbot, tmp_path, monkeypatch):
    import stagewright.core.study
    from stagewright.core.warm_pool import is_warm
    real = stagewright.core.study.compare_stagings
    asked = []

    def recorded(*args, **kw):
        asked.append(kw.get("processes"))
        return real(*args, **kw)
    monkeypatch.setattr(stagewright.core.study, "compare_stagings", recorded)
    win = make_window(qtbot, tmp_path, perfect_gas_doc())
    panel = win.panels["study"]
    first = [dict(r) for r in run(qtbot, win, 4).rows]
    qtbot.waitUntil(lambda: panel._pool_ready, timeout=120_000)  # warmed in the background after the first study
    assert is_warm()
    second = [dict(r) for r in run(qtbot, win, 4).rows]
    assert asked == [1, 2]
    assert second == first
    win.close()
