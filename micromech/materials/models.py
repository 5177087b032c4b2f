"""Constituent materials: isotropic, transversely isotropic and orthotropic, with strengths.

Every model is a frozen pydantic model whose fields are SI floats. Quantity strings
(``"72 GPa"``, ``"2.54 g/cm^3"``, ``"5e-6 1/K"``, ``"7 um"``) are accepted in every numeric field
and converted once with :func:`micromech.units.parse_quantity`. Invalid input raises
:class:`~micromech.errors.InvalidMaterialError` (or :class:`~micromech.errors.UnitError` for an
unreadable quantity) with a message naming the material, the field, the value and the rule.

The admissibility rules are those of a positive-definite strain energy: positive Young's and shear
moduli and the Poisson-ratio restrictions of Lempriere (1968) as given by Jones (1999).

References
----------
.. [1] Lempriere, B. M. (1968). Poisson's ratio in orthotropic materials. *AIAA Journal* 6(11),
   2226-2227 (restrictions on the Poisson ratios of an orthotropic material).
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.4 (restrictions on engineering constants).
"""

from __future__ import annotations

import math
from typing import Any, ClassVar, Literal, cast

import numpy as np
from numpy.typing import NDArray
from pydantic import BaseModel, ConfigDict, Field, ValidationError, model_validator

from micromech import tensors
from micromech.errors import InvalidMaterialError, MicromechError, suggest
from micromech.results import CONSTANT_NAMES, ElasticConstants
from micromech.units import parse_quantity

__all__ = [
    "Strengths",
    "Isotropic",
    "TransverselyIsotropic",
    "Orthotropic",
    "Material",
    "MATERIAL_KINDS",
    "material_from_dict",
]

Array = NDArray[np.float64]

#: Relative tolerance for "two given constants agree" (e.g. G23 and nu23 given together).
CONSISTENCY_RTOL = 1e-6

#: Least modulus (E*, G*) and least strength accepted, Pa: 0.1 MPa and 1 kPa lie far below any
#: fibre, matrix or ply (soft elastomers start near 1 MPa); a smaller positive value is almost
#: always a number written without its unit (``E1 = 230`` is 230 Pa). Common practice, no
#: source.
MODULUS_FLOOR = 1e5
STRENGTH_FLOOR = 1e3


# --- error formatting -------------------------------------------------------------------------


def _describe(cls: type, data: Any) -> str:
    label = getattr(cls, "_LABEL", cls.__name__)
    name = data.get("name") or data.get("key") if isinstance(data, dict) else None
    return f"{label} {name!r}" if name else label


def _convert_validation_error(exc: ValidationError, cls: type, data: Any) -> MicromechError:
    """Turn a pydantic ValidationError into the project's error with a readable message."""
    messages: list[str] = []
    err_type: type[MicromechError] = InvalidMaterialError
    first = True
    fields = list(getattr(cls, "model_fields", {}))
    for e in exc.errors():
        loc = ".".join(str(p) for p in e.get("loc", ()))
        ctx = e.get("ctx") or {}
        orig = ctx.get("error")
        if isinstance(orig, MicromechError):
            text = str(orig)
            if first:
                err_type = type(orig)
        elif e["type"] == "extra_forbidden":
            last = str(e["loc"][-1]) if e.get("loc") else loc
            pool = fields
            if len(e.get("loc", ())) > 1 and str(e["loc"][0]) == "strengths":
                pool = list(Strengths.model_fields)
            hint = suggest(last, pool) or f"; valid fields: {', '.join(pool)}"
            text = f"unknown field {loc!r}{hint}"
        elif e["type"] == "missing":
            text = f"missing required field {loc!r}"
        else:
            text = f"field {loc!r}: {e['msg']} (got {e.get('input')!r})"
        first = False
        messages.append(text)
    return err_type(f"{_describe(cls, data)}: " + "; ".join(messages))


class _Frozen(BaseModel):
    """Frozen, strict-keys base that reports errors as the project's exceptions."""

    model_config = ConfigDict(frozen=True, extra="forbid", validate_default=False)

    #: Field name -> quantity kind (see :data:`micromech.units.DIMENSIONS`); the fields every
    #: subclass shares are in ``_COMMON_KINDS``.
    _KINDS: ClassVar[dict[str, str]] = {}
    _COMMON_KINDS: ClassVar[dict[str, str]] = {}
    _LABEL: ClassVar[str] = "material"

    def __init__(self, **data: Any) -> None:
        try:
            super().__init__(**data)
        except ValidationError as exc:
            raise _convert_validation_error(exc, type(self), data) from None

    @model_validator(mode="before")
    @classmethod
    def _parse_quantities(cls, data: Any) -> Any:
        if not isinstance(data, dict):
            return data
        out = dict(data)
        for key, kind in {**cls._COMMON_KINDS, **cls._KINDS}.items():
            value = out.get(key)
            if value is None:
                continue
            x = parse_quantity(value, kind, key)
            if not math.isfinite(x):
                raise InvalidMaterialError(f"{key} = {value!r} must be finite")
            if kind == "pressure":
                _check_floor(key, value, x)
            out[key] = x
        return out


def _is_bare(value: Any) -> bool:
    """Whether a value is a number without a unit (a number, or text that reads as one)."""
    if isinstance(value, str):
        try:
            float(value)
        except ValueError:
            return False
        return True
    return not isinstance(value, bool)


def _check_floor(key: str, value: Any, x: float) -> None:
    """Refuse a positive modulus below 0.1 MPa or strength below 1 kPa (a unit left out).

    Zero and negative values are left to the positivity checks (their own message).
    """
    modulus = key[:1] in ("E", "G")
    floor = MODULUS_FLOOR if modulus else STRENGTH_FLOOR
    if not 0.0 < x < floor:
        return
    what = ("below 0.1 MPa, far below any fibre or matrix" if modulus
            else "below 1 kPa, far below any fibre, matrix or ply strength")
    if _is_bare(value):
        unit = "MPa" if not modulus or x >= 1e3 else "GPa"
        raise InvalidMaterialError(
            f"{key} = {x:g} Pa is {what}: a bare number is read as Pa; write '{x:g} {unit}'")
    raise InvalidMaterialError(f"{key} = {value!r} is {x:g} Pa, {what}: check the unit")


def _positive(obj: BaseModel, names: tuple[str, ...], why: str = "") -> None:
    for n in names:
        v = getattr(obj, n)
        if v is not None and not v > 0.0:
            raise InvalidMaterialError(f"{n} = {v!r} must be positive{why}")


# --- strengths --------------------------------------------------------------------------------


class Strengths(_Frozen):
    """Strengths of a constituent or ply, Pa; all optional.

    Compressive strengths are positive magnitudes. For an isotropic constituent ``Xt``, ``Xc``
    and ``S12`` are its tensile, compressive and shear strengths.

    Parameters
    ----------
    Xt, Xc : float or str, optional
        Tensile and compressive strength along axis 1, Pa.
    Yt, Yc : float or str, optional
        Tensile and compressive strength across (axis 2), Pa.
    S12, S23 : float or str, optional
        In-plane and transverse shear strength, Pa.
    yield_strength : float or str, optional
        Tensile yield strength (of a matrix or metal), Pa.
    """

    _KINDS: ClassVar[dict[str, str]] = {
        k: "pressure" for k in ("Xt", "Xc", "Yt", "Yc", "S12", "S23", "yield_strength")
    }
    _LABEL: ClassVar[str] = "strengths"

    Xt: float | None = None
    Xc: float | None = None
    Yt: float | None = None
    Yc: float | None = None
    S12: float | None = None
    S23: float | None = None
    yield_strength: float | None = None

    @model_validator(mode="after")
    def _check(self) -> Strengths:
        _positive(self, ("Xc", "Yc"), ": give compressive strengths as positive magnitudes")
        _positive(self, ("Xt", "Yt", "S12", "S23", "yield_strength"))
        return self

    def as_dict(self) -> dict[str, float]:
        """Return the strengths that are given, Pa.

        Returns
        -------
        dict of str to float
            Only the strengths that are not None.
        """
        return {k: v for k, v in self.model_dump().items() if v is not None}


# --- common base ------------------------------------------------------------------------------

Role = Literal["fibre", "matrix", "ply", "particle", "other"]


class _MaterialBase(_Frozen):
    key: str | None = Field(default=None, description="registry key, when loaded from one")
    name: str = ""
    role: Role | None = None
    density: float | None = None
    fibre_diameter: float | None = None
    strengths: Strengths | None = None
    source: str = "user input"
    notes: dict[str, str] = Field(default_factory=dict)

    _COMMON_KINDS: ClassVar[dict[str, str]] = {"density": "density", "fibre_diameter": "length"}
    #: Fields other than the elastic constants, carried over to a converted copy (see ``ti()``).
    _LABEL_FIELDS: ClassVar[tuple[str, ...]] = (
        "key", "name", "role", "density", "fibre_diameter", "strengths", "source", "notes",
    )

    def _check_common(self) -> None:
        _positive(self, ("density", "fibre_diameter"), " (a physical size)")

    def _labels(self) -> dict[str, Any]:
        return {k: getattr(self, k) for k in self._LABEL_FIELDS}

    def _poisson(self, E: str, nu: str, G: str, neither: str) -> float:
        """Return ``nu`` as given, else E / (2 G) - 1 from the shear modulus."""
        nu_v, G_v = getattr(self, nu), getattr(self, G)
        if nu_v is None and G_v is None:
            raise InvalidMaterialError(neither)
        return float(nu_v) if nu_v is not None else getattr(self, E) / (2.0 * G_v) - 1.0

    def _settle_shear(self, E: str, nu: str, G: str, nu_value: float) -> None:
        """Check a given shear modulus against E / (2 (1 + nu)); fill in the one not given."""
        E_v, G_given = getattr(self, E), getattr(self, G)
        G_value = E_v / (2.0 * (1.0 + nu_value))
        if G_given is not None and abs(G_value - G_given) > CONSISTENCY_RTOL * G_given:
            raise InvalidMaterialError(
                f"inconsistent inputs: {G} = {G_given:.6g} Pa but {E} / (2 (1 + {nu})) = "
                f"{G_value:.6g} Pa from {E} = {E_v:.6g} Pa, {nu} = {nu_value:.6g}; "
                f"give only one of {nu} and {G}"
            )
        if getattr(self, nu) is None:
            self.__dict__[nu] = nu_value
        if G_given is None:
            self.__dict__[G] = G_value

    def _check_positive_definite(self) -> None:
        C = self.stiffness()
        if not bool(tensors.is_positive_definite(C)):
            raise InvalidMaterialError(
                "the constants give a stiffness that is not positive definite "
                "(rule: positive strain energy, Jones 1999 Sec. 2.4)"
            )

    # Interface shared by all kinds (overridden below).
    def stiffness(self) -> Array:  # pragma: no cover - abstract
        """Return the 6x6 stiffness, Pa (Voigt 11, 22, 33, 23, 13, 12; engineering shear)."""
        raise NotImplementedError

    def compliance(self) -> Array:
        """Return the 6x6 compliance, 1/Pa.

        Returns
        -------
        ndarray, shape (6, 6)
            Inverse of :meth:`stiffness`.
        """
        return np.asarray(np.linalg.inv(self.stiffness()), dtype=np.float64)

    def constants(self) -> ElasticConstants:
        """Return the nine engineering constants and CTEs as an :class:`ElasticConstants`.

        Returns
        -------
        ElasticConstants
            Model key ``"constituent"``, source = this material's source.
        """
        vals = {n: getattr(self, n) for n in (*CONSTANT_NAMES, "alpha1", "alpha2", "alpha3")}
        return ElasticConstants(**vals, model="constituent", source=self.source)

    def thermal_expansion(self) -> Array | None:
        """Return the CTE vector in Voigt order (alpha1, alpha2, alpha3, 0, 0, 0), 1/K.

        Returns
        -------
        ndarray, shape (6,), or None
            None when any of the three CTEs is unknown.
        """
        a = tuple(getattr(self, n) for n in ("alpha1", "alpha2", "alpha3"))
        if any(x is None for x in a):
            return None
        return np.array([a[0], a[1], a[2], 0.0, 0.0, 0.0])

    def replaced(self, **changes: Any) -> Any:
        """Return a copy with some fields changed (validated again).

        A change to one member of a derived pair (``nu``/``G``, ``nu23``/``G23``) drops the other
        so that it is derived again.

        Parameters
        ----------
        **changes
            Field values (SI floats or quantity strings).

        Returns
        -------
        Material
            The new, validated material.
        """
        data = {k: getattr(self, k) for k in self.model_fields_set}
        if self.strengths is not None and "strengths" in data:
            data["strengths"] = self.strengths.as_dict()
        pairs: dict[str, str] = getattr(self, "_PAIRS", {})
        for k in changes:
            partner = pairs.get(k)
            if partner is not None and partner not in changes:
                data.pop(partner, None)
        data.update(changes)
        return type(self)(**data)

    @property
    def label(self) -> str:
        """Registry key, or name, for messages and tables."""
        return self.key or self.name or type(self).__name__


# --- isotropic --------------------------------------------------------------------------------


class Isotropic(_MaterialBase):
    """An isotropic constituent (glass fibre, polymer matrix, particles).

    Parameters
    ----------
    E : float or str
        Young's modulus, Pa (e.g. ``"72 GPa"``).
    nu : float, optional
        Poisson ratio, -1 < nu < 1/2. Give ``nu`` or ``G``; given both they must agree.
    G : float or str, optional
        Shear modulus, Pa; derived as E / (2 (1 + nu)) when not given.
    alpha : float or str, optional
        Coefficient of thermal expansion, 1/K.
    density, fibre_diameter : float or str, optional
        kg/m^3 and m.
    strengths : Strengths or dict, optional
        Strengths, Pa.
    name, key, role, source, notes :
        Labels: display name, registry key, role (fibre, matrix, ...), source of the values and
        per-field notes where a field's source differs.

    Examples
    --------
    >>> m = Isotropic(name="epoxy", E="3.5 GPa", nu=0.35)
    >>> round(m.G / 1e9, 4)
    1.2963
    """

    kind: Literal["isotropic"] = "isotropic"
    E: float
    nu: float | None = None
    G: float | None = None
    alpha: float | None = None

    _KINDS: ClassVar[dict[str, str]] = {
        "E": "pressure", "G": "pressure", "nu": "dimensionless", "alpha": "expansion",
    }
    _LABEL: ClassVar[str] = "isotropic material"
    _PAIRS: ClassVar[dict[str, str]] = {"nu": "G", "G": "nu"}

    @model_validator(mode="after")
    def _check(self) -> Isotropic:
        self._check_common()
        _positive(self, ("E", "G"), " (moduli must be positive)")
        nu = self._poisson("E", "nu", "G",
                           "give nu (Poisson ratio) or G (shear modulus); neither given")
        if not -1.0 < nu < 0.5:
            raise InvalidMaterialError(
                f"nu = {nu:.6g} makes the stiffness not positive definite: need -1 < nu < 0.5"
            )
        self._settle_shear("E", "nu", "G", nu)
        return self

    # Uniform accessors (axis 1, 2, 3 are all alike).
    @property
    def E1(self) -> float:  # noqa: D102
        return self.E

    E2 = E3 = E1

    @property
    def G12(self) -> float:  # noqa: D102
        return float(self.G)  # type: ignore[arg-type]

    G13 = G23 = G12

    @property
    def nu12(self) -> float:  # noqa: D102
        return float(self.nu)  # type: ignore[arg-type]

    nu13 = nu23 = nu12

    @property
    def alpha1(self) -> float | None:  # noqa: D102
        return self.alpha

    alpha2 = alpha3 = alpha1

    @property
    def bulk_modulus(self) -> float:
        """Bulk modulus K = E / (3 (1 - 2 nu)), Pa."""
        return self.E / (3.0 * (1.0 - 2.0 * float(self.nu)))  # type: ignore[arg-type]

    def stiffness(self) -> Array:
        """Return the 6x6 stiffness, Pa.

        Returns
        -------
        ndarray, shape (6, 6)
            Voigt order 11, 22, 33, 23, 13, 12 with engineering shear.
        """
        return tensors.isotropic_stiffness(self.E, self.nu12)

    def ti(self) -> TransverselyIsotropic:
        """Return the same material as a transversely isotropic one (E1 = E2 = E, nu12 = nu23).

        Returns
        -------
        TransverselyIsotropic
            With G12 = G and alpha1 = alpha2 = alpha.
        """
        return TransverselyIsotropic(
            **self._labels(), E1=self.E, E2=self.E, nu12=self.nu12, G12=self.G12, nu23=self.nu12,
            alpha1=self.alpha, alpha2=self.alpha,
        )


# --- transversely isotropic -------------------------------------------------------------------


class TransverselyIsotropic(_MaterialBase):
    """A constituent transversely isotropic about axis 1 (carbon, aramid fibres; a UD ply).

    Parameters
    ----------
    E1, E2 : float or str
        Axial and transverse Young's moduli, Pa (E3 = E2).
    nu12 : float
        Axial Poisson ratio (nu13 = nu12).
    G12 : float or str
        Axial shear modulus, Pa (G13 = G12).
    nu23 : float, optional
        Transverse Poisson ratio. Give ``nu23`` or ``G23``; given both they must satisfy
        G23 = E2 / (2 (1 + nu23)).
    G23 : float or str, optional
        Transverse shear modulus, Pa.
    alpha1, alpha2 : float or str, optional
        Axial and transverse CTEs, 1/K (alpha3 = alpha2).
    density, fibre_diameter, strengths, name, key, role, source, notes :
        As for :class:`Isotropic`.

    Examples
    --------
    >>> f = TransverselyIsotropic(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", nu23=0.07)
    >>> round(f.G23 / 1e9, 4)
    7.0093
    """

    kind: Literal["transversely_isotropic"] = "transversely_isotropic"
    E1: float
    E2: float
    nu12: float
    G12: float
    nu23: float | None = None
    G23: float | None = None
    alpha1: float | None = None
    alpha2: float | None = None

    _KINDS: ClassVar[dict[str, str]] = {
        "E1": "pressure", "E2": "pressure", "G12": "pressure", "G23": "pressure",
        "nu12": "dimensionless", "nu23": "dimensionless",
        "alpha1": "expansion", "alpha2": "expansion",
    }
    _LABEL: ClassVar[str] = "transversely isotropic material"
    _PAIRS: ClassVar[dict[str, str]] = {"nu23": "G23", "G23": "nu23"}

    @model_validator(mode="after")
    def _check(self) -> TransverselyIsotropic:
        self._check_common()
        _positive(self, ("E1", "E2", "G12", "G23"), " (moduli must be positive)")
        nu23 = self._poisson("E2", "nu23", "G23",
                             "give nu23 or G23 (transverse shear); neither given")
        limit12 = math.sqrt(self.E1 / self.E2)
        if not abs(self.nu12) < limit12:
            raise InvalidMaterialError(
                f"nu12 = {self.nu12:.6g} makes the stiffness not positive definite: need "
                f"|nu12| < sqrt(E1 / E2) = {limit12:.6g} (Jones 1999 Sec. 2.4)"
            )
        upper = 1.0 - 2.0 * self.nu12**2 * self.E2 / self.E1
        if not -1.0 < nu23 < upper:
            raise InvalidMaterialError(
                f"nu23 = {nu23:.6g} (with nu12 = {self.nu12:.6g}) makes the stiffness not positive "
                f"definite: need -1 < nu23 < 1 - 2 nu12^2 E2 / E1 = {upper:.6g}"
            )
        self._settle_shear("E2", "nu23", "G23", nu23)
        self._check_positive_definite()
        return self

    @property
    def E3(self) -> float:  # noqa: D102
        return self.E2

    @property
    def G13(self) -> float:  # noqa: D102
        return self.G12

    @property
    def nu13(self) -> float:  # noqa: D102
        return self.nu12

    @property
    def alpha3(self) -> float | None:  # noqa: D102
        return self.alpha2

    @property
    def nu21(self) -> float:
        """Minor Poisson ratio nu21 = nu12 E2 / E1."""
        return self.nu12 * self.E2 / self.E1

    def stiffness(self) -> Array:
        """Return the 6x6 stiffness, Pa.

        Returns
        -------
        ndarray, shape (6, 6)
            Voigt order 11, 22, 33, 23, 13, 12 with engineering shear.
        """
        return tensors.transversely_isotropic_stiffness(
            self.E1, self.E2, self.nu12, self.G12, cast(float, self.nu23)
        )

    def ti(self) -> TransverselyIsotropic:
        """Return this material (already transversely isotropic).

        Returns
        -------
        TransverselyIsotropic
            ``self``.
        """
        return self


# --- orthotropic ------------------------------------------------------------------------------


class Orthotropic(_MaterialBase):
    """An orthotropic material given by nine engineering constants (e.g. a measured ply).

    Parameters
    ----------
    E1, E2, E3 : float or str
        Young's moduli, Pa.
    G12, G13, G23 : float or str
        Shear moduli, Pa.
    nu12, nu13, nu23 : float
        Major Poisson ratios nu_ij = -eps_j / eps_i under stress along i.
    alpha1, alpha2, alpha3 : float or str, optional
        CTEs, 1/K.
    density, fibre_diameter, strengths, name, key, role, source, notes :
        As for :class:`Isotropic`.

    Notes
    -----
    Admissible when all moduli are positive, |nu_ij| < sqrt(E_i / E_j) and
    1 - nu12 nu21 - nu23 nu32 - nu13 nu31 - 2 nu21 nu32 nu13 > 0 (Lempriere 1968;
    Jones 1999 Sec. 2.4).
    """

    kind: Literal["orthotropic"] = "orthotropic"
    E1: float
    E2: float
    E3: float
    G12: float
    G13: float
    G23: float
    nu12: float
    nu13: float
    nu23: float
    alpha1: float | None = None
    alpha2: float | None = None
    alpha3: float | None = None

    _KINDS: ClassVar[dict[str, str]] = {
        **{k: "pressure" for k in ("E1", "E2", "E3", "G12", "G13", "G23")},
        **{k: "dimensionless" for k in ("nu12", "nu13", "nu23")},
        **{k: "expansion" for k in ("alpha1", "alpha2", "alpha3")},
    }
    _LABEL: ClassVar[str] = "orthotropic material"

    @model_validator(mode="after")
    def _check(self) -> Orthotropic:
        self._check_common()
        _positive(self, ("E1", "E2", "E3", "G12", "G13", "G23"), " (moduli must be positive)")
        for nu, Ei, Ej, i, j in (
            (self.nu12, self.E1, self.E2, "1", "2"),
            (self.nu13, self.E1, self.E3, "1", "3"),
            (self.nu23, self.E2, self.E3, "2", "3"),
        ):
            lim = math.sqrt(Ei / Ej)
            if not abs(nu) < lim:
                raise InvalidMaterialError(
                    f"nu{i}{j} = {nu:.6g} makes the stiffness not positive definite: need "
                    f"|nu{i}{j}| < sqrt(E{i} / E{j}) = {lim:.6g} (Lempriere 1968)"
                )
        nu21 = self.nu12 * self.E2 / self.E1
        nu31 = self.nu13 * self.E3 / self.E1
        nu32 = self.nu23 * self.E3 / self.E2
        delta = (1.0 - self.nu12 * nu21 - self.nu23 * nu32 - self.nu13 * nu31
                 - 2.0 * nu21 * nu32 * self.nu13)
        if not delta > 0.0:
            raise InvalidMaterialError(
                f"Poisson ratios nu12 = {self.nu12:.6g}, nu13 = {self.nu13:.6g}, nu23 = "
                f"{self.nu23:.6g} make the stiffness not positive definite: need "
                f"1 - nu12 nu21 - nu23 nu32 - nu13 nu31 - 2 nu21 nu32 nu13 > 0, got {delta:.6g} "
                "(Lempriere 1968)"
            )
        self._check_positive_definite()
        return self

    def stiffness(self) -> Array:
        """Return the 6x6 stiffness, Pa.

        Returns
        -------
        ndarray, shape (6, 6)
            Voigt order 11, 22, 33, 23, 13, 12 with engineering shear.
        """
        return tensors.orthotropic_stiffness(
            self.E1, self.E2, self.E3, self.G23, self.G13, self.G12,
            self.nu23, self.nu13, self.nu12,
        )

    def ti(self, rtol: float = 1e-6) -> TransverselyIsotropic:
        """Return this material as transversely isotropic about axis 1, when it is one.

        Parameters
        ----------
        rtol : float
            Relative tolerance on E2 = E3, G12 = G13, nu12 = nu13 and G23 = E2 / (2 (1 + nu23)).

        Returns
        -------
        TransverselyIsotropic
            The same constants.

        Raises
        ------
        InvalidMaterialError
            If the material is not transversely isotropic about axis 1.
        """
        checks = (
            ("E3", self.E3, "E2", self.E2),
            ("G13", self.G13, "G12", self.G12),
            ("nu13", self.nu13, "nu12", self.nu12),
            ("G23", self.G23, "E2 / (2 (1 + nu23))", self.E2 / (2.0 * (1.0 + self.nu23))),
        )
        for a, va, b, vb in checks:
            if abs(va - vb) > rtol * max(abs(va), abs(vb), 1e-300):
                raise InvalidMaterialError(
                    f"orthotropic material {self.label!r} is not transversely isotropic about "
                    f"axis 1: {a} = {va:.6g} differs from {b} = {vb:.6g} (rtol {rtol:g}); "
                    "the fibre estimates need a transversely isotropic fibre"
                )
        return TransverselyIsotropic(
            **self._labels(), E1=self.E1, E2=self.E2, nu12=self.nu12, G12=self.G12,
            nu23=self.nu23, alpha1=self.alpha1, alpha2=self.alpha2,
        )


#: Any constituent material.
Material = Isotropic | TransverselyIsotropic | Orthotropic

#: The ``kind`` names accepted in files, with aliases.
MATERIAL_KINDS: dict[str, type[_MaterialBase]] = {
    "isotropic": Isotropic,
    "transversely_isotropic": TransverselyIsotropic,
    "transversely-isotropic": TransverselyIsotropic,
    "ti": TransverselyIsotropic,
    "orthotropic": Orthotropic,
}


def material_from_dict(data: dict[str, Any], label: str = "material") -> Material:
    """Build a material from a mapping (a TOML table), choosing the kind.

    Parameters
    ----------
    data : dict
        Field values. ``kind`` selects the model (``isotropic``, ``transversely_isotropic``
        (alias ``ti``), ``orthotropic``); without it the kind is inferred: ``E`` means isotropic,
        any of ``E3``, ``G13``, ``nu13``, ``alpha3`` means orthotropic, otherwise transversely
        isotropic.
    label : str
        Where the data come from, for error messages (e.g. ``"[fibre]"``).

    Returns
    -------
    Material
        The validated material.

    Raises
    ------
    InvalidMaterialError
        On an unknown kind or invalid constants (the message starts with ``label``).
    """
    if not isinstance(data, dict):
        raise InvalidMaterialError(f"{label}: expected a table of constants, got {data!r}")
    d = dict(data)
    kind = d.pop("kind", None)
    cls: type[_MaterialBase]
    if kind is None:
        if "E" in d:
            cls = Isotropic
        elif any(k in d for k in ("E3", "G13", "nu13", "alpha3")):
            cls = Orthotropic
        else:
            cls = TransverselyIsotropic
    else:
        k = str(kind).strip().lower().replace(" ", "_")
        if k not in MATERIAL_KINDS:
            raise InvalidMaterialError(
                f"{label}: unknown kind {kind!r}; expected isotropic, transversely_isotropic or "
                f"orthotropic{suggest(k, MATERIAL_KINDS)}"
            )
        cls = MATERIAL_KINDS[k]
    try:
        return cls(**d)  # type: ignore[return-value]
    except MicromechError as exc:
        raise type(exc)(f"{label}: {exc}") from None
