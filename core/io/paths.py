"""File names as the project's readers and writers take them."""

from __future__ import annotations

import errno
import os
import stat
from pathlib import Path

from core.errors import DrawingError

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


def same_file(a: str | os.PathLike[str], b: str | os.PathLike[str]) -> bool:
    """Whether ``a`` and ``b`` name one file, by name or through a link; False when either
    is missing or is a name no file can have."""
    try:
        return os.path.samefile(a, b)
    except (OSError, ValueError):
        return False


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


#: The most a drawing (DXF) or a table of offsets or points is read to: far more than any
#: hull's or site's drawing holds, and well short of what would exhaust the machine.
MAX_SOURCE_BYTES = 128_000_000


#: The most characters of a table's row a message quotes.
SHOWN_ROW_CHARS = 60


def shown_row(text: str) -> str:
    """A table's row as a message quotes it: in quotes, cut short after
    :data:`SHOWN_ROW_CHARS` characters (a row may run to megabytes)."""
    if len(text) <= SHOWN_ROW_CHARS:
        return repr(text)
    return f"{text[:SHOWN_ROW_CHARS]!r}... ({len(text)} characters)"


def read_source(path: str | os.PathLike[str], limit: int | None = None) -> bytes:
    """The bytes of a drawing or table to import, read to at most ``limit`` bytes
    (default :data:`MAX_SOURCE_BYTES`).

    Raises DrawingError naming the file: it cannot be read, or it is larger than any
    drawing (a device such as /dev/zero is refused once it passes the limit).
    """
    name = Path(shown_path(path)).name
    limit = MAX_SOURCE_BYTES if limit is None else limit
    try:
        return read_at_most(path, limit)
    except TooLarge:
        raise DrawingError(
            name, f"is larger than {limit / 1e6:g} MB, far more than any drawing holds; not read"
        ) from None
    except OSError as e:
        raise DrawingError(name, f"cannot be read: {e.strerror or e}") from None


def read_table(path: str | os.PathLike[str], limit: int | None = None) -> str:
    """The text of a table (CSV) of offsets or points: UTF-8, a byte order mark dropped.

    Raises DrawingError naming the file, as :func:`read_source` does, or when the file
    is not UTF-8 text.
    """
    raw = read_source(path, limit)
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as e:
        raise DrawingError(
            Path(shown_path(path)).name,
            f"is not UTF-8 text (byte {e.start + 1} cannot be read); save it as UTF-8 CSV",
        ) from None
