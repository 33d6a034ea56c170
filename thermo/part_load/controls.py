"""One entry point for every capacity control: the project's ``package.control`` by its kind."""
from __future__ import annotations

__all__ = ["control_duty", "CONTROL_LABELS"]

from stagewright.core.part_load.duty import ControlDuty
from stagewright.core.part_load.full_load import FullLoad
from stagewright.core.part_load.load_unload import load_unload_duty
from stagewright.core.part_load.measured_curve import measured_curve_duty
from stagewright.core.part_load.modulation import modulation_duty
from stagewright.core.part_load.start_stop import start_stop_duty
from stagewright.core.part_load.variable_speed import variable_speed_duty

#: control kind -> words for people
CONTROL_LABELS = {"load_unload": "load/unload", "modulation": "inlet modulation",
                  "variable_speed": "variable speed", "start_stop": "start/stop",
                  "measured_curve": "measured part-load curve"}


def control_duty(control: dict, full: FullLoad, demand_fraction: float) -> ControlDuty:
    """The running states of ``control`` at ``demand_fraction`` of full capacity.

    Parameters
    ----------
    control : dict
        The normalised ``package.control`` section (its ``kind`` picks the model).
    full : FullLoad
        Full-capacity shaft power and free air delivery at the conditions solved.
    demand_fraction : float
        Demand over full capacity [-], 0…1.

    Returns
    -------
    ControlDuty

    Raises
    ------
    ValueError
        For an unknown kind or a demand outside 0…1 (programming errors: the schema checks both).
    """
    if not 0.0 <= demand_fraction <= 1.0:
        raise ValueError(f"demand fraction {demand_fraction!r} outside 0…1")
    kind = control["kind"]
    p, q, pa, x = full.shaft_power_W, full.fad_m3_s, full.intake_pressure_Pa, demand_fraction
    if kind == "load_unload":
        return load_unload_duty(control, p, q, pa, x)
    if kind == "modulation":
        return modulation_duty(control, p, x)
    if kind == "variable_speed":
        return variable_speed_duty(control, p, q, pa, x)
    if kind == "start_stop":
        return start_stop_duty(control, p, q, pa, x)
    if kind == "measured_curve":
        return measured_curve_duty(control, p, x)
    raise ValueError(f"unknown control kind {kind!r}")
