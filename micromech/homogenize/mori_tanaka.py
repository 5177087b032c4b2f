"""Mori-Tanaka estimate for aligned or randomly oriented spheroids, in Benveniste's form.

With the matrix (0) as reference, the dilute strain concentration of the inclusions (1) is

    A1 = [I + P : (C1 - C0)]^-1                     (Benveniste 1987, Eq. 9)

with Hill's polarisation tensor ``P = S : C0^-1`` of the spheroid (S the Eshelby tensor of the
isotropic matrix, :mod:`.eshelby`), and the Mori-Tanaka stiffness is

    C* = (c0 C0 + c1 C1 : A1) : (c0 I + c1 A1)^-1   (Benveniste 1987, Eq. 23)

For aligned inclusions every tensor is transversely isotropic about the inclusion axis, so the
whole estimate is closed-form algebra on Walpole's six components (:mod:`.walpole`), broadcast
over the fibre fraction and the constituent constants. Spherical voids enter as a third phase
with zero stiffness (Benveniste 1987, Eq. 23 with three phases).

For randomly oriented short fibres (in plane or in space) the aligned Mori-Tanaka stiffness and
its thermal stress tensor are averaged over the orientations (Advani and Tucker 1987; the scheme
Tucker and Liang 1999 found most accurate). We do not average the concentration tensors inside
Benveniste's formula: for in-plane random spheroids that gives a stiffness that is not symmetric
(Benveniste, Dvorak and Chen 1991), which is no admissible elastic tensor.

For continuous fibres Mori-Tanaka reproduces the composite cylinder assemblage's E1, nu12, k23
and G12 and Hashin's lower bound on G23; for spheres it equals the Hashin-Shtrikman lower bound
when the matrix is the more compliant phase (Weng 1984; Benveniste 1987).

Thermal expansion follows from the effective compliance by Levin's exact two-phase relation
(Levin 1967; Rosen and Hashin 1970), so it is consistent with the elastic estimate.

References
----------
.. [1] Mori, T., Tanaka, K. (1973). Average stress in matrix and average elastic energy of
   materials with misfitting inclusions. *Acta Metall.* 21, 571-574.
.. [2] Benveniste, Y. (1987). A new approach to the application of Mori-Tanaka's theory in
   composite materials. *Mech. Mater.* 6, 147-157.
.. [3] Weng, G. J. (1984). Some elastic properties of reinforced solids, with special reference
   to isotropic ones containing spherical inclusions. *Int. J. Eng. Sci.* 22, 845-856.
.. [4] Tandon, G. P., Weng, G. J. (1984). *Polym. Compos.* 5, 327-333 (aligned spheroids).
.. [5] Advani, S. G., Tucker, C. L. (1987). The use of tensors to describe and predict fiber
   orientation in short fiber composites. *J. Rheol.* 31, 751-784.
.. [6] Tucker, C. L., Liang, E. (1999). Stiffness predictions for unidirectional short-fiber
   composites: review and evaluation. *Compos. Sci. Technol.* 59, 655-671.
.. [7] Benveniste, Y., Dvorak, G. J., Chen, T. (1991). On diagonal and elastic symmetry of the
   approximate effective stiffness tensor of heterogeneous media. *J. Mech. Phys. Solids* 39,
   927-946.
"""

from __future__ import annotations

from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.homogenize import _common as cm
from micromech.homogenize import walpole as W
from micromech.homogenize.eshelby import dilute_concentration, polarization
from micromech.homogenize.orientation import ORIENTATIONS, average, check_orientation_name
from micromech.results import ElasticConstants
from micromech.shapes import INCLUSIONS

__all__ = ["mori_tanaka", "INCLUSIONS", "ORIENTATIONS", "inclusion_aspect_ratio"]

Array = NDArray[np.float64]


RANDOM_SOURCE = "; orientation average of the aligned stiffness and thermal stress (Advani & " \
    "Tucker 1987; Tucker & Liang 1999)"
SOURCE = "Mori & Tanaka (1973) in Benveniste's (1987) form, Eq. 23; Eshelby tensor after " \
    "Tandon & Weng (1984); CTE by Levin (1967)"


def inclusion_aspect_ratio(inclusion: str, aspect_ratio: ArrayLike | None) -> Array | None:
    """Check an inclusion name and its aspect ratio; return the aspect ratio (None = cylinder).

    Parameters
    ----------
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape.
    aspect_ratio : array_like or None
        Length over diameter; needed (> 0) for a spheroid, None or 1 for a sphere, None for
        continuous fibres.

    Returns
    -------
    ndarray or None
        The aspect ratio, or None for a continuous cylinder.

    Raises
    ------
    InputError
        For an unknown inclusion or an aspect ratio that does not fit it.
    """
    if inclusion not in INCLUSIONS:
        raise InputError(
            f"inclusion = {inclusion!r}: expected one of {', '.join(INCLUSIONS)}"
        )
    if inclusion == "continuous":
        if aspect_ratio is not None and not np.all(np.isinf(np.asarray(aspect_ratio, float))):
            raise InputError(
                f"aspect_ratio = {aspect_ratio!r} is given for continuous fibres; use "
                "inclusion = 'spheroid' for short fibres"
            )
        return None
    if inclusion == "sphere":
        if aspect_ratio is not None and not np.all(np.asarray(aspect_ratio, float) == 1.0):
            raise InputError(f"aspect_ratio = {aspect_ratio!r}: a sphere has aspect ratio 1")
        return np.asarray(1.0)
    if aspect_ratio is None:
        raise InputError("aspect_ratio = None: a spheroid inclusion needs an aspect ratio > 0")
    a = np.asarray(aspect_ratio, dtype=np.float64)
    if np.any(~(a > 0.0)):
        raise InputError(f"aspect_ratio = {aspect_ratio!r}: must be positive")
    return a


def mori_tanaka(
    fibre: Any,
    matrix: Any,
    vf: ArrayLike,
    inclusion: Literal["continuous", "spheroid", "sphere"] = "continuous",
    aspect_ratio: ArrayLike | None = None,
    *,
    orientation: Literal["aligned", "random_in_plane", "random_3d"] = "aligned",
    void_fraction: ArrayLike = 0.0,
) -> ElasticConstants:
    """Mori-Tanaka estimate of a matrix with spheroidal (or continuous) inclusions.

    Parameters
    ----------
    fibre : FibrePhase or material
        Inclusion phase, transversely isotropic about its axis (isotropic allowed).
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Inclusion volume fraction of the composite, in [0, 1].
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape.
    aspect_ratio : array_like, shape (...), optional
        Length over diameter of a spheroid (> 0; < 1 oblate).
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Aligned along axis 1, random in the 1-2 plane, or random in space.
    void_fraction : array_like, shape (...)
        Volume fraction of spherical voids; the matrix fraction is 1 - vf - void_fraction.

    Returns
    -------
    ElasticConstants
        Arrays of the broadcast shape. Aligned: transversely isotropic about axis 1 (``extra``
        holds ``k23``). Random in plane: E1 = E2 in the plane, E3 across it. Random in space:
        isotropic. CTEs when both phases have them and there are no voids.

    Raises
    ------
    FractionError
        If a fraction is outside [0, 1] or vf + void_fraction > 1.
    InputError
        For an unknown inclusion or orientation, or a bad aspect ratio.
    InvalidMaterialError
        For inadmissible constituent constants.

    References
    ----------
    Mori and Tanaka (1973); Benveniste (1987), Eqs. 9 and 23; Tandon and Weng (1984).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> r = mori_tanaka(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.6)
    >>> round(float(r.E1) / 1e9, 2)  # rule of mixtures 44.60 plus the Poisson term
    44.62
    """
    check_orientation_name(orientation)
    ar = inclusion_aspect_ratio(inclusion, aspect_ratio)
    f, m = cm.phases(fibre, matrix)
    c1, cv, has_voids = cm.void_fractions(vf, void_fraction)

    C0 = cm.matrix_tensor(m)
    C1 = cm.fibre_tensor(f)
    K0, G0 = m.K, m.G
    P = polarization(K0, G0, ar)
    A1 = dilute_concentration(P, C1, C0)
    B1 = W.dot(C1, A1)

    if has_voids:
        c0 = 1.0 - c1 - cv
        num = W.add(W.scale(C0, c0), W.scale(B1, c1))
        den = W.TI(c0 + c1 * A1.c, c0 + c1 * A1.d, c1 * A1.e, c1 * A1.f, c0 + c1 * A1.g,
                   c0 + c1 * A1.h)
        Pv = polarization(K0, G0, 1.0)
        Av = W.inv(W.sub(W.identity(), W.dot(Pv, C0)))
        den = W.add(den, W.scale(Av, cv))
    else:
        # c0 = 1 - c1: num = C0 + c1 (C1 A1 - C0), den = I + c1 (A1 - I); the differences are
        # per phase, so each component costs one multiply-add over the fractions
        dB = W.sub(B1, C0)
        dA = W.sub(A1, W.identity())
        num = W.TI(*(x + c1 * y for x, y in zip(C0, dB, strict=True)))
        den = W.TI(1.0 + c1 * dA.c, 1.0 + c1 * dA.d, c1 * dA.e, c1 * dA.f, 1.0 + c1 * dA.g,
                   1.0 + c1 * dA.h)
    # compliance S = den : num^-1 = (c0 I + c1 A1) : (c0 C0 + c1 C1 A1)^-1, with the 2x2 block
    # inverse written out (adjugate over determinant)
    det = num.c * num.d - num.e * num.f
    S = W.TI(
        (den.c * num.d - den.e * num.f) / det,
        (den.d * num.c - den.f * num.e) / det,
        (den.e * num.c - den.c * num.e) / det,
        (den.f * num.d - den.d * num.f) / det,
        den.g / num.g,
        den.h / num.h,
    )
    del num, den, det

    alpha = None
    if cm.has_cte(f, m) and not has_voids:
        alpha = cm.levin_block(
            S, W.inv(C1), W.inv(C0), c1, f.alpha1, f.alpha2, m.alpha, m.alpha,  # type: ignore[arg-type]
        )
    if orientation == "aligned":
        return cm.ti_result(None, model="mori_tanaka", source=SOURCE, alpha=alpha, S=S)
    return _random_result(W.inv(S), orientation, alpha)


def _random_result(
    C_aligned: W.TI, orientation: str, alpha: tuple[Array, Array] | None
) -> ElasticConstants:
    """Orientation average of the aligned stiffness (and thermal stress), as constants.

    The averaged tensor is transversely isotropic about the plane normal (in-plane random, the
    normal is axis 3) or isotropic (random in space).
    """
    C = average(C_aligned, orientation)
    a_avg = None
    if alpha is not None:
        # thermal stress beta = C : alpha of the aligned composite, averaged; alpha = <C>^-1 <beta>
        t0, t1 = cm.thermal_vector(alpha[0], alpha[1])
        b0 = C_aligned.c * t0 + C_aligned.e * t1  # transverse part (theta / sqrt2 component)
        b1 = C_aligned.f * t0 + C_aligned.d * t1  # axial part
        bt, ba = b0 / W.SQ2, b1
        if orientation == "random_3d":
            bt = ba = (2.0 * bt + ba) / 3.0
        else:
            bt, ba = 0.5 * (bt + ba), bt  # in-plane, normal
        x0, x1 = cm.solve_block(C, W.SQ2 * bt, ba)
        a_avg = (x0 / W.SQ2, x1)  # in-plane, normal
    return cm.normal_result(W.inv(C), orientation, model="mori_tanaka",
                            source=SOURCE + RANDOM_SOURCE, alpha=a_avg)
