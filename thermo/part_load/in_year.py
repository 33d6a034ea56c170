"""A year bin's power through the package's control (:mod:`stagewright.core.year` calls it per bin)."""
from __future__ import annotations

__all__ = ["BinPower", "bin_power"]

from dataclasses import dataclass

from stagewright.core.part_load.full_load import full_load_of
from stagewright.core.part_load.package import package_point


@dataclass(frozen=True)
class BinPower:
    """A bin's mean driver input, auxiliaries and package input [W]."""

    driver_power_W: float
    auxiliary_power_W: float
    package_power_W: float


def bin_power(norm: dict, res, load: float) -> BinPower:
    """The power a bin draws at ``load``.

    The bin's train is solved at ``load`` times the full flow (its delivered air, condensate
    and cooling water). With a ``package`` section its full-load figures are that solve's per
    unit of flow (:func:`stagewright.core.part_load.full_load.full_load_of`) and the control, motor,
    drive and auxiliaries give the power at that demand (:func:`stagewright.core.part_load.package.package_point`).
    Without one the power is in proportion to the flow at full-load efficiency (the driver
    power of the solve): optimistic below full load, which the year's notes say.

    Parameters
    ----------
    norm : dict
        The normalised project (its ``package`` and ``driver`` sections).
    res : stagewright.core.results.TrainResult
        The bin's solve.
    load : float
        The bin's demand over full capacity [-], > 0.

    Returns
    -------
    BinPower
    """
    pkg = norm.get("package")
    if not pkg:
        return BinPower(res.driver_power_W, 0.0, res.driver_power_W)
    p = package_point(pkg, full_load_of(res, norm["driver"]["efficiency"], load), load)
    return BinPower(p.driver_power_W, p.package_power_W - p.driver_power_W, p.package_power_W)
