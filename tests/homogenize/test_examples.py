"""The docstring examples of every homogenize module run and print what they show."""

import doctest
import importlib

import pytest

MODULES = ["bounds", "chamis", "cylinders", "eshelby", "estimate", "halpin_tsai", "mori_tanaka",
           "orientation", "phases", "rule_of_mixtures", "strength", "thermal", "walpole"]


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples_run(name):
    mod = importlib.import_module(f"micromech.homogenize.{name}")
    assert doctest.testmod(mod).failed == 0


def test_estimate_report_examples_run():
    import micromech.report.estimate

    assert doctest.testmod(micromech.report.estimate).failed == 0
