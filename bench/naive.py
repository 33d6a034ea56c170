"""A deliberately naive train solve on CoolProp's high-level PropsSI, for benchmark ratios only.

It does the same job as stagewright.core.solve for dry air (intake filter, equal split with cooler
pressure drops, isentropic or polytropic stages, coolers) the straightforward way: a
PropsSI call for every property, Euler steps in (h, p) for polytropic paths and bisection
for the polytropic efficiency of isentropic stages. Never used by the program.
"""
from __future__ import annotations

import math

from CoolProp.CoolProp import PropsSI


def _props(out, a, va, b, vb):
    return PropsSI(out, a, va, b, vb, "Air")


def _polytropic_end_h(h1, p1, p2, eta, steps=50):
    h = h1
    for k in range(steps):
        pa = p1 * (p2 / p1) ** (k / steps)
        pb = p1 * (p2 / p1) ** ((k + 1) / steps)
        v = 1.0 / _props("D", "H", h, "P", pa)
        h += v * (pb - pa) / eta
    return h


def naive_solve(doc: dict) -> dict:
    site = doc["site"]
    T0 = site["ambient_temperature_K"]
    P0 = site.get("barometric_pressure_Pa") or 101325.0
    m = doc["flow"]["value"]
    if doc["flow"]["kind"] == "free_air_delivery":
        m *= _props("D", "T", T0, "P", P0)
    h0, s0 = _props("H", "T", T0, "P", P0), _props("S", "T", T0, "P", P0)
    p = P0 - doc.get("inlet_pressure_drop_Pa", 0.0)
    h = h0
    stages = doc["stages"]
    drops = [(st.get("cooler") or {}).get("pressure_drop_Pa", 0.0) for st in stages]
    lo, hi = 1.0, 40.0
    for _ in range(200):  # bisection on the equal ratio
        r = 0.5 * (lo + hi)
        q = p
        for dp in drops:
            q = q * r - dp
        lo, hi = (r, hi) if q < doc["discharge_pressure_Pa"] else (lo, r)
    shaft = 0.0
    out = []
    for st, dp in zip(stages, drops):
        s1 = _props("S", "H", h, "P", p)
        p2 = p * r
        h2s = _props("H", "S", s1, "P", p2)
        eff = st["efficiency"]
        if eff["kind"] == "isentropic":
            h2 = h + (h2s - h) / eff["value"]
            a, b = 0.3, 1.0
            for _ in range(40):  # bisection for the polytropic efficiency
                mid = 0.5 * (a + b)
                a, b = (a, mid) if _polytropic_end_h(h, p, p2, mid) < h2 else (mid, b)
            eta_p = 0.5 * (a + b)
        else:
            h2 = _polytropic_end_h(h, p, p2, eff["value"])
            eta_p = eff["value"]
        T2 = _props("T", "H", h2, "P", p2)
        shaft += m * (h2 - h)
        out.append({"T2": T2, "eta_p": eta_p})
        h, p = h2, p2
        cooler = st.get("cooler")
        if cooler:
            t_out = cooler.get("outlet_temperature_K") or cooler["coolant_inlet_temperature_K"] + cooler["approach_K"]
            p -= dp
            h = _props("H", "T", t_out, "P", p)
    s_d = _props("S", "H", h, "P", p)
    x_gain = m * ((h - h0) - T0 * (s_d - s0))
    return {"shaft_power_W": shaft, "stages": out, "second_law_efficiency": x_gain / shaft}


def naive_minimal(doc: dict) -> float:
    """The least a dry isentropic train needs, on PropsSI: four flashes a stage (s at the inlet,
    h at the isentropic discharge, T at the discharge, h after the cooler), the equal ratio of
    :func:`naive_solve`; returns the shaft power [W]. No polytropic efficiency, no closures."""
    site = doc["site"]
    T0 = site["ambient_temperature_K"]
    P0 = site.get("barometric_pressure_Pa") or 101325.0
    m = doc["flow"]["value"]
    rho0 = _props("D", "T", T0, "P", P0)
    m = m * rho0 if doc["flow"]["kind"] == "free_air_delivery" else m
    p = P0 - doc.get("inlet_pressure_drop_Pa", 0.0)
    T, h = T0, _props("H", "T", T0, "P", p)
    drops = [(st.get("cooler") or {}).get("pressure_drop_Pa", 0.0) for st in doc["stages"]]
    lo, hi = 1.0, 40.0
    for _ in range(60):  # bisection on the equal ratio (pressure arithmetic only)
        r = 0.5 * (lo + hi)
        q = p
        for dp in drops:
            q = q * r - dp
        lo, hi = (r, hi) if q < doc["discharge_pressure_Pa"] else (lo, r)
    shaft = 0.0
    for st, dp in zip(doc["stages"], drops):
        p2 = p * r
        h2s = _props("H", "S", _props("S", "T", T, "P", p), "P", p2)
        h2 = h + (h2s - h) / st["efficiency"]["value"]
        _props("T", "H", h2, "P", p2)
        shaft += m * (h2 - h)
        c = st.get("cooler") or {}
        p = p2 - dp
        T = c.get("outlet_temperature_K") or c["coolant_inlet_temperature_K"] + c["approach_K"]
        h = _props("H", "T", T, "P", p)
    return shaft
