"""The report's JSON for the samples, against the core and against hand calculations.

The hand calculations read the sample file's own numbers and apply the statics of
equivalent systems directly (R = sum F, M = sum r x F about the centroid), with the
towline-angle rule horizontal = tension x cos(angle) (geometry, common practice).
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import numpy as np
import pytest
import shapely

from core.analysis.stage import balance_of, stage_result
from core.io.projectfile import load
from core.io.report import report_json, report_text
from tests.conftest import SAMPLES

ROOT = Path(__file__).resolve().parents[2]
TF = 9806.65  # N per tonne-force (NIST SP 811)


def test_pontoon_swing_is_a_pure_couple_by_hand() -> None:
    """The swing stage's pulls, as the report gives them, summed by hand (R = sum F,
    M = sum r x F about the centroid (30, 0) of the 60 x 28 m pontoon): no net force and
    the goal's 720 t*m, bow to port."""
    project = load(ROOT / "sample_projects" / "pontoon_swing.towboard")
    rep = report_json(project)
    bal = rep["stages"][0]["balance"]
    net, moment = np.zeros(2), 0.0
    for t in bal["tugs"]:
        b = math.radians(t["force_bearing_deg"])  # clockwise from ahead
        f = t["assigned_pull_N"] * np.array([math.cos(b), -math.sin(b)])
        x, y = {
            "Fwd port bollard": (60.0, 14.0),
            "Fwd stbd bollard": (60.0, -14.0),
            "Aft port bollard": (0.0, 14.0),
            "Aft stbd bollard": (0.0, -14.0),
        }[t["point"]]
        net += f
        moment += (x - 30.0) * f[1] - y * f[0]
    assert np.hypot(*net) == pytest.approx(0.0, abs=1e-6 * TF)
    assert moment == pytest.approx(720 * TF, rel=1e-6)  # 2 x 12 t x 30 m
    assert bal["equivalent"]["kind"] == "couple"
    assert bal["yaw_moment_about_centroid_Nm"] == pytest.approx(moment, rel=1e-6)
    assert bal["turning"] == "swings bow to port"
    assert bal["equivalent"]["crosses_centreline_at_x_m"] is None
    assert rep["units"] == {
        "force": "N",
        "moment": "N*m",
        "length": "m",
        "speed": "m/s",
        "angle": "deg",
    }
    assert "x forward, y to port" in rep["frame"]


def _hand_balance(data: dict, stage: int) -> tuple[np.ndarray, float, tuple[float, float]]:
    hull = data["hulls"][0]
    poly = shapely.Polygon(hull["outline_m"])
    c = (poly.centroid.x, poly.centroid.y)
    fittings = {f["name"]: f for f in hull["fittings"]}
    tugs = {t["name"]: t for t in data["tugs"]}
    net, moment = np.zeros(2), 0.0
    goal = data["stages"][stage]["goal"] or {}
    speed_kn = goal.get("speed_through_water_kn", 0.0) if goal.get("kind") == "transit" else 0.0
    for pl in data["stages"][stage]["tugs"]:
        f = fittings[pl["point"]]
        tug = tugs[pl["tug"]]
        x, y = f["position_m"]
        rated = (tug["astern_pull_kN"] if pl["astern"] else tug["bollard_pull_kN"]) * 1000
        # A transit's speed through the water: the tug's headway rows [kn, share], linear
        # between them and held beyond.
        rows = tug["headway"]["speed_kn_and_share"]
        rated *= float(np.interp(speed_kn, [r[0] for r in rows], [r[1] for r in rows]))
        if f["kind"] == "push":
            # square to the hull: the sample's pads are on the flat starboard side, inward is +y
            assert y == pytest.approx(-12.0)
            angle = math.radians(90 - pl["push_angle_deg"])
            # the tug's pushing capability at that angle off its bow (the file's pairs of
            # relative bearing and share, linear between them round the circle)
            pairs = tug["capability"]["bearing_deg_and_share"]["push"]
            b = [p[0] for p in pairs] + [pairs[0][0] + 360.0]
            v = [p[1] for p in pairs] + [pairs[0][1]]
            share = float(np.interp(pl["push_angle_deg"] % 360.0, b, v))
            pull = pl["setting_percent"] / 100 * rated * share
        else:
            angle = -math.radians(pl["lead_deg"])  # relative bearing clockwise -> CCW angle
            drop = abs(hull["freeboard_m"] - tug["towing_point_height_m"])
            pull = (
                pl["setting_percent"]
                / 100
                * rated
                * math.cos(math.atan2(drop, pl["line_length_m"]))
            )
        force = pull * np.array([math.cos(angle), math.sin(angle)])
        net += force
        moment += (x - c[0]) * force[1] - (y - c[1]) * force[0]
    for (x, y), force in _hand_conditions(data, stage):
        net += force
        moment += (x - c[0]) * force[1] - (y - c[1]) * force[0]
    return net, moment, c


def _hand_conditions(data: dict, stage: int) -> list[tuple[tuple[float, float], np.ndarray]]:
    """Wind and current by F = 1/2 rho C A V^2 on the head-on and side areas (outline
    extent x freeboard or draught), cos|cos| ahead and sin|sin| abeam of the flow, acting
    at the middle of the outline's extent, the sideways part moved towards the end the
    flow comes from by (1/2 - a)(1 - phi/90) L, phi the flow's angle off the length (the
    centre of pressure's travel after Hughes, from memory; a from the file); Hoerner's
    cross-flow table (REFERENCES.md) for the current beam-on coefficient; wind power law
    U10 = U(z) / (z/10)^a."""
    hull, st = data["hulls"][0], data["stages"][stage]
    cond, heading = st["conditions"], st["poses"][0]["heading_deg"]
    xs = [p[0] for p in hull["outline_m"]]
    ys = [p[1] for p in hull["outline_m"]]
    length, beam = max(xs) - min(xs), max(ys) - min(ys)
    centre = ((max(xs) + min(xs)) / 2, (max(ys) + min(ys)) / 2)
    knot = 1852 / 3600
    out = []

    def at(b: float, head_on: float) -> tuple[float, float]:
        if cond.get("pressure_centre", "moving") != "moving":
            return centre
        phi = math.degrees(math.atan2(abs(math.sin(b)), abs(math.cos(b))))
        shift = (0.5 - head_on) * (1 - phi / 90) * length
        return (centre[0] + (shift if math.cos(b) < 0 else -shift), centre[1])

    v = cond["wind_speed_kn"] * knot / (cond["wind_height_m"] / 10) ** cond["wind_exponent"]
    v *= cond["gust_factor"]
    b = -math.radians((cond["wind_from_deg"] + 180 - heading) % 360)
    q = 0.5 * cond["air_density_kg_m3"] * v * v
    fb = hull["freeboard_m"]
    out.append(
        (
            at(b, cond["wind_centre_head_on"]),
            q
            * np.array(
                [
                    cond["wind_coefficient_head_on"] * beam * fb * math.cos(b) * abs(math.cos(b)),
                    cond["wind_coefficient_beam_on"] * length * fb * math.sin(b) * abs(math.sin(b)),
                ]
            ),
        )
    )
    v = cond["current_speed_kn"] * knot
    b = -math.radians((cond["current_towards_deg"] - heading) % 360)
    q = 0.5 * cond["water_density_kg_m3"] * v * v
    t = hull["draught_m"]
    cd_beam = cond["current_coefficient_beam_on"]
    if cd_beam is None:
        cd_beam = float(
            np.interp(beam / (2 * t), [0.99, 1.64, 3.01, 4.0], [0.828, 0.691, 0.587, 0.559])
        )
    depth = cond.get("water_depth_m")
    if depth is not None:
        # UFC 4-159-03 (2005) section 4-5 (read): C_yc = C0 + (3.2 - C0)(T/d)^2 with
        # C0 = 0.22 L^2 A_m / (B V); wall-sided, A_m = B T and V = (plan area) T.
        c0 = 0.22 * length**2 / shapely.Polygon(hull["outline_m"]).area
        cd_beam *= max((c0 + (3.2 - c0) * (t / depth) ** 2) / c0, 1.0)
    out.append(
        (
            at(b, cond["current_centre_head_on"]),
            q
            * np.array(
                [
                    cond["current_coefficient_head_on"] * beam * t * math.cos(b) * abs(math.cos(b)),
                    cd_beam * length * t * math.sin(b) * abs(math.sin(b)),
                ]
            ),
        )
    )
    return out


@pytest.mark.parametrize("stage", [0, 1, 2, 3])
def test_deck_barge_report_matches_a_hand_calculation(stage: int) -> None:
    path = ROOT / "sample_projects" / "deck_barge_unberth.towboard"
    data = json.loads(path.read_text())
    net, moment, c = _hand_balance(data, stage)
    bal = report_json(load(path))["stages"][stage]["balance"]
    # The sample's pulls are solved, so the net force can be close to nothing: compare
    # against the size of the pulls present (the file keeps 12 significant digits).
    scale = sum(t["assigned_pull_N"] for t in bal["tugs"]) + 1.0
    assert bal["centroid_m"] == pytest.approx(list(c), rel=1e-9)
    assert bal["net_force_N"]["ahead"] == pytest.approx(net[0], rel=1e-9, abs=1e-9 * scale)
    assert bal["net_force_N"]["to_port"] == pytest.approx(net[1], rel=1e-9, abs=1e-9 * scale)
    assert bal["yaw_moment_about_centroid_Nm"] == pytest.approx(
        moment, rel=1e-9, abs=1e-9 * scale * 84.0
    )
    # a real sideways force (beyond 1 % of the pulls and the balance's 1 000 N floor,
    # core.mechanics.forces): where its line crosses
    if abs(net[1]) > max(0.01 * scale, 1000.0):
        # Where the line of action crosses the centreline: x with x * R_y = M about (0, 0).
        m_origin = moment + c[0] * net[1] - c[1] * net[0]
        assert bal["equivalent"]["crosses_centreline_at_x_m"] == pytest.approx(
            m_origin / net[1], rel=1e-6
        )
    if np.hypot(*net) > max(0.01 * scale, 1000.0):  # a real net force: its line's offset
        assert bal["equivalent"]["offset_from_centroid_m"] == pytest.approx(
            moment / np.hypot(*net), rel=1e-6, abs=1e-6
        )


def test_report_json_numbers_are_the_cores() -> None:
    for path in sorted((ROOT / "sample_projects").glob("*.towboard")):
        project = load(path)
        rep = report_json(project)
        for s, out in zip(project.stages, rep["stages"], strict=True):
            b = balance_of(project, s)  # the tugs with the stage's wind and current
            assert out["balance"]["yaw_moment_about_centroid_Nm"] == b.moment_centroid_nm
            assert [t["assigned_pull_N"] for t in out["balance"]["tugs"]] == [
                sh.pull_n for sh in b.shares
            ]
        json.dumps(rep, allow_nan=False)  # strict JSON: no NaN or infinity


def test_report_text_speaks_the_display_units_and_the_turning_sense() -> None:
    text = report_text(load(ROOT / "sample_projects" / "pontoon_swing.towboard"))
    assert "kN·m about the centroid, swings bow to port" in text
    # Alder and Damson 12 t each square to the centreline, 60 m apart: a pure couple of
    # 12 x 60 = 720 t·m = 7060.8 kN·m (hand calculation; the sample's stage notes)
    assert "a couple of 7060.8 kN·m, no single line of action" in text
    assert "Planning aid only" in text
    assert "-0.0" not in text


def test_the_fittings_lines_name_the_rating_the_tension_is_checked_against() -> None:
    # A towline is checked against the fitting's TOW where given, else its SWL (IMO
    # MSC.1/Circ.1175); the report said "SWL" beside the TOW, unlike the briefing.
    from dataclasses import replace

    project = load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")
    hull = project.hulls[0]
    bitt = hull.fitting("Bow centre bitt")
    text = report_text(project)
    assert f"against SWL {bitt.swl_n / TF:.1f} t" in text
    towed = project.with_hull(hull.with_fitting(replace(bitt, tow_n=50 * TF)))
    text = report_text(towed)
    assert "Bow centre bitt       tension" in text
    assert "against TOW 50.0 t" in text and f"SWL {bitt.swl_n / TF:.1f} t" not in text
    assert "against no rating given" in text  # the pushing pads have none


def test_a_small_fitting_load_is_printed_with_the_settings_digits() -> None:
    """The deck barge's hold (stage 3): Gannet's line on the 80 t SWL bow bitt carries
    about 0.3 t, i.e. 0.3 / 80 = 0.4 % of the SWL (hand calculation, the shown figures),
    printed by the settings' percent rule ("0.4 %"), not as "0 %"."""
    project = load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")
    main = stage_result(project, 2).main
    assert main is not None
    gannet = next(f for f in main.fittings if f.tug == "Gannet")
    assert gannet.use_of_rating is not None
    assert 0.001 < gannet.use_of_rating < 0.01  # the hand figure above, 0.1-1 %
    expected = f"{gannet.use_of_rating * 100:.1f} %"  # below 1 %: one digit
    assert gannet.use_words == expected
    stage3 = report_text(project).split("Stage 3:")[1].split("Stage 4:")[0]
    row = next(ln for ln in stage3.splitlines() if ln.startswith("    Gannet ") and "SWL" in ln)
    assert row.endswith(f"against SWL 80.0 t ({expected})")
    assert "(0 %)" not in stage3


def test_the_json_says_which_units_its_words_are_in() -> None:
    # The figures are SI, but the reasons and warnings are sentences in the plan's units
    # ("needs 0.4 kip more astern"); the JSON said only N, N*m, m and deg (not even m/s for
    # its *_ms speeds), so a reader of a kip plan's JSON met kip in its text unannounced.
    from core.units import DisplayUnits

    plan = load(SAMPLES / "deck_barge_unberth.towboard")
    imperial = plan.with_units(DisplayUnits("kip", "kip*ft", "ft", "kn"))
    rep = report_json(imperial)
    assert rep["units"]["speed"] == "m/s"
    assert rep["text_units"] == {"force": "kip", "moment": "kip*ft", "length": "ft", "speed": "kn"}
    reasons = [r["text"] for s in rep["stages"] for r in s["verdict"]["reasons"]]
    assert any(" kip " in t for t in reasons)
