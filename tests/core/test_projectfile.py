"""The .towboard file: round trips, every problem reported with its field path, atomic save."""

from __future__ import annotations

import copy
import json
import os
import re
import sys
import threading
from pathlib import Path
from typing import Any

import jsonschema
import pytest

from core.errors import FormatVersionError, ProjectFileError
from core.io import projectfile
from core.io.paths import TooLarge, read_at_most
from core.io.projectfile import MAX_FILE_BYTES, backup_path, dumps, load, loads, save

ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "docs" / "towboard.schema.json").read_text())
SAMPLES = sorted((ROOT / "sample_projects").glob("*.towboard"))


def _sample_data() -> dict[str, Any]:
    return json.loads((ROOT / "sample_projects" / "deck_barge_unberth.towboard").read_text())


def _problems(data: Any) -> list[str]:
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    return [str(p) for p in e.value.problems]


def test_there_are_at_least_two_samples() -> None:
    assert len(SAMPLES) >= 2


@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.name)
def test_samples_load_match_the_schema_and_round_trip_byte_identical(
    path: Path, tmp_path: Path
) -> None:
    text = path.read_text(encoding="utf-8")
    jsonschema.validate(json.loads(text), SCHEMA)
    project = loads(text, path.name)
    assert dumps(project) == text
    out = tmp_path / "copy.towboard"
    save(project, out)
    first = out.read_bytes()
    save(load(out), out)
    assert out.read_bytes() == first


@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.name)
def test_the_compact_text_holds_the_same_plan_on_one_line(path: Path) -> None:
    """The recovery file's form: the same JSON values as the file, on one line."""
    project = load(path)
    text = dumps(project, compact=True)
    assert text.endswith("}\n") and text.count("\n") == 1
    assert json.loads(text) == json.loads(dumps(project))
    assert loads(text) == project


def test_saved_files_match_the_schema(tmp_path: Path) -> None:
    for path in SAMPLES:
        jsonschema.validate(json.loads(dumps(load(path))), SCHEMA)


def test_setting_above_100_names_the_field_path() -> None:
    data = _sample_data()
    data["stages"][1]["tugs"][2]["setting_percent"] = 130
    assert _problems(data) == ["stages[1].tugs[2].setting_percent: 130.0 % must be at most 100 %"]


def test_every_problem_is_reported_not_just_the_first() -> None:
    data = _sample_data()
    data["tugs"][0]["bollard_pull_kN"] = -5
    data["hulls"][0]["outline_m"][1] = ["x", 3]
    data["stages"][0]["tugs"][1]["tug"] = "Nobody"
    data["stages"][0]["conditions"]["wind_speed_kn"] = -3
    problems = _problems(data)
    assert "tugs[0].bollard_pull_kN: -5.0 kN must be at least 0.980665 kN" in problems
    assert "hulls[0].outline_m[1]: ['x', 3] is not a pair of numbers [x, y]" in problems
    assert "stages[0].tugs[1].tug: 'Nobody' is not a tug of this plan" in problems
    assert "stages[0].conditions.wind_speed_kn: -3.0 kn must not be negative" in problems


#: Ratings and hull figures a denormal once passed as "positive" and broke later (an
#: IndexError in the solver, an infinite share of a rating, a drift preview without end).
TINY_FIELDS = [
    (("tugs", 0, "bollard_pull_kN"), "must be at least 0.980665 kN"),
    (("tugs", 0, "towline_mbl_kN"), "must be at least 0.980665 kN"),
    (("hulls", 0, "fittings", 0, "swl_kN"), "must be at least 0.980665 kN"),
    (("hulls", 0, "fittings", 0, "tow_kN"), "must be at least 0.980665 kN"),
    (("hulls", 0, "draught_m"), "must be at least 0.01 m"),
    (("hulls", 0, "freeboard_m"), "must be at least 0.01 m"),
    (("hulls", 0, "displacement_t"), "must be at least 1 t"),
    (("tug_efficiency", "bollard_pull_kN", 0), "must be at least 0.980665 kN"),
]


@pytest.mark.parametrize("value", [5e-324, 1e-300])
@pytest.mark.parametrize(("where", "reason"), TINY_FIELDS, ids=lambda w: str(w))
def test_absurdly_small_ratings_and_sizes_are_refused_by_name(
    where: tuple[str | int, ...], reason: str, value: float
) -> None:
    data = _sample_data()
    inner = data
    for key in where[:-1]:
        inner = inner[key]
    inner[where[-1]] = value
    path = "".join(f"[{k}]" if isinstance(k, int) else f".{k}" for k in where).lstrip(".")
    said = [p for p in _problems(data) if p.startswith(f"{path}: ")]
    assert len(said) == 1 and said[0].endswith(reason), said


def test_unknown_fields_are_reported_not_dropped() -> None:
    data = _sample_data()
    data["tugs"][1]["colour"] = "blue"
    data["surprise"] = 1
    problems = _problems(data)
    assert "tugs[1].colour: is not a known field" in problems
    assert "surprise: is not a known field" in problems


def test_missing_required_field() -> None:
    data = _sample_data()
    del data["hulls"][0]["outline_m"]
    assert "hulls[0].outline_m: is missing" in _problems(data)


def test_self_crossing_outline_in_a_file_names_hull_and_edges() -> None:
    data = _sample_data()
    data["hulls"][0]["outline_m"] = [[0, 0], [10, 10], [10, 0], [0, 10]]
    data["hulls"][0]["fittings"] = []
    data["stages"] = []
    (problem,) = _problems(data)
    assert problem.startswith("hulls[0]: hull Kestrel 3 outline: crosses itself: edge 0")


def test_fitting_far_off_the_outline_is_a_problem() -> None:
    data = _sample_data()
    data["hulls"][0]["fittings"][0]["position_m"] = [84.0, 30.0]
    (problem,) = _problems(data)
    assert re.fullmatch(
        r"hulls\[0\]\.fittings\[0\]\.position_m: is \d+\.\d\d m off the hull outline", problem
    )


def test_placement_at_an_unknown_fitting_or_wrong_kind_of_lead() -> None:
    data = _sample_data()
    data["stages"][0]["tugs"][0]["point"] = "Funnel"
    data["stages"][0]["tugs"][2]["lead_deg"] = 45
    problems = _problems(data)
    assert "stages[0].tugs[0].point: 'Funnel' is not a fitting of hull Kestrel 3" in problems
    assert (
        "stages[0].tugs[2].lead_deg: does not apply at push point Stbd shoulder pad; use push_angle_deg"
        in problems
    )


def test_duplicate_names_are_problems() -> None:
    data = _sample_data()
    data["tugs"][1]["name"] = data["tugs"][0]["name"]
    data["stages"] = []
    assert _problems(data) == ["tug name: 'Gannet' is used twice"]


def test_newer_format_version_is_refused_clearly() -> None:
    data = _sample_data()
    data["format_version"] = 7
    with pytest.raises(
        FormatVersionError, match="format_version: 7 is newer than this Towboard reads"
    ):
        loads(json.dumps(data), "new.towboard")


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("{ not json", "not valid JSON"),
        ("[1, 2]", r"must be an object, not \[1, 2\]"),
        (
            '{"format": "towboard", "format_version": "one"}',
            "format_version: 'one' is not a format version",
        ),
        ('{"format": "other", "format_version": 1}', "format: 'other' is not 'towboard'"),
    ],
)
def test_malformed_files(text: str, message: str) -> None:
    with pytest.raises(ProjectFileError, match=message):
        loads(text, "bad.towboard")


def test_unreadable_and_non_utf8_files(tmp_path: Path) -> None:
    with pytest.raises(ProjectFileError, match="cannot be read"):
        load(tmp_path / "absent.towboard")
    bad = tmp_path / "latin.towboard"
    bad.write_bytes(b"\xff\xfe{}")
    with pytest.raises(ProjectFileError, match="is not UTF-8 text"):
        load(bad)


def test_a_file_over_the_limit_is_refused_by_its_size_unread(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    monkeypatch.setattr(projectfile, "MAX_FILE_BYTES", 1000)
    big = tmp_path / "big.towboard"
    big.write_bytes(b" " * 1001)
    with pytest.raises(ProjectFileError) as e:
        load(big)
    assert str(e.value) == f"{big}: is larger than 0.001 MB, far more than any plan holds; not read"
    big.write_bytes(b" " * 1000)  # at the limit it is read (and is no plan)
    with pytest.raises(ProjectFileError, match="not valid JSON"):
        load(big)


def test_a_device_is_read_only_up_to_the_limit() -> None:
    # /dev/zero never ends: it was once read until memory ran out
    with pytest.raises(TooLarge):
        read_at_most("/dev/zero", 3_000_000)
    assert read_at_most("/dev/null", 10) == b""


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="no FIFOs here")
@pytest.mark.parametrize(("size", "refused"), [(5000, False), (5001, True)])
def test_a_fifo_is_read_only_up_to_the_limit(tmp_path: Path, size: int, refused: bool) -> None:
    fifo = tmp_path / "plan.towboard"
    os.mkfifo(fifo)

    def write() -> None:
        try:
            with open(fifo, "wb") as f:
                for _ in range(size // 1000):
                    f.write(b"x" * 1000)
                f.write(b"x" * (size % 1000))
        except BrokenPipeError:  # the reader refused and closed its end
            pass

    writer = threading.Thread(target=write)
    writer.start()
    try:
        if refused:
            with pytest.raises(TooLarge):
                read_at_most(fifo, 5000)
        else:
            assert read_at_most(fifo, 5000) == b"x" * size
    finally:
        writer.join()


def test_the_largest_plans_of_the_growth_benchmark_are_far_under_the_limit() -> None:
    sys.path.insert(0, str(ROOT / "benchmarks"))
    try:
        from growth import outline_text, placements_text
    finally:
        sys.path.remove(str(ROOT / "benchmarks"))
    for text in (outline_text(100_000), placements_text(10_000)):
        saved = dumps(loads(text)).encode("utf-8")  # as the program writes them: 4 and 16 MB
        assert len(saved) * 5 < MAX_FILE_BYTES


def test_save_keeps_the_previous_file_as_a_backup(tmp_path: Path) -> None:
    path = tmp_path / "plan.towboard"
    first = load(SAMPLES[0])
    save(first, path)
    old = path.read_bytes()
    second = first.with_stages(first.stages[:1])
    save(second, path)
    assert backup_path(path).read_bytes() == old
    assert load(path) == second
    assert not [p for p in tmp_path.iterdir() if p.name.endswith(".tmp")]


def test_a_failed_save_leaves_the_old_file_whole(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    path = tmp_path / "plan.towboard"
    project = load(SAMPLES[0])
    save(project, path)
    before = path.read_bytes()

    def broken_fsync(fd: int) -> None:
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(projectfile.os, "fsync", broken_fsync)
    with pytest.raises(ProjectFileError, match="cannot be written: No space left on device"):
        save(project.with_stages(()), path)
    assert path.read_bytes() == before
    assert sorted(p.name for p in tmp_path.iterdir()) == ["plan.towboard"]


def test_round_trip_keeps_every_value() -> None:
    for path in SAMPLES:
        project = load(path)
        assert loads(dumps(project)) == project


def test_file_text_is_stable_through_unit_conversions() -> None:
    # kN in the file, N in the core: twelve significant digits keep the text fixed.
    data = _sample_data()
    data["tugs"][0]["bollard_pull_kN"] = 539.3657
    data["hulls"][0]["fittings"][0]["swl_kN"] = 1000 / 3
    text = dumps(loads(json.dumps(data)))
    assert dumps(loads(text)) == text
    assert json.loads(text)["tugs"][0]["bollard_pull_kN"] == 539.3657


def test_loading_does_not_change_the_input(tmp_path: Path) -> None:
    data = _sample_data()
    keep = copy.deepcopy(data)
    loads(json.dumps(data))
    assert data == keep
    assert os.path.exists(SAMPLES[0])


def test_the_documented_example_loads_and_matches_the_schema() -> None:
    text = (ROOT / "docs" / "file-format.md").read_text()
    example = text.split("```json", 1)[1].split("```", 1)[0]
    data = json.loads(example)
    jsonschema.validate(data, SCHEMA)
    project = loads(example, "file-format.md")
    assert project.tugs[0].bollard_pull_n == pytest.approx(45 * 9806.65)
    jsonschema.validate(json.loads(dumps(project)), SCHEMA)


@pytest.mark.parametrize("t", [1 / 3, 1 / 7, 0.123456789, 0.5, 2 / 3, 0.987654321])
@pytest.mark.parametrize("far", [0.0, -20538.41, 95_345.678], ids=["at 0", "20 km", "95 km"])
def test_a_fitting_on_a_slanted_edge_saves_to_the_same_text_every_time(
    t: float, far: float
) -> None:
    # Found by the monkey: a fitting snapped onto a slanted edge is written to 12 significant
    # digits, which puts it a hair off the edge; loading snapped it again to a slightly other
    # point, so every save of the loaded plan wrote different digits. A point within a
    # nanometre of the outline is on it (the file's own precision, docs/file-format.md),
    # and within more as the coordinates grow (the monkey again: a hull dragged 20 km off;
    # an outline drawn in a site's coordinates lies kilometres out).
    from core.model.hull import Fitting, Hull
    from core.model.plan import Project, Stage

    raked = ((0.0, 0.0), (60.0, 0.0), (71.3, 9.1), (60.0, 18.0), (0.0, 18.0))
    outline = tuple((x + far, y + far / 10) for x, y in raked)
    x0, y0 = outline[1]
    at = (x0 + 11.3 * t, y0 + 9.1 * t)  # on the raked edge from (60, 0) to (71.3, 9.1)
    hull = Hull("Raked", outline, fittings=(Fitting("Bow bitt", "line", *at),))
    project = Project(name="Raked bow", hulls=(hull,), stages=(Stage("Stage 1"),))
    first = dumps(project)
    again = loads(first)
    assert dumps(again) == first
    assert loads(dumps(again)) == again
    f = again.hull("Raked").fitting("Bow bitt")
    assert (f.x, f.y) == pytest.approx(at, rel=5e-12, abs=1e-9)  # the file's 12 digits
