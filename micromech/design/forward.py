"""Forward models for design: properties of a composite as vectorised functions of the fraction.

:class:`Constituents` gathers what the estimates need besides the fibre fraction (fibre and
matrix phases, possibly arrays of several constituents, inclusion shape, voids, densities,
packing limit and an optional layup). :func:`properties_at` evaluates one model at an array of
fractions and returns a lazy mapping of:

* the ply constants of the estimate (``E1 E2 E3 G12 G13 G23 nu12 nu13 nu23 alpha1 alpha2
  alpha3``, as the model gives them);
* ``density`` = v_f rho_f + (1 - v_f - v_v) rho_m and ``weight_fraction`` = v_f rho_f / density
  (voids massless; Agarwal, Broutman and Chandrashekhara 2006, Sec. 3.2), when both densities are
  known; the laminate has the density of its plies;
* with a layup, the laminate's in-plane constants ``Ex Ey Gxy nuxy`` from classical laminate
  theory with plies of the estimated constants (:func:`laminate_in_plane`).

Models per inclusion shape (as in :func:`micromech.homogenize.estimate.estimate`): continuous
fibres use ``rule_of_mixtures, halpin_tsai, chamis, cylinders, mori_tanaka`` and the Hill-Hashin
fibre bounds; spheroids use ``halpin_tsai`` (aspect ratio >= 1) and ``mori_tanaka``, spheres
``mori_tanaka``, with Willis' spheroid bounds or the isotropic Hashin-Shtrikman bounds for an
isotropic inclusion. With voids only Mori-Tanaka applies (voids as a third phase) and there are
no bounds (the lower one is zero); voids also lower the density. Randomly oriented fibres
(``orientation = "random_in_plane"`` or ``"random_3d"``) use the orientation-averaged
``mori_tanaka`` only; the bounds are the isotropic Hashin-Shtrikman ones for ``random_3d`` of an
isotropic fibre, none for ``random_in_plane`` (as in ``estimate``).

References
----------
.. [1] Agarwal, B. D., Broutman, L. J., Chandrashekhara, K. (2006). *Analysis and Performance of
   Fiber Composites*, 3rd ed., Wiley, Sec. 3.2 (densities and weight fractions with voids).
.. [2] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Eq. (2.93)
   (reduced stiffness), Eqs. (2.103)-(2.104) (transformation), Eqs. (4.28)-(4.29) (ABD) and
   Sec. 4.5 (laminate engineering constants).
"""

from __future__ import annotations

from collections.abc import Callable, Iterator, Mapping, Sequence
from dataclasses import dataclass, fields, replace
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError, InputError
from micromech.homogenize.phases import FibrePhase, MatrixPhase
from micromech.results import ElasticConstants

__all__ = [
    "SIZING_MODELS",
    "BOUND_MODELS",
    "Constituents",
    "applicable_models",
    "chosen_models",
    "fraction_of",
    "estimate_at",
    "properties_at",
    "forward_model",
    "bound_models",
    "has_bounds",
    "mass_at",
    "laminate_in_plane",
]

Array = NDArray[np.float64]

#: Estimates used for sizing, in report order.
SIZING_MODELS: tuple[str, ...] = ("rule_of_mixtures", "halpin_tsai", "chamis", "cylinders",
                                  "mori_tanaka")
#: Keys of the rigorous bounds.
BOUND_MODELS: tuple[str, ...] = ("hashin_shtrikman_lower", "hashin_shtrikman_upper")

_ELASTIC = ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23", "alpha1", "alpha2",
            "alpha3")
_LAMINATE = ("Ex", "Ey", "Gxy", "nuxy")


def _opt_arr(x: ArrayLike | None) -> Array | None:
    return None if x is None else np.asarray(x, dtype=np.float64)


@dataclass(frozen=True, eq=False)
class Constituents:
    """Everything a design estimate needs besides the fibre volume fraction.

    Parameters
    ----------
    fibre : FibrePhase or material
        The fibre (constants may be arrays of shape (...) for several fibres at once).
    matrix : MatrixPhase or material
        The isotropic matrix (arrays broadcast with the fibre's).
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape.
    aspect_ratio : float, optional
        Spheroid length over diameter (spheroid only).
    void_fraction : float
        Void volume fraction, in [0, 1).
    fibre_density, matrix_density : array_like, optional
        Densities, kg/m^3 (needed for density, weight fraction and specific properties).
    packing_limit : float
        Largest fibre fraction, in (0, 1].
    angles : sequence of float, optional
        Ply angles of a layup, degrees, bottom to top (for Ex, Ey, Gxy, nuxy).
    ply_thickness : float
        Ply thickness, m (the in-plane constants do not depend on it for one ply material).
    layup : str
        The laminate code, for labels.
    name : str
        Label.
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Fibre orientation (see :class:`~micromech.materials.Composite`).

    Raises
    ------
    InputError
        For an unknown inclusion, a spheroid without aspect ratio, a packing limit outside
        (0, 1], or an orientation that does not fit the inclusion.
    FractionError
        For a void fraction outside [0, 1).
    """

    fibre: FibrePhase
    matrix: MatrixPhase
    inclusion: Literal["continuous", "spheroid", "sphere"] = "continuous"
    aspect_ratio: float | None = None
    void_fraction: float = 0.0
    fibre_density: Array | None = None
    matrix_density: Array | None = None
    packing_limit: float = 1.0
    angles: tuple[float, ...] | None = None
    ply_thickness: float = 1e-3
    layup: str = ""
    name: str = ""
    orientation: Literal["aligned", "random_in_plane", "random_3d"] = "aligned"

    def __post_init__(self) -> None:
        object.__setattr__(self, "fibre", FibrePhase.from_material(self.fibre))
        object.__setattr__(self, "matrix", MatrixPhase.from_material(self.matrix))
        if self.inclusion not in ("continuous", "spheroid", "sphere"):
            raise InputError(f"inclusion = {self.inclusion!r}: expected continuous, spheroid or "
                             "sphere")
        if self.inclusion == "spheroid" and self.aspect_ratio is None:
            raise InputError("aspect_ratio: a spheroid inclusion needs an aspect ratio")
        if self.orientation != "aligned":
            from micromech.materials.composite import check_orientation

            check_orientation(self.orientation, self.inclusion)
        if not 0.0 < float(self.packing_limit) <= 1.0:
            raise InputError(f"packing_limit = {self.packing_limit!r} must lie in (0, 1]")
        vv = float(self.void_fraction)
        if not 0.0 <= vv < 1.0:
            raise FractionError(f"void_fraction = {vv!r} must lie in [0, 1)")
        object.__setattr__(self, "void_fraction", vv)
        object.__setattr__(self, "packing_limit", float(self.packing_limit))
        object.__setattr__(self, "fibre_density", _opt_arr(self.fibre_density))
        object.__setattr__(self, "matrix_density", _opt_arr(self.matrix_density))
        if self.angles is not None:
            object.__setattr__(self, "angles", tuple(float(a) for a in self.angles))

    @classmethod
    def from_composite(
        cls,
        composite: Any,
        *,
        layup: str | None = None,
        ply_thickness: float | None = None,
        fibre: Any = None,
        matrix: Any = None,
        fibre_density: ArrayLike | None = None,
        matrix_density: ArrayLike | None = None,
    ) -> Constituents:
        """Build from a :class:`~micromech.materials.Composite`, optionally overriding phases.

        Parameters
        ----------
        composite : Composite
            Constituents, inclusion, arrangement (packing limit) and void fraction.
        layup : str, optional
            Laminate code (e.g. ``"[0/90]s"``) for the laminate properties.
        ply_thickness : float, optional
            Ply thickness, m.
        fibre, matrix : FibrePhase, MatrixPhase or material, optional
            Replace the composite's constituents (arrays: several constituents at once).
        fibre_density, matrix_density : array_like, optional
            Replace the densities, kg/m^3.

        Returns
        -------
        Constituents
            The design description.
        """
        angles = None
        if layup:
            from micromech.laminate.layup import parse_layup

            angles = parse_layup(layup)
        f = composite.fibre if fibre is None else fibre
        m = composite.matrix if matrix is None else matrix
        rf = _opt_arr(fibre_density if fibre_density is not None else getattr(f, "density", None))
        rm = _opt_arr(matrix_density if matrix_density is not None
                      else getattr(m, "density", None))
        return cls(
            fibre=f, matrix=m, inclusion=composite.inclusion,
            aspect_ratio=composite.aspect_ratio if composite.inclusion == "spheroid" else None,
            void_fraction=float(np.max(composite.void_fraction)), fibre_density=rf,
            matrix_density=rm, packing_limit=composite.packing_limit, angles=angles,
            ply_thickness=1e-3 if ply_thickness is None else float(ply_thickness),
            layup=layup or "", name=getattr(composite, "name", "") or "",
            orientation=getattr(composite, "orientation", "aligned"),
        )

    @classmethod
    def from_case(cls, case: Any) -> Constituents:
        """Build from a loaded case (its [composite] and, when given, its [laminate] layup).

        Parameters
        ----------
        case : Case
            From :func:`micromech.case.load_case`.

        Returns
        -------
        Constituents
            The design description.

        Raises
        ------
        InputError
            If the case has no [composite] (fibre, matrix and fraction).
        """
        comp = getattr(case, "composite", None)
        if comp is None:
            raise InputError(f"case {getattr(case, 'name', '')!r}: sizing needs [fibre], [matrix] "
                             "and [composite]")
        lam = getattr(case, "laminate", None)
        return cls.from_composite(
            comp, layup=None if lam is None else lam.layup,
            ply_thickness=None if lam is None else lam.ply_thickness,
        )

    @property
    def inclusion_text(self) -> str:
        """The inclusion shape, with the orientation when it is not aligned (for messages)."""
        return self.inclusion if self.orientation == "aligned" else \
            f"{self.inclusion} ({self.orientation})"

    @property
    def upper_fraction(self) -> float:
        """Largest admissible fibre fraction: the packing limit, and 1 - void fraction."""
        return min(self.packing_limit, 1.0 - self.void_fraction)

    @property
    def has_density(self) -> bool:
        """Whether both densities are known."""
        return self.fibre_density is not None and self.matrix_density is not None

    @property
    def shape(self) -> tuple[int, ...]:
        """Broadcast shape of the constituent constants (``()`` for one fibre and matrix)."""
        arrays = [getattr(self.fibre, f.name) for f in fields(self.fibre)]
        arrays += [getattr(self.matrix, f.name) for f in fields(self.matrix)]
        arrays += [self.fibre_density, self.matrix_density]
        return np.broadcast_shapes(*(np.shape(a) for a in arrays if a is not None))

    def expanded(self) -> Constituents:
        """Return a copy whose constants have a trailing axis, to broadcast against a sweep axis.

        Returns
        -------
        Constituents
            Constants reshaped from (...) to (..., 1) (unchanged when scalar).
        """
        if self.shape == ():
            return self

        def ex(x: Array | None) -> Any:
            return None if x is None else np.broadcast_to(x, self.shape)[..., None]

        f = FibrePhase(**{k.name: ex(getattr(self.fibre, k.name)) for k in fields(self.fibre)})
        m = MatrixPhase(**{k.name: ex(getattr(self.matrix, k.name)) for k in fields(self.matrix)})
        return replace(self, fibre=f, matrix=m, fibre_density=ex(self.fibre_density),
                       matrix_density=ex(self.matrix_density))


def applicable_models(c: Constituents) -> tuple[str, ...]:
    """Return the estimate keys that apply to the inclusion shape.

    Parameters
    ----------
    c : Constituents
        The design description.

    Returns
    -------
    tuple of str
        Subset of :data:`SIZING_MODELS`, in its order (randomly oriented fibres: Mori-Tanaka).
    """
    if c.void_fraction > 0.0 or c.orientation != "aligned":
        return ("mori_tanaka",)
    if c.inclusion == "continuous":
        return SIZING_MODELS
    if c.inclusion == "spheroid" and float(c.aspect_ratio) >= 1.0:  # type: ignore[arg-type]
        return ("halpin_tsai", "mori_tanaka")
    return ("mori_tanaka",)


def chosen_models(c: Constituents, models: Sequence[str] | None) -> tuple[str, ...]:
    """Check the estimate keys a user chose against those that apply (all of them for None).

    Parameters
    ----------
    c : Constituents
        The design description.
    models : sequence of str or None
        Chosen estimate keys.

    Returns
    -------
    tuple of str
        The chosen keys (or every applicable one).

    Raises
    ------
    InputError
        If a key does not apply to the inclusion shape (bounds are named with a hint: they
        are added with ``bounds=True``).
    """
    keys = applicable_models(c)
    chosen = tuple(keys if models is None else models)
    for k in chosen:
        if k not in keys:
            hint = " (bounds are added with bounds=True)" if k in BOUND_MODELS else ""
            raise InputError(f"models: {k!r} does not apply to {c.inclusion_text} inclusions; "
                             f"choose from {', '.join(keys)}{hint}")
    return chosen


def fraction_of(c: Constituents, design: Any, volume_fraction: float | None, what: str) -> float:
    """Return the fibre fraction given, or else the design's own, checked against packing.

    Parameters
    ----------
    c : Constituents
        The design description (for the packing limit).
    design : Composite, Case or Constituents
        Where the fraction comes from when ``volume_fraction`` is None.
    volume_fraction : float or None
        The fraction given.
    what : str
        How the fraction is named in the message when none is found
        (``"the mean fibre fraction"``).

    Returns
    -------
    float
        The fibre volume fraction.

    Raises
    ------
    InputError
        If no fraction is given nor found, or it lies outside [0, packing limit].
    """
    if volume_fraction is None:
        comp = getattr(design, "composite", design)
        if not hasattr(comp, "volume_fraction"):
            raise InputError(f"volume_fraction: give {what}")
        volume_fraction = float(np.asarray(comp.volume_fraction))
    vf = float(volume_fraction)
    if not 0.0 <= vf <= c.upper_fraction:
        raise InputError(f"volume_fraction = {vf!r} must lie in [0, {c.upper_fraction:.4g}] "
                         "(the packing limit)")
    return vf


def estimate_at(c: Constituents, model: str, vf: ArrayLike) -> ElasticConstants:
    """Evaluate one estimate (or bound) at an array of fibre fractions.

    Parameters
    ----------
    c : Constituents
        The design description.
    model : str
        A key of :data:`SIZING_MODELS` or :data:`BOUND_MODELS`.
    vf : array_like, shape (...)
        Fibre volume fractions (broadcast with the constituent constants).

    Returns
    -------
    ElasticConstants
        The estimate.

    Raises
    ------
    InputError
        If the model does not apply to the inclusion shape (or is unknown).

    References
    ----------
    See the estimators in :mod:`micromech.homogenize` (each names its source).
    """
    from micromech.homogenize.chamis import chamis
    from micromech.homogenize.cylinders import cylinders
    from micromech.homogenize.halpin_tsai import halpin_tsai
    from micromech.homogenize.mori_tanaka import mori_tanaka
    from micromech.homogenize.rule_of_mixtures import rule_of_mixtures

    f, m, v = c.fibre, c.matrix, np.asarray(vf, dtype=np.float64)
    cont = c.inclusion == "continuous"
    if model in BOUND_MODELS:
        pair = None if c.void_fraction > 0.0 else _bounds_pair(c, v)
        if pair is None:
            raise InputError(f"model {model!r}: no bounds with voids, nor for {c.inclusion} "
                             "inclusions of an anisotropic fibre, nor for fibres random in "
                             "plane")
        return pair[0] if model.endswith("lower") else pair[1]
    if model not in applicable_models(c):
        raise InputError(f"model {model!r} does not apply to {c.inclusion_text} inclusions; use "
                         f"one of {', '.join(applicable_models(c))}")
    if model == "mori_tanaka":
        return mori_tanaka(f, m, v, c.inclusion, c.aspect_ratio if c.inclusion == "spheroid"
                           else None, orientation=c.orientation, void_fraction=c.void_fraction)
    if model == "halpin_tsai":
        return halpin_tsai(f, m, v, aspect_ratio=None if cont else c.aspect_ratio)
    fn: Callable[..., ElasticConstants] = {
        "rule_of_mixtures": rule_of_mixtures, "chamis": chamis, "cylinders": cylinders,
    }[model]
    return fn(f, m, v)


def _bounds_pair(c: Constituents, v: Array) -> tuple[ElasticConstants, ElasticConstants] | None:
    from micromech.homogenize import bounds as hb

    if not has_bounds(c):
        return None
    if c.orientation == "random_3d":
        return hb.hashin_shtrikman(c.fibre, c.matrix, v)
    if c.inclusion == "continuous":
        return hb.hashin_shtrikman_fibre(c.fibre, c.matrix, v)
    if not c.fibre.is_isotropic:
        return None
    if c.inclusion == "sphere":
        return hb.hashin_shtrikman(c.fibre, c.matrix, v)
    return hb.hashin_shtrikman_spheroid(c.fibre, c.matrix, v, float(c.aspect_ratio or 1.0))


def mass_at(c: Constituents, vf: ArrayLike) -> dict[str, Array]:
    """Composite density and fibre weight fraction at fibre fractions (empty without densities).

    Parameters
    ----------
    c : Constituents
        The design description.
    vf : array_like, shape (...)
        Fibre volume fractions.

    Returns
    -------
    dict
        ``density`` = v_f rho_f + (1 - v_f - v_v) rho_m (kg/m^3) and ``weight_fraction`` =
        v_f rho_f / density; empty when a density is missing.

    References
    ----------
    Agarwal, Broutman and Chandrashekhara (2006), Sec. 3.2 (from memory).
    """
    if not c.has_density:
        return {}
    v = np.asarray(vf, dtype=np.float64)
    rf, rm = np.asarray(c.fibre_density), np.asarray(c.matrix_density)
    mf = v * rf
    rho = mf + (1.0 - v - c.void_fraction) * rm
    return {"density": rho, "weight_fraction": mf / rho}


class _Properties(Mapping[str, Array]):
    """Lazy mapping: the estimate's constants, mass properties and laminate constants."""

    def __init__(self, c: Constituents, constants: ElasticConstants, vf: Array) -> None:
        self._c, self._k, self._vf = c, constants, vf
        self._cache: dict[str, Array] = {}

    def _names(self) -> list[str]:
        out = [k for k in _ELASTIC if self._k.get(k) is not None]
        if self._c.has_density:
            out += ["density", "weight_fraction"]
        if self._c.angles and all(self._k.get(k) is not None for k in ("E1", "E2", "nu12", "G12")):
            out += list(_LAMINATE)
        return out

    def __getitem__(self, key: str) -> Array:
        if key in _ELASTIC:
            v = self._k.get(key)
            if v is None:
                raise KeyError(key)
            return v
        if key not in self._cache:
            if key in ("density", "weight_fraction"):
                self._cache.update(mass_at(self._c, self._vf))
            elif key in _LAMINATE and key in self._names():
                k = self._k
                self._cache.update(laminate_in_plane(
                    k.E1, k.E2, k.nu12, k.G12, self._c.angles,  # type: ignore[arg-type]
                    np.full(len(self._c.angles), self._c.ply_thickness),  # type: ignore[arg-type]
                ))
        if key not in self._cache:
            raise KeyError(key)
        return self._cache[key]

    def __iter__(self) -> Iterator[str]:
        return iter(self._names())

    def __len__(self) -> int:
        return len(self._names())


def properties_at(c: Constituents, model: str, vf: ArrayLike) -> Mapping[str, Array]:
    """All design properties of one model at fibre fractions, as a lazy mapping.

    Parameters
    ----------
    c : Constituents
        The design description.
    model : str
        Estimate or bound key.
    vf : array_like, shape (...)
        Fibre volume fractions.

    Returns
    -------
    Mapping of str to ndarray
        Ply constants, ``density``, ``weight_fraction`` and (with a layup) ``Ex Ey Gxy nuxy``;
        names the model does not give are absent.
    """
    v = np.asarray(vf, dtype=np.float64)
    return _Properties(c, estimate_at(c, model, v), v)


def forward_model(c: Constituents, model: str) -> Callable[[Array], Mapping[str, Array]]:
    """Return ``vf -> properties_at(c, model, vf)``, the form the sizing and sweeps take.

    Parameters
    ----------
    c : Constituents
        The design description.
    model : str
        Estimate or bound key.

    Returns
    -------
    callable
        The forward model.
    """
    def f(vf: Array) -> Mapping[str, Array]:
        return properties_at(c, model, vf)

    return f


def bound_models(c: Constituents) -> tuple[Callable[[Array], Mapping[str, Array]],
                                           Callable[[Array], Mapping[str, Array]]] | None:
    """Lower and upper bound forward models, or None where no bounds apply.

    Parameters
    ----------
    c : Constituents
        The design description.

    Returns
    -------
    tuple of callable or None
        ``(lower, upper)``.
    """
    if c.void_fraction > 0.0 or not has_bounds(c):
        return None
    return forward_model(c, BOUND_MODELS[0]), forward_model(c, BOUND_MODELS[1])


def has_bounds(c: Constituents) -> bool:
    """Whether Hashin-Shtrikman type bounds exist for the inclusion shape and orientation.

    Aligned continuous fibres (Hill 1964, Hashin 1965), aligned spheres and spheroids of an
    isotropic fibre (Hashin and Shtrikman 1963, Willis 1977), and isotropic fibres random in
    space (Hashin and Shtrikman 1963: any statistically isotropic composite); not anisotropic
    particles nor fibres random in plane. Voids are not considered here.

    Parameters
    ----------
    c : Constituents
        The design description.

    Returns
    -------
    bool
        True where :data:`BOUND_MODELS` apply (without voids).
    """
    if c.orientation == "random_in_plane":
        return False
    if c.orientation == "random_3d":
        return c.fibre.is_isotropic
    return c.inclusion == "continuous" or c.fibre.is_isotropic


def laminate_in_plane(
    E1: ArrayLike,
    E2: ArrayLike,
    nu12: ArrayLike,
    G12: ArrayLike,
    angles: ArrayLike,
    thicknesses: ArrayLike | None = None,
    *,
    bending: Literal["free", "restrained"] = "free",
) -> dict[str, Array]:
    """In-plane engineering constants of a laminate of one ply material, vectorised.

    The transformed stiffness of every ply is written with the stiffness invariants U1 ... U5 of
    the ply and cos 2theta, cos 4theta, sin 2theta, sin 4theta of its angle, so A, B and D are
    the invariants times thickness-weighted sums of these over the plies [1]_: no (N, 3, 3)
    temporaries and no batched inverse on the common path (symmetric laminates, or
    ``bending="restrained"``), where A^-1 is written out by cofactors.

    Parameters
    ----------
    E1, E2, nu12, G12 : array_like, shape (...)
        Ply constants, Pa (dimensionless nu12).
    angles : array_like, shape (n,) or (..., n)
        Ply angles, degrees, bottom to top (the last axis runs over the plies; leading axes
        broadcast with the ply constants, e.g. an angle sweep).
    thicknesses : array_like, shape (n,), optional
        Ply thicknesses, m (equal plies by default).
    bending : {"free", "restrained"}
        "free": from the in-plane block of ABD^-1, i.e. (A - B D^-1 B)^-1; "restrained": A^-1.
        Equal for symmetric laminates.

    Returns
    -------
    dict of str to ndarray, shape (...)
        ``Ex = 1/(h a11)``, ``Ey = 1/(h a22)``, ``Gxy = 1/(h a66)``, ``nuxy = -a12/a11``.

    Raises
    ------
    InputError
        For no plies, thicknesses of the wrong length or an unknown ``bending``.

    References
    ----------
    .. [1] Tsai, S. W., Pagano, N. J. (1968). Invariant properties of composite materials. In:
       Tsai, Halpin, Pagano (eds.), *Composite Materials Workshop*, Technomic, 233-253
       (the invariants U1 ... U5; from memory); Jones (1999), 2nd ed., Sec. 2.6.
    .. [2] Kaw (2006), Eq. (2.93), Eqs. (4.28)-(4.29) and Sec. 4.5.

    Examples
    --------
    >>> c = laminate_in_plane(181e9, 10.3e9, 0.28, 7.17e9, [0.0])
    >>> round(float(c["Ex"]) / 1e9, 6)
    181.0
    """
    if bending not in ("free", "restrained"):
        raise InputError(f"bending: expected 'free' or 'restrained', got {bending!r}")
    ang = np.asarray(angles, dtype=np.float64)
    if ang.ndim == 0 or ang.shape[-1] == 0:
        raise InputError("angles: a laminate needs at least one ply")
    n = ang.shape[-1]
    t = np.full(n, 1.0) if thicknesses is None else np.asarray(thicknesses, dtype=np.float64)
    if t.shape != (n,):
        raise InputError(f"thicknesses: {t.shape} given for {n} plies")
    z = np.concatenate(([0.0], np.cumsum(t))) - t.sum() / 2.0
    h = float(t.sum())
    # reduced stiffness (Kaw 2006, Eq. 2.93) and its invariants (Tsai and Pagano 1968)
    e1, e2, v12, g12 = (np.asarray(x, dtype=np.float64) for x in (E1, E2, nu12, G12))
    d = 1.0 - v12 * v12 * e2 / e1
    q11, q22, q12, q66 = e1 / d, e2 / d, v12 * e2 / d, g12 + 0.0 * d
    U1 = (3.0 * q11 + 3.0 * q22 + 2.0 * q12 + 4.0 * q66) / 8.0
    U2 = (q11 - q22) / 2.0
    U3 = (q11 + q22 - 2.0 * q12 - 4.0 * q66) / 8.0
    U4 = (q11 + q22 + 6.0 * q12 - 4.0 * q66) / 8.0
    U5 = (q11 + q22 - 2.0 * q12 + 4.0 * q66) / 8.0
    r = np.deg2rad(ang)
    trig = np.stack([np.cos(2 * r), np.cos(4 * r), np.sin(2 * r), np.sin(4 * r)])  # (4, ..., n)
    weights = (t, (z[1:] ** 2 - z[:-1] ** 2) / 2.0, (z[1:] ** 3 - z[:-1] ** 3) / 3.0)

    def block(w: Array) -> tuple[Array, ...]:
        """Entries 11, 22, 12, 66, 16, 26 of sum_k w_k Qbar_k."""
        w0 = float(w.sum())
        c2, c4, s2, s4 = (trig * w).sum(-1)
        return (U1 * w0 + U2 * c2 + U3 * c4, U1 * w0 - U2 * c2 + U3 * c4, U4 * w0 - U3 * c4,
                U5 * w0 - U3 * c4, U2 / 2.0 * s2 + U3 * s4, U2 / 2.0 * s2 - U3 * s4)

    A = block(weights[0])
    B = block(weights[1])
    scale = max(float(np.max(np.abs(a))) for a in A)
    coupled = bending == "free" and any(bool(np.any(np.abs(b) > 1e-12 * scale * h)) for b in B)
    if coupled:
        D = block(weights[2])
        Am, Bm, Dm = (_sym3(*m) for m in (A, B, D))
        Ared = Am - Bm @ np.linalg.solve(Dm, Bm)
        A = (Ared[..., 0, 0], Ared[..., 1, 1], Ared[..., 0, 1], Ared[..., 2, 2],
             Ared[..., 0, 2], Ared[..., 1, 2])
    a11, a22, a12, a66 = _inverse_entries(*A)
    return {"Ex": 1.0 / (h * a11), "Ey": 1.0 / (h * a22), "Gxy": 1.0 / (h * a66),
            "nuxy": -a12 / a11}


def _sym3(m11: Array, m22: Array, m12: Array, m66: Array, m16: Array, m26: Array) -> Array:
    """Assemble a symmetric (..., 3, 3) matrix in the order 1, 2, 6 from its entries."""
    m11, m22, m12, m66, m16, m26 = np.broadcast_arrays(m11, m22, m12, m66, m16, m26)
    return np.stack([np.stack([m11, m12, m16], -1), np.stack([m12, m22, m26], -1),
                     np.stack([m16, m26, m66], -1)], -2)


def _inverse_entries(
    m11: Array, m22: Array, m12: Array, m66: Array, m16: Array, m26: Array
) -> tuple[Array, Array, Array, Array]:
    """Entries 11, 22, 12, 66 of the inverse of a symmetric 3x3 matrix, by cofactors."""
    c11 = m22 * m66 - m26 * m26
    c12 = m16 * m26 - m12 * m66
    c16 = m12 * m26 - m22 * m16
    det = m11 * c11 + m12 * c12 + m16 * c16
    return c11 / det, (m11 * m66 - m16 * m16) / det, c12 / det, (m11 * m22 - m12 * m12) / det
