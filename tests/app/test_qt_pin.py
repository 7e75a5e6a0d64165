"""The PySide6 pin: the installed Qt build survives many event-loop calls.

PySide6-Essentials 6.12.0 on CPython 3.11 aborts the interpreter ("none_dealloc:
deallocating None", exit 134) after a few thousand calls such as processEvents() or
repaint() (measured on this project's machines). pyproject.toml pins a safe build per
Python with an environment marker; if that pin goes wrong this test fails.
"""

from __future__ import annotations

import subprocess
import sys
import textwrap

SCRIPT = textwrap.dedent(
    """
    import os
    os.environ["QT_QPA_PLATFORM"] = "offscreen"
    from PySide6.QtWidgets import QApplication, QLabel
    app = QApplication([])
    w = QLabel("pin check")
    w.show()
    for i in range(10_000):
        app.processEvents()
    for i in range(2_000):
        w.setText(str(i))
        w.repaint()
    print("survived")
    """
)


def test_ten_thousand_process_events_calls_exit_cleanly() -> None:
    done = subprocess.run(
        [sys.executable, "-c", SCRIPT], capture_output=True, text=True, timeout=300
    )
    assert done.returncode == 0, f"exit {done.returncode}: {done.stderr[-2000:]}"
    assert done.stdout.strip() == "survived"
