"""Command line: ``ifccheck check MODEL.ifc [-o OUT.ifc] [--csv OUT.csv] [--rules PROJECT.toml] [--in-place]``
and ``ifccheck rules --example [-o PROJECT.toml]`` (a commented starter project rules file).

Exit codes: 0 ran and nothing fails; 1 ran and at least one member fails; 2 could not run.
"""

from __future__ import annotations

import argparse
import gc
import os
import sys
from contextlib import ExitStack
from pathlib import Path

from . import CAUTION, __version__
from .atomic import atomic_target
from .errors import IfcCheckError


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="ifccheck",
        description="Check every timber bending member of an IFC model by allowable stress design. " + CAUTION,
    )
    parser.add_argument("--version", action="version", version=f"ifccheck {__version__}")
    commands = parser.add_subparsers(dest="command", required=True)
    check = commands.add_parser("check", help="check a model and write verdicts and the exception list")
    check.add_argument("model", type=Path, help="the IFC model to check")
    check.add_argument("-o", "--output", type=Path, help="checked model to write (default MODEL.checked.ifc)")
    check.add_argument("--csv", type=Path, help="exception list to write (default MODEL.exceptions.csv)")
    check.add_argument("--rules", type=Path, help="project rules file (TOML) over the rules/ defaults")
    check.add_argument("--in-place", action="store_true", help="write the verdicts into MODEL itself")
    rules = commands.add_parser("rules", help="project rules files: print or write a commented starter file")
    rules.add_argument("--example", action="store_true", required=True,
                       help="the starter file, with every key and what it does")
    rules.add_argument("-o", "--output", type=Path, help="write it to this new file instead of printing it")
    return parser


def _outputs(args) -> "tuple[Path, Path]":
    model = args.model
    stem = model.name[: -len(model.suffix)] if model.suffix else model.name
    ifc_out = model if args.in_place else (args.output or model.with_name(f"{stem}.checked.ifc"))
    csv_out = args.csv or model.with_name(f"{stem}.exceptions.csv")
    return ifc_out, csv_out


def _reactions_path(model: Path) -> Path:
    stem = model.name[: -len(model.suffix)] if model.suffix else model.name
    return model.with_name(f"{stem}.reactions.csv")


class _ParseInBackground:
    """The model file parsed by ifcopenshell on a thread of its own, started before the rest of
    the program is imported: ifcopenshell parses without holding Python's interpreter lock, so on
    two cores the parse and the imports overlap. Calling it waits for the parse and returns the
    file, or raises what the parse raised (ifccheck.ifc.open_model checks the file either way).
    As a context manager it waits for the parse on leaving, so no thread outlives the command."""

    def __init__(self, path: Path) -> None:
        import threading

        self._file = None
        self._error = None
        self._thread = threading.Thread(target=self._parse, args=(str(path),), name="ifccheck-parse")
        self._thread.start()

    def _parse(self, path: str) -> None:
        import ifcopenshell

        try:
            self._file = ifcopenshell.open(path)
        except Exception as exc:  # noqa: BLE001 - raised again where the file is used
            self._error = exc

    def __call__(self):
        self._thread.join()
        if self._error is not None:
            raise self._error
        return self._file

    def __enter__(self) -> "_ParseInBackground":
        return self

    def __exit__(self, *exc) -> None:
        self._thread.join()


def run_check(args) -> int:
    ifc_out, csv_out = _outputs(args)
    if args.in_place and args.output:
        raise IfcCheckError("use either --in-place or -o, not both")
    gc.disable()  # a short run holding many small records: skip the collector's repeated scans
    import ifcopenshell  # noqa: F401 - imported here, before the parse starts on its thread

    from .stepfile import check_ifc_file

    check_ifc_file(args.model)  # a file that is not IFC, or cut short, is never handed to the parser
    with _ParseInBackground(args.model) as parsed:
        from .checker import check_model
        from .ifc.writer import EarlyCopy
        from .report.console import summary

        with EarlyCopy(ifc_out) as early:  # the checked model is written while it is checked
            result = check_model(args.model, args.rules, parsed=parsed, on_open=early.start)
            outputs = [ifc_out, csv_out]
            # the outputs are written to temporary files and renamed only when all succeeded
            with atomic_target(ifc_out) as ifc_tmp, atomic_target(csv_out) as csv_tmp, ExitStack() as more:
                result.write_ifc(ifc_tmp, early)
                result.write_csv(csv_tmp)
                if result.has_reactions:
                    outputs.append(_reactions_path(args.model))
                    result.write_reactions_csv(more.enter_context(atomic_target(outputs[-1])))
    try:
        print(summary(result, [str(p) for p in outputs]), flush=True)
    except BrokenPipeError:  # the summary was piped into a reader that stopped early (e.g. head)
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
    return 1 if result.failed else 0


def run_rules(args) -> int:
    from .rules import example_text

    text = example_text()
    if args.output is None:
        sys.stdout.write(text)
        return 0
    try:
        with open(args.output, "x", encoding="utf-8") as fh:  # "x": never overwrite a file
            fh.write(text)
    except FileExistsError as exc:
        raise IfcCheckError(f"{args.output} already exists; choose another name or remove it first") from exc
    except OSError as exc:
        raise IfcCheckError(f"cannot write {args.output}: {exc}") from exc
    print(f"wrote {args.output}; check a model with: ifccheck check MODEL.ifc --rules {args.output}")
    return 0


def main(argv=None) -> int:
    """Run the command line ``argv`` (None: the program's own arguments) and return the exit code."""
    args = _parser().parse_args(argv)
    try:
        code = run_rules(args) if args.command == "rules" else run_check(args)
    except IfcCheckError as exc:
        print(f"ifccheck: cannot run: {exc}", file=sys.stderr)
        code = 2
    if argv is None:  # run as the program, which ends next: its objects need no more collecting
        gc.freeze()  # spares the interpreter's last collection a scan of every object (0.1 s)
    return code


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
