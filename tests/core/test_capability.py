"""Tug types, capability, towlines, working sectors in the file, and line tension."""

from __future__ import annotations

import json
import math
from dataclasses import replace

import numpy as np
import pytest

from core.errors import InputError, ProjectFileError
from core.io.projectfile import dumps, loads
from core.mechanics.balance import analyse
from core.mechanics.fittings import line_tension_n
from core.mechanics.towline import girting_notice, towline_notices
from core.model import rules
from core.model.capability import (
    PLACEHOLDER_NOTE,
    Capability,
    CapabilityCurve,
    default_capability,
    tug_kind,
)
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug, sector_span
from core.units import DisplayUnits
from tests.core.plan_builders import TF, box_hull


@pytest.mark.parametrize(
    ("text", "kind"),
    [
        ("ASD", "ASD"),
        ("asd 2 x 1800 kW", "ASD"),
        ("Azimuth stern drive", "ASD"),
        ("Tractor", "tractor"),
        ("Conventional twin screw", "conventional twin screw"),
        ("twin screw", "conventional twin screw"),
        ("conventional", "conventional single screw"),
        ("Conventional single-screw", "conventional single screw"),
        ("", "other"),
        ("our harbour launch", "other"),
    ],
)
def test_type_words_name_a_kind(text: str, kind: str) -> None:
    assert tug_kind(text) == kind


def test_conventional_tug_has_a_small_astern_pull_and_works_on_a_line_only() -> None:
    # The rule (placeholder shares, no published source).
    t = Tug("Tern", 30 * TF, tug_type="conventional single screw")
    cap = t.capability_curves
    assert cap.placeholder and cap.note == PLACEHOLDER_NOTE
    assert cap.push is None and cap.push_pull is None
    assert t.astern_pull < 0.5 * t.bollard_pull_n
    assert t.share("line", 0.0) == 1.0
    assert t.share("line", 180.0) == pytest.approx(t.astern_pull / t.bollard_pull_n)
    assert t.share("push", 0.0) == 0.0


def test_placeholder_capability_follows_the_type_and_the_astern_pull() -> None:
    t = Tug("Gannet", 50 * TF, 40 * TF, "ASD")
    assert t.share("push_pull", 180.0) == pytest.approx(0.8)
    t2 = replace(t, astern_pull_n=45 * TF)
    assert t2.share("line", 180.0) == pytest.approx(0.9)
    t3 = replace(t2, tug_type="tractor")
    assert t3.share("push", 90.0) == default_capability("tractor").push.at_bearing(90.0)
    # A capability of the user's own stays as given.
    own = Capability(CapabilityCurve((0.0, 180.0), (1.0, 0.2)), None, None, False, "trials")
    t4 = t3.with_capability(own)
    assert replace(t4, astern_pull_n=10 * TF).capability_curves is own


def test_curve_is_linear_between_bearings_round_the_circle() -> None:
    c = CapabilityCurve((0.0, 90.0, 270.0), (1.0, 0.5, 0.3))
    assert c.at_bearing(45.0) == pytest.approx(0.75)
    assert c.at_bearing(315.0) == pytest.approx(0.65)  # between 270 (0.3) and 360 (1.0)
    assert c.at_bearing(-45.0) == pytest.approx(0.65)
    assert c.at_angles(np.array([-math.pi / 2]))[0] == pytest.approx(0.5)  # CCW -90 = 090


@pytest.mark.parametrize(
    ("bearings", "shares", "message"),
    [
        ((0.0, 90.0, 45.0), (1.0, 1.0, 1.0), "increasing order"),
        ((0.0, 360.0), (1.0, 1.0), "must be below 360"),
        # files as 360 (11 decimals), which is 0: it would save a curve that loads no more
        ((0.0, 359.9999999999999), (1.0, 1.0), "is 360 to the file's 11 decimals"),
        ((0.0,), (2.5,), "must be at most 2"),
        ((0.0, 90.0), (1.0,), "one share for each bearing"),
        ((0.0,), (math.nan,), "must be a finite number"),
    ],
)
def test_bad_curves_are_refused_with_a_reason(bearings, shares, message) -> None:  # type: ignore[no-untyped-def]
    with pytest.raises(InputError, match=message):
        CapabilityCurve(bearings, shares)


def test_a_curve_holds_its_bearings_to_the_file_s_digits() -> None:
    # 12 significant digits and at most 11 decimals, as the file writes them
    # (core.units.filed_degrees): the curve saved is the curve read back
    c = CapabilityCurve((0.0, 123.4567890123456789, 359.99999), (1.0, 0.5, 1.0))
    assert c.bearings_deg == (0.0, 123.456789012, 359.99999)
    assert rules.CAPABILITY_BEARING.span() == "0 to under 360°"
    assert rules.CAPABILITY_BEARING.holds(math.nextafter(360.0, 0.0))
    assert not rules.CAPABILITY_BEARING.holds(360.0)


def test_capability_needs_one_way_and_the_warning_share_is_checked() -> None:
    with pytest.raises(InputError, match="at least one way"):
        Capability(None, None, None)
    with pytest.raises(InputError, match="towline warning share of MBL.*must be at most 1"):
        Tug("Gannet", 50 * TF, towline_mbl_n=100e3, towline_warn_fraction=1.5)


def test_sector_span_keeps_a_whole_circle_and_wraps_the_rest() -> None:
    assert sector_span(0.0, 2 * math.pi) == pytest.approx((0.0, 2 * math.pi))
    lo, hi = sector_span(math.radians(170), math.radians(-170))
    assert math.degrees(hi - lo) == pytest.approx(20.0)
    assert sector_span(1.0, 1.0) == (1.0, 1.0)


def test_a_conventional_tug_at_a_push_point_gives_nothing_and_says_why() -> None:
    hull = box_hull("Barge", 80.0, 20.0)
    tugs = (Tug("Tern", 30 * TF, tug_type="conventional twin screw"),)
    stage = Stage("s", placements=(Placement("Tern", "Barge", "port pad", 0.5),))
    project = Project(hulls=(hull,), tugs=tugs, stages=(stage,))
    bal = analyse(project, stage)
    assert bal.shares[0].pull_n == 0.0
    assert any(n.code == "way_not_possible" and "pushing" in n.message for n in bal.notices)


def test_push_usable_pull_follows_the_capability_at_the_push_angle() -> None:
    # ASD placeholder: pushing 1.0 square on, 0.4 abeam, linear between: at 30 deg, 0.8.
    hull = box_hull("Barge", 80.0, 20.0)
    tugs = (Tug("Gannet", 50 * TF, tug_type="ASD"),)
    p = Placement("Gannet", "Barge", "port pad", 1.0, math.radians(30.0))
    project = Project(hulls=(hull,), tugs=tugs, stages=(Stage("s", placements=(p,)),))
    bal = analyse(project, project.stages[0])
    assert bal.shares[0].pull_n == pytest.approx(0.8 * 50 * TF)


# -- tension --------------------------------------------------------------------------------


def test_a_three_four_five_line_carries_five_quarters_of_its_pull() -> None:
    # Geometry: a line 3 up over 4 along is 5 long; T = H / cos(atan(3/4)) = H * 5/4.
    assert line_tension_n(100e3, math.atan2(3.0, 4.0)) == pytest.approx(125e3, rel=1e-12)
    assert line_tension_n(100e3, math.radians(36.87)) == pytest.approx(125e3, rel=1e-5)


def test_towline_tension_warns_above_its_share_of_mbl_and_a_short_line() -> None:
    # Share 0.5 of MBL (common practice, no source): 125 kN on a 240 kN line is 52 %.
    t = Tug("Gannet", 50 * TF, towline_length_m=40.0, towline_mbl_n=240e3)
    u = DisplayUnits(force="kN")
    got = towline_notices(t, 125e3, 45.0, u)
    assert [n.code for n in got] == ["towline_tension", "towline_short"]
    assert "52 % of its MBL" in got[0].message and "warned above 50 %" in got[0].message
    assert towline_notices(t, 119e3, 40.0, u) == ()
    # Just over: 120.7 kN is 50.3 % of 240 kN, over the 50 % warning, and the line 40.04 m
    # against 40 m carried. Whole percents and tenths of a metre read "50 % ... (warned
    # above 50 %)" and "drawn 40.0 m long but the tug carries 40.0 m".
    tension, short = towline_notices(t, 120.7e3, 40.04, u)
    assert "is 50.3 % of its MBL 240.0 kN (warned above 50.0 %" in tension.message
    assert short.message == "Gannet: the line is drawn 40.04 m long but the tug carries 40.00 m"


def test_girting_is_warned_for_a_conventional_tug_near_its_beam_with_way_on() -> None:
    conv = Tug("Tern", 30 * TF, tug_type="conventional single screw")
    asd = Tug("Gannet", 30 * TF, tug_type="ASD")
    assert girting_notice(conv, 80.0, headway=True) is not None
    assert girting_notice(conv, 80.0, headway=False) is None
    assert girting_notice(conv, 20.0, headway=True) is None
    assert girting_notice(asd, 80.0, headway=True) is None


# -- the file ---------------------------------------------------------------------------------


def _plan() -> Project:
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=3.0)
    own = Capability(
        CapabilityCurve((0.0, 90.0, 180.0, 270.0), (1.0, 0.3, 0.6, 0.3)),
        None,
        CapabilityCurve((0.0, 180.0), (1.0, 0.7)),
        False,
        "owner's trials",
    )
    tugs = (
        Tug(
            "Gannet",
            50 * TF,
            45 * TF,
            "ASD",
            towline_length_m=220.0,
            towline_mbl_n=1500e3,
            towline_warn_fraction=0.4,
            capability=own,
        ),
        Tug("Tern", 30 * TF, tug_type="conventional twin screw"),
    )
    stage = Stage(
        "s",
        poses=(BodyPose("Barge", 0.0, 0.0, 90.0),),
        placements=(
            Placement(
                "Gannet", "Barge", "port pad", 0.5, 0.0, 30.0, False, (-math.pi, math.pi), True
            ),
            Placement(
                "Tern", "Barge", "bow", 0.4, 0.0, 40.0, False, (-math.radians(20), math.radians(50))
            ),
        ),
    )
    return Project(hulls=(hull,), tugs=tugs, stages=(stage,))


def test_capability_towline_push_pull_and_whole_circle_sectors_round_trip() -> None:
    project = _plan()
    text = dumps(project)
    again = loads(text)
    assert again.tugs == project.tugs
    for a, b in zip(again.stages[0].placements, project.stages[0].placements, strict=True):
        assert a.push_pull == b.push_pull
        assert a.lead_sector_rad == pytest.approx(b.lead_sector_rad, abs=1e-12)
    assert dumps(again) == text
    data = json.loads(text)
    assert data["tugs"][0]["capability"]["placeholder"] is False
    assert data["tugs"][1]["capability"]["placeholder"] is True  # marked in the file
    t = data["tugs"][0]
    assert (t["towline_length_m"], t["towline_mbl_kN"], t["towline_warning_share_of_mbl"]) == (
        220.0,
        1500.0,
        0.4,
    )
    pl = data["stages"][0]["tugs"]
    assert pl[0]["push_pull"] is True and pl[0]["lead_sector_deg"] == [-180.0, 180.0]
    assert pl[1]["lead_sector_deg"] == [310.0, 20.0]


def test_an_old_file_without_the_new_fields_loads_with_the_placeholders() -> None:
    data = json.loads(dumps(_plan()))
    for t in data["tugs"]:
        del t["capability"], t["towline_warning_share_of_mbl"]
    del data["stages"][0]["tugs"][0]["push_pull"]
    p = loads(json.dumps(data))
    assert p.tugs[0].capability_curves.placeholder
    assert p.tugs[0].towline_warn_fraction == 0.5
    assert not p.stages[0].placements[0].push_pull


@pytest.mark.parametrize(
    ("edit", "message"),
    [
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(
                line=[[0, 1], [90]]
            ),
            "tugs[0].capability.bearing_deg_and_share.line[1]: [90] is not a pair",
        ),
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(
                line=[[90, 1], [0, 1]]
            ),
            "tugs[0].capability.bearing_deg_and_share.line: capability bearings: [90.0, 0.0] must be in increasing order",
        ),
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(line=[[0, 3]]),
            "line[0][1]: 3.0 must be at most 2",
        ),
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(line=[]),
            "tugs[0].capability.bearing_deg_and_share.line: "
            "must be a list of 1 to 360 [bearing_deg, share] pairs, or null",
        ),
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(
                push=[[0, 1], [400, 1]]
            ),
            "tugs[0].capability.bearing_deg_and_share.push[1][0]: 400.0° must be below 360°",
        ),
        (
            lambda d: d["tugs"][0]["capability"]["bearing_deg_and_share"].update(
                push=[[0, 1], [360, 1]]
            ),
            "tugs[0].capability.bearing_deg_and_share.push[1][0]: 360.0° must be below 360°",
        ),
        (
            lambda d: d["tugs"][0].update(towline_warning_share_of_mbl=1.5),
            "tugs[0].towline_warning_share_of_mbl: 1.5 must be at most 1",
        ),
        (
            lambda d: d["tugs"][0]["capability"].update(colour="red"),
            "tugs[0].capability.colour: is not a known field",
        ),
        (
            lambda d: d["stages"][0]["tugs"][1].update(push_pull=True),
            "stages[0].tugs[1].push_pull: applies at a push point only",
        ),
    ],
)
def test_bad_capability_and_placement_fields_name_their_path(edit, message) -> None:  # type: ignore[no-untyped-def]
    data = json.loads(dumps(_plan()))
    edit(data)
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data))
    assert message in e.value.details()
