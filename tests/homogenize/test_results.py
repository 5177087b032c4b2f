"""Tests of micromech.results.ElasticConstants, the result object every estimator returns.

Kept here beside the estimators that produce it; the relations used are exact: E3 = E2,
G13 = G12, nu13 = nu12 and G23 = E2 / (2 (1 + nu23)) for transverse isotropy about axis 1
(Jones 1999, 2nd ed., Sec. 2.2).
"""

import json

import numpy as np
import pytest

from micromech import tensors
from micromech.errors import InputError
from micromech.results import CONSTANT_NAMES, ElasticConstants


def _ti(**kw):
    return ElasticConstants.transversely_isotropic(140e9, 9e9, 0.3, 5e9, nu23=0.4, **kw)


def test_transversely_isotropic_fills_the_tied_constants():
    r = _ti()
    assert (float(r.E3), float(r.G13), float(r.nu13)) == (9e9, 5e9, 0.3)
    assert float(r.G23) == pytest.approx(9e9 / 2.8, rel=1e-15)
    assert r.alpha1 is None and r.alpha3 is None


def test_transversely_isotropic_derives_nu23_from_g23():
    r = ElasticConstants.transversely_isotropic(140e9, 9e9, 0.3, 5e9, 3e9)
    assert float(r.nu23) == pytest.approx(9 / 6 - 1, rel=1e-15)


def test_stiffness_round_trips_through_from_stiffness():
    r = _ti(model="m", source="s")
    back = ElasticConstants.from_stiffness(r.stiffness(), model="m", source="s")
    for k in CONSTANT_NAMES:
        assert float(back.get(k)) == pytest.approx(float(r.get(k)), rel=1e-12), k
    assert np.allclose(r.stiffness(), tensors.transversely_isotropic_stiffness(
        140e9, 9e9, 0.3, 5e9, 0.4), rtol=1e-12)
    assert np.allclose(r.compliance() @ r.stiffness(), np.eye(6), atol=1e-12)


def test_stiffness_of_an_incomplete_result_names_the_missing_constants():
    r = ElasticConstants(E1=1e9, E2=1e9, model="halpin_tsai")
    assert not r.complete
    with pytest.raises(InputError, match=r"halpin_tsai: the 6x6 stiffness needs all nine "
                                         r"constants; missing E3, G12, G13, G23, nu12"):
        r.stiffness()


def test_get_reads_constants_and_extra_and_nothing_else():
    r = _ti(extra={"k23": 7e9})
    assert float(r.get("k23")) == 7e9
    assert float(r.get("E1")) == 140e9
    assert r.get("alpha2") is None
    assert r.get("stiffness") is None and r.get("model") is None and r.get("nope") is None


def test_with_model_relabels_a_copy():
    r = _ti(model="a", source="x")
    s = r.with_model("b", "y")
    assert (s.model, s.source, r.model) == ("b", "y", "a")
    assert s.E1 is r.E1


def test_as_dict_is_strict_json_with_null_for_non_finite_values():
    r = ElasticConstants(E1=np.array([1e9, np.nan]), E2=np.array(np.inf), nu12=0.3, source="s")
    d = r.as_dict()
    assert d["E1"] == [1e9, None] and d["E2"] is None and d["nu12"] == 0.3 and d["G12"] is None
    assert set(d) == {*CONSTANT_NAMES, "alpha1", "alpha2", "source"}
    json.dumps(d, allow_nan=False)


def test_results_are_frozen():
    with pytest.raises(AttributeError, match="cannot assign"):
        _ti().E1 = 1.0  # type: ignore[misc]


def test_results_module_examples_run():
    import doctest

    import micromech.results

    assert doctest.testmod(micromech.results).failed == 0
