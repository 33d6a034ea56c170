"""Site barometric pressure from elevation by the ISO 2533 standard atmosphere [1]_."""
from __future__ import annotations

__all__ = ["standard_pressure", "SEA_LEVEL_PRESSURE", "SEA_LEVEL_TEMPERATURE"]

from thermo.errors import InputError

SEA_LEVEL_PRESSURE = 101_325.0  #: [Pa], ISO 2533
SEA_LEVEL_TEMPERATURE = 288.15  #: [K], ISO 2533
_LAPSE_RATE = 0.0065  # [K/m] troposphere, ISO 2533
_G0 = 9.80665  # [m/s²]
_R_AIR = 287.05287  # [J/(kg K)], ISO 2533 gas constant of air
_EXPONENT = _G0 / (_R_AIR * _LAPSE_RATE)  # 5.25588


def standard_pressure(elevation_m: float, field: str = "site.elevation_m") -> float:
    r"""Pressure of the ISO 2533 standard atmosphere at a geopotential altitude [1]_.

    .. math:: p = p_0 \left(1 - \frac{L H}{T_0}\right)^{g_0 / (R L)}

    Parameters
    ----------
    elevation_m : float
        Geopotential altitude above mean sea level, [m].
    field : str
        Name of the input, used in the error message.

    Returns
    -------
    float
        Static pressure of the standard atmosphere, [Pa].

    Raises
    ------
    InputError
        If the altitude lies outside the troposphere branch used here (−500 m to 11 000 m).

    Notes
    -----
    Troposphere branch of the standard atmosphere, valid from −500 m to 11 000 m
    geopotential altitude; p0 = 101 325 Pa, T0 = 288.15 K, L = 6.5 K/km. A real site's
    barometric pressure varies with weather by a few per cent; give the measured value
    where it is known.

    Examples
    --------
    >>> round(standard_pressure(1000.0))
    89875

    References
    ----------
    .. [1] ISO 2533:1975, *Standard Atmosphere*. International Organization for
       Standardization, Geneva, 1975.
    """
    if not -500.0 <= elevation_m <= 11_000.0:
        raise InputError(field, elevation_m, "elevation must be within −500 m … 11 000 m")
    return SEA_LEVEL_PRESSURE * (1.0 - _LAPSE_RATE * elevation_m / SEA_LEVEL_TEMPERATURE) ** _EXPONENT
