"""Composite cylinder assemblage (Hashin and Rosen 1964) for aligned continuous fibres.

The assemblage of coated cylinders (fibre core, matrix coating, the same fibre fraction in each)
gives exact values of the plane-strain bulk modulus k23, E1, nu12 and G12 for transversely
isotropic fibres (Hashin 1979 for anisotropic phases):

    k23 = k_m + vf / (1/(k_f - k_m) + vm/(k_m + G_m))                     (Hashin-Rosen 1964)
    G12 = G_m (G_f (1 + vf) + G_m vm) / (G_f vm + G_m (1 + vf))
    E1  = vf E_f + vm E_m + 4 vf vm (nu_f - nu_m)^2 / (vf/k_m + vm/k_f + 1/G_m)
    nu12 = vf nu_f + vm nu_m + vf vm (nu_f - nu_m)(1/k_m - 1/k_f) / (vf/k_m + vm/k_f + 1/G_m)

evaluated here in the equivalent Hashin-Shtrikman form with the matrix moduli as reference, which
has no division by k_f - k_m. The last term of E1 is the Poisson-mismatch gain over the rule of
mixtures (always >= 0).

The assemblage does not determine G23 (only bounds it). Our documented choice: G23 is Hashin's
(1965) bound with the matrix as the reference medium,
``G23 = G_m + vf / (1/(G23f - G_m) + vm (k_m + 2 G_m) / (2 G_m (k_m + G_m)))``, which is the lower
bound when the matrix is the softer phase and equals Mori-Tanaka's G23. nu23 and E2 follow from
the transversely isotropic relations; the CTEs from Levin's exact relation applied to the
assemblage's compliance.

References
----------
.. [1] Hashin, Z., Rosen, B. W. (1964). The elastic moduli of fiber-reinforced materials.
   *J. Appl. Mech.* 31, 223-232.
.. [2] Hashin, Z. (1965). *J. Mech. Phys. Solids* 13, 119-134 (bounds on G23).
.. [3] Hashin, Z. (1979). Analysis of properties of fiber composites with anisotropic
   constituents. *J. Appl. Mech.* 46, 543-550.
"""

from __future__ import annotations

from typing import Any

from numpy.typing import ArrayLike

from micromech.homogenize import _common as cm
from micromech.homogenize import walpole as W
from micromech.homogenize.bounds import fibre_reference_form, reference_stiffness
from micromech.homogenize.thermal import levin_fibre
from micromech.results import ElasticConstants

__all__ = ["cylinders"]

SOURCE = ("Hashin & Rosen (1964) composite cylinder assemblage (E1, nu12, k23, G12); G23 from "
          "Hashin (1965) with the matrix as reference; CTE by Levin (1967)")


def cylinders(fibre: Any, matrix: Any, vf: ArrayLike) -> ElasticConstants:
    """Composite cylinder assemblage estimate for aligned continuous fibres.

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre, transversely isotropic about axis 1.
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].

    Returns
    -------
    ElasticConstants
        Transversely isotropic about axis 1; ``extra`` holds k23.

    References
    ----------
    Hashin and Rosen (1964); Hashin (1965, 1979).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> r = cylinders(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.6)
    >>> round(float(r.G12) / 1e9, 4)
    4.4587
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    C = reference_stiffness(fibre_reference_form(f, m, c, m.G, m.k23, m.G))
    S = W.inv(C)
    alpha = levin_fibre(S, f, m, c) if cm.has_cte(f, m) else None
    return cm.ti_result(C, model="cylinders", source=SOURCE, alpha=alpha, S=S)
