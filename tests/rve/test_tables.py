"""Reading delimited text into tables: sniffing, headers, units rows, bad cells (invented data)."""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from micromech.errors import DataFileError, InputError
from micromech.rve import tables
from micromech.rve.tables import read_table

FIXTURE = HealthCheck.function_scoped_fixture


def write(tmp_path: Path, text: str | bytes, name: str = "h.csv", mode: str = "w") -> Path:
    p = tmp_path / name
    if mode == "wb":
        p.write_bytes(text.encode("latin-1") if isinstance(text, str) else text)
    else:
        with open(p, "w", newline="") as f:
            f.write(text)
    return p


# --- tables --------------------------------------------------------------------------------


def test_header_comments_and_blank_lines_are_skipped_and_lines_counted(tmp_path):
    p = write(tmp_path, "# invented RVE history\n% solver notes\n\nstep,disp,force\n"
                        "0,0,0\n\n1,0.1,2\n  # mid comment\n2,0.2,4\n")
    t = read_table(p)
    assert t.header == ("step", "disp", "force")
    assert t.header_line == 4
    assert t.lines.tolist() == [5, 7, 9]
    assert t.column("force").tolist() == [0.0, 2.0, 4.0]
    assert t.columns["disp"].tolist() == [0.0, 0.1, 0.2]
    assert (t.n_rows, t.n_columns, t.delimiter) == (3, 3, ",")


@pytest.mark.parametrize(
    ("text", "delim"),
    [
        ("a\tb\n1\t2\n3\t4\n5\t6\n", "\t"),
        ("a;b\n1,5;2\n3;4\n5;6\n", ";"),
        ("a b\n1 2\n3    4\n5\t6\n", " "),
        ("a, b\n1, 2\n3, 4\n5, 6\n", ","),
    ],
)
def test_delimiter_is_sniffed(tmp_path, text, delim):
    assert read_table(write(tmp_path, text)).delimiter == delim


def test_headerless_file_numbers_columns_from_one(tmp_path):
    t = read_table(write(tmp_path, "0 0\n1 10\n2 20\n"))
    assert t.header == () and t.header_line is None
    assert t.names == ("1", "2")
    assert t.column(2).tolist() == [0.0, 10.0, 20.0]
    assert t.column("2").tolist() == [0.0, 10.0, 20.0]


def test_crlf_bom_and_quoted_header_are_read(tmp_path):
    p = write(tmp_path, b'\xef\xbb\xbf"disp";"force"\r\n0;0\r\n1;2\r\n2;4\r\n', mode="wb")
    t = read_table(p)
    assert t.header == ("disp", "force")
    assert t.column("force").tolist() == [0.0, 2.0, 4.0]


def test_header_names_match_ignoring_case_and_spaces(tmp_path):
    t = read_table(write(tmp_path, "Disp X,Force X\n0,0\n1,2\n2,4\n"))
    assert t.column("dispx").tolist() == [0.0, 1.0, 2.0]


def test_delimiter_given_by_name_and_skip_rows(tmp_path):
    p = write(tmp_path, "solver output v1\nunits below\nd;f\n0;0\n1;2\n2;4\n")
    t = read_table(p, delimiter="semicolon", skip_rows=2)
    assert t.lines.tolist() == [4, 5, 6] and t.column("f")[-1] == 4.0


def test_text_in_an_unused_column_does_not_stop_reading(tmp_path):
    t = read_table(write(tmp_path, "disp,force,status\n0,0,ok\n1,2,ok\n2,4,done\n"))
    assert t.column("force").tolist() == [0.0, 2.0, 4.0]


def test_text_in_a_number_column_names_file_line_and_column(tmp_path):
    p = write(tmp_path, "disp,force\n0,0\n1,abc\n2,4\n")
    with pytest.raises(DataFileError, match=r"h\.csv, line 3, column 2 \('force'\): 'abc' is not"):
        read_table(p).column("force")


def test_empty_cell_is_reported(tmp_path):
    p = write(tmp_path, "disp,force\n0,0\n1,\n2,4\n")
    with pytest.raises(DataFileError, match=r"line 3, column 2 .*an empty cell"):
        read_table(p).column("force")


def test_decimal_comma_gets_a_hint(tmp_path):
    p = write(tmp_path, "d;f\n0;0\n1;2,5\n2;4\n")
    with pytest.raises(DataFileError, match="decimal comma"):
        read_table(p).column("f")


def test_nan_and_infinity_are_rejected_with_line(tmp_path):
    p = write(tmp_path, "disp,force\n0,0\n1,nan\n2,4\n")
    with pytest.raises(DataFileError, match=r"line 3, column 2 \('force'\): value nan is not"):
        read_table(p).column("force")
    p = write(tmp_path, "0 0\n1 2\n2 inf\n", name="b.txt")
    with pytest.raises(DataFileError, match=r"line 3, column 2: value inf"):
        read_table(p).column(2)


def test_too_few_rows_is_an_error(tmp_path):
    with pytest.raises(DataFileError, match="2 data row.*at least 3"):
        read_table(write(tmp_path, "disp,force\n0,0\n1,2\n"))


def test_only_comments_is_an_error(tmp_path):
    with pytest.raises(DataFileError, match="no data rows"):
        read_table(write(tmp_path, "# nothing\n\n% here\n"))


def test_missing_column_name_lists_the_columns(tmp_path):
    t = read_table(write(tmp_path, "disp,force\n0,0\n1,2\n2,4\n"))
    with pytest.raises(DataFileError, match=r"line 1: force column 'load' does not exist; .*'d"):
        t.column("load", "force column")


def test_missing_column_number_is_an_error(tmp_path):
    t = read_table(write(tmp_path, "0,0\n1,2\n2,4\n"))
    with pytest.raises(DataFileError, match="number 3 does not exist; the file has 2 column"):
        t.column(3)
    with pytest.raises(DataFileError, match="number 0 does not exist"):
        t.column(0)


def test_column_reference_of_wrong_type_is_an_error(tmp_path):
    t = read_table(write(tmp_path, "0,0\n1,2\n2,4\n"))
    with pytest.raises(DataFileError, match="must be a column name or a 1-based column number"):
        t.column(1.5)  # type: ignore[arg-type]


def test_duplicate_header_name_is_ambiguous(tmp_path):
    t = read_table(write(tmp_path, "u,f,u\n0,0,0\n1,2,1\n2,4,2\n"))
    with pytest.raises(DataFileError, match=r"'u' names columns 1, 3; give the column number"):
        t.column("u")
    assert t.column(3).tolist() == [0.0, 1.0, 2.0]


def test_ragged_row_names_the_line(tmp_path):
    p = write(tmp_path, "disp,force\n0,0\n1,2,7\n2,4\n")
    with pytest.raises(DataFileError, match=r"line 3: 3 cell\(s\) where line 1 has 2 \(deli"):
        read_table(p)


def test_non_utf8_file_is_an_error(tmp_path):
    p = write(tmp_path, b"disp,force\n0,0\n1,\xff\n2,4\n", mode="wb")
    with pytest.raises(DataFileError, match=r"line 3: not UTF-8 text \(byte 0xff"):
        read_table(p)


def test_missing_file_is_an_error(tmp_path):
    with pytest.raises(DataFileError, match="cannot read the file"):
        read_table(tmp_path / "absent.csv")


def test_bad_delimiter_and_skip_rows_are_input_errors(tmp_path):
    p = write(tmp_path, "0,0\n1,2\n2,4\n")
    with pytest.raises(InputError, match="delimiter: expected"):
        read_table(p, delimiter="|")
    with pytest.raises(InputError, match="skip_rows: expected a whole number >= 0, got -1"):
        read_table(p, skip_rows=-1)


@pytest.mark.parametrize(
    ("text", "column", "line"),
    [
        ("a,b,c\n1, ,2\n3,4,5\n6,7,8\n", "b", 2),      # numpy's parser reads ' ' as -1
        ("a;b;c\n1;2;3\n4;5;\t\n6;7;8\n", "c", 3),
        ("a\tb\tc\n1\t \t2\n3\t4\t5\n6\t7\t8\n", "b", 2),
    ],
)
def test_cell_of_blanks_is_an_empty_cell_not_a_number(tmp_path, text, column, line):
    t = read_table(write(tmp_path, text))
    assert np.isnan(t.columns[column][line - 2])
    with pytest.raises(DataFileError, match=rf"line {line}, column \d \('{column}'\): an empty"):
        t.column(column)


def test_blank_inside_a_tab_separated_cell_does_not_split_it(tmp_path):
    t = read_table(write(tmp_path, "a\tb\n0\t0\n1 2\t\n3\t4\n"))  # "1 2" is not two cells
    assert t.bad_cells == {0: (3, "1 2"), 1: (3, "")}
    assert t.data[[0, 2]].tolist() == [[0.0, 0.0], [3.0, 4.0]]
    with pytest.raises(DataFileError, match=r"line 3, column 1 \('a'\): '1 2' is not a number"):
        t.column("a")


def _outcome(path: Path, reader: str) -> object:
    """read_table with the vectorised reader, the joined-line parser or cell by cell only."""
    with pytest.MonkeyPatch.context() as mp:
        if reader != "vectorised":
            mp.setattr(tables, "_read_regular", lambda *args: None)
        if reader == "cells":
            mp.setattr(tables, "_parse_joined", lambda *args: None)
        try:
            t = read_table(path)
        except DataFileError as exc:
            return type(exc)
    return (t.header, t.units, t.header_line, t.units_line,
            np.nan_to_num(t.data, nan=7.5).tolist(), t.lines.tolist(), t.delimiter,
            dict(t.bad_cells))


def test_units_row_is_read_alike_by_all_readers(tmp_path):
    p = write(tmp_path, "# invented\ntime,force\ns,[mN]\n0,0\n1,2\n2,4\n")
    outcomes = [_outcome(p, r) for r in ("vectorised", "joined", "cells")]
    assert outcomes[0] == outcomes[1] == outcomes[2]
    assert outcomes[0][1:4] == (("s", "[mN]"), 2, 3)


_number = st.one_of(st.floats(-1e6, 1e6, allow_nan=False).map(lambda v: f"{v:.6g}"),
                    st.sampled_from(["abc", "", " ", "1 2", "nan", "1e5", ".5", "-0"]))
_extra = st.sampled_from(["", "   ", "# note", "% note", "  # indented note", "\t"])


@settings(max_examples=60, deadline=None, suppress_health_check=[FIXTURE])
@example(rows=[["0", "0"]] * 4, delim=" ", header=False, extras=[], crlf=False, lead="\t ")
@given(
    rows=st.lists(st.lists(_number, min_size=2, max_size=2), min_size=0, max_size=8),
    delim=st.sampled_from([",", ";", "\t", " ", "  "]),
    header=st.booleans(),
    extras=st.lists(st.tuples(st.integers(0, 10), _extra), max_size=4),
    crlf=st.booleans(),
    lead=st.sampled_from(["", " ", "\t ", "\x0b"]),
)
def test_vectorised_joined_and_cell_by_cell_readers_agree(
    tmp_path, rows, delim, header, extras, crlf, lead
):
    lines = [lead + delim.join(r) for r in rows]
    if header:
        lines.insert(0, delim.join(["disp", "force"]))
    for pos, text in extras:
        lines.insert(min(pos, len(lines)), text)
    body = ("\r\n" if crlf else "\n").join(lines)
    p = tmp_path / "h.csv"
    p.write_bytes(("# invented, 5 \u00b5m cell\n" + body).encode())
    outcomes = [_outcome(p, r) for r in ("vectorised", "joined", "cells")]
    assert outcomes[0] == outcomes[1] == outcomes[2]
