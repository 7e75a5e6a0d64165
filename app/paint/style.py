"""The one palette of the plan, and the pens and fonts of the screen.

The board, the hold limits plot and the printed briefing all take their colours from
here, so the screen and the paper look like the same plan. Port and starboard follow
the navigation-light convention (red to port, green to starboard); the other colours
are our own, chosen to stay apart from those two and from each other on screen, on a
colour printer and on a grey photocopy (each also differs in weight or dash):

- the hull is a pale grey-blue with a dark edge; tugs are amber with a dark brown edge,
  their towlines dark brown;
- each tug's force is blue; the net force, its line of action and the yaw moment are
  purple (the result of all the forces together);
- the wind and its load are cyan, the current and its load slate;
- the verdict reads green (go), amber-brown (caution) and deep red (no-go), always
  beside its word.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPen

# -- paper, ink and the water ----------------------------------------------------------
INK = QColor("#1b1f24")
TEXT = INK
MUTED = QColor("#5b6470")
RULE = QColor("#9aa3ad")
SHADE = QColor("#eef1f4")
WATER = QColor("#f4f8fb")
GRID_MINOR = QColor("#e2eaf0")
GRID_MAJOR = QColor("#c9d6e0")
LABEL_BG = QColor(255, 255, 255, 235)

# -- the body ----------------------------------------------------------------------------
HULL_FILL = QColor("#dde4ec")
HULL_EDGE = QColor("#1f3b57")
HULL_SELECTED = QColor("#1565c0")
SELECTION = HULL_SELECTED
INVALID = QColor("#c62828")
INVALID_FILL = QColor(198, 40, 40, 40)
CENTRELINE = QColor("#6b7a89")
PORT = QColor("#c62828")  # navigation-light convention: red to port
STARBOARD = QColor("#2e7d32")  # green to starboard
LINE_POINT = QColor("#37474f")
PUSH_POINT = QColor("#6d4c41")

# -- tugs and forces --------------------------------------------------------------------
TUG_FILL = QColor("#f5d06a")
TUG_FILL_SELECTED = QColor("#ffe6a3")
TUG_EDGE = QColor("#4e3b12")
TOWLINE = QColor("#4e3b12")
TUG_FORCE = QColor("#1e5fb4")
NET_FORCE = QColor("#6a1b9a")
MOMENT = NET_FORCE
LINE_OF_ACTION = NET_FORCE
STALE = QColor("#9e9e9e")

# -- the conditions and their loads --------------------------------------------------
WIND = QColor("#0097a7")
CURRENT = QColor("#546e7a")
LOAD_FORCE = WIND  # a load of no known cause


def load_color(name: str) -> QColor:
    """The colour of a load named by its cause ("wind", "current")."""
    return CURRENT if name == "current" else WIND


# -- the site --------------------------------------------------------------------------
QUAY = QColor("#454b52")
DOLPHIN_FILL = QColor("#8d949b")
VESSEL_FILL = QColor("#cfd4da")
LIMIT = QColor("#2f6f9f")
CLEARANCE = QColor("#37474f")
TRACK = QColor("#37474f")

# -- the drift preview -------------------------------------------------------------------
DRIFT = QColor("#a0522d")  # ghost outlines and the centroid's track, dashed and dotted
DRIFT_CONTACT = QColor("#b3261e")  # where the drifting body first touches

# -- the hold limits plot ---------------------------------------------------------------
ALL_TUGS = TUG_FORCE
ALL_TUGS_FILL = QColor(30, 95, 180, 28)
TUG_LOST = QColor("#c2410c")
PLANNED_WIND = QColor("#8e1b1b")
CURRENT_HELD = CURRENT  # the hold limits for the current, dash-dotted

# -- a tug's capability (the tug editor's polar diagram) and working sectors --------------
CAPABILITY_LINE = TUG_FORCE
CAPABILITY_PUSH = QColor("#6d4c41")
CAPABILITY_PUSH_PULL = QColor("#2e6f5e")
SECTOR_FILL = QColor(30, 95, 180, 20)  # a tug's working sector on the board, faint
SECTOR_EDGE = QColor(30, 95, 180, 90)
SECTOR_FILL_SELECTED = QColor(30, 95, 180, 42)  # the selected tug's, a little stronger
SECTOR_EDGE_SELECTED = QColor(21, 101, 192, 200)
#: the part of a working sector the solve cannot use (leads over the hull, or cut off): hatched
SECTOR_UNUSED = QColor(110, 90, 80, 90)
SECTOR_UNUSED_SELECTED = QColor(110, 90, 80, 190)

# -- the verdict -------------------------------------------------------------------------
GO = QColor("#1e6b35")
CAUTION = QColor("#8a5a00")
NO_GO = QColor("#b3261e")
NO_GO_FILL = QColor("#fdf3f2")
CAUTION_FILL = QColor("#fdf8ec")
GO_FILL = QColor("#f1f8f3")
CLEARANCE_LOW = NO_GO


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
