"""Condensate of a compress-then-cool case against hand calculations (Çengel & Boles 2015, §14-7)."""
import copy

import CoolProp.CoolProp as CP
import pytest

import stagewright.core
from stagewright.core.moist.condensation import condensate_volume_L_h

EPS = 18.015268 / 28.9647  # M_w / M_a (IAPWS-95; ASHRAE 2017 ch. 1 molar mass of dry air), hand value


def psat_iapws95(T):
    # independent saturation-pressure source: IAPWS-95 through CoolProp's PropsSI
    return CP.PropsSI("P", "T", T, "Q", 0, "Water")


def case(model="ideal_gas", rh=0.7, t_cool=308.15, p_d=8e5, stages=1, sep=1.0):
    return {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 101_325.0, "relative_humidity": rh},
            "fluid": {"model": model}, "flow": {"kind": "mass", "value": 1.5}, "discharge_pressure_Pa": p_d,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                        "cooler": {"outlet_temperature_K": t_cool, "separator_efficiency": sep}}
                       for _ in range(stages)]}


def test_condensate_matches_dalton_hand_calculation():
    # humidity ratio w = ε p_v / (p − p_v) (Çengel & Boles eq. 14-11), ideal mixture, IAPWS-95
    # saturation pressure; condensate = ṁ_a (w_intake − w_sat at the aftercooler outlet)
    r = stagewright.core.solve(case()).to_dict()
    pv0 = 0.7 * psat_iapws95(303.15)
    w0 = EPS * pv0 / (101_325.0 - pv0)
    ps = psat_iapws95(308.15)
    w_out = EPS * ps / (8e5 - ps)
    assert r["condensate_kg_s"] == pytest.approx(1.5 * (w0 - w_out), rel=3e-4)
    c = r["stages"][0]["cooler"]
    assert c["condensate_kg_s"] == pytest.approx(r["condensate_kg_s"], rel=1e-12)
    # latent duty ≈ condensate × latent heat at the outlet (IAPWS-95), within the ideal mixture's 1 %
    h_fg = CP.PropsSI("H", "T", 308.15, "Q", 1, "Water") - CP.PropsSI("H", "T", 308.15, "Q", 0, "Water")
    assert c["latent_duty_W"] == pytest.approx(c["condensate_kg_s"] * h_fg, rel=0.01)
    assert c["latent_duty_W"] + c["sensible_duty_W"] == pytest.approx(c["duty_W"], rel=1e-12)
    # litres per hour at the outlet state: IAPWS-95 liquid density (CoolProp PropsSI)
    rho = CP.PropsSI("D", "T", 308.15, "P", 8e5, "Water")
    assert c["condensate_L_h"] == pytest.approx(c["condensate_kg_s"] / rho * 3.6e6, rel=1e-9)


def test_real_gas_condensate_matches_hapropssi_hand_calculation():
    # HAPropsSI (RP-1485, enhancement factor) for both humidity ratios
    r = stagewright.core.solve(case("real_gas")).to_dict()
    w0 = CP.HAPropsSI("W", "T", 303.15, "P", 101_325.0, "R", 0.7)
    w_out = CP.HAPropsSI("W", "T", 308.15, "P", 8e5, "R", 1.0)
    assert r["condensate_kg_s"] == pytest.approx(1.5 * (w0 - w_out), rel=1e-9)
    assert r["delivered_pressure_dew_point_K"] == pytest.approx(308.15, abs=1e-6)  # saturated outlet


def test_pressure_dew_point_of_unsaturated_delivery_real_vs_dalton():
    # RH 0.1 at the intake: no condensation at 8 bar and 35 °C. HAPropsSI's Tdp agrees
    # to 1e-6 K; a Dalton-law dew point (ε p_v/(p − p_v), IAPWS-95 psat, no enhancement
    # factor) is a few tenths of a kelvin higher at 8 bar, because f ≈ 1.02–1.03 there.
    r = stagewright.core.solve(case("real_gas", rh=0.1)).to_dict()
    assert r["condensate_kg_s"] == 0.0
    w = r["delivery"]["humidity_ratio"]
    assert r["delivered_pressure_dew_point_K"] == pytest.approx(
        CP.HAPropsSI("Tdp", "T", 308.15, "P", 8e5, "W", w), abs=1e-6)
    pv = w / (EPS + w) * 8e5
    t_dalton = CP.PropsSI("T", "P", pv, "Q", 0, "Water")
    assert 0.1 < t_dalton - r["delivered_pressure_dew_point_K"] < 0.6
    # and the ideal model's own dew point is the Dalton one within IF97-vs-IAPWS-95 tolerance
    ri = stagewright.core.solve(case("ideal_gas", rh=0.1)).to_dict()
    wi = ri["delivery"]["humidity_ratio"]
    t_dalton_i = CP.PropsSI("T", "P", wi / (EPS + wi) * 8e5, "Q", 0, "Water")
    assert ri["delivered_pressure_dew_point_K"] == pytest.approx(t_dalton_i, abs=0.01)


def test_separator_carry_over_evaporates_in_the_next_stage_and_water_is_conserved():
    r = stagewright.core.solve(case(stages=2, p_d=9e5, sep=0.7)).to_dict()
    c1, c2 = r["stages"][0]["cooler"], r["stages"][1]["cooler"]
    assert c1["carry_over_kg_s"] == pytest.approx(0.3 / 0.7 * c1["drained_kg_s"], rel=1e-12)
    assert r["stages"][1]["inlet"]["liquid_ratio"] > 0.0  # supersaturated stage inlet
    assert r["stages"][1]["outlet"]["liquid_ratio"] == 0.0  # compression evaporated it
    assert r["delivery"]["liquid_ratio"] > 0.0
    water_in = r["intake_water_kg_s"]
    assert r["condensate_kg_s"] + r["delivered_water_kg_s"] == pytest.approx(water_in, rel=1e-12)
    assert r["iso8573_humidity_class"] in ("7", "8", "9", "X")


def test_volume_of_nothing_is_zero():
    assert condensate_volume_L_h(0.0, 300.0, 1e5) == 0.0


def test_condensate_and_carry_over_are_reported_as_messages_with_their_field():
    # condensate is a hazard to manage (drains, treatment): the result says so per cooler
    r = stagewright.core.solve(case(stages=2, p_d=9e5, sep=0.7)).to_dict()
    by_field = [w for w in r["warnings"] if w["field"] == "stages[0].cooler.separator_efficiency"]
    drained = r["stages"][0]["cooler"]["drained_kg_s"] * 3600.0
    assert any(f"drains {drained:.2f} kg/h of condensate" in w["message"] for w in by_field)
    assert any("passes the intercooler 1's separator into stage 2" in w["message"] for w in by_field)


@pytest.mark.parametrize("model_name", ["real_gas", "ideal_gas"])
def test_dew_point_on_a_cooling_line_saturates_the_stream(model_name):
    # at the dew point the saturation humidity ratio at the line's pressure equals the stream's
    # water (ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. (23) with the enhancement factor of
    # RP-1485 for real gas); the secant iteration must find it to 1e-9 K
    from stagewright.core.moist.dew_point import dew_point
    from stagewright.core.moist.stream import MoistAir
    from stagewright.core.models import make_model
    from stagewright.core.solve_context import mixture_for
    model = MoistAir(mixture_for(make_model({"model": model_name})), 0.012)
    t_in, t_out, p_in, p_out = 420.0, 303.0, 4.0e5, 3.8e5

    def p_at(T):
        return p_out + (T - t_out) / (t_in - t_out) * (p_in - p_out)
    T = dew_point(model.mixture, model.water, p_at, t_out, t_in)
    assert t_out < T < t_in
    ws = model.mixture.saturation_ratio
    assert ws(T, p_at(T)) == pytest.approx(0.012, rel=1e-10)
    assert ws(T - 1e-6, p_at(T - 1e-6)) < 0.012 < ws(T + 1e-6, p_at(T + 1e-6))
