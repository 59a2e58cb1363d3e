"""Pattern (partial) live loading over the spans and overhangs of a continuous member.

ASCE 7-16 Section 4.3.3 (partial loading; from memory) asks for the live load on only a
portion of a member where that gives a worse effect than the load over the whole member. The
patterns used here (common practice for continuous joists and girders) are: every segment
loaded, each segment alone, and each pair of adjacent segments. A segment is a span or an
overhang, so a single span with an overhang is patterned too (the back span is worst with the
overhang unloaded, and the tip rises most with only the back span loaded). Only the live-type
loads are patterned; the same pattern is applied to all of them in a combination, while dead and
wind loads always act in full. The snow drift and unbalanced-snow arrangements of ASCE 7-16
Chapter 7 are load inputs, not patterns made here.
"""

from __future__ import annotations

from dataclasses import dataclass

#: load types whose position varies and which are therefore patterned: floor live, roof live, snow
LIVE_LOAD_TYPES = ("L", "Lr", "S")

#: name of the pattern with every segment loaded
FULL_PATTERN = "all"


@dataclass(frozen=True)
class LoadPattern:
    """A live-load arrangement: the indices of the loaded segments and a readable name."""

    name: str
    loaded: tuple  # segment indices, ascending


def live_load_patterns(segment_labels) -> tuple:
    """The live-load patterns of a member with the given segments (labels left to right).

    ``segment_labels`` is a sequence of labels such as ``("span 1", "span 2", "right overhang")``
    or just the number of segments. Returned, without repeats and in this order: all segments
    loaded (named ``"all"``), each segment alone, then each pair of adjacent segments (named
    ``"span 1 + span 2"``). A member with one segment has the single pattern ``"all"``.
    """
    labels = _labels(segment_labels)
    n = len(labels)
    patterns = [LoadPattern(FULL_PATTERN, tuple(range(n)))]
    if n < 2:
        return tuple(patterns)
    patterns += [LoadPattern(labels[i], (i,)) for i in range(n)]
    if n > 2:  # with two segments the only pair is the full pattern
        patterns += [LoadPattern(f"{labels[i]} + {labels[i + 1]}", (i, i + 1)) for i in range(n - 1)]
    return tuple(patterns)


def _labels(segment_labels) -> tuple:
    if isinstance(segment_labels, int):
        return tuple(f"segment {i + 1}" for i in range(segment_labels))
    return tuple(str(s) for s in segment_labels)
