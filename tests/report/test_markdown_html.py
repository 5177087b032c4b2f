import base64

import pytest

from micromech.errors import InputError
from micromech.report.html import (
    escape,
    figure_png,
    html_document,
    html_table,
    image_tag,
    png_data_uri,
)
from micromech.report.markdown import escape_cell, markdown_table, write_atomic


def test_markdown_table_layout_and_alignment():
    text = markdown_table(["a", "b"], [[1, "x|y"]], align="lr")
    assert text == "| a | b |\n|---|--:|\n| 1 | x\\|y |\n"


def test_escape_cell_removes_line_breaks():
    assert escape_cell("a\nb") == "a b"


def test_markdown_row_length_mismatch_raises():
    with pytest.raises(InputError, match="row 1 has 1 cells; the table has 2 columns"):
        markdown_table(["a", "b"], [[1]])


def test_markdown_bad_alignment_raises():
    with pytest.raises(InputError, match="align = 'lx' must have one of l, r, c per column"):
        markdown_table(["a", "b"], [[1, 2]], align="lx")


def test_html_table_escapes_and_classes():
    t = html_table(["<h>"], [["a&b"]], numeric=[True], cell_class=[["suspect"]])
    assert "&lt;h&gt;" in t and "a&amp;b" in t and 'class="num suspect"' in t


def test_html_row_length_mismatch_raises():
    with pytest.raises(InputError, match="row 1 has 2 cells"):
        html_table(["a"], [[1, 2]])


def test_png_data_uri_round_trips():
    from matplotlib.figure import Figure

    png = figure_png(Figure(figsize=(1, 1)))
    uri = png_data_uri(png)
    assert uri.startswith("data:image/png;base64,")
    assert base64.b64decode(uri.split(",", 1)[1]) == png
    assert image_tag(png, "a<b", "cap").count("<img") == 1


def test_png_data_uri_rejects_other_bytes():
    with pytest.raises(InputError, match="expects PNG bytes"):
        png_data_uri(b"GIF89a")


def test_html_document_is_self_contained_with_caution_twice():
    doc = html_document("T <1>", "<p>x</p>", caution="not allowables")
    assert doc.startswith("<!DOCTYPE html>") and doc.count("not allowables") == 2
    assert "T &lt;1&gt;" in doc and "http" not in doc and "<script" not in doc
    assert escape('"') == "&quot;"


def test_write_atomic_replaces_whole_file_and_leaves_no_temp(tmp_path):
    target = tmp_path / "r.md"
    write_atomic(target, "old")
    write_atomic(target, b"new")
    assert target.read_text() == "new"
    assert [p.name for p in tmp_path.iterdir()] == ["r.md"]


def test_write_atomic_failure_keeps_old_file(tmp_path, monkeypatch):
    import os

    target = tmp_path / "r.md"
    write_atomic(target, "old")

    def broken(src, dst):
        raise OSError("disk full (simulated)")

    monkeypatch.setattr(os, "replace", broken)
    with pytest.raises(OSError, match="simulated"):
        write_atomic(target, "new")
    assert target.read_text() == "old"
    assert [p.name for p in tmp_path.iterdir()] == ["r.md"]
