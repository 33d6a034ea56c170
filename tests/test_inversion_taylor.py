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
