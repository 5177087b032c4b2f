"""Checks on output files shared by every command that writes one.

:func:`check_image_path` is the one rule for an image a command draws (``--plot`` of
``estimate``, ``laminate``, ``size`` and ``rve``): the file name ends in a format matplotlib
writes, and its folder exists. It runs before any computing, so a long run never ends on a
file that cannot be written.
"""

from __future__ import annotations

import os
from pathlib import Path

from micromech.errors import InputError

__all__ = ["IMAGE_FORMATS", "check_image_path"]

#: Image formats a plot may be written in, by file suffix (all are among the formats
#: matplotlib's ``savefig`` writes).
IMAGE_FORMATS: tuple[str, ...] = (
    "png", "svg", "pdf", "eps", "ps", "jpg", "jpeg", "tif", "tiff", "webp",
)


def check_image_path(path: str | os.PathLike[str], field: str = "path") -> Path:
    """Check that an image can be written to ``path``: a known suffix and an existing folder.

    Parameters
    ----------
    path : str or path-like
        The image file; its suffix (case-insensitive) chooses the format and must be one of
        :data:`IMAGE_FORMATS`.
    field : str
        How the path is named in messages (e.g. ``"--plot"``).

    Returns
    -------
    Path
        The path.

    Raises
    ------
    InputError
        If the suffix is missing or not in :data:`IMAGE_FORMATS`, or the folder does not exist.

    Examples
    --------
    >>> check_image_path("envelope.PNG", "--plot").name
    'envelope.PNG'
    """
    out = Path(path)
    suffix = out.suffix.lower().lstrip(".")
    if suffix not in IMAGE_FORMATS:
        got = f"format {suffix!r} is not an image format that can be written" if suffix \
            else "no suffix names the format"
        raise InputError(
            f"{field} = {str(path)!r}: the file name must end in "
            f"{', '.join('.' + f for f in IMAGE_FORMATS)} ({got})"
        )
    folder = out.parent if str(out.parent) else Path(".")
    if not folder.is_dir():
        raise InputError(f"{field} = {str(path)!r}: folder {str(folder)!r} does not exist")
    return out
