"""Simulated RVE results: read histories, measure curves, fit the effective stiffness.

- :mod:`micromech.rve.ingest`: delimited history files into tables and stress-strain curves.
- :mod:`micromech.rve.curves`: modulus, offset yield, proportional limit, strength, energy.
- :mod:`micromech.rve.stiffness`: effective 6x6 stiffness from load cases; constants from curves.
- :mod:`micromech.rve.geometry`: square, hexagonal and random periodic fibre arrangements.
- :mod:`micromech.rve.check`: grade simulated properties against bounds and estimates.
"""

from micromech.rve.check import (
    CheckResult,
    PropertyCheck,
    check_case,
    grade_property,
    likely_causes,
)
from micromech.rve.curves import CurveMetrics, curve_metrics, metrics_of_curve
from micromech.rve.geometry import (
    FibreArrangement,
    NeighbourStats,
    RveGuidance,
    hexagonal_cell,
    nearest_neighbour_stats,
    random_cell,
    rve_size_guidance,
    square_cell,
)
from micromech.rve.ingest import (
    DIRECTIONS,
    NORMAL_DIRECTIONS,
    SHEAR_DIRECTIONS,
    Curve,
    Table,
    curve_from_columns,
    history_to_curve,
    load_curve,
    read_table,
)
from micromech.rve.stiffness import (
    AXIS_NAMES,
    DIRECTION_PROPERTY,
    EffectiveStiffness,
    axis_values,
    constants_from_curves,
    stiffness_from_load_cases,
    stiffness_from_matrix,
)

__all__ = [
    "CheckResult",
    "FibreArrangement",
    "NeighbourStats",
    "PropertyCheck",
    "RveGuidance",
    "check_case",
    "grade_property",
    "hexagonal_cell",
    "likely_causes",
    "nearest_neighbour_stats",
    "random_cell",
    "rve_size_guidance",
    "square_cell",
    "AXIS_NAMES",
    "DIRECTIONS",
    "DIRECTION_PROPERTY",
    "NORMAL_DIRECTIONS",
    "SHEAR_DIRECTIONS",
    "Curve",
    "CurveMetrics",
    "EffectiveStiffness",
    "Table",
    "axis_values",
    "constants_from_curves",
    "curve_from_columns",
    "curve_metrics",
    "history_to_curve",
    "load_curve",
    "metrics_of_curve",
    "read_table",
    "stiffness_from_load_cases",
    "stiffness_from_matrix",
]
