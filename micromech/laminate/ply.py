"""Ply materials, ply strengths and plies (a material at an angle with a thickness).

A :class:`PlyMaterial` holds the constants of a unidirectional ply in its material axes
(1 = fibre, 2 = transverse in-plane, 3 = through the thickness). The four in-plane constants
E1, E2, nu12, G12 are required (classical laminate theory needs nothing else); E3, G13, nu13
default to the transversely isotropic values E2, G12, nu12 and G23 / nu23 complete the 3D
stiffness for :func:`~micromech.laminate.stack.stack_constants`. The constants may come from
inline numbers or unit strings, from the materials registry, from a material model, or from any
homogenisation estimate (:meth:`PlyMaterial.from_constants`), or straight from a composite's
fibre, matrix and fraction (:meth:`PlyMaterial.from_composite`: constituents -> estimate -> ply
in one call). :meth:`PlyMaterial.coerce` accepts any of these sources, so that
``Laminate.from_code("[0/90]s", composite, "0.125 mm")`` goes from constituents to a laminate.

References
----------
.. [1] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.4 (restrictions on engineering constants) and Sec. 2.5 (plane stress).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, fields
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech import tensors
from micromech.errors import InputError, InvalidMaterialError, MicromechError
from micromech.laminate.failure import REQUIRED_STRENGTHS
from micromech.units import parse_quantity

__all__ = ["PlyStrengths", "PlyMaterial", "Ply", "STRENGTH_NAMES", "STRENGTHS_HINT"]

Array = NDArray[np.float64]

#: Ply strength names: Xt, Xc (fibre direction), Yt, Yc (transverse), S12 (in-plane shear),
#: S23 (transverse shear, used by Hashin's matrix-compression mode).
STRENGTH_NAMES: tuple[str, ...] = ("Xt", "Xc", "Yt", "Yc", "S12", "S23")
#: Where ply strengths go, said with every message on missing strengths.
STRENGTHS_HINT: str = (
    "give them as flat keys Xt, Xc, Yt, Yc, S12 in the case's [ply] table (e.g. Xt = "
    "\"1000 MPa\"); the strength estimates of `micromech estimate` are not used"
)


def _scalar(
    value: Any, kind: str, field_name: str, error: type[MicromechError] = InvalidMaterialError
) -> float:
    """Convert a number, a 0-d/size-1 array or a unit string to a finite float."""
    if isinstance(value, str):
        return parse_quantity(value, kind, field_name)
    arr = np.asarray(value, dtype=np.float64)
    if arr.size != 1:
        raise InputError(
            f"{field_name}: a ply needs one value, got an array of shape {arr.shape}; "
            "pick one design point first"
        )
    out = float(arr.reshape(()))
    if not math.isfinite(out):
        raise error(f"{field_name} = {out}: must be finite")
    return out


@dataclass(frozen=True)
class PlyStrengths:
    """Strengths of a unidirectional ply in its material axes, Pa.

    Compressive strengths are positive magnitudes. Any strength may be missing (``None``); a
    criterion that needs a missing one raises :class:`~micromech.errors.InputError`. Values may
    be numbers (Pa), unit strings (``"1500 MPa"``) or, for vectorised use, arrays.

    Attributes
    ----------
    Xt, Xc : float or ndarray or None
        Tensile and compressive strength along the fibres, Pa.
    Yt, Yc : float or ndarray or None
        Tensile and compressive strength across the fibres, Pa.
    S12 : float or ndarray or None
        In-plane shear strength, Pa.
    S23 : float or ndarray or None
        Transverse shear strength, Pa (Hashin's matrix-compression mode; Yc / 2 when missing).
    """

    Xt: Any = None
    Xc: Any = None
    Yt: Any = None
    Yc: Any = None
    S12: Any = None
    S23: Any = None

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
            if v is None:
                continue
            if isinstance(v, str):
                v = parse_quantity(v, "pressure", f.name)
            arr = np.asarray(v, dtype=np.float64)
            if not np.all(np.isfinite(arr)) or np.any(arr <= 0.0):
                bad = arr.reshape(-1)[np.argmax(~(np.isfinite(arr) & (arr > 0)).reshape(-1))]
                raise InvalidMaterialError(
                    f"strength {f.name} = {float(bad):g} Pa: must be positive and finite "
                    "(compressive strengths are given as positive magnitudes)"
                )
            object.__setattr__(self, f.name, float(arr) if arr.ndim == 0 else arr)

    @classmethod
    def from_any(cls, obj: Any) -> PlyStrengths | None:
        """Read strengths from a mapping or any object with attributes Xt, Xc, ... (or None).

        Parameters
        ----------
        obj : PlyStrengths, mapping, object or None
            E.g. a materials-registry ``Strengths`` object or ``{"Xt": "1500 MPa"}``.

        Returns
        -------
        PlyStrengths or None
            None when ``obj`` is None or gives no strength at all.
        """
        if obj is None or isinstance(obj, PlyStrengths):
            return obj
        if isinstance(obj, Mapping):
            unknown = sorted(set(obj) - set(STRENGTH_NAMES))
            if unknown:
                raise InputError(
                    f"strengths: unknown key {unknown[0]!r}; valid keys are "
                    f"{', '.join(STRENGTH_NAMES)}"
                )
            values = {k: obj.get(k) for k in STRENGTH_NAMES}
        else:
            values = {k: getattr(obj, k, None) for k in STRENGTH_NAMES}
        if all(v is None for v in values.values()):
            return None
        return cls(**values)

    @property
    def complete(self) -> bool:
        """Whether Xt, Xc, Yt, Yc and S12 are all given (S23 is optional)."""
        return not self.missing(REQUIRED_STRENGTHS)

    def missing(self, names: tuple[str, ...] | list[str]) -> list[str]:
        """Names among ``names`` that are not given.

        Parameters
        ----------
        names : sequence of str
            Strength names to look for.

        Returns
        -------
        list of str
            The missing ones, in the order given.
        """
        return [n for n in names if getattr(self, n) is None]

    def as_dict(self) -> dict[str, Any]:
        """Return the strengths as a plain dict (Pa, ``None`` where missing).

        Returns
        -------
        dict
            Keys Xt, Xc, Yt, Yc, S12, S23.
        """
        return {k: (None if (v := getattr(self, k)) is None else np.asarray(v).tolist())
                for k in STRENGTH_NAMES}


_MODULI = ("E1", "E2", "E3", "G12", "G13", "G23")
_RATIOS = ("nu12", "nu13", "nu23")
_ALPHAS = ("alpha1", "alpha2", "alpha3")


def _given_constants(source: Any) -> dict[str, Any]:
    """Return the moduli, Poisson ratios and CTEs an object gives (attributes not None)."""
    return {k: v for k in (*_MODULI, *_RATIOS, *_ALPHAS)
            if (v := getattr(source, k, None)) is not None}


@dataclass(frozen=True)
class PlyMaterial:
    """Elastic, thermal and strength constants of a unidirectional ply in material axes.

    Parameters
    ----------
    E1, E2 : float or str
        Young's moduli along and across the fibres, Pa (or a unit string).
    nu12 : float
        Major in-plane Poisson ratio.
    G12 : float or str
        In-plane shear modulus, Pa.
    E3, G13, nu13 : float or str, optional
        Through-thickness constants; default E2, G12, nu12 (transversely isotropic ply).
    G23, nu23 : float or str, optional
        Transverse shear modulus and Poisson ratio. For a transversely isotropic ply (E3 = E2)
        either one gives the other, G23 = E2 / (2 (1 + nu23)). Needed only for 3D results.
    alpha1, alpha2, alpha3 : float or str, optional
        Thermal expansion coefficients, 1/K; alpha3 defaults to alpha2. Needed only with a
        temperature change.
    strengths : PlyStrengths, mapping or object, optional
        Ply strengths (see :class:`PlyStrengths`).
    name, source : str
        Label and provenance of the constants.

    Raises
    ------
    InvalidMaterialError
        For non-positive moduli, an unstable Poisson ratio (1 - nu12 nu21 <= 0) or, when the 3D
        constants are complete, a 6x6 stiffness that is not positive definite.

    References
    ----------
    Jones (1999), Sec. 2.4 (restrictions on the engineering constants).

    Examples
    --------
    >>> m = PlyMaterial(E1="181 GPa", E2="10.3 GPa", nu12=0.28, G12="7.17 GPa")
    >>> round(float(m.reduced_stiffness()[0, 0]) / 1e9, 2)
    181.81
    """

    E1: float
    E2: float
    nu12: float
    G12: float
    E3: float | None = None
    G13: float | None = None
    G23: float | None = None
    nu13: float | None = None
    nu23: float | None = None
    alpha1: float | None = None
    alpha2: float | None = None
    alpha3: float | None = None
    strengths: PlyStrengths | None = None
    name: str = ""
    source: str = ""

    def __post_init__(self) -> None:
        label = f"ply material {self.name!r}" if self.name else "ply material"
        for names, kind in ((_MODULI, "pressure"), (_RATIOS, "dimensionless"),
                            (_ALPHAS, "expansion")):
            for k in names:
                if (v := getattr(self, k)) is None:
                    continue
                v = _scalar(v, kind, f"{label}: {k}")
                if kind == "pressure" and v <= 0.0:
                    raise InvalidMaterialError(f"{label}: {k} = {v:g} Pa must be positive")
                object.__setattr__(self, k, v)
        object.__setattr__(self, "strengths", PlyStrengths.from_any(self.strengths))
        # transversely isotropic defaults: direction 3 like direction 2
        for k, like in (("E3", "E2"), ("G13", "G12"), ("nu13", "nu12"), ("alpha3", "alpha2")):
            if getattr(self, k) is None:
                object.__setattr__(self, k, getattr(self, like))
        if self.E3 == self.E2:
            if self.G23 is None and self.nu23 is not None:
                object.__setattr__(self, "G23", self.E2 / (2.0 * (1.0 + self.nu23)))
            elif self.nu23 is None and self.G23 is not None:
                object.__setattr__(self, "nu23", self.E2 / (2.0 * self.G23) - 1.0)
        # plane-stress stability: 1 - nu12 nu21 > 0, i.e. |nu12| < sqrt(E1 / E2)
        limit = math.sqrt(self.E1 / self.E2)
        if not abs(self.nu12) < limit:
            raise InvalidMaterialError(
                f"{label}: nu12 = {self.nu12:g} must satisfy |nu12| < sqrt(E1/E2) = {limit:.4g} "
                "(positive-definite in-plane stiffness)"
            )
        if self.has_3d:
            tensors.check_stiffness(self.stiffness(), name=f"{label}: 3D stiffness")

    # -- constructors ----------------------------------------------------------------------
    @classmethod
    def from_constants(
        cls,
        constants: Any,
        strengths: Any = None,
        *,
        name: str | None = None,
    ) -> PlyMaterial:
        """Make a ply from an :class:`~micromech.results.ElasticConstants` result.

        This is how a homogenisation estimate becomes a ply: constituents -> estimate -> ply.

        Parameters
        ----------
        constants : ElasticConstants
            A result with one design point (0-d arrays); E1, E2, nu12, G12 required. E3, G13,
            G23, nu13, nu23 and alpha1..alpha3 are taken where present.
        strengths : PlyStrengths, mapping or object, optional
            Ply strengths, given separately (estimates carry no strengths).
        name : str, optional
            Label; defaults to the result's model key.

        Returns
        -------
        PlyMaterial
            The ply constants, with ``source`` copied from the result.

        Raises
        ------
        InputError
            If a required constant is missing or the result holds several design points.
        """
        missing = [k for k in ("E1", "E2", "nu12", "G12") if getattr(constants, k, None) is None]
        if missing:
            raise InputError(
                f"ply from {getattr(constants, 'model', '') or 'constants'}: "
                f"missing {', '.join(missing)} (a ply needs E1, E2, nu12, G12)"
            )
        return cls(
            **_given_constants(constants),
            strengths=strengths,
            name=name if name is not None else str(getattr(constants, "model", "") or ""),
            source=str(getattr(constants, "source", "") or ""),
        )

    @classmethod
    def from_composite(
        cls,
        composite: Any,
        model: str = "mori_tanaka",
        strengths: Any = None,
        *,
        name: str | None = None,
    ) -> PlyMaterial:
        """Estimate the ply constants of a composite (fibre, matrix, fraction) with one model.

        Parameters
        ----------
        composite : Composite
            One design point (a scalar fibre fraction) of a continuous-fibre composite.
        model : str
            Estimate key of :func:`micromech.homogenize.estimate`, e.g. ``"mori_tanaka"``,
            ``"halpin_tsai"``, ``"cylinders"``, ``"chamis"``, ``"rule_of_mixtures"``.
        strengths : PlyStrengths, mapping or object, optional
            Ply strengths (estimates carry none; failure analysis needs them).
        name : str, optional
            Label; default ``"<model> estimate"``.

        Returns
        -------
        PlyMaterial
            The estimated ply, with the model's source.

        Raises
        ------
        InputError
            If the model does not apply to this composite (the message says why and lists the
            models that do), or the composite holds several fractions.

        References
        ----------
        The estimators of :mod:`micromech.homogenize` name their sources (e.g. Mori and Tanaka
        1973 in the form of Benveniste 1987).

        Examples
        --------
        >>> from micromech.materials import Composite, Isotropic
        >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.55)
        >>> round(PlyMaterial.from_composite(c, "rule_of_mixtures").E1 / 1e9, 4)
        41.175
        """
        from micromech.homogenize import estimate

        if np.ndim(getattr(composite, "volume_fraction", 0.0)) != 0:
            raise InputError(
                f"ply from composite: volume_fraction has shape "
                f"{np.shape(composite.volume_fraction)}; a ply needs one fibre fraction"
            )
        result = estimate(composite, strengths=False)
        models = getattr(result, "models", result)
        if model not in models:
            why = getattr(result, "notes", {}).get(model, "")
            raise InputError(
                f"ply model = {model!r} does not apply to this composite"
                f"{' (' + why + ')' if why else ''}; available: {', '.join(models)}"
            )
        return cls.from_constants(models[model], strengths=strengths,
                                  name=name if name is not None else f"{model} estimate")

    @classmethod
    def coerce(
        cls, source: Any, *, model: str = "mori_tanaka", strengths: Any = None
    ) -> PlyMaterial:
        """Make a ply from any source of ply constants.

        Parameters
        ----------
        source : PlyMaterial, str, ElasticConstants, Composite or material
            A ply (returned as is, or with ``strengths`` replaced), a registry key, a
            homogenisation result of one design point, a composite (estimated with ``model``),
            or a material model (transversely isotropic, orthotropic or isotropic).
        model : str
            Estimate used for a composite.
        strengths : PlyStrengths, mapping or object, optional
            Strengths to attach (replacing the source's own).

        Returns
        -------
        PlyMaterial
            The ply constants.

        Raises
        ------
        InputError
            If the source gives no ply constants (see the constructors).
        """
        from dataclasses import replace

        from micromech.results import ElasticConstants

        if isinstance(source, PlyMaterial):
            if strengths is None:
                return source
            return replace(source, strengths=PlyStrengths.from_any(strengths))
        if isinstance(source, str):
            return cls.from_registry(source, strengths=strengths)
        if isinstance(source, ElasticConstants):
            return cls.from_constants(source, strengths=strengths)
        if all(hasattr(source, k) for k in ("fibre", "matrix", "volume_fraction")):
            return cls.from_composite(source, model, strengths)
        return cls.from_material(source, strengths=strengths)

    @classmethod
    def from_material(cls, material: Any, strengths: Any = None) -> PlyMaterial:
        """Make a ply from a material model (transversely isotropic, orthotropic or isotropic).

        Parameters
        ----------
        material : object
            Anything with attributes ``E1, E2, nu12, G12`` (and optionally E3, G13, G23, nu13,
            nu23, alpha1..alpha3), or with a ``ti()`` view giving them, or an isotropic material
            with ``E`` and ``nu`` (and ``alpha``). Its ``strengths`` attribute is used unless
            ``strengths`` is given.
        strengths : PlyStrengths, mapping or object, optional
            Strengths that override the material's own.

        Returns
        -------
        PlyMaterial
            The ply constants.

        Raises
        ------
        InputError
            If the object carries neither ply constants nor isotropic ones.
        """
        own = getattr(material, "strengths", None)
        name = str(getattr(material, "name", "") or "")
        source = str(getattr(material, "source", "") or "")
        if strengths is None:
            strengths = own
        src = material
        if getattr(src, "E1", None) is None and getattr(src, "E", None) is None:
            ti = getattr(material, "ti", None)
            if callable(ti):
                src = ti()
        if getattr(src, "E1", None) is not None:
            return cls(**_given_constants(src), strengths=strengths, name=name, source=source)
        E, nu = getattr(src, "E", None), getattr(src, "nu", None)
        if E is None or nu is None:
            raise InputError(
                f"ply from material {name or type(material).__name__!r}: needs E1, E2, nu12, "
                "G12 (or E and nu for an isotropic ply)"
            )
        E = _scalar(E, "pressure", "E")
        nu = _scalar(nu, "dimensionless", "nu")
        alpha = getattr(src, "alpha", None)
        G = E / (2.0 * (1.0 + nu))
        return cls(
            E1=E, E2=E, nu12=nu, G12=G, nu23=nu, alpha1=alpha, alpha2=alpha,
            strengths=strengths, name=name, source=source,
        )

    @classmethod
    def from_registry(cls, key: str, strengths: Any = None) -> PlyMaterial:
        """Make a ply from a materials-registry entry.

        Parameters
        ----------
        key : str
            Registry key (see ``micromech.materials.list_materials()``).
        strengths : PlyStrengths, mapping or object, optional
            Strengths that override the entry's own.

        Returns
        -------
        PlyMaterial
            The ply constants.
        """
        from micromech.materials import get_material  # type: ignore[attr-defined]

        return cls.from_material(get_material(key), strengths=strengths)

    # -- derived quantities ----------------------------------------------------------------
    @property
    def has_3d(self) -> bool:
        """Whether all nine constants (hence the 6x6 stiffness) are known."""
        return all(getattr(self, k) is not None for k in (*_MODULI, *_RATIOS))

    def reduced_stiffness(self) -> Array:
        """Plane-stress reduced stiffness Q in material axes, shape (3, 3), Pa.

        Returns
        -------
        ndarray, shape (3, 3)
            Q in the order 11, 22, 12 (engineering shear strain).

        References
        ----------
        Kaw (2006), Eq. (2.93) (from memory); Jones (1999), Sec. 2.6.
        """
        from micromech.laminate.plane import reduced_stiffness

        return reduced_stiffness(self.E1, self.E2, self.nu12, self.G12)

    def compliance_2d(self) -> Array:
        """Plane-stress compliance S in material axes, shape (3, 3), 1/Pa.

        Returns
        -------
        ndarray, shape (3, 3)
            S in the order 11, 22, 12.
        """
        return np.array([
            [1.0 / self.E1, -self.nu12 / self.E1, 0.0],
            [-self.nu12 / self.E1, 1.0 / self.E2, 0.0],
            [0.0, 0.0, 1.0 / self.G12],
        ])

    def stiffness(self) -> Array:
        """Return the 6x6 stiffness in material axes, Pa (needs G23 or nu23).

        Returns
        -------
        ndarray, shape (6, 6)
            Voigt order 11, 22, 33, 23, 13, 12.

        Raises
        ------
        InputError
            If G23 / nu23 (or another 3D constant) is missing.
        """
        if not self.has_3d:
            missing = [k for k in (*_MODULI, *_RATIOS) if getattr(self, k) is None]
            raise InputError(
                f"ply material {self.name!r}: 3D stiffness needs {', '.join(missing)} "
                "(give nu23 or G23)"
            )
        return tensors.orthotropic_stiffness(
            self.E1, self.E2, self.E3, self.G23, self.G13, self.G12,  # type: ignore[arg-type]
            self.nu23, self.nu13, self.nu12,  # type: ignore[arg-type]
        )

    def expansion(self) -> Array:
        """In-plane thermal expansion (alpha1, alpha2, 0) in material axes, 1/K.

        Returns
        -------
        ndarray, shape (3,)
            Missing coefficients count as zero; use :attr:`has_expansion` to check.
        """
        return np.array([self.alpha1 or 0.0, self.alpha2 or 0.0, 0.0])

    @property
    def has_expansion(self) -> bool:
        """Whether alpha1 and alpha2 are both given."""
        return self.alpha1 is not None and self.alpha2 is not None

    def degraded(self, factor: float, keep_fibre: bool) -> PlyMaterial:
        """Return the ply with its stiffness discounted after a failure (plane stress only).

        Parameters
        ----------
        factor : float
            Residual fraction (e.g. 1e-6) applied to the discounted constants.
        keep_fibre : bool
            True after a matrix or shear failure (E2, G12, nu12 discounted, E1 kept); False
            after a fibre failure (E1 discounted too).

        Returns
        -------
        PlyMaterial
            A 2D-only copy (no G23 / nu23) with the same strengths and CTEs.

        References
        ----------
        Kaw (2006), Sec. 5.3 (ply-discount method).
        """
        return PlyMaterial(
            E1=self.E1 if keep_fibre else self.E1 * factor,
            E2=self.E2 * factor,
            nu12=self.nu12 * factor,
            G12=self.G12 * factor,
            alpha1=self.alpha1,
            alpha2=self.alpha2,
            strengths=self.strengths,
            name=f"{self.name} (discounted)" if self.name else "discounted",
            source=self.source,
        )


@dataclass(frozen=True)
class Ply:
    """One ply of a laminate: a material, an angle and a thickness.

    Parameters
    ----------
    material : PlyMaterial
        The ply constants in material axes.
    angle : float
        Fibre angle from the laminate x axis towards y, degrees (counter-clockwise about z).
    thickness : float or str
        Ply thickness, m (or a unit string such as ``"0.125 mm"``).

    Raises
    ------
    InputError
        If the angle is not finite or the thickness is not positive.
    """

    material: PlyMaterial
    angle: float
    thickness: float

    def __post_init__(self) -> None:
        if not isinstance(self.material, PlyMaterial):
            raise InputError(
                f"ply material: expected a PlyMaterial, got {type(self.material).__name__}"
            )
        angle = _scalar(self.angle, "dimensionless", "ply angle", InputError)
        t = _scalar(self.thickness, "length", "ply thickness", InputError)
        if not t > 0.0:
            raise InputError(f"ply thickness = {t:g} m: must be positive")
        object.__setattr__(self, "angle", angle)
        object.__setattr__(self, "thickness", t)
