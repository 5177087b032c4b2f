"""First-ply and last-ply failure of laminates (ply discount)."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import InputError
from micromech.laminate import (
    CRITERIA,
    Laminate,
    PlyMaterial,
    first_ply_failure,
    last_ply_failure,
    ply_strength_ratios,
    reduced_stiffness,
)


def _cross_ply_hand_values(t: float, residual: float = 1e-6) -> tuple[float, float]:
    """First- and last-ply failure Nx of graphite/epoxy [0/90]s, maximum stress, by hand.

    The procedure of Kaw (2006), 2nd ed., Sec. 5.3 (from memory) written out for a cross-ply:
    A = 2t (Q0 + Q90); the 90 plies fail when their s22 (= sigma_x) reaches Yt; then their E2,
    nu12, G12 are discounted and the 0 plies fail when s11 reaches Xt.
    """
    Q0 = reduced_stiffness(181e9, 10.3e9, 0.28, 7.17e9)
    swap = [1, 0, 2]
    Q90 = Q0[np.ix_(swap, swap)]
    eps = np.linalg.solve(2 * t * (Q0 + Q90)[:2, :2], [1.0, 0.0])  # per unit Nx
    first = 40e6 / (Q90[0, :2] @ eps)
    Qd = reduced_stiffness(181e9, 10.3e9 * residual, 0.28 * residual, 7.17e9 * residual)
    Q90d = Qd[np.ix_(swap, swap)]
    eps = np.linalg.solve(2 * t * (Q0 + Q90d)[:2, :2], [1.0, 0.0])
    last = 1500e6 / (Q0[0, :2] @ eps)
    return first, last


def test_cross_ply_first_and_last_ply_failure_under_uniaxial_tension(graphite_epoxy):
    t = 5e-3  # ply thickness of the textbook examples
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, t)
    first, last = _cross_ply_hand_values(t)
    fpf = first_ply_failure(lam, {"Nx": 1.0}, criterion="max_stress")
    assert fpf.load_factor == pytest.approx(first, rel=1e-12)
    assert fpf.plies == (1, 2) and fpf.angles == (90.0, 90.0)
    assert fpf.modes == ("matrix_tension", "matrix_tension")
    # the same numbers as ratios at Nx = 1000 N/m: 90 plies 7486, 0 plies 1.585e4 (hand values)
    assert first / 1000 == pytest.approx(7486, rel=1e-4)
    seq = last_ply_failure(lam, {"Nx": 1.0}, criterion="max_stress")
    assert seq.events[1].plies == (0, 3) and seq.events[1].modes[0] == "fibre_tension"
    assert seq.last_ply_factor == pytest.approx(last, rel=1e-9)
    assert seq.collapsed and seq.first_ply_factor == fpf.load_factor


def test_every_criterion_finds_the_transverse_plies_first(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    for c in CRITERIA:
        e = first_ply_failure(lam, {"Nx": "100 N/mm"}, criterion=c)
        assert e.plies == (1, 2) and set(e.modes) == {"matrix_tension"}
        d = e.as_dict()
        assert d["resultants"]["Nx"] == pytest.approx(1e5 * e.load_factor)


@settings(max_examples=30, deadline=None)
@given(st.lists(st.floats(-1, 1), min_size=6, max_size=6).filter(
    lambda v: max(map(abs, v)) > 0.05), st.floats(0.1, 50.0), st.sampled_from(CRITERIA))
def test_first_ply_failure_factor_scales_as_one_over_load(v, k, criterion):
    m = PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9,
                    strengths={"Xt": 1.5e9, "Xc": 1.5e9, "Yt": 40e6, "Yc": 246e6, "S12": 68e6})
    lam = Laminate.from_code("[0/+-45/90]s", m, 0.125e-3)
    loads = np.array(v) * [1e5, 1e5, 1e5, 10, 10, 10]
    f1 = first_ply_failure(lam, loads, criterion=criterion).load_factor
    fk = first_ply_failure(lam, k * loads, criterion=criterion).load_factor
    assert fk == pytest.approx(f1 / k, rel=1e-9)


def test_residual_thermal_stress_is_held_fixed(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    cold = first_ply_failure(lam, {"Nx": 1e5}, delta_T=-150.0, criterion="max_stress")
    warm = first_ply_failure(lam, {"Nx": 1e5}, criterion="max_stress")
    assert cold.load_factor < warm.load_factor  # cooling leaves transverse tension in 90 plies
    # at the failure resultants, thermal + mechanical stress reaches the strength exactly
    r = lam.response(np.array(cold.resultants), delta_T=-150.0)
    assert np.max(r.total.stress_material[1, :, 1]) == pytest.approx(40e6, rel=1e-9)


def test_angle_ply_collapses_when_its_matrix_fails(graphite_epoxy):
    lam = Laminate.from_code("[+-45]s", graphite_epoxy, 0.125e-3)
    seq = last_ply_failure(lam, {"Nx": 1e5}, criterion="tsai_wu")
    assert len(seq.events) == 1 and seq.collapsed
    assert seq.last_ply_factor == seq.first_ply_factor
    assert set(seq.events[0].modes) == {"shear"}


def test_quasi_isotropic_sequence_is_ordered_and_ends_with_fibre_failure(graphite_epoxy):
    lam = Laminate.from_code("[0/+-45/90]s", graphite_epoxy, 0.125e-3)
    seq = last_ply_failure(lam, {"Nx": 1e5}, delta_T=-100.0, criterion="hashin")
    factors = [e.load_factor for e in seq.events]
    assert factors == sorted(factors) and len(factors) >= 2
    assert seq.events[0].plies == (3, 4)
    assert any(m.startswith("fibre") for m in seq.events[-1].modes)
    d = seq.as_dict()
    assert d["collapsed"] is True and d["last_ply_factor"] == pytest.approx(factors[-1])


def test_ply_in_compression_only_direction_never_fails_gives_no_events():
    m = PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.0, G12=7.17e9,
                    strengths={"Xt": 1.5e9, "Xc": 1.5e9, "Yt": 40e6, "Yc": 246e6, "S12": 68e6})
    lam = Laminate.from_code("[0]", m, 1e-3)
    # with nu12 = 0 a load along y leaves s11 = 0: after the matrix fails nothing else can
    seq = last_ply_failure(lam, {"Ny": 1e4}, criterion="max_stress")
    assert len(seq.events) == 1 and seq.events[0].modes == ("matrix_tension",)
    assert seq.collapsed  # only the residual stiffness is left along y


def test_ply_strength_ratios_for_a_batch_of_loads(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    res = ply_strength_ratios(lam, np.eye(6)[:3] * 1e5, criterion="tsai_hill")
    assert res.strength_ratio.shape == (3, 4, 3)
    only_fibre = ply_strength_ratios(lam, {"Nx": 1e5}, criterion="max_stress",
                                     fibre_only=[False, True, True, False])
    s11 = lam.response({"Nx": 1e5}).total.stress_material[1, :, 0]
    # s22 and s12 no longer count: the fibre direction alone governs (Xc = Xt = 1500 MPa)
    np.testing.assert_allclose(only_fibre.strength_ratio[1], 1.5e9 / np.abs(s11), rtol=1e-12)


def test_failure_analysis_errors(graphite_epoxy, graphite_epoxy_2d):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    with pytest.raises(InputError, match="at least one of Nx, Ny, Nxy, Mx, My, Mxy must be"):
        first_ply_failure(lam, {"delta_T": -100})
    with pytest.raises(InputError, match=r"one load direction \(shape \(6,\)\) expected"):
        last_ply_failure(lam, np.ones((2, 6)))
    with pytest.raises(InputError, match=r"residual = 0.0: must lie in \(0, 1\)"):
        last_ply_failure(lam, {"Nx": 1.0}, residual=0.0)
    weak = PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9, strengths={"Xt": 1e9})
    with pytest.raises(InputError, match=r"ply 1 of 1 from the bottom .*strength Xc missing.*"
                                         r"flat keys Xt, Xc, Yt, Yc, S12 in the case's \[ply\]"):
        first_ply_failure(Laminate.from_code("[0]", weak, 1e-3), {"Nx": 1.0})


@pytest.mark.parametrize("k", [1e-300, 1e300])
def test_failure_loads_of_extreme_resultants_scale_exactly(graphite_epoxy, k):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    ref = last_ply_failure(lam, {"Nx": 1.0}, criterion="tsai_wu")
    seq = last_ply_failure(lam, {"Nx": k}, criterion="tsai_wu")
    assert [e.load_factor * k for e in seq.events] == pytest.approx(
        [e.load_factor for e in ref.events], rel=1e-12)
    assert seq.events[-1].resultants[0] == pytest.approx(ref.events[-1].resultants[0], rel=1e-12)
    fpf = first_ply_failure(lam, {"Nx": k}, criterion="hashin")
    assert fpf.load_factor * k == pytest.approx(
        first_ply_failure(lam, {"Nx": 1.0}, criterion="hashin").load_factor, rel=1e-12)
