"""The full moist real-gas solve against its results before the speed work of issue 19.

Regression baseline, not a physics check (those live in test_stage, test_train, test_moist_*):
``tests/data/moist_baseline.json`` holds the documents and ``to_dict()`` results (chart points
included) of 24 random moist real-gas trains and the bench train, solved by main at 9e23dcd
(``tests/data/make_moist_baseline.py``). The issue's tolerance: nothing reported changes by more
than 1e-8 relative. Closure residuals (order 1e-13, the noise of the states' 1e-9 K Newton tolerance)
are compared to 1e-10 absolute, liquid ratios about zero (rounding noise) to 1e-14; entropies use the
model's own reference, so they may pass through zero: they are compared to 1e-8 of the entropy scale
(1e3 J/(kg K)).
"""
from __future__ import annotations

import copy
import json
import math

import pytest

import stagewright.core
from tests.conftest import ROOT

BASELINE = json.loads((ROOT / "tests" / "data" / "moist_baseline.json").read_text())
REL = 1e-8


def _abs_floor(path: str) -> float:
    leaf = path.rsplit(".", 1)[-1]
    if "residual" in leaf:  # closures: noise of the 1e-9 K Newton tolerance of a state (h = cp ΔT)
        return 1e-10
    if leaf == "entropy_J_kgK":
        return REL * 1e3
    if leaf in ("liquid_ratio", "carry_over_kg_s", "delivered_liquid_kg_s"):  # rounding noise about 0
        return 1e-14
    return 1e-300


def _compare(expected, got, path, misses):
    if isinstance(expected, dict):
        assert isinstance(got, dict) and sorted(got) == sorted(expected), f"{path}: keys differ"
        for k, v in expected.items():
            _compare(v, got[k], f"{path}.{k}", misses)
    elif isinstance(expected, list):
        assert isinstance(got, list) and len(got) == len(expected), f"{path}: length differs"
        for i, (a, b) in enumerate(zip(expected, got)):
            _compare(a, b, f"{path}[{i}]", misses)
    elif isinstance(expected, float) and isinstance(got, (float, int)) and not isinstance(got, bool):
        if math.isnan(expected):
            assert math.isnan(got), f"{path}: {got!r} != nan"
        elif abs(got - expected) > REL * max(abs(got), abs(expected)) + _abs_floor(path):
            misses.append(f"{path}: {got!r} != {expected!r} (rel {abs(got - expected) / max(abs(expected), 1e-300):.2e})")
    else:
        assert got == expected, f"{path}: {got!r} != {expected!r}"


@pytest.mark.parametrize("index", range(len(BASELINE)))
def test_full_moist_solve_reports_what_it_reported_before(index):
    case = BASELINE[index]
    got = json.loads(json.dumps(stagewright.core.solve(copy.deepcopy(case["doc"])).to_dict()))
    misses = []
    _compare(case["result"], got, "result", misses)
    assert not misses, "\n".join(misses[:20])
