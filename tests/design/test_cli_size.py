"""The ``micromech size`` command."""

import json

from click.testing import CliRunner

import micromech.cli as cli_module
from micromech.cli import cli


def run(*args):
    return CliRunner().invoke(cli, list(args))


def test_size_prints_a_table_per_target_and_the_window(case_file):
    r = run("size", str(case_file), "--target", "E2=9GPa", "-t", "density<=1.9 g/cm^3")
    assert r.exit_code == 0, r.output
    assert "target E2 = 9 GPa: reached" in r.stdout
    assert "Mori-Tanaka" in r.stdout and "bounds admit" in r.stdout
    assert "window meeting all targets" in r.stdout
    assert "not design allowables" in r.stdout


def test_size_json_is_si_and_has_the_contract_keys(case_file):
    r = run("size", str(case_file), "-t", "Ex>=20GPa", "-m", "mori_tanaka", "--json")
    assert r.exit_code == 0, r.output
    d = json.loads(r.stdout)
    assert set(d) == {"case", "sizing", "uncertainty", "caution"}
    t = d["sizing"]["targets"][0]
    assert t["target"] == {"name": "Ex", "relation": ">=", "value": 20e9}
    assert list(t["models"]) == ["mori_tanaka"] and d["uncertainty"] is None


def test_unreachable_target_is_an_answer_with_exit_status_zero(case_file):
    r = run("size", str(case_file), "-t", "E2=200GPa", "--no-bounds")
    assert r.exit_code == 0
    assert "not reachable below the packing limit" in r.stdout


def test_uncertainty_prints_percentiles_and_plots(case_file, tmp_path):
    png = tmp_path / "size.png"
    r = run("size", str(case_file), "-t", "E2=9GPa", "--uncertainty", "400", "--seed", "3",
            "--percentiles", "10,90", "--plot", str(png))
    assert r.exit_code == 0, r.output
    assert "Monte Carlo: 400 samples of mori_tanaka (seed 3)" in r.stdout
    assert "P10" in r.stdout and "P90" in r.stdout
    assert png.read_bytes()[:4] == b"\x89PNG"
    assert (tmp_path / "size-scatter.png").read_bytes()[:4] == b"\x89PNG"


def test_uncertainty_alone_in_json_with_a_progress_bar(case_file, monkeypatch):
    monkeypatch.setattr(cli_module, "_SIZE_PROGRESS_ABOVE", 100)
    r = run("size", str(case_file), "--uncertainty", "300", "--cov", "0.1", "--json")
    assert r.exit_code == 0, r.output
    d = json.loads(r.stdout)
    assert d["sizing"] is None and d["uncertainty"]["n"] == 300
    assert d["uncertainty"]["inputs"]["matrix_E"]["cov"] == 0.1
    assert "Monte Carlo" in r.stderr


def test_no_target_and_no_uncertainty_is_an_error(case_file):
    r = run("size", str(case_file))
    assert r.exit_code == 2
    assert "error: size: give at least one --target" in r.stderr


def test_bad_percentiles_are_an_error(case_file):
    r = run("size", str(case_file), "--uncertainty", "10", "--percentiles", "5,x")
    assert r.exit_code == 2
    assert "--percentiles: '5,x' is not a comma-separated list" in r.stderr
    r = run("size", str(case_file), "--uncertainty", "10", "--percentiles", ",")
    assert r.exit_code == 2 and "give at least one percentile" in r.stderr


def test_bad_target_is_an_error(case_file):
    r = run("size", str(case_file), "-t", "E2~9GPa")
    assert r.exit_code == 2
    assert "expected NAME=VALUE, NAME>=VALUE or NAME<=VALUE" in r.stderr


def test_plot_that_cannot_be_written_is_refused_before_sizing(case_file, tmp_path):
    r = run("size", str(case_file), "--target", "E2=9GPa", "--plot",
            str(tmp_path / "missing" / "s.png"))
    assert r.exit_code == 2 and "error: --plot = " in r.output and "does not exist" in r.output
    r = run("size", str(case_file), "--target", "E2=9GPa", "--plot", str(tmp_path / "s.xyz"))
    assert r.exit_code == 2 and "format 'xyz' is not an image format" in r.output


def test_too_many_samples_are_refused_by_the_option(case_file):
    from micromech.design.uncertainty import MAX_SAMPLES

    assert cli_module._SIZE_MAX_SAMPLES == MAX_SAMPLES
    r = run("size", str(case_file), "--uncertainty", str(MAX_SAMPLES + 1))
    assert r.exit_code == 2 and "--uncertainty" in r.output and "Traceback" not in r.output


def _keys(obj):
    if isinstance(obj, dict):
        for k, v in obj.items():
            yield k
            yield from _keys(v)
    elif isinstance(obj, list):
        for v in obj:
            yield from _keys(v)


def test_json_keys_have_no_dots_uncertain_inputs_use_underscores(case_file):
    r = run("size", str(case_file), "-t", "E2=9GPa", "--uncertainty", "50", "--json")
    assert r.exit_code == 0, r.output
    d = json.loads(r.stdout)
    assert not [k for k in _keys(d) if "." in k]
    assert set(d["uncertainty"]["inputs"]) == {
        "fibre_E", "fibre_nu", "fibre_alpha", "matrix_E", "matrix_nu", "matrix_alpha",
        "fibre_density", "matrix_density", "volume_fraction"}


def test_point_window_prints_a_single_weight_fraction(case_file):
    r = run("size", str(case_file), "-t", "E2=9GPa", "-m", "mori_tanaka", "--no-bounds")
    assert r.exit_code == 0, r.output
    line = next(ln for ln in r.stdout.splitlines() if "met under every model" in ln)
    assert "(weight fraction " in line and " to " not in line
