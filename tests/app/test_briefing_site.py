"""The site in print: each stage diagram framed on its nearest features, every clearance
line saying what it measures, and an overview of the whole move near the front."""

from __future__ import annotations

from pathlib import Path

import pytest
import shapely
from PySide6.QtCore import QRectF
from PySide6.QtGui import QColor, QImage, QPainter

from app.briefing.layout import Ctx
from core.analysis.stage import plan_results, stage_result
from core.io.projectfile import load
from core.mechanics.clearance import least_per_body, notable_clearances
from tests.app.test_briefing import norm, pages_text
from tests.conftest import sample_stages

ROOT = Path(__file__).resolve().parents[2]


CASES = sample_stages()


@pytest.mark.parametrize(("path", "k"), CASES)
def test_each_stage_diagram_frames_the_feature_that_sets_the_least_clearance(
    qapp, path: Path, k: int
) -> None:  # type: ignore[no-untyped-def]
    from app.briefing.diagram import StageDiagram

    project = load(path)
    check = stage_result(project, k)
    balances = tuple(b.balance for b in check.worked)
    diagram = StageDiagram(project, check.stage, balances, check.clearances)
    image = QImage(1100, 800, QImage.Format.Format_ARGB32)
    image.fill(QColor("white"))
    p = QPainter(image)
    diagram.paint(p, Ctx(image), QRectF(0, 0, 1100, 800))
    p.end()
    view = diagram.frame.view  # what the map shows, site m
    nearest = least_per_body(check.clearances)
    assert nearest or not project.site.features
    for c in nearest.values():
        if c.outside_limit:
            continue
        # both ends of the least clearance, so the nearest point of the feature, are on the map
        for end in (c.at_body, c.at_other):
            assert shapely.contains_xy(view, *end), (c.other, end)
        # and the feature itself shows there (shapely: the feature's outline meets the view)
        feature = next(f for f in project.site.features if f.name == c.other)
        assert shapely.LineString([*feature.points, feature.points[0]]).intersects(view)
    # every body and every tug is on the map too
    for pb in diagram.placed:
        assert view.contains(pb.polygon)
    for t in diagram.tugs:
        assert view.contains(shapely.Polygon(diagram.tug_outline(t)))


@pytest.fixture(scope="module")
def twin(tmp_path_factory, qapp):  # type: ignore[no-untyped-def]
    from app.briefing.document import write_pdf

    project = load(ROOT / "sample_projects" / "twin_barge_move.towboard")
    out = tmp_path_factory.mktemp("site") / "twin.pdf"
    write_pdf(project, out)
    return project, pages_text(out)


def test_every_clearance_line_is_labelled_with_what_it_measures(twin) -> None:  # type: ignore[no-untyped-def]
    from app.briefing.diagram import clearance_text

    project, texts = twin
    whole = " ".join(texts)
    drawn = 0
    for check in plan_results(project):
        for c in notable_clearances(check.clearances):
            text = clearance_text(c, project.units)
            assert c.other in text and project.units.show(c.distance_m, "length") in text
            assert norm(text) in whole, text
            drawn += 1
    assert drawn >= len(project.stages)  # at least each stage's least clearance


def test_the_overview_page_follows_the_cover_with_every_stage(twin) -> None:  # type: ignore[no-untyped-def]
    project, texts = twin
    k = next(k for k, t in enumerate(texts) if "Overview of the move" in t)
    assert k <= 2  # right after the cover (one or two pages)
    assert "Units, frames and assumptions" not in " ".join(texts[:k])
    page = texts[k]
    for i, s in enumerate(project.stages, start=1):
        assert f"{i} {s.name} {s.kind}" in page, s.name
        for pose in s.poses:
            assert f"{pose.body} at ({pose.x:.1f}, {pose.y:.1f}) m, heading" in page
    assert "Scale 1 :" in page and "N" in page
