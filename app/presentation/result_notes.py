"""Plain-language notes on result figures that readers often take for errors (Qt-free).

One wording for the balance sheet's tooltips and the report's notes.
"""
from __future__ import annotations

__all__ = ["TOTAL_TIPS", "NEGATIVE_TIPS", "negative_notes"]

from stagewright.gui.presentation.units import NORMAL_VOLUME_NOTE

#: tooltips of the totals' labels: what the figure is
TOTAL_TIPS = {
    "normal_volume_flow_m3_s": NORMAL_VOLUME_NOTE,
    "free_air_delivery_m3_s": "Free air delivery: the delivered flow as a volume at the site's intake state "
                              "(ambient temperature, barometric pressure and humidity), ISO 1217.",
    "heat_exergy_W": "Exergy carried away by the heat the train rejects: Q\u00b7(1 \u2212 T0/Tb) for heat Q leaving "
                     "at boundary temperature Tb, with T0 the site ambient. Heat rejected at ambient carries none.",
}
#: tooltips of the totals' values when negative: why that is not an error
NEGATIVE_TIPS = {
    "heat_exergy_W": "Negative because heat leaves below the site ambient temperature (a coolant colder than "
                     "ambient). Heat rejected below ambient carries negative exergy: the cold coolant gives "
                     "exergy to the train rather than receiving any, so this is expected, not an error.",
}


def negative_notes(result: dict) -> list[str]:
    """The notes of :data:`NEGATIVE_TIPS` whose total is negative in ``result`` (a solve's ``to_dict()``)."""
    return [text for key, text in NEGATIVE_TIPS.items() if (result.get(key) or 0.0) < 0.0]
