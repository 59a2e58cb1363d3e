"""Direct stiffness solution of straight Euler-Bernoulli members, batched over members meshed alike.

Units: the core unit system of :mod:`ifccheck.units` -- inch, lbf, lbf/in, psi; moments in
lbf*in, EI in lbf*in^2.

Signs: loads downward positive (line loads and forces), concentrated moments clockwise
positive; reactions positive upward; reaction moments at fixed supports positive clockwise (the
couple the support puts on the member); shear V(x) is the resultant of the upward forces left of
x (so dM/dx = V); moment M(x) positive sagging (bottom edge in tension); deflection positive
downward; slope is d(deflection)/dx.

How a member is solved: nodes go at both ends, at every support, every concentrated load and
every start or end of a line load, so that within each element the line load is linear. The
stiffness method then gives the exact nodal deflections and slopes, and each element's exact
closed-form solution (:mod:`.elements`) gives V, M and the deflection anywhere, with extremes at
the roots of V and of the slope. Members with the same number of nodes and the same supports at
the same node numbers share one stacked system (one ``np.linalg.solve`` call for all of them).

Each load type is solved once per segment (span or overhang) where it is a patterned live load,
once in full otherwise; every combination and live-load pattern is a linear combination of these
unit solutions.
"""

from __future__ import annotations

import bisect
from dataclasses import dataclass

import numpy as np

from ..model import LOAD_TYPES
from . import elements as el
from .layout import (
    BeamInputError,
    BeamMember,
    PointLoad,
    PointMoment,
    UniformLoad,
    check_load,
    load_positions,
    position_tolerance,
    segments_of,
)
from .patterns import FULL_PATTERN, LIVE_LOAD_TYPES, live_load_patterns

#: members x cases x elements handled at once when finding extremes (bounds the memory used)
CHUNK_SIZE = 300_000


@dataclass(frozen=True)
class Case:
    """One analysed loading: a load type alone in full, or a combination under one live-load pattern."""

    kind: str  # "unit" or "combination"
    name: str  # load type or combination name
    pattern: str  # pattern name ("all" for full loading)
    loaded: tuple  # loaded segment indices


@dataclass
class MemberMesh:
    """One member cut into elements: node positions, support nodes and its spans and overhangs."""

    member: BeamMember
    loads: tuple
    x: np.ndarray
    support_nodes: tuple
    segments: tuple
    segment_first_node: tuple  # node number where each segment starts (and the last end node)

    @property
    def key(self) -> tuple:
        """Members with equal keys assemble alike and are solved in one stacked system."""
        fixed = tuple(s.holds_rotation for s in self.member.layout.supports)
        return (len(self.x), self.support_nodes, fixed)


def mesh_member(member: BeamMember) -> MemberMesh:
    """Cut ``member`` into elements at its ends, supports, load points and line-load ends."""
    if not isinstance(member, BeamMember):
        raise BeamInputError(f"{member!r} is not a BeamMember (a BeamLayout with its loads)")
    layout = member.layout
    L = layout.length
    loads = tuple(check_load(load, L) for load in member.loads)
    points = [0.0, L] + [s.x for s in layout.supports] + [p for load in loads for p in load_positions(load)]
    nodes = _merge_close([min(max(p, 0.0), L) for p in points], position_tolerance(L))
    segments = segments_of(layout)
    support_nodes = tuple(_node_of(nodes, s.x) for s in layout.supports)
    first = tuple(_node_of(nodes, seg.start) for seg in segments) + (len(nodes) - 1,)
    return MemberMesh(member, loads, np.array(nodes), support_nodes, segments, first)


def _merge_close(points: list, tol: float) -> list:
    """Sorted points with those closer than ``tol`` to the previous one dropped (the last is kept exact)."""
    points = sorted(points)
    merged = [points[0]]
    for p in points[1:]:
        if p - merged[-1] > tol:
            merged.append(p)
    merged[-1] = points[-1]
    return merged


def _node_of(nodes, position: float) -> int:
    """Index of the node nearest to ``position`` (``nodes`` ascending)."""
    i = bisect.bisect_left(nodes, position)
    if i == len(nodes) or (i > 0 and position - nodes[i - 1] < nodes[i] - position):
        i -= 1
    return i


class UnitColumns:
    """The unit load cases of a group: one per load type, or per segment for patterned live loads."""

    def __init__(self, load_types: tuple, n_segments: int, element_segment: np.ndarray):
        self.columns = []  # (load type, segment index or None for the whole member)
        self.of_element = {}  # load type -> column number of each element
        for t in load_types:
            base = len(self.columns)
            if t in LIVE_LOAD_TYPES and n_segments > 1:
                self.columns += [(t, g) for g in range(n_segments)]
                self.of_element[t] = base + element_segment
            else:
                self.columns.append((t, None))
                self.of_element[t] = np.full(len(element_segment), base)

    def __len__(self):
        return len(self.columns)

    def weights(self, factors: dict, loaded: tuple) -> np.ndarray:
        """Row combining the unit columns for load-type ``factors`` with live load on ``loaded`` segments."""
        return np.array([factors.get(t, 0.0) * (g is None or g in loaded) for t, g in self.columns])


class GroupSolution:
    """Unit solutions and extremes of every case for members that share a mesh key.

    Arrays are indexed ``[member, case, ...]``; positions are in inches from each member's left end.
    """

    def __init__(self, meshes: list, combinations: dict):
        self.meshes = meshes
        first = meshes[0]
        self.n_nodes = len(first.x)
        self.n_elements = self.n_nodes - 1
        self.support_nodes = np.array(first.support_nodes)
        self.fixed = np.array(first.key[2])
        self.segment_first_node = first.segment_first_node
        self.n_segments = len(first.segments)
        self.segment_labels = tuple(seg.label for seg in first.segments)
        starts = np.array(self.segment_first_node[:-1])
        self.element_segment = np.searchsorted(starts, np.arange(self.n_elements), side="right") - 1
        present = {load.load_type for m in meshes for load in m.loads}
        self.load_types = tuple(t for t in LOAD_TYPES if t in present)
        self.columns = UnitColumns(self.load_types, self.n_segments, self.element_segment)
        self.patterns = live_load_patterns(self.segment_labels)
        self.combinations = combinations
        self._envelopes = {}
        self._case_index = {}
        self.cases, weights = self._cases(combinations)
        self.weights = np.array(weights).reshape(len(self.cases), len(self.columns))
        self.x = np.stack([m.x for m in meshes])
        self.h = np.diff(self.x, axis=1)
        self.EI = np.array([m.member.layout.EI for m in meshes])
        self._fill_loads()
        self._solve_units()
        self._find_extremes()

    # -- cases -------------------------------------------------------------------------------
    def _cases(self, combinations: dict):
        cases, weights = [], []
        full = tuple(range(self.n_segments))
        for t in self.load_types:
            cases.append(Case("unit", t, FULL_PATTERN, full))
            weights.append(self.columns.weights({t: 1.0}, full))
        for name, factors in combinations.items():
            patterned = any(factors.get(t, 0.0) != 0.0 for t in LIVE_LOAD_TYPES if t in self.load_types)
            for p in self.patterns if patterned else self.patterns[:1]:
                cases.append(Case("combination", name, p.name, p.loaded))
                weights.append(self.columns.weights(factors, p.loaded))
        return cases, weights

    def case_indices(self, kind: str, name: str) -> np.ndarray:
        """Positions in ``cases`` of the unit case or of the combination's patterns called ``name``."""
        if (kind, name) not in self._case_index:
            found = [i for i, c in enumerate(self.cases) if c.kind == kind and c.name == name]
            self._case_index[kind, name] = np.array(found, int)
        return self._case_index[kind, name]

    # -- loads -------------------------------------------------------------------------------
    def _fill_loads(self):
        N, nc, ne, nn = len(self.meshes), len(self.columns), self.n_elements, self.n_nodes
        self.q0 = np.zeros((N, nc, ne))
        self.q1 = np.zeros((N, nc, ne))
        self.P = np.zeros((N, nc, nn))
        self.C = np.zeros((N, nc, nn))
        for m, mesh in enumerate(self.meshes):
            nodes = mesh.x.tolist()
            for load in mesh.loads:
                self._add_load(m, mesh.x, nodes, load)

    def _add_load(self, m: int, x: np.ndarray, nodes: list, load):
        cols = self.columns.of_element[load.load_type]
        if isinstance(load, (PointLoad, PointMoment)):
            i = _node_of(nodes, load.x)
            col = cols[max(i - 1, 0)]  # a load at an interior support goes with the span on its left
            target, value = (self.P, load.P) if isinstance(load, PointLoad) else (self.C, load.M)
            target[m, col, i] += value
            return
        ia, ib = _node_of(nodes, load.a), _node_of(nodes, load.b)
        if isinstance(load, UniformLoad):
            w = np.full(ib - ia + 1, float(load.w))
        else:  # LinearLoad
            w = load.w1 + (load.w2 - load.w1) * (x[ia : ib + 1] - load.a) / (load.b - load.a)
        e = np.arange(ia, ib)
        self.q0[m, cols[e], e] += w[:-1]
        self.q1[m, cols[e], e] += w[1:]

    # -- stiffness solution --------------------------------------------------------------------
    def _solve_units(self):
        N, nd, h, EI = len(self.meshes), 2 * self.n_nodes, self.h, self.EI[:, None]
        k = EI / h**3
        ke = k[..., None, None] * _unit_stiffness(h)  # (N, ne, 4, 4)
        fe = _equivalent_loads(self.q0, self.q1, h[:, None, :])  # (N, nc, ne, 4)
        K = np.zeros((N, nd, nd))
        F = np.zeros((N, nd, len(self.columns)))
        for e in range(self.n_elements):
            K[:, 2 * e : 2 * e + 4, 2 * e : 2 * e + 4] += ke[:, e]
            F[:, 2 * e : 2 * e + 4, :] += np.swapaxes(fe[:, :, e, :], 1, 2)
        F[:, 0::2, :] += np.swapaxes(self.P, 1, 2)
        F[:, 1::2, :] += np.swapaxes(self.C, 1, 2)
        held = np.zeros(nd, bool)
        held[2 * self.support_nodes] = True
        held[2 * self.support_nodes[self.fixed] + 1] = True
        free = np.nonzero(~held)[0]
        Kff = K[:, free[:, None], free]
        scale = 1.0 / np.sqrt(np.diagonal(Kff, axis1=1, axis2=2))  # Jacobi scaling for conditioning
        y = np.linalg.solve(Kff * scale[:, :, None] * scale[:, None, :], F[:, free, :] * scale[:, :, None])
        u = np.zeros_like(F)
        u[:, free, :] = y * scale[:, :, None]
        ue = np.stack([u[:, 2 * np.arange(self.n_elements) + j, :] for j in range(4)], axis=-1)  # (N, ne, nc, 4)
        ue = np.swapaxes(ue, 1, 2)  # (N, nc, ne, 4)
        p = np.einsum("nepq,ncep->nceq", ke, ue) - fe  # element end forces on the element
        self.units = dict(V0=-p[..., 0], M0=p[..., 1], D0=ue[..., 0], T0=ue[..., 1], q0=self.q0, q1=self.q1)
        self._unit_reactions()

    def _unit_reactions(self):
        """Support reactions of each unit case from the jumps of V and M at the support nodes."""
        u, h = self.units, self.h[:, None, :]
        V_end = u["V0"] - 0.5 * (u["q0"] + u["q1"]) * h
        M_end = u["M0"] + u["V0"] * h - u["q0"] * h**2 / 2 - (u["q1"] - u["q0"]) * h**2 / 6
        zeros = np.zeros(u["V0"].shape[:2] + (1,))
        V_right = np.concatenate([u["V0"], zeros], axis=2)[..., self.support_nodes]
        V_left = np.concatenate([zeros, V_end], axis=2)[..., self.support_nodes]
        M_right = np.concatenate([u["M0"], zeros], axis=2)[..., self.support_nodes]
        M_left = np.concatenate([zeros, M_end], axis=2)[..., self.support_nodes]
        self.unit_reaction = V_right - V_left + self.P[..., self.support_nodes]
        # a pinned or roller support takes no moment: zero there, not round-off
        self.unit_reaction_moment = (M_right - M_left - self.C[..., self.support_nodes]) * self.fixed

    # -- extremes ------------------------------------------------------------------------------
    def _find_extremes(self):
        N, K, ns = len(self.meshes), len(self.cases), self.n_segments
        self.reaction = np.einsum("kc,ncs->nks", self.weights, self.unit_reaction)
        self.reaction_moment = np.einsum("kc,ncs->nks", self.weights, self.unit_reaction_moment)
        self.segment_extremes = {name: np.zeros((N, K, ns)) for name in _SEGMENT_EXTREMES}
        self.max_shear = np.zeros((N, K, 2))  # signed value of largest |V|, x
        self.support_x = np.array([[s.x for s in m.member.layout.supports] for m in self.meshes])
        self.face_x = self._face_positions()
        self.face_shear = np.zeros((N, K) + self.face_x.shape[1:])
        self.case_regions = []  # (member, case, start, end) blocks
        self.combination_regions = {}  # name -> list of (member, start, end) blocks
        step = max(1, CHUNK_SIZE // (K * self.n_elements))
        for lo in range(0, N, step):
            self._extremes_of(slice(lo, min(N, lo + step)))
        self.case_regions = _concat_regions(self.case_regions, 4)
        self.case_region_keys = self.case_regions[:, 0] * K + self.case_regions[:, 1]
        self.combination_regions = {k: _concat_regions(v, 3) for k, v in self.combination_regions.items()}

    def envelope(self, idx: np.ndarray) -> dict:
        """Worst of the cases ``idx`` for every member: ``quantity -> (value, x, case position)``.

        Position is the index into ``idx`` of the governing case. Quantities: ``Mmax``, ``Mmin``,
        ``Dmax``, ``Dmin`` per segment (N, n_seg); ``M+``/``M-`` over the member (N,); ``R+``/``R-``
        and ``Rm+``/``Rm-`` per support (N, n_sup); ``Vface`` per support and face (N, n_sup, 2);
        ``V`` (N,).
        """
        key = tuple(int(k) for k in idx)
        if key not in self._envelopes:
            self._envelopes[key] = self._envelope(np.asarray(idx))
        return self._envelopes[key]

    def _envelope(self, idx: np.ndarray) -> dict:
        se = self.segment_extremes
        out = {}
        for q in ("Mmax", "Mmin", "Dmax", "Dmin"):
            out[q] = _pick(se[q][:, idx], se[q + "_x"][:, idx], largest=q.endswith("max"))
        for q, seg in (("M+", "Mmax"), ("M-", "Mmin")):
            value, x, p = out[seg]
            i = (np.argmax(value, axis=1) if q == "M+" else np.argmin(value, axis=1))[:, None]
            out[q] = tuple(np.take_along_axis(a, i, 1)[:, 0] for a in (value, x, p))
        sx = np.broadcast_to(self.support_x[:, None, :], (len(self.meshes), len(idx), len(self.support_nodes)))
        for q, values in (("R", self.reaction[:, idx]), ("Rm", self.reaction_moment[:, idx])):
            out[q + "+"] = _pick(values, sx, largest=True)
            out[q + "-"] = _pick(values, sx, largest=False)
        faces = self.face_shear[:, idx]
        fx = np.broadcast_to(self.face_x[:, None], faces.shape)
        out["Vface"] = _pick(np.nan_to_num(np.abs(faces)), fx, largest=True, values=faces)
        shear = self.max_shear[:, idx]
        out["V"] = _pick(np.abs(shear[..., 0]), shear[..., 1], largest=True, values=shear[..., 0])
        return out

    def combined_state(self, rows, cases=slice(None)) -> dict:
        """Element states (V0, M0, D0, T0, q0, q1) of the given members and cases, shape (n, k, ne)."""
        w = self.weights[cases]
        return {f: np.einsum("kc,nce->nke", w, self.units[f][rows]) for f in el.STATE_FIELDS}

    def _extremes_of(self, rows: slice):
        st = self.combined_state(rows)
        h = self.h[rows][:, None, :]
        EI = self.EI[rows][:, None, None]
        x0 = self.x[rows][:, None, :-1]
        Vc = el.shear_coefficients(st, h)
        Mc = el.moment_coefficients(st, h)
        V_roots = el.quadratic_roots_in_unit(Vc)
        M_roots = el.bracketed_roots(Mc, el.interval_points(V_roots))
        T_roots = el.bracketed_roots(el.slope_coefficients(st, h, EI), el.interval_points(M_roots))
        q_root = el.linear_root_in_unit(np.stack([st["q0"], st["q1"] - st["q0"]], axis=-1))
        xi_M = el.extreme_candidates(V_roots)
        xi_D = el.extreme_candidates(T_roots)
        xi_V = el.extreme_candidates(q_root)
        M = el.polyval(Mc, xi_M)
        D = el.polyval(el.deflection_coefficients(st, h, EI), xi_D)
        V = el.polyval(Vc, xi_V)
        at_x = lambda xi: x0[..., None] + xi * h[..., None]  # noqa: E731  (element coordinate -> x)
        for name, values, xs in (("M", M, at_x(xi_M)), ("D", D, at_x(xi_D))):
            for g in range(self.n_segments):
                e = slice(self.segment_first_node[g], self.segment_first_node[g + 1])
                for tag, sign in (("max", 1.0), ("min", -1.0)):
                    val, at = _extreme(sign * values[:, :, e], xs[:, :, e])
                    self.segment_extremes[f"{name}{tag}"][rows, :, g] = sign * val
                    self.segment_extremes[f"{name}{tag}_x"][rows, :, g] = at
        val, at = _extreme(np.abs(V), at_x(xi_V), V)
        self.max_shear[rows] = np.stack([val, at], axis=-1)
        self.face_shear[rows] = self._shear_at(Vc, self.x[rows], self.face_x[rows])
        self._regions_of(rows, Mc, M_roots, M, h, x0)

    def _face_positions(self) -> np.ndarray:
        """Support face positions (N, supports, 2), left and right; NaN where no member is beyond the face."""
        xs = self.support_x
        half = np.array([[s.width / 2 for s in m.member.layout.supports] for m in self.meshes])
        L = self.x[:, -1][:, None]
        tol = position_tolerance(L)
        left = np.where(xs - half > tol, xs - half, np.nan)
        right = np.where(xs + half < L - tol, xs + half, np.nan)
        return np.stack([left, right], axis=-1)

    def _shear_at(self, Vc, x, faces):
        """V at the support faces: the left face as the limit from the left, the right from the right."""
        n, k = Vc.shape[:2]
        out = np.empty((n, k) + faces.shape[1:])
        for side in (0, 1):
            xf = np.nan_to_num(faces[..., side])  # (n, s)
            beyond = x[:, None, :] < xf[..., None] if side == 0 else x[:, None, :] <= xf[..., None]
            e = np.clip(beyond.sum(axis=-1) - 1, 0, self.n_elements - 1)
            xi = (xf - np.take_along_axis(x, e, 1)) / np.take_along_axis(np.diff(x, axis=1), e, 1)
            c = np.take_along_axis(Vc, np.broadcast_to(e[:, None, :, None], (n, k, e.shape[1], 3)), axis=2)
            v = el.polyval(c, np.broadcast_to(xi[:, None, :, None], (n, k, e.shape[1], 1)))[..., 0]
            out[..., side] = np.where(np.isnan(faces[..., side])[:, None, :], np.nan, v)
        return out

    def _regions_of(self, rows, Mc, M_roots, M, h, x0):
        """Negative-moment regions of every case and their union over each combination's patterns."""
        pts = el.interval_points(M_roots)
        mid = el.polyval(Mc, 0.5 * (pts[..., :-1] + pts[..., 1:]))
        scale = np.abs(M).max(axis=(2, 3))  # (n, k)
        negative = (mid < -1e-9 * scale[..., None, None]) & (pts[..., 1:] > pts[..., :-1])
        start = x0[..., None] + pts[..., :-1] * h[..., None]
        end = x0[..., None] + pts[..., 1:] * h[..., None]
        n, k = start.shape[:2]
        tol = position_tolerance(self.x[rows][:, -1])  # (n,)
        start, end, negative = (a.reshape(n, k, -1) for a in (start, end, negative))
        row, s, e = el.merge_intervals(start, end, negative, np.broadcast_to(tol[:, None], (n, k)))
        self.case_regions.append(np.stack([row // k + rows.start, row % k, s, e], axis=-1))
        for name in dict.fromkeys(c.name for c in self.cases if c.kind == "combination"):
            idx = self.case_indices("combination", name)
            row, s, e = el.merge_intervals(
                start[:, idx].reshape(n, -1), end[:, idx].reshape(n, -1), negative[:, idx].reshape(n, -1), tol
            )
            self.combination_regions.setdefault(name, []).append(np.stack([row + rows.start, s, e], axis=-1))


def _pick(key: np.ndarray, xs: np.ndarray, largest: bool, values=None):
    """Over the case axis (1): the governing ``values`` (``key`` by default), its x and case position."""
    p = np.argmax(key, axis=1) if largest else np.argmin(key, axis=1)
    at = p[:, None]
    chosen = key if values is None else values
    return np.take_along_axis(chosen, at, 1)[:, 0], np.take_along_axis(xs, at, 1)[:, 0], p


_SEGMENT_EXTREMES = tuple(f"{q}{t}{x}" for q in "MD" for t in ("max", "min") for x in ("", "_x"))


def _extreme(key: np.ndarray, xs: np.ndarray, values=None):
    """Where ``key`` is largest over the element and candidate axes (n, k, e, c): ``values`` there
    (``key`` itself by default) and the position."""
    flat = key.reshape(key.shape[:2] + (-1,))
    i = np.argmax(flat, axis=-1)[..., None]
    picked = flat if values is None else values.reshape(flat.shape)
    return np.take_along_axis(picked, i, -1)[..., 0], np.take_along_axis(xs.reshape(flat.shape), i, -1)[..., 0]


def _concat_regions(blocks: list, width: int) -> np.ndarray:
    return np.concatenate(blocks) if blocks else np.zeros((0, width))


def _unit_stiffness(h: np.ndarray) -> np.ndarray:
    """Beam element stiffness divided by EI/h^3 for DOFs (D_i, T_i, D_j, T_j), shape h.shape + (4, 4)."""
    o = np.ones_like(h)
    rows = [
        [12 * o, 6 * h, -12 * o, 6 * h],
        [6 * h, 4 * h**2, -6 * h, 2 * h**2],
        [-12 * o, -6 * h, 12 * o, -6 * h],
        [6 * h, 2 * h**2, -6 * h, 4 * h**2],
    ]
    return np.stack([np.stack(r, axis=-1) for r in rows], axis=-2)


def _equivalent_loads(q0: np.ndarray, q1: np.ndarray, h: np.ndarray) -> np.ndarray:
    """Consistent nodal loads of a linear line load q0 -> q1 on an element of length h (Hermite shapes)."""
    return np.stack(
        [
            h * (7 * q0 + 3 * q1) / 20,
            h**2 * (3 * q0 + 2 * q1) / 60,
            h * (3 * q0 + 7 * q1) / 20,
            -(h**2) * (2 * q0 + 3 * q1) / 60,
        ],
        axis=-1,
    )


def solve_groups(members, combinations: dict):
    """Mesh every member, group the members by mesh key and solve each group in one batch.

    Returns ``(group, row)`` for each member in input order.
    """
    meshes = [mesh_member(m) for m in members]
    by_key = {}
    for i, mesh in enumerate(meshes):
        by_key.setdefault(mesh.key, []).append(i)
    where = [None] * len(meshes)
    for indices in by_key.values():
        group = GroupSolution([meshes[i] for i in indices], combinations)
        for row, i in enumerate(indices):
            where[i] = (group, row)
    return where


def check_combinations(combinations) -> dict:
    """Combinations as ``{name: {load type: factor}}`` from dicts or sequences in LOAD_TYPES order."""
    out = {}
    for name, factors in (combinations or {}).items():
        if not isinstance(factors, dict):
            values = np.asarray(factors, float).ravel()
            if values.size != len(LOAD_TYPES):
                n = len(LOAD_TYPES)
                raise BeamInputError(f"combination {name!r} needs {n} factors, in the order {LOAD_TYPES}")
            factors = dict(zip(LOAD_TYPES, values))
        unknown = set(factors) - set(LOAD_TYPES)
        if unknown:
            raise BeamInputError(f"combination {name!r} names unknown load types {sorted(unknown)}; use {LOAD_TYPES}")
        out[str(name)] = {t: float(f) for t, f in factors.items() if float(f) != 0.0}
    return out
