import numpy as np
import pytest

from micromech.errors import InputError
from micromech.homogenize import (
    FibrePhase,
    MatrixPhase,
    cylinders,
    halpin_tsai,
    halpin_tsai_modulus,
    inverse_mix,
    mix,
)

# Kaw, Mechanics of Composite Materials, 2nd ed. (2006), glass/epoxy, Vf = 0.7 (from memory)
GLASS = FibrePhase.isotropic(85e9, 0.2)
EPOXY = MatrixPhase(3.4e9, 0.3)


def test_kaw_glass_epoxy_transverse_modulus_with_xi_2():
    r = halpin_tsai(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Ch. 3, Halpin-Tsai example (from memory; example number not recalled)
    assert float(r.E2) / 1e9 == pytest.approx(20.20, abs=0.01)


def test_kaw_glass_epoxy_shear_modulus_with_xi_1():
    r = halpin_tsai(GLASS, EPOXY, 0.7)
    # Kaw 2nd ed. Ch. 3, Halpin-Tsai example (from memory; example number not recalled)
    assert float(r.G12) / 1e9 == pytest.approx(6.169, abs=0.002)


def test_hand_calculation_of_the_formula():
    # eta = (25 - 1)/(25 + 2) = 8/9; E/Em = (1 + 2 (8/9) 0.6)/(1 - (8/9) 0.6)
    # (Halpin & Kardos 1976, Eqs. 1-2; hand calculation)
    eta = 8 / 9
    assert float(halpin_tsai_modulus(85e9, 3.4e9, 0.6, 2.0)) == pytest.approx(
        3.4e9 * (1 + 2 * eta * 0.6) / (1 - eta * 0.6), rel=1e-14)


def test_xi_zero_is_the_inverse_rule_and_xi_infinite_the_rule_of_mixtures():
    v = np.linspace(0, 1, 7)
    assert np.allclose(halpin_tsai_modulus(85e9, 3.4e9, v, 0.0), inverse_mix(v, 85e9, 3.4e9))
    assert np.allclose(halpin_tsai_modulus(85e9, 3.4e9, v, np.inf), mix(v, 85e9, 3.4e9))


def test_g12_with_xi_one_equals_the_cylinder_assemblage(carbon, epoxy):
    # classical identity: HT (xi = 1) G12 = Hashin-Rosen (1964) G12 = Hashin lower bound
    v = np.linspace(0, 1, 11)
    assert np.allclose(halpin_tsai(carbon, epoxy, v).G12, cylinders(carbon, epoxy, v).G12,
                       rtol=1e-12)


def test_limits_are_the_phases(carbon, epoxy):
    r = halpin_tsai(carbon, epoxy, np.array([0.0, 1.0]), aspect_ratio=20.0)
    assert np.allclose(r.E1, [3.5e9, 230e9]) and np.allclose(r.E2, [3.5e9, 15e9])
    assert np.allclose(r.G12, [3.5e9 / 2.7, 15e9])
    assert r.G23 is None and r.nu23 is None


def test_short_fibres_use_xi_two_l_over_d(glass, epoxy):
    r = halpin_tsai(glass, epoxy, 0.3, aspect_ratio=10.0)
    assert float(r.extra["xi_E1"]) == 20.0
    assert float(r.E1) == pytest.approx(float(halpin_tsai_modulus(72e9, 3.5e9, 0.3, 20.0)))
    assert float(r.E1) < float(halpin_tsai(glass, epoxy, 0.3).E1)


def test_factors_are_arguments(glass, epoxy):
    r = halpin_tsai(glass, epoxy, 0.5, xi_E2=1.0, xi_G12=0.5, xi_E1=3.0)
    assert float(r.E2) == pytest.approx(float(halpin_tsai_modulus(72e9, 3.5e9, 0.5, 1.0)))
    assert float(r.E1) == pytest.approx(float(halpin_tsai_modulus(72e9, 3.5e9, 0.5, 3.0)))


def test_negative_factor_raises(glass, epoxy):
    with pytest.raises(InputError, match="xi_E2 = -1.0: the Halpin-Tsai factor must be >= 0"):
        halpin_tsai(glass, epoxy, 0.5, xi_E2=-1.0)
    with pytest.raises(InputError, match="xi = -2: the Halpin-Tsai factor"):
        halpin_tsai_modulus(1.0, 1.0, 0.5, -2)


def test_short_fibre_aspect_ratio_below_one_raises(glass, epoxy):
    with pytest.raises(InputError, match="aspect_ratio = 0.5: the Halpin-Kardos factor 2 l/d"):
        halpin_tsai(glass, epoxy, 0.5, aspect_ratio=0.5)
