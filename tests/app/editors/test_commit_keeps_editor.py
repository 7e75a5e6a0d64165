"""A table's cell editor commits without the table being reset under it.

When a committed value reset the whole model, the view released the editor while Qt's
delegate was still inside its event filter for that editor's key press ("commitData
called with an editor that does not belong to this view"); with a modal message shown
from the commit, the editor was deleted under the filter and the program could crash
(the fittings table was mended the same way before). A rename is a change of one row.
"""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt

from app.panels.tugs_model import KEYS as TUG_KEYS
from tests.app.editors.conftest import open_cell, press_enter


def _warnings(qtlog) -> list[str]:  # type: ignore[no-untyped-def]
    return [r.message for r in qtlog.records if "does not belong" in r.message]


@pytest.mark.parametrize("key", [Qt.Key.Key_Return, Qt.Key.Key_Tab])
def test_a_tug_renamed_in_its_cell_keeps_its_row_and_the_editor_commits_once(
    window, qtbot, qtlog, key
) -> None:
    table = window.tugs_panel.table
    model = table.model()
    col = TUG_KEYS.index("name")
    before = [t.name for t in window.controller.project.tugs]
    resets: list[int] = []
    model.modelAboutToBeReset.connect(lambda: resets.append(1))
    editor = open_cell(qtbot, table, 0, col)
    editor.setText("Zz renamed")
    if key == Qt.Key.Key_Return:
        press_enter(qtbot, table, editor)
    else:
        qtbot.keyClick(editor, key)
        qtbot.waitUntil(lambda: window.controller.project.tugs[0].name == "Zz renamed")
    after = [t.name for t in window.controller.project.tugs]
    assert after == ["Zz renamed", *before[1:]]
    assert model.index(0, col).data() == "Zz renamed"
    assert resets == []  # one row changed, the table was not reset
    assert _warnings(qtlog) == []
