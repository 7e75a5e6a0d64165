"""``towboard`` opens the sample, ``towboard FILE`` that file; outline from dimensions."""

from __future__ import annotations

import gc
from pathlib import Path

import pytest
from PySide6.QtWidgets import QApplication, QDialog

import app.window.main_window as main_window
from core.io.projectfile import load, save
from core.model.outlines import raked_outline
from tests.app.board.conftest import SAMPLE


@pytest.fixture
def no_loop(monkeypatch, qtbot):  # type: ignore[no-untyped-def]
    monkeypatch.setattr(QApplication, "exec", lambda self: 0)
    main_window.OPEN_WINDOWS.clear()
    yield
    for w in main_window.OPEN_WINDOWS:
        w.controller.undo_stack.setClean()
        w.close()
    main_window.OPEN_WINDOWS.clear()
    gc.unfreeze()  # run() set aside what was alive (app.collector.freeze_at_start)


def test_no_file_opens_the_bundled_sample(no_loop) -> None:  # type: ignore[no-untyped-def]
    assert main_window.run(None) == 0
    (w,) = main_window.OPEN_WINDOWS
    assert w.controller.project == load(SAMPLE)
    assert w.controller.path == SAMPLE


def test_a_file_argument_opens_that_file(no_loop, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    project = load(SAMPLE)
    other = save(project.with_stages(project.stages[-1:]), tmp_path / "one stage.towboard")
    assert main_window.run(str(other)) == 0
    (w,) = main_window.OPEN_WINDOWS
    assert len(w.controller.project.stages) == 1
    assert w.controller.path == other


def test_outline_from_dimensions_replaces_the_hulls_outline(window, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    from app.window.outline_dialog import OutlineDialog

    def accept(dlg):  # type: ignore[no-untyped-def]
        dlg.shape.setCurrentIndex(dlg.shape.findData("raked"))
        dlg.length.setValue(90.0)
        dlg.beam.setValue(26.0)
        dlg.bow_rake.setValue(8.0)
        dlg.stern_rake.setValue(4.0)
        dlg.end_fraction.setValue(0.6)
        return int(QDialog.DialogCode.Accepted)

    monkeypatch.setattr(OutlineDialog, "exec", accept)
    window.board.select(("hull", "Kestrel 3"))
    window.generate_outline()
    hull = window.controller.project.hull("Kestrel 3")
    assert hull.outline == raked_outline(90.0, 26.0, 8.0, 4.0, 0.6)
    # the fittings moved onto the new outline
    for f in hull.fittings:
        assert hull.geometry.nearest(f.x, f.y).distance == pytest.approx(0.0, abs=1e-9)
    window.act_undo.trigger()
    assert window.controller.project == load(SAMPLE)
