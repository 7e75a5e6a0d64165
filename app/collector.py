"""Python's cycle collector kept off the paths a user feels.

A full collection walks every object that has lived long enough. The libraries the
program imports make some 125,000 of them on their own, and walking them took a tenth of
a second a time here (gc.collect() in the window on a 200-tug plan: 90-105 ms). One
fell in the middle of a drag now and then: a move that took 100 ms instead of 8.

Two measures, both about timing only (every object is still freed when nothing refers
to it, as before; the collector only looks for cycles):

- :func:`freeze_at_start`: once the window is up on its first plan, what is alive then
  (libraries, window, panels) is set aside for good (``gc.freeze``). A collection
  after that walks only what was made since. What is set aside and later left in a
  cycle is never freed: at most what the start made, once.
- :class:`CollectorHold`: while a drag previews (press to release), the collector is
  held off altogether. A drag makes almost no cyclic garbage (a 60-move drag with
  live solving on a 200-tug plan left 9 objects for it), so nothing grows meanwhile;
  the release turns it back on and it runs when next due.
"""

from __future__ import annotations

import contextlib
import gc

from core.io.projectfile import collector_paused


def freeze_at_start() -> None:
    """Collect once, then set aside everything alive for the rest of the run."""
    gc.collect()
    gc.freeze()


class CollectorHold:
    """The collector held off from :meth:`hold` until :meth:`let_go` (each idempotent).

    Two holds at once (two windows) are fine: the collector is on again only when the
    hold that turned it off lets go (core.io.projectfile.collector_paused).
    """

    def __init__(self) -> None:
        self._held: contextlib.ExitStack | None = None

    @property
    def holding(self) -> bool:
        return self._held is not None

    def hold(self) -> None:
        if self._held is None:
            stack = contextlib.ExitStack()
            stack.enter_context(collector_paused())
            self._held = stack

    def let_go(self) -> None:
        held, self._held = self._held, None
        if held is not None:
            held.close()
