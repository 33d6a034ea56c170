"""The solve context: resolved site, intake state and the per-thread caches shared across solves.

Consistency checks (no physics of their own): a cached intake state must be exactly the one
computed afresh, and never another site's.
"""
from __future__ import annotations

import threading

import pytest

from tests.conftest import make_doc
from stagewright.core.errors import InputError
from stagewright.core.models import make_model
from stagewright.core.project.validation import normalise, resolve_site
from stagewright.core.solve_context import intake_state, mixture_for, release_thread_caches, solve_context


def _norm(**site):
    doc = make_doc(model="real_gas", inlet_pressure_drop_Pa=800.0)
    doc["site"].update(site)
    return normalise(doc)


def test_context_carries_the_resolved_site_and_the_intake():
    norm = _norm(relative_humidity=0.6)
    ctx = solve_context(norm, make_model({"model": "real_gas"}))
    assert ctx.site == resolve_site(norm) and ctx.norm is norm
    assert ctx.intake.dead.P0 == ctx.site.pressure_Pa == 1e5
    assert ctx.intake.after_filter.P == 1e5 - 800.0
    assert ctx.mixture is ctx.intake.mixture is mixture_for(ctx.model)
    assert ctx.intake.humidity_ratio == ctx.intake.model.water > 0.0
    # the intake's own relative humidity, from the formulation's saturation law
    assert ctx.intake.relative_humidity == pytest.approx(0.6, rel=1e-12)


def test_dry_intake_is_the_dry_model_itself():
    model = make_model({"model": "real_gas"})
    ctx = solve_context(_norm(), model)
    assert ctx.intake.model is model and ctx.mixture is None and ctx.intake.humidity_ratio == 0.0


def test_intake_state_is_kept_per_model_and_site_and_equals_a_fresh_one():
    model = make_model({"model": "real_gas"})
    sites = [resolve_site(_norm(**h)) for h in ({"relative_humidity": 0.5}, {"humidity_ratio": 0.005},
                                                   {"dew_point_K": 285.0}, {})]
    first = [intake_state(model, s) for s in sites]
    assert [intake_state(model, s) for s in sites] == first  # the same objects, from the cache
    assert all(intake_state(model, s) is f for s, f in zip(sites, first))
    release_thread_caches()
    again = [intake_state(model, s) for s in sites]
    assert all(a is not f for a, f in zip(again, first))
    for a, f in zip(again, first):
        assert (a.humidity_ratio, a.ambient, a.dead, a.after_filter, a.relative_humidity) == (
            f.humidity_ratio, f.ambient, f.dead, f.after_filter, f.relative_humidity)
    other = make_model({"model": "real_gas"})
    assert intake_state(other, sites[0]) is not intake_state(model, sites[0])


def test_caches_are_per_thread():
    model = make_model({"model": "constant_cp"})
    here = mixture_for(model)
    there = []
    t = threading.Thread(target=lambda: (there.append(mixture_for(model)), release_thread_caches()))
    t.start()
    t.join()
    assert there[0] is not here and mixture_for(model) is here


def test_a_humidity_above_saturation_names_the_field():
    with pytest.raises(InputError, match=r"site\.humidity_ratio"):
        solve_context(_norm(humidity_ratio=0.19), make_model({"model": "ideal_gas"}))


@pytest.mark.parametrize("model", ["real_gas", "ideal_gas", "constant_cp"])
@pytest.mark.parametrize("rh", [0.0, 0.7])
def test_free_air_delivery_from_the_contexts_ambient_equals_a_fresh_property_call(model, rh):
    # consistency: the solve converts FAD with the intake state it already has (no property call)
    from stagewright.core.flow import mass_flow_from
    ctx = solve_context(_norm(relative_humidity=rh), make_model({"model": model}))
    T0, P0 = ctx.site.ambient_temperature_K, ctx.site.pressure_Pa
    for kind in ("free_air_delivery", "normal_volume", "mass"):
        assert (mass_flow_from(kind, 0.5, ctx.intake.model, T0, P0, ambient=ctx.intake.ambient)
                == mass_flow_from(kind, 0.5, ctx.intake.model, T0, P0))
