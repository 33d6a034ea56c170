"""Field-check uncertainty (thermo/uncertainty): closed form, linear against Monte Carlo, verdicts."""
from __future__ import annotations

import copy
import json
import math
import threading

import numpy as np
import pytest

from conftest import SAMPLES
from stagewright.core.errors import InputError
from stagewright.core.project.validation import normalise, problems
from stagewright.core.uncertainty.field_check import field_check_uncertainty, has_field_check
from stagewright.core.uncertainty.inputs import measured_inputs
from stagewright.core.uncertainty.monte_carlo import draw_inputs
from stagewright.core.uncertainty.verdict import judge, tolerance_of

T1, P1, RATIO, K, T2 = 293.15, 100_000.0, 4.0, 1.4, 470.0


def one_stage(u_t2: float = 1.0, u_t1: float | None = None, guarantees=None) -> dict:
    """Perfect gas, one stage, no losses: η_s = T1 (r^((k-1)/k) - 1) / (T2 - T1)."""
    unc = [{"input": "stages[0].efficiency.value_K", "kind": "standard", "standard_uncertainty": u_t2}]
    if u_t1 is not None:
        unc.append({"input": "site.ambient_temperature_K", "kind": "standard", "standard_uncertainty": u_t1})
    return {"site": {"ambient_temperature_K": T1, "barometric_pressure_Pa": P1},
            "fluid": {"model": "constant_cp", "cp_J_kgK": 1005.0, "k": K},
            "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": RATIO * P1,
            "stages": [{"efficiency": {"kind": "discharge_temperature", "value_K": T2}}],
            "field_check": {"uncertainties": unc, "guarantees": guarantees or [], "monte_carlo_draws": 4000}}


def _row(result, name):
    return [f.name for f in result.figures].index(name)


def test_closed_form_isentropic_efficiency_and_its_uncertainty():
    # Perfect gas: T2s = T1 r^((k-1)/k) (isentropic relation of a perfect gas, e.g. Çengel & Boles,
    # Thermodynamics: An Engineering Approach, §7-9); η = (T2s - T1)/(T2 - T1). Law of propagation
    # of uncertainty, JCGM 100:2008 §5.1.2 eq. (10), with ∂η/∂T2 = -η/(T2 - T1) and
    # ∂η/∂T1 = (r^a - 1) T2 / (T2 - T1)².
    u2, u1 = 1.5, 0.4
    r = field_check_uncertainty(one_stage(u2, u1), monte_carlo=False)
    j = _row(r, "stages[0].isentropic_efficiency")
    ra = RATIO ** ((K - 1) / K)
    eta = T1 * (ra - 1) / (T2 - T1)
    c2, c1 = -eta / (T2 - T1), (ra - 1) * T2 / (T2 - T1) ** 2
    u_exact = math.hypot(c2 * u2, c1 * u1)
    assert r.linear.value[j] == pytest.approx(eta, rel=1e-10)
    # central differences of a function with a small second derivative: agree to 1e-4 relative
    assert r.linear.standard_uncertainty[j] == pytest.approx(u_exact, rel=1e-4)
    assert r.linear.expanded_uncertainty[j] == pytest.approx(2 * u_exact, rel=1e-4)
    shares = r.linear.variance_share[j]
    assert shares[0] == pytest.approx((c2 * u2) ** 2 / u_exact ** 2, rel=1e-3)
    assert shares.sum() == pytest.approx(1.0)


def test_largest_contributor_is_named_in_words():
    r = field_check_uncertainty(one_stage(1.0), monte_carlo=False)
    sentence = [s for s in r.sentences() if "isentropic" in s][0]
    assert sentence == "100 % of the variance of stage 1 isentropic efficiency comes from stage 1 discharge temperature"


def test_monte_carlo_agrees_with_first_order_on_a_nearly_linear_case():
    # small uncertainties on the perfect-gas stage: the model is nearly linear over ±3 u, so the
    # Monte Carlo standard deviation must match u_c within its statistical error s/√(2(M-1))
    # (JCGM 101:2008 §8 compares the two this way; the 3-σ band is common practice, no source)
    r = field_check_uncertainty(one_stage(0.5, 0.2), draws=4000, seed=7)
    mc = r.monte_carlo
    assert mc.solved == 4000 and mc.failed == 0
    j = _row(r, "stages[0].isentropic_efficiency")
    se = mc.standard_uncertainty[j] / math.sqrt(2 * (mc.solved - 1))
    assert abs(mc.standard_uncertainty[j] - r.linear.standard_uncertainty[j]) <= 3 * se
    assert abs(mc.mean[j] - r.linear.value[j]) <= 3 * mc.standard_uncertainty[j] / math.sqrt(mc.solved)
    assert all(a is not False for a in r.agreement())


def test_monte_carlo_agrees_on_the_real_gas_sample():
    doc = json.loads((SAMPLES / "field_check_two_stage.json").read_text())
    assert has_field_check(doc)
    r = field_check_uncertainty(doc, draws=600, seed=3)
    assert r.monte_carlo.failed == 0
    assert all(r.agreement()), list(zip([f.name for f in r.figures], r.linear.standard_uncertainty,
                                        r.monte_carlo.standard_uncertainty))
    d = r.to_dict()
    json.dumps(d)  # plain data
    assert {v["figure"] for v in d["verdicts"]} == {g["figure"] for g in doc["field_check"]["guarantees"]}


def test_same_seed_same_draws_and_rectangular_limits():
    doc = one_stage()
    doc["field_check"]["uncertainties"] = [
        {"input": "stages[0].efficiency.value_K", "kind": "accuracy_class", "class_percent": 0.5,
         "full_scale": 600.0}]
    inputs = measured_inputs(normalise(doc))
    # JCGM 100:2008 §4.3.7: limits ±a, rectangular → u = a/√3; a = 0.5 % of 600 K = 3 K
    assert inputs[0].half_width == pytest.approx(3.0)
    assert inputs[0].standard_uncertainty == pytest.approx(3.0 / math.sqrt(3.0))
    x = draw_inputs(inputs, 20000, 5)
    assert np.array_equal(x, draw_inputs(inputs, 20000, 5))
    assert x.min() >= T2 - 3.0 and x.max() <= T2 + 3.0
    assert x.std() == pytest.approx(3.0 / math.sqrt(3.0), rel=0.02)


def test_accuracy_class_of_the_reading():
    doc = one_stage()
    doc["field_check"]["uncertainties"][0] = {"input": "stages[0].efficiency.value_K", "kind": "accuracy_class",
                                              "class_percent": 1.0}
    (inp,) = measured_inputs(normalise(doc))
    assert inp.half_width == pytest.approx(0.01 * T2)


@pytest.mark.parametrize("entry, blocks_solve", [
    ({"input": "fluid.cp_J_kgK", "kind": "standard", "standard_uncertainty": 1.0}, True),  # not measurable
    ({"input": "stages[0].efficiency.value_K", "kind": "standard", "standard_uncertainty": 1.0}, True),  # twice
    ({"input": "stages[3].efficiency.value_K", "kind": "standard", "standard_uncertainty": 1.0}, False),  # no stage 4
    ({"input": "stages[0].pressure_ratio", "kind": "standard", "standard_uncertainty": 0.1}, False),  # ratio null
])
def test_bad_uncertainty_entries_name_their_field(entry, blocks_solve):
    # entries that refer to a stage or value the project does not give (a stage removed since)
    # must not block the solve: they are refused only when the uncertainty is evaluated
    doc = one_stage()
    doc["field_check"]["uncertainties"].append(entry)
    field = "field_check.uncertainties[1].input"
    assert [p.field for p in problems(doc)] == ([field] if blocks_solve else [])
    with pytest.raises(InputError) as err:
        field_check_uncertainty(doc, monte_carlo=False)
    assert err.value.field == field


def test_guarantee_on_a_figure_the_check_does_not_report():
    bad = one_stage(guarantees=[{"kind": "relative", "figure": "stages[0].polytropic_efficiency", "value": 0.8,
                                 "tolerance": 0.02}])
    assert [p.field for p in problems(bad)] == ["field_check.guarantees[0].figure"]
    gone = one_stage(guarantees=[{"kind": "relative", "figure": "stages[4].isentropic_efficiency", "value": 0.8,
                                  "tolerance": 0.02}])
    assert problems(gone) == []
    with pytest.raises(InputError):
        field_check_uncertainty(gone, monte_carlo=False)


def test_removing_a_stage_leaves_a_project_that_still_solves():
    from stagewright.core import solve
    doc = json.loads((SAMPLES / "field_check_two_stage.json").read_text())
    doc["stages"] = doc["stages"][:1]
    doc["stages"][0]["pressure_ratio"] = None
    doc["discharge_pressure_Pa"] = 300_000.0
    assert [p.field for p in problems(doc)] == []
    assert len(solve(doc).stages) == 1


def test_verdict_flips_exactly_at_the_tolerance_boundary():
    # zone [7, 9] (8 ± 1), U = 0.5; all values exact in binary
    g = {"kind": "absolute", "figure": "x", "value": 8.0, "tolerance": 1.0, "limit": "both"}
    assert judge("x", g, 8.5, 0.5).verdict == "within"  # y + U = 9, the limit itself
    assert judge("x", g, math.nextafter(8.5, 9), 0.5).verdict == "not decidable at this uncertainty"
    assert judge("x", g, 9.5, 0.5).verdict == "not decidable at this uncertainty"  # y - U = 9: touching
    assert judge("x", g, math.nextafter(9.5, 10), 0.5).verdict == "outside"
    assert judge("x", g, 7.5, 0.5).verdict == "within"
    assert judge("x", g, math.nextafter(7.5, 7), 0.5).verdict == "not decidable at this uncertainty"
    assert judge("x", g, math.nextafter(6.5, 6), 0.5).verdict == "outside"
    one_sided = dict(g, limit="at_least")
    assert judge("x", one_sided, 1e9, 0.5).verdict == "within"


def test_verdict_end_to_end_flips_with_the_tolerance():
    # η from the closed form with U from the first-order propagation: a guarantee whose lower
    # limit sits exactly at η - U is met; one a little higher is not decidable
    base = field_check_uncertainty(one_stage(1.0), monte_carlo=False)
    j = _row(base, "stages[0].isentropic_efficiency")
    eta, U = float(base.linear.value[j]), float(base.linear.expanded_uncertainty[j])
    limit = eta - U

    def verdict(tol):
        g = [{"kind": "absolute", "figure": "stages[0].isentropic_efficiency", "value": limit + tol,
              "tolerance": tol, "limit": "at_least"}]
        return field_check_uncertainty(one_stage(1.0, guarantees=g), monte_carlo=False).verdicts[0]
    assert verdict(0.05).verdict == "within"  # (limit + 0.05) - 0.05 may round either way by 1 ulp
    assert verdict(0.05).lower_limit <= limit + 1e-15
    shifted = [{"kind": "absolute", "figure": "stages[0].isentropic_efficiency", "value": limit + 0.051,
                "tolerance": 0.05, "limit": "at_least"}]
    assert field_check_uncertainty(one_stage(1.0, guarantees=shifted), monte_carlo=False).verdicts[0].verdict \
        == "not decidable at this uncertainty"
    far = [{"kind": "absolute", "figure": "stages[0].isentropic_efficiency", "value": eta + U + 0.2,
            "tolerance": 0.1, "limit": "at_least"}]
    assert field_check_uncertainty(one_stage(1.0, guarantees=far), monte_carlo=False).verdicts[0].verdict == "outside"


def test_iso1217_band_follows_the_flow():
    # bands and percentages from memory (thermo/uncertainty/verdict.py), so only their use is checked
    small = {"kind": "iso1217_annex_c", "figure": "free_air_delivery_m3_s", "value": 0.005}
    big = dict(small, value=1.0)
    assert tolerance_of(small)[0] / 0.005 > tolerance_of(big)[0] / 1.0
    assert "from memory" in tolerance_of(big)[1]


def test_cancel_keeps_the_first_order_result():
    stop = threading.Event()
    seen = []

    def progress(fraction, message):
        seen.append(fraction)
        if fraction > 0:
            stop.set()
    r = field_check_uncertainty(one_stage(1.0), draws=2000, progress=progress, cancel=stop)
    assert r.monte_carlo is None and "cancelled" in r.monte_carlo_note
    assert math.isfinite(r.linear.standard_uncertainty[0])
    assert 0 < max(seen) < 1


def test_draws_outside_an_inputs_range_are_counted_not_solved():
    doc = copy.deepcopy(one_stage(1.0))
    doc["site"]["relative_humidity"] = 0.995
    doc["fluid"]["model"] = "ideal_gas"
    doc["field_check"]["uncertainties"].append({"input": "site.relative_humidity", "kind": "limits",
                                                "half_width": 0.01})
    r = field_check_uncertainty(doc, draws=400, seed=2)
    assert 0 < r.monte_carlo.failed < 400
    assert "site.relative_humidity" in r.monte_carlo.first_failure
