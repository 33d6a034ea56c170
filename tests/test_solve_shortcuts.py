"""The full solve's shortcuts (issue 19) against straightforward references, on random trains.

- Chart points (the cooling lines, the path of a stage with casing loss or exit velocity) are
  made when something reads them, never in the balance; made later they are the same points.
- The polytropic efficiency of isentropic and measured-temperature moist stages comes from one
  RK4 path integration (stagewright.core.polytropic._from_one_path); the reference is the plain
  definition: the efficiency whose RK4 path (the public ``polytropic_path``) ends at the
  discharge temperature, found by Brent's method to 1e-15. The issue's tolerance: 1e-8 relative.

What is checked is agreement with the straightforward calculation, not physics (the paths
and efficiencies themselves are checked against published sources in test_stage.py and
test_ts_lines.py).
"""
from __future__ import annotations

import copy
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

import stagewright.core
from stagewright.core import polytropic
from stagewright.core.chart_points import PointsOnDemand
from stagewright.core.models import RealGasAir
from stagewright.core.moist import mixture as mixture_module
from stagewright.core.moist.mixture import make_mixture
from stagewright.core.moist.stream import MoistAir
from stagewright.core.polytropic import path_steps, polytropic_efficiency_between, polytropic_path
from tests.test_train import moist_projects

REL = 1e-8
MIX = make_mixture(RealGasAir())


def _reference_efficiency(model, inlet, h_end, p_out) -> float:
    """The efficiency whose RK4 path ends at h_end: Brent's method on the public path function."""
    t_end = model.at_hp(h_end, p_out, T_guess=inlet.T * 1.5).T

    def miss(eta):
        return polytropic_path(model, inlet, p_out, eta)[-1].T - t_end
    return brentq(miss, 0.3, 1.2, xtol=1e-15, rtol=1e-15)


@st.composite
def moist_compressions(draw):
    """A moist real-gas stream at an unsaturated stage inlet, a pressure ratio and an isentropic efficiency."""
    T = draw(st.floats(280.0, 330.0))
    P = draw(st.floats(0.9e5, 2.5e6))
    w_sat = MIX.saturation_ratio(T, P)
    w = draw(st.floats(0.0, 1.0)) * w_sat
    ratio = draw(st.floats(1.3, 4.0))
    return MoistAir(MIX, w), T, P, ratio, draw(st.floats(0.6, 0.97))


def _stage(case):
    """(stream, inlet, discharge pressure [Pa], discharge enthalpy [J/kg]) of a random compression."""
    air, T, P, ratio, eta_s = case
    inlet = air.at_tp(T, P)
    p_out = min(P * ratio, 9.5e6)
    iso = air.at_sp(inlet.s, p_out, T_guess=T * ratio ** 0.3)
    return air, inlet, p_out, inlet.h + (iso.h - inlet.h) / eta_s


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_compressions())
def test_polytropic_efficiency_from_one_path_equals_the_reference_root(case):
    if case[0].water == 0.0:
        return
    air, inlet, p_out, h_end = _stage(case)
    eta, path = polytropic_efficiency_between(air, inlet, h_end, p_out, case[4])
    assert eta == pytest.approx(_reference_efficiency(air, inlet, h_end, p_out), rel=REL)
    # the path (made on demand) ends at the discharge state and follows the reference path
    ref_path = polytropic_path(air, inlet, p_out, eta)
    assert len(path) == len(ref_path)
    for a, b in zip(path, ref_path):
        assert a.T == pytest.approx(b.T, rel=REL) and a.s == pytest.approx(b.s, rel=REL, abs=1e-6)
    assert path[-1].h == pytest.approx(h_end, rel=1e-9)  # the search (a fallback) ends within 1e-10 of the rise


def test_polytropic_efficiency_of_a_moist_stage_takes_one_path_integration(monkeypatch):
    # issue 19: before, the search integrated two or three trial paths (2 × 4n slope evaluations
    # and more); now one path (4n) and five states for the estimate (two ends, three quadrature nodes)
    air = MoistAir(MIX, 0.008)
    inlet = air.at_tp(305.0, 3e5)
    p_out = 9e5
    iso = air.at_sp(inlet.s, p_out, T_guess=400.0)
    h_end = inlet.h + (iso.h - inlet.h) / 0.8
    calls = []
    for name in ("polytropic_slope", "polytropic_slope_parts"):
        original = getattr(MoistAir, name, None)
        if original is not None:
            monkeypatch.setattr(MoistAir, name, lambda self, *a, _f=original: calls.append(1) or _f(self, *a))
    eta, _ = polytropic_efficiency_between(air, inlet, h_end, p_out, 0.8)
    assert 0.8 < eta < 0.9
    assert len(calls) <= 4 * path_steps(inlet.P, p_out) + 5


def _dict_without_paths(d):
    d = copy.deepcopy(d)
    for s in d["stages"]:
        s.pop("path")
        if s["cooler"]:
            s["cooler"].pop("path")
    return d


def test_the_balance_makes_no_chart_points():
    # issue 19: the cooling lines and the drawn path of a stage with casing loss used to be
    # computed in every full solve; now only when read (to_dict, charts)
    doc = {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100e3, "relative_humidity": 0.7},
           "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 0.5}, "discharge_pressure_Pa": 9e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "heat_loss_W": 800.0,
                       "cooler": {"outlet_temperature_K": 308.15}} for _ in range(2)]}
    res = stagewright.core.solve(doc)
    lazy = [s.path for s in res.stages] + [c.path for c in res.coolers]
    assert all(isinstance(p, PointsOnDemand) and not p.made for p in lazy)
    d = res.to_dict()
    assert all(p.made for p in lazy)
    assert len(d["stages"][0]["cooler"]["path"]) >= 9 and len(d["stages"][0]["path"]) > 2


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects(models=("real_gas", "ideal_gas"), always_cool=True), st.floats(0.0, 2000.0))
def test_chart_points_made_later_are_the_points_of_an_eager_solve(doc, heat_loss):
    # the reference: the same solve with every path read at once, stage by stage, as before
    for s in doc["stages"]:
        s["heat_loss_W"] = heat_loss
    try:
        late = stagewright.core.solve(copy.deepcopy(doc))
    except stagewright.core.StagewrightError:
        return
    eager = stagewright.core.solve(copy.deepcopy(doc))
    eager_paths = [(list(s.path), list(c.path) if c else None) for s, c in zip(eager.stages, eager.coolers)]
    d_late = late.to_dict()
    assert _dict_without_paths(d_late) == _dict_without_paths(eager.to_dict())
    for (sp, cp), s in zip(eager_paths, d_late["stages"]):
        assert [p.T for p in sp] == [q["temperature_K"] for q in s["path"]]
        assert [p.s for p in sp] == [q["entropy_J_kgK"] for q in s["path"]]
        if cp is not None:
            assert [(p.T, p.s, p.w, p.wl) for p in cp] == [
                (q["temperature_K"], q["entropy_J_kgK"], q["humidity_ratio"], q["liquid_ratio"])
                for q in s["cooler"]["path"]]


def test_a_stage_whose_estimate_is_poor_still_finds_the_root(monkeypatch):
    # the one-path scheme hands over to the search when its Newton step is too long
    monkeypatch.setattr(polytropic, "_NEWTON_STEP_MAX", 0.0)
    air = MoistAir(MIX, 0.005)
    inlet = air.at_tp(300.0, 1e5)
    iso = air.at_sp(inlet.s, 3e5, T_guess=400.0)
    h_end = inlet.h + (iso.h - inlet.h) / 0.75
    eta, path = polytropic_efficiency_between(air, inlet, h_end, 3e5, 0.75)
    assert isinstance(path, list)
    assert eta == pytest.approx(_reference_efficiency(air, inlet, h_end, 3e5), rel=REL)
    assert math.isfinite(eta)


def test_trial_solves_reuse_unchanged_leading_stages_and_report_the_same(monkeypatch):
    # issue 19: a study's trial that changes stage j's ratio takes stages before j from an
    # earlier trial; the reference is the same trial solved from scratch
    from stagewright.core import train
    from stagewright.core.project.validation import normalise
    from stagewright.core.solve import solve_normalised
    doc = {"site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100e3, "relative_humidity": 0.6},
           "fluid": {"model": "real_gas"}, "flow": {"kind": "free_air_delivery", "value": 0.5},
           "discharge_pressure_Pa": 30e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                       "cooler": {"approach_K": 8.0, "coolant_inlet_temperature_K": 298.15,
                                  "pressure_drop_Pa": 10e3}} for _ in range(4)]}
    norm = normalise(doc)
    solved = []
    original = train.solve_stage
    monkeypatch.setattr(train, "solve_stage", lambda *a, **k: solved.append(a[2]) or original(*a, **k))
    reuse: dict = {}
    for ratios in ([2.3, 2.3, 2.3, 2.2], [2.3, 2.3, 2.4, 2.1], [2.3, 2.4, 2.3, 2.1]):
        trial = dict(norm, stages=[dict(s, pressure_ratio=r) for s, r in zip(norm["stages"], ratios)])
        shared = solve_normalised(trial, detail=False, fast=True, reuse=reuse)
        alone = solve_normalised(trial, detail=False, fast=True)
        assert shared.to_dict() == alone.to_dict()
    # with reuse: 4 + 2 + 3 stages solved; each solve alone: 4 stages
    assert len(solved) == 4 + 2 + 3 + 3 * 4


@pytest.mark.parametrize("T, P", [(278.0, 1e5), (303.15, 8e5), (318.0, 4e6), (350.0, 9e6)])
def test_interaction_term_of_condensed_water_is_differentiated_analytically(T, P):
    # reference: the old central difference of the interaction term along the saturation line
    d = 1e-2
    dln = (math.log(MIX.enhancement(T + d, P) * _p_ws(T + d)) - math.log(MIX.enhancement(T - d, P) * _p_ws(T - d))) / (2 * d)
    mu, dmu = MIX._mu_virial_along_saturation(T, P, dln)
    ref = (MIX._mu_virial(T + d, P, MIX.saturation_fraction(T + d, P))
           - MIX._mu_virial(T - d, P, MIX.saturation_fraction(T - d, P))) / (2 * d)
    assert mu == MIX._mu_virial(T, P, MIX.saturation_fraction(T, P))
    assert dmu == pytest.approx(ref, rel=1e-7)


def _p_ws(T):
    from stagewright.core.moist.saturation import saturation_pressure
    return saturation_pressure(T)


def _every_slope_rk4(parts, inlet, p_out, u):
    """ln T at the end of the classical RK4 path at 1/ηp = u with all four slopes of every step
    evaluated (Atkinson, An Introduction to Numerical Analysis, 2nd ed., 1989, §6.10)."""
    n = path_steps(inlet.P, p_out)
    x, dx = math.log(inlet.P), math.log(p_out / inlet.P) / n
    y = math.log(inlet.T)

    def k(x, y):
        T = math.exp(y)
        a, b, _ = parts(T, math.exp(x))
        return (a * u - b) / T
    for _ in range(n):
        k1 = k(x, y)
        k2 = k(x + dx / 2, y + dx / 2 * k1)
        k3 = k(x + dx / 2, y + dx / 2 * k2)
        k4 = k(x + dx, y + dx * k3)
        y += dx * (k1 + 2 * k2 + 2 * k3 + k4) / 6
        x += dx
    return y


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_compressions(), st.floats(1.0, 1.6))
def test_first_slopes_by_taylor_keep_the_rk4_path_end(case, u):
    # from the third step on, k1 comes from the previous k4 by a Taylor step (issue 19): the end of
    # the path must stay that of the plain RK4 path within 1e-10 in ln T (ηp within ~3e-10)
    air, T, P, ratio, _ = case
    if air.water == 0.0:
        return
    inlet = air.at_tp(T, P)
    p_out = min(P * ratio, 9.5e6)
    parts = air.polytropic_slope_parts
    calls = []

    def counted(T, P):
        calls.append(T)
        return parts(T, P)
    _, y_end, _ = polytropic._nodes_with_slope(counted, inlet, p_out, u)
    n = path_steps(inlet.P, p_out)
    assert len(calls) == 4 * n - max(n - 2, 0)
    assert y_end == pytest.approx(_every_slope_rk4(parts, inlet, p_out, u), abs=1e-10, rel=0.0)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_compressions())
def test_the_one_path_scheme_lands_on_the_root_without_the_search(case):
    # the Newton step's derivative follows the RK4 scheme's variational equation (issue 19), so
    # one integration at the entropy estimate lands within 2e-9 of the plain RK4 root, and no
    # random compression needs the search (with the plain ∫ a d ln p derivative one in twenty did)
    if case[0].water == 0.0:
        return
    air, inlet, p_out, h_end = _stage(case)
    target = air.at_hp(h_end, p_out, T_guess=inlet.T * 1.5)
    one = polytropic._from_one_path(air, inlet, target, p_out)
    assert one is not None
    assert one[0] == pytest.approx(_reference_efficiency(air, inlet, h_end, p_out), rel=2e-9)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_compressions(), st.floats(1.0, 1.6))
def test_mid_slopes_by_taylor_keep_the_rk4_path_end(case, u):
    # with the exact ∂a/∂T, ∂b/∂T of the fast slope parts, k3 comes from k2 and the second step's k1
    # from the first step's k4 by Taylor steps too (issue 19): the end of the path stays that of the
    # plain RK4 path within 1e-9 in ln T
    air, T, P, ratio, _ = case
    if air.water == 0.0:
        return
    fast = air.fast_slope_parts()
    assert fast is not None
    inlet = air.at_tp(T, P)
    p_out = min(P * ratio, 9.5e6)
    calls = []

    def counted(T, P, derivative=False):
        calls.append(derivative)
        return fast(T, P, derivative)
    _, y_end, _ = polytropic._nodes_with_slope(counted, inlet, p_out, u, derivative=True)
    n = path_steps(inlet.P, p_out)
    # evaluated: k1 of the first step, then k2 (with derivatives) and k4 of every step; the first
    # step's k4 with derivatives too (the second step's k1 follows from it)
    assert len(calls) == 2 * n + 1 and calls.count(True) == n + 1
    assert y_end == pytest.approx(_every_slope_rk4(air.polytropic_slope_parts, inlet, p_out, u), abs=1e-9, rel=0.0)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.floats(280.0, 600.0), st.floats(0.9e5, 5e6), st.floats(1e-4, 0.03))
def test_slope_part_derivatives_match_central_differences(T, P, w):
    # ∂a/∂T and ∂b/∂T at constant p of the fast slope parts against central differences of a and b
    # (step 1e-3 K, within one cubic piece of the vapour and virial tables)
    air = MoistAir(MIX, w)
    fast = air.fast_slope_parts()
    got = fast(T, P, True)
    if len(got) != 5:  # a saturated state: the general method, no derivatives
        return
    assert got[:3] == fast(T, P)
    h = 1e-3
    if math.floor((T - h - mixture_module._T_LO) / mixture_module._STEP) != math.floor(
            (T + h - mixture_module._T_LO) / mixture_module._STEP):
        return  # a node of the tables between: their second derivative (in c_p) steps there
    (a_p, b_p, _), (a_m, b_m, _) = fast(T + h, P), fast(T - h, P)
    assert got[3] == pytest.approx((a_p - a_m) / (2 * h), rel=1e-6, abs=1e-9 * got[0] / T)
    assert got[4] == pytest.approx((b_p - b_m) / (2 * h), rel=1e-5, abs=1e-8 * abs(got[0]) / T)


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_compressions())
def test_the_entropy_estimate_takes_one_state_beyond_the_ends(case):
    # issue 19: the estimate's ∫ (v/T) dp by Simpson's rule takes its ends from the end states' own
    # slope parts (which the chord and the first RK4 stage need anyway): one new state, the curve's
    # middle (two-point Gauss took two). It must stay well inside the 2e-5 Newton step it feeds
    # (measured 2.4e-6 at most on 300 random compressions); the reference is the plain RK4 root
    # found by Brent's method (Atkinson 1989, §6.10; scipy.optimize.brentq)
    if case[0].water == 0.0:
        return
    air, inlet, p_out, h_end = _stage(case)
    target = air.at_hp(h_end, p_out, T_guess=inlet.T * 1.5)
    parts = air.fast_slope_parts()
    calls = []

    def counted(T, P, derivative=False):
        calls.append((T, P))
        return parts(T, P, derivative)
    u, first = polytropic._entropy_estimate(counted, inlet, target, p_out)
    assert len(calls) == 3
    assert first == parts(inlet.T, inlet.P)
    assert u == pytest.approx(1.0 / _reference_efficiency(air, inlet, h_end, p_out), rel=5e-6)
