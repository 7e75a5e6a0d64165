"""Colours, pens and sizes of the board, in one place (chosen for screen and print)."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPen

WATER = QColor("#f4f8fb")
GRID_MINOR = QColor("#e2eaf0")
GRID_MAJOR = QColor("#c9d6e0")
HULL_FILL = QColor("#d9dde3")
HULL_EDGE = QColor("#2b3440")
HULL_SELECTED = QColor("#1565c0")
INVALID = QColor("#d32f2f")
CENTRELINE = QColor("#7a8794")
PORT = QColor("#d32f2f")  # navigation-light convention: red to port
STARBOARD = QColor("#2e7d32")  # green to starboard
LINE_POINT = QColor("#37474f")
PUSH_POINT = QColor("#6d4c41")
TUG_FILL = QColor("#fff3d6")
TUG_EDGE = QColor("#5d4a1f")
TOWLINE = QColor("#5d4a1f")
TUG_FORCE = QColor("#1e63b8")
NET_FORCE = QColor("#8e24aa")
MOMENT = QColor("#ef6c00")
LINE_OF_ACTION = QColor("#8e24aa")
LOAD_FORCE = QColor("#00838f")
STALE = QColor("#9e9e9e")
TEXT = QColor("#1d252d")
LABEL_BG = QColor(255, 255, 255, 235)
SELECTION = QColor("#1565c0")

#: Drawn size of a tug, m (a generic harbour tug; the board is to scale).
TUG_LENGTH_M = 26.0
TUG_BEAM_M = 10.0


def pen(color: QColor, width: float = 1.5, style: Qt.PenStyle = Qt.PenStyle.SolidLine) -> QPen:
    """A cosmetic pen: ``width`` in screen pixels whatever the zoom."""
    p = QPen(color, width, style)
    p.setCosmetic(True)
    p.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
    p.setCapStyle(Qt.PenCapStyle.RoundCap)
    return p


def brush(color: QColor) -> QBrush:
    return QBrush(color)


def label_font(point_size: float = 9.0, bold: bool = False) -> QFont:
    """A board font sized in pixels (``point_size`` at 96 dpi), like the marks beside it."""
    f = QFont()
    f.setPixelSize(max(1, round(point_size * 96 / 72)))
    f.setBold(bold)
    return f


def device_scale(painter: object) -> float:
    """Device pixels per 96-dpi screen pixel of the painter's device (1 on screen).

    Sizes on the board given in pixels (pens, labels, marks) are multiplied by this,
    so a board drawn into a 1200-dpi PDF looks as it does on screen.
    """
    dev = painter.device() if hasattr(painter, "device") else None  # type: ignore[attr-defined]
    if dev is None:
        return 1.0
    dpi = dev.logicalDpiX()
    return dpi / 96.0 if dpi > 0 else 1.0


def scaled_pen(p: QPen, k: float) -> QPen:
    if k == 1.0:
        return p
    q = QPen(p)
    q.setWidthF(p.widthF() * k)
    return q
