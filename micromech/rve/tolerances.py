"""Default tolerances for grading simulated RVE properties against the closed-form estimates.

A single flat tolerance either flags correct RVE models or lets wrong ones through: a correct
full-field E2 of a random arrangement at Vf = 0.65 lies 14-18 % above Mori-Tanaka while E1 lies
within 0.1 %. The default acceptance band of each property is therefore set per property and per
fibre fraction from our own measurement of how far Mori-Tanaka is from periodic full-field
results (``ACCURACY.md`` of this project: aligned continuous isotropic fibres, perfect bonding,
hexagonal arrays and random arrangements of 36 fibres, Vf = 0.30 / 0.45 / 0.55 / 0.65; glass-like
and stiff-fibre contrasts), widened by a margin for mesh, cell-size and curve-fit scatter.

The band of a property ``p`` around the Mori-Tanaka value ``mt`` is

    low  = mt * min(1, 1 / (1 + e_hi)) * (1 - margin)
    high = mt * max(1, 1 / (1 + e_lo)) * (1 + margin)

where ``e = (mt - full_field) / full_field`` is the measured relative error (its range over the
contrasts and seeds is ``[e_lo, e_hi]``), linearly interpolated in the fraction (zero at
Vf = 0, where every estimate is exact; extrapolated with the last slope above 0.65). The band
always contains Mori-Tanaka itself, so a lower fibre/matrix contrast than the measured ones (where
the errors are smaller) is not flagged. For E2 the band also reaches up to Halpin-Tsai (xi = 2):
the measured full-field E2 always lay between Mori-Tanaka and Halpin-Tsai (xi = 2).

Square arrays were not measured and are not transversely isotropic (their transverse moduli depend
on the direction within the cross-section); their band is the hull of the hexagonal and random
bands with a further allowance on the transverse properties. Particles and short fibres were not
measured either: a flat band (common practice, no source) applies.

These numbers choose tolerances; they are not an outside reference.
"""

from __future__ import annotations

import difflib
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import CaseFileError, InputError
from micromech.results import ElasticConstants
from micromech.rve.causes import (
    STACK_ARCHITECTURES,
    STACK_PROPERTIES,
    UD_PROPERTIES,
    direction_of,
    property_kind,
    property_name,
)
from micromech.rve.ingest import DIRECTIONS

__all__ = [
    "BOUND_SLACK",
    "HS_SLACK",
    "MARGINS",
    "MT_ERROR",
    "PROPERTY_NAMES",
    "Band",
    "band_about",
    "check_selection",
    "corner_plies",
    "fibre_band",
    "particle_band",
    "parse_tolerances",
    "property_order",
    "ud_base_name",
]

Array = NDArray[np.float64]

#: Relative allowance on the rigorous (Voigt/Reuss) bounds for round-off and curve-fit scatter
#: of the simulated modulus (common practice, no source).
BOUND_SLACK = 0.005

#: Relative allowance on the Hashin-Shtrikman band (common practice, no source): a
#: displacement-based finite-element model errs on the stiff side, so a value clearly below the
#: lower bound of a transversely isotropic arrangement points to a modelling problem.
HS_SLACK = 0.01

#: Margin added on both sides of the measured band: mesh, finite cell and curve-fit scatter
#: (common practice, no source). Tight for the fibre-dominated E1 and nu12.
MARGINS: dict[str, float] = {
    "E1": 0.03,
    "nu12": 0.03,
    "G12": 0.05,
    "E2": 0.05,
    "G23": 0.05,
    "nu23": 0.05,
    "nu21": 0.05,
}

#: Extra allowance on the transverse properties of square arrays (not measured; not transversely
#: isotropic) and flat bands for particles / short fibres (common practice, no source).
SQUARE_EXTRA = 0.15
PARTICLE_TOLERANCE = {"sphere": 0.10, "spheroid": 0.15}

_FRACTIONS = np.array([0.0, 0.30, 0.45, 0.55, 0.65])

#: Measured relative error of Mori-Tanaka against full field, % (low, high) at Vf = 0.30, 0.45,
#: 0.55, 0.65 (ACCURACY.md of this project; our own measurement).
MT_ERROR: dict[str, dict[str, tuple[tuple[float, float], ...]]] = {
    "hexagonal": {
        "E1": ((0.0, 0.0), (0.0, 0.0), (0.0, 0.0), (0.0, 0.0)),
        "nu12": ((0.0, 0.0), (0.0, 0.0), (0.0, 0.0), (0.1, 0.1)),
        "G12": ((0.0, 0.0), (-0.1, -0.1), (-0.4, -0.4), (-1.2, -1.2)),
        "E2": ((-0.5, -0.5), (-3.0, -3.0), (-6.0, -5.0), (-11.0, -9.0)),
        "G23": ((-0.7, -0.7), (-4.0, -4.0), (-8.0, -7.0), (-14.0, -12.0)),
        "nu23": ((0.5, 0.5), (3.0, 3.0), (7.0, 8.0), (13.0, 15.0)),
    },
    "random": {
        "E1": ((0.0, 0.0), (0.0, 0.0), (0.0, 0.0), (0.0, 0.0)),
        "nu12": ((0.3, 0.3), (0.7, 0.7), (0.9, 0.9), (1.0, 1.0)),
        "G12": ((-3.0, -3.0), (-7.0, -6.0), (-10.0, -8.0), (-12.0, -9.0)),
        "E2": ((-4.0, -3.0), (-9.0, -7.0), (-14.0, -11.0), (-18.0, -14.0)),
        "G23": ((-5.0, -4.0), (-11.0, -9.0), (-17.0, -14.0), (-22.0, -18.0)),
        "nu23": ((3.0, 3.0), (6.0, 7.0), (11.0, 13.0), (16.0, 19.0)),
    },
}

#: Names a property may have in a check: material axes (unidirectional, particulate: x = 1 =
#: fibre, y = 2, z = 3) and stack axes (cross-ply and other stacks), plus strengths per direction.
PROPERTY_NAMES: tuple[str, ...] = (
    *UD_PROPERTIES,
    *STACK_PROPERTIES,
    *(f"yield_strength_{d}" for d in DIRECTIONS),
    *(f"ultimate_strength_{d}" for d in DIRECTIONS),
)

#: Unidirectional constants that share a band with a measured one (transverse isotropy).
_UD_BASE = {"E3": "E2", "G13": "G12", "nu13": "nu12", "nu32": "nu23", "nu31": "nu21"}


@dataclass(frozen=True)
class Band:
    """An acceptance band for a simulated value.

    Attributes
    ----------
    low, high : ndarray, shape (...)
        Ends of the band, in the property's SI unit.
    basis : str
        One sentence saying where the band comes from.
    """

    low: Array
    high: Array
    basis: str


def ud_base_name(name: str) -> str:
    """Return the measured property whose band a unidirectional constant shares.

    Parameters
    ----------
    name : str
        Constant name (``"E3"`` shares the band of ``"E2"``, ``"G13"`` that of ``"G12"`` ...).

    Returns
    -------
    str
        The name with a measured band.
    """
    return _UD_BASE.get(name, name)


def _interp_extrap(x: Array, xp: Array, fp: Array) -> Array:
    """Linear interpolation with linear extrapolation of the last segment above ``xp[-1]``."""
    y = np.interp(x, xp, fp)
    slope = (fp[-1] - fp[-2]) / (xp[-1] - xp[-2])
    return np.where(x > xp[-1], fp[-1] + slope * (x - xp[-1]), y)


def _error_range(name: str, vf: Array, arrangement: str) -> tuple[Array, Array]:
    table = MT_ERROR[arrangement][name]
    lo = np.concatenate([[0.0], [t[0] for t in table]]) / 100.0
    hi = np.concatenate([[0.0], [t[1] for t in table]]) / 100.0
    return _interp_extrap(vf, _FRACTIONS, lo), _interp_extrap(vf, _FRACTIONS, hi)


def fibre_band(
    name: str,
    mori_tanaka: ArrayLike,
    vf: ArrayLike,
    arrangement: str = "random",
    *,
    halpin_tsai: ArrayLike | None = None,
) -> Band:
    """Default acceptance band of a constant of aligned continuous fibres around Mori-Tanaka.

    Parameters
    ----------
    name : str
        Constant in material axes: ``E1, E2, E3, G12, G13, G23, nu12, nu13, nu23, nu21, nu31,
        nu32`` (the transverse ones share the band of their transversely isotropic twin).
    mori_tanaka : array_like, shape (...)
        The Mori-Tanaka value, SI.
    vf : array_like, shape (...)
        Fibre volume fraction.
    arrangement : {"random", "hexagonal", "square"}
        Fibre arrangement of the RVE.
    halpin_tsai : array_like, shape (...), optional
        Halpin-Tsai (xi = 2) value; widens the upper end of the E2/E3 band up to it.

    Returns
    -------
    Band
        ``low``, ``high`` and a sentence naming the basis.

    Raises
    ------
    InputError
        For an unknown constant name or arrangement.

    References
    ----------
    Mori, T., Tanaka, K. (1973), Acta Metallurgica 21, 571-574 (the centre estimate);
    Halpin, J. C., Kardos, J. L. (1976), Polymer Engineering and Science 16(5), 344-352 (xi = 2
    for E2 of circular fibres); the error table is this project's own measurement (ACCURACY.md).
    """
    base = ud_base_name(name)
    if base not in MARGINS:
        raise InputError(
            f"property {name!r} has no default band for aligned fibres; expected one of "
            f"{sorted(set(MARGINS) | set(_UD_BASE))}"
        )
    if arrangement not in ("random", "hexagonal", "square"):
        raise InputError(
            f"arrangement = {arrangement!r} has no measured band; expected random, hexagonal or "
            "square"
        )
    mt = np.asarray(mori_tanaka, dtype=np.float64)
    v = np.asarray(vf, dtype=np.float64)
    margin = MARGINS[base]
    if base == "nu21":  # nu21 = nu12 E2 / E1: the bands of nu12 and E2 compound
        lo_n, hi_n = _factors("nu12", v, arrangement)
        lo_e, hi_e = _factors("E2", v, arrangement)
        lo_f, hi_f = lo_n * lo_e, hi_n * hi_e
    else:
        lo_f, hi_f = _factors(base, v, arrangement)
    low = mt * lo_f * (1.0 - margin)
    high = mt * hi_f * (1.0 + margin)
    basis = (
        f"measured spread of Mori-Tanaka against full-field results for a {arrangement} "
        f"arrangement at this fraction, widened by {100 * margin:.0f} %"
    )
    if arrangement == "square" and base in ("E2", "G23", "nu23", "nu21"):
        low = low * (1.0 - SQUARE_EXTRA)
        high = high * (1.0 + SQUARE_EXTRA)
        basis = (
            "square arrays were not measured and are not transversely isotropic: hull of the "
            f"hexagonal and random bands widened by {100 * (margin + SQUARE_EXTRA):.0f} %"
        )
    if base == "E2" and halpin_tsai is not None:
        high = np.maximum(high, np.asarray(halpin_tsai, dtype=np.float64) * (1.0 + margin))
        basis += "; full-field E2 lies between Mori-Tanaka and Halpin-Tsai (xi = 2)"
    return Band(low=np.minimum(low, high), high=np.maximum(low, high), basis=basis)


def _factors(base: str, v: Array, arrangement: str) -> tuple[Array, Array]:
    arrs = ("hexagonal", "random") if arrangement == "square" else (arrangement,)
    lo_f = np.full(v.shape, np.inf)
    hi_f = np.full(v.shape, -np.inf)
    for arr in arrs:
        e_lo, e_hi = _error_range(base, v, arr)
        # full field = MT / (1 + e): the band of true values, always containing MT itself
        lo_f = np.minimum(lo_f, np.minimum(1.0, 1.0 / (1.0 + e_hi)))
        hi_f = np.maximum(hi_f, np.maximum(1.0, 1.0 / (1.0 + e_lo)))
    return lo_f, hi_f


def corner_plies(
    mori_tanaka: ElasticConstants,
    vf: ArrayLike,
    arrangement: str = "random",
    *,
    halpin_tsai: ElasticConstants | None = None,
) -> list[ElasticConstants]:
    """Plies at the ends of their expected bands, to carry the bands through a stack.

    Each ply constant (E1, E2, nu12, G12, nu23) takes the low or the high end of its band
    (:func:`fibre_band`). The full-field results are stiffer transversely and have a lower nu23
    than Mori-Tanaka, so the stiff corner pairs high moduli with low Poisson ratios and the soft
    corner the reverse; two mixed corners take all ends alike. The band of a stack property is
    the range of the stacks of these plies and of the Mori-Tanaka (and Halpin-Tsai) plies.

    Parameters
    ----------
    mori_tanaka : ElasticConstants
        Mori-Tanaka ply (E1, E2, nu12, G12, nu23 needed), shape ().
    vf : array_like
        Fibre volume fraction.
    arrangement : str
        Fibre arrangement.
    halpin_tsai : ElasticConstants, optional
        A complete Halpin-Tsai ply (its E2 also widens the E2 band).

    Returns
    -------
    list of ElasticConstants
        The four corner plies (transversely isotropic): stiff, soft, and the two mixed ones.
    """
    ends: dict[str, tuple[Array, Array]] = {}
    for n in ("E1", "E2", "nu12", "G12", "nu23"):
        b = fibre_band(n, mori_tanaka.get(n), vf, arrangement,  # type: ignore[arg-type]
                       halpin_tsai=None if halpin_tsai is None else halpin_tsai.get(n))
        ends[n] = (b.low, b.high)

    def ply(moduli: int, poisson: int) -> ElasticConstants:
        return ElasticConstants.transversely_isotropic(
            ends["E1"][moduli], ends["E2"][moduli], ends["nu12"][poisson], ends["G12"][moduli],
            nu23=ends["nu23"][poisson], model="band corner")

    return [ply(1, 0), ply(0, 1), ply(1, 1), ply(0, 0)]


def particle_band(best: ArrayLike, inclusion: str = "sphere") -> Band:
    """Default band for particles and short fibres: a flat relative tolerance (not measured).

    Parameters
    ----------
    best : array_like, shape (...)
        The best estimate (Mori-Tanaka), SI.
    inclusion : {"sphere", "spheroid"}
        Inclusion shape.

    Returns
    -------
    Band
        ``best * (1 -+ t)`` with t = 0.10 for spheres, 0.15 for spheroids.

    Raises
    ------
    InputError
        For another inclusion shape.
    """
    if inclusion not in PARTICLE_TOLERANCE:
        raise InputError(
            f"inclusion = {inclusion!r} has no flat band; expected one of "
            f"{sorted(PARTICLE_TOLERANCE)}"
        )
    t = PARTICLE_TOLERANCE[inclusion]
    b = np.asarray(best, dtype=np.float64)
    return Band(
        low=np.minimum(b * (1 - t), b * (1 + t)),
        high=np.maximum(b * (1 - t), b * (1 + t)),
        basis=(
            f"{inclusion} inclusions were not measured against full-field results: a flat "
            f"{100 * t:.0f} % band around Mori-Tanaka (common practice, no source)"
        ),
    )


def band_about(best: ArrayLike, tolerance: float | tuple[float, float]) -> Band:
    """Band ``best * (1 - below) .. best * (1 + above)`` from a user tolerance.

    Parameters
    ----------
    best : array_like, shape (...)
        The best estimate, SI.
    tolerance : float or (float, float)
        Relative tolerance, symmetric or as (below, above).

    Returns
    -------
    Band
        The band with a basis naming the tolerance.

    Raises
    ------
    InputError
        If a tolerance is negative, not finite, or ``below`` is 1 or more.
    """
    below, above = (tolerance, tolerance) if np.isscalar(tolerance) else tolerance  # type: ignore[misc]
    below, above = float(below), float(above)  # type: ignore[arg-type]
    for label, t in (("below", below), ("above", above)):
        if not np.isfinite(t) or t < 0.0:
            raise InputError(f"tolerance {label} = {t!r} must be a finite number >= 0")
    if below >= 1.0:
        raise InputError(f"tolerance below = {below!r} must be less than 1 (100 %)")
    b = np.asarray(best, dtype=np.float64)
    lo, hi = b * (1.0 - below), b * (1.0 + above)
    text = (
        f"{100 * below:.3g} %" if below == above
        else f"-{100 * below:.3g} % / +{100 * above:.3g} %"
    )
    return Band(low=np.minimum(lo, hi), high=np.maximum(lo, hi),
                basis=f"tolerance {text} around the best estimate (given by the user)")


def parse_tolerances(items: Iterable[str] | Mapping[str, float]) -> dict[str, float]:
    """Read tolerance overrides such as ``"E2=0.2"`` (relative, symmetric).

    Parameters
    ----------
    items : iterable of str, or mapping of str to float
        ``NAME=VALUE`` strings (a trailing ``%`` divides by 100), or a mapping.

    Returns
    -------
    dict of str to float
        Property name -> relative tolerance.

    Raises
    ------
    InputError
        For a malformed item, an unknown property name (the nearest valid one is suggested) or
        a value that is not a number in [0, 1).
    """
    pairs: list[tuple[str, object]]
    if isinstance(items, Mapping):
        pairs = list(items.items())
    else:
        pairs = []
        for item in items:
            if "=" not in item:
                raise InputError(
                    f"tolerance {item!r} must read NAME=VALUE, e.g. E2=0.2 (relative) or E2=20%"
                )
            name, _, text = item.partition("=")
            pairs.append((name.strip(), text.strip()))
    out: dict[str, float] = {}
    for key, val in pairs:
        if key not in PROPERTY_NAMES:
            near = difflib.get_close_matches(key, PROPERTY_NAMES, n=1)
            hint = f"; did you mean {near[0]!r}?" if near else ""
            raise InputError(f"tolerance for unknown property {key!r}{hint}")
        try:
            if isinstance(val, str) and val.endswith("%"):
                t = float(val[:-1]) / 100.0
            else:
                t = float(val)  # type: ignore[arg-type]
        except (TypeError, ValueError):
            raise InputError(
                f"tolerance {key} = {val!r} is not a number (give e.g. 0.2 or 20%)"
            ) from None
        if not (np.isfinite(t) and 0.0 <= t < 1.0):
            raise InputError(f"tolerance {key} = {val!r} must lie in [0, 1) (a relative tolerance)")
        out[key] = t
    return out


# ------------------------------------------------------------------------------------------
# the order of names in tables, and the [check] properties list

_ORDER_DIRECTIONS = ("x", "y", "z", "yz", "xz", "xy")
_ORDER = (
    *UD_PROPERTIES, *STACK_PROPERTIES,
    *(f"yield_strength_{d}" for d in _ORDER_DIRECTIONS),
    *(f"ultimate_strength_{d}" for d in _ORDER_DIRECTIONS),
)
_ORDER_INDEX = {n: i for i, n in enumerate(_ORDER)}


def property_order(name: str) -> int:
    """Sort key of a property name in tables: moduli, Poisson ratios, yields, strengths.

    Parameters
    ----------
    name : str
        Property name.

    Returns
    -------
    int
        Its place (unknown names last).
    """
    return _ORDER_INDEX.get(name, len(_ORDER_INDEX))


def _other_family(name: str, arch: str) -> str | None:
    """Return the name this cell gives a property named in the other family's axes."""
    stack = arch in STACK_ARCHITECTURES
    if name in (UD_PROPERTIES if stack else STACK_PROPERTIES):
        d, lat = direction_of(name)
        if d is not None:
            return property_name(arch, d, lat)
    return None


def _suggest(name: str) -> list[str]:
    """Return the valid names nearest to a misspelt one.

    The same letters in another case come first, then the shear modulus with its indices in
    the other order, then the closest by spelling.
    """
    near = [n for n in PROPERTY_NAMES if n.lower() == name.lower()]
    if len(name) == 3 and name[0] in "Gg":
        near += [n for n in PROPERTY_NAMES if n == f"G{name[2]}{name[1]}"]
    if near:
        return near
    lower = {n.lower(): n for n in PROPERTY_NAMES}
    near += [lower[m] for m in difflib.get_close_matches(name.lower(), list(lower), n=3,
                                                          cutoff=0.5)]
    return list(dict.fromkeys(near))[:3]


def _source_of(name: str) -> str:
    """Which [rve] entry gives a property (for messages)."""
    d, lat = direction_of(name)
    if property_kind(name) == "strength":
        return (f"a [[rve.load_case]] history with direction = {d!r} (averaged load cases and "
                "[rve.stiffness] give no strengths)")
    if lat is not None:
        return (f"a [[rve.load_case]] history with direction = {d!r} and a lateral column in "
                f"{lat}, or averaged load cases / [rve.stiffness] (all nine constants)")
    return (f"a [[rve.load_case]] with direction = {d!r}, or averaged load cases / "
            "[rve.stiffness] (all nine constants)")


def check_selection(
    wanted: Sequence[str], given: Iterable[str], not_graded: Mapping[str, str],
    architecture: str, where: str = "case",
) -> None:
    """Validate a ``[check] properties`` list against the names a case's results give.

    Parameters
    ----------
    wanted : sequence of str
        The names listed.
    given : iterable of str
        The names the results give a value for.
    not_graded : Mapping of str to str
        Names a load case gives without a value (a yield strength the curve never reaches),
        with the reason.
    architecture : str
        RVE architecture (sets the naming: E1 ... or Ex ...).
    where : str
        The case, for messages.

    Raises
    ------
    InputError
        For a name that is no property name (the nearest valid names are suggested).
    CaseFileError
        For an empty list, a name the results do not give (saying which load case, or which
        name, would give it), or a list that selects nothing that can be graded.
    """
    have = sorted(given, key=property_order)
    if not wanted:
        raise CaseFileError(
            f"{where}: [check] properties = [] selects nothing to grade; list the names to "
            "grade (e.g. [\"E1\", \"nu12\"]) or leave the key out to grade everything")
    unknown = []
    for n in wanted:
        if n not in PROPERTY_NAMES:
            near = _suggest(n)
            hint = f" (did you mean {' or '.join(repr(x) for x in near)}?)" if near else ""
            unknown.append(f"{n!r}{hint}")
    if unknown:
        raise InputError(
            f"{where}: [check] properties: {'; '.join(unknown)} "
            f"{'is not a property name' if len(unknown) == 1 else 'are not property names'}; "
            f"the names are {', '.join(UD_PROPERTIES)} for unidirectional and particulate "
            f"cells, {', '.join(STACK_PROPERTIES)} for crossply and stack cells, and "
            "yield_strength_x, ultimate_strength_xy ... per load case")
    for n in wanted:
        if n in have or n in not_graded:
            continue
        other = _other_family(n, architecture)
        if other is not None:
            why = (f"{architecture} cells name this property {other!r} ("
                   + ("Ex ... for crossply and stack cells"
                      if architecture in STACK_ARCHITECTURES else
                      "E1 ... with x = 1 the fibre axis for unidirectional and particulate "
                      "cells") + ")")
        else:
            why = f"it needs {_source_of(n)}, which this case does not have"
        raise CaseFileError(
            f"{where}: [check] properties: {n!r} is not given by this case's [rve] results: "
            f"{why}; the results give {', '.join(have) or 'nothing'}")
    if not any(n in have for n in wanted):
        reasons = "; ".join(f"{k}: {r}" for k, r in not_graded.items() if k in wanted)
        raise CaseFileError(
            f"{where}: [check] properties = {list(wanted)!r} selects nothing that can be "
            f"graded ({reasons}); add properties the results give: {', '.join(have)}")
