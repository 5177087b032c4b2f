"""Chamis' simplified micromechanics equations for unidirectional continuous fibres.

    E11 = vf Ef11 + vm Em
    E22 = Em / (1 - sqrt(vf) (1 - Em / Ef22))
    G12 = Gm / (1 - sqrt(vf) (1 - Gm / Gf12))
    G23 = Gm / (1 - sqrt(vf) (1 - Gm / Gf23))
    nu12 = vf nuf12 + vm num,   nu23 = E22 / (2 G23) - 1
    alpha11 = (vf alphaf11 Ef11 + vm alpham Em) / E11
    alpha22 = alphaf22 sqrt(vf) + (1 - sqrt(vf)) (1 + vf num Ef11 / E11) alpham

The square-root terms come from a square-packed fibre of side sqrt(vf) in a unit cell.

References
----------
.. [1] Chamis, C. C. (1983). Simplified composite micromechanics equations for hygral, thermal
   and mechanical properties. NASA TM-83320 (also *SAMPE Quarterly* 15(3), 14-23, 1984); the
   equations as recalled from the report's table of micromechanics equations (from memory).
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.homogenize import _common as cm
from micromech.results import ElasticConstants

__all__ = ["chamis"]

Array = NDArray[np.float64]

SOURCE = "Chamis (1983/1984), NASA TM-83320, simplified micromechanics equations"


def chamis(fibre: Any, matrix: Any, vf: ArrayLike) -> ElasticConstants:
    """Chamis' simplified equations for unidirectional continuous fibres.

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
        Transversely isotropic about axis 1, with CTEs when both phases have them.

    References
    ----------
    Chamis (1983), NASA TM-83320.

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> r = chamis(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.6)
    >>> round(float(r.E2) / 1e9, 3)
    13.305
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    s = np.sqrt(c)
    d = 1.0 - c
    E1 = c * f.E1 + d * m.E
    E2 = m.E / (1.0 - s * (1.0 - m.E / f.E2))
    Gm = m.G
    G12 = Gm / (1.0 - s * (1.0 - Gm / f.G12))
    G23 = Gm / (1.0 - s * (1.0 - Gm / f.G23))
    nu12 = c * f.nu12 + d * m.nu
    a1 = a2 = None
    if cm.has_cte(f, m):
        a1 = (c * f.alpha1 * f.E1 + d * m.alpha * m.E) / E1  # type: ignore[operator]
        a2 = f.alpha2 * s + (1.0 - s) * (1.0 + c * m.nu * f.E1 / E1) * m.alpha  # type: ignore[operator]
    return ElasticConstants.transversely_isotropic(
        E1, E2, nu12, G12, G23, alpha1=a1, alpha2=a2, model="chamis", source=SOURCE,
    )
