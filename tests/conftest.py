"""Test configuration shared by every test: Qt runs offscreen, paths to the samples."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_projects"


@pytest.fixture
def sample_paths() -> list[Path]:
    return sorted(SAMPLES.glob("*.towboard"))


def sample_stages() -> list[object]:
    """Each stage of each sample as a test parameter ``(path, index)``, its id the
    sample's name and the stage's number ("pontoon_swing-2")."""
    from core.io.projectfile import load

    return [
        pytest.param(path, k, id=f"{path.stem}-{k + 1}")
        for path in sorted(SAMPLES.glob("*.towboard"))
        for k in range(len(load(path).stages))
    ]
