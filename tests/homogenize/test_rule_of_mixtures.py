import numpy as np
import pytest

from micromech.errors import FractionError
from micromech.homogenize import FibrePhase, MatrixPhase, inverse_mix, mix, rule_of_mixtures

# Kaw, Mechanics of Composite Materials, 2nd ed. (2006), glass/epoxy of Tables 3.1-3.2
# (from memory): Ef = 85 GPa, nuf = 0.2, Em = 3.4 GPa, num = 0.3, Vf = 0.7.
GLASS = FibrePhase.isotropic(85e9, 0.2, 5e-6)
EPOXY = MatrixPhase(3.4e9, 0.3, 63e-6)


def test_kaw_glass_epoxy_longitudinal_modulus():
    r = rule_of_mixtures(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Example 3.3 (from memory)
    assert float(r.E1) / 1e9 == pytest.approx(60.52, abs=0.005)


def test_kaw_glass_epoxy_transverse_modulus():
    r = rule_of_mixtures(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Example 3.4 (from memory)
    assert float(r.E2) / 1e9 == pytest.approx(10.37, abs=0.005)


def test_kaw_glass_epoxy_major_poisson_ratio():
    r = rule_of_mixtures(GLASS, EPOXY, 0.7)
    assert float(r.nu12) == pytest.approx(0.23, abs=1e-12)  # Kaw 2nd ed. Example 3.5 (from memory)


def test_kaw_glass_epoxy_in_plane_shear_modulus():
    r = rule_of_mixtures(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Example 3.6 (from memory)
    assert float(r.G12) / 1e9 == pytest.approx(4.014, abs=0.001)


def test_limits_are_the_phases(carbon, epoxy):
    r = rule_of_mixtures(carbon, epoxy, np.array([0.0, 1.0]))
    assert np.allclose(r.E1, [3.5e9, 230e9]) and np.allclose(r.E2, [3.5e9, 15e9])
    assert np.allclose(r.G23, [3.5e9 / 2.7, 15e9 / 2.14]) and np.allclose(r.nu23, [0.35, 0.07])
    assert np.allclose(r.alpha1, [60e-6, -0.5e-6]) and np.allclose(r.alpha2, [60e-6, 10e-6])


def test_mix_and_inverse_mix():
    assert float(mix(0.25, 8.0, 4.0)) == 5.0
    assert float(inverse_mix(0.5, 2.0, 6.0)) == pytest.approx(3.0)


def test_no_cte_without_phase_ctes():
    r = rule_of_mixtures(FibrePhase.isotropic(85e9, 0.2), MatrixPhase(3.4e9, 0.3), 0.5)
    assert r.alpha1 is None and r.alpha2 is None


def test_fraction_is_checked():
    with pytest.raises(FractionError, match="vf = 1.01 must lie in"):
        rule_of_mixtures(GLASS, EPOXY, 1.01)
