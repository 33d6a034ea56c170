"""The result of a train solve, and its plain-data form (``to_dict``) for JSON, CSV and reports."""
from __future__ import annotations

__all__ = ["TrainResult", "InletResult", "Warning_", "WaterResult", "point_dict", "exchanger_dict",
           "LIQUID_COOLANTS", "cooling_water_m3_s"]

import math
from dataclasses import dataclass, field

from stagewright.core.cooler import CoolerResult
from stagewright.core.errors import message_detail
from stagewright.core.exergy import DeadState
from stagewright.core.moist.stream import humidity_of
from stagewright.core.models.base import Point
from stagewright.core.stage import StageResult


@dataclass(frozen=True)
class Warning_:
    """Something the user should look at; ``field`` is the input path to select.

    ``message`` is SI (command line, JSON); ``detail`` the same sentence as a template with
    named values (:func:`stagewright.core.errors.message_detail`) for display units.
    """

    field: str
    message: str
    detail: dict | None = field(default=None, compare=False, hash=False)

    def to_dict(self) -> dict:
        """Plain data: field, SI message, template and values (a list, each with its name)."""
        d = self.detail or message_detail(self.message)
        return {"field": self.field, "message": self.message, "template": d["template"],
                "values": [{"name": k, "value": v["value"], "quantity": v["quantity"]}
                           for k, v in d["values"].items()]}


@dataclass
class InletResult:
    """The intake filter: a throttle from ambient to the stage-1 inlet pressure."""

    ambient: Point
    outlet: Point
    entropy_generation_W_K: float
    exergy_destroyed_W: float


@dataclass
class WaterResult:
    """Water totals of a train with moist intake air (SI units; mass flows in kg/s)."""

    mixture: object  #: the MoistMixture used (for per-point humidity figures)
    intake_humidity_ratio: float
    intake_water_kg_s: float
    condensate_kg_s: float  #: drained by all separators
    delivered_water_kg_s: float  #: vapour and liquid leaving with the delivered air
    delivered_liquid_kg_s: float
    delivered_pressure_dew_point_K: float | None
    delivered_atmospheric_dew_point_K: float | None
    delivered_liquid_kg_m3: float  #: liquid water per m³ at the ISO 8573-1 reference conditions
    iso8573_humidity_class: str
    condensate_exergy_W: float
    water_balance_residual: float


def point_dict(p: Point, velocity: float = 0.0, mixture=None) -> dict:
    """Plain-data form of a state point (SI, unit in each key).

    Humidity ratio (vapour) and liquid ratio are per kilogram of dry air, relative
    humidity on the mole-fraction basis, ``dew_point_K`` at the point's own pressure
    (a frost point below 273.15 K; None without water). Enthalpy and entropy are per
    kilogram of dry air and include the water.
    """
    d = {"temperature_K": p.T, "pressure_Pa": p.P, "enthalpy_J_kg": p.h, "entropy_J_kgK": p.s,
         "density_kg_m3": p.rho, "velocity_m_s": velocity}
    d.update(humidity_of(mixture, p))
    return d


def _path(points: list, mixture) -> list:
    if mixture is None:
        return [{"temperature_K": p.T, "pressure_Pa": p.P, "entropy_J_kgK": p.s} for p in points]
    return [{"temperature_K": p.T, "pressure_Pa": p.P, "entropy_J_kgK": p.s, "humidity_ratio": p.w,
             "liquid_ratio": p.wl} for p in points]


def _cooler_water(cooler: CoolerResult, mixture) -> dict:
    w = cooler.water
    if w is None:
        return {"condensate_kg_s": 0.0, "condensate_L_h": 0.0, "latent_duty_W": 0.0,
                "sensible_duty_W": cooler.duty_W, "drained_kg_s": 0.0, "carry_over_kg_s": 0.0,
                "separator_outlet": point_dict(cooler.outlet)}
    return {"condensate_kg_s": w.condensate_kg_s, "condensate_L_h": w.condensate_L_h,
            "latent_duty_W": w.latent_duty_W, "sensible_duty_W": w.sensible_duty_W,
            "drained_kg_s": w.drained_kg_s, "carry_over_kg_s": w.carry_over_kg_s,
            "separator_outlet": point_dict(w.after, 0.0, mixture)}


#: coolant kinds whose flow is cooling water (a water or water–glycol circuit), not fan air
LIQUID_COOLANTS = ("water", "glycol")


def cooling_water_m3_s(coolers) -> float | None:
    """Cooling-water volume flow of the train, [m³/s]: the liquid coolants' flows at their inlets.

    ``coolers`` are CoolerResults (or None); None when no cooler has a water or glycol side.
    """
    sides = [c.exchanger.coolant for c in coolers if c is not None and c.exchanger is not None]
    flows = [s.volume_flow_m3_s for s in sides if s.kind in LIQUID_COOLANTS]
    return sum(flows) if flows else None


def exchanger_dict(cooler: CoolerResult) -> dict:
    """Sizing figures of a cooler's exchanger (None where no coolant side is given)."""
    ex = cooler.exchanger
    if ex is None:
        return {"arrangement": cooler.arrangement, "coolant_kind": None, "coolant_flow_kg_s": None,
                "coolant_volume_flow_m3_s": None, "cooling_water_m3_s": None, "coolant_inlet_temperature_K": None,
                "coolant_outlet_temperature_K": None, "lmtd_K": None, "lmtd_correction_factor": None,
                "mean_temperature_difference_K": None, "effectiveness": None, "ntu": None,
                "ua_W_K": None, "zones": []}
    c = ex.coolant
    return {"arrangement": ex.arrangement, "coolant_kind": c.kind, "coolant_flow_kg_s": c.flow_kg_s,
            "coolant_volume_flow_m3_s": c.volume_flow_m3_s,
            "cooling_water_m3_s": c.volume_flow_m3_s if c.kind in LIQUID_COOLANTS else None,
            "coolant_inlet_temperature_K": c.inlet_temperature_K,
            "coolant_outlet_temperature_K": c.outlet_temperature_K, "lmtd_K": ex.lmtd_K,
            "lmtd_correction_factor": ex.correction_factor,
            "mean_temperature_difference_K": ex.mean_temperature_difference_K,
            "effectiveness": ex.effectiveness, "ntu": ex.ntu, "ua_W_K": ex.ua_W_K,
            "zones": [{"kind": z.kind, "duty_W": z.duty_W, "hot_inlet_temperature_K": z.hot_inlet_temperature_K,
                       "hot_outlet_temperature_K": z.hot_outlet_temperature_K,
                       "coolant_inlet_temperature_K": z.coolant_inlet_temperature_K,
                       "coolant_outlet_temperature_K": z.coolant_outlet_temperature_K,
                       "capacity_ratio": z.capacity_ratio, "effectiveness": z.effectiveness, "ntu": z.ntu,
                       "lmtd_K": z.lmtd_K, "lmtd_correction_factor": z.correction_factor,
                       "log_mean_enthalpy_difference_J_kg": z.log_mean_enthalpy_difference_J_kg,
                       "ua_W_K": z.ua_W_K} for z in ex.zones]}


def _stage_dict(st: StageResult, cooler: CoolerResult | None, mixture=None) -> dict:
    return {
        "inlet": point_dict(st.inlet, st.inlet_velocity_m_s, mixture),
        "outlet": point_dict(st.outlet, st.exit_velocity_m_s, mixture),
        "pressure_ratio": st.pressure_ratio,
        "isentropic_discharge_temperature_K": st.isentropic_outlet.T,
        "gas_power_W": st.gas_power_W,
        "shaft_power_W": st.shaft_power_W,
        "mechanical_loss_W": st.mechanical_loss_W,
        "heat_loss_W": st.heat_loss_W,
        "heat_loss_exergy_W": st.heat_loss_exergy_W,
        "isentropic_efficiency": st.isentropic_efficiency,
        "polytropic_efficiency": st.polytropic_efficiency,
        "polytropic_exponent": st.polytropic_exponent,
        "entropy_generation_W_K": st.entropy_generation_W_K,
        "exergy_destroyed_W": st.exergy_destroyed_W,
        "path": _path(st.path, mixture),
        "cooler": None if cooler is None else {
            "inlet": point_dict(cooler.inlet, st.exit_velocity_m_s, mixture),
            "outlet": point_dict(cooler.outlet, 0.0, mixture),
            "duty_W": cooler.duty_W,
            "boundary_temperature_K": cooler.boundary_temperature_K,
            "heat_exergy_W": cooler.heat_exergy_W,
            "entropy_generation_W_K": cooler.entropy_generation_W_K,
            "exergy_destroyed_W": cooler.exergy_destroyed_W,
            "path": _path(cooler.path, mixture),
            **exchanger_dict(cooler),
            **_cooler_water(cooler, mixture),
        },
    }


@dataclass
class TrainResult:
    """All states, component balances and totals of one solved train (SI units)."""

    model: str
    eos_reference: str
    dead: DeadState
    mass_flow_kg_s: float
    free_air_delivery_m3_s: float
    normal_volume_flow_m3_s: float
    inlet: InletResult
    stages: list
    coolers: list  #: CoolerResult or None, one per stage
    delivery: Point
    delivery_velocity_m_s: float
    shaft_power_W: float
    driver_power_W: float
    specific_power_kW_per_m3_min: float
    heat_rejected_W: float
    entropy_generation_W_K: float
    exergy_destroyed_W: float
    heat_exergy_W: float
    exergy_gained_W: float
    isothermal_power_W: float
    isothermal_efficiency: float
    second_law_efficiency: float
    energy_residual: float
    exergy_residual: float
    warnings: list = field(default_factory=list)
    recovery: object = None  #: stagewright.core.heat_recovery.RecoveryResult when the project asks for heat recovery
    water: WaterResult | None = None  #: moist intake air only
    #: stagewright.core.part_load.figures.PackageFigures when the project has a ``package`` section (detailed solves)
    package: object = None

    def to_dict(self) -> dict:
        """Plain-data form (JSON-ready, no NaN: missing values are ``None``).

        ``mass_flow_kg_s`` is the dry-air mass flow (for a dry intake, the air mass flow).
        """
        mix = None if self.water is None else self.water.mixture
        d = {
            "model": self.model,
            "eos_reference": self.eos_reference,
            "ambient_temperature_K": self.dead.T0,
            "barometric_pressure_Pa": self.dead.P0,
            "mass_flow_kg_s": self.mass_flow_kg_s,
            "free_air_delivery_m3_s": self.free_air_delivery_m3_s,
            "normal_volume_flow_m3_s": self.normal_volume_flow_m3_s,
            "shaft_power_W": self.shaft_power_W,
            "driver_power_W": self.driver_power_W,
            "specific_power_kW_per_m3_min": self.specific_power_kW_per_m3_min,
            "heat_rejected_W": self.heat_rejected_W,
            "entropy_generation_W_K": self.entropy_generation_W_K,
            "exergy_destroyed_W": self.exergy_destroyed_W,
            "heat_exergy_W": self.heat_exergy_W,
            "exergy_gained_W": self.exergy_gained_W,
            "isothermal_power_W": self.isothermal_power_W,
            "isothermal_efficiency": self.isothermal_efficiency,
            "second_law_efficiency": self.second_law_efficiency,
            "energy_residual": self.energy_residual,
            "exergy_residual": self.exergy_residual,
            "intake": point_dict(self.inlet.ambient, 0.0, mix),
            "inlet_filter": {"outlet": point_dict(self.inlet.outlet, 0.0, mix),
                             "entropy_generation_W_K": self.inlet.entropy_generation_W_K,
                             "exergy_destroyed_W": self.inlet.exergy_destroyed_W},
            "delivery": point_dict(self.delivery, self.delivery_velocity_m_s, mix),
            "stages": [_stage_dict(s, c, mix) for s, c in zip(self.stages, self.coolers)],
            "cooling_water_m3_s": cooling_water_m3_s(self.coolers),
            "recoverable_heat_W": None if self.recovery is None else self.recovery.recoverable_heat_W,
            "heat_recovery": _recovery_dict(self.recovery),
            "package": None if self.package is None else self.package.to_dict(),
            "warnings": [w.to_dict() for w in self.warnings],
        }
        d.update(self._water_dict())
        return _finite(d)

    def _water_dict(self) -> dict:
        w = self.water
        if w is None:
            return {"humidity_formulation": None, "intake_humidity_ratio": 0.0, "intake_water_kg_s": 0.0,
                    "condensate_kg_s": 0.0, "condensate_L_h": 0.0, "condensate_exergy_W": 0.0,
                    "delivered_water_kg_s": 0.0, "delivered_liquid_kg_s": 0.0,
                    "delivered_pressure_dew_point_K": None, "delivered_atmospheric_dew_point_K": None,
                    "iso8573_humidity_class": "1", "water_balance_residual": 0.0}
        litres = sum((c.water.condensate_L_h for c in self.coolers if c is not None and c.water is not None), 0.0)
        return {"humidity_formulation": w.mixture.formulation, "intake_humidity_ratio": w.intake_humidity_ratio,
                "intake_water_kg_s": w.intake_water_kg_s, "condensate_kg_s": w.condensate_kg_s,
                "condensate_L_h": litres, "condensate_exergy_W": w.condensate_exergy_W,
                "delivered_water_kg_s": w.delivered_water_kg_s, "delivered_liquid_kg_s": w.delivered_liquid_kg_s,
                "delivered_pressure_dew_point_K": w.delivered_pressure_dew_point_K,
                "delivered_atmospheric_dew_point_K": w.delivered_atmospheric_dew_point_K,
                "iso8573_humidity_class": w.iso8573_humidity_class,
                "water_balance_residual": w.water_balance_residual}


def _recovery_dict(rec) -> dict | None:
    if rec is None:
        return None
    return {"delivery_temperature_K": rec.delivery_temperature_K,
            "source_temperature_K": rec.source_temperature_K,
            "coolers_W": list(rec.coolers_W), "casings_W": list(rec.casings_W),
            "recoverable_heat_W": rec.recoverable_heat_W,
            "share_of_driver_input": rec.share_of_driver_input,
            "operating_hours_per_year": rec.operating_hours_per_year,
            "heat_per_year_kWh": rec.heat_per_year_kWh,
            "fuel_saved_per_year_kWh": rec.fuel_saved_per_year_kWh,
            "value_per_year": rec.value_per_year}


def _finite(obj):
    """Replace any non-finite float by None so that JSON output never carries NaN."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {k: _finite(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [_finite(v) for v in obj]
    return obj
