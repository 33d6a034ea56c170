"""The year panel for issue 15: a CSV profile imported as one undo step (or not at all), the
cooler mode chosen in the profile editor, and the per-bin figures of coolers designed once."""
import json

import pytest

pytest.importorskip("PySide6")

from PySide6.QtCore import Qt  # noqa: E402

from gui_support import ROOT, make_window, table_cell_text  # noqa: E402

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui


def _window(qtbot, tmp_path):
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    return make_window(qtbot, tmp_path, doc)


def test_csv_import_is_one_undo_step_and_a_bad_file_changes_nothing(qtbot, tmp_path):
    win = _window(qtbot, tmp_path)
    ed = win.panels["year"].profile_editor
    before = json.dumps(win.editor.model.get("year"), sort_keys=True)
    count = win.editor.undo_stack.count()
    bad = tmp_path / "bad.csv"
    bad.write_text("time,temperature [°C],rh [%]\n2025-01-01 00:00,-8,85\n2025-01-01 01:00,-9,eighty\n")
    assert ed.import_csv(bad) is False
    assert "CSV line 3, column 3 'rh [%]'" in ed.message.text()
    assert json.dumps(win.editor.model.get("year"), sort_keys=True) == before
    assert win.editor.undo_stack.count() == count
    good = tmp_path / "good.csv"
    rows = "\n".join(f"2025-01-{1 + h // 24:02d} {h % 24:02d}:00,{-8 + (h % 10)},{85 - h % 7}" for h in range(96))
    good.write_text("time,temperature [°C],rh [%]\n" + rows + "\n")
    assert ed.import_csv(good, bin_steps=(1.0, 0.05)) is True
    year = win.editor.model.get("year")
    assert year["profile"]["kind"] == "bins" and 1 < len(year["profile"]["bins"]) < 96
    assert sum(b["hours"] for b in year["profile"]["bins"]) == pytest.approx(96.0)
    assert year["energy_price_per_kWh"] > 0.0  # the rest of the year is kept
    assert win.editor.undo_stack.count() == count + 1
    assert "Imported 96 rows" in ed.message.text()
    win.editor.undo_stack.undo()
    assert json.dumps(win.editor.model.get("year"), sort_keys=True) == before


def test_cooler_mode_chosen_in_the_editor_and_rated_bins_shown(qtbot, tmp_path):
    win = _window(qtbot, tmp_path)
    panel = win.panels["year"]
    ed = panel.profile_editor
    box, options = ed.choices["year.coolers.mode"]
    box.activated.emit([v for v, _ in options].index("design_once"))
    assert win.editor.model.get("year.coolers.mode") == "design_once"
    ed.set_field("year.coolers.max_dryer_inlet_temperature_K", "30")
    assert win.editor.model.get("year.coolers.max_dryer_inlet_temperature_K") == pytest.approx(303.15)
    assert win.editor.model.problems() == []
    win.docks["year"].raise_()
    with qtbot.waitSignal(panel.runner.finished, timeout=120_000):
        panel.run()
    model = panel.table.model()
    heads = [model.headerData(c, Qt.Horizontal).split("\n")[0] for c in range(model.columnCount())]
    for name in ("To dryer", "Pressure dew pt", "Cooler outlets", "Coolant outlets", "Meets limits"):
        assert name in heads
    col = heads.index("Cooler outlets")
    assert table_cell_text(panel.table, 6, col).count(" / ") == 2  # three coolers, July
    assert "Hours missing a limit" in [panel.totals.item(r, 0).text() for r in range(panel.totals.rowCount())]
    assert panel.result["cooler_design"]["condition"] == "site"
    gids = {a.get_gid() for ax in panel.chart.figure.axes for a in ax.lines}
    assert {"year-dryer", "year-pdp"} <= gids
