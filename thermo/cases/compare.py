"""Solve several cases of one project, each as its own standalone document.

A case's result here is exactly the result of the same case written out as a file and solved
(``stagewright.core.solve(case_document(doc, name))``): nothing else of the project reaches the solver.
A case that cannot be solved is kept with its error message, so a comparison of five cases
still shows the four that solve.
"""
from __future__ import annotations

__all__ = ["CaseOutcome", "compare_cases"]

from dataclasses import dataclass, field
from typing import Callable, Mapping, Sequence

from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.project.cases import case_document, case_names


@dataclass
class CaseOutcome:
    """One case of a comparison.

    Attributes
    ----------
    name : str
        The case's name (the base's name for the base).
    document : dict
        The case as a standalone project document.
    result : dict or None
        ``TrainResult.to_dict()``, or None when the case could not be solved.
    year : dict or None
        ``YearResult.to_dict()`` when the case has a year at the site and it was run.
    error : str
        Why the case (or its year) could not be solved; empty when it was.
    error_field : str
        The field the error names, when it names one.
    """

    name: str
    document: dict
    result: dict | None = None
    year: dict | None = None
    error: str = ""
    error_field: str = ""
    warnings: list = field(default_factory=list)

    @property
    def solved(self) -> bool:
        return self.result is not None


def compare_cases(doc: Mapping, names: Sequence[str] | None = None, with_year: bool = True,
                  progress: Callable[[int, int], None] | None = None,
                  cancelled: Callable[[], bool] | None = None) -> list[CaseOutcome]:
    """Solve cases of ``doc`` side by side.

    Parameters
    ----------
    doc : Mapping
        A project document with cases (a project without any compares its base alone).
    names : sequence of str, optional
        The cases to solve, in this order (default: all, the base first).
    with_year : bool
        Run the year at the site of each case that has one (for the annual energy and cost).
    progress : callable, optional
        ``progress(done, total)`` after each case.
    cancelled : callable, optional
        Returns True to stop between cases (the cases solved so far are returned).

    Returns
    -------
    list of CaseOutcome
        One per case asked for, in that order.

    Raises
    ------
    InputError
        If a name is not a case of the project (field ``case``).

    Examples
    --------
    >>> import json, pathlib
    >>> doc = json.loads(pathlib.Path("sample_projects/two_stage_plant_air.json").read_text())
    >>> doc["cases"] = [{"name": "Hot day", "changes": {"site.ambient_temperature_K": 313.15}}]
    >>> hot, = compare_cases(doc, ["Hot day"])
    >>> hot.solved and hot.document["site"]["ambient_temperature_K"]
    313.15
    """
    from stagewright.core.solve import solve
    from stagewright.core.year import run_year

    chosen = list(names) if names is not None else case_names(doc)
    known = case_names(doc)
    for name in chosen:
        if name not in known:
            raise InputError("case", name, "expected one of the project's cases: " + ", ".join(known))
    out: list[CaseOutcome] = []
    for i, name in enumerate(chosen):
        if cancelled is not None and cancelled():
            break
        own = case_document(doc, name)
        outcome = CaseOutcome(name, own)
        try:
            outcome.result = solve(own).to_dict()
            outcome.warnings = list(outcome.result.get("warnings") or [])
            if with_year and own.get("year"):
                outcome.year = run_year(own).to_dict()
        except StagewrightError as exc:
            outcome.error, outcome.error_field = str(exc), getattr(exc, "field", "") or ""
        out.append(outcome)
        if progress is not None:
            progress(i + 1, len(chosen))
    return out
