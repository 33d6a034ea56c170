"""Saturation of water: vapour pressure over liquid water (IAPWS-IF97, supercooled: Murphy & Koop 2005)
and over ice (IAPWS 2011) [1]_ [2]_ [3]_.

Two saturation references are kept apart:

* :func:`vapour_pressure` — over the *stable* condensed phase: liquid water from the triple
  point 273.16 K up, ice Ih below (IAPWS R14-08(2011), Wagner, Riethmann, Feistel & Harvey,
  J. Phys. Chem. Ref. Data 40, 043103 (2011)). This is where moist air really saturates:
  condensation in a cooler, dew points (frost points below 0.01 °C), the enhancement factor
  of ASHRAE RP-1485 (which also switches to ice at 273.16 K).
* :func:`liquid_vapour_pressure` — over liquid water, supercooled below 0 °C. Relative
  humidity as meteorological data give it is relative to liquid water even below 0 °C
  (WMO-No. 8, *Guide to Instruments and Methods of Observation*, annex on humidity
  formulae; the annex's own Magnus-type formula is not used here — detail from memory), so
  the site's relative humidity is converted with this one.

References
----------
.. [1] IAPWS R7-97(2012), *Revised Release on the IAPWS Industrial Formulation 1997*.
.. [2] IAPWS R14-08(2011); W. Wagner, T. Riethmann, R. Feistel, A. H. Harvey, "New equations
   for the sublimation pressure and melting pressure of H2O ice Ih", J. Phys. Chem. Ref. Data
   40 (2011) 043103.
.. [3] D. M. Murphy, T. Koop, "Review of the vapour pressures of ice and supercooled water for
   atmospheric applications", Q. J. R. Meteorol. Soc. 131 (2005) 1539–1565, eq. (10).
"""
from __future__ import annotations

__all__ = ["saturation_pressure", "saturation_pressure_log_slope", "saturation_temperature", "sublimation_pressure", "vapour_pressure",
           "vapour_pressure_log_slope", "supercooled_vapour_pressure", "liquid_vapour_pressure",
           "dew_point_from_vapour_pressure", "T_TRIPLE", "P_TRIPLE", "T_CRITICAL", "P_CRITICAL", "T_IF97_MIN"]

import math

T_TRIPLE = 273.16  #: triple point of water, [K] (IAPWS)
P_TRIPLE = 611.657  #: triple-point pressure, [Pa] (IAPWS R14-08)
T_CRITICAL = 647.096  #: critical temperature, [K] (IAPWS-IF97)
P_CRITICAL = 22.064e6  #: critical pressure, [Pa] (IAPWS-IF97)
T_IF97_MIN = 273.15  #: lower end of the IF97 saturation line, [K]

# IAPWS-IF97, region 4, Table 34: coefficients n1 … n10 of the saturation-line equation
_N = (0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.12020824702470e5,
      -0.32325550322333e7, 0.14915108613530e2, -0.48232657361591e4, 0.40511340542057e6,
      -0.23855557567849, 0.65017534844798e3)

# IAPWS R14-08(2011), sublimation pressure of ice Ih, eq. (6): a_i, b_i
_A_SUB = (-0.212144006e2, 0.273203819e2, -0.610598130e1)
_B_SUB = (0.333333333e-2, 0.120666667e1, 0.170333333e1)

# Murphy & Koop (2005) eq. (10): vapour pressure over (supercooled) liquid water, 123 K to 332 K
_MK = (54.842763, -6763.22, -4.210, 0.000367, 0.0415, 218.8, 53.878, -1331.22, -9.44523, 0.014025)
T_SUPERCOOLED_MIN = 123.0  #: lower end of Murphy & Koop eq. (10), [K]


def saturation_pressure(T: float) -> float:
    r"""Saturation pressure of liquid water, IAPWS-IF97 region 4, eq. (30) [1]_.

    .. math::

        \vartheta = T + \frac{n_9}{T - n_{10}}, \quad
        \frac{p_s}{1\,\mathrm{MPa}} = \left[\frac{2C}{-B + \sqrt{B^2 - 4AC}}\right]^4

    with :math:`A = \vartheta^2 + n_1\vartheta + n_2`, :math:`B = n_3\vartheta^2 + n_4\vartheta + n_5`,
    :math:`C = n_6\vartheta^2 + n_7\vartheta + n_8`.

    Parameters
    ----------
    T : float
        Temperature, [K]; the equation holds from 273.15 K to the critical point 647.096 K.

    Returns
    -------
    float
        Saturation pressure, [Pa].

    Notes
    -----
    Closed form, no iteration; the caller keeps T inside the range (the equation is smooth
    a little outside it). The backward equation :func:`saturation_temperature` is its exact
    algebraic inverse.

    Examples
    --------
    >>> round(saturation_pressure(300.0) / 1e6, 11)  # IAPWS R7-97 Table 35: 0.353658941e-2 MPa
    0.00353658941

    References
    ----------
    .. [1] IAPWS R7-97(2012), *Revised Release on the IAPWS Industrial Formulation 1997 for the
       Thermodynamic Properties of Water and Steam*, International Association for the
       Properties of Water and Steam, 2012, §8.1, eq. (30), Tables 34–35.
    """
    n = _N
    th = T + n[8] / (T - n[9])
    a = th * th + n[0] * th + n[1]
    b = n[2] * th * th + n[3] * th + n[4]
    c = n[5] * th * th + n[6] * th + n[7]
    return (2.0 * c / (-b + math.sqrt(b * b - 4.0 * a * c))) ** 4 * 1.0e6


def saturation_pressure_log_slope(T: float) -> float:
    r"""d ln p_s / dT of the IF97 saturation line, [1/K], exact to rounding (complex-step derivative [1]_).

    .. math:: \frac{d\ln p_s}{dT} = \frac{\operatorname{Im}\,\ln p_s(T + i h)}{h}, \qquad h = 10^{-20}\,\mathrm{K}

    Parameters
    ----------
    T : float
        Temperature, [K], 273.15 K to 647.096 K.

    Returns
    -------
    float
        Logarithmic slope of the saturation pressure, [1/K].

    References
    ----------
    .. [1] J. R. R. A. Martins, P. Sturdza, J. J. Alonso, "The complex-step derivative
       approximation", ACM Trans. Math. Software 29 (2003) 245–262; eq. (30) of IAPWS R7-97(2012).
    """
    n = _N
    h = 1e-20
    Tc = complex(T, h)
    th = Tc + n[8] / (Tc - n[9])
    a = th * th + n[0] * th + n[1]
    b = n[2] * th * th + n[3] * th + n[4]
    c = n[5] * th * th + n[6] * th + n[7]
    beta = 2.0 * c / (-b + (b * b - 4.0 * a * c) ** 0.5)
    return (4.0 * (beta.imag / beta.real)) / h


def saturation_temperature(p: float) -> float:
    r"""Saturation temperature of water at pressure p, IAPWS-IF97 region 4, eq. (31) [1]_.

    .. math::

        \beta = (p / 1\,\mathrm{MPa})^{1/4}, \quad
        T_s = \tfrac12\left[n_{10} + D - \sqrt{(n_{10} + D)^2 - 4(n_9 + n_{10} D)}\right]

    with :math:`D = 2G/(-F - \sqrt{F^2 - 4EG})`, :math:`E = \beta^2 + n_3\beta + n_6`,
    :math:`F = n_1\beta^2 + n_4\beta + n_7`, :math:`G = n_2\beta^2 + n_5\beta + n_8`.

    Parameters
    ----------
    p : float
        Pressure, [Pa]; 611.213 Pa to 22.064 MPa.

    Returns
    -------
    float
        Saturation temperature, [K].

    Examples
    --------
    >>> round(saturation_temperature(0.1e6), 6)  # IAPWS R7-97 Table 36: 0.372755919e3 K
    372.755919

    References
    ----------
    .. [1] IAPWS R7-97(2012), §8.2, eq. (31), Table 36.
    """
    n = _N
    beta = (p / 1.0e6) ** 0.25
    e = beta * beta + n[2] * beta + n[5]
    f = n[0] * beta * beta + n[3] * beta + n[6]
    g = n[1] * beta * beta + n[4] * beta + n[7]
    d = 2.0 * g / (-f - math.sqrt(f * f - 4.0 * e * g))
    return 0.5 * (n[9] + d - math.sqrt((n[9] + d) ** 2 - 4.0 * (n[8] + n[9] * d)))


def sublimation_pressure(T: float) -> float:
    r"""Vapour pressure over ice Ih, IAPWS R14-08(2011) eq. (6) [1]_.

    .. math:: \ln\frac{p_\mathrm{subl}}{p_t} = \vartheta^{-1} \sum_{i=1}^{3} a_i \vartheta^{b_i},
       \qquad \vartheta = T / T_t

    Parameters
    ----------
    T : float
        Temperature, [K]; 50 K to 273.16 K.

    Returns
    -------
    float
        Sublimation pressure, [Pa].

    Notes
    -----
    The saturation of moist air below the triple point (:func:`vapour_pressure`): frost
    points, and the condensed water of a cooler whose outlet is below 0.01 °C (ice).

    Examples
    --------
    >>> round(sublimation_pressure(230.0) / 1e6, 15)  # IAPWS R14-08 Table 3: 8.947352740e-6 MPa
    8.94735274e-06

    References
    ----------
    .. [1] IAPWS R14-08(2011), *Revised Release on the Pressure along the Melting and
       Sublimation Curves of Ordinary Water Substance*, International Association for the
       Properties of Water and Steam, 2011, eq. (6) and Table 3.
    """
    th = T / T_TRIPLE
    return P_TRIPLE * math.exp(sum(a * th ** b for a, b in zip(_A_SUB, _B_SUB)) / th)


def vapour_pressure(T: float) -> float:
    """Saturation pressure of water vapour over the stable condensed phase, [Pa] [1]_ [2]_.

    Over liquid water from the triple point 273.16 K up (IF97; it reproduces the triple-point
    pressure 611.657 Pa to 1e-8 Pa), over ice Ih below (IAPWS 2011), as ASHRAE RP-1485 does.

    Parameters
    ----------
    T : float
        Temperature, [K], 50 K up to the critical temperature.

    Examples
    --------
    >>> round(vapour_pressure(250.0), 4)  # over ice: IAPWS R14-08(2011) eq. (6)
    76.0127

    References
    ----------
    .. [1] IAPWS R7-97(2012), eq. (30).
    .. [2] IAPWS R14-08(2011), eq. (6).
    """
    return saturation_pressure(T) if T >= T_TRIPLE else sublimation_pressure(T)


def vapour_pressure_log_slope(T: float) -> float:
    r"""d ln p / dT of :func:`vapour_pressure`, [1/K]: IF97 from 273.16 K, ice below.

    Below the triple point, from IAPWS R14-08(2011) eq. (6),
    :math:`d\ln p/dT = \frac{1}{T_t}\sum_i a_i (b_i - 1)\,\vartheta^{b_i - 2}`.

    Parameters
    ----------
    T : float
        Temperature, [K].

    References
    ----------
    .. [1] IAPWS R14-08(2011), eq. (6).
    """
    if T >= T_TRIPLE:
        return saturation_pressure_log_slope(T)
    th = T / T_TRIPLE
    return sum(a * (b - 1.0) * th ** (b - 2.0) for a, b in zip(_A_SUB, _B_SUB)) / T_TRIPLE


def supercooled_vapour_pressure(T: float) -> float:
    r"""Vapour pressure over (supercooled) liquid water, Murphy & Koop (2005) eq. (10) [1]_.

    .. math::

        \ln\frac{p}{\mathrm{Pa}} = 54.842763 - \frac{6763.22}{T} - 4.210\ln T + 0.000367\,T
        + \tanh\{0.0415\,(T - 218.8)\}\left(53.878 - \frac{1331.22}{T} - 9.44523\ln T
        + 0.014025\,T\right)

    with T in kelvin.

    Parameters
    ----------
    T : float
        Temperature, [K]; the equation holds from 123 K to 332 K.

    Returns
    -------
    float
        Vapour pressure over a plane surface of liquid water, [Pa].

    Notes
    -----
    At 273.15 K it agrees with IF97 to 3e-8 relative, so :func:`liquid_vapour_pressure`
    is continuous where it hands over; at 240 K it lies 0.14 % below CoolProp's IAPWS-95
    continued into the supercooled region (tests/test_moist_saturation.py).

    Examples
    --------
    >>> round(supercooled_vapour_pressure(263.15), 2)
    286.45

    References
    ----------
    .. [1] D. M. Murphy, T. Koop, "Review of the vapour pressures of ice and supercooled water
       for atmospheric applications", Q. J. R. Meteorol. Soc. 131 (2005) 1539–1565, eq. (10).
    """
    c = _MK
    ln_t = math.log(T)
    return math.exp(c[0] + c[1] / T + c[2] * ln_t + c[3] * T
                    + math.tanh(c[4] * (T - c[5])) * (c[6] + c[7] / T + c[8] * ln_t + c[9] * T))


def liquid_vapour_pressure(T: float) -> float:
    """Vapour pressure over liquid water, supercooled below 0 °C, [Pa] [1]_ [2]_.

    The reference of relative humidity as meteorological data give it (WMO-No. 8: relative
    to water even below 0 °C). IF97 from 273.15 K, Murphy & Koop (2005) below.

    Parameters
    ----------
    T : float
        Temperature, [K], 123 K up to the critical temperature.

    References
    ----------
    .. [1] IAPWS R7-97(2012), eq. (30).
    .. [2] D. M. Murphy, T. Koop, Q. J. R. Meteorol. Soc. 131 (2005) 1539–1565, eq. (10).
    """
    return saturation_pressure(T) if T >= T_IF97_MIN else supercooled_vapour_pressure(T)


def dew_point_from_vapour_pressure(p_v: float) -> float:
    r"""Temperature at which water vapour of partial pressure p_v saturates, [K] [1]_ [2]_.

    From the triple-point pressure (611.657 Pa) up this is the IF97 backward equation;
    below, the frost point over ice (the inverse of :func:`vapour_pressure`), found by Newton's method on the IAPWS 2011
    sublimation equation (with its exact d ln p / dT).

    Parameters
    ----------
    p_v : float
        Partial pressure of the vapour, [Pa]; above 1e-6 Pa (frost point near 130 K) and
        below the critical pressure.

    Returns
    -------
    float
        Dew point (or frost point), [K].

    References
    ----------
    .. [1] IAPWS R7-97(2012), eq. (31).
    .. [2] IAPWS R14-08(2011), eq. (6).
    """
    if p_v >= P_TRIPLE:
        return saturation_temperature(p_v)
    target = math.log(p_v / P_TRIPLE)
    T = 260.0
    for _ in range(50):  # ln(p/p_t) = Σ a θ^(b−1), so d/dT = Σ a (b−1) θ^(b−2) / T_t (exact slope)
        th = T / T_TRIPLE
        f = sum(a * th ** (b - 1.0) for a, b in zip(_A_SUB, _B_SUB)) - target
        slope = sum(a * (b - 1.0) * th ** (b - 2.0) for a, b in zip(_A_SUB, _B_SUB)) / T_TRIPLE
        step = f / slope
        T = max(T - step, 0.5 * T)
        if abs(step) < 1e-10:
            break
    return T
