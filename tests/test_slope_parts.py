"""The one-call polytropic slope parts of a moist real-gas stream equal the general method's, bit for bit.

An internal equivalence check (the general method's physics is checked against RP-1485 via
CoolProp ``HAPropsSI`` in test_moist_*.py); here only that the short path changes nothing.
"""
import random

import pytest

from stagewright.core.errors import PropertyRangeError
from stagewright.core.models import ConstantCpAir, RealGasAir
from stagewright.core.moist.mixture import make_mixture
from stagewright.core.moist.stream import MoistAir


def test_fast_parts_equal_the_general_method_on_random_states():
    rng = random.Random(20261203)
    mixture = make_mixture(RealGasAir())
    checked = 0
    handed = []
    for _ in range(300):
        water = 10 ** rng.uniform(-4, -1.3)
        general, fast_stream = MoistAir(mixture, water), MoistAir(mixture, water)
        handed_on = fast_stream.polytropic_slope_parts
        fast_stream.polytropic_slope_parts = lambda T, P: (handed.append(1), handed_on(T, P))[1]
        fast = fast_stream.fast_slope_parts()
        T0 = rng.uniform(230.0, 620.0)
        for k in range(5):  # a path's worth of states, warming up, so the short path answers
            T, P = T0 * (1.0 + 0.1 * k), 10 ** rng.uniform(4.0, 6.7)
            assert fast(T, P) == general.polytropic_slope_parts(T, P), (water, T, P)
            checked += 1
    assert checked == 1500
    assert len(handed) < 0.7 * checked, len(handed)  # most answers came from the short path itself


def test_out_of_range_states_raise_the_general_error():
    fast = MoistAir(make_mixture(RealGasAir()), 0.01).fast_slope_parts()
    with pytest.raises(PropertyRangeError, match="polytropic path"):
        fast(1400.0, 1e5)


def test_no_short_path_without_the_real_gas_tables():
    assert MoistAir(make_mixture(ConstantCpAir()), 0.01).fast_slope_parts() is None


def test_fast_state_equals_the_general_state_on_random_states():
    # issue 19: MoistAir.at_tp/at_hp/at_sp take their unsaturated states from one call
    # (slope_parts.fast_state); it must give the general method's answers bit for bit, and hand
    # saturated states (with liquid) to it
    from stagewright.core.moist.slope_parts import fast_state
    rng = random.Random(19)
    mixture = make_mixture(RealGasAir())
    two_phase = 0
    for _ in range(300):
        water = 10 ** rng.uniform(-4, -1.3)
        general, fast_stream = MoistAir(mixture, water), MoistAir(mixture, water)
        at = fast_state(fast_stream)
        T0 = rng.uniform(230.0, 620.0)
        for k in range(5):
            T, P = T0 * (1.0 + 0.05 * k), 10 ** rng.uniform(4.0, 6.9)
            got = at(T, P)
            assert got == general._state(T, P, slope=False), (water, T, P)
            two_phase += got[6] > 0.0
    assert two_phase > 50  # saturated states were among them


def test_fast_state_out_of_range_raises_the_general_error():
    from stagewright.core.moist.slope_parts import fast_state
    at = fast_state(MoistAir(make_mixture(RealGasAir()), 0.01))
    with pytest.raises(PropertyRangeError):
        at(1400.0, 1e5)


def test_the_interaction_volume_from_one_cubic_equals_the_sum_of_its_three_columns():
    # issue 19: D, D' and D'' come from one cubic per grid interval (the weighted sum of the B_aa,
    # B_aw and B_ww columns' cubics), kept per interval by the one-call functions. The reference is
    # the sum of the three columns evaluated one by one (the weights of RP-1485's interaction
    # volume, Herrmann, Wagner & Harvey 2009): equal to rounding
    from stagewright.core.moist import mixture as mx
    rng = random.Random(7)
    mixture = make_mixture(RealGasAir())
    _, _, aa, aw, ww = mixture._fused
    for _ in range(500):
        T, x_w = rng.uniform(230.0, 620.0), rng.uniform(1e-5, 0.3)
        x = (T - mx._T_LO) / mx._STEP
        i = min(max(int(x), 0), len(aa) - 1)
        t = x - i
        weights = (-mixture.n_a * x_w, 2.0 * mixture.n_a * x_w, mixture.n_a * x_w * x_w / (1.0 - x_w))
        ref = [0.0, 0.0, 0.0]
        for (a, b, c, e), k in zip((aa[i], aw[i], ww[i]), weights):
            ref[0] += k * (a + t * (b + t * (c + t * e)))
            ref[1] += k * (b + t * (2.0 * c + 3.0 * e * t)) / mx._STEP
            ref[2] += k * (2.0 * c + 6.0 * e * t) / mx._STEP ** 2
        got = mixture._fused_virial(i, t, x_w, 1.0 - x_w)
        scale = [sum(abs(k * col[j]) for k, col in zip(weights, (aa[i], aw[i], ww[i]))) for j in range(3)]
        for g, r, sc in zip(got, ref, scale):
            assert abs(g - r) <= 1e-14 * max(sc, abs(r)) + 1e-300
