"""micromech: size fibre composites before an RVE model and check its results after.

Public API re-exports only. Names are imported on first use (PEP 562), so ``import micromech``
and the ``micromech`` command start quickly; ``from micromech import estimate`` works as usual.
"""

from __future__ import annotations

import importlib
from typing import TYPE_CHECKING, Any

__version__ = "0.1.0"

#: Public name -> module that defines it.
_EXPORTS: dict[str, str] = {
    # errors
    "MicromechError": "micromech.errors",
    "InputError": "micromech.errors",
    "UnitError": "micromech.errors",
    "InvalidMaterialError": "micromech.errors",
    "FractionError": "micromech.errors",
    "CaseFileError": "micromech.errors",
    "DataFileError": "micromech.errors",
    "RegistryError": "micromech.errors",
    # units, results, safety
    "parse_quantity": "micromech.units",
    "ElasticConstants": "micromech.results",
    "CAUTION": "micromech.safety",
    # materials and case files
    "Isotropic": "micromech.materials",
    "TransverselyIsotropic": "micromech.materials",
    "Orthotropic": "micromech.materials",
    "Material": "micromech.materials",
    "Strengths": "micromech.materials",
    "Composite": "micromech.materials",
    "Registry": "micromech.materials",
    "get_material": "micromech.materials",
    "list_materials": "micromech.materials",
    "load_material": "micromech.materials",
    "load_case": "micromech.case",
    # estimates and bounds
    "Estimates": "micromech.homogenize",
    "FibrePhase": "micromech.homogenize",
    "MatrixPhase": "micromech.homogenize",
    "estimate": "micromech.homogenize",
    "mori_tanaka": "micromech.homogenize",
    # laminates
    "Laminate": "micromech.laminate",
    "Ply": "micromech.laminate",
    "PlyMaterial": "micromech.laminate",
    "PlyStrengths": "micromech.laminate",
    "analyse_laminate": "micromech.laminate",
    "failure_envelope": "micromech.laminate",
    "first_ply_failure": "micromech.laminate",
    "last_ply_failure": "micromech.laminate",
    "parse_layup": "micromech.laminate",
    "stack_constants": "micromech.laminate",
    # design
    "SizingTarget": "micromech.design",
    "SizingResult": "micromech.design",
    "size_fraction": "micromech.design",
    "Sweep": "micromech.design",
    "sweep_fraction": "micromech.design",
    "sweep_angle": "micromech.design",
    "sweep_ply_share": "micromech.design",
    "MonteCarloResult": "micromech.design",
    "monte_carlo": "micromech.design",
    # RVE: geometry, curves, stiffness, check
    "random_cell": "micromech.rve.geometry",
    "square_cell": "micromech.rve.geometry",
    "hexagonal_cell": "micromech.rve.geometry",
    "FibreArrangement": "micromech.rve.geometry",
    "read_table": "micromech.rve.ingest",
    "load_curve": "micromech.rve.ingest",
    "curve_metrics": "micromech.rve.curves",
    "CurveMetrics": "micromech.rve.curves",
    "stiffness_from_load_cases": "micromech.rve.stiffness",
    "EffectiveStiffness": "micromech.rve.stiffness",
    "check_case": "micromech.rve.check",
    "CheckResult": "micromech.rve.check",
    "grade_property": "micromech.rve.check",
    # the end-to-end tour
    "run_demo": "micromech.report.demo",
}

__all__ = [
    "CAUTION",
    "CaseFileError",
    "CheckResult",
    "Composite",
    "CurveMetrics",
    "DataFileError",
    "EffectiveStiffness",
    "ElasticConstants",
    "Estimates",
    "FibreArrangement",
    "FibrePhase",
    "FractionError",
    "InputError",
    "InvalidMaterialError",
    "Isotropic",
    "Laminate",
    "Material",
    "MatrixPhase",
    "MicromechError",
    "MonteCarloResult",
    "Orthotropic",
    "Ply",
    "PlyMaterial",
    "PlyStrengths",
    "Registry",
    "RegistryError",
    "SizingResult",
    "SizingTarget",
    "Strengths",
    "Sweep",
    "TransverselyIsotropic",
    "UnitError",
    "analyse_laminate",
    "check_case",
    "curve_metrics",
    "estimate",
    "failure_envelope",
    "first_ply_failure",
    "get_material",
    "grade_property",
    "hexagonal_cell",
    "last_ply_failure",
    "list_materials",
    "load_case",
    "load_curve",
    "load_material",
    "monte_carlo",
    "mori_tanaka",
    "parse_layup",
    "parse_quantity",
    "random_cell",
    "read_table",
    "run_demo",
    "size_fraction",
    "square_cell",
    "stack_constants",
    "stiffness_from_load_cases",
    "sweep_angle",
    "sweep_fraction",
    "sweep_ply_share",
]


def __getattr__(name: str) -> Any:
    module = _EXPORTS.get(name)
    if module is None:
        raise AttributeError(f"module 'micromech' has no attribute {name!r}")
    value = getattr(importlib.import_module(module), name)
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))


if TYPE_CHECKING:  # pragma: no cover - for type checkers and IDEs
    from micromech.case import load_case
    from micromech.design import (
        MonteCarloResult,
        SizingResult,
        SizingTarget,
        Sweep,
        monte_carlo,
        size_fraction,
        sweep_angle,
        sweep_fraction,
        sweep_ply_share,
    )
    from micromech.errors import (
        CaseFileError,
        DataFileError,
        FractionError,
        InputError,
        InvalidMaterialError,
        MicromechError,
        RegistryError,
        UnitError,
    )
    from micromech.homogenize import Estimates, FibrePhase, MatrixPhase, estimate, mori_tanaka  # type: ignore[no-redef]
    from micromech.laminate import (
        Laminate,
        Ply,
        PlyMaterial,
        PlyStrengths,
        analyse_laminate,
        failure_envelope,
        first_ply_failure,
        last_ply_failure,
        parse_layup,
        stack_constants,
    )
    from micromech.materials import (
        Composite,
        Isotropic,
        Material,
        Orthotropic,
        Registry,
        Strengths,
        TransverselyIsotropic,
        get_material,
        list_materials,
        load_material,
    )
    from micromech.report.demo import run_demo
    from micromech.results import ElasticConstants
    from micromech.rve.check import CheckResult, check_case, grade_property
    from micromech.rve.curves import CurveMetrics, curve_metrics
    from micromech.rve.geometry import FibreArrangement, hexagonal_cell, random_cell, square_cell
    from micromech.rve.ingest import load_curve, read_table
    from micromech.rve.stiffness import EffectiveStiffness, stiffness_from_load_cases
    from micromech.safety import CAUTION
    from micromech.units import parse_quantity
