"""Tests of micromech.errors: the error classes and the one "did you mean" helper."""

from __future__ import annotations

import pytest

from micromech.errors import (
    CaseFileError,
    InputError,
    MicromechError,
    RegistryError,
    UnitError,
    suggest,
)


@pytest.mark.parametrize(
    ("word", "choices", "expected"),
    [
        ("volume_fracton", ["volume_fraction", "void_fraction", "weight_fraction"],
         "; did you mean 'volume_fraction'?"),  # a clear best is named alone
        ("KN", ["N", "kN", "MN"], "; did you mean 'kN'?"),  # case does not count
        ("nx", ["Nx", "Nxy", "Mx"], "; did you mean 'Nx'?"),  # equal but for case: only that
        ("hex", ["square", "hexagonal", "random"], "; did you mean 'hexagonal'?"),  # a prefix
        ("carbn", ["carbon-standard", "carbon-high", "e-glass"],
         "; did you mean 'carbon-standard' or 'carbon-high'?"),  # a prefix with a typo
        ("random", ["aligned", "random_in_plane", "random_3d"],
         "; did you mean 'random_in_plane' or 'random_3d'?"),
        ("E", ["E1", "E2", "E3", "E4"], "; did you mean 'E1', 'E2' or 'E3'?"),  # ties: n = 3
        ("zzz", ["E1", "E2"], ""),
        ("E2", ["E2", "E22"], "; did you mean 'E22'?"),  # the word itself is never suggested
        ("E2", ["E3", "G12"], ""),  # ratio 0.5 < 0.6
    ],
)
def test_suggest_names_the_close_choices(word, choices, expected):
    assert suggest(word, choices) == expected


def test_suggest_lists_at_most_n_best_first():
    choices = ["carbon-a", "carbon-b", "carbon-c", "carbon-d"]
    assert suggest("carbon", choices) == "; did you mean 'carbon-a', 'carbon-b' or 'carbon-c'?"
    assert suggest("carbon", choices, n=1) == "; did you mean 'carbon-a'?"
    assert suggest("carbon", choices, n=0) == ""


def test_suggest_cutoff_and_non_text_words():
    assert suggest("Ee", ["E", "nu"]) == "; did you mean 'E'?"  # ratio 2/3
    assert suggest("Ee", ["E", "nu"], cutoff=0.7) == ""
    assert suggest(12, ["12a", "x"]) == "; did you mean '12a'?"


@pytest.mark.parametrize("cls", [InputError, UnitError, CaseFileError])
def test_errors_are_project_errors_and_value_errors(cls):
    with pytest.raises(MicromechError, match="bad"):
        raise cls("bad")
    with pytest.raises(ValueError, match="bad"):
        raise cls("bad")


def test_registry_error_prints_its_message_plainly():
    assert str(RegistryError("unknown material 'x'")) == "unknown material 'x'"
    with pytest.raises(KeyError):
        raise RegistryError("x")
