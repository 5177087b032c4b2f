"""Tests of micromech.materials.composite: fractions, packing limits, weight <-> volume.

Packing limits: pi/4 and pi/(2 sqrt 3) are exact for touching circles on square and hexagonal
grids; pi/6 (simple cubic) and pi/(3 sqrt 2) (face-centred cubic, Hales 2005) are exact for
spheres; random values 0.82 (discs, Berryman 1983) and 0.64 (spheres, Scott and Kilgour 1969)
are from memory. Weight/volume relations: Agarwal, Broutman and Chandrashekhara (2006), 3rd ed.,
Sec. 3.2 (from memory); they are exact mass balances.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from micromech.errors import FractionError, InputError, InvalidMaterialError, UnitError
from micromech.materials import (
    Composite,
    Isotropic,
    TransverselyIsotropic,
    packing_limit,
    volume_fraction_from_weight,
    weight_fraction_from_volume,
)

GLASS = Isotropic(name="glass", E="72 GPa", nu=0.22, density="2.55 g/cm^3")
EPOXY = Isotropic(name="epoxy", E="3.5 GPa", nu=0.35, density="1.2 g/cm^3")
CARBON = TransverselyIsotropic(name="carbon", E1="230 GPa", E2="15 GPa", nu12=0.2, G12="15 GPa",
                               nu23=0.07)  # no density
SETTINGS = settings(max_examples=80, deadline=None)


# --- packing limits ---------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("inclusion", "arrangement", "limit"),
    [
        ("continuous", "square", math.pi / 4),  # exact
        ("continuous", "hexagonal", math.pi / (2 * math.sqrt(3))),  # exact
        ("continuous", "random", 0.82),  # Berryman 1983, from memory
        ("sphere", "square", math.pi / 6),  # simple cubic, exact
        ("sphere", "hexagonal", math.pi / (3 * math.sqrt(2))),  # fcc/hcp, exact (Hales 2005)
        ("sphere", "random", 0.64),  # Scott and Kilgour 1969, from memory
        ("spheroid", "hexagonal", math.pi / (3 * math.sqrt(2))),  # affine image of spheres
    ],
)
def test_packing_limits(inclusion, arrangement, limit):
    assert packing_limit(inclusion, arrangement) == pytest.approx(limit, rel=1e-15)
    aspect = 3.0 if inclusion == "spheroid" else None
    c = Composite(GLASS, EPOXY, limit, inclusion=inclusion, arrangement=arrangement,
                  aspect_ratio=aspect)
    assert c.packing_limit == pytest.approx(limit, rel=1e-15)


@pytest.mark.parametrize(
    ("inclusion", "arrangement", "vf", "match"),
    [
        ("continuous", "square", 0.79, r"volume_fraction = 0.79 exceeds the packing limit 0.7854 "
                                       r"of square continuous inclusions \(pi/4"),
        ("continuous", "hexagonal", 0.91, r"exceeds the packing limit 0.9069 of hexagonal"),
        ("continuous", "random", 0.83, r"exceeds the packing limit 0.8200 of random continuous "
                                       r"inclusions \(random close packing of equal discs"),
        ("sphere", "random", 0.65, r"exceeds the packing limit 0.6400 of random sphere"),
        ("sphere", "square", 0.53, r"exceeds the packing limit 0.5236 of square sphere"),
    ],
)
def test_fraction_above_packing_limit_is_a_fraction_error_naming_the_limit(
    inclusion, arrangement, vf, match
):
    with pytest.raises(FractionError, match=match):
        Composite(GLASS, EPOXY, vf, inclusion=inclusion, arrangement=arrangement)


@pytest.mark.parametrize("vf", [-0.01, 1.01, float("nan"), float("inf")])
def test_fraction_outside_unit_interval_is_rejected(vf):
    with pytest.raises(FractionError, match=r"volume_fraction = .* is outside \[0, 1\] "
                       r"\(rule: 0 <= value <= 1\)"):
        Composite(GLASS, EPOXY, vf)


def test_void_fraction_of_one_is_rejected():
    with pytest.raises(FractionError, match=r"void_fraction = 1.0 is outside \[0, 1\] "
                       r"\(rule: 0 <= value < 1\)"):
        Composite(GLASS, EPOXY, 0.0, void_fraction=1.0)


def test_fibres_plus_voids_above_one_is_rejected():
    with pytest.raises(FractionError, match=r"volume_fraction \+ void_fraction = 1.1 exceeds 1"):
        Composite(GLASS, EPOXY, 0.6, void_fraction=0.5, arrangement="hexagonal")


def test_array_fractions_report_the_first_bad_index():
    with pytest.raises(FractionError, match=r"volume_fraction = 1.2 at index 2 is outside"):
        Composite(GLASS, EPOXY, [0.1, 0.2, 1.2])
    with pytest.raises(FractionError, match=r"volume_fraction = 0.9 at index 1 exceeds the "
                       r"packing limit"):
        Composite(GLASS, EPOXY, np.array([0.5, 0.9]))


def test_limits_zero_and_packing_limit_are_accepted():
    assert Composite(GLASS, EPOXY, 0.0).volume_fraction == 0.0
    assert Composite(GLASS, EPOXY, "0.82").volume_fraction == 0.82


def test_packing_limit_rejects_unknown_names():
    with pytest.raises(InputError, match=r"arrangement = 'hex' is not one of random, square, "
                       r"hexagonal; did you mean 'hexagonal'\?"):
        packing_limit("continuous", "hex")


# --- inclusion shape --------------------------------------------------------------------------


def test_unknown_inclusion_suggests_nearest():
    with pytest.raises(InputError, match=r"inclusion = 'sphre' is not one of continuous, "
                       r"spheroid, sphere; did you mean 'sphere'\?"):
        Composite(GLASS, EPOXY, 0.3, inclusion="sphre")  # type: ignore[arg-type]


def test_spheroid_needs_a_positive_aspect_ratio():
    with pytest.raises(InputError, match=r"aspect_ratio = None: a spheroid inclusion needs a "
                       r"finite aspect ratio > 0"):
        Composite(GLASS, EPOXY, 0.3, inclusion="spheroid")
    with pytest.raises(InputError, match=r"aspect_ratio = -2.0: a spheroid"):
        Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=-2.0)


def test_sphere_has_aspect_ratio_one():
    assert Composite(GLASS, EPOXY, 0.3, inclusion="sphere").aspect_ratio == 1.0
    with pytest.raises(InputError, match=r"aspect_ratio = 2.0: a sphere has aspect ratio 1"):
        Composite(GLASS, EPOXY, 0.3, inclusion="sphere", aspect_ratio=2.0)


def test_continuous_fibres_take_no_aspect_ratio():
    with pytest.raises(InputError, match=r"aspect_ratio = 20.0 is given for continuous fibres; "
                       r"use inclusion = 'spheroid'"):
        Composite(GLASS, EPOXY, 0.3, aspect_ratio=20.0)


def test_constituents_must_be_materials():
    with pytest.raises(InputError, match=r"fibre: expected a material .* got dict"):
        Composite({"E": 1e9}, EPOXY, 0.3)  # type: ignore[arg-type]


# --- weight and volume fractions --------------------------------------------------------------


def test_weight_to_volume_for_density_ratio_two_is_one_third():
    # w = 0.5, rho_f = 2 rho_m: v_f = (0.5/2) / (0.5/2 + 0.5/1) = 1/3 exactly (mass balance)
    assert volume_fraction_from_weight(0.5, 2000.0, 1000.0) == pytest.approx(1 / 3, rel=1e-15)


def test_voids_scale_fibre_and_matrix_volume_alike():
    v0 = volume_fraction_from_weight(0.6, 2550.0, 1200.0)
    v = volume_fraction_from_weight(0.6, 2550.0, 1200.0, void_fraction=0.03)
    assert v == pytest.approx(0.97 * v0, rel=1e-15)


@SETTINGS
@given(st.floats(0.0, 1.0), st.floats(500.0, 20000.0), st.floats(500.0, 20000.0),
       st.floats(0.0, 0.3))
def test_weight_volume_round_trip(w, rho_f, rho_m, vv):
    vf = volume_fraction_from_weight(w, rho_f, rho_m, vv)
    assert weight_fraction_from_volume(vf, rho_f, rho_m, vv) == pytest.approx(w, abs=1e-13)


def test_conversions_broadcast():
    w = np.linspace(0.1, 0.9, 5)[:, None]
    vv = np.array([0.0, 0.02])[None, :]
    assert volume_fraction_from_weight(w, 2550.0, 1200.0, vv).shape == (5, 2)


def test_composite_from_weight_fraction_round_trips():
    c = Composite.from_weight_fraction(GLASS, EPOXY, 0.7, void_fraction=0.02)
    assert c.weight_fraction == pytest.approx(0.7, rel=1e-14)
    assert c.void_fraction == 0.02
    assert c.volume_fraction + c.matrix_fraction + c.void_fraction == pytest.approx(1.0)


def test_composite_density_is_the_volume_average_with_massless_voids():
    c = Composite(GLASS, EPOXY, 0.5, void_fraction=0.02)
    assert c.density == pytest.approx(0.5 * 2550 + 0.48 * 1200, rel=1e-12)


def test_weight_fraction_needs_both_densities():
    with pytest.raises(InvalidMaterialError, match=r"fibre 'carbon' has no density; converting "
                       r"between weight and volume fractions needs both densities"):
        Composite(CARBON, EPOXY, 0.5).weight_fraction  # noqa: B018
    with pytest.raises(InvalidMaterialError, match=r"fibre 'carbon' has no density"):
        Composite.from_weight_fraction(CARBON, EPOXY, 0.5)


def test_from_weight_fraction_rejects_bad_fractions():
    with pytest.raises(FractionError, match=r"weight_fraction = 1.5 is outside \[0, 1\]"):
        Composite.from_weight_fraction(GLASS, EPOXY, 1.5)
    with pytest.raises(FractionError, match=r"void_fraction = -0.1 is outside"):
        Composite.from_weight_fraction(GLASS, EPOXY, 0.5, void_fraction=-0.1)


def test_heavy_fibre_weight_fraction_can_exceed_the_packing_limit():
    # w = 0.95 with glass/epoxy gives v_f = 0.9 > 0.82: the packing check still applies
    with pytest.raises(FractionError, match=r"exceeds the packing limit 0.8200"):
        Composite.from_weight_fraction(GLASS, EPOXY, 0.95)


# --- copies -----------------------------------------------------------------------------------


def test_with_fraction_returns_a_validated_copy():
    c = Composite(GLASS, EPOXY, 0.3)
    d = c.with_fraction(0.6)
    assert (c.volume_fraction, d.volume_fraction) == (0.3, 0.6)
    with pytest.raises(FractionError, match=r"exceeds the packing limit"):
        c.with_fraction(0.9)


def test_with_fraction_accepts_arrays_read_only():
    c = Composite(GLASS, EPOXY, 0.3).with_fraction(np.linspace(0, 0.8, 9))
    assert c.volume_fraction.shape == (9,)
    assert c.weight_fraction.shape == (9,)
    with pytest.raises(ValueError, match="read-only"):
        c.volume_fraction[0] = 0.5


def test_composite_is_frozen():
    c = Composite(GLASS, EPOXY, 0.3)
    with pytest.raises(AttributeError):
        c.volume_fraction = 0.4  # type: ignore[misc]


@pytest.mark.parametrize("bad", [None, True, [0.3, "x"], {"a": 1}])
def test_fraction_that_is_not_a_number_is_rejected(bad):
    with pytest.raises(FractionError, match=r"volume_fraction = .* is not a number"):
        Composite(GLASS, EPOXY, bad)


def test_fraction_text_that_is_not_a_number_is_a_unit_error():
    with pytest.raises(UnitError, match=r"volume_fraction expects a plain number, got '50 MPa'"):
        Composite(GLASS, EPOXY, "50 MPa")


# --- fibre orientation ------------------------------------------------------------------------


def test_orientation_defaults_to_aligned():
    assert Composite(GLASS, EPOXY, 0.3).orientation == "aligned"


@pytest.mark.parametrize(
    ("inclusion", "aspect", "orientation"),
    [
        ("spheroid", 20.0, "random_in_plane"),
        ("spheroid", 20.0, "random_3d"),
        ("spheroid", 0.1, "random_3d"),  # platelets random in space
        ("continuous", None, "random_in_plane"),  # continuous-filament mat (module table)
        ("sphere", None, "aligned"),
    ],
)
def test_allowed_orientations(inclusion, aspect, orientation):
    c = Composite(GLASS, EPOXY, 0.3, inclusion=inclusion, aspect_ratio=aspect,
                  orientation=orientation)
    assert c.orientation == orientation


def test_with_fraction_keeps_the_orientation():
    c = Composite(GLASS, EPOXY, 0.3, inclusion="spheroid", aspect_ratio=20.0,
                  orientation="random_3d")
    d = c.with_fraction(np.linspace(0.0, 0.5, 6))
    assert d.orientation == "random_3d" and d.aspect_ratio == 20.0


def test_weight_fraction_constructor_passes_the_orientation():
    c = Composite.from_weight_fraction(GLASS, EPOXY, 0.4, inclusion="spheroid", aspect_ratio=30.0,
                                       orientation="random_in_plane")
    assert c.orientation == "random_in_plane"
    assert c.weight_fraction == pytest.approx(0.4, rel=1e-13)


@pytest.mark.parametrize(
    ("kw", "match"),
    [
        (dict(orientation="random"), r"orientation = 'random' is not one of aligned, "
                                     r"random_in_plane, random_3d; did you mean "
                                     r"'random_in_plane' or 'random_3d'\?"),
        (dict(inclusion="sphere", orientation="random_3d"),
         r"orientation = 'random_3d' is not allowed with inclusion = 'sphere' \(rule: random_3d "
         r"needs inclusion 'spheroid'; a sphere has no orientation\)"),
        (dict(inclusion="sphere", orientation="random_in_plane"),
         r"orientation = 'random_in_plane' is not allowed with inclusion = 'sphere' \(rule: "
         r"random_in_plane needs inclusion 'spheroid' or 'continuous'"),
        (dict(orientation="random_3d"),
         r"orientation = 'random_3d' is not allowed with inclusion = 'continuous' .*straight "
         r"continuous fibres cannot run in every direction in space; use inclusion = 'spheroid'"),
        (dict(inclusion="spheroid", aspect_ratio=10.0, arrangement="square",
              orientation="random_3d"),
         r"orientation = 'random_3d' is not allowed with arrangement = 'square' \(rule: randomly "
         r"oriented inclusions need arrangement = 'random'"),
    ],
)
def test_orientation_that_does_not_fit_is_rejected(kw, match):
    with pytest.raises(InputError, match=match):
        Composite(GLASS, EPOXY, 0.3, **kw)


def test_check_orientation_returns_the_orientation():
    from micromech.materials.composite import check_orientation

    assert check_orientation("aligned", "sphere", "square") == "aligned"
    assert check_orientation("random_3d", "spheroid") == "random_3d"
