"""File names as the project's readers and writers take them."""

from __future__ import annotations

import errno
import os
import stat
from pathlib import Path

#: Bytes read at a time from a file of unknown size (a device, a pipe).
_CHUNK = 1 << 20


class TooLarge(OSError):
    """A file holds more bytes than its reader takes."""


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


def read_at_most(path: str | os.PathLike[str], limit: int) -> bytes:
    """The bytes of the file at ``path``, or :class:`TooLarge` once it proves to hold more
    than ``limit`` bytes.

    A regular file is refused by its size before it is read; anything else (a device such
    as /dev/zero, a FIFO) is read a chunk at a time and refused as soon as it passes the
    limit, so no file is ever read without bound. Other failures are the OSError the
    system gives.
    """
    with open(file_path(path), "rb") as f:
        st = os.fstat(f.fileno())
        if stat.S_ISREG(st.st_mode) and st.st_size > limit:
            raise TooLarge(errno.EFBIG, "too large", str(path))
        chunks: list[bytes] = []
        got = 0
        while True:
            chunk = f.read(min(_CHUNK, limit + 1 - got))
            if not chunk:
                return b"".join(chunks)
            chunks.append(chunk)
            got += len(chunk)
            if got > limit:
                raise TooLarge(errno.EFBIG, "too large", str(path))
