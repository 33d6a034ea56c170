"""The dry-air (T, p) flash by Newton's method on density (stagewright.core.air_tp_flash).

Reference: CoolProp's own (T, p) flash of the same equation of state (Lemmon et al., J. Phys. Chem.
Ref. Data 29 (2000) 331), through its AbstractState. The agreement of h, s, v, cp and (dh/dp)_T on
random states over the models' whole range is in tests/test_models.py.
"""
from __future__ import annotations

import math
import random

import pytest

CP = pytest.importorskip("CoolProp.CoolProp")

from stagewright.core import coolprop_adapter as cpa  # noqa: E402
from stagewright.core.air_tp_flash import tp_flash  # noqa: E402


class _CountingState:
    """An AbstractState that counts its updates."""

    def __init__(self, state):
        self._state, self.updates = state, 0

    def update(self, *args):
        self.updates += 1
        return self._state.update(*args)

    def __getattr__(self, name):
        return getattr(self._state, name)


def _states(n: int, p_max: float, seed: int):
    rng = random.Random(seed)
    return [(10 ** rng.uniform(3.0, math.log10(p_max)), rng.uniform(200.0, 1300.0)) for _ in range(n)]


def test_the_density_solves_the_equation_of_state_to_rounding():
    # the pressure of the state left behind is the one asked for, to rounding (CoolProp's p(rho, T));
    # below 250 K near 5 MPa (|B n| >= 0.05) CoolProp's own flash takes over (its residual reaches 2e-12 there)
    state = cpa.new_gas_air_state()
    flash = tp_flash(state)
    for P, T in _states(3000, 5e6, 1):
        flash(P, T)
        assert state.T() == T
        assert abs(state.p() / P - 1.0) < (1e-14 if T >= 250.0 else 1e-11), (P, T)


def test_a_state_is_the_same_to_the_last_bit_whatever_came_before():
    # the first guess depends on (T, p) alone: no history in the answer
    a, b = cpa.new_gas_air_state(), cpa.new_gas_air_state()
    fa, fb = tp_flash(a), tp_flash(b)
    points = _states(400, 5e6, 2)
    for P, T in points:
        fa(P, T)
    for (P, T), (P_prev, T_prev) in zip(points, reversed(points)):
        fa(P, T)
        fb(P_prev, T_prev)
        fb(P, T)
        assert (a.rhomolar(), a.hmass(), a.smass(), a.cpmass()) == (b.rhomolar(), b.hmass(), b.smass(), b.cpmass())


def test_above_five_megapascal_it_is_coolprops_own_flash_bit_for_bit():
    ours, theirs = cpa.new_gas_air_state(), cpa.new_gas_air_state()
    flash = tp_flash(ours)
    rng = random.Random(3)
    for _ in range(300):
        P, T = 10 ** rng.uniform(math.log10(5.01e6), 8.0), rng.uniform(200.0, 1300.0)
        flash(P, T)
        theirs.update(CP.PT_INPUTS, P, T)
        assert (ours.rhomolar(), ours.hmass()) == (theirs.rhomolar(), theirs.hmass())


def test_two_updates_below_one_megapascal_and_at_most_three_to_five():
    # the speed the module promises: the virial guess is within 1e-5 of the root below 1 MPa
    state = _CountingState(cpa.new_gas_air_state())
    flash = tp_flash(state)
    flash(2e5, 300.0)  # the first call may be made while the virial table is filled
    for p_max, most in ((1e6, 2), (5e6, 3)):
        for P, T in _states(500, p_max, 4):
            state.updates = 0
            flash(P, T)
            assert state.updates <= most, (P, T, state.updates)


def test_outside_the_range_it_raises_coolprops_error():
    state = cpa.new_gas_air_state()
    flash = tp_flash(state)
    with pytest.raises(ValueError):
        flash(-1.0, 300.0)


def test_the_second_order_term_is_left_out_only_where_it_is_below_rounding():
    # issue 19: where the virial estimate of Chebyshev's term is below 5e-18 of ρ, the last update
    # takes the plain Newton step and (∂²p/∂ρ²)_T is not asked for. The density must still solve
    # p(ρ, T) = p to rounding, and equal the density with the term always taken to an ulp or two
    # (reference: the same iteration with Chebyshev's step, Atkinson 1989 §2.2).
    import stagewright.core.air_tp_flash as module
    seconds = []

    class Counting(_CountingState):
        def second_partial_deriv(self, *args):
            seconds.append(args)
            return self._state.second_partial_deriv(*args)
    state, ref_state = Counting(cpa.new_gas_air_state()), cpa.new_gas_air_state()
    flash = tp_flash(state)
    always = module._NEGLIGIBLE
    skipped = 0
    for P, T in _states(1500, 5e6, 9):
        seconds.clear()
        flash(P, T)
        skipped += not seconds
        rho = state.rhomolar()
        module._NEGLIGIBLE = -1.0  # the term always taken
        try:
            tp_flash(ref_state)(P, T)
        finally:
            module._NEGLIGIBLE = always
        assert abs(rho / ref_state.rhomolar() - 1.0) <= 4.5e-16, (P, T)
        assert abs(state.p() / P - 1.0) < (1e-14 if T >= 250.0 else 1e-11), (P, T)
    assert skipped > 300  # mostly below about 5 bar: one CoolProp call fewer
    seconds.clear()
    flash(1.01325e5, 293.15)
    assert not seconds
