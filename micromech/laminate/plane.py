"""Ply-level plane-stress algebra: reduced stiffness Q, transformations, Q-bar, ply CTEs.

Angles are measured from the laminate x axis towards y (counter-clockwise about z), in degrees.
In-plane vectors are ordered (x, y, xy) or (1, 2, 12) with engineering shear strain. Every
function broadcasts over leading axes.

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press: Eq. (2.93)
   (reduced stiffness), Eqs. (2.94)-(2.104) (transformation, Q-bar), Eq. (2.176) (ply CTEs in
   laminate axes). Equation numbers are cited from memory; check them against the edition at
   hand.
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.6 (plane stress, off-axis lamina).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

__all__ = [
    "reduced_stiffness",
    "stress_transformation",
    "strain_transformation",
    "transformed_reduced_stiffness",
    "transformed_expansion",
]

Array = NDArray[np.float64]


def _f(x: ArrayLike) -> Array:
    return np.asarray(x, dtype=np.float64)


def reduced_stiffness(E1: ArrayLike, E2: ArrayLike, nu12: ArrayLike, G12: ArrayLike) -> Array:
    """Plane-stress reduced stiffness Q of an orthotropic ply in its material axes.

    Parameters
    ----------
    E1, E2 : array_like, shape (...)
        Young's moduli along and across the fibres, Pa.
    nu12 : array_like, shape (...)
        Major Poisson ratio.
    G12 : array_like, shape (...)
        In-plane shear modulus, Pa.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        Q in the order 11, 22, 12, Pa: Q11 = E1 / (1 - nu12 nu21), Q12 = nu12 E2 / (1 - nu12
        nu21), Q22 = E2 / (1 - nu12 nu21), Q66 = G12, with nu21 = nu12 E2 / E1.

    References
    ----------
    Kaw (2006), Eq. (2.93); Jones (1999), Sec. 2.6.

    Examples
    --------
    >>> Q = reduced_stiffness(181e9, 10.3e9, 0.28, 7.17e9)
    >>> round(float(Q[0, 1]) / 1e9, 3)
    2.897
    """
    E1, E2, nu12, G12 = np.broadcast_arrays(_f(E1), _f(E2), _f(nu12), _f(G12))
    d = 1.0 - nu12 * nu12 * E2 / E1
    Q = np.zeros(E1.shape + (3, 3))
    Q[..., 0, 0] = E1 / d
    Q[..., 1, 1] = E2 / d
    Q[..., 0, 1] = Q[..., 1, 0] = nu12 * E2 / d
    Q[..., 2, 2] = G12
    return Q


def _cos_sin(angle: ArrayLike) -> tuple[Array, Array]:
    """Cosine and sine of an angle in degrees, exactly 0 at multiples of 90 degrees."""
    a = np.deg2rad(_f(angle))
    c, s = np.cos(a), np.sin(a)
    return np.where(np.abs(c) < 1e-15, 0.0, c), np.where(np.abs(s) < 1e-15, 0.0, s)


def _rotation(angle: ArrayLike, k: float) -> Array:
    """[[c^2, s^2, k cs], [s^2, c^2, -k cs], [-2cs/k, 2cs/k, c^2 - s^2]].

    k = 2 for stresses (tensor shear), k = 1 for strains (engineering shear, gamma = 2 eps).
    """
    c, s = _cos_sin(angle)
    cs = c * s
    return np.stack([
        np.stack([c * c, s * s, k * cs], -1),
        np.stack([s * s, c * c, -k * cs], -1),
        np.stack([-2.0 / k * cs, 2.0 / k * cs, c * c - s * s], -1),
    ], -2)


def stress_transformation(angle: ArrayLike) -> Array:
    """Matrix T that takes in-plane stresses from laminate to ply axes: sigma_12 = T sigma_xy.

    Parameters
    ----------
    angle : array_like, shape (...)
        Fibre angle from x towards y, degrees.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        [[c^2, s^2, 2cs], [s^2, c^2, -2cs], [-cs, cs, c^2 - s^2]]; its inverse is T(-angle).

    References
    ----------
    Kaw (2006), Eq. (2.94).
    """
    return _rotation(angle, 2.0)


def strain_transformation(angle: ArrayLike) -> Array:
    """Matrix that takes engineering strains from laminate to ply axes: eps_12 = T_e eps_xy.

    Parameters
    ----------
    angle : array_like, shape (...)
        Fibre angle from x towards y, degrees.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        [[c^2, s^2, cs], [s^2, c^2, -cs], [-2cs, 2cs, c^2 - s^2]] (= R T R^-1, R = diag(1, 1, 2)).

    References
    ----------
    Kaw (2006), Eq. (2.98).
    """
    return _rotation(angle, 1.0)


def transformed_reduced_stiffness(Q: ArrayLike, angle: ArrayLike) -> Array:
    """Compute the transformed reduced stiffness Q-bar of a ply at an angle, in laminate axes.

    Parameters
    ----------
    Q : array_like, shape (..., 3, 3)
        Reduced stiffness in material axes, Pa.
    angle : array_like, shape (...)
        Fibre angle from x towards y, degrees.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        Q-bar = T(-angle) Q T_e(angle), Pa: sigma_xy = Q-bar eps_xy.

    References
    ----------
    Kaw (2006), Eqs. (2.103)-(2.104); Jones (1999), Sec. 2.6.

    Examples
    --------
    >>> Qb = transformed_reduced_stiffness(reduced_stiffness(181e9, 10.3e9, 0.28, 7.17e9), 60.0)
    >>> round(float(Qb[0, 0]) / 1e9, 2)
    23.65
    """
    angle = _f(angle)
    return stress_transformation(-angle) @ _f(Q) @ strain_transformation(angle)


def transformed_expansion(alpha: ArrayLike, angle: ArrayLike) -> Array:
    """Thermal expansion of a ply in laminate axes (alpha_x, alpha_y, alpha_xy).

    Parameters
    ----------
    alpha : array_like, shape (..., 3)
        (alpha1, alpha2, 0) in material axes, 1/K.
    angle : array_like, shape (...)
        Fibre angle, degrees.

    Returns
    -------
    ndarray, shape (..., 3)
        alpha_x = a1 c^2 + a2 s^2, alpha_y = a1 s^2 + a2 c^2, alpha_xy = 2 (a1 - a2) c s
        (engineering shear strain per kelvin).

    References
    ----------
    Kaw (2006), Eq. (2.176).
    """
    Te_inv = strain_transformation(-_f(angle))
    return np.einsum("...ij,...j->...i", Te_inv, _f(alpha))
