"""Sizing targets: a property name, a relation and a value, parsed from text with units.

A target reads ``NAME=VALUE``, ``NAME>=VALUE`` or ``NAME<=VALUE`` (``==`` is accepted for ``=``),
for example ``E2=9GPa``, ``density<=1.6 g/cm^3``, ``alpha1<=1e-6 1/K`` or ``E1/density>=40
GPa/(g/cm^3)`` (a specific stiffness). Values with units are converted to SI once, here.

Property names
--------------
Ply (composite) constants: ``E1 E2 E3 G12 G13 G23 nu12 nu13 nu23 alpha1 alpha2 alpha3``; mass:
``density`` and ``weight_fraction``; laminate in-plane constants (need a layup): ``Ex Ey Gxy
nuxy``; and any ratio ``A/B`` of two of these (``E1/density``).
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any, cast

from micromech.design.roots import Relation
from micromech.errors import InputError, UnitError
from micromech.units import DIMENSIONS, parse_quantity

__all__ = [
    "PROPERTY_KINDS",
    "LAMINATE_PROPERTIES",
    "SizingTarget",
    "property_kind",
    "parse_property_value",
    "format_value",
    "property_unit",
]

#: Property name -> quantity kind (see :data:`micromech.units.DIMENSIONS`).
PROPERTY_KINDS: dict[str, str] = {
    **{k: "pressure" for k in ("E1", "E2", "E3", "G12", "G13", "G23")},
    **{k: "dimensionless" for k in ("nu12", "nu13", "nu23")},
    **{k: "expansion" for k in ("alpha1", "alpha2", "alpha3")},
    "density": "density",
    "weight_fraction": "dimensionless",
    **{k: "pressure" for k in ("Ex", "Ey", "Gxy")},
    "nuxy": "dimensionless",
}

#: Names that need a laminate (a layup) to be evaluated.
LAMINATE_PROPERTIES: tuple[str, ...] = ("Ex", "Ey", "Gxy", "nuxy")

_TARGET = re.compile(r"^\s*([A-Za-z][A-Za-z0-9_]*(?:\s*/\s*[A-Za-z][A-Za-z0-9_]*)?)\s*"
                     r"(>=|<=|==|=)\s*(.+?)\s*$")

# kinds whose values (and ratios of them) are positive
_POSITIVE_KINDS = ("pressure", "density")

# display unit per kind: (label, SI per display unit)
_DISPLAY: dict[str, tuple[str, float]] = {
    "pressure": ("GPa", 1e9),
    "density": ("g/cm^3", 1e3),
    "expansion": ("1e-6/K", 1e-6),
    "dimensionless": ("", 1.0),
}


def _split(name: str) -> tuple[str, str | None]:
    parts = [p.strip() for p in name.split("/")]
    if len(parts) == 1:
        return parts[0], None
    return parts[0], parts[1]


def _known(name: str, field: str) -> str:
    if name not in PROPERTY_KINDS:
        import difflib

        near = difflib.get_close_matches(name, list(PROPERTY_KINDS), n=1, cutoff=0.5)
        hint = f"; did you mean {near[0]!r}?" if near else ""
        raise InputError(
            f"{field}: unknown property {name!r}{hint} (known: {', '.join(PROPERTY_KINDS)}, "
            "or a ratio such as 'E1/density')"
        )
    return PROPERTY_KINDS[name]


def property_kind(name: str) -> tuple[str, str | None]:
    """Return the quantity kind of a property, and of its denominator for a ratio ``A/B``.

    Parameters
    ----------
    name : str
        Property name (``"E2"``) or ratio (``"E1/density"``).

    Returns
    -------
    tuple of (str, str or None)
        Kind of the numerator and of the denominator (None for a plain property).

    Raises
    ------
    InputError
        If a name is not a known property.
    """
    num, den = _split(name)
    k = _known(num, "target")
    return k, (None if den is None else _known(den, "target"))


def _si_unit(kind: str) -> str:
    return DIMENSIONS[kind] or "1"


def parse_property_value(value: Any, name: str) -> float:
    """Convert a target value (number or string with units) to SI for the named property.

    Parameters
    ----------
    value : float or str
        ``9e9``, ``"9 GPa"``, ``"1.6 g/cm^3"``, ``"40 GPa/(g/cm^3)"`` (for ``E1/density``).
    name : str
        The property name or ratio.

    Returns
    -------
    float
        The value in SI (for a ratio: SI of the numerator per SI of the denominator).

    Raises
    ------
    UnitError
        If the value cannot be read or has the wrong dimension.
    InputError
        If the property name is unknown.
    """
    num_kind, den_kind = property_kind(name)
    field = f"target {name}"
    if den_kind is None:
        return parse_quantity(value, num_kind, field)
    if isinstance(value, int | float) and not isinstance(value, bool):
        return float(value)
    text = str(value).strip()
    try:
        return float(text)
    except ValueError:
        pass
    import pint

    from micromech.units import _registry

    ureg = _registry()
    unit = f"({_si_unit(num_kind)})/({_si_unit(den_kind)})"
    try:
        q: Any = ureg.Quantity(text.replace("µ", "u"))
        return float(q.to(unit).magnitude)
    except (pint.errors.PintError, ValueError, TypeError, AttributeError, SyntaxError) as exc:
        raise UnitError(f"{field} expects a value in {unit} (e.g. '40 GPa/(g/cm^3)'), could not "
                        f"read {text!r}: {exc}") from None


def property_unit(name: str) -> tuple[str, float]:
    """Return the display unit of a property and the SI amount of one display unit.

    Parameters
    ----------
    name : str
        Property name or ratio.

    Returns
    -------
    tuple of (str, float)
        E.g. ``("GPa", 1e9)``; ``("GPa/(g/cm^3)", 1e6)`` for ``E1/density``.
    """
    num_kind, den_kind = property_kind(name)
    lab, f = _DISPLAY.get(num_kind, ("", 1.0))
    if den_kind is None:
        return lab, f
    dlab, df = _DISPLAY.get(den_kind, ("", 1.0))
    if not dlab:
        return lab, f / df
    return f"{lab or '1'}/({dlab})", f / df


def format_value(name: str, value: float | None) -> str:
    """Format an SI value of the named property with its display unit (``"9 GPa"``).

    Parameters
    ----------
    name : str
        Property name or ratio.
    value : float or None
        The SI value.

    Returns
    -------
    str
        Four significant digits and the unit; ``"-"`` for None.
    """
    if value is None:
        return "-"
    lab, f = property_unit(name)
    text = f"{value / f:.4g}"
    if lab.startswith("1e-"):  # the power of ten joins the number: "30e-6/K"
        return text + lab[1:]
    return f"{text} {lab}" if lab else text


@dataclass(frozen=True)
class SizingTarget:
    """A requirement on one property: equal to, at least or at most a value.

    Parameters
    ----------
    name : str
        Property name (``"E2"``) or ratio (``"E1/density"``); see the module docstring.
    value : float
        Target value, SI.
    relation : {"==", ">=", "<="}
        ``"=="`` to reach the value, ``">="`` a minimum, ``"<="`` a maximum.

    Raises
    ------
    InputError
        If the name is unknown, the relation is not one of the three forms, the value is not
        finite, a modulus or density (or a ratio of them) is not positive, or a weight fraction
        lies outside [0, 1].

    Examples
    --------
    >>> t = SizingTarget.parse("E2>=9 GPa")
    >>> (t.name, t.relation, t.value)
    ('E2', '>=', 9000000000.0)
    """

    name: str
    value: float
    relation: Relation = "=="

    def __post_init__(self) -> None:
        num, den = _split(self.name)
        object.__setattr__(self, "name", num if den is None else f"{num}/{den}")
        kinds = [k for k in property_kind(self.name) if k is not None]
        if self.relation not in ("==", ">=", "<="):
            raise InputError(
                f"target {self.name}: relation {self.relation!r} is not one of '=', '>=', '<='"
            )
        v = float(self.value)
        if not v == v or v in (float("inf"), float("-inf")):
            raise InputError(f"target {self.name}: value {self.value!r} must be finite")
        if all(k in _POSITIVE_KINDS for k in kinds) and not v > 0.0:
            raise InputError(
                f"target {self.name}: value {format_value(self.name, v)} must be positive "
                "(moduli, densities and their ratios are positive)"
            )
        if self.name == "weight_fraction" and not 0.0 <= v <= 1.0:
            raise InputError(f"target weight_fraction: value {v:g} must lie in [0, 1]")
        object.__setattr__(self, "value", v)

    @classmethod
    def parse(cls, text: str) -> SizingTarget:
        """Read ``NAME=VALUE``, ``NAME>=VALUE`` or ``NAME<=VALUE`` (value with units).

        Parameters
        ----------
        text : str
            E.g. ``"E2=9GPa"``, ``"density<=1.6 g/cm^3"``, ``"E1/density>=40 GPa/(g/cm^3)"``.

        Returns
        -------
        SizingTarget
            The target with an SI value.

        Raises
        ------
        InputError
            If the text does not have the form NAME<op>VALUE or names an unknown property.
        UnitError
            If the value has the wrong unit.
        """
        m = _TARGET.match(str(text))
        if not m:
            raise InputError(
                f"target {text!r}: expected NAME=VALUE, NAME>=VALUE or NAME<=VALUE "
                "(e.g. 'E2=9GPa')"
            )
        name, op, value = m.group(1), m.group(2), m.group(3)
        rel = cast(Relation, "==" if op in ("=", "==") else op)
        return cls(name, parse_property_value(value, name), rel)

    @property
    def is_laminate(self) -> bool:
        """Whether the target needs a laminate (a layup) to be evaluated."""
        return any(p in LAMINATE_PROPERTIES for p in _split(self.name) if p)

    @property
    def parts(self) -> tuple[str, str | None]:
        """Numerator and denominator names (denominator None for a plain property)."""
        return _split(self.name)

    def describe(self) -> str:
        """Return the target as text, e.g. ``"E2 >= 9 GPa"``.

        Returns
        -------
        str
            Name, relation (``=`` for equality) and value with its unit.
        """
        op = "=" if self.relation == "==" else self.relation
        return f"{self.name} {op} {format_value(self.name, self.value)}"

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (SI value).

        Returns
        -------
        dict
            Keys name, relation, value.
        """
        return {"name": self.name, "relation": self.relation, "value": self.value}
