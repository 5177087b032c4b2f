"""Sizing the fibre fraction of a composite with the real estimators."""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from micromech.case import load_case
from micromech.design import Constituents, SizingTarget, size_fraction
from micromech.design.forward import properties_at
from micromech.design.sizing import as_constituents
from micromech.errors import InputError
from micromech.homogenize import FibrePhase
from micromech.materials import Composite, Isotropic, get_material

LAYUP = "[0/90]s"


def value(c, model, name, vf):
    props = properties_at(c, model, np.array([vf]))
    parts = name.split("/")
    v = props[parts[0]]
    return float((v / props[parts[1]])[0] if len(parts) == 2 else v[0])


@settings(max_examples=60, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(u=st.floats(0.01, 0.99), carbon_fibre=st.booleans(),
       name=st.sampled_from(["E1", "E2", "G12", "G23", "nu12", "alpha1", "alpha2", "density",
                             "Ex", "Gxy", "E1/density"]),
       model=st.sampled_from(["rule_of_mixtures", "halpin_tsai", "chamis", "cylinders",
                              "mori_tanaka"]))
def test_sized_fraction_reproduces_the_target(glass, carbon, resin, u, carbon_fibre, name,
                                              model):
    comp = Composite(carbon if carbon_fibre else glass, resin, 0.5)
    c = Constituents.from_composite(comp, layup=LAYUP)
    if any(p not in properties_at(c, model, np.array([0.5])) for p in name.split("/")):
        return  # this model does not give the property (e.g. Halpin-Tsai has no G23)
    lo, hi = value(c, model, name, 0.0), value(c, model, name, c.upper_fraction)
    # any value between the two ends is met somewhere (intermediate values), also for the
    # non-monotonic nu12 and alpha2
    target = lo + u * (hi - lo)
    r = size_fraction(c, SizingTarget(name, target), models=[model], bounds=False)
    sol = r[name].models[model]
    assert sol.status == "reached"
    for x in sol.fractions:
        assert value(c, model, name, x) == pytest.approx(target, rel=1e-8)


def test_rule_of_mixtures_fraction_is_the_closed_form(glass_epoxy):
    # E1 = Ef Vf + Em (1 - Vf) (Jones 1999, 2nd ed., Eq. 3.6): Vf = (40 - 3.5)/(72 - 3.5)
    r = size_fraction(glass_epoxy, "E1=40GPa", models=["rule_of_mixtures"], bounds=False)
    assert r["E1"].models["rule_of_mixtures"].fraction == pytest.approx(36.5 / 68.5, rel=1e-13)


def test_mori_tanaka_and_cylinders_give_the_same_axial_fractions(glass_epoxy):
    # Mori-Tanaka reproduces the composite cylinder assemblage's E1, nu12 and G12 for aligned
    # continuous fibres (Benveniste 1987): the inverse answers coincide
    r = size_fraction(glass_epoxy, ["E1=30GPa", "G12=3GPa", "nu12=0.3"],
                      models=["cylinders", "mori_tanaka"], bounds=False)
    for name in ("E1", "G12", "nu12"):
        t = r[name]
        assert t.models["mori_tanaka"].fraction == pytest.approx(
            t.models["cylinders"].fraction, rel=1e-10)


def test_bounds_interval_ends_where_the_bounds_reach_the_target(glass_epoxy):
    r = size_fraction(glass_epoxy, "E2=9GPa")
    t = r["E2"]
    lo, hi = t.bounds.interval
    c = as_constituents(glass_epoxy)
    assert value(c, "hashin_shtrikman_upper", "E2", lo) == pytest.approx(9e9, rel=1e-9)
    assert value(c, "hashin_shtrikman_lower", "E2", hi) == pytest.approx(9e9, rel=1e-9)
    # Mori-Tanaka's E2 is Hashin's lower bound for continuous fibres (Hashin 1965; Benveniste
    # 1987): it reaches the target where the admissible interval ends
    assert t.models["mori_tanaka"].fraction == pytest.approx(hi, rel=1e-10)
    assert t.fraction_range[0] <= t.models["mori_tanaka"].fraction <= t.fraction_range[1]


def test_non_monotonic_transverse_expansion_gives_two_crossings(glass_epoxy):
    # the Mori-Tanaka alpha2 of glass/resin rises above the resin's 60e-6/K at low Vf, then falls
    r = size_fraction(glass_epoxy, "alpha2=62e-6 1/K", models=["mori_tanaka"], bounds=False)
    s = r["alpha2"].models["mori_tanaka"]
    assert len(s.crossings) == 2
    c = as_constituents(glass_epoxy)
    for x in s.fractions:
        assert value(c, "mori_tanaka", "alpha2", x) == pytest.approx(62e-6, rel=1e-8)


def test_unreachable_target_is_reported_not_raised(glass_epoxy):
    r = size_fraction(glass_epoxy, "E2=100GPa")
    t = r["E2"]
    assert t.status == "not_reachable" and t.fraction_range is None
    assert "not reachable below the packing limit (Vf 0.82) under any model" in t.message
    assert r.status == "not_met"


def test_weight_fraction_and_density_at_the_crossing_match_the_composite(glass_epoxy):
    r = size_fraction(glass_epoxy, "E1=40GPa", models=["mori_tanaka"])
    p = r["E1"].models["mori_tanaka"].crossings[0]
    ref = glass_epoxy.with_fraction(p.volume_fraction)
    assert p.weight_fraction == pytest.approx(ref.weight_fraction, rel=1e-14)
    assert p.density == pytest.approx(ref.density, rel=1e-14)


def test_window_of_a_minimum_and_a_maximum(glass_epoxy):
    r = size_fraction(glass_epoxy, ["E1>=30GPa", "density<=1.9 g/cm^3"])
    (w,) = r.common_window
    # density 1.9 g/cm^3 at Vf = (1900 - 1200)/(2540 - 1200) (exact algebra)
    assert w.high.volume_fraction == pytest.approx(700 / 1340, rel=1e-12)
    assert r.status == "met_by_all_models"
    assert r.bounds_window is not None


@pytest.mark.parametrize("model", ["rule_of_mixtures", "halpin_tsai", "chamis", "cylinders",
                                   "mori_tanaka"])
def test_two_equality_targets_met_at_one_fraction_give_that_point_as_the_window(model):
    # registry e-glass/epoxy, [0]4: Ex = E1 (exact identity), so E1 = Ex = E1(0.5) meet at Vf 0.5
    comp = Composite(get_material("e-glass"), get_material("epoxy"), 0.5)
    c = Constituents.from_composite(comp, layup="[0]4")
    e1 = value(c, model, "E1", 0.5)
    r = size_fraction(c, [SizingTarget("E1", e1), SizingTarget("Ex", e1)], models=[model],
                      bounds=False)
    assert r.status == "met_by_all_models"
    (w,) = r.windows[model]
    assert w.low.volume_fraction == pytest.approx(0.5, abs=1e-12)
    assert w.high.volume_fraction == w.low.volume_fraction
    assert r.common_window == r.windows[model]


def test_case_file_with_a_layup_sizes_laminate_targets(case_file):
    case = load_case(case_file)
    r = size_fraction(case, ["Ex>=20GPa"], models=["mori_tanaka"])
    x = r["Ex"].models["mori_tanaka"].fraction
    assert value(as_constituents(case), "mori_tanaka", "Ex", x) == pytest.approx(20e9, rel=1e-8)


def test_voids_leave_mori_tanaka_alone_and_lower_the_density(glass, resin):
    comp = Composite(glass, resin, 0.5, void_fraction=0.03)
    r = size_fraction(comp, "E2=9GPa")
    assert list(r["E2"].models) == ["mori_tanaka"] and r["E2"].bounds is None
    p = r["E2"].models["mori_tanaka"].crossings[0]
    v = p.volume_fraction
    assert p.density == pytest.approx(v * 2540 + (1 - v - 0.03) * 1200, rel=1e-14)


def test_spheres_are_sized_with_their_bounds(glass, resin):
    comp = Composite(glass, resin, 0.3, inclusion="sphere")
    r = size_fraction(comp, "E1=6GPa")
    assert list(r["E1"].models) == ["mori_tanaka"]
    # Mori-Tanaka equals the Hashin-Shtrikman lower bound for spheres in a softer matrix
    # (Weng 1984): it reaches the target where the admissible interval ends
    assert r["E1"].bounds.interval[1] == pytest.approx(
        r["E1"].models["mori_tanaka"].fraction, rel=1e-9)


def test_laminate_target_without_a_layup_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="target Ex needs a layup"):
        size_fraction(glass_epoxy, "Ex=20GPa")


def test_mass_target_without_densities_is_an_error():
    comp = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.5)
    with pytest.raises(InputError, match="target density needs the densities"):
        size_fraction(comp, "density<=1.8 g/cm^3")


def test_several_constituents_are_an_error(glass_epoxy):
    c = Constituents.from_composite(glass_epoxy, fibre=FibrePhase.isotropic([72e9, 86e9], 0.22))
    with pytest.raises(InputError, match=r"constituents of shape \(2,\); size one"):
        size_fraction(c, "E2=9GPa")


def test_model_that_does_not_apply_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="'hashin_shtrikman_lower' does not apply.*bounds=True"):
        size_fraction(glass_epoxy, "E2=9GPa", models=["hashin_shtrikman_lower"])


def test_design_of_the_wrong_type_is_an_error():
    with pytest.raises(InputError, match="design: expected a Composite, a case or Constituents"):
        as_constituents(42)


def test_layup_replaces_that_of_constituents(glass_epoxy):
    c = as_constituents(as_constituents(glass_epoxy), layup="[0]")
    assert c.angles == (0.0,)


# --- fibre orientation ------------------------------------------------------------------------


def test_random_mat_is_sized_with_the_averaged_mori_tanaka_and_no_bounds(glass, resin):
    comp = Composite(glass, resin, 0.3, inclusion="spheroid", aspect_ratio=50.0,
                     orientation="random_in_plane")
    r = size_fraction(comp, "E1=9GPa")
    assert list(r["E1"].models) == ["mori_tanaka"] and r["E1"].bounds is None
    x = r["E1"].models["mori_tanaka"].fraction
    assert value(as_constituents(comp), "mori_tanaka", "E1", x) == pytest.approx(9e9, rel=1e-8)
    from micromech.homogenize import estimate

    assert float(estimate(comp.with_fraction(x))["mori_tanaka"].E1) == pytest.approx(
        9e9, rel=1e-8)  # the same model as the estimate command


def test_random_3d_glass_is_sized_with_the_isotropic_bounds(glass, resin):
    comp = Composite(glass, resin, 0.3, inclusion="spheroid", aspect_ratio=1.0,
                     orientation="random_3d")
    r = size_fraction(comp, "E1=6GPa")
    # aspect ratio 1: Mori-Tanaka = HS lower bound (Weng 1984), so it closes the interval
    assert r["E1"].bounds.interval[1] == pytest.approx(r["E1"].models["mori_tanaka"].fraction,
                                                       rel=1e-9)


def test_point_window_prints_one_weight_fraction_and_one_density(glass_epoxy):
    r = size_fraction(glass_epoxy, "E1=40GPa", models=["mori_tanaka"], bounds=False)
    (w,) = r.common_window
    assert w.low.volume_fraction == w.high.volume_fraction  # an equality target: a point
    wf, rho = f"{w.low.weight_fraction:.4g}", w.low.density / 1e3
    assert f"for Vf {w.low.volume_fraction:.4g} (weight fraction {wf}; density {rho:.4g} g/cm^3)" \
           in r.message
    assert " to " not in r.message


def test_interval_window_still_prints_both_ends(glass_epoxy):
    r = size_fraction(glass_epoxy, "E1>=30GPa", models=["mori_tanaka"], bounds=False)
    (w,) = r.common_window
    assert f"weight fraction {w.low.weight_fraction:.4g} to {w.high.weight_fraction:.4g}" \
           in r.message
