"""The window's tugs table prints a setting as the briefing and the report do: a small
one with its digits, "standing by" only for a setting of exactly nothing."""

from __future__ import annotations

from app.panels.tugs_model import KEYS


def test_the_tugs_table_shows_a_small_setting_and_standing_by(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(2)  # the sample's hold: Gannet 0.5 %, Puffin and Tern 0.6 %
    stage = c.stage
    c.apply(
        c.project.with_stage(stage.with_placement(stage.placement("Tern").with_setting(0.0)), 2),
        "Tern stands by",
    )
    model = window.tugs_panel.model
    shown = {
        model.rows[r].tug.name: model.data(model.index(r, KEYS.index("setting")))
        for r in range(model.rowCount())
    }
    # hand written: 0.005 x 100 = 0.5; 0.006 x 100 = 0.6; Tern set to nothing
    assert shown == {"Gannet": "0.5", "Puffin": "0.6", "Tern": "standing by"}
