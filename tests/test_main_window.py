"""The workbench window driven offscreen: edits, the live balance, undo, bad entries, stages,
units, charts and closing. Expected numbers come from CoolProp's high-level PropsSI interface
(Lemmon et al. 2000 equation of state for air), a different path from the core's AbstractState
use, or from exact unit definitions (NIST SP 811)."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")

from CoolProp.CoolProp import PropsSI  # noqa: E402

from gui_support import make_window, simple_real_gas_doc, type_into, wait_solved, window  # noqa: E402,F401
from stagewright.core.project import dumps  # noqa: E402

pytestmark = pytest.mark.gui

HP_W = 745.69987158  # 1 hp (mechanical) in W, exact by definition — NIST SP 811 (2008), App. B


def stage_power_kW(T_in: float, p_in: float, p_out: float, eta_s: float, m: float = 1.0) -> float:
    """Adiabatic stage power from the isentropic-efficiency definition (Çengel & Boles,
    Thermodynamics, 8th ed., §7-12), with air properties from CoolProp PropsSI (Lemmon 2000)."""
    h1 = PropsSI("H", "T", T_in, "P", p_in, "Air")
    s1 = PropsSI("S", "T", T_in, "P", p_in, "Air")
    h2s = PropsSI("H", "P", p_out, "S", s1, "Air")
    return m * (h2s - h1) / eta_s / 1000.0


def shown_number(text: str) -> float:
    return float(text.replace(" ", "").split()[0])


def test_efficiency_edit_updates_balance_and_undo_restores(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    bal, ed = win.panels["balance"], win.editor
    # stage 2 inlet: 20 °C at 3 bar(a) (cooler back to ambient, equal split r = 3 exactly)
    expected_08 = stage_power_kW(293.15, 3e5, 9e5, 0.80)
    assert shown_number(bal.value_text("components", "stage-2", "power")) == pytest.approx(expected_08, abs=0.006)

    win.panels["train"].select("stage", 1)
    field = win.panels["train"].stage_form.value
    assert field.path == "stages[1].efficiency.value"
    n = ed.solved_jobs
    type_into(qtbot, field, "70")
    wait_solved(qtbot, win, n)
    assert ed.model.get("stages[1].efficiency.value") == 0.7
    expected_07 = stage_power_kW(293.15, 3e5, 9e5, 0.70)
    assert shown_number(bal.value_text("components", "stage-2", "power")) == pytest.approx(expected_07, abs=0.006)
    assert ed.undo_stack.undoText() == "Change stage 2 efficiency"
    assert win.isWindowModified()

    n = ed.solved_jobs
    ed.undo_stack.undo()
    wait_solved(qtbot, win, n)
    assert ed.model.get("stages[1].efficiency.value") == 0.8
    assert shown_number(bal.value_text("components", "stage-2", "power")) == pytest.approx(expected_08, abs=0.006)
    assert field.text() == "80"
    assert not win.isWindowModified()
    win.close()


def test_invalid_entry_is_explained_and_marks_results_stale(qtbot, window):
    ed, msgs, bal = window.editor, window.panels["messages"], window.panels["balance"]
    field = window.panels["train"].stage_form.value
    before = dumps(ed.model.doc)
    type_into(qtbot, field, "abc")
    assert ed.stale and bal.is_stale
    assert any("'abc' is not a number" in t for t in msgs.texts("problem"))
    assert field.edit.property("invalid") is True
    assert dumps(ed.model.doc) == before  # unreadable text never reaches the document

    type_into(qtbot, field, "150")  # out of range: kept as typed (no clamp), reported with the schema range
    assert ed.model.get("stages[0].efficiency.value") == 1.5
    assert ed.stale and bal.is_stale
    problems = msgs.texts("problem")
    assert problems == ["Stage 1 efficiency: 150.00 % is out of range (allowed: 0.1 to 100 %)."]
    assert field.edit.property("invalid") is True
    assert "Not solved" in window.status_solve.text()

    n = ed.solved_jobs
    type_into(qtbot, field, "81")
    wait_solved(qtbot, window, n)
    assert not bal.is_stale and field.edit.property("invalid") is False
    assert msgs.texts("problem") == []


def test_message_click_selects_the_offending_field(qtbot, window):
    ed, msgs, train = window.editor, window.panels["messages"], window.panels["train"]
    n = ed.solved_jobs
    ed.set_value("stages[1].max_discharge_temperature_K", 400.0)  # below the ~447 K discharge
    wait_solved(qtbot, window, n)
    warnings = [m for m in msgs.messages if m.severity == "warning"]
    # the humid demo also warns about each separator's condensate (a drain to manage)
    drains = [m.field for m in warnings if m.field.endswith("separator_efficiency")]
    assert drains == ["stages[0].cooler.separator_efficiency", "stages[1].cooler.separator_efficiency"]
    warnings = [m for m in warnings if not m.field.endswith("separator_efficiency")]
    assert [m.field for m in warnings] == ["stages[1].max_discharge_temperature_K"]
    assert "is above its 126.85 °C limit" in warnings[0].text and "K " not in warnings[0].text
    assert any(m.severity == "caution" for m in msgs.messages)  # the discharge-temperature caution
    train.select("cooler", 0)
    item = msgs.list.item(msgs.messages.index(warnings[0]))
    msgs._clicked(item)
    assert (train.selected_kind(), train.selected_stage()) == ("stage", 1)
    field = train.stage_form.field_for("stages[1].max_discharge_temperature_K")
    assert field is train.stage_form.limit
    qtbot.waitUntil(lambda: field.edit.hasFocus(), timeout=2000)


def test_add_insert_remove_and_reorder_stages_with_undo(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    ed, bal, train = win.editor, win.panels["balance"], win.panels["train"]
    n = ed.solved_jobs
    win.action_map["train.add_stage"].trigger()
    wait_solved(qtbot, win, n)
    assert ed.model.stage_count == 3
    assert ed.undo_stack.undoText() == "Add stage 3"
    # equal split of 9 over three stages with perfect intercooling and no drops: r = 9^(1/3)
    # (Çengel & Boles, 8th ed., §7-11, multistage compression with intercooling)
    for i in (1, 2, 3):
        assert shown_number(bal.value_text("components", f"stage-{i}", "ratio")) == pytest.approx(9 ** (1 / 3), abs=6e-5)
    assert "stage-3" in bal.row_keys("points") and "cooler-3" in bal.row_keys("points")

    train.select("stage", 0)
    n = ed.solved_jobs
    win.action_map["train.remove_stage"].trigger()
    wait_solved(qtbot, win, n)
    assert [s["name"] for s in ed.model.doc["stages"]] == ["S2", "Stage 3"]
    n = ed.solved_jobs
    win.action_map["train.move_down"].trigger()
    wait_solved(qtbot, win, n)
    assert [s["name"] for s in ed.model.doc["stages"]] == ["Stage 3", "S2"]
    assert train.selected_stage() == 1

    n = ed.solved_jobs
    ed.undo_stack.undo()  # move
    ed.undo_stack.undo()  # remove: stage S1 comes back at the front, same data
    ed.undo_stack.undo()  # add
    wait_solved(qtbot, win, n)
    assert ed.model.doc == simple_real_gas_doc()
    assert shown_number(bal.value_text("components", "stage-1", "ratio")) == pytest.approx(3.0, abs=6e-5)
    assert not win.isWindowModified()
    win.close()


def test_cooler_toggle_and_duplicate(qtbot, window):
    ed, train = window.editor, window.panels["train"]
    train.select("stage", 0)
    window.action_map["train.toggle_cooler"].trigger()
    assert ed.model.get("stages[0].cooler", None) is None
    assert ed.undo_stack.undoText() == "Remove intercooler 1"
    window.action_map["train.toggle_cooler"].trigger()
    assert ed.model.get("stages[0].cooler")["outlet_temperature_K"] == pytest.approx(308.15)
    assert train.selected_kind() == "cooler"
    window.action_map["train.duplicate_stage"].trigger()
    assert ed.model.stage_count == 3 and ed.model.get("stages[1].name") == "LP stage (copy)"
    n = ed.solved_jobs
    wait_solved(qtbot, window, n - 1)


def test_unit_switch_changes_every_view_but_not_the_model(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    ed, bal = win.editor, win.panels["balance"]
    before = dumps(ed.model.doc)
    kw = bal.value_text("components", "stage-1", "power")
    win.action_map["view.us_units"].trigger()
    assert ed.prefs.system == "US"
    site = win.panels["site"]
    ambient = site.fields[1]
    assert ambient.path == "site.ambient_temperature_K"
    assert ambient.text() == "68" and ambient.unit_label.text() == "°F"  # 293.15 K = 68 °F exactly
    hp = shown_number(bal.value_text("components", "stage-1", "power"))
    assert hp == pytest.approx(shown_number(kw) * 1000.0 / HP_W, abs=0.01)
    assert "[hp]" in bal.components.horizontalHeaderItem(2).text()
    # focus passing through every field must not write rounded values back
    for panel in (site, win.panels["duty"], win.panels["train"].stage_form):
        for f in panel.fields:
            if hasattr(f, "commit"):
                f.commit()
    win.action_map["view.us_units"].trigger()
    assert ed.prefs.system == "SI"
    assert dumps(ed.model.doc) == before
    assert ed.undo_stack.count() == 0
    win.close()


def test_gauge_entry_is_relative_to_site_pressure(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    ed = win.editor
    duty = win.panels["duty"]
    assert ed.prefs.gauge and duty.pressure.text() == "8" and duty.pressure.unit_label.text() == "bar(g)"
    n = ed.solved_jobs
    type_into(qtbot, duty.pressure, "7")
    wait_solved(qtbot, win, n)
    assert ed.model.get("discharge_gauge_pressure_Pa") == 700_000.0  # stated as typed: gauge
    assert ed.result["delivery"]["pressure_Pa"] == pytest.approx(800_000.0)  # 7 bar(g) + 1 bar(a) site
    win.action_map["view.gauge"].trigger()
    assert duty.pressure.text() == "8" and duty.pressure.unit_label.text() == "bar(a)"
    win.close()


def test_charts_have_one_path_segment_per_stage_and_cooler(qtbot, window):
    from matplotlib.lines import Line2D
    charts = window.panels["charts"]
    qtbot.waitUntil(lambda: charts.ts is not None and charts.ts.pending is None, timeout=20_000)

    def gids():
        return sorted(a.get_gid() for a in charts.ts.figure.findobj(Line2D)
                      if (a.get_gid() or "").startswith(("stage-", "cooler-")) and a.get_gid().count("-") == 1)
    assert gids() == ["cooler-1", "cooler-2", "stage-1", "stage-2"]
    window.panels["train"].select("stage", 1)
    n = window.editor.solved_jobs
    window.action_map["train.toggle_cooler"].trigger()  # no aftercooler
    wait_solved(qtbot, window, n)
    qtbot.waitUntil(lambda: charts.ts.pending is None, timeout=5000)
    assert gids() == ["cooler-1", "stage-1", "stage-2"]
    charts.tabs.setCurrentWidget(charts.power)
    assert charts.power.pending is None and charts.power.figure.axes


def test_closing_with_unsaved_changes_asks(qtbot, window, tmp_path):
    window.editor.set_value("title", "changed")
    assert window.isWindowModified() and window.windowTitle().startswith("Untitled")
    asked = []
    window.prompts.ask_save_changes = lambda _name: asked.append(1) or "cancel"
    assert not window.close()
    assert asked and window.isVisible()
    window.prompts.ask_save_changes = lambda _name: "discard"
    assert window.close()
    assert not window.editor.solver._thread.isRunning()


def test_every_action_handler_is_a_method_of_an_object_the_window_owns(window):
    from stagewright.gui.window.actions import ACTIONS
    for spec in ACTIONS:
        assert callable(window.handler(spec.handler)), spec.id


def test_save_and_open_round_trip(qtbot, window, tmp_path):
    from stagewright.core.project import load
    out = tmp_path / "train.json"
    window.editor.set_value("title", "Saved train")
    assert window.files.save_to(out)
    assert not window.isWindowModified() and window.windowTitle() == "train.json[*] — Stagewright"
    assert load(out)["title"] == "Saved train"
    assert window.files.recent_files()[0] == str(out.resolve())
    window.files.new_project()
    assert window.editor.model.get("title") == "New compression train"
    assert window.files.open_path(str(out))
    assert window.editor.model.get("title") == "Saved train" and window.editor.undo_stack.count() == 0


def test_site_pressure_switches_between_barometric_and_elevation(qtbot, tmp_path):
    from stagewright.core.atmosphere import standard_pressure
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    ed, site = win.editor, win.panels["site"]
    site._choose_mode("elevation")
    # 1 bar(a) in the ISO 2533 standard atmosphere: z with standard_pressure(z) = 100 000 Pa
    z = ed.model.get("site.elevation_m")
    assert standard_pressure(z) == pytest.approx(1e5, rel=1e-6)
    assert "barometric_pressure_Pa" not in ed.model.doc["site"]
    assert site.elevation.isVisibleTo(site) and not site.pressure.isVisibleTo(site)
    assert ed.undo_stack.undoText() == "Give site pressure as elevation"
    ed.undo_stack.undo()
    assert ed.model.doc["site"] == simple_real_gas_doc()["site"]
    win.close()


def test_warned_value_is_highlighted_in_the_balance(qtbot, window):
    from stagewright.gui.panels.balance_panel import WARNING_BG
    bal = window.panels["balance"]
    n = window.editor.solved_jobs
    window.editor.set_value("stages[0].max_discharge_temperature_K", 400.0)
    wait_solved(qtbot, window, n)
    row = bal.row_keys("points").index("stage-1")
    assert bal.points.item(row, 1).background().color().name() == WARNING_BG
    from PySide6.QtCore import Qt
    assert bal.points.item(row + 2, 1).background().style() == Qt.NoBrush  # stage 2 (after cooler 1)


def test_help_shows_the_cautions_and_the_deferral_to_local_codes(qtbot, window):
    from stagewright.gui.presentation.cautions import CAUTIONS, DEFERRAL
    from stagewright.gui.window.help_dialogs import CautionsDialog
    dlg = CautionsDialog(window)
    text = dlg.browser.toPlainText()
    for title, body in CAUTIONS:
        assert title in text and body[:60] in text
    assert DEFERRAL[:80] in text
    assert window.action_map["help.cautions"].isEnabled()


def test_problem_and_failure_messages_select_their_fields(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    ed, msgs, duty = win.editor, win.panels["messages"], win.panels["duty"]
    type_into(qtbot, duty.pressure, "-0.9")  # a gauge statement must be above 0 bar(g)
    problem = next(m for m in msgs.messages if m.severity == "problem")
    assert problem.field == "discharge_gauge_pressure_Pa" and "Discharge pressure" in problem.text
    win.panels["train"].stage_form.value.setFocus()
    msgs._clicked(msgs.list.item(msgs.messages.index(problem)))
    qtbot.waitUntil(lambda: duty.pressure.edit.hasFocus(), timeout=2000)
    type_into(qtbot, duty.pressure, "8")
    # a measured discharge temperature below the isentropic one: the solve fails with a reason
    n = ed.solved_jobs
    ed.set_value("stages[1].efficiency", {"kind": "discharge_temperature", "value_K": 300.0})
    qtbot.waitUntil(lambda: ed.failure is not None, timeout=30_000)
    failed = next(m for m in msgs.messages if m.severity == "problem")
    assert failed.field == "stages[1].efficiency.value_K" and failed.text.startswith("The train could not be solved")
    assert win.panels["balance"].is_stale and ed.solved_jobs == n
    msgs._clicked(msgs.list.item(msgs.messages.index(failed)))
    train = win.panels["train"]
    assert train.selected_stage() == 1 and train.stage_form.value.path == "stages[1].efficiency.value_K"
    qtbot.waitUntil(lambda: train.stage_form.value.edit.hasFocus(), timeout=2000)
    win.close()


def test_staging_study_runs_off_the_gui_thread_and_is_shown_once_in_its_panel(qtbot, tmp_path, doc_factory):
    # perfect gas, equal stages, intercooling back to the intake temperature, no drops: the
    # optimum split is the equal one and an N-stage train needs
    # N * m cp T1 (r^((k-1)/k) - 1) / eta_s with r = 9^(1/N)
    # (Çengel & Boles, Thermodynamics, 8th ed., §7-11, multistage compression with intercooling)
    win = make_window(qtbot, tmp_path, doc_factory())
    charts, panel = win.panels["charts"], win.panels["study"]
    qtbot.waitUntil(lambda: charts.ts is not None, timeout=10_000)
    win.docks["balance"].raise_()  # the study panel behind another one …
    qtbot.waitUntil(lambda: panel.visibleRegion().isEmpty(), timeout=5_000)
    win.action_map["train.study"].trigger()
    qtbot.waitUntil(lambda: bool(panel.rows) and not panel.busy, timeout=60_000)
    qtbot.waitUntil(lambda: not panel.visibleRegion().isEmpty(), timeout=5_000)  # … comes to the front
    # the study is shown once, in its panel: the charts area keeps its own charts only
    assert [charts.tabs.tabText(i) for i in range(charts.tabs.count())] == ["T–s path", "Power split"]
    by_n = {r["stages"]: r for r in panel.rows}
    assert sorted(by_n) == [1, 2, 3, 4]
    for n in (1, 2, 3):
        r = 9.0 ** (1.0 / n)
        expected_W = n * 1.0 * 1005.0 * 293.15 * (r ** (0.4 / 1.4) - 1.0) / 0.8
        assert by_n[n]["driver_power_W"] == pytest.approx(expected_W, rel=1e-4)
        assert shown_number(panel.table.cell_text(n - 1, "power")) == pytest.approx(expected_W / 1000.0, abs=0.01)
    from matplotlib.lines import Line2D
    assert any(a.get_gid() == "staging-power" for a in panel.chart.figure.findobj(Line2D))
    n = win.editor.solved_jobs
    win.editor.set_value("stages[0].efficiency.value", 0.75)
    wait_solved(qtbot, win, n)
    assert panel.banner.isVisibleTo(panel)  # the panel says its study is out of date
    win.close()


def test_layout_and_display_choices_are_remembered(qtbot, tmp_path):
    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow
    win = make_window(qtbot, tmp_path, simple_real_gas_doc())
    win.docks["messages"].hide()
    win.action_map["view.us_units"].trigger()
    assert win.close()
    settings = QSettings(str(tmp_path / "settings.ini"), QSettings.IniFormat)
    assert settings.value("display/system") == "US"
    again = MainWindow(simple_real_gas_doc(), settings=settings, debounce_ms=10, autosave_ms=None)
    qtbot.addWidget(again)
    again.show()
    qtbot.waitUntil(lambda: not again.docks["messages"].isVisible() and again.docks["site"].isVisible(),
                    timeout=5000)
    assert again.prefs.system == "US"
    settings.setValue("window/state", "not a saved state")  # junk is ignored, never evaluated
    junk = MainWindow(simple_real_gas_doc(), settings=settings, debounce_ms=10, autosave_ms=None)
    qtbot.addWidget(junk)
    junk.show()
    qtbot.wait(50)
    assert junk.docks["messages"].isVisible()
    again.close()
    junk.close()


def test_moist_intake_shows_humidity_condensate_and_dew_point(qtbot, tmp_path):
    # humidity ratio and condensate equal the solver's own figures (the solver's moist-air
    # checks against IAPWS-IF97 and ASHRAE tables live in the core tests)
    import stagewright.core
    doc = simple_real_gas_doc(stages=2)
    doc["site"]["relative_humidity"] = 0.7
    for st in doc["stages"]:
        st["cooler"]["outlet_temperature_K"] = 303.15
    doc["site"]["ambient_temperature_K"] = 298.15
    win = make_window(qtbot, tmp_path, doc)
    bal = win.panels["balance"]
    expected = stagewright.core.solve(doc).to_dict()
    assert not bal.points.isColumnHidden(7)
    w_shown = shown_number(bal.value_text("points", "intake", "w"))
    assert w_shown == pytest.approx(expected["intake"]["humidity_ratio"] * 1e3, abs=6e-4)
    cond = shown_number(bal.value_text("components", "cooler-1", "condensate"))
    assert cond == pytest.approx(expected["stages"][0]["cooler"]["condensate_kg_s"] * 3600.0, abs=6e-3)
    assert cond > 0.0
    pdp = bal.value_text("totals", "delivered_pressure_dew_point_K", "")
    assert float(pdp.split()[0]) == pytest.approx(expected["delivered_pressure_dew_point_K"] - 273.15, abs=6e-3)


def test_dry_intake_hides_the_humidity_columns(qtbot, window):
    bal = window.panels["balance"]
    from stagewright.gui.panels.balance_panel import POINT_COLUMNS
    col = 1 + [c.id for c in POINT_COLUMNS].index("w")
    assert not bal.points.isColumnHidden(col)  # the demo's intake is humid
    ed = window.editor
    n = ed.solved_jobs
    ed.set_value("site.relative_humidity", 0.0)
    wait_solved(qtbot, window, n)
    assert bal.points.isColumnHidden(col)
