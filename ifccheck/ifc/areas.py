"""What a project rule may name a slab, roof or space by, and what a slab is made of.

A project rules file puts area loads on slabs (``slab = "..."``) and on spaces by their usage
(``space_usage = "..."``). This module reads the texts such a rule is matched against (the
element's tags) and, for slabs and roofs, the material layers whose weight the design code may
add to the dead load. Read once per slab or space: there are few of them beside the members.
"""

from __future__ import annotations

import ifcopenshell
import ifcopenshell.util.classification as ifc_classification
import ifcopenshell.util.element as ifc_element

#: property set values that say what a space is used for (IFC4 and IFC2X3 names)
_SPACE_USAGE_PROPS = (
    ("Pset_SpaceOccupancyRequirements", "OccupancyType"),
    ("Pset_SpaceCommon", "Category"),
    ("Pset_SpaceCommon", "OccupancyType"),
)


def element_tags(element: ifcopenshell.entity_instance) -> tuple:
    """Texts that name an element for a project rule: its Name, ObjectType, LongName, predefined
    type (other than NOTDEFINED and USERDEFINED), its type's Name, its classification references'
    Identification and Name, and for a space its occupancy from the property sets. Distinct, in
    that order, blanks left out."""
    texts = [getattr(element, name, None) for name in ("Name", "ObjectType", "LongName")]
    predefined = getattr(element, "PredefinedType", None)
    if predefined not in ("NOTDEFINED", "USERDEFINED"):
        texts.append(predefined)
    element_type = ifc_element.get_type(element)
    if element_type is not None:
        texts.append(element_type.Name)
    for reference in ifc_classification.get_references(element):
        texts += [_identification(reference), getattr(reference, "Name", None)]
    if element.is_a("IfcSpace"):
        psets = ifc_element.get_psets(element)
        texts += [psets.get(pset, {}).get(prop) for pset, prop in _SPACE_USAGE_PROPS]
    return tuple(dict.fromkeys(str(t).strip() for t in texts if t is not None and str(t).strip()))


def _identification(reference) -> "str | None":
    """IFC4 Identification, IFC2X3 ItemReference."""
    return getattr(reference, "Identification", None) or getattr(reference, "ItemReference", None)


def slab_layers(element: ifcopenshell.entity_instance, to_inch: float, box_height: float) -> tuple:
    """((material text, thickness in), ...) of a slab or roof, bottom to top, and where they came
    from. A material layer set gives its layers (thickness in the model's length unit times
    ``to_inch``); a single material takes the element's box height ``box_height`` (inches) as its
    thickness; anything else gives no layers and says why."""
    material = ifc_element.get_material(element, should_skip_usage=True)
    if material is None:
        return (), "no material associated"
    if material.is_a("IfcMaterialLayerSet"):
        layers = tuple(
            (_material_text(layer.Material), float(layer.LayerThickness) * to_inch)
            for layer in material.MaterialLayers or ()
        )
        return layers, "material layer set"
    if material.is_a("IfcMaterial"):
        return ((_material_text(material), box_height),), "material, thickness from the element's box height"
    return (), f"material given as {material.is_a()} (neither layers nor one material)"


def _material_text(material) -> str:
    """A material's Name and Category (IFC4) once each ignoring case, e.g. "C25/30 Concrete"; "" for none."""
    if material is None:
        return ""
    parts = [str(p).strip() for p in (material.Name, getattr(material, "Category", None)) if p]
    distinct = {p.casefold(): p for p in reversed(parts)}  # the first spelling of each, ignoring case
    return " ".join(distinct[key] for key in dict.fromkeys(p.casefold() for p in parts))
