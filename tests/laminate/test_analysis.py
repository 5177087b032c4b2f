"""One-call laminate analysis and the case-file glue."""

from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import pytest

import micromech.homogenize
from micromech.case import case_from_dict
from micromech.errors import CaseFileError, InputError
from micromech.laminate import (
    Laminate,
    PlyMaterial,
    analyse_laminate,
    laminate_from_case,
    plies_from_case,
    ply_material_from_case,
)
from micromech.results import ElasticConstants

PLY = {"E1": "181 GPa", "E2": "10.3 GPa", "nu12": 0.28, "G12": "7.17 GPa", "nu23": 0.4,
       "alpha1": "0.02e-6 1/K", "alpha2": "22.5e-6 1/K", "Xt": "1500 MPa", "Xc": "1500 MPa",
       "Yt": "40 MPa", "Yc": "246 MPa", "S12": "68 MPa"}


def _case(**tables):
    data = {"name": "invented test case"}
    data.update(tables)
    return case_from_dict(data)


def test_full_analysis_with_loads(graphite_epoxy):
    lam = Laminate.from_code("[0/+-45/90]s", graphite_epoxy, 0.125e-3)
    a = analyse_laminate(lam, {"Nx": "100 N/mm", "delta_T": -100}, criterion="hashin")
    assert set(a.criteria) == {"max_stress", "max_strain", "tsai_hill", "tsai_wu", "hashin"}
    assert a.criteria["tsai_wu"].strength_ratio.shape == (8, 3)
    assert a.first_ply is not None and a.first_ply.plies == (3, 4)
    assert a.sequence is not None and a.sequence.collapsed
    assert a.stack is not None and a.notes == () and a.has_loads
    R, point = a.ply_ratio()
    assert R.shape == (8,) and R.min() == pytest.approx(a.first_ply.load_factor, rel=1e-12)


def test_analysis_without_loads_or_strengths_explains_what_is_missing(graphite_epoxy_2d):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy_2d, 0.125e-3)
    a = analyse_laminate(lam)
    assert a.response is None and a.stack is None and not a.has_loads
    assert any("nu23" in n for n in a.notes) and any("no loads" in n for n in a.notes)
    bare = PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9, strengths={"Xt": 1.5e9})
    nostrength = Laminate.from_code("[0/90]s", bare, 1e-3)
    b = analyse_laminate(nostrength, {"Nx": 1e4})
    assert b.response is not None and b.criteria == {}
    note = next(n for n in b.notes if "needs ply strengths" in n)
    # in the order of the criteria, with where to put them and that estimates are not used
    assert "needs ply strengths Xc, Yt, Yc, S12: give them as flat keys Xt, Xc, Yt, Yc, S12 " \
           "in the case's [ply] table" in note
    assert "strength estimates of `micromech estimate` are not used" in note
    with pytest.raises(InputError, match="criterion 'tsai_wu' was not evaluated"):
        b.ply_ratio()


def test_temperature_change_alone_gives_stresses_but_no_failure_load(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    a = analyse_laminate(lam, {"delta_T": -150})
    assert a.criteria and a.first_ply is None
    assert any("delta_T is held fixed" in n for n in a.notes)
    assert np.all(np.isinf(a.criteria["tsai_wu"].strength_ratio))


def test_analysis_argument_errors(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    with pytest.raises(InputError, match="unknown 'von_mises'"):
        analyse_laminate(lam, {"Nx": 1.0}, criterion="von_mises")
    with pytest.raises(InputError, match=r"one load case \(shape \(6,\)\) expected"):
        analyse_laminate(lam, np.ones((3, 6)))


def test_case_with_a_ply_table_builds_the_laminate():
    case = _case(ply=PLY, laminate={"layup": "[0/+-45/90]s", "ply_thickness": "0.125 mm",
                                    "loads": {"Nx": "100 N/mm"}})
    lam = laminate_from_case(case)
    assert lam.n_plies == 8 and lam.code == "[0/+-45/90]s"
    assert lam.thickness == pytest.approx(1e-3)
    assert lam.plies[0].material.strengths.complete
    assert len(plies_from_case(case)) == 8


def test_case_without_laminate_or_ply_source_is_refused():
    with pytest.raises(CaseFileError, match=r"no \[laminate\] table"):
        laminate_from_case(_case(ply=PLY))
    with pytest.raises(CaseFileError, match=r"needs ply constants: give a \[ply\] table"):
        laminate_from_case(_case(laminate={"layup": "[0/90]s", "ply_thickness": "0.2 mm"}))


COMPOSITE_CASE = {
    "fibre": {"E": "73 GPa", "nu": 0.22},
    "matrix": {"E": "3.2 GPa", "nu": 0.35},
    "composite": {"volume_fraction": 0.55},
    "ply": {"Xt": "1000 MPa", "model": "halpin_tsai"},
    "laminate": {"layup": "[0/90]s", "ply_thickness": "0.2 mm"},
}


def test_case_without_ply_constants_takes_the_named_estimate(monkeypatch):
    ec = ElasticConstants.transversely_isotropic(41e9, 12e9, 0.27, 4.3e9, nu23=0.4,
                                                 model="halpin_tsai", source="Halpin (1969)")
    seen = []

    def fake_estimate(composite, **options):
        seen.append(composite.volume_fraction)
        return SimpleNamespace(models={"halpin_tsai": ec})

    monkeypatch.setattr(micromech.homogenize, "estimate", fake_estimate, raising=False)
    m = ply_material_from_case(_case(**COMPOSITE_CASE))
    assert seen == [0.55] and m.E1 == 41e9 and m.name == "halpin_tsai estimate"
    assert m.strengths is not None and m.strengths.Xt == pytest.approx(1e9)


def test_estimate_that_does_not_give_the_named_model_is_refused(monkeypatch):
    monkeypatch.setattr(micromech.homogenize, "estimate", lambda c, **options: {"voigt": None},
                        raising=False)
    with pytest.raises(CaseFileError, match="model = 'halpin_tsai' does not apply.*voigt"):
        ply_material_from_case(_case(**COMPOSITE_CASE))


def test_case_without_ply_constants_uses_the_real_estimate():
    case = _case(**COMPOSITE_CASE)
    m = ply_material_from_case(case)
    from micromech.homogenize import estimate

    ec = estimate(case.composite).models["halpin_tsai"]
    assert m.E1 == pytest.approx(float(ec.E1), rel=1e-12)
    assert m.E2 == pytest.approx(float(ec.E2), rel=1e-12)
    assert m.strengths is not None and m.strengths.Xt == pytest.approx(1e9)
    lam = laminate_from_case(case)
    # a cross-ply of an estimated glass/polymer ply: in-plane Ex = Ey (exact identity)
    c = lam.in_plane_constants()
    assert c.Ex == pytest.approx(c.Ey, rel=1e-12)


def test_ply_origin_names_the_table_and_the_strengths_given():
    from micromech.laminate import ply_origin

    NS = SimpleNamespace
    strong = NS(Xt=1e9, Xc=6e8, Yt=4e7, Yc=1.2e8, S12=6e7, S23=None)
    named = NS(name="carbon/epoxy (invented)", strengths=strong)
    assert ply_origin(NS(ply=named)) == ("constants from [ply] of the case (carbon/epoxy "
                                         "(invented)); strengths Xt, Xc, Yt, Yc, S12 from [ply] "
                                         "of the case")
    est = NS(ply=None, ply_model="chamis", ply_strengths=NS(Xt=1e9))
    assert ply_origin(est) == ("chamis estimate from [fibre], [matrix] and [composite]; "
                               "strengths Xt from [ply] of the case")
    bare = NS(ply=None, ply_model="mori_tanaka", ply_strengths=None)
    assert ply_origin(bare).endswith("no ply strengths (failure analysis needs Xt, Xc, Yt, Yc, "
                                     "S12 in [ply])")
