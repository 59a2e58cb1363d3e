"""The load path between members: which member bears on which, and the order to analyse them in.

A member whose support names a carrier (another checked member) delivers its reaction there as a
point load, so carried members are analysed before their carriers. Members on a cycle of carriers
cannot be ordered and are reported. Works on row positions; no O(n²) search.
"""

from __future__ import annotations

from collections import defaultdict


def carrier_edges(guids: list, analyses: list) -> list:
    """(carried row, support index, carrier row, position on the carrier) for every support that
    bears on another member of ``guids``; ``analyses`` holds each row's AnalysisInput or None."""
    row_of = {g: k for k, g in enumerate(guids)}
    edges = []
    for k, analysis in enumerate(analyses):
        if analysis is None:
            continue
        for j, support in enumerate(analysis.supports):
            if support.carrier in row_of:
                edges.append((k, j, row_of[support.carrier], support.carrier_x))
    return edges


def dependency_levels(n: int, edges: list) -> "tuple[list, set]":
    """Rows grouped so that every carried member comes in an earlier group than its carrier
    (Kahn's algorithm), and the rows left on cycles."""
    carried_by = defaultdict(set)  # carrier -> rows it carries
    carriers_of = defaultdict(set)  # carried -> rows carrying it
    for carried, _, carrier, _ in edges:
        carried_by[carrier].add(carried)
        carriers_of[carried].add(carrier)
    waiting = {k: len(carried_by[k]) for k in range(n)}
    level = [k for k in range(n) if waiting[k] == 0]
    levels, placed = [], set()
    while level:
        levels.append(level)
        placed.update(level)
        following = []
        for k in level:
            for carrier in carriers_of[k]:
                waiting[carrier] -= 1
                if waiting[carrier] == 0:
                    following.append(carrier)
        level = sorted(following)
    return levels, set(range(n)) - placed
