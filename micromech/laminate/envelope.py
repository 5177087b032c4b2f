"""First-ply failure envelopes of a laminate in any two load axes, as arrays and as a plot.

An envelope is traced by rays: for each direction phi in the plane of two axes, the unit load
(cos phi along the first axis, sin phi along the second, everything else zero) is scaled by its
first-ply strength ratio. Axes are force or moment resultants (``Nx, Ny, Nxy, Mx, My, Mxy``) or
average laminate stresses (``sx, sy, sxy`` = N / h, Pa). A temperature change is held fixed, so
the envelope of a laminate with residual stresses is shifted, not scaled. All directions are
solved at once (vectorised over the rays).

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Sec. 5.3.
.. [2] Daniel, I. M., Ishai, O. (2006). *Engineering Mechanics of Composite Materials*, 2nd ed.,
   Sec. 12.3 (first-ply failure envelopes). Section numbers from memory.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
from numpy.typing import NDArray

from micromech.errors import InputError
from micromech.laminate.clt import LOAD_NAMES, Laminate
from micromech.laminate.failure import MODES
from micromech.laminate.progressive import ply_strength_ratios
from micromech.report.files import check_image_path
from micromech.safety import CAUTION

__all__ = ["DISPLAY_UNITS", "ENVELOPE_AXES", "Envelope", "failure_envelope", "plot_envelopes"]

Array = NDArray[np.float64]

#: Axis names accepted by :func:`failure_envelope`, with their SI unit.
ENVELOPE_AXES: dict[str, str] = {
    "Nx": "N/m", "Ny": "N/m", "Nxy": "N/m", "Mx": "N", "My": "N", "Mxy": "N",
    "sx": "Pa", "sy": "Pa", "sxy": "Pa",
}

_STRESS_AXES = {"sx": 0, "sy": 1, "sxy": 2}

#: How an axis of each SI unit is shown in plots and tables: (factor from SI, unit shown).
DISPLAY_UNITS: dict[str, tuple[float, str]] = {
    "N/m": (1e-3, "N/mm"), "N": (1.0, "N*m/m"), "Pa": (1e-6, "MPa"),
}


@dataclass(frozen=True, eq=False)
class Envelope:
    """A first-ply failure envelope.

    Attributes
    ----------
    axes : tuple of str
        The two axes.
    criterion : str
        Failure criterion.
    phi : ndarray, shape (m,)
        Ray directions, radians.
    x, y : ndarray, shape (m,)
        Failure loads along the two axes, SI (N/m, N or Pa); inf where the ray never fails.
    ratio : ndarray, shape (m,)
        First-ply strength ratio of the unit load along each ray.
    mode : ndarray of str, shape (m,)
        Failure mode of the first ply to fail on each ray.
    ply : ndarray of int, shape (m,)
        Index of that ply (-1 where none fails).
    delta_T : float
        Temperature change held fixed, K.
    intercepts : dict of str to float
        First-ply failure loads along the four half axes, solved exactly whatever the number of
        rays: keys ``"+A"``, ``"-A"``, ``"+B"``, ``"-B"`` with A, B the axis names, signed values
        in SI (``-A`` is negative), inf (with the sign of the half axis) where it never fails.
    """

    axes: tuple[str, str]
    criterion: str
    phi: Array
    x: Array
    y: Array
    ratio: Array
    mode: NDArray[np.str_]
    ply: NDArray[np.int64]
    delta_T: float
    intercepts: dict[str, float] = field(default_factory=dict)

    @property
    def units(self) -> tuple[str, str]:
        """SI units of the two axes."""
        return ENVELOPE_AXES[self.axes[0]], ENVELOPE_AXES[self.axes[1]]

    def as_dict(self) -> dict[str, object]:
        """Return the JSON form (SI; ``None`` where a ray never fails).

        Returns
        -------
        dict
            axes, units, criterion, delta_T, x, y, mode, ply, intercepts.
        """
        def clean(a: Array) -> list[float | None]:
            return [float(v) if np.isfinite(v) else None for v in a]

        return {
            "axes": list(self.axes), "units": list(self.units), "criterion": self.criterion,
            "delta_T": self.delta_T, "x": clean(self.x), "y": clean(self.y),
            "mode": self.mode.tolist(), "ply": self.ply.tolist(),
            "intercepts": {k: (float(v) if np.isfinite(v) else None)
                           for k, v in self.intercepts.items()},
        }


def _unit_loads(laminate: Laminate, axes: tuple[str, str], a: Array, b: Array) -> Array:
    """Resultants of shape (m, 6) with components a along the first axis and b the second."""
    loads = np.zeros(a.shape + (6,))
    for axis, comp in zip(axes, (a, b), strict=True):
        if axis in _STRESS_AXES:
            loads[..., _STRESS_AXES[axis]] += comp * laminate.thickness
        else:
            loads[..., LOAD_NAMES.index(axis)] += comp
    return loads


def failure_envelope(
    laminate: Laminate,
    axes: Sequence[str] | str = ("Nx", "Ny"),
    criterion: str = "tsai_wu",
    *,
    n_points: int = 361,
    delta_T: float = 0.0,
    f12_star: float = -0.5,
) -> Envelope:
    """First-ply failure envelope of a laminate in the plane of two load axes.

    Parameters
    ----------
    laminate : Laminate
        The laminate; every ply needs Xt, Xc, Yt, Yc, S12.
    axes : pair of str or "A,B"
        Two different names among ``Nx, Ny, Nxy, Mx, My, Mxy, sx, sy, sxy``.
    criterion : str
        Failure criterion key.
    n_points : int
        Number of rays over the full circle (>= 8).
    delta_T : float
        Temperature change held fixed, K.
    f12_star : float
        Tsai-Wu interaction term.

    Returns
    -------
    Envelope
        Failure loads along every ray.

    Raises
    ------
    InputError
        For unknown or repeated axes, or too few points.

    References
    ----------
    Kaw (2006), Sec. 5.3; Daniel and Ishai (2006), Sec. 12.3.
    """
    if isinstance(axes, str):
        axes = [a.strip() for a in axes.split(",")]
    ax = tuple(axes)
    if len(ax) != 2:
        raise InputError(f"envelope axes: expected two names such as 'Nx,Ny', got {axes!r}")
    for a in ax:
        if a not in ENVELOPE_AXES:
            raise InputError(
                f"envelope axis {a!r}: unknown; choose from {', '.join(ENVELOPE_AXES)}"
            )
    if ax[0] == ax[1]:
        raise InputError(f"envelope axes: the two axes must differ, got {ax[0]!r} twice")
    if int(n_points) < 8:
        raise InputError(f"n_points = {n_points}: at least 8 rays are needed")
    m = int(n_points)
    phi = np.linspace(0.0, 2.0 * np.pi, m)
    # the rays, then the four half axes (exact unit loads: no round-off in cos and sin)
    loads = _unit_loads(laminate, (ax[0], ax[1]),
                        np.concatenate([np.cos(phi), [1.0, -1.0, 0.0, 0.0]]),
                        np.concatenate([np.sin(phi), [0.0, 0.0, 1.0, -1.0]]))
    res = ply_strength_ratios(laminate, loads, delta_T, criterion, f12_star=f12_star)
    R = res.strength_ratio.reshape((m + 4, -1))
    codes = res.mode_code.reshape((m + 4, -1))
    k = np.argmin(R, -1)
    ratio_all = np.take_along_axis(R, k[:, None], -1)[:, 0]
    ratio = ratio_all[:m]
    mode = np.asarray(MODES)[np.take_along_axis(codes, k[:, None], -1)[:m, 0]]
    ply = np.where(np.isfinite(ratio), k[:m] // 3, -1).astype(np.int64)
    with np.errstate(invalid="ignore"):
        x = np.where(np.isfinite(ratio), ratio * np.cos(phi), np.inf)
        y = np.where(np.isfinite(ratio), ratio * np.sin(phi), np.inf)
    signs = (1.0, -1.0, 1.0, -1.0)
    keys = (f"+{ax[0]}", f"-{ax[0]}", f"+{ax[1]}", f"-{ax[1]}")
    intercepts = {key: float(sg * r) for key, sg, r in zip(keys, signs, ratio_all[m:],
                                                            strict=True)}
    return Envelope((ax[0], ax[1]), criterion, phi, x, y, ratio, mode, ply, float(delta_T),
                    intercepts)


def plot_envelopes(
    envelopes: Sequence[Envelope], path: str | Path, title: str = ""
) -> Path:
    """Draw one or more envelopes (same axes) into an image file.

    Parameters
    ----------
    envelopes : sequence of Envelope
        Envelopes to overlay, e.g. one per criterion.
    path : str or Path
        Output file; the format follows the suffix, one of
        :data:`micromech.report.files.IMAGE_FORMATS` (``.png`` recommended).
    title : str
        Plot title.

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    InputError
        If no envelope is given, their axes differ, the file suffix is not one of
        :data:`~micromech.report.files.IMAGE_FORMATS`, or the directory does not exist.
    """
    out = check_image_path(path, "plot file")
    if not envelopes:
        raise InputError("plot_envelopes: no envelope given")
    axes = envelopes[0].axes
    for e in envelopes:
        if e.axes != axes:
            raise InputError(f"plot_envelopes: axes differ ({axes} and {e.axes})")
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    (fx, ux), (fy, uy) = (DISPLAY_UNITS[u] for u in envelopes[0].units)
    fig = Figure(figsize=(6.4, 6.0))
    FigureCanvasAgg(fig)
    ax = fig.add_subplot()
    for e in envelopes:
        ok = np.isfinite(e.x) & np.isfinite(e.y)
        ax.plot(e.x[ok] * fx, e.y[ok] * fy, label=e.criterion.replace("_", " "))
    ax.axhline(0.0, color="0.6", lw=0.6)
    ax.axvline(0.0, color="0.6", lw=0.6)
    ax.set_xlabel(f"{axes[0]} ({ux})")
    ax.set_ylabel(f"{axes[1]} ({uy})")
    dT = envelopes[0].delta_T
    extra = f", delta_T = {dT:g} K held fixed" if dT else ""
    ax.set_title((title + "\n" if title else "") + f"first-ply failure envelope{extra}",
                 fontsize=10)
    ax.legend(fontsize=8)
    ax.grid(True, alpha=0.3)
    fig.text(0.5, 0.01, CAUTION, ha="center", va="bottom", fontsize=6.5, wrap=True)
    fig.subplots_adjust(bottom=0.14)
    fig.savefig(out, dpi=120)
    return out
