r"""The coolant side of a cooler: water, water–glycol, or ambient air [1]_ [2]_ [3]_.

The user gives the coolant inlet temperature and either its mass flow or its temperature
rise; :func:`coolant_side` returns the other and the outlet temperature from the
coolant's enthalpy, so that the coolant energy balance equals the air-side duty exactly:

.. math:: \dot Q = \dot m_c \left[h_c(T_{c,o}) - h_c(T_{c,i})\right]

Coolants (registry :data:`COOLANTS`):

``water``
    Liquid water, CoolProp incompressible ``Water``; usable from 273.15 K to 373.15 K (the
    circuit is taken as open or low-pressure: the outlet must stay below atmospheric
    boiling).
``glycol``
    Water–ethylene glycol (CoolProp ``MEG``) or water–propylene glycol (``MPG``), glycol
    mass fraction 0 … 0.6; usable from the mixture's freezing point to 373.15 K.
``air``
    Ambient air (an air-cooled cooler's fan air) at the site barometric pressure and
    humidity ratio, humid-air properties of ASHRAE RP-1485 via ``HAPropsSI``; flow is
    humid-air mass flow.

Properties come only through :mod:`stagewright.core.coolprop_adapter`.
"""
from __future__ import annotations

__all__ = ["COOLANTS", "CoolantSide", "make_coolant", "coolant_side", "COOLANT_PRESSURE_PA", "warm_up",
           "temperature_from_h"]

import threading
from dataclasses import dataclass


from stagewright.core import coolprop_adapter as cpa
from stagewright.core.direct_init import direct_init
from stagewright.core.errors import InputError

#: pressure at which liquid-coolant properties are evaluated, [Pa]; liquids are nearly
#: incompressible, and CoolProp's incompressible tables do not depend on it.
COOLANT_PRESSURE_PA = 3.0e5
_BOILING_LIMIT_K = 373.15  #: liquid outlet limit: no boiling at atmospheric pressure, [K]


def brentq(*args, **kwargs):
    """scipy.optimize.brentq, imported on first use (keeps start-up light)."""
    from scipy.optimize import brentq as _brentq
    return _brentq(*args, **kwargs)


class _Liquid:
    """A liquid coolant from CoolProp's incompressible tables."""

    def __init__(self, kind: str, fluid: str, fraction: float | None, label: str):
        self.kind = kind
        self.label = label
        self._state = cpa.new_incompressible_state(fluid, fraction)
        self._memo: dict = {}
        lo, hi = cpa.incompressible_limits(fluid, fraction)
        self.t_min, self.t_max = lo, min(hi, _BOILING_LIMIT_K)

    def _set(self, T: float) -> None:
        cpa.incompressible_update_tp(self._state, T, COOLANT_PRESSURE_PA, f"coolant {self.label}")

    def _prop(self, which: int, T: float) -> float:
        # a rating sizes the exchanger several times at the same inlet and limit: keep the answers
        key = (which, T)
        value = self._memo.get(key)
        if value is None:
            if len(self._memo) > 256:
                self._memo.clear()
            self._set(T)
            state = self._state
            value = self._memo[key] = (state.hmass, state.smass, state.rhomass)[which]()
        return value

    def h(self, T: float) -> float:
        return self._prop(0, T)

    def s(self, T: float) -> float:
        return self._prop(1, T)

    def rho(self, T: float) -> float:
        return self._prop(2, T)


class _AmbientAir:
    """Ambient air at the site pressure and humidity ratio (per kg of humid air)."""

    kind = "air"

    def __init__(self, pressure: float, humidity_ratio: float):
        self.label = "ambient air"
        self.P, self.W = pressure, humidity_ratio
        self._memo: dict = {}
        self.t_min, self.t_max = 223.15, 573.15

    def _prop(self, name: str, T: float) -> float:
        # a rating sizes the exchanger several times at the same coolant inlet: keep the answers
        key = (name, T)
        value = self._memo.get(key)
        if value is None:
            if len(self._memo) > 256:
                self._memo.clear()
            value = self._memo[key] = cpa.humid_air_property(name, "T", T, "P", self.P, "W", self.W)
        return value

    def h(self, T: float) -> float:
        return self._prop("Hha", T)

    def s(self, T: float) -> float:
        return self._prop("Sha", T)

    def rho(self, T: float) -> float:
        return 1.0 / self._prop("Vha", T)


_LIQUIDS = threading.local()


def _liquid(kind: str, fluid: str, fraction: float | None, label: str, fast: bool = False):
    """This thread's liquid coolant of that fluid and fraction, made once and handed out again.

    Making one costs a CoolProp state and three limit calls (a year asked for two a bin); what it
    keeps between solves is only its memo of exact answers. The starting points a rating's
    searches keep on it (``last_outlet``, ``last_boundary``) are cleared, so a reused coolant
    gives the same answers, bit for bit, as a new one. ``fast`` (the fast property path): its
    :class:`~stagewright.core.exchanger.liquid_table.TabulatedLiquid`, also made once per thread."""
    made = getattr(_LIQUIDS, "made", None)
    if made is None:
        made = _LIQUIDS.made = {}
    key = (fluid, fraction, label, fast)
    liquid = made.get(key)
    if liquid is None:
        if len(made) > 16:
            made.clear()
        if fast:
            from stagewright.core.exchanger.liquid_table import TabulatedLiquid  # local: fast path only
            liquid = made[key] = TabulatedLiquid(_liquid(kind, fluid, fraction, label))
        else:
            liquid = made[key] = _Liquid(kind, fluid, fraction, label)
    liquid.__dict__.pop("last_outlet", None)
    liquid.__dict__.pop("last_boundary", None)
    return liquid


def _water(spec, site, fast: bool = False):
    return _liquid("water", "Water", None, "water", fast)


def _glycol(spec, site, fast: bool = False):
    glycol = spec.get("glycol", "ethylene")
    name = {"ethylene": "MEG", "propylene": "MPG"}[glycol]
    x = spec["glycol_fraction"]
    return _liquid("glycol", name, x, f"water–{glycol} glycol ({x:.0%} by mass)", fast)


def _air(spec, site, fast: bool = False, humidity_ratio: float | None = None):
    T0, P0, rh = site
    if humidity_ratio is not None:
        w = humidity_ratio
    else:
        w = 0.0 if rh <= 0.0 else cpa.humid_air_property("W", "T", T0, "P", P0, "R", rh)
    if fast:  # trial solves: the table of stagewright.core.exchanger.air_table (HAPropsSI to 2e-5 J/kg)
        from stagewright.core.exchanger.air_table import TabulatedAmbientAir
        return TabulatedAmbientAir(P0, w)
    return _AmbientAir(P0, w)


#: coolant kind -> factory taking the ``coolant`` entry and the site (T0 [K], p0 [Pa], RH [-])
COOLANTS = {"water": _water, "glycol": _glycol, "air": _air}


def make_coolant(spec: dict, site: tuple, fast: bool = False, humidity_ratio: float | None = None):
    """Build the coolant a ``cooler.coolant`` entry names (see :data:`COOLANTS`).

    ``fast`` (the fast property path of trial solves): an air coolant's properties from the
    table of :mod:`stagewright.core.exchanger.air_table` instead of a ``HAPropsSI`` call each, a
    liquid's enthalpy and entropy from :mod:`stagewright.core.exchanger.liquid_table`. ``humidity_ratio`` [kg/kg dry air], on the fast path: the ambient's humidity
    ratio as the intake already has it, instead of ``HAPropsSI`` from the site's relative humidity
    (the same air; the two agree to the saturation laws' rounding)."""
    if fast:
        if spec["kind"] == "air":
            return _air(spec, site, fast=True, humidity_ratio=humidity_ratio)
        return COOLANTS[spec["kind"]](spec, site, fast=True)
    return COOLANTS[spec["kind"]](spec, site)


def warm_up() -> None:
    """Load what the first solve with a coolant needs, so that it does not wait for it.

    scipy's root finder (the exchanger sizing's Brent method; importing ``scipy.optimize``
    takes most of a second on a slow machine), CoolProp's incompressible-liquid tables of every
    coolant and its humid-air back end. The window calls this once on a background thread after
    its first answer; any later solve then finds them loaded. Nothing is computed for a result.

    Examples
    --------
    >>> warm_up()
    """
    brentq(lambda x: x - 1.0, 0.0, 2.0)
    for fluid, fraction in (("Water", None), ("MEG", 0.3), ("MPG", 0.3)):
        liquid = _Liquid("warm-up", fluid, fraction, fluid)
        liquid.h(0.5 * (liquid.t_min + liquid.t_max))
    _AmbientAir(101_325.0, 0.01).h(300.0)


@direct_init
@dataclass(frozen=True)
class CoolantSide:
    """The coolant stream through one cooler (SI units)."""

    kind: str
    label: str
    flow_kg_s: float
    inlet_temperature_K: float
    outlet_temperature_K: float
    duty_W: float
    #: thermodynamic mean temperature Δh/Δs of the coolant, [K]: where its heat is received
    mean_temperature_K: float
    inlet_density_kg_m3: float

    @property
    def volume_flow_m3_s(self) -> float:
        """Coolant volume flow at the inlet, [m³/s]."""
        return self.flow_kg_s / self.inlet_density_kg_m3


def temperature_from_h(fluid, h_target: float, t_lo: float, t_hi: float, h_lo: float, h_hi: float,
                       near: tuple | None = None) -> float:
    """T with ``fluid.h(T) = h_target`` on [t_lo, t_hi] (``h_lo``, ``h_hi`` the enthalpies there), to 1e-12 K.

    A coolant's h(T) is nearly straight, so secant steps from the chord's root settle in three or
    four enthalpy calls (each a CoolProp call, humid air ~0.1 ms); steps are kept inside the
    bracket, and Brent's method on the bracket decides should they not settle in 12 steps. A step
    below 1e-12 K (or two equal enthalpies: rounding) ends the search even where rounding puts it
    just outside the bracket (before, such a step was sent to mid-bracket and a third of the
    searches of a rating ran to Brent's method).
    ``near`` = (T, h) of an earlier answer on the same fluid (a rating's sizings ask for nearby
    outlets): the first step then follows the local chord from ``t_lo`` through it, one or two
    calls fewer; the answer is the same root to the same tolerance.
    """
    a, fa, b, fb = t_lo, h_lo - h_target, t_hi, h_hi - h_target
    x0, f0 = (a, fa) if abs(fa) <= abs(fb) else (b, fb)
    x1 = a - fa * (b - a) / (fb - fa) if fb != fa else 0.5 * (a + b)
    if near is not None and a < near[0] < b and near[1] != h_lo:
        guess = a - fa * (near[0] - a) / (near[1] - h_lo)  # root of the chord from t_lo through ``near``
        if a < guess < b:
            x1 = guess
    for _ in range(12):
        f1 = fluid.h(x1) - h_target
        if f1 == 0.0:
            return x1
        if f1 < 0.0:
            a, fa = x1, f1
        else:
            b, fb = x1, f1
        if f1 != f0:
            x2 = x1 - f1 * (x1 - x0) / (f1 - f0)
        else:  # equal enthalpies: at temperatures within 1e-9 K that is rounding (settled), else bisect
            x2 = x1 if abs(x1 - x0) <= 1e-9 else 0.5 * (a + b)
        if abs(x2 - x1) <= 1e-12:  # settled (tested before the bracket: a step of rounding may leave it)
            return min(max(x2, a), b)
        if not a < x2 < b:
            x2 = 0.5 * (a + b)
        x0, f0, x1 = x1, f1, x2
    return brentq(lambda T: fluid.h(T) - h_target, a, b, xtol=1e-12, rtol=1e-15, maxiter=200)


def coolant_side(fluid, t_in: float, duty: float, flow: float | None = None, rise: float | None = None,
                 where: str = "cooler") -> CoolantSide:
    r"""Coolant flow, outlet temperature and mean temperature for a duty [1]_ [3]_.

    .. math::

        T_{c,o} = h_c^{-1}\!\left(h_c(T_{c,i}) + \dot Q/\dot m_c\right) \;\text{(flow given)},
        \qquad
        \dot m_c = \frac{\dot Q}{h_c(T_{c,i} + \Delta T_c) - h_c(T_{c,i})} \;\text{(rise given)},
        \qquad
        \bar T_c = \frac{h_{c,o} - h_{c,i}}{s_{c,o} - s_{c,i}}

    Parameters
    ----------
    fluid : object
        A coolant from :func:`make_coolant`.
    t_in : float
        Coolant inlet temperature, [K].
    duty : float
        Heat taken from the compressed air, [W].
    flow : float, optional
        Coolant mass flow, [kg/s] (give this or ``rise``).
    rise : float, optional
        Coolant temperature rise, [K].
    where : str
        Input path of the cooler entry (``stages[0].cooler``), for messages.

    Returns
    -------
    CoolantSide

    Raises
    ------
    InputError
        If the inlet lies outside the coolant's range (frozen or boiling), or the flow is
        too small (or the rise too large) for the coolant to stay below its limit.

    Notes
    -----
    :math:`\bar T_c` is the temperature at which a reversible receiver would take the same
    heat with the same entropy change; using it as the cooler's boundary temperature puts
    the entropy generated inside the exchanger in the cooler and the exergy gained by the
    coolant in the heat term [2]_.

    Examples
    --------
    >>> w = make_coolant({"kind": "water"}, (293.15, 101325.0, 0.0))
    >>> side = coolant_side(w, 293.15, 41_800.0, rise=10.0)
    >>> round(side.flow_kg_s, 3)  # ≈ Q / (cp ΔT), cp ≈ 4.17 kJ/(kg K) near 298 K
    1.002

    References
    ----------
    .. [1] I. H. Bell, J. Wronski, S. Quoilin, V. Lemort, Ind. Eng. Chem. Res. 53 (2014)
       2498–2508 (CoolProp; incompressible liquids after M. Conde, "Thermophysical
       properties of brines", M. Conde Engineering, Zurich, 2002, and the IIR tables).
    .. [2] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.2 and §3.5.
    .. [3] ASHRAE, *RP-1485: Thermodynamic properties of real moist air, dry air, steam,
       water, and ice*, S. Herrmann, H.-J. Kretzschmar, D. P. Gatley, 2009.
    """
    t_field = f"{where}.coolant_inlet_temperature_K"
    if not fluid.t_min <= t_in < fluid.t_max:
        raise InputError(t_field, t_in, f"expected a {fluid.label} inlet temperature in "
                                        f"[{fluid.t_min:.2f}, {fluid.t_max:.2f}) K (frozen below, "
                                        "boiling or out of the property table above)")
    h_in = fluid.h(t_in)
    h_max = fluid.h(fluid.t_max)
    if rise is not None:
        t_out = t_in + rise
        if t_out > fluid.t_max:
            raise InputError(f"{where}.coolant.temperature_rise_K", rise,
                             f"expected at most {fluid.t_max - t_in:.2f} K: the {fluid.label} "
                             f"would leave above {fluid.t_max:.2f} K")
        dh = fluid.h(t_out) - h_in
        flow = duty / dh if dh > 0.0 else 0.0
    else:
        if duty > 0.0 and duty / flow > h_max - h_in:
            raise InputError(f"{where}.coolant.flow_kg_s", flow,
                             f"expected at least {duty / (h_max - h_in):.6g} kg/s for a duty of "
                             f"{duty:.6g} W: less would heat the {fluid.label} above "
                             f"{fluid.t_max:.2f} K")
        if duty <= 0.0:
            t_out = t_in
        else:  # a rating sizes the same coolant several times: start from its last outlet
            h_out = h_in + duty / flow
            t_out = temperature_from_h(fluid, h_out, t_in, fluid.t_max, h_in, h_max,
                                       near=getattr(fluid, "last_outlet", None))
            fluid.last_outlet = (t_out, h_out)
    change = getattr(fluid, "entropy_change", None)
    ds = fluid.s(t_out) - fluid.s(t_in) if change is None else change(t_in, t_out)
    dh = fluid.h(t_out) - h_in
    t_mean = dh / ds if ds > 0.0 and dh > 0.0 else 0.5 * (t_in + t_out)
    return CoolantSide(kind=fluid.kind, label=fluid.label, flow_kg_s=flow, inlet_temperature_K=t_in,
                       outlet_temperature_K=t_out, duty_W=duty, mean_temperature_K=t_mean,
                       inlet_density_kg_m3=fluid.rho(t_in))
