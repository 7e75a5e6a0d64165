"""What a tug drag leaves alone, drawn once as two pictures instead of on every move.

A tug drag changes the dragged tug (its shape, towline, arrow, label) and the balance
(the net force, the yaw moment, the line of action, their marks and labels); every
other item stays as it is. With 200 tugs those still items are a thousand, and every
move's repaint drew each one under the parts of the board that changed (a line of
action runs across the board), which cost more than a frame.

So, once a tug drag's first move has been drawn, the view takes the still items in
Qt's stacking order: the run of them from the bottom up to the first moving item is
drawn once into a picture under everything (with the water and the grid), the run
from the last moving item to the top into a picture over everything, and those items
are told they have nothing to draw (``ItemHasNoContents``) until the drag ends. Still
items stacked between moving ones are drawn as before, so the board looks exactly as
it would: the pictures are the same items drawn by the same view, and each picture
keeps its place in the stacking order.

The backdrop is let go (every item drawn again) when the drag ends, when the view's
zoom, position or size changes, or when a still item changes after all: a body's
drawing counts its changes (:meth:`app.board.drawing.BodyDrawing.still_revision`), and
the items of other layers are compared by where they are and whether they are shown.
"""

from __future__ import annotations

from collections.abc import Callable, Iterable

from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QPainter, QPixmap, QRegion, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsView, QWidget
from shiboken6 import isValid

NO_CONTENTS = QGraphicsItem.GraphicsItemFlag.ItemHasNoContents
Signature = tuple[float, float, float, float, bool, float]


def _painted(item: QGraphicsItem) -> bool:
    """Whether Qt draws anything for ``item`` itself (shown, and with contents)."""
    return item.isVisible() and not (item.flags() & NO_CONTENTS)


def _signature(item: QGraphicsItem) -> Signature:
    r = item.sceneBoundingRect()
    return (r.x(), r.y(), r.width(), r.height(), item.isVisible(), item.zValue())


class Backdrop:
    """The still items of a tug drag on one view, as a picture under and one over.

    ``capture`` is ``"under"`` or ``"over"`` while a picture is being drawn (the view's
    background and foreground read it); ``frozen`` is True while the pictures stand in
    for their items.
    """

    def __init__(self, view: QGraphicsView) -> None:
        self.view = view
        self.frozen = False
        self.capture: str | None = None
        self.under = QPixmap()
        self.over = QPixmap()
        self._items: list[QGraphicsItem] = []  # told they have nothing to draw
        self._others: dict[QGraphicsItem, Signature] = {}
        self._count = 0
        self._revision: Callable[[], int] = lambda: 0
        self._revision_at = 0
        self._view_key: tuple[object, ...] = ()

    # -- taking the pictures ---------------------------------------------------------
    def freeze(
        self,
        moving: Iterable[QGraphicsItem],
        owned: Callable[[QGraphicsItem], bool],
        revision: Callable[[], int],
    ) -> bool:
        """Draw the still items into the two pictures and stop drawing them one by one.

        ``moving``: the items the drag changes; ``owned(item)``: True for an item whose
        changes ``revision()`` counts (the bodies' drawings); other items are checked
        by their place and visibility. Returns whether anything was frozen.
        """
        self.thaw()
        scene = self.view.scene()
        vp = self.view.viewport()
        if scene is None or vp.width() < 2 or vp.height() < 2:
            return False
        live = {id(i) for i in moving}
        order = scene.items(Qt.SortOrder.AscendingOrder)
        painted = [i for i in order if _painted(i)]
        at = [k for k, i in enumerate(painted) if id(i) in live]
        if not at:
            return False
        first, last = at[0], at[-1]
        under, over = painted[:first], painted[last + 1 :]
        if len(under) + len(over) < 2:
            return False
        self._revision = revision
        self._revision_at = revision()
        self._count = len(order)
        self._others = {i: _signature(i) for i in order if not owned(i)}
        self._view_key = self._key()
        ratio = vp.devicePixelRatioF()

        def picture() -> QPixmap:
            pix = QPixmap(round(vp.width() * ratio), round(vp.height() * ratio))
            pix.setDevicePixelRatio(ratio)
            pix.fill(Qt.GlobalColor.transparent)
            return pix

        ends = {id(i) for i in under} | {id(i) for i in over}
        others = [i for i in painted if id(i) not in ends]
        # the picture under: the background and the still items below the first moving one
        self._hide(over + others)
        self.under = self._draw(picture(), "under")
        # the picture over: on a clear ground, the still items above the last moving one
        self._show(over)
        self._hide(under)
        mode, fill = self.view.cacheMode(), vp.autoFillBackground()
        self.view.setCacheMode(QGraphicsView.CacheModeFlag.CacheNone)
        vp.setAutoFillBackground(False)
        self.over = self._draw(picture(), "over")
        vp.setAutoFillBackground(fill)
        self.view.setCacheMode(mode)
        self._show(others)
        self._hide(over)
        self._items = under + over
        self.frozen = True
        self.view.resetCachedContent()  # the cached background becomes the picture under
        return True

    def _draw(self, pix: QPixmap, which: str) -> QPixmap:
        self.capture = which
        try:
            painter = QPainter(pix)
            self.view.viewport().render(painter, QPoint(), QRegion(), QWidget.RenderFlag(0))
            painter.end()
        finally:
            self.capture = None
        return pix

    @staticmethod
    def _hide(items: list[QGraphicsItem]) -> None:
        for i in items:
            i.setFlag(NO_CONTENTS, True)

    @staticmethod
    def _show(items: list[QGraphicsItem]) -> None:
        for i in items:
            if isValid(i):
                i.setFlag(NO_CONTENTS, False)

    def _key(self) -> tuple[object, ...]:
        v = self.view
        t: QTransform = v.viewportTransform()
        return (
            t.m11(), t.m12(), t.m21(), t.m22(), t.dx(), t.dy(),
            v.viewport().width(), v.viewport().height(), v.viewport().devicePixelRatioF(),
        )  # fmt: skip

    # -- keeping them true -------------------------------------------------------------
    def still_true(self) -> bool:
        """Whether the pictures still show the board (the same view, no still item changed)."""
        if not self.frozen:
            return True
        if self._key() != self._view_key or self._revision() != self._revision_at:
            return False
        scene = self.view.scene()
        if scene is None or len(scene.items()) != self._count:
            return False
        return all(isValid(i) and _signature(i) == s for i, s in self._others.items())

    def thaw(self) -> None:
        """Draw every item on its own again (the whole board is painted afresh)."""
        if not self.frozen:
            return
        self.frozen = False
        self._show(self._items)
        self._items = []
        self._others = {}
        self.under = QPixmap()
        self.over = QPixmap()
        self.view.resetCachedContent()
        self.view.viewport().update()

    # -- what the view draws ------------------------------------------------------------
    def draw_under(self, painter: QPainter) -> bool:
        """Draw the picture under (True), or leave the background to the view (False)."""
        if not self.frozen or self.capture is not None:
            return False
        painter.save()
        painter.resetTransform()
        painter.drawPixmap(0, 0, self.under)
        painter.restore()
        return True

    def draw_over(self, painter: QPainter) -> None:
        """Draw the picture over (the painter in viewport pixels)."""
        if self.frozen and self.capture is None:
            painter.drawPixmap(0, 0, self.over)
