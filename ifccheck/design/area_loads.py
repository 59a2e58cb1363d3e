"""Line loads from the project rules' area loads: by the spaces and slabs over a member, else by
its storey, times its tributary width; and the weight of the slab over it when the rules say the
area dead loads exclude it.

Which entries act (per load type, the most specific place that gives that type wins):
1. ``space_usage`` entries matching a space over the member (see :mod:`.places`);
2. ``slab`` entries matching a slab or roof over it;
3. ``storey`` entries naming its storey.
Several entries matching one place add; of several places over the member, the one giving the
largest load governs over its whole length (conservative, common practice for a member under two
rooms). A rule's text matches a place when it equals one of the place's tags (name, object type,
type name, classification, occupancy; see ifccheck.ifc.areas) ignoring case; ``*`` and ``?``
match any text and any one character ("Bed*"). Core units: inch, lbf, psi, lbf/in.
"""

from __future__ import annotations

import functools
import re
from fnmatch import fnmatchcase

import numpy as np

from ..errors import RulesError
from ..model import LOAD_TYPES
from ..rules import read_table
from ..units import ureg

#: the project rules' area load keys and the load types they give
AREA_LOAD_TYPES = {"dead": "D", "live": "L", "roof_live": "Lr", "snow": "S"}
#: selectors from the most to the least specific, with the kind of place each names
_PLACE_SELECTORS = (("space_usage", "spaces"), ("slab", "slabs"))


def project_area_loads(record, entries: list, tributary: "tuple[float, str]", places=None) -> tuple:
    """(loads lbf/in by load type, sources, problems) of the project's area loads on a member.

    ``record`` needs ``storey``; ``tributary`` is (width in, where it came from); ``places`` the
    member's :class:`~.places.PlacesOver` (None: no geometry searched).
    """
    loads = {t: 0.0 for t in LOAD_TYPES}
    chosen = _chosen_entries(record.storey, entries, places)
    if not chosen:
        return loads, [], []
    width, where = tributary
    labels = "; ".join(dict.fromkeys(text for _, _, text in chosen.values()))
    if not np.isfinite(width):
        return loads, [], [f"area loads of {labels} apply but the member has no tributary width "
                           "(no parallel neighbours found; give TributaryWidth)"]
    for key, (psi, _, _) in chosen.items():
        loads[AREA_LOAD_TYPES[key]] += psi * width
    by_text: dict = {}
    for key, (_, _, text) in chosen.items():
        by_text.setdefault(text, []).append(AREA_LOAD_TYPES[key])
    sources = [f"{text} ({', '.join(types)}) x {where}" for text, types in by_text.items()]
    return loads, sources, []


def _chosen_entries(storey: str, entries: list, places) -> dict:
    """Area load key -> (psi, entries, text naming them and their place) for each load type some entry gives."""
    chosen = {}
    for key in AREA_LOAD_TYPES:
        found = _most_specific(key, entries, places) or _by_storey(key, storey, entries)
        if found is not None:
            chosen[key] = found
    return chosen


def _most_specific(key: str, entries: list, places) -> "tuple | None":
    """The largest load of type ``key`` over the spaces over the member, else over its slabs."""
    if places is None:
        return None
    for selector, attribute in _PLACE_SELECTORS:
        best = None
        for place, _share in getattr(places, attribute):
            matching = [e for e in entries if selector in e and key in e["given"] and names_place(e[selector], place.tags)]
            if matching:
                psi = sum(e[key] for e in matching)
                if best is None or psi > best[0]:
                    text = f"{' + '.join(e['label'] for e in matching)} on {place.ifc_class} '{place.name or place.global_id}'"
                    best = (psi, matching, text)
        if best is not None:
            return best
    return None


def _by_storey(key: str, storey: str, entries: list) -> "tuple | None":
    matching = [e for e in entries if e.get("storey") is not None and e["storey"] == storey and key in e["given"]]
    if not matching:
        return None
    return sum(e[key] for e in matching), matching, " + ".join(e["label"] for e in matching)


def names_place(pattern: str, tags: tuple) -> bool:
    """Whether a rule's text names a place with these tags: equal ignoring case, ``*`` and ``?`` as wildcards."""
    wanted = pattern.strip().casefold()
    return any(fnmatchcase(tag.casefold(), wanted) for tag in tags)


# --- the slab's own weight --------------------------------------------------------------------


@functools.lru_cache(maxsize=None)
def unit_weights() -> tuple:
    """((words, unit weight lbf/in^3, source), ...) of rules/materials/densities.csv, longest entry first."""
    table = read_table("materials/densities.csv")
    rows = []
    for row in table.itertuples(index=False):
        try:
            quantity = ureg.Quantity(float(row.unit_weight), row.unit)
            if quantity.check("[mass] / [volume]"):
                quantity = quantity * ureg.Quantity(1.0, "standard_gravity")
            weight = quantity.to("lbf / inch ** 3").magnitude
        except Exception as exc:  # noqa: BLE001 - any pint failure means the row is wrong
            raise RulesError(f"rules table materials/densities.csv, entry {row.word!r}: {exc}; fix the CSV") from exc
        rows.append((tuple(str(row.word).casefold().split()), weight, f"{row.source} ({row.status})"))
    return tuple(sorted(rows, key=lambda r: -len(" ".join(r[0]))))


def _unit_weight(material: str) -> "tuple | None":
    """(lbf/in^3, source) of the longest entry whose words begin words of the material text, in order."""
    words = re.findall(r"[^\W_]+", material.casefold())
    for entry, weight, source in unit_weights():
        for start in range(len(words) - len(entry) + 1):
            if all(words[start + i].startswith(w) for i, w in enumerate(entry)):
                return weight, source
    return None


def slab_weight(slab) -> "tuple[float, str, str]":
    """(psi, how it was found, problem) of a slab's own weight from its layers: the sum of each
    layer's unit weight (rules/materials/densities.csv) times its thickness. The problem names
    what is missing when a layer's material or the layers are unknown ("" when none)."""
    label = f"{slab.ifc_class} '{slab.name or slab.global_id}'"
    if not slab.layers:
        return np.nan, "", f"the weight of {label} is unknown: {slab.layers_source or 'no material layers read'}"
    psi, parts = 0.0, []
    for material, thickness in slab.layers:
        found = _unit_weight(material)
        if found is None or not np.isfinite(thickness):
            return np.nan, "", (f"the weight of {label} is unknown: its material {material or '(unnamed)'!r} has no "
                                "unit weight in rules/materials/densities.csv; add a row or include the slab in the dead load")
        weight, source = found
        psi += weight * thickness
        parts.append(f"{material} {thickness:.2f} in x {weight * 1728:.1f} lbf/ft3 [{source}]")
    return psi, f"weight of {label} {psi * 144:.1f} psf ({'; '.join(parts)}; {slab.layers_source})", ""
