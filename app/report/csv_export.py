"""The balance sheet as CSV for spreadsheets: one row per state point and per component.

Layout: one header row, each column named with its display unit as the sweep's and the JSON's
keys carry theirs (``temperature_degC``, ``pressure_bar_a``, ``entropy_kJ_kgK``, ``shaft_power_kW``;
:func:`column_name`), then data rows; a file reads into a data frame as it is. The first column says
what the row is (``state``, ``component`` or ``train``). The columns are the figures of
:mod:`stagewright.gui.presentation.balance_tables` that show in the ``"csv"`` output: state-point figures,
then component figures, then any train totals (filled in the ``train`` row); a spreadsheet's
columns stay put, so a column is there even when no row has a value. Numbers are written in the
chosen display units to 12 significant digits, so converting back with
:func:`stagewright.gui.presentation.units.to_si` returns the solver's SI values to 1e-12 relative; a missing
value is an empty cell. A project with a ``package`` section gains the package's columns and
rows (``package``: full load, stated load, each data-sheet load at the site; ``package_year``: the
load profile). Written with the standard library's :mod:`csv` (RFC 4180 quoting, UTF-8).
"""
from __future__ import annotations

__all__ = ["COLUMNS", "column_name", "csv_columns", "csv_rows", "write_csv", "write_year_csv", "year_csv_path"]

import csv
import io
import re
from pathlib import Path

from stagewright.gui.presentation import balance_tables as tables
from stagewright.gui.presentation import package_table
from stagewright.gui.presentation.figures import Figure, shown
from stagewright.gui.report.atomic import atomic_path
from stagewright.gui.report.sections import state_points

_OUT = "csv"


def _figures(package: bool = False) -> list[tuple[str, Figure]]:
    """(row part, figure) of every figure column: ``"point"``, ``"component"`` or ``"total"``, and
    with ``package`` the package's (``"package"``, ``"package_year"``: :mod:`stagewright.gui.presentation.package_table`)."""
    return ([("point", f) for f in shown(tables.POINTS, _OUT)]
            + [("component", f) for f in shown(tables.COMPONENTS, _OUT)]
            + [("total", f) for f in shown(tables.TOTALS, _OUT)]
            + ([("package", f) for f in shown(package_table.PACKAGE_POINT, _OUT)]
               + [("package_year", f) for f in shown(package_table.PACKAGE_ANNUAL, _OUT)] if package else []))


def _package_records(pkg: dict | None) -> list[tuple[str, str, dict]]:
    """Rows of a project with a ``package`` section: full, stated and data-sheet loads, the profile's year."""
    if not pkg:
        return []
    rows = [("package", name, {"package": (point, None)})
            for name, point in package_table.point_columns(pkg, part_loads=True)]
    if pkg.get("annual"):
        rows.append(("package_year", "Load profile", {"package_year": (package_table.annual_view(pkg["annual"]), None)}))
    return rows


#: characters of a unit symbol as a column name writes them (``kJ/(kg·K)`` → ``kJ_kgK``)
_SYMBOL_CHARS = str.maketrans({"/": "_", "(": "_", ")": "", "·": "", " ": "", "°": "deg", "³": "3", "²": "2",
                               "%": "percent"})


def column_name(label: str, symbol: str) -> str:
    """A column named with its unit, in the style of the project's keys (``discharge_pressure_Pa``).

    Examples
    --------
    >>> column_name("entropy", "kJ/(kg·K)"), column_name("pressure", "bar(a)"), column_name("temperature", "°F")
    ('entropy_kJ_kgK', 'pressure_bar_a', 'temperature_degF')
    >>> column_name("density", "kg/m³"), column_name("relative_humidity", "%"), column_name("isentropic_efficiency", "")
    ('density_kg_m3', 'relative_humidity_percent', 'isentropic_efficiency')
    """
    suffix = re.sub("_+", "_", symbol.translate(_SYMBOL_CHARS)).strip("_")
    return f"{label}_{suffix}" if suffix and suffix != "-" else label


def _column(fig: Figure, system: str) -> str:
    return column_name(fig.label_in(_OUT), fig.symbol_in(_OUT, system) or "")


def csv_columns(system: str = "SI") -> list[tuple[str, str | None]]:
    """(column name, display quantity or None for text) of every column, in order."""
    return [("kind", None), ("name", None)] + [
        (_column(f, system), None if f.style in ("text", "yes_no") else (f.look(_OUT).quantity or f.quantity))
        for _, f in _figures()]


#: (column name, quantity of stagewright.gui.presentation.units or None for text) in SI display units, as the
#: tables stood at import
COLUMNS = csv_columns()


def _cell(fig: Figure, data: dict | None, kind: str | None, system: str) -> str:
    value = None if data is None else fig.value(data, kind)
    if value is None:
        return ""
    if fig.style in ("text", "yes_no", "scientific") or (fig.look(_OUT).quantity or fig.quantity) is None:
        return fig.format(value, _OUT, system, missing="")
    return format(fig.unit_in(_OUT, system).to_display(float(value) * fig.to_si), ".12g")


def csv_rows(result: dict, system: str = "SI") -> list[list[str]]:
    """Header row (the unit in each column name) and data rows of the CSV (strings, display units)."""
    figures = _figures(package=bool(result.get("package")))
    header = ["kind", "name"] + [_column(f, system) for _, f in figures]
    # (row kind, name, {row part: (data, kind for per-kind paths)})
    records = [("state", name, {"point": (pt, None)}) for name, pt in state_points(result)]
    for _, kind, i, data in tables.component_rows(result):
        if kind == "train":
            records.append(("train", "Train", {"component": (data, kind), "total": (result, None)}))
        else:
            name = {"filter": "Intake filter", "stage": f"Stage {i}", "cooler": f"Cooler {i}"}[kind]
            records.append(("component", name, {"component": (data, kind)}))
    records += _package_records(result.get("package"))
    body = [[row_kind, name] + [_cell(f, *parts.get(part, (None, None)), system) for part, f in figures]
            for row_kind, name, parts in records]
    return [header] + body


def write_csv(result: dict, path, system: str = "SI") -> None:
    """Write the CSV to ``path`` atomically (a half-written file never replaces a good one)."""
    _write_rows(csv_rows(result, system), path)


def _write_rows(rows, path) -> None:
    """``rows`` as CSV (CRLF, UTF-8) to ``path``, atomically."""
    buf = io.StringIO()
    csv.writer(buf, lineterminator="\r\n").writerows(rows)
    with atomic_path(path) as tmp:
        with open(tmp, "w", encoding="utf-8", newline="") as fh:
            fh.write(buf.getvalue())


def year_csv_path(csv_path) -> Path:
    """Where the year's bins go beside a report's CSV: ``<name>-year.csv``."""
    path = Path(csv_path)
    return path.with_name(f"{path.stem}-year{path.suffix or '.csv'}")


def write_year_csv(year: dict, path) -> None:
    """Every bin of a year (``YearResult.to_dict()``) as one row, SI with the unit in each key, written
    atomically (:func:`stagewright.gui.presentation.year_tables.bins_csv_rows`)."""
    from stagewright.gui.presentation.year_tables import bins_csv_rows
    _write_rows(bins_csv_rows(year), path)
