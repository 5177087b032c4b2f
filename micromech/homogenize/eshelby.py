"""Eshelby tensor of a spheroid in an isotropic matrix, in closed form.

The spheroid's symmetry axis is axis 1 and its aspect ratio is ``a = a1 / a2`` (length over
diameter): ``a > 1`` prolate (short fibre), ``a = 1`` sphere, ``a < 1`` oblate (platelet),
``a = inf`` a continuous circular cylinder. The components are those of Tandon and Weng (1984,
Appendix), equivalent to Mura (1987, Eq. 11.22) for a spheroid, rewritten here with

    g = a / (a^2 - 1)^(3/2) [a (a^2 - 1)^(1/2) - arccosh a]         (prolate)
    g = a / (1 - a^2)^(3/2) [arccos a - a (1 - a^2)^(1/2)]          (oblate)
    t = a^2 - 1,  w = g - 2/3,  q = w / t

so that no component divides by ``t``: each ``(1 - nu) S_ijkl`` is ``A + B nu + (C + D nu) w +
E q``. Near the sphere (|t| < 1/4) ``q`` comes from the power series of ``g`` about ``t = 0``
(derived here from the series of ``arcsinh``), so the tensor is smooth and accurate through
``a = 1``; at ``a = 1`` it is the sphere's tensor, and as ``a -> inf`` it tends to the
cylinder's (``q -> 0``, ``w -> 1/3``).

References
----------
.. [1] Eshelby, J. D. (1957). The determination of the elastic field of an ellipsoidal inclusion,
   and related problems. *Proc. R. Soc. Lond. A* 241, 376-396.
.. [2] Mura, T. (1987). *Micromechanics of Defects in Solids*, 2nd ed., Martinus Nijhoff,
   Sec. 11 (Eqs. 11.21-11.22: sphere, cylinder, spheroid).
.. [3] Tandon, G. P., Weng, G. J. (1984). The effect of aspect ratio of inclusions on the elastic
   properties of unidirectionally aligned composites. *Polym. Compos.* 5(4), 327-333, Appendix.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.homogenize import walpole as W

__all__ = [
    "eshelby_components",
    "eshelby_spheroid",
    "eshelby_sphere",
    "eshelby_cylinder",
    "polarization",
    "dilute_concentration",
    "shape_function",
]

Array = NDArray[np.float64]

_SERIES_T = 0.25  # |t| below which q comes from the power series about the sphere
_SERIES_TERMS = 40
_AR_CAP = 1e100  # aspect ratios above this are evaluated as this (a continuous fibre to 1e-200)


def _series_coefficients(n: int) -> Array:
    """Coefficients c_k (k >= 2) of h(t) = sum_k c_k t^(k-1), g = a h(t)."""
    out = np.empty(n)
    binom_over_4k = 1.0  # C(2k, k) / 4^k, updated by the ratio (2k - 1) / (2k)
    for k in range(1, n + 2):
        binom_over_4k *= (2 * k - 1) / (2 * k)
        if k >= 2:
            out[k - 2] = (-1) ** (k - 1) * binom_over_4k * 4 * k / ((2 * k - 1) * (2 * k + 1))
    return out


_H1 = _series_coefficients(_SERIES_TERMS)  # h1(t) = (h(t) - 2/3) / t = sum _H1[j] t^j


def _check_aspect_ratio(aspect_ratio: ArrayLike) -> Array:
    a = np.asarray(aspect_ratio, dtype=np.float64)
    bad = ~(a > 0.0) | np.isnan(a)
    if np.any(bad):
        first = float(np.asarray(a)[bad][0]) if a.ndim else float(a)
        raise InputError(f"aspect_ratio = {first!r}: must be positive (length / diameter > 0)")
    return a


def shape_function(aspect_ratio: ArrayLike) -> tuple[Array, Array]:
    """Return the shape functions ``w = g - 2/3`` and ``q = w / (a^2 - 1)`` of a spheroid.

    Parameters
    ----------
    aspect_ratio : array_like, shape (...)
        Length over diameter ``a1 / a2`` (``inf`` for a continuous cylinder).

    Returns
    -------
    w, q : ndarray, shape (...)
        Smooth functions of the aspect ratio; sphere: ``w = 0``, ``q = 2/15``; cylinder:
        ``w = 1/3``, ``q = 0``.

    Raises
    ------
    InputError
        If an aspect ratio is not positive.

    References
    ----------
    Tandon and Weng (1984), Appendix (the function g); Mura (1987), Eq. 11.22.
    """
    a = np.minimum(_check_aspect_ratio(aspect_ratio), _AR_CAP)
    t = (a - 1.0) * (a + 1.0)
    near = np.abs(t) < _SERIES_T
    with np.errstate(invalid="ignore", divide="ignore"):
        # closed forms away from the sphere
        tp = np.where(t > 0.0, t, 1.0)
        tn = np.where(t < 0.0, -t, 1.0)
        rtp = np.sqrt(tp)
        g_pro = a / (tp * rtp) * (a * rtp - np.arcsinh(rtp))
        ac = np.minimum(a, 1.0)
        rtn = np.sqrt(tn)
        g_obl = a / (tn * rtn) * (np.arccos(ac) - ac * rtn)
        g = np.where(t > 0.0, g_pro, g_obl)
        w_far = g - 2.0 / 3.0
        q_far = w_far / np.where(near, 1.0, t)
    # power series about the sphere: q = a h1(t) + (2/3) / (1 + a)
    ts = np.where(near, t, 0.0)
    h1 = np.zeros_like(ts)
    for c in _H1[::-1]:
        h1 = h1 * ts + c
    q_near = a * h1 + (2.0 / 3.0) / (1.0 + a)
    q = np.where(near, q_near, q_far)
    w = np.where(near, q_near * ts, w_far)
    return np.asarray(w), np.asarray(q)


def eshelby_components(nu: ArrayLike, aspect_ratio: ArrayLike) -> dict[str, Array]:
    """Independent components of the Eshelby tensor of a spheroid (axis 1) in an isotropic matrix.

    Parameters
    ----------
    nu : array_like, shape (...)
        Poisson ratio of the matrix.
    aspect_ratio : array_like, shape (...)
        Length over diameter (``inf`` for a continuous cylinder).

    Returns
    -------
    dict of str to ndarray
        ``S1111, S2222 (= S3333), S2233, S2211 (= S3311), S1122 (= S1133), S2323, S1212``.

    References
    ----------
    Tandon and Weng (1984), Appendix; Mura (1987), Eq. 11.22 (rewritten without 1/(a^2 - 1)).

    Examples
    --------
    >>> s = eshelby_components(0.3, 1.0)
    >>> round(float(s["S1111"]), 12) == round((7 - 5 * 0.3) / (15 * 0.7), 12)
    True
    """
    nu = np.asarray(nu, dtype=np.float64)
    w, q = shape_function(aspect_ratio)
    r = 1.0 / (1.0 - nu)
    return {
        "S1111": r * (2.0 / 3.0 - nu / 3.0 + (nu - 2.0) * w - 1.5 * q),
        "S2222": r * (13.0 / 24.0 - nu / 3.0 + (0.25 - 0.5 * nu) * w - 9.0 / 16.0 * q),
        "S2233": r * (-1.0 / 24.0 + nu / 3.0 + (0.5 * nu - 0.25) * w - 3.0 / 16.0 * q),
        "S2211": r * (-1.0 / 6.0 + nu / 3.0 + 0.5 * (1.0 + nu) * w + 0.75 * q),
        "S1122": r * (-1.0 / 6.0 + nu / 3.0 + (0.5 - nu) * w + 0.75 * q),
        "S2323": r * (7.0 / 24.0 - nu / 3.0 + (0.25 - 0.5 * nu) * w - 3.0 / 16.0 * q),
        "S1212": r * (1.0 / 6.0 - nu / 3.0 + 0.25 * (1.0 + nu) * w + 0.75 * q),
    }


def eshelby_spheroid(nu: ArrayLike, aspect_ratio: ArrayLike) -> W.TI:
    """Eshelby tensor of a spheroid in Walpole components (see :mod:`.walpole`).

    Parameters
    ----------
    nu : array_like, shape (...)
        Poisson ratio of the matrix.
    aspect_ratio : array_like, shape (...)
        Length over diameter (``inf`` for a continuous cylinder).

    Returns
    -------
    walpole.TI
        ``(S2222 + S2233, S1111, sqrt2 S2211, sqrt2 S1122, S2222 - S2233, 2 S1212)``.

    References
    ----------
    Tandon and Weng (1984), Appendix; Walpole (1981), Sec. 3 for the basis.
    """
    s = eshelby_components(nu, aspect_ratio)
    return W.TI(
        s["S2222"] + s["S2233"],
        s["S1111"],
        W.SQ2 * s["S2211"],
        W.SQ2 * s["S1122"],
        s["S2222"] - s["S2233"],
        2.0 * s["S1212"],
    )


def eshelby_sphere(nu: ArrayLike) -> W.TI:
    """Eshelby tensor of a sphere: ``(1 + nu) / (3 (1 - nu)) J + 2 (4 - 5 nu) / (15 (1 - nu)) K``.

    Parameters
    ----------
    nu : array_like, shape (...)
        Poisson ratio of the matrix.

    Returns
    -------
    walpole.TI
        The tensor.

    References
    ----------
    Eshelby (1957); Mura (1987), Eq. 11.21.

    Examples
    --------
    >>> [round(float(x), 6) for x in eshelby_sphere(0.3)]
    [0.571429, 0.52381, 0.067344, 0.067344, 0.47619, 0.47619]
    """
    nu = np.asarray(nu, dtype=np.float64)
    a = (1.0 + nu) / (3.0 * (1.0 - nu))
    b = 2.0 * (4.0 - 5.0 * nu) / (15.0 * (1.0 - nu))
    return W.TI(
        (2.0 * a + b) / 3.0, (a + 2.0 * b) / 3.0, W.SQ2 * (a - b) / 3.0, W.SQ2 * (a - b) / 3.0,
        b, b,
    )


def eshelby_cylinder(nu: ArrayLike) -> W.TI:
    """Eshelby tensor of a continuous circular cylinder along axis 1.

    Parameters
    ----------
    nu : array_like, shape (...)
        Poisson ratio of the matrix.

    Returns
    -------
    walpole.TI
        ``(1/(2(1-nu)), 0, sqrt2 nu/(2(1-nu)), 0, (3-4nu)/(4(1-nu)), 1/2)``: S2222 = S3333 =
        (5 - 4 nu)/(8 (1 - nu)), S2233 = (4 nu - 1)/(8 (1 - nu)), S2211 = nu/(2 (1 - nu)),
        S2323 = (3 - 4 nu)/(8 (1 - nu)), S1212 = 1/4, S11kl = 0.

    References
    ----------
    Mura (1987), Eq. 11.22 with a1 -> infinity.

    Examples
    --------
    >>> [round(float(x), 6) for x in eshelby_cylinder(0.25)]
    [0.666667, 0.0, 0.235702, 0.0, 0.666667, 0.5]
    """
    nu = np.asarray(nu, dtype=np.float64)
    r = 1.0 / (1.0 - nu)
    z = np.zeros_like(r)
    return W.TI(0.5 * r, z, W.SQ2 * 0.5 * nu * r, z, (0.75 - nu) * r, 0.5 + z)


def polarization(K0: ArrayLike, G0: ArrayLike, aspect_ratio: ArrayLike | None) -> W.TI:
    """Hill's polarisation tensor ``P = S : C0^-1`` of a spheroid in an isotropic medium.

    Parameters
    ----------
    K0, G0 : array_like, shape (...)
        Bulk and shear moduli of the medium, Pa.
    aspect_ratio : array_like or None, shape (...)
        Length over diameter; ``None`` or ``inf`` for a continuous cylinder, 1 for a sphere.

    Returns
    -------
    walpole.TI
        P in 1/Pa.

    References
    ----------
    Hill, R. (1965). A self-consistent mechanics of composite materials. *J. Mech. Phys. Solids*
    13, 213-222 (the tensor P); Walpole (1981), Sec. 3.
    """
    K0 = np.asarray(K0, dtype=np.float64)
    G0 = np.asarray(G0, dtype=np.float64)
    nu0 = (3.0 * K0 - 2.0 * G0) / (2.0 * (3.0 * K0 + G0))
    if aspect_ratio is None:
        S = eshelby_cylinder(nu0)
    else:
        S = eshelby_spheroid(nu0, aspect_ratio)
    return W.dot(S, W.inv(W.isotropic(K0, G0)))


def dilute_concentration(P: W.TI, C: W.TI, C0: W.TI) -> W.TI:
    """Strain concentration ``[I + P : (C - C0)]^-1`` of one inclusion in a reference medium.

    Parameters
    ----------
    P : walpole.TI
        Polarisation tensor of the inclusion shape in the medium (:func:`polarization`), 1/Pa.
    C, C0 : walpole.TI
        Stiffness of the inclusion and of the medium, Pa.

    Returns
    -------
    walpole.TI
        The dilute strain concentration tensor (dimensionless).

    References
    ----------
    Eshelby (1957); Hill (1965) (see :func:`polarization`); Benveniste, Y. (1987). A new
    approach to the application of Mori-Tanaka's theory in composite materials. *Mech. Mater.*
    6, 147-157, Eq. 9.
    """
    return W.inv(W.add(W.identity(), W.dot(P, W.sub(C, C0))))
