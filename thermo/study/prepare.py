"""Turn a project into the design problem a staging study solves."""
from __future__ import annotations

__all__ = ["Prepared", "prepare"]

import copy
from dataclasses import dataclass, field

from stagewright.core.project.validation import normalise
from stagewright.core.solve import solve


@dataclass
class Prepared:
    """A normalised project ready for a study, and what was changed to make it one.

    Attributes
    ----------
    doc : dict
        Normalised project document; every stage's ``pressure_ratio`` is None (the study
        chooses them), the flow is never given as shaft power and every efficiency is an
        isentropic or polytropic efficiency.
    notes : list of str
        One sentence per change, for the study's output.
    """

    doc: dict
    notes: list = field(default_factory=list)

    def with_stages(self, stages: list[dict], note: str | None = None) -> "Prepared":
        """The same problem with other stages (each ratio cleared)."""
        doc = dict(self.doc)
        doc["stages"] = [dict(copy.deepcopy(s), pressure_ratio=None) for s in stages]
        return Prepared(doc, self.notes + ([note] if note else []))


def prepare(doc: dict) -> Prepared:
    """Normalise a project and restate it as a design problem for the study.

    Parameters
    ----------
    doc : dict
        Project document.

    Returns
    -------
    Prepared

    Raises
    ------
    StagewrightError
        If the document is invalid, or (when the project gives a shaft power or a measured
        discharge temperature) the project as given cannot be solved.

    Notes
    -----
    * A flow given as shaft power is replaced by the mass flow the project's own split
      gives: the study compares splits at one delivered flow.
    * A stage given by a measured discharge temperature gets the isentropic efficiency
      that temperature implies at the project's own split: a fixed discharge temperature
      would make the work of that stage independent of its ratio.
    * Ratios given in the project are replaced by the optimum; a stage is held at a ratio
      by setting ``min_pressure_ratio`` = ``max_pressure_ratio``.
    """
    norm = copy.deepcopy(normalise(doc))
    notes = []
    stages = norm["stages"]
    measured = [i for i, s in enumerate(stages) if s["efficiency"]["kind"] == "discharge_temperature"]
    if norm["flow"]["kind"] == "shaft_power" or measured:
        base = solve(norm)
        if norm["flow"]["kind"] == "shaft_power":
            norm["flow"] = {"kind": "mass", "value": base.mass_flow_kg_s}
            notes.append(f"the flow given as shaft power is held at the {base.mass_flow_kg_s:.6g} kg/s "
                         "it gives with the project's own split")
        for i in measured:
            eta = base.stages[i].isentropic_efficiency
            stages[i]["efficiency"] = {"kind": "isentropic", "value": eta}
            notes.append(f"stage {i + 1}'s measured discharge temperature is used as the isentropic "
                         f"efficiency it implies, {eta:.4f}")
    if any(s["pressure_ratio"] is not None for s in stages):
        notes.append("the stage ratios given in the project are replaced by the optimum "
                     "(hold a stage with min_pressure_ratio = max_pressure_ratio)")
    for s in stages:
        s["pressure_ratio"] = None
    return Prepared(norm, notes)
