"""The whole train: dry intake reproduces the dry-air core bit for bit; moist-air balances close."""
import copy
import json

import pytest

import thermo
from conftest import ROOT

BASELINE = json.loads((ROOT / "tests" / "data" / "dry_baseline.json").read_text())


def _same(expected, got, path=""):
    """Every key of ``expected`` is in ``got`` with exactly the same value (floats bit-equal)."""
    if isinstance(expected, dict):
        for k, v in expected.items():
            assert k in got, f"{path}.{k} missing"
            _same(v, got[k], f"{path}.{k}")
    elif isinstance(expected, list):
        assert len(expected) == len(got), f"{path}: length {len(got)} != {len(expected)}"
        for i, (a, b) in enumerate(zip(expected, got)):
            _same(a, b, f"{path}[{i}]")
    else:
        assert got == expected, f"{path}: {got!r} != {expected!r}"


@pytest.mark.parametrize("name", sorted(BASELINE))
def test_dry_intake_reproduces_the_dry_air_core_exactly(name):
    # Regression baseline (not a physics check; those live in test_stage/test_models): the
    # results of the dry-air core before moist air existed (commit 50835c4). Moist air must
    # not change one bit of a dry solve; json stores floats by repr, so == is bit equality.
    case = BASELINE[name]
    _same(case["result"], thermo.solve(copy.deepcopy(case["doc"])).to_dict())


@pytest.mark.parametrize("humidity", [{"relative_humidity": 0.0}, {"humidity_ratio": 0.0}, {}])
def test_zero_humidity_given_any_way_is_the_dry_path(humidity):
    case = BASELINE["real_gas_isentropic_3"]
    doc = copy.deepcopy(case["doc"])
    doc["site"].pop("relative_humidity", None)
    doc["site"].update(humidity)
    _same(case["result"], thermo.solve(doc).to_dict())
