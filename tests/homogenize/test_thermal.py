import numpy as np
import pytest

from micromech.errors import InputError
from micromech.homogenize import (
    FibrePhase,
    MatrixPhase,
    hashin_shtrikman,
    levin,
    levin_fibre,
    mori_tanaka,
    schapery,
)
from micromech.homogenize import walpole as W

# Kaw, Mechanics of Composite Materials, 2nd ed. (2006), glass/epoxy (from memory):
# Ef = 85 GPa, nuf = 0.2, alphaf = 5e-6; Em = 3.4 GPa, num = 0.3, alpham = 63e-6; Vf = 0.7
GLASS = FibrePhase.isotropic(85e9, 0.2, 5e-6)
EPOXY = MatrixPhase(3.4e9, 0.3, 63e-6)


def test_kaw_glass_epoxy_axial_cte():
    a1, _ = schapery(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Ch. 3, Schapery CTE example (from memory; example number not recalled)
    assert float(a1) * 1e6 == pytest.approx(5.978, abs=5e-4)


def test_kaw_glass_epoxy_transverse_cte():
    _, a2 = schapery(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Ch. 3, Schapery CTE example (from memory; example number not recalled)
    assert float(a2) * 1e6 == pytest.approx(27.40, abs=0.01)


def test_schapery_limits_are_the_phases(carbon, epoxy):
    a1, a2 = schapery(carbon, epoxy, np.array([0.0, 1.0]))
    assert np.allclose(a1, [60e-6, -0.5e-6]) and np.allclose(a2, [60e-6, 10e-6])


def test_schapery_needs_ctes():
    with pytest.raises(InputError, match="schapery: needs the CTEs of both phases"):
        schapery(FibrePhase.isotropic(85e9, 0.2), EPOXY, 0.5)
    with pytest.raises(InputError, match="levin_fibre: needs the CTEs"):
        levin_fibre(W.identity(), FibrePhase.isotropic(85e9, 0.2), EPOXY, 0.5)


def test_levin_relation_hand_value():
    # alpha = <alpha> + (af - am)/(1/Kf - 1/Km)(1/K - <1/K>), Levin (1967); hand calculation
    assert float(levin(40e9, 4e9, 5e-6, 60e-6, 0.3, 6.5e9)) * 1e6 == pytest.approx(36.496, abs=1e-3)


def test_levin_with_equal_bulk_moduli_gives_the_volume_average():
    assert float(levin(5e9, 5e9, 1e-6, 9e-6, 0.25, 5e9)) == pytest.approx(7e-6)


def test_levin_at_the_voigt_and_reuss_bulk_moduli():
    # K* = Reuss gives the volume average (uniform stress): exact
    c, Kf, Km = 0.4, 40e9, 4e9
    KR = 1 / (c / Kf + (1 - c) / Km)
    assert float(levin(Kf, Km, 5e-6, 60e-6, c, KR)) == pytest.approx(0.4 * 5e-6 + 0.6 * 60e-6)


def test_spheres_cte_lies_in_the_levin_hashin_shtrikman_bounds(glass, epoxy):
    # Rosen & Hashin (1970): HS bounds on K bound the CTE through Levin's relation
    v = np.linspace(0, 1, 21)
    lo, hi = hashin_shtrikman(glass, epoxy, v)
    mt = mori_tanaka(glass, epoxy, v, "sphere")
    assert np.all(lo.alpha1 <= mt.alpha1 * (1 + 1e-12))
    assert np.all(mt.alpha1 <= hi.alpha1 * (1 + 1e-12))


def test_levin_fibre_reproduces_mori_tanakas_cte(carbon, epoxy):
    v = np.array([0.2, 0.6])
    mt = mori_tanaka(carbon, epoxy, v)
    S = W.inv(W.from_engineering(mt.E1, mt.E2, mt.nu12, mt.G12, mt.nu23))
    a1, a2 = levin_fibre(S, carbon, epoxy, v)
    assert np.allclose(a1, mt.alpha1, rtol=1e-10) and np.allclose(a2, mt.alpha2, rtol=1e-10)


def test_identical_phases_with_different_ctes_give_the_volume_average():
    # singular (S_f - S_m): the uniform-field relation still holds with any solution
    f, m = FibrePhase.isotropic(3.4e9, 0.3, 5e-6), MatrixPhase(3.4e9, 0.3, 63e-6)
    r = mori_tanaka(f, m, 0.3)
    assert float(r.alpha1) == pytest.approx(0.3 * 5e-6 + 0.7 * 63e-6, rel=1e-12)
