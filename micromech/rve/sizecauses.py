"""Wrong sizes, areas and lengths: the geometry of an RVE load case as a cause of a bad value.

A simulated modulus, shear modulus, Poisson ratio or strength is read from a history with the
declared cell size: the loaded area and the gauge length of each load case. This module finds
the factors by which a wrong face or edge, two swapped [rve].size entries or the other shear
convention would scale a value (:func:`_geometry_factors`, used by
:func:`~micromech.rve.causes.likely_causes`), states how a shear load case is read
(:func:`shear_convention`), and tests whether the three normal load cases together point to one
wrong cell size (:func:`fit_size_error`, :func:`size_error_reason`).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from itertools import product
from typing import TYPE_CHECKING

from micromech.units import format_si

if TYPE_CHECKING:
    from micromech.rve.causes import Diagnosis

__all__ = [
    "fit_size_error",
    "shear_convention",
    "size_error_reason",
]

_AXES = ("x", "y", "z")


def _positive(x: float) -> bool:
    """Whether x is a finite positive number (its logarithm exists)."""
    return math.isfinite(x) and x > 0.0


_FACE = {"x": ("y", "z"), "y": ("x", "z"), "z": ("x", "y")}
_PAIRS = (("x", "y"), ("x", "z"), ("y", "z"))


def _load_geometry(d: str, L: Mapping[str, float]) -> tuple[float, float]:
    """Return (loaded area, gauge length) of load case d as micromech reads it."""
    if len(d) == 1:
        a, b = _FACE[d]
        return L[a] * L[b], L[d]
    i, j = d[0], d[1]  # shear ij: force along i on the face normal to j, gauge length L_j
    k = next(a for a in _AXES if a not in d)
    return L[i] * L[k], L[j]


def shear_convention(direction: str) -> str:
    """Sentence stating how micromech reads a shear load case.

    Parameters
    ----------
    direction : str
        Shear load case ``"xy"``, ``"xz"`` or ``"yz"``.

    Returns
    -------
    str
        E.g. "The xy load case is read as force along x on the face normal to y (shear
        stress = force / (Lx Lz)) and engineering shear strain = displacement along x / Ly."
    """
    i, j = direction[0], direction[1]
    k = next(a for a in _AXES if a not in direction)
    return (f"The {direction} load case is read as force along {i} on the face normal to {j} "
            f"(shear stress = force / (L{i} L{k})) and engineering shear strain = displacement "
            f"along {i} / L{j}.")


def _geometry_factors(kind: str, ctx: Diagnosis) -> list[tuple[float, str]]:
    """(factor by which the value is too large, what went wrong) for swapped faces/edges.

    Both directions are tried: micromech reading the history with another face or edge than
    the one the model used (the factor f), and the history made with another face or edge
    than the one micromech reads (1 / f); also the other shear convention and [rve].size with
    two entries swapped. Factors within 1 % of 1 are left out.
    """
    assert ctx.size is not None and ctx.direction is not None
    L = dict(zip(_AXES, ctx.size, strict=True))
    d = ctx.direction
    out: list[tuple[float, str]] = []

    def add(f: float, text: str) -> None:
        if _positive(f) and abs(math.log(f)) > 0.01:
            out.append((f, text))

    def swapped(a: str, b: str) -> dict[str, float]:
        return {**L, a: L[b], b: L[a]}

    def swap_text(a: str, b: str) -> str:
        return (f"[rve].size with the {a} and {b} entries swapped (declared {a} = "
                f"{format_si(L[a], 'length')}, {b} = {format_si(L[b], 'length')})")

    if kind == "poisson":
        if ctx.lateral is None or len(d) != 1:
            return []
        lat = ctx.lateral
        for a, b in _PAIRS:
            if L[a] != L[b]:
                S = swapped(a, b)
                # nu = (u_lat / L_lat) / (u_ax / L_ax), read with the declared edges
                add((S[lat] * L[d]) / (L[lat] * S[d]), swap_text(a, b))
        for ax_used, lat_used in product(_AXES, _AXES):
            if (ax_used, lat_used) == (d, lat):
                continue
            f = (L[lat] * L[ax_used]) / (L[lat_used] * L[d])
            add(f, (f"the lateral strain taken over the {lat_used} edge and the axial "
                    f"strain over the {ax_used} edge"))
            add(1.0 / f, (f"displacements in the history that belong to other edges (the "
                          f"lateral one to the {lat_used} edge, the axial one to the {ax_used} "
                          f"edge) than the {lat} and {d} edges micromech divides them by"))
        return out
    area, gauge = _load_geometry(d, L)
    strength = kind == "strength"
    if len(d) == 2:
        i, j = d[0], d[1]
        k = next(a for a in _AXES if a not in d)
        # the other convention: force along j on the face normal to i, displacement along j
        # over L_i
        f = (L[j] / L[i]) if strength else (L[j] / L[i]) ** 2
        add(f, (f"the history written in the other shear convention (force along {j} on the "
                f"face normal to {i}, area L{j} L{k}"
                + ("" if strength else f"; displacement along {j} over L{i}") + ")"))
    for a, b in _PAIRS:
        if L[a] != L[b]:
            a_s, g_s = _load_geometry(d, swapped(a, b))
            add((a_s / area) if strength else (a_s * gauge) / (area * g_s), swap_text(a, b))
    if len(d) == 1:
        face_true, len_true = d, d
    else:  # shear ij: force along i on the face normal to j, gauge length L_j
        face_true, len_true = d[1], d[1]

    def face_area(face: str) -> float:
        a, b = _FACE[face]
        return L[a] * L[b]

    lengths = (_AXES if not strength else (len_true,))
    reverse: list[tuple[float, str]] = []
    for face_used, len_used in product(_AXES, lengths):
        if (face_used, len_used) == (face_true, len_true):
            continue
        f = (face_area(face_true) * L[len_used]) / (face_area(face_used) * L[len_true])
        parts = []
        if face_used != face_true:
            parts.append(f"the stress computed with the area of the {face_used} face instead of "
                         f"the {face_true} face")
        if len_used != len_true:
            parts.append(f"the strain computed over the {len_used} edge instead of the "
                         f"{len_true} edge")
        add(f, " and ".join(parts))
        if len(d) == 2 and face_used == len_used == d[0]:
            continue  # the other shear convention, named above
        made = [f"force on the {face_used} face"]
        if not strength:
            made.append(f"displacement over the {len_used} edge")
        read = f"the {face_true} face" + ("" if strength else f" and the {len_true} edge")
        reverse.append((1.0 / f, (f"the history made with {' and '.join(made)}, while "
                                  f"micromech reads the {d} load case with {read}")))
    for f, text in reverse:  # after the direct ones: a shared factor names those first
        add(f, text)
    return out


def fit_size_error(
    ratios: Mapping[str, float], size: Sequence[float], *, tolerance: float = 0.1
) -> tuple[str, float] | None:
    """Test whether the moduli of the x, y, z load cases point to one wrong cell size.

    A size entry off by a factor s (true = s * declared) scales the modulus of its own axis
    by 1/s and those of the two other axes by s (the load-carrying area of those cases
    contains it). Unit slips of a power of 1000 are removed from the ratios first.

    Parameters
    ----------
    ratios : Mapping of str to float
        For ``"x"``, ``"y"``, ``"z"``: simulated modulus / best estimate (all three needed).
    size : sequence of 3 float
        Declared edge lengths (x, y, z), m.
    tolerance : float
        Largest relative misfit of each ratio to the one-size pattern.

    Returns
    -------
    (str, float) or None
        The axis and the factor s (true size = s * declared), or None when no single wrong
        size explains the ratios or the factor is within ``tolerance`` of 1.

    Examples
    --------
    >>> fit_size_error({"x": 1.5, "y": 1 / 1.5, "z": 1.5}, (1e-4, 1e-4, 1e-4))
    ('y', 1.5)
    """
    if not all(a in ratios for a in _AXES):
        return None
    logs = {}
    for a in _AXES:
        r = float(ratios[a])
        if not (math.isfinite(r) and r > 0):
            return None
        k = round(math.log(r) / math.log(1000.0))
        logs[a] = math.log(r) - k * math.log(1000.0)
    best: tuple[float, str, float] | None = None
    for axis in _AXES:
        # pattern: log r_axis = -t, log r_other = +t; least squares t
        t = (-logs[axis] + sum(logs[o] for o in _AXES if o != axis)) / 3.0
        misfit = max(abs(logs[o] - (-t if o == axis else t)) for o in _AXES)
        if best is None or misfit < best[0]:
            best = (misfit, axis, t)
    assert best is not None
    misfit, axis, t = best
    if misfit > math.log(1.0 + tolerance) or abs(t) < math.log(1.0 + tolerance):
        return None
    return axis, float(round(math.exp(t), 6))


def size_error_reason(axis: str, factor: float, size: Sequence[float]) -> str:
    """Sentence for a wrong cell size found by :func:`fit_size_error`.

    Parameters
    ----------
    axis : str
        The axis whose size looks wrong.
    factor : float
        True size / declared size.
    size : sequence of 3 float
        Declared sizes, m.

    Returns
    -------
    str
        The sentence.
    """
    declared = float(size[_AXES.index(axis)])
    return (
        f"A wrong cell size: the moduli of the x, y and z load cases together fit a cell whose "
        f"{axis} edge is {factor:.3g} times the declared {format_si(declared, 'length')} "
        f"(about {format_si(declared * factor, 'length')}); check size.{axis} in [rve] (it sets "
        f"the loaded area of two load cases and the gauge length of the third)."
    )
