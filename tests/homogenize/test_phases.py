import numpy as np
import pytest

from micromech.errors import InvalidMaterialError
from micromech.homogenize import FibrePhase, MatrixPhase
from micromech.materials import Isotropic, Orthotropic, TransverselyIsotropic


def test_isotropic_fibre_has_equal_axial_and_transverse_constants():
    f = FibrePhase.isotropic(72e9, 0.22, 5e-6)
    assert float(f.E1) == float(f.E2) == 72e9
    assert float(f.nu12) == float(f.nu23) == 0.22
    assert float(f.G12) == pytest.approx(72e9 / 2.44)
    assert float(f.alpha1) == float(f.alpha2) == 5e-6
    assert f.is_isotropic


def test_transversely_isotropic_fibre_derived_moduli():
    f = FibrePhase(230e9, 15e9, 0.2, 15e9, 0.07)
    assert float(f.G23) == pytest.approx(15e9 / 2.14)
    # k23 = 1 / (2 ((1 - nu23)/E2 - 2 nu12^2/E1)) (Hill 1964 plane-strain bulk modulus)
    assert float(f.k23) == pytest.approx(0.5 / (0.93 / 15e9 - 0.08 / 230e9))
    assert not f.is_isotropic


def test_matrix_moduli():
    m = MatrixPhase(3.5e9, 0.35)
    assert float(m.G) == pytest.approx(3.5e9 / 2.7)
    assert float(m.K) == pytest.approx(3.5e9 / 0.9)
    assert float(m.k23) == pytest.approx(3.5e9 / 0.9 + 3.5e9 / 8.1)


def test_phase_constants_broadcast():
    f = FibrePhase.isotropic(np.array([70e9, 80e9]), 0.2)
    assert f.E1.shape == (2,) and f.nu12.shape == ()


def test_from_material_reads_isotropic_and_transversely_isotropic_models():
    glass = Isotropic(E="72 GPa", nu=0.22, alpha="5e-6 1/K")
    f = FibrePhase.from_material(glass)
    assert f.is_isotropic and float(f.alpha2) == 5e-6
    carbon = TransverselyIsotropic(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", G23="7 GPa",
                                   alpha1=-0.5e-6, alpha2=10e-6)
    fc = FibrePhase.from_material(carbon)
    assert float(fc.nu23) == pytest.approx(15 / 14 - 1)
    assert float(fc.alpha1) == -0.5e-6
    m = MatrixPhase.from_material(Isotropic(E="3.5 GPa", G="1.3 GPa"))
    assert float(m.nu) == pytest.approx(3.5 / 2.6 - 1)


def test_from_material_reads_an_orthotropic_model_through_its_ti_view():
    o = Orthotropic(E1=230e9, E2=15e9, E3=15e9, G12=15e9, G13=15e9, G23=15e9 / 2.14,
                    nu12=0.2, nu13=0.2, nu23=0.07)
    f = FibrePhase.from_material(o)
    assert float(f.nu23) == pytest.approx(0.07)


def test_orthotropic_fibre_that_is_not_transversely_isotropic_raises():
    o = Orthotropic(E1=230e9, E2=15e9, E3=12e9, G12=15e9, G13=15e9, G23=6e9,
                    nu12=0.2, nu13=0.2, nu23=0.07)
    with pytest.raises(InvalidMaterialError, match="not transversely isotropic"):
        FibrePhase.from_material(o)


def test_from_material_accepts_phases_themselves():
    f = FibrePhase.isotropic(72e9, 0.22)
    m = MatrixPhase(3.5e9, 0.35, 1e-5)
    assert FibrePhase.from_material(f) is f
    assert MatrixPhase.from_material(m) is m
    assert FibrePhase.from_material(m).is_isotropic
    assert float(MatrixPhase.from_material(f).E) == 72e9


def test_object_without_constants_raises():
    with pytest.raises(InvalidMaterialError, match="lacks E1, E2, nu12, G12, nu23"):
        FibrePhase.from_material(object())


def test_anisotropic_matrix_raises():
    carbon = TransverselyIsotropic(E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa", nu23=0.07)
    with pytest.raises(InvalidMaterialError, match="the estimates need an isotropic matrix"):
        MatrixPhase.from_material(carbon)


def test_foreign_ti_view_failure_is_reported():
    class Odd:
        def ti(self):
            raise RuntimeError("boom")

    with pytest.raises(InvalidMaterialError, match="cannot read a transversely isotropic view"):
        FibrePhase.from_material(Odd())


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        (dict(E1=-1.0), "fibre E1 = -1: must be positive"),
        (dict(E2=0.0), "fibre E2 = 0: must be positive"),
        (dict(G12=np.nan), "fibre G12 = nan: must be finite"),
        (dict(nu23=-1.0), "fibre nu23 = -1: must exceed -1"),
        (dict(nu23=0.999), "must be below 1 - 2 nu12\\^2 E2 / E1"),
        (dict(alpha1=1e-6), "alpha1 is given without its partner"),
        (dict(alpha1=1e-6, alpha2=np.inf), "fibre alpha2 = inf: must be finite"),
    ],
)
def test_inadmissible_fibre_raises(kwargs, match):
    base = dict(E1=230e9, E2=15e9, nu12=0.2, G12=15e9, nu23=0.07)
    base.update(kwargs)
    with pytest.raises(InvalidMaterialError, match=match):
        FibrePhase(**base)


def test_bad_value_in_an_array_is_located():
    with pytest.raises(InvalidMaterialError, match="at index 2"):
        FibrePhase.isotropic(np.array([70e9, 70e9, -1.0]), 0.2)


@pytest.mark.parametrize(
    ("E", "nu", "match"),
    [(-3e9, 0.3, "matrix E = -3e\\+09: must be positive"),
     (3e9, 0.5, "matrix nu = 0.5: must lie in \\(-1, 0.5\\)"),
     (3e9, np.nan, "matrix nu = nan: must be finite"),
     (np.inf, 0.3, "matrix E = inf: must be finite")],
)
def test_inadmissible_matrix_raises(E, nu, match):
    with pytest.raises(InvalidMaterialError, match=match):
        MatrixPhase(E, nu)


def test_matrix_cte_must_be_finite():
    with pytest.raises(InvalidMaterialError, match="matrix alpha = nan: must be finite"):
        MatrixPhase(3e9, 0.3, np.nan)


def test_isotropic_fibre_poisson_ratio_is_checked():
    with pytest.raises(InvalidMaterialError, match="fibre nu = 0.6: must lie in"):
        FibrePhase.isotropic(70e9, 0.6)
    with pytest.raises(InvalidMaterialError, match="fibre nu = nan: must be finite"):
        FibrePhase.isotropic(70e9, np.nan)


def test_half_known_material_cte_is_dropped():
    class Half:
        E1, E2, nu12, G12, nu23 = 230e9, 15e9, 0.2, 15e9, 0.07
        alpha1, alpha2 = -0.5e-6, None

    f = FibrePhase.from_material(Half())
    assert f.alpha1 is None and f.alpha2 is None
