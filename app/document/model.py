"""The open project as a Qt-free model with change signals.

Views read the document through :class:`ProjectModel` and change it only through its
methods (normally from undo commands), so every change is announced once with the path
that changed. The document stays plain JSON data in SI units — exactly what
:func:`stagewright.core.project.save` writes and :func:`stagewright.core.solve` reads.
"""
from __future__ import annotations

__all__ = ["Signal", "ProjectModel", "new_document"]

import copy
import pickle
from typing import Any, Callable

from stagewright.core.project.case_changes import base_document, differences
from stagewright.core.project.cases import base_name, case_document, case_names
from stagewright.core.project.validation import problems as doc_problems
from stagewright.core.project.schema import FORMAT_NAME, FORMAT_VERSION, PROJECT
from stagewright.core.project.schema_types import check

from stagewright.gui.document.paths import ABSENT, format_path, get_in, parse_path, set_in


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
    cases_changed()
        The project's cases (names, order) or the case being edited changed.

    Cases
    -----
    A project may hold cases (:mod:`stagewright.core.project.cases`). The model shows one at a time:
    :attr:`doc`, :meth:`get`, :meth:`snapshot` and the edits read and change the *active* case
    as a standalone document, and every edit is written back into the project — into the base's
    own fields, or as the active case's changes (:func:`stagewright.core.project.case_changes.differences`).
    :meth:`project_snapshot` is the whole project (base, cases, snapshot) to save.
    """

    def __init__(self, doc: dict | None = None) -> None:
        self.changed = Signal()
        self.structure_changed = Signal()
        self.cases_changed = Signal()
        self._project: dict = copy.deepcopy(doc) if doc is not None else new_document()
        self._active: str | None = None  # None: the base
        self._doc: dict = self._view()
        self._version = 0  #: one more at every change of the document (set, stages, case shown, replaced)
        self._normalised: tuple[int, dict] | None = None  #: (version, normalised()) of the last call

    # ---- cases ---------------------------------------------------------------------------
    def _view(self) -> dict:
        """The active case as a standalone document (with the project's format and version)."""
        view = case_document(self._project, self._active)
        head = {k: self._project[k] for k in ("format", "version") if k in self._project}
        return {**head, **{k: v for k, v in view.items() if k not in head}}

    def _sync(self) -> None:
        """Write the active view back into the project."""
        self._version += 1
        if self._active is None:
            keep = {k: self._project[k] for k in ("base_name", "cases", "snapshot") if k in self._project}
            self._project = {**_data_copy(self._doc), **keep}
            return
        changes = differences(base_document(self._project), self._doc)
        for case in self._project.get("cases") or []:
            if case.get("name") == self._active:
                case["changes"] = changes

    @property
    def active_case(self) -> str:
        """Name of the case being edited (the base's name for the base)."""
        return self._active if self._active is not None else base_name(self._project)

    @property
    def is_base_active(self) -> bool:
        return self._active is None

    def case_names(self) -> list[str]:
        """The base's name, then each case's."""
        return case_names(self._project)

    def activate(self, name: str | None) -> None:
        """Show and edit case ``name`` (None or the base's name: the base). Not an edit."""
        target = None if name is None or name == base_name(self._project) else name
        if target == self._active:
            return
        if target is not None and target not in case_names(self._project):
            raise KeyError(name)
        self._active = target
        self._doc = self._view()
        self._version += 1
        self.structure_changed.emit("reset", 0, 0)
        self.changed.emit("")
        self.cases_changed.emit()

    def project_snapshot(self) -> dict:
        """The whole project — base, cases, kept results — as a deep copy, to save."""
        return copy.deepcopy(self._project)

    def project_problems(self) -> list:
        """Every problem of the whole project, its cases included."""
        return doc_problems(self._project)

    def replace_project(self, doc: dict, active: str | None = None) -> None:
        """Swap in a project after a case operation (add, rename, remove, make base), showing
        case ``active`` (default: the base; a name the project lacks shows the base)."""
        self._project = copy.deepcopy(doc)
        names = case_names(self._project)
        self._active = active if active in names[1:] else None
        self._doc = self._view()
        self._version += 1
        self.structure_changed.emit("reset", 0, 0)
        self.changed.emit("")
        self.cases_changed.emit()

    # ---- reading -------------------------------------------------------------------------
    @property
    def doc(self) -> dict:
        """The document itself (read it; change it only through this model's methods)."""
        return self._doc

    def snapshot(self) -> dict:
        """A deep copy, safe to hand to a worker thread or to save."""
        return _data_copy(self._doc)

    def get(self, path: str, default: Any = ABSENT) -> Any:
        return get_in(self._doc, path, default)

    def normalised(self) -> dict:
        """The document with schema defaults filled in, even when it has problems (for display).

        Read it, never change it: it is worked out once per change of the document and shared by
        every view that asks (each field's shown default asks; with an 8760-bin year each answer
        took about 50 ms)."""
        if self._normalised is None or self._normalised[0] != self._version:
            norm = check(PROJECT, self._doc, "", []) if isinstance(self._doc, dict) else {}
            self._normalised = (self._version, norm)
        return self._normalised[1]

    def problems(self) -> list:
        """Every :class:`stagewright.core.errors.Problem` of the document (ranges come from the schema)."""
        return doc_problems(self._doc)

    @property
    def stage_count(self) -> int:
        stages = self._doc.get("stages")
        return len(stages) if isinstance(stages, list) else 0

    # ---- changing ------------------------------------------------------------------------
    def set(self, path: str, value: Any) -> Any:
        """Set one value (``ABSENT`` removes the key); return the previous value."""
        old = set_in(self._doc, path, copy.deepcopy(value))
        self._sync()
        self.changed.emit(path)
        return old

    def set_many(self, pairs: list[tuple[str, Any]]) -> list[Any]:
        """Set several values as one change; return the previous values in order."""
        olds = [set_in(self._doc, p, _data_copy(v)) for p, v in pairs]
        self._sync()
        self.changed.emit(_common_prefix([p for p, _ in pairs]))
        return olds

    def insert_stage(self, index: int, stage: dict) -> None:
        self._doc["stages"].insert(index, copy.deepcopy(stage))
        self._sync()
        self.structure_changed.emit("insert", index, index)
        self.changed.emit("stages")

    def remove_stage(self, index: int) -> dict:
        stage = self._doc["stages"].pop(index)
        self._sync()
        self.structure_changed.emit("remove", index, min(index, len(self._doc["stages"]) - 1))
        self.changed.emit("stages")
        return stage

    def move_stage(self, index: int, new_index: int) -> None:
        stages = self._doc["stages"]
        stages.insert(new_index, stages.pop(index))
        self._sync()
        self.structure_changed.emit("move", index, new_index)
        self.changed.emit("stages")

    def replace(self, doc: dict) -> None:
        """Swap in another project (open, new, revert), showing its base."""
        self.replace_project(doc)


def _data_copy(doc: Any) -> Any:
    """A deep copy of plain document data, about five times faster than ``copy.deepcopy`` (an
    8760-bin year: 7 ms rather than 38 ms; the year profile editor, issue 15)."""
    return pickle.loads(pickle.dumps(doc, pickle.HIGHEST_PROTOCOL))


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
