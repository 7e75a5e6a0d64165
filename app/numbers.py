"""The one number parser of the window: what a person types, to the core's SI value.

Every panel, table and dialog that takes a number reads it here, so every field
accepts the same writing and refuses the same nonsense, and every refusal is phrased
in the display units the user chose:

- :func:`parse_number` reads a plain number: ``12.5``, ``12,5`` (a comma as the
  decimal mark), ``-3``, ``1e3``, ``1 200``, a typographic minus; it refuses words,
  ``nan`` and ``inf``, and a comma before exactly three digits (``2,800``: a thousands
  separator and a decimal comma cannot be told apart; ``2800`` or ``2.8`` is asked for).
- :func:`parse_value` reads a number in the display unit of a core rule
  (:mod:`core.model.rules`), accepts an explicit unit typed after it (``400 kN`` in a
  field shown in t), converts to SI and checks the rule, so ``120`` typed as a setting
  says "setting: 120.0 % must be at most 100 %".
- :func:`parse_optional` is the same for a field that may be left blank (None).
- :func:`message` phrases any core error for the status line in the display units.
"""

from __future__ import annotations

import math
import re

from core.errors import InputError, TowboardError
from core.model.headway import SpeedOrderError
from core.model.rules import Range, RangeError, unit_of
from core.units import CHOICES, FACTORS, LABELS, DisplayUnits

_MINUSES = str.maketrans({"\u2212": "-", "\u2013": "-", "\u00a0": "", "\u202f": "", " ": ""})


#: A comma with exactly three digits after it: ``2,800`` is 2800 to some and 2.8 to others.
_COMMA_THOUSANDS = re.compile(r",\d{3}(?!\d)")


def parse_number(text: str, what: str = "value") -> float:
    """A finite number typed by a person; raises InputError naming ``what``."""
    t = str(text).strip().translate(_MINUSES).replace("_", "")
    if _COMMA_THOUSANDS.search(t):
        if t.count(",") == 1:
            why = f"the comma may mark thousands or decimals): write {t.replace(',', '')} or "
            why += t.replace(",", ".")
        else:
            why = "a comma may mark thousands or decimals): write it without the commas"
        raise InputError(what, text, f"is ambiguous ({why}")
    t = t.replace(",", ".")
    try:
        v = float(t)
    except (ValueError, OverflowError):
        raise InputError(what, text, "is not a number") from None
    if not math.isfinite(v):
        raise InputError(what, text, "is not a finite number")
    return v


def _split_unit(text: str, rule: Range, units: DisplayUnits) -> tuple[str, float, str]:
    """The number part of ``text``, the SI factor of the unit it is in, and that unit.

    A unit typed after the number (any unit offered for the rule's quantity) wins over
    the display unit.
    """
    factor, shown = unit_of(rule.kind, units)
    t = text.strip()
    if rule.kind in CHOICES:
        for sym, f in sorted(FACTORS[rule.kind].items(), key=lambda kv: -len(kv[0])):  # type: ignore[index]
            for written in {sym, LABELS.get(sym, sym)}:
                if t.endswith(written) and t[: -len(written)].strip():
                    return t[: -len(written)].strip(), f, LABELS.get(sym, sym)
    elif shown and t.endswith(shown) and t[: -len(shown)].strip():
        return t[: -len(shown)].strip(), factor, shown
    return t, factor, shown


def parse_value(text: str, rule: Range, units: DisplayUnits, subject: str = "") -> float:
    """The SI value of ``text`` typed in the display unit of ``rule``, checked by it.

    Parameters
    ----------
    text:
        What was typed, e.g. ``"45"``, ``"45,5"``, ``"400 kN"``.
    rule:
        The core rule of the value (:mod:`core.model.rules`); it says the unit and range.
    units:
        The display units the user chose; the number is read in them, and a refusal
        is phrased in them.
    subject:
        What the value belongs to (``"tug Castor"``), for the message.

    Raises
    ------
    InputError
        Not a number, or (a RangeError) outside the rule's range.
    """
    number, factor, _unit = _split_unit(text, rule, units)
    name = f"{subject}: {rule.label}" if subject else rule.label
    v = parse_number(number, name) * factor
    return rule.check(v, subject, units)


def parse_optional(text: str, rule: Range, units: DisplayUnits, subject: str = "") -> float | None:
    """None for a blank field, else :func:`parse_value`."""
    return None if not str(text).strip() else parse_value(text, rule, units, subject)


def message(error: BaseException, units: DisplayUnits) -> str:
    """An error as the status line says it: a rule's refusal in the display units."""
    if isinstance(error, (RangeError, SpeedOrderError)):
        return error.in_units(units)
    if isinstance(error, TowboardError):
        return str(error).splitlines()[0]
    return f"{type(error).__name__}: {error}"


def shown(value_si: float, rule: Range, units: DisplayUnits) -> str:
    """An SI value as a field shows it for editing: the bare number in the display unit."""
    factor, _unit = unit_of(rule.kind, units)
    return f"{value_si / factor:.6g}"
