"""An ambient profile from an hourly or logged CSV file: one row per hour or logged interval. Qt-free.

The first line that is not blank and does not start with ``#`` is the header. Columns are found
by name (case and spaces ignored), each with its unit in the header — ``temperature [°C]``,
``T (K)``, ``rh %``, ``dew_point_F`` — or, where the header names none, the unit chosen on
import (:data:`DEFAULT_UNITS`):

=====================  ===================================================  ================
column                 header names                                         units
=====================  ===================================================  ================
timestamp (optional)   time, timestamp, date, datetime                      ISO 8601
dry-bulb temperature   temperature, temp, t, dry_bulb, tdb, ambient         °C, °F, K
relative humidity      relative_humidity, rh, humidity                      %, fraction
or dew point           dew_point, dewpoint, td, tdp                         °C, °F, K
or frost point         frost_point, tf                                      °C, °F, K
load (optional)        load                                                 %, fraction
coolant (optional)     coolant, coolant_temperature, coolant_inlet, supply  °C, °F, K
hours (optional)       hours, duration, interval                            h
=====================  ===================================================  ================

Relative humidity is taken as meteorological data give it, relative to liquid water also below
0 °C (WMO-No. 8); a dew point too (over supercooled water below 0 °C, as station data report
it) and a frost point over ice; both are turned into relative humidity with the vapour
pressures of :mod:`stagewright.core.moist.saturation` (the enhancement factor cancels in the ratio to
within about 1e-4). Each row runs for its ``hours``, else for the time to the next timestamp
(the last row: the median step), else one hour. A row with a timestamp is named by it
(``label``, e.g. ``2025-01-17 06:00``), so results name the hour.

Nothing is imported half-way: every row is read first, and the first bad one raises an
:class:`~stagewright.core.errors.InputError` naming its line, its column and the valid range.
"""
from __future__ import annotations

__all__ = ["COLUMNS", "DEFAULT_UNITS", "read_profile_csv", "read_profile_text", "ProfileCsv"]

import csv
import io
import re
import statistics
from dataclasses import dataclass, field
from datetime import datetime

from stagewright.core.errors import InputError
from stagewright.core.moist.saturation import T_TRIPLE, liquid_vapour_pressure, sublimation_pressure

from stagewright.gui.presentation.units import Unit, unit_named

#: column → the header names that mean it (lower case, without spaces, units or brackets)
COLUMNS = {
    "time": ("time", "timestamp", "date", "datetime"),
    "temperature": ("temperature", "temp", "t", "drybulb", "dry_bulb", "tdb", "ambient", "airtemperature"),
    "relative_humidity": ("relative_humidity", "relativehumidity", "rh", "humidity"),
    "dew_point": ("dew_point", "dewpoint", "td", "tdp"),
    "frost_point": ("frost_point", "frostpoint", "tf"),
    "load": ("load",),
    "coolant": ("coolant", "coolant_temperature", "coolant_inlet", "coolant_inlet_temperature", "supply",
                "coolant_supply"),
    "hours": ("hours", "duration", "interval", "h"),
}
_QUANTITY = {"temperature": "temperature", "dew_point": "temperature", "frost_point": "temperature",
             "coolant": "temperature", "relative_humidity": "fraction", "load": "fraction", "hours": "hours"}
#: units a header may name, per quantity (symbol as written → display unit of the units table)
_UNIT_WORDS = {
    "temperature": {"°c": "°C", "degc": "°C", "c": "°C", "celsius": "°C", "°f": "°F", "degf": "°F", "f": "°F",
                    "fahrenheit": "°F", "k": "K", "kelvin": "K"},
    "fraction": {"%": "%", "percent": "%", "pct": "%", "fraction": "", "-": "", "1": ""},
    "hours": {"h": "h", "hours": "h"},
}
#: the unit of a column whose header names none (the window and the command line let the user choose)
DEFAULT_UNITS = {"temperature": "°C", "fraction": "%", "hours": "h"}
_RANGES = {"temperature": (223.15, 333.15), "dew_point": (173.15, 333.15), "frost_point": (173.15, T_TRIPLE),
           "coolant": (263.15, 373.15), "relative_humidity": (0.0, 1.0), "load": (0.0, 1.0), "hours": (0.0, 8784.0)}


def _unit(quantity: str, symbol: str) -> Unit:
    if quantity == "fraction" and symbol == "":
        return Unit("", 1.0, 0.0, 4)
    if quantity == "temperature" and symbol == "K":
        return Unit("K", 1.0, 0.0, 2)
    return unit_named(quantity, symbol)


@dataclass
class ProfileCsv:
    """What a CSV file gave: the bins (SI, ready for ``year.profile.bins``) and how it was read."""

    bins: list
    columns: dict  #: column → (header as written, unit symbol used)
    rows: int
    notes: list = field(default_factory=list)


def _split_header(cell: str) -> tuple[str, str | None]:
    """``"Temperature [°C]"`` → (``"temperature"``, ``"°C"``); the unit None when the header names none."""
    text = cell.strip().lower()
    m = re.match(r"^(.*?)\s*[\[(]\s*([^\])]*)\s*[\])]\s*$", text)
    if m:
        return re.sub(r"[\s\-]+", "_", m.group(1).strip()), m.group(2).strip()
    name = re.sub(r"[\s\-]+", "_", text)
    for words in _UNIT_WORDS.values():  # a unit after an underscore: temperature_c, rh_%
        for word in sorted(words, key=len, reverse=True):
            if name.endswith("_" + word) and name[:-len(word) - 1]:
                return name[:-len(word) - 1], word
    return name, None


def _columns(header: list, units: dict, line: int) -> dict:
    """column → (index, header, Unit) for the header cells; unknown headers are refused."""
    found = {}
    for i, cell in enumerate(header):
        name, word = _split_header(cell)
        column = next((c for c, names in COLUMNS.items() if name in names or name.replace("_", "") in names), None)
        if column is None:
            raise InputError(f"CSV line {line}, column {i + 1} '{cell.strip()}'", cell.strip(),
                             "a column named like one of: " + ", ".join(n[0] for n in COLUMNS.values()))
        if column in found:
            raise InputError(f"CSV line {line}, column {i + 1} '{cell.strip()}'", cell.strip(),
                             f"one {column.replace('_', ' ')} column (it is also column {found[column][0] + 1})")
        quantity = _QUANTITY.get(column)
        unit = None
        if quantity is not None:
            if word is None:
                symbol = units.get(quantity, DEFAULT_UNITS[quantity])
            elif word in _UNIT_WORDS[quantity]:
                symbol = _UNIT_WORDS[quantity][word]
            else:
                raise InputError(f"CSV line {line}, column {i + 1} '{cell.strip()}'", word,
                                 "a unit of " + ", ".join(sorted(set(_UNIT_WORDS[quantity].values()) - {""}))
                                 + (" or fraction" if quantity == "fraction" else ""))
            unit = _unit(quantity, symbol)
        found[column] = (i, cell.strip(), unit)
    if "temperature" not in found:
        raise InputError(f"CSV line {line}", ", ".join(header), "a dry-bulb temperature column")
    humid = [c for c in ("relative_humidity", "dew_point", "frost_point") if c in found]
    if len(humid) != 1:
        raise InputError(f"CSV line {line}", ", ".join(header),
                         "exactly one of relative humidity, dew point or frost point")
    return found


def _value(row: list, column: str, spec: tuple, line: int) -> float:
    i, header, unit = spec
    where = f"CSV line {line}, column {i + 1} '{header}'"
    text = row[i].strip() if i < len(row) else ""
    try:
        value = unit.to_si(float(text.replace(",", ".") if text.count(",") == 1 and "." not in text else text))
    except ValueError:
        raise InputError(where, text, "a number" + (f" in {unit.symbol}" if unit.symbol else "")) from None
    lo, hi = _RANGES[column]
    if not lo <= value <= hi or value != value:
        shown = (f"{unit.to_display(lo):g} {unit.symbol} to {unit.to_display(hi):g} {unit.symbol}"
                 if unit.symbol else f"{lo:g} to {hi:g}")
        raise InputError(where, text, f"a value from {shown}")
    return value


def _row(row: list, cols: dict, line: int) -> dict:
    t = _value(row, "temperature", cols["temperature"], line)
    out = {"temperature_K": t}
    if "relative_humidity" in cols:
        out["relative_humidity"] = _value(row, "relative_humidity", cols["relative_humidity"], line)
    else:
        key = "dew_point" if "dew_point" in cols else "frost_point"
        td = _value(row, key, cols[key], line)
        if td > t + 1e-9:
            i, header, _ = cols[key]
            raise InputError(f"CSV line {line}, column {i + 1} '{header}'", row[i].strip(),
                             "at most the dry-bulb temperature of the row")
        e = liquid_vapour_pressure(td) if key == "dew_point" else sublimation_pressure(td)
        out["relative_humidity"] = min(1.0, e / liquid_vapour_pressure(t))
    if "load" in cols:
        load = _value(row, "load", cols["load"], line)
        if load <= 0.0:
            i, header, _ = cols["load"]
            raise InputError(f"CSV line {line}, column {i + 1} '{header}'", row[i].strip(), "a load above 0")
        out["load"] = load
    if "coolant" in cols:
        out["coolant_inlet_temperature_K"] = _value(row, "coolant", cols["coolant"], line)
    if "hours" in cols:
        out["hours"] = _value(row, "hours", cols["hours"], line)
    return out


def _times(rows: list, spec: tuple, lines: list) -> list:
    i, header, _ = spec
    out = []
    for row, line in zip(rows, lines):
        text = row[i].strip() if i < len(row) else ""
        try:
            out.append(datetime.fromisoformat(text.replace("Z", "+00:00")))
        except ValueError:
            raise InputError(f"CSV line {line}, column {i + 1} '{header}'", text,
                             "a date and time as ISO 8601, e.g. 2025-01-31 13:00") from None
    return out


def _hours_from_times(times: list, lines: list, spec: tuple) -> list:
    steps = []
    for k in range(len(times) - 1):
        h = (times[k + 1] - times[k]).total_seconds() / 3600.0
        if h <= 0.0:
            raise InputError(f"CSV line {lines[k + 1]}, column {spec[0] + 1} '{spec[1]}'", str(times[k + 1]),
                             "a time after the row before (rows in time order)")
        steps.append(h)
    last = statistics.median(steps) if steps else 1.0
    return steps + [last]


def read_profile_text(text: str, units: dict | None = None) -> ProfileCsv:
    """The bins of a CSV text (see the module notes); InputError naming line and column.

    Parameters
    ----------
    text : str
        The file's text.
    units : dict, optional
        Unit symbol per quantity for columns whose header names none, e.g.
        ``{"temperature": "°F", "fraction": ""}`` (default :data:`DEFAULT_UNITS`).

    Examples
    --------
    >>> p = read_profile_text("time, temperature [°C], rh [%]\\n2025-01-01 00:00, -8, 85\\n"
    ...                       "2025-01-01 01:00, -9, 88\\n")
    >>> [round(b["temperature_K"], 2) for b in p.bins], [b["hours"] for b in p.bins]
    ([265.15, 264.15], [1.0, 1.0])
    """
    units = units or {}
    numbered = [(n, line) for n, line in enumerate(text.splitlines(), start=1)
                if line.strip() and not line.lstrip().startswith("#")]
    if not numbered:
        raise InputError("CSV", text[:40], "a header line and at least one row")
    # the separator is the one the header uses most: tab, semicolon (decimal commas) or comma
    count, delimiter = max((numbered[0][1].count(d), d) for d in ("\t", ";", ","))
    parsed = list(csv.reader(io.StringIO("\n".join(line for _, line in numbered)),
                             delimiter=delimiter if count else ","))
    header_line, header = numbered[0][0], parsed[0]
    cols = _columns(header, units, header_line)
    lines = [n for n, _ in numbered[1:]]
    rows = parsed[1:]
    if not rows:
        raise InputError(f"CSV line {header_line}", ", ".join(header), "at least one row under the header")
    if len(rows) > 8784:
        raise InputError(f"CSV line {lines[8784]}", f"{len(rows)} rows", "at most 8784 rows (one leap year of hours)")
    bins = [_row(row, cols, line) for row, line in zip(rows, lines)]
    notes = []
    times = _times(rows, cols["time"], lines) if "time" in cols else None
    if times is not None:  # each row named by its time: results and charts say which hour, not "bin 4873"
        for b, t in zip(bins, times):
            b["label"] = f"{t:%Y-%m-%d %H:%M}"
    if "hours" not in cols:
        if times is not None:
            for b, h in zip(bins, _hours_from_times(times, lines, cols["time"])):
                b["hours"] = h
            notes.append("each row runs until the next timestamp (the last row: the median step)")
        else:
            for b in bins:
                b["hours"] = 1.0
            notes.append("no hours or timestamps: each row is one hour")
    total = sum(b["hours"] for b in bins)
    if total > 8784.0:
        raise InputError(f"CSV line {lines[-1]}", f"{total:g} h in all", "rows adding up to at most 8784 h (one year)")
    return ProfileCsv(bins, {c: (h, u.symbol if u else "") for c, (_, h, u) in cols.items()}, len(bins), notes)


def read_profile_csv(path, units: dict | None = None) -> ProfileCsv:
    """:func:`read_profile_text` of a file (UTF-8, a byte-order mark allowed)."""
    from pathlib import Path
    try:
        text = Path(path).read_text(encoding="utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError(f"CSV file {path}", f"byte {exc.start}", "a UTF-8 text file") from None
    return read_profile_text(text, units)
