"""Tests of micromech.rve.packing: periodic disc packing in units of the exclusion diameter."""

from __future__ import annotations

import numpy as np
import pytest

from micromech.rve.packing import (
    FEASIBLE,
    adsorb,
    is_feasible,
    min_image,
    overlap_energy,
    relax,
    shake,
    wrap,
)

BOX = np.array([6.0, 5.0])


def test_wrap_and_min_image_by_hand() -> None:
    got = wrap(np.array([[-0.5, 5.5], [6.0, 0.0]]), BOX)
    assert got.tolist() == [[5.5, 0.5], [0.0, 0.0]]
    assert min_image(np.array([5.5, -4.0]), BOX).tolist() == [-0.5, 1.0]


def test_overlap_energy_of_one_pair_across_the_face_by_hand() -> None:
    # centres 0.2 and 5.4 on a 6-wide cell are 0.8 apart: overlap 0.2, energy 0.2^2 / 2
    e, g = overlap_energy(np.array([0.2, 2.0, 5.4, 2.0]), BOX, 1.0)
    assert e == pytest.approx(0.02)
    assert g == pytest.approx([-0.2, 0.0, 0.2, 0.0])  # pushing apart lowers the energy


def test_overlap_energy_gradient_matches_finite_differences() -> None:
    rng = np.random.default_rng(3)
    x = (rng.random((12, 2)) * BOX).ravel()
    e, g = overlap_energy(x, BOX, 1.0)
    h = 1e-7
    fd = np.array([(overlap_energy(x + h * np.eye(24)[k], BOX, 1.0)[0]
                    - overlap_energy(x - h * np.eye(24)[k], BOX, 1.0)[0]) / (2 * h)
                   for k in range(24)])
    assert e > 0 and np.allclose(g, fd, atol=1e-6)


def test_adsorption_relaxation_and_shaking_keep_discs_apart() -> None:
    rng = np.random.default_rng(5)
    n = 24  # exclusion fraction 24 (pi/4) / 30 = 0.63
    p = adsorb(n, BOX, 0.8, rng)
    assert p.shape == (n, 2) and np.all((p >= 0) & (p < BOX))
    p, used = relax(p, BOX, rng, 2000)
    assert is_feasible(p, BOX) and used >= 1
    q, acceptance = shake(p, BOX, rng, 30)
    assert is_feasible(q, BOX) and 0.0 < acceptance <= 1.0 and not np.allclose(p, q)


def test_is_feasible_sees_a_close_pair_across_the_face() -> None:
    p = np.array([[0.1, 1.0], [5.95, 1.0]])  # 0.15 apart through the face x = 0
    assert not is_feasible(p, BOX)
    assert is_feasible(np.array([[0.1, 1.0], [5.09, 1.0]]), BOX)  # 1.01 apart
    assert not is_feasible(np.array([[0.1, 1.0], [5.1, 1.0]]), BOX)  # 1 apart: below FEASIBLE
    assert FEASIBLE == 1.0 + 1e-9
