"""Every `micromech` command against bad input: exit status 2 and an error line, no traceback.

Each bad input (missing file, folder instead of file, empty file, binary junk, malformed TOML,
unknown keys, wrong units, negative moduli, a fraction of 1.5, a history with text in a number
column or without a named column) is given to every command that reads it. The command must
stop with exit status 2 and a message starting ``error:`` (click's own usage errors print
``Error:``) that names the problem; a command that does not read the broken part must still
succeed. Hypothesis then feeds random bytes, mutated case files and random histories: the answer
is always a result (status 0 or 1) or the project's error (status 2), never a traceback or an
"internal error". All inputs are invented.
"""

from __future__ import annotations

import copy
import json
import math
import re
from pathlib import Path
from typing import Any

import pytest
from click.testing import CliRunner, Result
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from micromech.cli import cli

DEMO = Path(__file__).resolve().parent.parent / "data" / "demo"

# --- invented inputs -------------------------------------------------------------------------

CASE_HEAD = 'name = "invented robustness case"\n'
CASE_BODY = """
[fibre]
use = "e-glass"

[matrix]
use = "epoxy"

[composite]
volume_fraction = 0.5

[laminate]
layup = "[0/90]s"
ply_thickness = "0.25 mm"

[rve]
architecture = "crossply"
size = { x = "100 um", y = "100 um", z = "100 um" }

[[rve.load_case]]
direction = "x"
file = "h.csv"
force = { column = "force", unit = "N" }
displacement = { column = "disp", unit = "um" }
"""
GOOD_CASE = CASE_HEAD + CASE_BODY
# invented linear history: 2.5 GPa over a 100 um cube (force N, displacement um)
GOOD_CSV = "force,disp\n" + "\n".join(f"{0.25 * i:.6g},{0.1 * i:.6g}" for i in range(30)) + "\n"

GOOD_REGISTRY = """[invented-resin]
kind = "isotropic"
role = "matrix"
name = "invented resin"
source = "invented for a test"
E = "3 GPa"
nu = 0.35
"""

#: name -> (case file content: text, bytes, None = no file, "DIR" = a folder; history content)
BAD_CASE_INPUTS: dict[str, tuple[Any, str]] = {
    "missing file": (None, GOOD_CSV),
    "folder instead of file": ("DIR", GOOD_CSV),
    "empty file": (b"", GOOD_CSV),
    "binary junk": (bytes(range(256)) * 4, GOOD_CSV),
    "malformed TOML": ("name = \n[fibre\nE = ", GOOD_CSV),
    "unknown key": (CASE_HEAD + "colour = 'red'\n" + CASE_BODY, GOOD_CSV),
    "wrong units": (GOOD_CASE.replace('use = "e-glass"', 'E = "72 kg"\nnu = 0.22'), GOOD_CSV),
    "negative modulus": (GOOD_CASE.replace('use = "e-glass"', 'E = "-72 GPa"\nnu = 0.22'),
                         GOOD_CSV),
    "fraction 1.5": (GOOD_CASE.replace("volume_fraction = 0.5", "volume_fraction = 1.5"),
                     GOOD_CSV),
    "text in a number column": (GOOD_CASE, GOOD_CSV.replace("\n0.5,0.2\n", "\nabc,0.2\n")),
    "missing column": (GOOD_CASE.replace('column = "disp"', 'column = "dsp"'), GOOD_CSV),
}

_CASE_ERRORS = {
    "folder instead of file": r"is a directory",
    "binary junk": r"not UTF-8 text",
    "malformed TOML": r"malformed TOML",
    "unknown key": r"unknown key 'colour'",
    "wrong units": r"\bE\b.*pressure.*'72 kg'",
    "negative modulus": r"E = -72000000000\.0 must be positive",
    "fraction 1.5": r"volume_fraction = 1\.5 is outside \[0, 1\]",
}
_READS_HISTORIES = {
    "text in a number column": r"h\.csv, line 4, column 1 \('force'\): 'abc' is not a number",
    "missing column": r"displacement column 'dsp' does not exist",
}
_EMPTY = {
    "estimate": r"needs \[fibre\], \[matrix\] and \[composite\]",
    "laminate": r"no \[laminate\] table",
    "size": r"needs \[fibre\], \[matrix\] and \[composite\]",
    "rve": r"fraction",
    "check": r"no \[rve\] results to check",
}
_MISSING = {"estimate": "case file not found", "laminate": "case file not found",
            "size": "case file not found", "check": "case file not found",
            "rve": "does not exist"}
#: command -> extra arguments after the case file
CASE_COMMANDS = {
    "estimate": [],
    "laminate": [],
    "size": ["--target", "E2=9GPa"],
    "rve": ["--fibres", "4", "--packing", "square"],
    "check": [],
}


def expected(command: str, bad: str) -> str | None:
    """The message a command must give for a bad input, or None when it must succeed."""
    if bad == "missing file":
        return _MISSING[command]
    if bad == "empty file":
        return _EMPTY[command]
    if bad in _READS_HISTORIES:
        return _READS_HISTORIES[bad] if command == "check" else None
    return _CASE_ERRORS[bad]


# --- helpers ---------------------------------------------------------------------------------


def invoke(args: list[str]) -> Result:
    return CliRunner().invoke(cli, [str(a) for a in args])


def assert_no_crash(r: Result) -> None:
    """A result or the project's error: status 0, 1 or 2, never a traceback."""
    assert r.exit_code in (0, 1, 2), (r.exit_code, r.output, r.exception)
    assert r.exception is None or isinstance(r.exception, SystemExit), repr(r.exception)
    assert "Traceback" not in r.output
    assert "internal error" not in r.output, r.output
    if r.exit_code == 2:
        assert re.search(r"(?mi)^error: ", r.output), r.output


def assert_user_error(r: Result, pattern: str) -> None:
    """Exit status 2, an ``error:`` line, the problem named, no traceback."""
    assert_no_crash(r)
    assert r.exit_code == 2, r.output
    assert re.search(pattern, r.output), (pattern, r.output)


def write_case(folder: Path, content: Any, csv: str = GOOD_CSV) -> Path:
    path = folder / "case.toml"
    if content == "DIR":
        path.mkdir()
    elif content is not None:
        path.write_bytes(content if isinstance(content, bytes) else content.encode())
    (folder / "h.csv").write_text(csv)
    return path


# --- the good inputs work --------------------------------------------------------------------


@pytest.mark.parametrize("command", sorted(CASE_COMMANDS))
def test_the_good_case_works_with_every_command(tmp_path, command):
    r = invoke([command, write_case(tmp_path, GOOD_CASE), *CASE_COMMANDS[command]])
    assert_no_crash(r)
    assert r.exit_code == 0, r.output


# --- every case-reading command against every bad input --------------------------------------


@pytest.mark.parametrize("bad", sorted(BAD_CASE_INPUTS))
@pytest.mark.parametrize("command", sorted(CASE_COMMANDS))
def test_bad_case_inputs(tmp_path, command, bad):
    content, csv = BAD_CASE_INPUTS[bad]
    r = invoke([command, write_case(tmp_path, content, csv), *CASE_COMMANDS[command]])
    message = expected(command, bad)
    if message is None:  # the broken part is not read by this command
        assert_no_crash(r)
        assert r.exit_code == 0, r.output
    else:
        assert_user_error(r, message)


# --- materials: registry files and keys -------------------------------------------------------

BAD_REGISTRIES: dict[str, tuple[Any, str | None]] = {
    "missing file": (None, r"(?i)path '.*' does not exist"),
    "folder instead of file": ("DIR", None),  # a folder of registry files is allowed
    "empty file": (b"", None),  # an empty registry file adds nothing
    "binary junk": (bytes(range(256)) * 4, r"not UTF-8 text"),
    "malformed TOML": ("[invented-resin\nE = ", r"malformed TOML"),
    "unknown key": (GOOD_REGISTRY + "colour = 'red'\n", r"unknown field 'colour'"),
    "wrong units": (GOOD_REGISTRY.replace('"3 GPa"', '"3 kg"'), r"E expects a pressure"),
    "negative modulus": (GOOD_REGISTRY.replace('"3 GPa"', '"-3 GPa"'), r"E = .* must be positive"),
    "Poisson ratio 1.5": (GOOD_REGISTRY.replace("nu = 0.35", "nu = 1.5"), r"nu = 1\.5"),
    "not a table": ("E = 3\n", r"top-level key 'E' must be a table"),
}


@pytest.mark.parametrize("bad", sorted(BAD_REGISTRIES))
def test_materials_with_bad_registry_files(tmp_path, bad):
    content, message = BAD_REGISTRIES[bad]
    path = tmp_path / "extra.toml"
    if content == "DIR":
        path.mkdir()
    elif content is not None:
        path.write_bytes(content if isinstance(content, bytes) else content.encode())
    r = invoke(["materials", "--registry", path])
    if message is None:
        assert_no_crash(r)
        assert r.exit_code == 0, r.output
    else:
        assert_user_error(r, message)


def test_materials_good_registry_file_and_unknown_key(tmp_path):
    path = tmp_path / "extra.toml"
    path.write_text(GOOD_REGISTRY)
    r = invoke(["materials", "--registry", path, "invented-resin", "--json"])
    assert r.exit_code == 0, r.output
    assert json.loads(r.output)["material"]["E"] == 3e9
    assert_user_error(invoke(["materials", "no-such-material"]), r"unknown material")


# --- options with wrong units, negative values, out-of-range numbers -------------------------

PANEL = DEMO / "panel.toml"
CROSSPLY = DEMO / "crossply.toml"
BAD_OPTIONS = [
    (["estimate", PANEL, "--misalignment", "-5"], r"misalignment.*-5"),
    (["laminate", PANEL, "--f12-star", "5"], r"f12.*5"),
    (["laminate", PANEL, "--envelope", "Nx,Foo"], r"'Foo'"),
    (["laminate", PANEL, "--envelope", "Nx,Ny", "--points", "2"], r"points.* 2\b"),
    (["size", PANEL, "--target", "E2=9kg"], r"E2.*9 ?kg"),
    (["size", PANEL, "--target", "Foo=9GPa"], r"'Foo'"),
    (["size", PANEL, "--target", "E2"], r"'E2'.*NAME=VALUE"),
    (["size", PANEL], r"--target"),
    (["rve", "--fraction", "1.5", "--diameter", "7 um"], r"fraction.*1\.5"),
    (["rve", "--fraction", "0.5", "--diameter", "-7 um"], r"diameter.*-7"),
    (["rve", "--fraction", "0.5", "--diameter", "7 kg"], r"--diameter.*7 kg"),
    (["rve", "--fraction", "abc", "--diameter", "7 um"], r"--fraction.*'abc'"),
    (["rve", "--fraction", "0.5"], r"--diameter"),
    (["check", CROSSPLY, "--offset", "-1"], r"offset = -1\.0 must be a strain between 0 and 1"),
    (["check", CROSSPLY, "--tolerance", "E2=abc"], r"tolerance E2 = 'abc' is not a number"),
    (["check", CROSSPLY, "--tolerance", "E22=0.1"], r"unknown property 'E22'"),
    (["check", CROSSPLY, "--strain-range", "x,y"], r"--strain-range: 'x,y' must be two"),
    (["check", PANEL], r"no \[rve\] results to check"),
    (["check", CROSSPLY, "--report", DEMO], r"holds the case's input files"),
    (["check", CROSSPLY, "--report", CROSSPLY], r"is a file"),
    (["demo", "--out", PANEL], r"is a file"),
    (["demo", "--out", DEMO / "sub"], r"must lie outside the demo data folder"),
]


@pytest.mark.parametrize(("args", "message"), BAD_OPTIONS,
                         ids=[" ".join(str(a) for a in a[:1] + a[2:]) for a, _ in BAD_OPTIONS])
def test_bad_options(args, message):
    assert_user_error(invoke(args), message)


def test_demo_report_under_a_file_exits_2(tmp_path):
    blocker = tmp_path / "file"
    blocker.write_text("invented")
    r = invoke(["demo", "--out", blocker / "sub"])
    assert_user_error(r, r"(?i)not a directory")


def test_check_report_folder_that_cannot_be_created_exits_2(tmp_path):
    blocker = tmp_path / "file"
    blocker.write_text("invented")
    r = invoke(["check", CROSSPLY, "--report", blocker / "sub"])
    assert_user_error(r, r"report folder .* cannot be created")


# --- hypothesis: random bytes, mutated cases, random histories --------------------------------

_SETTINGS = settings(max_examples=40, deadline=None,
                     suppress_health_check=[HealthCheck.function_scoped_fixture,
                                            HealthCheck.too_slow])


@_SETTINGS
@given(data=st.binary(max_size=400), command=st.sampled_from(sorted(CASE_COMMANDS)))
def test_random_bytes_as_a_case_file_never_crash(tmp_path, data, command):
    path = tmp_path / "case.toml"
    path.write_bytes(data)
    assert_no_crash(invoke([command, path, *CASE_COMMANDS[command]]))


def _toml_value(v: Any) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        if math.isnan(v):
            return "nan"
        return ("inf" if v > 0 else "-inf") if math.isinf(v) else repr(v)
    if isinstance(v, int):
        return str(v)
    if isinstance(v, str):
        return json.dumps(v)
    if isinstance(v, list):
        return "[" + ", ".join(_toml_value(x) for x in v) + "]"
    return "{" + ", ".join(f"{json.dumps(k)} = {_toml_value(x)}" for k, x in v.items()) + "}"


def _paths(d: Any, prefix: tuple = ()) -> list[tuple]:
    out: list[tuple] = []
    items = d.items() if isinstance(d, dict) else enumerate(d) if isinstance(d, list) else ()
    for k, v in items:
        out.append((*prefix, k))
        out.extend(_paths(v, (*prefix, k)))
    return out


#: Values a careless edit might leave in a case file.
ODD_VALUES = [0, -1, 1.5, 1e300, -1e-300, float("nan"), float("inf"), "abc", "-3 GPa", "3 kg", "",
              True, [], [1, 2], {}, {"a": 1}, "0 um", "1e400 um", "xy", "N", "%", 10**30,
              "nan GPa", "1e-320 m", "mN", "5 %"]


@_SETTINGS
@given(picks=st.lists(st.tuples(st.integers(0, 10**6), st.sampled_from(ODD_VALUES)),
                      min_size=1, max_size=3),
       command=st.sampled_from(sorted(CASE_COMMANDS)))
def test_mutated_case_files_never_crash(tmp_path, picks, command):
    import tomllib

    data = tomllib.loads(GOOD_CASE)
    for index, value in picks:
        paths = _paths(data)
        *parent, key = paths[index % len(paths)]
        target = data
        for k in parent:
            target = target[k]
        target[key] = copy.deepcopy(value)  # never the shared object itself
    text = "\n".join(f"{json.dumps(k)} = {_toml_value(v)}" for k, v in data.items()) + "\n"
    path = write_case(tmp_path, text)
    assert_no_crash(invoke([command, path, *CASE_COMMANDS[command]]))


_cells = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True).map(repr),
    st.sampled_from(["", "abc", "1,5", "1e999", "-0", "nan", " ", "0x10", "1_0", "--1"]),
    st.integers(-10**6, 10**6).map(str),
)


@_SETTINGS
@given(rows=st.lists(st.tuples(_cells, _cells), min_size=0, max_size=25),
       header=st.sampled_from(["force,disp\n", "disp,force\n", "", "# invented\nforce disp\n",
                               "force,disp\nN,um\n", "force,disp\nkN,mm\n"]),
       sep=st.sampled_from([",", "\t", " ", ";"]), as_json=st.booleans())
def test_random_histories_never_crash_check(tmp_path, rows, header, sep, as_json):
    csv = header + "\n".join(sep.join(r) for r in rows) + "\n"
    path = write_case(tmp_path, GOOD_CASE, csv)
    r = invoke(["check", path, *(["--json"] if as_json else [])])
    assert_no_crash(r)
    if as_json and r.exit_code in (0, 1):
        assert json.loads(r.output)["worst_verdict"] in ("consistent", "suspect",
                                                         "violates_bounds")


@_SETTINGS
@given(rows=st.lists(st.tuples(st.floats(-1e6, 1e6), st.floats(-1e3, 1e3)), min_size=3,
                     max_size=60))
def test_random_numeric_histories_give_a_result_or_an_error(tmp_path, rows):
    csv = "force,disp\n" + "\n".join(f"{f!r},{u!r}" for f, u in rows) + "\n"
    assert_no_crash(invoke(["check", write_case(tmp_path, GOOD_CASE, csv), "--json"]))
