"""Field readers for case files: the parsing context and checks of single values.

:mod:`micromech.case` reads each table of a case file with these. Every reader either returns
the value (SI where it is a quantity) or raises an error whose message starts with the file
label and the table, e.g. ``case.toml: [composite] unknown key 'volume_fracton'; did you mean
'volume_fraction'?``.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech.errors import CaseFileError, MicromechError, suggest
from micromech.materials.registry import Registry, default_registry
from micromech.units import parse_quantity

__all__ = [
    "CaseContext",
    "check_keys",
    "choice",
    "positive",
    "quantity",
    "six_values",
    "table_of",
    "text",
    "unit_factor",
]

Array = NDArray[np.float64]


class CaseContext:
    """Carries the file label, the case folder and the registry while parsing.

    Parameters
    ----------
    label : str
        File name (or ``"<case>"``) that starts every message.
    directory : Path
        Folder that relative file names resolve against.
    registry : Registry or None
        Registry for ``use = KEY``; the default registry when None.
    """

    def __init__(self, label: str, directory: Path, registry: Registry | None) -> None:
        self.label = label
        self.directory = directory
        self._registry = registry

    @property
    def registry(self) -> Registry:
        """The registry given, or the default registry."""
        return self._registry if self._registry is not None else default_registry()

    def error(self, table: str, message: str) -> CaseFileError:
        """Build (not raise) a :class:`CaseFileError` placed at the file and ``table``."""
        return CaseFileError(f"{self.label}: {table} {message}")

    @contextmanager
    def prefix(self, table: str) -> Iterator[None]:
        """Re-raise the project's errors with the file and table in front."""
        try:
            yield
        except CaseFileError:
            raise
        except MicromechError as exc:
            if str(exc).startswith(f"{self.label}: "):
                raise  # already placed by an inner prefix
            raise type(exc)(f"{self.label}: {table} {exc}") from None


def check_keys(ctx: CaseContext, table: dict[str, Any], allowed: Iterable[str],
               where: str) -> None:
    """Reject a key of ``table`` not in ``allowed``, naming the nearest valid key.

    Parameters
    ----------
    ctx : CaseContext
        Parsing context.
    table : dict
        The table read.
    allowed : iterable of str
        Valid keys.
    where : str
        Table name for messages, e.g. ``"[composite]"``.

    Raises
    ------
    CaseFileError
        An unknown key.
    """
    allowed = tuple(allowed)
    for key in table:
        if key not in allowed:
            hint = suggest(key, allowed) or f"; valid keys: {', '.join(allowed)}"
            raise ctx.error(where, f"unknown key {key!r}{hint}")


def table_of(ctx: CaseContext, value: Any, where: str) -> dict[str, Any]:
    """Return ``value`` if it is a table (a dict); raise :class:`CaseFileError` otherwise."""
    if not isinstance(value, dict):
        raise ctx.error(where, f"must be a table, got {value!r}")
    return value


def text(ctx: CaseContext, value: Any, where: str, key: str) -> str:
    """Return ``value`` stripped if it is non-empty text; raise :class:`CaseFileError` otherwise."""
    if not isinstance(value, str) or not value.strip():
        raise ctx.error(where, f"{key} must be non-empty text, got {value!r}")
    return value.strip()


def choice(ctx: CaseContext, value: Any, options: Iterable[str], where: str, key: str) -> str:
    """Return ``value`` if it is one of ``options``; raise :class:`CaseFileError` otherwise."""
    options = tuple(options)
    if value not in options:
        raise ctx.error(where, f"{key} = {value!r} is not one of {', '.join(options)}"
                               f"{suggest(value, options)}")
    return str(value)


def quantity(ctx: CaseContext, value: Any, kind: str, where: str, key: str) -> float:
    """Parse a finite quantity of ``kind`` into SI.

    Parameters
    ----------
    ctx : CaseContext
        Parsing context.
    value : float or str
        The value as written (a number in SI, or text with a unit).
    kind : str
        Quantity kind of :func:`micromech.units.parse_quantity`.
    where, key : str
        Table and key for messages.

    Returns
    -------
    float
        The value in SI.

    Raises
    ------
    UnitError
        An unreadable quantity (placed at the file and table).
    CaseFileError
        A value that is not finite.
    """
    with ctx.prefix(where):
        x = parse_quantity(value, kind, key)
    if not math.isfinite(x):
        raise ctx.error(where, f"{key} = {value!r} must be finite")
    return x


def positive(ctx: CaseContext, value: Any, kind: str, where: str, key: str) -> float:
    """Parse like :func:`quantity` and raise :class:`CaseFileError` unless the value is > 0."""
    x = quantity(ctx, value, kind, where, key)
    if not x > 0.0:
        raise ctx.error(where, f"{key} = {value!r} must be positive")
    return x


def unit_factor(ctx: CaseContext, unit: Any, kinds: tuple[str, ...],
                where: str) -> tuple[float, str]:
    """Factor to SI of a column unit, and the first of ``kinds`` it fits.

    Parameters
    ----------
    ctx : CaseContext
        Parsing context.
    unit : str
        The unit as written (``"N"``, ``"um"``, ``"MPa"``, ``"%"``).
    kinds : tuple of str
        Quantity kinds to try, in order.
    where : str
        Table for messages.

    Returns
    -------
    factor : float
        Multiply a value in ``unit`` by this to get SI.
    kind : str
        The kind that matched.

    Raises
    ------
    CaseFileError
        A unit that is not text.
    UnitError
        A unit of none of ``kinds``.
    """
    if not isinstance(unit, str) or not unit.strip():
        raise ctx.error(where, f"unit must be text such as 'N' or 'um', got {unit!r}")
    last: MicromechError | None = None
    for kind in kinds:
        try:
            return parse_quantity(f"1 {unit}", kind, "unit"), kind
        except MicromechError as exc:
            last = exc
    assert last is not None
    raise type(last)(f"{ctx.label}: {where} unit {unit!r} is not {' or '.join(kinds)}: {last}")


def six_values(ctx: CaseContext, value: Any, where: str, key: str, factor: float) -> Array:
    """Read a list of 6 numbers (Voigt order 11, 22, 33, 23, 13, 12) times ``factor``.

    Parameters
    ----------
    ctx : CaseContext
        Parsing context.
    value : list
        The list as written.
    where, key : str
        Table and key for messages.
    factor : float
        Factor to SI.

    Returns
    -------
    ndarray, shape (6,)
        The values in SI, read-only.

    Raises
    ------
    CaseFileError
        Not a list of 6 finite numbers.
    """
    if not isinstance(value, list) or len(value) != 6:
        raise ctx.error(where, f"{key} must be a list of 6 values (Voigt order 11, 22, 33, 23, "
                               f"13, 12), got {value!r}")
    out = np.empty(6)
    for i, v in enumerate(value):
        if isinstance(v, bool) or not isinstance(v, int | float):
            raise ctx.error(where, f"{key}[{i + 1}] = {v!r} must be a number")
        out[i] = float(v) * factor
    if not np.all(np.isfinite(out)):
        raise ctx.error(where, f"{key} values must be finite")
    out.flags.writeable = False
    return out
