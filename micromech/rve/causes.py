"""Likely causes of a simulated value far from its bounds or estimates, and cross-checks.

The causes are tried in the order they are met in practice: a unit slip (a ratio to the best
estimate near a power of 1000), a wrong area or length (a ratio near a ratio of the RVE's faces
or edges), a sign slip, boundary conditions (over-constrained when too stiff, free faces when
too soft), and a fibre fraction other than the declared one (solved for under the best
estimate). The geometry of a load case (wrong areas, lengths, swapped sizes, the shear
convention) and a wrong cell size, which shows in the three normal load cases together
(:func:`fit_size_error`), are diagnosed in :mod:`micromech.rve.sizecauses` and re-exported
here. The cross-checks (:func:`consistency_reasons`) test reciprocity and the
equalities that the cell's symmetry imposes.

References
----------
.. [1] Hill, R. (1952). The elastic behaviour of a crystalline aggregate. *Proc. Phys. Soc. A*
   65, 349-354 (the constrained modulus C_ii exceeds the Young's modulus 1/S_ii).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.results import ElasticConstants
from micromech.rve.sizecauses import (
    _geometry_factors,
    _positive,
    fit_size_error,
    shear_convention,
    size_error_reason,
)
from micromech.units import format_si

__all__ = [
    "MODEL_LABELS",
    "STACK_ARCHITECTURES",
    "STACK_PROPERTIES",
    "UD_PROPERTIES",
    "constant_of",
    "direction_of",
    "format_property",
    "property_name",
    "Diagnosis",
    "consistency_reasons",
    "fit_size_error",
    "fraction_for_value",
    "likely_causes",
    "model_label",
    "property_kind",
    "shear_convention",
    "size_error_reason",
]

#: Relative mismatch allowed by the consistency checks (reciprocity, equal moduli of a
#: symmetric cell): curve-fit scatter and finite random cells (common practice, no source).
RECIPROCITY_TOLERANCE = 0.05
SYMMETRY_TOLERANCE = {"hexagonal": 0.05, "square": 0.05, "random": 0.10}
#: Strengths depend on local details (the first crack, the mesh near it): a looser tolerance.
STRENGTH_SYMMETRY_TOLERANCE = 0.15

#: Plain labels of the model keys, for sentences and tables.
MODEL_LABELS: dict[str, str] = {
    "voigt": "Voigt",
    "reuss": "Reuss",
    "hashin_shtrikman_lower": "Hashin-Shtrikman lower",
    "hashin_shtrikman_upper": "Hashin-Shtrikman upper",
    "rule_of_mixtures": "rule of mixtures",
    "halpin_tsai": "Halpin-Tsai",
    "chamis": "Chamis",
    "cylinders": "composite cylinders",
    "mori_tanaka": "Mori-Tanaka",
}


def model_label(key: str) -> str:
    """Return a plain label for a model key (``stack_`` keys: a stack of such plies).

    Parameters
    ----------
    key : str
        Model key such as ``"mori_tanaka"`` or ``"stack_halpin_tsai"``.

    Returns
    -------
    str
        The label, e.g. ``"Mori-Tanaka"`` or ``"stack of Halpin-Tsai plies"``.
    """
    if key.startswith("stack_"):
        return f"stack of {model_label(key[6:])} plies"
    return MODEL_LABELS.get(key, key.replace("_", " "))


def property_kind(name: str) -> str:
    """Return the kind of a property: ``modulus``, ``shear``, ``poisson`` or ``strength``.

    Parameters
    ----------
    name : str
        Property name (``"E2"``, ``"Gxy"``, ``"nu12"``, ``"yield_strength_x"`` ...).

    Returns
    -------
    str
        The kind.

    Raises
    ------
    InputError
        For a name that is none of these.
    """
    if name.startswith("nu"):
        return "poisson"
    if "strength" in name:
        return "strength"
    if name.startswith("E"):
        return "modulus"
    if name.startswith("G"):
        return "shear"
    raise InputError(
        f"property name {name!r} is not a modulus (E...), shear modulus (G...), Poisson ratio "
        "(nu...) or strength (..._strength_...)"
    )


def format_property(value: float | None, name: str) -> str:
    """Format a property value for sentences and tables: SI prefix and unit, 4 digits.

    Parameters
    ----------
    value : float or None
        The value, SI (Pa for moduli and strengths).
    name : str
        Property name (a Poisson ratio is shown as a plain number).

    Returns
    -------
    str
        E.g. ``"72 GPa"``, ``"0.3"``; ``"-"`` for None.
    """
    if value is None:
        return "-"
    if property_kind(name) == "poisson":
        return f"{value:.4g}"
    return format_si(float(value), "pressure")


def _pct(a: float, b: float) -> str:
    """Signed relative difference of a against b, in %."""
    return f"{100.0 * (a / b - 1.0):+.1f} %"


def _finite(x: Any) -> float | None:
    if x is None:
        return None
    try:
        v = float(np.asarray(x, dtype=np.float64))
    except (TypeError, ValueError):
        return None
    return v if math.isfinite(v) else None


@dataclass(frozen=True)
class Diagnosis:
    """How a simulated value was obtained, so that a bad value can be traced to a cause.

    Attributes
    ----------
    direction : str, optional
        Load case of the value: ``x``, ``y``, ``z`` (normal) or ``xy``, ``yz``, ``xz`` (shear,
        force along the first axis on the face normal to the second).
    lateral : str, optional
        Lateral axis of a Poisson ratio (``"y"`` for nu_xy).
    size : (float, float, float), optional
        Declared RVE edge lengths (x, y, z), m.
    source : {"force_displacement", "stress_strain", "stiffness"}
        What the value was computed from.
    fraction : float, optional
        Declared fibre volume fraction.
    fraction_curve : (array, array), optional
        Fibre fractions and the best estimate of the property at each, for solving the
        fraction that would give the simulated value.
    constrained_modulus : float, optional
        The best estimate's modulus under uniaxial strain (C_ii), Pa: a value near it points to
        lateral faces held fixed.
    """

    direction: str | None = None
    lateral: str | None = None
    size: tuple[float, float, float] | None = None
    source: str = "force_displacement"
    fraction: float | None = None
    fraction_curve: tuple[ArrayLike, ArrayLike] | None = None
    constrained_modulus: float | None = None


# ------------------------------------------------------------------------------------------
# property names by architecture and load case

#: Architectures whose properties carry stack names (Ex ... nuzy).
STACK_ARCHITECTURES = ("crossply", "stack")
_UD_NAMES = {"x": "E1", "y": "E2", "z": "E3", "xy": "G12", "xz": "G13", "yz": "G23"}
_STACK_NAMES = {"x": "Ex", "y": "Ey", "z": "Ez", "xy": "Gxy", "xz": "Gxz", "yz": "Gyz"}
_NU_INDEX = {"x": "1", "y": "2", "z": "3"}
#: Name -> ElasticConstants attribute (stack results carry Ex as E1 ...).
_CONST = {
    **{n: n for n in ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23")},
    "Ex": "E1", "Ey": "E2", "Ez": "E3", "Gxy": "G12", "Gxz": "G13", "Gyz": "G23",
    "nuxy": "nu12", "nuxz": "nu13", "nuyz": "nu23",
}
#: Minor Poisson ratios: nu_ji = nu_ij E_j / E_i.
_MINOR = {"nu21": ("nu12", "E2", "E1"), "nu31": ("nu13", "E3", "E1"),
          "nu32": ("nu23", "E3", "E2"), "nuyx": ("nu12", "E2", "E1"),
          "nuzx": ("nu13", "E3", "E1"), "nuzy": ("nu23", "E3", "E2")}
#: The elastic properties by name: material axes and stack axes.
UD_PROPERTIES = (*_UD_NAMES.values(), "nu12", "nu13", "nu23", "nu21", "nu31", "nu32")
STACK_PROPERTIES = (*_STACK_NAMES.values(), "nuxy", "nuxz", "nuyz", "nuyx", "nuzx", "nuzy")


def property_name(architecture: str, direction: str, lateral: str | None = None) -> str:
    """Name of the property a load case measures.

    Parameters
    ----------
    architecture : str
        ``unidirectional``, ``particulate`` (names E1 ... nu32) or ``crossply``, ``stack``
        (names Ex ... nuzy).
    direction : str
        Load case: x, y, z, xy, xz, yz.
    lateral : str, optional
        Lateral axis, for a Poisson ratio nu_{direction, lateral}.

    Returns
    -------
    str
        E.g. ``"E2"``, ``"Gxy"``, ``"nu12"``, ``"nuyx"``.

    Raises
    ------
    InputError
        For an unknown direction or a lateral axis equal to the load axis.
    """
    stack = architecture in STACK_ARCHITECTURES
    names = _STACK_NAMES if stack else _UD_NAMES
    if direction not in names:
        raise InputError(f"direction = {direction!r}: expected one of {sorted(names)}")
    if lateral is None:
        return names[direction]
    if direction not in _NU_INDEX or lateral not in _NU_INDEX or lateral == direction:
        raise InputError(
            f"Poisson ratio of load case {direction!r} needs a lateral axis among x, y, z other "
            f"than the load axis, got {lateral!r}"
        )
    return f"nu{direction}{lateral}" if stack else f"nu{_NU_INDEX[direction]}{_NU_INDEX[lateral]}"


def direction_of(name: str) -> tuple[str | None, str | None]:
    """Return the load case and lateral axis that measure a property.

    Parameters
    ----------
    name : str
        Property name (``"E2"``, ``"nuzx"``, ``"yield_strength_xy"`` ...).

    Returns
    -------
    (str or None, str or None)
        Load direction and lateral axis (None where not applicable or unknown).
    """
    for table in (_UD_NAMES, _STACK_NAMES):
        for d, n in table.items():
            if n == name:
                return d, None
    if name.startswith("nu") and len(name) == 4:
        a, b = name[2], name[3]
        inv = {v: k for k, v in _NU_INDEX.items()}
        a, b = inv.get(a, a), inv.get(b, b)
        return a, b
    if "strength_" in name:
        return name.rsplit("_", 1)[-1], None
    return None, None


def constant_of(ec: ElasticConstants, name: str) -> NDArray[np.float64] | None:
    """Return a named constant of a result (minor Poisson ratios by reciprocity).

    Parameters
    ----------
    ec : ElasticConstants
        The result (stack results carry Ex as E1 ...).
    name : str
        Property name in material or stack axes.

    Returns
    -------
    ndarray or None
        The value, None where the result does not give it.
    """
    if name in _MINOR:
        nu, ej, ei = _MINOR[name]
        a, b, c = ec.get(nu), ec.get(ej), ec.get(ei)
        if a is None or b is None or c is None:
            return None
        return np.asarray(a * b / c)
    attr = _CONST.get(name)
    return None if attr is None else ec.get(attr)


# ------------------------------------------------------------------------------------------
# likely causes


def likely_causes(
    name: str,
    value: float,
    *,
    best_value: float | None,
    best_model: str = "the best estimate",
    band: tuple[float, float] | None = None,
    lower_bound: float | None = None,
    upper_bound: float | None = None,
    context: Diagnosis | None = None,
) -> list[str]:
    """List the likely causes of a value far from the best estimate, most likely first.

    The order: a unit slip (ratio near a power of 1000, or 100 for percent strains), a wrong
    area or length (ratio near a ratio of the RVE's faces or edges), a sign slip, boundary
    conditions (over-constrained when too stiff, free faces when too soft), and the fibre
    fraction that would give the value under the best estimate. A wrong area or length is
    tried both ways (micromech reading another face or edge than the model used, and the
    reverse), with the other shear convention and [rve].size entries swapped. A cause that was
    tried and does not fit (no fibre fraction gives the value) follows the numbered causes as
    ``Ruled out: ...``.

    Parameters
    ----------
    name : str
        Property name.
    value : float
        Simulated value, SI.
    best_value : float or None
        The best estimate, SI.
    best_model : str
        Its label, for the sentences.
    band : (float, float), optional
        The expected band; a correction must bring the value near it to count as a match.
    lower_bound, upper_bound : float, optional
        Rigorous bounds; a correction must bring the value inside them.
    context : Diagnosis, optional
        How the value was obtained.

    Returns
    -------
    list of str
        ``Likely cause 1: ...`` sentences, most likely first, then ``Ruled out: ...`` ones.
    """
    ctx = context or Diagnosis()
    kind = property_kind(name)
    out: list[tuple[float, str]] = []
    ruled_out: list[str] = []
    if best_value is None or best_value == 0.0:
        return []
    with np.errstate(over="ignore", under="ignore"):
        ratio = float(np.float64(value) / np.float64(best_value))
    if not math.isfinite(ratio):  # a value near the float range over a small estimate
        ratio = math.copysign(1e300, ratio)
    label = best_model
    lo_ok = (band[0] if band else best_value * 0.85) / 1.15
    hi_ok = (band[1] if band else best_value * 1.15) * 1.15
    lo_ok, hi_ok = min(lo_ok, hi_ok), max(lo_ok, hi_ok)

    def inside_bounds(x: float) -> bool:
        return ((lower_bound is None or x >= lower_bound * 0.9)
                and (upper_bound is None or x <= upper_bound * 1.1))

    # 1. unit slips: only factors of 1000 (and 100 for percent strains) give such ratios
    residual = ratio
    if ratio > 0:
        for f, text in _unit_factors(kind, ctx.source):
            r = ratio / f
            if _positive(r) and abs(math.log(r)) < math.log(3.0) and inside_bounds(value / f):
                residual = r
                out.append((-10.0 + abs(math.log(r)), (
                    f"A unit slip: {name} is {ratio:.3g} times {label} = "
                    f"{format_property(best_value, name)}, close to "
                    f"{_factor_text(f)}{_rest(r)}. {text}")))
                break
    # 2. a wrong area or length (also on top of a unit slip); alike factors share a sentence
    if residual > 0 and ctx.size is not None and ctx.direction is not None:
        lo_g, hi_g = (band[0] / 1.05, band[1] * 1.05) if band else (lo_ok, hi_ok)
        groups: dict[float, list[str]] = {}
        for f, text in _geometry_factors(kind, ctx):
            corrected = best_value * residual / f
            if not (_positive(residual / f) and math.isfinite(corrected)):
                continue
            gain = abs(math.log(residual)) - abs(math.log(residual / f))
            if lo_g <= corrected <= hi_g and inside_bounds(corrected) and gain > 0.05:
                groups.setdefault(float(f"{f:.3g}"), []).append(text)
        ranked = sorted(groups.items(), key=lambda kv: (abs(math.log(residual / kv[0])),
                                                        len(kv[1][0])))
        convention = (f" {shear_convention(ctx.direction)}"
                      if len(ctx.direction) == 2 and kind in ("shear", "strength") else "")
        for f, texts in ranked[:2]:
            out.append((-5.0 + abs(math.log(residual / f)), (
                f"A wrong area or length: the ratio {residual:.3g} to {label} is close to "
                f"{f:.3g}, as with {'; or '.join(texts[:2])}; check [rve].size and the face "
                f"the force acts on ({ctx.direction} load case).{convention}")))
    # 3. a sign slip
    if ratio < 0 and lo_ok <= -value <= hi_ok:
        out.append((-4.0, (
            f"A sign slip: {name} has the wrong sign but the right size; force and displacement "
            "(or stress and strain) are of opposite sign, e.g. a compressive load read with a "
            "tensile sign convention, or the displacement of the other face.")))
    # 4. boundary conditions
    if ratio > 1.0:
        cm = ctx.constrained_modulus
        if kind == "modulus" and cm is not None and abs(math.log(value / cm)) < math.log(1.1):
            out.append((-3.0, (
                f"Over-constrained boundary conditions: {name} = "
                f"{format_property(value, name)} is close to the constrained modulus "
                f"{format_property(cm, name)} of {label} (lateral "
                "contraction prevented); let the lateral faces contract (periodic or "
                "symmetry conditions), do not hold them fixed.")))
        else:
            out.append((1.0, _BC_STIFF[kind]))
    else:
        out.append((1.0, _BC_SOFT[kind]))
    # 5. the fibre fraction
    if ctx.fraction_curve is not None and kind != "strength":
        vf_grid, values = ctx.fraction_curve
        vf = fraction_for_value(value, vf_grid, values, declared=ctx.fraction)
        declared = "" if ctx.fraction is None else f" instead of the declared {ctx.fraction:.3g}"
        if vf is not None:
            out.append((2.0, (
                f"A fibre fraction different from the declared one: {label} gives this "
                f"value at Vf = {vf:.3f}{declared}; check the fibre count, diameter and cell "
                "size of the RVE geometry.")))
        else:
            vmax = float(np.max(np.asarray(vf_grid)))
            ruled_out.append(
                f"Ruled out: a wrong fibre fraction. No fibre fraction between 0 and {vmax:.3g} "
                f"gives this value under {label}, so a wrong fraction alone cannot explain it.")
    out.sort(key=lambda t: t[0])
    return [f"Likely cause {i + 1}: {text}" for i, (_, text) in enumerate(out)] + ruled_out


def _rest(r: float) -> str:
    if abs(math.log(r)) < 0.05:
        return ""
    return f" (remaining factor {r:.3g})"


def _factor_text(f: float) -> str:
    k = math.log10(f)
    if abs(k - round(k)) < 1e-9:
        return f"10^{int(round(k))}"
    return f"{f:g}"


def _unit_factors(kind: str, source: str) -> list[tuple[float, str]]:
    """(factor by which the value is too large, explanation) for common unit slips."""
    big: str
    small: str
    if kind == "poisson":
        big = ("Check that the lateral and the axial displacement (or strain) columns carry the "
               "same unit as declared, e.g. one in um and the other in mm.")
        small = big
    elif source == "stiffness":
        big = "Check the unit declared for the stiffness matrix (e.g. GPa declared, MPa given)."
        small = "Check the unit declared for the stiffness matrix (e.g. MPa declared, GPa given)."
    elif source == "stress_strain":
        big = ("Check the stress unit (e.g. GPa declared while the file holds MPa) and the "
               "strain unit.")
        small = ("Check the stress unit (e.g. Pa or kPa declared while the file holds MPa) and "
                 "the strain unit (microstrain read as strain).")
    elif kind == "strength":
        big = ("Check the force unit (e.g. kN declared while the file holds N) and [rve].size "
               "(an area in mm^2 read as um^2 is a factor 10^6).")
        small = ("Check the force unit (e.g. N declared while the file holds kN, or mN read as "
                 "N) and [rve].size.")
    else:
        big = ("Check the units of the load case: force declared in kN while the file holds N, "
               "displacement declared in um while the file holds mm, or a cell size in "
               "[rve].size given in um where mm were meant.")
        small = ("Check the units of the load case: displacement declared in mm while the file "
                 "holds um, force declared in N while the file holds kN (or mN), or a cell "
                 "size in [rve].size given in mm where um were meant.")
    out: list[tuple[float, str]] = []
    for k in (1, 2, 3):
        out.append((1000.0**k, big))
        out.append((1000.0**-k, small))
    if source == "stress_strain" and kind in ("modulus", "shear"):
        out.append((0.01, "The strains may be written in percent but read as plain numbers "
                          "(give unit = \"%\")."))
        out.append((100.0, "The strains may be plain numbers but declared in percent."))
    return out


_BC_STIFF = {
    "modulus": ("Over-constrained boundary conditions make the cell too stiff: lateral faces "
                "held fixed, rigid plates that prevent the Poisson contraction, or constraints "
                "that tie nodes across the cell; use periodic conditions."),
    "shear": ("Over-constrained boundary conditions make the cell too stiff in shear: faces "
              "held flat or fixed normal displacements where periodic conditions are needed."),
    "poisson": ("Boundary conditions or post-processing: a lateral strain taken from a single "
                "node or a constrained face instead of the face average."),
    "strength": ("Over-constrained boundary conditions raise the apparent strength (lateral "
                 "faces held fixed add confinement); also check the load-carrying area."),
}
_BC_SOFT = {
    "modulus": ("Boundary conditions that leave the cell too free make it too soft: free "
                "faces or edges without periodic constraints, a load on part of a face only, "
                "or fibres not tied to the matrix (debonded interface)."),
    "shear": ("Boundary conditions that leave the cell too free in shear: free edges, no "
              "periodic constraints, or fibres not tied to the matrix."),
    "poisson": ("Boundary conditions: lateral faces held fixed drive the Poisson ratio towards "
                "0; or a lateral strain taken from a single node instead of the face average."),
    "strength": ("A soft or damaged model: free edges, an unbonded interface or damage that "
                 "starts early lower the apparent strength; also check the load-carrying area."),
}


def fraction_for_value(
    value: float, vf: ArrayLike, values: ArrayLike, *, declared: float | None = None
) -> float | None:
    """Solve for the fibre fraction at which an estimate equals a value.

    Parameters
    ----------
    value : float
        The target (the simulated value), SI.
    vf : array_like, shape (n,)
        Increasing fibre fractions.
    values : array_like, shape (n,)
        The estimate at each fraction.
    declared : float, optional
        Declared fraction: of several solutions the nearest to it is returned.

    Returns
    -------
    float or None
        The fraction (linear interpolation between grid points), or None when the estimate
        never reaches the value on the grid.

    Raises
    ------
    InputError
        If ``vf`` and ``values`` differ in shape or have fewer than two points.

    Examples
    --------
    >>> fraction_for_value(2.0, [0.0, 0.5, 1.0], [1.0, 2.0, 3.0])
    0.5
    """
    x = np.asarray(vf, dtype=np.float64).ravel()
    y = np.asarray(values, dtype=np.float64).ravel() - value
    if x.shape != y.shape or x.size < 2:
        raise InputError(
            f"fraction curve: vf and values must be 1-D of equal length >= 2, got {x.size} and "
            f"{y.size}"
        )
    roots = [float(x[i]) for i in np.flatnonzero(y == 0.0)]
    s = np.flatnonzero(np.sign(y[:-1]) * np.sign(y[1:]) < 0)
    roots += list(x[s] - y[s] * (x[s + 1] - x[s]) / (y[s + 1] - y[s]))
    if not roots:
        return None
    ref = 0.5 * (x[0] + x[-1]) if declared is None else declared
    return float(min(roots, key=lambda r: abs(r - ref)))


# ------------------------------------------------------------------------------------------
# consistency checks across properties


@dataclass(frozen=True)
class _Pairs:
    reciprocity: tuple[tuple[str, str, str, str], ...]
    equal: tuple[tuple[str, str], ...]


_UD_PAIRS = _Pairs(
    reciprocity=(("nu12", "E1", "nu21", "E2"), ("nu13", "E1", "nu31", "E3"),
                 ("nu23", "E2", "nu32", "E3")),
    equal=(("E2", "E3"), ("G12", "G13"), ("nu12", "nu13")),
)
_ISOTROPIC_EQUAL = (("E1", "E2"), ("G12", "G23"), ("nu12", "nu23"))
_STACK_PAIRS = _Pairs(
    reciprocity=(("nuxy", "Ex", "nuyx", "Ey"), ("nuxz", "Ex", "nuzx", "Ez"),
                 ("nuyz", "Ey", "nuzy", "Ez")),
    equal=(("Ex", "Ey"), ("Gxz", "Gyz"), ("nuxz", "nuyz"), ("nuzx", "nuzy"),
           ("yield_strength_x", "yield_strength_y"),
           ("ultimate_strength_x", "ultimate_strength_y")),
)


def consistency_reasons(
    values: Mapping[str, float],
    *,
    stack: bool = False,
    symmetric: bool = True,
    arrangement: str = "random",
    isotropic: bool = False,
) -> dict[str, list[str]]:
    """Consistency checks across the simulated properties; each failure makes them suspect.

    Checks: reciprocity nu_ij / E_i = nu_ji / E_j (the stiffness is symmetric); the moduli a
    symmetric cell must have equal (E2 = E3, G12 = G13 for aligned fibres in a hexagonal,
    square or random arrangement; also E1 = E2, G12 = G23, nu12 = nu23 for spheres in a random
    or square arrangement, isotropic or cubic; Ex = Ey, Gxz = Gyz and the x and y strengths for
    a balanced cross-ply). The limit-analysis checks of strengths are bounds in
    :func:`~micromech.rve.verdicts.grade_property` with ``bounds_rigorous=False``.

    Parameters
    ----------
    values : Mapping of str to float
        Simulated properties by name, SI.
    stack : bool
        Names in stack axes (Ex ...) instead of material axes (E1 ...).
    symmetric : bool
        Whether the cell's symmetry makes the pairs equal (a balanced cross-ply; aligned
        fibres).
    arrangement : str
        Fibre arrangement; a random cell may differ a little more between the pairs.
    isotropic : bool
        Spheres (material axes): the three axes are alike, as in an isotropic or cubic cell.

    Returns
    -------
    dict of str to list of str
        Property name -> reasons (only properties that fail a check).

    References
    ----------
    Reciprocity follows from the symmetry of the compliance matrix (any elasticity text, e.g.
    Jones (1999), *Mechanics of Composite Materials*, 2nd ed., Eq. 2.47, from memory).
    """
    out: dict[str, list[str]] = {}
    pairs = _STACK_PAIRS if stack else _UD_PAIRS

    def add(name: str, text: str) -> None:
        out.setdefault(name, []).append(text)

    for nij, ei, nji, ej in pairs.reciprocity:
        if all(k in values for k in (nij, ei, nji, ej)):
            a, b = values[nij] / values[ei], values[nji] / values[ej]
            scale = max(abs(a), abs(b))
            if scale > 0 and abs(a - b) / scale > RECIPROCITY_TOLERANCE:
                text = (
                    f"Reciprocity fails: {nij}/{ei} = {a:.4g} 1/Pa but {nji}/{ej} = {b:.4g} 1/Pa "
                    f"({100 * abs(a - b) / scale:.1f} % apart, more than "
                    f"{100 * RECIPROCITY_TOLERANCE:.0f} %); the compliance of any elastic cell "
                    "is symmetric, so a strain or modulus of one of the two load cases is "
                    "wrong (units, gauge length, or lateral strains taken at a point)."
                )
                add(nij, text)
                add(nji, text)
    if symmetric:
        tol = SYMMETRY_TOLERANCE.get(arrangement, 0.10)
        why = ("a balanced cross-ply is the same after a 90 degree turn about z"
               if stack else "aligned fibres make the cell transversely isotropic (or square-"
               "symmetric) about the fibre axis")
        equal = pairs.equal
        if isotropic and not stack:
            why = "spheres make the three axes of the cell alike (isotropic or cubic)"
            equal = (*equal, *_ISOTROPIC_EQUAL)
        for p, q in equal:
            if p in values and q in values:
                vp, vq = values[p], values[q]
                mean = 0.5 * (abs(vp) + abs(vq))
                t = STRENGTH_SYMMETRY_TOLERANCE if "strength" in p else tol
                if mean > 0 and abs(vp - vq) / mean > t:
                    text = (
                        f"{p} = {format_property(vp, p)} and {q} = {format_property(vq, q)} "
                        "differ by "
                        f"{100 * abs(vp - vq) / mean:.1f} % (more than {100 * t:.0f} %) though "
                        f"{why}; check the load cases, sizes and boundary conditions of both."
                    )
                    add(p, text)
                    add(q, text)
    return out
