"""Property models of air, chosen per project by name (a registry, not an if-chain)."""
from __future__ import annotations

__all__ = ["MODELS", "make_model", "Point", "PropertyModel"]

from stagewright.core.models.base import Point, PropertyModel
from stagewright.core.models.constant_cp import ConstantCpAir
from stagewright.core.models.ideal_gas import IdealGasAir
from stagewright.core.models.real_gas import RealGasAir

#: model name -> factory taking the project's ``fluid`` section
MODELS = {
    "real_gas": lambda fluid: RealGasAir(),
    "ideal_gas": lambda fluid: IdealGasAir(),
    "constant_cp": lambda fluid: ConstantCpAir(fluid.get("cp_J_kgK", 1005.0), fluid.get("k", 1.4)),
}


def make_model(fluid: dict) -> PropertyModel:
    """Build the property model a project's ``fluid`` section names."""
    return MODELS[fluid.get("model", "real_gas")](fluid)
