"""The year's results in the window for an hourly year (issue 15 item 5): 8760 bins shown by a
table model, an extreme named by its hour, and a freeze caution that counts hours rather than
listing hundreds of names. The figures are the core's; they are spread here over 8760 invented
hours (the run itself is checked in test_year_panel and the core's tests)."""
import json
from datetime import datetime, timedelta

import pytest

pytest.importorskip("PySide6")

from stagewright.gui.year.panel import YEAR_COLUMNS, freezing_caution  # noqa: E402
from gui_support import ROOT, make_window, table_cell_text  # noqa: E402

YEAR_SAMPLE = ROOT / "sample_projects" / "three_stage_site_year.json"
pytestmark = pytest.mark.gui


@pytest.fixture(scope="module")
def hourly_year():
    from stagewright.core.year import run_year
    year = run_year(json.loads(YEAR_SAMPLE.read_text(encoding="utf-8"))).to_dict()
    bins, start = [], datetime(2025, 1, 1)
    for h in range(8760):
        t = start + timedelta(hours=h)
        b = dict(year["bins"][t.month - 1])
        b.update(label=f"{t:%Y-%m-%d %H:%M}", hours=1.0, freezing_condensate=t.month == 1 and t.day <= 10)
        bins.append(b)
    worst = max(bins, key=lambda b: b["max_discharge_temperature_K"])
    return {**year, "bins": bins, "freezing_bins": [b["label"] for b in bins if b["freezing_condensate"]],
            "worst_discharge_temperature": {"bin": worst["label"], "temperature_K": worst["max_discharge_temperature_K"]}}


def test_an_hourly_year_shows_every_hour_and_names_its_extremes_by_the_hour(qtbot, tmp_path, hourly_year):
    win = make_window(qtbot, tmp_path, json.loads(YEAR_SAMPLE.read_text(encoding="utf-8")))
    panel = win.panels["year"]
    panel._running_doc = win.editor.model.snapshot()
    panel._on_finished(1, hourly_year, 1.0)
    assert panel.table.model().rowCount() == 8760
    label = [c.id for c in YEAR_COLUMNS].index("label")
    assert table_cell_text(panel.table, 5000, label) == "2025-07-28 08:00"
    worst = panel.results.total_value("worst_discharge_temperature.temperature_K")
    assert worst.endswith(" at " + hourly_year["worst_discharge_temperature"]["bin"])
    status = panel.status.text()
    assert "in 240 bins (240 h, ambient" in status and "2025-01-01" not in status  # counted, not listed
    assert "freeze protection" in status
    assert panel.chart.figure is not None


def test_a_few_freezing_bins_are_named():
    year = {"freezing_bins": ["January", "February"],
            "bins": [{"label": m, "freezing_condensate": True, "hours": 700.0, "temperature_K": 265.0}
                     for m in ("January", "February")]}
    assert "in January, February: freeze protection" in freezing_caution(year)
    assert freezing_caution({"freezing_bins": [], "bins": []}) == ""
