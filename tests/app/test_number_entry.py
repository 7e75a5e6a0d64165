"""Every editable numeric cell and field of the window reads numbers with the one parser
(app/numbers.py) and checks them with the core's rule (core/model/rules.py): a value out of
its range is refused with a message in the display units and leaves the project unchanged;
a good value is taken, and the plan still saves and loads.

The cases are typed with real key presses into the sample plan in one window. A last test
finds every line edit and table of the window's panels and fails on any numeric field
without a case here: a new field gets its rule in the core and its case in this file.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterator
from dataclasses import dataclass, replace
from pathlib import Path

import pytest
from PySide6.QtCore import QAbstractItemModel, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QAbstractItemView, QApplication, QDialog, QLineEdit, QMessageBox

from app.panels.tugs_model import KEYS
from core.io.projectfile import dumps, load, save
from core.model.plan import Project
from core.units import DisplayUnits
from tests.conftest import SAMPLES

TF = 9806.65  # N per tonne-force (NIST SP 811)
KNOT = 1852 / 3600  # m/s per knot (international knot, exact)
SAMPLE = SAMPLES / "deck_barge_unberth.towboard"


@pytest.fixture(scope="module")
def env(tmp_path_factory: pytest.TempPathFactory) -> Iterator[object]:
    """One main window on the sample for the whole module (each case resets the plan)."""
    tmp = tmp_path_factory.mktemp("entry")
    with pytest.MonkeyPatch.context() as mp:
        mp.setenv("TOWBOARD_RECOVERY_DIR", str(tmp / "recovery"))
        mp.setenv("TOWBOARD_SETTINGS_FILE", str(tmp / "settings.ini"))
        ok = QMessageBox.StandardButton.Ok
        mp.setattr(QMessageBox, "question", staticmethod(lambda *a, **k: ok))
        mp.setattr(QMessageBox, "warning", staticmethod(lambda *a, **k: ok))
        mp.setattr(QMessageBox, "information", staticmethod(lambda *a, **k: ok))
        mp.setattr(QDialog, "exec", lambda self: int(QDialog.DialogCode.Rejected))
        _app = QApplication.instance() or QApplication([])
        from app.window.main_window import MainWindow

        w = MainWindow()
        w.resize(1400, 900)
        w.show()
        assert w.open_path(SAMPLE, ask=False)
        yield w
        w.controller.undo_stack.setClean()
        w.close()
        w.deleteLater()
        QApplication.processEvents()


@dataclass(frozen=True)
class Case:
    """One numeric field: how to reach it, a refused value and its message, a good value."""

    id: str
    field: Callable[[object], object]  # window -> QLineEdit, or (view, index) of a cell
    bad: str
    said: str
    good: str
    got: Callable[[Project], float | None]
    expect: float
    commit: Callable[[object], None] | None = None  # for fields read on a button press
    setup: Callable[[object], None] | None = None  # before typing (fill a partner field)


def _tug_cell(key: str, tug: str = "Gannet") -> Callable[[object], object]:
    def find(w):  # type: ignore[no-untyped-def]
        model = w.tugs_panel.model
        return w.tugs_panel.table, model.index(model.row_of(tug), KEYS.index(key))

    return find


def _cond(attr: str) -> Callable[[object], object]:
    return lambda w: w.solve_ui.conditions.edits[attr]  # type: ignore[attr-defined]


def _centre(attr: str, k: int) -> Callable[[object], object]:
    return lambda w: w.solve_ui.conditions.centre_edits[attr][k]  # type: ignore[attr-defined]


def _pose_cell(column: int) -> Callable[[object], object]:
    def find(w):  # type: ignore[no-untyped-def]
        table = w.plan_ui.stage_details.poses
        return table, table.model().index(0, column)

    return find


def _stage(p: Project):  # type: ignore[no-untyped-def]
    return p.stages[0]


def _cond_value(attr: str) -> Callable[[Project], float | None]:
    return lambda p: getattr(_stage(p).conditions, attr)


def _goal_kind(w, kind: str) -> None:  # type: ignore[no-untyped-def]
    box = w.solve_ui.solve_panel.kind
    box.setCurrentIndex(box.findData(kind))


CASES = [
    # the tugs table, in t and m (the sample's display units)
    Case(
        "tugs: bollard pull",
        _tug_cell("bp"),
        "0.05",
        "tug Gannet: bollard pull: 0.05 t must be at least 0.1 t",
        "45",
        lambda p: p.tug("Gannet").bollard_pull_n,
        45 * TF,
    ),
    Case(
        "tugs: astern pull",
        _tug_cell("astern_bp"),
        "-1",
        "tug Gannet: astern pull: -1.0 t must not be negative",
        "30",
        lambda p: p.tug("Gannet").astern_pull,
        30 * TF,
    ),
    Case(
        "tugs: lead",
        _tug_cell("lead"),
        "1e9",
        "tug Gannet: lead: 1e+09° must be at most 36000°",
        "90",
        lambda p: _stage(p).placement("Gannet").lead_rad,
        -math.pi / 2,
    ),
    Case(
        "tugs: line length",
        _tug_cell("length"),
        "0",
        "tug Gannet: line length: 0.0 m must be positive",
        "55",
        lambda p: _stage(p).placement("Gannet").line_length_m,
        55.0,
    ),
    Case(
        "tugs: sector from",
        _tug_cell("sector_from"),
        "1e9",
        "tug Gannet: sector from: 1e+09° must be at most 36000°",
        "20",  # the sample's 060 to 140 becomes 020 to 140 (clockwise, relative bearings)
        lambda p: _stage(p).placement("Gannet").lead_sector_rad[1],
        math.radians(-20.0),
    ),
    Case(
        "tugs: sector to",
        _tug_cell("sector_to"),
        "-1e9",
        "tug Gannet: sector to: -1e+09° must be at least -36000°",
        "150",  # 060 to 150: the low lead (counter-clockwise from ahead) is -150 deg
        lambda p: _stage(p).placement("Gannet").lead_sector_rad[0],
        math.radians(-150.0),
    ),
    Case(
        "tugs: setting",
        _tug_cell("setting"),
        "120",
        "tug Gannet: setting: 120.0 % must be at most 100 %",
        "75",
        lambda p: _stage(p).placement("Gannet").setting,
        0.75,
    ),
    # the hull panel
    Case(
        "hull: draught",
        lambda w: w.hull_panel.draught,  # type: ignore[attr-defined]
        "0.005",
        "draught: 0.005 m must be at least 0.01 m",
        "3.5",
        lambda p: p.hulls[0].draught_m,
        3.5,
    ),
    Case(
        "hull: freeboard",
        lambda w: w.hull_panel.freeboard,  # type: ignore[attr-defined]
        "1e-300",
        "freeboard: 1e-300 m must be at least 0.01 m",
        "4",
        lambda p: p.hulls[0].freeboard_m,
        4.0,
    ),
    Case(
        "hull: displacement",
        lambda w: w.hull_panel.displacement,  # type: ignore[attr-defined]
        "0.5",
        "displacement: 0.5 t must be at least 1 t",
        "2500",
        lambda p: p.hulls[0].displacement_kg,
        2.5e6,
    ),
    Case(
        "hull: centre of gravity x",
        lambda w: w.hull_panel.cog_x,  # type: ignore[attr-defined]
        "2e5",
        "centre of gravity x: 200000.0 m must be at most 100000 m",
        "40",
        lambda p: p.hulls[0].cog[0] if p.hulls[0].cog else None,
        40.0,
    ),
    Case(
        "hull: centre of gravity y",
        lambda w: w.hull_panel.cog_y,  # type: ignore[attr-defined]
        "-2e5",
        "centre of gravity y: -200000.0 m must be at least -100000 m",
        "1",
        lambda p: p.hulls[0].cog[1] if p.hulls[0].cog else None,
        1.0,
    ),
    # the conditions panel
    Case(
        "conditions: wind speed",
        _cond("wind_speed_ms"),
        "250",
        "wind speed: 250.0 kn must be at most 200 kn",
        "25",
        _cond_value("wind_speed_ms"),
        25 * KNOT,
    ),
    Case(
        "conditions: wind height",
        _cond("wind_height_m"),
        "0.1",
        "wind height: 0.1 m must be at least 0.5 m",
        "20",
        _cond_value("wind_height_m"),
        20.0,
    ),
    Case(
        "conditions: wind from",
        _cond("wind_from_deg"),
        "400",
        "wind direction (from): 400.0° must be at most 360°",
        "45",
        _cond_value("wind_from_deg"),
        45.0,
    ),
    Case(
        "conditions: gust factor",
        _cond("gust_factor"),
        "1e300",
        "gust factor: 1e+300 must be at most 3",
        "1.3",
        _cond_value("gust_factor"),
        1.3,
    ),
    Case(
        "conditions: wind exponent",
        _cond("wind_exponent"),
        "2",
        "wind exponent: 2.0 must be at most 1",
        "0.14",
        _cond_value("wind_exponent"),
        0.14,
    ),
    Case(
        "conditions: current speed",
        _cond("current_speed_ms"),
        "1e200",
        "current speed: 1e+200 kn must be at most 20 kn",
        "2",
        _cond_value("current_speed_ms"),
        2 * KNOT,
    ),
    Case(
        "conditions: current towards",
        _cond("current_towards_deg"),
        "-1",
        "current direction (towards): -1.0° must not be negative",
        "180",
        _cond_value("current_towards_deg"),
        180.0,
    ),
    Case(
        "conditions: sea state",
        _cond("sea_state"),
        "10",
        "sea state: 10.0 must be at most 9",
        "3",
        _cond_value("sea_state"),
        3.0,
    ),
    *(
        Case(
            f"conditions: {attr}",
            _cond(attr),
            "0",
            f"{label}: 0.0 must be positive",
            "1.1",
            _cond_value(attr),
            1.1,
        )
        for attr, label in (
            ("wind_coeff_head", "wind coefficient head-on"),
            ("wind_coeff_beam", "wind coefficient beam-on"),
            ("current_coeff_head", "current coefficient head-on"),
            ("current_coeff_beam", "current coefficient beam-on"),
        )
    ),
    *(
        Case(
            f"conditions: {attr}",
            _cond(attr),
            "-1",
            f"{label}: -1.0 m² must be positive",
            "250",
            _cond_value(attr),
            250.0,
        )
        for attr, label in (
            ("wind_area_head_m2", "wind area head-on"),
            ("wind_area_beam_m2", "wind area beam-on"),
            ("current_area_head_m2", "current area head-on"),
            ("current_area_beam_m2", "current area beam-on"),
        )
    ),
    Case(
        "conditions: air density",
        _cond("air_density"),
        "0.1",
        "air density: 0.1 kg/m³ must be at least 0.5 kg/m³",
        "1.25",
        _cond_value("air_density"),
        1.25,
    ),
    Case(
        "conditions: water density",
        _cond("water_density"),
        "5000",
        "water density: 5000.0 kg/m³ must be at most 1100 kg/m³",
        "1000",
        _cond_value("water_density"),
        1000.0,
    ),
    Case(
        "conditions: water depth",
        _cond("water_depth_m"),
        "0",
        "water depth: 0.0 m must be positive",
        "12",
        _cond_value("water_depth_m"),
        12.0,
    ),
    Case(
        "conditions: under-keel clearance margin",
        _cond("ukc_margin_m"),
        "-1",
        "under-keel clearance margin: -1.0 m must not be negative",
        "1.5",
        _cond_value("ukc_margin_m"),
        1.5,
    ),
    *(
        Case(
            f"conditions: {attr}",
            _cond(attr),
            "0.7",
            f"{label}: 0.7 must be at most 0.5",
            "0.3",
            _cond_value(attr),
            0.3,
        )
        for attr, label in (
            ("wind_centre_head_on", "wind centre of pressure head-on"),
            ("current_centre_head_on", "current centre of pressure head-on"),
        )
    ),
    *(
        Case(
            f"conditions: {attr}[{k}]",
            _centre(attr, k),
            "1e6",
            "centre of pressure: 1e+06 m must be at most 100000 m",
            "12",
            lambda p, attr=attr, k=k: (getattr(_stage(p).conditions, attr) or (None, None))[k],
            12.0,
            setup=lambda w, attr=attr, k=k: _type_line(_centre(attr, 1 - k)(w), "0"),
        )
        for attr in ("wind_centre_m", "current_centre_m")
        for k in (0, 1)
    ),
    # the stage details
    Case(
        "stage: wind limit",
        lambda w: w.plan_ui.stage_details.limit_fields["max_wind_ms"],  # type: ignore[attr-defined]
        "-1",
        "wind limit: -1.0 kn must not be negative",
        "30",
        lambda p: _stage(p).limits.max_wind_ms,
        30 * KNOT,
    ),
    Case(
        "stage: current limit",
        lambda w: w.plan_ui.stage_details.limit_fields["max_current_ms"],  # type: ignore[attr-defined]
        "30",
        "current limit: 30.0 kn must be at most 20 kn",
        "2.5",
        lambda p: _stage(p).limits.max_current_ms,
        2.5 * KNOT,
    ),
    Case(
        "stage: least clearance",
        lambda w: w.plan_ui.stage_details.limit_fields["min_clearance_m"],  # type: ignore[attr-defined]
        "-3",
        "least clearance: -3.0 m must not be negative",
        "7",
        lambda p: _stage(p).limits.min_clearance_m,
        7.0,
    ),
    Case(
        "stage: clearance margin",
        lambda w: w.plan_ui.stage_details.margin,  # type: ignore[attr-defined]
        "-1",
        "clearance margin: -1.0 m must not be negative",
        "12",
        lambda p: p.clearance_margin_m,
        12.0,
    ),
    Case(
        "stage: pose x",
        _pose_cell(1),
        "1e6",
        "Kestrel 3: x: 1e+06 m must be at most 100000 m",
        "25",
        lambda p: _stage(p).poses[0].x,
        25.0,
    ),
    Case(
        "stage: pose y",
        _pose_cell(2),
        "nan",
        "Kestrel 3: y: 'nan' is not a finite number",
        "-15",
        lambda p: _stage(p).poses[0].y,
        -15.0,
    ),
    Case(
        "stage: pose heading",
        _pose_cell(3),
        "1e9",
        "Kestrel 3: heading: 1e+09° must be at most 36000°",
        "45",
        lambda p: _stage(p).poses[0].heading_deg,
        45.0,
    ),
    # a swing stage's start and end headings (the sample's second stage swings 090 -> 270)
    Case(
        "stage: swing start",
        lambda w: w.plan_ui.stage_details.swing_start,  # type: ignore[attr-defined]
        "1e9",
        "swing start: 1e+09° must be at most 36000°",
        "45",
        lambda p: p.stages[1].swing.start_heading_deg,  # type: ignore[union-attr]
        45.0,
        setup=lambda w: w.controller.set_stage_index(1),  # type: ignore[attr-defined]
    ),
    # found by the monkey: a start a hair off the end (it typed 1e-300 against an end of 000;
    # here 270 less 1e-12 against 270) was taken as a whole turn, which the file wrote as
    # no turn at all and then refused to read
    Case(
        "stage: swing start a hair off the end",
        lambda w: w.plan_ui.stage_details.swing_start,  # type: ignore[attr-defined]
        "269.999999999999",
        "must differ from the start heading",
        "260",
        lambda p: p.stages[1].swing.start_heading_deg,  # type: ignore[union-attr]
        260.0,
        setup=lambda w: w.controller.set_stage_index(1),  # type: ignore[attr-defined]
    ),
    Case(
        "stage: swing end",
        lambda w: w.plan_ui.stage_details.swing_end,  # type: ignore[attr-defined]
        "nan",
        "swing end: 'nan' is not a finite number",
        "300",
        lambda p: p.stages[1].swing.end_heading_deg,  # type: ignore[union-attr]
        300.0,
        setup=lambda w: w.controller.set_stage_index(1),  # type: ignore[attr-defined]
    ),
    # the drift panel: ghost times, look ahead, each hull's yaw radius of gyration
    Case(
        "drift: ghost times",
        lambda w: w.drift_ui.panel.times,  # type: ignore[attr-defined]
        "0, 60",
        "drift: drift time: 0.0 s must be positive",
        "20, 40",
        lambda p: p.drift.times_s[0],
        20.0,
    ),
    Case(
        "drift: look ahead",
        lambda w: w.drift_ui.panel.horizon,  # type: ignore[attr-defined]
        "5000",
        "drift: drift horizon: 5000.0 s must be at most 3600 s",
        "300",
        lambda p: p.drift.horizon_s,
        300.0,
    ),
    Case(
        "drift: yaw radius of gyration",
        lambda w: (w.drift_ui.panel.hulls, w.drift_ui.panel.hulls.model().index(0, 1)),  # type: ignore[attr-defined]
        "-4",
        "hull Kestrel 3: yaw radius of gyration: -4.0 m must be positive",
        "18",
        lambda p: p.hulls[0].yaw_gyradius_m,
        18.0,
    ),
    # the solve panel's goal (kept with the stage as it is typed)
    *(
        Case(
            f"goal: {label}",
            lambda w, attr=attr: getattr(w.solve_ui.solve_panel, attr),  # type: ignore[attr-defined]
            "1e9",
            f"goal: {label}: 1e+09 {unit} must be at most {bound} {unit}",
            "7",
            lambda p, field=field: getattr(_stage(p).goal, field),
            7 * TF,  # t or t·m
            setup=lambda w: _goal_kind(w, "force"),
        )
        for attr, field, label, unit, bound in (
            ("fx", "fx_n", "force ahead", "t", "10000"),
            ("fy", "fy_n", "force to port", "t", "10000"),
            ("mz", "moment_nm", "yaw moment", "t·m", "1e+07"),
        )
    ),
    Case(
        "goal: speed through the water",
        lambda w: w.solve_ui.solve_panel.speed,  # type: ignore[attr-defined]
        "25",
        "goal: speed through the water: 25.0 kn must be at most 20 kn",
        "3.5",
        lambda p: _stage(p).goal.speed_ms,
        3.5 * KNOT,
        setup=lambda w: _goal_kind(w, "transit"),
    ),
]


def _type_line(edit: QLineEdit, text: str) -> None:
    edit.setFocus()
    edit.selectAll()
    QTest.keyClicks(edit, text)
    QTest.keyClick(edit, Qt.Key.Key_Return)
    edit.clearFocus()
    QApplication.processEvents()


def _type_cell(view: QAbstractItemView, index: object, text: str) -> None:
    view.setFocus()
    view.setCurrentIndex(index)  # type: ignore[arg-type]
    view.edit(index)  # type: ignore[arg-type]
    editor = view.focusWidget()
    assert isinstance(editor, QLineEdit), f"no line editor for the cell: {editor!r}"
    editor.selectAll()
    QTest.keyClicks(editor, text)
    QTest.keyClick(editor, Qt.Key.Key_Return)
    for _ in range(3):  # the delegate commits on the next turn of the event loop
        QApplication.processEvents()


def _enter(w: object, case: Case, text: str) -> None:
    target = case.field(w)
    if isinstance(target, QLineEdit):
        _type_line(target, text)
    else:
        view, index = target  # type: ignore[misc]
        _type_cell(view, index, text)
    if case.commit is not None:
        case.commit(w)


@pytest.mark.parametrize("case", CASES, ids=lambda c: c.id)
def test_a_value_out_of_range_is_refused_in_display_units(env, case: Case, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    w = env
    c = w.controller
    c.reset(load(SAMPLE))
    c.set_stage_index(0)
    QApplication.processEvents()
    said: list[str] = []
    c.message.connect(said.append)
    try:
        if case.setup is not None:
            case.setup(w)
        before = c.project
        _enter(w, case, case.bad)
        assert c.project is before, f"{case.id}: {case.bad!r} changed the plan"
        assert said, f"{case.id}: {case.bad!r} was refused without a word"
        assert case.said in said[-1]
        _enter(w, case, case.good)
        assert c.project is not before, f"{case.id}: {case.good!r} was not taken ({said[-1:]})"
        assert case.got(c.project) == pytest.approx(case.expect, abs=1e-9)
        out = save(c.project, tmp_path / "entry.towboard")
        assert dumps(load(out)) == dumps(c.project)
    finally:
        c.message.disconnect(said.append)


def test_refusals_follow_the_display_units(env) -> None:  # type: ignore[no-untyped-def]
    w = env
    c = w.controller
    project = load(SAMPLE)
    c.reset(replace(project, units=DisplayUnits("kN", "kN*m", "ft", "m/s")))
    c.set_stage_index(0)
    QApplication.processEvents()
    said: list[str] = []
    c.message.connect(said.append)
    try:
        _enter(w, CASES[0], "5e-324")
        assert said[-1] == (
            "Not changed: tug Gannet: bollard pull: 4.94066e-324 kN must be at least 0.980665 kN"
        )
        _enter(w, CASES[0], "400 kN")
        assert c.project.tug("Gannet").bollard_pull_n == pytest.approx(400_000.0)
        _enter(w, CASES[0], "50 t")  # a unit typed after the number wins
        assert c.project.tug("Gannet").bollard_pull_n == pytest.approx(50 * TF)
        line = next(x for x in CASES if x.id == "tugs: line length")
        _enter(w, line, "-3")
        assert said[-1] == "Not changed: tug Gannet: line length: -3.0 ft must be positive"
        wind = next(x for x in CASES if x.id == "conditions: wind speed")
        _enter(w, wind, "150")
        assert said[-1] == "wind speed: 150.0 m/s must be at most 102.889 m/s"
    finally:
        c.message.disconnect(said.append)


@pytest.mark.parametrize(
    ("case_id", "typed", "said", "good", "expect"),
    [
        # "2,800" was read as 2.8 t; "1,500" as 1.5 t·m
        (
            "hull: displacement",
            "2,800",
            "displacement: '2,800' is ambiguous (the comma may mark thousands or decimals): "
            "write 2800 or 2.800",
            "2800",
            2.8e6,  # kg
        ),
        (
            "goal: yaw moment",
            "1,500",
            "goal: yaw moment: '1,500' is ambiguous (the comma may mark thousands or "
            "decimals): write 1500 or 1.500",
            "1,5",  # a decimal comma before fewer than three digits is read as ever
            1.5 * TF,  # t·m to N·m
        ),
    ],
)
def test_a_comma_before_three_digits_is_refused_not_guessed(  # type: ignore[no-untyped-def]
    env, case_id: str, typed: str, said: str, good: str, expect: float
) -> None:
    w = env
    c = w.controller
    c.reset(load(SAMPLE))
    c.set_stage_index(0)
    QApplication.processEvents()
    case = next(x for x in CASES if x.id == case_id)
    messages: list[str] = []
    c.message.connect(messages.append)
    try:
        if case.setup is not None:
            case.setup(w)
        before = c.project
        _enter(w, case, typed)
        assert c.project is before, f"{typed!r} changed the plan"
        assert messages and messages[-1].endswith(f"ot changed: {said}")
        _enter(w, case, good)
        assert case.got(c.project) == pytest.approx(expect, abs=1e-9)
    finally:
        c.message.disconnect(messages.append)


#: Line edits of the panels that hold text, not numbers (names, or a list of numbers
#: checked in its own dialog).
TEXT_FIELDS = {"hull_panel.name"}


def _numeric_fields(w) -> dict[str, object]:  # type: ignore[no-untyped-def]
    """Every line edit and editable table of the window's panels, by where it lives."""
    panels = {
        "tugs_panel": w.tugs_panel,
        "hull_panel": w.hull_panel,
        "conditions": w.solve_ui.conditions,
        "solve_panel": w.solve_ui.solve_panel,
        "stage_details": w.plan_ui.stage_details,
        "drift_panel": w.drift_ui.panel,
    }
    out: dict[str, object] = {}
    for name, panel in panels.items():
        named = {id(v): f"{name}.{attr}" for attr, v in vars(panel).items()}
        for edit in panel.findChildren(QLineEdit):
            if isinstance(edit.parent().parent(), QAbstractItemView):
                continue  # a cell's editor
            out[named.get(id(edit), f"{name}.{edit.objectName() or hex(id(edit))}")] = edit
    return out


def test_every_numeric_field_has_a_case(env) -> None:  # type: ignore[no-untyped-def]
    w = env
    w.controller.reset(load(SAMPLE))
    covered = {id(x) for case in CASES if isinstance(x := case.field(w), QLineEdit)}
    missing = [
        name
        for name, edit in _numeric_fields(w).items()
        if id(edit) not in covered and name not in TEXT_FIELDS
    ]
    assert not missing, f"numeric fields without a case in {__file__}: {missing}"
    model: QAbstractItemModel = w.tugs_panel.model
    editable = {
        KEYS[col]
        for col in range(model.columnCount())
        if model.flags(model.index(0, col)) & Qt.ItemFlag.ItemIsEditable
    }
    cased = {case.id.split(": ")[1] for case in CASES if case.id.startswith("tugs: ")}
    numeric = editable - {"name", "point", "astern"}
    titles = {
        "bp": "bollard pull",
        "astern_bp": "astern pull",
        "length": "line length",
        "sector_from": "sector from",
        "sector_to": "sector to",
    }
    assert {titles.get(k, k) for k in numeric} <= cased
