"""Reading a drawing (DXF) or a table (CSV) to import: bounded, and every failure a
DrawingError naming the file, never one of the reading library's own exceptions."""

from __future__ import annotations

import os
from pathlib import Path

import ezdxf
import pytest

from core.errors import DrawingError
from core.io import paths
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import import_outline, layer_summaries, likely_layer
from core.io.outline_import import OutlinePlacement
from tests import dxf_drawings as dd


@pytest.mark.parametrize(
    "text",
    [
        "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n",  # cut after a header variable's name
        "0\nSECTION\n2\nHEADER\n9\n$INSBASE\n10\n",  # cut inside a point
        "0\nSECTION\n2\nHEADER\n",
        "999\nonly a comment\n",
    ],
)
def test_a_drawing_cut_short_is_refused_or_read_never_a_library_error(
    tmp_path: Path, text: str
) -> None:
    # A header cut short once ended in ezdxf's StopIteration and a traceback.
    path = tmp_path / "cut.dxf"
    path.write_text(text)
    try:
        drawing = Drawing.open(path)
    except DrawingError as e:
        assert str(e).startswith("cut.dxf: ") and len(str(e).splitlines()) == 1
    else:
        assert drawing.layers() == ()


@pytest.mark.parametrize("suffix", [".dxf", ".csv"])
def test_a_device_is_refused_once_it_passes_the_limit(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch, suffix: str
) -> None:
    link = tmp_path / f"zeros{suffix}"
    os.symlink("/dev/zero", link)
    monkeypatch.setattr(paths, "MAX_SOURCE_BYTES", 3 << 20)
    read = Drawing.open if suffix == ".dxf" else paths.read_table
    with pytest.raises(DrawingError, match=rf"^zeros\{suffix}: is larger than 3\.14573 MB"):
        read(link)


def test_a_regular_file_over_the_limit_is_refused_by_its_size(tmp_path: Path) -> None:
    path = tmp_path / "big.csv"
    path.write_bytes(b"x,y\n" * 100)
    with pytest.raises(DrawingError, match=r"^big\.csv: is larger than 0\.0001 MB"):
        paths.read_table(path, limit=100)
    assert paths.read_table(path, limit=400).startswith("x,y")


def test_a_table_not_in_utf8_names_the_byte(tmp_path: Path) -> None:
    path = tmp_path / "offsets.csv"
    path.write_bytes(b"x,y\n0,1\n\xff,2\n")
    with pytest.raises(DrawingError, match=r"^offsets\.csv: is not UTF-8 text \(byte 9 "):
        paths.read_table(path)


def test_a_byte_order_mark_is_dropped(tmp_path: Path) -> None:
    path = tmp_path / "offsets.csv"
    path.write_bytes("\ufeffx,y\n".encode())
    assert paths.read_table(path) == "x,y\n"


def test_a_missing_file_says_so(tmp_path: Path) -> None:
    with pytest.raises(DrawingError, match=r"^gone\.dxf: cannot be read: No such file"):
        Drawing.open(tmp_path / "gone.dxf")


def _outline_area(path: Path) -> float:
    drawing = Drawing.open(path)
    layer = likely_layer(layer_summaries(drawing, "m", 0.01, 0.001))
    assert layer is not None
    return import_outline(drawing, layer, "m", OutlinePlacement("+x"), 0.01, 0.001).area_m2


def test_a_binary_dxf_reads_as_its_text_twin(tmp_path: Path) -> None:
    # ezdxf writes both; a 60 x 18 m box is 1080 m² (rectangle area).
    text = dd.box_barge(tmp_path / "box.dxf")
    doc = ezdxf.readfile(text)
    doc.saveas(tmp_path / "box_bin.dxf", fmt="bin")
    assert (tmp_path / "box_bin.dxf").read_bytes().startswith(b"AutoCAD Binary DXF")
    assert _outline_area(tmp_path / "box_bin.dxf") == pytest.approx(1080.0)
    assert _outline_area(text) == pytest.approx(1080.0)


def test_an_old_drawing_reads_in_the_code_page_its_header_names(tmp_path: Path) -> None:
    # A DXF R12 file is written in the code page of $DWGCODEPAGE (DXF reference): a layer
    # name with a letter outside ASCII reads back as ezdxf's own file reader reads it.
    doc = ezdxf.new("R12")
    doc.header["$DWGCODEPAGE"] = "ANSI_1252"
    doc.layers.add("RUMPF_ÄUSSEN")
    doc.modelspace().add_line((0, 0), (10, 0), dxfattribs={"layer": "RUMPF_ÄUSSEN"})
    path = tmp_path / "old.dxf"
    doc.saveas(path, encoding="cp1252")
    assert "RUMPF_ÄUSSEN".encode("cp1252") in path.read_bytes()
    assert "RUMPF_ÄUSSEN" in Drawing.open(path).layers()
    assert {e.dxf.layer for e in ezdxf.readfile(path).modelspace()} == {"RUMPF_ÄUSSEN"}
