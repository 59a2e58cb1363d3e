"""The slabs and spaces over each member: where a project's area loads by slab and by space usage act.

A slab or roof is over a member when its footprint covers at least ``MIN_COVER_SHARE`` of the
member's plan length and its thickness reaches the member's top (its underside at or below the
top, its upper face at or above it, within the tolerance): a deck laid on the joists, or a floor
slab modelled around them. A space is over a member when its footprint covers that share and its
floor (the box's underside) lies above the member's whole top line over the covered stretch, by
no more than ``FLOOR_BUILD_UP`` (sheathing, topping and finishes between joist and room): the
joists under a room carry its use. Footprints are the elements' world boxes, so an L-shaped room
covers its whole box (common practice approximation, conservative for the loads it gives).

Same grid search as :mod:`.supports` (no pairwise comparison). Pure numpy; lengths in inches.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from .supports import _Axes, _BoxTable, _candidates, _check_count, _Crossings, _range_along

#: share of a member's plan length a slab or space must cover to load it
MIN_COVER_SHARE = 0.10
#: in: the most a space's floor may sit above the top of a member under it
FLOOR_BUILD_UP = 12.0

SLAB_KINDS = ("slab", "roof")
SPACE_KINDS = ("space",)


class PlacesOver(NamedTuple):
    """What lies over one member: (ElementBox, covered share of its plan length) pairs, the
    largest share first."""

    slabs: list
    spaces: list


def places_over(guids: list, starts: np.ndarray, ends: np.ndarray, depths: np.ndarray, boxes: list,
                tolerance: float = 1.0) -> list:
    """The slabs and spaces over each member (a PlacesOver per member, input order).

    ``starts`` and ``ends`` are (n, 3) world coordinates of the members' axis ends, ``depths``
    their depths d; ``boxes`` the ElementBox records of the model (other kinds are ignored).
    """
    axes = _Axes(starts, ends, depths)
    _check_count(guids, len(axes.plan))
    slab_table, space_table = _BoxTable(boxes, SLAB_KINDS), _BoxTable(boxes, SPACE_KINDS)
    # the member top heights at which each box can fit: the grid cubes to look in
    slab_levels = (slab_table.lo[:, 2] - tolerance, slab_table.hi[:, 2] + tolerance)
    floor_levels = (space_table.lo[:, 2] - FLOOR_BUILD_UP, space_table.lo[:, 2] + tolerance)
    slabs = _covering(axes, slab_table, slab_levels, tolerance, _slab_reaches_top)
    spaces = _covering(axes, space_table, floor_levels, tolerance, _floor_above_top)
    return [PlacesOver(a, b) for a, b in zip(slabs, spaces)]


def _slab_reaches_top(table: _BoxTable, box, low, high, tolerance: float):
    """Slab box from underside to upper face overlaps the member's top line (± tolerance)."""
    return (table.lo[box, 2] <= high + tolerance) & (table.hi[box, 2] >= low - tolerance)


def _floor_above_top(table: _BoxTable, box, low, high, tolerance: float):
    """The space's floor is above the member's whole top line, by at most FLOOR_BUILD_UP."""
    floor = table.lo[box, 2]
    return (floor >= high - tolerance) & (floor <= low + FLOOR_BUILD_UP)


def _covering(axes: _Axes, table: _BoxTable, levels: tuple, tolerance: float, fits) -> list:
    """Per member, the (ElementBox, share) of the boxes that cover enough of it and fit, largest
    share first; ``levels`` are the lowest and highest member top at which each box may fit."""
    out = [[] for _ in range(len(axes.plan))]
    member, box = _candidates(axes, axes.top, table, levels, tolerance)
    if not len(member):
        return out
    crossing = _Crossings(axes, table, member, box, tolerance)
    low, high = _range_along(axes.top[member], axes.rise[member], np.nan_to_num(crossing.start),
                             np.nan_to_num(crossing.end))
    share = np.nan_to_num(crossing.end - crossing.start) / np.where(axes.valid, axes.plan, 1.0)[member]
    keep = np.isfinite(crossing.start) & (share >= MIN_COVER_SHARE) & fits(table, box, low, high, tolerance)
    member, box, share = member[keep], box[keep], share[keep]
    for k in np.lexsort((-share, member)).tolist():
        out[int(member[k])].append((table.boxes[int(box[k])], float(share[k])))
    return out


def distance_to_edge(box, point: np.ndarray, direction: np.ndarray) -> float:
    """Plan distance (in) from ``point`` (x, y) along the unit plan ``direction`` to the edge of
    an ElementBox's footprint; 0 when the point is outside it."""
    lo, hi = np.asarray(box.lo[:2], dtype=float), np.asarray(box.hi[:2], dtype=float)
    if np.any(point < lo) or np.any(point > hi):
        return 0.0
    with np.errstate(divide="ignore"):
        exits = np.where(direction > 0, (hi - point) / direction, np.where(direction < 0, (lo - point) / direction, np.inf))
    return float(exits.min())


#: element kinds that carry the slab strip beside an edge member (a wall or beam parallel to it)
_STRIP_SUPPORT_KINDS = ("wall", "beam", "member")
_PAST_EDGE = 48.0  # in: how far past the slab edge the search line runs, to find a whole wall under the edge


def edge_overhangs(guids: list, mids: np.ndarray, depths: np.ndarray, outward: np.ndarray, slabs: list,
                   boxes: list, tolerance: float = 1.0) -> tuple:
    """(overhang in, note) of each edge member of a framing run: how much of the slab beyond it,
    measured from its centre line, it carries (common practice).

    ``mids`` are the members' (k, 3) axis mid-points, ``depths`` their depths, ``outward`` (k, 2)
    unit plan vectors pointing away from their neighbour and ``slabs`` the ElementBox of the slab
    over each (None where there is none: no overhang). The overhang reaches the slab's edge, or,
    when a wall or beam runs beside the member on that side before the edge (reaching from below
    the member's top to its bottom or higher, and beginning beside the member rather than under
    its mid-point), half the distance to that element's centre: the rest of the strip bears on it.
    """
    mids, outward = np.asarray(mids, dtype=float).reshape(-1, 3), np.asarray(outward, dtype=float).reshape(-1, 2)
    to_edge = np.array([distance_to_edge(s, m[:2], o) if s is not None else 0.0
                        for s, m, o in zip(slabs, mids, outward)])
    ends = mids.copy()
    ends[:, :2] += outward * (to_edge + _PAST_EDGE)[:, None]
    support, names = _nearest_strip_support(guids, mids, ends, np.asarray(depths, dtype=float), boxes, tolerance, to_edge)
    overhang = np.where(np.isfinite(support), support / 2, to_edge)
    notes = [
        "" if s is None else (f"half the slab strip to {name} beside it" if name
                              else f"to the edge of {s.ifc_class} '{s.name or s.global_id}'")
        for s, name in zip(slabs, names)
    ]
    return overhang, notes


def _nearest_strip_support(guids, starts, ends, depths, boxes, tolerance: float, to_edge) -> tuple:
    """(distance in to the centre of the nearest wall or beam the search lines cross before the
    slab edge, NaN for none; its label, "" for none) of each search line from a member's mid-point."""
    axes = _Axes(starts, ends, depths)
    table = _BoxTable(boxes, _STRIP_SUPPORT_KINDS)
    distance, names = np.full(len(axes.plan), np.nan), [""] * len(axes.plan)
    member, box = _candidates(axes, axes.bottom, table, (table.lo[:, 2] - tolerance, table.hi[:, 2] + tolerance), tolerance)
    if not len(member):
        return distance, names
    codes = {g: k for k, g in enumerate(guids)}
    own = np.array([codes.get(table.boxes[j].global_id, -1) == k for k, j in zip(member.tolist(), box.tolist())], dtype=bool)
    crossing = _Crossings(axes, table, member, box, tolerance)
    centre = (crossing.start + crossing.end) / 2
    # the element reaches from below the member's top up to its bottom or higher
    beside = (table.hi[box, 2] >= axes.bottom[member] - tolerance) & (table.lo[box, 2] <= axes.top[member] + tolerance)
    keep = ~own & np.isfinite(centre) & beside & (crossing.start <= to_edge[member]) & (crossing.start > tolerance)
    member, box, centre = member[keep], box[keep], centre[keep]
    for k in np.lexsort((centre, member))[::-1].tolist():  # the nearest last, so it stays
        distance[member[k]] = centre[k]
        b = table.boxes[int(box[k])]
        names[member[k]] = f"{b.ifc_class} '{b.name or b.global_id}'"
    return distance, names
