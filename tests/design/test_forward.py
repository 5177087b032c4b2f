"""Forward models of a composite as vectorised functions of the fibre fraction."""

import numpy as np
import pytest

from micromech.design.forward import (
    Constituents,
    applicable_models,
    bound_models,
    estimate_at,
    laminate_in_plane,
    mass_at,
    properties_at,
)
from micromech.errors import FractionError, InputError
from micromech.homogenize import FibrePhase, MatrixPhase, mori_tanaka, rule_of_mixtures
from micromech.homogenize.estimate import estimate
from micromech.laminate.clt import Laminate
from micromech.laminate.ply import PlyMaterial
from micromech.materials import Composite, weight_fraction_from_volume

PLY = dict(E1=140e9, E2=9e9, nu12=0.3, G12=5e9)  # invented ply constants


@pytest.mark.parametrize("code", ["[0/90]s", "[0/45]", "[+-45]s", "[0/30/-60]", "[0/90]"])
@pytest.mark.parametrize("bending", ["free", "restrained"])
def test_vectorised_laminate_constants_equal_the_laminate_package(code, bending):
    # same classical laminate theory, two implementations: agreement to rounding
    lam = Laminate.from_code(code, PlyMaterial(**PLY), 0.25e-3)
    ref = lam.in_plane_constants(bending)
    got = laminate_in_plane(**PLY, angles=lam.angles, thicknesses=lam.thicknesses,
                            bending=bending)
    for k in ("Ex", "Ey", "Gxy", "nuxy"):
        assert float(got[k]) == pytest.approx(getattr(ref, k), rel=1e-12)


def test_single_zero_ply_gives_the_ply_constants():
    c = laminate_in_plane(**PLY, angles=[0.0])  # exact identity
    assert [float(c[k]) for k in ("Ex", "Ey", "Gxy", "nuxy")] == pytest.approx(
        [140e9, 9e9, 5e9, 0.3], rel=1e-14)


def test_laminate_constants_broadcast_over_ply_constants_and_angle_sweeps():
    E1 = np.array([100e9, 140e9, 200e9])
    out = laminate_in_plane(E1, 9e9, 0.3, 5e9, angles=[0.0, 90.0, 90.0, 0.0])
    assert out["Ex"].shape == (3,)
    sweep = laminate_in_plane(E1[:, None], 9e9, 0.3, 5e9, angles=np.arange(0.0, 91.0)[:, None])
    assert sweep["Ex"].shape == (3, 91)
    assert sweep["Ex"][:, 0] == pytest.approx(E1, rel=1e-14)


def test_density_and_weight_fraction_with_voids(glass, resin):
    c = Constituents(glass, resin, void_fraction=0.02, fibre_density=2540.0,
                     matrix_density=1200.0)
    v = np.array([0.3, 0.6])
    m = mass_at(c, v)
    # rho = vf rho_f + (1 - vf - vv) rho_m (Agarwal, Broutman and Chandrashekhara 2006, Sec. 3.2)
    assert m["density"] == pytest.approx(v * 2540 + (1 - v - 0.02) * 1200, rel=1e-15)
    assert m["weight_fraction"] == pytest.approx(
        weight_fraction_from_volume(v, 2540.0, 1200.0, 0.02), rel=1e-15)
    assert mass_at(Constituents(glass, resin), v) == {}


def test_constituents_from_a_composite_carry_limit_densities_and_layup(glass, resin):
    comp = Composite(glass, resin, 0.5, arrangement="hexagonal")
    c = Constituents.from_composite(comp, layup="[0/90]s", ply_thickness=2e-4)
    assert c.packing_limit == pytest.approx(np.pi / (2 * np.sqrt(3)), rel=1e-15)  # exact
    assert float(c.fibre_density) == 2540.0 and c.angles == (0.0, 90.0, 90.0, 0.0)
    assert c.upper_fraction == c.packing_limit and c.shape == ()


def test_models_that_apply_follow_the_inclusion_shape_and_voids(glass, resin):
    assert applicable_models(Constituents(glass, resin)) == (
        "rule_of_mixtures", "halpin_tsai", "chamis", "cylinders", "mori_tanaka")
    assert applicable_models(Constituents(glass, resin, "spheroid", 10.0)) == (
        "halpin_tsai", "mori_tanaka")
    assert applicable_models(Constituents(glass, resin, "spheroid", 0.5)) == ("mori_tanaka",)
    assert applicable_models(Constituents(glass, resin, "sphere")) == ("mori_tanaka",)
    assert applicable_models(Constituents(glass, resin, void_fraction=0.01)) == ("mori_tanaka",)
    assert bound_models(Constituents(glass, resin, void_fraction=0.01)) is None
    assert bound_models(Constituents(glass, resin, "sphere")) is not None


def test_estimates_equal_the_estimators_and_the_estimate_command(glass, resin, glass_epoxy):
    c = Constituents(glass, resin)
    v = np.linspace(0.0, 0.8, 5)
    f, m = FibrePhase.from_material(glass), MatrixPhase.from_material(resin)
    assert estimate_at(c, "rule_of_mixtures", v).E2 == pytest.approx(
        rule_of_mixtures(f, m, v).E2, rel=1e-15)
    assert estimate_at(c, "mori_tanaka", v).G23 == pytest.approx(
        mori_tanaka(f, m, v).G23, rel=1e-15)
    est = estimate(glass_epoxy, strengths=False)
    for k in ("halpin_tsai", "chamis", "cylinders", "hashin_shtrikman_lower",
              "hashin_shtrikman_upper"):
        assert float(estimate_at(c, k, 0.55).E2) == pytest.approx(float(est[k].E2), rel=1e-14)


def test_property_mapping_is_lazy_and_lists_what_it_gives(glass, resin):
    c = Constituents.from_composite(Composite(glass, resin, 0.5), layup="[0/90]s")
    p = properties_at(c, "halpin_tsai", np.array([0.5]))
    assert "G23" not in p and "Ex" in p and "density" in p
    assert len(p) == len(list(p))
    with pytest.raises(KeyError):
        p["G23"]
    with pytest.raises(KeyError):
        p["nonsense"]


def test_several_constituents_gain_a_trailing_axis(glass, resin):
    c = Constituents(FibrePhase.isotropic([72e9, 86e9], 0.22), resin)
    assert c.shape == (2,)
    e = c.expanded()
    assert e.shape == (2, 1)
    assert estimate_at(e, "mori_tanaka", np.linspace(0, 0.5, 4)).E1.shape == (2, 4)
    assert Constituents(glass, resin).expanded().shape == ()


def test_unknown_inclusion_is_an_error(glass, resin):
    with pytest.raises(InputError, match="inclusion = 'fibre': expected continuous"):
        Constituents(glass, resin, "fibre")  # type: ignore[arg-type]


def test_spheroid_without_aspect_ratio_is_an_error(glass, resin):
    with pytest.raises(InputError, match="a spheroid inclusion needs an aspect ratio"):
        Constituents(glass, resin, "spheroid")


def test_packing_limit_outside_the_unit_interval_is_an_error(glass, resin):
    with pytest.raises(InputError, match=r"packing_limit = 1.2 must lie in \(0, 1\]"):
        Constituents(glass, resin, packing_limit=1.2)


def test_void_fraction_outside_the_unit_interval_is_an_error(glass, resin):
    with pytest.raises(FractionError, match=r"void_fraction = 1.0 must lie in \[0, 1\)"):
        Constituents(glass, resin, void_fraction=1.0)


def test_case_without_a_composite_is_an_error():
    class Bare:
        name = "bare"
        composite = None

    with pytest.raises(InputError, match="case 'bare': sizing needs"):
        Constituents.from_case(Bare())


def test_model_that_does_not_apply_is_an_error(glass, resin):
    with pytest.raises(InputError, match="model 'chamis' does not apply to sphere inclusions"):
        estimate_at(Constituents(glass, resin, "sphere"), "chamis", 0.3)


def test_bounds_of_an_anisotropic_particle_are_an_error(carbon, resin):
    with pytest.raises(InputError, match="no bounds with voids, nor for sphere inclusions"):
        estimate_at(Constituents(carbon, resin, "sphere"), "hashin_shtrikman_lower", 0.3)


def test_laminate_without_plies_is_an_error():
    with pytest.raises(InputError, match="angles: a laminate needs at least one ply"):
        laminate_in_plane(**PLY, angles=[])


def test_laminate_thicknesses_of_the_wrong_length_are_an_error():
    with pytest.raises(InputError, match=r"thicknesses: \(3,\) given for 2 plies"):
        laminate_in_plane(**PLY, angles=[0, 90], thicknesses=[1, 1, 1])


def test_unknown_bending_is_an_error():
    with pytest.raises(InputError, match="bending: expected 'free' or 'restrained'"):
        laminate_in_plane(**PLY, angles=[0], bending="clamped")  # type: ignore[arg-type]


@pytest.mark.parametrize("bending", ["free", "restrained"])
def test_invariant_form_equals_the_laminate_package_for_random_stacks(bending):
    # two implementations of classical laminate theory (invariants here, Q-bar matrices in
    # micromech.laminate): agreement to rounding for random angles, thicknesses and plies
    rng = np.random.default_rng(2024)
    for _ in range(25):
        n = int(rng.integers(1, 7))
        angles = rng.uniform(-90.0, 90.0, n)
        t = rng.uniform(0.05e-3, 0.5e-3, n)
        ply = dict(E1=rng.uniform(20e9, 300e9), E2=rng.uniform(3e9, 15e9),
                   nu12=rng.uniform(0.1, 0.4), G12=rng.uniform(1e9, 8e9))
        ref = Laminate.from_angles(angles, PlyMaterial(**ply), t).in_plane_constants(bending)
        got = laminate_in_plane(**ply, angles=angles, thicknesses=t, bending=bending)
        for k in ("Ex", "Ey", "Gxy", "nuxy"):
            assert float(got[k]) == pytest.approx(getattr(ref, k), rel=1e-9, abs=1e-12)


# --- fibre orientation ------------------------------------------------------------------------


def test_constituents_from_a_composite_carry_the_orientation(glass, resin):
    comp = Composite(glass, resin, 0.3, inclusion="spheroid", aspect_ratio=30.0,
                     orientation="random_3d")
    c = Constituents.from_composite(comp)
    assert c.orientation == "random_3d" and c.inclusion_text == "spheroid (random_3d)"
    assert Constituents.from_composite(Composite(glass, resin, 0.3)).orientation == "aligned"


@pytest.mark.parametrize("orientation", ["random_in_plane", "random_3d"])
@pytest.mark.parametrize("fibre", ["glass", "carbon"])
def test_random_orientations_use_the_models_estimate_returns(glass, carbon, resin, orientation,
                                                             fibre):
    f = {"glass": glass, "carbon": carbon}[fibre]
    comp = Composite(f, resin, 0.3, inclusion="spheroid", aspect_ratio=30.0,
                     orientation=orientation)
    c = Constituents.from_composite(comp)
    est = estimate(comp, strengths=False)
    assert applicable_models(c) == ("mori_tanaka",)
    for k in ("mori_tanaka", "hashin_shtrikman_lower", "hashin_shtrikman_upper"):
        if k in est:  # same values as estimate(), exactly
            for name in ("E1", "E3", "G12", "G13"):
                assert float(estimate_at(c, k, 0.3).get(name)) == float(est[k].get(name))
    assert (bound_models(c) is not None) == ("hashin_shtrikman_lower" in est)


def test_bounds_of_fibres_random_in_plane_are_an_error(glass, resin):
    c = Constituents(glass, resin, "continuous", orientation="random_in_plane")
    with pytest.raises(InputError, match="no bounds .*nor for fibres random in plane"):
        estimate_at(c, "hashin_shtrikman_upper", 0.3)
    with pytest.raises(InputError, match=r"model 'halpin_tsai' does not apply to continuous "
                                         r"\(random_in_plane\) inclusions; use one of "
                                         r"mori_tanaka"):
        estimate_at(c, "halpin_tsai", 0.3)


def test_orientation_that_does_not_fit_the_constituents_is_an_error(glass, resin):
    with pytest.raises(InputError, match=r"orientation = 'random_3d' is not allowed with "
                                         r"inclusion = 'sphere'"):
        Constituents(glass, resin, "sphere", orientation="random_3d")
