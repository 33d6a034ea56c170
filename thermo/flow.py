"""How the required flow is given: mass, free air delivery, normal volume [1]_ [2]_."""
from __future__ import annotations

__all__ = ["NORMAL_TEMPERATURE", "NORMAL_PRESSURE", "mass_flow_from", "VOLUME_KINDS"]

from stagewright.core.models.base import Point, PropertyModel

NORMAL_TEMPERATURE = 273.15  #: DIN 1343 normal temperature, [K]
NORMAL_PRESSURE = 101_325.0  #: DIN 1343 normal pressure, [Pa]


def _fad_density(model: PropertyModel, T0: float, P0: float, ambient: Point | None = None) -> float:
    p = model.at_tp(T0, P0, "site intake") if ambient is None else ambient
    return p.rho if p.w == 0.0 else p.rho / (1.0 + p.w)  # dry air per m³ of moist intake air


def _normal_density(model: PropertyModel, T0: float, P0: float, ambient: Point | None = None) -> float:
    dry = getattr(model, "dry", model)  # DIN 1343 normal volume is of the dry gas
    return dry.at_tp(NORMAL_TEMPERATURE, NORMAL_PRESSURE, "normal state").rho


#: flow kind -> density that turns its volume flow into mass flow
VOLUME_KINDS = {
    "free_air_delivery": _fad_density,
    "normal_volume": _normal_density,
}


def mass_flow_from(kind: str, value: float, model: PropertyModel, T0: float, P0: float,
                   ambient: Point | None = None) -> float:
    r"""Mass flow [kg/s] of a flow given as mass, free air delivery or normal volume [1]_ [2]_.

    .. math:: \dot m = \rho_\mathrm{ref} \dot V_\mathrm{ref}

    Parameters
    ----------
    kind : str
        ``"mass"`` (value in kg/s), ``"free_air_delivery"`` or ``"normal_volume"`` (m³/s).
    value : float
        The flow, [kg/s] or [m³/s].
    model : PropertyModel
        Property model of the gas.
    T0, P0 : float
        Site ambient temperature [K] and barometric pressure [Pa].
    ambient : Point, optional
        The intake air at T0, P0 from ``model`` when the caller has it already (the solve
        context's :attr:`~stagewright.core.solve_context.IntakeState.ambient`): free air delivery then
        needs no property call of its own.

    Returns
    -------
    float
        Mass flow, [kg/s].

    Notes
    -----
    Free air delivery is the delivered flow expressed at the conditions of the standard
    inlet point, here the site ambient before the intake filter (ISO 1217, Annex C, from
    memory). Normal volume is referred to the DIN 1343 normal state, 273.15 K and
    101 325 Pa, dry gas.

    With moist intake air (``model`` a :class:`~stagewright.core.moist.stream.MoistAir`) the mass flow
    returned is that of the dry air. Free air delivery is the volume of the moist intake
    air, vapour included, at the site's temperature, pressure and humidity (ISO 1217
    refers FAD to the total temperature, pressure and composition at the inlet point, from
    memory): :math:`\dot m_a = \dot V_\mathrm{FAD}\,\rho/(1 + W_0)`. Normal volume counts
    the dry air only (DIN 1343 normal state, dry gas): :math:`\dot m_a = \rho_{n,\mathrm{dry}}
    \dot V_n`. Both are therefore converted through the dry-air mass flow.

    References
    ----------
    .. [1] ISO 1217:2009, *Displacement compressors — Acceptance tests*, §3 and Annex C.
    .. [2] DIN 1343:1990, *Reference conditions, normal conditions, normal volume*.
    """
    if kind == "mass":
        return value
    return value * VOLUME_KINDS[kind](model, T0, P0, ambient)
