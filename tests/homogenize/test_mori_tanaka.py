import numpy as np
import pytest

from micromech import tensors
from micromech.errors import FractionError, InputError
from micromech.homogenize import (
    FibrePhase,
    MatrixPhase,
    cylinders,
    hashin_shtrikman,
    hashin_shtrikman_fibre,
    hashin_shtrikman_spheroid,
    mori_tanaka,
)

VF = np.linspace(0.0, 1.0, 11)
NAMES = ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23")


def _close(a, b, rtol=1e-12, names=NAMES):
    for n in names:
        assert np.allclose(a.get(n), b.get(n), rtol=rtol, atol=0), n


def test_spheres_equal_the_hashin_shtrikman_lower_bound_for_a_softer_matrix(glass, epoxy):
    # Weng (1984), Int. J. Eng. Sci. 22, 845; Benveniste (1987): exact identity for spheres
    mt = mori_tanaka(glass, epoxy, VF, "sphere")
    lo, _ = hashin_shtrikman(glass, epoxy, VF)
    _close(mt, lo)


def test_spheres_equal_the_hashin_shtrikman_upper_bound_for_a_stiffer_matrix(epoxy):
    # the same identity with the roles swapped: stiff matrix, compliant particles (Weng 1984)
    stiff = MatrixPhase(200e9, 0.3)
    soft = FibrePhase.isotropic(3.5e9, 0.35)
    _, hi = hashin_shtrikman(soft, stiff, VF)
    _close(mori_tanaka(soft, stiff, VF, "sphere"), hi)


def test_continuous_fibres_give_the_cylinder_assemblage(carbon, epoxy):
    # Benveniste (1987) / Hashin & Rosen (1964): MT = CCA for E1, nu12, k23, G12 (exact identity)
    mt, cca = mori_tanaka(carbon, epoxy, VF), cylinders(carbon, epoxy, VF)
    _close(mt, cca, names=("E1", "nu12", "G12"))
    assert np.allclose(mt.extra["k23"], cca.extra["k23"], rtol=1e-12)


def test_continuous_fibres_g23_is_hashins_lower_bound(carbon, epoxy):
    # Hashin (1965) lower bound on G23 with the matrix softer = MT (exact identity)
    lo, _ = hashin_shtrikman_fibre(carbon, epoxy, VF)
    assert np.allclose(mori_tanaka(carbon, epoxy, VF).G23, lo.G23, rtol=1e-12)


def test_aligned_spheroids_equal_willis_lower_bound(glass, epoxy):
    # Willis (1977) bound with the matrix as comparison medium = MT (exact identity, well ordered)
    mt = mori_tanaka(glass, epoxy, VF, "spheroid", 7.0)
    lo, _ = hashin_shtrikman_spheroid(glass, epoxy, VF, 7.0)
    _close(mt, lo, names=("E1", "E2", "G12", "G23"))


@pytest.mark.parametrize(
    ("inclusion", "ar", "orientation"),
    [("continuous", None, "aligned"), ("sphere", None, "aligned"), ("spheroid", 0.1, "aligned"),
     ("spheroid", 30.0, "aligned"), ("spheroid", 30.0, "random_in_plane"),
     ("spheroid", 10.0, "random_3d"), ("continuous", None, "random_in_plane")],
)
def test_fraction_zero_gives_the_matrix_and_one_the_fibre(carbon, epoxy, inclusion, ar,
                                                          orientation):
    # exact limits of Benveniste's (1987) Eq. 23; at vf = 1 the (averaged) fibre itself
    r = mori_tanaka(carbon, epoxy, np.array([0.0, 1.0]), inclusion, ar, orientation=orientation)
    C = r.stiffness()
    assert np.allclose(C[0], tensors.isotropic_stiffness(3.5e9, 0.35), rtol=1e-10, atol=1.0)
    Cf = tensors.transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07)
    if orientation == "random_in_plane":
        R = tensors.rotation_about_axis(3, np.linspace(0, 180, 36, endpoint=False))
        Cf = tensors.rotate_stiffness(Cf, R).mean(axis=0)
    elif orientation == "random_3d":
        assert np.isclose(r.E1[1], r.E3[1]) and np.isclose(r.G12[1], r.G23[1])
        return
    assert np.allclose(C[1], Cf, rtol=1e-9, atol=1e-3 * np.max(Cf))
    assert np.allclose(r.alpha1, [60e-6, -0.5e-6 if orientation == "aligned" else r.alpha1[1]])


def test_random_3d_fibres_are_isotropic_and_between_the_aligned_extremes(glass, epoxy):
    al = mori_tanaka(glass, epoxy, 0.3, "spheroid", 20.0)
    r3 = mori_tanaka(glass, epoxy, 0.3, "spheroid", 20.0, orientation="random_3d")
    assert float(r3.E1) == pytest.approx(float(r3.E3)) == pytest.approx(float(r3.E2))
    assert float(r3.G12) == pytest.approx(float(r3.E1) / (2 * (1 + float(r3.nu12))), rel=1e-10)
    assert float(al.E2) < float(r3.E1) < float(al.E1)


def test_in_plane_random_is_planar_isotropic_and_symmetric(carbon, epoxy):
    r = mori_tanaka(carbon, epoxy, 0.3, "spheroid", 50.0, orientation="random_in_plane")
    C = r.stiffness()
    assert tensors.is_symmetric(C) and tensors.is_positive_definite(C)
    # planar isotropy: G12 = E1 / (2 (1 + nu12)) in the plane
    assert float(r.G12) == pytest.approx(float(r.E1) / (2 * (1 + float(r.nu12))), rel=1e-10)
    al = mori_tanaka(carbon, epoxy, 0.3, "spheroid", 50.0)
    assert float(al.E2) < float(r.E1) < float(al.E1)


def test_in_plane_average_equals_a_brute_force_rotation_average(carbon, epoxy):
    # the constant Walpole map against averaging rotated 6x6 stiffnesses (Advani & Tucker 1987)
    al = mori_tanaka(carbon, epoxy, 0.4, "spheroid", 12.0)
    R = tensors.rotation_about_axis(3, np.linspace(0, 180, 64, endpoint=False))
    ref = tensors.rotate_stiffness(al.stiffness(), R).mean(axis=0)
    got = mori_tanaka(carbon, epoxy, 0.4, "spheroid", 12.0, orientation="random_in_plane")
    assert np.allclose(got.stiffness(), ref, rtol=1e-9, atol=1e-6 * np.max(ref))


def test_long_spheroids_tend_to_continuous_fibres(carbon, epoxy):
    long = mori_tanaka(carbon, epoxy, 0.5, "spheroid", 1e7)
    cont = mori_tanaka(carbon, epoxy, 0.5)
    _close(long, cont, rtol=1e-6)


def test_results_broadcast_over_fraction_and_constants(epoxy):
    f = FibrePhase.isotropic(np.array([70e9, 80e9, 90e9])[:, None], 0.22)
    r = mori_tanaka(f, epoxy, np.linspace(0, 0.6, 4))
    assert r.E1.shape == (3, 4) and r.G23.shape == (3, 4)


def test_voids_lower_every_modulus(glass, epoxy):
    dry = mori_tanaka(glass, epoxy, 0.5)
    wet = mori_tanaka(glass, epoxy, 0.5, void_fraction=0.05)
    for n in ("E1", "E2", "G12", "G23"):
        assert float(wet.get(n)) < float(dry.get(n))
    assert wet.alpha1 is None


def test_porous_matrix_equals_the_hashin_shtrikman_upper_bound(glass, epoxy):
    # spherical voids only: MT = HS upper bound of a porous solid (Hashin 1962; exact identity):
    # K = [(1-p)/(K + 4G/3) + p/(4G/3)]^-1 - 4G/3
    p = 0.2
    r = mori_tanaka(glass, epoxy, 0.0, "sphere", void_fraction=p)
    K, G = float(epoxy.K), float(epoxy.G)
    a = 4 * G / 3
    K_hs = 1 / ((1 - p) / (K + a) + p / a) - a
    z = G / 6 * (9 * K + 8 * G) / (K + 2 * G)
    G_hs = 1 / ((1 - p) / (G + z) + p / z) - z
    E_hs = 9 * K_hs * G_hs / (3 * K_hs + G_hs)
    assert float(r.E1) == pytest.approx(E_hs, rel=1e-12)
    assert float(r.G12) == pytest.approx(G_hs, rel=1e-12)


def test_mori_tanaka_cte_at_the_limits(carbon, epoxy):
    r = mori_tanaka(carbon, epoxy, np.array([0.0, 1.0]))
    assert np.allclose(r.alpha1, [60e-6, -0.5e-6]) and np.allclose(r.alpha2, [60e-6, 10e-6])


def test_unknown_inclusion_raises(glass, epoxy):
    with pytest.raises(InputError, match="inclusion = 'cube': expected one of continuous"):
        mori_tanaka(glass, epoxy, 0.5, "cube")  # type: ignore[arg-type]


def test_unknown_orientation_raises(glass, epoxy):
    with pytest.raises(InputError, match="orientation = 'woven': expected one of aligned"):
        mori_tanaka(glass, epoxy, 0.5, orientation="woven")  # type: ignore[arg-type]


@pytest.mark.parametrize(
    ("inclusion", "ar", "match"),
    [("continuous", 10.0, "aspect_ratio = 10.0 is given for continuous fibres"),
     ("sphere", 2.0, "aspect_ratio = 2.0: a sphere has aspect ratio 1"),
     ("spheroid", None, "a spheroid inclusion needs an aspect ratio"),
     ("spheroid", -1.0, "aspect_ratio = -1.0: must be positive")],
)
def test_aspect_ratio_must_fit_the_inclusion(glass, epoxy, inclusion, ar, match):
    with pytest.raises(InputError, match=match):
        mori_tanaka(glass, epoxy, 0.3, inclusion, ar)


@pytest.mark.parametrize("vf", [-0.1, 1.5, np.nan])
def test_fraction_outside_the_unit_interval_raises(glass, epoxy, vf):
    with pytest.raises(FractionError, match="vf = .* must lie in \\[0, 1\\]"):
        mori_tanaka(glass, epoxy, vf)


def test_fraction_error_names_the_index(glass, epoxy):
    with pytest.raises(FractionError, match="at index 2"):
        mori_tanaka(glass, epoxy, [0.1, 0.2, 1.2])


def test_fibres_and_voids_above_one_raise(glass, epoxy):
    with pytest.raises(FractionError, match="vf \\+ void_fraction = 1.1 exceeds 1"):
        mori_tanaka(glass, epoxy, 0.9, void_fraction=0.2)


def _mandel_eshelby(nu, ar):
    """Mandel 6x6 matrix of the Eshelby tensor from its components (Voigt order 11..12)."""
    from micromech.homogenize import eshelby_components

    s = {k: float(v) for k, v in eshelby_components(nu, ar).items()}
    M = np.zeros((6, 6))
    M[0, 0] = s["S1111"]
    M[1, 1] = M[2, 2] = s["S2222"]
    M[1, 2] = M[2, 1] = s["S2233"]
    M[1, 0] = M[2, 0] = s["S2211"]
    M[0, 1] = M[0, 2] = s["S1122"]
    M[3, 3] = 2 * s["S2323"]
    M[4, 4] = M[5, 5] = 2 * s["S1212"]
    return M


@pytest.mark.parametrize("ar", [0.1, 1.0, 4.0])
def test_walpole_algebra_equals_benvenistes_formula_in_6x6_matrices(carbon, epoxy, ar):
    # Benveniste (1987) Eqs. 9 and 23 evaluated with plain 6x6 Mandel matrices (an independent
    # route to the closed Walpole algebra), transversely isotropic spheroids
    c = 0.35
    C0 = tensors.to_mandel(tensors.isotropic_stiffness(3.5e9, 0.35))
    C1 = tensors.to_mandel(tensors.transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07))
    I6 = np.eye(6)
    A = np.linalg.inv(I6 + _mandel_eshelby(0.35, ar) @ np.linalg.inv(C0) @ (C1 - C0))
    C = ((1 - c) * C0 + c * C1 @ A) @ np.linalg.inv((1 - c) * I6 + c * A)
    got = mori_tanaka(carbon, epoxy, c, "spheroid" if ar != 1.0 else "sphere",
                      ar if ar != 1.0 else None).stiffness()
    assert np.allclose(tensors.from_mandel(C), got, rtol=1e-10, atol=1e-6 * np.max(got))
