"""Humid intake air below 0 °C (issue 15): humidity conventions, frost points, frozen-condensate cautions.

Outside references named beside each check: CoolProp ``HAPropsSI`` (ASHRAE RP-1485, Herrmann,
Kretzschmar & Gatley 2009; its relative humidity ``R`` is over ice below 0.01 °C), CoolProp's
IAPWS-95 continued into supercooled water, and the IAPWS R14-08(2011) verification table of
the sublimation pressure (Wagner, Riethmann, Feistel & Harvey, J. Phys. Chem. Ref. Data 40,
043103 (2011)).
"""
import math

import CoolProp.CoolProp as CP
import pytest

from stagewright.core.models import make_model
from stagewright.core.moist.dew_point import dew_point
from stagewright.core.moist.mixture import make_mixture
from stagewright.core.moist.saturation import (liquid_vapour_pressure, saturation_pressure, sublimation_pressure,
                                     supercooled_vapour_pressure, vapour_pressure)
from stagewright.core.moist.stream import ice_supersaturation, intake_humidity_ratio
from stagewright.core.solve import solve

P0 = 101325.0


@pytest.fixture(scope="module")
def real_mix():
    return make_mixture(make_model({"model": "real_gas"}))


@pytest.mark.parametrize("T", [236.0, 250.0, 265.0, 272.0])
def test_supercooled_vapour_pressure_against_iapws95_continued(T):
    # CoolProp's IAPWS-95 (Wagner & Pruss 2002) continued below the triple point; Murphy & Koop
    # (2005) report agreement with it to a few tenths of a percent down to about 236 K (from memory)
    assert supercooled_vapour_pressure(T) == pytest.approx(CP.PropsSI("P", "T", T, "Q", 0, "Water"), rel=3e-3)


def test_liquid_reference_is_continuous_at_0C():
    # IF97 above 273.15 K, Murphy & Koop below: the hand-over is seamless (measured 3e-8)
    assert supercooled_vapour_pressure(273.15) == pytest.approx(saturation_pressure(273.15), rel=1e-7)
    assert liquid_vapour_pressure(273.149999) == pytest.approx(liquid_vapour_pressure(273.15), rel=1e-6)


def test_stable_phase_saturation_switches_to_ice_at_the_triple_point():
    # IAPWS R14-08(2011) Table 3: p_subl(230 K) = 8.947352740e-6 MPa; IF97 meets it at 273.16 K
    assert vapour_pressure(230.0) == pytest.approx(8.947352740, rel=1e-9)
    assert vapour_pressure(273.16) == pytest.approx(611.657, abs=1e-6)
    assert vapour_pressure(263.15) < liquid_vapour_pressure(263.15)


@pytest.mark.parametrize("T0, rh_w", [(223.15, 0.55), (240.0, 0.6), (255.0, 0.7), (265.15, 0.85), (272.5, 0.9)])
def test_sub_zero_humidity_ratio_against_hapropssi(real_mix, T0, rh_w):
    # WMO convention: rh relative to liquid water. HAPropsSI's R is over ice below 0.01 °C, so the
    # same air has R = rh_w e_w/e_i; RP-1485 via CoolProp (HAPropsSI) is the outside reference.
    W = intake_humidity_ratio({"relative_humidity": rh_w}, real_mix, T0, P0)
    r_ice = rh_w * liquid_vapour_pressure(T0) / sublimation_pressure(T0)
    assert r_ice < 1.0
    W_ref = CP.HAPropsSI("W", "T", T0, "P", P0, "R", r_ice)
    assert W == pytest.approx(W_ref, rel=1e-6)
    assert ice_supersaturation(real_mix, T0, P0, W) == 0.0


@pytest.mark.parametrize("T0, t_frost", [(240.0, 230.0), (263.15, 255.0), (270.0, 268.0)])
def test_frost_point_input_against_hapropssi(real_mix, T0, t_frost):
    # a dew point below 0.01 °C is a frost point; HAPropsSI's Tdp input is too (RP-1485)
    W = intake_humidity_ratio({"dew_point_K": t_frost}, real_mix, T0, P0)
    assert W == pytest.approx(CP.HAPropsSI("W", "T", T0, "P", P0, "Tdp", t_frost), rel=1e-6)


def test_frost_point_reproduces_the_iapws_2011_verification_value(real_mix):
    # IAPWS R14-08(2011) Table 3: p_subl(230 K) = 8.947352740e-6 MPa. Air whose vapour partial
    # pressure is f(230 K, p) times that value has its frost point at 230 K.
    P = 8.0e5
    x = real_mix.enhancement(230.0, P) * 8.947352740 / P
    W = real_mix.epsilon * x / (1.0 - x)
    assert dew_point(real_mix, W, P) == pytest.approx(230.0, abs=1e-6)
    assert real_mix.dew_point(P0, 1e-5) == pytest.approx(CP.HAPropsSI("Tdp", "T", 280.0, "P", P0, "W", 1e-5),
                                                         abs=2e-3)


def test_relative_humidity_above_ice_saturation_deposits_rime(real_mix):
    # at −10 °C ice saturates at e_i/e_w ≈ 0.907 relative to water (IAPWS 2011 / Murphy & Koop)
    W = intake_humidity_ratio({"relative_humidity": 0.97}, real_mix, 263.15, P0)
    excess = ice_supersaturation(real_mix, 263.15, P0, W)
    assert excess > 0.0
    assert W - excess == pytest.approx(CP.HAPropsSI("W", "T", 263.15, "P", P0, "R", 1.0), rel=1e-6)


def _cold_doc(T0=265.15, rh=0.85, approach=5.0, model="real_gas"):
    cooler = {"coolant": {"kind": "air", "temperature_rise_K": 10.0}}
    return {"site": {"ambient_temperature_K": T0, "relative_humidity": rh}, "fluid": {"model": model},
            "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 8e5,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "cooler": {**cooler, "approach_K": 12.0}},
                       {"efficiency": {"kind": "isentropic", "value": 0.8},
                        "cooler": {**cooler, "approach_K": approach}}]}


@pytest.mark.parametrize("model", ["real_gas", "ideal_gas", "constant_cp"])
def test_winter_intake_solves_and_closes(model):
    # issue 15: −8 °C and 85 % RH used to be refused ("water vapour over ice is out of scope")
    r = solve(_cold_doc(model=model)).to_dict()
    assert abs(r["energy_residual"]) < 1e-9 and abs(r["exergy_residual"]) < 1e-9
    assert abs(r["water_balance_residual"]) < 1e-9
    assert r["intake_humidity_ratio"] > 0.0


def test_air_cooled_aftercooler_at_frozen_ambient_warns_of_frozen_condensate():
    r = solve(_cold_doc(approach=5.0)).to_dict()
    frozen = [w for w in r["warnings"] if "would freeze" in w["message"]]
    assert [w["field"] for w in frozen] == ["stages[1].cooler"]
    assert "frozen ambient" in frozen[0]["message"] and "minimum air outlet temperature" in frozen[0]["message"]
    # the delivered air saturated over ice at the outlet: its pressure dew point is a frost point,
    # checked against RP-1485 via HAPropsSI (Tdp below 0.01 °C is over ice)
    out = r["stages"][1]["cooler"]["outlet"]
    pdp = r["delivered_pressure_dew_point_K"]
    assert pdp < 273.16
    delivered_w = r["delivered_water_kg_s"] / r["mass_flow_kg_s"]
    ref = CP.HAPropsSI("Tdp", "T", out["temperature_K"] + 5.0, "P", out["pressure_Pa"], "W", delivered_w)
    assert pdp == pytest.approx(ref, abs=5e-3)


def test_warm_site_gets_no_freeze_caution():
    r = solve(_cold_doc(T0=293.15, rh=0.6)).to_dict()
    assert not any("freez" in w["message"] for w in r["warnings"])


def test_cold_coolant_above_zero_outlet_no_ice_caution_but_close_margin():
    r = solve(_cold_doc(approach=9.0)).to_dict()  # outlet 274.15 K: within the 2 K margin
    msgs = [w["message"] for w in r["warnings"] if "freez" in w["message"]]
    assert any("within a few kelvin of freezing" in m for m in msgs)
    assert not any("forms as ice" in m for m in msgs)


def test_supersaturated_intake_warns_of_rime_and_keeps_water_balance():
    r = solve(_cold_doc(rh=0.98)).to_dict()
    assert any(w["field"] == "site.relative_humidity" and "rime" in w["message"] for w in r["warnings"])
    assert abs(r["water_balance_residual"]) < 1e-9


def test_year_with_a_frozen_month_runs():
    # the reproduction: one month at −8 °C and 85 % RH stopped the whole year
    from stagewright.core.year import run_year
    doc = _cold_doc(T0=288.15, rh=0.6, approach=12.0)
    months = [{"temperature_K": 265.15 if i in (0, 1) else 283.15, "relative_humidity": 0.85 if i < 2 else 0.7}
              for i in range(12)]
    doc["year"] = {"profile": {"kind": "monthly", "months": months}}
    y = run_year(doc)
    assert len(y.bins) == 12 and math.isfinite(y.totals["energy_kWh"])


def test_air_cooled_train_with_rime_at_the_intake_solves():
    # the ambient air that cools an air-cooled cooler is then saturated over ice: its relative
    # humidity passed to HAPropsSI must not round above 1 (found solving an hourly year)
    doc = _cold_doc(T0=265.89186, rh=0.94)
    doc["site"]["elevation_m"] = 240.0
    r = solve(doc).to_dict()
    assert any("rime" in w["message"] for w in r["warnings"])


def test_sweep_and_study_run_a_humid_intake_below_zero():
    # issue 15: single solves, years, studies and sweeps all take a humid intake down to 223.15 K
    from stagewright.core.study.compare import compare_stagings
    from stagewright.core.sweep import sweep
    r = sweep(_cold_doc(), {"site.ambient_temperature_K": [223.15, 248.15, 268.15, 283.15]}, processes=1)
    assert r.to_dict()["errors"] == {}
    doc = _cold_doc(T0=258.15, rh=0.8)
    doc["stages"] = doc["stages"][:1]
    assert [o.stages for o in compare_stagings(doc, 2).options] == [1, 2]
