"""The Cases panel and cases in the window (issue: options side by side).

Each edit to a case is one undo step and goes into that case only; rename, new, remove and make
base are each one undo step; a comparison runs off the GUI thread and its figures equal the
core's for each case's standalone document (the reference here is ``stagewright.core.solve`` of that
document).
"""
from __future__ import annotations

import os

import pytest

pytest.importorskip("pytestqt")
pytestmark = pytest.mark.gui

import stagewright.core  # noqa: E402
from gui_support import make_window, simple_real_gas_doc, wait_solved  # noqa: E402
from stagewright.core.project import load  # noqa: E402
from stagewright.core.project.cases import add_case, case_document, case_names  # noqa: E402


def _two_case_doc():
    doc = simple_real_gas_doc()
    doc["title"] = "Two options"
    return add_case(doc, "Cool day", {"site.ambient_temperature_K": 283.15})


def _panel(win):
    win.docks["cases"].raise_()
    return win.panels["cases"]


def test_choosing_a_case_shows_it_and_edits_go_into_it_only(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _two_case_doc())
    panel = _panel(win)
    assert [panel.case_list.item(i).data(0x0100) for i in range(panel.case_list.count())] == ["Base", "Cool day"]
    after = win.editor.solved_jobs
    panel.case_list.setCurrentRow(1)
    wait_solved(qtbot, win, after)
    assert win.model.active_case == "Cool day" and win.model.get("site.ambient_temperature_K") == 283.15
    assert "case “Cool day”" in win.windowTitle()  # which option is on screen
    cool = stagewright.core.solve(case_document(_two_case_doc(), "Cool day")).to_dict()
    assert win.editor.result["driver_power_W"] == cool["driver_power_W"]
    after = win.editor.solved_jobs
    win.editor.set_value("stages[0].efficiency.value", 0.75)
    wait_solved(qtbot, win, after)
    project = win.model.project_snapshot()
    assert project["cases"][0]["changes"] == {"site.ambient_temperature_K": 283.15,
                                              "stages[0].efficiency.value": 0.75}
    assert project["stages"][0]["efficiency"]["value"] == 0.8  # the base is untouched
    # undo goes back into the case the edit was made in, even when the base is shown
    panel.case_list.setCurrentRow(0)
    assert win.model.active_case == "Base"
    win.editor.undo_stack.undo()
    assert win.model.active_case == "Cool day"
    assert win.model.project_snapshot()["cases"][0]["changes"] == {"site.ambient_temperature_K": 283.15}
    win.close()


def test_new_rename_remove_make_base_are_each_one_undo_step(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _two_case_doc())
    panel = _panel(win)
    stack = win.editor.undo_stack
    start = stack.count()
    panel.new_case("Winter")
    assert case_names(win.model.project_snapshot()) == ["Base", "Cool day", "Winter"]
    assert win.model.active_case == "Winter" and stack.count() == start + 1
    panel.rename_case("Cold winter")
    assert win.model.active_case == "Cold winter"
    panel.case_list.setCurrentRow(1)
    panel.make_base()
    assert case_names(win.model.project_snapshot())[0] == "Cool day"
    assert win.model.project_snapshot()["site"]["ambient_temperature_K"] == 283.15
    panel.case_list.setCurrentRow(2)
    removed = win.model.active_case
    panel.remove_case()
    assert removed not in case_names(win.model.project_snapshot())
    assert stack.count() == start + 4
    for _ in range(4):
        stack.undo()
    assert case_names(win.model.project_snapshot()) == ["Base", "Cool day"]
    assert stack.index() == start
    panel.rename_case("Cool day")  # to an existing name: refused in words, nothing changes
    assert stack.index() == start and "already has a case named 'Cool day'" in panel.status.text()
    win.close()


def test_compare_runs_off_the_gui_thread_and_equals_each_case_alone(qtbot, tmp_path, monkeypatch):
    doc = _two_case_doc()
    win = make_window(qtbot, tmp_path, doc)
    panel = _panel(win)
    with qtbot.waitSignal(panel.runner.finished, timeout=60_000):
        panel.compare()
        assert not panel.compare_button.isEnabled() and panel.cancel_button.isEnabled()
    assert [o.name for o in panel.outcomes] == ["Base", "Cool day"]
    for o in panel.outcomes:
        assert o.result["driver_power_W"] == stagewright.core.solve(case_document(doc, o.name)).to_dict()["driver_power_W"]
    headers = [panel.table.verticalHeaderItem(r).text() for r in range(panel.table.rowCount())]
    power_row = headers.index("Driver input power [kW]")
    cool_cell = panel.table.item(power_row, 1).text()
    base_kW = panel.outcomes[0].result["driver_power_W"] / 1e3
    cool_kW = panel.outcomes[1].result["driver_power_W"] / 1e3
    assert cool_cell.startswith(f"{cool_kW:.2f}") and f"{cool_kW - base_kW:+.2f} kW".replace("-", "−") in cool_cell
    # the charts are drawn when their tabs show (issue 19: hidden charts are not redrawn)
    assert panel.tabs.currentIndex() == 0 and panel.canvas is None and panel.paths_canvas is None
    panel.tabs.setCurrentIndex(1)
    assert panel.canvas is not None and len(panel.canvas.figure.axes) >= 3
    panel.tabs.setCurrentIndex(2)
    gids = {line.get_gid() for line in panel.paths_canvas.figure.axes[0].get_lines()}
    assert {"Base:stage-1", "Cool day:stage-1", "Cool day:cooler-2"} <= gids  # the paths overlaid
    # a change of units redraws only the chart on screen; the other is drawn when its tab shows
    drawn = []
    from stagewright.gui.charts import case_chart, case_ts_chart
    for module, name, tag in ((case_chart, "draw_case_comparison", "chart"), (case_ts_chart, "draw_case_paths", "paths")):
        monkeypatch.setattr(module, name, lambda *a, _f=getattr(module, name), _t=tag: drawn.append(_t) or _f(*a))
    win.set_us_units(True)
    assert drawn == ["paths"]
    panel.tabs.setCurrentIndex(1)
    assert drawn == ["paths", "chart"]
    win.set_us_units(False)
    if os.environ.get("STAGEWRIGHT_SHOTS"):
        win.resize(1280, 800)
        panel.tabs.setCurrentIndex(0)
        qtbot.wait(200)
        win.grab().save(os.path.join(os.environ["STAGEWRIGHT_SHOTS"], "cases_table.png"))
        panel.tabs.setCurrentIndex(1)
        qtbot.wait(200)
        win.grab().save(os.path.join(os.environ["STAGEWRIGHT_SHOTS"], "cases_chart.png"))
        panel.tabs.setCurrentIndex(2)
        qtbot.wait(200)
        win.grab().save(os.path.join(os.environ["STAGEWRIGHT_SHOTS"], "cases_paths.png"))
    win.close()


def test_kept_results_show_at_once_and_the_new_solve_checks_them(qtbot, tmp_path):
    doc = _two_case_doc()
    win = make_window(qtbot, tmp_path, doc)
    wait_solved(qtbot, win, 0)
    win.files.set_keep_results(True)
    path = tmp_path / "kept.json"
    assert win.files.save_to(path)
    saved = load(path)
    assert saved["snapshot"]["results"]["Base"] == win.editor.result
    win.close()
    from PySide6.QtCore import QSettings

    from stagewright.gui.window.main_window import MainWindow
    checks = []
    again = MainWindow(saved, settings=QSettings(str(tmp_path / "s2.ini"), QSettings.IniFormat), debounce_ms=10,
                       restore_layout=False)
    qtbot.addWidget(again)
    again.editor.snapshot_checked.connect(checks.append)
    # before any solve: the kept results are shown, not marked out of date
    assert again.editor.from_snapshot and not again.editor.stale
    assert again.editor.result == saved["snapshot"]["results"]["Base"]
    assert again.action_map["file.keep_results"].isChecked()
    qtbot.waitUntil(lambda: bool(checks), timeout=30_000)
    assert "within 1e-06" in checks[0] and not again.editor.from_snapshot
    again.close()
