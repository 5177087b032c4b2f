"""Standard laminate codes: ``[0/90]s``, ``[0/+-45/90]2s``, ``[(0/90)3]s``, ``[0_2/90]`` ...

The rules this parser follows (our own, stated once here and in :func:`parse_layup`):

* The code is enclosed in square brackets; plies are separated by ``/`` and listed from the
  bottom face (z = -h/2) to the top face (z = +h/2). Spaces are ignored.
* An angle is a signed decimal number of degrees in [-180, 180]: ``0``, ``-45``, ``+45``,
  ``22.5``. An integer written with a leading zero (``02``, ``045``) is rejected as ambiguous:
  write ``0_2`` for two 0-degree plies, or ``2`` for one 2-degree ply.
* ``+-45`` (or ``±45``) expands to the two plies +45, -45; ``-+45`` (or ``∓45``) to -45, +45.
* A repeat count is written with an underscore after an angle or a pair: ``0_2`` = 0/0 and
  ``+-45_2`` = +45/-45/+45/-45 (the pair is repeated as a unit). After a closing parenthesis the
  underscore is optional: ``(0/90)3`` = ``(0/90)_3`` = 0/90/0/90. Groups may nest.
* After the closing bracket: nothing or ``T`` (the plies as written), ``N`` (repeat the whole
  sequence N times), ``s`` (symmetric: the sequence followed by its mirror image) or ``Ns``
  (repeat N times, then mirror). ``S`` is accepted for ``s``.
* Odd symmetric laminates: a trailing apostrophe marks the mid-plane ply, which is not mirrored.
  It is allowed only on the last single angle before ``]s`` (no count, not a pair, not inside a
  group, plain ``s`` suffix): ``[0/45/90']s`` = 0/45/90/45/0. This stands for the overbar of
  printed codes; an overbar typed as combining characters (U+0305 or U+0304 after the digits,
  as text copied from a document gives it, ``[0/45/9\u03050\u0305]s``) is read the same way.
* A code expands to at most :data:`MAX_PLIES` plies (a guard against a mistyped repeat count).

A malformed code raises :class:`~micromech.errors.InputError` naming the character and its
1-based position.

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press, Sec. 4.2
   (laminate code).
.. [2] Daniel, I. M., Ishai, O. (2006). *Engineering Mechanics of Composite Materials*, 2nd ed.,
   Oxford University Press, Sec. 7.2 (laminate notation). Section numbers from memory.
"""

from __future__ import annotations

import math

from micromech.errors import InputError

__all__ = ["parse_layup", "format_layup", "MAX_ANGLE", "MAX_PLIES"]

#: Largest accepted magnitude of a ply angle in a code, degrees.
MAX_ANGLE = 180.0
#: Largest number of plies a code may expand to.
MAX_PLIES = 10_000

_OVERBARS = ("\u0305", "\u0304")  # combining overline, combining macron

# the tokens of a +-/-+ pair and the signs of its two plies
_PAIRS: tuple[tuple[tuple[float, float], str], ...] = (
    ((1.0, -1.0), "+-"), ((1.0, -1.0), "±"), ((-1.0, 1.0), "-+"), ((-1.0, 1.0), "∓"),
)


class _Parser:
    """Recursive-descent parser over the characters of one code."""

    def __init__(self, code: str) -> None:
        self.code = code
        self.i = 0
        self.mid_at: int | None = None  # position of the mid-plane mark, if any
        self.bar_at: int | None = None  # position of an overbar on the angle just read

    # -- helpers ---------------------------------------------------------------------------
    def _char(self) -> str:
        """Return the character at the position, or "" at the end."""
        return self.code[self.i] if self.i < len(self.code) else ""

    def _skip(self) -> None:
        while self._char().isspace():
            self.i += 1

    def _peek(self) -> str:
        self._skip()
        return self._char()

    def _fail(self, rule: str, at: int | None = None) -> InputError:
        pos = self.i if at is None else at
        if pos < len(self.code):
            what = f"character {self.code[pos]!r} at position {pos + 1}"
        else:
            what = f"end of code at position {pos + 1}"
        return InputError(f"layup {self.code!r}: {what}: {rule}")

    def _digits(self) -> str:
        start = self.i
        while self._char().isdigit():
            self.i += 1
        return self.code[start : self.i]

    def _marked_digits(self) -> str:
        """Digits of an angle; combining overbars among them are noted and skipped."""
        out = []
        while self.i < len(self.code):
            c = self.code[self.i]
            if c.isdigit():
                out.append(c)
            elif c in _OVERBARS and out:
                if self.bar_at is None:
                    self.bar_at = self.i
            else:
                break
            self.i += 1
        return "".join(out)

    def _repeat(self, items: list[float], n: int, at: int) -> list[float]:
        """Return ``items`` repeated ``n`` times, refusing codes that grow beyond MAX_PLIES."""
        if len(items) * n > MAX_PLIES:
            raise self._fail(
                f"the code would expand to {len(items) * n} plies, more than the limit of "
                f"{MAX_PLIES}", at=at,
            )
        return items * n

    def _repeat_count(self, bare: bool) -> int:
        """Read an optional repeat count ``_N`` (with ``bare`` also ``N``); 1 without one."""
        if self._char() == "_":
            self.i += 1
            return self._count()
        return self._count() if bare and self._char().isdigit() else 1

    def _count(self) -> int:
        start = self.i
        text = self._digits()
        if not text:
            raise self._fail("expected a repeat count (digits)")
        n = int(text)
        if n < 1:
            raise self._fail("a repeat count must be at least 1", at=start)
        return n

    # -- grammar ---------------------------------------------------------------------------
    def parse(self) -> tuple[float, ...]:
        if self._peek() != "[":
            raise self._fail("a laminate code starts with '['")
        self.i += 1
        angles = self._sequence(depth=0)
        if self._peek() != "]":
            raise self._fail("expected '/' or ']'")
        self.i += 1
        return self._suffix(angles)

    def _sequence(self, depth: int) -> list[float]:
        out: list[float] = []
        while True:
            c = self._peek()
            if c in ("", "]", ")", "/"):
                raise self._fail("expected a ply angle or '('")
            if self.mid_at is not None:
                raise self._fail(
                    "the mid-plane mark (' or an overbar) must be on the last ply before ']s'",
                    at=self.mid_at,
                )
            out.extend(self._item(depth))
            if self._peek() != "/":
                return out
            self.i += 1

    def _item(self, depth: int) -> list[float]:
        if self._peek() == "(":
            self.i += 1
            inner = self._sequence(depth + 1)
            if self._peek() != ")":
                raise self._fail("expected '/' or ')'")
            self.i += 1
            at = self.i
            return self._repeat(inner, self._repeat_count(bare=True), at)
        self.bar_at = None
        plies = self._angle_or_pair()
        at = self.i
        n = self._repeat_count(bare=False)
        barred = self.bar_at is not None
        quoted = self._char() == "'"
        if barred or quoted:
            mark = self.i if quoted else self.bar_at
            if depth > 0:
                raise self._fail(
                    "the mid-plane mark (' or an overbar) cannot be used inside a group", at=mark
                )
            if len(plies) != 1 or n != 1:
                raise self._fail(
                    "the mid-plane mark (' or an overbar) applies to one single ply "
                    "(no count, no +- pair)",
                    at=mark,
                )
            self.mid_at = mark
            if quoted:
                self.i += 1
        return self._repeat(plies, n, at)

    def _angle_or_pair(self) -> list[float]:
        self._skip()
        signs: tuple[float, float] | None = None
        for pair, tok in _PAIRS:
            if self.code.startswith(tok, self.i):
                signs = pair
                self.i += len(tok)
                break
        start = self.i
        sign = 1.0
        if signs is None and self._char() in ("+", "-"):
            sign = -1.0 if self.code[self.i] == "-" else 1.0
            self.i += 1
        num_start = self.i
        whole = self._marked_digits()
        frac = ""
        if self._char() == ".":
            self.i += 1
            while self._char() in _OVERBARS:
                self.bar_at = self.i if self.bar_at is None else self.bar_at
                self.i += 1
            frac = self._marked_digits()
            if not frac:
                raise self._fail("expected digits after the decimal point")
        if not whole:
            raise self._fail("expected a ply angle (a number of degrees)")
        if len(whole) > 1 and whole[0] == "0" and not frac:
            raise InputError(
                f"layup {self.code!r}: ambiguous angle {whole!r} at position {num_start + 1}: "
                f"write {whole[0]}_{whole[1:]} for {int(whole[1:])} plies at 0 degrees, or "
                f"{int(whole)} for one {int(whole)}-degree ply"
            )
        value = float(whole + ("." + frac if frac else ""))
        if not math.isfinite(value) or value > MAX_ANGLE:
            raise InputError(
                f"layup {self.code!r}: angle {value:g} at position {start + 1} is outside "
                f"[-{MAX_ANGLE:g}, {MAX_ANGLE:g}] degrees"
            )
        if signs is not None:
            return [signs[0] * value, signs[1] * value]
        return [sign * value + 0.0]  # + 0.0 turns -0.0 into 0.0

    def _suffix(self, angles: list[float]) -> tuple[float, ...]:
        self._skip()
        start = self.i
        n = self._count() if self._char().isdigit() else 1
        symmetric = False
        if self._char() in ("s", "S"):
            symmetric = True
            self.i += 1
        elif self._char() == "T" and self.i == start:
            self.i += 1
        self._skip()
        if self.i != len(self.code):
            raise self._fail("expected nothing, 'T', a count, 's' or a count and 's' after ']'")
        if self.mid_at is not None and not (symmetric and n == 1):
            raise self._fail(
                "the mid-plane mark (' or an overbar) needs the plain symmetric suffix ']s'",
                at=self.mid_at,
            )
        half = self._repeat(angles, 2 * n if symmetric else n, start)[: len(angles) * n]
        if not symmetric:
            return tuple(half)
        if self.mid_at is not None:
            return tuple(half + half[-2::-1])
        return tuple(half + half[::-1])


def parse_layup(code: str) -> tuple[float, ...]:
    """Expand a laminate code into ply angles, bottom (z = -h/2) to top (z = +h/2).

    Parameters
    ----------
    code : str
        The code, e.g. ``"[0/90]s"``, ``"[0/+-45/90]2s"``, ``"[(0/90)3]s"``, ``"[0_2/90]"``,
        ``"[0/45/90']s"`` (odd symmetric, 90 is the mid-plane ply). The rules are listed in
        the module docstring of :mod:`micromech.laminate.layup`.

    Returns
    -------
    tuple of float
        Ply angles in degrees, one per ply.

    Raises
    ------
    InputError
        If the code is malformed or expands to more than :data:`MAX_PLIES` plies; the message
        names the character and its 1-based position.

    References
    ----------
    Kaw (2006), Sec. 4.2; Daniel and Ishai (2006), Sec. 7.2 (laminate notation).

    Examples
    --------
    >>> parse_layup("[0/+-45/90]s")
    (0.0, 45.0, -45.0, 90.0, 90.0, -45.0, 45.0, 0.0)
    >>> parse_layup("[0/45/90']s")
    (0.0, 45.0, 90.0, 45.0, 0.0)
    """
    if not isinstance(code, str):
        raise InputError(f"layup: expected a string such as '[0/90]s', got {code!r}")
    return _Parser(code).parse()


def format_layup(angles: tuple[float, ...] | list[float]) -> str:
    """Write ply angles as a plain code with every ply listed, e.g. ``"[0/90/90/0]"``.

    Parameters
    ----------
    angles : sequence of float
        Ply angles in degrees, bottom to top.

    Returns
    -------
    str
        A code that :func:`parse_layup` reads back to the same angles.

    Examples
    --------
    >>> format_layup([0.0, 45.0, -45.0, 22.5])
    '[0/45/-45/22.5]'
    """
    return "[" + "/".join(f"{a:g}" for a in angles) + "]"
