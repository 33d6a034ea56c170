"""The last step of a moist stream's (h, p) and (s, p) inversions, taken by a Taylor step.

MoistAir.at_hp and at_sp invert h(T) and s(T) at fixed p by Newton's method. Where the stream
holds no liquid, a final step of at most 1e-4 K is taken without another evaluation: the state
moves to first order (h + c_p δ, s + c_p δ/T, v + v_T δ), and at_sp steps in ln T (s ≈ c_p ln T),
so that a guess 1 K off needs two evaluations instead of three or four (issue 19). Checked here
against the same inversions converged to 1e-13 K with every step evaluated (the reference is the
straightforward Newton iteration, Press et al., Numerical Recipes, 3rd ed., 2007, §9.4), and the
number of evaluations.
"""
from __future__ import annotations

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from stagewright.core.models import RealGasAir
from stagewright.core.models import newton
from stagewright.core.moist.mixture import make_mixture
from stagewright.core.moist.stream import MoistAir

MIX = make_mixture(RealGasAir())


def _tight(monkeypatch):
    plain = newton._newton

    def every_step_evaluated(evaluate, target, T_guess, tol_K, keep_last, taylor=None, in_log=False):
        return plain(evaluate, target, T_guess, 1e-13, keep_last)
    monkeypatch.setattr(newton, "_newton", every_step_evaluated)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow,
                                                                 HealthCheck.function_scoped_fixture])
@given(T=st.floats(330.0, 650.0), P=st.floats(1e5, 5e6), w=st.floats(1e-4, 0.02), off=st.floats(-1.5, 1.5))
def test_inversions_ending_with_a_taylor_step_agree_with_tightly_converged_ones(T, P, w, off, monkeypatch):
    air = MoistAir(MIX, w)
    known = air.at_tp(T, P)
    assume(known.wl == 0.0)  # all the water as vapour (with liquid, every step is evaluated)
    got = air.at_hp(known.h, P, T_guess=T + off), air.at_sp(known.s, P, T_guess=T + off)
    with monkeypatch.context() as m:
        _tight(m)
        ref = air.at_hp(known.h, P, T_guess=T + off), air.at_sp(known.s, P, T_guess=T + off)
    for a, b in zip(got, ref):
        assert a.T == pytest.approx(b.T, rel=1e-14, abs=1e-12)
        assert a.h == pytest.approx(b.h, rel=1e-14, abs=1e-9)
        assert a.s == pytest.approx(b.s, rel=1e-14, abs=1e-10)
        assert a.rho == pytest.approx(b.rho, rel=1e-13)


def test_a_guess_a_kelvin_off_takes_two_evaluations(monkeypatch):
    air = MoistAir(MIX, 0.008)
    known = air.at_tp(420.0, 8e5)
    calls = []
    plain = air._state_without_slope()

    def counted(T, P, need_cp=True):
        calls.append(T)
        return plain(T, P, need_cp)
    air._fast_state = counted
    for invert, value in ((air.at_hp, known.h), (air.at_sp, known.s)):
        calls.clear()
        invert(value, 8e5, T_guess=421.0)
        assert len(calls) == 2, invert.__name__


def _count_at_hp_evaluations(monkeypatch, chosen) -> list:
    """The temperatures at which MoistAir.at_hp evaluates a state, for the inversions whose
    ``where`` satisfies ``chosen`` (a list the caller reads after the solve)."""
    calls = []
    original = MoistAir.at_hp

    def counted(self, h, P, where="", T_guess=300.0):
        if not chosen(where):
            return original(self, h, P, where, T_guess)
        plain = self._state_without_slope()
        self._fast_state = lambda T, P, need_cp=True: calls.append(T) or plain(T, P, need_cp)
        try:
            return original(self, h, P, where, T_guess)
        finally:
            self._fast_state = plain
    monkeypatch.setattr(MoistAir, "at_hp", counted)
    return calls


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(T=st.floats(360.0, 600.0), P=st.floats(2e5, 4e6), w=st.floats(1e-4, 0.02), off=st.floats(0.5, 6.0),
       sign=st.sampled_from((-1.0, 1.0)), drop=st.floats(-3000.0, 3000.0))
def test_the_isobaric_guess_from_the_last_inversion_is_within_a_taylor_step(T, P, w, off, sign, drop):
    # a stage's discharge after its casing heat loss lies a couple of kelvin from the end of the
    # adiabatic compression, found by the stream's last at_hp from a guess some kelvin off (issue 19):
    # from that inversion's c_p and its c_p secant, the second-order guess is well within the 1e-4 K
    # final Taylor step of the root, so one evaluation finds it (reference: the straightforward
    # Newton inversion from a far guess, Press et al. 2007 §9.4). Measured on 3000 random cases:
    # at most 5e-6 K where no state involved holds liquid (2e-5 K at the corners the search finds).
    air = MoistAir(MIX, w)
    known = air.at_tp(T, P)
    guess_at = T + sign * off
    assume(known.wl == 0.0 and air.at_tp(guess_at, P).wl == 0.0)
    end = air.at_hp(known.h, P, T_guess=guess_at)
    assert air.isobaric_guess(air.at_tp(T + 1.0, P), end.h) is None  # only from the point at_hp returned
    guess = air.isobaric_guess(end, end.h - drop)
    root = air.at_hp(end.h - drop, P, T_guess=T + 20.0)
    assume(root.wl == 0.0)  # below the dew point h(T) has a kink: the inversion evaluates more
    assert guess is not None and abs(guess - root.T) < 0.5 * newton.TAYLOR_STEP_K


def test_a_discharge_after_a_casing_heat_loss_takes_one_evaluation(monkeypatch):
    import stagewright.core
    doc = {"site": {"ambient_temperature_K": 300.0, "barometric_pressure_Pa": 1e5, "relative_humidity": 0.5},
           "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 0.4}, "discharge_pressure_Pa": 3e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "heat_loss_W": 1500.0}]}
    calls = _count_at_hp_evaluations(monkeypatch, lambda where: where.endswith("discharge"))
    res = stagewright.core.solve(doc)
    assert len(calls) == 1  # two with the first-order secant guess
    out = res.stages[0].outlet
    monkeypatch.undo()
    _tight(monkeypatch)  # the same state by the plain Newton iteration from 5 K off, to 1e-13 K
    ref = MoistAir(MIX, out.w).at_hp(out.h, out.P, T_guess=out.T + 5.0)
    assert out.T == pytest.approx(ref.T, rel=1e-14) and out.rho == pytest.approx(ref.rho, rel=1e-13)
    doc["stages"][0]["heat_loss_W"] = 0.0
    assert out.T < stagewright.core.solve(doc).stages[0].outlet.T - 3.0  # the loss: 3.75 kJ/kg


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(T=st.floats(230.0, 330.0), P=st.floats(6e4, 1.1e5), w=st.floats(1e-5, 0.02), drop=st.floats(1.0, 5000.0))
def test_the_throttle_guess_by_the_joule_thomson_coefficient_is_within_a_taylor_step(T, P, w, drop):
    # the intake filter is a throttle: from the ambient state, μ_JT = (T v_T - v)/c_p (Çengel & Boles
    # 2015, §12-5) moves the guess to within a Taylor step of the root (reference: the plain
    # Newton inversion from 5 K off, Press et al. 2007 §9.4), so the filter outlet takes one evaluation
    air = MoistAir(MIX, w)
    ambient = air.at_tp(T, P)
    assume(ambient.wl == 0.0)
    guess = air.isenthalpic_guess(ambient, P - drop)
    assert guess is not None and guess != T
    root = air.at_hp(ambient.h, P - drop, T_guess=T + 5.0)
    assert abs(guess - root.T) < 1e-5  # 1e-6 K at most at 230 K, 0.6 bar and 3 kPa
    assert air.isenthalpic_guess(ambient, P - drop) is None  # the dry state moved on: no stale slope


def test_the_intake_filter_outlet_takes_one_evaluation(monkeypatch):
    import stagewright.core
    doc = {"site": {"ambient_temperature_K": 297.0, "barometric_pressure_Pa": 99e3, "relative_humidity": 0.6},
           "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 0.4}, "discharge_pressure_Pa": 3e5,
           "inlet_pressure_drop_Pa": 2500.0, "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]}
    calls = _count_at_hp_evaluations(monkeypatch, lambda where: where == "intake filter outlet")
    res = stagewright.core.solve(doc)
    assert len(calls) == 1  # two from the ambient temperature as the guess
    after = res.stages[0].inlet
    monkeypatch.undo()
    _tight(monkeypatch)
    ref = MoistAir(MIX, after.w).at_hp(after.h, after.P, T_guess=after.T + 5.0)
    assert after.T == pytest.approx(ref.T, rel=1e-14) and after.T < 297.0
