"""Readable plain-text table of a solved train for the command line (SI units).

Its columns and totals are those of :mod:`stagewright.gui.presentation.balance_tables` that show in the
``"text"`` output: a figure added there appears here too. Numbers are right-aligned in the
width a figure's text :class:`~stagewright.gui.presentation.figures.Look` gives (else two characters wider
than its header), without thousands grouping; totals print to 4 decimals unless told otherwise,
with their labels' first letter in lower case.
"""
from __future__ import annotations

__all__ = ["format_result", "package_lines"]

from stagewright.gui.presentation import balance_tables as tables
from stagewright.gui.presentation import package_table
from stagewright.gui.presentation.figures import Figure, condition_holds, shown

_OUT = "text"
_NAME_WIDTH, _TOTAL_NAME_WIDTH, _TOTAL_WIDTH, _TOTAL_DECIMALS = 22, 24, 14, 4


def _header(fig: Figure) -> str:
    label, sym = fig.label_in(_OUT), fig.symbol_in(_OUT)
    return f"{label} [{sym}]" if sym else label


def _width(fig: Figure) -> int:
    width = fig.look(_OUT).width
    return width if width is not None else len(_header(fig)) + 2


def _columns(table, result: dict, rows=()) -> list[Figure]:
    return [f for f in shown(table, _OUT) if condition_holds(f, _OUT, result, rows)]


def _line(name: str, cells: list[str], columns: list[Figure]) -> str:
    return f"{name:<{_NAME_WIDTH}}" + "".join(f"{text:>{_width(f)}}" for f, text in zip(columns, cells))


def _lower_first(label: str) -> str:
    """``"Shaft power"`` → ``"shaft power"``; an acronym (``"ISO class"``) stays as it is."""
    return label[:1].lower() + label[1:] if label[1:2].islower() else label


def _point_name(key: str, i: int | None) -> str:
    return {"intake": "intake", "filter": "after filter"}.get(key) or (
        f"stage {i} discharge" if key.startswith("stage") else f"cooler {i} outlet")


def _component_name(kind: str, i: int | None, component: dict) -> str:
    if kind == "filter":
        return "intake filter"
    return f"stage {i} (r={component['pressure_ratio']:.3f})" if kind == "stage" else f"cooler {i}"


def _total_line(fig: Figure, result: dict) -> str:
    name = f"{_lower_first(fig.label_in(_OUT)):<{_TOTAL_NAME_WIDTH}}"
    if fig.style == "scientific" or (fig.look(_OUT).quantity or fig.quantity) is None:
        return f"{name}{fig.text(result, _OUT, missing='', grouping=False):>{_TOTAL_WIDTH}}"
    decimals = fig.look(_OUT).decimals
    fixed = _TOTAL_DECIMALS if decimals is None else decimals
    value = fig.value(result)
    u = fig.unit_in(_OUT)
    text = "" if value is None else f"{u.to_display(value * fig.to_si):.{fixed}f}"
    return f"{name}{text:>{_TOTAL_WIDTH}} {u.symbol}"


def format_result(title: str, r: dict) -> str:
    """Format the ``to_dict()`` of a train result as an aligned text table."""
    lines = [title or "(untitled project)", f"property model: {r['model']} — {r['eos_reference']}", ""]
    points = tables.train_points(r)
    cols = _columns(tables.POINTS, r, [(None, p) for _, _, p in points])
    lines.append(_line("point", [_header(f) for f in cols], cols))
    for key, i, p in points:
        cells = [f.text(p, _OUT, missing="", grouping=False) for f in cols]
        lines.append(_line(_point_name(key, i), cells, cols))
    lines.append("")
    rows = [row for row in tables.component_rows(r) if row[1] != "train"]
    cols = _columns(tables.COMPONENTS, r, [(kind, c) for _, kind, _, c in rows])
    lines.append(_line("component", [_header(f) for f in cols], cols))
    for _, kind, i, c in rows:
        cells = [f.text(c, _OUT, kind=kind, missing="", grouping=False) for f in cols]
        lines.append(_line(_component_name(kind, i, c), cells, cols))
    lines.append("")
    lines += [_total_line(f, r) for f in _columns(tables.TOTALS, r)]
    if r.get("package"):
        lines += [""] + package_lines(r["package"])
    for w in r["warnings"]:
        lines.append(f"warning: {w['message']} ({w['field']})")
    return "\n".join(lines)


def package_lines(pkg: dict) -> list[str]:
    """The package's figures at full and at the stated load, and its load profile's year
    (:mod:`stagewright.gui.presentation.package_table`, the ``"text"`` rows), as aligned lines."""
    rows = package_table.point_rows(pkg, _OUT)
    heads = [h.lower() for h, _ in package_table.point_columns(pkg)]
    label_w = max([len(r[0]) + len(r[1]) + 3 for r in rows] + [_TOTAL_NAME_WIDTH])
    width = max(len(h) for h in heads) + 2

    def name(row):
        return _lower_first(row[0]) + (f" [{row[1]}]" if row[1] else "")

    lines = [package_table.control_line(pkg), f"{'package':<{label_w}}" + "".join(f"{h:>{width}}" for h in heads)]
    lines += [f"{name(row):<{label_w}}" + "".join(f"{c:>{width}}" for c in row[2:]) for row in rows]
    annual = package_table.annual_rows(pkg, _OUT)
    if annual:
        lines.append("load profile (at the site as stated):")
        lines += [f"  {_lower_first(label):<{label_w - 2}}{value:>{width}}" for label, value in annual]
    return lines
