"""The monkey on the main window: random clicks, drags, keys, menus, edits and dialogs.

A short seeded run per sample (``tests/fuzz/monkey.py``; ``benchmarks/monkey.py`` runs
thousands of actions over many seeds in subprocesses, so that a crash is seen): no error
may reach ``sys.excepthook`` (every guard in app/ sends a program fault there), and every
50 actions and at the end the window's plan gives its report with finite numbers and
saves and loads back equal. A failure prints the seed and the actions before it.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from PySide6.QtWidgets import QApplication

from tests.fuzz.monkey import (
    SAMPLES,
    Monkey,
    _finite_problems,
    check_project,
    copy_samples,
    new_window,
)


@pytest.fixture(autouse=True)
def isolated(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    """Recovery, settings and any relative path typed into a dialog stay in the test's folder."""
    monkeypatch.setenv("TOWBOARD_RECOVERY_DIR", str(tmp_path / "recovery"))
    monkeypatch.setenv("TOWBOARD_SETTINGS_FILE", str(tmp_path / "settings.ini"))
    monkeypatch.chdir(tmp_path)
    return tmp_path


def _window(qtbot, sample: Path):  # type: ignore[no-untyped-def]
    w = new_window(copy_samples(Path.cwd() / "opened")[SAMPLES.index(sample)])
    qtbot.addWidget(w)
    return w


@pytest.mark.parametrize(("seed", "sample"), [(3, 0), (8, 2)])
def test_random_actions_raise_nothing_and_the_plan_always_reports(
    qtbot, tmp_path: Path, seed: int, sample: int
) -> None:
    w = _window(qtbot, SAMPLES[sample])
    monkey = Monkey(w, seed, tmp_path / "files", keep=tmp_path)
    outcome = monkey.run(180, check_every=45)
    w.controller.undo_stack.setClean()
    assert outcome.actions == 180 and outcome.checks == 5
    assert outcome.clean, outcome.summary()
    # the run did things to the plan: edits were made and some were undone
    assert monkey.w.controller.undo_stack.count() > 0


def test_the_monkey_reports_a_fault_with_the_actions_before_it(
    qtbot, tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    """A key handler that fails is caught by its guard and found by the monkey."""
    from app.board.interaction import Interaction

    def broken(self, event):  # type: ignore[no-untyped-def]
        raise ZeroDivisionError("planted by the test")

    monkeypatch.setattr(Interaction, "key", broken)
    w = _window(qtbot, SAMPLES[0])
    monkey = Monkey(w, 5, tmp_path / "files")
    outcome = monkey.run(60, check_every=30)
    w.controller.undo_stack.setClean()
    QApplication.processEvents()
    assert outcome.faults, "a planted fault went unseen"
    first = outcome.faults[0]
    assert "ZeroDivisionError: planted by the test" in first
    assert "actions before it:" in first and ": key Key_" in first
    assert f"seed {monkey.seed}" in outcome.summary()


def test_the_check_finds_a_number_that_is_not_finite() -> None:
    tree = {"stages": [{"pull": 1.0, "moment": [0.0, math.nan]}], "ok": math.inf}
    assert sorted(_finite_problems(tree)) == ["/ok = inf", "/stages/0/moment/1 = nan"]


@pytest.mark.parametrize("sample", SAMPLES, ids=lambda p: p.stem)
def test_the_check_passes_the_samples(sample: Path) -> None:
    from core.io.projectfile import load

    assert check_project(load(sample)) == []
