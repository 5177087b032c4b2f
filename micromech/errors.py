"""The project's exceptions: one base class, each also a builtin so callers may catch either.

:func:`suggest` builds the "did you mean" hint that messages about unknown names carry.
"""

from __future__ import annotations

import difflib
from collections.abc import Iterable

__all__ = [
    "MicromechError",
    "InputError",
    "UnitError",
    "InvalidMaterialError",
    "FractionError",
    "CaseFileError",
    "DataFileError",
    "RegistryError",
    "suggest",
]


class MicromechError(Exception):
    """Base of every error micromech raises on purpose.

    The CLI prints the message of any ``MicromechError`` and exits with status 2.
    Messages name the field, the value given and the rule it broke.
    """


class InputError(MicromechError, ValueError):
    """An argument has a value outside its valid range or the wrong shape."""


class UnitError(MicromechError, ValueError):
    """A quantity string cannot be parsed or has the wrong physical dimension."""


class InvalidMaterialError(MicromechError, ValueError):
    """Constituent or ply constants that are not physically admissible."""


class FractionError(MicromechError, ValueError):
    """A fibre, void or weight fraction outside [0, 1] or above a packing limit."""


class CaseFileError(MicromechError, ValueError):
    """A case file that is malformed, has unknown keys or inconsistent entries."""


class DataFileError(MicromechError, ValueError):
    """A simulation-output file that cannot be read (names file, line and column)."""


class RegistryError(MicromechError, KeyError):
    """A materials-registry problem: unknown key, key defined twice, bad registry file."""

    def __str__(self) -> str:  # KeyError would quote the message; print it plainly
        return str(self.args[0]) if self.args else ""


#: A further suggestion must be nearly as close as the best one (common practice, no source):
#: a clear best match is named alone.
_MARGIN = 0.1


def _similarity(word: str, choice: str) -> float:
    """Similarity in [0, 1] of two case-folded names; a typo in a prefix counts as close.

    The ratio of :class:`difflib.SequenceMatcher` against the whole choice, or (for words of 3
    characters or more) against its first ``len(word) + 2`` characters, whichever is higher:
    ``'hex'`` is close to ``'hexagonal'``, ``'carbn'`` to ``'carbon-standard'``.
    """
    best = difflib.SequenceMatcher(None, word, choice).ratio()
    if len(word) >= 3 and len(choice) > len(word) + 2:
        head = choice[: len(word) + 2]
        best = max(best, difflib.SequenceMatcher(None, word, head).ratio())
    return best


def suggest(word: object, choices: Iterable[str], n: int = 3, cutoff: float = 0.6) -> str:
    """Return the "did you mean" hint for an unknown name, or an empty string.

    Case does not count: a choice that equals ``word`` but for case is the only suggestion
    (``'KN'`` -> ``'kN'``, ``'nx'`` -> ``'Nx'``). Otherwise up to ``n`` choices whose
    similarity (difflib's ratio, also against the choice's leading characters so that a prefix
    with a typo matches) is at least ``cutoff`` and within 0.1 of the best, best first.

    Parameters
    ----------
    word : object
        The unknown name as given (converted with ``str``).
    choices : iterable of str
        The valid names.
    n : int
        Most names suggested.
    cutoff : float
        Least similarity in [0, 1] of a suggestion.

    Returns
    -------
    str
        ``"; did you mean 'x'?"``, ``"; did you mean 'x' or 'y'?"``,
        ``"; did you mean 'x', 'y' or 'z'?"``, or ``""`` when nothing is close.

    Examples
    --------
    >>> suggest("volume_fracton", ["volume_fraction", "void_fraction"])
    "; did you mean 'volume_fraction'?"
    >>> suggest("KN", ["N", "kN", "MN"])
    "; did you mean 'kN'?"
    >>> suggest("zzz", ["E1", "E2"])
    ''
    """
    text = str(word)
    folded = text.casefold()
    pool = list(dict.fromkeys(str(c) for c in choices))
    same = [c for c in pool if c.casefold() == folded and c != text]
    if same:
        names = same[:1]
    else:
        scored = [(_similarity(folded, c.casefold()), i, c) for i, c in enumerate(pool)]
        close = sorted((t for t in scored if t[0] >= cutoff and t[2] != text),
                       key=lambda t: (-t[0], t[1]))
        best = close[0][0] if close else 1.0
        names = [c for score, _, c in close[:max(n, 0)] if score >= best - _MARGIN]
    if not names:
        return ""
    quoted = [repr(c) for c in names]
    listed = quoted[0] if len(quoted) == 1 else f"{', '.join(quoted[:-1])} or {quoted[-1]}"
    return f"; did you mean {listed}?"
