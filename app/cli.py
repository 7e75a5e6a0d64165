"""The ``towboard`` command.

``towboard [FILE]`` opens the window (the bundled sample when no file is given);
``towboard report FILE [--json]`` prints each stage's verdict, balance, conditions,
fittings, solved pulls, tug lost check and hold limits without a window;
``towboard report FILE --csv [--table tugs|balance] [--display-units]`` prints the
tug table and the balance of every stage as CSV, the report's numbers;
``towboard check FILE [--json]`` prints each stage's verdict and its reasons and exits 0
only when every stage is go; ``towboard drift FILE --stage N [--lose TUG | --let-go]
[--seconds S] [--json]`` prints one stage's drift preview (the track and the first
contact); ``towboard brief FILE -o plan.pdf`` writes the printed briefing; ``towboard import-outline`` and ``towboard export`` read drawings and write
pictures (app.drawings.commands). Bad input exits 2 with a one-line message on stderr,
never a traceback.

Each subcommand is a function ``(argv) -> exit code`` named in :data:`COMMANDS` as
``"module:function"`` and imported only when used, so the window's Qt is not loaded
for a headless command.
"""

from __future__ import annotations

import argparse
import importlib
import json
import sys
from collections.abc import Callable, Sequence
from pathlib import Path

from core.errors import TowboardError
from core.io.projectfile import load

SAMPLE = Path(__file__).resolve().parent.parent / "sample_projects" / "deck_barge_unberth.towboard"

#: Subcommand -> "module:function" taking the arguments after the subcommand's name.
COMMANDS: dict[str, str] = {
    "report": "app.cli:report_command",
    "check": "app.cli:check_command",
    "drift": "app.cli:drift_command",
    "brief": "app.briefing.cli:brief_command",
    "import-outline": "app.cli:import_outline_command",
    "export": "app.cli:export_command",
}


class Parser(argparse.ArgumentParser):
    """An argument parser whose errors exit 2 with one line (the project's rule)."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"{self.prog}: {message}\n")


def report_command(argv: Sequence[str]) -> int:
    p = Parser(
        prog="towboard report",
        description="Print each stage's verdict, balance, conditions, fittings, solved pulls, "
        "tug lost check and hold limits.",
    )
    p.add_argument("file", help="a .towboard file")
    p.add_argument("--json", action="store_true", help="print JSON in SI units")
    p.add_argument(
        "--csv",
        action="store_true",
        help="print the tug table and the balance table as CSV (a blank line between)",
    )
    p.add_argument("--table", choices=("tugs", "balance"), help="with --csv: one table")
    p.add_argument(
        "--display-units", action="store_true", help="with --csv: the plan's units, not SI"
    )
    args = p.parse_args(list(argv))
    from core.io.report import report_json, report_text

    project = load(args.file)
    if args.csv:
        from core.io.tables import TABLES, csv_text

        report = report_json(project)
        units = project.units if args.display_units else None
        names = [args.table] if args.table else list(TABLES)
        print("\n".join(csv_text(TABLES[t](report, units)) for t in names), end="")
        return 0
    if args.json:
        print(json.dumps(report_json(project), indent=2, allow_nan=False))
    else:
        print(report_text(project), end="")
    return 0


def check_command(argv: Sequence[str]) -> int:
    """Each stage's verdict; exit 0 when every stage is go, 1 when any is not."""
    p = Parser(
        prog="towboard check",
        description="Print each stage's verdict (go, caution or no-go) and its reasons. "
        "Exits 0 when every stage is go, 1 when any is not, 2 on bad input.",
    )
    p.add_argument("file", help="a .towboard file")
    p.add_argument("--json", action="store_true", help="print JSON")
    args = p.parse_args(list(argv))
    from core.analysis.stage import plan_results
    from core.io.report import verdict_json

    project = load(args.file)
    results = plan_results(project)
    not_go = [r for r in results if not r.verdict.is_go]
    if args.json:
        out = {
            "plan": project.name,
            "revision": project.revision,
            "all_go": not not_go,
            "stages": [
                {"stage": r.stage.name, "verdict": verdict_json(r.verdict)} for r in results
            ],
        }
        print(json.dumps(out, indent=2, allow_nan=False))
    else:
        for r in results:
            print(f"Stage {r.index + 1}: {r.stage.name}: {r.verdict.label}")
            for reason in r.verdict.reasons:
                print(f"  {reason.status.upper():<8}{reason.text}")
        if not results:
            print("The plan has no stages.")
        elif not_go:
            names = ", ".join(f"{r.index + 1} ({r.verdict.status})" for r in not_go)
            print(f"Not every stage is go: stage {names}.")
        else:
            print("Every stage is go.")
    return 1 if not_go or not results else 0


def drift_command(argv: Sequence[str]) -> int:
    """The drift preview of one stage: the track and the first contact."""
    p = Parser(
        prog="towboard drift",
        description="Print the drift preview of one stage: the body's track (time, centroid "
        "east and north, heading, speed, rate of turn) and its first contact. Without --lose "
        "or --let-go the pulls stay as set.",
    )
    p.add_argument("file", help="a .towboard file")
    p.add_argument("--stage", required=True, type=int, metavar="N", help="stage number, 1 first")
    lost = p.add_mutually_exclusive_group()
    lost.add_argument("--lose", metavar="TUG", help="this tug is lost; the others stay as set")
    lost.add_argument("--let-go", action="store_true", help="every line is let go")
    p.add_argument(
        "--seconds", type=float, metavar="S", help="how long to look ahead (default: the plan's)"
    )
    p.add_argument(
        "--every", type=float, default=10.0, metavar="S", help="print the track every S s (10)"
    )
    p.add_argument("--json", action="store_true", help="print JSON in SI units")
    args = p.parse_args(list(argv))
    from core.io.report_drift import drift_command_json, drift_command_text

    project = load(args.file)
    options = (args.stage, args.lose, args.let_go, args.seconds, args.every)
    if args.json:
        print(json.dumps(drift_command_json(project, *options), indent=2, allow_nan=False))
    else:
        print(drift_command_text(project, *options), end="")
    return 0


def import_outline_command(argv: Sequence[str]) -> int:
    from app.drawings.commands import run

    return run("import-outline", list(argv))


def export_command(argv: Sequence[str]) -> int:
    from app.drawings.commands import run

    return run("export", list(argv))


def _open_window(file: str | None) -> int:
    from app.window.main_window import run

    return run(file)


def _command(name: str) -> Callable[[Sequence[str]], int]:
    module, _, func = COMMANDS[name].partition(":")
    return getattr(importlib.import_module(module), func)  # type: ignore[no-any-return]


def main(argv: Sequence[str] | None = None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    try:
        if argv and argv[0] in COMMANDS:
            return _command(argv[0])(argv[1:])
        p = Parser(
            prog="towboard",
            description="Plan multi-tug moves. Subcommands: " + ", ".join(COMMANDS) + ".",
        )
        p.add_argument("file", nargs="?", help="a .towboard file (default: the bundled sample)")
        args = p.parse_args(argv)
        return _open_window(args.file)
    except TowboardError as e:
        first = str(e).splitlines()[0]
        print(f"towboard: {first}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        return 130
