"""Measures of a fibre cell: nearest-neighbour statistics and the statistical RVE-size guidance.

:func:`nearest_neighbour_stats` measures the centre distances and clear gaps of a periodic
arrangement; :func:`rve_size_guidance` grades the cell side of a
:class:`~micromech.rve.geometry.FibreArrangement` against the published guidance on the size of
a statistically representative random cell, ``L/R >= 50`` [1]_, and :func:`guidance_fibres`
gives the fewest fibres of a square random cell that meets it. The cell generators live in
:mod:`micromech.rve.geometry`, which re-exports every name here.

References
----------
.. [1] Trias D, Costa J, Turon A, Hurtado JE (2006). Determination of an appropriate
   representative volume element for probabilistic micromechanics of fibre-reinforced
   polymers. Acta Materialia 54(13):3471-3484; a cell side of at least 50 fibre radii
   (delta = L/R >= 50) for statistically representative local fields (from memory).
.. [2] Kanit T, Forest S, Galliet I, Mounoury V, Jeulin D (2003). Determination of the size of
   the representative volume element for random composites: statistical and numerical
   approach. Int. J. Solids Struct. 40(13-14):3647-3679 (from memory).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError, InputError
from micromech.rve.packing import wrap
from micromech.units import parse_quantity

if TYPE_CHECKING:  # pragma: no cover
    from micromech.rve.geometry import FibreArrangement

__all__ = [
    "GUIDANCE_DELTA",
    "NeighbourStats",
    "RveGuidance",
    "nearest_neighbour_stats",
    "guidance_fibres",
    "rve_size_guidance",
]

Array = NDArray[np.float64]

#: Cell side in fibre radii for statistically representative fields (Trias et al. 2006,
#: from memory).
GUIDANCE_DELTA: float = 50.0
#: Relative slack of the size verdict, so a cell sized for exactly 50 R by the rounding of
#: :func:`guidance_fibres` is not graded small by a last-digit rounding error.
_DELTA_RTOL = 1e-12


# --- results ---------------------------------------------------------------------------------


@dataclass(frozen=True, eq=False)
class NeighbourStats:
    """Nearest-neighbour statistics of a periodic fibre arrangement.

    Attributes
    ----------
    n_fibres : int
        Number of fibres in the cell.
    distance_mean, distance_min, distance_max, distance_std : float
        Centre distance from each fibre to its nearest neighbour (periodic images included), in
        fibre diameters.
    gap_mean, gap_min, gap_std : float
        The same less one diameter: the clear gap between fibre surfaces, in fibre diameters.
    distances : ndarray, shape (N,)
        Nearest-neighbour centre distance of each fibre, m.
    """

    n_fibres: int
    distance_mean: float
    distance_min: float
    distance_max: float
    distance_std: float
    gap_mean: float
    gap_min: float
    gap_std: float
    distances: Array

    def as_dict(self) -> dict[str, Any]:
        """Return the statistics as a JSON-ready dict (distances and gaps in diameters)."""
        return {
            "n_fibres": self.n_fibres,
            "distance_mean": self.distance_mean,
            "distance_min": self.distance_min,
            "distance_max": self.distance_max,
            "distance_std": self.distance_std,
            "gap_mean": self.gap_mean,
            "gap_min": self.gap_min,
            "gap_std": self.gap_std,
            "unit": "fibre diameters",
        }


@dataclass(frozen=True)
class RveGuidance:
    """Cell size of an arrangement against published guidance on statistical RVE size.

    Attributes
    ----------
    delta : float
        Smaller cell side over the fibre radius, L/R.
    required_delta : float
        The guidance, L/R >= 50 (Trias et al. 2006, from memory).
    verdict : str
        ``"adequate"``, ``"small"``, or ``"not_applicable"`` for periodic square and hexagonal
        arrays (their unit cell is exact for the idealised array).
    fibres_for_guidance : int
        Fewest fibres of a square random cell of side >= 50 R at the larger of the target and
        the achieved fraction (:func:`guidance_fibres`): a cell made with this count at either
        fraction meets the guidance.
    message : str
        One plain sentence for a table.
    references : tuple of str
        The sources.
    """

    delta: float
    required_delta: float
    verdict: str
    fibres_for_guidance: int
    message: str
    references: tuple[str, ...]

    def as_dict(self) -> dict[str, Any]:
        """Return the guidance as a JSON-ready dict."""
        return {
            "delta": self.delta,
            "required_delta": self.required_delta,
            "verdict": self.verdict,
            "fibres_for_guidance": self.fibres_for_guidance,
            "message": self.message,
            "references": list(self.references),
        }


# --- statistics ------------------------------------------------------------------------------


def nearest_neighbour_stats(
    centres: ArrayLike, cell_size: tuple[float, float], diameter: float
) -> NeighbourStats:
    """Nearest-neighbour centre distances and gaps of a periodic arrangement.

    The nearest neighbour of a fibre is the closest other fibre or periodic image, its own
    images included (minimum-image convention in a rectangular cell).

    Parameters
    ----------
    centres : array_like, shape (N, 2)
        Fibre centres, m, inside ``[0, Lx) x [0, Ly)``.
    cell_size : (float, float)
        ``(Lx, Ly)``, m.
    diameter : float
        Fibre diameter, m.

    Returns
    -------
    NeighbourStats
        Mean, min, max and standard deviation of the distances, and of the gaps (distance less
        one diameter), in diameters.

    Raises
    ------
    InputError
        If the centres are not an (N, 2) array with N >= 1, the cell sides not two positive
        lengths, or the diameter not a positive finite length.
    """
    from scipy.spatial import cKDTree

    c = np.asarray(centres, dtype=np.float64)
    if c.ndim != 2 or c.shape[1] != 2 or c.shape[0] < 1:
        raise InputError(f"centres: shape {c.shape} must be (N, 2) with N >= 1")
    box = np.asarray(cell_size, dtype=np.float64)
    if box.shape != (2,) or not np.all(box > 0.0):
        raise InputError(f"cell_size = {cell_size!r} must be two positive lengths")
    d = parse_quantity(diameter, "length", "diameter")
    if not (math.isfinite(d) and d > 0.0):
        raise InputError(f"diameter = {diameter!r} must be > 0 (a finite length)")
    c = wrap(c, box)
    own = float(box.min())
    if c.shape[0] == 1:
        nn = np.array([own])
    else:
        dist, _ = cKDTree(c, boxsize=box).query(c, k=2)
        nn = np.minimum(dist[:, 1], own)
    x = nn / d
    return NeighbourStats(
        n_fibres=int(c.shape[0]),
        distance_mean=float(x.mean()),
        distance_min=float(x.min()),
        distance_max=float(x.max()),
        distance_std=float(x.std()),
        gap_mean=float(x.mean() - 1.0),
        gap_min=float(x.min() - 1.0),
        gap_std=float(x.std()),
        distances=nn,
    )


# --- size guidance ---------------------------------------------------------------------------


def guidance_fibres(vf: ArrayLike) -> NDArray[np.int64]:
    """Fewest fibres of a square random cell whose side meets the guidance ``L/R >= 50``.

    A square cell of ``n`` fibres of radius ``R`` at fraction ``vf`` has side
    ``L = R sqrt(n pi / vf)``, so ``L/R >= 50`` needs ``n >= 50^2 vf / pi``; the count is that
    rounded up. :func:`micromech.rve.geometry.random_cell` without a size uses this count.

    Parameters
    ----------
    vf : array_like, shape (...)
        Fibre volume fraction, ``0 < vf <= 1``.

    Returns
    -------
    ndarray of int, shape (...)
        ``ceil(50^2 vf / pi)``.

    Raises
    ------
    FractionError
        If a fraction is not a number, not finite, ``<= 0`` or above 1.

    References
    ----------
    Trias D, Costa J, Turon A, Hurtado JE (2006), Acta Materialia 54:3471-3484 (from memory).

    Examples
    --------
    >>> int(guidance_fibres(0.55))
    438
    """
    try:
        v = np.asarray(vf, dtype=np.float64)
    except (TypeError, ValueError):
        raise FractionError(f"volume_fraction = {vf!r} must be a number") from None
    bad = ~(np.isfinite(v) & (v > 0.0) & (v <= 1.0))
    if np.any(bad):
        raise FractionError(
            f"volume_fraction = {float(v[bad].ravel()[0])!r} must be > 0 and <= 1 (finite)"
        )
    return np.asarray(np.ceil(v * GUIDANCE_DELTA**2 / math.pi), dtype=np.int64)


def rve_size_guidance(arrangement: FibreArrangement) -> RveGuidance:
    """Compare the cell size with the published guidance on statistical RVE size.

    For a random arrangement the smaller cell side in fibre radii, ``delta = L/R``, is compared
    with ``delta >= 50`` (Trias et al. 2006, from memory), the size they found for
    statistically representative stress and strain fields; smaller cells can still give mean
    properties when several realisations (seeds) are averaged (Kanit et al. 2003). A periodic
    square or hexagonal cell is exact for its idealised array, so the guidance does not apply.

    Parameters
    ----------
    arrangement : FibreArrangement
        The cell to judge.

    Returns
    -------
    RveGuidance
        ``delta``, the verdict, the fibre count of a cell that meets the guidance (at the larger
        of the target and achieved fractions, so a cell made with it at the target fraction is
        graded adequate) and a message.

    References
    ----------
    Trias D, Costa J, Turon A, Hurtado JE (2006), Acta Materialia 54:3471-3484 (from memory);
    Kanit T, Forest S, Galliet I, Mounoury V, Jeulin D (2003), Int. J. Solids Struct.
    40:3647-3679 (from memory).
    """
    delta = min(arrangement.cell_size) / arrangement.radius
    vf = max(arrangement.target_fraction, arrangement.volume_fraction)
    n50 = int(guidance_fibres(vf))
    refs = (
        "Trias D, Costa J, Turon A, Hurtado JE (2006) Acta Materialia 54:3471-3484: "
        "L/R >= 50 (from memory)",
        "Kanit T, Forest S, Galliet I, Mounoury V, Jeulin D (2003) Int. J. Solids Struct. "
        "40:3647-3679: RVE size depends on property, contrast and accepted error (from memory)",
    )
    if arrangement.method != "random":
        verdict = "not_applicable"
        msg = (f"L/R = {delta:.3g}: a periodic {arrangement.method} cell is exact for the "
               "idealised array; the statistical size guidance applies to random arrangements")
    elif delta >= GUIDANCE_DELTA * (1.0 - _DELTA_RTOL):
        verdict = "adequate"
        msg = f"L/R = {delta:.3g} >= {GUIDANCE_DELTA:g}: meets the size guidance (Trias 2006)"
    else:
        verdict = "small"
        msg = (f"L/R = {delta:.3g} < {GUIDANCE_DELTA:g} (Trias 2006): use about {n50} fibres, "
               "or average several seeds for mean properties (Kanit 2003)")
    return RveGuidance(delta, GUIDANCE_DELTA, verdict, n50, msg, refs)
