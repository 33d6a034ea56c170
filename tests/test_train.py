"""Whole trains: classical closed forms, the real-gas cooling trap, property-based balances."""
import math

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

import stagewright.core
from tests.conftest import make_doc


def test_two_stage_perfect_intercooling_matches_closed_form():
    """Two ideal-gas stages, equal ratios, intercooled to the inlet temperature.

    Classical result (Çengel & Boles, Thermodynamics, 8th ed., 2015, §7-11):
    w = 2 cp T1 (r^((k-1)/k) − 1) / ηs with r = √(p2/p1).
    """
    doc = make_doc(stages=2, eta=0.8, p_out=16e5, T0=300.0)
    res = stagewright.core.solve(doc)
    cp, k = 1005.0, 1.4
    r = math.sqrt(16.0)
    w = 2 * cp * 300.0 * (r ** ((k - 1) / k) - 1) / 0.8
    assert [s.pressure_ratio for s in res.stages] == pytest.approx([4.0, 4.0], rel=1e-12)
    assert res.shaft_power_W == pytest.approx(w, rel=1e-12)


def test_isothermal_power_is_ideal_gas_closed_form():
    # w_iso = R T0 ln(p2/p1) for an ideal gas (Çengel & Boles 2015, eq. 7-57)
    res = stagewright.core.solve(make_doc(stages=3, p_out=20e5, T0=300.0))
    R = 1005.0 * 0.4 / 1.4
    assert res.isothermal_power_W == pytest.approx(R * 300.0 * math.log(20.0), rel=1e-12)


def test_real_gas_aftercooler_rejects_more_than_shaft_work():
    # Joule–Thomson: real air compressed to 8 bar(a) and cooled back to the inlet temperature has
    # lower enthalpy than at intake (Lemmon et al. 2000 EOS), so the cooler duty exceeds the work.
    res = stagewright.core.solve(make_doc(model="real_gas", stages=1, p_out=8e5, T0=293.15))
    assert res.coolers[0].duty_W > res.shaft_power_W
    assert res.energy_residual == pytest.approx(0.0, abs=1e-12)


def test_equal_split_accounts_for_cooler_pressure_drops():
    res = stagewright.core.solve(make_doc(stages=3, p_out=25e5, drop=20_000.0))
    assert res.delivery.P == pytest.approx(25e5, rel=1e-12)
    ratios = [s.pressure_ratio for s in res.stages]
    assert max(ratios) - min(ratios) < 1e-12


@pytest.mark.parametrize("model", ["real_gas", "ideal_gas", "constant_cp"])
def test_shaft_power_mode_inverts_mass_flow_mode(model):
    doc = make_doc(model=model, stages=2, p_out=9e5, flow=("mass", 0.73))
    doc["stages"][0]["heat_loss_W"] = 2500.0
    doc["driver"] = {"efficiency": 0.94}
    forward = stagewright.core.solve(doc)
    doc["flow"] = {"kind": "shaft_power", "value": forward.shaft_power_W}
    back = stagewright.core.solve(doc)
    assert back.mass_flow_kg_s == pytest.approx(0.73, rel=1e-9)


def test_field_check_measured_temperatures_and_power_give_flow_and_efficiencies():
    doc = make_doc(model="real_gas", stages=2, p_out=9e5, flow=("mass", 1.1))
    design = stagewright.core.solve(doc)
    for spec, st_ in zip(doc["stages"], design.stages):
        spec["efficiency"] = {"kind": "discharge_temperature", "value_K": st_.outlet.T}
    doc["flow"] = {"kind": "shaft_power", "value": design.shaft_power_W}
    check = stagewright.core.solve(doc)
    assert check.mass_flow_kg_s == pytest.approx(1.1, rel=1e-9)
    assert [s.isentropic_efficiency for s in check.stages] == pytest.approx([0.8, 0.8], rel=1e-9)


def test_free_air_delivery_uses_intake_density():
    # ISO 1217 (from memory): FAD is the delivered flow expressed at the standard inlet point
    doc = make_doc(model="ideal_gas", flow=("free_air_delivery", 0.25), T0=303.15, P0=97_000.0)
    res = stagewright.core.solve(doc)
    R = res.stages[0].inlet.P / (res.stages[0].inlet.rho * res.stages[0].inlet.T)
    assert res.mass_flow_kg_s == pytest.approx(0.25 * 97_000.0 / (R * 303.15), rel=1e-12)
    assert res.free_air_delivery_m3_s == pytest.approx(0.25, rel=1e-12)


def test_normal_volume_uses_din_1343_state():
    # DIN 1343: 273.15 K, 101 325 Pa
    res = stagewright.core.solve(make_doc(model="constant_cp", flow=("normal_volume", 1.0)))
    R = 1005.0 * 0.4 / 1.4
    assert res.mass_flow_kg_s == pytest.approx(101_325.0 / (R * 273.15), rel=1e-12)


# --- property-based: random valid trains --------------------------------------------------------

stage_st = st.fixed_dictionaries({
    "efficiency": st.one_of(
        st.fixed_dictionaries({"kind": st.just("isentropic"), "value": st.floats(0.5, 0.95)}),
        st.fixed_dictionaries({"kind": st.just("polytropic"), "value": st.floats(0.5, 0.95)})),
    "mechanical_efficiency": st.floats(0.9, 1.0),
    "heat_loss_W": st.floats(0.0, 2000.0),
    "exit_velocity_m_s": st.floats(0.0, 80.0),
    "cooler": st.one_of(st.none(), st.fixed_dictionaries({
        "approach_K": st.floats(3.0, 30.0),
        "coolant_inlet_temperature_K": st.floats(280.0, 310.0),
        "pressure_drop_Pa": st.floats(0.0, 30_000.0)})),
})

train_st = st.fixed_dictionaries({
    "site": st.fixed_dictionaries({"ambient_temperature_K": st.floats(253.15, 318.15),
                                   "elevation_m": st.floats(0.0, 2500.0)}),
    "fluid": st.fixed_dictionaries({"model": st.sampled_from(["real_gas", "ideal_gas", "constant_cp"])}),
    "flow": st.fixed_dictionaries({"kind": st.sampled_from(["mass", "free_air_delivery"]),
                                   "value": st.floats(0.05, 5.0)}),
    "inlet_pressure_drop_Pa": st.floats(0.0, 3000.0),
    "discharge_pressure_Pa": st.floats(3e5, 4e6),
    "driver": st.fixed_dictionaries({"efficiency": st.floats(0.85, 1.0)}),
    "stages": st.lists(stage_st, min_size=1, max_size=4),
})


def _plausible(doc):
    """Keep trains whose stage discharge stays within the model window (≤ 1300 K)."""
    n = len(doc["stages"])
    return (doc["discharge_pressure_Pa"] / 7e4) ** (1.0 / n) < 12.0


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(train_st)
def test_random_trains_close_both_balances_and_obey_second_law(doc):
    assume(_plausible(doc))
    try:
        res = stagewright.core.solve(doc)
    except stagewright.core.StagewrightError as exc:
        # an honest refusal is allowed (e.g. cooler coolant warmer than the stage discharge),
        # but it checks no balance: ask hypothesis for another train
        assert exc.args[0]
        assume(False)
    assert abs(res.energy_residual) <= 1e-6
    assert abs(res.exergy_residual) <= 1e-6
    assert res.inlet.entropy_generation_W_K >= 0.0
    for s in res.stages:
        assert s.entropy_generation_W_K >= 0.0
        assert 0.0 < s.isentropic_efficiency <= 1.0 + 1e-12
        assert 0.0 < s.polytropic_efficiency <= 1.0 + 1e-12
    for c in res.coolers:
        if c is not None:
            assert c.entropy_generation_W_K >= 0.0
    assert res.shaft_power_W >= res.isothermal_power_W
    assert 0.0 < res.second_law_efficiency <= 1.0
    assert 0.0 < res.isothermal_efficiency <= 1.0


# ---- moist intake air ----------------------------------------------------------------------
import copy
import json

import pytest

import stagewright.core
from tests.conftest import ROOT

BASELINE = json.loads((ROOT / "tests" / "data" / "dry_baseline.json").read_text())


def _same(expected, got, path="", rel=0.0):
    """Every key of ``expected`` is in ``got`` with the same value (floats within ``rel``; 0 = bit-equal)."""
    if isinstance(expected, dict):
        for k, v in expected.items():
            assert k in got, f"{path}.{k} missing"
            _same(v, got[k], f"{path}.{k}", rel)
    elif isinstance(expected, list):
        assert len(expected) == len(got), f"{path}: length {len(got)} != {len(expected)}"
        for i, (a, b) in enumerate(zip(expected, got)):
            _same(a, b, f"{path}[{i}]", rel)
    elif rel and isinstance(expected, float) and isinstance(got, float):
        assert got == pytest.approx(expected, rel=rel, abs=1e-13), f"{path}: {got!r} != {expected!r}"
    else:
        assert got == expected, f"{path}: {got!r} != {expected!r}"


@pytest.mark.parametrize("name", sorted(BASELINE))
def test_dry_intake_reproduces_the_dry_air_core_exactly(name):
    # Regression baseline (not a physics check; those live in test_stage/test_models): the
    # dry-air results of main just before moist air landed (commit 4ca441c); moist air landed
    # bit-identical to it. Later numerical work on the dry core (a different root finder in
    # the pressure split) may move the last bits only: 1e-12 relative (1e-13 absolute for the
    # closure residuals, which are rounding noise of order 1e-16).
    # The path of a stage with casing heat loss or exit kinetic energy is drawn from the inlet
    # to its real discharge since issue 14 (item 5), no longer along the adiabatic reference:
    # those paths are checked in tests/test_ts_lines.py, everything else against the baseline.
    case = BASELINE[name]
    expected = copy.deepcopy(case["result"])
    for spec, st in zip(case["doc"]["stages"], expected["stages"]):
        if spec.get("heat_loss_W") or spec.get("exit_velocity_m_s"):
            st.pop("path")
    _same(expected, stagewright.core.solve(copy.deepcopy(case["doc"])).to_dict(), rel=1e-12)


@pytest.mark.parametrize("humidity", [{"relative_humidity": 0.0}, {"humidity_ratio": 0.0}, {}])
def test_zero_humidity_given_any_way_is_the_dry_path(humidity):
    # a zero humidity, given any way, takes exactly the dry path: bit-equal results
    dry = copy.deepcopy(BASELINE["real_gas_isentropic_3"]["doc"])
    dry["site"].pop("relative_humidity", None)
    doc = copy.deepcopy(dry)
    doc["site"].update(humidity)
    _same(stagewright.core.solve(dry).to_dict(), stagewright.core.solve(doc).to_dict())


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
            # separators at 100 %: carry-over into a stage is covered by test_condensate; the
            # polytropic-efficiency search still fails to converge on some carry-over cases
            "separator_efficiency": 1.0}
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
            "discharge_pressure_Pa": min(P0 * r ** n * 0.9, 9.0e6), "stages": stages}  # RP-1485: ≤ 10 MPa


def _check_moist_balances(doc):
    res = stagewright.core.solve(doc)
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
        dry = stagewright.core.solve(copy.deepcopy(doc))
        doc["site"]["humidity_ratio"] = 1e-9
        wet = stagewright.core.solve(doc)
        assert wet.shaft_power_W == pytest.approx(dry.shaft_power_W, rel=1e-8)
        assert wet.stages[-1].outlet.T == pytest.approx(dry.stages[-1].outlet.T, abs=1e-6)


def test_sample_projects_solve_with_closed_balances():
    from tests.conftest import SAMPLES
    for path in sorted(SAMPLES.glob("*.json")):
        d = stagewright.core.solve(json.loads(path.read_text())).to_dict()
        assert abs(d["energy_residual"]) <= 1e-6 and abs(d["exergy_residual"]) <= 1e-6, path.name


def _assert_lean_matches_full(doc, rel=1e-9):
    """The lean solve (``detail=False``: trial solves of studies and sweeps) against the full one."""
    full, lean = stagewright.core.solve(copy.deepcopy(doc)), stagewright.core.solve(copy.deepcopy(doc), detail=False)
    for name in ("shaft_power_W", "driver_power_W", "heat_rejected_W", "entropy_generation_W_K",
                 "exergy_destroyed_W", "isothermal_power_W", "free_air_delivery_m3_s"):
        assert getattr(lean, name) == pytest.approx(getattr(full, name), rel=rel), name
    for a, b in zip(lean.stages + [lean.delivery], full.stages + [full.delivery]):
        a, b = getattr(a, "outlet", a), getattr(b, "outlet", b)
        assert (a.T, a.P, a.w, a.wl) == pytest.approx((b.T, b.P, b.w, b.wl), rel=rel, abs=1e-15)
        assert a.h == pytest.approx(b.h, rel=rel, abs=rel * abs(full.stages[0].gas_power_W / full.mass_flow_kg_s))
    for a, b in zip(lean.coolers, full.coolers):
        if b is not None:
            assert a.duty_W == pytest.approx(b.duty_W, rel=rel)
            assert a.water.drained_kg_s == pytest.approx(b.water.drained_kg_s, rel=rel, abs=1e-15)
    assert lean.water.condensate_kg_s == pytest.approx(full.water.condensate_kg_s, rel=rel, abs=1e-15)
    assert lean.water.delivered_pressure_dew_point_K == pytest.approx(full.water.delivered_pressure_dew_point_K,
                                                                      rel=rel)


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(moist_projects(models=("constant_cp", "ideal_gas", "real_gas"), always_cool=True))
def test_lean_moist_solve_agrees_with_the_full_solve(doc):
    # The fast path of studies and sweeps (solve(detail=False)) skips reporting-only work only;
    # the issue asks for 1e-4 agreement with the exact path, and it agrees to 1e-9 (the same
    # property calls; only the temperature guesses of the Newton steps differ). Reference: the
    # full solve (exact path), itself checked against HAPropsSI in tests/test_moist_mixture.py.
    _assert_lean_matches_full(doc)


@pytest.mark.parametrize("heat_loss", [0.0, 800.0])
def test_flow_from_shaft_power_equals_the_solve_at_its_mass_flow(heat_loss):
    # The shaft-power mode iterates on lean trial solves and solves the converged flow in full:
    # the answer must be the full solve at that mass flow, bit for bit, with the power asked for
    # (a consistency check of the inversion; the train itself is checked elsewhere).
    doc = copy.deepcopy(BASELINE["real_gas_isentropic_3"]["doc"])
    doc["site"]["relative_humidity"] = 0.7
    for s in doc["stages"]:
        s["heat_loss_W"] = heat_loss
    power = 1.3 * stagewright.core.solve(copy.deepcopy(doc)).shaft_power_W
    doc["flow"] = {"kind": "shaft_power", "value": power}
    res = stagewright.core.solve(copy.deepcopy(doc))
    assert res.shaft_power_W == pytest.approx(power, rel=1e-12)
    assert res.stages[0].path[1:-1], "the answer is a full solve (points along the path)"
    doc["flow"] = {"kind": "mass", "value": res.mass_flow_kg_s}
    again = stagewright.core.solve(doc)
    assert res.to_dict() == again.to_dict()


def test_remembered_intake_states_follow_every_site_input():
    # consistency check of the intake memo (sweeps and studies solve many trains at one site):
    # alternating humidity inputs at the same ambient and pressure must give exactly the results
    # of a fresh model each time — a memo keyed too loosely would hand one site's water to another
    from stagewright.core.project.validation import normalise
    from stagewright.core.models import make_model
    from stagewright.core.solve_context import solve_context
    from stagewright.core.train import solve_train

    def doc(site_humidity):
        return {"site": {"ambient_temperature_K": 300.0, "barometric_pressure_Pa": 1e5, **site_humidity},
                "fluid": {"model": "real_gas"}, "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 7e5,
                "inlet_pressure_drop_Pa": 800.0,
                "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                            "cooler": {"outlet_temperature_K": 305.0}} for _ in range(2)]}
    cases = [{"humidity_ratio": 0.005}, {"humidity_ratio": 0.012}, {"dew_point_K": 290.0},
             {"relative_humidity": 0.5}, {"humidity_ratio": 0.005}, {"relative_humidity": 0.0}]
    shared = make_model({"model": "real_gas"})
    for humidity in cases:
        norm = normalise(doc(humidity))
        a = solve_train(solve_context(norm, shared), 1.0, detail=False)
        b = solve_train(solve_context(norm, make_model({"model": "real_gas"})), 1.0, detail=False)
        assert a.shaft_power_W == b.shaft_power_W, humidity
        assert a.inlet.outlet == b.inlet.outlet and a.dead == b.dead, humidity
        assert (a.water is None) == (b.water is None)
        if a.water is not None:
            assert a.water.condensate_kg_s == b.water.condensate_kg_s


def test_a_hot_single_stage_is_reported_not_failed():
    # issue 14 item 8: the demo with one stage removed failed ("could not be solved") because
    # the uncooled reference compression ended 0.06 K above the humid-air formulation's
    # 623.15 K (ASHRAE RP-1485); its real discharge, after the casing loss, lies within it.
    # Now it solves, and the discharge above its limit is a warning naming the limit.
    doc = json.loads((ROOT / "sample_projects" / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    del doc["stages"][1]
    r = stagewright.core.solve(doc)
    t_out = r.stages[0].outlet.T
    assert 473.15 < t_out < 623.15
    hot = [w for w in r.warnings if w.field == "stages[0].max_discharge_temperature_K"]
    assert len(hot) == 1 and "473.1 K" in hot[0].message


@pytest.mark.parametrize("T0, P, W", [(293.15, 8e5, 0.012), (303.15, 4e6, 0.02), (280.0, 2e5, 0.004),
                                      (310.0, 1.2e5, 0.003)])
def test_isothermal_reference_from_the_gibbs_energy_of_condensate(T0, P, W):
    # issue 19: at T = T0 the condensate's h_l − T0 s_l is its Gibbs energy, so the isothermal
    # reference needs no temperature derivative of the enhancement factor; the figure is the
    # straightforward flow exergy of the state at (T0, p) (Bejan, Tsatsaronis & Moran 1996 §3.3)
    from stagewright.core.exergy import DeadState, flow_exergy, water_exergy
    from stagewright.core.models import RealGasAir
    from stagewright.core.moist.mixture import make_mixture
    from stagewright.core.moist.stream import MoistAir
    from stagewright.core.train import _isothermal_exergy, _liquid_exergy_at_dead_temperature
    mix = make_mixture(RealGasAir())
    air = MoistAir(mix, W)
    amb = MoistAir(mix, 0.005).at_tp(T0, 1e5)
    dead = DeadState(T0, 1e5, amb.h, amb.s, 0.005, 2.5e6, 8.9e3)
    point = air.at_tp(T0, P)
    h_l, s_l = mix.liquid(T0, P)
    assert _isothermal_exergy(air, P, dead) == pytest.approx(flow_exergy(point, 0.0, dead), rel=1e-13)
    assert _liquid_exergy_at_dead_temperature(mix, P, dead) == pytest.approx(water_exergy(h_l, s_l, dead),
                                                                             rel=1e-11, abs=1e-6)
