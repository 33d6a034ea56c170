"""Heat recovery against the perfect-gas steady-flow energy balance."""
import pytest

import stagewright.core
from tests.conftest import make_doc


def _doc(**rec):
    doc = make_doc(model="constant_cp", stages=1, p_out=8e5, T0=293.15, cool_to=303.15)
    doc["stages"][0]["heat_loss_W"] = 2000.0
    doc["heat_recovery"] = {"delivery_temperature_K": 333.15, "approach_K": 5.0, **rec}
    return doc


def test_cooler_heat_above_delivery_plus_approach_is_cp_delta_t():
    # perfect gas, steady flow (Çengel & Boles 2015, §5-4): Q = m cp (T_in − (T_d + ΔT_min))
    res = stagewright.core.solve(_doc())
    t_in = res.coolers[0].inlet.T
    assert res.recovery.coolers_W[0] == pytest.approx(1.0 * 1005.0 * (t_in - 338.15), rel=1e-12)
    assert res.recovery.casings_W == [0.0]  # no casing share asked for
    assert res.to_dict()["recoverable_heat_W"] == pytest.approx(res.recovery.recoverable_heat_W)
    assert res.recovery.share_of_driver_input == pytest.approx(
        res.recovery.recoverable_heat_W / res.driver_power_W, rel=1e-12)


def test_casing_share_counts_only_above_the_source_temperature():
    doc = _doc(casing_share=0.5)
    doc["stages"][0]["heat_loss_boundary_temperature_K"] = 400.0
    assert stagewright.core.solve(doc).recovery.casings_W == [pytest.approx(1000.0)]
    doc["stages"][0]["heat_loss_boundary_temperature_K"] = 330.0
    assert stagewright.core.solve(doc).recovery.casings_W == [0.0]


def test_yearly_value_is_fuel_saved_times_price():
    res = stagewright.core.solve(_doc(fuel_price_per_kWh=0.08, boiler_efficiency=0.85, operating_hours_per_year=4000.0))
    r = res.recovery
    assert r.value_per_year == pytest.approx(r.recoverable_heat_W * 4000.0 / 1000.0 / 0.85 * 0.08, rel=1e-12)


def test_only_heat_above_the_source_temperature_counts():
    res = stagewright.core.solve(_doc(approach_K=90.0))  # source 423 K, discharge about 590 K: some left
    assert res.recovery.recoverable_heat_W > 0.0
    doc = _doc(delivery_temperature_K=423.15, approach_K=100.0, casing_share=1.0)
    doc["stages"][0]["efficiency"]["value"] = 0.95  # discharge about 544 K: only its top ~20 K lies above 523 K
    res = stagewright.core.solve(doc)
    t_in = res.coolers[0].inlet.T
    assert t_in < 523.15 + 50.0
    expected = 1005.0 * (t_in - 523.15) if t_in > 523.15 else 0.0
    assert res.recovery.coolers_W[0] == pytest.approx(expected, abs=1e-9)
    assert res.recovery.casings_W == [0.0]  # casing heat at the stage mean temperature, below 523 K


def test_no_section_means_none_in_results():
    doc = _doc()
    del doc["heat_recovery"]
    assert stagewright.core.solve(doc).to_dict()["recoverable_heat_W"] is None


def _humid_doc(rh=0.8, delivery=313.15):
    doc = make_doc(model="real_gas", stages=2, p_out=8e5, T0=298.15, cool_to=303.15)
    doc["site"]["relative_humidity"] = rh
    doc["heat_recovery"] = {"delivery_temperature_K": delivery, "approach_K": 5.0}
    return doc


def test_moist_recovery_counts_the_latent_heat_above_the_source_temperature():
    # Equilibrium enthalpy of the moist stream per kg dry air from CoolProp HAPropsSI (ASHRAE
    # RP-1485; liquid water at 4186 J/(kg K) from 0.01 °C, from memory): Q = m_a [h(T_in) − h_eq(T_x)].
    # The source temperature lies below the stream's dew point, so part of it is latent heat.
    # 0.5 % covers the two moist-air formulations (tolerance common practice, no source).
    import CoolProp.CoolProp as CP
    res = stagewright.core.solve(_humid_doc())
    t_x = 318.15
    checked = 0
    for c, q in zip(res.coolers, res.recovery.coolers_W):
        P, W = c.outlet.P, c.inlet.w + c.inlet.wl
        t_dew = CP.HAPropsSI("D", "T", c.inlet.T, "P", P, "W", W)
        if t_dew <= t_x:
            continue
        ws = CP.HAPropsSI("W", "T", t_x, "P", P, "R", 1.0)
        h_x = CP.HAPropsSI("H", "T", t_x, "P", P, "R", 1.0) + (W - ws) * 4186.0 * (t_x - 273.16)
        h_in = CP.HAPropsSI("H", "T", c.inlet.T, "P", P, "W", W)  # pressure effect on the vapour phase: small
        expected = res.mass_flow_kg_s * (h_in - h_x)
        assert q == pytest.approx(expected, rel=5e-3)
        # the latent part (about 2.4 MJ/kg condensed, from memory) is far above the tolerance: a dry-air
        # (sensible-only) reckoning would fail the check above (latent part at least 4× its tolerance)
        assert res.mass_flow_kg_s * (W - ws) * 2.4e6 > 4 * 5e-3 * expected
        checked += 1
    assert checked >= 1


def test_dry_intake_recovery_is_unchanged_by_the_stream_model():
    # zero humidity runs the dry code: the recovered heat is the dry-air model's enthalpy drop
    res = stagewright.core.solve(_humid_doc(rh=0.0))
    c = res.coolers[0]
    h_x = c.stream_model.at_tp(318.15, c.outlet.P).h
    assert res.recovery.coolers_W[0] == pytest.approx(res.mass_flow_kg_s * (c.outlet.h + c.duty_W / res.mass_flow_kg_s - h_x), rel=1e-12)
