"""Optimum pressure split against the classical staged-compression results, brute force, and limits."""
import math
import threading

import numpy as np
import pytest
from fluids.compressible import isentropic_work_compression

import stagewright.core
from stagewright.core.errors import InputError
from stagewright.core.split import delivered_pressure
from stagewright.core.study import LimitNotMet, StudyCancelled, optimal_split
from stagewright.core.study.limits import implied_ratio

from conftest import make_doc

R_MOLAR = 8.314462618  # CODATA 2018, J/(mol K)
M_AIR = 0.02896546  # kg/mol, CoolProp's air (as in test_stage.py)
CP_AIR = R_MOLAR / M_AIR * 1.4 / 0.4  # perfect gas with k = 1.4 exactly


def ideal_doc(stages, p_out=9e5, eta=0.8, **kw):
    """Constant-cp air, perfect intercooling to the inlet temperature, no pressure drops."""
    doc = make_doc(model="constant_cp", stages=stages, eta=eta, p_out=p_out, **kw)
    doc["fluid"].update({"cp_J_kgK": CP_AIR, "k": 1.4})
    return doc


@pytest.mark.parametrize("n", [2, 3, 4, 5])
def test_equal_ratios_for_perfect_intercooling_without_drops(n):
    # Classical minimum-work result for staged compression of an ideal gas with perfect
    # intercooling: every stage takes (P_out/P_in)^(1/N) (Çengel & Boles, Thermodynamics,
    # 8th ed., 2015, §7-11).
    out = optimal_split(ideal_doc(n, p_out=12e5))
    assert out.feasible and out.binding_limits == []
    for r in out.pressure_ratios:
        assert r == pytest.approx(12.0 ** (1.0 / n), rel=1e-6)
    # the discharge pressure is met exactly, not approximately
    assert out.result.delivery.P == pytest.approx(12e5, rel=1e-12)


def test_two_stage_intermediate_pressure_is_geometric_mean():
    r"""Two ideal-gas stages, each of isentropic efficiency η, inlet T1 to both (perfect
    intercooling), no pressure drops. With a = (k-1)/k the work per unit mass is

    .. math:: w = \frac{c_p T_1}{\eta}\Bigl[\Bigl(\frac{p_m}{p_1}\Bigr)^a - 1
              + \Bigl(\frac{p_2}{p_m}\Bigr)^a - 1\Bigr]

    and :math:`dw/dp_m = \frac{c_p T_1 a}{\eta}\,[p_m^{a-1} p_1^{-a} - p_2^a p_m^{-a-1}] = 0`
    gives :math:`p_m^{2a} = (p_1 p_2)^a`, i.e. :math:`p_m = \sqrt{p_1 p_2}` (classical result,
    Çengel & Boles, Thermodynamics, 8th ed., 2015, §7-11).
    """
    doc = ideal_doc(2, p_out=16e5, eta=0.77)
    doc["site"]["barometric_pressure_Pa"] = 0.98e5
    out = optimal_split(doc)
    p1, p2 = 0.98e5, 16e5
    assert out.result.stages[0].outlet.P == pytest.approx(math.sqrt(p1 * p2), rel=1e-6)


def test_minimum_power_matches_fluids_per_stage_work():
    # N equal stages at (p2/p1)^(1/N): total work = N × isentropic stage work of the
    # `fluids` library (Bell, ChEDL: fluids.compressible.isentropic_work_compression, J/mol).
    n, p1, p2 = 3, 1e5, 20e5
    out = optimal_split(ideal_doc(n, p_out=p2, eta=0.82))
    w_stage = isentropic_work_compression(T1=293.15, k=1.4, Z=1.0, P1=p1, P2=p1 * (p2 / p1) ** (1 / n), eta=0.82)
    assert out.result.driver_power_W == pytest.approx(n * w_stage / M_AIR, rel=1e-6)


def test_unequal_inlet_temperatures_follow_the_lagrange_condition():
    r"""Ideal gas, intercooler 2 leaves at 320 K while stage 1 takes air at 293.15 K, no drops.
    Minimising :math:`\sum_i c_p T_i (r_i^a - 1)/\eta` with :math:`\prod r_i` fixed gives
    :math:`T_i r_i^a` equal for all stages (Lagrange multiplier; Çengel & Boles §7-11 for the
    equal-temperature case), so :math:`(r_1/r_2)^a = T_2/T_1`.
    """
    doc = ideal_doc(2, p_out=10e5)
    doc["stages"][0]["cooler"]["outlet_temperature_K"] = 320.0
    r1, r2 = optimal_split(doc).pressure_ratios
    a = 0.4 / 1.4
    assert (r1 / r2) ** a == pytest.approx(320.0 / 293.15, rel=1e-6)
    assert r1 * r2 == pytest.approx(10.0, rel=1e-12)


def _real_doc(n):
    """Real-gas train with uneven coolers, efficiencies and drops (invented data)."""
    doc = make_doc(model="real_gas", stages=n, p_out=14e5, drop=15000.0, flow=("free_air_delivery", 0.25),
                   inlet_pressure_drop_Pa=2000.0)
    for i, st in enumerate(doc["stages"]):
        st["efficiency"]["value"] = 0.84 - 0.03 * i
        st["cooler"]["outlet_temperature_K"] = 300.0 + 6.0 * i
        st["heat_loss_W"] = 800.0
    return doc


def _power_at(doc, ratios):
    d = dict(doc)
    d["stages"] = [dict(s, pressure_ratio=r) for s, r in zip(doc["stages"], ratios)]
    return stagewright.core.solve(d, detail=False).driver_power_W


def test_two_stage_optimum_not_worse_than_brute_force_grid():
    # Direct enumeration (no published source needed): no grid split may beat the optimum.
    doc = _real_doc(2)
    out = optimal_split(doc)
    p_in = out.result.inlet.outlet.P
    best = math.inf
    for r1 in np.linspace(2.0, 6.0, 81):
        r2 = implied_ratio(p_in, 14e5, [r1, None], [15000.0, 15000.0], 1)
        best = min(best, _power_at(doc, [r1, r2]))
    assert out.result.driver_power_W <= best * (1 + 1e-9)
    assert out.result.delivery.P == pytest.approx(14e5, rel=1e-12)


def test_three_stage_optimum_not_worse_than_brute_force_grid():
    # Direct enumeration over (r1, r2), r3 implied by the discharge pressure.
    doc = _real_doc(3)
    out = optimal_split(doc)
    p_in = out.result.inlet.outlet.P
    drops = [15000.0] * 3
    best = math.inf
    for r1 in np.linspace(1.8, 3.6, 25):
        for r2 in np.linspace(1.6, 3.4, 25):
            r3 = implied_ratio(p_in, 14e5, [r1, r2, None], drops, 2)
            if r3 > 1.0:
                best = min(best, _power_at(doc, [r1, r2, r3]))
    assert out.result.driver_power_W <= best * (1 + 1e-9)


def _limited(limit, n=2):
    doc = make_doc(model="real_gas", stages=n, p_out=12e5, drop=10000.0, cool_to=310.0)
    for st in doc["stages"]:
        st["max_discharge_temperature_K"] = limit
    doc["stages"][0]["efficiency"]["value"] = 0.72  # a poorer first stage runs hotter
    return doc


def test_binding_temperature_limit_is_respected_and_relaxing_never_costs_power():
    # Relaxing a constraint cannot raise the minimum of a minimisation (feasible set only
    # grows; general property of constrained optima, e.g. Nocedal & Wright, Numerical
    # Optimization, 2nd ed., 2006, §12.8 sensitivity). Limits 473 … 520 K, invented data;
    # unlimited, this train's optimum discharges 463 K and 482 K.
    powers = []
    for limit in (473.0, 476.0, 480.0, 490.0, 520.0):
        out = optimal_split(_limited(limit))
        assert out.feasible
        assert all(st.outlet.T <= limit for st in out.result.stages)
        assert out.result.delivery.P == pytest.approx(12e5, rel=1e-12)
        powers.append(out.result.driver_power_W)
        if limit < 482.0:
            assert [b.field for b in out.binding_limits] == ["stages[1].max_discharge_temperature_K"]
            assert out.binding_limits[0].status == "active"
            assert out.result.stages[1].outlet.T == pytest.approx(limit, abs=0.01)
        else:
            assert out.binding_limits == []
    assert all(b <= a * (1 + 1e-12) for a, b in zip(powers, powers[1:]))
    assert powers[0] > powers[-1]  # the tightest limit does cost power


def test_limit_no_split_meets_names_it_and_the_closest_feasible_value():
    with pytest.raises(LimitNotMet, match=r"stages\[\d\]\.max_discharge_temperature_K: 420.0 .*closest feasible value is"):
        optimal_split(_limited(420.0))
    try:
        optimal_split(_limited(420.0))
    except LimitNotMet as exc:
        closest = exc.binding[0].closest_feasible
        assert exc.split is not None and not exc.split.feasible
    # the closest feasible value really is the edge: a hair above it works, below it does not
    assert optimal_split(_limited(closest + 0.05)).feasible
    assert not optimal_split(_limited(closest - 0.5), strict=False).feasible


def test_not_strict_returns_the_closest_split_flagged_infeasible():
    out = optimal_split(_limited(420.0), strict=False)
    assert out.feasible is False
    assert out.binding_limits and all(b.status == "violated" for b in out.binding_limits)
    assert out.binding_limits[0].closest_feasible > 420.0
    assert out.result.delivery.P == pytest.approx(12e5, rel=1e-12)


def test_single_stage_over_its_limit_reports_its_discharge_as_closest_value():
    doc = _limited(450.0, n=1)
    out = optimal_split(doc, strict=False)
    assert not out.feasible
    assert out.binding_limits[0].closest_feasible == pytest.approx(out.result.stages[0].outlet.T, rel=1e-12)


def test_max_ratio_too_low_names_closest_feasible_ratio():
    # No drops: the common maximum needed is sqrt(12) for two stages (pressure arithmetic).
    doc = make_doc(model="constant_cp", stages=2, p_out=12e5)
    for st in doc["stages"]:
        st["max_pressure_ratio"] = 3.0
    with pytest.raises(LimitNotMet, match=r"stages\[0\]\.max_pressure_ratio: 3.0 .* at least 3.4641"):
        optimal_split(doc)


def test_min_ratio_too_high_names_closest_feasible_ratio():
    doc = make_doc(model="constant_cp", stages=2, p_out=12e5)
    for st in doc["stages"]:
        st["min_pressure_ratio"] = 4.0
    with pytest.raises(LimitNotMet, match=r"stages\[0\]\.min_pressure_ratio: 4.0 .* at most 3.4641"):
        optimal_split(doc)


def test_inconsistent_ratio_bounds_are_an_input_error():
    doc = make_doc(model="constant_cp", stages=2)
    doc["stages"][1].update({"min_pressure_ratio": 5.0, "max_pressure_ratio": 4.0})
    with pytest.raises(InputError, match=r"stages\[1\]\.min_pressure_ratio: 5.0 — expected at most max_pressure_ratio \(4\)"):
        optimal_split(doc)


def test_active_ratio_bound_and_held_stage():
    doc = ideal_doc(3, p_out=12e5)
    doc["stages"][0]["max_pressure_ratio"] = 2.0
    doc["stages"][2].update({"min_pressure_ratio": 2.5, "max_pressure_ratio": 2.5})
    out = optimal_split(doc)
    r = out.pressure_ratios
    assert r[0] == pytest.approx(2.0, rel=1e-9) and r[2] == 2.5
    assert r[1] == pytest.approx(12.0 / 5.0, rel=1e-9)  # the rest, exactly
    assert "stages[0].max_pressure_ratio" in [b.field for b in out.binding_limits]


def test_measured_temperature_and_shaft_power_are_restated_with_notes():
    base_doc = make_doc(model="ideal_gas", stages=2, p_out=9e5, drop=5000.0)
    base = stagewright.core.solve(base_doc)
    doc = make_doc(model="ideal_gas", stages=2, p_out=9e5, drop=5000.0, flow=("shaft_power", base.shaft_power_W))
    doc["stages"][1]["efficiency"] = {"kind": "discharge_temperature", "value_K": base.stages[1].outlet.T}
    out = optimal_split(doc)
    assert len(out.notes) == 2 and "shaft power" in out.notes[0] and "measured" in out.notes[1]
    assert out.result.mass_flow_kg_s == pytest.approx(base.mass_flow_kg_s, rel=1e-9)
    # same stages as the base project, so the optimum is at most its power
    assert out.result.driver_power_W <= base.driver_power_W * (1 + 1e-12)


def test_cancel_event_stops_the_optimisation():
    ev = threading.Event()
    ev.set()
    with pytest.raises(StudyCancelled):
        optimal_split(_real_doc(2), cancel=ev)


def test_cooler_that_would_have_to_heat_is_reported_not_hidden():
    doc = make_doc(model="real_gas", stages=2, p_out=1.3e5, cool_to=330.0)
    for st in doc["stages"]:
        st["cooler"]["coolant_inlet_temperature_K"] = 290.0
    out = optimal_split(doc, strict=False)
    assert not out.feasible and out.pressure_ratios is None
    assert out.binding_limits[0].field == "stages[0].cooler.outlet_temperature_K"
    assert "a cooler cannot heat the air" in out.binding_limits[0].message


def test_delivered_pressure_of_result_matches_split_arithmetic():
    out = optimal_split(_real_doc(3))
    p_in = out.result.inlet.outlet.P
    assert delivered_pressure(p_in, out.pressure_ratios, [15000.0] * 3) == pytest.approx(14e5, rel=1e-12)
    assert out.iterations >= 1 and out.solves >= 3


def test_coolers_rated_from_ua_are_optimised_too():
    # Rated coolers (outlet is a result of UA and coolant flow): no start hint, no cooler
    # limit; the optimum must still beat the equal split and a brute-force grid.
    doc = make_doc(model="real_gas", stages=2, p_out=9e5, flow=("free_air_delivery", 0.3))
    for st in doc["stages"]:
        st["cooler"] = {"ua_W_K": 2500.0, "coolant": {"kind": "water", "flow_kg_s": 1.0},
                        "coolant_inlet_temperature_K": 293.15, "pressure_drop_Pa": 5000.0}
    out = optimal_split(doc)
    equal = stagewright.core.solve(doc)  # the project's own (equal) split
    assert out.result.driver_power_W <= equal.driver_power_W
    p_in = out.result.inlet.outlet.P
    grid = [_power_at(doc, [r1, implied_ratio(p_in, 9e5, [r1, None], [5000.0] * 2, 1)])
            for r1 in np.linspace(2.6, 3.6, 21)]
    assert out.result.driver_power_W <= min(grid) * (1 + 1e-9)
