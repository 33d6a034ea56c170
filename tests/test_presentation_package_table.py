"""The package's presentation rows (app/presentation/package_table.py): every output — window,
text, PDF, CSV — shows the figures ``stagewright solve --json`` gives, in the chosen units.

Check kinds: the shown numbers against the solver's SI values converted with unit factors written
out from their definitions (NIST SP 811, 2008 edition, Appendix B: 1 kW = 1000 W, 1 hp =
745.69987158 W, 1 ft = 0.3048 m exactly; 1 kW/(m³/min) = 60 000 J/m³ by the definition of the
minute). The project is the invented sample ``two_stage_plant_air.json``.
"""
from __future__ import annotations

import csv
import io
import json

import pytest

from stagewright.gui.cli.main import main
from stagewright.gui.presentation import package_table as pt
from conftest import SAMPLES
from stagewright.core.project import load

SAMPLE = SAMPLES / "two_stage_plant_air.json"
HP = 745.69987158  # W (NIST SP 811)
FT3 = 0.3048 ** 3  # m³
#: display value of an SI figure, per (quantity, system), written out from the definitions
FROM_SI = {
    ("power", "SI"): lambda w: w / 1e3, ("power", "US"): lambda w: w / HP,
    ("volume_flow", "SI"): lambda q: q * 60.0, ("volume_flow", "US"): lambda q: q * 60.0 / FT3,
    ("specific_power", "SI"): lambda e: e / 60_000.0,
    ("specific_power", "US"): lambda e: e / 60_000.0 * 100.0 * FT3,  # kW per 100 cfm
    ("fraction", "SI"): lambda x: 100.0 * x, ("fraction", "US"): lambda x: 100.0 * x,
}


@pytest.fixture(scope="module")
def solved(tmp_path_factory) -> dict:
    """``stagewright solve --json`` of the sample, as a user would get it."""
    import contextlib
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        assert main(["solve", str(SAMPLE), "--json"]) == 0
    return json.loads(out.getvalue())[0]["result"]  # one list, an entry per file


def _number(text: str) -> float:
    return float(text.replace(" ", "").replace("\u2009", ""))


@pytest.mark.parametrize("system", ["SI", "US"])
@pytest.mark.parametrize("output", ["window", "text", "pdf"])
def test_point_rows_show_the_solved_figures(solved, output, system):
    pkg = solved["package"]
    rows = {r[0]: r for r in pt.point_rows(pkg, output, system)}
    cols = [pkg["full_load"], pkg["at_load"]]
    checks = {"Free air delivered": ("delivered_fad_m3_s", "volume_flow"),
              "Package input": ("package_power_W", "power"), "Driver input": ("driver_power_W", "power"),
              "Other loads": ("other_power_W", "power"),
              "Package specific power": ("package_specific_power_J_m3", "specific_power")}
    for label, (key, quantity) in checks.items():
        row = rows[label]
        for cell, point in zip(row[2:], cols):
            want = FROM_SI[(quantity, system)](point[key])
            decimals = len(cell.split(".")[1]) if "." in cell else 0
            assert _number(cell) == pytest.approx(want, abs=0.51 * 10 ** -decimals), (label, cell)
    # what the sample has nothing for is left out: no fans, no pump, no drive, no starts
    assert not {"Cooler fans", "Coolant pump", "of which drive loss", "Motor starts per hour"} & set(rows)
    assert rows["Load cycles per hour"][3] == f"{pkg['at_load']['cycles_per_hour']:.1f}"


def test_the_stated_load_column_is_the_projects_load(solved):
    assert pt.point_columns(solved["package"])[1][0] == "Stated load 70 %"
    assert solved["package"]["at_load"]["demand_fraction"] == load(SAMPLE)["package"]["load"]


def test_annual_rows_show_the_load_profile_year(solved):
    annual = solved["package"]["annual"]
    rows = dict(pt.annual_rows(solved["package"], "window", "SI"))
    assert _number(rows["Package energy"].removesuffix(" kWh")) == pytest.approx(annual["energy_kWh"], abs=0.5)
    assert _number(rows["Hours in the load profile"].removesuffix(" h")) == 6500.0
    extra = (annual["energy_kWh"] - annual["ideal_energy_kWh"]) / annual["energy_kWh"]
    assert rows["Part-load extra share"] == f"{100 * extra:.1f} %"
    # the hand sum of the profile: 2000 + 3000 + 1500 h (sample_projects/two_stage_plant_air.json)
    assert annual["hours"] == 6500.0


def test_text_output_of_solve_has_the_package_rows(solved, capsys):
    assert main(["solve", str(SAMPLE)]) == 0
    text = capsys.readouterr().out
    assert pt.control_line(solved["package"]) in text
    block = text.split(pt.control_line(solved["package"]))[1].splitlines()
    for row in pt.point_rows(solved["package"], "text"):
        line = next(ln for ln in block if ln.lower().startswith(row[0].lower()))
        assert line.split()[-2:] == row[-2:]


@pytest.mark.parametrize("system", ["SI", "US"])
def test_csv_package_rows_convert_back_to_the_solved_figures(solved, system):
    from stagewright.gui.report.csv_export import csv_rows
    header, *body = csv_rows(solved, system)  # one header row: the unit in each column name
    rows = {r[1]: dict(zip(header, r)) for r in body if r[0] == "package"}
    assert list(rows) == ["Full load", "Stated load 70 %", "Part load 100 %", "Part load 75 %", "Part load 50 %"]
    at = solved["package"]["at_load"]
    stated = rows["Stated load 70 %"]
    power = "package_input_kW" if system == "SI" else "package_input_hp"
    specific = "package_specific_power_kW_m3_min" if system == "SI" else "package_specific_power_kW_100cfm"
    assert float(stated[power]) == pytest.approx(FROM_SI[("power", system)](at["package_power_W"]), rel=1e-11)
    assert float(stated[specific]) == pytest.approx(
        FROM_SI[("specific_power", system)](at["package_specific_power_J_m3"]), rel=1e-11)
    assert float(stated["demand_percent"]) == pytest.approx(70.0, rel=1e-12)
    year = next(dict(zip(header, r)) for r in body if r[0] == "package_year")
    assert float(year["package_energy_kWh"]) == pytest.approx(solved["package"]["annual"]["energy_kWh"], rel=1e-11)


def test_csv_of_a_project_without_package_keeps_its_columns():
    from stagewright.gui.report.csv_export import COLUMNS, csv_rows
    from stagewright.core import solve
    doc = load(SAMPLE)
    del doc["package"]
    header = csv_rows(solve(doc).to_dict())[0]
    assert header == [name for name, _ in COLUMNS]


def test_sheet_rows_are_the_data_sheet_figures():
    from stagewright.core.part_load.data_sheet import data_sheet
    sheet = data_sheet(load(SAMPLE)).to_dict()
    rows = pt.sheet_rows(sheet, "pdf", "US")
    ref, site = sheet["columns"]
    assert [r[1] for r in rows[:2]] == ["ISO 1217 reference", "Site"]
    assert len(rows) == 2 * len(ref["points"])
    for i, (a, b) in enumerate(zip(ref["points"], site["points"])):
        for row, point in ((rows[2 * i], a), (rows[2 * i + 1], b)):
            assert _number(row[2]) == pytest.approx(FROM_SI[("volume_flow", "US")](point["delivered_fad_m3_s"]),
                                                    abs=0.051)
            assert _number(row[3]) == pytest.approx(FROM_SI[("power", "US")](point["package_power_W"]), abs=0.0051)
            assert _number(row[4]) == pytest.approx(
                FROM_SI[("specific_power", "US")](point["package_specific_power_J_m3"]), abs=0.0051)
    conditions = {r[0]: r[1:] for r in pt.sheet_condition_rows(sheet, "pdf", "SI")}
    assert conditions["Inlet pressure"][0] == "1.000 bar(a)"  # ISO 1217 reference: 100 kPa
    assert conditions["Inlet temperature"][0] == "20.0 °C"


def test_report_prints_the_package_section_only_with_a_package(tmp_path):
    import pypdf

    from stagewright.gui.report import export_report
    from stagewright.core import solve
    doc = load(SAMPLE)
    out = tmp_path / "with.pdf"
    export_report(doc, solve(doc), out, prepared_by="test")
    text = "\n".join(page.extract_text() for page in pypdf.PdfReader(out).pages)
    assert "Package and data sheet" in text and "Receiver and relief." in text
    assert "Automatic restart." not in text  # load/unload: the motor keeps running
    del doc["package"]
    export_report(doc, solve(doc), tmp_path / "without.pdf", prepared_by="test")
    text = "\n".join(page.extract_text() for page in pypdf.PdfReader(tmp_path / "without.pdf").pages)
    assert "Package and data sheet" not in text and "Data sheet" not in text
