r"""Design once, rate every bin: coolers sized at one design condition, then rated at fixed UA.

A plant's coolers are bought once. With ``year.coolers.mode = "design_once"`` each cooler that
has a coolant side is sized at the design condition — the site as the project states it, or
the year's hottest bin — for the outlet its entry asks for (outlet temperature, or coolant
inlet plus approach). Its installed conductance is the sized UA plus a fouling margin,

.. math:: UA_\mathrm{rated} = (1 + m)\,UA_\mathrm{design},

and every bin is then *rated* with that UA and the design coolant flow (a pump or fan at fixed
speed) by the ε–NTU method (:func:`stagewright.core.exchanger.rate_exchanger`; wet zones where the air
condenses): the air outlet, duty, coolant outlet and condensate move with the bin's coolant
and ambient temperatures and its load, as they do in a real plant. The default margin
m = 0.10 is common practice, no source (fouling allowances of 10–25 % on UA or area are
usual; TEMA lists fouling resistances rather than margins — from memory); m = 0 rates an
exchanger exactly at its design UA (end of a cleaning interval, fully fouled).

Bins where a rated cooler's air leaves warmer than at the design condition, or where the air
reaching the dryer (the delivered air) is warmer than ``max_dryer_inlet_temperature_K``, are
flagged (:func:`limit_flags`).

References
----------
.. [1] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat and
   Mass Transfer*, 6th ed., Wiley, 2007, §11.4–11.5 (sizing and rating with ε–NTU).
.. [2] Standards of the Tubular Exchanger Manufacturers Association, 9th ed., TEMA, 2007,
   §RGP-T-2.4 (fouling resistances) — section number from memory.
"""
from __future__ import annotations

__all__ = ["CoolerDesign", "YearDesign", "design_coolers", "limit_flags", "DEFAULT_UA_MARGIN"]

from dataclasses import dataclass

from stagewright.core.year_bins import norm_for_bin
from stagewright.core.year_profile import Bin

DEFAULT_UA_MARGIN = 0.10  #: fouling margin on UA (common practice, no source)
#: a rated outlet this close to its design outlet still meets it, [K]: above the year's fast-path rating
#: tolerance (stagewright.core.year.FAST_RATING_RTOL, 3e-4 K at 300 K), far below any limit's meaning
_OUTLET_TOLERANCE_K = 1e-3


@dataclass(frozen=True)
class CoolerDesign:
    """One cooler as designed (SI units)."""

    stage: int  #: stage the cooler follows, counted from 1
    design_ua_W_K: float  #: UA sized at the design condition
    rated_ua_W_K: float  #: UA every bin is rated with (design UA plus the fouling margin)
    coolant_flow_kg_s: float  #: coolant flow at the design condition, kept in every bin
    design_outlet_temperature_K: float  #: air outlet at the design condition
    design_duty_W: float

    def to_dict(self) -> dict:
        """Plain data (JSON-ready)."""
        return dict(self.__dict__)


@dataclass(frozen=True)
class YearDesign:
    """The design condition and the coolers sized at it; ``coolers[i]`` None where stage i's cooler
    keeps its own entry (no cooler, no coolant side, or already rated from ``ua_W_K``)."""

    condition: str  #: "site" or "hottest_bin"
    bin_label: str | None  #: the design bin (None for the site)
    temperature_K: float  #: ambient at the design condition
    ua_margin: float
    coolers: tuple

    def rating(self) -> list:
        """Per stage ``(UA, coolant flow)`` to rate with, or None (:func:`stagewright.core.year_bins.norm_for_bin`)."""
        return [None if c is None else (c.rated_ua_W_K, c.coolant_flow_kg_s) for c in self.coolers]

    def to_dict(self) -> dict:
        """Plain data (JSON-ready)."""
        return {"condition": self.condition, "bin": self.bin_label, "temperature_K": self.temperature_K,
                "ua_margin": self.ua_margin, "coolers": [None if c is None else c.to_dict() for c in self.coolers]}


def design_coolers(base: dict, bins: list, settings: dict, solve_fn) -> YearDesign:
    """Size the coolers once, at the design condition of ``settings``.

    Parameters
    ----------
    base : dict
        The normalised project without its year (:func:`stagewright.core.year_bins.year_base`).
    bins : list of Bin
        The year's operating bins (the hottest is the design bin of ``"hottest_bin"``).
    settings : dict
        Normalised ``year.coolers`` (``design_condition``, ``ua_margin``).
    solve_fn : callable
        ``solve_fn(norm) -> TrainResult``: the same solve the bins use, so that the design bin
        rated at its own condition reproduces the sized result.

    Returns
    -------
    YearDesign

    Raises
    ------
    StagewrightError
        When the project cannot be solved at the design condition.
    """
    if settings["design_condition"] == "hottest_bin":
        hottest = max(bins, key=lambda b: b.temperature_K)
        norm, label, t_design = norm_for_bin(base, hottest), hottest.label, hottest.temperature_K
    else:
        norm, label, t_design = base, None, base["site"]["ambient_temperature_K"]
    res = solve_fn(norm)
    margin = settings["ua_margin"]
    coolers = []
    for i, c in enumerate(res.coolers):
        spec = norm["stages"][i].get("cooler")
        if c is None or c.exchanger is None or spec.get("ua_W_K") is not None:
            coolers.append(None)
            continue
        ua = c.exchanger.ua_W_K
        coolers.append(CoolerDesign(i + 1, ua, ua * (1.0 + margin), c.exchanger.coolant.flow_kg_s, c.outlet.T,
                                    c.duty_W))
    return YearDesign(settings["design_condition"], label, t_design, margin, tuple(coolers))


def _name(i: int, n: int) -> str:
    return "aftercooler" if i == n - 1 else f"intercooler {i + 1}"


def limit_flags(b: Bin, result, design: YearDesign | None, max_dryer_inlet_K: float | None) -> list:
    """Where bin ``b``'s train misses a stated limit: plain SI sentences (empty when it meets them all).

    A rated cooler misses its design when its air leaves warmer than it did at the design
    condition (its design outlet temperature) by more than 1e-3 K (above the year's fast-path
    rating tolerance); the air reaching the dryer (the delivered air) misses ``max_dryer_inlet_K``
    when it is warmer.

    Parameters
    ----------
    b : Bin
        The bin.
    result : TrainResult
        The bin's solve.
    design : YearDesign or None
        The coolers' design (None: every bin sized afresh, so every cooler meets its entry).
    max_dryer_inlet_K : float or None
        Highest temperature of the air reaching the dryer, [K].
    """
    flags = []
    n = len(result.stages)
    if design is not None:
        for i, c in enumerate(result.coolers):
            d = design.coolers[i]
            if c is None or d is None or c.outlet.T <= d.design_outlet_temperature_K + _OUTLET_TOLERANCE_K:
                continue
            flags.append(f"{_name(i, n)} leaves at {c.outlet.T:.2f} K, above its design outlet "
                         f"{d.design_outlet_temperature_K:.2f} K")
    if max_dryer_inlet_K is not None and result.delivery.T > max_dryer_inlet_K:
        flags.append(f"air reaches the dryer at {result.delivery.T:.2f} K, above the stated "
                     f"{max_dryer_inlet_K:.2f} K")
    return flags
