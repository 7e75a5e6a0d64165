"""The site on the board: quays, dolphins, moored vessels and basin limits, and the
clearances of the stage shown, drawn where they occur.

``SiteLayer(scene)`` adds itself to the scene's refresh hooks. Features are drawn in
the site frame (x east, y north, m) under the bodies; the clearances are the core's
(core.mechanics.clearance) for the bodies as the board places them, and are worked out again
only when the poses, the hulls or the site change (not while a tug is dragged).
"""

from __future__ import annotations

import shapely
from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QPainterPath, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QGraphicsLineItem, QGraphicsPathItem

from app.board.items import GUIDE, ROLE, Handle, Label
from app.board.scene import BoardScene
from app.edits.site import nearest_segment
from app.guard import guarded
from app.paint import style
from core.mechanics.bodies import body_of
from core.mechanics.clearance import Clearance, notable_clearances, stage_clearances
from core.mechanics.site import place_body
from core.model.plan import SiteFeature

Z_SITE = -5.0
Z_CLEARANCE = 1.0  # above the hulls' fill, under the tugs
Z_HANDLES = 30.0
HIT_PX = 6.0  # how near a line a click picks its feature, px

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
        self.handles: list[Handle] = []
        self._handles_key: object = None
        scene.site_layer = self  # type: ignore[attr-defined]
        scene.refresh_hooks.append(self.refresh)
        scene.selection_changed.connect(self._sync_selection)
        self.refresh(scene)

    # -- which feature is where -----------------------------------------------------------
    def feature_at(self, pos: QPointF, ppm: float, reach_px: float = HIT_PX) -> str | None:
        """The feature under site point ``pos``: near a line or an edge, or inside a dolphin
        or a vessel (never just inside a basin limit, which holds the whole board)."""
        p = (pos.x(), pos.y())
        best: tuple[float, str] | None = None
        for f in self.scene.controller.project.site.features:
            if (
                f.closed
                and f.kind != "limit"
                and shapely.contains_xy(shapely.Polygon(f.points), *p)
            ):
                return f.name
            d = nearest_segment(f, p)[2] * ppm
            if d <= reach_px and (best is None or d < best[0]):
                best = (d, f.name)
        return best[1] if best is not None else None

    def _selected_feature(self) -> tuple[str, int | None] | None:
        sel = self.scene.selection
        if sel and sel[0] == "site":
            return str(sel[1]), None
        if sel and sel[0] == "site_point":
            return str(sel[1]), int(sel[2])  # type: ignore[call-overload]
        return None

    @guarded
    def _sync_selection(self) -> None:
        """The selected feature drawn bold, with a handle on each of its points."""
        chosen = self._selected_feature()
        site = self.scene.controller.project.site
        key = (chosen, site)
        if key == self._handles_key:
            return
        self._handles_key = key
        name = chosen[0] if chosen else None
        f = next((x for x in site.features if x.name == name), None)
        pts = list(f.points) if f is not None else []
        while len(self.handles) > len(pts):
            h = self.handles.pop()
            if h.scene() is not None:
                h.scene().removeItem(h)
        while len(self.handles) < len(pts):
            h = Handle()
            h.setZValue(Z_HANDLES)
            self.scene.addItem(h)
            self.handles.append(h)
        for i, (h, (x, y)) in enumerate(zip(self.handles, pts, strict=True)):
            h.setPos(x, y)
            h.setData(ROLE, ("site_point", name, i))
            h.set_selected(chosen is not None and chosen[1] == i)
        for g, item, _lab in self.features:
            item.setPen(self._pen(g, g.name == name))

    @staticmethod
    def _pen(f: SiteFeature, selected: bool):  # type: ignore[no-untyped-def]
        if selected:
            return style.pen(style.HULL_SELECTED, 4.0 if f.kind == "quay" else 2.4)
        if f.kind == "quay":
            return style.pen(QUAY, 4.0)
        if f.kind == "limit":
            return style.pen(LIMIT, 1.3, Qt.PenStyle.DashLine)
        return style.pen(QUAY, 1.0)

    # -- features ------------------------------------------------------------------------
    def _draw_features(self) -> None:
        for _, item, lab in self.features:
            self.scene.removeItem(item)
            self.scene.removeItem(lab)
        self.features = []
        for f in self.scene.controller.project.site.features:
            item = QGraphicsPathItem(feature_path(f))
            item.setZValue(Z_SITE)
            item.setData(ROLE, ("site", f.name))
            # clicks find a feature by feature_at (its stroke is thin, a limit's area vast)
            item.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
            item.setPen(self._pen(f, False))
            if f.kind in ("quay", "limit"):
                item.setData(GUIDE, True)
            else:
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
            line.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
            self.scene.addItem(line)
            text = f"{units.show(c.distance_m, 'length')} to {c.other}"
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
            self._handles_key = None
        self._sync_selection()
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
