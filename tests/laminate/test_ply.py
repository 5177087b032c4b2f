"""Ply materials, strengths and plies: constructors, defaults and validation."""

from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import pytest

from micromech.errors import InputError, InvalidMaterialError, UnitError
from micromech.laminate import Ply, PlyMaterial, PlyStrengths
from micromech.results import ElasticConstants


def test_unit_strings_are_converted_to_si():
    m = PlyMaterial(E1="181 GPa", E2="10.3 GPa", nu12=0.28, G12="7.17 GPa",
                    alpha1="0.02e-6 1/K", alpha2="22.5e-6 1/K",
                    strengths={"Xt": "1500 MPa", "Yc": "246 MPa"})
    assert m.E1 == pytest.approx(181e9, rel=1e-12)
    assert m.alpha2 == pytest.approx(22.5e-6, rel=1e-12)
    assert m.strengths is not None and m.strengths.Yc == pytest.approx(246e6, rel=1e-12)
    assert m.strengths.missing(("Xt", "Xc", "S12")) == ["Xc", "S12"]
    assert not m.strengths.complete


def test_transversely_isotropic_defaults_fill_the_third_axis():
    m = PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9, nu23=0.4)
    assert (m.E3, m.G13, m.nu13) == (10e9, 5e9, 0.3)
    assert m.G23 == pytest.approx(10e9 / 2.8, rel=1e-14)  # G23 = E2 / (2 (1 + nu23))
    m2 = PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9, G23=10e9 / 2.8)
    assert m2.nu23 == pytest.approx(0.4, rel=1e-12)
    assert m.has_3d and not PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9).has_3d


def test_3d_stiffness_reduces_to_the_plane_stress_q():
    m = PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9, nu23=0.4)
    S = np.linalg.inv(m.stiffness())
    Q = np.linalg.inv(S[np.ix_([0, 1, 5], [0, 1, 5])])
    np.testing.assert_allclose(Q, m.reduced_stiffness(), rtol=1e-12, atol=1e-3)
    np.testing.assert_allclose(np.linalg.inv(m.compliance_2d()), Q, rtol=1e-12, atol=1e-3)


def test_estimate_result_becomes_a_ply_with_separate_strengths():
    ec = ElasticConstants.transversely_isotropic(
        np.array(140e9), 9e9, 0.31, 4.5e9, nu23=0.42, alpha1=-0.3e-6, alpha2=30e-6,
        model="mori_tanaka", source="Mori and Tanaka (1973)",
    )
    m = PlyMaterial.from_constants(ec, strengths=PlyStrengths(Xt=1.9e9, Xc=1.2e9, Yt=50e6,
                                                             Yc=200e6, S12=80e6))
    assert m.name == "mori_tanaka" and "Mori" in m.source
    assert (m.E1, m.E2, m.nu12, m.G12, m.nu23) == (140e9, 9e9, 0.31, 4.5e9, 0.42)
    assert m.alpha1 == -0.3e-6 and m.has_expansion and m.strengths.complete


def test_estimate_over_many_fractions_is_refused_as_a_ply():
    ec = ElasticConstants.transversely_isotropic([140e9, 150e9], 9e9, 0.31, 4.5e9)
    with pytest.raises(InputError, match=r"one value, got an array of shape \(2,\)"):
        PlyMaterial.from_constants(ec)


def test_estimate_without_in_plane_constants_is_refused():
    with pytest.raises(InputError, match="missing E2, G12"):
        PlyMaterial.from_constants(ElasticConstants(E1=1e9, nu12=0.3, model="partial"))


def test_material_objects_transversely_isotropic_isotropic_and_view():
    ti = SimpleNamespace(E1=230e9, E2=15e9, nu12=0.2, G12=15e9, nu23=0.07, name="fibre",
                         strengths=SimpleNamespace(Xt=3e9, Xc=None, Yt=None, Yc=None, S12=None))
    m = PlyMaterial.from_material(ti)
    assert m.name == "fibre" and m.strengths.Xt == 3e9 and m.nu23 == 0.07
    iso = PlyMaterial.from_material(SimpleNamespace(E=70e9, nu=0.3, alpha=23e-6))
    assert iso.G12 == pytest.approx(70e9 / 2.6) and iso.E2 == 70e9 and iso.alpha2 == 23e-6
    view = SimpleNamespace(ti=lambda: SimpleNamespace(E1=1e11, E2=1e10, nu12=0.3, G12=5e9))
    assert PlyMaterial.from_material(view).E1 == 1e11


def test_material_model_from_the_materials_package():
    from micromech.materials import Isotropic, TransverselyIsotropic

    t = TransverselyIsotropic(name="ud", E1="140 GPa", E2="10 GPa", nu12=0.3, G12="5 GPa",
                              nu23=0.4, strengths={"Xt": "2 GPa", "Yt": "50 MPa"})
    m = PlyMaterial.from_material(t)
    assert m.E1 == pytest.approx(140e9) and m.G23 == pytest.approx(10e9 / 2.8)
    assert m.strengths.Yt == pytest.approx(50e6)
    i = PlyMaterial.from_material(Isotropic(name="al", E="70 GPa", nu=0.33))
    assert i.E1 == pytest.approx(70e9) and i.nu23 == pytest.approx(0.33)


def test_registry_entry_becomes_a_ply():
    m = PlyMaterial.from_registry("carbon-standard", strengths={"Xt": "2 GPa"})
    assert m.E1 > m.E2 > 0 and m.strengths.Xt == pytest.approx(2e9)


def test_object_without_constants_is_refused():
    with pytest.raises(InputError, match="needs E1, E2, nu12, G12"):
        PlyMaterial.from_material(SimpleNamespace(name="blank"))


@pytest.mark.parametrize(
    ("kwargs", "error", "message"),
    [
        ({"E2": -1e9}, InvalidMaterialError, r"E2 = -1e\+09 Pa must be positive"),
        ({"nu12": 5.0}, InvalidMaterialError, r"nu12 = 5 must satisfy \|nu12\| < sqrt"),
        ({"G12": float("nan")}, InvalidMaterialError, "G12 = nan: must be finite"),
        ({"nu23": 0.999, "E3": 100e9, "G23": 3e9}, InvalidMaterialError,
         "3D stiffness.*positive definite"),
        ({"E1": "181 MPa/m"}, UnitError, "E1"),
    ],
)
def test_invalid_constants_are_refused(kwargs, error, message):
    base = {"E1": 181e9, "E2": 10.3e9, "nu12": 0.28, "G12": 7.17e9}
    with pytest.raises(error, match=message):
        PlyMaterial(**{**base, **kwargs})


def test_strengths_must_be_positive_and_known():
    with pytest.raises(InvalidMaterialError, match=r"strength Xc = -1.5e\+09 Pa: must be positive"):
        PlyStrengths(Xc=-1.5e9)
    with pytest.raises(InputError, match="unknown key 'Zt'"):
        PlyStrengths.from_any({"Zt": 1e6})
    assert PlyStrengths.from_any({}) is None
    assert PlyStrengths(Xt="1 GPa").as_dict()["Xt"] == pytest.approx(1e9)


def test_3d_stiffness_needs_the_transverse_constants():
    m = PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9)
    with pytest.raises(InputError, match="3D stiffness needs G23, nu23"):
        m.stiffness()


def test_discounted_ply_keeps_or_drops_the_fibre_stiffness(graphite_epoxy):
    matrix_failed = graphite_epoxy.degraded(1e-6, keep_fibre=True)
    fibre_failed = graphite_epoxy.degraded(1e-6, keep_fibre=False)
    assert matrix_failed.E1 == graphite_epoxy.E1
    assert matrix_failed.E2 == pytest.approx(10.3e3) and matrix_failed.G12 == pytest.approx(7.17e3)
    assert fibre_failed.E1 == pytest.approx(181e3)
    assert matrix_failed.strengths is graphite_epoxy.strengths


def test_ply_thickness_and_angle_are_checked(graphite_epoxy):
    assert Ply(graphite_epoxy, 45, "0.125 mm").thickness == pytest.approx(125e-6)
    with pytest.raises(InputError, match="ply thickness = 0 m: must be positive"):
        Ply(graphite_epoxy, 0.0, 0.0)
    with pytest.raises(InputError, match="ply angle = nan: must be finite"):
        Ply(graphite_epoxy, float("nan"), 1e-3)
    with pytest.raises(InputError, match="expected a PlyMaterial, got dict"):
        Ply({"E1": 1}, 0.0, 1e-3)  # type: ignore[arg-type]


# --- constituents -> ply -> laminate in one call -------------------------------------------------

def _glass_epoxy(vf=0.55):
    from micromech.materials import Composite, Isotropic

    # invented constants of the magnitude of E-glass and epoxy
    return Composite(Isotropic(name="glass", E="72 GPa", nu=0.22, alpha="5e-6 1/K"),
                     Isotropic(name="resin", E="3.5 GPa", nu=0.35, alpha="60e-6 1/K"), vf)


def test_composite_becomes_a_ply_through_the_named_estimate():
    from micromech.homogenize import estimate

    c = _glass_epoxy()
    m = PlyMaterial.from_composite(c, "rule_of_mixtures", strengths={"Xt": "1 GPa"})
    # E1 = Ef Vf + Em (1 - Vf) (Jones 1999, 2nd ed., Eq. 3.6; exact algebra): 41.175 GPa
    assert m.E1 == pytest.approx(0.55 * 72e9 + 0.45 * 3.5e9, rel=1e-14)
    assert m.name == "rule_of_mixtures estimate" and "Voigt" in m.source
    assert m.strengths.Xt == pytest.approx(1e9)
    mt = PlyMaterial.from_composite(c)  # Mori-Tanaka by default
    ref = estimate(c).models["mori_tanaka"]
    assert (mt.E2, mt.G12, mt.nu23) == pytest.approx(
        (float(ref.E2), float(ref.G12), float(ref.nu23)), rel=1e-14)
    assert mt.has_3d and mt.has_expansion


def test_composite_with_a_model_that_does_not_apply_is_refused():
    from micromech.materials import Composite, Isotropic

    beads = Composite(Isotropic(E="70 GPa", nu=0.22), Isotropic(E="3 GPa", nu=0.35), 0.3,
                      inclusion="sphere")
    with pytest.raises(InputError, match=r"ply model = 'chamis' does not apply to this "
                                         r"composite \(.*sphere.*\); available: .*mori_tanaka"):
        PlyMaterial.from_composite(beads, "chamis")


def test_composite_with_several_fractions_is_refused_as_a_ply():
    with pytest.raises(InputError, match=r"volume_fraction has shape \(2,\); a ply needs one"):
        PlyMaterial.from_composite(_glass_epoxy(np.array([0.4, 0.5])))


def test_coerce_takes_every_source_of_ply_constants():
    c = _glass_epoxy()
    ply = PlyMaterial(E1=140e9, E2=10e9, nu12=0.3, G12=5e9)
    assert PlyMaterial.coerce(ply) is ply
    assert PlyMaterial.coerce(ply, strengths={"Yt": "50 MPa"}).strengths.Yt == pytest.approx(50e6)
    assert PlyMaterial.coerce("carbon-standard").E1 == pytest.approx(230e9)  # registry key
    ec = ElasticConstants.transversely_isotropic(np.array(140e9), 9e9, 0.31, 4.5e9)
    assert PlyMaterial.coerce(ec).E2 == 9e9
    assert PlyMaterial.coerce(c, model="halpin_tsai").name == "halpin_tsai estimate"
    assert PlyMaterial.coerce(SimpleNamespace(E=70e9, nu=0.3)).G12 == pytest.approx(70e9 / 2.6)
    with pytest.raises(InputError, match="needs E1, E2, nu12, G12"):
        PlyMaterial.coerce(SimpleNamespace(name="blank"))


def test_laminate_from_a_composite_in_one_call():
    from micromech.laminate import Laminate

    c = _glass_epoxy()
    lam = Laminate.from_code("[0/90]s", c, "0.25 mm", strengths={"Xt": "1 GPa"})
    ply = PlyMaterial.from_composite(c)
    ref = Laminate.from_code("[0/90]s", ply, 0.25e-3)
    np.testing.assert_allclose(lam.A, ref.A, rtol=1e-14)
    in_plane = lam.in_plane_constants()
    assert in_plane.Ex == pytest.approx(in_plane.Ey, rel=1e-12)  # balanced cross-ply (exact)
    assert lam.plies[0].material.strengths.Xt == pytest.approx(1e9)
    assert lam.plies[0].material is lam.plies[3].material  # estimated once
    hybrid = Laminate.from_angles([0, 90, 0], [c, "carbon-standard", c], 0.2e-3,
                                  model="cylinders")
    assert hybrid.plies[0].material.name == "cylinders estimate"
    assert hybrid.plies[1].material.E1 == pytest.approx(230e9)
    with pytest.raises(InputError, match="2 materials given for 3 plies"):
        Laminate.from_angles([0, 90, 0], (c, c), 0.2e-3)
