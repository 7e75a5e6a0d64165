"""A list of the file's entries read a column at a time: the plain case of thousands of tugs.

core.io.plain reads one tug or one placement at once; a plan of thousands of them is read
faster a field at a time across the whole list (one key of every entry, its types and its
range tested together in C loops: ``map``, ``min``, ``max``, ``sum``), then built in one
pass. Each helper here gives None as soon as a column is not plain throughout (a missing
key, a value of another type, a number outside its rule, a NaN): the list is then read an
entry at a time, and an entry that is not plain is read by the careful reader, which says
what is wrong with it. The numbers taken are those the entry readers take: a float, or an
int within 1e300 (not a bool), whose SI value ``v * factor`` lies within the rule's limits.
"""

from __future__ import annotations

from itertools import repeat
from operator import itemgetter
from typing import Any

from core.io.fileformat import FILE_UNITS
from core.model import rules

_NONE = type(None)
_NUMBER_TYPES = frozenset((float, int))
_REQUIRED: Any = object()


def file_bounds(rule: rules.Range) -> tuple[float, float, float]:
    """The SI value of one file unit of ``rule``'s kind, and the least and the greatest SI
    value that keep ``rule``: a number ``v`` of the file keeps it when
    ``lo <= v * factor <= hi`` (a float, or an int within 1e300 so that the product is
    one; not a bool)."""
    return (rules.unit_of(rule.kind, FILE_UNITS)[0], *rule.limits())


def keys(entries: list[Any]) -> set[str] | None:
    """The keys found in any of ``entries`` if each is a JSON object, else None."""
    if not set(map(type, entries)) <= {dict}:
        return None
    return set().union(*entries)


def column(entries: list[dict[str, Any]], key: str, default: Any = _REQUIRED) -> list[Any] | None:
    """The value at ``key`` of each entry (``default`` where it has none); None if the key
    is required (no default given) and an entry lacks it."""
    if default is _REQUIRED:
        try:
            return list(map(itemgetter(key), entries))
        except KeyError:
            return None
    return list(map(dict.get, entries, repeat(key), repeat(default)))


def all_of_type(values: list[Any], kind: type) -> bool:
    """Whether each of ``values`` is exactly a ``kind`` (a bool is no int, a str subclass
    no str)."""
    return set(map(type, values)) <= {kind}


def texts(values: list[Any], rule: rules.Text) -> bool:
    """Whether each of ``values`` is a text that keeps ``rule``."""
    return all_of_type(values, str) and rule.keeps_all(values)


def numbers(raw: list[Any], rule: rules.Range, nullable: bool = False) -> list[Any] | None:
    """The SI values of a column of the file's numbers in the file's unit for ``rule``
    (None for a null when ``nullable``), or None unless every one is taken."""
    if not raw:
        return []
    factor, lo, hi = file_bounds(rule)
    types = set(map(type, raw))
    values = raw
    if nullable and _NONE in types:
        types.discard(_NONE)
        values = [v for v in raw if v is not None]
        if not values:
            return raw
    if not types <= _NUMBER_TYPES:
        return None
    # Multiplying by a positive factor keeps the order (rounding is monotone), so the least
    # and the greatest SI values are those of the least and the greatest numbers; min and
    # max pass over a NaN that is not first (one first makes both NaN and fails the test),
    # and the sum of any list holding a NaN is NaN.
    least, most = min(values), max(values)
    if int in types and not (least > -1e300 and most < 1e300):
        return None  # an int beyond 1e300 makes no float
    if not (lo <= least * factor and most * factor <= hi):
        return None
    if float in types:
        total = sum(values)
        if total != total:
            return None
    if factor != 1.0:
        si = [v * factor for v in values]
    elif int in types:
        si = list(map(float, values))  # v * 1.0, as an entry reader gives it
    else:
        si = values
    if values is raw:
        return si
    taken = iter(si)
    return [None if v is None else next(taken) for v in raw]
