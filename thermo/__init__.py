"""Stagewright calculation core: compression trains with first- and second-law balances.

Pure Python on numpy, scipy and CoolProp; it never imports Qt.

``solve`` is imported on first use: importing the package, or a light part of it such as
:mod:`stagewright.core.errors` or :mod:`stagewright.core.project` (what ``stagewright check`` reads), does not load
CoolProp (about 1.5 s).
"""
import sys as _sys
import types as _types

from stagewright.core.errors import InputError, PropertyRangeError, SecondLawViolation, StagewrightError

__all__ = ["solve", "StagewrightError", "InputError", "SecondLawViolation", "PropertyRangeError"]
__version__ = "0.1.0"


class _Package(_types.ModuleType):
    """This package's module type: its ``solve`` attribute is the function :func:`stagewright.core.solve.solve`,
    imported when first read.

    A module-level ``__getattr__`` would not do: importing the submodule of the same name binds the
    module to the package's attribute, and ``stagewright.core.solve`` would then be a module. Here a binding
    of that submodule is ignored, and any other value (a test's stand-in) is kept."""

    @property
    def solve(self):
        replaced = self.__dict__.get("_solve_replaced")
        if replaced is not None:
            return replaced
        from .solve import solve
        return solve

    @solve.setter
    def solve(self, value) -> None:
        if not isinstance(value, _types.ModuleType):
            self.__dict__["_solve_replaced"] = value


_sys.modules[__name__].__class__ = _Package
