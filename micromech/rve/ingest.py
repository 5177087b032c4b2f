"""Turn RVE history tables into stress-strain curves of the six load cases.

The tables come from :func:`micromech.rve.tables.read_table` (re-exported here with
:class:`~micromech.rve.tables.Table`); this module applies the column units and the RVE
geometry.

Load cases and conventions
--------------------------
The RVE is a box of edge lengths ``(Lx, Ly, Lz)``. For a normal case ``"x"`` (likewise ``"y"``,
``"z"``) the force acts along x on the face normal to x:

* stress = force / (Ly Lz), strain = displacement along x / Lx.

For a shear case ``"ij"`` (``"xy"``, ``"yz"``, ``"xz"``) the force acts along i on the face
normal to j, and the displacement along i of that face is measured over the length across, L_j:

* shear stress = force / (area of the face normal to j) = force / (L_i L_k), k the third axis;
* engineering shear strain gamma_ij = displacement along i / L_j.

For ``"xy"``: force along x on the face normal to y (area Lx Lz), displacement along x divided
by Ly. For ``"yz"``: force along y on the face normal to z (area Lx Ly), displacement along y
over Lz. For ``"xz"``: force along x on the face normal to z (area Lx Ly), displacement along x
over Lz. By the symmetry of the stress tensor the same gamma and tau follow from the
complementary loading, so the convention only fixes which columns to read.

Optional lateral displacement columns of a normal case (displacement along j of the face normal
to j, j != the load axis) give lateral strains eps_j = u_j / L_j, from which the curve metrics
read the Poisson ratios nu_ij = -eps_j / eps_i.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from functools import lru_cache
from pathlib import Path
from types import MappingProxyType
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import DataFileError, InputError, MicromechError, UnitError
from micromech.rve.tables import MIN_ROWS, Array, Table, _first_nonfinite, read_table
from micromech.units import parse_quantity, unit_factor

__all__ = [
    "DIRECTIONS",
    "NORMAL_DIRECTIONS",
    "SHEAR_DIRECTIONS",
    "ColumnRef",
    "Table",
    "Curve",
    "read_table",
    "history_to_curve",
    "curve_from_columns",
    "load_curve",
]

NORMAL_DIRECTIONS: tuple[str, ...] = ("x", "y", "z")
SHEAR_DIRECTIONS: tuple[str, ...] = ("xy", "yz", "xz")
#: The six load cases: three normal, three shear.
DIRECTIONS: tuple[str, ...] = NORMAL_DIRECTIONS + SHEAR_DIRECTIONS

#: A column reference with its unit: ``(column, unit)`` where column is a header name or a
#: 1-based number, a mapping ``{"column": ..., "unit": ...}`` as written in a case file, or any
#: object with ``.column`` and ``.unit`` attributes (the case-file column objects).
ColumnRef = tuple[str | int, str | None] | Mapping[str, Any] | Any

_AXIS = {"x": 0, "y": 1, "z": 2}


@dataclass(frozen=True, eq=False)
class Curve:
    """A stress-strain history of one load case, in SI units.

    Attributes
    ----------
    direction : str
        ``"x"``, ``"y"``, ``"z"`` (normal) or ``"xy"``, ``"yz"``, ``"xz"`` (shear).
    strain : ndarray, shape (n,)
        Normal strain, or engineering shear strain, dimensionless; read-only.
    stress : ndarray, shape (n,)
        Normal or shear stress, Pa; read-only.
    lateral : Mapping of str to ndarray, shape (n,)
        Lateral normal strains by axis (``"y"``, ``"z"`` for a case ``"x"``), read-only.
    source : str
        Where the data came from (file path), for messages.
    lines : ndarray of int, shape (n,), optional
        Line number in the source file of each point.
    """

    direction: str
    strain: Array
    stress: Array
    lateral: Mapping[str, Array] = field(default_factory=dict)
    source: str = ""
    lines: NDArray[np.int64] | None = None

    def __post_init__(self) -> None:
        label = self.source or "curve"
        _check_direction(self.direction, label)
        strain = _finite_1d(self.strain, f"{label}: strain", frozen=True)
        stress = _finite_1d(self.stress, f"{label}: stress", frozen=True)
        if strain.shape != stress.shape:
            raise InputError(
                f"{label}: strain and stress must have the same length, got {strain.size} and "
                f"{stress.size}"
            )
        lateral: dict[str, Array] = {}
        for axis, values in dict(self.lateral).items():
            _check_lateral_axis(self.direction, axis, label)
            arr = _finite_1d(values, f"{label}: lateral strain {axis}", frozen=True)
            if arr.shape != strain.shape:
                raise InputError(
                    f"{label}: lateral strain {axis} has {arr.size} points, the curve {strain.size}"
                )
            lateral[axis] = arr
        object.__setattr__(self, "strain", strain)
        object.__setattr__(self, "stress", stress)
        object.__setattr__(self, "lateral", MappingProxyType(lateral))
        if self.lines is not None:
            lines = np.array(self.lines, dtype=np.int64)
            lines.flags.writeable = False
            object.__setattr__(self, "lines", lines)

    @property
    def is_shear(self) -> bool:
        """Whether this is a shear load case."""
        return self.direction in SHEAR_DIRECTIONS

    @property
    def n_points(self) -> int:
        """Number of points."""
        return int(self.strain.size)


def _finite_1d(values: ArrayLike, label: str, *, frozen: bool = False) -> Array:
    """Check a curve array: 1-D, at least MIN_ROWS points, all finite.

    ``frozen`` returns a read-only copy (for :class:`Curve`); else the input itself where it is
    already a float array.
    """
    try:
        arr = np.array(values, dtype=np.float64, copy=True if frozen else None)
    except (TypeError, ValueError):
        raise InputError(f"{label}: expected an array of numbers") from None
    if arr.ndim != 1:
        raise InputError(f"{label}: expected a 1-D array, got shape {arr.shape}")
    if arr.size < MIN_ROWS:
        raise InputError(f"{label}: {arr.size} point(s); at least {MIN_ROWS} are needed")
    i = _first_nonfinite(arr)
    if i is not None:
        raise InputError(f"{label}: point {i} is {float(arr[i])!r}; every value must be finite")
    if frozen:
        arr.flags.writeable = False
    return arr


def _check_lateral_axis(direction: str, axis: str, label: str) -> None:
    if direction in SHEAR_DIRECTIONS:
        raise InputError(
            f"{label}: lateral strains are read for normal load cases only, not for "
            f"{direction!r}"
        )
    if axis not in _AXIS or axis == direction:
        allowed = [a for a in NORMAL_DIRECTIONS if a != direction]
        raise InputError(
            f"{label}: lateral axis of load case {direction!r} must be one of {allowed}, got "
            f"{axis!r}"
        )


def _spec(spec: Any, field: str) -> tuple[str | int, str | None]:
    if hasattr(spec, "column") and hasattr(spec, "unit"):  # a case-file column object
        return spec.column, spec.unit
    if isinstance(spec, Mapping):
        if "column" not in spec:
            raise InputError(f"{field}: expected keys 'column' and 'unit', got {sorted(spec)}")
        unknown = set(spec) - {"column", "unit"}
        if unknown:
            raise InputError(f"{field}: unknown key(s) {sorted(unknown)}; expected column, unit")
        return spec["column"], spec.get("unit")
    if isinstance(spec, str | int) and not isinstance(spec, bool):
        return spec, None
    if isinstance(spec, Sequence) and len(spec) == 2:
        return spec[0], spec[1]
    raise InputError(f"{field}: expected (column, unit) or {{column, unit}}, got {spec!r}")


def _factor(unit: Any, kind: str, field: str) -> float:
    """SI factor of a unit, checked to be of the expected kind."""
    if unit is not None and not isinstance(unit, str):
        raise UnitError(f"{field}: expected a unit string such as 'mm', got {unit!r}")
    return _cached_factor(unit, kind, field)


@lru_cache(maxsize=64)
def _cached_factor(unit: str | None, kind: str, field: str) -> float:
    if kind == "dimensionless":
        if unit is None or unit.strip() in _UNIT_FREE:
            return 1.0
        if unit.strip() in _PERCENT:
            return 0.01
        raise UnitError(
            f"{field}: strain unit must be empty, '1', '-' or '%', got {unit!r}"
        )
    if unit is None or not str(unit).strip():
        raise UnitError(f"{field}: a unit is required (e.g. {_EXAMPLE_UNITS[kind]})")
    parse_quantity(f"1 {unit}", kind, field)  # checks the dimension
    return unit_factor(str(unit).strip(), field)


def _unit(table: Table, column: str | int, unit: Any, kind: str, role: str) -> float:
    """SI factor of a column's declared unit, checked against the file's row of units."""
    factor = _factor(unit, kind, f"{role} unit")
    if not table.units:
        return factor
    j = table.index(column, f"{role} column")
    text = table.units[j].strip().strip("[]()").strip()
    if not text:
        return factor
    try:
        given = _cached_factor(text, kind, f"{role} unit row")
    except MicromechError:
        return factor  # a label that is no unit of this kind: nothing to compare
    if not math.isclose(given, factor, rel_tol=1e-9):
        raise UnitError(
            f"{table.path}, line {table.units_line}: the {role} column {table.names[j]!r} is in "
            f"{text!r} by the file's row of units, but its unit is declared {unit!r}; declare "
            "the unit the file holds"
        )
    return factor


_EXAMPLE_UNITS = {"force": "'N' or 'mN'", "length": "'mm' or 'um'", "pressure": "'MPa'"}


def _values(table: Table, column: str | int, unit: Any, kind: str, role: str) -> Array:
    """Return a column in SI: its values times the SI factor of its unit (inf on overflow)."""
    values = table.column(column, f"{role} column")
    factor = _unit(table, column, unit, kind, role)
    with np.errstate(over="ignore"):
        return values * factor


def _lateral_strains(
    table: Table, direction: str, lateral: Any, size: Array | None
) -> dict[str, Array]:
    """Lateral strains by axis, from strain columns or, given the RVE size, displacements.

    With ``size`` a column with a length unit (or none) holds the displacement u_j, strain
    u_j / L_j, and one with a strain unit the strain itself; without ``size`` every lateral
    column holds a strain.
    """
    lat: dict[str, Array] = {}
    for axis, spec in _lateral_items(lateral, table.path):
        _check_lateral_axis(direction, axis, table.path)
        role = f"lateral {axis}"
        col, unit = _spec(spec, role)
        if size is None or (unit is not None and _is_strain_unit(unit)):
            lat[axis] = _values(table, col, unit, "dimensionless", role)
        else:
            with np.errstate(over="ignore"):
                lat[axis] = _values(table, col, unit, "length", role) / size[_AXIS[axis]]
    return lat


def _lateral_items(lateral: Any, label: str) -> list[tuple[str, Any]]:
    """Lateral columns as (axis, spec) pairs from a mapping or from objects with .direction."""
    if lateral is None:
        return []
    if isinstance(lateral, Mapping):
        return list(lateral.items())
    items = []
    for spec in lateral:
        axis = getattr(spec, "direction", None)
        if axis is None and isinstance(spec, Mapping):
            axis = spec.get("direction")
            spec = {k: v for k, v in spec.items() if k != "direction"}
        if axis is None:
            raise InputError(f"{label}: each lateral column needs a direction (x, y or z)")
        items.append((str(axis), spec))
    return items


def _is_strain_unit(unit: Any) -> bool:
    return unit is None or (isinstance(unit, str) and unit.strip() in _STRAIN_UNITS)


_UNIT_FREE = ("", "1", "-", "m/m", "mm/mm")
_PERCENT = ("%", "percent")
_STRAIN_UNITS = _UNIT_FREE + _PERCENT


def _check_size(size_xyz: ArrayLike) -> Array:
    try:
        size = np.asarray(size_xyz, dtype=np.float64)
    except (TypeError, ValueError):
        raise InputError(f"size: expected three lengths in m, got {size_xyz!r}") from None
    if size.shape != (3,):
        raise InputError(f"size: expected three lengths (x, y, z) in m, got shape {size.shape}")
    if not (np.isfinite(size).all() and (size > 0).all()):
        raise InputError(
            f"size: every edge length must be positive and finite, got {size.tolist()}"
        )
    return size


def _case_geometry(direction: str, size: Array) -> tuple[float, float]:
    """Return (loaded area, gauge length) of a load case (see the module notes)."""
    if direction in NORMAL_DIRECTIONS:
        i = _AXIS[direction]
        others = [k for k in range(3) if k != i]
        return float(size[others[0]] * size[others[1]]), float(size[i])
    i, j = _AXIS[direction[0]], _AXIS[direction[1]]
    k = 3 - i - j
    return float(size[i] * size[k]), float(size[j])


def _check_finite(table: Table, values: Array, what: str) -> None:
    r = _first_nonfinite(values)
    if r is not None:
        raise DataFileError(
            f"{table.path}, line {int(table.lines[r])}: {what} overflows to {float(values[r])!r}"
        )


def _check_direction(direction: str, label: str) -> None:
    if direction not in DIRECTIONS:
        raise InputError(
            f"{label}: direction must be one of {', '.join(DIRECTIONS)}, got {direction!r}"
        )


def history_to_curve(
    table: Table,
    direction: str,
    size_xyz: ArrayLike,
    *,
    force: ColumnRef,
    displacement: ColumnRef,
    lateral: Mapping[str, ColumnRef] | Sequence[Any] | None = None,
) -> Curve:
    """Turn force and displacement columns into a stress-strain curve.

    Parameters
    ----------
    table : Table
        The history read by :func:`read_table`.
    direction : {"x", "y", "z", "xy", "yz", "xz"}
        The load case (see the module notes for the shear convention).
    size_xyz : array_like, shape (3,)
        RVE edge lengths (Lx, Ly, Lz), m.
    force : (column, unit) or {"column": ..., "unit": ...}
        The force column (name or 1-based number) and its unit (N, kN, mN, uN, ...).
    displacement : (column, unit) or mapping
        The displacement column and its unit (m, mm, um, nm, ...).
    lateral : mapping of axis to (column, unit), optional
        Lateral columns of a normal case, e.g. ``{"y": ("uy", "um")}``: displacements (a length
        unit; strain = u_j / L_j) or lateral strains directly (unit ``"1"`` or ``"%"``). Case-file
        column objects with ``.column``, ``.unit`` and ``.direction`` are accepted as a list.

    Returns
    -------
    Curve
        Stress = force / loaded area (Pa), strain = displacement / gauge length.

    Raises
    ------
    DataFileError
        If a column does not exist or holds text, NaN or infinity (naming file, line, column).
    UnitError
        If a unit is missing, unknown or of the wrong kind.
    InputError
        If the direction, size or lateral axes are invalid.
    """
    _check_direction(direction, table.path)
    size = _check_size(size_xyz)
    area, gauge = _case_geometry(direction, size)
    fcol, funit = _spec(force, "force")
    dcol, dunit = _spec(displacement, "displacement")
    f = _values(table, fcol, funit, "force", "force")
    u = _values(table, dcol, dunit, "length", "displacement")
    lat = _lateral_strains(table, direction, lateral, size)
    with np.errstate(over="ignore"):
        strain, stress = u / gauge, f / area
    _check_finite(table, stress, "stress (force / area)")
    _check_finite(table, strain, "strain (displacement / length)")
    for axis, values in lat.items():
        _check_finite(table, values, f"lateral strain {axis}")
    return Curve(
        direction=direction, strain=strain, stress=stress, lateral=lat, source=table.path,
        lines=table.lines,
    )


def curve_from_columns(
    table: Table,
    direction: str,
    *,
    stress: ColumnRef,
    strain: ColumnRef,
    lateral: Mapping[str, ColumnRef] | Sequence[Any] | None = None,
) -> Curve:
    """Read a stress-strain curve from stress and strain columns.

    Parameters
    ----------
    table : Table
        The history read by :func:`read_table`.
    direction : {"x", "y", "z", "xy", "yz", "xz"}
        The load case; for shear the strain column holds engineering shear strain.
    stress : (column, unit) or mapping
        Stress column and unit (Pa, kPa, MPa, GPa).
    strain : (column, unit) or mapping
        Strain column; unit empty / ``"1"`` / ``"-"`` (dimensionless) or ``"%"``.
    lateral : mapping of axis to (column, unit), optional
        Lateral strain columns of a normal case, dimensionless or ``"%"`` (or a list of
        case-file column objects with ``.direction``).

    Returns
    -------
    Curve
        The curve in SI.

    Raises
    ------
    DataFileError
        If a column does not exist or holds text, NaN or infinity.
    UnitError
        If a unit is unknown or of the wrong kind.
    InputError
        If the direction or the lateral axes are invalid.
    """
    _check_direction(direction, table.path)
    scol, sunit = _spec(stress, "stress")
    ecol, eunit = _spec(strain, "strain")
    sig = _values(table, scol, sunit, "pressure", "stress")
    eps = _values(table, ecol, eunit, "dimensionless", "strain")
    lat = _lateral_strains(table, direction, lateral, None)
    _check_finite(table, sig, "stress")
    return Curve(direction=direction, strain=eps, stress=sig, lateral=lat, source=table.path,
                 lines=table.lines)


def load_curve(
    path: str | Path,
    direction: str,
    size_xyz: ArrayLike | None = None,
    *,
    force: ColumnRef | None = None,
    displacement: ColumnRef | None = None,
    stress: ColumnRef | None = None,
    strain: ColumnRef | None = None,
    lateral: Mapping[str, ColumnRef] | Sequence[Any] | None = None,
    delimiter: str | None = None,
    skip_rows: int = 0,
) -> Curve:
    """Read a file and build its curve in one call (force/displacement or stress/strain).

    Parameters
    ----------
    path : str or Path
        The history file.
    direction : {"x", "y", "z", "xy", "yz", "xz"}
        The load case.
    size_xyz : array_like, shape (3,), optional
        RVE edge lengths, m; needed with force and displacement columns.
    force, displacement : (column, unit) or mapping, optional
        Force and displacement columns (give both, or neither).
    stress, strain : (column, unit) or mapping, optional
        Stress and strain columns (instead of force and displacement).
    lateral : mapping of axis to (column, unit), optional
        Lateral displacement (with force/displacement) or lateral strain columns.
    delimiter : str, optional
        As in :func:`read_table`.
    skip_rows : int
        As in :func:`read_table`.

    Returns
    -------
    Curve
        The curve in SI.

    Raises
    ------
    InputError
        If the column settings are not exactly one complete pair.
    """
    by_force = force is not None or displacement is not None
    by_stress = stress is not None or strain is not None
    if by_force == by_stress:
        raise InputError(
            f"{path}: give either force and displacement columns or stress and strain columns"
        )
    table = read_table(path, delimiter=delimiter, skip_rows=skip_rows)
    if by_force:
        if force is None or displacement is None or size_xyz is None:
            raise InputError(f"{path}: force, displacement and the RVE size are all needed")
        return history_to_curve(table, direction, size_xyz, force=force,
                                displacement=displacement, lateral=lateral)
    if stress is None or strain is None:
        raise InputError(f"{path}: both the stress and the strain column are needed")
    return curve_from_columns(table, direction, stress=stress, strain=strain, lateral=lateral)
