"""What a tug drag leaves alone, drawn once as pictures instead of on every move.

A tug drag changes the dragged tug (its shape, towline, arrow, label) and the balance
(the net force, the yaw moment, the line of action, their marks and labels); every
other item stays as it is. With 200 tugs those still items are a thousand, and every
move's repaint drew each one under the parts of the board that changed (a line of
action runs across the board), which cost more than a frame.

So, once a tug drag's still items have stood still for a move, the view takes them in
Qt's stacking order: the run of them from the bottom up to the first moving item is
drawn once into a picture under everything (with the water and the grid), the run
from the last moving item to the top into a picture over everything, each long run
between moving items into a picture drawn where that run lies (:class:`Picture`), and
those items are told they have nothing to draw (``ItemHasNoContents``) until the drag
ends. Short runs are drawn item by item as before. The board looks as it would: the
pictures are the same items drawn by the same view, each in its place in the stacking
order (laid over one another, translucent label boxes may differ by a level of 255).

The backdrop is let go (every item drawn again) when the drag ends, when the view's
zoom, position or size changes, or when a still item changes after all: a body's
drawing counts its changes (:meth:`app.board.drawing.BodyDrawing.still_changes`), and
the items of other layers are compared by where they are, whether and how faintly they
are shown, and whether they are still there (the drift layer, the one layer that draws
during a tug drag, takes its items away and makes new ones).
"""

from __future__ import annotations

from collections.abc import Callable, Iterable

from PySide6.QtCore import QPoint, QRectF, Qt
from PySide6.QtGui import QPainter, QPixmap, QRegion, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsView, QStyleOptionGraphicsItem, QWidget
from shiboken6 import isValid

from app.board.items import take_out
from app.guard import guarded

NO_CONTENTS = QGraphicsItem.GraphicsItemFlag.ItemHasNoContents
#: A run of still items between moving ones goes into a picture of its own when it has
#: at least this many items (a short run is drawn item by item).
MIN_RUN = 30
Signature = tuple[float, float, float, float, bool, float, float]


def _painted(item: QGraphicsItem) -> bool:
    """Whether Qt draws anything for ``item`` itself (shown, and with contents)."""
    return item.isVisible() and not (item.flags() & NO_CONTENTS)


def _still_runs(painted: list[QGraphicsItem], live: set[int]) -> list[list[QGraphicsItem]]:
    """The runs of consecutive still items in stacking order (``live``: ids of the moving);
    none when no item moves."""
    runs: list[list[QGraphicsItem]] = []
    run: list[QGraphicsItem] = []
    moves = False
    for item in painted:
        if id(item) in live:
            moves = True
            if run:
                runs.append(run)
            run = []
        else:
            run.append(item)
    if run:
        runs.append(run)
    return runs if moves else []


class Picture(QGraphicsItem):
    """A picture of a run of still items, drawn where the run's last item is stacked.

    It is a child of that item stacked under the item's own children (a child is drawn
    after its parent, and the children after the item's are moving ones); it covers
    the viewport and draws in its pixels.
    """

    def __init__(self, after: QGraphicsItem, pixmap: QPixmap, vt: QTransform, port: QRectF) -> None:
        super().__init__(after)
        self.pixmap = pixmap
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        kids = [c for c in after.childItems() if c is not self]
        # before the item's own children (they come after it in the stacking order)
        self.setZValue(min((c.zValue() for c in kids), default=0.0) - 1.0)
        self._rect = self.deviceTransform(vt).inverted()[0].mapRect(port)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        painter.save()
        painter.resetTransform()
        painter.drawPixmap(0, 0, self.pixmap)
        painter.restore()


def _signature(item: QGraphicsItem) -> Signature:
    r = item.sceneBoundingRect()
    return (r.x(), r.y(), r.width(), r.height(), item.isVisible(), item.zValue(), item.opacity())


class Backdrop:
    """The still items of a tug drag on one view, as a picture under, one over, and one
    for each long run between moving items.

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
        self._pictures: list[Picture] = []  # the runs of still items between moving ones
        self._others: dict[QGraphicsItem, Signature] = {}
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
        """Draw the still items into pictures and stop drawing them one by one.

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
        runs = _still_runs(painted, live)
        if not runs:
            return False
        first = runs[0] if runs[0][0] is painted[0] else []
        last = runs[-1] if runs[-1][-1] is painted[-1] and runs[-1] is not first else []
        between = [
            r
            for r in runs
            if r is not first
            and r is not last
            and len(r) >= MIN_RUN
            # the picture is the last item's child: it would take a faint item's opacity
            and r[-1].effectiveOpacity() == 1.0
        ]
        if len(first) + len(last) + sum(map(len, between)) < 2:
            return False
        self._revision = revision
        self._revision_at = revision()
        self._others = {i: _signature(i) for i in order if not owned(i)}
        self._view_key = self._key()
        ratio = vp.devicePixelRatioF()

        def picture() -> QPixmap:
            pix = QPixmap(round(vp.width() * ratio), round(vp.height() * ratio))
            pix.setDevicePixelRatio(ratio)
            pix.fill(Qt.GlobalColor.transparent)
            return pix

        shown = {id(i): True for i in painted}

        def only(run: list[QGraphicsItem]) -> None:
            keep = {id(i) for i in run}
            for i in painted:
                on = id(i) in keep
                if shown[id(i)] != on:
                    i.setFlag(NO_CONTENTS, not on)
                    shown[id(i)] = on

        # the picture under: the background and the still items below the first moving one
        only(first)
        self.under = self._draw(picture(), "under")
        # the others on a clear ground: the runs between moving items and the one on top
        mode, fill = self.view.cacheMode(), vp.autoFillBackground()
        self.view.setCacheMode(QGraphicsView.CacheModeFlag.CacheNone)
        vp.setAutoFillBackground(False)
        try:
            pictures = []
            for run in between:
                only(run)
                pictures.append(self._draw(picture(), "over"))
            only(last)
            self.over = self._draw(picture(), "over")
        finally:
            vp.setAutoFillBackground(fill)
            self.view.setCacheMode(mode)
        frozen = first + last + [i for r in between for i in r]
        in_pictures = {id(i) for i in frozen}
        only([i for i in painted if id(i) not in in_pictures])
        self._items = frozen
        vt = self.view.viewportTransform()
        port = QRectF(vp.rect())
        for run, pix in zip(between, pictures, strict=True):
            self._pictures.append(Picture(run[-1], pix, vt, port))
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
        return all(
            isValid(i) and i.scene() is scene and _signature(i) == s
            for i, s in self._others.items()
        )

    def thaw(self) -> None:
        """Draw every item on its own again (the whole board is painted afresh)."""
        if not self.frozen:
            return
        self.frozen = False
        self._show(self._items)
        self._items = []
        for pic in self._pictures:
            if isValid(pic):
                take_out(pic)
        self._pictures = []
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
