"""PDF and CSV reports: what the PDF prints equals what ``stagewright solve`` computes.

The PDF is read back with pypdf (a general-purpose PDF library) and the printed figures are
compared with the JSON results of the ``solve`` sub-command at the printed precision. Unit
conversions in these checks are written out from their exact definitions (NIST SP 811, 2008
edition, Appendix B: 1 hp = 745.69987158 W, 1 Btu(IT) = 1055.05585262 J,
1 psi = 6894.757293168 Pa, t/°F = 1.8·T/K − 459.67), not taken from stagewright.gui.presentation.units.
"""
from __future__ import annotations

import csv
import io
import json
import re

import pypdf
import pytest

from stagewright.gui.presentation import units
from stagewright.gui.presentation.cautions import CAUTIONS, DEFERRAL
from stagewright.gui.document.messages import limit_sentence, warning_text
from stagewright.gui.document.field_specs import describe
from stagewright.gui.cli.main import main
from stagewright.gui.cli.progress import Progress
from stagewright.gui.report import csv_rows, export_report
from stagewright.gui.report.csv_export import COLUMNS
from stagewright.gui.report.layout import Column, Pager, Table
from stagewright.gui.report.sections import state_points
from conftest import SAMPLES, make_doc
from stagewright.core import InputError, solve
from stagewright.core.project import load

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))
HP, BTU, PSI = 745.69987158, 1055.05585262, 6894.757293168


def _solve_json(path, capsys) -> dict:
    assert main(["solve", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def _pdf_text(path) -> tuple[str, list[str]]:
    pages = [p.extract_text() for p in pypdf.PdfReader(str(path)).pages]
    return "\n".join(pages), pages


def _printed(text: str, label: str, unit: str = "") -> tuple[float, int]:
    """The number printed after ``label`` on its own line, and its number of decimals."""
    m = re.search(rf"^{re.escape(label)} (-?[\d ]+(?:\.(\d+))?)\s*{re.escape(unit)}\s*$", text, re.M)
    assert m, f"{label!r} not printed"
    return float(m.group(1).replace(" ", "")), len(m.group(2) or "")


def _same_at_printed_precision(text, label, unit, expected):
    value, decimals = _printed(text, label, unit)
    assert abs(value - expected) <= 0.5 * 10.0 ** -decimals * (1 + 1e-9), (label, value, expected)


def _flat(s: str) -> str:
    return " ".join(s.split())


@pytest.fixture(scope="module")
def si_reports(sample_reports):
    return sample_reports


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_pdf_totals_equal_solve_results(path, si_reports, capsys):
    r = _solve_json(path, capsys)
    text, pages = _pdf_text(si_reports[path][0])
    _same_at_printed_precision(text, "Mass flow", "kg/s", r["mass_flow_kg_s"])
    _same_at_printed_precision(text, "Free air delivery", "m³/min", r["free_air_delivery_m3_s"] * 60.0)
    _same_at_printed_precision(text, "Shaft power", "kW", r["shaft_power_W"] / 1e3)
    _same_at_printed_precision(text, "Driver input power", "kW", r["driver_power_W"] / 1e3)
    _same_at_printed_precision(text, "Specific power", "kW/(m³/min)", r["specific_power_kW_per_m3_min"])
    _same_at_printed_precision(text, "Heat rejected", "kW", r["heat_rejected_W"] / 1e3)
    _same_at_printed_precision(text, "Isothermal efficiency", "%", r["isothermal_efficiency"] * 100.0)
    _same_at_printed_precision(text, "Second-law efficiency", "%", r["second_law_efficiency"] * 100.0)
    _same_at_printed_precision(text, "Exergy destroyed", "kW", r["exergy_destroyed_W"] / 1e3)
    _same_at_printed_precision(text, "Entropy generation", "W/K", r["entropy_generation_W_K"])
    for label, key in (("Energy balance closure", "energy_residual"), ("Exergy balance closure", "exergy_residual")):
        m = re.search(rf"^{label} (-?\d\.\d\de[-+]\d+)$", text, re.M)
        assert m and abs(float(m.group(1)) - r[key]) <= 0.005 * abs(r[key]) + 1e-15
    # every stage: discharge temperature in the state table, shaft power in the component table
    for i, st in enumerate(r["stages"], 1):
        m = re.search(rf"^Stage {i} discharge (-?[\d.]+) ", text, re.M)
        assert m and abs(float(m.group(1)) - (st["outlet"]["temperature_K"] - 273.15)) <= 0.005
        m = re.search(rf"^Stage {i}  \(r = ([\d.]+)\) ([\d .]+?\.\d\d) ", text, re.M)
        assert m and abs(float(m.group(1)) - st["pressure_ratio"]) <= 5e-5
        assert abs(float(m.group(2).replace(" ", "")) - st["shaft_power_W"] / 1e3) <= 0.005
    # page numbers on every page
    for k, page in enumerate(pages, 1):
        assert f"Page {k} of {len(pages)}" in page


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_pdf_title_block_charts_and_cautions(path, si_reports, capsys):
    r = _solve_json(path, capsys)
    doc = load(path)
    text, pages = _pdf_text(si_reports[path][0])
    flat = _flat(text)
    assert _flat(doc.get("title", "")) in flat
    assert path.name in flat and "Stagewright 0.1.0" in flat
    assert _flat(r["eos_reference"]) in flat
    assert "Temperature–entropy path" in text and "Where the shaft power goes" in text
    for title, body in CAUTIONS:
        assert f"{title}." in flat and _flat(body) in flat
    assert _flat(DEFERRAL) in flat
    assert "Staging comparison" not in text  # no study was run


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_negative_heat_exergy_is_explained_in_the_report(path, si_reports, capsys):
    # heat rejected below the ambient temperature carries negative exergy, Q(1 − T0/Tb) < 0
    # (Bejan, Tsatsaronis & Moran, Thermal Design and Optimization, 1996, §3.2): the report says
    # so where the figure is negative, and only there
    from stagewright.gui.presentation.result_notes import NEGATIVE_TIPS
    r = _solve_json(path, capsys)
    flat = _flat(_pdf_text(si_reports[path][0])[0])
    note = _flat(NEGATIVE_TIPS["heat_exergy_W"])[1:]  # the report lower-cases its first letter
    assert (note in flat) == (r["heat_exergy_W"] < 0.0)


def test_us_report_prints_us_units(tmp_path, capsys):
    path = SAMPLE_FILES[0]
    r = _solve_json(path, capsys)
    pdf = tmp_path / "us.pdf"
    assert main(["report", str(path), "-o", str(pdf), "--units", "US"]) == 0
    text, _ = _pdf_text(pdf)
    _same_at_printed_precision(text, "Shaft power", "hp", r["shaft_power_W"] / HP)
    _same_at_printed_precision(text, "Heat rejected", "Btu/h", r["heat_rejected_W"] / (BTU / 3600.0))
    m = re.search(r"^Stage 1 discharge (-?[\d.]+) (-?[\d.]+) ", text, re.M)
    assert abs(float(m.group(1)) - (1.8 * r["stages"][0]["outlet"]["temperature_K"] - 459.67)) <= 0.05
    assert abs(float(m.group(2)) - r["stages"][0]["outlet"]["pressure_Pa"] / PSI) <= 0.005
    assert "Display units US customary" in text
    assert pypdf.PdfReader(str(pdf)).pages[0].mediabox.width == pytest.approx(8.5 * 72)  # US Letter


def test_csv_parses_and_round_trips(si_reports):
    path = SAMPLE_FILES[0]
    result = solve(load(path)).to_dict()
    with open(si_reports[path][1], newline="", encoding="utf-8") as fh:
        rows = list(csv.reader(fh))
    header, unit_row, body = rows[0], rows[1], rows[2:]
    assert header == [c for c, _ in COLUMNS]
    assert unit_row[header.index("temperature")] == "°C" and unit_row[header.index("shaft_power")] == "kW"
    states = [r for r in body if r[0] == "state"]
    points = state_points(result)
    assert [r[1] for r in states] == [name for name, _ in points]
    q = dict(COLUMNS)
    for row, (_, pt) in zip(states, points):
        for col, key in (("temperature", "temperature_K"), ("pressure", "pressure_Pa"),
                         ("enthalpy", "enthalpy_J_kg"), ("entropy", "entropy_J_kgK")):
            back = units.to_si(float(row[header.index(col)]), q[col], "SI")
            assert back == pytest.approx(pt[key], rel=1e-11)
    comps = {r[1]: r for r in body if r[0] == "component"}
    n_cool = sum(1 for st in result["stages"] if st["cooler"])
    assert len(comps) == 1 + len(result["stages"]) + n_cool
    st1 = result["stages"][0]
    assert float(comps["Stage 1"][header.index("shaft_power")]) * 1e3 == pytest.approx(st1["shaft_power_W"], rel=1e-11)
    train = [r for r in body if r[0] == "train"][0]
    assert float(train[header.index("exergy_destroyed")]) * 1e3 == pytest.approx(result["exergy_destroyed_W"],
                                                                                 rel=1e-11)
    assert comps["Intake filter"][header.index("shaft_power")] == ""  # missing values stay empty


def test_csv_in_us_units_uses_exact_conversions():
    result = solve(load(SAMPLE_FILES[0])).to_dict()
    rows = csv_rows(result, "US")
    header = rows[0]
    reader = list(csv.reader(io.StringIO("\r\n".join(",".join(r) for r in rows))))
    train = [r for r in reader if r[0] == "train"][0]
    assert float(train[header.index("shaft_power")]) == pytest.approx(result["shaft_power_W"] / HP, rel=1e-11)
    intake = [r for r in reader if r[0] == "state"][0]
    assert float(intake[header.index("temperature")]) == pytest.approx(1.8 * result["intake"]["temperature_K"] - 459.67,
                                                                       rel=1e-11)


def test_warnings_and_staging_rows_are_printed(tmp_path):
    doc = make_doc(stages=2, title="Warned train")
    for st in doc["stages"]:
        st["max_discharge_temperature_K"] = 350.0  # far below the discharge: a warning per stage
    result = solve(doc)
    assert len(result.warnings) == 2
    # rows shaped like stagewright.core.study's staging comparison (binding limits, one shared note)
    rows = [dict(stages=1, driver_power_W=300e3, max_discharge_temperature_K=600.0, feasible=False,
                 pressure_ratios=[9.0], note="Each option repeats stage 1.",
                 binding_limits=[{"field": "stages[0].max_discharge_temperature_K", "status": "violated",
                                  "message": "discharge above its limit"}]),
            dict(stages=2, driver_power_W=250e3, max_discharge_temperature_K=430.0, feasible=True,
                 pressure_ratios=[3.0, 3.0], note="Each option repeats stage 1.", binding_limits=[])]
    pdf = tmp_path / "w.pdf"
    n = export_report(doc, result, pdf, system="SI", source_name="warned.json", study_rows=rows, date="2024-05-06")
    text, pages = _pdf_text(pdf)
    assert len(pages) == n
    for w in result.to_dict()["warnings"]:  # display units and the field's name (issue 14 item 7)
        assert _flat(warning_text(w, doc, "SI")) in _flat(text)
        assert _flat(describe(w["field"], doc)) in _flat(text)
        assert w["message"] not in text and w["field"] not in text  # no kelvin, no key path
    assert "Staging comparison" in text and "discharge above its limit" in text.lower()
    assert re.search(r"^1 9\.000 300\.00 326\.85 no$", text, re.M)  # 300 kW, 600 K = 326.85 °C, infeasible
    assert "3.000 × 3.000" in text and text.count("Each option repeats stage 1.") == 1
    assert "Date 2024-05-06" in text


def test_tables_break_across_pages_and_repeat_their_header():
    p = Pager("A4", running_title="t", footer_left="f")
    rows = [[f"row {i}", f"{i * 1.5:.2f}"] for i in range(120)]
    p.table(Table("Long table", [Column("Name", align="left"), Column("Value", "kW")], rows))
    pages = p.finish()
    assert len(pages) >= 3
    texts = [[t.get_text() for t in fig.texts] for fig in pages]
    printed = [t for page in texts for t in page if t.startswith("row ")]
    assert printed == [r[0] for r in rows]  # every row once, in order
    assert "Long table" in texts[0] and all("Long table  (continued)" in page for page in texts[1:])
    assert all("Name" in page and "Value" in page for page in texts)
    assert [next(t for t in page if t.startswith("Page ")) for page in texts] == [
        f"Page {k} of {len(pages)}" for k in range(1, len(pages) + 1)]
    # nothing is printed into the bottom margin
    for fig in pages:
        for t in fig.texts:
            if t.get_text().startswith("row "):
                assert t.get_position()[1] * p.height > p.bottom - 1e-9


def test_export_rejects_an_unknown_unit_system(tmp_path):
    result = solve(load(SAMPLE_FILES[0]))
    with pytest.raises(InputError, match="units"):
        export_report(load(SAMPLE_FILES[0]), result, tmp_path / "x.pdf", system="metric")
    assert not list(tmp_path.iterdir())  # nothing half-written


def test_batch_report_keeps_going_and_exits_non_zero(tmp_path, capsys):
    bad = make_doc()
    bad["stages"][0]["efficiency"]["value"] = 1.5
    folder = tmp_path / "projects"
    folder.mkdir()
    (folder / "a_bad.json").write_text(json.dumps(bad))
    (folder / "b_broken.json").write_text("{not json")
    (folder / "c_good.json").write_text(SAMPLE_FILES[0].read_text(encoding="utf-8"))
    out = tmp_path / "reports"
    assert main(["report", str(folder), "-o", str(out), "--csv"]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 2 and "a_bad.json" in err[0] and "stages[0].efficiency.value" in err[0]
    assert "b_broken.json" in err[1] and "line 1" in err[1]
    assert sorted(p.name for p in out.iterdir()) == ["c_good.csv", "c_good.pdf"]


def test_batch_refuses_one_pdf_for_several_projects(tmp_path, capsys):
    assert main(["report", str(SAMPLE_FILES[0]), str(SAMPLE_FILES[0]), "-o", str(tmp_path / "x.pdf")]) == 2
    assert "folder" in capsys.readouterr().err


def test_progress_line_only_on_a_terminal():
    class Tty(io.StringIO):
        def isatty(self):
            return True

    tty = Tty()
    with Progress(3, stream=tty) as bar:
        bar.step("a.json")
        bar.message("a.json: bad")
        bar.step("b.json")
    out = tty.getvalue()
    assert "[1/3] a.json" in out and "[2/3] b.json" in out and "\na.json: bad\n".replace("\n", "", 1) in out
    assert out.endswith("\r\033[K")  # the progress line is cleared at the end
    plain = io.StringIO()
    with Progress(3, stream=plain) as bar:
        bar.step("a.json")
        bar.message("a.json: bad")
    assert plain.getvalue() == "a.json: bad\n"


def test_cooler_exchanger_figures_are_printed(tmp_path):
    doc = load(SAMPLE_FILES[0])
    doc["stages"][0]["cooler"]["coolant"] = {"kind": "water", "temperature_rise_K": 8.0}
    result = solve(doc).to_dict()
    c = result["stages"][0]["cooler"]
    pdf = tmp_path / "x.pdf"
    export_report(doc, result, pdf)
    text, _ = _pdf_text(pdf)
    assert "Cooler exchangers" in text and "water, rise 8.00 K" in text
    m = re.search(r"^Cooler 1 water ([\d.]+) ([\d.]+) ([\d.]+) ([\d.]+) ([\d.]+) ([\d.]+) ([\d.]+) ([\d.]+) "
                  r"([\d.]+)$", text, re.M)
    assert m, "exchanger row not printed"
    assert abs(float(m.group(1)) - c["coolant_flow_kg_s"]) <= 5e-5
    assert abs(float(m.group(3)) - (c["coolant_outlet_temperature_K"] - 273.15)) <= 0.005
    assert abs(float(m.group(8)) - c["ua_W_K"] / 1e3) <= 5e-4  # kW/K
    assert abs(float(m.group(9)) - c["cooling_water_m3_s"] * 3600.0) <= 0.005  # m³/h


def test_report_with_the_staging_study(tmp_path):
    """--stagings runs stagewright.core.study.compare_stagings; its rows are printed at printed precision."""
    from stagewright.core.study import compare_stagings

    path = SAMPLE_FILES[0]
    rows = compare_stagings(load(path), 3).rows()
    pdf = tmp_path / "s.pdf"
    assert main(["report", str(path), "-o", str(pdf), "--stagings", "3"]) == 0
    text, _ = _pdf_text(pdf)
    assert "Staging comparison" in text
    for r in rows:
        if r["driver_power_W"] is None:  # infeasible option (e.g. moist real gas beyond RP-1485's range)
            continue
        m = re.search(rf"^{r['stages']} [\d. ×]+? ([\d ]+\.\d\d) ", text, re.M)
        assert m and abs(float(m.group(1).replace(" ", "")) - r["driver_power_W"] / 1e3) <= 0.005
    for b in rows[0]["binding_limits"]:
        assert _flat(limit_sentence(b, None, "SI")) in _flat(text)


def test_the_inputs_say_which_basis_the_delivery_pressure_was_stated_in(tmp_path):
    gauge = make_doc(model="ideal_gas", P0=95_000.0)
    del gauge["discharge_pressure_Pa"]
    gauge["discharge_gauge_pressure_Pa"] = 8e5
    for doc, stated, other in ((gauge, "8.0000 bar(g) stated as gauge", "(= 8.9500 bar(a) at this site)"),
                               (make_doc(model="ideal_gas", P0=95_000.0, p_out=9e5),
                                "9.0000 bar(a) stated as absolute", "(= 8.0500 bar(g) at this site)")):
        pdf = tmp_path / "r.pdf"
        export_report(doc, solve(doc).to_dict(), pdf)
        text = _flat(_pdf_text(pdf)[0])
        assert f"Discharge pressure {stated} {other}" in text  # gauge = absolute − barometric
