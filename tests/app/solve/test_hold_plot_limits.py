"""The hold limits plot: the stage's go / no-go limit drawn, the current as a second curve
for a hold stage, and limits beyond the core's range said as "above N kn"; the figures
are the stage result's own (issue 12)."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QImage

from app.paint import style
from app.panels.hold_plot import LIMIT, HoldPlot, current_summary, summary
from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.solve.holdlimits import SHOWN_UP_TO_MS, limit_at, limit_words
from core.units import DisplayUnits
from tests.conftest import SAMPLES

HOLD = 2  # the sample's stage "Hold while the dredger clears the entrance"


def _choose(qtbot, panel, text: str) -> None:  # type: ignore[no-untyped-def]
    box = panel.flow_box
    box.setFocus()
    qtbot.keyClick(box, Qt.Key.Key_Down if text == "current" else Qt.Key.Key_Up)
    assert box.currentData() == text


def test_a_hold_stage_shows_the_current_the_tugs_can_hold(window, qtbot) -> None:
    c = window.controller
    panel = window.solve_ui.hold
    c.set_stage_index(HOLD)
    qtbot.waitUntil(lambda: panel.flow_row.isVisibleTo(panel))
    _choose(qtbot, panel, "current")
    main = c.stage_result().main
    assert main.current_limits is not None and panel.plot.flow == "current"
    assert panel.plot.limits is main.current_limits  # read from the stage result, not worked
    stage = c.stage
    at = limit_at(main.current_limits, stage.conditions.current_towards_deg)
    assert limit_words(at, c.project.units, "current") in panel.caption.text()
    assert f"limit {c.project.units.show(stage.limits.max_current_ms, 'speed')}" in (
        panel.caption.text()
    )
    _choose(qtbot, panel, "wind")
    assert panel.plot.limits is main.hold_limits and panel.plot.flow == "wind"


def test_other_stages_show_the_wind_only(window, qtbot) -> None:
    panel = window.solve_ui.hold
    window.controller.set_stage_index(0)  # a walk
    qtbot.wait(10)
    assert not panel.flow_row.isVisibleTo(panel) and panel.plot.flow == "wind"
    assert window.controller.stage_result().main.current_limits is None


def test_the_stage_limit_is_drawn_as_a_ring(window, qtbot) -> None:
    c = window.controller
    panel = window.solve_ui.hold
    c.set_stage_index(HOLD)
    qtbot.wait(10)
    plot = panel.plot
    plot.resize(420, 460)
    limit = c.stage.limits.max_wind_ms
    assert plot._stage_limit() == limit
    image = QImage(plot.size(), QImage.Format.Format_ARGB32)
    image.fill(0)
    plot.render(image)
    centre, radius = plot._frame()
    top, _ = plot.scale_top()
    r = radius * c.project.units.value(limit, "speed") / top
    hits = 0
    for k in range(180):
        a = math.radians(k * 2.0)
        pt = QPointF(centre.x() + r * math.sin(a), centre.y() - r * math.cos(a))
        px = image.pixelColor(round(pt.x()), round(pt.y()))
        if abs(px.red() - LIMIT.red()) + abs(px.green() - LIMIT.green()) < 90 and px.red() > 120:
            hits += 1
    assert hits >= 30, hits  # a dotted ring: many of its points, not all


def test_limits_beyond_the_cores_range_are_said_as_above(window) -> None:
    c = window.controller
    c.set_stage_index(HOLD)
    main = c.stage_result().main
    units = c.project.units
    lim = main.current_limits
    # the planned current set towards the direction the tugs hold most against
    d = float(lim.problem.directions_deg[int(np.argmax(lim.all_tugs_ms))])
    assert float(np.max(lim.all_tugs_ms)) > SHOWN_UP_TO_MS["current"]
    stage = replace(c.stage, conditions=replace(c.stage.conditions, current_towards_deg=d))
    cap = units.show(SHOWN_UP_TO_MS["current"], "speed")
    assert current_summary(lim, stage, units).startswith(
        f"Current setting to {d:03.0f}°T: above {cap} with all tugs"
    )
    wind = main.hold_limits
    w = float(wind.problem.directions_deg[int(np.argmax(wind.all_tugs_ms))])
    stage = replace(c.stage, conditions=replace(c.stage.conditions, wind_from_deg=w))
    text = summary(wind, stage, units)
    assert float(np.max(wind.all_tugs_ms)) > SHOWN_UP_TO_MS["wind"]
    assert f"above {units.show(SHOWN_UP_TO_MS['wind'], 'speed')} with all tugs" in text


def test_a_message_stays_within_the_rings_clear_of_the_compass_letters(qtbot) -> None:  # type: ignore[no-untyped-def]
    # On a narrow plot (File > New's dock) the message once ran 300 px wide, over the W
    # and E letters. Every pixel of its colour now lies inside 0.85 of the outer ring.
    plot = HoldPlot()
    qtbot.addWidget(plot)
    plot.resize(260, 300)
    plot.set_data(None, None, DisplayUnits(), "Place tugs to see what wind they can hold.")
    image = plot.grab().toImage().convertToFormat(QImage.Format.Format_RGB32)
    centre, radius = plot._frame()
    ratio = image.width() / plot.width()
    red = style.NO_GO
    found = 0
    for y in range(image.height()):
        for x in range(image.width()):
            c = image.pixelColor(x, y)
            if (
                abs(c.red() - red.red()) + abs(c.green() - red.green()) + abs(c.blue() - red.blue())
                < 60
            ):
                found += 1
                d = math.hypot(x / ratio - centre.x(), y / ratio - centre.y())
                assert d <= 0.85 * radius, (x, y, d, radius)
    assert found > 50  # the message is drawn


def test_the_windows_lowest_limit_names_no_direction_when_all_read_alike() -> None:
    # The deck barge's unberth (stage 1): every all-tugs limit is above the 60 kn shown
    # and the worst-tug-lost limit is 0 from every direction (tests/core/test_limit_words.py):
    # the plot's summary says so in the core's words, naming no direction.
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    main = stage_result(project, 0).main
    assert main is not None and main.hold_limits is not None
    text = summary(main.hold_limits, project.stages[0], project.units)
    assert "Lowest: above 60.0 kn from every direction; 0 from every direction losing" in text


def test_the_planned_marks_label_stays_inside_the_plot(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """Every stage of every sample, the plot as the window shows it and narrower: the
    label "planned 12.0 kn from 200°" lies whole inside the plot (at the window's size
    the twin barge's ran off the right edge)."""
    boxes: list[tuple[object, object]] = []
    place = HoldPlot.planned_box

    def kept(self, *args):  # type: ignore[no-untyped-def]
        box = place(self, *args)
        boxes.append((box, self.rect()))
        return box

    monkeypatch.setattr(HoldPlot, "planned_box", kept)
    plot = window.solve_ui.hold.plot
    for path in sorted(SAMPLES.glob("*.towboard")):
        assert window.open_path(path, ask=False)
        for k in range(len(window.controller.project.stages)):
            window.controller.set_stage_index(k)
            for width in (plot.width(), 260):
                plot.resize(width, plot.height())
                boxes.clear()
                plot.repaint()
                qtbot.wait(1)
                if plot.limits is None:
                    continue
                assert boxes, (path.name, k)
                for box, rect in boxes:
                    assert rect.toRectF().contains(box), (path.name, k, width, box, rect)
    window.controller.undo_stack.setClean()
