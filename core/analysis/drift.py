"""The drift preview of a stage, worked out once from the stage's result and kept with it.

:func:`drift_of` takes a stage result's main body and its tugs as arrays (the same
layout the balance, the solve and the tug lost check read) and works out the drift with
every line let go and with each tug lost in turn (the others as set), keeping the worst:
the soonest contact, else the furthest drift. It is remembered per project value like
the stage result, and read as ``stage_result(project, i).drift``, so the board, the
report, the briefing and the command line read one computation.
"""

from __future__ import annotations

from collections import OrderedDict
from typing import TYPE_CHECKING

from core.errors import TowboardError
from core.model.plan import Project
from core.motion.scenarios import drift_setup
from core.motion.summary import StageDrift, summarise

if TYPE_CHECKING:
    from core.analysis.stage import StageResult

_CACHE: OrderedDict[tuple[int, int], tuple[Project, StageDrift]] = OrderedDict()
_CACHE_SIZE = 64


def compute_drift(result: StageResult) -> StageDrift:
    """Work the drift preview of a stage out from scratch."""
    stage, index, main = result.stage, result.index, result.main
    if main is None:
        return StageDrift(index, stage.name, None, reason="no hull to drift")
    try:
        setup = drift_setup(result.project, stage, main.name, layout=main.layout)
        return summarise(setup, index, stage.name)
    except TowboardError as e:
        return StageDrift(index, stage.name, main.name, reason=f"drift not worked out: {e}")


def drift_of(result: StageResult) -> StageDrift:
    """The drift preview of ``result``'s stage, worked out once per project value."""
    key = (id(result.project), result.index)
    hit = _CACHE.get(key)
    if hit is not None and hit[0] is result.project:
        _CACHE.move_to_end(key)
        return hit[1]
    drift = compute_drift(result)
    _CACHE[key] = (result.project, drift)
    while len(_CACHE) > _CACHE_SIZE:
        _CACHE.popitem(last=False)
    return drift
