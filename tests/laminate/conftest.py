"""Shared ply materials for the laminate tests."""

from __future__ import annotations

import pytest

from micromech.laminate import PlyMaterial, PlyStrengths

# Graphite/epoxy (T300/5208) as tabulated in Kaw (2006), 2nd ed., Table 2.1 (from memory):
# E1 = 181 GPa, E2 = 10.3 GPa, nu12 = 0.28, G12 = 7.17 GPa; strengths 1500/1500/40/246/68 MPa;
# alpha1 = 0.02e-6 1/K, alpha2 = 22.5e-6 1/K. nu23 = 0.4 is our own assumption (common practice,
# no source) so that the 3D stiffness is complete.
KAW_STRENGTHS = PlyStrengths(Xt=1500e6, Xc=1500e6, Yt=40e6, Yc=246e6, S12=68e6)


@pytest.fixture
def graphite_epoxy() -> PlyMaterial:
    return PlyMaterial(
        E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9, nu23=0.4,
        alpha1=0.02e-6, alpha2=22.5e-6, strengths=KAW_STRENGTHS, name="graphite/epoxy",
    )


@pytest.fixture
def graphite_epoxy_2d() -> PlyMaterial:
    """Without nu23 / G23 (plane-stress constants only) and without CTEs."""
    return PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9, strengths=KAW_STRENGTHS)
