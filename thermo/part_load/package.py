r"""The package's input power at a demand: control, motor, drive and auxiliaries together.

.. math::

    P_{pkg}(x) = \sum_i t_i \Bigl[ P_{drive}\bigl(P_{motor}(P_{shaft,i})\bigr)
                 + \mathbb{1}_{run,i}\, (P_{fan} + P_{pump} + P_{other}) \Bigr]

over the control's running states :math:`i` with time shares :math:`t_i` (:mod:`.controls`);
:math:`P_{drive}` is the identity without a variable-speed drive. The package specific power
is :math:`P_{pkg}/(x\,Q_c)` (ISO 1217 calls the input per delivered volume the specific energy
requirement). The motor's rated output defaults to the full-load shaft power solved, so that
at full load the driver input equals the train's driver power exactly.
"""
from __future__ import annotations

__all__ = ["PackagePoint", "package_point", "package_curve"]

import math
from dataclasses import asdict, dataclass, field

from stagewright.core.part_load.auxiliaries import auxiliaries
from stagewright.core.part_load.controls import control_duty
from stagewright.core.part_load.drive import drive_input
from stagewright.core.part_load.full_load import FullLoad
from stagewright.core.part_load.motor import motor_input


@dataclass(frozen=True)
class PackagePoint:
    """The package at one demand (SI; time means over the control's cycle)."""

    demand_fraction: float
    delivered_fad_m3_s: float
    shaft_power_W: float
    driver_power_W: float  #: motor input, and the drive's where there is one
    drive_loss_W: float
    fan_power_W: float
    pump_power_W: float
    other_power_W: float
    package_power_W: float
    package_specific_power_J_m3: float | None  #: None at zero demand
    loaded_fraction: float
    running_fraction: float
    cycles_per_hour: float | None
    starts_per_hour: float | None
    notes: list = field(default_factory=list)

    def to_dict(self) -> dict:
        return asdict(self)


def _specific(power_W: float, delivered_m3_s: float) -> float | None:
    """Input per delivered volume [J/m³]; None when nothing (or too little to divide by) is delivered."""
    if delivered_m3_s <= 0.0:
        return None
    value = power_W / delivered_m3_s
    return value if math.isfinite(value) else None


def package_point(package: dict, full: FullLoad, demand_fraction: float) -> PackagePoint:
    """The package's figures at ``demand_fraction`` of its full capacity.

    Parameters
    ----------
    package : dict
        The normalised ``package`` section.
    full : FullLoad
        Full-capacity figures at the conditions solved (:func:`.full_load.full_load_of`).
    demand_fraction : float
        Demand over full capacity [-], 0…1.

    Returns
    -------
    PackagePoint

    Examples
    --------
    >>> pkg = {"control": {"kind": "modulation", "zero_flow_power_fraction": 0.7},
    ...        "motor": {"rated_output_W": None, "fixed_loss_share": 0.35, "efficiency_points": []},
    ...        "fan_power_W": 0.0, "pump": None, "other_loads": []}
    >>> full = FullLoad(shaft_power_W=95_000.0, fad_m3_s=0.25, intake_pressure_Pa=1e5, driver_efficiency=0.95)
    >>> round(package_point(pkg, full, 1.0).package_power_W, 6)  # 95 kW / 0.95
    100000.0
    """
    duty = control_duty(package["control"], full, demand_fraction)
    rated = package["motor"].get("rated_output_W") or full.shaft_power_W
    eta = full.driver_efficiency
    vsd = package["control"]["kind"] == "variable_speed"
    rated_in = motor_input(package["motor"], rated, eta, rated)
    aux = auxiliaries(package, full.coolant_m3_s, full.coolant_density_kg_m3)
    driver = drive_loss = running = 0.0
    for s in duty.states:
        if not s.running:
            continue
        m_in = motor_input(package["motor"], rated, eta, s.shaft_power_W)
        d_in = drive_input(package["control"], rated_in, m_in) if vsd else m_in
        driver += s.time_fraction * d_in
        drive_loss += s.time_fraction * (d_in - m_in)
        running += s.time_fraction
    delivered = demand_fraction * full.fad_m3_s
    total = driver + running * aux.total_W
    return PackagePoint(
        demand_fraction=demand_fraction, delivered_fad_m3_s=delivered, shaft_power_W=duty.mean_shaft_power_W,
        driver_power_W=driver, drive_loss_W=drive_loss, fan_power_W=running * aux.fan_W,
        pump_power_W=running * aux.pump_W, other_power_W=running * aux.other_W, package_power_W=total,
        package_specific_power_J_m3=_specific(total, delivered),
        loaded_fraction=duty.loaded_fraction, running_fraction=running, cycles_per_hour=duty.cycles_per_hour,
        starts_per_hour=duty.starts_per_hour, notes=list(duty.notes))


def package_curve(package: dict, full: FullLoad, points: int = 21) -> list:
    """:func:`package_point` at ``points`` demands evenly from 0 to 1 (a part-load chart)."""
    return [package_point(package, full, i / (points - 1)) for i in range(points)]
