"""micromech: size fibre composites before an RVE model and check its results after.

Public API re-exports only.
"""

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
from micromech.homogenize import Estimates, FibrePhase, MatrixPhase, estimate, mori_tanaka
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
from micromech.results import ElasticConstants
from micromech.units import parse_quantity

__all__ = [
    "Estimates",
    "FibrePhase",
    "MatrixPhase",
    "estimate",
    "mori_tanaka",
    "MonteCarloResult",
    "SizingResult",
    "SizingTarget",
    "Sweep",
    "monte_carlo",
    "size_fraction",
    "sweep_angle",
    "sweep_fraction",
    "sweep_ply_share",
    "Laminate",
    "Ply",
    "PlyMaterial",
    "PlyStrengths",
    "analyse_laminate",
    "failure_envelope",
    "first_ply_failure",
    "last_ply_failure",
    "parse_layup",
    "stack_constants",
    "CaseFileError",
    "Composite",
    "DataFileError",
    "ElasticConstants",
    "FractionError",
    "InputError",
    "InvalidMaterialError",
    "Isotropic",
    "Material",
    "MicromechError",
    "Orthotropic",
    "Registry",
    "RegistryError",
    "Strengths",
    "TransverselyIsotropic",
    "UnitError",
    "get_material",
    "list_materials",
    "load_case",
    "load_material",
    "parse_quantity",
]

__version__ = "0.1.0"
