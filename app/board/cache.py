"""Qt's picture cache, sized for the board.

Cached items (the hull and the tugs in device pixels, fixed-size marks and labels in
their own pixel frame) each keep a pixmap in ``QPixmapCache``, the one cache of the
whole program that also holds the style's pictures (the docks' title buttons, arrows,
check marks). Its
default size (10 MB) holds the board of a small plan at one device pixel per pixel; 200
tugs on a high-density screen need several times that. When the board's pixmaps do not
fit, Qt throws the oldest out and draws them again on the next frame, so every frame
draws every tug again, and the style's pictures with them.

:func:`fit_pixmap_cache` works out what the board's cached items take at the view's zoom
and pixel ratio, and makes the cache room for twice that (it only ever grows it).

The hull and the tugs keep a device cache only while they are drawn unturned: Qt draws
an item whose transform to the screen turns it (a body at a heading other than 090 or
270) into its pixmap again on every paint, which costs more than no cache at all.
:func:`still_mode` is their cache as they lie on screen; the body drawings ask it again
when a pose turns them (the view itself only scales and flips y, it never turns).
"""

from __future__ import annotations

from PySide6.QtGui import QPixmapCache, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsView

NO_CACHE = QGraphicsItem.CacheMode.NoCache
DEVICE_CACHE = QGraphicsItem.CacheMode.DeviceCoordinateCache
#: Room kept for the style's own pictures and everything else that is not the board, KiB.
OTHERS_KIB = 8 * 1024
#: Bytes per cached pixel (premultiplied ARGB, 32 bits).
PIXEL_BYTES = 4


def board_cache_kib(view: QGraphicsView) -> int:
    """What the cached items of ``view``'s scene take in the pixmap cache, KiB.

    A cached item's pixmap covers its box on screen, clipped to the viewport (Qt caches
    only the part in view of an item larger than the view), at the device pixel ratio.
    """
    scene = view.scene()
    if scene is None:
        return 0
    vt = view.viewportTransform()
    port = view.viewport().rect().toRectF()
    ratio = view.devicePixelRatioF()
    pixels = 0.0
    for item in scene.items():
        if item.cacheMode() == NO_CACHE or not item.isVisible():
            continue
        box = item.deviceTransform(vt).mapRect(item.boundingRect()).intersected(port)
        pixels += (box.width() + 2) * (box.height() + 2)
    return int(pixels * ratio * ratio * PIXEL_BYTES / 1024) + 1


def fit_pixmap_cache(view: QGraphicsView) -> int:
    """Make the pixmap cache room for twice the board's pictures and the rest; its limit, KiB."""
    want = 2 * board_cache_kib(view) + OTHERS_KIB
    if want > QPixmapCache.cacheLimit():
        QPixmapCache.setCacheLimit(want)
    return QPixmapCache.cacheLimit()


def turned(item: QGraphicsItem) -> bool:
    """Whether ``item`` is drawn turned (rotated or sheared) on screen, as Qt sees it.

    The board's view only scales and flips y, so the item's scene transform says it; a
    turn by 180 degrees is a scale by -1 to Qt, and its device cache is kept.
    """
    return item.sceneTransform().type().value > QTransform.TransformationType.TxScale.value


def still_mode(item: QGraphicsItem) -> QGraphicsItem.CacheMode:
    """The cache of a hull's or a tug's picture (drawn in metres, in a body's frame) as
    it lies on screen: Qt's device cache when unturned, none when turned (the cache would
    be drawn again on every paint; an item cache, drawn turned and scaled from a picture
    in metres, would blur it)."""
    return NO_CACHE if turned(item) else DEVICE_CACHE
