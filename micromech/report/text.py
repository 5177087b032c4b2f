"""Plain-text building blocks shared by the terminal tables and the JSON writers."""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path
from typing import Any

__all__ = ["json_default", "text_table"]


def text_table(headers: Sequence[str], rows: Sequence[Sequence[Any]]) -> str:
    """Left-aligned columns with a rule under the header, two spaces apart.

    Parameters
    ----------
    headers : sequence of str
        Column titles.
    rows : sequence of sequence
        Cells (converted with ``str``), one sequence per row, as many as there are headers.

    Returns
    -------
    str
        The table, lines joined by newlines, no trailing spaces.

    Examples
    --------
    >>> print(text_table(["a", "bb"], [["1", "2"]]))
    a  bb
    -  --
    1  2
    """
    widths = [max(len(str(h)), *(len(str(r[i])) for r in rows)) if rows else len(str(h))
              for i, h in enumerate(headers)]

    def line(cells: Sequence[Any]) -> str:
        return "  ".join(str(c).ljust(w) for c, w in zip(cells, widths, strict=True)).rstrip()

    return "\n".join([line(headers), "  ".join("-" * w for w in widths), *map(line, rows)])


def json_default(o: Any) -> Any:
    """``json.dumps`` fallback: numpy arrays and scalars as lists and numbers, paths as text.

    Parameters
    ----------
    o : object
        What the standard encoder could not serialise.

    Returns
    -------
    object
        A JSON-serialisable equivalent.

    Raises
    ------
    TypeError
        For any other type (as the standard encoder does).
    """
    import numpy as np

    if isinstance(o, np.ndarray):
        return o.tolist()
    if isinstance(o, np.generic):
        return o.item()
    if isinstance(o, Path):
        return str(o)
    raise TypeError(f"not JSON serialisable: {type(o).__name__}")
