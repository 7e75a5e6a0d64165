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

    def cost(self, boxes: np.ndarray, on_hull: bool | np.ndarray = False) -> np.ndarray:
        """(k,) cost of each of (k, 4) boxes x0, y0, x1, y1 (px); ``on_hull`` (one for
        all, or (k,) one per box): the box's label belongs on its hull, whose area it
        may cover for nothing."""
        if self.base is None or self.hull is None:
            raise RuntimeError("CostMap.finish() first")
        x0, y0, x1, y1 = _cells(boxes, self.w, self.h)
        total = _box_sums(self.base, x0, y0, x1, y1)
        if np.all(on_hull):
            return total
        return np.where(on_hull, total, total + _box_sums(self.hull, x0, y0, x1, y1))


def _summed(grid: np.ndarray) -> np.ndarray:
    """Summed-area table with a zero first row and column: (h+1, w+1)."""
    out = np.zeros((grid.shape[0] + 1, grid.shape[1] + 1))
    out[1:, 1:] = grid.cumsum(0).cumsum(1)
    return out


def _cells(boxes: np.ndarray, w: int, h: int) -> np.ndarray:
    """(4, k) cell indices x0, y0, x1, y1 of (k, 4) pixel boxes: the cells they touch,
    within the raster."""
    cells = boxes.T / CELL
    cells[:2] = np.floor(cells[:2])
    cells[2:] = np.ceil(cells[2:])
    return np.clip(cells, 0, np.array([[w], [h], [w], [h]])).astype(int)


def _box_sums(
    sat: np.ndarray, x0: np.ndarray, y0: np.ndarray, x1: np.ndarray, y1: np.ndarray
) -> np.ndarray:
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


#: The shifts tried first: the home box, then 6, 12 and 20 px right, left, down, up.
_NEAR = np.array(
    [(0.0, 0.0)]
    + [s for d in (6.0, 12.0, 20.0) for s in ((d, 0.0), (-d, 0.0), (0.0, d), (0.0, -d))]
)
#: Then boxes round the anchor: 16 directions, each at these gaps (px) beyond the box.
_GAPS = np.array([4.0, 14.0, 28.0, 48.0, 75.0, 110.0, 160.0])[:, None]
_UX = np.array([math.cos(2 * math.pi * k / 16) for k in range(16)])
_UY = np.array([math.sin(2 * math.pi * k / 16) for k in range(16)])
_AUX, _AUY = np.abs(_UX), np.abs(_UY)
#: Where a leader is sampled along its length (0: the anchor, 1: the box).
_LEADER_T = np.linspace(0.0, 1.0, 12)


def _candidates(homes: np.ndarray, anchors: np.ndarray) -> np.ndarray:
    """(n, k, 2) shifts (px) to try for each of n labels: ``homes`` (n, 4) their home
    boxes' centres and half sizes cx, cy, half width, half height (device px), ``anchors``
    (n, 2) their anchors."""
    cx, cy, hw, hh = (homes[:, i, None, None] for i in range(4))
    reach = (hw * _AUX + hh * _AUY) + _GAPS  # (n, 7, 16)
    dx = anchors[:, 0, None, None] + _UX * reach - cx
    dy = anchors[:, 1, None, None] + _UY * reach - cy
    far = np.stack([dx, dy], axis=-1).reshape(len(homes), -1, 2)
    near = np.broadcast_to(_NEAR, (len(homes), *_NEAR.shape))
    return np.concatenate([near, far], axis=1)


def _near(boxes: np.ndarray, others: np.ndarray) -> np.ndarray:
    """(m,) True for each of (m, 4) ``boxes`` that reaches inside the box round all of
    (k, 4) ``others`` (one that does not overlaps none of them)."""
    x0, y0 = others[:, 0].min(initial=np.inf), others[:, 1].min(initial=np.inf)
    x1, y1 = others[:, 2].max(initial=-np.inf), others[:, 3].max(initial=-np.inf)
    return (boxes[:, 0] < x1) & (boxes[:, 2] > x0) & (boxes[:, 1] < y1) & (boxes[:, 3] > y0)


def _overlap(boxes: np.ndarray, others: np.ndarray) -> np.ndarray:
    """(k,) total overlap area of each of (k, 4) boxes with (m, 4) boxes."""
    others = others[_near(others, boxes)]  # the others add nothing
    if len(others) == 0:
        return np.zeros(len(boxes))
    w = np.minimum(boxes[:, None, 2], others[None, :, 2]) - np.maximum(
        boxes[:, None, 0], others[None, :, 0]
    )
    h = np.minimum(boxes[:, None, 3], others[None, :, 3]) - np.maximum(
        boxes[:, None, 1], others[None, :, 1]
    )
    return (np.clip(w, 0, None) * np.clip(h, 0, None)).sum(1)


def _leaders_cross(boxes: np.ndarray, anchors: np.ndarray, reserved: np.ndarray) -> np.ndarray:
    """(k,) True where the leader from each of (k, 2) ``anchors`` to the nearest point of
    its box, one of (k, 4) ``boxes``, runs through any of (m, 4) ``reserved`` boxes
    (sampled along its length)."""
    out = np.zeros(len(boxes), dtype=bool)
    if len(reserved) == 0:
        return out
    ax, ay = anchors[:, 0], anchors[:, 1]
    ex = np.clip(ax, boxes[:, 0], boxes[:, 2])  # where Label._aim_leader ends the line
    ey = np.clip(ay, boxes[:, 1], boxes[:, 3])
    # only a leader whose own box (a hair larger) meets a reserved box can have a sample in it
    pad = 1e-6
    x0, x1 = np.minimum(ax, ex) - pad, np.maximum(ax, ex) + pad
    y0, y1 = np.minimum(ay, ey) - pad, np.maximum(ay, ey) + pad
    meets = (
        (reserved[None, :, 0] < x1[:, None])
        & (reserved[None, :, 2] > x0[:, None])
        & (reserved[None, :, 1] < y1[:, None])
        & (reserved[None, :, 3] > y0[:, None])
    ).any(axis=1)
    rows = np.flatnonzero(meets)
    if rows.size == 0:
        return out
    ax, ay, ex, ey = ax[rows, None], ay[rows, None], ex[rows, None], ey[rows, None]
    px = ax + (ex - ax) * _LEADER_T[None, :]  # (r, s)
    py = ay + (ey - ay) * _LEADER_T[None, :]
    inside = (
        (px[:, :, None] > reserved[None, None, :, 0])
        & (px[:, :, None] < reserved[None, None, :, 2])
        & (py[:, :, None] > reserved[None, None, :, 1])
        & (py[:, :, None] < reserved[None, None, :, 3])
    )
    out[rows] = inside.any(axis=(1, 2))
    return out


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

    What a box costs apart from the labels placed before it (what it covers, how far it
    moved, its leader) is worked out for every label's boxes at once; only the overlap
    with the labels placed before is worked out label by label.
    """
    items = scene.items()
    reserved = list(reserved)
    costs = cost_map(items, vt, size, reserved)
    grown = [r.adjusted(-3, -3, 3, 3) for r in reserved]  # a leader's pen and its padding
    overlays = np.array([(r.left(), r.top(), r.right(), r.bottom()) for r in grown])
    overlays = overlays.reshape(-1, 4)
    view_box = QRectF(0, 0, size.width(), size.height())
    labels = [i for i in items if isinstance(i, Label) and _shown(i) and i.text]
    order = sorted(labels, key=lambda lab: (not lab.fixed, lab.priority, -lab.home_rect().width()))
    placed: list[Label] = []
    homes, anchors = [], []  # of the labels placed: edges, centre, half sizes; anchor (px)
    for lab in order:
        dt = lab.deviceTransform(vt)
        anchor = dt.map(QPointF(0, 0))
        home = dt.mapRect(lab.home_rect())
        if not view_box.intersects(home.adjusted(-200, -200, 200, 200)):
            lab.set_shift(0.0, 0.0)  # far off the view: nothing to place it against
            continue
        c, half_w, half_h = home.center(), home.width() / 2, home.height() / 2
        homes.append(
            (home.left(), home.top(), home.right(), home.bottom(), c.x(), c.y(), half_w, half_h)
        )
        anchors.append((anchor.x(), anchor.y()))
        placed.append(lab)
    if not placed:
        return placed
    home_a, anchor_a = np.array(homes), np.array(anchors)  # (n, 8), (n, 2)
    shifts = _candidates(home_a[:, 4:], anchor_a)  # (n, k, 2)
    fixed = np.array([lab.fixed for lab in placed])
    shifts[fixed] = 0.0  # a fixed label stays home (its every box is the home box)
    n, k = shifts.shape[:2]
    cand = np.concatenate([home_a[:, None, 0:2] + shifts, home_a[:, None, 2:4] + shifts], axis=2)
    flat = cand.reshape(-1, 4)
    on_hull = np.repeat([lab.on_hull for lab in placed], k)
    covered = costs.cost(flat, on_hull).reshape(n, k)
    outside = W_OUTSIDE * _outside(flat, size.width(), size.height()).reshape(n, k)
    moved = np.hypot(shifts[..., 0], shifts[..., 1])
    leader = np.where(moved > 0, W_LEADER, 0.0)
    hidden_leader = _leaders_cross(flat, np.repeat(anchor_a, k, axis=0), overlays).reshape(n, k)
    hidden = np.where(hidden_leader & (moved > 0), W_LEADER_HIDDEN, 0)
    moved *= W_MOVE
    boxes = np.empty((n, 4))  # the boxes of the labels placed, in order
    for i, lab in enumerate(placed):
        cost = covered[i] + W_LABEL * _overlap(cand[i], boxes[:i])
        cost += outside[i]
        cost += moved[i]
        cost += leader[i]
        cost += hidden[i]
        best = int(np.argmin(cost))
        # pixels of the device are the label's own (it ignores the view's scale)
        lab.set_shift(float(shifts[i, best, 0]), float(shifts[i, best, 1]))
        boxes[i] = cand[i, best]
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
