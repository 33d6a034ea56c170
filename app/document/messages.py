"""Messages for people: the core's errors and warnings in the display units, with field labels.

The calculation core gives every message in SI (for the command line and JSON) and, where it
can, the same sentence as a template with named values, each SI and tagged with its quantity
(:func:`stagewright.core.errors.message_detail`). This module renders those in the display system
chosen in the window or report, with the field names of :mod:`stagewright.gui.document.field_specs`;
the field path itself is kept only for jumping to the field. Qt-free: the Messages panel, the
status line, the staging study and the reports all read it.
"""
from __future__ import annotations

__all__ = ["format_quantity", "render", "place", "problem_text", "warning_text", "error_text", "limit_short",
           "limit_sentence"]

import math
import re
import string

from stagewright.gui.document.field_specs import describe, problem_message
from stagewright.gui.presentation import units

_STAGE_PLACE = re.compile(r"^stages\[(\d+)\](?![.\[])\s*(.*)$")
_FIELD_PREFIX = re.compile(r"^([a-z_]+(?:\[\d+\])?(?:\.[a-z_A-Z0-9]+(?:\[\d+\])?)*):\s+")


def format_quantity(si, quantity: str | None, system: str = "SI", *, gauge: bool = False,
                    barometric_Pa: float = 101_325.0) -> str:
    """A value with its display unit, to four significant figures (``"346 °C"``, ``"12.7 kg/h"``);
    a value with at most two decimals in the display unit (one the user typed) as it is.

    ``quantity`` None shows a plain number or word as it is; ``"absolute_pressure"`` is a
    pressure always shown absolute (a range bound, never relative to the site).
    """
    if quantity is None or not isinstance(si, (int, float)) or isinstance(si, bool):
        return _number(si) if isinstance(si, float) else str(si)
    kw = {}
    if quantity == "absolute_pressure":
        quantity = "pressure"
        kw = {"barometric_Pa": barometric_Pa}
    elif quantity == "pressure":
        kw = {"gauge": gauge, "barometric_Pa": barometric_Pa}
    u = units.unit(quantity, system, **kw)
    text = _number(u.to_display(float(si)))
    return f"{text} {u.symbol}".rstrip()


def _number(x: float) -> str:
    if not math.isfinite(x):
        return str(x)
    if abs(x) >= 1e4:
        return f"{x:,.0f}".replace(",", " ")
    if 0.01 <= abs(x) < 1e4 and abs(x - round(x, 2)) < 1e-9 * max(1.0, abs(x)):
        return f"{round(x, 2):.2f}".rstrip("0").rstrip(".")  # a value as typed (126.85 °C)
    text = f"{x:.4g}"
    return text if "e" not in text else f"{x:.3e}"


def _name(field: str, doc: dict | None) -> str:
    """The name of a field path, or of a place the core names in words (``stages[0] discharge``)."""
    m = _STAGE_PLACE.match(field)
    if m:
        return place(field, doc)
    try:
        return describe(field, doc or {})
    except ValueError:  # not a field path
        return place(field, doc)


def place(where: str, doc: dict | None = None) -> str:
    """A place named by the core (``stages[0] discharge``, ``stages[1].efficiency.value_K``)
    in words (``Stage 1 discharge``, ``Stage 2 measured discharge temperature``)."""
    m = _STAGE_PLACE.match(where)
    if m:
        rest = m.group(2).strip()
        return f"Stage {int(m.group(1)) + 1}" + (f" {rest}" if rest else "")
    if re.match(r"^[a-z_]+(\[\d+\])?(\.[A-Za-z_0-9]+(\[\d+\])?)+$", where) or where in (
            "discharge_pressure_Pa", "inlet_pressure_drop_Pa"):
        try:
            return describe(where, doc or {})
        except ValueError:
            pass
    return where[:1].upper() + where[1:]


def render(detail: dict, field: str = "", doc: dict | None = None, system: str = "SI", *,
           gauge: bool = False, barometric_Pa: float = 101_325.0) -> str:
    """The sentence of a :func:`stagewright.core.errors.message_detail` in display units.

    ``{label}`` becomes the name of ``field``; a value named ``where`` is a place
    (:func:`place`); every other value is shown with :func:`format_quantity`. Values may be
    given as a dict (name → value) or as the list of a result's ``warnings[].values``.
    """
    values = detail.get("values") or {}
    if isinstance(values, list):
        values = {v["name"]: v for v in values}
    shown = {"label": _name(field, doc) if field else ""}
    for name, v in values.items():
        if name == "where":
            shown[name] = place(str(v.get("value", "")), doc)
        else:
            shown[name] = format_quantity(v.get("value"), v.get("quantity"), system, gauge=gauge,
                                          barometric_Pa=barometric_Pa)
    text = string.Formatter().vformat(detail.get("template", ""), (), _Missing(shown))
    text = text.strip()
    text = text[:1].upper() + text[1:]
    return text if text.endswith((".", "?", "!")) else text + "."


class _Missing(dict):
    def __missing__(self, key):  # an unknown placeholder stays visible rather than failing
        return "{" + key + "}"


def problem_text(problem, doc: dict | None = None, system: str = "SI", *, gauge: bool = False,
                 barometric_Pa: float = 101_325.0) -> str:
    """An input problem (:class:`stagewright.core.errors.Problem`) for people: its template where it has
    one (a rule between fields), else the schema range in display units
    (:func:`stagewright.gui.document.field_specs.problem_message`)."""
    detail = getattr(problem, "detail", None)
    if detail:
        return render(detail, problem.field, doc, system, gauge=gauge, barometric_Pa=barometric_Pa)
    return problem_message(problem, doc or {}, system, barometric_Pa, gauge)


def warning_text(w: dict, doc: dict | None = None, system: str = "SI", *, gauge: bool = False,
                 barometric_Pa: float = 101_325.0) -> str:
    """A result warning (``TrainResult.to_dict()["warnings"][i]``) for people."""
    if w.get("template"):
        return render(w, w.get("field", ""), doc, system, gauge=gauge, barometric_Pa=barometric_Pa)
    return error_text(w.get("message", ""), w.get("field", ""), None, doc, system, gauge=gauge,
                      barometric_Pa=barometric_Pa)


def error_text(message: str, field: str = "", detail: dict | None = None, doc: dict | None = None,
               system: str = "SI", *, gauge: bool = False, barometric_Pa: float = 101_325.0) -> str:
    """An error of the core for people: its template in display units where it has one, else
    its SI message with the leading field path replaced by the field's name."""
    if detail and detail.get("template"):
        return render(detail, field, doc, system, gauge=gauge, barometric_Pa=barometric_Pa)
    m = _FIELD_PREFIX.match(message)
    if m:
        message = f"{place(m.group(1), doc)}: {message[m.end():]}"
    message = message.strip()
    return message[:1].upper() + message[1:]


def _stage_of(field: str) -> int | None:
    m = re.match(r"^stages\[(\d+)\]", field or "")
    return int(m.group(1)) if m else None


def limit_short(b: dict, doc: dict | None = None, system: str = "SI") -> str:
    """A staging study's binding limit in a few words for a table cell: which limit, the value
    and the limit (``"Stage 1 discharge 346 °C > 200 °C limit"``)."""
    field = b.get("field", "") or ""
    i = _stage_of(field)
    lim, val = b.get("limit"), b.get("value")
    violated = b.get("status") == "violated"
    t = lambda x: format_quantity(x, "temperature", system)  # noqa: E731
    if field.endswith("max_discharge_temperature_K") and isinstance(lim, (int, float)) and i is not None:
        if violated and isinstance(val, (int, float)):
            return f"Stage {i + 1} discharge {t(val)} > {t(lim)} limit"
        return f"Stage {i + 1} held at its {t(lim)} limit"
    if b.get("detail") and violated:
        return "Not solved: " + limit_sentence(b, doc, system)
    name = _name(field, doc) if field else "Limits"
    return f"{name}: {'not met' if violated else 'active'}"


def limit_sentence(b: dict, doc: dict | None = None, system: str = "SI", *, gauge: bool = False,
                   barometric_Pa: float = 101_325.0) -> str:
    """The full sentence of a staging study's binding limit in display units: a discharge
    temperature limit with its value, a failed solve from its ``detail``, else its own message."""
    field, lim, val = b.get("field", "") or "", b.get("limit"), b.get("value")
    i = _stage_of(field)
    if field.endswith("max_discharge_temperature_K") and i is not None and isinstance(lim, (int, float)):
        t = lambda x: format_quantity(x, "temperature", system)  # noqa: E731
        if b.get("status") == "violated" and isinstance(val, (int, float)):
            return f"Stage {i + 1} discharge {t(val)} is above its {t(lim)} limit; add a stage."
        return f"Stage {i + 1} discharge held at its {t(lim)} limit."
    detail = b.get("detail")
    if detail:
        return render(detail, b.get("field", ""), doc, system, gauge=gauge, barometric_Pa=barometric_Pa)
    return error_text(b.get("message", ""), b.get("field", ""), None, doc, system, gauge=gauge,
                      barometric_Pa=barometric_Pa)
