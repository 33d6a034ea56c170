"""The interpolated RP-1485 enhancement factor against the exact one (CoolProp's HAProps_Aux).

Reference: ASHRAE RP-1485 (Herrmann, Kretzschmar & Zhang 2009) as implemented in CoolProp
(Bell et al. 2014), called point by point — the table must reproduce it, not improve on it.
"""
from __future__ import annotations

import math
import random

import pytest

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.moist.enhancement_table import T_FIRST, T_LAST, EnhancementTable
from stagewright.core.moist.saturation import saturation_pressure


def _exact(T, p):
    return cpa.humid_air_coefficient("f", T, p)


def test_interpolated_factor_matches_the_exact_one_inside_the_grid():
    table = EnhancementTable()
    rng = random.Random(7)
    worst, checked = 0.0, 0
    while checked < 400:
        T = rng.uniform(T_FIRST + 2.0, 440.0)
        p = math.exp(rng.uniform(math.log(2e4), math.log(9.5e6)))
        if p < 3.0 * saturation_pressure(T + 6.0):
            continue
        checked += 1
        worst = max(worst, abs(math.log(table(T, p)) - math.log(_exact(T, p))))
    # measured 8e-9 when written (ΔT = 2 K, Δln p = 0.025); 1e-7 leaves room and is still
    # a thousand times below the 1e-4 the fast path promises for reported figures
    assert worst < 1e-7
    assert table.nodes_computed > 16


@pytest.mark.parametrize("T, p", [
    (273.155, 2e5),   # below the grid: CoolProp's factor jumps at the triple point (ice ↔ liquid)
    (T_LAST + 5.0, 5e6),  # above the grid
    (373.0, 1.1e5),   # near saturation of pure steam (p < 2 p_ws): f bends sharply, no table
    (300.0, 9.99e6),  # stencil would pass 10 MPa, RP-1485's upper pressure
])
def test_outside_the_grid_the_exact_factor_is_returned(T, p):
    table = EnhancementTable()
    assert table(T, p) == _exact(T, p)
    assert table.nodes_computed == 0


def test_nodes_are_computed_once_and_kept():
    calls = []

    def counting(T, p):
        calls.append((T, p))
        return _exact(T, p)
    table = EnhancementTable(counting)
    table(300.0, 8e5)
    first = len(calls)
    assert first == 16  # one 4 × 4 stencil
    table(300.3, 8.05e5)  # same cell
    assert len(calls) == first
    table(302.5, 8e5)  # the next cell in T shares 12 of its 16 nodes
    assert len(calls) == first + 4
