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
Load scales the project's flow value (mass, volume or shaft power). With a ``package``
section each bin's power goes through the capacity control, motor, drive and auxiliaries
(:mod:`stagewright.core.part_load.in_year`) and :math:`P_{driver,j}` above is the package input; without
one it is in proportion to the flow at full-load efficiency (optimistic below full load: the
result's ``power_basis`` says which). Air-cooled coolers
take their coolant inlet from the bin's ambient temperature; water and glycol coolers
keep theirs unless the bin gives ``coolant_inlet_temperature_K``.

Coolers are sized afresh in every bin (``year.coolers.mode = "size_every_bin"``, each bin
gets a perfect exchanger) or sized once at a design condition and rated at that fixed UA in
every bin (``"design_once"``, :mod:`stagewright.core.year_design`). Each bin's project shares every
unchanged part with the year's normalised project (:mod:`stagewright.core.year_bins`), so a year's time
grows linearly with its bins. Bins are solved on the fast property path of trial solves
(:func:`stagewright.core.solve.solve_normalised` with ``detail=False, fast=True``; its figures agree with
exact solves to better than 1e-4 relative, tests/test_year_design.py checks the totals);
``run_year(..., exact=True)`` solves them exactly. Bins whose inputs (temperature, humidity, load,
coolant inlet) are bit-for-bit equal — hourly data repeats them often — share one solve
(:func:`same_input_groups`); nothing is rounded or binned for it. Bins are solved in order of
temperature (then humidity), in chunks of CHUNK_BINS bins (a pool worker's task), and each rated
cooler's rating starts where the previous bin's settled
(:class:`~stagewright.core.exchanger.rating.RatingStart`, fresh at each chunk, in a process as in a pool).
"""
from __future__ import annotations

__all__ = ["YearResult", "BinResult", "YearCancelled", "run_year", "CONDENSATE_DENSITY_KG_M3", "FAST_PATH_BINS",
           "POOL_BINS", "CHUNK_BINS", "FAST_RATING_RTOL", "same_input_groups"]

import math
import os
from dataclasses import asdict, dataclass, field
from functools import partial

from stagewright.core.part_load.in_year import bin_power
from stagewright.core.project.validation import normalise
from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.exchanger.rating import RatingStart
from stagewright.core.solve import release_thread_models, solve_normalised
from stagewright.core.year_bins import norm_for_bin, year_base
from stagewright.core.year_design import YearDesign, design_coolers, limit_flags
from stagewright.core.year_profile import Bin, operating_bins

CONDENSATE_DENSITY_KG_M3 = 1000.0
FAST_PATH_BINS = 24  #: up to this many bins a year solves exactly by default (measured: bench/run.py)
POOL_BINS = 2000  #: from this many bins a year uses every core by default
CHUNK_BINS = 60  #: bins per worker task: progress and cancel between chunks
ORDER_BAND_K = 0.2  #: width of the temperature bands in which bins are solved by humidity, [K] (:func:`_solve_order`)
#: rated cooler outlets of bins on the fast path, relative (3e-4 K at 300 K: the year's totals move by
#: about 1e-6 relative, a hundredth of the fast path's 1e-4; trial solves of studies keep 1e-9)
FAST_RATING_RTOL = 1e-6


class YearCancelled(StagewrightError):
    """The year run was cancelled; ``partial`` holds the bins finished so far (in profile order; bins are
    solved coolest first, so they are the coolest bins, not the first hours)."""


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
    #: per stage (None where it has no cooler): air outlet, coolant outlet, duty and condensate drained
    cooler_outlet_temperatures_K: list = field(default_factory=list)
    coolant_outlet_temperatures_K: list = field(default_factory=list)
    cooler_duties_W: list = field(default_factory=list)
    cooler_condensate_kg_s: list = field(default_factory=list)
    #: the air reaching the dryer (the delivered air): temperature and pressure dew point (frost
    #: point below 0.01 °C; None for a dry intake)
    dryer_inlet_temperature_K: float = 0.0
    pressure_dew_point_K: float | None = None
    #: stated limits this bin misses (:func:`stagewright.core.year_design.limit_flags`); empty when it meets them
    limit_flags: list = field(default_factory=list)
    meets_limits: bool = True
    #: a cooler's condensate would freeze, or nearly (stagewright.core.moist.freezing): freeze protection needed
    freezing_condensate: bool = False
    #: auxiliaries (fans, pump, fixed loads) and package input through the control (stagewright.core.part_load);
    #: without a ``package`` section 0 and the driver power
    auxiliary_power_W: float = 0.0
    package_power_W: float = 0.0


@dataclass
class YearResult:
    """All bins of a year and their totals."""

    bins: list
    totals: dict
    worst_discharge_bin: str
    worst_duty_bin: str
    cooler_mode: str = "size_every_bin"
    design: YearDesign | None = None  #: the coolers' design (``design_once``)
    #: how part-load power was found: through the package's control, or in proportion to flow
    power_basis: str = "proportional"

    def to_dict(self) -> dict:
        """Plain data (JSON-ready): ``bins``, ``totals``, worst bins, the coolers' design."""
        return {"bins": [asdict(b) for b in self.bins], "totals": dict(self.totals),
                "cooler_mode": self.cooler_mode, "power_basis": self.power_basis,
                "freezing_bins": [b.label for b in self.bins if b.freezing_condensate],
                "cooler_design": None if self.design is None else self.design.to_dict(),
                "worst_discharge_temperature": {"bin": self.worst_discharge_bin,
                                                "temperature_K": max(b.max_discharge_temperature_K
                                                                     for b in self.bins)},
                "worst_cooler_duty": {"bin": self.worst_duty_bin,
                                      "duty_W": max(b.cooler_duty_W for b in self.bins)}}


def _cooler_figures(res) -> tuple:
    """Per stage: air outlet, coolant outlet, duty and condensate drained (None without a cooler)."""
    outs, coolant, duties, cond = [], [], [], []
    for c in res.coolers:
        ex = None if c is None else c.exchanger
        outs.append(None if c is None else c.outlet.T)
        coolant.append(None if ex is None else ex.coolant.outlet_temperature_K)
        duties.append(None if c is None else c.duty_W)
        cond.append(None if c is None else (c.water.drained_kg_s if c.water is not None else 0.0))
    return outs, coolant, duties, cond


def _bin_result(res, b: Bin, year: dict, rec: dict | None, flags: list, norm: dict | None = None) -> BinResult:
    """A bin's figures from its solve (no ``to_dict``: only what the year reports); its power
    through the package's control when ``norm`` has a ``package`` section."""
    seconds = 3600.0 * b.hours
    power = bin_power(norm or {}, res, b.load)
    coolers = [c for c in res.coolers if c is not None]
    water = sum(c.exchanger.coolant.volume_flow_m3_s for c in coolers
                if c.exchanger is not None and c.exchanger.coolant.kind == "water")
    glycol = sum(c.exchanger.coolant.volume_flow_m3_s for c in coolers
                 if c.exchanger is not None and c.exchanger.coolant.kind == "glycol")
    condensate_kg_s = res.water.condensate_kg_s if res.water is not None else 0.0
    energy = power.package_power_W * b.hours / 1000.0
    q_rec = None if res.recovery is None else res.recovery.recoverable_heat_W
    rec_kwh = (q_rec or 0.0) * b.hours / 1000.0
    value = rec_kwh / rec["boiler_efficiency"] * rec["fuel_price_per_kWh"] if rec else 0.0
    outs, coolant, duties, cond = _cooler_figures(res)
    return BinResult(
        label=b.label, temperature_K=b.temperature_K, relative_humidity=b.relative_humidity, hours=b.hours,
        load=b.load, driver_power_W=power.driver_power_W, energy_kWh=energy,
        energy_cost=energy * year["energy_price_per_kWh"],
        condensate_m3=condensate_kg_s * seconds / CONDENSATE_DENSITY_KG_M3,
        cooling_water_m3=water * seconds, glycol_circulated_m3=glycol * seconds,
        water_cost=water * seconds * year["water_price_per_m3"],
        cooler_duty_W=sum(c.duty_W for c in coolers), recoverable_heat_W=q_rec,
        recoverable_heat_kWh=rec_kwh, recovered_value=value,
        max_discharge_temperature_K=max(st.outlet.T for st in res.stages),
        warnings=[w.message for w in res.warnings], cooler_outlet_temperatures_K=outs,
        coolant_outlet_temperatures_K=coolant, cooler_duties_W=duties, cooler_condensate_kg_s=cond,
        dryer_inlet_temperature_K=res.delivery.T,
        pressure_dew_point_K=None if res.water is None else res.water.delivered_pressure_dew_point_K,
        limit_flags=flags, meets_limits=not flags,
        freezing_condensate=any(w.field.endswith(".cooler") and "freez" in w.message for w in res.warnings),
        auxiliary_power_W=power.auxiliary_power_W, package_power_W=power.package_power_W)


def _in_bin(b: Bin, fn, *args):
    """``fn(*args)``, its StagewrightError re-raised naming bin ``b``."""
    try:
        return fn(*args)
    except StagewrightError as exc:
        if isinstance(exc, InputError):
            raise InputError(exc.problem.field, exc.problem.value, f"{exc.problem.expected} (year, {b.label})") from None
        raise type(exc)(f"year, {b.label} ({b.temperature_K:.2f} K, RH {b.relative_humidity:.2f}): {exc}",
                        exc.field) from None


_SUMMED = ("hours", "energy_kWh", "energy_cost", "condensate_m3", "cooling_water_m3", "glycol_circulated_m3",
           "water_cost", "recoverable_heat_kWh", "recovered_value")


def run_year(doc: dict, progress=None, cancelled=None, exact: bool | None = None,
             processes: int | None = None) -> YearResult:
    """Solve a project for every bin of its ``year`` section and total the year.

    Parameters
    ----------
    doc : dict
        Project document with a ``year`` section (see ``docs/project-format.md``).
    progress : callable, optional
        ``progress(done, total)`` after each solve (of a bin and the bins with its inputs; after
        each chunk of bins with a pool).
    cancelled : callable, optional
        ``cancelled()`` → True stops the run between bins or chunks (:class:`YearCancelled`).
    exact : bool, optional
        True: solve the bins (and the coolers' design) on the exact property path; False: on
        the fast one (figures agree to better than 1e-4 relative). Default: exact for up to
        FAST_PATH_BINS bins (the fast path's table costs more to fill than it saves), fast above.
    processes : int, optional
        Worker processes; default: all cores for POOL_BINS bins or more, else 1 (in-process).

    Returns
    -------
    YearResult
        Per-bin figures, totals (``energy_kWh``, ``energy_cost``, ``condensate_m3``,
        ``cooling_water_m3``, ``recoverable_heat_kWh``, ``bins_missing_limits`` …), the worst
        bins for discharge temperature and cooler duty, and the coolers' design
        (``year.coolers.mode = "design_once"``).

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
    bins = operating_bins(year)
    base = year_base(norm)
    exact = len(bins) <= FAST_PATH_BINS if exact is None else exact
    settings = year["coolers"]
    design = None
    if settings["mode"] == "design_once":
        design = _in_design(base, bins, settings, _solver(exact))
    # the year's settings without its profile: a job goes to a worker with every chunk (an 8760-hour
    # profile is 0.4 MB pickled, 146 times over)
    job = _Job(base, {k: v for k, v in year.items() if k != "profile"}, norm.get("heat_recovery"), design, exact)
    n_proc = processes or ((os.cpu_count() or 1) if len(bins) >= POOL_BINS else 1)
    out = (_run_in_process(job, bins, progress, cancelled) if n_proc <= 1 else
           _run_in_pool(job, bins, n_proc, progress, cancelled))
    result = _year_result(out, settings["mode"], design, settings.get("max_dryer_inlet_temperature_K"))
    if norm.get("package"):
        result.power_basis = norm["package"]["control"]["kind"]
    return result


def _solver(exact: bool):
    """The bins' solve: lean (no reporting-only work), on the exact or the fast property path."""
    return partial(solve_normalised, detail=False, fast=not exact)


@dataclass(frozen=True)
class _Job:
    """What every bin's solve needs (picklable: worker processes get it once per chunk)."""

    base: dict
    year: dict
    rec: dict | None
    design: YearDesign | None
    exact: bool


def _rating_starts(job: _Job) -> list | None:
    """One :class:`~stagewright.core.exchanger.rating.RatingStart` per rated cooler: each bin's rating starts
    where the previous bin's settled (fewer sizings; exact path: the same answers to 1e-12 relative;
    fast path: rated outlets to FAST_RATING_RTOL); None when no cooler is rated."""
    if job.design is None:
        return None
    rtol = None if job.exact else FAST_RATING_RTOL
    return [None if c is None else RatingStart(rtol) for c in job.design.coolers]


def _solve_bin(job: _Job, b: Bin, same: tuple = (), starts: list | None = None) -> list:
    """Bin ``b`` and the bins ``same`` whose inputs equal its own: one solve, each bin's figures and
    limit flags (errors name bin ``b``); ``starts`` from :func:`_rating_starts`."""
    design = job.design
    res = _in_bin(b, _solver(job.exact),
                  norm_for_bin(job.base, b, None if design is None else design.rating(), starts))
    limit = job.year["coolers"].get("max_dryer_inlet_temperature_K")
    return [_bin_result(res, x, job.year, job.rec, limit_flags(x, res, design, limit), job.base)
            for x in (b, *same)]


def _inputs(b: Bin) -> tuple:
    """Everything a bin's solve depends on (its label and hours only scale or name its figures)."""
    return (b.temperature_K, b.relative_humidity, b.load, b.coolant_inlet_temperature_K)


def same_input_groups(bins: list) -> list:
    """Positions of the bins grouped by exactly equal inputs (:func:`_inputs`), in order of first
    appearance: hourly data repeats a bin's temperature, humidity, load and coolant inlet often, and
    such bins are solved once. Only bit-for-bit equal inputs share a solve (no rounding, no binning)."""
    groups: dict = {}
    for i, b in enumerate(bins):
        groups.setdefault(_inputs(b), []).append(i)
    return list(groups.values())


def _cancelled_error(done: list, total: int) -> YearCancelled:
    """The error of a cancelled run; ``partial`` holds the finished bins in profile order."""
    out = [r for _, r in sorted(done, key=lambda d: d[0])]
    err = YearCancelled(f"year run cancelled after {len(out)} of {total} bins")
    err.partial = out
    return err


def _in_order(done: list, total: int) -> list:
    out: list = [None] * total
    for i, r in done:
        out[i] = r
    return out


def _run_in_process(job: _Job, bins: list, progress, cancelled) -> list:
    done: list = []
    for chunk in _chunks(bins):
        starts = _rating_starts(job)  # fresh at each chunk, as in a pool worker: the same answers either way
        for group in chunk:
            if cancelled is not None and cancelled():
                raise _cancelled_error(done, len(bins))
            done.extend(zip(group, _solve_bin(job, bins[group[0]], tuple(bins[i] for i in group[1:]), starts)))
            if progress is not None:
                progress(len(done), len(bins))
    return _in_order(done, len(bins))


def _solve_order(bins: list, group: list) -> tuple:
    """Where a same-input group is solved: in bands of ORDER_BAND_K of temperature, each band by humidity
    (rising in one band, falling in the next), then temperature, load and coolant inlet (None first),
    so that each bin's rating starts from a bin much like it in both temperature and humidity.

    Hourly data sorted by temperature alone put bins 0.005 K but a random humidity apart, and an
    air-cooled cooler that condenses moves with the humidity: the bands took the bench year's sizings
    from 53 061 to 49 429 (the aftercooler's from 19 390 to 17 269; bench/RESULTS.md). Profile order
    (an hour's change apart) needed 11 % more than temperature order."""
    b = bins[group[0]]
    c = b.coolant_inlet_temperature_K
    band = math.floor(b.temperature_K / ORDER_BAND_K)
    rh = b.relative_humidity if band % 2 == 0 else -b.relative_humidity
    return band, rh, b.temperature_K, b.load, c is not None, c or 0.0


def _chunks(bins: list) -> list:
    """The same-input groups (:func:`same_input_groups`) in the order of :func:`_solve_order`, in runs of
    about CHUNK_BINS bins: a pool worker's task, and where a run of ratings starts afresh
    (:func:`_rating_starts`; in a process as in a pool, so that both give the same figures to the last
    bit). Results are put back in profile order."""
    chunks: list = [[]]
    count = 0
    for group in sorted(same_input_groups(bins), key=lambda g: _solve_order(bins, g)):
        if count >= CHUNK_BINS:
            chunks.append([])
            count = 0
        chunks[-1].append(group)
        count += len(group)
    return chunks


def _solve_chunk(job: _Job, chunk: list) -> list:
    """A worker's chunk of same-input groups (lists of bins); a group that fails ends the chunk as
    ``("error", its position)`` (the caller solves it again in its own process to raise the error
    with its type)."""
    out = []
    starts = _rating_starts(job)  # a chunk is a run of neighbouring bins: each starts from the one before
    for k, group in enumerate(chunk):
        try:
            out.append(_solve_bin(job, group[0], tuple(group[1:]), starts))
        except StagewrightError:
            out.append(("error", k))
            break
    release_thread_models()
    return out


def _run_in_pool(job: _Job, bins: list, n_proc: int, progress, cancelled) -> list:
    """The same-input groups in chunks of about CHUNK_BINS bins on ``n_proc`` worker processes."""
    from concurrent.futures import ProcessPoolExecutor  # local: most years are short
    from stagewright.core.process_pool import pool_context
    chunks = _chunks(bins)
    done: list = []
    with ProcessPoolExecutor(max_workers=n_proc, mp_context=pool_context()) as pool:
        futures = [pool.submit(_solve_chunk, job, [[bins[i] for i in g] for g in ch]) for ch in chunks]
        for ch, fut in zip(chunks, futures):
            if cancelled is not None and cancelled():
                for f in futures:
                    f.cancel()
                raise _cancelled_error(done, len(bins))
            part = fut.result()
            if part and isinstance(part[-1], tuple):
                for f in futures:
                    f.cancel()
                _solve_bin(job, bins[ch[part[-1][1]][0]])  # raises the bin's own error
            for group, results in zip(ch, part):
                done.extend(zip(group, results))
            if progress is not None:
                progress(len(done), len(bins))
    return _in_order(done, len(bins))


def _in_design(base: dict, bins: list, settings: dict, solve_fn) -> YearDesign:
    """:func:`stagewright.core.year_design.design_coolers`, its errors naming the design condition."""
    try:
        return design_coolers(base, bins, settings, solve_fn)
    except StagewrightError as exc:
        where = "the site as stated" if settings["design_condition"] == "site" else "the hottest bin"
        if isinstance(exc, InputError):
            raise InputError(exc.problem.field, exc.problem.value,
                             f"{exc.problem.expected} (year, design condition: {where})") from None
        raise type(exc)(f"year, design condition ({where}): {exc}", exc.field) from None


def _year_result(out: list, mode: str, design, max_dryer: float | None = None) -> YearResult:
    """Totals of the bins, the worst bins and the bins that miss a stated limit."""
    totals = {k: sum(getattr(b, k) for b in out) for k in _SUMMED}
    totals["cost"] = totals["energy_cost"] + totals["water_cost"] - totals["recovered_value"]
    hours = totals["hours"]
    totals["mean_driver_power_W"] = totals["energy_kWh"] * 1000.0 / hours if hours > 0 else 0.0
    totals["auxiliary_kWh"] = sum(b.auxiliary_power_W * b.hours / 1000.0 for b in out)
    missed = [b for b in out if b.limit_flags]
    totals["bins_missing_limits"] = len(missed)
    totals["hours_missing_limits"] = sum(b.hours for b in missed)
    totals["limits_stated"] = design is not None or max_dryer is not None
    worst_t = max(out, key=lambda b: b.max_discharge_temperature_K)
    worst_q = max(out, key=lambda b: b.cooler_duty_W)
    return YearResult(bins=out, totals=totals, worst_discharge_bin=worst_t.label, worst_duty_bin=worst_q.label,
                      cooler_mode=mode, design=design)
