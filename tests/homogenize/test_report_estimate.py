import json
from pathlib import Path

import numpy as np
from click.testing import CliRunner

from micromech.cli import cli
from micromech.homogenize import estimate
from micromech.materials import Isotropic
from micromech.materials.composite import Composite
from micromech.report.estimate import estimate_table, plot_estimates

GLASS = Isotropic(E="72 GPa", nu=0.22, alpha="5e-6 1/K")
EPOXY = Isotropic(E="3.5 GPa", nu=0.35, alpha="60e-6 1/K", strengths={"Xt": "70 MPa"})

CASE = """
name = "invented example: glass / epoxy for the estimate command"

[fibre]
E = "72 GPa"
nu = 0.22
alpha = "5e-6 1/K"

[matrix]
E = "3.5 GPa"
nu = 0.35
alpha = "60e-6 1/K"

[composite]
volume_fraction = 0.55
"""


def test_table_has_bound_columns_units_sources_and_the_caution():
    text = estimate_table(estimate(Composite(GLASS, EPOXY, 0.55), case="demo"))
    lines = text.splitlines()
    assert lines[0].startswith("demo: fibre fraction 0.55, continuous")
    assert "Reuss" in lines[2] and "Voigt" in lines[2] and "M-T" in lines[2]
    assert "bound" in lines[3] and "estimate" in lines[3]
    assert any(line.startswith("E1 [GPa]") for line in lines)
    assert any(line.startswith("alpha2 [1e-6/K]") for line in lines)
    assert "longitudinal compression microbuckling" in text and "MPa" in text
    assert "Hashin & Rosen (1964)" in text
    assert "not design allowables" in text


def test_table_lists_absent_models_and_ranges():
    est = estimate(Composite(GLASS, EPOXY, np.array([0.1, 0.3]), inclusion="sphere",
                             void_fraction=0.01))
    text = estimate_table(est)
    assert "not applied:" in text and "rule_of_mixtures" in text
    assert "0.1..0.3" in text and "void fraction 0.01" in text


def test_plot_writes_a_png(tmp_path):
    out = plot_estimates(estimate(Composite(GLASS, EPOXY, 0.55)), tmp_path / "e.png", points=11)
    assert out.exists() and out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def _case(tmp_path: Path, text: str = CASE) -> str:
    p = tmp_path / "case.toml"
    p.write_text(text)
    return str(p)


def test_cli_prints_the_table(tmp_path):
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path)])
    assert res.exit_code == 0, res.output
    assert "E2 [GPa]" in res.output and "not design allowables" in res.output


def test_cli_json_follows_the_contract(tmp_path):
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path), "--json"])
    assert res.exit_code == 0, res.output
    d = json.loads(res.output)
    assert d["case"].startswith("invented example")
    assert d["models"]["cylinders"]["E1"] > 1e10 and d["models"]["halpin_tsai"]["nu23"] is None


def test_cli_plot_option(tmp_path):
    png = tmp_path / "p.png"
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path), "--plot", str(png)])
    assert res.exit_code == 0, res.output
    assert png.exists() and "plot written" in res.output


def test_cli_without_a_composite_exits_2(tmp_path):
    text = 'name = "invented: no composite"\n[ply]\nE1 = "140 GPa"\nE2 = "9 GPa"\nnu12 = 0.3\n' \
        'G12 = "5 GPa"\nnu23 = 0.4\n'
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path, text)])
    assert res.exit_code == 2
    assert "estimate needs [fibre], [matrix] and [composite]" in res.output


def test_cli_missing_file_exits_2(tmp_path):
    res = CliRunner().invoke(cli, ["estimate", str(tmp_path / "nope.toml")])
    assert res.exit_code == 2
