"""Tests of micromech.tensors: 6x6 builders, engineering constants, rotations, checks.

Exact identities are used throughout (round trips, rotation group properties, the eigenvalues
of an isotropic stiffness, C44 = (C22 - C23) / 2 for transverse isotropy). Closed forms:
Lame constants lambda = E nu / ((1 + nu)(1 - 2 nu)), mu = E / (2 (1 + nu)) (any elasticity text,
e.g. Timoshenko and Goodier 1970, 3rd ed., Sec. 6); compliance of an orthotropic solid from
Jones (1999), 2nd ed., Eq. (2.21).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import InputError, InvalidMaterialError
from micromech.tensors import (
    bond_matrix,
    check_stiffness,
    engineering_constants,
    from_mandel,
    is_positive_definite,
    is_symmetric,
    isotropic_compliance,
    isotropic_stiffness,
    orthotropic_compliance,
    orthotropic_stiffness,
    rotate_compliance,
    rotate_stiffness,
    rotation_about_axis,
    symmetry_error,
    to_mandel,
    transversely_isotropic_compliance,
    transversely_isotropic_stiffness,
)

NAMES = ("E1", "E2", "E3", "G23", "G13", "G12", "nu23", "nu13", "nu12")

modulus = st.floats(min_value=1e9, max_value=5e11)
shear = st.floats(min_value=2e8, max_value=2e11)
scaled_nu = st.floats(min_value=-0.45, max_value=0.45)
angle = st.floats(min_value=-720.0, max_value=720.0)
SETTINGS = settings(max_examples=60, deadline=None)


@st.composite
def orthotropic_constants(draw):
    """Nine admissible constants: |nu_ij sqrt(E_j / E_i)| <= 0.45 keeps the energy positive."""
    E1, E2, E3 = draw(modulus), draw(modulus), draw(modulus)
    G23, G13, G12 = draw(shear), draw(shear), draw(shear)
    nu23 = draw(scaled_nu) * np.sqrt(E2 / E3)
    nu13 = draw(scaled_nu) * np.sqrt(E1 / E3)
    nu12 = draw(scaled_nu) * np.sqrt(E1 / E2)
    return dict(zip(NAMES, (E1, E2, E3, G23, G13, G12, nu23, nu13, nu12), strict=True))


@st.composite
def ti_constants(draw):
    E1, E2, G12 = draw(modulus), draw(modulus), draw(shear)
    nu12 = draw(scaled_nu) * np.sqrt(E1 / E2)
    nu23 = draw(st.floats(min_value=-0.9, max_value=0.9)) * (1 - 2 * nu12**2 * E2 / E1)
    return dict(E1=E1, E2=E2, nu12=nu12, G12=G12, nu23=nu23)


def rel(a, b):
    return np.max(np.abs(np.asarray(a) - np.asarray(b))) / np.max(np.abs(np.asarray(b)))


# --- builders and round trips -----------------------------------------------------------------


@SETTINGS
@given(orthotropic_constants())
def test_orthotropic_constants_round_trip_to_1e12(c):
    back = engineering_constants(orthotropic_stiffness(**c))
    for k, v in c.items():
        assert back[k] == pytest.approx(v, rel=1e-12, abs=1e-12), k


@SETTINGS
@given(ti_constants())
def test_transversely_isotropic_constants_round_trip_to_1e12(c):
    back = engineering_constants(transversely_isotropic_stiffness(**c))
    G23 = c["E2"] / (2 * (1 + c["nu23"]))
    expected = dict(c, E3=c["E2"], G13=c["G12"], nu13=c["nu12"], G23=G23)
    for k, v in expected.items():
        assert back[k] == pytest.approx(v, rel=1e-12, abs=1e-12), k


@SETTINGS
@given(ti_constants())
def test_transversely_isotropic_stiffness_has_c44_equal_half_c22_minus_c23(c):
    C = transversely_isotropic_stiffness(**c)
    assert C[3, 3] == pytest.approx((C[1, 1] - C[1, 2]) / 2, rel=1e-10)  # exact identity


@SETTINGS
@given(modulus, st.floats(min_value=-0.95, max_value=0.49))
def test_isotropic_stiffness_is_inverse_of_isotropic_compliance(E, nu):
    C = isotropic_stiffness(E, nu)
    assert rel(C @ isotropic_compliance(E, nu), np.eye(6)) < 1e-10


def test_isotropic_stiffness_equals_lame_form():
    E, nu = 70e9, 0.3  # Lame constants, Timoshenko and Goodier (1970) Sec. 6
    lam, mu = E * nu / ((1 + nu) * (1 - 2 * nu)), E / (2 * (1 + nu))
    C = isotropic_stiffness(E, nu)
    assert C[0, 0] == pytest.approx(lam + 2 * mu, rel=1e-14)
    assert C[0, 1] == pytest.approx(lam, rel=1e-14)
    assert C[5, 5] == pytest.approx(mu, rel=1e-14)
    assert C[0, 3] == 0.0


def test_isotropic_c11_for_unit_modulus_and_quarter_poisson():
    # E (1 - nu) / ((1 + nu)(1 - 2 nu)) = 0.75 / 0.625 = 1.2 exactly
    assert isotropic_stiffness(1.0, 0.25)[0, 0] == pytest.approx(1.2, rel=1e-15)


def test_orthotropic_compliance_entries_follow_jones_eq_2_21():
    S = orthotropic_compliance(140e9, 10e9, 9e9, 3.5e9, 5e9, 5.5e9, 0.45, 0.28, 0.3)
    assert S[0, 0] == 1 / 140e9
    assert S[2, 2] == 1 / 9e9
    assert S[3, 3] == 1 / 3.5e9 and S[4, 4] == 1 / 5e9 and S[5, 5] == 1 / 5.5e9
    assert S[0, 1] == -0.3 / 140e9 and S[0, 2] == -0.28 / 140e9 and S[1, 2] == -0.45 / 10e9
    assert is_symmetric(S)


def test_transversely_isotropic_equals_orthotropic_with_tied_constants():
    E1, E2, nu12, G12, nu23 = 230e9, 15e9, 0.2, 15e9, 0.07
    G23 = E2 / (2 * (1 + nu23))
    a = transversely_isotropic_compliance(E1, E2, nu12, G12, nu23)
    b = orthotropic_compliance(E1, E2, E2, G23, G12, G12, nu23, nu12, nu12)
    assert rel(a, b) < 1e-15


def test_builders_broadcast_over_leading_axes():
    E1 = np.linspace(100e9, 200e9, 4)[:, None]
    nu12 = np.linspace(0.2, 0.3, 3)[None, :]
    C = transversely_isotropic_stiffness(E1, 10e9, nu12, 5e9, 0.4)
    assert C.shape == (4, 3, 6, 6)
    c = engineering_constants(C)
    assert c["E1"].shape == (4, 3)
    assert np.allclose(c["E1"], np.broadcast_to(E1, (4, 3)), rtol=1e-12)
    assert isotropic_stiffness(np.ones(5) * 3e9, 0.35).shape == (5, 6, 6)


def test_minor_poisson_ratios_obey_reciprocity():
    c = engineering_constants(orthotropic_stiffness(140e9, 10e9, 9e9, 3.5e9, 5e9, 5.5e9,
                                                    0.45, 0.28, 0.3))
    # nu21 / E2 = nu12 / E1 (Jones 1999, Eq. 2.20 reciprocal relations)
    assert c["nu21"] / c["E2"] == pytest.approx(c["nu12"] / c["E1"], rel=1e-12)
    assert c["nu31"] / c["E3"] == pytest.approx(c["nu13"] / c["E1"], rel=1e-12)
    assert c["nu32"] / c["E3"] == pytest.approx(c["nu23"] / c["E2"], rel=1e-12)


# --- rotations --------------------------------------------------------------------------------


@pytest.mark.parametrize("axis", [1, 2, 3, "x", "y", "z"])
def test_rotation_matrices_are_proper_orthogonal(axis):
    R = rotation_about_axis(axis, np.array([0.0, 17.0, 90.0, 233.0]))
    assert np.allclose(R @ np.swapaxes(R, -1, -2), np.eye(3), atol=1e-15)
    assert np.allclose(np.linalg.det(R), 1.0, atol=1e-15)


def test_rotation_about_z_turns_x_into_y():
    R = rotation_about_axis(3, 90.0)
    assert np.allclose(R @ [1.0, 0.0, 0.0], [0.0, 1.0, 0.0], atol=1e-15)
    assert np.allclose(rotation_about_axis(3, np.pi / 2, degrees=False), R, atol=1e-15)


def test_rotation_rejects_unknown_axis():
    with pytest.raises(InputError, match=r"axis: expected one of 1, 2, 3, 'x', 'y', 'z', got 4"):
        rotation_about_axis(4, 10.0)


@SETTINGS
@given(orthotropic_constants(), st.sampled_from([1, 2, 3]))
def test_rotation_by_360_degrees_is_identity(c, axis):
    C = orthotropic_stiffness(**c)
    assert rel(rotate_stiffness(C, rotation_about_axis(axis, 360.0)), C) < 1e-12
    S = np.linalg.inv(C)
    assert rel(rotate_compliance(S, rotation_about_axis(axis, 360.0)), S) < 1e-12


@SETTINGS
@given(ti_constants(), angle)
def test_transversely_isotropic_stiffness_is_invariant_about_axis_1(c, theta):
    C = transversely_isotropic_stiffness(**c)
    assert rel(rotate_stiffness(C, rotation_about_axis(1, theta)), C) < 1e-12


@SETTINGS
@given(modulus, st.floats(min_value=-0.9, max_value=0.45), angle, angle)
def test_isotropic_stiffness_is_invariant_under_any_rotation(E, nu, a, b):
    C = isotropic_stiffness(E, nu)
    R = rotation_about_axis(2, a) @ rotation_about_axis(3, b)
    assert rel(rotate_stiffness(C, R), C) < 1e-12


@SETTINGS
@given(orthotropic_constants(), angle, angle)
def test_rotations_compose(c, a, b):
    C = orthotropic_stiffness(**c)
    two_steps = rotate_stiffness(rotate_stiffness(C, rotation_about_axis(3, a)),
                                 rotation_about_axis(3, b))
    assert rel(two_steps, rotate_stiffness(C, rotation_about_axis(3, a + b))) < 1e-12


@SETTINGS
@given(orthotropic_constants(), angle)
def test_rotated_compliance_is_inverse_of_rotated_stiffness(c, theta):
    C = orthotropic_stiffness(**c)
    R = rotation_about_axis(2, theta)
    assert rel(np.linalg.inv(rotate_stiffness(C, R)),
               rotate_compliance(np.linalg.inv(C), R)) < 1e-10


def test_bond_matrix_of_transpose_is_inverse():
    R = rotation_about_axis(1, 33.0) @ rotation_about_axis(3, -71.0)
    assert np.allclose(bond_matrix(R) @ bond_matrix(R.T), np.eye(6), atol=1e-14)


def test_rotation_by_90_about_3_swaps_axial_and_transverse_moduli():
    C = transversely_isotropic_stiffness(140e9, 10e9, 0.3, 5e9, 0.4)
    c = engineering_constants(rotate_stiffness(C, rotation_about_axis(3, 90.0)))
    assert c["E2"] == pytest.approx(140e9, rel=1e-12)
    assert c["E1"] == pytest.approx(10e9, rel=1e-12)
    assert c["G12"] == pytest.approx(5e9, rel=1e-12)


def test_off_axis_modulus_matches_transformation_formula():
    # 1/Ex = cos^4/E1 + (1/G12 - 2 nu12/E1) sin^2 cos^2 + sin^4/E2 (Jones 1999, Eq. 2.98)
    E1, E2, nu12, G12, theta = 140e9, 10e9, 0.3, 5e9, np.deg2rad(30.0)
    C = transversely_isotropic_stiffness(E1, E2, nu12, G12, 0.4)
    Ex = engineering_constants(rotate_stiffness(C, rotation_about_axis(3, 30.0)))["E1"]
    m, n = np.cos(theta), np.sin(theta)
    expected = 1 / (m**4 / E1 + (1 / G12 - 2 * nu12 / E1) * m**2 * n**2 + n**4 / E2)
    assert Ex == pytest.approx(expected, rel=1e-12)


def test_rotation_broadcasts_over_angles():
    C = transversely_isotropic_stiffness(140e9, 10e9, 0.3, 5e9, 0.4)
    Cr = rotate_stiffness(C, rotation_about_axis(3, np.linspace(0, 90, 7)))
    assert Cr.shape == (7, 6, 6)


# --- Mandel form and checks -------------------------------------------------------------------


def test_mandel_round_trip_is_exact():
    C = orthotropic_stiffness(140e9, 10e9, 9e9, 3.5e9, 5e9, 5.5e9, 0.45, 0.28, 0.3)
    assert rel(from_mandel(to_mandel(C)), C) < 1e-15


def test_isotropic_mandel_eigenvalues_are_3k_and_2g():
    E, nu = 70e9, 0.3
    K, G = E / (3 * (1 - 2 * nu)), E / (2 * (1 + nu))  # exact spectral decomposition
    w = np.linalg.eigvalsh(to_mandel(isotropic_stiffness(E, nu)))
    assert np.allclose(np.sort(w), np.sort([3 * K] + [2 * G] * 5), rtol=1e-12)


def test_symmetry_error_and_is_symmetric():
    C = isotropic_stiffness(3e9, 0.3)
    assert symmetry_error(C) == 0.0 and bool(is_symmetric(C))
    D = C.copy()
    D[0, 1] *= 1.01
    assert symmetry_error(D) > 1e-3 and not bool(is_symmetric(D))


def test_is_positive_definite_flags_unstable_poisson_ratio():
    good = isotropic_stiffness(3e9, 0.3)
    bad = orthotropic_stiffness(10e9, 10e9, 10e9, 4e9, 4e9, 4e9, 0.9, 0.9, 0.9)
    assert bool(is_positive_definite(good))
    assert not bool(is_positive_definite(bad))
    assert is_positive_definite(np.stack([good, bad])).tolist() == [True, False]


def test_check_stiffness_returns_valid_input():
    C = isotropic_stiffness(3e9, 0.3)
    assert check_stiffness(C) is not None
    assert np.array_equal(check_stiffness(C), C)


def test_check_stiffness_rejects_wrong_shape():
    with pytest.raises(InputError, match=r"C: expected shape \(\.\.\., 6, 6\), got \(3, 3\)"):
        check_stiffness(np.eye(3), "C")


def test_check_stiffness_rejects_non_finite_with_index():
    C = np.stack([isotropic_stiffness(3e9, 0.3)] * 3)
    C[2, 0, 0] = np.nan
    with pytest.raises(InvalidMaterialError, match=r"C at index 2 must be finite"):
        check_stiffness(C, "C")


def test_check_stiffness_rejects_asymmetric():
    C = isotropic_stiffness(3e9, 0.3)
    C[0, 1] *= 1.1
    with pytest.raises(InvalidMaterialError, match=r"C must be symmetric: relative asymmetry"):
        check_stiffness(C, "C")


def test_check_stiffness_rejects_not_positive_definite():
    C = -isotropic_stiffness(3e9, 0.3)
    with pytest.raises(InvalidMaterialError, match=r"C must be positive definite"):
        check_stiffness(C, "C")


# --- general rotations against the fourth-order tensor rule; input checks -----------------------

_VOIGT = ((0, 0), (1, 1), (2, 2), (1, 2), (0, 2), (0, 1))


def _full_tensor(C):
    """Fourth-order C_ijkl of a Voigt stiffness (engineering shear: no factors on C)."""
    T = np.zeros((3, 3, 3, 3))
    for a, (i, j) in enumerate(_VOIGT):
        for b, (k, l) in enumerate(_VOIGT):
            for p, q in {(i, j), (j, i)}:
                for r, s in {(k, l), (l, k)}:
                    T[p, q, r, s] = C[a, b]
    return T


@st.composite
def rotations(draw):
    """Any proper rotation, from a random unit quaternion (Shoemake 1992, Graphics Gems III)."""
    q = np.array([draw(st.floats(-1.0, 1.0)) for _ in range(4)])
    if np.linalg.norm(q) < 1e-3:
        q = np.array([1.0, 0.3, -0.2, 0.5])
    w, x, y, z = q / np.linalg.norm(q)
    return np.array([
        [1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y)],
        [2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x)],
        [2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y)],
    ])


@SETTINGS
@given(orthotropic_constants(), rotations())
def test_rotation_by_any_matrix_follows_the_fourth_order_transformation_rule(c, R):
    # C'_ijkl = R_ip R_jq R_kr R_ls C_pqrs (exact tensor transformation rule, any elasticity text)
    C = orthotropic_stiffness(**c)
    T = np.einsum("ip,jq,kr,ls,pqrs->ijkl", R, R, R, R, _full_tensor(C))
    expected = np.array([[T[i, j, k, l] for (k, l) in _VOIGT] for (i, j) in _VOIGT])
    assert rel(rotate_stiffness(C, R), expected) < 1e-12


def test_rotation_rejects_a_matrix_that_is_not_orthogonal():
    C = isotropic_stiffness(3e9, 0.3)
    R = np.stack([np.eye(3), 2.0 * np.eye(3)])
    with pytest.raises(InputError, match=r"R at index 1 is not a rotation: max \|R R\^T - I\| = 3"):
        rotate_stiffness(C, R)
    with pytest.raises(InputError, match=r"R is not a rotation"):
        rotate_compliance(np.linalg.inv(C), np.ones((3, 3)))


def test_rotation_rejects_wrong_shapes():
    with pytest.raises(InputError, match=r"R: expected rotation matrices of shape \(\.+, 3, 3\)"):
        bond_matrix(np.eye(2))
    with pytest.raises(InputError, match=r"stiffness: expected shape \(\.+, 6, 6\), got \(3, 3\)"):
        rotate_stiffness(np.eye(3), np.eye(3))
    with pytest.raises(InputError, match=r"compliance: expected shape \(\.+, 6, 6\), got \(6,\)"):
        rotate_compliance(np.ones(6), np.eye(3))


def test_engineering_constants_reject_wrong_shape_and_singular_matrices():
    with pytest.raises(InputError, match=r"stiffness: expected shape \(\.+, 6, 6\), got \(3, 3\)"):
        engineering_constants(np.eye(3))
    with pytest.raises(InvalidMaterialError, match="stiffness is singular"):
        engineering_constants(np.zeros((6, 6)))


def test_not_positive_definite_message_gives_the_smallest_eigenvalue():
    with pytest.raises(InvalidMaterialError, match=r"C must be positive definite: smallest "
                                                   r"eigenvalue -7\.5e\+09 is not above"):
        check_stiffness(-isotropic_stiffness(3e9, 0.3), "C")  # -3K = -7.5 GPa for E = 3, nu = 0.3


def test_tensor_module_examples_run():
    import doctest

    import micromech.tensors

    assert doctest.testmod(micromech.tensors).failed == 0
