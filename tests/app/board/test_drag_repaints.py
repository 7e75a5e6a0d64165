"""What a drag's mouse move leaves alone, and what the drag's end puts right.

The line of action is drawn in pieces so a move repaints a band along it, not its whole
bounding box; the hull's selection is not shown again when it did not change; the
balance panel's figures are not selectable while they change on every move and are
again, with the final figures, once the drag ends, and they keep their sizes while they
change, so the panel is not laid out again on every move; the drift layer, when off, tells its
panel nothing on every move.
"""

from __future__ import annotations

import itertools
import math

from PySide6.QtCore import QCoreApplication, QEvent, QLineF, QObject, Qt
from PySide6.QtGui import QColor, QImage, QPainter

from app.board.items import PiecedLine
from core.model.hull import Fitting


def _drag_step(c, tug: str, turn: float) -> None:  # type: ignore[no-untyped-def]
    stage = c.stage
    p = stage.placement(tug)
    c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + turn))))


def _main_drawing(window):  # type: ignore[no-untyped-def]
    return window.board.bodies[window.controller.main_body()]


def test_the_line_of_action_is_in_pieces_along_the_equivalent_force(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    tug = c.stage.placements[0].tug
    _drag_step(c, tug, 0.3)
    d = _main_drawing(window)
    action = d.balance.action
    assert isinstance(action, PiecedLine) and action.isVisible()
    eq = c.balance().equivalent
    assert eq.kind == "force"
    pieces = [item.line() for item in action.pieces]
    whole = action.line()
    # end to end: each piece starts where the one before it ended, the first at the start
    assert pieces[0].p1() == whole.p1()
    for a, b in itertools.pairwise(pieces):
        assert math.dist((a.p2().x(), a.p2().y()), (b.p1().x(), b.p1().y())) < 1e-9
    assert (
        math.dist((pieces[-1].p2().x(), pieces[-1].p2().y()), (whole.p2().x(), whole.p2().y()))
        < 1e-9
    )
    # and on the equivalent force's line of action (its point, its direction)
    px, py = eq.point
    ux, uy = eq.direction
    for line in pieces:
        for q in (line.p1(), line.p2()):
            assert abs((q.x() - px) * uy - (q.y() - py) * ux) < 1e-6 * whole.length()
    # the dashes run on across the joins: every piece counts them from the line's start
    assert all(item.dash_from == whole.p1() for item in action.pieces)
    # each piece's box is a small part of the whole line's box (what a move repaints)
    box = QLineF(whole).p2() - whole.p1()
    whole_area = abs(box.x() * box.y())
    for item in action.pieces:
        r = item.boundingRect()
        assert r.width() * r.height() < whole_area / 100
    c.cancel_preview()


def test_a_pieced_dashed_line_draws_as_the_whole_line_does(qapp) -> None:  # type: ignore[no-untyped-def]
    from PySide6.QtWidgets import QGraphicsScene

    from app.board.items import LineItem
    from app.paint import style

    pen = style.pen(QColor("black"), 1.0, Qt.PenStyle.DashLine)
    line = QLineF(3.0, 5.0, 290.0, 37.0)

    def picture(pieces: int) -> QImage:
        scene = QGraphicsScene(0, 0, 300, 50)
        scene.setBackgroundBrush(QColor("white"))
        if pieces:
            pieced = PiecedLine(None, pieces)
            for item in pieced.pieces:
                scene.addItem(item)
            pieced.setPen(pen)
            pieced.setLine(line)
        else:
            whole = LineItem()
            whole.setPen(pen)
            whole.setLine(line)
            scene.addItem(whole)
        img = QImage(300, 50, QImage.Format.Format_ARGB32)
        img.fill(QColor("white"))
        p = QPainter(img)
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        scene.render(p)
        p.end()
        return img

    def dark(img: QImage) -> set[tuple[int, int]]:
        return {
            (x, y)
            for x in range(img.width())
            for y in range(img.height())
            if img.pixelColor(x, y).value() < 128
        }

    whole, pieced = dark(picture(0)), dark(picture(7))
    assert whole  # something was drawn
    # the same dashes: at most a pixel's rounding at a join differs
    assert len(whole ^ pieced) <= 7 * 2


def test_an_unchanged_selection_is_not_shown_again_and_a_new_fitting_still_shows_it(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    board = window.board
    hull = c.project.hulls[0]
    drawing = next(d for d in board.bodies.values() if hull.name in d.hulls).hulls[hull.name]
    fitting = hull.fittings[0].name
    board.select(("fitting", hull.name, fitting))
    mark, label = drawing.fittings[fitting]
    assert mark.selected and label.isVisible()
    calls: list[int] = []
    show = drawing.show_handles
    drawing.show_handles = lambda *a: (calls.append(1), show(*a))  # type: ignore[method-assign]
    tug = c.stage.placements[0].tug
    for k in range(1, 4):
        _drag_step(c, tug, 0.1 * k)
    assert calls == []  # a refresh in a drag: the same selection is left as it is
    c.cancel_preview()
    # a fitting added to the hull: the marks are made again, and the selection with them
    f0 = hull.fittings[0]
    added = Fitting("X-new", f0.kind, f0.x, f0.y)
    c.apply(c.project.with_hull(hull.with_fitting(added)), "add")
    assert calls != []
    mark, label = drawing.fittings[fitting]
    new_mark, new_label = drawing.fittings["X-new"]
    assert mark.selected and label.isVisible()
    assert not new_mark.selected and not new_label.isVisible()
    board.select(("fitting", hull.name, "X-new"))
    assert new_mark.selected and not mark.selected


def test_the_balance_figures_wait_to_be_selectable_until_the_drag_ends(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    panel = window.balance_panel
    selectable = Qt.TextInteractionFlag.TextSelectableByMouse
    assert all(lab.textInteractionFlags() & selectable for lab in panel.fields.values())
    tug = c.stage.placements[0].tug

    def shown() -> list[str]:
        return [lab.text() for lab in panel.fields.values()]

    before = shown()
    for k in range(1, 4):
        _drag_step(c, tug, 0.15 * k)
        assert not any(lab.textInteractionFlags() & selectable for lab in panel.fields.values())
    during = shown()
    assert during != before
    c.commit_preview("turn the line")
    # after the drag: selectable again, and the figures are the stage result's own
    assert all(lab.textInteractionFlags() & selectable for lab in panel.fields.values())
    b = c.stage_result().bodies[0].balance
    from app import formatting as fmt

    u = c.project.units
    assert panel.fields["net"].text() == fmt.value(u, b.equivalent.magnitude, "force")
    assert (
        panel.fields["moment_centroid"]
        .text()
        .startswith(fmt.signed(u, b.equivalent.moment, "moment"))
    )
    assert shown() == during  # the last move's figures are the final ones


class _Layouts(QObject):
    """Counts the layout requests that reach a widget."""

    def __init__(self) -> None:
        super().__init__()
        self.count = 0

    def eventFilter(self, obj, event) -> bool:  # type: ignore[no-untyped-def]
        if event.type() == QEvent.Type.LayoutRequest:
            self.count += 1
        return False


def test_the_balance_figures_keep_their_sizes_while_a_drag_changes_them(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    panel = window.balance_panel
    inner = panel.fields["net"].parentWidget()
    tug = c.stage.placements[0].tug
    _drag_step(c, tug, 0.05)  # the first move: the verdict says it is updating
    qtbot.wait(200)  # (longer than the verdict's delay: nothing of before the drag is left)
    layouts = _Layouts()
    inner.installEventFilter(layouts)
    texts = []
    for k in range(2, 6):
        _drag_step(c, tug, 0.05 * k)
        QCoreApplication.processEvents()
        texts.append(panel.fields["net"].text())
    inner.removeEventFilter(layouts)
    assert len(set(texts)) > 1  # the figures changed ...
    assert layouts.count == 0  # ... and the panel was not laid out again
    assert all(lab.minimumSize() == lab.maximumSize() for lab in panel.fields.values())
    c.commit_preview("turn the line")
    # after the drag the figures are sized by the layout again and show the result's
    assert all(lab.maximumWidth() > 10_000 for lab in panel.fields.values())
    assert all(lab.minimumSize().isNull() for lab in panel.fields.values())
    assert panel.fields["net"].text() == texts[-1]


def test_a_verdict_due_from_before_a_drag_waits_for_its_end(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    verdict = window.balance_panel.verdict
    c.invalidate()  # a change: the verdict is read again shortly
    assert verdict._timer.isActive()
    tug = c.stage.placements[0].tug
    _drag_step(c, tug, 0.1)
    assert not verdict._timer.isActive()  # not on a plan the mouse is still moving
    qtbot.wait(250)
    # it says the verdict shown is old: "updating", or "working out" when the plan just
    # opened had not been read yet
    assert "updating" in verdict.says() or "working the verdict out" in verdict.says()
    c.commit_preview("turn the line")
    qtbot.waitUntil(lambda: "updating" not in verdict.says() and "working" not in verdict.says())
    assert verdict.verdict is c.stage_result().verdict


def test_a_held_figure_that_needs_more_lines_gets_them(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    panel = window.balance_panel
    tug = c.stage.placements[0].tug
    _drag_step(c, tug, 0.1)
    lab = panel.fields["net_words"]
    assert lab.minimumSize() == lab.maximumSize()  # held
    height = lab.height()
    panel._set("net_words", " ".join(["a long reason that wraps"] * 12))
    assert lab.maximumWidth() > 10_000  # let go: the layout gives it its lines
    qtbot.waitUntil(lambda: lab.height() > height)
    c.cancel_preview()
    assert lab.text() == c.balance().walking


def test_the_drift_layer_when_off_tells_its_panel_nothing_during_a_drag(window) -> None:  # type: ignore[no-untyped-def]
    ui = window.drift_ui
    assert not ui.layer.enabled
    told: list[int] = []
    ui.layer.updated.connect(lambda: told.append(1))
    c = window.controller
    tug = c.stage.placements[0].tug
    for k in range(1, 4):
        _drag_step(c, tug, 0.1 * k)
    c.cancel_preview()
    assert told == []
    ui.set_enabled(True)  # switched on, it shows; off again, it says so once
    told.clear()
    ui.set_enabled(False)
    assert len(told) == 1
    assert "off" in ui.panel.outcome.text()
