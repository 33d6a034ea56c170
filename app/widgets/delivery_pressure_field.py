"""The delivery-pressure entry: shows what the project states in the display basis, writes what is typed.

A project states its delivery pressure absolute (``discharge_pressure_Pa``) or gauge
(``discharge_gauge_pressure_Pa``, above the site's barometric pressure;
:mod:`stagewright.core.project.delivery`). The field shows that statement in the basis of View ▸ gauge,
converted with the site pressure when the two bases differ, and a typed value is stated in the
basis shown — the other key removed, one undo step. Switching the display basis never touches
the document, and a gauge statement is held when the site changes.
"""
from __future__ import annotations

__all__ = ["DeliveryPressureField"]

import dataclasses

from stagewright.core.project.delivery import ABSOLUTE_KEY, DELIVERY_KEYS, GAUGE_KEY, stated_delivery

from stagewright.gui.document.paths import ABSENT
from stagewright.gui.presentation import units
from stagewright.gui.widgets.quantity_field import QuantityField


class DeliveryPressureField(QuantityField):
    """``[ 8 ] bar(g)`` bound to whichever delivery key the project states."""

    def __init__(self, editor, parent=None):
        super().__init__(editor, ABSOLUTE_KEY, parent=parent)

    @property
    def path(self) -> str:
        """The key the project states; with neither, the key of the basis shown."""
        stated = stated_delivery(self.editor.model.doc)
        if stated is not None:
            return stated[0]
        return GAUGE_KEY if self.editor.prefs.gauge else ABSOLUTE_KEY

    @path.setter
    def path(self, _value: str) -> None:
        """The path follows the document (set by the base class; ignored)."""

    def _unit(self) -> units.Unit:
        """bar(g)/bar(a) (psig/psia) of the basis shown, without offset: values are in that basis."""
        prefs = self.editor.prefs
        return dataclasses.replace(units.unit("pressure", prefs.system, gauge=prefs.gauge), offset=0.0)

    def shown_si(self):
        """The stated pressure in the basis shown, [Pa]: as stated, or ± the site pressure."""
        stated = stated_delivery(self.editor.model.doc)
        if stated is None:
            return None
        key, value = stated
        gauge_shown = self.editor.prefs.gauge
        if (key == GAUGE_KEY) == gauge_shown:
            return value
        p0 = self.editor.barometric_Pa()
        return value - p0 if gauge_shown else value + p0

    def write_si(self, si: float) -> bool:
        """State the typed pressure in the basis shown; the other statement goes (one undo step)."""
        key = GAUGE_KEY if self.editor.prefs.gauge else ABSOLUTE_KEY
        pairs = [(key, si)] + [(other, ABSENT) for other in DELIVERY_KEYS if other != key]
        return self.editor.set_values(pairs, "Change discharge pressure")

    def problem_message(self) -> str | None:
        """A problem of either statement (or of unreadable text)."""
        message = self.editor.problem_for(self.path)
        for key in DELIVERY_KEYS:
            message = message or self.editor.problem_for(key)
        return message
