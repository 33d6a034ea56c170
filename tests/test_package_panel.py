"""The package panel: add a capacity control, edit it and its loads through the undo stack, and show
the rows every other output shows (the package figures, the data sheet computed off the GUI
thread, the part-load chart).

Check kinds: behaviour checks on invented projects; the shown numbers are compared with the
presentation rows (app/presentation/package_table.py), whose agreement with ``solve --json`` in
SI and US units is checked in tests/test_presentation_package_table.py. Unit factors written out:
1 US gal = 3.785411784 L (NIST SP 811, 2008 edition, Appendix B).
"""
from __future__ import annotations

import json

import pytest

pytest.importorskip("PySide6")

from stagewright.gui.document.paths import ABSENT  # noqa: E402
from stagewright.gui.presentation import package_table as pt  # noqa: E402
from gui_support import SAMPLE, make_window, type_into, wait_solved  # noqa: E402

pytestmark = pytest.mark.gui
SHEET_MS = 120_000


def _doc_without_package() -> dict:
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    del doc["package"]
    return doc


def _show(win):
    win.docks["package"].raise_()
    return win.panels["package"]


def _cells(table) -> list[list[str]]:
    return [[table.item(r, c).text() for c in range(table.columnCount())] for r in range(table.rowCount())]


def test_add_capacity_control_sizes_the_receiver_and_undo_takes_it_away(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path, _doc_without_package())
    panel = _show(win)
    assert panel.pages.currentIndex() == 0 and "common practice, no source" in panel.add_button.toolTip()
    fad = win.editor.result["free_air_delivery_m3_s"]
    done = win.editor.solved_jobs
    panel.add_button.click()
    pkg = win.model.get("package")
    # about 20 L per (L/s) of free air delivery: 300 L/s → 6 m³
    assert pkg["control"] == {"kind": "load_unload", "receiver_volume_m3": pytest.approx(20.0 * fad, abs=1e-3)}
    assert panel.pages.currentIndex() == 1
    wait_solved(qtbot, win, done)
    assert win.editor.result["package"]["control"] == "load_unload"
    assert _cells(panel.results.points) == pt.point_rows(win.editor.result["package"], "window", "SI")
    win.editor.undo_stack.undo()
    assert "package" not in win.model.doc and panel.pages.currentIndex() == 0
    win.editor.undo_stack.redo()
    assert win.model.get("package.control.kind") == "load_unload"
    win.close()


def test_control_kind_receiver_and_loads_edit_through_undo(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    panel = _show(win)
    inputs = panel.inputs
    before = json.loads(json.dumps(win.model.get("package")))
    # another control kind keeps the receiver and the band, one undo step
    inputs.kind._chosen(inputs.kind._values.index("start_stop"))  # as the drop-down's activated signal does
    control = win.model.get("package.control")
    assert control == {"kind": "start_stop", "receiver_volume_m3": 6.0, "pressure_band_Pa": 100_000.0,
                       "unloaded_power_fraction": 0.25, "blowdown_time_s": 40.0}
    assert win.editor.undo_stack.undoText() == "Change capacity control to start/stop"
    assert inputs.parameters["max_starts_per_hour"][1].isVisibleTo(inputs)
    assert not inputs.parameters["zero_flow_power_fraction"][1].isVisibleTo(inputs)
    win.editor.undo_stack.undo()
    assert win.model.get("package") == before
    # the receiver in US gallons: 1000 gal = 3.785411784 m³
    win.prefs.system = "US"
    field = inputs.parameters["receiver_volume_m3"][1]
    assert field.unit_label.text() == "US gal"
    type_into(qtbot, field, "1000")
    assert win.model.get("package.control.receiver_volume_m3") == pytest.approx(3.785411784, rel=1e-9)
    assert win.editor.undo_stack.undoText() == "Change receiver volume"
    win.editor.undo_stack.undo()
    assert win.model.get("package.control.receiver_volume_m3") == 6.0
    # data-sheet loads typed in per cent; text that is no load is refused, the document kept
    inputs.part_loads.setFocus()
    inputs.part_loads.setText("100, 60")
    inputs.part_loads.setModified(True)
    inputs.part_loads.editingFinished.emit()
    assert win.model.get("package.part_loads") == [1.0, 0.6]
    inputs.part_loads.setText("100, lots")
    inputs.part_loads.setModified(True)
    inputs.part_loads.editingFinished.emit()
    assert win.model.get("package.part_loads") == [1.0, 0.6]
    assert "'lots' is not a load" in inputs.part_loads_note.text()
    win.editor.undo_stack.undo()
    assert win.model.get("package.part_loads") == [1.0, 0.75, 0.5]
    win.close()


def test_load_profile_rows_add_edit_remove_and_undo(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    profile = _show(win).inputs.profile
    rows = win.model.get("package.load_profile")
    profile.add_button.click()
    assert win.model.get("package.load_profile") == rows + [rows[-1]]
    assert win.editor.undo_stack.undoText() == "Add load-profile row"
    profile.table.item(3, 0).setText("45")  # per cent
    assert win.model.get("package.load_profile[3].load") == pytest.approx(0.45)
    assert win.editor.undo_stack.undoText() == "Change load-profile row 4 load"
    profile.table.item(3, 1).setText("many")
    assert win.model.get("package.load_profile[3].hours") == rows[-1]["hours"]
    assert "'many' is not a number" in profile.status.text()
    profile.table.item(3, 1).setText("-5")  # out of range: into the document, marked and named
    assert win.model.get("package.load_profile[3].hours") == -5.0
    assert "Load-profile row 4 hours: -5 h is out of range (allowed: above 0 h" in profile.table.item(3, 1).toolTip()
    win.editor.undo_stack.undo()
    profile.table.setCurrentCell(0, 0)
    profile.remove_button.click()
    assert win.model.get("package.load_profile") == [rows[1], rows[2], {**rows[-1], "load": 0.45}]
    for _ in range(3):
        win.editor.undo_stack.undo()
    assert win.model.get("package.load_profile") == rows
    win.close()


def test_out_of_range_package_value_is_named_in_the_messages(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    panel = _show(win)
    field = panel.inputs.parameters["unloaded_power_fraction"][1]
    type_into(qtbot, field, "150")  # per cent: above 100 %
    from stagewright.gui.document.messages import problem_text
    (problem,) = [p for p in win.editor.problems if p.field == "package.control.unloaded_power_fraction"]
    text = problem_text(problem, win.model.doc, "SI")
    assert "Unloaded power" in text and "150" in text and "100 %" in text, text
    assert field.problem_message()  # the field is marked
    win.close()


def test_data_sheet_is_computed_off_the_gui_thread_and_shown(qtbot, tmp_path):
    from stagewright.core.part_load.data_sheet import data_sheet
    win = make_window(qtbot, tmp_path)
    panel = win.panels["package"]
    if panel.sheet is None:  # not computed yet (the panel was hidden at the first answer, or it still runs)
        with qtbot.waitSignal(panel.runner.finished, timeout=SHEET_MS):
            _show(win)
            qtbot.waitUntil(panel.isVisible, timeout=5_000)
    else:  # the panel was already shown when the first answer came, and its sheet is in
        _show(win)
    assert panel.runner.latest_job >= 1 and panel.sheet is not None
    sheet = data_sheet(win.model.snapshot()).to_dict()
    assert _cells(panel.results.sheet) == pt.sheet_rows(sheet, "window", "SI")
    assert "ISO 1217 reference: inlet pressure 1.000 bar(a)" in panel.results.conditions.text()
    # the chart: the stated load is marked where the figures put it
    panel.results.setCurrentIndex(3)
    fig = panel.results.canvas.figure
    stated = next(ln for ax in fig.axes for ln in ax.lines if ln.get_gid() == "part-load-stated")
    at = win.editor.result["package"]["at_load"]
    assert stated.get_xdata()[0] == pytest.approx(at["delivered_fad_m3_s"] * 60.0)
    assert stated.get_ydata()[0] == pytest.approx(at["package_power_W"] / 1e3)
    win.close()


def test_motor_efficiency_points_edit_through_undo(qtbot, tmp_path):
    """A supplier's motor points typed in per cent reach the document (and the solve), one undo step each."""
    win = make_window(qtbot, tmp_path)
    panel = _show(win)
    rows = panel.inputs.motor_points
    done = win.editor.solved_jobs
    rows.add_button.click()
    assert win.model.get("package.motor.efficiency_points") == [{"load_fraction": 0.5, "efficiency": 0.9}]
    rows.table.item(0, 1).setText("93")  # per cent
    assert win.model.get("package.motor.efficiency_points") == [{"load_fraction": 0.5, "efficiency": 0.93}]
    wait_solved(qtbot, win, done)
    win.editor.undo_stack.undo()
    win.editor.undo_stack.undo()
    assert win.model.get("package.motor.efficiency_points") in (ABSENT, [], None)
    win.close()
