"""One solve's context: the resolved site, the property model, the intake state and the caches.

A solve resolves its inputs once, at the boundary, and passes them down:
:func:`stagewright.core.project.validation.resolve_site` works out the site (barometric pressure,
humidity input), :func:`solve_context` adds the property model and the state of the intake
air (its stream model, moist-air mixture, humidity ratio, the ambient and dead states and
the filter outlet) in one :class:`SolveContext`, and :func:`stagewright.core.train.solve_train` and
its steps read them from there. Nothing below derives the site pressure or the intake
humidity again, and nothing is stored on the model objects.

Caches shared across solves (sweeps, studies and the shaft-power iteration solve many
trains at one site) are kept per thread, as the property models themselves are
(:func:`stagewright.core.solve.model_for`: one CoolProp state per thread), in two small
least-recently-used maps keyed on the model object itself (never on its ``id``, which a
later object could reuse):

* the moist-air mixture of each dry-air model (:func:`mixture_for`, 16 models), whose own
  tables and memos of recent states are then kept from one solve to the next;
* the intake state of each (model, resolved site) (:func:`intake_state`, 64 sites).

:func:`release_thread_caches` empties the calling thread's maps
(:func:`stagewright.core.solve.release_thread_models` calls it before a worker thread ends).
"""
from __future__ import annotations

__all__ = ["SolveContext", "IntakeState", "solve_context", "intake_state", "mixture_for", "fixed_state",
           "release_thread_caches", "MIXTURE_CACHE_SIZE", "INTAKE_CACHE_SIZE"]

import threading
from collections import OrderedDict
from dataclasses import dataclass

from stagewright.core.exergy import DeadState
from stagewright.core.models.base import Point, PropertyModel
from stagewright.core.moist.mixture import MoistMixture, make_mixture
from stagewright.core.moist.stream import ice_supersaturation, intake_humidity_ratio, moist_stream
from stagewright.core.project.delivery import delivery_pressure
from stagewright.core.project.validation import ResolvedSite, resolve_site

MIXTURE_CACHE_SIZE = 16  #: dry-air models whose moist mixture each thread keeps
INTAKE_CACHE_SIZE = 64  #: (model, site) pairs whose intake state each thread keeps

_local = threading.local()
_MISSING = object()


class _Recent:
    """A least-recently-used map of at most ``size`` entries (one thread's; no lock)."""

    def __init__(self, size: int):
        self.size = size
        self.entries: OrderedDict = OrderedDict()

    def get(self, key):
        value = self.entries.get(key, _MISSING)
        if value is not _MISSING:
            self.entries.move_to_end(key)
        return value

    def put(self, key, value) -> None:
        self.entries[key] = value
        self.entries.move_to_end(key)
        if len(self.entries) > self.size:
            self.entries.popitem(last=False)


def _caches() -> tuple[_Recent, _Recent]:
    """(mixtures, intake states) of the calling thread."""
    caches = getattr(_local, "caches", None)
    if caches is None:
        caches = _local.caches = (_Recent(MIXTURE_CACHE_SIZE), _Recent(INTAKE_CACHE_SIZE))
    return caches


def release_thread_caches() -> None:
    """Empty the calling thread's mixtures and intake states (they hold CoolProp states).

    Examples
    --------
    >>> release_thread_caches()
    """
    caches = getattr(_local, "caches", None)
    if caches is not None:
        for cache in caches:
            cache.entries.clear()


def fixed_state(model: PropertyModel, T: float, P: float, where: str):
    """``model.at_tp(T, P, where)`` of a state that no input moves (normal conditions, the
    ISO 8573-1 reference), computed once per model and thread: the same Point on every call.

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> air = ConstantCpAir()
    >>> fixed_state(air, 273.15, 101325.0, "normal state") is fixed_state(air, 273.15, 101325.0, "normal state")
    True
    """
    states = _caches()[1]
    key = ("fixed state", model, T, P)
    point = states.get(key)
    if point is _MISSING:
        point = model.at_tp(T, P, where)
        states.put(key, point)
    return point


def mixture_for(model: PropertyModel) -> MoistMixture:
    """The moist-air formulation of a dry-air model, built once per model and thread.

    Parameters
    ----------
    model : PropertyModel
        Dry-air property model.

    Returns
    -------
    MoistMixture
        :func:`stagewright.core.moist.mixture.make_mixture` of ``model``; the same object on every
        call with the same model (its tables and memos of recent states are kept).

    Notes
    -----
    Kept in the calling thread's cache of the last 16 models (see the module notes).

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> air = ConstantCpAir()
    >>> mixture_for(air) is mixture_for(air)
    True
    """
    mixtures = _caches()[0]
    mix = mixtures.get(model)
    if mix is _MISSING:
        mix = make_mixture(model)
        mixtures.put(model, mix)
    return mix


@dataclass(frozen=True)
class IntakeState:
    """The air a train takes in: its stream model and states at the site and after the filter.

    Attributes
    ----------
    model : PropertyModel
        Stream model of the intake air: a :class:`~stagewright.core.moist.stream.MoistAir` of the
        intake's water, or the dry-air model itself for a dry intake (so that the dry
        calculation is exactly the one without moist air).
    mixture : MoistMixture or None
        Moist-air formulation of the property model; None for a dry intake.
    humidity_ratio : float
        Intake humidity ratio W0, [kg water / kg dry air] (0 for a dry intake).
    relative_humidity : float
        Ambient relative humidity over the stable phase (over ice below 0.01 °C), [-]: the
        humidity of an air coolant, in the convention of CoolProp's ``HAPropsSI`` input ``R``.
    frost_deposit : float
        Water above saturation over ice that a sub-zero intake deposits on the intake
        louvres and filter before the compressor, [kg/kg dry air] (0 normally;
        :func:`stagewright.core.moist.stream.ice_supersaturation`).
    ambient : Point
        Ambient air at the site's temperature and barometric pressure.
    dead : DeadState
        Dead state of the exergy balances (for moist air with the partial properties of
        the ambient's water).
    after_filter : Point
        Air after the intake filter, at the stage-1 inlet pressure (a throttle: the
        ambient enthalpy).
    """

    model: PropertyModel
    mixture: MoistMixture | None
    humidity_ratio: float
    relative_humidity: float
    ambient: Point
    dead: DeadState
    after_filter: Point
    frost_deposit: float = 0.0


@dataclass(frozen=True)
class SolveContext:
    """Everything a train solve reads besides the stages: built once per solve by :func:`solve_context`.

    Attributes
    ----------
    norm : dict
        Normalised project document (:func:`stagewright.core.project.validation.normalise`).
    site : ResolvedSite
        The site resolved at the boundary: ambient temperature [K], barometric pressure
        [Pa], humidity input, intake filter drop [Pa].
    model : PropertyModel
        Dry-air property model named by the project.
    intake : IntakeState
        Stream model, mixture, humidity ratio and states of the intake air.
    delivery_pressure_Pa : float
        Absolute pressure wanted after the last cooler, resolved from what the project
        states (absolute, or gauge above this solve's site pressure;
        :func:`stagewright.core.project.delivery.delivery_pressure`), [Pa].
    """

    norm: dict
    site: ResolvedSite
    model: PropertyModel
    intake: IntakeState
    delivery_pressure_Pa: float

    @property
    def mixture(self) -> MoistMixture | None:
        """Moist-air formulation of a moist intake; None for a dry one."""
        return self.intake.mixture


def _water_reference(mixture: MoistMixture, T0: float, P0: float, W0: float) -> tuple[float, float]:
    r"""Partial specific enthalpy and entropy of water in the ambient air [1]_.

    .. math:: \bar s_w = -\left(\frac{\partial \mu_w}{\partial T}\right)_{p, x}, \qquad
       \bar h_w = \mu_w + T_0 \bar s_w

    Parameters
    ----------
    mixture : MoistMixture
        Moist-air formulation (its chemical potential of water, per kilogram of water).
    T0, P0 : float
        Ambient temperature [K] and barometric pressure [Pa].
    W0 : float
        Ambient humidity ratio, [kg/kg].

    Returns
    -------
    tuple of float
        :math:`\bar h_w` [J/kg] and :math:`\bar s_w` [J/(kg K)].

    Notes
    -----
    The temperature derivative is a central difference with a step of 1e-3 K at fixed
    mole fraction of water :math:`x_0 = W_0/(\varepsilon + W_0)`.

    References
    ----------
    .. [1] J. M. Smith, H. C. Van Ness, M. M. Abbott, *Introduction to Chemical Engineering
       Thermodynamics*, 7th ed., McGraw-Hill, 2005, ch. 11 (chemical potential and partial
       properties).
    """
    x0 = W0 / (mixture.epsilon + W0)
    d = 1e-3
    mu = mixture.mu_water(T0, P0, x0)
    s_w = -(mixture.mu_water(T0 + d, P0, x0) - mixture.mu_water(T0 - d, P0, x0)) / (2.0 * d)
    return mu + T0 * s_w, s_w


def _new_intake_state(model: PropertyModel, site: ResolvedSite) -> IntakeState:
    """The intake state of :func:`intake_state`, computed (no cache).

    Parameters
    ----------
    model : PropertyModel
        Dry-air property model.
    site : ResolvedSite
        Resolved site.

    Returns
    -------
    IntakeState

    Notes
    -----
    The equations and sources are those of :func:`intake_state` and
    :func:`_water_reference`.
    """
    T0, P0 = site.ambient_temperature_K, site.pressure_Pa
    stream, mixture, W0, frost = model, None, 0.0, 0.0
    if site.moist:
        mix = mixture_for(model)
        W = intake_humidity_ratio(site.humidity_input(), mix, T0, P0)
        frost = ice_supersaturation(mix, T0, P0, W)
        W -= frost
        if W > 0.0:
            stream, mixture, W0 = moist_stream(mix, W), mix, W
    ambient = stream.at_tp(T0, P0, "site intake")
    if mixture is None:
        dead = DeadState(T0, P0, ambient.h, ambient.s)
    else:
        dead = DeadState(T0, P0, ambient.h, ambient.s, W0, *_water_reference(mixture, T0, P0, W0))
    p1 = P0 - site.inlet_pressure_drop_Pa
    throttle = getattr(stream, "isenthalpic_guess", None)  # the Joule–Thomson change across the filter
    t_guess = throttle(ambient, p1) if throttle is not None else None
    after_filter = stream.at_hp(ambient.h, p1, "intake filter outlet", T_guess=T0 if t_guess is None else t_guess)
    # saturated over ice after rime: 1 within rounding, and never above (CoolProp refuses R > 1)
    rh0 = site.relative_humidity if mixture is None else min(1.0, mixture.saturation_degree(T0, P0, W0))
    return IntakeState(stream, mixture, W0, rh0, ambient, dead, after_filter, frost)


def intake_state(model: PropertyModel, site: ResolvedSite) -> IntakeState:
    r"""The intake air of a train at a site: stream model, humidity ratio, ambient and filter states [1]_.

    .. math:: h_1 = h_0(T_0, p_0), \qquad p_1 = p_0 - \Delta p_\mathrm{filter}

    Parameters
    ----------
    model : PropertyModel
        Dry-air property model named by the project.
    site : ResolvedSite
        Resolved site (:func:`stagewright.core.project.validation.resolve_site`).

    Returns
    -------
    IntakeState
        The same object for the same model and site while the thread's cache keeps it.

    Raises
    ------
    InputError
        If the humidity input is out of range at the site (a humidity ratio above
        saturation, an ambient below 0 °C for moist air;
        :func:`stagewright.core.moist.stream.intake_humidity_ratio`).
    PropertyRangeError
        If the ambient state lies outside the property model's range.

    Notes
    -----
    The intake filter is a throttle: the air keeps the ambient enthalpy and drops to the
    stage-1 inlet pressure. The intake humidity ratio follows from the site's humidity
    input and the mixture's saturation law (:func:`stagewright.core.moist.stream.intake_humidity_ratio`);
    it depends on the property model, which is why it is resolved here, once per solve,
    and not by the validation. Cached per thread for the last 64 (model, site) pairs.

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.project.validation import ResolvedSite
    >>> site = ResolvedSite(293.15, 1e5, None, 0.0, 2000.0)
    >>> state = intake_state(ConstantCpAir(), site)
    >>> state.after_filter.T, state.after_filter.P, state.mixture is None
    (293.15, 98000.0, True)

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §5-4 (throttling valves: constant enthalpy).
    """
    states = _caches()[1]
    key = (model, site)
    state = states.get(key)
    if state is _MISSING:
        state = _new_intake_state(model, site)
        states.put(key, state)
    return state


def solve_context(norm: dict, model: PropertyModel, site: ResolvedSite | None = None) -> SolveContext:
    """The context of one solve: resolved site, property model, intake state, delivery pressure.

    Parameters
    ----------
    norm : dict
        Normalised project document.
    model : PropertyModel
        Dry-air property model named by the project (:func:`stagewright.core.solve.model_for`).
    site : ResolvedSite, optional
        The resolved site, when the caller has it already; by default
        :func:`stagewright.core.project.validation.resolve_site` of ``norm``.

    Returns
    -------
    SolveContext

    Raises
    ------
    InputError, PropertyRangeError
        As :func:`intake_state`.

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.project.validation import normalise
    >>> norm = normalise({"site": {"ambient_temperature_K": 293.15, "elevation_m": 1000.0},
    ...                   "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...                   "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}]})
    >>> ctx = solve_context(norm, ConstantCpAir())
    >>> round(ctx.site.pressure_Pa), round(ctx.intake.dead.P0)  # ISO 2533 table: 89 875 Pa
    (89875, 89875)
    >>> ctx.delivery_pressure_Pa  # stated absolute
    400000.0
    """
    site = resolve_site(norm) if site is None else site
    return SolveContext(norm, site, model, intake_state(model, site), delivery_pressure(norm, site.pressure_Pa))
