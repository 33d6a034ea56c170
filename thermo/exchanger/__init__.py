"""Heat-exchanger side of the coolers: coolant stream, ε-NTU, LMTD, sizing and rating."""
from thermo.exchanger.coolant import COOLANTS, CoolantSide, coolant_side, make_coolant
from thermo.exchanger.effectiveness import ARRANGEMENTS, effectiveness, max_effectiveness, ntu_from_effectiveness
from thermo.exchanger.lmtd import correction_factor, counterflow_lmtd, log_mean
from thermo.exchanger.rating import rate_exchanger
from thermo.exchanger.sizing import Exchanger, HotSide, Infeasible, Zone, size_exchanger

__all__ = ["COOLANTS", "CoolantSide", "coolant_side", "make_coolant", "ARRANGEMENTS", "effectiveness",
           "max_effectiveness", "ntu_from_effectiveness", "correction_factor", "counterflow_lmtd",
           "log_mean", "rate_exchanger", "Exchanger", "HotSide", "Infeasible", "Zone", "size_exchanger"]
