"""Monte Carlo propagation of scatter in constituent constants and fraction through any estimate.

Each uncertain input is given by its mean and coefficient of variation (CoV = standard deviation /
|mean|) with a normal or lognormal distribution, and an open physical range ``(lower, upper)``.

Sampling rules (documented behaviour):

* **normal**: ``x = mean + CoV |mean| z`` with ``z`` standard normal.
* **lognormal**: ``|x|`` is lognormal with mean ``|mean|`` and the given CoV
  (``sigma^2 = ln(1 + CoV^2)``, ``mu = ln|mean| - sigma^2 / 2``) and ``x`` keeps the sign of the
  mean, so a negative CTE keeps its sign. A zero mean gives a constant.
* **physical range**: samples outside an input's open range (moduli > 0, -1 < nu < 1/2 for an
  isotropic phase, 0 < Vf < packing limit, ...) and rows that fail a joint check (such as the
  positive definiteness of a transversely isotropic fibre) are *rejected and redrawn* (whole rows,
  so the inputs stay independent). The sampled distribution is then the given one truncated to
  the physical range; the number of redrawn rows is reported. When a CoV is so large that rows
  keep failing after ``max_rounds`` redraws, an :class:`~micromech.errors.InputError` says so.
  Values are never clipped onto the range ends (that would pile probability on a boundary).

Samples are drawn and evaluated in chunks (``chunk_size``), with an optional progress callback
``progress(done, total)`` after each chunk. The mean and standard deviation are accumulated in
float64 over chunks (sums about a shift, to avoid cancellation); percentiles and histograms are
computed from the stored samples, float64 up to 2 million samples and float32 beyond (unless
``keep_samples``), which halves the memory of long runs and is ample for quantiles whose sampling
error is far larger than 1e-7 relative.

References
----------
.. [1] Metropolis, N., Ulam, S. (1949). The Monte Carlo method. *Journal of the American
   Statistical Association* 44(247), 335-341.
.. [2] Johnson, N. L., Kotz, S., Balakrishnan, N. (1994). *Continuous Univariate
   Distributions*, Vol. 1, 2nd ed., Wiley, Ch. 14 (lognormal moments: mean exp(mu + s^2/2),
   variance (exp(s^2) - 1) exp(2 mu + s^2)).
.. [3] Hyndman, R. J., Fan, Y. (1996). Sample quantiles in statistical packages. *The American
   Statistician* 50(4), 361-365 (the linear-interpolation quantile, their definition 7, used by
   numpy).
"""

from __future__ import annotations

import math
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.safety import CAUTION

__all__ = [
    "Uncertain",
    "Statistics",
    "MonteCarloResult",
    "propagate",
    "DEFAULT_PERCENTILES",
    "MAX_SAMPLES",
]

Array = NDArray[np.float64]
Distribution = Literal["normal", "lognormal"]
#: Largest number of sample rows of one run (memory: 4 bytes per sample and output kept).
MAX_SAMPLES: int = 10_000_000
#: Percentiles reported by default.
DEFAULT_PERCENTILES: tuple[float, ...] = (5.0, 50.0, 95.0)


@dataclass(frozen=True)
class Uncertain:
    """An uncertain input: mean, coefficient of variation, distribution and physical range.

    Parameters
    ----------
    mean : float
        Mean value (SI).
    cov : float
        Coefficient of variation, standard deviation / |mean|, >= 0 (0: a fixed value).
    distribution : {"normal", "lognormal"}
        The distribution (see the module notes for the lognormal of a negative mean).
    lower, upper : float
        Open physical range; samples outside it are rejected and redrawn. The mean may lie on
        a range end (a fixed value at 0, say); samples must lie strictly inside.

    Raises
    ------
    InputError
        If the mean or CoV is not finite, the CoV is negative, the distribution is unknown or the
        mean lies outside the physical range.

    Examples
    --------
    >>> Uncertain(72e9, 0.05).std
    3600000000.0
    """

    mean: float
    cov: float = 0.0
    distribution: Distribution = "normal"
    lower: float = -math.inf
    upper: float = math.inf

    def __post_init__(self) -> None:
        for k in ("mean", "cov", "lower", "upper"):
            object.__setattr__(self, k, float(getattr(self, k)))
        if not math.isfinite(self.mean):
            raise InputError(f"uncertain input: mean = {self.mean!r} must be finite")
        if not (math.isfinite(self.cov) and self.cov >= 0.0):
            raise InputError(f"uncertain input: cov = {self.cov!r} must be finite and >= 0")
        if self.distribution not in ("normal", "lognormal"):
            raise InputError(f"uncertain input: distribution = {self.distribution!r} is not "
                             "'normal' or 'lognormal'")
        if not self.lower <= self.mean <= self.upper:
            raise InputError(f"uncertain input: mean = {self.mean!r} lies outside its physical "
                             f"range ({self.lower!r}, {self.upper!r})")

    @property
    def std(self) -> float:
        """Standard deviation of the untruncated distribution, cov |mean|."""
        return self.cov * abs(self.mean)

    def sample(self, rng: np.random.Generator, n: int) -> Array:
        """Draw ``n`` samples (not yet checked against the physical range).

        Parameters
        ----------
        rng : numpy.random.Generator
            The random generator.
        n : int
            Number of samples.

        Returns
        -------
        ndarray, shape (n,)
            The samples (a constant array when the CoV or the mean is 0).
        """
        if self.std == 0.0:
            return np.full(n, self.mean)
        z = rng.standard_normal(n)
        if self.distribution == "normal":
            return self.mean + self.std * z
        s2 = math.log1p(self.cov**2)
        mu = math.log(abs(self.mean)) - 0.5 * s2
        return math.copysign(1.0, self.mean) * np.exp(mu + math.sqrt(s2) * z)

    def inside(self, x: Array) -> NDArray[np.bool_]:
        """Whether samples lie in the open physical range.

        Parameters
        ----------
        x : ndarray, shape (n,)
            Samples.

        Returns
        -------
        ndarray of bool, shape (n,)
            True inside ``(lower, upper)`` (every finite sample of a fixed input).
        """
        if self.std == 0.0:  # a fixed value is taken as given (it may sit on a range end)
            return np.isfinite(x)
        return np.asarray((x > self.lower) & (x < self.upper) & np.isfinite(x))

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form.

        Returns
        -------
        dict
            Keys mean, cov, distribution, lower, upper (None for an infinite end).
        """
        return {"mean": self.mean, "cov": self.cov, "distribution": self.distribution,
                "lower": None if math.isinf(self.lower) else self.lower,
                "upper": None if math.isinf(self.upper) else self.upper}


@dataclass(frozen=True, eq=False)
class Statistics:
    """Summary of one Monte Carlo output.

    Attributes
    ----------
    name : str
        Output name.
    n : int
        Number of finite samples used.
    mean, std : float
        Sample mean and standard deviation (ddof = 1), SI.
    percentiles : dict of float to float
        Percentile (0-100) -> value, SI (linear interpolation, Hyndman and Fan 1996, def. 7).
    counts : ndarray of int, shape (bins,)
        Histogram counts.
    edges : ndarray, shape (bins + 1,)
        Histogram bin edges, SI.
    """

    name: str
    n: int
    mean: float
    std: float
    percentiles: dict[float, float]
    counts: NDArray[np.int64]
    edges: Array

    @property
    def cov(self) -> float:
        """Sample coefficient of variation std / |mean| (nan for a zero mean)."""
        return self.std / abs(self.mean) if self.mean != 0.0 else math.nan

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys n, mean, std, percentiles (keys like "P5"), histogram (counts, edges).
        """
        return {
            "n": self.n, "mean": self.mean, "std": self.std,
            "percentiles": {f"P{p:g}": v for p, v in self.percentiles.items()},
            "histogram": {"counts": self.counts.tolist(), "edges": self.edges.tolist()},
        }


@dataclass(frozen=True, eq=False)
class MonteCarloResult:
    """Outputs of a Monte Carlo run with the inputs that produced them.

    Attributes
    ----------
    n : int
        Number of sample rows.
    seed : int or None
        The seed (None when a Generator or no seed was given).
    inputs : dict of str to Uncertain
        The uncertain inputs.
    outputs : dict of str to Statistics
        One summary per output.
    rejected : int
        Rows redrawn because an input left its physical range or a joint check failed.
    samples : dict of str to ndarray or None
        Input and output samples, shape (n,), when ``keep_samples`` was set.
    model : str
        Label of the propagated estimate.
    caution : str
        Estimates and bounds are not design allowables.
    """

    n: int
    seed: int | None
    inputs: dict[str, Uncertain]
    outputs: dict[str, Statistics]
    rejected: int
    samples: dict[str, Array] | None = None
    model: str = ""
    caution: str = field(default=CAUTION)

    def __getitem__(self, name: str) -> Statistics:
        """Return the summary of an output."""
        if name not in self.outputs:
            raise InputError(f"Monte Carlo result: no output {name!r}; outputs are "
                             f"{', '.join(self.outputs)}")
        return self.outputs[name]

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            Keys model, n, seed, rejected, inputs, outputs, caution.
        """
        return {
            "model": self.model, "n": self.n, "seed": self.seed, "rejected": self.rejected,
            "inputs": {k: v.as_dict() for k, v in self.inputs.items()},
            "outputs": {k: v.as_dict() for k, v in self.outputs.items()},
            "caution": self.caution,
        }


def _as_uncertain(name: str, u: Uncertain | float) -> Uncertain:
    if isinstance(u, Uncertain):
        return u
    try:
        value = float(u)
    except (TypeError, ValueError):
        raise InputError(f"input {name!r}: expected an Uncertain or a number, got "
                         f"{type(u).__name__}") from None
    if not math.isfinite(value):
        raise InputError(f"input {name!r}: fixed value {value!r} must be finite")
    return Uncertain(value)


def _draw(
    specs: Mapping[str, Uncertain],
    m: int,
    rng: np.random.Generator,
    valid: Callable[[dict[str, Array]], ArrayLike] | None,
    max_rounds: int,
) -> tuple[dict[str, Array], int]:
    rows = {k: u.sample(rng, m) for k, u in specs.items()}
    rejected = 0
    for _ in range(max_rounds + 1):
        ok = np.ones(m, dtype=bool)
        for k, u in specs.items():
            ok &= u.inside(rows[k])
        if valid is not None:
            ok &= np.asarray(valid(rows), dtype=bool)
        bad = np.flatnonzero(~ok)
        if not bad.size:
            return rows, rejected
        rejected += int(bad.size)
        fresh = {k: u.sample(rng, bad.size) for k, u in specs.items()}
        for k in rows:
            rows[k][bad] = fresh[k]
    raise InputError(
        f"Monte Carlo: {bad.size} of {m} sample rows still fail the physical range after "
        f"{max_rounds} redraws; reduce the coefficients of variation"
    )


def propagate(
    func: Callable[[dict[str, Array]], Mapping[str, Any]],
    inputs: Mapping[str, Uncertain | float],
    n: int,
    *,
    seed: int | np.random.Generator | None = None,
    percentiles: Sequence[float] = DEFAULT_PERCENTILES,
    bins: int = 40,
    chunk_size: int = 100_000,
    progress: Callable[[int, int], None] | None = None,
    valid: Callable[[dict[str, Array]], ArrayLike] | None = None,
    max_rounds: int = 100,
    keep_samples: bool = False,
    model: str = "",
) -> MonteCarloResult:
    """Propagate uncertain inputs through a vectorised function by Monte Carlo sampling.

    Parameters
    ----------
    func : callable
        ``func(samples)`` with ``samples`` a dict of input arrays, shape (m,), returning a mapping
        of output arrays of shape (m,) (or scalars); outputs that are None are ignored.
    inputs : mapping of str to Uncertain or float
        The inputs; a plain number is a fixed input.
    n : int
        Number of sample rows, >= 2.
    seed : int, numpy.random.Generator or None
        Seed of :func:`numpy.random.default_rng`, or a generator.
    percentiles : sequence of float
        Percentiles to report, each in [0, 100].
    bins : int
        Histogram bins, >= 1.
    chunk_size : int
        Rows drawn and evaluated per chunk, >= 1.
    progress : callable, optional
        ``progress(done, total)`` called after each chunk.
    valid : callable, optional
        Joint check ``valid(samples) -> bool array (m,)``; failing rows are redrawn.
    max_rounds : int
        Redraw rounds before giving up.
    keep_samples : bool
        Keep all input and output samples (float64) in the result.
    model : str
        Label stored in the result.

    Returns
    -------
    MonteCarloResult
        Mean, standard deviation, percentiles and histogram per output.

    Raises
    ------
    InputError
        For n < 2 or n > :data:`MAX_SAMPLES`, a bad percentile, bins or chunk size, a function
        that returns arrays of the wrong shape or no outputs, or rows that keep failing the
        physical range.

    References
    ----------
    .. [1] Metropolis, N., Ulam, S. (1949). *J. Am. Stat. Assoc.* 44(247), 335-341.

    Examples
    --------
    >>> r = propagate(lambda s: {"y": 2.0 * s["x"]}, {"x": Uncertain(1.0, 0.1)}, 1000, seed=1)
    >>> abs(r["y"].mean - 2.0) < 0.05
    True
    """
    n = int(n)
    if n < 2:
        raise InputError(f"samples: n = {n}; need at least 2")
    if n > MAX_SAMPLES:
        raise InputError(
            f"samples: n = {n}; at most {MAX_SAMPLES:.0e} (every sample of every output is kept "
            "for the percentiles, 4 bytes each; the sampling error at 10^7 samples is already "
            "far below the scatter of any constituent data)"
        )
    pct = tuple(float(p) for p in percentiles)
    if any(not 0.0 <= p <= 100.0 for p in pct):
        raise InputError(f"percentiles: {list(pct)} must each lie in [0, 100]")
    if bins < 1 or chunk_size < 1:
        raise InputError(f"bins = {bins}, chunk_size = {chunk_size}: both must be >= 1")
    specs = {k: _as_uncertain(k, u) for k, u in inputs.items()}
    rng = seed if isinstance(seed, np.random.Generator) else np.random.default_rng(seed)
    store_dtype = np.float64 if keep_samples or n <= 2_000_000 else np.float32
    store: dict[str, NDArray[Any]] = {}
    kept_in: dict[str, Array] = {k: np.empty(n) for k in specs} if keep_samples else {}
    sums: dict[str, list[float]] = {}  # name -> [shift, count, sum, sum of squares]
    rejected = 0
    done = 0
    while done < n:
        m = min(chunk_size, n - done)
        rows, rej = _draw(specs, m, rng, valid, max_rounds)
        rejected += rej
        out = func(rows)
        if not isinstance(out, Mapping):
            raise InputError(f"Monte Carlo: the function returned {type(out).__name__}; "
                             "expected a mapping of output arrays")
        for k, v in out.items():
            if v is None:
                continue
            a = np.asarray(v, dtype=np.float64)
            if a.ndim == 0:
                a = np.full(m, float(a))
            if a.shape != (m,):
                raise InputError(f"Monte Carlo: output {k!r} has shape {a.shape} for {m} "
                                 "sample rows; expected one value per row")
            if k not in store:
                store[k] = np.full(n, np.nan, dtype=store_dtype)
                fin = a[np.isfinite(a)]
                sums[k] = [float(fin[0]) if fin.size else 0.0, 0.0, 0.0, 0.0]
            store[k][done:done + m] = a
            s = sums[k]
            fin = a[np.isfinite(a)] - s[0]
            s[1] += fin.size
            s[2] += float(fin.sum())
            s[3] += float((fin * fin).sum())
        for k in kept_in:
            kept_in[k][done:done + m] = rows[k]
        done += m
        if progress is not None:
            progress(done, n)
    if not store:
        raise InputError("Monte Carlo: the function returned no outputs")
    stats = {k: _summary(k, store[k], sums[k], pct, bins) for k in store}
    samples = None
    if keep_samples:
        samples = {**kept_in, **{k: np.asarray(v, dtype=np.float64) for k, v in store.items()}}
    return MonteCarloResult(n=n, seed=seed if isinstance(seed, int) else None, inputs=specs,
                            outputs=stats, rejected=rejected, samples=samples, model=model)


def _summary(name: str, x: NDArray[Any], s: list[float], pct: tuple[float, ...],
             bins: int) -> Statistics:
    shift, cnt, sm, sq = s
    fin = x[np.isfinite(x)]
    if cnt < 2:
        nan = math.nan
        return Statistics(name, int(cnt), nan, nan, {p: nan for p in pct},
                          np.zeros(bins, dtype=np.int64), np.full(bins + 1, nan))
    mean = shift + sm / cnt
    var = max((sq - sm * sm / cnt) / (cnt - 1), 0.0)
    q = np.percentile(fin.astype(np.float64, copy=False), pct) if pct else np.empty(0)
    lo, hi = float(fin.min()), float(fin.max())
    if lo == hi:
        lo, hi = lo - 0.5 * max(abs(lo), 1e-300), hi + 0.5 * max(abs(hi), 1e-300)
    counts, edges = np.histogram(fin, bins=bins, range=(lo, hi))
    return Statistics(name=name, n=int(cnt), mean=float(mean), std=math.sqrt(var),
                      percentiles={p: float(v) for p, v in zip(pct, q, strict=True)},
                      counts=counts.astype(np.int64), edges=edges.astype(np.float64))
