"""Tables and plots for sizing, sweeps and Monte Carlo scatter (``micromech size``).

The tables are plain text in display units (GPa, g/cm^3, 1e-6/K); every table and figure carries
the caution that estimates and bounds are not design allowables. Plots use matplotlib's Agg
backend, imported inside the functions.
"""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path
from typing import Any

import numpy as np

from micromech.design.inverse import FractionInterval, SizingResult, TargetSizing
from micromech.design.sweeps import Sweep
from micromech.design.targets import format_value, property_unit
from micromech.design.uncertainty import MonteCarloResult
from micromech.report.files import check_image_path
from micromech.report.text import text_table
from micromech.safety import CAUTION

__all__ = [
    "CAUTION",
    "sizing_table",
    "monte_carlo_table",
    "plot_sweep",
    "plot_sizing",
    "plot_histograms",
]


_SHORT = {
    "rule_of_mixtures": "rule of mixtures", "halpin_tsai": "Halpin-Tsai", "chamis": "Chamis",
    "cylinders": "composite cylinders", "mori_tanaka": "Mori-Tanaka",
    "hashin_shtrikman_lower": "HS lower", "hashin_shtrikman_upper": "HS upper",
}
_STYLES = ("-", "--", ":", "-.")
_COLOURS = {"rule_of_mixtures": "tab:blue", "halpin_tsai": "tab:orange", "chamis": "tab:green",
            "cylinders": "tab:red", "mori_tanaka": "tab:purple"}


def _num(x: float | None, digits: int = 4) -> str:
    return "-" if x is None else f"{x:.{digits}g}"


def _span(a: float | None, b: float | None, name: str | None = None) -> str:
    if a is None or b is None:
        return "-"
    fa = format_value(name, a) if name else _num(a)
    fb = format_value(name, b) if name else _num(b)
    return fa if fa == fb else f"{fa} .. {fb}"


def _target_rows(t: TargetSizing) -> list[list[str]]:
    rows = []
    for k, s in t.models.items():
        if s.crossings:
            for p in s.crossings:
                rows.append([_SHORT.get(k, k), _num(p.volume_fraction), _num(p.weight_fraction),
                             format_value("density", p.density), s.status])
        else:
            rows.append([_SHORT.get(k, k), "-", "-", "-", s.status])
    if t.bounds is not None:
        cells = ["-", "-", "-"]
        if t.bounds.possible:
            lo, hi = t.bounds.possible[0].low, t.bounds.possible[-1].high
            cells = [_span(lo.volume_fraction, hi.volume_fraction),
                     _span(lo.weight_fraction, hi.weight_fraction),
                     _span(lo.density, hi.density, "density")]
        rows.append(["bounds admit", *cells, t.bounds.status])
    return rows


def _window(intervals: Sequence[FractionInterval]) -> str:
    return ", ".join(i.describe() for i in intervals) or "none"


def sizing_table(result: SizingResult, *, title: str = "") -> str:
    """Format a sizing result: one table per target, then the window meeting all of them.

    Parameters
    ----------
    result : SizingResult
        From :func:`micromech.design.size_fraction`.
    title : str
        First line (e.g. the case name).

    Returns
    -------
    str
        Plain text.
    """
    lines = [title] if title else []
    lines.append(f"fibre fraction range searched: 0 to {result.upper:.4g} (packing limit)")
    for t in result.targets:
        lines += ["", f"target {t.target.describe()}: {t.status.replace('_', ' ')}"]
        lines.append(text_table(["model", "Vf", "weight fraction", "density", "status"],
                                _target_rows(t)))
        lines.append(t.message)
    lines += ["", "window meeting all targets"]
    rows = [[_SHORT.get(k, k), _window(v)] for k, v in result.windows.items()]
    rows.append(["every model", _window(result.common_window)])
    if result.bounds_window is not None:
        rows.append(["bounds admit", _window(result.bounds_window)])
    lines.append(text_table(["model", "fractions"], rows))
    lines += [result.message, "", f"Caution: {CAUTION}"]
    return "\n".join(lines)


def monte_carlo_table(result: MonteCarloResult, *, title: str = "") -> str:
    """Format Monte Carlo statistics: mean, standard deviation, CoV and percentiles per property.

    Parameters
    ----------
    result : MonteCarloResult
        From :func:`micromech.design.monte_carlo`.
    title : str
        First line.

    Returns
    -------
    str
        Plain text in display units.
    """
    pct = next(iter(result.outputs.values())).percentiles if result.outputs else {}
    headers = ["property", "unit", "mean", "std", "CoV", *(f"P{p:g}" for p in pct)]
    rows = []
    for k, s in result.outputs.items():
        unit, f = property_unit(k)
        rows.append([k, unit or "-", _num(s.mean / f), _num(s.std / f, 3),
                     _num(s.cov, 3) if np.isfinite(s.cov) else "-",
                     *(_num(v / f) for v in s.percentiles.values())])
    lines = [title] if title else []
    inputs = ", ".join(f"{k} CoV {u.cov:g}" for k, u in result.inputs.items() if u.cov > 0)
    lines.append(f"Monte Carlo: {result.n} samples of {result.model or 'the model'} (seed "
                 f"{result.seed}); scatter in {inputs or 'nothing'}; {result.rejected} rows "
                 "redrawn outside the physical range")
    lines.append(text_table(headers, rows))
    lines += ["", f"Caution: {CAUTION}"]
    return "\n".join(lines)


def _pyplot() -> Any:
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    return plt


def _draw_sweep(ax: Any, sweep: Sweep, target: Any = None) -> None:
    unit, f = sweep.unit
    x = sweep.x * (100.0 if sweep.variable in ("volume_fraction", "ply_share") else 1.0)
    if sweep.lower is not None and sweep.upper is not None:
        lo = np.reshape(sweep.lower, (-1, sweep.x.size))
        hi = np.reshape(sweep.upper, (-1, sweep.x.size))
        for i in range(lo.shape[0]):
            ax.fill_between(x, lo[i] / f, hi[i] / f, color="0.85", lw=0,
                            label="bounds" if i == 0 else None)
    rows = 1
    for k, v in sweep.values.items():
        y = np.reshape(v, (-1, sweep.x.size))
        rows = y.shape[0]
        for i in range(rows):
            # one line style per constituent set when several are swept at once
            ls = _STYLES[i % len(_STYLES)] if rows > 1 else ("--" if k == "cylinders" else "-")
            ax.plot(x, y[i] / f, color=_COLOURS.get(k), lw=1.3, ls=ls,
                    label=_SHORT.get(k, k) if i == 0 else None)
    if rows > 1:
        for i in range(min(rows, len(_STYLES))):
            ax.plot([], [], color="0.3", lw=1.0, ls=_STYLES[i],
                    label=f"constituents {i + 1}" + (" (and every 4th after)"
                                                    if rows > len(_STYLES) else ""))
    if target is not None:
        ax.axhline(target.value / f, color="k", lw=1, ls=":", label=f"target {target.describe()}")
    xl = {"volume_fraction": "fibre volume fraction [%]", "angle": "fibre angle [deg]",
          "ply_share": "share of 0-degree plies [%]"}.get(sweep.variable, sweep.variable)
    ax.set_xlabel(xl)
    ax.set_ylabel(f"{sweep.name} [{unit}]" if unit else sweep.name)
    ax.grid(alpha=0.3)
    ax.legend(fontsize=7, loc="best")


def _save(fig: Any, path: str | Path) -> Path:
    import textwrap

    width, height = fig.get_size_inches()
    text = textwrap.fill(CAUTION, width=max(40, int(width * 15)))  # about 15 characters per inch
    lines = text.count("\n") + 1
    fig.text(0.5, 0.005, text, ha="center", va="bottom", fontsize=7)
    fig.tight_layout(rect=(0, min(0.3, (0.05 + 0.13 * lines) / height), 1, 1))
    out = Path(path)
    fig.savefig(out, dpi=120)
    _pyplot().close(fig)
    return out


def plot_sweep(sweep: Sweep, path: str | Path) -> Path:
    """Plot a sweep: one line per model (and per constituent), the bound band shaded.

    Parameters
    ----------
    sweep : Sweep
        From :func:`micromech.design.sweep_fraction`, ``sweep_angle`` or ``sweep_ply_share``.
    path : str or Path
        Image file to write (``.png``, ``.svg``, ``.pdf``, ...).

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    InputError
        If the suffix is not an image format of :data:`~micromech.report.files.IMAGE_FORMATS`
        or the folder does not exist (checked before drawing).
    """
    check_image_path(path, "plot file")
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(6.0, 4.2))
    _draw_sweep(ax, sweep)
    return _save(fig, path)


def plot_sizing(design: Any, result: SizingResult, path: str | Path, *, points: int = 201) -> Path:
    """Plot each target's property against the fibre fraction with the target line.

    Parameters
    ----------
    design : Composite, Case or Constituents
        What was sized (the models are evaluated again over the fraction).
    result : SizingResult
        The sizing result (targets, models, packing limit).
    path : str or Path
        Image file to write (``.png``, ``.svg``, ``.pdf``, ...).
    points : int
        Fractions plotted.

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    InputError
        If the suffix is not an image format of :data:`~micromech.report.files.IMAGE_FORMATS`
        or the folder does not exist (checked before drawing).
    """
    check_image_path(path, "plot file")
    from micromech.design.sweeps import sweep_fraction

    plt = _pyplot()
    n = len(result.targets)
    ncol = min(n, 2)
    nrow = -(-n // ncol)
    fig, axes = plt.subplots(nrow, ncol, figsize=(5.6 * ncol, 4.0 * nrow), squeeze=False)
    x = np.linspace(result.lower, result.upper, points)
    for ax, t in zip(axes.ravel(), result.targets, strict=False):
        models = list(t.models) or None
        s = sweep_fraction(design, t.target.name, x, models=models, bounds=t.bounds is not None)
        _draw_sweep(ax, s, t.target)
        for k, sol in t.models.items():
            for p in sol.crossings:
                ax.plot(p.volume_fraction * 100, t.target.value / s.unit[1], "o",
                        color=_COLOURS.get(k, "k"), ms=4)
        for iv in result.common_window:
            ax.axvspan(iv.low.volume_fraction * 100, iv.high.volume_fraction * 100,
                       color="tab:green", alpha=0.12)
    for ax in axes.ravel()[n:]:
        ax.axis("off")
    return _save(fig, path)


def plot_histograms(result: MonteCarloResult, path: str | Path,
                    names: Sequence[str] | None = None) -> Path:
    """Plot the Monte Carlo histograms with the reported percentiles marked.

    Parameters
    ----------
    result : MonteCarloResult
        Monte Carlo statistics.
    path : str or Path
        Image file to write (``.png``, ``.svg``, ``.pdf``, ...).
    names : sequence of str, optional
        Outputs to plot (default: all).

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    InputError
        If the suffix is not an image format of :data:`~micromech.report.files.IMAGE_FORMATS`
        or the folder does not exist (checked before drawing).
    """
    check_image_path(path, "plot file")
    plt = _pyplot()
    keys = list(names or result.outputs)
    ncol = min(len(keys), 3) or 1
    nrow = max(1, -(-len(keys) // ncol))
    fig, axes = plt.subplots(nrow, ncol, figsize=(4.2 * ncol, 3.2 * nrow), squeeze=False)
    for ax, k in zip(axes.ravel(), keys, strict=False):
        s = result[k]
        unit, f = property_unit(k)
        e = s.edges / f
        ax.bar(e[:-1], s.counts, width=np.diff(e), align="edge", color="tab:blue", alpha=0.7)
        for p, v in s.percentiles.items():
            ax.axvline(v / f, color="k", ls=":", lw=1)
            ax.text(v / f, ax.get_ylim()[1] * 0.95, f"P{p:g}", fontsize=7, ha="center")
        ax.set_xlabel(f"{k} [{unit}]" if unit else k)
        ax.set_ylabel("samples")
    for ax in axes.ravel()[len(keys):]:
        ax.axis("off")
    return _save(fig, path)
