"""Verdict logic with hand-made numbers: bounds, HS band and estimates are given, not computed."""

import math

import pytest

from micromech.errors import InputError
from micromech.rve.causes import Diagnosis
from micromech.rve.tolerances import fibre_band
from micromech.rve.verdicts import CAUTION, PropertyCheck, grade_property, worst_verdict

# invented numbers of a glass/epoxy-like ply at Vf = 0.55 (not from any source)
E2_EST = {"mori_tanaka": 11e9, "halpin_tsai": 14e9, "hashin_shtrikman_lower": 11e9}
E2_BOUNDS = {"lower_bound": 6.5e9, "upper_bound": 41e9}
E2_BAND = fibre_band("E2", 11e9, 0.55, "random", halpin_tsai=14e9)
CTX_Y = Diagnosis(direction="y", size=(100e-6, 100e-6, 100e-6), fraction=0.55,
                  fraction_curve=([0.0, 0.3, 0.55, 0.7], [3.5e9, 6.0e9, 11e9, 17e9]))


def grade_e2(value, **kw):
    args = dict(estimates=E2_EST, band=E2_BAND, context=CTX_Y, **E2_BOUNDS)
    args.update(kw)
    return grade_property("E2", value, **args)


def test_band_reasons_give_the_distance_to_the_best_estimate():
    band = (9e9, 11e9)  # hand-made band around an invented Mori-Tanaka E2 of 10 GPa
    out = grade_property("E2", 13e9, estimates={"mori_tanaka": 10e9}, band=band)
    assert "band 9 GPa .. 11 GPa (+30.0 % from Mori-Tanaka = 10 GPa; band:" in out.reasons[0]
    inside = grade_property("E2", 10.5e9, estimates={"mori_tanaka": 10e9}, band=band)
    assert "band 9 GPa .. 11 GPa, +5.0 % from Mori-Tanaka = 10 GPa (band:" in inside.reasons[0]
    alone = grade_property("E2", 10.5e9, band=band, best=None)
    assert "band 9 GPa .. 11 GPa (band: the given band)." in alone.reasons[0]


def test_value_times_1000_violates_bounds_with_unit_slip_first():
    r = grade_e2(11.5e9 * 1000)
    assert r.verdict == "violates_bounds"
    assert "above the rigorous upper bound" in r.reasons[0]
    assert r.reasons[1].startswith("Likely cause 1: A unit slip")
    assert "10^3" in r.reasons[1]


def test_value_divided_by_1000_violates_bounds_with_unit_slip():
    r = grade_e2(11.5e9 / 1000)
    assert r.verdict == "violates_bounds"
    assert "below the rigorous lower bound" in r.reasons[0]
    assert "A unit slip" in r.reasons[1] and "10^-3" in r.reasons[1]


def test_value_40_percent_below_estimates_inside_bounds_is_suspect():
    r = grade_e2(0.6 * 11e9 + 0.1e9)  # 6.7 GPa: above Reuss 6.5 GPa, 39 % below MT
    assert r.verdict == "suspect"
    assert "below the expected band" in r.reasons[0]
    assert not any("unit slip" in x for x in r.reasons)


def test_value_within_band_is_consistent_and_says_why():
    r = grade_e2(12.2e9)  # +11 % above MT: inside the MT .. HT(xi=2) band
    assert r.verdict == "consistent"
    assert r.reasons[0].startswith("E2 = 12.2 GPa lies within the expected band")
    assert r.best_model == "mori_tanaka" and r.best_estimate == 11e9


def test_value_slightly_below_mt_but_above_band_low_is_consistent():
    assert grade_e2(10.6e9, hs_band=None).verdict == "consistent"


def test_below_hashin_shtrikman_lower_is_suspect():
    # inside a wide user band, but 5 % below the HS lower value (1 % slack)
    r = grade_e2(10.45e9, tolerance=0.3, hs_band=(11e9, 30e9))
    assert r.verdict == "suspect"
    assert "below the lower Hashin-Shtrikman value" in r.reasons[0]


def test_within_hs_slack_is_not_suspect():
    r = grade_e2(10.95e9, tolerance=0.3, hs_band=(11e9, 30e9))
    assert r.verdict == "consistent"


def test_user_tolerance_replaces_default_band():
    assert grade_e2(12.6e9, tolerance=0.2).verdict == "consistent"   # +14.5 % within 20 %
    assert grade_e2(12.6e9, tolerance=0.1).verdict == "suspect"      # outside 10 %
    r = grade_e2(12.6e9, tolerance=0.1)
    assert "given by the user" in r.reasons[0]


def test_just_above_upper_bound_within_slack_is_consistent_with_note():
    r = grade_property("E1", 40.1e9, lower_bound=8e9, upper_bound=40e9,
                       estimates={"mori_tanaka": 39.9e9}, band=fibre_band("E1", 39.9e9, 0.55))
    assert r.verdict == "consistent"
    assert any("within the 0.5 % allowed" in x for x in r.reasons)


def test_beyond_slack_above_upper_bound_violates():
    r = grade_property("E1", 40.4e9, lower_bound=8e9, upper_bound=40e9,
                       estimates={"mori_tanaka": 39.9e9})
    assert r.verdict == "violates_bounds"


def test_strength_outside_limit_analysis_bounds_is_suspect_not_violation():
    r = grade_property("yield_strength_y", 40e6, lower_bound=60e6, upper_bound=1.9e9,
                       estimates={}, best=None, bounds_rigorous=False)
    assert r.verdict == "suspect"
    assert "matrix yield" in r.reasons[0]


def test_no_estimate_inside_bounds_is_consistent():
    r = grade_property("Gxy", 4e9, lower_bound=2e9, upper_bound=20e9, estimates={}, best=None)
    assert r.verdict == "consistent" and "no estimate" in r.reasons[0]


def test_nothing_to_compare_is_consistent_with_reason():
    r = grade_property("nu12", 0.3, estimates={}, best=None)
    assert r.verdict == "consistent" and "no bound or estimate" in r.reasons[0]


def test_poisson_without_band_gets_flat_default_band():
    r = grade_property("nu12", 0.36, estimates={"mori_tanaka": 0.28})
    assert r.verdict == "suspect" and "flat 10 % band" in r.reasons[0]


def test_as_dict_follows_the_contract_keys():
    d = grade_e2(12e9).as_dict()
    for key in ("value", "lower_bound", "upper_bound", "estimates", "verdict", "reasons"):
        assert key in d
    assert d["estimates"]["halpin_tsai"] == 14e9


def test_with_reasons_raises_severity_and_keeps_worst():
    r = grade_e2(12e9)
    s = r.with_reasons(["Reciprocity fails: ..."], "suspect")
    assert s.verdict == "suspect" and s.reasons == ("Reciprocity fails: ...",)
    v = grade_e2(12e12).with_reasons(["x"], "suspect")
    assert v.verdict == "violates_bounds" and v.reasons[-1] == "x"


def test_worst_verdict_orders_by_severity():
    assert worst_verdict([]) == "consistent"
    assert worst_verdict(["suspect", "consistent"]) == "suspect"
    assert worst_verdict(["suspect", "violates_bounds", "consistent"]) == "violates_bounds"


def test_caution_names_allowables_codes_and_engineer():
    assert "not design allowables" in CAUTION and "licensed engineer" in CAUTION


def test_propertycheck_is_frozen():
    r = grade_e2(12e9)
    assert isinstance(r, PropertyCheck)
    with pytest.raises(AttributeError):
        r.verdict = "suspect"  # type: ignore[misc]


def test_nan_value_raises():
    with pytest.raises(InputError, match="E2: simulated value nan is not a finite number"):
        grade_e2(math.nan)


def test_tolerance_without_best_estimate_raises():
    with pytest.raises(InputError, match="a tolerance needs a best estimate"):
        grade_property("E2", 1e9, estimates={}, best=None, tolerance=0.1)


def test_best_not_among_estimates_raises():
    with pytest.raises(InputError, match="best estimate 'cylinders' is not among"):
        grade_property("E2", 1e9, estimates={"mori_tanaka": 1e9}, best="cylinders")


def test_unknown_property_kind_raises():
    with pytest.raises(InputError, match="property name 'K23' is not a modulus"):
        grade_property("K23", 1e9)


# property by property, hand-made numbers (invented glass/epoxy-like values at Vf = 0.55):
# name, Reuss, Voigt, Mori-Tanaka, value, expected verdict
TABLE = [
    ("E1", 7.3e9, 41.3e9, 41.2e9, 41.0e9, "consistent"),       # -0.5 %: inside +-3 %
    ("E1", 7.3e9, 41.3e9, 41.2e9, 37.0e9, "suspect"),          # -10 %: fibre-dominated, tight
    ("E1", 7.3e9, 41.3e9, 41.2e9, 41.2e12, "violates_bounds"),  # x 1000
    ("G12", 2.7e9, 16.8e9, 3.9e9, 4.3e9, "consistent"),        # +10 %: full field above MT
    ("G12", 2.7e9, 16.8e9, 3.9e9, 3.0e9, "suspect"),           # -23 %
    ("G12", 2.7e9, 16.8e9, 3.9e9, 2.0e9, "violates_bounds"),   # below Reuss
    ("G23", 2.7e9, 16.8e9, 3.5e9, 4.0e9, "consistent"),        # +14 %: inside the G23 band
    ("G23", 2.7e9, 16.8e9, 3.5e9, 5.0e9, "suspect"),           # +43 %
    ("nu12", None, None, 0.27, 0.268, "consistent"),
    ("nu12", None, None, 0.27, 0.32, "suspect"),
    ("nu23", None, None, 0.45, 0.40, "consistent"),            # MT overestimates nu23
    ("nu23", None, None, 0.45, 0.50, "suspect"),
]


@pytest.mark.parametrize(("name", "lb", "ub", "mt", "value", "verdict"), TABLE)
def test_verdict_table(name, lb, ub, mt, value, verdict):
    band = fibre_band(name, mt, 0.55, "random")
    r = grade_property(name, value, lower_bound=lb, upper_bound=ub,
                       estimates={"mori_tanaka": mt}, band=band)
    assert r.verdict == verdict, r.reasons
    assert r.reasons  # every verdict carries its reasons


# --- issue 6 of the user trial: bands clipped to the bounds, limit-analysis wording ----------


def test_band_is_clipped_to_the_voigt_bound():
    # invented E1: band 135.2 .. 143.6 GPa beside a Voigt bound of 139.5 GPa
    r = grade_property("E1", 139.0e9, lower_bound=8e9, upper_bound=139.5e9,
                       estimates={"mori_tanaka": 139.4e9}, band=(135.2e9, 143.6e9))
    assert r.band == (135.2e9, 139.5e9)
    assert r.verdict == "consistent" and "clipped to the Voigt bound" in r.reasons[0]


def test_user_tolerance_band_is_clipped_to_the_reuss_bound():
    r = grade_e2(11e9, tolerance=0.5)  # 5.5 .. 16.5 GPa around MT = 11 GPa; Reuss 6.5 GPa
    assert r.band == (6.5e9, 16.5e9)
    assert "clipped to the Reuss bound" in r.reasons[0]


def test_value_on_a_clipped_band_end_keeps_the_bound_allowance():
    # 0.3 % above Voigt, inside the 0.5 % allowance: not suspect for the clipped band alone
    r = grade_property("E1", 139.5e9 * 1.003, lower_bound=8e9, upper_bound=139.5e9,
                       estimates={"mori_tanaka": 139.4e9}, band=(135.2e9, 143.6e9))
    assert r.verdict == "consistent"
    assert any("within the 0.5 % allowed" in x for x in r.reasons)


def test_strength_outside_is_called_a_limit_analysis_bound_for_plastic_phases():
    r = grade_property("yield_strength_x", 2.5e9, lower_bound=60e6, upper_bound=1.9e9,
                       estimates={}, best=None, bounds_rigorous=False)
    assert r.verdict == "suspect"
    assert "above the limit-analysis upper bound 1.9 GPa" in r.reasons[0]
    assert "perfectly plastic" in r.reasons[0] and "brittle or damage model" in r.reasons[0]


def test_strength_inside_is_not_said_to_lie_within_rigorous_bounds():
    r = grade_property("ultimate_strength_x", 400e6, upper_bound=1.9e9, estimates={}, best=None,
                       bounds_rigorous=False)
    assert r.verdict == "consistent"
    assert "within the rigorous bounds" not in r.reasons[0]
    assert "lies below the limit-analysis upper bound 1.9 GPa" in r.reasons[0]
    assert "brittle or damage model" in r.reasons[0]


# --- the stability limit of a Poisson ratio: nu_ij^2 < E_i / E_j (positive definite
# compliance; Lempriere 1968, AIAA J. 6, 2226, from memory); invented ply E1 40 GPa, E2 10 GPa

def test_minor_poisson_ratio_within_the_stability_limit_is_left_alone():
    from micromech.rve.verdicts import poisson_stability

    r = grade_property("nu21", 0.45, estimates={"mori_tanaka": 0.07})  # limit sqrt(1/4) = 0.5
    out = poisson_stability(r, ("E2", 10e9, "simulated"), ("E1", 40e9, "simulated"))
    assert out is r


def test_minor_poisson_ratio_beyond_the_stability_limit_violates_bounds():
    from micromech.rve.verdicts import poisson_stability

    r = grade_property("nu21", 0.6, estimates={"mori_tanaka": 0.07})
    out = poisson_stability(r, ("E2", 10e9, "simulated"), ("E1", 40e9, "simulated"))
    assert out.verdict == "violates_bounds"
    assert out.reasons[0].startswith("nu21 = 0.6 breaks the stability limit |nu21| < "
                                     "sqrt(E2 / E1) = 0.5")


def test_stability_failure_of_a_ratio_inside_its_band_points_at_the_moduli():
    from micromech.rve.verdicts import poisson_stability

    r = grade_property("nu12", 0.27, estimates={"mori_tanaka": 0.27})  # consistent
    out = poisson_stability(r, ("E1", 1e9, "simulated"), ("E2", 40e9, "simulated"),
                            {"E1": "suspect"})
    assert out.verdict == "violates_bounds"
    assert "E1 is suspect as well: look there first." in out.reasons[0]
    assert len(out.reasons) == 1  # "lies within the band" no longer tells the story
