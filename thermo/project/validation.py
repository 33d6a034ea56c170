"""Check a project document and turn it into the solver's input.

:func:`problems` lists everything wrong with a document (never raises on bad data);
:func:`normalise` returns the document with every default filled in, or raises
:class:`~stagewright.core.errors.InputError` naming the first problem; :func:`resolve_site` works out
what the solver needs of the site once, at this boundary: the barometric pressure (given,
or from the elevation by ISO 2533, or sea level) and the one humidity input of the intake
air (:class:`ResolvedSite`). Nothing below the boundary derives them again.
"""
from __future__ import annotations

__all__ = ["problems", "normalise", "resolve_site", "ResolvedSite", "barometric_pressure", "HUMIDITY_KEYS"]

import math
from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

from stagewright.core.atmosphere import SEA_LEVEL_PRESSURE, standard_pressure
from stagewright.core.errors import InputError, Problem, message_detail, quantity
from stagewright.core.project.case_changes import apply_changes
from stagewright.core.project.delivery import ABSOLUTE_KEY, delivery_pressure, stated_delivery
from stagewright.core.project.schema import PROJECT
from stagewright.core.project.schema_types import check
from stagewright.core.year_profile import year_problems
from stagewright.core.uncertainty.inputs import field_check_problems

#: the site's ways of giving the intake humidity (the document allows at most one)
HUMIDITY_KEYS = ("relative_humidity", "dew_point_K", "humidity_ratio")


def _check(doc: Any) -> tuple[dict, list[Problem]]:
    out: list[Problem] = []
    if not isinstance(doc, dict):
        return {}, [Problem("(document)", type(doc).__name__, "expected a project object")]
    norm = check(PROJECT, doc, "", out)
    if not out:
        out.extend(_cross_checks(norm))
        out.extend(_humidity_checks(doc.get("site") or {}, norm))
    if not out and norm.get("cases"):
        out.extend(_case_checks(doc, norm))
    return norm, out


def _case_checks(doc: dict, norm: dict) -> list[Problem]:
    """Each case's name (unique, not the base's) and its own document's problems, reported at
    ``cases[k].changes`` with the case's name and the field inside it."""
    out: list[Problem] = []
    seen = {norm["base_name"]}
    for k, case in enumerate(norm["cases"]):
        name = case["name"]
        if not name.strip() or name in seen:
            out.append(Problem(f"cases[{k}].name", name, "expected a name of its own (not empty, not another "
                                                         "case's or the base's)"))
        seen.add(name)
        try:
            own = apply_changes(doc, case["changes"])
        except (KeyError, IndexError, TypeError, AttributeError, InputError) as exc:
            out.append(Problem(f"cases[{k}].changes", name, f"a change runs through a field the base does not "
                                                            f"have ({type(exc).__name__}: {exc})"))
            continue
        for p in _check(own)[1]:
            out.append(Problem(f"cases[{k}].changes", p.value, f"in case {name!r}, {p.field}: {p.expected}"))
    return out


def _usable(value: Any) -> bool:
    """True for a finite real number (not a bool): an entry the pressure can be worked out from."""
    if not isinstance(value, (int, float)) or isinstance(value, bool):
        return False
    try:
        return math.isfinite(value)
    except OverflowError:  # an integer too large for a float
        return False


def barometric_pressure(site: Any) -> float:
    r"""Barometric pressure of a site section, [Pa]: as given, else from the elevation by ISO 2533 [1]_.

    .. math:: p = p_\mathrm{given} \quad\text{or}\quad p = p_0 \left(1 - \frac{L H}{T_0}\right)^{g_0/(R L)}
       \quad\text{or}\quad p = p_0

    Parameters
    ----------
    site : Mapping
        The ``site`` section of a project document, valid or being edited: its
        ``barometric_pressure_Pa`` [Pa] and ``elevation_m`` [m] are read.

    Returns
    -------
    float
        ``barometric_pressure_Pa`` when it is a positive number; else the ISO 2533 standard
        pressure at ``elevation_m`` (:func:`stagewright.core.atmosphere.standard_pressure`); else the
        standard sea-level pressure, 101 325 Pa, [Pa].

    Notes
    -----
    Never raises: an entry that is not a usable number, or an elevation outside the
    standard atmosphere, is passed over, and :func:`problems` reports it, naming the field,
    the value and the valid range. This lets the window show gauge pressures while a
    document is being edited; for a normalised document every entry is usable.

    The one place where the site pressure is worked out: the validation's own checks, the
    solver (through :func:`resolve_site`) and the window's gauge display all call it. A
    document gives at most one of the two entries (:func:`problems` refuses both); the
    measured pressure is used first.

    Examples
    --------
    >>> barometric_pressure({"barometric_pressure_Pa": 95_000.0, "ambient_temperature_K": 293.15})
    95000.0
    >>> round(barometric_pressure({"elevation_m": 1000.0}))  # ISO 2533 table: 89 875 Pa
    89875
    >>> barometric_pressure({"elevation_m": "high"}), barometric_pressure(None)
    (101325.0, 101325.0)

    References
    ----------
    .. [1] ISO 2533:1975, *Standard Atmosphere*. International Organization for
       Standardization, Geneva, 1975.
    """
    if not isinstance(site, Mapping):
        return SEA_LEVEL_PRESSURE
    p = site.get("barometric_pressure_Pa")
    if _usable(p) and p > 0:
        return float(p)
    z = site.get("elevation_m")
    if _usable(z):
        try:
            return standard_pressure(float(z))
        except InputError:  # outside the standard atmosphere: the field shows the problem
            pass
    return SEA_LEVEL_PRESSURE


@dataclass(frozen=True)
class ResolvedSite:
    """The site and intake filter of a valid project, worked out once (SI units).

    Built by :func:`resolve_site` at the boundary and passed down to the solver
    (:class:`stagewright.core.context.SolveContext`); hashable, so that it can key the caches of
    intake states that sweeps and studies share across solves.

    Attributes
    ----------
    ambient_temperature_K : float
        Site ambient temperature, also the dead-state temperature, [K].
    pressure_Pa : float
        Site barometric pressure, always present (:func:`barometric_pressure`), [Pa].
    humidity : tuple of (str, float) or None
        The humidity input that makes the intake moist, ``("relative_humidity", φ [-])``,
        ``("dew_point_K", T_d [K])`` or ``("humidity_ratio", W [kg/kg])``; None for a dry
        intake (no humidity given, or zero). The intake humidity ratio itself follows from
        it and the property model's saturation law, once per solve
        (:class:`stagewright.core.context.IntakeState`).
    relative_humidity : float
        The document's ``site.relative_humidity``, [-] (0 when the humidity is given
        otherwise).
    inlet_pressure_drop_Pa : float
        Pressure lost in the intake filter before stage 1, [Pa].
    """

    ambient_temperature_K: float
    pressure_Pa: float
    humidity: tuple | None
    relative_humidity: float
    inlet_pressure_drop_Pa: float

    @property
    def moist(self) -> bool:
        """True when the intake air carries water (a non-zero humidity input)."""
        return self.humidity is not None

    @property
    def stage_inlet_pressure_Pa(self) -> float:
        """Pressure after the intake filter, at the stage-1 inlet, [Pa]."""
        return self.pressure_Pa - self.inlet_pressure_drop_Pa

    def humidity_input(self) -> dict:
        """The humidity input as a site-section entry, ``{key: value}`` (empty when dry)."""
        return {} if self.humidity is None else {self.humidity[0]: self.humidity[1]}


def resolve_site(norm: dict) -> ResolvedSite:
    """What the solver needs of a normalised project's site, worked out once.

    Parameters
    ----------
    norm : dict
        Normalised project document (:func:`normalise`); its ``site`` section and
        ``inlet_pressure_drop_Pa`` [Pa] are read.

    Returns
    -------
    ResolvedSite
        Ambient temperature [K], barometric pressure [Pa] (given, from the elevation by
        ISO 2533, or sea level), the humidity input of a moist intake and the intake
        filter's pressure drop [Pa].

    Raises
    ------
    KeyError
        If ``norm`` lacks the ``site`` section or ``inlet_pressure_drop_Pa`` (it was not
        normalised).

    Notes
    -----
    A humidity input counts when it makes the intake moist: a relative humidity or
    humidity ratio above zero, or any dew point (the document allows at most one of the
    three). Resolve again after changing a site value of ``norm`` (a sweep axis does):
    nothing is stored in the document.

    Examples
    --------
    >>> norm = normalise({"site": {"ambient_temperature_K": 293.15, "elevation_m": 500.0,
    ...                            "relative_humidity": 0.6},
    ...                   "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...                   "inlet_pressure_drop_Pa": 1000.0,
    ...                   "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]})
    >>> site = resolve_site(norm)
    >>> round(site.pressure_Pa), round(site.stage_inlet_pressure_Pa), site.humidity
    (95461, 94461, ('relative_humidity', 0.6))
    """
    site = norm["site"]
    if site.get("dew_point_K") is not None:
        humidity = ("dew_point_K", site["dew_point_K"])
    elif site.get("humidity_ratio"):
        humidity = ("humidity_ratio", site["humidity_ratio"])
    elif site.get("relative_humidity"):
        humidity = ("relative_humidity", site["relative_humidity"])
    else:
        humidity = None
    return ResolvedSite(site["ambient_temperature_K"], barometric_pressure(site), humidity,
                        site.get("relative_humidity", 0.0), norm["inlet_pressure_drop_Pa"])


def _cross_checks(norm: dict) -> list[Problem]:
    out = []
    site = norm["site"]
    if site.get("barometric_pressure_Pa") is not None and site.get("elevation_m") is not None:
        out.append(Problem("site.elevation_m", site["elevation_m"],
                           "give either barometric_pressure_Pa or elevation_m, not both"))
    resolved = resolve_site(norm)
    p0, p1 = resolved.pressure_Pa, resolved.stage_inlet_pressure_Pa
    if norm["inlet_pressure_drop_Pa"] >= 0.5 * p0:
        out.append(Problem("inlet_pressure_drop_Pa", norm["inlet_pressure_drop_Pa"],
                           f"expected less than half the barometric pressure ({0.5 * p0:.0f} Pa)",
                           message_detail("{label} {value} must be less than half the barometric pressure ({half})",
                                          {"value": quantity(norm["inlet_pressure_drop_Pa"], "pressure_difference"),
                                           "half": quantity(0.5 * p0, "pressure_difference")})))
    out.extend(_delivery_checks(norm, p0, p1))
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
    out.extend(field_check_problems(norm))
    return out


def _delivery_checks(norm: dict, p0: float, p1: float) -> list[Problem]:
    """The delivery pressure, as stated (absolute or gauge), above the barometric pressure (so above
    the stage-1 inlet too) and within range.

    A delivery between the stage-1 inlet and the barometric pressure would be solved, but the
    isothermal and second-law efficiencies, which compare with compressing ambient air, come out
    negative (−0.19 for 0.99 bar at a 1 bar site): such a train is not a compressor, and is refused.
    """
    key, value = stated_delivery(norm)
    p_d = delivery_pressure(norm, p0)
    if key == ABSOLUTE_KEY:
        if p_d <= p0:
            return [Problem(key, value, f"expected an absolute pressure above the barometric pressure {p0:.0f} Pa",
                            message_detail("{label} {value} must be above the barometric pressure {p0}",
                                           {"value": quantity(p_d, "pressure"), "p0": quantity(p0, "pressure")}))]
        return []
    # a gauge pressure above zero is always above the stage-1 inlet (the filter only lowers it)
    top = PROJECT.fields[ABSOLUTE_KEY].hi
    if p_d > top:
        return [Problem(key, value, f"expected at most {top - p0:.0f} Pa gauge at this site: the absolute "
                                    f"delivery pressure can be at most {top:g} Pa")]
    return []


def _coolant_checks(cooler: dict | None, where: str) -> list[Problem]:
    """Cross-checks of a cooler's coolant side (stagewright.core.exchanger)."""
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


def _humidity_checks(raw_site: dict, norm: dict) -> list[Problem]:
    """Moist intake: one humidity input, a dew (or frost) point not above ambient.

    Intake air below 0 °C is in scope down to the schema's 223.15 K (relative humidity relative
    to liquid water, a dew point below 0.01 °C a frost point; :mod:`stagewright.core.moist.stream`), and
    a cooler outlet below 0 °C is a caution of the solve (frozen condensate), not an input
    problem."""
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
