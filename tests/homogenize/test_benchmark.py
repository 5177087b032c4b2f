"""Runs benchmarks/bench_mori_tanaka.py and asserts its two ratios (slow: excluded by default)."""

import importlib.util
from pathlib import Path

import pytest

BENCH = Path(__file__).resolve().parents[2] / "benchmarks" / "bench_mori_tanaka.py"


@pytest.mark.slow
def test_mori_tanaka_benchmark_meets_its_ratios():
    spec = importlib.util.spec_from_file_location("bench_mori_tanaka", BENCH)
    assert spec is not None and spec.loader is not None
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    r = mod.run(n=10**6, loop_points=1000, repeat=3)
    print(r)
    assert r["mt_over_rom"] <= 10.0  # DESIGN.md target (a)
    assert r["loop_over_vector_per_point"] >= 200.0  # DESIGN.md target (b)
    assert r["peak_mb"] < 500.0  # DESIGN.md: < 0.5 GB for 10^6 points
