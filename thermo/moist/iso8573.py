"""Compressed-air purity classes for water, ISO 8573-1:2010 [1]_."""
from __future__ import annotations

__all__ = ["PDP_CLASSES", "LIQUID_CLASSES", "REFERENCE_TEMPERATURE", "REFERENCE_PRESSURE", "humidity_class",
           "class_description"]

#: ISO 8573-1:2010 Table 3 (from memory; check against the standard before quoting a class in
#: a contract): class -> highest pressure dew point [K] (−70, −40, −20, +3, +7, +10 °C)
PDP_CLASSES = ((1, 203.15), (2, 233.15), (3, 253.15), (4, 276.15), (5, 280.15), (6, 283.15))

#: ISO 8573-1:2010 Table 3 (from memory): class -> highest liquid-water concentration [kg/m³]
#: (0.5, 5, 10 g/m³); above the last one the class is "X"
LIQUID_CLASSES = ((7, 0.5e-3), (8, 5.0e-3), (9, 10.0e-3))

#: ISO 8573-1 reference conditions for concentrations (from memory): 20 °C, 100 kPa, dry air
REFERENCE_TEMPERATURE = 293.15
REFERENCE_PRESSURE = 100_000.0


def humidity_class(pressure_dew_point_K: float | None, liquid_kg_m3: float) -> str:
    """ISO 8573-1 water class of delivered air [1]_.

    Parameters
    ----------
    pressure_dew_point_K : float or None
        Pressure dew point of the delivered air, [K]; None for air without water.
    liquid_kg_m3 : float
        Liquid water carried, per cubic metre of air at the reference conditions, [kg/m³].

    Returns
    -------
    str
        ``"1"`` … ``"6"`` by pressure dew point when there is no liquid water and the dew
        point is at most +10 °C; otherwise ``"7"`` … ``"9"`` by liquid-water concentration,
        or ``"X"`` above 10 g/m³. Class 0 (stricter than class 1, as specified by the user)
        is never assigned.

    Notes
    -----
    Classes 1–6 describe water vapour only, so air that carries liquid cannot meet them;
    saturated air without liquid (a perfect separator, no dryer) meets class 7.

    Examples
    --------
    >>> humidity_class(273.15, 0.0), humidity_class(303.15, 0.0), humidity_class(303.15, 0.02)
    ('4', '7', 'X')

    References
    ----------
    .. [1] ISO 8573-1:2010, *Compressed air — Part 1: Contaminants and purity classes*,
       International Organization for Standardization, Geneva, 2010, Table 3 (values here
       from memory).
    """
    if liquid_kg_m3 <= 0.0:
        if pressure_dew_point_K is None:
            return "1"
        for cls, limit in PDP_CLASSES:
            if pressure_dew_point_K <= limit:
                return str(cls)
    for cls, limit in LIQUID_CLASSES:
        if liquid_kg_m3 <= limit:
            return str(cls)
    return "X"


def class_description(cls: str) -> str:
    """One line saying what an ISO 8573-1 water class means."""
    for c, limit in PDP_CLASSES:
        if str(c) == cls:
            return f"ISO 8573-1 class {cls}: pressure dew point at most {limit - 273.15:+.0f} °C"
    for c, limit in LIQUID_CLASSES:
        if str(c) == cls:
            return f"ISO 8573-1 class {cls}: liquid water at most {limit * 1e3:g} g/m³"
    return "ISO 8573-1 class X: liquid water above 10 g/m³"
