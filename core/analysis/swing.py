"""A swing stage's turn against the yaw moment on a body: does the moment turn the bow the
way the stage swings it?

A swing (core.model.swing) says which way the bow swings; a yaw moment says which way it
turns: positive is counter-clockwise seen from above, the bow to port (CONVENTIONS.md). The
moment judged is the goal's (what Solve pulls will set), else, with no goal, the pulls as
set with the wind and current. The pulls as set are judged too, so a goal turning the right
way that the pulls as set turn the wrong way is caught. A moment within the goal's moment
tolerance turns nothing. The verdict (core.analysis.verdict), the report and the briefing
all read this one result.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

from core.model.goals import GOAL_WORDS, Goal
from core.model.plan import Stage
from core.model.swing import Swing
from core.units import DisplayUnits

Side = Literal["port", "starboard"]


def is_swing_stage(stage: Stage) -> bool:
    """A stage of kind swing, or any stage given a swing's headings."""
    return stage.kind == "swing" or stage.swing is not None


def swing_words(stage: Stage) -> str:
    """A swing stage's swing in words: "swings bow to port 180° from 090.0° to 270.0°"."""
    return "no headings given" if stage.swing is None else stage.swing.words()


def turn_of(moment_nm: float, tolerance_nm: float) -> Side | None:
    """The side a yaw moment turns the bow to; None within the tolerance."""
    if abs(moment_nm) <= tolerance_nm:
        return None
    return "port" if moment_nm > 0 else "starboard"


@dataclass(frozen=True, slots=True)
class SwingSense:
    """One body's yaw moments in a swing stage, against the way the stage swings."""

    body: str
    swing: Swing | None  # the stage's headings and side (None: a swing stage without them)
    goal: Goal | None
    as_set_moment_nm: float  # the pulls as set with the wind and current, about the centroid
    tolerance_nm: float  # a moment within this turns nothing

    @property
    def goal_moment_nm(self) -> float | None:
        return None if self.goal is None else self.goal.target()[2]

    @property
    def goal_turn(self) -> Side | None:
        m = self.goal_moment_nm
        return None if m is None else turn_of(m, self.tolerance_nm)

    @property
    def as_set_turn(self) -> Side | None:
        return turn_of(self.as_set_moment_nm, self.tolerance_nm)

    @property
    def judged(self) -> tuple[str, float, Side | None]:
        """What governs: ("the goal", its moment, its turn), or with no goal the pulls as set."""
        if self.goal is not None:
            m = self.goal.target()[2]
            return "the goal", m, turn_of(m, self.tolerance_nm)
        return "the pulls as set", self.as_set_moment_nm, self.as_set_turn

    def _against(self, turn: Side | None) -> bool:
        return self.swing is not None and turn is not None and turn != self.swing.bow_to

    @property
    def goal_against(self) -> bool:
        """The goal's moment turns the bow the other way from the swing."""
        return self.goal is not None and self._against(self.goal_turn)

    @property
    def as_set_against(self) -> bool:
        """The pulls as set turn the bow the other way from the swing."""
        return self._against(self.as_set_turn)

    @property
    def against(self) -> bool:
        return self.goal_against or self.as_set_against

    @property
    def no_turn(self) -> bool:
        """What governs (the goal, else the pulls as set) gives no yaw moment to speak of."""
        return self.judged[2] is None

    def stage_words(self) -> str:
        """ "the stage swings bow to starboard (090.0° to 270.0°)", or a swing stage
        without headings."""
        if self.swing is None:
            return "a swing stage (no headings given)"
        return f"the stage swings bow to {self.swing.bow_to} ({self.swing.span_words()})"

    def turn_words(self, who: str, moment_nm: float, u: DisplayUnits) -> str:
        """ "the goal turns the bow to port (100 t·m about the centroid)"."""
        turn = turn_of(moment_nm, self.tolerance_nm)
        if turn is None:
            what = (
                f"asks for no yaw moment ({GOAL_WORDS[self.goal.kind].split(':')[0]})"
                if who == "the goal" and self.goal is not None
                else "give no yaw moment to speak of"
            )
            return f"{who} {what}"
        verb = "turns" if who == "the goal" else "turn"
        return (
            f"{who} {verb} the bow to {turn} ({u.show(abs(moment_nm), 'moment')} about "
            "the centroid)"
        )

    def words(self, u: DisplayUnits) -> str:
        """The sense in one sentence, for the report and the briefing."""
        who, m, turn = self.judged
        if self.goal_against or (self.goal is None and self.as_set_against):
            tie = "AGAINST the swing"
        elif turn is None:
            tie = "no turn to swing her"
        elif self.swing is None:
            tie = "no headings to check it against"
        else:
            tie = "with the swing"
        out = f"{self.body}: {self.turn_words(who, m, u)}: {tie}"
        if self.goal is not None and self.as_set_against and not self.goal_against:
            out += "; " + self.turn_words("the pulls as set", self.as_set_moment_nm, u)
            out += ": AGAINST the swing"
        return out


def swing_sense(
    stage: Stage, body: str, goal: Goal | None, as_set_moment_nm: float, tolerance_nm: float
) -> SwingSense | None:
    """The sense of ``body``'s moments in ``stage`` (None unless it is a swing stage)."""
    if not is_swing_stage(stage):
        return None
    return SwingSense(body, stage.swing, goal, as_set_moment_nm, tolerance_nm)
