"""Frozen result objects shared by the estimators, the laminate code and the RVE checks."""

from __future__ import annotations

from dataclasses import dataclass, field, fields, replace
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech import tensors
from micromech.errors import InputError

__all__ = ["ElasticConstants", "CONSTANT_NAMES", "json_value"]

Array = NDArray[np.float64]

#: The nine engineering constants every result carries, in the JSON contract's order.
CONSTANT_NAMES: tuple[str, ...] = ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23")
_ARRAY_FIELDS: frozenset[str] = frozenset((*CONSTANT_NAMES, "alpha1", "alpha2", "alpha3"))


def _arr(x: ArrayLike | None) -> Array | None:
    return None if x is None else np.asarray(x, dtype=np.float64)


def json_value(v: ArrayLike) -> Any:
    """Return a float (or nested lists) with every NaN or infinity replaced by None (null).

    Parameters
    ----------
    v : array_like, shape (...)
        Values, SI.

    Returns
    -------
    float, None or list
        Strict-JSON form of ``v``.
    """
    v = np.asarray(v, dtype=np.float64)
    if v.ndim == 0:
        x = float(v)
        return x if np.isfinite(x) else None
    out = v.astype(object)
    out[~np.isfinite(v)] = None
    return out.tolist()


@dataclass(frozen=True, eq=False)
class ElasticConstants:
    """Effective engineering constants of a material or composite, with their provenance.

    Attributes are arrays of one broadcast shape ``(...)`` (0-d for a single design point), in SI
    units. A constant that the model does not give is ``None`` (``null`` in JSON).

    Attributes
    ----------
    E1, E2, E3 : ndarray or None
        Young's moduli, Pa (axis 1 = fibre direction).
    G12, G13, G23 : ndarray or None
        Shear moduli, Pa.
    nu12, nu13, nu23 : ndarray or None
        Major Poisson ratios.
    alpha1, alpha2, alpha3 : ndarray or None
        Thermal expansion coefficients, 1/K.
    model : str
        Key of the model (``"mori_tanaka"``, ``"voigt"``, ...).
    source : str
        The published source of the model (author, year, equation).
    extra : dict
        Further model outputs (e.g. ``k23`` for fibre composites), SI.
    """

    E1: Array | None = None
    E2: Array | None = None
    E3: Array | None = None
    G12: Array | None = None
    G13: Array | None = None
    G23: Array | None = None
    nu12: Array | None = None
    nu13: Array | None = None
    nu23: Array | None = None
    alpha1: Array | None = None
    alpha2: Array | None = None
    alpha3: Array | None = None
    model: str = ""
    source: str = ""
    extra: dict[str, Any] = field(default_factory=dict)

    def __post_init__(self) -> None:
        for f in fields(self):
            if f.name in ("model", "source", "extra"):
                continue
            object.__setattr__(self, f.name, _arr(getattr(self, f.name)))

    @classmethod
    def transversely_isotropic(
        cls,
        E1: ArrayLike | None,
        E2: ArrayLike | None,
        nu12: ArrayLike | None,
        G12: ArrayLike | None,
        G23: ArrayLike | None = None,
        *,
        nu23: ArrayLike | None = None,
        alpha1: ArrayLike | None = None,
        alpha2: ArrayLike | None = None,
        model: str = "",
        source: str = "",
        extra: dict[str, Any] | None = None,
    ) -> ElasticConstants:
        """Build a result for a material transversely isotropic about axis 1.

        Parameters
        ----------
        E1, E2, nu12, G12 : array_like or None, shape (...)
            Axial and transverse constants (Pa, dimensionless).
        G23 : array_like or None, shape (...)
            Transverse shear modulus, Pa. Derived from ``nu23`` when not given.
        nu23 : array_like or None, shape (...)
            Transverse Poisson ratio. Derived as E2 / (2 G23) - 1 when not given.
        alpha1, alpha2 : array_like or None, shape (...)
            Axial and transverse CTE, 1/K.
        model, source : str
            Model key and its published source.
        extra : dict, optional
            Further outputs.

        Returns
        -------
        ElasticConstants
            With E3 = E2, G13 = G12, nu13 = nu12, alpha3 = alpha2.
        """
        E2a = _arr(E2)
        if G23 is None and nu23 is not None and E2a is not None:
            G23 = E2a / (2.0 * (1.0 + np.asarray(nu23, dtype=float)))
        if nu23 is None and G23 is not None and E2a is not None:
            nu23 = E2a / (2.0 * np.asarray(G23, dtype=float)) - 1.0
        return cls(
            E1=_arr(E1), E2=E2a, E3=E2a, G12=_arr(G12), G13=_arr(G12), G23=_arr(G23),
            nu12=_arr(nu12), nu13=_arr(nu12), nu23=_arr(nu23),
            alpha1=_arr(alpha1), alpha2=_arr(alpha2), alpha3=_arr(alpha2),
            model=model, source=source, extra=dict(extra or {}),
        )

    @classmethod
    def from_stiffness(
        cls, C: ArrayLike, *, model: str = "", source: str = "", extra: dict[str, Any] | None = None
    ) -> ElasticConstants:
        """Read the engineering constants of a 6x6 stiffness (see `tensors.engineering_constants`).

        Parameters
        ----------
        C : array_like, shape (..., 6, 6)
            Stiffness, Pa.
        model, source : str
            Model key and its published source.
        extra : dict, optional
            Further outputs.

        Returns
        -------
        ElasticConstants
            The nine constants.
        """
        c = tensors.engineering_constants(C)
        return cls(**{k: c[k] for k in CONSTANT_NAMES}, model=model, source=source,
                   extra=dict(extra or {}))

    @property
    def complete(self) -> bool:
        """Whether all nine elastic constants are known."""
        return all(getattr(self, k) is not None for k in CONSTANT_NAMES)

    def stiffness(self) -> Array:
        """Return the 6x6 stiffness, shape ``(..., 6, 6)``, Pa (all nine constants needed).

        Returns
        -------
        ndarray, shape (..., 6, 6)
            The stiffness in Voigt order 11, 22, 33, 23, 13, 12, engineering shear.
        """
        return np.asarray(np.linalg.inv(self.compliance()), dtype=np.float64)

    def compliance(self) -> Array:
        """Return the 6x6 compliance, shape ``(..., 6, 6)``, 1/Pa.

        Returns
        -------
        ndarray, shape (..., 6, 6)
            The compliance.

        Raises
        ------
        InputError
            If a constant is unknown (None), naming the missing ones.
        """
        if not self.complete:
            missing = [k for k in CONSTANT_NAMES if getattr(self, k) is None]
            raise InputError(
                f"{self.model or 'result'}: the 6x6 stiffness needs all nine constants; "
                f"missing {', '.join(missing)}"
            )
        return tensors.orthotropic_compliance(
            self.E1, self.E2, self.E3, self.G23, self.G13, self.G12,  # type: ignore[arg-type]
            self.nu23, self.nu13, self.nu12,  # type: ignore[arg-type]
        )

    def get(self, name: str) -> Array | None:
        """Return a constant by name (also ``alpha*`` and keys of ``extra``), or None.

        Parameters
        ----------
        name : str
            Constant name.

        Returns
        -------
        ndarray or None
            The value; None for a constant the model does not give or an unknown name.
        """
        if name in self.extra:
            return _arr(self.extra[name])
        if name in _ARRAY_FIELDS:
            value: Array | None = getattr(self, name)
            return value
        return None

    def with_model(self, model: str, source: str) -> ElasticConstants:
        """Return a copy relabelled with another model key and source.

        Parameters
        ----------
        model, source : str
            New labels.

        Returns
        -------
        ElasticConstants
            The relabelled copy.
        """
        return replace(self, model=model, source=source)

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form: SI floats (or nested lists for arrays), ``None`` where unknown.

        Returns
        -------
        dict
            Keys E1 ... nu23, alpha1, alpha2 and source. A value that is not finite (a model
            that gives no number at that point) is None, so the output is strict JSON.

        Examples
        --------
        >>> ElasticConstants.transversely_isotropic(140e9, 9e9, 0.3, 5e9, nu23=0.4).as_dict()["E3"]
        9000000000.0
        """
        out: dict[str, Any] = {}
        for k in (*CONSTANT_NAMES, "alpha1", "alpha2"):
            v = getattr(self, k)
            out[k] = None if v is None else json_value(v)
        out["source"] = self.source
        return out
