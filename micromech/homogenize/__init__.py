"""Mean-field estimates and rigorous bounds for fibre and particle composites.

One module per model family; every estimator takes ``(fibre, matrix, vf, ...)`` and returns a
frozen :class:`~micromech.results.ElasticConstants` whose arrays broadcast over the fraction and
the constituent constants. :func:`estimate` evaluates every model that applies to a composite.
Estimates and bounds are not design allowables: qualified test data, the applicable codes and a
licensed engineer decide.
"""

from micromech.homogenize.bounds import (
    hashin_shtrikman,
    hashin_shtrikman_fibre,
    hashin_shtrikman_isotropic,
    hashin_shtrikman_spheroid,
    reuss_bound,
    voigt_bound,
    voigt_reuss,
)
from micromech.homogenize.chamis import chamis
from micromech.homogenize.cylinders import cylinders
from micromech.homogenize.eshelby import (
    eshelby_components,
    eshelby_cylinder,
    eshelby_sphere,
    eshelby_spheroid,
    polarization,
)
from micromech.homogenize.estimate import BOUND_KEYS, MODEL_KEYS, Estimates, estimate
from micromech.homogenize.halpin_tsai import halpin_tsai, halpin_tsai_modulus
from micromech.homogenize.mori_tanaka import mori_tanaka
from micromech.homogenize.phases import FibrePhase, MatrixPhase
from micromech.homogenize.rule_of_mixtures import inverse_mix, mix, rule_of_mixtures
from micromech.homogenize.strength import (
    CAUTION,
    StrengthEstimate,
    fibre_spacing_ratio,
    in_plane_shear_strength,
    kink_band,
    longitudinal_tension,
    rosen_microbuckling,
    strength_estimates,
    transverse_strength,
    yield_bounds,
)
from micromech.homogenize.thermal import levin, levin_fibre, schapery

__all__ = [
    "BOUND_KEYS",
    "CAUTION",
    "Estimates",
    "FibrePhase",
    "MODEL_KEYS",
    "MatrixPhase",
    "StrengthEstimate",
    "chamis",
    "cylinders",
    "eshelby_components",
    "eshelby_cylinder",
    "eshelby_sphere",
    "eshelby_spheroid",
    "estimate",
    "fibre_spacing_ratio",
    "halpin_tsai",
    "halpin_tsai_modulus",
    "hashin_shtrikman",
    "hashin_shtrikman_fibre",
    "hashin_shtrikman_isotropic",
    "hashin_shtrikman_spheroid",
    "in_plane_shear_strength",
    "inverse_mix",
    "kink_band",
    "levin",
    "levin_fibre",
    "longitudinal_tension",
    "mix",
    "mori_tanaka",
    "polarization",
    "reuss_bound",
    "rosen_microbuckling",
    "rule_of_mixtures",
    "schapery",
    "strength_estimates",
    "transverse_strength",
    "voigt_bound",
    "voigt_reuss",
    "yield_bounds",
]
