"""The window's one number parser: what it reads, and what it refuses rather than guess."""

from __future__ import annotations

import pytest

from app.numbers import parse_number, parse_value
from core.errors import InputError
from core.model import rules
from core.model.rules import DEFAULT_UNITS


@pytest.mark.parametrize(
    ("typed", "value"),
    [
        ("12.5", 12.5),
        ("12,5", 12.5),  # a decimal comma
        ("1,5", 1.5),
        ("2,80", 2.8),  # two digits after the comma: a decimal comma, never thousands
        ("1,2345", 1.2345),  # four: the same
        ("1 200", 1200.0),  # a space between thousands
        ("\u22123", -3.0),  # a typographic minus
        ("1e3", 1000.0),
    ],
)
def test_numbers_read_as_written(typed: str, value: float) -> None:
    assert parse_number(typed) == value


@pytest.mark.parametrize(
    ("typed", "ways"),
    [
        ("2,800", "write 2800 or 2.800"),
        ("-1,500", "write -1500 or -1.500"),
        ("0,125", "write 0125 or 0.125"),
        ("1,234,567", "write it without the commas"),
    ],
)
def test_a_comma_before_exactly_three_digits_is_refused(typed: str, ways: str) -> None:
    # 2,800 is 2800 where the comma separates thousands and 2.8 where it marks decimals
    with pytest.raises(InputError) as e:
        parse_number(typed, "displacement")
    assert str(e.value) == (
        f"displacement: {typed!r} is ambiguous ({'the' if typed.count(',') == 1 else 'a'} "
        f"comma may mark thousands or decimals): {ways}"
    )


def test_a_value_with_a_unit_is_refused_the_same_way() -> None:
    with pytest.raises(InputError, match="'2,800' is ambiguous"):
        parse_value("2,800 t", rules.DISPLACEMENT, DEFAULT_UNITS)
    # 2800 t is 2.8e6 kg (1 t = 1000 kg)
    assert parse_value("2800 t", rules.DISPLACEMENT, DEFAULT_UNITS) == pytest.approx(2.8e6)
