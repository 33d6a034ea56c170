"""Presentation tables of a year at the site (``YearResult.to_dict()``): its bins and its totals.

* :data:`YEAR_BINS` — the columns of the bin-by-bin table (paths into a bin dict).
* :data:`YEAR_TOTALS` — the year's totals and extremes (paths into the year dict).

The year panel in the window (:mod:`app.year.panel`) and ``stagewright year``'s text table
(:mod:`app.cli.year_table`) read them; each shows the figures its ``where`` names, in table order
(a figure placed twice is shown at the place one output lists it). A year keeps energies in kWh:
those figures carry ``to_si=3.6e6``. Money is in the currency of the prices the user gave and is
shown as a plain number. No Qt.
"""
from __future__ import annotations

__all__ = ["YEAR_BINS", "YEAR_TOTALS"]

from dataclasses import replace

from app.presentation.figures import Figure, Look

_KWH = 3.6e6  # J per kWh
_WINDOW, _TEXT = {"window"}, {"text"}

_DUTY = Figure("cooler_duty_W", "Cooler duty", "heat_flow", looks={"text": Look(label="duty", width=11)})
_CONDENSATE = Figure("condensate_m3", "Condensate", "liquid_volume", looks={"text": Look(label="condens.", width=15)})

#: columns of the year's table, one row per bin (paths into a bin dict)
YEAR_BINS: tuple[Figure, ...] = (
    Figure("label", "Bin", style="text", looks={"text": Look(label="bin", width=12)}),
    Figure("temperature_K", "T", "temperature", looks={"text": Look(decimals=1, width=8)}),
    Figure("relative_humidity", "RH", "fraction", looks={"text": Look(quantity="ratio", decimals=2, width=6)}),
    Figure("hours", "Hours", decimals=0, looks={"text": Look(label="hours", width=8)}),
    Figure("driver_power_W", "Driver power", "power", looks={"text": Look(label="power", width=12)}),
    Figure("energy_kWh", "Energy", "energy", to_si=_KWH, looks={"text": Look(label="energy", unit="MWh", width=14)}),
    replace(_DUTY, where=frozenset(_TEXT)),
    replace(_CONDENSATE, where=frozenset(_WINDOW)),
    Figure("max_discharge_temperature_K", "Hottest discharge", "temperature",
           looks={"text": Look(label="t_max", decimals=1, width=12)}),
    replace(_DUTY, where=frozenset(_WINDOW)),
    replace(_CONDENSATE, where=frozenset(_TEXT)),
    Figure("cooling_water_m3", "Cooling water", "liquid_volume", where=_TEXT,
           looks={"text": Look(label="water", decimals=1, width=12)}),
    Figure("recoverable_heat_kWh", "Recoverable heat", "energy", to_si=_KWH, where=_TEXT,
           looks={"text": Look(label="recov.", unit="MWh", width=14)}),
    # issue 17: the PDF report's year table (a column whose every value is zero is left out there)
    replace(_DUTY, where=frozenset({"pdf"})),
    replace(_CONDENSATE, where=frozenset({"pdf"})),
    Figure("cooling_water_m3", "Cooling water", "liquid_volume", decimals=0, when="any", where={"pdf"}),
    Figure("recoverable_heat_kWh", "Recoverable heat", "energy", to_si=_KWH, when="any", where={"pdf"}),
)

#: the year's totals and extremes (paths into the year dict), read by the text table (the window's
#: year panel sums the year up in a sentence of its own); it lower-cases a label's first letter and
#: prints a note in brackets after the value
YEAR_TOTALS: tuple[Figure, ...] = (
    Figure("totals.hours", "Operating hours", "hours"),
    Figure("totals.energy_kWh", "Energy", "energy", to_si=_KWH),
    Figure("totals.energy_cost", "Energy cost", decimals=2),
    Figure("totals.condensate_m3", "Condensate", "liquid_volume"),
    Figure("totals.cooling_water_m3", "Cooling water", "liquid_volume", decimals=1, note="once-through volume"),
    Figure("totals.glycol_circulated_m3", "Glycol circulated", "liquid_volume", decimals=1),
    Figure("totals.water_cost", "Cooling-water cost", decimals=2),
    Figure("totals.recoverable_heat_kWh", "Recoverable heat", "energy", to_si=_KWH),
    Figure("totals.recovered_value", "Value of recovered heat", decimals=2),
    Figure("totals.cost", "Net cost", decimals=2),
    Figure("worst_discharge_temperature.temperature_K", "Worst discharge temperature", "temperature", decimals=1,
           bin_key="worst_discharge_temperature.bin"),
    Figure("worst_cooler_duty.duty_W", "Largest cooler duty", "heat_flow", bin_key="worst_cooler_duty.bin"),
)
