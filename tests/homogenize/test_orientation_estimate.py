"""Tests of estimate() for randomly oriented fibres (``Composite.orientation``).

Exact identities: a 3D random average is isotropic and an in-plane random average transversely
isotropic about the plate normal (axis 3); spheres (aspect ratio 1) of an isotropic phase are
the same in every orientation; the fraction-0 and fraction-1 limits are the matrix and the
orientation-averaged fibre. The orientation averages are checked against an independent
quadrature over rotations (16 in-plane angles; 8 x 5 x 8 Euler angles with Gauss-Legendre in
cos(beta), exact for the degree-4 trigonometric polynomials of a rotated fourth-order tensor).
Constituent constants are typical magnitudes (common practice, no source), not references.
"""

from __future__ import annotations

import json

import numpy as np
import pytest

from micromech import tensors
from micromech.design.forward import laminate_in_plane
from micromech.homogenize import FibrePhase, MatrixPhase, estimate, mori_tanaka
from micromech.homogenize.bounds import hashin_shtrikman
from micromech.materials import Isotropic, Orthotropic, TransverselyIsotropic
from micromech.materials.composite import Composite

GLASS = Isotropic(E="72 GPa", nu=0.22, alpha="5e-6 1/K", strengths={"Xt": "2 GPa"})
EPOXY = Isotropic(E="3.5 GPa", nu=0.35, alpha="60e-6 1/K",
                  strengths={"Xt": "70 MPa", "yield_strength": "60 MPa"})
CARBON = TransverselyIsotropic(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", nu23=0.07,
                               alpha1="-0.5e-6 1/K", alpha2="10e-6 1/K",
                               strengths={"Xt": "3.5 GPa", "yield_strength": "3.5 GPa"})
VF = np.linspace(0.0, 0.6, 13)
MODULI = ("E1", "E2", "E3", "G12", "G13", "G23")


def short(fibre, vf=VF, aspect=30.0, orientation="random_3d", **kw):
    return Composite(fibre, EPOXY, vf, inclusion="spheroid", aspect_ratio=aspect,
                     orientation=orientation, **kw)


def rotations_3d():
    """ZYZ Euler rotations and weights that average a rotated 4th-order tensor exactly."""
    a = np.arange(8) * (2 * np.pi / 8)
    x, w = np.polynomial.legendre.leggauss(5)
    b = np.arccos(x)
    A, B, G = np.meshgrid(a, b, a, indexing="ij")
    W = np.broadcast_to(w[None, :, None], A.shape) / (2.0 * 64)
    R = (tensors.rotation_about_axis(3, A, degrees=False)
         @ tensors.rotation_about_axis(2, B, degrees=False)
         @ tensors.rotation_about_axis(3, G, degrees=False))
    return R.reshape(-1, 3, 3), W.ravel()


def average(T, orientation, compliance=False):
    """Independent orientation average of a 6x6 Voigt stiffness or compliance (axis 1 fibre)."""
    rot = tensors.rotate_compliance if compliance else tensors.rotate_stiffness
    if orientation == "random_in_plane":
        R = tensors.rotation_about_axis(3, np.arange(16) * 22.5)
        return rot(T, R).mean(axis=0)
    R, w = rotations_3d()
    return np.einsum("n,nij->ij", w, rot(T, R))


def constants(ec):
    return np.array([np.broadcast_to(ec.get(n), np.shape(VF)) for n in MODULI])


# --- symmetry of the averaged results (exact identities) --------------------------------------


@pytest.mark.parametrize("fibre", [GLASS, CARBON])
@pytest.mark.parametrize("aspect", [0.2, 1.0, 5.0, 100.0])
def test_random_3d_is_isotropic(fibre, aspect):
    est = estimate(short(fibre, aspect=aspect), strengths=False)
    for key, r in est.items():
        E, G, nu = r.E1, r.G12, r.nu12
        for name in ("E2", "E3"):
            np.testing.assert_allclose(r.get(name), E, rtol=1e-12, err_msg=f"{key} {name}")
        for name in ("G13", "G23"):
            np.testing.assert_allclose(r.get(name), G, rtol=1e-12, err_msg=f"{key} {name}")
        np.testing.assert_allclose(r.nu13, nu, rtol=1e-12)
        np.testing.assert_allclose(r.nu23, nu, rtol=1e-12)
        np.testing.assert_allclose(G, E / (2.0 * (1.0 + nu)), rtol=1e-12, err_msg=key)  # exact


@pytest.mark.parametrize("fibre", [GLASS, CARBON])
@pytest.mark.parametrize(("inclusion", "aspect"), [("spheroid", 0.3), ("spheroid", 40.0),
                                                   ("continuous", None)])
def test_random_in_plane_is_transversely_isotropic_about_the_plate_normal(fibre, inclusion,
                                                                          aspect):
    comp = Composite(fibre, EPOXY, VF, inclusion=inclusion, aspect_ratio=aspect,
                     orientation="random_in_plane")
    for key, r in estimate(comp, strengths=False).items():
        np.testing.assert_allclose(r.E2, r.E1, rtol=1e-12, err_msg=key)  # in-plane isotropy
        np.testing.assert_allclose(r.G23, r.G13, rtol=1e-12, err_msg=key)
        np.testing.assert_allclose(r.nu23, r.nu13, rtol=1e-12, err_msg=key)
        np.testing.assert_allclose(r.G12, r.E1 / (2.0 * (1.0 + r.nu12)), rtol=1e-12,
                                   err_msg=key)  # exact in the isotropic plane
        C = r.stiffness()
        Cr = tensors.rotate_stiffness(C, tensors.rotation_about_axis(3, 37.0))
        np.testing.assert_allclose(Cr, C, rtol=0, atol=1e-12 * np.max(np.abs(C)), err_msg=key)


def test_in_plane_fibres_stiffen_the_plane_more_than_the_normal():
    # axis convention: fibres lie in the 1-2 plane, axis 3 is the plate normal
    r = estimate(short(GLASS, 0.3, 50.0, "random_in_plane"))["mori_tanaka"]
    assert float(r.E1) > 1.5 * float(r.E3)
    assert float(r.G12) > float(r.G13)


@pytest.mark.parametrize("key", ["voigt", "reuss", "mori_tanaka"])
def test_spheres_are_the_same_in_every_orientation(key):
    # aspect ratio 1 of an isotropic particle: rotating it changes nothing (exact)
    ref = estimate(short(GLASS, aspect=1.0, orientation="aligned"), strengths=False)[key]
    for orientation in ("random_in_plane", "random_3d"):
        r = estimate(short(GLASS, aspect=1.0, orientation=orientation), strengths=False)[key]
        np.testing.assert_allclose(constants(r), constants(ref), rtol=1e-12, err_msg=orientation)
        np.testing.assert_allclose(r.nu12, ref.nu12, rtol=1e-12)
        if key == "mori_tanaka":
            np.testing.assert_allclose(r.alpha1, ref.alpha1, rtol=1e-12)
            np.testing.assert_allclose(r.alpha3, ref.alpha1, rtol=1e-12)


def test_random_3d_mori_tanaka_of_spheres_is_the_lower_hashin_shtrikman_bound():
    # Weng (1984), Eq. 31; Benveniste (1987): Mori-Tanaka = HS lower bound for spheres in the
    # softer matrix (exact identity)
    est = estimate(short(GLASS, aspect=1.0), strengths=False)
    mt, lo = est["mori_tanaka"], est["hashin_shtrikman_lower"]
    np.testing.assert_allclose(mt.E1, lo.E1, rtol=1e-12)
    np.testing.assert_allclose(mt.G12, lo.G12, rtol=1e-12)


def test_isotropic_fibres_have_orientation_free_voigt_and_reuss():
    # two isotropic phases: uniform strain / stress averages do not see the orientation (exact)
    ref = estimate(short(GLASS, orientation="aligned"), strengths=False)
    for orientation in ("random_in_plane", "random_3d"):
        est = estimate(short(GLASS, orientation=orientation), strengths=False)
        for key in ("voigt", "reuss"):
            np.testing.assert_allclose(constants(est[key]), constants(ref[key]), rtol=1e-12)


# --- orientation-averaged Voigt and Reuss against an independent quadrature -------------------


@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
def test_voigt_and_reuss_average_the_fibre_stiffness_and_compliance(orientation):
    # Hill (1952): c1 <C1> + c0 C0 and (c1 <S1> + c0 S0)^-1 (exact)
    est = estimate(short(CARBON, orientation=orientation), strengths=False)
    Cf, Cm = CARBON.stiffness(), EPOXY.stiffness()
    c = VF[:, None, None]
    CV = c * average(Cf, orientation) + (1 - c) * Cm
    SR = c * average(np.linalg.inv(Cf), orientation, compliance=True) + (1 - c) * np.linalg.inv(Cm)
    np.testing.assert_allclose(est["voigt"].stiffness(), CV, rtol=0, atol=1e-12 * 230e9)
    np.testing.assert_allclose(est["reuss"].compliance(), SR, rtol=0, atol=1e-12 / 3.5e9)


@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
def test_anisotropic_matrix_averages_the_fibre_in_the_full_tensor_path(orientation):
    m = Orthotropic(E1=10e9, E2=8e9, E3=7e9, G12=3e9, G13=2.5e9, G23=2e9, nu12=0.3, nu13=0.3,
                    nu23=0.35)
    comp = Composite(CARBON, m, 0.3, inclusion="spheroid", aspect_ratio=20.0,
                     orientation=orientation)
    est = estimate(comp, strengths=False)
    assert set(est) == {"voigt", "reuss"}
    Cf = CARBON.stiffness()
    CV = 0.3 * average(Cf, orientation) + 0.7 * m.stiffness()
    SR = 0.3 * average(np.linalg.inv(Cf), orientation, True) + 0.7 * np.linalg.inv(m.stiffness())
    np.testing.assert_allclose(est["voigt"].stiffness(), CV, rtol=0, atol=1e-12 * 230e9)
    np.testing.assert_allclose(est["reuss"].compliance(), SR, rtol=0, atol=1e-12 / 7e9)


# --- bounds and limits --------------------------------------------------------------------------


@pytest.mark.parametrize("fibre", [GLASS, CARBON])
@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
@pytest.mark.parametrize("aspect", [0.1, 1.0, 10.0, 1000.0])
def test_mori_tanaka_lies_within_the_orientation_averaged_voigt_and_reuss(fibre, orientation,
                                                                         aspect):
    # <C_MT> <= <C_V> and <C_MT> >= <C_R> >= <S_R>^-1 (averaging keeps the order; Hill 1952)
    est = estimate(short(fibre, aspect=aspect, orientation=orientation), strengths=False)
    lo, mt, hi = (constants(est[k]) for k in ("reuss", "mori_tanaka", "voigt"))
    assert np.all(mt >= lo * (1 - 1e-12)) and np.all(mt <= hi * (1 + 1e-12))


@pytest.mark.parametrize("aspect", [0.05, 0.5, 3.0, 30.0, 1000.0])
def test_random_3d_mori_tanaka_lies_within_the_isotropic_bounds(aspect):
    # consistency check of the averaged estimate with Hashin-Shtrikman (1963) for a stiff fibre
    # in a soft matrix; observed for these inputs, not a theorem (no source)
    est = estimate(short(GLASS, aspect=aspect), strengths=False)
    for name in ("E1", "G12"):
        mt = est["mori_tanaka"].get(name)
        assert np.all(mt >= est["hashin_shtrikman_lower"].get(name) * (1 - 1e-12))
        assert np.all(mt <= est["hashin_shtrikman_upper"].get(name) * (1 + 1e-12))


@pytest.mark.parametrize("fibre", [GLASS, CARBON])
@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
def test_no_fibre_gives_the_matrix(fibre, orientation):
    est = estimate(short(fibre, vf=0.0, orientation=orientation), strengths=False)
    for key, r in est.items():  # exact limit vf = 0
        for name in ("E1", "E2", "E3"):
            assert float(r.get(name)) == pytest.approx(3.5e9, rel=1e-12), key
        assert float(r.nu12) == pytest.approx(0.35, rel=1e-12), key
    assert float(est["mori_tanaka"].alpha3) == pytest.approx(60e-6, rel=1e-12)


@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
def test_all_fibre_gives_the_orientation_averaged_fibre(orientation):
    # vf = 1 (beyond any packing limit, so through mori_tanaka): C* = <C_fibre> (exact)
    f, m = FibrePhase.from_material(CARBON), MatrixPhase.from_material(EPOXY)
    r = mori_tanaka(f, m, 1.0, "spheroid", 20.0, orientation=orientation)
    np.testing.assert_allclose(r.stiffness(), average(CARBON.stiffness(), orientation),
                               rtol=0, atol=1e-12 * 230e9)


def test_all_isotropic_fibre_gives_the_fibre_in_every_orientation():
    f, m = FibrePhase.from_material(GLASS), MatrixPhase.from_material(EPOXY)
    for orientation in ("random_in_plane", "random_3d"):
        r = mori_tanaka(f, m, 1.0, "spheroid", 20.0, orientation=orientation)
        assert float(r.E3) == pytest.approx(72e9, rel=1e-12)  # exact limit vf = 1
        assert float(r.nu12) == pytest.approx(0.22, rel=1e-12)


def test_in_plane_random_continuous_fibres_are_a_little_stiffer_than_a_quasi_isotropic_laminate():
    # The 3D average imposes one through-thickness strain on every orientation, a laminate lets
    # each ply relax (sigma_33 = 0): by minimum potential energy the averaged in-plane stiffness
    # is the larger (derived here). The quasi-isotropic laminate [0/60/-60]s has the in-plane
    # average of the ply stiffness (Tsai and Pagano 1968). Observed gap here below 0.5 %.
    vf = np.linspace(0.05, 0.7, 14)
    for fibre in (GLASS, CARBON):
        rand = estimate(Composite(fibre, EPOXY, vf, orientation="random_in_plane"),
                        strengths=False)["mori_tanaka"]
        ply = estimate(Composite(fibre, EPOXY, vf), strengths=False)["mori_tanaka"]
        lam = laminate_in_plane(ply.E1[:, None], ply.E2[:, None], ply.nu12[:, None],
                                ply.G12[:, None], [0, 60, -60, -60, 60, 0])
        for mine, theirs in ((rand.E1, lam["Ex"][:, 0]), (rand.G12, lam["Gxy"][:, 0])):
            ratio = mine / theirs
            assert np.all(ratio >= 1 - 1e-12) and np.all(ratio < 1.005)


# --- which models, notes, strengths, bands ------------------------------------------------------


@pytest.mark.parametrize(
    ("fibre", "orientation", "kw", "present"),
    [(GLASS, "random_3d", {}, {"voigt", "reuss", "hashin_shtrikman_lower",
                               "hashin_shtrikman_upper", "mori_tanaka"}),
     (CARBON, "random_3d", {}, {"voigt", "reuss", "mori_tanaka"}),
     (GLASS, "random_in_plane", {}, {"voigt", "reuss", "mori_tanaka"}),
     (GLASS, "random_3d", {"void_fraction": 0.03}, {"voigt", "mori_tanaka"})],
)
def test_keys_for_random_orientations(fibre, orientation, kw, present):
    est = estimate(short(fibre, 0.3, orientation=orientation, **kw))
    assert set(est) == present
    for k in ("rule_of_mixtures", "halpin_tsai", "chamis", "cylinders"):
        assert est.notes[k] == f"assumes aligned fibres; not applied with orientation = " \
                               f"{orientation}"


def test_notes_say_why_the_hashin_shtrikman_bounds_are_absent():
    planar = estimate(short(GLASS, 0.3, orientation="random_in_plane"))
    assert "assume aligned inclusions" in planar.notes["hashin_shtrikman_lower"]
    carbon = estimate(short(CARBON, 0.3))
    assert "need isotropic fibre and matrix" in carbon.notes["hashin_shtrikman_upper"]
    voids = estimate(short(GLASS, 0.3, void_fraction=0.03))
    assert voids.notes["hashin_shtrikman_lower"].startswith("not computed with voids")
    assert voids.notes["reuss"] == "zero with voids"


def test_random_3d_bounds_say_they_hold_for_any_inclusion_shape():
    est = estimate(short(GLASS, 0.3))
    src = est["hashin_shtrikman_lower"].source
    assert "whatever the inclusion shape" in src and "Hashin & Shtrikman (1963)" in src
    lo, hi = hashin_shtrikman(FibrePhase.from_material(GLASS), MatrixPhase.from_material(EPOXY),
                              0.3)
    assert float(est["hashin_shtrikman_upper"].G12) == float(hi.G12)
    assert "averaged over the random_3d orientations" in est["voigt"].source


def test_aligned_strength_estimates_are_left_out_for_random_orientations():
    comp = Composite(CARBON, EPOXY, 0.4, orientation="random_in_plane")
    aligned = estimate(Composite(CARBON, EPOXY, 0.4))
    assert "longitudinal_tension" in aligned.strengths
    est = estimate(comp)
    assert set(est.strengths) == {"yield_lower_bound", "yield_upper_bound"}
    assert "assume aligned fibres" in est.notes["strengths"]


def test_band_uses_the_tighter_bounds_and_the_random_3d_expansion_bounds():
    est = estimate(short(GLASS, VF))
    lo, hi = est.band("E1")
    np.testing.assert_array_equal(lo, np.maximum(est["reuss"].E1,
                                                 est["hashin_shtrikman_lower"].E1))
    np.testing.assert_array_equal(hi, np.minimum(est["voigt"].E1,
                                                 est["hashin_shtrikman_upper"].E1))
    a_lo, a_hi = est.band("alpha1")
    mt = est["mori_tanaka"].alpha1
    assert np.all(a_lo <= mt * (1 + 1e-12)) and np.all(mt <= a_hi * (1 + 1e-12))
    planar = estimate(Composite(GLASS, EPOXY, 0.4, orientation="random_in_plane"))
    assert planar.band("nu12") is None and planar.band("alpha1") is None


def test_long_rods_random_in_space_note_the_packing_limit():
    est = estimate(short(GLASS, 0.2, aspect=200.0))
    assert "5.4 / aspect ratio = 0.027" in est.notes["packing"]
    assert "packing" not in estimate(short(GLASS, 0.02, aspect=200.0)).notes


def test_json_of_a_random_mat_has_the_plate_normal_constants():
    est = estimate(Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=50.0,
                             orientation="random_in_plane"), case="mat")
    d = json.loads(json.dumps(est.as_dict()))
    mt = d["models"]["mori_tanaka"]
    assert mt["E1"] == mt["E2"] and mt["E3"] < mt["E1"]
    assert "orientation average" in mt["source"]
