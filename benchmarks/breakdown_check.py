"""Where the time of ``ifccheck check`` goes: the command's steps timed one by one, in one process.

    python benchmarks/breakdown_check.py [N]

Generates the N-joist model of bench_check.py and runs the steps of the command line on it as
ifccheck.cli does (the file parsed on a thread while the rest is imported, the checked model's
copy written by a child process while the model is checked), printing each step's time. Then it
times, for comparison, the same model written whole (what the child process does). A benchmark,
not a test: nothing here asserts a time.
"""

from __future__ import annotations

import gc
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
from make_joists import make_joists  # noqa: E402


def breakdown(src: Path, out: Path) -> list:
    """(step, seconds) of one run of the command's steps on ``src``."""
    steps, start = [], time.perf_counter()

    def lap(name: str) -> None:
        nonlocal start
        now = time.perf_counter()
        steps.append((name, now - start))
        start = now

    gc.disable()
    import ifcopenshell  # noqa: F401

    from ifccheck.cli import _ParseInBackground

    with _ParseInBackground(src) as parsed:
        from ifccheck.checker import CheckResult, _provenance
        from ifccheck.design import get_basis
        from ifccheck.design.inputs import design_inputs
        from ifccheck.ifc import open_model, read_members
        from ifccheck.ifc.writer import EarlyCopy
        from ifccheck.report.console import summary
        from ifccheck.rules import load_rules

        lap("imports (the parse runs meanwhile)")
        rules = load_rules(None)
        model = open_model(src, parsed)
        lap("rest of the parse")
        with EarlyCopy(out) as early:
            early.start(model)
            lap("fork of the child writing the copy")
            read = read_members(model, rules)
            lap("reading members")
            inputs = design_inputs(read.members, rules, read.elements)
            lap("design inputs incl. framing runs")
            verdicts = get_basis(rules["defaults"]["design_basis"]).check(inputs, rules)
            lap("NDS checks and span search")
            table = inputs.drop(columns=[c for c in verdicts.columns if c in inputs.columns]).join(verdicts)
            table["provenance"] = [_provenance(*row) for row in zip(
                table["notes"], table["identified_from"], table["load_sources"], table["defaults_used"])]
            result = CheckResult(model, table, read.skipped, read.units, read.schema, rules, owns_model=True,
                                 structural=read.structural, elements=read.elements)
            lap("verdict table and provenance")
            result.apply_to_model()
            lap("verdict property sets")
            result.write_ifc(out, early)
            lap("checked model: wait for the copy, add the verdict sets")
            result.write_csv(out.with_suffix(".csv"))
            summary(result, [str(out)])
            lap("exception list and summary")
    model.write(str(out.with_suffix(".whole.ifc")))
    lap("(the child's work: writing the model whole)")
    return steps


def main() -> None:
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 20000
    with tempfile.TemporaryDirectory() as tmp:
        src = make_joists(n, Path(tmp) / "joists.ifc")
        steps = breakdown(src, Path(tmp) / "checked.ifc")
    for name, seconds in steps:
        print(f"{seconds:6.2f} s  {name}")
    print(f"{sum(s for name, s in steps if not name.startswith('(')):6.2f} s  total in this process")


if __name__ == "__main__":
    main()
