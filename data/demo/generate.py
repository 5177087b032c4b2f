"""Synthesise the invented demo histories rve_x.csv, rve_y.csv and rve_z.csv.

Invented example (not measured, not from any publication). These files are NOT the output of an
RVE simulation: they are made here from micromech's own estimate of the case in crossply.toml
(a periodic stack of Mori-Tanaka plies, exact layer averaging), plus an invented softening after
a proportional limit, an invented failure drop and a little seeded noise. Because the data come
from our own estimate, `micromech check crossply.toml` must grade them consistent; the check of
crossply_bad.toml (same files, two deliberate input mistakes) shows what a unit slip and a wrong
cell size look like. Nothing here says how a real glass/epoxy cross-ply behaves.

Run from anywhere: ``python data/demo/generate.py``. The output is deterministic.
"""

from __future__ import annotations

import tomllib
from pathlib import Path

import numpy as np

from micromech.case import case_from_dict
from micromech.homogenize import mori_tanaka
from micromech.laminate.layup import parse_layup
from micromech.laminate.stack import stack_constants

HERE = Path(__file__).resolve().parent
CASE = HERE / "crossply.toml"
SEED = 20240611

#: Invented curve shapes per load case: proportional limit, 0.2 % offset yield and ultimate
#: stress (Pa). Softening after the proportional limit: plastic strain
#: 0.002 * ((s - s_p) / (s_y - s_p))**2, so the offset yield lies at s_y by construction.
SHAPES = {
    "x": {"s_p": 120e6, "s_y": 200e6, "s_u": 300e6},
    "y": {"s_p": 120e6, "s_y": 200e6, "s_u": 300e6},
    "z": {"s_p": 35e6, "s_y": 55e6, "s_u": 62e6},
}
#: Invented factors on the estimated moduli (1.0: the Mori-Tanaka stack as it is). The
#: through-thickness modulus is raised by 4 %, inside the band where full-field transverse
#: moduli are found above Mori-Tanaka (this project's ACCURACY.md); the Poisson ratios of the
#: z load case follow from reciprocity.
MODULUS_FACTOR = {"x": 1.0, "y": 1.0, "z": 1.04}
#: Relative noise (standard deviation over the peak) of force and lateral displacement.
NOISE = 1e-3
POINTS = 160


def stack_estimate() -> dict[str, float]:
    """Return the stack constants of the demo case from Mori-Tanaka plies (Pa)."""
    data = tomllib.loads(CASE.read_text(encoding="utf-8"))
    data["rve"].pop("load_case")  # the histories are what this script writes
    case = case_from_dict(data, path=CASE)
    comp = case.composite
    ply = mori_tanaka(comp.fibre, comp.matrix, comp.volume_fraction)
    angles = np.asarray(parse_layup(case.rve.layup))
    n = angles.size
    layers = np.broadcast_to(ply.stiffness(), (n, 6, 6))
    c = stack_constants(layers, np.full(n, 1.0 / n), angles=angles).constants
    return {k: float(c.get(k)) for k in ("E1", "E2", "E3", "nu12", "nu13", "nu23")}


def history(direction: str, E: float, nus: dict[str, float], size: dict[str, float],
            rng: np.random.Generator) -> tuple[list[str], np.ndarray]:
    """Return the column names and rows (force N, displacement um, lateral um) of one case."""
    sh = SHAPES[direction]
    stress = np.linspace(0.0, sh["s_u"], POINTS)
    plastic = 0.002 * (np.clip(stress - sh["s_p"], 0.0, None) / (sh["s_y"] - sh["s_p"])) ** 2
    strain = stress / E + plastic
    # failure: the stress drops to a fifth over a few further strain steps
    step = strain[-1] - strain[-2]
    strain = np.concatenate([strain, strain[-1] + step * np.arange(1, 6)])
    stress = np.concatenate([stress, sh["s_u"] * np.linspace(0.8, 0.2, 5)])
    others = [a for a in "xyz" if a != direction]
    area = size[others[0]] * size[others[1]]
    force = stress * area
    force = force + rng.normal(0.0, NOISE * force.max(), force.size)
    force[0] = 0.0
    disp = strain * size[direction] * 1e6
    cols = [force, disp]
    names = ["force", "disp"]
    for axis in others:
        lat = -nus[axis] * strain * size[axis] * 1e6
        lat = lat + rng.normal(0.0, NOISE * np.abs(lat).max(), lat.size)
        lat[0] = 0.0
        cols.append(lat)
        names.append(f"lat_{axis}")
    return names, np.column_stack(cols)


def main(out_dir: Path = HERE) -> None:
    """Write rve_x.csv, rve_y.csv, rve_z.csv (next to this script by default)."""
    est = stack_estimate()
    rng = np.random.default_rng(SEED)
    size = {"x": 120e-6, "y": 120e-6, "z": 120e-6}  # the true cell (see crossply.toml)
    E = {"x": est["E1"] * MODULUS_FACTOR["x"], "y": est["E2"] * MODULUS_FACTOR["y"],
         "z": est["E3"] * MODULUS_FACTOR["z"]}
    nu = {("x", "y"): est["nu12"], ("x", "z"): est["nu13"], ("y", "z"): est["nu23"]}
    for (i, j), v in list(nu.items()):  # reciprocity: nu_ji = nu_ij E_j / E_i
        nu[(j, i)] = v * E[j] / E[i]
    for d in "xyz":
        names, rows = history(d, E[d], {a: nu[(d, a)] for a in "xyz" if a != d}, size, rng)
        header = (
            f"# invented example: synthesised by data/demo/generate.py from micromech's own "
            f"stack estimate (not measured, not from any publication); load case {d}; force in "
            "N, displacements in um\n"
        )
        body = "\n".join(",".join(f"{x:.6g}" for x in row) for row in rows)
        (Path(out_dir) / f"rve_{d}.csv").write_text(header + ",".join(names) + "\n" + body + "\n",
                                           encoding="utf-8")


if __name__ == "__main__":
    main()
