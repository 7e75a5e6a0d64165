"""Reading and writing ``.towboard`` files.

Loading reports every problem with its field path; a file from a newer format
version is refused. Saving is atomic: the text goes to a temporary file in the same
folder, is flushed and fsynced, and is renamed over the target, after the previous
file has been kept as ``<name>.bak``. A save keeps the old file's permission bits (a new
file gets the user's umask) and writes through a symbolic link to the file it points
to. Save -> load -> save is byte-identical.
"""

from __future__ import annotations

import contextlib
import gc
import json
import os
import re
import tempfile
from collections.abc import Iterator
from pathlib import Path
from typing import Any

from core.errors import FormatVersionError, Problem, ProjectFileError
from core.io.decode import decode
from core.io.encode import encode
from core.io.fileformat import FORMAT_VERSION
from core.io.paths import TooLarge, file_path, read_at_most, shown_path
from core.model.plan import Project

SUFFIX = ".towboard"
#: The largest plan file read, bytes. A plan of 10,000 placed tugs is 16 MB as saved and
#: one of a 100,000-vertex outline 4 MB (benchmarks/growth.py); real plans are well under
#: 1 MB. Anything bigger, or a device that never ends, is refused before it fills memory
#: (reading JSON takes some ten times the text's size).
MAX_FILE_BYTES = 128_000_000


_PAIR = re.compile(r"\[\s+(-?[0-9][0-9.eE+-]*),\s+(-?[0-9][0-9.eE+-]*)\s+\]")


def dumps(project: Project, compact: bool = False) -> str:
    """The file text of a project (UTF-8 JSON, two-space indent, final newline).

    Coordinate pairs are kept on one line, ``[x, y]``, so outlines stay readable.
    ``compact``: all on one line without spaces, for a file only the program reads (the
    recovery file). It is written by json's C encoder, which indented text cannot use: about six
    times faster for a plan of 200 tugs.
    """
    data = encode(project)
    if compact:
        return json.dumps(data, ensure_ascii=False, allow_nan=False, separators=(",", ":")) + "\n"
    text = json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)
    return _PAIR.sub(r"[\1, \2]", text) + "\n"


@contextlib.contextmanager
def collector_paused() -> Iterator[None]:
    """Python's cycle collector held off for the block (if it was on, it is on again after).

    Reading a plan makes tens of thousands of values that all live on (and no cycles to
    free): each collection on the way walks the ones made so far again and frees nothing,
    a fifth of the time a plan of 10,000 tugs takes to load. Held off, the collector
    looks at them once, after the load. Only the block that turned it off turns it on
    again, so that two loads at once never leave it off."""
    was_on = gc.isenabled()
    if was_on:
        gc.disable()
    try:
        yield
    finally:
        if was_on:
            gc.enable()


def loads(text: str, source: str = "<text>") -> Project:
    """A project from file text; raises ProjectFileError listing every problem."""
    with collector_paused():
        return _loads(text, source)


def _loads(text: str, source: str) -> Project:
    try:
        data: Any = json.loads(text)
    except json.JSONDecodeError as e:
        raise ProjectFileError(
            source, [Problem("", f"not valid JSON: {e.msg} at line {e.lineno}, column {e.colno}")]
        ) from None
    except RecursionError:
        raise ProjectFileError(source, [Problem("", "is nested too deeply to be a plan")]) from None
    except ValueError:  # an integer of thousands of digits (Python's own limit)
        raise ProjectFileError(
            source, [Problem("", "holds an integer too long to read (over 4300 digits)")]
        ) from None
    if isinstance(data, dict):
        version = data.get("format_version")
        if isinstance(version, int) and not isinstance(version, bool) and version > FORMAT_VERSION:
            raise FormatVersionError(
                source,
                [
                    Problem(
                        "format_version",
                        f"{version} is newer than this Towboard reads ({FORMAT_VERSION}); update Towboard to open it",
                    )
                ],
            )
        if "format_version" in data and not (
            isinstance(version, int) and not isinstance(version, bool) and version >= 1
        ):
            raise ProjectFileError(
                source, [Problem("format_version", f"{version!r} is not a format version")]
            )
    project, problems = decode(data)
    if project is None:
        raise ProjectFileError(source, problems)
    return project


def load(path: str | os.PathLike[str]) -> Project:
    """Read a ``.towboard`` file."""
    p = Path(path)
    try:
        raw = read_at_most(p, MAX_FILE_BYTES)
    except TooLarge:
        raise ProjectFileError(
            shown_path(p),
            [
                Problem(
                    "",
                    f"is larger than {MAX_FILE_BYTES / 1e6:g} MB, far more than any "
                    "plan holds; not read",
                )
            ],
        ) from None
    except OSError as e:
        raise ProjectFileError(
            shown_path(p), [Problem("", f"cannot be read: {e.strerror or e}")]
        ) from None
    return load_bytes(raw, str(p))


def load_bytes(raw: bytes, source: str = "<bytes>") -> Project:
    """A project from the bytes of a file (UTF-8 JSON); raises ProjectFileError."""
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise ProjectFileError(source, [Problem("", "is not UTF-8 text")]) from None
    return loads(text, source)


def current_umask() -> int:
    """The process's file-creation mask (read without changing it where the OS allows)."""
    with contextlib.suppress(OSError, ValueError):
        for line in Path("/proc/self/status").read_text().splitlines():
            if line.startswith("Umask:"):
                return int(line.split()[1], 8)
    mask = os.umask(0o022)  # elsewhere: set it and put it back at once
    os.umask(mask)
    return mask


def target_of(path: str | os.PathLike[str]) -> Path:
    """The file a save to ``path`` writes: ``path`` itself, or through a symbolic link, the
    file the link points to (so the link stays a link)."""
    p = file_path(path)
    return Path(os.path.realpath(p)) if p.is_symlink() else p


def _mode_for(path: Path) -> int:
    """Permission bits for a new version of ``path``: the old file's, or for a new file what
    the user's umask gives (0666 less the mask), as ``open`` would."""
    try:
        return os.stat(path).st_mode & 0o7777
    except OSError:
        return 0o666 & ~current_umask()


@contextlib.contextmanager
def replacing(path: Path, mode: int | None = None) -> Iterator[Path]:
    """A temporary path beside ``path``; once the block has written it, it replaces ``path``.

    The temporary file is fsynced and renamed over ``path`` only if the block ends
    normally, so a crash or an error leaves either the old file or the new one, never
    half of one; on an error the temporary file is removed. A symbolic link is written
    through to its target. The new file keeps the old file's permission bits (a new file
    gets the user's umask), or ``mode`` when given.
    """
    path = target_of(path)
    bits = _mode_for(path) if mode is None else mode
    fd, name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    os.close(fd)
    tmp = Path(name)
    try:
        yield tmp
        with open(tmp, "rb+") as f:
            os.fsync(f.fileno())
        os.chmod(tmp, bits)
        os.replace(tmp, path)
    except BaseException:
        with contextlib.suppress(OSError):
            tmp.unlink()
        raise
    with contextlib.suppress(OSError):  # make the rename itself durable where the OS allows
        dir_fd = os.open(path.parent, os.O_RDONLY)
        try:
            os.fsync(dir_fd)
        finally:
            os.close(dir_fd)


def write_atomic(path: Path, data: bytes, mode: int | None = None) -> None:
    """Write ``data`` to ``path`` so that a crash leaves either the old or the new file
    (permission bits and symbolic links as :func:`replacing` keeps them)."""
    with replacing(path, mode) as tmp:
        tmp.write_bytes(data)


def backup_path(path: str | os.PathLike[str]) -> Path:
    p = Path(path)
    return p.with_name(p.name + ".bak")


def save(project: Project, path: str | os.PathLike[str]) -> Path:
    """Write ``project`` to ``path`` atomically, keeping the previous file as ``.bak``.

    Saving through a symbolic link writes the file it points to (and its backup beside
    it); the file keeps its permission bits, and so does its backup.
    """
    p = Path(path)
    try:
        data = dumps(project).encode("utf-8")
    except (UnicodeEncodeError, ValueError) as e:  # the rules keep these out; never half a file
        raise ProjectFileError(str(p), [Problem("", f"cannot be written: {e}")]) from None
    try:
        real = target_of(p)
        if real.exists():
            old = real.read_bytes()
            if old != data:
                write_atomic(backup_path(real), old, _mode_for(real))
        write_atomic(real, data)
    except OSError as e:
        raise ProjectFileError(
            shown_path(p), [Problem("", f"cannot be written: {e.strerror or e}")]
        ) from None
    return p
