"""Closed forms checked against symbolic algebra (sympy) instead of numbers typed from a book.

Each test derives the expression from its definition with sympy, then compares the package's
numeric function with it at seeded random points.
"""

from __future__ import annotations

import numpy as np
import pytest

sp = pytest.importorskip("sympy")

from micromech.homogenize.halpin_tsai import halpin_tsai_modulus  # noqa: E402
from micromech.laminate.plane import reduced_stiffness  # noqa: E402
from micromech.tensors import transversely_isotropic_stiffness  # noqa: E402

RNG = np.random.default_rng(20261202)


def _ti_compliance_symbols():
    E1, E2, nu12, G12, nu23 = sp.symbols("E1 E2 nu12 G12 nu23", positive=True)
    G23 = E2 / (2 * (1 + nu23))
    S = sp.zeros(6, 6)
    S[0, 0], S[1, 1], S[2, 2] = 1 / E1, 1 / E2, 1 / E2
    S[0, 1] = S[1, 0] = S[0, 2] = S[2, 0] = -nu12 / E1
    S[1, 2] = S[2, 1] = -nu23 / E2
    S[3, 3], S[4, 4], S[5, 5] = 1 / G23, 1 / G12, 1 / G12
    return (E1, E2, nu12, G12, nu23), S


def test_transversely_isotropic_stiffness_equals_symbolic_inverse_of_compliance():
    # Jones (1999), Mechanics of Composite Materials 2nd ed., Eq. (2.22): compliance of a
    # transversely isotropic solid; the stiffness is its exact inverse (derived here by sympy).
    symbols, S = _ti_compliance_symbols()
    C = sp.simplify(S[:3, :3].inv())
    f = sp.lambdify(symbols, C, "numpy")
    for _ in range(20):
        E1, E2 = RNG.uniform(5e9, 400e9), RNG.uniform(2e9, 30e9)
        nu12, nu23, G12 = RNG.uniform(0.1, 0.35), RNG.uniform(0.1, 0.45), RNG.uniform(1e9, 30e9)
        num = transversely_isotropic_stiffness(E1, E2, nu12, G12, nu23)
        np.testing.assert_allclose(num[:3, :3], np.asarray(f(E1, E2, nu12, G12, nu23), float),
                                   rtol=1e-10)
        assert num[3, 3] == pytest.approx(E2 / (2 * (1 + nu23)), rel=1e-12)


def test_plane_stress_reduced_stiffness_equals_symbolic_inverse():
    # Q = inverse of the in-plane compliance [[1/E1, -nu12/E1, 0], [-nu12/E1, 1/E2, 0],
    # [0, 0, 1/G12]] (Jones 1999, Eq. 2.61); derived by sympy, compared numerically.
    E1, E2, nu12, G12 = sp.symbols("E1 E2 nu12 G12", positive=True)
    S = sp.Matrix([[1 / E1, -nu12 / E1, 0], [-nu12 / E1, 1 / E2, 0], [0, 0, 1 / G12]])
    f = sp.lambdify((E1, E2, nu12, G12), sp.simplify(S.inv()), "numpy")
    args = (RNG.uniform(5e9, 400e9, 50), RNG.uniform(2e9, 30e9, 50),
            RNG.uniform(0.1, 0.35, 50), RNG.uniform(1e9, 30e9, 50))
    Q = reduced_stiffness(*args)
    for i in range(50):
        expected = np.asarray(f(*(a[i] for a in args)), dtype=float)
        np.testing.assert_allclose(Q[i], expected, rtol=1e-10, atol=1e-6)


def test_halpin_tsai_limits_are_the_rule_of_mixtures_and_its_inverse():
    # Halpin & Kardos (1976), Eqs. 1-2: M = Mm (1 + xi eta vf) / (1 - eta vf),
    # eta = (Mf/Mm - 1) / (Mf/Mm + xi). xi -> infinity gives Voigt, xi = 0 gives Reuss
    # (limits taken symbolically here).
    Mf, Mm, v, xi = sp.symbols("M_f M_m v xi", positive=True)
    eta = (Mf / Mm - 1) / (Mf / Mm + xi)
    M = Mm * (1 + xi * eta * v) / (1 - eta * v)
    upper = sp.simplify(sp.limit(M, xi, sp.oo))
    lower = sp.simplify(M.subs(xi, 0))
    assert sp.simplify(upper - (Mf * v + Mm * (1 - v))) == 0
    assert sp.simplify(lower - 1 / (v / Mf + (1 - v) / Mm)) == 0
    f = sp.lambdify((Mf, Mm, v, xi), M, "numpy")
    mf, mm, vf = RNG.uniform(10e9, 400e9, 30), RNG.uniform(1e9, 5e9, 30), RNG.uniform(0, 0.7, 30)
    for x in (0.0, 1.0, 2.0, 40.0):
        np.testing.assert_allclose(halpin_tsai_modulus(mf, mm, vf, x), f(mf, mm, vf, x),
                                   rtol=1e-12)
