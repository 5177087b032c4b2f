"""`micromech check`: exit status, JSON contract, report folder rules."""

import json
from pathlib import Path

from click.testing import CliRunner

from micromech.cli import cli

DEMO = Path(__file__).resolve().parents[2] / "data" / "demo"


def run(*args):
    return CliRunner().invoke(cli, ["check", *map(str, args)])


def test_good_demo_exits_0_with_table_and_caution():
    r = run(DEMO / "crossply.toml")
    assert r.exit_code == 0, r.output
    assert "worst verdict: consistent" in r.output
    assert "licensed engineer" in r.output


def test_bad_demo_exits_1_to_gate_a_pipeline():
    r = run(DEMO / "crossply_bad.toml")
    assert r.exit_code == 1
    assert "violates_bounds" in r.output and "A unit slip" in r.output


def test_json_follows_the_contract_and_keeps_exit_status():
    r = run(DEMO / "crossply_bad.toml", "--json")
    assert r.exit_code == 1
    d = json.loads(r.output)
    assert d["worst_verdict"] == "violates_bounds"
    assert set(d["curves"]) == {"x", "y", "z"}
    ex = d["properties"]["Ex"]
    assert ex["verdict"] == "violates_bounds" and ex["upper_bound"] < ex["value"]
    assert isinstance(ex["reasons"], list) and ex["estimates"]["stack_mori_tanaka"] > 0


def test_tolerance_and_offset_options():
    r = run(DEMO / "crossply.toml", "--json", "--tolerance", "Ez=1%", "--offset", "0.003")
    d = json.loads(r.output)
    assert d["properties"]["Ez"]["verdict"] == "suspect"
    assert d["curves"]["x"]["yield_offset"] == 0.003


def test_bad_tolerance_exits_2_with_message():
    r = run(DEMO / "crossply.toml", "--tolerance", "E2")
    assert r.exit_code == 2
    assert "error: tolerance 'E2' must read NAME=VALUE" in r.output


def test_missing_case_exits_2():
    r = run(DEMO / "no_such_case.toml")
    assert r.exit_code == 2 and "case file not found" in r.output


def test_report_into_the_input_folder_is_refused_and_writes_nothing():
    before = sorted(p.name for p in DEMO.iterdir())
    r = run(DEMO / "crossply.toml", "--report", DEMO)
    assert r.exit_code == 2
    assert "holds the case's input files" in r.output
    assert sorted(p.name for p in DEMO.iterdir()) == before


def test_report_folder_written(tmp_path):
    # a unidirectional case given by its stiffness: no curves, one figure
    case = tmp_path / "in" / "ud.toml"
    case.parent.mkdir()
    diag = ["40", "10", "10", "4", "4", "4"]
    rows = "\n".join("  [" + ", ".join(diag[i] if i == j else "0" for j in range(6)) + "],"
                     for i in range(6))
    case.write_text(
        'name = "invented example: unidirectional stiffness"\n'
        '[fibre]\nuse = "e-glass"\n[matrix]\nuse = "epoxy"\n'
        "[composite]\nvolume_fraction = 0.55\n"
        '[rve]\narchitecture = "unidirectional"\n'
        f'[rve.stiffness]\nunit = "GPa"\nmatrix = [\n{rows}\n]\n'
    )
    out = tmp_path / "report"
    r = run(case, "--report", out)
    assert r.exit_code in (0, 1), r.output
    assert (out / "report.md").is_file() and (out / "report.html").is_file()
    assert "report written to" in r.output


def test_strain_range_option_fixes_the_fit_window():
    r = run(DEMO / "crossply.toml", "--json", "--strain-range", "0.0005,0.003")
    assert r.exit_code == 0, r.output
    fit = json.loads(r.output)["curves"]["x"]
    assert fit["fit_automatic"] is False
    assert 0.0005 <= fit["modulus_fit_range"][0] < fit["modulus_fit_range"][1] <= 0.003


def test_bad_strain_range_option_exits_2():
    r = run(DEMO / "crossply.toml", "--strain-range", "0.003")
    assert r.exit_code == 2 and "error: --strain-range: '0.003' must be two strains" in r.output
    r = run(DEMO / "crossply.toml", "--strain-range", "0.003,0.001")
    assert r.exit_code == 2 and "must satisfy 0 <= low < high" in r.output


def test_json_carries_the_effective_stiffness_of_a_matrix_case(tmp_path):
    case = tmp_path / "ud.toml"
    rows = "\n".join("  [" + ", ".join(("9" if i == j else "1") if i < 3 and j < 3 else
                                       ("3" if i == j else "0") for j in range(6)) + "],"
                     for i in range(6))
    case.write_text(
        'name = "invented example: stiffness only"\n'
        '[fibre]\nuse = "glass-beads"\n[matrix]\nuse = "epoxy"\n'
        '[composite]\nvolume_fraction = 0.3\ninclusion = "sphere"\n'
        '[rve]\narchitecture = "particulate"\n'
        f'[rve.stiffness]\nunit = "GPa"\nmatrix = [\n{rows}\n]\n'
    )
    r = run(case, "--json")
    assert r.exit_code in (0, 1), r.output
    d = json.loads(r.output)
    assert d["stiffness"]["source"] == "matrix" and d["stiffness"]["positive_definite"] is True
    assert d["stiffness"]["stiffness"][0][0] == 9e9 and d["stiffness"]["symmetry_error"] == 0.0
    assert {"E1", "G12", "nu12"} <= set(d["properties"])


def test_strain_range_option_parser_raises_on_bad_text():
    import pytest

    from micromech.cli import _check_range_option
    from micromech.errors import InputError

    assert _check_range_option(" 0.001 , 0.004 ") == (0.001, 0.004)
    assert _check_range_option(None) is None
    with pytest.raises(InputError, match=r"--strain-range: '1,2,3' must be two strains"):
        _check_range_option("1,2,3")
