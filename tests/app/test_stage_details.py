"""The stage details form and the site panel, both ways: model -> widgets, typing -> model."""

from __future__ import annotations

import pytest
import shapely
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QDialog, QLineEdit

from app.controller import Controller
from app.panels.site_panel import FeatureDialog, SitePanel, make_features
from app.panels.stage_details import StageDetails
from core.io.projectfile import load
from core.units import DisplayUnits
from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"
KNOT = 1852 / 3600  # m/s (NIST SP 811, from memory)
FOOT = 0.3048  # m, exact (NIST SP 811)


@pytest.fixture
def form(qtbot):
    controller = Controller(load(TWIN))
    w = StageDetails(controller)
    qtbot.addWidget(w)
    w.show()
    yield controller, w
    controller.undo_stack.clear()


def type_into(qtbot, field: QLineEdit, text: str) -> None:
    field.setFocus()
    field.selectAll()
    qtbot.keyClicks(field, text)
    qtbot.keyClick(field, Qt.Key.Key_Return)


def test_the_form_shows_the_stage_in_display_units(form):
    controller, w = form
    s = controller.stage
    assert w.kind.currentText() == s.kind == "unberth"
    assert w.notes.toPlainText() == s.notes
    assert w.limit_fields["max_wind_ms"].text() == "20.00"  # the sample's 20 kn
    assert w.limit_fields["min_clearance_m"].text() == "5.00"
    assert [w.poses.item(0, c).text() for c in range(4)] == ["Lark pair", "40.0", "43.0", "090.0"]
    controller.set_stage_index(3)
    assert w.kind.currentText() == "berth"
    assert w.limit_fields["min_clearance_m"].text() == "3.00"
    controller.apply(controller.project.with_units(DisplayUnits(length="ft", speed="m/s")), "units")
    assert w.limit_fields["max_wind_ms"].text() == f"{18 * KNOT:.2f}"
    assert w.limit_units["min_clearance_m"].text() == "ft"
    assert w.limit_fields["min_clearance_m"].text() == f"{3 / FOOT:.2f}"


def test_typing_a_limit_sets_it_and_an_empty_field_clears_it(form, qtbot):
    controller, w = form
    type_into(qtbot, w.limit_fields["max_wind_ms"], "15")
    assert controller.stage.limits.max_wind_ms == pytest.approx(15 * KNOT)
    w.limit_fields["max_current_ms"].clear()
    w.limit_fields["max_current_ms"].setFocus()
    qtbot.keyClick(w.limit_fields["max_current_ms"], Qt.Key.Key_Return)
    assert controller.stage.limits.max_current_ms is None
    assert controller.undo_stack.count() == 2
    controller.undo_stack.undo()
    assert controller.stage.limits.max_current_ms == pytest.approx(1.0 * KNOT)


def test_bad_input_is_refused_with_a_message(form, qtbot):
    controller, w = form
    said = []
    controller.message.connect(said.append)
    before = controller.project
    type_into(qtbot, w.limit_fields["min_clearance_m"], "-3")
    assert controller.project == before
    assert said[-1] == "Not changed: least clearance: -3.0 m must not be negative"
    assert w.limit_fields["min_clearance_m"].text() == "5.00"
    type_into(qtbot, w.margin, "ten")
    assert said[-1] == "Not changed: clearance margin: 'ten' is not a number"


def test_kind_notes_margin_and_pose(form, qtbot):
    controller, w = form
    w.kind.setCurrentText("other")
    assert controller.stage.kind == "other"
    w.notes.setFocus()
    w.notes.selectAll()
    qtbot.keyClicks(w.notes, "Let go aft first.")
    w.margin.setFocus()  # leaving the notes writes them
    assert controller.stage.notes == "Let go aft first."
    type_into(qtbot, w.margin, "12.5")
    assert controller.project.clearance_margin_m == 12.5
    # heading and position of the pair, typed into the table
    item = w.poses.item(0, 3)
    item.setText("100")
    pose = controller.stage.poses[0]
    assert (pose.body, pose.x, pose.y, pose.heading_deg) == ("Lark pair", 40.0, 43.0, 100.0)
    w.poses.item(0, 2).setText("50")
    assert controller.stage.poses[0].y == 50.0
    assert len(controller.stage.poses) == 1


def test_make_features_in_display_units():
    u = DisplayUnits(length="ft")
    (d,) = make_features("dolphin", "D9", {"x": 100.0, "y": 0.0, "size": 10.0}, u, "square")
    # a square dolphin of 10 ft side centred 100 ft east
    assert shapely.Polygon(d.points).bounds == pytest.approx(
        (95 * FOOT, -5 * FOOT, 105 * FOOT, 5 * FOOT)
    )
    (v,) = make_features(
        "vessel",
        "Sea Vale",
        {"x": 0, "y": 0, "heading": 90.0, "length": 100, "beam": 20},
        DisplayUnits(),
    )
    assert shapely.Polygon(v.points).bounds == pytest.approx((-50, -10, 50, 10))
    left, right = make_features(
        "channel", "Fairway", {"x0": 0, "y0": 0, "x1": 0, "y1": 100, "width": 60}, DisplayUnits()
    )
    assert left.points[0] == pytest.approx((-30, 0)) and right.points[0] == pytest.approx((30, 0))
    (b,) = make_features("basin", "Basin", {"x0": 0, "y0": 0, "x1": 300, "y1": 200}, DisplayUnits())
    assert b.closed and shapely.Polygon(b.points).area == pytest.approx(60000)


@pytest.fixture
def site(qtbot):
    controller = Controller(load(TWIN))
    w = SitePanel(controller)
    qtbot.addWidget(w)
    yield controller, w
    controller.undo_stack.clear()


def test_add_a_quay_through_the_dialog(site, qtbot, monkeypatch):
    controller, w = site
    n = len(controller.project.site.features)

    def fill_and_accept(dialog: FeatureDialog) -> int:
        dialog.set_kind("quay")
        dialog.name.setText("Repair berth")
        for key, text in (("x0", "0"), ("y0", "300"), ("x1", "150"), ("y1", "300")):
            dialog.fields["quay"][key].setText(text)
        dialog._try_accept()
        return dialog.result()

    monkeypatch.setattr(FeatureDialog, "exec", fill_and_accept)
    qtbot.mouseClick(w.add_button, Qt.MouseButton.LeftButton)
    feats = controller.project.site.features
    assert len(feats) == n + 1
    assert feats[-1].name == "Repair berth" and feats[-1].points == ((0.0, 300.0), (150.0, 300.0))
    assert w.list.item(n).text() == "Repair berth  [quay]"
    # the same name again is refused
    said = []
    controller.message.connect(said.append)
    qtbot.mouseClick(w.add_button, Qt.MouseButton.LeftButton)
    assert len(controller.project.site.features) == n + 1
    assert said == ["Not added: a site feature is already called Repair berth"]


def test_the_dialog_names_a_bad_field_and_stays_open(qtbot):
    d = FeatureDialog(DisplayUnits())
    qtbot.addWidget(d)
    d.set_kind("dolphin")
    d.name.setText("D3")
    d.fields["dolphin"]["x"].setText("10")
    d.fields["dolphin"]["y"].setText("")
    d.fields["dolphin"]["size"].setText("4")
    d._try_accept()
    assert d.result() != QDialog.DialogCode.Accepted
    assert d.error.text() == "centre y: '' is not a number"
    d.fields["dolphin"]["y"].setText("5")
    d.fields["dolphin"]["size"].setText("0")
    d._try_accept()
    assert "dolphin D3: size: 0.0 must be a positive length" in d.error.text()


def test_delete_a_feature_and_undo(site):
    controller, w = site
    names = [f.name for f in controller.project.site.features]
    w.list.setCurrentRow(2)
    w.delete()
    assert [f.name for f in controller.project.site.features] == names[:2] + names[3:]
    controller.undo_stack.undo()
    assert [f.name for f in controller.project.site.features] == names


def test_a_pose_row_left_from_another_plan_adds_no_pose(form):
    """A poses row naming a body the plan no longer has (a row left from the plan shown
    before, as the monkey's seed 401 met after File > New) once added a pose for that
    name: the window then held a plan its own file refuses. Now the row is made again."""
    from core.io.projectfile import dumps, loads

    controller, w = form
    w.poses.blockSignals(True)
    w.poses.item(0, 0).setText("Lark 41")  # a hull of the pair, not a body of its own
    w.poses.blockSignals(False)
    before = controller.project
    w.poses.item(0, 1).setText("12.0")
    p = controller.project
    assert p is before
    names = set(p.body_names())
    assert all(pose.body in names for s in p.stages for pose in s.poses)
    assert dumps(loads(dumps(p))) == dumps(p)
    assert w.poses.item(0, 0).text() == "Lark pair"  # the table is made again from the plan


def test_the_wind_limit_says_its_measure_in_the_form_and_the_briefing(form):
    # the limit is a mean wind at 10 m (core.analysis.limits); every view names it so
    from PySide6.QtWidgets import QLabel

    from app.briefing.cover import cover
    from core.analysis.stage import plan_results

    controller, w = form
    labels = [lb.text() for lb in w.findChildren(QLabel)]
    assert "Max wind (mean at 10 m)" in labels and "Max wind" not in labels
    project = controller.project
    titles = [
        c.title for b in cover(project, plan_results(project)) for c in getattr(b, "columns", [])
    ]
    assert "Max wind (mean at 10 m)" in titles and "Max wind" not in titles


def test_a_limit_left_as_shown_in_another_unit_keeps_its_value(form, qtbot):
    # The limits show the display unit to the hundredth: after the Units panel turns speed
    # to m/s and length to ft, the sample's 20 kn wind limit reads 10.29 (m/s) and its 1 kn
    # current limit 0.51; Enter in a field left as shown wrote those rounded figures back
    # (0.51 m/s = 0.991 kn, 5 m = 16.40 ft = 4.9987 m) as undo steps nobody made.
    from app.panels.units_panel import UnitsPanel

    controller, w = form
    units = UnitsPanel(controller)
    qtbot.addWidget(units)
    units.show()
    for q, sym in (("speed", "m/s"), ("length", "ft")):
        box = units.boxes[q]
        box.setFocus()
        qtbot.keyClick(box, Qt.Key.Key_End)  # m/s and ft are the last of their lists
        assert controller.project.units.unit(q) == sym
    before = controller.project
    steps = controller.undo_stack.count()
    assert w.limit_fields["max_wind_ms"].text() == f"{20 * KNOT:.2f}" == "10.29"
    assert w.limit_fields["min_clearance_m"].text() == f"{5 / FOOT:.2f}" == "16.40"
    for field in (*w.limit_fields.values(), w.margin):
        field.setFocus()
        qtbot.keyClick(field, Qt.Key.Key_Return)
    assert controller.project == before
    assert controller.undo_stack.count() == steps
    # typed, the same field still takes the figure in the unit shown
    type_into(qtbot, w.limit_fields["max_wind_ms"], "10.5")
    assert controller.stage.limits.max_wind_ms == pytest.approx(10.5)
    type_into(qtbot, w.margin, "3")
    assert controller.project.clearance_margin_m == pytest.approx(3 * FOOT)
