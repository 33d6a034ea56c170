"""Coolant side: energy balance against independent property sources, limits, bad input."""
import CoolProp.CoolProp as CP
import pytest

from stagewright.core.errors import InputError
from stagewright.core.exchanger.coolant import coolant_side, make_coolant

SITE = (293.15, 101_325.0, 0.0)


def test_water_enthalpy_rise_matches_iapws95():
    # CoolProp PropsSI with the HEOS back end (IAPWS-95, Wagner & Pruß 2002): an independent
    # formulation from the incompressible table the coolant uses; agreement to 0.2 %
    w = make_coolant({"kind": "water"}, SITE)
    side = coolant_side(w, 293.15, 100_000.0, flow=2.0)
    dh = CP.PropsSI("H", "T", side.outlet_temperature_K, "P", 3e5, "Water") - CP.PropsSI(
        "H", "T", 293.15, "P", 3e5, "Water")
    assert 2.0 * dh == pytest.approx(100_000.0, rel=2e-3)


def test_rise_and_flow_modes_are_inverse():
    w = make_coolant({"kind": "glycol", "glycol_fraction": 0.35}, SITE)
    a = coolant_side(w, 280.0, 55_000.0, rise=12.0)
    b = coolant_side(w, 280.0, 55_000.0, flow=a.flow_kg_s)
    assert b.outlet_temperature_K == pytest.approx(292.0, abs=1e-9)


def test_air_coolant_matches_ashrae_psychrometric_enthalpy():
    # ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 32: h = 1.006 t + W (2501 + 1.86 t) kJ/kg dry air;
    # per kg of humid air divide by (1 + W); agreement to 0.5 %
    site = (303.15, 101_325.0, 0.5)
    a = make_coolant({"kind": "air"}, site)
    W = CP.HAPropsSI("W", "T", 303.15, "P", 101_325.0, "R", 0.5)
    side = coolant_side(a, 303.15, 30_000.0, flow=3.0)
    t1, t2 = 30.0, side.outlet_temperature_K - 273.15
    dh = (1.006 * (t2 - t1) + W * 1.86 * (t2 - t1)) * 1000.0 / (1 + W)
    assert 3.0 * dh == pytest.approx(30_000.0, rel=5e-3)


def test_glycol_freezing_point_limits_the_inlet():
    # 30 % ethylene glycol by mass freezes near −15 °C (ASHRAE Handbook—Fundamentals, ch. 31, from memory)
    g = make_coolant({"kind": "glycol", "glycol_fraction": 0.3}, SITE)
    assert g.t_min == pytest.approx(273.15 - 15.0, abs=1.5)
    with pytest.raises(InputError, match=r"coolant_inlet_temperature_K.*frozen"):
        coolant_side(g, 250.0, 1000.0, flow=1.0, where="stages[0].cooler")


def test_too_little_water_names_flow_and_minimum():
    w = make_coolant({"kind": "water"}, SITE)
    with pytest.raises(InputError, match=r"stages\[1\]\.cooler\.coolant\.flow_kg_s.*at least 0\.2"):
        coolant_side(w, 293.15, 70_000.0, flow=0.1, where="stages[1].cooler")
    with pytest.raises(InputError, match=r"coolant\.temperature_rise_K.*at most 80\.00 K"):
        coolant_side(w, 293.15, 70_000.0, rise=85.0, where="stages[1].cooler")


@pytest.mark.parametrize("spec, t_in", [({"kind": "water"}, 285.0), ({"kind": "air"}, 268.0),
                                        ({"kind": "glycol", "glycol_fraction": 0.3}, 262.0)])
@pytest.mark.parametrize("duty_per_kg", [50.0, 4_000.0, 60_000.0])
def test_coolant_outlet_solves_its_enthalpy_balance_to_1e_9_K(spec, t_in, duty_per_kg):
    # issue 15 (speed): the outlet comes from secant steps now (Brent's method before); the answer must
    # still satisfy h(T_out) = h(T_in) + Q/m: checked with CoolProp's own enthalpy at the answer,
    # and against the outlet Brent's method finds on the same function (scipy.optimize.brentq)
    from scipy.optimize import brentq
    fluid = make_coolant(spec, (t_in, 98_000.0, 0.6))
    side = coolant_side(fluid, t_in, duty_per_kg, flow=1.0)
    target = fluid.h(t_in) + duty_per_kg
    assert fluid.h(side.outlet_temperature_K) == pytest.approx(target, rel=1e-13, abs=1e-7)
    ref = brentq(lambda t: fluid.h(t) - target, t_in, fluid.t_max, xtol=1e-12, rtol=1e-15)
    assert side.outlet_temperature_K == pytest.approx(ref, abs=1e-9)


def test_tabulated_air_coolant_matches_hapropssi_at_ambient_states():
    # the fast path's air coolant (stagewright.core.exchanger.air_table) against CoolProp HAPropsSI
    # (ASHRAE RP-1485) itself at random site states: the tolerances stated in the module
    import random
    from stagewright.core.exchanger.air_table import HumidAirTable, TabulatedAmbientAir
    p = 98_500.0
    table = HumidAirTable(p)
    rng = random.Random(15)
    for _ in range(150):
        t0, rh = rng.uniform(223.15, 318.15), rng.uniform(0.0, 1.0)
        w = CP.HAPropsSI("W", "T", t0, "P", p, "R", rh)
        t = t0 + rng.uniform(0.0, 80.0)
        air = TabulatedAmbientAir(p, w, table)
        assert air.h(t) == pytest.approx(CP.HAPropsSI("Hha", "T", t, "P", p, "W", w), abs=1e-4)
        assert air.s(t) == pytest.approx(CP.HAPropsSI("Sha", "T", t, "P", p, "W", w), abs=5e-6)
        assert air.rho(t) == pytest.approx(1.0 / CP.HAPropsSI("Vha", "T", t, "P", p, "W", w), rel=1e-9)


def test_fast_air_coolant_outlet_agrees_with_the_exact_one():
    site = (268.15, 98_500.0, 0.85)
    exact = coolant_side(make_coolant({"kind": "air"}, site), 268.15, 60_000.0, flow=6.0)
    fast = coolant_side(make_coolant({"kind": "air"}, site, fast=True), 268.15, 60_000.0, flow=6.0)
    assert fast.outlet_temperature_K == pytest.approx(exact.outlet_temperature_K, abs=1e-7)
    assert fast.mean_temperature_K == pytest.approx(exact.mean_temperature_K, abs=1e-6)
    assert fast.inlet_density_kg_m3 == pytest.approx(exact.inlet_density_kg_m3, rel=1e-9)


def test_coolant_outlet_search_settles_in_a_few_enthalpy_calls():
    # a step of rounding used to be sent to mid-bracket, and a third of a rating's searches ran on to
    # Brent's method (15 and more calls); now every search settles in at most 5 (the answer as before)
    from stagewright.core.exchanger.coolant import temperature_from_h
    for spec in ({"kind": "water"}, {"kind": "air"}):
        fluid = make_coolant(spec, (288.15, 98_500.0, 0.6))
        calls = []

        class Counted:
            def h(self, T):
                calls.append(T)
                return fluid.h(T)
        worst = 0
        for k in range(60):
            t_in, dh = 283.15 + 0.37 * k, 2_000.0 + 777.0 * k
            h_in = fluid.h(t_in)
            calls.clear()
            t = temperature_from_h(Counted(), h_in + dh, t_in, 360.0, h_in, fluid.h(360.0))
            worst = max(worst, len(calls))
            assert fluid.h(t) == pytest.approx(h_in + dh, abs=1e-6)
        assert worst <= 5
