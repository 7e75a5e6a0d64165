"""Inward normals at fittings: right on every call (they are worked out once per body)."""

from __future__ import annotations

import math

import pytest

from core.mechanics.bodies import Body, Member
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline


def _hull() -> Hull:
    return Hull(
        "Box",
        box_outline(60.0, 20.0),
        fittings=(Fitting("Port", "line", 30.0, 10.0), Fitting("Bow", "push", 60.0, 0.0)),
    )


def test_normals_point_into_the_hull_and_repeat() -> None:
    body = Body("Box", (Member(_hull(), 0.0, 0.0, 0.0),))
    # a rectangle's sides (geometry, no source needed): port side normal points to starboard
    assert body.inward_normal("Box", "Port") == pytest.approx((0.0, -1.0))
    assert body.inward_normal("Box", "Bow") == pytest.approx((-1.0, 0.0))
    assert body.inward_normal("Box", "Port") == body.inward_normal("Box", "Port")


def test_normals_turn_with_the_member() -> None:
    body = Body("Group", (Member(_hull(), 5.0, 0.0, math.pi / 2),))
    # the member is turned 90 degrees counter-clockwise: its port side now faces -x
    assert body.inward_normal("Box", "Port") == pytest.approx((1.0, 0.0))
