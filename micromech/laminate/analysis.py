"""One-call laminate analysis, and the glue from a case file to plies.

:func:`analyse_laminate` gathers what the ``micromech laminate`` command reports: ABD, in-plane
and flexural constants, the 3D constants of the stack, ply stresses under the loads, every
failure criterion per ply, and first- and last-ply failure. :func:`laminate_from_case` turns a
loaded case file into a :class:`~micromech.laminate.clt.Laminate`, taking the ply constants
from ``[ply]`` or, without them, from the homogenisation estimate named by ``case.ply_model``.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import CaseFileError, InputError
from micromech.laminate.clt import Laminate, LaminateConstants, LaminateResponse, load_vector
from micromech.laminate.failure import CRITERIA, REQUIRED_STRENGTHS, CriterionResult
from micromech.laminate.ply import STRENGTH_NAMES, STRENGTHS_HINT, Ply, PlyMaterial
from micromech.laminate.progressive import (
    FailureEvent,
    FailureSequence,
    first_ply_failure,
    last_ply_failure,
    ply_minimum,
    ply_strength_ratios,
)
from micromech.laminate.stack import StackResult

__all__ = [
    "LaminateAnalysis",
    "analyse_laminate",
    "ply_material_from_case",
    "ply_origin",
    "plies_from_case",
    "laminate_from_case",
]

Array = NDArray[np.float64]


@dataclass(frozen=True, eq=False)
class LaminateAnalysis:
    """Everything the laminate report shows, computed once.

    Attributes
    ----------
    laminate : Laminate
        The laminate.
    loads : ndarray, shape (6,)
        Nx, Ny, Nxy (N/m), Mx, My, Mxy (N).
    delta_T : float
        Temperature change, K.
    criterion : str
        Criterion used for first- and last-ply failure and for the critical ply.
    f12_star : float
        Tsai-Wu interaction term.
    in_plane, flexural : LaminateConstants
        Laminate engineering constants (free bending).
    stack : StackResult or None
        3D constants of the periodic stack (None where a ply lacks G23 / nu23).
    response : LaminateResponse or None
        Ply strains and stresses (None without loads).
    criteria : dict of str to CriterionResult
        Every criterion, arrays of shape (n, 3) (ply, point); empty without loads or strengths.
    first_ply : FailureEvent or None
        First-ply failure along the load direction (None without resultants or strengths).
    sequence : FailureSequence or None
        Ply-discount sequence up to last-ply failure.
    notes : tuple of str
        What was left out and why.
    """

    laminate: Laminate
    loads: Array
    delta_T: float
    criterion: str
    f12_star: float
    in_plane: LaminateConstants
    flexural: LaminateConstants
    stack: StackResult | None
    response: LaminateResponse | None
    criteria: dict[str, CriterionResult] = field(default_factory=dict)
    first_ply: FailureEvent | None = None
    sequence: FailureSequence | None = None
    notes: tuple[str, ...] = ()

    @property
    def has_loads(self) -> bool:
        """Whether any resultant or a temperature change is applied."""
        return bool(np.any(self.loads != 0.0) or self.delta_T != 0.0)

    def ply_ratio(self, criterion: str | None = None) -> tuple[Array, NDArray[np.intp]]:
        """Per ply, the smallest strength ratio over its three points and where it occurs.

        Parameters
        ----------
        criterion : str, optional
            Criterion key; the analysis criterion by default.

        Returns
        -------
        ratio : ndarray, shape (n,)
            Strength ratios.
        point : ndarray of int, shape (n,)
            0 bottom, 1 middle, 2 top.

        Raises
        ------
        InputError
            If the criterion was not evaluated (no loads or no strengths).
        """
        key = criterion or self.criterion
        if key not in self.criteria:
            raise InputError(
                f"criterion {key!r} was not evaluated (it needs loads and ply strengths)"
            )
        ratio, point, _ = ply_minimum(self.criteria[key])
        return ratio, point


def analyse_laminate(
    laminate: Laminate,
    loads: Mapping[str, Any] | ArrayLike | None = None,
    delta_T: float | None = None,
    criterion: str = "tsai_wu",
    *,
    f12_star: float = -0.5,
) -> LaminateAnalysis:
    """Analyse a laminate: stiffness, constants, ply stresses, failure.

    Parameters
    ----------
    laminate : Laminate
        The laminate.
    loads : mapping, array_like of shape (6,), or None
        Resultants (and ``delta_T`` in a mapping); see
        :func:`~micromech.laminate.clt.load_vector`.
    delta_T : float, optional
        Temperature change, K (overrides ``delta_T`` in ``loads``).
    criterion : str
        Criterion for first- and last-ply failure and for the critical ply.
    f12_star : float
        Tsai-Wu interaction term.

    Returns
    -------
    LaminateAnalysis
        The results; parts that cannot be computed are None and explained in ``notes``.

    Raises
    ------
    InputError
        For an unknown criterion or loads that are not one load case.
    """
    if criterion not in CRITERIA:
        raise InputError(f"criterion: unknown {criterion!r}; choose one of {', '.join(CRITERIA)}")
    vec, dT = load_vector(loads, delta_T)
    if vec.shape != (6,):
        raise InputError(f"loads: one load case (shape (6,)) expected, got {vec.shape}")
    notes: list[str] = []
    stack = None
    if all(p.material.has_3d for p in laminate.plies):
        stack = laminate.stack_constants()
    else:
        notes.append("3D stack constants need nu23 or G23 of every ply")
    response = None
    criteria: dict[str, CriterionResult] = {}
    first = None
    sequence = None
    loaded = bool(np.any(vec != 0.0) or dT != 0.0)
    if loaded:
        response = laminate.response(vec, dT)
        absent = {
            name for p in laminate.plies
            for name in (REQUIRED_STRENGTHS if p.material.strengths is None
                         else p.material.strengths.missing(REQUIRED_STRENGTHS))
        }
        missing = [name for name in REQUIRED_STRENGTHS if name in absent]
        if missing:
            notes.append(f"failure analysis needs ply strengths {', '.join(missing)}: "
                         f"{STRENGTHS_HINT}")
        else:
            for key in CRITERIA:
                criteria[key] = ply_strength_ratios(
                    laminate, vec, dT, key, f12_star=f12_star, response=response
                )
            if np.any(vec != 0.0):
                first = first_ply_failure(laminate, vec, dT, criterion, f12_star=f12_star)
                sequence = last_ply_failure(laminate, vec, dT, criterion, f12_star=f12_star)
            else:
                notes.append("first-ply failure needs a force or moment resultant "
                             "(delta_T is held fixed, not scaled)")
    else:
        notes.append("no loads given: ply stresses and failure are not evaluated")
    return LaminateAnalysis(
        laminate=laminate, loads=vec, delta_T=dT, criterion=criterion, f12_star=f12_star,
        in_plane=laminate.in_plane_constants(), flexural=laminate.flexural_constants(),
        stack=stack, response=response, criteria=criteria, first_ply=first, sequence=sequence,
        notes=tuple(notes),
    )


# --- case glue ----------------------------------------------------------------------------------


def ply_material_from_case(case: Any) -> PlyMaterial:
    """Ply constants of a case: the ``[ply]`` table, or else the chosen estimate.

    Parameters
    ----------
    case : Case
        A loaded case (:func:`micromech.case.load_case`).

    Returns
    -------
    PlyMaterial
        From ``case.ply`` (with its strengths) when given; otherwise from
        ``estimate(case.composite)`` under the key ``case.ply_model``, with the strengths of
        ``case.ply_strengths`` (a ``[ply]`` table that gives strengths only).

    Raises
    ------
    CaseFileError
        If the case has neither ``[ply]`` constants nor a composite to estimate them from, or
        the chosen estimate does not apply to the composite.
    """
    if getattr(case, "ply", None) is not None:
        return PlyMaterial.from_material(case.ply)
    composite = getattr(case, "composite", None)
    if composite is None:
        raise CaseFileError(
            f"{_label(case)}: [laminate] needs ply constants: give a [ply] table, or [fibre], "
            "[matrix] and [composite] to estimate them"
        )
    model = getattr(case, "ply_model", "mori_tanaka") or "mori_tanaka"
    try:
        return PlyMaterial.from_composite(composite, model, getattr(case, "ply_strengths", None))
    except InputError as exc:
        raise CaseFileError(f"{_label(case)}: {exc}") from None


def ply_origin(case: Any) -> str:
    """Say where the ply constants and the ply strengths of a case come from.

    Follows the same rule as :func:`ply_material_from_case`.

    Parameters
    ----------
    case : Case
        A loaded case (:func:`micromech.case.load_case`).

    Returns
    -------
    str
        E.g. ``"mori_tanaka estimate from [fibre], [matrix] and [composite]; strengths Xt, Xc,
        Yt, Yc, S12 from [ply] of the case"``.
    """
    ply = getattr(case, "ply", None)
    if ply is not None:
        name = str(getattr(ply, "name", "") or "")
        head = "constants from [ply] of the case" + (f" ({name})" if name not in ("", "ply")
                                                    else "")
        strengths = getattr(ply, "strengths", None)
    else:
        model = getattr(case, "ply_model", "mori_tanaka") or "mori_tanaka"
        head = f"{model} estimate from [fibre], [matrix] and [composite]"
        strengths = getattr(case, "ply_strengths", None)
    given = [k for k in STRENGTH_NAMES if getattr(strengths, k, None) is not None]
    if given:
        return f"{head}; strengths {', '.join(given)} from [ply] of the case"
    return f"{head}; no ply strengths (failure analysis needs Xt, Xc, Yt, Yc, S12 in [ply])"


def _label(case: Any) -> str:
    return str(getattr(case, "path", None) or getattr(case, "name", "case"))


def plies_from_case(case: Any) -> tuple[Ply, ...]:
    """Plies of the case's ``[laminate]``: its code, ply thickness and ply constants.

    Parameters
    ----------
    case : Case
        A loaded case with a ``[laminate]`` table.

    Returns
    -------
    tuple of Ply
        Bottom to top.

    Raises
    ------
    CaseFileError
        If the case has no ``[laminate]`` table.
    """
    return laminate_from_case(case).plies


def laminate_from_case(case: Any) -> Laminate:
    """Build the laminate a case file describes.

    Parameters
    ----------
    case : Case
        A loaded case with a ``[laminate]`` table.

    Returns
    -------
    Laminate
        With the code kept for reports.

    Raises
    ------
    CaseFileError
        If the case has no ``[laminate]`` table.
    """
    spec = getattr(case, "laminate", None)
    if spec is None:
        raise CaseFileError(
            f"{_label(case)}: no [laminate] table (needs layup = \"[0/90]s\" and ply_thickness)"
        )
    material = ply_material_from_case(case)
    return Laminate.from_code(spec.layup, material, spec.ply_thickness)
