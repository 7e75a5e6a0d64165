"""Unit factors against NIST SP 811 (appendix B; values from memory, they agree with pint)."""

from __future__ import annotations

from dataclasses import replace

import pytest

from core.errors import InputError
from core.io.projectfile import load
from core.io.report import report_text
from core.solve.holdlimits import limit_cell
from core.units import FACTORS, DisplayUnits, from_si, label, to_si, ureg
from tests.conftest import SAMPLES


@pytest.mark.parametrize(
    ("quantity", "unit", "si", "source"),
    [
        (
            "force",
            "t",
            9806.65,
            "tonne-force = 1000 kgf, standard gravity 9.80665 m/s^2 exact (NIST SP 811)",
        ),
        ("force", "kN", 1000.0, "SI prefix"),
        ("force", "kip", 4448.222, "NIST SP 811 B.8: kip = 4.448222 kN (from memory)"),
        ("force", "lbf", 4.448222, "NIST SP 811 B.8: lbf = 4.448222 N (from memory)"),
        ("moment", "t*m", 9806.65, "tonne-force times metre"),
        (
            "moment",
            "kip*ft",
            4448.222 * 0.3048,
            "kip x foot, foot = 0.3048 m exactly (NIST SP 811)",
        ),
        ("length", "ft", 0.3048, "international foot, exact (NIST SP 811)"),
        ("speed", "kn", 1852.0 / 3600.0, "knot = 1852 m per hour (NIST SP 811)"),
    ],
)
def test_display_unit_factors(quantity: str, unit: str, si: float, source: str) -> None:
    assert FACTORS[quantity][unit] == pytest.approx(si, rel=1e-6), source  # type: ignore[index]


def test_the_tonne_force_is_not_pints_tonne_or_short_ton() -> None:
    # pint's "t" is the tonne of mass; its "ton_force" is the short ton-force, 8896.443 N
    # (NIST SP 811, from memory). Towboard's "t" on a bollard pull is the tonne-force.
    assert ureg.Quantity(1, "t").dimensionality == ureg.Quantity(1, "kg").dimensionality
    assert ureg.Quantity(1, "ton_force").to("N").magnitude == pytest.approx(8896.443, rel=1e-6)
    assert ureg.Quantity(1, "tonne_force").to("N").magnitude == pytest.approx(9806.65, rel=1e-12)
    assert ureg.Quantity(1, "long_ton_force").to("N").magnitude == pytest.approx(9964.016, rel=1e-6)


def test_field_shortcut_kn_over_ten_is_about_two_percent_off() -> None:
    # "kN / 10 = t" (common practice, no source) under-states pull by about 2 %.
    bp_t = from_si(to_si(600.0, "force", "kN"), "force", "t")
    assert (600.0 / 10) / bp_t - 1 == pytest.approx(-0.0193, abs=0.001)


def test_round_trip_and_labels() -> None:
    assert from_si(to_si(45.0, "force", "t"), "force", "t") == pytest.approx(45.0, rel=1e-15)
    assert label("t*m") == "t·m" and label("kN") == "kN"
    u = DisplayUnits()
    assert u.show(9806.65 * 45, "force") == "45.0 t"
    assert u.with_unit("force", "kN").show(9806.65 * 45, "force") == "441.3 kN"


def test_unknown_unit_is_refused_with_the_choices() -> None:
    with pytest.raises(InputError, match="force unit: 'ton' is not one of t, kN, kip, lbf"):
        DisplayUnits(force="ton")


def test_speeds_in_m_per_s_are_printed_to_the_hundredth_and_knots_to_the_tenth() -> None:
    # 0.4 kn = 0.4 x 1852 m / 3600 s = 0.2058 m/s (the knot is 1852 m an hour, exact by
    # definition): one decimal read 0.2 m/s, two read 0.21 m/s.
    kn = 1852.0 / 3600.0
    assert DisplayUnits(speed="m/s").show(0.4 * kn, "speed") == "0.21 m/s"
    assert DisplayUnits(speed="kn").show(0.4 * kn, "speed") == "0.4 kn"
    assert DisplayUnits(speed="m/s").digits("speed") == 2
    assert DisplayUnits().digits("force") == 1
    assert DisplayUnits(speed="m/s").show(0.4 * kn, "speed", 1) == "0.2 m/s"  # as asked


def test_the_report_and_the_hold_limits_print_m_per_s_to_the_hundredth() -> None:
    # The deck barge sample's current, 0.4 kn (0.2058 m/s, hand calculation above), and
    # its hold limits' cells, shown in m/s.
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    project = replace(project, units=project.units.with_unit("speed", "m/s"))
    text = report_text(project)
    assert "  Current         0.21 m/s setting towards 070.0 true" in text
    assert limit_cell(1.4958, project.units) == "1.50"
    assert limit_cell(1.4958, DisplayUnits()) == "2.9"  # 1.4958 / 0.5144 = 2.91 kn
