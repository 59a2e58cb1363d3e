"""Framing runs found in the members' geometry, and each member's tributary width.

Parallel members in one storey and elevation band that run side by side (their plan extents
overlap along their direction over most of the shorter one) may be neighbours; a member's neighbour on each side is the nearest of them across its
direction, at most ``max_spacing`` on centre. Chains of neighbours form a framing RUN (the joists
of one bay, the rafters of one roof slope); a gap wider than ``max_spacing`` ends a run. Each
member carries half the spacing to each neighbour.

No pairwise comparison of all members: members are bucketed by storey, elevation band and plan
direction, sorted by their offset across the bucket's direction, and each is compared only with
the members near it in that order (within ``max_spacing``, widened by how far the members of the
bucket turn from its direction). Pure numpy and pandas; all lengths in inches.
"""

from __future__ import annotations

from typing import Callable, Optional

import numpy as np
import pandas as pd

from ..errors import IfcCheckError

#: NDS 2018, 4.3.9: repetitive members are three or more spaced not more than 24 in on centre
REPETITIVE_COUNT = 3
REPETITIVE_SPACING = 24.0  # in

#: share of the shorter member's length two members must run side by side to share the floor between them
SHARED_LENGTH = 0.5
_OVERLAP = 1e-6  # in: plan extents must overlap by more than this (members meeting end to end do not)
_NO_PLAN = 1e-9  # in: a plan projection shorter than this has no plan direction (vertical or unknown)
_ROUNDING = 1e-9  # in: rounding allowed on the 24 in limit


def tributary_widths(
    axes_start: np.ndarray,
    axes_end: np.ndarray,
    widths: np.ndarray,
    storeys: list,
    max_spacing: float = 48.0,
    angle_tol_deg: float = 5.0,
    elevation_band: float = 6.0,
    edge_overhang: "float | Callable" = 0.0,
    names: Optional[list] = None,
) -> pd.DataFrame:
    """Framing run, neighbour spacings and tributary width of each member (inches).

    ``axes_start`` and ``axes_end`` are (n, 3) world coordinates of the members' axis ends,
    ``widths`` their widths b, ``storeys`` the storey name of each and ``names`` (optional) the
    names used in the notes. Two members are candidates to be neighbours when they are in the
    same storey, parallel in plan within ``angle_tol_deg`` (either sense: an axis drawn the other
    way is the same direction), their mid-points within ``elevation_band`` in height, and their
    plan extents overlap along their direction over more than half the shorter one's length
    (``SHARED_LENGTH``; lapped joists are not neighbours), and they do not cut into each other (clear
    distance, centre-to-centre minus half of each width, not negative: a member drawn twice is
    not its own neighbour; NaN widths count as 0). A member's neighbour on each side is the
    nearest candidate, measured across the member's own direction, if it is not farther than
    ``max_spacing`` on centre. A run is a chain of neighbours.

    Tributary width (common practice): half the centre-to-centre spacing to each neighbour, so
    joists at 16 in on centre carry 16 in. This is the same as half the clear distance to each
    neighbour plus half the member's own width on each side. An edge member (one neighbour)
    carries half that spacing plus ``edge_overhang`` on its outside; a member with no neighbour
    gets NaN (unknown). ``edge_overhang`` is a length, or a function of (input rows of the edge
    members, their plan mid-points (k, 2), unit plan vectors pointing away from their neighbour
    (k, 2)) giving each one's overhang: the distance from its centre line to the slab edge.

    Columns (index = input order): ``run`` (id of the chain of neighbours, -1 for none),
    ``run_size`` (0 for none), ``spacing_left`` and ``spacing_right`` (centre-to-centre to the
    neighbour on the left and right looking along the member in the run's direction, the one
    between 0° and 180° from +x towards +y; NaN where there is none), ``tributary_width``, ``repetitive``
    (NDS 2018, 4.3.9: in a chain of three or more neighbours each at 24 in on centre or less; the
    load-distributing sheathing the clause also asks for is the caller's to find: the design
    inputs look for a slab over the member) and ``note``.
    """
    start, end = np.asarray(axes_start, dtype=float), np.asarray(axes_end, dtype=float)
    n = len(start)
    _check_shapes(start, end, widths, storeys, names, n)
    labels = list(names) if names is not None else [f"member {k}" for k in range(n)]
    layout = _Layout(start, end, np.asarray(widths, dtype=float), storeys, angle_tol_deg, elevation_band)
    (left, spacing_left), (right, spacing_right) = layout.neighbours(max_spacing, angle_tol_deg, elevation_band)
    m = len(layout.rows)
    run, run_size = _runs(m, left, right)
    close = spacing_left <= REPETITIVE_SPACING + _ROUNDING  # NaN compares False
    close_right = spacing_right <= REPETITIVE_SPACING + _ROUNDING
    _, close_size = _runs(m, np.where(close, left, -1), np.where(close_right, right, -1))

    table = pd.DataFrame(
        {
            "run": np.full(n, -1, dtype=int),
            "run_size": np.zeros(n, dtype=int),
            "spacing_left": np.full(n, np.nan),
            "spacing_right": np.full(n, np.nan),
            "tributary_width": np.full(n, np.nan),
            "repetitive": np.zeros(n, dtype=bool),
        }
    )
    rows = layout.rows  # input row of each member with a plan direction
    table.loc[rows, "run"] = run
    table.loc[rows, "run_size"] = run_size
    table.loc[rows, "spacing_left"] = spacing_left
    table.loc[rows, "spacing_right"] = spacing_right
    overhang = layout.edge_overhangs(spacing_left, spacing_right, edge_overhang)
    table.loc[rows, "tributary_width"] = _tributary(spacing_left, spacing_right, overhang)
    table.loc[rows, "repetitive"] = close_size >= REPETITIVE_COUNT
    table["note"] = _notes(table, rows, left, right, labels, max_spacing, overhang)
    return table


def _check_shapes(start, end, widths, storeys, names, n: int) -> None:
    if start.shape != (n, 3) or end.shape != (n, 3):
        raise IfcCheckError(f"axis ends must be arrays of shape (n, 3), not {start.shape} and {end.shape}")
    lengths = {"widths": len(widths), "storeys": len(storeys)}
    if names is not None:
        lengths["names"] = len(names)
    wrong = {name: size for name, size in lengths.items() if size != n}
    if wrong:
        raise IfcCheckError(f"{', '.join(wrong)} must have one entry per member ({n}), not {wrong}")


class _Layout:
    """The members with a plan direction (``rows``: their input rows), bucketed by storey,
    elevation band and direction, and sorted by (bucket, offset across the bucket's direction)."""

    def __init__(self, start: np.ndarray, end: np.ndarray, widths: np.ndarray, storeys: list, angle_tol: float, band: float) -> None:
        plan = end[:, :2] - start[:, :2]
        plan_length = np.hypot(plan[:, 0], plan[:, 1])
        has_plan = np.isfinite(start).all(axis=1) & np.isfinite(end).all(axis=1) & (plan_length > _NO_PLAN)
        rows = np.flatnonzero(has_plan)
        storey = pd.factorize(pd.Series(list(storeys), dtype=object).fillna("").to_numpy()[rows])[0]
        angle = np.degrees(np.arctan2(plan[rows, 1], plan[rows, 0])) % 180.0  # either sense
        angle[angle >= 180.0] = 0.0  # -tiny % 180 rounds to 180
        mid = (start[rows] + end[rows]) / 2
        bucket, mean, relative = _direction_buckets(_gap_groups(storey, mid[:, 2], band), angle, angle_tol)
        own = _plan_vectors(mean[bucket] + relative)  # each member's own direction
        bucket_along, bucket_across = _plan_vectors(mean[bucket])
        offset = np.einsum("ij,ij->i", mid[:, :2], bucket_across)
        ends = np.stack([np.einsum("ij,ij->i", p[rows, :2], bucket_along) for p in (start, end)])
        # the most a member turns from its bucket's direction (radians) and the longest member
        turn, longest = np.zeros(len(mean)), np.zeros(len(mean))
        np.maximum.at(turn, bucket, np.radians(np.abs(relative)))
        np.maximum.at(longest, bucket, plan_length[rows])
        order = np.lexsort((offset, bucket))
        self.rows = rows[order]
        self.bucket = bucket[order]
        self.offset = offset[order]
        self.turn, self.longest = turn[self.bucket], longest[self.bucket]
        self.angle = (mean[bucket] + relative)[order]
        self.across = own[1][order]
        self.mid = mid[order]
        self.width = np.nan_to_num(widths[rows][order])
        self.low, self.high = ends.min(axis=0)[order], ends.max(axis=0)[order]

    def edge_overhangs(self, spacing_left: np.ndarray, spacing_right: np.ndarray, edge_overhang) -> np.ndarray:
        """Overhang of each member with a neighbour on one side only (0 for the others): the
        given length, or what the given function says for the edge members."""
        overhang = np.zeros(len(self.rows))
        edge = np.isfinite(spacing_left) != np.isfinite(spacing_right)
        if not callable(edge_overhang):
            overhang[edge] = edge_overhang
        elif edge.any():
            # the outside is left (across) of a member whose only neighbour is on its right
            outward = np.where(np.isfinite(spacing_right)[:, None], self.across, -self.across)[edge]
            overhang[edge] = np.asarray(edge_overhang(self.rows[edge], self.mid[edge, :2], outward), dtype=float)
        return overhang

    def neighbours(self, max_spacing: float, angle_tol: float, band: float) -> tuple:
        """((left, spacing), (right, spacing)): position of each member's nearest neighbour on its
        left and on its right (-1 for none) and the centre-to-centre distance to it (NaN for none).

        Compares each member only with the next members in sorted order while they are in its
        bucket and near enough across it.
        """
        m = len(self.offset)
        # offsets across the bucket differ from a member's own by at most the distance between
        # the mid-points (spacing plus length) times the member's turn from the bucket
        reach = max_spacing + (max_spacing + self.longest) * self.turn + _OVERLAP
        pairs_i, pairs_j = [], []
        window = np.arange(m)
        for k in range(1, m):
            window = window[window + k < m]
            j = window + k
            near = (self.bucket[j] == self.bucket[window]) & (self.offset[j] - self.offset[window] <= reach[window])
            window, j = window[near], j[near]
            if not len(window):
                break
            found = self._candidates(window, j, angle_tol, band)
            pairs_i.append(window[found])
            pairs_j.append(j[found])
        i = np.concatenate(pairs_i) if pairs_i else np.zeros(0, dtype=int)
        j = np.concatenate(pairs_j) if pairs_j else np.zeros(0, dtype=int)
        member, other = np.r_[i, j], np.r_[j, i]
        distance = np.einsum("ij,ij->i", self.mid[other, :2] - self.mid[member, :2], self.across[member])
        clear = np.abs(distance) - (self.width[member] + self.width[other]) / 2
        keep = (np.abs(distance) <= max_spacing) & (np.abs(distance) > _OVERLAP) & (clear > -_OVERLAP)
        return tuple(_nearest(m, member[keep], other[keep], distance[keep], side) for side in (1.0, -1.0))

    def _candidates(self, i: np.ndarray, j: np.ndarray, angle_tol: float, band: float) -> np.ndarray:
        """True where members i and j of one bucket may be neighbours: parallel, level and side
        by side over more than ``SHARED_LENGTH`` of the shorter one's length (joists lapped over a
        bearing, which share only the lap, are not neighbours)."""
        parallel = np.abs(self.angle[i] - self.angle[j]) <= angle_tol
        level = np.abs(self.mid[i, 2] - self.mid[j, 2]) <= band
        overlap = np.minimum(self.high[i], self.high[j]) - np.maximum(self.low[i], self.low[j])
        shorter = np.minimum(self.high[i] - self.low[i], self.high[j] - self.low[j])
        side_by_side = overlap > np.maximum(_OVERLAP, SHARED_LENGTH * shorter)
        return parallel & level & side_by_side


def _nearest(m: int, member: np.ndarray, other: np.ndarray, distance: np.ndarray, side: float) -> tuple:
    """(neighbour, spacing) of each of m members: the nearest ``other`` on the side of ``distance``'s sign."""
    on_side = np.sign(distance) == side
    member, other, distance = member[on_side], other[on_side], np.abs(distance[on_side])
    order = np.lexsort((distance, member))
    first = order[np.r_[True, np.diff(member[order]) != 0]] if len(order) else order
    neighbour, spacing = np.full(m, -1), np.full(m, np.nan)
    neighbour[member[first]], spacing[member[first]] = other[first], distance[first]
    return neighbour, spacing


def _gap_groups(group: np.ndarray, value: np.ndarray, gap: float) -> np.ndarray:
    """Sub-groups of each group: sorted by value, a new one wherever the step exceeds ``gap``.

    Unlike fixed bins, this never splits values that lie close together across a bin edge.
    """
    order = np.lexsort((value, group))
    new = np.ones(len(order), dtype=bool)
    new[1:] = (np.diff(group[order]) != 0) | (np.diff(value[order]) > gap)
    ids = np.empty(len(order), dtype=int)
    ids[order] = np.cumsum(new) - 1
    return ids


def _direction_buckets(elevation: np.ndarray, angle: np.ndarray, angle_tol: float) -> tuple:
    """(bucket, mean direction of each bucket, each member's angle from it), degrees.

    Directions are grouped by gaps (see _gap_groups), near 0° and near 180° joined; a group
    chained wider than ``angle_tol`` (directions fanning out step by step) is split at its
    largest gaps until none is.
    """
    bucket = _gap_groups(elevation, angle, angle_tol)
    if not len(bucket):
        return bucket, np.zeros(0), np.zeros(0)
    order = np.lexsort((angle, elevation))
    first = np.flatnonzero(np.r_[True, np.diff(elevation[order]) != 0])
    last = np.r_[first[1:] - 1, len(order) - 1]
    lo, hi = order[first], order[last]
    wraps = (bucket[lo] != bucket[hi]) & (angle[lo] + 180.0 - angle[hi] <= angle_tol)
    rename = np.arange(bucket.max() + 1)
    rename[bucket[hi[wraps]]] = bucket[lo[wraps]]
    bucket = pd.factorize(rename[bucket])[0]
    bucket = _split_wide(bucket, _turn_from(angle, _mean_direction(bucket, angle)[bucket]), angle_tol)
    mean = _mean_direction(bucket, angle)
    return bucket, mean, _turn_from(angle, mean[bucket])


def _mean_direction(bucket: np.ndarray, angle: np.ndarray) -> np.ndarray:
    """Mean direction (degrees, 0 to 180) of each bucket, averaged on doubled angles so that
    directions near 0° and near 180° agree."""
    doubled = np.radians(2.0 * angle)
    mean = np.arctan2(np.bincount(bucket, np.sin(doubled)), np.bincount(bucket, np.cos(doubled)))
    return np.degrees(mean / 2.0) % 180.0


def _turn_from(angle: np.ndarray, reference: np.ndarray) -> np.ndarray:
    """Angle from a reference direction, either sense, in degrees from -90 to 90."""
    return (angle - reference + 90.0) % 180.0 - 90.0


def _split_wide(bucket: np.ndarray, turn: np.ndarray, angle_tol: float) -> np.ndarray:
    """Buckets whose directions spread wider than ``angle_tol`` split at their largest gaps."""
    order = np.lexsort((turn, bucket))
    ordered = turn[order]
    new = np.r_[True, np.diff(bucket[order]) != 0]
    first = np.flatnonzero(new)
    last = np.r_[first[1:], len(order)]
    for lo, hi in zip(first.tolist(), last.tolist()):
        stack = [(lo, hi)]
        while stack:
            lo, hi = stack.pop()
            if ordered[hi - 1] - ordered[lo] > angle_tol:
                cut = lo + 1 + int(np.argmax(np.diff(ordered[lo:hi])))
                new[cut] = True
                stack += [(lo, cut), (cut, hi)]
    split = np.empty(len(order), dtype=int)
    split[order] = np.cumsum(new) - 1
    return split


def _plan_vectors(direction: np.ndarray) -> tuple:
    """Unit plan vectors along each direction (degrees) and across it (turned 90° to the left)."""
    radians = np.radians(direction)
    along = np.column_stack([np.cos(radians), np.sin(radians)])
    return along, np.column_stack([-along[:, 1], along[:, 0]])


def _tributary(left: np.ndarray, right: np.ndarray, overhang: np.ndarray) -> np.ndarray:
    """Half the spacing to each neighbour; at an edge half the one spacing plus the overhang."""
    half = np.nan_to_num(left / 2) + np.nan_to_num(right / 2)
    return np.where(np.isfinite(left) | np.isfinite(right), half + overhang, np.nan)


def _runs(m: int, left: np.ndarray, right: np.ndarray) -> tuple:
    """(run id, run size) of each of m members: chains of neighbours; -1 and 0 for a lone member."""
    pairs = np.concatenate([np.column_stack([np.arange(m), links]) for links in (left, right)])
    pairs = pairs[pairs[:, 1] >= 0]
    linked = np.zeros(m, dtype=bool)
    linked[pairs.ravel()] = True
    root = _components(m, pairs[:, 0], pairs[:, 1])
    run, size = np.full(m, -1), np.zeros(m, dtype=int)
    if linked.any():
        run[linked] = pd.factorize(root[linked])[0]
        size[linked] = np.bincount(run[linked])[run[linked]]
    return run, size


def _components(m: int, a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Connected components of a graph of m nodes and edges (a, b): the smallest node of each.

    Hooks the larger root of every edge onto the smaller, then jumps pointers until each node
    points at its root; repeats until no edge joins two roots.
    """
    parent = np.arange(m)
    while True:
        ra, rb = parent[a], parent[b]
        apart = ra != rb
        if not apart.any():
            return parent
        np.minimum.at(parent, np.maximum(ra, rb)[apart], np.minimum(ra, rb)[apart])
        while True:
            jumped = parent[parent]
            if np.array_equal(jumped, parent):
                break
            parent = jumped


def _notes(table: pd.DataFrame, rows: np.ndarray, left, right, labels: list, max_spacing: float, overhang: np.ndarray) -> list:
    """One sentence per member saying where its tributary width comes from."""
    notes = ["tributary width unknown: the axis has no plan direction (unknown or vertical)"] * len(table)
    columns = zip(
        rows.tolist(),
        np.where(left >= 0, rows[left], -1).tolist(),
        np.where(right >= 0, rows[right], -1).tolist(),
        *(table[name].to_numpy()[rows].tolist() for name in ("spacing_left", "spacing_right", "tributary_width", "run_size", "repetitive")),
        overhang.tolist(),
    )
    for row, left_row, right_row, s_left, s_right, width, size, repetitive, edge in columns:
        notes[row] = _note(labels, left_row, right_row, s_left, s_right, width, size, repetitive, max_spacing, edge)
    return notes


def _note(labels, left, right, s_left, s_right, width, size, repetitive, max_spacing, overhang) -> str:
    if left < 0 and right < 0:
        return (
            f"tributary width unknown: no parallel member of the same storey and elevation band "
            f"overlaps it within {max_spacing:.1f} in"
        )
    if left >= 0 and right >= 0:
        basis = (
            f"half the spacing to {labels[right]} and {labels[left]} "
            f"({s_right:.1f} in, {s_left:.1f} in; run of {size} parallel members)"
        )
    else:
        other, spacing = (labels[left], s_left) if left >= 0 else (labels[right], s_right)
        basis = (
            f"half the {spacing:.1f} in spacing to {other} plus an edge overhang of {overhang:.1f} in "
            f"(edge of a run of {size} parallel members)"
        )
    cr = "; repetitive members (3 or more at 24 in on centre or less, NDS 2018 4.3.9)" if repetitive else ""
    return f"tributary width {width:.1f} in: {basis}{cr}"
