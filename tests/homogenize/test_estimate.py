import json

import numpy as np
import pytest

from micromech import tensors
from micromech.errors import InvalidMaterialError
from micromech.homogenize import BOUND_KEYS, MODEL_KEYS, Estimates, estimate, mori_tanaka
from micromech.materials import Isotropic, Orthotropic, TransverselyIsotropic
from micromech.materials.composite import Composite
from micromech.results import CONSTANT_NAMES

GLASS = Isotropic(E="72 GPa", nu=0.22, alpha="5e-6 1/K")
EPOXY = Isotropic(E="3.5 GPa", nu=0.35, alpha="60e-6 1/K",
                  strengths={"Xt": "70 MPa", "yield_strength": "60 MPa"})
CARBON = TransverselyIsotropic(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", nu23=0.07,
                               alpha1="-0.5e-6 1/K", alpha2="10e-6 1/K",
                               strengths={"Xt": "3.5 GPa"})


def test_continuous_fibres_have_every_model():
    est = estimate(Composite(CARBON, EPOXY, 0.6, name="cf"))
    assert list(est) == list(MODEL_KEYS)
    assert est.notes == {}
    assert est.case == "cf"


@pytest.mark.parametrize(
    ("kw", "present"),
    [(dict(inclusion="sphere"), {"voigt", "reuss", "hashin_shtrikman_lower",
                                 "hashin_shtrikman_upper", "mori_tanaka"}),
     (dict(inclusion="spheroid", aspect_ratio=15.0), {"voigt", "reuss", "hashin_shtrikman_lower",
                                                      "hashin_shtrikman_upper", "halpin_tsai",
                                                      "mori_tanaka"}),
     (dict(inclusion="spheroid", aspect_ratio=0.2), {"voigt", "reuss", "hashin_shtrikman_lower",
                                                     "hashin_shtrikman_upper", "mori_tanaka"}),
     (dict(void_fraction=0.04), {"voigt", "mori_tanaka"})],
)
def test_keys_where_the_models_apply(kw, present):
    est = estimate(Composite(GLASS, EPOXY, 0.3, **kw))
    assert set(est) == present
    assert set(est.notes) == set(MODEL_KEYS) - present


def test_transversely_isotropic_particles_have_no_isotropic_bounds():
    est = estimate(Composite(CARBON, EPOXY, 0.3, inclusion="sphere"))
    assert "hashin_shtrikman_lower" not in est
    assert "isotropic particles" in est.notes["hashin_shtrikman_lower"]


def test_anisotropic_matrix_gives_voigt_and_reuss_only():
    m = Orthotropic(E1=10e9, E2=8e9, E3=7e9, G12=3e9, G13=2.5e9, G23=2e9, nu12=0.3, nu13=0.3,
                    nu23=0.35)
    est = estimate(Composite(GLASS, m, 0.4))
    assert set(est) == {"voigt", "reuss"}
    Cv = 0.4 * GLASS.stiffness() + 0.6 * m.stiffness()
    assert float(est["voigt"].E3) == pytest.approx(float(tensors.engineering_constants(Cv)["E3"]))
    assert "isotropic matrix" in est.notes["mori_tanaka"]


def test_anisotropic_matrix_with_voids_has_no_reuss():
    m = TransverselyIsotropic(E1="10 GPa", E2="5 GPa", nu12=0.3, G12="2 GPa", nu23=0.4)
    est = estimate(Composite(GLASS, m, 0.4, void_fraction=0.02))
    assert set(est) == {"voigt"}


def test_non_material_constituents_are_reported():
    class Thing:
        volume_fraction = 0.3
        fibre = object()
        matrix = object()

    with pytest.raises(InvalidMaterialError, match="lacks E1"):
        estimate(Thing())


def test_estimates_are_a_read_only_mapping():
    est = estimate(Composite(GLASS, EPOXY, 0.5))
    assert isinstance(est, Estimates) and len(est) == len(est.models)
    assert est["mori_tanaka"] is est.models["mori_tanaka"]
    with pytest.raises(AttributeError):
        est.case = "other"  # type: ignore[misc]


def test_json_contract():
    d = estimate(Composite(CARBON, EPOXY, 0.6), case="demo").as_dict()
    text = json.dumps(d, allow_nan=False)
    back = json.loads(text)
    assert back["case"] == "demo"
    assert list(back["models"]) == list(MODEL_KEYS)
    for key, m in back["models"].items():
        assert set(m) == {*CONSTANT_NAMES, "alpha1", "alpha2", "source"}, key
        assert m["source"]
    assert back["models"]["halpin_tsai"]["G23"] is None
    assert back["models"]["hashin_shtrikman_lower"]["nu23"] is None
    assert back["models"]["mori_tanaka"]["E1"] > 1e11  # SI (Pa)
    assert "caution" in back and "licensed engineer" in back["caution"]


def test_array_fractions_broadcast_and_serialise():
    est = estimate(Composite(GLASS, EPOXY, np.linspace(0, 0.6, 4)))
    assert est["mori_tanaka"].E1.shape == (4,)
    d = est.as_dict()
    assert len(d["models"]["voigt"]["E2"]) == 4


def test_band_takes_the_tightest_bounds():
    est = estimate(Composite(CARBON, EPOXY, 0.5))
    lo, hi = est.band("E2")
    assert float(lo) == pytest.approx(float(est["hashin_shtrikman_lower"].E2))
    assert float(hi) == pytest.approx(float(est["hashin_shtrikman_upper"].E2))
    assert est.band("nu12") is not None and est.band("nu23") is None
    sph = estimate(Composite(GLASS, EPOXY, 0.3, inclusion="sphere"))
    assert sph.band("nu12") is None  # Poisson's ratio of an isotropic mixture is not bounded
    # spheres: Levin's relation with the HS bounds on K bounds the CTE (Rosen & Hashin 1970)
    lo, hi = sph.band("alpha1")
    assert float(lo) < float(sph["mori_tanaka"].alpha1) * (1 + 1e-12)
    assert float(sph["mori_tanaka"].alpha1) <= float(hi) * (1 + 1e-12)
    spd = estimate(Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=4.0))
    assert spd.band("alpha1") is None  # Willis bounds carry no CTE


def test_band_is_none_without_bounds_on_a_constant():
    est = estimate(Composite(GLASS, EPOXY, 0.3, void_fraction=0.02))
    assert est.band("E1") is None  # only an upper bound with voids


@pytest.mark.parametrize(
    ("kw", "key", "name", "bound"),
    [
        ({}, "voigt", "E2", True),  # Hill (1952): the Voigt stiffness bounds every modulus
        ({}, "reuss", "G23", True),
        ({}, "voigt", "nu12", False),  # ... but no Poisson ratio
        ({}, "reuss", "nu23", False),
        ({}, "hashin_shtrikman_lower", "nu12", True),  # Hill (1964): nu12 of aligned fibres
        ({}, "hashin_shtrikman_upper", "alpha2", True),  # Rosen & Hashin (1970)
        ({}, "hashin_shtrikman_upper", "nu23", False),
        ({}, "mori_tanaka", "E2", False),  # an estimate
        (dict(inclusion="sphere"), "hashin_shtrikman_lower", "nu12", False),
        (dict(inclusion="spheroid", aspect_ratio=4.0), "hashin_shtrikman_upper", "alpha1", False),
    ],
)
def test_is_bound_says_which_values_of_the_bound_models_are_bounds(kw, key, name, bound):
    assert estimate(Composite(GLASS, EPOXY, 0.3, **kw)).is_bound(key, name) is bound


def test_outside_bounds_names_the_estimates_that_leave_the_band():
    est = estimate(Composite(GLASS, EPOXY, 0.55))
    out = {(x.model, x.name): x for x in est.outside_bounds(("E2", "nu12"))}
    # rule of mixtures nu12 = 0.55 * 0.22 + 0.45 * 0.35 = 0.2785, above Hill's (1964) upper bound
    x = out[("rule_of_mixtures", "nu12")]
    assert (x.side, x.bound_model, x.fraction) == ("above", "hashin_shtrikman_upper", 0.55)
    assert x.value == pytest.approx(0.2785, rel=1e-12)
    assert x.bound == pytest.approx(float(est["hashin_shtrikman_upper"].nu12), rel=1e-12)
    # the inverse rule of mixtures for E2 is the Reuss value: below the lower HS bound
    x = out[("rule_of_mixtures", "E2")]
    assert x.side == "below" and x.value == pytest.approx(float(est["reuss"].E2), rel=1e-12)
    assert x.bound_model == "hashin_shtrikman_lower"
    # Mori-Tanaka and the cylinder assemblage stay within the bounds of aligned fibres
    assert not {k for k, _ in out} & {"mori_tanaka", "cylinders", "voigt", "reuss"}


def test_outside_bounds_reports_the_furthest_point_of_a_sweep():
    est = estimate(Composite(GLASS, EPOXY, np.array([0.0, 0.3, 0.6])))
    (x,) = [x for x in est.outside_bounds(("E2",)) if x.model == "rule_of_mixtures"]
    assert x.fraction == 0.6  # at vf = 0 every estimate equals the matrix: inside
    assert est.outside_bounds(("E2",), rtol=np.inf) == []


def test_outside_bounds_uses_one_sided_bounds_with_voids():
    est = estimate(Composite(GLASS, EPOXY, 0.3, void_fraction=0.02))
    assert est.band("E1") is None and est.outside_bounds() == []  # M-T below Voigt


def test_mori_tanaka_entry_equals_the_direct_call():
    est = estimate(Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=8.0))
    direct = mori_tanaka(GLASS, EPOXY, 0.3, "spheroid", 8.0)
    assert float(est["mori_tanaka"].E1) == float(direct.E1)


def test_every_complete_result_is_symmetric_positive_definite():
    for kw in (dict(), dict(inclusion="sphere"), dict(inclusion="spheroid", aspect_ratio=4.0)):
        est = estimate(Composite(GLASS, EPOXY, np.linspace(0, 0.6, 7), **kw))
        for k, r in est.items():
            if r.complete:
                C = r.stiffness()
                assert np.all(tensors.is_symmetric(C, 1e-9)), k
                assert np.all(tensors.is_positive_definite(C)), k


def test_strengths_can_be_skipped():
    est = estimate(Composite(CARBON, EPOXY, 0.6), strengths=False)
    assert est.strengths == {}
    assert "longitudinal_tension" in estimate(Composite(CARBON, EPOXY, 0.6)).strengths


def test_bound_keys_are_the_first_four():
    assert BOUND_KEYS == ("voigt", "reuss", "hashin_shtrikman_lower", "hashin_shtrikman_upper")
