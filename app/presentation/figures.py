"""One row of a presentation table: a figure of a result, and how every output shows it.

A :class:`Figure` names where a value sits in the plain-data result (``TrainResult.to_dict()``,
a staging-study row, a year dict), its label, its display quantity (a key of
:data:`stagewright.gui.presentation.units.QUANTITIES`, so SI/US conversion and the unit symbol come from
there) and its decimals. The tables of each result kind (:mod:`stagewright.gui.presentation.balance_tables`,
:mod:`~stagewright.gui.presentation.staging_table`, :mod:`~stagewright.gui.presentation.year_tables`) are tuples of
figures; the window, the command line's text tables, the PDF report and the CSV read them.

The outputs are named by :data:`OUTPUTS`. A figure appears in the outputs of its ``where`` (all
of them unless told otherwise), in the order of its table; where one output shows it differently
(another label, decimals, unit or column width) a :class:`Look` says how. No Qt.
"""
from __future__ import annotations

__all__ = ["OUTPUTS", "Look", "Figure", "read_path", "has_path", "shown", "condition_holds", "snake_case"]

import re
from collections.abc import Iterable, Mapping
from dataclasses import dataclass, field
from types import MappingProxyType

from stagewright.gui.presentation import units

#: the outputs that read the tables: the window, the command line's plain-text tables,
#: the PDF report and the CSV file
OUTPUTS = frozenset({"window", "text", "pdf", "csv"})
_STYLES = ("fixed", "scientific", "text", "yes_no")
_CONDITIONS = ("", "moist", "exchanger", "any")


@dataclass(frozen=True)
class Look:
    """How one output shows a figure where it departs from the figure's own (None: the figure's).

    Attributes
    ----------
    label : str, optional
        Label (column header, row name or CSV column name) in that output.
    quantity : str, optional
        Another display quantity, e.g. ``"ratio"`` to print an efficiency as 0.8123 rather than in %.
    unit : str, optional
        Symbol of another display unit of the quantity (:func:`stagewright.gui.presentation.units.unit_named`),
        e.g. ``"kPa"`` for a pressure in a table that always prints SI.
    symbol : str, optional
        Unit text printed instead of the unit's symbol (no other conversion).
    decimals : int, optional
        Decimals in that output.
    width : int, optional
        Column width in characters (plain-text tables).
    missing : str, optional
        Text for a missing value instead of the output's usual one.
    when : str, optional
        The condition under which that output shows the figure (see :attr:`Figure.when`).
    """

    label: str | None = None
    quantity: str | None = None
    unit: str | None = None
    symbol: str | None = None
    decimals: int | None = None
    width: int | None = None
    missing: str | None = None
    when: str | None = None


_PLAIN = Look()


@dataclass(frozen=True)
class Figure:
    """One figure of a result kind: where it is, what it is called, how it is shown.

    Attributes
    ----------
    key : str or Mapping[str, str]
        Path into the plain-data result: ``"shaft_power_W"``, ``"outlet.temperature_K"``; ``a+b``
        is the sum of two paths and ``stages[*].cooler.condensate_kg_s`` the sum over a list
        (:func:`read_path`). A mapping gives one path per row kind of a table whose rows are of
        several kinds (``{"stage": "shaft_power_W", "train": "shaft_power_W"}``); a row kind it
        does not name has no value in that column.
    label : str
        Label in the window and the PDF (and, unless a :class:`Look` says otherwise, elsewhere).
    quantity : str, optional
        Display quantity (a key of :data:`stagewright.gui.presentation.units.QUANTITIES`); None for a plain number.
    id : str
        Short name the window and its tests use for the column or row (default: ``key`` when it
        is a string, else the label in snake case).
    decimals : int, optional
        Decimals shown (default: those of the display unit; 2 for a plain number).
    style : str
        ``"fixed"`` (a number), ``"scientific"`` (``1.23e-12``), ``"text"`` (shown as it is) or
        ``"yes_no"``.
    joiner : str
        Non-empty when the value is a list of numbers, shown joined by it (``" × "``).
    to_si : float
        Factor turning the stored value into SI (a year keeps energies in kWh: 3.6e6).
    gauge : bool
        A pressure shown relative to the site barometric pressure.
    align : str
        ``"left"`` or ``"right"`` in tables (default: left for text and lists, right for numbers).
    when : str
        Shown only when this holds (:func:`condition_holds`): ``"moist"`` intake air, an
        ``"exchanger"`` sized in some cooler, ``"any"`` row having the value (for totals: the
        result having it). The window hides
        the column or row, the PDF and the text tables leave it out; the CSV always has it. A
        :class:`Look` may set another condition for one output.
    where : frozenset of str
        Outputs that show the figure (default: all of :data:`OUTPUTS`).
    note : str
        What the figure is: the window's tooltip, the text table's remark.
    negative_note : str
        Why a negative value is not an error (the window's tooltip on such a value).
    bin_key : str
        For an extreme of a year: path to the name of the bin it belongs to.
    looks : Mapping[str, Look]
        Per output, how it departs from the above.
    """

    key: str | Mapping[str, str]
    label: str
    quantity: str | None = None
    id: str = ""
    decimals: int | None = None
    style: str = "fixed"
    joiner: str = ""
    to_si: float = 1.0
    gauge: bool = False
    align: str = ""
    when: str = ""
    where: frozenset = OUTPUTS
    note: str = ""
    negative_note: str = ""
    bin_key: str = ""
    looks: Mapping[str, Look] = field(default_factory=dict)

    def __post_init__(self) -> None:
        object.__setattr__(self, "where", frozenset(self.where))
        object.__setattr__(self, "looks", MappingProxyType(dict(self.looks)))
        if not self.id:
            object.__setattr__(self, "id", self.key if isinstance(self.key, str) else snake_case(self.label))
        problems = [f"unknown output {o!r}" for o in (self.where | set(self.looks)) - OUTPUTS]
        if self.style not in _STYLES:
            problems.append(f"style {self.style!r} is not one of {_STYLES}")
        for look in [_PLAIN, *self.looks.values()]:
            if (self.when if look.when is None else look.when) not in _CONDITIONS:
                problems.append(f"condition {look.when or self.when!r} is not one of {_CONDITIONS}")
            q = look.quantity or self.quantity
            if q is not None and q not in units.QUANTITIES:
                problems.append(f"unknown quantity {q!r}")
            elif look.unit is not None and q is None:
                problems.append(f"unit {look.unit!r} given for a plain number")
            elif look.unit is not None:
                units.unit_named(q, look.unit)  # KeyError names a unit the quantity does not have
        if problems:
            raise ValueError(f"figure {self.id!r}: " + "; ".join(problems))

    # ---- where and how ------------------------------------------------------------------
    def shown_in(self, output: str) -> bool:
        """True when ``output`` shows this figure."""
        return output in self.where

    def look(self, output: str) -> Look:
        """How ``output`` departs from the figure's defaults (all None when it does not)."""
        return self.looks.get(output, _PLAIN)

    def label_in(self, output: str) -> str:
        """Label in ``output``: its :class:`Look`'s, else the CSV's snake case or the figure's label."""
        look = self.look(output).label
        if look is not None:
            return look
        return snake_case(self.label) if output == "csv" else self.label

    def when_in(self, output: str) -> str:
        """The condition under which ``output`` shows the figure (``""``: always)."""
        when = self.look(output).when
        return self.when if when is None else when

    def is_left_aligned(self) -> bool:
        """Whether tables align the figure's cells left (text and lists) rather than right."""
        return self.align == "left" if self.align else (self.style in ("text", "yes_no") or bool(self.joiner))

    def unit_in(self, output: str, system: str = "SI", *, gauge: bool = False,
                barometric_Pa: float = 101_325.0) -> units.Unit:
        """Display unit in ``output``: symbol, conversion and decimals resolved.

        ``gauge`` (the window's preference) shows a pressure relative to ``barometric_Pa``, as
        does the figure's own ``gauge``. A plain number gets a unit with no symbol and factor 1.
        """
        look = self.look(output)
        q = look.quantity or self.quantity
        if q is None:
            u = units.Unit("", 1.0, 0.0, 2)
        elif look.unit is not None:
            u = units.unit_named(q, look.unit)
        else:
            u = units.unit(q, system, gauge=self.gauge or gauge, barometric_Pa=barometric_Pa)
        decimals = next(d for d in (look.decimals, self.decimals, u.decimals) if d is not None)
        return units.Unit(u.symbol if look.symbol is None else look.symbol, u.scale, u.offset, decimals)

    def symbol_in(self, output: str, system: str = "SI", **pressure) -> str:
        """Unit symbol in ``output`` (``""`` for plain numbers, text and yes/no)."""
        if self.style in ("text", "yes_no"):
            return ""
        return self.unit_in(output, system, **pressure).symbol

    # ---- values ---------------------------------------------------------------------------
    def path_for(self, kind: str | None = None) -> str | None:
        """The path of the value in a row of ``kind`` (None: no value in such rows)."""
        if isinstance(self.key, str):
            return self.key
        return self.key.get(kind)

    def value(self, container: dict, kind: str | None = None):
        """The stored value (None when missing), read from ``container`` (a row of ``kind``)."""
        path = self.path_for(kind)
        return None if path is None else read_path(container, path)

    def text(self, container: dict, output: str, system: str = "SI", *, kind: str | None = None,
             missing: str = "—", with_unit: bool = False, grouping: bool = True, **pressure) -> str:
        """Display text of the figure's value in ``container`` as ``output`` shows it.

        Parameters
        ----------
        container : dict
            The plain-data row the figure's path starts from.
        output : str
            One of :data:`OUTPUTS`.
        system : str
            ``"SI"`` or ``"US"``.
        kind : str, optional
            Row kind, for a figure with one path per row kind.
        missing : str
            Text of a missing value (the output's; a :class:`Look` may override it).
        with_unit : bool
            Append the unit symbol.
        grouping : bool
            Group thousands with a space (``12 345.6``); plain numbers and lists never are.
        **pressure
            ``gauge`` and ``barometric_Pa`` for pressures.
        """
        return self.format(self.value(container, kind), output, system, missing=missing, with_unit=with_unit,
                           grouping=grouping, **pressure)

    def format(self, value, output: str, system: str = "SI", *, missing: str = "—", with_unit: bool = False,
               grouping: bool = True, **pressure) -> str:
        """Display text of a stored ``value`` (see :meth:`text`)."""
        look = self.look(output)
        if value is None or (self.joiner and not value):
            return missing if look.missing is None else look.missing
        if self.style == "text":
            return str(value)
        if self.style == "yes_no":
            return "yes" if value else "no"
        u = self.unit_in(output, system, **pressure)
        if self.style == "scientific":
            return f"{value:.{u.decimals}e}"
        if self.joiner:
            return self.joiner.join("–" if v is None else f"{u.to_display(v * self.to_si):.{u.decimals}f}"
                                    for v in value)
        shown = u.to_display(value * self.to_si)
        plain = (look.quantity or self.quantity) is None or not grouping
        text = f"{shown:.{u.decimals}f}" if plain else f"{shown:,.{u.decimals}f}".replace(",", " ")
        return f"{text} {u.symbol}".rstrip() if with_unit else text


def shown(table: Iterable[Figure], output: str) -> list[Figure]:
    """The figures of ``table`` that ``output`` shows, in table order."""
    return [f for f in table if f.shown_in(output)]


def condition_holds(figure: Figure, output: str, result: dict | None = None, rows: Iterable[tuple] = ()) -> bool:
    """Whether the condition under which ``output`` shows ``figure`` holds (:meth:`Figure.when_in`).

    Parameters
    ----------
    figure : Figure
        The figure.
    output : str
        One of :data:`OUTPUTS`.
    result : dict, optional
        A train's ``to_dict()``, for ``"moist"`` (the intake carries water) and ``"exchanger"``
        (some cooler's exchanger was sized).
    rows : iterable of (kind, dict)
        The table's rows with their kinds (None for tables of one kind), for ``"any"``; without
        rows, ``"any"`` asks whether ``result`` itself has the value (a table of totals).
    """
    when = figure.when_in(output)
    if when == "":
        return True
    if when == "moist":
        return bool(result.get("intake_humidity_ratio") or result["intake"].get("humidity_ratio"))
    if when == "exchanger":
        return any((st["cooler"] or {}).get("ua_W_K") for st in result["stages"])
    rows = list(rows)
    if not rows and result is not None:
        rows = [(None, result)]
    return any(figure.value(row, kind) is not None for kind, row in rows)


def snake_case(label: str) -> str:
    """``"Free air delivery"`` → ``"free_air_delivery"`` (a CSV column name)."""
    return re.sub(r"\W+", "_", label.lower()).strip("_")


# ---- paths ------------------------------------------------------------------------------------

def read_path(container: dict, path: str):
    """Value at ``path`` in ``container``; None when it, or a dict on the way, is missing or None.

    ``a.b`` goes into nested dicts; ``a+b`` adds two paths (None if either is missing);
    ``items[*].x`` adds ``x`` over the list ``items`` (None when no item has it).

    Examples
    --------
    >>> read_path({"st": {"q": 1.0, "w": 2.0}}, "st.q+st.w")
    3.0
    >>> read_path({"stages": [{"c": {"m": 1.5}}, {"c": None}, {"c": {"m": 0.5}}]}, "stages[*].c.m")
    2.0
    """
    total = None
    for term in path.split("+"):
        value = _read_term(container, term.strip().split("."), strict=False)
        if value is None:
            return None
        total = value if total is None else total + value
    return total


def has_path(container: dict, path: str) -> bool:
    """True when every key ``path`` names is present (a None value on the way ends the walk)."""
    try:
        for term in path.split("+"):
            _read_term(container, term.strip().split("."), strict=True)
    except (KeyError, TypeError):
        return False
    return True


def _read_term(node, parts: list[str], strict: bool):
    for i, part in enumerate(parts):
        if node is None:
            return None
        if part.endswith("[*]"):
            items = node[part[:-3]] if strict else (node.get(part[:-3]) or [])
            values = [_read_term(item, parts[i + 1:], strict) for item in items]
            values = [v for v in values if v is not None]
            return sum(values, 0.0) if values else None
        if strict and part not in node:
            raise KeyError(part)
        node = node.get(part) if isinstance(node, dict) else None
    return node
