"""The site by mouse: select a feature, drag it or its points, insert and delete points.

Used by :class:`app.board.interaction.Interaction` with the select tool: a click near
a quay line, a limit or a dolphin's or vessel's edge (or inside a dolphin or vessel)
selects the feature and shows a handle on each of its points. Dragging a handle moves
that point, dragging the selected feature moves all of it (both snap to the grid when
snapping is on), a double-click on its line inserts a point, Delete removes the
selected point or the feature, and the arrow keys nudge it (1 m a step, a point 0.5 m;
Shift: ten times); the board's menu renames it and closes or opens its outline. Every
drag is one undo step; nudges of one feature in a row are one.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from PySide6.QtCore import QPointF

from app.edits import site as site_edits
from core.errors import TowboardError

if TYPE_CHECKING:
    from app.board.interaction import Interaction

Point = tuple[float, float]


@dataclass
class PointDrag:
    feature: str
    index: int


@dataclass
class FeatureDrag:
    feature: str
    grab: Point  # the site point grabbed, m
    points: tuple[Point, ...]  # the feature's points when grabbed
    press_px: QPointF
    moving: bool = False


class SiteTools:
    """Mouse and key edits of the site's features for one Interaction."""

    def __init__(self, interaction: Interaction) -> None:
        self.i = interaction

    @property
    def layer(self):  # type: ignore[no-untyped-def]
        return getattr(self.i.scene, "site_layer", None)

    def _apply(self, project, text: str, merge_key: object | None = None) -> None:  # type: ignore[no-untyped-def]
        self.i.controller.apply(project, text, merge_key)

    # -- mouse ----------------------------------------------------------------------------
    def press_point(self, hit: tuple[object, ...]) -> None:
        """A press on a point's handle: select it and start dragging it."""
        self.i.scene.select(hit)
        self.i.drag = PointDrag(str(hit[1]), int(hit[2]))  # type: ignore[call-overload]

    def press(self, pos: QPointF, screen: QPointF) -> bool:
        """A press on open water: pick a feature there (True) or nothing (False)."""
        layer = self.layer
        if layer is None:
            return False
        name = layer.feature_at(pos, self.i.scene.pixels_per_metre())
        if name is None:
            return False
        sel = self.i.scene.selection
        if sel is not None and sel[0] == "site" and sel[1] == name:
            f = site_edits.feature(self.i.controller.project, name)
            self.i.drag = FeatureDrag(name, (pos.x(), pos.y()), f.points, QPointF(screen))
        else:
            self.i.scene.select(("site", name))
        return True

    def move(self, drag: PointDrag | FeatureDrag, pos: QPointF, screen: QPointF) -> None:
        c = self.i.controller
        try:
            if isinstance(drag, PointDrag):
                p = self.i.scene.snap((pos.x(), pos.y()))
                c.preview(site_edits.moved_point(c.project, drag.feature, drag.index, p))
                return
            if not drag.moving:
                d = QPointF(screen) - drag.press_px
                if abs(d.x()) + abs(d.y()) < 3:
                    return  # a click that wobbles is still a click
                drag.moving = True
            first = drag.points[0]
            to = self.i.scene.snap(
                (first[0] + pos.x() - drag.grab[0], first[1] + pos.y() - drag.grab[1])
            )
            dx, dy = to[0] - first[0], to[1] - first[1]
            c.preview(self._shifted(drag.feature, drag.points, dx, dy))
        except TowboardError as e:
            self.i._say(f"Not moved there: {e}")

    def release(self, drag: PointDrag | FeatureDrag) -> None:
        if isinstance(drag, PointDrag):
            self.i.controller.commit_preview(f"Move point {drag.index + 1} of {drag.feature}")
        else:
            self.i.controller.commit_preview(f"Move {drag.feature}")

    def _shifted(self, name: str, points: tuple[Point, ...], dx: float, dy: float):  # type: ignore[no-untyped-def]
        c = self.i.controller
        f = site_edits.feature(c.project, name)
        moved = type(f)(f.name, f.kind, tuple((x + dx, y + dy) for x, y in points), f.closed)
        return site_edits.replaced(c.project, name, moved)

    def double_click(self, pos: QPointF) -> bool:
        """Insert a point where a selected feature's line was double-clicked."""
        layer = self.layer
        sel = self.i.scene.selection
        if layer is None or not sel or sel[0] not in ("site", "site_point"):
            return False
        name = str(sel[1])
        c = self.i.controller
        try:
            f = site_edits.feature(c.project, name)
            seg, foot, d = site_edits.nearest_segment(f, (pos.x(), pos.y()))
            if d * self.i.scene.pixels_per_metre() > 8.0:
                return False
            self._apply(
                site_edits.inserted_point(c.project, name, seg, foot), f"Insert point in {name}"
            )
        except TowboardError as e:
            self.i._say(f"No point inserted: {e}")
            return True
        self.i.scene.select(("site_point", name, seg + 1))
        return True

    # -- keys and menus -----------------------------------------------------------------------
    def nudge(self, sel: tuple[object, ...], dx: float, dy: float, big: bool) -> None:
        c = self.i.controller
        name = str(sel[1])
        f = site_edits.feature(c.project, name)
        if sel[0] == "site_point":
            step = 5.0 if big else 0.5
            i = int(sel[2])  # type: ignore[call-overload]
            x, y = f.points[i]
            new = site_edits.moved_point(c.project, name, i, (x + dx * step, y + dy * step))
            self._apply(new, f"Nudge point {i + 1} of {name}", ("nudge", "site_point", name, i))
        else:
            step = 10.0 if big else 1.0
            new = self._shifted(name, f.points, dx * step, dy * step)
            self._apply(new, f"Nudge {name}", ("nudge", "site", name))

    def delete(self, sel: tuple[object, ...]) -> None:
        c = self.i.controller
        name = str(sel[1])
        if sel[0] == "site_point":
            i = int(sel[2])  # type: ignore[call-overload]
            self._apply(
                site_edits.deleted_point(c.project, name, i), f"Delete point {i + 1} of {name}"
            )
            self.i.scene.select(("site", name))
        else:
            self._apply(site_edits.deleted(c.project, name), f"Delete {name}")
            self.i.scene.select(None)

    def set_closed(self, name: str, closed: bool) -> None:
        """Close or open the outline of feature ``name`` (one undo step)."""
        c = self.i.controller
        new = site_edits.closed_set(c.project, name, closed)
        if new is not c.project:
            self._apply(new, f"{'Close' if closed else 'Open'} the outline of {name}")
        self.i.scene.select(("site", name))

    def rename(self, name: str, new: str) -> None:
        c = self.i.controller
        self._apply(site_edits.renamed(c.project, name, new), f"Rename {name} to {new.strip()}")
        self.i.scene.select(("site", new.strip()))
