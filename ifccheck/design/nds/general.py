"""NDS 2018 checks of members with their own supports and loads (continuous spans, overhangs,
cantilevers, point and partial loads), on the results of the beam analysis engine.

The engine gives exact moment, shear, reaction and deflection extremes per ASD combination
(live loads patterned over the spans); this module turns them into the :class:`Demands` that the
shared NDS checks of :mod:`.checks` take. Core units: inch, lbf, psi, lbf/in.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from ...analysis import BeamLayout, BeamMember, LinearLoad, PointLoad, PointMoment, Support, UniformLoad, analyse_beams
from ...model import LOAD_TYPES
from ..load_path import carrier_edges, dependency_levels
from . import factors
from .checks import Demands, SectionCapacity, load_duration_factors, utilizations

_LIVE = ("L", "Lr", "S")  # IBC Table 1604.3: live-type loads of the live deflection limit


def engine_loads(records: list, self_weight: float) -> tuple:
    """Engine loads from the analysis data's LoadRecords plus the member's own weight (lbf/in)."""
    loads = [UniformLoad("D", self_weight)] if self_weight > 0 else []
    for r in records:
        if r.kind == "uniform":
            loads.append(UniformLoad(r.load_type, r.value, r.a, r.b))
        elif r.kind == "linear":
            loads.append(LinearLoad(r.load_type, r.value, r.value_end, r.a, r.b))
        elif r.kind == "point":
            loads.append(PointLoad(r.load_type, r.value, r.a))
        elif r.kind == "moment":
            loads.append(PointMoment(r.load_type, r.value, r.a))
    return tuple(loads)


def uniform_loads(row) -> tuple:
    """Full-length uniform loads from the design inputs' line loads (self-weight included)."""
    return tuple(UniformLoad(t, getattr(row, f"w_{t}")) for t in LOAD_TYPES if getattr(row, f"w_{t}") != 0)


def _combination_sets(combos: np.ndarray, names: tuple, K_cr: float) -> dict:
    """Strength combinations, their live-load parts, and their long-term parts (Kcr on dead, NDS 3.5.2)."""
    out = {}
    for name, c in zip(names, combos):
        factors_ = dict(zip(LOAD_TYPES, c))
        out[name] = factors_
        out[f"{name}|live"] = {t: (factors_[t] if t in _LIVE else 0.0) for t in LOAD_TYPES}
        out[f"{name}|total"] = {**out[f"{name}|live"], "D": K_cr * factors_["D"]}
    return out


def _segment_at(segments, x: float):
    for seg in segments:
        if seg.start - 1e-9 <= x <= seg.end + 1e-9:
            return seg
    return segments[-1]


def _case(kind: str, loads: tuple, start: float, end: float) -> str:
    """NDS Table 3.3.3 row for a stretch of beam: a cantilever (uniform or concentrated load), a span
    with one concentrated load at its centre (within 5 % of the span), a span under uniform load, or
    otherwise the table's row for loadings it does not list."""
    points = [l.x for l in loads if isinstance(l, PointLoad) and start <= l.x <= end]
    if kind == "overhang":
        return "cantilever_point_end" if points else "cantilever_uniform"
    if not points:
        return "single_span_uniform"
    centre = (start + end) / 2.0
    if len(points) == 1 and abs(points[0] - centre) <= 0.05 * (end - start):
        return "single_span_point_centre"
    return "unspecified_loading"


def _effective(lu: float, d: float, case: str) -> tuple:
    """(lu, le) with le from NDS Table 3.3.3 for the stretch's case."""
    return lu, float(factors.effective_length(np.array([lu]), np.array([d]), case)[0])


def _top_edge(row, segments, loads, x: float, d: float) -> tuple:
    """(lu, le) of the top edge under positive moment at x ((NaN, NaN) where the edge is braced)."""
    if row.braced:
        return np.nan, np.nan
    seg = _segment_at(segments, x)
    lu = row.unbraced_length if np.isfinite(row.unbraced_length) else seg.end - seg.start
    return _effective(lu, d, _case(seg.kind, loads, seg.start, seg.end))


def _bottom_edge(regions, length: float, supports, loads, x: float, d: float) -> tuple:
    """(lu, le) of the bottom edge under negative moment at x. The edge is in compression over the stretch
    where the moment is negative and is held laterally only at the supports on that stretch, so the
    unbraced length is the longest piece between a support and a point of zero moment or a free end."""
    region = next(((a, b) for a, b in regions if a - 1e-6 <= x <= b + 1e-6), (x, x))
    cuts = [region[0], *(s.x for s in supports if region[0] < s.x < region[1]), region[1]]
    pieces = list(zip(cuts, cuts[1:]))
    start, end = max(pieces, key=lambda p: p[1] - p[0])
    lu = max(end - start, 1e-6)
    free_end = (start <= 1e-6 and supports[0].x > 1e-6) or (end >= length - 1e-6 and supports[-1].x < length - 1e-6)
    return _effective(lu, d, _case("overhang", loads, start, end) if free_end else "unspecified_loading")


def _deflection_ratio(segments, supports, n: float):
    """Largest deflection over its allowed value L/n per span and cantilever (IBC 2018 Table 1604.3,
    footnote: a cantilever's L is twice its length); overhangs no longer than the bearing are skipped."""
    widest = max(s.support.width for s in supports) if supports else 0.0
    best, where = 0.0, np.nan
    for seg in segments:
        length = seg.segment.end - seg.segment.start
        if seg.segment.kind == "overhang":
            if length <= widest:
                continue
            length *= 2.0
        for ext in (seg.max_deflection, seg.min_deflection):
            ratio = abs(ext.value) / (length / n)
            if ratio > best:
                best, where = ratio, ext.x
    return best, where


def _member_demands(row, result, loads, names, cap: SectionCapacity, k: int) -> dict:
    """One member's demands per strength combination (lists of length m)."""
    d, b = cap.d[k], cap.b[k]
    supports = result.layout.supports
    length = result.layout.length
    segments = result.segments
    out = {key: [] for key in Demands.__dataclass_fields__}
    for name in names:
        env = result.combinations[name]
        top, bottom = env.max_moment, env.min_moment
        out["M_pos"].append(max(top.value, 0.0))
        out["x_pos"].append(top.x)
        lu, le = _top_edge(row, segments, loads, top.x, d)
        out["lu_pos"].append(lu)
        out["le_pos"].append(le)
        out["M_neg"].append(max(-bottom.value, 0.0))
        out["x_neg"].append(bottom.x)
        # the stretch in negative moment under the live-load pattern that gives the extreme
        regions = env.patterns[bottom.pattern].negative_moment_regions if bottom.value < 0 else ()
        lu, le = _bottom_edge(regions, length, supports, loads, bottom.x, d) if regions else (np.nan, np.nan)
        out["lu_neg"].append(lu)
        out["le_neg"].append(le)
        faces = [f for s in env.supports for f in (s.shear_left_face, s.shear_right_face) if np.isfinite(f.value)]
        face = max(faces, key=lambda f: abs(f.value))
        out["V"].append(abs(face.value))
        out["x_V"].append(face.x)
        R = np.array([s.reaction_max.value for s in env.supports])
        width = np.array([s.width for s in supports])
        to_end = np.array([min(s.x - s.width / 2.0, length - s.x - s.width / 2.0) for s in supports])
        # NDS 3.10.2 with the bearing area factor Cb of NDS 3.10.4 at each support
        ratio = np.maximum(R, 0.0) / (b * width * cap.F_c_perp_prime[k] * factors.C_b(width, to_end))
        j = int(ratio.argmax())
        out["R"].append(R.max())
        out["bearing"].append(ratio[j])
        out["x_bearing"].append(supports[j].x)
        lowest = min(env.supports, key=lambda s: s.reaction_min.value)
        out["uplift"].append(min(lowest.reaction_min.value, 0.0))
        out["x_uplift"].append(lowest.support.x)
        seg = _segment_at(segments, top.x)
        out["zero_moment_length"].append(seg.end - seg.start)
        for part, n in (("live", cap.n_live[k]), ("total", cap.n_total[k])):
            ratio_, x = _deflection_ratio(result.combinations[f"{name}|{part}"].segments, env.supports, n)
            out[f"deflection_{part}"].append(ratio_)
            out[f"x_deflection_{part}"].append(x)
    return out


def analysed_checks(rows: pd.DataFrame, combos: np.ndarray, names: tuple, cd_by_type: np.ndarray, cap: SectionCapacity):
    """NDS checks of members with analysis data: (results as from :func:`checks.utilizations` with
    their ``demands``, supports per member, longest span per member).

    Members are analysed level by level along the load path: a member that bears on another one
    hands its reactions, per load type, to that carrier as point loads.
    """
    row_list = list(rows.itertuples())
    analyses = [row.analysis for row in row_list]
    edges = carrier_edges([row.global_id for row in row_list], analyses)
    levels, _ = dependency_levels(len(row_list), edges)  # cycles were made NOT_CHECKED before
    loads = [engine_loads(a.loads, row.self_weight) if a.loads else uniform_loads(row) for a, row in zip(analyses, row_list)]
    results = [None] * len(row_list)
    for level in levels:
        members = {k: BeamMember(_layout(row_list[k], cap, k), loads[k]) for k in level}
        for K_cr in np.unique(cap.K_cr[level]):  # the long-term combinations depend on the creep factor
            group = [k for k in level if cap.K_cr[k] == K_cr]
            solved = analyse_beams([members[k] for k in group], _combination_sets(combos, names, float(K_cr)))
            for k, res in zip(group, solved):
                results[k] = res
        for carried, j, carrier, x in edges:
            if carried in members:
                loads[carrier] = loads[carrier] + _reaction_loads(results[carried], j, x)
    per_member = [_member_demands(row, results[k], loads[k], names, cap, k) for k, row in enumerate(row_list)]
    dem = Demands(**{key: np.array([m[key] for m in per_member], dtype=float) for key in Demands.__dataclass_fields__})
    types_present = [[1.0 if any(l.load_type == t for l in member_loads) else 0.0 for t in LOAD_TYPES]
                     for member_loads in loads]
    CD = load_duration_factors(np.array(types_present), combos, cd_by_type)
    r = utilizations(dem, CD, cap)
    r["demands"] = dem
    r["element_reactions"] = [_element_reactions(row.analysis, res) for row, res in zip(row_list, results)]
    layouts = [res.layout for res in results]
    return r, np.array([len(l.supports) for l in layouts]), np.array([_longest_span(l) for l in layouts])


def _layout(row, cap: SectionCapacity, k: int) -> BeamLayout:
    supports = tuple(
        Support(s.x, s.kind, s.width if np.isfinite(s.width) else row.bearing_length) for s in row.analysis.supports
    )
    return BeamLayout(row.analysis.length, supports, cap.E_prime[k] * cap.I[k])


def _element_reactions(analysis, result) -> list:
    """(supporting element's GlobalId, {load type: reaction lbf}) for the supports found on
    elements other than members (walls, columns, footings; also a column standing on a member)."""
    return [
        (support.element, {t: float(case.reactions[j]) for t, case in result.unit_cases.items()})
        for j, support in enumerate(analysis.supports)
        if support.element and support.element != support.carrier  # a member's own reaction is a load on it
    ]


def _reaction_loads(result, support: int, x: float) -> tuple:
    """The reactions of one support, per load type, as point loads on the carrier at x (lbf, down)."""
    return tuple(
        PointLoad(t, float(case.reactions[support]), x)
        for t, case in result.unit_cases.items()
        if float(case.reactions[support]) != 0.0
    )


def _longest_span(layout: BeamLayout) -> float:
    """The longest distance between adjacent supports, or the cantilever's length (in)."""
    xs = [s.x for s in layout.supports]
    return max(np.diff(xs)) if len(xs) > 1 else max(xs[0], layout.length - xs[0])
