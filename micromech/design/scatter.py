"""Monte Carlo scatter of a composite's estimated properties from scatter in its constituents.

The constituent constants and the fibre fraction get independent distributions (mean = the
nominal value, a coefficient of variation per group, normal or lognormal); arrays of samples go
straight into the vectorised estimators through :class:`~micromech.homogenize.FibrePhase` and
:class:`~micromech.homogenize.MatrixPhase` arrays (see
:func:`micromech.design.uncertainty.propagate` for the sampling and rejection rules).

Inputs and their physical ranges (samples outside are redrawn):

======================================  ===================================  ================
input                                   range                                CoV group
======================================  ===================================  ================
fibre_E (isotropic fibre)               E > 0                                ``cov``
fibre_E1, fibre_E2, fibre_G12 (TI)      > 0                                  ``cov``
fibre_nu (isotropic)                    -1 < nu < 1/2                        ``cov_poisson``
fibre_nu12, fibre_nu23 (TI)             -1 < nu23, nu23 < 1 - 2 nu12^2 E2/E1  ``cov_poisson``
fibre_alpha / alpha1, alpha2            any                                  ``cov_expansion``
matrix_E                                E > 0                                ``cov``
matrix_nu                               -1 < nu < 1/2                        ``cov_poisson``
matrix_alpha                            any                                  ``cov_expansion``
fibre_density, matrix_density           > 0                                  ``cov_density``
volume_fraction                         0 < Vf < packing limit (and 1 - Vv)  ``cov_fraction``
======================================  ===================================  ================

The transversely isotropic fibre's joint rule is positive definiteness (Lempriere 1968; Jones
1999, Sec. 2.4). Any single input's CoV may be set by name with ``covs``.

References
----------
.. [1] Lempriere, B. M. (1968). Poisson's ratio in orthotropic materials. *AIAA Journal* 6(11),
   2226-2227.
.. [2] Metropolis, N., Ulam, S. (1949). The Monte Carlo method. *J. Am. Stat. Assoc.* 44(247),
   335-341.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import replace
from typing import Any, Literal

import numpy as np
from numpy.typing import NDArray

from micromech.design.forward import (
    Constituents,
    applicable_models,
    fraction_of,
    properties_at,
)
from micromech.design.inverse import property_values
from micromech.design.sizing import as_constituents
from micromech.design.targets import property_kind
from micromech.design.uncertainty import (
    DEFAULT_PERCENTILES,
    MonteCarloResult,
    Uncertain,
    propagate,
)
from micromech.errors import InputError
from micromech.homogenize.phases import FibrePhase, MatrixPhase

__all__ = ["constituent_inputs", "monte_carlo", "DEFAULT_PROPERTIES"]

Array = NDArray[np.float64]
#: Properties reported by default (those the model gives), plus laminate ones with a layup.
DEFAULT_PROPERTIES: tuple[str, ...] = ("E1", "E2", "G12", "G23", "nu12", "nu23", "alpha1",
                                       "alpha2", "density", "weight_fraction")
_LAMINATE = ("Ex", "Ey", "Gxy", "nuxy")


def _f(x: Any) -> float:
    return float(np.asarray(x))


def constituent_inputs(
    c: Constituents,
    volume_fraction: float,
    *,
    cov: float = 0.05,
    cov_fraction: float = 0.02,
    cov_poisson: float = 0.0,
    cov_expansion: float = 0.0,
    cov_density: float = 0.0,
    covs: Mapping[str, float] | None = None,
    distribution: Literal["normal", "lognormal"] = "normal",
) -> dict[str, Uncertain]:
    """Uncertain inputs of a composite: its constituent constants and fibre fraction.

    Parameters
    ----------
    c : Constituents
        One fibre and one matrix (scalar constants).
    volume_fraction : float
        Mean fibre fraction.
    cov, cov_fraction, cov_poisson, cov_expansion, cov_density : float
        Coefficients of variation of the moduli, the fraction, the Poisson ratios, the CTEs and
        the densities (0: fixed).
    covs : mapping of str to float, optional
        CoV of single inputs by name (see the module table), overriding the groups.
    distribution : {"normal", "lognormal"}
        Distribution of every input.

    Returns
    -------
    dict of str to Uncertain
        Inputs by name.

    Raises
    ------
    InputError
        For constituent arrays, or a name in ``covs`` that is not an input.
    """
    if c.shape != ():
        raise InputError(f"Monte Carlo: constituents of shape {c.shape}; give one fibre and one "
                         "matrix")
    f, m = c.fibre, c.matrix
    spec: dict[str, tuple[float, float, float, float]] = {}  # name -> mean, cov, lower, upper
    inf = float("inf")
    if f.is_isotropic:
        spec["fibre_E"] = (_f(f.E1), cov, 0.0, inf)
        spec["fibre_nu"] = (_f(f.nu12), cov_poisson, -1.0, 0.5)
        if f.alpha1 is not None:
            spec["fibre_alpha"] = (_f(f.alpha1), cov_expansion, -inf, inf)
    else:
        for k in ("E1", "E2", "G12"):
            spec[f"fibre_{k}"] = (_f(getattr(f, k)), cov, 0.0, inf)
        spec["fibre_nu12"] = (_f(f.nu12), cov_poisson, -inf, inf)
        spec["fibre_nu23"] = (_f(f.nu23), cov_poisson, -1.0, 1.0)
        if f.alpha1 is not None:
            spec["fibre_alpha1"] = (_f(f.alpha1), cov_expansion, -inf, inf)
            spec["fibre_alpha2"] = (_f(f.alpha2), cov_expansion, -inf, inf)
    spec["matrix_E"] = (_f(m.E), cov, 0.0, inf)
    spec["matrix_nu"] = (_f(m.nu), cov_poisson, -1.0, 0.5)
    if m.alpha is not None:
        spec["matrix_alpha"] = (_f(m.alpha), cov_expansion, -inf, inf)
    if c.has_density:
        spec["fibre_density"] = (_f(c.fibre_density), cov_density, 0.0, inf)
        spec["matrix_density"] = (_f(c.matrix_density), cov_density, 0.0, inf)
    spec["volume_fraction"] = (float(volume_fraction), cov_fraction, 0.0, c.upper_fraction)
    for k in covs or {}:
        if k not in spec:
            raise InputError(f"covs: {k!r} is not an input; inputs are {', '.join(spec)}")
    over = dict(covs or {})
    return {k: Uncertain(mean, over.get(k, cv), distribution, lo, hi)
            for k, (mean, cv, lo, hi) in spec.items()}


def _phases(s: Mapping[str, Array], iso: bool) -> tuple[FibrePhase, MatrixPhase]:
    if iso:
        f = FibrePhase.isotropic(s["fibre_E"], s["fibre_nu"], s.get("fibre_alpha"))
    else:
        f = FibrePhase(s["fibre_E1"], s["fibre_E2"], s["fibre_nu12"], s["fibre_G12"],
                       s["fibre_nu23"], s.get("fibre_alpha1"), s.get("fibre_alpha2"))
    return f, MatrixPhase(s["matrix_E"], s["matrix_nu"], s.get("matrix_alpha"))


def _valid_ti(s: Mapping[str, Array]) -> NDArray[np.bool_]:
    lim = 1.0 - 2.0 * s["fibre_nu12"] ** 2 * s["fibre_E2"] / s["fibre_E1"]
    return np.asarray(s["fibre_nu23"] < lim)


def monte_carlo(
    design: Any,
    n: int = 10_000,
    *,
    model: str | None = None,
    volume_fraction: float | None = None,
    properties: Sequence[str] | None = None,
    cov: float = 0.05,
    cov_fraction: float = 0.02,
    cov_poisson: float = 0.0,
    cov_expansion: float = 0.0,
    cov_density: float = 0.0,
    covs: Mapping[str, float] | None = None,
    distribution: Literal["normal", "lognormal"] = "normal",
    seed: int | np.random.Generator | None = None,
    percentiles: Sequence[float] = DEFAULT_PERCENTILES,
    bins: int = 40,
    chunk_size: int = 100_000,
    progress: Callable[[int, int], None] | None = None,
    keep_samples: bool = False,
    layup: str | None = None,
) -> MonteCarloResult:
    """Monte Carlo scatter of a composite's estimated properties.

    Parameters
    ----------
    design : Composite, Case or Constituents
        The nominal composite (a case adds its layup and its ``ply_model``).
    n : int
        Number of samples.
    model : str, optional
        Estimate to propagate (default: the case's ply model, else ``"mori_tanaka"``).
    volume_fraction : float, optional
        Mean fibre fraction (default: the composite's).
    properties : sequence of str, optional
        Outputs (default: :data:`DEFAULT_PROPERTIES` the model gives, and ``Ex Ey Gxy nuxy``
        with a layup).
    cov, cov_fraction, cov_poisson, cov_expansion, cov_density, covs, distribution :
        Scatter of the inputs (see :func:`constituent_inputs`).
    seed : int or numpy.random.Generator, optional
        Seed of the random generator.
    percentiles : sequence of float
        Percentiles reported (default 5, 50, 95).
    bins : int
        Histogram bins.
    chunk_size : int
        Samples evaluated per chunk.
    progress : callable, optional
        ``progress(done, total)`` after each chunk.
    keep_samples : bool
        Keep the input and output samples.
    layup : str, optional
        Laminate code (overrides a case's).

    Returns
    -------
    MonteCarloResult
        Mean, standard deviation, percentiles and histogram per property.

    Raises
    ------
    InputError
        For an inapplicable model, an unknown property, a property the model does not give, or
        a fraction outside [0, packing limit].

    References
    ----------
    .. [1] Metropolis, N., Ulam, S. (1949). *J. Am. Stat. Assoc.* 44(247), 335-341.

    Examples
    --------
    >>> from micromech.materials import Composite, Isotropic
    >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.5)
    >>> r = monte_carlo(c, 2000, seed=1, properties=["E1"])
    >>> 30e9 < r["E1"].percentiles[50.0] < 45e9
    True
    """
    c = as_constituents(design, layup=layup)
    if model is None:
        ply_model = getattr(design, "ply_model", None)
        model = ply_model if ply_model in applicable_models(c) else "mori_tanaka"
    if model not in applicable_models(c) and not model.startswith("hashin_shtrikman"):
        raise InputError(f"model {model!r} does not apply to {c.inclusion} inclusions; choose "
                         f"from {', '.join(applicable_models(c))}")
    vf = fraction_of(c, design, volume_fraction, "the mean fibre fraction")
    nominal = properties_at(c, model, np.asarray([vf]))
    if properties is None:
        names = [k for k in (*DEFAULT_PROPERTIES, *_LAMINATE) if k in nominal]
    else:
        names = list(properties)
        for k in names:
            property_kind(k)
            if property_values(nominal, k) is None:
                raise InputError(f"property {k!r}: {model} does not give it here (it gives "
                                 f"{', '.join(nominal)})")
    inputs = constituent_inputs(
        c, vf, cov=cov, cov_fraction=cov_fraction, cov_poisson=cov_poisson,
        cov_expansion=cov_expansion, cov_density=cov_density, covs=covs,
        distribution=distribution,
    )
    iso = "fibre_E" in inputs

    def evaluate(s: dict[str, Array]) -> dict[str, Any]:
        f, m = _phases(s, iso)
        over: dict[str, Any] = {"fibre": f, "matrix": m}
        if c.has_density:
            over["fibre_density"] = s["fibre_density"]
            over["matrix_density"] = s["matrix_density"]
        props = properties_at(replace(c, **over), model, s["volume_fraction"])  # type: ignore[arg-type]
        return {k: property_values(props, k) for k in names}

    return propagate(evaluate, inputs, n, seed=seed, percentiles=percentiles, bins=bins,
                     chunk_size=chunk_size, progress=progress,
                     valid=None if iso else _valid_ti, keep_samples=keep_samples, model=model)
