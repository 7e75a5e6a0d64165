"""The ``towboard`` command.

``towboard [FILE]`` opens the window (the bundled sample when no file is given);
``towboard report FILE [--json]`` prints each stage's balance, conditions, solved
pulls, tug lost check and hold limits without a window;
``towboard report FILE --csv [--table tugs|balance] [--display-units]`` prints the
tug table and the balance of every stage as CSV, the report's numbers;
``towboard brief FILE -o plan.pdf`` writes the printed briefing;
``towboard import-outline`` and ``towboard export`` read drawings and write pictures
(app.drawings.commands). Bad input exits 2
with a one-line message on stderr, never a traceback.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence
from pathlib import Path

from core.errors import TowboardError
from core.io.projectfile import load

SAMPLE = Path(__file__).resolve().parent.parent / "sample_projects" / "deck_barge_unberth.towboard"


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"towboard: {message}\n")


def _report(args: argparse.Namespace) -> int:
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


def _open_window(file: str | None) -> int:
    try:
        from app.window.main_window import run
    except ImportError:  # the window is not built yet: show the report instead
        project = load(file or SAMPLE)
        from core.io.report import report_text

        print(report_text(project), end="")
        return 0
    return run(file)


def main(argv: Sequence[str] | None = None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    try:
        if argv and argv[0] == "report":
            p = _Parser(
                prog="towboard report",
                description="Print each stage's balance, conditions, solved pulls, tug lost check and hold limits.",
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
            return _report(p.parse_args(argv[1:]))
        if argv and argv[0] in ("import-outline", "export"):
            from app.drawings.commands import run

            return run(argv[0], argv[1:])
        if argv and argv[0] == "brief":
            from app.briefing.cli import brief_command

            return brief_command(argv[1:])
        p = _Parser(prog="towboard", description="Plan multi-tug moves.")
        p.add_argument("file", nargs="?", help="a .towboard file (default: the bundled sample)")
        args = p.parse_args(argv)
        return _open_window(args.file)
    except TowboardError as e:
        first = str(e).splitlines()[0]
        print(f"towboard: {first}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        return 130
