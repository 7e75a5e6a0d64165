"""Hull outlines: validation, plane-area properties and boundary queries.

References: plane-area handbook formulas (from memory, see each test) and shapely as
an independent geometry library (agreement to 1e-7).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely
from hypothesis import given
from hypothesis import strategies as st

from core.errors import InputError, OutlineError
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline, raked_outline, ship_outline, validate_outline


def _hull(outline: object, **kw: object) -> Hull:
    return Hull("test", outline, **kw)  # type: ignore[arg-type]


# -- handbook area and centroid ---------------------------------------------------------


def test_rectangle_area_centroid_and_second_moments() -> None:
    """Rectangle b x h: A = b h, centroid (b/2, h/2), I = b h^3 / 12 about the centroid
    (engineering handbook, from memory)."""
    b, h = 60.0, 20.0
    g = _hull([(0, 0), (b, 0), (b, h), (0, h)]).geometry
    assert g.area == pytest.approx(b * h, rel=1e-12)
    assert g.centroid == pytest.approx((b / 2, h / 2), rel=1e-12)
    assert g.i_xx == pytest.approx(b * h**3 / 12, rel=1e-12)
    assert g.i_yy == pytest.approx(h * b**3 / 12, rel=1e-12)
    assert g.i_xy == pytest.approx(0.0, abs=1e-6)


def test_triangle_centroid_is_the_mean_of_its_vertices() -> None:
    """Triangle: centroid at the mean of the vertices (handbook, from memory)."""
    v = [(0.0, 0.0), (7.0, 1.0), (2.0, 5.0)]
    g = _hull(v).geometry
    assert g.centroid == pytest.approx((3.0, 2.0), rel=1e-12)
    assert g.area == pytest.approx(0.5 * abs(7 * 5 - 1 * 2), rel=1e-12)


def test_right_triangle_second_moment() -> None:
    """Triangle base b height h: I about the centroidal axis parallel to the base =
    b h^3 / 36 (handbook, from memory)."""
    b, h = 12.0, 9.0
    g = _hull([(0, 0), (b, 0), (0, h)]).geometry
    assert g.i_xx == pytest.approx(b * h**3 / 36, rel=1e-12)
    assert g.i_yy == pytest.approx(h * b**3 / 36, rel=1e-12)
    # product of inertia of a right triangle about its centroid: -b^2 h^2 / 72 (from memory)
    assert g.i_xy == pytest.approx(-(b**2) * h**2 / 72, rel=1e-12)


@pytest.mark.parametrize(("a", "b", "h"), [(4.0, 10.0, 6.0), (10.0, 4.0, 3.0), (7.0, 7.0, 2.0)])
def test_trapezoid_centroid_height(a: float, b: float, h: float) -> None:
    """Trapezoid with parallel sides a (top) and b (bottom), height h:
    y_c = h (b + 2a) / (3 (a + b)) from b (handbook, from memory)."""
    off = (b - a) / 2
    g = _hull([(0, 0), (b, 0), (off + a, h), (off, h)]).geometry
    assert g.area == pytest.approx((a + b) * h / 2, rel=1e-12)
    assert g.centroid[1] == pytest.approx(h * (b + 2 * a) / (3 * (a + b)), rel=1e-12)


def test_semicircle_many_sided_approximation() -> None:
    """Semicircle radius r: centroid 4 r / (3 pi) from the diameter (handbook, from memory);
    a 2000-sided polygon is within 1e-5 of it."""
    r = 15.0
    t = np.linspace(0.0, math.pi, 2001)
    g = _hull(list(zip(r * np.cos(t), r * np.sin(t), strict=True))).geometry
    assert g.area == pytest.approx(math.pi * r**2 / 2, rel=1e-5)
    assert g.centroid[1] == pytest.approx(4 * r / (3 * math.pi), rel=1e-5)
    assert g.centroid[0] == pytest.approx(0.0, abs=1e-9)


def test_circular_segment_area_and_centroid() -> None:
    """Circular segment of half-angle a: A = r^2 (a - sin a cos a),
    y_c = 4 r sin^3 a / (3 (2a - sin 2a)) from the centre (handbook, from memory)."""
    r, a = 10.0, math.radians(50)
    t = np.linspace(math.pi / 2 - a, math.pi / 2 + a, 4001)
    g = _hull(list(zip(r * np.cos(t), r * np.sin(t), strict=True))).geometry
    assert g.area == pytest.approx(r**2 * (a - math.sin(a) * math.cos(a)), rel=1e-5)
    assert g.centroid[1] == pytest.approx(
        4 * r * math.sin(a) ** 3 / (3 * (2 * a - math.sin(2 * a))), rel=1e-5
    )


@pytest.mark.parametrize(
    "outline",
    [
        box_outline(84, 24),
        raked_outline(84, 24, 9, 5, 0.75),
        ship_outline(140, 22, 60, "fine", "transom"),
        ship_outline(90, 16, 20, "full", "round"),
    ],
)
def test_area_and_centroid_agree_with_shapely(outline: tuple[tuple[float, float], ...]) -> None:
    g = _hull(outline).geometry
    poly = shapely.Polygon(outline)
    assert g.area == pytest.approx(poly.area, rel=1e-7)
    assert g.centroid == pytest.approx((poly.centroid.x, poly.centroid.y), rel=1e-7, abs=1e-7)
    assert g.length == pytest.approx(poly.bounds[2] - poly.bounds[0], rel=1e-12)


def test_parametric_shapes_have_the_asked_dimensions() -> None:
    for o in (box_outline(84, 24), raked_outline(84, 24, 9, 5), ship_outline(120, 20, 50)):
        g = _hull(o).geometry
        assert g.x_min == pytest.approx(0.0)
        assert g.beam == pytest.approx(24.0 if g.length == 84 else 20.0)
        assert g.centroid[1] == pytest.approx(0.0, abs=1e-9)  # symmetric about the centreline


def test_raked_ends_narrow_to_the_end_beam() -> None:
    o = raked_outline(60, 20, bow_rake_m=6, stern_rake_m=0, end_beam_fraction=0.5)
    bow = [y for x, y in o if x == 60.0]
    assert sorted(bow) == [-5.0, 5.0]
    stern = [y for x, y in o if x == 0.0]
    assert sorted(stern) == [-10.0, 10.0]


def test_ship_outline_is_symmetric_and_pointed_at_the_stem() -> None:
    o = ship_outline(100, 20, 40, "fine", "transom")
    pts = set(o)
    assert (100.0, 0.0) in pts
    assert all((x, -y) in pts or abs(y) < 1e-12 for x, y in o)


# -- validation -------------------------------------------------------------------------


def test_clockwise_and_counter_clockwise_give_the_same_hull() -> None:
    ccw = [(0, 0), (10, 0), (10, 4), (0, 4)]
    a, b = _hull(ccw), _hull(list(reversed(ccw)))
    assert a.geometry.area == pytest.approx(b.geometry.area)
    assert a.geometry.area > 0
    assert a.centroid == pytest.approx(b.centroid)


def test_self_crossing_outline_names_the_crossing_edges() -> None:
    with pytest.raises(
        OutlineError,
        match=r"crosses itself: edge 0 \(vertex 0 to 1\) meets edge 2 \(vertex 2 to 3\)",
    ) as e:
        validate_outline([(0, 0), (10, 10), (10, 0), (0, 10)])
    assert e.value.segments == (0, 2)


def test_non_finite_vertex_is_named() -> None:
    with pytest.raises(OutlineError, match="vertex 2 is not finite") as e:
        validate_outline([(0, 0), (1, 0), (math.inf, 1)])
    assert e.value.vertex == 2


def test_vertex_that_is_not_a_pair_is_named() -> None:
    with pytest.raises(OutlineError, match="vertex 1 is not a pair of numbers"):
        validate_outline([(0, 0), ("a", 0), (1, 1)])  # type: ignore[list-item]


def test_too_few_distinct_vertices() -> None:
    with pytest.raises(OutlineError, match="at least three distinct vertices, has 2"):
        validate_outline([(0, 0), (1, 1), (1, 1), (0, 0)])


def test_zero_area_outline() -> None:
    with pytest.raises(OutlineError, match="zero area"):
        validate_outline([(0, 0), (5, 0), (10, 0)])


def test_outline_folding_back_on_itself_is_refused() -> None:
    with pytest.raises(OutlineError, match="crosses itself"):
        validate_outline([(0, 0), (10, 0), (5, 0), (5, 5)])


def test_repeated_closing_vertex_is_accepted() -> None:
    assert len(validate_outline([(0, 0), (4, 0), (4, 3), (0, 0)])) == 3


@pytest.mark.parametrize(
    ("call", "message"),
    [
        (lambda: box_outline(-5, 10), "length: -5.0 must be a positive finite number"),
        (lambda: box_outline(50, math.nan), "beam: nan must be a positive"),
        (
            lambda: raked_outline(50, 10, 30, 30),
            "bow rake \\+ stern rake: 60.0 must be less than the length",
        ),
        (lambda: raked_outline(50, 10, -1, 0), "bow rake: -1.0 must be zero or a positive length"),
        (lambda: raked_outline(50, 10, 5, 5, 0.0), "end beam fraction"),
        (lambda: ship_outline(50, 10, 60), "parallel body length"),
        (lambda: ship_outline(50, 10, 20, "spoon"), "bow shape: 'spoon' is not one of"),
        (lambda: ship_outline(50, 10, 20, "fine", "canoe"), "stern shape"),
    ],
)
def test_bad_parameters_name_the_field(call: object, message: str) -> None:
    with pytest.raises(InputError, match=message):
        call()  # type: ignore[operator]


def test_hull_particulars_must_be_positive() -> None:
    with pytest.raises(InputError, match="hull test: draught: -1.0 m must be at least 0.01 m"):
        _hull(box_outline(10, 5), draught_m=-1.0)
    with pytest.raises(InputError, match="centre of gravity"):
        _hull(box_outline(10, 5), cog=(math.nan, 0.0))


def test_duplicate_fitting_names_are_refused() -> None:
    f = Fitting("A", "line", 10, 0)
    with pytest.raises(InputError, match="fitting name: 'A' is used twice"):
        _hull(box_outline(10, 5), fittings=(f, f))


def test_fitting_must_be_line_or_push() -> None:
    with pytest.raises(InputError, match="kind: 'tow' must be 'line' or 'push'"):
        Fitting("A", "tow", 0, 0)  # type: ignore[arg-type]


# -- boundary queries -------------------------------------------------------------------


def test_nearest_point_normal_and_arc_length_on_a_box() -> None:
    g = _hull(box_outline(60, 20)).geometry  # vertices (0,-10) (60,-10) (60,10) (0,10)
    p = g.nearest(30.0, -25.0)
    assert (p.x, p.y) == pytest.approx((30.0, -10.0))
    assert p.normal == pytest.approx((0.0, -1.0))  # outward on the starboard side
    assert p.s == pytest.approx(30.0)
    assert p.distance == pytest.approx(15.0)
    bow = g.nearest(75.0, 3.0)
    assert (bow.x, bow.y, bow.s) == pytest.approx((60.0, 3.0, 73.0))
    assert bow.normal == pytest.approx((1.0, 0.0))
    assert g.perimeter == pytest.approx(160.0)
    q = g.point_at(73.0)
    assert (q.x, q.y) == pytest.approx((60.0, 3.0))
    assert g.point_at(160.0 + 30.0).x == pytest.approx(30.0)  # wraps round


def test_normal_at_a_corner_bisects_the_edges() -> None:
    g = _hull(box_outline(60, 20)).geometry
    p = g.nearest(70.0, 20.0)
    assert (p.x, p.y) == pytest.approx((60.0, 10.0))
    assert p.normal == pytest.approx((math.sqrt(0.5), math.sqrt(0.5)))


@given(st.floats(-100, 200), st.floats(-100, 100))
def test_nearest_point_agrees_with_shapely(x: float, y: float) -> None:
    outline = raked_outline(84, 24, 9, 5)
    g = _hull(outline).geometry
    ring = shapely.LinearRing(outline)
    p = g.nearest(x, y)
    assert p.distance == pytest.approx(ring.distance(shapely.Point(x, y)), abs=1e-9)
    assert p.s == pytest.approx(ring.project(shapely.Point(p.x, p.y)), abs=1e-6)


def test_fittings_are_snapped_onto_the_outline_and_follow_it() -> None:
    h = _hull(box_outline(60, 20), fittings=(Fitting("Bow", "line", 61.0, 0.5),))
    assert (h.fittings[0].x, h.fittings[0].y) == pytest.approx((60.0, 0.5))
    # Dragging the bow corners forward: the fitting travels with its edge.
    longer = h.with_outline(box_outline(70, 20))
    assert (longer.fittings[0].x, longer.fittings[0].y) == pytest.approx((70.0, 0.5))
    # A vertex added: the fitting goes to the nearest point of the new outline.
    pointed = h.with_outline(((0, -10), (60, -10), (66, 0.0), (60, 10), (0, 10)))
    p = pointed.fittings[0]
    assert pointed.geometry.nearest(p.x, p.y).distance == pytest.approx(0.0, abs=1e-12)
    ring = shapely.LinearRing(pointed.outline)
    expected = ring.interpolate(ring.project(shapely.Point(60.0, 0.5)))
    assert (p.x, p.y) == pytest.approx((expected.x, expected.y), abs=1e-9)


def test_hull_values_are_immutable_and_edits_return_new_hulls() -> None:
    h = _hull(box_outline(60, 20))
    with pytest.raises(AttributeError):
        h.name = "other"  # type: ignore[misc]
    h2 = h.with_fitting(Fitting("A", "push", 30, -10))
    assert h.fittings == () and len(h2.fittings) == 1
    assert h2.without_fitting("A") == h
    moved = h2.shifted(10.0)
    assert moved.geometry.x_min == pytest.approx(-10.0)
    assert moved.fittings[0].x == pytest.approx(20.0)


def test_centre_of_gravity_defaults_to_the_centroid() -> None:
    h = _hull(box_outline(60, 20))
    assert h.centre_of_gravity == pytest.approx((30.0, 0.0))
    assert _hull(box_outline(60, 20), cog=(28.0, 1.5)).centre_of_gravity == (28.0, 1.5)
