r"""(T, p) states of dry air by Newton's method on density, from a virial first guess [1]_ [2]_ [3]_.

The reference equation of state of air is explicit in temperature and density: CoolProp sets a
(ρ, T) state in about 1 µs here, while its general (T, p) flash, which must find the density
itself, takes about 10 µs. Every state of the property models lies far above the critical
temperature of air (132.5 K; the models start at 200 K), where p(ρ) at fixed T is smooth,
monotonic and nearly linear at compressor pressures. So the density is found here directly:

1. a first guess from the virial expansion :math:`p/RT = \rho + B\rho^2 + C\rho^3` reverted to
   :math:`\rho \approx n - Bn^2 + (2B^2 - C)n^3`, :math:`n = p/RT` [2]_, with the equation of state's
   own second and third virial coefficients (tabulated once per process, 2.5 K apart, interpolated
   linearly): within about 1e-7 of the root below 1 MPa and 1e-3 at 4 MPa;
2. Newton steps :math:`\delta = (p - p(\rho))/(\partial p/\partial\rho)_T` on (ρ, T) updates until a
   step is below 1e-5 of ρ; that last step is taken to second order (Chebyshev's step,
   :math:`\delta - \tfrac12 (\partial^2 p/\partial\rho^2)_T\,\delta^2/(\partial p/\partial\rho)_T`, whose
   error is of order δ³ ≲ 1e-16 of ρ [3]_) with one more update. Where the second-order term itself
   is below 5e-18 of ρ by the virial estimate :math:`(|B n| + 3|C| n^2)\,(\delta/\rho)^2` of
   :math:`\tfrac12 \rho\,p_{\rho\rho}/p_\rho\,(\delta/\rho)^2` (a third of the states of a 4-stage
   solve, near atmospheric pressure), it is left out and the second derivative not asked for.

The density agrees with CoolProp's own flash to a few units in the last place (h, s, cp and
(∂h/∂p)_T to the same absolute precision; a test compares them on random states) in two (ρ, T)
updates below about 1 MPa, three at 4 MPa: some three quarters of the time of CoolProp's flash. The guess depends on (T, p) alone, so a state is the same to the last bit
whatever was computed before it. Pressures above 5 MPa, dense states (|Bρ| ≥ 0.05, e.g. 200 K
above 4 MPa), a non-converging iteration or a failed update go to CoolProp's own flash, which also raises its
errors (ValueError, as any CoolProp update).

References
----------
.. [1] E. W. Lemmon, R. T. Jacobsen, S. G. Penoncello, D. G. Friend, "Thermodynamic Properties
   of Air and Mixtures of Nitrogen, Argon, and Oxygen From 60 to 2000 K at Pressures to
   2000 MPa", J. Phys. Chem. Ref. Data 29 (2000) 331–385.
.. [2] E. A. Mason, T. H. Spurling, *The Virial Equation of State*, Pergamon, 1969, ch. 1
   (Z = 1 + Bρ + Cρ² + …).
.. [3] K. E. Atkinson, *An Introduction to Numerical Analysis*, 2nd ed., Wiley, 1989, §2.2
   (Newton's method and its quadratic convergence; Chebyshev's third-order method).
"""
from __future__ import annotations

__all__ = ["tp_flash"]

import threading

from stagewright.core import coolprop_adapter as cpa

_T_FIRST, _T_STEP, _T_COUNT = 195.0, 2.5, 446  # the virial table's temperatures: 195 … 1307.5 K
_DENSE = 0.05  # |B n| from which the virial guess is not trusted: CoolProp's own flash
_P_LIMIT = 5.0e6  # [Pa] above it CoolProp's own flash (there its density solution is looser than 1e-12)
_TOLERANCE = 1e-5  # a step below this share of ρ is the last one (taken to second order)
_MAX_STEPS = 8
#: Chebyshev's second-order term is left out where the virial estimate of it is below this share of
#: ρ (twice under the double-precision rounding of ρ, 1.1e-16): most states below about 5 bar
_NEGLIGIBLE = 0.5e-17

_table: tuple | None = None
_table_lock = threading.Lock()


def _virial_table(state) -> tuple:
    """B(T) [m³/mol] and C(T) [m⁶/mol²] of the equation of state at the table's temperatures, and
    their differences to the next temperature (made once per process with ``state``, which it
    leaves at the last of them)."""
    global _table
    with _table_lock:
        if _table is None:
            b, c = [], []
            for k in range(_T_COUNT):
                state.update(cpa.DmolarT_INPUTS, 1.0, _T_FIRST + k * _T_STEP)
                b.append(state.Bvirial())
                c.append(state.Cvirial())
            _table = (b, [y - x for x, y in zip(b, b[1:])], c, [y - x for x, y in zip(c, c[1:])])
        return _table


def tp_flash(state):
    r"""Return ``flash(P, T)``, which sets the dry-air ``state`` to pressure P [Pa] and temperature T [K].

    Parameters
    ----------
    state : CoolProp.AbstractState
        A dry-air HEOS state (:func:`stagewright.core.coolprop_adapter.new_gas_air_state`); the
        function keeps it and updates it in place.

    Returns
    -------
    callable
        ``flash(P, T) -> None``, in the argument order of ``state.update(PT_INPUTS, P, T)``.

    Raises
    ------
    ValueError
        From the returned function, where CoolProp's own (T, p) flash fails.

    Notes
    -----
    Virial guess, then Newton on density with (ρ, T) updates (module docstring). The state is left
    at the converged density, so every property read afterwards is the equation of state's at
    (T, ρ(T, p)).

    Examples
    --------
    >>> from stagewright.core import coolprop_adapter as cpa
    >>> st = cpa.new_gas_air_state()
    >>> flash = tp_flash(st)
    >>> flash(5e5, 350.0)
    >>> abs(st.p() / 5e5 - 1.0) < 1e-14, round(st.rhomass(), 4)
    (True, 4.9762)
    """
    b_table, b_step, c_table, c_step = _virial_table(state)
    gas_constant = state.gas_constant()
    update, pressure, partial, second = state.update, state.p, state.first_partial_deriv, state.second_partial_deriv
    DT, PT = cpa.DmolarT_INPUTS, cpa.PT_INPUTS
    iP, iD, iT = cpa.iP, cpa.iDmolar, cpa.iT
    t_first, per_kelvin, last = _T_FIRST, 1.0 / _T_STEP, _T_COUNT - 2

    def flash(P: float, T: float) -> None:
        x = (T - t_first) * per_kelvin
        i = int(x)
        if not (0 <= i <= last and 0.0 < P <= _P_LIMIT):
            update(PT, P, T)  # outside the table (or nonsense): CoolProp's own flash and errors
            return
        t = x - i
        b = b_table[i] + t * b_step[i]
        n = P / (gas_constant * T)
        if not abs(b * n) < _DENSE:
            update(PT, P, T)
            return
        c = c_table[i] + t * c_step[i]
        rho = n * (1.0 - n * (b - n * (2.0 * b * b - c)))
        curvature = abs(b * n) + 3.0 * abs(c) * n * n  # ≈ ρ (∂²p/∂ρ²)_T / (∂p/∂ρ)_T / 2 (virial)
        try:
            for _ in range(_MAX_STEPS):
                update(DT, rho, T)
                slope = partial(iP, iD, iT)
                step = (P - pressure()) / slope
                if abs(step) < _TOLERANCE * rho:
                    if step * step * curvature < _NEGLIGIBLE * rho * rho:  # the second-order term: negligible
                        if step != 0.0:
                            update(DT, rho + step, T)
                    else:
                        update(DT, rho + step - 0.5 * second(iP, iD, iT, iD, iT) * step * step / slope, T)
                    return
                rho += step
                if not rho > 0.0:
                    break
        except ValueError:
            pass
        update(PT, P, T)  # did not converge: CoolProp's own flash decides (and raises its error)
    return flash
