"""The laminate report (table and JSON) and the ``micromech laminate`` command."""

from __future__ import annotations

import json
from dataclasses import replace

import numpy as np
import pytest
from click.testing import CliRunner

from micromech.cli import cli
from micromech.laminate import Laminate, analyse_laminate, failure_envelope
from micromech.report.laminate import (
    CAUTION,
    envelope_intercepts_table,
    laminate_json,
    laminate_table,
)

CASE = """
name = "invented example: carbon/epoxy quasi-isotropic panel"

[ply]
E1 = "181 GPa"
E2 = "10.3 GPa"
nu12 = 0.28
G12 = "7.17 GPa"
nu23 = 0.4
alpha1 = "0.02e-6 1/K"
alpha2 = "22.5e-6 1/K"
Xt = "1500 MPa"
Xc = "1500 MPa"
Yt = "40 MPa"
Yc = "246 MPa"
S12 = "68 MPa"

[laminate]
layup = "{layup}"
ply_thickness = "0.125 mm"
{loads}
"""


@pytest.fixture
def case_file(tmp_path):
    def write(layup="[0/+-45/90]s", loads='loads = { Nx = "100 N/mm", delta_T = "-100 K" }'):
        p = tmp_path / "case.toml"
        p.write_text(CASE.format(layup=layup, loads=loads), encoding="utf-8")
        return p
    return write


def test_json_follows_the_design_contract(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    a = analyse_laminate(lam, {"Nx": 1e5, "Mx": 1.0})
    d = laminate_json(a, case="c")
    json.dumps(d, allow_nan=False)
    for key in ("A", "B", "D", "in_plane", "stack_3d", "plies", "first_ply_failure", "caution"):
        assert key in d
    np.testing.assert_allclose(d["A"], lam.A)  # N/m
    np.testing.assert_allclose(d["D"], lam.D)  # N*m
    assert d["B"] == [[0.0] * 3] * 3  # symmetric laminate, round-off written as 0
    assert set(d["in_plane"]) >= {"Ex", "Ey", "Gxy", "nuxy"}
    assert set(d["stack_3d"]) == {"Ex", "Ey", "Ez", "Gxy", "Gxz", "Gyz", "nuxy", "nuxz", "nuyz"}
    p = d["plies"][1]
    assert p["angle"] == 90.0 and p["z_bottom"] == pytest.approx(-0.125e-3)
    assert set(p["stress_material"]) == {"s11", "s22", "s12"}
    assert set(p["criteria"]) >= {"max_stress", "tsai_hill", "tsai_wu", "hashin"}
    assert set(p["criteria"]["tsai_wu"]) >= {"index", "strength_ratio", "mode"}
    assert d["first_ply_failure"]["plies"] in ([1], [2], [1, 2])
    assert d["caution"] == CAUTION


def test_json_without_loads_has_no_stresses(graphite_epoxy_2d):
    d = laminate_json(analyse_laminate(Laminate.from_code("[0/90]", graphite_epoxy_2d, 1e-3)))
    assert d["plies"][0]["stress_material"] is None and d["plies"][0]["criteria"] is None
    # the same keys as with loads, each null (not absent)
    for key in ("point", "stress_material", "stress_laminate", "strain_material",
                "stress_material_thermal", "stress_material_points"):
        assert all(key in p and p[key] is None for p in d["plies"]), key
    assert d["stack_3d"] is None and d["first_ply_failure"] is None
    assert d["B"][0][0] != 0.0  # unsymmetric: coupling is real
    json.dumps(d, allow_nan=False)


def test_table_shows_units_marks_the_critical_ply_and_carries_the_caution(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    text = laminate_table(analyse_laminate(lam, {"Nx": 1e5}), case="c")
    for piece in ("A (N/mm)", "B (N)", "D (N*mm)", "Ex (GPa)", "(MPa)", "First-ply failure",
                  "last-ply failure", CAUTION):
        assert piece in text
    marked = [ln for ln in text.splitlines() if ln.rstrip().endswith("<<")]
    assert len(marked) == 2 and all(" 90 " in ln for ln in marked)
    assert "\x1b[" not in text  # no terminal colour codes


def test_command_prints_the_report(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file())])
    assert result.exit_code == 0, result.output
    assert "A (N/mm)" in result.output and "<<" in result.output
    assert "invented example" in result.output


def test_command_json_and_envelope_plot(case_file, tmp_path):
    png = tmp_path / "env.png"
    result = CliRunner().invoke(cli, ["laminate", str(case_file()), "--json", "--envelope",
                                      "Nx,Ny", "--plot", str(png), "--points", "37"])
    assert result.exit_code == 0, result.output
    d = json.loads(result.output)
    assert d["criterion"] == "tsai_wu" and len(d["envelopes"]) == 5
    assert d["loads"]["delta_T"] == -100.0 and d["loads"]["Nx"] == pytest.approx(1e5)
    assert png.read_bytes()[:4] == b"\x89PNG"


def test_command_text_envelope_intercepts(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file()), "--envelope", "sx,sy",
                                      "--criterion", "max_stress", "--points", "41"])
    assert result.exit_code == 0, result.output
    assert "intercepts on the axes" in result.output and "sx (MPa)" in result.output


def test_command_without_loads(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file(loads=""))])
    assert result.exit_code == 0, result.output
    assert "no loads given" in result.output


def test_malformed_layup_exits_with_status_2_and_names_the_position(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file(layup="[0/9x]s"))])
    assert result.exit_code == 2
    assert "character 'x' at position 5" in result.output


def test_unknown_envelope_axis_exits_with_status_2(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file()), "--envelope", "Nx,Q"])
    assert result.exit_code == 2 and "envelope axis 'Q'" in result.output


def test_table_of_unsymmetric_laminate_shows_moment_units_and_restrained_constants(
        graphite_epoxy):
    lam = Laminate.from_code("[0/90]", graphite_epoxy, 0.25e-3)
    text = laminate_table(analyse_laminate(lam, {"Mx": "5 N*mm/mm"}))
    assert "Loads: Mx = 5 N*mm/mm" in text  # a moment per length has units of force
    assert "in-plane (restrained)" in text
    d = laminate_json(analyse_laminate(lam, {"Mx": 5.0}))
    stack = lam.stack_constants().as_dict()
    assert d["in_plane_restrained"]["Ex"] == pytest.approx(stack["Ex"], rel=1e-9)
    assert d["in_plane"]["Ex"] < d["in_plane_restrained"]["Ex"]  # free to bend: softer


def test_command_intercepts_for_any_number_of_rays(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file()), "--envelope", "Nx,Ny",
                                      "--criterion", "max_stress", "--points", "10"])
    assert result.exit_code == 0, result.output
    row = next(ln for ln in result.output.splitlines() if ln.strip().startswith("max_stress "))
    assert len(row.split()) == 5 and " - " not in row  # four numbers, none missing


@pytest.mark.parametrize(("plot", "message"), [
    ("env.txt", "error: --plot = .*format 'txt' is not an image format"),
    ("missing/env.png", "error: --plot = .*folder .* does not exist"),
])
def test_command_refuses_a_plot_it_cannot_write(case_file, tmp_path, plot, message):
    import re

    result = CliRunner().invoke(cli, ["laminate", str(case_file()), "--plot",
                                      str(tmp_path / plot)])
    assert result.exit_code == 2 and re.search(message, result.output)
    assert "Traceback" not in result.output


def test_table_says_when_the_residual_stress_alone_fails_or_nothing_fails(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    hot = laminate_table(analyse_laminate(lam, {"Nx": 1e5, "delta_T": -1e6}))
    assert "load factor 0 -> no load: the residual (thermal) stress alone exceeds" in hot
    from micromech.report.laminate import _at_failure

    assert _at_failure(np.zeros(6), float("inf")) == "never along this load direction"


def test_intercept_table_shows_display_units_and_never(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    env = failure_envelope(lam, "Nx,Mxy", "max_stress", n_points=8)
    head, cols, row = envelope_intercepts_table([env]).splitlines()
    assert head.startswith("First-ply failure envelope in Nx (N/mm), Mxy (N*m/m)")
    assert cols.split() == ["criterion", "+Nx", "-Nx", "+Mxy", "-Mxy"]
    cells = row.split()
    assert cells[0] == "max_stress"
    assert float(cells[1]) == pytest.approx(env.intercepts["+Nx"] * 1e-3, rel=1e-3)  # N/m -> N/mm
    assert float(cells[4]) == pytest.approx(env.intercepts["-Mxy"], rel=1e-3)  # N stays N*m/m
    never = replace(env, intercepts={**env.intercepts, "+Nx": float("inf")})
    assert envelope_intercepts_table([never]).splitlines()[2].split()[1] == "never"


def test_every_ply_has_the_same_json_keys_with_and_without_loads(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    loaded = laminate_json(analyse_laminate(lam, {"Nx": 1e5}))["plies"]
    unloaded = laminate_json(analyse_laminate(lam))["plies"]
    assert [set(p) for p in loaded] == [set(p) for p in unloaded]


def test_json_numbers_plies_from_one_beside_the_zero_based_index(graphite_epoxy):
    d = laminate_json(analyse_laminate(Laminate.from_code("[0/90/45]", graphite_epoxy, 1e-3)))
    assert [(p["index"], p["ply"]) for p in d["plies"]] == [(0, 1), (1, 2), (2, 3)]


def test_json_balanced_laminate_thermal_shear_is_exactly_zero(graphite_epoxy):
    # [0/90/+-45]s is balanced: alpha_xy = 0 exactly (Jones 1999, Sec. 4.5: no extension-shear
    # coupling in a balanced laminate); round-off (about 1e-38) is written as 0, as for B.
    lam = Laminate.from_code("[0/90/+-45]s", graphite_epoxy, 0.125e-3)
    d = laminate_json(analyse_laminate(lam, {"Nx": 1e5, "delta_T": -100.0}))
    alpha = d["thermal_expansion"]
    assert alpha["alpha_xy"] == 0.0 and alpha["alpha_x"] == pytest.approx(alpha["alpha_y"])
    assert alpha["alpha_x"] > 0.0
    # a 0-degree ply carries no thermal shear stress in material axes: exactly 0 in the JSON
    zero = next(p for p in d["plies"] if p["angle"] == 0.0)
    assert zero["stress_material_thermal"]["s12"] == 0.0
    assert zero["stress_material_thermal"]["s11"] != 0.0


def test_table_numbers_plies_from_one_in_rows_and_failure_lines(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    text = laminate_table(analyse_laminate(lam, {"Nx": 1e5}))
    lines = text.splitlines()
    head = next(i for i, ln in enumerate(lines) if ln.lstrip().startswith("ply  angle"))
    numbers = [ln.split()[0] for ln in lines[head + 2:head + 6]]
    assert numbers == ["1", "2", "3", "4"]
    assert any(ln.startswith("plies numbered from 1 at the bottom") for ln in lines)
    first = next(ln for ln in lines if ln.startswith("First-ply failure"))
    assert first.endswith("plies 2, 3 (matrix_tension)")  # the 90-degree plies, 1-based
    event = next(ln for ln in lines if ln.strip().startswith("1 ") and "(" in ln)
    assert "2 (matrix_tension), 3 (matrix_tension)" in event


def test_table_ply_material_line_says_where_constants_and_strengths_come_from(graphite_epoxy):
    lam = Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)
    a = analyse_laminate(lam, {"Nx": 1e5})
    assert "Ply material: graphite/epoxy\n" in laminate_table(a)
    text = laminate_table(a, ply_origin="mori_tanaka estimate; strengths from [ply]")
    assert "Ply material: mori_tanaka estimate; strengths from [ply]\n" in text


_NO_STRENGTHS = """
name = "invented example: glass/epoxy without ply strengths"
[fibre]
use = "e-glass"
[matrix]
use = "epoxy"
[composite]
volume_fraction = 0.5
{ply}
[laminate]
layup = "[0/90]s"
ply_thickness = "0.25 mm"
loads = {{ Nx = "100 N/mm" }}
"""


def test_command_without_strengths_says_where_to_give_them(tmp_path):
    p = tmp_path / "bare.toml"
    p.write_text(_NO_STRENGTHS.format(ply=""), encoding="utf-8")
    result = CliRunner().invoke(cli, ["laminate", str(p)])
    assert result.exit_code == 0, result.output
    assert ("Ply material: mori_tanaka estimate from [fibre], [matrix] and [composite]; no ply "
            "strengths (failure analysis needs Xt, Xc, Yt, Yc, S12 in [ply])") in result.output
    assert ("note: failure analysis needs ply strengths Xt, Xc, Yt, Yc, S12: give them as flat "
            "keys Xt, Xc, Yt, Yc, S12 in the case's [ply] table") in result.output
    assert "strength estimates of `micromech estimate` are not used" in result.output


def test_command_names_the_ply_table_as_the_source_of_the_strengths(tmp_path):
    p = tmp_path / "given.toml"
    ply = '[ply]\nmodel = "halpin_tsai"\nXt = "1 GPa"\nXc = "600 MPa"\nYt = "40 MPa"\n' \
          'Yc = "120 MPa"\nS12 = "60 MPa"'
    p.write_text(_NO_STRENGTHS.format(ply=ply), encoding="utf-8")
    result = CliRunner().invoke(cli, ["laminate", str(p)])
    assert result.exit_code == 0, result.output
    assert ("Ply material: halpin_tsai estimate from [fibre], [matrix] and [composite]; "
            "strengths Xt, Xc, Yt, Yc, S12 from [ply] of the case") in result.output


def test_command_with_ply_constants_names_the_ply_table(case_file):
    result = CliRunner().invoke(cli, ["laminate", str(case_file())])
    assert ("Ply material: constants from [ply] of the case; strengths Xt, Xc, Yt, Yc, S12 "
            "from [ply] of the case") in result.output
