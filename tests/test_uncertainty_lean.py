"""The field check's lean Monte Carlo draws (thermo/uncertainty/lean_figures.py) against the full solve.

The reference is the full solve (``stagewright.core.solve.solve_normalised``), itself checked against
published sources elsewhere (tests/test_stage.py, tests/test_train.py, and the closed-form
perfect-gas stage of tests/test_uncertainty_field_check.py). What is checked here is agreement:
a draw evaluated lean gives the full solve's figures, the draws the full solve refuses are
refused the same way, and a Monte Carlo run on the fast path (lean draws, fast property path)
agrees with one on the exact path (full exact solve for every draw) within its statistical
error (JCGM 101:2008 §7.6, §8).
"""
from __future__ import annotations

import copy
import json
import math

import numpy as np
import pytest

from conftest import SAMPLES
from stagewright.core import coolprop_adapter
from stagewright.core.project.validation import normalise
from stagewright.core.uncertainty.figures import result_figures
from stagewright.core.uncertainty.inputs import measured_inputs
from stagewright.core.uncertainty.measurement_model import MeasurementModel
from stagewright.core.uncertainty.monte_carlo import draw_inputs, propagate_monte_carlo


def _sample() -> dict:
    return json.loads((SAMPLES / "field_check_two_stage.json").read_text())


def _model(doc: dict, **kw) -> MeasurementModel:
    norm = normalise(doc)
    return MeasurementModel(norm, measured_inputs(norm), result_figures(norm), **kw)


def _isentropic_fad(doc: dict) -> dict:
    """The sample with stage 2 given by its isentropic efficiency (no casing loss) and the flow as FAD."""
    doc["stages"][1]["efficiency"] = {"kind": "isentropic", "value": 0.78}
    doc["stages"][1]["heat_loss_W"] = 0.0
    doc["flow"] = {"kind": "free_air_delivery", "value": 0.37}
    unc = doc["field_check"]["uncertainties"]
    doc["field_check"]["uncertainties"] = [u for u in unc if u["input"] not in (
        "stages[1].efficiency.value_K", "stages[1].heat_loss_W")]
    doc["field_check"]["guarantees"] = []
    return doc


def _fluid(model: str):
    def change(doc):
        doc["fluid"] = {"model": model}
        return doc
    return change


@pytest.mark.parametrize("variant", [lambda d: d, _isentropic_fad, _fluid("ideal_gas"), _fluid("constant_cp")],
                         ids=["sample", "isentropic-stage-fad", "ideal-gas", "constant-cp"])
def test_lean_draws_give_the_full_solves_figures(variant):
    model = _model(variant(_sample()))
    xs = draw_inputs(model.inputs, 150, 11)
    assert model.enable_lean([model.nominal, *xs[:8]])
    for x in xs:
        lean, full = model.draw(x), model(x)
        # both find their states to about 1e-9 K; the full solve's shaft-power flow to 1e-12
        np.testing.assert_allclose(lean, full, rtol=1e-9, atol=0.0)


def _agree_within_statistical_error(fast, exact):
    m = exact.solved
    assert fast.solved == m and fast.failed == exact.failed
    u = exact.standard_uncertainty
    # standard error of a mean s/√M and of a standard deviation s/√(2(M-1)) (normal theory,
    # JCGM 101:2008 §7.6); the 3-σ band is common practice, no source
    assert np.all(np.abs(fast.mean - exact.mean) <= 3.0 * u / math.sqrt(m))
    assert np.all(np.abs(fast.standard_uncertainty - u) <= 3.0 * u / math.sqrt(2.0 * (m - 1)))
    # the same seeded draws through two evaluations that agree to ≤ 1e-4 (the fast property path's
    # promise, tests/test_fast_path.py): much closer than the statistical error
    np.testing.assert_allclose(fast.mean, exact.mean, rtol=1e-6)
    np.testing.assert_allclose(fast.standard_uncertainty, u, rtol=1e-4)


def test_monte_carlo_on_the_fast_path_agrees_with_the_exact_path():
    doc = _sample()
    fast_model = _model(doc)
    fast = propagate_monte_carlo(fast_model, 400, 5)
    assert fast_model.lean  # the draws above went the lean way
    exact = propagate_monte_carlo(_model(doc, fast=False, allow_lean=False), 400, 5)
    _agree_within_statistical_error(fast, exact)


def test_moist_monte_carlo_on_the_fast_property_path_agrees_with_the_exact_path():
    # moist real-gas air: the fast path interpolates the RP-1485 enhancement factor; draws are full solves
    doc = _sample()
    doc["site"]["relative_humidity"] = 0.6
    doc["field_check"]["uncertainties"].append({"kind": "limits", "input": "site.relative_humidity",
                                                "half_width": 0.05})
    fast_model = _model(doc)
    fast = propagate_monte_carlo(fast_model, 150, 5)
    assert not fast_model.lean
    exact = propagate_monte_carlo(_model(doc, fast=False, allow_lean=False), 150, 5)
    _agree_within_statistical_error(fast, exact)


def _edgy_stage() -> dict:
    """Perfect gas, one stage (isentropic discharge 435.6 K) and an aftercooler, with uncertainties so
    wide that some draws need η_s > 1, some have the cooler heating the air and some lose more heat
    through the casing than the gas can give. The flow is about 2 kg/s: the full solve's first trial
    flow (1 kg/s) then never refuses a draw that its converged flow would accept (at a small flow it
    can: a casing loss per kilogram that makes up for a discharge below the isentropic one is smaller
    at the trial; the lean evaluation solves such a draw at its own flow)."""
    unc = [{"input": "stages[0].efficiency.value_K", "kind": "standard", "standard_uncertainty": 6.0},
           {"input": "stages[0].cooler.outlet_temperature_K", "kind": "limits", "half_width": 8.0},
           {"input": "stages[0].heat_loss_W", "kind": "limits", "half_width": 4000.0},
           {"input": "site.ambient_temperature_K", "kind": "standard", "standard_uncertainty": 0.5}]
    return {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
            "fluid": {"model": "constant_cp"}, "flow": {"kind": "shaft_power", "value": 320000.0},
            "discharge_pressure_Pa": 3.9e5,
            "stages": [{"pressure_ratio": 4.0, "heat_loss_W": 4000.0,
                        "heat_loss_boundary_temperature_K": 430.0,
                        "efficiency": {"kind": "discharge_temperature", "value_K": 442.0},
                        "cooler": {"outlet_temperature_K": 432.0, "pressure_drop_Pa": 10000.0}}],
            "field_check": {"uncertainties": unc, "guarantees": []}}


def test_draws_the_full_solve_refuses_are_refused_the_same_way():
    lean_model = _model(_edgy_stage())
    lean = propagate_monte_carlo(lean_model, 1500, 4)
    assert lean_model.lean
    full = propagate_monte_carlo(_model(_edgy_stage(), allow_lean=False), 1500, 4)
    assert 0 < full.failed < 1500
    assert (lean.solved, lean.failed, lean.first_failure) == (full.solved, full.failed, full.first_failure)
    np.testing.assert_allclose(lean.mean, full.mean, rtol=1e-9)
    np.testing.assert_allclose(lean.standard_uncertainty, full.standard_uncertainty, rtol=1e-7)
    np.testing.assert_allclose(np.r_[lean.low, lean.high], np.r_[full.low, full.high], rtol=1e-9)


def _with_coolant(doc):
    doc["stages"][0]["cooler"]["coolant"] = {"kind": "water", "flow_kg_s": 3.0}
    return doc


def _polytropic(doc):
    doc["stages"][1]["efficiency"] = {"kind": "polytropic", "value": 0.8}
    doc["field_check"]["uncertainties"] = [u for u in doc["field_check"]["uncertainties"]
                                           if u["input"] != "stages[1].efficiency.value_K"]
    doc["field_check"]["guarantees"] = []
    return doc


def _moist(doc):
    doc["site"]["relative_humidity"] = 0.5
    return doc


def _exit_velocity(doc):
    doc["stages"][0]["exit_velocity_m_s"] = 30.0
    return doc


@pytest.mark.parametrize("variant", [_with_coolant, _polytropic, _moist, _exit_velocity],
                         ids=["coolant", "polytropic", "moist", "exit-velocity"])
def test_trains_the_lean_evaluation_does_not_cover_keep_the_full_solve(variant):
    model = _model(variant(_sample()))
    assert not model.enable_lean([model.nominal])
    x = model.nominal
    np.testing.assert_array_equal(model.draw(x), model(x))


def test_a_lean_evaluation_that_disagrees_with_the_full_solve_is_not_used():
    model = _model(_sample())
    honest = model._lean_figures

    def off_by_a_little(norm, dry_model):
        y = honest(norm, dry_model)
        return [y[0] * (1.0 + 1e-6)] + y[1:]
    model._lean_figures = off_by_a_little
    assert not model.enable_lean([model.nominal])
    model._lean_figures = honest
    assert model.enable_lean([model.nominal])


def test_a_draw_needs_few_property_updates(monkeypatch):
    # a call count, not a timing (bench/run.py measures the time): the full solve of the sample
    # needed 58 CoolProp updates a draw (two train solves for the shaft-power flow, Newton
    # inversions started from rough guesses, states only reports need)
    norm = normalise(_sample())
    model = MeasurementModel(norm, measured_inputs(norm), result_figures(norm))
    xs = draw_inputs(model.inputs, 200, 2)
    getattr(model, "enable_lean", lambda points: None)([model.nominal, *xs[:8]])  # what propagate_monte_carlo does
    evaluate = getattr(model, "draw", model)
    calls = []
    real = coolprop_adapter.update_tp
    monkeypatch.setattr(coolprop_adapter, "update_tp", lambda *a, **k: (calls.append(1), real(*a, **k))[1])
    for x in xs:
        evaluate(x)
    assert len(calls) / len(xs) <= 12


def test_two_processes_give_the_same_answer_as_one():
    doc = _sample()
    one = propagate_monte_carlo(_model(copy.deepcopy(doc)), 600, 9)
    two = propagate_monte_carlo(_model(copy.deepcopy(doc)), 600, 9, processes=2)
    np.testing.assert_array_equal(one.mean, two.mean)
    np.testing.assert_array_equal(one.standard_uncertainty, two.standard_uncertainty)
