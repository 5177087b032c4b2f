"""Fibre arrangements for an RVE: periodic square and hexagonal cells and random periodic cells.

Every generator returns a frozen :class:`FibreArrangement`: the fibre centres in a periodic
rectangular cell ``[0, Lx) x [0, Ly)`` (metres), the cell size, the achieved fibre volume
fraction, nearest-neighbour statistics and the record needed to reproduce it (method, seed).
:meth:`FibreArrangement.to_csv` and :meth:`FibreArrangement.to_json` write the centres for a
mesher, together with the periodic images of the fibres that cut the cell faces.

Axes: the cell is made in its own cross-section plane, with the fibres along the third axis.
The writers name that plane by the fibre axis: ``fibre_axis="z"`` (default) writes the centres
as x, y; ``fibre_axis="x"`` writes them as y, z, the convention of a unidirectional
``micromech check`` cell (x = 1 the fibre axis). See :data:`FIBRE_AXES`.

The statistics and the RVE-size guidance are in :mod:`micromech.rve.cellstats`, the packing
numerics in :mod:`micromech.rve.packing` and the file writing and terminal summary in
:mod:`micromech.rve.cellio`; their public names are re-exported here.

Packing limits (``d`` fibre diameter, ``g`` minimum gap between fibre surfaces):

========== ============================================ ================================
packing    limit of the fibre volume fraction           source
========== ============================================ ================================
square     ``pi/4 (d/(d+g))^2``  (0.7854 at g = 0)      exact geometry
hexagonal  ``pi/(2 sqrt 3) (d/(d+g))^2``  (0.9069)      exact geometry
random     ``0.78 (d/(d+g))^2``  (0.7075 at g = 0.05 d) measured with this generator
random     ``0.72 (d/(d+g))^2`` for fewer than 20      measured with this generator
           fibres (0.6531 at g = 0.05 d)
========== ============================================ ================================

The random limits were measured with :func:`random_cell` (10 seeds per case, gaps 0, 0.05 d and
0.1 d): with 20 to 560 fibres every run reached an exclusion fraction ``vf ((d+g)/d)^2`` of
0.78, while 0.80 failed for some seeds and counts (13, 17, 19, 30 fibres); small square cells
frustrate the packing (7 fibres fail from 0.74, 10 and 13 fibres at 0.76 to 0.78), and 6 to 19
fibres all reached 0.72. Random close packing of equal discs is near 0.82 to 0.84 [3]_.

References
----------
.. [1] Hull D, Clyne TW (1996). An Introduction to Composite Materials, 2nd ed., Cambridge
   University Press, section 1.2: fibre fractions of square and hexagonal arrays, pi/4 and
   pi/(2 sqrt 3) at contact (from memory).
.. [2] Feder J (1980). Random sequential adsorption. J. Theor. Biol. 87:237-254; jamming
   coverage of discs about 0.547 (from memory).
.. [3] O'Hern CS, Silbert LE, Liu AJ, Nagel SR (2003). Jamming at zero temperature and zero
   applied stress: the epitome of disorder. Phys. Rev. E 68:011306 (from memory).
.. [4] Lubachevsky BD, Stillinger FH (1990). Geometric properties of random disk packings.
   J. Stat. Phys. 60:561-583 (from memory).
.. [5] Metropolis N, Rosenbluth AW, Rosenbluth MN, Teller AH, Teller E (1953). J. Chem. Phys.
   21:1087-1092; hard-disc Monte Carlo (from memory).
.. [6] Trias D, Costa J, Turon A, Hurtado JE (2006). Determination of an appropriate
   representative volume element for probabilistic micromechanics of fibre-reinforced
   polymers. Acta Materialia 54(13):3471-3484; a cell side of at least 50 fibre radii
   (delta = L/R >= 50) for statistically representative local fields (from memory).
"""

from __future__ import annotations

import json
import math
import os
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError, InputError
from micromech.rve import packing
from micromech.rve.cellio import (
    CAUTION,
    FIBRE_AXES,
    arrangement_text,
    csv_text,
    plot_arrangement,
    section_axes,
    write_atomic,
)
from micromech.rve.cellstats import (
    GUIDANCE_DELTA,
    NeighbourStats,
    RveGuidance,
    guidance_fibres,
    nearest_neighbour_stats,
    rve_size_guidance,
)
from micromech.units import parse_quantity

__all__ = [
    "SQUARE_LIMIT",
    "HEXAGONAL_LIMIT",
    "RANDOM_EFFECTIVE_LIMIT",
    "RANDOM_SMALL_CELL_LIMIT",
    "SMALL_CELL_FIBRES",
    "GUIDANCE_DELTA",
    "MAX_RANDOM_FIBRES",
    "MAX_REGULAR_FIBRES",
    "CAUTION",
    "FIBRE_AXES",
    "FibreArrangement",
    "NeighbourStats",
    "RveGuidance",
    "packing_limit",
    "square_cell",
    "hexagonal_cell",
    "random_cell",
    "nearest_neighbour_stats",
    "rve_size_guidance",
    "guidance_fibres",
    "arrangement_text",
    "plot_arrangement",
    "section_axes",
]

Array = NDArray[np.float64]
Progress = Callable[[str, int, int], None]

#: Fibre fraction of a square array at contact, pi/4 (exact geometry; Hull and Clyne 1996).
SQUARE_LIMIT: float = math.pi / 4.0
#: Fibre fraction of a hexagonal array at contact, pi/(2 sqrt 3) (exact geometry).
HEXAGONAL_LIMIT: float = math.pi / (2.0 * math.sqrt(3.0))
#: Practical limit of :func:`random_cell` on the fraction of the exclusion discs (diameter
#: d + gap), cells of 20 fibres or more: all measured runs reached 0.78, some failed at 0.80.
RANDOM_EFFECTIVE_LIMIT: float = 0.78
#: The same for cells of fewer than :data:`SMALL_CELL_FIBRES` fibres (all reached 0.72).
RANDOM_SMALL_CELL_LIMIT: float = 0.72
#: Below this many fibres a random cell uses :data:`RANDOM_SMALL_CELL_LIMIT`.
SMALL_CELL_FIBRES: int = 20

_METHODS = ("square", "hexagonal", "random")
_MIN_SIDE = 2.5  # random cells: side >= 2.5 (d + gap), so each pair meets once across the faces
#: Most fibres of a random cell: the packing time grows with the square of the count (about
#: 2 s for 1000 fibres, 14 s for 3000 on one core); a cell of 50 fibre radii holds about 480.
MAX_RANDOM_FIBRES: int = 5000
#: Most fibres of a square or hexagonal cell (memory of the centres and statistics).
MAX_REGULAR_FIBRES: int = 1_000_000


# --- results ---------------------------------------------------------------------------------


@dataclass(frozen=True, eq=False)
class FibreArrangement:
    """Fibre centres in a periodic rectangular cell, with how they were made.

    Attributes
    ----------
    centres : ndarray, shape (N, 2)
        Fibre centres, m, wrapped into ``[0, Lx) x [0, Ly)``. Read-only.
    diameter : float
        Fibre diameter, m.
    cell_size : tuple of float
        ``(Lx, Ly)``, m.
    volume_fraction : float
        Achieved fibre volume fraction, ``N pi d^2 / (4 Lx Ly)``.
    target_fraction : float
        The fraction asked for (differs from the achieved one only for a random cell of given
        size, where the number of fibres is rounded).
    min_gap : float
        Required smallest clear gap between fibre surfaces, m.
    seed : int or None
        Seed of ``numpy.random.default_rng`` (random cells); ``None`` for regular arrays.
    method : str
        ``"square"``, ``"hexagonal"`` or ``"random"``.
    stats : NeighbourStats
        Nearest-neighbour statistics.
    details : dict
        Generator record (iterations, Monte Carlo acceptance, ...).
    """

    centres: Array
    diameter: float
    cell_size: tuple[float, float]
    volume_fraction: float
    target_fraction: float
    min_gap: float
    seed: int | None
    method: str
    stats: NeighbourStats
    details: dict[str, Any] = field(default_factory=dict)

    def __post_init__(self) -> None:
        c = np.array(self.centres, dtype=np.float64).reshape(-1, 2)
        c.flags.writeable = False
        object.__setattr__(self, "centres", c)

    @property
    def radius(self) -> float:
        """Fibre radius, m."""
        return 0.5 * self.diameter

    @property
    def n_fibres(self) -> int:
        """Number of fibres in the cell (images not counted)."""
        return int(self.centres.shape[0])

    def images(self) -> tuple[Array, NDArray[np.int64]]:
        """Periodic images of the fibres that cut the cell faces.

        An image is the fibre shifted by ``(i Lx, j Ly)``, ``i, j in {-1, 0, 1}``, not both 0,
        whose disc overlaps the open cell (a disc that only touches a face is left out).

        Returns
        -------
        centres : ndarray, shape (M, 2)
            Image centres, m (outside the cell).
        fibre : ndarray of int, shape (M,)
            Index of the fibre each image copies.
        """
        lx, ly = self.cell_size
        shifts = np.array(
            [(i, j) for i in (-1, 0, 1) for j in (-1, 0, 1) if (i, j) != (0, 0)], dtype=np.float64
        ) * np.array([lx, ly])
        cand = self.centres[None, :, :] + shifts[:, None, :]  # (8, N, 2)
        ex = np.maximum(np.maximum(-cand[..., 0], cand[..., 0] - lx), 0.0)
        ey = np.maximum(np.maximum(-cand[..., 1], cand[..., 1] - ly), 0.0)
        cuts = np.hypot(ex, ey) < self.radius
        s_idx, f_idx = np.nonzero(cuts)
        order = np.lexsort((s_idx, f_idx))
        return cand[s_idx[order], f_idx[order]], f_idx[order].astype(np.int64)

    def circles(self) -> tuple[Array, NDArray[np.int64], NDArray[np.bool_]]:
        """All circles a mesher needs: the fibres, then the images that cut the faces.

        Returns
        -------
        centres : ndarray, shape (N + M, 2)
            Circle centres, m.
        fibre : ndarray of int, shape (N + M,)
            Fibre index (an image carries the index of the fibre it copies).
        image : ndarray of bool, shape (N + M,)
            True for the images.
        """
        img, parent = self.images()
        n = self.n_fibres
        centres = np.vstack([self.centres, img])
        fibre = np.concatenate([np.arange(n, dtype=np.int64), parent])
        image = np.concatenate([np.zeros(n, dtype=bool), np.ones(parent.size, dtype=bool)])
        return centres, fibre, image

    def as_dict(self, fibre_axis: str = "z") -> dict[str, Any]:
        """Return the arrangement as a JSON-ready dict, SI units (m).

        Parameters
        ----------
        fibre_axis : {"z", "x"}
            Axis the fibres run along: ``"z"`` writes the centres as ``x``, ``y``; ``"x"`` as
            ``y``, ``z`` (a unidirectional check cell). See :data:`FIBRE_AXES`.

        Returns
        -------
        dict
            Keys ``method``, ``seed``, ``fibre_axis``, ``section_axes`` (the two centre keys),
            ``diameter``, ``radius``, ``cell_size`` (the edges along the two section axes),
            ``volume_fraction``, ``target_fraction``, ``min_gap``, ``n_fibres``, ``n_images``,
            ``circles`` (list of ``{"fibre", "x", "y", "radius", "image"}``, or ``"y", "z"``
            for fibre axis x: the fibres, then the images of the fibres that cut the faces),
            ``stats`` (in diameters), ``rve_size`` (see :func:`rve_size_guidance`),
            ``details``, ``caution``.

        Raises
        ------
        InputError
            For an unknown fibre axis.
        """
        a_name, b_name = section_axes(fibre_axis)
        centres, fibre, image = self.circles()
        r = self.radius
        return {
            "method": self.method,
            "seed": self.seed,
            "fibre_axis": fibre_axis,
            "section_axes": [a_name, b_name],
            "diameter": self.diameter,
            "radius": r,
            "cell_size": [self.cell_size[0], self.cell_size[1]],
            "volume_fraction": self.volume_fraction,
            "target_fraction": self.target_fraction,
            "min_gap": self.min_gap,
            "n_fibres": self.n_fibres,
            "n_images": int(image.sum()),
            "circles": [
                {"fibre": int(f), a_name: float(c[0]), b_name: float(c[1]), "radius": r,
                 "image": bool(m)}
                for c, f, m in zip(centres, fibre, image, strict=True)
            ],
            "stats": self.stats.as_dict(),
            "rve_size": rve_size_guidance(self).as_dict(),
            "details": dict(self.details),
            "caution": CAUTION,
        }

    def to_json(self, path: str | os.PathLike[str], *, fibre_axis: str = "z") -> Path:
        """Write :meth:`as_dict` as JSON (SI units), replacing an existing file atomically.

        Parameters
        ----------
        path : str or path-like
            Output file.
        fibre_axis : {"z", "x"}
            Axis the fibres run along (see :meth:`as_dict`).

        Returns
        -------
        Path
            The path written.
        """
        text = json.dumps(self.as_dict(fibre_axis), indent=2, allow_nan=False) + "\n"
        return write_atomic(Path(path), text)

    def to_csv(
        self, path: str | os.PathLike[str], *, unit: str = "um", fibre_axis: str = "z"
    ) -> Path:
        """Write the circles as CSV for a mesher, replacing an existing file atomically.

        ``#`` lines describe the cell (axes, method, seed, size, fraction, caution); then
        columns ``fibre, x_<unit>, y_<unit>, radius_<unit>, image`` (``y_``, ``z_`` for fibre
        axis x), the fibres first, then the images of the fibres that cut the faces (see
        :func:`micromech.rve.cellio.csv_text`).

        Parameters
        ----------
        path : str or path-like
            Output file.
        unit : str
            Length unit of the coordinates (``"um"``, ``"mm"``, ``"m"``, ...).
        fibre_axis : {"z", "x"}
            Axis the fibres run along (see :data:`FIBRE_AXES`).

        Returns
        -------
        Path
            The path written.
        """
        return write_atomic(Path(path), csv_text(self, unit, fibre_axis))


# --- limits and validation ------------------------------------------------------------------


def packing_limit(
    method: str, diameter: ArrayLike, min_gap: ArrayLike = 0.0, n_fibres: int | None = None
) -> Array:
    """Largest fibre fraction a packing method reaches with a minimum gap.

    Parameters
    ----------
    method : str
        ``"square"``, ``"hexagonal"`` or ``"random"``.
    diameter : array_like, shape (...)
        Fibre diameter, m.
    min_gap : array_like, shape (...)
        Smallest clear gap between fibre surfaces, m.
    n_fibres : int, optional
        Random cells: the number of fibres (fewer than 20 lowers the limit); ``None`` for a
        large cell.

    Returns
    -------
    ndarray, shape (...)
        ``limit0 (d / (d + g))^2`` with ``limit0`` = pi/4 (square), pi/(2 sqrt 3) (hexagonal),
        :data:`RANDOM_EFFECTIVE_LIMIT` (random, 0.78) or :data:`RANDOM_SMALL_CELL_LIMIT`
        (random, fewer than 20 fibres, 0.72).

    References
    ----------
    Hull and Clyne (1996), section 1.2 (from memory); the random limit is measured here.
    """
    if method not in _METHODS:
        raise InputError(f"method: {method!r} is not one of {list(_METHODS)}")
    d = np.asarray(diameter, dtype=np.float64)
    g = np.asarray(min_gap, dtype=np.float64)
    return np.asarray(_base_limit(method, n_fibres)[0] * (d / (d + g)) ** 2, dtype=np.float64)


def _base_limit(method: str, n_fibres: int | None) -> tuple[float, str]:
    if method == "square":
        return SQUARE_LIMIT, "pi/4"
    if method == "hexagonal":
        return HEXAGONAL_LIMIT, "pi/(2 sqrt 3)"
    if n_fibres is not None and n_fibres < SMALL_CELL_FIBRES:
        return RANDOM_SMALL_CELL_LIMIT, (f"{RANDOM_SMALL_CELL_LIMIT:g} (practical, fewer than "
                                         f"{SMALL_CELL_FIBRES} fibres)")
    return RANDOM_EFFECTIVE_LIMIT, f"{RANDOM_EFFECTIVE_LIMIT:g} (practical)"


def _length(value: Any, field_name: str, *, allow_zero: bool) -> float:
    x = parse_quantity(value, "length", field_name)
    if not math.isfinite(x) or x < 0.0 or (x == 0.0 and not allow_zero):
        rule = "must be >= 0" if allow_zero else "must be > 0"
        raise InputError(f"{field_name} = {value!r} {rule} (a finite length)")
    return x


def _fraction(vf: Any, method: str, diameter: float, min_gap: float) -> float:
    if isinstance(vf, bool) or np.ndim(vf) != 0:
        raise FractionError(f"volume_fraction = {vf!r} must be a single number")
    try:
        v = float(vf)
    except (TypeError, ValueError):
        raise FractionError(f"volume_fraction = {vf!r} must be a number") from None
    if not math.isfinite(v) or v <= 0.0:
        raise FractionError(f"volume_fraction = {vf!r} must be > 0 and finite")
    _check_limit(v, method, diameter, min_gap)
    return v


def _check_limit(
    v: float, method: str, diameter: float, min_gap: float, n_fibres: int | None = None
) -> None:
    limit = float(packing_limit(method, diameter, min_gap, n_fibres))
    if v > limit * (1.0 + 1e-12):
        raise FractionError(
            f"volume_fraction = {v:.6g} is above the {method} packing limit {limit:.4f} "
            f"= {_base_limit(method, n_fibres)[1]} x (d/(d+gap))^2 for gap = "
            f"{min_gap / diameter:.4g} d"
        )


def _regular_inputs(
    method: str, vf: Any, diameter: Any, n_per_side: Any, min_gap: Any
) -> tuple[float, float, float, int]:
    """Diameter, gap, fraction and repeats of a square or hexagonal cell, all checked."""
    d = _length(diameter, "diameter", allow_zero=False)
    g = _length(min_gap, "min_gap", allow_zero=True)
    v = _fraction(vf, method, d, g)
    n = _count(n_per_side, "n_per_side")
    total = (1 if method == "square" else 2) * n * n
    if total > MAX_REGULAR_FIBRES:
        raise InputError(
            f"n_per_side = {n}: a {method} cell of {total} fibres exceeds the limit of "
            f"{MAX_REGULAR_FIBRES}; the periodic cell needs only one repeat"
        )
    return d, g, v, n


def _count(value: Any, field_name: str) -> int:
    if isinstance(value, bool) or not isinstance(value, int | np.integer) or value < 1:
        raise InputError(f"{field_name} = {value!r} must be a whole number >= 1")
    return int(value)


# --- regular arrays -------------------------------------------------------------------------


def square_cell(
    vf: float, diameter: float | str, *, n_per_side: int = 1, min_gap: float | str = 0.0
) -> FibreArrangement:
    """Periodic cell of a square fibre array at a given fraction.

    The cell is square, side ``L = n s`` with centre spacing ``s = d sqrt(pi / (4 vf))``; the
    centres are ``((i + 1/2) s, (j + 1/2) s)``, so with one fibre per side it sits whole in the
    middle of the cell.

    Parameters
    ----------
    vf : float
        Fibre volume fraction, ``0 < vf <= pi/4 (d/(d+g))^2``.
    diameter : float or str
        Fibre diameter, m (or a string such as ``"7 um"``).
    n_per_side : int
        Fibres along each side (``n_per_side**2`` fibres).
    min_gap : float or str
        Smallest clear gap between fibres that must remain, m.

    Returns
    -------
    FibreArrangement
        ``method = "square"``; the achieved fraction equals ``vf``.

    Raises
    ------
    FractionError
        If ``vf <= 0`` or above the square limit with the gap.
    InputError
        If the diameter is not positive, the gap negative, ``n_per_side < 1`` or the cell would
        hold more than :data:`MAX_REGULAR_FIBRES` fibres.

    References
    ----------
    Hull and Clyne (1996), section 1.2: ``vf = (pi/4)(d/s)^2`` (from memory).

    Examples
    --------
    >>> a = square_cell(0.5, 7e-6)
    >>> round(a.volume_fraction, 12), a.n_fibres
    (0.5, 1)
    """
    d, g, v, n = _regular_inputs("square", vf, diameter, n_per_side, min_gap)
    s = d * math.sqrt(math.pi / (4.0 * v))
    k = (np.arange(n, dtype=np.float64) + 0.5) * s
    xx, yy = np.meshgrid(k, k, indexing="ij")
    centres = np.column_stack([xx.ravel(), yy.ravel()])
    return _arrangement(centres, d, (n * s, n * s), v, g, None, "square", {"spacing": s})


def hexagonal_cell(
    vf: float, diameter: float | str, *, n_per_side: int = 1, min_gap: float | str = 0.0
) -> FibreArrangement:
    """Periodic rectangular cell of a hexagonal fibre array at a given fraction.

    The repeating rectangle has sides ``s`` and ``s sqrt 3`` and holds two fibres: one at the
    corner (four quarter discs, so its images cut the faces) and one in the middle. The centre
    spacing is ``s = d sqrt(pi / (2 sqrt 3 vf))``.

    Parameters
    ----------
    vf : float
        Fibre volume fraction, ``0 < vf <= pi/(2 sqrt 3) (d/(d+g))^2``.
    diameter : float or str
        Fibre diameter, m.
    n_per_side : int
        Repeats of the rectangle in each direction (``2 n_per_side**2`` fibres).
    min_gap : float or str
        Smallest clear gap between fibres that must remain, m.

    Returns
    -------
    FibreArrangement
        ``method = "hexagonal"``; the achieved fraction equals ``vf``.

    Raises
    ------
    FractionError
        If ``vf <= 0`` or above the hexagonal limit with the gap.
    InputError
        If the diameter is not positive, the gap negative, ``n_per_side < 1`` or the cell would
        hold more than :data:`MAX_REGULAR_FIBRES` fibres.

    References
    ----------
    Hull and Clyne (1996), section 1.2: ``vf = (pi/(2 sqrt 3))(d/s)^2`` (from memory).

    Examples
    --------
    >>> a = hexagonal_cell(0.6, 7e-6)
    >>> round(a.volume_fraction, 12), a.n_fibres
    (0.6, 2)
    """
    d, g, v, n = _regular_inputs("hexagonal", vf, diameter, n_per_side, min_gap)
    s = d * math.sqrt(math.pi / (2.0 * math.sqrt(3.0) * v))
    h = s * math.sqrt(3.0)
    base = np.array([[0.0, 0.0], [0.5 * s, 0.5 * h]])
    i, j = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")
    offsets = np.column_stack([i.ravel() * s, j.ravel() * h])
    centres = (offsets[:, None, :] + base[None, :, :]).reshape(-1, 2)
    return _arrangement(centres, d, (n * s, n * h), v, g, None, "hexagonal", {"spacing": s})


def _arrangement(
    centres: Array,
    d: float,
    cell: tuple[float, float],
    target: float,
    g: float,
    seed: int | None,
    method: str,
    details: dict[str, Any],
) -> FibreArrangement:
    c = packing.wrap(centres, np.array(cell))
    achieved = c.shape[0] * math.pi * d * d / (4.0 * cell[0] * cell[1])
    stats = nearest_neighbour_stats(c, cell, d)
    return FibreArrangement(
        centres=c,
        diameter=d,
        cell_size=(float(cell[0]), float(cell[1])),
        volume_fraction=float(achieved),
        target_fraction=float(target),
        min_gap=g,
        seed=seed,
        method=method,
        stats=stats,
        details=details,
    )


# --- random arrangement ---------------------------------------------------------------------


def random_cell(
    vf: float,
    diameter: float | str,
    *,
    n_fibres: int | None = None,
    cell_size: float | str | tuple[float | str, float | str] | None = None,
    min_gap: float | str | None = None,
    seed: int | None = None,
    max_iterations: int = 5000,
    shake_sweeps: int = 200,
    progress: Progress | None = None,
) -> FibreArrangement:
    """Random periodic fibre arrangement with a minimum gap, reproducible from a seed.

    Three steps, all with periodic minimum-image distances, in units of the exclusion diameter
    ``D = d + gap``:

    1. Random sequential adsorption [2]_ of discs of a reduced diameter (exclusion fraction
       0.40, well below the jamming coverage 0.547), so the start is random and loose.
    2. Growth to full size by minimising the overlap energy ``sum max(0, D' - r_ij)^2 / 2`` with
       ``D' = 1.001 D`` (L-BFGS-B, neighbour pairs from a periodic k-d tree), as in soft-disc
       jamming studies [3]_; where it stalls the centres are jittered and the minimisation
       resumes. This plays the part of Lubachevsky-Stillinger growth [4]_ and reaches
       exclusion fractions well above the adsorption jamming limit.
    3. Shaking: ``shake_sweeps`` sweeps of hard-disc Monte Carlo moves [5]_ (each fibre proposes
       a Gaussian step; a move is kept where it clears every other fibre's old and new place,
       so all gaps stay >= ``min_gap``), which removes the crowd of exact contacts that step 2
       leaves and randomises the gaps.

    Cell size: with ``n_fibres`` the square cell side is chosen so the fraction is exact; with
    ``cell_size`` the number of fibres is rounded (the achieved fraction is reported); with
    neither, the cell side is 50 fibre radii (Trias et al. 2006 [6]_, from memory) and the
    number of fibres is rounded up (:func:`~micromech.rve.cellstats.guidance_fibres`), the side
    then set for the exact fraction.

    Parameters
    ----------
    vf : float
        Fibre volume fraction, ``0 < vf <= 0.78 (d/(d+g))^2`` (0.7075 with a 5 % gap); with
        fewer than 20 fibres ``0.72 (d/(d+g))^2`` (0.6531).
    diameter : float or str
        Fibre diameter, m.
    n_fibres : int, optional
        Number of fibres (square cell).
    cell_size : float or str or (Lx, Ly), optional
        Cell side(s), m. Not together with ``n_fibres``.
    min_gap : float or str, optional
        Smallest clear gap between fibre surfaces, m; default ``0.05 * diameter``.
    seed : int, optional
        Seed of ``numpy.random.default_rng``; when ``None`` one is drawn and recorded.
    max_iterations : int
        Budget of minimiser iterations for step 2.
    shake_sweeps : int
        Monte Carlo sweeps of step 3 (0 to skip).
    progress : callable, optional
        Called as ``progress(stage, done, total)`` with stage ``"adsorption"``,
        ``"relaxation"`` or ``"shaking"``.

    Returns
    -------
    FibreArrangement
        ``method = "random"``. Every periodic centre distance is at least ``d + min_gap``.

    Raises
    ------
    FractionError
        If ``vf <= 0``, above the practical limit, or not reached within ``max_iterations``.
    InputError
        If the diameter is not positive, the gap negative, counts not whole numbers >= 1, both
        ``n_fibres`` and ``cell_size`` are given, the cell is smaller than 2.5 (d + gap), or it
        would hold more than :data:`MAX_RANDOM_FIBRES` fibres.

    References
    ----------
    See the module references [2]_ to [6]_.

    Examples
    --------
    >>> a = random_cell(0.6, 7e-6, n_fibres=30, seed=1)
    >>> a.n_fibres, round(a.volume_fraction, 12), a.stats.gap_min >= 0.05
    (30, 0.6, True)
    """
    d = _length(diameter, "diameter", allow_zero=False)
    g = 0.05 * d if min_gap is None else _length(min_gap, "min_gap", allow_zero=True)
    v = _fraction(vf, "random", d, g)
    iters = _count(max_iterations, "max_iterations")
    sweeps = 0 if shake_sweeps == 0 else _count(shake_sweeps, "shake_sweeps")
    if seed is None:
        seed = int(np.random.SeedSequence().generate_state(1)[0])
    if isinstance(seed, bool) or not isinstance(seed, int | np.integer) or seed < 0:
        raise InputError(f"seed = {seed!r} must be a whole number >= 0")
    seed = int(seed)
    n, lx, ly = _random_size(v, d, g, n_fibres, cell_size)
    if n > MAX_RANDOM_FIBRES:
        what = (f"n_fibres = {n}" if n_fibres is not None
                else f"cell_size = {cell_size!r} gives {n} fibres at this fraction" if cell_size
                is not None else f"{n} fibres")
        raise InputError(
            f"{what}: a random cell holds at most "
            f"{MAX_RANDOM_FIBRES} fibres, as the packing time grows with the square of the count;"
            " a cell of 50 fibre radii (the size guidance) needs "
            f"{int(guidance_fibres(v))}"
        )
    achieved = n * math.pi * d * d / (4.0 * lx * ly)
    _check_limit(achieved, "random", d, g, n)
    big_d = d + g
    if min(lx, ly) < _MIN_SIDE * big_d:
        raise InputError(
            f"cell_size: side {min(lx, ly):.4g} m is below 2.5 (d + gap) = {_MIN_SIDE * big_d:.4g}"
            " m, needed so each pair of fibres meets once across the periodic faces; use more "
            "fibres or a larger cell"
        )
    rng = np.random.default_rng(seed)
    box = np.array([lx, ly]) / big_d
    loose = min(1.0, math.sqrt(0.40 * box[0] * box[1] / (n * math.pi / 4.0)))
    p = packing.adsorb(n, box, loose, rng, progress)
    p, used = packing.relax(p, box, rng, iters, progress)
    if not packing.is_feasible(p, box):
        raise FractionError(
            f"volume_fraction = {achieved:.4f}: random_cell did not clear all gaps of "
            f"{g / d:.3g} d within max_iterations = {iters} (practical limit "
            f"{float(packing_limit('random', d, g, n)):.4f}); raise max_iterations, try another "
            "seed or lower the fraction"
        )
    p, acceptance = packing.shake(p, box, rng, sweeps, progress)
    details = {"iterations": used, "shake_sweeps": sweeps, "shake_acceptance": acceptance}
    return _arrangement(p * big_d, d, (lx, ly), v, g, seed, "random", details)


def _random_size(
    v: float, d: float, g: float, n_fibres: Any, cell_size: Any
) -> tuple[int, float, float]:
    area = math.pi * d * d / 4.0
    if n_fibres is not None and cell_size is not None:
        raise InputError("n_fibres and cell_size: give one of them, not both")
    if cell_size is not None:
        sides = cell_size if isinstance(cell_size, tuple | list) else (cell_size, cell_size)
        if len(sides) != 2:
            raise InputError(f"cell_size = {cell_size!r} must be one length or two (Lx, Ly)")
        lx = _length(sides[0], "cell_size", allow_zero=False)
        ly = _length(sides[1], "cell_size", allow_zero=False)
        return max(1, round(v * lx * ly / area)), lx, ly
    n = int(guidance_fibres(v)) if n_fibres is None else _count(n_fibres, "n_fibres")
    side = math.sqrt(n * area / v)
    return n, side, side
