"""The move plan: the project value everything else reads.

A :class:`Project` holds the hulls, the lashed groups, the tugs (particulars entered
once), the site and an ordered list of :class:`Stage`. Every value is frozen; an edit
returns a new project, so undo is a swap of two values.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Literal

from core.errors import InputError
from core.model.conditions import Conditions
from core.model.drift import DriftSettings
from core.model.efficiency import EfficiencyTable
from core.model.goals import Goal
from core.model.hull import Hull
from core.model.outlines import Outline, validate_outline
from core.model.tugs import Placement, Tug
from core.units import DisplayUnits

#: The plan's title block: what the plan details dialog edits and the briefing's cover shows.
TITLE_BLOCK_FIELDS = (
    "name",
    "revision",
    "date",
    "prepared_by",
    "checked_by",
    "approved_by",
    "notes",
    "history",
)
STAGE_KINDS = ("unberth", "hold", "swing", "transit", "berth", "other")
SiteFeatureKind = Literal["quay", "dolphin", "vessel", "limit"]
SITE_FEATURE_KINDS: tuple[SiteFeatureKind, ...] = ("quay", "dolphin", "vessel", "limit")


def _finite(field_name: str, *values: float) -> None:
    for v in values:
        if not math.isfinite(v):
            raise InputError(field_name, v, "must be finite")


@dataclass(frozen=True, slots=True)
class Revision:
    """One line of the plan's revision history: which revision, when, by whom, and why."""

    revision: str
    date: str = ""
    by: str = ""
    description: str = ""

    def __post_init__(self) -> None:
        if not self.revision.strip():
            raise InputError("revision history: revision", self.revision, "must not be empty")


@dataclass(frozen=True, slots=True)
class GroupMember:
    """A hull's pose within its lashed group's frame (the frame of the first member)."""

    hull: str
    x: float = 0.0
    y: float = 0.0
    heading_rad: float = 0.0

    def __post_init__(self) -> None:
        _finite(f"group member {self.hull}: pose", self.x, self.y, self.heading_rad)


@dataclass(frozen=True, slots=True)
class LashedGroup:
    """Hulls lashed into one rigid body (for example two barges side by side)."""

    name: str
    members: tuple[GroupMember, ...]

    def __post_init__(self) -> None:
        if len(self.members) < 2:
            raise InputError(
                f"group {self.name}: members", len(self.members), "must be two or more hulls"
            )


@dataclass(frozen=True, slots=True)
class SiteFeature:
    """A quay line, dolphin, moored vessel or basin limit, in the site frame (x east, y north).

    ``closed`` features are polygons (dolphins, vessels); open ones are polylines
    (a quay face, the edge of a fairway).
    """

    name: str
    kind: SiteFeatureKind
    points: Outline
    closed: bool = False

    def __post_init__(self) -> None:
        if self.kind not in SITE_FEATURE_KINDS:
            raise InputError(
                f"site {self.name}: kind",
                self.kind,
                f"is not one of {', '.join(SITE_FEATURE_KINDS)}",
            )
        if self.closed:
            object.__setattr__(self, "points", validate_outline(self.points, f"site {self.name}"))
        else:
            pts = tuple((float(x), float(y)) for x, y in self.points)
            if len(pts) < 2:
                raise InputError(f"site {self.name}: points", len(pts), "must be two or more")
            for x, y in pts:
                _finite(f"site {self.name}: point", x, y)
            object.__setattr__(self, "points", pts)


@dataclass(frozen=True, slots=True)
class Site:
    """The basin or fairway: its features, in the site frame (x east, y north, m)."""

    name: str = ""
    features: tuple[SiteFeature, ...] = ()


@dataclass(frozen=True, slots=True)
class BodyPose:
    """Where a body (a hull, or a lashed group) lies in the site during a stage.

    (x, y) is the site position of the body frame's origin, m; ``heading_deg`` is the
    true heading of its +x axis (bow), degrees clockwise from north.
    """

    body: str
    x: float = 0.0
    y: float = 0.0
    heading_deg: float = 0.0

    def __post_init__(self) -> None:
        _finite(f"pose of {self.body}", self.x, self.y, self.heading_deg)


@dataclass(frozen=True, slots=True)
class StageLimits:
    """Go / no-go limits for a stage; None where not set."""

    max_wind_ms: float | None = None
    max_current_ms: float | None = None
    min_clearance_m: float | None = None

    def __post_init__(self) -> None:
        for name in ("max_wind_ms", "max_current_ms", "min_clearance_m"):
            v = getattr(self, name)
            if v is not None and not (math.isfinite(v) and v >= 0):
                raise InputError(f"limits {name}", v, "must be zero or positive")


@dataclass(frozen=True, slots=True)
class Stage:
    """One step of the move: where the bodies lie, where the tugs work and how hard."""

    name: str
    kind: str = "other"
    notes: str = ""
    poses: tuple[BodyPose, ...] = ()
    placements: tuple[Placement, ...] = ()
    conditions: Conditions = field(default_factory=Conditions)
    goal: Goal | None = None
    limits: StageLimits = field(default_factory=StageLimits)

    def __post_init__(self) -> None:
        if not self.name.strip():
            raise InputError("stage name", self.name, "must not be empty")
        if self.kind not in STAGE_KINDS:
            raise InputError(
                f"stage {self.name}: kind", self.kind, f"is not one of {', '.join(STAGE_KINDS)}"
            )

    def placement(self, tug: str) -> Placement:
        for p in self.placements:
            if p.tug == tug:
                return p
        raise InputError(f"stage {self.name}: tug", tug, "is not placed in this stage")

    def with_placement(self, placement: Placement) -> Stage:
        """Add a placement, or replace the one of the same tug."""
        if any(p.tug == placement.tug for p in self.placements):
            new = tuple(placement if p.tug == placement.tug else p for p in self.placements)
        else:
            new = (*self.placements, placement)
        return replace(self, placements=new)

    def without_placement(self, tug: str) -> Stage:
        return replace(self, placements=tuple(p for p in self.placements if p.tug != tug))

    def pose_of(self, body: str) -> BodyPose:
        """The body's pose; a body with no pose lies at the origin bow east (heading 090),
        as the board draws it, so the conditions meet it as drawn."""
        for p in self.poses:
            if p.body == body:
                return p
        return BodyPose(body, 0.0, 0.0, 90.0)


@dataclass(frozen=True, slots=True)
class Project:
    """A whole move plan (the content of one ``.towboard`` file)."""

    name: str = "Untitled plan"
    revision: str = "A"
    date: str = ""
    prepared_by: str = ""
    checked_by: str = ""
    approved_by: str = ""
    notes: str = ""
    history: tuple[Revision, ...] = ()
    units: DisplayUnits = field(default_factory=DisplayUnits)
    hulls: tuple[Hull, ...] = ()
    groups: tuple[LashedGroup, ...] = ()
    tugs: tuple[Tug, ...] = ()
    site: Site = field(default_factory=Site)
    stages: tuple[Stage, ...] = ()
    clearance_margin_m: float = 10.0
    tug_efficiency: EfficiencyTable = field(default_factory=EfficiencyTable)
    drift: DriftSettings = field(default_factory=DriftSettings)

    def __post_init__(self) -> None:
        if not self.name.strip():
            raise InputError("plan name", self.name, "must not be empty")
        for label, names in (
            ("hull", [h.name for h in self.hulls] + [g.name for g in self.groups]),
            ("tug", [t.name for t in self.tugs]),
            ("stage", [s.name for s in self.stages]),
        ):
            dup = next((n for n in names if names.count(n) > 1), None)
            if dup is not None:
                raise InputError(f"{label} name", dup, "is used twice")
        if not (math.isfinite(self.clearance_margin_m) and self.clearance_margin_m >= 0):
            raise InputError(
                "clearance margin", self.clearance_margin_m, "must be zero or positive"
            )

    # -- look-ups ---------------------------------------------------------------------
    def hull(self, name: str) -> Hull:
        for h in self.hulls:
            if h.name == name:
                return h
        raise InputError("hull", name, "does not exist")

    def tug(self, name: str) -> Tug:
        for t in self.tugs:
            if t.name == name:
                return t
        raise InputError("tug", name, "does not exist")

    def stage(self, name: str) -> Stage:
        for s in self.stages:
            if s.name == name:
                return s
        raise InputError("stage", name, "does not exist")

    def group_of(self, hull: str) -> LashedGroup | None:
        for g in self.groups:
            if any(m.hull == hull for m in g.members):
                return g
        return None

    def body_names(self) -> tuple[str, ...]:
        """Every rigid body: each lashed group, and each hull in no group."""
        grouped = {m.hull for g in self.groups for m in g.members}
        return tuple(g.name for g in self.groups) + tuple(
            h.name for h in self.hulls if h.name not in grouped
        )

    # -- edits ------------------------------------------------------------------------
    def with_hull(self, hull: Hull, old_name: str | None = None) -> Project:
        """Replace the hull called ``old_name`` (default: ``hull.name``), or add it."""
        key = hull.name if old_name is None else old_name
        if any(h.name == key for h in self.hulls):
            return replace(self, hulls=tuple(hull if h.name == key else h for h in self.hulls))
        return replace(self, hulls=(*self.hulls, hull))

    def with_tug(self, tug: Tug, old_name: str | None = None) -> Project:
        """Replace the tug called ``old_name`` (default: ``tug.name``), or add it.

        A renamed tug keeps its placements in every stage.
        """
        key = tug.name if old_name is None else old_name
        if not any(t.name == key for t in self.tugs):
            return replace(self, tugs=(*self.tugs, tug))
        tugs = tuple(tug if t.name == key else t for t in self.tugs)
        stages = self.stages
        if key != tug.name:
            stages = tuple(
                replace(
                    s,
                    placements=tuple(
                        replace(p, tug=tug.name) if p.tug == key else p for p in s.placements
                    ),
                )
                for s in self.stages
            )
        return replace(self, tugs=tugs, stages=stages)

    def without_tug(self, name: str) -> Project:
        return replace(
            self,
            tugs=tuple(t for t in self.tugs if t.name != name),
            stages=tuple(s.without_placement(name) for s in self.stages),
        )

    def with_stage(self, stage: Stage, index: int) -> Project:
        """Replace the stage at ``index``."""
        stages = list(self.stages)
        stages[index] = stage
        return replace(self, stages=tuple(stages))

    def with_stages(self, stages: tuple[Stage, ...]) -> Project:
        return replace(self, stages=stages)

    def with_units(self, units: DisplayUnits) -> Project:
        return replace(self, units=units)

    def with_title_block(self, **fields: object) -> Project:
        """The project with title-block fields replaced (name, revision, date, prepared_by,
        checked_by, approved_by, notes, history); any other field is refused."""
        unknown = sorted(set(fields) - set(TITLE_BLOCK_FIELDS))
        if unknown:
            raise InputError("title block field", unknown[0], "is not part of the title block")
        return replace(self, **fields)  # type: ignore[arg-type]
