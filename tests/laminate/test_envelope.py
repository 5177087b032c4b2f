"""First-ply failure envelopes as arrays and as a plot."""

from __future__ import annotations

import numpy as np
import pytest

from micromech.errors import InputError
from micromech.laminate import Laminate, failure_envelope, first_ply_failure, plot_envelopes


@pytest.fixture
def cross_ply(graphite_epoxy):
    return Laminate.from_code("[0/90]s", graphite_epoxy, 0.125e-3)


def test_envelope_meets_the_axes_at_the_first_ply_failure_loads(cross_ply):
    env = failure_envelope(cross_ply, "Nx,Ny", "tsai_wu", n_points=9)
    fpf_x = first_ply_failure(cross_ply, {"Nx": 1.0}).load_factor
    fpf_my = first_ply_failure(cross_ply, {"Ny": -1.0}).load_factor
    assert env.x[0] == pytest.approx(fpf_x, rel=1e-12) and abs(env.y[0]) < 1e-9 * fpf_x
    assert env.y[6] == pytest.approx(-fpf_my, rel=1e-12)  # phi = 3 pi / 2
    assert env.x[2] == pytest.approx(0.0, abs=1e-6 * fpf_x)  # phi = pi / 2
    assert env.units == ("N/m", "N/m") and env.mode[0] == "matrix_tension"
    assert env.ply[0] in (1, 2)


def test_average_stress_axes_are_resultants_over_thickness(cross_ply):
    n = failure_envelope(cross_ply, ("Nx", "Nxy"), "max_stress", n_points=16)
    s = failure_envelope(cross_ply, ("sx", "sxy"), "max_stress", n_points=16)
    np.testing.assert_allclose(s.x * cross_ply.thickness, n.x, rtol=1e-12, atol=1e-6)
    np.testing.assert_allclose(s.y * cross_ply.thickness, n.y, rtol=1e-12, atol=1e-6)


def test_moment_axes_and_residual_stress(cross_ply):
    env = failure_envelope(cross_ply, "Mx,My", "hashin", n_points=12)
    assert np.all(np.isfinite(env.ratio)) and env.units == ("N", "N")
    cold = failure_envelope(cross_ply, "Nx,Ny", "max_stress", n_points=12, delta_T=-150.0)
    warm = failure_envelope(cross_ply, "Nx,Ny", "max_stress", n_points=12)
    assert cold.x[0] < warm.x[0]  # residual transverse tension lowers the Nx intercept
    d = cold.as_dict()
    assert d["axes"] == ["Nx", "Ny"] and d["delta_T"] == -150.0 and len(d["x"]) == 12


def test_plot_writes_a_png_with_all_envelopes(cross_ply, tmp_path):
    envs = [failure_envelope(cross_ply, "Nx,Ny", c, n_points=73)
            for c in ("max_stress", "tsai_wu", "hashin")]
    out = plot_envelopes(envs, tmp_path / "env.png", title="invented test case")
    data = out.read_bytes()
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and len(data) > 5000


def test_envelope_errors(cross_ply, tmp_path):
    with pytest.raises(InputError, match="envelope axis 'Nz': unknown"):
        failure_envelope(cross_ply, "Nx,Nz")
    with pytest.raises(InputError, match="the two axes must differ, got 'Nx' twice"):
        failure_envelope(cross_ply, ("Nx", "Nx"))
    with pytest.raises(InputError, match="expected two names such as 'Nx,Ny'"):
        failure_envelope(cross_ply, "Nx")
    with pytest.raises(InputError, match="n_points = 4: at least 8 rays"):
        failure_envelope(cross_ply, "Nx,Ny", n_points=4)
    with pytest.raises(InputError, match="no envelope given"):
        plot_envelopes([], tmp_path / "x.png")
    a = failure_envelope(cross_ply, "Nx,Ny", n_points=8)
    b = failure_envelope(cross_ply, "Nx,Nxy", n_points=8)
    with pytest.raises(InputError, match="axes differ"):
        plot_envelopes([a, b], tmp_path / "x.png")


@pytest.mark.parametrize("n_points", [10, 37, 361])
def test_intercepts_are_the_first_ply_failure_loads_on_the_half_axes(cross_ply, n_points):
    env = failure_envelope(cross_ply, "Nx,Nxy", "tsai_hill", n_points=n_points, delta_T=-50.0)
    for key, load in (("+Nx", {"Nx": 1.0}), ("-Nx", {"Nx": -1.0}), ("+Nxy", {"Nxy": 1.0}),
                      ("-Nxy", {"Nxy": -1.0})):
        fpf = first_ply_failure(cross_ply, load, delta_T=-50.0, criterion="tsai_hill")
        sign = -1.0 if key.startswith("-") else 1.0
        assert env.intercepts[key] == pytest.approx(sign * fpf.load_factor, rel=1e-12)
    assert env.as_dict()["intercepts"]["-Nx"] < 0.0


def test_stress_axis_intercepts_are_average_stresses(cross_ply):
    env = failure_envelope(cross_ply, "sx,sy", "max_stress", n_points=8)
    fpf = first_ply_failure(cross_ply, {"Nx": 1.0}, criterion="max_stress")
    # sx = Nx / h (exact)
    assert env.intercepts["+sx"] == pytest.approx(fpf.load_factor / cross_ply.thickness,
                                                  rel=1e-12)


def test_plot_refuses_an_unknown_format_or_a_missing_folder(cross_ply, tmp_path):
    e = failure_envelope(cross_ply, "Nx,Ny", n_points=8)
    with pytest.raises(InputError, match=r"plot file = .*env.txt': the file name must end in "
                                         r"\.png, .*\(format 'txt' is not an image format"):
        plot_envelopes([e], tmp_path / "env.txt")
    with pytest.raises(InputError, match=r"plot file = .*: folder .*missing.* does not exist"):
        plot_envelopes([e], tmp_path / "missing" / "env.png")
