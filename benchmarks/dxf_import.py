"""Reading a hull from a busy general-arrangement drawing, against reading the file alone.

The invented drawing holds a 120 m hull drawn as 2 000 loose LINE entities (shuffled,
some turned round) on layer HULL, and 20 more layers of 600 entities each (circles,
short lines, arcs and text), in millimetres. Each figure is the median of five runs,
printed with its ratio to ``ezdxf.readfile`` of the same file measured in the same run
(the least any import can cost).

Run: python benchmarks/dxf_import.py
"""

from __future__ import annotations

import math
import random
import statistics
import sys
import tempfile
import time
from collections.abc import Callable
from pathlib import Path

import ezdxf

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import import_outline, layer_summaries
from core.io.outline_import import OutlinePlacement


def make_drawing(
    path: Path, hull_lines: int = 2000, layers: int = 20, per_layer: int = 600
) -> None:
    rng = random.Random(11)
    doc = ezdxf.new(units=4)
    msp = doc.modelspace()
    doc.layers.add("HULL")
    # a 120 m x 22 m hull: super-ellipse |x/a|^4 + |y/b|^4 = 1, as loose lines
    a, b = 60_000.0, 11_000.0
    pts = []
    for k in range(hull_lines):
        t = 2 * math.pi * k / hull_lines
        c, s = math.cos(t), math.sin(t)
        pts.append((a * math.copysign(abs(c) ** 0.5, c), b * math.copysign(abs(s) ** 0.5, s)))
    lines = [(pts[k], pts[(k + 1) % hull_lines]) for k in range(hull_lines)]
    rng.shuffle(lines)
    for p, q in lines:
        if rng.random() < 0.5:
            p, q = q, p
        msp.add_line(p, q, dxfattribs={"layer": "HULL"})
    for n in range(layers):
        name = f"DECK-{n:02d}"
        doc.layers.add(name)
        at = {"layer": name}
        for _ in range(per_layer // 4):
            x, y = rng.uniform(-a, a), rng.uniform(-b, b)
            msp.add_circle((x, y), rng.uniform(50, 500), dxfattribs=at)
            msp.add_line(
                (x, y), (x + rng.uniform(-900, 900), y + rng.uniform(-900, 900)), dxfattribs=at
            )
            msp.add_arc(
                (x, y),
                rng.uniform(100, 800),
                rng.uniform(0, 180),
                rng.uniform(180, 360),
                dxfattribs=at,
            )
            msp.add_text("FR 12", dxfattribs=at)
    doc.saveas(path)


def median_s(fn: Callable[[], object], repeat: int = 5) -> float:
    runs = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        runs.append(time.perf_counter() - t0)
    return statistics.median(runs)


def main() -> None:
    with tempfile.TemporaryDirectory() as tmp:
        path = Path(tmp) / "ga.dxf"
        make_drawing(path)
        base = median_s(lambda: ezdxf.readfile(path))
        drawing = Drawing.open(path)
        got = import_outline(drawing, "HULL", "mm", OutlinePlacement())
        print(
            f"hull from 2000 loose lines: {got.length_m:.1f} m x {got.beam_m:.1f} m, "
            f"{got.area_m2:.0f} m², {got.points_kept} vertices kept of {got.points_read}"
        )
        rows = [
            ("ezdxf.readfile (baseline)", base),
            ("Drawing.open", median_s(lambda: Drawing.open(path))),
            ("layer_summaries (21 layers)", median_s(lambda: layer_summaries(drawing, "mm"))),
            (
                "import_outline (layer HULL)",
                median_s(lambda: import_outline(drawing, "HULL", "mm")),
            ),
        ]
        for name, t in rows:
            print(f"{name:<30} median {t * 1e3:8.1f} ms   {t / base:5.2f} x baseline")


if __name__ == "__main__":
    main()
