"""Shared invented constituents for the design tests (typical magnitudes, not a data source)."""

import pytest

from micromech.materials import Composite, Isotropic, TransverselyIsotropic


@pytest.fixture
def glass():
    # invented constants of the magnitude of an E-glass fibre
    return Isotropic(name="glass (invented)", E="72 GPa", nu=0.22, density="2.54 g/cm^3",
                     alpha="5e-6 1/K")


@pytest.fixture
def resin():
    # invented constants of the magnitude of an epoxy
    return Isotropic(name="resin (invented)", E="3.5 GPa", nu=0.35, density="1.2 g/cm^3",
                     alpha="60e-6 1/K")


@pytest.fixture
def carbon():
    # invented constants of the magnitude of a standard-modulus carbon fibre
    return TransverselyIsotropic(name="carbon (invented)", E1="230 GPa", E2="15 GPa", nu12=0.2,
                                 G12="15 GPa", nu23=0.07, density="1.8 g/cm^3",
                                 alpha1="-0.5e-6 1/K", alpha2="10e-6 1/K")


@pytest.fixture
def glass_epoxy(glass, resin):
    return Composite(glass, resin, 0.55)


@pytest.fixture
def case_file(tmp_path):
    p = tmp_path / "panel.toml"
    p.write_text(
        'name = "invented example: glass/resin cross-ply panel for sizing"\n'
        '[fibre]\nE = "72 GPa"\nnu = 0.22\ndensity = "2.54 g/cm^3"\nalpha = "5e-6 1/K"\n'
        '[matrix]\nE = "3.5 GPa"\nnu = 0.35\ndensity = "1.2 g/cm^3"\nalpha = "60e-6 1/K"\n'
        '[composite]\nvolume_fraction = 0.55\n'
        '[laminate]\nlayup = "[0/90]s"\nply_thickness = "0.25 mm"\n'
    )
    return p
