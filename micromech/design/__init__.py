"""Design before modelling: inverse sizing of the fibre fraction, sweeps and Monte Carlo scatter.

* :func:`size_fraction` finds the fibre fraction at which properties reach targets under every
  estimate and the bounds (:class:`SizingTarget`, :class:`SizingResult`); :func:`size_models`
  and :func:`solve_fraction` do the same for any vectorised forward model.
* :func:`sweep_fraction`, :func:`sweep_angle`, :func:`sweep_ply_share` return a :class:`Sweep`.
* :func:`monte_carlo` propagates constituent and fraction scatter through an estimate;
  :func:`propagate` does it for any vectorised function of :class:`Uncertain` inputs.
"""

from micromech.design.forward import Constituents, laminate_in_plane
from micromech.design.inverse import (
    BoundsSolution,
    FractionInterval,
    FractionPoint,
    FractionSolution,
    SizingResult,
    TargetSizing,
    size_models,
    solve_fraction,
)
from micromech.design.scatter import constituent_inputs, monte_carlo
from micromech.design.sizing import size_fraction
from micromech.design.sweeps import Sweep, sweep, sweep_angle, sweep_fraction, sweep_ply_share
from micromech.design.targets import SizingTarget
from micromech.design.uncertainty import MonteCarloResult, Statistics, Uncertain, propagate

__all__ = [
    "BoundsSolution",
    "Constituents",
    "FractionInterval",
    "FractionPoint",
    "FractionSolution",
    "MonteCarloResult",
    "SizingResult",
    "SizingTarget",
    "Statistics",
    "Sweep",
    "TargetSizing",
    "Uncertain",
    "constituent_inputs",
    "laminate_in_plane",
    "monte_carlo",
    "propagate",
    "size_fraction",
    "size_models",
    "solve_fraction",
    "sweep",
    "sweep_angle",
    "sweep_fraction",
    "sweep_ply_share",
]
