"""Markdown building blocks and the atomic file writer shared by the report writers.

Reports are replaced only as whole files: :func:`write_atomic` writes to a temporary file in the
target's own folder and renames it over the target with :func:`os.replace`, which is atomic on
POSIX and Windows when source and target share a file system. A reader therefore sees either
the old report or the new one, never a half-written file.
"""

from __future__ import annotations

import os
import tempfile
from collections.abc import Sequence
from pathlib import Path

from micromech.errors import InputError

__all__ = ["escape_cell", "markdown_table", "write_atomic"]


def escape_cell(text: object) -> str:
    """Make text safe for one cell of a Markdown table (pipes escaped, no line breaks).

    Parameters
    ----------
    text : object
        Cell content (converted with ``str``).

    Returns
    -------
    str
        The escaped text.
    """
    return str(text).replace("\\", "\\\\").replace("|", "\\|").replace("\n", " ")


def markdown_table(
    headers: Sequence[str], rows: Sequence[Sequence[object]], align: str | None = None
) -> str:
    """Format a Markdown (pipe) table.

    Parameters
    ----------
    headers : sequence of str
        Column headers.
    rows : sequence of sequences
        Cell contents, one sequence per row, as many cells as headers.
    align : str, optional
        One letter per column: ``l``, ``r`` or ``c`` (default: all left).

    Returns
    -------
    str
        The table, ending with a newline.

    Raises
    ------
    InputError
        If a row has a different number of cells than the headers, or ``align`` has the wrong
        length or letters.

    Examples
    --------
    >>> print(markdown_table(["a", "b"], [[1, 2]]), end="")
    | a | b |
    |---|---|
    | 1 | 2 |
    """
    n = len(headers)
    align = align or "l" * n
    if len(align) != n or set(align) - set("lrc"):
        raise InputError(f"align = {align!r} must have one of l, r, c per column ({n} columns)")
    rule = {"l": "---", "r": "--:", "c": ":-:"}
    lines = ["| " + " | ".join(escape_cell(h) for h in headers) + " |",
             "|" + "|".join(rule[a] for a in align) + "|"]
    for i, row in enumerate(rows):
        if len(row) != n:
            raise InputError(f"row {i + 1} has {len(row)} cells; the table has {n} columns")
        lines.append("| " + " | ".join(escape_cell(c) for c in row) + " |")
    return "\n".join(lines) + "\n"


def write_atomic(path: str | Path, data: str | bytes) -> Path:
    """Write a file as a whole: temporary file in the same folder, then :func:`os.replace`.

    Parameters
    ----------
    path : str or Path
        The target file; its folder must exist.
    data : str or bytes
        Content; text is written as UTF-8.

    Returns
    -------
    Path
        The target path.
    """
    target = Path(path)
    payload = data.encode("utf-8") if isinstance(data, str) else data
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=target.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(payload)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, _file_mode(target))
        os.replace(tmp, target)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
    return target


def _file_mode(path: Path) -> int:
    """Permissions for an output: those of the file it replaces, else 0o666 less the umask.

    Parameters
    ----------
    path : Path
        Output file.

    Returns
    -------
    int
        Permission bits for :func:`os.chmod`.
    """
    try:
        return path.stat().st_mode & 0o777
    except FileNotFoundError:
        mask = os.umask(0o022)
        os.umask(mask)
        return 0o666 & ~mask
