"""Effective stiffness from load cases and constants from curves (invented orthotropic cell)."""

from __future__ import annotations

import json

import numpy as np
import pytest

from micromech.errors import InputError
from micromech.rve import (
    AXIS_NAMES,
    Curve,
    axis_values,
    constants_from_curves,
    metrics_of_curve,
    stiffness_from_load_cases,
    stiffness_from_matrix,
)
from micromech.tensors import isotropic_stiffness, orthotropic_compliance, symmetry_error

# invented orthotropic cell: E1, E2, E3, G23, G13, G12, nu23, nu13, nu12
ORTHO = dict(E1=140e9, E2=10e9, E3=9e9, G23=3.5e9, G13=5.2e9, G12=5.0e9, nu23=0.45, nu13=0.3,
             nu12=0.28)
S = orthotropic_compliance(**ORTHO)
C = np.linalg.inv(S)


def six_exact_cases(seed: int = 0, n: int = 6) -> tuple[np.ndarray, np.ndarray]:
    eps = 1e-3 * (np.eye(6)[:n] if n == 6 and seed < 0 else
                  np.random.default_rng(seed).uniform(-1, 1, (n, 6)))
    return eps @ C.T, eps


@pytest.mark.parametrize("seed", [-1, 0, 1])
def test_six_exact_load_cases_recover_the_stiffness(seed):
    stress, strain = six_exact_cases(seed)
    r = stiffness_from_load_cases(stress, strain)
    assert np.max(np.abs(r.stiffness - C)) / np.max(np.abs(C)) < 1e-10  # exact identity
    assert r.symmetry_error < 1e-10 and r.positive_definite
    assert r.residual < 1e-12 and r.n_cases == 6
    for name, value in ORTHO.items():  # engineering constants through the compliance
        assert float(r.constants.get(name)) == pytest.approx(value, rel=1e-10), name
    assert float(r.constants.extra["nu21"]) == pytest.approx(0.28 * 10 / 140, rel=1e-10)
    assert r.constants.model == "rve"


def test_more_than_six_cases_fit_by_least_squares():
    stress, strain = six_exact_cases(seed=4, n=12)
    r = stiffness_from_load_cases(stress, strain)
    assert np.max(np.abs(r.stiffness - C)) / np.max(np.abs(C)) < 1e-10 and r.n_cases == 12
    noisy = stress + np.random.default_rng(5).normal(0, 1e-3 * np.abs(stress).max(), stress.shape)
    rn = stiffness_from_load_cases(noisy, strain)
    assert 1e-5 < rn.residual < 1e-2 and rn.symmetry_error > 1e-6


def test_asymmetry_of_the_cases_is_reported_not_hidden():
    asym = C.copy()
    asym[0, 1] *= 1.05  # inconsistent boundary conditions make C12 != C21
    eps = 1e-3 * np.eye(6)
    r = stiffness_from_load_cases(eps @ asym.T, eps)
    assert r.symmetry_error == pytest.approx(float(symmetry_error(asym)), rel=1e-9)
    np.testing.assert_allclose(r.symmetric_part, 0.5 * (asym + asym.T), rtol=1e-12)


def test_not_positive_definite_is_flagged():
    bad = isotropic_stiffness(70e9, 0.6)  # nu > 1/2: negative bulk modulus
    r = stiffness_from_matrix(bad)
    assert r.positive_definite is False


def test_given_matrix_gets_the_same_checks_and_constants():
    r = stiffness_from_matrix(C)
    assert r.symmetry_error < 1e-15 and r.positive_definite and r.n_cases == 0
    assert float(r.constants.E3) == pytest.approx(9e9, rel=1e-12)
    values = r.axis_values()
    assert values["Ex"] == pytest.approx(140e9, rel=1e-12)
    assert values["Gyz"] == pytest.approx(3.5e9, rel=1e-12)
    assert values["nuyx"] == pytest.approx(0.02, rel=1e-12)  # nu21 = nu12 E2 / E1
    json.dumps(r.as_dict(), allow_nan=False)


@pytest.mark.parametrize(
    ("stress", "strain", "message"),
    [
        (np.ones((6, 6)), np.ones((7, 6)), r"same shape \(n, 6\)"),
        (np.ones((5, 6)), np.ones((5, 6)), r"stress: 5 load case\(s\); at least 6"),
        (np.ones((6, 5)), np.ones((6, 5)), r"expected shape \(n, 6\) in Voigt order"),
        (np.full((6, 6), np.nan), np.eye(6), "load case 0, component 0 is nan"),
        ([["a"] * 6] * 6, np.eye(6), r"expected an \(n, 6\) array of numbers"),
        (np.eye(6), np.vstack([np.eye(6)[:5], np.eye(6)[4]]), "span only 5 independent strain"),
    ],
)
def test_bad_load_cases_raise(stress, strain, message):
    with pytest.raises(InputError, match=message):
        stiffness_from_load_cases(stress, strain)


@pytest.mark.parametrize(
    ("matrix", "message"),
    [
        (np.zeros((6, 6)), "symmetric part is singular"),
        (np.eye(5), r"expected shape \(6, 6\), got \(5, 5\)"),
        (np.full((6, 6), np.inf), "every entry must be finite"),
        ([["x"] * 6] * 6, "expected a 6x6 array of numbers"),
    ],
)
def test_bad_matrices_raise(matrix, message):
    with pytest.raises(InputError, match=message):
        stiffness_from_matrix(matrix)


# --- constants from uniaxial curves ----------------------------------------------------------


def uniaxial_metrics():
    """Linear curves of the invented cell: stress along i gives strains S[:, i] * stress."""
    load = np.linspace(0.0, 50e6, 21)
    out = {}
    for direction, i in (("x", 0), ("y", 1), ("z", 2)):
        lateral = {a: S[j, i] * load for a, j in (("x", 0), ("y", 1), ("z", 2)) if j != i}
        out[direction] = metrics_of_curve(Curve(direction, S[i, i] * load, load, lateral))
    for direction, i in (("yz", 3), ("xz", 4), ("xy", 5)):
        out[direction] = metrics_of_curve(Curve(direction, S[i, i] * load, load))
    return out


def test_curves_give_the_engineering_constants():
    c = constants_from_curves(uniaxial_metrics())
    assert c.complete and c.model == "rve"
    for name, value in ORTHO.items():
        assert float(c.get(name)) == pytest.approx(value, rel=1e-12), name
    assert float(c.extra["nu31"]) == pytest.approx(0.3 * 9 / 140, rel=1e-12)  # nu31 = nu13 E3/E1
    np.testing.assert_allclose(c.stiffness(), C, rtol=1e-10)


def test_partial_curves_give_a_partial_result_under_laminate_names():
    m = uniaxial_metrics()
    c = constants_from_curves({"x": m["x"], "xy": m["xy"]})
    assert not c.complete and c.E2 is None
    values = axis_values(c)
    assert set(values) == set(AXIS_NAMES)
    assert values["Ex"] == pytest.approx(140e9) and values["Gxy"] == pytest.approx(5e9)
    assert values["nuxy"] == pytest.approx(0.28) and values["nuxz"] == pytest.approx(0.3)
    assert values["Ey"] is None and values["nuyx"] is None


def test_curve_constants_reject_unknown_or_mislabelled_directions():
    m = uniaxial_metrics()
    with pytest.raises(InputError, match="direction must be one of x, y, z, xy, yz, xz, got 'w'"):
        constants_from_curves({"w": m["x"]})
    with pytest.raises(InputError, match=r"metrics\['y'\]: holds the metrics of load case 'x'"):
        constants_from_curves({"y": m["x"]})
