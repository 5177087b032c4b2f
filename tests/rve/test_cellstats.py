"""Tests of micromech.rve.cellstats: nearest-neighbour statistics and the RVE-size guidance."""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import FractionError, InputError
from micromech.rve import cellstats, geometry
from micromech.rve.cellstats import (
    GUIDANCE_DELTA,
    guidance_fibres,
    nearest_neighbour_stats,
    rve_size_guidance,
)
from micromech.rve.geometry import hexagonal_cell, random_cell

D = 7e-6  # fibre diameter, m (invented example)


# --- nearest-neighbour statistics -------------------------------------------------------------


def test_nearest_neighbour_stats_of_two_fibres_by_hand() -> None:
    # centres 5 apart (3-4-5 triangle) in a 20 x 20 cell, diameter 2: distance 2.5 d, gap 1.5 d
    s = nearest_neighbour_stats([[1.0, 1.0], [4.0, 5.0]], (20.0, 20.0), 2.0)
    assert (s.distance_mean, s.distance_min, s.gap_mean, s.distance_std) == pytest.approx(
        (2.5, 2.5, 1.5, 0.0))


def test_nearest_neighbour_stats_use_periodic_images() -> None:
    # 0.5 and 9.5 on a 10-wide cell are 1 apart across the face
    s = nearest_neighbour_stats([[0.5, 5.0], [9.5, 5.0]], (10.0, 10.0), 1.0)
    assert s.distance_max == pytest.approx(1.0)
    one = nearest_neighbour_stats([[2.0, 3.0]], (6.0, 4.0), 1.0)  # own image at the short side
    assert one.distance_min == pytest.approx(4.0)


def test_nearest_neighbour_stats_take_a_diameter_with_a_unit() -> None:
    s = nearest_neighbour_stats([[0.0, 0.0], [14e-6, 0.0]], (100e-6, 100e-6), "7 um")
    assert s.distance_min == pytest.approx(2.0, rel=1e-12) and s.as_dict()["gap_min"] == 1.0


def test_stats_refuse_bad_shapes() -> None:
    with pytest.raises(InputError, match=r"centres: shape \(3,\) must be \(N, 2\)"):
        nearest_neighbour_stats([1.0, 2.0, 3.0], (5.0, 5.0), 1.0)
    with pytest.raises(InputError, match="cell_size = .* must be two positive lengths"):
        nearest_neighbour_stats([[1.0, 2.0]], (5.0, -5.0), 1.0)


@pytest.mark.parametrize("diameter", [0.0, -1.0, float("inf"), "-7 um"])
def test_stats_refuse_a_diameter_that_is_not_a_positive_length(diameter: object) -> None:
    with pytest.raises(InputError, match=r"diameter = .* must be > 0 \(a finite length\)"):
        nearest_neighbour_stats([[1.0, 2.0]], (5.0, 5.0), diameter)  # type: ignore[arg-type]


# --- fibre count for the guidance ------------------------------------------------------------


@pytest.mark.parametrize(
    ("vf", "expected"),
    [
        (0.55, 438),  # 2500 x 0.55 / pi = 437.67, rounded up; Trias 2006 L/R >= 50, from memory
        (0.60, 478),  # 477.46
        (0.30, 239),  # 238.73
        (1.00, 796),  # 795.77
    ],
)
def test_guidance_fibres_by_hand(vf: float, expected: int) -> None:
    assert int(guidance_fibres(vf)) == expected


def test_guidance_fibres_broadcast() -> None:
    got = guidance_fibres(np.array([[0.3], [0.6]]) * np.ones(3))
    assert got.shape == (2, 3) and got.dtype == np.int64 and got[:, 0].tolist() == [239, 478]


@settings(max_examples=100, deadline=None)
@given(vf=st.floats(1e-3, 1.0))
def test_guidance_fibres_is_the_fewest_count_of_a_50_radii_cell(vf: float) -> None:
    # square cell of n fibres of radius R at fraction vf: side L = R sqrt(n pi / vf), exact
    n = int(guidance_fibres(vf))
    assert math.sqrt(n * math.pi / vf) >= GUIDANCE_DELTA * (1 - 1e-12)
    assert math.sqrt((n - 1) * math.pi / vf) < GUIDANCE_DELTA * (1 + 1e-12)


@pytest.mark.parametrize("vf", [0.0, -0.2, 1.2, float("nan"), float("inf")])
def test_guidance_fibres_refuse_a_fraction_outside_0_1(vf: float) -> None:
    with pytest.raises(FractionError, match=r"volume_fraction = .* must be > 0 and <= 1"):
        guidance_fibres(vf)


def test_guidance_fibres_refuse_text() -> None:
    with pytest.raises(FractionError, match="volume_fraction = 'lots' must be a number"):
        guidance_fibres("lots")


# --- size guidance ----------------------------------------------------------------------------


def test_guidance_verdicts() -> None:
    small = random_cell(0.6, D, n_fibres=30, seed=1, shake_sweeps=0)
    g = rve_size_guidance(small)
    assert g.verdict == "small" and g.required_delta == 50.0
    assert g.fibres_for_guidance == math.ceil(0.6 * 2500 / math.pi)  # 478
    assert g.delta == pytest.approx(min(small.cell_size) / small.radius)
    assert "Trias" in g.references[0] and "Kanit" in g.references[1]
    assert "use about 478 fibres" in g.message
    assert rve_size_guidance(hexagonal_cell(0.6, D)).verdict == "not_applicable"


def test_fibres_for_guidance_meet_it_at_the_target_when_the_achieved_fraction_is_lower() -> None:
    # 120 um cell of 14 um fibres at 0.55 holds round(51.45) = 51 fibres: achieved 0.5452. A
    # count from the achieved fraction (434) gave L/R = 49.8 at 0.55; from the target: 438.
    a = random_cell(0.55, 14e-6, cell_size=120e-6, seed=3, shake_sweeps=0)
    assert a.volume_fraction < a.target_fraction == 0.55
    n = rve_size_guidance(a).fibres_for_guidance
    assert n == 438
    b = random_cell(0.55, 14e-6, n_fibres=n, seed=3, shake_sweeps=0)
    assert rve_size_guidance(b).verdict == "adequate"
    assert rve_size_guidance(b).delta == pytest.approx(math.sqrt(438 * math.pi / 0.55))  # 50.02


def test_fibres_for_guidance_meet_it_at_either_fraction_when_the_achieved_one_is_higher() -> None:
    # 60 um cell of 7 um fibres at 0.50 holds round(46.77) = 47 fibres: achieved 0.5024
    a = random_cell(0.5, D, cell_size=60e-6, seed=1, shake_sweeps=0)
    assert a.volume_fraction > a.target_fraction
    n = rve_size_guidance(a).fibres_for_guidance
    assert n == math.ceil(a.volume_fraction * 2500 / math.pi) == 400  # not 398 from the target
    for vf in (a.target_fraction, a.volume_fraction):
        b = random_cell(vf, D, n_fibres=n, seed=1, shake_sweeps=0)
        assert rve_size_guidance(b).verdict == "adequate"


def test_default_cell_at_a_whole_guidance_count_is_adequate() -> None:
    # vf = 51 pi / 2500 makes 2500 vf / pi whole: L/R lands on 50 up to the last digit
    a = random_cell(51 * math.pi / 2500, 1.0, seed=1, shake_sweeps=0)
    assert min(a.cell_size) / a.radius == pytest.approx(50.0, rel=0.01)
    assert rve_size_guidance(a).verdict == "adequate"


def test_geometry_re_exports_the_statistics_and_guidance() -> None:
    for name in ("GUIDANCE_DELTA", "NeighbourStats", "RveGuidance", "guidance_fibres",
                 "nearest_neighbour_stats", "rve_size_guidance"):
        assert getattr(geometry, name) is getattr(cellstats, name)
        assert name in geometry.__all__
