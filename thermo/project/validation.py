"""Check a project document and turn it into the solver's input.

:func:`problems` lists everything wrong with a document (never raises on bad data);
:func:`normalise` returns the document with every default filled in, or raises
:class:`~thermo.errors.InputError` naming the first problem.
"""
from __future__ import annotations

__all__ = ["problems", "normalise", "site_pressure"]

from typing import Any

from thermo.atmosphere import standard_pressure
from thermo.errors import InputError, Problem
from thermo.project.schema import PROJECT
from thermo.project.schema_types import check
from thermo.year_profile import year_problems


def _check(doc: Any) -> tuple[dict, list[Problem]]:
    out: list[Problem] = []
    if not isinstance(doc, dict):
        return {}, [Problem("(document)", type(doc).__name__, "expected a project object")]
    norm = check(PROJECT, doc, "", out)
    if not out:
        out.extend(_cross_checks(norm))
        out.extend(_humidity_checks(doc.get("site") or {}, norm))
    return norm, out


def site_pressure(norm: dict) -> float:
    """Barometric pressure of a normalised document's site, [Pa]."""
    site = norm["site"]
    if site.get("barometric_pressure_Pa") is not None:
        return site["barometric_pressure_Pa"]
    if site.get("elevation_m") is not None:
        return standard_pressure(site["elevation_m"])
    return 101_325.0


#: smallest efficiency the stage and path solvers can compute, [-] (the schema's range is (0, 1])
MIN_EFFICIENCY = 1e-3
#: smallest flow value the solver can compute, per flow kind, in the kind's unit
#: smallest ratio of specific heats of the constant-cp model that can be computed, [-]
MIN_K = 1.001
MIN_FLOW = {"mass": 1e-6, "free_air_delivery": 1e-6, "normal_volume": 1e-6, "shaft_power": 1.0}


def _floor_checks(norm: dict) -> list[Problem]:
    """Values inside the schema's open ranges but too close to 0 to compute (5e-324 …)."""
    out = []
    flow = norm["flow"]
    floor = MIN_FLOW.get(flow["kind"], 0.0)
    if flow["value"] < floor:
        unit = PROJECT.fields["flow"].variants[flow["kind"]]["value"].unit
        out.append(Problem("flow.value", flow["value"],
                           f"expected at least {floor:g} {unit}; a smaller flow cannot be computed"))
    effs = [("driver.efficiency", norm["driver"]["efficiency"])]
    for i, st in enumerate(norm["stages"]):
        effs.append((f"stages[{i}].mechanical_efficiency", st["mechanical_efficiency"]))
        if "value" in st["efficiency"]:
            effs.append((f"stages[{i}].efficiency.value", st["efficiency"]["value"]))
    fluid = norm["fluid"]
    if fluid["model"] == "constant_cp" and fluid["k"] < MIN_K:
        out.append(Problem("fluid.k", fluid["k"], f"expected at least {MIN_K:g}; "
                                                  "a gas with k this close to 1 cannot be computed"))
    for field, value in effs:
        if value < MIN_EFFICIENCY:
            out.append(Problem(field, value, f"expected at least {MIN_EFFICIENCY:g}; "
                                             "a smaller efficiency cannot be computed"))
    return out


def _cross_checks(norm: dict) -> list[Problem]:
    out = _floor_checks(norm)
    site = norm["site"]
    if site.get("barometric_pressure_Pa") is not None and site.get("elevation_m") is not None:
        out.append(Problem("site.elevation_m", site["elevation_m"],
                           "give either barometric_pressure_Pa or elevation_m, not both"))
    p0 = site_pressure(norm)
    p1 = p0 - norm["inlet_pressure_drop_Pa"]
    if norm["inlet_pressure_drop_Pa"] >= 0.5 * p0:
        out.append(Problem("inlet_pressure_drop_Pa", norm["inlet_pressure_drop_Pa"],
                           f"expected less than half the barometric pressure ({0.5 * p0:.0f} Pa)"))
    if norm["discharge_pressure_Pa"] <= p1:
        out.append(Problem("discharge_pressure_Pa", norm["discharge_pressure_Pa"],
                           f"expected an absolute pressure above the stage-1 inlet pressure {p1:.0f} Pa"))
    for i, st in enumerate(norm["stages"]):
        lo, hi = st.get("min_pressure_ratio"), st.get("max_pressure_ratio")
        if lo is not None and hi is not None and lo > hi:
            out.append(Problem(f"stages[{i}].min_pressure_ratio", lo,
                               f"expected at most max_pressure_ratio ({hi:g})"))
        cooler = st.get("cooler")
        if (cooler and cooler.get("approach_K") is not None and cooler.get("coolant_inlet_temperature_K") is None
                and (cooler.get("coolant") or {}).get("kind") != "air"):
            out.append(Problem(f"stages[{i}].cooler.coolant_inlet_temperature_K", None,
                               "required when the cooler outlet is given as an approach"))
        out.extend(_coolant_checks(cooler, f"stages[{i}].cooler"))
    out.extend(year_problems(norm))
    return out


def _coolant_checks(cooler: dict | None, where: str) -> list[Problem]:
    """Cross-checks of a cooler's coolant side (thermo.exchanger)."""
    if not cooler:
        return []
    out = []
    coolant = cooler.get("coolant")
    if cooler.get("ua_W_K") is not None and coolant is None:
        out.append(Problem(f"{where}.coolant", None, "required when the cooler is rated from ua_W_K"))
    if coolant is None:
        return out
    if coolant["kind"] != "air" and cooler.get("coolant_inlet_temperature_K") is None:
        out.append(Problem(f"{where}.coolant_inlet_temperature_K", None,
                           f"required for a {coolant['kind']} coolant (only air defaults to the site ambient)"))
    if coolant["kind"] == "glycol" and coolant.get("glycol_fraction") is None:
        out.append(Problem(f"{where}.coolant.glycol_fraction", None,
                           "required for a glycol coolant: glycol mass fraction in [0, 0.6]"))
    if coolant["kind"] != "glycol" and coolant.get("glycol_fraction") is not None:
        out.append(Problem(f"{where}.coolant.glycol_fraction", coolant["glycol_fraction"],
                           "applies only to kind 'glycol'"))
    return out


HUMIDITY_KEYS = ("relative_humidity", "dew_point_K", "humidity_ratio")
_ZERO_C = 273.15


def _humidity_checks(raw_site: dict, norm: dict) -> list[Problem]:
    """Moist intake: one humidity input, dew point not above ambient, nothing at or below freezing."""
    out = []
    given = [k for k in HUMIDITY_KEYS if raw_site.get(k) is not None]
    if len(given) > 1:
        out.append(Problem("site." + given[1], raw_site[given[1]],
                           "give at most one of relative_humidity, dew_point_K, humidity_ratio"))
        return out
    site = norm["site"]
    T0 = site["ambient_temperature_K"]
    td = site.get("dew_point_K")
    if td is not None and td > T0:
        out.append(Problem("site.dew_point_K", td,
                           f"expected at most the ambient temperature {T0:.2f} K (a dew point above "
                           "ambient would be fog)"))
    if td is not None and td < _ZERO_C:
        out.append(Problem("site.dew_point_K", td,
                           "expected at least 273.15 K: dew points below 0 °C are frost points over ice, "
                           "which is out of scope; give relative_humidity or humidity_ratio instead"))
    moist = bool(site.get("relative_humidity")) or td is not None or bool(site.get("humidity_ratio"))
    if not moist:
        return out
    if T0 < _ZERO_C:
        out.append(Problem("site.ambient_temperature_K", T0,
                           "moist intake air needs an ambient temperature of at least 273.15 K: water "
                           "vapour over ice is out of scope; give relative_humidity 0 for a dry intake"))
    for i, st in enumerate(norm["stages"]):
        c = st.get("cooler")
        if not c:
            continue
        if c.get("outlet_temperature_K") is not None:
            field, value, t_out = "outlet_temperature_K", c["outlet_temperature_K"], c["outlet_temperature_K"]
        elif c.get("approach_K") is not None and c.get("coolant_inlet_temperature_K") is not None:
            field, value = "approach_K", c["approach_K"]
            t_out = c["coolant_inlet_temperature_K"] + c["approach_K"]
        else:
            continue
        if t_out < _ZERO_C:
            out.append(Problem(f"stages[{i}].cooler.{field}", value,
                               f"moist air must leave a cooler at 273.15 K or above (this gives {t_out:.2f} K): "
                               "condensate would freeze, and ice is out of scope"))
    return out


def problems(doc: Any) -> list[Problem]:
    """Every problem found in ``doc``: wrong types, unknown keys, values out of range.

    Parameters
    ----------
    doc : dict
        A project document (parsed JSON).

    Returns
    -------
    list of Problem
        Empty when the document is valid.
    """
    return _check(doc)[1]


def normalise(doc: Any) -> dict:
    """Return ``doc`` with defaults filled in.

    Raises
    ------
    InputError
        Naming the field path, the value and the valid range of the first problem
        (``.problems`` holds all of them).
    """
    norm, found = _check(doc)
    if found:
        raise InputError.from_problems(found)
    return norm
