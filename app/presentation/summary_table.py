"""Presentation tables of a report's first page: the answer a client reads before anything else.

* The train's key figures are :data:`stagewright.gui.presentation.balance_tables.KEY_FIGURES` (those shown in
  ``"pdf"``), the same table as the window's key-figures strip.
* :data:`SUMMARY_TRAIN` — one row per stage and per cooler (a path per row kind, ``"stage"`` or
  ``"cooler"``, into the stage or cooler dict).

The PDF report's first page (:mod:`stagewright.gui.report.summary`) reads them; the full balance sheet
follows on the next pages from :mod:`stagewright.gui.presentation.balance_tables`. A figure whose ``when``
does not hold (a dry intake has no dew point; a project without a coolant side has no cooling
water) is left out. No Qt.
"""
from __future__ import annotations

__all__ = ["SUMMARY_TRAIN"]

from stagewright.gui.presentation.figures import Figure


#: columns of the first page's stage and cooler table
SUMMARY_TRAIN: tuple[Figure, ...] = (
    Figure({"stage": "pressure_ratio"}, "Pressure ratio", "ratio", id="ratio", decimals=3),
    Figure({"stage": "outlet.pressure_Pa", "cooler": "outlet.pressure_Pa"}, "Pressure out", "pressure",
           id="pressure", gauge=True),
    Figure({"stage": "outlet.temperature_K", "cooler": "outlet.temperature_K"}, "Air out", "temperature",
           id="temperature", decimals=1),
    Figure({"stage": "shaft_power_W"}, "Shaft power", "power", id="power"),
    Figure({"cooler": "duty_W"}, "Cooler duty", "heat_flow", id="duty"),
    Figure({"cooler": "cooling_water_m3_s"}, "Cooling water", "water_volume_flow", id="cooling_water", when="any"),
    Figure({"cooler": "condensate_kg_s"}, "Condensate", "water_flow", id="condensate", when="moist"),
)
