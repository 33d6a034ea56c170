"""A year whose coolers are sized once and rated at fixed UA in every bin (issue 15).

Outside references: the ε–NTU relations of the ``ht`` package (Caleb Bell; Incropera et al.,
*Fundamentals of Heat and Mass Transfer*, 6th ed., Table 11.3) for a hand rating with the same
UA, and CoolProp's incompressible ``INCOMP::Water`` for the coolant's specific heat.
"""
import copy
import random

import CoolProp.CoolProp as CP
import ht
import pytest

from stagewright.core.project.validation import normalise
from stagewright.core.year import run_year
from stagewright.core.year_bins import norm_for_bin, year_base
from stagewright.core.year_profile import operating_bins


def _doc(model="constant_cp", rh=0.0, arrangement="counter_flow", coolers=None, months=None):
    doc = {"site": {"ambient_temperature_K": 293.15, "relative_humidity": rh}, "fluid": {"model": model},
           "flow": {"kind": "mass", "value": 1.5}, "discharge_pressure_Pa": 8e5,
           "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                       "cooler": {"approach_K": 10.0, "arrangement": arrangement, "coolant_inlet_temperature_K": 293.15,
                                  "coolant": {"kind": "water", "temperature_rise_K": 8.0}}} for _ in range(2)]}
    months = months or [{"temperature_K": 275.15 + 2.0 * i, "relative_humidity": rh,
                         "coolant_inlet_temperature_K": 283.15 + 1.5 * i} for i in range(12)]
    doc["year"] = {"profile": {"kind": "monthly", "months": months},
                   "coolers": coolers or {"mode": "design_once", "design_condition": "hottest_bin", "ua_margin": 0.0}}
    return doc


@pytest.mark.parametrize("model, rh", [("constant_cp", 0.0), ("real_gas", 0.7)])
def test_design_bin_rated_at_its_own_condition_reproduces_the_sized_result(model, rh):
    rated = run_year(_doc(model, rh), exact=True)
    sized = run_year(_doc(model, rh, coolers={"mode": "size_every_bin"}), exact=True)
    hot = max(range(12), key=lambda i: rated.bins[i].temperature_K)
    r, s = rated.bins[hot], sized.bins[hot]
    assert rated.design.bin_label == r.label
    for a, b in zip(r.cooler_outlet_temperatures_K, s.cooler_outlet_temperatures_K):
        assert a == pytest.approx(b, abs=1e-8)
    for a, b in zip(r.cooler_duties_W, s.cooler_duties_W):
        assert a == pytest.approx(b, rel=1e-9)
    for a, b in zip(r.coolant_outlet_temperatures_K, s.coolant_outlet_temperatures_K):
        assert a == pytest.approx(b, abs=1e-8)
    assert r.driver_power_W == pytest.approx(s.driver_power_W, rel=1e-12)
    assert r.limit_flags == []


def _hand_rated_outlet(t_air_in, m_air, cp_air, ua, t_ci, m_c, subtype, n_shell_tube=None):
    """ε–NTU rating by hand with ht, the coolant's mean cp iterated from CoolProp enthalpies."""
    t_co = t_ci + 5.0
    for _ in range(30):
        cp_c = (CP.PropsSI("H", "T", t_co, "P", 3e5, "INCOMP::Water")
                - CP.PropsSI("H", "T", t_ci, "P", 3e5, "INCOMP::Water")) / (t_co - t_ci)
        c_air, c_c = m_air * cp_air, m_c * cp_c
        c_min, c_max = min(c_air, c_c), max(c_air, c_c)
        eps = ht.effectiveness_from_NTU(ua / c_min, c_min / c_max, subtype=subtype, n_shell_tube=n_shell_tube)
        q = eps * c_min * (t_air_in - t_ci)
        t_co = t_ci + q / c_c
    return t_air_in - q / c_air, q


@pytest.mark.parametrize("arrangement, subtype, n", [("counter_flow", "counterflow", None),
                                                      ("shell_and_tube_1_2", "S&T", 1)])
def test_rated_bins_match_a_hand_ntu_rating_with_ht(arrangement, subtype, n):
    y = run_year(_doc(arrangement=arrangement), exact=True)
    cooler = y.design.coolers[0]
    doc = _doc(arrangement=arrangement)
    base = year_base(normalise(doc))
    from stagewright.core.solve import solve_normalised
    for b in (y.bins[0], y.bins[5]):
        bin_ = next(x for x in operating_bins(normalise(doc)["year"]) if x.label == b.label)
        res = solve_normalised(norm_for_bin(base, bin_, y.design.rating()), detail=False)
        t_in = res.stages[0].outlet.T
        t_out, q = _hand_rated_outlet(t_in, 1.5, 1005.0, cooler.rated_ua_W_K, bin_.coolant_inlet_temperature_K,
                                      cooler.coolant_flow_kg_s, subtype, n)
        # same model (constant cp air, the coolant's mean cp): agreement to rounding (measured 4e-13 K)
        assert b.cooler_outlet_temperatures_K[0] == pytest.approx(t_out, abs=1e-8)
        assert b.cooler_duties_W[0] == pytest.approx(q, rel=1e-10)


def test_fouling_margin_scales_the_rated_ua_and_cools_the_design_bin_further():
    y0 = run_year(_doc(), exact=True)
    y1 = run_year(_doc(coolers={"mode": "design_once", "design_condition": "hottest_bin", "ua_margin": 0.25}),
                  exact=True)
    for c0, c1 in zip(y0.design.coolers, y1.design.coolers):
        assert c1.rated_ua_W_K == pytest.approx(1.25 * c0.design_ua_W_K, rel=1e-12)
    hot = y1.design.bin_label
    b0 = next(b for b in y0.bins if b.label == hot)
    b1 = next(b for b in y1.bins if b.label == hot)
    assert all(t1 < t0 for t0, t1 in zip(b0.cooler_outlet_temperatures_K, b1.cooler_outlet_temperatures_K))


def test_default_margin_is_ten_percent():
    doc = _doc(coolers={"mode": "design_once"})
    assert normalise(doc)["year"]["coolers"] == {"mode": "design_once", "design_condition": "site",
                                                 "ua_margin": 0.1, "max_dryer_inlet_temperature_K": None}


def test_fixed_coolers_move_with_the_coolant_and_flag_bins_hotter_than_design():
    # designed at the site (coolant 293.15 K); the summer bins' coolant is warmer, so a fixed
    # exchanger lets the air out warmer than designed: those bins are flagged, the cold ones not
    y = run_year(_doc(coolers={"mode": "design_once", "design_condition": "site", "ua_margin": 0.0}), exact=True)
    design_out = y.design.coolers[0].design_outlet_temperature_K
    for b in y.bins:
        warm = b.cooler_outlet_temperatures_K[0] > design_out + 1e-6
        assert bool(b.limit_flags) == (warm or b.cooler_outlet_temperatures_K[1] >
                                       y.design.coolers[1].design_outlet_temperature_K + 1e-6)
    outs = [b.cooler_outlet_temperatures_K[0] for b in y.bins]
    assert outs == sorted(outs)  # coolant warms month by month in this profile
    assert y.totals["bins_missing_limits"] == sum(1 for b in y.bins if b.limit_flags) > 0
    coolant_out = [b.coolant_outlet_temperatures_K[0] for b in y.bins]
    assert coolant_out == sorted(coolant_out)


def test_dryer_inlet_limit_is_flagged():
    y = run_year(_doc(coolers={"mode": "size_every_bin", "max_dryer_inlet_temperature_K": 303.15}), exact=True)
    for b in y.bins:
        assert bool(b.limit_flags) == (b.dryer_inlet_temperature_K > 303.15)
        assert b.dryer_inlet_temperature_K == b.cooler_outlet_temperatures_K[-1]
    assert any(b.limit_flags for b in y.bins) and not all(b.limit_flags for b in y.bins)


def test_year_makes_no_copy_of_the_profile_per_bin(monkeypatch):
    # issue 15: each bin deep-copied the whole document (profile included): quadratic in the bins
    def refuse(*_a, **_k):
        raise AssertionError("deepcopy called by the year")
    monkeypatch.setattr(copy, "deepcopy", refuse)
    bins = [{"temperature_K": 280.0 + 0.01 * i, "relative_humidity": 0.0, "hours": 1.0} for i in range(50)]
    doc = _doc()
    doc["year"]["profile"] = {"kind": "bins", "bins": bins}
    y = run_year(doc)
    assert len(y.bins) == 50


def test_bin_projects_share_the_unchanged_parts():
    norm = normalise(_doc())
    base = year_base(norm)
    b = operating_bins(norm["year"])[0]
    d = norm_for_bin(base, b)
    assert "year" not in d and d["fluid"] is norm["fluid"] and d["driver"] is norm["driver"]
    assert norm["site"]["ambient_temperature_K"] == 293.15  # the base is left as it was


def test_fast_path_totals_agree_with_exact_solves_on_random_profiles():
    rng = random.Random(15)
    for _ in range(2):
        months = [{"temperature_K": rng.uniform(258.15, 308.15), "relative_humidity": rng.uniform(0.2, 0.9),
                   "coolant_inlet_temperature_K": rng.uniform(280.15, 300.15)} for _ in range(12)]
        for coolers in ({"mode": "size_every_bin"}, {"mode": "design_once", "design_condition": "hottest_bin"}):
            doc = _doc("real_gas", 0.5, coolers=coolers, months=months)
            fast, exact = run_year(doc, exact=False), run_year(doc, exact=True)
            for key in ("energy_kWh", "condensate_m3", "cooling_water_m3"):
                assert fast.totals[key] == pytest.approx(exact.totals[key], rel=1e-4)


def test_pool_of_two_processes_gives_the_same_year_and_reports_progress():
    bins = [{"temperature_K": 270.0 + 0.2 * i, "relative_humidity": 0.0, "hours": 1.0} for i in range(130)]
    doc = _doc(coolers={"mode": "design_once", "design_condition": "hottest_bin"})
    doc["year"]["profile"] = {"kind": "bins", "bins": bins}
    seen = []
    pooled = run_year(doc, processes=2, progress=lambda done, total: seen.append((done, total)))
    alone = run_year(doc, processes=1)
    assert pooled.totals == alone.totals
    assert [b.cooler_outlet_temperatures_K for b in pooled.bins] == [b.cooler_outlet_temperatures_K for b in alone.bins]
    assert seen[-1] == (130, 130) and len(seen) == 3  # one report per chunk of 60 bins


def test_pool_cancel_keeps_the_bins_finished():
    from stagewright.core.year import YearCancelled
    bins = [{"temperature_K": 270.0 + 0.2 * i, "relative_humidity": 0.0, "hours": 1.0} for i in range(130)]
    doc = _doc(coolers={"mode": "size_every_bin"})
    doc["year"]["profile"] = {"kind": "bins", "bins": bins}
    calls = []

    def cancelled():
        calls.append(1)
        return len(calls) > 1
    with pytest.raises(YearCancelled) as info:
        run_year(doc, processes=2, cancelled=cancelled)
    assert len(info.value.partial) == 60


@pytest.mark.parametrize("exact, rel", [(True, 1e-9), (False, 1e-5)])
def test_warm_started_bins_equal_bins_rated_alone(exact, rel):
    # each bin's rating starts where the previous bin's settled (RatingStart); the same bins solved one
    # by one, each rating searched afresh, give the same rated outlets: to 1e-9 relative exact, and to
    # the fast path's rating tolerance (year.FAST_RATING_RTOL = 1e-6, so 1e-5 with margin) on the fast path
    from stagewright.core.solve import solve_normalised
    months = [{"temperature_K": 262.15 + 3.1 * i, "relative_humidity": 0.85 - 0.03 * i,
               "coolant_inlet_temperature_K": 281.15 + 1.2 * i} for i in range(12)]
    doc = _doc("real_gas", 0.6, months=months, coolers={"mode": "design_once", "design_condition": "hottest_bin"})
    y = run_year(doc, exact=exact)
    norm = normalise(doc)
    base = year_base(norm)
    for b, got in zip(operating_bins(norm["year"]), y.bins):
        alone = solve_normalised(norm_for_bin(base, b, y.design.rating()), detail=False, fast=not exact)
        for a, c in zip(got.cooler_outlet_temperatures_K, alone.coolers):
            assert a == pytest.approx(c.outlet.T, rel=rel, abs=0.0)
        assert got.driver_power_W == pytest.approx(alone.driver_power_W, rel=rel)


def test_rated_root_on_a_pinch_is_taken_from_the_nearest_sizing():
    # found by an exact 974-hour year: at 273.16 K and 98 % RH the air-cooled aftercooler's rated root
    # sits where the wet zone's coolant reaches the dew point, and whether a sizing exists there is a
    # matter of rounding; Brent's fallback now takes the nearest outlet it sized. The outlet is main's
    # at 7d01038 (310.7706438541685 K, the same sample and design), to 1e-9 K
    import json
    from pathlib import Path
    doc = json.loads((Path(__file__).resolve().parent.parent / "sample_projects" /
                      "three_stage_site_year.json").read_text())
    doc["year"] = {"profile": {"kind": "bins", "bins": [
        {"temperature_K": 304.92, "relative_humidity": 0.25, "hours": 1.0},
        {"temperature_K": 273.16, "relative_humidity": 0.98, "hours": 1.0}]},
        "coolers": {"mode": "design_once", "design_condition": "hottest_bin"}}
    y = run_year(doc, exact=True)
    assert y.bins[1].cooler_outlet_temperatures_K[2] == pytest.approx(310.7706438541685, abs=1e-9)
