"""The headless drawing commands: ``towboard import-outline`` and ``towboard export``.

``towboard import-outline DRAWING.dxf|OFFSETS.csv [--layer NAME] [--units U] [--x-aft]
-o PLAN.towboard`` writes a new plan holding the hull drawn on the layer (the layer
with the largest closed outline when none is named), in the drawing's units unless
given, the drawing's x forward unless ``--x-aft``. ``towboard export FILE [--stage N]
-o FILE.svg|.png`` draws the board (or ``--picture diagram``) of stage N, or of every
stage into numbered files. Bad input exits 2 with one line on stderr.
"""

from __future__ import annotations

import argparse
import os
import re
import sys
from pathlib import Path

from core.errors import DrawingError, InputError, TowboardError
from core.io.drawing_units import METRES_PER_UNIT
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import (
    CHORD_ERROR_M,
    JOIN_TOLERANCE_M,
    import_outline,
    layer_summaries,
    likely_layer,
)
from core.io.offsets import import_offsets
from core.io.outline_import import REFERENCES, ImportedOutline, OutlinePlacement, new_plan
from core.io.paths import read_table, same_file
from core.io.projectfile import SUFFIX, load, save
from core.units import fmt


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"{self.prog}: {message}\n")


def _import_parser() -> _Parser:
    p = _Parser(
        prog="towboard import-outline",
        description="Make a new plan holding a hull outline read from a DXF drawing or a CSV of offsets.",
    )
    p.add_argument("drawing", help="a .dxf drawing, or a .csv of offsets (x, half-breadth)")
    p.add_argument("-o", "--output", required=True, help="the .towboard plan to write")
    p.add_argument(
        "--layer",
        help="the drawing's layer holding the outline (default: the largest closed outline)",
    )
    p.add_argument(
        "--units",
        choices=tuple(METRES_PER_UNIT),
        help="the drawing's units (default: its header's; m for a CSV)",
    )
    p.add_argument(
        "--x-aft", action="store_true", help="the drawing's x runs aft (the bow towards -x)"
    )
    p.add_argument(
        "--reference",
        choices=REFERENCES[:4],
        default="aft",
        help="the hull's reference point (aft end on the centreline)",
    )
    p.add_argument(
        "--chord-error",
        type=float,
        default=CHORD_ERROR_M,
        metavar="M",
        help=f"largest gap between an arc and its chords, m ({CHORD_ERROR_M})",
    )
    p.add_argument(
        "--join-tolerance",
        type=float,
        default=JOIN_TOLERANCE_M,
        metavar="M",
        help=f"line ends this close are joined, m ({JOIN_TOLERANCE_M})",
    )
    p.add_argument("--name", help="the hull's name (default: the file's name)")
    p.add_argument("--force", action="store_true", help="replace the output if it exists")
    return p


def read_outline(args: argparse.Namespace) -> ImportedOutline:
    """The outline the arguments ask for (DXF or CSV by the file's suffix)."""
    src = Path(args.drawing)
    placement = OutlinePlacement("-x" if args.x_aft else "+x", reference=args.reference)
    if src.suffix.lower() == ".csv":
        return import_offsets(
            read_table(src), src.name, args.units, args.x_aft, placement, args.chord_error
        )
    drawing = Drawing.open(src)
    units = args.units or drawing.units
    if units is None:
        raise DrawingError(
            src.name,
            f"the drawing does not say its units ($INSUNITS is {drawing.insunits}); "
            f"give --units {'|'.join(METRES_PER_UNIT)}",
        )
    layer = args.layer
    if layer is None:
        layer = likely_layer(layer_summaries(drawing, units, args.chord_error, args.join_tolerance))
        if layer is None:
            raise DrawingError(src.name, "no layer holds a closed outline")
    return import_outline(drawing, layer, units, placement, args.chord_error, args.join_tolerance)


def import_outline_command(argv: list[str]) -> int:
    args = _import_parser().parse_args(argv)
    out = Path(args.output)
    if out.suffix != SUFFIX:
        out = out.with_name(out.name + SUFFIX)
    if out.exists() and not args.force:
        raise InputError("output", str(out), "exists; give --force to replace it")
    got = read_outline(args)
    name = args.name or Path(args.drawing).stem
    project = new_plan(got, name)
    save(project, out)
    where = f"layer {got.layer}" if got.layer else "the offsets"
    print(
        f"{name}: outline from {where} in {got.units}, {got.length_m:.2f} m long, "
        f"{got.beam_m:.2f} m beam, area {got.area_m2:.1f} m², centroid x {fmt(got.centroid_m[0], 2)} m, "
        f"y {fmt(got.centroid_m[1], 2, signed=True)} m from the reference point "
        f"({got.points_kept} vertices)"
    )
    for n in got.notices:
        print(f"WARNING: {n.message}")
    print(f"wrote {out}")
    return 0


# -- export -------------------------------------------------------------------------------


def _size(text: str) -> tuple[int, int]:
    m = re.fullmatch(r"\s*(\d+)\s*[xX×]\s*(\d+)\s*", text)
    if not m:
        raise argparse.ArgumentTypeError(f"{text!r} is not WIDTHxHEIGHT in pixels")
    return int(m.group(1)), int(m.group(2))


def _export_parser() -> _Parser:
    p = _Parser(
        prog="towboard export", description="Draw a stage's board or diagram as SVG or PNG."
    )
    p.add_argument("file", help="a .towboard file")
    p.add_argument("-o", "--output", required=True, help="the picture to write (.svg or .png)")
    p.add_argument(
        "--stage",
        type=int,
        metavar="N",
        help="the stage, from 1 (default: every stage, numbered files)",
    )
    p.add_argument(
        "--picture",
        choices=("board", "diagram"),
        default="board",
        help="the board (default) or the printed stage diagram",
    )
    p.add_argument(
        "--size", type=_size, default=(1600, 1200), metavar="WxH", help="pixels (1600x1200)"
    )
    p.add_argument("--dpi", type=float, default=150.0, help="resolution, dots per inch (150)")
    return p


def _application() -> object:
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance()
    if app is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QApplication(["towboard-export"])
    return app


def export_command(argv: list[str]) -> int:
    args = _export_parser().parse_args(argv)
    from app.drawings.pictures import PictureSpec, picture_format, write_picture

    out = Path(args.output)
    picture_format(out)
    project = load(args.file)
    n = len(project.stages)
    if n == 0:
        raise InputError("stages", 0, "the plan has no stage to draw")
    if args.stage is not None and not 1 <= args.stage <= n:
        raise InputError("--stage", args.stage, f"is not a stage of the plan (1 to {n})")
    stages = [args.stage - 1] if args.stage is not None else list(range(n))
    _app = _application()
    w, h = args.size
    targets = {
        i: out if len(stages) == 1 else out.with_name(f"{out.stem}-{i + 1}{out.suffix}")
        for i in stages
    }
    for target in targets.values():  # every name checked before anything is written
        if same_file(target, args.file):
            raise InputError(
                "picture file", str(target), "is the plan itself; give the picture its own name"
            )
    for i, target in targets.items():
        try:
            write_picture(project, target, PictureSpec(args.picture, i, w, h, args.dpi))
        except OSError as e:
            raise InputError(
                "output", str(target), f"cannot be written: {e.strerror or e}"
            ) from None
        print(f"wrote {target} (stage {i + 1}: {project.stages[i].name})")
    del _app
    return 0


def run(command: str, argv: list[str]) -> int:
    """Run ``command`` with a one-line message and exit 2 on bad input."""
    prog = f"towboard {command}"
    try:
        if command == "import-outline":
            return import_outline_command(argv)
        return export_command(argv)
    except TowboardError as e:
        print(f"{prog}: {str(e).splitlines()[0]}", file=sys.stderr)
        return 2
