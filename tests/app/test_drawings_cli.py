"""``towboard import-outline``, ``towboard export`` and ``towboard report --csv``."""

from __future__ import annotations

import csv
import io
import json
import subprocess
import sys
from pathlib import Path

import pytest
from PySide6.QtGui import QImage

from app.cli import main
from core.io.projectfile import load
from tests import dxf_drawings as dd
from tests.conftest import ROOT, SAMPLES

PONTOON = SAMPLES / "pontoon_swing.towboard"


def _run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run(
        [sys.executable, "-m", "app", *args], capture_output=True, text=True, cwd=ROOT, timeout=120
    )


def test_import_outline_writes_a_new_plan(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    ship = dd.ship_mm_x_aft(tmp_path / "Ship Orla.dxf")
    out = tmp_path / "orla.towboard"
    assert main(["import-outline", str(ship.path), "--x-aft", "-o", str(out)]) == 0
    said = capsys.readouterr().out
    assert "Ship Orla: outline from layer HULL in mm, 90.00 m long, 20.00 m beam" in said
    plan = load(out)
    hull = plan.hulls[0]
    assert hull.name == "Ship Orla" and len(plan.stages) == 1
    area = dd.ship_area_and_centroid_x(ship)[0] * 1e-6
    assert hull.geometry.area == pytest.approx(area, abs=0.01 * hull.geometry.perimeter)
    # x forward: the round bow at the far end
    assert max(hull.outline, key=lambda p: p[0])[1] == pytest.approx(0.0, abs=1e-9)


def test_import_outline_from_offsets(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    csv_path = tmp_path / "offsets.csv"
    csv_path.write_text("x (mm),hb (mm)\n0,0\n5000,4000\n45000,4000\n50000,0\n")
    out = tmp_path / "pontoon"
    assert main(["import-outline", str(csv_path), "-o", str(out), "--name", "Pontoon Wren"]) == 0
    plan = load(tmp_path / "pontoon.towboard")  # the suffix is added
    assert plan.hulls[0].name == "Pontoon Wren"
    # trapezoidal rule over the stations, both sides
    assert plan.hulls[0].geometry.area == pytest.approx(2 * (10 + 160 + 10))
    assert "outline from the offsets in mm" in capsys.readouterr().out


def test_the_layer_is_found_when_not_named(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    doc = dd.new_doc(dd.M, ("HULL-OUTLINE", "HATCHES"))
    msp = doc.modelspace()
    msp.add_lwpolyline(
        [(0, -9), (80, -9), (80, 9), (0, 9)], close=True, dxfattribs={"layer": "HULL-OUTLINE"}
    )
    msp.add_lwpolyline(
        [(5, -2), (15, -2), (15, 2), (5, 2)], close=True, dxfattribs={"layer": "HATCHES"}
    )
    doc.saveas(tmp_path / "ga.dxf")
    assert (
        main(["import-outline", str(tmp_path / "ga.dxf"), "-o", str(tmp_path / "ga.towboard")]) == 0
    )
    assert "from layer HULL-OUTLINE in m" in capsys.readouterr().out
    assert load(tmp_path / "ga.towboard").hulls[0].geometry.area == pytest.approx(80 * 18)


@pytest.mark.parametrize(
    ("make", "args", "message"),
    [
        (dd.no_outline, (), "towboard import-outline: d.dxf: no layer holds a closed outline"),
        (
            dd.no_outline,
            ("--layer", "NOTES"),
            "towboard import-outline: d.dxf: layer NOTES: has no closed outline (it holds 1 TEXT)",
        ),
        (
            dd.broken_chain,
            ("--layer", "hull"),
            "towboard import-outline: d.dxf: layer HULL: the lines do not close into an outline: "
            "the nearest open ends are 0.5 m apart",
        ),
        (
            lambda p: dd.box_barge(p, insunits=0),
            (),
            "towboard import-outline: d.dxf: the drawing does not say its units ($INSUNITS is 0); "
            "give --units mm|cm|m|in|ft",
        ),
        # the drawing is in mm: the message once showed -900.0, 0.9 x the value in mm
        (
            dd.ship_mm_x_aft,
            ("--chord-error=-1",),
            "towboard import-outline: chord error: -1.0 m must be at least 1e-05 m",
        ),
        (
            dd.ship_mm_x_aft,
            ("--join-tolerance=-0.5",),
            "towboard import-outline: join tolerance: -0.5 m must not be negative",
        ),
    ],
)
def test_refusals_exit_2_with_one_line_and_write_nothing(
    tmp_path: Path,
    capsys: pytest.CaptureFixture[str],
    make,
    args,
    message,  # type: ignore[no-untyped-def]
) -> None:
    make(tmp_path / "d.dxf")
    out = tmp_path / "plan.towboard"
    assert main(["import-outline", str(tmp_path / "d.dxf"), *args, "-o", str(out)]) == 2
    err = capsys.readouterr().err
    assert err.startswith(message) and len(err.strip().splitlines()) == 1
    assert not out.exists() and list(tmp_path.iterdir()) == [tmp_path / "d.dxf"]


def test_an_existing_plan_is_not_replaced_without_force(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    dd.box_barge(tmp_path / "box.dxf")
    out = tmp_path / "plan.towboard"
    out.write_text("precious")
    assert main(["import-outline", str(tmp_path / "box.dxf"), "-o", str(out)]) == 2
    assert "exists; give --force to replace it" in capsys.readouterr().err
    assert out.read_text() == "precious"
    assert main(["import-outline", str(tmp_path / "box.dxf"), "-o", str(out), "--force"]) == 0
    assert load(out).hulls[0].geometry.area == pytest.approx(60 * 18)


@pytest.mark.parametrize(
    ("value", "message"),
    [
        ("nan", "chord error: NaN m must be a finite number"),  # was an AttributeError
        ("-1", "chord error: -1.0 m must be at least 1e-05 m"),  # was a GEOSException
        ("inf", "chord error: infinity m must be a finite number"),  # wrote a 3-vertex outline
        ("0", "chord error: 0.0 m must be at least 1e-05 m"),
        ("11", "chord error: 11.0 m must be at most 10 m"),
    ],
)
def test_offsets_refuse_a_chord_error_out_of_range(
    tmp_path: Path, capsys: pytest.CaptureFixture[str], value: str, message: str
) -> None:
    csv_path = tmp_path / "offsets.csv"
    csv_path.write_text("0,5\n10,5\n20,5\n")
    out = tmp_path / "plan.towboard"
    assert main(["import-outline", str(csv_path), "-o", str(out), f"--chord-error={value}"]) == 2
    err = capsys.readouterr().err
    assert err == f"towboard import-outline: {message}\n"
    assert not out.exists()


def test_offsets_with_a_bad_chord_error_give_no_traceback_from_a_real_process(
    tmp_path: Path,
) -> None:
    csv_path = tmp_path / "offsets.csv"
    csv_path.write_text("0,5\n10,5\n20,5\n")
    done = _run("import-outline", str(csv_path), "-o", str(tmp_path / "p"), "--chord-error", "nan")
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert done.stderr == "towboard import-outline: chord error: NaN m must be a finite number\n"


def test_no_traceback_from_a_real_process(tmp_path: Path) -> None:
    dd.no_outline(tmp_path / "n.dxf")
    done = _run("import-outline", str(tmp_path / "n.dxf"), "-o", str(tmp_path / "n.towboard"))
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert done.stderr.strip() == "towboard import-outline: n.dxf: no layer holds a closed outline"


# -- export -----------------------------------------------------------------------------


def test_export_every_stage_and_one(
    qapp, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:  # type: ignore[no-untyped-def]
    plan = load(PONTOON)
    assert (
        main(["export", str(PONTOON), "-o", str(tmp_path / "pontoon.png"), "--size", "640x480"])
        == 0
    )
    files = sorted(p.name for p in tmp_path.iterdir())
    assert files == [f"pontoon-{i + 1}.png" for i in range(len(plan.stages))]
    img = QImage(str(tmp_path / "pontoon-1.png"))
    assert (img.width(), img.height()) == (640, 480)
    assert (
        main(
            [
                "export",
                str(PONTOON),
                "--stage",
                "2",
                "--picture",
                "diagram",
                "-o",
                str(tmp_path / "two.svg"),
            ]
        )
        == 0
    )
    assert "<svg" in (tmp_path / "two.svg").read_text()
    assert f"stage 2: {plan.stages[1].name}" in capsys.readouterr().out


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (("--stage", "9", "-o", "x.svg"), "--stage: 9 is not a stage of the plan (1 to 2)"),
        (("-o", "x.pdf"), "picture file: 'x.pdf' must end in .svg or .png"),
        (("--size", "10x10", "-o", "x.png"), "picture width: 10 must be whole pixels from 64"),
    ],
)
def test_export_refusals(
    qapp, tmp_path: Path, capsys: pytest.CaptureFixture[str], args, message
) -> None:  # type: ignore[no-untyped-def]
    args = tuple(str(tmp_path / a) if a.startswith("x.") else a for a in args)
    assert main(["export", str(PONTOON), *args]) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"towboard export: {message}") and len(err.strip().splitlines()) == 1
    assert list(tmp_path.iterdir()) == []


def test_export_bad_size_is_an_argument_error(capsys: pytest.CaptureFixture[str]) -> None:
    with pytest.raises(SystemExit) as e:
        main(["export", str(PONTOON), "--size", "big", "-o", "x.png"])
    assert e.value.code == 2
    assert "towboard export: argument --size: 'big' is not WIDTHxHEIGHT" in capsys.readouterr().err


# -- report --csv ---------------------------------------------------------------------------


def test_report_csv_equals_the_report_json() -> None:
    data = json.loads(_run("report", str(PONTOON), "--json").stdout)
    done = _run("report", str(PONTOON), "--csv", "--table", "tugs")
    assert done.returncode == 0, done.stderr
    rows = list(csv.DictReader(io.StringIO(done.stdout)))
    stages = data["stages"]
    assert len(rows) == sum(len(s["balance"]["tugs"]) for s in stages)
    for row in rows:
        tug = next(
            t
            for t in stages[int(row["Stage no."]) - 1]["balance"]["tugs"]
            if t["tug"] == row["Tug"]
        )
        assert float(row["Assigned pull (N)"]) == tug["assigned_pull_N"]
        assert (
            float(row["Yaw moment about the centroid (N*m)"]) == tug["yaw_moment_about_centroid_Nm"]
        )
        assert float(row["Force to port (N)"]) == tug["force_N"]["to_port"]


def test_report_csv_both_tables_in_display_units(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["report", str(PONTOON), "--csv", "--display-units"]) == 0
    tugs, balance = capsys.readouterr().out.split("\n\n")
    plan = load(PONTOON)
    assert plan.units.force == "kN"  # the plan's own choice, not the default t
    assert tugs.startswith("Stage no.,Stage,Tug,") and "Assigned pull (kN)" in tugs
    assert balance.startswith("Stage no.,Stage,Kind,Verdict,Reasons,Body,") and "(kN·m)" in balance
    assert len(balance.strip().splitlines()) == 1 + len(plan.stages)


@pytest.mark.parametrize(("plan_name", "stage"), [("plan.svg", ("--stage", "1")), ("p-2.png", ())])
def test_export_never_writes_over_the_plan(
    qapp, tmp_path: Path, capsys: pytest.CaptureFixture[str], plan_name: str, stage
) -> None:  # type: ignore[no-untyped-def]
    # A plan named like a picture: the one picture, or any of the numbered pictures of
    # every stage, would have replaced it. Nothing is written, not even the other stages.
    plan = tmp_path / plan_name
    plan.write_bytes(PONTOON.read_bytes())
    out = plan if stage else tmp_path / "p.png"
    assert main(["export", str(plan), *stage, "-o", str(out)]) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"towboard export: picture file: {str(plan)!r} is the plan itself")
    assert plan.read_bytes() == PONTOON.read_bytes()
    assert list(tmp_path.iterdir()) == [plan]


def _nasty_drawings(tmp: Path) -> list[Path]:
    """Damaged and hostile drawings the fuzzing refused (tests/fuzz/drawing_mutations.py)."""
    import io
    import random

    from tests.fuzz.drawing_mutations import HOSTILE, base_drawings

    hull = base_drawings()["hull_polyline"]
    files = {
        "cut.dxf": hull[: len(hull) // 3],  # a file cut short
        "nan.dxf": hull.replace("\n60000.0\n", "\nnan\n", 1),  # a corner at NaN
        "mended.dxf": base_drawings()["loose_lines"].replace(
            "$LTSCALE\n 40\n1.0\n", "$LTSCALE\n 40\n--1.0\n", 1
        ),  # a header value ezdxf mends
    }
    for name in ("recursive_blocks", "degenerate_spline", "far_coordinates"):
        out = io.StringIO()
        HOSTILE[name](random.Random(3)).write(out)
        files[f"{name}.dxf"] = out.getvalue()
    paths = []
    for name, text in files.items():
        (tmp / name).write_text(text)
        paths.append(tmp / name)
    return paths


def test_nasty_drawings_exit_2_with_one_line_from_a_real_process(tmp_path: Path) -> None:
    """Each refused with one line and exit 2, nothing written; the mended one is read, with
    the repair on stdout as a warning and nothing from ezdxf on stderr, and blocks inserting
    themselves are opened up to a depth and the inserts left said as not read."""
    for path in _nasty_drawings(tmp_path):
        out = tmp_path / f"{path.stem}.towboard"
        done = _run("import-outline", str(path), "-o", str(out))
        if path.name == "mended.dxf":
            assert done.returncode == 0 and done.stderr == "", done.stderr
            assert "WARNING: mended.dxf is damaged and was read by mending it" in done.stdout
            assert out.exists()
            continue
        if path.name == "recursive_blocks.dxf":
            assert done.returncode == 0 and done.stderr == "", done.stderr
            assert "area 40.0 m²" in done.stdout  # the 10 m x 4 m box in block A
            assert "WARNING: Not read on layer HULL: " in done.stdout
            continue
        assert done.returncode == 2, (path.name, done.stdout, done.stderr)
        assert "Traceback" not in done.stderr and len(done.stderr.splitlines()) == 1, done.stderr
        assert done.stderr.startswith(f"towboard import-outline: {path.name}: "), done.stderr
        assert not out.exists() and not list(tmp_path.glob("*.tmp*"))
