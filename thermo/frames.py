"""Results as rows of plain data, and as pandas DataFrames when pandas is installed.

Every result already gives plain data (``to_dict()``, ``StagingComparison.rows()``); the rows
here are flat — one dict per stage, per sweep point, per year bin, per staging option, SI with
the unit in each column name — so they go straight into ``csv.DictWriter``, a spreadsheet or
pandas. pandas is an optional extra (``pip install "stagewright[frames]"``): nothing in
Stagewright needs it, and :func:`to_frame` without it raises an ImportError naming the extra.

>>> from stagewright.core.frames import rows
>>> rows([{"a_W": 1.0}, {"a_W": 2.0}])
[{'a_W': 1.0}, {'a_W': 2.0}]
>>> rows(42)
Traceback (most recent call last):
...
TypeError: no rows for int: give a solve, sweep, year or staging-study result, or a list of dicts
"""
from __future__ import annotations

__all__ = ["rows", "stage_rows", "sweep_rows", "year_rows", "to_frame", "FRAMES_EXTRA"]

#: the optional extra that brings pandas
FRAMES_EXTRA = "frames"

_STAGE_COLUMNS = ("pressure_ratio", "shaft_power_W", "gas_power_W", "isentropic_efficiency",
                  "polytropic_efficiency", "entropy_generation_W_K", "exergy_destroyed_W")


def stage_rows(result) -> list[dict]:
    """One row per stage of a solve (a ``TrainResult`` or its ``to_dict()``): inlet and outlet
    state, pressure ratio, powers, efficiencies, and the cooler after it (None without one)."""
    d = result if isinstance(result, dict) else result.to_dict()
    out = []
    for i, st in enumerate(d["stages"], 1):
        row = {"stage": i,
               "inlet_temperature_K": st["inlet"]["temperature_K"], "inlet_pressure_Pa": st["inlet"]["pressure_Pa"],
               "outlet_temperature_K": st["outlet"]["temperature_K"], "outlet_pressure_Pa": st["outlet"]["pressure_Pa"]}
        row.update({k: st[k] for k in _STAGE_COLUMNS})
        cooler = st.get("cooler")
        row["cooler_duty_W"] = cooler["duty_W"] if cooler else None
        row["cooler_outlet_temperature_K"] = cooler["outlet"]["temperature_K"] if cooler else None
        row["condensate_kg_s"] = cooler.get("condensate_kg_s") if cooler else None
        out.append(row)
    return out


def sweep_rows(result) -> list[dict]:
    """One row per grid point of a sweep (a ``SweepResult`` or its ``to_dict()``): the axis
    values under their field paths, the outputs, and ``error`` (None where the point solved)."""
    d = result if isinstance(result, dict) else result.to_dict()
    paths, errors = list(d["axes"]), d.get("errors", {})
    out = []
    for i, point in enumerate(d["points"]):
        row = dict(zip(paths, point))
        row.update({key: values[i] for key, values in d["values"].items()})
        row["error"] = errors.get(str(i), errors.get(i))
        out.append(row)
    return out


def year_rows(result) -> list[dict]:
    """One row per bin of a year (a ``YearResult`` or its ``to_dict()``). A per-stage list
    becomes one column per stage (``cooler_duties_W[0]`` …); a list of texts, one text."""
    d = result if isinstance(result, dict) else result.to_dict()
    out = []
    for b in d["bins"]:
        row = {}
        for key, value in b.items():
            if isinstance(value, list) and all(v is None or isinstance(v, (int, float)) for v in value):
                row.update({f"{key}[{i}]": v for i, v in enumerate(value)})
            elif isinstance(value, list):
                row[key] = "; ".join(str(v.get("message", v) if isinstance(v, dict) else v) for v in value)
            else:
                row[key] = value
        out.append(row)
    return out


def rows(result) -> list[dict]:
    """Flat rows of any result: a solve (per stage), a sweep (per point), a year (per bin), a
    staging study (per option, its ``rows()``) — or a list of dicts, returned as it is."""
    if isinstance(result, list) and all(isinstance(r, dict) for r in result):
        return result
    if hasattr(result, "rows"):
        return result.rows()
    d = result.to_dict() if hasattr(result, "to_dict") else result
    if isinstance(d, dict) and "stages" in d:
        return stage_rows(d)
    if isinstance(d, dict) and "points" in d:
        return sweep_rows(d)
    if isinstance(d, dict) and "bins" in d:
        return year_rows(d)
    raise TypeError(f"no rows for {type(result).__name__}: give a solve, sweep, year or "
                    "staging-study result, or a list of dicts")


def to_frame(result):
    """A pandas DataFrame of :func:`rows` (``result``: any result, or a list of dicts).

    Raises
    ------
    ImportError
        When pandas is not installed; the message names the extra that brings it.
    """
    try:
        import pandas
    except ImportError:
        raise ImportError(f'a DataFrame needs pandas, an optional extra: pip install "stagewright[{FRAMES_EXTRA}]" '
                          "(without it, stagewright.core.frames.rows gives the same rows as plain dicts)") from None
    return pandas.DataFrame(rows(result))
