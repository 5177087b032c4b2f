"""The names of inclusion shapes and fibre orientations, shared by the composite and the estimates.

A dependency-free module: the composite specification validates against these names without
importing the estimators, and the estimators implement exactly these.
"""

from __future__ import annotations

__all__ = ["INCLUSIONS", "ORIENTATIONS"]

#: Inclusion shapes: aligned continuous fibres, spheroids (with an aspect ratio), spheres.
INCLUSIONS: tuple[str, ...] = ("continuous", "spheroid", "sphere")

#: Fibre orientations: along axis 1, uniformly random in the 1-2 plane, uniformly random in space.
ORIENTATIONS: tuple[str, ...] = ("aligned", "random_in_plane", "random_3d")
