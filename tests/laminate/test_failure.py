"""Ply failure criteria: a published lamina example, uniaxial identities and ray solutions."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import InputError
from micromech.laminate import (
    CRITERIA,
    PlyStrengths,
    evaluate_criterion,
    hashin,
    max_strain,
    max_stress,
    stress_transformation,
    tsai_hill,
    tsai_wu,
)

# Graphite/epoxy strengths, Kaw (2006), 2nd ed., Table 2.1 (from memory), Pa
S = PlyStrengths(Xt=1500e6, Xc=1500e6, Yt=40e6, Yc=246e6, S12=68e6)
COMPLIANCE = np.array([[1 / 181e9, -0.28 / 181e9, 0], [-0.28 / 181e9, 1 / 10.3e9, 0],
                       [0, 0, 1 / 7.17e9]])
MPA = 1e6


def _ratio(name, stress, thermal=None, strengths=S, **kw):
    return evaluate_criterion(name, stress, strengths, compliance=COMPLIANCE, thermal=thermal,
                              **kw)


# --- published example ------------------------------------------------------------------------

def test_sixty_degree_graphite_epoxy_lamina_strength_ratios():
    # sigma_x = 2, sigma_y = -3, tau_xy = 4 MPa on a 60-degree graphite/epoxy lamina:
    # Kaw (2006), 2nd ed., Sec. 2.9 worked examples (from memory): local stresses 1.714, -2.714,
    # -4.165 MPa; strength ratio 16.33 (maximum stress and maximum strain), 16.06 (Tsai-Hill),
    # 22.39 (Tsai-Wu with F12 = -1/2 sqrt(F11 F22)); 4 digits
    s = stress_transformation(60.0) @ np.array([2.0, -3.0, 4.0]) * MPA
    np.testing.assert_allclose(s / MPA, [1.714, -2.714, -4.165], rtol=5e-4)
    assert float(_ratio("max_stress", s).strength_ratio) == pytest.approx(16.33, rel=5e-4)
    assert float(_ratio("max_strain", s).strength_ratio) == pytest.approx(16.33, rel=5e-4)
    assert float(_ratio("tsai_hill", s).strength_ratio) == pytest.approx(16.06, rel=5e-4)
    assert float(_ratio("tsai_wu", s).strength_ratio) == pytest.approx(22.39, rel=5e-4)
    assert str(_ratio("max_stress", s).mode) == "shear"


# --- uniaxial identities ------------------------------------------------------------------------

UNIAXIAL = [  # stress direction, expected strength ratio (exact identity), mode
    ((1.0, 0, 0), S.Xt, "fibre_tension"),
    ((-1.0, 0, 0), S.Xc, "fibre_compression"),
    ((0, 1.0, 0), S.Yt, "matrix_tension"),
    ((0, -1.0, 0), S.Yc, "matrix_compression"),
]


@pytest.mark.parametrize("criterion", CRITERIA)
@pytest.mark.parametrize(("direction", "strength", "mode"), UNIAXIAL)
def test_uniaxial_stress_fails_at_the_strength(criterion, direction, strength, mode):
    r = _ratio(criterion, np.array(direction))
    assert float(r.strength_ratio) == pytest.approx(strength, rel=1e-12)
    assert str(r.mode) == mode
    assert float(r.index) == pytest.approx(1.0 / strength, rel=1e-12)


@pytest.mark.parametrize("criterion", CRITERIA)
def test_pure_shear_fails_at_the_shear_strength(criterion):
    r = _ratio(criterion, np.array([0.0, 0.0, -1.0]))
    assert float(r.strength_ratio) == pytest.approx(S.S12, rel=1e-12)
    assert str(r.mode) in ("shear", "matrix_tension")  # Hashin names the matrix mode


def test_tsai_wu_interaction_term_under_equal_biaxial_tension():
    # F11 s^2 + F22 s^2 + 2 F12 s^2 + (F1 + F2) s = 1 with F12 = f* sqrt(F11 F22)
    # (Tsai and Wu 1971, Eq. (1); Tsai and Hahn 1980, Sec. 7.3), solved by hand
    F1, F2 = 1 / S.Xt - 1 / S.Xc, 1 / S.Yt - 1 / S.Yc
    F11, F22 = 1 / (S.Xt * S.Xc), 1 / (S.Yt * S.Yc)
    for f in (-0.5, 0.0, 0.3):
        a = F11 + F22 + 2 * f * np.sqrt(F11 * F22)
        b = F1 + F2
        expected = (-b + np.sqrt(b * b + 4 * a)) / (2 * a)
        got = float(tsai_wu(np.array([1.0, 1.0, 0.0]), S, f12_star=f).strength_ratio)
        assert got == pytest.approx(expected, rel=1e-12)


def test_hashin_matrix_compression_uses_the_transverse_shear_strength():
    s = np.array([0.0, -1.0, 0.0]) * MPA
    # Hashin (1980), plane-stress matrix compression: (s22/2ST)^2 + [(Yc/2ST)^2 - 1] s22/Yc = 1
    # solved by hand for s22 at failure with ST = 60 MPa
    ST = 60e6
    a = 1 / (2 * ST) ** 2
    b = -((S.Yc / (2 * ST)) ** 2 - 1) / S.Yc
    expected = (-b + np.sqrt(b * b + 4 * a)) / (2 * a) / MPA
    with_st = PlyStrengths(S.Xt, S.Xc, S.Yt, S.Yc, S.S12, S23=ST)
    assert float(hashin(s, with_st).strength_ratio) == pytest.approx(expected, rel=1e-12)
    assert float(hashin(s, S).strength_ratio) == pytest.approx(S.Yc / MPA, rel=1e-12)


# --- invariants ---------------------------------------------------------------------------------

stress = st.lists(st.floats(-300, 300), min_size=3, max_size=3).map(
    lambda v: np.array(v) * MPA).filter(lambda v: np.any(np.abs(v) > 1e3))


@settings(max_examples=80, deadline=None)
@given(stress, st.floats(0.01, 100.0), st.sampled_from(CRITERIA))
def test_strength_ratio_scales_as_one_over_load(s, k, criterion):
    r1 = float(_ratio(criterion, s).strength_ratio)
    rk = float(_ratio(criterion, k * s).strength_ratio)
    assert rk == pytest.approx(r1 / k, rel=1e-9)


def _criterion_value(name, s):
    """Independent evaluation of each criterion's failure function at stress s (..., 3)."""
    s1, s2, t = s[..., 0], s[..., 1], s[..., 2]
    if name == "max_stress":
        return np.maximum.reduce([np.where(s1 >= 0, s1 / S.Xt, -s1 / S.Xc),
                                  np.where(s2 >= 0, s2 / S.Yt, -s2 / S.Yc), np.abs(t) / S.S12])
    if name == "tsai_hill":
        X = np.where(s1 >= 0, S.Xt, S.Xc)
        Y = np.where(s2 >= 0, S.Yt, S.Yc)
        return (s1 / X) ** 2 - s1 * s2 / X**2 + (s2 / Y) ** 2 + (t / S.S12) ** 2
    if name == "tsai_wu":
        F11, F22 = 1 / (S.Xt * S.Xc), 1 / (S.Yt * S.Yc)
        return ((1 / S.Xt - 1 / S.Xc) * s1 + (1 / S.Yt - 1 / S.Yc) * s2 + F11 * s1**2
                + F22 * s2**2 + t**2 / S.S12**2 - np.sqrt(F11 * F22) * s1 * s2)
    ST = S.Yc / 2
    ft = np.where(s1 >= 0, (s1 / S.Xt) ** 2 + (t / S.S12) ** 2, 0.0)
    fc = np.where(s1 < 0, (s1 / S.Xc) ** 2, 0.0)
    mt = np.where(s2 >= 0, (s2 / S.Yt) ** 2 + (t / S.S12) ** 2, 0.0)
    mc = np.where(s2 < 0, (s2 / (2 * ST)) ** 2 + ((S.Yc / (2 * ST)) ** 2 - 1) * s2 / S.Yc
                  + (t / S.S12) ** 2, 0.0)
    return np.maximum.reduce([ft, fc, mt, mc])


@settings(max_examples=80, deadline=None)
@given(stress, stress.map(lambda v: 0.2 * v), st.sampled_from(
    ["max_stress", "tsai_hill", "tsai_wu", "hashin"]))
def test_residual_stress_is_held_fixed_and_the_ratio_is_the_first_crossing(sM, sT, criterion):
    R = float(_ratio(criterion, sM, thermal=sT).strength_ratio)
    if _criterion_value(criterion, sT) >= 1.0:
        assert R == 0.0
        return
    assert np.isfinite(R) and R > 0
    lam = np.linspace(0.0, R, 2001)[:-1]
    path = sT + lam[:, None] * sM
    assert np.all(_criterion_value(criterion, path) < 1.0 + 1e-9)
    at = _criterion_value(criterion, sT + R * sM)
    just_after = _criterion_value(criterion, sT + R * (1 + 1e-6) * sM)
    assert at >= 1.0 - 1e-7 or just_after >= 1.0


def test_residual_stress_alone_beyond_strength_gives_zero_ratio():
    r = max_stress(np.array([1.0, 0, 0]), S, thermal=np.array([0.0, 50e6, 0.0]))
    assert float(r.strength_ratio) == 0.0 and float(r.index) == np.inf
    assert str(r.mode) == "matrix_tension"


def test_no_load_never_fails():
    for c in CRITERIA:
        r = _ratio(c, np.zeros(3))
        assert float(r.strength_ratio) == np.inf and float(r.index) == 0.0
        assert str(r.mode) == "none"


def test_criteria_broadcast_over_stress_and_strength_arrays():
    s = np.random.default_rng(3).normal(size=(4, 5, 3)) * 50 * MPA
    strengths = PlyStrengths(Xt=np.full((5,), 1.5e9), Xc=1.2e9, Yt=40e6, Yc=200e6, S12=70e6)
    for c in CRITERIA:
        r = _ratio(c, s, strengths=strengths)
        assert r.strength_ratio.shape == (4, 5) and r.mode.shape == (4, 5)


# --- errors -------------------------------------------------------------------------------------

def test_missing_strengths_are_named():
    with pytest.raises(InputError, match=r"tsai_wu: ply strengths are needed"):
        tsai_wu(np.ones(3), None)
    with pytest.raises(InputError, match=r"hashin: strength Yc, S12 missing"):
        hashin(np.ones(3), PlyStrengths(Xt=1e9, Xc=1e9, Yt=1e7))
    with pytest.raises(InputError, match=r"max_stress: strength Xc missing"):
        max_stress(np.ones(3), PlyStrengths(Xt=1e9, Yt=1e7, Yc=1e8, S12=1e7))
    with pytest.raises(InputError, match=r"tsai_hill: strength S12 missing"):
        tsai_hill(np.ones(3), PlyStrengths(Xt=1e9, Xc=1e9, Yt=1e7, Yc=1e8))
    with pytest.raises(InputError, match=r"max_strain: strength Yt missing"):
        max_strain(np.ones(3), PlyStrengths(Xt=1e9, Xc=1e9, Yc=1e8, S12=1e7), COMPLIANCE)


def test_bad_arguments_are_refused():
    with pytest.raises(InputError, match=r"f12_star = -1.0: must lie in \(-1, 1\)"):
        tsai_wu(np.ones(3), S, f12_star=-1.0)
    with pytest.raises(InputError, match=r"stress: expected shape \(\.\.\., 3\)"):
        max_stress(np.ones(4), S)
    with pytest.raises(InputError, match=r"thermal: expected shape \(\.\.\., 3\)"):
        max_stress(np.ones(3), S, thermal=np.ones(2))
    with pytest.raises(InputError, match="max_strain: the ply compliance is needed"):
        evaluate_criterion("max_strain", np.ones(3), S)
    with pytest.raises(InputError, match=r"compliance: expected shape \(\.\.\., 3, 3\)"):
        max_strain(np.ones(3), S, np.eye(2))
    with pytest.raises(InputError, match="unknown 'puck'; choose one of max_stress"):
        evaluate_criterion("puck", np.ones(3), S)


@pytest.mark.parametrize("criterion", CRITERIA)
@pytest.mark.parametrize("k", [1e-300, 1e-150, 1e150, 1e300])
def test_extreme_loads_neither_overflow_nor_underflow(criterion, k):
    s = np.array([120e6, -30e6, 20e6])
    thermal = np.array([5e6, 10e6, 0.0])
    r1 = float(_ratio(criterion, s, thermal=thermal).strength_ratio)
    with np.errstate(all="raise"):  # no overflow, underflow to zero or invalid operation
        rk = float(_ratio(criterion, k * s, thermal=thermal).strength_ratio)
    assert np.isfinite(rk) and rk == pytest.approx(r1 / k, rel=1e-12)  # exact scaling 1/load
