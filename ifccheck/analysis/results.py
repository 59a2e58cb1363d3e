"""Results of the beam analysis: per load type, per combination and live-load pattern, and envelopes.

Units and signs are those of :mod:`ifccheck.analysis.beam`: inch, lbf, lbf*in; reactions up
positive, moment sagging positive, deflection down positive. Every value comes from the exact
element solution: extremes are exact, and so are the positions returned with them. Result
objects are built on first access from the batch arrays, so reading them costs only what is read.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from functools import cached_property
from typing import NamedTuple

import numpy as np

from . import elements as el
from .layout import Segment, Support


#: envelope quantities with one value for the whole member (the others have one per item)
_WHOLE_MEMBER = ("M+", "M-", "V")


class Extreme(NamedTuple):
    """A value, the position x (inches from the left end) where it occurs, and the governing pattern."""

    value: float
    x: float
    pattern: str


@dataclass(frozen=True)
class SupportEffects:
    """Forces at one support.

    ``reaction_max``/``reaction_min``: largest and smallest upward reaction (lbf; negative is
    uplift). ``moment_max``/``moment_min``: reaction moment of a fixed support (lbf*in, clockwise
    on the member positive; zero at pinned and roller supports). ``shear_left_face`` and
    ``shear_right_face``: the shear V of largest magnitude (signed, lbf) at the faces
    ``x -/+ width/2``; value and x are NaN where the member does not continue past that face.
    """

    index: int
    support: Support
    reaction_max: Extreme
    reaction_min: Extreme
    moment_max: Extreme
    moment_min: Extreme
    shear_left_face: Extreme
    shear_right_face: Extreme


@dataclass(frozen=True)
class SegmentEffects:
    """Moment and deflection extremes within one span or overhang (its ends included).

    ``max_moment`` is the largest (most positive, sagging) moment and ``min_moment`` the most
    negative (hogging) one; ``max_deflection`` the largest downward and ``min_deflection`` the most
    upward (negative) deflection.
    """

    segment: Segment
    max_moment: Extreme
    min_moment: Extreme
    max_deflection: Extreme
    min_deflection: Extreme


class LoadEffects:
    """What a design check needs from one loading, or from the envelope of a combination's patterns.

    ``max_moment``: the largest moment on the member (the max positive moment; it is <= 0 where
    the member has no sagging). ``min_moment``: the most negative moment (the max negative moment;
    >= 0 where there is no hogging). ``max_shear``: the shear of largest magnitude, signed.
    ``supports``: :class:`SupportEffects` per support, left to right. ``segments``:
    :class:`SegmentEffects` per span and overhang. ``negative_moment_regions``: the stretches
    ``(x_start, x_end)`` where M < 0, i.e. the bottom edge is in compression (for a combination,
    the union over its patterns). ``zero_moment_points``: where M changes sign inside the member.
    """

    def __init__(self, result: "BeamResult", name: str, cases: np.ndarray):
        self.name = name
        self._result = result
        self._cases = cases

    def __repr__(self):
        return f"{type(self).__name__}({self.name!r}, max_moment={self.max_moment}, min_moment={self.min_moment})"

    @cached_property
    def _env(self) -> dict:
        """Quantity -> list of Extremes (one per item: support, segment, face) or a single Extreme."""
        g, r = self._result._group, self._result._row
        cases = g.cases
        names = [cases[k].pattern for k in self._cases]
        out = {}
        for q, (value, x, p) in g.envelope(self._cases).items():
            items = zip(value[r].ravel().tolist(), x[r].ravel().tolist(), p[r].ravel().tolist())
            items = [Extreme(a, b, names[c]) for a, b, c in items]
            out[q] = items[0] if q in _WHOLE_MEMBER else items
        return out

    @property
    def max_moment(self) -> Extreme:
        return self._env["M+"]

    @property
    def min_moment(self) -> Extreme:
        return self._env["M-"]

    @property
    def max_shear(self) -> Extreme:
        return self._env["V"]

    @cached_property
    def supports(self) -> tuple:
        env = self._env
        faces = env["Vface"]  # left and right face of each support, in turn
        return tuple(
            SupportEffects(
                j, s, env["R+"][j], env["R-"][j], env["Rm+"][j], env["Rm-"][j], faces[2 * j], faces[2 * j + 1]
            )
            for j, s in enumerate(self._result.layout.supports)
        )

    @cached_property
    def segments(self) -> tuple:
        env = self._env
        return tuple(
            SegmentEffects(seg, env["Mmax"][j], env["Mmin"][j], env["Dmax"][j], env["Dmin"][j])
            for j, seg in enumerate(self._result.segments)
        )

    @property
    def max_reactions(self) -> np.ndarray:
        """Largest upward reaction at each support (lbf)."""
        return np.array([e.value for e in self._env["R+"]])

    @cached_property
    def negative_moment_regions(self) -> tuple:
        return self._negative_regions()

    @property
    def zero_moment_points(self) -> tuple:
        L = self._result.layout.length
        tol = 1e-9 * L
        return tuple(sorted({p for region in self.negative_moment_regions for p in region if tol < p < L - tol}))

    @cached_property
    def _diagrams(self) -> "Diagrams":
        g, r = self._result._group, self._result._row
        state = {f: v[0] for f, v in g.combined_state(slice(r, r + 1), self._cases).items()}
        return Diagrams(state, g.x[r], g.EI[r])


class CaseResult(LoadEffects):
    """One loading: a load type alone in full, or a combination under one live-load pattern.

    ``pattern`` names the live-load pattern and ``loaded_segments`` lists the loaded segments.
    ``shear``, ``moment``, ``slope`` and ``deflection`` evaluate the exact diagrams at positions
    x (inches); where a diagram jumps (at a concentrated load or a support), ``side`` picks the
    limit from the ``"left"`` or the ``"right"`` (at the member ends, the value inside the member).
    """

    def __init__(self, result, name, case: int):
        super().__init__(result, name, np.array([case]))
        c = result._group.cases[case]
        self.pattern = c.pattern
        self.loaded_segments = c.loaded

    def _negative_regions(self) -> tuple:
        g, r = self._result._group, self._result._row
        return _regions(g.case_regions, g.case_region_keys, r * len(g.cases) + int(self._cases[0]))

    @property
    def reactions(self) -> np.ndarray:
        """Upward reaction at each support (lbf)."""
        return self.max_reactions

    @property
    def reaction_moments(self) -> np.ndarray:
        """Reaction moment at each support (lbf*in, clockwise on the member; zero unless fixed)."""
        return np.array([e.value for e in self._env["Rm+"]])

    def shear(self, x, side: str = "right") -> np.ndarray:
        return self._diagrams.evaluate("shear", x, side)[0]

    def moment(self, x, side: str = "right") -> np.ndarray:
        return self._diagrams.evaluate("moment", x, side)[0]

    def slope(self, x) -> np.ndarray:
        return self._diagrams.evaluate("slope", x, "right")[0]

    def deflection(self, x) -> np.ndarray:
        return self._diagrams.evaluate("deflection", x, "right")[0]


class CombinationResult(LoadEffects):
    """A load combination: the envelope over its live-load patterns, and each pattern's own result.

    Every :class:`Extreme` of the envelope names the pattern that governs it. ``factors`` are the
    load factors by load type; ``patterns`` maps each pattern name to its :class:`CaseResult`.
    The ``*_envelope`` methods return the (largest, smallest) value over the patterns at x.
    """

    def __init__(self, result, name, cases: np.ndarray):
        super().__init__(result, name, cases)
        self.factors = dict(result._group.combinations[name])
        self.patterns = _PatternCases(result, name, cases)

    def _negative_regions(self) -> tuple:
        table = self._result._group.combination_regions[self.name]
        return _regions(table, table[:, 0], self._result._row)

    def shear_envelope(self, x, side: str = "right"):
        v = self._diagrams.evaluate("shear", x, side)
        return v.max(axis=0), v.min(axis=0)

    def moment_envelope(self, x, side: str = "right"):
        v = self._diagrams.evaluate("moment", x, side)
        return v.max(axis=0), v.min(axis=0)

    def deflection_envelope(self, x):
        v = self._diagrams.evaluate("deflection", x, "right")
        return v.max(axis=0), v.min(axis=0)


class _PatternCases(Mapping):
    """Pattern name -> :class:`CaseResult`, each built when first asked for."""

    def __init__(self, result, name, cases):
        self._result, self._name = result, name
        self._by_name = {result._group.cases[k].pattern: int(k) for k in cases}
        self._built = {}

    def __getitem__(self, pattern):
        if pattern not in self._built:
            self._built[pattern] = CaseResult(self._result, self._name, self._by_name[pattern])
        return self._built[pattern]

    def __iter__(self):
        return iter(self._by_name)

    def __len__(self):
        return len(self._by_name)


class Diagrams:
    """Exact V, M, slope and deflection of one member under several cases (element polynomials)."""

    def __init__(self, state: dict, x: np.ndarray, EI: float):
        self.x = x
        self.h = np.diff(x)
        self.coefficients = {
            "shear": el.shear_coefficients(state, self.h),
            "moment": el.moment_coefficients(state, self.h),
            "slope": el.slope_coefficients(state, self.h, EI),
            "deflection": el.deflection_coefficients(state, self.h, EI),
        }

    def evaluate(self, quantity: str, x, side: str) -> np.ndarray:
        """Values (cases, len(x)) at positions ``x`` (inches)."""
        xq = np.atleast_1d(np.asarray(x, float))
        e = np.clip(np.searchsorted(self.x, xq, side=side) - 1, 0, len(self.h) - 1)
        xi = (xq - self.x[e]) / self.h[e]
        c = self.coefficients[quantity][:, e, :]
        return el.polyval(c, np.broadcast_to(xi[None, :, None], c.shape[:2] + (1,)))[..., 0]


class BeamResult:
    """Analysis of one member: unit cases per load type and results per combination.

    ``unit_cases``: load type -> :class:`CaseResult` with that type alone in full (the types the
    member carries). ``combinations``: name -> :class:`CombinationResult`. ``segments``: the spans
    and overhangs, left to right. ``patterns``: the live-load patterns used for this member.
    """

    def __init__(self, group, row: int):
        self._group = group
        self._row = row
        mesh = group.meshes[row]
        self.layout = mesh.member.layout
        self.loads = mesh.loads
        self.segments = mesh.segments
        self.patterns = group.patterns

    def __repr__(self):
        return f"BeamResult(length={self.layout.length}, segments={[s.label for s in self.segments]})"

    @cached_property
    def unit_cases(self) -> dict:
        carried = {load.load_type for load in self.loads}
        cases = self._group.cases
        return {
            c.name: CaseResult(self, c.name, k) for k, c in enumerate(cases) if c.kind == "unit" and c.name in carried
        }

    @cached_property
    def combinations(self) -> dict:
        g = self._group
        return {name: CombinationResult(self, name, g.case_indices("combination", name)) for name in g.combinations}


def _regions(table: np.ndarray, keys: np.ndarray, key: int) -> tuple:
    lo, hi = np.searchsorted(keys, key, side="left"), np.searchsorted(keys, key, side="right")
    return tuple((float(a), float(b)) for a, b in table[lo:hi, -2:])
