"""The open project as a Qt-free model with change signals.

Views read the document through :class:`ProjectModel` and change it only through its
methods (normally from undo commands), so every change is announced once with the path
that changed. The document stays plain JSON data in SI units — exactly what
:func:`thermo.project.save` writes and :func:`thermo.solve` reads.
"""
from __future__ import annotations

__all__ = ["Signal", "ProjectModel", "new_document"]

import copy
from typing import Any, Callable

from thermo.project.validation import problems as doc_problems
from thermo.project.schema import FORMAT_NAME, FORMAT_VERSION, PROJECT
from thermo.project.schema_types import check

from app.document.paths import ABSENT, format_path, get_in, parse_path, set_in


class Signal:
    """A minimal observer list: ``connect(fn)``, ``disconnect(fn)``, ``emit(*args)``."""

    def __init__(self) -> None:
        self._slots: list[Callable] = []

    def connect(self, fn: Callable) -> None:
        if fn not in self._slots:
            self._slots.append(fn)

    def disconnect(self, fn: Callable) -> None:
        if fn in self._slots:
            self._slots.remove(fn)

    def emit(self, *args) -> None:
        for fn in list(self._slots):
            fn(*args)


#: stage discharge temperature limit of the new-project template, [K]: 200 °C, a usual
#: ceiling for dry (oil-free) compression stages (common practice, no source)
TEMPLATE_DISCHARGE_LIMIT_K = 473.15


def new_document() -> dict:
    """A small valid project to start from (invented values): two stages to 8 bar(a), each
    with a water-cooled cooler stated by its approach to 25 °C cooling water (so the project
    solves at any site ambient), and a 200 °C discharge limit on each stage (so a single hot
    stage is reported, not passed in silence)."""
    def stage(name: str) -> dict:
        return {"name": name, "efficiency": {"kind": "isentropic", "value": 0.8},
                "max_discharge_temperature_K": TEMPLATE_DISCHARGE_LIMIT_K,
                "cooler": {"approach_K": 10.0, "coolant_inlet_temperature_K": 298.15,
                           "coolant": {"kind": "water", "temperature_rise_K": 10.0},
                           "pressure_drop_Pa": 10_000.0}}
    return {
        "format": FORMAT_NAME,
        "version": FORMAT_VERSION,
        "title": "New compression train",
        "site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 101_325.0,
                 "relative_humidity": 0.0},
        "fluid": {"model": "real_gas"},
        "flow": {"kind": "free_air_delivery", "value": 0.1},
        "discharge_gauge_pressure_Pa": 700_000.0,  # 7 bar(g): held when the site changes
        "driver": {"efficiency": 0.95},
        "stages": [stage("Stage 1"), stage("Stage 2")],
    }


class ProjectModel:
    """One project document and the signals that announce its changes.

    Signals
    -------
    changed(path)
        A value at ``path`` changed (``""``: the whole document was replaced).
    structure_changed(kind, index, new_index)
        The stage list changed: ``"insert"``, ``"remove"`` or ``"move"``.
    """

    def __init__(self, doc: dict | None = None) -> None:
        self.changed = Signal()
        self.structure_changed = Signal()
        self._doc: dict = copy.deepcopy(doc) if doc is not None else new_document()

    # ---- reading -------------------------------------------------------------------------
    @property
    def doc(self) -> dict:
        """The document itself (read it; change it only through this model's methods)."""
        return self._doc

    def snapshot(self) -> dict:
        """A deep copy, safe to hand to a worker thread or to save."""
        return copy.deepcopy(self._doc)

    def get(self, path: str, default: Any = ABSENT) -> Any:
        return get_in(self._doc, path, default)

    def normalised(self) -> dict:
        """The document with schema defaults filled in, even when it has problems (for display)."""
        return check(PROJECT, self._doc, "", []) if isinstance(self._doc, dict) else {}

    def problems(self) -> list:
        """Every :class:`thermo.errors.Problem` of the document (ranges come from the schema)."""
        return doc_problems(self._doc)

    @property
    def stage_count(self) -> int:
        stages = self._doc.get("stages")
        return len(stages) if isinstance(stages, list) else 0

    # ---- changing ------------------------------------------------------------------------
    def set(self, path: str, value: Any) -> Any:
        """Set one value (``ABSENT`` removes the key); return the previous value."""
        old = set_in(self._doc, path, copy.deepcopy(value))
        self.changed.emit(path)
        return old

    def set_many(self, pairs: list[tuple[str, Any]]) -> list[Any]:
        """Set several values as one change; return the previous values in order."""
        olds = [set_in(self._doc, p, copy.deepcopy(v)) for p, v in pairs]
        self.changed.emit(_common_prefix([p for p, _ in pairs]))
        return olds

    def insert_stage(self, index: int, stage: dict) -> None:
        self._doc["stages"].insert(index, copy.deepcopy(stage))
        self.structure_changed.emit("insert", index, index)
        self.changed.emit("stages")

    def remove_stage(self, index: int) -> dict:
        stage = self._doc["stages"].pop(index)
        self.structure_changed.emit("remove", index, min(index, len(self._doc["stages"]) - 1))
        self.changed.emit("stages")
        return stage

    def move_stage(self, index: int, new_index: int) -> None:
        stages = self._doc["stages"]
        stages.insert(new_index, stages.pop(index))
        self.structure_changed.emit("move", index, new_index)
        self.changed.emit("stages")

    def replace(self, doc: dict) -> None:
        """Swap in another document (open, new, revert)."""
        self._doc = copy.deepcopy(doc)
        self.structure_changed.emit("reset", 0, 0)
        self.changed.emit("")


def _common_prefix(paths: list[str]) -> str:
    if not paths:
        return ""
    token_lists = [parse_path(p) for p in paths]
    out = []
    for group in zip(*token_lists):
        if all(t == group[0] for t in group):
            out.append(group[0])
        else:
            break
    return format_path(out)
