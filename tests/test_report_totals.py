"""Issue 17 item 1: the water, cooling-water and heat-recovery totals reach every output.

Each figure printed in the PDF, the ``solve`` text table, the CSV and the window's balance sheet
equals the ``solve --json`` value at the printed precision. Unit factors are written out from
their exact definitions (NIST SP 811, 2008 edition, Appendix B: 1 US gallon = 3.785411784 L,
1 lb = 0.45359237 kg, 1 Btu(IT) = 1055.05585262 J, t/°F = 1.8·T/K − 459.67), not taken from
stagewright.gui.presentation.units.
"""
from __future__ import annotations

import csv
import json
import re

import pypdf
import pytest

from stagewright.gui.cli.main import main
from conftest import SAMPLES

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))
GAL, LB, BTU = 3.785411784e-3, 0.45359237, 1055.05585262

#: (label in the PDF, result key, SI → shown in SI units, unit in SI, → shown in US units, unit in US)
FIGURES = [
    ("Condensate", "condensate_kg_s", lambda v: v * 3600.0, "kg/h", lambda v: v * 3600.0 / LB, "lb/h"),
    ("Condensate volume", "condensate_L_h", lambda v: v, "L/h", lambda v: v * 1e-3 / GAL, "US gal/h"),
    ("Pressure dew point", "delivered_pressure_dew_point_K", lambda v: v - 273.15, "°C",
     lambda v: 1.8 * v - 459.67, "°F"),
    ("Atmospheric dew point", "delivered_atmospheric_dew_point_K", lambda v: v - 273.15, "°C",
     lambda v: 1.8 * v - 459.67, "°F"),
    ("Cooling water", "cooling_water_m3_s", lambda v: v * 3600.0, "m³/h", lambda v: v * 60.0 / GAL, "US gpm"),
    ("Recoverable heat", "recoverable_heat_W", lambda v: v / 1e3, "kW", lambda v: v * 3600.0 / BTU, "Btu/h"),
]


def _solve_json(path, capsys) -> dict:
    assert main(["solve", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def _number_after(text: str, label: str, unit: str) -> tuple[float, int] | None:
    m = re.search(rf"^{re.escape(label)} +(-?[\d ]*\d(?:\.(\d+))?) ?{re.escape(unit)}\s*$", text, re.M)
    return None if m is None else (float(m.group(1).replace(" ", "")), len(m.group(2) or ""))


def _check_figures(text: str, r: dict, system: str, lower_first: bool = False) -> int:
    """Every figure of FIGURES the result has is printed at its precision; returns how many were."""
    checked = 0
    for label, key, si_shown, si_unit, us_shown, us_unit in FIGURES:
        shown_label = label[0].lower() + label[1:] if lower_first else label
        unit, convert = (si_unit, si_shown) if system == "SI" else (us_unit, us_shown)
        found = _number_after(text, shown_label, unit)
        moist = r["intake_humidity_ratio"] > 0.0
        present = r[key] is not None and (moist or key in ("cooling_water_m3_s", "recoverable_heat_W"))
        if not present:
            assert found is None, (label, "printed for a result without it")
            continue
        assert found is not None, (label, unit, text)
        value, decimals = found
        assert abs(value - convert(r[key])) <= 0.5 * 10.0 ** -decimals * (1 + 1e-9), (label, value, r[key])
        checked += 1
    if r["intake_humidity_ratio"] > 0.0:
        m = re.search(r"^ISO 8573-1 humidity class +(\S+)\s*$", text, re.M)
        assert m and m.group(1) == r["iso8573_humidity_class"]
    return checked


@pytest.fixture(scope="module")
def reports(sample_reports):
    return sample_reports


def _pdf_text(path) -> str:
    return "\n".join(p.extract_text() for p in pypdf.PdfReader(str(path)).pages)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_pdf_prints_the_water_and_cooling_totals(path, reports, capsys):
    r = _solve_json(path, capsys)
    _check_figures(_pdf_text(reports[path][0]), r, "SI")


def test_the_samples_exercise_every_new_total(capsys):
    # the foundry sample is moist, has water-cooled intercoolers and heat recovery
    r = _solve_json(SAMPLES / "three_stage_site_year.json", capsys)
    assert all(r[key] is not None for _, key, *_ in FIGURES)


def test_us_report_prints_the_totals_in_us_units(tmp_path, capsys):
    path = SAMPLES / "three_stage_site_year.json"
    r = _solve_json(path, capsys)
    pdf = tmp_path / "us.pdf"
    assert main(["report", str(path), "-o", str(pdf), "--units", "US"]) == 0
    assert _check_figures(_pdf_text(pdf), r, "US") == len(FIGURES)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_solve_text_prints_the_water_and_cooling_totals(path, capsys):
    r = _solve_json(path, capsys)
    assert main(["solve", str(path)]) == 0
    _check_figures(capsys.readouterr().out, r, "SI", lower_first=True)


def test_solve_text_lists_each_coolers_cooling_water(capsys):
    path = SAMPLES / "three_stage_site_year.json"
    r = _solve_json(path, capsys)
    assert main(["solve", str(path)]) == 0
    text = capsys.readouterr().out
    assert re.search(r"^component .* water \[m³/h\] +condensate \[kg/h\]$", text, re.M)
    for i, st in enumerate(r["stages"], 1):
        c = st["cooler"]
        m = re.search(rf"^cooler {i} .*?(\d+\.\d\d)? +(\d+\.\d\d)$", text, re.M)
        assert m, text
        assert abs(float(m.group(2)) - c["condensate_kg_s"] * 3600.0) <= 0.005
        if c["cooling_water_m3_s"] is None:  # the fan-cooled aftercooler has no cooling water
            assert c["coolant_kind"] == "air" and m.group(1) is None
        else:
            assert abs(float(m.group(1)) - c["cooling_water_m3_s"] * 3600.0) <= 0.005


def test_csv_train_row_carries_the_totals(reports, capsys):
    path = SAMPLES / "three_stage_site_year.json"
    r = _solve_json(path, capsys)
    with open(reports[path][1], newline="", encoding="utf-8") as fh:
        rows = list(csv.reader(fh))
    header, units_row = rows[0], rows[1]
    assert len(header) == len(set(header))  # a spreadsheet finds a column by its name
    train = next(row for row in rows if row[0] == "train")
    expect = {"condensate_drained": (r["condensate_kg_s"] * 3600.0, "kg/h"),
              "condensate_volume": (r["condensate_L_h"], "L/h"),
              "pressure_dew_point": (r["delivered_pressure_dew_point_K"] - 273.15, "°C"),
              "atmospheric_dew_point": (r["delivered_atmospheric_dew_point_K"] - 273.15, "°C"),
              "cooling_water": (r["cooling_water_m3_s"] * 3600.0, "m³/h"),
              "recoverable_heat": (r["recoverable_heat_W"] / 1e3, "kW")}
    for name, (value, unit) in expect.items():
        col = header.index(name)
        assert units_row[col] == unit
        assert float(train[col]) == pytest.approx(value, rel=1e-11, abs=1e-12)
    assert train[header.index("iso8573_humidity_class")] == r["iso8573_humidity_class"]
    cooler1 = next(row for row in rows if row[:2] == ["component", "Cooler 1"])
    expected = r["stages"][0]["cooler"]["cooling_water_m3_s"] * 3600.0
    assert float(cooler1[header.index("cooling_water")]) == pytest.approx(expected, rel=1e-11)


def test_cooling_water_is_the_liquid_coolants_volume_flow(capsys):
    import CoolProp.CoolProp as CP

    r = _solve_json(SAMPLES / "three_stage_site_year.json", capsys)
    coolers = [st["cooler"] for st in r["stages"]]
    water = [c for c in coolers if c["coolant_kind"] == "water"]
    for c in water:
        # volume flow = mass flow ÷ density at the coolant inlet; reference: IAPWS-95 (Wagner & Pruss,
        # J. Phys. Chem. Ref. Data 31 (2002) 387) through CoolProp's HEOS water, 997.39 kg/m³ at 24 °C.
        # The core takes CoolProp's incompressible-water table, which reads 0.16 % higher here: the
        # tolerance is 0.3 % (common practice for a flow figure, no source).
        rho = CP.PropsSI("D", "T", c["coolant_inlet_temperature_K"], "P", 3.0e5, "HEOS::Water")
        assert c["coolant_flow_kg_s"] / c["cooling_water_m3_s"] == pytest.approx(rho, rel=3e-3)
    assert r["cooling_water_m3_s"] == pytest.approx(sum(c["cooling_water_m3_s"] for c in water), rel=1e-12)
    assert [c["cooling_water_m3_s"] for c in coolers if c["coolant_kind"] == "air"] == [None]


@pytest.mark.gui
def test_balance_sheet_shows_cooling_water_and_recoverable_heat(qtbot, tmp_path):
    pytest.importorskip("PySide6")
    from gui_support import make_window

    path = SAMPLES / "three_stage_site_year.json"
    win = make_window(qtbot, tmp_path, json.loads(path.read_text(encoding="utf-8")))
    bal, r = win.panels["balance"], win.editor.result
    for key, scale, unit in (("cooling_water_m3_s", 3600.0, "m³/h"), ("recoverable_heat_W", 1e-3, "kW"),
                             ("condensate_L_h", 1.0, "L/h")):
        text = bal.value_text("totals", key, "")
        assert text.endswith(" " + unit), text
        assert float(text.removesuffix(" " + unit).replace(" ", "")) == pytest.approx(r[key] * scale, abs=0.005)
    assert not bal.totals.isRowHidden(bal.row_keys("totals").index("cooling_water_m3_s"))
    shown = bal.value_text("components", "cooler-1", "cooling_water")
    assert float(shown) == pytest.approx(r["stages"][0]["cooler"]["cooling_water_m3_s"] * 3600.0, abs=0.005)
    win.close()
