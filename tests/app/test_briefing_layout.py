"""Laying the briefing into pages: one pass, groups kept together, text measured once."""

from __future__ import annotations

import pytest
from PySide6.QtGui import QPageSize, QPdfWriter

from app.briefing.layout import Ctx, Group, PageBreak, Spacer, Text, heading, paginate


@pytest.fixture
def ctx(qapp, tmp_path):  # type: ignore[no-untyped-def]
    w = QPdfWriter(str(tmp_path / "m.pdf"))
    w.setResolution(300)
    w.setPageSize(QPageSize(QPageSize.PageSizeId.A4))
    yield Ctx(w)
    del w


def _texts(page) -> list[str]:  # type: ignore[no-untyped-def]
    return [getattr(p.block, "text", "") for p in page]


def test_a_group_that_fits_stays_and_one_that_does_not_starts_a_page(ctx) -> None:  # type: ignore[no-untyped-def]
    width, avail = ctx.mm(180), ctx.mm(100)
    body = [Text("top"), Spacer(70)]
    more = heading("Stage 1 (continued)", 1)
    small = Group([Text("fits"), Text("here")], more)
    big = Group([Text("tug lost"), Spacer(40), Text("end")], more)
    pages = paginate([*body, small, big], ctx, width, avail)
    assert len(pages) == 2
    assert "fits" in _texts(pages[0]) and "here" in _texts(pages[0])
    # the group that does not fit opens the next page, led by its "continued" heading
    assert _texts(pages[1])[:2] == ["Stage 1 (continued)", "tug lost"]
    # a group already at the top of a page is never pushed on
    pages = paginate([PageBreak(), big], ctx, width, avail)
    assert _texts(pages[0])[0] == "tug lost"


def test_a_heading_is_kept_with_what_follows(ctx) -> None:  # type: ignore[no-untyped-def]
    width, avail = ctx.mm(180), ctx.mm(100)
    pages = paginate(
        [Text("top"), Spacer(88), heading("Balance", 2), Text("net force")], ctx, width, avail
    )
    assert _texts(pages[1]) == ["Balance", "net force"]


def test_each_text_is_measured_once(ctx, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    calls = []
    metrics = ctx.metrics(8.5)
    real = type(metrics).boundingRect

    class Counting(type(metrics)):  # type: ignore[misc]
        def boundingRect(self, *args):  # type: ignore[no-untyped-def]
            calls.append(args[-1])
            return real(self, *args)

    ctx._metrics[(8.5, False, False)] = Counting(ctx.font(8.5), ctx.device)
    blocks = [Text(f"line {k % 7}") for k in range(300)]
    paginate(blocks, ctx, ctx.mm(180), ctx.mm(250))
    paginate(blocks, ctx, ctx.mm(180), ctx.mm(250))
    assert sorted(calls) == sorted(f"line {k}" for k in range(7))


def test_a_dash_for_nothing_given_stands_clear_of_the_next_column(qapp) -> None:  # type: ignore[no-untyped-def]
    """A missing figure in a right-aligned column is a dash in the middle of its cell,
    not flush against the next column's words ("- Bow, centre lead" read as one)."""
    from PySide6.QtCore import QRectF
    from PySide6.QtGui import QColor, QImage, QPainter

    from app.briefing.layout import Column, Table

    image = QImage(1200, 200, QImage.Format.Format_ARGB32)
    image.setDotsPerMeterX(11811)  # 300 dpi
    image.setDotsPerMeterY(11811)
    image.fill(QColor("white"))
    c = Ctx(image)
    table = Table(
        [Column("Towing point height", 1.0, "right"), Column("Role", 2.0)],
        [["-", "Bow, centre lead"], ["12.5 m", "Stern"]],
        header=False,
    )
    p = QPainter(image)
    table.paint(p, c, QRectF(0, 0, 1200, 200))
    p.end()
    split = 400  # the columns' edge: 1200 px in weights 1 : 2

    def ink(row_top: float, row_bottom: float) -> list[int]:
        return [
            x
            for x in range(1200)
            for y in range(int(row_top), int(row_bottom), 2)
            if QColor(image.pixel(x, y)).lightness() < 128
        ]

    first = table.row_height(c, 1200, 0)
    dash = [x for x in ink(0, first) if x < split]
    words = [x for x in ink(0, first) if x >= split]
    assert dash and words
    gap_mm = (min(words) - max(dash)) / c.mm(1)
    assert gap_mm > 5.0, gap_mm  # far apart, not the two paddings' 1.7 mm
    number = [x for x in ink(first, first + table.row_height(c, 1200, 1)) if x < split]
    assert split - max(number) < c.mm(2.0)  # a figure stays flush right
