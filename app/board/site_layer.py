"""The site on the board: quays, dolphins, moored vessels and basin limits, and the
clearances of the stage shown, drawn where they occur.

``SiteLayer(scene)`` adds itself to the scene's refresh hooks. Features are drawn in
the site frame (x east, y north, m) under the bodies; the clearances are the core's
(core.mechanics.clearance) for the bodies as the board places them, and are worked out again
only when the poses, the hulls or the site change (not while a tug is dragged).
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QPainterPath, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QGraphicsLineItem, QGraphicsPathItem

from app.board.items import GUIDE, Label
from app.board.scene import BoardScene
from app.paint import style
from core.mechanics.bodies import body_of
from core.mechanics.clearance import Clearance, notable_clearances, stage_clearances
from core.mechanics.site import place_body
from core.model.plan import SiteFeature

Z_SITE = -5.0
Z_CLEARANCE = 1.0  # above the hulls' fill, under the tugs

QUAY = style.QUAY
DOLPHIN_FILL = style.DOLPHIN_FILL
VESSEL_FILL = style.VESSEL_FILL
LIMIT = style.LIMIT
CLEAR_OK = style.CLEARANCE
CLEAR_LOW = style.CLEARANCE_LOW


def feature_path(f: SiteFeature) -> QPainterPath:
    path = QPainterPath()
    pts = [QPointF(x, y) for x, y in f.points]
    if f.closed:
        path.addPolygon(QPolygonF([*pts, pts[0]]))
        path.closeSubpath()
    else:
        path.moveTo(pts[0])
        for p in pts[1:]:
            path.lineTo(p)
    return path


def label_point(f: SiteFeature) -> tuple[float, float]:
    """Where the name of a feature goes (site m)."""
    pts = f.points
    if f.closed and f.kind != "limit":
        return (sum(x for x, _ in pts) / len(pts), sum(y for _, y in pts) / len(pts))
    if len(pts) == 2:
        (x0, y0), (x1, y1) = pts
        return (x0 + 0.2 * (x1 - x0), y0 + 0.2 * (y1 - y0))
    return pts[0]


class SiteLayer:
    """The site's features and the stage's clearances as items of a BoardScene."""

    def __init__(self, scene: BoardScene) -> None:
        self.scene = scene
        self.features: list[tuple[SiteFeature, QGraphicsPathItem, Label]] = []
        self.clearances: tuple[Clearance, ...] = ()
        self.clearance_items: list[QGraphicsItem] = []
        self.clearance_labels: list[Label] = []
        self._site_key: object = None
        self._clear_key: object = None
        scene.refresh_hooks.append(self.refresh)
        self.refresh(scene)

    # -- features ------------------------------------------------------------------------
    def _draw_features(self) -> None:
        for _, item, lab in self.features:
            self.scene.removeItem(item)
            self.scene.removeItem(lab)
        self.features = []
        for f in self.scene.controller.project.site.features:
            item = QGraphicsPathItem(feature_path(f))
            item.setZValue(Z_SITE)
            item.setData(0, ("site", f.name))
            if f.kind == "quay":
                item.setPen(style.pen(QUAY, 4.0))
                item.setData(GUIDE, True)
            elif f.kind == "limit":
                item.setPen(style.pen(LIMIT, 1.3, Qt.PenStyle.DashLine))
                item.setData(GUIDE, True)
            else:
                item.setPen(style.pen(QUAY, 1.0))
                item.setBrush(style.brush(VESSEL_FILL if f.kind == "vessel" else DOLPHIN_FILL))
            self.scene.addItem(item)
            lab = Label(f.name, None, style.MUTED, style.label_font(8.0), (0.0, -10.0), "centre")
            lab.setPos(*label_point(f))
            lab.setZValue(Z_SITE + 0.5)
            lab.priority = 8
            self.scene.addItem(lab)
            self.features.append((f, item, lab))

    # -- clearances ------------------------------------------------------------------------
    def compute(self) -> tuple[Clearance, ...]:
        """The core's clearances of the stage shown, for the bodies where the board draws them."""
        project = self.scene.controller.project
        stage = self.scene.stage()
        if stage is None or not project.hulls:
            return ()
        bodies = tuple(
            place_body(body_of(project, name), self.scene.pose(name))
            for name in project.body_names()
        )
        return stage_clearances(project, stage, bodies)

    def _draw_clearances(self) -> None:
        for item in self.clearance_items:
            self.scene.removeItem(item)
        self.clearance_items, self.clearance_labels = [], []
        units = self.scene.controller.project.units
        for c in notable_clearances(self.clearances):
            color = CLEAR_LOW if c.below_margin else CLEAR_OK
            line = QGraphicsLineItem(*c.at_body, *c.at_other)
            line.setPen(style.pen(color, 1.6 if c.below_margin else 1.1, Qt.PenStyle.DotLine))
            line.setZValue(Z_CLEARANCE)
            line.setData(0, ("clearance", c.body, c.other))
            self.scene.addItem(line)
            text = units.show(c.distance_m, "length")
            if c.below_margin:
                text += f" (margin {units.show(c.margin_m, 'length')})"
            lab = Label(
                text, None, color, style.label_font(8.5, c.below_margin), (0.0, 0.0), "centre"
            )
            lab.setPos((c.at_body[0] + c.at_other[0]) / 2, (c.at_body[1] + c.at_other[1]) / 2)
            lab.setZValue(Z_CLEARANCE + 0.5)
            lab.priority = 4
            self.scene.addItem(lab)
            self.clearance_items += [line, lab]
            self.clearance_labels.append(lab)

    def refresh(self, scene: BoardScene) -> None:
        project = scene.controller.project
        if project.site != self._site_key:
            self._site_key = project.site
            self._draw_features()
        stage = scene.stage()
        key = (
            project.site,
            None if stage is None else (stage.poses, stage.limits),
            project.hulls,
            project.groups,
            project.clearance_margin_m,
            project.units.length,
        )
        if key != self._clear_key:
            self._clear_key = key
            self.clearances = self.compute()
            self._draw_clearances()
