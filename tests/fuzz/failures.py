"""The fuzz benchmarks' book of failures: each distinct one kept once, with its input."""

from __future__ import annotations

import collections
import traceback
from pathlib import Path


def record_failure(
    e: Exception,
    data: bytes,
    failures: collections.Counter[str],
    out_dir: Path,
    suffix: str,
    case: str,
) -> None:
    """Count ``e`` in ``failures`` by its kind, place and message; the first time one is
    seen, keep ``data`` in ``out_dir`` as ``failure-N<suffix>`` and print where it is."""
    where = traceback.extract_tb(e.__traceback__)[-1]
    key = f"{type(e).__name__} at {Path(where.filename).name}:{where.lineno}: {e}"[:200]
    if key not in failures:
        bad = out_dir / f"failure-{len(failures) + 1}{suffix}"
        bad.write_bytes(data)
        print(f"{case}: {key}\n  file: {bad}", flush=True)
    failures[key] += 1
