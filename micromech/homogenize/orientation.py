"""Orientation averages of transversely isotropic tensors (random short fibres).

A tensor transversely isotropic about a fibre axis ``n`` (Walpole components, see
:mod:`.walpole`) averaged over all directions ``n`` in space is isotropic; averaged over all
directions in a plane it is transversely isotropic about the plane's normal. Both averages are
linear in the six components, so each is a constant 6x6 map applied component-wise: no per-point
matrices.

* 3D random: ``<T> = alpha J + beta K`` with ``alpha = J :: T`` and ``beta = (K :: T) / 5``;
  in components ``alpha = (2c + d + sqrt2 (e + f)) / 3`` and
  ``beta = (c + d + 2g + 2h - alpha) / 5`` (the traces of the basis tensors are 1, 1, 0, 0, 2, 2).
* in-plane random: the map is built once from the basis tensors, averaged exactly over the
  angle (the rotated components are trigonometric polynomials of degree 4, so 16 equally spaced
  angles integrate them exactly).

References
----------
.. [1] Walpole, L. J. (1981). Elastic behavior of composite materials: theoretical foundations.
   *Advances in Applied Mechanics* 21, 169-242, Sec. 3 (basis) and Sec. 5 (isotropic projections).
.. [2] Benveniste, Y. (1987). A new approach to the application of Mori-Tanaka's theory in
   composite materials. *Mech. Mater.* 6, 147-157 (orientation averages of the concentration
   tensors).
.. [3] Advani, S. G., Tucker, C. L. (1987). The use of tensors to describe and predict fiber
   orientation in short fiber composites. *J. Rheol.* 31, 751-784.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from micromech.errors import InputError
from micromech.homogenize import walpole as W
from micromech.shapes import ORIENTATIONS

__all__ = ["ORIENTATIONS", "average", "average_3d", "average_planar", "basis_tensors",
           "check_orientation_name", "project"]

Array = NDArray[np.float64]



def check_orientation_name(orientation: str) -> str:
    """Return ``orientation`` if it is one of :data:`ORIENTATIONS`.

    Parameters
    ----------
    orientation : str
        The name to check.

    Returns
    -------
    str
        The name.

    Raises
    ------
    InputError
        For any other name.
    """
    if orientation not in ORIENTATIONS:
        raise InputError(
            f"orientation = {orientation!r}: expected one of {', '.join(ORIENTATIONS)}"
        )
    return orientation


def average(T: W.TI, orientation: str) -> W.TI:
    """Average a tensor over the fibre directions of an orientation (``aligned``: T itself).

    Parameters
    ----------
    T : walpole.TI
        Tensor transversely isotropic about the fibre axis.
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Fibre orientation (see :func:`average_planar` and :func:`average_3d` for the axes).

    Returns
    -------
    walpole.TI
        The averaged tensor.

    References
    ----------
    Advani and Tucker (1987); Walpole (1981), Sec. 3 and 5.
    """
    if orientation == "random_3d":
        return average_3d(T)
    if orientation == "random_in_plane":
        return average_planar(T)
    return T


def basis_tensors(n: Array) -> Array:
    """Return Walpole's six basis tensors about the unit axis ``n`` as full arrays.

    Parameters
    ----------
    n : ndarray, shape (3,)
        Unit vector.

    Returns
    -------
    ndarray, shape (6, 3, 3, 3, 3)
        E1 ... E6.
    """
    n = np.asarray(n, dtype=np.float64)
    nn = np.outer(n, n)
    th = np.eye(3) - nn
    E1 = 0.5 * np.einsum("ij,kl->ijkl", th, th)
    E2 = np.einsum("ij,kl->ijkl", nn, nn)
    E3 = np.einsum("ij,kl->ijkl", th, nn) / W.SQ2
    E4 = np.einsum("ij,kl->ijkl", nn, th) / W.SQ2
    E5 = 0.5 * (np.einsum("ik,jl->ijkl", th, th) + np.einsum("il,jk->ijkl", th, th)) - E1
    E6 = 0.5 * (
        np.einsum("ik,jl->ijkl", th, nn) + np.einsum("il,jk->ijkl", th, nn)
        + np.einsum("jk,il->ijkl", th, nn) + np.einsum("jl,ik->ijkl", th, nn)
    )
    return np.stack([E1, E2, E3, E4, E5, E6])


def project(T: Array) -> Array:
    """Read the Walpole components about axis 1 (x) of a full tensor transversely isotropic there.

    Parameters
    ----------
    T : ndarray, shape (..., 3, 3, 3, 3)
        Tensor.

    Returns
    -------
    ndarray, shape (..., 6)
        ``(c, d, e, f, g, h)``.
    """
    return np.stack([
        T[..., 1, 1, 1, 1] + T[..., 1, 1, 2, 2],
        T[..., 0, 0, 0, 0],
        W.SQ2 * T[..., 1, 1, 0, 0],
        W.SQ2 * T[..., 0, 0, 1, 1],
        T[..., 1, 1, 1, 1] - T[..., 1, 1, 2, 2],
        2.0 * T[..., 0, 1, 0, 1],
    ], axis=-1)


@lru_cache(maxsize=1)
def _planar_map() -> Array:
    """Constant 6x6 map: components about n (in the plane x = 0) -> average, about x."""
    phis = np.arange(16) * (2.0 * np.pi / 16)
    acc = np.zeros((6, 3, 3, 3, 3))
    for phi in phis:
        acc += basis_tensors(np.array([0.0, np.cos(phi), np.sin(phi)]))
    acc /= len(phis)
    return project(acc).T  # column j = average of basis tensor j


def average_planar(T: W.TI) -> W.TI:
    """Average a tensor (axis n) over all fibre directions n in the 2-3 plane of the map's frame.

    The result is transversely isotropic about the plane's normal; its Walpole components are
    returned with that normal as the axis.

    Parameters
    ----------
    T : walpole.TI
        Tensor transversely isotropic about the fibre axis.

    Returns
    -------
    walpole.TI
        The in-plane average, axis = normal of the plane.

    References
    ----------
    Advani and Tucker (1987) (orientation averaging); Walpole (1981), Sec. 3 (the basis).
    """
    M = _planar_map()
    comps = tuple(T)
    out = []
    for i in range(6):
        acc = 0.0 * comps[0]
        for j in range(6):
            if M[i, j] != 0.0:
                acc = acc + M[i, j] * comps[j]
        out.append(np.asarray(acc, dtype=np.float64))
    return W.TI(*out)


def average_3d(T: W.TI) -> W.TI:
    """Average a tensor over all fibre directions in space (isotropic result).

    Parameters
    ----------
    T : walpole.TI
        Tensor transversely isotropic about the fibre axis.

    Returns
    -------
    walpole.TI
        ``alpha J + beta K`` in Walpole components (valid about any axis).

    References
    ----------
    Walpole (1981), Sec. 5 (isotropic projections); Advani and Tucker (1987).
    """
    alpha = (2.0 * T.c + T.d + W.SQ2 * (T.e + T.f)) / 3.0
    beta = (T.c + T.d + 2.0 * T.g + 2.0 * T.h - alpha) / 5.0
    return W.TI(
        (2.0 * alpha + beta) / 3.0, (alpha + 2.0 * beta) / 3.0,
        W.SQ2 * (alpha - beta) / 3.0, W.SQ2 * (alpha - beta) / 3.0, beta, beta,
    )
