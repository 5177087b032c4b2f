"""Verdicts on simulated RVE properties: rigorous bounds, estimates, tolerances, reasons.

Each simulated property gets one of three verdicts:

``violates_bounds``
    Outside a rigorous bound (Voigt/Reuss of the constituents, valid for any arrangement). No
    correct model of these constituents at this fraction can give the value. For a Poisson
    ratio: beyond the stability limit nu_ij^2 < E_i / E_j (:func:`poisson_stability`). The
    reasons list the likely causes in order: a unit slip (ratio to the estimate near a power
    of 1000), a wrong area or length (ratio near a ratio of the RVE's faces or edges),
    boundary conditions (too stiff: over-constrained; too soft: free faces), a fibre fraction
    other than the declared one (the fraction that would give the value under the best
    estimate is solved for; when none does, it is listed as ruled out).
``suspect``
    Inside the rigorous bounds, but outside the Hashin-Shtrikman band (where its assumptions
    hold), outside the expected band around the best estimate (per property and per fraction,
    see :mod:`micromech.rve.tolerances`), or failing a consistency check (reciprocity
    nu_ij / E_i = nu_ji / E_j, equal in-plane moduli of a balanced cross-ply, yield below the
    matrix yield, strengths outside the limit-analysis bounds for perfectly plastic phases,
    which a brittle or damage model may legitimately leave). The expected band is clipped to
    the rigorous bounds.
``consistent``
    Everything else.

Every verdict carries its reasons as sentences a user can act on. Estimates and bounds are not
design allowables: qualified test data, the applicable codes and a licensed engineer decide.

References
----------
.. [1] Hill, R. (1952). The elastic behaviour of a crystalline aggregate. *Proc. Phys. Soc. A*
   65, 349-354 (Voigt and Reuss averages as bounds).
.. [2] Hashin, Z. (1965). On elastic behaviour of fibre reinforced materials of arbitrary
   transverse phase geometry. *J. Mech. Phys. Solids* 13, 119-134 (bounds for transversely
   isotropic fibre composites).
.. [3] Drucker, D. C. (1966). The continuum theory of plasticity on the macroscale and the
   microscale. *J. Materials* 1, 873-910 (limit-analysis bounds for composites).
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from micromech.errors import InputError
from micromech.rve.causes import (
    Diagnosis,
    _finite,
    _pct,
    likely_causes,
    model_label,
    property_kind,
)
from micromech.rve.causes import format_property as _fmt
from micromech.rve.tolerances import BOUND_SLACK, HS_SLACK, Band, band_about
from micromech.safety import CAUTION

__all__ = [
    "CAUTION",
    "DEFAULT_TOLERANCE",
    "LIMIT_ANALYSIS_NOTE",
    "VERDICTS",
    "PropertyCheck",
    "grade_property",
    "poisson_stability",
    "worst_verdict",
]

VERDICTS: tuple[str, ...] = ("consistent", "suspect", "violates_bounds")
_RANK = {v: i for i, v in enumerate(VERDICTS)}

#: Band used when a property has an estimate but no measured band and no user tolerance
#: (common practice, no source).
DEFAULT_TOLERANCE = 0.10


def worst_verdict(verdicts: Iterable[str]) -> str:
    """Return the most severe of some verdicts (``consistent`` when there are none).

    Parameters
    ----------
    verdicts : iterable of str
        Verdicts from :data:`VERDICTS`.

    Returns
    -------
    str
        ``violates_bounds`` > ``suspect`` > ``consistent``.
    """
    out = "consistent"
    for v in verdicts:
        if _RANK[v] > _RANK[out]:
            out = v
    return out


# ------------------------------------------------------------------------------------------
# results


@dataclass(frozen=True)
class PropertyCheck:
    """The verdict on one simulated property, with everything it was compared against.

    Attributes
    ----------
    name : str
        Property (``"E1"``, ``"Ex"``, ``"nu12"``, ``"yield_strength_x"`` ...).
    value : float
        The simulated value, SI.
    lower_bound, upper_bound : float or None
        Rigorous bounds (Voigt/Reuss; limit analysis for strengths), SI.
    estimates : Mapping of str to float
        Estimates by model key, SI.
    best_model : str or None
        Key of the best estimate.
    band : (float, float) or None
        The expected band the value was graded against.
    hs_band : (float, float) or None
        Hashin-Shtrikman band, where its assumptions hold.
    verdict : str
        ``consistent``, ``suspect`` or ``violates_bounds``.
    reasons : tuple of str
        Sentences explaining the verdict and the likely causes, most likely first.
    """

    name: str
    value: float
    lower_bound: float | None
    upper_bound: float | None
    estimates: Mapping[str, float]
    best_model: str | None
    band: tuple[float, float] | None
    hs_band: tuple[float, float] | None
    verdict: str
    reasons: tuple[str, ...]

    @property
    def best_estimate(self) -> float | None:
        """The best estimate's value, or None."""
        return None if self.best_model is None else self.estimates.get(self.best_model)

    def with_reasons(self, reasons: Sequence[str], verdict: str | None = None) -> PropertyCheck:
        """Return a copy with more reasons and, if more severe, a new verdict.

        Parameters
        ----------
        reasons : sequence of str
            Sentences to append.
        verdict : str, optional
            A verdict that replaces the current one when it is more severe.

        Returns
        -------
        PropertyCheck
            The new result.
        """
        new = self.verdict if verdict is None else worst_verdict([self.verdict, verdict])
        old = self.reasons
        if new != self.verdict and self.verdict == "consistent":
            old = ()  # "lies within the band" no longer tells the whole story
        return PropertyCheck(
            name=self.name, value=self.value, lower_bound=self.lower_bound,
            upper_bound=self.upper_bound, estimates=self.estimates, best_model=self.best_model,
            band=self.band, hs_band=self.hs_band, verdict=new,
            reasons=(*old, *[r for r in reasons if r not in old]),
        )

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (the ``check.properties`` contract), SI.

        Returns
        -------
        dict
            value, lower_bound, upper_bound, estimates, verdict, reasons, and best_model,
            expected_band, hashin_shtrikman_band.
        """
        return {
            "value": self.value,
            "lower_bound": self.lower_bound,
            "upper_bound": self.upper_bound,
            "estimates": dict(self.estimates),
            "verdict": self.verdict,
            "reasons": list(self.reasons),
            "best_model": self.best_model,
            "expected_band": None if self.band is None else list(self.band),
            "hashin_shtrikman_band": None if self.hs_band is None else list(self.hs_band),
        }


# ------------------------------------------------------------------------------------------
# grading


def grade_property(
    name: str,
    value: float,
    *,
    lower_bound: float | None = None,
    upper_bound: float | None = None,
    hs_band: tuple[float, float] | None = None,
    estimates: Mapping[str, Any] | None = None,
    best: str | None = "mori_tanaka",
    band: Band | tuple[float, float] | None = None,
    tolerance: float | tuple[float, float] | None = None,
    context: Diagnosis | None = None,
    bound_slack: float = BOUND_SLACK,
    hs_slack: float = HS_SLACK,
    bounds_rigorous: bool = True,
) -> PropertyCheck:
    """Grade one simulated value against bounds, the Hashin-Shtrikman band and the estimates.

    Parameters
    ----------
    name : str
        Property name (sets the kind: modulus, shear, Poisson ratio, strength).
    value : float
        The simulated value, SI.
    lower_bound, upper_bound : float, optional
        Rigorous bounds, SI. Outside them (beyond ``bound_slack``) the verdict is
        ``violates_bounds``.
    hs_band : (float, float), optional
        Hashin-Shtrikman lower and upper values where the bounds' assumptions hold; outside
        (beyond ``hs_slack``) the verdict is at least ``suspect``.
    estimates : Mapping of str to float, optional
        Estimates by model key, SI; None entries are dropped.
    best : str, optional
        Key of the best estimate in ``estimates`` (default ``"mori_tanaka"``).
    band : Band or (float, float), optional
        Expected band (default per property and fraction from
        :mod:`micromech.rve.tolerances`); outside it the verdict is ``suspect``. Any band
        (also one from ``tolerance``) is clipped to rigorous bounds; a value on a clipped end
        keeps the ``bound_slack`` allowance.
    tolerance : float or (float, float), optional
        Relative tolerance around the best estimate; replaces ``band`` when given.
    context : Diagnosis, optional
        How the value was obtained, to name likely causes.
    bound_slack, hs_slack : float
        Relative allowances on the rigorous bounds and on the Hashin-Shtrikman band.
    bounds_rigorous : bool
        False for bounds that hold only under assumptions (the limit-analysis bounds of a
        strength): a value outside them is ``suspect``, not ``violates_bounds``.

    Returns
    -------
    PropertyCheck
        Verdict and reasons.

    Raises
    ------
    InputError
        If the value is not a finite number, a tolerance is given without a best estimate, or
        ``best`` is not among the estimates.

    Examples
    --------
    >>> r = grade_property("E2", 11e12, lower_bound=6e9, upper_bound=40e9,
    ...                    estimates={"mori_tanaka": 11e9}, tolerance=0.2)
    >>> r.verdict
    'violates_bounds'
    """
    kind = property_kind(name)
    v = _finite(value)
    if v is None:
        raise InputError(f"{name}: simulated value {value!r} is not a finite number")
    est = {k: f for k, x in (estimates or {}).items() if (f := _finite(x)) is not None}
    if best is not None and est and best not in est:
        raise InputError(
            f"{name}: best estimate {best!r} is not among the estimates {sorted(est)}"
        )
    best_value = est.get(best) if best is not None else None
    lb, ub = _finite(lower_bound), _finite(upper_bound)

    bnd: Band | None
    if tolerance is not None:
        if best_value is None:
            raise InputError(f"{name}: a tolerance needs a best estimate to measure from")
        bnd = band_about(best_value, tolerance)
    elif isinstance(band, Band):
        bnd = band
    elif band is not None:
        lo, hi = sorted((float(band[0]), float(band[1])))
        bnd = Band(low=np.asarray(lo), high=np.asarray(hi), basis="the given band")
    elif best_value is not None:
        bnd = band_about(best_value, DEFAULT_TOLERANCE)
        bnd = Band(bnd.low, bnd.high, basis=(
            f"a flat {100 * DEFAULT_TOLERANCE:.0f} % band: no measured band for this property "
            "(common practice, no source)"))
    else:
        bnd = None
    band_t = None if bnd is None else (float(bnd.low), float(bnd.high))
    # the band never reaches beyond a rigorous bound: clip it, and let a value on the clipped
    # end keep the bound's allowance for round-off and curve-fit scatter
    band_ok = band_t
    if band_t is not None and bnd is not None and bounds_rigorous:
        clipped, band_t, band_ok = _clip_band(band_t, lb, ub, bound_slack)
        if clipped:
            bnd = Band(np.asarray(band_t[0]), np.asarray(band_t[1]),
                       basis=f"{bnd.basis}; clipped to the {clipped}")
    hs = None
    if hs_band is not None:
        h0, h1 = _finite(hs_band[0]), _finite(hs_band[1])
        if h0 is not None and h1 is not None:
            hs = (min(h0, h1), max(h0, h1))
    model = model_label(best) if best else "the best estimate"
    ref_txt = (f"{_pct(v, best_value)} from {model} = {_fmt(best_value, name)}"
               if best_value else "")

    reasons: list[str] = []
    verdict = "consistent"
    slack_note = None
    below_lb = lb is not None and v < lb - bound_slack * abs(lb)
    above_ub = ub is not None and v > ub + bound_slack * abs(ub)
    if below_lb or above_ub:
        verdict = "violates_bounds" if bounds_rigorous else "suspect"
        side, b = ("lower", lb) if below_lb else ("upper", ub)
        word = "below" if below_lb else "above"
        if bounds_rigorous:
            reasons.append(
                f"{name} = {_fmt(v, name)} is {word} the rigorous {side} bound {_fmt(b, name)} "
                f"({_bound_name(kind, side)}, valid for any arrangement of these constituents "
                "at this fraction): no correct model can give it."
            )
        else:
            reasons.append(
                f"{name} = {_fmt(v, name)} is {word} the {_LIMIT_NAME[side]} {_fmt(b, name)} "
                f"({_LIMIT_TEXT[side]}). {LIMIT_ANALYSIS_NOTE}"
            )
    else:
        for b, side in ((lb, "lower"), (ub, "upper")):
            if b is not None and ((side == "lower" and v < b) or (side == "upper" and v > b)):
                which = f"{side} bound" if bounds_rigorous else _LIMIT_NAME[side]
                slack_note = (
                    f"{name} lies {abs(100 * (v / b - 1)):.2g} % beyond the {which} "
                    f"{_fmt(b, name)}, within the {100 * bound_slack:.2g} % allowed for "
                    "round-off and curve-fit scatter."
                )
        if hs is not None and (v < hs[0] - hs_slack * abs(hs[0])
                               or v > hs[1] + hs_slack * abs(hs[1])):
            verdict = "suspect"
            side = "below the lower" if v < hs[0] else "above the upper"
            ref = hs[0] if v < hs[0] else hs[1]
            reasons.append(
                f"{name} = {_fmt(v, name)} is {side} Hashin-Shtrikman value {_fmt(ref, name)} "
                f"({_pct(v, ref)}); these bounds hold for a transversely isotropic arrangement "
                "of perfectly bonded phases, so the model or its post-processing departs from "
                "the declared composite."
            )
        if (band_t is not None and band_ok is not None and bnd is not None
                and not band_ok[0] <= v <= band_ok[1]):
            verdict = "suspect"
            where = "below" if v < band_t[0] else "above"
            reasons.append(
                f"{name} = {_fmt(v, name)} is {where} the expected band "
                f"{_fmt(band_t[0], name)} .. {_fmt(band_t[1], name)} ({ref_txt}; band: "
                f"{bnd.basis})."
            )
    if verdict != "consistent":
        reasons.extend(likely_causes(
            name, v, best_value=best_value, best_model=model, band=band_t, lower_bound=lb,
            upper_bound=ub, context=context))
    else:
        if band_t is not None and bnd is not None:
            reasons.append(
                f"{name} = {_fmt(v, name)} lies within the expected band "
                f"{_fmt(band_t[0], name)} .. {_fmt(band_t[1], name)}"
                f"{', ' + ref_txt if ref_txt else ''} (band: "
                f"{bnd.basis})."
            )
        elif (lb is not None or ub is not None) and not bounds_rigorous:
            within = (f"within the limit-analysis bounds {_fmt(lb, name)} .. {_fmt(ub, name)}"
                      if lb is not None and ub is not None else
                      f"above the {_LIMIT_NAME['lower']} {_fmt(lb, name)}" if ub is None else
                      f"below the {_LIMIT_NAME['upper']} {_fmt(ub, name)}")
            reasons.append(
                f"{name} = {_fmt(v, name)} lies {within}; no estimate to compare it "
                f"with. {LIMIT_ANALYSIS_NOTE}"
            )
        elif lb is not None or ub is not None:
            reasons.append(
                f"{name} = {_fmt(v, name)} lies within the rigorous bounds "
                f"{_fmt(lb, name)} .. {_fmt(ub, name)}; no estimate to compare it with."
            )
        else:
            reasons.append(f"{name} = {_fmt(v, name)}: no bound or estimate to compare it with.")
    if slack_note:
        reasons.append(slack_note)
    return PropertyCheck(
        name=name, value=v, lower_bound=lb, upper_bound=ub, estimates=est,
        best_model=best if best_value is not None else None, band=band_t, hs_band=hs,
        verdict=verdict, reasons=tuple(reasons),
    )


def poisson_stability(
    result: PropertyCheck,
    modulus_i: tuple[str, float | None, str],
    modulus_j: tuple[str, float | None, str],
    moduli_verdicts: Mapping[str, str] | None = None,
    *,
    bound_slack: float = BOUND_SLACK,
) -> PropertyCheck:
    """Hold a graded Poisson ratio nu_ij to the stability limit nu_ij^2 < E_i / E_j.

    The compliance of a stable elastic solid is positive definite, so each 2x2 minor
    S_ii S_jj - S_ij^2 > 0, which for S_ii = 1 / E_i, S_ij = -nu_ij / E_i reads
    nu_ij^2 < E_i / E_j. Beyond sqrt(E_i / E_j) by more than ``bound_slack`` the ratio is
    ``violates_bounds``, with the limit stated first among the reasons.

    Parameters
    ----------
    result : PropertyCheck
        The graded Poisson ratio nu_ij (load axis i, lateral axis j).
    modulus_i, modulus_j : (str, float or None, str)
        Name, value (Pa) and source (e.g. ``"simulated"``) of E_i and E_j; a missing or
        non-positive modulus leaves the result as it is.
    moduli_verdicts : Mapping of str to str, optional
        Verdicts of the moduli, where graded: a modulus that is not consistent is named as the
        place to look first.
    bound_slack : float
        Relative allowance on the limit.

    Returns
    -------
    PropertyCheck
        The result, ``violates_bounds`` when the limit is broken.

    References
    ----------
    Lempriere, B. M. (1968). Poisson's ratio in orthotropic materials. *AIAA J.* 6, 2226-2227
    (from memory).

    Examples
    --------
    >>> r = grade_property("nu12", 256.0, estimates={"mori_tanaka": 0.27})
    >>> poisson_stability(r, ("E1", 41e9, "simulated"), ("E2", 10e9, "simulated")).verdict
    'violates_bounds'
    """
    name = result.name
    (ei, vi, si), (ej, vj, sj) = modulus_i, modulus_j
    if vi is None or vj is None or not (vi > 0.0 and vj > 0.0):
        return result
    limit = float(np.sqrt(vi / vj))
    if abs(result.value) <= limit * (1.0 + bound_slack):
        return result
    text = (
        f"{name} = {result.value:.4g} breaks the stability limit |{name}| < sqrt({ei} / {ej}) = "
        f"{limit:.4g} ({ei} = {_fmt(vi, ei)}, {si}; {ej} = {_fmt(vj, ej)}, {sj}): the "
        f"compliance of a stable elastic solid is positive definite, which requires {name}^2 "
        f"< {ei} / {ej} (Lempriere 1968, from memory), so no material has this set of "
        "constants."
    )
    off = [m for m in (ei, ej) if (moduli_verdicts or {}).get(m, "consistent") != "consistent"]
    if off:
        verdict = (moduli_verdicts or {})[off[0]]
        text += (f" {' and '.join(off)} {'is' if len(off) == 1 else 'are'} {verdict} as well: "
                 "look there first.")
    elif result.verdict == "consistent":
        text += f" {name} itself lies within its expected band: look at {ei} and {ej} first."
    else:
        text += (" A unit mismatch between the lateral and the axial displacement (or strain) "
                 "columns is the likely cause.")
    kept = () if result.verdict == "consistent" else result.reasons  # "within the band" is moot
    return PropertyCheck(
        name=name, value=result.value, lower_bound=result.lower_bound,
        upper_bound=result.upper_bound, estimates=result.estimates,
        best_model=result.best_model, band=result.band, hs_band=result.hs_band,
        verdict="violates_bounds", reasons=(text, *kept),
    )


def _bound_name(kind: str, side: str) -> str:
    if kind == "strength":
        return "limit analysis"
    return "Voigt" if side == "upper" else "Reuss"


def _clip_band(
    band: tuple[float, float], lb: float | None, ub: float | None, slack: float
) -> tuple[str, tuple[float, float], tuple[float, float]]:
    """Clip a band to the rigorous bounds.

    Returns what was clipped (``""``, ``"Reuss bound"``, ``"Voigt bound"`` or ``"Reuss and
    Voigt bounds"``), the clipped band, and the band to grade against: a clipped end moved out
    by the bound's allowance ``slack``, so that a value within it is not suspect for that alone.
    """
    lo, hi = band
    which = []
    if lb is not None and lo < lb:
        which.append("Reuss")
    if ub is not None and hi > ub:
        which.append("Voigt")
    if lb is not None:
        lo, hi = max(lo, lb), max(hi, lb)
    if ub is not None:
        lo, hi = min(lo, ub), min(hi, ub)
    lo_ok = lo - slack * abs(lo) if "Reuss" in which else lo
    hi_ok = hi + slack * abs(hi) if "Voigt" in which else hi
    text = "" if not which else (" and ".join(which) + (" bounds" if len(which) > 1 else
                                                       " bound"))
    return text, (lo, hi), (lo_ok, hi_ok)


#: What the limit-analysis bounds of a strength are, and why a strength outside them is only
#: suspect.
LIMIT_ANALYSIS_NOTE = (
    "These are limit-analysis bounds for perfectly plastic, perfectly bonded phases (Drucker "
    "1966), not rigorous bounds for every model: a strength from a brittle or damage model may "
    "legitimately lie outside them, so a strength is at most suspect."
)

_LIMIT_NAME = {"lower": "limit-analysis lower bound", "upper": "limit-analysis upper bound"}


_LIMIT_TEXT = {
    "lower": ("a bonded composite whose fibres are stronger than the matrix carries at least "
              "the matrix yield stress (in shear its von Mises shear yield stress, yield / "
              "sqrt(3)), since a uniform stress at that level is admissible; look for damage or "
              "debonding in the model, or a unit slip in the plastic input"),
    "upper": ("a uniform strain rate bounds the limit stress by the Voigt average of the phase "
              "strengths; check the force unit, the loaded area and the strength inputs"),
}


