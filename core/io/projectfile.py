"""Reading and writing ``.towboard`` files.

Loading reports every problem with its field path; a file from a newer format
version is refused. Saving is atomic: the text goes to a temporary file in the same
folder, is flushed and fsynced, and is renamed over the target, after the previous
file has been kept as ``<name>.bak``. Save -> load -> save is byte-identical.
"""

from __future__ import annotations

import contextlib
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
from core.model.plan import Project

SUFFIX = ".towboard"


_PAIR = re.compile(r"\[\s+(-?[0-9][0-9.eE+-]*),\s+(-?[0-9][0-9.eE+-]*)\s+\]")


def dumps(project: Project) -> str:
    """The file text of a project (UTF-8 JSON, two-space indent, final newline).

    Coordinate pairs are kept on one line, ``[x, y]``, so outlines stay readable.
    """
    text = json.dumps(encode(project), indent=2, ensure_ascii=False, allow_nan=False)
    return _PAIR.sub(r"[\1, \2]", text) + "\n"


def loads(text: str, source: str = "<text>") -> Project:
    """A project from file text; raises ProjectFileError listing every problem."""
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
        raw = p.read_bytes()
    except OSError as e:
        raise ProjectFileError(
            str(p), [Problem("", f"cannot be read: {e.strerror or e}")]
        ) from None
    return load_bytes(raw, str(p))


def load_bytes(raw: bytes, source: str = "<bytes>") -> Project:
    """A project from the bytes of a file (UTF-8 JSON); raises ProjectFileError."""
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise ProjectFileError(source, [Problem("", "is not UTF-8 text")]) from None
    return loads(text, source)


@contextlib.contextmanager
def replacing(path: Path) -> Iterator[Path]:
    """A temporary path beside ``path``; once the block has written it, it replaces ``path``.

    The temporary file is fsynced and renamed over ``path`` only if the block ends
    normally, so a crash or an error leaves either the old file or the new one, never
    half of one; on an error the temporary file is removed.
    """
    fd, name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    os.close(fd)
    tmp = Path(name)
    try:
        yield tmp
        with open(tmp, "rb+") as f:
            os.fsync(f.fileno())
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


def write_atomic(path: Path, data: bytes) -> None:
    """Write ``data`` to ``path`` so that a crash leaves either the old or the new file."""
    with replacing(path) as tmp:
        tmp.write_bytes(data)


def backup_path(path: str | os.PathLike[str]) -> Path:
    p = Path(path)
    return p.with_name(p.name + ".bak")


def save(project: Project, path: str | os.PathLike[str]) -> Path:
    """Write ``project`` to ``path`` atomically, keeping the previous file as ``.bak``."""
    p = Path(path)
    data = dumps(project).encode("utf-8")
    try:
        if p.exists():
            old = p.read_bytes()
            if old != data:
                write_atomic(backup_path(p), old)
        write_atomic(p, data)
    except OSError as e:
        raise ProjectFileError(
            str(p), [Problem("", f"cannot be written: {e.strerror or e}")]
        ) from None
    return p
