"""Placing the board's labels so that none hides another label, a tug, an arrow or the hull.

Labels are fixed in pixels, so where they fit depends on the zoom: the placing is done
in the view's pixels after every change that is not a drag in progress, and again
after a zoom or a pan. It is greedy and cheap:

1. Everything that is not a label is drawn into a coarse cost raster (``CELL`` px a
   cell) by what it is: a tug's shape, a mark or an overlay (the card, the north
   arrow, the scale bar) costs most, an arrow much, a line a little, the hull's area
   a little more; a summed-area table then gives the cost of any box in four look-ups.
2. Labels are taken in order of ``Label.priority``. Each tries its home box (where
   its owner put it) and boxes round its anchor at growing distances; the cheapest
   wins, counting what it covers, any overlap with a label already placed, any part
   outside the view, and how far it moved. A label moved off its anchor gets a
   leader line to it.

A label that belongs on its hull (``Label.on_hull``: its name, BOW, STERN) does not
count the hull's area.
"""

from __future__ import annotations

import math
from collections.abc import Iterable

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QBrush, QColor, QImage, QPainter, QPainterPath, QPen, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsLineItem, QGraphicsPathItem, QGraphicsScene

from app.board.items import (
    GUIDE,
    ROLE,
    FittingMark,
    Handle,
    Label,
    Leader,
    LineItem,
    Mark,
    PathItem,
    TugItem,
    _ArrowItem,
)

CELL = 3.0  # px per raster cell
W_HARD = 1000.0  # per cell: a tug, a mark, an overlay
W_ARROW = 60.0  # per cell: a force arrow or the yaw arrow
W_HULL = 6.0  # per cell: a hull's area
W_LINE = 3.0  # per cell: towlines, the line of action, site lines, clearances
W_LABEL = 60.0  # per px^2 of overlap with a label already placed
W_OUTSIDE = 40.0  # per px^2 outside the view
W_MOVE = 0.8  # per px the box moved from home
W_LEADER = 20.0  # once, for a box moved off its anchor (it needs a leader line)
W_LEADER_HIDDEN = 400.0  # once, for a leader line that would run under an overlay
LAYERS = ("hard", "arrow", "hull", "line")


class CostMap:
    """The cost of covering any pixel box of the view, from what is drawn there."""

    def __init__(self, size: QSize) -> None:
        self.size = size
        self.w = max(1, math.ceil(size.width() / CELL))
        self.h = max(1, math.ceil(size.height() / CELL))
        self._images = {k: QImage(self.w, self.h, QImage.Format.Format_Grayscale8) for k in LAYERS}
        self._painters: dict[str, QPainter] = {}
        for key, img in self._images.items():
            img.fill(0)
            p = QPainter(img)
            p.setRenderHint(QPainter.RenderHint.Antialiasing, False)
            p.scale(1 / CELL, 1 / CELL)
            self._painters[key] = p
        self.base: np.ndarray | None = None  # summed-area table without the hull's area
        self.hull: np.ndarray | None = None  # summed-area table of the hull's area alone

    def painter(self, layer: str) -> QPainter:
        return self._painters[layer]

    def fill_rect(self, layer: str, rect: QRectF) -> None:
        """Fill ``rect`` (px) and a cell round it, so no box slips past it by a sliver."""
        p = self._painters[layer]
        p.fillRect(rect.adjusted(-CELL, -CELL, CELL, CELL), QColor(Qt.GlobalColor.white))

    def fill_path(self, layer: str, path: QPainterPath) -> None:
        p = self._painters[layer]
        p.fillPath(path, QBrush(QColor(Qt.GlobalColor.white)))

    def stroke(self, layer: str, path: QPainterPath, width_px: float) -> None:
        p = self._painters[layer]
        pen = QPen(QColor(Qt.GlobalColor.white), width_px)
        pen.setCapStyle(Qt.PenCapStyle.FlatCap)
        p.strokePath(path, pen)

    def finish(self) -> None:
        """Close the painters and build the summed-area tables."""
        grids = {}
        for key, p in self._painters.items():
            p.end()
            img = self._images[key]
            ptr = img.constBits()
            arr = np.frombuffer(ptr, dtype=np.uint8, count=img.bytesPerLine() * self.h)
            grids[key] = arr.reshape(self.h, img.bytesPerLine())[:, : self.w] > 0
        base = (grids["hard"] * W_HARD + grids["arrow"] * W_ARROW + grids["line"] * W_LINE).astype(
            np.float64
        )
        self.base = _summed(base)
        self.hull = _summed(grids["hull"].astype(np.float64) * W_HULL)

    def cost(self, boxes: np.ndarray, on_hull: bool = False) -> np.ndarray:
        """(k,) cost of each of (k, 4) boxes x0, y0, x1, y1 (px)."""
        if self.base is None or self.hull is None:
            raise RuntimeError("CostMap.finish() first")
        total = _box_sums(self.base, boxes, self.w, self.h)
        if not on_hull:
            total = total + _box_sums(self.hull, boxes, self.w, self.h)
        return total


def _summed(grid: np.ndarray) -> np.ndarray:
    """Summed-area table with a zero first row and column: (h+1, w+1)."""
    out = np.zeros((grid.shape[0] + 1, grid.shape[1] + 1))
    out[1:, 1:] = grid.cumsum(0).cumsum(1)
    return out


def _box_sums(sat: np.ndarray, boxes: np.ndarray, w: int, h: int) -> np.ndarray:
    x0 = np.clip(np.floor(boxes[:, 0] / CELL), 0, w).astype(int)
    y0 = np.clip(np.floor(boxes[:, 1] / CELL), 0, h).astype(int)
    x1 = np.clip(np.ceil(boxes[:, 2] / CELL), 0, w).astype(int)
    y1 = np.clip(np.ceil(boxes[:, 3] / CELL), 0, h).astype(int)
    return sat[y1, x1] - sat[y0, x1] - sat[y1, x0] + sat[y0, x0]


def device_rect(item: QGraphicsItem, vt: QTransform) -> QRectF:
    """``item``'s bounding rectangle in the view's pixels (``vt``: the viewport transform)."""
    return item.deviceTransform(vt).mapRect(item.boundingRect())


def _is_guide(item: QGraphicsItem) -> bool:
    return bool(item.data(GUIDE))


def _shown(item: QGraphicsItem) -> bool:
    return item.isVisible() and item.opacity() > 0


def cost_map(
    items: Iterable[QGraphicsItem], vt: QTransform, size: QSize, reserved: Iterable[QRectF]
) -> CostMap:
    """Draw every item that is not a label into a cost map of the view's pixels."""
    m = CostMap(size)
    for r in reserved:
        m.fill_rect("hard", r)
    for item in items:
        if isinstance(item, (Label, Leader)) or not _shown(item):
            continue
        if item.flags() & QGraphicsItem.GraphicsItemFlag.ItemHasNoContents:
            continue
        dt = item.deviceTransform(vt)
        if isinstance(item, TugItem):
            glyph = dt.map(item.glyph)
            m.fill_rect("hard", glyph.boundingRect())
            shaft, head = item.arrow_parts()
            if not head.isEmpty():
                m.stroke("arrow", dt.map(shaft), 5.0)
                path = QPainterPath()
                path.addPolygon(dt.map(head))
                m.fill_path("arrow", path)
            line = item.towline
            if line is not None:
                p = QPainterPath()
                p.moveTo(dt.map(line.p1()))
                p.lineTo(dt.map(line.p2()))
                m.stroke("line", p, 3.0)
        elif isinstance(item, _ArrowItem):
            shaft, head = item.parts()
            if not head.isEmpty():
                m.stroke("arrow", dt.map(shaft), 5.0)
                path = QPainterPath()
                path.addPolygon(dt.map(head))
                m.fill_path("arrow", path)
        elif isinstance(item, (Mark, FittingMark, Handle)) or (
            item.flags() & QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations
        ):
            m.fill_rect("hard", dt.mapRect(item.boundingRect()))
        elif isinstance(item, (LineItem, QGraphicsLineItem)):
            line = item.line()
            p = QPainterPath()
            p.moveTo(dt.map(line.p1()))
            p.lineTo(dt.map(line.p2()))
            m.stroke("line", p, max(3.0, item.pen().widthF() + 1.0))
        elif isinstance(item, (PathItem, QGraphicsPathItem)):
            path = dt.map(item.path())
            role = item.data(ROLE)
            filled = item.brush().style() != Qt.BrushStyle.NoBrush
            is_hull = bool(role) and role[0] == "hull"
            if is_hull or (filled and not _is_guide(item)):  # an area: a hull, a dolphin
                m.fill_path("hull", path)
                m.stroke("line", path, 3.0)
            else:
                m.stroke("line", path, 3.0)
        else:  # an item of another layer: its shape counts as a line
            m.fill_path("line", dt.map(item.shape()))
    m.finish()
    return m


def _candidates(home: QRectF, anchor: QPointF) -> np.ndarray:
    """(k, 2) shifts (px) to try for a label whose home box is ``home`` (device px)."""
    shifts = [(0.0, 0.0)]
    for d in (6.0, 12.0, 20.0):
        shifts += [(d, 0.0), (-d, 0.0), (0.0, d), (0.0, -d)]
    cx, cy = home.center().x(), home.center().y()
    hw, hh = home.width() / 2, home.height() / 2
    for extra in (4.0, 14.0, 28.0, 48.0, 75.0, 110.0, 160.0):
        for k in range(16):
            a = 2 * math.pi * k / 16
            ux, uy = math.cos(a), math.sin(a)
            reach = hw * abs(ux) + hh * abs(uy) + extra
            shifts.append((anchor.x() + ux * reach - cx, anchor.y() + uy * reach - cy))
    return np.array(shifts)


def _overlap(boxes: np.ndarray, others: np.ndarray) -> np.ndarray:
    """(k,) total overlap area of each of (k, 4) boxes with (m, 4) boxes."""
    if len(others) == 0:
        return np.zeros(len(boxes))
    w = np.minimum(boxes[:, None, 2], others[None, :, 2]) - np.maximum(
        boxes[:, None, 0], others[None, :, 0]
    )
    h = np.minimum(boxes[:, None, 3], others[None, :, 3]) - np.maximum(
        boxes[:, None, 1], others[None, :, 1]
    )
    return (np.clip(w, 0, None) * np.clip(h, 0, None)).sum(1)


def _leaders_cross(
    boxes: np.ndarray, anchor: QPointF, reserved: np.ndarray, samples: int = 12
) -> np.ndarray:
    """(k,) True where the leader from ``anchor`` to the nearest point of each of (k, 4)
    boxes runs through any of (m, 4) ``reserved`` boxes (sampled along its length)."""
    if len(reserved) == 0:
        return np.zeros(len(boxes), dtype=bool)
    ax, ay = anchor.x(), anchor.y()
    ex = np.clip(ax, boxes[:, 0], boxes[:, 2])  # where Label._aim_leader ends the line
    ey = np.clip(ay, boxes[:, 1], boxes[:, 3])
    t = np.linspace(0.0, 1.0, samples)
    px = ax + (ex[:, None] - ax) * t[None, :]  # (k, s)
    py = ay + (ey[:, None] - ay) * t[None, :]
    inside = (
        (px[:, :, None] > reserved[None, None, :, 0])
        & (px[:, :, None] < reserved[None, None, :, 2])
        & (py[:, :, None] > reserved[None, None, :, 1])
        & (py[:, :, None] < reserved[None, None, :, 3])
    )
    return np.asarray(inside.any(axis=(1, 2)))


def _outside(boxes: np.ndarray, width: float, height: float) -> np.ndarray:
    area = (boxes[:, 2] - boxes[:, 0]) * (boxes[:, 3] - boxes[:, 1])
    w = np.clip(np.minimum(boxes[:, 2], width) - np.maximum(boxes[:, 0], 0), 0, None)
    h = np.clip(np.minimum(boxes[:, 3], height) - np.maximum(boxes[:, 1], 0), 0, None)
    return area - w * h


def place_labels(
    scene: QGraphicsScene, vt: QTransform, size: QSize, reserved: Iterable[QRectF] = ()
) -> list[Label]:
    """Move every shown label of ``scene`` clear of the rest, for a view of ``size`` px.

    ``vt`` is the view's viewport transform (scene to pixels); ``reserved`` are pixel
    boxes drawn over the board (overlays) that no label may cover. Returns the labels
    placed, in the order they were placed.
    """
    items = scene.items()
    reserved = list(reserved)
    costs = cost_map(items, vt, size, reserved)
    grown = [r.adjusted(-3, -3, 3, 3) for r in reserved]  # a leader's pen and its padding
    overlays = np.array([(r.left(), r.top(), r.right(), r.bottom()) for r in grown])
    overlays = overlays.reshape(-1, 4)
    view_box = QRectF(0, 0, size.width(), size.height())
    labels = [i for i in items if isinstance(i, Label) and _shown(i) and i.text]
    placed: list[Label] = []
    boxes: list[tuple[float, float, float, float]] = []
    order = sorted(labels, key=lambda lab: (not lab.fixed, lab.priority, -lab.home_rect().width()))
    for lab in order:
        dt = lab.deviceTransform(vt)
        anchor = dt.map(QPointF(0, 0))
        home = dt.mapRect(lab.home_rect())
        if not view_box.intersects(home.adjusted(-200, -200, 200, 200)):
            lab.set_shift(0.0, 0.0)  # far off the view: nothing to place it against
            continue
        shifts = np.zeros((1, 2)) if lab.fixed else _candidates(home, anchor)
        cand = np.column_stack(
            [
                home.left() + shifts[:, 0],
                home.top() + shifts[:, 1],
                home.right() + shifts[:, 0],
                home.bottom() + shifts[:, 1],
            ]
        )
        cost = costs.cost(cand, lab.on_hull)
        cost += W_LABEL * _overlap(cand, np.array(boxes).reshape(-1, 4))
        cost += W_OUTSIDE * _outside(cand, size.width(), size.height())
        moved = np.hypot(shifts[:, 0], shifts[:, 1])
        cost += W_MOVE * moved
        cost += np.where(moved > 0, W_LEADER, 0.0)
        cost += np.where(_leaders_cross(cand, anchor, overlays) & (moved > 0), W_LEADER_HIDDEN, 0)
        best = int(np.argmin(cost))
        # pixels of the device are the label's own (it ignores the view's scale)
        lab.set_shift(float(shifts[best, 0]), float(shifts[best, 1]))
        boxes.append(tuple(cand[best]))  # type: ignore[arg-type]
        placed.append(lab)
    return placed


def free_corner(
    items: Iterable[QGraphicsItem], vt: QTransform, corners: list[QRectF]
) -> tuple[QRectF, float]:
    """The first of ``corners`` (pixel boxes) that covers no item, else the least covering.

    An item counts by its bounding rectangle in pixels; guides that run across the
    board (the line of action, quay faces, limits) do not count. Returns the box and
    the area of items it covers (0 when free).
    """
    rects = [
        device_rect(i, vt)
        for i in items
        if _shown(i)
        and not _is_guide(i)
        and not (i.flags() & QGraphicsItem.GraphicsItemFlag.ItemHasNoContents)
        and not i.boundingRect().isEmpty()
    ]
    arr = np.array([(r.left(), r.top(), r.right(), r.bottom()) for r in rects]).reshape(-1, 4)
    best, best_cost = corners[0], math.inf
    for c in corners:
        box = np.array([[c.left(), c.top(), c.right(), c.bottom()]])
        covered = float(_overlap(box, arr)[0])
        if covered == 0:
            return c, 0.0
        if covered < best_cost:
            best, best_cost = c, covered
    return best, best_cost


def leader_line(label: Label) -> QLineF | None:
    """The label's leader line in its own pixels, or None when it has none shown."""
    lead = label.leader
    if lead is None or not lead.isVisible():
        return None
    return QLineF(QPointF(0, 0), lead.end)
