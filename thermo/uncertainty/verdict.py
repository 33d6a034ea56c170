r"""Guaranteed figures against a field check's results: within, outside, or not decidable.

A guarantee states a figure's value :math:`g` and a tolerance: relative (:math:`T = t\,g`),
absolute (:math:`T`), or ISO 1217's Annex C table for packaged displacement compressors
(flow and specific energy, by the guaranteed flow). The *specification zone* is
:math:`[g - T, g + T]` (``limit: both``), :math:`[g - T, \infty)` (``at_least``) or
:math:`(-\infty, g + T]` (``at_most``).

Decision rule — the default rule of ISO 14253-1:2017 (proving conformity or nonconformity;
the rule from memory, checked only against secondary summaries), which is also the guarded
acceptance of JCGM 106:2012 §8 with a guard band equal to the expanded uncertainty (from
memory). With the result :math:`y` and its expanded uncertainty :math:`U` (k = 2):

- **within** (conformity proven) when :math:`[y - U, y + U]` lies inside the zone, limits
  included;
- **outside** (nonconformity proven) when :math:`[y - U, y + U]` lies wholly outside the zone;
- **not decidable at this uncertainty** otherwise.

The measured value alone inside the zone ("simple acceptance", no guard band) is reported
beside the verdict: ISO 1217's tolerances may be agreed to include the measurement
uncertainty, and then that is the comparison the contract asks for.
"""
from __future__ import annotations

__all__ = ["Verdict", "judge", "tolerance_of", "ISO1217_ANNEX_C", "ISO1217_SOURCE", "DECISION_RULE"]

import math
from dataclasses import dataclass

#: ISO 1217:2009 (4th edition) Annex C: tolerances for a packaged displacement compressor by
#: volume flow rate (upper end of each band, m³/s): (flow tolerance, specific-energy tolerance).
#: VALUES FROM MEMORY, not checked against the standard: confirm them with your copy.
ISO1217_ANNEX_C = ((0.5 / 60.0, 0.07, 0.08), (1.5 / 60.0, 0.06, 0.07), (15.0 / 60.0, 0.05, 0.06),
                   (math.inf, 0.04, 0.05))
ISO1217_SOURCE = ("ISO 1217:2009 (4th edition) Annex C, tolerances on volume flow rate and specific "
                  "energy requirement — values from memory, check against the standard")
DECISION_RULE = ("within: y ± U inside the tolerance zone; outside: y ± U wholly outside it; otherwise not "
                 "decidable at this uncertainty (ISO 14253-1:2017 default rule / JCGM 106:2012 guarded "
                 "acceptance with guard band U; from memory)")

WITHIN, OUTSIDE, UNDECIDED = "within", "outside", "not decidable at this uncertainty"


@dataclass(frozen=True)
class Verdict:
    """One guarantee judged: zone, result, verdict and where the tolerance came from."""

    figure: str
    guaranteed: float
    lower_limit: float  #: -inf without a lower limit
    upper_limit: float  #: +inf without an upper limit
    value: float
    expanded_uncertainty: float
    verdict: str  #: WITHIN, OUTSIDE or UNDECIDED
    value_inside: bool  #: the result alone inside the zone (simple acceptance)
    tolerance_source: str

    def to_dict(self) -> dict:
        def fin(v):
            return v if math.isfinite(v) else None
        return {"figure": self.figure, "guaranteed": self.guaranteed, "lower_limit": fin(self.lower_limit),
                "upper_limit": fin(self.upper_limit), "value": self.value,
                "expanded_uncertainty": self.expanded_uncertainty, "verdict": self.verdict,
                "value_inside": self.value_inside, "tolerance_source": self.tolerance_source}


def tolerance_of(guarantee: dict) -> tuple[float, str]:
    """Tolerance :math:`T` of a guarantee (in the figure's unit) and where it comes from.

    Examples
    --------
    >>> tolerance_of({"kind": "iso1217_annex_c", "figure": "free_air_delivery_m3_s", "value": 0.4})
    (0.016, 'ISO 1217:2009 Annex C, ±4 % (values from memory)')
    >>> tolerance_of({"kind": "relative", "figure": "mass_flow_kg_s", "value": 2.0, "tolerance": 0.05})
    (0.1, 'stated by the user: ±5 % of the guaranteed value')
    """
    kind, g = guarantee["kind"], guarantee["value"]
    if kind == "relative":
        return guarantee["tolerance"] * g, f"stated by the user: ±{guarantee['tolerance'] * 100:g} % of the guaranteed value"
    if kind == "absolute":
        return guarantee["tolerance"], "stated by the user"
    flow = guarantee.get("flow_m3_s", g)
    band = next(b for b in ISO1217_ANNEX_C if flow <= b[0])
    t = band[1] if guarantee["figure"] == "free_air_delivery_m3_s" else band[2]
    return t * g, f"ISO 1217:2009 Annex C, ±{t * 100:g} % (values from memory)"


def judge(figure: str, guarantee: dict, value: float, expanded_uncertainty: float) -> Verdict:
    """Judge ``value`` ± ``expanded_uncertainty`` against ``guarantee`` (see module notes).

    Parameters
    ----------
    figure : str
        The figure's name (its path in the results).
    guarantee : dict
        A normalised ``field_check.guarantees`` entry; for ``iso1217_annex_c`` on specific
        power, ``flow_m3_s`` picks the band (the field check passes its free air delivery;
        a flow guarantee's band follows the guaranteed flow).
    value, expanded_uncertainty : float
        The result and its expanded uncertainty (k = 2), in the figure's SI unit.

    Returns
    -------
    Verdict

    Examples
    --------
    >>> g = {"kind": "absolute", "figure": "x", "value": 10.0, "tolerance": 1.0, "limit": "both"}
    >>> judge("x", g, 10.5, 0.5).verdict, judge("x", g, 10.5, 0.75).verdict, judge("x", g, 12.5, 0.5).verdict
    ('within', 'not decidable at this uncertainty', 'outside')
    """
    t, source = tolerance_of(guarantee)
    g, limit = guarantee["value"], guarantee.get("limit", "both")
    lo = -math.inf if limit == "at_most" else g - t
    hi = math.inf if limit == "at_least" else g + t
    y, U = value, expanded_uncertainty
    if lo <= y - U and y + U <= hi:
        verdict = WITHIN
    elif y + U < lo or y - U > hi:
        verdict = OUTSIDE
    else:
        verdict = UNDECIDED
    return Verdict(figure, g, lo, hi, y, U, verdict, lo <= y <= hi, source)
