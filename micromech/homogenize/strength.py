"""Strength estimates of unidirectional composites, and limit-analysis bounds on yield strength.

Every value here is an *estimate* from a simple mechanical model, labelled with its source, except
the two limit-analysis values, which are rigorous bounds for perfectly plastic phases. None is a
design allowable: qualified test data, the applicable codes and a licensed engineer decide.

Models (continuous aligned fibres unless stated):

* longitudinal tension, fibre controlled: ``Xt = vf Xf + vm sigma_m(eps_f*)`` with the matrix
  stress at the fibre failure strain ``eps_f* = Xf / E1f`` (capped by the matrix yield or
  strength); where the matrix fails first, ``max(vf Xf, (vf E1f + vm Em) eps_m*)`` (Kelly and Tyson
  1965; Hull and Clyne 1996, Sec. 8.2);
* longitudinal compression, shear microbuckling (Rosen 1965): the smaller of the extension mode
  ``2 vf sqrt(vf Em E1f / (3 vm))`` and the shear mode ``Gm / vm``;
* longitudinal compression, kink band with fibre misalignment ``phi`` (Argon 1972; Budiansky
  1983): ``Xc = tau_y / (phi + gamma_y)``, ``gamma_y = tau_y / G12`` (Argon's rigid-plastic form
  ``tau_y / phi`` is its limit for a stiff composite);
* transverse tension and compression with the strain magnification of a square (or hexagonal)
  array: ``eps_2* = eps_m* [(d/s)(Em / E2f) + 1 - d/s]``, ``Y = E2 eps_2*``, ``d/s =
  sqrt(4 vf / pi)`` (square) or ``sqrt(2 sqrt3 vf / pi)`` (hexagonal) (Kies 1962; Kaw 2006,
  Sec. 3.3);
* in-plane shear, the same with shear moduli: ``S12 = G12 gamma_m* [(d/s)(Gm / G12f) + 1 - d/s]``;
* yield of perfectly plastic phases (any geometry): a uniform stress field gives
  ``min(sigma_y)`` as a lower bound and a uniform strain rate the volume (Voigt) average
  ``sum c_r sigma_y,r`` as an upper bound (Drucker 1966).

The matrix shear strength is its ``S12`` if given, else ``yield_strength / sqrt(3)`` (von Mises).

References
----------
.. [1] Kelly, A., Tyson, W. R. (1965). Tensile properties of fibre-reinforced metals.
   *J. Mech. Phys. Solids* 13, 329-350.
.. [2] Hull, D., Clyne, T. W. (1996). *An Introduction to Composite Materials*, 2nd ed.,
   Cambridge University Press, Sec. 8.2 (from memory).
.. [3] Rosen, B. W. (1965). Mechanics of composite strengthening. In *Fiber Composite
   Materials*, ASM, 37-75.
.. [4] Argon, A. S. (1972). Fracture of composites. *Treatise Mater. Sci. Technol.* 1, 79-114.
.. [5] Budiansky, B. (1983). Micromechanics. *Comput. Struct.* 16, 3-12.
.. [6] Kies, J. A. (1962). Maximum strains in the resin of fiberglass composites. NRL Report
   5752.
.. [7] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Sec. 3.3
   (strain magnification; from memory).
.. [8] Drucker, D. C. (1966). The continuum theory of plasticity on the macroscale and the
   microscale. *J. Mater.* 1, 873-910.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.homogenize import _common as cm
from micromech.homogenize.mori_tanaka import mori_tanaka
from micromech.results import json_value
from micromech.safety import CAUTION
from micromech.tensors import at_index

__all__ = [
    "StrengthEstimate",
    "longitudinal_tension",
    "rosen_microbuckling",
    "kink_band",
    "transverse_strength",
    "in_plane_shear_strength",
    "yield_bounds",
    "fibre_spacing_ratio",
    "strength_estimates",
    "CAUTION",
    "FRACTION_SUM_TOL",
]

Array = NDArray[np.float64]

#: Allowed deviation of a sum of phase volume fractions from 1 (round-off of 1 - vf - vv).
FRACTION_SUM_TOL = 1e-9


@dataclass(frozen=True, eq=False)
class StrengthEstimate:
    """One strength value with what it is and where it comes from.

    Attributes
    ----------
    key : str
        Name (``longitudinal_tension``, ``yield_upper_bound``, ...).
    value : ndarray, shape (...)
        Strength, Pa (a positive magnitude, also in compression).
    kind : {"estimate", "lower_bound", "upper_bound"}
        Whether the value is an estimate or a rigorous bound.
    source : str
        Published source of the model.
    note : str
        Inputs used and limits of the model.
    """

    key: str
    value: Array
    kind: Literal["estimate", "lower_bound", "upper_bound"]
    source: str
    note: str = ""

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI; a value that is not finite is null).

        Returns
        -------
        dict
            ``value``, ``kind``, ``source``, ``note``.
        """
        return {"value": json_value(self.value), "kind": self.kind, "source": self.source,
                "note": self.note}


def _pos(x: ArrayLike, name: str) -> Array:
    a = np.asarray(x, dtype=np.float64)
    if np.any(~(a > 0.0)):
        raise InputError(f"{name} = {x!r}: must be positive")
    return a


def fibre_spacing_ratio(vf: ArrayLike, arrangement: str = "square") -> Array:
    """Diameter over centre spacing ``d/s`` of a square or hexagonal fibre array.

    Parameters
    ----------
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    arrangement : {"square", "hexagonal", "random"}
        Array; "random" is taken as square.

    Returns
    -------
    ndarray, shape (...)
        ``sqrt(4 vf / pi)`` (square) or ``sqrt(2 sqrt(3) vf / pi)`` (hexagonal), at most 1.

    Raises
    ------
    InputError
        For an unknown arrangement.

    References
    ----------
    Kaw (2006), Sec. 3.3 (square array, from memory); hexagonal from the cell geometry.
    """
    c = cm.fraction(vf)
    if arrangement in ("square", "random"):
        r = np.sqrt(4.0 * c / np.pi)
    elif arrangement == "hexagonal":
        r = np.sqrt(2.0 * np.sqrt(3.0) * c / np.pi)
    else:
        raise InputError(
            f"arrangement = {arrangement!r}: expected 'square', 'hexagonal' or 'random'"
        )
    return np.asarray(np.minimum(r, 1.0))


def longitudinal_tension(
    Xf: ArrayLike, E1f: ArrayLike, Em: ArrayLike, vf: ArrayLike,
    *, matrix_strength: ArrayLike | None = None, matrix_yield: ArrayLike | None = None,
) -> Array:
    """Fibre-controlled longitudinal tensile strength (mixture at the fibre failure strain).

    Parameters
    ----------
    Xf : array_like, shape (...)
        Fibre tensile strength, Pa.
    E1f : array_like, shape (...)
        Fibre axial modulus, Pa.
    Em : array_like, shape (...)
        Matrix modulus, Pa.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    matrix_strength : array_like, optional
        Matrix tensile strength, Pa; if its failure strain is below the fibre's, the matrix
        cracks first and ``max(vf Xf, (vf E1f + vm Em) eps_m*)`` applies.
    matrix_yield : array_like, optional
        Matrix yield strength, Pa; caps the matrix stress at the fibre failure strain.

    Returns
    -------
    ndarray, shape (...)
        Xt, Pa.

    References
    ----------
    Kelly and Tyson (1965); Hull and Clyne (1996), Sec. 8.2 (from memory).

    Examples
    --------
    >>> round(float(longitudinal_tension(2.1e9, 72e9, 3.5e9, 0.6)) / 1e6, 1)
    1300.8
    """
    c = cm.fraction(vf)
    Xf_ = _pos(Xf, "fibre Xt")
    Ef = _pos(E1f, "fibre E1")
    Em_ = _pos(Em, "matrix E")
    eps_f = Xf_ / Ef
    sig_m = Em_ * eps_f
    if matrix_yield is not None:
        sig_m = np.minimum(sig_m, _pos(matrix_yield, "matrix yield_strength"))
    value = c * Xf_ + (1.0 - c) * sig_m
    if matrix_strength is not None:
        eps_m = _pos(matrix_strength, "matrix Xt") / Em_
        matrix_first = eps_m < eps_f
        alt = np.maximum(c * Xf_, (c * Ef + (1.0 - c) * Em_) * eps_m)
        value = np.where(matrix_first, alt, value)
    return np.asarray(value)


def rosen_microbuckling(
    Gm: ArrayLike, Em: ArrayLike, E1f: ArrayLike, vf: ArrayLike
) -> dict[str, Array]:
    """Rosen's (1965) microbuckling estimates of the longitudinal compressive strength.

    Parameters
    ----------
    Gm, Em : array_like, shape (...)
        Matrix shear and Young's moduli, Pa.
    E1f : array_like, shape (...)
        Fibre axial modulus, Pa.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1] (infinite at vf = 1).

    Returns
    -------
    dict of str to ndarray
        ``extension`` ``2 vf sqrt(vf Em E1f / (3 (1 - vf)))``, ``shear`` ``Gm / (1 - vf)`` and
        ``value`` the smaller, Pa.

    References
    ----------
    Rosen (1965).

    Examples
    --------
    >>> round(float(rosen_microbuckling(1.3e9, 3.5e9, 72e9, 0.6)["value"]) / 1e9, 3)
    3.25
    """
    c = cm.fraction(vf)
    vm = 1.0 - c
    with np.errstate(divide="ignore"):
        inv_vm = np.where(vm > 0.0, 1.0 / np.where(vm > 0.0, vm, 1.0), np.inf)
    ext = 2.0 * c * np.sqrt(c * np.asarray(Em, float) * np.asarray(E1f, float) / 3.0 * inv_vm)
    shear = np.asarray(Gm, float) * inv_vm
    return {"extension": ext, "shear": shear, "value": np.minimum(ext, shear)}


def kink_band(tau_y: ArrayLike, G12: ArrayLike, misalignment: ArrayLike) -> Array:
    """Kink-band compressive strength with initial fibre misalignment (Budiansky 1983).

    Parameters
    ----------
    tau_y : array_like, shape (...)
        In-plane shear yield strength, Pa.
    G12 : array_like, shape (...)
        In-plane shear modulus of the composite, Pa.
    misalignment : array_like, shape (...)
        Initial fibre misalignment angle, radians (> 0).

    Returns
    -------
    ndarray, shape (...)
        ``tau_y / (phi + tau_y / G12)``, Pa.

    Raises
    ------
    InputError
        If the misalignment is not positive.

    References
    ----------
    Argon (1972); Budiansky (1983).

    Examples
    --------
    >>> round(float(kink_band(60e6, 5e9, np.radians(2.0))) / 1e6, 1)
    1279.1
    """
    t = _pos(tau_y, "tau_y")
    phi = _pos(misalignment, "misalignment")
    return np.asarray(t / (phi + t / _pos(G12, "G12")))


def transverse_strength(
    E2: ArrayLike, Em: ArrayLike, E2f: ArrayLike, matrix_strength: ArrayLike, vf: ArrayLike,
    arrangement: str = "square",
) -> Array:
    """Transverse strength from the matrix failure strain and the strain magnification factor.

    Parameters
    ----------
    E2 : array_like, shape (...)
        Transverse modulus of the composite, Pa.
    Em, E2f : array_like, shape (...)
        Matrix modulus and fibre transverse modulus, Pa.
    matrix_strength : array_like, shape (...)
        Matrix strength in the same sense (tension or compression), Pa.
    vf : array_like, shape (...)
        Fibre volume fraction.
    arrangement : {"square", "hexagonal", "random"}
        Fibre array for ``d/s``.

    Returns
    -------
    ndarray, shape (...)
        ``E2 (sigma_m / Em) [(d/s)(Em / E2f) + 1 - d/s]``, Pa.

    References
    ----------
    Kies (1962); Kaw (2006), Sec. 3.3 (from memory).

    Examples
    --------
    >>> round(float(transverse_strength(10.37e9, 3.4e9, 85e9, 72e6, 0.7)) / 1e6, 2)
    20.57
    """
    return _magnified(E2, Em, E2f, matrix_strength, vf, arrangement,
                      ("E2", "matrix E", "fibre E2", "matrix strength"))


def in_plane_shear_strength(
    G12: ArrayLike, Gm: ArrayLike, G12f: ArrayLike, matrix_shear_strength: ArrayLike,
    vf: ArrayLike, arrangement: str = "square",
) -> Array:
    """In-plane shear strength from the matrix shear failure strain and its magnification.

    Parameters
    ----------
    G12 : array_like, shape (...)
        In-plane shear modulus of the composite, Pa.
    Gm, G12f : array_like, shape (...)
        Matrix and fibre axial shear moduli, Pa.
    matrix_shear_strength : array_like, shape (...)
        Matrix shear strength, Pa.
    vf : array_like, shape (...)
        Fibre volume fraction.
    arrangement : {"square", "hexagonal", "random"}
        Fibre array for ``d/s``.

    Returns
    -------
    ndarray, shape (...)
        ``G12 (tau_m / Gm) [(d/s)(Gm / G12f) + 1 - d/s]``, Pa.

    References
    ----------
    Kaw (2006), Sec. 3.3 (from memory).

    Examples
    --------
    >>> round(float(in_plane_shear_strength(4.0137e9, 3.4e9 / 2.6, 85e9 / 2.4, 34e6, 0.7)) / 1e6, 2)
    9.47
    """
    return _magnified(G12, Gm, G12f, matrix_shear_strength, vf, arrangement,
                      ("G12", "matrix G", "fibre G12", "matrix shear strength"))


def _magnified(
    M: ArrayLike, M_m: ArrayLike, M_f: ArrayLike, matrix_strength: ArrayLike, vf: ArrayLike,
    arrangement: str, names: tuple[str, str, str, str],
) -> Array:
    """Return ``M (s_m / M_m) [(d/s)(M_m / M_f) + 1 - d/s]`` (strain magnification, Kies 1962).

    The composite modulus times the magnified matrix failure strain: E2 for the transverse
    strengths, G12 for the in-plane shear strength; ``names`` label M, M_m, M_f and s_m.
    """
    ds = fibre_spacing_ratio(vf, arrangement)
    Mm = _pos(M_m, names[1])
    strain = _pos(matrix_strength, names[3]) / Mm
    return np.asarray(_pos(M, names[0]) * strain * (ds * Mm / _pos(M_f, names[2]) + 1.0 - ds))


def yield_bounds(yield_strengths: ArrayLike, fractions: ArrayLike) -> tuple[Array, Array]:
    """Limit-analysis bounds on the yield strength of perfectly plastic phases.

    Parameters
    ----------
    yield_strengths : array_like, shape (N, ...)
        Phase yield strengths, Pa (>= 0; voids 0).
    fractions : array_like, shape (N, ...)
        Phase volume fractions, summing to 1.

    Returns
    -------
    lower, upper : ndarray, shape (...)
        ``min`` over the phases present (uniform stress field) and ``sum c_r sigma_y,r``
        (uniform strain rate), Pa.

    Raises
    ------
    InputError
        If a yield strength is negative, the shapes differ or the fractions do not sum to 1
        (within :data:`FRACTION_SUM_TOL`).
    FractionError
        If a fraction lies outside [0, 1].

    References
    ----------
    Drucker (1966) (from memory).

    Examples
    --------
    >>> lo, hi = yield_bounds([400e6, 80e6], [0.3, 0.7])
    >>> float(lo) / 1e6, round(float(hi) / 1e6, 6)
    (80.0, 176.0)
    """
    s = np.asarray(yield_strengths, dtype=np.float64)
    c = np.asarray(fractions, dtype=np.float64)
    if s.shape[:1] != c.shape[:1]:
        raise InputError(
            f"yield_strengths and fractions: {s.shape[0] if s.ndim else 0} strengths but "
            f"{c.shape[0] if c.ndim else 0} fractions"
        )
    if np.any(~(s >= 0.0)):
        raise InputError(f"yield_strengths = {yield_strengths!r}: must be >= 0")
    cm.fraction(c, "fractions")
    total = np.sum(c, axis=0)
    off = np.abs(total - 1.0) > FRACTION_SUM_TOL
    if np.any(off):
        raise InputError(
            f"fractions sum to {float(np.asarray(total)[off].ravel()[0]):.12g}"
            f"{at_index(off)}; the phase volume fractions "
            f"must sum to 1 (within {FRACTION_SUM_TOL:g})"
        )
    s, c = np.broadcast_arrays(s, c)
    present = c > 0.0
    lower = np.min(np.where(present, s, np.inf), axis=0)
    return np.asarray(lower), np.asarray(np.sum(c * s, axis=0))


def _strength(m: Any, name: str) -> float | None:
    s = getattr(m, "strengths", None)
    v = getattr(s, name, None) if s is not None else None
    return None if v is None else float(v)


def _shear_strength(m: Any) -> tuple[float | None, str]:
    s12 = _strength(m, "S12")
    if s12 is not None:
        return s12, "matrix S12"
    y = _strength(m, "yield_strength")
    if y is not None:
        return y / np.sqrt(3.0), "matrix yield_strength / sqrt(3) (von Mises)"
    return None, ""


def strength_estimates(
    composite: Any, *, elastic: Any = None, misalignment_deg: float = 2.0
) -> dict[str, StrengthEstimate]:
    """Every strength estimate and bound the composite's data allow.

    Parameters
    ----------
    composite : Composite
        Constituents (with optional ``strengths``), fraction, inclusion and arrangement.
    elastic : ElasticConstants, optional
        Elastic estimate used for E2 and G12 (default: Mori-Tanaka of the composite).
    misalignment_deg : float
        Initial fibre misalignment for the kink-band estimate, degrees (2 degrees: common
        practice, no source).

    Returns
    -------
    dict of str to StrengthEstimate
        Keys among ``longitudinal_tension``, ``longitudinal_compression_microbuckling``,
        ``longitudinal_compression_kink_band``, ``transverse_tension``,
        ``transverse_compression``, ``in_plane_shear``, ``yield_lower_bound``,
        ``yield_upper_bound``. An estimate whose inputs are missing is absent; the fibre
        estimates need continuous fibres and no voids.

    Raises
    ------
    InputError
        If the misalignment is not positive.

    References
    ----------
    Each value carries its own source (see the module references): Kelly and Tyson (1965),
    Rosen (1965), Argon (1972), Budiansky (1983), Kies (1962), Kaw (2006), Drucker (1966).
    """
    if not misalignment_deg > 0.0:
        raise InputError(f"misalignment_deg = {misalignment_deg!r}: must be positive")
    out: dict[str, StrengthEstimate] = {}
    fib, mat = composite.fibre, composite.matrix
    vf = np.asarray(composite.volume_fraction, dtype=np.float64)
    vv = np.asarray(getattr(composite, "void_fraction", 0.0), dtype=np.float64)

    yf, ym = _strength(fib, "yield_strength"), _strength(mat, "yield_strength")
    if yf is not None and ym is not None:
        fr = np.stack(np.broadcast_arrays(vf, 1.0 - vf - vv, vv))
        lo, hi = yield_bounds(np.stack(np.broadcast_arrays(yf, ym, 0.0 * vf)), fr)
        note = "perfectly plastic phases; voids count as phases of zero strength"
        out["yield_lower_bound"] = StrengthEstimate(
            "yield_lower_bound", lo, "lower_bound", "Drucker (1966), uniform stress field", note)
        out["yield_upper_bound"] = StrengthEstimate(
            "yield_upper_bound", hi, "upper_bound", "Drucker (1966), uniform strain-rate field",
            note)

    if getattr(composite, "inclusion", "continuous") != "continuous" or np.any(vv > 0.0):
        return out
    try:
        f, m = cm.phases(fib, mat)
    except Exception:  # noqa: BLE001 - non-isotropic matrix: the fibre estimates do not apply
        return out
    el = elastic if elastic is not None else mori_tanaka(f, m, vf)
    if el.E2 is None or el.G12 is None:
        raise InputError(f"strength_estimates: the elastic estimate {el.model!r} lacks E2 or G12")
    E2, G12 = el.E2, el.G12
    arrangement = getattr(composite, "arrangement", "square")
    array_note = (f"{arrangement} array" if arrangement != "random"
                  else "random taken as square array")

    Xf = _strength(fib, "Xt")
    if Xf is not None:
        out["longitudinal_tension"] = StrengthEstimate(
            "longitudinal_tension",
            longitudinal_tension(Xf, f.E1, m.E, vf, matrix_strength=_strength(mat, "Xt"),
                                 matrix_yield=ym),
            "estimate", "Kelly & Tyson (1965); Hull & Clyne (1996) Sec. 8.2",
            "fibre Xt with the matrix stress at the fibre failure strain",
        )
    r = rosen_microbuckling(m.G, m.E, f.E1, vf)
    out["longitudinal_compression_microbuckling"] = StrengthEstimate(
        "longitudinal_compression_microbuckling", r["value"], "estimate", "Rosen (1965)",
        "elastic microbuckling, min of extension and shear modes; known to overestimate "
        "measured strengths severalfold",
    )
    tau, how = _shear_strength(mat)
    if tau is not None:
        out["longitudinal_compression_kink_band"] = StrengthEstimate(
            "longitudinal_compression_kink_band",
            kink_band(tau, G12, np.radians(misalignment_deg)),
            "estimate", "Budiansky (1983); Argon (1972)",
            f"tau_y = {how}; misalignment {misalignment_deg:g} deg; G12 from {el.model}",
        )
        out["in_plane_shear"] = StrengthEstimate(
            "in_plane_shear",
            in_plane_shear_strength(G12, m.G, f.G12, tau, vf, arrangement),
            "estimate", "Kaw (2006) Sec. 3.3, shear strain magnification",
            f"matrix shear strength = {how}; {array_note}; G12 from {el.model}",
        )
    for key, name, label in (("transverse_tension", "Xt", "tensile"),
                             ("transverse_compression", "Xc", "compressive")):
        sm = _strength(mat, name)
        how2 = f"matrix {name}"
        if sm is None and ym is not None:
            sm, how2 = ym, "matrix yield_strength"
        if sm is not None:
            out[key] = StrengthEstimate(
                key, transverse_strength(E2, m.E, f.E2, sm, vf, arrangement), "estimate",
                "Kies (1962); Kaw (2006) Sec. 3.3, strain magnification",
                f"{how2} ({label}); {array_note}; E2 from {el.model}",
            )
    return out
