"""The towboard command without a window: exit codes, messages, JSON."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
SAMPLE = ROOT / "sample_projects" / "pontoon_swing.towboard"


def _run(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run(
        [sys.executable, "-m", "app", *args], capture_output=True, text=True, cwd=ROOT, timeout=120
    )


def test_report_prints_each_stage() -> None:
    done = _run("report", str(SAMPLE))
    assert done.returncode == 0, done.stderr
    assert "Stage 1: Swing to port on the spot" in done.stdout
    assert "Alder" in done.stdout


def test_report_json_is_si_with_frame_stated() -> None:
    done = _run("report", str(SAMPLE), "--json")
    assert done.returncode == 0, done.stderr
    data = json.loads(done.stdout)
    assert data["units"]["force"] == "N"
    assert data["stages"][0]["balance"]["equivalent"]["kind"] == "couple"


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (("report", "missing.towboard"), "missing.towboard: cannot be read"),
        (("report",), "the following arguments are required: file"),
        (("report", str(SAMPLE), "--colour"), "unrecognized arguments: --colour"),
    ],
)
def test_bad_input_exits_2_with_one_line_and_no_traceback(
    args: tuple[str, ...], message: str
) -> None:
    done = _run(*args)
    assert done.returncode == 2
    assert message in done.stderr
    assert "Traceback" not in done.stderr
    assert len(done.stderr.strip().splitlines()) == 1


def test_report_of_an_endless_device_is_refused_in_one_line() -> None:
    # /dev/zero was read until memory ran out (a MemoryError traceback under a limit)
    done = _run("report", "/dev/zero")
    assert done.returncode == 2
    assert done.stderr == (
        "towboard: /dev/zero: is larger than 128 MB, far more than any plan holds; not read\n"
    )


def test_broken_file_names_the_field(tmp_path: Path) -> None:
    data = json.loads(SAMPLE.read_text())
    data["stages"][0]["tugs"][0]["setting_percent"] = 130
    bad = tmp_path / "bad.towboard"
    bad.write_text(json.dumps(data))
    done = _run("report", str(bad))
    assert done.returncode == 2
    assert "stages[0].tugs[0].setting_percent: 130.0 % must be at most 100 %" in done.stderr
    assert "Traceback" not in done.stderr


def test_a_denormal_bollard_pull_is_refused_in_one_line(tmp_path: Path) -> None:
    # 5e-324 kN passed as "positive" once and ended in an IndexError in the solver.
    data = json.loads(SAMPLE.read_text())
    data["tugs"][0]["bollard_pull_kN"] = 5e-324
    bad = tmp_path / "tiny.towboard"
    bad.write_text(json.dumps(data))
    for args in (("report", str(bad)), ("brief", str(bad), "-o", str(tmp_path / "x.pdf"))):
        done = _run(*args)
        assert done.returncode == 2, done.stderr
        assert "tugs[0].bollard_pull_kN: 4.94066e-324 kN must be at least 0.980665 kN" in (
            done.stderr
        )
        assert len(done.stderr.strip().splitlines()) == 1
    assert not (tmp_path / "x.pdf").exists()
