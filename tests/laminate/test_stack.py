"""3D constants of a periodic stack by exact layer averaging (Pagano 1974; Sun and Li 1988)."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech import tensors
from micromech.errors import FractionError, InputError, InvalidMaterialError
from micromech.laminate import Laminate, PlyMaterial, plane_stress_reduce, stack_constants

GPA = 1e9

materials = st.builds(
    lambda E1, r, nu12, g, nu23: PlyMaterial(E1=E1 * GPA, E2=E1 * GPA * r, nu12=nu12,
                                             G12=E1 * GPA * r * g, nu23=nu23),
    st.floats(20, 400), st.floats(0.02, 1.0), st.floats(0.1, 0.45), st.floats(0.2, 0.8),
    st.floats(0.05, 0.6),
)


@settings(max_examples=60, deadline=None)
@given(materials, st.floats(-90, 90), st.integers(1, 4))
def test_stack_of_identical_plies_returns_the_ply(m, a, n):
    C = tensors.rotate_stiffness(m.stiffness(), tensors.rotation_about_axis(3, a))
    f = np.full(n, 1.0 / n)
    r = stack_constants(np.broadcast_to(C, (n, 6, 6)), f)
    np.testing.assert_allclose(r.stiffness, C, rtol=1e-9, atol=1e-9 * np.max(np.abs(C)))


@settings(max_examples=60, deadline=None)
@given(materials)
def test_balanced_cross_ply_stack_has_equal_in_plane_moduli(m):
    r = stack_constants(np.stack([m.stiffness()] * 2), [0.5, 0.5], angles=[0.0, 90.0])
    c = r.constants
    assert c.E1 == pytest.approx(float(c.E2), rel=1e-10)  # Ex = Ey
    assert c.G13 == pytest.approx(float(c.G23), rel=1e-10)  # Gxz = Gyz


@settings(max_examples=60, deadline=None)
@given(materials, st.floats(0.05, 0.95))
def test_cross_ply_through_thickness_modulus_lies_between_reuss_and_voigt(m, f0):
    C = np.stack([m.stiffness()] * 2)
    angles = [0.0, 90.0]
    f = np.array([f0, 1.0 - f0])
    Cr = tensors.rotate_stiffness(C, tensors.rotation_about_axis(3, angles))
    Ez = float(stack_constants(Cr, f).constants.E3)
    reuss = 1.0 / float(np.einsum("n,n->", f, np.linalg.inv(Cr)[:, 2, 2]))
    voigt = 1.0 / float(np.linalg.inv(np.einsum("n,nij->ij", f, Cr))[2, 2])
    # Hill (1952) bounds on the apparent modulus of a layered medium
    assert reuss * (1 - 1e-12) <= Ez <= voigt * (1 + 1e-12)


@settings(max_examples=60, deadline=None)
@given(materials, st.floats(0.05, 0.95), st.sampled_from([(0.0, 90.0), (30.0, -30.0),
                                                          (0.0, 45.0), (15.0, 75.0)]))
def test_in_plane_constants_agree_with_classical_laminate_theory(m, f0, pair):
    h = 1e-3
    lam = Laminate.from_angles(pair, m, [f0 * h, (1 - f0) * h])
    clt = lam.in_plane_constants(bending="restrained")
    c = lam.stack_constants().constants
    assert float(c.E1) == pytest.approx(clt.Ex, rel=1e-9)
    assert float(c.E2) == pytest.approx(clt.Ey, rel=1e-9)
    assert float(c.G12) == pytest.approx(clt.Gxy, rel=1e-9)
    assert float(c.nu12) == pytest.approx(clt.nuxy, rel=1e-9, abs=1e-12)


def test_equal_poisson_isotropic_layers_average_the_in_plane_modulus():
    C = tensors.isotropic_stiffness(np.array([70e9, 3e9]), 0.3)
    r = stack_constants(C, [0.25, 0.75])
    # exact identity: with equal nu the plane-stress reduced stiffnesses are proportional to E
    assert float(r.constants.E1) == pytest.approx(0.25 * 70e9 + 0.75 * 3e9, rel=1e-12)
    # through the thickness: the stack is stiffer than the Reuss average 1/<1/E> (constraint)
    assert float(r.constants.E3) > 1.0 / (0.25 / 70e9 + 0.75 / 3e9)


def test_stack_is_vectorised_over_fractions(graphite_epoxy):
    C = graphite_epoxy.stiffness()
    f0 = np.linspace(0.1, 0.9, 7)
    f = np.stack([f0, 1 - f0], -1)
    batch = stack_constants(np.broadcast_to(C, (7, 2, 6, 6)), f,
                            angles=np.broadcast_to([0.0, 90.0], (7, 2)))
    assert batch.stiffness.shape == (7, 6, 6) and batch.constants.E3.shape == (7,)
    one = stack_constants(np.stack([C, C]), f[4], angles=[0.0, 90.0])
    np.testing.assert_allclose(batch.stiffness[4], one.stiffness, rtol=1e-12)
    assert batch.constants.model == "stack" and "Pagano" in batch.constants.source
    d = one.as_dict()
    assert set(d) == {"Ex", "Ey", "Ez", "Gxy", "Gxz", "Gyz", "nuxy", "nuxz", "nuyz"}
    np.testing.assert_allclose(one.compliance @ one.stiffness, np.eye(6), atol=1e-9)


def test_plane_stress_reduction_of_a_ply_is_q(graphite_epoxy):
    np.testing.assert_allclose(plane_stress_reduce(graphite_epoxy.stiffness()),
                               graphite_epoxy.reduced_stiffness(), rtol=1e-12, atol=1e-3)


def test_bad_stack_inputs_are_refused(graphite_epoxy):
    C = np.stack([graphite_epoxy.stiffness()] * 2)
    with pytest.raises(InputError, match=r"stiffness: expected shape \(\.\.\., n, 6, 6\)"):
        stack_constants(C[0], [1.0])
    with pytest.raises(InputError, match=r"fractions: expected shape \(\.\.\., 2\)"):
        stack_constants(C, [1.0])
    with pytest.raises(FractionError, match=r"entry \(1,\) = -0.1 must be non-negative"):
        stack_constants(C, [1.1, -0.1])
    with pytest.raises(FractionError, match="must sum to 1, got 0.9"):
        stack_constants(C, [0.5, 0.4])
    bad = C.copy()
    bad[1, 0, 0] = -1.0
    with pytest.raises(InvalidMaterialError, match="layer stiffness at index 1"):
        stack_constants(bad, [0.5, 0.5])
