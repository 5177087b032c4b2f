"""Rule of mixtures and inverse rule of mixtures for unidirectional continuous fibres.

``E1`` and ``nu12`` follow the rule of mixtures (equal axial strain in both phases, Voigt 1889);
``E2``, ``G12`` and ``G23`` the inverse rule of mixtures (equal stress, Reuss 1929); ``nu23`` is
the transversely isotropic value ``E2 / (2 G23) - 1``. The CTEs are Schapery's (1968).

References
----------
.. [1] Voigt, W. (1889). Ueber die Beziehung zwischen den beiden Elasticitaetsconstanten
   isotroper Koerper. *Ann. Phys.* 274, 573-587.
.. [2] Reuss, A. (1929). Berechnung der Fliessgrenze von Mischkristallen auf Grund der
   Plastizitaetsbedingung fuer Einkristalle. *Z. Angew. Math. Mech.* 9, 49-58.
.. [3] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 3.2 (Eqs. 3.9, 3.13, 3.18, 3.27 in the mechanics-of-materials approach; from memory).
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.homogenize import _common as cm
from micromech.homogenize.thermal import schapery
from micromech.results import ElasticConstants

__all__ = ["rule_of_mixtures", "mix", "inverse_mix"]

Array = NDArray[np.float64]

SOURCE = ("rule of mixtures (Voigt 1889) for E1, nu12; inverse rule of mixtures (Reuss 1929) for "
          "E2, G12, G23; CTE Schapery (1968)")


def mix(vf: ArrayLike, value_f: ArrayLike, value_m: ArrayLike) -> Array:
    """Return the rule of mixtures ``vf X_f + (1 - vf) X_m``.

    Parameters
    ----------
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    value_f, value_m : array_like, shape (...)
        Fibre and matrix values.

    Returns
    -------
    ndarray, shape (...)
        The volume average.

    References
    ----------
    Voigt (1889): uniform strain.

    Examples
    --------
    >>> float(mix(0.25, 8.0, 4.0))
    5.0
    """
    return np.asarray(_mix(cm.fraction(vf), np.asarray(value_f, float), np.asarray(value_m, float)))


def inverse_mix(vf: ArrayLike, value_f: ArrayLike, value_m: ArrayLike) -> Array:
    """Return the inverse rule of mixtures ``1 / (vf / X_f + (1 - vf) / X_m)``.

    Parameters
    ----------
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    value_f, value_m : array_like, shape (...)
        Fibre and matrix values (positive).

    Returns
    -------
    ndarray, shape (...)
        The harmonic volume average.

    References
    ----------
    Reuss (1929): uniform stress.

    Examples
    --------
    >>> float(inverse_mix(0.5, 2.0, 6.0))
    3.0
    """
    return np.asarray(
        _inverse_mix(cm.fraction(vf), np.asarray(value_f, float), np.asarray(value_m, float)))


def _mix(c: Array, xf: Array, xm: Array) -> Array:
    return c * xf + (1.0 - c) * xm


def _inverse_mix(c: Array, xf: Array, xm: Array) -> Array:
    return 1.0 / (c / xf + (1.0 - c) / xm)


def rule_of_mixtures(fibre: Any, matrix: Any, vf: ArrayLike) -> ElasticConstants:
    """Rule of mixtures (E1, nu12) and inverse rule of mixtures (E2, G12, G23).

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre, transversely isotropic about axis 1 (isotropic allowed).
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].

    Returns
    -------
    ElasticConstants
        Transversely isotropic about axis 1; alpha1, alpha2 by Schapery (1968) when both phases
        have CTEs.

    Raises
    ------
    FractionError
        If vf is outside [0, 1].

    References
    ----------
    Voigt (1889); Reuss (1929); Jones (1999), Sec. 3.2.

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> r = rule_of_mixtures(FibrePhase.isotropic(85e9, 0.2), MatrixPhase(3.4e9, 0.3), 0.7)
    >>> round(float(r.E1) / 1e9, 2), round(float(r.E2) / 1e9, 2)
    (60.52, 10.37)
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    Gm = m.G
    alpha = schapery(f, m, c) if cm.has_cte(f, m) else (None, None)
    return ElasticConstants.transversely_isotropic(
        _mix(c, f.E1, m.E), _inverse_mix(c, f.E2, m.E), _mix(c, f.nu12, m.nu),
        _inverse_mix(c, f.G12, Gm), _inverse_mix(c, f.G23, Gm),
        alpha1=alpha[0], alpha2=alpha[1], model="rule_of_mixtures", source=SOURCE,
    )
