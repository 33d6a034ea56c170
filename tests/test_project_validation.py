"""Bad input: every rejection names the field path, the value and the valid range."""
import pytest

import stagewright.core
from tests.conftest import make_doc
from stagewright.core.project.validation import normalise, problems
from stagewright.core.errors import InputError, SecondLawViolation


@pytest.mark.parametrize("mutate, field, text", [
    (lambda d: d["stages"][1].update(pressure_ratio=0.9), r"stages\[1\]\.pressure_ratio", r"\(1, 40\]"),
    (lambda d: d["stages"][0]["efficiency"].update(value=1.2), r"stages\[0\]\.efficiency\.value", r"\[0\.001, 1\]"),
    (lambda d: d["stages"][0]["efficiency"].update(value=0.0), r"stages\[0\]\.efficiency\.value", r"\[0\.001, 1\]"),
    (lambda d: d["site"].update(ambient_temperature_K=400.0), r"site\.ambient_temperature_K", r"333\.15"),
    (lambda d: d["flow"].update(value=-1.0), r"flow\.value", r"\[1e-06, 1000\]"),
    (lambda d: d["stages"][0]["efficiency"].update(kind="adiabatic"), r"stages\[0\]\.efficiency\.kind", "isentropic"),
    (lambda d: d["fluid"].update(model="magic"), r"fluid\.model", "real_gas"),
    (lambda d: d.update(colour="red"), r"colour", "unknown key"),
    (lambda d: d["stages"][0]["cooler"].update(fins=3), r"stages\[0\]\.cooler\.fins", "unknown key"),
    (lambda d: d.pop("discharge_pressure_Pa"), r"discharge_pressure_Pa", "required"),
    (lambda d: d.update(discharge_pressure_Pa=float("nan")), r"discharge_pressure_Pa", "expected a number"),
    (lambda d: d.update(discharge_pressure_Pa="8 bar"), r"discharge_pressure_Pa", "expected a number"),
    (lambda d: d.update(discharge_pressure_Pa=90_000.0), r"discharge_pressure_Pa", "above the barometric"),
    # issue 22 item 12: between the stage-1 inlet and the site pressure, isothermal and second-law
    # efficiencies came out negative (−3 and −19 089 in the fuzzing)
    (lambda d: d.update(discharge_pressure_Pa=99_000.0, inlet_pressure_drop_Pa=5000.0), r"discharge_pressure_Pa",
     "above the barometric pressure 100000 Pa"),
])
def test_bad_input_names_field_value_and_range(mutate, field, text):
    doc = make_doc()
    mutate(doc)
    with pytest.raises(InputError, match=field) as info:
        stagewright.core.solve(doc)
    assert info.match(text)


def test_problems_lists_everything_at_once():
    doc = make_doc()
    doc["stages"][0]["efficiency"]["value"] = 2.0
    doc["site"]["ambient_temperature_K"] = 1.0
    fields = {p.field for p in problems(doc)}
    assert fields == {"stages[0].efficiency.value", "site.ambient_temperature_K"}


def test_cooler_outlet_above_inlet_is_refused():
    doc = make_doc(stages=1, p_out=2e5, cool_to=600.0)
    with pytest.raises(InputError, match=r"stages\[0\]\.cooler\.outlet_temperature_K.*above its inlet"):
        stagewright.core.solve(doc)


def test_cooler_outlet_below_heat_sink_is_refused():
    doc = make_doc(stages=1, p_out=4e5, cool_to=280.0, T0=293.15)
    with pytest.raises(InputError, match="below the heat-sink temperature"):
        stagewright.core.solve(doc)


def test_too_small_shaft_power_is_refused():
    doc = make_doc(stages=1, flow=("shaft_power", 100.0))
    doc["stages"][0]["heat_loss_W"] = 500.0
    with pytest.raises(InputError, match="too small to move any air"):
        stagewright.core.solve(doc)


def test_hot_casing_boundary_is_second_law_violation():
    doc = make_doc(stages=1, p_out=2e5)
    doc["stages"][0].update(heat_loss_W=100.0, heat_loss_boundary_temperature_K=900.0)
    with pytest.raises(SecondLawViolation, match="second-law violation"):
        stagewright.core.solve(doc)


def test_state_outside_property_range_is_clear():
    doc = make_doc(stages=1, p_out=3.9e6, eta=0.3, model="real_gas")
    # named by the input, with what would work (issue 22 item 11)
    with pytest.raises(stagewright.core.PropertyRangeError,
                       match=r"^stages\[0\]\.efficiency\.value: 0\.3 — the discharge would be above the property range"):
        stagewright.core.solve(doc)


def test_normalise_fills_defaults():
    norm = normalise(make_doc())
    assert norm["driver"]["efficiency"] == 1.0
    assert norm["stages"][0]["mechanical_efficiency"] == 1.0
    assert norm["fluid"]["model"] == "constant_cp"


def test_casing_loss_that_cools_below_boundary_is_second_law_violation():
    doc = make_doc(stages=1, p_out=1.3e5, flow=("mass", 0.05))
    doc["stages"][0]["heat_loss_W"] = 2000.0
    with pytest.raises(SecondLawViolation, match=r"stages\[0\]\.heat_loss_W.*second-law violation"):
        stagewright.core.solve(doc)


# ---- moist intake air ----------------------------------------------------------------------
import pytest

import stagewright.core
from stagewright.core.project.validation import problems
from stagewright.core.errors import InputError
from tests.conftest import make_doc


def moist(**site):
    doc = make_doc(model="ideal_gas", T0=298.15)
    doc["site"].update(site)
    return doc


@pytest.mark.parametrize("rh", [-0.1, 1.2])
def test_relative_humidity_outside_unit_interval(rh):
    with pytest.raises(InputError, match=r"site\.relative_humidity: .* expected a number in \[0, 1\]"):
        stagewright.core.solve(moist(relative_humidity=rh))


def test_site_dew_point_above_ambient():
    with pytest.raises(InputError, match=r"site\.dew_point_K: 300\.0 — expected at most the ambient temperature 298\.15 K"):
        stagewright.core.solve(moist(dew_point_K=300.0))


def test_two_humidity_inputs_are_refused():
    with pytest.raises(InputError, match=r"site\.dew_point_K: .*give at most one of relative_humidity, dew_point_K"):
        stagewright.core.solve(moist(relative_humidity=0.5, dew_point_K=280.0))


def test_moist_cooler_below_freezing_is_no_input_problem():
    # issue 15: a cooler outlet below 0 °C is a caution of the solve (frozen condensate), not a refusal
    doc = moist(relative_humidity=0.5)
    doc["stages"][0]["cooler"] = {"outlet_temperature_K": 270.0}
    assert problems(doc) == []


def test_dry_cooler_below_freezing_stays_allowed():
    doc = make_doc(model="constant_cp", T0=293.15)
    doc["stages"][0]["cooler"] = {"outlet_temperature_K": 265.0, "coolant_inlet_temperature_K": 263.15}
    assert problems(doc) == []


def test_moist_intake_below_freezing_and_frost_point_input_accepted():
    # issue 15: humid intake down to 223.15 K; a dew point below 0.01 °C is a frost point
    doc = make_doc(model="ideal_gas", T0=268.15, cool_to=290.0)
    doc["site"]["relative_humidity"] = 0.8
    assert problems(doc) == []
    assert problems(moist(dew_point_K=265.0)) == []


def test_moist_real_gas_state_outside_rp1485_range_names_stage_and_range():
    doc = make_doc(model="real_gas", stages=1, eta=0.75, p_out=12e5, T0=298.15)
    doc["site"]["relative_humidity"] = 0.5
    with pytest.raises(InputError, match=r"stages\[0\]\.pressure_ratio: 12\.0 — .*up to 623\.15 K and 1e\+07 Pa .*RP-1485"):
        stagewright.core.solve(doc)


# ---- resolved inputs: the site worked out once at the boundary ---------------------------------

def test_site_pressure_resolves_from_pressure_elevation_or_sea_level():
    from stagewright.core.atmosphere import standard_pressure
    from stagewright.core.project.validation import resolve_site
    doc = make_doc()
    assert resolve_site(normalise(doc)).pressure_Pa == 1e5  # as given, exactly
    doc["site"].pop("barometric_pressure_Pa")
    assert resolve_site(normalise(doc)).pressure_Pa == 101_325.0  # ISO 2533 sea-level pressure
    doc["site"]["elevation_m"] = 1000.0
    # ISO 2533:1975 table: 89 875 Pa at 1000 m (printed to 1 Pa)
    assert resolve_site(normalise(doc)).pressure_Pa == pytest.approx(89_875.0, abs=1.0)
    assert resolve_site(normalise(doc)).pressure_Pa == standard_pressure(1000.0)


@pytest.mark.parametrize("site, humidity", [
    ({}, None),
    ({"relative_humidity": 0.0}, None),
    ({"humidity_ratio": 0.0}, None),
    ({"relative_humidity": 0.4}, ("relative_humidity", 0.4)),
    ({"dew_point_K": 280.0}, ("dew_point_K", 280.0)),
    ({"humidity_ratio": 0.008}, ("humidity_ratio", 0.008)),
])
def test_resolved_site_names_the_one_humidity_input(site, humidity):
    from stagewright.core.project.validation import resolve_site
    doc = make_doc(inlet_pressure_drop_Pa=1500.0)
    doc["site"].update(site)
    resolved = resolve_site(normalise(doc))
    assert resolved.humidity == humidity and resolved.moist == (humidity is not None)
    assert resolved.stage_inlet_pressure_Pa == 1e5 - 1500.0
    assert resolved == resolve_site(normalise(doc)) and hash(resolved) == hash(resolve_site(normalise(doc)))


@pytest.mark.parametrize("site, expected", [
    ({"barometric_pressure_Pa": 95_000}, 95_000.0),
    ({"barometric_pressure_Pa": 95_000.0, "elevation_m": 1000.0}, 95_000.0),  # the measured one first
    ({"barometric_pressure_Pa": -5.0, "elevation_m": 0.0}, 101_325.0),
    ({"barometric_pressure_Pa": "1 bar", "elevation_m": 0.0}, 101_325.0),
    ({"barometric_pressure_Pa": True}, 101_325.0),
    ({"barometric_pressure_Pa": float("inf")}, 101_325.0),
    ({"elevation_m": 20_000.0}, 101_325.0),  # outside the standard atmosphere: the field shows it
    ({"elevation_m": 10 ** 400}, 101_325.0),
    ({}, 101_325.0),
    (None, 101_325.0),
])
def test_barometric_pressure_of_a_document_being_edited(site, expected):
    # the window shows gauge pressures relative to this while the user types: never raises
    from stagewright.core.project.validation import barometric_pressure
    assert barometric_pressure(site) == expected
