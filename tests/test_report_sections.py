"""Issue 17 item 4: everything the window knows goes into the report — the year at the site,
heat recovery and the coolers' exchanger figures (the staging study run in the window is checked
in test_export_ops.py).

Printed figures are compared with ``stagewright year --json`` and ``solve --json`` at the printed
precision; unit factors written out from their definitions (NIST SP 811, 2008 edition, Appendix B:
1 kW = 1e3 W, 1 kWh = 3.6e6 J, t/°C = T/K − 273.15), not taken from stagewright.gui.presentation.units.
"""
from __future__ import annotations

import json
import re

import pypdf
import pytest

from stagewright.gui.cli.main import main
from stagewright.gui.report.pdf import lay_out
from stagewright.gui.report.sections import ReportInfo
from conftest import SAMPLES
from stagewright.core import solve
from stagewright.core.project import load

FOUNDRY = SAMPLES / "three_stage_site_year.json"


def _json(capsys, *argv) -> dict:
    assert main([*argv, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


@pytest.fixture(scope="module")
def foundry_text(sample_reports) -> str:
    return "\n".join(p.extract_text() for p in pypdf.PdfReader(str(sample_reports[FOUNDRY][0])).pages)


def _number(text: str) -> float:
    return float(text.replace(" ", ""))


def test_the_year_is_printed_month_by_month(foundry_text, capsys):
    year = _json(capsys, "year", str(FOUNDRY))
    text = foundry_text
    assert "A year at the site" in text and "Month by month" in text
    assert "Energy per bin" in text and "Highest discharge temperature" in text  # the year chart's panels
    for b in year["bins"]:
        # bin, T [°C], RH [%], hours, driver power [kW], energy [kWh, grouped by thousands]
        m = re.search(rf"^{b['label']} (-?[\d.]+) ([\d.]+) (\d+) ([\d.]+) (\d{{1,3}}(?: \d{{3}})*) (\d+\.\d\d) ", text,
                      re.M)
        assert m, b["label"]
        assert abs(float(m.group(1)) - (b["temperature_K"] - 273.15)) <= 0.005
        assert abs(float(m.group(2)) - 100.0 * b["relative_humidity"]) <= 0.005
        assert abs(int(m.group(3)) - b["hours"]) <= 0.5
        assert abs(float(m.group(4)) - b["driver_power_W"] / 1e3) <= 0.005
        assert abs(_number(m.group(5)) - b["energy_kWh"]) <= 0.5
        assert abs(float(m.group(6)) - (b["max_discharge_temperature_K"] - 273.15)) <= 0.005
    t = year["totals"]
    m = re.search(r"^Energy ([\d ]+) kWh$", text, re.M)
    assert m and abs(_number(m.group(1)) - t["energy_kWh"]) <= 0.5
    m = re.search(r"^Net cost (\d{1,3}(?: \d{3})*)$", text, re.M)  # money in whole units, grouped
    assert m and abs(_number(m.group(1)) - t["cost"]) <= 0.5
    m = re.search(r"^Cooling water ([\d .]+) m³$", text, re.M)
    assert m and abs(_number(m.group(1)) - t["cooling_water_m3"]) <= 0.05
    worst = year["worst_discharge_temperature"]
    m = re.search(r"^Worst discharge temperature ([\d.]+) °C \((\w+)\)$", text, re.M)
    assert m and m.group(2) == worst["bin"]
    assert abs(float(m.group(1)) - (worst["temperature_K"] - 273.15)) <= 0.05


def test_heat_recovery_is_printed(foundry_text, capsys):
    r = _json(capsys, "solve", str(FOUNDRY))
    rec = r["heat_recovery"]
    text = foundry_text
    assert "Heat recovery" in text and "Recoverable heat by stage" in text
    m = re.search(r"^Delivery temperature ([\d.]+) °C$", text, re.M)
    assert m and abs(float(m.group(1)) - (rec["delivery_temperature_K"] - 273.15)) <= 0.005
    m = re.search(r"^Heat per year ([\d ]+) kWh$", text, re.M)
    assert m and abs(_number(m.group(1)) - rec["heat_per_year_kWh"]) <= 0.5
    m = re.search(r"^Share of driver input power ([\d.]+) %$", text, re.M)
    assert m and abs(float(m.group(1)) - 100.0 * rec["share_of_driver_input"]) <= 0.005
    for i, (cooler, casing) in enumerate(zip(rec["coolers_W"], rec["casings_W"]), 1):
        m = re.search(rf"^{i} ([\d.]+) ([\d.]+)$", text, re.M)
        assert m and abs(float(m.group(1)) - cooler / 1e3) <= 0.005 and abs(float(m.group(2)) - casing / 1e3) <= 0.005


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.json")), ids=lambda p: p.stem)
def test_year_and_recovery_only_where_the_project_has_them(path, sample_reports):
    doc = load(path)
    text = "\n".join(p.extract_text() for p in pypdf.PdfReader(str(sample_reports[path][0])).pages)
    assert ("A year at the site" in text) == bool(doc.get("year"))
    assert ("Recoverable heat by stage" in text) == bool(doc.get("heat_recovery"))


def _page_texts(pager) -> str:
    return "\n".join(t.get_text() for fig in pager.pages for t in fig.texts)


def test_a_year_that_cannot_be_computed_is_said_in_words():
    doc = load(FOUNDRY)
    p = lay_out(doc, solve(doc).to_dict(), ReportInfo("x.json", "2024-01-01", "0", "SI"),
                year_problem="year.profile.months[3].temperature_K: no such thing")
    text = _page_texts(p)
    assert "A year at the site" in text and "could not be computed" in text
    assert "no such thing" in text.replace("\n", " ")


def test_a_year_given_by_the_caller_is_printed_as_given(tmp_path, monkeypatch):
    # the window may pass the year it already has: export_report then does not run it again
    import stagewright.gui.report
    import stagewright.core.year

    doc = load(FOUNDRY)
    year = stagewright.core.year.run_year(doc).to_dict()
    monkeypatch.setattr(stagewright.core.year, "run_year", lambda *_a, **_k: pytest.fail("year run again"))
    written = {}
    monkeypatch.setattr(stagewright.gui.report, "write_pdf", lambda *a, **kw: written.update(kw) or 1)  # no PDF needed here
    stagewright.gui.report.export_report(doc, solve(doc), tmp_path / "y.pdf", year=year)
    assert written["year"] is year and written["year_problem"] == ""
