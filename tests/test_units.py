"""Tests of micromech.units: quantity strings to SI floats at the edges.

Conversion factors are SI definitions (BIPM SI Brochure, 9th ed., 2019) or exact unit
definitions (1 psi = 6894.757... Pa via 1 lbf = 4.4482216152605 N and 1 in = 0.0254 m).
"""

from __future__ import annotations

import math

import pytest

from micromech.errors import MicromechError, UnitError
from micromech.units import DIMENSIONS, format_si, parse_quantity, to_si, unit_factor


@pytest.mark.parametrize(
    ("text", "kind", "expected"),
    [
        ("72 GPa", "pressure", 72e9),  # SI prefix giga, exact
        ("50 MPa", "pressure", 50e6),
        ("10 ksi", "pressure", 10e3 * 4.4482216152605 / 0.0254**2),  # exact lbf and inch
        ("7 um", "length", 7e-6),
        ("7 µm", "length", 7e-6),  # micro sign accepted
        ("0.25 mm", "length", 2.5e-4),
        ("1 mm^2", "area", 1e-6),
        ("3 kN", "force", 3e3),
        ("100 N/mm", "force_per_length", 1e5),
        ("5 N*mm/mm", "moment_per_length", 5.0),
        ("2.54 g/cm^3", "density", 2540.0),
        ("5e-6 1/K", "expansion", 5e-6),
        ("-0.5e-6 1/K", "expansion", -0.5e-6),
        ("-100 K", "temperature_change", -100.0),
        ("-100 delta_degC", "temperature_change", -100.0),
        ("1 MJ/m^3", "energy_per_volume", 1e6),
        ("5 %", "dimensionless", 0.05),
        (" 3e9 ", "pressure", 3e9),  # bare number in a string is SI
    ],
)
def test_parse_quantity_converts_to_si(text, kind, expected):
    assert parse_quantity(text, kind, "field") == pytest.approx(expected, rel=1e-12)


def test_bare_numbers_are_taken_as_si():
    assert parse_quantity(72e9, "pressure") == 72e9
    assert parse_quantity(3, "length") == 3.0
    assert isinstance(parse_quantity(3, "length"), float)


def test_wrong_dimension_names_field_and_expected_kind():
    with pytest.raises(UnitError, match=r"E expects a pressure .* got '72 mm'"):
        parse_quantity("72 mm", "pressure", "E")


def test_unreadable_string_names_field():
    with pytest.raises(UnitError, match=r"nu expects a plain number, could not read 'abc'"):
        parse_quantity("abc", "dimensionless", "nu")


def test_unknown_kind_is_rejected():
    with pytest.raises(UnitError, match=r"unknown quantity kind 'speed'"):
        parse_quantity(1.0, "speed", "v")


def test_bool_is_not_a_number():
    with pytest.raises(UnitError, match=r"flag expects a plain number, got True"):
        parse_quantity(True, "dimensionless", "flag")


def test_non_numeric_object_is_rejected_with_its_type():
    with pytest.raises(UnitError, match=r"x expects a length .* of type list"):
        parse_quantity([1, 2], "length", "x")


def test_unit_errors_are_project_errors_and_value_errors():
    with pytest.raises(MicromechError, match="expects a length"):
        parse_quantity("1 kg", "length")
    with pytest.raises(ValueError, match="expects a length"):
        parse_quantity("1 kg", "length")


def test_every_kind_has_a_readable_si_unit():
    for kind, si_unit in DIMENSIONS.items():
        text = f"1 {si_unit}" if si_unit else "1"
        assert parse_quantity(text, kind, kind) == pytest.approx(1.0, rel=1e-12)


@pytest.mark.parametrize(
    ("unit", "factor"),
    [("kN", 1e3), ("um", 1e-6), ("MPa", 1e6), ("%", 0.01), ("mm", 1e-3)],  # SI definitions
)
def test_unit_factor_to_si(unit, factor):
    assert unit_factor(unit) == pytest.approx(factor, rel=1e-12)


def test_unit_factor_rejects_unknown_unit():
    with pytest.raises(UnitError, match=r"unit: unknown unit 'furlongz'"):
        unit_factor("furlongz")


def test_to_si_multiplies_by_unit_factor():
    assert to_si(5, "mm") == pytest.approx(5e-3, rel=1e-12)


@pytest.mark.parametrize(
    ("value", "kind", "text"),
    [
        (72e9, "pressure", "72 GPa"),
        (50e6, "pressure", "50 MPa"),
        (7e-6, "length", "7 um"),
        (2.5e-3, "length", "2.5 mm"),
        (2540.0, "density", "2.54 g/cm^3"),
        (5e-6, "expansion", "5 1e-6/K"),
        (0.3, "dimensionless", "0.3"),
        (None, "pressure", "-"),
    ],
)
def test_format_si_uses_engineering_units(value, kind, text):
    assert format_si(value, kind) == text


# --- temperature differences and non-finite values ---------------------------------------------


def test_expansion_per_degree_celsius_equals_per_kelvin():
    # A temperature difference of 1 degC equals 1 K (SI Brochure 9th ed., Sec. 2.3.1).
    assert parse_quantity("5e-6 1/degC", "expansion", "alpha") == pytest.approx(5e-6, rel=1e-12)


def test_temperature_change_in_celsius_is_a_difference():
    assert parse_quantity("10 degC", "temperature_change", "delta_T") == pytest.approx(10.0)


def test_non_finite_values_are_rejected():
    with pytest.raises(UnitError, match="finite"):
        parse_quantity("nan", "pressure", "E")
    assert math.isfinite(parse_quantity("1 GPa", "pressure", "E"))


# --- wrong dimensions say what was given; factors of offset units; to_si input -------------------


def test_wrong_dimension_says_what_the_value_is():
    with pytest.raises(UnitError, match=r"E expects a pressure .*, got '7 mm', which is a length$"):
        parse_quantity("7 mm", "pressure", "E")
    with pytest.raises(UnitError, match=r"got '3 m/s', of dimension \[length\] / \[time\]$"):
        parse_quantity("3 m/s", "pressure", "E")


@pytest.mark.parametrize(
    ("unit", "factor"),
    # a temperature difference of 1 degC is 1 K, of 1 degF is 5/9 K (SI Brochure 9th ed.,
    # Sec. 2.3.1; degF by definition)
    [("degC", 1.0), ("degF", 5.0 / 9.0), ("1/degC", 1.0)],
)
def test_unit_factor_of_offset_units_converts_differences(unit, factor):
    assert unit_factor(unit) == pytest.approx(factor, rel=1e-12)


def test_unit_factor_rejects_a_non_text_unit():
    with pytest.raises(UnitError, match=r"unit: unit must be text such as 'mm' or 'kN', got 3"):
        unit_factor(3)  # type: ignore[arg-type]


@pytest.mark.parametrize("value", ["x", None, True])
def test_to_si_rejects_a_value_that_is_not_a_number(value):
    with pytest.raises(UnitError, match=r"force = .* is not a number \(a magnitude in 'kN'"):
        to_si(value, "kN", "force")


def test_unit_module_examples_run():
    import doctest

    import micromech.units

    assert doctest.testmod(micromech.units).failed == 0


def test_malformed_unit_text_is_a_unit_error_not_a_crash():
    # pint raises AssertionError / tokenizer errors on such text; the project's error names it.
    for text in ("1 -", "1 (", "3 GPa)"):
        with pytest.raises(UnitError, match="f expects a force"):
            parse_quantity(text, "force", "f")
    with pytest.raises(UnitError, match="unknown unit"):
        unit_factor("(")


# --- unknown units and units of the wrong case suggest the unit meant ----------------------------


@pytest.mark.parametrize(
    ("text", "kind", "match"),
    [
        ("100 KN", "force", r"f expects a force .*could not read '100 KN': 'KN' is not defined in "
                            r"the unit registry; did you mean '100 kN'\?$"),
        ("72 Gpa", "pressure", r"did you mean '72 GPa'\?$"),
        ("72 GPA", "pressure", r"did you mean '72 GPa'\?$"),
        ("7 UM", "length", r"did you mean '7 um'\?$"),
        ("100 N/MM", "force_per_length",  # MM is megamolar: a wrong dimension, not unknown
         r"got '100 N/MM', of dimension .*\[substance\]; did you mean '100 N/mm'\?$"),
        ("2 kn", "force", r"got '2 kn', of dimension \[length\] / \[time\]; did you mean "
                          r"'2 kN'\?$"),  # kn is a knot
        ("5e-6 1/k", "expansion", r"did you mean '5e-6 1/K'\?$"),
        ("72 GPaa", "pressure", r"'GPaa' is not defined in the unit registry; did you mean "
                                r"'GPa'\?$"),  # not a case slip: the nearest common unit
    ],
)
def test_unit_slips_suggest_the_unit_meant(text, kind, match):
    with pytest.raises(UnitError, match=match):
        parse_quantity(text, kind, "f")


def test_unknown_unit_without_a_near_common_unit_has_no_hint():
    with pytest.raises(UnitError, match=r"'furlongz' is not defined in the unit registry$"):
        parse_quantity("3 furlongz", "length", "f")
    with pytest.raises(UnitError, match=r"got '7 mm', which is a length$"):
        parse_quantity("7 mm", "pressure", "E")  # a right-case unit of another kind


@pytest.mark.parametrize(("unit", "hint"), [("KN", "kN"), ("Mpa", "MPa"), ("GPA", "GPa")])
def test_unit_factor_suggests_the_unit_meant(unit, hint):
    with pytest.raises(UnitError, match=rf"unit: unknown unit '{unit}': .*; did you mean "
                                        rf"'{hint}'\?$"):
        unit_factor(unit)


def test_dimensions_map_each_kind_to_its_si_unit():
    assert DIMENSIONS["pressure"] == "Pa" and DIMENSIONS["force_per_length"] == "N/m"
    assert DIMENSIONS["dimensionless"] == ""
    assert all(isinstance(u, str) for u in DIMENSIONS.values())
