"""Display units of reports: the project's unit system (imperial or metric), from core units."""

from __future__ import annotations

from ..units import CORE, ureg

#: per system: kind -> (unit suffix used in column names, pint unit)
DISPLAY = {
    "imperial": {
        "length": ("ft", ureg.foot),
        "force": ("lbf", ureg.lbf),
        "linear_force": ("plf", ureg.lbf / ureg.foot),
        "area": ("in2", ureg.inch**2),
        "section_modulus": ("in3", ureg.inch**3),
        "moment_of_inertia": ("in4", ureg.inch**4),
    },
    "metric": {
        "length": ("m", ureg.meter),
        "force": ("kN", ureg.kilonewton),
        "linear_force": ("kN_per_m", ureg.kilonewton / ureg.meter),
        "area": ("cm2", ureg.centimeter**2),
        "section_modulus": ("cm3", ureg.centimeter**3),
        "moment_of_inertia": ("cm4", ureg.centimeter**4),
    },
}


def report_system(units, rules: dict) -> str:
    """'imperial' or 'metric': the rules' report_units, or the model's own system when 'auto'."""
    choice = rules["defaults"]["report_units"]
    return units.system if choice == "auto" else choice


def factor(system: str, kind: str) -> "tuple[str, float]":
    """(suffix, factor) so that display value = core value * factor."""
    suffix, unit = DISPLAY[system][kind]
    return suffix, float((1 * CORE[kind]).to(unit).magnitude)
