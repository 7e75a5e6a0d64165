"""A small picture of what an import will bring in: outlines and lines, y up, to scale.

The import dialogs hand it shapes in one frame (the hull frame, x forward and port
up; or the site frame, north up) with marks and words; it fits them in its box and
draws them. It computes nothing about them.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field

from PySide6.QtCore import QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QColor, QPainter, QPaintEvent, QPen, QPolygonF
from PySide6.QtWidgets import QSizePolicy, QWidget

from app.guard import guarded
from app.paint import style

Pt = tuple[float, float]


@dataclass(frozen=True, slots=True)
class Shape:
    """An outline (closed) or a line (open) to draw, in the preview's frame."""

    points: tuple[Pt, ...]
    closed: bool
    edge: QColor
    fill: QColor | None = None
    width: float = 1.5
    dashed: bool = False


@dataclass(frozen=True, slots=True)
class Mark:
    """A point to mark: ``cross`` (a reference point) or ``ring`` (a centroid), with words."""

    at: Pt
    kind: str
    text: str = ""
    color: QColor = field(default_factory=lambda: QColor(style.TEXT))


@dataclass(frozen=True, slots=True)
class Tag:
    """Words placed at a point of the frame: centred there (BOW, PORT...), or ``beside`` it
    (above and to the right, for a feature's name)."""

    at: Pt
    text: str
    color: QColor = field(default_factory=lambda: QColor(style.TEXT))
    beside: bool = False


class PreviewPane(QWidget):
    """Draws shapes, marks and tags fitted into the widget, y up, one scale both ways."""

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.shapes: tuple[Shape, ...] = ()
        self.marks: tuple[Mark, ...] = ()
        self.tags: tuple[Tag, ...] = ()
        self.message = ""
        self.corner = ""  # words in the top-left corner (a north arrow's "N ↑", an axis key)
        self.setMinimumSize(320, 200)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)

    @guarded(default=QSize)
    def sizeHint(self) -> QSize:
        return QSize(460, 260)

    def show_shapes(
        self,
        shapes: Sequence[Shape],
        marks: Sequence[Mark] = (),
        tags: Sequence[Tag] = (),
        corner: str = "",
    ) -> None:
        self.shapes, self.marks, self.tags = tuple(shapes), tuple(marks), tuple(tags)
        self.corner, self.message = corner, ""
        self.update()

    def show_message(self, text: str) -> None:
        """Nothing to draw: say why instead."""
        self.shapes, self.marks, self.tags, self.corner = (), (), (), ""
        self.message = text
        self.update()

    def _bounds(self) -> tuple[float, float, float, float] | None:
        xs = [x for s in self.shapes for x, _ in s.points] + [m.at[0] for m in self.marks]
        ys = [y for s in self.shapes for _, y in s.points] + [m.at[1] for m in self.marks]
        if not xs:
            return None
        return min(xs), min(ys), max(xs), max(ys)

    @guarded
    def paintEvent(self, event: QPaintEvent) -> None:  # a Qt override: never let an error out
        p = QPainter(self)
        try:
            self._paint(p)
        except Exception as e:  # a broken picture must not end the program
            p.setPen(style.INVALID)
            p.drawText(self.rect(), int(Qt.AlignmentFlag.AlignCenter), f"(no preview: {e})")
        finally:
            p.end()

    def _paint(self, p: QPainter) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        p.fillRect(self.rect(), style.WATER)
        p.setPen(QPen(style.GRID_MAJOR, 1.0))
        p.drawRect(QRectF(self.rect()).adjusted(0.5, 0.5, -0.5, -0.5))
        box = self._bounds()
        if box is None:
            p.setPen(style.TEXT)
            p.drawText(
                QRectF(self.rect()).adjusted(12, 12, -12, -12),
                int(Qt.AlignmentFlag.AlignCenter | Qt.TextFlag.TextWordWrap),
                self.message or "Nothing to show yet.",
            )
            return
        x0, y0, x1, y1 = box
        pad = 28.0
        w, h = self.width() - 2 * pad, self.height() - 2 * pad
        span_x, span_y = max(x1 - x0, 1e-9), max(y1 - y0, 1e-9)
        s = min(w / span_x, h / span_y)
        if not math.isfinite(s) or s <= 0:
            return
        cx, cy = (x0 + x1) / 2, (y0 + y1) / 2

        def at(pt: Pt) -> QPointF:
            return QPointF(
                self.width() / 2 + (pt[0] - cx) * s, self.height() / 2 - (pt[1] - cy) * s
            )

        for sh in self.shapes:
            pen = QPen(sh.edge, sh.width)
            if sh.dashed:
                pen.setStyle(Qt.PenStyle.DashLine)
            p.setPen(pen)
            poly = QPolygonF([at(q) for q in sh.points])
            if sh.closed:
                p.setBrush(sh.fill if sh.fill is not None else Qt.BrushStyle.NoBrush)
                p.drawPolygon(poly)
            else:
                p.setBrush(Qt.BrushStyle.NoBrush)
                p.drawPolyline(poly)
        p.setBrush(Qt.BrushStyle.NoBrush)
        fm = p.fontMetrics()
        for m in self.marks:
            c = at(m.at)
            p.setPen(QPen(m.color, 1.5))
            if m.kind == "cross":
                p.drawLine(QPointF(c.x() - 7, c.y()), QPointF(c.x() + 7, c.y()))
                p.drawLine(QPointF(c.x(), c.y() - 7), QPointF(c.x(), c.y() + 7))
            else:
                p.drawEllipse(c, 5.0, 5.0)
                p.drawPoint(c)
            if m.text:
                p.drawText(QPointF(c.x() + 8, c.y() - 6), m.text)
        taken: list[QRectF] = []
        for t in self.tags:
            c = at(t.at)
            w, h = fm.horizontalAdvance(t.text) + 6, fm.height()
            r = QRectF(c.x() - w / 2, c.y() - h / 2, w, h)
            if t.beside:
                r.moveLeft(c.x() + 6)
                r.moveBottom(c.y() - 2)
                if any(r.intersects(o) for o in taken):
                    continue  # a name is left out rather than written over another
            taken.append(r)
            p.fillRect(r, style.LABEL_BG)
            p.setPen(t.color)
            p.drawText(r, int(Qt.AlignmentFlag.AlignCenter), t.text)
        if self.corner:
            p.setPen(style.TEXT)
            p.drawText(QPointF(8, 4 + fm.ascent()), self.corner)
