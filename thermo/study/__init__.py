"""Staging study: the optimum pressure split under the stages' limits, staging options
side by side, and their sensitivity to a site variable.

Everything here is built on :func:`thermo.solve` (the one place the physics lives); a
study only chooses the stage ratios and the number of stages. Modules, one concept each:

* :mod:`~thermo.study.limits` — limits, how they bind, the pressure-arithmetic checks
* :mod:`~thermo.study.prepare` — a project restated as a design problem
* :mod:`~thermo.study.start` — starting splits (equal split, ideal-gas optimum)
* :mod:`~thermo.study.trials` — cached, cancellable trial solves
* :mod:`~thermo.study.optimal_split` — :func:`optimal_split`
* :mod:`~thermo.study.options` — the N-stage option built from a project
* :mod:`~thermo.study.compare` — :func:`compare_stagings`
* :mod:`~thermo.study.sensitivity` — :func:`sensitivity`
* :mod:`~thermo.study.progress` — progress spans, cancellation, :class:`StudyCancelled`
"""
from thermo.study.compare import (DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS, StagingComparison, StagingOption,
                      compare_stagings)
from thermo.study.limits import BindingLimit, LimitNotMet
from thermo.study.optimal_split import SplitResult, optimal_split
from thermo.study.options import MAX_STAGES
from thermo.study.progress import StudyCancelled
from thermo.study.sensitivity import SITE_VARIABLES, SensitivityStudy, sensitivity

__all__ = ["optimal_split", "compare_stagings", "sensitivity", "SplitResult", "StagingOption",
           "StagingComparison", "SensitivityStudy", "BindingLimit", "LimitNotMet", "StudyCancelled",
           "MAX_STAGES", "SITE_VARIABLES", "DEFAULT_OPERATING_HOURS", "DEFAULT_ENERGY_PRICE"]
