"""Staging options side by side: 1 … N stages, each at its optimum split."""
from __future__ import annotations

__all__ = ["DEFAULT_OPERATING_HOURS", "DEFAULT_ENERGY_PRICE", "StagingOption", "StagingComparison", "package_row",
           "compare_stagings", "check_economics"]

import math
from dataclasses import dataclass, field
from typing import Any, Callable

from stagewright.core.errors import InputError
from stagewright.core.study.in_parallel import options_in_pool, useful_processes
from stagewright.core.study.optimal_split import SplitResult, split_prepared
from stagewright.core.study.options import check_stage_count, staging_note, staging_stages
from stagewright.core.study.prepare import prepare
from stagewright.core.study.progress import ProgressSpan, StudyCancelled, cancel_check

from stagewright.core.study.defaults import DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS  # noqa: E402 (re-exported)
_HOURS_MAX = 8784.0  # hours in a leap year


def check_economics(hours: float, price: float) -> tuple[float, float]:
    """Validate operating hours per year and energy price; InputError naming the range."""
    if not isinstance(hours, (int, float)) or isinstance(hours, bool) or not 0.0 <= hours <= _HOURS_MAX:
        raise InputError("operating_hours_per_year", hours, f"expected 0 … {_HOURS_MAX:g} h per year")
    if (not isinstance(price, (int, float)) or isinstance(price, bool) or not math.isfinite(price)
            or not 0.0 <= price <= 1000.0):
        raise InputError("energy_price_per_kWh", price, "expected 0 … 1000 (currency units per kWh)")
    return float(hours), float(price)


@dataclass
class StagingOption:
    """One stage count at its optimum split, and its saving against the baseline.

    Attributes
    ----------
    stages : int
        Number of stages.
    split : SplitResult
        The optimum (or, when ``feasible`` is False, closest) split.
    saving_W : float or None
        Driver power saved against the fewest-stage option that meets every limit, [W];
        None for an option that does not meet its limits or when no option does.
    """

    stages: int
    split: SplitResult
    saving_W: float | None = None

    @property
    def feasible(self) -> bool:
        return self.split.feasible

    def row(self, hours: float, price: float, note: str, package: dict | None = None,
            driver_efficiency: float = 1.0) -> dict:
        """The comparison row (plain data, SI units, unit in each key); with a ``package`` section
        also the package input at its stated load and the year of its load profile
        (:func:`package_row`)."""
        sp, r = self.split, self.split.result
        row = {"stages": self.stages, "feasible": sp.feasible,
               "binding_limits": [b.to_dict() for b in sp.binding_limits],
               "pressure_ratios": sp.pressure_ratios}
        if r is None:
            for key in ("stage_discharge_pressures_Pa", "discharge_temperatures_K", "max_discharge_temperature_K",
                        "driver_power_W", "shaft_power_W", "specific_power_kW_per_m3_min", "heat_rejected_W",
                        "cooler_duty_W", "intercooler_duty_W", "aftercooler_duty_W", "condensate_kg_s",
                        "condensate_by_cooler_kg_s", "exergy_destroyed_W", "second_law_efficiency",
                        "isothermal_efficiency", "free_air_delivery_m3_s", "mass_flow_kg_s"):
                row[key] = None
        else:
            d = r.to_dict()
            duties = [None if c is None else c.duty_W for c in r.coolers]
            per_cooler = [None if st["cooler"] is None else st["cooler"].get("condensate_kg_s", 0.0)
                          for st in d["stages"]]
            condensate = d.get("condensate_kg_s")
            if condensate is None:
                condensate = sum(c or 0.0 for c in per_cooler)
            row.update({
                "stage_discharge_pressures_Pa": [s.outlet.P for s in r.stages],
                "discharge_temperatures_K": [s.outlet.T for s in r.stages],
                "max_discharge_temperature_K": max(s.outlet.T for s in r.stages),
                "driver_power_W": r.driver_power_W,
                "shaft_power_W": r.shaft_power_W,
                "specific_power_kW_per_m3_min": r.specific_power_kW_per_m3_min,
                "heat_rejected_W": r.heat_rejected_W,
                "cooler_duty_W": sum(q for q in duties if q is not None),
                "intercooler_duty_W": duties[:-1],
                "aftercooler_duty_W": duties[-1],
                "condensate_kg_s": condensate,
                "condensate_by_cooler_kg_s": per_cooler,
                "exergy_destroyed_W": r.exergy_destroyed_W,
                "second_law_efficiency": r.second_law_efficiency,
                "isothermal_efficiency": r.isothermal_efficiency,
                "free_air_delivery_m3_s": r.free_air_delivery_m3_s,
                "mass_flow_kg_s": r.mass_flow_kg_s,
            })
        saving = self.saving_W
        row.update({
            "saving_W": saving,
            "saving_kWh_per_year": None if saving is None else saving / 1000.0 * hours,
            "saving_cost_per_year": None if saving is None else saving / 1000.0 * hours * price,
            "operating_hours_per_year": hours,
            "energy_price_per_kWh": price,
            "iterations": sp.iterations,
            "solves": sp.solves,
            "note": note,
        })
        row.update(package_row(r, package, driver_efficiency, price))
        return row


def package_row(result, package: dict | None, driver_efficiency: float, price: float) -> dict:
    """An option's package figures: input at the stated load, and the load profile's energy and
    cost (:mod:`stagewright.core.part_load`); every value None without a package, profile or result."""
    row = {"package_power_at_load_W": None, "package_annual_energy_kWh": None, "package_annual_cost": None}
    if result is None or not package:
        return row
    from stagewright.core.part_load.annual import annual_figures
    from stagewright.core.part_load.full_load import full_load_of
    from stagewright.core.part_load.package import package_point
    full = full_load_of(result, driver_efficiency)
    row["package_power_at_load_W"] = package_point(package, full, package["load"]).package_power_W
    annual = annual_figures(package, full, package["load_profile"])
    if annual is not None:
        row["package_annual_energy_kWh"] = annual.energy_kWh
        row["package_annual_cost"] = annual.energy_kWh * price
    return row


@dataclass
class StagingComparison:
    """Every option of a comparison, fewest stages first, with how they were built."""

    options: list
    note: str
    operating_hours_per_year: float
    energy_price_per_kWh: float
    notes: list = field(default_factory=list)  #: what the study changed in the project
    package: dict | None = None  #: the project's normalised ``package`` section (part-load figures)
    driver_efficiency: float = 1.0

    @property
    def baseline(self) -> StagingOption | None:
        """The fewest-stage option that meets every limit."""
        return next((o for o in self.options if o.feasible), None)

    @property
    def lowest_power(self) -> StagingOption | None:
        """The feasible option of least driver power."""
        ok = [o for o in self.options if o.feasible]
        return min(ok, key=lambda o: o.split.result.driver_power_W) if ok else None

    def full_note(self) -> str:
        """The note with the study's own changes to the project appended."""
        extra = "".join(f" Also, {n}." for n in self.notes)
        return self.note + extra

    def rows(self) -> list[dict]:
        """One plain-data row per stage count (the ``stagewright study --json`` list)."""
        note = self.full_note()
        return [o.row(self.operating_hours_per_year, self.energy_price_per_kWh, note, self.package,
                      self.driver_efficiency) for o in self.options]


def _with_savings(options: list[StagingOption]) -> list[StagingOption]:
    base = next((o for o in options if o.feasible), None)
    for o in options:
        o.saving_W = (base.split.result.driver_power_W - o.split.result.driver_power_W
                      if base is not None and o.feasible else None)
    return options


def compare_stagings(doc: dict, max_stages: int = 4, *, operating_hours_per_year: float = DEFAULT_OPERATING_HOURS,
                     energy_price_per_kWh: float = DEFAULT_ENERGY_PRICE,
                     progress: Callable[[float, str], Any] | None = None, cancel: Any = None,
                     processes: int | None = 1) -> StagingComparison:
    r"""Evaluate 1 … ``max_stages`` stages, each at its optimum split, side by side.

    An N-stage option repeats the project's first stage N times (its efficiency,
    mechanical efficiency, casing heat loss, exit velocity, limits and intercooler) and
    keeps the project's last-stage cooler as aftercooler (:func:`~stagewright.core.study.options.staging_stages`);
    the comparison's ``note`` says so. Each option is optimised by
    :func:`~stagewright.core.study.optimal_split.optimal_split` without raising: an option whose
    limits cannot be met is kept with ``feasible=False`` and its violated limits.

    The saving of an option is against the fewest-stage option that meets its limits:

    .. math:: \Delta\dot W = \dot W_\mathrm{driver,base} - \dot W_\mathrm{driver}, \qquad
       \text{saving per year} = \frac{\Delta\dot W}{1000}\, t_\mathrm{op}\, c_\mathrm{kWh}

    Parameters
    ----------
    doc : dict
        Project document.
    max_stages : int
        Most stages, 1 … 8.
    operating_hours_per_year : float
        Hours of operation per year, [h], 0 … 8784.
    energy_price_per_kWh : float
        Price of driver input energy, [currency/kWh].
    progress : callable, optional
        ``progress(fraction, message)``, called before each option and at the end.
    cancel : None, threading.Event or callable
        Checked before every trial solve.
    processes : int or None
        Worker processes (None: every core). With more than one, the options are optimised side
        by side (:mod:`stagewright.core.study.in_parallel`), with the same results; worth it when
        the process pool is already started (a first pool start loads the property library
        again, about a second) — the window starts it in the background.

    Returns
    -------
    StagingComparison

    Raises
    ------
    InputError
        For ``max_stages`` outside 1 … 8, bad hours or price, or an invalid project.
    StudyCancelled
        When ``cancel`` is set; its ``partial`` holds the options finished so far (with
        savings against the fewest-stage feasible one among them).

    Examples
    --------
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...        "discharge_pressure_Pa": 8e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
    ...                    "max_discharge_temperature_K": 450.0,
    ...                    "cooler": {"outlet_temperature_K": 293.15}}]}
    >>> [(o.stages, o.feasible) for o in compare_stagings(doc, max_stages=3).options]
    [(1, False), (2, True), (3, True)]
    """
    max_stages = check_stage_count(max_stages)
    hours, price = check_economics(operating_hours_per_year, energy_price_per_kWh)
    should_stop = cancel_check(cancel)
    span = ProgressSpan(progress)
    prepared = prepare(doc)
    project_stages = prepared.doc["stages"]
    note = staging_note(project_stages)
    n_proc = useful_processes(processes, max_stages)
    if n_proc > 1:
        options = _options_side_by_side(prepared, project_stages, max_stages, n_proc, span, should_stop)
        span.report(1.0, f"compared 1 to {max_stages} stages")
        return StagingComparison(_with_savings(options), note, hours, price, list(prepared.notes),
                                 package=prepared.doc.get("package"),
                                 driver_efficiency=prepared.doc["driver"]["efficiency"])
    weights = [n + 1.0 for n in range(1, max_stages + 1)]
    total, done = sum(weights), 0.0
    options: list[StagingOption] = []
    for n in range(1, max_stages + 1):
        span.report(done / total, f"optimising the {n}-stage option")
        try:
            if should_stop():
                raise StudyCancelled()
            split = split_prepared(prepared.with_stages(staging_stages(project_stages, n)),
                                   strict=False, should_stop=should_stop)
        except StudyCancelled:
            raise StudyCancelled(f"study cancelled after {len(options)} of {max_stages} options",
                                 _with_savings(options)) from None
        options.append(StagingOption(n, split))
        done += weights[n - 1]
    span.report(1.0, f"compared 1 to {max_stages} stages")
    return StagingComparison(_with_savings(options), note, hours, price, list(prepared.notes),
                             package=prepared.doc.get("package"), driver_efficiency=prepared.doc["driver"]["efficiency"])


def _options_side_by_side(prepared, project_stages, max_stages, n_proc, span, should_stop) -> list[StagingOption]:
    """:func:`compare_stagings`'s options from worker processes, fewest stages first."""
    try:
        splits = options_in_pool(prepared, project_stages, list(range(1, max_stages + 1)), n_proc, span,
                                 should_stop)
    except StudyCancelled as exc:
        done = [StagingOption(n, split) for n, split in exc.partial]
        raise StudyCancelled(f"study cancelled after {len(done)} of {max_stages} options",
                             _with_savings(done)) from None
    return [StagingOption(n, splits[n]) for n in range(1, max_stages + 1)]
