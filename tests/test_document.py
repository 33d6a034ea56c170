"""Bad project input: each problem names the field, the value and the valid range."""
import pytest

import thermo
from thermo.document import problems
from thermo.errors import InputError
from conftest import make_doc


def moist(**site):
    doc = make_doc(model="ideal_gas", T0=298.15)
    doc["site"].update(site)
    return doc


@pytest.mark.parametrize("rh", [-0.1, 1.2])
def test_relative_humidity_outside_unit_interval(rh):
    with pytest.raises(InputError, match=r"site\.relative_humidity: .* expected a number in \[0, 1\]"):
        thermo.solve(moist(relative_humidity=rh))


def test_site_dew_point_above_ambient():
    with pytest.raises(InputError, match=r"site\.dew_point_K: 300\.0 — expected at most the ambient temperature 298\.15 K"):
        thermo.solve(moist(dew_point_K=300.0))


def test_two_humidity_inputs_are_refused():
    with pytest.raises(InputError, match=r"site\.dew_point_K: .*give at most one of relative_humidity, dew_point_K"):
        thermo.solve(moist(relative_humidity=0.5, dew_point_K=280.0))


def test_moist_cooler_below_freezing_says_ice_is_out_of_scope():
    doc = moist(relative_humidity=0.5)
    doc["stages"][0]["cooler"] = {"outlet_temperature_K": 270.0}
    found = problems(doc)
    assert [p.field for p in found] == ["stages[0].cooler.outlet_temperature_K"]
    assert "273.15 K or above" in found[0].expected and "ice is out of scope" in found[0].expected


def test_dry_cooler_below_freezing_stays_allowed():
    doc = make_doc(model="constant_cp", T0=293.15)
    doc["stages"][0]["cooler"] = {"outlet_temperature_K": 265.0, "coolant_inlet_temperature_K": 263.15}
    assert problems(doc) == []


def test_moist_intake_below_freezing_and_frost_point_input_refused():
    doc = make_doc(model="ideal_gas", T0=268.15, cool_to=290.0)
    doc["site"]["relative_humidity"] = 0.8
    assert "over ice is out of scope" in problems(doc)[0].expected
    assert "frost points" in problems(moist(dew_point_K=265.0))[0].expected


def test_moist_real_gas_state_outside_rp1485_range_names_stage_and_range():
    doc = make_doc(model="real_gas", stages=1, eta=0.75, p_out=12e5, T0=298.15)
    doc["site"]["relative_humidity"] = 0.5
    with pytest.raises(InputError, match=r"stages\[0\]: .*up to 623\.15 K and 1e\+07 Pa .*RP-1485"):
        thermo.solve(doc)
