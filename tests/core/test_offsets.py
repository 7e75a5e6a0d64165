"""A symmetric hull from a table of offsets: the trapezoidal rule, units, direction, refusals."""

from __future__ import annotations

import numpy as np
import pytest
import shapely

from core.errors import DrawingError
from core.io.offsets import import_offsets, offsets_outline, read_offsets
from core.io.outline_import import OutlinePlacement

# An invented 72 m pontoon: a parabolic half-breadth curve 6 m at its widest.
L, HB = 72.0, 6.0
X = np.linspace(0.0, L, 25)
Y = HB * (1.0 - ((X - L / 2) / (L / 2)) ** 2)


def _table(x: np.ndarray, y: np.ndarray, header: str = "x,half_breadth", sep: str = ",") -> str:
    rows = [header] if header else []
    rows += [f"{a!r}{sep}{b!r}" for a, b in zip(x.tolist(), y.tolist(), strict=True)]
    return "\n".join(rows) + "\n"


def test_area_is_twice_the_trapezoidal_integral() -> None:
    got = import_offsets(_table(X, Y), "pontoon.csv")
    # area by the trapezoidal rule over the stations, both sides (any naval architecture
    # text on waterplane areas, from memory); the polygon through the offsets is exactly it
    assert got.area_m2 == pytest.approx(2 * np.trapezoid(Y, X), rel=1e-12)
    # and near the parabola's exact 2/3 L B (Simpson exact for a parabola); the trapezoidal
    # error bound (b - a) h^2 max|f''| / 12 per side
    h = X[1] - X[0]
    bound = 2 * L * h * h * (2 * HB / (L / 2) ** 2) / 12
    assert abs(got.area_m2 - 2 / 3 * L * 2 * HB) <= bound
    poly = shapely.Polygon(got.outline)
    assert got.centroid_m == pytest.approx((poly.centroid.x, poly.centroid.y), abs=1e-9)
    assert got.centroid_m[0] == pytest.approx(L / 2) and got.beam_m == pytest.approx(2 * HB)
    assert got.layer is None and got.units == "m"


def test_units_in_the_header_and_given() -> None:
    text = _table(X * 1000, Y * 1000, header="x (mm),hb (mm)")
    assert read_offsets(text, "t.csv").units == "mm"
    got = import_offsets(text, "t.csv")
    assert got.length_m == pytest.approx(L) and got.units == "mm"
    # the caller's unit wins over the header's
    assert import_offsets(text, "t.csv", units="m").length_m == pytest.approx(L * 1000)
    plain = _table(X * 1000, Y * 1000, header="")
    assert read_offsets(plain, "t.csv").units is None
    assert import_offsets(plain, "t.csv", units="mm").area_m2 == pytest.approx(got.area_m2)


def test_semicolons_and_decimal_commas() -> None:
    text = (
        "# offsets of Pontoon Ysolde\nstation;y;note\n0;0;stern\n10,5;4,25;\n20;4,25;\n30;0;bow\n"
    )
    table = read_offsets(text, "ysolde.csv")
    assert table.stations == ((0.0, 0.0), (10.5, 4.25), (20.0, 4.25), (30.0, 0.0))


def test_x_running_aft_and_a_transom() -> None:
    # stations from the bow (x = 0) aft; a transom 6 m wide at the aft end (x = 40)
    text = "x,hb\n0,0\n10,5\n35,5\n40,3\n"
    got = import_offsets(text, "t.csv", x_aft=True)
    # trapezoids between stations, both sides: 2 (10 * 5 / 2 + 25 * 5 + 5 * (5 + 3) / 2)
    assert got.area_m2 == pytest.approx(340.0)
    xs = sorted(x for x, _ in got.outline)
    assert xs[0] == 0.0 and xs[-1] == pytest.approx(40.0)
    assert sorted(y for x, y in got.outline if x == 0.0) == pytest.approx(
        [-3.0, 3.0]
    )  # transom aft
    assert [y for x, y in got.outline if x == pytest.approx(40.0)] == [0.0]  # stem forward


def test_reference_point_on_a_table() -> None:
    got = import_offsets(
        "x,hb\n-5,0\n0,3\n50,3\n55,0\n", "t.csv", reference=OutlinePlacement(reference="origin")
    )
    assert min(x for x, _ in got.outline) == pytest.approx(-5.0)


def test_outline_runs_port_then_starboard() -> None:
    table = read_offsets("x,hb\n0,2\n10,3\n20,0\n", "t.csv")
    assert offsets_outline(table) == [
        (0.0, 2.0),
        (10.0, 3.0),
        (20.0, 0.0),
        (10.0, -3.0),
        (0.0, -2.0),
    ]


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("", "t.csv: holds no offsets"),
        ("x,hb\n0,0\n", "t.csv: needs at least two stations"),
        ("x,hb\n0,0\n10,-2\n20,0\n", "t.csv: line 3: half-breadth -2 is negative"),
        ("x,hb\n0,0\n10,two\n", "t.csv: line 3: is not an x and a half-breadth: '10,two'"),
        ("x,hb\n0,0\n10,nan\n", "t.csv: line 3: x and half-breadth must be finite"),
        ("x,hb\n0,0\n10,2\n5,2\n20,0\n", "t.csv: station x must run one way; station 3 turns back"),
        ("x,hb\n0,0\n0,2\n", "t.csv: every station has the same x"),
        ("frame,width\n0,0\n", "t.csv: line 1: the first row names no x and half-breadth columns"),
    ],
)
def test_bad_tables(text: str, message: str) -> None:
    with pytest.raises(DrawingError) as e:
        import_offsets(text, "t.csv")
    assert str(e.value).startswith(message)


def test_a_waist_on_the_centreline_is_refused() -> None:
    with pytest.raises(DrawingError, match="t.csv: the outline"):
        import_offsets("x,hb\n0,0\n10,3\n20,0\n30,3\n40,0\n", "t.csv")
