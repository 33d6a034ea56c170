"""Rating (UA given) inverts sizing (outlet given) to 1e-6, for every arrangement and coolant."""
import pytest

from stagewright.core.errors import InputError
from stagewright.core.exchanger import ARRANGEMENTS, HotSide, make_coolant, rate_exchanger, size_exchanger

COOLANTS = {"water": {"kind": "water"}, "glycol": {"kind": "glycol", "glycol_fraction": 0.4},
            "air": {"kind": "air"}}


def hot_at(t_out, t_in=430.0):
    # a gas whose cp rises with temperature (invented, smooth): h = 1000 T + 0.1 T²
    h = lambda t: 1000.0 * t + 0.1 * t * t
    return HotSide(t_in, t_out, 0.8 * (h(t_in) - h(t_out)))


@pytest.mark.parametrize("arr", list(ARRANGEMENTS))
@pytest.mark.parametrize("kind", list(COOLANTS))
@pytest.mark.parametrize("mode", ["flow", "rise"])
def test_rating_inverts_sizing(arr, kind, mode):
    fluid = make_coolant(COOLANTS[kind], (298.15, 101_325.0, 0.4))
    flow, rise = ((6.0 if kind == "air" else 1.5), None) if mode == "flow" else (None, 12.0)
    sized = size_exchanger(arr, hot_at(318.0), fluid, 298.15, flow, rise)
    t_out, rated = rate_exchanger(arr, sized.ua_W_K, 430.0, hot_at, fluid, 298.15, flow, rise)
    assert t_out == pytest.approx(318.0, rel=1e-6)
    assert rated.coolant.duty_W == pytest.approx(sized.coolant.duty_W, rel=1e-6)
    assert rated.coolant.outlet_temperature_K == pytest.approx(sized.coolant.outlet_temperature_K, rel=1e-6)


def test_more_ua_cools_further():
    fluid = make_coolant({"kind": "water"}, (298.15, 101_325.0, 0.0))
    t1, _ = rate_exchanger("counter_flow", 1000.0, 430.0, hot_at, fluid, 298.15, flow=2.0)
    t2, _ = rate_exchanger("counter_flow", 4000.0, 430.0, hot_at, fluid, 298.15, flow=2.0)
    assert 298.15 < t2 < t1 < 430.0


def test_coolant_warmer_than_air_is_refused():
    fluid = make_coolant({"kind": "water"}, (298.15, 101_325.0, 0.0))
    with pytest.raises(InputError, match="coolant_inlet_temperature_K"):
        rate_exchanger("counter_flow", 1000.0, 300.0, lambda t: hot_at(t, 300.0), fluid, 310.0, flow=1.0)


@pytest.mark.parametrize("ua, word", [(1e-12, "larger"), (1e12, "smaller")])
def test_ua_beyond_what_any_outlet_gives_names_the_ua(ua, word):
    # counter-flow: UA = C_min·NTU with NTU = ln((1−εCr)/(1−ε))/(1−Cr) (Incropera et al. 2007, Table 11.4)
    # is ~1e-6 W/K for an outlet 1e-7 K below the inlet and ~3e4 W/K for one 1e-10 K above the coolant:
    # a UA outside that range has no outlet and is refused naming the field
    fluid = make_coolant({"kind": "water"}, (298.15, 101_325.0, 0.0))
    with pytest.raises(InputError, match=rf"cooler\.ua_W_K.*expected a {word} UA"):
        rate_exchanger("counter_flow", ua, 430.0, hot_at, fluid, 298.15, flow=2.0)


@pytest.mark.parametrize("arr", list(ARRANGEMENTS))
@pytest.mark.parametrize("rtol", [1e-12, 1e-9])
def test_warm_started_rating_equals_a_cold_one(arr, rtol):
    # a run of ratings (a year's hours: the air and coolant inlets drift) started each from the one
    # before (RatingStart) settles on the same outlets as ratings searched afresh, to the tolerance
    from stagewright.core.exchanger import RatingStart
    fluid = make_coolant({"kind": "water"}, (298.15, 101_325.0, 0.0))
    start, calls = RatingStart(), {"warm": 0, "cold": 0}
    for k in range(12):
        t_in, t_ci = 430.0 + 1.7 * k, 290.0 + 0.6 * k

        def hot(t, key):
            calls[key] += 1
            return hot_at(t, t_in)
        cold, ex_cold = rate_exchanger(arr, 2500.0, t_in, lambda t: hot(t, "cold"), fluid, t_ci, flow=1.5, rtol=rtol)
        warm, ex_warm = rate_exchanger(arr, 2500.0, t_in, lambda t: hot(t, "warm"), fluid, t_ci, flow=1.5, rtol=rtol,
                                       start=start)
        assert warm == pytest.approx(cold, rel=2 * rtol, abs=0.0)
        assert ex_warm.ua_W_K == pytest.approx(2500.0, rel=1e-6)
        assert start.fraction == pytest.approx((warm - t_ci) / (t_in - t_ci), rel=1e-15)
    assert calls["warm"] < calls["cold"]  # the point of it: fewer sizings


def test_warm_start_that_misses_falls_back_to_the_cold_search():
    from stagewright.core.exchanger import RatingStart
    fluid = make_coolant({"kind": "water"}, (298.15, 101_325.0, 0.0))
    start = RatingStart()
    start.fraction, start.slope = 0.999999, -1e-9  # a nonsense start: the Newton step leaves the interval
    t_out, _ = rate_exchanger("counter_flow", 2500.0, 430.0, hot_at, fluid, 298.15, flow=1.5, start=start)
    cold, _ = rate_exchanger("counter_flow", 2500.0, 430.0, hot_at, fluid, 298.15, flow=1.5)
    assert t_out == pytest.approx(cold, rel=1e-12)
