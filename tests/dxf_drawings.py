"""DXF drawings made with ezdxf for the import tests: invented hulls and a site.

Every builder writes a file and returns its path with the shape's defining numbers,
so a test can work out the area and centroid by the handbook formulas.
"""

from __future__ import annotations

import math
import random
from dataclasses import dataclass
from pathlib import Path

import ezdxf

MM, M = 4, 6  # $INSUNITS codes (DXF reference)


def new_doc(insunits: int = M, layers: tuple[str, ...] = ("HULL",)):  # type: ignore[no-untyped-def]
    doc = ezdxf.new(units=insunits)
    for name in layers:
        doc.layers.add(name)
    return doc


def box_barge(path: Path, length: float = 60.0, beam: float = 18.0, insunits: int = M) -> Path:
    """A box barge as one closed LWPOLYLINE on layer HULL, aft end at x = 0."""
    doc = new_doc(insunits)
    h = beam / 2
    doc.modelspace().add_lwpolyline(
        [(0, -h), (length, -h), (length, h), (0, h)], close=True, dxfattribs={"layer": "HULL"}
    )
    doc.saveas(path)
    return path


def loose_lines_box(
    path: Path, length: float, beam: float, gap: float, pieces: int = 3, seed: int = 7
) -> Path:
    """A box barge drawn as loose LINE entities: each side cut in ``pieces``, shuffled,
    some turned round, every joint left open by ``gap``."""
    rng = random.Random(seed)
    h = beam / 2
    corners = [(0.0, -h), (length, -h), (length, h), (0.0, h)]
    lines = []
    for i in range(4):
        (ax, ay), (bx, by) = corners[i], corners[(i + 1) % 4]
        for k in range(pieces):
            t0, t1 = k / pieces, (k + 1) / pieces
            p = (ax + (bx - ax) * t0, ay + (by - ay) * t0)
            q = (ax + (bx - ax) * t1, ay + (by - ay) * t1)
            # shorten the piece at its end by the gap, along the side
            d = math.hypot(bx - ax, by - ay)
            q = (q[0] - (bx - ax) / d * gap, q[1] - (by - ay) / d * gap)
            lines.append((p, q) if rng.random() < 0.5 else (q, p))
    rng.shuffle(lines)
    doc = new_doc(M)
    msp = doc.modelspace()
    for p, q in lines:
        msp.add_line(p, q, dxfattribs={"layer": "HULL"})
    doc.saveas(path)
    return path


@dataclass(frozen=True)
class Ship:
    """A ship-shaped hull drawn in millimetres with x running aft.

    Bow: a semicircle of radius r (= half the beam) centred at x = r; the sides run aft
    to the transom at x = x_aft, whose two quarters are rounded with radius q.
    """

    path: Path
    r: float = 10_000.0
    x_aft: float = 90_000.0
    q: float = 3_000.0


def ship_mm_x_aft(path: Path, notch: bool = False) -> Ship:
    """The Ship as LINE and ARC entities on layer HULL ($INSUNITS millimetres)."""
    s = Ship(path)
    r, xa, q = s.r, s.x_aft, s.q
    doc = new_doc(MM)
    msp = doc.modelspace()
    a = {"layer": "HULL"}
    msp.add_arc((r, 0), r, 90, 270, dxfattribs=a)  # bow, through x = 0
    msp.add_line((r, -r), (xa - q, -r), dxfattribs=a)  # side at drawing -y
    msp.add_arc((xa - q, -(r - q)), q, 270, 360, dxfattribs=a)
    msp.add_line((xa, -(r - q)), (xa, r - q), dxfattribs=a)  # transom
    msp.add_arc((xa - q, r - q), q, 0, 90, dxfattribs=a)
    msp.add_line((xa - q, r), (r, r), dxfattribs=a)  # side at drawing +y
    doc.saveas(path)
    return s


def ship_area_and_centroid_x(s: Ship) -> tuple[float, float]:
    """Area (mm^2) and centroid (drawing x, mm) of the Ship by composite areas.

    Handbook formulas (REFERENCES.md, plane-area properties, from memory): rectangle
    centroid at its middle; semicircle pi r^2 / 2 with centroid 4 r / (3 pi) from its
    diameter; quarter circle pi q^2 / 4 with centroid 4 q / (3 pi) from each straight edge.
    """
    r, xa, q = s.r, s.x_aft, s.q
    parts = [
        ((xa - r) * 2 * r, (r + xa) / 2),  # the rectangle from the bow's diameter to the transom
        (math.pi * r * r / 2, r - 4 * r / (3 * math.pi)),  # the bow
        (-2 * q * q, xa - q / 2),  # minus the two q x q corner squares
        (2 * math.pi * q * q / 4, xa - q + 4 * q / (3 * math.pi)),  # plus the two quarter circles
    ]
    area = sum(a for a, _ in parts)
    return area, sum(a * x for a, x in parts) / area


def broken_chain(path: Path, gap: float = 0.5) -> Path:
    """Three sides of a 40 m x 12 m box and a fourth that stops ``gap`` m short."""
    doc = new_doc(M)
    msp = doc.modelspace()
    a = {"layer": "HULL"}
    msp.add_line((0, -6), (40, -6), dxfattribs=a)
    msp.add_line((40, -6), (40, 6), dxfattribs=a)
    msp.add_line((40, 6), (0, 6), dxfattribs=a)
    msp.add_line((0, 6), (0, -6 + gap), dxfattribs=a)
    doc.saveas(path)
    return path


def no_outline(path: Path) -> Path:
    """A drawing whose HULL layer holds only a title and one open line."""
    doc = new_doc(M, ("HULL", "NOTES"))
    msp = doc.modelspace()
    msp.add_text("GENERAL ARRANGEMENT", dxfattribs={"layer": "NOTES"})
    msp.add_text("HULL", dxfattribs={"layer": "HULL"})
    msp.add_line((0, 0), (50, 0), dxfattribs={"layer": "HULL"})
    doc.saveas(path)
    return path
