"""What a capacity control does at one demand: the share of time in each running state."""
from __future__ import annotations

__all__ = ["RunState", "ControlDuty"]

from dataclasses import dataclass, field


@dataclass(frozen=True)
class RunState:
    """One state the package spends a share of its time in (SI).

    ``shaft_power_W`` is the compressor's mean shaft power in the state; ``speed_fraction`` the
    motor speed over full speed (1 for fixed speed); ``running`` False when the motor is
    stopped (no motor, drive or auxiliary power).
    """

    time_fraction: float
    shaft_power_W: float
    speed_fraction: float = 1.0
    running: bool = True


@dataclass(frozen=True)
class ControlDuty:
    """A control's answer at one demand: its running states and its cycling.

    ``loaded_fraction`` is the share of time the compressor delivers air;
    ``cycles_per_hour`` the load/unload (or start/stop) cycles, None for a control that
    does not cycle at this demand; ``starts_per_hour`` the motor starts (start/stop only).
    """

    demand_fraction: float
    states: tuple
    loaded_fraction: float
    cycles_per_hour: float | None = None
    starts_per_hour: float | None = None
    notes: tuple = field(default_factory=tuple)

    @property
    def mean_shaft_power_W(self) -> float:
        """Time-weighted compressor shaft power [W]."""
        return sum(s.time_fraction * s.shaft_power_W for s in self.states)
