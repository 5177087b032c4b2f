"""Rigorous bounds: Voigt and Reuss, and Hashin-Shtrikman for isotropic phases and for fibres.

* Voigt (uniform strain) and Reuss (uniform stress) bounds for any number of phases with full 6x6
  stiffnesses (:func:`voigt_bound`, :func:`reuss_bound`), and the same for a fibre and a matrix in
  closed transversely isotropic algebra (:func:`voigt_reuss`). Hill (1952) proved they bound the
  strain energy, hence every Young's and shear modulus.
* Hashin-Shtrikman bounds on the bulk and shear moduli of a statistically isotropic mixture of
  N isotropic phases in Walpole's form, valid whether or not the phases are well ordered
  (:func:`hashin_shtrikman_isotropic`; Hashin and Shtrikman 1963, Walpole 1966):

      K = [sum c_r / (K_r + 4/3 G*)]^-1 - 4/3 G*
      G = [sum c_r / (G_r + z*)]^-1 - z*,   z* = G*/6 (9 K* + 8 G*) / (K* + 2 G*)

  with (K*, G*) the smallest moduli of the phases for the lower bound and the largest for the
  upper bound.
* Bounds for aligned continuous fibres with transversely isotropic phases
  (:func:`hashin_shtrikman_fibre`; Hill 1964, Hashin 1965): the plane-strain bulk modulus
  ``k = [sum c_r/(k_r + m*)]^-1 - m*``, axial shear ``p = [sum c_r/(p_r + p*)]^-1 - p*`` and
  transverse shear ``m = [sum c_r/(m_r + m^)]^-1 - m^`` with ``m^ = k* m* / (k* + 2 m*)``;
  E1 and nu12 follow from k through Hill's (1964) exact connections, which for a reference
  ``m*`` take the closed form

      E1 = <E1> + 4 c_f c_m (nu_f - nu_m)^2 / (c_f/k_m + c_m/k_f + 1/m*)
      nu12 = <nu12> + c_f c_m (nu_f - nu_m)(1/k_m - 1/k_f) / (c_f/k_m + c_m/k_f + 1/m*)

  (E1 rises with k; nu12 is monotone in 1/k), and the transverse modulus
  ``1/E2 = 1/(4k) + 1/(4m) + nu12^2 / E1`` falls with k and m, so the bounds on k and m give
  bounds on E2 (Hashin 1965). The CTE bounds follow from Levin's relation (Rosen and Hashin 1970).
* Hashin-Shtrikman-type bounds of Willis (1977) for aligned spheroids of isotropic phases whose
  distribution has the spheroid's shape (:func:`hashin_shtrikman_spheroid`); for spheres they are
  the isotropic bounds above and with the matrix as the softer phase the lower one is
  Mori-Tanaka's estimate.

References
----------
.. [1] Hill, R. (1952). The elastic behaviour of a crystalline aggregate. *Proc. Phys. Soc. A*
   65, 349-354.
.. [2] Hashin, Z., Shtrikman, S. (1963). A variational approach to the theory of the elastic
   behaviour of multiphase materials. *J. Mech. Phys. Solids* 11, 127-140.
.. [3] Walpole, L. J. (1966). On bounds for the overall elastic moduli of inhomogeneous systems -
   I. *J. Mech. Phys. Solids* 14, 151-162.
.. [4] Hill, R. (1964). Theory of mechanical properties of fibre-strengthened materials: I.
   Elastic behaviour. *J. Mech. Phys. Solids* 12, 199-212.
.. [5] Hashin, Z. (1965). On elastic behaviour of fibre reinforced materials of arbitrary
   transverse phase geometry. *J. Mech. Phys. Solids* 13, 119-134.
.. [6] Willis, J. R. (1977). Bounds and self-consistent estimates for the overall properties of
   anisotropic composites. *J. Mech. Phys. Solids* 25, 185-202.
.. [7] Rosen, B. W., Hashin, Z. (1970). *Int. J. Eng. Sci.* 8, 157-173 (CTE bounds).
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError, InputError, InvalidMaterialError
from micromech.homogenize import _common as cm
from micromech.homogenize import walpole as W
from micromech.homogenize.eshelby import dilute_concentration, polarization
from micromech.homogenize.orientation import average, check_orientation_name
from micromech.homogenize.thermal import levin, levin_fibre
from micromech.results import ElasticConstants

__all__ = [
    "voigt_bound",
    "reuss_bound",
    "voigt_reuss",
    "hashin_shtrikman_isotropic",
    "hashin_shtrikman",
    "hashin_shtrikman_fibre",
    "hashin_shtrikman_spheroid",
    "fibre_reference_form",
    "reference_stiffness",
]

Array = NDArray[np.float64]

VOIGT_SOURCE = "Voigt (1889) uniform strain; upper bound by Hill (1952)"
REUSS_SOURCE = "Reuss (1929) uniform stress; lower bound by Hill (1952)"
HS_ISO_SOURCE = "Hashin & Shtrikman (1963) in Walpole's (1966) form; CTE by Levin (1967)"
HS_FIBRE_SOURCE = ("Hill (1964) and Hashin (1965): bounds on k23, G12, G23, E1, nu12 and E2 of "
                   "aligned fibres; CTE by Rosen & Hashin (1970)")
HS_SPHEROID_SOURCE = "Willis (1977) Hashin-Shtrikman bounds for aligned spheroidal statistics"
AVERAGED_SOURCE = "; fibre {what} averaged over the {orientation} orientations"


def _isotropic_moduli(f: Any, who: str) -> tuple[Array, Array]:
    """Bulk and shear moduli of an isotropic inclusion; raise naming ``who`` for any other."""
    if not f.is_isotropic:
        def first(x: Any) -> float:
            return float(np.ravel(x)[0])

        raise InvalidMaterialError(
            f"{who} (rule: E1 = E2, nu12 = nu23, G12 = E1 / (2 (1 + nu12))); the fibre has "
            f"E1 = {first(f.E1):.4g} Pa, E2 = {first(f.E2):.4g} Pa, nu12 = {first(f.nu12):.4g}, "
            f"nu23 = {first(f.nu23):.4g}, G12 = {first(f.G12):.4g} Pa"
        )
    return f.E1 / (3.0 * (1.0 - 2.0 * f.nu12)), f.G12


def _phase_fractions(fractions: ArrayLike, n: int) -> Array:
    c = np.asarray(fractions, dtype=np.float64)
    if c.shape[:1] != (n,):
        raise InputError(
            f"fractions: expected {n} phase fractions along the first axis, got shape {c.shape}"
        )
    cm.fraction(c, "fractions")
    total = np.sum(c, axis=0)
    bad = np.abs(total - 1.0) > 1e-9
    if np.any(bad):
        first = float(np.asarray(total)[bad].flat[0]) if total.ndim else float(total)
        raise FractionError(f"fractions sum to {first!r}, must sum to 1")
    return c


def _phase_stiffnesses(stiffnesses: ArrayLike, fractions: ArrayLike) -> tuple[Array, Array]:
    """Check N phase stiffnesses and fractions; return them, the fractions shaped (N, ..., 1, 1)."""
    C = np.asarray(stiffnesses, dtype=np.float64)
    if C.ndim < 3 or C.shape[-2:] != (6, 6):
        raise InputError(f"stiffnesses: expected shape (N, ..., 6, 6), got {C.shape}")
    return C, _phase_fractions(fractions, C.shape[0])[..., None, None]


def voigt_bound(stiffnesses: ArrayLike, fractions: ArrayLike) -> Array:
    """Voigt (upper) bound of N phases with any anisotropic 6x6 stiffness.

    Parameters
    ----------
    stiffnesses : array_like, shape (N, ..., 6, 6)
        Phase stiffnesses in a common frame, Pa (Voigt notation, engineering shear).
    fractions : array_like, shape (N, ...)
        Phase volume fractions, each in [0, 1], summing to 1.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        ``sum c_r C_r``, Pa.

    Raises
    ------
    FractionError
        If the fractions are outside [0, 1] or do not sum to 1.
    InputError
        If the shapes do not match.

    References
    ----------
    Voigt (1889); Hill (1952), Sec. 3.

    Examples
    --------
    >>> from micromech.tensors import isotropic_stiffness
    >>> C = voigt_bound([isotropic_stiffness(70e9, 0.3), isotropic_stiffness(3e9, 0.3)], [0.5, 0.5])
    >>> round(float(C[3, 3]) / 1e9, 4)  # (70 / 2.6 + 3 / 2.6) / 2 GPa
    14.0385
    """
    C, c = _phase_stiffnesses(stiffnesses, fractions)
    return np.asarray(np.sum(c * C, axis=0))


def reuss_bound(stiffnesses: ArrayLike, fractions: ArrayLike) -> Array:
    """Reuss (lower) bound of N phases with any anisotropic 6x6 stiffness.

    Parameters
    ----------
    stiffnesses : array_like, shape (N, ..., 6, 6)
        Phase stiffnesses in a common frame, Pa.
    fractions : array_like, shape (N, ...)
        Phase volume fractions, summing to 1.

    Returns
    -------
    ndarray, shape (..., 6, 6)
        ``(sum c_r C_r^-1)^-1``, Pa.

    Raises
    ------
    FractionError
        If the fractions are outside [0, 1] or do not sum to 1.
    InputError
        If the shapes do not match.

    References
    ----------
    Reuss (1929); Hill (1952), Sec. 3.

    Examples
    --------
    >>> from micromech.tensors import isotropic_stiffness
    >>> C = reuss_bound([isotropic_stiffness(70e9, 0.3), isotropic_stiffness(3e9, 0.3)], [0.5, 0.5])
    >>> round(float(C[3, 3]) / 1e9, 4)  # 1 / (0.5 / (70 / 2.6) + 0.5 / (3 / 2.6)) GPa
    2.2129
    """
    C, c = _phase_stiffnesses(stiffnesses, fractions)
    return np.asarray(np.linalg.inv(np.sum(c * np.linalg.inv(C), axis=0)))


def voigt_reuss(
    fibre: Any, matrix: Any, vf: ArrayLike, *, void_fraction: ArrayLike = 0.0,
    orientation: str = "aligned",
) -> tuple[ElasticConstants, ElasticConstants | None]:
    """Voigt and Reuss bounds of a fibre and a matrix, in closed transversely isotropic form.

    Voigt: ``c1 <C1> + c0 C0``; Reuss: ``(c1 <S1> + c0 S0)^-1``, with ``< >`` the average of
    the fibre stiffness or compliance over the fibre orientations (none for aligned fibres;
    :mod:`.orientation`). Uniform strain and uniform stress trial fields make them bounds for
    any arrangement (Hill 1952).

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre, transversely isotropic about axis 1.
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Fibre volume fraction, in [0, 1].
    void_fraction : array_like, shape (...)
        Void fraction (zero stiffness); with voids the Reuss bound is zero and None is returned.
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Fibres along axis 1, random in the 1-2 plane (axis 3 the normal) or random in space.

    Returns
    -------
    voigt, reuss : ElasticConstants (reuss None with voids)
        Upper and lower bounds on the moduli (the Poisson ratios are those of the bounding
        tensors, not bounds), in the composite's axes: transversely isotropic about axis 1
        (aligned; ``extra`` holds k23) or axis 3 (random in plane), or isotropic (random in
        space). No CTE: for fibres the uniform-field CTEs do not bound the transverse CTE,
        which can exceed both phases' values.

    Raises
    ------
    FractionError
        If a fraction is outside [0, 1] or vf + void_fraction > 1.
    InputError
        For an unknown orientation.

    References
    ----------
    Voigt (1889); Reuss (1929); Hill (1952); orientation averages: Advani and Tucker (1987).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> V, R = voigt_reuss(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.6)
    >>> round(float(V.G12) / 1e9, 4), round(float(R.G12) / 1e9, 4)
    (18.2234, 3.0404)
    """
    check_orientation_name(orientation)
    f, m = cm.phases(fibre, matrix)
    c, cv, voids = cm.void_fractions(vf, void_fraction)
    c0 = 1.0 - c - cv
    Cf, Cm = cm.fibre_tensor(f), cm.matrix_tensor(m)
    CV = W.add(W.scale(average(Cf, orientation), c), W.scale(Cm, c0))
    voigt = _oriented_result(W.inv(CV), orientation, "voigt", VOIGT_SOURCE, "stiffness", C=CV)
    if voids:
        return voigt, None
    SR = W.add(W.scale(average(W.inv(Cf), orientation), c), W.scale(W.inv(Cm), c0))
    return voigt, _oriented_result(SR, orientation, "reuss", REUSS_SOURCE, "compliance")


def _oriented_result(
    S: W.TI, orientation: str, model: str, source: str, averaged: str, C: W.TI | None = None
) -> ElasticConstants:
    """Constants of a bound with compliance S (stiffness C when known), in the composite's axes."""
    if orientation == "aligned":
        return cm.ti_result(W.inv(S) if C is None else C, model=model, source=source, S=S)
    source += AVERAGED_SOURCE.format(what=averaged, orientation=orientation)
    return cm.normal_result(S, orientation, model=model, source=source)


def hashin_shtrikman_isotropic(
    K: ArrayLike, G: ArrayLike, fractions: ArrayLike
) -> dict[str, Array]:
    """Hashin-Shtrikman bounds on K and G of N isotropic phases (Walpole's form).

    Parameters
    ----------
    K, G : array_like, shape (N, ...)
        Bulk and shear moduli of the phases, Pa (positive).
    fractions : array_like, shape (N, ...)
        Volume fractions, summing to 1.

    Returns
    -------
    dict of str to ndarray, shape (...)
        ``K_lower, K_upper, G_lower, G_upper`` in Pa.

    Raises
    ------
    FractionError
        If the fractions are outside [0, 1] or do not sum to 1.
    InvalidMaterialError
        If a modulus is not positive.

    References
    ----------
    Hashin and Shtrikman (1963), Eqs. 3.37-3.40 (from memory); Walpole (1966), Eqs. 29-30 (from
    memory) for phases that are not well ordered.

    Examples
    --------
    >>> b = hashin_shtrikman_isotropic([40e9, 4e9], [30e9, 1.5e9], [0.3, 0.7])
    >>> round(float(b["K_lower"]) / 1e9, 3)  # 1 / (0.3/42 + 0.7/6) - 2 GPa
    6.077
    """
    Ka = np.asarray(K, dtype=np.float64)
    Ga = np.asarray(G, dtype=np.float64)
    Ka, Ga = np.broadcast_arrays(Ka, Ga)
    if np.any(~(Ka > 0.0)) or np.any(~(Ga > 0.0)):
        raise InvalidMaterialError(
            f"hashin_shtrikman_isotropic: K and G must be positive, got min K = "
            f"{float(np.min(Ka))!r}, min G = {float(np.min(Ga))!r}"
        )
    c = _phase_fractions(fractions, Ka.shape[0])
    out: dict[str, Array] = {}
    for side, pick in (("lower", np.min), ("upper", np.max)):
        K0 = pick(Ka, axis=0)
        G0 = pick(Ga, axis=0)
        a = 4.0 / 3.0 * G0
        z = G0 / 6.0 * (9.0 * K0 + 8.0 * G0) / (K0 + 2.0 * G0)
        out[f"K_{side}"] = 1.0 / np.sum(c / (Ka + a), axis=0) - a
        out[f"G_{side}"] = 1.0 / np.sum(c / (Ga + z), axis=0) - z
    return out


def hashin_shtrikman(
    fibre: Any, matrix: Any, vf: ArrayLike
) -> tuple[ElasticConstants, ElasticConstants]:
    """Hashin-Shtrikman bounds of a statistically isotropic mixture of two isotropic phases.

    Parameters
    ----------
    fibre : FibrePhase or material
        Inclusion phase (isotropic: particles).
    matrix : MatrixPhase or material
        Matrix.
    vf : array_like, shape (...)
        Inclusion fraction, in [0, 1].

    Returns
    -------
    lower, upper : ElasticConstants
        Isotropic; E = 9KG/(3K + G) and G bounded, nu the value of the bounding (K, G) pair
        (Poisson's ratio itself is not bounded); CTE bounds by Levin's relation. ``extra`` has K, G.

    Raises
    ------
    InvalidMaterialError
        If the fibre is not isotropic.

    References
    ----------
    Hashin and Shtrikman (1963); Walpole (1966); Levin (1967).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> lo, hi = hashin_shtrikman(FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35), 0.3)
    >>> round(float(lo.extra["K"]) / 1e9, 3), round(float(hi.extra["K"]) / 1e9, 3)
    (5.885, 11.057)
    """
    f, m = cm.phases(fibre, matrix)
    Kf, Gf = _isotropic_moduli(
        f, "hashin_shtrikman: the isotropic bounds need an isotropic inclusion")
    c = cm.fraction(vf)
    Kf, Km, Gf, Gm, cc = np.broadcast_arrays(Kf, m.K, Gf, m.G, c)
    b = hashin_shtrikman_isotropic(np.stack([Kf, Km]), np.stack([Gf, Gm]), np.stack([cc, 1 - cc]))
    aL = aU = None
    if cm.has_cte(f, m):
        x = levin(Kf, Km, f.alpha1, m.alpha, c, b["K_lower"])  # type: ignore[arg-type]
        y = levin(Kf, Km, f.alpha1, m.alpha, c, b["K_upper"])  # type: ignore[arg-type]
        aL, aU = np.minimum(x, y), np.maximum(x, y)
    lower = cm.isotropic_result(b["K_lower"], b["G_lower"], model="hashin_shtrikman_lower",
                                source=HS_ISO_SOURCE, alpha=aL)
    upper = cm.isotropic_result(b["K_upper"], b["G_upper"], model="hashin_shtrikman_upper",
                                source=HS_ISO_SOURCE, alpha=aU)
    return lower, upper


def fibre_reference_form(
    fibre: Any, matrix: Any, vf: ArrayLike, m_ref: ArrayLike, k_ref: ArrayLike, p_ref: ArrayLike
) -> dict[str, Array]:
    """Aligned-fibre moduli of the Hashin-Shtrikman form with reference moduli (Hashin 1965).

    With the matrix's moduli as the references this is the composite cylinder assemblage (for
    k23, E1, nu12, G12) and Mori-Tanaka for continuous fibres; with the smallest (largest) phase
    moduli it gives the lower (upper) bounds.

    Parameters
    ----------
    fibre : FibrePhase or material
        Fibre, transversely isotropic about axis 1.
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Fibre fraction, in [0, 1].
    m_ref, k_ref, p_ref : array_like, shape (...)
        Reference transverse shear, plane-strain bulk and axial shear moduli, Pa.

    Returns
    -------
    dict of str to ndarray
        ``k23, G12, G23, E1, nu12, E2, nu23`` (E2 and nu23 from the TI relations; Pa).

    References
    ----------
    Hill (1964), Eqs. for the exact connections; Hashin (1965); Hashin and Rosen (1964).
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    d = 1.0 - c
    kf, km = f.k23, m.k23
    mf, mm = f.G23, m.G
    m0 = np.asarray(m_ref, dtype=np.float64)
    k0 = np.asarray(k_ref, dtype=np.float64)
    p0 = np.asarray(p_ref, dtype=np.float64)
    k = 1.0 / (c / (kf + m0) + d / (km + m0)) - m0
    G12 = 1.0 / (c / (f.G12 + p0) + d / (m.G + p0)) - p0
    mh = k0 * m0 / (k0 + 2.0 * m0)
    G23 = 1.0 / (c / (mf + mh) + d / (mm + mh)) - mh
    den = c / km + d / kf + 1.0 / m0
    dnu = f.nu12 - m.nu
    E1 = c * f.E1 + d * m.E + 4.0 * c * d * dnu**2 / den
    nu12 = c * f.nu12 + d * m.nu + c * d * dnu * (1.0 / km - 1.0 / kf) / den
    E2 = 1.0 / (0.25 / k + 0.25 / G23 + nu12**2 / E1)
    return {"k23": k, "G12": G12, "G23": G23, "E1": E1, "nu12": nu12, "E2": E2,
            "nu23": E2 / (2.0 * G23) - 1.0}


def reference_stiffness(b: dict[str, Array]) -> W.TI:
    """Stiffness with the k23, E1, nu12, G23 and G12 of :func:`fibre_reference_form`.

    Parameters
    ----------
    b : dict of str to ndarray
        The moduli returned by :func:`fibre_reference_form`, Pa.

    Returns
    -------
    walpole.TI
        Hill's moduli ``(k, l, n, m, p)`` with ``l = 2 k nu12`` and ``n = E1 + l^2 / k``, Pa.

    References
    ----------
    Hill (1964), the connections between k, l, n and E1, nu12.
    """
    k = b["k23"]
    l = 2.0 * k * b["nu12"]
    return W.from_hill(k, l, b["E1"] + l * l / k, b["G23"], b["G12"])


def hashin_shtrikman_fibre(
    fibre: Any, matrix: Any, vf: ArrayLike
) -> tuple[ElasticConstants, ElasticConstants]:
    """Bounds for aligned continuous fibres (Hill 1964; Hashin 1965), any transverse geometry.

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
    lower, upper : ElasticConstants
        Lower and upper bounds on E1, E2 (= E3), G12 (= G13), G23 and (extra) k23; nu12 (= nu13)
        bounded from both sides (lower holds the smaller value); nu23 is not bounded (None).
        alpha1, alpha2: bounds from Levin's relation over the k23 interval (Rosen and Hashin
        1970).

    References
    ----------
    Hill (1964); Hashin (1965); Rosen and Hashin (1970).

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> f, m = FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35)
    >>> lo, hi = hashin_shtrikman_fibre(f, m, 0.5)
    >>> bool(lo.E2 < hi.E2)
    True
    """
    f, m = cm.phases(fibre, matrix)
    c = cm.fraction(vf)
    ks = (f.k23, m.k23)
    ms = (f.G23, m.G)
    ps = (f.G12, m.G)
    lo = fibre_reference_form(f, m, c, np.minimum(*ms), np.minimum(*ks), np.minimum(*ps))
    hi = fibre_reference_form(f, m, c, np.maximum(*ms), np.maximum(*ks), np.maximum(*ps))
    nu_lo = np.minimum(lo["nu12"], hi["nu12"])
    nu_hi = np.maximum(lo["nu12"], hi["nu12"])
    aL: tuple[Array, Array] | None = None
    aU: tuple[Array, Array] | None = None
    if cm.has_cte(f, m):
        x = levin_fibre(W.inv(reference_stiffness(lo)), f, m, c)
        y = levin_fibre(W.inv(reference_stiffness(hi)), f, m, c)
        aL = (np.minimum(x[0], y[0]), np.minimum(x[1], y[1]))
        aU = (np.maximum(x[0], y[0]), np.maximum(x[1], y[1]))

    def build(
        b: dict[str, Array], nu: Array, a: tuple[Array, Array] | None, key: str
    ) -> ElasticConstants:
        return ElasticConstants(
            E1=b["E1"], E2=b["E2"], E3=b["E2"], G12=b["G12"], G13=b["G12"], G23=b["G23"],
            nu12=nu, nu13=nu, nu23=None,
            alpha1=None if a is None else a[0], alpha2=None if a is None else a[1],
            alpha3=None if a is None else a[1],
            model=key, source=HS_FIBRE_SOURCE, extra={"k23": b["k23"]},
        )

    return (build(lo, nu_lo, aL, "hashin_shtrikman_lower"),
            build(hi, nu_hi, aU, "hashin_shtrikman_upper"))


def hashin_shtrikman_spheroid(
    fibre: Any, matrix: Any, vf: ArrayLike, aspect_ratio: ArrayLike
) -> tuple[ElasticConstants, ElasticConstants]:
    """Willis' (1977) bounds for aligned spheroids of isotropic phases with spheroidal statistics.

    The comparison media are isotropic with the smallest (lower) and largest (upper) phase bulk
    and shear moduli; ``C = [sum c_r C_r T_r] [sum c_r T_r]^-1`` with
    ``T_r = [I + P0 (C_r - C0)]^-1`` and P0 the polarisation tensor of the spheroid in C0.

    Parameters
    ----------
    fibre : FibrePhase or material
        Isotropic inclusion phase.
    matrix : MatrixPhase or material
        Isotropic matrix.
    vf : array_like, shape (...)
        Inclusion fraction, in [0, 1].
    aspect_ratio : array_like, shape (...)
        Spheroid length over diameter (1 = sphere).

    Returns
    -------
    lower, upper : ElasticConstants
        Bounds on E1, E2, G12, G23 and (extra) k23; Poisson ratios None (not bounded);
        no CTE.

    Raises
    ------
    InvalidMaterialError
        If the fibre is not isotropic.

    References
    ----------
    Willis (1977), Eq. 4.11 form (from memory); Walpole (1966) for the choice of comparison
    moduli.

    Examples
    --------
    >>> from micromech.homogenize import FibrePhase, MatrixPhase
    >>> f, m = FibrePhase.isotropic(72e9, 0.22), MatrixPhase(3.5e9, 0.35)
    >>> lo, hi = hashin_shtrikman_spheroid(f, m, 0.2, 5.0)
    >>> round(float(lo.E1) / 1e9, 3), round(float(hi.E1) / 1e9, 3)
    (8.402, 16.129)
    """
    f, m = cm.phases(fibre, matrix)
    Kf, Gf = _isotropic_moduli(f, "hashin_shtrikman_spheroid: needs an isotropic inclusion")
    c = cm.fraction(vf)
    d = 1.0 - c
    Cf, Cm = W.isotropic(Kf, Gf), W.isotropic(m.K, m.G)
    out = []
    sides = ((np.minimum, "hashin_shtrikman_lower"), (np.maximum, "hashin_shtrikman_upper"))
    for pick, key in sides:
        K0, G0 = pick(Kf, m.K), pick(Gf, m.G)
        C0 = W.isotropic(K0, G0)
        P = polarization(K0, G0, aspect_ratio)
        Tf, Tm = dilute_concentration(P, Cf, C0), dilute_concentration(P, Cm, C0)
        num = W.add(W.scale(W.dot(Cf, Tf), c), W.scale(W.dot(Cm, Tm), d))
        den = W.add(W.scale(Tf, c), W.scale(Tm, d))
        C = W.dot(num, W.inv(den))
        C = W.TI(C.c, C.d, 0.5 * (C.e + C.f), 0.5 * (C.e + C.f), C.g, C.h)
        r = cm.ti_result(C, model=key, source=HS_SPHEROID_SOURCE)
        out.append(replace(r, nu12=None, nu13=None, nu23=None))  # Poisson ratios: not bounded
    return out[0], out[1]
