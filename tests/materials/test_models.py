"""Tests of micromech.materials.models: constituent models, units, validation, round trips.

Admissibility rules: Lempriere (1968), AIAA J. 6(11) 2226; Jones (1999), Mechanics of Composite
Materials, 2nd ed., Sec. 2.4. Isotropic relation G = E / (2 (1 + nu)) is exact.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech import tensors
from micromech.errors import InvalidMaterialError, MicromechError, UnitError
from micromech.materials import (
    Isotropic,
    Orthotropic,
    Strengths,
    TransverselyIsotropic,
    material_from_dict,
)

SETTINGS = settings(max_examples=60, deadline=None)
modulus = st.floats(min_value=1e9, max_value=5e11)
shear = st.floats(min_value=2e8, max_value=2e11)
scaled_nu = st.floats(min_value=-0.45, max_value=0.45)

CARBON = dict(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", nu23=0.07)
ORTHO = dict(E1=140e9, E2=10e9, E3=9e9, G12=5.5e9, G13=5e9, G23=3.5e9, nu12=0.3, nu13=0.28,
             nu23=0.45)


def rel(a, b):
    return np.max(np.abs(np.asarray(a) - np.asarray(b))) / np.max(np.abs(np.asarray(b)))


# --- construction and units -------------------------------------------------------------------


def test_isotropic_accepts_quantity_strings_in_every_field():
    m = Isotropic(name="glass", E="72 GPa", nu=0.22, density="2.54 g/cm^3", alpha="5e-6 1/K",
                  fibre_diameter="7 um", strengths={"Xt": "3.4 GPa", "yield_strength": "1 GPa"})
    assert m.E == 72e9
    assert m.density == pytest.approx(2540.0, rel=1e-12)
    assert m.alpha == pytest.approx(5e-6, rel=1e-12)
    assert m.fibre_diameter == pytest.approx(7e-6, rel=1e-12)
    assert m.strengths.Xt == pytest.approx(3.4e9, rel=1e-12)
    assert m.strengths.yield_strength == pytest.approx(1e9, rel=1e-12)


def test_isotropic_shear_modulus_is_derived_from_poisson_ratio():
    m = Isotropic(E=3.5e9, nu=0.35)
    assert m.G == pytest.approx(3.5e9 / 2.7, rel=1e-15)  # G = E / (2 (1 + nu)), exact


def test_isotropic_poisson_ratio_is_derived_from_shear_modulus():
    m = Isotropic(E=3.5e9, G=1.25e9)
    assert m.nu == pytest.approx(3.5 / 2.5 - 1, rel=1e-14)


def test_isotropic_accepts_consistent_nu_and_g():
    assert Isotropic(E=2.7e9, nu=0.35, G=1e9).G == 1e9


def test_isotropic_axis_accessors_are_all_alike():
    m = Isotropic(E=72e9, nu=0.22, alpha=5e-6)
    assert m.E1 == m.E2 == m.E3 == 72e9
    assert m.G12 == m.G13 == m.G23 == m.G
    assert m.nu12 == m.nu13 == m.nu23 == 0.22
    assert m.alpha1 == m.alpha2 == m.alpha3 == 5e-6
    assert m.bulk_modulus == pytest.approx(72e9 / (3 * (1 - 0.44)), rel=1e-14)


def test_transversely_isotropic_g23_is_derived_from_nu23():
    f = TransverselyIsotropic(**CARBON)
    assert f.G23 == pytest.approx(15e9 / 2.14, rel=1e-14)
    assert (f.E3, f.G13, f.nu13) == (f.E2, f.G12, f.nu12)
    assert f.nu21 == pytest.approx(0.2 * 15 / 230, rel=1e-14)


def test_transversely_isotropic_nu23_is_derived_from_g23():
    f = TransverselyIsotropic(E1=230e9, E2=15e9, nu12=0.2, G12=15e9, G23=7e9)
    assert f.nu23 == pytest.approx(15 / 14 - 1, rel=1e-13)


def test_strengths_as_dict_lists_given_values_only():
    s = Strengths(Xt="1.5 GPa", Yc=200e6)
    assert s.as_dict() == {"Xt": 1.5e9, "Yc": 200e6}


def test_models_are_frozen():
    m = Isotropic(E=3e9, nu=0.3)
    with pytest.raises(ValueError, match="frozen"):
        m.E = 4e9


# --- round trips and views --------------------------------------------------------------------


@SETTINGS
@given(modulus, st.floats(min_value=-0.95, max_value=0.49))
def test_isotropic_constants_round_trip_through_stiffness(E, nu):
    c = tensors.engineering_constants(Isotropic(E=E, nu=nu).stiffness())
    for k in ("E1", "E2", "E3"):
        assert c[k] == pytest.approx(E, rel=1e-12)
    for k in ("nu12", "nu13", "nu23"):
        assert c[k] == pytest.approx(nu, rel=1e-12, abs=1e-12)


@st.composite
def ti_inputs(draw):
    E1, E2, G12 = draw(modulus), draw(modulus), draw(shear)
    nu12 = draw(scaled_nu) * np.sqrt(E1 / E2)
    nu23 = draw(st.floats(min_value=-0.9, max_value=0.9)) * (1 - 2 * nu12**2 * E2 / E1)
    return dict(E1=E1, E2=E2, nu12=nu12, G12=G12, nu23=nu23)


@SETTINGS
@given(ti_inputs())
def test_transversely_isotropic_constants_round_trip_through_stiffness(kw):
    f = TransverselyIsotropic(**kw)
    c = tensors.engineering_constants(f.stiffness())
    for k in ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23"):
        assert c[k] == pytest.approx(getattr(f, k), rel=1e-12, abs=1e-12), k


@SETTINGS
@given(modulus, modulus, modulus, shear, shear, shear, scaled_nu, scaled_nu, scaled_nu)
def test_orthotropic_constants_round_trip_through_stiffness(E1, E2, E3, G12, G13, G23, a, b, c):
    m = Orthotropic(E1=E1, E2=E2, E3=E3, G12=G12, G13=G13, G23=G23, nu12=a * np.sqrt(E1 / E2),
                    nu13=b * np.sqrt(E1 / E3), nu23=c * np.sqrt(E2 / E3))
    out = tensors.engineering_constants(m.stiffness())
    for k in ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23"):
        assert out[k] == pytest.approx(getattr(m, k), rel=1e-12, abs=1e-12), k
    assert bool(tensors.is_positive_definite(m.stiffness()))


def test_isotropic_ti_view_has_the_same_stiffness():
    m = Isotropic(E=72e9, nu=0.22, alpha=5e-6, density=2540)
    t = m.ti()
    assert isinstance(t, TransverselyIsotropic)
    assert rel(t.stiffness(), m.stiffness()) < 1e-14
    assert (t.alpha1, t.alpha2, t.density) == (5e-6, 5e-6, 2540)


def test_transversely_isotropic_ti_view_is_itself():
    f = TransverselyIsotropic(**CARBON)
    assert f.ti() is f


def test_orthotropic_with_tied_constants_has_a_ti_view_with_the_same_stiffness():
    f = TransverselyIsotropic(**CARBON)
    o = Orthotropic(E1=f.E1, E2=f.E2, E3=f.E2, G12=f.G12, G13=f.G12, G23=f.G23, nu12=f.nu12,
                    nu13=f.nu12, nu23=f.nu23)
    assert rel(o.ti().stiffness(), f.stiffness()) < 1e-12


def test_orthotropic_ti_view_is_refused_when_not_transversely_isotropic():
    with pytest.raises(InvalidMaterialError, match=r"not transversely isotropic about axis 1: "
                       r"E3 = 9e\+09 differs from E2 = 1e\+10"):
        Orthotropic(**ORTHO).ti()


def test_compliance_is_inverse_of_stiffness():
    o = Orthotropic(**ORTHO)
    assert rel(o.compliance() @ o.stiffness(), np.eye(6)) < 1e-12


def test_constants_give_an_elastic_constants_result_with_ctes():
    f = TransverselyIsotropic(**CARBON, alpha1="-0.5e-6 1/K", alpha2="10e-6 1/K")
    r = f.constants()
    assert float(r.E1) == 230e9 and float(r.G23) == pytest.approx(f.G23)
    assert float(r.alpha3) == pytest.approx(10e-6)
    assert rel(r.stiffness(), f.stiffness()) < 1e-12


def test_thermal_expansion_vector_in_voigt_order():
    f = TransverselyIsotropic(**CARBON, alpha1=-0.5e-6, alpha2=10e-6)
    assert f.thermal_expansion().tolist() == [-0.5e-6, 10e-6, 10e-6, 0.0, 0.0, 0.0]
    assert TransverselyIsotropic(**CARBON).thermal_expansion() is None


def test_replaced_rederives_the_partner_of_a_changed_constant():
    m = Isotropic(E=3.5e9, nu=0.35)
    assert m.replaced(E="4 GPa").nu == 0.35  # nu was given, kept; G follows E
    assert m.replaced(E="4 GPa").G == pytest.approx(4e9 / 2.7)
    assert m.replaced(G=1.5e9).nu == pytest.approx(3.5 / 3 - 1)
    f = TransverselyIsotropic(**CARBON)
    assert f.replaced(G23="6 GPa").nu23 == pytest.approx(15 / 12 - 1)


def test_material_from_dict_infers_the_kind():
    assert isinstance(material_from_dict({"E": 3e9, "nu": 0.3}), Isotropic)
    assert isinstance(material_from_dict(dict(CARBON)), TransverselyIsotropic)
    assert isinstance(material_from_dict(dict(ORTHO)), Orthotropic)
    assert isinstance(material_from_dict({"kind": "ti", **CARBON}), TransverselyIsotropic)


# --- validation: every rule names the field ---------------------------------------------------


@pytest.mark.parametrize(
    ("cls", "kwargs", "match"),
    [
        (Isotropic, dict(E="-3 GPa", nu=0.3), r"E = -3000000000.0 must be positive"),
        (Isotropic, dict(E=0.0, nu=0.3), r"E = 0.0 must be positive"),
        (Isotropic, dict(E=3e9, G=-1e9), r"G = -1000000000.0 must be positive"),
        (Isotropic, dict(E=3e9, nu=0.5), r"nu = 0.5 makes the stiffness not positive definite: "
                                         r"need -1 < nu < 0.5"),
        (Isotropic, dict(E=3e9, nu=-1.0), r"nu = -1 makes the stiffness not positive"),
        (Isotropic, dict(E=3e9), r"give nu \(Poisson ratio\) or G \(shear modulus\)"),
        (Isotropic, dict(E=3e9, nu=0.3, G=2e9), r"inconsistent inputs: G = 2e\+09 Pa but "
                                                r"E / \(2 \(1 \+ nu\)\)"),
        (Isotropic, dict(E=3e9, nu=0.3, density=-1.0), r"density = -1.0 must be positive"),
        (Isotropic, dict(E=3e9, nu=0.3, fibre_diameter="0 um"), r"fibre_diameter = 0.0 must be "
                                                                 r"positive"),
        (Isotropic, dict(E=3e9, nu=0.3, Ee=1.0), r"unknown field 'Ee'; did you mean 'E'\?"),
        (Isotropic, dict(nu=0.3), r"missing required field 'E'"),
        (Isotropic, dict(E=float("nan"), nu=0.3), r"E = nan must be finite"),
        (Isotropic, dict(E=3e9, nu=0.3, role="resin"), r"field 'role': Input should be"),
        (TransverselyIsotropic, dict(CARBON, E2="-15 GPa"), r"E2 = -15000000000.0 must be "
                                                            r"positive"),
        (TransverselyIsotropic, dict(CARBON, G12=0.0), r"G12 = 0.0 must be positive"),
        (TransverselyIsotropic, dict(CARBON, nu12=4.0), r"nu12 = 4 makes the stiffness not "
                                                        r"positive definite: need \|nu12\| < "
                                                        r"sqrt\(E1 / E2\)"),
        (TransverselyIsotropic, dict(CARBON, nu23=0.999), r"nu23 = 0.999 \(with nu12 = 0.2\) "
                                                          r"makes the stiffness not positive "
                                                          r"definite: need -1 < nu23 < 1 - 2 "
                                                          r"nu12\^2 E2 / E1"),
        (TransverselyIsotropic, dict(CARBON, nu23=-1.0), r"nu23 = -1 \(with nu12 = 0.2\)"),
        (TransverselyIsotropic, dict(CARBON, G23="7 GPa"), r"inconsistent inputs: G23 = 7e\+09 "
                                                           r"Pa but E2 / \(2 \(1 \+ nu23\)\)"),
        (TransverselyIsotropic, {k: v for k, v in CARBON.items() if k != "nu23"},
         r"give nu23 or G23 \(transverse shear\); neither given"),
        (TransverselyIsotropic, dict(CARBON, E3=1e9), r"unknown field 'E3'"),
        (Orthotropic, dict(ORTHO, E3=-9e9), r"E3 = -9000000000.0 must be positive"),
        (Orthotropic, dict(ORTHO, nu12=4.0), r"nu12 = 4 makes the stiffness not positive "
                                             r"definite: need \|nu12\| < sqrt\(E1 / E2\)"),
        (Orthotropic, dict(ORTHO, nu13=-4.0), r"nu13 = -4 .* \|nu13\| < sqrt\(E1 / E3\)"),
        (Orthotropic, dict(ORTHO, nu23=1.1), r"nu23 = 1.1 .* \|nu23\| < sqrt\(E2 / E3\)"),
        (Orthotropic, dict(ORTHO, E2=140e9, E3=140e9, nu12=0.9, nu13=0.9, nu23=0.9),
         r"Poisson ratios nu12 = 0.9, nu13 = 0.9, nu23 = 0.9 make the stiffness not positive "
         r"definite: need 1 - nu12 nu21 .* > 0"),
        (Orthotropic, {k: v for k, v in ORTHO.items() if k != "G13"},
         r"missing required field 'G13'"),
    ],
)
def test_invalid_constants_raise_naming_field_and_rule(cls, kwargs, match):
    with pytest.raises(InvalidMaterialError, match=match):
        cls(name="sample", **kwargs)


def test_error_message_names_the_material():
    with pytest.raises(InvalidMaterialError, match=r"^isotropic material 'resin A': E = "):
        Isotropic(name="resin A", E=-1.0, nu=0.3)


def test_constants_near_the_stability_limit_fail_the_positive_definite_check():
    # nu23 a hair below its analytic limit: the stiffness is too ill-conditioned to be accepted.
    upper = 1 - 2 * 0.2**2 * 15 / 230
    with pytest.raises(InvalidMaterialError, match=r"stiffness that is not positive definite"):
        TransverselyIsotropic(**dict(CARBON, nu23=upper * (1 - 1e-15)))


def test_unreadable_quantity_raises_unit_error_naming_field():
    with pytest.raises(UnitError, match=r"isotropic material 'x': E expects a pressure"):
        Isotropic(name="x", E="3 GPa/m", nu=0.3)


def test_unit_error_inside_strengths_names_the_field():
    with pytest.raises(UnitError, match=r"Xt expects a pressure"):
        Isotropic(name="x", E=3e9, nu=0.3, strengths={"Xt": "80 mm"})


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        (dict(Xc=-600e6), r"Xc = -600000000.0 must be positive: give compressive strengths as "
                          r"positive magnitudes"),
        (dict(Yc="-100 MPa"), r"Yc = -100000000.0 must be positive: give compressive"),
        (dict(Xt=0.0), r"Xt = 0.0 must be positive"),
        (dict(S12=-1.0), r"S12 = -1.0 must be positive"),
        (dict(Xx=1.0), r"unknown field 'Xx'; valid fields: Xt, Xc, Yt, Yc, S12, S23, "
                      r"yield_strength"),  # nothing clearly nearest: the list
        (dict(Xt="inf MPa"), r"Xt must be a finite number, got 'inf MPa'"),
    ],
)
def test_invalid_strengths_raise_naming_field(kwargs, match):
    with pytest.raises((InvalidMaterialError, UnitError), match=match):
        Strengths(**kwargs)


# A bare number is Pa; a modulus below 0.1 MPa or a strength below 1 kPa is a unit left out
# (thresholds: common practice, no source).
@pytest.mark.parametrize(
    ("cls", "kwargs", "match"),
    [
        (TransverselyIsotropic, dict(CARBON, E1=230),
         r"E1 = 230 Pa is below 0\.1 MPa, far below any fibre or matrix: a bare number is read as "
         r"Pa; write '230 GPa'"),
        (Isotropic, dict(E="230", nu=0.3),
         r"E = 230 Pa is below 0\.1 MPa, .*write '230 GPa'"),  # a number as text is bare too
        (Isotropic, dict(E=3500, nu=0.35), r"E = 3500 Pa is below 0\.1 MPa, .*write '3500 MPa'"),
        (Isotropic, dict(E=3.5e9, G=1300), r"G = 1300 Pa is below 0\.1 MPa"),
        (TransverselyIsotropic, dict(CARBON, G23=7), r"G23 = 7 Pa is below 0\.1 MPa"),
        (Isotropic, dict(E="230 Pa", nu=0.3),
         r"E = '230 Pa' is 230 Pa, below 0\.1 MPa, far below any fibre or matrix: check the unit"),
        (Isotropic, dict(E=3e9, nu=0.3, strengths={"Xt": 80}),
         r"strengths: Xt = 80 Pa is below 1 kPa, far below any fibre, matrix or ply strength: a "
         r"bare number is read as Pa; write '80 MPa'"),
    ],
)
def test_far_too_small_modulus_or_strength_is_refused(cls, kwargs, match):
    with pytest.raises(InvalidMaterialError, match=match):
        cls(name="m", **kwargs)


def test_smallest_moduli_and_strengths_accepted():
    m = Isotropic(E=1e5, nu=0.49, strengths={"Xt": 1e3})  # 0.1 MPa, 1 kPa: the floors
    assert m.E == 1e5 and m.strengths.Xt == 1e3
    with pytest.raises(InvalidMaterialError, match=r"E = 0.0 must be positive"):
        Isotropic(E=0.0, nu=0.3)  # zero keeps the positivity message


def test_invalid_strengths_inside_a_material_name_the_material():
    with pytest.raises(InvalidMaterialError, match=r"isotropic material 'm': strengths: Xc = "):
        Isotropic(name="m", E=3e9, nu=0.3, strengths={"Xc": -1.0})


def test_material_from_dict_rejects_unknown_kind_with_suggestion():
    with pytest.raises(InvalidMaterialError, match=r"\[fibre\]: unknown kind 'isotropc'; "
                       r"expected isotropic, transversely_isotropic or orthotropic; did you "
                       r"mean 'isotropic'\?"):
        material_from_dict({"kind": "isotropc", "E": 1e9, "nu": 0.3}, label="[fibre]")


def test_material_from_dict_rejects_non_table():
    with pytest.raises(InvalidMaterialError, match=r"\[fibre\]: expected a table of constants"):
        material_from_dict(72e9, label="[fibre]")  # type: ignore[arg-type]


def test_material_from_dict_prefixes_errors_with_label():
    with pytest.raises(InvalidMaterialError, match=r"^\[matrix\]: isotropic material: nu = 0.7"):
        material_from_dict({"E": 1e9, "nu": 0.7}, label="[matrix]")


def test_project_errors_are_value_errors():
    with pytest.raises(ValueError):
        Isotropic(E=-1.0, nu=0.3)
    with pytest.raises(MicromechError):
        Isotropic(E=-1.0, nu=0.3)


@pytest.mark.parametrize("field", ["density", "fibre_diameter"])
def test_infinite_size_is_rejected_naming_the_field(field):
    with pytest.raises(InvalidMaterialError, match=rf"{field} = inf must be finite"):
        Isotropic(E=3e9, nu=0.3, **{field: float("inf")})


@pytest.mark.parametrize("field", ["density", "fibre_diameter"])
def test_nan_size_is_rejected_as_not_finite(field):
    with pytest.raises(InvalidMaterialError, match=rf"{field} = nan must be finite"):
        Isotropic(E=3e9, nu=0.3, **{field: float("nan")})


def test_materials_module_examples_run():
    import doctest

    import micromech.materials.composite
    import micromech.materials.models
    import micromech.materials.registry

    for mod in (micromech.materials.models, micromech.materials.composite,
                micromech.materials.registry):
        assert doctest.testmod(mod).failed == 0, mod.__name__
