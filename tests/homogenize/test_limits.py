"""Every estimate returns the matrix at vf = 0 and the fibre at vf = 1 where defined there."""

import numpy as np
import pytest

from micromech.homogenize import (
    chamis,
    cylinders,
    halpin_tsai,
    hashin_shtrikman_fibre,
    mori_tanaka,
    rule_of_mixtures,
    voigt_reuss,
)

ENDS = np.array([0.0, 1.0])


def _models(f, m):
    lo, hi = hashin_shtrikman_fibre(f, m, ENDS)
    v, r = voigt_reuss(f, m, ENDS)
    return {
        "rule_of_mixtures": rule_of_mixtures(f, m, ENDS), "halpin_tsai": halpin_tsai(f, m, ENDS),
        "chamis": chamis(f, m, ENDS), "cylinders": cylinders(f, m, ENDS),
        "mori_tanaka": mori_tanaka(f, m, ENDS), "hs_lower": lo, "hs_upper": hi,
        "voigt": v, "reuss": r,
    }


@pytest.mark.parametrize("fibre", ["glass", "carbon"])
def test_every_fibre_model_meets_both_phases(fibre, request, epoxy):
    f = request.getfixturevalue(fibre)
    want = {"E1": (3.5e9, f.E1), "E2": (3.5e9, f.E2), "G12": (3.5e9 / 2.7, f.G12),
            "G23": (3.5e9 / 2.7, f.G23), "nu12": (0.35, f.nu12), "nu23": (0.35, f.nu23)}
    for key, r in _models(f, epoxy).items():
        for name, (at0, at1) in want.items():
            got = r.get(name)
            if got is None:
                continue
            assert np.allclose(got, [at0, float(at1)], rtol=1e-9, atol=1e-12), (key, name)


def test_particle_bounds_and_estimates_meet_both_phases(glass, epoxy):
    # exact limits: at vf = 0 the matrix, at vf = 1 the particle phase (Hashin & Shtrikman 1963;
    # Willis 1977; Benveniste 1987), for spheres and aligned spheroids
    from micromech.homogenize import hashin_shtrikman, hashin_shtrikman_spheroid

    results = [*hashin_shtrikman(glass, epoxy, ENDS), *hashin_shtrikman_spheroid(glass, epoxy,
                                                                                 ENDS, 6.0),
               mori_tanaka(glass, epoxy, ENDS, "sphere"),
               mori_tanaka(glass, epoxy, ENDS, "spheroid", 0.2)]
    Gm, Gf = 3.5e9 / 2.7, 72e9 / 2.44
    for r in results:
        for name, at0, at1 in (("E1", 3.5e9, 72e9), ("E2", 3.5e9, 72e9), ("G12", Gm, Gf),
                               ("G23", Gm, Gf)):
            assert np.allclose(r.get(name), [at0, at1], rtol=1e-9), (r.model, name)
        if r.alpha1 is not None:
            assert np.allclose(r.alpha1, [60e-6, 5e-6], rtol=1e-9), r.model
