"""The fast property path of studies and sweeps against the exact path, on random trains.

The fast path (``solve_normalised(..., detail=False, fast=True)``) skips reporting-only work
and interpolates the RP-1485 enhancement factor (stagewright.core.moist.enhancement_table); the exact path is
the full solve, itself checked against CoolProp's HAPropsSI in tests/test_moist_mixture.py
and against handbook values elsewhere. What is checked here is agreement, not speed: every
figure a sweep reports must agree to 1e-4 relative (the tolerance the fast path promises).
"""
from __future__ import annotations

import copy

import pytest
from hypothesis import HealthCheck, given, settings

import stagewright.core
from stagewright.core.project.validation import normalise
from stagewright.core.solve import solve_normalised
from stagewright.core.sweep import SWEEP_OUTPUTS, _summary
from tests.test_train import moist_projects

REL = 1e-4


def _compare(doc):
    exact = stagewright.core.solve(copy.deepcopy(doc))
    fast = solve_normalised(normalise(copy.deepcopy(doc)), detail=False, fast=True)
    for key, a, b in zip(SWEEP_OUTPUTS, _summary(fast), _summary(exact)):
        if key == "condensate_kg_s":  # may be zero: relative to the water taken in
            assert a == pytest.approx(b, rel=REL, abs=REL * exact.water.intake_water_kg_s), key
        else:
            assert a == pytest.approx(b, rel=REL), key
    for a, b in zip(fast.stages, exact.stages):
        assert a.outlet.T == pytest.approx(b.outlet.T, rel=REL)
        assert a.outlet.w == pytest.approx(b.outlet.w, rel=REL, abs=REL * exact.water.intake_humidity_ratio)
    assert fast.water.delivered_pressure_dew_point_K == pytest.approx(
        exact.water.delivered_pressure_dew_point_K, rel=REL)
    return exact, fast


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects(models=("real_gas",), always_cool=True))
def test_fast_path_agrees_with_the_exact_path_on_random_moist_real_gas_trains(doc):
    _compare(doc)


@settings(max_examples=10, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects(models=("constant_cp", "ideal_gas"), always_cool=True))
def test_fast_path_changes_nothing_for_the_ideal_mixtures(doc):
    # the ideal mixtures have no enhancement factor: fast and lean are the same solve
    lean = solve_normalised(normalise(copy.deepcopy(doc)), detail=False)
    fast = solve_normalised(normalise(copy.deepcopy(doc)), detail=False, fast=True)
    assert _summary(fast) == _summary(lean)


def test_fast_path_uses_the_table_and_the_full_solve_does_not():
    # a humid plant-air train: the fast solve must differ from the exact one (the table is in
    # use) by far less than the promised tolerance, and a full solve must stay exact
    from stagewright.core.moist import mixture as moist_mixture
    doc = {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100e3, "relative_humidity": 0.8},
           "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 8e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                       "cooler": {"outlet_temperature_K": 308.15}} for _ in range(2)]}
    exact, fast = _compare(doc)
    assert exact.water.condensate_kg_s > 0.0
    assert moist_mixture._FAST_TABLE is not None and moist_mixture._FAST_TABLE.__wrapped__.nodes_computed > 0
    lean = stagewright.core.solve(copy.deepcopy(doc), detail=False)
    assert lean.water.condensate_kg_s == pytest.approx(exact.water.condensate_kg_s, rel=1e-9)
    assert fast.water.condensate_kg_s != lean.water.condensate_kg_s
    assert fast.water.condensate_kg_s == pytest.approx(exact.water.condensate_kg_s, rel=1e-6)
