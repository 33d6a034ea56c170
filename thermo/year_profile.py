"""The ambient profile of a year at the site: 12 monthly means or pasted hourly bins.

:func:`year_problems` checks a normalised ``year`` section beyond what the schema can say
(exactly twelve months, hours that fit in a year); :func:`operating_bins` turns it into
the list of operating bins the year is solved for; :func:`parse_bins_text` reads bins
pasted as text.
"""
from __future__ import annotations

__all__ = ["MONTH_NAMES", "DAYS_IN_MONTH", "Bin", "year_problems", "operating_bins", "parse_bins_text"]

from dataclasses import dataclass

from thermo.errors import InputError, Problem

MONTH_NAMES = ("January", "February", "March", "April", "May", "June", "July", "August",
               "September", "October", "November", "December")
DAYS_IN_MONTH = (31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31)  #: a common (non-leap) year
HOURS_IN_YEAR = 8760.0
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
