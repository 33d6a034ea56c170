"""The tables and reuse behind a fast 8760-hour year (issue 15), each against the exact function it stands for.

References: the exact functions are the stream's own equilibrium enthalpy (ASHRAE RP-1485 saturation
and virial mixture via CoolProp, Herrmann, Kretzschmar & Gatley 2009), CoolProp's ``HAProps_Aux("f")``
(RP-1485 enhancement factor, also over ice) and ``HAPropsSI`` (Bell et al., Ind. Eng. Chem. Res. 53
(2014) 2498–2508). The year's fast-path tolerance (1e-4 relative on totals) is the issue's.
"""
from __future__ import annotations

import json
import math
import random
from pathlib import Path

import pytest

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.exchanger.coolant import coolant_side, make_coolant
from stagewright.core.exchanger.rating import rate_exchanger
from stagewright.core.exchanger.sizing import HotSide
from stagewright.core.moist.enhancement_table import ICE_FIRST, ICE_LAST, EnhancementTable
from stagewright.core.moist.saturated_table import SaturatedTable
from stagewright.core.moist.saturation import T_TRIPLE
from stagewright.core.moist.stream import MoistAir
from stagewright.core.solve import model_for
from stagewright.core.solve_context import mixture_for
from stagewright.core.year import run_year

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module")
def fast_mixture():
    return mixture_for(model_for({"model": "real_gas"}, True))


def test_saturated_table_gives_the_streams_own_equilibrium_enthalpy(fast_mixture):
    rng = random.Random(15)
    tables = {}
    worst = 0.0
    for _ in range(600):
        P = rng.choice([1.5e5, 3.3e5, 6e5, 12e5])
        T = rng.uniform(223.15, 333.15)
        table = tables.setdefault(P, SaturatedTable(fast_mixture, P))
        W = fast_mixture.saturation_ratio(T, P) * rng.uniform(1.0001, 3.0)
        exact = MoistAir(fast_mixture, W)._h(T, P)
        worst = max(worst, abs(table.enthalpy(T, W) - exact) / max(abs(exact), 1e3))
    assert worst < 1e-6  # measured 9e-8 when written; the fast path promises 1e-4


def test_saturated_table_leaves_unsaturated_air_and_the_triple_point_to_the_stream(fast_mixture):
    table = SaturatedTable(fast_mixture, 6e5)
    for T in (T_TRIPLE - 0.1, T_TRIPLE + 0.1):  # within the gap: the exact functions, no nodes
        assert table.parts(T) == table.exact(T)
    assert not table._nodes
    ws = fast_mixture.saturation_ratio(300.0, 6e5)
    assert table.enthalpy(300.0, 0.9 * ws) is None  # above the dew point: the gas at W, exactly
    table._nodes.clear()
    # just outside the gap each side takes nodes of its own phase only
    table.parts(T_TRIPLE + 0.3)
    table.parts(T_TRIPLE - 0.3)
    assert {side for side, _ in table._nodes} == {1, -1}
    assert all(abs(T_TRIPLE + side * (0.25 + 0.5 * k) - T_TRIPLE) >= 0.25 for side, k in table._nodes)


def test_enhancement_factor_over_ice_is_interpolated_within_1e7():
    table = EnhancementTable()
    rng = random.Random(3)
    worst = 0.0
    for _ in range(300):
        T = rng.uniform(ICE_FIRST, ICE_LAST)
        p = math.exp(rng.uniform(math.log(2e4), math.log(9.5e6)))
        worst = max(worst, abs(math.log(table(T, p)) - math.log(cpa.humid_air_coefficient("f", T, p))))
    # measured 7e-8 when written (at 9 MPa and −50 °C; 2e-9 below 2 MPa)
    assert worst < 1e-7
    assert table.nodes_computed > 16


def test_reused_liquid_coolant_rates_bit_for_bit_like_a_new_one():
    def rate(fluid):
        hot = lambda t: HotSide(410.0, t, 3000.0 * (410.0 - t))  # noqa: E731
        return rate_exchanger("shell_and_tube_1_2", 9000.0, 410.0, hot, fluid, 297.15, flow=4.0)
    site = (288.15, 101325.0, 0.5)
    first = make_coolant({"kind": "water"}, site)
    a = rate(first)
    again = make_coolant({"kind": "water"}, site)
    assert again is first  # made once per thread
    b = rate(again)
    assert a[0] == b[0] and a[1].coolant == b[1].coolant and a[1].ua_W_K == b[1].ua_W_K


def test_air_coolant_from_the_intakes_humidity_ratio_and_its_entropy_change():
    site = (268.15, 98_000.0, 0.8)  # −5 °C, 80 % over ice
    w = cpa.humid_air_property("W", "T", site[0], "P", site[1], "R", site[2])
    exact = make_coolant({"kind": "air"}, site)
    fast = make_coolant({"kind": "air"}, site, fast=True, humidity_ratio=w)
    assert fast.W == w
    assert fast.entropy_change(268.15, 301.0) == pytest.approx(exact.s(301.0) - exact.s(268.15), rel=1e-8)
    side_exact = coolant_side(exact, 268.15, 40_000.0, flow=3.0)
    side_fast = coolant_side(fast, 268.15, 40_000.0, flow=3.0)
    assert side_fast.outlet_temperature_K == pytest.approx(side_exact.outlet_temperature_K, abs=1e-7)
    assert side_fast.mean_temperature_K == pytest.approx(side_exact.mean_temperature_K, rel=1e-7)  # table: s to 1e-6 J/(kg K)


def test_a_winter_year_on_the_fast_path_agrees_with_exact_solves():
    # the sample's three coolers (two water, one air-cooled that condenses): hours from −14 °C to 31 °C,
    # so the ice grid, the saturated tables and the air coolant's humidity all take part
    doc = json.loads((ROOT / "sample_projects" / "three_stage_site_year.json").read_text())
    rng = random.Random(8760)
    bins = [{"temperature_K": round(rng.uniform(259.15, 304.15), 2), "relative_humidity": round(rng.uniform(0.3, 0.95), 3),
             "hours": 1.0} for _ in range(40)]
    doc["year"] = {"profile": {"kind": "bins", "bins": bins},
                   "coolers": {"mode": "design_once", "design_condition": "hottest_bin"}}
    fast, exact = run_year(doc, exact=False, processes=1), run_year(doc, exact=True, processes=1)
    for key in ("energy_kWh", "condensate_m3", "cooling_water_m3", "recoverable_heat_kWh"):
        assert fast.totals[key] == pytest.approx(exact.totals[key], rel=1e-4)
    for f, e in zip(fast.bins, exact.bins):
        assert f.dryer_inlet_temperature_K == pytest.approx(e.dryer_inlet_temperature_K, abs=1e-3)


def test_only_a_years_rated_coolers_on_the_fast_path_use_the_saturated_table(monkeypatch):
    import stagewright.core.cooler as cooler
    asked = []
    real = cooler.saturated_table
    monkeypatch.setattr(cooler, "saturated_table", lambda mix, p: asked.append(p) or real(mix, p))
    doc = json.loads((ROOT / "sample_projects" / "three_stage_site_year.json").read_text())
    doc["year"] = {"profile": {"kind": "bins", "bins": [
        {"temperature_K": 300.15, "relative_humidity": 0.7, "hours": 1.0},
        {"temperature_K": 290.15, "relative_humidity": 0.6, "hours": 1.0}]},
        "coolers": {"mode": "design_once", "design_condition": "hottest_bin"}}
    run_year(doc, exact=True, processes=1)
    assert asked == []
    run_year(doc, exact=False, processes=1)
    assert len(asked) >= 6  # three rated coolers, two bins


@pytest.mark.parametrize("spec", [{"kind": "water"},
                                  {"kind": "glycol", "glycol": "ethylene", "glycol_fraction": 0.3},
                                  {"kind": "glycol", "glycol": "propylene", "glycol_fraction": 0.5}])
def test_tabulated_liquid_coolant_matches_coolprops_incompressible_tables(spec):
    from stagewright.core.exchanger.liquid_table import TabulatedLiquid
    site = (293.15, 101325.0, 0.0)
    exact = make_coolant(spec, site)
    fast = make_coolant(spec, site, fast=True)
    assert isinstance(fast, TabulatedLiquid) and fast.exact is exact
    assert (fast.t_min, fast.t_max, fast.label) == (exact.t_min, exact.t_max, exact.label)
    rng = random.Random(12)
    for _ in range(300):
        T = rng.uniform(exact.t_min, exact.t_max)
        assert fast.h(T) == pytest.approx(exact.h(T), abs=1e-6)  # measured 4.3e-7 J/kg at worst
        assert fast.s(T) == pytest.approx(exact.s(T), abs=5e-8)  # measured 1.1e-8 J/(kg K)
    side_exact = coolant_side(exact, 297.15, 250_000.0, flow=6.0)
    side_fast = coolant_side(fast, 297.15, 250_000.0, flow=6.0)
    assert side_fast.outlet_temperature_K == pytest.approx(side_exact.outlet_temperature_K, abs=1e-9)


def test_bins_are_solved_in_temperature_bands_by_humidity_rising_then_falling():
    from stagewright.core.year import ORDER_BAND_K, _chunks
    from stagewright.core.year_profile import Bin
    t0 = 290.0
    band = math.floor(t0 / ORDER_BAND_K)
    lo = (band + (band % 2)) * ORDER_BAND_K + 0.01  # an even band: humidity rising
    hi = lo + ORDER_BAND_K
    bins = [Bin(f"b{i}", t, rh, 1.0, 1.0) for i, (t, rh) in enumerate(
        [(lo, 0.9), (hi, 0.2), (lo + 0.001, 0.3), (hi + 0.001, 0.8), (lo + 0.002, 0.6)])]
    order = [bins[g[0]] for chunk in _chunks(bins) for g in chunk]
    assert [b.relative_humidity for b in order] == [0.3, 0.6, 0.9, 0.8, 0.2]
