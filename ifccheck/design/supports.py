"""Supports and top-edge bracing of members found in the model's geometry.

A member bears on a wall, column, beam, member or footing when its plan line crosses the element's
plan footprint (its box, widened by a tolerance) and the element's top is at the member's bottom
there. A slab or roof whose underside is at the member's top and whose footprint holds the member
braces the member's top edge continuously.

No pairwise comparison of all members and elements: element footprints are laid on a uniform grid
of cubes (``CELL`` on a side, in plan and in height) and each member looks only in the cells its
plan line passes at the height of its bottom (or top). Pure numpy; all lengths in inches; axes are
world coordinates through the centre of the section.
"""

from __future__ import annotations

from typing import NamedTuple, Optional

import numpy as np
import pandas as pd

from ..errors import IfcCheckError
from ..model import SupportRecord

#: element kinds that may support a member, and those of them that are members themselves
SUPPORTING_KINDS = ("wall", "column", "beam", "member", "footing")
CARRIER_KINDS = ("beam", "member")
#: element kinds that may brace a member's top edge
BRACING_KINDS = ("slab", "roof")
#: share of the member's plan length that must lie under one slab to be braced by it
BRACED_SHARE = 0.90

CELL = 48.0  # in: side of the search grid's cubes
_NO_PLAN = 1e-9  # in: a plan projection shorter than this has no plan direction (vertical or unknown)


class MemberSupports(NamedTuple):
    """What the geometry says about one member's supports."""

    supports: list  # list[SupportRecord], sorted by x
    problems: list  # list[str], e.g. "no support found at end B"


def find_supports(
    guids: list,
    starts: np.ndarray,
    ends: np.ndarray,
    depths: np.ndarray,
    boxes: list,
    tolerance: float = 1.0,
    end_reach: float = 6.0,
    member_axes: Optional[dict] = None,
    overhang_ratio: float = 0.5,
) -> list:
    """Supports of each member found in the geometry: a list of MemberSupports in input order.

    ``starts`` and ``ends`` are (n, 3) world coordinates of the members' axis ends, ``depths``
    their depths d; ``boxes`` the ElementBox of every element that may support them (a member's
    own box, same GlobalId, is never its support). ``member_axes`` maps GlobalIds of beams and
    members to their (start, end) axis ends; a support on one of them names it as the carrier.

    The member's bottom at a plan point is its axis height there less the plumb half-depth
    d / (2 cos θ), θ the slope (d / 2 when level). An element supports the member where the
    member's plan line, clipped to its length, crosses the element's footprint widened by
    ``tolerance`` on every side, and the element's top (box high z) lies within ``tolerance`` of
    the member's bottom somewhere along that crossing. Kinds that may support: wall, column,
    beam, member, footing (slabs and roofs do not; they brace, see :func:`braced_by_slab`).

    Each support's ``x`` is the centre of the crossing of the (unwidened) footprint, measured
    along the member's plan projection from its start, and ``width`` its length, which stops at
    the member's end (the bearing length, common practice); NaN when the member only reaches
    the widened footprint. Supports whose widened crossings overlap are one bearing (its element
    is the one under the longest crossing, its source names all). An end is supported when a
    bearing starts within ``end_reach`` of it (members usually run over their bearings), or
    when the member has two bearings or more and runs past the one nearest that end by no more
    than ``overhang_ratio`` times the span next to it: an overhang, such as rafter eaves or a
    balcony joist, checked as a cantilever (common practice; a longer free end is more likely a
    missing support). Otherwise the problems say "no support found at end A" (start) or "... at
    end B" (end).

    Flush framing: a member whose end meets the side of a beam or member (its plan line ends in
    or within ``tolerance`` of the carrier's footprint, running into it no more than
    ``end_reach``) with at least half its depth beside the carrier (and the carrier's top above
    the member's bottom, so it is not a bearing from below), more than ``end_reach`` from the
    carrier's ends (nearer, it is a corner of two members), hangs on it: a support at the
    carrier's face, ``width`` NaN (a hanger is assumed; its own capacity is not checked), its
    source "hangs on ...".
    """
    axes = _Axes(starts, ends, depths)
    n = len(axes.plan)
    _check_count(guids, n)
    found = _BoxTable(boxes, SUPPORTING_KINDS)
    member, box = _candidates(axes, axes.bottom, found, found.hi[:, 2], tolerance)
    member, box = _not_itself(guids, found, member, box)
    crossing = _Crossings(axes, found, member, box, tolerance)
    level = found.hi[box, 2]
    low, high = _range_along(axes.bottom[member], axes.rise[member], crossing.wide_start, crossing.wide_end)
    bears = crossing.crosses & (level >= low - tolerance) & (level <= high + tolerance)
    supported = _joined(crossing.select(bears), _hangers(axes, found, guids, tolerance, end_reach))
    bearings = _merged(axes, found, supported, _carrier_axes(found, member_axes or {}))
    return _per_member(axes, bearings, end_reach, overhang_ratio)


def braced_by_slab(
    guids: list, starts: np.ndarray, ends: np.ndarray, depths: np.ndarray, boxes: list, tolerance: float = 1.0
) -> list:
    """GlobalId of the slab or roof bracing each member's top edge, or "" (input order).

    A slab or roof braces a member continuously on its top edge (common practice) when its
    underside (box low z) is within ``tolerance`` of the member's top (axis plus the plumb
    half-depth; for a sloped member its lowest point under the slab), its box reaches up to the
    member's highest top point there (a level slab does not brace a member climbing through it),
    and at least ``BRACED_SHARE`` of the member's plan length lies in its footprint widened by
    ``tolerance``. Of several, the one covering most of the member.
    """
    axes, slabs, crossing, low, high = _on_top(guids, starts, ends, depths, boxes, BRACING_KINDS, tolerance)
    member, box = crossing.member, crossing.box
    share = (crossing.wide_end - crossing.wide_start) / np.where(axes.valid, axes.plan, 1.0)[member]
    on_top = np.abs(slabs.lo[box, 2] - low) <= tolerance
    braces = crossing.crosses & on_top & (slabs.hi[box, 2] >= high - tolerance) & (share >= BRACED_SHARE)
    member, box, share = member[braces], box[braces], share[braces]
    order = np.lexsort((-share, member))
    first = order[np.r_[True, np.diff(member[order]) != 0]] if len(order) else order
    braced = [""] * len(axes.plan)
    for k, j in zip(member[first].tolist(), box[first].tolist()):
        braced[k] = slabs.boxes[j].global_id
    return braced


#: element kinds that stand on members and hand them what they carry
POST_KINDS = ("column",)


def posts_on_members(guids: list, starts: np.ndarray, ends: np.ndarray, depths: np.ndarray, boxes: list,
                     tolerance: float = 1.0) -> dict:
    """GlobalId of each column standing on a member -> (member's GlobalId, position along its
    plan axis in inches). A column stands on a member when its bottom (box low z) is within
    ``tolerance`` of the member's top where the member's plan line crosses the column's
    footprint widened by ``tolerance``; the position is the centre of the crossing. Of several
    members under one column, the one crossing most of its footprint."""
    _, posts, crossing, low, high = _on_top(guids, starts, ends, depths, boxes, POST_KINDS, tolerance)
    foot = posts.lo[crossing.box, 2]
    stands = crossing.crosses & (foot >= low - tolerance) & (foot <= high + tolerance)
    on = crossing.select(stands)
    x = np.where(np.isfinite(on.start), (on.start + on.end) / 2, (on.wide_start + on.wide_end) / 2)
    length = on.wide_end - on.wide_start
    found = {}
    for k in np.lexsort((length, on.box)).tolist():  # the longest crossing of each column last, so it stays
        found[posts.boxes[int(on.box[k])].global_id] = (guids[int(on.member[k])], float(x[k]))
    return found


def _on_top(guids, starts, ends, depths, boxes, kinds: tuple, tolerance: float) -> tuple:
    """(axes, boxes of ``kinds``, crossings of the members' plan lines with the boxes whose
    underside may meet the members' top, lowest and highest top height along each crossing)."""
    axes = _Axes(starts, ends, depths)
    _check_count(guids, len(axes.plan))
    table = _BoxTable(boxes, kinds)
    member, box = _candidates(axes, axes.top, table, table.lo[:, 2], tolerance)
    crossing = _Crossings(axes, table, member, box, tolerance)
    low, high = _range_along(axes.top[member], axes.rise[member], crossing.wide_start, crossing.wide_end)
    return axes, table, crossing, low, high


class _Axes:
    """Members' plan lines (start, unit direction, plan length) and the heights of their
    bottom and top edges at the start, with their rise per inch of plan."""

    def __init__(self, starts, ends, depths):
        start, end = np.asarray(starts, dtype=float), np.asarray(ends, dtype=float)
        depth = np.asarray(depths, dtype=float)
        if start.shape != end.shape or start.ndim != 2 or start.shape[1] != 3 or depth.shape != (len(start),):
            raise IfcCheckError(f"axis ends {start.shape} and {end.shape} and depths {depth.shape} do not match as (n, 3), (n, 3), (n,)")
        step = end - start
        plan = np.hypot(step[:, 0], step[:, 1])
        self.known = np.isfinite(start).all(axis=1) & np.isfinite(end).all(axis=1)
        self.deep = np.isfinite(depth) & (depth > 0)
        self.valid = self.known & self.deep & (plan > _NO_PLAN)
        safe = np.where(self.valid, plan, 1.0)
        self.start = np.where(self.valid[:, None], start[:, :2], 0.0)
        self.along = np.where(self.valid[:, None], step[:, :2] / safe[:, None], 0.0)
        self.plan = np.where(self.valid, plan, 0.0)
        self.rise = np.where(self.valid, step[:, 2] / safe, 0.0)
        # plumb half-depth d / (2 cos θ), cos θ = plan length / length (common practice geometry)
        half = np.where(self.valid, depth / 2 * np.sqrt(1.0 + self.rise**2), 0.0)
        self.bottom = np.where(self.valid, start[:, 2] - half, np.nan)
        self.top = np.where(self.valid, start[:, 2] + half, np.nan)

    def problem(self, k: int) -> str:
        """Why member k was not searched ("" when it was)."""
        if not self.known[k]:
            return "no support searched: the member's axis is unknown"
        if not self.deep[k]:
            return "no support searched: the member's depth is unknown"
        if not self.valid[k]:
            return "no support searched: the member's axis has no plan length (vertical)"
        return ""


def _check_count(guids: list, n: int) -> None:
    if len(guids) != n:
        raise IfcCheckError(f"{len(guids)} GlobalIds given for {n} member axes")


class _BoxTable:
    """The boxes of the given kinds with finite corners, and their corners as (m, 3) arrays."""

    def __init__(self, boxes: list, kinds: tuple):
        self.boxes = [b for b in boxes if b.kind in kinds]
        lo = np.array([b.lo for b in self.boxes], dtype=float).reshape(-1, 3)
        hi = np.array([b.hi for b in self.boxes], dtype=float).reshape(-1, 3)
        keep = np.isfinite(lo).all(axis=1) & np.isfinite(hi).all(axis=1)
        self.boxes = [b for b, k in zip(self.boxes, keep.tolist()) if k]
        self.lo, self.hi = np.minimum(lo, hi)[keep], np.maximum(lo, hi)[keep]

    def subset(self, rows: np.ndarray) -> "_BoxTable":
        """The boxes at these rows (indices into this table)."""
        part = object.__new__(_BoxTable)
        part.boxes = [self.boxes[j] for j in rows.tolist()]
        part.lo, part.hi = self.lo[rows], self.hi[rows]
        return part


def _candidates(axes: _Axes, edge: np.ndarray, table: _BoxTable, level, tolerance: float) -> tuple:
    """(member, box) pairs that share a grid cube: the box's footprint widened by ``tolerance``
    at height ``level`` (one height per box, or a (lowest, highest) pair of arrays), and the
    member's plan line at the height of its ``edge`` line (edge at the start plus rise per inch
    of plan) ± ``tolerance``. A superset of the pairs that meet."""
    rows = np.flatnonzero(axes.valid)
    if not len(rows) or not len(table.boxes):
        return np.zeros(0, dtype=int), np.zeros(0, dtype=int)
    level_low, level_high = level if isinstance(level, tuple) else (level, level)
    box_rows, box_cells = _cells_in_ranges(
        np.column_stack([_cell(table.lo[:, :2] - tolerance), _cell(level_low)]),
        np.column_stack([_cell(table.hi[:, :2] + tolerance), _cell(level_high)]),
    )
    piece_member, low, high = _line_pieces(axes, edge, rows, tolerance)
    piece_rows, line_cells = _cells_in_ranges(low, high)
    box_keys, line_keys = _keys(box_cells, line_cells)
    line_member = piece_member[piece_rows]
    key_count = max(box_keys.max(), line_keys.max()) + 1
    pairs = np.unique(line_member.astype(np.int64) * key_count + line_keys)
    line_member, line_keys = pairs // key_count, pairs % key_count
    order = np.argsort(box_keys, kind="stable")
    sorted_keys = box_keys[order]
    first = np.searchsorted(sorted_keys, line_keys, "left")
    count = np.searchsorted(sorted_keys, line_keys, "right") - first
    offset = np.arange(count.sum()) - np.repeat(np.cumsum(count) - count, count)
    member = np.repeat(line_member, count)
    box = box_rows[order[np.repeat(first, count) + offset]]
    pairs = np.unique(member * len(table.boxes) + box)
    return pairs // len(table.boxes), pairs % len(table.boxes)


def _cell(value: np.ndarray) -> np.ndarray:
    return np.floor(np.asarray(value) / CELL).astype(np.int64)


def _line_pieces(axes: _Axes, edge: np.ndarray, rows: np.ndarray, tolerance: float) -> tuple:
    """(member, lowest cube, highest cube) of pieces of each member's line no longer than half a
    cube in plan: the cubes of a piece's bounding box hold every cube the piece passes."""
    pieces = np.maximum(1, np.ceil(axes.plan[rows] / (CELL / 2))).astype(np.int64)
    member = np.repeat(rows, pieces)
    step = (axes.plan[rows] / pieces)[np.repeat(np.arange(len(rows)), pieces)]
    index = np.arange(pieces.sum()) - np.repeat(np.cumsum(pieces) - pieces, pieces)
    t0, t1 = index * step, (index + 1) * step
    a = axes.start[member] + t0[:, None] * axes.along[member]
    b = axes.start[member] + t1[:, None] * axes.along[member]
    za, zb = edge[member] + axes.rise[member] * t0, edge[member] + axes.rise[member] * t1
    low = np.column_stack([_cell(np.minimum(a, b)), _cell(np.minimum(za, zb) - tolerance)])
    high = np.column_stack([_cell(np.maximum(a, b)), _cell(np.maximum(za, zb) + tolerance)])
    return member, low, high


def _cells_in_ranges(low: np.ndarray, high: np.ndarray) -> tuple:
    """(row, cube) of every cube (i, j, k) from ``low`` to ``high`` (inclusive) of each row."""
    size = high - low + 1
    count = size.prod(axis=1)
    row = np.repeat(np.arange(len(low)), count)
    local = np.arange(count.sum()) - np.repeat(np.cumsum(count) - count, count)
    size = size[row]
    k, rest = local % size[:, 2], local // size[:, 2]
    j, i = rest % size[:, 1], rest // size[:, 1]
    return row, low[row] + np.column_stack([i, j, k])


def _keys(*cell_sets) -> list:
    """One integer key per cube, the same numbering for every set of cubes given (each axis's
    cube indices numbered densely first, so that far-off elements cannot overflow the key)."""
    both = np.concatenate(cell_sets)
    codes = [pd.factorize(both[:, axis])[0].astype(np.int64) for axis in range(3)]
    span = [c.max() + 1 for c in codes]
    key = (codes[0] * span[1] + codes[1]) * span[2] + codes[2]
    bounds = np.cumsum([0] + [len(cells) for cells in cell_sets])
    return [key[a:b] for a, b in zip(bounds[:-1], bounds[1:])]


def _not_itself(guids: list, table: _BoxTable, member: np.ndarray, box: np.ndarray) -> tuple:
    """The pairs whose box is not the member's own (same GlobalId)."""
    codes = pd.factorize(pd.Series(list(guids) + [b.global_id for b in table.boxes], dtype=object))[0]
    other = codes[member] != codes[len(guids) + box]
    return member[other], box[other]


def _clip(start, along, plan, low, high) -> tuple:
    """(entry, exit) of each plan line start + t·along, 0 ≤ t ≤ plan, in the rectangle
    [low, high]; entry > exit where the line misses it (Liang–Barsky clipping)."""
    entry, leave = np.zeros(len(start)), plan.astype(float).copy()
    for axis in (0, 1):
        u, p = along[:, axis], start[:, axis]
        flat = np.abs(u) < 1e-12
        with np.errstate(divide="ignore", invalid="ignore"):
            t1, t2 = (low[:, axis] - p) / u, (high[:, axis] - p) / u
        inside = (p >= low[:, axis]) & (p <= high[:, axis])
        entry = np.where(flat, np.where(inside, entry, np.inf), np.maximum(entry, np.minimum(t1, t2)))
        leave = np.where(flat, np.where(inside, leave, -np.inf), np.minimum(leave, np.maximum(t1, t2)))
    return entry, leave


def _range_along(edge: np.ndarray, rise: np.ndarray, t0: np.ndarray, t1: np.ndarray) -> tuple:
    """(lowest, highest) height of a straight edge line between plan positions t0 and t1."""
    a, b = edge + rise * t0, edge + rise * t1
    return np.minimum(a, b), np.maximum(a, b)


class _Crossings:
    """Where each (member, box) pair's plan line crosses the box's footprint: widened by the
    tolerance (``wide_start``, ``wide_end``; 0 where ``crosses`` is False) and as modelled
    (``start``, ``end``, NaN where it does not cross)."""

    def __init__(self, axes: _Axes, table: _BoxTable, member, box, tolerance: float):
        self.member, self.box = member, box
        line = (axes.start[member], axes.along[member], axes.plan[member])
        wide_start, wide_end = _clip(*line, table.lo[box, :2] - tolerance, table.hi[box, :2] + tolerance)
        self.crosses = wide_start <= wide_end
        self.wide_start, self.wide_end = np.where(self.crosses, wide_start, 0.0), np.where(self.crosses, wide_end, 0.0)
        start, end = _clip(*line, table.lo[box, :2], table.hi[box, :2])
        self.start, self.end = np.where(start <= end, start, np.nan), np.where(start <= end, end, np.nan)

        self.hangs = np.zeros(len(member), dtype=bool)  # True for a member hung on the box's side

    _FIELDS = ("member", "box", "wide_start", "wide_end", "crosses", "start", "end", "hangs")

    def select(self, keep: np.ndarray) -> "_Crossings":
        chosen = object.__new__(_Crossings)
        for name in self._FIELDS:
            setattr(chosen, name, getattr(self, name)[keep])
        return chosen


def _joined(a: _Crossings, b: _Crossings) -> _Crossings:
    both = object.__new__(_Crossings)
    for name in _Crossings._FIELDS:
        setattr(both, name, np.concatenate([getattr(a, name), getattr(b, name)]))
    return both


def _clear_of_carrier_ends(table: _BoxTable, box: np.ndarray, point: np.ndarray, margin: float) -> np.ndarray:
    """True where a plan point lies more than ``margin`` from both ends of the box's longer plan
    side: a member meeting a carrier there frames into its side, not at a corner where two
    members meet end to side (as rim joists do)."""
    size = table.hi[box, :2] - table.lo[box, :2]
    long = np.argmax(size, axis=1)
    rows = np.arange(len(box))
    at = point[rows, long]
    return (at - table.lo[box, long] > margin) & (table.hi[box, long] - at > margin)


def _hangers(axes: _Axes, table: _BoxTable, guids: list, tolerance: float, end_reach: float) -> _Crossings:
    """Members hung on the side of a beam or member at an end (flush framing), as crossings of
    no modelled length at the carrier's face (see :func:`find_supports`)."""
    rows = np.flatnonzero([b.kind in CARRIER_KINDS for b in table.boxes]).astype(int)
    carriers = table.subset(rows)
    member, box = _candidates(axes, axes.bottom, carriers, (carriers.lo[:, 2] - tolerance, carriers.hi[:, 2] + tolerance), tolerance)
    member, box = _not_itself(guids, table, member, rows[box])
    c = _Crossings(axes, table, member, box, tolerance)
    plan = axes.plan[c.member]
    into = end_reach + 2 * tolerance  # the most a hung member may run into its carrier's footprint
    at_a = c.crosses & (c.wide_start <= _NO_PLAN) & (c.wide_end <= into) & (c.wide_end < plan)
    at_b = c.crosses & (c.wide_end >= plan - _NO_PLAN) & (c.wide_start >= plan - into) & (c.wide_start > 0)
    bottom = axes.bottom[c.member] + np.where(at_b, axes.rise[c.member] * plan, 0.0)
    top = bottom + (axes.top - axes.bottom)[c.member]
    lo, hi = table.lo[c.box, 2], table.hi[c.box, 2]
    beside = (np.minimum(top, hi) - np.maximum(bottom, lo) >= (top - bottom) / 2) & (hi > bottom + tolerance)
    # the carrier's face: where the member enters its modelled footprint, else the member's end
    face = np.where(at_b, np.where(np.isfinite(c.start), c.start, plan), np.where(np.isfinite(c.end), c.end, 0.0))
    point = axes.start[c.member] + face[:, None] * axes.along[c.member]
    keep = (at_a | at_b) & beside & _clear_of_carrier_ends(table, c.box, point, end_reach)
    hung = c.select(keep)
    # widened by the tolerance, so hangers at one point on two carriers are one support
    hung.wide_start, hung.wide_end = face[keep] - tolerance, face[keep] + tolerance
    hung.start, hung.end = np.full(keep.sum(), np.nan), np.full(keep.sum(), np.nan)
    hung.hangs = np.ones(keep.sum(), dtype=bool)
    return hung


class _CarrierAxes(NamedTuple):
    start: np.ndarray  # (m, 2) plan start of each box's carrier axis (NaN when not a carrier)
    along: np.ndarray  # (m, 2) unit plan direction
    plan: np.ndarray  # (m,) plan length


def _carrier_axes(table: _BoxTable, member_axes: dict) -> _CarrierAxes:
    """The plan axis of every box that is a beam or member with a known axis (NaN for others)."""
    m = len(table.boxes)
    start, end = np.full((m, 2), np.nan), np.full((m, 2), np.nan)
    for j, b in enumerate(table.boxes):
        if b.kind in CARRIER_KINDS and b.global_id in member_axes:
            a, e = member_axes[b.global_id]
            start[j], end[j] = np.asarray(a, dtype=float)[:2], np.asarray(e, dtype=float)[:2]
    step = end - start
    plan = np.hypot(step[:, 0], step[:, 1])
    known = np.isfinite(plan) & (plan > _NO_PLAN)
    along = np.where(known[:, None], step / np.where(known, plan, 1.0)[:, None], np.nan)
    return _CarrierAxes(np.where(known[:, None], start, np.nan), along, np.where(known, plan, np.nan))


class _Bearings(NamedTuple):
    """Merged supports, sorted by member and position."""

    member: np.ndarray
    wide_start: np.ndarray
    wide_end: np.ndarray
    records: list  # list[SupportRecord]


def _merged(axes: _Axes, table: _BoxTable, found: _Crossings, carriers: _CarrierAxes) -> _Bearings:
    """One bearing per run of supports whose widened crossings overlap along a member: it spans
    their modelled crossings; its element is the one with the longest crossing."""
    order = np.lexsort((found.wide_start, found.member))
    member, box = found.member[order], found.box[order]
    wide_start, wide_end = found.wide_start[order], found.wide_end[order]
    start, end = found.start[order], found.end[order]
    if not len(order):
        return _Bearings(member, wide_start, wide_end, [])
    shift = member * (axes.plan.max() + 1.0)  # keeps each member's positions apart from the next
    reach = np.maximum.accumulate(wide_end + shift)
    new = np.r_[True, (np.diff(member) != 0) | (wide_start[1:] + shift[1:] > reach[:-1])]
    first = np.flatnonzero(new)
    group = np.cumsum(new) - 1
    low, high = np.fmin.reduceat(start, first), np.fmax.reduceat(end, first)
    wide_low, wide_high = wide_start[first], np.maximum.reduceat(wide_end, first)
    longest = np.lexsort((-np.nan_to_num(end - start, nan=-1.0), group))
    chosen = box[longest[np.r_[True, np.diff(group[longest]) != 0]]]
    modelled = np.isfinite(low)
    x = np.where(modelled, (low + high) / 2, (wide_low + wide_high) / 2)
    width = np.where(modelled, high - low, np.nan)
    on = member[first]
    point = axes.start[on] + x[:, None] * axes.along[on]
    carrier_x = np.clip(np.einsum("ij,ij->i", point - carriers.start[chosen], carriers.along[chosen]), 0.0, carriers.plan[chosen])
    sources = _sources(table, box, first, found.hangs[order])
    records = [
        SupportRecord(
            x=xk,
            kind="pinned",
            width=wk,
            source=sk,
            carrier=table.boxes[j].global_id if np.isfinite(ck) else "",
            carrier_x=ck,
            element=table.boxes[j].global_id,
        )
        for xk, wk, sk, j, ck in zip(x.tolist(), width.tolist(), sources, chosen.tolist(), carrier_x.tolist())
    ]
    return _Bearings(on, wide_low, wide_high, records)


def _sources(table: _BoxTable, box: np.ndarray, first: np.ndarray, hangs: np.ndarray) -> list:
    """"bears on IfcWall 'W-02'" for each bearing, naming every element of a merged one; "hangs
    on IfcBeam 'G-02' (flush: hanger assumed)" for a member hung on a carrier's side."""
    labels = [f"{b.ifc_class} '{b.name or b.global_id}'" for b in table.boxes]
    bounds = np.r_[first, len(box)].tolist()
    rows, hung = box.tolist(), hangs.tolist()
    return [
        "hangs on " + " and ".join(labels[j] for j in rows[a:b]) + " (flush: hanger assumed)" if all(hung[a:b])
        else "bears on " + " and ".join(labels[j] for j in rows[a:b])
        for a, b in zip(bounds[:-1], bounds[1:])
    ]


def _per_member(axes: _Axes, bearings: _Bearings, end_reach: float, overhang_ratio: float) -> list:
    """The bearings of each member and the problems: members not searched, ends without support."""
    n = len(axes.plan)
    supports = [[] for _ in range(n)]
    for k, record in zip(bearings.member.tolist(), bearings.records):
        supports[k].append(record)
    end_a, end_b = np.zeros(n, dtype=bool), np.zeros(n, dtype=bool)
    end_a[bearings.member[bearings.wide_start <= end_reach]] = True
    end_b[bearings.member[bearings.wide_end >= axes.plan[bearings.member] - end_reach]] = True
    results = []
    for k, (a, b) in enumerate(zip(end_a.tolist(), end_b.tolist())):
        problem = axes.problem(k)
        held = {"A": a or _overhang(supports[k], 0.0, overhang_ratio),
                "B": b or _overhang(supports[k][::-1], float(axes.plan[k]), overhang_ratio)}
        problems = [problem] if problem else [_no_support(end, supports[k], float(axes.plan[k]))
                                              for end, ok in held.items() if not ok]
        results.append(MemberSupports(supports[k], problems))
    return results


def _overhang(ordered: list, end: float, ratio: float) -> bool:
    """Whether the member's end at ``end`` overhangs the nearest of two or more supports
    (``ordered`` from that end) by no more than ``ratio`` times the span beside it."""
    if len(ordered) < 2:
        return False
    free, span = abs(ordered[0].x - end), abs(ordered[1].x - ordered[0].x)
    return free <= ratio * span


def _no_support(end: str, supports: list, length: float) -> str:
    """"no support found at end B", saying how far the member runs past its last one of two or more."""
    if len(supports) < 2:
        return f"no support found at end {end}"
    nearest = supports[0] if end == "A" else supports[-1]
    free = nearest.x if end == "A" else length - nearest.x
    return (f"no support found at end {end} (it runs {free:.1f} in past the support at {nearest.x:.1f} in, "
            "too far for an overhang)")
