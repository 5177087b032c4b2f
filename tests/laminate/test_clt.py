"""Classical laminate theory: published examples, exact identities and invariants."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech import tensors
from micromech.errors import InputError, UnitError
from micromech.laminate import (
    Laminate,
    Ply,
    PlyMaterial,
    load_vector,
    plane_stress_reduce,
    reduced_stiffness,
    transformed_expansion,
    transformed_reduced_stiffness,
)

GPA = 1e9

materials = st.builds(
    lambda E1, r, nu12, g, nu23: PlyMaterial(E1=E1 * GPA, E2=E1 * GPA * r, nu12=nu12,
                                             G12=E1 * GPA * r * g, nu23=nu23,
                                             alpha1=-0.5e-6, alpha2=30e-6),
    st.floats(20, 400), st.floats(0.02, 1.0), st.floats(0.1, 0.45), st.floats(0.2, 0.8),
    st.floats(0.05, 0.6),
)
angle = st.floats(-90, 90, allow_nan=False)
half_angles = st.lists(st.sampled_from([0.0, 15.0, -30.0, 45.0, 60.0, 90.0, 22.5]), min_size=1,
                       max_size=5)


# --- published examples -------------------------------------------------------------------------

def test_reduced_stiffness_of_graphite_epoxy():
    Q = reduced_stiffness(181e9, 10.3e9, 0.28, 7.17e9) / GPA
    # Kaw (2006), 2nd ed., Example 2.6 (from memory): Q11 181.8, Q12 2.897, Q22 10.35, Q66 7.17 GPa
    np.testing.assert_allclose([Q[0, 0], Q[0, 1], Q[1, 1], Q[2, 2]],
                               [181.8, 2.897, 10.35, 7.17], rtol=5e-4)
    assert Q[0, 2] == Q[1, 2] == 0.0


def test_transformed_stiffness_of_a_60_degree_graphite_epoxy_ply():
    Qb = transformed_reduced_stiffness(reduced_stiffness(181e9, 10.3e9, 0.28, 7.17e9), 60.0) / GPA
    # Kaw (2006), 2nd ed., Example 2.7 (from memory), GPa, tolerance 5e-4 relative (4 digits)
    expected = [[23.65, 32.46, 20.05], [32.46, 109.4, 54.19], [20.05, 54.19, 36.74]]
    np.testing.assert_allclose(Qb, expected, rtol=5e-4)


def test_abd_of_a_three_ply_graphite_epoxy_laminate(graphite_epoxy):
    lam = Laminate.from_code("[0/30/-45]", graphite_epoxy, 5e-3)
    # Kaw (2006), 2nd ed., Example 4.2 (from memory): 5 mm plies; A in Pa*m, B in Pa*m^2,
    # D in Pa*m^3; 4 digits, tolerance 5e-4 relative to the largest entry of each matrix
    A = [[1.739e9, 3.884e8, 5.663e7], [3.884e8, 4.533e8, -1.141e8], [5.663e7, -1.141e8, 4.525e8]]
    B = [[-3.129e6, 9.855e5, -1.072e6], [9.855e5, 1.158e6, -1.072e6],
         [-1.072e6, -1.072e6, 9.855e5]]
    D = [[3.343e4, 6.461e3, -5.240e3], [6.461e3, 9.320e3, -5.596e3], [-5.240e3, -5.596e3, 7.663e3]]
    np.testing.assert_allclose(lam.A, A, atol=5e-4 * 1.739e9)
    np.testing.assert_allclose(lam.B, B, atol=5e-4 * 3.129e6)
    np.testing.assert_allclose(lam.D, D, atol=5e-4 * 3.343e4)


def test_midplane_strains_and_curvatures_under_biaxial_resultants(graphite_epoxy):
    lam = Laminate.from_code("[0/30/-45]", graphite_epoxy, 5e-3)
    r = lam.response({"Nx": "1000 N/m", "Ny": "1000 N/m"})
    # Kaw (2006), 2nd ed., Example 4.3 (from memory): eps0 = (3.123e-7, 3.492e-6, -7.598e-7),
    # kappa = (2.971e-5, -3.285e-4, 4.101e-4) 1/m; 4 digits
    np.testing.assert_allclose(r.total.midplane_strain, [3.123e-7, 3.492e-6, -7.598e-7],
                               rtol=5e-4)
    np.testing.assert_allclose(r.total.curvature, [2.971e-5, -3.285e-4, 4.101e-4], rtol=5e-4)


@settings(max_examples=60, deadline=None)
@given(materials, angle)
def test_off_axis_modulus_of_one_ply(m, a):
    c = Laminate.from_angles([a], m, 1e-3).in_plane_constants()
    co, si = np.cos(np.radians(a)), np.sin(np.radians(a))
    # Jones (1999), 2nd ed., Sec. 2.6 (from memory): 1/Ex = c^4/E1 + (1/G12 - 2 nu12/E1) s^2 c^2
    # + s^4/E2 ; exact identity
    inv = co**4 / m.E1 + (1 / m.G12 - 2 * m.nu12 / m.E1) * si**2 * co**2 + si**4 / m.E2
    assert c.Ex == pytest.approx(1 / inv, rel=1e-10)


# --- exact identities and invariants -----------------------------------------------------------

@settings(max_examples=60, deadline=None)
@given(materials, angle)
def test_single_ply_matches_rotated_3d_stiffness_reduced_to_plane_stress(m, a):
    C = tensors.rotate_stiffness(m.stiffness(), tensors.rotation_about_axis(3, a))
    Qb = transformed_reduced_stiffness(m.reduced_stiffness(), a)
    np.testing.assert_allclose(Qb, plane_stress_reduce(C), rtol=1e-9, atol=1e-9 * m.E1)


@settings(max_examples=60, deadline=None)
@given(materials, half_angles, st.floats(0.05e-3, 1e-3))
def test_symmetric_layup_has_no_coupling(m, half, t):
    lam = Laminate.from_angles(half + half[::-1], m, t)
    assert np.max(np.abs(lam.B)) <= 1e-12 * np.max(np.abs(lam.A)) * lam.thickness


@settings(max_examples=60, deadline=None)
@given(materials, st.lists(st.floats(0, 90), min_size=1, max_size=4), st.randoms())
def test_balanced_layup_has_no_extension_shear_coupling(m, a, rnd):
    plies = a + [-x for x in a]
    rnd.shuffle(plies)
    lam = Laminate.from_angles(plies, m, 0.2e-3)
    assert abs(lam.A[0, 2]) <= 1e-12 * lam.A[0, 0] and abs(lam.A[1, 2]) <= 1e-12 * lam.A[0, 0]


@settings(max_examples=60, deadline=None)
@given(materials, st.sampled_from(["[0/+-60]", "[0/+-60]s", "[0/+-45/90]s", "[90/0/45/-45]",
                                   "[0/36/72/-72/-36]", "[30/90/-30]"]))
def test_quasi_isotropic_layup_has_isotropic_a(m, code):
    A = Laminate.from_code(code, m, 0.15e-3).A
    scale = A[0, 0]
    assert A[0, 0] == pytest.approx(A[1, 1], rel=1e-12)
    assert A[2, 2] == pytest.approx((A[0, 0] - A[0, 1]) / 2, rel=1e-12)
    assert abs(A[0, 2]) < 1e-12 * scale and abs(A[1, 2]) < 1e-12 * scale


@settings(max_examples=40, deadline=None)
@given(materials, half_angles)
def test_symmetric_laminate_constants_do_not_depend_on_bending_restraint(m, half):
    lam = Laminate.from_angles(half + half[::-1], m, 0.2e-3)
    free, restrained = lam.in_plane_constants("free"), lam.in_plane_constants("restrained")
    assert free.Ex == pytest.approx(restrained.Ex, rel=1e-9)
    assert lam.flexural_constants("free").Gxy == pytest.approx(
        lam.flexural_constants("restrained").Gxy, rel=1e-9)


def test_unidirectional_laminate_returns_the_ply_constants(graphite_epoxy):
    lam = Laminate.from_code("[0_4]", graphite_epoxy, 0.25e-3)
    for c in (lam.in_plane_constants(), lam.flexural_constants()):
        assert (c.Ex, c.Ey, c.Gxy, c.nuxy) == pytest.approx((181e9, 10.3e9, 7.17e9, 0.28),
                                                            rel=1e-12)
        assert c.nuyx == pytest.approx(0.28 * 10.3 / 181, rel=1e-12)


def test_free_ply_under_temperature_change_expands_without_stress(graphite_epoxy):
    lam = Laminate.from_angles([30.0], graphite_epoxy, 1e-3)
    r = lam.response(None, delta_T=-100.0)
    alpha_xy = transformed_expansion([0.02e-6, 22.5e-6, 0.0], 30.0)
    np.testing.assert_allclose(r.total.midplane_strain, -100 * alpha_xy, rtol=1e-12)
    np.testing.assert_allclose(r.total.stress_laminate, 0.0, atol=1e-6)  # Pa
    np.testing.assert_allclose(lam.thermal_expansion()[:3], alpha_xy, rtol=1e-12)
    # Kaw (2006), Sec. 2.10 (from memory): alpha_xy = 2 (a1 - a2) c s, exact identity
    c, s = np.cos(np.radians(30)), np.sin(np.radians(30))
    assert alpha_xy[2] == pytest.approx(2 * (0.02e-6 - 22.5e-6) * c * s, rel=1e-12)


def test_cross_ply_cooled_from_cure_has_residual_stress_that_balances(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    r = lam.response({"delta_T": "-150 K"})
    assert r.total.stress_material[0, 1, 1] > 0  # transverse tension in the 0 ply after cooling
    # in-plane force balance of the residual stresses: sum sigma t = 0 (exact identity)
    N = np.einsum("n,ni->i", lam.thicknesses, r.total.stress_laminate[:, 1, :])
    assert np.max(np.abs(N)) < 1e-9 * np.max(np.abs(r.total.stress_laminate)) * lam.thickness
    np.testing.assert_allclose(r.mechanical.stress_material, 0.0)
    np.testing.assert_allclose(r.thermal.stress_material, r.total.stress_material)


@settings(max_examples=40, deadline=None)
@given(materials, half_angles, st.lists(st.floats(-1e5, 1e5), min_size=6, max_size=6),
       st.floats(-200, 200))
def test_stresses_recover_the_applied_resultants(m, angles, loads, dT):
    lam = Laminate.from_angles(angles, m, 0.3e-3)
    r = lam.response(np.array(loads) * [1, 1, 1, 1e-3, 1e-3, 1e-3], delta_T=dT)
    # integrate the (linear-in-z) ply stresses exactly with Simpson's rule over each ply
    s, z, t = r.total.stress_laminate, lam.z_points, lam.thicknesses
    N = np.einsum("n,npi,p->i", t / 6, s, [1, 4, 1])
    M = np.einsum("n,npi,np,p->i", t / 6, s, z, [1, 4, 1])
    applied = r.loads
    scale = np.max(np.abs(applied)) + 1.0
    np.testing.assert_allclose(N, applied[:3], atol=1e-7 * scale)
    np.testing.assert_allclose(M, applied[3:], atol=1e-7 * scale * lam.thickness + 1e-12)


def test_material_axes_stresses_follow_the_transformation(graphite_epoxy):
    lam = Laminate.from_code("[45/-45]", graphite_epoxy, 0.2e-3)
    r = lam.response({"Nx": 1e4, "Mxy": 1.0})
    s_xy, s_12 = r.total.stress_laminate[0, 2], r.total.stress_material[0, 2]
    c = s = np.sqrt(0.5)
    # Kaw (2006), Eq. (2.94) (from memory): s11 = c^2 sx + s^2 sy + 2 c s txy
    assert s_12[0] == pytest.approx(c * c * s_xy[0] + s * s * s_xy[1] + 2 * c * s * s_xy[2],
                                    rel=1e-12)


def test_batch_of_load_cases_gives_stacked_results(graphite_epoxy):
    lam = Laminate.from_code("[0/+-45/90]s", graphite_epoxy, 0.125e-3)
    loads = np.random.default_rng(1).normal(size=(5, 6)) * 1e4
    r = lam.response(loads)
    assert r.total.stress_material.shape == (5, 8, 3, 3)
    one = lam.response(loads[3])
    np.testing.assert_allclose(r.total.stress_material[3], one.total.stress_material)


def test_hybrid_laminate_with_per_ply_materials_and_thicknesses(graphite_epoxy):
    glass = PlyMaterial(E1=38.6e9, E2=8.27e9, nu12=0.26, G12=4.14e9, name="glass/epoxy")
    lam = Laminate.from_code("[0/90]s", [graphite_epoxy, glass, glass, graphite_epoxy],
                             [0.1e-3, 0.3e-3, "0.3 mm", 0.1e-3])
    assert lam.thickness == pytest.approx(0.8e-3)
    np.testing.assert_allclose(lam.z, [-0.4e-3, -0.3e-3, 0.0, 0.3e-3, 0.4e-3], atol=1e-15)
    # A is the thickness-weighted sum of Q-bar (exact identity)
    Q0 = graphite_epoxy.reduced_stiffness()
    Q90 = transformed_reduced_stiffness(glass.reduced_stiffness(), 90.0)
    np.testing.assert_allclose(lam.A, 0.2e-3 * Q0 + 0.6e-3 * Q90, rtol=1e-12)
    assert np.max(np.abs(lam.B)) < 1e-9 * np.max(np.abs(lam.A)) * lam.thickness


def test_with_materials_keeps_angles_and_thicknesses(graphite_epoxy, graphite_epoxy_2d):
    lam = Laminate.from_code("[0/45]", graphite_epoxy, 0.2e-3)
    other = lam.with_materials([graphite_epoxy_2d, graphite_epoxy_2d])
    np.testing.assert_array_equal(other.angles, lam.angles)
    assert other.plies[1].material is graphite_epoxy_2d


# --- errors -------------------------------------------------------------------------------------

def test_laminate_needs_plies():
    with pytest.raises(InputError, match="needs at least one ply"):
        Laminate(())
    with pytest.raises(InputError, match=r"ply 1 \(from 1 at the bottom\) is a str, expected"):
        Laminate(("0",))  # type: ignore[arg-type]


def test_per_ply_lists_must_match_the_code(graphite_epoxy):
    with pytest.raises(InputError, match="3 materials given for 4 plies"):
        Laminate.from_code("[0/90]s", [graphite_epoxy] * 3, 1e-3)
    with pytest.raises(InputError, match="2 thicknesses given for 4 plies"):
        Laminate.from_code("[0/90]s", graphite_epoxy, [1e-3, 1e-3])
    lam = Laminate.from_code("[0/90]", graphite_epoxy, 1e-3)
    with pytest.raises(InputError, match="1 materials given for 2 plies"):
        lam.with_materials([graphite_epoxy])


def test_temperature_change_needs_ply_expansion(graphite_epoxy_2d):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy_2d, 1e-3)
    with pytest.raises(InputError, match=r"alpha1 and alpha2 are needed.*delta_T = -50 K"):
        lam.response({"Nx": 1.0, "delta_T": -50})
    assert isinstance(lam.response({"Nx": 1.0}).total.stress_material, np.ndarray)


def test_bad_loads_are_refused():
    with pytest.raises(InputError, match="unknown key 'Nz'"):
        load_vector({"Nz": 1.0})
    with pytest.raises(InputError, match=r"shape \(\.\.\., 6\).*got shape \(3,\)"):
        load_vector([1.0, 2.0, 3.0])
    with pytest.raises(InputError, match="resultants must be finite"):
        load_vector([1.0, 2.0, 3.0, 0.0, 0.0, float("inf")])
    with pytest.raises(InputError, match="resultants and delta_T must be finite"):
        load_vector({"Nx": float("nan")})
    with pytest.raises(UnitError, match="loads.Nx must be a finite number"):
        load_vector({"Nx": "nan N/mm"})
    vec, dT = load_vector({"Nx": "100 N/mm", "Mxy": "2 N*mm/mm", "delta_T": "-100 K"})
    np.testing.assert_allclose(vec, [1e5, 0, 0, 0, 0, 2.0])
    assert dT == -100.0


def test_delta_t_argument_overrides_the_one_in_the_loads():
    vec, dT = load_vector({"Nx": 1.0, "delta_T": -100.0}, delta_T=25.0)
    assert vec.tolist() == [1.0, 0.0, 0.0, 0.0, 0.0, 0.0] and dT == 25.0
    assert load_vector([0.0] * 6, 7)[1] == 7.0 and load_vector(None)[1] == 0.0


def test_flexural_constants_refuse_an_unknown_bending_option(graphite_epoxy):
    lam = Laminate.from_code("[0/90]", graphite_epoxy, 1e-3)
    with pytest.raises(InputError, match="bending: expected 'free' or 'restrained'"):
        lam.flexural_constants("clamped")


def test_unknown_bending_option_is_refused(graphite_epoxy):
    lam = Laminate.from_code("[0/90]", graphite_epoxy, 1e-3)
    with pytest.raises(InputError, match="bending: expected 'free' or 'restrained'"):
        lam.in_plane_constants("clamped")


def test_ply_3d_stiffness_needs_nu23(graphite_epoxy_2d):
    lam = Laminate((Ply(graphite_epoxy_2d, 0.0, 1e-3),))
    with pytest.raises(InputError, match="3D stiffness needs"):
        lam.stack_constants()


@pytest.mark.parametrize("t", [1e-300, 1e-150, 1e110])
def test_ply_thickness_that_makes_abd_singular_is_refused(graphite_epoxy, t):
    with pytest.raises(InputError, match=r"the ABD matrix cannot be inverted for ply thicknesses "
                                         r"from .* m \(total .* m\): the bending stiffness"):
        Laminate.from_code("[0/90]s", graphite_epoxy, t)
