import numpy as np

from micromech import tensors
from micromech.homogenize import walpole as W

RNG = np.random.default_rng(7)


def _random_ti(shape=()):
    return W.TI(*(RNG.uniform(0.5, 2.0, shape) for _ in range(6)))


def _mandel(T):
    # 6x6 Mandel matrix of a Walpole tensor (works for non-symmetric tensors too)
    v = W.to_voigt(T)
    # to_voigt gives engineering-shear Voigt form: C_ab with shear columns halved -> Mandel
    return tensors.to_mandel(v)


def test_dot_is_the_double_contraction_in_mandel_form():
    A, B = _random_ti(), _random_ti()
    assert np.allclose(_mandel(W.dot(A, B)), _mandel(A) @ _mandel(B), rtol=1e-12)


def test_inverse_times_tensor_is_identity():
    A = _random_ti((5,))
    P = W.dot(A, W.inv(A))
    for got, want in zip(P, W.identity(), strict=True):
        assert np.allclose(got, want, atol=1e-12)


def test_from_engineering_matches_the_6x6_stiffness():
    C = W.from_engineering(230e9, 15e9, 0.2, 15e9, 0.07)
    ref = tensors.transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07)
    assert np.allclose(W.to_voigt(C), ref, rtol=1e-10)


def test_isotropic_components_match_the_lame_stiffness():
    K, G = 40e9, 30e9
    E, nu = 9 * K * G / (3 * K + G), (3 * K - 2 * G) / (2 * (3 * K + G))
    assert np.allclose(W.to_voigt(W.isotropic(K, G)), tensors.isotropic_stiffness(E, nu))


def test_from_voigt_inverts_to_voigt():
    C = W.from_engineering(140e9, 10e9, 0.3, 5e9, 0.45)
    back = W.from_voigt(W.to_voigt(C))
    assert all(np.allclose(a, b) for a, b in zip(back, C, strict=True))


def test_to_engineering_reads_back_the_constants():
    c = W.to_engineering(W.from_engineering(140e9, 10e9, 0.3, 5e9, 0.45))
    assert np.allclose([c["E1"], c["E2"], c["nu12"], c["G12"], c["nu23"]],
                       [140e9, 10e9, 0.3, 5e9, 0.45], rtol=1e-12)
    assert np.isclose(c["G23"], 10e9 / 2.9, rtol=1e-12)


def test_hill_moduli_round_trip():
    C = W.from_hill(10e9, 4e9, 150e9, 3e9, 5e9)
    h = W.hill_moduli(C)
    assert np.allclose([h[k] for k in "klnmp"], [10e9, 4e9, 150e9, 3e9, 5e9])
