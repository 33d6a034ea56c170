"""Presentation tables of a year at the site (``YearResult.to_dict()``): its bins and its totals.

* :data:`YEAR_BINS` — the columns of the bin-by-bin table (paths into a bin dict).
* :data:`YEAR_TOTALS` — the year's totals and extremes (paths into the year dict).
* :data:`ONLY_WITH` and :func:`totals_for` — the totals a year has something to show for (no
  cooling-water line for an air-cooled train, no recovered heat without heat recovery, no money
  without prices).

The year panel in the window (:mod:`stagewright.gui.year.panel`) and ``stagewright year``'s text table
(:mod:`stagewright.gui.cli.year_table`) read them; each shows the figures its ``where`` names, in table order
(a figure placed twice is shown at the place one output lists it). A year keeps energies in kWh:
those figures carry ``to_si=3.6e6``. Money is in the currency of the prices the user gave and is
shown as a plain number (the window groups its thousands). No Qt.
"""
from __future__ import annotations

__all__ = ["bins_csv_rows", "YEAR_BINS", "YEAR_TOTALS", "ONLY_WITH", "totals_for", "design_note", "PDF_DRYER_COLUMNS",
           "PDF_ROW_KEYS", "BIN_ONLY_WITH", "bin_columns_for"]

from collections.abc import Mapping
from dataclasses import replace
from types import MappingProxyType

from stagewright.gui.presentation.figures import Figure, Look, read_path, shown

_KWH = 3.6e6  # J per kWh
_WINDOW, _TEXT, _WINDOW_TEXT = {"window"}, {"text"}, {"window", "text"}
_WINDOW_TEXT_PDF = {"window", "text", "pdf"}
#: money in the window: thousands grouped, whole units, no unit text (the currency is the user's)
_MONEY = {out: Look(quantity="money", decimals=0, symbol="") for out in ("window", "pdf")}

_DUTY = Figure("cooler_duty_W", "Cooler duty", "heat_flow", looks={"text": Look(label="duty", width=11)})
_HOURS = Figure("totals.hours", "Operating hours", "hours")
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
    # issue 15: what reaches the dryer, and each cooler as rated (window, text and the PDF's second
    # year table, :data:`PDF_DRYER_COLUMNS`)
    Figure("dryer_inlet_temperature_K", "To dryer", "temperature", where=_WINDOW_TEXT_PDF,
           note="Temperature of the delivered air, which reaches the dryer",
           looks={"text": Look(label="dryer", decimals=1, width=12)}),
    Figure("pressure_dew_point_K", "Pressure dew pt", "temperature", where=_WINDOW_TEXT_PDF,
           note="Pressure dew point of the air reaching the dryer (frost point below 0 °C)",
           looks={"text": Look(label="pdp", decimals=1, width=10), "pdf": Look(label="Pressure dew point",
                                                                                 when="any")}),
    Figure("cooler_outlet_temperatures_K", "Cooler outlets", "temperature", joiner=" / ", where=_WINDOW_TEXT_PDF,
           align="right", note="Air outlet of each cooler, first stage first (– where a stage has none)",
           looks={"text": Look(label="cooler outlets", decimals=1, width=26),
                  "pdf": Look(label="Cooler air outlets", decimals=1)}),
    Figure("coolant_outlet_temperatures_K", "Coolant outlets", "temperature", joiner=" / ", where=_WINDOW,
           note="Coolant outlet of each cooler with a coolant side"),
    Figure("meets_limits", "Meets limits", style="yes_no", where=_WINDOW_TEXT_PDF, align="right",
           note="No: a rated cooler leaves warmer than at its design condition, or the air reaches "
                "the dryer above the stated limit",
           looks={"text": Look(label="ok", width=6)}),
    # issue 17: the PDF report's year table (a column whose every value is zero is left out there)
    replace(_DUTY, where=frozenset({"pdf"})),
    replace(_CONDENSATE, where=frozenset({"pdf"})),
    Figure("cooling_water_m3", "Cooling water", "liquid_volume", decimals=0, when="any", where={"pdf"}),
    Figure("recoverable_heat_kWh", "Recoverable heat", "energy", to_si=_KWH, when="any", where={"pdf"}),
)

#: the PDF prints these bin figures in a second table, after the bin's label and ambient
#: (:data:`PDF_ROW_KEYS`), so that each table keeps a readable width on a portrait page
PDF_DRYER_COLUMNS: frozenset = frozenset({"dryer_inlet_temperature_K", "pressure_dew_point_K",
                                          "cooler_outlet_temperatures_K", "meets_limits"})
PDF_ROW_KEYS: tuple = ("label", "temperature_K", "relative_humidity")

#: bin figures a year may have nothing to show for: figure id → path into the year dict that is
#: false when the project states no limit (every bin then "meets" it); :func:`bin_columns_for`
#: leaves such a column out
BIN_ONLY_WITH: Mapping[str, str] = MappingProxyType({"meets_limits": "totals.limits_stated"})


def bin_columns_for(year: dict, output: str) -> list[Figure]:
    """The columns of :data:`YEAR_BINS` that ``output`` shows for ``year``: a column whose condition
    is ``"any"`` only when some bin has a non-zero value there, and none :data:`BIN_ONLY_WITH`
    finds nothing for.

    Examples
    --------
    >>> year = {"totals": {"limits_stated": False}, "bins": [{"pressure_dew_point_K": None}]}
    >>> ids = [f.id for f in bin_columns_for(year, "pdf")]
    >>> "pressure_dew_point_K" in ids, "meets_limits" in ids, "dryer_inlet_temperature_K" in ids
    (False, False, True)
    """
    bins = year.get("bins") or []
    return [f for f in shown(YEAR_BINS, output)
            if (f.when_in(output) != "any" or any(f.value(b) for b in bins))
            and (f.id not in BIN_ONLY_WITH or read_path(year, BIN_ONLY_WITH[f.id]))]


#: the year's totals and extremes (paths into the year dict). The text table lower-cases a label's
#: first letter and prints a note in brackets after the value; the window's year panel lists the
#: totals :func:`totals_for` keeps, with an extreme's bin after its value, and the hours last (what
#: the year costs comes first in a short panel)
YEAR_TOTALS: tuple[Figure, ...] = (
    replace(_HOURS, where=frozenset(_TEXT | {"pdf"})),
    Figure("totals.energy_kWh", "Energy", "energy", to_si=_KWH),
    Figure("totals.energy_cost", "Energy cost", decimals=2, looks=_MONEY),
    Figure("totals.condensate_m3", "Condensate", "liquid_volume"),
    Figure("totals.cooling_water_m3", "Cooling water", "liquid_volume", decimals=1, note="once-through volume",
           looks={"window": Look(decimals=0)}),  # a year's water runs to millions of US gallons: no tenths
    Figure("totals.glycol_circulated_m3", "Glycol circulated", "liquid_volume", decimals=1),
    Figure("totals.water_cost", "Cooling-water cost", decimals=2, looks=_MONEY),
    Figure("totals.recoverable_heat_kWh", "Recoverable heat", "energy", to_si=_KWH),
    Figure("totals.recovered_value", "Value of recovered heat", decimals=2, looks=_MONEY),
    Figure("totals.cost", "Net cost", decimals=2, looks=_MONEY),
    Figure("worst_discharge_temperature.temperature_K", "Worst discharge temperature", "temperature", decimals=1,
           bin_key="worst_discharge_temperature.bin"),
    Figure("worst_cooler_duty.duty_W", "Largest cooler duty", "heat_flow", bin_key="worst_cooler_duty.bin"),
    Figure("totals.hours_missing_limits", "Hours missing a limit", "hours", where=_WINDOW_TEXT_PDF,
           note="hours of the bins where a rated cooler or the dryer inlet misses its limit"),
    replace(_HOURS, where=frozenset(_WINDOW)),
    Figure("totals.mean_driver_power_W", "Mean driver power", "power", where=_WINDOW,
           note="energy over the operating hours"),
)

#: totals a year may have nothing to show for: figure id → path into the year dict that is None or
#: zero when the project lacks what the total counts (water coolers, a glycol circuit, heat
#: recovery, prices); :func:`totals_for` leaves such a total out
ONLY_WITH: Mapping[str, str] = MappingProxyType({
    "totals.energy_cost": "totals.energy_cost",
    "totals.cooling_water_m3": "totals.cooling_water_m3",
    "totals.glycol_circulated_m3": "totals.glycol_circulated_m3",
    "totals.water_cost": "totals.water_cost",
    "totals.recoverable_heat_kWh": "bins[*].recoverable_heat_W",  # None in every bin without heat recovery
    "totals.recovered_value": "totals.recovered_value",
    "totals.cost": "totals.cost",
    "totals.hours_missing_limits": "totals.limits_stated",
})


def totals_for(year: dict, output: str) -> list[Figure]:
    """The figures of :data:`YEAR_TOTALS` that ``output`` shows for ``year``, in table order,
    less those :data:`ONLY_WITH` finds nothing for.

    Examples
    --------
    >>> year = {"totals": {"energy_kWh": 10.0, "cooling_water_m3": 0.0, "energy_cost": 1.5},
    ...         "bins": [{"recoverable_heat_W": None}]}
    >>> ids = [f.id for f in totals_for(year, "window")]
    >>> "totals.cooling_water_m3" in ids, "totals.recoverable_heat_kWh" in ids, "totals.energy_cost" in ids
    (False, False, True)
    """
    return [f for f in shown(YEAR_TOTALS, output) if f.id not in ONLY_WITH or read_path(year, ONLY_WITH[f.id])]


def design_note(year: dict, system: str = "SI") -> str:
    """One sentence on how the year treated its coolers (empty when each bin sized them afresh).

    Examples
    --------
    >>> design_note({"cooler_design": {"condition": "hottest_bin", "bin": "July", "ua_margin": 0.1,
    ...              "coolers": [{"stage": 1, "rated_ua_W_K": 1500.0}, None]}})
    'Coolers designed once at the hottest bin (July), rated every bin with UA + 10 %: 1.500 kW/K (stage 1).'
    """
    from stagewright.gui.presentation import units
    design = year.get("cooler_design")
    if not design:
        return ""
    where = "the site as stated" if design["condition"] == "site" else f"the hottest bin ({design['bin']})"
    uas = ", ".join(f"{units.format_value(c['rated_ua_W_K'], 'conductance', system, with_unit=True)} "
                    f"(stage {c['stage']})" for c in design["coolers"] if c)
    return (f"Coolers designed once at {where}, rated every bin with UA + {100 * design['ua_margin']:.0f} %"
            + (f": {uas}." if uas else "."))


def bins_csv_rows(year: dict) -> list[list]:
    """Header and one row per bin of ``YearResult.to_dict()``: scalar figures, then one column per
    stage for each per-cooler list (``cooler_outlet_temperatures_K[1]`` …), then the limit flags."""
    bins = year["bins"]
    if not bins:
        return [[]]
    first = bins[0]
    scalars = [k for k, v in first.items() if not isinstance(v, list)]
    lists = [k for k, v in first.items() if isinstance(v, list) and k not in ("warnings", "limit_flags")]
    n = len(first["cooler_outlet_temperatures_K"])
    header = scalars + [f"{k}[{i + 1}]" for k in lists for i in range(n)] + ["limit_flags"]
    rows = [header]
    for b in bins:
        rows.append([b[k] for k in scalars] + [b[k][i] for k in lists for i in range(n)]
                    + ["; ".join(b["limit_flags"])])
    return rows
