"""What the constituents, fraction and architecture allow for each simulated RVE property.

:func:`expected_properties` gives, per elastic property, the rigorous bounds (Voigt and Reuss
averages of the constituents, fibres turned with their plies), every closed-form estimate (for
stacks: exact layer averages of plies from each complete estimate), the best estimate, the
expected band, the Hashin-Shtrikman band where its assumptions hold, and the data that
:func:`~micromech.rve.causes.likely_causes` needs (the constrained modulus and the best
estimate over a grid of fibre fractions). :func:`_strength_limits` gives the limit-analysis
bounds of a strength. :func:`micromech.rve.check.check_case` grades against them.

Estimates and bounds are not design allowables: qualified test data, the applicable codes and a
licensed engineer decide.

References
----------
.. [1] Hill, R. (1952). *Proc. Phys. Soc. A* 65, 349-354 (Voigt and Reuss bounds; the bound on
   a directional modulus follows from the bound on the stiffness as a quadratic form).
.. [2] Pagano, N. J. (1974). Exact moduli of anisotropic laminates. In *Composite Materials*
   Vol. 2, Academic Press, 23-44 (stack constants).
.. [3] Drucker, D. C. (1966). *J. Materials* 1, 873-910 (limit-analysis bounds).
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech import tensors
from micromech.errors import CaseFileError
from micromech.results import ElasticConstants
from micromech.rve.causes import STACK_ARCHITECTURES as _STACK_ARCH
from micromech.rve.causes import constant_of as _const
from micromech.rve.causes import direction_of as _direction_of
from micromech.rve.causes import property_kind
from micromech.rve.tolerances import Band, corner_plies, fibre_band, particle_band

__all__ = [
    "Expectation",
    "expected_properties",
]

Array = NDArray[np.float64]

_VOIGT = {"x": 0, "y": 1, "z": 2, "yz": 3, "xz": 4, "xy": 5}
_GRID_POINTS = 61
_HS_MODELS = ("hashin_shtrikman_lower", "hashin_shtrikman_upper")


@dataclass(frozen=True)
class Expectation:
    """What the constituents, fraction and architecture allow for one property.

    Attributes
    ----------
    estimates : Mapping of str to float
        Estimates by model key (``stack_...`` for stacks), SI.
    best : str
        Key of the best estimate.
    band : Band or None
        Default expected band.
    lower_bound, upper_bound : float or None
        Rigorous bounds.
    hs_band : (float, float) or None
        Hashin-Shtrikman band where its assumptions hold.
    constrained_modulus : float or None
        C_ii of the best estimate (normal moduli only).
    fraction_curve : (ndarray, ndarray) or None
        Fibre fractions and the best estimate at each.
    """

    estimates: Mapping[str, float]
    best: str
    band: Band | None = None
    lower_bound: float | None = None
    upper_bound: float | None = None
    hs_band: tuple[float, float] | None = None
    constrained_modulus: float | None = None
    fraction_curve: tuple[Array, Array] | None = None


def _layup_angles(case: Any) -> tuple[float, ...]:
    from micromech.laminate.layup import parse_layup

    rve = case.rve
    code = rve.layup or (case.laminate.layup if case.laminate is not None else None)
    if code is None:
        if rve.architecture == "crossply":
            return (0.0, 90.0, 90.0, 0.0)
        raise CaseFileError(
            f"{case.path or 'case'}: [rve] architecture = 'stack' needs layup = '[...]' in [rve] "
            "or [laminate]"
        )
    return tuple(float(a) for a in parse_layup(code))


def _bounds(case: Any, angles: Sequence[float]) -> tuple[Array, Array | None]:
    """Voigt stiffness and Reuss compliance of the constituents (fibres turned per ply)."""
    comp = case.composite
    vf = float(comp.volume_fraction)
    vv = float(comp.void_fraction)
    vm = 1.0 - vf - vv
    Cf = np.asarray(comp.fibre.stiffness(), dtype=np.float64)
    Cm = np.asarray(comp.matrix.stiffness(), dtype=np.float64)
    R = tensors.rotation_about_axis(3, np.asarray(angles, dtype=np.float64))
    Cf_rot = tensors.rotate_stiffness(Cf, R)
    C_V = vm * Cm + vf * Cf_rot.mean(axis=0)
    if vv > 0.0:
        return C_V, None  # a void has no stiffness: the Reuss bound is zero
    S_R = vm * np.linalg.inv(Cm) + vf * np.linalg.inv(Cf_rot).mean(axis=0)
    return C_V, S_R


def _plies(est: Mapping[str, ElasticConstants]) -> dict[str, ElasticConstants]:
    """Complete transversely isotropic plies from every estimate that gives enough constants.

    Where an estimate lacks nu23 but gives E2 and G23 (Hashin-Shtrikman), nu23 = E2 / (2 G23)
    - 1 (transverse isotropy). Where it lacks G23 (Halpin-Tsai gives E1, E2, nu12, G12), the
    ply takes Mori-Tanaka's nu23 and G23 = E2 / (2 (1 + nu23)).
    """
    mt = est["mori_tanaka"]
    out: dict[str, ElasticConstants] = {}
    for k, v in est.items():
        if k in ("voigt", "reuss"):
            continue
        E1, E2, nu12, G12, G23, nu23 = (v.get(n) for n in ("E1", "E2", "nu12", "G12", "G23",
                                                           "nu23"))
        if E1 is None or E2 is None or nu12 is None or G12 is None:
            continue
        if nu23 is None:
            nu23 = E2 / (2.0 * G23) - 1.0 if G23 is not None else mt.get("nu23")
        out[k] = ElasticConstants.transversely_isotropic(E1, E2, nu12, G12, nu23=nu23,
                                                         model=k, source=v.source)
    return out


def _stack(ply: ElasticConstants, angles: Sequence[float]) -> Any:
    from micromech.laminate.stack import stack_constants

    C = ply.stiffness()
    n = len(angles)
    layers = np.broadcast_to(C[..., None, :, :], C.shape[:-2] + (n, 6, 6))
    return stack_constants(layers, np.full(n, 1.0 / n), angles=np.asarray(angles))


def expected_properties(case: Any, names: Sequence[str]) -> dict[str, Expectation]:
    """Bounds, estimates, bands and diagnosis data for the named properties of a case.

    Parameters
    ----------
    case : Case
        A loaded case with a ``[composite]`` and an ``[rve]`` table.
    names : sequence of str
        Property names (E1 ... or Ex ...; strengths are handled by :func:`check_case`).

    Returns
    -------
    dict of str to Expectation
        One entry per elastic property name.

    Raises
    ------
    CaseFileError
        If the case has no composite (fibre, matrix and fraction) or no [rve] table.
    """
    from micromech.homogenize import estimate, mori_tanaka

    comp = case.composite
    if comp is None or case.rve is None:
        raise CaseFileError(
            f"{case.path or 'case'}: checking RVE results needs [fibre], [matrix], "
            "[composite] with a fraction, and [rve]"
        )
    arch = case.rve.architecture
    vf = float(comp.volume_fraction)
    stack = arch in _STACK_ARCH
    angles = _layup_angles(case) if stack else (0.0,)
    est = dict(estimate(comp, strengths=False))
    # the best estimate over a grid of fractions, for solving the fraction of a value
    top = min(comp.packing_limit, 1.0 - float(comp.void_fraction))
    grid = np.linspace(0.0, top, _GRID_POINTS)
    mt_grid = mori_tanaka(comp.fibre, comp.matrix, grid, comp.inclusion, comp.aspect_ratio,
                          void_fraction=comp.void_fraction)
    hs_ok = comp.arrangement == "random" or (
        comp.arrangement == "hexagonal" and comp.inclusion == "continuous")
    if stack:
        plies = _plies(est)
        models = {f"stack_{k}": _stack(v, angles) for k, v in plies.items()}
        consts = {k: r.constants for k, r in models.items()}
        best = "stack_mori_tanaka"
        C_best = models[best].stiffness
        grid_consts = _stack(mt_grid, angles).constants
        bands = _stack_bands(plies, consts, vf, comp.arrangement, angles, names)
    else:
        consts = {k: v for k, v in est.items() if k not in ("voigt", "reuss")}
        best = "mori_tanaka"
        C_best = est[best].stiffness()
        grid_consts = mt_grid
        bands = {}
    C_V, S_R = _bounds(case, angles)
    S_V = np.linalg.inv(C_V)
    lo_key, hi_key = ((f"stack_{k}" for k in _HS_MODELS) if stack else _HS_MODELS)
    out: dict[str, Expectation] = {}
    for name in names:
        kind = property_kind(name)
        values = {k: float(x) for k, ec in consts.items() if (x := _const(ec, name)) is not None
                  and np.isfinite(x)}
        bv = values.get(best)
        direction, _ = _direction_of(name)
        lb = ub = cmod = None
        if kind in ("modulus", "shear") and direction in _VOIGT:
            i = _VOIGT[direction]
            ub = float(1.0 / S_V[i, i])
            lb = 0.0 if S_R is None else float(1.0 / S_R[i, i])
            if kind == "modulus":
                cmod = float(C_best[i, i])
        band: Band | None = bands.get(name)
        if band is None and bv is not None and not stack:
            if comp.inclusion == "continuous":
                ht = _const(est["halpin_tsai"], name) if "halpin_tsai" in est else None
                band = fibre_band(name, bv, vf, comp.arrangement, halpin_tsai=ht)
            else:
                band = particle_band(bv, comp.inclusion)
        hs = None
        # square arrays are not transversely isotropic: only the axial constants keep the band
        applicable = hs_ok or (not stack and name in ("E1", "G12", "G13"))
        if kind in ("modulus", "shear") and lo_key in values and hi_key in values and applicable:
            hs = (values[lo_key], values[hi_key])
            if stack and bv is not None:
                # stacking bounded plies is no bound itself (the plies' Poisson ratios enter):
                # the band always reaches the stack of Mori-Tanaka (= HS lower) plies
                hs = (min(*hs, bv), max(*hs, bv))
        curve_vals = _const(grid_consts, name)
        fc = None if curve_vals is None else (grid, np.asarray(curve_vals, dtype=np.float64))
        out[name] = Expectation(
            estimates=values, best=best, band=band, lower_bound=lb, upper_bound=ub,
            hs_band=hs, constrained_modulus=cmod, fraction_curve=fc,
        )
    return out


def _stack_bands(
    plies: Mapping[str, ElasticConstants], stacked: Mapping[str, ElasticConstants], vf: float,
    arrangement: str, angles: Sequence[float], names: Sequence[str],
) -> dict[str, Band]:
    """Bands of stack properties: stacks of plies at the ends of their expected bands.

    ``stacked`` holds the stacks of the estimates' ``plies`` (keys ``stack_...``); the band
    also takes in those of the Mori-Tanaka and Halpin-Tsai plies.
    """
    corners = corner_plies(plies["mori_tanaka"], vf, arrangement,
                           halpin_tsai=plies.get("halpin_tsai"))
    stacks = [_stack(c, angles).constants for c in corners]
    stacks += [stacked[k] for k in ("stack_mori_tanaka", "stack_halpin_tsai") if k in stacked]
    basis = (f"stacks of plies at the ends of their expected bands (measured spread of "
             f"Mori-Tanaka against full-field results, {arrangement} arrangement, and "
             "Halpin-Tsai (xi = 2) for E2)")
    out: dict[str, Band] = {}
    for name in names:
        vals = [v for s in stacks if (v := _const(s, name)) is not None]
        if vals:
            out[name] = Band(low=np.asarray(min(vals)), high=np.asarray(max(vals)), basis=basis)
    return out


def _strength_limits(case: Any) -> tuple[float | None, float | None]:
    """Limit-analysis bounds of a strength, Pa, where the phase strengths are known.

    Lower: the weakest phase present (uniform stress field: the matrix yield when the fibres
    are stronger); upper: the Voigt average of the phase strengths (uniform strain rate), with
    the matrix tensile strength (or its yield strength) and the fibre tensile strength.
    """
    from micromech.homogenize import yield_bounds

    comp = case.composite
    fs = getattr(comp.fibre, "strengths", None)
    ms = getattr(comp.matrix, "strengths", None)
    f_strength = None if fs is None else fs.Xt
    m_yield = None if ms is None else ms.yield_strength
    m_strength = None if ms is None else (ms.Xt if ms.Xt is not None else ms.yield_strength)
    vf, vv = float(comp.volume_fraction), float(comp.void_fraction)
    fractions = [vf, 1.0 - vf - vv, vv]
    lower = upper = None
    if m_yield is not None:
        lo, _ = yield_bounds([np.inf if f_strength is None else f_strength, m_yield, 0.0],
                             fractions)
        lower = float(lo) if lo > 0 else None
    if m_strength is not None and f_strength is not None:
        _, up = yield_bounds([f_strength, m_strength, 0.0], fractions)
        upper = float(up)
    return lower, upper
