"""Issue 17 items 3 and 6: the report's first page a client reads, no nearly empty pages, and
legends that stay clear of each other.

Figures on the first page are compared with ``solve --json`` at the printed precision; unit
factors are written out from their definitions (NIST SP 811, 2008 edition, Appendix B: 1 kW =
1e3 W, 1 m³/min = 1/60 m³/s, 1 m³/h = 1/3600 m³/s), not taken from stagewright.gui.presentation.units.
"""
from __future__ import annotations

import json
import re

import CoolProp
import pypdf
import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from stagewright.gui.charts import draw_power_split
from stagewright.gui.cli.main import main
from stagewright.gui.document.messages import warning_text
from stagewright.gui.report.pdf import lay_out
from stagewright.gui.report.sections import ReportInfo
from conftest import SAMPLES
from stagewright.core import solve
from stagewright.core.project import load

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))


def _first_page(pdf) -> str:
    return pypdf.PdfReader(str(pdf)).pages[0].extract_text()


def _near(text: str, label: str, unit: str, expected: float) -> None:
    """``label value unit`` is printed on one line of ``text`` and is ``expected`` at its precision."""
    m = re.search(rf"(?:^| ){re.escape(label)} (-?[\d ]*\d(?:\.(\d+))?) {re.escape(unit)}(?: |$)", text, re.M)
    assert m, f"{label!r} not on the first page"
    decimals = len(m.group(2) or "")
    assert abs(float(m.group(1).replace(" ", "")) - expected) <= 0.5 * 10.0 ** -decimals * (1 + 1e-9), label


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_first_page_has_the_answer(path, sample_reports, capsys):
    assert main(["solve", str(path), "--json"]) == 0
    r = json.loads(capsys.readouterr().out)
    page = _first_page(sample_reports[path][0])
    flat = " ".join(page.split())
    doc = load(path)
    assert " ".join(doc["title"].split()) in flat
    assert f"Stagewright 0.1.0, CoolProp {CoolProp.__version__}" in flat
    assert "Prepared by" in page and path.name in page and "Site and duty" in page
    _near(page, "Driver input power", "kW", r["driver_power_W"] / 1e3)
    _near(page, "Shaft power", "kW", r["shaft_power_W"] / 1e3)
    _near(page, "Specific power", "kW/(m³/min)", r["specific_power_kW_per_m3_min"])
    _near(page, "Free air delivery", "m³/min", r["free_air_delivery_m3_s"] * 60.0)
    _near(page, "Heat rejected", "kW", r["heat_rejected_W"] / 1e3)
    if r["intake_humidity_ratio"] > 0.0:
        _near(page, "Condensate drained", "kg/h", r["condensate_kg_s"] * 3600.0)
        _near(page, "Condensate volume", "L/h", r["condensate_L_h"])
        _near(page, "Pressure dew point", "°C", r["delivered_pressure_dew_point_K"] - 273.15)
        assert f"ISO 8573-1 humidity class {r['iso8573_humidity_class']}" in page
    else:
        assert "Pressure dew point" not in page and "dry air" in page
    if r["cooling_water_m3_s"] is not None:
        _near(page, "Cooling water", "m³/h", r["cooling_water_m3_s"] * 3600.0)
    if r["recoverable_heat_W"] is not None:
        _near(page, "Recoverable heat", "kW", r["recoverable_heat_W"] / 1e3)
    # each cooler's duty in the stage and cooler table
    for i, st in enumerate(r["stages"], 1):
        if st["cooler"]:
            m = re.search(rf"^Cooler {i} .*?{st['cooler']['duty_W'] / 1e3:.2f}", page, re.M)
            assert m, f"cooler {i} duty"
    # the warnings, or that there are none, are on the first page
    assert "Warnings" in page
    for w in r["warnings"]:  # in display units and words, as the window's Messages shows them
        assert " ".join(warning_text(w, doc, "SI").split()[:6]) in flat


def test_prepared_by_is_printed(tmp_path, monkeypatch):
    import stagewright.gui.report

    infos = []
    monkeypatch.setattr(stagewright.gui.report, "write_pdf", lambda doc, result, path, info, **kw: infos.append(info) or 1)
    path = SAMPLES / "single_stage_workshop.json"
    assert main(["report", str(path), "-o", str(tmp_path / "r.pdf"), "--prepared-by", "A. Designer, Example Ltd"]) == 0
    assert main(["report", str(path), "-o", str(tmp_path / "r.pdf")]) == 0
    assert [i.prepared_by for i in infos] == ["A. Designer, Example Ltd", stagewright.gui.report.account_name()]
    doc = load(path)
    p = lay_out(doc, solve(doc).to_dict(), infos[0])
    first = "\n".join(t.get_text() for t in p.pages[0].texts)
    assert "Prepared by" in first and "A. Designer, Example Ltd" in first


def _page_fill(page) -> float:
    """Share of a PDF page's body (between the running header and the footer) that its text reaches down to."""
    height = float(page.mediabox.height)
    top, bottom = height - 0.85 * 72.0, 0.8 * 72.0  # the report's margins (stagewright.gui.report.layout), [pt]
    lowest = [top]

    def visit(text, cm, tm, font, size):
        y = tm[5] * cm[3] + cm[5]  # baseline in page space (no rotation or skew in these reports)
        if text.strip() and bottom - 1.0 <= y <= top:
            lowest.append(y)

    page.extract_text(visitor_text=visit)
    return (top - min(lowest)) / (top - bottom)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_no_page_between_the_first_and_the_last_is_nearly_empty(path, sample_reports):
    # the first page is the summary (a page of its own) and the last ends the report; any other
    # page whose text ends above the middle of its body wastes paper (issue 17: a three-stage
    # report's page 3 held six rows of a table). Threshold: common practice, no source.
    pages = pypdf.PdfReader(str(sample_reports[path][0])).pages
    fills = [_page_fill(page) for page in pages]
    assert all(f >= 0.5 for f in fills[1:-1]), fills


def test_the_pager_measures_what_each_page_uses():
    doc = load(SAMPLES / "three_stage_site_year.json")
    p = lay_out(doc, solve(doc).to_dict(), ReportInfo("x.json", "2024-01-01", "0", "SI"))
    p.finish()
    assert len(p.page_fill) == len(p.pages) and all(0.0 < f <= 1.0 for f in p.page_fill)


def _extent(artist, renderer):
    return artist.get_window_extent(renderer)


@pytest.mark.parametrize("size", [(6.7, 3.9), (6.7, 4.6), (9.0, 3.2), (5.0, 4.0)])
def test_power_split_legends_clear_each_other_and_the_axis_labels(size):
    # the foundry sample drains condensate: the exergy legend has its longest entry
    r = solve(load(SAMPLES / "three_stage_site_year.json")).to_dict()
    fig = Figure(figsize=size)
    FigureCanvasAgg(fig)
    draw_power_split(fig, r)
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    legends = [ax.get_legend() for ax in fig.axes if ax.get_legend() is not None]
    assert len(legends) == 2
    texts = [t.get_text() for t in legends[0].get_texts()]
    assert "out with drained condensate" in texts
    a, b = (_extent(leg, renderer) for leg in legends)
    assert not a.overlaps(b) and a.x1 <= b.x0, (a, b)  # side by side, the exergy legend on the left
    exergy_ax, heat_ax = fig.axes[0], fig.axes[1]
    for ax, leg in ((exergy_ax, a), (heat_ax, b)):
        label = _extent(ax.xaxis.label, renderer)
        assert leg.y1 <= label.y0 + 0.5, "legend runs into the x label"
