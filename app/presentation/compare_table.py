"""Presentation table of a comparison of cases: the figures that decide between options.

* :data:`CASE_FIGURES` — one row per figure, one column per case (paths into :func:`case_row`).
* :func:`case_row` — the plain-data row of one case (its result, its year, the hottest discharge).
* :func:`difference` / :func:`difference_text` — a case's figure against the reference case's, in
  display units (temperatures as differences, everything else also as a percentage).

The window's comparison view (:mod:`stagewright.gui.compare`), ``stagewright compare``'s text, JSON and CSV
(:mod:`stagewright.gui.cli.compare`) and the PDF report's comparison read them. No Qt.
"""
from __future__ import annotations

__all__ = ["CASE_FIGURES", "case_row", "difference", "difference_text", "flags"]

import math

from stagewright.gui.presentation.figures import Figure, Look

_KWH = 3.6e6  # J per kWh
_MONEY = {out: Look(quantity="money", decimals=0, symbol="") for out in ("window", "pdf", "text")}

#: the figures compared, in the order an engineer weighs options
CASE_FIGURES: tuple[Figure, ...] = (
    Figure("stage_count", "Stages", decimals=0),
    Figure("driver_power_W", "Driver input power", "power"),
    Figure("shaft_power_W", "Shaft power", "power"),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power"),
    Figure("free_air_delivery_m3_s", "Free air delivery", "volume_flow"),
    Figure("hottest_discharge_K", "Hottest discharge", "temperature", decimals=1,
           note="the highest stage discharge temperature"),
    Figure("heat_rejected_W", "Heat rejected", "heat_flow"),
    Figure("cooling_water_m3_s", "Cooling water", "water_volume_flow", when="any"),
    Figure("condensate_kg_s", "Condensate", "water_flow", when="moist"),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist"),
    Figure("isothermal_efficiency", "Isothermal efficiency", "fraction"),
    Figure("second_law_efficiency", "Second-law efficiency", "fraction"),
    Figure("exergy_destroyed_W", "Exergy destroyed", "power"),
    Figure("year_energy_kWh", "Energy per year", "energy", to_si=_KWH, when="any"),
    Figure("year_cost", "Cost per year", decimals=0, when="any", looks=_MONEY,
           note="energy and cooling water at the project's prices, less the value of recovered heat"),
)

#: quantities whose differences are not shown as a percentage (an offset scale: 0 °C is not "none")
_NO_PERCENT = {"temperature"}


def case_row(result: dict | None, year: dict | None = None) -> dict:
    """The row of one case: ``result`` (``TrainResult.to_dict()``) with the stage count, the
    hottest discharge and, when a year was run, its energy and cost. None: the case did not solve.

    Examples
    --------
    >>> row = case_row({"stages": [{"outlet": {"temperature_K": 400.0}}, {"outlet": {"temperature_K": 410.0}}]},
    ...                {"totals": {"energy_kWh": 1000.0, "cost": 120.0}})
    >>> row["stage_count"], row["hottest_discharge_K"], row["year_energy_kWh"], row["year_cost"]
    (2, 410.0, 1000.0, 120.0)
    """
    if result is None:
        return {}
    row = dict(result)
    row["stage_count"] = len(result.get("stages") or [])
    temps = [st["outlet"]["temperature_K"] for st in result.get("stages") or []]
    row["hottest_discharge_K"] = max(temps) if temps else None
    totals = (year or {}).get("totals") or {}
    row["year_energy_kWh"] = totals.get("energy_kWh")
    row["year_cost"] = totals.get("cost")
    return row


def _number(x) -> bool:
    return isinstance(x, (int, float)) and not isinstance(x, bool) and math.isfinite(x)


def difference(fig: Figure, row: dict, reference: dict) -> tuple[float, float | None] | None:
    """``(value − reference value, relative difference or None)`` in SI, or None when either is missing.
    The relative difference is left out for temperatures and for a zero reference."""
    a, b = fig.value(row), fig.value(reference)
    if not (_number(a) and _number(b)):
        return None
    rel = None if fig.quantity in _NO_PERCENT or b == 0 else (a - b) / abs(b)
    return (a - b) * fig.to_si, rel


def difference_text(fig: Figure, row: dict, reference: dict, output: str, system: str = "SI") -> str:
    """``+1.23 kW (+1.2 %)`` — a case's figure against the reference, in display units; ``""``
    when the values are equal at the shown precision or one is missing."""
    d = difference(fig, row, reference)
    if d is None:
        return ""
    delta, rel = d
    u = fig.unit_in(output, system)
    shown = delta / u.scale if fig.quantity else delta
    if round(shown, u.decimals) == 0:
        return ""
    text = f"{shown:+,.{u.decimals}f}".replace(",", " ").replace("-", "−")  # thousands grouped as in tables
    if fig.quantity == "temperature":  # a difference of temperatures is in kelvin (or °F), not °C
        text += " K" if system == "SI" else " °F"
    elif fig.quantity == "fraction":  # a difference of percentages is in percentage points
        text += " pts"
    elif u.symbol:
        text += f" {u.symbol}"
    if rel is not None:
        text += f" ({100.0 * rel:+.1f} %)".replace("-", "−")
    return text


def flags(result: dict | None, error: str = "") -> list[str]:
    """What a reader must see beside a case's figures: its error, its warnings' count, a limit hit."""
    if result is None:
        return [f"not solved: {error}"] if error else ["not solved"]
    out = []
    warnings = result.get("warnings") or []
    if warnings:
        out.append(f"{len(warnings)} warning{'s' if len(warnings) != 1 else ''}")
    return out
