"""The project's exceptions: one base class, each also a builtin so callers may catch either."""

from __future__ import annotations

__all__ = [
    "MicromechError",
    "InputError",
    "UnitError",
    "InvalidMaterialError",
    "FractionError",
    "CaseFileError",
    "DataFileError",
    "RegistryError",
]


class MicromechError(Exception):
    """Base of every error micromech raises on purpose.

    The CLI prints the message of any ``MicromechError`` and exits with status 2.
    Messages name the field, the value given and the rule it broke.
    """


class InputError(MicromechError, ValueError):
    """An argument has a value outside its valid range or the wrong shape."""


class UnitError(MicromechError, ValueError):
    """A quantity string cannot be parsed or has the wrong physical dimension."""


class InvalidMaterialError(MicromechError, ValueError):
    """Constituent or ply constants that are not physically admissible."""


class FractionError(MicromechError, ValueError):
    """A fibre, void or weight fraction outside [0, 1] or above a packing limit."""


class CaseFileError(MicromechError, ValueError):
    """A case file that is malformed, has unknown keys or inconsistent entries."""


class DataFileError(MicromechError, ValueError):
    """A simulation-output file that cannot be read (names file, line and column)."""


class RegistryError(MicromechError, KeyError):
    """A materials-registry problem: unknown key, key defined twice, bad registry file."""

    def __str__(self) -> str:  # KeyError would quote the message; print it plainly
        return str(self.args[0]) if self.args else ""
