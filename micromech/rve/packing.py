"""Periodic packing of equal discs: the numerics behind :func:`micromech.rve.geometry.random_cell`.

Everything here is dimensionless: lengths are in units of the exclusion diameter ``D = d + gap``
(fibre diameter plus the required gap), the cell is ``[0, Lx) x [0, Ly)`` with periodic faces and
distances follow the minimum-image convention, so the cell sides must exceed ``2 D``.

References
----------
.. [1] Feder J (1980). Random sequential adsorption. J. Theor. Biol. 87:237-254 (from memory).
.. [2] O'Hern CS, Silbert LE, Liu AJ, Nagel SR (2003). Jamming at zero temperature and zero
   applied stress: the epitome of disorder. Phys. Rev. E 68:011306; harmonic overlap energy of
   soft discs, eq. (1) (from memory).
.. [3] Byrd RH, Lu P, Nocedal J, Zhu C (1995). A limited memory algorithm for bound constrained
   optimization. SIAM J. Sci. Comput. 16:1190-1208 (L-BFGS-B, through scipy).
.. [4] Metropolis N, Rosenbluth AW, Rosenbluth MN, Teller AH, Teller E (1953). Equation of state
   calculations by fast computing machines. J. Chem. Phys. 21:1087-1092; hard-disc Monte Carlo
   (from memory).
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np
from numpy.typing import NDArray

__all__ = ["FEASIBLE", "TARGET", "wrap", "min_image", "adsorb", "overlap_energy", "is_feasible",
           "relax", "shake"]

Array = NDArray[np.float64]
Progress = Callable[[str, int, int], None]

#: Smallest accepted centre distance (units of D): a hair above 1 against rounding.
FEASIBLE: float = 1.0 + 1e-9
#: Contact distance the relaxation aims at (units of D), a little beyond the gap.
TARGET: float = 1.0 + 1e-3


def wrap(p: Array, box: Array) -> Array:
    """Wrap points into ``[0, Lx) x [0, Ly)``.

    Parameters
    ----------
    p : ndarray, shape (N, 2)
        Points.
    box : ndarray, shape (2,)
        Cell sides.

    Returns
    -------
    ndarray, shape (N, 2)
        The points moved into the cell by whole cell sides.
    """
    q = np.mod(p, box)
    return np.where(q >= box, 0.0, q)


def min_image(v: Array, box: Array) -> Array:
    """Shortest periodic copy of difference vectors (minimum-image convention).

    Parameters
    ----------
    v : ndarray, shape (..., 2)
        Difference vectors.
    box : ndarray, shape (2,)
        Cell sides.

    Returns
    -------
    ndarray, shape (..., 2)
        Each component reduced to ``[-L/2, L/2]``.
    """
    return v - box * np.round(v / box)


def adsorb(n: int, box: Array, diam: float, rng: np.random.Generator,
           progress: Progress | None = None) -> Array:
    """Random sequential adsorption of ``n`` discs of diameter ``diam`` [1]_.

    Each disc tries up to 200 batches of 64 random places and takes the first one that clears
    every placed disc; where none does (near jamming) it takes the roomiest place tried and
    leaves the overlap to :func:`relax`.

    Parameters
    ----------
    n : int
        Number of discs.
    box : ndarray, shape (2,)
        Cell sides.
    diam : float
        Disc diameter used for the placement.
    rng : numpy.random.Generator
        Random source.
    progress : callable, optional
        ``progress("adsorption", placed, n)``.

    Returns
    -------
    ndarray, shape (n, 2)
        Centres inside the cell.
    """
    p = np.empty((n, 2))
    for k in range(n):
        best, best_r = rng.random(2) * box, -1.0
        for _ in range(200 if k else 0):
            cand = rng.random((64, 2)) * box
            v = min_image(cand[:, None, :] - p[None, :k, :], box)
            r = np.sqrt(np.min(np.einsum("abk,abk->ab", v, v), axis=1))
            i = int(np.argmax(r >= diam)) if np.any(r >= diam) else int(np.argmax(r))
            if r[i] > best_r:
                best, best_r = cand[i], float(r[i])
            if best_r >= diam:
                break
        p[k] = best
        if progress is not None:
            progress("adsorption", k + 1, n)
    return p


def overlap_energy(flat: Array, box: Array, target: float) -> tuple[float, Array]:
    """Harmonic overlap energy ``sum_(i<j) max(0, target - r_ij)^2 / 2`` and its gradient [2]_.

    Parameters
    ----------
    flat : ndarray, shape (2 N,)
        Centres, flattened (any periodic copy).
    box : ndarray, shape (2,)
        Cell sides.
    target : float
        Contact distance.

    Returns
    -------
    energy : float
        The overlap energy.
    gradient : ndarray, shape (2 N,)
        Its gradient with respect to ``flat``.
    """
    from scipy.spatial import cKDTree

    p = wrap(flat.reshape(-1, 2), box)
    pairs = cKDTree(p, boxsize=box).query_pairs(target, output_type="ndarray")
    if pairs.size == 0:
        return 0.0, np.zeros_like(flat)
    i, j = pairs[:, 0], pairs[:, 1]
    v = min_image(p[i] - p[j], box)
    r = np.hypot(v[:, 0], v[:, 1])
    over = np.maximum(target - r, 0.0)
    w = over / np.maximum(r, 1e-300)
    n = p.shape[0]
    grad = np.empty_like(p)
    for k in range(2):
        f = w * v[:, k]
        grad[:, k] = np.bincount(j, f, minlength=n) - np.bincount(i, f, minlength=n)
    return float(0.5 * np.dot(over, over)), grad.ravel()


def is_feasible(p: Array, box: Array) -> bool:
    """Whether every periodic centre distance is at least :data:`FEASIBLE`.

    Parameters
    ----------
    p : ndarray, shape (N, 2)
        Centres inside the cell.
    box : ndarray, shape (2,)
        Cell sides (each above 2).

    Returns
    -------
    bool
        True when no pair of discs comes closer than one exclusion diameter.
    """
    from scipy.spatial import cKDTree

    pairs = cKDTree(p, boxsize=box).query_pairs(FEASIBLE, output_type="ndarray")
    if pairs.size == 0:
        return True
    v = min_image(p[pairs[:, 0]] - p[pairs[:, 1]], box)
    return bool(np.all(np.hypot(v[:, 0], v[:, 1]) >= FEASIBLE))


def relax(p: Array, box: Array, rng: np.random.Generator, budget: int,
          progress: Progress | None = None) -> tuple[Array, int]:
    """Grow the discs to full size by minimising :func:`overlap_energy` with L-BFGS-B [2]_ [3]_.

    The target contact distance is :data:`TARGET`. Where the minimiser stalls at a jammed state
    with overlaps left, the centres are jittered (standard deviation 0.02) and the minimisation
    resumes, until the discs clear each other or the iteration budget is spent.

    Parameters
    ----------
    p : ndarray, shape (N, 2)
        Start centres.
    box : ndarray, shape (2,)
        Cell sides.
    rng : numpy.random.Generator
        Random source for the jitter.
    budget : int
        Largest total number of minimiser iterations.
    progress : callable, optional
        ``progress("relaxation", iterations, budget)`` after each minimisation.

    Returns
    -------
    centres : ndarray, shape (N, 2)
        Final centres (check with :func:`is_feasible`).
    iterations : int
        Minimiser iterations used.
    """
    from scipy.optimize import minimize

    used = 0
    while True:
        res = minimize(
            overlap_energy, p.ravel(), args=(box, TARGET), jac=True, method="L-BFGS-B",
            options={"maxiter": budget - used, "maxfun": 4 * (budget - used) + 10, "ftol": 0.0,
                     "gtol": 1e-12, "maxcor": 20},
        )
        used += max(int(res.nit), 1)
        p = wrap(res.x.reshape(-1, 2), box)
        if progress is not None:
            progress("relaxation", min(used, budget), budget)
        if used >= budget or is_feasible(p, box):
            return p, used
        p = wrap(p + rng.normal(scale=0.02, size=p.shape), box)


def shake(p: Array, box: Array, rng: np.random.Generator, sweeps: int,
          progress: Progress | None = None) -> tuple[Array, float]:
    """Hard-disc Monte Carlo sweeps that keep every centre distance >= :data:`FEASIBLE` [4]_.

    In a sweep every disc proposes a Gaussian step at once; a disc moves where its new place
    clears the old and the new places of every other disc, so any mix of moves stays feasible.
    The step adapts towards an acceptance of about 0.4.

    Parameters
    ----------
    p : ndarray, shape (N, 2)
        Feasible centres.
    box : ndarray, shape (2,)
        Cell sides.
    rng : numpy.random.Generator
        Random source.
    sweeps : int
        Number of sweeps (0 returns ``p``).
    progress : callable, optional
        ``progress("shaking", sweep, sweeps)``.

    Returns
    -------
    centres : ndarray, shape (N, 2)
        Shaken centres, still feasible.
    acceptance : float
        Mean share of accepted moves.
    """
    from scipy.spatial import cKDTree

    n = p.shape[0]
    step, accepted = 0.05, 0.0
    for s in range(sweeps):
        new = wrap(p + rng.normal(scale=step, size=p.shape), box)
        both = np.vstack([p, new])
        pairs = cKDTree(both, boxsize=box).query_pairs(FEASIBLE, output_type="ndarray")
        a, b = pairs[:, 0], pairs[:, 1]
        va = min_image(both[a] - both[b], box)
        close = np.hypot(va[:, 0], va[:, 1]) < FEASIBLE
        a, b = a[close], b[close]
        distinct = (a % n) != (b % n)
        a, b = a[distinct], b[distinct]
        blocked = np.zeros(n, dtype=bool)
        blocked[a[a >= n] - n] = True
        blocked[b[b >= n] - n] = True
        ok = ~blocked
        p = np.where(ok[:, None], new, p)
        rate = float(ok.mean())
        accepted += rate
        step = float(np.clip(step * (1.1 if rate > 0.4 else 0.9), 1e-6, 0.5))
        if progress is not None:
            progress("shaking", s + 1, sweeps)
    return p, accepted / sweeps if sweeps else 0.0
