"""The delivery pressure stated gauge or absolute: resolved per solve from the site pressure."""
import pytest

import stagewright.core
from tests.conftest import make_doc
from stagewright.core.project.schema import FORMAT_VERSION
from stagewright.core.errors import InputError
from stagewright.core.project import load, save
from stagewright.core.project.delivery import ABSOLUTE_KEY, GAUGE_KEY, delivery_pressure, stated_delivery
from stagewright.core.project.validation import normalise, problems
from stagewright.core.study import optimal_split
from stagewright.core.sweep import sweep

# ISO 2533:1975 standard atmosphere (the table, as cited in stagewright.core.project.validation):
# 101 325 Pa at 0 m, 89 875 Pa at 1000 m
ISO_2533 = {0.0: 101_325.0, 1000.0: 89_875.0}


def _gauge_doc(elevation_m: float, gauge_Pa: float = 7e5) -> dict:
    doc = make_doc()
    del doc[ABSOLUTE_KEY]
    doc["site"] = {"ambient_temperature_K": 293.15, "elevation_m": elevation_m}
    doc[GAUGE_KEY] = gauge_Pa
    return doc


@pytest.mark.parametrize("elevation_m", [0.0, 1000.0])
def test_a_gauge_statement_delivers_gauge_plus_the_site_pressure(elevation_m):
    r = stagewright.core.solve(_gauge_doc(elevation_m))
    # absolute = gauge + barometric (definition of gauge pressure); ISO 2533 to its table's 1 Pa
    assert r.delivery.P == pytest.approx(7e5 + ISO_2533[elevation_m], abs=1.0)
    assert r.dead.P0 == pytest.approx(ISO_2533[elevation_m], abs=1.0)


def test_the_same_gauge_statement_gives_the_same_gauge_pressure_at_both_sites():
    low, high = (stagewright.core.solve(_gauge_doc(z)) for z in (0.0, 1000.0))
    assert low.delivery.P - low.dead.P0 == pytest.approx(7e5, rel=1e-9)
    assert high.delivery.P - high.dead.P0 == pytest.approx(7e5, rel=1e-9)
    assert high.delivery.P < low.delivery.P


def test_an_absolute_statement_keeps_its_meaning():
    doc = make_doc(p_out=9e5)
    assert stagewright.core.solve(doc).delivery.P == pytest.approx(9e5, rel=1e-9)
    assert delivery_pressure(normalise(doc), 1e5) == 9e5


def test_exactly_one_statement_is_required():
    both = _gauge_doc(0.0)
    both[ABSOLUTE_KEY] = 8e5
    found = problems(both)
    assert [p.field for p in found] == [GAUGE_KEY] and "exactly one of" in found[0].expected
    neither = _gauge_doc(0.0)
    del neither[GAUGE_KEY]
    found = problems(neither)
    assert [p.field for p in found] == [ABSOLUTE_KEY] and found[0].expected.startswith("required")


@pytest.mark.parametrize("gauge_Pa, text", [(0.0, r"expected a number in \(0, 5e\+07\] Pa"),
                                             (5.0e7, "at most 49898675 Pa gauge at this site")])
def test_a_gauge_pressure_out_of_range_is_refused_naming_the_gauge_key(gauge_Pa, text):
    with pytest.raises(InputError, match=GAUGE_KEY) as info:
        stagewright.core.solve(_gauge_doc(0.0, gauge_Pa))
    assert info.match(text)


def test_a_saved_gauge_statement_reads_back_as_stated(tmp_path):
    path = tmp_path / "gauge.json"
    save(_gauge_doc(1000.0), path)
    doc = load(path)
    assert stated_delivery(doc) == (GAUGE_KEY, 7e5) and ABSOLUTE_KEY not in doc
    assert doc["version"] == FORMAT_VERSION


def test_a_sweep_over_the_elevation_resolves_the_gauge_statement_at_each_point():
    res = sweep(_gauge_doc(0.0), {"site.elevation_m": [0.0, 1000.0]}, processes=1)
    for i, (z,) in enumerate(res.points):
        exact = stagewright.core.solve(_gauge_doc(z))
        assert res.values["shaft_power_W"][i] == pytest.approx(exact.shaft_power_W, rel=1e-12)
    assert res.values["shaft_power_W"][0] != res.values["shaft_power_W"][1]


def test_a_sweep_axis_on_the_other_delivery_key_replaces_the_statement():
    res = sweep(_gauge_doc(1000.0), {ABSOLUTE_KEY: [8e5]}, processes=1)
    doc = _gauge_doc(1000.0)
    del doc[GAUGE_KEY]
    doc[ABSOLUTE_KEY] = 8e5
    assert not res.errors
    assert res.values["shaft_power_W"][0] == pytest.approx(stagewright.core.solve(doc).shaft_power_W, rel=1e-12)
    with pytest.raises(InputError, match="not both"):
        sweep(_gauge_doc(0.0), {ABSOLUTE_KEY: [8e5], GAUGE_KEY: [7e5]}, processes=1)


def test_the_staging_study_meets_the_gauge_statement_at_the_site():
    study = optimal_split(_gauge_doc(1000.0))
    assert study.result.delivery.P == pytest.approx(7e5 + ISO_2533[1000.0], abs=1.0)
