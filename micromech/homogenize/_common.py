"""Helpers shared by the estimators: fraction checks, phase tensors and result assembly."""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError
from micromech.homogenize import walpole as W
from micromech.homogenize.phases import FibrePhase, MatrixPhase
from micromech.results import ElasticConstants

Array = NDArray[np.float64]


def fraction(vf: ArrayLike, field: str = "vf") -> Array:
    """Return ``vf`` as a float array, raising FractionError unless every value is in [0, 1].

    Parameters
    ----------
    vf : array_like, shape (...)
        Volume fraction.
    field : str
        Name for the message.

    Returns
    -------
    ndarray, shape (...)
        The fraction.

    Raises
    ------
    FractionError
        A value outside [0, 1] or not finite, with its index.
    """
    v = np.asarray(vf, dtype=np.float64)
    bad = ~((v >= 0.0) & (v <= 1.0))
    if np.any(bad):
        if v.ndim == 0:
            raise FractionError(f"{field} = {float(v)!r} must lie in [0, 1]")
        idx = tuple(int(i) for i in np.argwhere(bad)[0])
        raise FractionError(
            f"{field} = {float(v[idx])!r} at index {idx if len(idx) > 1 else idx[0]} "
            "must lie in [0, 1]"
        )
    return v


def phases(fibre: Any, matrix: Any) -> tuple[FibrePhase, MatrixPhase]:
    """Coerce the constituents to :class:`FibrePhase` and :class:`MatrixPhase`.

    Parameters
    ----------
    fibre, matrix : object
        Phases or material models (see ``from_material``).

    Returns
    -------
    tuple
        ``(FibrePhase, MatrixPhase)``.
    """
    return FibrePhase.from_material(fibre), MatrixPhase.from_material(matrix)


def fibre_tensor(f: FibrePhase) -> W.TI:
    """Return the fibre stiffness in Walpole components (axis 1 the fibre axis), Pa."""
    return W.from_engineering(f.E1, f.E2, f.nu12, f.G12, f.nu23)


def matrix_tensor(m: MatrixPhase) -> W.TI:
    """Return the matrix stiffness in Walpole components, Pa."""
    return W.isotropic(m.K, m.G)


def thermal_vector(axial: ArrayLike, transverse: ArrayLike) -> tuple[Array, Array]:
    """Components of ``a_t theta + a_a n n`` on the orthonormal pair (theta / sqrt2, n n)."""
    return W.SQ2 * np.asarray(transverse, dtype=np.float64), np.asarray(axial, dtype=np.float64)


def solve_block(M: W.TI, b0: Array, b1: Array) -> tuple[Array, Array]:
    """Solve ``[[c, e], [f, d]] x = b`` for each point, robust to a singular block.

    Where the block is singular (relative determinant below 1e-12), the minimum-norm solution of
    the rank-one system is returned; for the uniform-field (Levin) relation any solution serves,
    because the effective compliance acts on the null direction as the average does.

    Parameters
    ----------
    M : walpole.TI
        Tensor whose (c, d, e, f) block is used.
    b0, b1 : ndarray, shape (...)
        Right-hand side.

    Returns
    -------
    x0, x1 : ndarray, shape (...)
        Solution.
    """
    det = M.c * M.d - M.e * M.f
    nrm = M.c**2 + M.d**2 + M.e**2 + M.f**2
    ok = np.abs(det) > 1e-12 * nrm
    safe_det = np.where(ok, det, 1.0)
    x0 = (M.d * b0 - M.e * b1) / safe_det
    x1 = (M.c * b1 - M.f * b0) / safe_det
    safe_n = np.where(nrm > 0.0, nrm, 1.0)
    p0 = (M.c * b0 + M.f * b1) / safe_n
    p1 = (M.e * b0 + M.d * b1) / safe_n
    return np.where(ok, x0, p0), np.where(ok, x1, p1)


def levin_block(
    S_eff: W.TI, S_f: W.TI, S_m: W.TI, vf: Array,
    af1: ArrayLike, af2: ArrayLike, am1: ArrayLike, am2: ArrayLike,
) -> tuple[Array, Array]:
    """Two-phase uniform-field (Levin) CTE from an effective compliance, axis-1 form.

    ``alpha* = <alpha> + (S* - <S>) : (S_f - S_m)^-1 : (alpha_f - alpha_m)`` on the axial /
    transverse-dilatation block.

    Parameters
    ----------
    S_eff, S_f, S_m : walpole.TI
        Effective, fibre and matrix compliances, 1/Pa.
    vf : ndarray, shape (...)
        Fibre fraction.
    af1, af2, am1, am2 : array_like, shape (...)
        Axial and transverse CTEs of fibre and matrix, 1/K.

    Returns
    -------
    alpha1, alpha2 : ndarray, shape (...)
        Axial and transverse CTE, 1/K.

    References
    ----------
    Levin, V. M. (1967). On the coefficients of thermal expansion of heterogeneous materials.
    *Mech. Solids* 2, 58-61; Rosen, B. W., Hashin, Z. (1970). Effective thermal expansion
    coefficients and specific heats of composite materials. *Int. J. Eng. Sci.* 8, 157-173.
    """
    vm = 1.0 - vf
    f0, f1 = thermal_vector(af1, af2)
    m0, m1 = thermal_vector(am1, am2)
    dS = W.sub(S_f, S_m)
    x0, x1 = solve_block(dS, f0 - m0, f1 - m1)
    sc = S_eff.c - (vf * S_f.c + vm * S_m.c)
    sd = S_eff.d - (vf * S_f.d + vm * S_m.d)
    se = S_eff.e - (vf * S_f.e + vm * S_m.e)
    sf = S_eff.f - (vf * S_f.f + vm * S_m.f)
    a0 = vf * f0 + vm * m0 + sc * x0 + se * x1
    a1 = vf * f1 + vm * m1 + sf * x0 + sd * x1
    return a1, a0 / W.SQ2


def ti_result(
    C: W.TI,
    *,
    model: str,
    source: str,
    alpha: tuple[Array, Array] | None = None,
    extra: dict[str, Any] | None = None,
    S: W.TI | None = None,
) -> ElasticConstants:
    """Turn a stiffness transversely isotropic about axis 1 into :class:`ElasticConstants`.

    Parameters
    ----------
    C : walpole.TI
        Effective stiffness, Pa.
    model, source : str
        Model key and published source.
    alpha : tuple of ndarray, optional
        ``(alpha1, alpha2)``, 1/K.
    extra : dict, optional
        Further outputs; ``k23`` is added.
    S : walpole.TI, optional
        The compliance, when already known.

    Returns
    -------
    ElasticConstants
        E1, E2 = E3, G12 = G13, G23, nu12 = nu13, nu23.
    """
    if S is None:
        S = W.inv(C)
    E1 = 1.0 / S.d
    E2 = 2.0 / (S.c + S.g)
    ex = {"k23": C.c / 2.0}
    ex.update(extra or {})
    return ElasticConstants(
        E1=E1, E2=E2, E3=E2, G12=0.5 / S.h, G13=0.5 / S.h, G23=0.5 / S.g,
        nu12=-S.e / W.SQ2 * E1, nu13=-S.e / W.SQ2 * E1, nu23=(S.g - S.c) / (S.c + S.g),
        alpha1=None if alpha is None else alpha[0],
        alpha2=None if alpha is None else alpha[1],
        alpha3=None if alpha is None else alpha[1],
        model=model, source=source, extra=ex,
    )


def has_cte(f: FibrePhase, m: MatrixPhase) -> bool:
    """Whether both phases carry thermal expansion coefficients."""
    return f.alpha1 is not None and f.alpha2 is not None and m.alpha is not None
