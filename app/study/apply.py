"""A staging-study option back into the project, and whether a study still fits the project.

Qt-free. An N-stage option of :func:`stagewright.core.study.compare_stagings` repeats the project's
first stage N times and keeps its last stage's cooler as the aftercooler
(:func:`stagewright.core.study.options.staging_stages`); :func:`option_stages` builds the same stage
list from the project's own entries (so the document keeps its own keys, not every default)
with the option's pressure ratios.
"""
from __future__ import annotations

__all__ = ["option_stages", "apply_text", "study_key", "project_field"]

import copy
import json
import re

_STAGE_FIELD = re.compile(r"^stages\[(\d+)\](.*)$")


def option_stages(doc: dict, ratios: list[float], first_efficiency: dict | None = None) -> list[dict]:
    """The stage list of an N-stage option (N = ``len(ratios)``), ready for ``stages``.

    Parameters
    ----------
    doc : dict
        The project document the study ran on.
    ratios : list of float
        The option's stage pressure ratios, [-], first stage first.
    first_efficiency : dict, optional
        The efficiency entry the study used for the repeated stage (when the project gives
        the first stage a measured discharge temperature, the study uses the isentropic
        efficiency it implies; that is what the option's numbers belong to).

    Returns
    -------
    list of dict
        Copies of the project's first stage named "Stage 1" … "Stage N", each with its ratio;
        the last carries the project's last-stage cooler (or none, as the project has it).

    Examples
    --------
    >>> doc = {"stages": [{"name": "LP", "cooler": {"outlet_temperature_K": 300.0}},
    ...                   {"name": "HP"}]}
    >>> [(s["name"], s["pressure_ratio"], "cooler" in s) for s in option_stages(doc, [2.0, 2.0, 2.25])]
    [('Stage 1', 2.0, True), ('Stage 2', 2.0, True), ('Stage 3', 2.25, False)]
    """
    stages = doc["stages"]
    first, last = stages[0], stages[-1]
    out = []
    for k, r in enumerate(ratios):
        st = copy.deepcopy(first)
        st["name"] = f"Stage {k + 1}"
        st["pressure_ratio"] = float(r)
        if first_efficiency is not None:
            st["efficiency"] = copy.deepcopy(first_efficiency)
        if k == len(ratios) - 1:
            if "cooler" in last:
                st["cooler"] = copy.deepcopy(last["cooler"])
            else:
                st.pop("cooler", None)
        out.append(st)
    return out


def apply_text(n: int) -> str:
    """Undo-stack description of applying the ``n``-stage option."""
    return f"Apply {n}-stage option"


def study_key(doc: dict) -> str:
    """Everything a staging study of ``doc`` depends on, as text: two documents with the same
    key have the same study (stage names and ratios do not count; the study chooses ratios).

    Only the first stage and the last stage's cooler shape the options, unless the first
    stage measures its discharge temperature or the flow is a shaft power: the study then
    starts from a solve of the project's own train, which depends on every stage.

    Examples
    --------
    >>> a = {"flow": {"kind": "mass", "value": 1.0}, "stages": [{"name": "A", "x": 1}, {"x": 2}]}
    >>> b = {"flow": {"kind": "mass", "value": 1.0}, "stages": [{"name": "B", "x": 1, "pressure_ratio": 3.0},
    ...                                               {"x": 9}, {"x": 2}]}
    >>> study_key(a) == study_key(b)
    True
    """
    if not isinstance(doc, dict):
        return ""
    stages = doc.get("stages") if isinstance(doc.get("stages"), list) else []
    stages = [s if isinstance(s, dict) else {} for s in stages]

    def bare(st: dict) -> dict:
        return {k: v for k, v in st.items() if k not in ("name", "pressure_ratio")}

    rest = {k: v for k, v in doc.items() if k not in ("stages", "title", "note")}
    flow = doc.get("flow") if isinstance(doc.get("flow"), dict) else {}
    first = stages[0] if stages else {}
    eff = first.get("efficiency") if isinstance(first.get("efficiency"), dict) else {}
    if flow.get("kind") == "shaft_power" or eff.get("kind") == "discharge_temperature":
        shape = [bare(s) for s in stages]
    else:
        shape = {"first": bare(first), "aftercooler": stages[-1].get("cooler", "(none)") if stages else None}
    return json.dumps({"project": rest, "stages": shape}, sort_keys=True, default=str)


def project_field(path: str, option_stages_n: int, project_stages_n: int) -> str:
    """The project's field behind a field path of an N-stage option.

    Every stage of an option is the project's first stage, except that the last one's cooler
    is the project's last-stage cooler; other paths are the project's own.

    Examples
    --------
    >>> project_field("stages[2].max_discharge_temperature_K", 3, 2)
    'stages[0].max_discharge_temperature_K'
    >>> project_field("stages[2].cooler.approach_K", 3, 2)
    'stages[1].cooler.approach_K'
    >>> project_field("discharge_pressure_Pa", 3, 2)
    'discharge_pressure_Pa'
    """
    m = _STAGE_FIELD.match(path or "")
    if not m or project_stages_n < 1:
        return path
    i, rest = int(m.group(1)), m.group(2)
    if rest.startswith(".cooler") and i == option_stages_n - 1:
        return f"stages[{project_stages_n - 1}]{rest}"
    return f"stages[0]{rest}"
