"""Constituent phases of a fibre composite as frozen records of float arrays.

The estimators take a :class:`FibrePhase` (transversely isotropic about axis 1, the fibre axis;
an isotropic fibre is the special case E1 = E2, nu12 = nu23, G12 = E / (2 (1 + nu))) and an
isotropic :class:`MatrixPhase`. All constants are float arrays that broadcast against each other
and against the fibre volume fraction, so one call evaluates a whole design sweep.

Admissibility follows a positive-definite strain energy: positive moduli, -1 < nu < 1/2 for the
isotropic matrix and, for the transversely isotropic fibre, -1 < nu23 < 1 - 2 nu12^2 E2 / E1
(Lempriere 1968, as given by Jones 1999, Sec. 2.4).

References
----------
.. [1] Lempriere, B. M. (1968). Poisson's ratio in orthotropic materials. *AIAA Journal* 6(11),
   2226-2227.
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.4 (restrictions on engineering constants).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InvalidMaterialError
from micromech.tensors import at_index

__all__ = ["FibrePhase", "MatrixPhase"]

Array = NDArray[np.float64]


def _arr(x: ArrayLike | None) -> Array | None:
    return None if x is None else np.asarray(x, dtype=np.float64)


def _first_value(x: Array, mask: Array) -> float:
    if x.ndim == 0:
        return float(x)
    return float(np.broadcast_to(x, mask.shape)[mask][0])


def _require(ok: Any, x: Array, who: str, field: str, rule: str) -> None:
    """Raise InvalidMaterialError naming the field, first bad value and the rule broken."""
    okb = np.asarray(ok, dtype=bool)
    bad = ~okb
    if np.any(bad):
        bad = np.broadcast_to(bad, np.broadcast_shapes(bad.shape, x.shape))
        raise InvalidMaterialError(
            f"{who} {field} = {_first_value(x, bad):.6g}{at_index(bad)}: {rule}"
        )


def _finite(x: Array, who: str, field: str) -> None:
    _require(np.isfinite(x), x, who, field, "must be finite")


def _attr(m: Any, name: str) -> Any:
    return getattr(m, name, None)


def _isotropic_constants(m: Any) -> tuple[Any, Any] | None:
    """Return ``(E, nu)`` of an object with ``E`` and ``nu`` or ``G`` (nu = E / (2 G) - 1)."""
    E, nu, G = _attr(m, "E"), _attr(m, "nu"), _attr(m, "G")
    if E is None or (nu is None and G is None):
        return None
    if nu is None:
        nu = np.asarray(E, dtype=float) / (2.0 * np.asarray(G, dtype=float)) - 1.0
    return E, nu


@dataclass(frozen=True, eq=False)
class FibrePhase:
    """A fibre transversely isotropic about its axis (axis 1); arrays broadcast.

    Parameters
    ----------
    E1 : array_like, shape (...)
        Axial Young's modulus, Pa.
    E2 : array_like, shape (...)
        Transverse Young's modulus, Pa.
    nu12 : array_like, shape (...)
        Axial Poisson ratio.
    G12 : array_like, shape (...)
        Axial shear modulus, Pa.
    nu23 : array_like, shape (...)
        Transverse Poisson ratio (G23 = E2 / (2 (1 + nu23))).
    alpha1, alpha2 : array_like, shape (...), optional
        Axial and transverse coefficients of thermal expansion, 1/K.

    Raises
    ------
    InvalidMaterialError
        A constant that is not finite or breaks positive definiteness (see the module notes).

    Examples
    --------
    >>> f = FibrePhase(230e9, 15e9, 0.2, 15e9, 0.07)
    >>> round(float(f.G23) / 1e9, 4)
    7.0093
    """

    E1: Array
    E2: Array
    nu12: Array
    G12: Array
    nu23: Array
    alpha1: Array | None = None
    alpha2: Array | None = None

    def __post_init__(self) -> None:
        for name in ("E1", "E2", "nu12", "G12", "nu23", "alpha1", "alpha2"):
            object.__setattr__(self, name, _arr(getattr(self, name)))
        who = "fibre"
        for name in ("E1", "E2", "nu12", "G12", "nu23"):
            _finite(getattr(self, name), who, name)
        for name in ("E1", "E2", "G12"):
            x = getattr(self, name)
            _require(x > 0.0, x, who, name, "must be positive")
        _require(self.nu23 > -1.0, self.nu23, who, "nu23", "must exceed -1")
        limit = 1.0 - 2.0 * self.nu12**2 * self.E2 / self.E1
        _require(
            self.nu23 < limit, self.nu23, who, "nu23",
            "must be below 1 - 2 nu12^2 E2 / E1 for a positive-definite stiffness",
        )
        if (self.alpha1 is None) != (self.alpha2 is None):
            given = "alpha1" if self.alpha1 is not None else "alpha2"
            raise InvalidMaterialError(
                f"fibre {given} is given without its partner: give both alpha1 and alpha2 or "
                "neither"
            )
        for name in ("alpha1", "alpha2"):
            x = getattr(self, name)
            if x is not None:
                _finite(x, who, name)

    @property
    def G23(self) -> Array:
        """Transverse shear modulus E2 / (2 (1 + nu23)), Pa."""
        return self.E2 / (2.0 * (1.0 + self.nu23))

    @property
    def k23(self) -> Array:
        """Plane-strain bulk modulus k23 (Hill's k), Pa."""
        return 0.5 / ((1.0 - self.nu23) / self.E2 - 2.0 * self.nu12**2 / self.E1)

    @property
    def is_isotropic(self) -> bool:
        """Whether every point is isotropic (E1 = E2, nu12 = nu23, G12 = E / (2 (1 + nu)))."""
        G = self.E1 / (2.0 * (1.0 + self.nu12))
        return bool(
            np.all(np.isclose(self.E1, self.E2, rtol=1e-9, atol=0.0))
            and np.all(np.isclose(self.nu12, self.nu23, rtol=1e-9, atol=1e-12))
            and np.all(np.isclose(self.G12, G, rtol=1e-9, atol=0.0))
            and (
                self.alpha1 is None
                or self.alpha2 is None
                or bool(np.all(np.isclose(self.alpha1, self.alpha2, rtol=1e-9, atol=1e-30)))
            )
        )

    @classmethod
    def isotropic(cls, E: ArrayLike, nu: ArrayLike, alpha: ArrayLike | None = None) -> FibrePhase:
        """Return an isotropic fibre (glass, or a particle).

        Parameters
        ----------
        E : array_like, shape (...)
            Young's modulus, Pa.
        nu : array_like, shape (...)
            Poisson ratio, -1 < nu < 1/2.
        alpha : array_like, shape (...), optional
            Coefficient of thermal expansion, 1/K.

        Returns
        -------
        FibrePhase
            With E1 = E2 = E, nu12 = nu23 = nu, G12 = E / (2 (1 + nu)), alpha1 = alpha2 = alpha.

        Raises
        ------
        InvalidMaterialError
            If E <= 0 or nu outside (-1, 1/2).
        """
        E_ = np.asarray(E, dtype=np.float64)
        nu_ = np.asarray(nu, dtype=np.float64)
        _finite(nu_, "fibre", "nu")
        _require((nu_ > -1.0) & (nu_ < 0.5), nu_, "fibre", "nu", "must lie in (-1, 0.5)")
        a = _arr(alpha)
        return cls(E_, E_, nu_, E_ / (2.0 * (1.0 + nu_)), nu_, a, a)

    @classmethod
    def from_material(cls, m: Any) -> FibrePhase:
        """Build a fibre phase from a material model (duck-typed).

        Accepts a :class:`FibrePhase` or :class:`MatrixPhase`, an isotropic material (attributes
        ``E``, ``nu`` or ``G``, optional ``alpha``), or a transversely isotropic one (``E1``,
        ``E2``, ``nu12``, ``G12``, ``nu23`` or ``G23``, optional ``alpha1``, ``alpha2``). An
        orthotropic material is read through its ``ti()`` view when it has one.

        Parameters
        ----------
        m : object
            The material.

        Returns
        -------
        FibrePhase
            The phase.

        Raises
        ------
        InvalidMaterialError
            If the object carries neither set of constants.
        """
        if isinstance(m, FibrePhase):
            return m
        iso = _isotropic_constants(m)  # also a MatrixPhase
        if iso is not None:
            return cls.isotropic(*iso, _attr(m, "alpha"))
        if callable(_attr(m, "ti")):
            try:
                m = m.ti()
            except InvalidMaterialError:
                raise
            except Exception as exc:  # noqa: BLE001 - foreign object: report in our terms
                raise InvalidMaterialError(
                    f"fibre: cannot read a transversely isotropic view of {type(m).__name__}: {exc}"
                ) from None
        vals = {k: _attr(m, k) for k in ("E1", "E2", "nu12", "G12", "nu23")}
        if vals["nu23"] is None and _attr(m, "G23") is not None and vals["E2"] is not None:
            vals["nu23"] = np.asarray(vals["E2"], float) / (2.0 * np.asarray(_attr(m, "G23"))) - 1
        missing = [k for k, v in vals.items() if v is None]
        if missing:
            raise InvalidMaterialError(
                f"fibre: {type(m).__name__} lacks {', '.join(missing)}; need E and nu (isotropic) "
                "or E1, E2, nu12, G12, nu23 (transversely isotropic)"
            )
        a1, a2 = _attr(m, "alpha1"), _attr(m, "alpha2")
        if a1 is None and a2 is None and _attr(m, "alpha") is not None:
            a1 = a2 = _attr(m, "alpha")
        if (a1 is None) != (a2 is None):
            a1 = a2 = None  # a half-known CTE gives no thermal estimate
        return cls(**vals, alpha1=a1, alpha2=a2)


@dataclass(frozen=True, eq=False)
class MatrixPhase:
    """An isotropic matrix; arrays broadcast.

    Parameters
    ----------
    E : array_like, shape (...)
        Young's modulus, Pa.
    nu : array_like, shape (...)
        Poisson ratio, -1 < nu < 1/2.
    alpha : array_like, shape (...), optional
        Coefficient of thermal expansion, 1/K.

    Raises
    ------
    InvalidMaterialError
        If E <= 0, nu outside (-1, 1/2) or a value is not finite.

    Examples
    --------
    >>> m = MatrixPhase(3.5e9, 0.35)
    >>> round(float(m.K) / 1e9, 4)
    3.8889
    """

    E: Array
    nu: Array
    alpha: Array | None = None

    def __post_init__(self) -> None:
        for name in ("E", "nu", "alpha"):
            object.__setattr__(self, name, _arr(getattr(self, name)))
        who = "matrix"
        _finite(self.E, who, "E")
        _finite(self.nu, who, "nu")
        _require(self.E > 0.0, self.E, who, "E", "must be positive")
        _require((self.nu > -1.0) & (self.nu < 0.5), self.nu, who, "nu", "must lie in (-1, 0.5)")
        if self.alpha is not None:
            _finite(self.alpha, who, "alpha")

    @property
    def G(self) -> Array:
        """Shear modulus E / (2 (1 + nu)), Pa."""
        return self.E / (2.0 * (1.0 + self.nu))

    @property
    def K(self) -> Array:
        """Bulk modulus E / (3 (1 - 2 nu)), Pa."""
        return self.E / (3.0 * (1.0 - 2.0 * self.nu))

    @property
    def k23(self) -> Array:
        """Plane-strain bulk modulus K + G / 3, Pa."""
        return self.K + self.G / 3.0

    @classmethod
    def from_material(cls, m: Any) -> MatrixPhase:
        """Build a matrix phase from an isotropic material model (duck-typed).

        Accepts a :class:`MatrixPhase`, an isotropic :class:`FibrePhase`, or any object with
        ``E`` and ``nu`` (or ``G``) and optional ``alpha``; also a transversely isotropic object
        whose constants are isotropic (E1 = E2, nu12 = nu23, G12 = E / (2 (1 + nu))).

        Parameters
        ----------
        m : object
            The material.

        Returns
        -------
        MatrixPhase
            The phase.

        Raises
        ------
        InvalidMaterialError
            If the material is not isotropic.
        """
        if isinstance(m, MatrixPhase):
            return m
        iso = _isotropic_constants(m)
        if iso is not None:
            return cls(*iso, _attr(m, "alpha"))
        f = m if isinstance(m, FibrePhase) else None
        if f is None and _attr(m, "E1") is not None:
            try:
                f = FibrePhase.from_material(m)
            except InvalidMaterialError:
                f = None
        if f is not None and f.is_isotropic:
            return cls(f.E1, f.nu12, f.alpha1)
        raise InvalidMaterialError(
            f"matrix: the estimates need an isotropic matrix (E and nu); got "
            f"{type(m).__name__} that is not isotropic"
        )
