"""Writing fibre cells: CSV text for meshers, a terminal summary, a drawing of the cell.

Used by :class:`micromech.rve.geometry.FibreArrangement`; every file carries :data:`CAUTION`.

Axes. A cell is generated in its own cross-section plane with coordinates (u, v) in
``[0, Lu) x [0, Lv)``; the fibres run along the third axis. The writers place that plane in
the model's axes by the fibre axis (:data:`FIBRE_AXES`): ``"z"`` (the default) writes the
centres as x, y with the fibres along z; ``"x"`` writes them as y, z with the fibres along x,
the convention of a unidirectional ``micromech check`` cell (x = 1 the fibre axis). The mapping
(u, v) -> (y, z) is the cyclic one, so the axes stay right-handed.
"""

from __future__ import annotations

import io
import os
from pathlib import Path
from typing import TYPE_CHECKING

from micromech.errors import InputError
from micromech.report.files import check_image_path
from micromech.report.markdown import write_atomic
from micromech.rve.cellstats import rve_size_guidance
from micromech.safety import CAUTION
from micromech.units import parse_quantity

if TYPE_CHECKING:  # pragma: no cover
    from micromech.rve.geometry import FibreArrangement

__all__ = ["CAUTION", "FIBRE_AXES", "arrangement_text", "axes_note", "csv_text",
           "plot_arrangement", "section_axes", "write_atomic"]

#: Fibre axis -> the two axes of the cross-section plane the centres are written in.
FIBRE_AXES: dict[str, tuple[str, str]] = {"z": ("x", "y"), "x": ("y", "z")}


def section_axes(fibre_axis: str = "z") -> tuple[str, str]:
    """Names of the two cross-section axes for a fibre axis.

    Parameters
    ----------
    fibre_axis : {"z", "x"}
        Axis the fibres run along.

    Returns
    -------
    tuple of str
        ``("x", "y")`` for ``"z"``, ``("y", "z")`` for ``"x"``.

    Raises
    ------
    InputError
        For another fibre axis.
    """
    if fibre_axis not in FIBRE_AXES:
        raise InputError(f"fibre_axis = {fibre_axis!r}: choose 'z' (centres in x, y) or 'x' "
                         "(centres in y, z, fibres along x as in a unidirectional check cell)")
    return FIBRE_AXES[fibre_axis]


def axes_note(fibre_axis: str = "z") -> str:
    """One sentence on the axes of the written centres.

    Parameters
    ----------
    fibre_axis : {"z", "x"}
        Axis the fibres run along.

    Returns
    -------
    str
        E.g. ``"fibres along z; centres in the x-y plane; ..."``.
    """
    a, b = section_axes(fibre_axis)
    text = f"fibres along {fibre_axis}; centres in the {a}-{b} plane"
    if fibre_axis == "x":
        return text + " (as in a unidirectional check cell, x = 1 the fibre axis)"
    return text + (" (a unidirectional check cell has its fibres along x; --fibre-axis x"
                   " writes the centres as y, z)")


def csv_text(arrangement: FibreArrangement, unit: str = "um", fibre_axis: str = "z") -> str:
    """CSV text of the circles of a cell: the fibres, then the images that cut the faces.

    Lines starting with ``#`` describe the cell (axes, method, seed, cell size, fraction,
    caution). Then one header line and one row per circle. Columns (fibre axis ``"z"``; with
    ``"x"`` the two centre columns are ``y_<unit>``, ``z_<unit>``):

    ``fibre``
        Fibre index, 0-based; an image row repeats the index of the fibre it copies.
    ``x_<unit>``, ``y_<unit>``
        Centre; the cell is ``[0, Lx] x [0, Ly]``, so image centres lie outside it.
    ``radius_<unit>``
        Fibre radius.
    ``image``
        0 for a fibre, 1 for a periodic image.

    Parameters
    ----------
    arrangement : FibreArrangement
        The cell.
    unit : str
        Length unit of the coordinates (``"um"``, ``"mm"``, ``"m"``, ...).
    fibre_axis : {"z", "x"}
        Axis the fibres run along (see :data:`FIBRE_AXES`).

    Returns
    -------
    str
        The file contents.

    Raises
    ------
    InputError
        For a unit that is not a positive length, or an unknown fibre axis.
    """
    a_name, b_name = section_axes(fibre_axis)
    factor = parse_quantity(f"1 {unit}", "length", "unit")
    if not factor > 0.0:
        raise InputError(f"unit: {unit!r} must be a positive length unit")
    name = unit.strip().replace(" ", "")
    a = arrangement
    centres, fibre, image = a.circles()
    lx, ly = a.cell_size
    lines = [
        "# fibre centres of a periodic RVE cell; images of fibres cutting the faces flagged",
        f"# axes: {axes_note(fibre_axis)}",
        f"# method: {a.method}; seed: {a.seed}",
        f"# cell: {a_name} from 0 to {lx / factor:.12g}, {b_name} from 0 to {ly / factor:.12g} "
        f"{name}",
        f"# fibre diameter: {a.diameter / factor:.12g} {name}; fibres: {a.n_fibres}; "
        f"images: {int(image.sum())}",
        f"# volume fraction: {a.volume_fraction:.10g}; "
        f"required min gap: {a.min_gap / factor:.12g} {name}",
        f"# {CAUTION}",
        f"fibre,{a_name}_{name},{b_name}_{name},radius_{name},image",
    ]
    r = a.radius / factor
    for c, f, m in zip(centres / factor, fibre, image, strict=True):
        lines.append(f"{int(f)},{c[0]:.12g},{c[1]:.12g},{r:.12g},{int(m)}")
    return "\n".join(lines) + "\n"


def arrangement_text(
    arrangement: FibreArrangement, title: str, *, written: str | os.PathLike[str] | None = None,
    plot: str | os.PathLike[str] | None = None, fibre_axis: str = "z",
) -> str:
    """Terminal summary of a cell: axes, fibres, fraction, size, neighbour statistics, guidance.

    Parameters
    ----------
    arrangement : FibreArrangement
        The cell.
    title : str
        First line (underlined).
    written, plot : path-like, optional
        Files written for the cell (centres, drawing), listed at the end.
    fibre_axis : {"z", "x"}
        Axis the fibres run along in the files written (see :data:`FIBRE_AXES`).

    Returns
    -------
    str
        The text, ending with the caution (no final newline).
    """
    a_name, b_name = section_axes(fibre_axis)
    a = arrangement
    lx, ly = a.cell_size
    r, d, st = a.radius, a.diameter, a.stats
    guide = rve_size_guidance(a)
    rows = [
        ("packing", a.method + ("" if a.seed is None else f" (seed {a.seed})")),
        ("axes", axes_note(fibre_axis)),
        ("fibres", f"{a.n_fibres} (+{a.images()[1].size} images cutting the faces)"),
        ("fibre diameter", f"{d * 1e6:.4g} um"),
        ("volume fraction", f"achieved {a.volume_fraction:.4f} (asked {a.target_fraction:.4f})"),
        ("cell size", f"{lx * 1e6:.4g} x {ly * 1e6:.4g} um ({a_name} by {b_name}) = "
                      f"{lx / r:.4g} x {ly / r:.4g} fibre radii"),
        ("required min gap", f"{a.min_gap * 1e6:.4g} um ({a.min_gap / d:.3g} d)"),
        ("nearest distance [d]", f"mean {st.distance_mean:.4f}, min {st.distance_min:.4f}, "
                                 f"max {st.distance_max:.4f}, std {st.distance_std:.4f}"),
        ("nearest gap [d]", f"mean {st.gap_mean:.4f}, min {st.gap_min:.4f}, "
                            f"std {st.gap_std:.4f}"),
        ("RVE size guidance", f"{guide.verdict}: {guide.message}"),
    ]
    if written is not None:
        rows.append(("written", str(written)))
    if plot is not None:
        rows.append(("plot", str(plot)))
    lines = [title, "-" * len(title), *(f"  {name:<22}{value}" for name, value in rows)]
    return "\n".join(lines) + f"\n\n{CAUTION}"


def plot_arrangement(arrangement: FibreArrangement, path: str | os.PathLike[str],
                     fibre_axis: str = "z") -> Path:
    """Draw the cell, its fibres and their images to an image file (matplotlib, Agg).

    Parameters
    ----------
    arrangement : FibreArrangement
        The cell to draw.
    path : str or path-like
        Output image, format from the suffix (one of
        :data:`~micromech.report.files.IMAGE_FORMATS`); replaced atomically.
    fibre_axis : {"z", "x"}
        Axis the fibres run along; names the plot axes (see :data:`FIBRE_AXES`).

    Returns
    -------
    Path
        The path written.

    Raises
    ------
    InputError
        For an unknown fibre axis, a suffix that is not an image format, or a missing folder.
    """
    a_name, b_name = section_axes(fibre_axis)
    out = check_image_path(path, "plot file")
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    from matplotlib.patches import Circle, Rectangle

    um = 1e6
    lx, ly = arrangement.cell_size
    centres, _, image = arrangement.circles()
    fig, ax = plt.subplots(figsize=(6.0, 6.0 * min(2.0, max(0.5, ly / lx))))
    try:
        for c, m in zip(centres * um, image, strict=True):
            ax.add_patch(Circle((c[0], c[1]), arrangement.radius * um,
                                facecolor="0.85" if m else "tab:blue",
                                edgecolor="0.4" if m else "navy",
                                linestyle="--" if m else "-", linewidth=0.6))
        ax.add_patch(Rectangle((0, 0), lx * um, ly * um, fill=False, edgecolor="k", linewidth=1.2))
        pad = arrangement.diameter * um
        ax.set_xlim(-pad, lx * um + pad)
        ax.set_ylim(-pad, ly * um + pad)
        ax.set_aspect("equal")
        ax.set_xlabel(f"{a_name} [um]")
        ax.set_ylabel(f"{b_name} [um]")
        ax.set_title(f"{arrangement.method} cell: {arrangement.n_fibres} fibres along "
                     f"{fibre_axis}, Vf = {arrangement.volume_fraction:.4f} (images dashed)",
                     fontsize=9)
        fig.text(0.5, 0.005, CAUTION, ha="center", va="bottom", fontsize=5.5, wrap=True)
        buf = io.BytesIO()
        fig.savefig(buf, format=out.suffix.lower().lstrip("."), dpi=150, bbox_inches="tight")
    finally:
        plt.close(fig)
    return write_atomic(out, buf.getvalue())
