"""The lines of a solved train's temperature–entropy chart, as plain SI data.

A chart only draws what these functions return: the process path of every stage and
cooler in flow order (:func:`path_segments`) and the isobars through the stage-1 inlet and
every stage discharge (:func:`isobars`), computed from the property model that produced
the result (:func:`isobar_model`). They read the plain-data result
(``TrainResult.to_dict()``), which is what the window and the reports hold.

Entropies are the model's own (each model has its own reference state): a chart draws
them relative to the intake, :math:`s - s_\\mathrm{intake}`.
"""
from __future__ import annotations

__all__ = ["PathSegment", "Isobar", "path_segments", "isobar_pressures", "isobar_model", "isobars",
           "ISOBAR_POINTS"]

from dataclasses import dataclass

from stagewright.core.errors import StagewrightError
from stagewright.core.models.base import T_MAX, T_MIN, PropertyModel

ISOBAR_POINTS = 48  #: points along an isobar, evenly spaced in temperature


@dataclass(frozen=True)
class PathSegment:
    """One compression or cooling line of the process path.

    Attributes
    ----------
    kind : str
        ``"stage"`` or ``"cooler"``.
    stage : int
        Number of the stage, 1-based (a cooler carries the number of the stage it follows).
    points : tuple of (float, float, float)
        States along the line in flow order: temperature [K], pressure [Pa], entropy
        [J/(kg K)] (per kilogram of dry air for moist air).
    """

    kind: str
    stage: int
    points: tuple

    @property
    def name(self) -> str:
        """``"stage-2"``, ``"cooler-1"`` …"""
        return f"{self.kind}-{self.stage}"


@dataclass(frozen=True)
class Isobar:
    """A line of constant pressure, evenly spaced in temperature.

    Attributes
    ----------
    number : int
        Position of its pressure in :func:`isobar_pressures`, 1-based.
    pressure_Pa : float
        Pressure, [Pa].
    temperature_K : tuple of float
        Temperatures, [K], rising.
    entropy_J_kgK : tuple of float
        Entropy at each temperature, [J/(kg K)] (the model's own reference).
    """

    number: int
    pressure_Pa: float
    temperature_K: tuple
    entropy_J_kgK: tuple


def _state(q: dict) -> tuple[float, float, float]:
    return q["temperature_K"], q["pressure_Pa"], q["entropy_J_kgK"]


def path_segments(result: dict) -> list[PathSegment]:
    """Every compression and cooling line of a solved train, in flow order.

    Parameters
    ----------
    result : dict
        ``TrainResult.to_dict()`` of a solve.

    Returns
    -------
    list of PathSegment
        Per stage its compression line (the states along the path, from the intake to the
        actual discharge also for a stage with casing heat loss or exit kinetic energy, then
        the static discharge where a lean solve's path ends elsewhere), followed by its cooling line if it has a cooler (the states along the line,
        or inlet and outlet when the solve kept none).

    Raises
    ------
    KeyError
        If ``result`` is not the plain-data result of a train solve.

    Notes
    -----
    The states are the solver's own (:func:`stagewright.core.polytropic.polytropic_path` for the
    compression, :func:`stagewright.core.cooler.solve_cooler` for the cooling line); nothing is
    recomputed.

    Examples
    --------
    >>> import stagewright.core
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...        "discharge_pressure_Pa": 4e5,
    ...        "stages": [{"efficiency": {"kind": "polytropic", "value": 0.8},
    ...                    "cooler": {"outlet_temperature_K": 303.15}}]}
    >>> segs = path_segments(stagewright.core.solve(doc).to_dict())
    >>> [s.name for s in segs], round(segs[0].points[-1][0], 4)  # 293.15 K · 4 ** (0.4 / (1.4 · 0.8))
    (['stage-1', 'cooler-1'], 480.9626)
    """
    segs = []
    for i, st in enumerate(result["stages"], 1):
        pts = [_state(q) for q in st["path"]]
        end = _state(st["outlet"])
        if not pts:
            pts = [_state(st["inlet"])]
        if abs(end[0] - pts[-1][0]) > 1e-9 or abs(end[2] - pts[-1][2]) > 1e-12:
            pts.append(end)  # a path that does not end at the discharge (never from a full solve)
        segs.append(PathSegment("stage", i, tuple(pts)))
        c = st.get("cooler")
        if c:
            cpts = [_state(q) for q in c.get("path") or []]
            if not cpts:
                cpts = [_state(p) for p in (c["inlet"], c["outlet"])]
            segs.append(PathSegment("cooler", i, tuple(cpts)))
    return segs


def isobar_pressures(result: dict) -> list[float]:
    """Pressures of a chart's isobars: the stage-1 inlet and every distinct stage discharge, [Pa].

    Parameters
    ----------
    result : dict
        ``TrainResult.to_dict()`` of a solve.

    Returns
    -------
    list of float
        Stage-1 inlet pressure, then each stage discharge pressure that differs from all
        earlier ones by more than 0.1 %, [Pa].

    Examples
    --------
    >>> isobar_pressures({"stages": [{"inlet": {"pressure_Pa": 1e5}, "outlet": {"pressure_Pa": 3e5}},
    ...                              {"inlet": {"pressure_Pa": 3e5}, "outlet": {"pressure_Pa": 9e5}}]})
    [100000.0, 300000.0, 900000.0]
    """
    out = [result["stages"][0]["inlet"]["pressure_Pa"]]
    for st in result["stages"]:
        p = st["outlet"]["pressure_Pa"]
        if all(abs(p - q) > 1e-3 * q for q in out):
            out.append(p)
    return out


def isobar_model(result: dict) -> PropertyModel | None:
    r"""The property model that produced ``result``, for its isobars (None if unknown) [1]_ [2]_.

    Parameters
    ----------
    result : dict
        ``TrainResult.to_dict()`` of a solve: its ``model``, ``intake_humidity_ratio`` and,
        for the constant-cp model, its intake and first stage discharge are read.

    Returns
    -------
    PropertyModel or None
        The model named by ``result["model"]`` (:func:`stagewright.core.solve.model_for`); for moist
        intake air (``intake_humidity_ratio`` > 0) the moist stream model of the intake's
        water, whose entropy per kilogram of dry air is the one the result's states carry
        (below the dew point at a pressure, the isobar includes the condensed water). None
        for a model this core does not know.

    Notes
    -----
    The result does not name the constant-cp model's cp and k, so they are recovered from
    the result's own states, exactly for a perfect gas [1]_: :math:`c_p = \Delta h / \Delta T`
    between the intake and the first stage discharge, :math:`R = p / (\rho T)` at the intake
    and :math:`k = c_p / (c_p - R)` (rounded to 9 and 12 decimals, so that repeated charts
    reuse one model).

    Examples
    --------
    >>> import stagewright.core
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...        "fluid": {"model": "constant_cp", "cp_J_kgK": 1040.0, "k": 1.36},
    ...        "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]}
    >>> model = isobar_model(stagewright.core.solve(doc).to_dict())
    >>> round(model.at_tp(300.0, 1e5).h - model.at_tp(299.0, 1e5).h, 6)  # cp, [J/(kg K)]
    1040.0

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §2-6, §4-4 (ideal gas: Pv = RT, Δh = cp ΔT, cp − cv = R).
    .. [2] ASHRAE Handbook — Fundamentals, 2017, ch. 1 (moist-air properties per kilogram of
       dry air).
    """
    from stagewright.core.solve import model_for  # local: stagewright.core.solve is the solver's entry point
    name = result.get("model")
    fluid = {"model": name}
    if name == "constant_cp":
        a, b = result["intake"], result["stages"][0]["outlet"]
        dT = b["temperature_K"] - a["temperature_K"]
        if abs(dT) > 1e-6:
            cp = (b["enthalpy_J_kg"] - a["enthalpy_J_kg"]) / dT
            R = a["pressure_Pa"] / (a["density_kg_m3"] * a["temperature_K"])
            fluid.update(cp_J_kgK=round(cp, 9), k=round(cp / (cp - R), 12))
    try:
        model = model_for(fluid)
    except KeyError:  # a model this core does not know: no isobars
        return None
    w0 = result.get("intake_humidity_ratio") or 0.0
    if w0 > 0.0:  # moist intake: isobars of the intake air's own water (entropy per kg dry air)
        from stagewright.core.moist.stream import MoistAir
        from stagewright.core.solve_context import mixture_for
        model = MoistAir(mixture_for(model), w0)
    return model


def isobars(result: dict, T_lo: float, T_hi: float, points: int = ISOBAR_POINTS) -> list[Isobar]:
    """Isobars of a solved train over a temperature range, from its own property model [1]_.

    .. math:: s_k(T_j) = s(T_j, p_k), \\qquad T_j = T_a + (T_b - T_a)\\,\\frac{j}{n - 1}

    Parameters
    ----------
    result : dict
        ``TrainResult.to_dict()`` of a solve.
    T_lo, T_hi : float
        Temperature range to cover, [K]; it is limited to the property models' window
        (200 K … 1300 K).
    points : int
        Points per isobar, n (at least 2).

    Returns
    -------
    list of Isobar
        One per pressure of :func:`isobar_pressures`, in that order; a pressure at which the
        model cannot give every point is left out (its number is skipped). Empty when the
        result's model is unknown.

    Notes
    -----
    The states come from :func:`isobar_model` (the result's property model, moist for a
    moist intake), one ``at_tp`` call per point.

    Examples
    --------
    >>> import stagewright.core
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...        "discharge_pressure_Pa": 4e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]}
    >>> lines = isobars(stagewright.core.solve(doc).to_dict(), 250.0, 500.0, points=6)
    >>> [(iso.number, iso.pressure_Pa, iso.temperature_K[:2]) for iso in lines]
    [(1, 100000.0, (250.0, 300.0)), (2, 400000.0, (250.0, 300.0))]
    >>> # perfect gas: s(T, 4 bar) − s(T, 1 bar) = −R ln 4 (Çengel & Boles 2015, §7-9)
    >>> round(lines[1].entropy_J_kgK[0] - lines[0].entropy_J_kgK[0], 6)  # −287.142857 · ln 4
    -398.064524

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-9 (entropy change of ideal gases).
    """
    model = isobar_model(result)
    if model is None:
        return []
    t_a, t_b = max(T_MIN, T_lo), min(T_MAX, T_hi)
    out = []
    for k, p in enumerate(isobar_pressures(result), 1):
        Ts = [t_a + (t_b - t_a) * j / (points - 1) for j in range(points)]
        try:
            ss = [model.at_tp(T, p, "isobar").s for T in Ts]
        except StagewrightError:
            continue
        out.append(Isobar(k, p, tuple(Ts), tuple(ss)))
    return out
