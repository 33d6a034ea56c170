"""Display preferences (unit system, gauge or absolute pressure): never part of the document."""
from __future__ import annotations

__all__ = ["DisplayPrefs"]

from stagewright.gui.presentation import units
from stagewright.gui.document.model import Signal


class DisplayPrefs:
    """Unit system and pressure reference used by every field and table; ``changed()`` on edit."""

    def __init__(self, system: str = "SI", gauge: bool = True) -> None:
        self.changed = Signal()
        self._system = system if system in units.SYSTEMS else "SI"
        self._gauge = bool(gauge)

    @property
    def system(self) -> str:
        return self._system

    @system.setter
    def system(self, value: str) -> None:
        if value not in units.SYSTEMS:
            raise ValueError(f"unit system must be one of {units.SYSTEMS}, not {value!r}")
        if value != self._system:
            self._system = value
            self.changed.emit()

    @property
    def gauge(self) -> bool:
        return self._gauge

    @gauge.setter
    def gauge(self, value: bool) -> None:
        if bool(value) != self._gauge:
            self._gauge = bool(value)
            self.changed.emit()
