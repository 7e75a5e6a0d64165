"""The file reader's plain path (core.io.plain): tugs and placements written plainly are
read at once, each field checked once by its rule, and built without a second check
(core.model.checked). It must give the value the careful reader gives, take nothing the
careful reader refuses (so every refusal still names its field), and leave the values
as frozen as any other."""

from __future__ import annotations

import dataclasses
import gc
import json
import math
from contextlib import contextmanager
from typing import Any
from unittest import mock

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from core.errors import ProjectFileError
from core.io import decode as decode_module
from core.io import plain, projectfile
from core.io.projectfile import dumps, loads
from core.model import checked, rules
from core.model.tugs import Placement, Tug

LINE_POINTS = {"Bow": [100.0, 0.0], "Stern": [0.0, 0.0], "Port": [50.0, 15.0]}
PUSH_POINTS = {"Pad": [50.0, -15.0]}


def _plan(tugs: list[dict[str, Any]], placed: list[dict[str, Any]]) -> dict[str, Any]:
    fittings = [{"name": n, "kind": "line", "position_m": p} for n, p in LINE_POINTS.items()]
    fittings += [{"name": n, "kind": "push", "position_m": p} for n, p in PUSH_POINTS.items()]
    return {
        "format": "towboard",
        "format_version": 1,
        "plan": {"name": "Plain path"},
        "hulls": [
            {
                "name": "Barge",
                "outline_m": [[0.0, -15.0], [100.0, -15.0], [100.0, 15.0], [0.0, 15.0]],
                "fittings": fittings,
            }
        ],
        "tugs": tugs,
        "stages": [{"name": "Hold", "kind": "other", "tugs": placed}],
    }


@contextmanager
def _entries_only() -> Any:
    """The loader with its whole-list readers turned off: each entry read on its own."""
    with (
        mock.patch.object(decode_module.plain, "tugs", lambda ds: plain.NOT_PLAIN),
        mock.patch.object(decode_module.plain, "placements", lambda t, k, ds: plain.NOT_PLAIN),
    ):
        yield


@contextmanager
def _careful_only() -> Any:
    """The loader with its plain path turned off: every entry read the careful way."""
    with (
        _entries_only(),
        mock.patch.object(decode_module.plain, "tug", lambda d: plain.NOT_PLAIN),
        mock.patch.object(decode_module.plain, "placement", lambda t, k, d: plain.NOT_PLAIN),
    ):
        yield


def _problems(data: Any) -> list[str]:
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data))
    return [str(p) for p in e.value.problems]


# -- the same value either way -------------------------------------------------------------


def _in_file_units(rule: rules.Range) -> st.SearchStrategy[float | int]:
    """Numbers in the file's unit that keep ``rule`` (ints and floats)."""
    factor = rules.unit_of(rule.kind, decode_module.FILE_UNITS)[0]
    lo, hi = rule.low / factor, rule.high / factor
    floats = st.floats(lo, hi, exclude_min=rule.above, allow_nan=False)
    ints = st.integers(math.floor(lo) + 1, math.floor(hi))
    return st.one_of(floats, ints)


labels = st.text(max_size=20).filter(lambda t: rules.LABEL.problem(t) is None)

OPTIONAL_TUG = {
    "astern_pull_kN": st.one_of(st.none(), _in_file_units(rules.ASTERN_PULL)),
    "towing_point_height_m": st.one_of(st.none(), _in_file_units(rules.TOWING_POINT_HEIGHT)),
    "towline_length_m": st.one_of(st.none(), _in_file_units(rules.TOWLINE_LENGTH)),
    "towline_mbl_kN": st.one_of(st.none(), _in_file_units(rules.TOWLINE_MBL)),
    "towline_warning_share_of_mbl": _in_file_units(rules.TOWLINE_WARN_SHARE),
    "type": st.one_of(labels, st.sampled_from(["ASD", "tractor", "conventional twin screw"])),
    "role": labels,
    "certificate_date": labels,
    "call_sign": labels,
    "working_channel": labels,
}


@st.composite
def tug_entries(draw: st.DrawFn, name: str) -> dict[str, Any]:
    d: dict[str, Any] = {"name": name, "bollard_pull_kN": draw(_in_file_units(rules.BOLLARD_PULL))}
    for key in draw(st.lists(st.sampled_from(sorted(OPTIONAL_TUG)), unique=True)):
        d[key] = draw(OPTIONAL_TUG[key])
    return d


@st.composite
def placement_entries(draw: st.DrawFn, tug: str) -> dict[str, Any]:
    point = draw(st.sampled_from([*LINE_POINTS, *PUSH_POINTS]))
    d: dict[str, Any] = {
        "tug": tug,
        "hull": "Barge",
        "point": point,
        "setting_percent": draw(_in_file_units(rules.SETTING.named("s"))),
    }
    push = point in PUSH_POINTS
    optional = {
        "astern": st.booleans(),
        # A working sector is not the plain path's: the careful reader reads it.
        "lead_sector_deg": st.one_of(st.none(), st.just([350, 10])),
    }
    if push:
        optional |= {"push_angle_deg": _in_file_units(rules.PUSH_ANGLE), "push_pull": st.booleans()}
    else:
        optional |= {
            "lead_deg": _in_file_units(rules.BEARING),
            "line_length_m": _in_file_units(rules.LINE_LENGTH),
            "push_pull": st.just(False),
        }
    for key in draw(st.lists(st.sampled_from(sorted(optional)), unique=True)):
        d[key] = draw(optional[key])
    return d


@st.composite
def plans(draw: st.DrawFn) -> dict[str, Any]:
    names = [f"Tug {i}" for i in range(draw(st.integers(1, 6)))]
    tugs = [draw(tug_entries(n)) for n in names]
    placed = [draw(placement_entries(n)) for n in names]
    return _plan(tugs, placed)


@settings(max_examples=150, deadline=None)
@given(plans())
def test_the_plain_path_reads_what_the_careful_reader_reads(data: dict[str, Any]) -> None:
    kinds = {"Barge": {**dict.fromkeys(LINE_POINTS, "line"), **dict.fromkeys(PUSH_POINTS, "push")}}
    names = {t["name"] for t in data["tugs"]}
    for d in data["tugs"]:
        assert plain.tug(d) is not plain.NOT_PLAIN, d
    assert plain.tugs(data["tugs"]) == [plain.tug(d) for d in data["tugs"]]
    placed = data["stages"][0]["tugs"]
    for d in placed:
        took = plain.placement(names, kinds, d) is not plain.NOT_PLAIN
        assert took == (d.get("lead_sector_deg") is None), d
    whole = plain.placements(names, kinds, placed)
    if any(d.get("lead_sector_deg") is not None for d in placed):
        assert whole is plain.NOT_PLAIN
    else:
        assert whole == [plain.placement(names, kinds, d) for d in placed]
    text = json.dumps(data)
    fast = loads(text)
    with _entries_only():
        by_entry = loads(text)
    with _careful_only():
        careful = loads(text)
    assert fast == by_entry == careful
    assert dumps(fast) == dumps(by_entry) == dumps(careful)
    assert dumps(loads(dumps(fast))) == dumps(fast)  # save -> load -> save, byte for byte


def test_a_plan_of_many_tugs_is_read_by_the_plain_path() -> None:
    tugs = [{"name": f"Tug {i}", "bollard_pull_kN": 400 + i} for i in range(50)]
    placed = [
        {"tug": f"Tug {i}", "hull": "Barge", "point": "Bow", "setting_percent": i, "lead_deg": i}
        for i in range(50)
    ]
    project = loads(json.dumps(_plan(tugs, placed)))
    with _careful_only():
        assert loads(json.dumps(_plan(tugs, placed))) == project
    assert [t.bollard_pull_n for t in project.tugs] == [(400 + i) * 1000.0 for i in range(50)]
    settings_ = [p.setting for p in project.stages[0].placements]
    assert settings_ == pytest.approx([i / 100 for i in range(50)], rel=1e-15)


# -- what the careful reader refuses, the plain path does not take ---------------------------

TUG = {"name": "Castor", "bollard_pull_kN": 600}
LINE = {"tug": "Castor", "hull": "Barge", "point": "Bow", "setting_percent": 50, "lead_deg": 10}
PUSH = {"tug": "Castor", "hull": "Barge", "point": "Pad", "setting_percent": 50}

BAD_TUG_FIELDS = [
    ("bollard_pull_kN", -5, "-5.0 kN must be at least 0.980665 kN"),
    ("bollard_pull_kN", 0.5, "0.5 kN must be at least 0.980665 kN"),
    ("bollard_pull_kN", 1e6, "1e+06 kN must be at most 9806.65 kN"),
    ("bollard_pull_kN", True, "true is not a number"),
    ("bollard_pull_kN", None, "must be a number, not null"),
    ("bollard_pull_kN", "600", "'600' is not a number"),
    ("bollard_pull_kN", math.nan, "NaN kN must be a finite number"),
    ("bollard_pull_kN", math.inf, "infinity kN must be a finite number"),
    ("bollard_pull_kN", 10**400, "a very long integer is too large a number"),
    ("astern_pull_kN", -1, "-1.0 kN must not be negative"),
    ("astern_pull_kN", False, "false is not a number"),
    ("towing_point_height_m", 51, "51.0 m must be at most 50 m"),
    ("towline_length_m", 0, "0.0 m must be positive"),
    ("towline_mbl_kN", 0.5, "0.5 kN must be at least 0.980665 kN"),
    ("towline_warning_share_of_mbl", 0, "0.0 must be positive"),
    ("towline_warning_share_of_mbl", 1.5, "1.5 must be at most 1"),
    ("towline_warning_share_of_mbl", None, "must be a number, not null"),
    ("type", 5, "5 is not text"),
    ("type", None, "None is not text"),
    ("role", "a\ud800", "'a\\ud800' has a lone surrogate (U+D800) at character 2, which"),
    ("call_sign", "x" * 201, "'xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx...' is 201 characters"),
]


@pytest.mark.parametrize(("key", "value", "said"), BAD_TUG_FIELDS)
def test_a_bad_tug_field_is_refused_with_its_name(key: str, value: Any, said: str) -> None:
    tug = {**TUG, key: value}
    assert plain.tug(tug) is plain.NOT_PLAIN
    problems = _problems(_plan([tug], []))
    assert any(p.startswith(f"tugs[0].{key}: {said}") for p in problems), problems


@pytest.mark.parametrize(
    ("name", "said"),
    [
        ("", "'' must not be empty"),
        ("a\x00b", "'a\\x00b' has a control character (U+0000)"),
        (7, "7 is not text"),
    ],
)
def test_a_bad_tug_name_is_refused(name: Any, said: str) -> None:
    tug = {**TUG, "name": name}
    assert plain.tug(tug) is plain.NOT_PLAIN
    assert any(p.startswith(f"tugs[0].name: {said}") for p in _problems(_plan([tug], [])))


def test_a_tug_with_an_unknown_key_or_its_own_tables_is_not_plain() -> None:
    assert plain.tug({**TUG, "colour": "red"}) is plain.NOT_PLAIN
    assert plain.tug({**TUG, "headway": {"speed_kn_and_share": [[0, 1]]}}) is plain.NOT_PLAIN
    assert plain.tug({**TUG, "capability": {"placeholder": True}}) is plain.NOT_PLAIN
    assert plain.tug([TUG]) is plain.NOT_PLAIN
    assert "tugs[0].colour: is not a known field" in _problems(_plan([{**TUG, "colour": 1}], []))


def test_a_pull_that_rounds_past_its_bound_is_not_taken_and_is_refused() -> None:
    # The file's pulls are kept as written (12 digits, so a plan's first save gives the same
    # file): 0.9806649990194 kN keeps the bollard pull's rule (at least 0.980665 kN, less a
    # part in 1e9) but written to 12 digits, 0.980664999019 kN, it does not.
    tug = {**TUG, "bollard_pull_kN": 0.9806649990194}
    assert rules.BOLLARD_PULL.holds(0.9806649990194 * 1000)
    assert not rules.BOLLARD_PULL.holds(0.980664999019 * 1000)
    assert plain.tug(tug) is plain.NOT_PLAIN
    problems = _problems(_plan([tug], []))
    assert len(problems) == 1 and problems[0].startswith("tugs[0]: tug Castor: bollard pull: ")
    inside = {**TUG, "bollard_pull_kN": 0.98066500000049}  # rounds to 0.980665000000
    assert plain.tug(inside).bollard_pull_n == 980.665


BAD_PLACEMENT_FIELDS = [
    (LINE, "setting_percent", 101, "101.0 % must be at most 100 %"),
    (LINE, "setting_percent", -1, "-1.0 % must not be negative"),
    (LINE, "setting_percent", True, "true is not a number"),
    (LINE, "setting_percent", None, "must be a number, not null"),
    (LINE, "lead_deg", 1e9, "1e+09° must be at most 36000°"),
    (LINE, "lead_deg", "north", "'north' is not a number"),
    (LINE, "line_length_m", 0, "0.0 m must be positive"),
    (LINE, "line_length_m", 5001, "5001.0 m must be at most 5000 m"),
    (LINE, "push_angle_deg", 10, "does not apply at line point Bow; use lead_deg"),
    (LINE, "push_pull", True, "applies at a push point only; Bow is a line point"),
    (LINE, "astern", 1, "1 is not true or false"),
    (LINE, "tug", "Pollux", "'Pollux' is not a tug of this plan"),
    (LINE, "tug", ["Castor"], "['Castor'] is not text"),  # a list for a name
    (LINE, "hull", "Lighter", "'Lighter' is not a hull of this plan"),
    (LINE, "point", "Mast", "'Mast' is not a fitting of hull Barge"),
    (PUSH, "push_angle_deg", 90, "90.0° must be at most 89.999°"),
    (PUSH, "lead_deg", 10, "does not apply at push point Pad; use push_angle_deg"),
    (PUSH, "push_pull", 0, "0 is not true or false"),
]


@pytest.mark.parametrize(("base", "key", "value", "said"), BAD_PLACEMENT_FIELDS)
def test_a_bad_placement_field_is_refused_with_its_name(
    base: dict[str, Any], key: str, value: Any, said: str
) -> None:
    placed = {**base, key: value}
    kinds = {"Barge": {"Bow": "line", "Pad": "push"}}
    assert plain.placement({"Castor"}, kinds, placed) is plain.NOT_PLAIN
    problems = _problems(_plan([TUG], [placed]))
    path = f"stages[0].tugs[0].{key}: "
    assert any(p.startswith(path) and said in p for p in problems), problems


def test_a_placement_missing_its_setting_is_refused() -> None:
    placed = {k: v for k, v in LINE.items() if k != "setting_percent"}
    assert plain.placement({"Castor"}, {"Barge": {"Bow": "line"}}, placed) is plain.NOT_PLAIN
    assert "stages[0].tugs[0].setting_percent: is missing" in _problems(_plan([TUG], [placed]))


# -- the values built from checked fields ----------------------------------------------------


def test_values_built_from_checked_fields_are_ordinary_frozen_values() -> None:
    p = checked.placement("Castor", "Barge", "Bow", 0.5, 0.25, 40.0, False, False)
    usual = Placement("Castor", "Barge", "Bow", 0.5, 0.25, 40.0, False, None, False)
    assert type(p) is Placement and p == usual and hash(p) == hash(usual)
    with pytest.raises(dataclasses.FrozenInstanceError):
        p.setting = 2.0  # type: ignore[misc]
    with pytest.raises(rules.RangeError, match="setting"):
        p.with_setting(2.0)  # an edit is checked as usual
    t = checked.tug("Castor", 6e5, 2e5, "ASD", "", None, "", 200.0, None, "", "", 0.5)
    usual_tug = Tug("Castor", 6e5, 2e5, "ASD", towline_length_m=200.0)
    assert type(t) is Tug and t == usual_tug and hash(t) == hash(usual_tug)
    assert t.capability == usual_tug.capability and t.headway == usual_tug.headway
    with pytest.raises(dataclasses.FrozenInstanceError):
        t.name = "Pollux"  # type: ignore[misc]
    with pytest.raises(rules.RangeError, match="astern pull"):
        t.with_astern_pull(-1.0)


def test_a_tug_placed_twice_in_a_stage_is_refused() -> None:
    # Both placements are plain; the stage still finds the tug placed twice.
    problems = _problems(_plan([TUG], [LINE, {**LINE, "point": "Stern"}]))
    assert problems == ["stages[0].tugs[1].tug: 'Castor' is placed twice in this stage"]


def test_placed_twice_is_said_at_the_file_s_entry_after_a_refused_one() -> None:
    # The second entry is refused on its own (a list for a name), so two placements are
    # read: the message still names the third entry, where the file places Castor again.
    problems = _problems(_plan([TUG], [LINE, {"tug": ["x"]}, {**LINE, "point": "Stern"}]))
    assert "stages[0].tugs[2].tug: 'Castor' is placed twice in this stage" in problems
    assert not any("'Castor' is placed twice" in p for p in problems if "tugs[2]" not in p)


ALL_RANGES = [v for v in vars(rules).values() if isinstance(v, rules.Range)]


@pytest.mark.parametrize("rule", ALL_RANGES, ids=[r.label for r in ALL_RANGES])
def test_a_ranges_limits_are_its_rule(rule: rules.Range) -> None:
    # The plain reader tests a number inline with the rule's limits: they must keep what
    # the rule keeps and refuse what it refuses, at each bound and either side of it.
    lo, hi = rule.limits()
    near = [rule.low, rule.high, lo, hi, 0.0, -0.0, 1.0, -1.0, 1e300, -1e300]
    values = [math.nan, math.inf, -math.inf]
    for v in near:
        if math.isfinite(v):
            values += [v, math.nextafter(v, math.inf), math.nextafter(v, -math.inf)]
    for x in values:
        assert (lo <= x <= hi) == rule.holds(x), (rule.label, x)


# -- a whole list at once: one entry not plain sends the list entry by entry -----------------

OTHERS = [{"name": "Rigel", "bollard_pull_kN": 450.5}, {"name": "Vega", "bollard_pull_kN": 700}]


def _among_others(entry: dict[str, Any], others: list[dict[str, Any]], at: int) -> list[Any]:
    return [*others[:at], entry, *others[at:]]


@pytest.mark.parametrize("at", [0, 1, 2])
@pytest.mark.parametrize(("key", "value", "said"), BAD_TUG_FIELDS)
def test_a_bad_tug_among_good_ones_is_refused_with_its_place(
    key: str, value: Any, said: str, at: int
) -> None:
    tugs = _among_others({**TUG, key: value}, OTHERS, at)
    assert plain.tugs(tugs) is plain.NOT_PLAIN
    problems = _problems(_plan(tugs, []))
    assert any(p.startswith(f"tugs[{at}].{key}: {said}") for p in problems), problems


@pytest.mark.parametrize("at", [0, 1, 2])
@pytest.mark.parametrize(("base", "key", "value", "said"), BAD_PLACEMENT_FIELDS)
def test_a_bad_placement_among_good_ones_is_refused_with_its_place(
    base: dict[str, Any], key: str, value: Any, said: str, at: int
) -> None:
    good = [
        {"tug": "Rigel", "hull": "Barge", "point": "Stern", "setting_percent": 20.5},
        {"tug": "Vega", "hull": "Barge", "point": "Pad", "setting_percent": 30},
    ]
    placed = _among_others({**base, key: value}, good, at)
    kinds = {"Barge": {"Bow": "line", "Stern": "line", "Pad": "push"}}
    assert plain.placements({"Castor", "Rigel", "Vega"}, kinds, placed) is plain.NOT_PLAIN
    problems = _problems(_plan([TUG, *OTHERS], placed))
    path = f"stages[0].tugs[{at}].{key}: "
    assert any(p.startswith(path) and said in p for p in problems), problems


@pytest.mark.parametrize(
    "bad",
    [math.nan, math.inf, -math.inf, 10**400, -(10**400), True, None, "5", 1e300, -1e-300],
)
@pytest.mark.parametrize("at", [0, 1, 2])
def test_a_column_with_one_number_not_taken_is_not_plain(bad: Any, at: int) -> None:
    # The column's least, greatest and sum are tested at once: a NaN or a huge integer
    # first, in the middle or last must not pass with them.
    raw = _among_others(bad, [12, 13.5], at)
    assert plain.columns.numbers(raw, rules.SETTING) is None
    assert plain.columns.numbers([*raw, math.nan], rules.SETTING) is None
    assert plain.columns.numbers([math.nan, *raw], rules.SETTING) is None


def test_a_column_of_numbers_gives_what_the_entry_reader_gives() -> None:
    raw = [0, 100, 12, 13.5, -0.0, 99.99999999999]
    read = plain.plain_number(rules.SETTING)
    si = plain.columns.numbers(raw, rules.SETTING)
    assert si == [read(v) for v in raw]
    assert all(type(v) is float for v in si)  # type: ignore[union-attr]
    assert [math.copysign(1, v) for v in si] == [math.copysign(1, read(v)) for v in raw]  # type: ignore[union-attr]
    nullable = [None, 5, None, 7.25]
    height = plain.plain_number(rules.TOWING_POINT_HEIGHT, nullable=True)
    got = plain.columns.numbers(nullable, rules.TOWING_POINT_HEIGHT, nullable=True)
    assert got == [height(v) for v in nullable]
    assert plain.columns.numbers([None, None], rules.TOWING_POINT_HEIGHT, nullable=True) == [
        None,
        None,
    ]
    assert plain.columns.numbers([None], rules.TOWING_POINT_HEIGHT) is None
    assert plain.columns.numbers([], rules.SETTING) == []


def test_a_plan_at_line_and_push_points_is_read_at_once() -> None:
    tugs = [{"name": f"Tug {i}", "bollard_pull_kN": 300 + i / 7} for i in range(40)]
    points = ["Bow", "Pad", "Stern", "Pad", "Port"]
    placed: list[dict[str, Any]] = []
    for i in range(40):
        d: dict[str, Any] = {
            "tug": f"Tug {i}",
            "hull": "Barge",
            "point": points[i % 5],
            "setting_percent": i * 2.5,
            "astern": i % 3 == 0,
        }
        if points[i % 5] == "Pad":
            d |= {"push_angle_deg": i - 20, "push_pull": i % 2 == 0}
        else:
            d |= {"lead_deg": i * 17.25 - 300, "line_length_m": 10 + i}
        placed.append(d)
    kinds = {"Barge": {**dict.fromkeys(LINE_POINTS, "line"), **dict.fromkeys(PUSH_POINTS, "push")}}
    names = {t["name"] for t in tugs}
    whole = plain.placements(names, kinds, placed)
    assert whole == [plain.placement(names, kinds, d) for d in placed]
    assert plain.tugs(tugs) == [plain.tug(d) for d in tugs]
    text = json.dumps(_plan(tugs, placed))
    with _careful_only():
        careful = loads(text)
    assert loads(text) == careful and dumps(loads(text)) == dumps(careful)


def test_a_tug_placed_twice_is_refused_when_read_at_once() -> None:
    tugs = [{"name": f"Tug {i}", "bollard_pull_kN": 300} for i in range(3)]
    placed = [
        {"tug": f"Tug {i % 2}", "hull": "Barge", "point": "Bow", "setting_percent": 5}
        for i in range(3)
    ]
    assert _problems(_plan(tugs, placed)) == [
        "stages[0].tugs[2].tug: 'Tug 0' is placed twice in this stage"
    ]


def test_names_of_a_column_are_held_to_the_name_rule() -> None:
    rule = rules.Text("test name", 10, required=True)
    assert rule.keeps_all(["Castor", "Pollux"]) and rule.keeps_all([])
    assert rule.keeps_all(["Castor", "Pollux"])  # known now: checked once
    for bad in ["", "   ", "x" * 11, "a\x00", "\ud800", "b\u2028c"]:
        assert not rule.keeps_all(["Vega", bad, "Rigel"]), bad
        assert rule.problem(bad) is not None
    # Two halves of a surrogate pair in two names stay two lone surrogates when joined.
    assert not rule.keeps_all(["a\ud83d", "\ude00b"])
    free = rules.Text("test notes", 20, multiline=True)
    assert free.keeps_all(["line\nbreak", "tab\there", ""])
    assert not free.keeps_all(["ok", "bell\x07"])


def test_a_load_leaves_the_cycle_collector_as_it_found_it() -> None:
    # The collector is held off while a plan is read, and on again after, whether the
    # load succeeds or fails; a load made while it is off leaves it off.
    text = json.dumps(_plan([TUG], [LINE]))
    seen: list[bool] = []
    decode = decode_module.decode

    def spy(data: Any) -> Any:
        seen.append(gc.isenabled())
        return decode(data)

    assert gc.isenabled()
    with mock.patch.object(projectfile, "decode", spy):
        loads(text)
        with pytest.raises(ProjectFileError):
            loads(json.dumps(_plan([TUG], [{**LINE, "setting_percent": 101}])))
    assert seen == [False, False] and gc.isenabled()
    with pytest.raises(ProjectFileError):
        loads("{")
    assert gc.isenabled()
    gc.disable()
    try:
        loads(text)
        assert not gc.isenabled()
    finally:
        gc.enable()
