"""Cautions of moist air below 0 °C: frozen condensate in a cooler, rime on the intake [1]_ [2]_.

Compression warms the air, so stages never see ice; what a winter changes is the intake
and the coolers. A cooler whose air outlet is below the triple point while water condenses
(an air-cooled cooler at a frozen ambient, or a cold coolant) deposits the water as ice:
the exchanger, separator and drain would freeze. The solve goes on with the condensed
water as ice (saturation over ice, IAPWS 2011) and says so plainly; the remedy is freeze
protection (heated drain and separator) or a minimum air outlet temperature above 0 °C
(coolant bypass, louvres, a warmer coolant). Intake air holding more water than saturation
over ice deposits the excess as rime on the intake louvres and filter.
"""
from __future__ import annotations

__all__ = ["frozen_condensate_warning", "intake_rime_warning", "FREEZE_MARGIN_K"]

from stagewright.core.errors import message_detail, quantity
from stagewright.core.moist.saturation import T_TRIPLE
from stagewright.core.results import Warning_

#: outlet temperatures this close above the triple point still get the caution: a real cooler's
#: coldest surface and the drain line are colder than the mixed air outlet (common practice, no source)
FREEZE_MARGIN_K = 2.0


def frozen_condensate_warning(i: int, n: int, cooler, coolant_kind: str | None,
                              ambient_K: float) -> Warning_ | None:
    """The caution for cooler ``i`` (of ``n`` stages) when water condenses at an outlet near or below 0 °C.

    Parameters
    ----------
    i, n : int
        Stage index (0-based) and number of stages (the last cooler is the aftercooler).
    cooler : CoolerResult
        The solved cooler (its ``water`` and ``outlet``).
    coolant_kind : str or None
        ``air``, ``water``, ``glycol`` or None (no coolant side given).
    ambient_K : float
        Site ambient temperature, [K].

    Returns
    -------
    Warning_ or None
        None when no water condenses or the outlet is at least FREEZE_MARGIN_K above 0.01 °C.

    References
    ----------
    .. [1] IAPWS R14-08(2011), sublimation pressure of ice Ih (the saturation below 0.01 °C).
    """
    water = cooler.water
    t_out = cooler.outlet.T
    if water is None or water.condensate_kg_s <= 0.0 or t_out >= T_TRIPLE + FREEZE_MARGIN_K:
        return None
    name = "aftercooler" if i == n - 1 else f"intercooler {i + 1}"
    frozen = t_out < T_TRIPLE
    cause = (" (air-cooled at a frozen ambient {ambient})" if coolant_kind == "air" and ambient_K < T_TRIPLE else "")
    state = ("condensate forms as ice: the exchanger, separator and drain would freeze and block"
             if frozen else "condensate reaches the drain within a few kelvin of freezing")
    tail = ("; provide freeze protection (heated separator and drain) or hold a minimum air outlet "
            "temperature above 0 °C (coolant bypass, louvres or a warmer coolant)")
    template = "{name} air outlet {t}" + cause + ": " + state + tail
    values = {"name": name[:1].upper() + name[1:], "t": quantity(t_out, "temperature"),
              "ambient": quantity(ambient_K, "temperature")}
    plain = (f"{name} air outlet {t_out:.2f} K"
             + (f" (air-cooled at a frozen ambient {ambient_K:.2f} K)" if cause else "") + ": " + state + tail)
    return Warning_(f"stages[{i}].cooler", plain, message_detail(template, values))


def intake_rime_warning(frost_deposit: float, mass_flow: float, ambient_K: float) -> Warning_ | None:
    """The caution when sub-zero intake air holds more water than saturation over ice [2]_.

    Parameters
    ----------
    frost_deposit : float
        Water above saturation over ice, [kg/kg dry air]
        (:func:`stagewright.core.moist.stream.ice_supersaturation`).
    mass_flow : float
        Dry-air mass flow, [kg/s].
    ambient_K : float
        Site ambient temperature, [K].

    References
    ----------
    .. [2] D. M. Murphy, T. Koop, Q. J. R. Meteorol. Soc. 131 (2005) 1539–1565 (ice and
       supercooled water: saturation over ice lies below saturation over water below 0 °C).
    """
    if frost_deposit <= 0.0:
        return None
    rate = frost_deposit * mass_flow
    tail = (": it deposits as rime on the intake louvres and filter (the train takes in air saturated "
            "over ice); watch the filter pressure drop and provide intake heating or de-icing")
    plain = (f"intake air at {ambient_K:.2f} K holds {rate * 3600.0:.3f} kg/h more water than saturation "
             "over ice" + tail)
    detail = message_detail("Intake air at {t} holds {flow} more water than saturation over ice" + tail,
                            {"t": quantity(ambient_K, "temperature"), "flow": quantity(rate, "water_flow")})
    return Warning_("site.relative_humidity", plain, detail)
