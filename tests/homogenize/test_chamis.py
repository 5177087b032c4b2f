import numpy as np
import pytest

from micromech.homogenize import FibrePhase, MatrixPhase, chamis


def test_hand_calculation_of_the_square_root_formulas(carbon, epoxy):
    # Chamis (1983) NASA TM-83320, E22 = Em / (1 - sqrt(vf)(1 - Em/Ef22)) (from memory)
    r = chamis(carbon, epoxy, 0.64)
    assert float(r.E2) == pytest.approx(3.5e9 / (1 - 0.8 * (1 - 3.5 / 15)), rel=1e-14)
    Gm = 3.5e9 / 2.7
    assert float(r.G12) == pytest.approx(Gm / (1 - 0.8 * (1 - Gm / 15e9)), rel=1e-14)
    assert float(r.G23) == pytest.approx(Gm / (1 - 0.8 * (1 - Gm / (15e9 / 2.14))), rel=1e-14)
    assert float(r.E1) == pytest.approx(0.64 * 230e9 + 0.36 * 3.5e9, rel=1e-14)


def test_glass_epoxy_hand_value(glass, epoxy):
    # 3.5 / (1 - sqrt(0.6)(1 - 3.5/72)) GPa = 13.305 GPa, hand calculation
    assert float(chamis(glass, epoxy, 0.6).E2) / 1e9 == pytest.approx(13.305, abs=5e-4)


def test_limits_are_the_phases(carbon, epoxy):
    r = chamis(carbon, epoxy, np.array([0.0, 1.0]))
    assert np.allclose(r.E2, [3.5e9, 15e9]) and np.allclose(r.nu23, [0.35, 0.07])
    assert np.allclose(r.alpha1, [60e-6, -0.5e-6]) and np.allclose(r.alpha2, [60e-6, 10e-6])


def test_no_cte_without_phase_ctes():
    r = chamis(FibrePhase.isotropic(72e9, 0.2), MatrixPhase(3e9, 0.3), 0.5)
    assert r.alpha1 is None
