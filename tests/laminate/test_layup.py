"""Laminate codes: expansion rules and error messages (rules in micromech/laminate/layup.py)."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import InputError
from micromech.laminate import format_layup, parse_layup

# code -> plies, bottom to top. Notation per Kaw (2006), 2nd ed., Sec. 4.2, and Daniel and Ishai
# (2006), 2nd ed., Sec. 7.2; the odd-symmetric mark and the repeat rules are our own (documented).
EXPANSIONS = [
    ("[0/90]s", (0, 90, 90, 0)),
    ("[0/90]S", (0, 90, 90, 0)),
    ("[0/90]T", (0, 90)),
    ("[45/-45]", (45, -45)),
    ("[0/+-45/90]s", (0, 45, -45, 90, 90, -45, 45, 0)),
    ("[0/±45/90]s", (0, 45, -45, 90, 90, -45, 45, 0)),
    ("[-+30]", (-30, 30)),
    ("[∓30]", (-30, 30)),
    ("[0/+-45/90]2s", (0, 45, -45, 90, 0, 45, -45, 90, 90, -45, 45, 0, 90, -45, 45, 0)),
    ("[(0/90)3]s", (0, 90, 0, 90, 0, 90, 90, 0, 90, 0, 90, 0)),
    ("[(0/90)_2]", (0, 90, 0, 90)),
    ("[0_2/90]", (0, 0, 90)),
    ("[+-45_2]", (45, -45, 45, -45)),
    ("[0/90]3", (0, 90, 0, 90, 0, 90)),
    ("[0/45/90']s", (0, 45, 90, 45, 0)),
    ("[0']s", (0,)),
    ("[0/45/9\u03050\u0305]s", (0, 45, 90, 45, 0)),  # overbar as copied from print (U+0305)
    ("[0/45/90\u0304]s", (0, 45, 90, 45, 0)),  # overbar as a combining macron (U+0304)
    ("[0/22.\u03055\u0305]s", (0, 22.5, 0)),
    ("[0]5000s", (0,) * 10000),  # exactly MAX_PLIES
    ("[(0/(45/-45)2)_2]", (0, 45, -45, 45, -45, 0, 45, -45, 45, -45)),
    ("[ 0 / 22.5 / -67.5 ] s", (0, 22.5, -67.5, -67.5, 22.5, 0)),
    ("[+15/-0]", (15, 0)),
    ("[180/-180]", (180, -180)),
]


@pytest.mark.parametrize(("code", "plies"), EXPANSIONS)
def test_code_expands_to_plies(code, plies):
    assert parse_layup(code) == tuple(float(a) for a in plies)


# code, regex the message must match (names the character and its 1-based position)
MALFORMED = [
    ("0/90", r"character '0' at position 1: a laminate code starts with '\['"),
    ("[0/9x]", r"character 'x' at position 5: expected '/' or '\]'"),
    ("[0/90", r"end of code at position 6"),
    ("[02/90]", r"ambiguous angle '02' at position 2: write 0_2"),
    ("[045]", r"ambiguous angle '045' at position 2"),
    ("[0/90'/45]s", r"position 6: the mid-plane mark .* must be on the last ply"),
    ("[0/90']2s", r"position 6: the mid-plane mark .* needs the plain symmetric suffix"),
    ("[0/90']", r"needs the plain symmetric suffix"),
    ("[(0/90')]s", r"position 7: the mid-plane mark .* cannot be used inside a group"),
    ("[0/90_2']s", r"applies to one single ply"),
    ("[+-45']s", r"applies to one single ply"),
    ("[0/200]", r"angle 200 at position 4 is outside \[-180, 180\]"),
    ("[0_0]", r"position 4: a repeat count must be at least 1"),
    ("[0_]", r"position 4: expected a repeat count"),
    ("[0.]", r"position 4: expected digits after the decimal point"),
    ("[0/]", r"character '\]' at position 4: expected a ply angle"),
    ("[]", r"position 2: expected a ply angle"),
    ("[+]", r"position 3: expected a ply angle"),
    ("[(0/90]", r"position 7: expected '/' or '\)'"),
    ("[0/90]s2", r"character '2' at position 8: expected nothing, 'T', a count"),
    ("[0/90]2T", r"character 'T' at position 8"),
    ("[0/4\u03055/90]s", r"position 5: the mid-plane mark .* must be on the last ply"),
    ("[0/90\u0305]", r"position 6: the mid-plane mark .* needs the plain symmetric suffix"),
    ("[(0/90\u0305)]s", r"position 7: the mid-plane mark .* cannot be used inside a group"),
    ("[\u03050]s", r"position 2: expected a ply angle"),
    ("[0]10000s", r"position 4: the code would expand to 20000 plies, more than the limit "
                  r"of 10000"),
    ("[(0/90)6000]", r"position 8: the code would expand to 12000 plies"),
    ("[0_20000]", r"position 3: the code would expand to 20000 plies"),
]


@pytest.mark.parametrize(("code", "message"), MALFORMED)
def test_malformed_code_names_character_and_position(code, message):
    with pytest.raises(InputError, match=message):
        parse_layup(code)


def test_code_must_be_a_string():
    with pytest.raises(InputError, match="expected a string"):
        parse_layup(0)  # type: ignore[arg-type]


angles = st.lists(
    st.integers(-180, 180).map(float) | st.sampled_from([22.5, -67.5, 0.5]), min_size=1,
    max_size=8,
)


@settings(max_examples=60, deadline=None)
@given(angles)
def test_format_then_parse_returns_the_angles(a):
    assert parse_layup(format_layup(a)) == tuple(a)


@settings(max_examples=60, deadline=None)
@given(angles, st.integers(1, 3))
def test_symmetric_code_is_a_palindrome_of_twice_the_repeated_length(a, n):
    plies = parse_layup(format_layup(a)[:-1] + f"]{n}s")
    assert len(plies) == 2 * n * len(a)
    assert plies == plies[::-1]


@settings(max_examples=60, deadline=None)
@given(angles)
def test_mid_plane_mark_gives_odd_palindrome(a):
    plies = parse_layup(format_layup(a)[:-1] + "']s")
    assert len(plies) == 2 * len(a) - 1
    assert plies == plies[::-1]
