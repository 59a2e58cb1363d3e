"""Time the beam analysis engine on 10,000 random members of one to four spans.

Run: ``PYTHONPATH=. python benchmarks/bench_analysis.py [--members N] [--seed S]``.
The members are demo data (random joists and girders, spans 6 to 20 ft, some overhangs and
fixed ends, uniform dead, live and snow loads, some partial and point loads). Combinations are
the gravity ASD combinations 1 to 4 of ASCE 7-16 Section 2.4.1 (from memory) plus the live load
alone for the deflection check; live-type loads are patterned over the spans.
"""

from __future__ import annotations

import argparse
import time

import numpy as np

from ifccheck.analysis import BeamLayout, BeamMember, PointLoad, Support, UniformLoad, analyse_beams

COMBINATIONS = {
    "D": {"D": 1.0},
    "D+L": {"D": 1.0, "L": 1.0},
    "D+S": {"D": 1.0, "S": 1.0},
    "D+0.75L+0.75S": {"D": 1.0, "L": 0.75, "S": 0.75},
    "L": {"L": 1.0},
}


def random_member(rng) -> BeamMember:
    spans = rng.uniform(72, 240, size=rng.integers(1, 5))
    left = rng.uniform(12, 36) if rng.random() < 0.15 else 0.0
    right = rng.uniform(12, 36) if rng.random() < 0.15 else 0.0
    xs = left + np.concatenate([[0.0], np.cumsum(spans)])
    L = float(xs[-1] + right)
    kinds = ["pinned"] + ["roller"] * (len(xs) - 1)
    if left == 0.0 and rng.random() < 0.1:
        kinds[0] = "fixed"
    supports = tuple(Support(float(x), k, 3.5) for x, k in zip(xs, kinds))
    EI = 1.6e6 * 1.5 * rng.uniform(7.25, 11.25) ** 3 / 12
    loads = [UniformLoad("D", rng.uniform(1, 3)), UniformLoad("L", rng.uniform(3, 8))]
    if rng.random() < 0.3:
        loads.append(UniformLoad("S", rng.uniform(2, 6)))
    if rng.random() < 0.2:
        a = rng.uniform(0, L / 2)
        loads.append(UniformLoad("D", rng.uniform(1, 4), a, a + rng.uniform(12, L / 2)))
    if rng.random() < 0.3:
        loads.append(PointLoad(str(rng.choice(["D", "L"])), rng.uniform(200, 2000), float(rng.uniform(0, L))))
    return BeamMember(BeamLayout(L, supports, float(EI)), tuple(loads))


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--members", type=int, default=10_000)
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    rng = np.random.default_rng(args.seed)
    members = [random_member(rng) for _ in range(args.members)]
    start = time.perf_counter()
    results = analyse_beams(members, COMBINATIONS)
    solved = time.perf_counter()
    for r in results:  # what a design check reads: every combination's envelope
        for combination in r.combinations.values():
            combination.max_moment, combination.supports, combination.segments
    read = time.perf_counter()
    cases = sum(len(c.patterns) for c in results[0].combinations.values())
    groups = len({id(r._group) for r in results})
    print(f"{args.members} members, {len(COMBINATIONS)} combinations, {groups} mesh groups")
    print(f"analysis (solve, all patterns, exact extremes): {solved - start:.2f} s")
    print(f"reading every combination's envelope:          {read - solved:.2f} s")
    print(f"total:                                         {read - start:.2f} s")
    print(f"(first member: {len(results[0].segments)} segments, {cases} combination cases)")


if __name__ == "__main__":
    main()
