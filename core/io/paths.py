"""File names as the project's readers and writers take them."""

from __future__ import annotations

import errno
import os
from pathlib import Path


def file_path(path: str | os.PathLike[str]) -> Path:
    """``path`` as a Path; an OSError (as the system gives for a bad name) for a name with a
    NUL character, which no file system holds and Python refuses with a ValueError."""
    p = Path(path)
    if "\x00" in str(p):
        raise OSError(errno.EINVAL, "a file name cannot hold a NUL character", str(p))
    return p


def shown_path(path: str | os.PathLike[str]) -> str:
    """A path as a message shows it: a NUL character as \\0, never as itself."""
    return str(path).replace("\x00", "\\0")
