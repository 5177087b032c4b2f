import numpy as np
import pytest

from micromech import tensors
from micromech.errors import FractionError, InputError, InvalidMaterialError
from micromech.homogenize import (
    FibrePhase,
    MatrixPhase,
    hashin_shtrikman,
    hashin_shtrikman_fibre,
    hashin_shtrikman_isotropic,
    hashin_shtrikman_spheroid,
    reuss_bound,
    voigt_bound,
    voigt_reuss,
)

VF = np.linspace(0.0, 1.0, 11)


def test_generic_voigt_and_reuss_match_the_closed_form(carbon, epoxy):
    Cf = tensors.transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07)
    Cm = tensors.isotropic_stiffness(3.5e9, 0.35)
    fr = np.stack([VF, 1 - VF])
    V, R = voigt_reuss(carbon, epoxy, VF)
    assert np.allclose(voigt_bound(np.stack([np.broadcast_to(Cf, (11, 6, 6)),
                                             np.broadcast_to(Cm, (11, 6, 6))]), fr),
                       V.stiffness(), rtol=1e-10)
    assert np.allclose(reuss_bound([Cf, Cm], [0.3, 0.7]),
                       voigt_reuss(carbon, epoxy, 0.3)[1].stiffness(), rtol=1e-10)
    assert R is not None


def test_voigt_and_reuss_of_anisotropic_phases_order_the_strain_energy():
    # Hill (1952): C_R <= C_V in the energy sense; eigenvalues of C_V - C_R are >= 0
    Cf = tensors.rotate_stiffness(tensors.orthotropic_stiffness(
        140e9, 10e9, 9e9, 3e9, 5e9, 5.5e9, 0.45, 0.3, 0.28), tensors.rotation_about_axis(2, 30.0))
    Cm = tensors.isotropic_stiffness(3e9, 0.38)
    d = voigt_bound([Cf, Cm], [0.6, 0.4]) - reuss_bound([Cf, Cm], [0.6, 0.4])
    assert np.min(np.linalg.eigvalsh(tensors.to_mandel(0.5 * (d + d.T)))) > 0


def test_voigt_bound_of_one_phase_is_itself():
    C = tensors.isotropic_stiffness(70e9, 0.3)
    assert np.allclose(voigt_bound([C], [1.0]), C)
    assert np.allclose(reuss_bound([C], [1.0]), C)


def test_voigt_shape_errors_raise():
    with pytest.raises(InputError, match="expected shape \\(N, ..., 6, 6\\)"):
        voigt_bound(np.eye(6), [1.0])
    with pytest.raises(InputError, match="expected shape \\(N, ..., 6, 6\\)"):
        reuss_bound(np.eye(3)[None], [1.0])
    with pytest.raises(InputError, match="expected 2 phase fractions"):
        voigt_bound([np.eye(6), np.eye(6)], [1.0])


def test_fractions_must_sum_to_one():
    with pytest.raises(FractionError, match="fractions sum to 0.9, must sum to 1"):
        voigt_bound([np.eye(6), np.eye(6)], [0.5, 0.4])


def test_voids_remove_the_reuss_bound(glass, epoxy):
    V, R = voigt_reuss(glass, epoxy, 0.5, void_fraction=0.1)
    assert R is None
    # uniform strain: the shear modulus is the volume average, voids counting zero (Voigt 1889)
    assert float(V.G12) == pytest.approx(0.5 * 72e9 / 2.44 + 0.4 * 3.5e9 / 2.7, rel=1e-12)


def test_voigt_reuss_fraction_sum_checked(glass, epoxy):
    with pytest.raises(FractionError, match="vf \\+ void_fraction = 1.2 exceeds 1"):
        voigt_reuss(glass, epoxy, 0.7, void_fraction=0.5)


def test_in_plane_random_voigt_reuss_match_the_6x6_bounds_of_the_averaged_fibre(carbon, epoxy):
    # Hill (1952): Voigt = c <C_f> + (1 - c) C_m, Reuss = (c <S_f> + (1 - c) S_m)^-1, with < > the
    # in-plane average; 16 rotations about axis 3 average a degree-4 polynomial exactly
    R = tensors.rotation_about_axis(3, np.arange(16) * 22.5)
    Cf = tensors.transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07)
    Cm = tensors.isotropic_stiffness(3.5e9, 0.35)
    C_avg = np.mean(tensors.rotate_stiffness(Cf, R), axis=0)
    S_avg = np.mean(tensors.rotate_compliance(np.linalg.inv(Cf), R), axis=0)
    V, Rb = voigt_reuss(carbon, epoxy, 0.4, orientation="random_in_plane")
    tol = 1e-10 * float(np.max(Cf))
    assert np.allclose(V.stiffness(), voigt_bound([C_avg, Cm], [0.4, 0.6]), atol=tol, rtol=0)
    assert np.allclose(Rb.stiffness(), reuss_bound([np.linalg.inv(S_avg), Cm], [0.4, 0.6]),
                       atol=tol, rtol=0)


def test_random_voigt_of_isotropic_phases_is_the_aligned_voigt(glass, epoxy):
    # an isotropic fibre looks the same in every direction: averaging changes nothing (exact)
    aligned, _ = voigt_reuss(glass, epoxy, 0.3)
    for orientation in ("random_in_plane", "random_3d"):
        V, _ = voigt_reuss(glass, epoxy, 0.3, orientation=orientation)
        assert np.allclose(V.stiffness(), aligned.stiffness(), rtol=1e-12)


def test_voigt_reuss_rejects_an_unknown_orientation(glass, epoxy):
    with pytest.raises(InputError, match="orientation = 'random': expected one of aligned, "
                       "random_in_plane, random_3d"):
        voigt_reuss(glass, epoxy, 0.3, orientation="random")


def test_hashin_shtrikman_of_equal_phases_is_the_phase():
    b = hashin_shtrikman_isotropic([5e9, 5e9, 5e9], [2e9, 2e9, 2e9], [0.2, 0.3, 0.5])
    assert all(np.isclose(v, 5e9 if k[0] == "K" else 2e9, rtol=1e-12) for k, v in b.items())


def test_three_phase_bounds_lie_inside_voigt_and_reuss():
    K, G, c = [40e9, 4e9, 160e9], [30e9, 1.5e9, 80e9], [0.2, 0.5, 0.3]
    b = hashin_shtrikman_isotropic(K, G, c)
    assert 1 / sum(ci / Ki for ci, Ki in zip(c, K, strict=True)) <= b["K_lower"] <= b["K_upper"]
    assert b["K_upper"] <= sum(ci * Ki for ci, Ki in zip(c, K, strict=True))
    assert 1 / sum(ci / Gi for ci, Gi in zip(c, G, strict=True)) <= b["G_lower"] <= b["G_upper"]


def test_two_phase_bounds_equal_hashin_shtrikman_1963_for_well_ordered_phases():
    # Hashin & Shtrikman (1963): K_L = K1 + c2 / (1/(K2 - K1) + 3 c1/(3 K1 + 4 G1)) (from memory)
    K1, G1, K2, G2, c2 = 4e9, 1.5e9, 40e9, 30e9, 0.35
    c1 = 1 - c2
    b = hashin_shtrikman_isotropic([K1, K2], [G1, G2], [c1, c2])
    K_L = K1 + c2 / (1 / (K2 - K1) + 3 * c1 / (3 * K1 + 4 * G1))
    assert float(b["K_lower"]) == pytest.approx(K_L, rel=1e-12)
    G_L = G1 + c2 / (1 / (G2 - G1) + 6 * (K1 + 2 * G1) * c1 / (5 * G1 * (3 * K1 + 4 * G1)))
    assert float(b["G_lower"]) == pytest.approx(G_L, rel=1e-12)


def test_bounds_hold_for_phases_that_are_not_well_ordered():
    # stiffer in bulk but softer in shear: Walpole's (1966) bounds still enclose the MT estimate
    from micromech.homogenize import mori_tanaka
    f = FibrePhase.isotropic(30e9, 0.45)   # K = 50 GPa, G = 10.3 GPa
    m = MatrixPhase(40e9, 0.1)             # K = 16.7 GPa, G = 18.2 GPa
    lo, hi = hashin_shtrikman(f, m, VF)
    mt = mori_tanaka(f, m, VF, "sphere")
    K_mt = mt.E1 / (3 * (1 - 2 * mt.nu12))
    assert np.all(lo.extra["K"] <= K_mt * (1 + 1e-12))
    assert np.all(K_mt <= hi.extra["K"] * (1 + 1e-12))
    assert np.all(lo.G12 <= mt.G12 * (1 + 1e-12)) and np.all(mt.G12 <= hi.G12 * (1 + 1e-12))


def test_isotropic_bounds_need_positive_moduli():
    with pytest.raises(InvalidMaterialError, match="K and G must be positive"):
        hashin_shtrikman_isotropic([0.0, 4e9], [1e9, 1e9], [0.5, 0.5])


def test_isotropic_bounds_need_isotropic_particles(carbon, epoxy):
    with pytest.raises(InvalidMaterialError, match="need an isotropic inclusion"):
        hashin_shtrikman(carbon, epoxy, 0.3)
    with pytest.raises(InvalidMaterialError, match="needs an isotropic inclusion"):
        hashin_shtrikman_spheroid(carbon, epoxy, 0.3, 5.0)


def test_spheroid_bounds_at_aspect_one_are_the_isotropic_bounds(glass, epoxy):
    # Willis (1977) reduces to Hashin-Shtrikman (1963) for spherical statistics (exact identity)
    lo, hi = hashin_shtrikman(glass, epoxy, VF)
    slo, shi = hashin_shtrikman_spheroid(glass, epoxy, VF, 1.0)
    for a, b in ((lo, slo), (hi, shi)):
        assert np.allclose(a.E1, b.E1, rtol=1e-12) and np.allclose(a.G23, b.G23, rtol=1e-12)


def test_fibre_bounds_are_the_phases_at_the_ends(carbon, epoxy):
    lo, hi = hashin_shtrikman_fibre(carbon, epoxy, np.array([0.0, 1.0]))
    for r in (lo, hi):
        assert np.allclose(r.E1, [3.5e9, 230e9]) and np.allclose(r.E2, [3.5e9, 15e9])
        assert np.allclose(r.G23, [3.5e9 / 2.7, 15e9 / 2.14])
        assert np.allclose(r.nu12, [0.35, 0.2]) and np.allclose(r.alpha2, [60e-6, 10e-6])
    assert lo.nu23 is None


def test_fibre_bounds_are_ordered_and_inside_voigt_reuss(carbon, epoxy):
    lo, hi = hashin_shtrikman_fibre(carbon, epoxy, VF)
    V, R = voigt_reuss(carbon, epoxy, VF)
    for n in ("E1", "E2", "G12", "G23"):
        assert np.all(R.get(n) <= lo.get(n) * (1 + 1e-12)), n
        assert np.all(lo.get(n) <= hi.get(n) * (1 + 1e-12)), n
        assert np.all(hi.get(n) <= V.get(n) * (1 + 1e-12)), n
    assert np.all(lo.nu12 <= hi.nu12) and np.all(lo.alpha2 <= hi.alpha2)


def test_fibre_bound_e1_uses_hills_connection(glass, epoxy):
    # Hill (1964): E1 = <E> + 4 (nu_f - nu_m)^2 / (1/k_f - 1/k_m)^2 (<1/k> - 1/k*), exact connection
    vf = 0.45
    lo, _ = hashin_shtrikman_fibre(glass, epoxy, vf)
    kf, km, k = float(glass.k23), float(epoxy.k23), float(lo.extra["k23"])
    mean_inv = vf / kf + (1 - vf) / km
    E1 = vf * 72e9 + (1 - vf) * 3.5e9 + 4 * (0.22 - 0.35) ** 2 / (1 / kf - 1 / km) ** 2 * (
        mean_inv - 1 / k)
    assert float(lo.E1) == pytest.approx(E1, rel=1e-10)
