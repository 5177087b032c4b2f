import numpy as np
import pytest

from micromech.errors import InputError
from micromech.homogenize import eshelby_components, eshelby_cylinder, eshelby_sphere, polarization
from micromech.homogenize import walpole as W
from micromech.homogenize.eshelby import eshelby_spheroid, shape_function


def _tandon_weng(a, nu):
    """Tandon & Weng (1984) Appendix, as printed (with 1/(a^2 - 1)); valid away from a = 1."""
    if a > 1:
        g = a / (a**2 - 1) ** 1.5 * (a * np.sqrt(a**2 - 1) - np.arccosh(a))
    else:
        g = a / (1 - a**2) ** 1.5 * (np.arccos(a) - a * np.sqrt(1 - a**2))
    t, a2, r = a**2 - 1, a**2, 1 / (1 - nu)
    return {
        "S1111": 0.5 * r * (1 - 2 * nu + (3 * a2 - 1) / t - (1 - 2 * nu + 3 * a2 / t) * g),
        "S2222": 3 / 8 * r * a2 / t + 0.25 * r * (1 - 2 * nu - 9 / (4 * t)) * g,
        "S2233": 0.25 * r * (a2 / (2 * t) - (1 - 2 * nu + 3 / (4 * t)) * g),
        "S2211": -0.5 * r * a2 / t + 0.25 * r * (3 * a2 / t - (1 - 2 * nu)) * g,
        "S1122": -0.5 * r * (1 - 2 * nu + 1 / t) + 0.5 * r * (1 - 2 * nu + 3 / (2 * t)) * g,
        "S2323": 0.25 * r * (a2 / (2 * t) + (1 - 2 * nu - 3 / (4 * t)) * g),
        "S1212": 0.25 * r * (1 - 2 * nu - (a2 + 1) / t - 0.5 * (1 - 2 * nu - 3 * (a2 + 1) / t) * g),
    }


def _numerical_eshelby(a, nu, n=48):
    """Eshelby tensor by quadrature of Hill's polarisation integral over the unit sphere.

    P = det(a) / (4 pi) int sym(xi (x) N(xi) (x) xi) / |a xi|^3 dS, S = P : C0 (Mura 1987, Sec.
    11; Walpole 1981). Independent of the closed forms under test.
    """
    K, G = 1.0 / (3 * (1 - 2 * nu)), 1.0 / (2 * (1 + nu))
    d = np.eye(3)
    Id = 0.5 * (np.einsum("ik,jl->ijkl", d, d) + np.einsum("il,jk->ijkl", d, d))
    J = np.einsum("ij,kl->ijkl", d, d) / 3
    C = 3 * K * J + 2 * G * (Id - J)
    ax = np.array([a, 1.0, 1.0])
    x, w = np.polynomial.legendre.leggauss(n)
    phi = np.linspace(0, 2 * np.pi, 2 * n, endpoint=False)
    P = np.zeros((3, 3, 3, 3))
    for z, wz in zip(x, w, strict=True):
        s = np.sqrt(1 - z * z)
        xi = np.stack([np.full_like(phi, z), s * np.cos(phi), s * np.sin(phi)], -1)
        N = np.linalg.inv(np.einsum("pi,ijkl,pl->pjk", xi, C, xi))
        H = np.einsum("pi,pjk,pl->pijkl", xi, N, xi)
        H = 0.25 * (H + H.transpose(0, 2, 1, 3, 4) + H.transpose(0, 1, 2, 4, 3)
                    + H.transpose(0, 2, 1, 4, 3))
        rho = np.sqrt(((ax * xi) ** 2).sum(-1))
        P += wz * (np.pi / n) * np.einsum("pijkl,p->ijkl", H, a / rho**3)
    S = np.einsum("ijmn,mnkl->ijkl", P / (4 * np.pi), C)
    return {"S1111": S[0, 0, 0, 0], "S2222": S[1, 1, 1, 1], "S2233": S[1, 1, 2, 2],
            "S2211": S[1, 1, 0, 0], "S1122": S[0, 0, 1, 1], "S2323": S[1, 2, 1, 2],
            "S1212": S[0, 1, 0, 1]}


@pytest.mark.parametrize("nu", [-0.3, 0.0, 0.25, 0.35, 0.49])
def test_sphere_components_equal_eshelbys_closed_form(nu):
    # Eshelby (1957); Mura (1987) Eq. 11.21: S1111 = (7-5nu)/(15(1-nu)), S1122 = (5nu-1)/(15(1-nu)),
    # S1212 = (4-5nu)/(15(1-nu)); exact identity
    s = eshelby_components(nu, 1.0)
    d = 15 * (1 - nu)
    assert s["S1111"] == pytest.approx((7 - 5 * nu) / d, rel=1e-13)
    assert s["S2222"] == pytest.approx((7 - 5 * nu) / d, rel=1e-13)
    assert s["S1122"] == pytest.approx((5 * nu - 1) / d, abs=1e-14)
    assert s["S2233"] == pytest.approx((5 * nu - 1) / d, abs=1e-14)
    assert s["S1212"] == pytest.approx((4 - 5 * nu) / d, rel=1e-13)
    assert s["S2323"] == pytest.approx((4 - 5 * nu) / d, rel=1e-13)


@pytest.mark.parametrize("nu", [-0.3, 0.0, 0.25, 0.35, 0.49])
def test_cylinder_limit_equals_the_closed_form(nu):
    # Mura (1987) Eq. 11.22 with a1 -> inf: S2222 = (5-4nu)/(8(1-nu)), S2233 = (4nu-1)/(8(1-nu)),
    # S2211 = nu/(2(1-nu)), S2323 = (3-4nu)/(8(1-nu)), S1212 = 1/4, S11kl = 0; exact identity
    s = eshelby_components(nu, np.inf)
    r = 1 / (1 - nu)
    assert s["S1111"] == pytest.approx(0.0, abs=1e-14)
    assert s["S1122"] == pytest.approx(0.0, abs=1e-14)
    assert s["S2222"] == pytest.approx((5 - 4 * nu) * r / 8, rel=1e-13)
    assert s["S2233"] == pytest.approx((4 * nu - 1) * r / 8, abs=1e-14)
    assert s["S2211"] == pytest.approx(nu * r / 2, abs=1e-14)
    assert s["S2323"] == pytest.approx((3 - 4 * nu) * r / 8, rel=1e-13)
    assert s["S1212"] == pytest.approx(0.25, rel=1e-13)
    cyl = eshelby_cylinder(nu)
    walp = eshelby_spheroid(nu, np.inf)
    assert all(np.allclose(a, b, atol=1e-14) for a, b in zip(cyl, walp, strict=True))


def test_sphere_walpole_form_equals_the_spheroid_at_aspect_one():
    for a, b in zip(eshelby_sphere(0.3), eshelby_spheroid(0.3, 1.0), strict=True):
        assert np.isclose(a, b, rtol=1e-13, atol=1e-15)


@pytest.mark.parametrize("a", [0.05, 0.2, 0.5, 0.8, 1.3, 2.0, 5.0, 50.0])
def test_spheroid_components_equal_tandon_weng_as_printed(a):
    # Tandon & Weng (1984), Appendix; our form removes 1/(a^2 - 1) algebraically: same values
    ours, ref = eshelby_components(0.3, a), _tandon_weng(a, 0.3)
    for k, v in ref.items():
        assert ours[k] == pytest.approx(v, rel=1e-10, abs=1e-12), k


@pytest.mark.parametrize("a", [0.25, 3.0])
def test_spheroid_components_equal_a_numerical_quadrature(a):
    # Hill's polarisation integral evaluated numerically (Mura 1987 Sec. 11 form): independent check
    ours, num = eshelby_components(0.3, a), _numerical_eshelby(a, 0.3)
    for k, v in num.items():
        assert ours[k] == pytest.approx(v, abs=2e-6), k


def test_components_are_smooth_through_the_sphere():
    # the printed formulas lose all digits at a = 1 + 1e-7; ours must stay within 1e-6 of the sphere
    a = 1.0 + np.array([-1e-9, -1e-7, 1e-7, 1e-9])
    s, s0 = eshelby_components(0.3, a), eshelby_components(0.3, 1.0)
    for k in s:
        assert np.allclose(s[k], s0[k], atol=1e-6), k


def test_shape_function_is_continuous_at_the_series_switch():
    t_switch = np.sqrt(1.25), np.sqrt(0.75)
    for a in t_switch:
        w, q = shape_function(np.array([a * (1 - 1e-12), a * (1 + 1e-12)]))
        assert abs(q[1] - q[0]) < 1e-9 and abs(w[1] - w[0]) < 1e-9


def test_components_broadcast_over_poisson_and_aspect_ratio():
    s = eshelby_components(np.array([0.2, 0.3])[:, None], np.array([0.5, 1.0, 4.0]))
    assert s["S1111"].shape == (2, 3)


def test_polarization_of_a_cylinder_has_hills_closed_form():
    # P block [[1/(2(k0 + G0)), 0], [0, 0]], axial shear 1/(4 G0) for a cylinder (Hill 1964)
    K0, G0 = 4e9, 1.5e9
    P = polarization(K0, G0, None)
    assert P.c == pytest.approx(1 / (2 * (K0 + G0 / 3 + G0)), rel=1e-12)
    assert abs(P.d) < 1e-25 and abs(P.e) < 1e-25 and abs(P.f) < 1e-25
    assert P.h == pytest.approx(1 / (4 * G0), rel=1e-12)  # S.h / C0.h = (1/2) / (2 G0)


@pytest.mark.parametrize("bad", [0.0, -2.0, np.nan])
def test_non_positive_aspect_ratio_raises(bad):
    with pytest.raises(InputError, match="aspect_ratio .* must be positive"):
        eshelby_components(0.3, bad)


def test_walpole_identity_minus_eshelby_is_invertible_for_a_penny():
    S = eshelby_spheroid(0.3, 1e-3)
    M = W.sub(W.identity(), S)
    assert np.isfinite(W.inv(M).c)
