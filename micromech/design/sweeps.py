"""Sweeps: a property over fibre fraction, fibre angle or ply share, for every model at once.

All sweeps are vectorised: the sweep variable is the last axis and the constituent constants may
be arrays of shape (...) (several fibres or matrices at once), giving values of shape (..., m).
A :class:`Sweep` holds the variable, the values per model and the bound band (pointwise smaller
and larger of the lower- and upper-bound values).

* :func:`sweep_fraction`: any design property (ply constants, density, specific properties,
  laminate constants with a layup) over the fibre volume fraction.
* :func:`sweep_angle`: laminate constants ``Ex Ey Gxy nuxy`` over the fibre angle, of a single
  off-axis ply (``family="off_axis"``) or of a balanced symmetric angle-ply laminate
  ``[+theta/-theta]s`` (``family="angle_ply"``), with plies estimated at one fibre fraction.
* :func:`sweep_ply_share`: in-plane ``Ex Ey Gxy nuxy`` of a symmetric 0/90 laminate over the
  share of 0-degree plies p: A/h = p Q(0) + (1 - p) Q(90).

For angle and ply-share sweeps the "bounds" are laminates whose plies have the bound constants;
they are a band for orientation, not rigorous bounds on the laminate.

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Eqs.
   (2.103)-(2.104) (off-axis ply stiffness) and Sec. 4.5 (laminate engineering constants).
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Sec. 2.6 (off-axis ply) and Sec. 4.3 (cross-ply and angle-ply laminates).
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.design.forward import (
    BOUND_MODELS,
    Constituents,
    bound_models,
    chosen_models,
    estimate_at,
    forward_model,
    fraction_of,
    has_bounds,
    laminate_in_plane,
)
from micromech.design.inverse import property_values
from micromech.design.sizing import as_constituents
from micromech.design.targets import property_kind, property_unit
from micromech.errors import InputError
from micromech.safety import CAUTION

__all__ = ["Sweep", "sweep", "sweep_fraction", "sweep_angle", "sweep_ply_share",
           "LAMINATE_NAMES"]

Array = NDArray[np.float64]
#: Properties an angle or ply-share sweep gives.
LAMINATE_NAMES: tuple[str, ...] = ("Ex", "Ey", "Gxy", "nuxy")


@dataclass(frozen=True, eq=False)
class Sweep:
    """A property swept over one variable, per model, with the bound band.

    Attributes
    ----------
    variable : str
        ``"volume_fraction"``, ``"angle"`` (degrees) or ``"ply_share"``.
    x : ndarray, shape (m,)
        The sweep values.
    name : str
        Property name (or ratio ``A/B``).
    values : dict of str to ndarray, shape (..., m)
        Per model (leading axes: several constituents).
    lower, upper : ndarray, shape (..., m), or None
        Bound band (pointwise min and max of the two bound results), SI.
    fixed : dict
        The other design variables (e.g. the fibre fraction of an angle sweep, the layup).
    caution : str
        Estimates and bounds are not design allowables.
    """

    variable: str
    x: Array
    name: str
    values: dict[str, Array]
    lower: Array | None = None
    upper: Array | None = None
    fixed: dict[str, Any] = field(default_factory=dict)
    caution: str = CAUTION

    @property
    def unit(self) -> tuple[str, float]:
        """Display unit of the property and the SI amount of one display unit."""
        return property_unit(self.name)

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI; nested lists for several constituents).

        Returns
        -------
        dict
            Keys variable, x, property, values, lower, upper, fixed, caution.
        """
        return {
            "variable": self.variable, "x": self.x.tolist(), "property": self.name,
            "values": {k: v.tolist() for k, v in self.values.items()},
            "lower": None if self.lower is None else self.lower.tolist(),
            "upper": None if self.upper is None else self.upper.tolist(),
            "fixed": dict(self.fixed), "caution": self.caution,
        }


def sweep(
    models: Mapping[str, Callable[[Array], Any]],
    x: ArrayLike,
    prop: str,
    *,
    bounds: tuple[Callable[[Array], Any], Callable[[Array], Any]] | None = None,
    variable: str = "volume_fraction",
    fixed: Mapping[str, Any] | None = None,
) -> Sweep:
    """Evaluate a property of several forward models over a sweep variable.

    Parameters
    ----------
    models : mapping of str to callable
        Model key -> ``model(x)`` returning a mapping (or ElasticConstants) of property arrays
        whose last axis is x's (shape (..., m)). Models that do not give the property are left
        out.
    x : array_like, shape (m,)
        Sweep values.
    prop : str
        Property name or ratio ``A/B``.
    bounds : tuple of (callable, callable), optional
        Lower and upper bound models of the same form.
    variable : str
        Name of the swept variable.
    fixed : mapping, optional
        The other design variables, kept in the result.

    Returns
    -------
    Sweep
        Values per model and the bound band.

    Raises
    ------
    InputError
        If x is not a non-empty 1-d array, or no model gives the property.
    """
    xa = np.asarray(x, dtype=np.float64)
    if xa.ndim != 1 or xa.size == 0:
        raise InputError(f"sweep values: expected a non-empty 1-d array, got shape {xa.shape}")
    property_kind(prop)
    vals: dict[str, Array] = {}
    for k, m in models.items():
        r = m(xa)
        v = property_values(r, prop)
        if v is not None:
            vals[k] = np.asarray(v, dtype=np.float64)
    lo = hi = None
    if bounds is not None:
        a = property_values(bounds[0](xa), prop)
        b = property_values(bounds[1](xa), prop)
        if a is not None and b is not None:
            lo, hi = np.minimum(a, b), np.maximum(a, b)
    if not vals and lo is None:
        raise InputError(f"sweep: no model gives {prop!r} (models: {', '.join(models) or 'none'})")
    shape = np.broadcast_shapes(*(v.shape for v in vals.values()),
                                *(() if lo is None else (lo.shape,)), xa.shape)
    vals = {k: np.broadcast_to(v, shape).copy() for k, v in vals.items()}
    if lo is not None and hi is not None:
        lo, hi = np.broadcast_to(lo, shape).copy(), np.broadcast_to(hi, shape).copy()
    return Sweep(variable=variable, x=xa, name=prop, values=vals, lower=lo, upper=hi,
                 fixed=dict(fixed or {}))


def _design(design: Any, layup: str | None = None, ply_thickness: float | None = None,
            **overrides: Any) -> Constituents:
    """Return the design's constituents with the phases or densities given (not None) replaced."""
    from dataclasses import replace

    c = as_constituents(design, layup=layup, ply_thickness=ply_thickness)
    over = {k: v for k, v in overrides.items() if v is not None}
    return replace(c, **over) if over else c


def sweep_fraction(
    design: Any,
    prop: str,
    fractions: ArrayLike | None = None,
    *,
    models: Sequence[str] | None = None,
    bounds: bool = True,
    fibre: Any = None,
    matrix: Any = None,
    fibre_density: ArrayLike | None = None,
    matrix_density: ArrayLike | None = None,
    layup: str | None = None,
    ply_thickness: float | None = None,
    points: int = 101,
) -> Sweep:
    """Sweep a design property over the fibre volume fraction, for every model and the bounds.

    Parameters
    ----------
    design : Composite, Case or Constituents
        Inclusion, arrangement (packing limit), voids and constituents.
    prop : str
        Property name or ratio (``"E2"``, ``"density"``, ``"E1/density"``, ``"Ex"`` with a
        layup).
    fractions : array_like, shape (m,), optional
        Fibre fractions (default: ``points`` values from 0 to the packing limit).
    models : sequence of str, optional
        Estimate keys (default: all that apply).
    bounds : bool
        Add the bound band.
    fibre, matrix : FibrePhase, MatrixPhase or material, optional
        Replace the constituents; phase arrays of shape (...) sweep several at once.
    fibre_density, matrix_density : array_like, shape (...), optional
        Replace the densities, kg/m^3.
    layup : str, optional
        Laminate code for laminate properties.
    ply_thickness : float, optional
        Ply thickness, m.
    points : int
        Number of default fractions.

    Returns
    -------
    Sweep
        Values of shape (..., m).

    Raises
    ------
    InputError
        For an unknown or inapplicable model or property (see :func:`sweep`).

    References
    ----------
    The estimators in :mod:`micromech.homogenize` name their sources.

    Examples
    --------
    >>> from micromech.materials import Composite, Isotropic
    >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.5)
    >>> s = sweep_fraction(c, "E1", [0.0, 1.0 / 2], models=["rule_of_mixtures"])
    >>> [round(float(v) / 1e9, 2) for v in s.values["rule_of_mixtures"]]
    [3.5, 37.75]
    """
    c = _design(design, layup, ply_thickness, fibre=fibre, matrix=matrix,
                fibre_density=fibre_density, matrix_density=matrix_density)
    x = (np.linspace(0.0, c.upper_fraction, points) if fractions is None
         else np.asarray(fractions, dtype=np.float64))
    ce = c.expanded()
    fwd = {k: forward_model(ce, k) for k in chosen_models(c, models)}
    bnd = bound_models(ce) if bounds else None
    return sweep(fwd, x, prop, bounds=bnd, variable="volume_fraction",
                 fixed={"layup": c.layup or None, "inclusion": c.inclusion})


def _ply_sweep(
    prop: str,
    x: Array,
    variable: str,
    c: Constituents,
    vf: float,
    models: Sequence[str] | None,
    bounds: bool,
    fn: Callable[[Any], dict[str, Array]],
    fixed: dict[str, Any],
) -> Sweep:
    """Sweep of ``fn(ply constants)``: laminate constants over x, plies estimated at ``vf``."""
    ce = c.expanded()
    v = np.asarray(vf, dtype=np.float64)

    def laminate_of(model: str) -> Callable[[Array], dict[str, Array]]:
        values = fn(estimate_at(ce, model, v))
        return lambda _x: values

    fwd = {k: laminate_of(k) for k in chosen_models(c, models)}
    bnd = (laminate_of(BOUND_MODELS[0]), laminate_of(BOUND_MODELS[1])) \
        if bounds and has_bounds(c) else None
    return sweep(fwd, x, prop, bounds=bnd, variable=variable, fixed=fixed)


def _check_prop(prop: str, variable: str) -> None:
    if prop not in LAMINATE_NAMES:
        raise InputError(f"property {prop!r}: an {variable} sweep gives "
                         f"{', '.join(LAMINATE_NAMES)}")


def sweep_angle(
    design: Any,
    prop: str = "Ex",
    angles: ArrayLike | None = None,
    *,
    family: Literal["off_axis", "angle_ply"] = "off_axis",
    volume_fraction: float | None = None,
    models: Sequence[str] | None = None,
    bounds: bool = True,
    fibre: Any = None,
    matrix: Any = None,
) -> Sweep:
    """Sweep in-plane constants over the fibre angle: one off-axis ply or an angle-ply laminate.

    Parameters
    ----------
    design : Composite, Case or Constituents
        The composite whose plies are estimated.
    prop : {"Ex", "Ey", "Gxy", "nuxy"}
        The in-plane constant.
    angles : array_like, shape (m,), optional
        Fibre angles, degrees (default 0 to 90 in 1-degree steps).
    family : {"off_axis", "angle_ply"}
        A single ply at the angle, or the laminate ``[+theta/-theta]s``.
    volume_fraction : float, optional
        Fibre fraction of the plies (default: the composite's).
    models : sequence of str, optional
        Estimate keys (default: all that apply).
    bounds : bool
        Add the band of plies with the bound constants.
    fibre, matrix : FibrePhase, MatrixPhase or material, optional
        Replace the constituents (arrays: several at once).

    Returns
    -------
    Sweep
        Values of shape (..., m).

    Raises
    ------
    InputError
        For an unknown family or property, or a fraction above the packing limit.

    References
    ----------
    Kaw (2006), Eqs. (2.103)-(2.104) and Sec. 4.5; Jones (1999), Sec. 2.6 and 4.3.
    """
    if family not in ("off_axis", "angle_ply"):
        raise InputError(f"family: expected 'off_axis' or 'angle_ply', got {family!r}")
    _check_prop(prop, "angle")
    c = _design(design, fibre=fibre, matrix=matrix)
    vf = fraction_of(c, design, volume_fraction, "the fibre fraction of the plies")
    x = np.arange(0.0, 91.0) if angles is None else np.asarray(angles, dtype=np.float64)
    lay = x[:, None] if family == "off_axis" else np.stack([x, -x, -x, x], -1)

    def fn(k: Any) -> dict[str, Array]:
        return laminate_in_plane(k.E1, k.E2, k.nu12, k.G12, lay)

    return _ply_sweep(prop, x, "angle", c, vf, models, bounds, fn,
                      {"family": family, "volume_fraction": vf})


def _cross_ply(k: Any, p: Array) -> dict[str, Array]:
    """In-plane constants of a symmetric 0/90 laminate with a share p of 0-degree plies."""
    from micromech.laminate.plane import reduced_stiffness, transformed_reduced_stiffness

    Q0 = reduced_stiffness(k.E1, k.E2, k.nu12, k.G12)
    Q90 = transformed_reduced_stiffness(Q0, 90.0)
    A11 = p * Q0[..., 0, 0] + (1.0 - p) * Q90[..., 0, 0]
    A22 = p * Q0[..., 1, 1] + (1.0 - p) * Q90[..., 1, 1]
    A12 = p * Q0[..., 0, 1] + (1.0 - p) * Q90[..., 0, 1]
    A66 = p * Q0[..., 2, 2] + (1.0 - p) * Q90[..., 2, 2]
    det = A11 * A22 - A12 * A12
    return {"Ex": det / A22, "Ey": det / A11, "Gxy": A66, "nuxy": A12 / A22}


def sweep_ply_share(
    design: Any,
    prop: str = "Ex",
    shares: ArrayLike | None = None,
    *,
    volume_fraction: float | None = None,
    models: Sequence[str] | None = None,
    bounds: bool = True,
    fibre: Any = None,
    matrix: Any = None,
) -> Sweep:
    """Sweep in-plane constants of a symmetric 0/90 laminate over the share of 0-degree plies.

    Parameters
    ----------
    design : Composite, Case or Constituents
        The composite whose plies are estimated.
    prop : {"Ex", "Ey", "Gxy", "nuxy"}
        The in-plane constant.
    shares : array_like, shape (m,), optional
        Share of 0-degree plies, in [0, 1] (default 0 to 1 in steps of 0.02).
    volume_fraction : float, optional
        Fibre fraction of the plies (default: the composite's).
    models : sequence of str, optional
        Estimate keys (default: all that apply).
    bounds : bool
        Add the band of plies with the bound constants.
    fibre, matrix : FibrePhase, MatrixPhase or material, optional
        Replace the constituents (arrays: several at once).

    Returns
    -------
    Sweep
        Values of shape (..., m): A/h = p Q(0) + (1 - p) Q(90), B = 0;
        Ex = (A11 A22 - A12^2) / (h A22), Ey = (A11 A22 - A12^2) / (h A11), Gxy = A66 / h,
        nuxy = A12 / A22.

    Raises
    ------
    InputError
        For shares outside [0, 1] or an unknown property.

    References
    ----------
    Kaw (2006), Sec. 4.5; Jones (1999), Sec. 4.3.2 (cross-ply laminates).
    """
    _check_prop(prop, "ply_share")
    c = _design(design, fibre=fibre, matrix=matrix)
    vf = fraction_of(c, design, volume_fraction, "the fibre fraction of the plies")
    x = np.linspace(0.0, 1.0, 51) if shares is None else np.asarray(shares, dtype=np.float64)
    if np.any((x < 0.0) | (x > 1.0)):
        raise InputError(f"shares: {float(x[(x < 0) | (x > 1)][0])!r} is outside [0, 1]")
    return _ply_sweep(prop, x, "ply_share", c, vf, models, bounds, lambda k: _cross_ply(k, x),
                      {"volume_fraction": vf, "family": "0/90"})
