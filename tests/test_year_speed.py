"""A long year's shortcuts (issue 15, speed): bins with bit-for-bit equal inputs share one solve.

The shortcut must give every bin exactly the figures its own solve gives: checked against the
same year with the grouping switched off (each bin solved by itself), in and out of a process pool.
"""
import math

import pytest

import stagewright.core.year as year_module
from stagewright.core.year import run_year, same_input_groups
from stagewright.core.year_profile import Bin


def _doc(bins, coolers=None):
    return {"site": {"ambient_temperature_K": 293.15}, "fluid": {"model": "constant_cp"},
            "flow": {"kind": "mass", "value": 1.5}, "discharge_pressure_Pa": 8e5,
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                        "cooler": {"approach_K": 10.0, "coolant_inlet_temperature_K": 285.15,
                                   "coolant": {"kind": "water", "temperature_rise_K": 8.0}}} for _ in range(2)],
            "year": {"profile": {"kind": "bins", "bins": bins},
                     "coolers": coolers or {"mode": "design_once", "design_condition": "hottest_bin"}}}


def _hourly(n_unique, repeats):
    """Bins cycling through ``n_unique`` inputs (hours 1, 2, … so that each bin's totals differ)."""
    return [{"temperature_K": 290.0 + 1.5 * (i % n_unique), "relative_humidity": 0.0, "hours": 1.0 + i % 5,
             "coolant_inlet_temperature_K": 283.15 + 0.5 * (i % n_unique), "label": f"h{i}"}
            for i in range(n_unique * repeats)]


def _counting(monkeypatch):
    calls = []
    real = year_module.solve_normalised

    def counted(*args, **kwargs):
        calls.append(1)
        return real(*args, **kwargs)
    monkeypatch.setattr(year_module, "solve_normalised", counted)
    return calls


def test_bins_with_equal_inputs_are_solved_once(monkeypatch):
    # before issue 15's speed work every bin was solved, repeated inputs or not
    calls = _counting(monkeypatch)
    y = run_year(_doc(_hourly(3, 4), {"mode": "size_every_bin"}))
    assert len(calls) == 3
    assert [b.label for b in y.bins] == [f"h{i}" for i in range(12)]


def _same_figures(a: dict, b: dict, rel: float) -> bool:
    """Equal dicts, floats (also in lists) to ``rel``; everything else exactly (all of it when rel is 0)."""
    if rel == 0.0 or a.keys() != b.keys():
        return a == b
    for k in a:
        x, y = a[k], b[k]
        if isinstance(x, list) and x and isinstance(x[0], float):
            if x != pytest.approx(y, rel=rel, abs=0.0):
                return False
        elif isinstance(x, float):
            if x != pytest.approx(y, rel=rel, abs=1e-300):
                return False
        elif x != y:
            return False
    return True


@pytest.mark.parametrize("coolers, rel", [({"mode": "size_every_bin"}, 0.0), (None, 1e-11)])
def test_shared_solves_give_each_bin_its_own_figures(monkeypatch, coolers, rel):
    # sized coolers: bit for bit. Rated coolers (design once): each rating starts where the previous
    # bin's settled (exchanger.rating.RatingStart), so a bin solved after a different neighbour agrees
    # to the rating's tolerance (1e-12 relative on the exact path), not to the last bit
    doc = _doc(_hourly(4, 3), coolers)
    shared = run_year(doc)
    monkeypatch.setattr(year_module, "same_input_groups", lambda bins: [[i] for i in range(len(bins))])
    alone = run_year(doc)
    assert all(_same_figures(a.__dict__, b.__dict__, rel) for a, b in zip(shared.bins, alone.bins))
    assert _same_figures(shared.totals, alone.totals, rel)


def test_only_bit_for_bit_equal_inputs_share_a_solve():
    t = 280.0
    bins = [Bin("a", t, 0.5, 1.0, 1.0), Bin("b", math.nextafter(t, 300.0), 0.5, 1.0, 1.0),
            Bin("c", t, 0.5, 2.0, 1.0), Bin("d", t, 0.5, 1.0, 0.9), Bin("e", t, 0.5, 1.0, 1.0, 285.0)]
    assert same_input_groups(bins) == [[0, 2], [1], [3], [4]]


def test_pool_with_repeated_bins_gives_the_same_year_and_counts_every_bin():
    doc = _doc(_hourly(7, 12))  # 84 bins, 7 solves: the pool's chunks hold groups of bins
    seen = []
    pooled = run_year(doc, processes=2, progress=lambda done, total: seen.append((done, total)))
    alone = run_year(doc, processes=1)
    assert [b.__dict__ for b in pooled.bins] == [b.__dict__ for b in alone.bins]
    assert seen[-1] == (84, 84)


def test_cancel_keeps_the_finished_bins_in_profile_order():
    from stagewright.core.year import YearCancelled
    calls = []

    def cancelled():
        calls.append(1)
        return len(calls) > 2  # after two solves (groups)
    with pytest.raises(YearCancelled) as info:
        run_year(_doc(_hourly(3, 4), {"mode": "size_every_bin"}), cancelled=cancelled)
    assert [b.label for b in info.value.partial] == ["h0", "h1", "h3", "h4", "h6", "h7", "h9", "h10"]


def test_a_worker_task_does_not_carry_the_profile(monkeypatch):
    """Issue 15: no per-chunk copy of the profile (an 8760-hour profile pickled with each of ~146
    chunks was ~60 MB through the pool)."""
    import json
    from pathlib import Path

    import stagewright.core.year as year_mod
    seen = []
    real = year_mod._run_in_process

    def spy(job, bins, progress, cancelled):
        seen.append(job)
        return real(job, bins, progress, cancelled)
    monkeypatch.setattr(year_mod, "_run_in_process", spy)
    sample = Path(__file__).resolve().parent.parent / "sample_projects" / "three_stage_site_year.json"
    year_mod.run_year(json.loads(sample.read_text(encoding="utf-8")), processes=1)
    assert seen and "profile" not in seen[0].year
    assert "energy_price_per_kWh" in seen[0].year and "coolers" in seen[0].year
