r"""Read delimited text files of numbers into tables.

A history file is delimited text: comma, tab, semicolon or whitespace (sniffed unless given),
with or without a header line, with comment lines that start with ``#`` or ``%`` and with blank
lines anywhere. A line right under the header with no number in any cell is a row of units.
Columns are named (header) or numbered from 1. The file is only read, never changed, and the
arrays handed out are read-only.

Two readers share the work. A regular ASCII file is read with vectorised scans of its bytes and
one call to numpy's number parser; anything irregular falls back to a line-by-line reader that
finds and reports it (ragged rows, cells that are not numbers, text that is not UTF-8). Both
accept and reject exactly the same files and give the same :class:`Table`.
"""

from __future__ import annotations

import warnings
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from pathlib import Path
from types import MappingProxyType

import numpy as np
from numpy.typing import NDArray

from micromech.errors import DataFileError, InputError

__all__ = ["MIN_ROWS", "Table", "read_table"]

Array = NDArray[np.float64]

#: The fewest data rows a table may have (and the fewest points of a curve).
MIN_ROWS = 3
_SNIFF_LINES = 25
_MAX_LEAD = 64  # leading blanks scanned per line before the line-by-line reader takes over
_DELIMITER_NAMES = {",": "comma", ";": "semicolon", "\t": "tab", " ": "whitespace"}
_NAMED_DELIMITERS = {name: d for d, name in _DELIMITER_NAMES.items()} | {"space": " "}


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
        r = _first_nonfinite(values)
        if r is not None:
            raise DataFileError(
                f"{self.path}, line {int(self.lines[r])}, {label}: value "
                f"{float(values[r])!r} is not a finite number"
            )
        return values


def _fold(name: str) -> str:
    return "".join(name.split()).lower()


def _first_nonfinite(values: Array) -> int | None:
    """Index of the first NaN or infinite value, None when all are finite."""
    finite = np.isfinite(values)
    return None if finite.all() else int(np.argmin(finite))


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
    table = _read_regular(name, raw, delim, comment, skip_rows)
    if table is None:
        table = _read_lines(name, raw, delim, comment, skip_rows)
    return table


def _check_delimiter(delimiter: str | None) -> str | None:
    if delimiter is None:
        return None
    if isinstance(delimiter, str):
        d = _NAMED_DELIMITERS.get(delimiter.strip().lower(), delimiter)
        if d in _DELIMITER_NAMES:
            return d
    raise InputError(
        f"delimiter: expected ',', ';', '\\t' (or comma, semicolon, tab), ' ' or 'whitespace', "
        f"or None to detect it; got {delimiter!r}"
    )


# ------------------------------------------------------------------------------------------
# the two readers


def _read_regular(
    name: str, raw: bytes, delim: str | None, comment: str, skip_rows: int
) -> Table | None:
    """Read a regular file with vectorised line scans; None to use the line-by-line reader.

    Classifies every line (blank, comment, data) and counts its cells from the byte positions
    of line breaks and delimiters, then parses all numbers in one call. Anything irregular (a
    control character, a non-ASCII character outside comment lines, a ragged row, a cell that
    is not a number, fewer than 3 rows) returns None, and the line-by-line reader then finds and
    reports it, so both readers accept and reject exactly the same files.
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
    header, units, n_cols = _head(sample, d)
    rows = kept[bool(header) + bool(units) :]
    if rows.size < MIN_ROWS:
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
    data = _parse_numbers(body.decode("ascii"), d, rows.size, n_cols)
    if data is None:
        return None
    numbers = kept.astype(np.int64) + 1
    return _table(name, numbers, header, units, data, d, {})


def _read_lines(name: str, raw: bytes, delim: str | None, comment: str, skip_rows: int) -> Table:
    """Read any file line by line, reporting what makes it unreadable."""
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
    numbers = np.asarray(keep, dtype=np.int64) + 1
    d = delim if delim is not None else _sniff([all_lines[i] for i in keep[:_SNIFF_LINES]])
    header, units, n_cols = _head([all_lines[i] for i in keep[:2]], d)
    skip = bool(header) + bool(units)
    lines = [all_lines[i] for i in keep[skip:]]
    if len(lines) < MIN_ROWS:
        raise DataFileError(
            f"{name}: {len(lines)} data row(s); at least {MIN_ROWS} are needed for a curve"
        )
    data = _parse_joined(lines, d, n_cols)
    bad: dict[int, tuple[int, str]] = {}
    if data is None:
        data, bad = _parse_cells(name, lines, numbers, skip, d, n_cols)
    return _table(name, numbers, header, units, data, d, bad)


def _table(
    name: str, numbers: NDArray[np.int64], header: tuple[str, ...], units: tuple[str, ...],
    data: Array, delim: str, bad: dict[int, tuple[int, str]],
) -> Table:
    """Assemble a read-only table; ``numbers`` are the line numbers of header, units and rows."""
    skip = bool(header) + bool(units)
    lines = numbers[skip:]
    data.flags.writeable = False
    lines.flags.writeable = False
    return Table(
        path=name, header=header, data=data, lines=lines, delimiter=delim,
        header_line=int(numbers[0]) if header else None, bad_cells=MappingProxyType(bad),
        units=units, units_line=int(numbers[1]) if units else None,
    )


# ------------------------------------------------------------------------------------------
# lines and cells


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


def _head(first: Sequence[str], delim: str) -> tuple[tuple[str, ...], tuple[str, ...], int]:
    """Return (header, units, number of columns) from the first one or two data lines.

    The first line is a header when any of its cells is not a number; the line right under a
    header is a row of units when it has as many cells and none of them is a number. Header and
    units are empty when absent.
    """
    cells = _split(first[0], delim)
    if all(_is_number(c) for c in cells):
        return (), (), len(cells)
    below = _split(first[1], delim) if len(first) > 1 else []
    if len(below) == len(cells) and not any(_is_number(c) for c in below):
        return _labels(cells), _labels(below), len(cells)
    return _labels(cells), (), len(cells)


def _labels(cells: Sequence[str]) -> tuple[str, ...]:
    return tuple(c.strip().strip('"').strip("'").strip() for c in cells)


def _parse_numbers(body: str, delim: str, n_rows: int, n_cols: int) -> Array | None:
    """Parse cells separated by ``delim`` (rows too) in one call; None when irregular.

    numpy's parser takes a blank separator as any run of blanks, so tab-separated cells are
    parsed as comma-separated ones: an empty cell or a blank inside a cell then fails as it
    does cell by cell (a body with a comma is left to the cell-by-cell reader). It also reads
    a cell of blanks only as -1 without complaint, so such a cell is left to that reader too.
    """
    sep = delim
    if delim == "\t":
        if "," in body:
            return None
        body, sep = body.replace("\t", ","), ","
    if sep != " " and _has_blank_cell(np.frombuffer(body.encode("utf-8"), dtype=np.uint8), sep):
        return None
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            flat = np.fromstring(body, dtype=np.float64, sep=sep)
    except (ValueError, DeprecationWarning):
        return None
    if flat.size != n_rows * n_cols:
        return None
    return flat.reshape(n_rows, n_cols)


def _has_blank_cell(a: NDArray[np.uint8], sep: str) -> bool:
    """Whether a run of blanks (bytes <= 32) fills a whole cell between separators or ends."""
    blank = a <= 32
    if not blank.any():
        return False
    at = np.flatnonzero(blank)
    new_run = np.diff(at) > 1
    first = at[np.concatenate(([True], new_run))]
    last = at[np.concatenate((new_run, [True]))]
    s = ord(sep)
    before = np.where(first > 0, a[np.maximum(first - 1, 0)], s)
    after = np.where(last < a.size - 1, a[np.minimum(last + 1, a.size - 1)], s)
    return bool(np.any((before == s) & (after == s)))


def _parse_joined(lines: list[str], delim: str, n_cols: int) -> Array | None:
    """Parse decoded lines in one call; None when anything is irregular."""
    if delim == " ":
        if any(len(s.split()) != n_cols for s in lines):
            return None
    elif any(s.count(delim) != n_cols - 1 for s in lines):
        return None
    return _parse_numbers(delim.join(lines), delim, len(lines), n_cols)


def _parse_cells(
    name: str, lines: list[str], numbers: NDArray[np.int64], skip: int, delim: str, n_cols: int
) -> tuple[Array, dict[int, tuple[int, str]]]:
    """Parse cell by cell: NaN and the first bad cell per column; ragged rows raise."""
    data = np.full((len(lines), n_cols), np.nan)
    bad: dict[int, tuple[int, str]] = {}
    for r, s in enumerate(lines):
        cells = _split(s, delim)
        if len(cells) != n_cols:
            raise DataFileError(
                f"{name}, line {int(numbers[skip + r])}: {len(cells)} cell(s) where line "
                f"{int(numbers[0])} has {n_cols} (delimiter: {_DELIMITER_NAMES[delim]})"
            )
        for j, c in enumerate(cells):
            try:
                data[r, j] = float(c)
            except ValueError:
                if j not in bad:
                    bad[j] = (int(numbers[skip + r]), c)
    return data, bad
