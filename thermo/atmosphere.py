"""Site barometric pressure and elevation by the ISO 2533 standard atmosphere [1]_ [2]_.

:func:`standard_pressure` gives the pressure at a geopotential altitude and
:func:`standard_elevation` its inverse, both on the troposphere branch (−500 m to 11 000 m).
"""
from __future__ import annotations

__all__ = ["standard_pressure", "standard_elevation", "SEA_LEVEL_PRESSURE", "SEA_LEVEL_TEMPERATURE",
           "ELEVATION_MIN", "ELEVATION_MAX"]

from stagewright.core.errors import InputError

SEA_LEVEL_PRESSURE = 101_325.0  #: [Pa], ISO 2533
SEA_LEVEL_TEMPERATURE = 288.15  #: [K], ISO 2533
ELEVATION_MIN = -500.0  #: lowest geopotential altitude of the troposphere branch used here, [m]
ELEVATION_MAX = 11_000.0  #: tropopause, top of the troposphere branch, [m]
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
    if not ELEVATION_MIN <= elevation_m <= ELEVATION_MAX:
        raise InputError(field, elevation_m, "elevation must be within −500 m … 11 000 m")
    return SEA_LEVEL_PRESSURE * (1.0 - _LAPSE_RATE * elevation_m / SEA_LEVEL_TEMPERATURE) ** _EXPONENT


def standard_elevation(pressure_Pa: float, field: str = "site.barometric_pressure_Pa") -> float:
    r"""Geopotential altitude at which the ISO 2533 standard atmosphere has a given pressure [1]_ [2]_.

    The troposphere's pressure–altitude relation of :func:`standard_pressure` solved for
    the altitude, in closed form:

    .. math:: H = \frac{T_0}{L} \left[1 - \left(\frac{p}{p_0}\right)^{R L / g_0}\right]

    Parameters
    ----------
    pressure_Pa : float
        Static (barometric) pressure, [Pa].
    field : str
        Name of the input, used in the error message.

    Returns
    -------
    float
        Geopotential altitude above mean sea level, [m].

    Raises
    ------
    InputError
        If the pressure lies outside the troposphere branch used here, that is between
        the standard pressures at 11 000 m (22 632 Pa) and at −500 m (107 478 Pa); the
        message names ``field``, the value and that range.

    Notes
    -----
    Exact inverse of :func:`standard_pressure` on the same branch (p0 = 101 325 Pa,
    T0 = 288.15 K, L = 6.5 K/km, g0 = 9.806 65 m/s², R = 287.052 87 J/(kg K)); a round trip
    returns the altitude to rounding error (about 1e-9 m). It is the altitude a
    pressure-altitude scale assigns to a pressure: a site's real barometric pressure varies
    with the weather by a few per cent, that is by a few hundred metres of this altitude.

    Examples
    --------
    >>> round(standard_elevation(89_875.0))  # ISO 2533 table: 89 875 Pa at 1000 m
    1000
    >>> round(standard_elevation(standard_pressure(1234.5)), 9)
    1234.5

    References
    ----------
    .. [1] ISO 2533:1975, *Standard Atmosphere*. International Organization for
       Standardization, Geneva, 1975.
    .. [2] ICAO Doc 7488/3, *Manual of the ICAO Standard Atmosphere (extended to 80 kilometres
       (262 500 feet))*, 3rd ed., International Civil Aviation Organization, Montréal, 1993.
    """
    p_lo, p_hi = standard_pressure(ELEVATION_MAX), standard_pressure(ELEVATION_MIN)
    if not p_lo <= pressure_Pa <= p_hi:
        raise InputError(field, pressure_Pa, f"expected a pressure within {p_lo:.0f} Pa … {p_hi:.0f} Pa "
                                             "(the standard atmosphere from −500 m to 11 000 m)")
    return SEA_LEVEL_TEMPERATURE / _LAPSE_RATE * (1.0 - (pressure_Pa / SEA_LEVEL_PRESSURE) ** (1.0 / _EXPONENT))
