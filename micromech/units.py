"""Quantities with units at the edges: parse once into SI floats.

Everything inside micromech is SI (Pa, m, K, kg/m^3, 1/K, N/m). Strings such as ``"72 GPa"``,
``"7 um"``, ``"2.54 g/cm^3"``, ``"-0.5e-6 1/K"`` or ``"100 N/mm"`` are accepted in files, at the
CLI and in constructors, and converted here. Bare numbers mean SI already.

The pint registry is created on first use only, so importing this module is cheap.
"""

from __future__ import annotations

import math
import re
from functools import lru_cache
from typing import TYPE_CHECKING, Any

from micromech.errors import UnitError, suggest

if TYPE_CHECKING:  # pragma: no cover
    import pint

__all__ = ["COMMON_UNITS", "DIMENSIONS", "parse_quantity", "to_si", "unit_factor", "format_si"]

#: Physical kinds a field may expect -> their SI unit ("" for a plain number). The kind's
#: dimension is that of its SI unit.
DIMENSIONS: dict[str, str] = {
    "pressure": "Pa",
    "length": "m",
    "area": "m^2",
    "force": "N",
    "force_per_length": "N/m",
    "moment_per_length": "N",
    "density": "kg/m^3",
    "expansion": "1/K",
    "temperature_change": "K",
    "energy_per_volume": "J/m^3",
    "dimensionless": "",
}

#: Unit names of engineering use, offered when a unit name is unknown (``'KN'`` -> ``'kN'``)
#: or read as another unit because of its case (``'kn'`` is a knot, ``'MM'`` megamolar).
COMMON_UNITS: tuple[str, ...] = (
    "Pa", "kPa", "MPa", "GPa", "psi", "ksi", "Msi", "bar",
    "N", "kN", "MN", "lbf", "kip",
    "m", "cm", "mm", "um", "nm", "inch", "in", "ft",
    "g", "kg", "lb", "J", "kJ", "MJ",
    "K", "degC", "degF", "delta_degC", "delta_degF", "percent",
)
_FOLDED_UNITS = {u.casefold(): u for u in COMMON_UNITS}
_TOKEN = re.compile(r"(?<![\d.])[A-Za-zµ_]+")

_PLAIN_WORDS = {
    "pressure": "a pressure (e.g. '72 GPa')",
    "length": "a length (e.g. '7 um')",
    "area": "an area (e.g. '1 mm^2')",
    "force": "a force (e.g. '10 N')",
    "force_per_length": "a force per length (e.g. '100 N/mm')",
    "moment_per_length": "a moment per length (e.g. '5 N*mm/mm')",
    "density": "a density (e.g. '2.54 g/cm^3')",
    "expansion": "a thermal expansion coefficient (e.g. '5e-6 1/K')",
    "temperature_change": "a temperature change (e.g. '-100 K')",
    "energy_per_volume": "an energy per volume (e.g. '1 MJ/m^3')",
    "dimensionless": "a plain number",
}


@lru_cache(maxsize=1)
def _registry() -> pint.UnitRegistry:
    import pint

    ureg: pint.UnitRegistry = pint.UnitRegistry(autoconvert_offset_to_baseunit=True)
    return ureg


def _as_difference(text: str) -> str:
    """Read degC/degF as temperature differences: CTEs and delta_T are differences, not levels."""
    return re.sub(r"(?<![\w])(deg(?:ree)?_?[CF]|°[CF])(?![\w])",
                  lambda m: "delta_degC" if m.group(1)[-1] == "C" else "delta_degF", text)


def _checked(value: float, field: str, text: object) -> float:
    if not math.isfinite(value):
        raise UnitError(f"{field} must be a finite number, got {text!r}")
    # pint's conversion leaves float noise (2.55 g/cm^3 -> 2549.9999999999995): round to 15 digits
    return float(f"{value:.15g}")


def parse_quantity(value: Any, kind: str, field: str = "value") -> float:
    """Convert a number or a quantity string to an SI float of the expected kind.

    Parameters
    ----------
    value : float or str
        A bare number (taken as SI) or a string with a unit, such as ``"72 GPa"``.
    kind : str
        One of the keys of :data:`DIMENSIONS` (``"pressure"``, ``"length"``, ...).
    field : str
        Name of the field, used in error messages.

    Returns
    -------
    float
        The value in SI units.

    Raises
    ------
    UnitError
        If the string cannot be parsed or its dimension is not the expected one.

    Examples
    --------
    >>> parse_quantity("72 GPa", "pressure", "E")
    72000000000.0
    >>> parse_quantity(7e-6, "length")
    7e-06
    """
    if kind not in DIMENSIONS:
        raise UnitError(
            f"{field}: unknown quantity kind {kind!r}; expected one of {sorted(DIMENSIONS)}"
        )
    if isinstance(value, bool):
        raise UnitError(f"{field} expects {_PLAIN_WORDS[kind]}, got {value!r}")
    if isinstance(value, int | float):
        return float(value)  # numbers pass through; the caller's validation judges their range
    if not isinstance(value, str):
        try:
            return float(value)
        except (TypeError, ValueError):
            raise UnitError(
                f"{field} expects {_PLAIN_WORDS[kind]}, got {value!r} "
                f"of type {type(value).__name__}"
            ) from None
    text = value.strip()
    try:
        number = float(text)
    except ValueError:
        return _checked(_parse_string(text, kind, field), field, text)
    return _checked(number, field, text)


def _why(exc: Exception) -> str:
    """Pint's own message where it has one; tokenizer internals are not shown."""
    import pint

    return f": {exc}" if isinstance(exc, pint.errors.PintError) and str(exc) else ""


def _parse_string(text: str, kind: str, field: str) -> float:
    ureg = _registry()
    if kind in ("expansion", "temperature_change"):
        text = _as_difference(text)
    try:
        q: Any = ureg.Quantity(text.replace("µ", "u"))
    except Exception as exc:  # noqa: BLE001 - pint raises many kinds on malformed text
        raise UnitError(
            f"{field} expects {_PLAIN_WORDS[kind]}, could not read {text!r}{_why(exc)}"
            f"{_unit_hint(exc, text, kind)}"
        ) from None
    if not hasattr(q, "dimensionality") or q.dimensionality != _dimensionality(kind):
        fixed = _case_fixed(text, kind)
        hint = f"; did you mean {fixed!r}?" if fixed is not None else ""
        raise UnitError(
            f"{field} expects {_PLAIN_WORDS[kind]}, got {text!r}{_what_it_is(q)}{hint}"
        )
    return float(q.to(DIMENSIONS[kind] or "dimensionless").magnitude)


def _dimensionality(kind: str) -> Any:
    """Return pint's dimensionality of the SI unit of a quantity kind."""
    return _registry().Quantity(1, DIMENSIONS[kind] or "dimensionless").dimensionality


def _case_fixed(text: str, kind: str | None) -> str | None:
    """Return ``text`` with unit names of the wrong case corrected, when that makes it valid.

    ``'100 KN'`` -> ``'100 kN'``; ``'2 kn'`` (knots) -> ``'2 kN'`` for a force. None when no
    name changes or the corrected text is not a quantity of ``kind`` (any kind when None).
    """
    def fix(m: re.Match[str]) -> str:
        word = m.group(0)
        return word if word in COMMON_UNITS else _FOLDED_UNITS.get(word.casefold(), word)

    fixed = _TOKEN.sub(fix, text)
    if fixed == text:
        return None
    try:
        q: Any = _registry().Quantity(_as_difference(fixed.replace("µ", "u")))
    except Exception:  # noqa: BLE001 - pint raises many kinds on malformed text
        return None
    if kind is not None and getattr(q, "dimensionality", None) != _dimensionality(kind):
        return None
    return fixed


def _unit_hint(exc: Exception, text: str, kind: str | None) -> str:
    """Return the "did you mean" hint for a unit text pint did not read as meant, or ''."""
    fixed = _case_fixed(text, kind)
    if fixed is not None:
        return f"; did you mean {fixed!r}?"
    names = getattr(exc, "unit_names", None) or ()
    return suggest(names[0], COMMON_UNITS) if names else ""


def _what_it_is(q: Any) -> str:
    """Name the kind of quantity a wrongly dimensioned value is, for the error message."""
    dim = getattr(q, "dimensionality", None)
    if dim is None:
        return ""
    for kind in ("pressure", "length", "force", "force_per_length", "density", "expansion",
                 "temperature_change", "area", "dimensionless"):
        if _dimensionality(kind) == dim:
            return f", which is {_PLAIN_WORDS[kind].split(' (')[0]}"
    return f", of dimension {dim}"


def to_si(value: Any, unit: str, field: str = "value") -> float:
    """Convert a number given in ``unit`` (e.g. ``"mm"``) to SI.

    Parameters
    ----------
    value : float
        The magnitude.
    unit : str
        The unit the magnitude is expressed in.
    field : str
        Name of the field, used in error messages.

    Returns
    -------
    float
        The factor-converted value in SI base units.

    Raises
    ------
    UnitError
        If ``value`` is not a number or ``unit`` is unknown.

    Examples
    --------
    >>> to_si(5, "mm")
    0.005
    """
    if isinstance(value, bool):
        raise UnitError(f"{field} = {value!r} is not a number (a magnitude in {unit!r} is needed)")
    try:
        magnitude = float(value)
    except (TypeError, ValueError):
        raise UnitError(
            f"{field} = {value!r} is not a number (a magnitude in {unit!r} is needed)"
        ) from None
    return magnitude * unit_factor(unit, field)


@lru_cache(maxsize=256)
def unit_factor(unit: str, field: str = "unit") -> float:
    """Return the factor that converts a magnitude in ``unit`` to SI base units.

    Parameters
    ----------
    unit : str
        A unit string such as ``"kN"``, ``"um"`` or ``"MPa"``.
    field : str
        Name of the field, used in error messages.

    Returns
    -------
    float
        Multiply a magnitude in ``unit`` by this factor to get SI.

    Raises
    ------
    UnitError
        If the unit is unknown.

    Notes
    -----
    A factor only converts differences for units with an offset zero: ``degC`` and ``degF`` are
    read as temperature differences (``unit_factor("degC") == 1.0``), as for CTEs and delta_T.

    Examples
    --------
    >>> unit_factor("kN")
    1000.0
    """
    ureg = _registry()
    if not isinstance(unit, str):
        raise UnitError(f"{field}: unit must be text such as 'mm' or 'kN', got {unit!r}")
    try:
        q = ureg.Quantity(1.0, _as_difference(unit.replace("µ", "u")))
    except Exception as exc:  # noqa: BLE001 - pint raises many kinds on malformed text
        raise UnitError(
            f"{field}: unknown unit {unit!r}{_why(exc)}{_unit_hint(exc, unit, None)}"
        ) from None
    return float(q.to_base_units().magnitude)


def format_si(value: float, kind: str) -> str:
    """Format an SI float for a table with an engineering unit (GPa, MPa, um, ...).

    Parameters
    ----------
    value : float
        The SI value.
    kind : str
        The quantity kind (see :data:`DIMENSIONS`).

    Returns
    -------
    str
        Text such as ``"72.0 GPa"``.
    """
    if value is None:
        return "-"
    if kind == "pressure":
        if abs(value) >= 1e9:
            return f"{value / 1e9:.4g} GPa"
        return f"{value / 1e6:.4g} MPa"
    if kind == "length":
        if abs(value) < 1e-3:
            return f"{value * 1e6:.4g} um"
        return f"{value * 1e3:.4g} mm"
    if kind == "density":
        return f"{value / 1e3:.4g} g/cm^3"
    if kind == "expansion":
        return f"{value * 1e6:.4g} 1e-6/K"
    return f"{value:.4g}"
