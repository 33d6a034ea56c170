"""Presentation tables of a train's heat recovery (``TrainResult.to_dict()["heat_recovery"]``).

* :data:`RECOVERY` — its figures (paths into the ``heat_recovery`` dict).
* :data:`RECOVERY_BY_STAGE` — one row per stage: what its cooler and its casing can give
  (paths into the rows of :func:`recovery_rows`).

The PDF report's heat-recovery section (:mod:`stagewright.gui.report.recovery_section`) reads them; the
train's recoverable heat is also a total of :mod:`stagewright.gui.presentation.balance_tables`. Money is in
the currency of the fuel price the user gave and is shown as a plain number. No Qt.
"""
from __future__ import annotations

__all__ = ["RECOVERY", "RECOVERY_BY_STAGE", "recovery_rows"]

from stagewright.gui.presentation.figures import Figure

_KWH = 3.6e6  # J per kWh

#: the heat recovery's figures, in reading order
RECOVERY: tuple[Figure, ...] = (
    Figure("delivery_temperature_K", "Delivery temperature", "temperature",
           note="temperature of the water or air the recovered heat is delivered in"),
    Figure("source_temperature_K", "Coldest useful air", "temperature",
           note="delivery temperature plus the approach: air below it gives no useful heat"),
    Figure("recoverable_heat_W", "Recoverable heat", "heat_flow"),
    Figure("share_of_driver_input", "Share of driver input power", "fraction"),
    Figure("operating_hours_per_year", "Operating hours per year", "hours"),
    Figure("heat_per_year_kWh", "Heat per year", "energy", to_si=_KWH),
    Figure("fuel_saved_per_year_kWh", "Boiler fuel saved per year", "energy", to_si=_KWH),
    Figure("value_per_year", "Value of the fuel saved per year", decimals=0,
           note="in the currency of the fuel price"),
)

#: columns of the per-stage table (rows from :func:`recovery_rows`)
RECOVERY_BY_STAGE: tuple[Figure, ...] = (
    Figure("cooler_W", "From the cooler", "heat_flow"),
    Figure("casing_W", "From the casing", "heat_flow"),
)


def recovery_rows(recovery: dict) -> list[tuple[int, dict]]:
    """``(stage number, {"cooler_W", "casing_W"})`` of every stage, first stage first."""
    coolers, casings = recovery.get("coolers_W") or [], recovery.get("casings_W") or []
    n = max(len(coolers), len(casings))
    pad = [None] * n
    return [(i + 1, {"cooler_W": c, "casing_W": k})
            for i, (c, k) in enumerate(zip((coolers + pad)[:n], (casings + pad)[:n]))]
