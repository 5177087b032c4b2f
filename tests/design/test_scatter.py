"""Monte Carlo scatter of a composite's estimated properties."""

import math
import time

import numpy as np
import pytest

from micromech.case import load_case
from micromech.design import Constituents, constituent_inputs, monte_carlo
from micromech.errors import InputError
from micromech.homogenize import FibrePhase
from micromech.materials import Composite


def test_rule_of_mixtures_scatter_converges_to_the_closed_form(glass_epoxy):
    # E1 = Ef Vf + Em (1 - Vf) (Jones 1999, 2nd ed., Eq. 3.6) with independent normal Ef, Em, Vf;
    # moments by hand from independence:
    #   mean = mEf mVf + mEm (1 - mVf)
    #   var  = mVf^2 vEf + (1 - mVf)^2 vEm + (mEf - mEm)^2 vVf + vVf (vEf + vEm)
    n = 100_000
    r = monte_carlo(glass_epoxy, n, model="rule_of_mixtures", properties=["E1"], cov=0.05,
                    cov_fraction=0.02, seed=2024, keep_samples=True)
    mEf, mEm, mV = 72e9, 3.5e9, 0.55
    vEf, vEm, vV = (0.05 * mEf) ** 2, (0.05 * mEm) ** 2, (0.02 * mV) ** 2
    mean = mEf * mV + mEm * (1 - mV)
    var = mV**2 * vEf + (1 - mV) ** 2 * vEm + (mEf - mEm) ** 2 * vV + vV * (vEf + vEm)
    s = r["E1"]
    x = r.samples["E1"]
    m4 = float(np.mean((x - x.mean()) ** 4))
    assert abs(s.mean - mean) < 4 * math.sqrt(var / n)
    assert abs(s.std**2 - var) < 4 * math.sqrt((m4 - s.std**4) / n)
    assert s.percentiles[5.0] < s.percentiles[50.0] < s.percentiles[95.0]


def test_inputs_of_an_isotropic_and_a_transversely_isotropic_fibre(glass_epoxy, carbon, resin):
    iso = constituent_inputs(Constituents.from_composite(glass_epoxy), 0.55)
    assert list(iso) == ["fibre_E", "fibre_nu", "fibre_alpha", "matrix_E", "matrix_nu",
                         "matrix_alpha", "fibre_density", "matrix_density", "volume_fraction"]
    assert iso["fibre_E"].cov == 0.05 and iso["fibre_nu"].cov == 0.0
    assert iso["volume_fraction"].upper == pytest.approx(0.82)
    ti = constituent_inputs(Constituents(carbon, resin), 0.6, covs={"fibre_nu23": 0.1},
                            cov_expansion=0.1, distribution="lognormal")
    assert {"fibre_E1", "fibre_E2", "fibre_G12", "fibre_nu12", "fibre_alpha1"} <= set(ti)
    assert ti["fibre_nu23"].cov == 0.1 and ti["fibre_alpha1"].distribution == "lognormal"


def test_transversely_isotropic_fibre_rows_stay_positive_definite(carbon, resin):
    comp = Composite(carbon, resin, 0.6)
    r = monte_carlo(comp, 5000, seed=3, cov_poisson=0.8, properties=["E2", "nu23"],
                    keep_samples=True)
    s = r.samples
    assert r.rejected > 0
    assert np.all(s["fibre_nu23"] < 1 - 2 * s["fibre_nu12"] ** 2 * s["fibre_E2"] / s["fibre_E1"])
    assert np.all(s["volume_fraction"] > 0) and np.all(s["volume_fraction"] < 0.82)


def test_default_outputs_follow_the_model_and_the_layup(case_file):
    case = load_case(case_file)
    r = monte_carlo(case, 500, seed=1)
    assert r.model == "mori_tanaka"
    assert {"E1", "E2", "G23", "alpha2", "density", "weight_fraction", "Ex", "nuxy"} <= set(
        r.outputs)
    ht = monte_carlo(case, 500, seed=1, model="halpin_tsai")
    assert "G23" not in ht.outputs
    sp = monte_carlo(case, 500, seed=1, properties=["E1/density"], volume_fraction=0.4)
    assert sp["E1/density"].mean == pytest.approx(
        (0.4 * 72e9 + 0.6 * 3.5e9) / (0.4 * 2540 + 0.6 * 1200), rel=0.02)


def test_fixed_inputs_at_a_range_end_are_allowed(glass_epoxy):
    r = monte_carlo(glass_epoxy, 100, seed=1, volume_fraction=0.0, cov_fraction=0.0,
                    properties=["E1"])
    assert r["E1"].mean == pytest.approx(3.5e9, rel=0.05)


@pytest.mark.slow
def test_hundred_thousand_mori_tanaka_samples_take_well_under_a_second(glass_epoxy):
    monte_carlo(glass_epoxy, 1000, seed=0, properties=["E2"])  # warm up imports
    t0 = time.perf_counter()
    r = monte_carlo(glass_epoxy, 100_000, seed=0, properties=["E1", "E2", "G12", "G23", "nu12"])
    dt = time.perf_counter() - t0
    print(f"\n10^5 Mori-Tanaka Monte Carlo samples (5 outputs): {dt:.3f} s")
    assert r.n == 100_000 and dt < 1.0


def test_model_that_does_not_apply_is_an_error(glass, resin):
    with pytest.raises(InputError, match="model 'chamis' does not apply to sphere inclusions"):
        monte_carlo(Composite(glass, resin, 0.3, inclusion="sphere"), 10, model="chamis")


def test_property_the_model_does_not_give_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="property 'G23': halpin_tsai does not give it here"):
        monte_carlo(glass_epoxy, 10, model="halpin_tsai", properties=["G23"])


def test_unknown_property_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="unknown property 'E7'"):
        monte_carlo(glass_epoxy, 10, properties=["E7"])


def test_fraction_above_the_packing_limit_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match=r"volume_fraction = 0.95 must lie in \[0, 0.82\]"):
        monte_carlo(glass_epoxy, 10, volume_fraction=0.95)


def test_design_without_a_fraction_is_an_error(glass, resin):
    with pytest.raises(InputError, match="volume_fraction: give the mean fibre fraction"):
        monte_carlo(Constituents(glass, resin), 10)


def test_unknown_cov_name_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="covs: 'fibre_E1' is not an input; inputs are fibre_E"):
        monte_carlo(glass_epoxy, 10, covs={"fibre_E1": 0.1})


def test_several_constituents_are_an_error(glass_epoxy):
    c = Constituents.from_composite(glass_epoxy, fibre=FibrePhase.isotropic([72e9, 80e9], 0.2))
    with pytest.raises(InputError, match=r"constituents of shape \(2,\); give one fibre"):
        constituent_inputs(c, 0.5)
