"""RVE histories into stress-strain curves: units, load-case geometry, lateral strains.

The reading of delimited text into tables is tested in test_tables.py. All data are invented.
"""

from __future__ import annotations

import os
from pathlib import Path
from types import SimpleNamespace

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from micromech.errors import DataFileError, InputError, MicromechError, UnitError
from micromech.rve import (
    Curve,
    curve_from_columns,
    curve_metrics,
    history_to_curve,
    load_curve,
    metrics_of_curve,
    read_table,
)

FIXTURE = HealthCheck.function_scoped_fixture
SIZE = (100e-6, 80e-6, 50e-6)  # Lx, Ly, Lz in m (invented cell)


def write(tmp_path: Path, text: str, name: str = "h.csv") -> Path:
    p = tmp_path / name
    with open(p, "w", newline="") as f:
        f.write(text)
    return p


# --- the file and the arrays ------------------------------------------------------------


def test_file_is_never_modified_and_arrays_are_read_only(tmp_path):
    p = write(tmp_path, "disp,force\n0,0\n1,2\n2,4\n")
    before = (p.read_bytes(), os.stat(p).st_mtime_ns)
    t = read_table(p)
    c = history_to_curve(t, "x", SIZE, force=("force", "N"), displacement=("disp", "um"))
    assert (p.read_bytes(), os.stat(p).st_mtime_ns) == before
    for arr in (t.data, t.lines, t.column("force"), c.strain, c.stress):
        with pytest.raises(ValueError):
            arr[0] = 1.0


# --- curves from force and displacement --------------------------------------------------


def test_normal_case_divides_by_face_area_and_edge_length(tmp_path):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    for direction, area, length in (("x", 80e-6 * 50e-6, 100e-6), ("y", 100e-6 * 50e-6, 80e-6),
                                    ("z", 100e-6 * 80e-6, 50e-6)):
        c = history_to_curve(t, direction, SIZE, force=("f", "N"), displacement=("u", "um"))
        np.testing.assert_allclose(c.stress, np.array([0, 2, 4]) / area, rtol=1e-15)
        np.testing.assert_allclose(c.strain, np.array([0, 1, 2]) * 1e-6 / length, rtol=1e-15)


@pytest.mark.parametrize(
    ("direction", "area", "length"),
    [("xy", 100e-6 * 50e-6, 80e-6),   # force along x on the face normal to y; u_x / Ly
     ("yz", 100e-6 * 80e-6, 50e-6),   # force along y on the face normal to z; u_y / Lz
     ("xz", 100e-6 * 80e-6, 50e-6)],  # force along x on the face normal to z; u_x / Lz
)
def test_shear_case_convention(tmp_path, direction, area, length):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    c = history_to_curve(t, direction, SIZE, force={"column": "f", "unit": "mN"},
                         displacement={"column": "u", "unit": "nm"})
    assert c.is_shear
    np.testing.assert_allclose(c.stress, np.array([0, 2, 4]) * 1e-3 / area, rtol=1e-15)
    np.testing.assert_allclose(c.strain, np.array([0, 1, 2]) * 1e-9 / length, rtol=1e-15)


def test_mn_um_and_n_mm_give_the_same_stress_and_strain(tmp_path):
    x = np.linspace(0, 2.0, 50).tolist()  # um
    f = [12.0 * u - 0.5 * u**2 for u in x]  # mN
    a = write(tmp_path, "u,f\n" + "\n".join(f"{u!r},{v!r}" for u, v in zip(x, f, strict=True)),
              name="a.csv")
    b = write(tmp_path, "u\tf\n" + "\n".join(f"{u / 1e3!r}\t{v / 1e3!r}"
                                             for u, v in zip(x, f, strict=True)), name="b.tsv")
    ca = load_curve(a, "y", SIZE, force=("f", "mN"), displacement=("u", "um"))
    cb = load_curve(b, "y", SIZE, force=("f", "N"), displacement=("u", "mm"))
    np.testing.assert_allclose(ca.stress, cb.stress, rtol=1e-13)
    np.testing.assert_allclose(ca.strain, cb.strain, rtol=1e-13)


def test_lateral_displacements_and_strains(tmp_path):
    t = read_table(write(tmp_path, "u,f,uy,ez\n0,0,0,0\n1,2,-0.24,-0.3\n2,4,-0.48,-0.6\n"))
    c = history_to_curve(t, "x", SIZE, force=("f", "N"), displacement=("u", "um"),
                         lateral={"y": ("uy", "um"), "z": ("ez", "%")})
    np.testing.assert_allclose(c.lateral["y"], [0, -0.24e-6 / 80e-6, -0.48e-6 / 80e-6])
    np.testing.assert_allclose(c.lateral["z"], [0, -0.003, -0.006])


def test_case_file_column_objects_are_accepted(tmp_path):
    t = read_table(write(tmp_path, "u,f,uy\n0,0,0\n1,2,-0.3\n2,4,-0.6\n"))
    col = SimpleNamespace
    c = history_to_curve(t, "x", SIZE, force=col(column="f", unit="N"),
                         displacement=col(column=1, unit="um"),
                         lateral=[col(column="uy", unit="um", direction="y")])
    assert c.lateral["y"][2] == pytest.approx(-0.6e-6 / 80e-6)


def test_stress_and_strain_columns_with_percent(tmp_path):
    t = read_table(write(tmp_path, "eps,sig,ey\n0,0,0\n0.1,70,-0.03\n0.2,140,-0.06\n"))
    c = curve_from_columns(t, "x", stress=("sig", "MPa"), strain=("eps", "%"),
                           lateral=[{"column": "ey", "unit": "%", "direction": "y"}])
    np.testing.assert_allclose(c.stress, [0, 70e6, 140e6])
    np.testing.assert_allclose(c.strain, [0, 1e-3, 2e-3])
    m = metrics_of_curve(c)
    assert m.modulus == pytest.approx(70e9, rel=1e-12)
    assert m.poisson["y"] == pytest.approx(0.3, rel=1e-12)


@pytest.mark.parametrize(
    ("kwargs", "error", "message"),
    [
        ({"force": ("f", "mm")}, UnitError, "force unit expects a force"),
        ({"force": ("f", None)}, UnitError, r"force unit: a unit is required"),
        ({"force": ("f", 3)}, UnitError, "force unit: expected a unit string"),
        ({"force": ("f", "furlong")}, UnitError, "force unit"),
        ({"force": {"col": "f"}}, InputError, "force: expected keys 'column' and 'unit'"),
        ({"force": {"column": "f", "unit": "N", "k": 2}}, InputError, r"unknown key\(s\) \['k'\]"),
        ({"force": 1.5}, InputError, r"force: expected \(column, unit\)"),
        ({"lateral": {"x": ("f", "um")}}, InputError, "lateral axis of load case 'x' must be"),
        ({"lateral": [("f", "um")]}, InputError, "needs a direction"),
    ],
)
def test_bad_column_settings_raise(tmp_path, kwargs, error, message):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    args = {"force": ("f", "N"), "displacement": ("u", "um")} | kwargs
    with pytest.raises(error, match=message):
        history_to_curve(t, "x", SIZE, **args)


def test_bad_strain_unit_raises(tmp_path):
    t = read_table(write(tmp_path, "e,s\n0,0\n1,2\n2,4\n"))
    with pytest.raises(UnitError, match=r"strain unit: strain unit must be empty, '1', '-' or '%'"):
        curve_from_columns(t, "x", stress=("s", "MPa"), strain=("e", "MPa"))


def test_lateral_strain_of_a_shear_case_raises(tmp_path):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    with pytest.raises(InputError, match="lateral strains are read for normal load cases only"):
        history_to_curve(t, "xy", SIZE, force=("f", "N"), displacement=("u", "um"),
                         lateral={"z": ("u", "um")})


@pytest.mark.parametrize(
    ("size", "message"),
    [((1e-4, 1e-4), r"expected three lengths \(x, y, z\)"),
     ((1e-4, 0.0, 1e-4), "must be positive and finite"),
     (("a", 1, 1), "expected three lengths in m")],
)
def test_bad_size_raises(tmp_path, size, message):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    with pytest.raises(InputError, match=message):
        history_to_curve(t, "x", size, force=("f", "N"), displacement=("u", "um"))


def test_bad_direction_raises(tmp_path):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,4\n"))
    with pytest.raises(InputError, match="direction must be one of x, y, z, xy, yz, xz, got 'yx'"):
        history_to_curve(t, "yx", SIZE, force=("f", "N"), displacement=("u", "um"))
    with pytest.raises(InputError, match="direction must be one of"):
        curve_from_columns(t, "q", stress=("f", "MPa"), strain=("u", "1"))


def test_load_curve_needs_exactly_one_complete_pair(tmp_path):
    p = write(tmp_path, "u,f\n0,0\n1,2\n2,4\n")
    with pytest.raises(InputError, match="give either force and displacement columns or stress"):
        load_curve(p, "x", SIZE)
    with pytest.raises(InputError, match="force, displacement and the RVE size are all needed"):
        load_curve(p, "x", force=("f", "N"), displacement=("u", "um"))
    with pytest.raises(InputError, match="both the stress and the strain column are needed"):
        load_curve(p, "x", stress=("f", "MPa"))


def test_stress_strain_load_curve(tmp_path):
    p = write(tmp_path, "e,s\n0,0\n0.001,70\n0.002,140\n")
    c = load_curve(p, "z", stress=("s", "MPa"), strain=("e", "1"), delimiter=",")
    assert c.direction == "z" and c.stress[-1] == 140e6 and c.lines.tolist() == [2, 3, 4]


# --- the Curve object --------------------------------------------------------------------


@pytest.mark.parametrize(
    ("kwargs", "message"),
    [
        ({"direction": "w"}, "direction must be one of"),
        ({"stress": [0.0, 1.0]}, r"stress: 2 point\(s\); at least 3"),
        ({"stress": [0.0, 1.0, 2.0, 3.0]}, "same length, got 3 and 4"),
        ({"stress": [0.0, np.nan, 1.0]}, "point 1 is nan; every value must be finite"),
        ({"stress": [[0.0, 1.0, 2.0]]}, r"expected a 1-D array, got shape \(1, 3\)"),
        ({"stress": ["a", "b", "c"]}, "expected an array of numbers"),
        ({"lateral": {"y": [0.0, 1.0, 2.0, 3.0]}}, "lateral strain y has 4 points, the curve 3"),
    ],
)
def test_curve_validates_its_arrays(kwargs, message):
    args = {"direction": "x", "strain": [0.0, 1e-3, 2e-3], "stress": [0.0, 1e6, 2e6]} | kwargs
    with pytest.raises(InputError, match=message):
        Curve(**args)


# --- malformed files never give a traceback ----------------------------------------------

_cell = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True).map(repr),
    st.integers(-10**6, 10**6).map(str),
    st.text(alphabet=st.characters(codec="utf-8"), max_size=6),
    st.sampled_from(["", " ", "nan", "-", "1e999", "#", "%", "1,5", '"x"']),
)
_row = st.lists(_cell, min_size=0, max_size=4).flatmap(
    lambda cells: st.sampled_from([",", ";", "\t", " "]).map(lambda d: d.join(cells))
)


def _grade(path: Path) -> None:
    t = read_table(path)
    c = history_to_curve(t, "x", SIZE, force=(2, "N"), displacement=(1, "um"),
                         lateral={"y": (3, "um")} if t.n_columns >= 3 else None)
    m = metrics_of_curve(c)
    assert np.isfinite(m.modulus)


@settings(max_examples=60, deadline=None, suppress_health_check=[FIXTURE])
@given(rows=st.lists(_row, min_size=0, max_size=12))
def test_random_text_rows_give_a_result_or_a_micromech_error(tmp_path, rows):
    p = tmp_path / "random.csv"
    p.write_text("\n".join(rows), encoding="utf-8")
    try:
        _grade(p)
    except MicromechError:
        pass


@settings(max_examples=40, deadline=None, suppress_health_check=[FIXTURE])
@given(data=st.binary(max_size=300))
def test_random_bytes_give_a_result_or_a_micromech_error(tmp_path, data):
    p = tmp_path / "random.bin"
    p.write_bytes(data)
    try:
        _grade(p)
    except MicromechError:
        pass


@settings(max_examples=40, deadline=None, suppress_health_check=[FIXTURE])
@given(values=st.lists(st.tuples(st.floats(-1e300, 1e300), st.floats(-1e300, 1e300)),
                       min_size=3, max_size=30))
def test_random_numeric_histories_give_a_result_or_a_micromech_error(tmp_path, values):
    p = tmp_path / "numbers.csv"
    p.write_text("u,f\n" + "\n".join(f"{u!r},{f!r}" for u, f in values), encoding="utf-8")
    try:
        _grade(p)
        curve_metrics([u for u, _ in values], [f for _, f in values])
    except MicromechError:
        pass


def test_values_that_overflow_in_si_name_the_line(tmp_path):
    t = read_table(write(tmp_path, "u,f\n0,0\n1,2\n2,1e300\n"))
    with pytest.raises(DataFileError, match=r"line 4: stress \(force / area\) overflows to inf"):
        history_to_curve(t, "x", SIZE, force=("f", "kN"), displacement=("u", "um"))
    t = read_table(write(tmp_path, "u,f\n0,0\n1e306,2\n2,1\n", name="g.csv"))
    with pytest.raises(DataFileError, match=r"line 3: strain \(displacement / length\) overflows"):
        history_to_curve(t, "x", SIZE, force=("f", "kN"), displacement=("u", "m"))
    t = read_table(write(tmp_path, "u,f,l\n0,0,0\n1,2,1e306\n2,1,0\n", name="l.csv"))
    with pytest.raises(DataFileError, match=r"line 3: lateral strain y overflows"):
        history_to_curve(t, "x", SIZE, force=("f", "kN"), displacement=("u", "m"),
                         lateral={"y": ("l", "m")})
    t = read_table(write(tmp_path, "e,s\n0,0\n1,1e300\n2,1\n", name="s.csv"))
    with pytest.raises(DataFileError, match=r"line 3: stress overflows"):
        curve_from_columns(t, "x", stress=("s", "GPa"), strain=("e", "1"))


# --- a row of units under the header --------------------------------------------------------

UNITS_FILE = "# invented\ntime,force,disp,eps\ns,[mN],(um),%\n0,0,0,0\n1,2,1,0.1\n2,4,2,0.2\n"


def test_units_row_under_the_header_is_read_and_skipped(tmp_path):
    t = read_table(write(tmp_path, UNITS_FILE))
    assert t.header == ("time", "force", "disp", "eps") and t.units_line == 3
    assert t.units == ("s", "[mN]", "(um)", "%") and t.lines.tolist() == [4, 5, 6]
    c = history_to_curve(t, "x", SIZE, force=("force", "mN"), displacement=("disp", "um"))
    assert c.stress[-1] == pytest.approx(4e-3 / (SIZE[1] * SIZE[2]))  # N / m^2
    s = curve_from_columns(t, "x", stress=("force", "MPa"), strain=("eps", "%"))
    assert s.strain[-1] == pytest.approx(0.002)


@pytest.mark.parametrize(("kwargs", "message"), [
    ({"force": ("force", "N"), "displacement": ("disp", "um")},
     r"line 3: the force column 'force' is in 'mN' by the file's row of units, but its unit "
     r"is declared 'N'"),
    ({"force": ("force", "mN"), "displacement": ("disp", "mm")},
     r"the displacement column 'disp' is in 'um'"),
])
def test_declared_unit_that_contradicts_the_units_row_raises(tmp_path, kwargs, message):
    t = read_table(write(tmp_path, UNITS_FILE))
    with pytest.raises(UnitError, match=message):
        history_to_curve(t, "x", SIZE, **kwargs)


def test_units_row_label_that_is_no_unit_is_not_compared(tmp_path):
    t = read_table(write(tmp_path, "force,disp\nreaction,stroke\n0,0\n1,1\n2,2\n"))
    assert t.units == ("reaction", "stroke")
    c = history_to_curve(t, "x", SIZE, force=("force", "N"), displacement=("disp", "mm"))
    assert c.n_points == 3
