"""Year-at-site chart: bars and line carry the year run's own figures, in the display units."""
import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from app.charts.year_chart import draw_year_chart
from conftest import SAMPLES
from thermo.project import load
from thermo.year import run_year


@pytest.fixture(scope="module")
def year():
    return run_year(load(SAMPLES / "three_stage_site_year.json")).to_dict()


def _fig():
    fig = Figure(figsize=(7, 6), dpi=72)
    FigureCanvasAgg(fig)
    return fig


def _patches(fig, prefix):
    return {p.get_gid(): p for ax in fig.axes for p in ax.patches if (p.get_gid() or "").startswith(prefix)}


def test_bars_and_line_are_the_bins_figures(year):
    fig = draw_year_chart(_fig(), year, limit_K=473.15)
    fig.canvas.draw()
    energy, water = _patches(fig, "year-energy-"), _patches(fig, "year-condensate-")
    assert len(energy) == len(water) == len(year["bins"]) == 12
    for i, b in enumerate(year["bins"]):
        assert energy[f"year-energy-{i}"].get_height() == pytest.approx(b["energy_kWh"], rel=1e-12)
        assert water[f"year-condensate-{i}"].get_height() == pytest.approx(b["condensate_m3"], rel=1e-12)
    assert sum(b["condensate_m3"] for b in year["bins"]) > 0.0  # a humid site drains water every month
    (line,) = [ln for ax in fig.axes for ln in ax.get_lines() if ln.get_gid() == "year-discharge"]
    assert list(line.get_ydata()) == pytest.approx([b["max_discharge_temperature_K"] - 273.15 for b in year["bins"]])
    (worst,) = [ln for ax in fig.axes for ln in ax.get_lines() if ln.get_gid() == "year-worst"]
    labels = [b["label"] for b in year["bins"]]
    assert labels[int(worst.get_xdata()[0])] == year["worst_discharge_temperature"]["bin"]
    assert worst.get_ydata()[0] == pytest.approx(year["worst_discharge_temperature"]["temperature_K"] - 273.15)


def test_us_units_and_empty_year(year):
    fig = draw_year_chart(_fig(), year, "US")
    water = _patches(fig, "year-condensate-")
    # 1 US gal = 3.785411784 L (NIST SP 811, 2008, Appendix B.8)
    assert water["year-condensate-0"].get_height() == pytest.approx(year["bins"][0]["condensate_m3"] / 3.785411784e-3)
    (line,) = [ln for ax in fig.axes for ln in ax.get_lines() if ln.get_gid() == "year-discharge"]
    assert line.get_ydata()[0] == pytest.approx((year["bins"][0]["max_discharge_temperature_K"]) * 9 / 5 - 459.67)
    empty = draw_year_chart(_fig(), {"bins": [], "totals": {}})
    assert not _patches(empty, "year-") and any("No year run" in t.get_text() for ax in empty.axes for t in ax.texts)
