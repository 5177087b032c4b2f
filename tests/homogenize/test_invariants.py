"""Property tests: bounds order the estimates for random admissible phases at every fraction."""

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech import tensors
from micromech.homogenize import (
    FibrePhase,
    MatrixPhase,
    chamis,
    cylinders,
    halpin_tsai,
    hashin_shtrikman,
    hashin_shtrikman_fibre,
    hashin_shtrikman_spheroid,
    mori_tanaka,
    rule_of_mixtures,
    voigt_reuss,
)

VF = np.linspace(0.0, 1.0, 21)
TOL = 1e-9

moduli = st.floats(1e8, 1e12)
poisson = st.floats(-0.9, 0.49)


def _le(a, b, atol=1e-300):
    a, b = np.asarray(a), np.asarray(b)
    return bool(np.all(a <= b + TOL * np.abs(b) + atol))


def _finite(r):
    for k in ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23", "alpha1", "alpha2"):
        v = r.get(k)
        assert v is None or np.all(np.isfinite(v)), (r.model, k)


@settings(max_examples=60, deadline=None)
@given(Ef=moduli, nuf=poisson, Em=moduli, num=poisson)
def test_spheres_reuss_hs_mt_hs_voigt_chain(Ef, nuf, Em, num):
    f, m = FibrePhase.isotropic(Ef, nuf, 1e-6), MatrixPhase(Em, num, 5e-5)
    V, R = voigt_reuss(f, m, VF)
    lo, hi = hashin_shtrikman(f, m, VF)
    mt = mori_tanaka(f, m, VF, "sphere")
    # bulk and shear moduli in the order Reuss <= HS lower <= MT <= HS upper <= Voigt
    # (Hill 1952; Hashin & Shtrikman 1963; Walpole 1966); MT lies inside for any phase ordering
    def KG(r):
        return r.E1 / (3 * (1 - 2 * r.nu12)), r.G12
    chain = [KG(R), (lo.extra["K"], lo.G12), KG(mt), (hi.extra["K"], hi.G12), KG(V)]
    for a, b in zip(chain, chain[1:], strict=False):
        assert _le(a[0], b[0]) and _le(a[1], b[1])
    for r in (V, R, lo, hi, mt):
        _finite(r)
    C = mt.stiffness()
    assert np.all(tensors.is_symmetric(C, 1e-8)) and np.all(tensors.is_positive_definite(C))
    assert np.allclose(mt.E1[[0, -1]], [Em, Ef], rtol=1e-9)


fibre_params = st.tuples(moduli, st.floats(0.02, 1.0), st.floats(0.0, 0.45), st.floats(0.02, 1.0),
                         st.floats(-0.5, 0.9))


@settings(max_examples=60, deadline=None)
@given(fp=fibre_params, Em=moduli, num=poisson)
def test_fibre_bounds_order_every_continuous_estimate(fp, Em, num):
    E1, r2, nu12, rg, nu23 = fp
    E2 = E1 * r2
    nu23 = min(nu23, 0.98 * (1 - 2 * nu12**2 * E2 / E1))
    f = FibrePhase(E1, E2, nu12, E1 * rg * 0.5, nu23, -1e-6, 1e-5)
    m = MatrixPhase(Em, num, 5e-5)
    V, R = voigt_reuss(f, m, VF)
    lo, hi = hashin_shtrikman_fibre(f, m, VF)
    mt = mori_tanaka(f, m, VF)
    for n in ("E1", "E2", "G12", "G23"):
        assert _le(R.get(n), lo.get(n)) and _le(lo.get(n), hi.get(n)), n
        assert _le(hi.get(n), V.get(n)), n
        assert _le(R.get(n), mt.get(n)) and _le(mt.get(n), V.get(n)), n
        assert _le(lo.get(n), mt.get(n)) and _le(mt.get(n), hi.get(n)), n
    assert _le(lo.nu12, mt.nu12, 1e-9) and _le(mt.nu12, hi.nu12, 1e-9)
    for r in (V, R, lo, hi, mt, cylinders(f, m, VF), rule_of_mixtures(f, m, VF), chamis(f, m, VF),
              halpin_tsai(f, m, VF)):
        _finite(r)
        for n in ("E1", "E2", "G12"):
            assert np.all(r.get(n) > 0), (r.model, n)
    for r in (V, R, mt):
        C = r.stiffness()
        assert np.all(tensors.is_symmetric(C, 1e-8)) and np.all(tensors.is_positive_definite(C))


@settings(max_examples=40, deadline=None)
@given(Ef=moduli, nuf=poisson, Em=moduli, num=poisson, ar=st.floats(0.01, 1e4),
       orientation=st.sampled_from(["aligned", "random_in_plane", "random_3d"]))
def test_spheroid_estimates_are_admissible(Ef, nuf, Em, num, ar, orientation):
    f, m = FibrePhase.isotropic(Ef, nuf, 1e-6), MatrixPhase(Em, num, 5e-5)
    mt = mori_tanaka(f, m, VF, "spheroid", ar, orientation=orientation)
    _finite(mt)
    C = mt.stiffness()
    assert np.all(tensors.is_symmetric(C, 1e-8)) and np.all(tensors.is_positive_definite(C))
    V, R = voigt_reuss(f, m, VF)
    for n in ("E1", "E2", "E3", "G12", "G23"):
        assert _le(R.get(n), mt.get(n)) and _le(mt.get(n), V.get(n)), n
    if orientation == "aligned":
        # Willis (1977) bounds for spheroidal statistics enclose MT; all inside Voigt-Reuss
        lo, hi = hashin_shtrikman_spheroid(f, m, VF, ar)
        for n in ("E1", "E2", "G12", "G23"):
            assert _le(R.get(n), lo.get(n)) and _le(lo.get(n), mt.get(n)), n
            assert _le(mt.get(n), hi.get(n)) and _le(hi.get(n), V.get(n)), n


@settings(max_examples=60, deadline=None)
@given(Ef=moduli, nuf=poisson, Em=st.floats(1e8, 1e12), num=poisson,
       vf=st.lists(st.floats(0.0, 1.0), min_size=1, max_size=8))
def test_stiff_spheres_order_reuss_hs_mori_tanaka_hs_voigt_at_random_fractions(Ef, nuf, Em, num,
                                                                                vf):
    # stiff inclusions (K_f >= K_m, G_f >= G_m): Reuss <= HS lower = MT <= HS upper <= Voigt
    # for K, G and so for E = 9KG/(3K + G), increasing in both (Hill 1952; Hashin & Shtrikman
    # 1963; Weng 1984)
    f, m = FibrePhase.isotropic(Ef, nuf), MatrixPhase(Em, num)
    Kf, Km = Ef / (3 * (1 - 2 * nuf)), Em / (3 * (1 - 2 * num))
    if not (Kf >= Km and float(f.G12) >= float(m.G)):
        f, m = FibrePhase.isotropic(Em, num), MatrixPhase(Ef, nuf)  # swap: stiff inclusions
        Kf, Km = Km, Kf
    if not (Kf >= Km and float(f.G12) >= float(m.G)):
        return  # phases not well ordered: covered by the chain test above
    c = np.array(vf)
    V, R = voigt_reuss(f, m, c)
    lo, hi = hashin_shtrikman(f, m, c)
    mt = mori_tanaka(f, m, c, "sphere")
    for n in ("E1", "G12"):
        chain = [R.get(n), lo.get(n), mt.get(n), hi.get(n), V.get(n)]
        for a, b in zip(chain, chain[1:], strict=False):
            assert _le(a, b, atol=1e-6), n
    for r in (V, R, lo, hi, mt):
        _finite(r)
        C = r.stiffness()
        assert np.all(tensors.is_symmetric(C, 1e-8)) and np.all(tensors.is_positive_definite(C))
