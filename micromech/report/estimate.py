"""Terminal table and fraction plot for the ``micromech estimate`` command.

Both read an :class:`~micromech.homogenize.Estimates` and only format it; the plot evaluates the
same estimates over a fibre-fraction sweep with one vectorised call.
"""

from __future__ import annotations

import textwrap
from pathlib import Path
from typing import Any

import numpy as np

from micromech.homogenize.estimate import BOUND_KEYS, MODEL_KEYS, Estimates, estimate
from micromech.homogenize.strength import CAUTION
from micromech.report.files import IMAGE_FORMATS, check_image_path

__all__ = ["estimate_table", "plot_estimates", "check_plot_path", "CAUTION", "PROPERTIES",
           "PLOT_FORMATS"]

#: Image formats the plot may be written in (by file suffix): the one rule of every command.
PLOT_FORMATS: tuple[str, ...] = IMAGE_FORMATS

#: Rows of the table: name, label, unit, factor from SI.
PROPERTIES: tuple[tuple[str, str, str, float], ...] = (
    ("E1", "E1", "GPa", 1e-9),
    ("E2", "E2", "GPa", 1e-9),
    ("G12", "G12", "GPa", 1e-9),
    ("G23", "G23", "GPa", 1e-9),
    ("nu12", "nu12", "-", 1.0),
    ("nu23", "nu23", "-", 1.0),
    ("alpha1", "alpha1", "1e-6/K", 1e6),
    ("alpha2", "alpha2", "1e-6/K", 1e6),
)
#: Rows for fibres random in the 1-2 plane (axis 3 the plate normal): in-plane and normal values.
PLANAR_PROPERTIES: tuple[tuple[str, str, str, float], ...] = (
    ("E1", "E1 = E2", "GPa", 1e-9),
    ("E3", "E3", "GPa", 1e-9),
    ("G12", "G12", "GPa", 1e-9),
    ("G13", "G13 = G23", "GPa", 1e-9),
    ("nu12", "nu12", "-", 1.0),
    ("nu13", "nu13", "-", 1.0),
    ("alpha1", "alpha1", "1e-6/K", 1e6),
    ("alpha3", "alpha3", "1e-6/K", 1e6),
)
#: Rows for fibres random in space (isotropic results).
ISOTROPIC_PROPERTIES: tuple[tuple[str, str, str, float], ...] = (
    ("E1", "E", "GPa", 1e-9),
    ("G12", "G", "GPa", 1e-9),
    ("nu12", "nu", "-", 1.0),
    ("alpha1", "alpha", "1e-6/K", 1e6),
)
_ROWS = {"aligned": PROPERTIES, "random_in_plane": PLANAR_PROPERTIES,
         "random_3d": ISOTROPIC_PROPERTIES}
#: Property name -> (unit, factor from SI), from every row table (the plot's axis labels).
_UNITS = {name: (unit, factor) for rows in _ROWS.values() for name, _, unit, factor in rows}
_PLOT_DEFAULTS = {
    "aligned": ("E1", "E2", "G12", "G23", "nu12", "alpha2"),
    "random_in_plane": ("E1", "E3", "G12", "G13", "nu12", "alpha1"),
    "random_3d": ("E1", "G12", "nu12", "alpha1"),
}
_ORIENTATION_TEXT = {
    "aligned": "aligned fibres (axis 1)",
    "random_in_plane": "fibres random in the 1-2 plane (axis 3 normal)",
    "random_3d": "fibres random in space (isotropic)",
}

_SHORT = {
    "voigt": "Voigt", "reuss": "Reuss", "hashin_shtrikman_lower": "HS low",
    "hashin_shtrikman_upper": "HS up", "rule_of_mixtures": "RoM", "halpin_tsai": "H-T",
    "chamis": "Chamis", "cylinders": "CCA", "mori_tanaka": "M-T",
}

_COLOURS = {"rule_of_mixtures": "tab:blue", "halpin_tsai": "tab:orange", "chamis": "tab:green",
            "cylinders": "tab:red", "mori_tanaka": "tab:purple"}

#: Footnote of values in parentheses (a bound model's value that is not a bound).
NOT_A_BOUND_NOTE = ("( ) not a bound: the value of a bound model for a constant it does not "
                    "bound (Voigt and Reuss bound the stiffness and so the moduli, not Poisson "
                    "ratios; Hashin-Shtrikman bounds nu12 and the CTEs only where stated in "
                    "its source)")
#: Why an estimate may leave the bounds.
OUTSIDE_NOTE = ("These estimates are known approximations, not bounds: the rule of mixtures (and "
                "its inverse), Halpin-Tsai and Chamis leave the bounds for some constants (Hill "
                "1964: E1 and nu12 of aligned fibres differ slightly from the rule of mixtures). "
                "The bounds are rigorous: an estimate outside them is off by at least the gap.")

# Lower bounds first, estimates, then upper bounds: the table reads as a band.
_ORDER = ("reuss", "hashin_shtrikman_lower", "rule_of_mixtures", "halpin_tsai", "chamis",
          "cylinders", "mori_tanaka", "hashin_shtrikman_upper", "voigt")


def _fmt(v: Any, factor: float) -> str:
    if v is None:
        return "-"
    a = np.asarray(v, dtype=np.float64) * factor
    if a.size == 0 or not np.all(np.isfinite(a)):
        return "-"
    if a.size == 1:
        return f"{float(a.ravel()[0]):.4g}"
    return f"{float(a.min()):.3g}..{float(a.max()):.3g}"


def _cell(est: Estimates, key: str, name: str, factor: float) -> tuple[str, bool]:
    """Format one model's constant; in parentheses when a bound model's value is no bound.

    Returns the text and whether it was put in parentheses.
    """
    text = _fmt(est.models[key].get(name), factor)
    if key in BOUND_KEYS and text != "-" and not est.is_bound(key, name):
        return f"({text})", True
    return text, False


def _outside_lines(est: Estimates, rows: tuple[tuple[str, str, str, float], ...]) -> list[str]:
    """One line per estimate that leaves the bounds of the table, naming constants and gaps."""
    labels = {name: (label, unit, factor) for name, label, unit, factor in rows}
    several = np.asarray(est.composite.volume_fraction).size > 1
    by_model: dict[str, list[str]] = {}
    for x in est.outside_bounds(tuple(labels)):
        label, unit, factor = labels[x.name]
        rel = "<" if x.side == "below" else ">"
        at = f" at fibre fraction {x.fraction:.3g}" if several else ""
        u = "" if unit == "-" else f" {unit}"
        by_model.setdefault(x.model, []).append(
            f"{label} {x.value * factor:.4g} {rel} {x.bound * factor:.4g}{u} "
            f"({_SHORT[x.bound_model]}){at}")
    lines: list[str] = []
    for key, items in by_model.items():
        line = f"  {_SHORT[key]:<7}"
        for j, item in enumerate(items):  # whole items per line
            text = item + (";" if j < len(items) - 1 else "")
            if len(line) + 1 + len(text) > 96 and line.strip() != _SHORT[key]:
                lines.append(line)
                line = " " * 9
            line += (" " if not line.endswith(" ") else "") + text
        lines.append(line)
    if lines:
        lines = ["", "outside the bounds of this table:", *lines,
                 *textwrap.wrap(OUTSIDE_NOTE, width=96, initial_indent="  ",
                                subsequent_indent="  ")]
    return lines


def estimate_table(est: Estimates) -> str:
    """Format the estimates as a plain-text table (moduli in GPa, strengths in MPa).

    Parameters
    ----------
    est : Estimates
        The results of :func:`micromech.homogenize.estimate`.

    Returns
    -------
    str
        Header with fraction, inclusion and fibre orientation; property rows (for random
        orientations the in-plane and normal, or isotropic, constants); columns ordered lower
        bounds, estimates, upper bounds (a bound model's value that is not a bound, such as a
        Voigt or Reuss Poisson ratio, in parentheses with a footnote); the estimates that leave
        the bounds of the table; then the strength estimates, the sources, the absent models,
        further notes and the caution.
    """
    comp = est.composite
    orientation = getattr(comp, "orientation", "aligned")
    keys = [k for k in _ORDER if k in est.models]
    vf = np.asarray(comp.volume_fraction)
    head = f"{est.case or 'composite'}: fibre fraction {_fmt(vf, 1.0)}, " \
        f"{getattr(comp, 'inclusion', 'continuous')}"
    if getattr(comp, "aspect_ratio", None) not in (None, 1.0):
        head += f" (aspect ratio {comp.aspect_ratio:g})"
    vv = np.asarray(getattr(comp, "void_fraction", 0.0))
    if np.any(vv > 0):
        head += f", void fraction {_fmt(vv, 1.0)}"
    head += f", {_ORIENTATION_TEXT.get(orientation, orientation)}"
    lines = [head, ""]
    width = 10
    label_w = 16
    hdr = "property".ljust(label_w) + "".join(_SHORT[k].rjust(width) for k in keys)
    kinds = "".ljust(label_w) + "".join(
        ("bound" if k in BOUND_KEYS else "estimate").rjust(width) for k in keys)
    lines += [hdr, kinds, "-" * len(hdr)]
    rows = _ROWS.get(orientation, PROPERTIES)
    marked = False
    for name, label, unit, factor in rows:
        row = f"{label} [{unit}]".ljust(label_w)
        for k in keys:
            text, paren = _cell(est, k, name, factor)
            marked |= paren
            row += text.rjust(width)
        lines.append(row)
    if marked:
        lines += textwrap.wrap(NOT_A_BOUND_NOTE, width=96)
    lines += _outside_lines(est, rows)
    if est.strengths:
        lines += ["", "strength".ljust(40) + "MPa".rjust(10) + "  kind".ljust(14) + "  source"]
        lines.append("-" * 96)
        for k, s in est.strengths.items():
            lines.append(f"{k.replace('_', ' '):<40}{_fmt(s.value, 1e-6):>10}  {s.kind:<12}"
                         f"  {s.source}")
    lines += ["", "sources:"]
    lines += [f"  {_SHORT[k]:<7} {est.models[k].source}" for k in keys]
    absent = {k: v for k, v in est.notes.items() if k in MODEL_KEYS}
    other = {k: v for k, v in est.notes.items() if k not in MODEL_KEYS}
    if absent:
        lines += ["", "not applied:"]
        lines += [f"  {k}: {v}" for k, v in absent.items()]
    if other:
        lines += ["", "notes:"]
        lines += [f"  {k}: {v}" for k, v in other.items()]
    lines += ["", f"Caution: {CAUTION}"]
    return "\n".join(lines)


#: Kept under its earlier name: the one image-path rule of every plot (report.files).
check_plot_path = check_image_path


def plot_estimates(
    est: Estimates, path: str | Path, *, points: int = 101,
    properties: tuple[str, ...] | None = None,
) -> Path:
    """Plot each property against fibre fraction, bounds shaded, the case's fraction marked.

    Parameters
    ----------
    est : Estimates
        Results for the case; its composite is swept from 0 to its packing limit.
    path : str or Path
        PNG file to write.
    points : int
        Number of fractions.
    properties : tuple of str, optional
        Constants to plot (those no model gives are skipped); default by fibre orientation:
        aligned ``E1 E2 G12 G23 nu12 alpha2``, random in plane ``E1 E3 G12 G13 nu12 alpha1``,
        random in space ``E1 G12 nu12 alpha1``.

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    InputError
        If the file name has no supported image suffix or its folder does not exist.
    """
    out = check_plot_path(path)
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    comp = est.composite
    if properties is None:
        properties = _PLOT_DEFAULTS.get(getattr(comp, "orientation", "aligned"),
                                        _PLOT_DEFAULTS["aligned"])
    limit = float(getattr(comp, "packing_limit", 1.0))
    vv = float(np.max(np.asarray(getattr(comp, "void_fraction", 0.0))))
    top = min(limit, 1.0 - vv)
    v = np.linspace(0.0, top, points)
    sweep = estimate(comp.with_fraction(v), case=est.case, strengths=False)
    names = [p for p in properties if any(sweep.models[k].get(p) is not None for k in sweep)]
    ncol = 3
    nrow = max(1, -(-len(names) // ncol))
    fig, axes = plt.subplots(nrow, ncol, figsize=(4.2 * ncol, 3.3 * nrow), squeeze=False)
    case_vf = np.atleast_1d(np.asarray(comp.volume_fraction, dtype=float))
    for ax, name in zip(axes.ravel(), names, strict=False):
        unit, factor = _UNITS.get(name, ("", 1.0))
        band = sweep.band(name)
        if band is not None:
            ax.fill_between(v * 100, band[0] * factor, band[1] * factor, color="0.85",
                            label="bounds")
        for k in MODEL_KEYS:
            if k in BOUND_KEYS or k not in sweep.models:
                continue
            y = sweep.models[k].get(name)
            if y is not None:
                ls = "--" if k == "cylinders" else "-"  # equal to Mori-Tanaka for fibres
                ax.plot(v * 100, np.broadcast_to(y, v.shape) * factor, label=_SHORT[k], lw=1.3,
                        color=_COLOURS.get(k), ls=ls)
        for x in case_vf:
            ax.axvline(float(x) * 100, color="k", ls=":", lw=1)
        ax.set_xlabel("fibre volume fraction [%]")
        ax.set_ylabel(f"{name} [{unit}]")
        ax.grid(alpha=0.3)
    for ax in axes.ravel()[len(names):]:
        ax.axis("off")
    if names:
        axes.ravel()[0].legend(fontsize=7, loc="best")
    fig.suptitle(f"{est.case or 'composite'}: estimates and bounds (dotted: case fraction)",
                 fontsize=10)
    fig.text(0.5, 0.005, CAUTION, ha="center", fontsize=7)
    fig.tight_layout(rect=(0, 0.03, 1, 0.96))
    fig.savefig(out, dpi=120)
    plt.close(fig)
    return out
