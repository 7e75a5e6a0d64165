"""Pictures of a stage: SVG (vector) and PNG, the board and the diagram."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from pathlib import Path

import numpy as np
import pytest
import shapely
from PySide6.QtCore import QRectF
from PySide6.QtGui import QColor, QImage, QPainter
from PySide6.QtSvg import QSvgRenderer

from app.drawings.pictures import PictureSpec, write_picture
from app.paint import style
from core.errors import InputError
from core.io.projectfile import load
from core.mechanics.site import placed_bodies
from tests.conftest import SAMPLES

SVG = "{http://www.w3.org/2000/svg}"
SAMPLE_FILES = sorted(SAMPLES.glob("*.towboard"))


def _texts(root: ET.Element) -> list[str]:
    return ["".join(t.itertext()).strip() for t in root.iter(f"{SVG}text")]


def _matrix(text: str) -> np.ndarray:
    a, b, c, d, e, f = (float(v) for v in re.findall(r"[-0-9.e+]+", text))
    return np.array([[a, c, e], [b, d, f], [0, 0, 1.0]])


def _hull_paths(root: ET.Element) -> list[np.ndarray]:
    """Every hull drawn (filled with the board's hull colour), as (n, 2) device pixels."""
    out = []
    for g in root.iter(f"{SVG}g"):
        if g.get("fill") != style.HULL_FILL.name() or "transform" not in g.attrib:
            continue
        m = _matrix(g.attrib["transform"])
        for path in g.iter(f"{SVG}path"):
            nums = [float(v) for v in re.findall(r"-?[0-9.]+(?:e-?[0-9]+)?", path.get("d", ""))]
            pts = np.array(nums).reshape(-1, 2)[:-1]  # the last point closes the path
            out.append((np.column_stack([pts, np.ones(len(pts))]) @ m.T)[:, :2])
    return out


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
@pytest.mark.parametrize("kind", ["board", "diagram"])
def test_svg_parses_and_names_every_tug(qapp, tmp_path: Path, path: Path, kind: str) -> None:  # type: ignore[no-untyped-def]
    project = load(path)
    for i, stage in enumerate(project.stages):
        out = tmp_path / f"{kind}{i}.svg"
        write_picture(project, out, PictureSpec(kind, i, 1200, 900, 120))  # type: ignore[arg-type]
        root = ET.parse(out).getroot()
        words = " ".join(_texts(root))
        for placement in stage.placements:
            assert placement.tug in words, (path.name, i, placement.tug)
        assert f"stage {i + 1} of {len(project.stages)}: {stage.name}" in words
        assert "Planning aid only" in words
        # its size on paper follows the pixels and the resolution
        assert root.get("width") == f"{1200 / 120 * 25.4:g}mm"


def test_svg_board_is_the_board_to_scale(qapp, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    """The hull in the SVG lies where the site frame, the shown box and the scale put it."""
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    stage = project.stages[1]
    area = (-60.0, -40.0, 140.0, 110.0)  # site m
    spec = PictureSpec("board", 1, 1000, 800, 96, area)
    drawn = write_picture(project, tmp_path / "b.svg", spec)
    x, y, w, h = drawn.map_rect
    s = min(w / (area[2] - area[0]), h / (area[3] - area[1]))  # px per m, the box fitted
    assert drawn.px_per_m == pytest.approx(s)
    cx, cy = (area[0] + area[2]) / 2, (area[1] + area[3]) / 2
    drawn_hulls = _hull_paths(ET.parse(tmp_path / "b.svg").getroot())
    assert len(drawn_hulls) == 1
    # site frame (core) -> page: centred, north up, s pixels a metre
    body = placed_bodies(project, stage)[0].polygon
    site = np.asarray(body.exterior.coords)[:-1]
    page = np.column_stack([x + w / 2 + (site[:, 0] - cx) * s, y + h / 2 - (site[:, 1] - cy) * s])
    svg_poly = shapely.Polygon(drawn_hulls[0])
    core_poly = shapely.Polygon(page)
    assert svg_poly.symmetric_difference(core_poly).area <= 1e-4 * core_poly.area
    assert svg_poly.area == pytest.approx(body.area * s * s, rel=1e-4)


def _render_svg(path: Path, size: tuple[int, int]) -> QImage:
    img = QImage(*size, QImage.Format.Format_ARGB32)
    img.fill(QColor("white"))
    p = QPainter(img)
    QSvgRenderer(str(path)).render(p, QRectF(0, 0, *size))
    p.end()
    return img


def _array(img: QImage) -> np.ndarray:
    img = img.convertToFormat(QImage.Format.Format_RGB32)
    ptr = img.constBits()
    bgra = np.frombuffer(ptr, np.uint8).reshape(img.height(), img.width(), 4)  # 0xAARRGGBB words
    return bgra[:, :, 2::-1].astype(int)  # (h, w, 3) red, green, blue


@pytest.mark.parametrize("kind", ["board", "diagram"])
def test_svg_and_png_are_the_same_picture(qapp, tmp_path: Path, kind: str) -> None:  # type: ignore[no-untyped-def]
    project = load(SAMPLES / "pontoon_swing.towboard")
    spec = PictureSpec(kind, 0, 800, 600, 96)  # type: ignore[arg-type]
    write_picture(project, tmp_path / "p.svg", spec)
    write_picture(project, tmp_path / "p.png", spec)
    png = _array(QImage(str(tmp_path / "p.png")))
    svg = _array(_render_svg(tmp_path / "p.svg", (800, 600)))
    # the same drawing: nearly every pixel alike (text and anti-aliasing differ a little)
    differ = (np.abs(png - svg).max(axis=2) > 64).mean()
    assert differ < 0.03


@pytest.mark.parametrize(
    ("size", "dpi"), [((640, 480), 96.0), ((1920, 1080), 200.0), ((300, 900), 72.0)]
)
def test_png_has_the_asked_size_and_is_not_blank(qapp, tmp_path: Path, size, dpi) -> None:  # type: ignore[no-untyped-def]
    project = load(SAMPLES / "twin_barge_move.towboard")
    out = tmp_path / "t.png"
    write_picture(project, out, PictureSpec("board", 0, *size, dpi))
    img = QImage(str(out))
    assert (img.width(), img.height()) == size
    assert img.dotsPerMeterX() == round(dpi / 0.0254)
    a = _array(img)
    colours = {tuple(c) for c in a[::4, ::4].reshape(-1, 3).tolist()}
    assert len(colours) > 50
    hull = style.HULL_FILL
    assert (np.abs(a - [hull.red(), hull.green(), hull.blue()]).max(axis=2) <= 2).mean() > 0.005


def test_bad_requests_write_nothing(qapp, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    project = load(SAMPLES / "pontoon_swing.towboard")
    with pytest.raises(InputError, match="stage: 7 is not a stage of the plan"):
        write_picture(project, tmp_path / "x.png", PictureSpec("board", 6))
    with pytest.raises(InputError, match="must end in .svg or .png"):
        write_picture(project, tmp_path / "x.jpg", PictureSpec())
    with pytest.raises(OSError, match="no folder"):
        write_picture(project, tmp_path / "nowhere" / "x.png", PictureSpec())
    with pytest.raises(InputError, match="picture resolution"):
        PictureSpec(dpi=float("nan"))
    with pytest.raises(InputError, match="board area"):
        PictureSpec(area=(0.0, 0.0, -1.0, 5.0))
    with pytest.raises(InputError, match="picture"):
        PictureSpec("chart")  # type: ignore[arg-type]
    assert list(tmp_path.iterdir()) == []
