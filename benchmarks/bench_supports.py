"""Time the supports and top-edge bracing search on a generated building of 50,000 members.

Run: ``PYTHONPATH=. python benchmarks/bench_supports.py [--members N] [--seed S]``.
The building is demo data: storeys 10 ft apart, each a row of bays 14 ft wide (along x) and
100 ft deep (along y). The bay lines are bearing walls (3.5 in thick), every third line a dropped
girder line instead (3.5 x 11.25 in girders 20 ft long on 5.5 in posts at both ends, the posts
shared by neighbouring girders). Each bay holds 2x10 joists at 16 in on centre spanning from line
to line, running 1.5 in onto each bearing; about a third of the axes are drawn the other way, and
about one in a hundred joists is cut 12 in short (its end B has no support). A slab lies on
every storey's joists. Every joist, girder, wall, post and slab is an element box, the joists
and girders also members. The times of ``find_supports`` and ``braced_by_slab`` are printed
with the supports found against those laid out.
"""

from __future__ import annotations

import argparse
import time

import numpy as np

from ifccheck.design.supports import braced_by_slab, find_supports
from ifccheck.model import ElementBox

BAY = 168.0  # in: 14 ft from line to line
DEPTH_Y = 1200.0  # in: 100 ft of joists along each line
SPACING = 16.0  # in on centre
GIRDER_LENGTH = 240.0  # in
STOREY_HEIGHT = 120.0  # in
BAYS = 30
D_JOIST, D_GIRDER, THICKNESS, POST = 9.25, 11.25, 3.5, 5.5  # in
SHORT = 12.0  # in: how much a joist without end B support is cut short


class Building:
    """The generated members (guids, axes, depths), element boxes and the supports laid out."""

    def __init__(self, n: int, rng):
        self.guids, self.starts, self.ends, self.depths, self.boxes = [], [], [], [], []
        self.axes, self.expected_supports, self.short = {}, 0, 0
        storey = 0
        while len(self.guids) < n:
            self._storey(storey, n, rng)
            storey += 1
        self.storeys = storey
        self.starts, self.ends, self.depths = np.array(self.starts), np.array(self.ends), np.array(self.depths)

    def _member(self, guid, start, end, depth, kind, width):
        self.guids.append(guid)
        self.starts.append(start)
        self.ends.append(end)
        self.depths.append(depth)
        self.axes[guid] = (start, end)
        lo = np.minimum(start, end) - [width / 2 if start[1] != end[1] else 0, width / 2 if start[0] != end[0] else 0, depth / 2]
        hi = np.maximum(start, end) + [width / 2 if start[1] != end[1] else 0, width / 2 if start[0] != end[0] else 0, depth / 2]
        self.boxes.append(ElementBox(guid, guid, "IfcBeam", kind, "", tuple(lo), tuple(hi)))

    def _storey(self, storey: int, n: int, rng):
        floor = storey * STOREY_HEIGHT
        bearing = floor + STOREY_HEIGHT - D_JOIST  # joists' bottom = wall and girder tops
        for line in range(BAYS + 1):
            x = line * BAY
            if line % 3 == 2:
                self._girder_line(storey, line, x, bearing)
            else:
                name = f"W-{storey}-{line}"
                self.boxes.append(
                    ElementBox(name, name, "IfcWall", "wall", "", (x - THICKNESS / 2, 0.0, floor), (x + THICKNESS / 2, DEPTH_Y, bearing))
                )
        for bay in range(BAYS):
            for k in range(int(DEPTH_Y / SPACING)):
                if len(self.guids) >= n:
                    break
                self._joist(f"J-{storey}-{bay}-{k}", bay * BAY, (k + 0.5) * SPACING, bearing, rng)
        z = floor + STOREY_HEIGHT
        corners = (-10.0, -10.0, z), (BAYS * BAY + 10, DEPTH_Y + 10, z + 6)
        self.boxes.append(ElementBox(f"S-{storey}", f"S-{storey}", "IfcSlab", "slab", "", *corners))

    def _girder_line(self, storey, line, x, bearing):
        z = bearing - D_GIRDER / 2
        for k in range(int(DEPTH_Y / GIRDER_LENGTH)):
            y0 = k * GIRDER_LENGTH
            self._member(f"G-{storey}-{line}-{k}", np.array([x, y0, z]), np.array([x, y0 + GIRDER_LENGTH, z]), D_GIRDER, "beam", THICKNESS)
            self.expected_supports += 2
        for k in range(int(DEPTH_Y / GIRDER_LENGTH) + 1):
            y = k * GIRDER_LENGTH
            name = f"P-{storey}-{line}-{k}"
            lo = (x - POST / 2, max(y - POST / 2, 0.0), storey * STOREY_HEIGHT)
            hi = (x + POST / 2, min(y + POST / 2, DEPTH_Y), bearing - D_GIRDER)
            self.boxes.append(ElementBox(name, name, "IfcColumn", "column", "", lo, hi))

    def _joist(self, guid, x0, y, bearing, rng):
        start = np.array([x0, y, bearing + D_JOIST / 2])
        end = np.array([x0 + BAY + 1.5 - THICKNESS / 2, y, start[2]])
        start[0] -= 1.5 - THICKNESS / 2  # runs 1.5 in onto each 3.5 in bearing
        if rng.random() < 0.01:
            end[0] -= SHORT
            self.short += 1
            self.expected_supports += 1
        else:
            self.expected_supports += 2
        if rng.random() < 0.35:
            start, end = end, start
        self._member(guid, start, end, D_JOIST, "member", 1.5)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--members", type=int, default=50_000)
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    building = Building(args.members, np.random.default_rng(args.seed))
    b = building  # short name for the argument lists
    began = time.perf_counter()
    found = find_supports(b.guids, b.starts, b.ends, b.depths, b.boxes, member_axes=b.axes)
    supports_time = time.perf_counter() - began
    began = time.perf_counter()
    braced = braced_by_slab(b.guids, b.starts, b.ends, b.depths, b.boxes)
    bracing_time = time.perf_counter() - began
    supports = sum(len(f.supports) for f in found)
    with_problems = sum(bool(f.problems) for f in found)
    on_members = sum(1 for f in found for s in f.supports if s.carrier)
    print(
        f"{len(b.guids)} members, {len(b.boxes)} element boxes in {b.storeys} storeys: "
        f"find_supports in {supports_time:.2f} s, {supports} supports found of {b.expected_supports} laid out "
        f"({on_members} on girders), {with_problems} members with an end unsupported of {b.short} cut short; "
        f"braced_by_slab in {bracing_time:.2f} s, {sum(bool(s) for s in braced)} braced"
    )


if __name__ == "__main__":
    main()
