"""Design inputs per member: loads, bearing, service conditions and bracing, with the defaults used.

Turns the reader's :class:`~ifccheck.model.MemberRecord` list into one table (a DataFrame, core
units: inch, lbf, lbf/in, degF) that any design basis can check. Each value records whether it
came from the model or from a default, so the verdict can name every assumption.
"""

from __future__ import annotations

import functools
import math
import operator
from collections import Counter
from dataclasses import replace

import numpy as np
import pandas as pd

from ..model import AREA_LOAD_PROPS, LINE_LOAD_PROPS, LOAD_TYPES, AnalysisInput, MemberRecord
from ..rules import member_use as rules_member_use
from ..units import parse_quantity, parse_temperature_f
from .area_loads import project_area_loads, slab_weight
from .framing import tributary_widths
from .places import SLAB_KINDS, SPACE_KINDS, edge_overhangs, places_over
from .supports import POST_KINDS, braced_by_slab, find_supports, posts_on_members

LOAD_COLUMNS = [f"w_{t}" for t in LOAD_TYPES]
_BY_LOAD_TYPE = operator.itemgetter(*LOAD_TYPES)  # a loads dict's values in LOAD_TYPES order


def _section_text(section) -> str:
    if section is None:
        return ""
    ply = f"{section.plies}-ply " if section.plies > 1 else ""
    return f"{ply}{section.ply_width:.3g}x{section.depth:.3g} in"


def superimposed_loads(record: MemberRecord, tributary: "tuple[float, str]") -> "tuple[dict, list, list]":
    """Line loads by type (lbf/in, per horizontal length) from the input property set.

    Line loads and area loads × tributary width add; ``tributary`` is (width in inches, where it
    came from), the input's TributaryWidth or the framing run's. Returns (loads, sources, problems).
    """
    loads = dict.fromkeys(LOAD_TYPES, 0.0)
    sources, problems = [], []
    inputs = record.inputs
    for prop, load_type in LINE_LOAD_PROPS.items():
        if prop in inputs:
            loads[load_type] += inputs[prop]
            sources.append(_line_source(prop, record.input_sources.get(prop, "occurrence")))
    area = [(p, t) for p, t in AREA_LOAD_PROPS.items() if p in inputs]
    if area:
        width, where = tributary
        if not np.isfinite(width):
            problems.append("area loads given but no tributary width (no TributaryWidth, no parallel neighbours)")
        else:
            for prop, load_type in area:
                loads[load_type] += inputs[prop] * width
                sources.append(f"{prop} x {where}")
    return loads, sources, problems


@functools.lru_cache(maxsize=None)
def _line_source(prop: str, where: str) -> str:
    """"DeadLoad (type)": a line load of the input property set and where it was found."""
    return f"{prop} ({where})"


def _placed(records: "list[MemberRecord]") -> list:
    """Positions of the records whose axis and section are known (their geometry can be searched)."""
    return [k for k, r in enumerate(records) if r.axis_start is not None and r.axis_end is not None and r.section]


def framing_runs(records: "list[MemberRecord]", places: "dict | None" = None, elements: "list | None" = None,
                 tolerance: float = 1.0) -> dict:
    """Framing runs (see :mod:`.framing`) of the members whose axis and section are known: record
    position -> (tributary width in, run size, repetitive, note). ``places`` (record position ->
    PlacesOver) gives the slab over each member: an edge member's overhang reaches its edge, or
    halfway to a wall or beam under it beside the member (``elements``, see places.edge_overhangs)."""
    known = _placed(records)
    if not known:
        return {}
    places = places or {}
    edge_notes = {}

    def overhang(rows, mids, outward):
        positions = [known[row] for row in rows.tolist()]
        slabs = [places[k].slabs[0][0] if k in places and places[k].slabs else None for k in positions]
        mids3 = [(*mid, (np.add(records[k].axis_start, records[k].axis_end) / 2)[2]) for k, mid in zip(positions, mids)]
        found, notes = edge_overhangs([records[k].global_id for k in positions], np.array(mids3),
                                      [records[k].section.depth for k in positions], outward, slabs,
                                      elements or [], tolerance)
        edge_notes.update(zip(positions, notes))
        return found

    runs = tributary_widths(
        np.array([records[k].axis_start for k in known]), np.array([records[k].axis_end for k in known]),
        np.array([records[k].section.width for k in known]), [records[k].storey for k in known],
        names=[records[k].name or records[k].global_id for k in known], edge_overhang=overhang,
    )
    notes = [note.replace(" (edge of a run", f" ({edge_notes[k]}; edge of a run", 1) if edge_notes.get(k) else note
             for k, note in zip(known, runs["note"].tolist())]
    return dict(zip(known, zip(runs["tributary_width"].tolist(), runs["run_size"].tolist(),
                               runs["repetitive"].tolist(), notes)))


def _tributary(record: MemberRecord, run) -> "tuple[float, str]":
    """The input's TributaryWidth wins over the framing run's half spacings."""
    if "TributaryWidth" in record.inputs:
        return record.inputs["TributaryWidth"], "TributaryWidth"
    if run is not None and np.isfinite(run[0]):
        return float(run[0]), f"tributary width {run[0]:.1f} in (framing run)"
    return np.nan, ""


def _default_bearing_used(analysis) -> bool:
    """Whether some support takes the default bearing length (its width is not known from the model)."""
    return analysis is None or any(not np.isfinite(s.width) for s in analysis.supports)


def _flag(record, name, default, label, defaults_used):
    """The input property's value, else the default, named in ``defaults_used`` (unless no label)."""
    if name in record.inputs:
        return record.inputs[name]
    if label:
        defaults_used.append(label)
    return default


def _bracing(record, braced_type: bool, ptype: str, defaults_used: list, slab: str = "") -> bool:
    """Whether the compression edge is held along the length: the input says, or an UnbracedLength
    implies not, or a slab or roof found on the member's top holds it, or the member type's default
    (sheathing on joists and rafters) applies."""
    if "ContinuouslyBraced" in record.inputs:
        return bool(record.inputs["ContinuouslyBraced"])
    if "UnbracedLength" in record.inputs:
        return False
    if slab:
        defaults_used.append(f"top edge braced by the slab or roof on it ({slab})")
        return True
    state = "braced by sheathing" if braced_type else "unbraced over the span"
    defaults_used.append(f"compression edge {state} ({ptype} default)")
    return braced_type


def geometry_supports(records: "list[MemberRecord]", elements: list, rules: dict) -> dict:
    """Supports and top-edge bracing found in the geometry for members without analysis data:
    record position -> (AnalysisInput, bracing slab GlobalId or ""). Empty when the rules say
    never, or (auto) when the model has no wall, column or footing to bear on."""
    d = rules["defaults"]
    mode = d["supports_from_geometry"]
    bearing_kinds = {"wall", "column", "footing"}
    if mode == "never" or (mode == "auto" and not any(e.kind in bearing_kinds for e in elements)):
        return {}
    known = [k for k, r in enumerate(records)
             if r.analysis is None and r.axis_start is not None and r.axis_end is not None and r.section]
    if not known:
        return {}
    guids = [records[k].global_id for k in known]
    starts = np.array([records[k].axis_start for k in known], dtype=float)
    ends = np.array([records[k].axis_end for k in known], dtype=float)
    depths = np.array([records[k].section.depth for k in known])
    axes = {r.global_id: (r.axis_start, r.axis_end) for r in records if r.axis_start is not None}
    tolerance = parse_quantity(d["support_tolerance"], "length")
    found = find_supports(guids, starts, ends, depths, elements, tolerance=tolerance, member_axes=axes,
                          overhang_ratio=float(d["overhang_ratio"]))
    if any(e.kind in POST_KINDS for e in elements):
        posts = posts_on_members(guids, starts, ends, depths, elements, tolerance)
        names = {r.global_id: r.name or r.global_id for r in records}
        found = [_through_posts(m, posts, guid, names) for m, guid in zip(found, guids)]
    slabs = braced_by_slab(guids, starts, ends, depths, elements, tolerance=tolerance)
    plan = np.hypot(*(ends - starts)[:, :2].T)
    named = {e.global_id: f"{e.ifc_class} '{e.name or e.global_id}'" for e in elements}
    out = {}
    for k, member_supports, slab, length in zip(known, found, slabs, plan):
        notes = [f"support at {s.x:.1f} in: {s.source}" for s in member_supports.supports]
        out[k] = (AnalysisInput(length=float(length), supports=list(member_supports.supports), loads=[],
                                notes=notes, problems=list(member_supports.problems)), named.get(slab, slab))
    return out


def members_places(records: "list[MemberRecord]", elements: list, rules: dict) -> dict:
    """The slabs and spaces over each member whose axis and section are known (record position ->
    PlacesOver); empty when the model gave no slab, roof or space."""
    if not any(e.kind in SLAB_KINDS + SPACE_KINDS for e in elements):
        return {}
    known = _placed(records)
    if not known:
        return {}
    found = places_over(
        [records[k].global_id for k in known],
        np.array([records[k].axis_start for k in known], dtype=float),
        np.array([records[k].axis_end for k in known], dtype=float),
        np.array([records[k].section.depth for k in known]), elements,
        tolerance=parse_quantity(rules["defaults"]["support_tolerance"], "length"),
    )
    return dict(zip(known, found))


def add_slab_weight(loads: dict, sources: list, places, width: float) -> str:
    """Add the weight of the slab covering most of the member times its tributary width to the
    dead load (when the rules say the area dead loads exclude it); returns the problem, if any."""
    if places is None or not places.slabs:
        return ("the rules say the area dead loads exclude the slab's weight ([defaults] slab_weight_included "
                "= false), but no slab was found over the member; model the slab or include its weight")
    psi, how, problem = slab_weight(places.slabs[0][0])
    if problem:
        return problem
    loads["D"] += psi * width
    sources.append(f"{how} x {width:.1f} in")
    return ""


def framing_points(records: "list[MemberRecord]", found_in_geometry: dict) -> tuple:
    """(carrier GlobalId -> positions along it (in) where members bear on it or hang on it; the
    carriers on which members bear or hang directly; carrier GlobalId -> names of the members it
    carries). A load handed on through a post standing on a carrier gives no position: the post
    does not brace it, nor carry its floor."""
    points: dict = {}
    direct = set()
    carried: dict = {}
    for k, r in enumerate(records):
        analysis = r.analysis if r.analysis is not None else found_in_geometry.get(k, (None, ""))[0]
        for support in (analysis.supports if analysis is not None else ()):
            if support.carrier:
                on_it = not support.element or support.element == support.carrier
                points.setdefault(support.carrier, []).append(support.carrier_x if on_it else np.nan)
                carried.setdefault(support.carrier, []).append((r.name or r.global_id) + ("" if on_it else " through a post"))
                if on_it:
                    direct.add(support.carrier)
    return points, direct, carried


def _carried_text(names: list) -> str:
    """"reactions of the members bearing on it: J-01, J-02 (2)", repeated names counted ("Joist x12")."""
    counts = Counter(names)
    listed = ", ".join(name if n == 1 else f"{name} x{n}" for name, n in counts.items())
    return f"reactions of the members bearing on it: {listed} ({len(names)})"


def braced_at_framing(analysis: AnalysisInput, points: list, used: list) -> float:
    """NDS 2018, 3.3.3: the unbraced length of a carrier's top edge held at its supports and at
    the members framing onto or into it (common practice: joists held by their sheathing brace
    the beam they bear on): the longest stretch between those points, or of an overhang past
    them. NaN (unbraced over the stretches) when no framing position is known."""
    known = [x for x in points if np.isfinite(x)]
    if not known:
        return np.nan
    held = np.unique(np.r_[known, [s.x for s in analysis.supports]])
    stretches = np.r_[np.diff(held), held[0], analysis.length - held[-1]]
    lu = float(stretches.max())
    used.append(f"top edge braced at its supports and at the {len(known)} members framing onto it: "
                f"lu = {lu:.1f} in (common practice)")
    return lu


def _through_posts(member_supports, posts: dict, guid: str, names: dict):
    """A member's supports with those on a column that stands on another candidate member
    (``names``: GlobalId -> name of the candidates) handed on to that member: the reaction
    becomes a point load on it where the column stands. The column's own weight is not added."""
    supports = []
    for s in member_supports.supports:
        below = posts.get(s.element)
        if below is not None and below[0] != guid and below[0] in names and not s.carrier:
            s = replace(s, carrier=below[0], carrier_x=below[1], source=f"{s.source}, which stands on '{names[below[0]]}'")
        supports.append(s)
    return member_supports._replace(supports=supports)


def _repetitive(record, type_default: bool, ptype: str, run, slab: str, defaults_used: list) -> bool:
    """NDS 4.3.9 Cr: the input says; else three plies or more in contact; else a framing run of
    three or more: at 24 in or less under a slab (``slab``, the one over the member) yes, wider
    apart no; else (no run, or no slab to distribute the load) the member type's default."""
    if "RepetitiveMember" in record.inputs:
        return bool(record.inputs["RepetitiveMember"])
    if record.section is not None and record.section.plies >= 3:
        defaults_used.append(f"repetitive member yes ({record.section.plies} plies in contact, NDS 4.3.9)")
        return True
    if run is not None and run[1] >= 3 and not run[2]:
        defaults_used.append(f"repetitive member no (framing run of {run[1]} spaced more than 24 in)")
        return False
    if run is not None and run[1] >= 3 and slab:
        defaults_used.append(f"repetitive member yes (framing run of {run[1]} under {slab})")
        return True
    why = f"framing run of {run[1]} but no slab found over it; " if run is not None and run[1] >= 3 else ""
    defaults_used.append(f"repetitive member {'yes' if type_default else 'no'} ({why}{ptype} default)")
    return type_default


def _slab_over(places) -> str:
    """"IfcSlab 'S-01'": the slab or roof covering most of the member, "" for none."""
    if places is None or not places.slabs:
        return ""
    slab = places.slabs[0][0]
    return f"{slab.ifc_class} '{slab.name or slab.global_id}'"


def _held(supports) -> bool:
    """A straight member is held by two supports, or by one fixed support (a cantilever)."""
    return len(supports) >= 2 or any(s.kind == "fixed" for s in supports)


def design_inputs(records: "list[MemberRecord]", rules: dict, elements: "list | None" = None) -> pd.DataFrame:
    """One row per candidate member with everything a design basis needs (core units); ``elements``
    are the model's walls, columns, beams and slabs (ElementBox) for supports found in the geometry."""
    elements = elements or []
    d = rules["defaults"]
    bearing_default = parse_quantity(d["bearing_length"], "length")
    temperature_default = parse_temperature_f(d["service_temperature"])
    braced_types = set(d["continuously_braced_types"])
    repetitive_types = set(d["repetitive_types"])
    labels = {  # the defaults' wording, made once
        "self_weight": "self-weight " + ("included in dead load" if d["self_weight_included"] else "added")
        + " (rules default)",
        "bearing": f"bearing length {d['bearing_length']} (rules default)",
        "temperature": f"service temperature {d['service_temperature']} (rules default)",
    }
    places = members_places(records, elements, rules)
    runs = framing_runs(records, places, elements, parse_quantity(d["support_tolerance"], "length"))
    found_in_geometry = geometry_supports(records, elements, rules)
    # members that carry floor or roof framing directly take their area load through it
    framed_at, framing_carriers, carried = framing_points(records, found_in_geometry)
    carriers = set(framed_at)
    area_entries = rules.get("area_loads", [])
    derived = []
    for k, r in enumerate(records):
        found_analysis, slab = found_in_geometry.get(k, (None, ""))
        run = runs.get(k)
        member_analysis = r.analysis if r.analysis is not None else found_analysis
        used: list = []
        notices: list = []
        problems = list(r.problems)
        tributary = _tributary(r, run)
        loads, load_sources, load_problems = superimposed_loads(r, tributary)
        # the input property set's loads win over the project's area loads; a member that carries
        # others takes the floor's area load through them, never directly as well (no double count)
        if not load_sources and r.global_id not in framing_carriers:
            loads, load_sources, load_problems = project_area_loads(r, area_entries, tributary, places.get(k))
            if load_sources and not d["slab_weight_included"]:
                load_problems += [p for p in [add_slab_weight(loads, load_sources, places.get(k), tributary[0])] if p]
        analysis = member_analysis if (member_analysis is not None and member_analysis.supports) else None
        if analysis is not None and "BearingLength" in r.inputs:  # the input wins over the elements' widths
            analysis = replace(analysis, supports=[replace(s, width=r.inputs["BearingLength"]) for s in analysis.supports])
        if member_analysis is not None:
            problems += member_analysis.problems
            if not member_analysis.supports and member_analysis.loads:
                problems.append("the structural-analysis data loads this member but gives it no supports "
                                "(its end nodes hold nothing and join no other member)")
        if analysis is not None and not _held(analysis.supports):
            problems.append(f"the structural-analysis supports do not hold the member "
                            f"({len(analysis.supports)} pinned support); it needs two, or one fixed")
        if analysis is not None:
            if analysis.loads:
                if load_sources:
                    notices.append("loads from the structural-analysis data; the ifccheck_DesignInput loads are not used")
                load_sources, load_problems = ["structural-analysis data"], []
        problems += load_problems
        if r.global_id in carriers:
            load_sources.append(_carried_text(carried[r.global_id]))
        if not load_sources:
            problems.append("no loads found (no ifccheck_DesignInput loads)")
        ptype = r.predefined_type or "NOTDEFINED"
        braced = _bracing(r, ptype in braced_types, ptype, used, slab)
        unbraced = r.inputs.get("UnbracedLength", np.nan)
        if not braced and "UnbracedLength" not in r.inputs and r.global_id in framed_at and analysis is not None:
            unbraced = braced_at_framing(analysis, framed_at[r.global_id], used)
        sw_included = _flag(r, "SelfWeightIncluded", d["self_weight_included"], labels["self_weight"], used)
        bearing = _flag(r, "BearingLength", bearing_default, labels["bearing"] if _default_bearing_used(analysis) else "", used)
        wet = _flag(r, "WetService", d["wet_service"], "dry service (rules default)", used)
        temperature = _flag(r, "ServiceTemperature", temperature_default, labels["temperature"], used)
        repetitive = _repetitive(r, ptype in repetitive_types, ptype, run, _slab_over(places.get(k)), used)
        derived.append((
            ptype, *_BY_LOAD_TYPE(loads), "; ".join(load_sources), bool(sw_included), bearing, bool(wet),
            temperature, bool(braced), unbraced, repetitive, tributary[0],
            "; ".join(f"{sup.source} at {sup.x:.1f} in" for sup in analysis.supports) if analysis is not None else "",
            rules_member_use(rules, ptype, r.storey), used, notices, problems,
            list(r.notes) + (member_analysis.notes if member_analysis is not None else [])
            + ([run[3]] if run is not None and run[3] else []),
            analysis,
        ))
    columns = {**_record_columns(records), **dict(zip(_DERIVED, map(list, zip(*derived)) if derived else [[]] * len(_DERIVED)))}
    columns["incised"] = [bool(d["incised"])] * len(records)
    return pd.DataFrame({name: columns[name] for name in _COLUMNS}, columns=_COLUMNS)


def _record_columns(records: "list[MemberRecord]") -> dict:
    """The columns read straight from the records, one list each."""
    sections = [r.section for r in records]
    materials = [r.material for r in records]
    return {
        "global_id": [r.global_id for r in records],
        "name": [r.name for r in records],
        "ifc_class": [r.ifc_class for r in records],
        "storey": [r.storey for r in records],
        "section": [_section_text(s) for s in sections],
        "section_source": [s.source if s else "" for s in sections],
        "b": [s.width if s else math.nan for s in sections],
        "d": [s.depth if s else math.nan for s in sections],
        "plies": [s.plies if s else 1 for s in sections],
        "material_name": [m.name for m in materials],
        "material_category": [m.category for m in materials],
        "material_species": [m.species for m in materials],
        "material_grade": [m.grade for m in materials],
        "input_species": [r.inputs.get("Species", "") for r in records],
        "input_grade": [r.inputs.get("Grade", "") for r in records],
        "span_read": [r.span if r.span is not None else math.nan for r in records],
        "span_is_clear": [r.span_is_clear for r in records],
        "span_source": [r.span_source for r in records],
        "slope": [r.slope for r in records],
        "n_live_input": [r.inputs.get("LiveDeflectionLimit", np.nan) for r in records],
        "n_total_input": [r.inputs.get("TotalDeflectionLimit", np.nan) for r in records],
    }


#: the columns worked out per member in design_inputs, in the order of its tuples
_DERIVED = [
    "predefined_type", *LOAD_COLUMNS, "load_sources", "self_weight_included", "bearing_length", "wet",
    "temperature_F", "braced", "unbraced_length", "repetitive", "tributary_width", "supports_found",
    "member_use", "defaults_used", "notices", "problems", "notes", "analysis",
]

_COLUMNS = [
    "global_id", "name", "ifc_class", "predefined_type", "storey", "section", "section_source", "b", "d",
    "plies", "material_name", "material_category", "material_species", "material_grade", "input_species",
    "input_grade", "span_read", "span_is_clear", "span_source", "slope", *LOAD_COLUMNS, "load_sources",
    "self_weight_included", "bearing_length", "wet", "temperature_F", "incised", "braced", "unbraced_length",
    "repetitive", "tributary_width", "supports_found", "member_use", "n_live_input", "n_total_input", "defaults_used", "notices", "problems", "notes", "analysis",
]

