"""Read RVE output histories: delimited text into tables, tables into stress-strain curves.

A history file is delimited text: comma, tab, semicolon or whitespace (sniffed unless given),
with or without a header line, with comment lines that start with ``#`` or ``%`` and with blank
lines anywhere. Columns are named (header) or numbered from 1. The file is only read, never
changed, and the arrays handed out are read-only.

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
import warnings
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from functools import lru_cache
from pathlib import Path
from types import MappingProxyType
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import DataFileError, InputError, MicromechError, UnitError
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

Array = NDArray[np.float64]

NORMAL_DIRECTIONS: tuple[str, ...] = ("x", "y", "z")
SHEAR_DIRECTIONS: tuple[str, ...] = ("xy", "yz", "xz")
#: The six load cases: three normal, three shear.
DIRECTIONS: tuple[str, ...] = NORMAL_DIRECTIONS + SHEAR_DIRECTIONS

#: A column reference with its unit: ``(column, unit)`` where column is a header name or a
#: 1-based number, a mapping ``{"column": ..., "unit": ...}`` as written in a case file, or any
#: object with ``.column`` and ``.unit`` attributes (the case-file column objects).
ColumnRef = tuple[str | int, str | None] | Mapping[str, Any] | Any

_AXIS = {"x": 0, "y": 1, "z": 2}
_MIN_ROWS = 3
_SNIFF_LINES = 25
_DELIMITER_NAMES = {",": "comma", ";": "semicolon", "\t": "tab", " ": "whitespace"}


# ------------------------------------------------------------------------------------------
# tables


@dataclass(frozen=True, eq=False)
class Table:
    r"""A numeric table read from a delimited text file.

    Cells that are not numbers are stored as NaN and remembered in :attr:`bad_cells`; the error
    is raised only when such a column is asked for, so a text column that is never used does
    not stop the reading.

    Attributes
    ----------
    path : str
        The file read.
    header : tuple of str
        Column names from the header line; empty when the file has no header.
    data : ndarray, shape (rows, columns)
        The values, read-only; NaN where a cell is not a number.
    lines : ndarray of int, shape (rows,)
        The 1-based line number in the file of each row.
    delimiter : str
        The delimiter used: ``","``, ``";"``, ``"\t"`` or ``" "`` (any run of whitespace).
    header_line : int or None
        Line number of the header, None without one.
    bad_cells : Mapping of int to (int, str)
        For each 0-based column with a cell that is not a number: the line and text of the
        first such cell.
    units : tuple of str
        A row of units right under the header (every cell text, e.g. ``s, N, mm``), else empty.
    units_line : int or None
        Line number of that row.
    """

    path: str
    header: tuple[str, ...]
    data: Array
    lines: NDArray[np.int64]
    delimiter: str
    header_line: int | None = None
    bad_cells: Mapping[int, tuple[int, str]] = field(default_factory=dict)
    units: tuple[str, ...] = ()
    units_line: int | None = None

    @property
    def n_rows(self) -> int:
        """Number of data rows."""
        return int(self.data.shape[0])

    @property
    def n_columns(self) -> int:
        """Number of columns."""
        return int(self.data.shape[1])

    @property
    def names(self) -> tuple[str, ...]:
        """Column names: the header, or ``"1"``, ``"2"``, ... without one."""
        if self.header:
            return self.header
        return tuple(str(i + 1) for i in range(self.n_columns))

    @property
    def columns(self) -> Mapping[str, Array]:
        """Columns by name (first of duplicate names wins), read-only views, NaN where bad."""
        out: dict[str, Array] = {}
        for i, name in enumerate(self.names):
            out.setdefault(name, self.data[:, i])
        return MappingProxyType(out)

    def index(self, column: str | int, role: str = "column") -> int:
        """Return the 0-based index of a column given by name or by 1-based number.

        Parameters
        ----------
        column : str or int
            Header name (exact, else case- and space-insensitive) or 1-based column number
            (an int or a string of digits that is not a header name).
        role : str
            What the column is for (``"force column"``), used in error messages.

        Returns
        -------
        int
            The 0-based index.

        Raises
        ------
        DataFileError
            If the column does not exist or its name is ambiguous.
        """
        names = self.names
        if isinstance(column, bool) or not isinstance(column, str | int):
            raise DataFileError(
                f"{self.path}: {role} must be a column name or a 1-based column number, "
                f"got {column!r}"
            )
        if isinstance(column, str):
            hits = [i for i, n in enumerate(names) if n == column]
            if not hits:
                key = _fold(column)
                hits = [i for i, n in enumerate(names) if _fold(n) == key]
            if len(hits) > 1:
                raise DataFileError(
                    f"{self.path}, line {self.header_line}: {role} {column!r} names columns "
                    f"{', '.join(str(h + 1) for h in hits)}; give the column number instead"
                )
            if hits:
                return hits[0]
            if not column.strip().isdigit():
                where = f", line {self.header_line}" if self.header_line else ""
                listed = ", ".join(repr(n) for n in names) if self.header else "none (no header)"
                raise DataFileError(
                    f"{self.path}{where}: {role} {column!r} does not exist; column names are "
                    f"{listed}"
                )
            column = int(column.strip())
        if not 1 <= column <= self.n_columns:
            raise DataFileError(
                f"{self.path}: {role} number {column} does not exist; the file has "
                f"{self.n_columns} column(s), numbered from 1"
            )
        return column - 1

    def column(self, column: str | int, role: str = "column") -> Array:
        """Return one column as a read-only float array, checked to be all finite numbers.

        Parameters
        ----------
        column : str or int
            Header name or 1-based number (see :meth:`index`).
        role : str
            What the column is for, used in error messages.

        Returns
        -------
        ndarray, shape (rows,)
            The values as written in the file (no unit applied).

        Raises
        ------
        DataFileError
            Naming the file, line and column of the first cell that is text, empty, NaN or
            infinite, or when the column does not exist.
        """
        j = self.index(column, role)
        label = f"column {j + 1}" + (f" ({self.names[j]!r})" if self.header else "")
        if j in self.bad_cells:
            line, text = self.bad_cells[j]
            hint = ""
            if "," in text and self.delimiter != ",":
                hint = " (a decimal comma? use '.' as the decimal mark)"
            what = "an empty cell" if not text.strip() else f"{text.strip()!r} is not a number"
            raise DataFileError(f"{self.path}, line {line}, {label}: {what}{hint}")
        values = self.data[:, j]
        finite = np.isfinite(values)
        if not finite.all():
            r = int(np.argmin(finite))
            raise DataFileError(
                f"{self.path}, line {int(self.lines[r])}, {label}: value "
                f"{float(values[r])!r} is not a finite number"
            )
        return values


def _fold(name: str) -> str:
    return "".join(name.split()).lower()


def read_table(
    path: str | Path, *, delimiter: str | None = None, comment: str = "#%", skip_rows: int = 0
) -> Table:
    r"""Read a delimited text file of numbers into a :class:`Table`.

    Parameters
    ----------
    path : str or Path
        The file (read only, never changed). UTF-8, with or without a byte-order mark.
    delimiter : str, optional
        ``","``, ``";"``, ``"\t"``, or ``" "`` / ``"whitespace"`` for runs of blanks (also by
        name: ``"comma"``, ``"semicolon"``, ``"tab"``). Sniffed
        when None: the first of tab, semicolon, comma that occurs on every one of the first 25
        lines wins, else whitespace.
    comment : str
        Characters that start a comment line (after optional leading blanks). Blank lines are
        skipped too.
    skip_rows : int
        Lines at the top of the file to skip unread (a preamble), before the header.

    Returns
    -------
    Table
        The table. The first non-comment line is a header when any of its cells is not a
        number; a line right under it with no number in any cell is a row of units.

    Raises
    ------
    DataFileError
        If the file cannot be read or decoded, a row has a different number of cells than the
        first, or there are fewer than 3 data rows.
    InputError
        If ``delimiter`` is not one of the accepted ones, or ``skip_rows`` is negative.

    Examples
    --------
    >>> import tempfile, os
    >>> p = os.path.join(tempfile.mkdtemp(), "h.csv")
    >>> _ = open(p, "w").write("# invented\ndisp,force\n0,0\n1,2\n2,4\n")
    >>> t = read_table(p)
    >>> t.header, t.column("force").tolist(), t.lines.tolist()
    (('disp', 'force'), [0.0, 2.0, 4.0], [3, 4, 5])
    """
    name = str(path)
    delim = _check_delimiter(delimiter)
    if isinstance(skip_rows, bool) or not isinstance(skip_rows, int) or skip_rows < 0:
        raise InputError(f"skip_rows: expected a whole number >= 0, got {skip_rows!r}")
    try:
        raw = Path(path).read_bytes()
    except OSError as exc:
        raise DataFileError(f"{name}: cannot read the file ({exc.strerror or exc})") from None
    if raw.startswith(b"\xef\xbb\xbf"):
        raw = raw[3:]
    fast = _read_regular(raw, delim, comment, skip_rows)
    if fast is not None:
        f_header, f_header_line, f_data, f_lines, f_delim = fast
        f_data.flags.writeable = False
        f_lines.flags.writeable = False
        return Table(
            path=name, header=f_header, data=f_data, lines=f_lines, delimiter=f_delim,
            header_line=f_header_line, bad_cells=MappingProxyType({}),
        )
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = raw.count(b"\n", 0, exc.start) + 1
        raise DataFileError(
            f"{name}, line {line}: not UTF-8 text (byte {raw[exc.start]:#04x} at offset "
            f"{exc.start})"
        ) from None
    if "\r" in text:
        text = text.replace("\r\n", "\n").replace("\r", "\n")
    all_lines = text.split("\n")
    comment_chars = tuple(comment)
    keep = [
        i for i, s in enumerate(all_lines[skip_rows:], start=skip_rows)
        if s.strip() and not s.lstrip().startswith(comment_chars)
    ]
    if not keep:
        raise DataFileError(f"{name}: no data rows (only blank or comment lines)")
    lines = [all_lines[i] for i in keep]
    numbers = np.asarray(keep, dtype=np.int64) + 1
    if delim is None:
        delim = _sniff(lines[:_SNIFF_LINES])
    first = _split(lines[0], delim)
    first_line = int(numbers[0])
    header: tuple[str, ...] = ()
    header_line: int | None = None
    units: tuple[str, ...] = ()
    units_line: int | None = None
    if not all(_is_number(c) for c in first):
        header = tuple(c.strip().strip('"').strip("'").strip() for c in first)
        header_line = int(numbers[0])
        lines = lines[1:]
        numbers = numbers[1:]
        below = _split(lines[0], delim) if lines else []
        if len(below) == len(first) and not any(_is_number(c) for c in below):
            units = tuple(c.strip().strip('"').strip("'").strip() for c in below)
            units_line = int(numbers[0])
            lines = lines[1:]
            numbers = numbers[1:]
    n_cols = len(first)
    if len(lines) < _MIN_ROWS:
        raise DataFileError(
            f"{name}: {len(lines)} data row(s); at least {_MIN_ROWS} are needed for a curve"
        )
    parsed = _parse_fast(lines, delim, n_cols)
    bad: dict[int, tuple[int, str]] = {}
    if parsed is None:
        data, bad = _parse_slow(name, lines, numbers, delim, n_cols, first_line)
    else:
        data = parsed
    data.flags.writeable = False
    numbers.flags.writeable = False
    return Table(
        path=name, header=header, data=data, lines=numbers, delimiter=delim,
        header_line=header_line, bad_cells=MappingProxyType(bad), units=units,
        units_line=units_line,
    )


_MAX_LEAD = 64  # leading blanks scanned per line before the line-by-line reader takes over


def _read_regular(
    raw: bytes, delim: str | None, comment: str, skip_rows: int
) -> tuple[tuple[str, ...], int | None, Array, NDArray[np.int64], str] | None:
    """Read a regular file with vectorised line scans; None to use the line-by-line path.

    Classifies every line (blank, comment, data) and counts its cells from the byte positions
    of line breaks and delimiters, then parses all numbers in one call. Anything irregular (a
    control character, a non-ASCII character outside comment lines, a ragged row, a cell that
    is not a number, fewer than 3 rows) returns None, and the line-by-line reader then finds and
    reports it, so both paths accept and reject exactly the same files.
    """
    if b"\r" in raw:
        raw = raw.replace(b"\r\n", b"\n").replace(b"\r", b"\n")
    a = np.frombuffer(raw, dtype=np.uint8)
    if a.size == 0 or np.any((a < 9) | ((a > 13) & (a < 28))):
        return None
    # from here on, a byte <= 32 is exactly a character for which str.isspace() holds
    nl = np.flatnonzero(a == 10)
    starts = np.concatenate(([0], nl + 1))
    ends = np.concatenate((nl, [a.size]))
    lead = starts.copy()  # first non-blank character of each line (or its end)
    for _ in range(_MAX_LEAD):
        open_ = lead < ends
        step = np.zeros(lead.size, dtype=bool)
        step[open_] = a[lead[open_]] <= 32
        if not step.any():
            break
        lead[step] += 1
    else:
        return None
    blank = lead >= ends
    first_char = a[np.minimum(lead, a.size - 1)]
    marks = np.frombuffer(comment.encode("ascii", "ignore"), dtype=np.uint8)
    is_comment = ~blank & np.isin(first_char, marks)
    keep = ~blank & ~is_comment
    keep[:skip_rows] = False
    high = np.flatnonzero(a >= 128)
    if high.size:  # non-ASCII text is fine in comment lines and skipped lines only
        line_of = np.searchsorted(starts, high, side="right") - 1
        if not np.all(is_comment[line_of] | (line_of < skip_rows)):
            return None
        try:
            raw.decode("utf-8")
        except UnicodeDecodeError:
            return None
    kept = np.flatnonzero(keep)
    if kept.size == 0:
        return None
    sample = [raw[starts[i] : ends[i]].decode("ascii") for i in kept[:_SNIFF_LINES]]
    d = delim if delim is not None else _sniff(sample)
    first = _split(sample[0], d)
    header: tuple[str, ...] = ()
    header_line: int | None = None
    rows = kept
    if not all(_is_number(c) for c in first):
        header = tuple(c.strip().strip('"').strip("'").strip() for c in first)
        header_line = int(kept[0]) + 1
        rows = kept[1:]
    n_cols = len(first)
    if rows.size < _MIN_ROWS:
        return None
    if d == " ":
        space = a <= 32
        marks_at = np.flatnonzero(~space[1:] & space[:-1]) + 1  # starts of blank-separated cells
        if a[0] > 32:
            marks_at = np.concatenate(([0], marks_at))
        want = n_cols
    else:
        marks_at = np.flatnonzero(a == ord(d))
        want = n_cols - 1
    counts = np.searchsorted(marks_at, ends[rows]) - np.searchsorted(marks_at, starts[rows])
    if np.any(counts != want):
        return None
    if np.all(np.diff(rows) == 1):
        body = raw[starts[rows[0]] : ends[rows[-1]]]
    else:
        body = b"\n".join(raw[starts[i] : ends[i]] for i in rows)
    if d != " ":
        body = body.replace(b"\n", d.encode("ascii"))
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            flat = np.fromstring(body.decode("ascii"), dtype=np.float64, sep=d)
    except (ValueError, DeprecationWarning):
        return None
    if flat.size != rows.size * n_cols:
        return None
    return header, header_line, flat.reshape(rows.size, n_cols), rows.astype(np.int64) + 1, d


def _check_delimiter(delimiter: str | None) -> str | None:
    if delimiter is None:
        return None
    named = {"comma": ",", "semicolon": ";", "tab": "\t", "whitespace": " ", "space": " "}
    if isinstance(delimiter, str):
        d = named.get(delimiter.strip().lower(), delimiter)
        if d in (",", ";", "\t", " "):
            return d
    raise InputError(
        f"delimiter: expected ',', ';', '\\t' (or comma, semicolon, tab), ' ' or 'whitespace', "
        f"or None to detect it; got {delimiter!r}"
    )


def _sniff(sample: Sequence[str]) -> str:
    for d in ("\t", ";", ","):
        if all(d in s for s in sample):
            return d
    return " "


def _split(line: str, delim: str) -> list[str]:
    return line.split() if delim == " " else line.split(delim)


def _is_number(cell: str) -> bool:
    try:
        float(cell)
    except ValueError:
        return False
    return True


def _parse_fast(lines: list[str], delim: str, n_cols: int) -> Array | None:
    """Parse with numpy's C reader; None when anything is irregular (the slow path explains)."""
    if delim == " ":
        if any(len(s.split()) != n_cols for s in lines):
            return None
        body = " ".join(lines)
    else:
        if any(s.count(delim) != n_cols - 1 for s in lines):
            return None
        body = delim.join(lines)
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            flat = np.fromstring(body, dtype=np.float64, sep=delim)
    except (ValueError, DeprecationWarning):
        return None
    if flat.size != len(lines) * n_cols:
        return None
    return flat.reshape(len(lines), n_cols)


def _parse_slow(
    name: str, lines: list[str], numbers: NDArray[np.int64], delim: str, n_cols: int,
    first_line: int,
) -> tuple[Array, dict[int, tuple[int, str]]]:
    data = np.full((len(lines), n_cols), np.nan)
    bad: dict[int, tuple[int, str]] = {}
    for r, s in enumerate(lines):
        cells = _split(s, delim)
        if len(cells) != n_cols:
            raise DataFileError(
                f"{name}, line {int(numbers[r])}: {len(cells)} cell(s) where line {first_line} "
                f"has {n_cols} (delimiter: {_DELIMITER_NAMES[delim]})"
            )
        for j, c in enumerate(cells):
            try:
                data[r, j] = float(c)
            except ValueError:
                if j not in bad:
                    bad[j] = (int(numbers[r]), c)
    return data, bad


# ------------------------------------------------------------------------------------------
# curves


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
        if self.direction not in DIRECTIONS:
            raise InputError(
                f"{label}: direction must be one of {', '.join(DIRECTIONS)}, got "
                f"{self.direction!r}"
            )
        strain = _frozen_1d(self.strain, f"{label}: strain")
        stress = _frozen_1d(self.stress, f"{label}: stress")
        if strain.shape != stress.shape:
            raise InputError(
                f"{label}: strain and stress must have the same length, got {strain.size} and "
                f"{stress.size}"
            )
        lateral: dict[str, Array] = {}
        for axis, values in dict(self.lateral).items():
            _check_lateral_axis(self.direction, axis, label)
            arr = _frozen_1d(values, f"{label}: lateral strain {axis}")
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


def _frozen_1d(values: ArrayLike, label: str) -> Array:
    try:
        arr = np.array(values, dtype=np.float64)
    except (TypeError, ValueError):
        raise InputError(f"{label}: expected an array of numbers") from None
    if arr.ndim != 1:
        raise InputError(f"{label}: expected a 1-D array, got shape {arr.shape}")
    if arr.size < _MIN_ROWS:
        raise InputError(f"{label}: {arr.size} point(s); at least {_MIN_ROWS} are needed")
    finite = np.isfinite(arr)
    if not finite.all():
        i = int(np.argmin(finite))
        raise InputError(f"{label}: point {i} is {float(arr[i])!r}; every value must be finite")
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
        if unit is None or unit.strip() in ("", "1", "-", "m/m", "mm/mm"):
            return 1.0
        if unit.strip() in ("%", "percent"):
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


_STRAIN_UNITS = ("", "1", "-", "m/m", "mm/mm", "%", "percent")


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
    finite = np.isfinite(values)
    if not finite.all():
        r = int(np.argmin(finite))
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
    f = table.column(fcol, "force column") * _unit(table, fcol, funit, "force", "force")
    u = table.column(dcol, "displacement column") * _unit(table, dcol, dunit, "length",
                                                          "displacement")
    lat: dict[str, Array] = {}
    for axis, spec in _lateral_items(lateral, table.path):
        _check_lateral_axis(direction, axis, table.path)
        col, unit = _spec(spec, f"lateral {axis}")
        values = table.column(col, f"lateral {axis} column")
        if unit is not None and _is_strain_unit(unit):  # lateral strain given directly
            lat[axis] = values * _unit(table, col, unit, "dimensionless", f"lateral {axis}")
        else:
            unit_si = _unit(table, col, unit, "length", f"lateral {axis}")
            with np.errstate(over="ignore"):
                lat[axis] = values * unit_si / size[_AXIS[axis]]
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
    with np.errstate(over="ignore"):
        sig = table.column(scol, "stress column") * _unit(table, scol, sunit, "pressure",
                                                           "stress")
    eps = table.column(ecol, "strain column") * _unit(table, ecol, eunit, "dimensionless",
                                                       "strain")
    lat: dict[str, Array] = {}
    for axis, spec in _lateral_items(lateral, table.path):
        _check_lateral_axis(direction, axis, table.path)
        col, unit = _spec(spec, f"lateral {axis}")
        lat[axis] = table.column(col, f"lateral {axis} column") * _unit(
            table, col, unit, "dimensionless", f"lateral {axis}"
        )
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
