"""Presentation tables of a report's first page: the answer a client reads before anything else.

* :data:`SUMMARY` — the train's key figures (paths into ``TrainResult.to_dict()``).
* :data:`SUMMARY_TRAIN` — one row per stage and per cooler (a path per row kind, ``"stage"`` or
  ``"cooler"``, into the stage or cooler dict).

The PDF report's first page (:mod:`app.report.summary`) reads them; the full balance sheet
follows on the next pages from :mod:`app.presentation.balance_tables`. A figure whose ``when``
does not hold (a dry intake has no dew point; a project without a coolant side has no cooling
water) is left out. No Qt.
"""
from __future__ import annotations

__all__ = ["SUMMARY", "SUMMARY_TRAIN"]

from app.presentation.figures import Figure

_L_H = 1e-3 / 3600.0  # m³/s per L/h

#: key figures of the train, in the order a client reads them
SUMMARY: tuple[Figure, ...] = (
    Figure("driver_power_W", "Driver input power", "power"),
    Figure("shaft_power_W", "Shaft power", "power"),
    Figure("specific_power_kW_per_m3_min", "Specific power", "specific_power",
           note="driver input power per unit of free air delivery"),
    Figure("free_air_delivery_m3_s", "Free air delivery", "volume_flow"),
    Figure("mass_flow_kg_s", "Mass flow", "mass_flow", note="of dry air"),
    Figure("heat_rejected_W", "Heat rejected", "heat_flow", note="by the coolers, the stage casings and the "
                                                                  "mechanical losses"),
    Figure("cooling_water_m3_s", "Cooling water", "water_volume_flow", when="any",
           note="through all coolers with a water or glycol side, at their inlets"),
    Figure("condensate_kg_s", "Condensate drained", "water_flow", when="moist"),
    Figure("condensate_L_h", "Condensate volume", "condensate_volume_flow", to_si=_L_H, when="moist"),
    Figure("delivered_pressure_dew_point_K", "Pressure dew point", "temperature", when="moist",
           note="of the delivered air, at the delivery pressure"),
    Figure("delivered_atmospheric_dew_point_K", "Atmospheric dew point", "temperature", when="moist",
           note="of the delivered air expanded to the site pressure"),
    Figure("iso8573_humidity_class", "ISO 8573-1 humidity class", style="text", when="moist"),
    Figure("recoverable_heat_W", "Recoverable heat", "heat_flow", when="any",
           note="at the heat recovery's delivery temperature"),
)

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
