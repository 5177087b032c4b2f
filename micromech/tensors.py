"""6x6 stiffness and compliance helpers in Voigt notation (11, 22, 33, 23, 13, 12).

Shear strains are engineering strains (gamma = 2 epsilon) at every public boundary. All functions
broadcast over leading axes: constants of shape ``(...)`` give matrices of shape ``(..., 6, 6)``.

References
----------
.. [1] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.2-2.4 (compliance of orthotropic and transversely isotropic materials).
.. [2] Auld, B. A. (1973). *Acoustic Fields and Waves in Solids*, Vol. 1, Wiley, Ch. 3
   (the Bond transformation matrix for rotating 6x6 stiffness matrices).
"""

from __future__ import annotations

from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError, InvalidMaterialError

__all__ = [
    "VOIGT_PAIRS",
    "isotropic_stiffness",
    "isotropic_compliance",
    "transversely_isotropic_stiffness",
    "transversely_isotropic_compliance",
    "orthotropic_stiffness",
    "orthotropic_compliance",
    "engineering_constants",
    "rotation_about_axis",
    "bond_matrix",
    "rotate_stiffness",
    "rotate_compliance",
    "to_mandel",
    "from_mandel",
    "symmetry_error",
    "is_symmetric",
    "is_positive_definite",
    "check_stiffness",
    "at_index",
]

Array = NDArray[np.float64]

#: Index pairs (i, j) of the Voigt order 11, 22, 33, 23, 13, 12 (zero based).
VOIGT_PAIRS: tuple[tuple[int, int], ...] = ((0, 0), (1, 1), (2, 2), (1, 2), (0, 2), (0, 1))

_MANDEL = np.array([1.0, 1.0, 1.0, np.sqrt(2.0), np.sqrt(2.0), np.sqrt(2.0)])


def _f(x: ArrayLike) -> Array:
    return np.asarray(x, dtype=np.float64)


def _six_by_six(C: ArrayLike, name: str) -> Array:
    a = _f(C)
    if a.ndim < 2 or a.shape[-2:] != (6, 6):
        raise InputError(f"{name}: expected shape (..., 6, 6), got {a.shape}")
    return a


#: Largest |R R^T - I| accepted for a rotation matrix.
ROTATION_ATOL = 1e-8


def _rotation(R: ArrayLike) -> Array:
    """Check that R has shape (..., 3, 3) and is orthogonal; return it as a float array."""
    a = _f(R)
    if a.ndim < 2 or a.shape[-2:] != (3, 3):
        raise InputError(f"R: expected rotation matrices of shape (..., 3, 3), got {a.shape}")
    dev = np.max(np.abs(a @ np.swapaxes(a, -1, -2) - np.eye(3)), axis=(-2, -1))
    bad = ~(dev <= ROTATION_ATOL)
    if np.any(bad):
        idx = _first(bad)
        raise InputError(
            f"R{_at(idx)} is not a rotation: max |R R^T - I| = {float(dev[idx]):.3g} exceeds "
            f"{ROTATION_ATOL:g} (rule: R must be orthogonal)"
        )
    return a


def orthotropic_compliance(
    E1: ArrayLike,
    E2: ArrayLike,
    E3: ArrayLike,
    G23: ArrayLike,
    G13: ArrayLike,
    G12: ArrayLike,
    nu23: ArrayLike,
    nu13: ArrayLike,
    nu12: ArrayLike,
) -> Array:
    """Compliance of an orthotropic material from its nine engineering constants.

    Parameters
    ----------
    E1, E2, E3 : array_like, shape (...)
        Young's moduli along the material axes, Pa.
    G23, G13, G12 : array_like, shape (...)
        Shear moduli, Pa.
    nu23, nu13, nu12 : array_like, shape (...)
        Major Poisson ratios nu_ij = -eps_j / eps_i under stress along i (i < j).

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Compliance in 1/Pa, Voigt order 11, 22, 33, 23, 13, 12, engineering shear.

    References
    ----------
    Jones (1999), Eq. (2.21).

    Examples
    --------
    >>> S = orthotropic_compliance(140e9, 10e9, 10e9, 3.5e9, 5e9, 5e9, 0.45, 0.3, 0.3)
    >>> round(float(1 / S[0, 0]) / 1e9, 6)
    140.0
    """
    E1, E2, E3, G23, G13, G12, nu23, nu13, nu12 = np.broadcast_arrays(
        *(_f(v) for v in (E1, E2, E3, G23, G13, G12, nu23, nu13, nu12))
    )
    S = np.zeros(E1.shape + (6, 6))
    S[..., 0, 0] = 1.0 / E1
    S[..., 1, 1] = 1.0 / E2
    S[..., 2, 2] = 1.0 / E3
    S[..., 3, 3] = 1.0 / G23
    S[..., 4, 4] = 1.0 / G13
    S[..., 5, 5] = 1.0 / G12
    S[..., 0, 1] = S[..., 1, 0] = -nu12 / E1
    S[..., 0, 2] = S[..., 2, 0] = -nu13 / E1
    S[..., 1, 2] = S[..., 2, 1] = -nu23 / E2
    return S


def orthotropic_stiffness(
    E1: ArrayLike,
    E2: ArrayLike,
    E3: ArrayLike,
    G23: ArrayLike,
    G13: ArrayLike,
    G12: ArrayLike,
    nu23: ArrayLike,
    nu13: ArrayLike,
    nu12: ArrayLike,
) -> Array:
    """Stiffness of an orthotropic material; the inverse of :func:`orthotropic_compliance`.

    Parameters
    ----------
    E1, E2, E3, G23, G13, G12, nu23, nu13, nu12 : array_like, shape (...)
        As in :func:`orthotropic_compliance` (Pa and dimensionless).

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Stiffness in Pa.
    """
    return _f(np.linalg.inv(orthotropic_compliance(E1, E2, E3, G23, G13, G12, nu23, nu13, nu12)))


def transversely_isotropic_compliance(
    E1: ArrayLike, E2: ArrayLike, nu12: ArrayLike, G12: ArrayLike, nu23: ArrayLike
) -> Array:
    """Compliance of a transversely isotropic material with symmetry axis 1.

    Parameters
    ----------
    E1 : array_like, shape (...)
        Axial Young's modulus, Pa.
    E2 : array_like, shape (...)
        Transverse Young's modulus (E3 = E2), Pa.
    nu12 : array_like, shape (...)
        Axial Poisson ratio (nu13 = nu12).
    G12 : array_like, shape (...)
        Axial shear modulus (G13 = G12), Pa.
    nu23 : array_like, shape (...)
        Transverse Poisson ratio; G23 = E2 / (2 (1 + nu23)).

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Compliance in 1/Pa.

    References
    ----------
    Jones (1999), Eq. (2.22).
    """
    E2 = _f(E2)
    nu23 = _f(nu23)
    G23 = E2 / (2.0 * (1.0 + nu23))
    return orthotropic_compliance(E1, E2, E2, G23, G12, G12, nu23, nu12, nu12)


def transversely_isotropic_stiffness(
    E1: ArrayLike, E2: ArrayLike, nu12: ArrayLike, G12: ArrayLike, nu23: ArrayLike
) -> Array:
    """Stiffness of a transversely isotropic material with symmetry axis 1.

    Parameters
    ----------
    E1, E2, nu12, G12, nu23 : array_like, shape (...)
        As in :func:`transversely_isotropic_compliance`.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Stiffness in Pa.

    Examples
    --------
    >>> C = transversely_isotropic_stiffness(230e9, 15e9, 0.2, 15e9, 0.07)
    >>> C.shape
    (6, 6)
    """
    return _f(np.linalg.inv(transversely_isotropic_compliance(E1, E2, nu12, G12, nu23)))


def isotropic_compliance(E: ArrayLike, nu: ArrayLike) -> Array:
    """Compliance of an isotropic material.

    Parameters
    ----------
    E : array_like, shape (...)
        Young's modulus, Pa.
    nu : array_like, shape (...)
        Poisson ratio, -1 < nu < 1/2.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Compliance in 1/Pa.
    """
    E = _f(E)
    nu = _f(nu)
    G = E / (2.0 * (1.0 + nu))
    return orthotropic_compliance(E, E, E, G, G, G, nu, nu, nu)


def isotropic_stiffness(E: ArrayLike, nu: ArrayLike) -> Array:
    """Stiffness of an isotropic material in closed form (Lame constants).

    Parameters
    ----------
    E : array_like, shape (...)
        Young's modulus, Pa.
    nu : array_like, shape (...)
        Poisson ratio, -1 < nu < 1/2.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Stiffness in Pa: lambda + 2 mu on the normal diagonal, lambda off it, mu on the shear
        diagonal (engineering shear strain).

    Examples
    --------
    >>> C = isotropic_stiffness(3.5e9, 0.35)
    >>> bool(abs(C[3, 3] - 3.5e9 / 2.7) < 1e-3)
    True
    """
    E, nu = np.broadcast_arrays(_f(E), _f(nu))
    lam = E * nu / ((1.0 + nu) * (1.0 - 2.0 * nu))
    mu = E / (2.0 * (1.0 + nu))
    C = np.zeros(E.shape + (6, 6))
    C[..., :3, :3] = lam[..., None, None]
    idx = np.arange(3)
    C[..., idx, idx] = (lam + 2.0 * mu)[..., None]
    C[..., idx + 3, idx + 3] = mu[..., None]
    return C


def engineering_constants(C: ArrayLike) -> dict[str, Array]:
    """Engineering constants of any 6x6 stiffness, read from its compliance.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Stiffness in Pa (Voigt order, engineering shear).

    Returns
    -------
    dict of str to ndarray, each shape (...)
        ``E1, E2, E3, G23, G13, G12`` (Pa), ``nu12, nu13, nu23`` (major) and
        ``nu21, nu31, nu32`` (minor), nu_ij = -S_ij / S_ii. For a matrix that is not
        orthotropic in these axes the coupling terms are ignored: the constants are the
        apparent ones under uniaxial stress along each axis.

    Raises
    ------
    InputError
        If C does not have shape (..., 6, 6).
    InvalidMaterialError
        If a matrix is singular (no compliance).

    References
    ----------
    Jones (1999), Eq. (2.21): the compliance entries in engineering constants.

    Examples
    --------
    >>> c = engineering_constants(isotropic_stiffness(70e9, 0.3))
    >>> round(float(c["E1"]) / 1e9, 9), round(float(c["nu12"]), 12)
    (70.0, 0.3)
    """
    Ca = _six_by_six(C, "stiffness")
    try:
        S = np.linalg.inv(Ca)
    except np.linalg.LinAlgError:
        raise InvalidMaterialError(
            "stiffness is singular: its engineering constants are undefined (rule: a stiffness "
            "must be invertible)"
        ) from None
    d = np.diagonal(S, axis1=-2, axis2=-1)
    return {
        "E1": 1.0 / d[..., 0],
        "E2": 1.0 / d[..., 1],
        "E3": 1.0 / d[..., 2],
        "G23": 1.0 / d[..., 3],
        "G13": 1.0 / d[..., 4],
        "G12": 1.0 / d[..., 5],
        "nu12": -S[..., 0, 1] / d[..., 0],
        "nu13": -S[..., 0, 2] / d[..., 0],
        "nu23": -S[..., 1, 2] / d[..., 1],
        "nu21": -S[..., 0, 1] / d[..., 1],
        "nu31": -S[..., 0, 2] / d[..., 2],
        "nu32": -S[..., 1, 2] / d[..., 2],
    }


def rotation_about_axis(axis: int | str, angle: ArrayLike, degrees: bool = True) -> Array:
    """Rotation matrix for a right-handed rotation about a coordinate axis.

    Parameters
    ----------
    axis : {1, 2, 3, "x", "y", "z"}
        The axis of rotation.
    angle : array_like, shape (...)
        The angle of rotation (degrees by default).
    degrees : bool
        Whether ``angle`` is in degrees.

    Returns
    -------
    ndarray, shape (..., 3, 3)
        Rotation matrices R with new_vector = R @ old_vector, i.e. the components of a vector
        rotated by ``angle`` in the fixed axes.
    """
    names = {1: 0, 2: 1, 3: 2, "x": 0, "y": 1, "z": 2, "1": 0, "2": 1, "3": 2}
    if axis not in names:
        raise InputError(f"axis: expected one of 1, 2, 3, 'x', 'y', 'z', got {axis!r}")
    k = names[axis]
    a = _f(angle)
    if degrees:
        a = np.deg2rad(a)
    c, s = np.cos(a), np.sin(a)
    i, j = [(1, 2), (2, 0), (0, 1)][k]
    R = np.zeros(a.shape + (3, 3))
    R[..., k, k] = 1.0
    R[..., i, i] = c
    R[..., j, j] = c
    R[..., j, i] = s
    R[..., i, j] = -s
    return R


def bond_matrix(R: ArrayLike) -> Array:
    """Bond matrix that rotates stresses in Voigt notation.

    Parameters
    ----------
    R : array_like, shape (..., 3, 3)
        Rotation matrix (new components = R @ old components).

    Returns
    -------
    ndarray, shape (..., 6, 6)
        M with sigma_new = M @ sigma_old (Voigt order 11, 22, 33, 23, 13, 12). Stiffness rotates
        as M C M^T and compliance as M^-T S M^-1 = N S N^T with N = M^-T.

    Raises
    ------
    InputError
        If R does not have shape (..., 3, 3) or is not orthogonal.

    References
    ----------
    Auld (1973), Ch. 3, Eq. (3.32).

    Examples
    --------
    >>> M = bond_matrix(rotation_about_axis(3, 90.0))
    >>> [int(round(x)) for x in M[:3, :3].diagonal()]
    [0, 0, 1]
    """
    R = _rotation(R)
    M = np.empty(R.shape[:-2] + (6, 6))
    for a, (i, j) in enumerate(VOIGT_PAIRS):
        for b, (k, l) in enumerate(VOIGT_PAIRS):
            if k == l:
                M[..., a, b] = R[..., i, k] * R[..., j, k]
            else:
                M[..., a, b] = R[..., i, k] * R[..., j, l] + R[..., i, l] * R[..., j, k]
    return M


def rotate_stiffness(C: ArrayLike, R: ArrayLike) -> Array:
    """Stiffness expressed in rotated axes (or of a rotated material in fixed axes).

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Stiffness in Pa.
    R : array_like, shape (..., 3, 3)
        Rotation matrix; a material rotated by R has stiffness M C M^T.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        The rotated stiffness.

    Raises
    ------
    InputError
        If C is not (..., 6, 6), or R not a (..., 3, 3) rotation.

    References
    ----------
    Auld (1973), Ch. 3: C' = M C M^T with the Bond matrix M.

    Examples
    --------
    >>> C = transversely_isotropic_stiffness(140e9, 10e9, 0.3, 5e9, 0.4)
    >>> Cr = rotate_stiffness(C, rotation_about_axis(3, 90.0))
    >>> round(float(engineering_constants(Cr)["E2"]) / 1e9, 6)
    140.0
    """
    Ca = _six_by_six(C, "stiffness")
    M = bond_matrix(R)
    return M @ Ca @ np.swapaxes(M, -1, -2)


def rotate_compliance(S: ArrayLike, R: ArrayLike) -> Array:
    """Compliance of a rotated material; the counterpart of :func:`rotate_stiffness`.

    Parameters
    ----------
    S : array_like, shape (..., 6, 6)
        Compliance in 1/Pa.
    R : array_like, shape (..., 3, 3)
        Rotation matrix.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        The rotated compliance.

    Raises
    ------
    InputError
        If S is not (..., 6, 6), or R not a (..., 3, 3) rotation.

    References
    ----------
    Auld (1973), Ch. 3: strains rotate with N = M^-T.
    """
    # For a proper rotation the strain transformation N = M^-T equals bond_matrix applied to the
    # engineering-strain form: N = D M D^-1 with D = diag(1, 1, 1, 2, 2, 2).
    Sa = _six_by_six(S, "compliance")
    M = bond_matrix(R)
    D = np.array([1.0, 1.0, 1.0, 2.0, 2.0, 2.0])
    N = M * D[:, None] / D[None, :]
    return N @ Sa @ np.swapaxes(N, -1, -2)


def to_mandel(C: ArrayLike) -> Array:
    """Convert a Voigt stiffness (engineering shear) to Mandel form.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Voigt stiffness.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Mandel stiffness (an orthonormal-basis representation of the 4th-order tensor).
    """
    return _f(C) * _MANDEL[:, None] * _MANDEL[None, :]


def from_mandel(C: ArrayLike) -> Array:
    """Convert a Mandel stiffness back to Voigt form (engineering shear).

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Mandel stiffness.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        Voigt stiffness.
    """
    return _f(C) / (_MANDEL[:, None] * _MANDEL[None, :])


def symmetry_error(C: ArrayLike) -> Array:
    """Relative asymmetry ``max|C - C^T| / max|C|`` of each matrix.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Matrices.

    Returns
    -------
    ndarray, shape (...)
        The relative symmetry error.
    """
    C = _f(C)
    num = np.max(np.abs(C - np.swapaxes(C, -1, -2)), axis=(-2, -1))
    den = np.max(np.abs(C), axis=(-2, -1))
    return np.asarray(num / np.where(den > 0, den, 1.0))


def is_symmetric(C: ArrayLike, rtol: float = 1e-8) -> Array:
    """Whether each matrix is symmetric to a relative tolerance.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Matrices.
    rtol : float
        Tolerance on :func:`symmetry_error`.

    Returns
    -------
    ndarray of bool, shape (...)
        True where symmetric.
    """
    return np.asarray(symmetry_error(C) <= rtol)


def is_positive_definite(C: ArrayLike, rtol: float = 1e-12) -> Array:
    """Whether the symmetric part of each matrix is positive definite.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Matrices (stiffness or compliance).
    rtol : float
        The smallest eigenvalue must exceed ``rtol`` times the largest.

    Returns
    -------
    ndarray of bool, shape (...)
        True where positive definite.
    """
    C = _f(C)
    w = np.linalg.eigvalsh(0.5 * (C + np.swapaxes(C, -1, -2)))
    return np.asarray((w[..., 0] > rtol * np.abs(w[..., -1])) & np.all(np.isfinite(w), axis=-1))


def check_stiffness(C: ArrayLike, name: str = "stiffness", rtol: float = 1e-8) -> Array:
    """Raise unless every matrix is finite, symmetric and positive definite.

    Parameters
    ----------
    C : array_like, shape (..., 6, 6)
        Matrices to check.
    name : str
        Name used in the error message.
    rtol : float
        Symmetry tolerance.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        The input as a float array, unchanged.

    Raises
    ------
    InputError
        If C does not have shape (..., 6, 6).
    InvalidMaterialError
        Naming the first offending index and the rule broken.
    """
    C = _six_by_six(C, name)
    finite = np.all(np.isfinite(C), axis=(-2, -1))
    if not np.all(finite):
        raise InvalidMaterialError(
            f"{name}{at_index(np.logical_not(finite))} must be finite (no NaN or infinity)")
    err = symmetry_error(C)
    bad = err > rtol
    if np.any(bad):
        idx = _first(bad)
        raise InvalidMaterialError(
            f"{name}{_at(idx)} must be symmetric: relative asymmetry {float(err[idx]):.3g} "
            f"exceeds {rtol:g}"
        )
    pd = is_positive_definite(C)
    if not np.all(pd):
        idx = _first(np.logical_not(pd))
        Ci = C[idx] if idx else C
        w = np.linalg.eigvalsh(0.5 * (Ci + Ci.T))
        raise InvalidMaterialError(
            f"{name}{_at(idx)} must be positive definite: smallest eigenvalue {w[0]:.4g} is "
            f"not above 1e-12 times the largest magnitude {abs(w[-1]):.4g}"
        )
    return C


def _first(mask: Any) -> tuple[int, ...]:
    m = np.asarray(mask)
    if m.ndim == 0:
        return ()
    return tuple(int(i) for i in np.argwhere(m)[0])


def _at(idx: tuple[int, ...]) -> str:
    return f" at index {idx if len(idx) > 1 else idx[0]}" if idx else ""


def at_index(mask: ArrayLike) -> str:
    """Name the first True entry of a mask, for error messages.

    Parameters
    ----------
    mask : array_like of bool, shape (...)
        Where a rule is broken; at least one entry is True.

    Returns
    -------
    str
        ``" at index 3"`` (one axis), ``" at index (1, 2)"`` (several) or ``""`` (a 0-d mask).

    Examples
    --------
    >>> at_index([False, True]), at_index([[False], [True]]), at_index(True)
    (' at index 1', ' at index (1, 0)', '')
    """
    return _at(_first(mask))
