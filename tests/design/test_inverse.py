"""Inverse sizing with forward models written out in closed form (no estimator package needed).

Models used here (the formulas themselves are the test oracle, re-derived by hand):
rule of mixtures E1 = Ef Vf + Em (1 - Vf) (Jones 1999, 2nd ed., Eq. 3.6); inverse rule of mixtures
E2 = 1 / (Vf/Ef + (1 - Vf)/Em) (Jones 1999, Eq. 3.13); Halpin-Tsai E2 = Em (1 + xi eta Vf) /
(1 - eta Vf), eta = (Ef/Em - 1)/(Ef/Em + xi) (Halpin and Kardos 1976, Eq. 1, from memory).
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.design.inverse import (
    FractionInterval,
    FractionPoint,
    property_values,
    size_models,
    solve_fraction,
)
from micromech.design.targets import SizingTarget
from micromech.errors import InputError

EF, EM, RF, RM = 72e9, 3.5e9, 2540.0, 1200.0
LIMIT = 0.82


def rom(v):
    return {"E1": EF * v + EM * (1 - v), "E2": 1.0 / (v / EF + (1 - v) / EM),
            "nu12": 0.22 * v + 0.35 * (1 - v) + 0.4 * v * (1 - v),
            "density": RF * v + RM * (1 - v)}


def halpin_tsai(v, xi=2.0):
    r = EF / EM
    eta = (r - 1) / (r + xi)
    return {"E1": EF * v + EM * (1 - v), "E2": EM * (1 + xi * eta * v) / (1 - eta * v)}


def mass(v):
    return {"density": RF * v + RM * (1 - v), "weight_fraction": RF * v / (RF * v + RM * (1 - v))}


def upper_bound(v):
    return {"E2": EF * v + EM * (1 - v), "E1": EF * v + EM * (1 - v)}


def lower_bound(v):
    return {"E2": 1.0 / (v / EF + (1 - v) / EM), "E1": EF * v + EM * (1 - v)}


MODELS = {"rule_of_mixtures": rom, "halpin_tsai": halpin_tsai}


@settings(max_examples=50, deadline=None)
@given(st.floats(0.0, 1.0), st.sampled_from(["E1", "E2"]), st.sampled_from(list(MODELS)))
def test_inverse_answer_reproduces_the_target(u, name, model):
    f = MODELS[model]
    lo, hi = f(np.array([0.0]))[name][0], f(np.array([LIMIT]))[name][0]
    target = lo + u * (hi - lo)
    s = solve_fraction(lambda v: f(v)[name], SizingTarget(name, target), upper=LIMIT)
    assert s.status == "reached"
    for x in s.fractions:
        assert f(np.array([x]))[name][0] == pytest.approx(target, rel=1e-8)


def test_rule_of_mixtures_fraction_matches_closed_form():
    # Vf = (E1 - Em) / (Ef - Em), exact algebra; 40 GPa -> 36.5/68.5
    s = solve_fraction(lambda v: rom(v)["E1"], SizingTarget("E1", 40e9), upper=LIMIT)
    assert s.fraction == pytest.approx(36.5 / 68.5, rel=1e-13)


def test_halpin_tsai_fraction_matches_closed_form():
    # E2/Em = (1 + xi eta V)/(1 - eta V)  ->  V = (E2/Em - 1) / (eta (E2/Em + xi)), exact algebra
    r, xi, ratio = EF / EM, 2.0, 9e9 / EM
    eta = (r - 1) / (r + xi)
    s = solve_fraction(lambda v: halpin_tsai(v)["E2"], SizingTarget("E2", 9e9), upper=LIMIT)
    assert s.fraction == pytest.approx((ratio - 1) / (eta * (ratio + xi)), rel=1e-12)


def test_non_monotonic_property_reports_both_crossings():
    # nu12 = 0.35 + 0.27 V - 0.4 V^2 (the invented model above) peaks at V = 0.3375; it equals
    # 0.37 at V = (0.27 -+ sqrt(0.27^2 - 4 * 0.4 * 0.02)) / 0.8 (quadratic formula)
    s = solve_fraction(lambda v: rom(v)["nu12"], SizingTarget("nu12", 0.37), upper=LIMIT)
    d = np.sqrt(0.27**2 - 4 * 0.4 * 0.02)
    assert s.fractions == pytest.approx([(0.27 - d) / 0.8, (0.27 + d) / 0.8], rel=1e-12)


def test_unreachable_target_is_an_answer_not_an_error():
    s = solve_fraction(lambda v: rom(v)["E2"], SizingTarget("E2", 30e9), upper=LIMIT,
                       model="rule_of_mixtures")
    assert s.status == "not_reachable"
    assert s.fraction is None and s.intervals == ()
    assert "E2 = 30 GPa is not reachable below the packing limit (Vf 0.82)" in s.message
    assert s.value_range[1] == pytest.approx(rom(np.array([LIMIT]))["E2"][0], rel=1e-12)


def test_weight_fraction_and_density_are_reported_at_the_crossing():
    s = solve_fraction(lambda v: rom(v)["E1"], SizingTarget("E1", 40e9), upper=LIMIT, mass=mass)
    v = 36.5 / 68.5
    p = s.crossings[0]
    assert p.density == pytest.approx(RF * v + RM * (1 - v), rel=1e-12)
    assert p.weight_fraction == pytest.approx(RF * v / (RF * v + RM * (1 - v)), rel=1e-12)


def test_sizing_interval_over_models_and_bounds_interval():
    res = size_models(["E2=9GPa"], MODELS, bounds=(lower_bound, upper_bound), upper=LIMIT)
    t = res["E2"]
    v_rom = MODELS["rule_of_mixtures"]
    f_rom = solve_fraction(lambda v: v_rom(v)["E2"], SizingTarget("E2", 9e9), upper=LIMIT)
    f_ht = solve_fraction(lambda v: halpin_tsai(v)["E2"], SizingTarget("E2", 9e9), upper=LIMIT)
    assert t.fraction_range == (pytest.approx(f_ht.fraction), pytest.approx(f_rom.fraction))
    # the bounds admit the target between where the upper bound reaches it (Voigt: exact algebra
    # (9 - 3.5)/(72 - 3.5)) and where the lower bound does (here the inverse rule of mixtures)
    lo, hi = t.bounds.interval
    assert lo == pytest.approx(5.5 / 68.5, rel=1e-12)
    assert hi == pytest.approx(f_rom.fraction, rel=1e-12)
    assert t.status == "reached"
    assert res.status == "met_by_some_models"  # two different points: no common fraction


def test_minimum_targets_give_a_window_that_meets_all():
    res = size_models(["E1>=40GPa", "density<=2 g/cm^3"], {"rule_of_mixtures": rom}, mass=mass,
                      upper=LIMIT)
    (w,) = res.common_window
    assert w.low.volume_fraction == pytest.approx(36.5 / 68.5, rel=1e-12)
    assert w.high.volume_fraction == pytest.approx(800.0 / 1340.0, rel=1e-12)  # exact algebra
    assert w.high.density == pytest.approx(2000.0, rel=1e-12)
    assert res.status == "met_by_all_models"
    assert "met under every model for Vf 0.5328 to 0.597" in res.message
    assert "density 1.914 g/cm^3 to 2 g/cm^3" in res.message


def test_conflicting_targets_give_no_window():
    res = size_models(["E1>=60GPa", "density<=1.5 g/cm^3"], {"rule_of_mixtures": rom},
                      upper=LIMIT)
    assert res.common_window == () and res.status == "not_met"
    assert "meets all under any model" in res.message


def test_target_met_everywhere_is_reported_as_such():
    res = size_models(["E1>=1GPa"], {"rule_of_mixtures": rom}, upper=LIMIT)
    assert res["E1"].status == "always_met"
    assert res["E1"].models["rule_of_mixtures"].intervals[0].describe() == "Vf 0 to 0.82"


def test_target_reachable_by_no_model_but_admitted_by_the_bounds():
    res = size_models(["E2=30GPa"], MODELS, bounds=(lower_bound, upper_bound), upper=LIMIT)
    t = res["E2"]
    assert t.status == "not_reachable"
    assert t.bounds.status == "admissible"
    assert "not reachable below the packing limit (Vf 0.82) under any model" in t.message


def test_target_some_models_reach():
    res = size_models(["E2=18GPa"], MODELS, upper=LIMIT)
    assert res["E2"].status == "partly_reached"
    assert "not reachable below the packing limit under rule_of_mixtures" in res["E2"].message


def test_models_without_the_property_are_skipped():
    res = size_models(["nu12=0.3"], MODELS, upper=LIMIT)
    assert res["nu12"].skipped == ("halpin_tsai",)


def test_specific_stiffness_target_is_a_ratio_of_two_properties():
    res = size_models(["E1/density>=20e6"], {"rule_of_mixtures": rom}, upper=LIMIT)
    x = res["E1/density"].models["rule_of_mixtures"].fraction
    r = rom(np.array([x]))
    assert r["E1"][0] / r["density"][0] == pytest.approx(20e6, rel=1e-10)


def test_results_serialise_to_plain_json():
    import json

    res = size_models(["E2=9GPa", "E1>=40GPa"], MODELS, bounds=(lower_bound, upper_bound),
                      mass=mass, upper=LIMIT)
    d = json.loads(json.dumps(res.as_dict(), allow_nan=False))
    assert d["targets"][0]["target"] == {"name": "E2", "relation": "==", "value": 9e9}
    assert d["range"] == [0.0, LIMIT]
    assert "not design allowables" in d["caution"]
    assert FractionInterval(FractionPoint(0.1), FractionPoint(0.1)).describe() == "Vf 0.1"


def test_property_values_reads_ratios_and_missing_names():
    r = {"E1": np.array([2.0]), "density": np.array([4.0])}
    assert property_values(r, "E1/density").tolist() == [0.5]
    assert property_values(r, "E2") is None
    assert property_values(r, "E1/E2") is None


def test_forward_model_of_the_wrong_type_is_an_error():
    with pytest.raises(InputError, match="returned list; expected a mapping"):
        property_values([1.0], "E1")


def test_no_targets_is_an_error():
    with pytest.raises(InputError, match="targets: none given"):
        size_models([], MODELS)


def test_no_models_is_an_error():
    with pytest.raises(InputError, match="models: none given"):
        size_models(["E1=40GPa"], {})


def test_property_no_model_gives_is_an_error():
    with pytest.raises(InputError, match="target Ex: no model gives this property"):
        size_models(["Ex=40GPa"], MODELS)


def test_unknown_target_name_in_a_result_is_an_error():
    res = size_models(["E1=40GPa"], MODELS, upper=LIMIT)
    with pytest.raises(InputError, match="no target 'E2'; targets are E1"):
        res["E2"]


def test_model_without_finite_values_is_an_error():
    with pytest.raises(InputError, match="no finite value on the fraction range"):
        solve_fraction(lambda v: np.full_like(v, np.nan), SizingTarget("E1", 1e9))
