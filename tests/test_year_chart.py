"""Year-at-site chart: bars and line carry the year run's own figures, in the display units."""
import math

import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from stagewright.gui.charts.year_chart import draw_year_chart
from conftest import SAMPLES
from stagewright.core.project import load
from stagewright.core.year import run_year


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


def _title_texts(ax):
    from matplotlib.text import Text
    full = ax.get_title(loc="left")
    return [c for c in ax.get_children() if isinstance(c, Text) and full and c.get_text() == full]


@pytest.mark.parametrize("system", ["SI", "US"])
@pytest.mark.parametrize("size_px", [(320, 200), (480, 300), (1200, 700), (900, 225), (1170, 280)])
def test_titles_and_labels_lie_inside_the_figure(year, system, size_px):
    # 320 px is the panel's narrowest chart area; every title, axis label and tick label must be
    # drawn inside the figure, neighbouring month labels must not run into each other, and the
    # titles of panels side by side (a wide, short figure) must not run into each other either
    w, h = size_px
    fig = Figure(figsize=(w / 100, h / 100), dpi=100)
    FigureCanvasAgg(fig)
    draw_year_chart(fig, year, system, limit_K=473.15)
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    box = fig.bbox
    titles = [t for ax in fig.axes for t in _title_texts(ax)]
    assert len(titles) == 3
    texts = titles + [ax.yaxis.label for ax in fig.axes]
    labelled = [ax for ax in fig.axes if any(t.get_visible() and t.get_text() for t in ax.get_xticklabels())]
    assert len(labelled) == (3 if w >= 2.2 * h else 1)  # side by side: month labels under each panel
    for ax in labelled:
        ticks = [t for t in ax.get_xticklabels() if t.get_visible() and t.get_text()]
        assert len(ticks) == 12
        for t in texts + ticks:
            e = t.get_window_extent(renderer)
            assert box.x0 <= e.x0 and e.x1 <= box.x1 and box.y0 <= e.y0 and e.y1 <= box.y1, t.get_text()
        rotation = ticks[0].get_rotation()
        if rotation == 0.0:
            spans = sorted((t.get_window_extent(renderer) for t in ticks), key=lambda e: e.x0)
            assert all(a.x1 <= b.x0 for a, b in zip(spans, spans[1:]))
        else:  # turned labels: parallel lines one tick apart must be at least a text height apart
            step = ax.transData.transform((1, 0))[0] - ax.transData.transform((0, 0))[0]
            height = ticks[0].get_fontsize() * fig.dpi / 72.0
            assert step * math.sin(math.radians(rotation)) >= height
    boxes = [t.get_window_extent(renderer) for t in titles]
    assert not any(a.overlaps(b) for i, a in enumerate(boxes) for b in boxes[i + 1:])


def test_a_wide_short_figure_puts_the_panels_side_by_side_with_one_title_size(year):
    # the window docks the chart under its charts: about 900 × 225 px at 1280 × 800
    fig = Figure(figsize=(9.0, 2.25), dpi=100)
    FigureCanvasAgg(fig)
    draw_year_chart(fig, year)
    fig.canvas.draw()
    boxes = [ax.get_window_extent() for ax in fig.axes]
    assert all(a.x1 < b.x0 for a, b in zip(boxes, boxes[1:]))  # left to right, in one row
    assert min(b.height for b in boxes) >= 100
    sizes = {t.get_fontsize() for ax in fig.axes for t in _title_texts(ax)}
    assert len(sizes) == 1
    row = draw_year_chart(_fig(), year, side_by_side=True)  # the caller may choose (a 7 × 6 in figure)
    row.canvas.draw()
    assert len({round(ax.get_window_extent().y0) for ax in row.axes}) == 1


def test_fitting_keeps_the_words_and_gives_them_back_when_wide(year):
    fig = Figure(figsize=(3.2, 2.0), dpi=100)
    FigureCanvasAgg(fig)
    draw_year_chart(fig, year)
    full = [ax.get_title(loc="left") for ax in fig.axes]
    assert full[0].startswith("Energy per bin (year: ") and "\n" not in full[0]
    fig.canvas.draw()
    narrow = [ax.get_title(loc="left") for ax in fig.axes]
    assert [" ".join(t.split()) for t in narrow] == full  # same words, at most other line breaks
    fig.set_size_inches(9.0, 6.0)
    fig.canvas.draw()
    assert [ax.get_title(loc="left") for ax in fig.axes] == full
    assert fig.axes[-1].get_xticklabels()[0].get_rotation() == 0.0


@pytest.mark.parametrize("system", ["SI", "US"])
@pytest.mark.parametrize("size_px", [(360, 170), (540, 180), (360, 208), (900, 225), (520, 420), (1170, 280)])
def test_the_worst_bin_is_named_clear_of_the_month_labels(year, system, size_px):
    # layout check (common practice, no source): in a short panel the name of the worst month sat
    # on the month labels; at every size it is on the chart and no text overlaps a month label
    from matplotlib.text import Text
    w, h = size_px
    fig = Figure(figsize=(w / 100, h / 100), dpi=100)
    FigureCanvasAgg(fig)
    draw_year_chart(fig, year, system)
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    ticks = [t for ax in fig.axes for t in ax.get_xticklabels() if t.get_visible() and t.get_text()]
    texts = [t for t in fig.findobj(Text) if t.get_visible() and t.get_text() and t not in ticks]
    worst = year["worst_discharge_temperature"]["bin"]
    assert any(f"worst: {worst}" in " ".join(t.get_text().split()) for t in texts)
    tick_boxes = [t.get_window_extent(renderer) for t in ticks]
    for t in texts:
        box = t.get_window_extent(renderer)
        assert not any(box.overlaps(b) for b in tick_boxes), (t.get_text(), size_px)


def _hourly(year):
    """The twelve months' figures spread over 8760 hours named by their time (as an imported
    hourly year is), January's condensate marked as freezing."""
    from datetime import datetime, timedelta
    start, bins = datetime(2025, 1, 1), []
    for h in range(8760):
        t = start + timedelta(hours=h)
        month = dict(year["bins"][t.month - 1])
        month.update(label=f"{t:%Y-%m-%d %H:%M}", hours=1.0, energy_kWh=month["energy_kWh"] / month["hours"],
                     condensate_m3=month["condensate_m3"] / month["hours"], freezing_condensate=t.month == 1)
        bins.append(month)
    return {**year, "bins": bins}


def test_an_hourly_year_is_drawn_as_areas_with_month_ticks_and_its_freezing_hours_marked(year):
    # 8760 bars and markers would run together into a band, and 8760 labels cannot be read
    hourly = _hourly(year)
    fig = Figure(figsize=(9, 2.4), dpi=100)
    FigureCanvasAgg(fig)
    draw_year_chart(fig, hourly, side_by_side=True, dryer=True)
    assert not _patches(fig, "year-energy-") and not _patches(fig, "year-condensate-")
    areas = {c.get_gid(): c for ax in fig.axes for c in ax.collections}
    assert {"year-energy", "year-condensate", "year-freezing"} <= set(areas)
    tops = areas["year-energy"].get_paths()[0].vertices[:, 1]
    assert tops.max() == pytest.approx(max(b["energy_kWh"] for b in hourly["bins"]), rel=1e-9)
    for ax in fig.axes:
        assert [t.get_text() for t in ax.get_xticklabels()] == ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul",
                                                               "Aug", "Sep", "Oct", "Nov", "Dec"]
    (line,) = [ln for ax in fig.axes for ln in ax.get_lines() if ln.get_gid() == "year-discharge"]
    assert len(line.get_xdata()) == 8760 and line.get_marker() in ("None", "none", None)
    assert "Energy per hour" in fig.axes[0].get_title(loc="left")
