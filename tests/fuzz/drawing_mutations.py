"""Hostile drawings and tables to import, for the fuzz test and benchmarks/fuzz_drawings.py.

The starting points are valid: DXF drawings written by ezdxf (a hull as one closed
polyline with bulges, a hull of loose lines, a ship of lines and arcs with circles,
ellipses, splines and old-style polylines beside it, a hull built of blocks, a site on
several layers) and valid tables of offsets and of site points. A mutation damages a
copy: a group code's value swapped for a nasty number (nan, inf, 1e308, -0.0, 5e-324, a
huge integer, nothing), tags dropped, repeated or swapped, bytes flipped, cut or
inserted, ``$INSUNITS`` set to a code no drawing uses; or a drawing built hostile on
purpose (zero-radius arcs, degenerate splines, repeated points, a self-crossing
outline, a polyline of tens of thousands of points, blocks that insert themselves).
Tables get odd separators and units, blank, non-numeric and huge rows.

The random source is a ``random.Random`` or anything with its ``random`` and
``randrange`` methods, so hypothesis can drive it too.
"""

from __future__ import annotations

import functools
import io
import math
import random
from collections.abc import Callable
from typing import Any

import ezdxf

from tests.fuzz.mutations import Source, choice
from tests.fuzz.mutations import mutate_bytes as plan_mutate_bytes

MM, M = 4, 6  # $INSUNITS codes (DXF reference)

#: Values hostile to a DXF reader, as they would be written in the file.
NASTY_NUMBERS = [
    "nan",
    "NaN",
    "inf",
    "-inf",
    "1e308",
    "-1e308",
    "1.7976931348623157e308",
    "1e309",
    "-0.0",
    "5e-324",
    "1e-300",
    "0",
    "-1",
    "1e20",
    "123456789012345678901234567890",
    "9" * 400,
    "-" + "9" * 30,
    "",
    " ",
    "x",
    "1,5",
    "0x10",
    "1e",
    "--1",
]

#: ``$INSUNITS`` values: codes we do not read, out of range, not numbers.
ODD_INSUNITS = ["0", "3", "7", "13", "20", "21", "99", "-1", "-6", "2147483648", "1e9", "", "m"]

#: Group codes that carry a float (DXF reference, group code value types).
_FLOAT_CODES = set(range(10, 60)) | set(range(110, 150)) | set(range(210, 240))
_INT_CODES = set(range(60, 100)) | set(range(170, 180)) | set(range(270, 290))


# -- valid drawings -------------------------------------------------------------------------


def _new(insunits: int, layers: tuple[str, ...]) -> Any:
    doc = ezdxf.new(units=insunits)
    for name in layers:
        doc.layers.add(name)
    return doc


def _text(doc: Any) -> str:
    s = io.StringIO()
    doc.write(s)
    return s.getvalue()


def _hull_polyline() -> Any:
    """A barge with rounded bow corners: one closed LWPOLYLINE with bulges, millimetres."""
    doc = _new(MM, ("HULL", "NOTES"))
    msp = doc.modelspace()
    b = math.tan(math.radians(90) / 4)  # a quarter circle's bulge
    msp.add_lwpolyline(
        [
            (0, -9000, 0),
            (55_000, -9000, b),
            (60_000, -4000, 0),
            (60_000, 4000, b),
            (55_000, 9000, 0),
            (0, 9000, 0),
        ],
        format="xyb",
        close=True,
        dxfattribs={"layer": "HULL"},
    )
    msp.add_text("BARGE", dxfattribs={"layer": "NOTES"})
    return doc


def _loose_lines() -> Any:
    """A box barge, metres, drawn as loose lines out of order, some turned round."""
    doc = _new(M, ("HULL",))
    msp = doc.modelspace()
    corners = [(0.0, -6.0), (40.0, -6.0), (40.0, 6.0), (0.0, 6.0)]
    pieces = []
    for i in range(4):
        (ax, ay), (bx, by) = corners[i], corners[(i + 1) % 4]
        mid = ((ax + bx) / 2, (ay + by) / 2)
        pieces += [((ax, ay), mid), ((bx, by), mid)]
    for p, q in pieces[::3] + pieces[1::3] + pieces[2::3]:
        msp.add_line(p, q, dxfattribs={"layer": "HULL"})
    return doc


def _curves() -> Any:
    """A ship of lines and arcs (mm, x aft) and, on other layers, every kind of curve."""
    doc = _new(MM, ("HULL", "CURVES", "OLD"))
    msp = doc.modelspace()
    a = {"layer": "HULL"}
    r, xa, q = 10_000.0, 90_000.0, 3_000.0
    msp.add_arc((r, 0), r, 90, 270, dxfattribs=a)
    msp.add_line((r, -r), (xa - q, -r), dxfattribs=a)
    msp.add_arc((xa - q, -(r - q)), q, 270, 360, dxfattribs=a)
    msp.add_line((xa, -(r - q)), (xa, r - q), dxfattribs=a)
    msp.add_arc((xa - q, r - q), q, 0, 90, dxfattribs=a)
    msp.add_line((xa - q, r), (r, r), dxfattribs=a)
    c = {"layer": "CURVES"}
    msp.add_circle((0, 40_000), 3_000, dxfattribs=c)
    msp.add_ellipse((20_000, 40_000), major_axis=(6_000, 0), ratio=0.4, dxfattribs=c)
    msp.add_spline_control_frame(
        [(0, 60_000), (10_000, 65_000), (20_000, 60_000), (10_000, 55_000), (0, 60_000)],
        dxfattribs=c,
    )
    msp.add_spline([(30_000, 60_000), (35_000, 66_000), (40_000, 58_000)], dxfattribs=c)
    o = {"layer": "OLD"}
    msp.add_polyline2d(
        [(0, -40_000), (30_000, -40_000), (30_000, -30_000), (0, -30_000)], close=True, dxfattribs=o
    )
    msp.add_polyline3d(
        [(40_000, -40_000, 0), (50_000, -40_000, 5), (45_000, -30_000, 0)], close=True, dxfattribs=o
    )
    return doc


def _blocks() -> Any:
    """A pontoon built of blocks: a half hull on layer 0 inserted twice (once mirrored),
    and a nested block of fenders (circles) inserted along the side."""
    doc = _new(M, ("HULL", "FENDERS"))
    half = doc.blocks.new("HALF")
    half.add_lwpolyline([(0, 0), (30, 0), (30, 5), (0, 5)], close=True)
    fender = doc.blocks.new("FENDER")
    fender.add_circle((0, 0), 0.4)
    row = doc.blocks.new("FENDERS")
    for x in (5, 15, 25):
        row.add_blockref("FENDER", (x, 0))
    msp = doc.modelspace()
    msp.add_blockref("HALF", (0, 0), dxfattribs={"layer": "HULL"})
    msp.add_blockref("HALF", (0, 0), dxfattribs={"layer": "HULL", "yscale": -1})
    msp.add_blockref("FENDERS", (0, 10.5), dxfattribs={"layer": "FENDERS", "rotation": 0})
    return doc


def _site() -> Any:
    """An invented basin, millimetres: a quay line, dolphins, a moored vessel, a limit."""
    doc = _new(MM, ("QUAY", "DOLPHINS", "VESSELS", "LIMITS", "TEXT"))
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 0), (150_000, 0), (150_000, -20_000)], dxfattribs={"layer": "QUAY"})
    for cx in (170_000, 190_000):
        msp.add_circle((cx, 0), 2_000, dxfattribs={"layer": "DOLPHINS"})
    msp.add_lwpolyline(
        [(20_000, 30_000), (110_000, 30_000), (110_000, 46_000), (20_000, 46_000)],
        close=True,
        dxfattribs={"layer": "VESSELS"},
    )
    msp.add_line((0, 250_000), (300_000, 250_000), dxfattribs={"layer": "LIMITS"})
    msp.add_text("BASIN", dxfattribs={"layer": "TEXT"})
    return doc


BUILDERS: dict[str, Callable[[], Any]] = {
    "hull_polyline": _hull_polyline,
    "loose_lines": _loose_lines,
    "curves": _curves,
    "blocks": _blocks,
    "site": _site,
}


@functools.cache
def base_drawings() -> dict[str, str]:
    """The valid drawings as DXF text, by name (built once)."""
    return {name: _text(build()) for name, build in BUILDERS.items()}


# -- hostile drawings built on purpose ---------------------------------------------------------


def _zero_radius(rnd: Source) -> Any:
    doc = _new(M, ("HULL",))
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 0), (20, 0), (20, 8), (0, 8)], close=True, dxfattribs={"layer": "HULL"})
    msp.add_arc(
        (5, 5), choice(rnd, [0.0, -1.0, 1e-300, 5e-324]), 0, 90, dxfattribs={"layer": "HULL"}
    )
    msp.add_circle((9, 9), choice(rnd, [0.0, -2.0, 1e-300]), dxfattribs={"layer": "HULL"})
    msp.add_arc((0, 0), 5, 45, 45, dxfattribs={"layer": "ARCS"})  # no sweep
    return doc


def _degenerate_spline(rnd: Source) -> Any:
    doc = _new(M, ("HULL",))
    msp = doc.modelspace()
    p = (3.0, 4.0, 0.0)
    kind = rnd.randrange(5)
    if kind == 0:  # every control point the same
        msp.add_spline(dxfattribs={"layer": "HULL"}).set_open_uniform([p, p, p, p], degree=3)
    elif kind == 1:  # two fit points only, or the same fit point repeated
        msp.add_spline([p, (5.0, 4.0, 0.0)], dxfattribs={"layer": "HULL"})
        msp.add_spline(dxfattribs={"layer": "HULL"}).fit_points = [p, p, p]
    elif kind == 2:  # a spline whose control points lie on one line, closed
        s = msp.add_spline(dxfattribs={"layer": "HULL"})
        s.set_closed_rational([(0, 0, 0), (1, 0, 0), (2, 0, 0), (3, 0, 0)], [1, 1, 1, 1], degree=3)
    elif kind == 4:  # weights of zero and less, a huge degree
        s = msp.add_spline(dxfattribs={"layer": "HULL"})
        s.set_open_rational([(0, 0, 0), (5, 5, 0), (10, 0, 0), (15, 5, 0)], [1, 0, -1, 1], degree=3)
        s2 = msp.add_spline(dxfattribs={"layer": "HULL"})
        s2.set_open_uniform([(0, 0, 0), (1e12, 1, 0), (2, 1e-12, 0)], degree=2)
    else:  # an ellipse with next to no minor axis
        msp.add_ellipse((0, 0), major_axis=(5, 0), ratio=1e-12, dxfattribs={"layer": "HULL"})
    return doc


def _coincident(rnd: Source) -> Any:
    doc = _new(M, ("HULL",))
    msp = doc.modelspace()
    k = choice(rnd, [3, 4, 50])
    p = (7.0, 7.0)
    msp.add_lwpolyline([p] * k, close=True, dxfattribs={"layer": "HULL"})
    msp.add_lwpolyline(
        [(0, 0), (0, 0), (10, 0), (10, 0), (10, 5), (0, 5), (0, 0)],
        close=True,
        dxfattribs={"layer": "HULL"},
    )
    msp.add_line(p, p, dxfattribs={"layer": "HULL"})
    return doc


def _self_crossing(rnd: Source) -> Any:
    doc = _new(M, ("HULL", "SITE"))
    msp = doc.modelspace()
    bow_tie = [(0, 0), (30, 10), (30, 0), (0, 10)]
    msp.add_lwpolyline(bow_tie, close=True, dxfattribs={"layer": "HULL"})
    for p, q in zip(bow_tie, bow_tie[1:] + bow_tie[:1], strict=True):
        msp.add_line(p, q, dxfattribs={"layer": "SITE"})
    return doc


def _many_points(rnd: Source) -> Any:
    """A circle-ish hull as one polyline of many points, metres (sizes kept sensible)."""
    doc = _new(M, ("HULL",))
    n = choice(rnd, [2_000, 20_000, 100_000]) if rnd.random() < 0.1 else 2_000
    jitter = choice(rnd, [0.0, 1e-9, 0.3])
    rng = random.Random(n)
    pts = [
        (
            30 * math.cos(2 * math.pi * i / n) + jitter * rng.random(),
            10 * math.sin(2 * math.pi * i / n) + jitter * rng.random(),
        )
        for i in range(n)
    ]
    doc.modelspace().add_lwpolyline(pts, close=True, dxfattribs={"layer": "HULL"})
    return doc


def _recursive_blocks(rnd: Source) -> Any:
    """Blocks that insert themselves, directly or through another."""
    doc = _new(M, ("HULL",))
    a = doc.blocks.new("A")
    a.add_lwpolyline([(0, 0), (10, 0), (10, 4), (0, 4)], close=True)
    b = doc.blocks.new("B")
    a.add_blockref("B", (1, 0))
    b.add_blockref("A", (0, 1))
    if rnd.random() < 0.5:
        a.add_blockref("A", (0, 0))
    doc.modelspace().add_blockref("A", (0, 0), dxfattribs={"layer": "HULL"})
    return doc


def _wild_inserts(rnd: Source) -> Any:
    """Inserts scaled to nothing, by huge factors, or in arrays (of up to 10^6 x 10^6
    copies, their spacing 0 or not a number)."""
    doc = _new(M, ("HULL",))
    blk = doc.blocks.new("BOX")
    blk.add_lwpolyline([(0, 0), (10, 0), (10, 4), (0, 4)], close=True)
    blk.add_arc((5, 2), 1, 0, 180)
    s = choice(rnd, [0.0, 1e-300, 1e300, -1.0, 1e154])
    attribs = {"layer": "HULL", "xscale": s, "yscale": choice(rnd, [1.0, s])}
    ref = doc.modelspace().add_blockref("BOX", (0, 0), dxfattribs=attribs)
    if rnd.random() < 0.3:
        ref.dxf.column_count = choice(rnd, [2, 1000, 10**6])
        ref.dxf.row_count = choice(rnd, [2, 1000, 10**6])
        ref.dxf.column_spacing = choice(rnd, [20.0, 0.0, math.nan])
        ref.dxf.row_spacing = 20
    return doc


def _far_coordinates(rnd: Source) -> Any:
    """A hull with corners at the edge of what a float holds."""
    doc = _new(choice(rnd, [MM, M, 2]), ("HULL",))
    big = choice(rnd, [1e6, 1e15, 1e154, 1e300, 1.7e308])
    small = choice(rnd, [1e-300, 5e-324, 1e-9])
    pts = choice(
        rnd,
        [
            [(0, 0), (big, 0), (big, big), (0, big)],
            [(big, big), (big + 10, big), (big + 10, big + 4), (big, big + 4)],
            [(0, 0), (small, 0), (small, small), (0, small)],
        ],
    )
    doc.modelspace().add_lwpolyline(pts, close=True, dxfattribs={"layer": "HULL"})
    return doc


HOSTILE: dict[str, Callable[[Source], Any]] = {
    "zero_radius": _zero_radius,
    "degenerate_spline": _degenerate_spline,
    "coincident": _coincident,
    "self_crossing": _self_crossing,
    "many_points": _many_points,
    "recursive_blocks": _recursive_blocks,
    "wild_inserts": _wild_inserts,
    "far_coordinates": _far_coordinates,
}


def hostile_drawing(rnd: Source) -> str:
    """One drawing built hostile on purpose, as DXF text."""
    return _text(choice(rnd, list(HOSTILE.values()))(rnd))


# -- damage to a drawing's tags -------------------------------------------------------------


def tags(text: str) -> list[tuple[str, str]]:
    """A text DXF as (group code, value) pairs, as written (a trailing odd line dropped)."""
    lines = text.splitlines()
    return [(lines[i], lines[i + 1]) for i in range(0, len(lines) - 1, 2)]


def untag(pairs: list[tuple[str, str]]) -> str:
    return "".join(f"{c}\n{v}\n" for c, v in pairs)


def _code(c: str) -> int | None:
    try:
        return int(c)
    except ValueError:
        return None


def mutate_tags(text: str, rnd: Source, count: int = 1) -> str:
    """``text`` with ``count`` tags damaged: a number swapped for a nasty one, a tag
    dropped, repeated or swapped with its neighbour, or ``$INSUNITS`` set oddly."""
    pairs = tags(text)
    numeric = [i for i, (c, _v) in enumerate(pairs) if _code(c) in _FLOAT_CODES | _INT_CODES]
    for _ in range(count):
        op = rnd.randrange(10)
        if op <= 4 and numeric:
            i = choice(rnd, numeric)
            pairs[i] = (pairs[i][0], choice(rnd, NASTY_NUMBERS))
        elif op == 5:
            i = next((k for k, (_c, v) in enumerate(pairs) if v == "$INSUNITS"), None)
            if i is not None and i + 1 < len(pairs):
                pairs[i + 1] = (pairs[i + 1][0], choice(rnd, ODD_INSUNITS))
        elif op == 6 and pairs:
            del pairs[rnd.randrange(len(pairs))]
        elif op == 7 and pairs:
            i = rnd.randrange(len(pairs))
            pairs.insert(i, pairs[i])
        elif op == 8 and len(pairs) > 1:
            i = rnd.randrange(len(pairs) - 1)
            pairs[i], pairs[i + 1] = pairs[i + 1], pairs[i]
        elif numeric:  # a number scaled wildly, still a number
            i = choice(rnd, numeric)
            c, v = pairs[i]
            try:
                x = float(v) * choice(rnd, [-1, 0, 1e-12, 1e3, 1e12, 1e300])
            except ValueError:
                continue
            pairs[i] = (c, repr(int(x)) if _code(c) in _INT_CODES and math.isfinite(x) else repr(x))
    return untag(pairs)


#: Bytes a drawing's mutation inserts: a DXF's numbers and line ends, and three bad ones.
DXF_BYTES = (*b"0123456789.-eE \r\n", 0, 255, 195)


def mutate_bytes(data: bytes, rnd: Source, count: int = 1) -> bytes:
    """``data`` with ``count`` bytes flipped, inserted (a DXF's own), deleted (up to 8), a
    cut, or a run of up to 200 repeated (tests.fuzz.mutations.mutate_bytes)."""
    return plan_mutate_bytes(data, rnd, count, DXF_BYTES, longest_cut=8, longest_repeat=200)


# -- tables ---------------------------------------------------------------------------------

#: Valid tables of offsets (x, half-breadth) and of site points, by name.
OFFSETS = {
    "plain": "x,half_breadth\n0,0\n5,4\n10,5\n40,5\n50,3\n55,0\n",
    "mm_semicolon": "x (mm);hb\n0;0\n5000;4000,5\n40000;5000\n55000;0\n",
    "tabs_no_header": "0\t2\n10\t5\n20\t5\n30\t2\n",
    "comments": "# a lighter\nstation,y,note\n\n0,3,transom\n12.5,3,\n25,0,stem\n",
}
POINTS = {
    "plain": (
        "feature,kind,x,y,closed\n"
        "Quay A,quay,0,0,no\nQuay A,quay,150,0,no\nQuay A,quay,150,-20,no\n"
        "D1,dolphin,170,-2,\nD1,dolphin,172,0,\nD1,dolphin,170,2,\n"
        "Ship,vessel,20,30,yes\nShip,vessel,110,30,yes\nShip,vessel,110,46,yes\nShip,vessel,20,46,yes\n"
    ),
    "semicolon": "name;kind;x;y\nLimit;limit;0;250\nLimit;limit;300;250\n",
}

#: Cells hostile to a table reader.
NASTY_CELLS = [
    "nan",
    "inf",
    "-inf",
    "1e308",
    "1e309",
    "-0.0",
    "5e-324",
    "9" * 400,
    "",
    " ",
    "x",
    "1,5",
    "1 000",
    "١٢",  # Arabic-Indic digits: Python's float reads them
    "\u00a0",
    '"',
    "quay",
    "-1",
    "1e-300",
    "0",
]


def mutate_table(text: str, rnd: Source, count: int = 1) -> str:
    """A table with ``count`` rows or cells damaged: a cell swapped for a nasty one, the
    separator changed, a row dropped, repeated, emptied or made huge, a unit added."""
    rows = text.splitlines()
    for _ in range(count):
        if not rows:
            rows = [""]
        i = rnd.randrange(len(rows))
        op = rnd.randrange(9)
        sep = next((d for d in ("\t", ";", ",") if d in rows[i]), ",")
        cells = rows[i].split(sep)
        if op <= 2:
            cells[rnd.randrange(len(cells))] = choice(rnd, NASTY_CELLS)
            rows[i] = sep.join(cells)
        elif op == 3:
            new = choice(rnd, ["\t", ";", ",", "|", " ", ";;", ",,"])
            rows = [r.replace(sep, new) for r in rows]
        elif op == 4:
            del rows[i]
        elif op == 5:
            rows.insert(i, rows[i])
        elif op == 6:
            rows[i] = choice(rnd, ["", "   ", "#", sep * 50, "0" + sep * 5000, "x" * 10_000])
        elif op == 7:  # a unit, odd or not, in the header
            rows[0] = rows[0].replace(
                "x", choice(rnd, ["x (mm)", "x_ft", "x [furlong]", "x (m)"]), 1
            )
        else:  # many rows
            rows += [rows[-1]] * choice(rnd, [2, 1000])
    return "\n".join(rows) + choice(rnd, ["\n", "", "\r\n", "\n\n"])


# -- one case -------------------------------------------------------------------------------


def drawing_case(rnd: Source) -> tuple[str, bytes]:
    """One hostile drawing as (how it was made, DXF bytes)."""
    kind = rnd.randrange(5)
    if kind == 0:
        name = choice(rnd, list(HOSTILE))
        text = _text(HOSTILE[name](rnd))
        if rnd.random() < 0.3:
            text = mutate_tags(text, rnd)
        return f"built {name}", text.encode()
    name = choice(rnd, list(base_drawings()))
    text = base_drawings()[name]
    if kind <= 2:
        return f"tags of {name}", mutate_tags(text, rnd, 1 + rnd.randrange(4)).encode()
    if kind == 3:
        return f"bytes of {name}", mutate_bytes(text.encode(), rnd, 1 + rnd.randrange(4))
    return f"tags and bytes of {name}", mutate_bytes(mutate_tags(text, rnd).encode(), rnd)


def table_case(rnd: Source) -> tuple[str, str, bytes]:
    """One hostile table as ("offsets" or "points", how it was made, bytes)."""
    what = choice(rnd, ["offsets", "points"])
    tables = OFFSETS if what == "offsets" else POINTS
    name = choice(rnd, list(tables))
    text = mutate_table(tables[name], rnd, 1 + rnd.randrange(3))
    data = text.encode("utf-8")
    if rnd.random() < 0.15:
        data = mutate_bytes(data, rnd)
    return what, f"{what} {name}", data
