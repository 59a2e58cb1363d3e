"""The model's units: factors from the units of an IFC file (or of one property) to core units.

IFC gives every measure in the unit the project's IfcUnitAssignment names for its kind, and in
the SI unit where it names none. An IfcPropertySingleValue may carry its own Unit. This module
turns both into factors onto the core units of :mod:`ifccheck.units`; it never assumes mm.
"""

from __future__ import annotations

import math

import ifcopenshell
import ifcopenshell.util.unit as ifc_unit

from ..errors import ModelReadError
from ..model import ModelUnits
from ..units import SI_TO_CORE

#: IFC unit type of each core kind (IfcUnitEnum / IfcDerivedUnitEnum)
UNIT_TYPES = {
    "length": "LENGTHUNIT",
    "area": "AREAUNIT",
    "section_modulus": "SECTIONMODULUSUNIT",
    "moment_of_inertia": "MOMENTOFINERTIAUNIT",
    "force": "FORCEUNIT",
    "linear_force": "LINEARFORCEUNIT",
    "planar_force": "PLANARFORCEUNIT",
    "stress": "PRESSUREUNIT",
    "mass_density": "MASSDENSITYUNIT",
}

#: dimensional exponents (length, mass, time, current, temperature, amount, luminous intensity)
#: of each kind, to check a property's own unit against the kind it must have
DIMENSIONS = {
    "length": (1, 0, 0, 0, 0, 0, 0),
    "linear_force": (0, 1, -2, 0, 0, 0, 0),
    "planar_force": (-1, 1, -2, 0, 0, 0, 0),
    "stress": (-1, 1, -2, 0, 0, 0, 0),
    "temperature": (0, 0, 0, 0, 1, 0, 0),
}

#: temperature unit names as understood by ifccheck.units.to_temperature_f
_SI_TEMPERATURE = {"KELVIN": "kelvin", "DEGREE_CELSIUS": "degC"}
_NAMED_TEMPERATURE = {"fahrenheit": "degF", "rankine": "degR", "celsius": "degC", "kelvin": "kelvin"}

_FOOT_M = 0.3048  # exact by definition of the international foot
_INCH_M = 0.0254  # exact by definition of the international inch


def model_units(model: ifcopenshell.file) -> ModelUnits:
    """The model's factor onto core units for each kind of UNIT_TYPES, its length name and system."""
    to_core = {kind: project_unit_to_si(model, unit_type) * SI_TO_CORE[kind] for kind, unit_type in UNIT_TYPES.items()}
    length_unit = assigned_unit(model, "LENGTHUNIT")
    name = unit_name(length_unit) if length_unit is not None else "metre"
    return ModelUnits(to_core=to_core, length_name=name, system=_system(name, project_unit_to_si(model, "LENGTHUNIT")))


def project_unit_to_si(model: ifcopenshell.file, unit_type: str) -> float:
    """Factor from the model's unit of ``unit_type`` to SI; 1 where the model assigns none (IFC's SI default).

    A derived kind such as SECTIONMODULUSUNIT that is not assigned is in m³, whatever the length unit.
    """
    unit = assigned_unit(model, unit_type)
    return 1.0 if unit is None else unit_to_si(unit)


def assigned_unit(model: ifcopenshell.file, unit_type: str):
    """The unit the project's IfcUnitAssignment gives for ``unit_type``, or None.

    Only a unit of that very type counts: a kN/m² PLANARFORCEUNIT does not make pressures kPa.
    """
    projects = model.by_type("IfcProject")
    assignment = projects[0].UnitsInContext if projects else None
    for unit in assignment.Units if assignment else ():
        if getattr(unit, "UnitType", None) == unit_type:
            return unit
    return None


def unit_to_si(unit: ifcopenshell.entity_instance) -> float:
    """Factor from one IFC unit to SI (kilogram for mass).

    ifcopenshell's scales count mass in grams (its GRAM base unit has scale 1); the kilogram is
    the SI unit, so every gram base unit is scaled by 1e-3 here.
    """
    if unit.is_a("IfcDerivedUnit"):
        return math.prod(unit_to_si(element.Unit) ** element.Exponent for element in unit.Elements)
    base = _base_si_unit(unit)
    in_grams = base.is_a("IfcSIUnit") and base.Name == "GRAM"
    return ifc_unit.get_named_unit_scale(unit) * (1e-3 if in_grams else 1.0)


def property_unit_to_core(unit: ifcopenshell.entity_instance, kind: str) -> float:
    """Factor from a property's own unit to core units of ``kind``; ModelReadError if it is not of that kind."""
    if tuple(ifc_unit.get_unit_dimensions(unit)) != DIMENSIONS[kind]:
        raise ModelReadError(f"its unit {unit_label(unit)} is not a {kind.replace('_', ' ')} unit")
    return unit_to_si(unit) * SI_TO_CORE[kind]


def model_temperature_unit(model: ifcopenshell.file) -> str:
    """The model's temperature unit as a name for ifccheck.units.to_temperature_f (kelvin when none)."""
    unit = assigned_unit(model, "THERMODYNAMICTEMPERATUREUNIT")
    return "kelvin" if unit is None else temperature_unit(unit)


def temperature_unit(unit: ifcopenshell.entity_instance) -> str:
    """Name of an IFC temperature unit for ifccheck.units.to_temperature_f; ModelReadError if unknown."""
    if tuple(ifc_unit.get_unit_dimensions(unit)) != DIMENSIONS["temperature"]:
        raise ModelReadError(f"its unit {unit_label(unit)} is not a temperature unit")
    if unit.is_a("IfcSIUnit"):
        return _SI_TEMPERATURE[unit.Name]
    name = (unit.Name or "").lower()
    for word, pint_name in _NAMED_TEMPERATURE.items():
        if word in name:
            return pint_name
    raise ModelReadError(f"temperature unit {unit_label(unit)} is not kelvin, Celsius, Fahrenheit or Rankine")


def unit_name(unit: ifcopenshell.entity_instance) -> str:
    """Readable name of a named unit, e.g. 'millimetre', 'foot'."""
    if unit.is_a("IfcSIUnit"):
        return ((unit.Prefix or "") + unit.Name).lower().replace("_", " ")
    return (getattr(unit, "Name", None) or "unnamed unit").lower()


def unit_label(unit: ifcopenshell.entity_instance) -> str:
    if unit.is_a("IfcDerivedUnit"):
        return f"'{unit.UserDefinedType or unit.UnitType}'"
    return f"'{unit_name(unit)}'"


def _base_si_unit(unit: ifcopenshell.entity_instance) -> ifcopenshell.entity_instance:
    while unit.is_a("IfcConversionBasedUnit"):
        unit = unit.ConversionFactor.UnitComponent
    return unit


def _system(length_name: str, length_to_m: float) -> str:
    imperial_name = any(word in length_name for word in ("foot", "feet", "inch"))
    imperial_scale = any(math.isclose(length_to_m, scale, rel_tol=1e-6) for scale in (_FOOT_M, _INCH_M))
    return "imperial" if imperial_name or imperial_scale else "metric"


def format_length(value_in: float, system: str) -> str:
    """A span for notes: feet for imperial models, metres for metric ones."""
    if system == "imperial":
        return f"{value_in / 12.0:.2f} ft"
    return f"{value_in * _INCH_M:.2f} m"


def format_section(width_in: float, depth_in: float, system: str) -> str:
    """A section b x d for notes: inches for imperial models, millimetres for metric ones."""
    scale, unit = (1.0, "in") if system == "imperial" else (_INCH_M * 1000.0, "mm")
    return f"{_short(width_in * scale)}x{_short(depth_in * scale)} {unit}"


def _short(value: float) -> str:
    return f"{value:.3f}".rstrip("0").rstrip(".")
