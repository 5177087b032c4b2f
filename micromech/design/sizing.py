"""Size the fibre fraction of a composite (or a case) for property targets.

This ties the generic solver of :mod:`micromech.design.inverse` to the estimates of
:mod:`micromech.homogenize` through :mod:`micromech.design.forward`: every applicable estimate
(rule of mixtures, Halpin-Tsai, Chamis, composite cylinders, Mori-Tanaka) and the
Hashin-Shtrikman type bounds are evaluated as vectorised functions of the fibre fraction on
``[0, packing limit]``.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from micromech.design.forward import (
    Constituents,
    bound_models,
    chosen_models,
    forward_model,
    mass_at,
)
from micromech.design.inverse import SizingResult, size_models
from micromech.design.roots import DEFAULT_POINTS
from micromech.design.targets import SizingTarget
from micromech.errors import InputError

__all__ = ["size_fraction", "as_constituents"]


def as_constituents(
    design: Any, *, layup: str | None = None, ply_thickness: float | None = None
) -> Constituents:
    """Turn a Composite, a loaded case or Constituents into :class:`Constituents`.

    Parameters
    ----------
    design : Composite, Case or Constituents
        What to size. A case contributes its [laminate] layup.
    layup : str, optional
        Laminate code overriding the case's (needed for Ex, Ey, Gxy, nuxy).
    ply_thickness : float, optional
        Ply thickness, m.

    Returns
    -------
    Constituents
        The design description.

    Raises
    ------
    InputError
        If ``design`` is none of the three.
    """
    if isinstance(design, Constituents):
        if layup is None:
            return design
        from dataclasses import replace

        from micromech.laminate.layup import parse_layup

        return replace(design, angles=parse_layup(layup), layup=layup)
    if hasattr(design, "composite") and hasattr(design, "laminate"):
        c = Constituents.from_case(design)
        return as_constituents(c, layup=layup) if layup else c
    if hasattr(design, "fibre") and hasattr(design, "packing_limit"):
        return Constituents.from_composite(design, layup=layup, ply_thickness=ply_thickness)
    raise InputError(f"design: expected a Composite, a case or Constituents, got "
                     f"{type(design).__name__}")


def size_fraction(
    design: Any,
    targets: Sequence[SizingTarget | str] | SizingTarget | str,
    *,
    models: Sequence[str] | None = None,
    bounds: bool = True,
    layup: str | None = None,
    ply_thickness: float | None = None,
    points: int = DEFAULT_POINTS,
) -> SizingResult:
    """Fibre volume fractions at which a composite meets property targets, per model and bounds.

    Parameters
    ----------
    design : Composite, Case or Constituents
        The fibre, matrix, inclusion, arrangement (packing limit), voids and densities; a case
        also gives its layup.
    targets : SizingTarget, str or a sequence of them
        E.g. ``"E2=9GPa"``, ``"E1>=120GPa"``, ``"density<=1.6 g/cm^3"``, ``"Ex=50GPa"`` (needs a
        layup), ``"E1/density>=40 GPa/(g/cm^3)"``.
    models : sequence of str, optional
        Estimate keys (default: every estimate that applies to the inclusion shape).
    bounds : bool
        Also solve with the Hashin-Shtrikman type lower and upper bounds.
    layup : str, optional
        Laminate code for laminate targets (overrides a case's).
    ply_thickness : float, optional
        Ply thickness, m.
    points : int
        Grid points of the scan before each bracketed root search.

    Returns
    -------
    SizingResult
        Per target: the fraction per model, the interval over the models, the interval the bounds
        admit, a status and a sentence; and the window meeting all targets, with weight fraction
        and density alongside. An unreachable target is an answer, not an error.

    Raises
    ------
    InputError
        For an unknown or inapplicable model, constituent arrays (size one design at a time),
        a laminate target without a layup or a mass target without densities.

    References
    ----------
    .. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Ch. 4.
    .. [2] Hill, R. (1964). *J. Mech. Phys. Solids* 12, 199-212; Hashin, Z. (1965). *J. Mech.
       Phys. Solids* 13, 119-134 (the fibre bounds).

    Examples
    --------
    >>> from micromech.materials import Composite, Isotropic
    >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.5)
    >>> r = size_fraction(c, "E1=40GPa", models=["rule_of_mixtures"], bounds=False)
    >>> round(r["E1"].models["rule_of_mixtures"].fraction, 4)
    0.5328
    """
    c = as_constituents(design, layup=layup, ply_thickness=ply_thickness)
    if c.shape != ():
        raise InputError(f"size_fraction: constituents of shape {c.shape}; size one fibre and "
                         "matrix at a time (use the sweeps for several)")
    tlist = [targets] if isinstance(targets, SizingTarget | str) else list(targets)
    tg = [t if isinstance(t, SizingTarget) else SizingTarget.parse(t) for t in tlist]
    for t in tg:
        if t.is_laminate and not c.angles:
            raise InputError(f"target {t.name} needs a layup: add [laminate] layup to the case "
                             "or pass layup=")
        if any(p in ("density", "weight_fraction") for p in t.parts) and not c.has_density:
            raise InputError(f"target {t.name} needs the densities of the fibre and the matrix")
    fwd = {k: forward_model(c, k) for k in chosen_models(c, models)}
    bnd = bound_models(c) if bounds else None

    def mass(v: Any) -> dict[str, Any]:
        return mass_at(c, v)

    return size_models(tg, fwd, bounds=bnd, mass=mass if c.has_density else None,
                       lower=0.0, upper=c.upper_fraction, points=points,
                       upper_label="the packing limit")
