"""Bracketed root search on a fraction range, and interval sets."""

import numpy as np
import pytest

from micromech.design.roots import (
    TOUCH,
    evaluate,
    find_crossings,
    intersect,
    intersect_all,
    satisfying_set,
)
from micromech.errors import InputError


def linear(v):
    return 70e9 * v + 3e9 * (1.0 - v)


def test_linear_model_has_one_crossing_at_the_closed_form_fraction():
    # 70 v + 3 (1 - v) = 40  ->  v = 37/67 (exact algebra)
    r = find_crossings(linear, 40e9, 0.0, 0.9)
    assert r.shape == (1,)
    assert r[0] == pytest.approx(37.0 / 67.0, rel=1e-14)


def test_hump_gives_two_crossings_and_touching_its_peak_gives_one():
    hump = lambda v: v * (1.0 - v)  # noqa: E731  peak 0.25 at 0.5 (exact)
    r = find_crossings(hump, 0.2, 0.0, 1.0)
    assert r == pytest.approx([0.5 - np.sqrt(0.05), 0.5 + np.sqrt(0.05)], rel=1e-13)
    touch = find_crossings(hump, 0.25, 0.0, 1.0)  # the peak is on the grid
    assert touch.tolist() == [0.5]
    off = lambda v: 0.25 - (v - 0.5003) ** 2  # noqa: E731  peak between grid points
    assert find_crossings(off, 0.25, 0.0, 1.0) == pytest.approx([0.5003], abs=1e-7)


def test_narrow_peak_inside_one_grid_cell_is_found():
    # Gaussian of half width 1e-3 around 0.5003: crossings of 1/2 at 0.5003 +- 1e-3 sqrt(ln 2)
    peak = lambda v: np.exp(-(((v - 0.5003) / 1e-3) ** 2))  # noqa: E731
    r = find_crossings(peak, 0.5, 0.0, 1.0)
    d = 1e-3 * np.sqrt(np.log(2.0))
    assert r == pytest.approx([0.5003 - d, 0.5003 + d], rel=1e-12)


def test_target_out_of_range_has_no_crossing():
    assert find_crossings(linear, 80e9, 0.0, 0.9).size == 0


def test_grid_point_that_hits_the_target_exactly_is_a_root():
    r = find_crossings(lambda v: v, 0.5, 0.0, 1.0)  # 0.5 is on the 257-point grid
    assert r.tolist() == [0.5]


def test_non_finite_values_are_skipped():
    f = lambda v: np.where(v > 0.95, np.nan, v)  # noqa: E731
    assert find_crossings(f, 0.3, 0.0, 1.0) == pytest.approx([0.3], rel=1e-14)


def test_minimum_requirement_gives_the_fractions_above_the_crossing():
    roots, iv = satisfying_set(linear, ">=", 40e9, 0.0, 0.9)
    assert iv == ((roots[0], 0.9),)
    _, below = satisfying_set(linear, "<=", 40e9, 0.0, 0.9)
    assert below == ((0.0, roots[0]),)


def test_inequality_on_a_hump_gives_the_middle_or_the_two_ends():
    hump = lambda v: v * (1.0 - v)  # noqa: E731
    r, mid = satisfying_set(hump, ">=", 0.2, 0.0, 1.0)
    assert mid == ((r[0], r[1]),)
    _, ends = satisfying_set(hump, "<=", 0.2, 0.0, 1.0)
    assert ends == ((0.0, r[0]), (r[1], 1.0))


def test_equality_gives_points_and_a_constant_model_at_the_target_gives_the_range():
    r, pts = satisfying_set(linear, "==", 40e9, 0.0, 0.9)
    assert pts == ((r[0], r[0]),)
    _, whole = satisfying_set(lambda v: np.full_like(v, 5.0), "==", 5.0, 0.0, 0.9)
    assert whole == ((0.0, 0.9),)


def test_inequality_met_everywhere_or_nowhere():
    assert satisfying_set(linear, ">=", 1e9, 0.0, 0.9)[1] == ((0.0, 0.9),)
    assert satisfying_set(linear, ">=", 1e12, 0.0, 0.9)[1] == ()


def test_intersection_of_interval_sets_keeps_points_and_overlaps():
    a = ((0.0, 0.3), (0.5, 0.8))
    b = ((0.2, 0.6), (0.7, 0.7))
    assert intersect(a, b) == ((0.2, 0.3), (0.5, 0.6), (0.7, 0.7))
    assert intersect(a, ()) == ()
    assert intersect_all([], 0.0, 0.9) == ((0.0, 0.9),)
    assert intersect_all([a, b, ((0.25, 0.55),)], 0.0, 1.0) == ((0.25, 0.3), (0.5, 0.55))


def test_points_that_coincide_to_the_tolerance_intersect_in_one_point():
    # two roots of one fraction refined separately differ in the last places (exact identity)
    p, q = ((0.5, 0.5),), ((0.5 + 4e-16, 0.5 + 4e-16),)
    (meet,) = intersect(p, q)
    assert meet[0] == meet[1] == pytest.approx(0.5, abs=1e-15)
    (end,) = intersect(((0.2, 0.5),), q)
    assert end[0] == end[1] == pytest.approx(0.5, abs=1e-15)
    assert len(intersect(((0.5 - 0.9 * TOUCH, 0.5 - 0.9 * TOUCH),), p)) == 1
    assert intersect(((0.5 - 2.0 * TOUCH, 0.5 - 2.0 * TOUCH),), p) == ()


def test_scalar_result_is_broadcast_over_the_fractions():
    assert evaluate(lambda v: 2.0, np.array([0.1, 0.2])).tolist() == [2.0, 2.0]


def test_model_returning_the_wrong_shape_is_an_error():
    with pytest.raises(InputError, match=r"returned shape \(3,\) for fractions of shape \(2,\)"):
        evaluate(lambda v: np.zeros(3), np.array([0.1, 0.2]))


def test_empty_range_is_an_error():
    with pytest.raises(InputError, match="lower=0.5, upper=0.5; need finite lower < upper"):
        find_crossings(linear, 1.0, 0.5, 0.5)


def test_too_few_grid_points_is_an_error():
    with pytest.raises(InputError, match="points: got 2"):
        find_crossings(linear, 1.0, 0.0, 1.0, points=2)


def test_non_finite_target_is_an_error():
    with pytest.raises(InputError, match="target: got nan"):
        find_crossings(linear, float("nan"), 0.0, 1.0)


def test_unknown_relation_is_an_error():
    with pytest.raises(InputError, match="relation: got '>'"):
        satisfying_set(linear, ">", 1.0, 0.0, 1.0)  # type: ignore[arg-type]
