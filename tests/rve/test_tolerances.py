import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import InputError
from micromech.results import ElasticConstants
from micromech.rve.tolerances import (
    MARGINS,
    band_about,
    corner_plies,
    fibre_band,
    parse_tolerances,
    particle_band,
    ud_base_name,
)

# Bands come from this project's own measurement (ACCURACY.md), not an outside reference:
# the tests check that the table is read as documented.

NAMES = ["E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23", "nu21"]


def test_band_at_zero_fraction_is_the_margin_only():
    # every estimate is exact at Vf = 0 (exact identity): only the margin remains
    for name in NAMES:
        b = fibre_band(name, 10.0, 0.0, "random")
        m = MARGINS[ud_base_name(name)]
        assert (float(b.low), float(b.high)) == pytest.approx((10.0 * (1 - m), 10.0 * (1 + m)))


def test_e1_band_is_tight_three_percent():
    b = fibre_band("E1", 40e9, 0.55, "random")  # E1: MT error 0 everywhere, margin 3 %
    assert (float(b.low), float(b.high)) == pytest.approx((38.8e9, 41.2e9))


def test_e2_random_065_upper_end_from_measured_minus_18_percent():
    # full field = MT / (1 - 0.18) at the worst seed, widened by 5 %
    b = fibre_band("E2", 10e9, 0.65, "random")
    assert float(b.high) == pytest.approx(10e9 / 0.82 * 1.05)
    assert float(b.low) == pytest.approx(10e9 * 0.95)


def test_e2_band_reaches_halpin_tsai():
    b = fibre_band("E2", 10e9, 0.55, "random", halpin_tsai=15e9)
    assert float(b.high) == pytest.approx(15e9 * 1.05)
    assert "Halpin-Tsai" in b.basis


def test_nu23_band_lies_below_mori_tanaka():
    # MT overestimates nu23 (+16 to +19 % at Vf 0.65, random): band reaches down to MT / 1.19
    b = fibre_band("nu23", 0.4, 0.65, "random")
    assert float(b.low) == pytest.approx(0.4 / 1.19 * 0.95)
    assert float(b.high) == pytest.approx(0.4 * 1.05)


def test_e3_shares_the_e2_band_and_g13_the_g12_band():
    assert ud_base_name("E3") == "E2" and ud_base_name("G13") == "G12"
    a, b = fibre_band("E3", 9e9, 0.5), fibre_band("E2", 9e9, 0.5)
    assert float(a.low) == float(b.low) and float(a.high) == float(b.high)


def test_band_extrapolates_above_measured_range_and_widens():
    b65 = fibre_band("G23", 1.0, 0.65, "random")
    b75 = fibre_band("G23", 1.0, 0.75, "random")
    assert float(b75.high) > float(b65.high)


def test_square_band_is_wider_than_both_measured_arrangements():
    sq = fibre_band("E2", 1.0, 0.5, "square")
    for arr in ("random", "hexagonal"):
        b = fibre_band("E2", 1.0, 0.5, arr)
        assert float(sq.low) < float(b.low) and float(sq.high) > float(b.high)
    assert "square arrays were not measured" in sq.basis


def test_band_broadcasts_over_fraction():
    b = fibre_band("G12", np.full(4, 2e9), np.array([0.1, 0.3, 0.5, 0.7]), "random")
    assert b.low.shape == (4,) and b.high.shape == (4,)
    assert np.all(np.diff(b.high) > 0)  # wider with the fraction


@settings(max_examples=60, deadline=None)
@given(
    name=st.sampled_from(NAMES),
    vf=st.floats(0.0, 0.8),
    arrangement=st.sampled_from(["random", "hexagonal", "square"]),
    mt=st.floats(0.05, 500e9),
)
def test_band_always_contains_mori_tanaka(name, vf, arrangement, mt):
    b = fibre_band(name, mt, vf, arrangement)
    assert float(b.low) < mt < float(b.high)


def test_particle_band_flat_ten_percent_for_spheres():
    b = particle_band(5e9, "sphere")
    assert (float(b.low), float(b.high)) == pytest.approx((4.5e9, 5.5e9))
    assert "common practice, no source" in b.basis


def test_band_about_asymmetric():
    b = band_about(10.0, (0.1, 0.3))
    assert (float(b.low), float(b.high)) == pytest.approx((9.0, 13.0))


def test_parse_tolerances_reads_fraction_and_percent():
    assert parse_tolerances(["E2=0.2", "G23 = 15%"]) == pytest.approx({"E2": 0.2, "G23": 0.15})
    assert parse_tolerances({"Ex": 0.05}) == {"Ex": 0.05}


def test_unknown_property_in_band_raises():
    with pytest.raises(InputError, match="property 'Q9' has no default band"):
        fibre_band("Q9", 1.0, 0.5)


def test_unknown_arrangement_raises():
    with pytest.raises(InputError, match="arrangement = 'cubic' has no measured band"):
        fibre_band("E1", 1.0, 0.5, "cubic")


def test_particle_band_continuous_raises():
    with pytest.raises(InputError, match="inclusion = 'continuous' has no flat band"):
        particle_band(1.0, "continuous")


def test_band_about_negative_tolerance_raises():
    with pytest.raises(InputError, match="tolerance below = -0.1 must be a finite number >= 0"):
        band_about(1.0, -0.1)


def test_band_about_below_one_hundred_percent_raises():
    with pytest.raises(InputError, match="must be less than 1"):
        band_about(1.0, (1.0, 0.2))


def test_parse_tolerance_without_equals_raises():
    with pytest.raises(InputError, match="must read NAME=VALUE"):
        parse_tolerances(["E2:0.2"])


def test_parse_tolerance_unknown_name_suggests():
    with pytest.raises(InputError, match="unknown property 'E22'; did you mean 'E2'"):
        parse_tolerances(["E22=0.2"])


def test_parse_tolerance_not_a_number_raises():
    with pytest.raises(InputError, match="E2 = 'wide' is not a number"):
        parse_tolerances(["E2=wide"])


def test_parse_tolerance_out_of_range_raises():
    with pytest.raises(InputError, match=r"must lie in \[0, 1\)"):
        parse_tolerances(["E2=1.5"])


def test_error_table_ranges_are_ordered():
    from micromech.rve.tolerances import MT_ERROR

    for arr, table in MT_ERROR.items():
        for name, rows in table.items():
            assert len(rows) == 4, (arr, name)
            assert all(lo <= hi for lo, hi in rows), (arr, name)


def test_corner_plies_take_the_ends_of_each_band():
    # invented Mori-Tanaka ply of a glass/epoxy-like UD at Vf = 0.55 (not from any source)
    mt = ElasticConstants.transversely_isotropic(40e9, 10e9, 0.27, 4e9, nu23=0.4)
    stiff, soft, high, low = corner_plies(mt, 0.55, "random")
    for name in ("E1", "E2", "G12", "nu12", "nu23"):
        b = fibre_band(name, mt.get(name), 0.55, "random")
        # the stiff corner pairs high moduli with low Poisson ratios, the soft one the reverse
        stiff_end, soft_end = (b.low, b.high) if name.startswith("nu") else (b.high, b.low)
        assert float(stiff.get(name)) == pytest.approx(float(stiff_end), rel=1e-12)
        assert float(soft.get(name)) == pytest.approx(float(soft_end), rel=1e-12)
        assert float(high.get(name)) == pytest.approx(float(b.high), rel=1e-12)
        assert float(low.get(name)) == pytest.approx(float(b.low), rel=1e-12)


# --- the [check] properties list (issue 6 of the user trial) --------------------------------


def test_check_selection_accepts_names_the_results_give():
    from micromech.rve.tolerances import check_selection

    check_selection(["E1", "nu12"], ["E1", "E2", "nu12"], {}, "unidirectional")


def test_check_selection_suggests_other_case_and_swapped_indices():
    from micromech.rve.tolerances import check_selection

    with pytest.raises(InputError, match=r"'gXY' \(did you mean 'Gxy'\?\) is not a property"):
        check_selection(["gXY"], ["Gxy"], {}, "crossply")
    with pytest.raises(InputError, match=r"'G32' \(did you mean 'G23'\?\)"):
        check_selection(["G32"], ["G23"], {}, "unidirectional")


def test_check_selection_names_the_load_case_of_a_missing_poisson_ratio():
    from micromech.errors import CaseFileError
    from micromech.rve.tolerances import check_selection

    with pytest.raises(CaseFileError, match=r"'nuyz' .* direction = 'y' and a lateral column "
                                            r"in z"):
        check_selection(["nuyz"], ["Ex", "nuxy"], {}, "crossply", "demo.toml")


def test_property_order_puts_moduli_before_poisson_ratios_and_strengths():
    from micromech.rve.tolerances import property_order

    names = ["ultimate_strength_x", "nu12", "yield_strength_x", "E2", "E1", "unknown"]
    assert sorted(names, key=property_order) == [
        "E1", "E2", "nu12", "yield_strength_x", "ultimate_strength_x", "unknown"]
