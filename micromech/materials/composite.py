"""Composite specification: fibre + matrix + fraction + inclusion shape + arrangement.

Fractions are volume fractions of the whole composite (voids included). Weight fractions are
fractions of the solid mass (voids carry no mass) and are converted with the densities:

    v_f0 = (w_f / rho_f) / (w_f / rho_f + (1 - w_f) / rho_m)      (void-free fibre fraction)
    v_f  = (1 - v_v) v_f0,   v_m = (1 - v_v) (1 - v_f0)
    w_f  = v_f rho_f / (v_f rho_f + v_m rho_m),  rho_c = v_f rho_f + v_m rho_m

(Agarwal, Broutman and Chandrashekhara 2006, Sec. 3.2, from memory; the void content is the
volume share of the composite not filled by fibre or matrix, as in ASTM D2734.)

The fibre fraction may not exceed the packing limit of the stated arrangement:

============== ===================================== ============================================
inclusion      arrangement: limit                    source
============== ===================================== ============================================
continuous     square: pi/4 = 0.7854                 exact (touching circles on a square grid)
continuous     hexagonal: pi/(2 sqrt 3) = 0.9069     exact (densest circle packing)
continuous     random: 0.82                          random close packing of equal discs,
                                                     Berryman (1983), from memory
sphere         square: pi/6 = 0.5236                 exact (simple cubic)
sphere         hexagonal: pi/(3 sqrt 2) = 0.7405     exact (face-centred cubic / hcp, Hales 2005)
sphere         random: 0.64                          random close packing of spheres,
                                                     Scott and Kilgour (1969), from memory
spheroid       as sphere                             aligned spheroids are an affine image of a
                                                     sphere packing, which keeps volume fractions
============== ===================================== ============================================

The spheroid limit assumes aligned spheroids (the case of the mean-field estimates). Randomly
oriented long rods pack much less densely (about 5.4 / aspect ratio, Philipse 1996, from
memory); that limit is not applied, also not with ``orientation = "random_3d"``.

Fibre orientation (``orientation``):

================ ================================================= ==========================
orientation      meaning, axes of the results                      allowed inclusions
================ ================================================= ==========================
aligned          all fibre axes along axis 1 (the default)         any
random_in_plane  fibre axes uniformly distributed over the 1-2     spheroid, continuous
                 plane; axis 3 is the plate normal, the composite
                 is transversely isotropic about it (E1 = E2)
random_3d        fibre axes uniformly distributed over all          spheroid
                 directions; the composite is isotropic
================ ================================================= ==========================

Continuous fibres randomly oriented in the plane stand for a continuous-filament or
chopped-strand mat, or a stack of thin unidirectional layers at random angles: the classical
orientation average of the aligned stiffness, Christensen and Waals (1972) (from memory). Straight
continuous fibres cannot run in every direction in space without crossing, so
``random_3d`` needs ``spheroid`` (a large aspect ratio approaches long fibres; Christensen and
Waals 1972 treat the 3D average as that limit). A sphere has no orientation: only ``aligned``.
Random orientations need ``arrangement = "random"``: the square and hexagonal packing limits are
those of aligned inclusions.

References
----------
.. [1] Agarwal, B. D., Broutman, L. J., Chandrashekhara, K. (2006). *Analysis and Performance of
   Fiber Composites*, 3rd ed., Wiley, Sec. 3.2 (weight and volume fractions, voids).
.. [2] Berryman, J. G. (1983). Random close packing of hard spheres and disks. *Physical Review
   A* 27(2), 1053-1061.
.. [3] Scott, G. D., Kilgour, D. M. (1969). The density of random close packing of spheres.
   *Journal of Physics D* 2(6), 863-866.
.. [4] Hales, T. C. (2005). A proof of the Kepler conjecture. *Annals of Mathematics* 162,
   1065-1185.
.. [5] Christensen, R. M., Waals, F. M. (1972). Effective stiffness of randomly oriented fibre
   composites. *Journal of Composite Materials* 6, 518-535 (from memory).
.. [6] Philipse, A. P. (1996). The random contact equation and its implications for (colloidal)
   rods in packings, suspensions, and anisotropic powders. *Langmuir* 12, 1127-1133 (from
   memory).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import FractionError, InputError, InvalidMaterialError, suggest
from micromech.materials.models import Isotropic, Material, Orthotropic, TransverselyIsotropic
from micromech.shapes import INCLUSIONS, ORIENTATIONS
from micromech.tensors import at_index
from micromech.units import parse_quantity

__all__ = [
    "Composite",
    "PACKING_LIMITS",
    "INCLUSIONS",
    "ARRANGEMENTS",
    "ORIENTATIONS",
    "ORIENTATION_INCLUSIONS",
    "check_fraction",
    "check_orientation",
    "packing_limit",
    "volume_fraction_from_weight",
    "weight_fraction_from_volume",
]

Array = NDArray[np.float64]
Inclusion = Literal["continuous", "spheroid", "sphere"]
Arrangement = Literal["random", "square", "hexagonal"]
Orientation = Literal["aligned", "random_in_plane", "random_3d"]

# INCLUSIONS and ORIENTATIONS (micromech.shapes) are those the estimates implement.
ARRANGEMENTS: tuple[str, ...] = ("random", "square", "hexagonal")
#: orientation -> inclusions it is allowed with (see the module table).
ORIENTATION_INCLUSIONS: dict[str, tuple[str, ...]] = {
    "aligned": INCLUSIONS,
    "random_in_plane": ("spheroid", "continuous"),
    "random_3d": ("spheroid",),
}

#: (inclusion, arrangement) -> (limit, how it is known).
PACKING_LIMITS: dict[tuple[str, str], tuple[float, str]] = {
    ("continuous", "square"): (math.pi / 4.0, "pi/4, touching circles on a square grid"),
    ("continuous", "hexagonal"): (
        math.pi / (2.0 * math.sqrt(3.0)), "pi/(2 sqrt 3), touching circles on a hexagonal grid"
    ),
    ("continuous", "random"): (0.82, "random close packing of equal discs, Berryman 1983, "
                                     "from memory"),
    ("sphere", "square"): (math.pi / 6.0, "pi/6, simple cubic packing of spheres"),
    ("sphere", "hexagonal"): (
        math.pi / (3.0 * math.sqrt(2.0)), "pi/(3 sqrt 2), face-centred cubic / hcp packing"
    ),
    ("sphere", "random"): (0.64, "random close packing of spheres, Scott and Kilgour 1969, "
                                 "from memory"),
}
for _arr_name in ARRANGEMENTS:  # aligned spheroids: affine image of the sphere packing
    PACKING_LIMITS[("spheroid", _arr_name)] = (
        PACKING_LIMITS[("sphere", _arr_name)][0],
        PACKING_LIMITS[("sphere", _arr_name)][1] + " (aligned spheroids: affine image)",
    )


def packing_limit(inclusion: str, arrangement: str) -> float:
    """Largest inclusion volume fraction for an inclusion shape and arrangement.

    Parameters
    ----------
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape.
    arrangement : {"random", "square", "hexagonal"}
        Arrangement (square = simple cubic and hexagonal = face-centred cubic for spheres).

    Returns
    -------
    float
        The packing limit (see the module table for sources).

    Examples
    --------
    >>> round(packing_limit("continuous", "hexagonal"), 4)
    0.9069
    """
    _choice("inclusion", inclusion, INCLUSIONS)
    _choice("arrangement", arrangement, ARRANGEMENTS)
    return PACKING_LIMITS[(inclusion, arrangement)][0]


def _choice(field: str, value: Any, options: tuple[str, ...]) -> str:
    if value not in options:
        raise InputError(f"{field} = {value!r} is not one of {', '.join(options)}"
                         f"{suggest(value, options)}")
    return str(value)


def check_orientation(orientation: Any, inclusion: str, arrangement: str = "random") -> str:
    """Check a fibre orientation against the inclusion shape and the arrangement.

    Parameters
    ----------
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Fibre orientation.
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape.
    arrangement : {"random", "square", "hexagonal"}
        Arrangement.

    Returns
    -------
    str
        The orientation.

    Raises
    ------
    InputError
        For an unknown orientation, a random orientation of spheres, continuous fibres random
        in space, or a random orientation with a square or hexagonal arrangement (see the
        module table).

    References
    ----------
    Christensen and Waals (1972) (orientation averages of aligned-fibre stiffness, from memory).

    Examples
    --------
    >>> check_orientation("random_in_plane", "continuous")
    'random_in_plane'
    """
    _choice("orientation", orientation, ORIENTATIONS)
    if orientation == "aligned":
        return "aligned"
    allowed = ORIENTATION_INCLUSIONS[orientation]
    if inclusion not in allowed:
        why = ("a sphere has no orientation" if inclusion == "sphere" else
               "straight continuous fibres cannot run in every direction in space; use "
               "inclusion = 'spheroid' with a large aspect_ratio")
        raise InputError(
            f"orientation = {orientation!r} is not allowed with inclusion = {inclusion!r} "
            f"(rule: {orientation} needs inclusion {' or '.join(repr(a) for a in allowed)}; "
            f"{why})"
        )
    if arrangement != "random":
        raise InputError(
            f"orientation = {orientation!r} is not allowed with arrangement = {arrangement!r} "
            "(rule: randomly oriented inclusions need arrangement = 'random'; the square and "
            "hexagonal packing limits are those of aligned inclusions)"
        )
    return str(orientation)


def _fraction(value: Any, field: str) -> float | Array:
    if isinstance(value, str):
        value = parse_quantity(value, "dimensionless", field)
    if isinstance(value, bool) or value is None:
        raise FractionError(f"{field} = {value!r} is not a number (rule: a fraction in [0, 1])")
    try:
        a = np.asarray(value, dtype=np.float64)
    except (TypeError, ValueError):
        raise FractionError(
            f"{field} = {value!r} is not a number or an array of numbers (rule: fractions in "
            "[0, 1])"
        ) from None
    if a.ndim == 0:
        return float(a)
    a = a.copy()
    a.flags.writeable = False
    return a


def check_fraction(x: ArrayLike, field: str, *, open_upper: bool = False) -> None:
    """Raise FractionError unless every value is a finite fraction in [0, 1] (or [0, 1)).

    Parameters
    ----------
    x : array_like, shape (...)
        The fraction(s).
    field : str
        Name for the message.
    open_upper : bool
        Whether 1 is excluded (a void fraction).

    Raises
    ------
    FractionError
        Naming the field, the first bad value, its index and the rule.
    """
    a = np.asarray(x)
    bad = ~np.isfinite(a) | (a < 0.0) | ((a >= 1.0) if open_upper else (a > 1.0))
    if np.any(bad):
        val = a[np.nonzero(bad)][0] if a.ndim else a
        rule = "0 <= value < 1" if open_upper else "0 <= value <= 1"
        raise FractionError(f"{field} = {float(val)!r}{at_index(bad)} is outside [0, 1] "
                            f"(rule: {rule})")


def _density(m: Material, role: str) -> float:
    if m.density is None:
        raise InvalidMaterialError(
            f"{role} {m.label!r} has no density; converting between weight and volume fractions "
            "needs both densities"
        )
    return m.density


def volume_fraction_from_weight(
    weight_fraction: ArrayLike, rho_f: ArrayLike, rho_m: ArrayLike, void_fraction: ArrayLike = 0.0
) -> Array:
    """Fibre volume fraction from the fibre weight fraction of the solid.

    Parameters
    ----------
    weight_fraction : array_like, shape (...)
        Fibre mass / (fibre + matrix mass), in [0, 1].
    rho_f, rho_m : array_like, shape (...)
        Fibre and matrix densities, kg/m^3.
    void_fraction : array_like, shape (...)
        Void volume / composite volume, in [0, 1).

    Returns
    -------
    ndarray, shape (...)
        v_f = (1 - v_v) (w_f / rho_f) / (w_f / rho_f + (1 - w_f) / rho_m).

    References
    ----------
    Agarwal, Broutman and Chandrashekhara (2006), Sec. 3.2 (from memory).

    Examples
    --------
    >>> round(float(volume_fraction_from_weight(0.5, 2000.0, 1000.0)), 12)
    0.333333333333
    """
    w = np.asarray(weight_fraction, dtype=np.float64)
    vv = np.asarray(void_fraction, dtype=np.float64)
    a = w / np.asarray(rho_f, dtype=np.float64)
    b = (1.0 - w) / np.asarray(rho_m, dtype=np.float64)
    return np.asarray((1.0 - vv) * a / (a + b))


def weight_fraction_from_volume(
    volume_fraction: ArrayLike, rho_f: ArrayLike, rho_m: ArrayLike, void_fraction: ArrayLike = 0.0
) -> Array:
    """Fibre weight fraction of the solid from the fibre and void volume fractions.

    Parameters
    ----------
    volume_fraction : array_like, shape (...)
        Fibre volume / composite volume.
    rho_f, rho_m : array_like, shape (...)
        Fibre and matrix densities, kg/m^3.
    void_fraction : array_like, shape (...)
        Void volume / composite volume; the matrix takes v_m = 1 - v_f - v_v.

    Returns
    -------
    ndarray, shape (...)
        w_f = v_f rho_f / (v_f rho_f + v_m rho_m).

    References
    ----------
    Agarwal, Broutman and Chandrashekhara (2006), Sec. 3.2 (from memory).
    """
    vf = np.asarray(volume_fraction, dtype=np.float64)
    vm = 1.0 - vf - np.asarray(void_fraction, dtype=np.float64)
    mf = vf * np.asarray(rho_f, dtype=np.float64)
    return np.asarray(mf / (mf + vm * np.asarray(rho_m, dtype=np.float64)))


@dataclass(frozen=True, eq=False)
class Composite:
    """A fibre (or particle) composite: constituents, fibre fraction and inclusion geometry.

    Parameters
    ----------
    fibre : Isotropic, TransverselyIsotropic or Orthotropic
        The reinforcement (axis 1 along the fibres).
    matrix : Isotropic, TransverselyIsotropic or Orthotropic
        The matrix.
    volume_fraction : float or array_like, shape (...)
        Fibre volume fraction of the composite, in [0, packing limit].
    inclusion : {"continuous", "spheroid", "sphere"}
        Inclusion shape. ``spheroid`` needs ``aspect_ratio`` (length / diameter, > 0); ``sphere``
        has aspect ratio 1; ``continuous`` fibres have none (``None``).
    aspect_ratio : float, optional
        Spheroid aspect ratio.
    arrangement : {"random", "square", "hexagonal"}
        Arrangement, which sets the packing limit (see the module table).
    void_fraction : float
        Void volume fraction, in [0, 1); v_f + v_v <= 1.
    name : str
        Label.
    orientation : {"aligned", "random_in_plane", "random_3d"}
        Fibre orientation: along axis 1; uniformly random in the 1-2 plane (axis 3 is the plate
        normal; spheroids or continuous fibres); uniformly random in space (spheroids only).
        See the module table.

    Raises
    ------
    FractionError
        A fraction outside [0, 1], v_f + v_v > 1, or v_f above the packing limit.
    InputError
        An unknown inclusion, arrangement or orientation, an aspect ratio that does not fit the
        inclusion, a random orientation of spheres or of continuous fibres in space, or a random
        orientation with a square or hexagonal arrangement.

    Examples
    --------
    >>> from micromech.materials import Isotropic
    >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.6)
    >>> round(c.packing_limit, 2)
    0.82
    """

    fibre: Material
    matrix: Material
    volume_fraction: float | Array
    inclusion: Inclusion = "continuous"
    aspect_ratio: float | None = None
    arrangement: Arrangement = "random"
    void_fraction: float | Array = 0.0
    name: str = ""
    orientation: Orientation = "aligned"

    def __post_init__(self) -> None:
        for role in ("fibre", "matrix"):
            m = getattr(self, role)
            if not isinstance(m, Isotropic | TransverselyIsotropic | Orthotropic):
                raise InputError(
                    f"{role}: expected a material (Isotropic, TransverselyIsotropic or "
                    f"Orthotropic), got {type(m).__name__}"
                )
        _choice("inclusion", self.inclusion, INCLUSIONS)
        _choice("arrangement", self.arrangement, ARRANGEMENTS)
        check_orientation(self.orientation, self.inclusion, self.arrangement)
        ar = self.aspect_ratio
        if ar is not None:
            ar = parse_quantity(ar, "dimensionless", "aspect_ratio")
        if self.inclusion == "spheroid":
            if ar is None or not (math.isfinite(ar) and ar > 0.0):
                raise InputError(
                    f"aspect_ratio = {ar!r}: a spheroid inclusion needs a finite aspect ratio > 0"
                )
        elif self.inclusion == "sphere":
            if ar is not None and ar != 1.0:
                raise InputError(f"aspect_ratio = {ar!r}: a sphere has aspect ratio 1")
            ar = 1.0
        elif ar is not None:
            raise InputError(
                f"aspect_ratio = {ar!r} is given for continuous fibres; use inclusion = "
                "'spheroid' for short fibres"
            )
        object.__setattr__(self, "aspect_ratio", ar)
        vf = _fraction(self.volume_fraction, "volume_fraction")
        vv = _fraction(self.void_fraction, "void_fraction")
        object.__setattr__(self, "volume_fraction", vf)
        object.__setattr__(self, "void_fraction", vv)
        check_fraction(vf, "volume_fraction")
        check_fraction(vv, "void_fraction", open_upper=True)
        total = np.asarray(vf) + np.asarray(vv)
        if np.any(total > 1.0 + 1e-12):
            raise FractionError(
                f"volume_fraction + void_fraction = {float(np.max(total))!r} exceeds 1"
                f"{at_index(total > 1.0 + 1e-12)}"
            )
        limit, how = PACKING_LIMITS[(self.inclusion, self.arrangement)]
        over = np.asarray(vf) > limit
        if np.any(over):
            val = float(np.max(np.asarray(vf)))
            raise FractionError(
                f"volume_fraction = {val!r}{at_index(over)} exceeds the packing limit "
                f"{limit:.4f} of {self.arrangement} {self.inclusion} inclusions ({how})"
            )

    @property
    def packing_limit(self) -> float:
        """The largest admissible fibre volume fraction for this inclusion and arrangement."""
        return PACKING_LIMITS[(self.inclusion, self.arrangement)][0]

    @property
    def matrix_fraction(self) -> float | Array:
        """Matrix volume fraction, 1 - v_f - v_v."""
        return _scalar(1.0 - np.asarray(self.volume_fraction) - np.asarray(self.void_fraction))

    @property
    def weight_fraction(self) -> float | Array:
        """Fibre weight fraction of the solid (needs both densities), see the module formula."""
        return _scalar(weight_fraction_from_volume(
            self.volume_fraction, _density(self.fibre, "fibre"), _density(self.matrix, "matrix"),
            self.void_fraction,
        ))

    @property
    def density(self) -> float | Array:
        """Composite density rho_c = v_f rho_f + v_m rho_m, kg/m^3 (voids massless)."""
        rf = _density(self.fibre, "fibre")
        rm = _density(self.matrix, "matrix")
        vf = np.asarray(self.volume_fraction)
        return _scalar(vf * rf + np.asarray(self.matrix_fraction) * rm)

    def with_fraction(self, volume_fraction: ArrayLike) -> Composite:
        """Return a copy with another fibre volume fraction (validated again).

        Parameters
        ----------
        volume_fraction : float or array_like, shape (...)
            The new fibre volume fraction.

        Returns
        -------
        Composite
            The new composite.
        """
        return replace(self, volume_fraction=volume_fraction)  # type: ignore[arg-type]

    @classmethod
    def from_weight_fraction(
        cls,
        fibre: Material,
        matrix: Material,
        weight_fraction: ArrayLike | str,
        *,
        void_fraction: ArrayLike | str = 0.0,
        inclusion: Inclusion = "continuous",
        aspect_ratio: float | None = None,
        arrangement: Arrangement = "random",
        name: str = "",
        orientation: Orientation = "aligned",
    ) -> Composite:
        """Build a composite from the fibre weight fraction of the solid.

        Parameters
        ----------
        fibre, matrix : Material
            Constituents; both need a density.
        weight_fraction : float or array_like, shape (...)
            Fibre mass / (fibre + matrix mass), in [0, 1].
        void_fraction : float or array_like
            Void volume fraction of the composite, in [0, 1).
        inclusion, aspect_ratio, arrangement, name, orientation :
            As for :class:`Composite`.

        Returns
        -------
        Composite
            With v_f from :func:`volume_fraction_from_weight`.

        Raises
        ------
        FractionError
            If the weight or void fraction is outside [0, 1].
        InvalidMaterialError
            If a density is missing.
        """
        wf = _fraction(weight_fraction, "weight_fraction")
        vv = _fraction(void_fraction, "void_fraction")
        check_fraction(wf, "weight_fraction")
        check_fraction(vv, "void_fraction", open_upper=True)
        vf = volume_fraction_from_weight(
            wf, _density(fibre, "fibre"), _density(matrix, "matrix"), vv
        )
        return cls(fibre, matrix, _scalar(vf), inclusion=inclusion, aspect_ratio=aspect_ratio,
                   arrangement=arrangement, void_fraction=vv, name=name, orientation=orientation)


def _scalar(x: Any) -> float | Array:
    a = np.asarray(x, dtype=np.float64)
    return float(a) if a.ndim == 0 else a
