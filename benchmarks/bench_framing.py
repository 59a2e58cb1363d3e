"""Time the framing runs and tributary widths on a generated layout of 50,000 members.

Run: ``PYTHONPATH=. python benchmarks/bench_framing.py [--members N] [--seed S]``.
The layout is demo data: storeys 10 ft apart, each a grid of bays 50 ft square; each bay holds one
run of parallel members (2x lumber, 1.5 in wide) in a random plan direction (0°, 90°, 30°, 45°
or any), at a random spacing (12, 16, 19.2, 24 or 32 in on centre), 3 to 30 members in a run at
most 35 ft wide, each 8 to 20 ft long, about a third of the axes drawn the other way; a few bays
hold a lone beam. The time of
``tributary_widths`` is printed, with the number of runs found against those laid out and how
many interior members carry their run's spacing.
"""

from __future__ import annotations

import argparse
import time

import numpy as np

from ifccheck.design.framing import tributary_widths

BAY = 600.0  # in: 50 ft square cells, one run each
BAYS_PER_SIDE = 20
MAX_RUN_WIDTH = 420.0  # in: a run's width across its members, so that runs of two bays stay apart
STOREY_HEIGHT = 120.0  # in
SPACINGS = (12.0, 16.0, 19.2, 24.0, 32.0)  # in on centre
DIRECTIONS = (0.0, 90.0, 30.0, 45.0)  # degrees; the rest random


def generated_layout(n: int, rng) -> tuple:
    """(starts, ends, widths, storeys, spacing of each member's run, number of runs) of ``n`` members."""
    starts, ends, spacings, storeys = [], [], [], []
    count, bay, runs = 0, 0, 0
    while count < n:
        storey, cell = divmod(bay, BAYS_PER_SIDE * BAYS_PER_SIDE)
        row, column = divmod(cell, BAYS_PER_SIDE)
        centre = np.array([column * BAY + BAY / 2, row * BAY + BAY / 2])
        spacing = float(rng.choice(SPACINGS))
        size = 1 if rng.random() < 0.05 else int(rng.integers(3, 31))
        size = min(size, int(MAX_RUN_WIDTH / spacing) + 1, n - count)
        angle = np.radians(float(rng.choice(DIRECTIONS)) if rng.random() < 0.8 else rng.uniform(0, 180))
        along = np.array([np.cos(angle), np.sin(angle)])
        across = np.array([-along[1], along[0]])
        length = rng.uniform(96, 240)
        offsets = (np.arange(size) - (size - 1) / 2) * spacing
        mid = centre + offsets[:, None] * across
        half = along * length / 2
        flip = np.where(rng.random(size) < 0.35, -1.0, 1.0)[:, None]
        z = (storey + 1) * STOREY_HEIGHT - 4.625
        starts.append(np.column_stack([mid - flip * half, np.full(size, z)]))
        ends.append(np.column_stack([mid + flip * half, np.full(size, z)]))
        spacings.append(np.full(size, spacing if size > 1 else np.nan))
        storeys += [f"Level {storey + 1:02d}"] * size
        count += size
        runs += size > 1
        bay += 1
    starts, ends = np.concatenate(starts), np.concatenate(ends)
    return starts, ends, np.full(len(starts), 1.5), storeys, np.concatenate(spacings), runs


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--members", type=int, default=50_000)
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    starts, ends, widths, storeys, spacing, runs = generated_layout(args.members, np.random.default_rng(args.seed))
    names = [f"M{k}" for k in range(len(starts))]
    began = time.perf_counter()
    table = tributary_widths(starts, ends, widths, storeys, names=names)
    elapsed = time.perf_counter() - began
    interior = table["spacing_left"].notna() & table["spacing_right"].notna()
    right = np.isclose(table["tributary_width"][interior], spacing[interior.to_numpy()], atol=1e-6)
    print(
        f"{len(starts)} members in {len(set(storeys))} storeys, {table['run'].max() + 1} runs found of {runs} laid out: "
        f"tributary_widths in {elapsed:.2f} s; {right.sum()} of {interior.sum()} interior members carry their run's spacing"
    )


if __name__ == "__main__":
    main()
