"""Coolers in a train: coolant energy balance, rating from UA, closures, old keys unchanged."""
import copy
import json

import CoolProp.CoolProp as CP
import pytest

import stagewright.core
from tests.conftest import SAMPLES, make_doc
from stagewright.core.errors import InputError


def _sample():
    return json.loads((SAMPLES / "two_stage_plant_air.json").read_text())


def _sized_and_rated(doc):
    """The train sized from its approaches, and again rated from the UA that sizing found."""
    sized = stagewright.core.solve(doc)
    rated_doc = copy.deepcopy(doc)
    for st, c in zip(rated_doc["stages"], sized.coolers):
        del st["cooler"]["approach_K"]
        st["cooler"]["ua_W_K"] = c.exchanger.ua_W_K
    return sized, stagewright.core.solve(rated_doc)


def _with_coolant(doc, coolant, arrangement="counter_flow"):
    doc = copy.deepcopy(doc)
    for st in doc["stages"]:
        st["cooler"]["coolant"] = dict(coolant)
        st["cooler"]["arrangement"] = arrangement
    return doc


def test_without_new_keys_nothing_changes_but_the_none_fields():
    plain = stagewright.core.solve(_sample()).to_dict()
    sized = stagewright.core.solve(_with_coolant(_sample(), {"kind": "water", "temperature_rise_K": 8.0})).to_dict()
    for a, b in zip(plain["stages"], sized["stages"]):
        assert a["cooler"]["duty_W"] == b["cooler"]["duty_W"]
        assert a["cooler"]["outlet"] == b["cooler"]["outlet"]
        assert a["cooler"]["ua_W_K"] is None and b["cooler"]["ua_W_K"] > 0.0
    assert plain["shaft_power_W"] == sized["shaft_power_W"]


@pytest.mark.parametrize("model", ["real_gas", "constant_cp"])
def test_coolant_energy_balance_matches_air_duty(model):
    # coolant enthalpy rise from CoolProp's high-level PropsSI (INCOMP::Water) — a different call
    # path from the AbstractState the core uses — times the flow equals the air-side duty to 1e-6
    doc = _with_coolant(make_doc(model=model, stages=2, p_out=9e5, cool_to=305.0),
                        {"kind": "water", "flow_kg_s": 1.2})
    for st in doc["stages"]:
        st["cooler"]["coolant_inlet_temperature_K"] = 291.15
    res = stagewright.core.solve(doc)
    for c in res.coolers:
        side = c.exchanger.coolant
        dh = (CP.PropsSI("H", "T", side.outlet_temperature_K, "P", 3e5, "INCOMP::Water")
              - CP.PropsSI("H", "T", 291.15, "P", 3e5, "INCOMP::Water"))
        assert 1.2 * dh == pytest.approx(c.duty_W, rel=1e-6)
        assert c.entropy_generation_W_K > 0.0
    assert abs(res.energy_residual) <= 1e-6 and abs(res.exergy_residual) <= 1e-6


@pytest.mark.parametrize("arrangement", ["counter_flow", "cross_flow_unmixed", "shell_and_tube_1_2"])
def test_train_rating_from_ua_inverts_sizing(arrangement):
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": 2.0}, arrangement)
    sized, rated = _sized_and_rated(doc)
    for a, b in zip(sized.coolers, rated.coolers):
        assert b.outlet.T == pytest.approx(a.outlet.T, rel=1e-6)
        assert b.duty_W == pytest.approx(a.duty_W, rel=1e-6)
    assert abs(rated.energy_residual) <= 1e-6


def test_air_cooled_defaults_to_site_ambient():
    doc = make_doc(model="ideal_gas", stages=1, p_out=8e5, T0=303.15)
    doc["stages"][0]["cooler"] = {"approach_K": 12.0, "coolant": {"kind": "air", "temperature_rise_K": 10.0},
                                  "arrangement": "cross_flow_unmixed"}
    c = stagewright.core.solve(doc).to_dict()["stages"][0]["cooler"]
    assert c["outlet"]["temperature_K"] == pytest.approx(315.15)
    assert c["coolant_inlet_temperature_K"] == pytest.approx(303.15)
    assert c["coolant_outlet_temperature_K"] == pytest.approx(313.15)
    assert 0.0 < c["lmtd_correction_factor"] < 1.0


def test_bad_cooler_inputs_name_field_and_limit():
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": 0.05})
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.coolant\.flow_kg_s.*at least"):
        stagewright.core.solve(doc)
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": 1.0})
    doc["stages"][0]["cooler"]["approach_K"] = 0.0
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.approach_K.*above 0 K"):
        stagewright.core.solve(doc)
    doc = _sample()
    del doc["stages"][0]["cooler"]["approach_K"]
    doc["stages"][0]["cooler"]["ua_W_K"] = 1000.0
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.coolant.*required"):
        stagewright.core.solve(doc)
    doc["stages"][0]["cooler"]["approach_K"] = 5.0
    with pytest.raises(InputError, match="exactly one of outlet_temperature_K, approach_K, ua_W_K"):
        stagewright.core.solve(doc)
    doc = _with_coolant(_sample(), {"kind": "glycol", "flow_kg_s": 1.0})
    with pytest.raises(InputError, match="glycol_fraction"):
        stagewright.core.solve(doc)


# ---- condensing coolers in the train: dry and wet zones -----------------------------------------

def _humid_with_coolant(rh=0.65, flow=2.0, arrangement="counter_flow"):
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": flow}, arrangement)
    doc["site"]["relative_humidity"] = rh
    doc["fluid"]["model"] = "real_gas"
    return doc


def test_condensing_cooler_is_split_at_the_dew_point_of_hapropssi():
    res = stagewright.core.solve(_humid_with_coolant())
    for c in res.coolers:
        assert c.water.condensate_kg_s > 0.0
        assert [z.kind for z in c.exchanger.zones] == ["dry", "wet"]
        t_dew = c.exchanger.zones[0].hot_outlet_temperature_K
        # dew point of the stream's water at the cooler outlet pressure: ASHRAE RP-1485 via CoolProp's
        # HAPropsSI (a different implementation from our tabulated saturation law); 0.05 K covers the
        # difference of the two formulations (tolerance common practice, no source)
        ref = CP.HAPropsSI("D", "T", c.inlet.T, "P", c.outlet.P, "W", c.inlet.w)
        assert t_dew == pytest.approx(ref, abs=0.05)
        assert c.exchanger.zones[1].hot_inlet_temperature_K == t_dew
        assert c.exchanger.ua_W_K == pytest.approx(sum(z.ua_W_K for z in c.exchanger.zones), rel=1e-14)
        assert c.exchanger.zones[1].correction_factor is None  # a wet zone has no F (its driving force is Δh)
    assert abs(res.energy_residual) <= 1e-6 and abs(res.exergy_residual) <= 1e-6


def test_condensing_coolant_balance_includes_latent_heat():
    # coolant enthalpy rise from CoolProp PropsSI (INCOMP::Water), a different call path from the
    # AbstractState the core uses, equals the air-side duty including the latent part to 1e-6
    res = stagewright.core.solve(_humid_with_coolant())
    for c, st in zip(res.coolers, _sample()["stages"]):
        side = c.exchanger.coolant
        t_ci = st["cooler"]["coolant_inlet_temperature_K"]
        dh = (CP.PropsSI("H", "T", side.outlet_temperature_K, "P", 3e5, "INCOMP::Water")
              - CP.PropsSI("H", "T", t_ci, "P", 3e5, "INCOMP::Water"))
        assert c.water.latent_duty_W > 0.0
        assert 2.0 * dh == pytest.approx(c.water.latent_duty_W + c.water.sensible_duty_W, rel=1e-6)
        assert 2.0 * dh == pytest.approx(c.duty_W, rel=1e-6)
        assert sum(z.duty_W for z in c.exchanger.zones) == pytest.approx(c.duty_W, rel=1e-12)


def test_condensing_wet_zone_matches_direct_integration_with_hapropssi():
    # Counter-flow exchanger integrated along its length from the cold end (Incropera et al. 2007
    # §11.3; Threlkeld 1970 ch. 13): dry zone dUA = dQ/(T_a − T_c), wet zone dUA = c_p,m dQ/(h_a − h_s(T_c))
    # with the air's equilibrium enthalpy from CoolProp HAPropsSI (ASHRAE RP-1485) and liquid water at
    # 4186 J/(kg K) (from memory), coolant from PropsSI INCOMP::Water. The zone model linearises h_s
    # (Braun, Klein & Mitchell 1989): agreement to 1 % (common practice, no source).
    from scipy.integrate import quad
    from scipy.optimize import brentq
    res = stagewright.core.solve(_humid_with_coolant())
    c = res.coolers[1]
    P, W, m, T_in = c.outlet.P, c.inlet.w, res.mass_flow_kg_s, c.inlet.T
    t_dew = CP.HAPropsSI("D", "T", T_in, "P", P, "W", W)

    def h_eq(T):
        if T >= t_dew:
            return CP.HAPropsSI("H", "T", T, "P", P, "W", W)
        ws = CP.HAPropsSI("W", "T", T, "P", P, "R", 1.0)
        return CP.HAPropsSI("H", "T", T, "P", P, "R", 1.0) + (W - ws) * 4186.0 * (T - 273.16)

    t_ci = _sample()["stages"][1]["cooler"]["coolant_inlet_temperature_K"]
    hw = lambda t: CP.PropsSI("H", "T", t, "P", 3e5, "INCOMP::Water")
    hw0, flow = hw(t_ci), 2.0
    h_out = h_eq(c.outlet.T)
    q_tot = m * (h_eq(T_in) - h_out)
    cp_m = (h_eq(T_in) - h_eq(t_dew)) / (T_in - t_dew)
    t_cool = lambda q: brentq(lambda t: hw(t) - (hw0 + q / flow), t_ci, 373.0, xtol=1e-10)
    t_air = lambda h: brentq(lambda t: h_eq(t) - h, c.outlet.T - 1.0, T_in + 1.0, xtol=1e-10)
    q_wet = m * (h_eq(t_dew) - h_out)
    wet = quad(lambda q: cp_m / (h_out + q / m - h_eq(t_cool(q))), 0.0, q_wet, limit=200)[0]
    dry = quad(lambda q: 1.0 / (t_air(h_out + q / m) - t_cool(q)), q_wet, q_tot, limit=200)[0]
    assert c.exchanger.ua_W_K == pytest.approx(wet + dry, rel=1e-2)
    assert c.exchanger.zones[1].ua_W_K == pytest.approx(wet, rel=2e-2)


@pytest.mark.parametrize("arrangement", ["counter_flow", "cross_flow_unmixed", "shell_and_tube_1_2"])
def test_condensing_train_rating_from_ua_inverts_sizing(arrangement):
    doc = _humid_with_coolant(arrangement=arrangement)
    sized, rated = _sized_and_rated(doc)
    for a, b in zip(sized.coolers, rated.coolers):
        assert [z.kind for z in b.exchanger.zones] == ["dry", "wet"]
        assert b.outlet.T == pytest.approx(a.outlet.T, rel=1e-6)
        assert b.duty_W == pytest.approx(a.duty_W, rel=1e-6)
        assert b.water.condensate_kg_s == pytest.approx(a.water.condensate_kg_s, rel=1e-6)
        assert b.water.latent_duty_W == pytest.approx(a.water.latent_duty_W, rel=1e-6)
        assert b.exchanger.coolant.duty_W == pytest.approx(b.duty_W, rel=1e-6)
    assert abs(rated.energy_residual) <= 1e-6 and abs(rated.exergy_residual) <= 1e-6


def test_condensing_ua_is_larger_than_a_dry_only_estimate():
    # the wet zone's enthalpy driving force needs more area than one mean-cp LMTD would claim for the
    # same duty (ASHRAE Handbook, HVAC Systems and Equipment, "Coils": dry and wet zones, from memory)
    from stagewright.core.exchanger import HotSide, make_coolant, size_exchanger
    res = stagewright.core.solve(_humid_with_coolant())
    c = res.coolers[1]
    fluid = make_coolant({"kind": "water"}, (298.15, 101325.0, 0.0))
    t_ci = _sample()["stages"][1]["cooler"]["coolant_inlet_temperature_K"]
    dry_only = size_exchanger("counter_flow", HotSide(c.inlet.T, c.outlet.T, c.duty_W), fluid, t_ci, flow=2.0)
    assert c.exchanger.ua_W_K != pytest.approx(dry_only.ua_W_K, rel=1e-3)
