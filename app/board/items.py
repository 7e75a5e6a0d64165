"""Graphics items of the board. They draw what they are given; they compute no physics.

Geometry is in the parent's frame (a body frame: x forward, y to port, metres). Items
that must stay readable at every zoom (labels, marks, vertex handles) ignore the view's
transformations and are sized in pixels.
"""

from __future__ import annotations

import itertools
import math

from PySide6.QtCore import QLineF, QPointF, QRect, QRectF, Qt
from PySide6.QtGui import (
    QBrush,
    QColor,
    QFont,
    QFontMetricsF,
    QPainter,
    QPainterPath,
    QPen,
    QPolygonF,
    QRegion,
)
from PySide6.QtWidgets import (
    QGraphicsItem,
    QGraphicsLineItem,
    QGraphicsPathItem,
    QGraphicsPolygonItem,
    QGraphicsView,
    QStyleOptionGraphicsItem,
    QWidget,
)

from app.guard import guarded
from app.paint import style, symbols
from app.paint.shapes import (
    HEAD_HALF_WIDTH,
    TUG_BEAM_M,
    TUG_LENGTH_M,
    arc_arrow,
    arrow_head,
    tug_outline,
)
from app.paint.symbols import draw_centroid, draw_cog, draw_crossing, polygon, polyline_path

#: Key of the item data slot that says what an item stands for, e.g. ("tug", "Gannet").
ROLE = 0
#: Key of the item data slot set True on a guide that runs across the board (the line of
#: action, a quay face, a limit): the conditions card may lie over it.
GUIDE = 1

IGNORES = QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations
#: Fixed-size items are kept as pixmaps on screen (render_board turns this off to print).
CACHE = QGraphicsItem.CacheMode.DeviceCoordinateCache
#: Items fixed in pixels keep theirs in their own (pixel) frame: the picture is then the same
#: wherever the item lies. A device cache kept the sub-pixel place it was first drawn at when
#: the item moved by a fraction of a pixel, until a repaint drew part of it afresh: the text
#: then stood half a pixel apart from what a full repaint draws.
FIXED_CACHE = QGraphicsItem.CacheMode.ItemCoordinateCache
NO_CACHE = QGraphicsItem.CacheMode.NoCache


def take_out(item: QGraphicsItem) -> None:
    """Take ``item`` off its parent and out of its scene: it is drawn no more."""
    scene = item.scene()
    # Qt takes a null parent (the item is made top-level); PySide6's stubs leave None out
    item.setParentItem(None)  # type: ignore[arg-type]
    if scene is not None:
        scene.removeItem(item)


class Label(QGraphicsItem):
    """Text on a light box, fixed in pixels; ``offset`` (px, y down) from its anchor."""

    def __init__(
        self,
        text: str = "",
        parent: QGraphicsItem | None = None,
        color: QColor = style.TEXT,
        font: QFont | None = None,
        offset: tuple[float, float] = (8.0, -8.0),
        align: str = "left",
    ) -> None:
        super().__init__(parent)
        self.setFlag(IGNORES)
        self._font = font or style.label_font()
        # the font's measures, taken once (a label's text changes on every move of a drag)
        self._fm = QFontMetricsF(self._font)
        self._ascent, self._line_height = self._fm.ascent(), self._fm.height()
        self._color = color
        self._offset = offset
        self._outward: tuple[float, float, float] | None = None
        self._align = align
        self._lines: list[str] = []
        self._rect = QRectF()
        #: Where the label placer moved the box from its home (px, y down).
        self._shift = (0.0, 0.0)
        self._leader: Leader | None = None
        #: Placing order: lower is placed first and moves least (see app.board.placement).
        self.priority = 5
        #: True for a label that belongs on its hull (a name, BOW): the hull is no obstacle.
        self.on_hull = False
        #: True for a label the placer leaves where it is (the others keep clear of it).
        self.fixed = False
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self.setCacheMode(FIXED_CACHE)
        self.set_text(text)

    @property
    def text(self) -> str:
        return "\n".join(self._lines)

    def set_outward(self, ux: float, uy: float, gap: float = 5.0) -> None:
        """Centre the label just clear of its anchor in screen direction (ux, uy), y down.

        The box stays clear as its text changes (it is worked out with the text's size).
        """
        outward = (ux, uy, gap)
        if outward != self._outward or self._align != "centre":
            self._outward = outward
            self._align = "centre"
            self._relayout()

    def set_align(self, align: str) -> None:
        if align != self._align:
            self._align = align
            self._relayout()

    def set_offset(self, offset: tuple[float, float]) -> None:
        if offset != self._offset or self._outward is not None:
            self._offset = offset
            self._outward = None
            self._relayout()

    def _relayout(self) -> None:
        lines, self._lines = self._lines, []
        self.set_text("\n".join(lines))

    def set_text(self, text: str) -> None:
        lines = text.split("\n") if text else []
        if lines == self._lines:
            return
        self._lines = lines
        fm = self._fm
        # a little spare width: printers' font metrics run wider than the screen's
        w = 1.06 * max((fm.horizontalAdvance(s) for s in lines), default=0.0)
        h = self._line_height * len(lines)
        if self._outward is not None:
            ux, uy, gap = self._outward
            dx, dy = ux * ((w + 6) / 2 + gap), uy * ((h + 4) / 2 + gap)
        else:
            dx, dy = self._offset
        if self._align == "right":
            dx -= w + 6
        elif self._align == "centre":
            dx -= (w + 6) / 2
        rect = QRectF(dx, dy - h / 2 - 2, w + 6, h + 4).translated(*self._shift)
        if rect != self._rect:  # new figures of the same width keep the box (and its place
            self.prepareGeometryChange()  # in the scene's index): a drag's labels, often
        self._rect = rect
        self._aim_leader()
        self.update()

    def home_rect(self) -> QRectF:
        """The box where its owner put it, before the placer moved it (px from the anchor)."""
        return self._rect.translated(-self._shift[0], -self._shift[1])

    @property
    def shift(self) -> tuple[float, float]:
        return self._shift

    def set_shift(self, dx: float, dy: float) -> None:
        """Move the box (dx, dy) px from its home; a leader joins a box moved off its anchor."""
        if (dx, dy) == self._shift:
            return
        self.prepareGeometryChange()
        home = self.home_rect()
        self._shift = (dx, dy)
        self._rect = home.translated(dx, dy)
        self._aim_leader()
        self.update()

    def _aim_leader(self) -> None:
        far = self._shift != (0.0, 0.0) and not self._rect.adjusted(-12, -12, 12, 12).contains(
            QPointF(0, 0)
        )
        if not far:
            if self._leader is not None:
                self._leader.setVisible(False)
            return
        if self._leader is None:
            self._leader = Leader(self)
        r = self._rect
        near = QPointF(min(max(0.0, r.left()), r.right()), min(max(0.0, r.top()), r.bottom()))
        self._leader.set_line(near, self._color)
        self._leader.setVisible(True)

    @property
    def leader(self) -> Leader | None:
        """The line from the anchor to the moved box (None or hidden when not moved far)."""
        return self._leader

    def set_color(self, color: QColor) -> None:
        if color != self._color:
            self._color = color
            if self._leader is not None:
                self._leader.set_line(self._leader.end, color)
            self.update()

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        if not self._lines:
            return
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setPen(Qt.PenStyle.NoPen)
        painter.setBrush(style.LABEL_BG)
        painter.drawRoundedRect(self._rect, 3, 3)
        painter.setPen(self._color)
        painter.setFont(self._font)
        y = self._rect.top() + 2 + self._ascent
        for s in self._lines:
            painter.drawText(QPointF(self._rect.left() + 3, y), s)
            y += self._line_height


def leader_pen(color: QColor) -> QPen:
    """A leader's pen: thin and dotted, so that a leader in a load's colour running to
    a short load arrow does not read as the arrow's shaft (a solid leader from a label
    moved above a current arrow pointing to port looked like an arrow to starboard)."""
    return QPen(color, 1.0, Qt.PenStyle.DotLine)


class Leader(QGraphicsItem):
    """A thin dotted line from a label's anchor (its parent's origin) to its moved box, in
    pixels."""

    def __init__(self, parent: QGraphicsItem) -> None:
        super().__init__(parent)
        self.end = QPointF()
        self._pen = leader_pen(style.MUTED)
        self._rect = QRectF(-3, -3, 6, 6)
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)

    def set_line(self, end: QPointF, color: QColor) -> None:
        self.prepareGeometryChange()
        self.end = QPointF(end)
        self._pen = leader_pen(color)
        # worked out here once: Qt asks for it several times a frame, for every leader
        self._rect = QRectF(QPointF(0, 0), self.end).normalized().adjusted(-3, -3, 3, 3)
        self.update()

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        painter.setPen(self._pen)
        painter.drawLine(QPointF(0, 0), self.end)


class Mark(QGraphicsItem):
    """A point symbol fixed in pixels: centroid, centre of gravity, crossing, reference."""

    def __init__(self, kind: str, parent: QGraphicsItem | None = None, size: float = 14.0) -> None:
        super().__init__(parent)
        self.setFlag(IGNORES)
        self.kind = kind
        self.size = size
        self.color = style.TEXT
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self.setCacheMode(FIXED_CACHE)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        s = self.size / 2 + 2
        return QRectF(-s, -s, 2 * s, 2 * s)

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        r = self.size / 2
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        c = QPointF(0, 0)
        if self.kind == "centroid":
            draw_centroid(painter, c, r, self.color, 1.5)
        elif self.kind == "cog":
            draw_cog(painter, c, r, self.color, 1.5)
        elif self.kind == "crossing":
            draw_crossing(painter, c, r, self.color, 1.5)
        elif self.kind == "reference":  # small square with a dot: the hull frame's origin
            painter.setPen(QPen(self.color, 1.5))
            painter.setBrush(Qt.BrushStyle.NoBrush)
            painter.drawRect(QRectF(-r * 0.5, -r * 0.5, r, r))
            painter.setBrush(self.color)
            painter.drawEllipse(QPointF(0, 0), 1.5, 1.5)


class Handle(QGraphicsItem):
    """A vertex handle of an outline, fixed in pixels."""

    def __init__(self, parent: QGraphicsItem | None = None, size: float = 8.0) -> None:
        super().__init__(parent)
        self.setFlag(IGNORES)
        self.size = size
        self.selected = False
        self.setCacheMode(FIXED_CACHE)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        s = self.size / 2 + 1
        return QRectF(-s, -s, 2 * s, 2 * s)

    def set_selected(self, on: bool) -> None:
        if on != self.selected:
            self.selected = on
            self.update()

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        s = self.size / 2
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setPen(QPen(style.HULL_SELECTED, 1.2))
        painter.setBrush(style.HULL_SELECTED if self.selected else QColor("white"))
        painter.drawRect(QRectF(-s, -s, 2 * s, 2 * s))


class FittingMark(QGraphicsItem):
    """A line point (a bitt: ring with a dot) or a push point (a pad: a bar), in pixels."""

    def __init__(self, kind: str, parent: QGraphicsItem | None = None) -> None:
        super().__init__(parent)
        self.setFlag(IGNORES)
        self.kind = kind
        self.selected = False
        self.angle_deg = 0.0  # screen angle of the hull edge, for the push pad's bar
        self.setCacheMode(FIXED_CACHE)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return QRectF(-9, -9, 18, 18)

    def set_selected(self, on: bool) -> None:
        if on != self.selected:
            self.selected = on
            self.update()

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        edge = style.SELECTION if self.selected else QColor("white")
        if self.selected:
            painter.setPen(QPen(style.SELECTION, 2))
            painter.setBrush(Qt.BrushStyle.NoBrush)
            painter.drawEllipse(QPointF(0, 0), 8, 8)
        if self.kind == "line":
            painter.setPen(QPen(edge if self.selected else style.LINE_POINT, 1.5))
            painter.setBrush(QColor("white"))
            painter.drawEllipse(QPointF(0, 0), 4.5, 4.5)
            painter.setBrush(style.LINE_POINT)
            painter.drawEllipse(QPointF(0, 0), 2.0, 2.0)
        else:
            painter.rotate(self.angle_deg)
            painter.setPen(QPen(style.PUSH_POINT, 1))
            painter.setBrush(style.PUSH_POINT)
            painter.drawRoundedRect(QRectF(-6, -2.5, 12, 5), 1.5, 1.5)


#: A banded arrow's repaint band: pieces this long along its shaft (px), this far round it.
BAND_STEP_PX = 24.0
BAND_PAD_PX = 4.0
BAND_GRID_PX = 16


def _on_grid(x0: float, y0: float, x1: float, y1: float) -> tuple[int, int, int, int]:
    """A box grown to a grid of BAND_GRID_PX: neighbouring boxes then merge into few
    (a repaint clipped to a region of many small boxes costs more for every item in it)."""
    g = BAND_GRID_PX
    return (
        math.floor(x0 / g) * g,
        math.floor(y0 / g) * g,
        math.ceil(x1 / g) * g,
        math.ceil(y1 / g) * g,
    )


class _ArrowItem(QGraphicsItem):
    """What the straight and the curved arrow share: pen, filled head, cached bounds.

    A long slanting arrow's box is most of the board. While ``banded`` (the arrow
    changes on every move of a drag) it keeps a box that only grows, and each change
    asks its views to repaint a band along the old and the new arrow instead of both
    boxes: the same arrow is drawn, one item, where the band is exposed.
    """

    def __init__(self, color: QColor, width: float, parent: QGraphicsItem | None = None) -> None:
        super().__init__(parent)
        self._pen = style.pen(color, width)
        self._brush = QBrush(color)
        self._shaft = QPainterPath()
        self._head = QPolygonF()
        self._rect = QRectF()  # the arrow's own box
        self._box = QRectF()  # the box Qt is given: the arrow's, or one grown in a drag
        self._banded = False
        self._last_band: tuple[tuple[object, ...], QRegion] | None = None
        self._key: tuple[float, ...] | None = None
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)

    def set_banded(self, on: bool) -> None:
        """Repaint a band along the arrow as it changes (True), or its box (False)."""
        if on == self._banded:
            return
        self._banded = on
        if not on and self._box != self._rect:
            self.prepareGeometryChange()
            self._box = QRectF(self._rect)
            self.update()

    def _reshape(self, shaft: QPainterPath, head: QPolygonF, rect: QRectF) -> None:
        """Take a new shaft, head and box, and have what changed repainted."""
        views = self.scene().views() if self._banded and self.scene() is not None else []
        if not views or not self.isVisible() or not self._box.contains(rect):
            self.prepareGeometryChange()
            self._shaft, self._head, self._rect = shaft, head, rect
            self._box = rect.united(self._box) if views and self.isVisible() else QRectF(rect)
            self.update()
            return
        old = [self._band(v) for v in views]
        self._shaft, self._head, self._rect = shaft, head, rect
        for v, band in zip(views, old, strict=True):
            v.viewport().update(band.united(self._band(v)))

    def _band(self, view: QGraphicsView) -> QRegion:
        """The viewport pixels the arrow covers, as small boxes along it (the last one
        worked out is kept: a change repaints the old band and the new)."""
        t = self.deviceTransform(view.viewportTransform())
        key = (id(view), t, self._shaft, self._head)
        if self._last_band is not None and self._last_band[0] == key:
            return self._last_band[1]
        pad = BAND_PAD_PX + self._pen.widthF() / 2
        boxes: set[tuple[int, int, int, int]] = set()
        for line in self._shaft.toSubpathPolygons(t):
            pts = [(p.x(), p.y()) for p in line.toList()]
            for (ax, ay), (bx, by) in itertools.pairwise(pts):
                n = max(1, math.ceil(math.hypot(bx - ax, by - ay) / BAND_STEP_PX))
                for k in range(n):
                    px, py = ax + (bx - ax) * k / n, ay + (by - ay) * k / n
                    qx, qy = ax + (bx - ax) * (k + 1) / n, ay + (by - ay) * (k + 1) / n
                    boxes.add(
                        _on_grid(
                            min(px, qx) - pad,
                            min(py, qy) - pad,
                            max(px, qx) + pad,
                            max(py, qy) + pad,
                        )
                    )
        if not self._head.isEmpty():
            r = t.map(self._head).boundingRect()
            boxes.add(_on_grid(r.left() - 2, r.top() - 2, r.right() + 2, r.bottom() + 2))
        band = QRegion()
        for x0, y0, x1, y1 in sorted(boxes):
            band += QRect(x0, y0, x1 - x0, y1 - y0)
        self._last_band = (key, band)
        return band

    def set_color(self, color: QColor) -> None:
        if self._pen.color() != color:
            self._pen.setColor(color)
            self._brush = QBrush(color)
            self.update()

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._box

    def parts(self) -> tuple[QPainterPath, QPolygonF]:
        """The shaft and the head, in the parent's frame (m)."""
        return self._shaft, self._head

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        paint_arrow(painter, self._pen, self._brush, self._shaft, self._head)


class Arrow(_ArrowItem):
    """A straight arrow from ``start`` to ``end`` (parent frame, m), head sized in metres."""

    def set_geometry(
        self, start: tuple[float, float], end: tuple[float, float], head: float
    ) -> None:
        key = (start[0], start[1], end[0], end[1], head)
        if key == self._key:
            return
        self._key = key
        self._reshape(*arrow_parts(start, end, head))


def paint_arrow(
    painter: QPainter, pen: QPen, brush: QBrush, shaft: QPainterPath, head: QPolygonF
) -> None:
    """Draw an arrow's shaft with its pen scaled to the device, and its filled head."""
    k = style.device_scale(painter)
    symbols.paint_arrow(painter, style.scaled_pen(pen, k), brush.color(), shaft, head, 1.0 * k)


def arrow_parts(
    start: tuple[float, float], end: tuple[float, float], head: float
) -> tuple[QPainterPath, QPolygonF, QRectF]:
    """Shaft, head and bounds of a straight arrow (:func:`app.paint.shapes.arrow_head`);
    empty when it has no length."""
    parts = arrow_head(start, end, head)
    if parts is None:
        return QPainterPath(), QPolygonF(), QRectF()
    shaft_end, tip = parts
    shaft = polyline_path([start, shaft_end])
    head_poly = polygon(tip)
    w = HEAD_HALF_WIDTH * head
    rect = shaft.boundingRect().united(head_poly.boundingRect()).adjusted(-w, -w, w, w)
    return shaft, head_poly, rect


class TugItem(QGraphicsItem):
    """One tug in one item: its towline, its shape and its force arrow (body frame, m).

    One item rather than three, so a board with many tugs has few items to draw; it is
    grabbed by its shape only.

    While a drag moves the pulls of tugs that stay where they are (live solving), a tug
    whose pull alone changes draws its arrow apart, in a child item (:class:`TugArrow`,
    stacked just over it as the arrow is drawn now), so its picture of the towline and
    the shape is kept and only the arrow is drawn again; :meth:`join` takes the arrow
    back when the drag ends, so a tug at rest is drawn as one picture, as ever.
    """

    def __init__(self, parent: QGraphicsItem | None = None) -> None:
        super().__init__(parent)
        self._line_pen = style.pen(style.TOWLINE, 1.4)
        self._edge_pen = style.pen(style.TUG_EDGE, 1.3)
        self._arrow_pen = style.pen(style.TUG_FORCE, 2.6)
        self._fill = QBrush(style.TUG_FILL)
        self._towline: QLineF | None = None
        self._glyph = QPolygonF()
        self._shape = QPainterPath()
        self._shaft = QPainterPath()
        self._head = QPolygonF()
        self._rect = QRectF()
        self._still_rect = QRectF()  # the towline's and the shape's box
        self._arrow_rect = QRectF()  # the arrow's box
        #: The arrow drawn apart while a drag changes the pull alone (None: in this item).
        self._apart: TugArrow | None = None
        #: (start, end) of the force arrow, m, for whoever checks the drawing
        self.arrow_line: tuple[tuple[float, float], tuple[float, float]] | None = None

    def set_geometry(
        self,
        towline: QLineF | None,
        glyph: QPolygonF,
        arrow: tuple[tuple[float, float], tuple[float, float]] | None,
        head: float,
        apart: bool = False,
    ) -> None:
        """Take a new towline, shape and arrow; ``apart``: a drag is under way, and when
        only the arrow changed it is drawn apart (the picture of the rest is kept)."""
        still = glyph is self._glyph and towline == self._towline
        self.arrow_line = arrow
        if arrow is not None:
            self._shaft, self._head, self._arrow_rect = arrow_parts(arrow[0], arrow[1], head)
        else:
            self._shaft, self._head, self._arrow_rect = QPainterPath(), QPolygonF(), QRectF()
        if apart and still:
            (self._apart or self._split()).set_parts(self._shaft, self._head, self._arrow_rect)
            return
        self.prepareGeometryChange()
        if not still:
            # a live solve changes the pulls of tugs that stay where they are
            self._towline = towline
            self._glyph = glyph
            self._shape = QPainterPath()
            self._shape.addPolygon(glyph)
            self._shape.closeSubpath()
            rect = glyph.boundingRect()
            if towline is not None:
                rect = rect.united(QRectF(towline.p1(), towline.p2()).normalized())
            self._still_rect = rect
        if self._apart is not None:
            self._unsplit(self._apart)
        self._rect = self._box()
        self.update()

    def _box(self) -> QRectF:
        rect = self._still_rect
        if self._apart is None and not self._arrow_rect.isNull():
            rect = rect.united(self._arrow_rect)
        return rect.adjusted(-1.0, -1.0, 1.0, 1.0)

    def _split(self) -> TugArrow:
        """Draw the arrow apart from now on (this item's picture drawn once more, without)."""
        arrow = self._apart = TugArrow(self, self._arrow_pen)
        self.prepareGeometryChange()
        self._rect = self._box()
        self.update()
        return arrow

    def _unsplit(self, arrow: TugArrow) -> None:
        """Let the arrow apart go (out of the scene: at rest the tug is one item)."""
        self._apart = None
        take_out(arrow)

    def join(self) -> bool:
        """Draw the arrow in this item again (the drag is over); whether it was apart."""
        if self._apart is None:
            return False
        self.prepareGeometryChange()
        self._unsplit(self._apart)
        self._rect = self._box()
        self.update()
        return True

    @property
    def apart(self) -> bool:
        """Whether the arrow is drawn apart (a drag changes this tug's pull alone)."""
        return self._apart is not None

    @property
    def glyph(self) -> QPolygonF:
        """The tug's outline in the body frame, m."""
        return self._glyph

    @property
    def towline(self) -> QLineF | None:
        return self._towline

    def arrow_parts(self) -> tuple[QPainterPath, QPolygonF]:
        """The force arrow's shaft and head in the body frame, m (empty when no pull)."""
        return self._shaft, self._head

    def set_selected(self, on: bool) -> None:
        self._edge_pen = style.pen(style.SELECTION if on else style.TUG_EDGE, 2.6 if on else 1.3)
        self._fill = QBrush(style.TUG_FILL_SELECTED if on else style.TUG_FILL)
        self.update()

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded(default=QPainterPath)
    def shape(self) -> QPainterPath:
        return self._shape

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        k = style.device_scale(painter)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        if self._towline is not None:
            painter.setPen(style.scaled_pen(self._line_pen, k))
            painter.drawLine(self._towline)
        painter.setPen(style.scaled_pen(self._edge_pen, k))
        painter.setBrush(self._fill)
        painter.drawPolygon(self._glyph)
        if self._apart is None:
            _paint_tug_arrow(painter, self._arrow_pen, self._shaft, self._head, k)


def _paint_tug_arrow(
    painter: QPainter, pen: QPen, shaft: QPainterPath, head: QPolygonF, k: float
) -> None:
    symbols.paint_arrow(painter, style.scaled_pen(pen, k), pen.color(), shaft, head, 1.0 * k)


class TugArrow(QGraphicsItem):
    """A tug's force arrow drawn apart from its tug while a drag changes its pull alone
    (a child of the TugItem, so stacked over it as the arrow is there). Not grabbed: its
    shape is empty, the tug is grabbed by its own shape."""

    def __init__(self, parent: TugItem, pen: QPen) -> None:
        super().__init__(parent)
        self._pen = pen
        self._shaft = QPainterPath()
        self._head = QPolygonF()
        self._rect = QRectF()
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)

    def set_parts(self, shaft: QPainterPath, head: QPolygonF, rect: QRectF) -> None:
        self.prepareGeometryChange()
        self._shaft, self._head = shaft, head
        self._rect = rect.adjusted(-1.0, -1.0, 1.0, 1.0) if not rect.isNull() else QRectF()
        self.update()

    def parts(self) -> tuple[QPainterPath, QPolygonF]:
        """The shaft and the head drawn, in the tug's frame (m)."""
        return self._shaft, self._head

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded(default=QPainterPath)
    def shape(self) -> QPainterPath:
        return QPainterPath()

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        _paint_tug_arrow(painter, self._pen, self._shaft, self._head, style.device_scale(painter))


class MomentArrow(_ArrowItem):
    """A curved arrow round ``centre``: ``sweep_deg`` > 0 counter-clockwise (seen from above)."""

    def set_geometry(
        self,
        centre: tuple[float, float],
        radius: float,
        start_deg: float,
        sweep_deg: float,
        head: float,
    ) -> None:
        key = (centre[0], centre[1], radius, start_deg, sweep_deg, head)
        if key == self._key:
            return
        self._key = key
        parts = arc_arrow(centre, radius, start_deg, sweep_deg, head)
        if parts is None:
            self._reshape(QPainterPath(), QPolygonF(), QRectF())
            return
        shaft, tip = parts
        path, tip_poly = polyline_path(shaft), polygon(tip)
        w = HEAD_HALF_WIDTH * head
        rect = path.boundingRect().united(tip_poly.boundingRect()).adjusted(-w, -w, w, w)
        self._reshape(path, tip_poly, rect)


def polygon_path(
    points: list[tuple[float, float]] | tuple[tuple[float, float], ...],
) -> QPainterPath:
    path = QPainterPath()
    path.addPolygon(QPolygonF([QPointF(x, y) for x, y in points]))
    path.closeSubpath()
    return path


def tug_polygon(length: float = TUG_LENGTH_M, beam: float = TUG_BEAM_M) -> QPolygonF:
    """A tug's plan shape (:func:`app.paint.shapes.tug_outline`), bow at +x, towing point at 0."""
    return polygon(tug_outline(length, beam))


class PathItem(QGraphicsPathItem):
    """A path with a cosmetic pen that keeps its screen width on any device."""

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        painter.setPen(style.scaled_pen(self.pen(), style.device_scale(painter)))
        painter.setBrush(self.brush())
        painter.drawPath(self.path())


class LineItem(QGraphicsLineItem):
    """A line with a cosmetic pen that keeps its screen width on any device.

    The whole line is handed to the painter, whatever part of it is exposed: the painter
    clips it to what is repainted and keeps its dashes where the whole line has them.
    Clipped here first, a dashed line started its dashes at the clip's edge, a fraction
    of a pixel from where the whole line has them, so a repaint of part of the board left
    dashes a pixel apart from a full repaint's.
    """

    def __init__(self, parent: QGraphicsItem | None = None) -> None:
        super().__init__(parent)
        #: Where the dashes are counted from (parent frame), when the line is a piece of a
        #: longer one (:class:`PiecedLine`); None: from the line's own start.
        self.dash_from: QPointF | None = None
        self._rect = _line_box(self.line(), self.pen())

    @guarded
    def setLine(self, *line: object) -> None:  # type: ignore[override]
        """Qt's ``setLine`` (a QLineF, or x1, y1, x2, y2), keeping the box."""
        new = QLineF(*line)  # type: ignore[call-overload]
        if new == self.line():
            return
        self.prepareGeometryChange()  # while the box is still the old line's
        self._rect = _line_box(new, self.pen())
        super().setLine(new)

    @guarded
    def setPen(self, pen: QPen) -> None:  # type: ignore[override]
        if pen == self.pen():
            return
        self.prepareGeometryChange()
        self._rect = _line_box(self.line(), pen)
        super().setPen(pen)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        # Qt's own strokes the line into a path on every call, and it is called several
        # times a frame for every piece of the line of action that moves with a drag
        return self._rect

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        own = self.pen()
        painter.setPen(style.scaled_pen(own, style.device_scale(painter)))
        line = self.line()
        origin = line.p1() if self.dash_from is None else self.dash_from
        if own.style() != Qt.PenStyle.SolidLine and line.p1() != origin:
            # keep the dashes where they would be on the whole line: a cosmetic pen's
            # dashes are counted in device pixels along the line's major axis
            t = painter.worldTransform()
            d = t.map(line.p1()) - t.map(origin)
            pen = painter.pen()
            cosmetic = pen.isCosmetic()
            px = max(abs(d.x()), abs(d.y())) if cosmetic else math.hypot(d.x(), d.y())
            period = sum(pen.dashPattern()) or 1.0
            pen.setDashOffset((px / max(pen.widthF(), 1.0)) % period)
            painter.setPen(pen)
        painter.drawLine(line)


def _line_box(line: QLineF, pen: QPen) -> QRectF:
    """The box of ``line`` drawn with ``pen``, its width in the line's units as Qt's
    QGraphicsLineItem takes it. A square cap's corner reaches half a width along the line
    and half across, up to half a width times root 2 on an axis, more than a round cap's
    curve points (1.14 times)."""
    pad = pen.widthF() / 2 * math.sqrt(2.0)
    return QRectF(line.p1(), line.p2()).normalized().adjusted(-pad, -pad, pad, pad)


class PiecedLine:
    """A long straight line drawn as ``pieces`` LineItems end to end, dashes continuous.

    A line that runs across the board (the line of action) and moves on every step of a
    drag would, as one item, mark its whole bounding box for repainting, which for a
    slanting line is most of the board: every tug, label and mark under it drawn again.
    In pieces, only a band of small boxes along the old and the new line is repainted.
    It takes the calls the board makes on a LineItem (it is not an item itself).
    """

    def __init__(self, parent: QGraphicsItem, pieces: int = 24) -> None:
        self.pieces = [LineItem(parent) for _ in range(pieces)]
        self._line = QLineF()
        self._pen = self.pieces[0].pen()
        self._visible = True

    def setLine(self, line: QLineF) -> None:
        if line == self._line:
            return
        self._line = QLineF(line)
        n = len(self.pieces)
        p = line.p1()
        x0, y0, x1, y1 = line.x1(), line.y1(), line.x2(), line.y2()
        dx, dy = x1 - x0, y1 - y0  # the ends worked out as QPointF arithmetic would
        for k, item in enumerate(self.pieces):
            item.dash_from = p
            a, b = k / n, (k + 1) / n
            item.setLine(x0 + dx * a, y0 + dy * a, x0 + dx * b, y0 + dy * b)

    def line(self) -> QLineF:
        return QLineF(self._line)

    def setPen(self, pen: QPen) -> None:
        if pen == self._pen:
            return  # set on every refresh: 24 pieces compared in C++ for nothing
        self._pen = QPen(pen)
        for item in self.pieces:
            item.setPen(pen)

    def pen(self) -> QPen:
        return self.pieces[0].pen()

    def setVisible(self, on: bool) -> None:
        if on == self._visible:
            return
        self._visible = on
        for item in self.pieces:
            item.setVisible(on)

    def isVisible(self) -> bool:
        return self.pieces[0].isVisible()

    def setZValue(self, z: float) -> None:
        for item in self.pieces:
            item.setZValue(z)

    def setData(self, key: int, value: object) -> None:
        for item in self.pieces:
            item.setData(key, value)


class PolygonItem(QGraphicsPolygonItem):
    """A polygon with a cosmetic pen that keeps its screen width on any device."""

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        painter.setPen(style.scaled_pen(self.pen(), style.device_scale(painter)))
        painter.setBrush(self.brush())
        painter.drawPolygon(self.polygon())
