"""Shared stage ratio that meets the delivery pressure through cooler pressure drops."""
from __future__ import annotations

import math

import pytest
from hypothesis import assume, given, settings, strategies as st

from stagewright.core.errors import InputError
from stagewright.core.split import delivered_pressure, stage_pressure_ratios


def test_two_stages_without_drops_split_at_the_geometric_mean():
    # intermediate pressure sqrt(p1 p2), the least-work split of ideal-gas stages with perfect
    # intercooling (Çengel & Boles, Thermodynamics, 8th ed., §7-11)
    r = stage_pressure_ratios(1e5, 16e5, [None, None], [0.0, 0.0])
    assert r == pytest.approx([4.0, 4.0], rel=1e-14)


@settings(max_examples=200, deadline=None)
@given(st.integers(1, 6), st.floats(5e4, 1.2e5), st.floats(1.5, 30.0), st.data())
def test_the_shared_ratio_delivers_the_pressure_asked_for(n, p_in, overall, data):
    # the defining recurrence p_{k+1} = p_k r_k − Δp_k must reproduce the delivery pressure
    p_out = p_in * overall
    drops = [data.draw(st.floats(0.0, 0.02)) * p_in * overall ** ((k + 1) / n) for k in range(n)]
    given_ = [None if data.draw(st.booleans()) or k == 0 else data.draw(st.floats(1.05, 1.5)) for k in range(n)]
    try:
        ratios = stage_pressure_ratios(p_in, p_out, given_, drops)
    except InputError:
        assume(False)  # the given ratios overshoot, or no ratio up to 40 reaches the pressure
    assert delivered_pressure(p_in, ratios, drops) == pytest.approx(p_out, rel=1e-12)
    free = {r for r, g in zip(ratios, given_) if g is None}
    assert len(free) == 1 and 1.0 < free.pop() <= 40.0
    assert all(r == g for r, g in zip(ratios, given_) if g is not None)


def test_unreachable_pressure_names_the_field():
    with pytest.raises(InputError, match="discharge_pressure_Pa"):
        stage_pressure_ratios(1e5, 1e5 * 41.0 ** 2, [None, None], [0.0, 0.0])
    assert math.isfinite(stage_pressure_ratios(1e5, 1e5 * 39.0 ** 2, [None, None], [0.0, 0.0])[0])
