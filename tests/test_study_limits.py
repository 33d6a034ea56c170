"""Ratio bounds against the discharge pressure: pure pressure arithmetic."""
import math

import pytest

from stagewright.core.split import delivered_pressure
from stagewright.core.study.limits import RatioBounds, implied_ratio, pressure_reach_problems, ratio_bounds


def bounds(lo, hi):
    return RatioBounds(tuple(lo), tuple(hi), tuple(v > 1.001 for v in lo), tuple(v < 40 for v in hi))


def test_implied_ratio_meets_delivery_with_drops():
    # p_d = ((p1 r1 - d1) r2 - d2) r3 - d3 (definition of the train's pressure chain)
    r = [2.5, None, 2.0]
    drops = [10e3, 12e3, 15e3]
    r2 = implied_ratio(1e5, 12e5, r, drops, 1)
    assert delivered_pressure(1e5, [2.5, r2, 2.0], drops) == pytest.approx(12e5, rel=1e-14)
    assert ((1e5 * 2.5 - 10e3) * r2 - 12e3) * 2.0 - 15e3 == pytest.approx(12e5, rel=1e-14)


def test_implied_ratio_undefined_when_upstream_pressure_is_gone():
    assert math.isnan(implied_ratio(1e5, 9e5, [1.001, None], [2e5, 0.0], 1))


def test_reachable_bounds_give_no_problem():
    assert pressure_reach_problems(1e5, 9e5, [0.0, 0.0], bounds([1.001, 1.001], [40.0, 40.0])) == []


def test_max_bound_closest_value_with_drops():
    drops = [20e3, 0.0]
    found = pressure_reach_problems(1e5, 9e5, drops, bounds([1.001, 1.001], [2.5, 2.5]))
    assert [b.field for b in found] == ["stages[0].max_pressure_ratio", "stages[1].max_pressure_ratio"]
    c = found[0].closest_feasible
    # c is the common maximum that just reaches 9 bar: (1e5 c - 20e3) c = 9e5
    assert delivered_pressure(1e5, [c, c], drops) == pytest.approx(9e5, rel=1e-10)
    assert c == pytest.approx((20e3 + math.sqrt(20e3 ** 2 + 4 * 1e5 * 9e5)) / (2 * 1e5), rel=1e-10)


def test_uncapped_discharge_out_of_reach_names_discharge_pressure():
    found = pressure_reach_problems(1e5, 2e8, [0.0], bounds([1.001], [40.0]))
    assert found[0].field == "discharge_pressure_Pa" and "add stages" in found[0].message


def test_min_bounds_only_the_tight_ones_are_named():
    found = pressure_reach_problems(1e5, 6e5, [0.0, 0.0, 0.0], bounds([1.5, 3.0, 1.001], [40.0, 40.0, 40.0]))
    # 1.5 × 3 × 1.001 > 6 is false, so nothing is wrong here …
    assert found == []
    found = pressure_reach_problems(1e5, 4e5, [0.0, 0.0, 0.0], bounds([1.5, 3.0, 1.001], [40.0, 40.0, 40.0]))
    # … but 4 bar needs the minimum of stage 2 lowered to 4/(1.5·1.001) = 2.664
    assert [b.field for b in found] == ["stages[1].min_pressure_ratio"]
    assert found[0].closest_feasible == pytest.approx(4.0 / (1.5 * 1.001), rel=1e-10)


def test_ratio_bounds_from_stage_entries():
    b = ratio_bounds([{"min_pressure_ratio": 2.0, "max_pressure_ratio": None},
                      {"min_pressure_ratio": None, "max_pressure_ratio": 3.0}])
    assert b.lo == (2.0, 1.001) and b.hi == (40.0, 3.0)
    assert b.lo_set == (True, False) and b.hi_set == (False, True)
