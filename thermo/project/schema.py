"""The project document, version 3: every key, its unit, range and default.

This table is the single source of truth for what a project may contain. The solver,
the project-file loader, the window's entry fields and ``docs/project-format.md`` all
follow it. Keys carry SI units in their names.
"""
from __future__ import annotations

__all__ = ["FORMAT_NAME", "FORMAT_VERSION", "PROJECT", "STAGE", "COOLER", "EFFICIENCY",
           "FLOW_KINDS", "MODEL_NAMES", "COOLANT", "COOLANT_KINDS", "ARRANGEMENT_NAMES",
           "HEAT_RECOVERY", "YEAR", "YEAR_COOLERS", "CASE", "SNAPSHOT", "FIELD_CHECK", "CONTROL_KINDS", "PACKAGE"]

from stagewright.core.project.case_changes import CHANGEABLE_KEYS
from stagewright.core.project.schema_types import Changes, Choice, Items, Num, Obj, Raw, Text, Variant

FORMAT_NAME = "stagewright-project"
FORMAT_VERSION = 3  #: 2: the delivery pressure may be stated gauge; 3: cases and a results snapshot
FLOW_KINDS = ("mass", "free_air_delivery", "normal_volume", "shaft_power")
MODEL_NAMES = ("real_gas", "ideal_gas", "constant_cp")

_TEMPERATURE = dict(lo=200.0, hi=1300.0, unit="K")
#: an efficiency [-]: the smallest the stage and path solvers can compute is 0.001
_EFFICIENCY_RANGE = dict(lo=1e-3, hi=1.0)
#: a flow value, per flow kind, from the smallest the solver can compute
_FLOW_MIN = {"mass": 1e-6, "free_air_delivery": 1e-6, "normal_volume": 1e-6, "shaft_power": 1.0}

EFFICIENCY = Variant(required=True, variants={
    "isentropic": {"value": Num(**_EFFICIENCY_RANGE, required=True)},
    "polytropic": {"value": Num(**_EFFICIENCY_RANGE, required=True)},
    "discharge_temperature": {"value_K": Num(required=True, **_TEMPERATURE)},
})

COOLANT_KINDS = ("water", "glycol", "air")
#: exchanger arrangements (stagewright.core.exchanger.effectiveness.ARRANGEMENTS holds their relations)
ARRANGEMENT_NAMES = ("counter_flow", "cross_flow_unmixed", "cross_flow_hot_mixed", "shell_and_tube_1_2")

#: the coolant side of a cooler: kind, and either its flow or its temperature rise
COOLANT = Obj(nullable=True, default=None, one_of=(("flow_kg_s", "temperature_rise_K"),), fields={
    "kind": Choice(COOLANT_KINDS, required=True),
    "glycol": Choice(("ethylene", "propylene"), default="ethylene"),
    "glycol_fraction": Num(0.0, 0.6, nullable=True, default=None),
    "flow_kg_s": Num(0.0, 1.0e5, unit="kg/s", lo_open=True, nullable=True),
    "temperature_rise_K": Num(0.0, 150.0, unit="K", lo_open=True, nullable=True),
})

COOLER = Obj(nullable=True, default=None, one_of=(("outlet_temperature_K", "approach_K", "ua_W_K"),), fields={
    "outlet_temperature_K": Num(nullable=True, **_TEMPERATURE),
    "approach_K": Num(0.0, 200.0, unit="K", nullable=True),
    "ua_W_K": Num(0.0, 1.0e9, unit="W/K", lo_open=True, nullable=True),
    "arrangement": Choice(ARRANGEMENT_NAMES, default="counter_flow"),
    "coolant": COOLANT,
    "coolant_inlet_temperature_K": Num(263.15, 373.15, unit="K", nullable=True, default=None),
    "pressure_drop_Pa": Num(0.0, 5.0e6, unit="Pa", default=0.0),
    "separator_efficiency": Num(0.0, 1.0, default=1.0),
})

STAGE = Obj(fields={
    "name": Text(default=""),
    "pressure_ratio": Num(1.0, 40.0, lo_open=True, nullable=True, default=None),
    "efficiency": EFFICIENCY,
    "mechanical_efficiency": Num(**_EFFICIENCY_RANGE, default=1.0),
    "heat_loss_W": Num(0.0, 1.0e8, unit="W", default=0.0),
    "heat_loss_boundary_temperature_K": Num(nullable=True, default=None, **_TEMPERATURE),
    "exit_velocity_m_s": Num(0.0, 340.0, unit="m/s", default=0.0),
    "max_discharge_temperature_K": Num(250.0, 1300.0, unit="K", nullable=True, default=None),
    "min_pressure_ratio": Num(1.0, 40.0, nullable=True, default=None),
    "max_pressure_ratio": Num(1.0, 40.0, lo_open=True, nullable=True, default=None),
    "cooler": COOLER,
})

#: heat recovery from the coolers and casings (optional)
HEAT_RECOVERY = Obj(nullable=True, default=None, fields={
    "delivery_temperature_K": Num(283.15, 423.15, unit="K", required=True),
    "approach_K": Num(0.0, 100.0, unit="K", default=5.0),
    "casing_share": Num(0.0, 1.0, default=0.0),
    "fuel_price_per_kWh": Num(0.0, 100.0, unit="money/kWh", default=0.0),
    "boiler_efficiency": Num(0.0, 1.2, lo_open=True, default=0.9),
    "operating_hours_per_year": Num(0.0, 8784.0, unit="h", nullable=True, default=None),
})

_AMBIENT_ENTRY = {
    "temperature_K": Num(223.15, 333.15, unit="K", required=True),
    "relative_humidity": Num(0.0, 1.0, required=True),
    "load": Num(0.0, 1.0, lo_open=True, nullable=True, default=None),
    "coolant_inlet_temperature_K": Num(263.15, 373.15, unit="K", nullable=True, default=None),
}

#: how a year treats the coolers: sized afresh in every bin, or sized once and rated at fixed UA
#: (stagewright.core.year_design; the default margin 0.10 is common practice, no source)
YEAR_COOLERS = Obj(default={"mode": "size_every_bin"}, fields={
    "mode": Choice(("size_every_bin", "design_once"), default="size_every_bin"),
    "design_condition": Choice(("site", "hottest_bin"), default="site"),
    "ua_margin": Num(0.0, 1.0, default=0.10),
    "max_dryer_inlet_temperature_K": Num(223.15, 373.15, unit="K", nullable=True, default=None),
})

#: a year at the site: ambient profile, operating hours, load and prices (optional)
YEAR = Obj(nullable=True, default=None, fields={
    "profile": Variant(required=True, variants={
        "monthly": {"months": Items(Obj(fields={**_AMBIENT_ENTRY,
                                                "hours": Num(0.0, 744.0, unit="h", nullable=True, default=None)}),
                                    min_length=1, max_length=12, required=True)},
        "bins": {"bins": Items(Obj(fields={**_AMBIENT_ENTRY, "label": Text(default="", max_length=80),
                                           "hours": Num(0.0, 8784.0, unit="h", lo_open=True, required=True)}),
                               min_length=1, max_length=8784, required=True)},
    }),
    "operating_hours_per_year": Num(0.0, 8784.0, unit="h", lo_open=True, nullable=True, default=None),
    "load": Num(0.0, 1.0, lo_open=True, default=1.0),
    "energy_price_per_kWh": Num(0.0, 100.0, unit="money/kWh", default=0.0),
    "water_price_per_m3": Num(0.0, 1000.0, unit="money/m³", default=0.0),
    "coolers": YEAR_COOLERS,
})

#: capacity control of the package (stagewright.core.part_load). A receiver and pressure band set the
#: cycles of the controls that stop delivering air (ideal gas, isothermal receiver). Defaults
#: without a published source are marked in thermo/part_load/defaults.py.
_STORAGE = {
    # floors: 0.1 L and 100 Pa, far below any real receiver, keep the cycle times computable
    "receiver_volume_m3": Num(1.0e-4, 1.0e4, unit="m³", required=True),
    "pressure_band_Pa": Num(100.0, 2.0e6, unit="Pa", default=50_000.0),
    "unloaded_power_fraction": Num(0.0, 1.0, default=0.25),
    "blowdown_time_s": Num(0.0, 3600.0, unit="s", default=40.0),
}
CONTROL_KINDS = ("load_unload", "modulation", "variable_speed", "start_stop", "measured_curve")
_CURVE_POINT = Obj(fields={"flow_fraction": Num(0.0, 1.0, required=True),
                           "power_fraction": Num(0.0, 2.0, required=True)})
CONTROL = Variant(required=True, variants={
    "load_unload": dict(_STORAGE),
    "modulation": {"zero_flow_power_fraction": Num(0.0, 1.0, default=0.70)},
    "variable_speed": {**_STORAGE, "min_speed_fraction": Num(0.05, 1.0, default=0.30),
                       "specific_power_rise_at_min_speed": Num(0.0, 1.0, default=0.10),
                       "drive_efficiency": Num(0.5, 1.0, default=0.97),
                       "drive_fixed_loss_share": Num(0.0, 1.0, default=0.50)},
    "start_stop": {**_STORAGE, "max_starts_per_hour": Num(0.0, 120.0, lo_open=True, default=6.0)},
    "measured_curve": {"points": Items(_CURVE_POINT, min_length=2, max_length=50, required=True)},
})

#: the whole package: capacity control, the motor at part load, auxiliaries, a load profile
PACKAGE = Obj(nullable=True, default=None, fields={
    "control": CONTROL,
    "motor": Obj(default={}, fields={
        "rated_output_W": Num(0.0, 1.0e9, unit="W", lo_open=True, nullable=True, default=None),
        "fixed_loss_share": Num(0.0, 1.0, default=0.35),
        "efficiency_points": Items(Obj(fields={"load_fraction": Num(0.0, 1.5, lo_open=True, required=True),
                                               "efficiency": Num(0.01, 1.0, required=True)}),
                                   max_length=20, default=[]),
    }),
    "fan_power_W": Num(0.0, 1.0e7, unit="W", default=0.0),
    "pump": Obj(nullable=True, default=None, fields={
        "head_m": Num(0.0, 500.0, unit="m", lo_open=True, required=True),
        "efficiency": Num(0.05, 1.0, default=0.70),
    }),
    "other_loads": Items(Obj(fields={"name": Text(required=True, max_length=80),
                                     "power_W": Num(0.0, 1.0e8, unit="W", required=True)}),
                         max_length=20, default=[]),
    "load": Num(0.0, 1.0, lo_open=True, default=1.0),
    "part_loads": Items(Num(0.0, 1.0, lo_open=True), min_length=1, max_length=10,
                        default=[1.0, 0.75, 0.5, 0.25]),
    "load_profile": Items(Obj(fields={"load": Num(0.0, 1.0, required=True),
                                      "hours": Num(0.0, 8784.0, unit="h", lo_open=True, required=True)}),
                          max_length=100, default=[]),
})

#: a named case: the base design with some fields changed (stagewright.core.project.case_changes)
CASE = Obj(fields={
    "name": Text(required=True, max_length=80),
    "note": Text(default="", max_length=1000),
    "changes": Changes(roots=CHANGEABLE_KEYS, required=True),
})

#: the results as last saved, with the versions that computed them (stagewright.core.cases.snapshot)
SNAPSHOT = Obj(nullable=True, default=None, fields={
    "stagewright_version": Text(required=True, max_length=40),
    "coolprop_version": Text(required=True, max_length=40),
    "saved_utc": Text(default="", max_length=40),
    "results": Raw(required=True),
})

#: a field check's measurement uncertainties and guaranteed figures (stagewright.core.uncertainty); optional.
#: Each uncertainty names a measured input by its field path and is in that input's SI unit.
_NAMED_INPUT = {"input": Text(required=True, max_length=200)}
_GUARANTEED = {"figure": Text(required=True, max_length=200),
               "value": Num(0.0, 1.0e12, lo_open=True, required=True),
               "limit": Choice(("both", "at_least", "at_most"), default="both")}
FIELD_CHECK = Obj(nullable=True, default=None, fields={
    "uncertainties": Items(Variant(variants={
        "standard": {**_NAMED_INPUT, "standard_uncertainty": Num(0.0, 1.0e9, 
                                                                 lo_open=True, required=True)},
        "limits": {**_NAMED_INPUT, "half_width": Num(0.0, 1.0e9, lo_open=True,
                                                     required=True)},
        "accuracy_class": {**_NAMED_INPUT, "class_percent": Num(0.0, 100.0, lo_open=True, required=True),
                           "full_scale": Num(0.0, 1.0e10, lo_open=True, nullable=True,
                                             default=None)},
    }), max_length=200),
    "guarantees": Items(Variant(variants={
        "relative": {**_GUARANTEED, "tolerance": Num(0.0, 1.0, lo_open=True, required=True)},
        "absolute": {**_GUARANTEED, "tolerance": Num(0.0, 1.0e12, lo_open=True,
                                                     required=True)},
        "iso1217_annex_c": dict(_GUARANTEED),
    }), max_length=50),
    "monte_carlo_draws": Num(100, 1_000_000, integer=True, default=10_000),
    "seed": Num(0, 2**32 - 1, integer=True, default=1),
})

#: the delivery pressure: stated absolute or gauge (stagewright.core.project.delivery), exactly one
PROJECT = Obj(one_of=(("discharge_pressure_Pa", "discharge_gauge_pressure_Pa"),), fields={
    "format": Choice((FORMAT_NAME,), default=FORMAT_NAME),
    "version": Num(1, FORMAT_VERSION, integer=True, default=FORMAT_VERSION),
    "title": Text(default="", max_length=200),
    "note": Text(default=""),
    "site": Obj(required=True, fields={
        "ambient_temperature_K": Num(223.15, 333.15, unit="K", required=True),
        "barometric_pressure_Pa": Num(50_000.0, 110_000.0, unit="Pa", nullable=True, default=None),
        "elevation_m": Num(-500.0, 5000.0, unit="m", nullable=True, default=None),
        "relative_humidity": Num(0.0, 1.0, default=0.0),
        # moist intake: give at most one of relative_humidity, dew_point_K, humidity_ratio
        "dew_point_K": Num(173.15, 333.15, unit="K", nullable=True, default=None),
        "humidity_ratio": Num(0.0, 0.2, nullable=True, default=None),  # kg water per kg dry air
    }),
    "fluid": Obj(default={"model": "real_gas"}, fields={
        "model": Choice(MODEL_NAMES, default="real_gas"),
        "cp_J_kgK": Num(500.0, 5000.0, unit="J/(kg K)", default=1005.0),
        "k": Num(1.001, 1.7, default=1.4),  # a gas with k closer to 1 cannot be computed
    }),
    "flow": Variant(required=True, variants={
        "mass": {"value": Num(_FLOW_MIN["mass"], 1000.0, unit="kg/s", required=True)},
        "free_air_delivery": {"value": Num(_FLOW_MIN["free_air_delivery"], 1000.0, unit="m³/s", required=True)},
        "normal_volume": {"value": Num(_FLOW_MIN["normal_volume"], 1000.0, unit="m³/s", required=True)},
        "shaft_power": {"value": Num(_FLOW_MIN["shaft_power"], 1.0e9, unit="W", required=True)},
    }),
    "inlet_pressure_drop_Pa": Num(0.0, 50_000.0, unit="Pa", default=0.0),
    "discharge_pressure_Pa": Num(50_000.0, 5.0e7, unit="Pa"),
    "discharge_gauge_pressure_Pa": Num(0.0, 5.0e7, unit="Pa", lo_open=True),
    "driver": Obj(default={"efficiency": 1.0}, fields={
        "efficiency": Num(**_EFFICIENCY_RANGE, default=1.0),
    }),
    "stages": Items(STAGE, min_length=1, max_length=12, required=True),
    "heat_recovery": HEAT_RECOVERY,
    "year": YEAR,
    "field_check": FIELD_CHECK,
    "package": PACKAGE,
    # version 3: options as cases of one project (stagewright.core.project.cases) and the results last saved
    "base_name": Text(default="Base", max_length=80),
    "cases": Items(CASE, max_length=50, default=[]),
    "snapshot": SNAPSHOT,
})
