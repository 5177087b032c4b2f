"""Roots of a vectorised forward model on a fraction range, and sets of fractions meeting a target.

The forward model is any callable ``f(vf) -> values`` that takes a 1-d array of fibre fractions and
returns an array of the same shape. A target ``f(vf) = T`` is solved in three steps:

1. evaluate ``f`` on a uniform grid over ``[lower, upper]`` in one vectorised call;
2. bracket every sign change of ``f - T`` between neighbouring grid points, and every interior
   grid extremum of ``f`` whose peak (found by a bounded scalar minimisation) crosses ``T``, which
   catches a target met twice inside one grid cell near the maximum of a non-monotonic property
   such as ``nu12`` or a CTE;
3. refine each bracket with Brent's method (:func:`scipy.optimize.brentq`).

Sets of fractions are tuples of closed intervals ``((a, b), ...)``, sorted and disjoint; an
isolated point is ``(a, a)``. Intersections treat ends closer than :data:`TOUCH` (1e-9 in the
fraction) as touching, so two targets met at the same fraction (each root refined on its own,
to a few units in the last place) give that point rather than nothing.

Limits: a hump of ``f`` that crosses ``T`` twice within the first or last grid cell and has no grid
extremum is missed; with the default 257 grid points that cell is 1/256 of the range.

References
----------
.. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Prentice-Hall,
   Ch. 4 (the root finder) and Ch. 5 (the bounded minimiser).
"""

from __future__ import annotations

from collections.abc import Callable, Iterable, Sequence
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError

__all__ = [
    "Relation",
    "IntervalSet",
    "DEFAULT_POINTS",
    "TOUCH",
    "evaluate",
    "find_crossings",
    "satisfying_set",
    "intersect",
    "intersect_all",
]

Array = NDArray[np.float64]
Relation = Literal["==", ">=", "<="]
IntervalSet = tuple[tuple[float, float], ...]
ForwardFunction = Callable[[Array], ArrayLike]

#: Grid points of the scan that precedes the bracketed root search.
DEFAULT_POINTS = 257

#: Gap in the fraction below which two interval ends count as one point when intersecting.
TOUCH = 1e-9

_EPS = float(np.finfo(float).eps)
_RTOL = 4.0 * _EPS
_XTOL = 1e-15


def evaluate(func: ForwardFunction, x: ArrayLike) -> Array:
    """Evaluate a forward model on an array of fractions and check the shape it returns.

    Parameters
    ----------
    func : callable
        Vectorised forward model, ``func(x)`` with ``x`` of shape (n,) returning shape (n,).
    x : array_like, shape (n,)
        Fibre volume fractions.

    Returns
    -------
    ndarray, shape (n,)
        The values, float64.

    Raises
    ------
    InputError
        If the model returns an array of another shape.
    """
    xa = np.atleast_1d(np.asarray(x, dtype=np.float64))
    y = np.asarray(func(xa), dtype=np.float64)
    if y.shape != xa.shape:
        y = np.broadcast_to(y, xa.shape) if y.ndim == 0 else y
    if y.shape != xa.shape:
        raise InputError(
            f"forward model: returned shape {y.shape} for fractions of shape {xa.shape}; "
            "it must return one value per fraction"
        )
    return y


def _scalar(func: ForwardFunction, target: float) -> Callable[[float], float]:
    def h(x: float) -> float:
        return float(evaluate(func, np.array([x]))[0]) - target

    return h


def _check_range(lower: float, upper: float) -> None:
    if not (np.isfinite(lower) and np.isfinite(upper)) or not lower < upper:
        raise InputError(
            f"fraction range: lower={lower!r}, upper={upper!r}; need finite lower < upper"
        )


def find_crossings(
    func: ForwardFunction,
    target: float,
    lower: float,
    upper: float,
    *,
    points: int = DEFAULT_POINTS,
) -> Array:
    """Return every fraction in ``[lower, upper]`` at which ``func`` equals ``target``.

    Parameters
    ----------
    func : callable
        Vectorised forward model of the fraction, shape (n,) -> (n,).
    target : float
        The value to reach (SI).
    lower, upper : float
        Fraction range searched (e.g. 0 and the packing limit).
    points : int
        Grid points of the initial scan (at least 3).

    Returns
    -------
    ndarray, shape (k,)
        Sorted roots, each refined to about 1e-15 in the fraction. Points where the model is
        not finite are skipped.

    Raises
    ------
    InputError
        If the range is empty, ``points`` < 3 or ``target`` is not finite.

    References
    ----------
    .. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Ch. 4-5.
    """
    from scipy.optimize import brentq, minimize_scalar

    _check_range(lower, upper)
    if points < 3:
        raise InputError(f"points: got {points}; the scan needs at least 3 grid points")
    if not np.isfinite(target):
        raise InputError(f"target: got {target!r}; it must be a finite number")
    x = np.linspace(lower, upper, points)
    g = evaluate(func, x) - target
    ok = np.isfinite(g)
    roots: list[float] = list(x[ok & (g == 0.0)])
    h = _scalar(func, target)

    both = ok[:-1] & ok[1:]
    cells = np.flatnonzero(both & (g[:-1] * g[1:] < 0.0))
    for i in cells:
        roots.append(float(brentq(h, x[i], x[i + 1], xtol=_XTOL, rtol=_RTOL)))

    # interior grid extrema of f whose peak may cross the target between grid points
    d = np.diff(g)
    inner = np.arange(1, points - 1)
    okk = ok[inner - 1] & ok[inner] & ok[inner + 1]
    sg = np.sign(g)
    same = (sg[inner - 1] == sg[inner]) & (sg[inner] == sg[inner + 1])
    same &= g[inner] != 0.0
    peak = (d[inner - 1] * d[inner] < 0.0) & okk & same
    # a maximum below the target or a minimum above it may reach it
    toward = np.where(d[inner - 1] > 0.0, g[inner] < 0.0, g[inner] > 0.0)
    scale = max(abs(target), float(np.nanmax(np.abs(g + target))) if ok.any() else 1.0, 1e-300)
    for i in inner[peak & toward]:
        a, b = float(x[i - 1]), float(x[i + 1])
        sgn = 1.0 if g[i] > 0.0 else -1.0  # minimise sgn * g to approach zero
        res = minimize_scalar(lambda t, s=sgn: s * h(t), bounds=(a, b), method="bounded",
                              options={"xatol": 1e-13})
        xs = float(res.x)
        gs = h(xs)
        if abs(gs) <= 1e-12 * scale:
            roots.append(xs)
        elif gs * g[i] < 0.0:
            roots.append(float(brentq(h, a, xs, xtol=_XTOL, rtol=_RTOL)))
            roots.append(float(brentq(h, xs, b, xtol=_XTOL, rtol=_RTOL)))

    if not roots:
        return np.empty(0)
    r = np.sort(np.asarray(roots, dtype=np.float64))
    keep = np.concatenate(([True], np.diff(r) > 4.0 * _XTOL))
    return r[keep]


def _meets(g: Array, relation: Relation) -> NDArray[np.bool_]:
    if relation == ">=":
        return g >= 0.0
    if relation == "<=":
        return g <= 0.0
    return g == 0.0


def satisfying_set(
    func: ForwardFunction,
    relation: Relation,
    target: float,
    lower: float,
    upper: float,
    *,
    points: int = DEFAULT_POINTS,
) -> tuple[Array, IntervalSet]:
    """Return the crossings and the set of fractions at which ``func <relation> target`` holds.

    Parameters
    ----------
    func : callable
        Vectorised forward model of the fraction, shape (n,) -> (n,).
    relation : {"==", ">=", "<="}
        Equality or a minimum (``>=``) or maximum (``<=``) requirement.
    target : float
        The target value (SI).
    lower, upper : float
        Fraction range searched.
    points : int
        Grid points of the initial scan.

    Returns
    -------
    roots : ndarray, shape (k,)
        Fractions where ``func == target``.
    intervals : tuple of (float, float)
        Sorted, disjoint closed intervals of fractions meeting the requirement. For ``"=="`` these
        are the roots as points ``(r, r)`` (or whole stretches where the model equals the target
        identically).

    Raises
    ------
    InputError
        If ``relation`` is not one of the three forms (and as :func:`find_crossings`).
    """
    if relation not in ("==", ">=", "<="):
        raise InputError(f"relation: got {relation!r}; expected '==', '>=' or '<='")
    roots = find_crossings(func, target, lower, upper, points=points)
    edges = np.concatenate(([lower], roots, [upper]))
    edges = np.unique(np.clip(edges, lower, upper))
    a, b = edges[:-1], edges[1:]
    mids = 0.5 * (a + b)
    good = _meets(evaluate(func, mids) - target, relation) if mids.size else np.zeros(0, bool)
    segments = [(float(lo), float(hi)) for lo, hi, m in zip(a, b, good, strict=True) if m]
    pts = [(float(r), float(r)) for r in roots]
    return roots, _union(segments + pts)


def _union(items: Iterable[tuple[float, float]]) -> IntervalSet:
    out: list[list[float]] = []
    for lo, hi in sorted(items):
        if out and lo <= out[-1][1]:
            out[-1][1] = max(out[-1][1], hi)
        else:
            out.append([lo, hi])
    return tuple((lo, hi) for lo, hi in out)


def intersect(a: IntervalSet, b: IntervalSet) -> IntervalSet:
    """Return the intersection of two sets of closed intervals.

    Parameters
    ----------
    a, b : tuple of (float, float)
        Sorted, disjoint closed intervals.

    Returns
    -------
    tuple of (float, float)
        Sorted, disjoint closed intervals (points kept as ``(x, x)``). Two pieces whose ends lie
        within :data:`TOUCH` of each other meet in one point, the midpoint of the gap.
    """
    out: list[tuple[float, float]] = []
    i = j = 0
    while i < len(a) and j < len(b):
        lo = max(a[i][0], b[j][0])
        hi = min(a[i][1], b[j][1])
        if lo <= hi:
            out.append((lo, hi))
        elif lo - hi <= TOUCH:
            mid = 0.5 * (lo + hi)
            out.append((mid, mid))
        if a[i][1] < b[j][1]:
            i += 1
        else:
            j += 1
    return _union(out)


def intersect_all(sets: Sequence[IntervalSet], lower: float, upper: float) -> IntervalSet:
    """Return the intersection of several interval sets (the whole range for none).

    Parameters
    ----------
    sets : sequence of interval sets
        Each a tuple of sorted, disjoint closed intervals.
    lower, upper : float
        The range returned when ``sets`` is empty.

    Returns
    -------
    tuple of (float, float)
        The common part.
    """
    out: IntervalSet = ((lower, upper),)
    for s in sets:
        out = intersect(out, s)
    return out
