"""Check reports: terminal text, Markdown, self-contained HTML, input safety, atomic rewrite."""

import base64
import hashlib
import re
from pathlib import Path

import numpy as np
import pytest

from micromech.errors import InputError
from micromech.report.check import (
    format_check_text,
    render_html,
    render_markdown,
    run_demo_check,
    verdict_rows,
    write_check_report,
)
from micromech.rve.check import CheckResult, CurveResult, check_case
from micromech.rve.curves import curve_metrics
from micromech.rve.verdicts import CAUTION, grade_property

DEMO = Path(__file__).resolve().parents[2] / "data" / "demo"


def small_result(folder: Path) -> CheckResult:
    """A hand-made result: one curve, one consistent and one violating property."""
    case = folder / "case.toml"
    hist = folder / "x.csv"
    case.write_text("name = 'small'\n")
    hist.write_text("strain,stress\n0,0\n")
    strain = np.linspace(0.0, 0.02, 120)
    stress = 10e9 * strain / (1.0 + (strain / 0.008) ** 4) ** 0.25
    m = curve_metrics(strain, stress, direction="x")
    props = {
        "E1": grade_property("E1", m.modulus, lower_bound=5e9, upper_bound=20e9,
                             estimates={"mori_tanaka": 10.1e9, "halpin_tsai": 10.0e9},
                             tolerance=0.05),
        "E2": grade_property("E2", 7e12, lower_bound=3e9, upper_bound=15e9,
                             estimates={"mori_tanaka": 7e9}, tolerance=0.1),
    }
    return CheckResult(case="small <test>", path=case, architecture="unidirectional",
                       volume_fraction=0.5, arrangement="random", properties=props,
                       curves={"x": CurveResult("x", strain, stress, m, str(hist))},
                       notes=("a note",), inputs=(case, hist))


def digest(p: Path) -> str:
    return hashlib.sha256(p.read_bytes()).hexdigest()


def test_text_report_has_table_reasons_of_problems_and_caution(tmp_path):
    r = small_result(tmp_path)
    text = format_check_text(r)
    assert "property" in text and "violates_bounds" in text
    assert "E2 (violates_bounds):" in text and "E1 (consistent):" not in text
    assert "E1 (consistent):" in format_check_text(r, all_reasons=True)
    assert "not design allowables" in text and "licensed engineer" in text
    assert "Load cases:" in text and "Notes:" in text


def test_verdict_rows_units_in_cells(tmp_path):
    headers, rows = verdict_rows(small_result(tmp_path))
    assert headers[0] == "property" and rows[1][0] == "E2"
    assert rows[1][1].endswith("GPa") and rows[1][-1] == "violates_bounds"


def test_report_files_html_self_contained_markdown_present(tmp_path):
    r = small_result(tmp_path)
    out = tmp_path / "report"
    written = write_check_report(r, out)
    html = (out / "report.html").read_text()
    md = (out / "report.md").read_text()
    # HTML: no link to anything outside the file; images are data URIs of PNGs
    assert not re.search(r"(src|href)\s*=\s*[\"'](?!data:)", html)
    assert "http://" not in html and "https://" not in html
    assert "<script" not in html and "<link" not in html
    uris = re.findall(r'src="data:image/png;base64,([^"]+)"', html)
    assert len(uris) == 2
    assert all(base64.b64decode(u).startswith(b"\x89PNG") for u in uris)
    # Markdown: references the PNGs written next to it
    for name in ("curves.png", "properties.png"):
        assert f"({name})" in md and (out / name).is_file()
    assert written["html"] == out / "report.html"
    # caution in every document, escaping of the case name in HTML
    assert CAUTION in md and CAUTION in html
    assert "small &lt;test&gt;" in html


def test_report_never_touches_inputs(tmp_path):
    r = small_result(tmp_path)
    before = {p: (digest(p), p.stat().st_mtime_ns) for p in r.inputs}
    write_check_report(r, tmp_path / "out")
    assert {p: (digest(p), p.stat().st_mtime_ns) for p in r.inputs} == before


def test_report_refuses_the_folder_of_the_inputs(tmp_path):
    r = small_result(tmp_path)
    with pytest.raises(InputError, match=r"holds the case's input files \(case.toml, x.csv\)"):
        write_check_report(r, tmp_path)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["case.toml", "x.csv"]


def test_report_refuses_an_existing_file_as_folder(tmp_path):
    r = small_result(tmp_path)
    f = tmp_path / "taken"
    f.write_text("keep")
    with pytest.raises(InputError, match="is an existing file; give a folder"):
        write_check_report(r, f)
    assert f.read_text() == "keep"


def test_rewriting_replaces_whole_files_and_leaves_no_temp(tmp_path):
    r = small_result(tmp_path)
    out = tmp_path / "out"
    (out).mkdir()
    (out / "report.md").write_text("an old report")
    write_check_report(r, out)
    first = (out / "report.md").read_text()
    assert first.startswith("# RVE check: small <test>")
    write_check_report(r, out)
    assert (out / "report.md").read_text() == first
    assert not [p for p in out.iterdir() if p.name.startswith(".")]


def test_failed_rewrite_keeps_the_previous_report(tmp_path, monkeypatch):
    import os

    r = small_result(tmp_path)
    out = tmp_path / "out"
    write_check_report(r, out)
    old = (out / "report.html").read_bytes()
    real_replace = os.replace

    def fail_on_html(src, dst):
        if str(dst).endswith("report.html"):
            raise OSError("simulated crash while replacing")
        real_replace(src, dst)

    monkeypatch.setattr(os, "replace", fail_on_html)
    with pytest.raises(OSError, match="simulated crash"):
        write_check_report(r, out)
    assert (out / "report.html").read_bytes() == old
    assert not [p for p in out.iterdir() if p.name.startswith(".")]


def test_markdown_and_html_render_without_figures(tmp_path):
    r = small_result(tmp_path)
    assert "![" not in render_markdown(r)
    assert "<img" not in render_html(r)


def test_demo_check_verdicts_without_writing(tmp_path):
    out = run_demo_check(tmp_path, write=False)
    assert out["crossply"].worst_verdict == "consistent"
    assert {p.verdict for p in out["crossply_bad"].properties.values()} == {
        "consistent", "suspect", "violates_bounds"}
    assert not any(tmp_path.iterdir())


def test_demo_bad_report_is_written_and_names_the_causes(tmp_path):
    r = check_case(DEMO / "crossply_bad.toml")
    write_check_report(r, tmp_path / "bad")
    md = (tmp_path / "bad" / "report.md").read_text()
    assert "violates_bounds" in md and "A unit slip" in md and "check size.z" in md


def test_demo_histories_are_what_the_generator_writes(tmp_path):
    import importlib.util

    spec = importlib.util.spec_from_file_location("demo_generate", DEMO / "generate.py")
    gen = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(gen)
    gen.main(tmp_path)
    for d in "xyz":
        made = (tmp_path / f"rve_{d}.csv").read_text()
        assert made == (DEMO / f"rve_{d}.csv").read_text()
        assert made.startswith("# invented example")


def averaged_result() -> CheckResult:
    """A check from six averaged load cases of an invented isotropic cell (no curves)."""
    from micromech.case import case_from_dict
    from micromech.tensors import isotropic_stiffness

    C = isotropic_stiffness(5e9, 0.33)
    eps = 1e-3 * np.eye(6)
    cases = [{"stress": (C @ e).tolist(), "strain": e.tolist()} for e in eps]
    return check_case(case_from_dict({
        "name": "invented averaged cell", "fibre": {"use": "glass-beads"},
        "matrix": {"use": "epoxy"},
        "composite": {"volume_fraction": 0.2, "inclusion": "sphere"},
        "rve": {"architecture": "particulate", "load_case": cases}}))


def test_effective_stiffness_is_reported_in_text_markdown_and_html():
    r = averaged_result()
    text = format_check_text(r)
    assert "Effective stiffness fitted to 6 averaged load cases" in text
    assert "symmetry error 0 %" in text and "positive definite: yes" in text
    assert "C (GPa)" in text
    md = render_markdown(r)
    assert "## Effective stiffness" in md and "| C (GPa) | 11 |" in md
    html = render_html(r)
    assert "<h2>Effective stiffness</h2>" in html and "positive definite: yes" in html


def test_curve_table_lists_proportional_limit_final_strain_and_energy(tmp_path):
    r = small_result(tmp_path)
    text = format_check_text(r)
    for head in ("proportional limit", "final strain", "energy to ultimate", "MJ/m^3"):
        assert head in text, head


def test_report_folder_that_cannot_be_created_raises(tmp_path):
    blocker = tmp_path / "file"
    blocker.write_text("x")
    with pytest.raises(InputError, match="report folder .* cannot be created"):
        write_check_report(small_result(tmp_path), blocker / "sub")


def test_demo_directory_holds_the_demo_cases_or_raises(monkeypatch, tmp_path):
    import micromech.resources
    from micromech.errors import DataFileError
    from micromech.report.check import demo_directory

    assert (demo_directory() / "crossply_bad.toml").is_file()
    monkeypatch.setattr(micromech.resources, "data_candidates", lambda name: [tmp_path / name])
    with pytest.raises(DataFileError, match="bundled demo data not found"):
        demo_directory()


# --- issue 6 of the user trial: limit-analysis marks, rows of yields not graded ---------------


def test_strength_bounds_are_marked_limit_analysis_in_every_table():
    r = check_case(DEMO / "crossply.toml")
    _, rows = verdict_rows(r)
    by_name = {row[0]: row for row in rows}
    assert by_name["yield_strength_z"][3].endswith("GPa (LA)")  # Voigt average of strengths
    assert not by_name["Ex"][3].endswith("(LA)")  # a rigorous Voigt bound: no mark
    note = "limit-analysis bound of a strength for perfectly plastic"
    assert note in format_check_text(r).replace("\n", " ")
    assert note in render_markdown(r) and note in render_html(r)


def linear_history_result(folder: Path) -> CheckResult:
    """An invented linear x history (never crosses the offset line), checked."""
    from micromech.case import case_from_dict

    strain = np.linspace(0.0, 0.01, 40)
    rows = "\n".join(f"{e:.8g},{41e9 * e / 1e6:.8g}" for e in strain)
    (folder / "h.csv").write_text("# invented example\nstrain,stress\n" + rows)
    data = {"fibre": {"use": "e-glass"}, "matrix": {"use": "epoxy"},
            "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional",
                    "load_case": [{"direction": "x", "file": "h.csv",
                                   "stress": {"column": "stress", "unit": "MPa"},
                                   "strain": {"column": "strain"}}]}}
    return check_case(case_from_dict(data, path=folder / "c.toml"))


def test_yield_that_is_not_found_keeps_its_row_and_reason(tmp_path):
    r = linear_history_result(tmp_path)
    _, rows = verdict_rows(r)
    assert [row[0] for row in rows] == ["E1", "yield_strength_x", "ultimate_strength_x"]
    assert rows[1] == ["yield_strength_x", "-", "-", "-", "-", "-", "not graded"]
    text = format_check_text(r)
    assert "yield_strength_x (not graded):" in text
    assert "no offset yield: the curve stays above the 0.002 offset line" in text
    md, html = render_markdown(r), render_html(r)
    assert "### yield_strength_x: not graded" in md and "no offset yield" in md
    assert "yield_strength_x: not graded</h3>" in html and "no offset yield" in html
