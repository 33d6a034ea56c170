"""A project document built in code: typed dataclasses instead of nested SI dicts.

Each class holds the keys of one object of the project document (:mod:`.schema`), SI with the
unit in each name as in the file; a field left ``None`` is not written, so the schema's default
applies (the defaults live in one place, the schema). The few keys the file nests by kind are
flat here: a stage takes exactly one of ``isentropic_efficiency``, ``polytropic_efficiency`` or
``discharge_temperature_K``; a project takes exactly one flow (``free_air_delivery_m3_s``,
``mass_flow_kg_s``, ``normal_volume_m3_s`` or ``shaft_power_W``) and one delivery pressure
(``discharge_pressure_Pa`` absolute or ``discharge_gauge_pressure_Pa``). :meth:`Project.document`
returns the project document and validates it with the loader's own normaliser, so a bad value
is refused with the field path, the value and the valid range, exactly as in a file.

>>> from stagewright.core.project.builder import Cooler, Project, Site, Stage
>>> project = Project(
...     site=Site(ambient_temperature_K=293.15, elevation_m=250.0, relative_humidity=0.6),
...     free_air_delivery_m3_s=0.05, discharge_gauge_pressure_Pa=7.0e5,
...     stages=[Stage(isentropic_efficiency=0.78,
...                   cooler=Cooler(approach_K=10.0, coolant_inlet_temperature_K=293.15))])
>>> doc = project.document()
>>> doc["flow"], doc["stages"][0]["efficiency"]
({'kind': 'free_air_delivery', 'value': 0.05}, {'kind': 'isentropic', 'value': 0.78})
>>> Project(site=Site(ambient_temperature_K=293.15), mass_flow_kg_s=1.0, discharge_pressure_Pa=8e5,
...         stages=[Stage(isentropic_efficiency=1.2)]).document()
Traceback (most recent call last):
...
stagewright.core.errors.InputError: stages[0].efficiency.value: 1.2 — expected a number in [0.001, 1]
"""
from __future__ import annotations

__all__ = ["Site", "Coolant", "Cooler", "Stage", "HeatRecovery", "Month", "Bin", "YearCoolers", "Year",
           "Case", "Project"]

import dataclasses
import copy
from dataclasses import dataclass, field

from stagewright.core.errors import InputError
from stagewright.core.project.schema import FORMAT_NAME, FORMAT_VERSION
from stagewright.core.project.validation import normalise


def _plain(obj) -> dict:
    """The given (not None) fields of a dataclass as document keys, nested objects as dicts."""
    out = {}
    for f in dataclasses.fields(obj):
        value = getattr(obj, f.name)
        if value is None:
            continue
        if dataclasses.is_dataclass(value):
            value = _plain(value)
        elif isinstance(value, (list, tuple)):
            value = [_plain(v) if dataclasses.is_dataclass(v) else v for v in value]
        out[f.name] = value
    return out


def _exactly_one(where: str, given: dict) -> tuple[str, object]:
    """The one (name, value) of ``given`` that is not None; InputError naming ``where`` otherwise."""
    named = [(k, v) for k, v in given.items() if v is not None]
    if len(named) != 1:
        stated = ", ".join(k for k, _ in named) or "none"
        raise InputError(where, stated, "expected exactly one of " + ", ".join(given))
    return named[0]


@dataclass
class Site:
    """The site: ambient temperature, site pressure (given, or from the elevation, else sea
    level) and at most one humidity input (``site`` in the document)."""

    ambient_temperature_K: float
    barometric_pressure_Pa: float | None = None
    elevation_m: float | None = None
    relative_humidity: float | None = None
    dew_point_K: float | None = None
    humidity_ratio: float | None = None


@dataclass
class Coolant:
    """A cooler's coolant: ``kind`` (water, glycol, air) and its flow or its temperature rise."""

    kind: str
    flow_kg_s: float | None = None
    temperature_rise_K: float | None = None
    glycol: str | None = None
    glycol_fraction: float | None = None


@dataclass
class Cooler:
    """An intercooler or aftercooler: one of ``outlet_temperature_K``, ``approach_K`` (to the
    coolant inlet temperature) or ``ua_W_K``."""

    outlet_temperature_K: float | None = None
    approach_K: float | None = None
    ua_W_K: float | None = None
    arrangement: str | None = None
    coolant: Coolant | None = None
    coolant_inlet_temperature_K: float | None = None
    pressure_drop_Pa: float | None = None
    separator_efficiency: float | None = None


@dataclass
class Stage:
    """One compression stage and the cooler after it (``None``: no cooler).

    Exactly one of ``isentropic_efficiency``, ``polytropic_efficiency`` [-] or
    ``discharge_temperature_K`` (a measured discharge temperature) states how well it compresses.
    """

    isentropic_efficiency: float | None = None
    polytropic_efficiency: float | None = None
    discharge_temperature_K: float | None = None
    name: str | None = None
    pressure_ratio: float | None = None
    mechanical_efficiency: float | None = None
    heat_loss_W: float | None = None
    heat_loss_boundary_temperature_K: float | None = None
    exit_velocity_m_s: float | None = None
    max_discharge_temperature_K: float | None = None
    min_pressure_ratio: float | None = None
    max_pressure_ratio: float | None = None
    cooler: Cooler | None = None

    _EFFICIENCY = {"isentropic_efficiency": ("isentropic", "value"),
                   "polytropic_efficiency": ("polytropic", "value"),
                   "discharge_temperature_K": ("discharge_temperature", "value_K")}

    def to_dict(self, where: str = "stages[0]") -> dict:
        """This stage as a document object; ``where`` is its field path (for errors)."""
        name, value = _exactly_one(f"{where}.efficiency", {k: getattr(self, k) for k in self._EFFICIENCY})
        kind, key = self._EFFICIENCY[name]
        out = {"efficiency": {"kind": kind, key: value}}
        out.update({k: v for k, v in _plain(self).items() if k not in self._EFFICIENCY})
        return out


@dataclass
class HeatRecovery:
    """Heat recovered from the coolers and casings (``heat_recovery``)."""

    delivery_temperature_K: float
    approach_K: float | None = None
    casing_share: float | None = None
    fuel_price_per_kWh: float | None = None
    boiler_efficiency: float | None = None
    operating_hours_per_year: float | None = None


@dataclass
class Month:
    """One month of a monthly year profile (a profile has twelve, January to December)."""

    temperature_K: float
    relative_humidity: float
    hours: float | None = None
    load: float | None = None
    coolant_inlet_temperature_K: float | None = None


@dataclass
class Bin:
    """One bin of a binned year profile: an ambient condition and its hours."""

    temperature_K: float
    relative_humidity: float
    hours: float
    label: str | None = None
    load: float | None = None
    coolant_inlet_temperature_K: float | None = None


@dataclass
class YearCoolers:
    """How a year treats the coolers: sized in every bin, or once and rated (``year.coolers``)."""

    mode: str | None = None
    design_condition: str | None = None
    ua_margin: float | None = None
    max_dryer_inlet_temperature_K: float | None = None


@dataclass
class Year:
    """A year at the site: exactly one of ``months`` (twelve) or ``bins``, plus hours, load
    and prices (``year``)."""

    months: list[Month] | None = None
    bins: list[Bin] | None = None
    operating_hours_per_year: float | None = None
    load: float | None = None
    energy_price_per_kWh: float | None = None
    water_price_per_m3: float | None = None
    coolers: YearCoolers | None = None

    def to_dict(self) -> dict:
        kind, entries = _exactly_one("year.profile", {"months": self.months, "bins": self.bins})
        out = {"profile": {"kind": "monthly" if kind == "months" else "bins",
                           kind: [_plain(e) for e in entries]}}
        out.update({k: v for k, v in _plain(self).items() if k not in ("months", "bins")})
        return out


@dataclass
class Case:
    """A named case: the base design with the fields at ``changes`` (field path → value) changed."""

    name: str
    changes: dict = field(default_factory=dict)
    note: str | None = None


_FLOWS = {"free_air_delivery_m3_s": "free_air_delivery", "mass_flow_kg_s": "mass",
          "normal_volume_m3_s": "normal_volume", "shaft_power_W": "shaft_power"}
_PRESSURES = ("discharge_pressure_Pa", "discharge_gauge_pressure_Pa")
_FLUID = {"model": "model", "cp_J_kgK": "cp_J_kgK", "k": "k"}
_TOP = ("title", "note", "inlet_pressure_drop_Pa", "heat_recovery", "base_name")


@dataclass
class Project:
    """A whole project. ``model`` is the air property model (``real_gas``, ``ideal_gas`` or
    ``constant_cp`` with ``cp_J_kgK`` and ``k``); ``driver_efficiency`` the motor's."""

    site: Site
    stages: list[Stage]
    free_air_delivery_m3_s: float | None = None
    mass_flow_kg_s: float | None = None
    normal_volume_m3_s: float | None = None
    shaft_power_W: float | None = None
    discharge_pressure_Pa: float | None = None
    discharge_gauge_pressure_Pa: float | None = None
    model: str | None = None
    cp_J_kgK: float | None = None
    k: float | None = None
    driver_efficiency: float | None = None
    inlet_pressure_drop_Pa: float | None = None
    title: str | None = None
    note: str | None = None
    heat_recovery: HeatRecovery | None = None
    year: Year | None = None
    #: the ``package`` section (capacity control, motor, auxiliaries) as plain data, SI, as
    #: ``docs/project-format.md`` gives it
    package: dict | None = None
    base_name: str | None = None
    cases: list[Case] = field(default_factory=list)

    def to_dict(self) -> dict:
        """The project document, not yet validated (:meth:`document` validates it)."""
        flow, value = _exactly_one("flow", {name: getattr(self, name) for name in _FLOWS})
        pressure, p = _exactly_one("discharge_pressure_Pa", {name: getattr(self, name) for name in _PRESSURES})
        doc = {"format": FORMAT_NAME, "version": FORMAT_VERSION}
        plain = _plain(self)
        doc.update({k: plain[k] for k in ("title", "note") if k in plain})
        doc["site"] = _plain(self.site)
        fluid = {key: plain[name] for name, key in _FLUID.items() if name in plain}
        if fluid:
            doc["fluid"] = fluid
        doc["flow"] = {"kind": _FLOWS[flow], "value": value}
        doc.update({k: plain[k] for k in ("inlet_pressure_drop_Pa",) if k in plain})
        doc[pressure] = p
        if self.driver_efficiency is not None:
            doc["driver"] = {"efficiency": self.driver_efficiency}
        doc["stages"] = [s.to_dict(f"stages[{i}]") for i, s in enumerate(self.stages)]
        doc.update({k: plain[k] for k in ("heat_recovery", "base_name") if k in plain})
        if self.year is not None:
            doc["year"] = self.year.to_dict()
        if self.package is not None:
            doc["package"] = copy.deepcopy(self.package)
        if self.cases:
            doc["cases"] = plain["cases"]
        return doc

    def document(self) -> dict:
        """The project document (what a project file holds), checked by the loader's normaliser.

        Raises
        ------
        InputError
            Naming the field path, the value and the valid range of the first problem.
        """
        doc = self.to_dict()
        normalise(doc)
        return doc
