"""The one place where the core talks to CoolProp [1]_.

Everything else in :mod:`thermo` asks this module for property states; a failed
CoolProp flash becomes a :class:`~stagewright.core.errors.PropertyRangeError` that echoes the
inputs instead of a C++ message.
"""
from __future__ import annotations

__all__ = ["new_air_state", "new_gas_air_state", "update_tp", "eos_reference", "coolprop_version",
           "load_library_in_background",
           "humid_air_property", "water_saturation_pressure", "new_water_state", "water_ideal_gas",
           "humid_air_coefficient", "liquid_water_density", "new_incompressible_state",
           "incompressible_update_tp", "incompressible_limits"]

import atexit
import sys
import threading
import time
from functools import lru_cache

from stagewright.core.errors import PropertyRangeError

_CONSTANTS = ("PT_INPUTS", "DmassT_INPUTS", "DmolarT_INPUTS", "iHmass", "iP", "iT", "iDmolar", "iDmass", "iCpmass")

#: (seconds it took, ``time.perf_counter()`` when it ended) of loading CoolProp in this process;
#: None until it has loaded. A window's first solve includes it, and says so.
LOADED: tuple[float, float] | None = None


#: the thread loading CoolProp's fluid library ahead of the first import (:func:`load_library_in_background`)
_AHEAD: threading.Thread | None = None
#: ``CoolProp::get_library()``, the C++ function that parses the fluid library on first call (its
#: Itanium C++ ABI name: the Linux and macOS builds export it from the extension module)
_GET_LIBRARY = "_ZN8CoolProp11get_libraryEv"


def load_library_in_background() -> bool:
    """Start parsing CoolProp's fluid library on a background thread that does not hold the interpreter.

    The first property call parses every fluid of CoolProp's built-in library (about 1.3 s of CPU
    here), inside a C++ call that holds Python's interpreter lock: a window that solved its first
    project after it appeared stood still for that long. Called at a window's launch, this loads the
    extension module with :mod:`ctypes` (no Python import, no module initialisation) and calls
    ``CoolProp::get_library()`` there; a ctypes call releases the interpreter lock, so the window's
    own imports and first paint run meanwhile on the other core. The later ``import CoolProp`` finds
    the same library in the same process already loaded. The first import waits for this thread
    (:func:`_load`), and the process waits for it at exit, so the library is never parsed twice at once.

    Returns
    -------
    bool
        Whether the background load started (False where the module or its exported function is
        not found, e.g. another platform's build, or CoolProp is already imported: then the first
        property call loads it as before).
    """
    global _AHEAD
    if _AHEAD is not None or "CoolProp.CoolProp" in sys.modules:
        return False
    try:
        import ctypes
        from importlib.util import find_spec
        from pathlib import Path
        spec = find_spec("CoolProp")  # locates the package without running its __init__
        folders = list(spec.submodule_search_locations or []) if spec is not None else []
        candidates = [p for folder in folders for p in Path(folder).glob("CoolProp.*") if p.suffix in (".so", ".dylib")]
        if len(candidates) != 1:
            return False
        get_library = getattr(ctypes.CDLL(str(candidates[0])), _GET_LIBRARY)
    except (OSError, AttributeError, ImportError, ValueError):
        return False
    get_library.restype = ctypes.c_void_p
    get_library.argtypes = []
    _AHEAD = threading.Thread(target=get_library, name="stagewright-coolprop-library", daemon=True)
    _AHEAD.start()
    atexit.register(_AHEAD.join)  # never exit (C++ destructors) in the middle of the parse
    return True


def _load():
    """Import CoolProp (loading its fluid library takes most of a second) and bind its names here."""
    global LOADED
    start = time.perf_counter()
    if _AHEAD is not None:
        if _AHEAD.is_alive():
            _import_numpy()  # CoolProp's module imports it: meanwhile, while the library still loads
        _AHEAD.join()  # CoolProp's library loader is not safe to run twice at once
    import CoolProp.CoolProp as cp
    _require_ideal_gas_parts(cp)
    g = globals()
    for name in _CONSTANTS:
        g[name] = getattr(cp, name)
    g["_CP"] = cp
    if LOADED is None:
        end = time.perf_counter()
        LOADED = (end - start, end)
    return cp


def _require_ideal_gas_parts(cp) -> None:
    """Raise ImportError naming the version where CoolProp is older than 7.2: the moist mixtures read
    water's ideal-gas h and s through ``AbstractState.hmass_idealgas``/``smass_idealgas``, which
    arrived in 7.2 (pyproject.toml asks for it; an older one installed by hand would otherwise fail
    deep inside the first moist solve)."""
    if not hasattr(cp.AbstractState, "hmass_idealgas"):
        version = getattr(cp, "__version__", None) or cp.get_global_param_string("version")
        raise ImportError(f"Stagewright needs CoolProp 7.2 or newer (found {version}): "
                          "pip install --upgrade \"CoolProp>=7.2,<8\"")


def _import_numpy() -> None:
    """Import numpy, which ``CoolProp.CoolProp`` imports first thing (about 0.1 s here), so that a
    wait for the library loading ahead (:func:`load_library_in_background`) is not idle time."""
    try:
        import numpy  # noqa: F401
    except ImportError:  # CoolProp's own import will say what is missing
        pass


class _OnFirstUse:
    """Stands for ``CoolProp.CoolProp`` until something asks it for a name: CoolProp is imported
    on the first property call, not when the core is imported, so a window can show first."""

    def __getattr__(self, name):
        return getattr(_load(), name)


_CP = _OnFirstUse()


def __getattr__(name: str):
    """``PT_INPUTS``, ``iHmass`` … of CoolProp, loading it on first use (PEP 562)."""
    if name in _CONSTANTS:
        _load()
        return globals()[name]
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def new_air_state():
    """Return a fresh CoolProp ``AbstractState`` for dry air (HEOS back end, Lemmon 2000).

    Returns
    -------
    CoolProp.AbstractState
        Low-level state object; keep one per property model and reuse it.

    References
    ----------
    .. [1] I. H. Bell, J. Wronski, S. Quoilin, V. Lemort, "Pure and Pseudo-pure Fluid
       Thermophysical Property Evaluation and the Open-Source Thermophysical Property
       Library CoolProp", Ind. Eng. Chem. Res. 53 (2014) 2498–2508.
    """
    return _CP.AbstractState("HEOS", "Air")


def new_gas_air_state():
    """A fresh dry-air ``AbstractState`` (as :func:`new_air_state`) whose (T, p) flashes skip
    CoolProp's phase determination: every state of the property models lies above the critical
    temperature of air (132.5 K; the models start at 200 K), so it is imposed as gas [1]_.

    The answers are those of :func:`new_air_state`'s flash, bit for bit (density, h, s, cp and
    (∂h/∂p)_T compared on 20 000 random states over 199–1301 K and 0.8 kPa–126 MPa, and in
    ``tests/test_models.py``); a flash takes about three quarters of the time. Use it for (T, p)
    updates only.

    References
    ----------
    .. [1] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, J. Phys. Chem. Ref.
       Data 29 (2000) 331–385 (critical point of air: 132.5306 K, 3.7860 MPa).
    """
    state = new_air_state()
    state.specify_phase(_CP.iphase_supercritical_gas)
    return state


def update_tp(state, temperature: float, pressure: float, where: str = "", flash=None) -> None:
    """Set ``state`` to temperature [K] and pressure [Pa]; raise our own error on failure.
    ``flash``: the state's own ``flash(P, T)`` (:func:`stagewright.core.air_tp_flash.tp_flash`),
    else CoolProp's (T, p) flash."""
    try:
        if flash is not None:
            flash(pressure, temperature)
        else:
            state.update(_CP.PT_INPUTS, pressure, temperature)
    except ValueError as exc:  # CoolProp reports every flash failure as ValueError
        raise PropertyRangeError(
            f"{where or 'state'}: air properties unavailable at T = {temperature:.6g} K, "
            f"p = {pressure:.6g} Pa ({exc})", where) from None


def _version() -> str:
    _load()  # the package's __init__ reads the fluid library: after any load started ahead
    import CoolProp
    return CoolProp.__version__


@lru_cache(maxsize=None)
def eos_reference(model: str) -> str:
    """Bibliographic reference of the equation of state behind a property model."""
    if model == "real_gas":
        key = _CP.get_BibTeXKey("Air", "EOS")
        return ("E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, J. Phys. Chem. "
                f"Ref. Data 29 (2000) 331–385 [{key}], via CoolProp {_version()}")
    if model == "ideal_gas":
        return ("Ideal-gas part of Lemmon et al., J. Phys. Chem. Ref. Data 29 (2000) 331–385, "
                f"via CoolProp {_version()}")
    return "Perfect gas with constant specific heat (user cp and k)"


def coolprop_version() -> str:
    """Version string of the CoolProp library in use."""
    return _version()


def humid_air_property(output: str, *pairs) -> float:
    """``HAPropsSI`` (ASHRAE RP-1485) behind our error type; ``pairs`` = name, value, …"""
    try:
        return _CP.HAPropsSI(output, *pairs)
    except ValueError as exc:
        shown = ", ".join(f"{pairs[i]}={pairs[i + 1]:.6g}" for i in range(0, len(pairs), 2))
        raise PropertyRangeError(f"humid-air property {output} unavailable at {shown} ({exc})") from None


def water_saturation_pressure(temperature: float) -> float:
    """Saturation pressure of pure water [Pa] at ``temperature`` [K] (IAPWS-95 in CoolProp)."""
    try:
        return _CP.PropsSI("P", "T", temperature, "Q", 0, "Water")
    except ValueError as exc:
        raise PropertyRangeError(f"water saturation pressure unavailable at T = {temperature:.6g} K ({exc})") from None


def new_water_state():
    """Return a fresh CoolProp ``AbstractState`` for water (HEOS back end, IAPWS-95)."""
    return _CP.AbstractState("HEOS", "Water")


def water_ideal_gas(state, temperature: float) -> tuple[float, float, float]:
    """Ideal-gas part of IAPWS-95 at ``temperature`` [K]: h [J/kg], s° at 101 325 Pa [J/(kg K)], cp [J/(kg K)].

    Parameters
    ----------
    state : CoolProp.AbstractState
        A water state from :func:`new_water_state` (reused).
    temperature : float
        Temperature, [K].
    """
    r_w = state.gas_constant() / state.molar_mass()
    state.update(_CP.DmassT_INPUTS, 101_325.0 / (r_w * temperature), temperature)
    return state.hmass_idealgas(), state.smass_idealgas(), state.cp0mass()


def humid_air_coefficient(name: str, temperature: float, pressure: float) -> float:
    """One auxiliary quantity of CoolProp's ASHRAE RP-1485 humid-air code (``HAProps_Aux``).

    ``name`` is e.g. ``"f"`` (enhancement factor), ``"p_ws"`` (saturation pressure of water),
    ``"Baa"``, ``"Baw"``, ``"Bww"`` (second virial coefficients, [m³/mol]) or ``"dBaa"``,
    ``"dBaw"``, ``"dBww"`` (their temperature derivatives, [m³/(mol K)]).
    """
    try:
        return _CP.HAProps_Aux(name, temperature, pressure, 0.0)[0]
    except ValueError as exc:
        raise PropertyRangeError(f"humid-air coefficient {name} unavailable at T = {temperature:.6g} K, "
                                 f"p = {pressure:.6g} Pa ({exc})") from None


@lru_cache(maxsize=1)
def _liquid_state():
    state = _CP.AbstractState("HEOS", "Water")
    state.specify_phase(_CP.iphase_liquid)
    return state


@lru_cache(maxsize=256)
def liquid_water_density(temperature: float, pressure: float) -> float:
    """Density of liquid water [kg/m³] at T [K], p [Pa] (IAPWS-95), for condensate volumes; the
    answers of recent states are kept (a cooler's outlet often stays where it was between solves)."""
    try:
        state = _liquid_state()
        state.update(_CP.PT_INPUTS, pressure, temperature)
        return state.rhomass()
    except ValueError as exc:
        raise PropertyRangeError(f"liquid water density unavailable at T = {temperature:.6g} K, "
                                 f"p = {pressure:.6g} Pa ({exc})") from None
def new_incompressible_state(fluid: str, mass_fraction: float | None = None):
    """Fresh CoolProp ``AbstractState`` of an incompressible liquid (``INCOMP`` back end).

    ``fluid`` is a CoolProp incompressible name (``"Water"``, ``"MEG"`` ethylene glycol,
    ``"MPG"`` propylene glycol); mixtures take a mass fraction of the solute.
    """
    try:
        state = _CP.AbstractState("INCOMP", fluid)
        if mass_fraction is not None:
            state.set_mass_fractions([mass_fraction])
    except ValueError as exc:
        raise PropertyRangeError(f"coolant {fluid} unavailable ({exc})") from None
    return state


def incompressible_update_tp(state, temperature: float, pressure: float, where: str = "") -> None:
    """Set an incompressible ``state`` to T [K], p [Pa]; raise our own error on failure."""
    try:
        state.update(_CP.PT_INPUTS, pressure, temperature)
    except ValueError as exc:
        raise PropertyRangeError(f"{where or 'coolant'}: properties unavailable at T = {temperature:.6g} K "
                                 f"({exc})", where) from None


def incompressible_limits(fluid: str, mass_fraction: float | None = None) -> tuple[float, float]:
    """(lowest, highest) temperature [K] of a liquid coolant: freezing point (or table minimum)
    and table maximum of CoolProp's incompressible data."""
    name = f"INCOMP::{fluid}" + (f"[{mass_fraction}]" if mass_fraction else "")
    try:
        t_min = _CP.PropsSI("Tmin", "T", 300.0, "P", 1e5, name)
        t_max = _CP.PropsSI("Tmax", "T", 300.0, "P", 1e5, name)
        if mass_fraction:
            t_min = max(t_min, _CP.PropsSI("T_freeze", "T", 300.0, "P", 1e5, name))
    except ValueError as exc:
        raise PropertyRangeError(f"coolant {name} unavailable ({exc})") from None
    return t_min, t_max
