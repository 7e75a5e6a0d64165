"""The stage diagram's labels never cover one another: where a small wind or current
load and a small yaw moment all sit at the centroid, their labels move beside each
other (app.briefing.mapframe.first_free over spots_near) instead of printing over."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest
from PySide6.QtCore import QPointF, QRectF
from PySide6.QtGui import QColor, QImage, QPainter

from app.briefing import mapframe
from app.briefing.layout import Ctx
from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.plan import Project
from tests.conftest import sample_stages

ROOT = Path(__file__).resolve().parents[2]
CASES = sample_stages()


def _labels(
    monkeypatch, plan: Path | Project, k: int, size: tuple[int, int]
) -> list[tuple[str, QRectF]]:  # type: ignore[no-untyped-def]
    """Every label the stage diagram of stage ``k`` of ``plan`` (a file or a plan) draws
    in a ``size`` px picture."""
    from app.briefing.diagram import StageDiagram

    drawn: list[tuple[str, QRectF]] = []
    label = mapframe.MapFrame.label

    def kept(self, p, at, text, *args, **kwargs):  # type: ignore[no-untyped-def]
        r = label(self, p, at, text, *args, **kwargs)
        if r is not None:
            drawn.append((text, QRectF(r)))
        return r

    monkeypatch.setattr(mapframe.MapFrame, "label", kept)
    project = load(plan) if isinstance(plan, Path) else plan
    check = stage_result(project, k)
    diagram = StageDiagram(
        project, check.stage, tuple(b.balance for b in check.worked), check.clearances
    )
    image = QImage(*size, QImage.Format.Format_ARGB32)
    image.fill(QColor("white"))
    p = QPainter(image)
    diagram.paint(p, Ctx(image), QRectF(0, 0, *size))
    p.end()
    return drawn


@pytest.mark.parametrize("size", [(1100, 800), (700, 520)], ids=["large", "small"])
@pytest.mark.parametrize(("path", "k"), CASES)
def test_no_label_of_a_stage_diagram_covers_another(
    qapp, monkeypatch, path: Path, k: int, size: tuple[int, int]
) -> None:  # type: ignore[no-untyped-def]
    _apart(_labels(monkeypatch, path, k, size))


def _apart(drawn: list[tuple[str, QRectF]]) -> None:
    assert len(drawn) >= 4  # the tugs, the sides, the body's name at least
    for i, (a, ra) in enumerate(drawn):
        for b, rb in drawn[i + 1 :]:
            both = ra.intersected(rb)
            assert both.width() <= 0.5 or both.height() <= 0.5, (a, b, both)


def test_a_touching_clearance_is_labelled_clear_of_the_side_marks(qapp, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """A body on the quay: the clearance line has no length, so the spots along it are
    one point (under the side mark); the label takes a spot round it instead."""
    plan = load(ROOT / "sample_projects" / "twin_barge_move.towboard")
    stage = plan.stages[0]
    (pose,) = stage.poses
    near = min(stage_result(plan, 0).clearances, key=lambda c: c.distance_m)
    moved = replace(pose, y=pose.y - near.distance_m)  # the quay lies to the south
    plan = plan.with_stage(replace(stage, poses=(moved,)), 0)
    assert any(c.touching for c in stage_result(plan, 0).clearances)
    drawn = _labels(monkeypatch, plan, 0, (1100, 800))
    assert any(text.startswith("touching ") for text, _ in drawn)
    _apart(drawn)


def test_the_yaw_moment_and_the_loads_at_the_centroid_are_all_labelled(qapp, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """Twin barge stage 1: a 0.3 kn current, a light wind and a yaw of a few t·m, all at
    the pair's centroid; each label is printed, each within a few label heights of it."""
    path = ROOT / "sample_projects" / "twin_barge_move.towboard"
    drawn = dict(_labels(monkeypatch, path, 0, (1100, 800)))
    yaw = next(t for t in drawn if t.startswith("yaw "))
    reach = 4 * drawn["wind"].height()
    centre = drawn["wind"].center()
    for text in ("wind", "current", yaw):
        d = drawn[text].center() - centre
        assert QPointF.dotProduct(d, d) ** 0.5 < reach + drawn[text].width() / 2, text


def test_spots_near_start_where_asked_and_move_a_box_away(qapp) -> None:  # type: ignore[no-untyped-def]
    image = QImage(400, 300, QImage.Format.Format_ARGB32)
    frame = mapframe.MapFrame(Ctx(image), QRectF(0, 0, 400, 300), (0.0, 0.0, 100.0, 80.0))
    at = QPointF(200, 150)
    spots = frame.spots_near(at, "wind", 6.0)
    box = frame.label_rect(at, "wind", 6.0, False)
    assert spots[0] == at and len(spots) == 17
    below, above, right = spots[1], spots[2], spots[3]
    assert below.y() - at.y() >= box.height() and at.y() - above.y() >= box.height()
    assert right.x() - at.x() >= box.width() / 2
