"""The shape of the program: core never imports Qt or the app, and runs without Qt."""

from __future__ import annotations

import shutil
import subprocess
import sys
import textwrap
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def test_import_linter_contract_holds() -> None:
    exe = shutil.which("lint-imports") or str(Path(sys.executable).with_name("lint-imports"))
    done = subprocess.run(
        [exe, "--config", str(ROOT / "pyproject.toml")], cwd=ROOT, capture_output=True, text=True
    )
    assert done.returncode == 0, done.stdout + done.stderr
    assert "0 broken" in done.stdout


def test_core_tests_pass_with_qt_absent() -> None:
    # PySide6 made unimportable, pytest-qt left out: the core and its tests stand alone.
    script = textwrap.dedent(
        """
        import sys
        for name in ("PySide6", "shiboken6"):
            sys.modules[name] = None
        import pytest
        sys.exit(pytest.main(["-q", "-p", "no:pytest-qt", "-p", "no:cacheprovider",
                              "-o", "addopts=", "-W", "ignore::pytest.PytestConfigWarning", "tests/core"]))
        """
    )
    done = subprocess.run(
        [sys.executable, "-c", script], cwd=ROOT, capture_output=True, text=True, timeout=600
    )
    assert done.returncode == 0, done.stdout[-3000:] + done.stderr[-2000:]
    assert " passed" in done.stdout


def test_only_the_plain_file_reader_builds_values_from_checked_fields() -> None:
    # core.model.checked builds tugs and placements without checking their fields again:
    # only the file reader's plain path, which has checked each by its rule, may use it.
    from tests.test_import_cycles import import_graph

    users = sorted(m for m, wanted in import_graph().items() if "core.model.checked" in wanted)
    assert users == ["core.io.plain"]
