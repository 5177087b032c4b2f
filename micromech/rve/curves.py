"""Metrics of one stress-strain curve: modulus, offset yield, proportional limit, strength.

Every rule works on the *sign-normalised loading envelope*:

1. **Sign.** The ultimate point is the point of largest absolute stress. When that stress is
   negative (compression), strain and stress are both negated, the rules below run on the
   mirrored curve, and every strain and stress is reported with the original sign again
   (the modulus stays positive). A compression curve therefore gives exactly the mirrored
   metrics of its tension twin.
2. **Loading envelope.** Only the points up to the ultimate point whose strain reaches a new
   running maximum are kept: unloading segments, and the reloading that follows until the
   previous strain is passed again, are ignored. When the strain itself is noisy (see 3), the
   test runs on the strain smoothed as below, and a point is dropped only when it lies more
   than 6 strain-noise sigmas below the running maximum, so that noise is not taken for
   unloading.
3. **Noise level.** The noise sigma of the stress is read from the second differences of the
   envelope stresses, d2 (robust: 1.4826 x median absolute deviation / sqrt(6), since
   var(d2) = 6 sigma^2 for white noise). Smooth curves give a sigma near zero, though their
   curvature adds to d2. A curve counts as noisy (and is smoothed) only when the noise is
   above 1e-4 of the stress range and the fourth differences (var(d4) = 70 sigma^2, almost
   free of curvature) confirm at least half of the d2 estimate, or when the strain is noisy.
   The noise of the strain is read alike from its fourth differences (var(d4) = 70 sigma^2;
   they leave the smooth trend of an unevenly stepped record out) and counts only when above
   2 % of the median strain step; it enters as stress noise times the initial slope (the slope
   over the first tenth of the points), and then the modulus is fitted to the smoothed curve,
   since least squares on noisy strains would underestimate the slope.

Linear range (automatic)
------------------------
Windows grow from the first point: ``[0, k]`` for a grid of end points k (every point for short
curves, 400 end points spaced geometrically for long ones). For each window the least-squares
slope E_k (the *secant* of the window) is compared with the least-squares slope T_k over the
last quarter of the window (at least 3 points; the *tangent* at its end). A window is linear when

    |T_k - E_k| <= max(tol * E_k, 3 * SE_k),

with ``tol = linear_tolerance`` (default 1 %) and SE_k the standard error of T_k - E_k from the
noise sigma: a deviation counts only when it is both larger than the tolerance and larger than
the noise can explain. Windows too short for their slope to stand 3 standard errors clear of
zero count as linear (undecided). The linear range ends at the last linear window before the
first run of 5 consecutive non-linear windows (single non-linear windows caused by noise do not
end it). The modulus is the least-squares slope over that window (with an intercept), reported
with its strain range and r2. A user-given strain range replaces the search.

Offset yield
------------
The offset line is the fit line moved along the strain axis by ``offset`` (default 0.002, the
usual 0.2 % offset: common practice, no source). The yield point is the first crossing of the
curve below that line that persists (for noisy curves of 50 points or more, see 3, the curve --
stress and strain alike -- is first smoothed by a centred moving average over about 1 % of the
points, 5 to 501, and the crossing must hold for as many points),
interpolated linearly between the two points that bracket it. When the curve never falls below
the line before its ultimate point, the yield strength is None and the note says why.

Proportional limit
------------------
The first point after the middle of the fit range where the (smoothed) curve departs from the
fit line by more than ``proportional_tolerance`` (default 1 %) of the line's stress, and by more
than 3 noise sigmas (of the smoothed curve), and stays so over the smoothing width;
interpolated between the bracketing points. The ultimate point
when the curve never departs (linear to the end).

Ultimate, failure, energy
-------------------------
Ultimate strength: largest absolute stress, with the strain there. Final strain: strain of the
last point. ``failed`` is True when, after the peak of the (smoothed) record and at a strain at
least as large, the stress falls below that peak by more than 1 % and 3 noise sigmas: the record
shows the failure. Otherwise (the largest stress is at, or within noise of, the end) the run
stopped before failure and the strength is only a lower limit. Energy per volume to the ultimate
point: the trapezoid integral of stress over strain along the loading envelope (J/m^3).

References
----------
.. [1] Ramberg, W. and Osgood, W. R. (1943). Description of stress-strain curves by three
   parameters. NACA Technical Note 902 (the test curves with a known 0.2 % offset yield).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.rve.ingest import Curve, _finite_1d

__all__ = ["CurveMetrics", "curve_metrics", "metrics_of_curve"]

Array = NDArray[np.float64]

_N_ENDS = 400  # window end points searched on long curves
_TAIL = 0.25  # fraction of a window used for its end tangent
_Z = 3.0  # noise standard errors a deviation must exceed
_RUN = 5  # consecutive non-linear windows that end the linear range
_FAIL_DROP = 0.01  # stress drop after the ultimate that shows failure
_NOISE_FLOOR = 1e-6  # relative strain noise below which the strain counts as clean
_STRESS_NOISE_FLOOR = 1e-4  # stress noise (of the stress range) below which nothing is smoothed
_CURVATURE_SHARE = 0.5  # d4 / d2 noise estimates below this: the d2 estimate is curvature
_MIN_SMOOTH_POINTS = 50
_ENV_Z = 6.0  # strain noise sigmas a drop must exceed to count as unloading
_STEP_NOISE = 0.02  # strain noise below this fraction of the median step is ignored


@dataclass(frozen=True)
class CurveMetrics:
    """Metrics of one stress-strain curve (SI, signs as in the data).

    Attributes
    ----------
    modulus : float
        Initial modulus (Young's or shear), Pa; the slope of the fit line.
    modulus_intercept : float
        Stress of the fit line at zero strain, Pa.
    modulus_fit_range : tuple of float
        Strains at the first and last point of the fit window.
    r2 : float
        Coefficient of determination of the fit.
    fit_points : int
        Number of points in the fit window.
    fit_automatic : bool
        Whether the window was found automatically (False: user range).
    yield_offset : float
        The strain offset used.
    yield_strength, yield_strain : float or None
        The offset yield point; None when the curve never crosses the offset line.
    yield_note : str
        Why there is no yield point (empty when there is one).
    proportional_limit, proportional_limit_strain : float
        Where the curve departs from the fit line (the ultimate point when it never does).
    ultimate_strength, strain_at_ultimate : float
        The point of largest absolute stress, Pa and strain.
    final_strain : float
        Strain of the last point.
    failed : bool
        True when the record shows the failure; False when the run stopped before it (the
        ultimate strength is then only a lower limit).
    energy_to_ultimate : float
        Energy per volume to the ultimate point along the loading envelope, J/m^3.
    sign : int
        +1 for a tension (positive) curve, -1 for compression.
    noise : float
        Estimated noise standard deviation of the stress, Pa.
    poisson : Mapping of str to float
        nu_ij = -eps_j / eps_i by lateral axis j, fitted over the modulus range.
    direction : str or None
        The load case, when known.
    notes : tuple of str
        Remarks on how the metrics were found.
    """

    modulus: float
    modulus_intercept: float
    modulus_fit_range: tuple[float, float]
    r2: float
    fit_points: int
    fit_automatic: bool
    yield_offset: float
    yield_strength: float | None
    yield_strain: float | None
    yield_note: str
    proportional_limit: float
    proportional_limit_strain: float
    ultimate_strength: float
    strain_at_ultimate: float
    final_strain: float
    failed: bool
    energy_to_ultimate: float
    sign: int
    noise: float
    poisson: Mapping[str, float] = field(default_factory=dict)
    direction: str | None = None
    notes: tuple[str, ...] = ()

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI floats; keys of the ``check`` contract first).

        Returns
        -------
        dict
            ``modulus``, ``modulus_fit_range``, ``r2``, ``yield_offset``, ``yield_strength``,
            ``ultimate_strength``, ``strain_at_ultimate``, ``final_strain``, ``failed``, then
            the further metrics.
        """
        return {
            "modulus": self.modulus,
            "modulus_fit_range": list(self.modulus_fit_range),
            "r2": self.r2,
            "yield_offset": self.yield_offset,
            "yield_strength": self.yield_strength,
            "ultimate_strength": self.ultimate_strength,
            "strain_at_ultimate": self.strain_at_ultimate,
            "final_strain": self.final_strain,
            "failed": self.failed,
            "yield_strain": self.yield_strain,
            "yield_note": self.yield_note,
            "proportional_limit": self.proportional_limit,
            "proportional_limit_strain": self.proportional_limit_strain,
            "energy_to_ultimate": self.energy_to_ultimate,
            "modulus_intercept": self.modulus_intercept,
            "fit_points": self.fit_points,
            "fit_automatic": self.fit_automatic,
            "noise": self.noise,
            "poisson": dict(self.poisson),
            "notes": list(self.notes),
        }


def metrics_of_curve(
    curve: Curve,
    *,
    offset: float = 0.002,
    fit_range: tuple[float, float] | None = None,
    linear_tolerance: float = 0.01,
    proportional_tolerance: float = 0.01,
) -> CurveMetrics:
    """Metrics of a :class:`~micromech.rve.ingest.Curve`, with its Poisson ratios.

    Parameters
    ----------
    curve : Curve
        The stress-strain curve of one load case.
    offset, fit_range, linear_tolerance, proportional_tolerance
        As in :func:`curve_metrics`.

    Returns
    -------
    CurveMetrics
        The metrics, labelled with the curve's direction.
    """
    return curve_metrics(
        curve.strain, curve.stress, offset=offset, fit_range=fit_range,
        lateral=curve.lateral, direction=curve.direction, linear_tolerance=linear_tolerance,
        proportional_tolerance=proportional_tolerance,
    )


def curve_metrics(
    strain: ArrayLike,
    stress: ArrayLike,
    *,
    offset: float = 0.002,
    fit_range: tuple[float, float] | None = None,
    lateral: Mapping[str, ArrayLike] | None = None,
    direction: str | None = None,
    linear_tolerance: float = 0.01,
    proportional_tolerance: float = 0.01,
) -> CurveMetrics:
    """Modulus, offset yield, proportional limit, ultimate point and energy of a curve.

    The rules are given in the module notes. Everything is vectorised: a curve of 10^5 points
    takes a few milliseconds.

    Parameters
    ----------
    strain : array_like, shape (n,)
        Strain (or engineering shear strain), dimensionless, n >= 3.
    stress : array_like, shape (n,)
        Stress, Pa.
    offset : float
        Strain offset of the yield line (default 0.002: common practice, no source).
    fit_range : (float, float), optional
        Strain range of the modulus fit, as magnitudes (signs ignored, but both must agree);
        replaces the automatic search.
    lateral : mapping of str to array_like, shape (n,), optional
        Lateral strains by axis; each gives a Poisson ratio -d(eps_j)/d(eps_i) fitted over the
        modulus range.
    direction : str, optional
        Label of the load case, kept in the result and used in messages.
    linear_tolerance : float
        Allowed relative disagreement of tangent and secant in the linear range (0.01).
    proportional_tolerance : float
        Relative departure from the fit line that ends proportionality (0.01).

    Returns
    -------
    CurveMetrics
        The metrics.

    Raises
    ------
    InputError
        For arrays that are not 1-D, of unequal length, shorter than 3 or not finite; a stress
        that is zero everywhere; fewer than 3 loading points up to the ultimate; a loading
        branch without strain change; a non-positive initial slope; a bad offset, tolerance or
        fit range.

    References
    ----------
    Ramberg and Osgood (1943), NACA TN 902: the curves used to test these rules.

    Examples
    --------
    >>> import numpy as np
    >>> s = np.linspace(0.0, 400e6, 2001)
    >>> e = s / 70e9 + 0.002 * (s / 300e6) ** 10
    >>> m = curve_metrics(e, s)
    >>> round(m.modulus / 1e9), round(m.yield_strength / 1e6)
    (70, 300)
    """
    label = f"curve {direction}" if direction else "curve"
    x = _finite_1d(strain, f"{label}: strain")
    y = _finite_1d(stress, f"{label}: stress")
    if x.size != y.size:
        raise InputError(f"{label}: strain has {x.size} points but stress has {y.size}")
    _check_positive(offset, f"{label}: offset")
    _check_positive(linear_tolerance, f"{label}: linear_tolerance")
    _check_positive(proportional_tolerance, f"{label}: proportional_tolerance")
    notes: list[str] = []

    # 1. sign and ultimate point
    iu = int(np.argmax(np.abs(y)))
    if y[iu] == 0.0:
        raise InputError(f"{label}: stress is zero at every point")
    sgn = 1.0 if y[iu] > 0 else -1.0
    xn = sgn * x
    yn = sgn * y
    peak = float(yn[iu])
    if xn[iu] < 0:
        raise InputError(
            f"{label}: at the ultimate point stress {y[iu]:.4g} Pa and strain {x[iu]:.4g} have "
            "opposite signs; check the sign convention of the force and displacement columns"
        )

    # 2. loading envelope up to the ultimate point: points whose strain reaches a new running
    #    maximum (within the noise of the strain, when the strain itself is noisy)
    xl = xn[: iu + 1]
    xscale = float(np.max(np.abs(xl)))
    sigma_x = _strain_noise(xl / xscale) if xscale > 0 else 0.0
    if sigma_x > 0.0:
        wx = _smooth_width(xl.size)
        xs = _moving_average(xl, wx) if wx > 1 else xl
        slack = _ENV_Z * sigma_x * xscale / np.sqrt(wx)
        env = np.flatnonzero(xs >= np.maximum.accumulate(xs) - slack)
    else:
        sigma_x = 0.0
        env = np.flatnonzero(xl >= np.maximum.accumulate(xl))
    if env.size < 3:
        raise InputError(
            f"{label}: only {env.size} loading point(s) up to the ultimate stress at point "
            f"{iu}; at least 3 are needed"
        )
    if env.size < iu + 1:
        notes.append(
            f"{iu + 1 - env.size} unloading/reloading point(s) before the ultimate ignored"
        )
    xe = xn[env]
    ye = yn[env]
    xspan = float(np.max(np.abs(xe)))
    if not xe[-1] > xe[0]:
        raise InputError(f"{label}: strain does not change along the loading branch")
    u = xe / xspan
    v = ye / peak
    m = u.size

    # 3. noise and smoothing: stress noise, plus strain noise times the initial slope
    sigma_v = _noise(v)
    sigma = sigma_v
    noisy = _stress_is_noisy(v, sigma_v)
    if sigma_x > 0.0:
        sigma = float(np.hypot(sigma_v, _initial_slope(u, v) * sigma_x * xscale / xspan))
        notes.append(f"noisy strain (sigma {sigma_x * xscale:.3g})")
        noisy = True
    width = 1
    if noisy and m >= _MIN_SMOOTH_POINTS:
        width = _smooth_width(m)
        notes.append(f"noisy curve (sigma {sigma * peak:.3g} Pa): smoothed over {width} points")
    vs = _moving_average(v, width) if width > 1 else v
    us = _moving_average(u, width) if width > 1 else u
    sigma_s = sigma / np.sqrt(width)

    # linear range and fit; a noisy strain is fitted after smoothing (least squares on noisy
    # abscissae underestimates the slope), with r2 from the points as read
    uf, vf = (us, vs) if sigma_x > 0.0 else (u, v)
    if fit_range is None:
        i0, i1, found = 0, *_linear_end(uf, vf, sigma, linear_tolerance)
        if not found:
            notes.append("no linear range found: modulus fitted over the first points")
    else:
        i0, i1 = _user_window(fit_range, xe, label)
    slope, icpt, r2 = _fit(uf[i0 : i1 + 1], vf[i0 : i1 + 1])
    if uf is not u:
        r2 = _r2(u[i0 : i1 + 1], v[i0 : i1 + 1], slope, icpt)
    if not slope > 0:
        raise InputError(
            f"{label}: the initial slope {slope * peak / xspan:.4g} Pa is not positive (stress "
            "and strain of opposite sign, or no loading)"
        )

    # offset yield (on the smoothed curve: stress and strain averaged alike)
    off = offset / xspan
    d = vs - (slope * (us - off) + icpt)
    iy = _first_persistent(d <= 0.0, width, 0)
    yield_strength: float | None = None
    yield_strain: float | None = None
    yield_note = ""
    if iy is None:
        x0 = -icpt / slope * xspan
        if xe[-1] < x0 + offset:
            yield_note = (
                f"no offset yield: the loading branch ends at strain {sgn * xe[-1]:.4g}, before "
                f"the {offset:g} offset line starts"
            )
        else:
            yield_note = (
                f"no offset yield: the curve stays above the {offset:g} offset line up to its "
                "ultimate point (linear or stiffening to the end)"
            )
    elif iy == 0:
        yield_note = "no offset yield: the curve starts below the offset line"
    else:
        t = d[iy - 1] / (d[iy - 1] - d[iy])
        uy = us[iy - 1] + t * (us[iy] - us[iy - 1])
        yield_strain = float(sgn * uy * xspan)
        yield_strength = float(sgn * peak * (slope * (uy - off) + icpt))

    # proportional limit
    line = slope * us + icpt
    g = np.abs(vs - line) - np.maximum(proportional_tolerance * np.abs(line), _Z * sigma_s)
    start = int(np.searchsorted(np.maximum.accumulate(us), 0.5 * (u[i0] + u[i1])))
    ip = _first_persistent(g > 0.0, width, start)
    if ip is None:
        pl_u, pl_v = us[-1], vs[-1]
        notes.append("the curve stays on the fit line up to the ultimate point")
    elif ip == start:
        pl_u, pl_v = us[ip], vs[ip]
    else:
        t = g[ip - 1] / (g[ip - 1] - g[ip])
        pl_u = us[ip - 1] + t * (us[ip] - us[ip - 1])
        pl_v = vs[ip - 1] + t * (vs[ip] - vs[ip - 1])

    # failure and energy
    failed = False
    if iu < y.size - 1:
        ys = _moving_average(yn, width) if width > 1 else yn
        ks = int(np.argmax(ys))
        drop = max(_FAIL_DROP * ys[ks], _Z * sigma_s * peak)
        after = slice(ks + 1, None)
        failed = bool(np.any((xn[after] >= xn[ks]) & (ys[after] < ys[ks] - drop)))
    if not failed:
        notes.append("the run stopped before failure: the ultimate strength is a lower limit")
    with np.errstate(over="ignore"):
        energy = float(np.trapezoid(v, u)) * peak * xspan
        modulus = slope * peak / xspan
    if not (np.isfinite(energy) and np.isfinite(modulus)):
        raise InputError(
            f"{label}: stress {peak:.3g} Pa and strain {xspan:.3g} are out of range: the "
            "modulus or the energy overflows"
        )

    # Poisson ratios over the fit window
    poisson: dict[str, float] = {}
    xw = x[env][i0 : i1 + 1]
    for axis, values in (lateral or {}).items():
        lat = _finite_1d(values, f"{label}: lateral strain {axis}")
        if lat.size != x.size:
            raise InputError(
                f"{label}: lateral strain {axis} has {lat.size} points, the curve {x.size}"
            )
        poisson[axis] = -_fit(xw, lat[env][i0 : i1 + 1])[0]

    return CurveMetrics(
        modulus=float(modulus),
        modulus_intercept=float(sgn * icpt * peak),
        modulus_fit_range=(float(sgn * xe[i0]), float(sgn * xe[i1])),
        r2=float(r2),
        fit_points=int(i1 - i0 + 1),
        fit_automatic=fit_range is None,
        yield_offset=float(offset),
        yield_strength=yield_strength,
        yield_strain=yield_strain,
        yield_note=yield_note,
        proportional_limit=float(sgn * pl_v * peak),
        proportional_limit_strain=float(sgn * pl_u * xspan),
        ultimate_strength=float(y[iu]),
        strain_at_ultimate=float(x[iu]),
        final_strain=float(x[-1]),
        failed=failed,
        energy_to_ultimate=energy,
        sign=int(sgn),
        noise=float(sigma * peak),
        poisson=MappingProxyType({k: float(v_) for k, v_ in poisson.items()}),
        direction=direction,
        notes=tuple(notes),
    )


# ------------------------------------------------------------------------------------------
# helpers (all vectorised)


def _check_positive(value: float, label: str) -> None:
    if isinstance(value, bool) or not isinstance(value, int | float | np.floating):
        raise InputError(f"{label}: expected a positive number, got {value!r}")
    if not (np.isfinite(value) and 0.0 < value < 1.0):
        raise InputError(
            f"{label}: must lie between 0 and 1 (a strain or a fraction), got {value!r}"
        )


def _noise(v: Array) -> float:
    """Robust noise sigma from second differences: 1.4826 MAD / sqrt(6)."""
    if v.size < 5:
        return 0.0
    d2 = np.diff(v, 2)
    mad = np.median(np.abs(d2 - np.median(d2)))
    return float(1.4826 * mad / np.sqrt(6.0))


def _stress_is_noisy(v: Array, sigma: float) -> bool:
    """Whether the stress record carries noise worth smoothing, not just curvature.

    The second-difference estimate ``sigma`` also picks up the curvature of a smooth curve
    (d2 = h^2 times the second derivative). Noise counts when it is above 1e-4 of the stress
    range and the fourth-difference estimate (var(d4) = 70 sigma^2 for white noise; curvature
    adds only h^4 times the fourth derivative) confirms at least half of it.
    """
    if v.size < 8 or not sigma > 0.0:
        return False
    d4 = np.diff(v, 4)
    sigma4 = float(1.4826 * np.median(np.abs(d4 - np.median(d4))) / np.sqrt(70.0))
    span = float(np.max(v) - np.min(v))
    return min(sigma, sigma4) > _STRESS_NOISE_FLOOR * span and sigma4 >= _CURVATURE_SHARE * sigma


def _strain_noise(x: Array) -> float:
    """Robust noise sigma of a strain record (scaled to about 1), 0 where it does not matter.

    Fourth differences (var = 70 sigma^2 for white noise) leave the smooth trend of an unevenly
    stepped record out; noise below 2 % of the median step, or below the floor, counts as 0.
    """
    if x.size < 8:
        return 0.0
    d4 = np.diff(x, 4)
    sigma = float(1.4826 * np.median(np.abs(d4 - np.median(d4))) / np.sqrt(70.0))
    step = float(np.median(np.abs(np.diff(x))))
    return sigma if sigma > max(_NOISE_FLOOR, _STEP_NOISE * step) else 0.0


def _smooth_width(n: int) -> int:
    """Odd smoothing width for n points: about 1 % of them, 5 to 501 (1 below 50 points)."""
    if n < _MIN_SMOOTH_POINTS:
        return 1
    return int(np.clip(n // 100, 5, 501)) | 1


def _initial_slope(u: Array, v: Array) -> float:
    """Magnitude of the slope over the first tenth of the points (at least 10), else 1."""
    k = min(u.size, max(10, u.size // 10))
    slope = abs(_fit(u[:k], v[:k])[0])
    return slope if np.isfinite(slope) and slope > 0 else 1.0


def _moving_average(v: Array, width: int) -> Array:
    """Centred moving average over ``width`` points, the window clipped at the ends."""
    c = np.concatenate(([0.0], np.cumsum(v)))
    half = width // 2
    idx = np.arange(v.size)
    lo = np.maximum(idx - half, 0)
    hi = np.minimum(idx + half + 1, v.size)
    return np.asarray((c[hi] - c[lo]) / (hi - lo))


def _first_persistent(mask: NDArray[np.bool_], width: int, start: int) -> int | None:
    """First index >= start where ``mask`` holds for ``width`` points (or to the end)."""
    n = mask.size
    c = np.concatenate(([0], np.cumsum(mask)))
    idx = np.arange(start, n)
    end = np.minimum(idx + width, n)
    ok = (c[end] - c[idx]) == (end - idx)
    hits = np.flatnonzero(ok)
    return int(idx[hits[0]]) if hits.size else None


def _dot(a: Array, b: Array) -> float:
    # einsum, not a @ b: a threaded BLAS dot can be 100x slower on a busy machine
    return float(np.einsum("i,i->", a, b))


def _fit(x: Array, y: Array) -> tuple[float, float, float]:
    """Least-squares line through centred data: slope, intercept, r2."""
    xm = x.mean()
    ym = y.mean()
    dx = x - xm
    dy = y - ym
    sxx = _dot(dx, dx)
    if sxx <= 0.0:
        return float("nan"), float("nan"), float("nan")
    slope = _dot(dx, dy) / sxx
    icpt = float(ym - slope * xm)
    syy = _dot(dy, dy)
    res = dy - slope * dx
    r2 = 1.0 - _dot(res, res) / syy if syy > 0 else 1.0
    return slope, icpt, r2


def _r2(x: Array, y: Array, slope: float, icpt: float) -> float:
    """Coefficient of determination of a given line through points."""
    res = y - (slope * x + icpt)
    dy = y - y.mean()
    syy = _dot(dy, dy)
    return 1.0 - _dot(res, res) / syy if syy > 0 else 1.0


def _window_slopes(
    s1: Array, s2: Array, t1: Array, p: Array, i: NDArray[np.int64], j: NDArray[np.int64]
) -> tuple[Array, Array]:
    """Least-squares slopes and centred Sxx over the index ranges [i, j) from prefix sums."""
    n = (j - i).astype(np.float64)
    sx = s1[j] - s1[i]
    sxx = (s2[j] - s2[i]) - sx * sx / n
    sxy = (p[j] - p[i]) - sx * (t1[j] - t1[i]) / n
    with np.errstate(all="ignore"):
        slope = sxy / sxx
    return slope, sxx


def _linear_end(u: Array, v: Array, sigma: float, tol: float) -> tuple[int, bool]:
    """Index of the last point of the linear range (see the module notes) and whether found."""
    m = u.size
    if m <= _N_ENDS:
        ends = np.arange(2, m)
    else:
        ends = np.unique(np.round(np.geomspace(2, m - 1, _N_ENDS)).astype(np.int64))
    zero = np.zeros(1)
    s1 = np.concatenate((zero, np.cumsum(u)))
    s2 = np.concatenate((zero, np.cumsum(u * u)))
    t1 = np.concatenate((zero, np.cumsum(v)))
    p = np.concatenate((zero, np.cumsum(u * v)))
    j = ends + 1
    q = np.minimum(np.maximum(3, np.ceil(_TAIL * j).astype(np.int64)), j)
    secant, sxx_w = _window_slopes(s1, s2, t1, p, np.zeros_like(j), j)
    tangent, sxx_t = _window_slopes(s1, s2, t1, p, j - q, j)
    with np.errstate(all="ignore"):
        se = sigma * np.sqrt(1.0 / sxx_t + 1.0 / sxx_w)
        resolved = secant > _Z * sigma / np.sqrt(sxx_w)  # slope stands clear of the noise
        agree = np.abs(tangent - secant) <= np.maximum(tol * secant, _Z * se)
        ok = (sxx_w > 0) & (sxx_t > 0) & (agree | ~resolved) & ((secant > 0) | ~resolved)
    if not ok.any():
        valid = np.flatnonzero(sxx_w > 0)
        return (int(ends[valid[0]]) if valid.size else m - 1), False
    first = int(np.argmax(ok))
    bad = np.concatenate(([0], np.cumsum(~ok)))
    runs = np.flatnonzero(bad[_RUN:] - bad[:-_RUN] == _RUN) if ok.size >= _RUN else np.array([])
    runs = runs[runs > first]
    stop = int(runs[0]) if runs.size else ok.size
    last = first + int(np.flatnonzero(ok[first:stop])[-1])
    return int(ends[last]), True


def _user_window(fit_range: Any, xe: Array, label: str) -> tuple[int, int]:
    try:
        lo, hi = (float(r) for r in fit_range)
    except (TypeError, ValueError):
        raise InputError(
            f"{label}: fit_range must be two strains (low, high), got {fit_range!r}"
        ) from None
    if not (np.isfinite(lo) and np.isfinite(hi)):
        raise InputError(f"{label}: fit_range must be finite, got {fit_range!r}")
    if lo * hi < 0:
        raise InputError(
            f"{label}: fit_range ({lo:g}, {hi:g}) mixes signs; give strain magnitudes"
        )
    lo, hi = sorted((abs(lo), abs(hi)))
    top = np.maximum.accumulate(xe)  # sorted even where a noisy strain steps back
    i0 = int(np.searchsorted(top, lo, side="left"))
    i1 = int(np.searchsorted(top, hi, side="right")) - 1
    if i1 - i0 + 1 < 3:
        raise InputError(
            f"{label}: fit_range ({lo:g}, {hi:g}) holds {max(i1 - i0 + 1, 0)} loading point(s); "
            "at least 3 are needed"
        )
    return i0, i1
