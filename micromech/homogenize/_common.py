"""Helpers shared by the estimators: fraction checks, phase tensors and result assembly."""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError
from micromech.homogenize import walpole as W
from micromech.homogenize.phases import FibrePhase, MatrixPhase
from micromech.results import ElasticConstants
from micromech.tensors import at_index

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
        raise FractionError(f"{field} = {float(v[bad][0])!r}{at_index(bad)} must lie in [0, 1]")
    return v


def void_fractions(vf: ArrayLike, void_fraction: ArrayLike) -> tuple[Array, Array, bool]:
    """Return the fibre and void fractions and whether there are voids.

    FractionError unless each is in [0, 1] and vf + void_fraction <= 1 (the matrix takes the rest).
    """
    c = fraction(vf)
    cv = fraction(void_fraction, "void_fraction")
    voids = bool(np.any(cv > 0.0))
    if voids and np.any(c + cv > 1.0 + 1e-12):
        raise FractionError(f"vf + void_fraction = {float(np.max(c + cv))!r} exceeds 1")
    return c, cv, voids


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
    k23 = C.c / 2.0 if C is not None else 0.5 * S.d / (S.c * S.d - S.e * S.f)
    e = W.engineering_from_compliance(S)
    a1, a2 = (None, None) if alpha is None else alpha
    return ElasticConstants.transversely_isotropic(
        e["E1"], e["E2"], e["nu12"], e["G12"], e["G23"], nu23=e["nu23"], alpha1=a1, alpha2=a2,
        model=model, source=source, extra={"k23": k23, **(extra or {})},
    )


def normal_result(
    S: W.TI,
    orientation: str,
    *,
    model: str,
    source: str,
    alpha: tuple[Array, Array] | None = None,
) -> ElasticConstants:
    """Turn a compliance about the plate normal (axis 3) into constants in the composite's axes.

    ``random_in_plane``: E1 = E2 in the plane, E3 along the normal; ``random_3d``: S is isotropic
    and so are the constants (``extra`` has K and G). ``alpha`` is (in-plane, normal), 1/K.
    """
    e = W.engineering_from_compliance(S)  # its axis 1 is the plate normal
    E_in, nu_in, G_in = e["E2"], e["nu23"], e["G23"]
    a_in, a_n = (None, None) if alpha is None else alpha
    if orientation == "random_3d":
        return isotropic_result(E_in / (3.0 * (1.0 - 2.0 * nu_in)), G_in, model=model,
                                source=source, alpha=a_in)
    nu_io = -S.f / W.SQ2 * E_in  # in-plane stress, normal strain
    return ElasticConstants(E1=E_in, E2=E_in, E3=e["E1"], G12=G_in, G13=e["G12"], G23=e["G12"],
                            nu12=nu_in, nu13=nu_io, nu23=nu_io, alpha1=a_in, alpha2=a_in,
                            alpha3=a_n, model=model, source=source)


def isotropic_result(
    K: Array, G: Array, *, model: str, source: str, alpha: Array | None = None
) -> ElasticConstants:
    """Turn bulk and shear moduli into isotropic constants (``extra`` holds K and G).

    ``E = 9 K G / (3 K + G)`` and ``nu = (3 K - 2 G) / (2 (3 K + G))`` on every axis.
    """
    E = 9.0 * K * G / (3.0 * K + G)
    nu = (3.0 * K - 2.0 * G) / (2.0 * (3.0 * K + G))
    return ElasticConstants(E1=E, E2=E, E3=E, G12=G, G13=G, G23=G, nu12=nu, nu13=nu, nu23=nu,
                            alpha1=alpha, alpha2=alpha, alpha3=alpha, model=model, source=source,
                            extra={"K": K, "G": G})


def has_cte(f: FibrePhase, m: MatrixPhase) -> bool:
    """Whether both phases carry thermal expansion coefficients."""
    return f.alpha1 is not None and f.alpha2 is not None and m.alpha is not None
