"""A label moved off its anchor is joined to it by a leader that cannot be taken for a
force arrow's shaft.

A load's label sits at the tail of its arrow and takes the load's colour; a short load
arrow (a small current beside the tugs' pulls) with its label moved away read as one
long arrow from the label: a current setting to port looked like a push to starboard.
The leader is dotted, the arrows' shafts are solid, on the board and in the pictures
exported from it (the briefing's diagram draws no leaders).
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QColor, QImage, QPainter
from PySide6.QtWidgets import QStyleOptionGraphicsItem

from tests.app.board.conftest import settle


def _ink_runs(item, width: int, height: int, row: int) -> int:  # type: ignore[no-untyped-def]
    """How many separate stretches of ink ``item`` paints along pixel row ``row`` (its
    origin at the image's (10, row))."""
    image = QImage(width, height, QImage.Format.Format_ARGB32)
    image.fill(QColor("white"))
    painter = QPainter(image)
    painter.translate(QPointF(10, row))
    item.paint(painter, QStyleOptionGraphicsItem(), None)
    painter.end()
    runs, inked = 0, False
    for x in range(width):
        dark = QColor(image.pixel(x, row)).lightness() < 200
        runs += dark and not inked
        inked = dark
    return runs


def test_a_moved_load_label_has_a_dotted_leader_and_its_arrow_a_solid_shaft(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    settle(window, qtbot)
    loads = window.board.bodies["Kestrel 3"].balance.loads
    assert loads, "the sample's first stage has wind and current"
    arrow, label = loads[-1]
    assert "current" in label.text
    label.set_shift(120.0, 0.0)  # as the label placement moves a box that has no room
    leader = label.leader
    assert leader is not None and leader.isVisible()
    assert leader.end.x() > 60 and abs(leader.end.y()) < 20
    # paint the leader along a row: a dotted line is many short stretches of ink
    leader.set_line(QPointF(100.0, 0.0), QColor("black"))
    assert _ink_runs(leader, 140, 20, 10) > 10
    # the load arrow's shaft is one stroke (its pen is solid)
    assert arrow._pen.style() == Qt.PenStyle.SolidLine
