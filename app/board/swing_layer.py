"""A swing stage on the board: the body at its start and end headings, and the way round.

``SwingLayer(scene)`` adds itself to the scene's refresh hooks. When the stage shown has
a swing (core.model.swing.Swing), the body the stage works on is drawn faintly at the
swing's start heading and at its end heading, each turned about the body's centroid
where the stage's pose puts it, with a curved arrow from the one to the other on the
side the bow swings to, and the swing in words. The outlines are the core's placing of
the body (core.mechanics.site.place_body) at those headings.
"""

from __future__ import annotations

import math

import shapely
from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QPainterPath, QPolygonF

from app.board.items import GUIDE, Label, MomentArrow, PathItem
from app.board.scene import BoardScene
from app.edits.bodies import turned_body
from app.paint import style
from core.mechanics.bodies import body_of
from core.mechanics.site import body_pose, place_body
from core.model.plan import Project, Stage
from core.model.swing import Swing

Z_SWING = -1.0  # under the hulls, over the site


def ghost_polygons(
    project: Project, stage: Stage, body: str, swing: Swing
) -> list[shapely.Polygon]:
    """The body's outline in the site at the swing's start and end headings (m)."""
    b = body_of(project, body)
    out = []
    for heading in (swing.start_heading_deg, swing.end_heading_deg):
        at = turned_body(project, stage, body, heading)
        out.append(place_body(b, body_pose(project, at, body)).polygon)
    return out


def _path(poly: shapely.Geometry) -> QPainterPath:
    """A polygon, or the parts of a lashed group whose hulls do not touch, as one path."""
    path = QPainterPath()
    for part in shapely.get_parts(poly):
        for ring in (part.exterior, *part.interiors):
            path.addPolygon(QPolygonF([QPointF(x, y) for x, y in ring.coords]))
            path.closeSubpath()
    return path


class SwingLayer:
    """The swing of the stage shown, as items of a BoardScene."""

    def __init__(self, scene: BoardScene) -> None:
        self.scene = scene
        self.ghosts = [PathItem(), PathItem()]
        pens = (Qt.PenStyle.DashLine, Qt.PenStyle.DotLine)  # the start dashed, the end dotted
        for g, dash in zip(self.ghosts, pens, strict=True):
            g.setPen(style.pen(style.CENTRELINE, 1.4, dash))
            g.setZValue(Z_SWING)
            g.setData(GUIDE, True)
            g.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
            scene.addItem(g)
        self.arc = MomentArrow(style.CENTRELINE, 2.0)
        self.arc.setZValue(Z_SWING)
        self.arc.setData(GUIDE, True)
        scene.addItem(self.arc)
        self.ends = [
            Label("", None, style.MUTED, style.label_font(8.5, True), (0, 0), "centre")
            for _ in range(2)
        ]
        self.words = Label("", None, style.MUTED, style.label_font(8.5, True), (0, 0), "centre")
        for lab in (*self.ends, self.words):
            lab.priority = 4
            scene.addItem(lab)
        self._key: object = None
        scene.swing_layer = self  # type: ignore[attr-defined]
        scene.refresh_hooks.append(self.refresh)
        self.refresh(scene)

    def items(self) -> list:  # type: ignore[type-arg]
        return [*self.ghosts, self.arc, *self.ends, self.words]

    def refresh(self, scene: BoardScene) -> None:
        project = scene.controller.project
        stage = scene.stage()
        body = scene.main_body() if stage is not None else None
        swing = stage.swing if stage is not None else None
        key = (
            swing,
            body,
            None if body is None else scene.pose(body),
            project.hulls,
            project.groups,
        )
        if key == self._key:
            return
        self._key = key
        if swing is None or body is None or stage is None:
            for item in self.items():
                item.setVisible(False)
            return
        self._draw(project, stage, body, swing)

    def _draw(self, project: Project, stage: Stage, body: str, swing: Swing) -> None:
        polys = ghost_polygons(project, stage, body, swing)
        b = body_of(project, body)
        placed = place_body(b, body_pose(project, stage, body))
        cx, cy = placed.placing.point(b.centroid)
        for g, poly in zip(self.ghosts, polys, strict=True):
            g.setPath(_path(poly))
            g.setVisible(True)
        radius = 0.62 * max(b.length, b.beam)
        start = 90.0 - swing.start_heading_deg  # the bow's site angle, counter-clockwise
        sweep = -swing.sign * swing.turn_deg  # to port: counter-clockwise, a positive sweep
        head = max(2.0, min(0.05 * b.length, 12.0))
        self.arc.set_geometry((cx, cy), radius, start, sweep, head)
        self.arc.setVisible(True)
        words = ("start", "end")
        for lab, heading, what in zip(
            self.ends, (swing.start_heading_deg, swing.end_heading_deg), words, strict=True
        ):
            a = math.radians(90.0 - heading)
            reach = radius + 0.08 * b.length
            lab.setPos(cx + reach * math.cos(a), cy + reach * math.sin(a))
            lab.set_text(f"swing {what} {heading:05.1f}°")
            lab.setVisible(True)
        mid = math.radians(90.0 - swing.heading_at(0.5))
        self.words.setPos(cx + radius * math.cos(mid), cy + radius * math.sin(mid))
        self.words.set_text(f"swings bow to {swing.bow_to} {swing.turn_deg:.0f}°")
        self.words.set_outward(math.cos(mid), -math.sin(mid), 6.0)  # screen y points down
        self.words.setVisible(True)
