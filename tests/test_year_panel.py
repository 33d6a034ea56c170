"""The year-at-site panel runs the project's year off the GUI thread and shows every bin."""
import json

import pytest

pytest.importorskip("PySide6")

from app.year.panel import YEAR_COLUMNS  # noqa: E402
from gui_support import ROOT, make_window, window  # noqa: E402,F401

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui


def test_year_run_fills_one_row_per_bin_and_matches_the_core(qtbot, tmp_path):
    # the panel shows thermo.year's own figures (whose checks against twelve identical months
    # and the coolant balance live in the core tests)
    from thermo.year import run_year
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    panel = win.panels["year"]
    assert panel.run_button.isEnabled()
    assert panel.progress.isHidden()  # no empty bar before the first run
    with qtbot.waitSignal(panel.runner.finished, timeout=120_000):
        panel.run()
    assert not panel.progress.isHidden() and panel.progress.value() == panel.progress.maximum()
    expected = run_year(doc).to_dict()
    assert panel.table.rowCount() == len(expected["bins"]) == 12
    energy_col = [c.id for c in YEAR_COLUMNS].index("energy_kWh")
    shown = float(panel.table.item(6, energy_col).text().replace(" ", ""))
    assert shown == pytest.approx(expected["bins"][6]["energy_kWh"], abs=0.6)
    assert panel._canvas is not None
    assert "hottest discharge" in panel.totals.text()


def test_wide_window_gives_the_chart_the_room_the_table_does_not_need(qtbot, tmp_path):
    # layout check (common practice, no source): in a wide window the table is sized to its
    # columns and the chart takes the rest, instead of the table's size hint taking nearly all
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    win.resize(1920, 1080)
    win.docks["year"].raise_()
    panel = win.panels["year"]
    with qtbot.waitSignal(panel.runner.finished, timeout=120_000):
        panel.run()
    qtbot.waitUntil(lambda: panel.split.sizes()[1] > 0, timeout=5_000)
    table_w, chart_w = panel.split.sizes()
    need = panel.table.horizontalHeader().length()
    assert need <= table_w <= need + 80
    assert chart_w > 2 * panel.chart_box.minimumWidth()


def test_project_without_year_profile_says_so(qtbot, window):
    panel = window.panels["year"]
    assert not panel.run_button.isEnabled()
    assert "no year profile" in panel.status.text()


def test_exchanger_figures_appear_in_the_balance_sheet(qtbot, tmp_path):
    # UA and LMTD as the core reports them (their checks against `ht` live in the core tests)
    import thermo
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    bal = win.panels["balance"]
    expected = thermo.solve(doc).to_dict()["stages"][0]["cooler"]
    ua = float(bal.value_text("components", "cooler-1", "ua").replace(" ", ""))
    assert ua == pytest.approx(expected["ua_W_K"] / 1e3, abs=6e-4)
