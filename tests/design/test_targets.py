"""Sizing targets read from text with units."""

import pytest

from micromech.design.targets import (
    SizingTarget,
    format_value,
    parse_property_value,
    property_kind,
    property_unit,
)
from micromech.errors import InputError, UnitError


@pytest.mark.parametrize(
    ("text", "name", "relation", "value"),
    [
        ("E2=9GPa", "E2", "==", 9e9),
        ("E2 == 9 GPa", "E2", "==", 9e9),
        ("E1>=120 GPa", "E1", ">=", 120e9),
        ("density<=1.6 g/cm^3", "density", "<=", 1600.0),
        ("alpha1<=-0.5e-6 1/K", "alpha1", "<=", -0.5e-6),
        ("nu12=0.3", "nu12", "==", 0.3),
        ("Ex>=50e9", "Ex", ">=", 50e9),
        ("E1 / density>=40 GPa/(g/cm^3)", "E1/density", ">=", 40e6),
        ("E1/density=25e6", "E1/density", "==", 25e6),
    ],
)
def test_targets_parse_to_si(text, name, relation, value):
    t = SizingTarget.parse(text)
    assert (t.name, t.relation) == (name, relation)
    assert t.value == pytest.approx(value, rel=1e-12)


def test_target_describes_itself_with_display_units():
    assert SizingTarget.parse("E2>=9GPa").describe() == "E2 >= 9 GPa"
    assert SizingTarget.parse("density=1.55 g/cm^3").describe() == "density = 1.55 g/cm^3"
    assert SizingTarget.parse("E1/density>=40 GPa/(g/cm^3)").describe() == (
        "E1/density >= 40 GPa/(g/cm^3)")
    assert SizingTarget("E2", 9e9, ">=").as_dict() == {"name": "E2", "relation": ">=",
                                                       "value": 9e9}


def test_laminate_targets_are_flagged():
    assert SizingTarget.parse("Ex=50GPa").is_laminate
    assert not SizingTarget.parse("E1=50GPa").is_laminate
    assert SizingTarget.parse("Ex/density=30e6").parts == ("Ex", "density")


def test_units_and_kinds():
    assert property_kind("E1/density") == ("pressure", "density")
    assert property_unit("alpha2") == ("1e-6/K", 1e-6)
    assert property_unit("nu12/density") == ("1/(g/cm^3)", 1e-3)
    assert format_value("E2", 9.2e9) == "9.2 GPa"
    assert format_value("nu12", 0.3) == "0.3"
    assert format_value("alpha2", 30e-6) == "30e-6/K"
    assert format_value("E2", None) == "-"
    assert parse_property_value(3, "E1/density") == 3.0


def test_unknown_property_is_an_error_with_a_hint():
    with pytest.raises(InputError, match="unknown property 'E22'; did you mean 'E2'"):
        SizingTarget.parse("E22=9GPa")


def test_text_without_a_relation_is_an_error():
    with pytest.raises(InputError, match="expected NAME=VALUE, NAME>=VALUE or NAME<=VALUE"):
        SizingTarget.parse("E2 9GPa")


def test_value_of_the_wrong_dimension_is_an_error():
    with pytest.raises(UnitError, match="target E2 expects a pressure"):
        SizingTarget.parse("E2=9 mm")
    with pytest.raises(UnitError, match=r"target E1/density expects a value in \(Pa\)/\(kg/m\^3\)"):
        SizingTarget.parse("E1/density>=40 GPa")


def test_unknown_relation_is_an_error():
    with pytest.raises(InputError, match="relation '>' is not one of"):
        SizingTarget("E2", 9e9, ">")  # type: ignore[arg-type]


def test_non_finite_value_is_an_error():
    with pytest.raises(InputError, match="value inf must be finite"):
        SizingTarget("E2", float("inf"))


@pytest.mark.parametrize(("text", "message"), [
    ("E2=-9GPa", r"target E2: value -9 GPa must be positive \(moduli, densities"),
    ("density<=0 g/cm^3", "target density: value 0 g/cm\\^3 must be positive"),
    ("E1/density>=-1 GPa/(g/cm^3)", "target E1/density: value -1 GPa/.* must be positive"),
    ("weight_fraction=1.2", r"target weight_fraction: value 1.2 must lie in \[0, 1\]"),
])
def test_impossible_values_are_refused(text, message):
    with pytest.raises(InputError, match=message):
        SizingTarget.parse(text)


def test_signed_properties_may_be_negative():
    assert SizingTarget.parse("alpha1<=-0.5e-6 1/K").value == pytest.approx(-0.5e-6)
    assert SizingTarget.parse("nu12>=-0.1").value == -0.1
    assert SizingTarget.parse("nu12/density<=1e-3").value == 1e-3
