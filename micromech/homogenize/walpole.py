"""Closed-form algebra of transversely isotropic fourth-order tensors (Walpole's basis).

A fourth-order tensor with the minor symmetries that is transversely isotropic about a unit axis
``n`` is a combination of six basis tensors (Walpole 1981, Sec. 3; Walpole 1969):

* ``E1 = 1/2 theta (x) theta`` (transverse dilatation; ``theta = delta - n n``),
* ``E2 = n n (x) n n`` (axial extension),
* ``E3 = 1/sqrt(2) theta (x) n n`` and ``E4 = 1/sqrt(2) n n (x) theta`` (couplings),
* ``E5`` (transverse deviatoric shear) and ``E6`` (axial shear).

We store a tensor as its six components ``(c, d, e, f, g, h)``. Products and inverses reduce to
the 2x2 matrix ``[[c, e], [f, d]]`` and the two scalars ``g``, ``h``, so every operation is a
handful of element-wise array operations: no ``(N, 6, 6)`` temporaries.

In Hill's moduli (Hill 1964) a stiffness is ``(2k, n, sqrt(2) l, sqrt(2) l, 2m, 2p)``: k the
plane-strain bulk modulus, n = C11, l = C12, m = G23 and p = G12. An isotropic stiffness is
``3K J + 2G K`` with ``J = (2/3, 1/3, sqrt2/3, sqrt2/3, 0, 0)`` and ``K = I - J``.

References
----------
.. [1] Walpole, L. J. (1981). Elastic behavior of composite materials: theoretical foundations.
   *Advances in Applied Mechanics* 21, 169-242, Sec. 3 (the transversely isotropic basis).
.. [2] Hill, R. (1964). Theory of mechanical properties of fibre-strengthened materials: I.
   Elastic behaviour. *J. Mech. Phys. Solids* 12, 199-212 (the moduli k, l, n, m, p).
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from numpy.typing import ArrayLike, NDArray

__all__ = [
    "TI",
    "ti",
    "identity",
    "isotropic",
    "from_engineering",
    "from_hill",
    "to_engineering",
    "engineering_from_compliance",
    "hill_moduli",
    "add",
    "sub",
    "scale",
    "dot",
    "inv",
    "to_voigt",
    "from_voigt",
    "SQ2",
]

Array = NDArray[np.float64]
SQ2 = float(np.sqrt(2.0))


class TI(NamedTuple):
    """Components ``(c, d, e, f, g, h)`` of a transversely isotropic tensor (Walpole 1981).

    Attributes
    ----------
    c, d, e, f, g, h : ndarray or float, shape (...)
        Components on the basis E1 ... E6 (stiffness in Pa, compliance in 1/Pa,
        concentration and Eshelby tensors dimensionless).
    """

    c: Array
    d: Array
    e: Array
    f: Array
    g: Array
    h: Array


def ti(c: ArrayLike, d: ArrayLike, e: ArrayLike, f: ArrayLike, g: ArrayLike, h: ArrayLike) -> TI:
    """Build a :class:`TI` from six array-likes (converted to float arrays).

    Parameters
    ----------
    c, d, e, f, g, h : array_like, shape (...)
        Walpole components.

    Returns
    -------
    TI
        The tensor.
    """
    return TI(*(np.asarray(v, dtype=np.float64) for v in (c, d, e, f, g, h)))


def identity() -> TI:
    """Return the symmetric fourth-order identity, ``(1, 1, 0, 0, 1, 1)``.

    Returns
    -------
    TI
        The identity.
    """
    return ti(1.0, 1.0, 0.0, 0.0, 1.0, 1.0)


def isotropic(K: ArrayLike, G: ArrayLike) -> TI:
    """Return the isotropic stiffness ``3K J + 2G K`` in Walpole components.

    Parameters
    ----------
    K, G : array_like, shape (...)
        Bulk and shear moduli, Pa.

    Returns
    -------
    TI
        ``(2K + 2G/3, K + 4G/3, sqrt2 (K - 2G/3), sqrt2 (K - 2G/3), 2G, 2G)``.
    """
    K = np.asarray(K, dtype=np.float64)
    G = np.asarray(G, dtype=np.float64)
    lam = K - (2.0 / 3.0) * G
    return TI(2.0 * K + (2.0 / 3.0) * G, K + (4.0 / 3.0) * G, SQ2 * lam, SQ2 * lam, 2.0 * G,
              2.0 * G)


def from_hill(k: ArrayLike, l: ArrayLike, n: ArrayLike, m: ArrayLike, p: ArrayLike) -> TI:
    """Return the stiffness with Hill's moduli k, l, n, m, p.

    Parameters
    ----------
    k, l, n, m, p : array_like, shape (...)
        Plane-strain bulk modulus, C12, C11, G23 and G12, Pa.

    Returns
    -------
    TI
        ``(2k, n, sqrt2 l, sqrt2 l, 2m, 2p)``.
    """
    k, l, n, m, p = (np.asarray(v, dtype=np.float64) for v in (k, l, n, m, p))
    return TI(2.0 * k, n, SQ2 * l, SQ2 * l, 2.0 * m, 2.0 * p)


def hill_moduli(C: TI) -> dict[str, Array]:
    """Read Hill's moduli of a (symmetric) stiffness.

    Parameters
    ----------
    C : TI
        Stiffness.

    Returns
    -------
    dict of str to ndarray
        ``k, l, n, m, p`` in Pa (l from the mean of the two coupling components).
    """
    return {
        "k": C.c / 2.0,
        "l": (C.e + C.f) / (2.0 * SQ2),
        "n": C.d,
        "m": C.g / 2.0,
        "p": C.h / 2.0,
    }


def from_engineering(
    E1: ArrayLike, E2: ArrayLike, nu12: ArrayLike, G12: ArrayLike, nu23: ArrayLike
) -> TI:
    """Return the stiffness of a transversely isotropic material (axis 1) in closed form.

    Parameters
    ----------
    E1, E2 : array_like, shape (...)
        Axial and transverse Young's moduli, Pa.
    nu12, nu23 : array_like, shape (...)
        Axial and transverse Poisson ratios.
    G12 : array_like, shape (...)
        Axial shear modulus, Pa.

    Returns
    -------
    TI
        The stiffness (inverse of the compliance ``((1 - nu23)/E2, 1/E1, -sqrt2 nu12/E1,
        -sqrt2 nu12/E1, (1 + nu23)/E2, 1/(2 G12))``).
    """
    E1, E2, nu12, G12, nu23 = (np.asarray(v, dtype=np.float64) for v in (E1, E2, nu12, G12, nu23))
    s = TI((1.0 - nu23) / E2, 1.0 / E1, -SQ2 * nu12 / E1, -SQ2 * nu12 / E1, (1.0 + nu23) / E2,
           0.5 / G12)
    return inv(s)


def to_engineering(C: TI) -> dict[str, Array]:
    """Engineering constants of a stiffness transversely isotropic about axis 1.

    Parameters
    ----------
    C : TI
        Stiffness, Pa.

    Returns
    -------
    dict of str to ndarray
        ``E1, E2, G12, G23`` (Pa), ``nu12, nu23`` and ``k23`` (plane-strain bulk modulus, Pa).
        For a non-symmetric C, nu12 is -eps22/eps11 under axial stress.
    """
    return {**engineering_from_compliance(inv(C)), "k23": C.c / 2.0}


def engineering_from_compliance(S: TI) -> dict[str, Array]:
    """Engineering constants of a compliance transversely isotropic about axis 1.

    Parameters
    ----------
    S : TI
        Compliance, 1/Pa.

    Returns
    -------
    dict of str to ndarray
        ``E1, E2, G12, G23`` (Pa), ``nu12, nu23``: ``E1 = 1/d``, ``E2 = 2/(c + g)``,
        ``nu12 = -e E1 / sqrt2``, ``G12 = 1/(2h)``, ``G23 = 1/(2g)``, ``nu23 = (g - c)/(g + c)``.
    """
    tr = S.c + S.g
    E1 = 1.0 / S.d
    return {
        "E1": E1,
        "E2": 2.0 / tr,
        "nu12": -S.e / SQ2 * E1,
        "G12": 0.5 / S.h,
        "G23": 0.5 / S.g,
        "nu23": (S.g - S.c) / tr,
    }


def add(A: TI, B: TI) -> TI:
    """Return the sum A + B.

    Parameters
    ----------
    A, B : TI
        Tensors.

    Returns
    -------
    TI
        Component-wise sum.
    """
    return TI(*(a + b for a, b in zip(A, B, strict=True)))


def sub(A: TI, B: TI) -> TI:
    """Return the difference A - B.

    Parameters
    ----------
    A, B : TI
        Tensors.

    Returns
    -------
    TI
        Component-wise difference.
    """
    return TI(*(a - b for a, b in zip(A, B, strict=True)))


def scale(A: TI, s: ArrayLike) -> TI:
    """Return s A for a scalar field s.

    Parameters
    ----------
    A : TI
        Tensor.
    s : array_like, shape (...)
        Factor.

    Returns
    -------
    TI
        Scaled tensor.
    """
    s = np.asarray(s, dtype=np.float64)
    return TI(*(s * a for a in A))


def dot(A: TI, B: TI) -> TI:
    """Return the double contraction ``A : B`` (Walpole 1981, Eq. 3.6).

    Parameters
    ----------
    A, B : TI
        Tensors.

    Returns
    -------
    TI
        The product: the 2x2 blocks ``[[c, e], [f, d]]`` multiply as matrices, g and h as scalars.
    """
    return TI(
        A.c * B.c + A.e * B.f,
        A.f * B.e + A.d * B.d,
        A.c * B.e + A.e * B.d,
        A.f * B.c + A.d * B.f,
        A.g * B.g,
        A.h * B.h,
    )


def inv(A: TI) -> TI:
    """Return the inverse of A in closed form.

    Parameters
    ----------
    A : TI
        An invertible tensor.

    Returns
    -------
    TI
        ``A^-1``.
    """
    det = A.c * A.d - A.e * A.f
    return TI(A.d / det, A.c / det, -A.e / det, -A.f / det, 1.0 / A.g, 1.0 / A.h)


def to_voigt(C: TI) -> Array:
    """Return the 6x6 Voigt stiffness (engineering shear, axis 1 the symmetry axis).

    For checks and for the public 6x6 boundary only; not used on hot paths.

    Parameters
    ----------
    C : TI
        A stiffness.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Voigt matrix in the order 11, 22, 33, 23, 13, 12.
    """
    shape = np.broadcast_shapes(*(np.shape(v) for v in C))
    c, d, e, f, g, h = (np.broadcast_to(v, shape) for v in C)
    M = np.zeros(shape + (6, 6))
    M[..., 0, 0] = d
    M[..., 0, 1] = M[..., 0, 2] = f / SQ2
    M[..., 1, 0] = M[..., 2, 0] = e / SQ2
    M[..., 1, 1] = M[..., 2, 2] = 0.5 * (c + g)
    M[..., 1, 2] = M[..., 2, 1] = 0.5 * (c - g)
    M[..., 3, 3] = 0.5 * g
    M[..., 4, 4] = M[..., 5, 5] = 0.5 * h
    return M


def from_voigt(M: ArrayLike) -> TI:
    """Project a 6x6 Voigt stiffness onto its transversely isotropic part about axis 1.

    Parameters
    ----------
    M : array_like, shape (..., 6, 6)
        Voigt stiffness (engineering shear).

    Returns
    -------
    TI
        Components read as ``c = C22 + C23``, ``d = C11``, ``e = sqrt2 C21``, ``f = sqrt2 C12``,
        ``g = C22 - C23`` and ``h = 2 C66`` (averaged over the equivalent entries).
    """
    M = np.asarray(M, dtype=np.float64)
    c22 = 0.5 * (M[..., 1, 1] + M[..., 2, 2])
    c23 = 0.5 * (M[..., 1, 2] + M[..., 2, 1])
    return TI(
        c22 + c23,
        M[..., 0, 0],
        SQ2 * 0.5 * (M[..., 1, 0] + M[..., 2, 0]),
        SQ2 * 0.5 * (M[..., 0, 1] + M[..., 0, 2]),
        c22 - c23,
        M[..., 4, 4] + M[..., 5, 5],
    )
