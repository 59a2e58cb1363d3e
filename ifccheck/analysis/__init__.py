"""One-dimensional beam analysis: continuous members, overhangs and cantilevers under line and point loads.

Units: the core unit system of :mod:`ifccheck.units` -- positions and lengths in inches, forces in
lbf, line loads in lbf/in, moments in lbf*in, bending stiffness EI in lbf*in^2.

Sign convention:
    loads           downward force and line load positive; concentrated moment clockwise positive
    reactions       upward positive; reaction moment (fixed support) clockwise on the member positive
    shear V(x)      resultant of the upward forces left of x, so that dM/dx = V
    moment M(x)     sagging positive (bottom edge in tension), hogging negative
    deflection      downward positive; slope = d(deflection)/dx

Use::

    layout = BeamLayout(length=288.0, supports=(Support(0), Support(144), Support(288)), EI=2.9e9)
    loads = (UniformLoad("D", 10.0), UniformLoad("L", 40.0 / 12 * 16 / 12))
    result = analyse_beam(layout, loads, {"D+L": {"D": 1.0, "L": 1.0}})
    env = result.combinations["D+L"]           # envelope over the live-load patterns
    env.max_moment, env.min_moment              # Extreme(value, x, pattern)
    env.supports[1].reaction_max, env.supports[1].shear_left_face
    env.segments[0].max_deflection, env.negative_moment_regions, env.zero_moment_points
    env.patterns["span 1"].moment([0, 72, 144])  # one pattern's exact diagram

Many members at once: :func:`analyse_beams` groups members with the same mesh (node count and
support arrangement) and solves each group as one stacked system.

The engine is the direct stiffness method with nodes at the ends, supports, load points and
line-load ends, and the exact closed-form solution inside each element, so values and extremes
(with their positions) are exact for Euler-Bernoulli beams (shear deformation neglected).
"""

from __future__ import annotations

from typing import Mapping, Optional, Sequence

from .beam import check_combinations, solve_groups
from .layout import (
    SUPPORT_KINDS,
    BeamInputError,
    BeamLayout,
    BeamMember,
    LinearLoad,
    Load,
    PointLoad,
    PointMoment,
    Segment,
    Support,
    UniformLoad,
    segments_of,
)
from .patterns import FULL_PATTERN, LIVE_LOAD_TYPES, LoadPattern, live_load_patterns
from .results import BeamResult, CaseResult, CombinationResult, Extreme, LoadEffects, SegmentEffects, SupportEffects

__all__ = [
    "SUPPORT_KINDS",
    "LIVE_LOAD_TYPES",
    "FULL_PATTERN",
    "BeamInputError",
    "BeamLayout",
    "BeamMember",
    "Support",
    "Segment",
    "Load",
    "UniformLoad",
    "LinearLoad",
    "PointLoad",
    "PointMoment",
    "LoadPattern",
    "live_load_patterns",
    "segments_of",
    "Extreme",
    "SupportEffects",
    "SegmentEffects",
    "LoadEffects",
    "CaseResult",
    "CombinationResult",
    "BeamResult",
    "analyse_beam",
    "analyse_beams",
]


def analyse_beam(layout: BeamLayout, loads: Sequence[Load], combinations: Optional[Mapping] = None) -> BeamResult:
    """Analyse one member under ``loads`` for each load type and each of ``combinations``.

    ``combinations`` maps a name to load factors, either ``{"D": 1.0, "L": 0.75, "S": 0.75}`` or a
    sequence of five factors in the order D, L, Lr, S, W. Live-type loads (L, Lr, S) are patterned
    over the spans and overhangs (:func:`live_load_patterns`) when the member has two or more.
    """
    return analyse_beams([BeamMember(layout, tuple(loads))], combinations)[0]


def analyse_beams(members: Sequence[BeamMember], combinations: Optional[Mapping] = None) -> list:
    """Analyse many members at once (same ``combinations`` for all); results in input order.

    Members whose meshes match (same node count and supports at the same node numbers) are
    solved together in one stacked numpy system (10,000 joists of one to four spans take a few
    seconds; see benchmarks/README.md).
    """
    checked = check_combinations(combinations)
    return [BeamResult(group, row) for group, row in solve_groups(members, checked)]
