"""The row type of the presentation tables: paths, per-output looks, display text, conditions.

Check kinds: unit factors are exact by definition (NIST SP 811, 2008 edition, Appendix B:
1 hp = 745.69987158 W; t/°F = 1.8·T/K − 459.67; 1 kPa = 1000 Pa; 1 kWh = 3.6 MJ); the rest are
behaviour checks of invented values (no physics here).
"""
from __future__ import annotations

import pytest

from stagewright.gui.presentation import units
from stagewright.gui.presentation.figures import Figure, Look, condition_holds, has_path, read_path, shown, snake_case

HP_W = 745.69987158


def test_paths_read_nested_values_sums_and_sums_over_lists():
    data = {"st": {"q": 1.0, "w": 2.0, "none": None},
            "stages": [{"cooler": {"m": 1.5}}, {"cooler": None}, {"cooler": {"m": 0.5}}]}
    assert read_path(data, "st.q") == 1.0
    assert read_path(data, "st.q+st.w") == 3.0
    assert read_path(data, "stages[*].cooler.m") == 2.0
    assert read_path(data, "st.none") is None and read_path(data, "st.missing") is None
    assert read_path(data, "st.q+st.missing") is None  # a sum with a missing term is missing
    assert read_path({"stages": [{"cooler": None}]}, "stages[*].cooler.m") is None
    assert has_path(data, "st.none") and has_path(data, "stages[*].cooler.m")
    assert not has_path(data, "st.missing") and not has_path(data, "st.q+st.missing")


def test_a_figure_shows_in_every_output_unless_told_and_each_output_may_look_different():
    fig = Figure("shaft_power_W", "Shaft power", "power",
                 looks={"text": Look(label="power", decimals=3, width=11)})
    assert fig.where == {"window", "text", "pdf", "csv"} and fig.id == "shaft_power_W"
    assert fig.label_in("window") == fig.label_in("pdf") == "Shaft power"
    assert fig.label_in("text") == "power" and fig.label_in("csv") == "shaft_power"
    row = {"shaft_power_W": 123_456.7}
    assert fig.text(row, "window") == "123.46"
    assert fig.text(row, "window", with_unit=True) == "123.46 kW"
    assert fig.text(row, "text", grouping=False) == "123.457"
    assert float(fig.text(row, "pdf", "US")) == pytest.approx(123_456.7 / HP_W, abs=0.005)
    assert fig.text({}, "window") == "—" and fig.text({}, "csv", missing="") == ""
    only = Figure("x", "X", where={"pdf"})
    assert shown([fig, only], "window") == [fig] and shown([fig, only], "pdf") == [fig, only]


def test_other_units_conversion_and_symbols_come_from_the_units_table():
    p = Figure("pressure_Pa", "p", "pressure", looks={"text": Look(unit="kPa")})
    assert p.text({"pressure_Pa": 101_325.0}, "text") == "101.33"  # 1 kPa = 1000 Pa
    assert p.symbol_in("text") == "kPa" and p.symbol_in("window") == "bar(a)"
    gauge = Figure("pressure_Pa", "p", "pressure", gauge=True)
    assert gauge.symbol_in("pdf") == "bar(g)"
    assert gauge.text({"pressure_Pa": 900_000.0}, "pdf", barometric_Pa=100_000.0) == "8.0000"
    energy = Figure("energy_kWh", "Energy", "energy", to_si=3.6e6, looks={"text": Look(unit="MWh")})
    assert energy.text({"energy_kWh": 12_345.0}, "window") == "12 345"
    assert energy.text({"energy_kWh": 12_345.0}, "text") == "12.345"  # 1 MWh = 1000 kWh
    s = Figure("entropy_J_kgK", "s", "specific_entropy", looks={"text": Look(symbol="kJ/kgK", decimals=5)})
    assert s.symbol_in("text") == "kJ/kgK" and s.text({"entropy_J_kgK": 3916.5}, "text") == "3.91650"
    assert units.unit_named("humidity_ratio", "kg/kg").to_display(0.012) == 0.012
    with pytest.raises(KeyError, match="no display unit"):
        units.unit_named("pressure", "mmHg")


def test_styles_lists_and_plain_numbers():
    temps = Figure("t", "T", "temperature", decimals=1, joiner=" · ")
    assert temps.text({"t": [428.15, 433.15]}, "window", "US") == "311.0 · 320.0"  # 428.15 K = 311 °F
    assert temps.text({"t": []}, "window") == "—" and temps.is_left_aligned()
    assert Figure("r", "Residual", style="scientific", decimals=2).text({"r": -3.79e-13}, "window") == "-3.79e-13"
    assert Figure("c", "Class", style="text").text({"c": "2"}, "window", with_unit=True) == "2"
    assert Figure("f", "Feasible", style="yes_no").text({"f": False}, "pdf") == "no"
    assert Figure("h", "Hours", decimals=0).text({"h": 6000.0}, "window") == "6000"  # plain: no grouping
    assert Figure("m", "Saving", "money").text({"m": 14_400.0}, "window", with_unit=True) == "14 400 cost"
    assert Figure("x", "X", "ratio", looks={"pdf": Look(missing="0.0")}).text({}, "pdf") == "0.0"


def test_conditions_per_output():
    fig = Figure("v", "V", when="any", looks={"csv": Look(when="")})
    rows = [(None, {"v": None}), (None, {"v": 1.0})]
    assert condition_holds(fig, "pdf", rows=rows) and not condition_holds(fig, "pdf", rows=rows[:1])
    assert condition_holds(fig, "csv", rows=rows[:1])
    moist = Figure("w", "w", when="moist")
    assert condition_holds(moist, "window", {"intake_humidity_ratio": 0.01, "intake": {}})
    assert not condition_holds(moist, "window", {"intake_humidity_ratio": 0.0, "intake": {"humidity_ratio": 0.0}})


def test_mistakes_in_a_table_row_are_caught_when_it_is_written():
    with pytest.raises(ValueError, match="unknown quantity 'powr'"):
        Figure("x", "X", "powr")
    with pytest.raises(ValueError, match="unknown output 'html'"):
        Figure("x", "X", where={"html"})
    with pytest.raises(ValueError, match="condition 'wet'"):
        Figure("x", "X", when="wet")
    with pytest.raises(KeyError, match="no display unit"):
        Figure("x", "X", "power", looks={"text": Look(unit="MW")})
    assert snake_case("Normal volume flow (0 °C)") == "normal_volume_flow_0_c"
