"""The package figures a solve reports: full load, the stated load, the data-sheet loads, a curve."""
from __future__ import annotations

__all__ = ["PackageFigures", "package_figures", "package_warnings", "CURVE_POINTS"]

from dataclasses import dataclass

from stagewright.core.errors import message_detail
from stagewright.core.part_load.annual import AnnualFigures, annual_figures
from stagewright.core.part_load.controls import CONTROL_LABELS
from stagewright.core.part_load.full_load import FullLoad, full_load_of
from stagewright.core.part_load.package import PackagePoint, package_curve, package_point

CURVE_POINTS = 21  #: demands 0, 0.05 … 1 of the part-load chart


@dataclass
class PackageFigures:
    """What the package does at the conditions solved (SI)."""

    control_kind: str
    control_label: str
    full: FullLoad
    full_load: PackagePoint
    at_load: PackagePoint
    part_loads: list
    curve: list
    annual: AnnualFigures | None

    def to_dict(self) -> dict:
        return {"control": self.control_kind, "control_label": self.control_label,
                "full_load": self.full_load.to_dict(), "at_load": self.at_load.to_dict(),
                "part_loads": [p.to_dict() for p in self.part_loads],
                "curve": [p.to_dict() for p in self.curve],
                "annual": None if self.annual is None else self.annual.to_dict()}


def package_figures(norm: dict, res) -> PackageFigures | None:
    """The package's figures for a solved train; None when the project has no ``package`` section.

    The train is solved at its full flow; the stated ``package.load``, the data-sheet
    ``part_loads`` and the ``load_profile`` go through the control (:mod:`.package`).

    Parameters
    ----------
    norm : dict
        The normalised project.
    res : stagewright.core.results.TrainResult
        Its solved train.

    Returns
    -------
    PackageFigures or None
    """
    pkg = norm.get("package")
    if not pkg:
        return None
    full = full_load_of(res, norm["driver"]["efficiency"])
    kind = pkg["control"]["kind"]
    return PackageFigures(
        control_kind=kind, control_label=CONTROL_LABELS[kind], full=full,
        full_load=package_point(pkg, full, 1.0), at_load=package_point(pkg, full, pkg["load"]),
        part_loads=[package_point(pkg, full, x) for x in pkg["part_loads"]],
        curve=package_curve(pkg, full, CURVE_POINTS), annual=annual_figures(pkg, full, pkg["load_profile"]))


def package_warnings(fig: PackageFigures | None) -> list:
    """Result warnings of the package at its stated load: short cycling on the receiver
    (:func:`stagewright.core.part_load.load_unload.short_cycling_note`)."""
    from stagewright.core.part_load.load_unload import SHORT_CYCLES_PER_HOUR
    from stagewright.core.results import Warning_
    if fig is None:
        return []
    cycles = fig.at_load.cycles_per_hour
    if fig.at_load.starts_per_hour is not None or cycles is None or cycles <= SHORT_CYCLES_PER_HOUR:
        return []
    text = (f"At the stated load the control cycles {cycles:.0f} times an hour (more than "
            f"{SHORT_CYCLES_PER_HOUR:.0f}): short cycling wears the inlet valve and wastes energy in blowdowns; "
            "a larger receiver or a wider pressure band lengthens the cycle")
    return [Warning_("package.control.receiver_volume_m3", text, message_detail(text))]
