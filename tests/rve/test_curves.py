"""Curve metrics against curves whose answers are known exactly (invented material constants)."""

from __future__ import annotations

import importlib.util
import json
import time
from pathlib import Path

import numpy as np
import pytest

from micromech.errors import InputError
from micromech.rve import Curve, curve_metrics, load_curve, metrics_of_curve

E, S0 = 70e9, 300e6  # invented aluminium-like constants


def ramberg_osgood(n: float = 10.0, points: int = 2001, top: float = 1.3) -> tuple:
    """eps = s/E + 0.002 (s/S0)^n: its 0.2 % offset yield is S0 by construction."""
    s = np.linspace(0.0, top * S0, points)
    return s / E + 0.002 * (s / S0) ** n, s


def bilinear(points: int = 301, e1: float = 100e9, e2: float = 10e9, knee: float = 0.003):
    x = np.linspace(0.0, 0.02, points)
    return x, np.where(x <= knee, e1 * x, e1 * knee + e2 * (x - knee))


# --- Ramberg-Osgood ----------------------------------------------------------------------


@pytest.mark.parametrize("n", [5.0, 10.0, 20.0])
def test_ramberg_osgood_offset_yield_is_sigma0(n):
    m = curve_metrics(*ramberg_osgood(n))
    # Ramberg & Osgood (1943), NACA TN 902: the 0.2 % offset yield of this curve is sigma0.
    assert m.yield_strength == pytest.approx(S0, rel=2e-3)
    assert m.yield_strain == pytest.approx(S0 / E + 0.002, rel=5e-3)
    assert m.modulus == pytest.approx(E, rel=5e-3)  # fit over the nearly linear start
    assert m.r2 > 0.9999 and m.fit_automatic


def test_ramberg_osgood_energy_is_the_integral_to_the_ultimate():
    n = 10.0
    eps, sig = ramberg_osgood(n, points=4001)
    su, eu = sig[-1], eps[-1]
    # integral of sigma d(eps) = su*eu - integral of eps d(sigma), exact for this curve
    exact = su * eu - (su**2 / (2 * E) + 0.002 * su ** (n + 1) / ((n + 1) * S0**n))
    assert curve_metrics(eps, sig).energy_to_ultimate == pytest.approx(exact, rel=1e-5)


@pytest.mark.parametrize("seed", range(5))
def test_ramberg_osgood_with_one_percent_noise(seed):
    eps, sig = ramberg_osgood(10.0)
    noise = 0.01 * (sig.max() - sig.min())
    noisy = sig + np.random.default_rng(seed).normal(0.0, noise, sig.size)
    m = curve_metrics(eps, noisy)
    assert m.yield_strength == pytest.approx(S0, rel=0.01)  # Ramberg & Osgood (1943)
    assert m.modulus == pytest.approx(E, rel=0.02)
    assert m.noise == pytest.approx(noise, rel=0.15)  # the robust estimate finds the noise
    assert any("noisy curve" in note for note in m.notes)


@pytest.mark.parametrize("seed", range(3))
def test_ramberg_osgood_with_noise_on_the_strain(seed):
    # noise on the displacement column: 0.1 % of the largest strain (2 strain steps)
    eps, sig = ramberg_osgood(10.0)
    noisy = eps + np.random.default_rng(seed).normal(0.0, 1e-3 * eps.max(), eps.size)
    m = curve_metrics(noisy, sig)
    assert m.yield_strength == pytest.approx(S0, rel=3e-3)  # Ramberg & Osgood (1943)
    assert m.modulus == pytest.approx(E, rel=1e-2)
    assert any("noisy strain" in note for note in m.notes)
    assert not any("unloading" in note for note in m.notes)  # noise is not an unloading


def test_unevenly_stepped_clean_strain_is_not_taken_for_noise():
    # equal stress steps make the strain steps grow 100-fold: smooth, not noisy
    m = curve_metrics(*ramberg_osgood(10.0, points=301))
    assert not any("noisy" in note for note in m.notes)
    assert m.yield_strength == pytest.approx(S0, rel=2e-3)  # Ramberg & Osgood (1943)


def test_unloading_is_still_found_on_a_noisy_strain():
    eps, sig = ramberg_osgood(10.0, points=2001)
    k = 1200
    down = np.linspace(sig[k], 0.3 * sig[k], 200)[1:]
    e_down = eps[k] - (sig[k] - down) / E
    x = np.concatenate((eps[: k + 1], e_down, e_down[::-1][1:-1], eps[k + 1:]))
    y = np.concatenate((sig[: k + 1], down, down[::-1][1:-1], sig[k + 1:]))
    x = x + np.random.default_rng(1).normal(0.0, 1e-3 * eps.max(), x.size)
    m = curve_metrics(x, y)
    assert any("unloading" in note for note in m.notes)
    assert m.yield_strength == pytest.approx(S0, rel=3e-3)  # Ramberg & Osgood (1943)
    assert m.modulus == pytest.approx(E, rel=1e-2)


def test_user_fit_range_on_a_noisy_strain():
    eps, sig = ramberg_osgood(10.0)
    noisy = eps + np.random.default_rng(2).normal(0.0, 1e-3 * eps.max(), eps.size)
    m = curve_metrics(noisy, sig, fit_range=(0.0005, 0.0025))
    assert not m.fit_automatic and m.fit_points > 50
    assert m.modulus == pytest.approx(E, rel=1e-2)  # RO curve: 0.2 % plastic strain at S0


# --- bilinear: every answer analytic ------------------------------------------------------


def test_bilinear_curve_metrics_are_analytic():
    e1, e2, knee, off, ptol = 100e9, 10e9, 0.003, 0.002, 0.01
    m = curve_metrics(*bilinear(e1=e1, e2=e2, knee=knee))
    eps_y = knee + off * e1 / (e1 - e2)  # offset line meets the second branch
    eps_p = (e1 - e2) * knee / (e1 - e2 - ptol * e1)  # departure reaches 1 % of the line
    assert m.modulus == pytest.approx(e1, rel=1e-12)
    assert m.modulus_fit_range[1] <= knee + 1e-15
    assert m.yield_strain == pytest.approx(eps_y, rel=1e-12)
    assert m.yield_strength == pytest.approx(e1 * (eps_y - off), rel=1e-12)
    assert m.proportional_limit_strain == pytest.approx(eps_p, rel=1e-9)
    assert m.proportional_limit == pytest.approx(e1 * knee + e2 * (eps_p - knee), rel=1e-9)
    assert m.ultimate_strength == pytest.approx(e1 * knee + e2 * (0.02 - knee), rel=1e-15)
    energy = 0.5 * e1 * knee**2 + (0.02 - knee) * (e1 * knee + 0.5 * e2 * (0.02 - knee))
    assert m.energy_to_ultimate == pytest.approx(energy, rel=1e-12)  # trapezoid exact here


def test_other_offset_moves_the_yield_analytically():
    m = curve_metrics(*bilinear(), offset=0.001)
    eps_y = 0.003 + 0.001 * 100e9 / 90e9
    assert m.yield_strain == pytest.approx(eps_y, rel=1e-12) and m.yield_offset == 0.001


def test_user_fit_range_overrides_the_search():
    x, y = bilinear()
    m = curve_metrics(x, y, fit_range=(0.00039, 0.00201))
    assert not m.fit_automatic
    assert m.modulus_fit_range == (x[6], x[30]) and m.fit_points == 25
    assert m.modulus == pytest.approx(100e9, rel=1e-12)
    mc = curve_metrics(-x, -y, fit_range=(-0.00039, -0.00201))  # signed range, compression
    assert mc.modulus == pytest.approx(100e9, rel=1e-12)


def test_shear_curve_gives_the_shear_modulus():
    gamma = np.linspace(0.0, 0.01, 101)
    tau = 4e9 * gamma
    m = metrics_of_curve(Curve(direction="xy", strain=gamma, stress=tau))
    assert m.direction == "xy" and m.modulus == pytest.approx(4e9, rel=1e-12)


# --- signs, units, unloading --------------------------------------------------------------


@pytest.mark.parametrize("noisy", [False, True])
def test_compression_mirror_gives_mirrored_metrics(noisy):
    eps, sig = ramberg_osgood(10.0)
    if noisy:
        sig = sig + np.random.default_rng(7).normal(0.0, 0.01 * sig.max(), sig.size)
    t = curve_metrics(eps, sig)
    c = curve_metrics(-eps, -sig)
    assert (c.sign, t.sign) == (-1, 1)
    assert c.modulus == t.modulus and c.r2 == t.r2 and c.failed == t.failed
    for name in ("yield_strength", "yield_strain", "ultimate_strength", "strain_at_ultimate",
                 "final_strain", "proportional_limit", "proportional_limit_strain",
                 "modulus_intercept"):
        assert getattr(c, name) == -getattr(t, name), name
    assert c.modulus_fit_range == (-t.modulus_fit_range[0], -t.modulus_fit_range[1])
    assert c.energy_to_ultimate == t.energy_to_ultimate > 0


def test_same_data_in_mn_um_and_n_mm_give_the_same_metrics(tmp_path):
    eps, sig = ramberg_osgood(10.0, points=501)
    size = (50e-6, 40e-6, 40e-6)
    area, length = size[1] * size[2], size[0]
    u_um = (eps * length / 1e-6).tolist()
    f_mn = (sig * area / 1e-3).tolist()
    a, b = tmp_path / "a.csv", tmp_path / "b.csv"
    pairs = list(zip(u_um, f_mn, strict=True))
    a.write_text("# invented\nu,f\n" + "\n".join(f"{u!r},{f!r}" for u, f in pairs))
    b.write_text("u f\n" + "\n".join(f"{u / 1e3!r} {f / 1e3!r}" for u, f in pairs))
    ma = metrics_of_curve(load_curve(a, "x", size, force=("f", "mN"), displacement=("u", "um")))
    mb = metrics_of_curve(load_curve(b, "x", size, force=("f", "N"), displacement=("u", "mm")))
    assert ma.yield_strength == pytest.approx(mb.yield_strength, rel=1e-12)
    assert ma.modulus == pytest.approx(mb.modulus, rel=1e-12)
    assert ma.yield_strength / 1e6 == pytest.approx(300.0, rel=2e-3)  # MPa, Ramberg & Osgood (1943)


def test_unloading_before_the_ultimate_is_ignored():
    eps, sig = ramberg_osgood(10.0, points=801)
    k = 500  # unload from point k to 30 % and reload below the previous strain
    down = np.linspace(sig[k], 0.3 * sig[k], 20)[1:]
    e_down = eps[k] - (sig[k] - down) / E
    up = down[::-1][1:-1]
    e_up = eps[k] - (sig[k] - up) / E
    x = np.concatenate((eps[: k + 1], e_down, e_up, eps[k + 1:]))
    y = np.concatenate((sig[: k + 1], down, up, sig[k + 1:]))
    plain, looped = curve_metrics(eps, sig), curve_metrics(x, y)
    for name in ("modulus", "yield_strength", "ultimate_strength", "energy_to_ultimate",
                 "proportional_limit"):
        assert getattr(looped, name) == getattr(plain, name), name
    assert any("unloading" in note for note in looped.notes)


def test_reload_after_the_ultimate_is_ignored_and_failure_flagged():
    x, y = bilinear()
    xr = np.concatenate((x, [0.019, 0.018, 0.019, 0.0205, 0.021]))
    yr = np.concatenate((y, [0.5 * y[-1], 0.2 * y[-1], 0.4 * y[-1], 0.6 * y[-1], 0.1 * y[-1]]))
    m0, m = curve_metrics(x, y), curve_metrics(xr, yr)
    assert m.ultimate_strength == m0.ultimate_strength and m.modulus == m0.modulus
    assert m.final_strain == 0.021 and m.failed and not m0.failed


# --- failure flag, missing yield ------------------------------------------------------------


def test_run_stopped_before_failure_is_flagged():
    m = curve_metrics(*ramberg_osgood(10.0))
    assert m.failed is False  # largest stress at the last point: strength is a lower limit
    assert any("lower limit" in note for note in m.notes)


def test_drop_after_the_peak_counts_as_failure():
    x, y = bilinear()
    m = curve_metrics(np.append(x, [0.0201, 0.0202]), np.append(y, [0.5 * y[-1], 0.0]))
    assert m.failed is True and m.final_strain == 0.0202
    assert m.strain_at_ultimate == pytest.approx(0.02)


def test_flat_plateau_is_not_a_failure():
    x = np.linspace(0, 0.02, 401)
    y = np.minimum(70e9 * x, 280e6)  # elastic-perfectly plastic: the peak is early on the plateau
    assert curve_metrics(x, y).failed is False


def test_noisy_rising_curve_is_not_a_failure():
    eps, sig = ramberg_osgood(10.0, points=100_000)
    noisy = sig + np.random.default_rng(3).normal(0.0, 0.01 * sig.max(), sig.size)
    assert curve_metrics(eps, noisy).failed is False


def test_linear_to_failure_has_no_offset_yield():
    x = np.linspace(0, 0.015, 151)
    m = curve_metrics(np.append(x, 0.0151), np.append(230e9 * x, 0.0))
    assert m.yield_strength is None and m.yield_strain is None
    assert "stays above the 0.002 offset line" in m.yield_note
    assert m.proportional_limit == pytest.approx(230e9 * 0.015)
    assert m.failed


def test_run_too_short_for_the_offset_says_so():
    x = np.linspace(0, 0.001, 51)
    m = curve_metrics(x, 70e9 * x)
    assert m.yield_strength is None
    assert "ends at strain 0.001, before the 0.002 offset line starts" in m.yield_note


def test_poisson_ratio_from_lateral_strain_over_the_fit_range():
    x, y = bilinear()
    lateral = {"y": -0.31 * x, "z": -0.25 * x + 1e-6}
    m = curve_metrics(x, y, lateral=lateral)
    assert m.poisson["y"] == pytest.approx(0.31, rel=1e-12)
    assert m.poisson["z"] == pytest.approx(0.25, rel=1e-12)


def test_as_dict_has_the_json_contract_keys():
    d = curve_metrics(*bilinear()).as_dict()
    for key in ("modulus", "modulus_fit_range", "r2", "yield_offset", "yield_strength",
                "ultimate_strength", "strain_at_ultimate", "final_strain", "failed"):
        assert key in d
    json.dumps(d, allow_nan=False)


def test_metrics_of_a_long_curve_take_well_under_a_third_of_a_second():
    eps, sig = ramberg_osgood(10.0, points=100_000)
    noisy = sig + np.random.default_rng(0).normal(0.0, 0.01 * sig.max(), sig.size)
    best = np.inf
    for _ in range(3):
        t0 = time.perf_counter()
        curve_metrics(eps, noisy)
        best = min(best, time.perf_counter() - t0)
    assert best < 0.3


# --- bad input ------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("strain", "stress", "message"),
    [
        ([0.0, 1.0], [0.0, 1.0], r"strain: 2 point\(s\); at least 3"),
        ([0.0, 1.0, 2.0], [0.0, 1.0, 2.0, 3.0], "strain has 3 points but stress has 4"),
        ([[0.0, 1.0, 2.0]], [0.0, 1.0, 2.0], "expected a 1-D array"),
        ([0.0, np.inf, 2.0], [0.0, 1.0, 2.0], "point 1 is inf"),
        (["a", "b", "c"], [0.0, 1.0, 2.0], "expected an array of numbers"),
        ([0.0, 1.0, 2.0], [0.0, 0.0, 0.0], "stress is zero at every point"),
        ([0.0, 1.0, 2.0, 3.0], [0.0, 5.0, 1.0, 2.0], r"only 2 loading point\(s\) up to the"),
        ([1e-3, 1e-3, 1e-3, 1e-3], [0.0, 1.0, 2.0, 3.0], "strain does not change"),
        ([1e-300, 2e-300, 3e-300], [1e300, 2e300, 3e300], "out of range"),
    ],
)
def test_bad_curves_raise(strain, stress, message):
    with pytest.raises(InputError, match=message):
        curve_metrics(strain, stress)


def test_stress_and_strain_of_opposite_sign_raise():
    x = np.linspace(0.0, 0.01, 11)
    with pytest.raises(InputError, match="opposite signs; check the sign convention"):
        curve_metrics(-x, 70e9 * x)


def test_inputs_are_not_modified():
    eps, sig = ramberg_osgood(10.0, points=301)
    lat = -0.3 * eps
    copies = eps.copy(), sig.copy(), lat.copy()
    curve_metrics(eps, sig, lateral={"y": lat})
    for before, after in zip(copies, (eps, sig, lat), strict=True):
        np.testing.assert_array_equal(before, after)


def test_negative_initial_slope_raises():
    x = np.arange(6) * 1e-3
    y = np.array([0.0, -1.0, -2.0, -3.0, 0.0, 10.0]) * 1e6
    with pytest.raises(InputError, match="initial slope .* is not positive"):
        curve_metrics(x, y, fit_range=(0.0, 0.003))


@pytest.mark.parametrize(
    ("kwargs", "message"),
    [
        ({"offset": 0.0}, "offset: must lie between 0 and 1"),
        ({"offset": 1.5}, "offset: must lie between 0 and 1"),
        ({"offset": "0.2 %"}, "offset: expected a positive number"),
        ({"linear_tolerance": True}, "linear_tolerance: expected a positive number"),
        ({"proportional_tolerance": -0.1}, "proportional_tolerance: must lie between 0 and 1"),
        ({"fit_range": (0.001,)}, "fit_range must be two strains"),
        ({"fit_range": (0.0, np.nan)}, "fit_range must be finite"),
        ({"fit_range": (-0.001, 0.002)}, "mixes signs"),
        ({"fit_range": (0.00101, 0.00105)}, r"holds 0 loading point\(s\)"),
        ({"lateral": {"y": [0.0, 1.0, 2.0]}}, "lateral strain y has 3 points, the curve 301"),
    ],
)
def test_bad_settings_raise(kwargs, message):
    with pytest.raises(InputError, match=message):
        curve_metrics(*bilinear(), **kwargs)


# --- benchmark ------------------------------------------------------------------------------


@pytest.mark.slow
def test_benchmark_grades_six_long_load_cases_in_under_two_seconds():
    path = Path(__file__).resolve().parents[2] / "benchmarks" / "bench_check.py"
    spec = importlib.util.spec_from_file_location("bench_check", path)
    assert spec is not None and spec.loader is not None
    bench = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(bench)
    result = bench.run(points=100_000, repeats=1)
    assert result["seconds"] < 2.0


# --- issue 6 of the user trial: smooth curves are not taken for noisy ones --------------------


@pytest.mark.parametrize("points", [60, 120, 500])
def test_smooth_tanh_curve_is_not_flagged_noisy(points):
    # a noise-free curve: its second differences are curvature, not noise
    e = np.linspace(0.0, 0.03, points)
    m = curve_metrics(e, 80e6 * np.tanh(e / 0.005))
    assert not any("noisy" in note for note in m.notes)


@pytest.mark.parametrize("seed", range(3))
def test_tanh_curve_with_noise_above_1e4_of_the_range_is_smoothed(seed):
    e = np.linspace(0.0, 0.03, 500)
    s = 80e6 * np.tanh(e / 0.005)
    noisy = s + np.random.default_rng(seed).normal(0.0, 1e-3 * 80e6, s.size)
    m = curve_metrics(e, noisy)
    assert any("noisy curve" in note and "smoothed over 5 points" in note for note in m.notes)
