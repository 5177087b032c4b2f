"""Throughput of the continuous-fibre Mori-Tanaka estimate (closed Walpole algebra).

Measured in one process and printed as ratios:

(a) Mori-Tanaka over 10^6 fibre fractions against the rule of mixtures on the same arrays
    (target: no more than 10 times the rule of mixtures' time);
(b) the same estimate called point by point in a Python loop, per point, against the vectorised
    call (target: the vectorised call at least 200 times faster per point);

plus the peak memory of the vectorised call (DESIGN.md: under 0.5 GB for 10^6 points).

Run: ``python benchmarks/bench_mori_tanaka.py`` (not part of the default test run).
"""

from __future__ import annotations

import time
import tracemalloc
from collections.abc import Callable
from typing import Any

import numpy as np

from micromech.homogenize import FibrePhase, MatrixPhase, mori_tanaka, rule_of_mixtures

# typical glass / epoxy constants with CTEs (common practice, no source)
FIBRE = FibrePhase.isotropic(72e9, 0.22, 5e-6)
MATRIX = MatrixPhase(3.5e9, 0.35, 60e-6)


def _best(fn: Callable[[], Any], repeat: int) -> float:
    best = np.inf
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return float(best)


def run(n: int = 10**6, loop_points: int = 2000, repeat: int = 5) -> dict[str, float]:
    """Measure the timings and ratios; return them as a dict (seconds, ratios, MB)."""
    vf = np.linspace(0.0, 0.7, n)
    mori_tanaka(FIBRE, MATRIX, vf[:10])  # warm up imports and caches
    t_rom = _best(lambda: rule_of_mixtures(FIBRE, MATRIX, vf), repeat)
    t_mt = _best(lambda: mori_tanaka(FIBRE, MATRIX, vf), repeat)
    pts = [float(v) for v in vf[:: max(1, n // loop_points)][:loop_points]]

    def loop() -> None:
        for v in pts:
            mori_tanaka(FIBRE, MATRIX, v)

    t_loop = _best(loop, 2) / len(pts)
    tracemalloc.start()
    mori_tanaka(FIBRE, MATRIX, vf)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    return {
        "n": float(n),
        "rule_of_mixtures_s": t_rom,
        "mori_tanaka_s": t_mt,
        "mt_over_rom": t_mt / t_rom,
        "loop_per_point_s": t_loop,
        "vector_per_point_s": t_mt / n,
        "loop_over_vector_per_point": t_loop / (t_mt / n),
        "peak_mb": peak / 1e6,
    }


def main() -> None:
    """Print the figures."""
    r = run()
    n = int(r["n"])
    print(f"Mori-Tanaka, continuous fibres, {n:,} fractions (CTE included)")
    print(f"  rule of mixtures, vectorised : {r['rule_of_mixtures_s'] * 1e3:8.1f} ms")
    print(f"  Mori-Tanaka, vectorised      : {r['mori_tanaka_s'] * 1e3:8.1f} ms")
    print(f"  ratio MT / RoM               : {r['mt_over_rom']:8.2f}   (target <= 10)")
    print(f"  MT per point, Python loop    : {r['loop_per_point_s'] * 1e6:8.1f} us")
    print(f"  MT per point, vectorised     : {r['vector_per_point_s'] * 1e9:8.1f} ns")
    print(f"  speed-up per point           : {r['loop_over_vector_per_point']:8.0f}   "
          "(target >= 200)")
    print(f"  peak memory of the MT call   : {r['peak_mb']:8.0f} MB  (target < 500)")


if __name__ == "__main__":
    main()
