"""A year at the site: identical months, hours weighting, worst month, bad profiles."""
import copy

import pytest

import stagewright.core
from tests.conftest import make_doc
from stagewright.core.errors import InputError
from stagewright.core.year import run_year
from stagewright.core.year_profile import DAYS_IN_MONTH, parse_bins_text


def _doc(months=None, **year):
    doc = make_doc(model="ideal_gas", stages=2, p_out=8e5, T0=293.15)
    for st in doc["stages"]:
        st["cooler"] = {"approach_K": 8.0, "coolant_inlet_temperature_K": 291.15,
                        "coolant": {"kind": "water", "temperature_rise_K": 8.0}}
    doc["heat_recovery"] = {"delivery_temperature_K": 333.15, "fuel_price_per_kWh": 0.06}
    month = {"temperature_K": 288.15, "relative_humidity": 0.6}
    doc["year"] = {"profile": {"kind": "monthly", "months": months or [dict(month) for _ in range(12)]},
                   "energy_price_per_kWh": 0.15, **year}
    return doc


def test_year_of_identical_months_is_twelve_times_one_month():
    # arithmetic identity of the annual total (no source needed): 12 equal months of 600 h each
    months = [{"temperature_K": 288.15, "relative_humidity": 0.6, "hours": 600.0} for _ in range(12)]
    y = run_year(_doc(months))
    one = y.bins[0]
    for key in ("energy_kWh", "energy_cost", "cooling_water_m3", "recoverable_heat_kWh", "recovered_value"):
        assert y.totals[key] == pytest.approx(12 * getattr(one, key), rel=1e-12)
    # and one month equals an independent single solve at that ambient, times its hours
    single = copy.deepcopy(_doc(months))
    del single["year"]
    single["site"]["ambient_temperature_K"] = 288.15
    single["site"]["relative_humidity"] = 0.6
    res = stagewright.core.solve(single)
    assert one.energy_kWh == pytest.approx(res.driver_power_W * 600.0 / 1000.0, rel=1e-12)
    assert one.cooling_water_m3 == pytest.approx(
        sum(c.exchanger.coolant.volume_flow_m3_s for c in res.coolers) * 3600 * 600.0, rel=1e-12)


def test_default_hours_follow_days_of_the_month():
    y = run_year(_doc(operating_hours_per_year=6000.0))
    assert [b.hours for b in y.bins] == pytest.approx([6000.0 * d / 365 for d in DAYS_IN_MONTH])
    assert y.totals["hours"] == pytest.approx(6000.0)


def test_worst_month_is_the_hottest_for_discharge_temperature():
    months = [{"temperature_K": 275.0 + 2.0 * i, "relative_humidity": 0.5} for i in range(12)]
    months[6]["temperature_K"] = 310.0
    y = run_year(_doc(months))
    assert y.worst_discharge_bin == "July"
    assert y.to_dict()["worst_discharge_temperature"]["temperature_K"] == max(
        b.max_discharge_temperature_K for b in y.bins)


def test_load_scales_the_flow():
    y_full = run_year(_doc())
    y_half = run_year(_doc(load=0.5))
    assert y_half.totals["cooling_water_m3"] == pytest.approx(0.5 * y_full.totals["cooling_water_m3"], rel=1e-9)


def test_bins_scaled_to_operating_hours():
    doc = _doc()
    doc["year"] = {"profile": {"kind": "bins", "bins": parse_bins_text("278.15 0.8 3000\n298.15 0.5 1000")},
                   "operating_hours_per_year": 2000.0}
    y = run_year(doc)
    assert [b.hours for b in y.bins] == pytest.approx([1500.0, 500.0])


def test_bad_profiles_name_field_and_limit():
    with pytest.raises(InputError, match=r"year\.profile\.months.*expected 12 .*missing: December"):
        run_year(_doc([{"temperature_K": 288.15, "relative_humidity": 0.6}] * 11))
    bad = [{"temperature_K": 288.15, "relative_humidity": 0.6} for _ in range(12)]
    bad[3]["relative_humidity"] = 1.2
    with pytest.raises(InputError, match=r"year\.profile\.months\[3\]\.relative_humidity.*\[0, 1\]"):
        run_year(_doc(bad))
    some = [{"temperature_K": 288.15, "relative_humidity": 0.6} for _ in range(12)]
    some[0]["hours"] = 300.0
    with pytest.raises(InputError, match=r"months\[1\]\.hours.*every month or for none"):
        run_year(_doc(some))
    with pytest.raises(InputError, match="parse|three numbers"):
        parse_bins_text("290 0.5")
    doc = _doc()
    del doc["year"]
    with pytest.raises(InputError, match="year"):
        run_year(doc)
