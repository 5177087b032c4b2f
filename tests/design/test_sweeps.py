"""Sweeps over fibre fraction, fibre angle and ply share."""

import json

import numpy as np
import pytest

from micromech.design import sweep, sweep_angle, sweep_fraction, sweep_ply_share
from micromech.design.forward import Constituents, estimate_at
from micromech.errors import InputError
from micromech.homogenize import FibrePhase, MatrixPhase
from micromech.laminate.clt import Laminate
from micromech.laminate.ply import PlyMaterial


def test_fraction_sweep_runs_from_zero_to_the_packing_limit(glass_epoxy):
    s = sweep_fraction(glass_epoxy, "E2")
    assert s.x[0] == 0.0 and s.x[-1] == pytest.approx(0.82) and s.x.size == 101
    c = Constituents.from_composite(glass_epoxy)
    for k, v in s.values.items():
        assert v == pytest.approx(estimate_at(c, k, s.x).E2, rel=1e-15)
    assert np.all(s.lower <= s.upper)
    assert s.unit == ("GPa", 1e9)


def test_several_constituents_sweep_along_a_leading_axis(glass_epoxy):
    moduli = np.array([72e9, 86e9, 110e9])
    s = sweep_fraction(glass_epoxy, "E2", [0.2, 0.4, 0.6], fibre=FibrePhase.isotropic(moduli, 0.22))
    assert s.values["mori_tanaka"].shape == (3, 3) and s.lower.shape == (3, 3)
    for i, E in enumerate(moduli):
        one = sweep_fraction(glass_epoxy, "E2", [0.2, 0.4, 0.6],
                             fibre=FibrePhase.isotropic(E, 0.22))
        assert s.values["mori_tanaka"][i] == pytest.approx(one.values["mori_tanaka"], rel=1e-14)


def test_specific_and_density_sweeps_use_the_densities(glass_epoxy):
    s = sweep_fraction(glass_epoxy, "E1/density", [0.5], models=["rule_of_mixtures"],
                       fibre_density=2000.0, matrix_density=1000.0)
    # (0.5 * 72 + 0.5 * 3.5) GPa / (0.5 * 2000 + 0.5 * 1000) kg/m^3, exact algebra
    assert s.values["rule_of_mixtures"][0] == pytest.approx(37.75e9 / 1500.0, rel=1e-14)


def test_laminate_sweep_over_fraction(glass_epoxy):
    s = sweep_fraction(glass_epoxy, "Ex", [0.3, 0.6], layup="[0/90]s", bounds=False)
    assert s.lower is None and s.fixed["layup"] == "[0/90]s"
    assert np.all(np.diff(s.values["mori_tanaka"]) > 0)


def test_off_axis_ply_follows_the_transformation_of_compliance(glass_epoxy):
    s = sweep_angle(glass_epoxy, "Ex", models=["mori_tanaka"])
    k = estimate_at(Constituents.from_composite(glass_epoxy), "mori_tanaka", 0.55)
    t = np.deg2rad(s.x)
    c, n = np.cos(t), np.sin(t)
    # 1/Ex = c^4/E1 + (1/G12 - 2 nu12/E1) s^2 c^2 + s^4/E2 (Jones 1999, 2nd ed., Eq. 2.97;
    # from memory)
    inv = c**4 / k.E1 + (1 / k.G12 - 2 * k.nu12 / k.E1) * n**2 * c**2 + n**4 / k.E2
    assert s.values["mori_tanaka"] == pytest.approx(1 / inv, rel=1e-12)
    assert s.fixed == {"family": "off_axis", "volume_fraction": 0.55}


def test_angle_ply_laminate_equals_the_laminate_package(glass_epoxy):
    s = sweep_angle(glass_epoxy, "Gxy", [0.0, 30.0, 45.0], family="angle_ply",
                    models=["mori_tanaka"], bounds=False)
    k = estimate_at(Constituents.from_composite(glass_epoxy), "mori_tanaka", 0.55)
    ply = PlyMaterial(E1=float(k.E1), E2=float(k.E2), nu12=float(k.nu12), G12=float(k.G12))
    for a, v in zip(s.x, s.values["mori_tanaka"], strict=True):
        ref = Laminate.from_angles([a, -a, -a, a], ply, 1e-4).in_plane_constants().Gxy
        assert v == pytest.approx(ref, rel=1e-12)


def test_angle_sweep_of_several_fibres_has_a_bound_band(glass_epoxy):
    s = sweep_angle(glass_epoxy, "Ey", [0.0, 90.0], fibre=FibrePhase.isotropic([72e9, 86e9], 0.22))
    assert s.values["chamis"].shape == (2, 2) and np.all(s.lower <= s.upper)


def test_ply_share_ends_are_the_ply_constants_and_the_middle_is_a_cross_ply(glass_epoxy):
    s = sweep_ply_share(glass_epoxy, "Ex", [0.0, 0.5, 1.0], models=["mori_tanaka"])
    k = estimate_at(Constituents.from_composite(glass_epoxy), "mori_tanaka", 0.55)
    ply = PlyMaterial(E1=float(k.E1), E2=float(k.E2), nu12=float(k.nu12), G12=float(k.G12))
    v = s.values["mori_tanaka"]
    assert v[0] == pytest.approx(float(k.E2), rel=1e-13)  # all 90-degree plies (exact)
    assert v[2] == pytest.approx(float(k.E1), rel=1e-13)  # all 0-degree plies (exact)
    ref = Laminate.from_code("[0/90]s", ply, 1e-4).in_plane_constants().Ex
    assert v[1] == pytest.approx(ref, rel=1e-12)
    nu = sweep_ply_share(glass_epoxy, "nuxy", [1.0], models=["mori_tanaka"])
    assert nu.values["mori_tanaka"][0] == pytest.approx(float(k.nu12), rel=1e-13)


def test_generic_sweep_of_closed_form_models_serialises():
    s = sweep({"a": lambda x: {"E1": 2 * x}, "b": lambda x: {"E2": x}}, [0.0, 1.0], "E1",
              bounds=(lambda x: {"E1": x}, lambda x: {"E1": 3 * x}))
    assert list(s.values) == ["a"] and s.upper.tolist() == [0.0, 3.0]
    d = json.loads(json.dumps(s.as_dict(), allow_nan=False))
    assert d["values"]["a"] == [0.0, 2.0] and "not design allowables" in d["caution"]


def test_sweep_values_must_be_one_dimensional():
    with pytest.raises(InputError, match=r"expected a non-empty 1-d array, got shape \(2, 2\)"):
        sweep({"a": lambda x: {"E1": x}}, np.zeros((2, 2)), "E1")


def test_sweep_of_a_property_no_model_gives_is_an_error():
    with pytest.raises(InputError, match="sweep: no model gives 'E2'"):
        sweep({"a": lambda x: {"E1": x}}, [0.0], "E2")


def test_angle_sweep_of_a_ply_constant_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="property 'E1': an angle sweep gives Ex, Ey, Gxy, nuxy"):
        sweep_angle(glass_epoxy, "E1")


def test_unknown_angle_family_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match="family: expected 'off_axis' or 'angle_ply'"):
        sweep_angle(glass_epoxy, family="cross_ply")  # type: ignore[arg-type]


def test_shares_outside_the_unit_interval_are_an_error(glass_epoxy):
    with pytest.raises(InputError, match=r"shares: 1.5 is outside \[0, 1\]"):
        sweep_ply_share(glass_epoxy, shares=[0.5, 1.5])


def test_ply_fraction_above_the_packing_limit_is_an_error(glass_epoxy):
    with pytest.raises(InputError, match=r"volume_fraction = 0.9 must lie in \[0, 0.82\]"):
        sweep_ply_share(glass_epoxy, volume_fraction=0.9)


def test_ply_sweep_without_a_fraction_is_an_error(glass, resin):
    with pytest.raises(InputError, match="volume_fraction: give the fibre fraction of the plies"):
        sweep_angle(Constituents(glass, resin))


def test_fraction_sweep_with_a_model_that_does_not_apply_is_an_error(glass, resin):
    c = Constituents(glass, resin, "sphere")
    with pytest.raises(InputError, match="models: 'chamis' does not apply to sphere inclusions"):
        sweep_fraction(c, "E1", models=["chamis"])


def test_matrix_override_sweeps_several_matrices(glass_epoxy):
    s = sweep_fraction(glass_epoxy, "G12", [0.5], matrix=MatrixPhase([3e9, 4e9], 0.35),
                       models=["rule_of_mixtures"], bounds=False)
    assert s.values["rule_of_mixtures"].shape == (2, 1)


def test_angle_sweep_of_a_random_mat_is_flat_and_has_no_bounds(glass, resin):
    from micromech.materials import Composite

    mat = Composite(glass, resin, 0.3, orientation="random_in_plane")
    s = sweep_angle(mat, "Ex", [0.0, 30.0, 45.0, 90.0])  # bounds=True by default: none apply
    v = s.values["mori_tanaka"]
    np.testing.assert_allclose(v, v[0], rtol=1e-12)  # in-plane isotropic ply: exact
