"""Format versions of the project document and the chain that upgrades old files.

Every project file carries an integer ``version``. This release writes
:data:`~stagewright.core.project.schema.FORMAT_VERSION` and reads every version from 1 up to it: a file of
version *n* is passed through the registered steps *n → n+1 → …* until it is current,
then validated against :mod:`stagewright.core.project.schema`. A file of a newer version than this release
knows is refused, and nothing is written.

Versions: 1, the first; 3 adds cases and a results snapshot (:mod:`stagewright.core.project.cases`); 2 lets the delivery pressure be stated gauge
(``discharge_gauge_pressure_Pa``, relative to the site's barometric pressure) as an alternative
to ``discharge_pressure_Pa`` (absolute, unchanged), exactly one of the two. Whoever changes the meaning of a
key, renames or removes one, or adds a required key bumps ``FORMAT_VERSION`` and registers
one step here (see DEVELOPERS.md, "Changing the project format"); the test suite fails
until the step and a fixture file ``tests/fixtures/project_v<n>.json`` of the old
version exist. Adding an optional key with a default that reproduces the old behaviour
needs no new version.

A step receives a deep copy of a version-*n* document (plain JSON data, not yet
validated) and returns the version-*n+1* document; :func:`migrate` sets ``version``.
"""
from __future__ import annotations

__all__ = ["STEPS", "step", "file_version", "migrate", "oldest_readable"]

import copy
import math
from typing import Callable

from stagewright.core.project import schema
from stagewright.core.errors import ProjectFileError

#: from-version → function turning a document of that version into the next version's
STEPS: dict[int, Callable[[dict], dict]] = {}
#: first format version ever written; files without a ``version`` key are this version
FIRST_VERSION = 1


def step(from_version: int):
    """Register the decorated function as the upgrade ``from_version`` → ``from_version + 1``."""
    def register(fn: Callable[[dict], dict]) -> Callable[[dict], dict]:
        if from_version in STEPS:
            raise ValueError(f"a migration step from version {from_version} is already registered")
        STEPS[from_version] = fn
        return fn
    return register


def oldest_readable() -> int:
    """Oldest format version this release can upgrade (the chain must be unbroken)."""
    v = schema.FORMAT_VERSION
    while v - 1 in STEPS:
        v -= 1
    return v


def file_version(doc: dict) -> int:
    """The format version a document declares.

    A missing ``version`` means version 1: the only version in which leaving it out was
    ever allowed (files written by :func:`stagewright.core.project.save` always carry it).

    Raises
    ------
    ProjectFileError
        If ``version`` is not a whole number, or is newer or older than this release reads.
    """
    v = doc.get("version", FIRST_VERSION)
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or v != int(v):
        raise ProjectFileError(f"version: {v!r} — expected a whole number (the project format version)",
                               field="version")
    v = int(v)
    current = schema.FORMAT_VERSION
    if v > current:
        raise ProjectFileError(
            f"version: {v} — this file was written by a newer Stagewright (project format version {v}); "
            f"this release reads versions up to {current}. Open it with a newer release; "
            "the file has not been changed.", field="version")
    if v < oldest_readable():
        raise ProjectFileError(f"version: {v} — expected a project format version from "
                               f"{oldest_readable()} to {current}", field="version")
    return v


def migrate(doc: dict) -> tuple[dict, int]:
    """Upgrade a document to the current format version.

    Parameters
    ----------
    doc : dict
        A parsed project document of any readable version (left unchanged).

    Returns
    -------
    tuple of (dict, int)
        The current-version document (a new object, ``version`` set) and the version
        the input declared.

    Raises
    ------
    ProjectFileError
        For a version that is not a whole number, newer than this release, or older
        than the chain reaches.

    Examples
    --------
    >>> migrate({"title": "no version key: read as version 1"})[1]
    1
    """
    start = file_version(doc)
    out = copy.deepcopy(doc)
    for v in range(start, schema.FORMAT_VERSION):
        out = STEPS[v](out)
        out["version"] = v + 1
    out["version"] = schema.FORMAT_VERSION
    return out, start


@step(1)
def _v1_to_v2(doc: dict) -> dict:
    """Version 1 → 2: nothing to change.

    Version 2 adds ``discharge_gauge_pressure_Pa`` as an alternative to
    ``discharge_pressure_Pa``, which keeps its meaning (absolute pressure, [Pa]); a version-1
    file always states the absolute key, so it reads exactly as before. The version is bumped
    because a version-2 file stating the gauge key cannot be read by a version-1 release.
    """
    return doc


@step(2)
def _v2_to_v3(doc: dict) -> dict:
    """Version 2 → 3: nothing to change.

    Version 3 adds cases (``base_name``, ``cases``: named cases, each the base design's
    fields it changes) and ``snapshot`` (the results as last saved). A version-2 file is a
    project with one case, its base; it reads exactly as before. The version is bumped because
    a release that reads version 2 would refuse the new keys.
    """
    return doc
