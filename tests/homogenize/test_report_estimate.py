import json
import re
from pathlib import Path

import numpy as np
import pytest
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


def _row(text: str, label: str) -> list[str]:
    return next(line for line in text.splitlines() if line.startswith(label)).split()[2:]


def test_table_shows_values_of_bound_models_that_are_not_bounds_in_parentheses():
    text = estimate_table(estimate(Composite(GLASS, EPOXY, 0.55)))
    # columns: Reuss, HS low, RoM, H-T, Chamis, CCA, M-T, HS up, Voigt
    nu12, e2 = _row(text, "nu12 [-]"), _row(text, "E2 [GPa]")
    assert nu12[0].startswith("(") and nu12[-1].startswith("(")  # Voigt/Reuss: no bound on nu
    assert not nu12[1].startswith("(") and not nu12[7].startswith("(")  # HS: Hill (1964)
    assert not any(v.startswith("(") for v in e2)  # every modulus is bounded (Hill 1952)
    assert "( ) not a bound: the value of a bound model for a constant it does not bound" in text


def test_table_notes_estimates_outside_the_bounds():
    text = estimate_table(estimate(Composite(GLASS, EPOXY, 0.55)))
    section = text.split("outside the bounds of this table:")[1].split("strength")[0]
    rom = re.search(r"^  RoM .*?(?=^  \S)", section, re.M | re.S).group(0)
    assert "nu12 0.2785 > " in rom and "(HS up)" in rom  # 0.55 * 0.22 + 0.45 * 0.35
    assert "E2 " in rom and "GPa (HS low)" in rom
    assert "M-T" not in section and "CCA" not in section
    assert "known approximations, not bounds" in section


def test_table_without_excursions_has_no_outside_section():
    text = estimate_table(estimate(Composite(GLASS, EPOXY, 0.3, void_fraction=0.02)))
    assert "outside the bounds" not in text and "(0." in text  # Voigt nu12 still marked


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


BAD_CASES = [
    ('name = "x\n', r"case\.toml: malformed TOML: .*line 1"),
    (CASE.replace("volume_fraction", "volume_fracton"),
     r"\[composite\] unknown key 'volume_fracton'; did you mean 'volume_fraction'\?"),
    (CASE.replace('E = "72 GPa"', 'E = "72 mm"'),
     r"\[fibre\]: .*E expects a pressure .*got '72 mm', which is a length"),
    (CASE.replace("volume_fraction = 0.55", 'volume_fraction = 0.8\narrangement = "square"'),
     r"\[composite\] volume_fraction = 0\.8 exceeds the packing limit 0\.7854 of square"),
    (CASE.replace('[fibre]\nE = "72 GPa"\nnu = 0.22', '[fibre]\nuse = "e-glas"'),
     r"\[fibre\]: unknown material 'e-glas'; did you mean 'e-glass'"),
    (CASE.replace("volume_fraction = 0.55", 'inclusion = "sphere"'),
     r"\[composite\] missing required key 'volume_fraction'"),
    (CASE.split("[fibre]")[0] + CASE.split("alpha = \"5e-6 1/K\"\n")[1],
     r"estimate needs \[fibre\], \[matrix\] and \[composite\] .*; missing: \[fibre\]$"),
]


@pytest.mark.parametrize(("text", "match"), BAD_CASES)
def test_cli_bad_case_exits_2_with_one_error_line(tmp_path, text, match):
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path, text), "--json"])
    assert res.exit_code == 2, res.output
    lines = res.output.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("error: "), res.output
    assert re.search(match, lines[0]), lines[0]
    assert "Traceback" not in res.output


@pytest.mark.parametrize(
    ("args", "match"),
    [(["--plot", "p.txt"], r"error: --plot = '.*p\.txt': the file name must end in \.png"),
     (["--plot", "no/such/dir/p.png"], r"error: --plot = .*: folder .* does not exist"),
     (["--misalignment", "0"], r"error: --misalignment = 0\.0: the fibre misalignment must be "
                               r"positive")],
)
def test_cli_bad_options_exit_2(tmp_path, args, match):
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path), *[
        str(tmp_path / a) if a.endswith((".txt", ".png")) else a for a in args]])
    assert res.exit_code == 2 and re.search(match, res.output), res.output


def test_plot_rejects_an_unknown_format_before_drawing(tmp_path):
    from micromech.errors import InputError

    with pytest.raises(InputError, match=r"path = '.*e\.txt': the file name must end in \.png, "
                                         r"\.svg, \.pdf, .*\(format 'txt' is not an image "
                                         r"format that can be written\)"):
        plot_estimates(estimate(Composite(GLASS, EPOXY, 0.55)), tmp_path / "e.txt")


def test_cli_json_models_are_the_contract_keys_in_si(tmp_path):
    # DESIGN.md "JSON output": model keys, the nine constants, alpha1, alpha2, source; SI; null
    from micromech.homogenize import MODEL_KEYS
    from micromech.results import CONSTANT_NAMES

    d = json.loads(CliRunner().invoke(cli, ["estimate", _case(tmp_path), "--json"]).output)
    assert list(d["models"]) == list(MODEL_KEYS)
    for key, m in d["models"].items():
        assert list(m) == [*CONSTANT_NAMES, "alpha1", "alpha2", "source"], key
    # uniform strain: G12 is the volume average of the phase shear moduli (Voigt 1889), in Pa
    assert d["models"]["voigt"]["G12"] == pytest.approx(0.55 * 72e9 / 2.44 + 0.45 * 3.5e9 / 2.7,
                                                        rel=1e-12)
    assert d["models"]["voigt"]["alpha1"] is None  # Voigt gives no CTE: null


# --- fibre orientation --------------------------------------------------------------------------

RANDOM_MAT = Path(__file__).parents[1] / "data" / "random_mat" / "case.toml"


def test_table_header_and_rows_follow_the_orientation():
    mat = Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=50.0,
                    orientation="random_in_plane")
    lines = estimate_table(estimate(mat, case="mat")).splitlines()
    assert lines[0] == ("mat: fibre fraction 0.3, spheroid (aspect ratio 50), fibres random in "
                        "the 1-2 plane (axis 3 normal)")
    rows = [line.split(" [")[0] for line in lines if " [" in line and line[0] in "EGna"]
    assert rows == ["E1 = E2", "E3", "G12", "G13 = G23", "nu12", "nu13", "alpha1", "alpha3"]
    iso = estimate(Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=50.0,
                             orientation="random_3d"), case="iso")
    text = estimate_table(iso)
    assert text.splitlines()[0].endswith("fibres random in space (isotropic)")
    assert "E [GPa]" in text and "HS low" in text and "alpha [1e-6/K]" in text
    aligned = estimate_table(estimate(Composite(GLASS, EPOXY, 0.3), case="ud")).splitlines()[0]
    assert aligned == "ud: fibre fraction 0.3, continuous, aligned fibres (axis 1)"


def test_table_separates_absent_models_from_other_notes():
    est = estimate(Composite(GLASS, EPOXY, 0.2, inclusion="spheroid", aspect_ratio=200.0,
                             orientation="random_3d"))
    text = estimate_table(est)
    absent, other = text.split("not applied:")[1].split("notes:")
    assert "halpin_tsai: assumes aligned fibres" in absent and "packing" not in absent
    assert "packing: rods of aspect ratio 200" in other


def test_plot_of_a_random_mat_draws_the_normal_modulus(tmp_path):
    mat = Composite(GLASS, EPOXY, 0.3, orientation="random_in_plane")
    out = plot_estimates(estimate(mat), tmp_path / "mat.png", points=11)
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_plot_of_a_random_mat_labels_the_normal_constants_with_units(tmp_path, monkeypatch):
    import matplotlib.figure

    labels: list[str] = []
    save = matplotlib.figure.Figure.savefig

    def spy(fig, *args, **kwargs):
        labels.extend(ax.get_ylabel() for ax in fig.axes)
        return save(fig, *args, **kwargs)

    monkeypatch.setattr(matplotlib.figure.Figure, "savefig", spy)
    mat = Composite(GLASS, EPOXY, 0.3, orientation="random_in_plane")
    plot_estimates(estimate(mat), tmp_path / "mat.png", points=5)
    assert {"E3 [GPa]", "G13 [GPa]", "alpha1 [1e-6/K]"} <= set(labels)


def test_cli_estimates_the_random_mat_example():
    res = CliRunner().invoke(cli, ["estimate", str(RANDOM_MAT), "--json"])
    assert res.exit_code == 0, res.output
    d = json.loads(res.output)
    assert set(d["models"]) == {"voigt", "reuss", "mori_tanaka"}
    mt = d["models"]["mori_tanaka"]
    assert mt["E1"] == pytest.approx(mt["E2"], rel=1e-12) and mt["E3"] < mt["E1"]
    text = CliRunner().invoke(cli, ["estimate", str(RANDOM_MAT)]).output
    assert "fibres random in the 1-2 plane (axis 3 normal)" in text and "E3 [GPa]" in text


def test_cli_rejects_a_random_orientation_of_spheres_with_one_error_line(tmp_path):
    text = CASE.replace("volume_fraction = 0.55",
                        'volume_fraction = 0.3\ninclusion = "sphere"\norientation = "random_3d"')
    res = CliRunner().invoke(cli, ["estimate", _case(tmp_path, text)])
    assert res.exit_code == 2
    assert re.fullmatch(r"error: .*case\.toml: \[composite\] orientation = 'random_3d' is not "
                        r"allowed with inclusion = 'sphere' .*\n", res.output), res.output
