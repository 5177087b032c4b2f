"""Monte Carlo propagation: convergence to closed-form moments of a linear model."""

import math

import numpy as np
import pytest

from micromech.design.uncertainty import Uncertain, propagate
from micromech.errors import InputError

# rule of mixtures E1 = Ef Vf + Em (1 - Vf) (Jones 1999, 2nd ed., Eq. 3.6) with independent
# normal Ef, Em, Vf. Moments derived by hand from independence (E[XY] = E[X] E[Y]):
#   mean = mEf mVf + mEm (1 - mVf)
#   var  = mVf^2 vEf + (1 - mVf)^2 vEm + (mEf - mEm)^2 vVf + vVf (vEf + vEm)
MEF, MEM, MVF = 72e9, 3.5e9, 0.55
SEF, SEM, SVF = 0.05 * MEF, 0.05 * MEM, 0.02 * MVF


def rom(s):
    return {"E1": s["Ef"] * s["Vf"] + s["Em"] * (1.0 - s["Vf"])}


def test_mean_and_variance_converge_to_the_closed_form():
    n = 200_000
    r = propagate(rom, {"Ef": Uncertain(MEF, 0.05), "Em": Uncertain(MEM, 0.05),
                          "Vf": Uncertain(MVF, 0.02)}, n, seed=12345, keep_samples=True)
    mean = MEF * MVF + MEM * (1 - MVF)
    var = (MVF**2 * SEF**2 + (1 - MVF) ** 2 * SEM**2 + (MEF - MEM) ** 2 * SVF**2
           + SVF**2 * (SEF**2 + SEM**2))
    s = r["E1"]
    x = r.samples["E1"]
    m4 = float(np.mean((x - x.mean()) ** 4))
    se_mean = math.sqrt(var / n)
    se_var = math.sqrt((m4 - s.std**4) / n)  # standard error of a sample variance
    assert abs(s.mean - mean) < 4 * se_mean
    assert abs(s.std**2 - var) < 4 * se_var
    assert r.rejected == 0  # 2 % and 5 % CoVs never leave the physical range here


def test_percentiles_of_a_normal_output_converge_to_the_normal_quantiles():
    # with Vf fixed, E1 is an exact linear combination of normals: normal with the moments above
    n = 200_000
    r = propagate(rom, {"Ef": Uncertain(MEF, 0.05), "Em": Uncertain(MEM, 0.05), "Vf": MVF},
                    n, seed=7, percentiles=(5, 50, 95))
    mean = MEF * MVF + MEM * (1 - MVF)
    sd = math.sqrt(MVF**2 * SEF**2 + (1 - MVF) ** 2 * SEM**2)
    z95 = 1.6448536269514722  # standard normal 95 % quantile (Abramowitz and Stegun 1964,
    # Table 26.5; from memory)
    phi = math.exp(-0.5 * z95**2) / math.sqrt(2 * math.pi)
    se_q = math.sqrt(0.05 * 0.95 / n) / phi * sd  # asymptotic standard error of a quantile
    se_med = math.sqrt(0.25 / n) / (1 / math.sqrt(2 * math.pi)) * sd
    p = r["E1"].percentiles
    assert abs(p[5.0] - (mean - z95 * sd)) < 4 * se_q
    assert abs(p[95.0] - (mean + z95 * sd)) < 4 * se_q
    assert abs(p[50.0] - mean) < 4 * se_med


def test_lognormal_input_keeps_its_mean_and_cov_and_the_sign_of_a_negative_mean():
    n = 100_000
    r = propagate(lambda s: {"a": s["a"], "b": s["b"]},
                    {"a": Uncertain(2.0, 0.3, "lognormal"),
                     "b": Uncertain(-5e-7, 0.1, "lognormal")},
                    n, seed=3)
    # lognormal moments (Johnson, Kotz and Balakrishnan 1994, Ch. 14): mean 2, std 0.6
    assert abs(r["a"].mean - 2.0) < 4 * 0.6 / math.sqrt(n)
    assert r["a"].std == pytest.approx(0.6, rel=0.02)
    assert r["b"].percentiles[95.0] < 0.0
    assert r["b"].mean == pytest.approx(-5e-7, rel=0.002)


def test_samples_outside_the_physical_range_are_redrawn_not_clipped():
    r = propagate(lambda s: {"E": s["E"]}, {"E": Uncertain(1.0, 1.0, lower=0.0)}, 20_000,
                    seed=5, keep_samples=True)
    assert r.rejected > 0  # about 16 % of a normal with CoV 1 is negative
    assert r.samples["E"].min() > 0.0
    assert np.count_nonzero(r.samples["E"] == 0.0) == 0


def test_joint_check_redraws_whole_rows():
    r = propagate(lambda s: {"d": s["x"] - s["y"]},
                    {"x": Uncertain(1.0, 0.5), "y": Uncertain(0.9, 0.5)}, 5000, seed=9,
                    valid=lambda s: s["x"] > s["y"])
    assert r["d"].percentiles[5.0] > 0.0 and r.rejected > 0


def test_same_seed_gives_the_same_result_and_chunks_report_progress():
    seen = []
    spec = {"Ef": Uncertain(MEF, 0.05), "Em": Uncertain(MEM, 0.05), "Vf": Uncertain(MVF, 0.02)}
    a = propagate(rom, spec, 2500, seed=11, chunk_size=1000,
                    progress=lambda d, t: seen.append((d, t)))
    b = propagate(rom, spec, 2500, seed=11, chunk_size=1000)
    assert seen == [(1000, 2500), (2000, 2500), (2500, 2500)]
    assert a["E1"].mean == b["E1"].mean and a["E1"].percentiles == b["E1"].percentiles
    assert a.seed == 11


def test_histogram_counts_every_finite_sample_and_result_serialises():
    import json

    r = propagate(rom, {"Ef": Uncertain(MEF, 0.05), "Em": MEM, "Vf": MVF}, 1000, seed=1,
                    bins=12)
    s = r["E1"]
    assert s.counts.sum() == 1000 and s.edges.shape == (13,)
    d = json.loads(json.dumps(r.as_dict(), allow_nan=False))
    assert set(d["outputs"]["E1"]["percentiles"]) == {"P5", "P50", "P95"}
    assert d["inputs"]["Ef"] == {"mean": MEF, "cov": 0.05, "distribution": "normal",
                                 "lower": None, "upper": None}
    assert s.cov == pytest.approx(s.std / s.mean)


def test_constant_output_has_zero_spread():
    r = propagate(lambda s: {"c": 3.0, "skip": None}, {"x": Uncertain(1.0, 0.1)}, 10, seed=0)
    assert r["c"].std == 0.0 and r["c"].percentiles[50.0] == 3.0
    assert "skip" not in r.outputs


def test_too_few_samples_is_an_error():
    with pytest.raises(InputError, match="samples: n = 1; need at least 2"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 1)


def test_too_many_samples_is_an_error_before_any_memory_is_taken():
    with pytest.raises(InputError, match=r"samples: n = 100000000; at most 1e\+07"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 10**8)


def test_percentile_out_of_range_is_an_error():
    with pytest.raises(InputError, match=r"percentiles: \[5.0, 150.0\] must each lie in"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 10, percentiles=(5, 150))


def test_bad_bins_is_an_error():
    with pytest.raises(InputError, match="bins = 0, chunk_size = 10: both must be >= 1"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 10, bins=0, chunk_size=10)


def test_rows_that_never_pass_are_an_error():
    with pytest.raises(InputError, match="still fail the physical range after 3 redraws"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 10, valid=lambda s: s["Ef"] < 0,
                    max_rounds=3)


def test_function_must_return_a_mapping_of_row_arrays():
    with pytest.raises(InputError, match="returned list; expected a mapping"):
        propagate(lambda s: [1.0], {"x": 1.0}, 10)
    with pytest.raises(InputError, match=r"output 'y' has shape \(3,\) for 10 sample rows"):
        propagate(lambda s: {"y": np.zeros(3)}, {"x": 1.0}, 10)
    with pytest.raises(InputError, match="returned no outputs"):
        propagate(lambda s: {}, {"x": 1.0}, 10)


def test_unknown_output_is_an_error():
    r = propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": MVF}, 10)
    with pytest.raises(InputError, match="no output 'E2'; outputs are E1"):
        r["E2"]


def test_input_that_is_not_a_number_is_an_error():
    with pytest.raises(InputError, match="input 'x': expected an Uncertain or a number, got str"):
        propagate(rom, {"x": "abc"}, 10)
    with pytest.raises(InputError, match=r"input 'Vf': fixed value nan must be finite"):
        propagate(rom, {"Ef": MEF, "Em": MEM, "Vf": float("nan")}, 10)


@pytest.mark.parametrize(
    ("kwargs", "message"),
    [
        ({"mean": float("nan")}, "mean = nan must be finite"),
        ({"mean": 1.0, "cov": -0.1}, "cov = -0.1 must be finite and >= 0"),
        ({"mean": 1.0, "distribution": "uniform"}, "distribution = 'uniform' is not"),
        ({"mean": -1.0, "lower": 0.0}, r"mean = -1.0 lies outside its physical range \(0.0, inf\)"),
    ],
)
def test_bad_uncertain_inputs_are_errors(kwargs, message):
    with pytest.raises(InputError, match=message):
        Uncertain(**kwargs)
