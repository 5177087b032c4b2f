"""Ply failure criteria in plane stress: failure index, strength ratio and mode.

Every criterion takes ply stresses in material axes, ``stress[..., :] = (s11, s22, s12)`` in Pa,
and returns a :class:`CriterionResult` with, for each stress state,

* ``strength_ratio`` R: the factor by which the (mechanical) stress can be multiplied before
  the criterion reaches failure. Where a fixed residual stress ``thermal`` is given (e.g. from
  curing), the ratio multiplies the mechanical part only: failure at ``thermal + R * stress``.
  R = 0 where the residual stress alone already fails the ply; R = inf where the load never
  fails it.
* ``index`` = 1 / R: grows linearly with the load for every criterion, and reaches 1 at
  failure. (For maximum stress it is the largest stress-to-strength ratio; for Tsai-Hill it is
  the square root of the usual quadratic form; for Tsai-Wu it is not the polynomial itself.)
* ``mode``: ``fibre_tension``, ``fibre_compression``, ``matrix_tension``,
  ``matrix_compression``, ``shear`` or ``none``. For the interactive criteria (Tsai-Hill,
  Tsai-Wu) the mode is the stress component with the largest stress-to-strength ratio at the
  failure point (common practice, no source).

Strengths are positive magnitudes (Xc, Yc too). Along the load ray the quadratic criteria are
solved exactly, including sign changes of s11 and s22 on the way (Tsai-Hill and Hashin choose
their strengths or modes by the sign of the stress).

References
----------
.. [1] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Sec. 2.9 (maximum
   stress, maximum strain, Tsai-Hill, Tsai-Wu).
.. [2] Azzi, V. D., Tsai, S. W. (1965). Anisotropic strength of composites. *Experimental
   Mechanics* 5, 283-288 (the Tsai-Hill form used here).
.. [3] Tsai, S. W., Wu, E. M. (1971). A general theory of strength for anisotropic materials.
   *Journal of Composite Materials* 5, 58-80.
.. [4] Tsai, S. W., Hahn, H. T. (1980). *Introduction to Composite Materials*, Technomic,
   Sec. 7.3 (normalised interaction term F12* = -1/2).
.. [5] Hashin, Z. (1980). Failure criteria for unidirectional fiber composites. *Journal of
   Applied Mechanics* 47, 329-334 (fibre and matrix modes; plane-stress forms of Eqs. (23)-(26),
   equation numbers from memory).
.. [6] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., Sec. 2.9 (strength
   ratio). Section numbers are cited from memory; check them against the edition at hand.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError

__all__ = [
    "CRITERIA",
    "MODES",
    "REQUIRED_STRENGTHS",
    "CriterionResult",
    "max_stress",
    "max_strain",
    "tsai_hill",
    "tsai_wu",
    "hashin",
    "evaluate_criterion",
]

Array = NDArray[np.float64]

#: Criterion keys accepted by :func:`evaluate_criterion`.
CRITERIA: tuple[str, ...] = ("max_stress", "max_strain", "tsai_hill", "tsai_wu", "hashin")

#: Strengths every criterion needs (Hashin also reads S23 when given).
REQUIRED_STRENGTHS: tuple[str, ...] = ("Xt", "Xc", "Yt", "Yc", "S12")

#: Failure modes; ``CriterionResult.mode_code`` indexes this tuple.
MODES: tuple[str, ...] = (
    "none", "fibre_tension", "fibre_compression", "matrix_tension", "matrix_compression", "shear",
)
_NONE, _FT, _FC, _MT, _MC, _SH = range(6)


@dataclass(frozen=True, eq=False)
class CriterionResult:
    """Outcome of one failure criterion for an array of stress states.

    Attributes
    ----------
    criterion : str
        Criterion key.
    strength_ratio : ndarray, shape (...)
        Load multiplier to failure (0 ... inf).
    mode_code : ndarray of int, shape (...)
        Index into :data:`MODES`.
    """

    criterion: str
    strength_ratio: Array
    mode_code: NDArray[np.int64]

    @property
    def index(self) -> Array:
        """Failure index 1 / R (0 where R is infinite, inf where R = 0)."""
        with np.errstate(divide="ignore"):
            return np.asarray(1.0 / self.strength_ratio)

    @property
    def mode(self) -> NDArray[np.str_]:
        """Failure mode names, same shape as ``strength_ratio``."""
        return np.asarray(MODES)[self.mode_code]


# --- helpers ----------------------------------------------------------------------------------


def _need(strengths: Any, criterion: str) -> list[Array]:
    """Xt, Xc, Yt, Yc, S12 as arrays, or an error naming the criterion and what is missing."""
    names = REQUIRED_STRENGTHS
    if strengths is None:
        raise InputError(f"{criterion}: ply strengths are needed ({', '.join(names)})")
    missing = [n for n in names if getattr(strengths, n, None) is None]
    if missing:
        raise InputError(
            f"{criterion}: strength {', '.join(missing)} missing (this criterion needs "
            f"{', '.join(names)})"
        )
    return [np.asarray(getattr(strengths, n), dtype=np.float64) for n in names]


def _stresses(stress: ArrayLike, thermal: ArrayLike | None) -> tuple[Array, Array, Array]:
    """Return the scaled mechanical stress (largest component 1), the thermal stress, the scale.

    The ray problem is solved for the scaled stress and its ratio divided by the scale at the
    end (ratios scale as 1 / load), so that very large or very small loads neither overflow
    nor underflow in the quadratic forms.
    """
    sM = np.asarray(stress, dtype=np.float64)
    if sM.shape[-1:] != (3,):
        raise InputError(f"stress: expected shape (..., 3) = (s11, s22, s12), got {sM.shape}")
    sT = np.zeros_like(sM) if thermal is None else np.asarray(thermal, dtype=np.float64)
    if sT.shape[-1:] != (3,):
        raise InputError(f"thermal: expected shape (..., 3) = (s11, s22, s12), got {sT.shape}")
    sM, sT = np.broadcast_arrays(sM, sT)
    k = np.max(np.abs(sM), axis=-1)
    k = np.where((k > 0.0) & np.isfinite(k), k, 1.0)
    return sM / k[..., None], sT, k


def _linear_ratio(vT: Array, vM: Array, upper: Array, lower: Array) -> Array:
    """Smallest lambda >= 0 with vT + lambda vM outside [-lower, upper]."""
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        up = (upper - vT) / vM
        down = (-lower - vT) / vM
    lam = np.where(vM > 0, up, np.where(vM < 0, down, np.inf))
    outside = (vT > upper) | (vT < -lower)
    return np.where(outside, 0.0, np.maximum(lam, 0.0))


def _sign_interval(vT: Array, vM: Array, positive: bool) -> tuple[Array, Array]:
    """Interval [lo, hi] of lambda >= 0 where vT + lambda vM >= 0 (or < 0); empty if lo > hi."""
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        root = -vT / vM
    inf = np.full(np.shape(vT), np.inf)
    zero = np.zeros(np.shape(vT))
    if positive:
        lo = np.where(vM > 0, np.maximum(root, 0.0), np.where(vM < 0, 0.0,
                      np.where(vT >= 0, 0.0, np.inf)))
        hi = np.where(vM < 0, root, inf)
    else:
        lo = np.where(vM < 0, np.maximum(root, 0.0), np.where(vM > 0, 0.0,
                      np.where(vT < 0, 0.0, np.inf)))
        hi = np.where(vM > 0, root, inf)
    lo = np.where(np.isnan(lo), zero, lo)
    return lo, hi


def _ray(H: Array, f: Array, sT: Array, sM: Array) -> tuple[Array, Array, Array]:
    """Coefficients of F(sT + lambda sM) = a lambda^2 + b lambda + c for F = s.H.s + f.s."""
    HsM = np.einsum("...ij,...j->...i", H, sM)
    HsT = np.einsum("...ij,...j->...i", H, sT)
    a = (sM * HsM).sum(-1)
    b = 2.0 * (sT * HsM).sum(-1) + (f * sM).sum(-1)
    c = (sT * HsT).sum(-1) + (f * sT).sum(-1)
    return a, b, c


def _first_reach(a: Array, b: Array, c: Array, lo: Array, hi: Array) -> Array:
    """Smallest lambda in [lo, hi] with a lambda^2 + b lambda + c >= 1 (a >= 0), else inf.

    Regions that start beyond 1e100 (a stress component that changes sign only at an
    astronomically large load) count as never reached.
    """
    empty = ~(lo <= hi) | (lo > 1e100)
    lo_f = np.where(empty, 0.0, lo)
    F_lo = a * lo_f**2 + b * lo_f + c
    d = 1.0 - F_lo
    bp = 2.0 * a * lo_f + b
    disc = np.sqrt(np.maximum(bp * bp + 4.0 * a * d, 0.0))
    den = bp + disc
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        mu = np.where(den > 0, 2.0 * d / den, np.inf)
    lam = np.where(d <= 0.0, lo_f, lo_f + mu)
    return np.where(empty | (lam > hi), np.inf, lam)


def _first_component(
    vT: Array, vM: Array, upper: tuple[Array, ...], lower: tuple[Array, ...]
) -> tuple[Array, Array]:
    """Ratio and mode of the first of three components (1, 2, 12) to leave its allowable range.

    ``vT + lambda vM`` (stresses or strains) is compared with ``[-lower, upper]`` component by
    component; the mode is named by the component that reaches its limit first and its sign
    there.
    """
    lams = np.stack([_linear_ratio(vT[..., i], vM[..., i], upper[i], lower[i])
                     for i in range(3)], -1)
    k = np.argmin(lams, -1)
    R = np.min(lams, -1)
    v = _failure_point(vT, vM, R)
    mode = np.choose(k, [np.where(v[..., 0] >= 0, _FT, _FC), np.where(v[..., 1] >= 0, _MT, _MC),
                         np.full(np.shape(k), _SH)])
    return R, mode


def _dominant_mode(s: Array, Xt: Array, Xc: Array, Yt: Array, Yc: Array, S: Array) -> Array:
    """Mode of the largest stress-to-strength ratio at stress state s (..., 3)."""
    r1 = np.where(s[..., 0] >= 0, s[..., 0] / Xt, -s[..., 0] / Xc)
    r2 = np.where(s[..., 1] >= 0, s[..., 1] / Yt, -s[..., 1] / Yc)
    r6 = np.abs(s[..., 2]) / S
    k = np.argmax(np.stack([r1, r2, r6], -1), -1)
    m1 = np.where(s[..., 0] >= 0, _FT, _FC)
    m2 = np.where(s[..., 1] >= 0, _MT, _MC)
    return np.choose(k, [m1, m2, np.full(np.shape(k), _SH)])


def _failure_point(sT: Array, sM: Array, R: Array) -> Array:
    Rf = np.where(np.isfinite(R), R, 1.0)
    return np.where(np.isfinite(R)[..., None], sT + Rf[..., None] * sM, sM)


def _result(name: str, R: Array, mode: Array) -> CriterionResult:
    mode = np.where(np.isfinite(R), mode, _NONE).astype(np.int64)
    return CriterionResult(name, np.asarray(R, dtype=np.float64), np.asarray(mode))


# --- criteria ---------------------------------------------------------------------------------


def max_stress(
    stress: ArrayLike, strengths: Any, thermal: ArrayLike | None = None
) -> CriterionResult:
    """Maximum-stress criterion: each stress component against its own strength.

    Parameters
    ----------
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12) in material axes, Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12
        Strengths, Pa (scalars or arrays broadcasting with ``stress[..., 0]``).
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.

    Returns
    -------
    CriterionResult
        R = min over components of the multiplier that brings the component to its strength.

    References
    ----------
    Jones (1999), Sec. 2.9.2; Kaw (2006), Sec. 2.9.1.
    """
    Xt, Xc, Yt, Yc, S = _need(strengths, "max_stress")
    sM, sT, scale = _stresses(stress, thermal)
    R, mode = _first_component(sT, sM, (Xt, Yt, S), (Xc, Yc, S))
    return _result("max_stress", R / scale, mode)


def max_strain(
    stress: ArrayLike, strengths: Any, compliance: ArrayLike, thermal: ArrayLike | None = None
) -> CriterionResult:
    """Maximum-strain criterion with allowable strains = strength / modulus.

    The strains compared are the stress-producing strains S sigma (free thermal expansion
    excluded); the allowables are Xt/E1, Xc/E1, Yt/E2, Yc/E2 and S12/G12, i.e. the strains at
    failure of a linear ply in uniaxial tests.

    Parameters
    ----------
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12), Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12
        Strengths, Pa.
    compliance : array_like, shape (..., 3, 3)
        Plane-stress compliance of the ply in material axes, 1/Pa.
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.

    Returns
    -------
    CriterionResult
        As for :func:`max_stress`, on strains.

    References
    ----------
    Jones (1999), Sec. 2.9.3; Kaw (2006), Sec. 2.9.2.
    """
    Xt, Xc, Yt, Yc, S = _need(strengths, "max_strain")
    sM, sT, scale = _stresses(stress, thermal)
    Sm = np.asarray(compliance, dtype=np.float64)
    if Sm.shape[-2:] != (3, 3):
        raise InputError(f"compliance: expected shape (..., 3, 3), got {Sm.shape}")
    eM = np.einsum("...ij,...j->...i", Sm, sM)
    eT = np.einsum("...ij,...j->...i", Sm, sT)
    s11, s22, s66 = Sm[..., 0, 0], Sm[..., 1, 1], Sm[..., 2, 2]
    R, mode = _first_component(eT, eM, (Xt * s11, Yt * s22, S * s66),
                               (Xc * s11, Yc * s22, S * s66))
    return _result("max_strain", R / scale, mode)


def _diag3(a: Any, b: Any, c: Any) -> Array:
    a, b, c = np.broadcast_arrays(*(np.asarray(v, dtype=np.float64) for v in (a, b, c)))
    H = np.zeros(a.shape + (3, 3))
    H[..., 0, 0], H[..., 1, 1], H[..., 2, 2] = a, b, c
    return H


def tsai_hill(
    stress: ArrayLike, strengths: Any, thermal: ArrayLike | None = None
) -> CriterionResult:
    """Tsai-Hill criterion with strengths chosen by the sign of each normal stress.

    (s11/X)^2 - s11 s22 / X^2 + (s22/Y)^2 + (s12/S)^2 = 1, X = Xt or Xc by the sign of s11,
    Y = Yt or Yc by the sign of s22.

    Parameters
    ----------
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12), Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12
        Strengths, Pa.
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.

    Returns
    -------
    CriterionResult
        R solves the piecewise quadratic exactly along the load ray.

    References
    ----------
    Azzi and Tsai (1965); Jones (1999), Sec. 2.9; Kaw (2006), Sec. 2.9.3.
    """
    Xt, Xc, Yt, Yc, S = _need(strengths, "tsai_hill")
    sM, sT, scale = _stresses(stress, thermal)
    zero_f = np.zeros(3)
    R = np.full(sM.shape[:-1], np.inf)
    for pos1, X in ((True, Xt), (False, Xc)):
        lo1, hi1 = _sign_interval(sT[..., 0], sM[..., 0], pos1)
        for pos2, Y in ((True, Yt), (False, Yc)):
            lo2, hi2 = _sign_interval(sT[..., 1], sM[..., 1], pos2)
            H = _diag3(1.0 / X**2, 1.0 / Y**2, 1.0 / S**2)
            H[..., 0, 1] = H[..., 1, 0] = -0.5 / X**2
            a, b, c = _ray(H, zero_f, sT, sM)
            R = np.minimum(R, _first_reach(a, b, c, np.maximum(lo1, lo2), np.minimum(hi1, hi2)))
    mode = _dominant_mode(_failure_point(sT, sM, R), Xt, Xc, Yt, Yc, S)
    return _result("tsai_hill", R / scale, mode)


def tsai_wu(
    stress: ArrayLike,
    strengths: Any,
    thermal: ArrayLike | None = None,
    f12_star: float = -0.5,
) -> CriterionResult:
    """Tsai-Wu criterion with a normalised interaction term.

    F1 s11 + F2 s22 + F11 s11^2 + F22 s22^2 + F66 s12^2 + 2 F12 s11 s22 = 1 with
    F1 = 1/Xt - 1/Xc, F2 = 1/Yt - 1/Yc, F11 = 1/(Xt Xc), F22 = 1/(Yt Yc), F66 = 1/S12^2 and
    F12 = f12_star sqrt(F11 F22).

    Parameters
    ----------
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12), Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12
        Strengths, Pa.
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.
    f12_star : float
        Normalised interaction term, -1 < f12_star < 1 (closed failure surface); default
        -1/2 (Tsai and Hahn 1980).

    Returns
    -------
    CriterionResult
        R is the positive root of the quadratic a R^2 + b R + c = 1 along the load ray.

    Raises
    ------
    InputError
        If f12_star is not in (-1, 1).

    References
    ----------
    Tsai and Wu (1971); Tsai and Hahn (1980), Sec. 7.3; Kaw (2006), Sec. 2.9.4.
    """
    if not -1.0 < float(f12_star) < 1.0:
        raise InputError(
            f"f12_star = {f12_star}: must lie in (-1, 1) for a closed Tsai-Wu failure surface"
        )
    Xt, Xc, Yt, Yc, S = _need(strengths, "tsai_wu")
    sM, sT, scale = _stresses(stress, thermal)
    F11, F22, F66 = 1.0 / (Xt * Xc), 1.0 / (Yt * Yc), 1.0 / S**2
    H = _diag3(F11, F22, F66)
    H[..., 0, 1] = H[..., 1, 0] = float(f12_star) * np.sqrt(F11 * F22)
    F1, F2 = np.broadcast_arrays(1.0 / Xt - 1.0 / Xc, 1.0 / Yt - 1.0 / Yc)
    f = np.stack([F1, F2, np.zeros_like(F1)], -1)
    a, b, c = _ray(H, f, sT, sM)
    zero = np.zeros(np.shape(a))
    R = _first_reach(a, b, c, zero, zero + np.inf)
    mode = _dominant_mode(_failure_point(sT, sM, R), Xt, Xc, Yt, Yc, S)
    return _result("tsai_wu", R / scale, mode)


def hashin(
    stress: ArrayLike, strengths: Any, thermal: ArrayLike | None = None
) -> CriterionResult:
    """Hashin's (1980) criteria in plane stress: two fibre modes and two matrix modes.

    * fibre tension (s11 >= 0): (s11/Xt)^2 + (s12/S12)^2 = 1
    * fibre compression (s11 < 0): (s11/Xc)^2 = 1
    * matrix tension (s22 >= 0): (s22/Yt)^2 + (s12/S12)^2 = 1
    * matrix compression (s22 < 0): (s22/(2 S23))^2 + [(Yc/(2 S23))^2 - 1] s22/Yc
      + (s12/S12)^2 = 1

    Parameters
    ----------
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12), Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12 (and S23)
        Strengths, Pa. Without S23 the transverse shear strength is taken as Yc / 2, which
        turns the matrix-compression mode into (s22/Yc)^2 + (s12/S12)^2 = 1 (common practice,
        no source).
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.

    Returns
    -------
    CriterionResult
        R is the smallest multiplier that activates any mode; the mode is that one.

    References
    ----------
    Hashin (1980), J. Appl. Mech. 47, 329-334, Eqs. (23)-(26) (from memory).
    """
    Xt, Xc, Yt, Yc, S = _need(strengths, "hashin")
    S23 = getattr(strengths, "S23", None)
    ST = Yc / 2.0 if S23 is None else np.asarray(S23, dtype=np.float64)
    sM, sT, scale = _stresses(stress, thermal)
    zero3 = np.zeros(3)
    lin = ((Yc / (2.0 * ST)) ** 2 - 1.0) / Yc
    f_mc = np.stack(np.broadcast_arrays(0.0 * lin, lin, 0.0 * lin), -1)
    # mode, the component whose sign selects it (s22 or s11), that sign, H and f of
    # F = s.H.s + f.s; matrix modes first: on a tie (e.g. pure shear, s11 = s22 = 0) the
    # matrix mode is named
    table = (
        (_MT, 1, True, _diag3(0.0, 1.0 / Yt**2, 1.0 / S**2), zero3),
        (_MC, 1, False, _diag3(0.0 * lin, 1.0 / (2.0 * ST) ** 2, 1.0 / S**2), f_mc),
        (_FT, 0, True, _diag3(1.0 / Xt**2, 0.0, 1.0 / S**2), zero3),
        (_FC, 0, False, _diag3(1.0 / Xc**2, 0.0, 0.0), zero3),
    )
    lams = np.stack([
        _first_reach(*_ray(H, f, sT, sM), *_sign_interval(sT[..., i], sM[..., i], positive))
        for _, i, positive, H, f in table
    ], -1)
    k = np.argmin(lams, -1)
    R = np.min(lams, -1)
    mode = np.asarray([row[0] for row in table])[k]
    return _result("hashin", R / scale, mode)


def evaluate_criterion(
    criterion: str,
    stress: ArrayLike,
    strengths: Any,
    *,
    compliance: ArrayLike | None = None,
    thermal: ArrayLike | None = None,
    f12_star: float = -0.5,
) -> CriterionResult:
    """Evaluate a criterion by key.

    Parameters
    ----------
    criterion : str
        One of :data:`CRITERIA`.
    stress : array_like, shape (..., 3)
        Mechanical stress (s11, s22, s12), Pa.
    strengths : PlyStrengths or object with Xt, Xc, Yt, Yc, S12 (S23)
        Strengths, Pa.
    compliance : array_like, shape (..., 3, 3), optional
        Plane-stress compliance in material axes (needed by ``max_strain``), 1/Pa.
    thermal : array_like, shape (..., 3), optional
        Fixed residual stress, Pa.
    f12_star : float
        Tsai-Wu interaction term.

    Returns
    -------
    CriterionResult
        The result.

    Raises
    ------
    InputError
        For an unknown criterion, or ``max_strain`` without a compliance.
    """
    if criterion == "max_stress":
        return max_stress(stress, strengths, thermal)
    if criterion == "max_strain":
        if compliance is None:
            raise InputError("max_strain: the ply compliance is needed (compliance=...)")
        return max_strain(stress, strengths, compliance, thermal)
    if criterion == "tsai_hill":
        return tsai_hill(stress, strengths, thermal)
    if criterion == "tsai_wu":
        return tsai_wu(stress, strengths, thermal, f12_star)
    if criterion == "hashin":
        return hashin(stress, strengths, thermal)
    raise InputError(f"criterion: unknown {criterion!r}; choose one of {', '.join(CRITERIA)}")
