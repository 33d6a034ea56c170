"""The isothermal reference of a moist train on the interpolated enhancement factor.

The reversible isothermal power delivers the train's condensate at the ambient temperature and
each drain's pressure; the Gibbs energy of that water is the only place the reference meets the
enhancement factor f, and it moves by R_w T0 δln f per kilogram. So the reference takes f from the
interpolation table (stagewright.core.moist.enhancement_table, within 1e-7 in ln f) instead of four
exact RP-1485 evaluations at every new ambient. Checked here: the isothermal power (and with it the
isothermal efficiency) agrees with the one on the exact factor to 1e-8 relative on random trains,
every other figure is untouched (bit for bit), and a solve at a new ambient asks CoolProp for the
exact factor once (the intake's humidity), where it asked five times before.
"""
from __future__ import annotations

import copy

import pytest
from hypothesis import HealthCheck, given, settings

import stagewright.core
from stagewright.core import coolprop_adapter as cpa
from stagewright.core.moist.mixture import MoistMixture
from tests.test_train import moist_projects


def _exact_reference(monkeypatch):
    monkeypatch.setattr(MoistMixture, "interpolated", lambda self: self)


def _both(doc, monkeypatch):
    ours = stagewright.core.solve(copy.deepcopy(doc))
    with monkeypatch.context() as m:
        _exact_reference(m)
        exact = stagewright.core.solve(copy.deepcopy(doc))
    return ours, exact


@settings(max_examples=20, deadline=None, suppress_health_check=[HealthCheck.too_slow,
                                                                 HealthCheck.function_scoped_fixture])
@given(doc=moist_projects(models=("real_gas",), always_cool=True))
def test_isothermal_power_agrees_with_the_exact_factor_on_random_trains(doc, monkeypatch):
    ours, exact = _both(doc, monkeypatch)
    assert ours.isothermal_power_W == pytest.approx(exact.isothermal_power_W, rel=1e-8, abs=0.0)
    assert ours.isothermal_efficiency == pytest.approx(exact.isothermal_efficiency, rel=1e-8, abs=0.0)
    # nothing else reads the reference: the balance itself is the same to the last bit
    assert ours.shaft_power_W == exact.shaft_power_W
    assert ours.water.condensate_kg_s == exact.water.condensate_kg_s
    assert [s.outlet.T for s in ours.stages] == [s.outlet.T for s in exact.stages]


def _humid_train(T0: float) -> dict:
    """Invented: a humid 3-stage real-gas train to 25 bar(a) whose coolers all drain water."""
    return {"site": {"ambient_temperature_K": T0, "barometric_pressure_Pa": 99_000.0, "relative_humidity": 0.7},
            "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 0.8}, "discharge_pressure_Pa": 25e5,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                        "cooler": {"outlet_temperature_K": 305.0, "pressure_drop_Pa": 10_000.0}}
                       for _ in range(3)]}


def test_condensing_train_reference_uses_the_table_within_its_bound(monkeypatch):
    ours, exact = _both(_humid_train(301.0), monkeypatch)
    assert all(c.water.drained_kg_s > 0.0 for c in ours.coolers)
    assert ours.isothermal_power_W != exact.isothermal_power_W  # the table is in use
    assert ours.isothermal_power_W == pytest.approx(exact.isothermal_power_W, rel=1e-8, abs=0.0)


def test_a_new_ambient_asks_for_the_exact_factor_once(monkeypatch):
    calls = []
    real = cpa.humid_air_coefficient

    def counted(name, T, P):
        calls.append((name, T, P))
        return real(name, T, P)

    stagewright.core.solve(_humid_train(301.3))  # the table's cells near 301 K are filled here
    monkeypatch.setattr(cpa, "humid_air_coefficient", counted)
    stagewright.core.solve(_humid_train(301.3 + 0.0173))  # a new ambient: no cached factor applies
    # the intake humidity (exact); the cooler outlets repeat their (T, p) and are cached
    assert [c[0] for c in calls] == ["f"]
    assert calls[0][2] == 99_000.0
