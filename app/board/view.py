"""The board's view: north up, zoom with the wheel round the cursor, pan, fit to hull.

When another stage is shown the view fits it again, unless the user zoomed or panned
since the last fit (then the view stays where the user put it). Fit to hull and fit to
site clear that.
"""

from __future__ import annotations

import math
from collections.abc import Callable

from PySide6.QtCore import QPointF, QRectF, QSizeF, Qt, QTimer
from PySide6.QtGui import QPainter, QPixmap, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsView, QWidget

from app.board.backdrop import Backdrop
from app.board.cache import fit_pixmap_cache
from app.board.items import GUIDE, Label, Leader
from app.board.overlay import draw_north_arrow, draw_scale_bar
from app.board.placement import device_rect, free_corner, place_labels
from app.board.scene import BoardScene
from app.guard import guarded

#: The overlays drawn on top, in viewport pixels from the corners they sit in.
SCALE_BAR = QSizeF(220, 48)  # bottom left
NORTH_ARROW = QSizeF(72, 86)  # top right
MARGIN = 10.0
#: How many times a fit may zoom out to leave a corner free for the card.
FIT_TRIES = 8
#: A tug drag draws the still items as two pictures (app.board.backdrop) when at least
#: this many of them would go into the pictures: below it, taking the pictures costs
#: more than the moves save.
BACKDROP_MIN_ITEMS = 400
#: A pan or a wheel's zoom places the labels once the view has stood still this long, ms
#: (in between they move with the board, as on a chart).
PLACE_AT_REST_MS = 150


class BoardView(QGraphicsView):
    """A view of a BoardScene with y flipped, so north is up and east to the right.

    The wheel zooms round the cursor, except over the selected tug, where it changes
    the tug's setting (5 % a notch). Drag empty water (or use the middle button) to pan.
    """

    def __init__(self, scene: BoardScene, parent: QWidget | None = None) -> None:
        super().__init__(scene, parent)
        self.board = scene
        self.setRenderHint(QPainter.RenderHint.Antialiasing)
        self.setRenderHint(QPainter.RenderHint.TextAntialiasing)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        self.setResizeAnchor(QGraphicsView.ViewportAnchor.AnchorViewCenter)
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.SmartViewportUpdate)
        # the water and grid are drawn once per zoom or pan, not on every move of a drag
        self.setCacheMode(QGraphicsView.CacheModeFlag.CacheBackground)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        self.setMouseTracking(True)
        self.setMinimumSize(320, 240)
        self.setTransform(QTransform.fromScale(1.0, -1.0))
        self._pan: QPointF | None = None
        self._fitted = False
        self._fit_box = QRectF()  # the site box (m) last fitted
        #: The user zoomed or panned since the last fit: a change of stage keeps the view.
        self.user_zoomed = False
        self._stage_shown: int | None = None
        self._wheel_rest = 0
        self._overlay_key: tuple[object, ...] | None = None
        self._overlay_pix: tuple[QPixmap, QPixmap] = (QPixmap(), QPixmap())
        #: Callables ``(painter, width, height)`` drawing on top in viewport pixels.
        self.foreground_hooks: list[Callable[[QPainter, int, int], None]] = []
        #: The size of a card (the wind and current) that wants a corner free of items,
        #: px; ``corner_rect`` is where it goes (see :meth:`choose_corner`).
        self.corner_size: QSizeF | None = None
        self.corner_rect = QRectF()
        self._place_timer = QTimer(self)
        self._place_timer.setSingleShot(True)
        self._place_timer.setInterval(0)
        self._place_timer.timeout.connect(self.place_labels)
        self._rest_timer = QTimer(self)  # restarted by every step of a pan or a wheel's zoom
        self._rest_timer.setSingleShot(True)
        self._rest_timer.setInterval(PLACE_AT_REST_MS)
        self._rest_timer.timeout.connect(self.schedule_placement)
        scene.refresh_hooks.append(lambda _s: self.schedule_placement())
        #: The still items of a tug drag as two pictures (see app.board.backdrop).
        self.backdrop = Backdrop(self)
        self._drag_seen: tuple[object, int] | None = None  # the drag and its still count
        self._drag_spoilt: object = None  # a drag whose still items changed: no backdrop
        scene.refresh_hooks.append(lambda _s: self._follow_drag())
        # connected after the scene's own refresh, so a refit sees the new stage's items
        scene.controller.changed.connect(self._controller_changed)
        self._stage_shown = scene.controller.stage_index

    # -- zoom and pan ---------------------------------------------------------------
    def pixels_per_metre(self) -> float:
        t = self.transform()
        return math.hypot(t.m11(), t.m12())

    def zoom(self, factor: float, *, at_rest: bool = False) -> None:
        """Zoom by ``factor`` round the anchor; the labels are placed once the events in
        hand are done, or with ``at_rest`` once the view has stood still (a wheel's
        notches in a row)."""
        ppm = self.pixels_per_metre()
        new = min(max(ppm * factor, 0.02), 200.0)
        f = new / ppm
        self.scale(f, f)
        self.user_zoomed = True
        if at_rest:
            self.place_at_rest()
        else:
            self.schedule_placement()

    def fit_to_hull(self) -> None:
        """Zoom so every body (with room for its tugs) fills the board."""
        self.fit_rect(self.board.fit_rect())

    def fit_to_site(self) -> None:
        """Zoom so the whole site (every feature) and every body fill the board."""
        self.fit_rect(self.board.site_rect())

    def fit_rect(self, rect: QRectF) -> None:
        """Show site box ``rect`` (m) whole, centred, north up."""
        if rect.isNull() or self.viewport().width() < 10:
            return
        self._fit_box = QRectF(rect)
        vw, vh = self.viewport().width(), self.viewport().height()
        k = min(vw / rect.width(), vh / rect.height())
        self.setTransform(QTransform.fromScale(k, -k))
        self.centerOn(rect.center())
        centre = rect.center()
        # labels keep their size in pixels: zoom out until they are in view as well
        for _ in range(4):
            content = self._content_rect(rect)
            if content.isNull() or self.viewport().rect().toRectF().contains(content):
                break
            f = 0.97 * min(vw / max(content.width(), 1.0), vh / max(content.height(), 1.0), 1.0)
            centre = self.mapToScene(content.center().toPoint())
            k *= f if f < 1.0 else 0.97
            self.setTransform(QTransform.fromScale(k, -k))
            self.centerOn(centre)
        # a little further out until a corner is free for the card
        for _ in range(FIT_TRIES if self.corner_size is not None else 0):
            if self.choose_corner()[1] == 0:
                break
            k *= 0.88
            self.setTransform(QTransform.fromScale(k, -k))
            self.centerOn(centre)
        self._fitted = True
        self.user_zoomed = False
        self.place_labels()

    def _content_rect(self, fitted: QRectF) -> QRectF:
        """The pixel box round the bodies' items, their labels where their owners put them.

        A mark or label anchored outside ``fitted`` (site m), such as where a far line of
        action crosses the centreline, does not count.
        """
        vt = self.viewportTransform()
        roots = {d.root for d in self.board.bodies.values()}
        box = QRectF()
        ignores = QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations
        for item in self.board.items():
            if item.topLevelItem() not in roots or not item.isVisible() or item.data(GUIDE):
                continue
            if isinstance(item, Leader):
                continue
            if item.flags() & ignores and not fitted.contains(item.scenePos()):
                continue
            if isinstance(item, Label):
                if not item.text:
                    continue
                r = item.deviceTransform(vt).mapRect(item.home_rect())
            else:
                r = device_rect(item, vt)
            if r.isEmpty():
                continue
            box = r if box.isNull() else box.united(r)
        return box

    # -- what is drawn on top, and the labels clear of it all ------------------------------
    def corners(self) -> list[QRectF]:
        """Where a card of ``corner_size`` may go, in order of preference (viewport px)."""
        if self.corner_size is None:
            return []
        w, h = self.viewport().width(), self.viewport().height()
        cw, ch = self.corner_size.width(), self.corner_size.height()
        m = MARGIN
        return [
            QRectF(w - m - cw, NORTH_ARROW.height(), cw, ch),  # under the north arrow
            QRectF(m, m, cw, ch),  # top left
            QRectF(w - m - cw, h - m - ch, cw, ch),  # bottom right
            QRectF(m, h - SCALE_BAR.height() - m - ch, cw, ch),  # above the scale bar
        ]

    def choose_corner(self) -> tuple[QRectF, float]:
        """Put the card in the first corner that covers no item; the area it covers, px²."""
        corners = self.corners()
        if not corners:
            self.corner_rect = QRectF()
            return QRectF(), 0.0
        items = [i for i in self.board.items() if not isinstance(i, (Label, Leader))]
        rect, covered = free_corner(items, self.viewportTransform(), corners)
        if rect != self.corner_rect:
            self.corner_rect = rect
            self.viewport().update()
        return rect, covered

    def overlay_rects(self) -> list[QRectF]:
        """The pixel boxes of the scale bar, the north arrow and the card."""
        w, h = self.viewport().width(), self.viewport().height()
        out = [
            QRectF(0, h - SCALE_BAR.height(), SCALE_BAR.width(), SCALE_BAR.height()),
            QRectF(w - NORTH_ARROW.width(), 0, NORTH_ARROW.width(), NORTH_ARROW.height()),
        ]
        if not self.corner_rect.isNull():
            out.append(self.corner_rect)
        return out

    @guarded
    def schedule_placement(self) -> None:
        """Place the labels once the events in hand are done (not during a drag)."""
        if not self.board.controller.previewing:
            self._place_timer.start()

    def place_at_rest(self) -> None:
        """Place the labels once the view has stood still for PLACE_AT_REST_MS.

        A pan or a wheel's zoom moves the view in many small steps; placing the labels
        after each cost more than a frame (a tenth of a second with 200 tugs). The card's
        corner and the item picture cache are chosen with the labels, so they too wait
        until the view stands still."""
        self._rest_timer.start()

    @guarded
    def place_labels(self) -> None:
        """Choose the card's corner, then move every label clear of the rest (now)."""
        self._place_timer.stop()
        self._rest_timer.stop()  # placed now: for the view as it stands
        self.backdrop.thaw()  # the placer reads every item as it is drawn
        if self.viewport().width() < 10:
            return
        self.choose_corner()
        place_labels(
            self.board, self.viewportTransform(), self.viewport().size(), self.overlay_rects()
        )
        fit_pixmap_cache(self)  # the zoom, the size or the items changed: room for their pictures

    @guarded
    def _controller_changed(self) -> None:
        index = self.board.controller.stage_index
        if index == self._stage_shown:
            return
        self._stage_shown = index
        if not self.user_zoomed:
            self.fit_to_hull()

    @guarded
    def showEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().showEvent(event)
        if not self._fitted:
            self.fit_to_hull()

    @guarded
    def resizeEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().resizeEvent(event)
        if not self._fitted or event.oldSize().width() <= 0:
            self.fit_to_hull()
        elif not self.user_zoomed and not self.board.controller.previewing:
            self.fit_rect(self._fit_box)  # a fitted view stays fitted (card corner too)
        else:
            self.schedule_placement()

    @guarded
    def wheelEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        tug = self.board.selected_tug()
        if tug is not None and self._over_tug(event.position(), tug):
            self._wheel_rest += event.angleDelta().y()
            notches = int(self._wheel_rest / 120)
            if notches:
                self._wheel_rest -= notches * 120
                self.board.interaction.step_setting(tug, 0.05 * notches)
            event.accept()
            return
        steps = event.angleDelta().y() / 120.0
        if steps:
            self.zoom(1.2**steps, at_rest=True)
        event.accept()

    def _over_tug(self, pos: QPointF, tug: str) -> bool:
        for d in self.board.bodies.values():
            t = d.tugs.get(tug)
            if t is not None:
                scene_pos = self.mapToScene(pos.toPoint())
                local = t.glyph.mapFromScene(scene_pos)
                return bool(t.glyph.contains(local))
        return False

    @guarded
    def mousePressEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        middle = event.button() == Qt.MouseButton.MiddleButton
        if middle:
            self._pan = event.position()
            self.viewport().setCursor(Qt.CursorShape.ClosedHandCursor)
            event.accept()
            return
        super().mousePressEvent(event)
        if (
            event.button() == Qt.MouseButton.LeftButton
            and not event.isAccepted()
            and self.board.tool == "select"
        ):
            self._pan = event.position()
            self.viewport().setCursor(Qt.CursorShape.ClosedHandCursor)
            event.accept()

    @guarded
    def mouseMoveEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        if self._pan is not None:
            d = event.position() - self._pan
            self._pan = event.position()
            if d.x() or d.y():
                self.user_zoomed = True
                self.place_at_rest()
            self.horizontalScrollBar().setValue(self.horizontalScrollBar().value() - int(d.x()))
            self.verticalScrollBar().setValue(self.verticalScrollBar().value() - int(d.y()))
            event.accept()
            return
        super().mouseMoveEvent(event)

    @guarded
    def mouseReleaseEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        if self._pan is not None:
            self._pan = None
            self.viewport().unsetCursor()
            if self._rest_timer.isActive():  # let go: the labels are placed at once
                self._rest_timer.stop()
                self.schedule_placement()
            event.accept()
            return
        super().mouseReleaseEvent(event)

    # -- a tug drag's still items as pictures ----------------------------------------------
    def _moving_tug(self) -> tuple[str, str] | None:
        """(body, tug) of the tug being dragged with its move shown, else None."""
        scene = self.board
        moving = scene.interaction.dragged_tug()
        if moving is None or not scene.controller.previewing:
            return None
        d = scene.bodies.get(moving[0])
        return moving if d is not None and moving[1] in d.tugs else None

    def _still_revision(self, moving: tuple[str, str]) -> int:
        bodies = self.board.bodies
        n = len(bodies)
        for name, d in bodies.items():
            n += d.still_changes(moving[1] if name == moving[0] else None)
        return n

    def _moving_items(self, moving: tuple[str, str]) -> list[QGraphicsItem]:
        """The items a drag of this tug changes: the tug's, the balance's, its sector's."""
        body, tug = moving
        d = self.board.bodies[body]
        t, b = d.tugs[tug], d.balance
        items: list[QGraphicsItem] = [t.glyph, t.label, b.centroid, b.cog, b.net, b.moment]
        items += [b.crossing, b.net_label, b.moment_label, b.cross_label, b.state, b.stale]
        items += b.action.pieces
        sectors = self.board.sectors
        wedge = sectors.wedges.get(tug)
        items += ([wedge] if wedge is not None else []) + list(sectors.knobs.get(tug, ()))
        out: list[QGraphicsItem] = []
        while items:  # with their children (a label's leader)
            item = items.pop()
            out.append(item)
            items += item.childItems()
        return out

    @guarded
    def _follow_drag(self) -> None:
        """After a refresh: take the backdrop once a tug drag's still items stand still,
        let it go when the drag ends or they change."""
        moving = self._moving_tug()
        drag = self.board.interaction.drag
        if moving is None:
            self.backdrop.thaw()
            self._drag_seen = self._drag_spoilt = None
            return
        if self.backdrop.frozen:
            if not self.backdrop.still_true():
                self.backdrop.thaw()
                self._drag_spoilt = drag  # live solving moves every tug: draw them as ever
            return
        if drag is self._drag_spoilt:
            return
        revision = self._still_revision(moving)
        seen, self._drag_seen = self._drag_seen, (drag, revision)
        if seen != (drag, revision):
            return  # the first move, or the still items changed with this one: wait
        bodies = {d.root for d in self.board.bodies.values()}
        items = self._moving_items(moving)
        if len(self.board.items()) - len(items) < BACKDROP_MIN_ITEMS:
            self._drag_spoilt = drag  # a small board: drawn as it is
            return
        self.backdrop.freeze(
            items,
            lambda i: i.topLevelItem() in bodies,
            lambda: self._still_revision(moving),
        )

    @guarded
    def paintEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        if self.backdrop.frozen and (self._moving_tug() is None or not self.backdrop.still_true()):
            self._drag_spoilt = self.board.interaction.drag
            self.backdrop.thaw()  # and the whole board is painted again after this
        super().paintEvent(event)

    @guarded
    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:
        if self.backdrop.capture == "over":
            return  # the picture over the moving items: on a clear ground
        if not self.backdrop.draw_under(painter):
            super().drawBackground(painter, rect)

    # -- on top: scale bar and north arrow ------------------------------------------------
    @guarded
    def drawForeground(self, painter: QPainter, rect: QRectF) -> None:
        if self.backdrop.capture is not None:
            return  # a picture of the still items: no overlays in it
        painter.save()
        painter.resetTransform()
        self.backdrop.draw_over(painter)
        h = self.viewport().height()
        w = self.viewport().width()
        bar, arrow = self._overlays()
        painter.drawPixmap(0, h - 48, bar)
        painter.drawPixmap(w - 72, 10, arrow)
        for hook in self.foreground_hooks:  # e.g. the wind and current card
            hook(painter, w, h)
        painter.restore()

    def _overlays(self) -> tuple[QPixmap, QPixmap]:
        """The scale bar and the north arrow as small pixmaps, drawn once per zoom and unit."""
        units = self.board.controller.project.units
        key = (round(self.pixels_per_metre(), 9), units.unit("length"), self.devicePixelRatioF())
        if self._overlay_key != key:
            ratio = self.devicePixelRatioF()

            def canvas(w: int, h: int) -> tuple[QPixmap, QPainter]:
                pix = QPixmap(int(w * ratio), int(h * ratio))
                pix.setDevicePixelRatio(ratio)
                pix.fill(Qt.GlobalColor.transparent)
                return pix, QPainter(pix)

            bar, p = canvas(220, 48)
            draw_scale_bar(p, QPointF(16, 34), self.pixels_per_metre(), units)
            p.end()
            arrow, p = canvas(72, 76)
            draw_north_arrow(p, QPointF(36, 38 + 6))
            p.end()
            self._overlay_pix = (bar, arrow)
            self._overlay_key = key
        return self._overlay_pix
