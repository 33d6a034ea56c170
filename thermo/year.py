r"""A year at the site: the train solved for every ambient bin, and its annual totals.

For each operating bin :math:`j` (a month, or a pasted ambient bin) the project is solved
at that bin's ambient temperature, humidity, load and (optionally) coolant inlet
temperature, and its figures are weighted by the bin's operating hours :math:`t_j`:

.. math::

    E = \sum_j \frac{P_{driver,j}\, t_j}{1000}\ \mathrm{[kWh]}, \qquad
    V_{cond} = \sum_j \frac{\dot m_{cond,j}\, 3600\, t_j}{\rho_w}, \qquad
    V_{cw} = \sum_j \sum_k \dot V_{cw,jk}\, 3600\, t_j

Condensate volume is taken at :math:`\rho_w` = 1000 kg/m³. Cooling-water volume is the
volume of water-kind coolant passed through the coolers (once-through use; in a closed
circuit it is circulation, not consumption); glycol circuits are reported separately.
Load scales the project's flow value (mass, volume or shaft power). Air-cooled coolers
take their coolant inlet from the bin's ambient temperature; water and glycol coolers
keep theirs unless the bin gives ``coolant_inlet_temperature_K``.
"""
from __future__ import annotations

__all__ = ["YearResult", "BinResult", "YearCancelled", "run_year", "CONDENSATE_DENSITY_KG_M3"]

import copy
from dataclasses import asdict, dataclass, field

from thermo.project.validation import normalise
from thermo.errors import InputError, StagewrightError
from thermo.solve import solve
from thermo.year_profile import Bin, operating_bins

CONDENSATE_DENSITY_KG_M3 = 1000.0


class YearCancelled(StagewrightError):
    """The year run was cancelled; ``partial`` holds the bins finished so far."""


@dataclass
class BinResult:
    """Figures of one operating bin (SI; money in the user's price units)."""

    label: str
    temperature_K: float
    relative_humidity: float
    hours: float
    load: float
    driver_power_W: float
    energy_kWh: float
    energy_cost: float
    condensate_m3: float
    cooling_water_m3: float
    glycol_circulated_m3: float
    water_cost: float
    cooler_duty_W: float
    recoverable_heat_W: float | None
    recoverable_heat_kWh: float
    recovered_value: float
    max_discharge_temperature_K: float
    warnings: list = field(default_factory=list)


@dataclass
class YearResult:
    """All bins of a year and their totals."""

    bins: list
    totals: dict
    worst_discharge_bin: str
    worst_duty_bin: str

    def to_dict(self) -> dict:
        """Plain data (JSON-ready): ``bins``, ``totals``, worst bins."""
        return {"bins": [asdict(b) for b in self.bins], "totals": dict(self.totals),
                "worst_discharge_temperature": {"bin": self.worst_discharge_bin,
                                                "temperature_K": max(b.max_discharge_temperature_K
                                                                     for b in self.bins)},
                "worst_cooler_duty": {"bin": self.worst_duty_bin,
                                      "duty_W": max(b.cooler_duty_W for b in self.bins)}}


def _doc_for(doc: dict, b: Bin) -> dict:
    d = copy.deepcopy(doc)
    d.pop("year", None)
    d["site"]["ambient_temperature_K"] = b.temperature_K
    d["site"]["relative_humidity"] = b.relative_humidity
    d["flow"]["value"] = d["flow"]["value"] * b.load
    for st in d["stages"]:
        cooler = st.get("cooler")
        if not cooler:
            continue
        kind = (cooler.get("coolant") or {}).get("kind")
        if kind == "air":
            cooler.pop("coolant_inlet_temperature_K", None)
        elif b.coolant_inlet_temperature_K is not None and (
                kind is not None or cooler.get("coolant_inlet_temperature_K") is not None):
            cooler["coolant_inlet_temperature_K"] = b.coolant_inlet_temperature_K
    return d


def _solve_bin(doc: dict, b: Bin, year: dict, rec: dict | None) -> BinResult:
    res = solve(_doc_for(doc, b))
    d = res.to_dict()
    seconds = 3600.0 * b.hours
    coolers = [st["cooler"] for st in d["stages"] if st["cooler"] is not None]
    condensate_kg_s = d.get("condensate_kg_s") or 0.0
    water = sum(c["coolant_volume_flow_m3_s"] for c in coolers if c.get("coolant_kind") == "water")
    glycol = sum(c["coolant_volume_flow_m3_s"] for c in coolers if c.get("coolant_kind") == "glycol")
    energy = res.driver_power_W * b.hours / 1000.0
    q_rec = d.get("recoverable_heat_W")
    rec_kwh = (q_rec or 0.0) * b.hours / 1000.0
    value = rec_kwh / rec["boiler_efficiency"] * rec["fuel_price_per_kWh"] if rec else 0.0
    return BinResult(
        label=b.label, temperature_K=b.temperature_K, relative_humidity=b.relative_humidity, hours=b.hours,
        load=b.load, driver_power_W=res.driver_power_W, energy_kWh=energy,
        energy_cost=energy * year["energy_price_per_kWh"],
        condensate_m3=condensate_kg_s * seconds / CONDENSATE_DENSITY_KG_M3,
        cooling_water_m3=water * seconds, glycol_circulated_m3=glycol * seconds,
        water_cost=water * seconds * year["water_price_per_m3"],
        cooler_duty_W=sum(c["duty_W"] for c in coolers), recoverable_heat_W=q_rec,
        recoverable_heat_kWh=rec_kwh, recovered_value=value,
        max_discharge_temperature_K=max(st["outlet"]["temperature_K"] for st in d["stages"]),
        warnings=[w["message"] for w in d["warnings"]])


_SUMMED = ("hours", "energy_kWh", "energy_cost", "condensate_m3", "cooling_water_m3", "glycol_circulated_m3",
           "water_cost", "recoverable_heat_kWh", "recovered_value")


def run_year(doc: dict, progress=None, cancelled=None) -> YearResult:
    """Solve a project for every bin of its ``year`` section and total the year.

    Parameters
    ----------
    doc : dict
        Project document with a ``year`` section (see ``docs/project-format.md``).
    progress : callable, optional
        ``progress(done, total)`` after each bin.
    cancelled : callable, optional
        ``cancelled()`` → True stops the run between bins (:class:`YearCancelled`).

    Returns
    -------
    YearResult
        Per-bin figures, totals (``energy_kWh``, ``energy_cost``, ``condensate_m3``,
        ``cooling_water_m3``, ``recoverable_heat_kWh`` …) and the worst bins for discharge
        temperature and cooler duty.

    Raises
    ------
    InputError
        If the project has no ``year`` section or the section is invalid; a bin that cannot
        be solved raises its own error with the bin named.

    Examples
    --------
    >>> doc = {"site": {"ambient_temperature_K": 293.15}, "fluid": {"model": "constant_cp"},
    ...        "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}}],
    ...        "year": {"profile": {"kind": "bins", "bins": [
    ...            {"temperature_K": 293.15, "relative_humidity": 0.0, "hours": 1000.0}]}}}
    >>> y = run_year(doc)
    >>> round(y.totals["energy_kWh"] / 1000.0, 1)  # cp T1 ((p2/p1)^(2/7) − 1)/ηs × 1000 h, in MWh
    176.9
    """
    norm = normalise(doc)
    year = norm.get("year")
    if not year:
        raise InputError("year", None, "add a 'year' section (ambient profile, hours, load) to run a year")
    rec = norm.get("heat_recovery")
    bins = operating_bins(year)
    out: list[BinResult] = []
    for i, b in enumerate(bins):
        if cancelled is not None and cancelled():
            err = YearCancelled(f"year run cancelled after {i} of {len(bins)} bins")
            err.partial = out
            raise err
        try:
            out.append(_solve_bin(doc, b, year, rec))
        except StagewrightError as exc:
            raise type(exc)(f"year, {b.label} ({b.temperature_K:.2f} K, RH {b.relative_humidity:.2f}): {exc}",
                            exc.field) if not isinstance(exc, InputError) else InputError(
                exc.problem.field, exc.problem.value, f"{exc.problem.expected} (year, {b.label})") from None
        if progress is not None:
            progress(i + 1, len(bins))
    totals = {k: sum(getattr(b, k) for b in out) for k in _SUMMED}
    totals["cost"] = totals["energy_cost"] + totals["water_cost"] - totals["recovered_value"]
    hours = totals["hours"]
    totals["mean_driver_power_W"] = totals["energy_kWh"] * 1000.0 / hours if hours > 0 else 0.0
    worst_t = max(out, key=lambda b: b.max_discharge_temperature_K)
    worst_q = max(out, key=lambda b: b.cooler_duty_W)
    return YearResult(bins=out, totals=totals, worst_discharge_bin=worst_t.label, worst_duty_bin=worst_q.label)
