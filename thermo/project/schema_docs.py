"""What every key of the project document and of the results means, and the key tables
of ``docs/project-format.md`` generated from :mod:`stagewright.core.project.schema`.

Type, unit, range and default of each project key come from the schema itself; this
module adds only the meaning, keyed by the schema path (:func:`stagewright.core.project.schema_types.walk`).
The tests check that every schema key has a meaning here, that no meaning is left for
a key that no longer exists, that every key ``solve(doc).to_dict()`` produces is
described, and that the tables in the document are the ones this module generates.
After changing the schema or the results, run::

    python -m stagewright.core.project.schema_docs --write

which rewrites the generated parts of ``docs/project-format.md`` (between the
``BEGIN``/``END`` markers) and leaves the hand-written text alone.
"""
from __future__ import annotations

__all__ = ["PROJECT_KEYS", "RESULT_KEYS", "project_key_table", "result_key_table",
           "result_paths", "unit_of", "render", "update_document"]

import math
import re
import sys
from pathlib import Path

from stagewright.core.project.schema import PROJECT
from stagewright.core.project.schema_types import MISSING, Changes, Choice, Items, Num, Obj, Raw, Text, Variant, walk

#: schema path → meaning
PROJECT_KEYS = {
    "format": "Marks the file as a Stagewright project. Always `\"stagewright-project\"`.",
    "version": "Project format version the file is written in (see *Versions* below). "
               "A missing version means version 1.",
    "title": "Short name of the project, shown in the window title and on reports.",
    "note": "Free text: what the project shows, where the numbers came from.",
    "site": "Where the machine stands: the ambient air it draws in.",
    "site.ambient_temperature_K": "Temperature of the ambient air at the intake; also the "
                                  "dead-state temperature T0 for exergy.",
    "site.barometric_pressure_Pa": "Barometric (absolute) pressure at the site. Give this "
                                   "or `elevation_m`, not both; with neither, 101 325 Pa.",
    "site.elevation_m": "Site elevation; the barometric pressure then follows the ISO 2533 "
                        "standard atmosphere.",
    "site.relative_humidity": "Relative humidity of the ambient air, as a fraction (0.6 = 60 %). As "
                              "meteorological data give it: relative to liquid water, also below 0 °C "
                              "(WMO-No. 8; supercooled water after Murphy & Koop 2005). Below 0 °C air "
                              "above saturation over ice deposits the excess as rime on the intake (a caution).",
    "site.dew_point_K": "Dew point of the ambient air at the site pressure, instead of relative_humidity "
                        "(at most one humidity key; not above ambient). Below 0.01 °C it is the frost point, over ice "
                        "(IAPWS 2011); convert a meteorological dew point over supercooled water to relative_humidity.",
    "site.humidity_ratio": "Water vapour per dry air of the ambient air, kg/kg, instead of relative_humidity "
                           "(at most one humidity key; at most saturation).",
    "fluid": "How the properties of air are computed.",
    "fluid.model": "`real_gas`: Lemmon et al. (2000) equation of state via CoolProp; "
                   "`ideal_gas`: the same equation's ideal-gas part (cp varies with T); "
                   "`constant_cp`: perfect gas with `cp_J_kgK` and `k`.",
    "fluid.cp_J_kgK": "Specific heat at constant pressure; used by `constant_cp` only.",
    "fluid.k": "Ratio of specific heats cp/cv; used by `constant_cp` only.",
    "flow": "The flow the train must deliver, or the shaft power it takes (then the flow is found).",
    "flow.kind": "How `value` is given: `mass`, `free_air_delivery`, `normal_volume` or `shaft_power`.",
    "flow{mass}.value": "Mass flow of air.",
    "flow{free_air_delivery}.value": "Free air delivery: the delivered flow expressed at the "
                                     "site ambient temperature and barometric pressure (ISO 1217).",
    "flow{normal_volume}.value": "Volume flow at the DIN 1343 normal state, 273.15 K and 101 325 Pa.",
    "flow{shaft_power}.value": "Total shaft power of the train (a field check: the solver finds the "
                               "mass flow). A measured motor input power times the motor efficiency "
                               "gives this value.",
    "inlet_pressure_drop_Pa": "Pressure drop of the intake filter and silencer before stage 1.",
    "discharge_pressure_Pa": "Absolute pressure wanted after the last cooler (or after the last "
                             "stage when it has no cooler). Give this or `discharge_gauge_pressure_Pa`, "
                             "exactly one.",
    "discharge_gauge_pressure_Pa": "The same delivery pressure stated gauge: above the site's barometric "
                                   "pressure (given, or from the elevation). The statement is kept when "
                                   "the site changes; the absolute pressure follows the site (since "
                                   "version 2).",
    "driver": "The motor (or other driver) and its efficiency.",
    "driver.efficiency": "Driver efficiency: shaft power ÷ driver input power.",
    "stages": "The stages in flow order, 1 to 12.",
    "stages[]": "One stage, optionally followed by its cooler.",
    "stages[].name": "Label of the stage in tables and charts.",
    "stages[].pressure_ratio": "Discharge ÷ inlet pressure of this stage. Leave out (or null) to "
                               "have it found: stages without a ratio share one ratio so that "
                               "the discharge pressure is met exactly.",
    "stages[].efficiency": "How well the stage compresses: one of the three kinds below.",
    "stages[].efficiency.kind": "`isentropic`, `polytropic`, or `discharge_temperature` (measured).",
    "stages[].efficiency{isentropic}.value": "Isentropic (adiabatic) efficiency of the internal compression.",
    "stages[].efficiency{polytropic}.value": "Polytropic efficiency of the internal compression.",
    "stages[].efficiency{discharge_temperature}.value_K": "Measured discharge temperature; the "
                                                          "efficiency follows from it.",
    "stages[].mechanical_efficiency": "Gas power ÷ shaft power (bearings, gears, seals).",
    "stages[].heat_loss_W": "Heat lost through the casing during compression.",
    "stages[].heat_loss_boundary_temperature_K": "Temperature at which the casing heat leaves; "
                                                 "null means the ambient temperature.",
    "stages[].exit_velocity_m_s": "Air velocity at the stage discharge (its kinetic energy is counted).",
    "stages[].max_discharge_temperature_K": "Discharge temperature limit of the machine; exceeding "
                                            "it gives a warning in the result.",
    "stages[].min_pressure_ratio": "Lowest pressure ratio this stage may be given (staging studies).",
    "stages[].max_pressure_ratio": "Highest pressure ratio this stage may be given (staging studies).",
    "stages[].cooler": "The cooler after this stage (an intercooler, or the aftercooler after the "
                       "last stage), or null for none. Give `outlet_temperature_K` or `approach_K`.",
    "stages[].cooler.outlet_temperature_K": "Air temperature at the cooler outlet.",
    "stages[].cooler.approach_K": "Air outlet temperature minus coolant inlet temperature; needs "
                                  "`coolant_inlet_temperature_K`.",
    "stages[].cooler.coolant_inlet_temperature_K": "Inlet temperature of the cooling water or air; "
                                                   "the rejected heat crosses the boundary at this "
                                                   "temperature (null: ambient).",
    "stages[].cooler.pressure_drop_Pa": "Air-side pressure drop of the cooler.",
    "stages[].cooler.separator_efficiency": "Fraction of the condensed water the cooler's "
                                            "separator removes.",
    "stages[].cooler.ua_W_K": "Overall conductance of an existing exchanger (rating: the air outlet, "
                              "duty and coolant outlet are results); needs `coolant`.",
    "stages[].cooler.arrangement": "Flow arrangement for ε–NTU and the LMTD correction factor.",
    "stages[].cooler.coolant": "The coolant side (see *Coolers* below), or null: the cooler then "
                               "works without sizing figures.",
    "stages[].cooler.coolant.kind": "`water`, `glycol` (water–glycol) or `air` (ambient air, fan-cooled).",
    "stages[].cooler.coolant.glycol": "Glycol type (kind `glycol` only).",
    "stages[].cooler.coolant.glycol_fraction": "Glycol mass fraction; required for kind `glycol`.",
    "stages[].cooler.coolant.flow_kg_s": "Coolant mass flow (give this or `temperature_rise_K`).",
    "stages[].cooler.coolant.temperature_rise_K": "Coolant temperature rise (give this or `flow_kg_s`).",
    "heat_recovery": "Heat recovery from the coolers and casings (see *Heat recovery* below), or null.",
    "heat_recovery.delivery_temperature_K": "Temperature of the hot water or warm air delivered.",
    "heat_recovery.approach_K": "Minimum difference between the compressed air and the delivered stream.",
    "heat_recovery.casing_share": "Share of each stage's casing heat loss a jacket collects.",
    "heat_recovery.fuel_price_per_kWh": "Price of the boiler fuel the recovered heat replaces (money per kWh).",
    "heat_recovery.boiler_efficiency": "Efficiency of that boiler (above 1 for condensing boilers, net basis).",
    "heat_recovery.operating_hours_per_year": "Hours for the yearly value; null: `year.operating_hours_per_year`, "
                                              "else 8760.",
    "base_name": "Name of the base design (the document's own fields) among the project's cases.",
    "cases": "Named cases: each is the base design with some fields changed (version 3). A case's results "
             "are those of the same project saved on its own.",
    "cases[]": "One case.",
    "cases[].name": "The case's name: unique in the project, not the base's.",
    "cases[].note": "Free text: what the case stands for.",
    "cases[].changes": "The fields the case changes, each as a field path (`site.ambient_temperature_K`, "
                       "`stages[1].cooler`, `stages` for another stage list) and its value in the same units as "
                       "the field; `null` removes an optional key. Every other field follows the base.",
    "snapshot": "The results as last saved (optional): on opening, the window shows them at once, solves again "
                "and says which figures moved by more than 1e-6 relative, and why if the versions differ.",
    "snapshot.stagewright_version": "Version of Stagewright that computed the snapshot.",
    "snapshot.coolprop_version": "Version of CoolProp that computed the snapshot.",
    "snapshot.saved_utc": "When the snapshot was taken (UTC, ISO 8601).",
    "snapshot.results": "Each case's results by case name, in the form of `solve --json` (SI, unit in each key).",
    "year": "A year at the site: ambient profile, hours, load and prices (see *A year at the site* "
            "below), or null.",
    "year.profile": "The ambient profile: 12 months, or bins of hours.",
    "year.profile.kind": "`monthly` or `bins`.",
    "year.profile{monthly}.months": "January to December in order, exactly 12 entries.",
    "year.profile{monthly}.months[]": "One month.",
    "year.profile{monthly}.months[].temperature_K": "Mean ambient temperature of the month.",
    "year.profile{monthly}.months[].relative_humidity": "Mean relative humidity of the month.",
    "year.profile{monthly}.months[].load": "Load in this month; null: the section's `load`.",
    "year.profile{monthly}.months[].coolant_inlet_temperature_K": "Water or glycol supply temperature "
                                                                  "this month; null: the cooler's own.",
    "year.profile{monthly}.months[].hours": "Operating hours in the month; null: spread from "
                                            "`operating_hours_per_year` by the days of the month.",
    "year.profile{bins}.bins": "Bins of ambient conditions, each with its hours.",
    "year.profile{bins}.bins[]": "One bin.",
    "year.profile{bins}.bins[].temperature_K": "Mean ambient temperature of the bin.",
    "year.profile{bins}.bins[].relative_humidity": "Mean relative humidity of the bin.",
    "year.profile{bins}.bins[].load": "Load in this bin; null: the section's `load`.",
    "year.profile{bins}.bins[].coolant_inlet_temperature_K": "Water or glycol supply temperature in this "
                                                             "bin; null: the cooler's own.",
    "year.profile{bins}.bins[].label": "Name of the bin; empty: `bin N`.",
    "year.profile{bins}.bins[].hours": "Operating hours in the bin (scaled to "
                                       "`operating_hours_per_year` when that is given).",
    "year.operating_hours_per_year": "Operating hours in the year; null: 8760 (monthly) or the bins' sum.",
    "year.load": "Scales the project's flow value (mass, volume or shaft power).",
    "year.energy_price_per_kWh": "Price of the driver's electricity (money per kWh).",
    "year.water_price_per_m3": "Price of cooling water, once-through kind `water` coolers (money per m³).",
    "field_check": "Uncertainty of a field check's measured inputs and the guaranteed figures its results "
                   "are judged against (see *Field-check uncertainty* below), or null.",
    "field_check.uncertainties": "The measured inputs that carry an uncertainty, one entry each.",
    "field_check.uncertainties[]": "One measured input and its uncertainty.",
    "field_check.uncertainties[].kind": "`standard`: a standard uncertainty (Gaussian); `limits`: ±half-width, "
                                        "u = a/√3 (rectangular, JCGM 100:2008 §4.3.7); `accuracy_class`: an "
                                        "instrument's class in per cent of full scale (or of the reading), read "
                                        "as limits.",
    "field_check.uncertainties[]{standard}.input": "Field path of the measured input, e.g. "
                                                   "`stages[1].efficiency.value_K` (see the list below).",
    "field_check.uncertainties[]{standard}.standard_uncertainty": "Standard uncertainty, in the SI unit of the "
                                                                  "input (its key names the unit).",
    "field_check.uncertainties[]{limits}.input": "Field path of the measured input.",
    "field_check.uncertainties[]{limits}.half_width": "Half-width a of the limits x ± a, in the SI unit of "
                                                      "the input.",
    "field_check.uncertainties[]{accuracy_class}.input": "Field path of the measured input.",
    "field_check.uncertainties[]{accuracy_class}.class_percent": "Accuracy class: limit of error in per cent "
                                                                 "of `full_scale`.",
    "field_check.uncertainties[]{accuracy_class}.full_scale": "Full scale (span) of the instrument, in the SI "
                                                              "unit of the input; null: the class is per cent "
                                                              "of the reading.",
    "field_check.guarantees": "Guaranteed figures, each with its tolerance.",
    "field_check.guarantees[]": "One guaranteed figure.",
    "field_check.guarantees[].kind": "`relative`: tolerance as a fraction of the guaranteed value; "
                                     "`absolute`: in the figure's unit; `iso1217_annex_c`: ISO 1217 Annex C "
                                     "tolerance on flow or specific power (values from memory).",
    "field_check.guarantees[]{relative}.figure": "Result figure, by its path in the results: "
                                                "`free_air_delivery_m3_s`, `specific_power_kW_per_m3_min`, "
                                                "`stages[1].isentropic_efficiency`, `stages[0].cooler.duty_W` ….",
    "field_check.guarantees[]{relative}.value": "Guaranteed value, in the figure's SI unit.",
    "field_check.guarantees[]{relative}.limit": "`both`: value ± tolerance; `at_least`: not below value − "
                                               "tolerance; `at_most`: not above value + tolerance.",
    "field_check.guarantees[]{absolute}.figure": "Result figure, by its path in the results: "
                                                "`free_air_delivery_m3_s`, `specific_power_kW_per_m3_min`, "
                                                "`stages[1].isentropic_efficiency`, `stages[0].cooler.duty_W` ….",
    "field_check.guarantees[]{absolute}.value": "Guaranteed value, in the figure's SI unit.",
    "field_check.guarantees[]{absolute}.limit": "`both`: value ± tolerance; `at_least`: not below value − "
                                               "tolerance; `at_most`: not above value + tolerance.",
    "field_check.guarantees[]{iso1217_annex_c}.figure": "Result figure, by its path in the results: "
                                                "`free_air_delivery_m3_s`, `specific_power_kW_per_m3_min`, "
                                                "`stages[1].isentropic_efficiency`, `stages[0].cooler.duty_W` ….",
    "field_check.guarantees[]{iso1217_annex_c}.value": "Guaranteed value, in the figure's SI unit.",
    "field_check.guarantees[]{iso1217_annex_c}.limit": "`both`: value ± tolerance; `at_least`: not below value − "
                                               "tolerance; `at_most`: not above value + tolerance.",
    "field_check.guarantees[]{relative}.tolerance": "Tolerance as a fraction of the guaranteed value "
                                                    "(0.05 = ±5 %).",
    "field_check.guarantees[]{absolute}.tolerance": "Tolerance in the figure's SI unit.",
    "field_check.monte_carlo_draws": "Draws of the Monte Carlo check (JCGM 101:2008).",
    "field_check.seed": "Seed of the Monte Carlo draws (the same seed repeats a run).",
    "package": "The whole package at part load (thermo/part_load/): capacity control, the motor, auxiliaries, "
               "a stated load and a load profile. Null: part-load power in proportion to flow (optimistic).",
    "package.control": "Capacity control: how the package meets a demand below its full capacity.",
    "package.control.kind": "`load_unload`: full capacity or none, cycling on a receiver; `modulation`: inlet "
                            "throttling; `variable_speed`: speed follows demand down to a minimum speed; "
                            "`start_stop`: the motor stops when the receiver is full; `measured_curve`: your own "
                            "power-against-flow points.",
    "package.control{load_unload}.receiver_volume_m3": "Receiver and piping volume the control cycles on.",
    "package.control{load_unload}.pressure_band_Pa": "Pressure band between loading and unloading.",
    "package.control{load_unload}.unloaded_power_fraction": "Shaft power when fully unloaded, as a share of "
                                                            "full-load power (default 0.25: common practice, no "
                                                            "source).",
    "package.control{load_unload}.blowdown_time_s": "Time constant of the fall from loaded to unloaded power "
                                                    "(default 40 s: common practice, no source).",
    "package.control{modulation}.zero_flow_power_fraction": "Shaft power at zero flow as a share of full-load "
                                                            "power; power falls linearly to it (default 0.70: DOE "
                                                            "sourcebook, from memory).",
    "package.control{variable_speed}.receiver_volume_m3": "Receiver volume for cycling below the minimum speed.",
    "package.control{variable_speed}.pressure_band_Pa": "Pressure band for cycling below the minimum speed.",
    "package.control{variable_speed}.unloaded_power_fraction": "Unloaded power below the minimum speed, as a "
                                                               "share of the minimum-speed power.",
    "package.control{variable_speed}.blowdown_time_s": "Blowdown time constant when cycling below the "
                                                       "minimum speed.",
    "package.control{variable_speed}.min_speed_fraction": "Lowest speed over full speed (default 0.30: common "
                                                          "practice, no source).",
    "package.control{variable_speed}.specific_power_rise_at_min_speed": "Rise of specific power at the minimum "
                                                                        "speed over full speed, linear between "
                                                                        "(0.10 = 10 % more; common practice, no "
                                                                        "source).",
    "package.control{variable_speed}.drive_efficiency": "Drive efficiency at full load (default 0.97: common "
                                                        "practice, no source).",
    "package.control{variable_speed}.drive_fixed_loss_share": "Share of the drive's full-load losses that stays "
                                                              "at any load (default 0.5).",
    "package.control{start_stop}.receiver_volume_m3": "Receiver and piping volume the control cycles on.",
    "package.control{start_stop}.pressure_band_Pa": "Pressure band between starting and stopping.",
    "package.control{start_stop}.unloaded_power_fraction": "Unloaded power in the cycles the starts limit "
                                                           "keeps running, as a share of full-load power.",
    "package.control{start_stop}.blowdown_time_s": "Blowdown time constant of those unloaded periods.",
    "package.control{start_stop}.max_starts_per_hour": "Most motor starts an hour (default 6: common "
                                                       "practice, no source; the motor's supplier states its own).",
    "package.control{measured_curve}.points": "Measured part-load curve, interpolated linearly.",
    "package.control{measured_curve}.points[]": "One point of the curve.",
    "package.control{measured_curve}.points[].flow_fraction": "Delivered flow over full capacity.",
    "package.control{measured_curve}.points[].power_fraction": "Shaft power over full-load shaft power.",
    "package.motor": "The motor at part load.",
    "package.motor.rated_output_W": "Rated output; null: the full-load shaft power solved (the motor exactly "
                                    "sized, so full load keeps `driver.efficiency`).",
    "package.motor.fixed_loss_share": "Share of the rated losses that stays at any load (iron, friction); the "
                                      "rest grows with load squared (default 0.35: common practice, no source).",
    "package.motor.efficiency_points": "A supplier's efficiency points; when given they replace the loss split.",
    "package.motor.efficiency_points[]": "One point.",
    "package.motor.efficiency_points[].load_fraction": "Output over rated output.",
    "package.motor.efficiency_points[].efficiency": "Efficiency at that load.",
    "package.fan_power_W": "Cooler fans' electrical input while the package runs.",
    "package.pump": "Coolant pump: its input is ρ g H V / η at the coolers' full-load coolant flow.",
    "package.pump.head_m": "Pump head.",
    "package.pump.efficiency": "Pump and motor efficiency (default 0.70: common practice, no source).",
    "package.other_loads": "Other fixed loads of the package (dryer, controls …), drawn while it runs.",
    "package.other_loads[]": "One load.",
    "package.other_loads[].name": "What the load is.",
    "package.other_loads[].power_W": "Its electrical input.",
    "package.load": "Demand over full capacity the solve reports the package at.",
    "package.part_loads": "Loads of the data sheet.",
    "package.part_loads[]": "A load over full capacity.",
    "package.load_profile": "Hours at each load over a year at the site as stated (annual energy; the staging "
                            "study's annual cost).",
    "package.load_profile[]": "One row.",
    "package.load_profile[].load": "Demand over full capacity.",
    "package.load_profile[].hours": "Hours a year at that load.",
    "year.coolers": "How the year treats the coolers that have a coolant side (thermo/year_design.py).",
    "year.coolers.mode": "`size_every_bin`: each bin sizes every cooler afresh for its entry (a perfect "
                         "exchanger every bin). `design_once`: each cooler is sized once at the design "
                         "condition and every bin is rated at that fixed UA and design coolant flow; the air "
                         "outlet, duty, coolant outlet and condensate then move with the bin.",
    "year.coolers.design_condition": "Where `design_once` sizes the coolers: `site` (the project as "
                                     "stated) or `hottest_bin` (the bin with the highest ambient).",
    "year.coolers.ua_margin": "Fouling margin on UA: every bin is rated with (1 + margin) × the design UA. "
                              "Default 0.10 is common practice, no source; 0 rates at the design UA.",
    "year.coolers.max_dryer_inlet_temperature_K": "Highest temperature of the air reaching the dryer "
                                                  "(the delivered air); warmer bins are flagged. Null: no limit.",
}

#: results path → meaning; ``point.*`` is the state-point object used by every state
RESULT_KEYS = {
    "model": "Property model used.",
    "eos_reference": "Bibliographic reference of the property model.",
    "ambient_temperature_K": "Site ambient temperature, the dead-state temperature T0.",
    "barometric_pressure_Pa": "Site barometric pressure, the dead-state pressure p0.",
    "mass_flow_kg_s": "Mass flow of air through the train.",
    "free_air_delivery_m3_s": "Free air delivery at site ambient conditions (ISO 1217).",
    "normal_volume_flow_m3_s": "Volume flow at the DIN 1343 normal state.",
    "shaft_power_W": "Total shaft power of all stages.",
    "driver_power_W": "Driver input power: shaft power ÷ driver efficiency.",
    "specific_power_kW_per_m3_min": "Driver input power per unit free air delivery.",
    "heat_rejected_W": "Heat leaving the train: cooler duties, casing losses, mechanical losses.",
    "entropy_generation_W_K": "Total entropy generation of filter, stages and coolers.",
    "exergy_destroyed_W": "Total exergy destroyed, T0 × entropy generation.",
    "heat_exergy_W": "Exergy carried out with the rejected heat, Σ Q (1 − T0/Tb).",
    "exergy_gained_W": "Flow exergy of the delivered air (at the delivery state, relative to the site).",
    "isothermal_power_W": "Reversible isothermal power at T0 to the delivery pressure.",
    "isothermal_efficiency": "Isothermal power ÷ shaft power.",
    "second_law_efficiency": "Exergy gained by the air ÷ shaft power.",
    "energy_residual": "Energy balance closure, relative to shaft power (≤ 1e-6).",
    "exergy_residual": "Exergy balance closure, relative to shaft power (≤ 1e-6).",
    "intake": "Ambient air at the intake (a point).",
    "inlet_filter": "The intake filter, a throttle from ambient to the stage-1 inlet pressure.",
    "inlet_filter.outlet": "State after the filter (a point).",
    "inlet_filter.entropy_generation_W_K": "Entropy generated in the filter.",
    "inlet_filter.exergy_destroyed_W": "Exergy destroyed in the filter.",
    "delivery": "Delivered air after the last cooler (a point).",
    "stages": "One entry per stage, in flow order.",
    "stages[].inlet": "Stage inlet state (a point).",
    "stages[].outlet": "Stage discharge state (a point).",
    "stages[].pressure_ratio": "Stage pressure ratio used (given or found).",
    "stages[].isentropic_discharge_temperature_K": "Discharge temperature of isentropic compression "
                                                   "to the same pressure.",
    "stages[].gas_power_W": "Power delivered to the gas.",
    "stages[].shaft_power_W": "Shaft power of the stage: gas power ÷ mechanical efficiency.",
    "stages[].mechanical_loss_W": "Shaft power minus gas power.",
    "stages[].heat_loss_W": "Casing heat loss.",
    "stages[].heat_loss_exergy_W": "Exergy carried out with the casing heat loss.",
    "stages[].isentropic_efficiency": "Isentropic efficiency (given, or computed from the other kinds).",
    "stages[].polytropic_efficiency": "Polytropic efficiency (given, or computed from the other kinds).",
    "stages[].polytropic_exponent": "Polytropic exponent n of the compression.",
    "stages[].entropy_generation_W_K": "Entropy generated in the stage.",
    "stages[].exergy_destroyed_W": "Exergy destroyed in the stage.",
    "stages[].path": "Points along the compression path, for T–s charts.",
    "stages[].path[].temperature_K": "Temperature along the path.",
    "stages[].path[].pressure_Pa": "Pressure along the path.",
    "stages[].path[].entropy_J_kgK": "Specific entropy along the path (model's own reference state).",
    "stages[].cooler": "The cooler after the stage, or null.",
    "stages[].cooler.inlet": "Cooler inlet state (a point).",
    "stages[].cooler.outlet": "Cooler outlet state (a point).",
    "stages[].cooler.duty_W": "Heat removed from the air.",
    "stages[].cooler.boundary_temperature_K": "Temperature at which the heat crosses the boundary.",
    "stages[].cooler.heat_exergy_W": "Exergy carried out with the cooler heat.",
    "stages[].cooler.entropy_generation_W_K": "Entropy generated in the cooler.",
    "stages[].cooler.exergy_destroyed_W": "Exergy destroyed in the cooler.",
    "stages[].cooler.path": "Points along the cooling path, for T–s charts.",
    "stages[].cooler.path[].temperature_K": "Temperature along the path.",
    "stages[].cooler.path[].pressure_Pa": "Pressure along the path.",
    "stages[].cooler.path[].entropy_J_kgK": "Specific entropy along the path.",
    "stages[].cooler.arrangement": "Flow arrangement of the exchanger.",
    "stages[].cooler.coolant_kind": "`water`, `glycol` or `air`; null without a coolant side.",
    "stages[].cooler.coolant_flow_kg_s": "Coolant mass flow (given, or found from the temperature rise).",
    "stages[].cooler.coolant_volume_flow_m3_s": "Coolant volume flow at its inlet.",
    "stages[].cooler.cooling_water_m3_s": "Cooling-water flow of this cooler: its coolant volume flow at the inlet "
                                          "when the coolant is water or a water–glycol mixture; null for fan air "
                                          "or without a coolant side.",
    "stages[].cooler.coolant_inlet_temperature_K": "Coolant inlet temperature.",
    "stages[].cooler.coolant_outlet_temperature_K": "Coolant outlet temperature.",
    "stages[].cooler.lmtd_K": "Counter-flow log-mean temperature difference of the four terminal temperatures.",
    "stages[].cooler.lmtd_correction_factor": "LMTD correction factor F of the arrangement (≤ 1). A condensing "
                                              "cooler: 1 for counter-flow, else null (see its dry zone).",
    "stages[].cooler.mean_temperature_difference_K": "Mean temperature difference, duty ÷ UA.",
    "stages[].cooler.effectiveness": "Exchanger effectiveness ε (a condensing cooler: on the mean capacity rates "
                                     "of the terminal changes, latent heat included).",
    "stages[].cooler.ntu": "Number of transfer units, UA ÷ C_min (C_min as for ε).",
    "stages[].cooler.ua_W_K": "Overall conductance UA (needed, or given when rating).",
    "stages[].cooler.zones": "One dry zone, or a dry and a condensing zone.",
    "stages[].cooler.zones[].kind": "`dry` (sensible only) or `wet` (condensing).",
    "stages[].cooler.zones[].duty_W": "Heat removed in the zone.",
    "stages[].cooler.zones[].hot_inlet_temperature_K": "Compressed-air temperature entering the zone.",
    "stages[].cooler.zones[].hot_outlet_temperature_K": "Compressed-air temperature leaving the zone.",
    "stages[].cooler.zones[].coolant_inlet_temperature_K": "Coolant temperature entering the zone.",
    "stages[].cooler.zones[].coolant_outlet_temperature_K": "Coolant temperature leaving the zone.",
    "stages[].cooler.zones[].capacity_ratio": "C_min ÷ C_max of the zone.",
    "stages[].cooler.zones[].effectiveness": "Effectiveness of the zone (a wet zone: on the enthalpy basis).",
    "stages[].cooler.zones[].ntu": "Number of transfer units of the zone (a wet zone: on the enthalpy basis).",
    "stages[].cooler.zones[].lmtd_K": "Log-mean temperature difference of the zone.",
    "stages[].cooler.zones[].lmtd_correction_factor": "LMTD correction factor F of a dry zone (≤ 1); null for a "
                                                      "wet zone, which is driven by an enthalpy difference.",
    "stages[].cooler.zones[].log_mean_enthalpy_difference_J_kg": "Wet zone: log-mean difference between the air's "
                                                                 "enthalpy and saturated air's at the coolant "
                                                                 "temperature, per kg dry air (Braun, Klein & "
                                                                 "Mitchell 1989); null for a dry zone.",
    "stages[].cooler.zones[].ua_W_K": "Conductance UA of the zone.",
    "cooling_water_m3_s": "Cooling-water flow of the train: the sum of the coolers' `cooling_water_m3_s` (null when "
                          "no cooler has a water or glycol side).",
    "package": "Package figures (null without a `package` section): the control, `full_load`, `at_load` "
               "(the stated load), `part_loads`, a 21-point `curve` and the load profile's `annual` totals; each "
               "point has driver, auxiliary and package input [W], delivered free air [m³/s], package specific "
               "power [J/m³], loaded and running shares, cycles and starts per hour.",
    "recoverable_heat_W": "Heat that can be recovered (null without a `heat_recovery` section).",
    "heat_recovery": "Heat recovery figures, or null without a `heat_recovery` section.",
    "heat_recovery.delivery_temperature_K": "Temperature of the stream delivered.",
    "heat_recovery.source_temperature_K": "Delivery temperature plus approach: the coldest useful air.",
    "heat_recovery.coolers_W": "Recoverable heat of each stage's cooler (null where there is none).",
    "heat_recovery.casings_W": "Recoverable casing heat of each stage.",
    "heat_recovery.recoverable_heat_W": "Total recoverable heat.",
    "heat_recovery.share_of_driver_input": "Recoverable heat ÷ driver input power.",
    "heat_recovery.operating_hours_per_year": "Hours used for the yearly figures, [h].",
    "heat_recovery.heat_per_year_kWh": "Recoverable heat over those hours.",
    "heat_recovery.fuel_saved_per_year_kWh": "Boiler fuel that heat replaces.",
    "heat_recovery.value_per_year": "Value of the fuel saved (money, in the unit of the fuel price).",
    "warnings": "Things to look at, e.g. a discharge temperature above its limit.",
    "warnings[].field": "Path of the input concerned (`stages[1].max_discharge_temperature_K`).",
    "warnings[].message": "What is wrong, in words.",
    "warnings[].template": "The same sentence with `{name}` placeholders, for showing it in other units.",
    "warnings[].values": "The placeholders' values.",
    "warnings[].values[].name": "Placeholder name.",
    "warnings[].values[].value": "Its value, SI (or a plain number or word).",
    "warnings[].values[].quantity": "What it measures (`temperature`, `pressure`, `absolute_pressure`, `water_flow` …), or null.",
    "point.temperature_K": "Static temperature.",
    "point.pressure_Pa": "Static absolute pressure.",
    "point.enthalpy_J_kg": "Specific enthalpy (the model's own reference state: compare differences).",
    "point.entropy_J_kgK": "Specific entropy (the model's own reference state: compare differences).",
    "point.density_kg_m3": "Density.",
    "point.velocity_m_s": "Velocity of the stream at this point.",
    "point.humidity_ratio": "Water vapour per unit mass of dry air, kg/kg.",
    "point.relative_humidity": "Relative humidity, as a fraction (relative to liquid water, also below 0 °C).",
    "point.dew_point_K": "Dew point at the point's pressure; below 0.01 °C the frost point over ice "
                         "(IAPWS 2011 sublimation pressure); null for dry air.",
    "point.liquid_ratio": "Liquid water carried per unit mass of dry air, kg/kg (moist air only).",
    "stages[].path[].humidity_ratio": "Water vapour per dry air at this point of the path (moist air only).",
    "stages[].path[].liquid_ratio": "Liquid water per dry air at this point of the path (moist air only).",
    "stages[].cooler.path[].humidity_ratio": "Water vapour per dry air along the cooling line (moist air only).",
    "stages[].cooler.path[].liquid_ratio": "Liquid water per dry air along the cooling line; it becomes positive "
                                           "where condensation starts (moist air only).",
    "stages[].cooler.condensate_kg_s": "Water vapour condensed in this cooler.",
    "stages[].cooler.condensate_L_h": "Volume flow of the condensate drained after this cooler, L/h (IAPWS-95 "
                                      "density at the outlet).",
    "stages[].cooler.latent_duty_W": "Part of the duty released by condensation.",
    "stages[].cooler.sensible_duty_W": "Part of the duty that cools the air without condensation.",
    "stages[].cooler.drained_kg_s": "Condensate removed by the separator after this cooler.",
    "stages[].cooler.carry_over_kg_s": "Liquid water the separator lets through to the next stage.",
    "stages[].cooler.separator_outlet": "State after the separator (the next stage's inlet).",
    "humidity_formulation": "Moist-air formulation used (null for a dry intake).",
    "intake_humidity_ratio": "Water vapour per dry air of the intake air, kg/kg.",
    "intake_water_kg_s": "Water entering with the intake air.",
    "condensate_kg_s": "Condensate drained by all separators.",
    "condensate_L_h": "Condensate drained by all separators, L/h.",
    "condensate_exergy_W": "Exergy leaving with the drained condensate.",
    "delivered_water_kg_s": "Water (vapour and liquid) leaving with the delivered air.",
    "delivered_liquid_kg_s": "Liquid water leaving with the delivered air.",
    "delivered_pressure_dew_point_K": "Pressure dew point of the delivered air; below 0.01 °C its frost "
                                      "point over ice (IAPWS 2011); null for a dry intake.",
    "delivered_atmospheric_dew_point_K": "Dew point of the delivered air expanded to the site pressure.",
    "iso8573_humidity_class": "ISO 8573-1 water class the delivered air meets (table from memory).",
    "water_balance_residual": "Water in minus water out, relative to water in (0 for a dry intake).",
}

#: the keys of one package point (thermo.part_load.package.PackagePoint), at each place it appears
_PACKAGE_POINT_KEYS = {
    "demand_fraction": "Demand over full capacity.",
    "delivered_fad_m3_s": "Free air delivered at that demand.",
    "shaft_power_W": "Compressor shaft power, time mean over the control's cycle.",
    "driver_power_W": "Motor input (and the drive's, for variable speed), time mean.",
    "drive_loss_W": "The variable-speed drive's own losses (0 without one).",
    "fan_power_W": "Cooler fans' input, time mean (off while stopped).",
    "pump_power_W": "Coolant pump's input, time mean.",
    "other_power_W": "The named fixed loads' input, time mean.",
    "package_power_W": "Package input: driver and auxiliaries.",
    "package_specific_power_J_m3": "Package input per unit of free air delivered (null at zero demand).",
    "loaded_fraction": "Share of time the compressor delivers air.",
    "running_fraction": "Share of time the motor runs.",
    "cycles_per_hour": "Load/unload or start/stop cycles an hour (null where the control does not cycle).",
    "starts_per_hour": "Motor starts an hour (start/stop only).",
    "notes": "What the control had to do at this demand (e.g. cycling below the minimum speed).",
}
RESULT_KEYS.update({
    "package.control": "The capacity control's kind.",
    "package.control_label": "The capacity control in words.",
    "package.full_load": "The package at full load.",
    "package.at_load": "The package at its stated `package.load`.",
    "package.part_loads": "The package at each of `package.part_loads` (the data sheet's loads).",
    "package.curve": "The package at demands 0, 0.05 … 1 (the part-load chart).",
    "package.annual": "The load profile's year at the site as stated (null without a profile).",
    "package.annual.hours": "Hours of the profile [h].",
    "package.annual.energy_kWh": "Package energy over the profile.",
    "package.annual.delivered_m3": "Free air delivered over the profile.",
    "package.annual.mean_power_W": "Mean package input over the profile's hours.",
    "package.annual.specific_power_J_m3": "Energy over delivered free air.",
    "package.annual.ideal_energy_kWh": "The same hours with input in proportion to flow (full-load specific power).",
})
for _place in ("package.full_load", "package.at_load", "package.part_loads[]", "package.curve[]"):
    RESULT_KEYS.update({f"{_place}.{k}": v for k, v in _PACKAGE_POINT_KEYS.items()})

_SUFFIX_UNITS = [  # longest first
    ("_per_kWh", "money/kWh"), ("_per_m3", "money/m³"), ("_kWh", "kWh"), ("_kW_per_m3_min", "kW/(m³/min)"), ("_J_kgK", "J/(kg·K)"), ("_kg_m3", "kg/m³"), ("_J_kg", "J/kg"),
    ("_kg_s", "kg/s"), ("_m3_s", "m³/s"), ("_W_K", "W/K"), ("_m_s", "m/s"), ("_Pa", "Pa"),
    ("_K", "K"), ("_W", "W"), ("_m3", "m³"), ("_m", "m"), ("_s", "s"),
]


def unit_of(key: str) -> str:
    """The SI unit a key's name carries (``discharge_pressure_Pa`` → ``Pa``), or ``""``.

    >>> unit_of("stages[].cooler.duty_W"), unit_of("isothermal_efficiency")
    ('W', '')
    """
    last = key.rsplit(".", 1)[-1]
    for suffix, unit in _SUFFIX_UNITS:
        if last.endswith(suffix):
            return unit
    return ""


def _g(x: float) -> str:
    if math.isinf(x):
        return "∞" if x > 0 else "−∞"
    return f"{x:g}".replace("e+0", "e").replace("e+", "e")


def _describe(node) -> tuple[str, str, str, str]:
    """(type, unit, allowed values, default) of a schema node, as table text."""
    null = " or null" if getattr(node, "nullable", False) else ""
    if isinstance(node, Num):
        lo, hi = ("(" if node.lo_open else "["), (")" if node.hi_open else "]")
        kind = "integer" if node.integer else "number"
        rng = f"{lo}{_g(node.lo)}, {_g(node.hi)}{hi}"
        typ, unit = kind + null, node.unit
    elif isinstance(node, Choice):
        typ, unit, rng = "text" + null, "", ", ".join(f"`{o}`" for o in node.options)
    elif isinstance(node, Text):
        typ, unit, rng = "text" + null, "", f"up to {node.max_length} characters"
    elif isinstance(node, Items):
        typ, unit, rng = "list", "", f"{node.min_length} to {node.max_length} items"
    elif isinstance(node, (Obj, Variant)):
        typ, unit, rng = "object" + null, "", ""
    elif isinstance(node, Changes):
        typ, unit, rng = "object", "", f"up to {node.max_items} field paths"
    elif isinstance(node, Raw):
        typ, unit, rng = "any" + null, "", ""
    else:
        raise TypeError(node)
    if getattr(node, "required", False):
        default = "required"
    elif getattr(node, "default", MISSING) is MISSING:
        default = "—"
    else:
        d = node.default
        default = "null" if d is None else (f"`{d!r}`".replace("'", '"') if isinstance(d, (str, dict, list)) else _g(d))
    return typ, unit, rng, default


def _key_cell(path: str) -> str:
    m = re.search(r"\{(\w+)\}", path)
    shown = re.sub(r"\{\w+\}", "", path)
    return f"`{shown}`" + (f" (kind `{m.group(1)}`)" if m else "")


def project_key_table() -> str:
    """Markdown table of every project key: key, type, unit, allowed values, default, meaning."""
    rows = ["| Key | Type | Unit | Allowed | Default | Meaning |", "|---|---|---|---|---|---|"]
    for path, node in walk(PROJECT):
        typ, unit, rng, default = _describe(node)
        meaning = PROJECT_KEYS.get(path, "**(no description: add one in thermo/project/schema_docs.py)**")
        rows.append(f"| {_key_cell(path)} | {typ} | {unit} | {rng} | {default} | {meaning} |")
    return "\n".join(rows) + "\n"


def result_key_table() -> str:
    """Markdown table of every results key (``solve --json``), with the unit its name carries."""
    rows = ["| Key | Unit | Meaning |", "|---|---|---|"]
    for path, meaning in RESULT_KEYS.items():
        rows.append(f"| `{path}` | {unit_of(path)} | {meaning} |")
    return "\n".join(rows) + "\n"


def result_paths(result: dict) -> set[str]:
    """Paths of every key in a ``to_dict()`` result, in the notation of :data:`RESULT_KEYS`.

    Every state-point object (the shape of ``result["intake"]``) is one path; its keys
    are listed once, as ``point.<key>``.
    """
    point_keys = set(result["intake"])
    out = {f"point.{k}" for k in point_keys}

    def visit(value, path):
        if isinstance(value, dict):
            if path and not path.endswith("[]"):  # a list's entries are described by the list
                out.add(path)
            if set(value) == point_keys and path:
                return
            for k, v in value.items():
                visit(v, f"{path}.{k}" if path else k)
        elif isinstance(value, list):
            out.add(path)
            for v in value:
                if isinstance(v, (dict, list)):  # a list of numbers is described by the list
                    visit(v, f"{path}[]")
        else:
            out.add(path)

    visit(result, "")
    return out


_BLOCKS = {"PROJECT KEYS": project_key_table, "RESULT KEYS": result_key_table}


def render(text: str) -> str:
    """``text`` with every generated block replaced by its current content."""
    for name, make in _BLOCKS.items():
        begin = f"<!-- BEGIN {name} (generated by `python -m stagewright.core.project.schema_docs --write`; do not edit) -->\n"
        end = f"<!-- END {name} -->"
        pattern = re.compile(re.escape(begin) + r".*?" + re.escape(end), re.DOTALL)
        if not pattern.search(text):
            raise ValueError(f"marker {begin.strip()} … {end} not found")
        text = pattern.sub(lambda _m: begin + make() + end, text)
    return text


def update_document(path: Path) -> bool:
    """Rewrite the generated blocks of ``path``; True if anything changed."""
    old = path.read_text(encoding="utf-8")
    new = render(old)
    if new != old:
        path.write_text(new, encoding="utf-8")
    return new != old


if __name__ == "__main__":  # pragma: no cover - a developer tool
    doc = Path(__file__).resolve().parents[2] / "docs" / "project-format.md"
    if "--write" in sys.argv:
        print(f"{doc}: {'updated' if update_document(doc) else 'already up to date'}")
    else:
        sys.stdout.write(project_key_table() + "\n" + result_key_table())
