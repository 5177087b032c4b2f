"""Thermal expansion of fibre composites: Schapery's estimates and Levin's exact relation.

* :func:`schapery` - the energy-based estimates of Schapery (1968) for continuous fibres, in the
  usual form for a transversely isotropic fibre (axial CTE weighted by E1; transverse CTE from the
  volume change less the axial Poisson contraction).
* :func:`levin` - Levin's (1967) exact relation for two isotropic phases: the effective CTE of a
  statistically isotropic two-phase composite is fixed by its effective bulk modulus,
  ``alpha* = <alpha> + (alpha_f - alpha_m) / (1/K_f - 1/K_m) (1/K* - <1/K>)``; being monotone in
  ``1/K*``, the Hashin-Shtrikman bounds on K give bounds on alpha (Rosen and Hashin 1970).
* :func:`levin_fibre` - the same uniform-field relation for aligned fibres with transversely
  isotropic phases, from the effective compliance (Rosen and Hashin 1970; Benveniste and Dvorak
  1990).

References
----------
.. [1] Schapery, R. A. (1968). Thermal expansion coefficients of composite materials based on
   energy principles. *J. Compos. Mater.* 2(3), 380-404.
.. [2] Levin, V. M. (1967). On the coefficients of thermal expansion of heterogeneous materials.
   *Mech. Solids* 2, 58-61.
.. [3] Rosen, B. W., Hashin, Z. (1970). Effective thermal expansion coefficients and specific
   heats of composite materials. *Int. J. Eng. Sci.* 8, 157-173.
.. [4] Benveniste, Y., Dvorak, G. J. (1990). On a correspondence between mechanical and thermal
   effects in two-phase composites. In *Micromechanics and Inhomogeneity*, Springer, 65-81.
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.homogenize import _common as cm
from micromech.homogenize import walpole as W

__all__ = ["schapery", "levin", "levin_fibre"]

Array = NDArray[np.float64]

SCHAPERY_SOURCE = "Schapery (1968), J. Compos. Mater. 2, 380-404 (alpha1, alpha2)"


def _need_cte(f: Any, m: Any, who: str) -> None:
    if not cm.has_cte(f, m):
        raise InputError(
            f"{who}: needs the CTEs of both phases (fibre alpha1, alpha2; matrix alpha); "
            f"fibre alpha1 = {f.alpha1!r}, matrix alpha = {m.alpha!r}"
        )


def schapery(fibre: Any, matrix: Any, vf: ArrayLike) -> tuple[Array, Array]:
    """Schapery's (1968) axial and transverse CTE of a unidirectional composite.

    ``alpha1 = (E1f alpha1f vf + Em alpham vm) / (E1f vf + Em vm)`` and
    ``alpha2 = (alpha2f + nu12f alpha1f) vf + (1 + num) alpham vm - alpha1 nu12`` with
    ``nu12 = nu12f vf + num vm``. For an isotropic fibre the second reads
    ``(1 + nuf) alphaf vf + (1 + num) alpham vm - alpha1 nu12``, Schapery's form.

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre with alpha1, alpha2 (1/K).
    matrix : MatrixPhase or material
        Matrix with alpha (1/K).
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].

    Returns
    -------
    alpha1, alpha2 : ndarray, shape (...)
        Axial and transverse CTE, 1/K.

    Raises
    ------
    InputError
        If a CTE is missing.
    FractionError
        If vf is outside [0, 1].

    References
    ----------
    Schapery (1968), the expressions for alpha_1 and alpha_2 (isotropic phases); the
    transversely isotropic fibre form as given by e.g. Hyer, M. W. (1998), *Stress Analysis of
    Fiber-Reinforced Composite Materials*, McGraw-Hill, Ch. 3 (from memory).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> f = FibrePhase.isotropic(72e9, 0.22, 5e-6)
    >>> a1, a2 = schapery(f, MatrixPhase(3.5e9, 0.35, 60e-6), 0.6)
    >>> round(float(a1) * 1e6, 3)
    6.726
    """
    f, m = cm.phases(fibre, matrix)
    _need_cte(f, m, "schapery")
    c = cm.fraction(vf)
    cm_ = 1.0 - c
    af1, af2, am = f.alpha1, f.alpha2, m.alpha
    stiff = f.E1 * c + m.E * cm_
    a1 = (f.E1 * af1 * c + m.E * am * cm_) / stiff  # type: ignore[operator]
    nu12 = f.nu12 * c + m.nu * cm_
    a2 = (af2 + f.nu12 * af1) * c + (1.0 + m.nu) * am * cm_ - a1 * nu12  # type: ignore[operator]
    return np.asarray(a1), np.asarray(a2)


def levin(
    K_f: ArrayLike, K_m: ArrayLike, alpha_f: ArrayLike, alpha_m: ArrayLike, vf: ArrayLike,
    K_eff: ArrayLike,
) -> Array:
    """Levin's exact CTE of a statistically isotropic two-phase composite from its bulk modulus.

    Parameters
    ----------
    K_f, K_m : array_like, shape (...)
        Bulk moduli of the phases, Pa.
    alpha_f, alpha_m : array_like, shape (...)
        CTEs of the phases, 1/K.
    vf : array_like, shape (...)
        Volume fraction of phase f, in [0, 1].
    K_eff : array_like, shape (...)
        Effective bulk modulus (an estimate or a bound), Pa.

    Returns
    -------
    ndarray, shape (...)
        Effective CTE, 1/K; the volume average where the bulk moduli are equal.

    References
    ----------
    Levin (1967); Rosen and Hashin (1970), Eq. 4.8 form for isotropic phases (from memory).

    Examples
    --------
    >>> round(float(levin(40e9, 4e9, 5e-6, 60e-6, 0.3, 6.5e9)) * 1e6, 3)
    36.496
    """
    Kf, Km, af, am, c, Ke = (np.asarray(x, dtype=np.float64)
                             for x in (K_f, K_m, alpha_f, alpha_m, vf, K_eff))
    c = cm.fraction(c)
    d = 1.0 / Kf - 1.0 / Km
    mean_inv = c / Kf + (1.0 - c) / Km
    ok = np.abs(d) > 1e-12 * (1.0 / Kf + 1.0 / Km)
    factor = np.where(ok, (1.0 / Ke - mean_inv) / np.where(ok, d, 1.0), 0.0)
    return np.asarray(c * af + (1.0 - c) * am + (af - am) * factor)


def levin_fibre(
    S_eff: W.TI, fibre: Any, matrix: Any, vf: ArrayLike
) -> tuple[Array, Array]:
    """Exact two-phase CTE of an aligned-fibre composite from its effective compliance.

    Parameters
    ----------
    S_eff : walpole.TI
        Effective compliance, transversely isotropic about the fibre axis (1/Pa).
    fibre : FibrePhase or material
        Fibre with alpha1, alpha2.
    matrix : MatrixPhase or material
        Matrix with alpha.
    vf : array_like, shape (...)
        Fibre fraction, in [0, 1].

    Returns
    -------
    alpha1, alpha2 : ndarray, shape (...)
        Axial and transverse CTE, 1/K.

    Raises
    ------
    InputError
        If a CTE is missing.

    References
    ----------
    Levin (1967); Rosen and Hashin (1970); Benveniste and Dvorak (1990).
    """
    f, m = cm.phases(fibre, matrix)
    _need_cte(f, m, "levin_fibre")
    c = cm.fraction(vf)
    return cm.levin_block(
        S_eff, W.inv(cm.fibre_tensor(f)), W.inv(cm.matrix_tensor(m)), c,
        f.alpha1, f.alpha2, m.alpha, m.alpha,  # type: ignore[arg-type]
    )
