import numpy as np
import pytest

from micromech.homogenize import FibrePhase, MatrixPhase, cylinders, rule_of_mixtures

VF = np.linspace(0.0, 1.0, 11)


def test_e1_exceeds_the_rule_of_mixtures_by_the_poisson_mismatch_term(carbon, epoxy):
    # Hashin & Rosen (1964): E1 - <E1> = 4 vf vm (nuf - num)^2 / (vf/km + vm/kf + 1/Gm), exact
    r, rom = cylinders(carbon, epoxy, VF), rule_of_mixtures(carbon, epoxy, VF)
    kf, km, Gm = float(carbon.k23), float(epoxy.k23), float(epoxy.G)
    term = 4 * VF * (1 - VF) * (0.2 - 0.35) ** 2 / (VF / km + (1 - VF) / kf + 1 / Gm)
    assert np.allclose(r.E1 - rom.E1, term, rtol=1e-9, atol=1e-3)
    assert np.all(r.E1 >= rom.E1 * (1 - 1e-14))


def test_equal_poisson_ratios_give_the_rule_of_mixtures():
    f, m = FibrePhase.isotropic(72e9, 0.3), MatrixPhase(3.5e9, 0.3)
    assert np.allclose(cylinders(f, m, VF).E1, rule_of_mixtures(f, m, VF).E1, rtol=1e-14)


def test_k23_and_g12_equal_hashin_rosens_printed_forms(glass, epoxy):
    # Hashin & Rosen (1964): k* = km + vf/(1/(kf-km) + vm/(km+Gm)),
    # G12 = Gm (Gf (1+vf) + Gm vm)/(Gf vm + Gm (1+vf)) (from memory)
    r = cylinders(glass, epoxy, VF)
    kf, km, Gm, Gf = float(glass.k23), float(epoxy.k23), float(epoxy.G), float(glass.G12)
    k = km + VF / (1 / (kf - km) + (1 - VF) / (km + Gm))
    G12 = Gm * (Gf * (1 + VF) + Gm * (1 - VF)) / (Gf * (1 - VF) + Gm * (1 + VF))
    assert np.allclose(r.extra["k23"], k, rtol=1e-12)
    assert np.allclose(r.G12, G12, rtol=1e-12)


def _single_cylinder_cte(Ef, nuf, af, Em, num, am, vf):
    """Thermal strains of one composite cylinder (Lame solution, free surface, no axial force).

    Rosen & Hashin (1970): the assemblage's CTE is that of one composite cylinder. Independent
    of the code under test.
    """
    lam = lambda E, nu: E * nu / ((1 + nu) * (1 - 2 * nu))  # noqa: E731
    mu = lambda E, nu: E / (2 * (1 + nu))  # noqa: E731
    lf, mf, lm, mm = lam(Ef, nuf), mu(Ef, nuf), lam(Em, num), mu(Em, num)
    bf, bm = (3 * lf + 2 * mf) * af, (3 * lm + 2 * mm) * am
    a2, b2 = vf, 1.0
    a = np.sqrt(a2)
    M = np.array([
        [a, -a, -1 / a, 0],                                    # u continuous at r = a
        [2 * (lf + mf), -2 * (lm + mm), 2 * mm / a2, lf - lm],  # sigma_rr continuous
        [0, 2 * (lm + mm), -2 * mm / b2, lm],                  # sigma_rr(b) = 0
        [2 * lf * a2, 2 * lm * (b2 - a2), 0, (lf + 2 * mf) * a2 + (lm + 2 * mm) * (b2 - a2)],
    ])
    rhs = np.array([0, bf - bm, bm, bf * a2 + bm * (b2 - a2)])
    A, B, C, e = np.linalg.solve(M, rhs)
    return e, B + C / b2


@pytest.mark.parametrize("vf", [0.1, 0.4, 0.65])
def test_cte_equals_the_composite_cylinder_elasticity_solution(vf):
    f, m = FibrePhase.isotropic(72e9, 0.22, 5e-6), MatrixPhase(3.5e9, 0.35, 60e-6)
    a1, a2 = _single_cylinder_cte(72e9, 0.22, 5e-6, 3.5e9, 0.35, 60e-6, vf)
    r = cylinders(f, m, vf)
    assert float(r.alpha1) == pytest.approx(a1, rel=1e-10)
    assert float(r.alpha2) == pytest.approx(a2, rel=1e-10)


def test_limits_are_the_phases(carbon, epoxy):
    r = cylinders(carbon, epoxy, np.array([0.0, 1.0]))
    assert np.allclose(r.E2, [3.5e9, 15e9]) and np.allclose(r.nu23, [0.35, 0.07])
