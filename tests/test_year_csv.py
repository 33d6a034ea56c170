"""Hourly and logged ambient profiles from CSV (issue 15): units, errors by line and column, binning.

Outside reference for the humidity conversions: CoolProp ``HAPropsSI`` (ASHRAE RP-1485), whose
``Tdp`` below 0.01 °C is a frost point over ice.
"""
import math
import random

import CoolProp.CoolProp as CP
import pytest

from stagewright.gui.cli.main import main
from stagewright.gui.document.year_csv import read_profile_text
from stagewright.core.errors import InputError
from stagewright.core.models import make_model
from stagewright.core.moist.mixture import make_mixture
from stagewright.core.moist.stream import intake_humidity_ratio
from stagewright.core.year import run_year
from stagewright.core.year_profile import bin_profile


def test_units_in_the_header_and_timestamps_give_hours():
    p = read_profile_text("# site log\ntime;T (°F);RH [fraction];load [%]\n"
                          "2025-03-01 00:00;50;0.5;80\n2025-03-01 00:30;41;0.75;100\n2025-03-01 01:30;32;0.9;90\n")
    assert [round(b["temperature_K"], 6) for b in p.bins] == [283.15, 278.15, 273.15]
    assert [b["relative_humidity"] for b in p.bins] == [0.5, 0.75, 0.9]
    assert [b["load"] for b in p.bins] == pytest.approx([0.8, 1.0, 0.9])
    assert [b["hours"] for b in p.bins] == [0.5, 1.0, 0.75]  # the last row: the median step


def test_units_chosen_on_import_for_plain_headers():
    p = read_profile_text("temperature,rh,hours\n300,0.4,2\n", units={"temperature": "K", "fraction": ""})
    assert p.bins == [{"temperature_K": 300.0, "relative_humidity": 0.4, "hours": 2.0}]
    q = read_profile_text("temperature,rh\n20,40\n")  # defaults: °C and %
    assert q.bins[0]["temperature_K"] == pytest.approx(293.15) and q.bins[0]["relative_humidity"] == 0.4
    assert q.bins[0]["hours"] == 1.0


def test_sub_zero_dew_and_frost_points_against_hapropssi():
    # dew point over supercooled water (as station data give it) and frost point over ice: the
    # humidity ratio of the relative humidity they become matches RP-1485's for the same vapour
    mix = make_mixture(make_model({"model": "real_gas"}))
    p = read_profile_text("temperature_C,frost_point_C\n-8,-12\n")
    rh = p.bins[0]["relative_humidity"]
    W = intake_humidity_ratio({"relative_humidity": rh}, mix, 265.15, 101325.0)
    assert W == pytest.approx(CP.HAPropsSI("W", "T", 265.15, "P", 101325.0, "Tdp", 261.15), rel=2e-4)
    d = read_profile_text("temperature_C,dew_point_C\n-8,-12\n").bins[0]["relative_humidity"]
    assert d > rh  # over supercooled water the same number is more vapour than over ice


@pytest.mark.parametrize("text, where, expected", [
    ("temperature,rh\n10,50\n12,abc\n", "CSV line 3, column 2 'rh'", "a number in %"),
    ("temperature,rh\n10,50\n\n# note\n99,50\n", "CSV line 5, column 1 'temperature'", "-50 °C to 60 °C"),
    ("temperature,rh\n10,150\n", "CSV line 2, column 2 'rh'", "0 % to 100 %"),
    ("temperature,dew_point\n10,12\n", "CSV line 2, column 2 'dew_point'", "at most the dry-bulb"),
    ("temperature,rh,pressure\n10,50,1\n", "CSV line 1, column 3 'pressure'", "a column named like"),
    ("temperature [bar],rh\n10,50\n", "CSV line 1, column 1 'temperature [bar]'", "a unit of"),
    ("temperature,rh,dew_point\n10,50,2\n", "CSV line 1", "exactly one of"),
    ("time,temperature,rh\n2025-01-01 01:00,10,50\n2025-01-01 00:00,10,50\n", "CSV line 3, column 1 'time'",
     "time order"),
])
def test_a_bad_row_names_its_line_and_column_and_nothing_is_imported(text, where, expected):
    with pytest.raises(InputError) as info:
        read_profile_text(text)
    assert info.value.problem.field == where
    assert expected in info.value.problem.expected


def test_a_year_of_8760_rows_reads():
    rows = "\n".join(f"{-10 + 30 * (h % 24) / 24:.1f},{60 + h % 30}" for h in range(8760))
    p = read_profile_text("temperature,rh\n" + rows)
    assert p.rows == 8760 and sum(b["hours"] for b in p.bins) == 8760.0


def _hourly(n=240, seed=5):
    rng = random.Random(seed)
    return [{"temperature_K": 278.0 + 8.0 * math.sin(h / 20.0) + rng.uniform(-1, 1),
             "relative_humidity": rng.uniform(0.4, 0.9), "hours": 1.0} for h in range(n)]


def test_binning_keeps_the_hours_and_the_weighted_means():
    rows = _hourly()
    bins = bin_profile(rows)
    assert sum(b["hours"] for b in bins) == pytest.approx(240.0)
    assert sum(b["temperature_K"] * b["hours"] for b in bins) == pytest.approx(
        sum(r["temperature_K"] for r in rows), rel=1e-12)
    assert len(bins) < len(rows)


def test_binning_changes_energy_little_and_extremes_by_less_than_a_bin():
    # what binning changes (stagewright.core.year_profile.bin_profile): energy within 0.1 %, extremes smoothed
    doc = {"site": {"ambient_temperature_K": 288.15, "relative_humidity": 0.6}, "fluid": {"model": "ideal_gas"},
           "flow": {"kind": "free_air_delivery", "value": 0.3}, "discharge_pressure_Pa": 8e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                       "cooler": {"approach_K": 8.0, "coolant": {"kind": "air", "temperature_rise_K": 10.0}}}]}
    rows = _hourly()
    hourly = run_year({**doc, "year": {"profile": {"kind": "bins", "bins": rows}}})
    binned = run_year({**doc, "year": {"profile": {"kind": "bins", "bins": bin_profile(rows)}}})
    assert binned.totals["hours"] == pytest.approx(hourly.totals["hours"])
    assert binned.totals["energy_kWh"] == pytest.approx(hourly.totals["energy_kWh"], rel=1e-3)
    t_h = max(b.max_discharge_temperature_K for b in hourly.bins)
    t_b = max(b.max_discharge_temperature_K for b in binned.bins)
    assert 0.0 <= t_h - t_b < 2.0


def test_cli_year_reads_a_csv_profile_bins_it_and_writes_every_bin(tmp_path, capsys):
    import json
    project = tmp_path / "p.json"
    project.write_text(json.dumps({
        "site": {"ambient_temperature_K": 288.15, "relative_humidity": 0.6}, "fluid": {"model": "ideal_gas"},
        "flow": {"kind": "mass", "value": 0.5}, "discharge_pressure_Pa": 8e5,
        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                    "cooler": {"approach_K": 8.0, "coolant": {"kind": "air", "temperature_rise_K": 10.0}}}]}))
    csv_in = tmp_path / "hourly.csv"
    csv_in.write_text("temperature,rh\n" + "\n".join(f"{-8 + (h % 12)},{85 - h % 20}" for h in range(120)))
    out = tmp_path / "bins.csv"
    assert main(["year", str(project), "--profile", str(csv_in), "--coolers", "design_once", "--csv", str(out)]) == 0
    lines = out.read_text().splitlines()
    assert len(lines) == 121 and "cooler_outlet_temperatures_K[1]" in lines[0] and "pressure_dew_point_K" in lines[0]
    capsys.readouterr()
    assert main(["year", str(project), "--profile", str(csv_in), "--bin", "--json"]) == 0
    y = json.loads(capsys.readouterr().out)[0]["year"]  # a list, an entry per file
    assert 1 < len(y["bins"]) < 120 and y["totals"]["hours"] == pytest.approx(120.0)
    bad = tmp_path / "bad.csv"
    bad.write_text("temperature,rh\n10,50\n11,x\n")
    assert main(["year", str(project), "--profile", str(bad)]) == 2
    assert "CSV line 3, column 2 'rh'" in capsys.readouterr().err


def test_rows_with_timestamps_are_named_by_their_hour():
    p = read_profile_text("time,temperature [°C],dew point [°C]\n2025-01-17 06:00,-21.5,-23\n"
                          "2025-01-17 07:00,-21,-22.4\n")
    assert [b["label"] for b in p.bins] == ["2025-01-17 06:00", "2025-01-17 07:00"]
    assert "label" not in read_profile_text("temperature [°C],rh [%]\n-8,85\n").bins[0]
