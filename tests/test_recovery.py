"""Heat recovery against the perfect-gas steady-flow energy balance."""
import pytest

import thermo
from tests.conftest import make_doc


def _doc(**rec):
    doc = make_doc(model="constant_cp", stages=1, p_out=8e5, T0=293.15, cool_to=303.15)
    doc["stages"][0]["heat_loss_W"] = 2000.0
    doc["heat_recovery"] = {"delivery_temperature_K": 333.15, "approach_K": 5.0, **rec}
    return doc


def test_cooler_heat_above_delivery_plus_approach_is_cp_delta_t():
    # perfect gas, steady flow (Çengel & Boles 2015, §5-4): Q = m cp (T_in − (T_d + ΔT_min))
    res = thermo.solve(_doc())
    t_in = res.coolers[0].inlet.T
    assert res.recovery.coolers_W[0] == pytest.approx(1.0 * 1005.0 * (t_in - 338.15), rel=1e-12)
    assert res.recovery.casings_W == [0.0]  # no casing share asked for
    assert res.to_dict()["recoverable_heat_W"] == pytest.approx(res.recovery.recoverable_heat_W)
    assert res.recovery.share_of_driver_input == pytest.approx(
        res.recovery.recoverable_heat_W / res.driver_power_W, rel=1e-12)


def test_casing_share_counts_only_above_the_source_temperature():
    doc = _doc(casing_share=0.5)
    doc["stages"][0]["heat_loss_boundary_temperature_K"] = 400.0
    assert thermo.solve(doc).recovery.casings_W == [pytest.approx(1000.0)]
    doc["stages"][0]["heat_loss_boundary_temperature_K"] = 330.0
    assert thermo.solve(doc).recovery.casings_W == [0.0]


def test_yearly_value_is_fuel_saved_times_price():
    res = thermo.solve(_doc(fuel_price_per_kWh=0.08, boiler_efficiency=0.85, operating_hours_per_year=4000.0))
    r = res.recovery
    assert r.value_per_year == pytest.approx(r.recoverable_heat_W * 4000.0 / 1000.0 / 0.85 * 0.08, rel=1e-12)


def test_only_heat_above_the_source_temperature_counts():
    res = thermo.solve(_doc(approach_K=90.0))  # source 423 K, discharge about 590 K: some left
    assert res.recovery.recoverable_heat_W > 0.0
    doc = _doc(delivery_temperature_K=423.15, approach_K=100.0, casing_share=1.0)
    doc["stages"][0]["efficiency"]["value"] = 0.95  # discharge about 544 K: only its top ~20 K lies above 523 K
    res = thermo.solve(doc)
    t_in = res.coolers[0].inlet.T
    assert t_in < 523.15 + 50.0
    expected = 1005.0 * (t_in - 523.15) if t_in > 523.15 else 0.0
    assert res.recovery.coolers_W[0] == pytest.approx(expected, abs=1e-9)
    assert res.recovery.casings_W == [0.0]  # casing heat at the stage mean temperature, below 523 K


def test_no_section_means_none_in_results():
    doc = _doc()
    del doc["heat_recovery"]
    assert thermo.solve(doc).to_dict()["recoverable_heat_W"] is None
