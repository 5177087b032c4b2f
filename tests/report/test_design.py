"""Tables and plots of sizing, sweeps and Monte Carlo scatter."""

import pytest

from micromech.design import monte_carlo, size_fraction, sweep_angle, sweep_fraction
from micromech.materials import Composite, Isotropic
from micromech.report.design import (
    CAUTION,
    monte_carlo_table,
    plot_histograms,
    plot_sizing,
    plot_sweep,
    sizing_table,
)


@pytest.fixture
def composite():
    # invented constants of glass/epoxy magnitude
    return Composite(Isotropic(E="72 GPa", nu=0.22, density="2.54 g/cm^3"),
                     Isotropic(E="3.5 GPa", nu=0.35, density="1.2 g/cm^3"), 0.55)


def test_sizing_table_lists_models_bounds_window_and_caution(composite):
    r = size_fraction(composite, ["E2=9GPa", "E2=100GPa"])
    text = sizing_table(r, title="invented panel")
    assert text.startswith("invented panel")
    assert "Halpin-Tsai" in text and "bounds admit" in text
    assert "target E2 = 100 GPa: not reachable" in text
    assert "every model" in text and CAUTION in text


def test_monte_carlo_table_shows_display_units_and_percentiles(composite):
    r = monte_carlo(composite, 300, seed=1, properties=["E2", "nu12", "density"])
    text = monte_carlo_table(r)
    assert "E2               GPa" in text or "E2  " in text
    assert "g/cm^3" in text and "P5" in text and "P95" in text
    assert "300 samples of mori_tanaka (seed 1)" in text and CAUTION in text


def test_plots_are_written_as_png(composite, tmp_path):
    r = size_fraction(composite, ["E2=9GPa", "E1>=30GPa", "density<=2 g/cm^3"])
    paths = [
        plot_sizing(composite, r, tmp_path / "size.png", points=21),
        plot_sweep(sweep_fraction(composite, "E2", points=11), tmp_path / "vf.png"),
        plot_sweep(sweep_angle(composite, "Ex", [0.0, 45.0, 90.0]), tmp_path / "angle.png"),
        plot_histograms(monte_carlo(composite, 200, seed=1, properties=["E1", "E2"]),
                        tmp_path / "hist.png"),
    ]
    for p in paths:
        assert p.read_bytes()[:4] == b"\x89PNG"


def test_sweep_of_several_constituents_tells_them_apart(composite, tmp_path):
    import numpy as np

    from micromech.homogenize import FibrePhase

    s = sweep_fraction(composite, "E2", points=11, models=["mori_tanaka"],
                       fibre=FibrePhase.isotropic(np.array([72e9, 86e9, 100e9]), 0.22))
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    from micromech.report.design import _draw_sweep

    fig, ax = plt.subplots()
    _draw_sweep(ax, s)
    labels = [t.get_text() for t in ax.get_legend().get_texts()]
    plt.close(fig)
    assert labels[-3:] == ["constituents 1", "constituents 2", "constituents 3"]
    assert plot_sweep(s, tmp_path / "three.png").read_bytes()[:4] == b"\x89PNG"
