"""Points along a path for charts, made when they are first read (never in a balance).

A solve's stage and cooler results carry the states along their paths for T–s charts
(``StageResult.path``, ``CoolerResult.path``). Those points take no part in any balance, so a
solve only records how to make them; :class:`PointsOnDemand` makes them the first time
anything reads them (``TrainResult.to_dict()`` does, and so does every chart) and keeps them.
"""
from __future__ import annotations

__all__ = ["PointsOnDemand", "path_ends", "known_points"]

import threading
from collections.abc import Sequence


class PointsOnDemand(Sequence):
    """A list of points computed by ``make()`` on first use, then kept.

    Parameters
    ----------
    make : callable
        ``make() -> list`` of the points; called at most once.
    ends : tuple
        The first and last point, known without ``make`` (the states at both ends of the path).

    Notes
    -----
    ``make`` uses the property model of the solve that recorded it: read the points in the
    thread that solved (``TrainResult.to_dict()`` in the solve's own job does), as the model
    objects are per thread (:mod:`stagewright.core.solve_context`).

    Examples
    --------
    >>> calls = []
    >>> pts = PointsOnDemand(lambda: calls.append(1) or [1, 2, 3], (1, 3))
    >>> pts.ends, calls
    ((1, 3), [])
    >>> list(pts), pts[-1], len(pts), calls
    ([1, 2, 3], 3, 3, [1])
    >>> import copy, pickle
    >>> copy.deepcopy(pts), pickle.loads(pickle.dumps(pts))
    ([1, 2, 3], [1, 2, 3])
    """

    def __init__(self, make, ends: tuple):
        self._make = make
        self._points = None
        self._lock = threading.Lock()
        self.ends = ends

    @property
    def made(self) -> bool:
        """True once the points exist."""
        return self._points is not None

    def _get(self) -> list:
        if self._points is None:
            with self._lock:
                if self._points is None:
                    self._points = list(self._make())
                    self._make = None
        return self._points

    def __getitem__(self, index):
        return self._get()[index]

    def __len__(self) -> int:
        return len(self._get())

    def __iter__(self):
        return iter(self._get())

    def __eq__(self, other) -> bool:
        return list(self) == list(other) if isinstance(other, (list, tuple, Sequence)) else NotImplemented

    __hash__ = None

    def __reduce__(self):
        """Copied or pickled as the plain list of its points (made first)."""
        return (list, (list(self),))

    def __repr__(self) -> str:
        return f"PointsOnDemand({self._points!r})" if self.made else "PointsOnDemand(<not made yet>)"


def path_ends(path) -> tuple:
    """The first and last point of a path, without making the points of one on demand."""
    if isinstance(path, PointsOnDemand):
        return path.ends
    return path[0], path[-1]


def known_points(path) -> list:
    """The points of a path that exist already: all of a list, the two ends of one made on demand
    (a compression path of positive efficiency heats monotonically, so its extremes are its ends)."""
    return list(path.ends) if isinstance(path, PointsOnDemand) else path
