r"""Log-mean temperature difference and its correction factor [1]_ [2]_."""
from __future__ import annotations

__all__ = ["log_mean", "counterflow_lmtd", "correction_factor"]

import math

from stagewright.core.errors import InputError
from stagewright.core.exchanger.effectiveness import ntu_from_effectiveness


def log_mean(dt1: float, dt2: float, field: str = "temperature difference") -> float:
    r"""Logarithmic mean of two positive temperature differences [1]_.

    .. math:: \Delta T_\mathrm{lm} = \frac{\Delta T_1 - \Delta T_2}{\ln(\Delta T_1/\Delta T_2)}

    Evaluated as :math:`\Delta T_2\,x/\ln(1+x)` with :math:`x = \Delta T_1/\Delta T_2 - 1`,
    which is exact and tends smoothly to :math:`\Delta T_2` when the two are equal.

    Parameters
    ----------
    dt1, dt2 : float
        Terminal temperature differences, [K].
    field : str
        Input path named in the error.

    Returns
    -------
    float
        Log-mean temperature difference, [K].

    Raises
    ------
    InputError
        If either difference is not positive (the temperatures touch or cross).

    Examples
    --------
    >>> round(log_mean(60.0, 20.0), 4)  # 40 / ln 3
    36.4096
    >>> log_mean(15.0, 15.0)
    15.0

    References
    ----------
    .. [1] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat
       and Mass Transfer*, 6th ed., Wiley, 2007, §11.3, eq. 11.15.
    """
    if not (dt1 > 0.0 and dt2 > 0.0):
        raise InputError(field, (dt1, dt2), "both terminal temperature differences must be above "
                                            "0 K; the stream temperatures touch or cross")
    x = dt1 / dt2 - 1.0
    if x == 0.0:
        return dt2
    return dt2 * x / math.log1p(x)


def counterflow_lmtd(t_hot_in: float, t_hot_out: float, t_cold_in: float, t_cold_out: float,
                     field: str = "temperature difference") -> float:
    r"""Counter-flow log-mean temperature difference of four terminal temperatures [1]_.

    .. math:: \Delta T_1 = T_{h,i} - T_{c,o}, \qquad \Delta T_2 = T_{h,o} - T_{c,i}

    Parameters
    ----------
    t_hot_in, t_hot_out : float
        Hot-stream (compressed air) inlet and outlet temperatures, [K].
    t_cold_in, t_cold_out : float
        Coolant inlet and outlet temperatures, [K].
    field : str
        Input path named in the error.

    Returns
    -------
    float
        Log-mean temperature difference, [K].

    Raises
    ------
    InputError
        If a terminal difference is not positive.

    Examples
    --------
    >>> round(counterflow_lmtd(420.0, 305.0, 295.0, 330.0), 4)  # ΔT1 = 90, ΔT2 = 10
    36.4096
    """
    return log_mean(t_hot_in - t_cold_out, t_hot_out - t_cold_in, field)


def correction_factor(arrangement: str, eps: float, cr: float, hot_is_cmin: bool = True) -> float:
    r"""LMTD correction factor F of an arrangement, from its ε–NTU relation [1]_ [2]_.

    With :math:`\dot Q = UA\,F\,\Delta T_\mathrm{lm,cf}` and
    :math:`\dot Q = \varepsilon C_\min \Delta T_\max`, the counter-flow exchanger with the
    same terminal temperatures needs :math:`N_\mathrm{cf}` transfer units, so

    .. math:: F = \frac{N_\mathrm{cf}(\varepsilon, C_r)}{N(\varepsilon, C_r)}

    which for the 1-2 shell-and-tube exchanger is the closed form of Bowman, Mueller and
    Nagle [2]_ (checked against it and against Fakheri's form in the tests).

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    eps : float
        Effectiveness, [-].
    cr : float
        Capacity-rate ratio, [-].
    hot_is_cmin : bool
        Whether the compressed air has the smaller capacity rate.

    Returns
    -------
    float
        Correction factor in (0, 1], [-]; exactly 1 for counter-flow.

    Raises
    ------
    InputError
        If the effectiveness is out of reach of the arrangement.

    Examples
    --------
    >>> correction_factor("counter_flow", 0.6, 0.5)
    1.0
    >>> round(correction_factor("shell_and_tube_1_2", 0.5, 0.8), 4)
    0.8769

    References
    ----------
    .. [2] R. A. Bowman, A. C. Mueller, W. M. Nagle, "Mean temperature difference in design",
       Trans. ASME 62 (1940) 283–294.
    """
    if arrangement == "counter_flow" or eps == 0.0:
        return 1.0
    n = ntu_from_effectiveness(arrangement, eps, cr, hot_is_cmin)
    return ntu_from_effectiveness("counter_flow", eps, cr, hot_is_cmin) / n
