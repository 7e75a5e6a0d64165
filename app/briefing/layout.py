"""Flowing blocks onto printed pages: text, tables, drawings, with a header and footer.

Everything is measured and painted in the paint device's own pixels (a QPdfWriter or
a QPrinter), so the output stays vector and fonts keep their point sizes. The
document is laid out once into pages before anything is painted, which is how the
footer can say "page N of M".
"""

from __future__ import annotations

from collections import deque
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFont, QFontMetricsF, QPagedPaintDevice, QPainter, QPen

from app.paint import style

FONT_FAMILY = "DejaVu Sans"

# the plan's one palette (app.paint.style), under the names the page layout reads
INK, MUTED, RULE, SHADE = style.INK, style.MUTED, style.RULE, style.SHADE
FAIL, WARN, GOOD = style.NO_GO, style.CAUTION, style.GO


class Ctx:
    """Measuring and unit conversion for one paint device."""

    def __init__(self, device: QPagedPaintDevice) -> None:
        self.device = device
        self.dpi = float(device.logicalDpiX())
        self._metrics: dict[tuple[float, bool, bool], QFontMetricsF] = {}
        self._heights: dict[tuple[str, float, float, bool], float] = {}

    def mm(self, v: float) -> float:
        """Millimetres on paper -> device pixels."""
        return v * self.dpi / 25.4

    def font(self, size_pt: float = 8.5, bold: bool = False, italic: bool = False) -> QFont:
        f = QFont(FONT_FAMILY)
        f.setPointSizeF(size_pt)
        f.setBold(bold)
        f.setItalic(italic)
        return f

    def metrics(self, size_pt: float, bold: bool = False, italic: bool = False) -> QFontMetricsF:
        key = (size_pt, bold, italic)
        if key not in self._metrics:
            self._metrics[key] = QFontMetricsF(self.font(size_pt, bold, italic), self.device)
        return self._metrics[key]

    def text_height(self, text: str, width: float, size_pt: float, bold: bool = False) -> float:
        """Height of ``text`` word-wrapped to ``width`` device pixels, remembered: a
        briefing measures the same cells when it lays out and again when it paints."""
        key = (text, width, size_pt, bold)
        h = self._heights.get(key)
        if h is None:
            m = self.metrics(size_pt, bold)
            r = m.boundingRect(QRectF(0, 0, width, 1e7), int(Qt.TextFlag.TextWordWrap), text)
            h = self._heights[key] = max(r.height(), m.height())
        return h


class Block:
    """Something placed in the flow of a page. Blocks that cannot split move to the next page."""

    keep_with_next = False

    def height(self, ctx: Ctx, width: float) -> float:
        raise NotImplementedError

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        raise NotImplementedError


@dataclass
class Spacer(Block):
    mm: float = 3.0

    def height(self, ctx: Ctx, width: float) -> float:
        return ctx.mm(self.mm)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        pass


class PageBreak(Block):
    def height(self, ctx: Ctx, width: float) -> float:
        return 0.0

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        pass


@dataclass
class Text(Block):
    """A paragraph, word-wrapped to the column width."""

    text: str
    size_pt: float = 8.5
    bold: bool = False
    color: QColor = field(default_factory=lambda: QColor(INK))
    space_after_mm: float = 1.2
    keep_with_next: bool = False
    indent_mm: float = 0.0

    def height(self, ctx: Ctx, width: float) -> float:
        w = width - ctx.mm(self.indent_mm)
        return ctx.text_height(self.text, w, self.size_pt, self.bold) + ctx.mm(self.space_after_mm)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        p.setFont(ctx.font(self.size_pt, self.bold))
        p.setPen(self.color)
        r = rect.adjusted(ctx.mm(self.indent_mm), 0, 0, -ctx.mm(self.space_after_mm))
        p.drawText(r, int(Qt.TextFlag.TextWordWrap | Qt.AlignmentFlag.AlignLeft), self.text)


def heading(text: str, level: int = 1) -> Text:
    size = {0: 17.0, 1: 12.5, 2: 10.0}[level]
    return Text(text, size, True, space_after_mm=2.0 if level < 2 else 1.2, keep_with_next=True)


@dataclass
class Boxed(Block):
    """Paragraphs inside a ruled, shaded box (cautions, a stage's verdict)."""

    lines: Sequence[str]
    size_pt: float = 8.5
    border: QColor = field(default_factory=lambda: QColor(INK))
    fill: QColor = field(default_factory=lambda: QColor(SHADE))
    title: str = ""
    color: QColor = field(default_factory=lambda: QColor(INK))

    def _pad(self, ctx: Ctx) -> float:
        return ctx.mm(2.5)

    def height(self, ctx: Ctx, width: float) -> float:
        pad = self._pad(ctx)
        w = width - 2 * pad
        h = 2 * pad
        if self.title:
            h += ctx.text_height(self.title, w, self.size_pt + 1, True) + ctx.mm(1)
        for line in self.lines:
            h += ctx.text_height(line, w, self.size_pt) + ctx.mm(0.8)
        return h + ctx.mm(2.5)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        pad = self._pad(ctx)
        box = QRectF(rect.left(), rect.top(), rect.width(), rect.height() - ctx.mm(2.5))
        p.setPen(QPen(self.border, ctx.mm(0.35)))
        p.setBrush(self.fill)
        p.drawRect(box)
        p.setBrush(Qt.BrushStyle.NoBrush)
        y = box.top() + pad
        w = box.width() - 2 * pad
        if self.title:
            p.setFont(ctx.font(self.size_pt + 1, True))
            p.setPen(self.color)
            h = ctx.text_height(self.title, w, self.size_pt + 1, True)
            p.drawText(QRectF(box.left() + pad, y, w, h), int(Qt.TextFlag.TextWordWrap), self.title)
            y += h + ctx.mm(1)
        p.setFont(ctx.font(self.size_pt))
        p.setPen(self.color)
        for line in self.lines:
            h = ctx.text_height(line, w, self.size_pt)
            p.drawText(QRectF(box.left() + pad, y, w, h), int(Qt.TextFlag.TextWordWrap), line)
            y += h + ctx.mm(0.8)


@dataclass
class Column:
    title: str
    weight: float = 1.0
    align: str = "left"  # left, right, centre


#: What a table cell holds when there is nothing to give (drawn centred in its cell).
EMPTY_CELLS = frozenset({"-", "—", "–"})


@dataclass
class Table(Block):
    """A ruled table whose rows may run onto the next page (the header repeats).

    ``row_colors`` gives a text colour per row (None for the normal ink).
    """

    columns: Sequence[Column]
    rows: Sequence[Sequence[str]]
    size_pt: float = 8.0
    row_colors: Sequence[QColor | None] = ()
    header: bool = True
    first_bold: bool = False  # the first column in bold (a key / value table)
    pad_mm: float = 0.85
    keep_rows: int = 14  # a table of at most this many rows is not split across pages

    def widths(self, width: float) -> list[float]:
        total = sum(c.weight for c in self.columns)
        return [width * c.weight / total for c in self.columns]

    def _pad(self, ctx: Ctx) -> float:
        return ctx.mm(self.pad_mm)

    def header_height(self, ctx: Ctx, width: float) -> float:
        if not self.header:
            return 0.0
        pad = self._pad(ctx)
        return (
            max(
                ctx.text_height(c.title, w - 2 * pad, self.size_pt, True)
                for c, w in zip(self.columns, self.widths(width), strict=True)
            )
            + 2 * pad
        )

    def row_height(self, ctx: Ctx, width: float, i: int) -> float:
        pad = self._pad(ctx)
        cells = self.rows[i]
        hs = [
            ctx.text_height(str(t), w - 2 * pad, self.size_pt, self.first_bold and k == 0)
            for k, (t, w) in enumerate(zip(cells, self.widths(width), strict=True))
        ]
        return max(hs) + 2 * pad

    def height(self, ctx: Ctx, width: float) -> float:
        rows = sum(self.row_height(ctx, width, i) for i in range(len(self.rows)))
        return self.header_height(ctx, width) + rows + ctx.mm(2.5)

    def paint_rows(self, p: QPainter, ctx: Ctx, rect: QRectF, first: int, last: int) -> None:
        pad = self._pad(ctx)
        widths = self.widths(rect.width())
        y = rect.top()
        thin, thick = QPen(RULE, ctx.mm(0.15)), QPen(INK, ctx.mm(0.3))
        flags = {
            "left": Qt.AlignmentFlag.AlignLeft,
            "right": Qt.AlignmentFlag.AlignRight,
            "centre": Qt.AlignmentFlag.AlignHCenter,
        }
        if self.header:
            hh = self.header_height(ctx, rect.width())
            p.fillRect(QRectF(rect.left(), y, rect.width(), hh), SHADE)
            p.setFont(ctx.font(self.size_pt, True))
            p.setPen(INK)
            x = rect.left()
            for c, w in zip(self.columns, widths, strict=True):
                p.drawText(
                    QRectF(x + pad, y + pad, w - 2 * pad, hh - 2 * pad),
                    int(Qt.TextFlag.TextWordWrap | flags[c.align] | Qt.AlignmentFlag.AlignBottom),
                    c.title,
                )
                x += w
            y += hh
            p.setPen(thick)
            p.drawLine(QPointF(rect.left(), y), QPointF(rect.right(), y))
        for i in range(first, last):
            rh = self.row_height(ctx, rect.width(), i)
            color = self.row_colors[i] if i < len(self.row_colors) else None
            x = rect.left()
            for k, (c, w) in enumerate(zip(self.columns, widths, strict=True)):
                p.setFont(ctx.font(self.size_pt, self.first_bold and k == 0))
                p.setPen(color if color is not None else INK)
                text = str(self.rows[i][k])
                # a dash for nothing given sits in the middle of its cell: flush right it
                # ran into the next column's words ("- Bow, centre lead")
                align = "centre" if text in EMPTY_CELLS else c.align
                p.drawText(
                    QRectF(x + pad, y + pad, w - 2 * pad, rh - 2 * pad),
                    int(Qt.TextFlag.TextWordWrap | flags[align]),
                    text,
                )
                x += w
            y += rh
            p.setPen(thin)
            p.drawLine(QPointF(rect.left(), y), QPointF(rect.right(), y))

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        self.paint_rows(p, ctx, rect, 0, len(self.rows))


@dataclass
class TableSlice(Block):
    """Rows ``first`` to ``last`` of a table, with its header, as laid on one page."""

    table: Table
    first: int
    last: int

    def height(self, ctx: Ctx, width: float) -> float:
        rows = sum(self.table.row_height(ctx, width, i) for i in range(self.first, self.last))
        return self.table.header_height(ctx, width) + rows + ctx.mm(2.5)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        self.table.paint_rows(p, ctx, rect, self.first, self.last)


@dataclass
class Drawing(Block):
    """A fixed-height area painted by a function (the stage diagram, the hold limits plot)."""

    height_mm: float
    draw: Callable[[QPainter, Ctx, QRectF], None]
    space_after_mm: float = 3.0

    def height(self, ctx: Ctx, width: float) -> float:
        return ctx.mm(self.height_mm + self.space_after_mm)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        r = QRectF(
            rect.left(), rect.top(), rect.width(), rect.height() - ctx.mm(self.space_after_mm)
        )
        p.save()
        self.draw(p, ctx, r)
        p.restore()


@dataclass
class Group(Block):
    """Blocks kept on one page if they fit there; else they start a new page, led by
    ``continued`` (a "continued" heading)."""

    blocks: Sequence[Block]
    continued: Block | None = None

    def height(self, ctx: Ctx, width: float) -> float:
        return sum(b.height(ctx, width) for b in self.blocks)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:  # laid out block by block
        raise NotImplementedError


@dataclass
class Placed:
    block: Block
    y: float
    h: float


Page = list[Placed]


def _first_unit_height(block: Block, ctx: Ctx, width: float) -> float:
    """The least of a block that must go with a heading kept with it."""
    if isinstance(block, Table) and block.rows:
        if len(block.rows) <= block.keep_rows:
            return block.height(ctx, width)
        return block.header_height(ctx, width) + block.row_height(ctx, width, 0)
    return block.height(ctx, width)


def paginate(blocks: Sequence[Block], ctx: Ctx, width: float, avail: float) -> list[Page]:
    """Lay blocks down the page, starting a new page where the next one does not fit.

    One pass: a group is opened where it falls (with a page break and its "continued"
    heading in front when it does not fit on the rest of the page), so the time grows
    with the number of blocks, not with its square.
    """
    return _Paginator(ctx, width, avail).run(blocks)


class _Paginator:
    """The state of one pass of :func:`paginate`: the pages so far and the height used."""

    def __init__(self, ctx: Ctx, width: float, avail: float) -> None:
        self.ctx, self.width, self.avail = ctx, width, avail
        self.pages: list[Page] = [[]]
        self.y = 0.0

    def new_page(self) -> None:
        if self.pages[-1]:
            self.pages.append([])
        self.y = 0.0

    def run(self, blocks: Sequence[Block]) -> list[Page]:
        todo: deque[Block] = deque(blocks)
        while todo:
            block = todo.popleft()
            if isinstance(block, Group):
                opened: list[Block] = list(block.blocks)
                if self.y > 0.0 and self.y + block.height(self.ctx, self.width) > self.avail:
                    opened[:0] = [PageBreak()] + ([block.continued] if block.continued else [])
                todo.extendleft(reversed(opened))
                continue
            self.place(block, _first_of(todo[0]) if todo else None)
        return self.pages

    def place(self, block: Block, nxt: Block | None) -> None:
        ctx, width, avail = self.ctx, self.width, self.avail
        if isinstance(block, PageBreak):
            self.new_page()
            return
        if isinstance(block, Spacer) and self.y == 0.0:
            return
        if isinstance(block, Table):
            self.place_table(block)
            return
        h = block.height(ctx, width)
        need = h
        if block.keep_with_next and nxt is not None and not isinstance(nxt, PageBreak):
            need += _first_unit_height(nxt, ctx, width)
        if self.y > 0.0 and self.y + need > avail:
            self.new_page()
        self.pages[-1].append(Placed(block, self.y, h))
        self.y += h

    def place_table(self, block: Table) -> None:
        ctx, width, avail = self.ctx, self.width, self.avail
        if 0 < len(block.rows) <= block.keep_rows:
            h = block.height(ctx, width)
            if self.y > 0.0 and self.y + h > avail and h <= avail:
                self.new_page()
        i = 0
        n = len(block.rows)
        head = block.header_height(ctx, width)
        while i < n or (n == 0 and i == 0):
            j = i
            h = head + ctx.mm(2.5)
            while j < n and self.y + h + block.row_height(ctx, width, j) <= avail:
                h += block.row_height(ctx, width, j)
                j += 1
            if j == i and n > 0:  # not even one row fits here
                if self.y == 0.0:  # a single row taller than a page: place it anyway
                    h += block.row_height(ctx, width, j)
                    j += 1
                else:
                    self.new_page()
                    continue
            self.pages[-1].append(Placed(TableSlice(block, i, j), self.y, h))
            self.y += h
            i = j
            if n == 0:
                break
            if i < n:
                self.new_page()


def _first_of(block: Block) -> Block:
    """The block that will be laid first of ``block`` (a group's first block)."""
    while isinstance(block, Group) and block.blocks:
        block = block.blocks[0]
    return block
