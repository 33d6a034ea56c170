"""Every sample project loads, solves, closes its balances and respects its limits.

Independent checks use CoolProp's high-level ``PropsSI`` (the Lemmon et al. 2000 air
equation through a different interface than the solver's ``AbstractState`` path), the
`fluids` library's 1976 standard atmosphere, and closed-form algebra.
"""
from __future__ import annotations

import math

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.atmosphere import ATMOSPHERE_1976

import stagewright.core
from tests.conftest import SAMPLES
from stagewright.core.project import load

ALL = sorted(SAMPLES.glob("*.json"))
REQUIRED = {"single_stage_workshop.json", "two_stage_plant_air.json", "three_stage_high_pressure.json",
            "field_check_two_stage.json"}


def _solve(name):
    doc = load(SAMPLES / name)
    return doc, stagewright.core.solve(doc)


def test_the_required_samples_exist():
    assert REQUIRED <= {p.name for p in ALL}


@pytest.mark.parametrize("path", ALL, ids=lambda p: p.name)
def test_sample_solves_closes_and_respects_its_limits(path):
    doc = load(path)
    assert doc["title"].strip() and doc["note"].startswith("Invented")
    r = stagewright.core.solve(doc)
    assert abs(r.energy_residual) <= 1e-6 and abs(r.exergy_residual) <= 1e-6
    # no limit is exceeded (condensate notes on humid samples are information, not a breach)
    assert [w for w in r.warnings if not w.field.endswith(".cooler.separator_efficiency")] == []
    for spec, st in zip(doc["stages"], r.stages):
        assert spec.get("max_discharge_temperature_K") is not None, "every sample states its stage limits"
        assert st.outlet.T < spec["max_discharge_temperature_K"]
        assert 0.0 < st.isentropic_efficiency < st.polytropic_efficiency <= 1.0
    from stagewright.core.project.delivery import delivery_pressure
    from stagewright.core.project.validation import normalise
    assert r.delivery.P == pytest.approx(delivery_pressure(normalise(doc), r.dead.P0), rel=1e-9)


@pytest.mark.parametrize("path", [p for p in ALL if load(p)["flow"]["kind"] == "free_air_delivery"],
                         ids=lambda p: p.name)
def test_free_air_delivery_gives_the_mass_flow_of_ambient_air(path):
    doc, r = load(path), stagewright.core.solve(load(path))
    T0, P0 = doc["site"]["ambient_temperature_K"], r.dead.P0
    # ISO 1217 FAD is at the intake conditions; density from CoolProp PropsSI (HEOS air)
    rh = doc["site"].get("relative_humidity", 0.0)
    if not rh:
        assert r.mass_flow_kg_s == pytest.approx(doc["flow"]["value"] * PropsSI("D", "T", T0, "P", P0, "Air"),
                                                 rel=1e-9)
    else:  # moist intake: dry-air flow = FAD / (moist volume per kg dry air), HAPropsSI (RP-1485)
        from CoolProp.CoolProp import HAPropsSI
        v_da = HAPropsSI("Vda", "T", T0, "P", P0, "R", rh)
        assert r.mass_flow_kg_s == pytest.approx(doc["flow"]["value"] / v_da, rel=1e-4)


def test_plant_air_site_pressure_follows_the_standard_atmosphere():
    doc, r = _solve("two_stage_plant_air.json")
    # fluids' US 1976 atmosphere uses geometric altitude, ISO 2533 geopotential: at 120 m they
    # differ by ~2e-5 relative
    assert r.dead.P0 == pytest.approx(ATMOSPHERE_1976(doc["site"]["elevation_m"]).P, rel=1e-4)


def test_workshop_isentropic_discharge_matches_propssi():
    doc, r = _solve("single_stage_workshop.json")
    st = r.stages[0]
    T2s = PropsSI("T", "P", st.outlet.P, "S", PropsSI("S", "T", st.inlet.T, "P", st.inlet.P, "Air"), "Air")
    assert st.isentropic_outlet.T == pytest.approx(T2s, rel=1e-7)
    assert len(doc["stages"]) == 1 and doc["flow"]["value"] * 60 == pytest.approx(0.55, rel=1e-2)


def test_high_pressure_train_shares_the_remaining_lift_equally():
    doc, r = _solve("three_stage_high_pressure.json")
    # p_del = ((p1 r1 − Δp1) r − Δp2) r − Δp3: a quadratic in r, solved in closed form
    p1 = r.inlet.outlet.P
    r1 = doc["stages"][0]["pressure_ratio"]
    dp = [s["cooler"]["pressure_drop_Pa"] for s in doc["stages"]]
    a, b, c = p1 * r1 - dp[0], -dp[1], -(doc["discharge_pressure_Pa"] + dp[2])
    shared = (-b + math.sqrt(b * b - 4 * a * c)) / (2 * a)
    assert [s.pressure_ratio for s in r.stages] == pytest.approx([r1, shared, shared], rel=1e-10)
    assert doc["discharge_pressure_Pa"] > 4e6  # a high-pressure train: 40 bar(g)


def test_field_check_reproduces_the_readings_and_inverts():
    doc, r = _solve("field_check_two_stage.json")
    assert doc["flow"]["kind"] == "shaft_power"
    assert r.driver_power_W == pytest.approx(142.0e3, rel=1e-5)  # the measured motor input in the note
    for spec, st in zip(doc["stages"], r.stages):
        assert spec["efficiency"]["kind"] == "discharge_temperature"
        assert st.outlet.T == pytest.approx(spec["efficiency"]["value_K"], abs=1e-9)
        # ηs from the readings with PropsSI: h2i = h2 + q (casing loss per kg), no exit velocity
        s1 = PropsSI("S", "T", st.inlet.T, "P", st.inlet.P, "Air")
        h1 = PropsSI("H", "T", st.inlet.T, "P", st.inlet.P, "Air")
        h2s = PropsSI("H", "P", st.outlet.P, "S", s1, "Air")
        h2 = PropsSI("H", "T", st.outlet.T, "P", st.outlet.P, "Air")
        q = spec["heat_loss_W"] / r.mass_flow_kg_s
        assert st.isentropic_efficiency == pytest.approx((h2s - h1) / (h2 + q - h1), rel=1e-6)
    # the inverse: the flow found, given as mass flow, takes the measured shaft power
    forward = dict(doc, flow={"kind": "mass", "value": r.mass_flow_kg_s})
    assert stagewright.core.solve(forward).shaft_power_W == pytest.approx(doc["flow"]["value"], rel=1e-9)
