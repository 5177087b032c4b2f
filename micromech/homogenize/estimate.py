"""One call for every applicable estimate and bound of a composite.

:func:`estimate` returns an :class:`Estimates`: a frozen mapping from model key to
:class:`~micromech.results.ElasticConstants` with the keys of the JSON contract (DESIGN.md,
``estimate``) where the model applies:

============================  =========================================================
key                           applies to
============================  =========================================================
voigt                         always (3 phases with voids; any anisotropic phases)
reuss                         always, except with voids (it is zero)
hashin_shtrikman_lower/upper  continuous fibres (Hill 1964, Hashin 1965); spheres and
                              spheroids of isotropic phases (Hashin-Shtrikman 1963,
                              Willis 1977); not with voids
rule_of_mixtures              continuous fibres, no voids
halpin_tsai                   continuous fibres, or short fibres with aspect ratio >= 1
chamis                        continuous fibres, no voids
cylinders                     continuous fibres, no voids
mori_tanaka                   always for an isotropic matrix (voids as a third phase)
============================  =========================================================

Where a model does not apply its key is absent and :attr:`Estimates.notes` says why.
"""

from __future__ import annotations

from collections.abc import Iterator, Mapping
from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech.errors import InvalidMaterialError
from micromech.homogenize import _common as cm
from micromech.homogenize.bounds import (
    REUSS_SOURCE,
    VOIGT_SOURCE,
    hashin_shtrikman,
    hashin_shtrikman_fibre,
    hashin_shtrikman_spheroid,
    voigt_reuss,
)
from micromech.homogenize.chamis import chamis
from micromech.homogenize.cylinders import cylinders
from micromech.homogenize.halpin_tsai import halpin_tsai
from micromech.homogenize.mori_tanaka import mori_tanaka
from micromech.homogenize.rule_of_mixtures import rule_of_mixtures
from micromech.homogenize.strength import CAUTION, StrengthEstimate, strength_estimates
from micromech.results import ElasticConstants

__all__ = ["Estimates", "estimate", "MODEL_KEYS", "BOUND_KEYS", "CAUTION"]

Array = NDArray[np.float64]

#: Model keys of the JSON contract, in table order.
MODEL_KEYS: tuple[str, ...] = (
    "voigt", "reuss", "hashin_shtrikman_lower", "hashin_shtrikman_upper", "rule_of_mixtures",
    "halpin_tsai", "chamis", "cylinders", "mori_tanaka",
)
#: Keys that are rigorous bounds.
BOUND_KEYS: tuple[str, ...] = MODEL_KEYS[:4]

_MODULI = ("E1", "E2", "E3", "G12", "G13", "G23", "k23")


@dataclass(frozen=True, eq=False)
class Estimates(Mapping[str, ElasticConstants]):
    """Every applicable estimate and bound of one composite (a read-only mapping).

    Attributes
    ----------
    composite : Composite
        The composite estimated.
    models : dict of str to ElasticConstants
        Model key -> result, in :data:`MODEL_KEYS` order.
    strengths : dict of str to StrengthEstimate
        Strength estimates and yield bounds the data allow.
    notes : dict of str to str
        Why a model key is absent.
    case : str
        Case name for the JSON output.
    """

    composite: Any
    models: dict[str, ElasticConstants]
    strengths: dict[str, StrengthEstimate] = field(default_factory=dict)
    notes: dict[str, str] = field(default_factory=dict)
    case: str = ""

    def __getitem__(self, key: str) -> ElasticConstants:
        return self.models[key]

    def __iter__(self) -> Iterator[str]:
        return iter(self.models)

    def __len__(self) -> int:
        return len(self.models)

    def band(self, name: str) -> tuple[Array, Array] | None:
        """Tightest rigorous bounds on one constant, or None where none is known.

        Moduli (E1, E2, E3, G12, G13, G23, k23) take the larger of the Reuss and lower
        Hashin-Shtrikman values and the smaller of the Voigt and upper ones; nu12 is bounded
        for aligned continuous fibres only (Hill 1964), the CTEs for aligned continuous fibres
        and for spheres (Levin's relation with the bounds on k23 or K, Rosen and Hashin 1970).

        Parameters
        ----------
        name : str
            Constant name.

        Returns
        -------
        tuple of ndarray or None
            ``(lower, upper)``.
        """
        lows: tuple[str, ...]
        ups: tuple[str, ...]
        inclusion = getattr(self.composite, "inclusion", "")
        if name in _MODULI:
            lows, ups = ("reuss", "hashin_shtrikman_lower"), ("voigt", "hashin_shtrikman_upper")
        elif (name in ("nu12", "nu13") and inclusion == "continuous") or (
            name in ("alpha1", "alpha2", "alpha3") and inclusion in ("continuous", "sphere")
        ):
            lows, ups = ("hashin_shtrikman_lower",), ("hashin_shtrikman_upper",)
        else:
            return None
        lo = [v for k in lows if k in self.models and (v := self.models[k].get(name)) is not None]
        up = [v for k in ups if k in self.models and (v := self.models[k].get(name)) is not None]
        if not lo or not up:
            return None
        return np.maximum.reduce(np.broadcast_arrays(*lo)), np.minimum.reduce(
            np.broadcast_arrays(*up))

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON contract (SI units, None where a model gives no value).

        Returns
        -------
        dict
            ``{"case": ..., "models": {key: {E1 ... nu23, alpha1, alpha2, source}},
            "strengths": {key: {value, kind, source, note}}, "notes": {...}, "caution": ...}``.
        """
        return {
            "case": self.case,
            "models": {k: v.as_dict() for k, v in self.models.items()},
            "strengths": {k: v.as_dict() for k, v in self.strengths.items()},
            "notes": dict(self.notes),
            "caution": CAUTION,
        }


def _generic_voigt_reuss(composite: Any, vf: Array, vv: Array) -> dict[str, ElasticConstants]:
    """Voigt and Reuss bounds from the constituents' full 6x6 stiffnesses (any anisotropy)."""
    Cf = np.asarray(composite.fibre.stiffness(), dtype=np.float64)
    Cm = np.asarray(composite.matrix.stiffness(), dtype=np.float64)
    c = vf[..., None, None]
    c0 = (1.0 - vf - vv)[..., None, None]
    out = {"voigt": ElasticConstants.from_stiffness(c * Cf + c0 * Cm, model="voigt",
                                                    source=VOIGT_SOURCE)}
    if not np.any(vv > 0.0):
        S = c * np.linalg.inv(Cf) + c0 * np.linalg.inv(Cm)
        out["reuss"] = ElasticConstants.from_stiffness(np.linalg.inv(S), model="reuss",
                                                       source=REUSS_SOURCE)
    return out


def estimate(
    composite: Any, *, case: str | None = None, strengths: bool = True,
    misalignment_deg: float = 2.0,
) -> Estimates:
    """Evaluate every applicable estimate and bound of a composite.

    Parameters
    ----------
    composite : Composite
        Fibre and matrix materials, fibre volume fraction (scalar or array), inclusion shape,
        aspect ratio, arrangement and void fraction.
    case : str, optional
        Name for the JSON output (default: the composite's name).
    strengths : bool
        Whether to add the strength estimates.
    misalignment_deg : float
        Fibre misalignment for the kink-band estimate, degrees.

    Returns
    -------
    Estimates
        The results; keys as in the module table.

    Raises
    ------
    InvalidMaterialError
        If the fibre or matrix constants are inadmissible.

    References
    ----------
    Each result names its model's source in ``source`` (see the model functions): Voigt (1889),
    Reuss (1929), Hill (1952, 1964), Hashin and Shtrikman (1963), Hashin (1965), Willis (1977),
    Halpin and Kardos (1976), Chamis (1983), Hashin and Rosen (1964), Mori and Tanaka (1973),
    Benveniste (1987), Schapery (1968), Levin (1967).

    Examples
    --------
    >>> from micromech.materials import Isotropic
    >>> from micromech.materials.composite import Composite
    >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.6)
    >>> sorted(estimate(c))[:3]
    ['chamis', 'cylinders', 'halpin_tsai']
    """
    vf = np.asarray(composite.volume_fraction, dtype=np.float64)
    vv = np.asarray(getattr(composite, "void_fraction", 0.0), dtype=np.float64)
    inclusion = getattr(composite, "inclusion", "continuous")
    ar = getattr(composite, "aspect_ratio", None)
    voids = bool(np.any(vv > 0.0))
    name = case if case is not None else getattr(composite, "name", "")
    models: dict[str, ElasticConstants] = {}
    notes: dict[str, str] = {}

    try:
        f, m = cm.phases(composite.fibre, composite.matrix)
    except InvalidMaterialError as exc:
        if not (hasattr(composite.fibre, "stiffness") and hasattr(composite.matrix, "stiffness")):
            raise
        models.update(_generic_voigt_reuss(composite, vf, vv))
        for k in MODEL_KEYS[2:]:
            notes[k] = f"needs an isotropic matrix and a transversely isotropic fibre ({exc})"
        st = strength_estimates(composite, misalignment_deg=misalignment_deg) if strengths else {}
        return Estimates(composite, models, st, notes, name)

    V, R = voigt_reuss(f, m, vf, void_fraction=vv)
    models["voigt"] = V
    if R is not None:
        models["reuss"] = R
    else:
        notes["reuss"] = "zero with voids"

    if voids:
        notes["hashin_shtrikman_lower"] = notes["hashin_shtrikman_upper"] = (
            "not computed with voids (the lower bound is zero)")
    elif inclusion == "continuous":
        models["hashin_shtrikman_lower"], models["hashin_shtrikman_upper"] = (
            hashin_shtrikman_fibre(f, m, vf))
    elif f.is_isotropic:
        lo, hi = (hashin_shtrikman(f, m, vf) if inclusion == "sphere"
                  else hashin_shtrikman_spheroid(f, m, vf, ar))  # type: ignore[arg-type]
        models["hashin_shtrikman_lower"], models["hashin_shtrikman_upper"] = lo, hi
    else:
        notes["hashin_shtrikman_lower"] = notes["hashin_shtrikman_upper"] = (
            "needs isotropic particles for spheres and spheroids")

    if inclusion == "continuous" and not voids:
        models["rule_of_mixtures"] = rule_of_mixtures(f, m, vf)
        models["halpin_tsai"] = halpin_tsai(f, m, vf)
        models["chamis"] = chamis(f, m, vf)
        models["cylinders"] = cylinders(f, m, vf)
    else:
        why = "with voids" if voids else f"for {inclusion} inclusions"
        for k in ("rule_of_mixtures", "chamis", "cylinders"):
            notes[k] = f"continuous fibres only; not applied {why}"
        if inclusion == "spheroid" and not voids and np.all(np.asarray(ar) >= 1.0):
            models["halpin_tsai"] = halpin_tsai(f, m, vf, aspect_ratio=ar)
        else:
            notes["halpin_tsai"] = (
                f"continuous or short fibres (aspect ratio >= 1) without voids; not applied {why}")

    models["mori_tanaka"] = mori_tanaka(
        f, m, vf, inclusion,  # type: ignore[arg-type]
        None if inclusion == "continuous" else ar, void_fraction=vv)
    ordered = {k: models[k] for k in MODEL_KEYS if k in models}
    st = {}
    if strengths:
        st = strength_estimates(composite, elastic=ordered["mori_tanaka"],
                                misalignment_deg=misalignment_deg)
    return Estimates(composite, ordered, st, notes, name)
