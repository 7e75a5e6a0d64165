"""Nothing lost to a crash: the open project is written to a recovery file shortly after
each change, atomically (core.io.projectfile.write_atomic), and the next start offers it.

A burst of edits is written once it pauses (``DELAY_MS``), and never later than
``DEADLINE_MS`` after its first edit however long it goes on, so a kill loses at most the
last second of work. Each running window holds a lock file beside its recovery file; a
recovery file whose lock is not held by a live process was left by a crash or a kill, and
a lock left by a killed window is cleared. Recovery files are private to the user (mode
0600). The folder is ``$TOWBOARD_RECOVERY_DIR`` if set, else ``<app data>/recovery``.
"""

from __future__ import annotations

import contextlib
import json
import os
import time
from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QLockFile, QObject, QStandardPaths, Qt, QTimer

from app.controller import Controller
from app.guard import guarded
from core.io.projectfile import dumps, loads, write_atomic
from core.model.plan import Project

#: Delay after the last change before the recovery file is written, ms.
DELAY_MS = 300
#: The longest an unsaved change waits for its recovery write, ms, however busy the user
#: is (a write takes a few ms; the event loop may be late by as much again).
DEADLINE_MS = 500
#: Recovery files hold the user's work: readable by the user alone.
PRIVATE = 0o600


def recovery_dir() -> Path:
    env = os.environ.get("TOWBOARD_RECOVERY_DIR")
    if env:
        return Path(env)
    base = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)
    return Path(base or Path.home() / ".towboard") / "recovery"


@dataclass(frozen=True, slots=True)
class Orphan:
    """A recovery file left behind: the project text and the file it came from."""

    path: Path
    source: str | None
    written: float

    def project(self) -> Project:
        return loads(self.path.read_text(encoding="utf-8"), str(self.path))

    def discard(self) -> None:
        for p in (self.path, self.path.with_suffix(".json"), self.path.with_suffix(".lock")):
            with contextlib.suppress(OSError):
                p.unlink()


def _held(lock_path: Path) -> bool:
    """Whether a live Towboard holds this lock; a stale lock (its window was killed) is
    cleared on the way."""
    lock = QLockFile(str(lock_path))
    lock.setStaleLockTime(0)
    if not lock.tryLock(0):
        return True
    lock.unlock()  # removes the lock file
    return False


def clear_stale(folder: Path) -> None:
    """Remove what killed windows left with nothing to recover: stale locks and the notes
    of recovery files that are gone."""
    for lock_path in folder.glob("*.lock"):
        if not lock_path.with_suffix(".towboard").exists():
            _held(lock_path)
    for meta in folder.glob("*.json"):
        if not meta.with_suffix(".towboard").exists() and not _held(meta.with_suffix(".lock")):
            with contextlib.suppress(OSError):
                meta.unlink()


def find_orphans(folder: Path | None = None) -> list[Orphan]:
    """Recovery files no live Towboard holds, newest first (stale locks are cleared)."""
    folder = folder or recovery_dir()
    out: list[Orphan] = []
    if not folder.is_dir():
        return out
    clear_stale(folder)
    for path in folder.glob("*.towboard"):
        lock = QLockFile(str(path.with_suffix(".lock")))
        lock.setStaleLockTime(0)
        if not lock.tryLock(0):
            continue  # a running window owns it
        lock.unlock()
        meta: dict[str, object] = {}
        with contextlib.suppress(OSError, ValueError):
            meta = json.loads(path.with_suffix(".json").read_text(encoding="utf-8"))
        source = meta.get("source")
        out.append(Orphan(path, source if isinstance(source, str) else None, path.stat().st_mtime))
    return sorted(out, key=lambda o: o.written, reverse=True)


class RecoveryWriter(QObject):
    """Writes the controller's project to this session's recovery file after each change."""

    def __init__(self, controller: Controller, folder: Path | None = None) -> None:
        super().__init__(controller)
        self.controller = controller
        self.folder = folder or recovery_dir()
        self.folder.mkdir(parents=True, exist_ok=True)
        name = f"session-{os.getpid()}-{int(time.time() * 1000)}"
        self.path = self.folder / f"{name}.towboard"
        self._lock = QLockFile(str(self.path.with_suffix(".lock")))
        self._lock.setStaleLockTime(0)
        self._lock.tryLock(0)
        self._timer = QTimer(self)  # restarted by every change: the burst has paused
        self._timer.setSingleShot(True)
        self._timer.setInterval(DELAY_MS)
        self._timer.timeout.connect(self.write_now)
        self._deadline = QTimer(self)  # started by a burst's first change, never restarted
        self._deadline.setSingleShot(True)
        self._deadline.setTimerType(Qt.TimerType.PreciseTimer)
        self._deadline.setInterval(DEADLINE_MS)
        self._deadline.timeout.connect(self.write_now)
        controller.changed.connect(self._changed)
        controller.dirty_changed.connect(self._changed)
        self.writes = 0
        self.failed = False

    @guarded
    def _changed(self, *_: object) -> None:
        if self.controller.previewing:
            return  # a drag in progress: wait for its release
        self._timer.start()
        if not self._deadline.isActive():
            self._deadline.start()

    @guarded
    def write_now(self) -> None:
        """Write (or, when nothing is unsaved, remove) the recovery file now."""
        self._timer.stop()
        self._deadline.stop()
        if not self.controller.dirty:
            self._remove_files()
            return
        source = self.controller.path
        meta = json.dumps(
            {"source": None if source is None else str(source), "written": time.time()}
        )
        try:
            text = dumps(self.controller.project, compact=True).encode("utf-8")
            write_atomic(self.path.with_suffix(".json"), meta.encode("utf-8"), PRIVATE)
            write_atomic(self.path, text, PRIVATE)
        except (OSError, ValueError) as e:  # a full disk must not stop the editing
            if not self.failed:
                self.controller.message.emit(f"Recovery file not written: {e}")
            self.failed = True
            return
        self.failed = False
        self.writes += 1

    def _remove_files(self) -> None:
        for p in (self.path, self.path.with_suffix(".json")):
            with contextlib.suppress(OSError):
                p.unlink()

    def close(self) -> None:
        """A clean end of the session: nothing to recover."""
        self._timer.stop()
        self._deadline.stop()
        self._remove_files()
        self._lock.unlock()
