"""Staging study: the optimum pressure split under the stages' limits, staging options
side by side, and their sensitivity to a site variable.

Everything here is built on :func:`stagewright.core.solve` (the one place the physics lives); a
study only chooses the stage ratios and the number of stages. Modules, one concept each:

* :mod:`~stagewright.core.study.limits` — limits, how they bind, the pressure-arithmetic checks
* :mod:`~stagewright.core.study.prepare` — a project restated as a design problem
* :mod:`~stagewright.core.study.start` — starting splits (equal split, ideal-gas optimum)
* :mod:`~stagewright.core.study.trials` — cached, cancellable trial solves
* :mod:`~stagewright.core.study.optimal_split` — :func:`optimal_split`
* :mod:`~stagewright.core.study.pressure_steps` — its derivatives, taken in the intermediate pressures
* :mod:`~stagewright.core.study.options` — the N-stage option built from a project
* :mod:`~stagewright.core.study.compare` — :func:`compare_stagings`
* :mod:`~stagewright.core.study.sensitivity` — :func:`sensitivity`
* :mod:`~stagewright.core.study.progress` — progress spans, cancellation, :class:`StudyCancelled`
* :mod:`~stagewright.core.study.defaults` — the economic defaults (operating hours, energy price)
"""
from stagewright.core.study.compare import StagingComparison, StagingOption, compare_stagings
from stagewright.core.study.defaults import DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS
from stagewright.core.study.limits import BindingLimit, LimitNotMet
from stagewright.core.study.optimal_split import SplitResult, optimal_split
from stagewright.core.study.options import MAX_STAGES
from stagewright.core.study.progress import StudyCancelled
from stagewright.core.study.sensitivity import SITE_VARIABLES, SensitivityStudy, sensitivity

__all__ = ["optimal_split", "compare_stagings", "sensitivity", "SplitResult", "StagingOption",
           "StagingComparison", "SensitivityStudy", "BindingLimit", "LimitNotMet", "StudyCancelled",
           "MAX_STAGES", "SITE_VARIABLES", "DEFAULT_OPERATING_HOURS", "DEFAULT_ENERGY_PRICE"]
