"""Drawing on the board by clicks: a hull's outline and the site's features.

A :class:`Draft` holds the site points clicked so far (x east, y north, m; on the
grid when snapping is on), draws them with a rubber band to the cursor, and writes
the length of each side beside it in the display length unit, so a shape can be
drawn to size. What the clicks make depends on the tool:

- ``draw`` (a hull's outline) and ``limit`` (a basin limit): click the points; click
  the first one again to close the shape (an open limit line ends with Enter or a
  double-click);
- ``quay``: click the points of the quay face; Enter or a double-click ends it;
- ``dolphin``: click its centre, then a point on its edge (the diameter is shown);
- ``vessel``: click its stern and its bow on the centreline, then a point on its side
  (length, then beam, are shown).
"""

from __future__ import annotations

import itertools
import math

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QPainterPath
from PySide6.QtWidgets import QGraphicsPathItem

from app.board.items import GUIDE, Label
from app.paint import style
from core.frames import site_angle_to_true
from core.mechanics.site import dolphin, moored_vessel
from core.model.plan import SiteFeature
from core.units import DisplayUnits

Point = tuple[float, float]

#: Tools that draw, and the kind of shape each makes.
DRAW_TOOLS = ("draw", "quay", "limit", "dolphin", "vessel")
#: How many clicks finish a shape of fixed clicks (the others end on Enter or closing).
FIXED_CLICKS = {"dolphin": 2, "vessel": 3}
#: The forward part of a drawn moored vessel that tapers to its stem, as a share of length.
BOW_SHARE = 0.12
CLOSE_PX = 10.0  # how near the first point a click closes the shape, px
Z_DRAFT = 50.0


def _dist(a: Point, b: Point) -> float:
    return math.hypot(b[0] - a[0], b[1] - a[1])


class Draft:
    """The shape being drawn with one drawing tool (see the module docstring)."""

    def __init__(self, scene, tool: str) -> None:  # type: ignore[no-untyped-def]
        if tool not in DRAW_TOOLS:
            raise ValueError(f"{tool!r} is not a drawing tool")
        self.scene = scene
        self.tool = tool
        self.points: list[Point] = []
        self.cursor: Point | None = None
        self.closed = False
        self._path = QGraphicsPathItem()
        self._path.setPen(style.pen(style.HULL_SELECTED, 2.0, Qt.PenStyle.DashLine))
        self._path.setZValue(Z_DRAFT)
        self._path.setData(GUIDE, True)
        scene.addItem(self._path)
        self.labels: list[Label] = []

    @property
    def units(self) -> DisplayUnits:
        return self.scene.controller.project.units  # type: ignore[no-any-return]

    # -- clicks -----------------------------------------------------------------------------
    def click(self, pos: Point, ppm: float) -> bool:
        """Add a clicked point (snapped); True when the shape is complete or closed."""
        p = self.scene.snap(pos)
        near_first = bool(self.points) and (
            _dist(self.points[0], pos) * ppm <= CLOSE_PX or p == self.points[0]
        )
        if self.tool in ("draw", "limit") and len(self.points) >= 3 and near_first:
            self.closed = True
            self.cursor = None
            self._redraw()
            return True
        if self.points and _dist(self.points[-1], p) * ppm < 2.0:
            return False  # the second click of a double-click lands on the same spot
        self.points.append(p)
        self.cursor = p
        self._redraw()
        return len(self.points) == FIXED_CLICKS.get(self.tool, -1)

    def hover(self, pos: Point) -> None:
        self.cursor = self.scene.snap(pos)
        self._redraw()

    def back(self) -> None:
        """Take the last point back."""
        if self.points:
            self.points.pop()
            self._redraw()

    def clear(self) -> None:
        for item in (self._path, *self.labels):
            if item.scene() is not None:
                item.scene().removeItem(item)
        self.labels = []
        self.points = []

    # -- the shape ----------------------------------------------------------------------------
    def shape(self) -> tuple[list[Point], bool]:
        """The points of the shape as it stands (with the cursor), and whether it is closed."""
        pts = list(self.points)
        c = self.cursor
        if self.tool == "dolphin":
            if len(pts) == 1 and c is not None:
                pts.append(c)
            if len(pts) < 2 or _dist(pts[0], pts[1]) <= 0:
                return pts, False
            return list(dolphin("draft", pts[0], 2 * _dist(pts[0], pts[1])).points), True
        if self.tool == "vessel":
            if len(pts) < 3 and c is not None and (not pts or c != pts[-1]):
                pts.append(c)
            if len(pts) < 3:
                return pts, False
            try:
                return list(self._vessel("draft", pts).points), True
            except ValueError:
                return pts[:2], False
        if c is not None and not self.closed:
            pts.append(c)
        return pts, self.closed or self.tool == "draw"

    def _vessel(self, name: str, pts: list[Point]) -> SiteFeature:
        stern, bow, side = pts[0], pts[1], pts[2]
        length = _dist(stern, bow)
        ux, uy = (bow[0] - stern[0]) / length, (bow[1] - stern[1]) / length
        half = abs((side[0] - stern[0]) * -uy + (side[1] - stern[1]) * ux)
        heading = site_angle_to_true(math.atan2(uy, ux))
        centre = ((stern[0] + bow[0]) / 2, (stern[1] + bow[1]) / 2)
        return moored_vessel(name, centre, heading, length, 2 * half, BOW_SHARE * length)

    def feature(self, name: str) -> SiteFeature:
        """The site feature the clicks make (raises the core's InputError when they cannot)."""
        pts = list(self.points)
        if self.tool == "dolphin":
            return dolphin(name, pts[0], 2 * _dist(pts[0], pts[1]))
        if self.tool == "vessel":
            return self._vessel(name, pts)
        kind = "quay" if self.tool == "quay" else "limit"
        return SiteFeature(name, kind, tuple(pts), closed=self.closed)  # type: ignore[arg-type]

    # -- drawing -------------------------------------------------------------------------------
    def _redraw(self) -> None:
        pts, closed = self.shape()
        path = QPainterPath()
        if pts:
            path.moveTo(*pts[0])
            for p in pts[1:]:
                path.lineTo(*p)
            if closed and self.tool != "draw":
                path.closeSubpath()
        ppm = self.scene.pixels_per_metre()
        r = 4.0 / ppm
        for p in self.points:
            path.addEllipse(QPointF(*p), r, r)
        self._path.setPath(path)
        self._write_lengths()

    def measures(self) -> list[tuple[Point, str]]:
        """Where each length goes (site m) and its text, in the display length unit."""
        u = self.units
        pts = list(self.points)
        c = self.cursor
        out: list[tuple[Point, str]] = []
        if self.tool == "dolphin":
            if pts and c is not None and len(pts) == 1:
                out.append((c, f"⌀ {u.show(2 * _dist(pts[0], c), 'length')}"))
            return out
        if self.tool == "vessel":
            if len(pts) == 1 and c is not None:
                out.append((_mid(pts[0], c), f"length {u.show(_dist(pts[0], c), 'length')}"))
            elif len(pts) >= 2:
                out.append(
                    (_mid(pts[0], pts[1]), f"length {u.show(_dist(pts[0], pts[1]), 'length')}")
                )
                if c is not None and len(pts) == 2:
                    stern, bow = pts[0], pts[1]
                    length = _dist(stern, bow)
                    ux, uy = (bow[0] - stern[0]) / length, (bow[1] - stern[1]) / length
                    half = abs((c[0] - stern[0]) * -uy + (c[1] - stern[1]) * ux)
                    out.append((c, f"beam {u.show(2 * half, 'length')}"))
            return out
        seq = pts + ([c] if c is not None and not self.closed else [])
        for a, b in itertools.pairwise(seq):
            if _dist(a, b) > 0:
                out.append((_mid(a, b), u.show(_dist(a, b), "length")))
        return out

    def _write_lengths(self) -> None:
        marks = self.measures()
        while len(self.labels) > len(marks):
            lab = self.labels.pop()
            if lab.scene() is not None:
                lab.scene().removeItem(lab)
        while len(self.labels) < len(marks):
            lab = Label("", None, style.HULL_SELECTED, style.label_font(8.5, True), (0, -12))
            lab.setData(GUIDE, True)
            lab.setZValue(Z_DRAFT + 1)
            lab.priority = 0
            self.scene.addItem(lab)
            self.labels.append(lab)
        for lab, (p, text) in zip(self.labels, marks, strict=True):
            lab.setPos(*p)
            lab.set_text(text)


def _mid(a: Point, b: Point) -> Point:
    return ((a[0] + b[0]) / 2, (a[1] + b[1]) / 2)
