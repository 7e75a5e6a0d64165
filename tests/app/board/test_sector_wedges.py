"""Working sectors on the board: a wedge at each tug's point with a sector, its edges
dragged with the mouse (one undo step per drag), errors kept out of Qt."""

from __future__ import annotations

import math

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from scipy.optimize import brentq

from app.board.sector_layer import SectorLayer, SectorWedge
from app.edits import sectors
from core.frames import bearing_to_angle
from core.mechanics.leads import CLEAR_STEP_DEG
from core.mechanics.tugsets import used_arc
from tests.app.board.conftest import move_with_button


def _knob_px(window, tug: str, which: str):  # type: ignore[no-untyped-def]
    knob = dict(zip(("low", "high"), window.board.sectors.knobs[tug], strict=True))[which]
    assert knob.isVisible()
    return window.view.mapFromScene(knob.scenePos())


def _body_px(window, x: float, y: float):  # type: ignore[no-untyped-def]
    """The viewport pixel of body-frame point (x, y) of Kestrel 3, m."""
    root = window.board.bodies["Kestrel 3"].root
    return window.view.mapFromScene(root.mapToScene(QPointF(x, y)))


def _select(qtbot, window, tug: str) -> None:  # type: ignore[no-untyped-def]
    item = window.board.bodies["Kestrel 3"].tugs[tug].glyph
    at = window.view.mapFromScene(item.mapToScene(item.glyph.boundingRect().center()))
    qtbot.mouseClick(window.view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    assert window.board.selected_tug() == tug


def test_each_placement_with_a_sector_has_a_wedge(window) -> None:
    c = window.controller
    layer = window.board.sectors
    assert set(layer.wedges) == {p.tug for p in c.stage.placements if p.lead_sector_rad}
    # knobs only on the selected tug's wedge
    assert not any(k.isVisible() for pair in layer.knobs.values() for k in pair)
    stage = c.stage
    c.apply(c.with_stage(stage.with_placement(stage.placement("Puffin").with_sector(None))), "x")
    assert "Puffin" not in layer.wedges
    w = layer.wedges["Gannet"]
    # Gannet's line wedge reaches the tug: its radius is the line's length
    assert w.radius == stage.placement("Gannet").line_length_m


def test_dragging_a_wedge_edge_moves_one_limit_in_one_undo_step(window, qtbot) -> None:
    c = window.controller
    before = c.project
    old = c.stage_result().main.hold_limits.all_tugs_ms.copy()
    _select(qtbot, window, "Gannet")
    body = c.results()["Kestrel 3"].body
    start, end, _ = sectors.sector_bearings(body, c.stage.placement("Gannet"))
    assert (start, end) == pytest.approx((60.0, 140.0))
    wedge = window.board.sectors.wedges["Gannet"]
    ax, ay, r = wedge.apex.x(), wedge.apex.y(), wedge.radius
    vp = window.view.viewport()
    qtbot.mousePress(vp, Qt.MouseButton.LeftButton, pos=_knob_px(window, "Gannet", "high"))
    # round the bow point from the 060 edge to bearing 020.4, a few degrees a move
    for bearing in np.linspace(58.0, 20.4, 12):
        a = bearing_to_angle(float(bearing))
        move_with_button(window.view, _body_px(window, ax + r * math.cos(a), ay + r * math.sin(a)))
    assert c.previewing
    qtbot.mouseRelease(vp, Qt.MouseButton.LeftButton, pos=_body_px(window, ax, ay - r))
    assert not c.previewing
    p = c.stage.placement("Gannet")
    got = sectors.sector_bearings(body, p)
    assert got == pytest.approx((20.0, 140.0, 120.0))  # whole degrees; the other limit kept
    assert c.undo_stack.count() == 1 and c.undo_stack.undoText() == "Working sector of Gannet"
    # the stage result is the core's for the new sector, and a wider sector holds as much
    new = c.stage_result().main.hold_limits.all_tugs_ms
    assert np.all(new >= old * (1 - 1e-3))  # the sector polygons' chord error (tugsets)
    c.undo_stack.undo()
    assert c.project == before


def test_a_drag_past_the_other_edge_stops_at_no_width(window, qtbot) -> None:
    c = window.controller
    _select(qtbot, window, "Gannet")
    wedge = window.board.sectors.wedges["Gannet"]
    ax, ay, r = wedge.apex.x(), wedge.apex.y(), wedge.radius
    vp = window.view.viewport()
    qtbot.mousePress(vp, Qt.MouseButton.LeftButton, pos=_knob_px(window, "Gannet", "high"))
    for bearing in np.linspace(62.0, 170.0, 30):  # clockwise past the 140 edge
        a = bearing_to_angle(float(bearing))
        move_with_button(window.view, _body_px(window, ax + r * math.cos(a), ay + r * math.sin(a)))
    qtbot.mouseRelease(vp, Qt.MouseButton.LeftButton)
    p = c.stage.placement("Gannet")
    assert p.sector_width_rad == 0.0
    body = c.results()["Kestrel 3"].body
    assert sectors.sector_bearings(body, p)[:2] == pytest.approx((140.0, 140.0))


def test_an_error_in_a_drag_changes_nothing_and_is_said(window, qtbot, monkeypatch) -> None:
    from app.guard import REPORTER

    c = window.controller
    before = c.project
    said: list[str] = []
    REPORTER.said.connect(said.append)  # the board's guard says a fault there
    _select(qtbot, window, "Gannet")

    def broken(self, drag, pos, coarse):  # type: ignore[no-untyped-def]
        raise RuntimeError("broken on purpose")

    monkeypatch.setattr(SectorLayer, "move", broken)
    vp = window.view.viewport()
    at = _knob_px(window, "Gannet", "high")
    try:
        with qtbot.capture_exceptions() as faults:  # a fault also reaches sys.excepthook
            qtbot.mousePress(vp, Qt.MouseButton.LeftButton, pos=at)
            move_with_button(window.view, at + type(at)(15, 15))
            qtbot.mouseRelease(vp, Qt.MouseButton.LeftButton)
    finally:
        REPORTER.said.disconnect(said.append)
    assert [str(f[1]) for f in faults] == ["broken on purpose"]
    assert any("broken on purpose" in s for s in said)
    assert c.project == before and c.undo_stack.count() == 0


def test_a_wedge_that_fails_to_paint_draws_nothing_and_raises_nothing(
    window, monkeypatch, capsys
) -> None:
    from app.board import sector_layer

    class Broken:
        def __getattr__(self, name: str) -> object:
            raise RuntimeError("paint broken on purpose")

    monkeypatch.setattr(sector_layer, "style", Broken())  # the wedges' and knobs' palette
    window.board.select(("tug", "Gannet"))  # its knobs are painted too
    window.view.viewport().grab()  # paints every wedge
    assert "paint broken on purpose" in capsys.readouterr().err
    assert isinstance(window.board.sectors.wedges["Gannet"], SectorWedge)


def test_a_printed_board_has_no_wedges(window) -> None:
    from app.board.scene import BoardScene

    printed = BoardScene(window.controller, stage_index=0)
    assert printed.sectors.wedges == {}
    assert not any(isinstance(i, SectorWedge) for i in printed.items())


def test_wedges_follow_another_plan_opened_and_a_tug_removed(window, qtbot) -> None:
    from tests.conftest import SAMPLES

    errors: list[str] = []
    window.controller.message.connect(errors.append)
    for name in ("pontoon_swing", "twin_barge_move", "deck_barge_unberth"):
        assert window.open_path(SAMPLES / f"{name}.towboard", ask=False)
        c = window.controller
        for i in range(len(c.project.stages)):
            c.set_stage_index(i)
            want = {p.tug for p in c.stage.placements if p.lead_sector_rad is not None}
            assert set(window.board.sectors.wedges) == want
            assert all(w.scene() is window.board for w in window.board.sectors.wedges.values())
    c = window.controller
    c.set_stage_index(0)
    c.apply(c.project.without_tug("Gannet"), "Remove Gannet")
    assert "Gannet" not in window.board.sectors.wedges
    c.undo_stack.undo()
    assert "Gannet" in window.board.sectors.wedges
    assert not errors


# -- the part of a sector the solve uses ----------------------------------------------------


def _at(wedge: SectorWedge, lead: float, share: float = 0.5) -> QPointF:
    """A point inside ``wedge`` at body-frame angle ``lead`` (rad), ``share`` of its radius."""
    r = share * wedge.radius
    return QPointF(wedge.apex.x() + r * math.cos(lead), wedge.apex.y() + r * math.sin(lead))


def _core_used(window, tug: str):  # type: ignore[no-untyped-def]
    """The core's used arc of ``tug``'s sector in the stage shown (tugsets.used_arc)."""
    layout = window.controller.results()["Kestrel 3"].layout
    i = next(k for k, p in enumerate(layout.placements) if p.tug == tug)
    return used_arc(layout, i), float(layout.lead_frame_rad[i])


def test_the_wedge_fills_the_leads_the_solve_uses_and_hatches_the_rest(window) -> None:
    # Stage 1: Gannet on a 45 m line from the bow centre bitt (84, 0) of Kestrel 3, sector
    # leads -140..-60 degrees (starboard, aft of the beam). The deck's starboard shoulder
    # runs from (84, -9) to (75, -12), so a line at lead a crosses the deck for
    # t(a) = 9 / (cos(a) / 3 - sin(a)) before it leaves the hull; it may lie over the hull
    # for half the breadth and 2 m, 24 / 2 + 2 = 14 m (core.mechanics.leads). Clear while
    # t(a) <= 14: from the edge lead below up to -60.
    c = window.controller
    edge = math.degrees(
        brentq(
            lambda a: 9 / (math.cos(a) / 3 - math.sin(a)) - 14.0,
            math.radians(-135),
            math.radians(-100),
        )
    )
    wedge = window.board.sectors.wedges["Gannet"]
    (lo, hi), frame = _core_used(window, "Gannet")
    assert frame == 0.0  # the hull's ahead: the body frame's x
    assert wedge.used == pytest.approx((frame + lo, hi - lo), abs=1e-12)  # the core's arc
    # the first lead tried that is clear (the hull taken EDGE_M in lets it be a hair past)
    assert edge - 0.5 <= math.degrees(wedge.used[0]) <= edge + CLEAR_STEP_DEG
    assert math.degrees(wedge.used[0] + wedge.used[1]) == pytest.approx(-60.0)
    # the used part is filled, the part over the shoulder hatched, each holding its leads
    assert wedge.used_path.contains(_at(wedge, math.radians(-90)))
    assert not wedge.used_path.contains(_at(wedge, math.radians(-134)))
    assert wedge.unused_path.contains(_at(wedge, math.radians(-134)))
    assert not wedge.unused_path.contains(_at(wedge, math.radians(-90)))
    # the knobs stay on the sector's own ends (lead -140), not on the used part's
    window.board.select(("tug", "Gannet"))
    low = window.board.sectors.knobs["Gannet"][0]
    a = math.radians(-140)
    assert (low.pos().x(), low.pos().y()) == pytest.approx(
        (84 + 45 * math.cos(a), 45 * math.sin(a)), abs=1e-9
    )
    # A whole circle: clear from -edge round ahead to +edge (the bow is symmetric), wider
    # than half a turn, so the half turn about its middle (ahead) is used: -90..90.
    stage = c.stage
    whole = stage.placement("Gannet").with_sector((-math.pi, math.pi))
    c.apply(c.with_stage(stage.with_placement(whole)), "whole circle")
    (lo, hi), _ = _core_used(window, "Gannet")
    assert wedge.used == pytest.approx((lo, hi - lo), abs=1e-12)
    # (the core's arc of a whole circle may be given a turn round)
    assert math.remainder(wedge.used[0] + math.pi / 2, 2 * math.pi) == pytest.approx(0, abs=1e-9)
    assert wedge.used[1] == pytest.approx(math.pi)
    assert wedge.unused_path.contains(_at(wedge, math.pi))  # astern, over the deck
    assert wedge.unused_path.contains(_at(wedge, math.radians(110)))  # clear, but cut off
    assert wedge.used_path.contains(_at(wedge, math.radians(80)))


def test_a_sector_with_no_clear_lead_is_hatched_whole(window) -> None:
    # Gannet's sector led astern from the bow centre bitt (171.9..183.3 degrees): every line
    # runs the length of the 84 m deck, far over its 14 m allowance.
    c = window.controller
    stage = c.stage
    c.apply(
        c.with_stage(stage.with_placement(stage.placement("Gannet").with_sector((3.0, 3.2)))), "x"
    )
    wedge = window.board.sectors.wedges["Gannet"]
    assert _core_used(window, "Gannet")[0] is None
    assert wedge.used is None
    assert wedge.used_path.isEmpty()
    assert wedge.unused_path.contains(_at(wedge, 3.1))
    # the whole wedge, from the apex out to the rim at both ends
    box = wedge.unused_path.boundingRect().adjusted(-1e-6, -1e-6, 1e-6, 1e-6)
    for lead in (3.0, 3.2):
        assert box.contains(_at(wedge, lead, 1.0))
    assert box.contains(wedge.apex)


def test_the_used_part_follows_a_drag_of_the_sectors_edge(window, qtbot) -> None:
    # Gannet's low edge (lead -140, bearing 140) dragged to bearing 100 (lead -100): every
    # lead from -100 to -60 is clear of the shoulder (edge near -124, above), so all of
    # it is used; on to bearing 150 (lead -150), the part aft of the edge is hatched again.
    c = window.controller
    _select(qtbot, window, "Gannet")
    wedge = window.board.sectors.wedges["Gannet"]
    ax, ay, r = wedge.apex.x(), wedge.apex.y(), wedge.radius
    vp = window.view.viewport()
    qtbot.mousePress(vp, Qt.MouseButton.LeftButton, pos=_knob_px(window, "Gannet", "low"))

    def to(bearings) -> None:  # type: ignore[no-untyped-def]
        for bearing in bearings:
            a = bearing_to_angle(float(bearing))
            move_with_button(
                window.view, _body_px(window, ax + r * math.cos(a), ay + r * math.sin(a))
            )

    to(np.linspace(138.0, 100.2, 12))
    assert c.previewing
    assert c.stage.placement("Gannet").lead_sector_rad == pytest.approx(
        (math.radians(-100), math.radians(-60))
    )
    assert wedge.used == pytest.approx((math.radians(-100), math.radians(40)), abs=1e-9)
    assert wedge.unused_path.isEmpty()
    to(np.linspace(102.0, 149.8, 20))
    assert c.previewing
    (lo, hi), _ = _core_used(window, "Gannet")
    assert math.degrees(lo) < -120.0  # the edge of the clear leads, as at rest
    assert wedge.used == pytest.approx((lo, hi - lo), abs=1e-12)
    assert wedge.unused_path.contains(_at(wedge, math.radians(-145)))
    qtbot.mouseRelease(vp, Qt.MouseButton.LeftButton)
