"""Effective stiffness of an RVE from its load cases.

Two routes:

* **Full 6x6** from six (or more) load cases of volume-averaged stress and strain. Each case k
  gives sigma_k = C eps_k; stacked as rows, Eps C^T = Sigma, solved by least squares
  (C = Sigma^T Eps^-T for exactly six independent strain states). The fitted matrix is not forced
  to be symmetric: its relative asymmetry (:func:`micromech.tensors.symmetry_error`) measures
  how consistent the load cases are (boundary conditions, averaging), and positive definiteness
  of its symmetric part is checked. Engineering constants are read from the compliance of the
  symmetric part.
* **Partial constants** from uniaxial curves (:class:`~micromech.rve.curves.CurveMetrics`):
  the modulus of each normal case, the shear modulus of each shear case, and the Poisson ratios
  of the normal cases that carry lateral strains.

Axes
----
The RVE axes x, y, z are the material axes 1, 2, 3: x = 1, y = 2, z = 3. For a unidirectional
RVE the fibres lie along x = 1; for a laminate-like RVE (cross-ply), x and y are in-plane and z
is through the thickness, so E1, E2, E3 are the laminate's Ex, Ey, Ez. :data:`AXIS_NAMES` maps the
laminate names to the material ones, and :func:`axis_values` lists a result under the laminate
names (Ex, Ey, Ez, Gxy, Gxz, Gyz, nuxy, nuxz, nuyz, and the minor ratios nuyx, nuzx, nuzy).

Voigt order 11, 22, 33, 23, 13, 12 with engineering shear strain, as everywhere in micromech.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech import tensors
from micromech.errors import InputError
from micromech.results import ElasticConstants
from micromech.rve.curves import CurveMetrics
from micromech.rve.ingest import DIRECTIONS

__all__ = [
    "AXIS_NAMES",
    "DIRECTION_PROPERTY",
    "EffectiveStiffness",
    "stiffness_from_load_cases",
    "stiffness_from_matrix",
    "constants_from_curves",
    "axis_values",
]

Array = NDArray[np.float64]

SOURCE = "RVE load cases: least-squares fit of averaged stress against averaged strain"
CURVE_SOURCE = "RVE uniaxial curves: initial moduli and Poisson ratios"

#: Laminate (x, y, z) names of the engineering constants and their material (1, 2, 3) names.
AXIS_NAMES: Mapping[str, str] = MappingProxyType({
    "Ex": "E1", "Ey": "E2", "Ez": "E3",
    "Gxy": "G12", "Gxz": "G13", "Gyz": "G23",
    "nuxy": "nu12", "nuxz": "nu13", "nuyz": "nu23",
    "nuyx": "nu21", "nuzx": "nu31", "nuzy": "nu32",
})

#: The engineering constant that the modulus of each load case measures.
DIRECTION_PROPERTY: Mapping[str, str] = MappingProxyType({
    "x": "E1", "y": "E2", "z": "E3", "xy": "G12", "xz": "G13", "yz": "G23",
})

_STRAIN_RANK_RTOL = 1e-10


@dataclass(frozen=True, eq=False)
class EffectiveStiffness:
    """Effective 6x6 stiffness of an RVE, with its consistency checks.

    Attributes
    ----------
    stiffness : ndarray, shape (6, 6)
        The least-squares fit, Pa (not symmetrised).
    symmetric_part : ndarray, shape (6, 6)
        (C + C^T) / 2, Pa.
    symmetry_error : float
        max|C - C^T| / max|C|.
    positive_definite : bool
        Whether the symmetric part is positive definite.
    constants : ElasticConstants
        Engineering constants of the symmetric part (model ``"rve"``); minor Poisson ratios
        nu21, nu31, nu32 in ``extra``.
    residual : float
        Relative least-squares residual ||Eps C^T - Sigma|| / ||Sigma|| (0 for six cases).
    condition : float
        Condition number of the strain matrix.
    n_cases : int
        Number of load cases used.
    """

    stiffness: Array
    symmetric_part: Array
    symmetry_error: float
    positive_definite: bool
    constants: ElasticConstants
    residual: float = 0.0
    condition: float = 1.0
    n_cases: int = 6

    def axis_values(self) -> dict[str, float | None]:
        """Return the constants under their laminate names (see :func:`axis_values`).

        Returns
        -------
        dict of str to float
            Ex, Ey, Ez, Gxy, Gxz, Gyz, nuxy, nuxz, nuyz, nuyx, nuzx, nuzy.
        """
        return axis_values(self.constants)

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            ``stiffness`` (6x6 list), ``symmetry_error``, ``positive_definite``, ``residual``,
            ``condition``, ``n_cases`` and ``constants``.
        """
        return {
            "stiffness": self.stiffness.tolist(),
            "symmetry_error": self.symmetry_error,
            "positive_definite": self.positive_definite,
            "residual": self.residual,
            "condition": self.condition,
            "n_cases": self.n_cases,
            "constants": self.constants.as_dict(),
        }


def stiffness_from_load_cases(stress: ArrayLike, strain: ArrayLike) -> EffectiveStiffness:
    """Fit the effective 6x6 stiffness to load cases of averaged stress and strain.

    Parameters
    ----------
    stress : array_like, shape (n, 6)
        Volume-averaged stress of each load case, Pa, Voigt order 11, 22, 33, 23, 13, 12;
        n >= 6.
    strain : array_like, shape (n, 6)
        Volume-averaged strain of each case, engineering shear strain, same order.

    Returns
    -------
    EffectiveStiffness
        The fitted matrix, its symmetric part, checks and engineering constants.

    Raises
    ------
    InputError
        If the shapes differ or are not (n, 6) with n >= 6, a value is not finite, the strain
        states are not independent (rank below 6), or the symmetric part is singular.

    References
    ----------
    Least squares by singular value decomposition (numpy.linalg.lstsq); the averaging theorem
    that makes sigma = C eps hold for the volume averages: Hill, R. (1963), J. Mech. Phys.
    Solids 11, 357-372 (from memory).

    Examples
    --------
    >>> import numpy as np
    >>> from micromech.tensors import isotropic_stiffness
    >>> C = isotropic_stiffness(70e9, 0.3)
    >>> eps = 1e-3 * np.eye(6)
    >>> r = stiffness_from_load_cases(eps @ C.T, eps)
    >>> round(float(r.constants.E1) / 1e9, 6), r.positive_definite
    (70.0, True)
    """
    sig = _cases(stress, "stress")
    eps = _cases(strain, "strain")
    if sig.shape != eps.shape:
        raise InputError(
            f"stress and strain must have the same shape (n, 6), got {sig.shape} and {eps.shape}"
        )
    sv = np.linalg.svd(eps, compute_uv=False)
    rank = int(np.sum(sv > _STRAIN_RANK_RTOL * sv[0])) if sv[0] > 0 else 0
    if rank < 6:
        raise InputError(
            f"strain: the {eps.shape[0]} load cases span only {rank} independent strain "
            "state(s); six independent ones are needed for the full stiffness"
        )
    ct, *_ = np.linalg.lstsq(eps, sig, rcond=None)
    C = np.ascontiguousarray(ct.T)
    norm = float(np.linalg.norm(sig))
    resid = float(np.linalg.norm(eps @ ct - sig)) / norm if norm > 0 else 0.0
    return _result(C, residual=resid, condition=float(sv[0] / sv[-1]), n_cases=eps.shape[0])


def stiffness_from_matrix(C: ArrayLike) -> EffectiveStiffness:
    """Wrap a given effective 6x6 stiffness (e.g. from a case file) with the same checks.

    Parameters
    ----------
    C : array_like, shape (6, 6)
        Effective stiffness, Pa, Voigt order, engineering shear.

    Returns
    -------
    EffectiveStiffness
        With residual 0 and condition 1 (no fit).

    Raises
    ------
    InputError
        If the shape is not (6, 6), a value is not finite or the symmetric part is singular.
    """
    Cm = _matrix(C)
    return _result(Cm, residual=0.0, condition=1.0, n_cases=0)


def _cases(values: ArrayLike, name: str) -> Array:
    try:
        arr = np.array(values, dtype=np.float64)
    except (TypeError, ValueError):
        raise InputError(f"{name}: expected an (n, 6) array of numbers") from None
    if arr.ndim != 2 or arr.shape[1] != 6:
        raise InputError(f"{name}: expected shape (n, 6) in Voigt order, got {arr.shape}")
    if arr.shape[0] < 6:
        raise InputError(f"{name}: {arr.shape[0]} load case(s); at least 6 are needed")
    bad = ~np.isfinite(arr)
    if bad.any():
        k, c = (int(i) for i in np.argwhere(bad)[0])
        raise InputError(
            f"{name}: load case {k}, component {c} is {float(arr[k, c])!r}; must be finite"
        )
    return arr


def _matrix(C: ArrayLike) -> Array:
    try:
        arr = np.array(C, dtype=np.float64)
    except (TypeError, ValueError):
        raise InputError("stiffness: expected a 6x6 array of numbers") from None
    if arr.shape != (6, 6):
        raise InputError(f"stiffness: expected shape (6, 6), got {arr.shape}")
    if not np.isfinite(arr).all():
        raise InputError("stiffness: every entry must be finite")
    return arr


def _result(C: Array, *, residual: float, condition: float, n_cases: int) -> EffectiveStiffness:
    sym = 0.5 * (C + C.T)
    sv = np.linalg.svd(sym, compute_uv=False)
    if not sv[0] > 0 or sv[-1] <= 1e-13 * sv[0]:
        raise InputError(
            "stiffness: the symmetric part is singular, so no compliance and no engineering "
            "constants exist"
        )
    c = tensors.engineering_constants(sym)
    constants = ElasticConstants(
        **{k: c[k] for k in ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23")},
        model="rve", source=SOURCE,
        extra={"nu21": c["nu21"], "nu31": c["nu31"], "nu32": c["nu32"]},
    )
    C.flags.writeable = False
    sym.flags.writeable = False
    return EffectiveStiffness(
        stiffness=C,
        symmetric_part=sym,
        symmetry_error=float(tensors.symmetry_error(C)),
        positive_definite=bool(tensors.is_positive_definite(sym)),
        constants=constants,
        residual=residual,
        condition=condition,
        n_cases=n_cases,
    )


def constants_from_curves(metrics: Mapping[str, CurveMetrics]) -> ElasticConstants:
    """Collect the engineering constants measured by uniaxial load cases.

    Parameters
    ----------
    metrics : mapping of direction to CurveMetrics
        Metrics by load case ``"x"``, ``"y"``, ``"z"``, ``"xy"``, ``"xz"``, ``"yz"`` (any
        subset). Case x gives E1 (and nu12, nu13 from lateral y, z strains), y gives E2 (nu23
        from lateral z; minor nu21 from lateral x), z gives E3 (minor nu31, nu32), xy gives G12,
        xz gives G13, yz gives G23.

    Returns
    -------
    ElasticConstants
        A partial result (``model="rve"``): constants without a load case are None. Minor
        Poisson ratios are in ``extra`` (nu21, nu31, nu32) when measured.

    Raises
    ------
    InputError
        For an unknown direction, or a metrics object whose direction disagrees with its key.
    """
    values: dict[str, Any] = {}
    extra: dict[str, Any] = {}
    for direction, m in metrics.items():
        if direction not in DIRECTIONS:
            raise InputError(
                f"metrics: direction must be one of {', '.join(DIRECTIONS)}, got {direction!r}"
            )
        if m.direction is not None and m.direction != direction:
            raise InputError(
                f"metrics[{direction!r}]: holds the metrics of load case {m.direction!r}"
            )
        values[DIRECTION_PROPERTY[direction]] = m.modulus
        if direction in ("x", "y", "z"):
            i = "xyz".index(direction) + 1
            for axis, nu in m.poisson.items():
                j = "xyz".index(axis) + 1
                name = f"nu{i}{j}"
                if i < j:
                    values[name] = nu
                else:
                    extra[name] = np.asarray(nu)
    return ElasticConstants(**values, model="rve", source=CURVE_SOURCE, extra=extra)


def axis_values(constants: ElasticConstants) -> dict[str, float | None]:
    """List engineering constants under their laminate (x, y, z) names.

    Parameters
    ----------
    constants : ElasticConstants
        A result with scalar constants (x = 1, y = 2, z = 3).

    Returns
    -------
    dict of str to float or None
        Keys of :data:`AXIS_NAMES` (Ex, Ey, Ez, Gxy, Gxz, Gyz, nuxy, nuxz, nuyz, nuyx, nuzx,
        nuzy); None where unknown.

    Examples
    --------
    >>> from micromech.results import ElasticConstants
    >>> axis_values(ElasticConstants(E1=140e9))["Ex"]
    140000000000.0
    """
    out: dict[str, float | None] = {}
    for lam, mat in AXIS_NAMES.items():
        v = constants.get(mat)
        out[lam] = None if v is None else float(v)
    return out
