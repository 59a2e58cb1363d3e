"""Which members are timber: the material of an element, and its kind from words and grade patterns.

The words (rules/materials/material_words.csv) and strength-class patterns
(rules/materials/strength_class_patterns.csv) are data. Any timber word or pattern, or a
Pset_MaterialWood on the material, makes a material timber; a non-timber word or pattern makes it
non-timber only when nothing says timber; otherwise its kind stays unknown.
"""

from __future__ import annotations

import functools
import re
from dataclasses import dataclass, replace
from typing import Iterable, Optional

import ifcopenshell
import ifcopenshell.util.element as ifc_element

from ..model import MaterialInfo
from ..rules import read_table

TIMBER = "timber"
WOOD_PSET = "Pset_MaterialWood"

#: a word this long or longer also matches as the end of a compound of at least _MIN_COMPOUND_HEAD
#: more letters ("Nadelholz", but not "alpine") or with an ending of up to _MAX_ENDING letters
#: ("timbers"); shorter words ("tre", "fir") match whole only
_MIN_AFFIX_WORD = 4
_MIN_COMPOUND_HEAD = 3
_MAX_ENDING = 3
_PART_SEPARATORS = re.compile(r"[\s,;]+")


@dataclass(frozen=True)
class MaterialKind:
    """The verdict on one material: ``kind`` is "timber", "non_timber" or "unknown"."""

    kind: str = "unknown"
    material_kind: str = ""  # timber, steel, concrete, masonry, aluminium, glass, plastic, other
    matched: str = ""  # the word or pattern that decided


UNKNOWN = MaterialKind()


@dataclass(frozen=True)
class _Word:
    tokens: tuple
    kind: str
    text: str


@dataclass(frozen=True)
class _Pattern:
    regex: re.Pattern
    kind: str
    text: str


@functools.lru_cache(maxsize=None)
def _words() -> tuple:
    table = read_table("materials/material_words.csv")
    return tuple(_Word(tuple(_tokens(w)), k, w) for w, k in zip(table["word"], table["kind"]))


@functools.lru_cache(maxsize=None)
def _patterns() -> tuple:
    table = read_table("materials/strength_class_patterns.csv")
    return tuple(_Pattern(re.compile(p, re.IGNORECASE), k, p) for p, k in zip(table["pattern"], table["kind"]))


def _tokens(text: str) -> list:
    return re.findall(r"[^\W_]+", text.casefold())


def _token_matches(word: str, token: str) -> bool:
    if token == word:
        return True
    if len(word) < _MIN_AFFIX_WORD:
        return False
    extra = len(token) - len(word)
    return (token.endswith(word) and extra >= _MIN_COMPOUND_HEAD) or (token.startswith(word) and extra <= _MAX_ENDING)


def _word_in(word: _Word, tokens: list) -> bool:
    n = len(word.tokens)
    if n == 1:
        return any(_token_matches(word.tokens[0], token) for token in tokens)
    return any(tuple(tokens[i : i + n]) == word.tokens for i in range(len(tokens) - n + 1))


def _pattern_in(pattern: _Pattern, text: str) -> bool:
    stripped = text.strip()
    parts = [stripped, *_PART_SEPARATORS.split(stripped)]
    return any(part and pattern.regex.search(part) for part in parts)


def classify_texts(words_in: Iterable[str], grades: Iterable[str] = (), wood_pset: bool = False) -> MaterialKind:
    """Kind of a material from texts searched for words (name, category, species) and grade texts.

    Every text is also matched against the strength-class patterns.
    """
    word_texts = [t for t in words_in if t]
    all_texts = word_texts + [g for g in grades if g]
    if wood_pset:
        return MaterialKind("timber", TIMBER, WOOD_PSET)
    tokens = [_tokens(text) for text in word_texts]
    words = sorted((w for w in _words() if any(_word_in(w, t) for t in tokens)), key=lambda w: -len(w.text))
    patterns = [p for p in _patterns() if any(_pattern_in(p, text) for text in all_texts)]
    for found in (*words, *patterns):
        if found.kind == TIMBER:
            return MaterialKind("timber", TIMBER, found.text)
    for found in (*words, *patterns):
        return MaterialKind("non_timber", found.kind, found.text)
    return UNKNOWN


def materials_of(definition: Optional[ifcopenshell.entity_instance]) -> list:
    """The IfcMaterial entities of a material definition: a material, list, set, set usage or set item."""
    if definition is None:
        return []
    if definition.is_a("IfcMaterial"):
        return [definition]
    if definition.is_a("IfcMaterialLayerSetUsage") or definition.is_a("IfcMaterialProfileSetUsage"):
        return materials_of(_set_of_usage(definition))
    items = (
        getattr(definition, "Materials", None)  # IfcMaterialList
        or getattr(definition, "MaterialLayers", None)
        or getattr(definition, "MaterialProfiles", None)
        or getattr(definition, "MaterialConstituents", None)
    )
    if items is not None:
        return [m for item in items for m in materials_of(item)]
    return materials_of(getattr(definition, "Material", None))  # a layer, profile or constituent


class MaterialReader:
    """Classifies material definitions, each set and each material once."""

    def __init__(self) -> None:
        self._by_definition: dict = {}
        self._by_material: dict = {}

    def read(self, definition, source: str) -> tuple:
        """(MaterialInfo, MaterialKind) of a material definition found on the ``source`` ("occurrence" or "type")."""
        shared = _set_of_usage(definition)  # a usage belongs to one occurrence; its set is shared
        key = (shared.id(), source)
        if key not in self._by_definition:
            info, kind = self._classify_definition(shared)
            self._by_definition[key] = replace(info, source=source), kind
        return self._by_definition[key]

    def _classify_definition(self, definition) -> tuple:
        """(MaterialInfo, MaterialKind) of the material that decides: the first timber, else non-timber one.

        When none decides, the info names all the materials of the definition.
        """
        verdicts = [self._classify_material(material) for material in materials_of(definition)]
        if not verdicts:
            return MaterialInfo(name=definition.is_a()), UNKNOWN
        for wanted in ("timber", "non_timber"):
            for info, kind in verdicts:
                if kind.kind == wanted:
                    return info, kind
        names = ", ".join(dict.fromkeys(info.name for info, _ in verdicts))
        return replace(verdicts[0][0], name=names), UNKNOWN

    def _classify_material(self, material) -> tuple:
        key = material.id()
        if key not in self._by_material:
            self._by_material[key] = _classify_material(material)
        return self._by_material[key]


def _set_of_usage(definition):
    if definition.is_a("IfcMaterialLayerSetUsage"):
        return definition.ForLayerSet
    if definition.is_a("IfcMaterialProfileSetUsage"):
        return definition.ForProfileSet
    return definition


def _classify_material(material) -> tuple:
    name = material.Name or ""
    category = getattr(material, "Category", None) or ""  # IFC4 and later
    wood = _material_psets(material).get(WOOD_PSET)
    species = _text(wood, "Species")
    grade = _text(wood, "StrengthGrade")
    kind = classify_texts([name, category, species], [grade], wood_pset=wood is not None)
    info = MaterialInfo(name=name, category=category, species=species, grade=grade, kind=kind.kind, matched=kind.matched)
    return info, kind


def _material_psets(material) -> dict:
    if not hasattr(material, "HasProperties"):  # IFC2X3 materials carry no property sets
        return {}
    return ifc_element.get_psets(material)


def _text(pset: Optional[dict], name: str) -> str:
    value = (pset or {}).get(name)
    return str(value).strip() if value is not None else ""
