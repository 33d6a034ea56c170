"""Coolers in a train: coolant energy balance, rating from UA, closures, old keys unchanged."""
import copy
import json

import CoolProp.CoolProp as CP
import pytest

import thermo
from tests.conftest import SAMPLES, make_doc
from thermo.errors import InputError


def _sample():
    return json.loads((SAMPLES / "two_stage_plant_air.json").read_text())


def _with_coolant(doc, coolant, arrangement="counter_flow"):
    doc = copy.deepcopy(doc)
    for st in doc["stages"]:
        st["cooler"]["coolant"] = dict(coolant)
        st["cooler"]["arrangement"] = arrangement
    return doc


def test_without_new_keys_nothing_changes_but_the_none_fields():
    plain = thermo.solve(_sample()).to_dict()
    sized = thermo.solve(_with_coolant(_sample(), {"kind": "water", "temperature_rise_K": 8.0})).to_dict()
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
    res = thermo.solve(doc)
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
    sized = thermo.solve(doc)
    rated_doc = copy.deepcopy(doc)
    for st, c in zip(rated_doc["stages"], sized.coolers):
        del st["cooler"]["approach_K"]
        st["cooler"]["ua_W_K"] = c.exchanger.ua_W_K
    rated = thermo.solve(rated_doc)
    for a, b in zip(sized.coolers, rated.coolers):
        assert b.outlet.T == pytest.approx(a.outlet.T, rel=1e-6)
        assert b.duty_W == pytest.approx(a.duty_W, rel=1e-6)
    assert abs(rated.energy_residual) <= 1e-6


def test_air_cooled_defaults_to_site_ambient():
    doc = make_doc(model="ideal_gas", stages=1, p_out=8e5, T0=303.15)
    doc["stages"][0]["cooler"] = {"approach_K": 12.0, "coolant": {"kind": "air", "temperature_rise_K": 10.0},
                                  "arrangement": "cross_flow_unmixed"}
    c = thermo.solve(doc).to_dict()["stages"][0]["cooler"]
    assert c["outlet"]["temperature_K"] == pytest.approx(315.15)
    assert c["coolant_inlet_temperature_K"] == pytest.approx(303.15)
    assert c["coolant_outlet_temperature_K"] == pytest.approx(313.15)
    assert 0.0 < c["lmtd_correction_factor"] < 1.0


def test_bad_cooler_inputs_name_field_and_limit():
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": 0.05})
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.coolant\.flow_kg_s.*at least"):
        thermo.solve(doc)
    doc = _with_coolant(_sample(), {"kind": "water", "flow_kg_s": 1.0})
    doc["stages"][0]["cooler"]["approach_K"] = 0.0
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.approach_K.*above 0 K"):
        thermo.solve(doc)
    doc = _sample()
    del doc["stages"][0]["cooler"]["approach_K"]
    doc["stages"][0]["cooler"]["ua_W_K"] = 1000.0
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.coolant.*required"):
        thermo.solve(doc)
    doc["stages"][0]["cooler"]["approach_K"] = 5.0
    with pytest.raises(InputError, match="exactly one of outlet_temperature_K, approach_K, ua_W_K"):
        thermo.solve(doc)
    doc = _with_coolant(_sample(), {"kind": "glycol", "flow_kg_s": 1.0})
    with pytest.raises(InputError, match="glycol_fraction"):
        thermo.solve(doc)
