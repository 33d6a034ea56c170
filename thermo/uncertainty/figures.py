"""The result figures of a field check whose uncertainty is stated, read from a solve.

Names are the paths of the same figures in ``TrainResult.to_dict()`` (``mass_flow_kg_s``,
``stages[1].isentropic_efficiency``, ``stages[0].cooler.duty_W``), so a guarantee names a
figure the way the results JSON does.
"""
from __future__ import annotations

__all__ = ["ResultFigure", "result_figures", "figure_values"]

import math
from dataclasses import dataclass


@dataclass(frozen=True)
class ResultFigure:
    """One result figure: its results path, a label for people and its display quantity."""

    name: str
    label: str
    quantity: str


def result_figures(norm: dict) -> list[ResultFigure]:
    """The figures a field check of ``norm`` reports with their uncertainty.

    Parameters
    ----------
    norm : dict
        Normalised project document.

    Returns
    -------
    list of ResultFigure
        Flow (mass flow and free air delivery), the shaft power where the flow is given,
        specific power, each stage's isentropic efficiency and each cooler's duty.

    Examples
    --------
    >>> norm = {"flow": {"kind": "shaft_power"}, "stages": [{"cooler": None}]}
    >>> [f.name for f in result_figures(norm)]
    ['mass_flow_kg_s', 'free_air_delivery_m3_s', 'specific_power_kW_per_m3_min', 'stages[0].isentropic_efficiency']
    """
    out = [ResultFigure("mass_flow_kg_s", "mass flow", "mass_flow"),
           ResultFigure("free_air_delivery_m3_s", "free air delivery", "volume_flow")]
    if norm["flow"]["kind"] != "shaft_power":
        out.append(ResultFigure("shaft_power_W", "shaft power", "power"))
    out.append(ResultFigure("specific_power_kW_per_m3_min", "specific power", "specific_power"))
    for i, _ in enumerate(norm["stages"]):
        out.append(ResultFigure(f"stages[{i}].isentropic_efficiency", f"stage {i + 1} isentropic efficiency",
                                "fraction"))
    for i, st in enumerate(norm["stages"]):
        if st.get("cooler"):
            out.append(ResultFigure(f"stages[{i}].cooler.duty_W", f"duty of the cooler after stage {i + 1}",
                                    "heat_flow"))
    return out


def figure_values(result, figures: list[ResultFigure]) -> list[float]:
    """Values of ``figures`` in a solved ``TrainResult`` (SI; NaN where one is missing)."""
    out = []
    for f in figures:
        if f.name.startswith("stages["):
            i = int(f.name[7:f.name.index("]")])
            if f.name.endswith(".cooler.duty_W"):
                cooler = result.coolers[i]
                out.append(cooler.duty_W if cooler is not None else math.nan)
            else:
                out.append(result.stages[i].isentropic_efficiency)
        else:
            out.append(float(getattr(result, f.name)))
    return out
