"""The project builder (stagewright.core.project.builder): typed dataclasses give the same
document as the file, refuse what the loader refuses, and keep up with the schema.

No physical value is checked here: the built documents are compared with the sample projects
(invented scenarios) through the loader's own normaliser."""
from __future__ import annotations

import dataclasses
import json

import pytest

from stagewright.core.errors import InputError
from stagewright.core.project import schema
from stagewright.core.project.builder import (Bin, Case, Coolant, Cooler, HeatRecovery, Month, Project, Site, Stage,
                                              Year, YearCoolers)
from stagewright.core.project.validation import normalise
from tests.conftest import SAMPLES


def plant_air() -> Project:
    """sample_projects/two_stage_plant_air.json, built in code."""
    def stage(name, eta, v, approach, dp):
        return Stage(name=name, isentropic_efficiency=eta, mechanical_efficiency=0.985, heat_loss_W=1500.0,
                     exit_velocity_m_s=v, max_discharge_temperature_K=473.15,
                     cooler=Cooler(approach_K=approach, coolant_inlet_temperature_K=295.15, pressure_drop_Pa=dp))
    return Project(site=Site(ambient_temperature_K=298.15, elevation_m=120.0, relative_humidity=0.65),
                   model="real_gas", free_air_delivery_m3_s=0.3, inlet_pressure_drop_Pa=1500.0,
                   discharge_pressure_Pa=949900.0, driver_efficiency=0.955,
                   stages=[stage("LP stage", 0.82, 0.0, 8.0, 12000.0), stage("HP stage", 0.8, 25.0, 10.0, 15000.0)])


def test_builds_the_same_project_as_the_sample_file():
    sample = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    built = plant_air()
    built.title, built.note = sample["title"], sample["note"]
    built.package = sample["package"]  # the package section is given as plain data (no typed builder)
    assert built.document() == sample
    assert normalise(built.document()) == normalise(sample)


def test_a_year_a_coolant_heat_recovery_and_cases_reach_the_document():
    p = plant_air()
    p.stages[0].cooler.coolant = Coolant(kind="water", temperature_rise_K=8.0)
    p.heat_recovery = HeatRecovery(delivery_temperature_K=333.15)
    p.year = Year(months=[Month(temperature_K=275.15, relative_humidity=0.8)]
                  + [Month(temperature_K=295.15, relative_humidity=0.6)] * 11,
                  energy_price_per_kWh=0.2, coolers=YearCoolers(mode="design_once"))
    p.cases = [Case("Hot day", {"site.ambient_temperature_K": 308.15}, note="a heat wave")]
    doc = p.document()
    assert doc["stages"][0]["cooler"]["coolant"] == {"kind": "water", "temperature_rise_K": 8.0}
    assert doc["year"]["profile"] == {"kind": "monthly", "months": [
        {"temperature_K": 275.15, "relative_humidity": 0.8}]
        + [{"temperature_K": 295.15, "relative_humidity": 0.6}] * 11}
    assert doc["year"]["coolers"] == {"mode": "design_once"} and doc["year"]["energy_price_per_kWh"] == 0.2
    assert doc["cases"] == [{"name": "Hot day", "changes": {"site.ambient_temperature_K": 308.15},
                             "note": "a heat wave"}]
    assert doc["heat_recovery"] == {"delivery_temperature_K": 333.15}
    p.year = Year(bins=[Bin(temperature_K=280.0, relative_humidity=0.7, hours=4000.0, label="cool")])
    assert p.document()["year"]["profile"]["kind"] == "bins"


@pytest.mark.parametrize("change, field", [
    (dict(mass_flow_kg_s=1.0), "flow"),                             # two flows
    (dict(free_air_delivery_m3_s=None), "flow"),                    # none
    (dict(discharge_gauge_pressure_Pa=8e5), "discharge_pressure_Pa"),  # absolute and gauge
])
def test_exactly_one_flow_and_one_delivery_pressure(change, field):
    p = dataclasses.replace(plant_air(), **change)
    with pytest.raises(InputError) as err:
        p.document()
    assert err.value.field == field and "exactly one" in str(err.value)


def test_a_stage_with_two_efficiencies_is_refused_with_its_path():
    p = plant_air()
    p.stages[1].polytropic_efficiency = 0.8
    with pytest.raises(InputError) as err:
        p.document()
    assert err.value.field == "stages[1].efficiency"
    assert "isentropic_efficiency, polytropic_efficiency" in str(err.value)


def test_out_of_range_values_are_refused_by_the_loaders_normaliser():
    p = plant_air()
    p.site.relative_humidity = 1.5
    with pytest.raises(InputError) as err:
        p.document()
    assert err.value.field == "site.relative_humidity" and "1.5" in str(err.value)


FLATTENED = {"isentropic_efficiency", "polytropic_efficiency", "discharge_temperature_K",  # stage efficiency
             "free_air_delivery_m3_s", "mass_flow_kg_s", "normal_volume_m3_s", "shaft_power_W",  # project flow
             "model", "cp_J_kgK", "k", "driver_efficiency", "months", "bins"}


@pytest.mark.parametrize("cls, obj", [
    (Site, schema.PROJECT.fields["site"]), (Coolant, schema.COOLANT), (Cooler, schema.COOLER),
    (Stage, schema.STAGE), (HeatRecovery, schema.HEAT_RECOVERY), (YearCoolers, schema.YEAR_COOLERS),
    (Year, schema.YEAR), (Case, schema.CASE), (Project, schema.PROJECT),
    (Month, schema.YEAR.fields["profile"].variants["monthly"]["months"].item),
    (Bin, schema.YEAR.fields["profile"].variants["bins"]["bins"].item),
])
def test_the_builder_keeps_up_with_the_schema(cls, obj):
    """Every key of the schema object is a builder field (or one flattened into it), and no
    builder field is a key the schema does not have; so a key added to the schema fails here."""
    fields = {f.name for f in dataclasses.fields(cls)}
    keys = set(obj.fields)
    left_out = {"format", "version", "fluid", "flow", "driver", "field_check", "snapshot", "efficiency",
                "profile"}  # written by the builder itself, or not built (field check, snapshot)
    assert keys - fields - left_out == set()
    assert fields - keys - FLATTENED == set()
