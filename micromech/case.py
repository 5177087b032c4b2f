"""Case files: one TOML file describing a composite, its laminate and the RVE results to check.

:func:`load_case` reads the file, rejects unknown keys at any nesting level (naming the table and
the nearest valid key), resolves registry references (``use = "e-glass"``, with single fields
overridden next to ``use``), parses every quantity into SI floats and returns a frozen
:class:`Case`. The layout is the contract in ``DESIGN.md`` ("Case file").

Errors: malformed TOML, unknown keys, missing or contradictory entries raise
:class:`~micromech.errors.CaseFileError`; invalid constants raise
:class:`~micromech.errors.InvalidMaterialError`, fractions :class:`~micromech.errors.FractionError`,
unreadable quantities :class:`~micromech.errors.UnitError`. Every message starts with the file
name and the table, e.g. ``case.toml: [composite] unknown key 'volume_fracton'; did you mean
'volume_fraction'?``.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech.case_fields import (
    CaseContext,
    check_keys,
    choice,
    positive,
    quantity,
    six_values,
    table_of,
    text,
    unit_factor,
)
from micromech.errors import CaseFileError, RegistryError, suggest
from micromech.homogenize.estimate import MODEL_KEYS
from micromech.materials.composite import (
    ARRANGEMENTS,
    INCLUSIONS,
    ORIENTATIONS,
    Composite,
    check_fraction,
    check_orientation,
)
from micromech.materials.models import (
    Isotropic,
    Material,
    Orthotropic,
    Strengths,
    TransverselyIsotropic,
    material_from_dict,
)
from micromech.materials.registry import Registry
from micromech.resources import read_toml

__all__ = [
    "Case",
    "ColumnSpec",
    "LaminateSpec",
    "LoadCase",
    "RveSpec",
    "ESTIMATE_MODELS",
    "LOAD_KEYS",
    "case_from_dict",
    "load_case",
]

Array = NDArray[np.float64]

#: Model keys an estimate may be named by (``[ply] model = ...``): those of the JSON contract.
ESTIMATE_MODELS: tuple[str, ...] = MODEL_KEYS
#: Laminate load keys and their quantity kinds.
LOAD_KEYS: dict[str, str] = {
    "Nx": "force_per_length", "Ny": "force_per_length", "Nxy": "force_per_length",
    "Mx": "moment_per_length", "My": "moment_per_length", "Mxy": "moment_per_length",
    "delta_T": "temperature_change",
}
ARCHITECTURES: tuple[str, ...] = ("unidirectional", "crossply", "particulate", "stack")
DIRECTIONS: tuple[str, ...] = ("x", "y", "z", "xy", "yz", "xz")
STRENGTH_KEYS: tuple[str, ...] = tuple(Strengths.model_fields)

_TOP_KEYS = ("name", "description", "fibre", "matrix", "composite", "ply", "laminate", "rve",
             "check")
_MATERIAL_KEYS = tuple(sorted(
    {"use", "kind"} | set(Isotropic.model_fields) | set(TransverselyIsotropic.model_fields)
    | set(Orthotropic.model_fields)
))
_COMPOSITE_KEYS = ("volume_fraction", "weight_fraction", "inclusion", "aspect_ratio",
                   "arrangement", "void_fraction", "orientation")
_LAMINATE_KEYS = ("layup", "ply_thickness", "loads")
_RVE_KEYS = ("architecture", "size", "layup", "load_case", "stiffness", "stress_unit")
_LOAD_CASE_KEYS = ("direction", "file", "force", "displacement", "lateral", "stress", "strain",
                   "delimiter", "skip_rows", "strain_range", "offset", "stress_unit")
_CHECK_KEYS = ("offset", "tolerance", "models", "properties", "strain_range")


# --- data classes -----------------------------------------------------------------------------


@dataclass(frozen=True)
class ColumnSpec:
    """One column of a simulation-output file.

    Attributes
    ----------
    column : str or int
        Header name, or 1-based column number.
    unit : str
        Unit of the values in the file (``"N"``, ``"um"``, ``"MPa"``, ``"%"``, ``"1"``).
    factor : float
        Multiply a file value by this to get SI.
    kind : str
        Quantity kind of the column (``"force"``, ``"length"``, ``"pressure"``,
        ``"dimensionless"``).
    direction : str or None
        For lateral columns: the direction (x, y or z) they measure.
    """

    column: str | int
    unit: str
    factor: float
    kind: str
    direction: str | None = None


@dataclass(frozen=True)
class LoadCase:
    """One RVE load case: a history file with columns, or averaged stresses and strains.

    Attributes
    ----------
    direction : str or None
        Loading direction x, y, z, xy, yz or xz (optional for averaged values only).
    file : Path or None
        Absolute path of the history file.
    force, displacement : ColumnSpec or None
        Force and displacement columns (converted with the RVE size).
    stress, strain : ColumnSpec or None
        Stress and strain columns (an alternative to force and displacement).
    lateral : tuple of ColumnSpec
        Lateral displacement (or strain) columns, for Poisson ratios.
    delimiter : str or None
        Column delimiter (None: detect).
    skip_rows : int
        Lines to skip before the header.
    strain_range : tuple of float or None
        Strain window (lo, hi) for the modulus fit.
    offset : float or None
        Strain offset for the yield point (e.g. 0.002).
    stress_values, strain_values : ndarray, shape (6,), or None
        Averaged stress (Pa) and strain in Voigt order 11, 22, 33, 23, 13, 12 (engineering shear).
    """

    direction: str | None
    file: Path | None = None
    force: ColumnSpec | None = None
    displacement: ColumnSpec | None = None
    stress: ColumnSpec | None = None
    strain: ColumnSpec | None = None
    lateral: tuple[ColumnSpec, ...] = ()
    delimiter: str | None = None
    skip_rows: int = 0
    strain_range: tuple[float, float] | None = None
    offset: float | None = None
    stress_values: Array | None = None
    strain_values: Array | None = None

    @property
    def mode(self) -> str:
        """``"force_displacement"``, ``"stress_strain"`` or ``"averaged"``."""
        if self.stress_values is not None:
            return "averaged"
        return "force_displacement" if self.force is not None else "stress_strain"


@dataclass(frozen=True)
class LaminateSpec:
    """The [laminate] table.

    Attributes
    ----------
    layup : str
        Laminate code as written (e.g. ``"[0/90]s"``).
    ply_thickness : float
        Ply thickness, m.
    loads : dict of str to float
        Nx, Ny, Nxy (N/m), Mx, My, Mxy (N m / m = N) and delta_T (K); 0.0 where not given.
    loads_given : bool
        Whether a loads table was given.
    """

    layup: str
    ply_thickness: float
    loads: dict[str, float]
    loads_given: bool = False


@dataclass(frozen=True)
class RveSpec:
    """The [rve] table.

    Attributes
    ----------
    architecture : str
        unidirectional, crossply, particulate or stack.
    size : tuple of float or None
        Cell size (x, y, z), m.
    layup : str or None
        Laminate code of a stack.
    load_cases : tuple of LoadCase
        The load cases.
    stiffness : ndarray, shape (6, 6), or None
        A full effective stiffness, Pa (Voigt, engineering shear).
    """

    architecture: str
    size: tuple[float, float, float] | None = None
    layup: str | None = None
    load_cases: tuple[LoadCase, ...] = ()
    stiffness: Array | None = None


@dataclass(frozen=True)
class Case:
    """A loaded case file; every quantity in SI.

    Attributes
    ----------
    name : str
        The case name.
    path : Path or None
        Absolute path of the case file (None when built from a dict).
    directory : Path
        Folder of the case file; relative paths resolve against it.
    fibre, matrix : Material or None
        Constituents.
    composite : Composite or None
        None when the fibre, the matrix or the fraction is missing.
    ply : Material or None
        Measured ply constants from [ply] (with strengths), or None.
    ply_strengths : Strengths or None
        Ply strengths given in [ply] (also without ply constants).
    ply_model : str
        Estimate that gives ply constants when [ply] has none (default ``"mori_tanaka"``).
    laminate : LaminateSpec or None
        The [laminate] table.
    rve : RveSpec or None
        The [rve] table.
    check : dict
        The [check] table (offset, tolerance, ...), SI.
    description : str
        Optional free text.
    """

    name: str
    path: Path | None
    directory: Path
    fibre: Material | None = None
    matrix: Material | None = None
    composite: Composite | None = None
    ply: Material | None = None
    ply_strengths: Strengths | None = None
    ply_model: str = "mori_tanaka"
    laminate: LaminateSpec | None = None
    rve: RveSpec | None = None
    check: dict[str, Any] = field(default_factory=dict)
    description: str = ""


# --- sections ---------------------------------------------------------------------------------


def _material(ctx: CaseContext, value: Any, where: str) -> Material:
    label = f"{ctx.label}: {where}"
    if isinstance(value, str):
        try:
            return ctx.registry[value]
        except RegistryError as exc:
            raise RegistryError(f"{label} {exc}") from None
    table = dict(table_of(ctx, value, where))
    check_keys(ctx, table, _MATERIAL_KEYS, where)
    return _resolve(ctx, table, label, name=where.strip("[]"))


def _resolve(ctx: CaseContext, table: dict[str, Any], label: str, **defaults: str) -> Material:
    """Build a registry entry (``use = KEY`` plus overrides) or inline constants (``defaults``)."""
    if "use" in table:
        return ctx.registry.resolve(table, label=label)
    return material_from_dict({**defaults, **table}, label=label)


def _composite(
    ctx: CaseContext, value: Any, fibre: Material | None, matrix: Material | None
) -> Composite | None:
    where = "[composite]"
    table = table_of(ctx, value, where)
    check_keys(ctx, table, _COMPOSITE_KEYS, where)
    if "volume_fraction" in table and "weight_fraction" in table:
        raise ctx.error(where, "give volume_fraction or weight_fraction, not both")
    if "volume_fraction" not in table and "weight_fraction" not in table:
        raise ctx.error(where, "missing required key 'volume_fraction' (or 'weight_fraction'): "
                               "the fibre fraction of the composite")
    inclusion = choice(ctx, table.get("inclusion", "continuous"), INCLUSIONS, where, "inclusion")
    arrangement = choice(ctx, table.get("arrangement", "random"), ARRANGEMENTS, where,
                          "arrangement")
    orientation = choice(ctx, table.get("orientation", "aligned"), ORIENTATIONS, where,
                          "orientation")
    with ctx.prefix(where):
        check_orientation(orientation, inclusion, arrangement)
    aspect = table.get("aspect_ratio")
    if aspect is not None:
        aspect = positive(ctx, aspect, "dimensionless", where, "aspect_ratio")
    void = quantity(ctx, table.get("void_fraction", 0.0), "dimensionless", where,
                     "void_fraction")
    key = "volume_fraction" if "volume_fraction" in table else "weight_fraction"
    frac = quantity(ctx, table[key], "dimensionless", where, key)
    with ctx.prefix(where):
        if fibre is None or matrix is None:
            # no composite without both constituents (a geometry-only case), but the fraction
            # must still be a fraction
            check_fraction(frac, key)
            return None
        if key == "volume_fraction":
            return Composite(fibre, matrix, frac, inclusion=inclusion,  # type: ignore[arg-type]
                             aspect_ratio=aspect, arrangement=arrangement,  # type: ignore[arg-type]
                             void_fraction=void, orientation=orientation)  # type: ignore[arg-type]
        return Composite.from_weight_fraction(
            fibre, matrix, frac, void_fraction=void, inclusion=inclusion,  # type: ignore[arg-type]
            aspect_ratio=aspect, arrangement=arrangement,  # type: ignore[arg-type]
            orientation=orientation,  # type: ignore[arg-type]
        )


def _ply(ctx: CaseContext, value: Any) -> tuple[Material | None, Strengths | None, str]:
    where = "[ply]"
    table = dict(table_of(ctx, value, where))
    check_keys(ctx, table, _MATERIAL_KEYS + STRENGTH_KEYS + ("model",), where)
    model = choice(ctx, table.pop("model", "mori_tanaka"), ESTIMATE_MODELS, where, "model")
    flat = {k: table.pop(k) for k in STRENGTH_KEYS if k in table}
    nested = table.get("strengths")
    if nested is not None and not isinstance(nested, dict):
        raise ctx.error(where, f"strengths must be a table such as {{Xt = \"1900 MPa\"}}, got "
                               f"{nested!r}")
    strengths: Strengths | None = None
    if flat or nested:
        with ctx.prefix(where):
            strengths = Strengths(**{**(nested or {}), **flat})  # flat keys win
    constants = [k for k in table if k not in ("name", "source", "notes", "role", "strengths")]
    if not constants:
        return None, strengths, model
    if strengths is not None:
        table["strengths"] = strengths.as_dict()
    ply = _resolve(ctx, table, f"{ctx.label}: {where}", name="ply", role="ply")
    return ply, ply.strengths, model


def _laminate(ctx: CaseContext, value: Any) -> LaminateSpec:
    where = "[laminate]"
    table = table_of(ctx, value, where)
    check_keys(ctx, table, _LAMINATE_KEYS, where)
    if "layup" not in table:
        raise ctx.error(where, "missing required key 'layup' (e.g. layup = \"[0/90]s\")")
    if "ply_thickness" not in table:
        raise ctx.error(where, "missing required key 'ply_thickness' (e.g. \"0.25 mm\")")
    layup = text(ctx, table["layup"], where, "layup")
    t = positive(ctx, table["ply_thickness"], "length", where, "ply_thickness")
    loads = dict.fromkeys(LOAD_KEYS, 0.0)
    given = "loads" in table
    if given:
        lw = "[laminate.loads]"
        lt = table_of(ctx, table["loads"], lw)
        check_keys(ctx, lt, LOAD_KEYS, lw)
        for k, v in lt.items():
            loads[k] = quantity(ctx, v, LOAD_KEYS[k], lw, k)
    return LaminateSpec(layup=layup, ply_thickness=t, loads=loads, loads_given=given)


def _column(ctx: CaseContext, value: Any, where: str, kinds: tuple[str, ...],
            default_unit: str | None, lateral: bool = False) -> ColumnSpec:
    table = table_of(ctx, value, where)
    keys = ("column", "unit", "direction") if lateral else ("column", "unit")
    check_keys(ctx, table, keys, where)
    if "column" not in table:
        raise ctx.error(where, "missing required key 'column' (header name or 1-based number)")
    col = table["column"]
    if isinstance(col, bool) or not isinstance(col, str | int):
        raise ctx.error(where, f"column = {col!r} must be a header name or a 1-based number")
    if isinstance(col, int) and col < 1:
        raise ctx.error(where, f"column = {col} must be >= 1 (columns are numbered from 1)")
    if isinstance(col, str) and not col.strip():
        raise ctx.error(where, "column must not be empty")
    unit = table.get("unit", default_unit)
    if unit is None:
        raise ctx.error(where, "missing required key 'unit'")
    factor, kind = unit_factor(ctx, unit, kinds, where)
    direction = None
    if lateral:
        if "direction" not in table:
            raise ctx.error(where, "missing required key 'direction' (x, y or z)")
        direction = choice(ctx, table["direction"], ("x", "y", "z"), where, "direction")
    return ColumnSpec(column=col, unit=str(unit), factor=factor, kind=kind, direction=direction)


def _load_case(ctx: CaseContext, value: Any, index: int, rve_stress_unit: str | None) -> LoadCase:
    where = f"[[rve.load_case]] #{index}"
    t = table_of(ctx, value, where)
    check_keys(ctx, t, _LOAD_CASE_KEYS, where)
    averaged = isinstance(t.get("stress"), list) or isinstance(t.get("strain"), list)
    direction = t.get("direction")
    if direction is not None or not averaged:
        if direction is None:
            raise ctx.error(where, "missing required key 'direction' (x, y, z, xy, yz or xz)")
        direction = choice(ctx, direction, DIRECTIONS, where, "direction")
    if averaged:
        stray = [k for k in ("file", "force", "displacement", "lateral", "delimiter",
                             "skip_rows", "strain_range", "offset") if k in t]
        if stray:
            raise ctx.error(where, f"averaged stress/strain lists exclude file columns; "
                                   f"remove {', '.join(stray)}")
        if not (isinstance(t.get("stress"), list) and isinstance(t.get("strain"), list)):
            raise ctx.error(where, "averaged values need both stress = [6 values] and "
                                   "strain = [6 values]")
        unit = t.get("stress_unit", rve_stress_unit or "Pa")
        factor, _ = unit_factor(ctx, unit, ("pressure",), where + " stress_unit")
        return LoadCase(
            direction=direction,
            stress_values=six_values(ctx, t["stress"], where, "stress", factor),
            strain_values=six_values(ctx, t["strain"], where, "strain", 1.0),
        )
    if "stress_unit" in t:
        raise ctx.error(where, "stress_unit applies to averaged stress lists only; give the unit "
                               "in stress = {column, unit}")
    if "file" not in t:
        raise ctx.error(where, "missing required key 'file' (or give averaged stress = [...] "
                               "and strain = [...])")
    fname = text(ctx, t["file"], where, "file")
    path = (ctx.directory / fname).resolve()
    if not path.is_file():
        raise ctx.error(where, f"file {fname!r} not found (looked for {path})")
    has_fd = "force" in t or "displacement" in t
    has_ss = "stress" in t or "strain" in t
    if has_fd and has_ss:
        raise ctx.error(where, "give force and displacement, or stress and strain, not both")
    force = disp = stress = strain = None
    if has_fd:
        _both(ctx, t, where, "force", "displacement")
        force = _column(ctx, t["force"], where + " force", ("force",), None)
        disp = _column(ctx, t["displacement"], where + " displacement", ("length",), None)
    elif has_ss:
        _both(ctx, t, where, "stress", "strain")
        stress = _column(ctx, t["stress"], where + " stress", ("pressure",), None)
        strain = _column(ctx, t["strain"], where + " strain", ("dimensionless",), "1")
    else:
        raise ctx.error(where, "give force = {column, unit} and displacement = {column, unit}, "
                               "or stress and strain columns")
    lateral: list[ColumnSpec] = []
    if "lateral" in t:
        lat = t["lateral"]
        if isinstance(lat, dict):
            lat = [lat]
        if not isinstance(lat, list):
            raise ctx.error(where, f"lateral must be a list of {{column, unit, direction}}, "
                                   f"got {lat!r}")
        kinds = ("length", "dimensionless") if has_fd else ("dimensionless",)
        for j, item in enumerate(lat, start=1):
            spec = _column(ctx, item, f"{where} lateral #{j}", kinds, None, lateral=True)
            if direction is not None and spec.direction == direction:
                raise ctx.error(where, f"lateral #{j} direction {spec.direction!r} is the load "
                                       "direction; lateral columns measure another axis")
            lateral.append(spec)
    delim = t.get("delimiter")
    if delim is not None and (not isinstance(delim, str) or delim == ""):
        raise ctx.error(where, f"delimiter = {delim!r} must be a non-empty string")
    skip = t.get("skip_rows", 0)
    if isinstance(skip, bool) or not isinstance(skip, int) or skip < 0:
        raise ctx.error(where, f"skip_rows = {skip!r} must be a whole number >= 0")
    rng = _strain_range(ctx, t.get("strain_range"), where)
    off = _offset(ctx, t["offset"], where) if "offset" in t else None
    return LoadCase(direction=direction, file=path, force=force, displacement=disp,
                    stress=stress, strain=strain, lateral=tuple(lateral), delimiter=delim,
                    skip_rows=skip, strain_range=rng, offset=off)


def _both(ctx: CaseContext, table: dict[str, Any], where: str, a: str, b: str) -> None:
    """Raise unless the two column keys that go together are both given."""
    for key in (a, b):
        if key not in table:
            raise ctx.error(where, f"missing required key {key!r} ({a} and {b} go together)")


def _offset(ctx: CaseContext, value: Any, where: str) -> float:
    """Read the strain offset of the yield line: a strain strictly between 0 and 1."""
    off = quantity(ctx, value, "dimensionless", where, "offset")
    if not 0.0 < off < 1.0:
        raise ctx.error(where, f"offset = {value!r} must be a strain between 0 and 1, exclusive "
                               "(e.g. 0.002 or \"0.2 %\")")
    return off


def _strain_range(ctx: CaseContext, value: Any, where: str) -> tuple[float, float] | None:
    if value is None:
        return None
    if not isinstance(value, list) or len(value) != 2:
        raise ctx.error(where, f"strain_range must be [lo, hi], got {value!r}")
    lo = quantity(ctx, value[0], "dimensionless", where, "strain_range[1]")
    hi = quantity(ctx, value[1], "dimensionless", where, "strain_range[2]")
    if not 0.0 <= lo < hi:
        raise ctx.error(where, f"strain_range = {value!r} must satisfy 0 <= lo < hi")
    return (lo, hi)


def _rve(ctx: CaseContext, value: Any) -> RveSpec:
    where = "[rve]"
    t = table_of(ctx, value, where)
    check_keys(ctx, t, _RVE_KEYS, where)
    if "architecture" not in t:
        raise ctx.error(where, "missing required key 'architecture' "
                               f"({', '.join(ARCHITECTURES)})")
    arch = choice(ctx, t["architecture"], ARCHITECTURES, where, "architecture")
    size = None
    if "size" in t:
        sw = "[rve.size]"
        st = table_of(ctx, t["size"], sw)
        check_keys(ctx, st, ("x", "y", "z"), sw)
        missing = [k for k in ("x", "y", "z") if k not in st]
        if missing:
            raise ctx.error(sw, f"missing required key {missing[0]!r} (size needs x, y and z)")
        size = tuple(positive(ctx, st[k], "length", sw, k) for k in ("x", "y", "z"))
    layup = text(ctx, t["layup"], where, "layup") if "layup" in t else None
    stress_unit = t.get("stress_unit")
    if stress_unit is not None:
        unit_factor(ctx, stress_unit, ("pressure",), where + " stress_unit")
    cases: list[LoadCase] = []
    raw_cases = t.get("load_case", [])
    if isinstance(raw_cases, dict):
        raw_cases = [raw_cases]
    if not isinstance(raw_cases, list):
        raise ctx.error(where, "load_case must be a list of tables ([[rve.load_case]])")
    for i, lc in enumerate(raw_cases, start=1):
        cases.append(_load_case(ctx, lc, i, stress_unit))
    seen: dict[str, int] = {}
    for i, lc in enumerate(cases, start=1):
        if lc.direction is None:
            continue
        if lc.direction in seen:
            raise ctx.error(where, f"direction {lc.direction!r} is given twice (load cases "
                                   f"#{seen[lc.direction]} and #{i})")
        seen[lc.direction] = i
    if size is None and any(lc.mode == "force_displacement" for lc in cases):
        raise ctx.error(where, "size = {x, y, z} is needed to turn force and displacement into "
                               "stress and strain")
    stiffness = None
    if "stiffness" in t:
        sw = "[rve.stiffness]"
        stt = table_of(ctx, t["stiffness"], sw)
        check_keys(ctx, stt, ("matrix", "unit"), sw)
        if "matrix" not in stt:
            raise ctx.error(sw, "missing required key 'matrix' (6 rows of 6 values)")
        factor, _ = unit_factor(ctx, stt.get("unit", "Pa"), ("pressure",), sw)
        rows = stt["matrix"]
        if not isinstance(rows, list) or len(rows) != 6:
            raise ctx.error(sw, "matrix must have 6 rows of 6 values")
        stiffness = np.vstack([six_values(ctx, r, sw, f"matrix row {i}", factor)
                               for i, r in enumerate(rows, start=1)])
        stiffness.flags.writeable = False
    return RveSpec(architecture=arch, size=size, layup=layup,  # type: ignore[arg-type]
                   load_cases=tuple(cases), stiffness=stiffness)


def _property_names(architecture: str | None) -> tuple[tuple[str, ...], str]:
    """Property names a check may grade, and what they are the names of (for messages).

    All names of :data:`micromech.rve.tolerances.PROPERTY_NAMES` without an ``[rve]`` table;
    with one, those of its architecture (material axes E1 ... nu32 for unidirectional and
    particulate cells, stack axes Ex ... nuzy for cross-ply and stack cells) and the strengths.
    """
    from micromech.rve.causes import STACK_PROPERTIES, UD_PROPERTIES
    from micromech.rve.tolerances import PROPERTY_NAMES

    if architecture is None:
        return PROPERTY_NAMES, "the check"
    elastic = STACK_PROPERTIES if architecture in ("crossply", "stack") else UD_PROPERTIES
    strengths = tuple(n for n in PROPERTY_NAMES if "strength" in n)
    return (*elastic, *strengths), f"a {architecture} cell"


def _property(ctx: CaseContext, name: str, names: tuple[str, ...], of: str, where: str,
              key: str) -> str:
    if name in names:
        return name
    from micromech.rve.causes import STACK_PROPERTIES, UD_PROPERTIES

    # the same property in the other axes: x = 1 (fibre), y = 2, z = 3
    same = {**dict(zip(UD_PROPERTIES, STACK_PROPERTIES, strict=True)),
            **dict(zip(STACK_PROPERTIES, UD_PROPERTIES, strict=True))}
    if same.get(name) in names:
        hint = f"; {of} names it {same[name]!r}"
    else:
        hint = suggest(name, names)
    shown = ", ".join(n for n in names if "strength" not in n)
    raise ctx.error(where, f"{key} {name!r} is not a property of {of}{hint} (names: {shown}, "
                           "and yield_strength_D, ultimate_strength_D with D a load direction)")


def _check_section(ctx: CaseContext, value: Any, architecture: str | None = None) -> dict[str, Any]:
    where = "[check]"
    t = table_of(ctx, value, where)
    check_keys(ctx, t, _CHECK_KEYS, where)
    names, of = _property_names(architecture)
    out: dict[str, Any] = {}
    if "offset" in t:
        out["offset"] = _offset(ctx, t["offset"], where)
    if "strain_range" in t:
        out["strain_range"] = _strain_range(ctx, t["strain_range"], where)
    if "tolerance" in t:
        tw = "[check.tolerance]"
        tt = table_of(ctx, t["tolerance"], tw)
        tol: dict[str, float] = {}
        for k, v in tt.items():
            _property(ctx, k, names, of, tw, "tolerance for")
            x = quantity(ctx, v, "dimensionless", tw, k)
            if not 0.0 <= x < 1.0:
                raise ctx.error(tw, f"{k} = {v!r} must be a relative tolerance in [0, 1) (e.g. "
                                    "0.05 or \"5 %\")")
            tol[k] = x
        out["tolerance"] = tol
    if "models" in t:
        models = t["models"]
        if not isinstance(models, list):
            raise ctx.error(where, f"models must be a list of estimate keys, got {models!r}")
        out["models"] = [choice(ctx, m, ESTIMATE_MODELS, where, "models") for m in models]
    if "properties" in t:
        props = t["properties"]
        if not isinstance(props, list) or not all(isinstance(p, str) for p in props):
            raise ctx.error(where, f"properties must be a list of names, got {props!r}")
        out["properties"] = [_property(ctx, p, names, of, where, "properties:") for p in props]
    return out


# --- entry points -----------------------------------------------------------------------------


def case_from_dict(
    data: dict[str, Any],
    path: str | Path | None = None,
    registry: Registry | None = None,
) -> Case:
    """Validate a parsed case (the TOML as a dict) and build a :class:`Case`.

    Parameters
    ----------
    data : dict
        The case, as :func:`tomllib.load` returns it.
    path : str or Path, optional
        The file it came from (for messages and relative paths); the current folder otherwise.
    registry : Registry, optional
        Registry for ``use = KEY``; the default registry when not given.

    Returns
    -------
    Case
        The validated case, SI throughout.

    Raises
    ------
    CaseFileError
        Unknown keys (naming the table and the nearest valid key), missing or contradictory
        entries.
    InvalidMaterialError, FractionError, UnitError, RegistryError
        Invalid constants, fractions, quantities or registry keys (the message names the file
        and table).

    Examples
    --------
    >>> case = case_from_dict({"fibre": {"use": "e-glass"}, "matrix": {"use": "epoxy"},
    ...                        "composite": {"volume_fraction": 0.5}})
    >>> case.composite.volume_fraction
    0.5
    """
    p = Path(path).resolve() if path is not None else None
    label = str(path) if path is not None else "<case>"
    ctx = CaseContext(label, p.parent if p is not None else Path.cwd(), registry)
    if not isinstance(data, dict):
        raise CaseFileError(f"{label}: a case must be a TOML table")
    check_keys(ctx, data, _TOP_KEYS, "[top level]")
    name = data.get("name", p.stem if p is not None else "case")
    if not isinstance(name, str):
        raise ctx.error("[top level]", f"name must be text, got {name!r}")
    description = data.get("description", "")
    if not isinstance(description, str):
        raise ctx.error("[top level]", f"description must be text, got {description!r}")
    fibre = _material(ctx, data["fibre"], "[fibre]") if "fibre" in data else None
    matrix = _material(ctx, data["matrix"], "[matrix]") if "matrix" in data else None
    composite = _composite(ctx, data["composite"], fibre, matrix) if "composite" in data else None
    ply, strengths, model = _ply(ctx, data["ply"]) if "ply" in data else (None, None,
                                                                           "mori_tanaka")
    laminate = _laminate(ctx, data["laminate"]) if "laminate" in data else None
    rve = _rve(ctx, data["rve"]) if "rve" in data else None
    check = (_check_section(ctx, data["check"], rve.architecture if rve else None)
             if "check" in data else {})
    return Case(
        name=name, path=p, directory=ctx.directory, fibre=fibre, matrix=matrix,
        composite=composite, ply=ply, ply_strengths=strengths, ply_model=model,
        laminate=laminate, rve=rve, check=check, description=description,
    )


def load_case(path: str | Path, registry: Registry | None = None) -> Case:
    """Read, validate and resolve a TOML case file.

    Parameters
    ----------
    path : str or Path
        The case file.
    registry : Registry, optional
        Registry for ``use = KEY``; the default registry (bundled files plus
        ``MICROMECH_MATERIALS``) when not given.

    Returns
    -------
    Case
        The validated case, SI throughout; relative file names resolved against the case folder.

    Raises
    ------
    CaseFileError
        A missing or malformed file (with TOML's line and column), unknown keys, missing or
        contradictory entries.
    InvalidMaterialError, FractionError, UnitError, RegistryError
        See :func:`case_from_dict`.

    """
    p = Path(path)
    if not p.is_file():
        raise CaseFileError(f"{path}: case file not found")
    return case_from_dict(read_toml(p, CaseFileError, label=path), path=p, registry=registry)
