"""Options as cases of one project, solved side by side, and results kept with the file.

:mod:`.compare` solves any cases of a project (each exactly as its standalone document,
:func:`stagewright.core.project.cases.case_document`) and, when the project has a year at the site, runs
it per case; :mod:`.snapshot` keeps the results with the tool's and CoolProp's versions and
tells what changed when they are computed again. The cases themselves — names, changes, make
base — are document operations in :mod:`stagewright.core.project.cases`.
"""
from __future__ import annotations

from stagewright.core.cases.compare import CaseOutcome, compare_cases
from stagewright.core.cases.snapshot import SnapshotChange, compare_snapshot, take_snapshot

__all__ = ["CaseOutcome", "compare_cases", "SnapshotChange", "compare_snapshot", "take_snapshot"]
