"""micromech: size fibre composites before an RVE model and check its results after.

Public API re-exports only.
"""

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
from micromech.results import ElasticConstants
from micromech.units import parse_quantity

__all__ = [
    "CaseFileError",
    "DataFileError",
    "ElasticConstants",
    "FractionError",
    "InputError",
    "InvalidMaterialError",
    "MicromechError",
    "RegistryError",
    "UnitError",
    "parse_quantity",
]

__version__ = "0.1.0"
