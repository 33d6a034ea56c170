"""The year-at-site panel runs the project's year off the GUI thread and shows every bin, the
year's totals (money, cooling water, recoverable heat) and a chart that is readable at the
window's default size."""
import json

import pytest

pytest.importorskip("PySide6")

from stagewright.gui.year.panel import YEAR_COLUMNS  # noqa: E402
from gui_support import ROOT, make_window, table_cell_text, window  # noqa: E402,F401

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui
RUN_MS = 120_000


def _run(qtbot, win):
    win.docks["year"].raise_()
    panel = win.panels["year"]
    with qtbot.waitSignal(panel.runner.finished, timeout=RUN_MS):
        panel.run()
    return panel


def _shown_texts(widget) -> list[str]:
    """Every text a user can read in ``widget``: labels, then each table's headers and its cells
    row by row."""
    from PySide6.QtCore import Qt
    from PySide6.QtWidgets import QLabel, QTableView
    texts = [lab.text() for lab in widget.findChildren(QLabel) if lab.isVisibleTo(widget)]
    for t in widget.findChildren(QTableView):  # QTableWidget is a QTableView too
        if not t.isVisibleTo(widget):
            continue
        m = t.model()
        texts += [m.headerData(c, Qt.Horizontal, Qt.DisplayRole) or "" for c in range(m.columnCount())]
        for r in range(m.rowCount()):
            texts += [m.data(m.index(r, c), Qt.DisplayRole) or "" for c in range(m.columnCount())]
    return texts


def _year_canvas(qtbot, panel):
    """The year chart's canvas, its tab brought to the front and drawn at its size on screen."""
    from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
    (canvas,) = panel.findChildren(FigureCanvasQTAgg)
    page = next(panel.tabs.widget(i) for i in range(panel.tabs.count())
                if panel.tabs.widget(i).isAncestorOf(canvas))
    panel.tabs.setCurrentWidget(page)
    qtbot.waitUntil(canvas.isVisible, timeout=5_000)
    qtbot.wait(300)  # the resize, and a redraw if the chart changed its arrangement
    canvas.draw()
    return canvas


def test_year_run_fills_one_row_per_bin_and_matches_the_core(qtbot, tmp_path):
    # the panel shows stagewright.core.year's own figures (whose checks against twelve identical months
    # and the coolant balance live in the core tests)
    from stagewright.core.year import run_year
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    panel = win.panels["year"]
    assert panel.run_button.isEnabled()
    assert panel.progress.isHidden()  # no empty bar before the first run
    _run(qtbot, win)
    assert not panel.progress.isHidden() and panel.progress.value() == panel.progress.maximum()
    expected = run_year(doc).to_dict()
    assert panel.table.model().rowCount() == len(expected["bins"]) == 12
    energy_col = [c.id for c in YEAR_COLUMNS].index("energy_kWh")
    shown = float(table_cell_text(panel.table, 6, energy_col).replace(" ", ""))
    assert shown == pytest.approx(expected["bins"][6]["energy_kWh"], abs=0.6)
    assert panel.chart.canvas is not None
    assert panel.results.total_value("worst_discharge_temperature.temperature_K") == "137.3 °C in August"


def _number(text: str) -> float:
    return float(text.split(" in ")[0].rstrip("kWhm³ °CUSgal").replace(" ", ""))


@pytest.mark.parametrize("system", ["SI", "US"])
def test_results_show_the_years_money_cooling_water_and_recoverable_heat(qtbot, tmp_path, system):
    # the totals are stagewright.core.year's own (its energy and water sums are checked in the core tests);
    # 1 US gal = 3.785411784e-3 m³ (NIST SP 811, 2008, App. B.8). Each shown total is the core's
    # at the decimals it is printed with
    from stagewright.core.year import run_year
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    totals = run_year(doc).to_dict()["totals"]
    win = make_window(qtbot, tmp_path, doc)
    win.prefs.system = system
    panel = _run(qtbot, win)
    assert panel.tabs.tabText(panel.tabs.currentIndex()) == "Results"  # after a run the totals come first
    texts = _shown_texts(panel.tabs.currentWidget())
    gal = 3.785411784e-3
    volume = 1.0 if system == "SI" else 1.0 / gal
    expected = {"Energy cost": (totals["energy_cost"], 0.5),
                "Cooling water": (totals["cooling_water_m3"] * volume, 0.5),  # whole m³ or US gal
                "Cooling-water cost": (totals["water_cost"], 0.5),
                "Recoverable heat": (totals["recoverable_heat_kWh"], 0.5),
                "Value of recovered heat": (totals["recovered_value"], 0.5),
                "Net cost": (totals["cost"], 0.5),
                "Energy": (totals["energy_kWh"], 0.5)}
    for label, (value, tol) in expected.items():
        assert label in texts, label
        shown = texts[texts.index(label) + 1]  # the total's value, beside its name
        assert _number(shown) == pytest.approx(value, abs=tol), label
    assert "Glycol circulated" not in texts  # no glycol circuit in this project: nothing to show
    assert texts[texts.index("Cooling water") + 1].endswith("m³" if system == "SI" else "US gal")


def test_a_project_without_heat_recovery_shows_no_recoverable_heat(qtbot, tmp_path):
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    del doc["heat_recovery"]
    doc["year"]["energy_price_per_kWh"] = 0.0
    win = make_window(qtbot, tmp_path, doc)
    panel = _run(qtbot, win)
    ids = panel.results.total_ids()
    assert "totals.recoverable_heat_kWh" not in ids and "totals.recovered_value" not in ids
    assert "totals.energy_cost" not in ids  # no energy price given
    assert {"totals.energy_kWh", "totals.cooling_water_m3", "totals.water_cost", "totals.cost"} <= set(ids)


def _default_size_chart(qtbot, tmp_path):
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    assert (win.width(), win.height()) == (1280, 800)  # the window's default size
    canvas = _year_canvas(qtbot, _run(qtbot, win))
    return canvas.figure, canvas.get_renderer()


def test_the_chart_panels_are_tall_enough_at_the_default_window_size(qtbot, tmp_path):
    # layout check (common practice, no source): each of the chart's three panels is at least
    # 100 px tall at 1280 × 800 (they were about 30 px)
    fig, renderer = _default_size_chart(qtbot, tmp_path)
    assert len(fig.axes) == 3
    heights = [ax.get_window_extent(renderer).height for ax in fig.axes]
    assert min(heights) >= 100, heights


def test_the_worst_month_is_named_clear_of_the_month_labels(qtbot, tmp_path):
    # layout check (common practice, no source): "worst: August" is on the chart and no text of
    # the chart overlaps a month label
    from matplotlib.text import Text
    fig, renderer = _default_size_chart(qtbot, tmp_path)
    ticks = [t for ax in fig.axes for t in ax.get_xticklabels() if t.get_visible() and t.get_text()]
    assert len(ticks) >= 12
    texts = [t for t in fig.findobj(Text) if t.get_visible() and t.get_text() and t not in ticks]
    assert any("worst: August" in t.get_text().replace("\n", " ") for t in texts)
    tick_boxes = [t.get_window_extent(renderer) for t in ticks]
    for t in texts:
        box = t.get_window_extent(renderer)
        assert not any(box.overlaps(b) for b in tick_boxes), t.get_text()


def test_wide_window_shows_every_month_column_beside_the_totals(qtbot, tmp_path):
    # layout check (common practice, no source): at 1920 × 1080 the totals are as wide as their
    # text and the bin table beside them shows all its columns without scrolling sideways
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    win.resize(1920, 1080)
    panel = _run(qtbot, win)
    qtbot.waitUntil(lambda: panel.results.sizes()[1] > 0, timeout=5_000)
    totals_w, table_w = panel.results.sizes()
    need = panel.totals.horizontalHeader().length()
    assert need <= totals_w <= need + 80
    assert panel.table.horizontalHeader().length() <= panel.table.viewport().width()
    canvas = _year_canvas(qtbot, panel)
    assert all(ax.get_window_extent(canvas.get_renderer()).height >= 150 for ax in canvas.figure.axes)


def test_project_without_year_profile_says_so(qtbot, window):
    panel = window.panels["year"]
    assert not panel.run_button.isEnabled()
    assert "no year profile" in panel.status.text()


def test_exchanger_figures_appear_in_the_balance_sheet(qtbot, tmp_path):
    # UA and LMTD as the core reports them (their checks against `ht` live in the core tests)
    import stagewright.core
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    bal = win.panels["balance"]
    expected = stagewright.core.solve(doc).to_dict()["stages"][0]["cooler"]
    ua = float(bal.value_text("components", "cooler-1", "ua").replace(" ", ""))
    assert ua == pytest.approx(expected["ua_W_K"] / 1e3, abs=6e-4)


def test_an_edit_during_a_run_marks_the_year_out_of_date(qtbot, tmp_path):
    # issue 22 item 5: the old year was shown as "Year solved." although the project had changed
    doc = json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))
    win = make_window(qtbot, tmp_path, doc)
    win.docks["year"].raise_()
    panel = win.panels["year"]
    with qtbot.waitSignal(panel.runner.finished, timeout=RUN_MS):
        panel.run()
        # the answer is delivered to the GUI thread only once the wait runs: this edit comes first
        win.editor.set_value("site.ambient_temperature_K", doc["site"]["ambient_temperature_K"] + 5.0)
    assert panel.is_stale and panel.status.text().startswith("Out of date")
    win.editor.undo_stack.undo()  # back to the input the year was run on
    assert not panel.is_stale
    with qtbot.waitSignal(panel.runner.finished, timeout=RUN_MS):
        panel.run()
    assert not panel.is_stale and panel.status.text() == "Year solved."
