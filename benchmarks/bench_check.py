"""Benchmark: the whole `ifccheck check` on a generated model of 20,000 joists against the time
ifcopenshell alone takes to open that model and write it back (target: check <= 3 x open+write,
on one core).

    python benchmarks/bench_check.py [N] [--all-cores]

Runs on one core (the process and the command it starts are pinned to the first core this
process may use), as the target says; ``--all-cores`` lets both use every core. Prints both
times and their ratio; figures measured on the project machine are kept in benchmarks/README.md.
This is a benchmark, not a test: nothing here asserts a time.
"""

from __future__ import annotations

import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import ifcopenshell

sys.path.insert(0, str(Path(__file__).resolve().parent))
from make_joists import make_joists  # noqa: E402


def open_and_write(src: Path, dst: Path) -> float:
    start = time.perf_counter()
    ifcopenshell.open(str(src)).write(str(dst))
    return time.perf_counter() - start


def whole_check(src: Path, out: Path, csv: Path) -> float:
    start = time.perf_counter()
    subprocess.run(
        [sys.executable, "-m", "ifccheck.cli", "check", str(src), "-o", str(out), "--csv", str(csv)],
        check=False, stdout=subprocess.DEVNULL,
    )
    return time.perf_counter() - start


def pin_to_one_core() -> str:
    """Pin this process (and the processes it starts) to one core; says which, or why not."""
    if not hasattr(os, "sched_setaffinity"):
        return "all cores (this platform cannot pin a process)"
    core = min(os.sched_getaffinity(0))
    os.sched_setaffinity(0, {core})
    return f"one core (#{core})"


def main() -> None:
    args = [a for a in sys.argv[1:] if not a.startswith("--")]
    n = int(args[0]) if args else 20000
    cores = "all cores" if "--all-cores" in sys.argv else pin_to_one_core()
    with tempfile.TemporaryDirectory() as tmp:
        src = Path(tmp) / "joists.ifc"
        make_joists(n, src)
        a = min(open_and_write(src, Path(tmp) / "copy.ifc") for _ in range(2))
        b = min(whole_check(src, Path(tmp) / "checked.ifc", Path(tmp) / "ex.csv") for _ in range(2))
    print(f"{n} joists on {cores}: open+write {a:.2f} s, ifccheck check {b:.2f} s, ratio {b / a:.2f} (target <= 3)")


if __name__ == "__main__":
    main()
