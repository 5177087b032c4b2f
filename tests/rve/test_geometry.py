"""Tests of micromech.rve.geometry: regular and random periodic fibre cells, limits, files, CLI.

Statistics and the RVE-size guidance are tested in test_cellstats.py.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import FractionError, InputError, MicromechError
from micromech.rve.geometry import (
    CAUTION,
    HEXAGONAL_LIMIT,
    SQUARE_LIMIT,
    FibreArrangement,
    arrangement_text,
    hexagonal_cell,
    packing_limit,
    plot_arrangement,
    random_cell,
    rve_size_guidance,
    square_cell,
)

D = 7e-6  # fibre diameter, m (invented example)


def brute_min_distance(centres: np.ndarray, cell: tuple[float, float]) -> float:
    """Smallest centre distance over all pairs and all 3x3 periodic images (self images too).

    Independent of the module's minimum-image code: every image is listed explicitly.
    """
    lx, ly = cell
    shifts = np.array([(i * lx, j * ly) for i in (-1, 0, 1) for j in (-1, 0, 1)])
    diff = centres[:, None, None, :] - centres[None, :, None, :] - shifts[None, None, :, :]
    r = np.hypot(diff[..., 0], diff[..., 1])  # (N, N, 9)
    n = centres.shape[0]
    r[np.arange(n), np.arange(n), 4] = np.inf  # a fibre with itself, no shift
    return float(r.min())


def raster_fraction(arr: FibreArrangement, n: int = 400) -> float:
    """Share of a grid of points in the cell covered by the fibres and their listed images."""
    lx, ly = arr.cell_size
    x = (np.arange(n) + 0.5) / n * lx
    y = (np.arange(n) + 0.5) / n * ly
    xx, yy = np.meshgrid(x, y, indexing="ij")
    pts = np.column_stack([xx.ravel(), yy.ravel()])
    centres, _, _ = arr.circles()
    covered = np.zeros(pts.shape[0], dtype=bool)
    for c in centres:  # a loop over circles in a test helper, not over design points
        covered |= np.hypot(pts[:, 0] - c[0], pts[:, 1] - c[1]) < arr.radius
    return float(covered.mean())


# --- regular arrays: exact geometry -----------------------------------------------------------


@pytest.mark.parametrize("vf", [0.05, 0.3, 0.6, 0.78])
@pytest.mark.parametrize("n", [1, 3])
def test_square_cell_reproduces_fraction_and_spacing(vf: float, n: int) -> None:
    a = square_cell(vf, D, n_per_side=n)
    s = D * math.sqrt(math.pi / (4 * vf))  # vf = (pi/4)(d/s)^2, Hull & Clyne 1996 s1.2, from memory
    assert a.volume_fraction == pytest.approx(vf, rel=1e-12)
    assert a.n_fibres == n * n and a.cell_size == pytest.approx((n * s, n * s), rel=1e-12)
    assert a.stats.distance_min == pytest.approx(s / D, rel=1e-12)
    assert a.stats.distance_std == pytest.approx(0.0, abs=1e-12)


@pytest.mark.parametrize("vf", [0.05, 0.3, 0.6, 0.9])
@pytest.mark.parametrize("n", [1, 2])
def test_hexagonal_cell_reproduces_fraction_and_spacing(vf: float, n: int) -> None:
    a = hexagonal_cell(vf, D, n_per_side=n)
    s = D * math.sqrt(math.pi / (2 * math.sqrt(3) * vf))  # vf = pi/(2 sqrt3)(d/s)^2, from memory
    assert a.volume_fraction == pytest.approx(vf, rel=1e-12)
    assert a.n_fibres == 2 * n * n
    assert a.cell_size == pytest.approx((n * s, n * s * math.sqrt(3)), rel=1e-12)
    assert a.stats.distance_min == pytest.approx(s / D, rel=1e-12)
    assert a.stats.distance_max == pytest.approx(s / D, rel=1e-12)
    assert brute_min_distance(a.centres, a.cell_size) == pytest.approx(s, rel=1e-12)


def test_hexagonal_corner_fibre_has_three_face_images_and_centre_fibre_none() -> None:
    a = hexagonal_cell(0.6, D)
    img, parent = a.images()
    lx, ly = a.cell_size
    assert parent.tolist() == [0, 0, 0]  # fibre 0 sits at the corner, fibre 1 whole in the middle
    assert sorted(map(tuple, np.round(img / [lx, ly]).astype(int).tolist())) == [
        (0, 1), (1, 0), (1, 1)]


def test_single_square_fibre_sits_whole_in_the_middle() -> None:
    a = square_cell(0.5, D)
    assert a.centres.tolist() == [[a.cell_size[0] / 2, a.cell_size[1] / 2]]
    assert a.images()[0].shape == (0, 2)


@pytest.mark.parametrize("make", [square_cell, hexagonal_cell])
def test_rasterised_fraction_of_regular_cells_matches(make) -> None:  # type: ignore[no-untyped-def]
    a = make(0.55, D, n_per_side=2)
    assert raster_fraction(a) == pytest.approx(0.55, abs=0.005)  # grid of 400 x 400 points


def test_regular_limits_are_exact_geometry() -> None:
    assert SQUARE_LIMIT == pytest.approx(0.785398163, abs=1e-9)  # pi/4
    assert HEXAGONAL_LIMIT == pytest.approx(0.906899682, abs=1e-9)  # pi/(2 sqrt 3)
    assert square_cell(SQUARE_LIMIT, D).stats.gap_min == pytest.approx(0.0, abs=1e-12)
    assert hexagonal_cell(HEXAGONAL_LIMIT, D).stats.gap_min == pytest.approx(0.0, abs=1e-12)


def test_packing_limit_scales_with_gap_and_broadcasts() -> None:
    got = packing_limit("hexagonal", D, np.array([0.0, 0.05, 0.1]) * D)
    assert got.shape == (3,)
    assert got == pytest.approx(HEXAGONAL_LIMIT / np.array([1.0, 1.05, 1.1]) ** 2, rel=1e-12)
    assert float(packing_limit("random", D, 0.05 * D)) == pytest.approx(0.78 / 1.1025, rel=1e-12)


def test_regular_cell_at_its_gap_limit_keeps_the_gap() -> None:
    g = 0.1 * D
    a = square_cell(float(packing_limit("square", D, g)), D, min_gap=g)
    assert a.stats.gap_min == pytest.approx(0.1, rel=1e-9)


# --- random arrangement -----------------------------------------------------------------------


def test_random_cell_reaches_0_60_with_5_percent_gap_and_keeps_every_gap() -> None:
    a = random_cell(0.60, D, n_fibres=40, seed=7)
    assert a.volume_fraction == pytest.approx(0.60, rel=1e-12)
    assert a.n_fibres == 40 and a.min_gap == pytest.approx(0.05 * D, rel=1e-12)
    assert brute_min_distance(a.centres, a.cell_size) >= D + 0.05 * D - 1e-12
    assert a.stats.gap_min >= 0.05 - 1e-9


def test_random_cell_reaches_0_70_with_5_percent_gap() -> None:
    a = random_cell(0.70, D, n_fibres=40, seed=3)
    assert a.volume_fraction == pytest.approx(0.70, rel=1e-12)
    assert brute_min_distance(a.centres, a.cell_size) >= 1.05 * D - 1e-12


def test_random_cell_same_seed_same_centres_other_seed_other_centres() -> None:
    a = random_cell(0.55, D, n_fibres=30, seed=11)
    b = random_cell(0.55, D, n_fibres=30, seed=11)
    c = random_cell(0.55, D, n_fibres=30, seed=12)
    assert np.array_equal(a.centres, b.centres) and a.seed == 11
    assert not np.allclose(a.centres, c.centres)


def test_random_cell_without_seed_records_one_that_reproduces_it() -> None:
    a = random_cell(0.4, D, n_fibres=20, shake_sweeps=10)
    assert isinstance(a.seed, int)
    b = random_cell(0.4, D, n_fibres=20, shake_sweeps=10, seed=a.seed)
    assert np.array_equal(a.centres, b.centres)


def test_random_centres_lie_in_the_cell_and_images_are_shifted_copies() -> None:
    a = random_cell(0.6, D, n_fibres=40, seed=5)
    lx, ly = a.cell_size
    assert np.all((a.centres >= 0) & (a.centres < [lx, ly]))
    img, parent = a.images()
    k = (img - a.centres[parent]) / [lx, ly]
    assert np.allclose(k, np.round(k), atol=1e-12) and np.all(np.abs(np.round(k)).sum(1) >= 1)
    near_face = np.any((a.centres < a.radius) | (a.centres > [lx - a.radius, ly - a.radius]), 1)
    assert set(np.flatnonzero(near_face)) == set(parent.tolist())


def test_random_cell_circles_cover_the_fraction_on_a_grid() -> None:
    a = random_cell(0.6, D, n_fibres=40, seed=9)
    assert raster_fraction(a) == pytest.approx(0.6, abs=0.01)  # images fill the cut fibres


def test_random_cell_of_given_size_rounds_the_fibre_count() -> None:
    a = random_cell(0.5, D, cell_size="60 um", seed=1)
    assert a.n_fibres == round(0.5 * 60e-6**2 / (math.pi * D**2 / 4))  # 47
    assert a.volume_fraction == pytest.approx(a.n_fibres * math.pi * D**2 / 4 / 60e-6**2)
    assert a.target_fraction == 0.5


def test_random_cell_accepts_a_rectangular_cell() -> None:
    a = random_cell(0.5, D, cell_size=(80e-6, 40e-6), seed=2)
    assert a.cell_size == (80e-6, 40e-6)
    assert brute_min_distance(a.centres, a.cell_size) >= 1.05 * D - 1e-12


def test_random_cell_default_size_meets_the_50_radii_guidance() -> None:
    a = random_cell(0.3, D, seed=4, shake_sweeps=20)
    assert a.n_fibres == math.ceil(0.3 * 2500 / math.pi)  # side 50 R, Trias 2006 (from memory)
    assert min(a.cell_size) / a.radius == pytest.approx(50.0, rel=0.01)
    assert rve_size_guidance(a).verdict == "adequate"


def test_random_cell_without_gap_or_shaking_keeps_fibres_apart() -> None:
    a = random_cell(0.7, D, n_fibres=30, min_gap=0.0, seed=8, shake_sweeps=0)
    assert brute_min_distance(a.centres, a.cell_size) >= D - 1e-12
    assert a.details["shake_sweeps"] == 0


def test_random_cell_reports_progress_of_each_stage() -> None:
    seen: list[str] = []
    random_cell(0.6, D, n_fibres=20, seed=1, shake_sweeps=5,
                progress=lambda stage, done, total: seen.append(stage))
    assert set(seen) == {"adsorption", "relaxation", "shaking"} and seen.count("shaking") == 5


@settings(max_examples=20, deadline=None)
@given(excl=st.floats(0.05, 0.70), n=st.integers(12, 30), gap=st.floats(0.0, 0.1),
       seed=st.integers(0, 2**31))
def test_random_cells_keep_gaps_and_fraction(excl: float, n: int, gap: float, seed: int) -> None:
    vf = excl / (1.0 + gap) ** 2  # exclusion-disc fraction below the small-cell limit 0.72
    a = random_cell(vf, 1.0, n_fibres=n, min_gap=gap, seed=seed, shake_sweeps=20)
    assert a.volume_fraction == pytest.approx(vf, rel=1e-12)
    assert brute_min_distance(a.centres, a.cell_size) >= 1.0 + gap - 1e-12


@pytest.mark.slow
@pytest.mark.parametrize("seed", range(3))
def test_random_cell_of_560_fibres_at_0_70_keeps_every_gap(seed: int) -> None:
    a = random_cell(0.70, D, n_fibres=560, seed=seed)
    assert a.stats.gap_min >= 0.05 - 1e-9
    assert rve_size_guidance(a).verdict == "adequate"


# --- files ------------------------------------------------------------------------------------


def test_csv_lists_fibres_then_flagged_images_in_micrometres(tmp_path: Path) -> None:
    a = random_cell(0.6, D, n_fibres=30, seed=2, shake_sweeps=10)
    out = a.to_csv(tmp_path / "centres.csv")
    text = out.read_text()
    header = [ln for ln in text.splitlines() if not ln.startswith("#")][0]
    assert header == "fibre,x_um,y_um,radius_um,image" and CAUTION in text
    rows = np.loadtxt(out, delimiter=",", skiprows=_data_start(text), ndmin=2)
    img, parent = a.images()
    assert rows.shape == (30 + parent.size, 5)
    assert np.allclose(rows[:30, 1:3], a.centres * 1e6, rtol=1e-11)
    assert np.allclose(rows[30:, 1:3], img * 1e6, rtol=1e-11)
    assert rows[:, 3] == pytest.approx(3.5) and rows[:30, 4].sum() == 0 and rows[30:, 4].all()
    assert rows[30:, 0].astype(int).tolist() == parent.tolist()


def _data_start(text: str) -> int:
    """Lines before the first data row: the comment lines and the header line."""
    lines = text.splitlines()
    return next(i for i, ln in enumerate(lines) if not ln.startswith("#")) + 1


def test_csv_in_millimetres(tmp_path: Path) -> None:
    a = square_cell(0.5, D)
    text = a.to_csv(tmp_path / "c.csv", unit="mm").read_text()
    assert "fibre,x_mm,y_mm,radius_mm,image" in text and "0,0.0043" in text


def test_writing_replaces_an_existing_file_and_leaves_no_temporary(tmp_path: Path) -> None:
    target = tmp_path / "c.csv"
    target.write_text("old content\n")
    square_cell(0.5, D).to_csv(target)
    assert "old content" not in target.read_text()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["c.csv"]


def test_written_file_gets_ordinary_permissions_not_the_temporary_ones(tmp_path: Path) -> None:
    import os

    mask = os.umask(0o022)
    try:
        new = square_cell(0.5, D).to_json(tmp_path / "new.json")
        assert new.stat().st_mode & 0o777 == 0o644
        kept = tmp_path / "kept.csv"
        kept.write_text("x\n")
        kept.chmod(0o640)
        square_cell(0.5, D).to_csv(kept)
        assert kept.stat().st_mode & 0o777 == 0o640
    finally:
        os.umask(mask)


def test_json_has_si_circles_stats_guidance_and_caution(tmp_path: Path) -> None:
    a = hexagonal_cell(0.6, D)
    data = json.loads(a.to_json(tmp_path / "c.json").read_text())
    assert data["method"] == "hexagonal" and data["n_fibres"] == 2 and data["n_images"] == 3
    assert len(data["circles"]) == 5 and data["circles"][0]["radius"] == pytest.approx(3.5e-6)
    assert data["volume_fraction"] == pytest.approx(0.6, rel=1e-12)
    assert data["rve_size"]["verdict"] == "not_applicable" and data["caution"] == CAUTION
    assert data == json.loads(json.dumps(a.as_dict()))


def test_plot_writes_a_png(tmp_path: Path) -> None:
    out = plot_arrangement(random_cell(0.5, D, n_fibres=12, seed=3, shake_sweeps=0),
                           tmp_path / "cell.png")
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_arrangement_is_frozen() -> None:
    a = square_cell(0.5, D)
    with pytest.raises(AttributeError):
        a.diameter = 1.0  # type: ignore[misc]
    with pytest.raises(ValueError, match="read-only"):
        a.centres[0, 0] = 0.0


# --- bad input --------------------------------------------------------------------------------


@pytest.mark.parametrize("make", [square_cell, hexagonal_cell, random_cell])
@pytest.mark.parametrize("vf", [0.0, -0.1, float("nan")])
def test_non_positive_fraction_is_refused(make, vf: float) -> None:  # type: ignore[no-untyped-def]
    with pytest.raises(FractionError, match="volume_fraction .* must be > 0"):
        make(vf, D)


@pytest.mark.parametrize(
    ("make", "vf", "gap", "limit"),
    [
        (square_cell, 0.79, 0.0, "square packing limit 0.7854"),
        (square_cell, 0.72, 0.05, "square packing limit 0.7124"),
        (hexagonal_cell, 0.91, 0.0, "hexagonal packing limit 0.9069"),
        (hexagonal_cell, 0.83, 0.05, "hexagonal packing limit 0.8226"),
        (random_cell, 0.71, 0.05, r"random packing limit 0.7075 = 0.78 \(practical\)"),
        (random_cell, 0.79, 0.0, "random packing limit 0.7800"),
    ],
)
def test_fraction_above_the_packing_limit_is_refused(make, vf, gap, limit) -> None:  # type: ignore[no-untyped-def]
    with pytest.raises(FractionError, match=limit):
        make(vf, D, min_gap=gap * D)


def test_small_random_cell_has_the_lower_limit() -> None:
    assert float(packing_limit("random", D, 0.05 * D, n_fibres=19)) == pytest.approx(0.72 / 1.1025)
    with pytest.raises(FractionError,
                       match=r"limit 0.6531 = 0.72 \(practical, fewer than 20 fibres\)"):
        random_cell(0.66, D, n_fibres=12)


def test_fraction_must_be_one_number() -> None:
    with pytest.raises(FractionError, match="must be a single number"):
        square_cell(np.array([0.3, 0.4]), D)  # type: ignore[arg-type]
    with pytest.raises(FractionError, match="must be a number"):
        square_cell("lots", D)  # type: ignore[arg-type]


@pytest.mark.parametrize("diameter", [0.0, -7e-6, "-7 um"])
def test_non_positive_diameter_is_refused(diameter: float) -> None:
    with pytest.raises(InputError, match="diameter = .* must be > 0"):
        hexagonal_cell(0.5, diameter)


def test_infinite_diameter_is_refused() -> None:
    with pytest.raises(MicromechError, match="diameter .*finite"):
        hexagonal_cell(0.5, float("inf"))


def test_negative_gap_is_refused() -> None:
    with pytest.raises(InputError, match="min_gap = .* must be >= 0"):
        random_cell(0.5, D, min_gap=-1e-7)


def test_counts_must_be_whole_numbers() -> None:
    with pytest.raises(InputError, match="n_per_side = 0 must be a whole number >= 1"):
        square_cell(0.5, D, n_per_side=0)
    with pytest.raises(InputError, match="n_fibres = 2.5 must be a whole number"):
        random_cell(0.5, D, n_fibres=2.5)  # type: ignore[arg-type]
    with pytest.raises(InputError, match="max_iterations = 0"):
        random_cell(0.5, D, n_fibres=20, max_iterations=0)
    with pytest.raises(InputError, match="shake_sweeps = -1"):
        random_cell(0.5, D, n_fibres=20, shake_sweeps=-1)


@pytest.mark.parametrize("seed", [-1, "seven", True])
def test_bad_seed_is_refused(seed: object) -> None:
    with pytest.raises(InputError, match="seed = .* must be a whole number >= 0"):
        random_cell(0.5, D, n_fibres=20, seed=seed)  # type: ignore[arg-type]


def test_fibre_count_and_cell_size_together_are_refused() -> None:
    with pytest.raises(InputError, match="n_fibres and cell_size: give one of them"):
        random_cell(0.5, D, n_fibres=20, cell_size=50e-6)
    with pytest.raises(InputError, match="must be one length or two"):
        random_cell(0.5, D, cell_size=(50e-6, 50e-6, 50e-6))  # type: ignore[arg-type]


def test_too_small_random_cell_is_refused() -> None:
    with pytest.raises(InputError, match=r"below 2.5 \(d \+ gap\)"):
        random_cell(0.6, D, n_fibres=3, seed=1)


def test_rounded_fibre_count_above_the_limit_is_refused() -> None:
    # 30.6 fibres' worth of cell at vf 0.70 rounds to 31 fibres: achieved 0.7092 > 0.7075
    side = math.sqrt(30.6 * math.pi / 4 / 0.70)
    with pytest.raises(FractionError, match="random packing limit 0.7075"):
        random_cell(0.70, 1.0, cell_size=side, seed=1)


def test_unreached_fraction_names_the_limit() -> None:
    with pytest.raises(FractionError, match=r"did not clear .* max_iterations = 1 .*0\.7075"):
        random_cell(0.70, D, n_fibres=40, seed=1, max_iterations=1)


def test_unknown_method_and_bad_unit_are_refused(tmp_path: Path) -> None:
    with pytest.raises(InputError, match="method: 'triangular' is not one of"):
        packing_limit("triangular", D)
    with pytest.raises(InputError, match="unit: '0 um' must be a positive length unit"):
        square_cell(0.5, D).to_csv(tmp_path / "c.csv", unit="0 um")


# --- command line -----------------------------------------------------------------------------

CASE_TOML = """\
name = "invented example: stiff fibre in a polymer matrix, random cell"
[fibre]
E = "230 GPa"
nu = 0.2
fibre_diameter = "7 um"
[matrix]
E = "3.5 GPa"
nu = 0.35
[composite]
volume_fraction = 0.55
arrangement = "hexagonal"
"""


def run_cli(*args: str):  # type: ignore[no-untyped-def]
    from click.testing import CliRunner

    from micromech.cli import cli

    return CliRunner().invoke(cli, ["rve", *args])


@pytest.fixture
def case_file(tmp_path: Path) -> Path:
    p = tmp_path / "case.toml"
    p.write_text(CASE_TOML)
    return p


def test_summary_text_lists_the_cell_and_the_files_and_ends_with_the_caution() -> None:
    a = square_cell(0.5, D, n_per_side=2)
    text = arrangement_text(a, "RVE cell", written="c.csv", plot="c.png").splitlines()
    assert text[:3] == ["RVE cell", "--------", "  packing               square"]
    assert text[3].startswith("  axes                  fibres along z; centres in the x-y plane")
    assert "  fibres                4 (+" in text[4] and "achieved 0.5000 (asked 0.5000)" in text[6]
    assert "um (x by y) =" in text[7]
    assert text[-4:] == ["  written               c.csv", "  plot                  c.png", "",
                         CAUTION]


def test_cli_random_cell_from_options_prints_table_and_writes_csv(tmp_path: Path) -> None:
    out = tmp_path / "centres.csv"
    res = run_cli("--fraction", "0.6", "--diameter", "7 um", "--fibres", "40", "--seed", "7",
                  "--out", str(out))
    assert res.exit_code == 0, res.output
    a = random_cell(0.6, D, n_fibres=40, seed=7)
    for text in ("random (seed 7)", "achieved 0.6000", f"{a.cell_size[0] * 1e6:.4g} x",
                 "fibre radii", "nearest gap [d]", "RVE size guidance", "small: L/R", CAUTION):
        assert text in res.output
    rows = np.loadtxt(out, delimiter=",", skiprows=_data_start(out.read_text()), ndmin=2)
    assert np.allclose(rows[:40, 1:3], a.centres * 1e6, rtol=1e-11)  # same seed, same centres


def test_cli_reads_fraction_diameter_and_packing_from_the_case(case_file: Path) -> None:
    res = run_cli(str(case_file), "--json")
    assert res.exit_code == 0, res.output
    data = json.loads(res.output)
    assert data["method"] == "hexagonal" and data["diameter"] == pytest.approx(7e-6)
    assert data["volume_fraction"] == pytest.approx(0.55, rel=1e-12) and data["file"] is None


def test_cli_options_override_the_case(case_file: Path) -> None:
    res = run_cli(str(case_file), "--packing", "square", "--fraction", "0.5", "--fibres", "4",
                  "--diameter", "10 um", "--json")
    data = json.loads(res.output)
    assert (data["method"], data["n_fibres"]) == ("square", 4)
    assert data["diameter"] == pytest.approx(1e-5, rel=1e-12)
    assert data["volume_fraction"] == pytest.approx(0.5, rel=1e-12)


def test_cli_gap_as_fraction_of_diameter_or_as_length() -> None:
    base = ("--fraction", "0.5", "--diameter", "7 um", "--fibres", "20", "--seed", "1", "--json")
    assert json.loads(run_cli(*base, "--gap", "0.1").output)["min_gap"] == pytest.approx(0.7e-6)
    as_length = json.loads(run_cli(*base, "--gap", "0.35 um").output)
    assert as_length["min_gap"] == pytest.approx(0.35e-6) and as_length["stats"]["gap_min"] >= 0.05


def test_cli_writes_json_for_a_json_name_and_a_plot(tmp_path: Path) -> None:
    res = run_cli("--packing", "hexagonal", "--fibres", "8", "--fraction", "0.6", "--diameter",
                  "7 um", "--out", str(tmp_path / "c.json"), "--plot", str(tmp_path / "c.png"))
    assert res.exit_code == 0, res.output
    assert json.loads((tmp_path / "c.json").read_text())["n_fibres"] == 8
    assert (tmp_path / "c.png").read_bytes()[:4] == b"\x89PNG"


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (("--diameter", "7 um"), "--fraction: no fibre volume fraction"),
        (("--fraction", "0.5"), "--diameter: no fibre diameter"),
        (("--fraction", "0.5", "--diameter", "7 um", "--packing", "square", "--fibres", "5"),
         r"--fibres = 5: a square cell holds 1\*n\*n fibres \(1, 4, 9, 16, ...\)"),
        (("--fraction", "0.5", "--diameter", "7 um", "--packing", "hexagonal", "--fibres", "4"),
         r"--fibres = 4: a hexagonal cell holds 2\*n\*n fibres \(2, 8, 18, 32"),
        (("--fraction", "0.5", "--diameter", "7 um", "--packing", "hexagonal", "--cell-size",
          "50 um"), "--cell-size applies to random packing only"),
        (("--fraction", "0.8", "--diameter", "7 um", "--packing", "square"),
         "square packing limit 0.7854"),
        (("--fraction", "0.5", "--diameter", "7 um", "--gap", "-0.1"), "min_gap = .* must be >= 0"),
        # output problems are found before the packing runs
        (("--fraction", "0.5", "--diameter", "7 um", "--out", "/nonexistent-folder/c.csv"),
         "--out = '/nonexistent-folder/c.csv': folder '/nonexistent-folder' does not exist"),
        (("--fraction", "0.5", "--diameter", "7 um", "--out", "c.csv", "--unit", "kg"),
         r"--unit expects a length"),
        (("--fraction", "0.5", "--diameter", "7 um", "--plot", "cell.doc"),
         r"--plot = 'cell.doc': the file name must end in \.png.*format 'doc' is not an image"),
    ],
)
def test_cli_bad_input_exits_2_with_the_rule(args: tuple[str, ...], message: str) -> None:
    res = run_cli(*args)
    assert res.exit_code == 2
    assert res.output.startswith("error: ")
    assert __import__("re").search(message, res.output), res.output


def test_cli_never_overwrites_the_case_file(case_file: Path) -> None:
    before = case_file.read_text()
    res = run_cli(str(case_file), "--out", str(case_file))
    assert res.exit_code == 2 and "--out = " in res.output
    assert "is the input case file" in res.output
    res = run_cli(str(case_file), "--plot", str(case_file))
    assert res.exit_code == 2 and "--plot = " in res.output
    assert case_file.read_text() == before


def test_cli_plot_and_out_must_differ(tmp_path: Path) -> None:
    target = str(tmp_path / "same.csv")
    res = run_cli("--fraction", "0.5", "--diameter", "7 um", "--packing", "square", "--out",
                  target, "--plot", target)
    assert res.exit_code == 2 and "--plot = " in res.output and "also the --out file" in res.output


def test_cells_too_large_to_build_are_refused_before_any_work() -> None:
    with pytest.raises(InputError, match=r"n_fibres = 6000: a random cell holds at most 5000 "
                                         r"fibres.*50 fibre radii .* needs 478"):
        random_cell(0.6, D, n_fibres=6000)
    with pytest.raises(InputError, match=r"cell_size = '10 mm' gives 1559069 fibres at this "
                                         r"fraction: a random cell holds at most 5000"):
        random_cell(0.6, D, cell_size="10 mm")
    with pytest.raises(InputError, match=r"n_per_side = 1001: a square cell of 1002001 fibres "
                                         r"exceeds the limit of 1000000"):
        square_cell(0.5, D, n_per_side=1001)
    with pytest.raises(InputError, match=r"n_per_side = 800: a hexagonal cell of 1280000"):
        hexagonal_cell(0.5, D, n_per_side=800)


# --- fibre axis of the files ------------------------------------------------------------------


def test_csv_states_the_default_axes_fibres_along_z() -> None:
    from micromech.rve.cellio import csv_text

    text = csv_text(square_cell(0.5, D))
    assert "# axes: fibres along z; centres in the x-y plane (a unidirectional check cell has " \
           "its fibres along x; --fibre-axis x writes the centres as y, z)" in text
    assert "# cell: x from 0 to " in text and "fibre,x_um,y_um,radius_um,image" in text


def test_csv_with_fibre_axis_x_has_y_z_columns_with_the_same_numbers(tmp_path: Path) -> None:
    a = random_cell(0.55, D, n_fibres=12, seed=4, shake_sweeps=0)
    default = a.to_csv(tmp_path / "z.csv").read_text()
    along_x = a.to_csv(tmp_path / "x.csv", fibre_axis="x").read_text()
    assert "# axes: fibres along x; centres in the y-z plane (as in a unidirectional check " \
           "cell, x = 1 the fibre axis)" in along_x
    assert "# cell: y from 0 to " in along_x and ", z from 0 to " in along_x
    assert "fibre,y_um,z_um,radius_um,image" in along_x
    # the cyclic map (u, v) -> (y, z): the data rows are the same, only the names change
    rows = lambda t: [ln for ln in t.splitlines() if not ln.startswith("#")][1:]  # noqa: E731
    assert rows(along_x) == rows(default)


def test_json_with_fibre_axis_x_names_the_centres_y_and_z(tmp_path: Path) -> None:
    a = hexagonal_cell(0.6, D)
    d = a.as_dict("x")
    assert d["fibre_axis"] == "x" and d["section_axes"] == ["y", "z"]
    assert all(set(c) == {"fibre", "y", "z", "radius", "image"} for c in d["circles"])
    default = a.as_dict()
    assert default["fibre_axis"] == "z" and default["section_axes"] == ["x", "y"]
    assert [(c["x"], c["y"]) for c in default["circles"]] == \
           [(c["y"], c["z"]) for c in d["circles"]]
    written = json.loads(a.to_json(tmp_path / "c.json", fibre_axis="x").read_text())
    assert written["section_axes"] == ["y", "z"] and "z" in written["circles"][0]


def test_summary_text_names_the_axes_of_the_cross_section() -> None:
    text = arrangement_text(square_cell(0.5, D), "RVE cell", fibre_axis="x")
    assert "  axes                  fibres along x; centres in the y-z plane" in text
    assert "um (y by z) =" in text


def test_unknown_fibre_axis_is_refused() -> None:
    with pytest.raises(InputError, match=r"fibre_axis = 'y': choose 'z' \(centres in x, y\) or "
                                         r"'x' \(centres in y, z"):
        square_cell(0.5, D).as_dict("y")


def test_plot_with_fibre_axis_x_writes_an_image(tmp_path: Path) -> None:
    out = plot_arrangement(square_cell(0.5, D), tmp_path / "cell.svg", fibre_axis="x")
    assert b"<svg" in out.read_bytes()[:400]


def test_plot_refuses_a_format_before_drawing(tmp_path: Path) -> None:
    with pytest.raises(InputError, match=r"plot file = .*cell\.gif': the file name must end in "):
        plot_arrangement(square_cell(0.5, D), tmp_path / "cell.gif")
    assert not (tmp_path / "cell.gif").exists()


def test_cli_fibre_axis_x_writes_y_z_columns_and_says_so(tmp_path: Path) -> None:
    out = tmp_path / "centres.csv"
    res = run_cli("--fraction", "0.5", "--diameter", "7 um", "--packing", "square", "--fibres",
                  "4", "--fibre-axis", "x", "--out", str(out))
    assert res.exit_code == 0, res.output
    assert "fibres along x; centres in the y-z plane" in res.output
    assert "fibre,y_um,z_um,radius_um,image" in out.read_text()
    data = json.loads(run_cli("--fraction", "0.5", "--diameter", "7 um", "--packing", "square",
                              "--fibre-axis", "x", "--json").output)
    assert data["fibre_axis"] == "x" and set(data["circles"][0]) >= {"y", "z"}


def test_cli_default_keeps_x_y_and_says_fibres_along_z() -> None:
    res = run_cli("--fraction", "0.5", "--diameter", "7 um", "--packing", "square")
    assert res.exit_code == 0, res.output
    assert "fibres along z; centres in the x-y plane" in res.output
    assert "--fibre-axis x writes the centres as y, z" in res.output
