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


# ---- moist intake air: conservation and the second law, property-based ----------------------
from hypothesis import HealthCheck, given, settings, strategies as st  # noqa: E402


@st.composite
def moist_projects(draw, models=("constant_cp", "ideal_gas"), always_cool=False):
    n = draw(st.integers(1, 4))
    T0 = draw(st.floats(275.0, 315.0))
    P0 = draw(st.floats(90_000.0, 102_000.0))
    r = draw(st.floats(1.5, 4.0))
    eta_kind = draw(st.sampled_from(["isentropic", "polytropic"]))
    stages = []
    for k in range(n):  # only the last stage may go without a cooler (series stages overheat)
        cooler = None if k == n - 1 and not always_cool and draw(st.integers(0, 3)) == 0 else {
            "outlet_temperature_K": T0 + draw(st.floats(0.0, 25.0)),
            "pressure_drop_Pa": draw(st.floats(0.0, 15_000.0)),
            "separator_efficiency": draw(st.sampled_from([1.0, draw(st.floats(0.3, 1.0))]))}
        # efficiencies below 0.98: at ηp = 1 the RK4 path's truncation error (~1e-9 relative)
        # already trips the stage's second-law check for dry air (a dry-core matter)
        stages.append({"efficiency": {"kind": eta_kind, "value": draw(st.floats(0.65, 0.98))}, "cooler": cooler})
    humidity = draw(st.sampled_from(["relative_humidity", "humidity_ratio", "dew_point_K"]))
    site = {"ambient_temperature_K": T0, "barometric_pressure_Pa": P0}
    if humidity == "relative_humidity":
        site["relative_humidity"] = draw(st.floats(0.05, 1.0))
    elif humidity == "humidity_ratio":
        site["humidity_ratio"] = draw(st.floats(1e-4, 0.004))
    else:
        site["dew_point_K"] = draw(st.floats(273.15, T0))
    return {"site": site, "fluid": {"model": draw(st.sampled_from(models))},
            "flow": {"kind": "mass", "value": draw(st.floats(0.1, 5.0))},
            "discharge_pressure_Pa": P0 * r ** n * 0.9, "stages": stages}


def _check_moist_balances(doc):
    res = thermo.solve(doc)
    d = res.to_dict()
    assert abs(d["water_balance_residual"]) <= 1e-9
    assert abs(d["energy_residual"]) <= 1e-6 and abs(d["exergy_residual"]) <= 1e-6
    scale = 1e-9 * max(1.0, res.shaft_power_W / res.dead.T0)
    assert res.inlet.entropy_generation_W_K >= -scale
    for s, c in zip(res.stages, res.coolers):
        assert s.entropy_generation_W_K >= -scale
        if c is not None:
            assert c.entropy_generation_W_K >= -scale
            assert c.water.condensate_kg_s >= -1e-15 and c.water.drained_kg_s >= 0.0
            assert c.water.carry_over_kg_s >= -1e-15
    assert d["condensate_kg_s"] >= 0.0
    return d


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects())
def test_moist_train_conserves_water_and_obeys_the_second_law(doc):
    # mass conservation of water, the two closures, S_gen ≥ 0 per component (Gouy–Stodola;
    # Bejan, Tsatsaronis & Moran 1996 §3.5)
    _check_moist_balances(doc)


@pytest.mark.slow
@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects(models=("real_gas",), always_cool=True))  # uncooled series stages leave RP-1485's range
def test_moist_real_gas_train_conserves_water_and_obeys_the_second_law(doc):
    _check_moist_balances(doc)


def test_vanishing_humidity_tends_to_the_dry_result():
    # the moist formulation contains the dry-air model exactly (its water terms vanish with w),
    # so a tiny humidity must give nearly the dry result (the dry path itself is separate code)
    for model in ("real_gas", "ideal_gas"):
        doc = copy.deepcopy(BASELINE[f"{model}_isentropic_3"]["doc"])
        dry = thermo.solve(copy.deepcopy(doc))
        doc["site"]["humidity_ratio"] = 1e-9
        wet = thermo.solve(doc)
        assert wet.shaft_power_W == pytest.approx(dry.shaft_power_W, rel=1e-8)
        assert wet.stages[-1].outlet.T == pytest.approx(dry.stages[-1].outlet.T, abs=1e-6)


def test_sample_projects_solve_with_closed_balances():
    from conftest import SAMPLES
    for path in sorted(SAMPLES.glob("*.json")):
        d = thermo.solve(json.loads(path.read_text())).to_dict()
        assert abs(d["energy_residual"]) <= 1e-6 and abs(d["exergy_residual"]) <= 1e-6, path.name
