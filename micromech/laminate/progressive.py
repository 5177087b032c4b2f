"""Ply strength ratios in a laminate, first-ply failure and last-ply failure by ply discount.

Load path. The resultants (Nx ... Mxy) give a load direction; a temperature change, if any, is
held fixed. The load factor lambda multiplies the resultants only: the ply stresses are
``thermal + lambda * mechanical`` and every strength ratio reported here is such a lambda
(see :mod:`micromech.laminate.failure`). Each ply is checked at its bottom, middle and top; its
strength ratio is the smallest of the three.

Ply discount. At each failure event the failed plies lose stiffness according to the mode: a
fibre failure discounts E1, E2, nu12 and G12; a matrix or shear failure discounts E2, nu12 and
G12 and keeps E1 (the discounted constants are multiplied by ``residual``, a small number,
rather than set to zero, so that the ABD matrix stays invertible). A ply with a matrix failure
is afterwards checked in its fibre direction only (s22 and s12 set to zero), so that it can still
fail by its fibres. The laminate is reloaded along the same direction; a ply whose new strength
ratio is below the current load factor fails at that same load factor (a cascade). The process
ends when the laminate has collapsed, or when no remaining ply can fail along the load
direction. Collapse: every ply has failed by its fibres, or the compliance of the laminate along
the load direction, v.ABD^-1.v, has grown beyond 1/sqrt(residual) times its intact value (only
the residual stiffness is left, e.g. a [+-45]s laminate whose matrix has failed under uniaxial
load is a mechanism). The load factor of the last event is the last-ply failure load.

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Sec. 5.3
   (first-ply and last-ply failure, ply-discount method).
.. [2] Daniel, I. M., Ishai, O. (2006). *Engineering Mechanics of Composite Materials*, 2nd ed.,
   Sec. 12.4 (progressive failure of laminates). Section numbers from memory.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.laminate.clt import Laminate, LaminateResponse, load_vector
from micromech.laminate.failure import MODES, CriterionResult, evaluate_criterion
from micromech.laminate.ply import STRENGTH_NAMES, STRENGTHS_HINT, PlyStrengths

__all__ = [
    "ply_strength_ratios",
    "FailureEvent",
    "FailureSequence",
    "first_ply_failure",
    "last_ply_failure",
]

Array = NDArray[np.float64]

_FIBRE_MODES = {"fibre_tension", "fibre_compression"}


def _stacked_strengths(laminate: Laminate) -> PlyStrengths:
    """Strengths of all plies as arrays of shape (n, 1) (to broadcast over the 3 points)."""
    values: dict[str, Any] = {}
    for name in STRENGTH_NAMES:
        col: list[float] = []
        for i, p in enumerate(laminate.plies):
            s = p.material.strengths
            v = None if s is None else getattr(s, name)
            if v is None:
                if name == "S23":
                    col = []
                    break
                raise InputError(
                    f"ply {i + 1} of {laminate.n_plies} from the bottom "
                    f"({p.material.name or 'unnamed'}): strength {name} missing; failure "
                    f"analysis needs Xt, Xc, Yt, Yc and S12 for every ply: {STRENGTHS_HINT}"
                )
            col.append(float(v))
        values[name] = np.array(col)[:, None] if col else None
    return PlyStrengths(**values)


def ply_strength_ratios(
    laminate: Laminate,
    loads: Mapping[str, Any] | ArrayLike,
    delta_T: float | None = None,
    criterion: str = "tsai_wu",
    *,
    f12_star: float = -0.5,
    fibre_only: ArrayLike | None = None,
    response: LaminateResponse | None = None,
) -> CriterionResult:
    """Strength ratio, failure index and mode of every ply at its bottom, middle and top.

    Parameters
    ----------
    laminate : Laminate
        The laminate; every ply needs Xt, Xc, Yt, Yc, S12.
    loads : mapping or array_like, shape (..., 6)
        Resultants (see :func:`~micromech.laminate.clt.load_vector`); a batch is allowed.
    delta_T : float, optional
        Temperature change held fixed, K (overrides ``delta_T`` in ``loads``).
    criterion : str
        One of ``max_stress``, ``max_strain``, ``tsai_hill``, ``tsai_wu``, ``hashin``.
    f12_star : float
        Tsai-Wu interaction term.
    fibre_only : array_like of bool, shape (n,), optional
        Plies checked in the fibre direction only (s22 = s12 = 0), e.g. after matrix failure.
    response : LaminateResponse, optional
        A response already computed for these loads (saves a solve).

    Returns
    -------
    CriterionResult
        Arrays of shape (..., n, 3): load case(s), ply, point (bottom, middle, top).

    Raises
    ------
    InputError
        If a ply lacks a needed strength.
    """
    if response is None:
        response = laminate.response(loads, delta_T)
    strengths = _stacked_strengths(laminate)
    sM = response.mechanical.stress_material
    sT = np.broadcast_to(response.thermal.stress_material, sM.shape)
    if fibre_only is not None:
        keep = np.where(np.asarray(fibre_only, dtype=bool)[:, None, None], [1.0, 0.0, 0.0], 1.0)
        sM, sT = sM * keep, sT * keep
    comp = np.stack([p.material.compliance_2d() for p in laminate.plies])[:, None]
    return evaluate_criterion(
        criterion, sM, strengths, compliance=comp, thermal=sT, f12_star=f12_star
    )


@dataclass(frozen=True)
class FailureEvent:
    """Plies failing together at one load factor.

    Attributes
    ----------
    load_factor : float
        Multiplier of the applied resultants at this event (thermal part fixed).
    resultants : tuple of float
        Nx, Ny, Nxy (N/m), Mx, My, Mxy (N) at the event.
    plies : tuple of int
        Indices of the plies that fail (0 = bottom ply).
    angles : tuple of float
        Their angles, degrees.
    modes : tuple of str
        Their failure modes.
    points : tuple of str
        Where in each ply failure starts (bottom, middle or top).
    """

    load_factor: float
    resultants: tuple[float, ...]
    plies: tuple[int, ...]
    angles: tuple[float, ...]
    modes: tuple[str, ...]
    points: tuple[str, ...]

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI).

        Returns
        -------
        dict
            load_factor, resultants {Nx ... Mxy}, plies, angles, modes, points.
        """
        from micromech.laminate.clt import LOAD_NAMES

        finite = np.isfinite(self.load_factor)
        return {
            "load_factor": float(self.load_factor) if finite else None,
            "resultants": dict(zip(LOAD_NAMES, (float(v) if finite else None
                                                for v in self.resultants), strict=True)),
            "plies": list(self.plies),
            "angles": list(self.angles),
            "modes": list(self.modes),
            "points": list(self.points),
        }


@dataclass(frozen=True)
class FailureSequence:
    """Result of a ply-discount analysis.

    Attributes
    ----------
    criterion : str
        Criterion used.
    events : tuple of FailureEvent
        In order of increasing load factor.
    collapsed : bool
        Whether the laminate collapsed (all plies failed by their fibres, or no stiffness left
        along the load direction); False when the remaining plies cannot fail along this load
        direction.
    """

    criterion: str
    events: tuple[FailureEvent, ...]
    collapsed: bool

    @property
    def first_ply_factor(self) -> float:
        """Load factor of the first event (inf without events)."""
        return self.events[0].load_factor if self.events else float("inf")

    @property
    def last_ply_factor(self) -> float:
        """Load factor of the last event (inf without events)."""
        return self.events[-1].load_factor if self.events else float("inf")

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form.

        Returns
        -------
        dict
            criterion, first_ply_factor, last_ply_factor, collapsed, events.
        """
        def fin(x: float) -> float | None:
            return float(x) if np.isfinite(x) else None

        return {
            "criterion": self.criterion,
            "first_ply_factor": fin(self.first_ply_factor),
            "last_ply_factor": fin(self.last_ply_factor),
            "collapsed": self.collapsed,
            "events": [e.as_dict() for e in self.events],
        }


def _direction(
    loads: Mapping[str, Any] | ArrayLike, delta_T: float | None
) -> tuple[Array, float, float]:
    """Return the load direction scaled to a largest resultant of 1 (SI), the scale and dT.

    Load factors are found for the scaled direction and divided by the scale, so that very
    large or very small resultants neither overflow nor underflow.
    """
    vec, dT = load_vector(loads, delta_T)
    if vec.shape != (6,):
        raise InputError(f"loads: one load direction (shape (6,)) expected, got {vec.shape}")
    if not np.any(vec != 0.0):
        raise InputError(
            "loads: at least one of Nx, Ny, Nxy, Mx, My, Mxy must be non-zero to find a failure "
            "load (delta_T alone is held fixed, not scaled)"
        )
    scale = float(np.max(np.abs(vec)))
    return vec / scale, scale, dT


def ply_minimum(res: CriterionResult) -> tuple[Array, NDArray[np.intp], NDArray[np.int64]]:
    """Per ply: the smallest strength ratio over its three points, that point and its mode.

    Parameters
    ----------
    res : CriterionResult
        Arrays of shape (..., n, 3) (ply, point), as :func:`ply_strength_ratios` returns.

    Returns
    -------
    ratio : ndarray, shape (..., n)
        Strength ratios.
    point : ndarray of int, shape (..., n)
        0 bottom, 1 middle, 2 top.
    mode : ndarray of int, shape (..., n)
        Mode codes (index into :data:`~micromech.laminate.failure.MODES`).
    """
    R = res.strength_ratio
    k = np.argmin(R, -1)
    Rmin = np.take_along_axis(R, k[..., None], -1)[..., 0]
    mode = np.take_along_axis(res.mode_code, k[..., None], -1)[..., 0]
    return Rmin, k, mode


def _event(
    laminate: Laminate, unit: Array, lam: float, scale: float, idx: NDArray[Any],
    point: NDArray[Any], mode: NDArray[Any],
) -> FailureEvent:
    """Failure event at factor ``lam`` of the scaled direction ``unit`` (loads = unit * scale)."""
    from micromech.laminate.clt import POINTS

    return FailureEvent(
        load_factor=float(lam) / scale,
        resultants=tuple(float(v) for v in unit * lam),
        plies=tuple(int(i) for i in idx),
        angles=tuple(float(laminate.angles[i]) for i in idx),
        modes=tuple(MODES[int(mode[i])] for i in idx),
        points=tuple(POINTS[int(point[i])] for i in idx),
    )


def first_ply_failure(
    laminate: Laminate,
    loads: Mapping[str, Any] | ArrayLike,
    delta_T: float | None = None,
    criterion: str = "tsai_wu",
    *,
    f12_star: float = -0.5,
    rtol: float = 1e-9,
) -> FailureEvent:
    """First-ply failure along a load direction.

    Parameters
    ----------
    laminate : Laminate
        The laminate; every ply needs Xt, Xc, Yt, Yc, S12.
    loads : mapping or array_like, shape (6,)
        The load direction (resultants); not all zero. A mapping may carry ``delta_T``.
    delta_T : float, optional
        Temperature change held fixed, K.
    criterion : str
        Failure criterion key.
    f12_star : float
        Tsai-Wu interaction term.
    rtol : float
        Plies whose strength ratios are within ``rtol`` of the smallest fail together.

    Returns
    -------
    FailureEvent
        Load factor (inf if no ply can fail), resultants at failure, failing plies and modes.

    References
    ----------
    Kaw (2006), Sec. 5.3.
    """
    vec, scale, dT = _direction(loads, delta_T)
    res = ply_strength_ratios(laminate, vec, dT, criterion, f12_star=f12_star)
    R, point, mode = ply_minimum(res)
    lam = float(np.min(R))
    idx = np.flatnonzero(R <= lam * (1.0 + rtol)) if np.isfinite(lam) else np.array([], int)
    return _event(laminate, vec, lam, scale, idx, point, mode)


def last_ply_failure(
    laminate: Laminate,
    loads: Mapping[str, Any] | ArrayLike,
    delta_T: float | None = None,
    criterion: str = "tsai_wu",
    *,
    f12_star: float = -0.5,
    residual: float = 1e-6,
    rtol: float = 1e-9,
) -> FailureSequence:
    """Progressive failure by ply discount, from first-ply to last-ply failure.

    Parameters
    ----------
    laminate : Laminate
        The laminate; every ply needs Xt, Xc, Yt, Yc, S12.
    loads : mapping or array_like, shape (6,)
        The load direction (resultants); not all zero.
    delta_T : float, optional
        Temperature change held fixed, K.
    criterion : str
        Failure criterion key.
    f12_star : float
        Tsai-Wu interaction term.
    residual : float
        Fraction of a discounted constant that remains (0 < residual < 1).
    rtol : float
        Plies whose strength ratios are within ``rtol`` of the smallest fail together.

    Returns
    -------
    FailureSequence
        The events in order; ``last_ply_factor`` is the last-ply failure load factor.

    Raises
    ------
    InputError
        If ``residual`` is not in (0, 1).

    References
    ----------
    Kaw (2006), Sec. 5.3 (ply discount); Daniel and Ishai (2006), Sec. 12.4.
    """
    if not 0.0 < residual < 1.0:
        raise InputError(f"residual = {residual}: must lie in (0, 1)")
    vec, scale, dT = _direction(loads, delta_T)
    n = laminate.n_plies
    state = np.zeros(n, dtype=int)  # 0 intact, 1 matrix failed, 2 fibre failed
    original = [p.material for p in laminate.plies]
    current = laminate
    events: list[FailureEvent] = []
    level = 0.0
    intact = float(vec @ laminate.abd_inverse @ vec)
    collapsed = False
    for _ in range(2 * n):
        res = ply_strength_ratios(
            current, vec, dT, criterion, f12_star=f12_star, fibre_only=state == 1
        )
        R, point, mode = ply_minimum(res)
        R = np.where(state == 2, np.inf, R)
        lam = float(np.min(R))
        if not np.isfinite(lam):
            break
        failing = np.flatnonzero(R <= lam * (1.0 + rtol))
        level = max(level, lam)
        mode = np.where(state == 1, np.where(mode == MODES.index("fibre_compression"),
                                             mode, MODES.index("fibre_tension")), mode)
        events.append(_event(current, vec, level, scale, failing, point, mode))
        for i in failing:
            fibre = MODES[int(mode[i])] in _FIBRE_MODES
            state[i] = 2 if fibre else max(state[i], 1)
        mats = [
            original[i] if state[i] == 0
            else original[i].degraded(residual, keep_fibre=bool(state[i] == 1))
            for i in range(n)
        ]
        current = laminate.with_materials(mats)
        compliance = float(vec @ current.abd_inverse @ vec)
        if np.all(state == 2) or compliance > intact / np.sqrt(residual):
            collapsed = True
            break
    return FailureSequence(criterion=criterion, events=tuple(events), collapsed=collapsed)
