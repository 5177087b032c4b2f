"""The one rule for image files written by every command (micromech.report.files)."""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from click.testing import CliRunner

from micromech.cli import cli
from micromech.errors import InputError
from micromech.report.files import IMAGE_FORMATS, check_image_path

DEMO = Path(__file__).resolve().parents[2] / "data" / "demo" / "panel.toml"


def test_every_listed_format_is_one_matplotlib_writes() -> None:
    from matplotlib.backend_bases import FigureCanvasBase

    assert set(IMAGE_FORMATS) <= set(FigureCanvasBase.get_supported_filetypes())
    assert set(IMAGE_FORMATS) == {"png", "svg", "pdf", "eps", "ps", "jpg", "jpeg", "tif", "tiff",
                                  "webp"}


@pytest.mark.parametrize("suffix", [*IMAGE_FORMATS, "PNG", "Jpg"])
def test_listed_suffixes_pass_in_any_case(tmp_path: Path, suffix: str) -> None:
    assert check_image_path(tmp_path / f"plot.{suffix}", "--plot") == tmp_path / f"plot.{suffix}"


@pytest.mark.parametrize(("name", "message"), [
    ("plot.gif", r"--plot = '.*plot\.gif': the file name must end in \.png, \.svg, \.pdf, \.eps, "
                 r"\.ps, \.jpg, \.jpeg, \.tif, \.tiff, \.webp \(format 'gif' is not an image "
                 r"format that can be written\)"),
    ("plot", r"--plot = '.*plot': the file name must end in \.png.* \(no suffix names the "
             r"format\)"),
    ("missing/plot.png", r"--plot = '.*plot\.png': folder '.*missing' does not exist"),
])
def test_unknown_or_missing_suffix_and_missing_folder_are_refused(
    tmp_path: Path, name: str, message: str
) -> None:
    with pytest.raises(InputError, match=message):
        check_image_path(tmp_path / name, "--plot")


def test_the_library_plot_functions_share_the_rule(tmp_path: Path) -> None:
    # gif is a matplotlib format but not one of ours: every writer refuses it the same way
    from micromech.report.estimate import check_plot_path

    target = tmp_path / "p.gif"
    with pytest.raises(InputError) as ref:
        check_image_path(target, "plot file")
    with pytest.raises(InputError) as est:
        check_plot_path(target, "plot file")
    assert str(est.value) == str(ref.value)
    assert check_plot_path(tmp_path / "p.jpg") == tmp_path / "p.jpg"  # the one rule admits jpg


def test_design_laminate_and_cell_plots_refuse_before_drawing(tmp_path: Path) -> None:
    from micromech.design import sweep_fraction
    from micromech.laminate import Laminate, PlyMaterial, failure_envelope, plot_envelopes
    from micromech.materials import Composite, Isotropic
    from micromech.report.design import plot_sweep
    from micromech.rve.geometry import plot_arrangement, square_cell

    # invented constants of glass/epoxy magnitude
    comp = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.5)
    ply = PlyMaterial(E1=40e9, E2=10e9, nu12=0.3, G12=4e9,
                      strengths={"Xt": 1e9, "Xc": 6e8, "Yt": 4e7, "Yc": 1.2e8, "S12": 6e7})
    env = failure_envelope(Laminate.from_code("[0/90]s", ply, 1e-3), "Nx,Ny", n_points=8)
    target = tmp_path / "p.gif"
    calls = [lambda: plot_sweep(sweep_fraction(comp, "E2", points=5), target),
             lambda: plot_envelopes([env], target),
             lambda: plot_arrangement(square_cell(0.5, 7e-6), target)]
    for call in calls:
        with pytest.raises(InputError, match=r"plot file = .*p\.gif': the file name must end"):
            call()
    assert not target.exists()


@pytest.mark.parametrize("args", [
    ["estimate", str(DEMO)],
    ["laminate", str(DEMO)],
    ["size", str(DEMO), "-t", "E2=9GPa"],
    ["rve", "--fraction", "0.5", "--diameter", "7 um", "--packing", "square"],
])
def test_every_command_refuses_the_same_plot_name_with_the_same_words(
    tmp_path: Path, args: list[str]
) -> None:
    target = tmp_path / "figure.gif"
    res = CliRunner().invoke(cli, [*args, "--plot", str(target)])
    assert res.exit_code == 2, res.output
    expected = re.escape(f"error: --plot = {str(target)!r}: the file name must end in .png, "
                         ".svg, .pdf, .eps, .ps, .jpg, .jpeg, .tif, .tiff, .webp (format 'gif'")
    assert re.match(expected, res.output), res.output
