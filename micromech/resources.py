"""Where the bundled data live: the materials registry and the invented demo cases.

The data ship in the source tree (``data/`` next to the package, used by an editable install) and
are also installed as data files under ``<prefix>/share/micromech/`` by a regular install.
"""

from __future__ import annotations

import sys
from pathlib import Path

from micromech.errors import DataFileError

__all__ = ["data_candidates", "data_directory"]


def data_candidates(name: str) -> list[Path]:
    """Folders searched, in order, for the bundled data folder ``name``.

    Parameters
    ----------
    name : str
        ``"materials"`` or ``"demo"``.

    Returns
    -------
    list of Path
        ``<repo>/data/<name>``, ``<prefix>/share/micromech/<name>`` and ``./data/<name>``.
    """
    pkg = Path(__file__).resolve().parent
    return [
        pkg.parent / "data" / name,  # source tree (editable install)
        Path(sys.prefix) / "share" / "micromech" / name,  # regular install (data files)
        Path.cwd() / "data" / name,
    ]


def data_directory(name: str, marker: str = "*.toml") -> Path:
    """Return the first folder among :func:`data_candidates` that holds files matching ``marker``.

    Parameters
    ----------
    name : str
        ``"materials"`` or ``"demo"``.
    marker : str
        Glob pattern a valid folder must match.

    Returns
    -------
    Path
        The folder.

    Raises
    ------
    DataFileError
        If no candidate holds the data.
    """
    tried = data_candidates(name)
    for p in tried:
        if p.is_dir() and any(p.glob(marker)):
            return p
    raise DataFileError(
        f"bundled {name} data not found; looked in " + ", ".join(str(p) for p in tried)
    )
