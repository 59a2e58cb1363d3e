"""Input records of the beam analysis: supports, layout, loads, and the spans they form.

Units are the core unit system (:mod:`ifccheck.units`): positions and lengths in inches, forces
in lbf, line loads in lbf/in, moments in lbf*in, bending stiffness EI in lbf*in^2.
Positions ``x`` run from 0 at the member's left end to ``length`` at its right end.
Load signs: gravity (downward) forces and line loads are positive; a concentrated moment is
positive clockwise (with x to the right and up on the page), i.e. it raises the sagging moment
to its right.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Optional, Union

from ..errors import IfcCheckError
from ..model import LOAD_TYPES

#: support kinds; a pinned and a roller support act alike on a straight beam under
#: transverse load (both hold the deflection, neither the rotation)
SUPPORT_KINDS = ("pinned", "roller", "fixed")


class BeamInputError(IfcCheckError, ValueError):
    """A beam layout or load cannot be analysed (bad position, unstable supports, unknown load type)."""


@dataclass(frozen=True)
class Support:
    """A support at ``x`` (its centreline), of ``kind`` pinned, roller or fixed.

    ``width`` is the bearing width along the member; the support faces are at ``x - width/2``
    and ``x + width/2`` and the shear is reported there.
    """

    x: float
    kind: str = "pinned"
    width: float = 0.0

    def __post_init__(self):
        object.__setattr__(self, "x", float(self.x))
        object.__setattr__(self, "width", float(self.width))
        if self.kind not in SUPPORT_KINDS:
            raise BeamInputError(f"support kind {self.kind!r} is not one of {', '.join(SUPPORT_KINDS)}")
        if not (math.isfinite(self.x) and math.isfinite(self.width)) or self.width < 0:
            raise BeamInputError(f"support at x={self.x!r} needs a finite position and a width >= 0")

    @property
    def holds_rotation(self) -> bool:
        return self.kind == "fixed"


@dataclass(frozen=True)
class BeamLayout:
    """A straight member of ``length`` with uniform bending stiffness ``EI`` on ``supports``.

    Supports may sit anywhere on the member (ends, interior, leaving overhangs); they are kept
    sorted by position. A single fixed support makes a cantilever; otherwise two or more supports
    are needed.
    """

    length: float
    supports: tuple
    EI: float

    def __post_init__(self):
        supports = tuple(sorted(self.supports, key=lambda s: s.x))
        object.__setattr__(self, "supports", supports)
        object.__setattr__(self, "length", float(self.length))
        object.__setattr__(self, "EI", float(self.EI))
        if not (math.isfinite(self.length) and self.length > 0):
            raise BeamInputError(f"member length must be a positive number of inches, got {self.length!r}")
        if not (math.isfinite(self.EI) and self.EI > 0):
            raise BeamInputError(f"EI must be a positive number of lbf*in^2, got {self.EI!r}")
        if not supports:
            raise BeamInputError("the member has no support; give at least one fixed or two pinned/roller supports")
        tol = position_tolerance(self.length)
        for s in supports:
            if s.x < -tol or s.x > self.length + tol:
                raise BeamInputError(f"support at x={s.x} lies outside the member (0 to {self.length} in)")
        for a, b in zip(supports, supports[1:]):
            if b.x - a.x <= tol:
                raise BeamInputError(f"two supports at the same position x={a.x}; merge them into one")
        if len(supports) == 1 and not supports[0].holds_rotation:
            raise BeamInputError(
                "a single pinned or roller support leaves the member free to rotate; "
                "make it fixed (cantilever) or add a second support"
            )


def position_tolerance(length: float) -> float:
    """Positions closer than this (inches) are taken as the same point on a member of ``length``."""
    return 1e-9 * length


@dataclass(frozen=True)
class UniformLoad:
    """Uniform line load ``w`` (lbf/in) of ``load_type`` from ``a`` to ``b`` (whole member by default)."""

    load_type: str
    w: float
    a: Optional[float] = None
    b: Optional[float] = None


@dataclass(frozen=True)
class LinearLoad:
    """Linearly varying (trapezoidal or triangular) line load: ``w1`` at ``a`` to ``w2`` at ``b`` (lbf/in)."""

    load_type: str
    w1: float
    w2: float
    a: float
    b: float


@dataclass(frozen=True)
class PointLoad:
    """Concentrated force ``P`` (lbf, downward positive) at ``x``."""

    load_type: str
    P: float
    x: float


@dataclass(frozen=True)
class PointMoment:
    """Concentrated moment ``M`` (lbf*in, clockwise positive) at ``x``."""

    load_type: str
    M: float
    x: float


Load = Union[UniformLoad, LinearLoad, PointLoad, PointMoment]


@dataclass(frozen=True)
class BeamMember:
    """One member to analyse: its layout and its loads (any mix of load types)."""

    layout: BeamLayout
    loads: tuple = field(default_factory=tuple)


@dataclass(frozen=True)
class Segment:
    """A span (between adjacent supports) or an overhang (from the last support to a free end)."""

    index: int
    kind: str  # "span" or "overhang"
    label: str  # "span 1", "left overhang", "right overhang"
    start: float
    end: float

    @property
    def length(self) -> float:
        return self.end - self.start


def segments_of(layout: BeamLayout) -> tuple:
    """The spans and overhangs of ``layout`` from left to right.

    A span lies between adjacent supports; an overhang from the first support back to the left
    end or from the last support to the right end (a cantilever is a member that is one overhang).
    """
    tol = position_tolerance(layout.length)
    xs = [s.x for s in layout.supports]
    parts = []
    if xs[0] > tol:
        parts.append(("overhang", "left overhang", 0.0, xs[0]))
    for i, (a, b) in enumerate(zip(xs, xs[1:])):
        parts.append(("span", f"span {i + 1}", a, b))
    if xs[-1] < layout.length - tol:
        parts.append(("overhang", "right overhang", xs[-1], layout.length))
    return tuple(Segment(i, kind, label, a, b) for i, (kind, label, a, b) in enumerate(parts))


def load_positions(load: Load) -> tuple:
    """The positions on the member where ``load`` starts, ends or acts."""
    if isinstance(load, (PointLoad, PointMoment)):
        return (load.x,)
    return (load.a, load.b)


def check_load(load: Load, length: float) -> Load:
    """Return ``load`` with open ends filled in, after checking its type, values and positions."""
    if not isinstance(load, (UniformLoad, LinearLoad, PointLoad, PointMoment)):
        raise BeamInputError(f"{load!r} is not a beam load (UniformLoad, LinearLoad, PointLoad or PointMoment)")
    if load.load_type not in LOAD_TYPES:
        raise BeamInputError(f"load type {load.load_type!r} is not one of {', '.join(LOAD_TYPES)}")
    if isinstance(load, UniformLoad) and (load.a is None or load.b is None):
        a = 0.0 if load.a is None else load.a
        b = length if load.b is None else load.b
        load = UniformLoad(load.load_type, load.w, a, b)
    values = [v for k, v in vars(load).items() if k != "load_type"]
    if not all(isinstance(v, (int, float)) and math.isfinite(v) for v in values):
        raise BeamInputError(f"{load!r} has a value that is not a finite number")
    tol = position_tolerance(length)
    positions = load_positions(load)
    if any(p < -tol or p > length + tol for p in positions):
        raise BeamInputError(f"{load!r} lies outside the member (0 to {length} in)")
    if len(positions) == 2 and positions[1] - positions[0] <= tol:
        raise BeamInputError(f"{load!r} must end (b) after it starts (a)")
    return load
