"""The staging comparison across a range of one site variable (summer and winter)."""
from __future__ import annotations

__all__ = ["SITE_VARIABLES", "SensitivityPoint", "SensitivityStudy", "sensitivity"]

import copy
from dataclasses import dataclass
from typing import Any, Callable

from stagewright.core.project.validation import normalise
from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.study.compare import (DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS, StagingComparison, check_economics,
                      compare_stagings)
from stagewright.core.study.options import check_stage_count
from stagewright.core.study.progress import ProgressSpan, StudyCancelled, cancel_check

#: site variable -> (section, key) of the project document it sets
SITE_VARIABLES = {
    "ambient_temperature_K": ("site", "ambient_temperature_K"),
    "relative_humidity": ("site", "relative_humidity"),
}
_MAX_POINTS = 50


@dataclass
class SensitivityPoint:
    """The comparison at one value of the site variable, or why it could not be made."""

    value: float
    comparison: StagingComparison | None
    error: str | None = None


@dataclass
class SensitivityStudy:
    """One comparison per value of a site variable."""

    variable: str
    points: list

    def rows(self) -> list[dict]:
        """Plain data: one entry per value, with the comparison rows under ``options``."""
        return [{"variable": self.variable, "value": p.value,
                 "options": None if p.comparison is None else p.comparison.rows(), "error": p.error}
                for p in self.points]


def _with_value(doc: dict, variable: str, value: float) -> dict:
    section, key = SITE_VARIABLES[variable]
    out = copy.deepcopy(doc)
    out.setdefault(section, {})[key] = value
    return out


def sensitivity(doc: dict, variable: str, values: list[float], max_stages: int = 4, *,
                operating_hours_per_year: float = DEFAULT_OPERATING_HOURS,
                energy_price_per_kWh: float = DEFAULT_ENERGY_PRICE,
                progress: Callable[[float, str], Any] | None = None, cancel: Any = None) -> SensitivityStudy:
    """Run :func:`~stagewright.core.study.compare.compare_stagings` at each value of one site variable.

    Everything else in the project stays as it is; in particular coolers keep their
    outlet temperatures (or coolant temperature and approach), so a hot day changes
    the intake air, not the cooling water.

    Parameters
    ----------
    doc : dict
        Project document.
    variable : str
        A key of :data:`SITE_VARIABLES`: ``"ambient_temperature_K"`` [K] or
        ``"relative_humidity"`` [-] (it changes the results only with a moist-air model).
    values : list of float
        Values of the variable, in its SI unit, 1 … 50 of them.
    max_stages, operating_hours_per_year, energy_price_per_kWh, progress, cancel
        As for :func:`~stagewright.core.study.compare.compare_stagings`.

    Returns
    -------
    SensitivityStudy
        One point per value; a value at which the train cannot run (for example an
        ambient above a cooler's outlet temperature) carries the error message instead.

    Raises
    ------
    InputError
        For an unknown variable, no or too many values, or a value outside the
        project format's range for that key (all checked before any solve).
    StudyCancelled
        When cancelled; ``partial`` holds the points finished so far.
    """
    if variable not in SITE_VARIABLES:
        raise InputError("variable", variable, f"expected one of {', '.join(SITE_VARIABLES)}")
    values = list(values)
    if not 1 <= len(values) <= _MAX_POINTS:
        raise InputError("values", len(values), f"expected 1 … {_MAX_POINTS} values")
    check_stage_count(max_stages)
    check_economics(operating_hours_per_year, energy_price_per_kWh)
    for v in values:
        normalise(_with_value(doc, variable, v))  # a bad value fails here, naming its field
    span = ProgressSpan(progress)
    should_stop = cancel_check(cancel)
    points: list[SensitivityPoint] = []
    for k, v in enumerate(values):
        sub = span.sub(k / len(values), (k + 1) / len(values))
        try:
            comp = compare_stagings(_with_value(doc, variable, v), max_stages,
                                    operating_hours_per_year=operating_hours_per_year,
                                    energy_price_per_kWh=energy_price_per_kWh,
                                    progress=lambda f, m, v=v, sub=sub: sub.report(f, f"{variable} = {v:g}: {m}"),
                                    cancel=should_stop)
        except StudyCancelled:
            raise StudyCancelled(f"study cancelled after {len(points)} of {len(values)} values", points) from None
        except StagewrightError as exc:
            points.append(SensitivityPoint(v, None, str(exc)))
            continue
        points.append(SensitivityPoint(v, comp))
    span.report(1.0, f"{variable}: {len(values)} value(s) done")
    return SensitivityStudy(variable, points)
