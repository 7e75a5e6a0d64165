"""Fixtures for the conditions and solving screens: the board tests' window, and a plan
whose tugs can hold the body against a beam wind."""

from __future__ import annotations

import math

import pytest

from core.model.conditions import Conditions
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from tests.app.board.conftest import isolated, window  # noqa: F401  (fixtures)
from tests.core.plan_builders import TF, box_hull


def holding_plan() -> Project:
    """An 80 m x 20 m barge heading 000 with a 30 kn wind from the port beam (270 true):
    two 30 t tugs on the port bow and quarter lead to port, a 20 t tug on the bow leads
    ahead, a 25 t tug pushes on the port pad."""
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
    tugs = (
        Tug("Gannet", 30 * TF, towing_point_height_m=4.0),
        Tug("Puffin", 30 * TF, towing_point_height_m=4.0),
        Tug("Tern", 20 * TF, towing_point_height_m=4.0),
        Tug("Skua", 25 * TF),
    )
    stage = Stage(
        "Hold at the berth",
        "berth",
        poses=(BodyPose("Barge", 0.0, 0.0, 0.0),),
        placements=(
            Placement("Gannet", "Barge", "port bow", 0.2, math.pi / 2, 50.0),
            Placement("Puffin", "Barge", "port quarter", 0.2, math.pi / 2, 50.0),
            Placement("Tern", "Barge", "bow", 0.1, 0.0, 50.0),
            Placement("Skua", "Barge", "stbd pad", 0.1),
        ),
        conditions=Conditions(
            wind_speed_ms=30 * 1852 / 3600,
            wind_from_deg=270.0,
            current_speed_ms=0.5 * 1852 / 3600,
            current_towards_deg=180.0,
        ),
    )
    return Project(name="Holding plan", hulls=(hull,), tugs=tugs, stages=(stage,))


@pytest.fixture(autouse=True)
def no_modal_questions(monkeypatch: pytest.MonkeyPatch) -> None:
    """pytest-qt closes the window before the fixtures' own teardown: an edited plan
    would ask whether to save. Nothing may block: answer "discard"."""
    from PySide6.QtWidgets import QMessageBox

    monkeypatch.setattr(QMessageBox, "question", lambda *a, **k: QMessageBox.StandardButton.Discard)


@pytest.fixture
def holding(window):  # type: ignore[no-untyped-def]  # noqa: F811
    window.controller.reset(holding_plan())
    window.view.fit_to_hull()
    return window
