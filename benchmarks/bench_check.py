"""Benchmark: grade an RVE case with six load cases of 10^5 points each (target: under 2 s).

Generates six invented CSV histories (force in N, displacement in um, lateral displacements for
the normal cases; 1 % noise on the force) and a case file in a temporary folder, then times,
in one process:

1. reading + curve metrics with micromech.rve (read_table, history_to_curve, metrics_of_curve)
   and the constants from the curves;
2. grading the whole case end to end with micromech.rve.check.check_case (report plots
   excluded);
3. a baseline: reading the same files with a plain-Python csv loop (csv.reader, float()).

Prints the times and the ratios to the baseline. Run: ``python benchmarks/bench_check.py``.
All data are invented.
"""

from __future__ import annotations

import csv
import sys
import tempfile
import time
from pathlib import Path
from typing import Any

import numpy as np

from micromech.rve import constants_from_curves, history_to_curve, metrics_of_curve, read_table
from micromech.rve.check import check_case
from micromech.rve.ingest import _case_geometry

SIZE_UM = (120.0, 70.0, 70.0)  # invented UD cell, fibres along x
SIZE_M = np.asarray(SIZE_UM) * 1e-6
# invented moduli (Pa) and Poisson ratios of a glass/epoxy-like UD cell
MODULI = {"x": 41.6e9, "y": 10.5e9, "z": 10.5e9, "xy": 3.7e9, "xz": 3.7e9, "yz": 3.4e9}
POISSON = {("x", "y"): 0.27, ("x", "z"): 0.27, ("y", "z"): 0.44, ("y", "x"): 0.27 * 10.5 / 41.6,
           ("z", "x"): 0.27 * 10.5 / 41.6, ("z", "y"): 0.44}
YIELD = {"x": 900e6, "y": 60e6, "z": 60e6, "xy": 50e6, "xz": 50e6, "yz": 45e6}

CASE = """\
# invented benchmark case: glass / epoxy UD cell, six synthetic load cases
name = "invented benchmark: glass / epoxy UD cell"

[fibre]
E = "73 GPa"
nu = 0.22

[matrix]
E = "3.2 GPa"
nu = 0.35

[composite]
volume_fraction = 0.55
inclusion = "continuous"
arrangement = "hexagonal"

[rve]
architecture = "unidirectional"
size = {{ x = "{x} um", y = "{y} um", z = "{z} um" }}
{cases}
"""

LOAD_CASE = """
[[rve.load_case]]
direction = "{d}"
file = "rve_{d}.csv"
force = {{ column = "force", unit = "N" }}
displacement = {{ column = "disp", unit = "um" }}
{lateral}"""


def write_case(folder: Path, points: int, seed: int = 0) -> tuple[Path, dict[str, Any]]:
    """Write six histories and a case file; return the case path and the reading settings."""
    rng = np.random.default_rng(seed)
    specs: dict[str, Any] = {}
    blocks = []
    for d, E in MODULI.items():
        s0 = YIELD[d]
        stress = np.linspace(0.0, 1.4 * s0, points)
        strain = stress / E + 0.002 * (stress / s0) ** 12  # Ramberg-Osgood shape
        noisy = stress + rng.normal(0.0, 0.01 * stress[-1], points)
        area, length = _case_geometry(d, SIZE_M)
        cols = [np.arange(points) * 1e-3, strain * length / 1e-6, noisy * area]
        names = ["time", "disp", "force"]
        lateral: dict[str, tuple[str, str]] = {}
        if len(d) == 1:
            for a in "xyz":
                if a != d:
                    lat = -POISSON[(d, a)] * strain * SIZE_UM["xyz".index(a)]
                    cols.append(lat)
                    names.append(f"u{a}")
                    lateral[a] = (f"u{a}", "um")
        path = folder / f"rve_{d}.csv"
        np.savetxt(path, np.column_stack(cols), delimiter=",", fmt="%.10g",
                   header="invented benchmark history\n" + ",".join(names), comments="# ")
        # the second header line must be the column names, not a comment
        text = path.read_text().replace("# " + ",".join(names), ",".join(names), 1)
        path.write_text(text)
        specs[d] = {"path": path, "lateral": lateral}
        lat_toml = ""
        if lateral:
            items = ", ".join(f'{{ column = "{c}", unit = "{u}", direction = "{a}" }}'
                              for a, (c, u) in lateral.items())
            lat_toml = f"lateral = [{items}]\n"
        blocks.append(LOAD_CASE.format(d=d, lateral=lat_toml))
    case = folder / "case.toml"
    case.write_text(CASE.format(x=SIZE_UM[0], y=SIZE_UM[1], z=SIZE_UM[2], cases="".join(blocks)))
    return case, specs


def time_ours(specs: dict[str, Any]) -> tuple[float, float, dict[str, Any]]:
    """Time reading (table + curve) and the metrics of the six cases."""
    t0 = time.perf_counter()
    curves = {}
    for d, spec in specs.items():
        table = read_table(spec["path"])
        curves[d] = history_to_curve(table, d, SIZE_M, force=("force", "N"),
                                     displacement=("disp", "um"), lateral=spec["lateral"] or None)
    t1 = time.perf_counter()
    metrics = {d: metrics_of_curve(c) for d, c in curves.items()}
    constants = constants_from_curves(metrics)
    t2 = time.perf_counter()
    return t1 - t0, t2 - t1, {"metrics": metrics, "constants": constants}


def time_baseline(specs: dict[str, Any]) -> float:
    """Plain-Python csv loop over the same files (the baseline)."""
    t0 = time.perf_counter()
    for spec in specs.values():
        with open(spec["path"], newline="") as f:
            rows = []
            for row in csv.reader(f):
                if not row or row[0].startswith("#"):
                    continue
                try:
                    rows.append([float(c) for c in row])
                except ValueError:
                    continue  # header
    return time.perf_counter() - t0


def time_check(case: Path) -> tuple[float, str]:
    """Time check_case end to end."""
    t0 = time.perf_counter()
    result = check_case(case)
    return time.perf_counter() - t0, f"worst verdict: {result.worst_verdict}"


def run(points: int = 100_000, repeats: int = 3) -> dict[str, Any]:
    """Generate the case, time each part (best of ``repeats``) and return the figures."""
    with tempfile.TemporaryDirectory() as tmp:
        case, specs = write_case(Path(tmp), points)
        best: dict[str, float] = {}
        check_note = ""
        info: dict[str, Any] = {}
        for _ in range(repeats):
            t_read, t_metrics, info = time_ours(specs)
            t_base = time_baseline(specs)
            t_check, check_note = time_check(case)
            for key, val in (("read", t_read), ("metrics", t_metrics), ("baseline", t_base),
                             ("check", t_check)):
                best[key] = min(best.get(key, np.inf), val)
    ours = best["read"] + best["metrics"]
    return {
        "points": points,
        "read": best["read"],
        "metrics": best["metrics"],
        "read_and_metrics": ours,
        "check": best["check"],
        "check_note": check_note,
        "baseline": best["baseline"],
        "seconds": best["check"],
        "moduli": {d: m.modulus for d, m in info["metrics"].items()},
    }


def main() -> None:
    points = int(sys.argv[1]) if len(sys.argv) > 1 else 100_000
    r = run(points)
    print(f"six load cases of {r['points']} points each (best of 3)")
    print(f"  read (table + curve):      {r['read']:.3f} s")
    print(f"  curve metrics + constants: {r['metrics']:.3f} s")
    print(f"  read + metrics:            {r['read_and_metrics']:.3f} s")
    print(f"  check_case end to end:     {r['check']:.3f} s ({r['check_note']})")
    print(f"  baseline csv loop (read only): {r['baseline']:.3f} s")
    print(f"  ratio read + metrics / baseline: {r['read_and_metrics'] / r['baseline']:.2f}")
    print(f"  ratio read only / baseline:      {r['read'] / r['baseline']:.2f}")
    print(f"end to end: {r['seconds']:.3f} s (target < 2 s)")
    print("moduli (GPa): " + ", ".join(f"{d} {v / 1e9:.2f}" for d, v in r["moduli"].items()))


if __name__ == "__main__":
    main()
