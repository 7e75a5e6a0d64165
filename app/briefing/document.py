"""The printed briefing: the whole plan on paper, through Qt's print support.

:func:`render` paints the briefing on any paged paint device (a QPdfWriter, or a
QPrinter for a real printer or the print preview); :func:`write_pdf` writes a PDF
atomically. Pages are A4 or US Letter, portrait, drawn as vectors. The content is
laid out into pages first, so every page carries "page N of M".
"""

from __future__ import annotations

import os
from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QMarginsF, QPointF, QRectF
from PySide6.QtGui import (
    QPagedPaintDevice,
    QPageLayout,
    QPageSize,
    QPainter,
    QPdfWriter,
    QPen,
)

from app.briefing.cover import conventions, cover
from app.briefing.drift_section import drift_blocks
from app.briefing.layout import (
    INK,
    MUTED,
    RULE,
    Block,
    Ctx,
    Group,
    Page,
    PageBreak,
    Spacer,
    paginate,
)
from app.briefing.overview import overview_blocks
from app.briefing.particulars import particulars
from app.briefing.stage_page import stage_blocks
from core.analysis.stage import StageResult, plan_results
from core.errors import InputError
from core.io.paths import same_file
from core.io.projectfile import replacing
from core.model.plan import Project

PAPERS: dict[str, QPageSize.PageSizeId] = {
    "a4": QPageSize.PageSizeId.A4,
    "letter": QPageSize.PageSizeId.Letter,
}
MARGIN_MM = (15.0, 16.0, 15.0, 15.0)  # left, top, right, bottom: room for header and footer
RESOLUTION_DPI = 1200


@dataclass(frozen=True, slots=True)
class BriefingContent:
    """What the briefing prints: the plan and every stage's result (the core's, read as is)."""

    project: Project
    results: tuple[StageResult, ...]


def content_of(project: Project) -> BriefingContent:
    return BriefingContent(project, plan_results(project))


def blocks_of(content: BriefingContent, content_height_mm: float) -> list[Block]:
    project = content.project
    blocks: list[Block] = cover(project, content.results)
    blocks.append(PageBreak())
    clearances = [r.clearances for r in content.results]
    blocks += overview_blocks(project, clearances, min(165.0, content_height_mm * 0.62))
    blocks.append(PageBreak())
    blocks += particulars(project)
    # the conventions follow the particulars, on a page of their own if they do not fit
    blocks.append(Group([Spacer(4), *conventions(project)]))
    diagram_mm = min(130.0, content_height_mm * 0.45)
    for result in content.results:
        blocks += stage_blocks(project, result, diagram_mm)
        blocks += drift_blocks(project, result.index)
    return blocks


class Document:
    """A laid-out briefing for one paint device."""

    def __init__(self, content: BriefingContent, device: QPagedPaintDevice) -> None:
        self.content = content
        self.device = device
        self.ctx = Ctx(device)
        ml, mt, mr, mb = (self.ctx.mm(v) for v in MARGIN_MM)
        w, h = float(device.width()), float(device.height())
        self.body = QRectF(ml, mt, w - ml - mr, h - mt - mb)
        blocks = blocks_of(content, self.body.height() / self.ctx.mm(1))
        self.pages: list[Page] = paginate(blocks, self.ctx, self.body.width(), self.body.height())

    def paint(self, painter: QPainter, first_page: int = 0) -> None:
        n = len(self.pages)
        for i, page in enumerate(self.pages):
            if i > first_page:
                self.device.newPage()
            if i < first_page:
                continue
            self._frame(painter, i + 1, n)
            for placed in page:
                r = QRectF(
                    self.body.left(), self.body.top() + placed.y, self.body.width(), placed.h
                )
                placed.block.paint(painter, self.ctx, r)

    def _frame(self, p: QPainter, number: int, total: int) -> None:
        ctx, project = self.ctx, self.content.project
        left, right = self.body.left(), self.body.right()
        top = self.body.top() - ctx.mm(5)
        p.setFont(ctx.font(7.5, True))
        p.setPen(INK)
        p.drawText(QPointF(left, top - ctx.mm(1.2)), project.name)
        rev = f"Revision {project.revision}" + (f"  ·  {project.date}" if project.date else "")
        p.setFont(ctx.font(7.5))
        w = ctx.metrics(7.5).horizontalAdvance(rev)
        p.drawText(QPointF(right - w, top - ctx.mm(1.2)), rev)
        p.setPen(QPen(RULE, ctx.mm(0.25)))
        p.drawLine(QPointF(left, top), QPointF(right, top))
        bottom = self.body.bottom() + ctx.mm(5)
        p.drawLine(QPointF(left, bottom), QPointF(right, bottom))
        p.setPen(MUTED)
        p.setFont(ctx.font(7.0))
        p.drawText(
            QPointF(left, bottom + ctx.mm(3.8)),
            f"{project.name}  ·  revision {project.revision}  ·  planning aid: see the cautions",
        )
        pn = f"page {number} of {total}"
        p.setFont(ctx.font(7.5, True))
        p.setPen(INK)
        w = ctx.metrics(7.5, True).horizontalAdvance(pn)
        p.drawText(QPointF(right - w, bottom + ctx.mm(3.8)), pn)


def page_layout(paper: str) -> QPageLayout:
    if paper not in PAPERS:
        raise InputError("paper", paper, f"is not one of {', '.join(PAPERS)}")
    return QPageLayout(
        QPageSize(PAPERS[paper]),
        QPageLayout.Orientation.Portrait,
        QMarginsF(0, 0, 0, 0),
        QPageLayout.Unit.Millimeter,
    )


def render(device: QPagedPaintDevice, project: Project) -> int:
    """Paint the briefing of ``project`` on ``device`` (already sized); returns the page count."""
    doc = Document(content_of(project), device)
    painter = QPainter()
    if not painter.begin(device):
        raise OSError("cannot start painting on the print device")
    try:
        doc.paint(painter)
    finally:
        painter.end()
    return len(doc.pages)


def pdf_writer(path: str, project: Project, paper: str) -> QPdfWriter:
    w = QPdfWriter(path)
    w.setResolution(RESOLUTION_DPI)
    w.setPageLayout(page_layout(paper))
    w.setTitle(f"{project.name}, revision {project.revision}: briefing")
    w.setCreator("Towboard")
    return w


def check_output(path: Path, plan_path: str | os.PathLike[str] | None = None) -> None:
    """Refuse a briefing file that does not end in .pdf, or that is the plan it is made
    from (by name, or through a link: the plan would be replaced by its briefing).

    Raises InputError naming the briefing file.
    """
    if path.suffix.lower() != ".pdf":
        raise InputError("briefing file", path.name, "must end in .pdf")
    if plan_path is not None and same_file(path, plan_path):
        raise InputError(
            "briefing file", str(path), "is the plan itself; give the briefing its own name"
        )


def write_pdf(
    project: Project,
    path: str | os.PathLike[str],
    paper: str = "a4",
    plan_path: str | os.PathLike[str] | None = None,
) -> int:
    """Write the briefing to ``path`` as a PDF, atomically; returns the page count.

    ``path`` must end in .pdf and must not be ``plan_path``, the file the plan was read
    from (:func:`check_output`). The PDF is written to a temporary file in the same folder
    and renamed over ``path`` only once it is complete, so a failure never leaves a
    half-written file.
    """
    target = Path(path)
    check_output(target, plan_path)
    page_layout(paper)  # refuse a bad paper before touching the disk
    if not target.parent.is_dir():
        raise InputError("output folder", str(target.parent), "does not exist")
    with replacing(target) as tmp:
        writer = pdf_writer(str(tmp), project, paper)
        pages = render(writer, project)
        del writer  # flushes and closes the file
    return pages
