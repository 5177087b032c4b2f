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

Randomly oriented fibres (``composite.orientation``, see :mod:`micromech.materials.composite`):
results are in the composite's axes. ``random_in_plane``: fibres uniformly distributed over the
1-2 plane, axis 3 the plate normal, results transversely isotropic about axis 3 (E1 = E2, G13 =
G23); ``random_3d``: isotropic results.

============================  =========================================================
key                           random orientations
============================  =========================================================
voigt, reuss                  always (Reuss not with voids): the fibre stiffness (Voigt)
                              or compliance (Reuss) averaged over the orientations, then
                              mixed with the matrix; rigorous for any arrangement (Hill
                              1952: uniform strain and uniform stress trial fields)
hashin_shtrikman_lower/upper  ``random_3d`` of isotropic fibre and matrix, no voids: the
                              isotropic bounds, rigorous for any statistically isotropic
                              two-phase composite whatever the inclusion shape (Hashin
                              and Shtrikman 1963); not for ``random_in_plane`` (the fibre
                              and spheroid forms assume aligned inclusions) nor for
                              anisotropic fibres
mori_tanaka                   the aligned estimate averaged over the orientations
                              (:func:`~micromech.homogenize.mori_tanaka.mori_tanaka`)
rule_of_mixtures, halpin_     absent: they assume aligned fibres
tsai, chamis, cylinders
============================  =========================================================

The strength estimates of aligned fibres are left out too; the limit-analysis yield bounds (any
geometry) remain.
"""

from __future__ import annotations

from collections.abc import Iterator, Mapping
from dataclasses import dataclass, field, replace
from typing import Any, Literal

import numpy as np
from numpy.typing import NDArray

from micromech import tensors
from micromech.errors import InvalidMaterialError
from micromech.homogenize import _common as cm
from micromech.homogenize.bounds import (
    AVERAGED_SOURCE,
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

__all__ = ["Estimates", "Excursion", "estimate", "MODEL_KEYS", "BOUND_KEYS", "CAUTION"]

Array = NDArray[np.float64]

#: Model keys of the JSON contract, in table order.
MODEL_KEYS: tuple[str, ...] = (
    "voigt", "reuss", "hashin_shtrikman_lower", "hashin_shtrikman_upper", "rule_of_mixtures",
    "halpin_tsai", "chamis", "cylinders", "mori_tanaka",
)
#: Keys that are rigorous bounds.
BOUND_KEYS: tuple[str, ...] = MODEL_KEYS[:4]

_MODULI = ("E1", "E2", "E3", "G12", "G13", "G23", "k23")

#: Models that assume aligned fibres (absent for random orientations).
ALIGNED_ONLY: tuple[str, ...] = ("rule_of_mixtures", "halpin_tsai", "chamis", "cylinders")
#: Random packing of long rods: fraction times aspect ratio about 5.4 (Philipse 1996, from
#: memory), applied from aspect ratio 10 on (common practice, no source).
RANDOM_ROD_CONTACT = 5.4
RANDOM_ROD_MIN_ASPECT = 10.0
#: Relative slack before an estimate counts as outside the bounds (round-off: several estimates
#: coincide with a bound, e.g. Mori-Tanaka with the lower Hashin-Shtrikman bound on k23).
OUTSIDE_RTOL = 1e-6
_HS_RANDOM = ("; rigorous for any statistically isotropic two-phase composite of isotropic "
              "phases, whatever the inclusion shape (Hashin & Shtrikman 1963)")


@dataclass(frozen=True)
class Excursion:
    """An estimate that leaves the rigorous bounds of the same composite.

    Attributes
    ----------
    model : str
        Model key of the estimate.
    name : str
        Constant name.
    value : float
        The estimate where it lies furthest outside (in SI).
    side : {"below", "above"}
        Below the lower or above the upper bound.
    bound : float
        The bound it passes at that point.
    bound_model : str
        Model key giving that bound.
    fraction : float
        Fibre volume fraction at that point.
    """

    model: str
    name: str
    value: float
    side: Literal["below", "above"]
    bound: float
    bound_model: str
    fraction: float


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
        for aligned continuous fibres only (Hill 1964), the CTEs for aligned continuous fibres,
        for spheres and for ``random_3d`` isotropic phases (Levin's relation with the bounds on
        k23 or K, Rosen and Hashin 1970).

        Parameters
        ----------
        name : str
            Constant name.

        Returns
        -------
        tuple of ndarray or None
            ``(lower, upper)``.
        """
        lo, up = self._bounding_values(name)
        if not lo or not up:
            return None
        return np.maximum.reduce(np.broadcast_arrays(*lo.values())), np.minimum.reduce(
            np.broadcast_arrays(*up.values()))

    def _bound_keys(self, name: str) -> tuple[tuple[str, ...], tuple[str, ...]]:
        """Model keys whose value of ``name`` is a rigorous lower / upper bound (see band)."""
        inclusion = getattr(self.composite, "inclusion", "")
        orientation = getattr(self.composite, "orientation", "aligned")
        aligned = orientation == "aligned"
        if name in _MODULI:
            return ("reuss", "hashin_shtrikman_lower"), ("voigt", "hashin_shtrikman_upper")
        if (name in ("nu12", "nu13") and inclusion == "continuous" and aligned) or (
            name in ("alpha1", "alpha2", "alpha3")
            and ((aligned and inclusion in ("continuous", "sphere"))
                 or orientation == "random_3d")
        ):
            return ("hashin_shtrikman_lower",), ("hashin_shtrikman_upper",)
        return (), ()

    def _bounding_values(self, name: str) -> tuple[dict[str, Any], dict[str, Any]]:
        """Lower and upper bounds on ``name`` present, by model key (either may be empty)."""
        lows, ups = self._bound_keys(name)
        got = {k: v for k in (*lows, *ups)
               if k in self.models and (v := self.models[k].get(name)) is not None}
        return ({k: got[k] for k in lows if k in got}, {k: got[k] for k in ups if k in got})

    def is_bound(self, key: str, name: str) -> bool:
        """Whether the value of constant ``name`` given by model ``key`` is a rigorous bound.

        The bound models give some constants that are not bounds: the Voigt and Reuss bounds
        (Hill 1952) hold for the stiffness and so for the moduli, not for Poisson ratios or
        CTEs; the Hashin-Shtrikman forms bound nu12 of aligned continuous fibres only (Hill
        1964) and the CTEs only where :meth:`band` says so.

        Parameters
        ----------
        key : str
            Model key (a key of :data:`BOUND_KEYS` for a possible ``True``).
        name : str
            Constant name.

        Returns
        -------
        bool
            True where :meth:`band` uses that value as a lower or upper bound.
        """
        lows, ups = self._bound_keys(name)
        return key in lows or key in ups

    def outside_bounds(
        self, names: tuple[str, ...] | None = None, rtol: float = OUTSIDE_RTOL
    ) -> list[Excursion]:
        """Estimates that leave the rigorous bounds of this composite.

        Several estimates are known approximations that need not respect the bounds (the rule
        of mixtures, Halpin-Tsai and Chamis for Poisson ratios, transverse moduli and CTEs); an
        estimate outside the bounds is wrong there by at least the distance to the bound.

        Parameters
        ----------
        names : tuple of str, optional
            Constants to look at; default all constants with a bound (one side is enough:
            with voids only the Voigt upper bound remains).
        rtol : float
            Slack relative to the larger magnitude of the band ends (round-off).

        Returns
        -------
        list of Excursion
            One per model and constant outside, at its furthest point; model order.
        """
        if names is None:
            names = (*_MODULI, "nu12", "nu13", "nu23", "alpha1", "alpha2", "alpha3")
        vf = np.asarray(self.composite.volume_fraction, dtype=np.float64)
        out: list[Excursion] = []
        for key in self.models:
            if key in BOUND_KEYS:
                continue
            for name in names:
                value = self.models[key].get(name)
                if value is None:
                    continue
                lo, up = self._bounding_values(name)
                for side, bounds in (("below", lo), ("above", up)):
                    if not bounds:
                        continue
                    keys = list(bounds)
                    arrays = np.broadcast_arrays(value, vf, *bounds.values())
                    v, f, b = arrays[0], arrays[1], np.stack(arrays[2:])
                    tight = np.argmax(b, axis=0) if side == "below" else np.argmin(b, axis=0)
                    edge = np.take_along_axis(b, tight[None], axis=0)[0]
                    slack = rtol * np.max(np.abs(b), axis=0)
                    gap = (edge - v) if side == "below" else (v - edge)
                    if not np.any(gap > slack):
                        continue
                    i = np.unravel_index(int(np.argmax(np.where(gap > slack, gap, -np.inf))),
                                         gap.shape)
                    out.append(Excursion(key, name, float(v[i]), side,  # type: ignore[arg-type]
                                         float(edge[i]), keys[int(tight[i])], float(f[i])))
        return out

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


def _orientation_average_6x6(T: Array, orientation: str, compliance: bool = False) -> Array:
    """Average a Voigt stiffness (or compliance) of a fibre, axis 1, over its orientations.

    In plane: rotations about axis 3 at 16 equally spaced angles (the rotated components are
    trigonometric polynomials of degree 4, so the mean is the exact average). In space: the
    isotropic projection ``(J :: T) J + (K :: T) K / 5`` in Mandel form (Walpole 1981, Sec. 5).
    """
    if orientation == "random_in_plane":
        R = tensors.rotation_about_axis(3, np.arange(16) * 22.5)
        rot = tensors.rotate_compliance if compliance else tensors.rotate_stiffness
        return np.asarray(np.mean(rot(T[..., None, :, :], R), axis=-3))
    # Mandel form of a compliance is the Voigt one divided by (m_i m_j), of a stiffness times it
    M = tensors.from_mandel(T) if compliance else tensors.to_mandel(T)
    J = np.zeros((6, 6))
    J[:3, :3] = 1.0 / 3.0
    K = np.eye(6) - J
    a = np.einsum("ij,...ij->...", J, M)
    b = np.einsum("ij,...ij->...", K, M) / 5.0
    iso = a[..., None, None] * J + b[..., None, None] * K
    return tensors.to_mandel(iso) if compliance else tensors.from_mandel(iso)


def _generic_voigt_reuss(
    composite: Any, vf: Array, vv: Array, orientation: str = "aligned"
) -> dict[str, ElasticConstants]:
    """Voigt and Reuss bounds from the constituents' full 6x6 stiffnesses (any anisotropy)."""
    Cf = np.asarray(composite.fibre.stiffness(), dtype=np.float64)
    Cm = np.asarray(composite.matrix.stiffness(), dtype=np.float64)
    Sf = np.asarray(np.linalg.inv(Cf), dtype=np.float64)
    vs, rs = VOIGT_SOURCE, REUSS_SOURCE
    if orientation != "aligned":
        Cf, Sf = (_orientation_average_6x6(Cf, orientation),
                  _orientation_average_6x6(Sf, orientation, compliance=True))
        vs += AVERAGED_SOURCE.format(what="stiffness", orientation=orientation)
        rs += AVERAGED_SOURCE.format(what="compliance", orientation=orientation)
    c = vf[..., None, None]
    c0 = (1.0 - vf - vv)[..., None, None]
    out = {"voigt": ElasticConstants.from_stiffness(c * Cf + c0 * Cm, model="voigt", source=vs)}
    if not np.any(vv > 0.0):
        S = c * Sf + c0 * np.linalg.inv(Cm)
        out["reuss"] = ElasticConstants.from_stiffness(np.linalg.inv(S), model="reuss", source=rs)
    return out


def _hashin_shtrikman(
    f: Any, m: Any, vf: Array, voids: bool, inclusion: str, ar: Any, orientation: str,
) -> tuple[tuple[ElasticConstants, ElasticConstants] | None, str]:
    """Return the Hashin-Shtrikman pair that applies (module tables), or None and why not."""
    if voids:
        return None, "not computed with voids (the lower bound is zero)"
    if orientation == "random_in_plane":
        return None, ("not for in-plane random fibres: the fibre (Hill 1964, Hashin 1965) and "
                      "spheroid (Willis 1977) forms assume aligned inclusions and the isotropic "
                      "form an isotropic composite; the orientation-averaged Voigt and Reuss "
                      "bounds hold")
    if orientation == "random_3d":
        if not f.is_isotropic:
            return None, ("random_3d: the isotropic bounds need isotropic fibre and matrix; for "
                          "anisotropic fibres only the orientation-averaged Voigt and Reuss "
                          "bounds hold")
        lo, hi = hashin_shtrikman(f, m, vf)
        return (replace(lo, source=lo.source + _HS_RANDOM),
                replace(hi, source=hi.source + _HS_RANDOM)), ""
    if inclusion == "continuous":
        return hashin_shtrikman_fibre(f, m, vf), ""
    if not f.is_isotropic:
        return None, "needs isotropic particles for spheres and spheroids"
    if inclusion == "sphere":
        return hashin_shtrikman(f, m, vf), ""
    return hashin_shtrikman_spheroid(f, m, vf, ar), ""


def _phase_estimates(
    f: Any, m: Any, vf: Array, vv: Array, inclusion: str, ar: Any, orientation: str,
) -> tuple[dict[str, ElasticConstants], dict[str, str]]:
    """Models and notes for a fibre phase and an isotropic matrix (see the module tables)."""
    models: dict[str, ElasticConstants] = {}
    notes: dict[str, str] = {}
    aligned = orientation == "aligned"
    voids = bool(np.any(vv > 0.0))
    V, R = voigt_reuss(f, m, vf, void_fraction=vv, orientation=orientation)
    models["voigt"] = V
    if R is not None:
        models["reuss"] = R
    else:
        notes["reuss"] = "zero with voids"
    hs, why_hs = _hashin_shtrikman(f, m, vf, voids, inclusion, ar, orientation)
    if hs is not None:
        models["hashin_shtrikman_lower"], models["hashin_shtrikman_upper"] = hs
    else:
        notes["hashin_shtrikman_lower"] = notes["hashin_shtrikman_upper"] = why_hs

    if not aligned:
        for k in ALIGNED_ONLY:
            notes[k] = f"assumes aligned fibres; not applied with orientation = {orientation}"
        if orientation == "random_3d" and ar is not None:
            rods = np.asarray(ar, dtype=np.float64) >= RANDOM_ROD_MIN_ASPECT
            limit = RANDOM_ROD_CONTACT / np.asarray(ar, dtype=np.float64)
            if np.any(rods & (vf > limit)):
                notes["packing"] = (
                    f"rods of aspect ratio {float(np.max(ar)):g} random in space pack only up "
                    f"to about {RANDOM_ROD_CONTACT:g} / aspect ratio = {float(np.min(limit)):.3g} "
                    "(random contact equation, Philipse 1996, from memory); the fibre fraction "
                    "exceeds it: such a composite cannot be fully random in space")
    elif inclusion == "continuous" and not voids:
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
        None if inclusion == "continuous" else ar, orientation=orientation,  # type: ignore[arg-type]
        void_fraction=vv)
    return models, notes


def estimate(
    composite: Any, *, case: str | None = None, strengths: bool = True,
    misalignment_deg: float = 2.0,
) -> Estimates:
    """Evaluate every applicable estimate and bound of a composite.

    Parameters
    ----------
    composite : Composite
        Fibre and matrix materials, fibre volume fraction (scalar or array), inclusion shape,
        aspect ratio, arrangement, void fraction and fibre orientation (``aligned`` along axis
        1; ``random_in_plane`` in the 1-2 plane, axis 3 the plate normal; ``random_3d``).
    case : str, optional
        Name for the JSON output (default: the composite's name).
    strengths : bool
        Whether to add the strength estimates.
    misalignment_deg : float
        Fibre misalignment for the kink-band estimate, degrees.

    Returns
    -------
    Estimates
        The results; keys as in the module tables, constants in the composite's axes
        (``random_in_plane``: E1 = E2 in the plane, E3 along the normal; ``random_3d``:
        isotropic).

    Raises
    ------
    InvalidMaterialError
        If the fibre or matrix constants are inadmissible.

    References
    ----------
    Each result names its model's source in ``source`` (see the model functions): Voigt (1889),
    Reuss (1929), Hill (1952, 1964), Hashin and Shtrikman (1963), Hashin (1965), Willis (1977),
    Halpin and Kardos (1976), Chamis (1983), Hashin and Rosen (1964), Mori and Tanaka (1973),
    Benveniste (1987), Schapery (1968), Levin (1967); orientation averages: Advani and Tucker
    (1987), Walpole (1981).

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
    orientation = getattr(composite, "orientation", "aligned")
    name = case if case is not None else getattr(composite, "name", "")
    elastic: ElasticConstants | None = None
    try:
        f, m = cm.phases(composite.fibre, composite.matrix)
    except InvalidMaterialError as exc:
        if not (hasattr(composite.fibre, "stiffness") and hasattr(composite.matrix, "stiffness")):
            raise
        models = _generic_voigt_reuss(composite, vf, vv, orientation)
        notes = {k: f"needs an isotropic matrix and a transversely isotropic fibre ({exc})"
                 for k in MODEL_KEYS[2:]}
    else:
        models, notes = _phase_estimates(
            f, m, vf, vv, getattr(composite, "inclusion", "continuous"),
            getattr(composite, "aspect_ratio", None), orientation)
        elastic = models["mori_tanaka"]
    ordered = {k: models[k] for k in MODEL_KEYS if k in models}
    st = {}
    if strengths:
        st = strength_estimates(composite, elastic=elastic, misalignment_deg=misalignment_deg)
    return Estimates(composite, ordered, _strengths_for(st, orientation, notes), notes, name)


def _strengths_for(
    st: dict[str, StrengthEstimate], orientation: str, notes: dict[str, str]
) -> dict[str, StrengthEstimate]:
    """Keep only the strengths that hold for the orientation (noting what was left out)."""
    if orientation == "aligned":
        return st
    kept = {k: v for k, v in st.items() if v.kind != "estimate"}
    if len(kept) < len(st):
        notes["strengths"] = (f"the fibre and transverse strength estimates assume aligned "
                              f"fibres; left out with orientation = {orientation} (the "
                              "limit-analysis yield bounds hold for any geometry)")
    return kept
