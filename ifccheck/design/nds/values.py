"""Reference design values of the NDS Supplement, looked up by species, grade, product and size.

Names found in a model ("DF-L #2", "Douglas fir-larch No. 2", "SPF No.2") are normalised through
the alias tables of rules/nds2018/. Sizes are in inches.
"""

from __future__ import annotations

import functools
import re
from dataclasses import dataclass

import numpy as np

from ...errors import DesignValueLookupError
from ...rules import read_table

#: a written size such as "2 x 10" is one token, so its digits are never read as a grade
_SIZE = re.compile(r"(\d+(?:\.\d+)?)\s*[x\u00d7*]\s*(\d+)")

#: tolerance when matching an actual dimension to a standard dressed size (inches), common practice
DRESSED_SIZE_TOLERANCE = 0.0625


def normalise(text: str) -> str:
    """Lowercase, runs of characters other than a-z and 0-9 become one space (the alias tables' form)."""
    return re.sub(r"[^a-z0-9]+", " ", str(text).lower()).strip()


@functools.lru_cache(maxsize=None)
def _aliases(kind: str) -> dict:
    table = read_table(f"nds2018/{kind}_aliases.csv")
    return dict(zip(table["alias"].map(normalise), table[kind]))


def _find_run(tokens: list, aliases: dict):
    """The longest alias found as a contiguous run of tokens: (canonical, start, end) or None."""
    for size in range(len(tokens), 0, -1):
        for start in range(len(tokens) - size + 1):
            alias = " ".join(tokens[start : start + size])
            if alias in aliases:
                return aliases[alias], start, start + size
    return None


@dataclass(frozen=True)
class Identification:
    species: str  # canonical species or "" when not found
    grade: str  # canonical grade or "" when not found
    species_from: str
    grade_from: str


def identify(texts: "list[tuple[str, str]]") -> Identification:
    """Find species and grade in labelled texts, first match wins, e.g.
    ``[("input Species", "DF-L"), ("input Grade", "#2"), ("material name", "DF-L No.2")]``."""
    species = grade = species_from = grade_from = ""
    for label, text in texts:
        if not text:
            continue
        tokens = normalise(_SIZE.sub(r"\1x\2", str(text).lower())).split()
        if not species:
            hit = _find_run(tokens, _aliases("species"))
            if hit:
                species, species_from = hit[0], label
                tokens = tokens[: hit[1]] + tokens[hit[2] :]
        if not grade:
            hit = _find_run(tokens, _aliases("grade"))
            if hit:
                grade, grade_from = hit[0], label
    if grade and not species:
        implied = _glulam_species(grade)
        if implied:
            species, species_from = implied, f"implied by grade {grade}"
    return Identification(species, grade, species_from, grade_from)


@functools.lru_cache(maxsize=None)
def _glulam_species(grade: str) -> str:
    rows = _reference()
    rows = rows[(rows["grade"] == grade) & (rows["product"] == "glulam")]
    return str(rows["species"].iloc[0]) if len(rows) else ""


@functools.lru_cache(maxsize=None)
def _reference():
    return read_table("nds2018/reference_values.csv").astype({"nominal_depth": str})


def is_glulam_grade(grade: str) -> bool:
    return bool(_glulam_species(grade))


@functools.lru_cache(maxsize=None)
def _dressed_sizes(applies_to: str) -> tuple:
    table = read_table("nds2018/nominal_sizes.csv")
    table = table[table["applies_to"] == applies_to]
    return tuple(zip(table["nominal"].astype(float), table["dressed_in"].astype(float)))


@functools.lru_cache(maxsize=4096)
def nominal_size(actual: float) -> "tuple[float, bool]":
    """Nominal size (in) of a dressed dimension, and whether it matched a standard size exactly.

    Dimension-lumber sizes are tried first, then timber sizes; a non-standard dimension takes the
    smallest nominal whose dressed size is not smaller (so size factors stay on the safe side of
    the band), flagged as not matched.
    """
    for applies_to in ("dimension", "timber"):
        for nominal, dressed in _dressed_sizes(applies_to):
            if abs(actual - dressed) <= DRESSED_SIZE_TOLERANCE:
                return nominal, True
    sizes = sorted(_dressed_sizes("dimension") + _dressed_sizes("timber"), key=lambda s: s[1])
    for nominal, dressed in sizes:
        if dressed >= actual:
            return nominal, False
    return float(np.ceil(actual + 0.5)), False


def product_of(nominal_thickness: float, nominal_width: float, grade: str) -> str:
    """NDS Supplement 2018, Section 4 size classifications: which table a sawn member belongs to."""
    if is_glulam_grade(grade):
        return "glulam"
    if nominal_thickness <= 4:
        return "dimension"  # 2" to 4" thick
    if nominal_width > nominal_thickness + 2:
        return "beams_stringers"  # 5" and thicker, width more than 2" greater than thickness
    return "posts_timbers"


@functools.lru_cache(maxsize=4096)
def reference_values(species: str, grade: str, product: str, nominal_width: float) -> dict:
    """The reference design values row (psi) for species, grade, product and nominal width.

    Raises DesignValueLookupError naming what is missing when the rules have no such row.
    """
    rows = _reference()
    rows = rows[(rows["grade"] == grade) & (rows["product"] == product) & rows["species"].isin([species, "*"])]
    if rows.empty:
        raise DesignValueLookupError(
            f"no NDS reference values for {species or 'unknown species'} {grade or 'unknown grade'} "
            f"({product.replace('_', ' ')}) in rules/nds2018/reference_values.csv"
        )
    sized = rows[rows["nominal_depth"].isin(["*", str(int(nominal_width))])]
    if sized.empty:
        raise DesignValueLookupError(
            f"no NDS reference values for {species} {grade} at nominal width {int(nominal_width)} in "
            "(size-specific table); add the row to rules/nds2018/reference_values.csv"
        )
    return sized.iloc[0].to_dict()  # callers must not change it: the result is cached
