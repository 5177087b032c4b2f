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


def solve_block(
    M: W.TI, b0: Array, b1: Array, scale: Array | float = 0.0
) -> tuple[Array, Array]:
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
    scale : ndarray or float
        Size of the tensors M is a difference of; a block below 1e-10 of it counts as zero
        (solution 0).

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
    zero = nrm <= (1e-10 * np.asarray(scale)) ** 2
    return (np.where(zero, 0.0, np.where(ok, x0, p0)), np.where(zero, 0.0, np.where(ok, x1, p1)))


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
    f0, f1 = thermal_vector(af1, af2)
    m0, m1 = thermal_vector(am1, am2)
    dS = W.sub(S_f, S_m)
    scale = np.sqrt(sum(np.square(v) for v in (*S_f[:4], *S_m[:4])))
    x0, x1 = solve_block(dS, f0 - m0, f1 - m1, scale)
    # alpha* = m + vf (f - m) + (S* - S_m - vf dS) x: the per-phase terms are combined first
    u0 = (f0 - m0) - (dS.c * x0 + dS.e * x1)
    u1 = (f1 - m1) - (dS.f * x0 + dS.d * x1)
    k0 = m0 - (S_m.c * x0 + S_m.e * x1)
    k1 = m1 - (S_m.f * x0 + S_m.d * x1)
    a0 = k0 + vf * u0 + S_eff.c * x0 + S_eff.e * x1
    a1 = k1 + vf * u1 + S_eff.f * x0 + S_eff.d * x1
    return np.asarray(a1), np.asarray(a0 / W.SQ2)


def ti_result(
    C: W.TI | None,
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
    C : walpole.TI or None
        Effective stiffness, Pa (None: read k23 from the compliance S).
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
        assert C is not None, "ti_result needs C or S"  # internal use only
        S = W.inv(C)
    E1 = 1.0 / S.d
    tr = S.c + S.g
    E2 = 2.0 / tr
    k23 = C.c / 2.0 if C is not None else 0.5 * S.d / (S.c * S.d - S.e * S.f)
    ex = {"k23": k23}
    ex.update(extra or {})
    G12 = 0.5 / S.h
    nu12 = (-1.0 / W.SQ2) * S.e * E1
    return ElasticConstants(
        E1=E1, E2=E2, E3=E2, G12=G12, G13=G12, G23=0.5 / S.g,
        nu12=nu12, nu13=nu12, nu23=(S.g - S.c) / tr,
        alpha1=None if alpha is None else alpha[0],
        alpha2=None if alpha is None else alpha[1],
        alpha3=None if alpha is None else alpha[1],
        model=model, source=source, extra=ex,
    )


def has_cte(f: FibrePhase, m: MatrixPhase) -> bool:
    """Whether both phases carry thermal expansion coefficients."""
    return f.alpha1 is not None and f.alpha2 is not None and m.alpha is not None
