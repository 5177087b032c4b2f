"""Likely causes and cross-checks with hand-made numbers."""

import pytest

from micromech.errors import InputError
from micromech.rve.causes import (
    Diagnosis,
    consistency_reasons,
    fit_size_error,
    fraction_for_value,
    likely_causes,
    model_label,
    property_kind,
    size_error_reason,
)

CUBE = (100e-6, 100e-6, 100e-6)
BOX = (120e-6, 80e-6, 120e-6)  # x, y, z edges (invented)


def causes(name, value, best, **ctx):
    return likely_causes(name, value, best_value=best, best_model="Mori-Tanaka",
                         band=(0.97 * best, 1.03 * best), context=Diagnosis(**ctx))


def test_unit_slip_listed_first_for_power_of_1000():
    out = causes("E1", 40e12, 40e9, direction="x", size=CUBE)
    assert out[0].startswith("Likely cause 1: A unit slip")
    assert "force declared in kN" in out[0]


def test_unit_slip_with_remaining_factor_reported():
    out = causes("E1", 40e9 * 1000 * 1.5, 40e9, direction="x", size=CUBE)
    assert "remaining factor 1.5" in out[0]


def test_unit_slip_of_stress_strain_source_names_stress_unit():
    out = causes("E2", 11e6, 11e9, direction="y", source="stress_strain")
    assert "stress unit" in out[0]


def test_percent_strain_read_as_plain_number_found():
    out = causes("E2", 11e7, 11e9, direction="y", source="stress_strain")
    assert "percent" in out[0]


def test_x_face_area_used_for_y_load_is_found():
    # y load on a 120 x 80 x 120 um box: true area x*z; with the x face (y*z) the stress is
    # x/y = 1.5 times too large
    out = causes("E2", 1.5 * 11e9, 11e9, direction="y", size=BOX)
    assert out[0].startswith("Likely cause 1: A wrong area or length")
    assert "area of the x face instead of the y face" in out[0]
    assert "close to 1.5" in out[0]


def test_wrong_gauge_length_for_shear_found():
    # xy shear: gauge length L_y; using L_x gives gamma x/y times smaller... G x/y larger
    out = causes("G12", 1.5 * 4e9, 4e9, direction="xy", size=BOX)
    assert "wrong area or length" in out[0]


def test_poisson_lengths_swapped_found():
    # nu_xy = (u_y / L_y) / (u_x / L_x); lateral strain over L_x instead of L_y -> y/x = 2/3
    out = causes("nu12", 0.3 * 80 / 120, 0.3, direction="x", lateral="y", size=BOX)
    assert "lateral strain taken over the x edge" in out[0]


def test_constrained_modulus_points_to_fixed_lateral_faces():
    out = likely_causes("E2", 16.1e9, best_value=11e9, best_model="Mori-Tanaka",
                        band=(10.5e9, 14.5e9),
                        context=Diagnosis(direction="y", constrained_modulus=16e9))
    assert out[0].startswith("Likely cause 1: Over-constrained boundary conditions")
    assert "constrained modulus" in out[0]


def test_too_soft_lists_free_faces_then_fraction():
    out = likely_causes("E2", 7e9, best_value=11e9, best_model="Mori-Tanaka",
                        band=(10.5e9, 14.5e9),
                        context=Diagnosis(direction="y", fraction=0.55,
                                          fraction_curve=([0.0, 0.3, 0.55, 0.7],
                                                          [3.5e9, 6e9, 11e9, 17e9])))
    assert "too free" in out[0]
    assert "Vf = 0.350 instead of the declared 0.55" in out[1]


def test_fraction_that_cannot_explain_is_said():
    out = likely_causes("E2", 30e9, best_value=11e9, best_model="Mori-Tanaka",
                        context=Diagnosis(fraction_curve=([0.0, 0.7], [3.5e9, 17e9])))
    assert any("a wrong fraction alone cannot explain it" in x for x in out)


def test_sign_slip_found():
    out = causes("E1", -40e9, 40e9, direction="x", size=CUBE)
    assert "A sign slip" in out[0]


def test_no_best_estimate_gives_no_causes():
    assert likely_causes("E1", 1e9, best_value=None) == []


def test_fraction_for_value_interpolates_and_picks_nearest_root():
    assert fraction_for_value(2.0, [0.0, 0.5, 1.0], [1.0, 2.0, 3.0]) == 0.5
    assert fraction_for_value(2.5, [0.0, 0.5, 1.0], [1.0, 2.0, 3.0]) == pytest.approx(0.75)
    # a curve with two crossings: the one nearest the declared fraction
    vf, vals = [0.0, 0.25, 0.5, 0.75, 1.0], [0.0, 1.0, 2.0, 1.0, 0.0]
    assert fraction_for_value(1.5, vf, vals, declared=0.8) == pytest.approx(0.625)
    assert fraction_for_value(1.5, vf, vals, declared=0.2) == pytest.approx(0.375)
    assert fraction_for_value(5.0, vf, vals) is None


def test_fit_size_error_finds_one_wrong_edge():
    # y edge declared 80 um, true 120 um: Ex and Ez 1.5 x too large, Ey 1.5 x too small
    assert fit_size_error({"x": 1.5, "y": 1 / 1.5, "z": 1.5}, BOX) == ("y", 1.5)
    # the same on top of a unit slip of the x load case
    assert fit_size_error({"x": 1.5e-3, "y": 1 / 1.5, "z": 1.5}, BOX) == ("y", 1.5)


def test_fit_size_error_ignores_scatter_and_other_patterns():
    assert fit_size_error({"x": 1.02, "y": 0.97, "z": 1.04}, BOX) is None
    assert fit_size_error({"x": 1.5, "y": 1.5, "z": 1.5}, BOX) is None
    assert fit_size_error({"x": 1.5, "y": 1.0}, BOX) is None


def test_size_error_reason_names_the_entry():
    text = size_error_reason("y", 1.5, BOX)
    assert "check size.y" in text and "120 um" in text


def test_reciprocity_failure_flags_both_ratios():
    vals = {"nuxy": 0.15, "Ex": 25e9, "nuyx": 0.30, "Ey": 25e9}
    out = consistency_reasons(vals, stack=True)
    assert set(out) == {"nuxy", "nuyx"}
    assert "Reciprocity fails" in out["nuxy"][0]


def test_reciprocity_holds_for_consistent_values():
    # nu12 / E1 = nu21 / E2 exactly (invented ply)
    vals = {"nu12": 0.28, "E1": 40e9, "nu21": 0.28 * 11e9 / 40e9, "E2": 11e9}
    assert consistency_reasons(vals) == {}


def test_unequal_inplane_moduli_of_balanced_crossply_flagged():
    out = consistency_reasons({"Ex": 25e9, "Ey": 22e9}, stack=True)
    assert "Ex" in out and "Ey" in out and "90 degree turn" in out["Ex"][0]
    assert consistency_reasons({"Ex": 25e9, "Ey": 22e9}, stack=True, symmetric=False) == {}


def test_transverse_isotropy_tolerance_depends_on_arrangement():
    vals = {"E2": 11e9, "E3": 11.8e9}  # 7 % apart
    assert "E2" in consistency_reasons(vals, arrangement="hexagonal")
    assert consistency_reasons(vals, arrangement="random") == {}


def test_property_kind_and_labels():
    assert [property_kind(n) for n in ("E1", "Gxy", "nu23", "ultimate_strength_x")] == [
        "modulus", "shear", "poisson", "strength"]
    assert model_label("mori_tanaka") == "Mori-Tanaka"
    assert model_label("stack_halpin_tsai") == "stack of Halpin-Tsai plies"


def test_fraction_curve_of_unequal_length_raises():
    with pytest.raises(InputError, match="vf and values must be 1-D of equal length"):
        fraction_for_value(1.0, [0.0, 1.0], [1.0, 2.0, 3.0])


def test_unknown_property_kind_raises():
    with pytest.raises(InputError, match="property name 'k23' is not a modulus"):
        property_kind("k23")


# --- issue 6 of the user trial: the reciprocal mistakes, the shear convention, ruled out -----

TALL = (20e-6, 70e-6, 30e-6)  # x, y, z edges (invented): Ly / Lx = 3.5


def test_other_shear_convention_is_named_with_micromechs_convention():
    # xy history written as force along y on the x face, displacement over Lx: micromech reads
    # force / (Lx Lz) and displacement / Ly, so G12 comes out (Ly / Lx)^2 = 12.25 times too large
    out = causes("G12", 12.25 * 4e9, 4e9, direction="xy", size=TALL)
    assert out[0].startswith("Likely cause 1: A wrong area or length")
    assert "close to 12.2" in out[0] and "other shear convention" in out[0]
    assert ("The xy load case is read as force along x on the face normal to y (shear stress = "
            "force / (Lx Lz)) and engineering shear strain = displacement along x / Ly.") in out[0]


def test_cell_size_with_x_and_y_swapped_is_named():
    # declared (70, 20, 30) um for a (20, 70, 30) um cell: E1 = F Ldecl_x / (A_decl u) comes out
    # (70 / 20)^2 = 12.25 times too large
    out = causes("E1", 12.25 * 40e9, 40e9, direction="x", size=(70e-6, 20e-6, 30e-6))
    assert out[0].startswith("Likely cause 1: A wrong area or length")
    assert "[rve].size with the x and y entries swapped" in out[0]


def test_history_made_for_another_face_is_found_in_the_reverse_direction():
    # x load on (20, 70, 30) um: the y face is 3.5 times smaller than the x face; force meant
    # for the y face read over the x face gives E1 / 3.5 (0.286), a factor below 1 that the
    # forward direction (all factors above 1 for this cell) cannot give
    out = causes("E1", 40e9 / 3.5, 40e9, direction="x", size=TALL)
    assert out[0].startswith("Likely cause 1: A wrong area or length")
    assert "close to 0.286" in out[0] and "force on the y face" in out[0]


def test_ruled_out_fraction_is_listed_after_the_numbered_causes():
    out = likely_causes("E2", 30e9, best_value=11e9, best_model="Mori-Tanaka",
                        context=Diagnosis(fraction_curve=([0.0, 0.7], [3.5e9, 17e9])))
    assert out[-1].startswith("Ruled out: a wrong fibre fraction.")
    assert "between 0 and 0.7" in out[-1]
    assert not any(x.startswith("Likely cause") and "fraction" in x for x in out)
