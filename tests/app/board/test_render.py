"""Any stage's board drawn without a window, into an image and a PDF page."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QRectF
from PySide6.QtGui import QColor, QImage, QPageSize, QPainter, QPdfWriter

from app.board.render import render_board
from app.board.scene import BoardScene
from app.controller import Controller
from core.analysis.stage import stage_result
from core.io.projectfile import load
from tests.app.board.conftest import SAMPLE


def _colours(image: QImage) -> int:
    return len(
        {image.pixel(x, y) for y in range(0, image.height(), 2) for x in range(0, image.width(), 2)}
    )


def test_a_fixed_stage_scene_draws_that_stage(qtbot, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    c = Controller(load(SAMPLE))
    scene = BoardScene(c, stage_index=1)
    assert c.stage_index == 0  # the controller's own stage is not touched
    ref = stage_result(c.project, 1).body("Kestrel 3").balance
    tugs = scene.bodies["Kestrel 3"].tugs
    for share in ref.shares:
        assert c.project.units.show(share.pull_n, "force") in tugs[share.tug].label.text
    image = QImage(800, 600, QImage.Format.Format_ARGB32)
    image.fill(QColor("white"))
    painter = QPainter(image)
    scale = render_board(scene, painter, QRectF(0, 0, 800, 600))
    painter.end()
    image.save(str(tmp_path / "stage2.png"))
    assert _colours(image) > 100
    # to scale: the 84 m hull spans 84 m times the returned pixels per metre
    assert 84 * scale < 800


def test_a_pdf_page_gets_readable_labels(qtbot, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    c = Controller(load(SAMPLE))
    scene = BoardScene(c, stage_index=0)
    pdf = tmp_path / "board.pdf"
    writer = QPdfWriter(str(pdf))
    writer.setPageSize(QPageSize(QPageSize.PageSizeId.A4))
    writer.setResolution(1200)
    painter = QPainter(writer)
    rect = writer.pageLayout().paintRectPixels(1200)
    render_board(scene, painter, QRectF(0, 0, rect.width(), rect.height() / 2))
    painter.end()
    import unicodedata

    from pypdf import PdfReader

    raw = unicodedata.normalize("NFKC", PdfReader(str(pdf)).pages[0].extract_text())
    text = " ".join(raw.split())  # the PDF's text breaks words with tabs
    main = stage_result(c.project, 0).main
    assert main is not None
    net = c.project.units.show(main.balance.net_magnitude, "force")
    for name in ("Gannet", "Puffin", "Tern", "BOW", "STERN", f"net force {net}"):
        assert name in text
