"""Inverse sizing: the fibre fractions at which properties reach their targets.

Each forward model is a vectorised callable of the fibre volume fraction, ``model(vf)``, returning
a mapping (or an :class:`~micromech.results.ElasticConstants`) of property arrays of the shape of
``vf``. For each target and model the fractions in ``[lower, upper]`` (0 and the packing limit)
where the property equals the target are found by a grid scan and Brent's method (see
:mod:`micromech.design.roots`), so non-monotonic properties (``nu12``, CTEs) give all their
crossings. A target that is not met anywhere below the packing limit is an answer (status
``"not_reachable"`` and a sentence), not an error.

The rigorous bounds (Hashin-Shtrikman lower and upper) give the fractions at which *some*
microstructure between them can have the target value: ``lower(vf) <= T <= upper(vf)`` for an
equality, ``upper(vf) >= T`` for a minimum, ``lower(vf) <= T`` for a maximum; and, for an
inequality, the fractions at which *every* such microstructure meets it (``lower(vf) >= T`` or
``upper(vf) <= T``). The band is taken pointwise as the smaller and larger of the two bound
values, so a property the bounds do not order (such as ``nu12``) still gives a band.

Several targets give the window of fractions meeting all of them: per model, under every model
at once (the common window), and admitted by the bounds.

References
----------
.. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Prentice-Hall,
   Ch. 4 (bracketed root finding).
.. [2] Hashin, Z. (1979). Analysis of properties of fiber composites with anisotropic
   constituents. *Journal of Applied Mechanics* 46(3), 543-550 (bounds on fibre composites).
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.design.roots import (
    DEFAULT_POINTS,
    IntervalSet,
    Relation,
    evaluate,
    intersect,
    intersect_all,
    satisfying_set,
)
from micromech.design.targets import SizingTarget, format_value
from micromech.errors import InputError
from micromech.safety import CAUTION

__all__ = [
    "ForwardModel",
    "FractionPoint",
    "FractionInterval",
    "FractionSolution",
    "BoundsSolution",
    "TargetSizing",
    "SizingResult",
    "property_values",
    "solve_fraction",
    "size_models",
]

Array = NDArray[np.float64]
#: A forward model: fractions (n,) -> mapping (or object with ``.get``) of property arrays (n,).
ForwardModel = Callable[[Array], Any]
MassModel = Callable[[Array], Any]

ModelStatus = Literal["reached", "always_met", "not_reachable"]


def _get(result: Any, name: str) -> Array | None:
    if isinstance(result, Mapping):
        v = result.get(name)
    elif hasattr(result, "get"):
        v = result.get(name)
    else:
        raise InputError(
            f"forward model: returned {type(result).__name__}; expected a mapping of property "
            "arrays or an ElasticConstants"
        )
    return None if v is None else np.asarray(v, dtype=np.float64)


def property_values(result: Any, name: str) -> Array | None:
    """Read a property, or a ratio ``A/B`` of two, from a forward model's result.

    Parameters
    ----------
    result : mapping or ElasticConstants
        Property arrays by name.
    name : str
        Property name or ratio (``"E1/density"``).

    Returns
    -------
    ndarray or None
        The values, or None when the result does not give the property.

    Raises
    ------
    InputError
        If ``result`` is neither a mapping nor has a ``get`` method.
    """
    parts = [p.strip() for p in name.split("/")]
    a = _get(result, parts[0])
    if len(parts) == 1 or a is None:
        return a
    b = _get(result, parts[1])
    return None if b is None else a / b


def _property_function(model: ForwardModel, name: str) -> Callable[[Array], Array]:
    def f(x: Array) -> Array:
        v = property_values(model(x), name)
        if v is None:  # pragma: no cover - availability is checked before solving
            raise InputError(f"forward model gives no {name}")
        return v

    return f


# --- result objects ---------------------------------------------------------------------------


def _span(a: float, b: float) -> str:
    """``"Vf a"`` for a point, ``"Vf a to b"`` for an interval."""
    return f"Vf {_range_text(a, b, lambda x: f'{x:.4g}')}"


def _range_text(a: float, b: float, fmt: Callable[[float], str]) -> str:
    """Return ``"a"`` when both ends print the same (a point), else ``"a to b"``."""
    fa, fb = fmt(a), fmt(b)
    return fa if fa == fb else f"{fa} to {fb}"


@dataclass(frozen=True)
class FractionPoint:
    """A fibre volume fraction with the fibre weight fraction and the density there.

    Attributes
    ----------
    volume_fraction : float
        Fibre volume fraction.
    weight_fraction : float or None
        Fibre weight fraction of the solid (None without densities).
    density : float or None
        Composite (and laminate) density, kg/m^3 (None without densities).
    """

    volume_fraction: float
    weight_fraction: float | None = None
    density: float | None = None

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys volume_fraction, weight_fraction, density.
        """
        return {"volume_fraction": self.volume_fraction, "weight_fraction": self.weight_fraction,
                "density": self.density}


@dataclass(frozen=True)
class FractionInterval:
    """A closed interval of fibre fractions (``low == high`` for a single point).

    Attributes
    ----------
    low, high : FractionPoint
        Its ends, with weight fraction and density.
    """

    low: FractionPoint
    high: FractionPoint

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form: ``[low, high]`` pairs of volume and weight fraction and density.

        Returns
        -------
        dict
            Keys volume_fraction, weight_fraction, density, each a pair or None.
        """
        out: dict[str, Any] = {}
        for k in ("volume_fraction", "weight_fraction", "density"):
            a, b = getattr(self.low, k), getattr(self.high, k)
            out[k] = None if a is None or b is None else [a, b]
        return out

    def describe(self) -> str:
        """Return e.g. ``"Vf 0.52 to 0.6"`` (or ``"Vf 0.52"`` for a point).

        Returns
        -------
        str
            The fraction interval as text.
        """
        return _span(self.low.volume_fraction, self.high.volume_fraction)


@dataclass(frozen=True)
class FractionSolution:
    """Where one model's property meets one target, on ``[lower, upper]``.

    Attributes
    ----------
    model : str
        Model key.
    target : SizingTarget
        The target.
    status : {"reached", "always_met", "not_reachable"}
        ``reached``: the property crosses the target value; ``always_met``: an inequality that
        holds on the whole range (no crossing); ``not_reachable``: not met anywhere in the range.
    crossings : tuple of FractionPoint
        Fractions where the property equals the target value, ascending.
    intervals : tuple of FractionInterval
        Fractions meeting the target (points for an equality).
    value_range : tuple of (float, float)
        Smallest and largest value of the property on the scan grid, SI.
    lower, upper : float
        The fraction range searched.
    message : str
        One sentence.
    """

    model: str
    target: SizingTarget
    status: ModelStatus
    crossings: tuple[FractionPoint, ...]
    intervals: tuple[FractionInterval, ...]
    value_range: tuple[float, float]
    lower: float
    upper: float
    message: str

    @property
    def fraction(self) -> float | None:
        """The smallest crossing (the fraction at which the target is reached), or None."""
        return self.crossings[0].volume_fraction if self.crossings else None

    @property
    def fractions(self) -> tuple[float, ...]:
        """All crossings, ascending."""
        return tuple(p.volume_fraction for p in self.crossings)

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys model, status, fraction, crossings, intervals, value_range, message.
        """
        return {
            "model": self.model, "status": self.status, "fraction": self.fraction,
            "crossings": [p.as_dict() for p in self.crossings],
            "intervals": [i.as_dict() for i in self.intervals],
            "value_range": list(self.value_range), "message": self.message,
        }


@dataclass(frozen=True)
class BoundsSolution:
    """Fractions at which the bounds admit a target, and (for inequalities) guarantee it.

    Attributes
    ----------
    target : SizingTarget
        The target.
    status : {"admissible", "not_admissible"}
        Whether some fraction in the range admits the target between the bounds.
    possible : tuple of FractionInterval
        Fractions at which some microstructure between the bounds meets the target.
    guaranteed : tuple of FractionInterval
        Fractions at which every microstructure between the bounds meets it (inequalities; empty
        for an equality unless the bounds coincide).
    lower_range, upper_range : tuple of (float, float)
        Value range of the lower and upper bound over the fraction range, SI.
    message : str
        One sentence.
    """

    target: SizingTarget
    status: Literal["admissible", "not_admissible"]
    possible: tuple[FractionInterval, ...]
    guaranteed: tuple[FractionInterval, ...]
    lower_range: tuple[float, float]
    upper_range: tuple[float, float]
    message: str

    @property
    def interval(self) -> tuple[float, float] | None:
        """Smallest and largest admitted fraction, or None."""
        if not self.possible:
            return None
        return (self.possible[0].low.volume_fraction, self.possible[-1].high.volume_fraction)

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys status, interval, possible, guaranteed, lower_range, upper_range, message.
        """
        iv = self.interval
        return {
            "status": self.status, "interval": None if iv is None else list(iv),
            "possible": [i.as_dict() for i in self.possible],
            "guaranteed": [i.as_dict() for i in self.guaranteed],
            "lower_range": list(self.lower_range), "upper_range": list(self.upper_range),
            "message": self.message,
        }


@dataclass(frozen=True)
class TargetSizing:
    """One target sized under every model, with the bounds interval.

    Attributes
    ----------
    target : SizingTarget
        The target.
    models : dict of str to FractionSolution
        Per model (models that do not give the property are listed in ``skipped``).
    skipped : tuple of str
        Models that do not give this property.
    fraction_range : tuple of (float, float) or None
        Smallest and largest crossing over all models (None if no model crosses the target).
    bounds : BoundsSolution or None
        The bounds' answer (None where no bounds are available for the property).
    status : {"reached", "partly_reached", "always_met", "not_reachable"}
        ``reached``: every model meets it somewhere; ``partly_reached``: some do;
        ``always_met``: every model meets it on the whole range; ``not_reachable``: none does.
    message : str
        One sentence.
    """

    target: SizingTarget
    models: dict[str, FractionSolution]
    skipped: tuple[str, ...]
    fraction_range: tuple[float, float] | None
    bounds: BoundsSolution | None
    status: Literal["reached", "partly_reached", "always_met", "not_reachable"]
    message: str

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys target, status, fraction_range, models, skipped, bounds, message.
        """
        fr = self.fraction_range
        return {
            "target": self.target.as_dict(), "status": self.status,
            "fraction_range": None if fr is None else list(fr),
            "models": {k: v.as_dict() for k, v in self.models.items()},
            "skipped": list(self.skipped),
            "bounds": None if self.bounds is None else self.bounds.as_dict(),
            "message": self.message,
        }


@dataclass(frozen=True)
class SizingResult:
    """Targets sized together: per-target answers and the windows meeting all of them.

    Attributes
    ----------
    targets : tuple of TargetSizing
        One per target, in the given order.
    lower, upper : float
        Fraction range searched (upper: the packing limit).
    windows : dict of str to tuple of FractionInterval
        Per model, the fractions meeting every target that model gives.
    common_window : tuple of FractionInterval
        Fractions meeting every target under every model at once.
    bounds_window : tuple of FractionInterval or None
        Fractions admitted by the bounds for every target with bounds (None without bounds).
    status : {"met_by_all_models", "met_by_some_models", "not_met"}
        Whether the common window, or only some model's window, is non-empty.
    message : str
        One sentence on the window.
    caution : str
        Estimates and bounds are not design allowables.
    """

    targets: tuple[TargetSizing, ...]
    lower: float
    upper: float
    windows: dict[str, tuple[FractionInterval, ...]]
    common_window: tuple[FractionInterval, ...]
    bounds_window: tuple[FractionInterval, ...] | None
    status: Literal["met_by_all_models", "met_by_some_models", "not_met"]
    message: str
    caution: str = CAUTION

    def __getitem__(self, name: str) -> TargetSizing:
        """Return the sizing of the target with this property name."""
        for t in self.targets:
            if t.target.name == name:
                return t
        raise InputError(f"sizing result: no target {name!r}; targets are "
                         f"{', '.join(t.target.name for t in self.targets)}")

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys targets, range, windows, common_window, bounds_window, status, message, caution.
        """
        return {
            "targets": [t.as_dict() for t in self.targets],
            "range": [self.lower, self.upper],
            "windows": {k: [i.as_dict() for i in v] for k, v in self.windows.items()},
            "common_window": [i.as_dict() for i in self.common_window],
            "bounds_window": None if self.bounds_window is None
            else [i.as_dict() for i in self.bounds_window],
            "status": self.status, "message": self.message, "caution": self.caution,
        }


# --- solving ----------------------------------------------------------------------------------


def _points(xs: Sequence[float], mass: MassModel | None) -> tuple[FractionPoint, ...]:
    x = np.asarray(xs, dtype=np.float64)
    m = mass(x) if mass is not None and x.size else {}
    wf, rho = (property_values(m, k) for k in ("weight_fraction", "density"))

    def at(a: Array | None, i: int) -> float | None:
        return None if a is None else float(np.broadcast_to(a, x.shape)[i])

    return tuple(FractionPoint(float(v), at(wf, i), at(rho, i)) for i, v in enumerate(x))


def _intervals(iv: IntervalSet, mass: MassModel | None) -> tuple[FractionInterval, ...]:
    pts = _points([v for pair in iv for v in pair], mass)
    return tuple(FractionInterval(a, b) for a, b in zip(pts[::2], pts[1::2], strict=True))


def _raw(intervals: tuple[FractionInterval, ...]) -> IntervalSet:
    return tuple((i.low.volume_fraction, i.high.volume_fraction) for i in intervals)


def _grid_range(f: Callable[[Array], Array], lower: float, upper: float, points: int
                ) -> tuple[float, float]:
    y = evaluate(f, np.linspace(lower, upper, points))
    y = y[np.isfinite(y)]
    if not y.size:
        raise InputError("forward model: no finite value on the fraction range")
    return float(y.min()), float(y.max())


def _join(iv: tuple[FractionInterval, ...]) -> str:
    return ", ".join(i.describe() for i in iv)


def solve_fraction(
    func: Callable[[Array], ArrayLike],
    target: SizingTarget,
    *,
    lower: float = 0.0,
    upper: float = 1.0,
    model: str = "",
    mass: MassModel | None = None,
    points: int = DEFAULT_POINTS,
    upper_label: str = "the packing limit",
) -> FractionSolution:
    """Find where a vectorised property function of the fibre fraction meets a target.

    Parameters
    ----------
    func : callable
        ``func(vf)`` with vf of shape (n,) returns the property, shape (n,), SI.
    target : SizingTarget
        Name, relation and SI value.
    lower, upper : float
        Fraction range searched (0 and the packing limit).
    model : str
        Model key for the result and the message.
    mass : callable, optional
        ``mass(vf)`` returning ``density`` and ``weight_fraction`` arrays (reported alongside).
    points : int
        Grid points of the scan that precedes the root search.
    upper_label : str
        How the upper end is named in messages.

    Returns
    -------
    FractionSolution
        Crossings, intervals meeting the target, status and a sentence.

    References
    ----------
    .. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Ch. 4.

    Examples
    --------
    >>> t = SizingTarget("E1", 40e9)
    >>> s = solve_fraction(lambda v: 70e9 * v + 3e9 * (1 - v), t, upper=0.9)
    >>> round(s.fraction, 6)
    0.552239
    """
    f = lambda x: evaluate(func, x)  # noqa: E731
    roots, iv = satisfying_set(f, target.relation, target.value, lower, upper, points=points)
    vrange = _grid_range(f, lower, upper, points)
    crossings = _points(list(roots), mass)
    intervals = _intervals(iv, mass)
    who = model or "the model"
    what = target.describe()
    status: ModelStatus
    if roots.size:
        status = "reached"
        if target.relation == "==":
            msg = f"{who} reaches {what} at " + ", ".join(f"Vf {r:.4g}" for r in roots)
        else:
            msg = f"{who} meets {what} for {_join(intervals)}"
    elif intervals:
        status = "always_met"
        msg = f"{who} meets {what} over the whole range Vf {lower:.4g} to {upper:.4g}"
    else:
        status = "not_reachable"
        msg = (f"{who}: {what} is not reachable below {upper_label} (Vf {upper:.4g}); its "
               f"{target.name} ranges from {format_value(target.name, vrange[0])} to "
               f"{format_value(target.name, vrange[1])}")
    return FractionSolution(model=model, target=target, status=status, crossings=crossings,
                            intervals=intervals, value_range=vrange, lower=lower, upper=upper,
                            message=msg + ".")


def _bounds_solution(
    lo_f: Callable[[Array], Array],
    hi_f: Callable[[Array], Array],
    target: SizingTarget,
    lower: float,
    upper: float,
    mass: MassModel | None,
    points: int,
) -> BoundsSolution:
    def band_lo(x: Array) -> Array:
        return np.minimum(lo_f(x), hi_f(x))

    def band_hi(x: Array) -> Array:
        return np.maximum(lo_f(x), hi_f(x))

    def met(f: Callable[[Array], Array], relation: Relation) -> IntervalSet:
        return satisfying_set(f, relation, target.value, lower, upper, points=points)[1]

    # possible: some value in the band meets the target; guaranteed: every value does
    if target.relation == "==":
        possible = intersect(met(band_hi, ">="), met(band_lo, "<="))
        guaranteed = intersect(met(band_lo, "=="), met(band_hi, "=="))
    elif target.relation == ">=":
        possible, guaranteed = met(band_hi, ">="), met(band_lo, ">=")
    else:
        possible, guaranteed = met(band_lo, "<="), met(band_hi, "<=")
    pos = _intervals(possible, mass)
    gua = _intervals(guaranteed, mass)
    what = target.describe()
    if pos:
        msg = f"the bounds admit {what} for {_join(pos)}"
        if target.relation != "==":
            msg += (f"; every microstructure between them meets it for {_join(gua)}" if gua
                    else "; no fraction guarantees it for every microstructure")
    else:
        msg = f"the bounds do not admit {what} at any Vf from {lower:.4g} to {upper:.4g}"
    return BoundsSolution(
        target=target, status="admissible" if pos else "not_admissible", possible=pos,
        guaranteed=gua, lower_range=_grid_range(band_lo, lower, upper, points),
        upper_range=_grid_range(band_hi, lower, upper, points), message=msg + ".",
    )


def _size_one(
    target: SizingTarget,
    models: Mapping[str, ForwardModel],
    bounds: tuple[ForwardModel, ForwardModel] | None,
    mass: MassModel | None,
    lower: float,
    upper: float,
    points: int,
    upper_label: str,
) -> TargetSizing:
    probe = np.array([0.5 * (lower + upper)])
    given = {k: m for k, m in models.items() if property_values(m(probe), target.name) is not None}
    skipped = tuple(k for k in models if k not in given)
    sols = {
        k: solve_fraction(_property_function(m, target.name), target, lower=lower, upper=upper,
                          model=k, mass=mass, points=points, upper_label=upper_label)
        for k, m in given.items()
    }
    bsol = None
    if bounds is not None and all(
        property_values(b(probe), target.name) is not None for b in bounds
    ):
        bsol = _bounds_solution(_property_function(bounds[0], target.name),
                                _property_function(bounds[1], target.name),
                                target, lower, upper, mass, points)
    if not sols and bsol is None:
        raise InputError(
            f"target {target.name}: no model gives this property (models: "
            f"{', '.join(models) or 'none'}); for Ex, Ey, Gxy, nuxy give a layup"
        )
    crossings = [x for s in sols.values() for x in s.fractions]
    frange = (min(crossings), max(crossings)) if crossings else None
    statuses = [s.status for s in sols.values()]
    what = target.describe()
    status: Literal["reached", "partly_reached", "always_met", "not_reachable"]
    if statuses and all(s == "always_met" for s in statuses):
        status = "always_met"
        msg = f"{what} holds over the whole range Vf {lower:.4g} to {upper:.4g} under every model"
    elif statuses and all(s != "not_reachable" for s in statuses):
        status = "reached"
        msg = _reached_sentence(what, sols, frange)
    elif any(s != "not_reachable" for s in statuses):
        status = "partly_reached"
        missing = [k for k, s in sols.items() if s.status == "not_reachable"]
        msg = (_reached_sentence(what, sols, frange) + f"; not reachable below {upper_label} "
               f"under {', '.join(missing)}")
    else:
        status = "not_reachable"
        msg = f"{what} is not reachable below {upper_label} (Vf {upper:.4g}) under any model"
        if sols:
            vals = [s.value_range for s in sols.values()]
            msg += (f" (the models span {format_value(target.name, min(v[0] for v in vals))} to "
                    f"{format_value(target.name, max(v[1] for v in vals))})")
    if bsol is not None:
        msg += "; " + bsol.message.rstrip(".")
    return TargetSizing(target=target, models=sols, skipped=skipped, fraction_range=frange,
                        bounds=bsol, status=status, message=msg + ".")


def _reached_sentence(what: str, sols: Mapping[str, FractionSolution],
                      frange: tuple[float, float] | None) -> str:
    span = "" if frange is None else _span(*frange)
    first = next(iter(sols.values()))
    if first.target.relation == "==":
        return f"{what} is reached at {span} over the models"
    lo, hi = first.lower, first.upper
    both = intersect_all([_raw(s.intervals) for s in sols.values()], lo, hi)
    held = ("holds under every model for " + ", ".join(_span(a, b) for a, b in both)
            if both else "holds under no model at every fraction")
    return f"{what} {held}" + (f" (the models cross it at {span})" if span else "")


def size_models(
    targets: Sequence[SizingTarget | str],
    models: Mapping[str, ForwardModel],
    *,
    bounds: tuple[ForwardModel, ForwardModel] | None = None,
    mass: MassModel | None = None,
    lower: float = 0.0,
    upper: float = 1.0,
    points: int = DEFAULT_POINTS,
    upper_label: str = "the packing limit",
) -> SizingResult:
    """Size the fibre fraction for several targets under several forward models.

    Parameters
    ----------
    targets : sequence of SizingTarget or str
        Targets (strings are parsed with :meth:`SizingTarget.parse`).
    models : mapping of str to callable
        Model key -> ``model(vf)`` returning a mapping (or ElasticConstants) of property arrays
        of vf's shape (n,). Models that do not give a target's property are skipped for it.
    bounds : tuple of (callable, callable), optional
        Lower and upper bound forward models of the same form.
    mass : callable, optional
        ``mass(vf)`` returning ``density`` and ``weight_fraction`` arrays, reported alongside.
    lower, upper : float
        Fraction range (0 and the packing limit).
    points : int
        Grid points of the scan before each root search.
    upper_label : str
        How the upper end is named in messages.

    Returns
    -------
    SizingResult
        Per-target answers and the windows meeting all targets.

    Raises
    ------
    InputError
        If no target is given, or no model (nor the bounds) gives a target's property.

    References
    ----------
    .. [1] Brent, R. P. (1973). *Algorithms for Minimization without Derivatives*, Ch. 4.
    .. [2] Hashin, Z. (1979). *Journal of Applied Mechanics* 46(3), 543-550.
    """
    if not targets:
        raise InputError("targets: none given; give at least one, e.g. 'E2=9GPa'")
    if not models and bounds is None:
        raise InputError("models: none given; give at least one forward model")
    tg = [t if isinstance(t, SizingTarget) else SizingTarget.parse(t) for t in targets]
    sized = tuple(_size_one(t, models, bounds, mass, lower, upper, points, upper_label)
                  for t in tg)
    windows: dict[str, tuple[FractionInterval, ...]] = {}
    for k in models:
        sets = [_raw(s.models[k].intervals) for s in sized if k in s.models]
        windows[k] = _intervals(intersect_all(sets, lower, upper), mass)
    common = _intervals(intersect_all([_raw(w) for w in windows.values()], lower, upper), mass) \
        if windows else ()
    bsets = [_raw(s.bounds.possible) for s in sized if s.bounds is not None]
    bwin = _intervals(intersect_all(bsets, lower, upper), mass) if bsets else None
    status: Literal["met_by_all_models", "met_by_some_models", "not_met"]
    names = ", ".join(t.describe() for t in tg)
    if common:
        status = "met_by_all_models"
        msg = f"{names}: met under every model for {_join(common)}"
        msg += _mass_text(common)
    elif any(windows.values()):
        status = "met_by_some_models"
        per = "; ".join(f"{k}: {_join(v)}" for k, v in windows.items() if v)
        msg = f"{names}: no fraction meets all under every model; met under {per}"
    else:
        status = "not_met"
        msg = f"{names}: no fraction up to {upper_label} (Vf {upper:.4g}) meets all under any model"
    if bwin is not None:
        msg += (f"; the bounds admit all for {_join(bwin)}" if bwin
                else "; the bounds admit no common fraction")
    return SizingResult(targets=sized, lower=lower, upper=upper, windows=windows,
                        common_window=common, bounds_window=bwin, status=status,
                        message=msg + ".")


def _mass_text(iv: tuple[FractionInterval, ...]) -> str:
    lo, hi = iv[0].low, iv[-1].high
    parts = []
    if lo.weight_fraction is not None and hi.weight_fraction is not None:
        parts.append("weight fraction " + _range_text(lo.weight_fraction, hi.weight_fraction,
                                                      lambda x: f"{x:.4g}"))
    if lo.density is not None and hi.density is not None:
        parts.append("density " + _range_text(lo.density, hi.density,
                                              lambda x: format_value("density", x)))
    return f" ({'; '.join(parts)})" if parts else ""
