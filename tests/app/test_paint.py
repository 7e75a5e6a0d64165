"""One way to paint the plan: the board, the hold limits plot and the briefing share it."""

from __future__ import annotations

import math
import re
from pathlib import Path

import pytest
import shapely
from PySide6.QtCore import QRectF
from PySide6.QtGui import QColor, QImage, QPainter

from app.paint import style
from app.paint.rings import RING_STEPS, polar_scale, ring_step
from app.paint.shapes import (
    HEAD_HALF_WIDTH,
    TUG_BEAM_M,
    TUG_LENGTH_M,
    arc_arrow,
    arrow_head,
    placed_tug,
    tug_origin,
)
from core.io.projectfile import load
from core.units import DisplayUnits

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = ROOT / "sample_projects"
KNOT = 1852 / 3600  # m/s, the international knot (exact by definition)

#: The modules that draw the plan; none may bring a colour of its own.
DRAWERS = [
    *sorted((ROOT / "app" / "board").glob("*.py")),
    *sorted((ROOT / "app" / "briefing").glob("*.py")),
    ROOT / "app" / "panels" / "hold_plot.py",
]
COLOUR_LITERAL = re.compile(r"QColor\(\s*(\"#|'#|\d)")


@pytest.mark.parametrize("path", DRAWERS, ids=lambda p: f"{p.parent.name}/{p.name}")
def test_no_drawing_module_has_a_colour_of_its_own(path: Path) -> None:
    text = path.read_text()
    assert not COLOUR_LITERAL.findall(text), f"{path.name}: take colours from app.paint.style"
    assert not re.search(r"#[0-9a-fA-F]{6}\b", text), f"{path.name}: a hex colour"


def test_port_is_red_and_starboard_green() -> None:
    # navigation-light convention (COLREGs Annex I: red sidelight to port, green to starboard)
    assert style.PORT.red() > 2 * max(style.PORT.green(), style.PORT.blue())
    assert style.STARBOARD.green() > 1.5 * max(style.STARBOARD.red(), style.STARBOARD.blue())
    # and no other mark of the plan may be read as one of them: each is a grey or lies
    # well away from both in hue (common practice, no source: 30 degrees of hue apart)
    for name in ("TUG_FORCE", "NET_FORCE", "WIND", "CURRENT", "TUG_FILL", "HULL_FILL", "QUAY"):
        c = getattr(style, name)
        if c.hsvSaturationF() < 0.35:
            continue
        for side in (style.PORT, style.STARBOARD):
            apart = abs(c.hsvHueF() - side.hsvHueF()) * 360.0
            assert min(apart, 360.0 - apart) >= 30.0, (name, side.name())


def _distance(a: QColor, b: QColor) -> float:
    return math.dist((a.red(), a.green(), a.blue()), (b.red(), b.green(), b.blue()))


# -- shapes ----------------------------------------------------------------------------


@pytest.mark.parametrize("heading_deg", [0.0, 37.0, 90.0, 215.0])
def test_a_placed_tug_is_the_tug_s_size_pointing_its_way(heading_deg: float) -> None:
    a = math.radians(heading_deg)
    d = (math.cos(a), math.sin(a))
    poly = shapely.Polygon(placed_tug((10.0, -4.0), d))
    assert poly.is_valid
    # extent along and across its heading: the tug's length and beam
    along = [(x - 10.0) * d[0] + (y + 4.0) * d[1] for x, y in poly.exterior.coords]
    across = [-(x - 10.0) * d[1] + (y + 4.0) * d[0] for x, y in poly.exterior.coords]
    assert max(along) - min(along) == pytest.approx(TUG_LENGTH_M)
    assert max(across) - min(across) == pytest.approx(TUG_BEAM_M)
    assert max(along) > -min(along)  # the bow is forward of the towing point


def test_a_pushing_tug_rests_its_bow_on_the_push_point() -> None:
    d = (0.0, 1.0)  # pushing north
    origin = tug_origin("push", (0.0, 0.0), (99.0, 99.0), d)
    bow = max(placed_tug(origin, d), key=lambda p: p[1])
    assert bow[0] == pytest.approx(0.0) and -1.0 < bow[1] < 0.0
    # on a line the tug's towing point is the line's far end
    assert tug_origin("line", (0.0, 0.0), (5.0, 40.0), d) == (5.0, 40.0)


def test_an_arrow_head_is_an_isosceles_triangle_on_its_tip() -> None:
    parts = arrow_head((0.0, 0.0), (30.0, 40.0), 10.0)
    assert parts is not None
    shaft_end, (tip, left, right) = parts
    assert tip == (30.0, 40.0)
    assert math.dist(tip, left) == pytest.approx(math.dist(tip, right))
    assert math.dist(left, right) == pytest.approx(2 * HEAD_HALF_WIDTH * 10.0)
    # the shaft ends under the head, on the arrow's line
    assert 0.0 < math.dist(shaft_end, tip) < 10.0
    assert shaft_end[0] * 40.0 - shaft_end[1] * 30.0 == pytest.approx(0.0, abs=1e-9)
    assert arrow_head((1.0, 1.0), (1.0, 1.0), 5.0) is None


@pytest.mark.parametrize("sweep", [90.0, -200.0])
def test_an_arc_arrow_keeps_its_radius_and_turns_its_way(sweep: float) -> None:
    parts = arc_arrow((2.0, 3.0), 10.0, 180.0, sweep, 3.0)
    assert parts is not None
    shaft, (tip, _, _) = parts
    for x, y in shaft:
        assert math.hypot(x - 2.0, y - 3.0) == pytest.approx(10.0)
    end = math.radians(180.0 + sweep)
    assert tip == pytest.approx((2.0 + 10 * math.cos(end), 3.0 + 10 * math.sin(end)))


# -- the polar plots' scale ---------------------------------------------------------------


def test_ring_steps_give_at_most_six_rings() -> None:
    for top in (3.0, 12.0, 25.0, 36.0, 61.0, 140.0, 600.0):
        s = ring_step(top)
        assert s in RING_STEPS
        assert top / s <= 6 or s == RING_STEPS[-1]


def test_the_polar_scale_reaches_past_the_planned_wind_and_follows_the_curve() -> None:
    kn = DisplayUnits()  # speed in knots
    # planned 12 kn: the base is 1.25 x 12 = 15 kn; a curve reaching 23 kn sets the top
    top, step = polar_scale([20 * KNOT, 23 * KNOT], 12 * KNOT, None, kn)
    assert (top, step) == (25.0, 5.0)
    # a curve far out is followed only to 2.5 x the planned wind (30 kn here, the floor)
    top, _ = polar_scale([90 * KNOT], 12 * KNOT, None, kn)
    assert top == pytest.approx(30.0)
    # the stage's limit (22 kn) shows inside the outer ring: 1.1 x 22 = 24.2 -> 25
    top, _ = polar_scale(None, 12 * KNOT, 22 * KNOT, kn)
    assert top == pytest.approx(25.0)


# -- the same plan on screen and on paper -----------------------------------------------


def _share_of(image: QImage, color: QColor) -> int:
    n = 0
    for y in range(0, image.height(), 2):
        for x in range(0, image.width(), 2):
            if _distance(image.pixelColor(x, y), color) < 12:
                n += 1
    return n


def test_the_board_and_the_printed_diagram_paint_tugs_and_pulls_alike(qtbot) -> None:  # type: ignore[no-untyped-def]
    from app.board.render import render_board
    from app.board.scene import BoardScene
    from app.briefing.diagram import StageDiagram
    from app.briefing.layout import Ctx
    from app.controller import Controller
    from core.analysis.checks import check_plan

    project = load(SAMPLES / "twin_barge_move.towboard")
    board = QImage(900, 700, QImage.Format.Format_ARGB32)
    board.fill(QColor("white"))
    p = QPainter(board)
    render_board(BoardScene(Controller(project), stage_index=1), p, QRectF(0, 0, 900, 700))
    p.end()
    paper = QImage(900, 700, QImage.Format.Format_ARGB32)
    paper.fill(QColor("white"))
    p = QPainter(paper)
    check = check_plan(project)[1]
    diagram = StageDiagram(project, check.stage, check.balances, check.clearances)
    diagram.paint(p, Ctx(paper), QRectF(0, 0, 900, 700))
    p.end()
    for color in (style.TUG_FILL, style.TUG_FORCE, style.HULL_FILL):
        assert _share_of(board, color) > 20, color.name()
        assert _share_of(paper, color) > 20, color.name()
