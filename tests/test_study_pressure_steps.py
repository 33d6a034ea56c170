"""The study's gradients taken in the intermediate pressures: exact pressures, local re-solves, same derivatives.

No physical values are checked here: the checks are floating-point identities of the pressure
recurrence (stagewright.core.split.delivered_pressure), the chain rule (Nocedal & Wright,
Numerical Optimization, 2nd ed., 2006, §8.1 and §A.2) against plain differences in the ratios,
and how many stages a difference solves again.
"""
from __future__ import annotations

import importlib
import random

import numpy as np
import pytest

import stagewright.core
from stagewright.core.study.prepare import prepare
from stagewright.core.study.pressure_steps import pressure_step, ratio_meeting, stage_pressures

from conftest import make_doc

optimal_split_module = importlib.import_module("stagewright.core.study.optimal_split")
train_module = importlib.import_module("stagewright.core.train")


def _problem(doc):
    return optimal_split_module._Problem(prepare(doc), lambda: False)


def test_stage_pressures_are_the_trains_own_bit_for_bit():
    doc = make_doc(model="real_gas", stages=4, p_out=20e5, drop=13_333.3, cool_to=305.0)
    problem = _problem(doc)
    ratios = [2.3, 2.1, 1.9, 1.7]
    d = dict(problem.doc, stages=[dict(s, pressure_ratio=r) for s, r in zip(problem.doc["stages"], ratios)])
    result = stagewright.core.solve(d, detail=False)
    assert [s.outlet.P for s in result.stages] == stage_pressures(problem.p_in, ratios, problem.drops)


def test_a_pressure_step_moves_that_pressure_only_and_reports_its_exact_size():
    rng = random.Random(7)
    steps, kept = 0, 0
    for _ in range(300):
        n = rng.randint(2, 8)
        ratios = [rng.uniform(1.05, 4.0) for _ in range(n)]
        drops = [rng.uniform(0.0, 20_000.0) for _ in range(n)]
        p_in = rng.uniform(0.8e5, 1.05e5)
        before = stage_pressures(p_in, ratios, drops)
        for i in range(n - 1):
            for rel in (1e-6, -1e-6):
                moved, step = pressure_step(p_in, ratios, drops, i, rel)
                after = stage_pressures(p_in, moved, drops)
                assert after[:i] == before[:i] and after[i] - before[i] == step
                assert step == pytest.approx(rel * before[i], rel=1e-6)
                assert after[i + 1:] == pytest.approx(before[i + 1:], rel=1e-15)
                steps += 1
                kept += after[i + 1:] == before[i + 1:]  # bit for bit: the stages after i + 1 are reused
    assert kept >= 0.999 * steps

def test_ratio_meeting_finds_an_exact_product_where_there_is_one():
    # a * r steps by a * ulp(r), up to two ulps of p: about one p in four has no exact ratio
    rng = random.Random(3)
    found = 0
    for _ in range(2000):
        a, p = rng.uniform(1e5, 3e6), rng.uniform(1e5, 4e6)
        r = ratio_meeting(a, p)
        if r is not None:
            assert a * r == p
            found += 1
    assert found > 1000


@pytest.mark.parametrize("model", ["constant_cp", "real_gas"])
def test_gradient_in_pressures_matches_plain_differences_in_ratios(model):
    doc = make_doc(model=model, stages=5, p_out=25e5, drop=12_000.0, cool_to=303.15)
    doc["stages"][2]["max_discharge_temperature_K"] = 420.0
    doc["stages"][1]["efficiency"]["value"] = 0.74
    problem = _problem(doc)
    start = problem.start()
    problem.w_ref = start.power_W
    x = problem.x_of(start.ratios) + 0.05  # off the optimum, where the derivatives are not small
    df, dc = problem.jacobian(x)
    df_plain, dc_plain = problem.ratio_jacobian(x)
    # each forward difference of step 1e-6 errs by about 1e-6 of the curvature of the scaled
    # power (about 5 at most here) and of the scaled temperature margins
    assert np.max(np.abs(df - df_plain)) < 5e-6 and np.max(np.abs(df)) > 1e-3
    assert np.max(np.abs(dc - dc_plain)) < 5e-6 and np.max(np.abs(dc)) > 1e-3


@pytest.mark.parametrize("model", ["constant_cp", "real_gas"])
def test_a_difference_solves_only_the_two_stages_around_its_pressure(model, monkeypatch):
    # Dry air: nothing carries from one cooler to the next but the pressure. The old differences
    # in the ratios re-solved every stage after the one whose ratio moved (35 stage solves for
    # the 7 variables of an 8-stage train); in the pressures it is two a variable.
    n = 8
    problem = _problem(make_doc(model=model, stages=n, p_out=30e5, drop=10_000.0, cool_to=300.0))
    start = problem.start()
    problem.w_ref = start.power_W
    x = problem.x_of(start.ratios) + 0.01  # a point no trial has seen
    problem.values(x)
    solved = []
    original = train_module.solve_stage

    def counting(model_, spec, i, *args, **kwargs):
        solved.append(i)
        return original(model_, spec, i, *args, **kwargs)
    monkeypatch.setattr(train_module, "solve_stage", counting)
    problem.jacobian(x)
    assert len(solved) == 2 * (n - 1)
    assert sorted(solved) == sorted(list(range(n - 1)) + list(range(1, n)))
    solved.clear()
    problem.jacobian(x)  # asked again for the constraints: nothing is solved
    assert solved == [] and np.all(np.isfinite(problem.jacobian(x)[0]))
