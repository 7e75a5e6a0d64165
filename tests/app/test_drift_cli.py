"""``towboard drift``: the track and the first contact of one stage, text and JSON, and one
line on stderr with exit 2 for bad input."""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from app.cli import main
from core.io.projectfile import load
from core.motion.drift import DriftScenario
from core.motion.scenarios import drift

ROOT = Path(__file__).resolve().parents[2]
TWIN = ROOT / "sample_projects" / "twin_barge_move.towboard"
KNOT = 1852.0 / 3600.0


def test_a_tug_lost_prints_the_track_and_the_core_s_first_contact(
    capsys: pytest.CaptureFixture[str],
) -> None:
    assert main(["drift", str(TWIN), "--stage", "4", "--lose", "Rowan"]) == 0
    out = capsys.readouterr().out
    project = load(TWIN)
    r = drift(project, project.stages[3], DriftScenario("tug_lost", "Rowan"))
    assert r is not None and r.contact is not None
    assert "Stage 4: Berth: port side to the lay-by quay; Lark pair, Rowan lost" in out
    assert "    t s     east m    north m  heading   speed kn  turn °/min" in out
    assert (
        f"touches {r.contact.other} (quay) after {round(r.contact.time_s)} s, closing at "
        f"{r.contact.closing_speed_ms / KNOT:.2f} kn" in out
    )
    assert "the master and the pilot decide" in out.lower()


def test_json_is_si_and_ends_at_the_contact(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["drift", str(TWIN), "--stage", "3", "--json", "--every", "20"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["scenario"] == "as_set" and data["units"]["speed"] == "m/s"
    track = data["track"]
    assert track[0]["time_s"] == 0.0
    assert [t["time_s"] for t in track[:3]] == [0.0, 20.0, 40.0]
    assert track[-1]["time_s"] == pytest.approx(data["contact"]["time_s"])
    assert all(math.isfinite(v) for t in track for v in t.values())
    assert data["inertia"]["mass_kg"] == pytest.approx(7.5e6)


def test_let_go_with_a_short_look_ahead(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["drift", str(TWIN), "--stage", "2", "--let-go", "--seconds", "90"]) == 0
    out = capsys.readouterr().out
    assert "all lines let go" in out
    assert "no contact within 90 s" in out
    assert out.count("\n     ") >= 10  # a row every 10 s, and the header


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (("--stage", "9"), "towboard: --stage: 9 must be from 1 to 4"),
        (("--stage", "1", "--lose", "Nobody"), "'Nobody' does not work on Lark pair"),
        (("--stage", "1", "--seconds", "-3"), "--seconds: -3.0 must be above 0 and at most 3600"),
        (("--stage", "1", "--every", "0"), "--every: 0.0 must be from 0.1 to 3600 seconds"),
        # 1e-9 s over the plan's 600 s once asked numpy for 6e11 times (37 GiB)
        (("--stage", "1", "--every", "1e-9"), "--every: 1e-09 must be from 0.1 to 3600 seconds"),
        (("--stage", "1", "--every", "nan"), "--every: nan must be from 0.1 to 3600 seconds"),
        # 3600 s / 0.1 s = 36,000 steps, and the row at 0 s: 36,001 rows, over the cap
        (
            ("--stage", "1", "--seconds", "3600", "--every", "0.1"),
            "--every: 0.1 gives 36,001 rows over the 3600 s look ahead, more than 10,000: "
            "take at least 0.37 s",
        ),
        # an empty name once meant "pulls as set"
        (("--stage", "1", "--lose", ""), "--lose: '' must name a tug"),
        (("--stage", "1", "--lose", " "), "--lose: ' ' must name a tug"),
        (("--stage", "1", "--lose", "Rowan", "--let-go"), "not allowed with argument --lose"),
        (("--stage", "x"), "argument --stage: invalid int value"),
    ],
)
def test_bad_input_exits_2_with_one_line(
    capsys: pytest.CaptureFixture[str], args: tuple[str, ...], message: str
) -> None:
    assert _run(["drift", str(TWIN), *args]) == 2
    err = capsys.readouterr().err
    assert message in err
    assert err.count("\n") == 1 and "Traceback" not in err


def test_the_finest_track_allowed_prints_every_row(capsys: pytest.CaptureFixture[str]) -> None:
    # 60 s every 0.1 s: 600 steps and the row at 0 s, well within the cap of 10,000 rows
    argv = ["drift", str(TWIN), "--stage", "2", "--let-go", "--seconds", "60", "--every", "0.1"]
    assert main([*argv, "--json"]) == 0
    track = json.loads(capsys.readouterr().out)["track"]
    assert len(track) == 601
    assert track[1]["time_s"] == pytest.approx(0.1)


def test_a_file_that_cannot_be_read(capsys: pytest.CaptureFixture[str], tmp_path: Path) -> None:
    assert main(["drift", str(tmp_path / "none.towboard"), "--stage", "1"]) == 2
    assert "none.towboard: cannot be read" in capsys.readouterr().err


def _run(argv: list[str]) -> int:
    """main's exit code, whether it returns it or argparse exits with it."""
    try:
        return main(argv)
    except SystemExit as e:
        return int(e.code or 0)
