"""The board's view: north up, zoom with the wheel round the cursor, pan, fit to hull.

When another stage is shown the view fits it again, unless the user zoomed or panned
since the last fit (then the view stays where the user put it). Fit to hull and fit to
site clear that.
"""

from __future__ import annotations

import math
from collections.abc import Callable

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QPainter, QPixmap, QTransform
from PySide6.QtWidgets import QGraphicsView, QWidget

from app.board.overlay import draw_north_arrow, draw_scale_bar
from app.board.scene import BoardScene


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
        #: The user zoomed or panned since the last fit: a change of stage keeps the view.
        self.user_zoomed = False
        self._stage_shown: int | None = None
        self._wheel_rest = 0
        self._overlay_key: tuple[object, ...] | None = None
        self._overlay_pix: tuple[QPixmap, QPixmap] = (QPixmap(), QPixmap())
        #: Callables ``(painter, width, height)`` drawing on top in viewport pixels.
        self.foreground_hooks: list[Callable[[QPainter, int, int], None]] = []
        # connected after the scene's own refresh, so a refit sees the new stage's items
        scene.controller.changed.connect(self._controller_changed)
        self._stage_shown = scene.controller.stage_index

    # -- zoom and pan ---------------------------------------------------------------
    def pixels_per_metre(self) -> float:
        t = self.transform()
        return math.hypot(t.m11(), t.m12())

    def zoom(self, factor: float) -> None:
        ppm = self.pixels_per_metre()
        new = min(max(ppm * factor, 0.02), 200.0)
        f = new / ppm
        self.scale(f, f)
        self.user_zoomed = True

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
        vw, vh = self.viewport().width(), self.viewport().height()
        k = min(vw / rect.width(), vh / rect.height())
        self.setTransform(QTransform.fromScale(k, -k))
        self.centerOn(rect.center())
        self._fitted = True
        self.user_zoomed = False

    def _controller_changed(self) -> None:
        index = self.board.controller.stage_index
        if index == self._stage_shown:
            return
        self._stage_shown = index
        if not self.user_zoomed:
            self.fit_to_hull()

    def showEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().showEvent(event)
        if not self._fitted:
            self.fit_to_hull()

    def resizeEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().resizeEvent(event)
        if not self._fitted or event.oldSize().width() <= 0:
            self.fit_to_hull()

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
            self.zoom(1.2**steps)
        event.accept()

    def _over_tug(self, pos: QPointF, tug: str) -> bool:
        for d in self.board.bodies.values():
            t = d.tugs.get(tug)
            if t is not None:
                scene_pos = self.mapToScene(pos.toPoint())
                local = t.glyph.mapFromScene(scene_pos)
                return bool(t.glyph.contains(local))
        return False

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

    def mouseMoveEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        if self._pan is not None:
            d = event.position() - self._pan
            self._pan = event.position()
            if d.x() or d.y():
                self.user_zoomed = True
            self.horizontalScrollBar().setValue(self.horizontalScrollBar().value() - int(d.x()))
            self.verticalScrollBar().setValue(self.verticalScrollBar().value() - int(d.y()))
            event.accept()
            return
        super().mouseMoveEvent(event)

    def mouseReleaseEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        if self._pan is not None:
            self._pan = None
            self.viewport().unsetCursor()
            event.accept()
            return
        super().mouseReleaseEvent(event)

    # -- on top: scale bar and north arrow ------------------------------------------------
    def drawForeground(self, painter: QPainter, rect: QRectF) -> None:
        painter.save()
        painter.resetTransform()
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
