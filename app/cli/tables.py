"""Tables the sub-commands write (a sweep's grid, a year's bins): CSV, Parquet or Excel.

One header row, the SI unit in each column name (``shaft_power_W``), then one row per grid
point or bin. The output file's suffix chooses the format: ``.parquet`` (needs ``pyarrow``)
and ``.xlsx`` (needs ``openpyxl``) come with the optional extra ``stagewright[tables]`` and
are never required; anything else is CSV (RFC 4180, UTF-8). A format whose library is
missing is refused before any work starts (:func:`format_problem`). Numbers stay numbers
(full precision), a missing value is empty (CSV) or null; text from a file is written as
text, never as a spreadsheet formula.
"""
from __future__ import annotations

__all__ = ["TABLE_FORMATS", "EXTRA", "table_format", "format_problem", "csv_text", "table_bytes", "write_table"]

import csv
import importlib.util
import io
import math
import os
from pathlib import Path

#: suffix -> (format, the library it needs or None)
TABLE_FORMATS = {".csv": ("csv", None), ".parquet": ("parquet", "pyarrow"), ".xlsx": ("xlsx", "openpyxl")}
#: the optional extra that brings the libraries (pyproject.toml)
EXTRA = "tables"


def table_format(path) -> str:
    """``"csv"``, ``"parquet"`` or ``"xlsx"`` by the suffix of ``path`` (CSV for any other)."""
    return TABLE_FORMATS.get(Path(path).suffix.lower(), ("csv", None))[0]


def format_problem(path) -> str | None:
    """Why ``path`` cannot be written in its format here (its library is not installed), or None."""
    fmt, library = TABLE_FORMATS.get(Path(path).suffix.lower(), ("csv", None))
    if library is None or importlib.util.find_spec(library) is not None:
        return None
    return (f"{path}: writing {fmt} needs {library}, which is not installed; "
            f"pip install 'stagewright[{EXTRA}]' (or write .csv)")


def _csv_cell(value) -> str:
    if value is None:
        return ""
    if isinstance(value, float):
        return repr(value)  # every digit: reads back to the same float
    return str(value)


def csv_text(header: list[str], rows: list[list]) -> str:
    """The table as CSV text: the header row, then the rows (floats in full precision)."""
    buf = io.StringIO()
    writer = csv.writer(buf)
    writer.writerow(header)
    writer.writerows([_csv_cell(v) for v in row] for row in rows)
    return buf.getvalue()


def _column(values: list) -> list:
    """A column as one type: bool, float (numbers), or text; None stays None."""
    present = [v for v in values if v is not None]
    if present and all(isinstance(v, bool) for v in present):
        return values
    if all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in present):
        return [None if v is None else float(v) for v in values]
    return [None if v is None else _csv_cell(v) for v in values]


def _parquet(header: list[str], rows: list[list]) -> bytes:
    import pyarrow as pa
    import pyarrow.parquet as pq

    columns = {name: _column([row[j] for row in rows]) for j, name in enumerate(header)}
    table = pa.table({name: pa.array(values) for name, values in columns.items()})
    sink = io.BytesIO()
    pq.write_table(table, sink)
    return sink.getvalue()


def _xlsx(header: list[str], rows: list[list]) -> bytes:
    from openpyxl import Workbook
    from openpyxl.cell import WriteOnlyCell

    from stagewright.gui.cli.terminal import escape_controls

    book = Workbook(write_only=True)
    sheet = book.create_sheet("table")

    def cell(value):
        if isinstance(value, float) and not math.isfinite(value):
            value = None
        if not isinstance(value, str):
            return value
        c = WriteOnlyCell(sheet, value=escape_controls(value))  # control characters are not XML
        c.data_type = "s"  # text, even when it starts with "=": never a formula
        return c

    sheet.append([cell(h) for h in header])
    for row in rows:
        sheet.append([cell(v) for v in row])
    sink = io.BytesIO()
    book.save(sink)
    return sink.getvalue()


def table_bytes(fmt: str, header: list[str], rows: list[list]) -> bytes:
    """The table in format ``fmt`` (:func:`table_format`) as the bytes of a file."""
    if fmt == "parquet":
        return _parquet(header, rows)
    if fmt == "xlsx":
        return _xlsx(header, rows)
    return csv_text(header, rows).encode("utf-8")


def write_table(path: Path, header: list[str], rows: list[list]) -> None:
    """Write the table to ``path`` atomically in the format its suffix names.

    Raises
    ------
    OSError
        When the file cannot be written; ``path`` is then unchanged.
    """
    from stagewright.gui.report.atomic import atomic_path

    data = table_bytes(table_format(path), header, rows)
    with atomic_path(path) as tmp:
        with open(tmp, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
