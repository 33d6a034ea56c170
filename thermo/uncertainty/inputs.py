r"""Measured inputs of a field check and the standard uncertainty each one carries.

A project's ``field_check.uncertainties`` names measured inputs by their field path
(``stages[1].efficiency.value_K``) and states, in that input's SI unit, either

- ``standard``: a standard uncertainty :math:`u` (a Gaussian distribution is assigned to
  the input in the Monte Carlo propagation, JCGM 101:2008 §6.4.7);
- ``limits``: a half-width :math:`a` of limits :math:`x \pm a` with nothing known about where
  inside them the value lies: rectangular distribution, :math:`u = a/\sqrt 3`
  (JCGM 100:2008 §4.3.7; JCGM 101:2008 §6.4.2);
- ``accuracy_class``: an instrument's accuracy class :math:`c` (per cent) of its full scale
  :math:`F` — or of the reading where no full scale is given — read as limits
  :math:`a = c/100 \cdot F`, then as ``limits`` (the class as a limit of error in per cent of
  the fiducial value follows IEC 60051-1 and EN 837-1 for pressure gauges; from memory).
"""
from __future__ import annotations

__all__ = ["MeasuredInput", "MEASURABLE", "describe_input", "measured_inputs", "measurable_paths", "field_check_problems"]

import math
import re
from dataclasses import dataclass

from stagewright.core.errors import InputError, Problem
from stagewright.core.project.paths import get_path, parse_path
from stagewright.core.uncertainty.figures import result_figures

#: field path pattern → (label with {n} for the stage number, display quantity)
MEASURABLE = (
    (r"site\.ambient_temperature_K", "intake temperature", "temperature"),
    (r"site\.barometric_pressure_Pa", "barometric pressure", "pressure"),
    (r"site\.relative_humidity", "intake relative humidity", "fraction"),
    (r"site\.dew_point_K", "intake dew point", "temperature"),
    (r"site\.humidity_ratio", "intake humidity ratio", "humidity_ratio"),
    (r"inlet_pressure_drop_Pa", "inlet filter pressure drop", "pressure_difference"),
    (r"discharge_pressure_Pa", "delivery pressure", "pressure"),
    (r"discharge_gauge_pressure_Pa", "delivery pressure (gauge)", "gauge_pressure"),
    (r"flow\.value", "{flow}", None),
    (r"driver\.efficiency", "driver efficiency", "fraction"),
    (r"stages\[(\d+)\]\.efficiency\.value_K", "stage {n} discharge temperature", "temperature"),
    (r"stages\[(\d+)\]\.pressure_ratio", "stage {n} pressure ratio", "ratio"),
    (r"stages\[(\d+)\]\.mechanical_efficiency", "stage {n} mechanical efficiency", "fraction"),
    (r"stages\[(\d+)\]\.heat_loss_W", "stage {n} casing heat loss", "heat_flow"),
    (r"stages\[(\d+)\]\.cooler\.outlet_temperature_K", "outlet temperature of the cooler after stage {n}", "temperature"),
    (r"stages\[(\d+)\]\.cooler\.pressure_drop_Pa", "pressure drop of the cooler after stage {n}", "pressure_difference"),
    (r"stages\[(\d+)\]\.cooler\.coolant_inlet_temperature_K", "coolant inlet temperature of the cooler after stage {n}",
     "temperature"),
)
_FLOW = {"shaft_power": ("shaft power", "power"), "mass": ("mass flow", "mass_flow"),
         "free_air_delivery": ("free air delivery", "volume_flow"),
         "normal_volume": ("normal volume flow", "normal_volume_flow")}
_SQRT3 = math.sqrt(3.0)


@dataclass(frozen=True)
class MeasuredInput:
    """One measured input with its uncertainty (SI, in the input's unit).

    ``distribution`` is ``"gaussian"`` (a standard uncertainty given) or ``"rectangular"``
    (limits ±``half_width``); ``rule`` says in words how ``standard_uncertainty`` was found;
    ``lo``/``hi`` are the input's valid range (a draw outside it is not solved).
    """

    path: str
    label: str
    quantity: str
    value: float
    standard_uncertainty: float
    distribution: str
    half_width: float | None
    rule: str
    lo: float = -math.inf
    hi: float = math.inf
    stated_as: str = "standard"  #: the entry's kind: standard, limits or accuracy_class
    class_percent: float | None = None
    full_scale: float | None = None


def describe_input(norm: dict, path: str) -> tuple[str, str] | None:
    """Label and display quantity of a measurable input ``path`` of ``norm``; None if the
    path is not one a field check can give an uncertainty for.

    Examples
    --------
    >>> describe_input({"flow": {"kind": "shaft_power"}}, "stages[1].efficiency.value_K")
    ('stage 2 discharge temperature', 'temperature')
    """
    for pattern, label, kind in MEASURABLE:
        m = re.fullmatch(pattern, path)
        if m is None:
            continue
        if kind is None:
            return _FLOW[norm["flow"]["kind"]]
        return label.format(n=int(m.group(1)) + 1) if m.groups() else label, kind
    return None


def measurable_paths(norm: dict) -> list[str]:
    """Field paths of the inputs of ``norm`` that can carry an uncertainty and have a number.

    Examples
    --------
    >>> norm = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": None},
    ...         "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...         "stages": [{"efficiency": {"kind": "discharge_temperature", "value_K": 440.0},
    ...                     "pressure_ratio": None, "cooler": None}]}
    >>> measurable_paths(norm)
    ['site.ambient_temperature_K', 'discharge_pressure_Pa', 'flow.value', 'stages[0].efficiency.value_K']
    """
    candidates = [f"site.{k}" for k in ("ambient_temperature_K", "barometric_pressure_Pa", "relative_humidity",
                                       "dew_point_K", "humidity_ratio")]
    candidates += ["inlet_pressure_drop_Pa", "discharge_pressure_Pa", "discharge_gauge_pressure_Pa", "flow.value",
                   "driver.efficiency"]
    for i, _ in enumerate(norm.get("stages", [])):
        candidates += [f"stages[{i}].{k}" for k in ("efficiency.value_K", "pressure_ratio", "mechanical_efficiency",
                                                     "heat_loss_W", "cooler.outlet_temperature_K",
                                                     "cooler.pressure_drop_Pa", "cooler.coolant_inlet_temperature_K")]
    out = []
    for path in candidates:
        try:
            value = get_path(norm, path)
        except (KeyError, IndexError, TypeError):
            continue
        if isinstance(value, (int, float)) and not isinstance(value, bool):
            out.append(path)
    return out


def _standard(entry: dict, value: float) -> tuple[float, str, float | None, str]:
    """(u, distribution, half-width, rule) of one ``uncertainties`` entry at the input ``value``."""
    kind = entry["kind"]
    if kind == "standard":
        u = entry["standard_uncertainty"]
        return u, "gaussian", None, "standard uncertainty as stated (Gaussian)"
    if kind == "limits":
        a = entry["half_width"]
        return a / _SQRT3, "rectangular", a, "limits ±a, u = a/√3 (rectangular, JCGM 100:2008 §4.3.7)"
    c = entry["class_percent"]
    scale = entry.get("full_scale")
    a = c / 100.0 * (scale if scale is not None else abs(value))
    of = f"of full scale {scale:g}" if scale is not None else "of the reading"
    return a / _SQRT3, "rectangular", a, f"accuracy class {c:g} % {of}: a = {a:.6g}, u = a/√3 (JCGM 100:2008 §4.3.7)"


def _range(norm: dict, path: str) -> tuple[float, float]:
    """Valid range of the input at ``path`` from the project schema (open bounds nudged inward)."""
    from stagewright.core.project.schema import PROJECT
    from stagewright.core.project.schema_types import Variant
    node, doc = PROJECT, norm
    for part in parse_path(path):
        if isinstance(part, int):
            node, doc = node.item, doc[part]
            continue
        fields = node.variants[doc["kind"]] if isinstance(node, Variant) else node.fields
        node, doc = fields[part], doc[part]
    lo = math.nextafter(node.lo, math.inf) if node.lo_open else node.lo
    hi = math.nextafter(node.hi, -math.inf) if node.hi_open else node.hi
    return lo, hi


def measured_inputs(norm: dict) -> list[MeasuredInput]:
    """The inputs of ``norm`` with an uncertainty, in the order the project lists them.

    Raises
    ------
    InputError
        If an entry names an input that cannot carry one (see :func:`field_check_problems`).
    """
    found = field_check_problems(norm, strict=True)
    if found:
        raise InputError.from_problems(found)
    out = []
    for entry in (norm.get("field_check") or {}).get("uncertainties", []):
        path = entry["input"]
        value = float(get_path(norm, path))
        label, kind = describe_input(norm, path)
        u, dist, a, rule = _standard(entry, value)
        lo, hi = _range(norm, path)
        out.append(MeasuredInput(path, label, kind, value, u, dist, a, rule, lo, hi, entry["kind"],
                                 entry.get("class_percent"), entry.get("full_scale")))
    return out


#: names of the figures a guarantee may name (their paths in the results)
_FIGURE_NAME = re.compile(r"mass_flow_kg_s|free_air_delivery_m3_s|shaft_power_W|specific_power_kW_per_m3_min"
                          r"|stages\[\d+\]\.isentropic_efficiency|stages\[\d+\]\.cooler\.duty_W")


def field_check_problems(norm: dict, strict: bool = False) -> list[Problem]:
    """Problems of a normalised document's ``field_check`` section (empty when absent or fine).

    Always: an input path that names no measurable input, an input named twice, a guarantee on
    a figure name no field check reports, ISO 1217 tolerances on another figure. With
    ``strict`` (when the uncertainty is evaluated) also: an input the project does not give
    (a stage removed since, a pressure ratio left to the split), an accuracy class of a zero
    reading, a guarantee on a figure this project does not have. Validation uses the lenient
    form, so an edit of the train never blocks the solve because of the field check.
    """
    section = norm.get("field_check")
    if not section:
        return []
    out, seen = [], set()
    for i, entry in enumerate(section.get("uncertainties", [])):
        where, path = f"field_check.uncertainties[{i}].input", entry.get("input")
        if not isinstance(path, str):
            continue
        if describe_input(norm, path) is None:
            out.append(Problem(where, path, "expected the field path of a measured input, e.g. "
                                            "stages[0].efficiency.value_K, site.ambient_temperature_K, flow.value"))
            continue
        if path in seen:
            out.append(Problem(where, path, "this input already has an uncertainty"))
        seen.add(path)
        if strict:
            out.extend(_given_problems(norm, entry, i))
    names = {f.name for f in result_figures(norm)}
    for i, g in enumerate(section.get("guarantees", [])):
        fig, where = g.get("figure"), f"field_check.guarantees[{i}].figure"
        if not isinstance(fig, str):
            continue
        if not _FIGURE_NAME.fullmatch(fig) or (strict and fig not in names):
            out.append(Problem(where, fig, "expected one of " + ", ".join(sorted(names))))
        elif g.get("kind") == "iso1217_annex_c" and fig not in ("free_air_delivery_m3_s",
                                                                 "specific_power_kW_per_m3_min"):
            out.append(Problem(where, fig, "ISO 1217 Annex C tolerances apply to free_air_delivery_m3_s and "
                                           "specific_power_kW_per_m3_min only"))
    return out


def _given_problems(norm: dict, entry: dict, i: int) -> list[Problem]:
    """An uncertainty entry's input must be a number the project gives (not zero for a class of the reading)."""
    path = entry["input"]
    try:
        value = get_path(norm, path)
    except (KeyError, IndexError, TypeError):
        value = None
    if not isinstance(value, (int, float)) or isinstance(value, bool):
        return [Problem(f"field_check.uncertainties[{i}].input", path,
                        "expected an input the project gives a number for")]
    if entry.get("kind") == "accuracy_class" and entry.get("full_scale") is None and value == 0:
        return [Problem(f"field_check.uncertainties[{i}].full_scale", None,
                        "required: an accuracy class of a zero reading needs the full scale")]
    return []
