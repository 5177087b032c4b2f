"""Laminates: layup codes, plies, classical laminate theory, 3D stack constants and failure.

Public names
------------
- layup codes: :func:`parse_layup`, :func:`format_layup`
- plies: :class:`PlyMaterial` (from inline constants, the registry, a material model, an
  estimate, or a composite's constituents: :meth:`PlyMaterial.from_composite`,
  :meth:`PlyMaterial.coerce`), :class:`PlyStrengths`, :class:`Ply`
- classical laminate theory: :class:`Laminate`, :func:`reduced_stiffness`,
  :func:`transformed_reduced_stiffness`, :func:`stress_transformation`,
  :func:`strain_transformation`, :func:`transformed_expansion`, :func:`abd_matrices`,
  :func:`load_vector`, :class:`LaminateResponse`, :class:`LaminateConstants`
- 3D constants of a periodic stack: :func:`stack_constants`, :func:`plane_stress_reduce`,
  :class:`StackResult`
- failure: :func:`max_stress`, :func:`max_strain`, :func:`tsai_hill`, :func:`tsai_wu`,
  :func:`hashin`, :func:`evaluate_criterion`, :func:`ply_strength_ratios`,
  :func:`first_ply_failure`, :func:`last_ply_failure`, :func:`failure_envelope`,
  :func:`plot_envelopes`
- one call: :func:`analyse_laminate`; from a case file: :func:`laminate_from_case`,
  :func:`plies_from_case`, :func:`ply_material_from_case`, :func:`ply_origin`
"""

from micromech.laminate.analysis import (
    LaminateAnalysis,
    analyse_laminate,
    laminate_from_case,
    plies_from_case,
    ply_material_from_case,
    ply_origin,
)
from micromech.laminate.clt import (
    LOAD_NAMES,
    POINTS,
    Laminate,
    LaminateConstants,
    LaminateResponse,
    PlyFields,
    abd_matrices,
    load_vector,
    reduced_stiffness,
    strain_transformation,
    stress_transformation,
    transformed_expansion,
    transformed_reduced_stiffness,
)
from micromech.laminate.envelope import (
    ENVELOPE_AXES,
    Envelope,
    failure_envelope,
    plot_envelopes,
)
from micromech.laminate.failure import (
    CRITERIA,
    MODES,
    CriterionResult,
    evaluate_criterion,
    hashin,
    max_strain,
    max_stress,
    tsai_hill,
    tsai_wu,
)
from micromech.laminate.layup import format_layup, parse_layup
from micromech.laminate.ply import STRENGTH_NAMES, Ply, PlyMaterial, PlyStrengths
from micromech.laminate.progressive import (
    FailureEvent,
    FailureSequence,
    first_ply_failure,
    last_ply_failure,
    ply_strength_ratios,
)
from micromech.laminate.stack import StackResult, plane_stress_reduce, stack_constants

__all__ = [
    "CRITERIA",
    "ENVELOPE_AXES",
    "LOAD_NAMES",
    "MODES",
    "POINTS",
    "STRENGTH_NAMES",
    "CriterionResult",
    "Envelope",
    "FailureEvent",
    "FailureSequence",
    "Laminate",
    "LaminateAnalysis",
    "LaminateConstants",
    "LaminateResponse",
    "Ply",
    "PlyFields",
    "PlyMaterial",
    "PlyStrengths",
    "StackResult",
    "abd_matrices",
    "analyse_laminate",
    "evaluate_criterion",
    "failure_envelope",
    "first_ply_failure",
    "format_layup",
    "hashin",
    "laminate_from_case",
    "last_ply_failure",
    "load_vector",
    "max_strain",
    "max_stress",
    "parse_layup",
    "plane_stress_reduce",
    "plies_from_case",
    "ply_material_from_case",
    "ply_origin",
    "ply_strength_ratios",
    "plot_envelopes",
    "reduced_stiffness",
    "stack_constants",
    "strain_transformation",
    "stress_transformation",
    "transformed_expansion",
    "transformed_reduced_stiffness",
    "tsai_hill",
    "tsai_wu",
]
