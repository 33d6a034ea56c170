"""The delivery pressure a project states (absolute or gauge) and the absolute pressure it means.

A project states the pressure wanted after the last cooler in exactly one of two keys:
``discharge_pressure_Pa`` (absolute) or ``discharge_gauge_pressure_Pa`` (gauge: relative to
the site's barometric pressure). What the user stated is kept; the absolute pressure the
solver needs is resolved at the boundary, per solve, from the site pressure of that solve
(:func:`delivery_pressure`), so that a change of site — an edit, a sweep axis, a study across
site variables — keeps a gauge statement and moves the absolute pressure with the site.
"""
from __future__ import annotations

__all__ = ["ABSOLUTE_KEY", "GAUGE_KEY", "DELIVERY_KEYS", "stated_delivery", "delivery_pressure",
           "state_delivery"]

import math
from collections.abc import Mapping, MutableMapping
from typing import Any

from stagewright.core.errors import InputError

ABSOLUTE_KEY = "discharge_pressure_Pa"  #: delivery pressure stated absolute, [Pa]
GAUGE_KEY = "discharge_gauge_pressure_Pa"  #: delivery pressure stated gauge (above barometric), [Pa]
#: the two ways of stating the delivery pressure; a project gives exactly one
DELIVERY_KEYS = (ABSOLUTE_KEY, GAUGE_KEY)


def _number(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool) and math.isfinite(value)


def stated_delivery(doc: Any) -> tuple[str, float] | None:
    """The delivery pressure a document states: ``(key, value [Pa])``, or None.

    Parameters
    ----------
    doc : Mapping
        A project document, valid or being edited.

    Returns
    -------
    tuple of (str, float) or None
        The key given (:data:`ABSOLUTE_KEY` or :data:`GAUGE_KEY`) and its value; None when
        neither holds a finite number. A document giving both (refused by the validation)
        reads as its gauge statement.

    Examples
    --------
    >>> stated_delivery({"discharge_gauge_pressure_Pa": 8e5})
    ('discharge_gauge_pressure_Pa', 800000.0)
    >>> stated_delivery({"discharge_pressure_Pa": 9e5}), stated_delivery({})
    (('discharge_pressure_Pa', 900000.0), None)
    """
    if not isinstance(doc, Mapping):
        return None
    for key in (GAUGE_KEY, ABSOLUTE_KEY):
        if _number(doc.get(key)):
            return key, float(doc[key])
    return None


def delivery_pressure(norm: Mapping, barometric_Pa: float) -> float:
    r"""Absolute delivery pressure of a normalised project at a site pressure, [Pa].

    .. math:: p_d = p_{d,\mathrm{abs}} \quad\text{or}\quad p_d = p_{d,g} + p_0

    Parameters
    ----------
    norm : Mapping
        Normalised project document: exactly one of ``discharge_pressure_Pa`` [Pa] and
        ``discharge_gauge_pressure_Pa`` [Pa].
    barometric_Pa : float
        Site barometric pressure :math:`p_0` of this solve
        (:func:`stagewright.core.project.validation.barometric_pressure`), [Pa].

    Returns
    -------
    float
        The absolute pressure wanted after the last cooler, [Pa].

    Raises
    ------
    InputError
        Naming ``discharge_pressure_Pa`` when the document states neither key or both.

    Notes
    -----
    Gauge pressure is the pressure above the local atmosphere, :math:`p_g = p - p_0`
    (IUPAC Gold Book, "pressure", gauge pressure; from memory). The barometric pressure is
    that of the site as resolved for the same solve, so the absolute pressure moves with
    the site while the gauge statement is kept.

    Examples
    --------
    >>> delivery_pressure({"discharge_gauge_pressure_Pa": 8e5}, 95_000.0)
    895000.0
    >>> delivery_pressure({"discharge_pressure_Pa": 9e5}, 95_000.0)
    900000.0
    """
    given = [k for k in DELIVERY_KEYS if norm.get(k) is not None]
    if len(given) != 1:
        raise InputError(ABSOLUTE_KEY, {k: norm.get(k) for k in DELIVERY_KEYS},
                         f"give exactly one of {ABSOLUTE_KEY}, {GAUGE_KEY}")
    if given[0] == GAUGE_KEY:
        return float(norm[GAUGE_KEY]) + float(barometric_Pa)
    return float(norm[ABSOLUTE_KEY])


def state_delivery(doc: MutableMapping, key: str, value: Any) -> None:
    """Set the delivery pressure of ``doc`` in ``key`` and remove the other statement.

    Used where one delivery key is set on a document that may state the other (a sweep
    axis): the document then states exactly what was set.

    Examples
    --------
    >>> doc = {"discharge_pressure_Pa": 9e5}
    >>> state_delivery(doc, GAUGE_KEY, 7e5); doc
    {'discharge_gauge_pressure_Pa': 700000.0}
    """
    if key not in DELIVERY_KEYS:
        raise KeyError(key)
    for other in DELIVERY_KEYS:
        if other != key:
            doc.pop(other, None)
    doc[key] = value
