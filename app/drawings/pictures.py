"""Pictures of a plan for sending round: the board of a stage, or its printed diagram.

:func:`write_picture` draws one stage into an SVG (vector, through QSvgGenerator) or
a PNG (an image of the asked size), chosen by the file's suffix. Either picture is
drawn by the code that draws it on screen or on paper (``render_board`` for the
board, ``StageDiagram`` for the diagram), from the same core results, under a title
line saying the plan and the stage and over the planning caution. The file appears
whole or not at all.

Sizes: ``width_px`` x ``height_px`` at ``dpi``. Labels and pens of the board are
sized for a 96-dpi screen and scaled by dpi / 96; the diagram's are in points and
millimetres of a sheet ``width_px / dpi`` inches wide.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path
from typing import Literal

from PySide6.QtCore import QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QColor, QFont, QImage, QPaintDevice, QPainter
from PySide6.QtSvg import QSvgGenerator

from app.board.conditions_layer import draw_conditions_card
from app.board.render import render_board
from app.board.scene import BoardScene
from app.board.site_layer import SiteLayer
from app.briefing.diagram import StageDiagram
from app.briefing.layout import Ctx
from app.controller import Controller
from core.analysis.checks import check_stage
from core.errors import InputError
from core.io.projectfile import replacing
from core.io.report import CAUTION
from core.model.plan import Project

PictureKind = Literal["board", "diagram"]
KINDS: dict[str, str] = {"board": "the board", "diagram": "the stage diagram (as printed)"}
FORMATS = (".svg", ".png")
MAX_SIDE_PX = 20000
TITLE_PT, FOOT_PT = 10.0, 7.0
CAUTION_LINE = (
    "Planning aid only: certified bollard pull, fitting ratings and the conditions on the day "
    "govern; the master, the pilot and local port rules decide."
)


@dataclass(frozen=True, slots=True)
class PictureSpec:
    """What to draw: which picture of which stage (0-based), how many pixels, at what dpi.

    ``area`` is the site box of the board to show (x0, y0, x1, y1, m); None fits the
    bodies and their tugs.
    """

    kind: PictureKind = "board"
    stage_index: int = 0
    width_px: int = 1600
    height_px: int = 1200
    dpi: float = 150.0
    area: tuple[float, float, float, float] | None = None

    def __post_init__(self) -> None:
        if self.kind not in KINDS:
            raise InputError("picture", self.kind, f"is not one of {', '.join(KINDS)}")
        for name in ("width_px", "height_px"):
            v = getattr(self, name)
            if not (isinstance(v, int) and 64 <= v <= MAX_SIDE_PX):
                raise InputError(
                    f"picture {name.split('_')[0]}",
                    v,
                    f"must be whole pixels from 64 to {MAX_SIDE_PX}",
                )
        if not (math.isfinite(self.dpi) and 24 <= self.dpi <= 2400):
            raise InputError("picture resolution", self.dpi, "must be from 24 to 2400 dpi")
        if self.area is not None:
            x0, y0, x1, y1 = self.area
            if not all(math.isfinite(v) for v in self.area) or x1 <= x0 or y1 <= y0:
                raise InputError("board area", self.area, "must be a box of finite size")


@dataclass(frozen=True, slots=True)
class Drawn:
    """What was drawn where, device pixels: the map's box and scale (board only)."""

    map_rect: tuple[float, float, float, float]  # x, y, width, height
    px_per_m: float | None  # the board's scale; None for the diagram (its own round scale)
    diagram_scale: int | None  # 1 : N of the diagram


def _font(device: QPaintDevice, size_pt: float, bold: bool = False) -> QFont:
    f = QFont("DejaVu Sans")
    f.setPixelSize(max(1, round(size_pt * device.logicalDpiY() / 72)))
    f.setBold(bold)
    return f


def title_of(project: Project, index: int) -> str:
    stage = project.stages[index]
    return (
        f"{project.name} (revision {project.revision}) — stage {index + 1} of "
        f"{len(project.stages)}: {stage.name}"
    )


def paint_picture(project: Project, spec: PictureSpec, p: QPainter, device: QPaintDevice) -> Drawn:
    """Paint the picture over the whole of ``device`` (its pixels)."""
    if not 0 <= spec.stage_index < len(project.stages):
        raise InputError(
            "stage",
            spec.stage_index + 1,
            f"is not a stage of the plan (it has {len(project.stages)})",
        )
    w, h = float(spec.width_px), float(spec.height_px)
    k = spec.dpi / 72.0
    title_h, foot_h = 2.2 * TITLE_PT * k, 2.0 * FOOT_PT * k
    p.fillRect(QRectF(0, 0, w, h), QColor("white"))
    p.setRenderHint(QPainter.RenderHint.Antialiasing)
    p.setRenderHint(QPainter.RenderHint.TextAntialiasing)
    p.setPen(QColor("#1b1f24"))
    p.setFont(_font(device, TITLE_PT, True))
    pad = 0.6 * TITLE_PT * k
    p.drawText(
        QRectF(pad, 0, w - 2 * pad, title_h),
        int(Qt.AlignmentFlag.AlignVCenter | Qt.AlignmentFlag.AlignLeft),
        title_of(project, spec.stage_index),
    )
    p.setPen(QColor("#5d4a1f"))
    p.setFont(_font(device, FOOT_PT))
    p.drawText(
        QRectF(pad, h - foot_h, w - 2 * pad, foot_h),
        int(Qt.AlignmentFlag.AlignVCenter | Qt.AlignmentFlag.AlignLeft),
        "⚠ " + CAUTION_LINE,
    )
    area = QRectF(0, title_h, w, h - title_h - foot_h)
    if spec.kind == "board":
        return _paint_board(project, spec, p, area)
    check = check_stage(project, spec.stage_index)
    diagram = StageDiagram(project, check.stage, check.balances, check.clearances)
    ctx = Ctx(device)  # type: ignore[arg-type]  # any paint device: only its dpi is read
    inner = area.adjusted(ctx.mm(2), 0, -ctx.mm(2), 0)
    diagram.paint(p, ctx, inner)
    r = inner
    return Drawn((r.x(), r.y(), r.width(), r.height()), None, diagram.scale_n)


def _paint_board(project: Project, spec: PictureSpec, p: QPainter, area: QRectF) -> Drawn:
    controller = Controller(project)
    scene = BoardScene(controller, stage_index=spec.stage_index)
    site = SiteLayer(scene)
    scene.refresh()
    source = None
    if spec.area is not None:
        x0, y0, x1, y1 = spec.area
        source = QRectF(x0, y0, x1 - x0, y1 - y0)
    try:
        scale = render_board(scene, p, area, source)
        k = spec.dpi / 96.0
        p.save()
        p.scale(k, k)
        stage = project.stages[spec.stage_index]
        draw_conditions_card(
            p, QPointF(area.right() / k - 10, area.top() / k + 84), stage.conditions, project.units
        )
        p.restore()
    finally:
        del site
        scene.clear()
        scene.deleteLater()
        controller.deleteLater()
    return Drawn((area.x(), area.y(), area.width(), area.height()), scale, None)


def picture_format(path: Path) -> str:
    suffix = path.suffix.lower()
    if suffix not in FORMATS:
        raise InputError("picture file", path.name, "must end in .svg or .png")
    return suffix


def write_picture(project: Project, path: str | Path, spec: PictureSpec) -> Drawn:
    """Write the picture to ``path`` (.svg or .png), atomically; what was drawn where.

    Raises InputError for a bad file name, stage or size, OSError when the file
    cannot be written.
    """
    target = Path(path)
    fmt = picture_format(target)
    if not target.parent.is_dir():
        raise OSError(f"no folder {target.parent}")
    with replacing(target) as tmp:
        drawn = _write_svg(project, spec, tmp) if fmt == ".svg" else _write_png(project, spec, tmp)
    return drawn


def _write_svg(project: Project, spec: PictureSpec, tmp: Path) -> Drawn:
    gen = QSvgGenerator()
    gen.setFileName(str(tmp))
    gen.setSize(QSize(spec.width_px, spec.height_px))
    gen.setViewBox(QRectF(0, 0, spec.width_px, spec.height_px))
    gen.setResolution(round(spec.dpi))
    gen.setTitle(title_of(project, spec.stage_index))
    gen.setDescription(f"Towboard: {KINDS[spec.kind]}. {CAUTION}")
    p = QPainter()
    if not p.begin(gen):
        raise OSError(f"cannot write {tmp.name}")
    try:
        drawn = paint_picture(project, spec, p, gen)
    finally:
        p.end()
    return drawn


def _write_png(project: Project, spec: PictureSpec, tmp: Path) -> Drawn:
    image = QImage(spec.width_px, spec.height_px, QImage.Format.Format_ARGB32)
    dpm = round(spec.dpi / 0.0254)
    image.setDotsPerMeterX(dpm)
    image.setDotsPerMeterY(dpm)
    image.fill(QColor("white"))
    p = QPainter(image)
    try:
        drawn = paint_picture(project, spec, p, image)
    finally:
        p.end()
    # PySide6 takes the format as a str (bytes raise ValueError); its stubs say bytes
    if not image.save(str(tmp), "PNG"):  # type: ignore[call-overload]
        raise OSError(f"cannot write {tmp.name}")
    return drawn
