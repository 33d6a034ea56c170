"""The ambient profile of a year at the site: 12 monthly means or pasted hourly bins.

:func:`year_problems` checks a normalised ``year`` section beyond what the schema can say
(exactly twelve months, hours that fit in a year); :func:`operating_bins` turns it into
the list of operating bins the year is solved for; :func:`parse_bins_text` reads bins
pasted as text.
"""
from __future__ import annotations

__all__ = ["MONTH_NAMES", "DAYS_IN_MONTH", "Bin", "year_problems", "operating_bins", "parse_bins_text",
           "bin_profile", "BIN_T_STEP_K", "BIN_RH_STEP", "BIN_LOAD_STEP"]

from dataclasses import dataclass

from stagewright.core.errors import InputError, Problem

MONTH_NAMES = ("January", "February", "March", "April", "May", "June", "July", "August",
               "September", "October", "November", "December")
DAYS_IN_MONTH = (31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31)  #: a common (non-leap) year
HOURS_IN_YEAR = 8760.0
BIN_T_STEP_K = 1.0  #: default width of a temperature bin (and of a coolant-temperature bin), [K]
BIN_RH_STEP = 0.05  #: default width of a relative-humidity bin, [-]
BIN_LOAD_STEP = 0.05  #: width of a load bin, [-]
MAX_HOURS = 8784.0  #: a leap year


@dataclass(frozen=True)
class Bin:
    """One operating bin: ambient state, operating hours and load (SI)."""

    label: str
    temperature_K: float
    relative_humidity: float
    hours: float
    load: float
    coolant_inlet_temperature_K: float | None = None


def year_problems(norm: dict) -> list[Problem]:
    """Problems of a normalised document's ``year`` section (empty when it is absent or fine)."""
    year = norm.get("year")
    if not year:
        return []
    out = []
    prof = year["profile"]
    if prof["kind"] == "monthly":
        months = prof["months"]
        if len(months) != 12:
            missing = ", ".join(MONTH_NAMES[len(months):]) if len(months) < 12 else "none"
            out.append(Problem("year.profile.months", f"{len(months)} month(s)",
                               "expected 12 monthly entries, January to December in order "
                               f"(missing: {missing})"))
            return out
        given = [m.get("hours") is not None for m in months]
        if any(given) and not all(given):
            first = given.index(False)
            out.append(Problem(f"year.profile.months[{first}].hours", None,
                               "give hours for every month or for none (then operating_hours_per_year "
                               "is spread by the days of each month)"))
        elif all(given):
            for i, m in enumerate(months):
                limit = 24.0 * DAYS_IN_MONTH[i] + (24.0 if i == 1 else 0.0)
                if m["hours"] > limit:
                    out.append(Problem(f"year.profile.months[{i}].hours", m["hours"],
                                       f"expected at most {limit:g} h in {MONTH_NAMES[i]}"))
    else:
        total = sum(b["hours"] for b in prof["bins"])
        if total > MAX_HOURS:
            out.append(Problem("year.profile.bins", f"{total:g} h in all",
                               f"expected bins adding up to at most {MAX_HOURS:g} h (one year)"))
    hours = year.get("operating_hours_per_year")
    if hours is not None and hours > MAX_HOURS:
        out.append(Problem("year.operating_hours_per_year", hours, f"expected at most {MAX_HOURS:g} h"))
    return out


def operating_bins(year: dict) -> list[Bin]:
    """Operating bins of a checked ``year`` section.

    Monthly profile: each month runs ``hours`` when given, otherwise
    ``operating_hours_per_year`` (default 8760 h) spread in proportion to its days.
    Bins: each bin's hours, scaled so that they add up to ``operating_hours_per_year``
    when that is given. Load per entry falls back to the section's ``load``.
    """
    prof = year["profile"]
    load = year["load"]
    hours_year = year.get("operating_hours_per_year")
    out = []
    if prof["kind"] == "monthly":
        months = prof["months"]
        for i, m in enumerate(months):
            if m.get("hours") is not None:
                h = m["hours"]
            else:
                h = (HOURS_IN_YEAR if hours_year is None else hours_year) * DAYS_IN_MONTH[i] / 365.0
            out.append(Bin(MONTH_NAMES[i], m["temperature_K"], m["relative_humidity"], h,
                           m.get("load") or load, m.get("coolant_inlet_temperature_K")))
        return out
    bins = prof["bins"]
    total = sum(b["hours"] for b in bins)
    scale = 1.0 if hours_year is None or total <= 0.0 else hours_year / total
    for i, b in enumerate(bins):
        out.append(Bin(b.get("label") or f"bin {i + 1}", b["temperature_K"], b["relative_humidity"],
                       b["hours"] * scale, b.get("load") or load, b.get("coolant_inlet_temperature_K")))
    return out


def parse_bins_text(text: str, field: str = "year.profile.bins") -> list[dict]:
    """Bins pasted as text: one per line, ``temperature_K  relative_humidity  hours``.

    Columns may be separated by spaces, tabs, commas or semicolons; blank lines and lines
    starting with ``#`` are skipped. Values are SI (the window converts before calling).

    Raises
    ------
    InputError
        Naming the line that cannot be read.

    Examples
    --------
    >>> parse_bins_text("# T RH h\\n278.15, 0.8, 1200\\n293.15\\t0.6\\t900")[1]
    {'temperature_K': 293.15, 'relative_humidity': 0.6, 'hours': 900.0}
    """
    bins = []
    for n, line in enumerate(text.splitlines(), start=1):
        line = line.strip()
        if not line or line.startswith("#"):
            continue
        parts = [p for p in line.replace(",", " ").replace(";", " ").split() if p]
        try:
            t, rh, h = (float(p) for p in parts)
        except ValueError:
            raise InputError(f"{field} (line {n})", line,
                             "expected three numbers: temperature [K], relative humidity [0–1], hours [h]") from None
        bins.append({"temperature_K": t, "relative_humidity": rh, "hours": h})
    if not bins:
        raise InputError(field, text[:40], "expected at least one bin")
    return bins


def bin_profile(rows: list, t_step: float = BIN_T_STEP_K, rh_step: float = BIN_RH_STEP, label=None) -> list:
    r"""Hourly (or logged) rows grouped into bins of temperature and humidity, for a faster year.

    Rows whose dry-bulb temperature falls in the same ``t_step`` interval, relative humidity in
    the same ``rh_step`` interval, and (when given) load in the same 0.05 interval and coolant
    temperature in the same ``t_step`` interval form one bin. The bin runs for the rows' hours
    together, at their hours-weighted means:

    .. math:: t_b = \sum_{j \in b} t_j, \qquad \bar x_b = \frac{1}{t_b}\sum_{j \in b} t_j\,x_j

    What binning changes: the total hours, and any figure linear in temperature and humidity
    within a bin, are kept; figures that bend inside a bin are taken at its mean — energy and
    cooling water barely move (their curvature over 1 K is small), condensate can move more
    (water condenses only below each row's own dew point), and extremes are smoothed (the
    hottest discharge is that of the hottest bin's mean, up to about half a bin below the
    hottest hour's). Years of hourly rows shrink from 8760 solves to a few hundred.

    Parameters
    ----------
    rows : list of dict
        Entries of ``year.profile.bins`` (``temperature_K``, ``relative_humidity``, ``hours``,
        optional ``load`` and ``coolant_inlet_temperature_K``).
    t_step : float
        Width of a temperature bin, [K].
    rh_step : float
        Width of a relative-humidity bin, [-].
    label : callable, optional
        ``label(bin) -> str`` names each bin (the front end names it in display units);
        default: the number of rows it holds.

    Returns
    -------
    list of dict
        Bins in order of temperature, labelled with the number of rows they hold.

    Examples
    --------
    >>> rows = [{"temperature_K": 280.2, "relative_humidity": 0.61, "hours": 1.0},
    ...         {"temperature_K": 280.6, "relative_humidity": 0.63, "hours": 3.0},
    ...         {"temperature_K": 290.0, "relative_humidity": 0.5, "hours": 1.0}]
    >>> b = bin_profile(rows)
    >>> len(b), b[0]["hours"], round(b[0]["temperature_K"], 2), b[0]["label"]
    (2, 4.0, 280.5, '2 rows')
    """
    import math
    groups: dict = {}
    for r in rows:
        key = (math.floor(r["temperature_K"] / t_step), math.floor(r["relative_humidity"] / rh_step),
               None if r.get("load") is None else math.floor(r["load"] / BIN_LOAD_STEP),
               None if r.get("coolant_inlet_temperature_K") is None
               else math.floor(r["coolant_inlet_temperature_K"] / t_step))
        groups.setdefault(key, []).append(r)
    out = []
    for key in sorted(groups, key=lambda k: (k[0], k[1], k[2] or 0, k[3] or 0)):
        members = groups[key]
        hours = sum(r["hours"] for r in members)
        if hours <= 0.0:
            continue

        def mean(name: str) -> float:
            return sum(r[name] * r["hours"] for r in members) / hours
        b = {"label": f"{len(members)} row{'s' if len(members) != 1 else ''}",
             "temperature_K": mean("temperature_K"), "relative_humidity": min(1.0, mean("relative_humidity")),
             "hours": hours}
        if key[2] is not None:
            b["load"] = mean("load")
        if key[3] is not None:
            b["coolant_inlet_temperature_K"] = mean("coolant_inlet_temperature_K")
        if label is not None:
            b["label"] = label(b)[:80]
        out.append(b)
    return out
