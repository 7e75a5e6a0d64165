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
