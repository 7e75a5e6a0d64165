"""A whole plan made in the window from File > New with real mouse and keyboard events only.

Nothing here calls into the controller or edits the project: every step is a click, a
drag or a key on the window, its board, panels, menus and dialogs (the file dialogs,
which are the system's, are answered by monkeypatching them, as DEVELOPERS.md says).
The plan is saved, opened again and printed to PDF; the PDF's text must hold every name
and number typed, and the plan opened again must equal the plan saved (to the 12
significant digits the file keeps, so that it saves to the same bytes).
"""

from __future__ import annotations

import unicodedata
from pathlib import Path

import pypdf
import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QFileDialog, QWidget

from app.panels.fitting_dialog import FittingDialog
from app.panels.fittings_model import KEYS as FITTING_KEYS
from app.panels.tug_dialog import TugDialog
from app.panels.tugs_model import KEYS as TUG_KEYS
from app.window.plan_details import PlanDetailsDialog
from core.io.projectfile import dumps, load
from tests.app.board.conftest import move_with_button, view_point
from tests.app.editors.conftest import retype, type_in_cell

CTRL = Qt.KeyboardModifier.ControlModifier
LEFT = Qt.MouseButton.LeftButton

#: The title block as typed.
TITLE = {
    "name": "Skua 7 shift to the Brenna lay-by",
    "revision": "C",
    "date": "2027-05-18",
    "prepared": "I. Varga, towage planner",
    "checked": "O. Lind, tow master",
    "approved": "H. Okafor, harbour master",
    "site": "Brenna basin, north arm",
}
HISTORY_TEXT = "Third tug added for the swing"
NOTES = "Invented exercise plan. High water 14:20."
#: Each tug: name, type, role, BP, astern, certificate, height, towline, MBL, call sign, channel.
TUGS = (
    (
        "Kittiwake",
        "ASD",
        "Bow centre lead",
        "52",
        "47",
        "2026-02-11",
        "6.5",
        "220",
        "161",
        "KTW3",
        "VHF 71",
    ),
    (
        "Fulmar",
        "tractor",
        "Stern line, steers",
        "38",
        "36",
        "2025-10-02",
        "5.2",
        "180",
        "118",
        "FLM8",
        "VHF 71",
    ),
    (
        "Guillemot",
        "conventional twin screw",
        "Pushes on the starboard side",
        "27",
        "12",
        "2024-07-30",
        "4.1",
        "150",
        "84",
        "GLM2",
        "VHF 71",
    ),
)
#: The two line points: the name, SWL and TOW typed (t).
FITTINGS = (("Bow staple", "75", "60"), ("Stern bitts", "55", "44"))
PUSH_NAME = "Starboard pushing pad"
HULL = "Skua 7"
DRAUGHT, FREEBOARD = "2.8", "2.4"  # m
FULMAR_LEAD, FULMAR_LINE = "190", "42"  # relative bearing, m
SETTINGS = ("40", "35", "30")  # percent, in the order of TUGS
QUAY = ((-40.0, 30.0), (60.0, 30.0))  # site, m: a quay face 100 m long north of the berth
STAGE_TWO = "Swing off the berth"
WIND = ("12", "045")  # kn, from: on the port bow of the body as it lies (heading 100)
CURRENT = ("0.6", "200")  # kn, towards: setting it to starboard


def _focused() -> QWidget:
    w = QApplication.focusWidget()
    assert w is not None
    return w


def _menu_item(qtbot, window, menu_key: Qt.Key, downs: int) -> None:  # type: ignore[no-untyped-def]
    """Open a menu with its Alt key and choose the item ``downs`` rows below the first."""
    qtbot.keyClick(window, menu_key, Qt.KeyboardModifier.AltModifier)
    popup = QApplication.activePopupWidget()
    assert popup is not None, "the menu did not open"
    for _ in range(downs):
        qtbot.keyClick(popup, Qt.Key.Key_Down)
    qtbot.keyClick(popup, Qt.Key.Key_Return)


def _visible(qtbot, window, kind):  # type: ignore[no-untyped-def]
    """The one dialog of ``kind`` showing, made the active window (as a window manager would)."""
    found = [d for d in window.findChildren(kind) if d.isVisible()]
    assert len(found) == 1, kind
    found[0].activateWindow()
    qtbot.waitUntil(found[0].isActiveWindow)
    return found[0]


def _ok(qtbot, dialog) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(dialog.buttons.button(dialog.buttons.StandardButton.Ok), LEFT)
    assert not dialog.isVisible(), getattr(dialog, "error", None) and dialog.error.text()
    _back_to(qtbot, dialog.parentWidget().window())


def _back_to(qtbot, window) -> None:  # type: ignore[no-untyped-def]
    """The window is active again once a dialog has gone (a window manager does this; the
    offscreen platform leaves no window active once a closed dialog is deleted)."""
    qtbot.wait(20)  # the closed dialog is deleted
    window.activateWindow()
    qtbot.waitUntil(window.isActiveWindow)


def _click_site(qtbot, view, x: float, y: float) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(view.viewport(), LEFT, pos=view_point(view, x, y))


def _board_key(view, key: Qt.Key, mod=Qt.KeyboardModifier.NoModifier) -> None:  # type: ignore[no-untyped-def]
    view.setFocus()
    QTest.keyClick(view.viewport(), key, mod)


def _shown(typed: str, unit: str) -> str:
    """A number as typed, as the briefing prints it: one decimal and its unit."""
    return f"{float(typed):.1f} {unit}"


def _pdf_text(path: Path) -> str:
    reader = pypdf.PdfReader(path)
    text = "\n".join(page.extract_text() for page in reader.pages)
    return " ".join(unicodedata.normalize("NFKC", text).split())


def test_a_whole_plan_from_file_new_with_mouse_and_keys(
    window, qtbot, tmp_path, monkeypatch
) -> None:
    w, view = window, window.view
    w.resize(1600, 1000)
    w.activateWindow()
    qtbot.waitUntil(w.isActiveWindow)

    # -- File > New --------------------------------------------------------------------
    qtbot.keyClick(w, Qt.Key.Key_N, CTRL)
    assert w.controller.project.hulls == () and len(w.controller.project.stages) == 1

    # -- a 55 x 18 m hull drawn on the 1 m grid --------------------------------------------
    qtbot.keyClick(w, Qt.Key.Key_G, CTRL)  # snap to the grid
    assert w.act_snap.isChecked()
    _board_key(view, Qt.Key.Key_D)  # the draw tool
    assert w.board.tool == "draw"
    # a little off the grid nodes: the snap puts them on (-27, -9) ... (28, 9)
    corners = [(-27.3, -8.8), (27.8, -9.2), (28.2, 9.3), (-26.7, 8.9)]
    for x, y in corners:
        _click_site(qtbot, view, x, y)
    _click_site(qtbot, view, *corners[0])  # back on the first vertex closes it
    hull = w.controller.project.hulls[0]
    assert (hull.geometry.length, hull.geometry.beam) == (55.0, 18.0)
    name = hull.name

    def site(px: float, py: float) -> tuple[float, float]:
        """A hull-frame point in the site: the hull lies bow east, aft end at x = -27."""
        return (-27.0 + px, py)

    # -- two line points, named and rated; a push point ---------------------------------------
    _board_key(view, Qt.Key.Key_L)
    _click_site(qtbot, view, *site(55.3, 0.2))  # the bow, on the centreline
    _board_key(view, Qt.Key.Key_L)
    _click_site(qtbot, view, *site(-0.3, 0.1))  # the stern
    _board_key(view, Qt.Key.Key_P)
    _click_site(qtbot, view, *site(30.0, -9.3))  # the starboard side
    fittings = w.controller.project.hull(name).fittings
    assert [f.kind for f in fittings] == ["line", "line", "push"]
    # the bow point by its dialog: double-click it on the board
    _board_key(view, Qt.Key.Key_S)
    qtbot.mouseDClick(view.viewport(), LEFT, pos=view_point(view, *site(55.0, 0.0)))
    d = _visible(qtbot, w, FittingDialog)
    retype(qtbot, d.name, FITTINGS[0][0])
    retype(qtbot, d.swl, FITTINGS[0][1])
    retype(qtbot, d.tow, FITTINGS[0][2])
    retype(qtbot, d.lines_from, "300")
    retype(qtbot, d.lines_to, "60")
    _ok(qtbot, d)
    # the stern point and the pad in the hull panel's fittings table
    w.panels["hull"].raise_()
    panel = w.hull_panel
    qtbot.mouseClick(panel.tabs.tabBar(), LEFT, pos=panel.tabs.tabBar().tabRect(2).center())
    table = panel.fittings_tab.table
    stern = panel.fittings_tab.model.row_of(fittings[1].name)
    type_in_cell(qtbot, table, stern, FITTING_KEYS.index("name"), FITTINGS[1][0])
    type_in_cell(qtbot, table, stern, FITTING_KEYS.index("swl"), FITTINGS[1][1])
    type_in_cell(qtbot, table, stern, FITTING_KEYS.index("tow"), FITTINGS[1][2])
    pad = panel.fittings_tab.model.row_of(fittings[2].name)
    type_in_cell(qtbot, table, pad, FITTING_KEYS.index("name"), PUSH_NAME)

    # -- the title block, from the Plan menu ------------------------------------------------
    _menu_item(qtbot, w, Qt.Key.Key_P, 0)  # Plan > Plan details…
    d = _visible(qtbot, w, PlanDetailsDialog)
    retype(qtbot, d.name, TITLE["name"])
    retype(qtbot, d.revision, TITLE["revision"])
    retype(qtbot, d.date, TITLE["date"])
    retype(qtbot, d.prepared, TITLE["prepared"])
    retype(qtbot, d.checked, TITLE["checked"])
    retype(qtbot, d.approved, TITLE["approved"])
    retype(qtbot, d.site, TITLE["site"])
    qtbot.mouseClick(d.add_line, LEFT)
    qtbot.keyClicks(_focused(), HISTORY_TEXT)
    qtbot.keyClick(_focused(), Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: d.history.state() != d.history.State.EditingState)
    d.notes.setFocus()
    qtbot.keyClicks(d.notes, NOTES)
    _ok(qtbot, d)

    # -- three tugs with their particulars --------------------------------------------------
    tugs_panel = w.tugs_panel
    for particulars in TUGS:
        qtbot.mouseClick(tugs_panel.add_button, LEFT)
        qtbot.mouseClick(tugs_panel.edit_button, LEFT)
        d = _visible(qtbot, w, TugDialog)
        f = d.form
        for edit, text in zip(
            (
                f.name,
                None,
                f.role,
                f.bollard_pull,
                f.astern_pull,
                f.certificate,
                f.towing_point_height,
                f.towline_length,
                f.towline_mbl,
                f.call_sign,
                f.channel,
            ),
            particulars,
            strict=True,
        ):
            if edit is None:  # the type: an editable list
                f.type.lineEdit().setFocus()
                qtbot.keyClick(f.type.lineEdit(), Qt.Key.Key_A, CTRL)
                qtbot.keyClicks(f.type.lineEdit(), text)
            else:
                retype(qtbot, edit, text)
        _ok(qtbot, d)
    project = w.controller.project
    assert [t.name for t in project.tugs] == [t[0] for t in TUGS]

    # -- the hull's particulars, and the line points put on the centreline by typing --------
    qtbot.mouseClick(panel.tabs.tabBar(), LEFT, pos=panel.tabs.tabBar().tabRect(0).center())
    for edit, text in ((panel.draught, DRAUGHT), (panel.freeboard, FREEBOARD), (panel.name, HULL)):
        retype(qtbot, edit, text)
        qtbot.keyClick(edit, Qt.Key.Key_Return)
    qtbot.mouseClick(panel.tabs.tabBar(), LEFT, pos=panel.tabs.tabBar().tabRect(2).center())
    for fname, _swl, _tow in FITTINGS:
        type_in_cell(
            qtbot, table, panel.fittings_tab.model.row_of(fname), FITTING_KEYS.index("y"), "0"
        )

    # -- where the tugs work: a drag on the board, and typed leads and lines ----------------
    model = tugs_panel.model
    tug_table = tugs_panel.table
    kitti = w.board.bodies[HULL].tugs[TUGS[0][0]].glyph
    grab = view.mapFromScene(kitti.sceneBoundingRect().center())
    qtbot.mousePress(view.viewport(), LEFT, pos=grab)
    for k in range(1, 6):  # the tug swings round towards the port bow
        move_with_button(view, grab + QPoint(-4 * k, -14 * k))
    qtbot.mouseRelease(view.viewport(), LEFT, pos=grab + QPoint(-20, -70))
    kitti_lead = w.controller.project.stages[0].placement(TUGS[0][0]).lead_rad
    assert 0.2 < kitti_lead < 1.2  # its line now leads off the port bow
    fulmar = model.row_of(TUGS[1][0])
    type_in_cell(qtbot, tug_table, fulmar, TUG_KEYS.index("lead"), FULMAR_LEAD)
    type_in_cell(qtbot, tug_table, fulmar, TUG_KEYS.index("length"), FULMAR_LINE)
    for row, setting in enumerate(SETTINGS):
        type_in_cell(qtbot, tug_table, row, TUG_KEYS.index("setting"), setting)

    # -- the body moved and turned on the board ---------------------------------------------
    pose0 = w.controller.stage.pose_of(HULL)
    inside = view_point(view, *site(20.0, 4.0))
    qtbot.mousePress(view.viewport(), LEFT, pos=inside)
    for k in range(1, 6):
        move_with_button(view, inside + QPoint(8 * k, -6 * k))
    qtbot.mouseRelease(view.viewport(), LEFT, pos=inside + QPoint(40, -30))
    moved = w.controller.stage.pose_of(HULL)
    assert (moved.x, moved.y) != (pose0.x, pose0.y)
    _board_key(view, Qt.Key.Key_BracketRight, Qt.KeyboardModifier.ShiftModifier)  # 10 deg
    turned = w.controller.stage.pose_of(HULL)
    assert turned.heading_deg == pytest.approx(100.0)

    # -- a quay drawn by mouse, on the grid ----------------------------------------------------
    _board_key(view, Qt.Key.Key_Q)
    for x, y in QUAY:
        _click_site(qtbot, view, x + 0.2, y - 0.3)
    _board_key(view, Qt.Key.Key_Return)
    quay = w.controller.project.site.features[0]
    assert quay.kind == "quay" and quay.points == QUAY
    _board_key(view, Qt.Key.Key_S)

    # -- a second stage, named; wind and current; the goal solved --------------------------
    sl = w.plan_ui.stage_list
    qtbot.mouseClick(sl.buttons["duplicate"], LEFT)  # a copy: poses, tugs and all
    assert w.controller.stage_index == 1
    qtbot.mouseClick(sl.buttons["rename"], LEFT)
    editor = _focused()
    qtbot.keyClick(editor, Qt.Key.Key_A, CTRL)
    qtbot.keyClicks(editor, STAGE_TWO)
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: w.controller.project.stages[1].name == STAGE_TWO)
    w.panels["conditions"].raise_()
    cond = w.solve_ui.conditions
    for attr, text in (
        ("wind_speed_ms", WIND[0]),
        ("wind_from_deg", WIND[1]),
        ("current_speed_ms", CURRENT[0]),
        ("current_towards_deg", CURRENT[1]),
    ):
        retype(qtbot, cond.edits[attr], text)
        qtbot.keyClick(cond.edits[attr], Qt.Key.Key_Return)
    w.panels["solve"].raise_()
    goal = w.solve_ui.solve_panel.kind
    goal.setFocus()
    qtbot.keyClick(goal, Qt.Key.Key_Down)  # "No goal" -> "Hold"
    assert w.controller.stage.goal is not None and w.controller.stage.goal.kind == "hold"
    qtbot.keyClick(w, Qt.Key.Key_F9)  # Solve pulls
    stage = w.controller.project.stages[1]
    w.grab().save(str(tmp_path / "solved.png"))
    assert w.controller.undo_stack.undoText().startswith("Solve")
    assert all(0.0 <= p.setting <= 1.0 for p in stage.placements)
    assert any(p.setting > 0.0 for p in stage.placements)
    assert [p.setting for p in stage.placements] != [
        p.setting for p in w.controller.project.stages[0].placements
    ]

    # -- save, open again ------------------------------------------------------------------
    saved_at = tmp_path / "skua7.towboard"
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", staticmethod(lambda *a, **k: (str(saved_at), ""))
    )
    qtbot.keyClick(w, Qt.Key.Key_S, CTRL)
    assert saved_at.exists() and not w.controller.dirty
    saved = w.controller.project
    monkeypatch.setattr(
        QFileDialog, "getOpenFileName", staticmethod(lambda *a, **k: (str(saved_at), ""))
    )
    qtbot.keyClick(w, Qt.Key.Key_N, CTRL)
    assert w.controller.project.hulls == ()
    qtbot.keyClick(w, Qt.Key.Key_O, CTRL)
    reopened = w.controller.project
    # The file keeps 12 significant digits (docs/file-format.md): the plan opened again is
    # the saved plan to that precision, field for field, and saves to the same bytes.
    assert reopened == load(saved_at)
    assert dumps(reopened) == dumps(saved) == saved_at.read_text(encoding="utf-8")
    assert reopened.tug(TUGS[1][0]).bollard_pull_n == pytest.approx(
        saved.tug(TUGS[1][0]).bollard_pull_n, rel=1e-11
    )

    # -- the briefing as a PDF ----------------------------------------------------------------
    pdf = tmp_path / "skua7.pdf"
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", staticmethod(lambda *a, **k: (str(pdf), ""))
    )
    qtbot.keyClick(w, Qt.Key.Key_E, CTRL | Qt.KeyboardModifier.ShiftModifier)
    assert pdf.exists()
    text = _pdf_text(pdf)
    typed = [
        *TITLE.values(),
        HISTORY_TEXT,
        NOTES,
        HULL,
        PUSH_NAME,
        STAGE_TWO,
        "Quay 1",
        *(n for n, _s, _t in FITTINGS),
        *(_shown(v, "t") for _n, swl, tow in FITTINGS for v in (swl, tow)),
        "300° to 060°",
        _shown(DRAUGHT, "m"),
        _shown(FREEBOARD, "m"),
        f"{_shown(WIND[0], 'kn')} from {WIND[1]}°",
        f"{_shown(CURRENT[0], 'kn')} towards {CURRENT[1]}°",
        f"{float(FULMAR_LEAD):.1f}°, {_shown(FULMAR_LINE, 'm')}",
    ]
    for name, kind, role, bp, astern, cert, height, towline, mbl, call, channel in TUGS:
        typed += [name, kind, role, cert, call, channel]
        typed += [_shown(bp, "t"), _shown(astern, "t"), _shown(mbl, "t")]
        typed += [_shown(height, "m"), _shown(towline, "m")]
    missing = [t for t in typed if t not in text]
    assert not missing, missing
