"""``towboard brief FILE -o plan.pdf [--paper a4|letter]``: the briefing without a window.

Exits 0 when the PDF is written; 2 with a one-line message on stderr for a file that
cannot be read, a bad option or an output that cannot be written, does not end in .pdf
or is the plan itself. Nothing is written unless the whole PDF is.
"""

from __future__ import annotations

import argparse
import os
import sys

from core.errors import TowboardError
from core.io.projectfile import load


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"towboard brief: {message}\n")


def _parser() -> _Parser:
    p = _Parser(prog="towboard brief", description="Write the printed briefing of a plan as a PDF.")
    p.add_argument("file", help="a .towboard file")
    p.add_argument("-o", "--output", required=True, help="the PDF to write")
    p.add_argument("--paper", choices=("a4", "letter"), default="a4", help="paper size (a4)")
    return p


def _application() -> object:
    """A Qt application for painting without a window (offscreen unless one is running)."""
    from PySide6.QtGui import QGuiApplication

    app = QGuiApplication.instance()
    if app is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QGuiApplication(["towboard-brief"])
    return app


def brief_command(argv: list[str]) -> int:
    args = _parser().parse_args(argv)
    try:
        project = load(args.file)
        _app = _application()
        from app.briefing.document import write_pdf

        pages = write_pdf(project, args.output, args.paper, plan_path=args.file)
    except TowboardError as e:
        print(f"towboard brief: {str(e).splitlines()[0]}", file=sys.stderr)
        return 2
    except OSError as e:
        print(f"towboard brief: cannot write {args.output}: {e.strerror or e}", file=sys.stderr)
        return 2
    del _app
    print(f"wrote {args.output} ({pages} page{'s' if pages != 1 else ''}, {args.paper})")
    return 0
