"""Shared constituents for the homogenize tests (typical values, not a reference)."""

import pytest

from micromech.homogenize import FibrePhase, MatrixPhase


@pytest.fixture
def glass() -> FibrePhase:
    # E-glass, typical handbook values (common practice, no source)
    return FibrePhase.isotropic(72e9, 0.22, 5e-6)


@pytest.fixture
def carbon() -> FibrePhase:
    # standard-modulus carbon, transversely isotropic (typical values, common practice, no source)
    return FibrePhase(230e9, 15e9, 0.2, 15e9, 0.07, -0.5e-6, 10e-6)


@pytest.fixture
def epoxy() -> MatrixPhase:
    # epoxy, typical values (common practice, no source)
    return MatrixPhase(3.5e9, 0.35, 60e-6)
