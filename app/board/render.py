"""Drawing a board into any painter (PDF, printer, image), north up and to scale.

Example, for a briefing page::

    scene = BoardScene(controller, stage_index=k)   # no window needed
    render_board(scene, painter, target_rect)       # target in the painter's units

Labels, marks and pen widths are sized in device pixels of a 96-dpi screen;
``render_board`` scales them to the painter's device so a 1200-dpi PDF looks like the
screen. The scale bar and north arrow are drawn too (pass ``overlays=False`` to leave
them out).
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QPainter, QTransform
from PySide6.QtWidgets import QGraphicsItem

from app.board.items import Label
from app.board.overlay import draw_north_arrow, draw_scale_bar
from app.board.placement import place_labels
from app.board.scene import BoardScene
from app.paint.style import device_scale

NO_CACHE = QGraphicsItem.CacheMode.NoCache


def _place_for_page(
    scene: BoardScene, src: QRectF, px_per_m: float, size: QSize, overlays: bool
) -> None:
    """Place the labels for a page showing ``src`` (site m) at ``px_per_m`` screen pixels."""
    # scene to the page's screen pixels, north up: what a view of that size would show
    vt = QTransform(px_per_m, 0.0, 0.0, -px_per_m, -src.left() * px_per_m, src.bottom() * px_per_m)
    w, h = size.width(), size.height()
    reserved = []
    if overlays:  # the scale bar bottom left, the north arrow top right
        reserved = [QRectF(0, h - 48, 220, 48), QRectF(w - 72, 0, 72, 86)]
    place_labels(scene, vt, size, reserved)


def render_board(
    scene: BoardScene,
    painter: QPainter,
    target: QRectF,
    source: QRectF | None = None,
    overlays: bool = True,
) -> float:
    """Draw ``scene`` into ``target`` (device units); returns the scale, device units per metre.

    ``source`` is the site-frame box to show (default: the bodies and their tugs).
    """
    src = QRectF(source) if source is not None else scene.fit_rect()
    k = device_scale(painter)  # items scale their pixel sizes by it themselves
    t = QRectF(target)
    sx, sy = t.width() / src.width(), t.height() / src.height()
    s = min(sx, sy)
    # centre the source in the target at one scale
    src = QRectF(
        src.center().x() - t.width() / s / 2,
        src.center().y() - t.height() / s / 2,
        t.width() / s,
        t.height() / s,
    )
    painter.save()
    painter.setRenderHint(QPainter.RenderHint.Antialiasing)
    painter.setRenderHint(QPainter.RenderHint.TextAntialiasing)
    painter.setClipRect(t)
    # flip y: the scene's north (+y) goes up the page
    painter.translate(0.0, t.top() + t.bottom())
    painter.scale(1.0, -1.0)
    # vector output: no item drawn from a cached pixmap
    cached = [(item, item.cacheMode()) for item in scene.items() if item.cacheMode() != NO_CACHE]
    for item, _ in cached:
        item.setCacheMode(NO_CACHE)
    # labels placed clear of each other for this page's scale; the screen's put back after
    shifts = {lab: lab.shift for lab in scene.items() if isinstance(lab, Label)}
    _place_for_page(scene, src, s / k, QSize(round(t.width() / k), round(t.height() / k)), overlays)
    try:
        scene.render(painter, t, src, Qt.AspectRatioMode.IgnoreAspectRatio)
    finally:
        for item, mode in cached:
            item.setCacheMode(mode)
        for lab, (dx, dy) in shifts.items():
            lab.set_shift(dx, dy)
    painter.restore()
    if overlays:
        painter.save()
        painter.scale(k, k)  # the overlays are drawn in screen pixels
        draw_scale_bar(
            painter,
            QPointF(t.left() / k + 14, t.bottom() / k - 10),
            s / k,
            scene.controller.project.units,
        )
        draw_north_arrow(painter, QPointF(t.right() / k - 34, t.top() / k + 44))
        painter.restore()
    return s
