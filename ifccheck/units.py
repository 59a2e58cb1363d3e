"""The package's single pint unit registry and the core unit system.

Core unit system (used by every vectorised computation, documented here once):
    length: inch (in); force: pound-force (lbf); stress and modulus: psi (lbf/in^2);
    line load: lbf/in; area load: psi (lbf/in^2); temperature: degree Fahrenheit.
Readers convert model values into these units at the edge; writers convert back.
"""

from __future__ import annotations

import math

import pint

from .errors import UnitError

def _registry() -> pint.UnitRegistry:
    """The registry, with its parsed definitions cached between runs where a cache folder can be used."""
    try:
        return pint.UnitRegistry(cache_folder=":auto:")
    except OSError:
        return pint.UnitRegistry()


ureg = _registry()
ureg.define("plf = lbf / foot")
ureg.define("psf = lbf / foot ** 2")
ureg.define("klf = kip / foot")
ureg.define("ksf = kip / foot ** 2")
Q_ = ureg.Quantity

#: core units by physical kind
CORE = {
    "length": ureg.inch,
    "force": ureg.lbf,
    "stress": ureg.psi,
    "linear_force": ureg.lbf / ureg.inch,
    "planar_force": ureg.psi,
    "area": ureg.inch**2,
    "section_modulus": ureg.inch**3,
    "moment_of_inertia": ureg.inch**4,
    "mass_density": ureg.lb / ureg.inch**3,
}

#: SI unit of each kind (the IFC default when a model assigns none)
SI = {
    "length": ureg.meter,
    "force": ureg.newton,
    "stress": ureg.pascal,
    "linear_force": ureg.newton / ureg.meter,
    "planar_force": ureg.pascal,
    "area": ureg.meter**2,
    "section_modulus": ureg.meter**3,
    "moment_of_inertia": ureg.meter**4,
    "mass_density": ureg.kilogram / ureg.meter**3,
}

#: factor from SI to core for each kind: core = si * SI_TO_CORE[kind]
SI_TO_CORE = {kind: float((1 * SI[kind]).to(CORE[kind]).magnitude) for kind in CORE}


def parse_quantity(text: str, kind: str) -> float:
    """Parse a written quantity such as ``"40 psf"`` or ``"1.9 kPa"`` into core units.

    ``kind`` is one of the keys of :data:`CORE`. Raises :class:`UnitError` naming what was
    expected when the text has no unit or a unit of the wrong dimension.
    """
    try:
        q = Q_(str(text).strip())
    except Exception as exc:  # pint raises several unrelated types
        raise UnitError(f"cannot read {text!r} as a quantity; write a number and a unit, e.g. '40 psf'") from exc
    if not isinstance(q, pint.Quantity) or q.dimensionless:
        raise UnitError(f"{text!r} has no unit; write it with one, e.g. '40 psf' or '1.5 in'")
    try:
        value = float(q.to(CORE[kind]).magnitude)
    except pint.DimensionalityError as exc:
        raise UnitError(f"{text!r} is not a {kind.replace('_', ' ')}; expected units like {CORE[kind]:~}") from exc
    if not math.isfinite(value):
        raise UnitError(f"{text!r} is not a finite number")
    return value


def to_temperature_f(value: float, unit: str) -> float:
    """Convert a temperature in ``unit`` (pint name: kelvin, degC, degF) to degrees Fahrenheit."""
    return float(Q_(value, unit).to(ureg.degF).magnitude)


def parse_temperature_f(text: str) -> float:
    """Parse a written temperature such as ``"70 degF"`` or ``"38 degC"`` into degrees Fahrenheit."""
    parts = str(text).strip().split(maxsplit=1)
    try:
        value = float(parts[0])
        return to_temperature_f(value, parts[1])
    except (IndexError, ValueError, pint.errors.UndefinedUnitError) as exc:
        raise UnitError(f"cannot read {text!r} as a temperature; write it like '70 degF' or '21 degC'") from exc
