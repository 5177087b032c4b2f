"""Effective 3D constants of a periodic stack of layers by exact layer averaging.

Layers are normal to z. In a periodic stack under uniform macroscopic strain, the in-plane
strains (xx, yy, xy) are the same in every layer and the out-of-plane stresses (zz, yz, xz) are
continuous, hence also the same in every layer. Writing each layer's stiffness in the mixed form

    sigma_p = A_k eps_p + B_k sigma_q,        eps_q = -B_k^T eps_p + E_k sigma_q

with p = (xx, yy, xy), q = (zz, yz, xz), A_k = C_pp - C_pq C_qq^-1 C_qp (the plane-stress
reduced stiffness), B_k = C_pq C_qq^-1 and E_k = C_qq^-1, the thickness averages <A>, <B>, <E>
are exact, and the effective stiffness follows by inverting the averaged mixed form:

    C_qq = <E>^-1,  C_qp = <E>^-1 <B>^T,  C_pq = <B> <E>^-1,  C_pp = <A> + <B> <E>^-1 <B>^T.

The in-plane block of the effective compliance is <A>^-1, i.e. the restrained in-plane
constants of classical laminate theory, exactly.

References
----------
.. [1] Pagano, N. J. (1974). Exact moduli of anisotropic laminates. In: Sendeckyj, G. P. (ed.),
   *Composite Materials*, Vol. 2, *Mechanics of Composite Materials*, Academic Press, 23-44.
.. [2] Sun, C. T., Li, S. (1988). Three-dimensional effective elastic constants for thick
   laminates. *Journal of Composite Materials* 22, 629-639.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech import tensors
from micromech.errors import FractionError, InputError
from micromech.results import ElasticConstants

__all__ = ["IN_PLANE", "OUT_OF_PLANE", "plane_stress_reduce", "stack_constants", "StackResult"]

Array = NDArray[np.float64]

#: Voigt indices of the in-plane components xx, yy, xy.
IN_PLANE = np.array([0, 1, 5])
#: Voigt indices of the out-of-plane components zz, yz, xz.
OUT_OF_PLANE = np.array([2, 3, 4])

STACK_SOURCE = (
    "exact layer averaging of a periodic stack: Pagano (1974), Exact moduli of anisotropic "
    "laminates; Sun and Li (1988), J. Compos. Mater. 22:629-639"
)


def _blocks(C: Array) -> tuple[Array, Array, Array, Array]:
    p, q = IN_PLANE, OUT_OF_PLANE
    return (C[..., p[:, None], p], C[..., p[:, None], q], C[..., q[:, None], p],
            C[..., q[:, None], q])


def plane_stress_reduce(C: ArrayLike) -> Array:
    """Reduce a 6x6 stiffness to plane stress in the xy plane (sigma_zz = tau_yz = tau_xz = 0).

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Stiffness in Voigt order xx, yy, zz, yz, xz, xy, Pa.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        C_pp - C_pq C_qq^-1 C_qp in the order xx, yy, xy, Pa. For a ply this is Q-bar.

    References
    ----------
    Jones (1999), Sec. 2.5 (plane stress); Sun and Li (1988).
    """
    Cpp, Cpq, Cqp, Cqq = _blocks(np.asarray(C, dtype=np.float64))
    return np.asarray(Cpp - Cpq @ np.linalg.solve(Cqq, Cqp), dtype=np.float64)


@dataclass(frozen=True, eq=False)
class StackResult:
    """Effective 3D constants and stiffness of a periodic stack.

    Attributes
    ----------
    constants : ElasticConstants
        E1 = Ex, E2 = Ey, E3 = Ez, G12 = Gxy, G13 = Gxz, G23 = Gyz, nu12 = nuxy, nu13 = nuxz,
        nu23 = nuyz, with ``model="stack"``. For stacks with off-axis plies the material is
        monoclinic; these are the apparent constants under uniaxial stress (couplings ignored;
        the full matrix is in ``stiffness``).
    stiffness : ndarray, shape (..., 6, 6)
        Effective stiffness in laminate axes, Pa.
    """

    constants: ElasticConstants
    stiffness: Array

    @property
    def compliance(self) -> Array:
        """Effective compliance, 1/Pa, shape (..., 6, 6)."""
        return np.asarray(np.linalg.inv(self.stiffness), dtype=np.float64)

    def as_dict(self) -> dict[str, object]:
        """Return the JSON form: Ex, Ey, Ez, Gxy, Gxz, Gyz, nuxy, nuxz, nuyz (SI).

        Returns
        -------
        dict
            The nine constants (floats or nested lists).
        """
        c = self.constants
        pairs = {"Ex": c.E1, "Ey": c.E2, "Ez": c.E3, "Gxy": c.G12, "Gxz": c.G13, "Gyz": c.G23,
                 "nuxy": c.nu12, "nuxz": c.nu13, "nuyz": c.nu23}
        return {k: np.asarray(v).tolist() for k, v in pairs.items()}


def stack_constants(
    stiffness: ArrayLike, fractions: ArrayLike, angles: ArrayLike | None = None
) -> StackResult:
    """Effective 3D stiffness and engineering constants of a periodic stack of layers.

    Parameters
    ----------
    stiffness : array_like, shape (..., n, 6, 6)
        Stiffness of each layer in laminate axes (already rotated), Pa; or in material axes
        when ``angles`` is given.
    fractions : array_like, shape (..., n)
        Thickness fraction of each layer; non-negative, summing to 1.
    angles : array_like, shape (..., n), optional
        Ply angles about z, degrees; the layers are rotated by them first.

    Returns
    -------
    StackResult
        Effective constants (``model="stack"``) and 6x6 stiffness, broadcast over ``...``.

    Raises
    ------
    InputError
        If shapes do not match.
    FractionError
        If a fraction is negative or the fractions do not sum to 1.

    References
    ----------
    Pagano (1974); Sun and Li (1988) (the mixed-form averaging above).

    Examples
    --------
    >>> C = tensors.transversely_isotropic_stiffness(140e9, 10e9, 0.3, 5e9, 0.4)
    >>> r = stack_constants(np.stack([C, C]), [0.5, 0.5], angles=[0.0, 90.0])
    >>> bool(abs(r.constants.E1 - r.constants.E2) < 1e-3 * r.constants.E1)
    True
    """
    C = np.asarray(stiffness, dtype=np.float64)
    f = np.asarray(fractions, dtype=np.float64)
    if C.ndim < 3 or C.shape[-2:] != (6, 6):
        raise InputError(f"stiffness: expected shape (..., n, 6, 6), got {C.shape}")
    if f.ndim < 1 or f.shape[-1] != C.shape[-3]:
        raise InputError(
            f"fractions: expected shape (..., {C.shape[-3]}) to match {C.shape[-3]} layers, "
            f"got {f.shape}"
        )
    if np.any(~np.isfinite(f)) or np.any(f < 0.0):
        idx = np.argwhere(~(np.isfinite(f) & (f >= 0.0)))[0]
        raise FractionError(
            f"fractions: entry {tuple(int(i) for i in idx)} = {float(f[tuple(idx)]):g} must be "
            "non-negative and finite"
        )
    total = f.sum(-1)
    if np.any(np.abs(total - 1.0) > 1e-9):
        bad = float(np.asarray(total).reshape(-1)[np.argmax(np.abs(total - 1.0).reshape(-1))])
        raise FractionError(f"fractions: must sum to 1, got {bad:.12g}")
    if angles is not None:
        C = tensors.rotate_stiffness(C, tensors.rotation_about_axis(3, angles))
    tensors.check_stiffness(C, name="layer stiffness")
    Cpp, Cpq, Cqp, Cqq = _blocks(C)
    E = np.linalg.inv(Cqq)
    Bk = Cpq @ E
    Ak = Cpp - Bk @ Cqp
    w = f[..., None, None]
    A_avg = (w * Ak).sum(-3)
    B_avg = (w * Bk).sum(-3)
    E_avg = (w * E).sum(-3)
    Cqq_eff = np.linalg.inv(E_avg)
    Cpq_eff = B_avg @ Cqq_eff
    Cpp_eff = A_avg + Cpq_eff @ np.swapaxes(B_avg, -1, -2)
    out = np.empty(Cpp_eff.shape[:-2] + (6, 6))
    p, q = IN_PLANE, OUT_OF_PLANE
    out[..., p[:, None], p] = Cpp_eff
    out[..., p[:, None], q] = Cpq_eff
    out[..., q[:, None], p] = np.swapaxes(Cpq_eff, -1, -2)
    out[..., q[:, None], q] = Cqq_eff
    out = 0.5 * (out + np.swapaxes(out, -1, -2))
    constants = ElasticConstants.from_stiffness(out, model="stack", source=STACK_SOURCE)
    return StackResult(constants=constants, stiffness=out)
