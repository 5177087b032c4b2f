"""Halpin-Tsai equations with the Halpin-Kardos shape factors.

    M / M_m = (1 + xi eta vf) / (1 - eta vf),   eta = (M_f / M_m - 1) / (M_f / M_m + xi)

(Halpin and Kardos 1976, Eqs. 1-2). The factor ``xi`` interpolates between the inverse rule of
mixtures (``xi = 0``) and the rule of mixtures (``xi -> inf``); the formula returns the matrix at
``vf = 0`` and the fibre at ``vf = 1`` for every ``xi``. Halpin and Kardos recommend, for
circular fibres: ``xi = 2`` for E2, ``xi = 1`` for G12 and, for short fibres of length l and
diameter d, ``xi = 2 l / d`` for E1 (continuous fibres: the rule of mixtures for E1 and nu12).
With ``xi = 1`` the G12 formula coincides with the composite cylinder assemblage's G12 and with
the Hashin lower bound (a classical identity, checked in the tests).

The equations give in-plane constants only: G23 and nu23 are not returned (None), because the
Halpin-Tsai E2 with xi = 2 and any consistent G23 would fix a nu23 that can leave the admissible
range for stiff fibres.

References
----------
.. [1] Halpin, J. C., Kardos, J. L. (1976). The Halpin-Tsai equations: a review. *Polym. Eng.
   Sci.* 16(5), 344-352.
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Sec. 3.5 (from memory).
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.homogenize import _common as cm
from micromech.results import ElasticConstants

__all__ = ["halpin_tsai", "halpin_tsai_modulus"]

Array = NDArray[np.float64]

SOURCE = "Halpin & Kardos (1976), Polym. Eng. Sci. 16, 344-352, Eqs. 1-2 with their shape factors"


def _check_xi(xi: Any, name: str) -> Array:
    x = np.asarray(xi, dtype=np.float64)
    if np.any(~(x >= 0.0)):
        raise InputError(f"{name} = {xi!r}: the Halpin-Tsai factor must be >= 0 (0 gives the "
                         "inverse rule of mixtures)")
    return x


def halpin_tsai_modulus(
    M_f: ArrayLike, M_m: ArrayLike, vf: ArrayLike, xi: ArrayLike
) -> Array:
    """Halpin-Tsai modulus ``M_m (1 + xi eta vf) / (1 - eta vf)``.

    Parameters
    ----------
    M_f, M_m : array_like, shape (...)
        Fibre and matrix modulus, Pa (positive).
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    xi : array_like, shape (...)
        Shape factor, >= 0 (``inf`` gives the rule of mixtures).

    Returns
    -------
    ndarray, shape (...)
        The modulus, Pa.

    Raises
    ------
    InputError
        If xi is negative.

    References
    ----------
    Halpin and Kardos (1976), Eqs. 1-2.

    Examples
    --------
    >>> round(float(halpin_tsai_modulus(85e9, 3.4e9, 0.6, 2.0)) / 1e9, 3)
    15.057
    """
    c = cm.fraction(vf)
    x = _check_xi(xi, "xi")
    Mf = np.asarray(M_f, dtype=np.float64)
    Mm = np.asarray(M_m, dtype=np.float64)
    r = Mf / Mm
    with np.errstate(invalid="ignore"):
        eta = np.where(np.isinf(x), 0.0, (r - 1.0) / (r + np.where(np.isinf(x), 0.0, x)))
        ht = Mm * (1.0 + x * eta * c) / (1.0 - eta * c)
        rom = c * Mf + (1.0 - c) * Mm
    return np.asarray(np.where(np.isinf(x), rom, ht))


def halpin_tsai(
    fibre: Any,
    matrix: Any,
    vf: ArrayLike,
    *,
    aspect_ratio: ArrayLike | None = None,
    xi_E1: ArrayLike | None = None,
    xi_E2: ArrayLike = 2.0,
    xi_G12: ArrayLike = 1.0,
) -> ElasticConstants:
    """Halpin-Tsai estimate of aligned continuous or short fibres.

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre (E1, E2, G12 used), transversely isotropic about axis 1.
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    aspect_ratio : array_like, shape (...), optional
        Length over diameter of short fibres (>= 1); None for continuous fibres.
    xi_E1 : array_like, optional
        Factor for E1; default ``2 l / d`` for short fibres, the rule of mixtures for continuous
        ones.
    xi_E2, xi_G12 : array_like
        Factors for E2 (default 2) and G12 (default 1).

    Returns
    -------
    ElasticConstants
        E1, E2 (= E3), nu12 (= nu13, rule of mixtures), G12 (= G13); G23 and nu23 None.

    Raises
    ------
    InputError
        If a factor is negative or the aspect ratio is below 1.

    References
    ----------
    Halpin and Kardos (1976).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> r = halpin_tsai(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.6)
    >>> round(float(r.E2) / 1e9, 3), round(float(r.G12) / 1e9, 3)
    (14.887, 4.459)
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    if aspect_ratio is not None:
        ar = np.asarray(aspect_ratio, dtype=np.float64)
        if np.any(~(ar >= 1.0)):
            raise InputError(
                f"aspect_ratio = {aspect_ratio!r}: the Halpin-Kardos factor 2 l/d is for fibres "
                "with l/d >= 1"
            )
        xi1 = 2.0 * ar if xi_E1 is None else xi_E1
    else:
        xi1 = np.inf if xi_E1 is None else xi_E1
    E1 = halpin_tsai_modulus(f.E1, m.E, c, _check_xi(xi1, "xi_E1"))
    E2 = halpin_tsai_modulus(f.E2, m.E, c, _check_xi(xi_E2, "xi_E2"))
    G12 = halpin_tsai_modulus(f.G12, m.G, c, _check_xi(xi_G12, "xi_G12"))
    nu12 = c * f.nu12 + (1.0 - c) * m.nu
    return ElasticConstants(
        E1=E1, E2=E2, E3=E2, G12=G12, G13=G12, nu12=nu12, nu13=nu12,
        model="halpin_tsai", source=SOURCE,
        extra={"xi_E1": np.asarray(xi1, dtype=np.float64), "xi_E2": np.asarray(xi_E2, float),
               "xi_G12": np.asarray(xi_G12, float)},
    )
