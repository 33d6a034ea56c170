r"""A variable-speed drive's own losses, added to the motor's input.

Like the motor's (:mod:`.motor`), a constant share :math:`k_d` of the rated drive losses
:math:`L_{d,r} = P_{in,r}(1/\eta_d - 1)` and a share growing with the square of the load
(conduction losses follow the current):

.. math::  L_d(y) = L_{d,r}\,\bigl(k_d + (1 - k_d)\,y^2\bigr), \qquad y = P_{in} / P_{in,r}

The defaults :math:`\eta_d` = 0.97 and :math:`k_d` = 0.50 are common practice, no source; with
them the efficiency at 25–100 % load stays within 0.03 of the generic PWM drive table the
``fluids`` library carries (``fluids.pump.VFD_efficiency``, tests/test_part_load.py). IEC
61800-9-2 states reference losses of drive modules at set speed and torque points (not used
here: from memory).
"""
from __future__ import annotations

__all__ = ["drive_input"]


def drive_input(control: dict, rated_motor_input_W: float, motor_input_W: float) -> float:
    """Electrical input of the drive feeding ``motor_input_W`` [W].

    Parameters
    ----------
    control : dict
        ``package.control`` of kind ``variable_speed`` (``drive_efficiency``, ``drive_fixed_loss_share``).
    rated_motor_input_W : float
        The motor's input at its rated output [W], > 0.
    motor_input_W : float
        The motor's input [W].

    Returns
    -------
    float

    Examples
    --------
    >>> c = {"drive_efficiency": 0.97, "drive_fixed_loss_share": 0.3}
    >>> round(drive_input(c, 100.0, 100.0), 9) == round(100.0 / 0.97, 9)
    True
    """
    k = control["drive_fixed_loss_share"]
    y = motor_input_W / rated_motor_input_W
    rated_loss = rated_motor_input_W * (1.0 / control["drive_efficiency"] - 1.0)
    return motor_input_W + rated_loss * (k + (1.0 - k) * y * y)
