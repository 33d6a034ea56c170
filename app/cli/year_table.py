"""Plain-text table of a year at the site for ``stagewright year`` (SI units, °C for reading).

Its columns and totals are the figures of :mod:`stagewright.gui.presentation.year_tables` that show in the
``"text"`` output, each column as wide as its text :class:`~stagewright.gui.presentation.figures.Look` says
(else two characters wider than its header); text is left-aligned, numbers right-aligned,
without thousands grouping.
"""
from __future__ import annotations

__all__ = ["format_year"]

from stagewright.gui.presentation import year_tables
from stagewright.gui.presentation.figures import Figure, read_path, shown

_OUT = "text"
_TOTAL_NAME_WIDTH, _TOTAL_WIDTH = 25, 14


def _header(fig: Figure) -> str:
    label, sym = fig.label_in(_OUT), fig.symbol_in(_OUT)
    return f"{label} [{sym}]" if sym else label


def _cell(fig: Figure, text: str) -> str:
    width = fig.look(_OUT).width
    width = width if width is not None else len(_header(fig)) + 2
    return f"{text:<{width}}" if fig.is_left_aligned() else f"{text:>{width}}"


def _lower_first(label: str) -> str:
    """``"Net cost"`` → ``"net cost"``; an acronym stays as it is."""
    return label[:1].lower() + label[1:] if label[1:2].islower() else label


def _total_line(fig: Figure, year: dict) -> str:
    """``energy   985585 kWh``; an extreme of the year as ``worst …: August (137.3 °C)``."""
    label = _lower_first(fig.label_in(_OUT))
    if fig.bin_key:
        value = fig.text(year, _OUT, with_unit=True, grouping=False)
        return f"{label}: {read_path(year, fig.bin_key)} ({value})"
    sym = fig.symbol_in(_OUT)
    line = f"{label:<{_TOTAL_NAME_WIDTH}}{fig.text(year, _OUT, missing='', grouping=False):>{_TOTAL_WIDTH}}"
    return line + (f" {sym}" if sym else "") + (f" ({fig.note})" if fig.note else "")


def format_year(title: str, y: dict) -> str:
    """Format ``YearResult.to_dict()`` as an aligned month-by-month (bin-by-bin) table."""
    lines = [title or "(untitled project)", "a year at the site", ""]
    columns = shown(year_tables.YEAR_BINS, _OUT)
    lines.append("".join(_cell(f, _header(f)) for f in columns))
    for b in y["bins"]:
        lines.append("".join(_cell(f, f.text(b, _OUT, missing="", grouping=False)) for f in columns))
    lines.append("")
    lines += [_total_line(f, y) for f in shown(year_tables.YEAR_TOTALS, _OUT)]
    return "\n".join(lines)
