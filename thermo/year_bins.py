"""The project of one operating bin, built from the year's normalised project without copying it.

A year solves the project once per bin. Copying the whole document per bin (it holds the
profile, up to 8784 bins) made a year's time grow with the square of its bins; here the
normalised project is taken apart once (:func:`year_base`, the project without its ``year``)
and each bin gets new dicts only for what it changes — the site, the flow and the coolers it
touches (:func:`norm_for_bin`). Everything else is shared, read-only, with the base.
"""
from __future__ import annotations

__all__ = ["year_base", "norm_for_bin", "rated_cooler_spec", "cooler_for_bin"]

from stagewright.core.year_profile import Bin


def year_base(norm: dict) -> dict:
    """The normalised project without its ``year`` section (a shallow copy; nothing else copied)."""
    return {k: v for k, v in norm.items() if k != "year"}


def rated_cooler_spec(spec: dict, ua_W_K: float, coolant_flow_kg_s: float, start=None) -> dict:
    """A cooler entry rated at a fixed UA with a fixed coolant flow (the installed exchanger).

    The air outlet is then a result of the rating (:func:`stagewright.core.exchanger.rate_exchanger`);
    the coolant flow is the design flow (a pump or fan at fixed speed), so the coolant's
    outlet temperature moves with the bin's coolant inlet and duty.

    Parameters
    ----------
    spec : dict
        Normalised cooler entry with a ``coolant``.
    ua_W_K : float
        Overall conductance to rate with, [W/K].
    coolant_flow_kg_s : float
        Coolant mass flow, [kg/s].
    start : RatingStart, optional
        Where this cooler's rating in the previous bin settled (:class:`stagewright.core.exchanger.rating.RatingStart`,
        kept under the entry's private key ``rating_start``): the rating starts there. Not part of
        the project format; it changes how fast the rating settles, not its answer.
    """
    coolant = {**spec["coolant"], "flow_kg_s": coolant_flow_kg_s, "temperature_rise_K": None}
    out = {**spec, "outlet_temperature_K": None, "approach_K": None, "ua_W_K": ua_W_K, "coolant": coolant}
    if start is not None:
        out["rating_start"] = start
    return out


def cooler_for_bin(spec: dict, b: Bin) -> dict:
    """The cooler entry in bin ``b``: an air coolant takes the bin's ambient, water and glycol the
    bin's coolant inlet temperature when it gives one."""
    kind = (spec.get("coolant") or {}).get("kind")
    if kind == "air":
        return {**spec, "coolant_inlet_temperature_K": None} if spec.get("coolant_inlet_temperature_K") else spec
    if b.coolant_inlet_temperature_K is not None and (kind is not None or spec.get("coolant_inlet_temperature_K")
                                                     is not None):
        return {**spec, "coolant_inlet_temperature_K": b.coolant_inlet_temperature_K}
    return spec


def norm_for_bin(base: dict, b: Bin, rating: list | None = None, starts: list | None = None) -> dict:
    """The normalised project of bin ``b``: its ambient, humidity, load and coolant temperatures.

    Parameters
    ----------
    base : dict
        :func:`year_base` of the normalised project.
    b : Bin
        The operating bin.
    rating : list, optional
        Per stage, ``(ua_W_K, coolant_flow_kg_s)`` of a cooler rated at a fixed UA, or None
        where the cooler keeps its entry (design once, rate every bin: :mod:`stagewright.core.year_design`).
    starts : list, optional
        Per stage, the :class:`~stagewright.core.exchanger.rating.RatingStart` of a rated cooler (the
        previous bin's rating, to start from), or None.

    Returns
    -------
    dict
        A normalised project sharing every unchanged part with ``base`` (do not modify it).

    Notes
    -----
    The bin's relative humidity replaces the site's humidity input (a dew point or humidity
    ratio of the site is dropped). Load scales the flow value (mass, volume or shaft power).

    Examples
    --------
    >>> base = {"site": {"ambient_temperature_K": 293.15, "relative_humidity": 0.0}, "flow": {"kind": "mass",
    ...         "value": 2.0}, "stages": [{"cooler": None}]}
    >>> d = norm_for_bin(base, Bin("b", 280.0, 0.5, 10.0, 0.5))
    >>> d["site"]["ambient_temperature_K"], d["flow"]["value"], base["flow"]["value"]
    (280.0, 1.0, 2.0)
    """
    d = dict(base)
    d["site"] = {**base["site"], "ambient_temperature_K": b.temperature_K, "relative_humidity": b.relative_humidity,
                 "dew_point_K": None, "humidity_ratio": None}
    d["flow"] = {**base["flow"], "value": base["flow"]["value"] * b.load}
    stages = []
    for i, st in enumerate(base["stages"]):
        spec = st.get("cooler")
        if not spec:
            stages.append(st)
            continue
        new = cooler_for_bin(spec, b)
        if rating is not None and rating[i] is not None:
            new = rated_cooler_spec(new, *rating[i], start=None if starts is None else starts[i])
        stages.append(st if new is spec else {**st, "cooler": new})
    d["stages"] = stages
    return d
