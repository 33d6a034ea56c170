"""Qt-free edits of a project's ``package`` section, as the window's package panel makes them.

Each function returns new values (SI, the document's keys); the panel writes them through the
editor as one undo step. Defaults the panel offers:

* a new section: load/unload on a receiver of about 20 L per (L/s) of free air delivery
  (:data:`RECEIVER_L_PER_L_S`; common practice, no source), the schema's other defaults;
* a change of control kind keeps the receiver, band, unloaded power and blowdown where both
  kinds have a receiver, and starts a measured curve from placeholder points the user replaces.
"""
from __future__ import annotations

__all__ = ["RECEIVER_L_PER_L_S", "CONTROL_CHOICES", "STORAGE_KEYS", "CONTROL_KEYS", "receiver_volume_for",
           "new_package", "control_for_kind", "parse_loads", "loads_text", "PLACEHOLDER_CURVE",
           "with_row", "without_row", "ROW_DEFAULTS"]

import copy

#: receiver volume per free air delivery offered for a new package: 20 L per (L/s) (about 2.5 US gal
#: per cfm), enough for load/unload control to cycle a few times a minute at most with a 0.5 bar band
#: (common practice, no source)
RECEIVER_L_PER_L_S = 20.0
#: control kind → words for the drop-down (stagewright.core.part_load.controls.CONTROL_LABELS, capitalised)
CONTROL_CHOICES = [("load_unload", "Load/unload"), ("modulation", "Inlet modulation"),
                   ("variable_speed", "Variable speed"), ("start_stop", "Start/stop"),
                   ("measured_curve", "Measured curve")]
STORAGE_KEYS = ("receiver_volume_m3", "pressure_band_Pa", "unloaded_power_fraction", "blowdown_time_s")
#: control kind → its parameter keys (stagewright.core.project.schema.CONTROL), in the order the panel shows them
CONTROL_KEYS = {
    "load_unload": STORAGE_KEYS,
    "modulation": ("zero_flow_power_fraction",),
    "variable_speed": STORAGE_KEYS + ("min_speed_fraction", "specific_power_rise_at_min_speed", "drive_efficiency",
                                      "drive_fixed_loss_share"),
    "start_stop": STORAGE_KEYS + ("max_starts_per_hour",),
    "measured_curve": ("points",),
}
#: a measured curve's starting points: invented placeholders (flow fraction, power fraction) to replace
PLACEHOLDER_CURVE = [{"flow_fraction": 0.0, "power_fraction": 0.3}, {"flow_fraction": 0.5, "power_fraction": 0.65},
                     {"flow_fraction": 1.0, "power_fraction": 1.0}]
#: list key → a new row's values (a new row copies the last one where there is one)
ROW_DEFAULTS = {"load_profile": {"load": 0.5, "hours": 1000.0},
                "other_loads": {"name": "other load", "power_W": 500.0},
                "points": {"flow_fraction": 0.5, "power_fraction": 0.65},
                "efficiency_points": {"load_fraction": 0.5, "efficiency": 0.9}}


def receiver_volume_for(fad_m3_s: float | None) -> float:
    """Receiver volume [m³] of :data:`RECEIVER_L_PER_L_S` at a free air delivery (1 m³ without one).

    Examples
    --------
    >>> round(receiver_volume_for(0.3), 6)  # 300 L/s → 6000 L
    6.0
    """
    if not fad_m3_s or fad_m3_s <= 0.0:
        return 1.0
    return round(RECEIVER_L_PER_L_S * fad_m3_s, 3) or 0.001


def new_package(fad_m3_s: float | None) -> dict:
    """The section "Add capacity control…" writes: load/unload on a receiver sized from the FAD.

    Examples
    --------
    >>> new_package(0.3)["control"]
    {'kind': 'load_unload', 'receiver_volume_m3': 6.0}
    """
    return {"control": {"kind": "load_unload", "receiver_volume_m3": receiver_volume_for(fad_m3_s)}}


def control_for_kind(old: dict | None, kind: str, fad_m3_s: float | None = None) -> dict:
    """A ``control`` of ``kind`` carrying over what the old control shares with it.

    Examples
    --------
    >>> control_for_kind({"kind": "load_unload", "receiver_volume_m3": 2.0, "pressure_band_Pa": 8e4}, "start_stop")
    {'kind': 'start_stop', 'receiver_volume_m3': 2.0, 'pressure_band_Pa': 80000.0}
    >>> control_for_kind({"kind": "load_unload", "receiver_volume_m3": 2.0}, "modulation")
    {'kind': 'modulation'}
    """
    old = old or {}
    new = {"kind": kind}
    for key in CONTROL_KEYS[kind]:
        if key in old and key in STORAGE_KEYS:
            new[key] = old[key]
    if "receiver_volume_m3" in CONTROL_KEYS[kind] and "receiver_volume_m3" not in new:
        new["receiver_volume_m3"] = receiver_volume_for(fad_m3_s)
    if kind == "measured_curve":
        new["points"] = copy.deepcopy(PLACEHOLDER_CURVE)
    return new


def parse_loads(text: str) -> list[float]:
    """Data-sheet loads typed as per cent (``"100, 75, 50"``) → fractions.

    Raises
    ------
    ValueError
        With a sentence naming the entry that is not a load between 0 and 100 %.

    Examples
    --------
    >>> parse_loads("100, 75 %; 50")
    [1.0, 0.75, 0.5]
    """
    parts = [p.strip().rstrip("%").strip() for p in text.replace(";", ",").split(",")]
    parts = [p for p in parts if p]
    if not parts:
        raise ValueError("give at least one load in per cent, e.g. 100, 75, 50")
    out = []
    for p in parts:
        try:
            x = float(p)
        except ValueError:
            raise ValueError(f"'{p}' is not a load in per cent (e.g. 100, 75, 50)") from None
        if not 0.0 < x <= 100.0:
            raise ValueError(f"a data-sheet load must be above 0 % and at most 100 %, not {p} %")
        out.append(round(x / 100.0, 10))
    if len(out) > 10:
        raise ValueError(f"at most 10 data-sheet loads, not {len(out)}")
    return out


def loads_text(loads: list[float]) -> str:
    """``[1.0, 0.75]`` → ``"100, 75"`` (per cent, as typed).

    Examples
    --------
    >>> loads_text([1.0, 0.75, 0.333])
    '100, 75, 33.3'
    """
    return ", ".join(f"{100.0 * x:.4f}".rstrip("0").rstrip(".") for x in loads)


def with_row(rows: list | None, key: str) -> list:
    """``rows`` with a new row at the end (a copy of the last one, else :data:`ROW_DEFAULTS`)."""
    rows = copy.deepcopy(rows or [])
    rows.append(copy.deepcopy(rows[-1]) if rows else dict(ROW_DEFAULTS[key]))
    return rows


def without_row(rows: list | None, index: int) -> list:
    """``rows`` without row ``index``."""
    rows = copy.deepcopy(rows or [])
    del rows[index]
    return rows
