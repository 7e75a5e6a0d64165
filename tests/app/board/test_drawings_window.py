"""File > Import outline…, Import site…, Export picture…, Export tables…, driven with the
mouse and keys through pytest-qt (the file choosers and ``exec`` monkeypatched)."""

from __future__ import annotations

import csv
from pathlib import Path

import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QImage
from PySide6.QtWidgets import QDialog, QDialogButtonBox, QFileDialog, QMessageBox

from app.window.export_dialogs import PictureDialog, TablesDialog
from app.window.outline_import_dialog import OutlineImportDialog
from app.window.site_import_dialog import SiteImportDialog
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import import_outline
from core.io.outline_import import OutlinePlacement
from core.io.report import report_json
from core.io.tables import BALANCE_COLUMNS, TUG_COLUMNS, lookup, stage_rows, tug_rows
from tests import dxf_drawings as dd
from tests.core.test_site_import import _site_drawing


def _open_returns(monkeypatch: pytest.MonkeyPatch, path: Path) -> None:
    monkeypatch.setattr(
        QFileDialog, "getOpenFileName", staticmethod(lambda *a, **k: (str(path), ""))
    )


def _click_ok(qtbot, dialog: QDialog) -> None:  # type: ignore[no-untyped-def]
    button = dialog.buttons.button(QDialogButtonBox.StandardButton.Ok)  # type: ignore[attr-defined]
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton)


def _choose(qtbot, combo, data) -> None:  # type: ignore[no-untyped-def]
    """Pick the item carrying ``data`` with the keyboard, as a user would."""
    combo.setFocus()
    target = combo.findData(data)
    assert target >= 0
    while combo.currentIndex() != target:
        key = Qt.Key.Key_Down if combo.currentIndex() < target else Qt.Key.Key_Up
        qtbot.keyClick(combo, key)


def _run_dialog(monkeypatch: pytest.MonkeyPatch, cls: type, drive) -> list[QDialog]:  # type: ignore[no-untyped-def]
    """Make ``cls.exec`` call ``drive(dialog)`` and return what the dialog ended with."""
    seen: list[QDialog] = []

    def exec_(self):  # type: ignore[no-untyped-def]
        seen.append(self)
        self.show()
        drive(self)
        return int(self.result())

    monkeypatch.setattr(cls, "exec", exec_)
    return seen


def test_the_file_menu_has_the_four_actions(window) -> None:  # type: ignore[no-untyped-def]
    texts = [a.text() for a in window.menu("file").actions()]
    for t in ("Import &outline…", "Import s&ite…", "Export pi&cture…", "Export &tables…"):
        assert t in texts
    assert texts.index("Import &outline…") < texts.index("&Quit")


def test_import_a_ship_drawn_in_mm_with_x_aft(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    ship = dd.ship_mm_x_aft(tmp_path / "Orla GA.dxf")
    _open_returns(monkeypatch, ship.path)
    before = window.controller.project

    def drive(d: OutlineImportDialog) -> None:
        assert d.layer() == "HULL" and d.chosen_units() == "mm"
        ok = d.buttons.button(QDialogButtonBox.StandardButton.Ok)
        assert not ok.isEnabled()  # the units are not confirmed yet
        _choose(qtbot, d.bow, "-x")
        qtbot.mouseClick(
            d.confirm, Qt.MouseButton.LeftButton, pos=QPoint(8, d.confirm.height() // 2)
        )
        assert d.confirm.isChecked() and ok.isEnabled()
        assert "Length 90.00 m, beam 20.00 m" in d.figures.text()
        _click_ok(qtbot, d)

    seen = _run_dialog(monkeypatch, OutlineImportDialog, drive)
    window.drawings_ui.act_import_outline.trigger()
    assert seen and seen[0].result() == QDialog.DialogCode.Accepted
    hull = window.controller.project.hull("Orla GA")
    ref = import_outline(Drawing.open(ship.path), "HULL", "mm", OutlinePlacement(bow="-x"))
    assert hull.outline == ref.outline
    assert hull.geometry.area == pytest.approx(ref.area_m2)
    assert window.board.selected_hull() == "Orla GA"
    window.act_undo.trigger()
    assert window.controller.project == before


def test_unconfirmed_units_import_nothing(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    path = dd.box_barge(tmp_path / "plain.dxf", 60_000, 18_000, insunits=0)
    _open_returns(monkeypatch, path)
    before = window.controller.project

    def drive(d: OutlineImportDialog) -> None:
        assert d.chosen_units() is None
        assert "must be chosen" in d.error.text()
        _click_ok(qtbot, d)  # disabled: nothing happens
        assert d.isVisible()
        _choose(qtbot, d.units_box, "mm")
        assert d.imported is not None and d.imported.length_m == pytest.approx(60.0)
        d.reject()

    _run_dialog(monkeypatch, OutlineImportDialog, drive)
    window.drawings_ui.act_import_outline.trigger()
    assert window.controller.project is before


def test_a_broken_chain_is_named_and_nothing_changes(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    path = dd.broken_chain(tmp_path / "broken.dxf")
    _open_returns(monkeypatch, path)
    before = window.controller.project

    def drive(d: OutlineImportDialog) -> None:
        assert "layer HULL: the lines do not close into an outline" in d.error.text()
        assert "0.5 m apart" in d.error.text()
        d.confirm.click()
        assert not d.buttons.button(QDialogButtonBox.StandardButton.Ok).isEnabled()
        _click_ok(qtbot, d)
        d.reject()

    _run_dialog(monkeypatch, OutlineImportDialog, drive)
    window.drawings_ui.act_import_outline.trigger()
    assert window.controller.project is before
    assert not window.isWindowModified()


def test_a_file_that_is_no_drawing_is_refused_in_a_message(
    window, tmp_path, monkeypatch, dialogs
) -> None:  # type: ignore[no-untyped-def]
    bad = tmp_path / "notes.dxf"
    bad.write_text("not a drawing")
    _open_returns(monkeypatch, bad)
    before = window.controller.project
    window.drawings_ui.act_import_outline.trigger()
    assert dialogs.shown[-1].startswith("Outline not imported: notes.dxf: is not a readable DXF")
    assert "The plan is unchanged." in dialogs.shown[-1]
    assert window.controller.project is before


def test_replacing_a_hull_outline_keeps_its_fittings(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    old = window.controller.project.hulls[0]
    length, beam = old.geometry.length, old.geometry.beam
    path = dd.box_barge(tmp_path / "new.dxf", length, beam)
    _open_returns(monkeypatch, path)

    def drive(d: OutlineImportDialog) -> None:
        qtbot.mouseClick(d.replace_hull, Qt.MouseButton.LeftButton)
        assert d.replace_hull.isChecked()
        d.confirm.click()
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, OutlineImportDialog, drive)
    window.drawings_ui.act_import_outline.trigger()
    new = window.controller.project.hull(old.name)
    assert new.geometry.area == pytest.approx(length * beam)
    assert [f.name for f in new.fittings] == [f.name for f in old.fittings]
    for f in new.fittings:
        assert new.geometry.nearest(f.x, f.y).distance == pytest.approx(0.0, abs=1e-9)


def test_offsets_in_the_dialog(qtbot, tmp_path) -> None:  # type: ignore[no-untyped-def]
    from core.io.projectfile import load
    from tests.app.board.conftest import SAMPLE

    path = tmp_path / "offsets.csv"
    path.write_text("x,hb\n0,0\n10,5\n35,5\n40,3\n")
    d = OutlineImportDialog(path, load(SAMPLE))
    qtbot.addWidget(d)
    assert [d.bow.itemData(i) for i in range(d.bow.count())] == ["+x", "-x"]
    assert d.layers.isHidden() and d.chosen_units() == "m"
    _choose(qtbot, d.bow, "-x")
    assert d.imported is not None and d.imported.area_m2 == pytest.approx(340.0)
    assert "area 340.0 m²" in d.figures.text()
    d.hull_name.setText("Kestrel 3")  # taken: no import under that name
    d.confirm.click()
    assert not d.buttons.button(QDialogButtonBox.StandardButton.Ok).isEnabled()


def test_reference_point_given_in_the_dialog(qtbot, tmp_path) -> None:  # type: ignore[no-untyped-def]
    from core.io.projectfile import load
    from tests.app.board.conftest import SAMPLE

    d = OutlineImportDialog(dd.box_barge(tmp_path / "box.dxf"), load(SAMPLE))
    qtbot.addWidget(d)
    assert not d.ref_x.isEnabled()
    _choose(qtbot, d.reference, "point")
    assert d.ref_x.isEnabled()
    d.ref_x.setValue(20.0)
    assert d.imported is not None
    assert d.imported.reference_in_drawing == pytest.approx((20.0, 0.0))
    assert d.imported.centroid_m[0] == pytest.approx(10.0)


def test_import_a_site_drawing(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    path = _site_drawing(tmp_path / "basin.dxf")
    _open_returns(monkeypatch, path)
    before = len(window.controller.project.site.features)

    def drive(d: SiteImportDialog) -> None:
        assert d.layer_kinds() == {
            "DOLPHINS": "dolphin",
            "LIMITS": "limit",
            "QUAY": "quay",
            "VESSELS": "vessel",
        }
        _choose(qtbot, d.kind_boxes["LIMITS"], None)  # leave the limit out
        d.north.setValue(90.0)
        assert d.imported is not None
        assert d.imported.counts() == {"quay": 1, "dolphin": 2, "vessel": 1}
        assert "open line(s) left out" in d.warnings.text()
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, SiteImportDialog, drive)
    window.drawings_ui.act_import_site.trigger()
    site = window.controller.project.site
    assert len(site.features) == before + 4
    quay = next(f for f in site.features if f.name == "QUAY 1")
    # north along the drawing's +x: the quay's run along the drawing's +x runs north
    assert quay.points[1][1] - quay.points[0][1] == pytest.approx(150.0)
    window.act_undo.trigger()
    assert len(window.controller.project.site.features) == before


def test_site_dialog_refuses_a_layer_of_the_wrong_kind(qtbot, tmp_path) -> None:  # type: ignore[no-untyped-def]
    from core.model.plan import Project

    d = SiteImportDialog(_site_drawing(tmp_path / "basin.dxf"), Project())
    qtbot.addWidget(d)
    d.set_kind("QUAY", "dolphin")
    assert "layer QUAY: holds no closed shapes for a dolphin" in d.error.text()
    assert not d.buttons.button(QDialogButtonBox.StandardButton.Ok).isEnabled()
    for layer in d.kind_boxes:
        d.set_kind(layer, None)
    assert "choose at least one layer" in d.error.text()


def test_site_from_a_table_replacing_the_features(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    path = tmp_path / "survey.csv"
    path.write_text("feature,kind,x,y\nWest quay,quay,1000,2000\nWest quay,quay,1000,2150\n")
    _open_returns(monkeypatch, path)

    def drive(d: SiteImportDialog) -> None:
        d.origin_x.setValue(1000.0)
        d.origin_y.setValue(2000.0)
        # on the button's own mark: a wide row's middle may be past its text
        at = QPoint(8, d.replace_all.height() // 2)
        qtbot.mouseClick(d.replace_all, Qt.MouseButton.LeftButton, pos=at)
        assert d.replace_all.isChecked()
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, SiteImportDialog, drive)
    window.drawings_ui.act_import_site.trigger()
    site = window.controller.project.site
    assert [(f.name, f.points) for f in site.features] == [
        ("West quay", ((0.0, 0.0), (0.0, 150.0)))
    ]


def test_export_pictures_of_every_stage(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    def drive(d: PictureDialog) -> None:
        qtbot.mouseClick(d.every_stage, Qt.MouseButton.LeftButton)
        _choose(qtbot, d.format, ".png")
        d.file.setText(str(tmp_path / "kestrel.png"))
        d.width_px.setValue(800)
        d.height_px.setValue(500)
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, PictureDialog, drive)
    written = window.drawings_ui.export_picture()
    n = len(window.controller.project.stages)
    assert [p.name for p in written] == [f"kestrel-{i + 1}.png" for i in range(n)]
    img = QImage(str(written[0]))
    assert (img.width(), img.height()) == (800, 500)


def test_export_the_board_as_shown(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    shown = window.drawings_ui.shown_area()
    assert shown is not None

    def drive(d: PictureDialog) -> None:
        qtbot.mouseClick(d.shown, Qt.MouseButton.LeftButton)
        d.file.setText(str(tmp_path / "view.svg"))
        jobs = d.jobs()
        assert [spec.area for _, spec in jobs] == [shown]
        assert jobs[0][1].stage_index == window.controller.stage_index
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, PictureDialog, drive)
    written = window.drawings_ui.export_picture()
    assert written == [tmp_path / "view.svg"]
    assert "<svg" in written[0].read_text()


def test_export_tables_in_the_plans_units(window, qtbot, tmp_path, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    def drive(d: TablesDialog) -> None:
        d.file.setText(str(tmp_path / "kestrel.csv"))
        assert d.files.text() == "kestrel-tugs.csv, kestrel-balance.csv"
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, TablesDialog, drive)
    written = window.drawings_ui.export_tables()
    assert [p.name for p in written] == ["kestrel-tugs.csv", "kestrel-balance.csv"]
    project = window.controller.project
    report = report_json(project)
    u = project.units
    for path, rows, columns in (
        (written[0], tug_rows(report), TUG_COLUMNS),
        (written[1], stage_rows(report), BALANCE_COLUMNS),
    ):
        text = path.read_bytes()
        assert text.startswith(b"\xef\xbb\xbf")  # a byte-order mark for spreadsheets
        table = list(csv.reader(text.decode("utf-8-sig").splitlines()))
        assert table[0] == [c.title(u) for c in columns]
        for row, cells in zip(rows, table[1:], strict=True):
            for col, cell in zip(columns, cells, strict=True):
                want = lookup(row, col.path)
                if col.quantity is not None and isinstance(want, float):
                    assert float(cell) == pytest.approx(
                        u.value(want, col.quantity), rel=1e-12, abs=1e-12
                    )


def test_a_table_name_with_a_nul_character_is_refused_in_a_message(
    window, qtbot, tmp_path, monkeypatch
) -> None:  # type: ignore[no-untyped-def]
    """Typed into the file field, a NUL character made os.stat raise a ValueError that
    reached the guard as a fault (the monkey, seed 701): now the tables are not written
    and a message says why."""
    out = tmp_path / "tables"
    out.mkdir()
    said: list[str] = []
    monkeypatch.setattr(
        QMessageBox,
        "warning",
        staticmethod(lambda parent, title, text: said.append(title + ": " + text)),
    )

    def drive(d: TablesDialog) -> None:
        d.file.setText(str(out / "a\x00b"))
        _click_ok(qtbot, d)

    _run_dialog(monkeypatch, TablesDialog, drive)
    assert window.drawings_ui.export_tables() == []
    assert len(said) == 1 and said[0].startswith("Tables not written: ")
    assert "a file name cannot hold a NUL character" in said[0]
    assert list(out.iterdir()) == []


def test_tables_dialog_needs_a_table(qtbot, tmp_path) -> None:  # type: ignore[no-untyped-def]
    from core.model.plan import Project

    d = TablesDialog(Project(), tmp_path / "x")
    qtbot.addWidget(d)
    d.tugs.click()
    d.balance.click()
    assert d.files.text() == "nothing: choose a table"
    d.accept()
    assert d.error.text() == "Choose at least one table."
    assert d.result() == QDialog.DialogCode.Rejected
