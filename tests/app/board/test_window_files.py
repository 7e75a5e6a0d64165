"""The window around the board: files, the title, a broken file, the table, a screenshot."""

from __future__ import annotations

from pathlib import Path

import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QImage
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QFileDialog, QLineEdit

from core.io.projectfile import dumps, load
from tests.app.board.conftest import SAMPLE
from tests.app.editors.conftest import retype_and_enter


def test_the_sample_opens_with_its_name_in_the_title(window) -> None:  # type: ignore[no-untyped-def]
    assert window.controller.project == load(SAMPLE)
    assert "Kestrel 3 sail-away" in window.windowTitle()
    assert "deck_barge_unberth.towboard" in window.windowTitle()
    assert not window.isWindowModified()


def test_an_edit_marks_the_title_and_undo_clears_it(window) -> None:  # type: ignore[no-untyped-def]
    was = window.controller.stage.placement("Gannet").setting
    window.board.interaction.step_setting("Gannet", 0.05)
    assert window.isWindowModified()
    window.act_undo.trigger()
    assert not window.isWindowModified()
    window.act_redo.trigger()
    assert window.controller.stage.placement("Gannet").setting == pytest.approx(was + 0.05)


def test_save_then_reopen_gives_the_same_plan(window, tmp_path: Path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    window.board.interaction.step_setting("Puffin", 0.10)
    edited = window.controller.project
    target = tmp_path / "saved plan"
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", staticmethod(lambda *a, **k: (str(target), ""))
    )
    assert window.file_save_as()
    saved = tmp_path / "saved plan.towboard"
    assert saved.exists()
    assert not window.isWindowModified()
    # the file keeps 12 significant digits: what is read back writes the same file
    assert dumps(load(saved)) == dumps(edited)
    window.file_new()
    assert window.controller.project != edited
    assert window.open_path(saved)
    assert dumps(window.controller.project) == dumps(edited)
    assert window.controller.path == saved
    assert str(saved.resolve()) in window.recent_files()


def test_a_broken_file_shows_the_field_and_keeps_the_plan(window, tmp_path: Path, dialogs) -> None:  # type: ignore[no-untyped-def]
    window.board.interaction.step_setting("Puffin", 0.10)
    before, path_before = window.controller.project, window.controller.path
    broken = tmp_path / "broken.towboard"
    text = SAMPLE.read_text(encoding="utf-8").replace(
        '"bollard_pull_kN": 539.36575', '"bollard_pull_kN": -5'
    )
    broken.write_text(text, encoding="utf-8")
    assert not window.open_path(broken, ask=False)
    assert window.controller.project is before
    assert window.controller.path == path_before
    assert window.isWindowModified()
    shown = "\n".join(dialogs.shown)
    assert "broken.towboard" in shown
    assert "tugs[0].bollard_pull_kN" in shown  # the core's field path


def test_opening_over_unsaved_work_asks_first(window, dialogs, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    from PySide6.QtWidgets import QMessageBox

    window.board.interaction.step_setting("Puffin", 0.10)
    edited = window.controller.project
    dialogs.answer = QMessageBox.StandardButton.Cancel
    assert not window.open_path(SAMPLE)
    assert window.controller.project is edited
    assert any("Unsaved" in s for s in dialogs.shown)


def test_editing_a_table_cell_moves_the_board(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    panel = window.tugs_panel
    model = panel.model
    row = model.row_of("Puffin")
    col = [c.key for c in __import__("app.panels.tugs_model", fromlist=["COLUMNS"]).COLUMNS].index(
        "setting"
    )
    index = model.index(row, col)
    panel.table.setFocus()
    panel.table.setCurrentIndex(index)
    panel.table.edit(index)
    editor = panel.table.focusWidget()
    assert isinstance(editor, QLineEdit)
    editor.selectAll()
    QTest.keyClicks(editor, "75")
    QTest.keyClick(editor, Qt.Key.Key_Return)
    c = window.controller
    # the delegate commits on the next turn of the event loop
    qtbot.waitUntil(lambda: c.stage.placement("Puffin").setting == pytest.approx(0.75))
    assert c.stage.placement("Puffin").setting == pytest.approx(0.75)
    share = next(s for s in c.balance().shares if s.tug == "Puffin")
    tug = window.board.bodies["Kestrel 3"].tugs["Puffin"]
    assert "(75 %)" in tug.label.text
    assert c.project.units.show(share.pull_n, "force") in tug.label.text
    # the force arrow is drawn to the board's scale of the assigned pull
    force_scale, _, _ = window.board.scales()
    (sx, sy), (ex, ey) = tug.glyph.arrow_line
    assert ((ex - sx) ** 2 + (ey - sy) ** 2) ** 0.5 == pytest.approx(share.pull_n * force_scale)


def test_lead_typed_as_a_bearing(window) -> None:  # type: ignore[no-untyped-def]
    from app.panels.tugs_model import KEYS

    model = window.tugs_panel.model
    index = model.index(model.row_of("Gannet"), KEYS.index("lead"))
    assert model.setData(index, "315", Qt.ItemDataRole.EditRole)
    share = next(s for s in window.controller.balance().shares if s.tug == "Gannet")
    assert share.lead_bearing_deg == pytest.approx(315.0)
    assert not model.setData(index, "north", Qt.ItemDataRole.EditRole)
    assert "not a number" in window.statusBar().currentMessage()


def test_add_duplicate_and_remove_tugs(window) -> None:  # type: ignore[no-untyped-def]
    panel = window.tugs_panel
    c = window.controller
    panel.add_tug()
    assert [t.name for t in c.project.tugs][-1] == "Tug 1"
    placed = c.stage.placement("Tug 1")  # made fast at the free line point
    assert placed.point == "Port quarter bitt"  # the sample's first stage leaves it free
    panel.select_tug("Gannet")
    panel.table.selectRow(c.project.tugs.index(c.project.tug("Gannet")))
    panel.duplicate_tug()
    copy = c.project.tug("Gannet (copy)")
    assert copy.bollard_pull_n == c.project.tug("Gannet").bollard_pull_n
    panel.table.selectRow(panel.model.row_of("Gannet (copy)"))
    panel.remove_tug()
    assert "Gannet (copy)" not in [t.name for t in c.project.tugs]
    for _ in range(3):
        c.undo_stack.undo()
    assert c.project == load(SAMPLE)


def test_display_units_change_everything_at_once(window) -> None:  # type: ignore[no-untyped-def]
    box = window.units_panel.boxes["force"]
    box.setCurrentIndex(box.findData("kN"))
    c = window.controller
    b = c.balance()
    assert c.project.units.force == "kN"
    assert window.balance_panel.fields["net"].text() == f"{b.net_magnitude / 1000:.1f} kN"
    tug = window.board.bodies["Kestrel 3"].tugs["Gannet"]
    share = next(s for s in b.shares if s.tug == "Gannet")
    assert f"{share.pull_n / 1000:.1f} kN" in tug.label.text
    assert "kN" in window.tugs_panel.model.headerData(1, Qt.Orientation.Horizontal)


def test_hull_panel_edits_the_hull(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    hp = window.hull_panel
    retype_and_enter(qtbot, hp.draught, "3.5")
    assert window.controller.project.hull("Kestrel 3").draught_m == pytest.approx(3.5)
    retype_and_enter(qtbot, hp.cog_y, "0")
    retype_and_enter(qtbot, hp.cog_x, "40")
    assert window.controller.project.hull("Kestrel 3").cog == (40.0, 0.0)
    retype_and_enter(qtbot, hp.draught, "-1")
    assert window.controller.project.hull("Kestrel 3").draught_m == pytest.approx(3.5)
    assert "draught" in window.statusBar().currentMessage()


def test_the_window_screenshot_is_not_blank(window, tmp_path: Path, qtbot) -> None:  # type: ignore[no-untyped-def]
    qtbot.wait(50)
    path = tmp_path / "window.png"
    assert window.grab().save(str(path))
    image = QImage(str(path))
    assert image.width() >= 1000 and image.height() >= 700
    colours = set()
    for y in range(0, image.height(), 3):
        for x in range(0, image.width(), 3):
            colours.add(image.pixel(x, y))
    assert len(colours) > 200  # the board, arrows, labels and panels, not a flat fill
    assert "Planning aid" in window.caution.text()


def test_a_recent_file_opened_from_its_menu_entry_is_not_deleted_under_it(
    window, tmp_path: Path
) -> None:  # type: ignore[no-untyped-def]
    """Opening a recent file rebuilds the Open Recent menu from inside the entry's own
    ``triggered``: the entry must outlive its signal (``QMenu.clear`` deleted it there, and
    Qt's menu went on using the deleted action after a real click)."""
    import shiboken6
    from PySide6.QtCore import QCoreApplication, QEvent

    copy = tmp_path / "again.towboard"
    copy.write_bytes(SAMPLE.read_bytes())
    assert window.open_path(copy, ask=False)
    entry = next(a for a in window.recent_menu.actions() if a.toolTip() == str(copy.resolve()))
    entry.trigger()
    assert shiboken6.isValid(entry)  # alive until the event loop comes round
    QCoreApplication.sendPostedEvents(None, QEvent.Type.DeferredDelete)
    assert not shiboken6.isValid(entry)  # then gone: the menu holds the new entries only
    assert window.recent_menu.actions()[0].toolTip() == str(copy.resolve())
    assert window.controller.path == copy


@pytest.mark.parametrize(
    ("stored", "files"),
    [(5, []), ("/plans/a.towboard", ["/plans/a.towboard"]), (["/a", "/b"], ["/a", "/b"])],
)
def test_the_recent_files_setting_of_any_kind_lets_the_window_open(  # type: ignore[no-untyped-def]
    qtbot, stored: object, files: list[str]
) -> None:
    """A settings store may hand back any kind of value (a registry or a plist keeps a
    number as a number): the window once iterated over it and did not open."""
    from app.window.main_window import MainWindow, settings

    s = settings()
    s.setValue("recent_files", stored)
    s.sync()
    w = MainWindow()
    qtbot.addWidget(w)
    assert w.recent_files() == files
    assert w.recent_menu.isEnabled() == bool(files)
