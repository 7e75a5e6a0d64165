"""The move plan: the project value everything else reads.

A :class:`Project` holds the hulls, the lashed groups, the tugs (particulars entered
once), the site and an ordered list of :class:`Stage`. Every value is frozen; an edit
returns a new project, so undo is a swap of two values.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field, replace
from operator import attrgetter
from typing import Literal

from core.errors import InputError
from core.model import rules
from core.model.conditions import Conditions
from core.model.drift import DriftSettings
from core.model.efficiency import EfficiencyTable
from core.model.goals import Goal
from core.model.hull import Hull
from core.model.outlines import Outline, validate_outline
from core.model.swing import Swing
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


def _point(where: str, p: object) -> tuple[float, float]:
    """A site point (x east, y north), each coordinate within its rule."""
    if not (isinstance(p, tuple | list) and len(p) == 2):
        raise InputError(where, p, "must be a point (x, y)")
    return (rules.COORDINATE.check(p[0], where), rules.COORDINATE.check(p[1], where))


_NAME = attrgetter("name")  # a part's name (a map of it over thousands of tugs runs in C)


def _first_repeat(names: Iterable[str]) -> str | None:
    listed = names if isinstance(names, list) else list(names)
    if len(set(listed)) == len(listed):  # at once, for plans of thousands of tugs
        return None
    seen: set[str] = set()
    for n in listed:
        if n in seen:
            return n
        seen.add(n)
    return None


@dataclass(frozen=True, slots=True)
class Revision:
    """One line of the plan's revision history: which revision, when, by whom, and why."""

    revision: str
    date: str = ""
    by: str = ""
    description: str = ""

    def __post_init__(self) -> None:
        rules.NAME.named("revision").check(self.revision, "revision history")
        rules.LABEL.check(self.date, f"revision {self.revision}: date")
        rules.LABEL.check(self.by, f"revision {self.revision}: by")
        rules.NOTES.check(self.description, f"revision {self.revision}: description")


@dataclass(frozen=True, slots=True)
class GroupMember:
    """A hull's pose within its lashed group's frame (the frame of the first member)."""

    hull: str
    x: float = 0.0
    y: float = 0.0
    heading_rad: float = 0.0

    def __post_init__(self) -> None:
        subject = f"group member {self.hull}"
        rules.NAME.check(self.hull, "group member")
        rules.COORDINATE.check(self.x, f"{subject}: x")
        rules.COORDINATE.check(self.y, f"{subject}: y")
        rules.MEMBER_HEADING.check(self.heading_rad, subject)


@dataclass(frozen=True, slots=True)
class LashedGroup:
    """Hulls lashed into one rigid body (for example two barges side by side)."""

    name: str
    members: tuple[GroupMember, ...]

    def __post_init__(self) -> None:
        rules.NAME.check(self.name, "group")
        if len(self.members) < 2:
            raise InputError(
                f"group {self.name}: members", len(self.members), "must be two or more hulls"
            )
        dup = _first_repeat(m.hull for m in self.members)
        if dup is not None:
            raise InputError(f"group {self.name}: member", dup, "is listed twice")


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
        rules.NAME.check(self.name, "site feature")
        if self.kind not in SITE_FEATURE_KINDS:
            raise InputError(
                f"site {self.name}: kind",
                self.kind,
                f"is not one of {', '.join(SITE_FEATURE_KINDS)}",
            )
        if self.closed:
            object.__setattr__(self, "points", validate_outline(self.points, f"site {self.name}"))
        else:
            pts = tuple(_point(f"site {self.name}: point", p) for p in self.points)
            if len(pts) < 2:
                raise InputError(f"site {self.name}: points", len(pts), "must be two or more")
            if len(pts) > rules.MAX_OUTLINE_VERTICES:
                raise InputError(
                    f"site {self.name}: points",
                    len(pts),
                    f"must be at most {rules.MAX_OUTLINE_VERTICES}",
                )
            object.__setattr__(self, "points", pts)


@dataclass(frozen=True, slots=True)
class Site:
    """The basin or fairway: its features, in the site frame (x east, y north, m)."""

    name: str = ""
    features: tuple[SiteFeature, ...] = ()

    def __post_init__(self) -> None:
        rules.LABEL.check(self.name, "site name")


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
        subject = f"pose of {self.body}"
        rules.NAME.check(self.body, "pose")
        rules.COORDINATE.check(self.x, f"{subject}: x")
        rules.COORDINATE.check(self.y, f"{subject}: y")
        rules.HEADING.check(self.heading_deg, subject)


@dataclass(frozen=True, slots=True)
class StageLimits:
    """Go / no-go limits for a stage; None where not set."""

    max_wind_ms: float | None = None
    max_current_ms: float | None = None
    min_clearance_m: float | None = None

    def __post_init__(self) -> None:
        rules.WIND_LIMIT.check_optional(self.max_wind_ms, "limits")
        rules.CURRENT_LIMIT.check_optional(self.max_current_ms, "limits")
        rules.LEAST_CLEARANCE.check_optional(self.min_clearance_m, "limits")


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
    #: The headings a swing starts and ends on, and the bow's side (a swing stage's).
    swing: Swing | None = None

    def __post_init__(self) -> None:
        rules.NAME.check(self.name, "stage")
        rules.NOTES.check(self.notes, f"stage {self.name}")
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
    _lookup: _Index | None = field(default=None, init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        rules.PLAN_NAME.check(self.name)
        for what in ("revision", "date", "prepared_by", "checked_by", "approved_by"):
            rules.LABEL.check(getattr(self, what), f"plan {what.replace('_', ' ')}")
        rules.NOTES.check(self.notes, "plan")
        for label, names in (
            ("hull", [*map(_NAME, self.hulls), *map(_NAME, self.groups)]),
            ("tug", list(map(_NAME, self.tugs))),
            ("stage", list(map(_NAME, self.stages))),
        ):
            dup = _first_repeat(names)
            if dup is not None:
                raise InputError(f"{label} name", dup, "is used twice")
        rules.CLEARANCE_MARGIN.check(self.clearance_margin_m)

    # -- look-ups (by name, through an index built once per project value) -------------
    def _index(self) -> _Index:
        index = self._lookup
        if index is None:
            index = _Index(self)
            object.__setattr__(self, "_lookup", index)
        return index

    def hull(self, name: str) -> Hull:
        h = self._index().hulls.get(name)
        if h is None:
            raise InputError("hull", name, "does not exist")
        return h

    def tug(self, name: str) -> Tug:
        t = self._index().tugs.get(name)
        if t is None:
            raise InputError("tug", name, "does not exist")
        return t

    def stage(self, name: str) -> Stage:
        s = self._index().stages.get(name)
        if s is None:
            raise InputError("stage", name, "does not exist")
        return s

    def group_of(self, hull: str) -> LashedGroup | None:
        return self._index().group_of.get(hull)

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


class _Index:
    """Name look-ups of one project value (built on first use; the value never changes)."""

    __slots__ = ("group_of", "hulls", "stages", "tugs")

    def __init__(self, project: Project) -> None:
        self.hulls = {h.name: h for h in project.hulls}
        self.tugs = {t.name: t for t in project.tugs}
        self.stages = {s.name: s for s in project.stages}
        self.group_of: dict[str, LashedGroup] = {}
        for g in project.groups:
            for m in g.members:
                self.group_of.setdefault(m.hull, g)
